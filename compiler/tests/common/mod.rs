//! Measures shared by the compiler's round-trip tests. Each test binary uses a subset, so
//! unused ones are allowed.
#![allow(dead_code)]

use std::f64::consts::TAU;

use armforge_compiler::model::Model;
use armforge_compiler::solver::Solver;
use armforge_runtime::{JointKind, Pose, Solution};

/// Random arms per test run: 200 times `ARMFORGE_SCALE`.
pub fn arms() -> u64 {
    armforge_compiler::plan::samples::sample_count(200) as u64
}

/// The larger of the position error relative to `reach` and the Frobenius norm of the
/// rotation difference.
pub fn pose_error(a: &Pose, b: &Pose, reach: f64) -> f64 {
    let mut p: f64 = 0.0;
    let mut r: f64 = 0.0;
    for i in 0..3 {
        p += (a.translation[i] - b.translation[i]).powi(2);
        for j in 0..3 {
            r += (a.rotation[i][j] - b.rotation[i][j]).powi(2);
        }
    }
    (p.sqrt() / reach).max(r.sqrt())
}

/// The largest joint difference, revolute joints compared modulo one turn.
pub fn joint_gap(model: &Model, a: &[f64; 6], b: &[f64; 6]) -> f64 {
    model
        .joints
        .iter()
        .zip(a.iter().zip(b))
        .map(|(j, (x, y))| {
            let d = x - y;
            match j.joint.kind {
                JointKind::Revolute => (d - TAU * (d / TAU).round()).abs(),
                JointKind::Prismatic => d.abs(),
            }
        })
        .fold(0.0, f64::max)
}

/// Solves the pose `forward(q)` and checks the answer: at most `most` solutions, each
/// reproducing the pose to 1e-9 of `reach` and, unless flagged, reading back its own branch
/// label; no two solutions alike; no label twice; `q` itself among them. Returns the number
/// of solutions. `what` names the arm in messages.
pub fn check_round_trip(
    solver: &Solver,
    model: &Model,
    q: &[f64; 6],
    most: usize,
    what: &str,
) -> usize {
    let reach = solver.plan().arm.scale;
    let target = model.forward(q);
    let solutions: Vec<Solution> = solver
        .solve(&target)
        .unwrap_or_else(|e| panic!("{what}: no solution for {q:?}: {e}"));
    assert!(solutions.len() <= most, "{what}: {}", solutions.len());
    for s in &solutions {
        let e = pose_error(&solver.forward(&s.joints), &target, reach);
        assert!(e < 1e-9, "{what}: {s:?} misses by {e:e}");
        if s.flags.is_empty() {
            assert_eq!(solver.branch_of(&s.joints), s.branch, "{what}: {s:?}");
        }
    }
    for (i, a) in solutions.iter().enumerate() {
        for b in &solutions[i + 1..] {
            assert!(
                joint_gap(model, &a.joints, &b.joints) > 1e-9,
                "{what}: duplicates"
            );
            assert_ne!(a.branch, b.branch, "{what}: one label twice");
        }
    }
    assert!(
        solutions
            .iter()
            .any(|s| joint_gap(model, &s.joints, q) < 1e-6),
        "{what}: {q:?} ({}) not among {solutions:#?}",
        solver.branch_of(q)
    );
    solutions.len()
}
