//! # armforge-compiler
//!
//! Turns a robot arm's description into a specialised closed-form inverse-kinematics solver:
//! description file → [`model::Model`] → [`classify::Geometry`] → plan → emitted Rust module,
//! plus the interpreter of the same plan ([`solver`]). The `solver!` proc macro
//! (`armforge-macros`) depends on this crate only; the `armforge` command line and its tools
//! (inspect report, review sheet, verify, draw, new) live in `armforge-workbench` on top of it.
//!
//! **Safety.** A generated solver is not a safety function. Validate every solver on the real
//! machine at reduced speed in a safeguarded cell, and defer to local regulations, the applicable
//! robot safety standards (e.g. ISO 10218) and licensed practice.
#![deny(missing_docs)]

pub mod classify;
pub mod description;
pub mod diagnostics;
pub mod emit;
pub mod expand;
pub mod family;
pub mod model;
pub mod pipeline;
pub mod plan;
pub mod solver;
pub mod text;
pub mod units;
