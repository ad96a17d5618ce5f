//! The free joint 1 on axis 1, chosen so that joint 5 fits its limits.
//!
//! With the wrist center on axis 1, joint 1 does not move it, and the plan holds joint 1 at a
//! reference. Joint 1 still turns the orientation the wrist must make, so at the reference
//! joint 5 can fall outside its limits although another value of joint 1 keeps it inside.
//! Choosing that value is a one-dimensional interval problem with a closed form:
//!
//! * Joint 5 fixes `k = h4 · v`, where `v = (R1 R2 R3)ᵀ rot(G) h6` is the direction axis 6 must
//!   take (the wrist step's `a`): `k = h4 · R5(θ5) h6 = p + q cos θ5 + r sin θ5`. Over joint 5's
//!   limits `k` covers an interval `[k_lo, k_hi]` (the ends of the range and the extremes of
//!   the sinusoid inside it).
//! * As a function of joint 1's model value `m`, with `u = R2 R3 h4` and `g = rot(G) h6`:
//!   `k(m) = u · R1(m)ᵀ g = A + B cos m + C sin m`, `A = (u·h1)(g·h1)`, `B = u·g − A`,
//!   `C = −h1 · (g × u)` (Rodrigues), i.e. `k(m) = A + ρ cos(m − μ)`. `k(m)` lies in
//!   `[k_lo, k_hi]` on two arcs symmetric about `μ`, `acos(x_hi) ≤ |m − μ| ≤ acos(x_lo)`,
//!   `x = (k − A) / ρ`.
//! * The value taken is the one nearest the held value among the arc ends (moved 1e-9 rad
//!   inside) and joint 1's limits that lie in both the arcs and joint 1's range.
//!
//! Only candidates that are on axis 1 and outside the limits are moved (at most once each; a
//! fixed number of steps, no search), so `solve` costs nothing more away from axis 1. The
//! interpreter and every emitted module call this one function.

use core::f64::consts::{PI, TAU};

use super::{wrap, Candidate, Settings};
use crate::fk::joint_motion;
use crate::math::{abs, atan2, clamp, cos, cross, dot, sin, sqrt};
use crate::model::{Joint, JointKind};
use crate::pose::Pose;
use crate::solution::JOINTS;

/// Arc ends are moved this far (radians) inside the arcs, so that joint 5 lands within its
/// limits despite rounding.
const INSIDE: f64 = 1e-9;

/// `acos` through `atan2`, argument clamped to `[−1, 1]`.
fn acos(x: f64) -> f64 {
    let x = clamp(x, -1.0, 1.0);
    atan2(sqrt((1.0 - x) * (1.0 + x)), x)
}

/// A revolute joint's limits as model values `[lo, hi]`, or `None` when it turns a whole turn
/// or more (or is a slide).
fn model_range(joint: &Joint) -> Option<[f64; 2]> {
    let [lo, hi] = joint.limits;
    if joint.kind != JointKind::Revolute || !(lo.is_finite() && hi.is_finite()) || hi - lo >= TAU {
        return None;
    }
    let (a, b) = (joint.model_value(lo), joint.model_value(hi));
    Some([a.min(b), a.max(b)])
}

/// True when the model value `m` is within `range` (by whole turns).
fn within(m: f64, [lo, hi]: [f64; 2], tol: f64) -> bool {
    let v = wrap(m, 0.5 * (lo + hi));
    v >= lo - tol && v <= hi + tol
}

/// The interval of `k = h4 · R5(θ5) h6` over joint 5's limits, or `None` when joint 5 turns a
/// whole turn or more (every `k` the wrist makes is within its limits).
pub fn joint_5_interval(joints: &[Joint; JOINTS]) -> Option<[f64; 2]> {
    let [mlo, mhi] = model_range(&joints[4])?;
    let (h4, h5, h6) = (&joints[3].axis, &joints[4].axis, &joints[5].axis);
    let p = dot(h4, h5) * dot(h6, h5);
    let q = dot(h4, h6) - p;
    let r = dot(h4, &cross(h5, h6));
    let k = |m: f64| p + q * cos(m) + r * sin(m);
    let (rho, mu) = (sqrt(q * q + r * r), atan2(r, q));
    let mut low = k(mlo).min(k(mhi));
    let mut high = k(mlo).max(k(mhi));
    if within(mu, [mlo, mhi], 0.0) {
        high = p + rho;
    }
    if within(mu + PI, [mlo, mhi], 0.0) {
        low = p - rho;
    }
    Some([low, high])
}

/// The model value of joint 1 nearest `held` for which joint 5 fits its limits, for a
/// candidate whose joints 2 and 3 have the model values `m2`, `m3`, with `g` where the target
/// sends axis 6 (base frame). `None` when no value does.
fn joint_1_value(
    joints: &[Joint; JOINTS],
    g: &[f64; 3],
    m2: f64,
    m3: f64,
    held: f64,
) -> Option<f64> {
    let [k_lo, k_hi] = joint_5_interval(joints)?;
    let e2 = joint_motion(&joints[1], joints[1].joint_value(m2));
    let e3 = joint_motion(&joints[2], joints[2].joint_value(m3));
    let u = e2.rotate(&e3.rotate(&joints[3].axis));
    let h1 = &joints[0].axis;
    let a = dot(&u, h1) * dot(g, h1);
    let b = dot(&u, g) - a;
    let c = -dot(h1, &cross(g, &u));
    let rho = sqrt(b * b + c * c);
    if rho <= 1e-12 || rho.is_nan() {
        return None;
    }
    let mu = atan2(c, b);
    let inner = acos((k_hi - a) / rho);
    let outer = acos((k_lo - a) / rho);
    if (k_hi - a) / rho < -1.0 || (k_lo - a) / rho > 1.0 || inner > outer {
        return None;
    }
    let margin = INSIDE.min(0.5 * (outer - inner));
    let arc = |m: f64| {
        let d = abs(wrap(m - mu, 0.0));
        d >= inner - 1e-12 && d <= outer + 1e-12
    };
    let range = model_range(&joints[0]);
    let in_range = |m: f64| range.map_or(true, |r| within(m, r, 0.0));
    let mut tries = [
        mu + inner + margin,
        mu - inner - margin,
        mu + outer - margin,
        mu - outer + margin,
        f64::NAN,
        f64::NAN,
    ];
    if let Some([lo, hi]) = range {
        tries[4] = lo + INSIDE;
        tries[5] = hi - INSIDE;
    }
    let mut best: Option<(f64, f64)> = None;
    for m in tries {
        if !(m.is_finite() && arc(m) && in_range(m)) {
            continue;
        }
        let d = abs(wrap(m - held, 0.0));
        if best.map_or(true, |(_, bd)| d < bd) {
            best = Some((m, d));
        }
    }
    best.map(|(m, _)| m)
}

/// True when a candidate passes its checks but some joint is outside its limits.
fn outside_limits(joints: &[Joint; JOINTS], settings: &Settings, c: &Candidate) -> bool {
    super::finish_one(joints, settings, c, &super::centers(joints)).is_err()
}

/// Moves joint 1 of every candidate that is on axis 1 and outside the limits to the value
/// nearest its held one for which joint 5 fits its limits (see the module documentation).
/// `rerun(reference, i)` evaluates the plan again with other reference inputs and returns
/// candidate `i`; `reference` is the one `candidates` were evaluated with.
///
/// A rare path: it does nothing unless a candidate is on axis 1 and outside the limits.
#[inline(never)]
pub fn free_joint_1(
    joints: &[Joint; JOINTS],
    frames: [&Pose; 2],
    settings: &Settings,
    target: &Pose,
    reference: &[f64; 4],
    candidates: &mut [Candidate],
    mut rerun: impl FnMut(&[f64; 4], usize) -> Option<Candidate>,
) {
    if joints[0].kind != JointKind::Revolute {
        return;
    }
    let [base, tool] = frames;
    // g = rot(B⁻¹ T M⁻¹) h6: where the target sends axis 6, base frame at zero.
    let in_tool = tool.rotate_back(&joints[5].axis);
    let g = base.rotate_back(&target.rotate(&in_tool));
    let held_reference = atan2(reference[1], reference[0]);
    for (i, c) in candidates.iter_mut().enumerate() {
        if !c.on_axis_1 || !outside_limits(joints, settings, c) {
            continue;
        }
        let held = c.model_values[0];
        let Some(m1) = joint_1_value(joints, &g, c.model_values[1], c.model_values[2], held) else {
            continue;
        };
        // The candidate's joint 1 is the reference or a fixed turn from it (half a turn for
        // the other shoulder solution): keep that turn.
        let angle = m1 - (held - held_reference);
        let mut moved = *reference;
        moved[0] = cos(angle);
        moved[1] = sin(angle);
        if let Some(again) = rerun(&moved, i) {
            if again.on_axis_1 {
                *c = again;
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
    fn joint_1_moves_only_as_far_as_joint_5_needs() {
        // Axis 1 along z; joints 2 and 3 at zero, so u = h4 = z and k = h1·g (A = g_z,
        // B = C = 0 when g is along z): nothing to choose.
        let joints = wrist([-120.0, 120.0]);
        assert_eq!(
            joint_1_value(&joints, &[0.0, 0.0, 1.0], 0.0, 0.0, 0.3),
            None
        );
        // Axis 4 tilted by joint 2 (about y, 90°): u = x, so k(m) = x · R1(m)ᵀ g = cos(m − μ)
        // for a horizontal g at angle μ. With g at μ = 170°, k(0) = cos 170° ≈ −0.985, outside
        // [−0.5, 1]; k ≥ −0.5 needs |m − 170°| ≤ 120°, i.e. 50° ≤ m ≤ 290°: the value
        // nearest 0 is 50°, moved 1e-9 rad into the arc.
        let mu = 170_f64.to_radians();
        let g = [mu.cos(), mu.sin(), 0.0];
        let m =
            joint_1_value(&joints, &g, core::f64::consts::FRAC_PI_2, 0.0, 0.0).unwrap_or(f64::NAN);
        assert!(
            (m - (50_f64.to_radians() + INSIDE)).abs() < 1e-12,
            "{}",
            m.to_degrees()
        );
    }
}
