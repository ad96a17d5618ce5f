//! The JSON-lines loop shared by `armforge forward` and `armforge solve`.

use std::fmt::Display;
use std::io::{BufRead, Write};
use std::process::ExitCode;

/// Answers every non-blank line of stdin with one line on stdout. A line that `answer`
/// rejects gets `{"error": "line N: …"}` and the loop goes on; the exit status is then 1
/// (also when stdin cannot be read or stdout cannot be written), otherwise 0.
pub fn answer_lines<A: Display>(mut answer: impl FnMut(&str) -> Result<A, String>) -> ExitCode {
    let stdin = std::io::stdin();
    let mut out = std::io::stdout().lock();
    let mut any_malformed = false;
    for (index, line) in stdin.lock().lines().enumerate() {
        let line = match line {
            Ok(line) => line,
            Err(e) => {
                eprintln!("error: cannot read stdin: {e}");
                return ExitCode::from(super::exit::FAILED);
            }
        };
        if line.trim().is_empty() {
            continue;
        }
        let written = match answer(&line) {
            Ok(answer) => writeln!(out, "{answer}"),
            Err(message) => {
                any_malformed = true;
                let error =
                    serde_json::json!({ "error": format!("line {}: {message}", index + 1) });
                writeln!(out, "{error}")
            }
        };
        if written.is_err() {
            return ExitCode::from(super::exit::FAILED);
        }
    }
    if any_malformed {
        ExitCode::from(super::exit::FAILED)
    } else {
        ExitCode::from(super::exit::OK)
    }
}
