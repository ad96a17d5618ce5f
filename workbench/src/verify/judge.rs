//! How closely a round trip is judged: by the geometry of the sample's configuration, not by
//! the sampler that made it. A uniform sample or one placed at a joint limit that happens to
//! lie near a singular configuration is judged exactly like one placed there on purpose.
//!
//! # The rule
//!
//! Three measures of the sample's configuration, each relative and dimensionless:
//!
//! * `w`: how far joint 5 is from the nearest position at which axes 4 and 6 line up (either
//!   one: joint 5 at 0 and, for a wrist that can fold back, at ±180°), radians, capped at 1;
//! * `ρ1`, `ρ2`: the wrist center's distance from axis 1 and from axis 2 (revolute joints
//!   only), fractions of the arm's size, capped at 1;
//! * `δ`: the wrist center's distance from the nearest reach boundary where two solutions of
//!   joints 1–3 merge, fraction of the arm's size.
//!
//! With `t` the joint threshold (1e-6) and `b` the boundary threshold (1e-4) when `δ < 1e-6`,
//! `t` otherwise, the solution that recovers the sample may differ from it by at most
//!
//! | joint | allowed difference |
//! |---|---|
//! | 1 | `max(b, t / ρ1)` |
//! | 2 | `max(b, t / ρ2)` |
//! | 3 | `b` |
//! | 5 | `e = max(tolerance of joint 1, tolerance of joint 2)` |
//! | 4, 6 | `e / w` |
//!
//! (radians; slides as a fraction of the arm's size). A rounding error `ε` in the wrist
//! center moves joint 1 by about `ε / ρ1`: the joint's conditioning. The wrist's orientation
//! follows joints 1 and 2, and joints 4 and 6 split a rotation about the aligned axes in the
//! ratio `1 / w`. A joint whose allowance reaches half a turn (or the arm's size) is free: only
//! the coupled sum or difference of joints 4 and 6 at an aligned wrist, and joint 1's part of
//! the orientation on axis 1, are fixed, and the pose check, which holds for every joint, covers
//! them. The solver's own singular bands (sine 1e-10 at the wrist, 1e-10 of the arm's size on
//! axis 1) give allowances of 1e4, so whatever a free joint is held at is accepted.
//!
//! A sample is near singular, and judged by the looser pose threshold, when `w`, `ρ1` or `ρ2`
//! is below 1e-3 or `δ` below 1e-6 (the bands the sampler places samples in).

use std::f64::consts::{PI, TAU};

use armforge_runtime::{Joint, JointKind, JOINTS};

use super::check::Thresholds;
use super::sampler::distance_of;
use armforge_compiler::family::{Role, VerifyHints};

/// Measures below this (`w`, `ρ1`, `ρ2`) make a sample near singular.
pub const SINGULAR_BAND: f64 = 1e-3;
/// Distances from a reach boundary below this (fraction of the arm's size) make a sample near
/// singular, with the boundary threshold for its joints.
pub const BOUNDARY_BAND: f64 = 1e-6;

/// The measures of one configuration (see the module documentation).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Measures {
    /// Joint 5's distance from the nearest aligned position, radians, at most 1.
    pub wrist: f64,
    /// The wrist center's distance from axes 1 and 2, fractions of the arm's size, at most 1
    /// (1 for a slide).
    pub axis: [f64; 2],
    /// The distance from the nearest reach boundary, fraction of the arm's size (infinite
    /// when there is none).
    pub boundary: f64,
}

/// How one sample is judged.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Judgement {
    /// The measures it is judged by.
    pub measures: Measures,
    /// The allowed difference per joint (radians, or fraction of the arm's size); infinite
    /// for a free joint.
    pub joint: [f64; JOINTS],
    /// The allowed pose error.
    pub pose: f64,
    /// True when the sample is near a singular configuration or a reach boundary.
    pub near_singular: bool,
}

/// Judges the samples of one arm.
#[derive(Clone, Debug)]
pub struct Judge {
    joints: [Joint; JOINTS],
    size: f64,
    /// The family's hints: the aligning joint and its aligned positions, the two axis distances,
    /// the reach boundaries and what conditions each joint.
    hints: VerifyHints,
    thresholds: Thresholds,
}

impl Judge {
    /// A judge: the model's joints, the arm's size (metres), the family's hints
    /// ([`armforge_compiler::family::FamilyModule::verify_hints`], with the boundaries the
    /// sampler can place) and the thresholds.
    pub fn new(
        joints: [Joint; JOINTS],
        size: f64,
        hints: VerifyHints,
        thresholds: Thresholds,
    ) -> Judge {
        Judge {
            joints,
            size,
            hints,
            thresholds,
        }
    }

    /// The measures of a configuration.
    pub fn measures(&self, q: &[f64; JOINTS]) -> Measures {
        let a = self.hints.aligned_joint;
        let m5 = self.joints[a].model_value(q[a]);
        let wrist = self
            .hints
            .aligned_at
            .iter()
            .map(|&a| {
                let d = m5 - a;
                (d - TAU * (d / TAU).round()).abs()
            })
            .fold(1.0, f64::min);
        let mut axis = [1.0; 2];
        for (a, d) in axis.iter_mut().zip(&self.hints.axes) {
            if let Some(d) = d {
                *a = (distance_of(&self.joints, d, q) / self.size).min(1.0);
            }
        }
        let boundary = self
            .hints
            .boundaries
            .iter()
            .map(|b| (distance_of(&self.joints, &b.distance, q) - b.at).abs() / self.size)
            .fold(f64::INFINITY, f64::min);
        Measures {
            wrist,
            axis,
            boundary,
        }
    }

    /// How the sample with joint values `q` is judged (the rule of the module documentation).
    pub fn judge(&self, q: &[f64; JOINTS]) -> Judgement {
        let m = self.measures(q);
        let t = self.thresholds.joint;
        let at_boundary = m.boundary < BOUNDARY_BAND;
        let b = if at_boundary {
            self.thresholds.joint_at_boundary
        } else {
            t
        };
        let conditioned = |rho: f64| b.max(t / rho);
        let j1 = conditioned(m.axis[0]);
        let j2 = conditioned(m.axis[1]);
        let e = j1.max(j2);
        let wrist = e / m.wrist;
        let mut joint = self.hints.roles.map(|r| match r {
            Role::Axis(0) => j1,
            Role::Axis(_) => j2,
            Role::Bend => b,
            Role::WristMiddle => e,
            Role::WristSplit => wrist,
            Role::AxisAndSplit(0) => j1.max(wrist),
            Role::AxisAndSplit(_) => j2.max(wrist),
            Role::BendAndSplit => b.max(wrist),
        });
        for (i, x) in joint.iter_mut().enumerate() {
            let free = match self.joints[i].kind {
                JointKind::Revolute => PI,
                JointKind::Prismatic => 1.0,
            };
            if *x >= free || x.is_nan() {
                *x = f64::INFINITY;
            }
        }
        let near_singular = at_boundary
            || m.wrist < SINGULAR_BAND
            || m.axis[0] < SINGULAR_BAND
            || m.axis[1] < SINGULAR_BAND;
        Judgement {
            measures: m,
            joint,
            pose: if near_singular {
                self.thresholds.pose_near_singular
            } else {
                self.thresholds.pose
            },
            near_singular,
        }
    }
}

/// The distance of `point` from the line of `joint`'s axis.
pub fn distance_from_line(point: &[f64; 3], joint: &Joint) -> f64 {
    let d = [
        point[0] - joint.point[0],
        point[1] - joint.point[1],
        point[2] - joint.point[2],
    ];
    let h = &joint.axis;
    let along = d[0] * h[0] + d[1] * h[1] + d[2] * h[2];
    let perp = [
        d[0] - along * h[0],
        d[1] - along * h[1],
        d[2] - along * h[2],
    ];
    (perp[0] * perp[0] + perp[1] * perp[1] + perp[2] * perp[2]).sqrt()
}
