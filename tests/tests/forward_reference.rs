//! armforge's forward kinematics (the model built by the description reader, evaluated by the
//! runtime's product of exponentials) against the independent `nalgebra` reference in
//! `armforge_tests` (textbook DH matrices, axis-angle isometries), on every example arm and
//! every twin fixture, at random configurations inside the limits.

use std::path::Path;

use armforge_compiler::pipeline::load_model;
use armforge_tests::{
    example_arm_paths, fixture, pose_difference, sample_count, toml_files_in, ReferenceArm,
};
use rand::rngs::StdRng;
use rand::SeedableRng;

const TOLERANCE: f64 = 1e-12;

fn compare_with_reference(path: &Path, samples: usize) {
    let model = load_model(path, "arm").unwrap_or_else(|d| panic!("{d}"));
    let reference = ReferenceArm::load(path);
    assert_eq!(model.joints.len(), reference.joint_count());
    for (joint, limits) in model.joints.iter().zip(&reference.limits) {
        if joint.joint.limits[0].is_finite() {
            assert!((joint.joint.limits[0] - limits[0]).abs() < TOLERANCE);
            assert!((joint.joint.limits[1] - limits[1]).abs() < TOLERANCE);
        }
    }
    let mut rng = StdRng::seed_from_u64(0x5eed_f00d);
    for _ in 0..samples {
        let q = reference.random_configuration(&mut rng);
        let (rotation, translation) = pose_difference(&model.forward(&q), &reference.forward(&q));
        assert!(
            rotation < TOLERANCE && translation < TOLERANCE,
            "{}: q = {q:?}: rotation differs by {rotation:e}, translation by {translation:e} m",
            path.display()
        );
    }
}

#[test]
fn every_example_arm_matches_the_nalgebra_reference() {
    let arms = example_arm_paths();
    assert!(arms.len() >= 4, "at least four example arms");
    for path in arms {
        compare_with_reference(&path, sample_count(1000));
    }
}

#[test]
fn every_twin_fixture_matches_the_nalgebra_reference() {
    let twins = toml_files_in(&fixture("twins"));
    // Two arms (elbow, cylinder), each in the three conventions.
    assert_eq!(twins.len(), 6, "twin fixtures found: {twins:?}");
    for path in twins {
        compare_with_reference(&path, sample_count(1000));
    }
}

#[test]
fn the_unit_twins_match_the_nalgebra_reference() {
    let units = toml_files_in(&fixture("units"));
    assert_eq!(units.len(), 2, "unit fixtures found: {units:?}");
    for path in units {
        compare_with_reference(&path, sample_count(200));
    }
}
