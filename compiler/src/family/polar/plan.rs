//! Joints 1–3 of a polar arm (R R P, axis 1 ∦ axis 2, slide ⟂ axis 2), with any shoulder
//! offset.
//!
//! 1. Joint 1 as for the elbow family (rotate a point into a plane; the slide keeps the wrist
//!    center's height along axis 2).
//! 2. The slide from the distance `d` to axis 2: `|P + s u3|² = d²` with `P` the wrist center's
//!    offset from axis 2 at zero (⟂ h2): `s = −m ± √(d² − (|P|² − m²))`, `m = P · u3` (0–2).
//! 3. Joint 2, Paden–Kahan subproblem 1: rotate `P + s u3` onto the wrist-center target.

use armforge_runtime::internal::{CheckKind, ElbowRule, ShoulderRule};
use armforge_runtime::plan::CheckLayout;
use armforge_runtime::Elbow;

use crate::family::elbow::plan::{self as elbow, joint_one};
use crate::plan::arm::Arm;
use crate::plan::graph::{Graph, Id};
use crate::plan::subproblems::rotate_onto;
use crate::plan::vec3::{self, num, V3};
use crate::plan::{ArmSolution, Target, Turn};
use crate::units::tidy;

/// The constants of joints 2 and 3 of a polar arm (joint 1 is the elbow family's).
#[derive(Clone, Copy, Debug)]
pub struct Constants {
    /// Axis 1.
    pub h1: [f64; 3],
    /// Axis 2.
    pub h2: [f64; 3],
    /// The slide's direction ⟂ h2, unit.
    pub u3: [f64; 3],
    /// `(c − p2)⊥h2`.
    pub p: [f64; 3],
    /// `P · u3`.
    pub m: f64,
}

/// The constants the plan of a polar arm is built from.
pub fn constants(arm: &Arm) -> Constants {
    let h2 = arm.axis(1);
    let u3 = num::unit(&num::perpendicular(&arm.axis(2), &h2));
    let p = num::perpendicular(&num::sub(&arm.wrist_center, &arm.point(1)), &h2);
    Constants {
        h1: arm.axis(0),
        h2,
        m: num::dot(&p, &u3),
        u3,
        p,
    }
}

/// The label rules of a polar arm.
pub fn rules(arm: &Arm) -> (ShoulderRule, ElbowRule) {
    let k = constants(arm);
    let (shoulder, _) = elbow::rules(arm);
    (shoulder, ElbowRule::Slide { nearest: -k.m })
}

/// `(cos(φ + δ), sin(φ + δ))` from `(cos φ, sin φ)` and a constant `δ` (radians).
fn turned(g: &mut Graph, (c, s): (Id, Id), delta: f64) -> (Id, Id) {
    let (cd, sd) = (g.constant(delta.cos()), g.constant(delta.sin()));
    let (cc, ss) = (g.mul(c, cd), g.mul(s, sd));
    let (sc, cs) = (g.mul(s, cd), g.mul(c, sd));
    (g.sub(cc, ss), g.add(sc, cs))
}

/// Builds joints 1–3 of a polar arm for every branch (σ × slide root).
pub fn solve(g: &mut Graph, arm: &Arm, t: &Target, ct: V3) -> Vec<ArmSolution> {
    let k = constants(arm);
    let tol = 1e-10 * arm.scale;
    let one = joint_one(g, arm, t, ct);
    let pp = num::dot(&k.p, &k.p);
    let nearest2 = (pp - k.m * k.m).max(0.0);
    let nearest = g.constant(nearest2.sqrt());
    // Joint 2 held at the pivot: with the zero reference at its zero, or the limit nearest it.
    // It follows joint 1's reference input turned by the difference, so that the runtime can
    // move it within the limits (`armforge_runtime::internal::free_joint_1`).
    let j2 = arm.joints[1];
    let hold = j2.model_value(0.0_f64.max(j2.limits[0]).min(j2.limits[1]));
    let reference = arm.joints[0].model_value(crate::plan::free_joint_1_value(&arm.joints[0]));
    let (hold_c, hold_s) = turned(g, t.reference1, hold - reference);
    let mut out = Vec::new();
    for i in 0..2 {
        let tag = if i == 0 { "a" } else { "b" };
        let d2 = one.d2[i];
        let off = g.constant(nearest2);
        let disc = g.sub(d2, off);
        let root = g.sqrt0(disc);
        let root = g.name(
            root,
            &format!("j3_root_{tag}"),
            format!("√(d² − (|P|² − m²)), |P|² − m² = {} m²", tidy(nearest2)),
        );
        let floor = g.exact(tol * tol);
        let pivot = g.sub(floor, d2);
        let pivot = g.name(
            pivot,
            &format!("pivot_{tag}"),
            "≥ 0 when the wrist center is on axis 2: joint 2 is free",
        );
        for (extended, rtag) in [(true, "a"), (false, "b")] {
            let tag2 = format!("{tag}{rtag}");
            let minus_m = g.constant(-k.m);
            let s = if extended {
                g.add(minus_m, root)
            } else {
                g.sub(minus_m, root)
            };
            let s = g.name(
                s,
                &format!("q3_{tag2}"),
                format!("s = −m ± √(d² − |P|² + m²), m = {} m", tidy(k.m)),
            );
            let x = {
                let a = vec3::scale_const(g, s, k.u3);
                vec3::add_const(g, a, k.p)
            };
            let (nc, ns) = rotate_onto(g, k.h2, x, one.w[i]);
            // Scaled by |x| |w| rather than d²: near the pivot (d → 0) the two differ by
            // rounding far beyond d², and the pair must stay a rotation.
            let (c2, s2) = crate::plan::unit_pair(g, nc, ns);
            // At the pivot (the wrist center on axis 2) joint 2 is free: held at `hold`.
            let c2 = g.select(pivot, hold_c, c2);
            let s2 = g.select(pivot, hold_s, s2);
            let theta2 = g.atan2(s2, c2);
            let theta2 = g.name(
                theta2,
                &format!("q2_{tag2}"),
                "Paden–Kahan 1: θ2 = atan2(h2 · (x × w), x · w), x = P + s u3 (held at the pivot)",
            );
            let (c1, s1) = one.roots[i];
            out.push(ArmSolution {
                angles: [one.angles[i], theta2, s],
                undo: vec![Turn::about(k.h1, (c1, s1)), Turn::about(k.h2, (c2, s2))],
                shoulder: one.shoulders[i],
                elbow: if extended {
                    Elbow::Extended
                } else {
                    Elbow::Retracted
                },
                checks: vec![
                    one.check,
                    CheckLayout {
                        kind: CheckKind::InsideHole,
                        have_squared: d2,
                        limit: nearest,
                    },
                ],
                on_axis_1: Some(one.singular),
            });
        }
    }
    out
}
