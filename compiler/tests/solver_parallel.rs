//! Three consecutive parallel axes: round trips on random arms, and the 8 solutions of a
//! generic pose.

mod common;

use common::{arms, joint_gap, pose_error};

use armforge_compiler::classify::Family;
use armforge_compiler::plan::parallel;
use armforge_compiler::plan::samples::{
    sample_configuration, sample_three_parallel, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;
use armforge_runtime::Solution;

fn round_trip(layout: bool) -> (usize, usize) {
    let mut eight = 0;
    let mut poses = 0;
    for seed in 0..arms() {
        let model = sample_three_parallel(seed, &SampleOptions::default(), layout);
        let solver = Solver::from_plan(parallel::build(&model, Family::Elbow));
        let reach = solver.plan().arm.scale;
        let mut rng = SampleRng::new(5000 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let target = model.forward(&q);
            let solutions: Vec<Solution> = solver
                .solve(&target)
                .unwrap_or_else(|e| panic!("arm {seed}: no solution for {q:?}: {e}"));
            poses += 1;
            if solutions.len() == 8 {
                eight += 1;
            }
            assert!(solutions.len() <= 8);
            for s in &solutions {
                let e = pose_error(&solver.forward(&s.joints), &target, reach);
                if e >= 1e-9 {
                    eprintln!("arm {seed}: q {q:?}\n all {solutions:#?}");
                }
                assert!(e < 1e-9, "arm {seed}: {s:?} misses by {e:e}");
                if s.flags.is_empty() {
                    assert_eq!(solver.branch_of(&s.joints), s.branch, "arm {seed}: {s:?}");
                }
            }
            for (i, a) in solutions.iter().enumerate() {
                for b in &solutions[i + 1..] {
                    assert!(
                        joint_gap(&model, &a.joints, &b.joints) > 1e-9,
                        "arm {seed}: duplicates"
                    );
                    assert_ne!(a.branch, b.branch, "arm {seed}: one label twice");
                }
            }
            assert!(
                solutions
                    .iter()
                    .any(|s| joint_gap(&model, &s.joints, &q) < 1e-6),
                "arm {seed}: {q:?} ({}) not among {solutions:#?}",
                solver.branch_of(&q)
            );
        }
    }
    (eight, poses)
}

#[test]
fn layout_arms_round_trip() {
    let (eight, poses) = round_trip(true);
    eprintln!("layout: {eight} of {poses} poses with 8 solutions");
    assert!(eight > 0);
}

#[test]
fn general_angle_arms_round_trip() {
    let (eight, poses) = round_trip(false);
    eprintln!("general angles: {eight} of {poses} poses with 8 solutions");
}
