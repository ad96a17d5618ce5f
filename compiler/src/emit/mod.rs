//! The emitter: writes a plan as a Rust module with the arm's constants folded in.
//!
//! Each named step of the plan becomes a `let` with a comment giving its equation; shared
//! terms are computed once for all branches; there are no loops and no heap. The module
//! depends only on `::armforge_runtime` (absolute paths), compiles under `#![no_std]`, and is
//! formatted with `prettyplease`. The output is deterministic: the same model gives
//! byte-identical text.
//!
//! Emitted API (SI units — metres and radians — whatever units the description uses):
//!
//! ```text
//! pub const JOINTS: usize = 6;
//! pub const CAPACITY: usize;                    // most solutions one target can have
//! pub type Solutions = ::armforge_runtime::SolutionSet<CAPACITY>;
//! pub fn forward(joints: &[f64; JOINTS]) -> ::armforge_runtime::Pose;
//! pub fn solve(target: &::armforge_runtime::Pose) -> Solutions;
//! pub fn solve_near(target, current: &[f64; JOINTS]) -> Result<Solution, Unreachable>;
//! pub fn solve_branch(target, branch: Branch) -> Result<Solution, Unreachable>;
//! pub fn branch_of(joints: &[f64; JOINTS]) -> Branch;
//! ```

mod comments;
mod expr;
mod forward;
mod items;
mod selftest;

use crate::model::Model;
use crate::plan::Plan;

/// Options of the emitted module.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct EmitOptions {
    /// The description file's path as shown in the header (e.g. `arms/bench-arm.toml`).
    pub source_path: String,
    /// Leave out the `#[cfg(test)]` round-trip test module.
    pub without_test: bool,
}

/// The version of this generator, named in every emitted header.
pub const GENERATOR_VERSION: &str = env!("CARGO_PKG_VERSION");

/// Writes the whole module source (a file body: header comment, items, test module).
pub fn emit_module(model: &Model, plan: &Plan, options: &EmitOptions) -> String {
    let (tokens, notes) = items::module(plan, !options.without_test);
    let file: syn::File = match syn::parse2(tokens) {
        Ok(file) => file,
        Err(e) => {
            // The emitter writes only what it can parse; reaching this is a generator bug.
            return format!("compile_error!(\"armforge emitter produced invalid Rust: {e}\");\n");
        }
    };
    let body = prettyplease::unparse(&file);
    let body = comments::insert(&body, &notes);
    let mut out = comments::header(model, plan, &options.source_path);
    out.push_str(&body);
    out
}

/// The module checked in for a sample-arm fixture (`tests/tests/generated/NAME.rs`, see
/// [`crate::plan::samples::fixtures`]).
pub fn emit_fixture(fixture: &crate::plan::samples::Fixture) -> String {
    let (model, geometry) = fixture.arm();
    let plan = crate::plan::build_plan(&model, &geometry);
    emit_module(
        &model,
        &plan,
        &EmitOptions {
            source_path: format!("<sample arm {}>", fixture.name),
            without_test: false,
        },
    )
}
