//! Scalar math that works with and without `std` (through `libm` when `std` is off).
//!
//! Emitted solvers call these so that the same source compiles in firmware and on a desktop.

/// Square root.
#[inline(always)]
pub fn sqrt(x: f64) -> f64 {
    #[cfg(feature = "std")]
    {
        x.sqrt()
    }
    #[cfg(not(feature = "std"))]
    {
        libm::sqrt(x)
    }
}

/// Four-quadrant arc tangent of `y / x`.
#[inline(always)]
pub fn atan2(y: f64, x: f64) -> f64 {
    #[cfg(feature = "std")]
    {
        y.atan2(x)
    }
    #[cfg(not(feature = "std"))]
    {
        libm::atan2(y, x)
    }
}

/// Sine and cosine of `x`, as `(sin, cos)`.
#[inline(always)]
pub fn sin_cos(x: f64) -> (f64, f64) {
    #[cfg(feature = "std")]
    {
        x.sin_cos()
    }
    #[cfg(not(feature = "std"))]
    {
        libm::sincos(x)
    }
}

/// Sine of `x`.
#[inline(always)]
pub fn sin(x: f64) -> f64 {
    sin_cos(x).0
}

/// Cosine of `x`.
#[inline(always)]
pub fn cos(x: f64) -> f64 {
    sin_cos(x).1
}

/// Absolute value.
#[inline(always)]
pub fn abs(x: f64) -> f64 {
    f64::from_bits(x.to_bits() & !(1u64 << 63))
}

/// Rounds to the nearest integer, halves away from zero.
#[inline(always)]
pub fn round(x: f64) -> f64 {
    #[cfg(feature = "std")]
    {
        x.round()
    }
    #[cfg(not(feature = "std"))]
    {
        libm::round(x)
    }
}

/// `x` limited to `[lo, hi]`; NaN stays NaN.
#[inline(always)]
pub fn clamp(x: f64, lo: f64, hi: f64) -> f64 {
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
pub fn dot(a: &[f64; 3], b: &[f64; 3]) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

/// Cross product of two 3-vectors.
#[inline(always)]
pub fn cross(a: &[f64; 3], b: &[f64; 3]) -> [f64; 3] {
    [
        a[1] * b[2] - a[2] * b[1],
        a[2] * b[0] - a[0] * b[2],
        a[0] * b[1] - a[1] * b[0],
    ]
}

/// `a - b` for 3-vectors.
#[inline(always)]
pub fn sub(a: &[f64; 3], b: &[f64; 3]) -> [f64; 3] {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}

/// `a + b` for 3-vectors.
#[inline(always)]
pub fn add(a: &[f64; 3], b: &[f64; 3]) -> [f64; 3] {
    [a[0] + b[0], a[1] + b[1], a[2] + b[2]]
}

/// `k · a` for a 3-vector.
#[inline(always)]
pub fn scale(a: &[f64; 3], k: f64) -> [f64; 3] {
    [a[0] * k, a[1] * k, a[2] * k]
}

/// Euclidean length of a 3-vector.
#[inline(always)]
pub fn norm(a: &[f64; 3]) -> f64 {
    sqrt(dot(a, a))
}
