//! The wrist at the base (axes 1–3 meet): round trips on random arms whose last three joints
//! have every decoupled family's shape, classified and planned through the registry (mirrored
//! decoupling), and the arm's rejection when its hand is no family.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::{classify, ArmEvidence, Family, Tolerances};
use armforge_compiler::model::Model;
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::mirror;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

/// A random arm with its wrist at the base whose joints 6, 5, 4 have the shape of `family`.
fn base_wrist_arm(family: Family, seed: u64) -> Model {
    base_wrist_arm_with(family, seed, SampleOptions::default())
}

/// [`base_wrist_arm`] with the hand built with `options`.
fn base_wrist_arm_with(family: Family, seed: u64, options: SampleOptions) -> Model {
    let (inner, _) = sample_arm(family, seed, &options);
    let mut arm = mirror::mirrored_model(&inner);
    let mut rng = SampleRng::new(77 + seed);
    arm.tool = rng.pose(0.5);
    arm.base = rng.pose(1.0);
    arm
}

/// Poses with `most` solutions over the random arms whose hand is `family`.
fn round_trip(family: Family, most: usize) -> usize {
    round_trip_with(family, most, SampleOptions::default())
}

/// [`round_trip`] with the hands built with `options`.
fn round_trip_with(family: Family, most: usize, options: SampleOptions) -> usize {
    let mut full = 0;
    for seed in 0..arms() {
        let model = base_wrist_arm_with(family, seed, options);
        let geometry = classify(&model, &Tolerances::default())
            .unwrap_or_else(|r| panic!("{family:?} arm {seed}: rejected: {r}"));
        assert_eq!(geometry.family, Family::BaseWrist, "{family:?} arm {seed}");
        let ArmEvidence::BaseWrist(e) = &geometry.arm else {
            panic!("{family:?} arm {seed}: evidence {:?}", geometry.arm);
        };
        assert_eq!(e.hand, family);
        assert_eq!(geometry.solutions.total as usize, most);
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        let mut rng = SampleRng::new(9000 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let what = format!("{family:?} arm {seed}");
            if check_round_trip(&solver, &model, &q, most, &what) == most {
                full += 1;
            }
        }
    }
    full
}

#[test]
fn elbow_hand_round_trip() {
    let full = round_trip(Family::Elbow, 8);
    eprintln!("elbow hand: {full} poses with 8");
    assert!(full > 0);
}

#[test]
fn polar_hand_round_trip() {
    round_trip(Family::Polar, 8);
}

#[test]
fn cylindrical_hand_round_trip() {
    round_trip(Family::Cylindrical, 4);
}

#[test]
fn cartesian_hand_round_trip() {
    round_trip(Family::Cartesian, 2);
}

#[test]
fn general_hands_round_trip() {
    // The general family read from the tool: the quartic and its two sub-cases with
    // quadratics (Pieper 1968: up to 4 positions of the meeting point, 8 with the wrist).
    let meeting = SampleOptions {
        shoulder_axes_meet: true,
        ..SampleOptions::default()
    };
    let parallel = SampleOptions {
        shoulder_axes_parallel: true,
        ..SampleOptions::default()
    };
    for (what, options) in [
        ("quartic", SampleOptions::default()),
        ("axes meeting", meeting),
        ("axes parallel", parallel),
    ] {
        let full = round_trip_with(Family::General, 8, options);
        eprintln!("general hand, {what}: {full} poses with 8");
        assert!(full > 0, "{what}");
    }
}

/// Axes 1–3 meet but joints 6, 5, 4 are no family: rejected, saying so.
#[test]
fn a_hand_of_no_family_is_rejected_with_its_reason() {
    let mut model = base_wrist_arm(Family::Elbow, 5);
    // Joint 6 a slide: read from the tool, joints 6, 5, 4 are P R R, no family's pattern.
    model.joints[5].joint.kind = armforge_runtime::JointKind::Prismatic;
    let r = classify(&model, &Tolerances::default()).expect_err("rejected");
    assert_eq!(r.reason.kind(), "base_wrist_hand_unsolved", "{r}");
    assert!(r.message.contains("joint 7 − i"), "{r}");
}
