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

mod context;
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

use crate::model::Model;

/// The family of the first three joints. The names are armforge's own.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[cfg_attr(feature = "serde", serde(rename_all = "snake_case"))]
pub enum Family {
    /// R R R with axis 2 ∥ axis 3 and axis 1 ∦ axis 2.
    Elbow,
    /// R R P with the slide ⟂ axis 2 and axis 1 ∦ axis 2.
    Polar,
    /// R P P with the slides not parallel and not both ⟂ axis 1.
    Cylindrical,
    /// P P P with independent slides.
    Cartesian,
}

impl Family {
    /// The family's name as armforge writes it.
    pub fn name(self) -> &'static str {
        match self {
            Family::Elbow => "elbow",
            Family::Polar => "polar",
            Family::Cylindrical => "cylindrical",
            Family::Cartesian => "cartesian",
        }
    }

    /// The kinds of joints 1–3.
    pub fn pattern(self) -> &'static str {
        match self {
            Family::Elbow => "R R R",
            Family::Polar => "R R P",
            Family::Cylindrical => "R P P",
            Family::Cartesian => "P P P",
        }
    }

    /// The most solutions joints 1–3 can have for one wrist-center target (distinct modulo
    /// full turns): two roots of joint 1 × two of joint 3 for elbow and polar, the two roots of
    /// one quadratic for cylindrical, one linear solve for cartesian.
    pub fn position_solutions(self) -> u32 {
        match self {
            Family::Elbow | Family::Polar => 4,
            Family::Cylindrical => 2,
            Family::Cartesian => 1,
        }
    }
}

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
    /// The spherical wrist.
    pub wrist: WristEvidence,
    /// The family's evidence.
    pub arm: ArmEvidence,
    /// The most solutions to expect for one tool pose.
    pub solutions: SolutionCount,
    /// The reach of the wrist center (none for cartesian arms: there it is the slides' box).
    pub reach: Option<Reach>,
    /// The singular configurations: the wrist's first, then those of joints 1–3.
    pub singularities: Vec<Singularity>,
}

/// Classifies `model`: the wrist must be spherical and joints 1–3 one of the four families.
///
/// Depends only on the joint lines, kinds and limits (for a slide's reach) and the tool point,
/// never on the base pose or the file's frames. A rejection names the failing property, the
/// joints and the numbers in the file's units, and points at the offending joint's table.
pub fn classify(model: &Model, tolerances: &Tolerances) -> Result<Geometry, Rejection> {
    let ctx = context::Context::new(model, tolerances)?;
    let wrist = wrist::analyse(&ctx)?;
    let center = nalgebra::Point3::from(wrist.center);
    let family = family::decide(&ctx, &center)?;
    let measured = evidence::measure(&ctx, family, &center);
    let mut singularities = vec![if wrist.aligned_at.is_empty() {
        Singularity::WristNeverAligned
    } else {
        Singularity::WristAligned {
            joint_5_at: wrist.aligned_at.clone(),
        }
    }];
    singularities.extend(measured.singularities);
    let position = family.position_solutions();
    Ok(Geometry {
        family,
        wrist_center: wrist.center,
        tolerances: ctx.tolerances,
        resolved: ctx.tol,
        wrist,
        arm: measured.arm,
        solutions: SolutionCount {
            position,
            wrist: WRIST_SOLUTIONS,
            total: position * WRIST_SOLUTIONS,
        },
        reach: measured.reach,
        singularities,
    })
}
