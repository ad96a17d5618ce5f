//! The general family (R R R of no named family, spherical wrist, a quartic): round trips on
//! random arms, the count of solutions (at most 4 positions × 2 wrists, and 4 positions on
//! some poses: Pieper 1968), and elbow arms solved through the general path against their own
//! plan (a cross-check of both).

mod common;

use common::{arms, check_round_trip, joint_gap};

use armforge_compiler::family::{Family, FamilyModule};
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, SampleOptions, SampleRng,
};
use armforge_compiler::plan::{decoupled_plan, samples::sample_count};
use armforge_compiler::solver::Solver;
use armforge_runtime::Solution;

#[test]
fn general_arms_round_trip_with_at_most_eight_solutions() {
    let (mut eight, mut poses, mut most) = (0, 0, 0);
    for seed in 0..arms() {
        let (model, geometry) = sample_arm(Family::General, seed, &SampleOptions::default());
        assert_eq!(geometry.family, Family::General);
        let solver = Solver::new(&model, &geometry);
        let mut rng = SampleRng::new(7000 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            poses += 1;
            // Pieper 1968: a quartic, so at most 4 positions, each with 2 wrist solutions.
            let n = check_round_trip(&solver, &model, &q, 8, &format!("general arm {seed}"));
            most = most.max(n);
            if n == 8 {
                eight += 1;
            }
        }
    }
    eprintln!("general: {eight} of {poses} poses with 8 solutions (4 positions), most {most}");
    assert!(eight > 0, "no pose reached 4 positions");
}

/// The solutions of `solver` at `forward(q)`, or none.
fn solutions(solver: &Solver, target: &armforge_runtime::Pose) -> Vec<Solution> {
    solver.solve(target).unwrap_or_default()
}

/// Random arms of the general family's sub-cases (axes 1 and 2 meeting, or parallel) round
/// trip with at most 4 positions and reach 4 on some pose (Pieper 1968, from memory).
fn sub_case_round_trips(options: SampleOptions, what: &str) {
    let (mut eight, mut poses, mut most) = (0, 0, 0);
    for seed in 0..arms() {
        let (model, geometry) = sample_arm(Family::General, seed, &options);
        assert_eq!(geometry.family, Family::General);
        let solver = Solver::new(&model, &geometry);
        let mut rng = SampleRng::new(8000 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            poses += 1;
            let n = check_round_trip(&solver, &model, &q, 8, &format!("{what} arm {seed}"));
            most = most.max(n);
            if n == 8 {
                eight += 1;
            }
        }
    }
    eprintln!("{what}: {eight} of {poses} poses with 8 solutions (4 positions), most {most}");
    assert!(eight > 0, "no pose reached 4 positions");
}

#[test]
fn general_arms_with_axes_1_and_2_meeting_round_trip() {
    sub_case_round_trips(
        SampleOptions {
            shoulder_axes_meet: true,
            ..SampleOptions::default()
        },
        "general, axes 1 and 2 meeting",
    );
}

#[test]
fn general_arms_with_axes_1_and_2_parallel_round_trip() {
    sub_case_round_trips(
        SampleOptions {
            shoulder_axes_parallel: true,
            ..SampleOptions::default()
        },
        "general, axes 1 and 2 parallel",
    );
}

#[test]
fn elbow_arms_through_the_general_path_agree_with_their_own_plan() {
    let (compared, poses) = through_the_general_path(SampleOptions::default());
    eprintln!("elbow arms through the general path: {compared} of {poses} poses compared");
    assert!(compared > poses / 2);
}

#[test]
fn elbow_arms_with_meeting_shoulder_axes_through_the_general_path_agree() {
    // Axes 1 and 2 meet: the general family's meeting sub-case against the elbow plan.
    let options = SampleOptions {
        shoulder_axes_meet: true,
        ..SampleOptions::default()
    };
    let (compared, poses) = through_the_general_path(options);
    eprintln!("meeting elbow arms through the general path: {compared} of {poses} compared");
    assert!(compared > poses / 2);
}

/// Elbow arms solved by their own plan and by the general family's position step: the same
/// solutions away from reach boundaries. Returns (poses compared, poses).
fn through_the_general_path(options: SampleOptions) -> (usize, usize) {
    let general = armforge_compiler::family::general::GENERAL
        .position_step()
        .expect("a decoupled family");
    let (mut compared, mut poses) = (0, 0);
    for seed in 0..sample_count(100) as u64 {
        let (model, geometry) = sample_arm(Family::Elbow, seed, &options);
        let own = Solver::new(&model, &geometry);
        // Axes 1 and 2 nearly meeting, but not within the tolerance, make the quartic
        // ill-conditioned: the general family's own evidence keeps such arms apart.
        let arm = &own.plan().arm;
        let gap = armforge_compiler::classify::decoupled::gap(arm, 1, 2);
        if gap < 1e-3 && gap > 1e-6 * arm.scale {
            continue;
        }
        let mut plan = decoupled_plan(&model, &geometry, general);
        plan.labels_by_solving = true;
        let through_general = Solver::from_plan(plan);
        let mut rng = SampleRng::new(9000 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let target = model.forward(&q);
            let a = solutions(&own, &target);
            let b = solutions(&through_general, &target);
            poses += 1;
            // Away from reach boundaries the two sets are the same configurations.
            if a.iter().any(|s| !s.flags.is_empty()) || b.iter().any(|s| !s.flags.is_empty()) {
                continue;
            }
            assert_eq!(
                a.len(),
                b.len(),
                "elbow arm {seed}, {q:?}: {a:#?} vs {b:#?}"
            );
            for s in &a {
                assert!(
                    b.iter()
                        .any(|t| joint_gap(&model, &s.joints, &t.joints) < 1e-7),
                    "elbow arm {seed}: {s:?} missing from the general path's {b:#?}"
                );
            }
            compared += 1;
        }
    }
    (compared, poses)
}

#[test]
fn the_reagent_rack_reacher_reaches_four_positions() {
    // An invented example arm of our lab: axes 2 and 3 make 25°.
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("../arms/reagent-rack-reacher-axes.toml");
    let model = armforge_compiler::pipeline::load_model(&path, "reagent-rack-reacher")
        .unwrap_or_else(|e| panic!("{e}"));
    let solver = Solver::for_model(&model).unwrap_or_else(|r| panic!("{r}"));
    assert_eq!(solver.plan().arm.family, Family::General);
    let mut rng = SampleRng::new(17);
    let (mut eight, poses) = (0, sample_count(300));
    for _ in 0..poses {
        let q = sample_configuration(&model, &mut rng);
        if check_round_trip(&solver, &model, &q, 8, "reagent-rack-reacher") == 8 {
            eight += 1;
        }
    }
    eprintln!("reagent-rack-reacher: {eight} of {poses} poses with 8 solutions");
    // Pieper 1968: up to 4 positions; this arm reaches them.
    assert!(eight > 0);
}
