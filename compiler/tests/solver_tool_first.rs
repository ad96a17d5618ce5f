//! The tool-first family (axes 3–5 parallel, axes 1 and 2 meeting: read from the tool, a
//! three-parallel arm): round trips on random arms classified and planned through the registry
//! (mirrored decoupling), the 8 solutions of generic poses, and the arms the family cannot
//! take rejected with their reasons in the arm's numbering.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::{classify, ArmEvidence, Family, Tolerances};
use armforge_compiler::model::Model;
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

/// (poses with 8 solutions, poses) over the random arms of one placement of the mirrored
/// three-parallel arm (even seeds: the layout; odd seeds: every angle).
fn round_trip(parity: u64) -> (usize, usize) {
    let mut eight = 0;
    let mut poses = 0;
    for n in 0..arms() {
        let seed = 2 * n + parity;
        let (model, geometry) = sample_arm(Family::ToolFirst, seed, &SampleOptions::default());
        let ArmEvidence::ToolFirst(e) = &geometry.arm else {
            panic!("arm {seed}: evidence {:?}", geometry.arm);
        };
        assert_eq!(e.mirrored_family, Family::ThreeParallel, "arm {seed}");
        assert_eq!(geometry.solutions.total, 8, "arm {seed}");
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        let mut rng = SampleRng::new(6000 + seed);
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

/// Pieper (1968): up to 8 solutions; the mirror of a three-parallel arm has its solutions
/// (reading an arm from its tool changes no solution, only the order of the joints), 8 at
/// generic poses of the layout (from memory).
#[test]
fn layout_mirrors_round_trip_with_eight_solutions() {
    let (eight, poses) = round_trip(0);
    eprintln!("tool-first, layout mirrors: {eight} of {poses} poses with 8 solutions");
    assert!(eight * 20 > poses, "{eight} of {poses}");
}

#[test]
fn general_angle_mirrors_round_trip() {
    let (eight, poses) = round_trip(1);
    eprintln!("tool-first, general angles: {eight} of {poses} poses with 8 solutions");
    assert!(eight > 0);
}

/// A tool-first arm with one axis moved: rejected with the reason in the arm's numbering.
fn rejected(edit: impl Fn(&mut Model)) -> (String, String, Option<usize>) {
    let (mut model, _) = sample_arm(Family::ToolFirst, 4, &SampleOptions::default());
    edit(&mut model);
    match classify(&model, &Tolerances::default()) {
        Ok(g) => panic!("accepted as {:?}", g.family),
        Err(r) => (r.reason.kind().to_string(), r.message, r.joint),
    }
}

#[test]
fn arms_the_family_cannot_take_are_rejected_with_their_reason() {
    // Axis 2 moved off axis 1 (along their common normal): axes 3–5 stay parallel and axes 1
    // and 2 pass apart: the mirror of an offset-hand arm, still this family's.
    let (mut model, _) = sample_arm(Family::ToolFirst, 4, &SampleOptions::default());
    let h1 = model.joints[0].joint.axis;
    let h2 = model.joints[1].joint.axis;
    let n = [
        h1[1] * h2[2] - h1[2] * h2[1],
        h1[2] * h2[0] - h1[0] * h2[2],
        h1[0] * h2[1] - h1[1] * h2[0],
    ];
    let p = &mut model.joints[1].joint.point;
    for i in 0..3 {
        p[i] += 0.05 * n[i];
    }
    let g = classify(&model, &Tolerances::default()).unwrap_or_else(|r| panic!("{r}"));
    assert_eq!(g.family, Family::ToolFirst);
    let ArmEvidence::ToolFirst(e) = &g.arm else {
        panic!("{:?}", g.arm);
    };
    assert_eq!(e.mirrored_family, Family::OffsetHand);
    // Axis 6 parallel to axes 3–5: four parallel axes, in the arm's numbering.
    let (kind, message, _) = rejected(|m| m.joints[5].joint.axis = m.joints[4].joint.axis);
    assert_eq!(kind, "four_parallel_axes", "{message}");
    assert!(
        message.contains("axes of joints 3–6 are parallel"),
        "{message}"
    );
}

/// Near-singular bands: joint 2 approaching the value at which axis 1 lines up with the
/// parallel axes 3–5 (the mirrored arm's aligned joint 5), and joint 4 approaching the
/// stretched hinges, at distances 1e-2 … 1e-8 rad. Every solution reproduces the pose, and
/// `solve_near` from the configuration comes back to it, to within `1e-11 / δ` (joints 1 and
/// 3–5 share one sum at the alignment, so their values are conditioned by the distance).
#[test]
fn near_singular_bands_keep_the_pose() {
    let mut checked = 0;
    for n in 0..arms() / 4 {
        let seed = 2 * n;
        let (model, geometry) = sample_arm(Family::ToolFirst, seed, &SampleOptions::default());
        let ArmEvidence::ToolFirst(e) = &geometry.arm else {
            panic!("arm {seed}: evidence {:?}", geometry.arm);
        };
        let ArmEvidence::ThreeParallel(inner) = &e.mirrored.arm else {
            panic!("arm {seed}: mirrored evidence {:?}", e.mirrored.arm);
        };
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        let reach = solver.plan().arm.scale;
        let mut rng = SampleRng::new(7000 + seed);
        // (arm joint, model value of the singular configuration)
        let mut bands: Vec<(usize, f64)> = inner.aligned_at.iter().map(|&m| (1, m)).collect();
        bands.push((3, inner.stretched_at));
        for (joint, at) in bands {
            for delta in [1e-2, 1e-4, 1e-6, 1e-8] {
                let mut q = sample_configuration(&model, &mut rng);
                q[joint] = model.joints[joint].joint.joint_value(at + delta);
                let target = model.forward(&q);
                let what = format!("arm {seed}, joint {} at {delta:e} from {at}", joint + 1);
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
                // The joints lose digits as rounding over the distance from the singular
                // value (measured: at most 4e-13 / δ on these arms).
                assert!(gap < 1e-11 / delta, "{what}: {gap:e} from {q:?}");
                checked += 1;
            }
        }
    }
    eprintln!("tool-first near-singular bands: {checked} poses");
    assert!(checked > 0);
}
