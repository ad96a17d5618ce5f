//! Text from the description file (names, the free-text description, the path) made inert in
//! Markdown: it shows as written and cannot add markup, HTML, links or table cells.
//!
//! Non-printing characters become `\u{…}` ([`escape_line`]); every ASCII punctuation
//! character that can start markup is backslash-escaped, which CommonMark defines to show the
//! character itself (CommonMark Spec 0.31, §2.4 "Backslash escapes"); `|` is escaped so a
//! name cannot split a table cell (GitHub Flavored Markdown Spec, §4.10 "Tables").

use armforge_compiler::text::escape_line;

/// Characters that are backslash-escaped: those that can open emphasis, code, links, images,
/// raw HTML, entities, strikethrough, table cells, headings or escapes.
const MARKUP: &str = "\\`*_[]<>|~&#!";

/// `text` on one line, showing as written inside a paragraph or a table cell.
pub fn inline(text: &str) -> String {
    let one_line = escape_line(text);
    let mut out = String::with_capacity(one_line.len() + 8);
    for c in one_line.chars() {
        if MARKUP.contains(c) {
            out.push('\\');
        }
        out.push(c);
    }
    out
}

/// Free text as one paragraph: its lines joined by spaces (as Markdown would render them),
/// escaped as [`inline`], and a start that would make a list, a quote, a heading or a rule
/// escaped too.
pub fn paragraph(text: &str) -> String {
    let joined = text
        .lines()
        .map(str::trim)
        .filter(|l| !l.is_empty())
        .collect::<Vec<_>>()
        .join(" ");
    let escaped = inline(&joined);
    let digits = escaped.chars().take_while(char::is_ascii_digit).count();
    let after_digits = escaped[digits..].chars().next();
    if escaped.starts_with(['-', '+', '=']) {
        format!("\\{escaped}")
    } else if digits > 0 && matches!(after_digits, Some('.' | ')')) {
        format!("{}\\{}", &escaped[..digits], &escaped[digits..])
    } else {
        escaped
    }
}

/// `text` as a code span: one line, non-printing characters as `\u{…}`, fenced with more
/// backticks than any run inside it (CommonMark Spec 0.31, §6.1 "Code spans").
pub fn code(text: &str) -> String {
    let one_line = escape_line(text);
    let mut longest = 0;
    let mut run = 0;
    for c in one_line.chars() {
        run = if c == '`' { run + 1 } else { 0 };
        longest = longest.max(run);
    }
    let fence = "`".repeat(longest + 1);
    let pad = if longest > 0 { " " } else { "" };
    format!("{fence}{pad}{one_line}{pad}{fence}")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn markup_and_html_show_as_written() {
        assert_eq!(
            inline("<b>a|b</b> & *c*"),
            "\\<b\\>a\\|b\\</b\\> \\& \\*c\\*"
        );
        assert_eq!(inline("bench-elbow 2"), "bench-elbow 2");
        assert_eq!(inline("a\u{0}b\nc"), "a\\\\u{0}b\\\\u{a}c");
        assert_eq!(paragraph("# one\n  - two\n"), "\\# one - two");
        assert_eq!(paragraph("- a list"), "\\- a list");
        assert_eq!(paragraph("12. not a list"), "12\\. not a list");
        assert_eq!(code("arms/a.toml"), "`arms/a.toml`");
        assert_eq!(code("a`b``c"), "``` a`b``c ```");
    }
}
