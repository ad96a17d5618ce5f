//! The configurations a verification tries: uniform within the joint limits, and placed close
//! to the arm's singular configurations and reach boundaries, where closed forms lose digits.
//!
//! Every sample is drawn from its own ChaCha8 stream (seed, sample index), so a run gives the
//! same samples for the same seed whatever the number of threads, and a failing sample can be
//! named by its index.

use std::f64::consts::TAU;

use armforge_runtime::{joint_motion, Joint, JointKind, JOINTS};
use rand::{Rng, SeedableRng};
use rand_chacha::ChaCha8Rng;
use serde::Serialize;

use super::judge::distance_from_line;
use super::place::solve_one;
use armforge_compiler::classify::Geometry;
use armforge_compiler::family::{Distance, SamplerBoundary, VerifyHints};

/// What a sample is placed near.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Kind {
    /// Uniform within the joint limits.
    WithinLimits,
    /// Joint 5 within 1e-12 … 1e-3 rad of the aligned position (axes 4 and 6 in one line).
    WristNearAligned,
    /// The wrist center within 1e-12 … 1e-3 of the arm's size from axis 1.
    NearAxis1,
    /// The wrist center within 1e-12 … 1e-6 of the arm's size inside a reach boundary (where
    /// two solutions of joints 1–3 merge).
    ReachBoundary,
    /// One joint within 1e-12 … 1e-6 (radians, or of the arm's size) inside one of its limits.
    AtLimit,
}

impl Kind {
    /// Every kind, in report order.
    pub const ALL: [Kind; 5] = [
        Kind::WithinLimits,
        Kind::WristNearAligned,
        Kind::NearAxis1,
        Kind::ReachBoundary,
        Kind::AtLimit,
    ];

    /// A short name for tables.
    pub fn name(self) -> &'static str {
        match self {
            Kind::WithinLimits => "within limits",
            Kind::WristNearAligned => "wrist near aligned",
            Kind::NearAxis1 => "wrist center near axis 1",
            Kind::ReachBoundary => "reach boundary",
            Kind::AtLimit => "joint at a limit",
        }
    }

    /// True for kinds placed near a singular configuration or a reach boundary (how a sample
    /// is judged depends on its geometry only, [`super::judge`]).
    pub fn is_near_singular(self) -> bool {
        matches!(
            self,
            Kind::WristNearAligned | Kind::NearAxis1 | Kind::ReachBoundary
        )
    }
}

/// One configuration to try.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Sample {
    /// Index in the run (names the sample in reports).
    pub index: u64,
    /// What it is placed near.
    pub kind: Kind,
    /// Joint values, SI.
    pub joints: [f64; JOINTS],
    /// How far it was placed from the singular configuration or boundary: radians for the
    /// wrist and joint limits of revolute joints, a fraction of the arm's size otherwise;
    /// zero for uniform samples.
    pub offset: f64,
}

/// Configurations tried when deciding whether a boundary can be reached within the limits.
const SCREENING: usize = 32;

/// Draws the samples of one arm.
#[derive(Clone, Debug)]
pub struct Sampler {
    joints: [Joint; JOINTS],
    ranges: [[f64; 2]; JOINTS],
    size: f64,
    /// Joint values of the wrist's aligning joint at which the wrist is aligned, within the
    /// limits.
    aligned: Vec<f64>,
    /// The family's hints, with only the boundaries the limits let the arm reach.
    hints: VerifyHints,
    seed: u64,
}

/// The range uniform samples of a joint come from: its limits, or where a limit is infinite,
/// one turn (revolute) or the arm's size (prismatic) from the other limit or from zero.
pub fn sample_range(joint: &Joint, size: f64) -> [f64; 2] {
    let span = match joint.kind {
        JointKind::Revolute => TAU,
        JointKind::Prismatic => 2.0 * size,
    };
    let [lo, hi] = joint.limits;
    match (lo.is_finite(), hi.is_finite()) {
        (true, true) => [lo, hi],
        (true, false) => [lo, lo + span],
        (false, true) => [hi - span, hi],
        (false, false) => [-0.5 * span, 0.5 * span],
    }
}

impl Sampler {
    /// The sampler of a classified arm. `joints` are the model's six joints (SI), `size` the
    /// arm's size (metres, from the classifier), `seed` the run's seed.
    pub fn new(joints: [Joint; JOINTS], geometry: &Geometry, seed: u64) -> Sampler {
        let size = geometry.resolved.arm_size;
        let ranges = joints.map(|j| sample_range(&j, size));
        let hints = geometry.family.module().verify_hints(&joints, geometry);
        let a = hints.aligned_joint;
        let mut aligned = Vec::new();
        for &m in &hints.aligned_at {
            for turns in -3..=3 {
                let q = joints[a].joint_value(m + TAU * f64::from(turns));
                if q >= ranges[a][0] && q <= ranges[a][1] {
                    aligned.push(q);
                }
            }
        }
        aligned.sort_by(f64::total_cmp);
        let mut sampler = Sampler {
            joints,
            ranges,
            size,
            aligned,
            hints: VerifyHints {
                on_axis: None,
                boundaries: Vec::new(),
                ..hints.clone()
            },
            seed,
        };
        // Keep only what the limits let the arm reach (a slide whose limits stop short of the
        // nearest approach, say), so no sample is spent on the impossible.
        sampler.hints.on_axis = hints.on_axis.filter(|b| sampler.can_place(b));
        sampler.hints.boundaries = hints
            .boundaries
            .into_iter()
            .filter(|b| sampler.can_place(b))
            .collect();
        sampler
    }

    /// True when the boundary can be placed from one of a few configurations (a stream of
    /// its own, apart from the samples').
    fn can_place(&self, b: &SamplerBoundary) -> bool {
        let mut rng = ChaCha8Rng::seed_from_u64(self.seed);
        rng.set_stream(u64::MAX);
        (0..SCREENING).any(|_| {
            let mut q = self.uniform(&mut rng);
            self.place(&mut q, b, 1e-9, &mut rng).is_some()
        })
    }

    /// True when the arm has configurations of this kind (an arm whose wrist center cannot
    /// reach axis 1 has no samples near it).
    pub fn applies(&self, kind: Kind) -> bool {
        match kind {
            Kind::WithinLimits => true,
            Kind::WristNearAligned => !self.aligned.is_empty(),
            Kind::NearAxis1 => self.hints.on_axis.is_some(),
            Kind::ReachBoundary => !self.hints.boundaries.is_empty(),
            Kind::AtLimit => self
                .joints
                .iter()
                .any(|j| j.limits.iter().any(|l| l.is_finite())),
        }
    }

    /// The family's hints with the boundaries the samples can be placed at (where two
    /// solutions of the position step merge), for the judge.
    pub fn hints(&self) -> &VerifyHints {
        &self.hints
    }

    /// The sample ranges of the joints (SI).
    pub fn ranges(&self) -> &[[f64; 2]; JOINTS] {
        &self.ranges
    }

    /// Sample number `index` of `kind`, or `None` when none could be placed (a few attempts
    /// are made from different starting configurations).
    pub fn sample(&self, index: u64, kind: Kind) -> Option<Sample> {
        let mut rng = ChaCha8Rng::seed_from_u64(self.seed);
        rng.set_stream(index);
        for _ in 0..8 {
            let mut q = self.uniform(&mut rng);
            let offset = match kind {
                Kind::WithinLimits => Some(0.0),
                Kind::WristNearAligned => self.near_aligned(&mut q, &mut rng),
                Kind::NearAxis1 => self.hints.on_axis.as_ref().and_then(|b| {
                    let delta = log_uniform(&mut rng, 1e-12, 1e-3);
                    self.place(&mut q, b, delta, &mut rng)
                }),
                Kind::ReachBoundary => {
                    let i = rng.random_range(0..self.hints.boundaries.len().max(1));
                    let delta = log_uniform(&mut rng, 1e-12, 1e-6);
                    self.hints
                        .boundaries
                        .get(i)
                        .and_then(|b| self.place(&mut q, b, delta, &mut rng))
                }
                Kind::AtLimit => self.at_limit(&mut q, &mut rng),
            };
            if let Some(offset) = offset {
                return Some(Sample {
                    index,
                    kind,
                    joints: q,
                    offset,
                });
            }
        }
        None
    }

    fn uniform(&self, rng: &mut ChaCha8Rng) -> [f64; JOINTS] {
        let mut q = [0.0; JOINTS];
        for (x, r) in q.iter_mut().zip(&self.ranges) {
            *x = r[0] + (r[1] - r[0]) * rng.random::<f64>();
        }
        q
    }

    fn near_aligned(&self, q: &mut [f64; JOINTS], rng: &mut ChaCha8Rng) -> Option<f64> {
        let at = *self
            .aligned
            .get(rng.random_range(0..self.aligned.len().max(1)))?;
        let delta = log_uniform(rng, 1e-12, 1e-3);
        let side = if rng.random::<bool>() { 1.0 } else { -1.0 };
        let a = self.hints.aligned_joint;
        let [lo, hi] = self.ranges[a];
        let step = delta / self.joints[a].direction.abs().max(f64::MIN_POSITIVE);
        let value = [at + side * step, at - side * step]
            .into_iter()
            .find(|v| *v >= lo && *v <= hi)?;
        q[a] = value;
        Some(delta)
    }

    fn at_limit(&self, q: &mut [f64; JOINTS], rng: &mut ChaCha8Rng) -> Option<f64> {
        let i = rng.random_range(0..JOINTS);
        let upper = rng.random::<bool>();
        let limit = self.joints[i].limits[usize::from(upper)];
        if !limit.is_finite() {
            return None;
        }
        let delta = log_uniform(rng, 1e-12, 1e-6);
        let step = match self.joints[i].kind {
            JointKind::Revolute => delta,
            JointKind::Prismatic => delta * self.size,
        };
        q[i] = if upper { limit - step } else { limit + step };
        Some(delta)
    }

    /// Moves the boundary's joint so that its distance lies `delta × size` on the boundary's
    /// side of it. Returns `delta` as placed (relative), or `None`.
    fn place(
        &self,
        q: &mut [f64; JOINTS],
        b: &SamplerBoundary,
        delta: f64,
        rng: &mut ChaCha8Rng,
    ) -> Option<f64> {
        let target = b.at + b.side * delta * self.size;
        if target < 0.0 {
            return None;
        }
        let start = *q;
        let measure = |x: f64| {
            let mut moved = start;
            moved[b.joint] = x;
            distance_of(&self.joints, &b.distance, &moved)
        };
        let x = solve_one(measure, self.ranges[b.joint], target, rng.random::<f64>())?;
        q[b.joint] = x;
        let placed = (distance_of(&self.joints, &b.distance, q) - b.at) * b.side / self.size;
        // Accept only what is really that close (bisection reaches the last bits of `x`).
        (placed > 0.25 * delta && placed < 4.0 * delta).then_some(placed)
    }
}

/// The distance a family's hint names, for joint values `q`: its point moved by its joints
/// (in its order; a mirrored joint's motion undone), from its axis line at zero.
pub fn distance_of(joints: &[Joint; JOINTS], d: &Distance, q: &[f64; JOINTS]) -> f64 {
    let mut p = d.point;
    for &(j, undo) in &d.moved_by {
        let m = joint_motion(&joints[j], q[j]);
        p = if undo {
            m.inverse().transform_point(&p)
        } else {
            m.transform_point(&p)
        };
    }
    distance_from_line(&p, &joints[d.axis])
}

/// `10^u` for `u` uniform between the exponents of `lo` and `hi`.
fn log_uniform(rng: &mut ChaCha8Rng, lo: f64, hi: f64) -> f64 {
    let (a, b) = (lo.log10(), hi.log10());
    10f64.powf(a + (b - a) * rng.random::<f64>())
}
