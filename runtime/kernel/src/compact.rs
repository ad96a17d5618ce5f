//! Numbers in messages, short and without the heap: `0.1234`, `3`, `2.5e-7`, never `3e0` or
//! `1.2345678901234567e-1`.

use core::fmt::{self, Write};

/// Significant digits a message shows.
const DIGITS: usize = 4;

/// A number printed for people with at most four significant digits and no trailing zeros:
/// plain decimals from 0.001 up to 100,000, scientific notation outside (`2.5e-7`, `1e308`),
/// `0` for zero (never `-0`), and `NaN` / `inf` as Rust writes them.
#[derive(Clone, Copy, Debug)]
pub struct Compact(pub f64);

impl fmt::Display for Compact {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let x = self.0;
        if !x.is_finite() {
            return write!(f, "{x}");
        }
        if x == 0.0 {
            return f.write_str("0");
        }
        let mut buf = Buffer::new();
        let magnitude = x.abs();
        if (1e-3..1e5).contains(&magnitude) {
            let decimals = decimals_for(magnitude);
            write!(buf, "{x:.decimals$}")?;
            f.write_str(trim_fraction(buf.as_str()))
        } else {
            write!(buf, "{x:.prec$e}", prec = DIGITS - 1)?;
            let text = buf.as_str();
            let (mantissa, exponent) = text.split_once('e').unwrap_or((text, "0"));
            write!(f, "{}e{exponent}", trim_fraction(mantissa))
        }
    }
}

/// Decimals that give [`DIGITS`] significant digits for a magnitude in `[1e-3, 1e5)`.
fn decimals_for(magnitude: f64) -> usize {
    let mut whole_digits = 1usize;
    let mut bound = 10.0;
    // At most five steps: the magnitude is below 1e5.
    while magnitude >= bound && whole_digits < 5 {
        whole_digits += 1;
        bound *= 10.0;
    }
    let mut leading_zeros = 0usize;
    let mut floor = 1.0;
    // At most three steps: the magnitude is at least 1e-3.
    while magnitude < floor && leading_zeros < 3 {
        leading_zeros += 1;
        floor /= 10.0;
    }
    if leading_zeros > 0 {
        DIGITS + leading_zeros - 1
    } else {
        DIGITS.saturating_sub(whole_digits)
    }
}

/// `"0.1200"` → `"0.12"`, `"3.000"` → `"3"`; text without a point stays.
fn trim_fraction(text: &str) -> &str {
    if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.')
    } else {
        text
    }
}

/// A small fixed buffer for one formatted number (no heap).
struct Buffer {
    bytes: [u8; 48],
    len: usize,
}

impl Buffer {
    fn new() -> Buffer {
        Buffer {
            bytes: [0; 48],
            len: 0,
        }
    }

    fn as_str(&self) -> &str {
        core::str::from_utf8(self.bytes.get(..self.len).unwrap_or(&[])).unwrap_or("")
    }
}

impl Write for Buffer {
    fn write_str(&mut self, s: &str) -> fmt::Result {
        let end = self.len + s.len();
        let slot = self.bytes.get_mut(self.len..end).ok_or(fmt::Error)?;
        slot.copy_from_slice(s.as_bytes());
        self.len = end;
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::Compact;

    fn show(x: f64) -> String {
        format!("{}", Compact(x))
    }

    #[test]
    fn short_numbers_for_people() {
        assert_eq!(show(3.0), "3");
        assert_eq!(show(0.1234567), "0.1235");
        assert_eq!(show(-0.5), "-0.5");
        assert_eq!(show(12.5), "12.5");
        assert_eq!(show(99999.0), "99999");
        assert_eq!(show(0.001), "0.001");
        assert_eq!(show(0.0012346), "0.001235");
        assert_eq!(show(2.5e-7), "2.5e-7");
        assert_eq!(show(1e308), "1e308");
        assert_eq!(show(-1.23456e20), "-1.235e20");
        assert_eq!(show(0.0), "0");
        assert_eq!(show(-0.0), "0");
        assert_eq!(show(f64::NAN), "NaN");
        assert_eq!(show(f64::INFINITY), "inf");
    }

    #[test]
    fn reasons_print_short_numbers() {
        use crate::solution::{PoseProblem, Unreachable};
        let skewed: Unreachable<f64> =
            Unreachable::InvalidPose(PoseProblem::NotOrthonormal { error: 3.0 });
        let text = format!("{skewed}");
        assert!(text.contains("up to 3, allowed "), "{text}");
        assert!(!text.contains("e0"), "{text}");
        let far: Unreachable<f32> = Unreachable::BeyondReach { by: 0.25 };
        assert_eq!(
            format!("{far}"),
            "the wrist center is beyond reach by 0.25 m"
        );
    }
}
