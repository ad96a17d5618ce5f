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

use super::judge::{distance_from_line, ReachBoundary};
use super::place::solve_one;
use armforge_compiler::classify::{ArmEvidence, Geometry, Singularity};

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

/// A measure of the arm that one joint changes, and the value to put it at.
#[derive(Clone, Copy, Debug)]
struct Boundary {
    /// The joint that moves (0-based).
    joint: usize,
    /// What is measured.
    measure: Measure,
    /// The boundary value, metres.
    at: f64,
    /// `+1` to place the sample above the boundary, `−1` below.
    side: f64,
}

/// A distance of the wrist center (moved by joints 2 and 3 only; joint 1 turns about axis 1
/// and changes neither distance) from the line of axis 1 or axis 2 at zero.
#[derive(Clone, Copy, Debug)]
enum Measure {
    FromAxis(usize),
}

/// Configurations tried when deciding whether a boundary can be reached within the limits.
const SCREENING: usize = 32;

/// Draws the samples of one arm.
#[derive(Clone, Debug)]
pub struct Sampler {
    joints: [Joint; JOINTS],
    ranges: [[f64; 2]; JOINTS],
    size: f64,
    center: [f64; 3],
    /// Joint-5 joint values at which the wrist is aligned, within the limits.
    aligned: Vec<f64>,
    /// Joint to move and the axis-1 distance measure, when the wrist center can reach axis 1.
    axis_1: Option<Boundary>,
    /// Reach boundaries at which solutions merge.
    boundaries: Vec<Boundary>,
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
        let j5 = joints[4];
        let mut aligned = Vec::new();
        for &m in &geometry.wrist.aligned_at {
            for turns in -3..=3 {
                let q = j5.joint_value(m + TAU * f64::from(turns));
                if q >= ranges[4][0] && q <= ranges[4][1] {
                    aligned.push(q);
                }
            }
        }
        aligned.sort_by(f64::total_cmp);
        let revolute = |i: usize| joints[i].kind == JointKind::Revolute;
        let mut axis_1 = None;
        let mut boundaries = Vec::new();
        for s in &geometry.singularities {
            match s {
                Singularity::WristCenterOnAxis1 { reachable } if *reachable != Some(false) => {
                    // Joint 2 moves the wrist center toward axis 1 (elbow, polar); for a
                    // cylindrical arm the slide with more sideways travel does.
                    let joint = if revolute(1) { 1 } else { 2 };
                    axis_1 = Some(Boundary {
                        joint,
                        measure: Measure::FromAxis(0),
                        at: 0.0,
                        side: 1.0,
                    });
                }
                Singularity::Shoulder {
                    perpendicular: true,
                    offset,
                    ..
                } if revolute(1) => boundaries.push(Boundary {
                    joint: 1,
                    measure: Measure::FromAxis(0),
                    at: *offset,
                    side: 1.0,
                }),
                _ => {}
            }
        }
        match &geometry.arm {
            ArmEvidence::Elbow(e) => {
                for (at, side) in [
                    (e.reach_from_axis_2[1], -1.0),
                    (e.reach_from_axis_2[0], 1.0),
                ] {
                    boundaries.push(Boundary {
                        joint: 2,
                        measure: Measure::FromAxis(1),
                        at,
                        side,
                    });
                }
            }
            ArmEvidence::Polar(p) => boundaries.push(Boundary {
                joint: 2,
                measure: Measure::FromAxis(1),
                at: p.closest_to_axis_2,
                side: 1.0,
            }),
            ArmEvidence::Cylindrical(_) | ArmEvidence::Cartesian(_) => {}
        }
        let mut sampler = Sampler {
            joints,
            ranges,
            size,
            center: geometry.wrist_center,
            aligned,
            axis_1: None,
            boundaries: Vec::new(),
            seed,
        };
        // Keep only what the limits let the arm reach (a slide whose limits stop short of the
        // nearest approach, say), so no sample is spent on the impossible.
        sampler.axis_1 = axis_1.filter(|b| sampler.can_place(b));
        sampler.boundaries = boundaries
            .into_iter()
            .filter(|b| sampler.can_place(b))
            .collect();
        sampler
    }

    /// True when the boundary can be placed from one of a few configurations (a stream of
    /// its own, apart from the samples').
    fn can_place(&self, b: &Boundary) -> bool {
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
            Kind::NearAxis1 => self.axis_1.is_some(),
            Kind::ReachBoundary => !self.boundaries.is_empty(),
            Kind::AtLimit => self
                .joints
                .iter()
                .any(|j| j.limits.iter().any(|l| l.is_finite())),
        }
    }

    /// The reach boundaries the samples can be placed at (the wrist center's distance from
    /// axis 1 or 2 at which two solutions of joints 1–3 merge).
    pub fn reach_boundaries(&self) -> Vec<ReachBoundary> {
        self.boundaries
            .iter()
            .map(|b| {
                let Measure::FromAxis(axis) = b.measure;
                ReachBoundary { axis, at: b.at }
            })
            .collect()
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
                Kind::NearAxis1 => self.axis_1.and_then(|b| {
                    let delta = log_uniform(&mut rng, 1e-12, 1e-3);
                    self.place(&mut q, &b, delta, &mut rng)
                }),
                Kind::ReachBoundary => {
                    let i = rng.random_range(0..self.boundaries.len().max(1));
                    let delta = log_uniform(&mut rng, 1e-12, 1e-6);
                    self.boundaries
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
        let [lo, hi] = self.ranges[4];
        let step = delta / self.joints[4].direction.abs().max(f64::MIN_POSITIVE);
        let value = [at + side * step, at - side * step]
            .into_iter()
            .find(|v| *v >= lo && *v <= hi)?;
        q[4] = value;
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

    /// Moves the boundary's joint so that its measure lies `delta × size` on the boundary's
    /// side of it. Returns `delta` as placed (relative), or `None`.
    fn place(
        &self,
        q: &mut [f64; JOINTS],
        b: &Boundary,
        delta: f64,
        rng: &mut ChaCha8Rng,
    ) -> Option<f64> {
        let target = b.at + b.side * delta * self.size;
        if target < 0.0 {
            return None;
        }
        let Measure::FromAxis(axis) = b.measure;
        let line = &self.joints[axis];
        // Only the boundary's joint moves: the other motion is computed once.
        let x = if b.joint == 2 {
            let e2 = joint_motion(&self.joints[1], q[1]);
            let measure = |x: f64| {
                let p = joint_motion(&self.joints[2], x).transform_point(&self.center);
                distance_from_line(&e2.transform_point(&p), line)
            };
            solve_one(measure, self.ranges[2], target, rng.random::<f64>())?
        } else {
            let p = joint_motion(&self.joints[2], q[2]).transform_point(&self.center);
            let measure = |x: f64| {
                let w = joint_motion(&self.joints[b.joint], x).transform_point(&p);
                distance_from_line(&w, line)
            };
            solve_one(measure, self.ranges[b.joint], target, rng.random::<f64>())?
        };
        q[b.joint] = x;
        let placed = (self.measure(&b.measure, q) - b.at) * b.side / self.size;
        // Accept only what is really that close (bisection reaches the last bits of `x`).
        (placed > 0.25 * delta && placed < 4.0 * delta).then_some(placed)
    }

    fn measure(&self, m: &Measure, q: &[f64; JOINTS]) -> f64 {
        let Measure::FromAxis(axis) = *m;
        let e3 = joint_motion(&self.joints[2], q[2]);
        let e2 = joint_motion(&self.joints[1], q[1]);
        let w = e2.transform_point(&e3.transform_point(&self.center));
        distance_from_line(&w, &self.joints[axis])
    }
}

/// `10^u` for `u` uniform between the exponents of `lo` and `hi`.
fn log_uniform(rng: &mut ChaCha8Rng, lo: f64, hi: f64) -> f64 {
    let (a, b) = (lo.log10(), hi.log10());
    10f64.powf(a + (b - a) * rng.random::<f64>())
}
