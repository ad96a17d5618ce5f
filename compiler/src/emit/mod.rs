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
//! // with `ScalarType::F32`: f32 in place of f64 (`[f32; JOINTS]`, `Pose<f32>`, …)
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

use proc_macro2::TokenStream;
use quote::quote;

use crate::model::Model;
use crate::plan::Plan;

/// The scalar an emitted solver computes in: a property of the target (a controller with a
/// single-precision FPU wants `f32`), not of the arm. The plan is the same for both; the
/// emitter prints the module's types and constants in the chosen scalar and carries the
/// solver's tolerances over by the ratio of the epsilons
/// ([`armforge_runtime::math::tolerance`]).
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash)]
pub enum ScalarType {
    /// IEEE 754 binary64, the default.
    #[default]
    F64,
    /// IEEE 754 binary32, for targets with a single-precision FPU.
    F32,
}

impl ScalarType {
    /// Both scalars, default first.
    pub const ALL: [ScalarType; 2] = [ScalarType::F64, ScalarType::F32];

    /// The Rust type's name: `"f64"` or `"f32"`.
    pub fn name(self) -> &'static str {
        match self {
            ScalarType::F64 => "f64",
            ScalarType::F32 => "f32",
        }
    }

    /// The scalar a word names (`"f64"` or `"f32"`), if any.
    pub fn from_name(word: &str) -> Option<ScalarType> {
        ScalarType::ALL.into_iter().find(|s| s.name() == word)
    }

    /// The type, as tokens.
    pub(crate) fn ty(self) -> TokenStream {
        match self {
            ScalarType::F64 => quote!(f64),
            ScalarType::F32 => quote!(f32),
        }
    }

    /// The generic argument of a runtime type: nothing for `f64` (the runtime's default, so
    /// an `f64` module reads `Pose`), `<f32>` otherwise.
    pub(crate) fn generic(self) -> TokenStream {
        match self {
            ScalarType::F64 => quote!(),
            ScalarType::F32 => quote!(<f32>),
        }
    }

    /// The scalar as a trailing generic argument (`SolutionSet<CAPACITY, f32>`): nothing for
    /// `f64`.
    pub(crate) fn trailing(self) -> TokenStream {
        match self {
            ScalarType::F64 => quote!(),
            ScalarType::F32 => quote!(, f32),
        }
    }

    /// `::core::f64` or `::core::f32` (for `consts::PI`, `INFINITY`).
    pub(crate) fn core_module(self) -> TokenStream {
        match self {
            ScalarType::F64 => quote!(::core::f64),
            ScalarType::F32 => quote!(::core::f32),
        }
    }

    /// An `f64` tolerance of the solver carried to this scalar.
    pub fn tolerance(self, f64_value: f64, growth: armforge_runtime::math::Growth) -> f64 {
        match self {
            ScalarType::F64 => f64_value,
            ScalarType::F32 => {
                f64::from(armforge_runtime::math::tolerance::<f32>(f64_value, growth))
            }
        }
    }

    /// A plan constant in this scalar: thresholds follow its epsilon (a squared tolerance of
    /// `f64` times 2^29 for `f32`, a fourth power times 2^58), floors become its own.
    pub fn constant(self, f64_value: f64, scaling: crate::plan::graph::Scaling) -> f64 {
        use crate::plan::graph::Scaling;
        use armforge_runtime::math::Growth;
        match (self, scaling) {
            (ScalarType::F64, _) | (_, Scaling::Fixed) => f64_value,
            (ScalarType::F32, Scaling::Floor) => 1e-30,
            (ScalarType::F32, Scaling::Tolerance(n)) => {
                // n factors of √(ε₃₂ / ε₆₄), applied in f64 (2^14.5 each).
                let factor = self.tolerance(1.0, Growth::SquareRoot);
                let scaled = (0..n).fold(f64_value, |x, _| x * factor);
                format!("{scaled:.2e}").parse().unwrap_or(scaled)
            }
        }
    }
}

/// Options of the emitted module.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct EmitOptions {
    /// The description file's path as shown in the header (e.g. `arms/bench-arm.toml`).
    pub source_path: String,
    /// Leave out the `#[cfg(test)]` round-trip test module.
    pub without_test: bool,
    /// The scalar the solver computes in.
    pub scalar: ScalarType,
}

/// The version of this generator, named in every emitted header.
pub const GENERATOR_VERSION: &str = env!("CARGO_PKG_VERSION");

/// Writes the whole module source (a file body: header comment, items, test module).
pub fn emit_module(model: &Model, plan: &Plan, options: &EmitOptions) -> String {
    let (tokens, notes) = items::module(plan, !options.without_test, options.scalar);
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
    if options.scalar == ScalarType::F32 {
        // Before the blank line that ends the header.
        out.pop();
        out.push_str(
            "//\n// Scalar: f32 (single precision, about 7 significant digits); tolerances carried\n\
             // over by the ratio of the epsilons. README gives the measured accuracy.\n\n",
        );
    }
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
            scalar: ScalarType::F64,
        },
    )
}
