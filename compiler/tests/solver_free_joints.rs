//! The free joints at singular configurations are chosen within their limits (issue 12): a
//! pose that forward kinematics made from a configuration within the limits always gets that
//! configuration's posture back, also where the plan holds a free joint at a reference that
//! puts another joint (or the free joint itself) outside its limits:
//!
//! - joint 2 at the pivot of a polar arm (the wrist center on axis 2);
//! - joint 4 at an aligned wrist, at both aligned positions of joint 5 (θ5 = 0 and ±180°);
//! - joint 1 with the wrist center on axis 1.
//!
//! Each round trip is checked against `Model::forward`, the product of exponentials
//! (Brockett 1984; Lynch & Park, Modern Robotics, 2017, §4.1).

mod common;

use std::f64::consts::PI;

use armforge_compiler::model::Model;
use armforge_compiler::plan::samples::{upright_elbow_arm, SampleRng};
use armforge_compiler::solver::Solver;
use armforge_runtime::{Flags, Pose};
use common::pose_error;

fn arm(path: &str, edit: impl Fn(String) -> String) -> (Model, Solver) {
    let text = std::fs::read_to_string(format!("{}/../{path}", env!("CARGO_MANIFEST_DIR")))
        .unwrap_or_else(|e| panic!("{path}: {e}"));
    let model = armforge_compiler::description::load_str(&edit(text), path)
        .unwrap_or_else(|d| panic!("{d}"));
    let solver = Solver::for_model(&model).unwrap_or_else(|r| panic!("{r}"));
    (model, solver)
}

/// A configuration with each joint uniform within its limits.
fn within_limits(model: &Model, rng: &mut SampleRng) -> [f64; 6] {
    let mut q = [0.0; 6];
    for (v, j) in q.iter_mut().zip(&model.joints) {
        let [lo, hi] = j.joint.limits;
        *v = rng.range(lo.max(-10.0), hi.min(10.0));
    }
    q
}

fn gap(a: f64, b: f64) -> f64 {
    let d = a - b;
    (d - 2.0 * PI * (d / (2.0 * PI)).round()).abs()
}

/// `solve` answers `target` (made from `q`), every solution reproduces it, and one solution
/// has `q`'s values in the joints `same` (the posture); returns its flags.
fn posture_found(model: &Model, solver: &Solver, q: &[f64; 6], same: &[usize]) -> Flags {
    let target = model.forward(q);
    let solutions = solver
        .solve(&target)
        .unwrap_or_else(|r| panic!("no solution for forward({q:?}): {r}"));
    let reach = solver.plan().arm.scale;
    for s in &solutions {
        let e = pose_error(&solver.forward(&s.joints), &target, reach);
        assert!(e < 1e-9, "{s:?} misses forward({q:?}) by {e:e}");
    }
    let found = solutions
        .iter()
        .find(|s| same.iter().all(|&i| gap(s.joints[i], q[i]) < 1e-6));
    let found = found.unwrap_or_else(|| panic!("posture of {q:?} missing from {solutions:#?}"));
    found.flags
}

#[test]
fn polar_pivot_joint_2_is_chosen_within_the_limits() {
    // The hotel loader with an unlimited boom: at slide −0.55 m the wrist center (1.17 m up)
    // sits on the tilt axis (0.62 m up). The tilt is limited to [−20°, 110°] and held at 0°;
    // joints 4 (±120°) and 5 (±100°) then often cannot make the orientation.
    let (model, solver) = arm("arms/hotel-loader-axes.toml", |t| {
        t.replace("limits = [0, 0.4]\n", "")
    });
    let mut rng = SampleRng::new(12);
    for _ in 0..armforge_compiler::plan::samples::sample_count(300) {
        let mut q = within_limits(&model, &mut rng);
        q[2] = -0.55;
        // Joints 1, 3 and 5 are fixed by the pose; 2, 4 and 6 split the turn about the pivot.
        posture_found(&model, &solver, &q, &[0, 2]);
    }
}

/// The joint value of joint 5 at which axes 4 and 6 line up (a wrist with h4 ⟂ h5 ⟂ h6).
fn aligned_joint5(solver: &Solver) -> f64 {
    let arm = &solver.plan().arm;
    let (h4, h5, h6) = (arm.joints[3].axis, arm.joints[4].axis, arm.joints[5].axis);
    let cross = [
        h6[1] * h4[2] - h6[2] * h4[1],
        h6[2] * h4[0] - h6[0] * h4[2],
        h6[0] * h4[1] - h6[1] * h4[0],
    ];
    let dot = |a: [f64; 3], b: [f64; 3]| a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    arm.joints[4].joint_value(dot(h5, cross).atan2(dot(h6, h4)))
}

#[test]
fn aligned_wrist_joint_4_is_chosen_within_the_limits_at_both_aligned_positions() {
    // Joint 4 within [30°, 150°]: its reference (0°) is outside, yet a value exists; joint 6
    // within ±90°, so θ6 = (θ4 + θ6) − θ4 fits only for some θ4.
    let (model, solver) = arm("arms/bench-elbow-dh.toml", |t| {
        t.replace("limits = [-185, 185]", "limits = [30, 150]")
            .replace("limits = [-120, 120]", "limits = [-180, 180]")
            .replace("limits = [-270, 270]", "limits = [-90, 90]")
    });
    let aligned = aligned_joint5(&solver);
    let mut rng = SampleRng::new(13);
    for k in 0..armforge_compiler::plan::samples::sample_count(300) {
        let mut q = within_limits(&model, &mut rng);
        let position = if k % 2 == 0 { aligned } else { aligned + PI };
        q[4] = (position + PI).rem_euclid(2.0 * PI) - PI;
        let flags = posture_found(&model, &solver, &q, &[0, 1, 2, 4]);
        assert!(
            flags.contains(Flags::WRIST_ALIGNED),
            "aligned posture flagged: {q:?}"
        );
    }
}

#[test]
fn axis_1_joint_1_is_chosen_within_the_limits() {
    // The upright elbow arm: with the wrist center on axis 1, joint 1 only turns the
    // orientation. Joint 1 limited to [40°, 170°] (held at 40°, the value nearest zero) and
    // joint 4 to ±60°: the held joint 1 often leaves joint 4 outside.
    let (open, geometry) = upright_elbow_arm(0.12, 0.0);
    let mut model = open.clone();
    model.joints[0].joint.limits = [40f64.to_radians(), 170f64.to_radians()];
    model.joints[3].joint.limits = [-60f64.to_radians(), 60f64.to_radians()];
    let open_solver = Solver::new(&open, &geometry);
    let solver = Solver::new(&model, &geometry);
    let mut rng = SampleRng::new(14);
    let mut checked = 0;
    for _ in 0..armforge_compiler::plan::samples::sample_count(100) {
        // A wrist center on axis 1 (0.09 m tool along its x axis), any orientation.
        let rotation = rng.rotation();
        let c = [0.0, 0.0, 1.0];
        let target = Pose {
            rotation,
            translation: [0, 1, 2].map(|i| c[i] + rotation[i][0] * 0.09),
        };
        let Ok(solutions) = open_solver.solve(&target) else {
            continue;
        };
        for s in solutions {
            // Turning joint 1 keeps the wrist center on axis 1: a configuration within the
            // limits when joints 4–6 are.
            let mut q = s.joints;
            q[0] = rng.range(40f64.to_radians(), 170f64.to_radians());
            let inside = model
                .joints
                .iter()
                .zip(&q)
                .all(|(j, v)| *v >= j.joint.limits[0] && *v <= j.joint.limits[1]);
            if inside {
                let flags = posture_found(&model, &solver, &q, &[1, 2]);
                assert!(flags.contains(Flags::ON_AXIS_1), "on axis 1: {q:?}");
                checked += 1;
            }
        }
    }
    assert!(checked > 20, "{checked}");
}
