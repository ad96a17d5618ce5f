//! The base-slide family (P R R, axes 2 and 3 skew, spherical wrist, a quartic in the slide):
//! round trips on random arms, the count of solutions (at most 4 positions × 2 wrists, and 4
//! positions on some poses: Pieper 1968), and the label pairs.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::family::Family;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

#[test]
fn base_slide_arms_round_trip_with_at_most_eight_solutions() {
    let (mut eight, mut poses, mut most) = (0, 0, 0);
    for seed in 0..arms() {
        let (model, geometry) = sample_arm(Family::BaseSlide, seed, &SampleOptions::default());
        assert_eq!(geometry.family, Family::BaseSlide);
        let solver = Solver::new(&model, &geometry);
        let mut rng = SampleRng::new(7100 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            poses += 1;
            // Pieper 1968: a quartic, so at most 4 positions, each with 2 wrist solutions.
            let n = check_round_trip(&solver, &model, &q, 8, &format!("base-slide arm {seed}"));
            most = most.max(n);
            if n == 8 {
                eight += 1;
            }
        }
    }
    eprintln!("base-slide: {eight} of {poses} poses with 8 solutions (4 positions), most {most}");
    assert!(eight > 0, "no pose reached 4 positions");
}
