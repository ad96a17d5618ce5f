//! # armforge-runtime
//!
//! The small `no_std` library shared by the solvers that armforge emits and by the armforge
//! interpreter: poses, the joint-axis model, forward kinematics by the product of exponentials,
//! and the scalar math they use. Nothing here allocates or panics.
//!
//! All quantities are SI: metres and radians.
//!
//! **Safety.** A generated solver is not a safety function. Validate every solver on the real
//! machine at reduced speed in a safeguarded cell, and defer to local regulations, the applicable
//! robot safety standards (e.g. ISO 10218) and licensed practice.
#![cfg_attr(not(feature = "std"), no_std)]
#![deny(missing_docs)]

pub mod fk;
#[doc(hidden)]
pub mod internal;
pub mod math;
pub mod model;
pub mod plan;
pub mod pose;
pub mod solution;

pub use fk::{forward, joint_motion};
pub use model::{Joint, JointKind};
pub use pose::Pose;
pub use solution::{
    Branch, Elbow, Flags, PoseProblem, Shoulder, Solution, SolutionSet, Unreachable, Wrist, JOINTS,
};
