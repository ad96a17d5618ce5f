//! The wrist at the base (axes 1–3 meet): round trips on random arms whose last three joints
//! have every named family's shape, solved by mirrored decoupling.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::{classify, Family, Tolerances};
use armforge_compiler::model::Model;
use armforge_compiler::plan::mirror;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

/// A random arm with its wrist at the base whose joints 6, 5, 4 have the shape of `family`.
fn base_wrist_arm(family: Family, seed: u64) -> Model {
    let (inner, _) = sample_arm(family, seed, &SampleOptions::default());
    let mut arm = mirror::mirrored_model(&inner);
    let mut rng = SampleRng::new(77 + seed);
    arm.tool = rng.pose(0.5);
    arm.base = rng.pose(1.0);
    arm
}

fn round_trip(family: Family, most: usize) -> usize {
    let mut full = 0;
    for seed in 0..arms() {
        let model = base_wrist_arm(family, seed);
        let inner = classify(&mirror::mirrored_model(&model), &Tolerances::default())
            .unwrap_or_else(|r| panic!("arm {seed}: mirrored arm rejected: {r}"));
        assert_eq!(inner.family, family);
        let solver = Solver::from_plan(mirror::build(
            &model,
            &inner,
            family,
            family.module().position_step().expect("decoupled"),
        ));
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
    eprintln!("elbow: {} poses with 8", round_trip(Family::Elbow, 8));
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
