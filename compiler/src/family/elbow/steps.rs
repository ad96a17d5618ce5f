//! The review sheet's method and steps of an elbow arm, with the constants its plan is built
//! from ([`super::plan::constants`]). Joint 1 ([`joint_one`]) is shared with the polar family.

use super::plan::{constants, Constants};
use crate::family::data::{axis_line, t};
use crate::family::data::{Part, Step, Steps};
use crate::family::decoupled_steps::decoupled;
use crate::plan::vec3::num;
use crate::plan::Plan;

/// §3's bullet on joints 1–3.
const METHOD: &str = "**Joints 1–3 (elbow family)**: joint 1 by *rotating a point into a \
    plane* (`a cos θ + b sin θ = e`, 0–2 roots); joint 3 by the **law of cosines** on the \
    distance from axis 2 to the wrist center (0–2 roots); joint 2 by **Paden–Kahan subproblem \
    1**, rotating a point onto a point about one axis (Paden 1986; Murray, Li & Sastry 1994, \
    §3.3).";

/// The method and the steps, as [`super::plan`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let k = constants(&plan.arm);
    decoupled(
        plan,
        METHOD,
        vec![joint_one(&k), joint_three(&k), joint_two(&k)],
    )
}

/// Joint 1 of elbow and polar arms: rotate the target into a plane.
pub(crate) fn joint_one(k: &Constants) -> Step {
    let p2 = num::sub(&k.p1, &k.p1_minus_p2);
    Step {
        title: "Joint 1: rotate the target into a plane".into(),
        text: "Joints 2 and 3 move the wrist center in planes perpendicular to axis 2, so its \
               component along `h2` is fixed: undoing joint 1 must bring the target to the same \
               component, `h2 · (E1(−θ1) c_t − p2) = h2 · (c − p2)`, which is"
            .into(),
        equations: vec![
            "a cos θ1 + b sin θ1 = e".into(),
            "u = c_t − p1".into(),
            "a = (h2 − (h1·h2) h1) · u".into(),
            "b = (h1 × h2) · u".into(),
            "e = h2·(c − p1) − (h1·h2) (h1·u)".into(),
            "r² = a² + b²,  k = √(r² − e²)".into(),
            "cos θ1 = (a e − σ b k) / r²,  sin θ1 = (b e + σ a k) / r²,  σ = ±1".into(),
            "w  = E1(−θ1) c_t − p2 = R1ᵀ u + (p1 − p2)   (joint 1 undone, seen from axis 2)".into(),
            "d² = |w|² − (h2·w)²                      (its squared distance from axis 2)".into(),
        ],
        after: "Real when `r² ≥ e²` (else the target is inside the cylinder around axis 1 that \
                the arm cannot enter); joint 1 free when `r² = 0` (§6)."
            .into(),
        numbers: vec![
            axis_line(1, k.h1, k.p1),
            axis_line(2, k.h2, p2),
            vec![t("a  = "), Part::direction(k.alpha), t(" · u")],
            vec![t("b  = "), Part::direction(k.beta), t(" · u")],
            vec![
                t("e  = "),
                Part::length(k.e0),
                t(" − "),
                Part::number(k.cos12),
                t(" (h1·u)"),
            ],
            vec![t("p1 − p2 = "), Part::point(k.p1_minus_p2)],
        ],
    }
}

/// Joint 3 by the law of cosines.
fn joint_three(k: &Constants) -> Step {
    let two = &k.two_link;
    let (ll, vv) = two.lengths();
    Step {
        title: "Joint 3: law of cosines".into(),
        text: "`L` is the upper arm (from axis 2 to axis 3, perpendicular to both), `V` the \
               forearm (from axis 3 to the wrist center, perpendicular to `h2`), both at zero; \
               `ψ` is the bend measured from the stretched arm."
            .into(),
        equations: vec![
            "d² = |L|² + |V|² + 2 |L| |V| cos ψ".into(),
            "cos ψ = (d² − |L|² − |V|²) / (2 |L| |V|),  sin ψ = ±√(1 − cos² ψ)".into(),
            "φ3 = φ0 ± ψ,  φ0 = atan2(L·(h2 × V), L·V)   (φ3 = φ0: stretched)".into(),
            "θ3 = s3 φ3,  s3 = h3·h2 = ±1".into(),
        ],
        after: String::new(),
        numbers: vec![
            vec![
                t("L = "),
                Part::point(two.l),
                t(",  |L| = "),
                Part::length(ll),
            ],
            vec![
                t("V = "),
                Part::point(two.v),
                t(",  |V| = "),
                Part::length(vv),
            ],
            vec![
                t("cos ψ = (d² − "),
                Part::Area(ll * ll + vv * vv),
                t(") / "),
                Part::Area(2.0 * ll * vv),
            ],
            vec![
                t("φ0 = "),
                Part::angle(two.stretched),
                t(",  s3 = "),
                Part::number(two.sense),
            ],
        ],
    }
}

/// Joint 2 by Paden–Kahan subproblem 1.
fn joint_two(k: &Constants) -> Step {
    let two = &k.two_link;
    Step {
        title: "Joint 2: rotate a point onto a point (Paden–Kahan 1)".into(),
        text: String::new(),
        equations: vec![
            "x⊥ = L + R(h2, φ3) V = L + cos φ3 V + sin φ3 (h2 × V)".into(),
            "θ2 = atan2(h2 · (x⊥ × w), x⊥ · w)".into(),
            "R1 R2 R3 = R(h1, θ1) R(h2, θ2 + φ3)   (axes 2 and 3 parallel)".into(),
        ],
        after: String::new(),
        numbers: vec![vec![
            t("x⊥ = "),
            Part::point(two.l),
            t(" + cos φ3 "),
            Part::point(two.v),
            t(" + sin φ3 "),
            Part::point(num::cross(&two.h, &two.v)),
        ]],
    }
}
