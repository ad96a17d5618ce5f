//! Three consecutive parallel axes: round trips on random arms, and the 8 solutions of a
//! generic pose.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::Family;
use armforge_compiler::plan::parallel;
use armforge_compiler::plan::samples::{
    sample_configuration, sample_three_parallel, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

fn round_trip(layout: bool) -> (usize, usize) {
    let mut eight = 0;
    let mut poses = 0;
    for seed in 0..arms() {
        let model = sample_three_parallel(seed, &SampleOptions::default(), layout);
        let solver = Solver::from_plan(parallel::build(&model, Family::Elbow));
        let mut rng = SampleRng::new(5000 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            poses += 1;
            if check_round_trip(&solver, &model, &q, 8, &format!("arm {seed}")) == 8 {
                eight += 1;
            }
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
