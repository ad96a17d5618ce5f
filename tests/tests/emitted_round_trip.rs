//! Round trip of the EMITTED solvers (compiled from `arms/*.toml` by `armforge_macros::solver!`)
//! for every example arm: random configurations within the limits → forward kinematics →
//! `solve`.
//!
//! The target pose and every check of a solution use the independent reference: the
//! description read with the `toml` crate and forward kinematics from the textbook definitions
//! with `nalgebra` (`armforge_tests::ReferenceArm`; Spong, Hutchinson & Vidyasagar 2006,
//! eq. 3.10; Craig 2005, eq. 3.6; Murray, Li & Sastry 1994, §3.2).
//!
//! Checks per configuration: the original is among the solutions (modulo full turns where the
//! joint's range is at most one turn); every solution reproduces the pose to 1e-9 (position
//! relative to the arm's size, rotation by the Frobenius norm of the difference); solutions are
//! distinct and within the limits; `branch_of(s.joints) == s.branch`; `solve_near` from the
//! original gives the original; `solve_branch` of the original's branch gives a solution of
//! that branch reproducing the pose.
//!
//! Samples per arm: 100,000 in release builds (a few seconds) and 2,000 in debug builds, times
//! `ARMFORGE_SCALE`.

use std::f64::consts::TAU;

use armforge_compiler::classify::Tolerances;
use armforge_compiler::pipeline::generate_module;
use armforge_runtime::{JointKind, Pose, Solution, JOINTS};
use armforge_tests::emitted::{EmittedArm, EMITTED_ARMS};
use armforge_tests::{sample_count, ReferenceArm};
use nalgebra::Isometry3;
use rand::rngs::StdRng;
use rand::SeedableRng;

fn samples() -> usize {
    sample_count(if cfg!(debug_assertions) {
        2_000
    } else {
        100_000
    })
}

/// The joint table and size of the arm as the generator sees it.
struct ArmFacts {
    joints: [armforge_runtime::Joint; JOINTS],
    size: f64,
}

fn facts(arm: &EmittedArm) -> ArmFacts {
    let generated = generate_module(&arm.file(), arm.path, &Tolerances::default())
        .unwrap_or_else(|e| panic!("{e}"));
    let mut joints = [generated.plan.arm.joints[0]; JOINTS];
    joints.copy_from_slice(&generated.plan.arm.joints);
    ArmFacts {
        joints,
        size: generated.plan.arm.scale,
    }
}

/// (position error ÷ size, rotation error by Frobenius norm) between a pose and a reference.
fn pose_error(a: &Isometry3<f64>, b: &Isometry3<f64>, size: f64) -> (f64, f64) {
    let dp = (a.translation.vector - b.translation.vector).norm() / size;
    let dr = (a.rotation.to_rotation_matrix().matrix() - b.rotation.to_rotation_matrix().matrix())
        .norm();
    (dp, dr)
}

fn pose_of(iso: &Isometry3<f64>) -> Pose {
    let r = iso.rotation.to_rotation_matrix();
    let mut rotation = [[0.0; 3]; 3];
    for (i, row) in rotation.iter_mut().enumerate() {
        for (j, x) in row.iter_mut().enumerate() {
            *x = r[(i, j)];
        }
    }
    Pose {
        rotation,
        translation: iso.translation.vector.into(),
    }
}

/// Distance between two values of one joint: revolute values modulo full turns (a solver
/// holds one value per joint and lists the other turns with `Solution::equivalents`).
fn joint_gap(joint: &armforge_runtime::Joint, a: f64, b: f64) -> f64 {
    let d = a - b;
    if joint.kind == JointKind::Revolute {
        (d - TAU * (d / TAU).round()).abs()
    } else {
        d.abs()
    }
}

fn same(joints: &[armforge_runtime::Joint; JOINTS], a: &[f64; 6], b: &[f64; 6], tol: f64) -> bool {
    (0..JOINTS).all(|i| joint_gap(&joints[i], a[i], b[i]) < tol)
}

#[derive(Default, Debug)]
struct Tally {
    poses: usize,
    solutions: usize,
    most: usize,
    flagged: usize,
    worst_position: f64,
    worst_rotation: f64,
}

fn round_trip(arm: &EmittedArm, count: usize, seed: u64) -> Tally {
    let facts = facts(arm);
    let reference = ReferenceArm::load(&arm.file());
    let mut rng = StdRng::seed_from_u64(seed);
    let mut tally = Tally::default();
    for _ in 0..count {
        let q = reference.random_within(&facts.joints, &mut rng);
        let target_iso = reference.forward(&q);
        let target = pose_of(&target_iso);
        let solutions: Vec<Solution> = (arm.solve)(&target)
            .unwrap_or_else(|reason| panic!("{}: no solution for {q:?}: {reason}", arm.path));
        tally.poses += 1;
        tally.solutions += solutions.len();
        tally.most = tally.most.max(solutions.len());
        assert!(solutions.len() <= arm.capacity);
        for s in &solutions {
            let (dp, dr) = pose_error(&reference.forward(&s.joints), &target_iso, facts.size);
            tally.worst_position = tally.worst_position.max(dp);
            tally.worst_rotation = tally.worst_rotation.max(dr);
            assert!(
                dp < 1e-9 && dr < 1e-9,
                "{}: solution {s:?} of {q:?} misses the pose by {dp:e} (position ÷ size), \
                 {dr:e} (rotation)",
                arm.path
            );
            for (j, v) in facts.joints.iter().zip(s.joints.iter()) {
                assert!(
                    *v >= j.limits[0] - 1e-12 && *v <= j.limits[1] + 1e-12,
                    "{}: solution {s:?} outside the limits",
                    arm.path
                );
            }
            if s.flags.is_empty() {
                assert_eq!((arm.branch_of)(&s.joints), s.branch, "{}: {s:?}", arm.path);
            } else {
                tally.flagged += 1;
            }
        }
        for (i, a) in solutions.iter().enumerate() {
            for b in &solutions[i + 1..] {
                assert!(
                    !same(&facts.joints, &a.joints, &b.joints, 1e-9),
                    "{}: duplicate solutions {a:?} and {b:?}",
                    arm.path
                );
            }
        }
        // Where two position solutions merge (a double root, flagged at a reach limit) the
        // pose fixes the joints only to about the square root of the rounding: 1e-4 there.
        let original = solutions
            .iter()
            .find(|s| same(&facts.joints, &s.joints, &q, 1e-6))
            .or_else(|| {
                solutions.iter().find(|s| {
                    s.flags.contains(armforge_runtime::Flags::AT_REACH_LIMIT)
                        && same(&facts.joints, &s.joints, &q, 1e-4)
                })
            })
            .unwrap_or_else(|| {
                panic!(
                    "{}: the original {q:?} is not among {solutions:#?}",
                    arm.path
                )
            });
        let tol = if same(&facts.joints, &original.joints, &q, 1e-6) {
            1e-6
        } else {
            1e-4
        };
        // Each of its joint values is the one held or one of the listed equivalents.
        let listed: Vec<_> = original.equivalents(arm.joints).collect();
        for i in 0..JOINTS {
            assert!(
                (original.joints[i] - q[i]).abs() < tol
                    || listed
                        .iter()
                        .any(|e| e.joint == i && (e.value - q[i]).abs() < tol),
                "{}: joint {} of {q:?}: neither {original:?} nor {listed:?}",
                arm.path,
                i + 1
            );
        }
        // The solution nearest to the original is the original itself (not only modulo
        // whole turns, also for joints whose range spans several turns).
        let near = (arm.solve_near)(&target, &q)
            .unwrap_or_else(|r| panic!("{}: solve_near {q:?}: {r}", arm.path));
        assert!(
            near.joints
                .iter()
                .zip(q.iter())
                .all(|(a, b)| (a - b).abs() < tol),
            "{}: solve_near gave {near:?} for {q:?}",
            arm.path
        );
        // The original's branch has a solution, of that branch, reproducing the pose.
        let branch = (arm.branch_of)(&q);
        let one = (arm.solve_branch)(&target, branch)
            .unwrap_or_else(|r| panic!("{}: solve_branch {branch:?} of {q:?}: {r}", arm.path));
        assert_eq!(one.branch, branch, "{}", arm.path);
        let (dp, dr) = pose_error(&reference.forward(&one.joints), &target_iso, facts.size);
        assert!(dp < 1e-9 && dr < 1e-9, "{}: solve_branch {one:?}", arm.path);
        // … and it is that branch's solution in `solve`.
        assert!(
            solutions.iter().any(|s| s.branch == branch
                && s.joints
                    .iter()
                    .zip(one.joints.iter())
                    .all(|(a, b)| (a - b).abs() < 1e-12)),
            "{}: solve_branch {one:?} is not among solve's {solutions:#?}",
            arm.path
        );
    }
    tally
}

#[test]
fn every_example_arm_round_trips_through_its_emitted_solver() {
    let count = samples();
    assert_eq!(
        EMITTED_ARMS.len(),
        armforge_tests::example_arm_paths().len()
    );
    for (k, arm) in EMITTED_ARMS.iter().enumerate() {
        let tally = round_trip(arm, count, 0x5eed + k as u64);
        println!(
            "{}: {} poses, {} solutions (most {}), {} flagged; worst errors {:.1e} (position ÷ \
             size), {:.1e} (rotation)",
            arm.path,
            tally.poses,
            tally.solutions,
            tally.most,
            tally.flagged,
            tally.worst_position,
            tally.worst_rotation
        );
        assert_eq!(tally.poses, count);
        // Every configuration within the limits is a solution of its own pose, so each pose
        // has at least one: the sum can't be less than the count.
        assert!(tally.solutions >= count);
    }
}
