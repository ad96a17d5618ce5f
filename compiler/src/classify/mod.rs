//! Classification of a model's geometry: the spherical wrist, the family of joints 1–3 and
//! the evidence for both; or a precise, located rejection.
//!
//! Everything is measured on the joint *lines* (axis directions and points in the base frame
//! with every model value at zero) and the tool point, never on the frames a file used or on
//! the base pose, so the same arm mounted on a wall or a ceiling, moved, or described in
//! another convention classifies the same.
//!
//! The test is Pieper's criterion (Pieper 1968): the axes of joints 4, 5, 6 meet in one point,
//! so the position of that point depends on joints 1–3 only (kinematic decoupling). Joints 1–3
//! must then be one of four families whose position problem armforge solves in closed form.

// A rejection carries its located message and notes; it is made once per classification, so
// its size costs nothing, and keeping it unboxed keeps the pinned `Result<Geometry, Rejection>`.
#![allow(clippy::result_large_err)]

pub mod context;
pub mod decoupled;
pub mod evidence;
pub mod family;
pub mod lines;
pub mod reach;
pub mod reject;
pub mod tolerances;
pub mod wrist;

pub use evidence::{ArmEvidence, Reach, ReachOrigin, Singularity};
pub use reject::{Note, Reason, Rejection};
pub use tolerances::{Resolved, Tolerances};
pub use wrist::WristEvidence;

use crate::family::{Found, Recognition, REGISTRY};
use crate::model::Model;

pub use crate::family::Family;

/// The most solutions a spherical wrist has for one orientation: joint 5 and its mirror.
pub const WRIST_SOLUTIONS: u32 = 2;

/// How many solutions to expect for one tool pose, at most (joints 1–3 × joints 4–6), counting
/// revolute values modulo full turns.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct SolutionCount {
    /// Solutions of joints 1–3 for one wrist-center target.
    pub position: u32,
    /// Solutions of joints 4–6 for each of those.
    pub wrist: u32,
    /// The product.
    pub total: u32,
}

/// What the classifier found: the family, the wrist center and the evidence for both.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Geometry {
    /// The family of joints 1–3.
    pub family: Family,
    /// The wrist center in the base frame with every model value at zero, metres.
    pub wrist_center: [f64; 3],
    /// The tolerances as given.
    pub tolerances: Tolerances,
    /// The tolerances resolved for this arm (its size, metres and radians).
    pub resolved: Resolved,
    /// The spherical wrist, when the arm has one.
    pub wrist: Option<WristEvidence>,
    /// The family's evidence.
    pub arm: ArmEvidence,
    /// The most solutions to expect for one tool pose.
    pub solutions: SolutionCount,
    /// The reach of the wrist center (none for cartesian arms: there it is the slides' box).
    pub reach: Option<Reach>,
    /// The singular configurations: the wrist's first, then those of joints 1–3.
    pub singularities: Vec<Singularity>,
}

/// Classifies `model`: the first family of the registry ([`crate::family::REGISTRY`]) that
/// recognises it, or the first family's reason why not.
///
/// Depends only on the joint lines, kinds and limits (for a slide's reach) and the tool point,
/// never on the base pose or the file's frames. A rejection names the failing property, the
/// joints and the numbers in the file's units, and points at the offending joint's table.
pub fn classify(model: &Model, tolerances: &Tolerances) -> Result<Geometry, Rejection> {
    let ctx = context::Context::new(model, tolerances)?;
    let mut degenerate = None;
    let mut first_reason = None;
    for module in REGISTRY {
        match module.recognise(&ctx) {
            Recognition::Mine(found) => return Ok(geometry_of(&ctx, module.family(), found)),
            Recognition::Degenerate(reason) => {
                degenerate.get_or_insert(reason);
            }
            Recognition::NotMine(reason) => {
                if first_reason.is_none() {
                    first_reason = reason;
                }
            }
        }
    }
    Err(degenerate
        .or(first_reason)
        .unwrap_or_else(|| family::unrecognised(&ctx)))
}

/// The geometry of an arm `family` recognised, with what it found.
pub fn geometry_of(ctx: &context::Context, family: Family, found: Found) -> Geometry {
    let [position, wrist] = found.solutions;
    Geometry {
        family,
        wrist_center: found.center,
        tolerances: ctx.tolerances,
        resolved: ctx.tol,
        wrist: found.wrist,
        arm: found.arm,
        solutions: SolutionCount {
            position,
            wrist,
            total: position * wrist,
        },
        reach: found.reach,
        singularities: found.singularities,
    }
}
