//! Round trips through the interpreter for random arms of every family: random
//! configurations → forward → solve. The original configuration must be among the solutions,
//! every solution must reproduce the pose, lie within the limits, carry the label that
//! `branch_of` reads back, and differ from the others.
//!
//! Sample counts are modest by default; `ARMFORGE_SCALE=K` (release builds) runs K times more
//! arms.

use std::f64::consts::{PI, TAU};

use armforge_compiler::classify::Family;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, sample_count, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;
use armforge_runtime::{JointKind, Pose, Solution};

/// (arms, configurations per arm): small in debug builds, more in release builds (CI), `K`
/// times the arms with `ARMFORGE_SCALE=K`.
fn counts() -> (u64, usize) {
    if cfg!(debug_assertions) {
        (sample_count(25) as u64, 25)
    } else {
        (sample_count(100) as u64, 100)
    }
}

/// Position error relative to the arm's reach, and rotation error by Frobenius norm.
fn pose_error(a: &Pose, b: &Pose, reach: f64) -> (f64, f64) {
    let mut p: f64 = 0.0;
    for i in 0..3 {
        p += (a.translation[i] - b.translation[i]).powi(2);
    }
    let mut r: f64 = 0.0;
    for i in 0..3 {
        for j in 0..3 {
            r += (a.rotation[i][j] - b.rotation[i][j]).powi(2);
        }
    }
    (p.sqrt() / reach, r.sqrt())
}

fn joint_gap(kind: JointKind, limits: [f64; 2], a: f64, b: f64) -> f64 {
    let d = a - b;
    if kind == JointKind::Revolute && limits[1] - limits[0] <= TAU + 1e-9 {
        (d - TAU * (d / TAU).round()).abs()
    } else {
        d.abs()
    }
}

fn same(solver: &Solver, a: &[f64; 6], b: &[f64; 6], tol: f64) -> bool {
    solver
        .plan()
        .arm
        .joints
        .iter()
        .zip(a.iter().zip(b.iter()))
        .all(|(j, (x, y))| joint_gap(j.kind, j.limits, *x, *y) < tol)
}

struct Tally {
    poses: usize,
    solutions: usize,
    eight: usize,
    most: usize,
}

fn round_trip(family: Family, options: &SampleOptions, expect_count: Option<usize>) -> Tally {
    let (arms, configs) = counts();
    let mut tally = Tally {
        poses: 0,
        solutions: 0,
        eight: 0,
        most: 0,
    };
    for seed in 0..arms {
        let (model, geometry) = sample_arm(family, seed, options);
        let solver = Solver::new(&model, &geometry);
        let reach = solver.plan().arm.scale;
        let mut rng = SampleRng::new(1000 + seed);
        for _ in 0..configs {
            let q = sample_configuration(&model, &mut rng);
            let target = model.forward(&q);
            let (dp, dr) = pose_error(&solver.forward(&q), &target, reach);
            assert!(dp < 1e-14 && dr < 1e-14, "canonical arm differs from model");
            let solutions: Vec<Solution> = match solver.solve(&target) {
                Ok(s) => s,
                Err(reason) => panic!("{family:?} arm {seed}: no solution for {q:?}: {reason}"),
            };
            tally.poses += 1;
            tally.solutions += solutions.len();
            tally.most = tally.most.max(solutions.len());
            for s in &solutions {
                let (dp, dr) = pose_error(&solver.forward(&s.joints), &target, reach);
                assert!(
                    dp < 1e-9 && dr < 1e-9,
                    "{family:?} arm {seed}: solution {:?} misses the pose by {dp:e} / {dr:e}",
                    s
                );
                for (j, v) in solver.plan().arm.joints.iter().zip(s.joints.iter()) {
                    assert!(*v >= j.limits[0] - 1e-12 && *v <= j.limits[1] + 1e-12);
                }
                if s.flags.is_empty() {
                    assert_eq!(
                        solver.branch_of(&s.joints),
                        s.branch,
                        "{family:?} arm {seed}: branch_of disagrees for {:?}",
                        s
                    );
                }
            }
            for (i, a) in solutions.iter().enumerate() {
                for b in &solutions[i + 1..] {
                    assert!(
                        !same(&solver, &a.joints, &b.joints, 1e-9),
                        "{family:?} arm {seed}: duplicate solutions {a:?} {b:?}"
                    );
                }
            }
            let found = solutions.iter().any(|s| same(&solver, &s.joints, &q, 1e-6));
            assert!(
                found,
                "{family:?} arm {seed}: original {q:?} ({}) not among {solutions:#?}",
                solver.branch_of(&q)
            );
            if let Some(n) = expect_count {
                if solutions.len() == n {
                    tally.eight += 1;
                }
            }
        }
    }
    eprintln!(
        "{family:?} ({options:?}): {} arms, {} poses, {} solutions, {} with the expected count",
        arms, tally.poses, tally.solutions, tally.eight
    );
    tally
}

#[test]
fn elbow_arms_round_trip() {
    // Any shoulder offset: the across posture may reach less far than the facing one, so only
    // "at most 8" holds everywhere.
    let t = round_trip(Family::Elbow, &SampleOptions::default(), Some(8));
    assert_eq!(t.most, 8);
    assert!(t.eight > 0);
}

#[test]
fn elbow_arms_have_eight_solutions_in_the_dextrous_workspace() {
    // Craig, Introduction to Robotics, 3rd ed., 2005, §4.7; Siciliano et al., Robotics, 2009,
    // §2.12: 4 arm postures × 2 wrist solutions = 8 for a 6R arm with a spherical wrist. With
    // axis 2 meeting axis 1, the facing and across postures reach the same distances, and a wrist
    // with h4 ⟂ h5 ⟂ h6 reaches every orientation, so every reachable generic pose is in the
    // dextrous workspace. (A wrist with other twist angles reaches only a band of directions
    // of axis 6 in some postures.)
    let options = SampleOptions {
        orthogonal_wrist: true,
        shoulder_axes_meet: true,
        ..SampleOptions::default()
    };
    let t = round_trip(Family::Elbow, &options, Some(8));
    assert_eq!(t.eight, t.poses, "generic poses must have all 8 solutions");
}

#[test]
fn elbow_arms_with_orthogonal_wrists_round_trip() {
    let options = SampleOptions {
        orthogonal_wrist: true,
        ..SampleOptions::default()
    };
    let t = round_trip(Family::Elbow, &options, Some(8));
    assert_eq!(t.most, 8);
}

#[test]
fn polar_arms_round_trip() {
    let t = round_trip(Family::Polar, &SampleOptions::default(), None);
    assert!(t.most <= 8);
}

#[test]
fn cylindrical_arms_round_trip() {
    let t = round_trip(Family::Cylindrical, &SampleOptions::default(), None);
    assert!(t.most <= 4);
}

#[test]
fn cartesian_arms_round_trip() {
    let t = round_trip(Family::Cartesian, &SampleOptions::default(), Some(2));
    assert_eq!(
        t.eight, t.poses,
        "a cartesian arm has one posture × 2 wrist solutions"
    );
}

#[test]
fn carriage_arms_round_trip() {
    // P P R: two roots of joint 3 × 2 wrist solutions. A pose from a configuration is within
    // reach for both roots; the other root's slides may leave their strokes.
    let t = round_trip(Family::Carriage, &SampleOptions::default(), Some(4));
    assert_eq!(t.most, 4);
    assert!(
        t.eight * 2 > t.poses,
        "{} of {} poses with 4",
        t.eight,
        t.poses
    );
}

#[test]
fn two_turn_limits_give_one_solution_per_branch_and_list_the_other_turns() {
    let options = SampleOptions {
        revolute_range: TAU,
        ..SampleOptions::default()
    };
    let (model, geometry) = sample_arm(Family::Elbow, 3, &options);
    let solver = Solver::new(&model, &geometry);
    let joints = &solver.plan().arm.joints;
    let mut rng = SampleRng::new(77);
    let q = sample_configuration(&model, &mut rng);
    let solutions = solver.solve(&model.forward(&q)).unwrap();
    // One solution per branch, each joint at the value nearest its range's center (zero).
    assert_eq!(solutions.len(), 8);
    assert_eq!(solver.capacity(), 8);
    for s in &solutions {
        assert!(s.joints.iter().all(|v| v.abs() <= PI + 1e-12), "{s:?}");
        // Over [−2π, 2π] a value within half a turn of zero has exactly one other: ±2π.
        assert_eq!(s.equivalents(joints).per_joint(), [1; 6]);
    }
    // The original is one of the solutions with some joints a whole turn away: listed by
    // the equivalents.
    let reached = solutions.iter().any(|s| {
        let others: Vec<_> = s.equivalents(joints).collect();
        (0..6).all(|i| {
            (s.joints[i] - q[i]).abs() < 1e-6
                || others
                    .iter()
                    .any(|e| e.joint == i && (e.value - q[i]).abs() < 1e-6)
        })
    });
    assert!(
        reached,
        "{q:?} not among {solutions:?} and their equivalents"
    );
    // `solve_near` gives the original itself, not only modulo whole turns.
    let near = solver.solve_near(&model.forward(&q), &q).unwrap();
    for i in 0..6 {
        assert!((near.joints[i] - q[i]).abs() < 1e-6, "{near:?} vs {q:?}");
    }
}
