//! The free joint 1 on axis 1, chosen so that joint 5 fits its limits.
//!
//! With the wrist center on axis 1, joint 1 does not move it, and the plan holds joint 1 at a
//! reference. Joint 1 still turns the orientation the wrist must make, so at the reference
//! joint 5 can fall outside its limits although another value of joint 1 keeps it inside.
//! Choosing that value is a one-dimensional interval problem with a closed form:
//!
//! * With `R456 = (R1(m) R2 R3)ᵀ G` the wrist's rotation for joint 1's model value `m`, each
//!   wrist joint reaching one of its limits is one condition `A + B cos m + C sin m = e`
//!   (Rodrigues), with at most two roots `m = μ ± acos((e − A) / ρ)`, `ρ = √(B² + C²)`
//!   ([`joint_1_tries`] lists the conditions). Between consecutive roots no wrist joint crosses
//!   a limit, so the values of joint 1 that keep the wrist inside form arcs whose ends are
//!   among those roots and joint 1's own limits.
//! * The ends, each moved 1e-9 rad to either side, are tried nearest the held value first: the
//!   plan is evaluated again with that value as joint 1's reference, and the first one whose
//!   candidate is within every limit is taken. At most [`TRIES`] evaluations, in the rare
//!   path only.
//!
//! Only candidates that are on axis 1 and outside the limits are moved, so `solve` costs
//! nothing more away from axis 1. The interpreter and every emitted module call this one
//! function.

use super::{wrap, Candidate, Settings};
use crate::fk::joint_motion;
use crate::math::{abs, atan2, clamp, cos, cross, dot, sin, sqrt, Scalar};
use crate::model::{Joint, JointKind};
use crate::pose::Pose;
use crate::solution::JOINTS;

/// Arc ends are moved this far (radians) inside the arcs, so that joint 5 lands within its
/// limits despite rounding: 1e-9 for `S`, 64 epsilons for `f32` (about 7.6e-6).
#[inline(always)]
fn inside<S: Scalar>() -> S {
    S::of(1e-9).max(S::of(64.0) * S::EPSILON)
}

/// `acos` through `atan2`, argument clamped to `[−1, 1]`.
fn acos<S: Scalar>(x: S) -> S {
    let x = clamp(x, -S::ONE, S::ONE);
    atan2(sqrt((S::ONE - x) * (S::ONE + x)), x)
}

/// A revolute joint's limits as model values `[lo, hi]`, or `None` when it turns a whole turn
/// or more (or is a slide).
fn model_range<S: Scalar>(joint: &Joint<S>) -> Option<[S; 2]> {
    let [lo, hi] = joint.limits;
    if joint.kind != JointKind::Revolute || !(lo.is_finite() && hi.is_finite()) || hi - lo >= S::TAU
    {
        return None;
    }
    let (a, b) = (joint.model_value(lo), joint.model_value(hi));
    Some([a.min(b), a.max(b)])
}

/// True when the model value `m` is within `range` (by whole turns).
fn within<S: Scalar>(m: S, [lo, hi]: [S; 2], tol: S) -> bool {
    let v = wrap(m, S::of(0.5) * (lo + hi));
    v >= lo - tol && v <= hi + tol
}

/// The interval of `k = h4 · R5(θ5) h6` over joint 5's limits, or `None` when joint 5 turns a
/// whole turn or more (every `k` the wrist makes is within its limits).
pub fn joint_5_interval<S: Scalar>(joints: &[Joint<S>; JOINTS]) -> Option<[S; 2]> {
    let [mlo, mhi] = model_range(&joints[4])?;
    let (h4, h5, h6) = (&joints[3].axis, &joints[4].axis, &joints[5].axis);
    let p = dot(h4, h5) * dot(h6, h5);
    let q = dot(h4, h6) - p;
    let r = dot(h4, &cross(h5, h6));
    let k = |m: S| p + q * cos(m) + r * sin(m);
    let (rho, mu) = (sqrt(q * q + r * r), atan2(r, q));
    let mut low = k(mlo).min(k(mhi));
    let mut high = k(mlo).max(k(mhi));
    if within(mu, [mlo, mhi], S::ZERO) {
        high = p + rho;
    }
    if within(mu + S::PI, [mlo, mhi], S::ZERO) {
        low = p - rho;
    }
    Some([low, high])
}

/// The most values of joint 1 tried for one candidate: for each of joints 4, 5 and 6, two
/// limits, two roots each, one on either side of each root; and joint 1's own two limits.
pub const TRIES: usize = 3 * 2 * 2 * 2 + 2;

/// `A + B cos m + C sin m = e`: the roots `m = μ ± acos((e − A) / ρ)` (none when out of range).
fn roots<S: Scalar>([a, b, c]: [S; 3], e: S) -> Option<[S; 2]> {
    let rho = sqrt(b * b + c * c);
    if rho <= S::of(1e-12).max(S::of(64.0) * S::EPSILON) || !rho.is_finite() {
        return None;
    }
    let x = (e - a) / rho;
    if !(x >= -S::ONE && x <= S::ONE) {
        return None;
    }
    let mu = atan2(c, b);
    let alpha = acos(x);
    Some([mu + alpha, mu - alpha])
}

/// The coefficients of `x · v(m) = A + B cos m + C sin m`, where `v(m) = (R1(m) R2 R3)ᵀ y` for
/// a base-frame direction `y`, `u = R2 R3 x` and `h1` axis 1 (Rodrigues):
/// `A = (u·h1)(y·h1)`, `B = u·y − A`, `C = −h1·(y × u)`.
fn coefficients<S: Scalar>(h1: &[S; 3], u: &[S; 3], y: &[S; 3]) -> [S; 3] {
    let a = dot(u, h1) * dot(y, h1);
    [a, dot(u, y) - a, -dot(h1, &cross(y, u))]
}

/// The values of joint 1 (model values) at which one of joints 4, 5 and 6 reaches one of its
/// limits, each moved 1e-9 rad to either side, and joint 1's own limits moved inside: every
/// end of the arcs on which the wrist fits its limits. Sorted by their distance from `held`;
/// returns how many there are.
///
/// With `R456 = (R1(m) R2 R3)ᵀ G`, `G = rot(B⁻¹ T M⁻¹)`, each limit is one linear condition:
/// joint 5 at a limit fixes `h4 · R456 h6 = k` (the ends of [`joint_5_interval`]); joint 4
/// at `L` puts `R456 h6` on the cone about `R4(L) h5` with `R4(L) h5 · R456 h6 = h5 · h6`;
/// joint 6 at `L` puts `R456ᵀ h4` on the cone about `R6(L)ᵀ h5`, i.e.
/// `u · R1(m)ᵀ (G R6(L)ᵀ h5) = h4 · h5` with `u = R2 R3 h4`. Each is
/// `A + B cos m + C sin m = e`, with up to two roots.
fn joint_1_tries<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    to_base: &impl Fn(&[S; 3]) -> [S; 3],
    m2: S,
    m3: S,
    held: S,
) -> ([S; TRIES], usize) {
    let e2 = joint_motion(&joints[1], joints[1].joint_value(m2));
    let e3 = joint_motion(&joints[2], joints[2].joint_value(m3));
    let forward = |x: &[S; 3]| e2.rotate(&e3.rotate(x));
    let h1 = &joints[0].axis;
    let (h4, h5, h6) = (&joints[3].axis, &joints[4].axis, &joints[5].axis);
    let u4 = forward(h4);
    let g6 = to_base(h6);
    let mut tries = [S::NAN; TRIES];
    let mut n = 0;
    let mut push = |m: S, tries: &mut [S; TRIES]| {
        if let Some(slot) = tries.get_mut(n) {
            *slot = m;
            n += 1;
        }
    };
    let mut both_sides = |r: Option<[S; 2]>, tries: &mut [S; TRIES]| {
        for m in r.into_iter().flatten() {
            push(m + inside(), tries);
            push(m - inside(), tries);
        }
    };
    if let Some([k_lo, k_hi]) = joint_5_interval(joints) {
        let k = coefficients(h1, &u4, &g6);
        both_sides(roots(k, k_lo), &mut tries);
        both_sides(roots(k, k_hi), &mut tries);
    }
    if let Some(range) = model_range(&joints[3]) {
        for limit in range {
            let axis = joint_motion(&joints[3], joints[3].joint_value(limit)).rotate(h5);
            let k = coefficients(h1, &forward(&axis), &g6);
            both_sides(roots(k, dot(h5, h6)), &mut tries);
        }
    }
    if let Some(range) = model_range(&joints[5]) {
        for limit in range {
            let axis = joint_motion(&joints[5], joints[5].joint_value(limit)).rotate_back(h5);
            let k = coefficients(h1, &u4, &to_base(&axis));
            both_sides(roots(k, dot(h4, h5)), &mut tries);
        }
    }
    if let Some([lo, hi]) = model_range(&joints[0]) {
        push(lo + inside(), &mut tries);
        push(hi - inside(), &mut tries);
    }
    // Nearest `held` first: a bubble sort over all TRIES slots with fixed loop bounds (no
    // data-dependent loop, every index provably in range, so no panic path). Unused slots
    // are NaN at the end; a comparison with NaN is false, so they never move forward.
    let mut distance = [S::NAN; TRIES];
    for (d, m) in distance.iter_mut().zip(tries.iter()) {
        *d = abs(wrap(*m - held, S::ZERO));
    }
    for pass in 0..TRIES {
        for j in (pass + 1..TRIES).rev() {
            if distance[j] < distance[j - 1] {
                distance.swap(j, j - 1);
                tries.swap(j, j - 1);
            }
        }
    }
    (tries, n)
}

/// True when a candidate passes its checks but some joint is outside its limits.
fn outside_limits<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    c: &Candidate<S>,
) -> bool {
    super::finish_one(joints, settings, c, &super::centers(joints)).is_err()
}

/// Moves joint 1 of every candidate that is on axis 1 and outside the limits to the value
/// nearest its held one for which joint 5 fits its limits (see the module documentation).
/// `rerun(reference, i)` evaluates the plan again with other reference inputs and returns
/// candidate `i`; `reference` is the one `candidates` were evaluated with.
///
/// A rare path: it does nothing unless a candidate is on axis 1 and outside the limits.
#[inline(never)]
pub fn free_joint_1<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    frames: [&Pose<S>; 2],
    settings: &Settings<S>,
    target: &Pose<S>,
    reference: &[S; 4],
    candidates: &mut [Candidate<S>],
    mut rerun: impl FnMut(&[S; 4], usize) -> Option<Candidate<S>>,
) {
    if joints[0].kind != JointKind::Revolute {
        return;
    }
    let [base, tool] = frames;
    // rot(B⁻¹ T M⁻¹): where the target sends a direction of the arm at zero, base frame.
    let to_base = |x: &[S; 3]| base.rotate_back(&target.rotate(&tool.rotate_back(x)));
    let held_reference = atan2(reference[1], reference[0]);
    for (i, c) in candidates.iter_mut().enumerate() {
        if !c.on_axis_1 || !outside_limits(joints, settings, c) {
            continue;
        }
        let held = c.model_values[0];
        let (tries, n) =
            joint_1_tries(joints, &to_base, c.model_values[1], c.model_values[2], held);
        for &m1 in tries.iter().take(n) {
            if !model_range(&joints[0]).map_or(true, |r| within(m1, r, S::ZERO)) {
                continue;
            }
            // The candidate's joint 1 is the reference or a fixed turn from it (half a turn
            // for the other shoulder solution): keep that turn.
            let angle = m1 - (held - held_reference);
            let mut moved = *reference;
            moved[0] = cos(angle);
            moved[1] = sin(angle);
            if let Some(again) = rerun(&moved, i) {
                if again.on_axis_1 && !outside_limits(joints, settings, &again) {
                    *c = again;
                    break;
                }
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn revolute(axis: [f64; 3], limits_deg: [f64; 2]) -> Joint {
        Joint {
            kind: JointKind::Revolute,
            axis,
            point: [0.0; 3],
            direction: 1.0,
            offset: 0.0,
            limits: limits_deg.map(f64::to_radians),
        }
    }

    fn wrist(limits_5: [f64; 2]) -> [Joint; JOINTS] {
        // A wrist with axes 4 and 6 along z and axis 5 along y at zero: turning joint 5 by θ
        // turns z into z cos θ + x sin θ, so h4 · R5 h6 = cos θ (Rodrigues' formula).
        let z = [0.0, 0.0, 1.0];
        [
            revolute(z, [-180.0, 180.0]),
            revolute([0.0, 1.0, 0.0], [-180.0, 180.0]),
            revolute([0.0, 1.0, 0.0], [-180.0, 180.0]),
            revolute(z, [-180.0, 180.0]),
            revolute([0.0, 1.0, 0.0], limits_5),
            revolute(z, [-180.0, 180.0]),
        ]
    }

    #[test]
    fn joint_5_interval_is_the_range_of_the_cosine() {
        let close =
            |a: [f64; 2], b: [f64; 2]| (a[0] - b[0]).abs() < 1e-12 && (a[1] - b[1]).abs() < 1e-12;
        // ±120°: cos covers [cos 120°, 1] = [−0.5, 1] (the maximum at 0 is inside).
        let k = joint_5_interval(&wrist([-120.0, 120.0])).unwrap_or([f64::NAN; 2]);
        assert!(close(k, [-0.5, 1.0]), "{k:?}");
        // 30° to 60°: cos is monotone there, [cos 60°, cos 30°].
        let k = joint_5_interval(&wrist([30.0, 60.0])).unwrap_or([f64::NAN; 2]);
        assert!(close(k, [0.5, 0.75_f64.sqrt()]), "{k:?}");
        // 150° to 200°: the minimum −1 at 180° is inside.
        let k = joint_5_interval(&wrist([150.0, 200.0])).unwrap_or([f64::NAN; 2]);
        assert!(close(k, [-1.0, -(0.75_f64.sqrt())]), "{k:?}");
        // A whole turn: joint 5 reaches every k.
        assert!(joint_5_interval(&wrist([-180.0, 180.0])).is_none());
    }

    #[test]
    fn the_ends_where_joint_5_reaches_a_limit_are_tried_nearest_first() {
        // Axis 1 along z; joint 2 (about y) at 90° turns axis 4 (z) into x, so
        // h4 · v(m) = x · R1(m)ᵀ g = cos(m − μ) for a horizontal g at angle μ (joint 6 and
        // joint 4 turn whole turns: no conditions from them). With μ = 170° and joint 5 within
        // ±120° (k ≥ cos 120° = −0.5), the ends are m = 170° ± 120°: 50° and 290°, each 1e-9
        // rad to either side; nearest the held 0 first: 50° and the wrapped 290° = −70°.
        let joints = wrist([-120.0, 120.0]);
        let mu = 170_f64.to_radians();
        let g = [mu.cos(), mu.sin(), 0.0];
        let to_base = |x: &[f64; 3]| {
            // The target sends h6 (z) to g; only h6 matters for joint 5.
            if x[2] > 0.5 {
                g
            } else {
                *x
            }
        };
        let (tries, n) = joint_1_tries(&joints, &to_base, core::f64::consts::FRAC_PI_2, 0.0, 0.0);
        assert_eq!(n, 4, "{tries:?}");
        let deg = |m: f64| wrap(m, 0.0).to_degrees();
        assert!((deg(tries[0]) - 50.0).abs() < 1e-6, "{}", deg(tries[0]));
        assert!((deg(tries[1]) - 50.0).abs() < 1e-6, "{}", deg(tries[1]));
        assert!((deg(tries[2]) + 70.0).abs() < 1e-6, "{}", deg(tries[2]));
        assert!((wrap(tries[0] - tries[1], 0.0).abs() - 2.0 * inside::<f64>()).abs() < 1e-12);
    }
}
