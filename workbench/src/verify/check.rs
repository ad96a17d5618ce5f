//! One round trip: the reference model's forward kinematics gives the pose of a sample
//! configuration, the solver solves it, and the solutions are compared with the pose (every
//! one of them) and with the original configuration (one of them must be it).

use std::f64::consts::TAU;

use armforge_runtime::{forward, Joint, JointKind, Pose, Unreachable, JOINTS};
use serde::Serialize;

use super::judge::{Judge, Judgement};
use super::sampler::{Kind, Sample};
use armforge_compiler::solver::Solver;

/// Two revolute values whole turns apart differ by at most this after wrapping (radians):
/// adding `2π k` to an angle of a few turns rounds at ~1e-15.
const TURN_ROUNDING: f64 = 1e-13;

/// True when `error` is at most `limit` (false for NaN).
pub fn within(error: f64, limit: f64) -> bool {
    error <= limit
}

/// The limits a verification holds the solver to.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Thresholds {
    /// Largest position error (fraction of the arm's size) and rotation error (Frobenius norm
    /// of the difference of the rotation matrices) of any solution, for samples away from
    /// singular configurations.
    pub pose: f64,
    /// The same near singular configurations and reach boundaries (judged by the sample's
    /// geometry, [`super::judge`]).
    pub pose_near_singular: f64,
    /// Largest difference (radians, or fraction of the arm's size for slides) between the
    /// original configuration and the solution that recovers it, away from singular
    /// configurations; near them it is scaled by the conditioning ([`super::judge`]).
    pub joint: f64,
    /// The same for samples at a reach boundary: there two solutions merge, and a pose within
    /// `δ` of the boundary moves them by about `√(2δ)`; the solver returns the merged one when
    /// the pose is within its tolerance (1e-10 of the arm's size), so up to ~1.4e-5 apart.
    pub joint_at_boundary: f64,
}

impl Default for Thresholds {
    fn default() -> Self {
        Thresholds {
            pose: 1e-9,
            pose_near_singular: 1e-8,
            joint: 1e-6,
            joint_at_boundary: 1e-4,
        }
    }
}

/// How a round trip ended.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Status {
    /// One solution is the original configuration (in the compared joints).
    Recovered,
    /// No solution is; the nearest misses in `joint` (0-based) by `by` (radians, or fraction
    /// of the arm's size) where `allowed` is allowed.
    NotRecovered {
        /// The joint that misses by the most (relative to its allowance) in the nearest
        /// solution.
        joint: usize,
        /// Its difference.
        by: f64,
        /// Its allowed difference.
        allowed: f64,
    },
    /// The solver found no solution.
    Unreachable(Unreachable),
}

/// The result of one sample.
#[derive(Clone, Debug, PartialEq)]
pub struct Outcome {
    /// The sample's index.
    pub index: u64,
    /// Its kind.
    pub kind: Kind,
    /// Number of solutions returned.
    pub solutions: usize,
    /// Number of them that differ by more than whole turns of revolute joints.
    pub distinct: usize,
    /// Largest position error of any solution, fraction of the arm's size.
    pub position_error: f64,
    /// Largest rotation error of any solution (Frobenius norm).
    pub rotation_error: f64,
    /// True when a solution carries a singular flag (wrist aligned, on axis 1, at the reach
    /// limit).
    pub singular: bool,
    /// Recovery.
    pub status: Status,
    /// The allowed pose error (by the sample's geometry).
    pub pose_limit: f64,
    /// True when the sample lies near a singular configuration or a reach boundary (judged
    /// by its geometry, whichever sampler made it).
    pub judged_singular: bool,
    /// True when `solve` found no solution.
    pub unreachable: bool,
    /// Recovered only by `solve_near` with the original configuration as the current one
    /// (the free joint of a singular pose held at the reference, as a controller holds it).
    pub recovered_near: bool,
    /// The sample, kept for failing samples only.
    pub failing: Option<Box<Sample>>,
}

impl Outcome {
    /// True when the sample fails: the configuration is not recovered (`solve` finding nothing
    /// for a pose that `forward` made included), or a solution misses the pose.
    pub fn fails(&self) -> bool {
        self.status != Status::Recovered
            || !within(self.position_error, self.pose_limit)
            || !within(self.rotation_error, self.pose_limit)
    }
}

/// Runs round trips against one solver, with the pose from a reference model.
#[derive(Clone, Debug)]
pub struct Checker<'a> {
    joints: [Joint; JOINTS],
    base: Pose,
    tool: Pose,
    size: f64,
    solver: &'a Solver,
    judge: Judge,
}

impl<'a> Checker<'a> {
    /// A checker: `joints`, `base` and `tool` are the reference model's (the poses come from
    /// them), `size` the arm's size in metres; `judge` says how closely each sample is held.
    pub fn new(
        joints: [Joint; JOINTS],
        base: Pose,
        tool: Pose,
        size: f64,
        solver: &'a Solver,
        judge: Judge,
    ) -> Self {
        Checker {
            joints,
            base,
            tool,
            size,
            solver,
            judge,
        }
    }

    /// The tool pose of a configuration, by the reference model.
    pub fn pose(&self, q: &[f64; JOINTS]) -> Pose {
        forward(&self.joints, &self.base, &self.tool, q)
    }

    /// Position error (fraction of the arm's size) and rotation error (Frobenius norm).
    pub fn pose_error(&self, a: &Pose, b: &Pose) -> (f64, f64) {
        let mut p = 0.0;
        let mut r = 0.0;
        for i in 0..3 {
            p += (a.translation[i] - b.translation[i]).powi(2);
            for j in 0..3 {
                r += (a.rotation[i][j] - b.rotation[i][j]).powi(2);
            }
        }
        (f64::sqrt(p) / self.size, f64::sqrt(r))
    }

    /// The difference of two values of joint `i`: revolute values modulo whole turns
    /// (radians), slides as a fraction of the arm's size.
    pub fn joint_difference(&self, i: usize, a: f64, b: f64) -> f64 {
        let d = a - b;
        match self.joints[i].kind {
            JointKind::Revolute => (d - TAU * (d / TAU).round()).abs(),
            JointKind::Prismatic => d.abs() / self.size,
        }
    }

    /// True when two configurations differ only by whole turns of revolute joints (to within
    /// the rounding of adding a turn, 1e-13 rad).
    fn same_modulo_turns(&self, a: &[f64; JOINTS], b: &[f64; JOINTS]) -> bool {
        (0..JOINTS).all(|i| match self.joints[i].kind {
            JointKind::Revolute => self.joint_difference(i, a[i], b[i]) <= TURN_ROUNDING,
            JointKind::Prismatic => a[i] == b[i],
        })
    }

    /// The round trip of one sample.
    pub fn check(&self, sample: &Sample) -> Outcome {
        let target = self.pose(&sample.joints);
        let judgement = self.judge.judge(&sample.joints);
        let mut outcome = Outcome {
            index: sample.index,
            kind: sample.kind,
            solutions: 0,
            distinct: 0,
            position_error: 0.0,
            rotation_error: 0.0,
            singular: false,
            status: Status::NotRecovered {
                joint: 0,
                by: f64::INFINITY,
                allowed: judgement.joint[0],
            },
            pose_limit: judgement.pose,
            judged_singular: judgement.near_singular,
            unreachable: false,
            recovered_near: false,
            failing: None,
        };
        match self.solver.solve(&target) {
            Err(reason) => {
                outcome.status = Status::Unreachable(reason);
                outcome.unreachable = true;
            }
            Ok(solutions) => {
                outcome.solutions = solutions.len();
                let mut nearest = Miss::NONE;
                let mut checked: Vec<[f64; JOINTS]> = Vec::with_capacity(solutions.len());
                for s in &solutions {
                    // The same configuration a whole turn away in a joint with a wider range:
                    // its pose is that of one already checked.
                    let turned = checked.iter().any(|c| self.same_modulo_turns(c, &s.joints));
                    let (p, r) = if turned {
                        (0.0, 0.0)
                    } else {
                        checked.push(s.joints);
                        self.pose_error(&self.pose(&s.joints), &target)
                    };
                    outcome.position_error = outcome.position_error.max(p);
                    outcome.rotation_error = outcome.rotation_error.max(r);
                    outcome.singular |= s.flags.is_singular();
                    let miss = self.miss(sample, &s.joints, &judgement);
                    if miss.ratio < nearest.ratio {
                        nearest = miss;
                    }
                }
                outcome.distinct = checked.len();
                outcome.status = nearest.status();
            }
        }
        // `solve` answered, but none of its solutions is the configuration: a controller at a
        // singular pose asks `solve_near` with its current configuration instead.
        // Where the free joint moves the rest (joint 6 of a three-parallel arm joins the planar
        // chain of joints 2–4), the reference `solve` holds it at may even leave the pose out
        // of reach: `solve_near` is asked then too.
        if judgement.near_singular && outcome.status != Status::Recovered {
            self.recover_near(sample, &target, &judgement, &mut outcome);
        }
        if outcome.fails() {
            outcome.failing = Some(Box::new(*sample));
        }
        outcome
    }

    /// At a singular pose `solve` holds the free joint (joint 1 on axis 1, joint 4 at the
    /// aligned wrist) at a reference; a controller calls `solve_near` with its current
    /// configuration instead. The original configuration is recovered when that solution is it
    /// and reproduces the pose.
    fn recover_near(
        &self,
        sample: &Sample,
        target: &Pose,
        judgement: &Judgement,
        outcome: &mut Outcome,
    ) {
        let Ok(s) = self.solver.solve_near(target, &sample.joints) else {
            return;
        };
        let (p, r) = self.pose_error(&self.pose(&s.joints), target);
        let miss = self.miss(sample, &s.joints, judgement);
        if within(p, judgement.pose) && within(r, judgement.pose) && miss.ratio <= 1.0 {
            outcome.status = Status::Recovered;
            outcome.recovered_near = true;
            outcome.unreachable = false;
        }
    }

    /// The joint that misses by the most relative to its allowance (free joints are not
    /// compared), between a solution and the sample.
    fn miss(&self, sample: &Sample, q: &[f64; JOINTS], judgement: &Judgement) -> Miss {
        let mut worst = Miss {
            joint: 0,
            by: 0.0,
            allowed: judgement.joint[0],
            ratio: 0.0,
        };
        for (i, (&allowed, (&a, &b))) in judgement
            .joint
            .iter()
            .zip(q.iter().zip(sample.joints.iter()))
            .enumerate()
        {
            if allowed == f64::INFINITY {
                continue;
            }
            let by = self.joint_difference(i, a, b);
            let ratio = by / allowed;
            if ratio > worst.ratio || ratio.is_nan() {
                worst = Miss {
                    joint: i,
                    by,
                    allowed,
                    ratio: if ratio.is_nan() { f64::INFINITY } else { ratio },
                };
            }
        }
        worst
    }
}

/// The largest difference of one solution from the sample, relative to its allowance.
#[derive(Clone, Copy, Debug)]
struct Miss {
    joint: usize,
    by: f64,
    allowed: f64,
    /// `by / allowed`: at most 1 when recovered.
    ratio: f64,
}

impl Miss {
    const NONE: Miss = Miss {
        joint: 0,
        by: f64::INFINITY,
        allowed: 0.0,
        ratio: f64::INFINITY,
    };

    fn status(&self) -> Status {
        if self.ratio <= 1.0 {
            Status::Recovered
        } else {
            Status::NotRecovered {
                joint: self.joint,
                by: self.by,
                allowed: self.allowed,
            }
        }
    }
}
