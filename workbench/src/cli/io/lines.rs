//! The JSON-lines loop shared by `armforge forward` and `armforge solve`, with bounded input.
//!
//! Lines are read as bytes, at most [`MAX_LINE_BYTES`] of each held in memory. A line that is
//! longer, or not UTF-8, gets an error line and the stream goes on with the next one.

use std::fmt::Display;
use std::io::{BufRead, Write};
use std::process::ExitCode;

use serde_json::json;

use super::exit;
use super::terminal::{fail, stdout_failed, Outcome};

/// The longest input line, in bytes (1 MiB; a pose line is about 200 bytes).
pub const MAX_LINE_BYTES: usize = 1 << 20;

/// One line of input as read.
#[derive(Debug, PartialEq, Eq)]
pub enum Line {
    /// The line's text (without its end of line).
    Text(String),
    /// The line is longer than the cap (its bytes were skipped).
    TooLong,
    /// The line is not UTF-8.
    NotUtf8 {
        /// The 0-based byte offset of the first bad byte within the line.
        at: usize,
    },
}

/// Reads the next line of `input` holding at most `cap` bytes; `None` at the end.
pub fn next_line(input: &mut impl BufRead, cap: usize) -> std::io::Result<Option<Line>> {
    let mut bytes = Vec::new();
    let mut too_long = false;
    let mut any = false;
    loop {
        let chunk = input.fill_buf()?;
        if chunk.is_empty() {
            break;
        }
        any = true;
        let (taken, ended) = match chunk.iter().position(|&b| b == b'\n') {
            Some(i) => (i + 1, true),
            None => (chunk.len(), false),
        };
        let content = &chunk[..taken - usize::from(ended)];
        if !too_long && bytes.len() + content.len() <= cap {
            bytes.extend_from_slice(content);
        } else {
            too_long = true;
            bytes = Vec::new();
        }
        input.consume(taken);
        if ended {
            break;
        }
    }
    if !any {
        return Ok(None);
    }
    if too_long {
        return Ok(Some(Line::TooLong));
    }
    if bytes.last() == Some(&b'\r') {
        bytes.pop();
    }
    Ok(Some(match String::from_utf8(bytes) {
        Ok(text) => Line::Text(text),
        Err(e) => Line::NotUtf8 {
            at: e.utf8_error().valid_up_to(),
        },
    }))
}

/// Answers every non-blank line of stdin with one line on stdout. A line that `answer`
/// rejects, that is longer than [`MAX_LINE_BYTES`] or that is not UTF-8 gets
/// `{"error": "…", "line": N}` and the loop goes on; the exit status is then 1, otherwise 0
/// (5 when stdin cannot be read or stdout cannot be written).
pub fn answer_lines<A: Display>(answer: impl FnMut(&str) -> Result<A, String>) -> Outcome {
    let stdin = std::io::stdin();
    let stdout = std::io::stdout();
    answer_stream(&mut stdin.lock(), &mut stdout.lock(), answer)
}

/// [`answer_lines`] over any input and output.
pub fn answer_stream<A: Display>(
    input: &mut impl BufRead,
    out: &mut impl Write,
    mut answer: impl FnMut(&str) -> Result<A, String>,
) -> Outcome {
    let mut any_malformed = false;
    let mut number = 0;
    loop {
        let line = match next_line(input, MAX_LINE_BYTES) {
            Ok(Some(line)) => line,
            Ok(None) => break,
            Err(e) => return Err(fail(exit::IO, &format!("cannot read standard input: {e}"))),
        };
        number += 1;
        let result = match line {
            Line::Text(text) if text.trim().is_empty() => continue,
            Line::Text(text) => answer(&text).map(|a| a.to_string()),
            Line::TooLong => Err(format!(
                "the line is longer than {} KiB; a line holds one JSON value",
                MAX_LINE_BYTES / 1024
            )),
            Line::NotUtf8 { at } => Err(format!(
                "the line is not UTF-8 text (byte {} starts no character)",
                at + 1
            )),
        };
        let written = match result {
            Ok(answer) => writeln!(out, "{answer}"),
            Err(message) => {
                any_malformed = true;
                writeln!(out, "{}", json!({ "error": message, "line": number }))
            }
        };
        written
            .and_then(|()| out.flush())
            .map_err(|e| stdout_failed(&e))?;
    }
    Ok(ExitCode::from(if any_malformed {
        exit::FAILED
    } else {
        exit::OK
    }))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn lines(input: &[u8], cap: usize) -> Vec<Line> {
        let mut reader = std::io::BufReader::with_capacity(4, input);
        std::iter::from_fn(|| next_line(&mut reader, cap).unwrap()).collect()
    }

    #[test]
    fn long_and_broken_lines_do_not_end_the_stream() {
        let got = lines(b"ab\n0123456789\n\xff\xfe\nlast", 5);
        assert_eq!(
            got,
            [
                Line::Text("ab".into()),
                Line::TooLong,
                Line::NotUtf8 { at: 0 },
                Line::Text("last".into())
            ]
        );
    }

    #[test]
    fn each_bad_line_gets_its_number() {
        let input = b"[1]\n\xc3(\n\n[2]\n";
        let mut out = Vec::new();
        let code = answer_stream(&mut &input[..], &mut out, |line| {
            if line == "[1]" || line == "[2]" {
                Ok(line.to_string())
            } else {
                Err("bad".to_string())
            }
        });
        assert_eq!(code, Ok(ExitCode::from(exit::FAILED)));
        let text = String::from_utf8(out).unwrap();
        let lines: Vec<&str> = text.lines().collect();
        assert_eq!(lines[0], "[1]");
        assert!(lines[1].contains(r#""line":2"#), "{text}");
        assert!(lines[1].contains("not UTF-8"), "{text}");
        assert_eq!(lines[2], "[2]");
    }
}
