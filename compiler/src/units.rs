//! The units a description file speaks, and conversion to and from SI (metres, radians).

use armforge_runtime::{JointKind, Pose};

/// Length unit of a description file.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum LengthUnit {
    /// Metres.
    Metre,
    /// Millimetres.
    Millimetre,
}

/// Angle unit of a description file.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum AngleUnit {
    /// Radians.
    Radian,
    /// Degrees.
    Degree,
}

/// The units of one description file.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Units {
    /// Unit of every length in the file.
    pub length: LengthUnit,
    /// Unit of every angle in the file.
    pub angle: AngleUnit,
}

impl Default for Units {
    fn default() -> Self {
        Units {
            length: LengthUnit::Metre,
            angle: AngleUnit::Radian,
        }
    }
}

impl LengthUnit {
    /// Metres per unit.
    pub fn metres(self) -> f64 {
        match self {
            LengthUnit::Metre => 1.0,
            LengthUnit::Millimetre => 1e-3,
        }
    }
    /// The symbol used in files and messages (`m`, `mm`).
    pub fn symbol(self) -> &'static str {
        match self {
            LengthUnit::Metre => "m",
            LengthUnit::Millimetre => "mm",
        }
    }
}

impl AngleUnit {
    /// Radians per unit.
    pub fn radians(self) -> f64 {
        match self {
            AngleUnit::Radian => 1.0,
            AngleUnit::Degree => core::f64::consts::PI / 180.0,
        }
    }
    /// The symbol used in files (`rad`, `deg`).
    pub fn symbol(self) -> &'static str {
        match self {
            AngleUnit::Radian => "rad",
            AngleUnit::Degree => "deg",
        }
    }
    /// The symbol used in messages (`rad`, `°`).
    pub fn display_symbol(self) -> &'static str {
        match self {
            AngleUnit::Radian => " rad",
            AngleUnit::Degree => "°",
        }
    }
}

impl Units {
    /// A length in the file's unit, converted to metres.
    pub fn length_to_si(&self, x: f64) -> f64 {
        x * self.length.metres()
    }
    /// A length in metres, converted to the file's unit.
    pub fn length_from_si(&self, x: f64) -> f64 {
        x / self.length.metres()
    }
    /// An angle in the file's unit, converted to radians.
    pub fn angle_to_si(&self, x: f64) -> f64 {
        x * self.angle.radians()
    }
    /// An angle in radians, converted to the file's unit.
    pub fn angle_from_si(&self, x: f64) -> f64 {
        x / self.angle.radians()
    }
    /// A joint value in the file's unit (angle or length by the joint's kind), to SI.
    pub fn joint_to_si(&self, kind: JointKind, x: f64) -> f64 {
        match kind {
            JointKind::Revolute => self.angle_to_si(x),
            JointKind::Prismatic => self.length_to_si(x),
        }
    }
    /// A joint value in SI, converted to the file's unit.
    pub fn joint_from_si(&self, kind: JointKind, x: f64) -> f64 {
        match kind {
            JointKind::Revolute => self.angle_from_si(x),
            JointKind::Prismatic => self.length_from_si(x),
        }
    }
    /// A pose with its translation in metres, converted to the file's length unit.
    pub fn pose_from_si(&self, pose: &Pose) -> Pose {
        Pose {
            rotation: pose.rotation,
            translation: pose.translation.map(|x| self.length_from_si(x)),
        }
    }
    /// A pose with its translation in the file's length unit, converted to metres.
    pub fn pose_to_si(&self, pose: &Pose) -> Pose {
        Pose {
            rotation: pose.rotation,
            translation: pose.translation.map(|x| self.length_to_si(x)),
        }
    }
    /// A length in metres written in the file's unit with its symbol, e.g. `20.0 mm`.
    pub fn show_length(&self, metres: f64) -> String {
        format!(
            "{} {}",
            crate::units::tidy(self.length_from_si(metres)),
            self.length.symbol()
        )
    }
    /// An angle in radians written in the file's unit with its symbol, e.g. `90°`.
    pub fn show_angle(&self, radians: f64) -> String {
        format!(
            "{}{}",
            crate::units::tidy(self.angle_from_si(radians)),
            self.angle.display_symbol()
        )
    }
}

/// A number printed for people: up to six significant decimals, no trailing zeros, no `-0`;
/// from 1e15 on in scientific notation with up to six significant digits (`1e308`, not 309
/// digits).
pub fn tidy(x: f64) -> String {
    if !x.is_finite() {
        return format!("{x}");
    }
    if x.abs() >= 1e15 {
        return scientific(x);
    }
    let s = format!("{:.6}", x);
    let s = s.trim_end_matches('0').trim_end_matches('.').to_string();
    if s == "-0" {
        "0".to_string()
    } else {
        s
    }
}

/// `x` as `1.23457e20`: six significant digits at most, no trailing zeros.
fn scientific(x: f64) -> String {
    let s = format!("{x:.5e}");
    let (mantissa, exponent) = s.split_once('e').unwrap_or((&s, "0"));
    let mantissa = mantissa.trim_end_matches('0').trim_end_matches('.');
    format!("{mantissa}e{exponent}")
}

#[cfg(test)]
mod tests {
    use super::tidy;

    #[test]
    fn huge_numbers_are_short() {
        assert_eq!(tidy(1e308), "1e308");
        assert_eq!(tidy(-1.234_567_89e20), "-1.23457e20");
        assert_eq!(tidy(1e15), "1e15");
        assert_eq!(tidy(123_456.5), "123456.5");
        assert_eq!(tidy(-0.0), "0");
    }
}
