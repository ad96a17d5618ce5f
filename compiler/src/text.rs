//! Text that came from outside (paths, names, descriptions, source lines) made safe to show.
//!
//! A character that does not print — a control character, a bidirectional control, a line or
//! paragraph separator, a zero-width or other format character, a noncharacter — can change how
//! the text around it reads: a terminal escape recolours or hides text, U+202E reverses it,
//! U+2028 starts what an editor shows as a new line inside a `//` comment. Every such character
//! is shown as `\u{…}` (its code point in hex) instead, so the reader sees what is really there.

use std::borrow::Cow;

/// `text` on one line: every non-printing character, newline and tab included, as `\u{…}`.
pub fn escape_line(text: &str) -> Cow<'_, str> {
    escape(text, |_| false)
}

/// `text` keeping its newlines and tabs: every other non-printing character as `\u{…}`.
pub fn escape_text(text: &str) -> Cow<'_, str> {
    escape(text, |c| c == '\n' || c == '\t')
}

/// `text` cut to at most `max_chars` characters for a message: a long value keeps its start
/// and end around `…`, followed by its length, so a 10 MB value is never echoed whole.
pub fn shorten(text: &str, max_chars: usize) -> Cow<'_, str> {
    let count = text.chars().count();
    if count <= max_chars {
        return Cow::Borrowed(text);
    }
    let head = max_chars.saturating_sub(max_chars / 4).max(1);
    let tail = (max_chars / 4).saturating_sub(1);
    let start: String = text.chars().take(head).collect();
    let end: String = text.chars().skip(count - tail).collect();
    Cow::Owned(format!("{start}…{end} ({count} characters)"))
}

fn escape(text: &str, keep: impl Fn(char) -> bool) -> Cow<'_, str> {
    if text.chars().all(|c| keep(c) || !is_non_printing(c)) {
        return Cow::Borrowed(text);
    }
    let mut out = String::with_capacity(text.len() + 8);
    for c in text.chars() {
        if keep(c) || !is_non_printing(c) {
            out.push(c);
        } else {
            out.push_str(&format!("\\u{{{:x}}}", u32::from(c)));
        }
    }
    Cow::Owned(out)
}

/// True for characters that do not print as themselves: Unicode's control (Cc), format (Cf),
/// line separator (Zl) and paragraph separator (Zp) characters, and noncharacters.
///
/// The format characters are listed by range from the Unicode Character Database's
/// general category Cf (Unicode 15; from memory), bidirectional controls (U+061C, U+200E,
/// U+200F, U+202A–U+202E, U+2066–U+2069, Unicode Standard Annex #9) among them.
pub fn is_non_printing(c: char) -> bool {
    const FORMAT: &[(u32, u32)] = &[
        (0x00AD, 0x00AD),
        (0x0600, 0x0605),
        (0x061C, 0x061C),
        (0x06DD, 0x06DD),
        (0x070F, 0x070F),
        (0x0890, 0x0891),
        (0x08E2, 0x08E2),
        (0x180E, 0x180E),
        (0x200B, 0x200F),
        (0x2028, 0x202E),
        (0x2060, 0x2064),
        (0x2066, 0x206F),
        (0xFEFF, 0xFEFF),
        (0xFFF9, 0xFFFB),
        (0x110BD, 0x110BD),
        (0x110CD, 0x110CD),
        (0x13430, 0x1343F),
        (0x1BCA0, 0x1BCA3),
        (0x1D173, 0x1D17A),
        (0xE0001, 0xE0001),
        (0xE0020, 0xE007F),
    ];
    let code = u32::from(c);
    let noncharacter = (0xFDD0..=0xFDEF).contains(&code) || code & 0xFFFE == 0xFFFE;
    c.is_control() || noncharacter || FORMAT.iter().any(|&(lo, hi)| (lo..=hi).contains(&code))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn shows_what_would_change_the_reading() {
        // Code points from the Unicode Standard: ESC U+001B (C0 controls), RLO U+202E and
        // LRI U+2066 (UAX #9), LINE SEPARATOR U+2028, ZERO WIDTH SPACE U+200B.
        assert_eq!(
            escape_line("a\u{1b}[31mb\u{202e}c\u{2066}d\u{2028}e\u{200b}f\0g\nh"),
            "a\\u{1b}[31mb\\u{202e}c\\u{2066}d\\u{2028}e\\u{200b}f\\u{0}g\\u{a}h"
        );
        assert_eq!(escape_text("a\tb\nc\u{85}"), "a\tb\nc\\u{85}");
    }

    #[test]
    fn shortens_long_values_and_says_how_long_they_were() {
        assert_eq!(shorten("abcdef", 6), "abcdef");
        let long = "x".repeat(10_000_000);
        let short = shorten(&long, 40);
        assert!(short.chars().count() < 80, "{short}");
        assert!(short.ends_with("(10000000 characters)"), "{short}");
        assert_eq!(shorten("abcdefghij", 8), "abcdef…j (10 characters)");
    }

    #[test]
    fn leaves_printing_text_alone() {
        let text = "θ₃ = atan2(y, x) — 90° ± 1e-6 µm, 電動";
        assert!(matches!(escape_line(text), Cow::Borrowed(_)));
    }
}
