//! The same arm written in the three conventions (`dh` in m/rad, `modified-dh` in mm/deg,
//! `axes` in m/rad; `tests/fixtures/twins/`) gives the same model and the same forward
//! kinematics to 1e-12 on 1,000 random configurations.
//!
//! The twins were written from one standard DH table: the modified DH rows take `alpha` and
//! `a` from the previous standard row (Craig, Introduction to Robotics, 3rd ed., 2005, §3.4,
//! compared with Spong, Hutchinson & Vidyasagar 2006, §3.2), and the axes file lists the z axes
//! and origins of the standard frames at zero.

use armforge_compiler::model::Model;
use armforge_compiler::pipeline::load_model;
use armforge_tests::{fixture, pose_difference_of, sample_count, ReferenceArm};
use rand::rngs::StdRng;
use rand::SeedableRng;

const TOLERANCE: f64 = 1e-12;

fn load(name: &str) -> Model {
    load_model(&fixture(&format!("twins/{name}.toml")), "arm").unwrap_or_else(|d| panic!("{d}"))
}

fn assert_twins(stem: &str) {
    let dh = load(&format!("{stem}-dh"));
    let mdh = load(&format!("{stem}-mdh"));
    let axes = load(&format!("{stem}-axes"));
    let reference = ReferenceArm::load(&fixture(&format!("twins/{stem}-dh.toml")));
    let mut rng = StdRng::seed_from_u64(7);
    for _ in 0..sample_count(1000) {
        let q = reference.random_configuration(&mut rng);
        let from_dh = dh.forward(&q);
        for (other, name) in [(&mdh, "modified-dh"), (&axes, "axes")] {
            let (r, t) = pose_difference_of(&from_dh, &other.forward(&q));
            assert!(
                r < TOLERANCE && t < TOLERANCE,
                "{stem}: dh and {name} differ at q = {q:?}: rotation {r:e}, translation {t:e} m"
            );
        }
    }
}

fn assert_same_model(a: &Model, b: &Model) {
    assert_eq!(a.joints.len(), b.joints.len());
    for (ja, jb) in a.joints.iter().zip(&b.joints) {
        let (ja, jb) = (&ja.joint, &jb.joint);
        assert_eq!(ja.kind, jb.kind);
        assert_eq!(ja.direction, jb.direction);
        for k in 0..3 {
            assert!((ja.axis[k] - jb.axis[k]).abs() < TOLERANCE, "{ja:?} {jb:?}");
        }
        if ja.kind == armforge_runtime::JointKind::Revolute {
            // The points may be anywhere on the same line: their difference is along the axis.
            let gap = armforge_runtime::math::sub(&ja.point, &jb.point);
            let off_line = armforge_runtime::math::cross(&gap, &ja.axis);
            assert!(
                armforge_runtime::math::norm(&off_line) < TOLERANCE,
                "{ja:?} {jb:?}"
            );
        }
        for k in 0..2 {
            assert!((ja.limits[k] - jb.limits[k]).abs() < TOLERANCE);
        }
    }
    let (r, t) = pose_difference_of(&a.tool, &b.tool);
    assert!(r < TOLERANCE && t < TOLERANCE);
    let (r, t) = pose_difference_of(&a.base, &b.base);
    assert!(r < TOLERANCE && t < TOLERANCE);
}

#[test]
fn an_elbow_arm_in_three_conventions_has_one_forward_kinematics() {
    assert_twins("elbow-twin");
}

#[test]
fn a_cylindrical_arm_in_three_conventions_has_one_forward_kinematics() {
    assert_twins("cylinder-twin");
}

#[test]
fn the_twins_give_the_same_model_of_axes_points_tool_and_base() {
    // Standard DH: joint i turns about z of frame i−1; modified DH: about z of frame i
    // (Craig 2005, §3.4); the model is the same lines either way.
    for stem in ["elbow-twin", "cylinder-twin"] {
        let dh = load(&format!("{stem}-dh"));
        assert_same_model(&dh, &load(&format!("{stem}-mdh")));
        assert_same_model(&dh, &load(&format!("{stem}-axes")));
    }
}
