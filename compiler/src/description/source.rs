//! The text of a description file and the problems found in it, located by line and column.

use std::ops::Range;

use crate::diagnostics::{Diagnostic, Diagnostics, Location, Warnings};

/// A description file's text with the problems collected while reading it.
pub(crate) struct Source<'a> {
    text: &'a str,
    path: &'a str,
    /// The byte offset where each line starts, so that locating a problem costs a search, not
    /// a scan of the file (a file with 20,000 problems is located in linear time).
    line_starts: Vec<usize>,
    found: Vec<(usize, Diagnostic)>,
    /// Likely slips that do not stop the load (see [`Source::warn`]).
    warned: Vec<(usize, Diagnostic)>,
}

impl<'a> Source<'a> {
    /// Starts reading `text`, which came from `path`.
    pub(crate) fn new(text: &'a str, path: &'a str) -> Self {
        let line_starts = std::iter::once(0)
            .chain(text.match_indices('\n').map(|(i, _)| i + 1))
            .collect();
        Source {
            text,
            path,
            line_starts,
            found: Vec::new(),
            warned: Vec::new(),
        }
    }

    /// The 1-based line and column (in characters) of a byte offset.
    pub(crate) fn location(&self, offset: usize) -> Location {
        let offset = self.clamp_to_char_boundary(offset);
        let line = self.line_starts.partition_point(|&start| start <= offset);
        let line_start = self.line_starts[line - 1];
        Location {
            line,
            column: self.text[line_start..offset].chars().count() + 1,
        }
    }

    /// The text of a 1-based line, without its line ending.
    pub(crate) fn line_text(&self, line: usize) -> String {
        let Some(&start) = self.line_starts.get(line.saturating_sub(1)) else {
            return String::new();
        };
        let end = self
            .line_starts
            .get(line)
            .map_or(self.text.len(), |&next| next - 1);
        self.text[start..end].trim_end_matches('\r').to_string()
    }

    /// Records a problem at the start of `span`, about `key`.
    pub(crate) fn report(&mut self, span: &Range<usize>, key: &str, message: impl Into<String>) {
        let diagnostic = self.diagnostic(span, key, message.into());
        self.found.push((span.start, diagnostic));
    }

    /// Records a likely slip at the start of `span`, about `key`: the file loads, and the
    /// tools show the warning on stderr.
    pub(crate) fn warn(&mut self, span: &Range<usize>, key: &str, message: impl Into<String>) {
        let diagnostic = self.diagnostic(span, key, message.into());
        self.warned.push((span.start, diagnostic));
    }

    fn diagnostic(&self, span: &Range<usize>, key: &str, message: String) -> Diagnostic {
        let location = self.location(span.start);
        Diagnostic {
            location,
            key: key.to_string(),
            message,
            source_line: self.line_text(location.line),
        }
    }

    /// Every warning, in file order.
    pub(crate) fn warnings(&self) -> Warnings {
        let mut warned = self.warned.clone();
        warned.sort_by_key(|(offset, _)| *offset);
        Warnings(Diagnostics {
            path: self.path.to_string(),
            items: warned.into_iter().map(|(_, d)| d).collect(),
        })
    }

    /// True when nothing has been reported.
    pub(crate) fn is_clean(&self) -> bool {
        self.found.is_empty()
    }

    /// Every problem found, in file order.
    pub(crate) fn into_diagnostics(self) -> Diagnostics {
        let mut found = self.found;
        found.sort_by_key(|(offset, _)| *offset);
        Diagnostics {
            path: self.path.to_string(),
            items: found.into_iter().map(|(_, d)| d).collect(),
        }
    }

    fn clamp_to_char_boundary(&self, offset: usize) -> usize {
        let mut offset = offset.min(self.text.len());
        while !self.text.is_char_boundary(offset) {
            offset -= 1;
        }
        offset
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn location_counts_lines_and_characters_from_one() {
        let source = Source::new("ab\nπx = 1\n", "f.toml");
        assert_eq!(source.location(0), Location { line: 1, column: 1 });
        // "π" is two bytes but one character.
        let x = "ab\nπ".len();
        assert_eq!(source.location(x), Location { line: 2, column: 2 });
        assert_eq!(source.line_text(2), "πx = 1");
        assert_eq!(source.line_text(3), "");
        assert_eq!(source.location(x + 100), Location { line: 3, column: 1 });
    }

    #[test]
    fn diagnostics_come_out_in_file_order() {
        let mut source = Source::new("a = 1\nb = 2\n", "f.toml");
        source.report(&(6..7), "b", "second");
        source.report(&(0..1), "a", "first");
        let d = source.into_diagnostics();
        assert_eq!(d.items[0].key, "a");
        assert_eq!(d.items[1].location, Location { line: 2, column: 1 });
    }
}
