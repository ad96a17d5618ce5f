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
        // Dividing by 1000 (exact in decimal) keeps the file's decimal: 380 mm is 0.38 m, not
        // 380 × 0.001 = 0.38000000000000006.
        match self.length {
            LengthUnit::Metre => x,
            LengthUnit::Millimetre => x / 1000.0,
        }
    }
    /// A length in metres, converted to the file's unit.
    pub fn length_from_si(&self, x: f64) -> f64 {
        match self.length {
            LengthUnit::Metre => x,
            LengthUnit::Millimetre => x * 1000.0,
        }
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

/// Rounding noise allowed by [`snap`], in units of the scale: 64 ulps of 1 (about 1.4e-14),
/// more than the few roundings a frame walk, a unit conversion or forward kinematics adds, far
/// below any dimension or tolerance of an arm.
pub const SNAP_ULPS: f64 = 64.0 * f64::EPSILON;

/// `x` as the description meant it: `0` when `|x|` is within [`SNAP_ULPS`] × `scale` of zero
/// (never `-0`), else the shortest decimal of at most 12 significant digits within
/// [`SNAP_ULPS`] × `|x|` of `x` (`0.8500000000000001` → `0.85`, `29.99999999999999` → `30`),
/// else `x` unchanged. `scale` is the size of the quantity: the
/// arm's size for lengths, 1 for direction cosines, a turn for angles.
pub fn snap(x: f64, scale: f64) -> f64 {
    if !x.is_finite() {
        return x;
    }
    let scale = scale.abs();
    if x.abs() <= SNAP_ULPS * scale {
        return 0.0;
    }
    let tolerance = SNAP_ULPS * x.abs();
    for digits in 0..12 {
        let short: f64 = format!("{x:.digits$e}").parse().unwrap_or(x);
        if (short - x).abs() <= tolerance {
            return short + 0.0;
        }
    }
    x + 0.0
}

/// [`snap`] on each component.
pub fn snap3(v: [f64; 3], scale: f64) -> [f64; 3] {
    v.map(|x| snap(x, scale))
}

/// A pose with each rotation entry snapped at scale 1 and each translation component at
/// `length_scale` ([`snap`]).
pub fn snap_pose(pose: &Pose, length_scale: f64) -> Pose {
    Pose {
        rotation: pose.rotation.map(|row| snap3(row, 1.0)),
        translation: snap3(pose.translation, length_scale),
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
    use super::*;

    #[test]
    fn snap_gives_the_decimal_the_file_wrote_and_zero_for_noise() {
        // Values seen in emitted tables and `forward` output before snapping.
        assert_eq!(snap(0.8500000000000001, 1.0), 0.85);
        assert_eq!(snap(0.12000000000000002, 1.0), 0.12);
        assert_eq!(snap(29.99999999999999, 360.0), 30.0);
        assert_eq!(snap(6.123233995736766e-17, 1.0), 0.0);
        assert_eq!(snap(7.041719095097277e-15, 1.463), 0.0);
        assert!(snap(-1e-17, 1.0).is_sign_positive());
        assert!(snap(-0.0, 1.0).is_sign_positive());
        // Real values stay: a cosine, a long decimal from a file, a small length.
        let c = (30f64).to_radians().cos();
        assert_eq!(snap(c, 1.0), c);
        assert_eq!(snap(std::f64::consts::PI, 1.0), std::f64::consts::PI);
        assert_eq!(snap(1e-9, 1.0), 1e-9);
        assert_eq!(snap(-0.21, 1.0), -0.21);
    }

    #[test]
    fn huge_numbers_are_short() {
        assert_eq!(tidy(1e308), "1e308");
        assert_eq!(tidy(-1.234_567_89e20), "-1.23457e20");
        assert_eq!(tidy(1e15), "1e15");
        assert_eq!(tidy(123_456.5), "123456.5");
        assert_eq!(tidy(-0.0), "0");
    }
}
