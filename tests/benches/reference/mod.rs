//! What the benchmarks compare the emitted solvers with, shared by the criterion bench
//! (`solve.rs`) and the instruction-count driver (`instructions.rs`): the poses, a plain
//! hand-written closed form of the bench elbow arm, and the numerical baselines.

#![allow(dead_code)]

pub mod hand;
pub mod numeric;

use armforge_runtime::{Branch, Pose, JOINTS};
use armforge_tests::emitted::bench_elbow;
use rand::rngs::StdRng;
use rand::{Rng, SeedableRng};

/// Poses per benchmark (the calls cycle through them).
pub const POSES: usize = 256;

/// One benchmark pose: the target, the configuration it came from and that one's branch.
#[derive(Clone, Copy)]
pub struct Sample {
    /// Reachable target.
    pub pose: Pose,
    /// The configuration forward kinematics made it from.
    pub joints: [f64; JOINTS],
    /// Its branch.
    pub branch: Branch,
}

/// A configuration drawn uniformly within the bench arm's limits.
pub fn random_joints(rng: &mut StdRng) -> [f64; JOINTS] {
    let mut q = [0.0; JOINTS];
    for (value, joint) in q.iter_mut().zip(bench_elbow::JOINT_TABLE.iter()) {
        let [lo, hi] = joint.limits;
        *value = rng.random_range(lo..hi);
    }
    q
}

/// Reachable poses of the bench elbow arm from seeded random configurations.
pub fn samples() -> Vec<Sample> {
    let mut rng = StdRng::seed_from_u64(0xbe7c);
    (0..POSES)
        .map(|_| {
            let joints = random_joints(&mut rng);
            Sample {
                pose: bench_elbow::forward(&joints),
                joints,
                branch: bench_elbow::branch_of(&joints),
            }
        })
        .collect()
}

/// The bench arm for the numerical baselines.
pub fn numeric_arm() -> numeric::Arm {
    numeric::Arm {
        joints: &bench_elbow::JOINT_TABLE,
        base: bench_elbow::BASE,
        tool: bench_elbow::TOOL,
    }
}

/// A seed 0.05 rad from `q` in every joint (signs alternating).
pub fn nearby_seed(q: &[f64; JOINTS]) -> [f64; JOINTS] {
    let mut s = *q;
    for (i, v) in s.iter_mut().enumerate() {
        *v += if i % 2 == 0 { 0.05 } else { -0.05 };
    }
    s
}

/// The hand-written form's branch arguments `(back, elbow sign, wrist sign)` that give the
/// sample's own configuration (its labels are the emitted solver's, read by `branch_of`).
pub fn hand_branch(sample: &Sample) -> Option<(bool, f64, f64)> {
    let choices = [false, true]
        .into_iter()
        .flat_map(|back| [1.0, -1.0].map(|e| (back, e)))
        .flat_map(|(back, e)| [1.0, -1.0].map(|w| (back, e, w)));
    for (back, e, w) in choices {
        if let Some(q) = hand::solve_one::<hand::Platform>(&sample.pose, back, e, w) {
            if bench_elbow::branch_of(&q) == sample.branch {
                return Some((back, e, w));
            }
        }
    }
    None
}
