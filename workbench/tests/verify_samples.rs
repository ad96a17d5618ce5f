//! The samples of `armforge verify` are where they claim to be: checked with the model's own
//! forward kinematics (product of exponentials), not with the sampler's arithmetic. Joint 5
//! within the stated angle of the aligned wrist; the wrist center within the stated fraction
//! of the arm's size from axis 1 or from a reach boundary; a joint within the stated amount
//! inside a limit; every sample within the limits; the same seed gives the same samples.

use std::f64::consts::TAU;

use armforge_compiler::classify::{classify, ArmEvidence, Geometry, Tolerances};
use armforge_compiler::description::load_str;
use armforge_compiler::model::Model;
use armforge_runtime::{Joint, JointKind, Pose};
use armforge_workbench::verify::{Kind, Sampler};

fn bench_elbow() -> (Model, Geometry) {
    let path = concat!(env!("CARGO_MANIFEST_DIR"), "/../arms/bench-elbow-dh.toml");
    let text = std::fs::read_to_string(path).expect("example arm");
    let model = load_str(&text, "arms/bench-elbow-dh.toml").expect("loads");
    let geometry = classify(&model, &Tolerances::default()).expect("classifies");
    (model, geometry)
}

fn joints(model: &Model) -> [Joint; 6] {
    model.runtime_joints().try_into().expect("six joints")
}

/// The wrist center in the base frame for joint values `q`: `B⁻¹ T(q) M⁻¹ c`.
fn wrist_center(model: &Model, geometry: &Geometry, q: &[f64; 6]) -> [f64; 3] {
    let t = model.forward(q);
    let g: Pose = model
        .base
        .inverse()
        .compose(&t)
        .compose(&model.tool.inverse());
    g.transform_point(&geometry.wrist_center)
}

fn distance_from_line(x: &[f64; 3], point: &[f64; 3], h: &[f64; 3]) -> f64 {
    let d = [x[0] - point[0], x[1] - point[1], x[2] - point[2]];
    let along = d[0] * h[0] + d[1] * h[1] + d[2] * h[2];
    let p = [
        d[0] - along * h[0],
        d[1] - along * h[1],
        d[2] - along * h[2],
    ];
    (p[0] * p[0] + p[1] * p[1] + p[2] * p[2]).sqrt()
}

fn close(measured: f64, claimed: f64) -> bool {
    (measured - claimed).abs() <= 1e-3 * claimed + 1e-14
}

#[test]
fn samples_are_within_the_limits_and_reproducible() {
    let (model, geometry) = bench_elbow();
    let j = joints(&model);
    let a = Sampler::new(j, &geometry, 11);
    let b = Sampler::new(j, &geometry, 11);
    for kind in Kind::ALL {
        for index in 0..100 {
            let s = a.sample(index, kind);
            assert_eq!(s, b.sample(index, kind));
            let Some(s) = s else { continue };
            for (i, (q, joint)) in s.joints.iter().zip(&j).enumerate() {
                assert!(
                    *q >= joint.limits[0] && *q <= joint.limits[1],
                    "{kind:?} sample {index}: joint {} = {q} outside {:?}",
                    i + 1,
                    joint.limits
                );
            }
        }
    }
}

#[test]
fn wrist_samples_are_near_the_aligned_position() {
    let (model, geometry) = bench_elbow();
    let j = joints(&model);
    let sampler = Sampler::new(j, &geometry, 3);
    let mut seen = 0;
    for index in 0..200 {
        let Some(s) = sampler.sample(index, Kind::WristNearAligned) else {
            continue;
        };
        assert!((1e-12..=1e-3).contains(&s.offset));
        let theta5 = j[4].model_value(s.joints[4]);
        let off = geometry
            .wrist
            .as_ref()
            .expect("spherical wrist")
            .aligned_at
            .iter()
            .map(|a| {
                let d = theta5 - a;
                (d - TAU * (d / TAU).round()).abs()
            })
            .fold(f64::INFINITY, f64::min);
        assert!(
            close(off, s.offset),
            "sample {index}: {off:e} vs {:e}",
            s.offset
        );
        seen += 1;
    }
    assert!(seen > 150, "only {seen} wrist samples placed");
}

#[test]
fn axis_1_samples_put_the_wrist_center_that_near_axis_1() {
    let (model, geometry) = bench_elbow();
    let j = joints(&model);
    let size = geometry.resolved.arm_size;
    let sampler = Sampler::new(j, &geometry, 5);
    let mut seen = 0;
    for index in 0..200 {
        let Some(s) = sampler.sample(index, Kind::NearAxis1) else {
            continue;
        };
        assert!((1e-12 / 4.0..=4e-3).contains(&s.offset));
        let c = wrist_center(&model, &geometry, &s.joints);
        let d = distance_from_line(&c, &j[0].point, &j[0].axis) / size;
        assert!(
            close(d, s.offset),
            "sample {index}: {d:e} vs {:e}",
            s.offset
        );
        seen += 1;
    }
    assert!(seen > 150, "only {seen} axis-1 samples placed");
}

#[test]
fn reach_samples_put_the_wrist_center_just_inside_a_boundary() {
    let (model, geometry) = bench_elbow();
    let ArmEvidence::Elbow(e) = &geometry.arm else {
        panic!("bench-elbow is an elbow arm")
    };
    let j = joints(&model);
    let size = geometry.resolved.arm_size;
    let sampler = Sampler::new(j, &geometry, 9);
    let mut seen = 0;
    for index in 0..200 {
        let Some(s) = sampler.sample(index, Kind::ReachBoundary) else {
            continue;
        };
        let c = wrist_center(&model, &geometry, &s.joints);
        // Axis 2 as joint 1 carries it.
        let e1 = armforge_runtime::joint_motion(&j[0], s.joints[0]);
        let p2 = e1.transform_point(&j[1].point);
        let h2 = e1.rotate(&j[1].axis);
        let d = distance_from_line(&c, &p2, &h2);
        let inside_outer = (e.reach_from_axis_2[1] - d) / size;
        let outside_inner = (d - e.reach_from_axis_2[0]) / size;
        let best = if (inside_outer - s.offset).abs() < (outside_inner - s.offset).abs() {
            inside_outer
        } else {
            outside_inner
        };
        // The distance itself is known to ~1e-16 of the arm's size.
        assert!(
            (best - s.offset).abs() <= 1e-3 * s.offset + 1e-14,
            "sample {index}: {best:e} vs {:e}",
            s.offset
        );
        seen += 1;
    }
    assert!(seen > 150, "only {seen} reach samples placed");
}

#[test]
fn limit_samples_put_a_joint_just_inside_a_limit() {
    let (model, geometry) = bench_elbow();
    let j = joints(&model);
    let size = geometry.resolved.arm_size;
    let sampler = Sampler::new(j, &geometry, 13);
    for index in 0..100 {
        let Some(s) = sampler.sample(index, Kind::AtLimit) else {
            continue;
        };
        let nearest = s
            .joints
            .iter()
            .zip(&j)
            .map(|(q, joint)| {
                let scale = match joint.kind {
                    JointKind::Revolute => 1.0,
                    JointKind::Prismatic => size,
                };
                ((q - joint.limits[0]).min(joint.limits[1] - q)) / scale
            })
            .fold(f64::INFINITY, f64::min);
        // limit ∓ offset rounds at ~1e-16 of the limit (a few radians).
        assert!(
            (nearest - s.offset).abs() <= 1e-6 * s.offset + 1e-14,
            "sample {index}: {nearest:e} vs {:e}",
            s.offset
        );
    }
}
