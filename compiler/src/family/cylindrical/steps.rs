//! The review sheet's method and steps of a cylindrical arm, with the constants its plan is
//! built from ([`super::plan::constants`]).

use super::plan::{constants, Constants};
use crate::family::data::{axis_line, t};
use crate::family::data::{Part, Step, Steps};
use crate::family::decoupled_steps::decoupled;
use crate::plan::vec3::num;
use crate::plan::Plan;

/// §3's bullet on joints 1–3.
const METHOD: &str = "**Joints 1–3 (cylindrical family)**: the height along axis 1 is linear \
    in the slides, the distance from axis 1 quadratic: one quadratic after substitution (0–2 \
    roots); joint 1 by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & Sastry 1994, \
    §3.3).";

/// The method and the steps, as [`super::plan`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let k = constants(&plan.arm);
    decoupled(plan, METHOD, vec![slides(&k), joint_one()])
}

/// The slides from the height along axis 1 and the distance from it.
fn slides(k: &Constants) -> Step {
    // 1-based joint numbers of the eliminated and the solved slide.
    let (p, j) = (k.pivot + 1, k.other + 1);
    Step {
        title: "The slides: height and distance from axis 1".into(),
        text: format!(
            "Joint 1 turns about axis 1, so it changes neither the wrist center's height along \
             `h1` nor its distance from axis 1. The height is linear in the slides; slide {p} \
             (`u_k`, the one moving more along axis 1) is eliminated with it, and the distance \
             gives a quadratic in slide {j} (`s`, direction `u_j`)."
        ),
        equations: vec![
            "y = c_t − p1,  z = h1 · y,  radial = y − z h1,  ρ² = |radial|²".into(),
            "z = h1·(c − p1) + (h1·u_k) s_k + (h1·u_j) s".into(),
            "W = A0 + z A1,  A0 = (c − p1)⊥h1 − (h1·(c − p1)) / (h1·u_k) u_k⊥h1,  A1 = u_k⊥h1 / (h1·u_k)"
                .into(),
            "D = u_j⊥h1 − (h1·u_j) / (h1·u_k) u_k⊥h1".into(),
            "|W + s D|² = ρ²".into(),
            "s   = (−D·W ± |D| √(ρ² − |W⊥D|²)) / |D|²,  |W⊥D|² = |W|² − (D·W)² / |D|²".into(),
            "s_k = (z − h1·(c − p1) − (h1·u_j) s) / (h1·u_k)".into(),
        ],
        after: String::new(),
        numbers: vec![
            axis_line(1, k.h1, k.p1),
            vec![
                t(&format!("k = slide {p}, j = slide {j};  h1·u_k = ")),
                Part::number(k.along_k),
                t(",  h1·u_j = "),
                Part::number(k.along_j),
                t(",  h1·(c − p1) = "),
                Part::length(k.height),
            ],
            vec![
                t("A0 = "),
                Part::point(k.a0),
                t(",  A1 = "),
                Part::direction(k.a1),
            ],
            vec![
                t("D  = "),
                Part::direction(k.d),
                t(",  |D|² = "),
                Part::number(num::dot(&k.d, &k.d)),
            ],
        ],
    }
}

/// Joint 1 by Paden–Kahan subproblem 1.
fn joint_one() -> Step {
    Step {
        title: "Joint 1: rotate a point onto a point (Paden–Kahan 1)".into(),
        text: String::new(),
        equations: vec![
            "x  = W + s D".into(),
            "θ1 = atan2(h1 · (x × radial), x · radial)".into(),
            "R1 R2 R3 = R(h1, θ1)   (slides do not turn)".into(),
        ],
        after: String::new(),
        numbers: Vec::new(),
    }
}
