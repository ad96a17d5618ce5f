//! Verification by round trips: configurations within the limits, and placed near singular
//! configurations and reach boundaries, go through the reference model's forward kinematics
//! and back through a solver. Every solution must reproduce the pose; one must be the original
//! configuration.
//!
//! The reference model (whose forward kinematics gives the poses) and the solver are passed
//! separately, so a solver built from a different description (one number changed) can be
//! shown to fail.
//!
//! Runs on every core (rayon); the samples depend only on the seed and their index, so the
//! findings do not depend on the number of threads.

pub mod check;
pub mod judge;
pub mod place;
pub mod sampler;
pub mod summary;

use std::collections::BTreeMap;
use std::time::Instant;

use armforge_runtime::{Joint, JOINTS};
use rayon::prelude::*;

pub use check::{Checker, Outcome, Status, Thresholds};
pub use judge::{Judge, Judgement};
pub use sampler::{Kind, Sample, Sampler};
pub use summary::{Failure, KindSummary, Summary};

use armforge_compiler::classify::Geometry;
use armforge_compiler::model::Model;
use armforge_compiler::solver::Solver;

/// What a verification tries.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Options {
    /// Configurations drawn uniformly within the limits.
    pub samples: u64,
    /// The seed of every random draw.
    pub seed: u64,
    /// The limits the solver is held to.
    pub thresholds: Thresholds,
}

impl Default for Options {
    fn default() -> Self {
        Options {
            samples: 100_000,
            seed: 1,
            thresholds: Thresholds::default(),
        }
    }
}

/// The fewest uniform samples a verification takes: with none, nothing would be checked and
/// the run would pass vacuously.
pub const SAMPLES_MIN: u64 = 1;
/// The most uniform samples a verification takes (about 10 s per million on one core; the
/// outcomes of a run are kept in memory, about 100 bytes each).
pub const SAMPLES_MAX: u64 = 10_000_000;

/// Samples of each kind near singular configurations and boundaries, for `samples` uniform
/// ones: one in twenty, at least one (when any are asked for).
pub fn extra_samples(samples: u64) -> u64 {
    samples.div_ceil(20)
}

/// Samples are checked in chunks of this many; progress is reported per chunk.
const CHUNK: u64 = 2048;

/// Why a verification could not start.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Error {
    /// The arm does not have six joints.
    JointCount(usize),
    /// The number of uniform samples is outside [`SAMPLES_MIN`]`..=`[`SAMPLES_MAX`].
    Samples(u64),
}

impl std::fmt::Display for Error {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Error::JointCount(n) => write!(f, "verification needs six joints, the arm has {n}"),
            Error::Samples(n) => write!(
                f,
                "{n} samples asked for; a verification takes {SAMPLES_MIN} to {SAMPLES_MAX}"
            ),
        }
    }
}

impl std::error::Error for Error {}

/// Verifies `solver` against the forward kinematics of `reference` (classified as
/// `geometry`). `progress` is called with the number of samples finished since its last call.
pub fn verify(
    reference: &Model,
    geometry: &Geometry,
    solver: &Solver,
    options: &Options,
    progress: &(dyn Fn(u64) + Sync),
) -> Result<Summary, Error> {
    if !(SAMPLES_MIN..=SAMPLES_MAX).contains(&options.samples) {
        return Err(Error::Samples(options.samples));
    }
    let joints: [Joint; JOINTS] = reference
        .runtime_joints()
        .try_into()
        .map_err(|j: Vec<Joint>| Error::JointCount(j.len()))?;
    let started = Instant::now();
    let size = geometry.resolved.arm_size;
    let sampler = Sampler::new(joints, geometry, options.seed);
    let judge = Judge::new(joints, size, sampler.hints().clone(), options.thresholds);
    let checker = Checker::new(joints, reference.base, reference.tool, size, solver, judge);
    let plan = plan_samples(&sampler, options.samples);
    let total: u64 = plan.iter().map(|(_, n)| n).sum();
    let chunks: Vec<(u64, u64)> = (0..total.div_ceil(CHUNK))
        .map(|c| (c * CHUNK, ((c + 1) * CHUNK).min(total)))
        .collect();
    let outcomes: Vec<Outcome> = chunks
        .par_iter()
        .flat_map_iter(|&(start, end)| {
            let done: Vec<Outcome> = (start..end)
                .filter_map(|i| sampler.sample(i, kind_of(&plan, i)))
                .map(|s| checker.check(&s))
                .collect();
            progress(end - start);
            done
        })
        .collect();
    let seconds = started.elapsed().as_secs_f64();
    Ok(summarise(
        reference, options, size, &plan, &outcomes, seconds,
    ))
}

/// How many samples a verification of `reference` tries, near singular configurations and
/// boundaries included (for a progress bar's length).
pub fn planned_samples(reference: &Model, geometry: &Geometry, samples: u64) -> u64 {
    let Ok(joints) = <[Joint; JOINTS]>::try_from(reference.runtime_joints()) else {
        return samples;
    };
    let sampler = Sampler::new(joints, geometry, 0);
    plan_samples(&sampler, samples).iter().map(|(_, n)| n).sum()
}

/// The kinds to sample and how many of each, in index order.
fn plan_samples(sampler: &Sampler, samples: u64) -> Vec<(Kind, u64)> {
    Kind::ALL
        .iter()
        .map(|&k| {
            let n = match k {
                Kind::WithinLimits => samples,
                _ if sampler.applies(k) => extra_samples(samples),
                _ => 0,
            };
            (k, n)
        })
        .collect()
}

/// The kind of sample number `index`.
fn kind_of(plan: &[(Kind, u64)], index: u64) -> Kind {
    let mut start = 0;
    for &(kind, n) in plan {
        if index < start + n {
            return kind;
        }
        start += n;
    }
    Kind::WithinLimits
}

fn summarise(
    model: &Model,
    options: &Options,
    size: f64,
    plan: &[(Kind, u64)],
    outcomes: &[Outcome],
    seconds: f64,
) -> Summary {
    let t = &options.thresholds;
    let kinds: Vec<KindSummary> = plan
        .iter()
        .map(|&(kind, asked)| {
            let of_kind: Vec<&Outcome> = outcomes.iter().filter(|o| o.kind == kind).collect();
            summary::kind_summary(kind, asked, &of_kind, t)
        })
        .collect();
    let mut histogram = BTreeMap::new();
    let mut distinct = BTreeMap::new();
    for k in &kinds {
        for (n, c) in &k.solutions_per_pose {
            *histogram.entry(*n).or_insert(0) += c;
        }
        for (n, c) in &k.distinct_per_pose {
            *distinct.entry(*n).or_insert(0) += c;
        }
    }
    let failing: Vec<&Outcome> = outcomes.iter().filter(|o| o.fails()).collect();
    let failures = failing
        .iter()
        .take(summary::LISTED_FAILURES)
        .map(|o| summary::failure(model, o))
        .collect();
    Summary {
        arm: model.name.clone(),
        path: model.source_path.clone(),
        seed: options.seed,
        samples: options.samples,
        arm_size: size,
        thresholds: *t,
        kinds,
        solutions_per_pose: histogram,
        distinct_per_pose: distinct,
        failed: failing.len() as u64,
        failures,
        passed: failing.is_empty(),
        seconds,
        threads: rayon::current_num_threads(),
    }
}
