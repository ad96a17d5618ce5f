//! Three consecutive parallel axes (the three-parallel family): round trips on random arms
//! classified and planned through the registry, the 8 solutions of generic poses, and the
//! degenerate variants rejected with their reasons.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::{classify, Family, Tolerances};
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::samples::{
    sample_configuration, sample_three_parallel, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

/// (poses with 8 solutions, poses) over the random arms of one placement.
fn round_trip(layout: bool) -> (usize, usize) {
    let mut eight = 0;
    let mut poses = 0;
    for seed in 0..arms() {
        let model = sample_three_parallel(seed, &SampleOptions::default(), layout);
        let geometry = classify(&model, &Tolerances::default())
            .unwrap_or_else(|r| panic!("arm {seed}: rejected: {r}"));
        assert_eq!(geometry.family, Family::ThreeParallel, "arm {seed}");
        assert_eq!(geometry.solutions.total, 8);
        let solver = Solver::from_plan(build_plan(&model, &geometry));
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

/// Pieper (1968): up to 8 solutions; three-parallel arms reach 8 at generic poses (from
/// memory). The layout arms (axes 1 and 5 ⟂ the parallel axes, axis 6 ⟂ axis 5) reach every
/// orientation, so many poses have all 8.
#[test]
fn layout_arms_round_trip_with_eight_solutions() {
    let (eight, poses) = round_trip(true);
    eprintln!("layout: {eight} of {poses} poses with 8 solutions");
    assert!(eight * 20 > poses, "{eight} of {poses}");
}

#[test]
fn general_angle_arms_round_trip() {
    let (eight, poses) = round_trip(false);
    eprintln!("general angles: {eight} of {poses} poses with 8 solutions");
    assert!(eight > 0);
}

/// A three-parallel arm with one axis moved: the precise reasons.
fn rejected_kind(edit: impl Fn(&mut armforge_compiler::model::Model)) -> String {
    let mut model = sample_three_parallel(3, &SampleOptions::default(), true);
    edit(&mut model);
    match classify(&model, &Tolerances::default()) {
        Ok(g) => panic!("accepted as {:?}", g.family),
        Err(r) => r.reason.kind().to_string(),
    }
}

#[test]
fn degenerate_variants_are_rejected_with_their_reason() {
    // Axis 1 parallel to axes 2–4: four parallel axes.
    let kind = rejected_kind(|m| m.joints[0].joint.axis = m.joints[1].joint.axis);
    assert_eq!(kind, "four_parallel_axes");
    // Axis 5 parallel to axes 2–4.
    let kind = rejected_kind(|m| m.joints[4].joint.axis = m.joints[1].joint.axis);
    assert_eq!(kind, "four_parallel_axes");
    // Axis 3 on axis 2: two joints about one line.
    let kind = rejected_kind(|m| m.joints[2].joint.point = m.joints[1].joint.point);
    assert_eq!(kind, "parallel_axes_coincide");
    // Axis 6 on axis 5's line: two joints about one line.
    let kind = rejected_kind(|m| {
        m.joints[5].joint.axis = m.joints[4].joint.axis;
        m.joints[5].joint.point = m.joints[4].joint.point;
    });
    assert_eq!(kind, "axes_5_and_6_one_line");
}

/// Axis 6 moved off axis 5 (along their common normal): the offset-hand family's arm.
#[test]
fn axes_5_and_6_apart_are_the_offset_hand_familys() {
    let mut model = sample_three_parallel(3, &SampleOptions::default(), true);
    let h5 = model.joints[4].joint.axis;
    let h6 = model.joints[5].joint.axis;
    let n = [
        h5[1] * h6[2] - h5[2] * h6[1],
        h5[2] * h6[0] - h5[0] * h6[2],
        h5[0] * h6[1] - h5[1] * h6[0],
    ];
    let p = &mut model.joints[5].joint.point;
    for i in 0..3 {
        p[i] += 0.05 * n[i];
    }
    let g = classify(&model, &Tolerances::default()).unwrap_or_else(|r| panic!("{r}"));
    assert_eq!(g.family, Family::OffsetHand);
}
