//! Measures shared by the compiler's round-trip tests. Each test binary uses a subset, so
//! unused ones are allowed.
#![allow(dead_code)]

use std::f64::consts::TAU;

use armforge_compiler::model::Model;
use armforge_runtime::{JointKind, Pose};

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
