//! # armforge-macros
//!
//! `solver!` turns an arm description into its inverse-kinematics solver module at compile
//! time, with exactly the items that `armforge emit` writes for the same file:
//!
//! ```ignore
//! armforge_macros::solver!(pub mod tray_arm = "arms/tray-arm.toml");
//!
//! let solutions = tray_arm::solve(&target);
//! ```
//!
//! The path is relative to the calling crate's `Cargo.toml`; Cargo rebuilds when the file
//! changes. The calling crate depends on `armforge-runtime` too (the module's only
//! dependency). A file that cannot be read, an invalid description or an arm without a
//! decoupled closed form is a compile error at the path, with the file, line and column.
//!
//! The work is done by `armforge_compiler::expand`; this crate is only the compiler's entry
//! point.
//!
//! **Safety.** A generated solver is not a safety function. Validate every solver on the real
//! machine at reduced speed in a safeguarded cell, and defer to local regulations, the
//! applicable robot safety standards (e.g. ISO 10218) and licensed practice.
#![deny(missing_docs)]

use proc_macro::TokenStream;

/// `solver!([attributes] [pub] mod NAME = "path/to/arm.toml");` — the arm's solver module.
///
/// See the crate documentation.
#[proc_macro]
pub fn solver(input: TokenStream) -> TokenStream {
    let manifest_dir = std::env::var_os("CARGO_MANIFEST_DIR").map(std::path::PathBuf::from);
    armforge_compiler::expand::solver_macro(input.into(), manifest_dir.as_deref()).into()
}
