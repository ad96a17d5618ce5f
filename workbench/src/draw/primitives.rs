//! Small SVG building blocks with fixed-precision coordinates (so the same drawing gives the
//! same bytes), built with the `svg` crate.

use armforge_compiler::text::escape_line;
use svg::node::element::{Circle, Group, Line, Polygon, Text};

/// Length of an arrowhead, px.
const HEAD_LENGTH: f64 = 8.0;
/// Half the width of an arrowhead, px.
const HEAD_HALF_WIDTH: f64 = 3.5;

/// A coordinate or length for the SVG: two decimals, never `-0.00`.
pub fn num(x: f64) -> String {
    let s = format!("{x:.2}");
    if s == "-0.00" {
        "0.00".to_string()
    } else {
        s
    }
}

/// A point list for `points="…"`.
pub fn point_list(points: &[[f64; 2]]) -> String {
    points
        .iter()
        .map(|p| format!("{},{}", num(p[0]), num(p[1])))
        .collect::<Vec<_>>()
        .join(" ")
}

/// A straight line.
pub fn segment(a: [f64; 2], b: [f64; 2], colour: &str, width: f64) -> Line {
    Line::new()
        .set("x1", num(a[0]))
        .set("y1", num(a[1]))
        .set("x2", num(b[0]))
        .set("y2", num(b[1]))
        .set("stroke", colour)
        .set("stroke-width", num(width))
}

/// A circle.
pub fn circle(centre: [f64; 2], radius: f64) -> Circle {
    Circle::new()
        .set("cx", num(centre[0]))
        .set("cy", num(centre[1]))
        .set("r", num(radius))
}

/// Text anchored at `at` (`anchor`: `start`, `middle` or `end`). Every text of a drawing
/// passes here: non-printing characters (which XML 1.0 forbids or an editor shows as a line
/// break) appear as `\u{…}`, and the `svg` crate escapes `<`, `>`, `&` and quotes.
pub fn text(at: [f64; 2], content: &str, size: f64, anchor: &str) -> Text {
    Text::new(escape_line(content))
        .set("x", num(at[0]))
        .set("y", num(at[1]))
        .set("font-size", num(size))
        .set("text-anchor", anchor)
}

/// A rough width of a text in the drawing's sans-serif font, px (for layout only).
pub fn text_width(content: &str, size: f64) -> f64 {
    0.58 * size * content.chars().count() as f64
}

/// Length of a 2-vector.
pub fn length(v: [f64; 2]) -> f64 {
    (v[0] * v[0] + v[1] * v[1]).sqrt()
}

/// An arrow from `from` to `to` with a filled head at `to`; `None` when shorter than its head.
pub fn arrow(from: [f64; 2], to: [f64; 2], colour: &str, width: f64) -> Option<Group> {
    let d = [to[0] - from[0], to[1] - from[1]];
    let l = length(d);
    if l < HEAD_LENGTH {
        return None;
    }
    let u = [d[0] / l, d[1] / l];
    let n = [-u[1], u[0]];
    let base = [to[0] - HEAD_LENGTH * u[0], to[1] - HEAD_LENGTH * u[1]];
    let head = [
        to,
        [
            base[0] + HEAD_HALF_WIDTH * n[0],
            base[1] + HEAD_HALF_WIDTH * n[1],
        ],
        [
            base[0] - HEAD_HALF_WIDTH * n[0],
            base[1] - HEAD_HALF_WIDTH * n[1],
        ],
    ];
    Some(
        Group::new()
            .add(segment(from, base, colour, width).set("stroke-linecap", "round"))
            .add(
                Polygon::new()
                    .set("points", point_list(&head))
                    .set("fill", colour),
            ),
    )
}

/// The mark of an axis pointing out of the page (a dot in a ring, `toward` = true) or into it
/// (a cross in a ring).
pub fn end_on_axis(centre: [f64; 2], radius: f64, toward: bool, colour: &str) -> Group {
    let ring = circle(centre, radius)
        .set("fill", "none")
        .set("stroke", colour)
        .set("stroke-width", "1.30");
    let class = if toward {
        "end-on toward"
    } else {
        "end-on away"
    };
    let group = Group::new().set("class", class).add(ring);
    if toward {
        group.add(circle(centre, 0.35 * radius).set("fill", colour))
    } else {
        let k = 0.62 * radius;
        group
            .add(segment(
                [centre[0] - k, centre[1] - k],
                [centre[0] + k, centre[1] + k],
                colour,
                1.3,
            ))
            .add(segment(
                [centre[0] - k, centre[1] + k],
                [centre[0] + k, centre[1] - k],
                colour,
                1.3,
            ))
    }
}

/// Splits text at spaces into lines of at most `max_chars` characters.
pub fn wrap_words(s: &str, max_chars: usize) -> Vec<String> {
    let mut lines = Vec::new();
    let mut line = String::new();
    for word in s.split(' ') {
        if !line.is_empty() && line.chars().count() + 1 + word.chars().count() > max_chars {
            lines.push(std::mem::take(&mut line));
        }
        if !line.is_empty() {
            line.push(' ');
        }
        line.push_str(word);
    }
    if !line.is_empty() {
        lines.push(line);
    }
    lines
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_have_two_decimals_and_no_negative_zero() {
        assert_eq!(num(1.0), "1.00");
        assert_eq!(num(-0.001), "0.00");
        assert_eq!(num(-12.346), "-12.35");
    }
}
