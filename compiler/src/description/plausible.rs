//! Bounds on the numbers a description may hold, so that a slip such as `1e308` or a length in
//! the wrong unit is an error at its place rather than a model whose arithmetic overflows.
//!
//! No arm is longer than ten kilometres, and no joint offset, angle or limit needs more than
//! a thousand turns; every length and angle of a file, and every joint value given on the
//! command line, must lie within these bounds.

use armforge_runtime::JointKind;

use crate::units::{tidy, AngleUnit, LengthUnit, Units};

/// The largest length (in metres) a description may hold: 10 km.
pub const MAX_LENGTH_M: f64 = 1e4;

/// The largest angle (in turns) a description may hold: 1,000 turns.
pub const MAX_TURNS: f64 = 1000.0;

/// What is implausible about a finite length `x` in `unit`, or `None` when it is within
/// ±[`MAX_LENGTH_M`].
pub fn length_problem(unit: LengthUnit, x: f64) -> Option<String> {
    (x.abs() * unit.metres() > MAX_LENGTH_M).then(|| {
        format!(
            "{} {} is implausible: lengths are at most {} {} (10 km) in size",
            tidy(x),
            unit.symbol(),
            tidy(MAX_LENGTH_M / unit.metres()),
            unit.symbol()
        )
    })
}

/// What is implausible about a finite angle `x` in `unit`, or `None` when it is within
/// ±[`MAX_TURNS`] turns.
pub fn angle_problem(unit: AngleUnit, x: f64) -> Option<String> {
    let turn = 2.0 * core::f64::consts::PI / unit.radians();
    (x.abs() > MAX_TURNS * turn).then(|| {
        format!(
            "{}{} is implausible: angles are at most {}{} ({} turns) in size",
            tidy(x),
            unit.display_symbol(),
            tidy(MAX_TURNS * turn),
            unit.display_symbol(),
            tidy(MAX_TURNS)
        )
    })
}

/// What is wrong with a joint value `x` in the file's units: not a finite number, or beyond
/// the bounds of [`length_problem`] and [`angle_problem`].
pub fn joint_value_problem(units: Units, kind: JointKind, x: f64) -> Option<String> {
    if !x.is_finite() {
        return Some(format!("{x} is not a finite number"));
    }
    match kind {
        JointKind::Revolute => angle_problem(units.angle, x),
        JointKind::Prismatic => length_problem(units.length, x),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bounds_hold_in_every_unit() {
        assert_eq!(length_problem(LengthUnit::Metre, 1e4), None);
        assert_eq!(length_problem(LengthUnit::Millimetre, -1e7), None);
        let m = length_problem(LengthUnit::Millimetre, 1e308).unwrap();
        assert!(m.starts_with("1e308 mm is implausible"), "{m}");
        assert!(m.contains("10000000 mm"), "{m}");
        assert_eq!(angle_problem(AngleUnit::Degree, 360_000.0), None);
        let a = angle_problem(AngleUnit::Degree, 1e308).unwrap();
        assert!(a.starts_with("1e308° is implausible"), "{a}");
        assert!(a.contains("360000°"), "{a}");
        assert!(angle_problem(AngleUnit::Radian, 6284.0).is_some());
        assert_eq!(angle_problem(AngleUnit::Radian, 6283.0), None);
        let units = Units::default();
        assert!(joint_value_problem(units, JointKind::Revolute, f64::NAN).is_some());
        assert!(joint_value_problem(units, JointKind::Prismatic, 2e4).is_some());
        assert_eq!(joint_value_problem(units, JointKind::Prismatic, 2.0), None);
    }
}
