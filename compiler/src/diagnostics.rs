//! Located problems in a description file, collected and reported together.

use std::fmt;

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
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for (i, d) in self.items.iter().enumerate() {
            if i > 0 {
                writeln!(f)?;
            }
            let key = if d.key.is_empty() {
                String::new()
            } else {
                format!("`{}`: ", d.key)
            };
            if d.location.line == 0 {
                // No place in the file (e.g. the file could not be read).
                writeln!(f, "error: {}: {}{}", self.path, key, d.message)?;
                continue;
            }
            writeln!(
                f,
                "error: {}:{}:{}: {}{}",
                self.path, d.location.line, d.location.column, key, d.message
            )?;
            let gutter = d.location.line.to_string().len();
            writeln!(f, "{:gutter$} |", "")?;
            writeln!(f, "{} | {}", d.location.line, d.source_line)?;
            write!(
                f,
                "{:gutter$} | {:>col$}",
                "",
                "^",
                col = d.location.column.max(1)
            )?;
            writeln!(f)?;
        }
        Ok(())
    }
}

impl std::error::Error for Diagnostics {}
