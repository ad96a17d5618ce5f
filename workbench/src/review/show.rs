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

/// The length of the number at the start of `chars` (`-0.21`, `1.46e-10`, `3`), or 0.
fn number_length(chars: &[char]) -> usize {
    let mut i = usize::from(chars.first() == Some(&'-'));
    let digits = |i: &mut usize| {
        let start = *i;
        while chars.get(*i).is_some_and(|c| c.is_ascii_digit()) {
            *i += 1;
        }
        *i > start
    };
    if !digits(&mut i) {
        return 0;
    }
    if chars.get(i) == Some(&'.') && chars.get(i + 1).is_some_and(|c| c.is_ascii_digit()) {
        i += 1;
        digits(&mut i);
    }
    if chars.get(i) == Some(&'e') {
        let mut j = i + 1;
        if chars.get(j) == Some(&'-') {
            j += 1;
        }
        if digits(&mut j) {
            i = j;
        }
    }
    i
}

/// The unit written right after a number (` m²`, ` m`, ` rad`) and its length in characters,
/// when it ends there (a space, punctuation or the end follows).
fn unit_after(chars: &[char]) -> Option<(&'static str, usize)> {
    ["m²", "m", "rad"].into_iter().find_map(|unit| {
        let n = unit.chars().count();
        let written: String = chars.iter().skip(1).take(n).collect();
        let ends = chars
            .get(n + 1)
            .map_or(true, |c| !(c.is_alphanumeric() || *c == '_'));
        (chars.first() == Some(&' ') && written == unit && ends).then_some((unit, n + 1))
    })
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

    /// A number in the file's unit that may be small (a tolerance): six decimals at most, or
    /// three significant digits in scientific notation below 1e-4.
    fn small_or_plain(&self, x: f64) -> String {
        if x != 0.0 && x.abs() < 1e-4 {
            let text = format!("{x:.2e}");
            let text = match text.split_once('e') {
                Some((mantissa, exponent)) => format!(
                    "{}e{exponent}",
                    mantissa.trim_end_matches('0').trim_end_matches('.')
                ),
                None => text,
            };
            minus(&text)
        } else {
            self.num(x)
        }
    }

    /// A tolerance that applies to every joint in SI (radians or metres), in the file's units:
    /// `5.73e-11° for a turning joint, 1e-9 mm for a slide`.
    pub fn per_kind(&self, si: f64) -> String {
        format!(
            "{} for a turning joint, {} for a slide",
            self.with_unit(si, "rad"),
            self.with_unit(si, "m")
        )
    }

    /// A threshold in radians for a turning joint (the same number is a fraction of the arm's
    /// size for a slide), in the file's angle unit.
    pub fn turning_or_fraction(&self, radians: f64) -> String {
        format!(
            "{} ({} of the arm's size for a slide)",
            self.with_unit(radians, "rad"),
            self.small_or_plain(radians)
        )
    }

    /// A text the plan builder wrote in SI units (`c_tool = (0, 0, -0.21) m`,
    /// `φ0 = -1.375932 rad`, `r < 1.46e-10 m`) in the file's units (`(0, 0, −210) mm`,
    /// `−78.835°`, `r < 1.46e-7 mm`), minus signs typeset as `−`. A tuple of numbers followed
    /// by a unit is converted whole.
    pub fn in_file_units(&self, text: &str) -> String {
        let chars: Vec<char> = text.chars().collect();
        let mut out = String::with_capacity(text.len());
        let mut i = 0;
        while i < chars.len() {
            let starts_word = i == 0 || !(chars[i - 1].is_alphanumeric() || chars[i - 1] == '_');
            if chars[i] == '(' {
                if let Some((converted, used)) = self.tuple(&chars[i..]) {
                    out.push_str(&converted);
                    i += used;
                    continue;
                }
            }
            let n = if starts_word {
                number_length(&chars[i..])
            } else {
                0
            };
            if n > 0 {
                let written: String = chars[i..i + n].iter().collect();
                if let (Ok(x), Some((unit, used))) =
                    (written.parse::<f64>(), unit_after(&chars[i + n..]))
                {
                    out.push_str(&self.with_unit(x, unit));
                    i += n + used;
                    continue;
                }
                out.push_str(&minus(&written));
                i += n;
                continue;
            }
            out.push(chars[i]);
            i += 1;
        }
        minus(&out)
    }

    /// `(a, b, c) unit` at the start of `chars`, converted, with the characters it used.
    fn tuple(&self, chars: &[char]) -> Option<(String, usize)> {
        let close = chars.iter().position(|&c| c == ')')?;
        let inner: String = chars[1..close].iter().collect();
        let values: Vec<f64> = inner
            .split(',')
            .map(|p| p.trim().parse::<f64>())
            .collect::<Result<_, _>>()
            .ok()?;
        let (unit, used) = unit_after(&chars[close + 1..])?;
        let parts: Vec<String> = values
            .iter()
            .map(|&x| {
                let shown = self.with_unit(x, unit);
                shown
                    .trim_end_matches(self.units.length.symbol())
                    .trim_end_matches(self.units.angle.display_symbol())
                    .trim_end()
                    .to_string()
            })
            .collect();
        let symbol = match unit {
            "rad" => self.units.angle.display_symbol().trim().to_string(),
            "m²" => format!("{}²", self.units.length.symbol()),
            _ => self.units.length.symbol().to_string(),
        };
        Some((format!("({}) {symbol}", parts.join(", ")), close + 1 + used))
    }

    /// An SI number with its SI unit (`m`, `m²`, `rad`), in the file's unit.
    fn with_unit(&self, x: f64, unit: &str) -> String {
        let m = self.units.length.metres();
        match unit {
            "rad" => format!(
                "{}{}",
                self.small_or_plain(self.units.angle_from_si(x)),
                self.units.angle.display_symbol()
            ),
            "m²" => format!(
                "{} {}²",
                self.small_or_plain(x / (m * m)),
                self.units.length.symbol()
            ),
            _ => format!(
                "{} {}",
                self.small_or_plain(self.units.length_from_si(x)),
                self.units.length.symbol()
            ),
        }
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
