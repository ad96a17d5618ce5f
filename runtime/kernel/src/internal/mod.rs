//! Not for users: the support code that armforge-emitted solvers and the armforge interpreter
//! call. Its items may change in any release; use the emitted module's functions or the
//! compiler's `Solver` instead.
//!
//! Everything that both back ends of a plan need after the closed-form steps lives here, so
//! that no formula is written twice: turning model values into joint values, wrapping revolute
//! values into their limits, listing equivalent angles, dropping candidates outside the limits,
//! returning double roots once, flags, and the reason when nothing is left.

//!
//! By role: this module holds what every back end and every family share (the candidate and
//! check types, the settings, the pose check, the reference inputs, whole-turn wrapping);
//! [`finish`] turns candidates into solutions (limits, equivalent angles, duplicates, flags,
//! the reason when nothing is left); [`labels`] reads a branch label back from joint values.

mod far;
mod finish;
mod free;
mod labels;

pub use far::*;
pub use finish::*;
pub use free::*;
pub use labels::*;

use core::f64::consts::PI;

use crate::math::{abs, cross, dot, rotation_tolerance, round, round_small, sin_cos, Scalar};
use crate::model::Joint;
use crate::pose::Pose;
use crate::solution::{Branch, PoseProblem, Unreachable, JOINTS};

/// What a [`Check`] guards.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum CheckKind {
    /// Unused slot.
    None,
    /// Real when `have_squared ≤ limit²`; otherwise beyond reach by `√have − limit` metres.
    BeyondReach,
    /// Real when `have_squared ≥ limit²`; otherwise inside the hole by `limit − √have` metres.
    InsideHole,
    /// Real when `have_squared ≥ 0` (`γ² |h4 × h5|²` of Paden–Kahan subproblem 2, negative
    /// when the two cones miss each other); `limit` is `h4 · v`, the cosine of the angle
    /// between axis 4 and the requested direction of axis 6 after joints 1–3.
    WristOrientation,
    /// Real when `have_squared ≤ tolerance²`: `have_squared` is the squared distance (m²) by
    /// which the candidate's joints 1–3 miss the wrist-center target (a general arm's quartic
    /// roots: a complex pair yields its real part, which misses); otherwise beyond reach by
    /// `√have` metres. `limit` is unused (zero). Never flags a reach boundary.
    Residual,
}

/// A condition for a candidate to be a real solution.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Check<S: Scalar = f64> {
    /// What is checked.
    pub kind: CheckKind,
    /// The squared quantity (see [`CheckKind`]).
    pub have_squared: S,
    /// Its limit (metres, not squared).
    pub limit: S,
}

impl<S: Scalar> Check<S> {
    /// An unused check.
    pub const NONE: Check<S> = Check {
        kind: CheckKind::None,
        have_squared: S::ZERO,
        limit: S::ZERO,
    };
}

/// One candidate solution straight out of the closed-form steps, in model values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Candidate<S: Scalar = f64> {
    /// Model values (radians or metres) of the six joints.
    pub model_values: [S; JOINTS],
    /// The branch the candidate belongs to.
    pub branch: Branch,
    /// Conditions for the candidate to be real.
    pub checks: [Check<S>; 4],
    /// Joint 5 at the aligned position (joint 4 taken from the reference).
    pub wrist_aligned: bool,
    /// The wrist center on axis 1 (joint 1 taken from the reference).
    pub on_axis_1: bool,
}

/// Tolerances of one arm's solver.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Settings<S: Scalar = f64> {
    /// A target this close to a reach boundary (metres) counts as on it.
    pub length_tolerance: S,
    /// A wrist cone gap this small (radians, squared sine) counts as closed.
    pub angle_tolerance: S,
    /// Joint values this far beyond a limit (radians or metres) still count as within it.
    pub limit_tolerance: S,
    /// Two solutions closer than this in every joint are one.
    pub duplicate_tolerance: S,
    /// `h4 · h5` and `h5 · h6`: the wrist's twist cosines, to say by how much an orientation
    /// misses what the wrist reaches.
    pub wrist_twist_cosines: [S; 2],
}

/// Checks that a target pose is finite with a proper orthonormal rotation (within
/// [`rotation_tolerance`]: 1e-6 for `f64`, about 7.6e-6 for `f32`).
#[inline]
pub fn check_pose<S: Scalar>(target: &Pose<S>) -> Result<(), Unreachable<S>> {
    if !target.is_finite() {
        return Err(Unreachable::InvalidPose(PoseProblem::NotFinite));
    }
    let r = &target.rotation;
    // Entry (i, j) of RᵀR, symmetric: the six on and above the diagonal.
    let g = |i: usize, j: usize| r[0][i] * r[0][j] + r[1][i] * r[1][j] + r[2][i] * r[2][j];
    let error = abs(g(0, 0) - S::ONE)
        .max(abs(g(1, 1) - S::ONE))
        .max(abs(g(2, 2) - S::ONE))
        .max(abs(g(0, 1)))
        .max(abs(g(0, 2)))
        .max(abs(g(1, 2)));
    if error > rotation_tolerance() {
        return Err(Unreachable::InvalidPose(PoseProblem::NotOrthonormal {
            error,
        }));
    }
    let det = dot(&r[0], &cross(&r[1], &r[2]));
    if det < S::ZERO {
        return Err(Unreachable::InvalidPose(PoseProblem::Reflection));
    }
    Ok(())
}

/// The plan's reference inputs for the current joint values: cosine and sine of the model
/// values of joints 1 and 4 (a non-finite value counts as zero).
pub fn reference<S: Scalar>(joints: &[Joint<S>; JOINTS], current: &[S; JOINTS]) -> [S; 4] {
    reference_of(joints, current, [0, 3])
}

/// The plan's reference inputs for the current joint values when the free joints are `free`
/// (0-based): joints 1 and 4 for an arm that decouples at its wrist, others for families that
/// hold other joints at their singularities (a non-finite value counts as zero).
pub fn reference_of<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    current: &[S; JOINTS],
    free: [usize; 2],
) -> [S; 4] {
    let model = |i: usize| {
        let i = i.min(JOINTS - 1);
        match (current.get(i), joints.get(i)) {
            (Some(&q), Some(joint)) => joint.model_value(if q.is_finite() { q } else { S::ZERO }),
            _ => S::ZERO,
        }
    };
    let (s1, c1) = sin_cos(model(free[0]));
    let (s4, c4) = sin_cos(model(free[1]));
    [c1, s1, c4, s4]
}

/// `1 / 2π` in the scalar `S`.
#[inline(always)]
pub(crate) fn inv_tau<S: Scalar>() -> S {
    S::of(1.0 / core::f64::consts::TAU)
}

/// `x` rounded to a whole number: [`round_small`] for a value of magnitude below `0.5 / ε`
/// (a predictable branch), `round` for larger ones.
#[inline(always)]
pub(crate) fn round_fast<S: Scalar>(x: S) -> S {
    if abs(x) < S::of(0.5) / S::EPSILON {
        round_small(x)
    } else {
        round(x)
    }
}

/// `x` wrapped by whole turns into `[center − π, center + π]`, without data-dependent branches.
#[inline]
pub fn wrap<S: Scalar>(x: S, center: S) -> S {
    x - S::TAU * round_fast((x - center) * inv_tau())
}

/// Half a turn, for emitted code that adds it to a model value.
pub const HALF_TURN: f64 = PI;

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn wrap_lands_within_half_a_turn_of_the_center() {
        use core::f64::consts::TAU;
        for k in -5..=5 {
            let x = 0.3 + TAU * k as f64;
            assert!((wrap(x, 0.0) - 0.3).abs() < 1e-12);
        }
        assert!((wrap(3.0 * PI / 2.0, 0.0) + PI / 2.0).abs() < 1e-12);
        let x = 0.3f32 + 3.0 * core::f32::consts::TAU;
        assert!((wrap(x, 0.0f32) - 0.3).abs() < 1e-5);
    }

    #[test]
    fn pose_checks() {
        assert!(check_pose(&Pose::<f64>::IDENTITY).is_ok());
        let mut p = Pose::IDENTITY;
        p.translation[0] = f64::NAN;
        assert_eq!(
            check_pose(&p),
            Err(Unreachable::InvalidPose(PoseProblem::NotFinite))
        );
        let mut p = Pose::IDENTITY;
        p.rotation[2][2] = -1.0;
        assert_eq!(
            check_pose(&p),
            Err(Unreachable::InvalidPose(PoseProblem::Reflection))
        );
        let mut p = Pose::IDENTITY;
        p.rotation[0][1] = 1e-3;
        assert!(matches!(
            check_pose(&p),
            Err(Unreachable::InvalidPose(PoseProblem::NotOrthonormal { .. }))
        ));
    }
}
