//! The exit codes of every `armforge` command, in one place.

use std::process::ExitCode;

use armforge_compiler::pipeline::PipelineError;

/// Success.
pub const OK: u8 = 0;
/// A failed check: a malformed input line, a stale `--check`, a failed verification.
pub const FAILED: u8 = 1;
/// The description file cannot be read or is not a valid description.
pub const BAD_FILE: u8 = 2;
/// The geometry has no decoupled closed form.
pub const REJECTED: u8 = 3;

/// The exit code for a pipeline error: [`BAD_FILE`] or [`REJECTED`].
pub fn of_pipeline(e: &PipelineError) -> ExitCode {
    ExitCode::from(if e.is_bad_description() {
        BAD_FILE
    } else {
        REJECTED
    })
}
