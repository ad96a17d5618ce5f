//! Numbers as the sheet writes them: the file's units, six decimals at most, no `-0`.

use std::fmt::Write as _;

use armforge_runtime::{Joint, JointKind};

use crate::report::Item;

use armforge_compiler::units::{tidy, Units};

/// `text` with the minus signs of numbers typeset as `−` (a hyphen before a digit that does
/// not follow a letter or digit); hyphens in words (`joint-1`) and exponents stay.
pub fn minus(text: &str) -> String {
    let chars: Vec<char> = text.chars().collect();
    let mut out = String::with_capacity(text.len());
    for (i, &c) in chars.iter().enumerate() {
        let before = i.checked_sub(1).and_then(|j| chars.get(j)).copied();
        let after = chars.get(i + 1).copied();
        let sign = c == '-'
            && after.is_some_and(|a| a.is_ascii_digit())
            && !before.is_some_and(|b| b.is_alphanumeric() || b == '.');
        out.push(if sign { '−' } else { c });
    }
    out
}

/// Writes a two-column Markdown table of report items, `heading` naming the first column.
pub fn items(out: &mut String, heading: &str, items: &[Item]) {
    let _ = writeln!(out, "| {heading} | value |\n|---|---|");
    for item in items {
        let _ = writeln!(
            out,
            "| {} | {} |",
            item.label.replace('|', "\\|"),
            minus(&item.shown)
        );
    }
}

/// Writes numbers of one arm in its file's units.
#[derive(Clone, Copy, Debug)]
pub struct Show {
    /// The file's units.
    pub units: Units,
}

impl Show {
    /// A plain number.
    pub fn num(&self, x: f64) -> String {
        minus(&tidy(x))
    }

    /// A length (metres in) with its unit.
    pub fn len(&self, metres: f64) -> String {
        if !metres.is_finite() {
            return "unlimited".into();
        }
        format!(
            "{} {}",
            self.num(self.units.length_from_si(metres)),
            self.units.length.symbol()
        )
    }

    /// A small length (a tolerance, metres in) in scientific notation with its unit.
    pub fn small_len(&self, metres: f64) -> String {
        format!(
            "{:.2e} {}",
            self.units.length_from_si(metres),
            self.units.length.symbol()
        )
    }

    /// A length without its unit.
    pub fn len_bare(&self, metres: f64) -> String {
        self.num(self.units.length_from_si(metres))
    }

    /// An angle (radians in) with its unit.
    pub fn angle(&self, radians: f64) -> String {
        format!(
            "{}{}",
            self.num(self.units.angle_from_si(radians)),
            self.units.angle.display_symbol()
        )
    }

    /// A squared length (square metres in) with its unit.
    pub fn area(&self, square_metres: f64) -> String {
        let m = self.units.length.metres();
        format!(
            "{} {}²",
            self.num(square_metres / (m * m)),
            self.units.length.symbol()
        )
    }

    /// A dimensionless vector.
    pub fn dir(&self, v: &[f64; 3]) -> String {
        format!(
            "({}, {}, {})",
            self.num(v[0]),
            self.num(v[1]),
            self.num(v[2])
        )
    }

    /// A point or length vector (metres in) with its unit.
    pub fn point(&self, v: &[f64; 3]) -> String {
        format!(
            "({}, {}, {}) {}",
            self.len_bare(v[0]),
            self.len_bare(v[1]),
            self.len_bare(v[2]),
            self.units.length.symbol()
        )
    }

    /// A joint value (SI in) in the file's unit for the joint's kind.
    pub fn joint_value(&self, joint: &Joint, x: f64) -> String {
        if !x.is_finite() {
            return if x > 0.0 {
                "∞".into()
            } else {
                "−∞".into()
            };
        }
        match joint.kind {
            JointKind::Revolute => self.angle(x),
            JointKind::Prismatic => self.len(x),
        }
    }

    /// A 3×3 matrix as three rows.
    pub fn rows(&self, m: &[[f64; 3]; 3]) -> String {
        format!(
            "[{}; {}; {}]",
            self.dir_bare(&m[0]),
            self.dir_bare(&m[1]),
            self.dir_bare(&m[2])
        )
    }

    fn dir_bare(&self, v: &[f64; 3]) -> String {
        format!("{} {} {}", self.num(v[0]), self.num(v[1]), self.num(v[2]))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn minus_signs_of_numbers_only() {
        assert_eq!(minus("-0.5 and (−1, -2)"), "−0.5 and (−1, −2)");
        assert_eq!(minus("joint-1 at 8.54e-4 mm"), "joint-1 at 8.54e-4 mm");
        assert_eq!(minus("a - b"), "a - b");
    }
}
