//! # armforge-runtime
//!
//! The small `no_std` library that the solvers armforge emits depend on: poses, the joint-axis
//! model, forward kinematics, solution sets with branch labels and flags, and the support code
//! emitted modules call. Everything here is re-exported from `armforge-kernel`, which the
//! compiler's interpreter uses too, so emitted solvers and the interpreter share every type
//! and every line of finishing code.
//!
//! With the `macros` feature, [`solver!`] emits an arm's solver module at compile time from its
//! description file (the same module `armforge emit` writes):
//!
//! ```ignore
//! armforge_runtime::solver!(pub mod tray_arm = "arms/tray-arm.toml");
//! ```
//!
//! (The macro cannot live in this crate itself: a proc macro is its own crate, and it runs the
//! compiler, which uses the kernel; re-exporting it here behind a feature keeps Cargo's graph
//! free of cycles: runtime → macros → compiler → kernel.)
//!
//! **Safety.** A generated solver is not a safety function. Validate every solver on the real
//! machine at reduced speed in a safeguarded cell, and defer to local regulations, the applicable
//! robot safety standards (e.g. ISO 10218) and licensed practice.
#![no_std]

#[doc(inline)]
pub use armforge_kernel::*;

#[doc(hidden)]
pub use armforge_kernel::internal;

/// Emits an arm's solver module at compile time: `solver!([pub] mod NAME = "path/to/arm.toml");`
/// with the path relative to the crate's `Cargo.toml`. See `armforge-macros`.
#[cfg(feature = "macros")]
pub use armforge_macros::solver;
