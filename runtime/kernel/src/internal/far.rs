//! Targets too far away to square: a translation beyond [`FAR`] metres is solved at [`FAR`]
//! along the same ray from the world origin, and the lengths of the reason scaled back.
//!
//! The plans square translations (distances to axes, reach checks), which overflows beyond
//! about 1e154 m and turns every reason into nonsense. No arm reaches anywhere near [`FAR`]
//! (1e100 m), so there the answer no longer depends on the arm's own lengths: a target
//! `D` metres out misses by `D / FAR` times what the same direction misses by at `FAR`
//! (beyond reach, or a slide's limit), to within `size / FAR` relative: far below rounding.
//! Revolute misses (the wrist's orientation, an angle) do not grow with the distance and are
//! kept.

use crate::math::{abs, sqrt, Scalar};
use crate::model::{Joint, JointKind};
use crate::pose::Pose;
use crate::solution::{Unreachable, JOINTS};

/// The largest translation component (metres) solved as given: the squares and products of
/// the plans stay far inside `f64` (about 1e200 at most).
pub const FAR: f64 = 1e100;

/// [`FAR`] for `f32`: 1e15 m, so that squares (1e30) and their products with the arm's
/// lengths stay inside `f32` (about 3.4e38).
pub const FAR_F32: f64 = 1e15;

/// The far limit in the scalar `S`.
#[inline(always)]
fn far<S: Scalar>() -> S {
    if S::EPSILON.to_f64() > 1e-10 {
        S::of(FAR_F32)
    } else {
        S::of(FAR)
    }
}

/// A far target brought in to [`FAR`], and by how much its distance was divided.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FarTarget<S: Scalar = f64> {
    /// The target at distance `FAR`-ish along the same ray (same rotation).
    pub target: Pose<S>,
    /// The true distance divided by the brought-in one (> 1).
    pub scale: S,
}

/// `Some` when the target's translation has a component beyond [`FAR`] (a finite target is
/// assumed: [`super::check_pose`] runs first).
#[inline]
pub fn far_target<S: Scalar>(target: &Pose<S>) -> Option<FarTarget<S>> {
    let t = &target.translation;
    let m = abs(t[0]).max(abs(t[1])).max(abs(t[2]));
    if m <= far() || !m.is_finite() {
        return None;
    }
    // Divided by the largest component first, so that nothing overflows.
    let u = [t[0] / m, t[1] / m, t[2] / m];
    let n = sqrt(u[0] * u[0] + u[1] * u[1] + u[2] * u[2]);
    let k = far::<S>() / n;
    let mut near = *target;
    near.translation = [u[0] * k, u[1] * k, u[2] * k];
    Some(FarTarget {
        target: near,
        scale: (m / far()) * n,
    })
}

/// The reason for the brought-in target, its lengths scaled back to the true distance.
#[inline]
pub fn scale_reason<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    reason: Unreachable<S>,
    scale: S,
) -> Unreachable<S> {
    match reason {
        Unreachable::BeyondReach { by } => Unreachable::BeyondReach { by: by * scale },
        Unreachable::InsideHole { by } => Unreachable::InsideHole { by: by * scale },
        Unreachable::OutsideLimits { joint, by }
            if joints
                .get(joint)
                .is_some_and(|j| j.kind == JointKind::Prismatic) =>
        {
            Unreachable::OutsideLimits {
                joint,
                by: by * scale,
            }
        }
        other => other,
    }
}
