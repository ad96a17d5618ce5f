//! The scale bar: a round length in the file's unit, and the grid step that goes with it.

use armforge_compiler::units::{tidy, Units};

/// A scale bar's length in metres and in the file's unit, with its label.
#[derive(Clone, Debug, PartialEq)]
pub struct ScaleBar {
    /// Length in metres.
    pub metres: f64,
    /// Length in the file's length unit.
    pub in_file_unit: f64,
    /// The label, e.g. `200 mm`.
    pub label: String,
}

impl ScaleBar {
    /// The round length (1, 2 or 5 × 10ᵏ in the file's unit) closest to, and not above, a
    /// quarter of `extent_metres` (the widest view): the grid step.
    pub fn for_extent(units: &Units, extent_metres: f64) -> ScaleBar {
        ScaleBar::of(
            units,
            round_length(units.length_from_si(extent_metres / 4.0)),
        )
    }

    /// The smallest round length (1, 2 or 5 × 10ᵏ in the file's unit) of at least
    /// `min_metres`: a bar long enough to read.
    pub fn at_least(units: &Units, min_metres: f64) -> ScaleBar {
        let target = units.length_from_si(min_metres);
        let below = round_length(target);
        let in_file_unit = [1.0, 2.0, 2.5, 5.0]
            .iter()
            .map(|k| below * k)
            .find(|l| *l >= target * (1.0 - 1e-12) && is_round(*l))
            .unwrap_or(below * 5.0);
        ScaleBar::of(units, in_file_unit)
    }

    fn of(units: &Units, in_file_unit: f64) -> ScaleBar {
        ScaleBar {
            metres: units.length_to_si(in_file_unit),
            in_file_unit,
            label: format!("{} {}", tidy(in_file_unit), units.length.symbol()),
        }
    }
}

/// True for 1, 2 or 5 × 10ᵏ.
fn is_round(x: f64) -> bool {
    (round_length(x) - x).abs() <= 1e-9 * x
}

/// The largest of 1, 2, 5 × 10ᵏ that is at most `target` (1 for targets that are not positive
/// and finite).
pub fn round_length(target: f64) -> f64 {
    if !(target.is_finite() && target > 0.0) {
        return 1.0;
    }
    let decade = 10f64.powf(target.log10().floor());
    let mantissa = target / decade;
    // `mantissa` is in [1, 10); a hair of slack keeps exact round targets (e.g. 0.2) on their step.
    let step = if mantissa >= 5.0 - 1e-9 {
        5.0
    } else if mantissa >= 2.0 - 1e-9 {
        2.0
    } else {
        1.0
    };
    step * decade
}

#[cfg(test)]
mod tests {
    use super::*;
    use armforge_compiler::units::{AngleUnit, LengthUnit};

    #[test]
    fn round_lengths_step_through_one_two_five() {
        assert_eq!(round_length(0.9), 0.5);
        assert_eq!(round_length(1.0), 1.0);
        assert_eq!(round_length(4.99), 2.0);
        assert_eq!(round_length(270.0), 200.0);
        assert!((round_length(0.2) - 0.2).abs() < 1e-15);
    }

    #[test]
    fn a_readable_bar_rounds_up() {
        let units = Units::default();
        assert!((ScaleBar::at_least(&units, 0.33).metres - 0.5).abs() < 1e-12);
        assert!((ScaleBar::at_least(&units, 0.2).metres - 0.2).abs() < 1e-12);
        assert!((ScaleBar::at_least(&units, 0.11).metres - 0.2).abs() < 1e-12);
        assert!((ScaleBar::at_least(&units, 0.6).metres - 1.0).abs() < 1e-12);
    }

    #[test]
    fn scale_bar_speaks_the_file_unit() {
        let units = Units {
            length: LengthUnit::Millimetre,
            angle: AngleUnit::Degree,
        };
        let bar = ScaleBar::for_extent(&units, 1.2);
        assert_eq!(bar.label, "200 mm");
        assert!((bar.metres - 0.2).abs() < 1e-12);
    }
}
