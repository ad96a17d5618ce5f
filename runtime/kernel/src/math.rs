//! Scalar math that works with and without `std` (through `libm` when `std` is off), for both
//! scalars a solver can be emitted in: `f64` (the default) and `f32`.
//!
//! Emitted solvers call these free functions so that the same source compiles in firmware and
//! on a desktop, whichever scalar it was emitted for; [`Scalar`] is the small trait behind them.

use core::fmt;
use core::ops::{Add, AddAssign, Div, Mul, MulAssign, Neg, Sub, SubAssign};

mod sealed {
    /// Keeps [`super::Scalar`] to the two scalars armforge emits.
    pub trait Sealed {}
    impl Sealed for f32 {}
    impl Sealed for f64 {}
}

/// A floating-point scalar the runtime's types and emitted solvers can use: `f64` or `f32`.
///
/// Sealed: the runtime's tolerances are worked out for IEEE 754 binary64 and binary32 only.
pub trait Scalar:
    Copy
    + PartialEq
    + PartialOrd
    + Default
    + fmt::Debug
    + fmt::Display
    + fmt::LowerExp
    + Add<Output = Self>
    + Sub<Output = Self>
    + Mul<Output = Self>
    + Div<Output = Self>
    + Neg<Output = Self>
    + AddAssign
    + SubAssign
    + MulAssign
    + Send
    + Sync
    + 'static
    + sealed::Sealed
{
    /// `0`.
    const ZERO: Self;
    /// `1`.
    const ONE: Self;
    /// `π`.
    const PI: Self;
    /// `2π`, one turn.
    const TAU: Self;
    /// Machine epsilon: the difference between 1 and the next larger number.
    const EPSILON: Self;
    /// Not a number.
    const NAN: Self;
    /// Name of the type, `"f64"` or `"f32"`.
    const NAME: &'static str;

    /// The nearest value of this scalar to `x` (exact for `f64`).
    fn of(x: f64) -> Self;
    /// The value as `f64` (exact).
    fn to_f64(self) -> f64;
    /// Square root.
    fn sqrt(self) -> Self;
    /// Real cube root (negative for negative `self`).
    fn cbrt(self) -> Self;
    /// Four-quadrant arc tangent of `self / x`.
    fn atan2(self, x: Self) -> Self;
    /// Sine and cosine, as `(sin, cos)`.
    fn sin_cos(self) -> (Self, Self);
    /// Rounds to the nearest integer, halves away from zero.
    fn round(self) -> Self;
    /// Absolute value (clears the sign bit; NaN stays NaN).
    fn abs(self) -> Self;
    /// True unless NaN or infinite.
    fn is_finite(self) -> bool;
    /// The smaller of two values (the other one when one is NaN).
    fn min(self, other: Self) -> Self;
    /// The larger of two values (the other one when one is NaN).
    fn max(self, other: Self) -> Self;
}

/// Implements [`Scalar`] for one float type with its `libm` functions.
macro_rules! scalar {
    (
        $t:ident,
        $bits:ty,
        $name:literal,
        $sqrt:ident,
        $atan2:ident,
        $sincos:path,
        $round:ident
    ) => {
        impl Scalar for $t {
            const ZERO: Self = 0.0;
            const ONE: Self = 1.0;
            const PI: Self = core::$t::consts::PI;
            const TAU: Self = core::$t::consts::TAU;
            const EPSILON: Self = $t::EPSILON;
            const NAN: Self = $t::NAN;
            const NAME: &'static str = $name;

            #[inline(always)]
            fn of(x: f64) -> Self {
                x as $t
            }
            #[inline(always)]
            fn to_f64(self) -> f64 {
                self as f64
            }
            #[inline(always)]
            fn sqrt(self) -> Self {
                #[cfg(feature = "std")]
                {
                    $t::sqrt(self)
                }
                #[cfg(not(feature = "std"))]
                {
                    libm::$sqrt(self)
                }
            }
            #[inline(always)]
            fn cbrt(self) -> Self {
                cube_root(self as f64) as $t
            }
            // `atan2` (the `libm` crate's) and `sin_cos` (`sin_cos_f64` for `f64`, the `libm`
            // crate's for `f32`) are the same with and without `std`: the solver gives the
            // same bits on a host and on a `no_std` target (tests on the host stand for the
            // firmware), and they take fewer instructions than the platform's (measured with
            // callgrind against glibc on x86-64: `atan2` 117 against 157, `atan2f` 104
            // against 146, `sincos` and `sqrt` together 109 against 139).
            #[inline(always)]
            fn atan2(self, x: Self) -> Self {
                libm::$atan2(self, x)
            }
            #[inline(always)]
            fn sin_cos(self) -> (Self, Self) {
                $sincos(self)
            }
            #[inline(always)]
            fn round(self) -> Self {
                #[cfg(feature = "std")]
                {
                    $t::round(self)
                }
                #[cfg(not(feature = "std"))]
                {
                    libm::$round(self)
                }
            }
            #[inline(always)]
            fn abs(self) -> Self {
                const SIGN: $bits = 1 << (<$bits>::BITS - 1);
                $t::from_bits(self.to_bits() & !SIGN)
            }
            #[inline(always)]
            fn is_finite(self) -> bool {
                $t::is_finite(self)
            }
            #[inline(always)]
            fn min(self, other: Self) -> Self {
                $t::min(self, other)
            }
            #[inline(always)]
            fn max(self, other: Self) -> Self {
                $t::max(self, other)
            }
        }
    };
}

scalar!(f64, u64, "f64", sqrt, atan2, sin_cos_f64, round);
scalar!(f32, u32, "f32", sqrtf, atan2f, libm::sincosf, roundf);

/// How a tolerance grows with the scalar's rounding error (see [`tolerance`]).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Growth {
    /// With the rounding error itself: a value compared with a limit, a squared quantity
    /// compared with zero.
    Linear,
    /// With its square root: where two roots of a quadratic meet, a rounding error `δ` in the
    /// discriminant moves the roots by about `√δ`, so a length at a reach boundary or the
    /// distance between two roots that should be one.
    SquareRoot,
}

/// A tolerance that follows the scalar's epsilon: `f64_value` for `f64`; for another scalar,
/// `f64_value` times the ratio of the epsilons (`2^29` for `f32`) or its square root
/// (`2^14.5 ≈ 23170`), as `growth` says.
///
/// Every solver tolerance is written once, for `f64`; this carries it to `f32`.
#[inline]
pub fn tolerance<S: Scalar>(f64_value: f64, growth: Growth) -> S {
    let ratio = S::EPSILON.to_f64() / f64::EPSILON;
    let factor = match growth {
        Growth::Linear => ratio,
        Growth::SquareRoot => Scalar::sqrt(ratio),
    };
    S::of(f64_value * factor)
}

/// Largest entry of `RᵀR − I` an input rotation may have: `1e-6`, or 64 epsilons of the
/// scalar when that is larger (`f32`: about `7.6e-6`, since a rotation rounded to `f32` and
/// multiplied out already carries errors of a few epsilons).
#[inline]
pub fn rotation_tolerance<S: Scalar>() -> S {
    S::of(1e-6).max(S::of(64.0) * S::EPSILON)
}

/// Square root.
#[inline(always)]
pub fn sqrt<S: Scalar>(x: S) -> S {
    x.sqrt()
}

/// `x` rounded to the nearest whole number (ties to even) with two additions, no call and no
/// branch: adding and subtracting `1.5 / ε` (`1.5 · 2^52` for `f64`, `1.5 · 2^23` for `f32`).
/// Exact for `|x|` below `0.5 / ε`; the caller makes sure it is.
#[inline(always)]
pub(crate) fn round_small<S: Scalar>(x: S) -> S {
    let rounder = S::of(1.5) / S::EPSILON;
    (x + rounder) - rounder
}

/// Sine and cosine of an `f64` in a fixed number of steps (no table): `x` reduced by the
/// nearest multiple `k` of π/2 with π/2 split in three parts (Cody and Waite's reduction,
/// exact for `|x|` below 2^20 · π/2 since the first two parts have 33 bits), then the Taylor
/// series of sine to `r^17` and of cosine to `r^16` on `|r| ≤ π/4` (truncation below 5e-17)
/// by Estrin's scheme, and the quadrant `k mod 4`. Within about one ulp; outside
/// `|x| ≤ 1.6e6` (no joint turns that far) and for NaN it is the `libm` crate's `sincos`. On
/// the bench arm's `forward` (six calls), in back-to-back runs, it took 870 instructions and
/// 85 ns against 932 and 92 ns with the `libm` crate's `sincos`.
#[inline]
pub fn sin_cos_f64(x: f64) -> (f64, f64) {
    // π/2 = P1 + P2 + P3 (fdlibm's split: P1 and P2 have 33 significant bits).
    const P1: f64 = 1.570_796_326_734_125_6;
    const P2: f64 = 6.077_100_506_303_966e-11;
    const P3: f64 = 2.022_266_248_795_950_6e-21;
    const FRAC_2_PI: f64 = core::f64::consts::FRAC_2_PI;
    const LIMIT: f64 = 1.6e6;
    if x.is_nan() || abs(x) > LIMIT {
        return libm::sincos(x);
    }
    let k = round_small(x * FRAC_2_PI);
    let r = ((x - k * P1) - k * P2) - k * P3;
    let z = r * r;
    // 1/n! for odd n (sine) and even n (cosine), alternating in sign, each polynomial in
    // z = r² evaluated by Estrin's scheme (pairs, then z², then z⁴: a short dependency chain).
    let (z2, z4) = (z * z, (z * z) * (z * z));
    let estrin = |c: [f64; 8]| {
        let p01 = c[0] + c[1] * z;
        let p23 = c[2] + c[3] * z;
        let p45 = c[4] + c[5] * z;
        let p67 = c[6] + c[7] * z;
        (p01 + p23 * z2) + (p45 + p67 * z2) * z4
    };
    let sine = r + r
        * z
        * estrin([
            -1.666_666_666_666_666_6e-1,
            8.333_333_333_333_333e-3,
            -1.984_126_984_126_984e-4,
            2.755_731_922_398_589_3e-6,
            -2.505_210_838_544_172e-8,
            1.605_904_383_682_161_3e-10,
            -7.647_163_731_819_816e-13,
            2.811_457_254_345_520_6e-15,
        ]);
    let cosine = 1.0
        + z * estrin([
            -0.5,
            4.166_666_666_666_666_4e-2,
            -1.388_888_888_888_889e-3,
            2.480_158_730_158_73e-5,
            -2.755_731_922_398_589e-7,
            2.087_675_698_786_81e-9,
            -1.147_074_559_772_972_5e-11,
            4.779_477_332_387_385e-14,
        ]);
    // The quadrant `q = k mod 4` picks (sin, cos) = (s, c), (c, −s), (−s, −c) or (−c, s),
    // through the bits (no branch for a predictor to miss on angles of any quadrant): an odd
    // quadrant swaps the two, quadrants 2–3 negate the sine, quadrants 1–2 the cosine.
    let q = (k as i64) as u64;
    let swap = 0u64.wrapping_sub(q & 1);
    let (s, c) = (sine.to_bits(), cosine.to_bits());
    let sine_bits = (c & swap) | (s & !swap);
    let cosine_bits = (s & swap) | (c & !swap);
    (
        f64::from_bits(sine_bits ^ ((q & 2) << 62)),
        f64::from_bits(cosine_bits ^ ((q.wrapping_add(1) & 2) << 62)),
    )
}

/// The real cube root of an `f64` in a fixed number of steps, with no table and no call
/// (the `libm` crate's `cbrt` indexes tables, which the no-panic proof cannot clear): the
/// exponent divided by three through the bits (Kahan's seed, within about 4 %), then three
/// Halley steps `y ← y (y³ + 2a) / (2y³ + a)`, each tripling the correct digits (4.5 → 13
/// → 40 → all 53 bits, Halley's method: Press et al., Numerical Recipes, 3rd ed., §9.4,
/// from memory). Within a few ulps; `±0`, `±∞` and NaN return themselves.
#[inline]
pub fn cube_root(x: f64) -> f64 {
    if x == 0.0 || !x.is_finite() {
        return x;
    }
    let magnitude = f64::from_bits(x.to_bits() & !(1u64 << 63));
    // A subnormal is scaled by 2^54 first (its cube root then by 2^-18).
    let subnormal = magnitude < f64::MIN_POSITIVE;
    let a = if subnormal {
        magnitude * 18_014_398_509_481_984.0
    } else {
        magnitude
    };
    // Bits / 3 plus a third of the bias (1023 · 2^52 · 2/3, adjusted): within ~4 %.
    const THIRD_OF_BIAS: u64 = 0x2A9F_7893_782D_A1CE;
    let mut y = f64::from_bits(a.to_bits() / 3 + THIRD_OF_BIAS);
    for _ in 0..3 {
        let y3 = y * y * y;
        y *= (y3 + 2.0 * a) / (2.0 * y3 + a);
    }
    if subnormal {
        y *= 1.0 / 262_144.0;
    }
    if x < 0.0 {
        -y
    } else {
        y
    }
}

/// Real cube root (`cbrt(−8) = −2`).
#[inline(always)]
pub fn cbrt<S: Scalar>(x: S) -> S {
    x.cbrt()
}

/// Four-quadrant arc tangent of `y / x`.
#[inline(always)]
pub fn atan2<S: Scalar>(y: S, x: S) -> S {
    y.atan2(x)
}

/// Sine and cosine of `x`, as `(sin, cos)`.
#[inline(always)]
pub fn sin_cos<S: Scalar>(x: S) -> (S, S) {
    x.sin_cos()
}

/// Sine of `x`.
#[inline(always)]
pub fn sin<S: Scalar>(x: S) -> S {
    x.sin_cos().0
}

/// Cosine of `x`.
#[inline(always)]
pub fn cos<S: Scalar>(x: S) -> S {
    x.sin_cos().1
}

/// Absolute value.
#[inline(always)]
pub fn abs<S: Scalar>(x: S) -> S {
    x.abs()
}

/// Rounds to the nearest integer, halves away from zero.
#[inline(always)]
pub fn round<S: Scalar>(x: S) -> S {
    x.round()
}

/// `x` limited to `[lo, hi]`; NaN stays NaN.
#[inline(always)]
pub fn clamp<S: Scalar>(x: S, lo: S, hi: S) -> S {
    if x < lo {
        lo
    } else if x > hi {
        hi
    } else {
        x
    }
}

/// Dot product of two 3-vectors.
#[inline(always)]
pub fn dot<S: Scalar>(a: &[S; 3], b: &[S; 3]) -> S {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

/// Cross product of two 3-vectors.
#[inline(always)]
pub fn cross<S: Scalar>(a: &[S; 3], b: &[S; 3]) -> [S; 3] {
    [
        a[1] * b[2] - a[2] * b[1],
        a[2] * b[0] - a[0] * b[2],
        a[0] * b[1] - a[1] * b[0],
    ]
}

/// `a - b` for 3-vectors.
#[inline(always)]
pub fn sub<S: Scalar>(a: &[S; 3], b: &[S; 3]) -> [S; 3] {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}

/// `a + b` for 3-vectors.
#[inline(always)]
pub fn add<S: Scalar>(a: &[S; 3], b: &[S; 3]) -> [S; 3] {
    [a[0] + b[0], a[1] + b[1], a[2] + b[2]]
}

/// `k · a` for a 3-vector.
#[inline(always)]
pub fn scale<S: Scalar>(a: &[S; 3], k: S) -> [S; 3] {
    [a[0] * k, a[1] * k, a[2] * k]
}

/// Euclidean length of a 3-vector.
#[inline(always)]
pub fn norm<S: Scalar>(a: &[S; 3]) -> S {
    sqrt(dot(a, a))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn both_scalars_agree_with_known_values() {
        // sin(π/6) = 1/2, atan2(1, 1) = π/4, √2 (textbook values).
        let (s, c) = sin_cos(core::f64::consts::FRAC_PI_6);
        assert!((s - 0.5).abs() < 1e-15 && (c - 0.75f64.sqrt()).abs() < 1e-15);
        let (s, _) = sin_cos(core::f32::consts::FRAC_PI_6);
        assert!((s - 0.5).abs() < 1e-6);
        assert!((atan2(1.0f32, 1.0) - core::f32::consts::FRAC_PI_4).abs() < 1e-6);
        assert_eq!(sqrt(2.0f32), core::f32::consts::SQRT_2);
        assert_eq!(abs(-0.0f32).to_bits(), 0);
        assert_eq!(abs(-2.5f64), 2.5);
    }

    #[test]
    fn cube_root_is_within_a_few_ulps_everywhere() {
        // Exact cubes (textbook values), then the platform's `cbrt` (IEEE 754 double, a
        // reference outside this crate) over normal and subnormal magnitudes of both signs.
        assert_eq!(cube_root(-8.0), -2.0);
        assert_eq!(cube_root(27.0), 3.0);
        assert_eq!(cube_root(0.001), 0.1);
        assert_eq!(cube_root(-0.0).to_bits(), (-0.0f64).to_bits());
        assert!(cube_root(f64::NAN).is_nan());
        assert_eq!(cube_root(f64::NEG_INFINITY), f64::NEG_INFINITY);
        let mut worst = 0.0f64;
        let mut x = 1e-310f64;
        while x < 1e300 {
            for v in [x, -x, x * 1.37, x * 2.9] {
                let want = f64::cbrt(v);
                worst = worst.max(((cube_root(v) - want) / want).abs());
            }
            x *= 1.9;
        }
        assert!(worst <= 4.0 * f64::EPSILON, "relative error {worst:e}");
        assert!((cbrt(-3.375f32) + 1.5).abs() <= f32::EPSILON);
    }

    #[test]
    fn sine_and_cosine_are_within_an_ulp_or_two_of_the_platform() {
        // The platform's `sin` and `cos` (IEEE 754 double, a reference outside this crate),
        // densely over ±40 rad (every joint angle), then out to the reduction's limit and
        // beyond (the `libm` crate there).
        let (s, c) = sin_cos_f64(core::f64::consts::FRAC_PI_6);
        assert!((s - 0.5).abs() <= f64::EPSILON && (c - 0.75f64.sqrt()).abs() <= f64::EPSILON);
        assert_eq!(sin_cos_f64(0.0), (0.0, 1.0));
        assert!(sin_cos_f64(f64::NAN).0.is_nan());
        let mut worst = 0.0f64;
        let mut check = |x: f64| {
            let (s, c) = sin_cos_f64(x);
            worst = worst.max((s - x.sin()).abs()).max((c - x.cos()).abs());
        };
        for i in -400_000..=400_000 {
            check(f64::from(i) * 1e-4 + 1.234_567e-9);
        }
        let mut x = 40.0;
        while x < 1e8 {
            check(x);
            check(-x * 1.000_1);
            x *= 1.37;
        }
        assert!(worst <= 2.5e-16, "absolute error {worst:e}");
    }

    #[test]
    fn tolerances_follow_the_epsilon() {
        assert_eq!(tolerance::<f64>(1e-12, Growth::Linear), 1e-12);
        assert_eq!(tolerance::<f64>(1e-10, Growth::SquareRoot), 1e-10);
        // f32 has 24 significand bits, f64 53 (IEEE 754): the epsilons differ by 2^29.
        let linear: f32 = tolerance(1e-12, Growth::Linear);
        assert!((linear as f64 / 1e-12 / 536_870_912.0 - 1.0).abs() < 1e-6);
        let root: f32 = tolerance(1e-10, Growth::SquareRoot);
        assert!((root as f64 / 1e-10 / 23_170.475 - 1.0).abs() < 1e-6);
        assert_eq!(rotation_tolerance::<f64>(), 1e-6);
        assert_eq!(rotation_tolerance::<f32>(), 64.0 * f32::EPSILON);
    }
}
