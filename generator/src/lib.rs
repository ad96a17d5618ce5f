//! # armforge-generator
//!
//! Turns a robot arm's description into a specialised closed-form inverse-kinematics solver:
//! description file → [`model::Model`] → [`classify::Geometry`] → plan → emitted Rust module.
//! The `armforge` binary and the `armforge-macros` proc macro are thin shells over this library.
//!
//! **Safety.** A generated solver is not a safety function. Validate every solver on the real
//! machine at reduced speed in a safeguarded cell, and defer to local regulations, the applicable
//! robot safety standards (e.g. ISO 10218) and licensed practice.
#![deny(missing_docs)]

pub mod classify;
pub mod description;
pub mod diagnostics;
pub mod draw;
pub mod emit;
pub mod expand;
pub mod model;
pub mod pipeline;
pub mod plan;
pub mod review;
pub mod scaffold;
pub mod solver;
pub mod units;
pub mod verify;
