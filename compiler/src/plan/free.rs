//! The free joint 1 on axis 1, chosen so that joint 5 fits its limits.
//!
//! With the wrist center on axis 1, joint 1 does not move it: `solve` holds joint 1 at a
//! reference. Joint 1 still turns the orientation the wrist must make, so at the reference
//! joint 5 can fall outside its limits although another value of joint 1 keeps every joint
//! inside. The choice is a one-dimensional interval problem with a closed form:
//!
//! * Joint 5 fixes `k = h4 · v`, the cosine-like measure of the angle between axis 4 and the
//!   direction `v = (R1 R2 R3)ᵀ rot(G) h6` that axis 6 must take (the wrist step's `a`):
//!   `k = h4 · R5(θ5) h6 = p + q cos θ5 + r sin θ5`. Over joint 5's limits `k` takes the values
//!   of an interval `[k_lo, k_hi]`, found once when planning (the ends of the range and the
//!   extremes of the sinusoid inside it).
//! * As a function of joint 1's model value `m`, with `u = R2 R3 h4` and `g = rot(G) h6`:
//!   `k(m) = u · R1(m)ᵀ g = A + B cos m + C sin m`, `A = (u·h1)(g·h1)`, `B = u·g − A`,
//!   `C = −h1 · (g × u)` (Rodrigues). So `k(m) = A + ρ cos(m − μ)`, `ρ = √(B² + C²)`, and
//!   `k(m) ∈ [k_lo, k_hi]` holds on two arcs around `μ` bounded by `m − μ = ±acos x` for
//!   `x = (k_hi − A) / ρ` and `x = (k_lo − A) / ρ`.
//! * The candidates are the reference, the four arc ends (moved 1e-9 inside the interval) and
//!   joint 1's two limits. Of those inside joint 1's limits with `k` inside `[k_lo, k_hi]`,
//!   the one nearest the reference (largest cosine of the difference) is taken; when none is,
//!   the reference stays.
//!
//! Every step is a fixed sequence of operations on cosines and sines (no loop depends on the
//! data), so the interpreter and the emitted module run the same choice. Away from axis 1 the
//! choice is computed and not used (a select keeps the family's own joint 1).

use core::f64::consts::{PI, TAU};

use armforge_runtime::JointKind;

use super::arm::Arm;
use super::graph::{Graph, Id};
use super::vec3::{self, num, V3};
use super::wrist::WristAxes;
use super::ArmSolution;

/// The arc ends are moved this far inside `[k_lo, k_hi]`, so that joint 5 lands strictly
/// within its limits despite rounding.
const INSIDE: f64 = 1e-9;

/// The interval of `k = h4 · R5(θ5) h6` over joint 5's limits (model values), or `None` when
/// joint 5 reaches every value (a range of a whole turn or more).
pub fn joint_5_interval(arm: &Arm) -> Option<[f64; 2]> {
    let w = WristAxes::of(arm);
    let j5 = arm.joints[4];
    if j5.kind != JointKind::Revolute {
        return None;
    }
    let [lo, hi] = j5.limits;
    if !(lo.is_finite() && hi.is_finite()) || hi - lo >= TAU {
        return None;
    }
    let (m1, m2) = (j5.model_value(lo), j5.model_value(hi));
    let (mlo, mhi) = (m1.min(m2), m1.max(m2));
    let p = num::dot(&w.h4, &w.h5) * num::dot(&w.h6, &w.h5);
    let q = num::dot(&w.h4, &w.h6) - p;
    let r = num::dot(&w.h4, &num::cross(&w.h5, &w.h6));
    let k = |m: f64| p + q * m.cos() + r * m.sin();
    let (rho, mu) = ((q * q + r * r).sqrt(), r.atan2(q));
    let contains = |angle: f64| {
        let first = angle + TAU * ((mlo - angle) / TAU).ceil();
        first <= mhi
    };
    let mut low = k(mlo).min(k(mhi));
    let mut high = k(mlo).max(k(mhi));
    if contains(mu) {
        high = p + rho;
    }
    if contains(mu + PI) {
        low = p - rho;
    }
    Some([low, high])
}

/// Joint 1's model values at its limits, or `None` when it turns a whole turn or more.
fn joint_1_limits(arm: &Arm) -> Option<[f64; 2]> {
    let j1 = arm.joints[0];
    let [lo, hi] = j1.limits;
    if !(lo.is_finite() && hi.is_finite()) || hi - lo >= TAU {
        return None;
    }
    let (m1, m2) = (j1.model_value(lo), j1.model_value(hi));
    Some([m1.min(m2), m1.max(m2)])
}

/// A unit (cos, sin) pair on the graph.
type Pair = (Id, Id);

/// `(a, b)` turned by `(c, s)`: the pair of the sum of the angles.
fn turn(g: &mut Graph, (a, b): Pair, (c, s): Pair) -> Pair {
    let ac = g.mul(a, c);
    let bs = g.mul(b, s);
    let bc = g.mul(b, c);
    let as_ = g.mul(a, s);
    (g.sub(ac, bs), g.add(bc, as_))
}

/// Moves joint 1 of `solution` (when its wrist center is on axis 1) to the value nearest its
/// reference for which joint 5 fits its limits (see the module documentation). `g6` is where
/// the target sends axis 6, in the base frame. Does nothing when joint 5 or joint 1 turns a
/// whole turn or more, or when joint 1 is not the solution's first turn. `tag` names the
/// steps.
pub fn choose_joint_1(g: &mut Graph, arm: &Arm, g6: V3, solution: &mut ArmSolution, tag: &str) {
    let Some(flag) = solution.on_axis_1 else {
        return;
    };
    let Some([k_lo, k_hi]) = joint_5_interval(arm) else {
        return;
    };
    let h1 = arm.axis(0);
    let first_turns_joint_1 = arm.joints[0].kind == JointKind::Revolute
        && solution
            .undo
            .first()
            .is_some_and(|t| num::dot(&t.axis, &h1) > 1.0 - 1e-12);
    if !first_turns_joint_1 {
        return;
    }
    let reference = (solution.undo[0].cos, solution.undo[0].sin);
    // u = R2 R3 h4 (the later turns applied to axis 4, last first).
    let w = WristAxes::of(arm);
    let mut u = vec3::constant(g, w.h4);
    for t in solution.undo[1..].iter().rev() {
        u = vec3::rotate(g, t.axis, t.cos, t.sin, u);
    }
    let uh = vec3::dot_const(g, h1, u);
    let gh = vec3::dot_const(g, h1, g6);
    let a = g.mul(uh, gh);
    let ug = vec3::dot(g, u, g6);
    let b = g.sub(ug, a);
    let gu = vec3::cross(g, g6, u);
    let c = vec3::dot_const(g, h1, gu);
    let c = g.neg(c);
    let a = g.name(
        a,
        &format!("free1_a_{tag}"),
        "A = (u·h1)(g·h1), u = R2 R3 h4, g = rot(G) h6",
    );
    let b = g.name(b, &format!("free1_b_{tag}"), "B = u·g − A");
    let c = g.name(
        c,
        &format!("free1_c_{tag}"),
        "C = −h1·(g × u): k(θ1) = A + B cos θ1 + C sin θ1",
    );
    let bb = g.mul(b, b);
    let cc = g.mul(c, c);
    let rr = g.add(bb, cc);
    let floor = g.exact(1e-300);
    let rr = g.max(rr, floor);
    let rho = g.sqrt(rr);
    let rho = g.name(rho, &format!("free1_rho_{tag}"), "ρ = √(B² + C²)");
    let one = g.constant(1.0);
    let inv = g.div(one, rho);
    let mu = (g.mul(b, inv), g.mul(c, inv));
    let mut candidates = vec![reference];
    for (edge, inside) in [(k_hi, -INSIDE), (k_lo, INSIDE)] {
        let e = g.constant(edge + inside);
        let d = g.sub(e, a);
        let x = g.mul(d, inv);
        let x = g.clamp(x, -1.0, 1.0);
        let xx = g.mul(x, x);
        let rest = g.sub(one, xx);
        let y = g.sqrt0(rest);
        let ny = g.neg(y);
        candidates.push(turn(g, mu, (x, y)));
        candidates.push(turn(g, mu, (x, ny)));
    }
    let limits = joint_1_limits(arm);
    if let Some(limits) = limits {
        for m in limits {
            candidates.push((g.constant(m.cos()), g.constant(m.sin())));
        }
    }
    let k_low = g.constant(k_lo - INSIDE * 0.5);
    let k_high = g.constant(k_hi + INSIDE * 0.5);
    let mut best = reference;
    let mut best_score = g.constant(2.0);
    for (i, &(cm, sm)) in candidates.iter().enumerate() {
        // k of the candidate, within [k_lo, k_hi]: both margins ≥ 0.
        let bc = g.mul(b, cm);
        let cs = g.mul(c, sm);
        let k = g.add(bc, cs);
        let k = g.add(k, a);
        let above = g.sub(k, k_low);
        let below = g.sub(k_high, k);
        let mut margin = g.min(above, below);
        if let Some([lo, hi]) = limits {
            // Inside joint 1's limits: the angle from the range's middle within half of it.
            let mid = 0.5 * (lo + hi);
            let (cmid, smid) = (g.constant(mid.cos()), g.constant(mid.sin()));
            let y1 = g.mul(sm, cmid);
            let y2 = g.mul(cm, smid);
            let y = g.sub(y1, y2);
            let x1 = g.mul(cm, cmid);
            let x2 = g.mul(sm, smid);
            let x = g.add(x1, x2);
            let from_mid = g.atan2(y, x);
            let from_mid = g.abs(from_mid);
            let half = g.constant(0.5 * (hi - lo) + 1e-12);
            let inside = g.sub(half, from_mid);
            // Scaled to compare with the k margin only by sign.
            margin = g.min(margin, inside);
        }
        // The reference scores 2 (kept when it fits); others their cosine to it.
        let score = if i == 0 {
            g.constant(2.0)
        } else {
            let x1 = g.mul(cm, reference.0);
            let x2 = g.mul(sm, reference.1);
            g.add(x1, x2)
        };
        let minus = g.constant(-3.0);
        let score = g.select(margin, score, minus);
        if i == 0 {
            best_score = score;
            continue;
        }
        // Strictly better only: ties keep the earlier candidate.
        let worse = g.sub(best_score, score);
        best = (g.select(worse, best.0, cm), g.select(worse, best.1, sm));
        best_score = g.max(best_score, score);
    }
    let cos = g.select(flag, best.0, reference.0);
    let sin = g.select(flag, best.1, reference.1);
    let cos = g.name(
        cos,
        &format!("free1_cos_{tag}"),
        "cos θ1: on axis 1, the candidate nearest the reference with joint 5 inside its limits",
    );
    let sin = g.name(sin, &format!("free1_sin_{tag}"), "sin θ1 of the same");
    let angle = g.atan2(sin, cos);
    solution.angles[0] = g.select(flag, angle, solution.angles[0]);
    solution.undo[0].cos = cos;
    solution.undo[0].sin = sin;
}
