//! The exit codes of every `armforge` command: one table, applied by every command and shown
//! in `armforge --help` ([`TABLE`]) and README.

use std::process::ExitCode;

use armforge_compiler::pipeline::PipelineError;

/// Success.
pub const OK: u8 = 0;
/// A failed check: a malformed input line, a stale `--check`, a failed verification, a pose
/// with no solution to draw.
pub const FAILED: u8 = 1;
/// A usage error: an unknown option, a bad option value (also from clap, whose code this is).
pub const USAGE: u8 = 2;
/// The geometry has no decoupled closed form.
pub const REJECTED: u8 = 3;
/// The description file is not a valid description (or cannot be read as text).
pub const BAD_DESCRIPTION: u8 = 4;
/// A file or stream cannot be read or written: a missing file, a full disk, an output that
/// would replace an input. A closed standard output (`armforge … | head`) ends the command
/// quietly with this code.
pub const IO: u8 = 5;

/// The table as `--help` shows it.
pub const TABLE: &str = "Exit status (every command): 0 success; 1 a failed check (a \
malformed input line, a stale --check, a failed verification, a pose with no solution to \
draw); 2 a usage error; 3 a geometry with no decoupled closed form; 4 a file that is not a \
valid description; 5 a file or stream that cannot be read or written (a closed standard \
output ends the command quietly with 5).";

/// The exit code for a pipeline error: [`IO`], [`BAD_DESCRIPTION`] or [`REJECTED`].
pub fn of_pipeline(e: &PipelineError) -> ExitCode {
    ExitCode::from(if matches!(e, PipelineError::Unreadable(_)) {
        IO
    } else if e.is_bad_description() {
        BAD_DESCRIPTION
    } else {
        REJECTED
    })
}

/// An exit code from the table.
pub fn code(code: u8) -> ExitCode {
    ExitCode::from(code)
}
