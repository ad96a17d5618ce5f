//! Every write to standard output and standard error goes through here, so none can panic.
//!
//! A closed standard output (`armforge solve … | head -1`) ends the command quietly with
//! [`exit::IO`](super::exit::IO); any other failure (a full disk behind a redirection) says so
//! on standard error and ends it with the same code. A failing standard error is ignored: there
//! is nowhere left to report it.
//!
//! Messages and text reports pass through [`escape_text`], so a name or path from a file
//! cannot carry terminal escapes, bidirectional controls or line separators to the terminal.

use std::io::{ErrorKind, Write};
use std::process::ExitCode;

use armforge_compiler::text::escape_text;

use super::exit;

/// A command stopped early, with its exit code; what went wrong was already said.
pub type Stopped = ExitCode;

/// What a command's `run` gives: its exit code either way.
pub type Outcome = Result<ExitCode, Stopped>;

/// Writes `text` as it is to standard output (an artefact: a module, a sheet, an SVG, JSON).
pub fn out(text: &str) -> Result<(), Stopped> {
    let mut stdout = std::io::stdout().lock();
    stdout
        .write_all(text.as_bytes())
        .and_then(|()| stdout.flush())
        .map_err(|e| stdout_failed(&e))
}

/// Writes a text report for people to standard output, non-printing characters escaped.
pub fn report(text: &str) -> Result<(), Stopped> {
    out(&escape_text(text))
}

/// The exit code for a failed write to standard output, after saying why (unless the reader
/// closed the pipe: then it wanted no more, and nothing is said).
pub fn stdout_failed(e: &std::io::Error) -> Stopped {
    if e.kind() != ErrorKind::BrokenPipe {
        say(&format!("error: cannot write to standard output: {e}"));
    }
    exit::code(exit::IO)
}

/// Writes one line for people to standard error, non-printing characters escaped (keeping
/// newlines). Errors are ignored: standard error is the last place to report anything.
pub fn say(line: &str) {
    let mut stderr = std::io::stderr().lock();
    let text = escape_text(line.trim_end_matches('\n'));
    let _ = writeln!(stderr, "{text}");
}

/// Says `error: {message}` and gives `code` (to return from `run`).
pub fn fail(code: u8, message: &str) -> Stopped {
    say(&format!("error: {message}"));
    exit::code(code)
}
