//! Three consecutive parallel axes with axes 5 and 6 passing apart (the offset-hand family):
//! round trips on random arms classified and planned through the registry, the same arms read
//! from the tool (axes 3–5 parallel, axes 1 and 2 apart: the tool-first family), and the
//! classification of the neighbours.
//!
//! Check values: Pieper (1968), three consecutive parallel axes: a quartic, so at most 4
//! placements of joints 1, 5 and 6, each with 2 bends of the planar chain: at most 8
//! solutions, reached at generic poses (from memory).

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::{classify, ArmEvidence, Family, Tolerances};
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::samples::{
    sample_configuration, sample_offset_hand, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

/// Poses with 8 solutions by kind of hand (axes 5 and 6 at an angle, parallel), over random
/// arms of one placement; and the poses tried.
fn round_trip(layout: bool) -> ([usize; 2], usize) {
    let mut eight = [0; 2];
    let mut poses = 0;
    for seed in 0..arms() {
        let model = sample_offset_hand(seed, &SampleOptions::default(), layout);
        let geometry = classify(&model, &Tolerances::default())
            .unwrap_or_else(|r| panic!("arm {seed}: rejected: {r}"));
        assert_eq!(geometry.family, Family::OffsetHand, "arm {seed}");
        assert_eq!(geometry.solutions.total, 8);
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        let mut rng = SampleRng::new(6100 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            poses += 1;
            let what = format!("offset-hand arm {seed}");
            if check_round_trip(&solver, &model, &q, 8, &what) == 8 {
                eight[usize::from(seed % 3 == 2)] += 1;
            }
        }
    }
    (eight, poses)
}

#[test]
fn layout_arms_round_trip() {
    let (eight, poses) = round_trip(true);
    eprintln!(
        "offset hand, layout: {eight:?} of {poses} poses with 8 solutions (angled, parallel)"
    );
    assert!(eight[0] > 0, "{eight:?}");
}

#[test]
fn general_angle_arms_round_trip() {
    let (eight, poses) = round_trip(false);
    eprintln!("offset hand, any angles: {eight:?} of {poses} poses with 8 solutions");
    assert!(eight[0] > 0, "{eight:?}");
}

/// Axes 3–5 parallel with axes 1 and 2 apart: the mirror of an offset-hand arm, read from the
/// tool by the tool-first family through the offset-hand family's target step.
#[test]
fn mirrored_arms_round_trip_read_from_the_tool() {
    let mut full = 0;
    for seed in 0..arms() {
        let inner = sample_offset_hand(seed, &SampleOptions::default(), seed % 2 == 0);
        let mut model = armforge_compiler::family::mirror::mirrored_model(&inner);
        let mut rng = SampleRng::new(7300 + seed);
        model.tool = rng.pose(0.5);
        model.base = rng.pose(1.0);
        let geometry = classify(&model, &Tolerances::default())
            .unwrap_or_else(|r| panic!("arm {seed}: rejected: {r}"));
        assert_eq!(geometry.family, Family::ToolFirst, "arm {seed}");
        assert_eq!(geometry.solutions.total, 8, "arm {seed}");
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let what = format!("axes 3–5 parallel, arm {seed}");
            if check_round_trip(&solver, &model, &q, 8, &what) == 8 {
                full += 1;
            }
        }
    }
    eprintln!("axes 3–5 parallel, axes 1–2 apart: {full} poses with 8 solutions");
    assert!(full > 0);
}

/// Near-singular bands: joint 5 approaching a value at which axis 6 lines up with the parallel
/// axes (joint 6 and the planar chain then share one rotation, and two roots of the quartic
/// merge), at distances 1e-2 … 1e-8 rad. Every solution reproduces the pose, and `solve_near`
/// from the configuration comes back to it, to within `1e-11 / δ` (joints 2–4 and 6 share one
/// sum at the alignment, so their values are conditioned by the distance).
#[test]
fn near_singular_bands_keep_the_pose() {
    let mut checked = 0;
    let mut worst: f64 = 0.0;
    for seed in 0..arms() / 4 {
        let model = sample_offset_hand(seed, &SampleOptions::default(), seed % 2 == 0);
        let geometry = classify(&model, &Tolerances::default()).unwrap_or_else(|r| panic!("{r}"));
        let ArmEvidence::OffsetHand(e) = &geometry.arm else {
            panic!("arm {seed}: evidence {:?}", geometry.arm);
        };
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        let reach = solver.plan().arm.scale;
        let mut rng = SampleRng::new(7500 + seed);
        for &at in &e.aligned_at {
            for delta in [1e-2, 1e-4, 1e-6, 1e-8] {
                let mut q = sample_configuration(&model, &mut rng);
                q[4] = model.joints[4].joint.joint_value(at + delta);
                let target = model.forward(&q);
                let what = format!("arm {seed}, joint 5 at {delta:e} from {at}");
                let solutions = solver
                    .solve(&target)
                    .unwrap_or_else(|r| panic!("{what}: unsolved: {r}"));
                for s in &solutions {
                    let err = common::pose_error(&solver.forward(&s.joints), &target, reach);
                    assert!(err < 1e-9, "{what}: {s:?} misses by {err:e}");
                }
                let near = solver
                    .solve_near(&target, &q)
                    .unwrap_or_else(|r| panic!("{what}: solve_near: {r}"));
                let err = common::pose_error(&solver.forward(&near.joints), &target, reach);
                assert!(err < 1e-9, "{what}: solve_near misses by {err:e}");
                let gap = common::joint_gap(&model, &near.joints, &q);
                assert!(gap < 1e-11 / delta, "{what}: {gap:e} from {q:?}");
                worst = worst.max(gap * delta);
                checked += 1;
            }
        }
    }
    eprintln!("offset-hand near-singular bands: {checked} poses, joints within {worst:.1e} / δ");
    assert!(checked > 0);
}
