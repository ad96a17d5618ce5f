//! # armforge-kernel (use it through armforge-runtime)
//!
//! The small `no_std` library shared by the solvers that armforge emits and by the armforge
//! interpreter: poses, the joint-axis model, forward kinematics by the product of exponentials,
//! and the scalar math they use. Nothing here allocates or panics.
//!
//! All quantities are SI: metres and radians.
//!
//! ## Scalars
//!
//! The types are generic over the scalar with `f64` as the default: [`Pose`] is `Pose<f64>`,
//! `Pose<f32>` is the same pose in single precision, and so on for [`Solution`],
//! [`SolutionSet`], [`Unreachable`] and [`Joint`]. A solver is emitted for one scalar (a
//! property of the target, not of the arm); [`math::Scalar`] is the small trait its math goes
//! through (`std` when the `std` feature is on, `libm` otherwise), and its tolerances follow
//! the scalar's epsilon ([`math::tolerance`]).
//!
//! ## What a solver gives you
//!
//! Every emitted solver module (and the compiler's interpreter, `armforge_compiler::solver`)
//! answers with the types of [`solution`]:
//!
//! * `solve(&target)` → [`SolutionSet`]: one configuration per branch within the joint limits
//!   (a joint whose range exceeds one turn at the equivalent angle nearest its range's center;
//!   [`Solution::equivalents`] lists its other values), each a [`Solution`] with its joint
//!   values, its [`Branch`] label and its [`Flags`]; or none, with the
//!   [`Unreachable`] reason (beyond reach by how much, inside a hole, an orientation the wrist
//!   cannot take, every solution outside the limits, an invalid pose).
//! * `solve_near(&target, &current)` → the solution nearest to `current`; at a singularity the
//!   free joint keeps its current value.
//! * `solve_branch(&target, branch)` → the one configuration of a branch a controller holds.
//! * `branch_of(&joints)` → the label of any configuration; it agrees with `solve`.
//!
//! A [`Branch`] names the shoulder ([`Shoulder::Facing`]/[`Shoulder::Across`]), the elbow
//! ([`Elbow::Up`]/[`Elbow::Down`], or [`Elbow::Extended`]/[`Elbow::Retracted`] for a polar
//! arm's slide) and the wrist ([`Wrist::Leading`]/[`Wrist::Trailing`]); families with fewer choices
//! say `Only`. Each variant documents its geometric definition.
//!
//! [`plan`] is the interpreter of solve plans; `internal` (hidden) is the support code emitted
//! modules call and is not for users.
//!
//! **Safety.** A generated solver is not a safety function. Validate every solver on the real
//! machine at reduced speed in a safeguarded cell, and defer to local regulations, the applicable
//! robot safety standards (e.g. ISO 10218) and licensed practice.
#![cfg_attr(not(feature = "std"), no_std)]
#![deny(missing_docs)]

pub mod compact;
pub mod equivalents;
pub mod fk;
#[doc(hidden)]
pub mod internal;
pub mod math;
pub mod model;
pub mod plan;
pub mod pose;
pub mod solution;

pub use equivalents::{Equivalent, Equivalents};
pub use fk::{forward, joint_motion};
pub use math::Scalar;
pub use model::{Joint, JointKind};
pub use pose::Pose;
pub use solution::{
    Branch, Elbow, Flags, PoseProblem, Shoulder, Solution, SolutionSet, Unreachable, Wrist, JOINTS,
};
