//! The text of a description file and the problems found in it, located by line and column.

use std::ops::Range;

use crate::diagnostics::{Diagnostic, Diagnostics, Location};

/// A description file's text with the problems collected while reading it.
pub(crate) struct Source<'a> {
    text: &'a str,
    path: &'a str,
    found: Vec<(usize, Diagnostic)>,
}

impl<'a> Source<'a> {
    /// Starts reading `text`, which came from `path`.
    pub(crate) fn new(text: &'a str, path: &'a str) -> Self {
        Source {
            text,
            path,
            found: Vec::new(),
        }
    }

    /// The 1-based line and column (in characters) of a byte offset.
    pub(crate) fn location(&self, offset: usize) -> Location {
        let offset = self.clamp_to_char_boundary(offset);
        let before = &self.text[..offset];
        let line_start = before.rfind('\n').map_or(0, |i| i + 1);
        Location {
            line: before.matches('\n').count() + 1,
            column: before[line_start..].chars().count() + 1,
        }
    }

    /// The text of a 1-based line, without its line ending.
    pub(crate) fn line_text(&self, line: usize) -> String {
        self.text
            .lines()
            .nth(line.saturating_sub(1))
            .unwrap_or("")
            .trim_end_matches('\r')
            .to_string()
    }

    /// Records a problem at the start of `span`, about `key`.
    pub(crate) fn report(&mut self, span: &Range<usize>, key: &str, message: impl Into<String>) {
        let location = self.location(span.start);
        let diagnostic = Diagnostic {
            location,
            key: key.to_string(),
            message: message.into(),
            source_line: self.line_text(location.line),
        };
        self.found.push((span.start, diagnostic));
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
