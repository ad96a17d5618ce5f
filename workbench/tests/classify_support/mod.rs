//! Test support for classification: models built straight from joint lines, rigid motions and
//! re-descriptions of a model, and the numbers that must not change under them.
#![allow(dead_code)]

pub mod arms;

use std::f64::consts::PI;

use armforge_compiler::classify::{ArmEvidence, Geometry, Singularity};
use armforge_compiler::diagnostics::Location;
use armforge_compiler::model::{Model, ModelJoint};
use armforge_compiler::units::Units;
use armforge_runtime::{Joint, JointKind, Pose};
use nalgebra::{Rotation3, Unit, Vector3};
use rand::rngs::StdRng;
use rand::{Rng, SeedableRng};

/// One joint line for [`arm`].
#[derive(Clone, Copy, Debug)]
pub struct Line {
    pub kind: JointKind,
    pub axis: [f64; 3],
    pub point: [f64; 3],
    pub limits: [f64; 2],
}

/// A revolute joint about the line through `point` along `axis`, limits ±π.
pub fn r(axis: [f64; 3], point: [f64; 3]) -> Line {
    Line {
        kind: JointKind::Revolute,
        axis: normalise(axis),
        point,
        limits: [-PI, PI],
    }
}

/// A prismatic joint along `axis` with the stroke `limits` (metres).
pub fn p(axis: [f64; 3], limits: [f64; 2]) -> Line {
    Line {
        kind: JointKind::Prismatic,
        axis: normalise(axis),
        point: [0.0; 3],
        limits,
    }
}

fn normalise(v: [f64; 3]) -> [f64; 3] {
    let n = (v[0] * v[0] + v[1] * v[1] + v[2] * v[2]).sqrt();
    [v[0] / n, v[1] / n, v[2] / n]
}

/// A model (metres, radians) from joint lines and the tool point at zero. Joint `i`'s table
/// is said to start at line `10 i`, column 1, of `test.toml`.
pub fn arm(lines: &[Line], tool: [f64; 3]) -> Model {
    arm_in(lines, tool, Units::default())
}

/// As [`arm`], reporting in `units`.
pub fn arm_in(lines: &[Line], tool: [f64; 3], units: Units) -> Model {
    Model {
        name: "test_arm".into(),
        description: None,
        units,
        joints: lines
            .iter()
            .enumerate()
            .map(|(i, l)| ModelJoint {
                joint: Joint {
                    kind: l.kind,
                    axis: l.axis,
                    point: l.point,
                    direction: 1.0,
                    offset: 0.0,
                    limits: l.limits,
                },
                name: format!("j{}", i + 1),
                location: Location {
                    line: 10 * (i + 1),
                    column: 1,
                },
            })
            .collect(),
        tool: Pose {
            rotation: Pose::IDENTITY.rotation,
            translation: tool,
        },
        base: Pose::IDENTITY,
        source_path: "test.toml".into(),
    }
}

/// A rigid motion: rotation then translation.
#[derive(Clone, Copy, Debug)]
pub struct Motion {
    pub rotation: Rotation3<f64>,
    pub translation: Vector3<f64>,
}

impl Motion {
    pub fn random(rng: &mut StdRng) -> Motion {
        let axis = Unit::new_normalize(Vector3::new(
            rng.random_range(-1.0..1.0),
            rng.random_range(-1.0..1.0),
            rng.random_range(-1.0..1.0) + 1e-3,
        ));
        Motion {
            rotation: Rotation3::from_axis_angle(&axis, rng.random_range(-PI..PI)),
            translation: Vector3::new(
                rng.random_range(-3.0..3.0),
                rng.random_range(-3.0..3.0),
                rng.random_range(-3.0..3.0),
            ),
        }
    }
    pub fn point(&self, p: [f64; 3]) -> [f64; 3] {
        let q = self.rotation * Vector3::from(p) + self.translation;
        [q.x, q.y, q.z]
    }
    pub fn vector(&self, v: [f64; 3]) -> [f64; 3] {
        let q = self.rotation * Vector3::from(v);
        [q.x, q.y, q.z]
    }
}

/// The same arm moved rigidly: every axis, point and the tool pose (as when the file describes
/// the arm in a frame on a wall or a ceiling).
pub fn moved(model: &Model, m: &Motion) -> Model {
    let mut out = model.clone();
    for j in &mut out.joints {
        j.joint.axis = m.vector(j.joint.axis);
        j.joint.point = m.point(j.joint.point);
    }
    let r = m.rotation.matrix();
    let t = &model.tool.rotation;
    let mut rotation = [[0.0; 3]; 3];
    for (i, row) in rotation.iter_mut().enumerate() {
        for (k, x) in row.iter_mut().enumerate() {
            *x = (0..3).map(|l| r[(i, l)] * t[l][k]).sum();
        }
    }
    out.tool = Pose {
        rotation,
        translation: m.point(model.tool.translation),
    };
    out
}

/// The same arm described differently: each axis point slid along its axis, some axis
/// directions flipped (with the joint's direction sign flipped, so the joint values mean the
/// same motion), and a random base pose.
pub fn redescribed(model: &Model, rng: &mut StdRng) -> Model {
    let mut out = model.clone();
    for j in &mut out.joints {
        let s: f64 = rng.random_range(-2.0..2.0);
        let a = j.joint.axis;
        j.joint.point = [
            j.joint.point[0] + s * a[0],
            j.joint.point[1] + s * a[1],
            j.joint.point[2] + s * a[2],
        ];
        if rng.random_bool(0.5) {
            j.joint.axis = [-a[0], -a[1], -a[2]];
            j.joint.direction = -j.joint.direction;
            j.joint.offset = -j.joint.offset;
        }
    }
    let m = Motion::random(rng);
    out.base = Pose {
        rotation: {
            let r = m.rotation.matrix();
            [
                [r[(0, 0)], r[(0, 1)], r[(0, 2)]],
                [r[(1, 0)], r[(1, 1)], r[(1, 2)]],
                [r[(2, 0)], r[(2, 1)], r[(2, 2)]],
            ]
        },
        translation: m.point([0.0; 3]),
    };
    out
}

/// A seeded random source.
pub fn rng(seed: u64) -> StdRng {
    StdRng::seed_from_u64(seed)
}

/// The joint value of joint `index` (0-based) for a model value, wrapped to (−π, π] for a
/// revolute joint.
pub fn joint_value(model: &Model, index: usize, model_value: f64) -> f64 {
    let j = &model.joints[index].joint;
    let q = j.joint_value(model_value);
    match j.kind {
        JointKind::Revolute => {
            let w = q.rem_euclid(2.0 * PI);
            if w > PI - 1e-12 {
                w - 2.0 * PI
            } else {
                w
            }
        }
        JointKind::Prismatic => q,
    }
}

/// Every number of a classification that does not depend on where the arm stands or how its
/// frames were written: lengths (m), angles (rad), joint values, counts.
pub fn invariant_numbers(model: &Model, g: &Geometry) -> Vec<(String, f64)> {
    let mut out: Vec<(String, f64)> = Vec::new();
    let mut put = |k: &str, v: f64| out.push((k.to_string(), v));
    put("arm_size", g.resolved.arm_size);
    if let Some(w) = &g.wrist {
        put("wrist.miss", w.miss);
        for (i, x) in w.gaps.iter().enumerate() {
            put(&format!("wrist.gap{i}"), *x);
        }
        put("wrist.angle_4_5", w.angle_4_5);
        put("wrist.angle_5_6", w.angle_5_6);
        put("wrist.range0", w.axis_4_6_angle_range[0]);
        put("wrist.range1", w.axis_4_6_angle_range[1]);
    }
    put("solutions", f64::from(g.solutions.total));
    if let Some(r) = g.reach {
        put("reach.min", r.min);
        put("reach.max", r.max);
    }
    match &g.arm {
        ArmEvidence::Elbow(e) => {
            put("shoulder.offset", e.shoulder.offset);
            put("shoulder.angle", e.shoulder.angle_1_2);
            put("sideways_offset", e.shoulder.sideways_offset);
            put("upper_arm", e.upper_arm);
            put("forearm", e.forearm);
            put("stretched", joint_value(model, 2, e.stretched_at));
            put("folded", joint_value(model, 2, e.folded_at));
        }
        ArmEvidence::Polar(e) => {
            put("shoulder.offset", e.shoulder.offset);
            put("shoulder.angle", e.shoulder.angle_1_2);
            put("sideways_offset", e.shoulder.sideways_offset);
            put("slide_angle", e.slide_angle_to_axis_2);
            put("closest", e.closest_to_axis_2);
            put("closest_at", joint_value(model, 2, e.closest_at));
        }
        ArmEvidence::Cylindrical(e) => {
            put("angle2", e.slide_angles_to_axis_1[0]);
            put("angle3", e.slide_angles_to_axis_1[1]);
            put("between", e.angle_between_slides);
            put("distance", e.distance_from_axis_1);
        }
        ArmEvidence::Cartesian(e) => {
            for (i, a) in e.angles.iter().enumerate() {
                put(&format!("angle{i}"), *a);
            }
            put("out_of_plane", e.slide_3_out_of_plane);
            put("independence", e.independence);
        }
        ArmEvidence::ThreeParallel(e) => {
            put("shoulder.offset", e.shoulder.offset);
            put("shoulder.angle", e.shoulder.angle_1_2);
            put("sideways_offset", e.shoulder.sideways_offset);
            put("upper_arm", e.upper_arm);
            put("forearm", e.forearm);
            put("angle_5", e.angle_5_to_parallel);
            put("angle_5_6", e.angle_5_6);
            put("stretched", joint_value(model, 2, e.stretched_at));
        }
        ArmEvidence::General(e) => {
            put("common_normal_1_2", e.common_normal_1_2);
            put("angle_1_2", e.angle_1_2);
            put("common_normal_2_3", e.common_normal_2_3);
            put("angle_2_3", e.angle_2_3);
            put("wrist_center_from_axis_3", e.wrist_center_from_axis_3);
        }
        ArmEvidence::BaseWrist(e) => {
            put("base_wrist.miss", e.wrist.miss);
            put("base_wrist.angle_1_2", e.wrist.angle_5_6);
            put("base_wrist.angle_2_3", e.wrist.angle_4_5);
        }
        ArmEvidence::OffsetHand(e) => {
            put("angle_1_2", e.angle_1_to_parallel);
            put("upper_arm", e.upper_arm);
            put("forearm", e.forearm);
            put("angle_5", e.angle_5_to_parallel);
            put("angle_5_6", e.angle_5_6);
            put("gap_5_6", e.gap_5_6);
        }
        ArmEvidence::BaseParallel(e) => {
            put("link_1_2", e.link_1_2);
            put("link_2_3", e.link_2_3);
            put("angle_4", e.angle_4_to_parallel);
            put("angle_4_5", e.angle_4_5);
            put("gap_4_5", e.gap_4_5);
            put("angle_5_6", e.angle_5_6);
            put("gap_5_6", e.gap_5_6);
            put("stretched", joint_value(model, 1, e.stretched_at));
        }
        ArmEvidence::BaseSlide(e) => {
            put("slide_angle_to_axis_2", e.slide_angle_to_axis_2);
            put("common_normal_2_3", e.common_normal_2_3);
            put("angle_2_3", e.angle_2_3);
            put("wrist_center_from_axis_3", e.wrist_center_from_axis_3);
        }
        ArmEvidence::MidWrist(e) => {
            put("mid_wrist.miss", e.wrist.miss);
            put("mid_wrist.angle_2_3", e.wrist.angle_4_5);
            put("mid_wrist.angle_3_4", e.wrist.angle_5_6);
            put("center_from_axis_1", e.center_from_axis_1);
            put("center_from_axis_5", e.center_from_axis_5);
            put("common_normal_5_6", e.common_normal_5_6);
            put("angle_5_6", e.angle_5_6);
        }
        ArmEvidence::Carriage(e) => {
            put("between", e.angle_between_slides);
            put("axis_3_to_normal", e.axis_3_to_normal);
            put("wrist_center_from_axis_3", e.wrist_center_from_axis_3);
            put("swing", e.swing);
            put("highest", joint_value(model, 2, e.extremes[0]));
            put("lowest", joint_value(model, 2, e.extremes[1]));
        }
        ArmEvidence::GeneralSlide(e) => {
            put("common_normal_1_2", e.common_normal_1_2);
            put("angle_1_2", e.angle_1_2);
            put("slide_angle", e.slide_angle_to_axis_2);
            put("wrist_center_from_axis_2", e.wrist_center_from_axis_2);
        }
        ArmEvidence::MiddleSlide(e) => {
            put("slide_angle", e.slide_angle_to_axis_1);
            put("angle_1_3", e.angle_1_3);
            put("common_normal_1_3", e.common_normal_1_3);
            put("wrist_center_from_axis_3", e.wrist_center_from_axis_3);
        }
        ArmEvidence::ToolFirst(e) => {
            // The mirrored arm's numbers: it stands where the arm stands.
            let mirrored = armforge_compiler::family::mirror::mirrored_model(model);
            for (k, v) in invariant_numbers(&mirrored, &e.mirrored) {
                put(&format!("mirrored.{k}"), v);
            }
        }
    }
    for s in &g.singularities {
        match s {
            Singularity::WristAligned { joint_5_at } => {
                let mut at: Vec<f64> = joint_5_at
                    .iter()
                    .map(|&m| joint_value(model, 4, m))
                    .collect();
                at.sort_by(f64::total_cmp);
                for q in at {
                    put("aligned", q);
                }
            }
            Singularity::Shoulder { offset, .. } => put("shoulder_sing", *offset),
            _ => {}
        }
    }
    out
}

/// Asserts two lists of invariant numbers agree within `tolerance`.
pub fn assert_same_numbers(a: &[(String, f64)], b: &[(String, f64)], tolerance: f64) {
    assert_eq!(a.len(), b.len(), "{a:?}\nvs\n{b:?}");
    for ((ka, va), (kb, vb)) in a.iter().zip(b) {
        assert_eq!(ka, kb);
        let same = (va - vb).abs() <= tolerance || (va.is_infinite() && va == vb);
        assert!(same, "{ka}: {va} vs {vb}");
    }
}
