//! Located problems in a description file, collected and reported together.

use std::fmt;

use crate::text::escape_line;

/// A place in a source file: 1-based line and column.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub struct Location {
    /// 1-based line.
    pub line: usize,
    /// 1-based column (in characters).
    pub column: usize,
}

/// One problem found in a description file.
#[derive(Clone, Debug, PartialEq)]
pub struct Diagnostic {
    /// Where in the file; line 0 when the problem has no place in it (an unreadable file).
    pub location: Location,
    /// The key the problem is about, as a dotted path (`joint[3].limits`), or empty.
    pub key: String,
    /// What is wrong, with the numbers in the file's units.
    pub message: String,
    /// The source line, for the caret display.
    pub source_line: String,
}

/// Every problem found in one file.
#[derive(Clone, Debug, PartialEq)]
pub struct Diagnostics {
    /// The path as given by the user.
    pub path: String,
    /// The problems, in file order.
    pub items: Vec<Diagnostic>,
}

impl fmt::Display for Diagnostics {
    /// Every problem with its place and caret. Text from the file (path, key, source line) is
    /// shown through [`escape_line`], so it cannot change how the message reads.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let path = escape_line(&self.path);
        for (i, d) in self.items.iter().enumerate() {
            if i > 0 {
                writeln!(f)?;
            }
            let key = if d.key.is_empty() {
                String::new()
            } else {
                format!("`{}`: ", escape_line(&d.key))
            };
            let message = escape_line(&d.message);
            if d.location.line == 0 {
                // No place in the file (e.g. the file could not be read).
                writeln!(f, "error: {path}: {key}{message}")?;
                continue;
            }
            writeln!(
                f,
                "error: {path}:{}:{}: {key}{message}",
                d.location.line, d.location.column
            )?;
            // The caret goes under the same character of the escaped line.
            let before: String = d
                .source_line
                .chars()
                .take(d.location.column.saturating_sub(1))
                .collect();
            let caret_column = escape_line(&before).chars().count() + 1;
            let gutter = d.location.line.to_string().len();
            writeln!(f, "{:gutter$} |", "")?;
            writeln!(f, "{} | {}", d.location.line, escape_line(&d.source_line))?;
            write!(f, "{:gutter$} | {:>caret_column$}", "", "^")?;
            writeln!(f)?;
        }
        Ok(())
    }
}

impl std::error::Error for Diagnostics {}
