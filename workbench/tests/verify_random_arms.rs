//! `armforge verify` passes random arms of every family of the registry (the generators of
//! `armforge_compiler::plan::samples`) at the default one-turn revolute limits, joint 5's
//! second aligned position (±180°) included, with random and right-angled wrists; and the
//! general family's sub-cases (axes 1 and 2 meeting or parallel).
//!
//! `ARMFORGE_SCALE=K` (release builds) runs K times the arms per family.

use armforge_compiler::family::{Family, REGISTRY};
use armforge_compiler::plan::samples::{sample_arm, sample_count, SampleOptions};
use armforge_compiler::solver::Solver;
use armforge_workbench::verify::{verify, Options};

#[test]
fn random_arms_of_every_family_pass_at_the_default_limits() {
    let arms = sample_count(5) as u64;
    for family in REGISTRY.iter().map(|m| m.family()) {
        for orthogonal_wrist in [false, true] {
            let options = SampleOptions {
                orthogonal_wrist,
                ..SampleOptions::default()
            };
            for seed in 0..arms {
                let (model, geometry) = sample_arm(family, seed, &options);
                check(family, seed, orthogonal_wrist, &model, &geometry);
            }
        }
    }
}

#[test]
fn random_general_arms_with_axes_1_and_2_meeting_or_parallel_pass() {
    // The general family's two sub-cases with quadratics.
    let arms = sample_count(5) as u64;
    for (meet, parallel) in [(true, false), (false, true)] {
        for orthogonal_wrist in [false, true] {
            let options = SampleOptions {
                orthogonal_wrist,
                shoulder_axes_meet: meet,
                shoulder_axes_parallel: parallel,
                ..SampleOptions::default()
            };
            for seed in 0..arms {
                let (model, geometry) = sample_arm(Family::General, seed, &options);
                check(Family::General, seed, orthogonal_wrist, &model, &geometry);
            }
        }
    }
}

/// `verify` with 1,000 samples passes the random arm `seed` of `family`.
fn check(
    family: Family,
    seed: u64,
    orthogonal_wrist: bool,
    model: &armforge_compiler::model::Model,
    geometry: &armforge_compiler::classify::Geometry,
) {
    let solver = Solver::new(model, geometry);
    let verify_options = Options {
        samples: 1000,
        seed,
        ..Options::default()
    };
    let summary = verify(model, geometry, &solver, &verify_options, &|_| {}).expect("six joints");
    assert!(
        summary.passed,
        "{family:?} seed {seed}, right-angled wrist {orthogonal_wrist}:\n{}",
        summary.to_text(model)
    );
}
