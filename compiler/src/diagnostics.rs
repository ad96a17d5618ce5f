//! Located problems in a description file, collected and reported together.

use std::fmt;

use crate::text::{escape_line, shorten};

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

/// The most problems a report shows; the rest are counted.
pub const MAX_SHOWN: usize = 50;

/// The most characters of a key, a message or a source line a report shows (a long source
/// line is shown as a window around the caret).
const MAX_LINE_CHARS: usize = 120;

/// Likely slips in a description file that do not stop it from loading (a radian file whose
/// limits look like degrees), shown like problems but as `warning:`.
#[derive(Clone, Debug, PartialEq)]
pub struct Warnings(pub Diagnostics);

impl Warnings {
    /// True when there is nothing to warn about.
    pub fn is_empty(&self) -> bool {
        self.0.items.is_empty()
    }
}

impl fmt::Display for Warnings {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        self.0.write_all(f, "warning")
    }
}

impl fmt::Display for Diagnostics {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        self.write_all(f, "error")
    }
}

impl Diagnostics {
    /// The first [`MAX_SHOWN`] items with their place and caret, each after `level:`, then how
    /// many more there are. Text from the file (path, key, source line) is shown through
    /// [`escape_line`], so it cannot change how the message reads, and cut to a readable
    /// length.
    fn write_all(&self, f: &mut fmt::Formatter<'_>, level: &str) -> fmt::Result {
        let path = escape_line(&shorten(&self.path, MAX_LINE_CHARS)).into_owned();
        for (i, d) in self.items.iter().take(MAX_SHOWN).enumerate() {
            if i > 0 {
                writeln!(f)?;
            }
            let key = if d.key.is_empty() {
                String::new()
            } else {
                format!("`{}`: ", escape_line(&shorten(&d.key, MAX_LINE_CHARS)))
            };
            let message = escape_line(&shorten(&d.message, 4 * MAX_LINE_CHARS)).into_owned();
            if d.location.line == 0 {
                // No place in the file (e.g. the file could not be read).
                writeln!(f, "{level}: {path}: {key}{message}")?;
                continue;
            }
            writeln!(
                f,
                "{level}: {path}:{}:{}: {key}{message}",
                d.location.line, d.location.column
            )?;
            let (shown_line, caret_column) = caret_window(&d.source_line, d.location.column);
            let gutter = d.location.line.to_string().len();
            writeln!(f, "{:gutter$} |", "")?;
            writeln!(f, "{} | {}", d.location.line, shown_line)?;
            write!(f, "{:gutter$} | {:>caret_column$}", "", "^")?;
            writeln!(f)?;
        }
        if self.items.len() > MAX_SHOWN {
            writeln!(
                f,
                "\n{level}: {path}: {} more problems not shown ({} in all)",
                self.items.len() - MAX_SHOWN,
                self.items.len()
            )?;
        }
        Ok(())
    }
}

/// The source line as shown (escaped, and cut to a window around `column` when long) with the
/// 1-based column of the caret in it: the caret stays under the same character.
fn caret_window(line: &str, column: usize) -> (String, usize) {
    let chars: Vec<char> = line.chars().collect();
    let at = column.saturating_sub(1).min(chars.len());
    let half = MAX_LINE_CHARS / 2;
    let (start, end) = if chars.len() <= MAX_LINE_CHARS {
        (0, chars.len())
    } else {
        let start = at.saturating_sub(half).min(chars.len() - MAX_LINE_CHARS);
        (start, start + MAX_LINE_CHARS)
    };
    let lead = if start > 0 { "…" } else { "" };
    let trail = if end < chars.len() { "…" } else { "" };
    let before: String = chars[start..at].iter().collect();
    let rest: String = chars[at..end].iter().collect();
    let before = format!("{lead}{}", escape_line(&before));
    let caret_column = before.chars().count() + 1;
    (
        format!("{before}{}{trail}", escape_line(&rest)),
        caret_column,
    )
}

impl std::error::Error for Diagnostics {}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_long_line_is_shown_as_a_window_with_the_caret_in_place() {
        let line = format!("k = \"{}\"", "x".repeat(100_000));
        let (shown, caret) = caret_window(&line, 50_000);
        assert!(shown.chars().count() <= MAX_LINE_CHARS + 2, "{shown}");
        assert!(shown.starts_with('…') && shown.ends_with('…'));
        assert_eq!(shown.chars().nth(caret - 1), Some('x'));
        let (short, caret) = caret_window("a = \u{1b}b", 6);
        assert_eq!(short, "a = \\u{1b}b");
        assert_eq!(short.chars().nth(caret - 1), Some('b'));
    }
}
