//! The review sheet's method and steps of a base-slide arm, with the constants its plan is
//! built from ([`super::plan::constants`]).

use super::plan::{constants, Constants};
use crate::family::data::{t, Part, Step, Steps};
use crate::family::decoupled_steps::decoupled;
use crate::plan::Plan;

/// §3's bullet on joints 1–3.
const METHOD: &str = "**Joints 1–3 (base-slide family)**: joint 2 keeps the wrist center's \
    height along axis 2 and its distance from a point of axis 2; both are linear in \
    `(cos θ3, sin θ3)`, so Cramer's rule gives joint 3 as quadratics in the slide and \
    `cos² θ3 + sin² θ3 = 1` a **quartic** in the slide (Pieper 1968), solved by **Ferrari's \
    method** with two Newton steps per root (0–4 roots); joint 2 by **Paden–Kahan subproblem \
    1** (Paden 1986; Murray, Li & Sastry 1994, §3.3).";

/// The method and the steps, as [`super::plan`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let k = constants(&plan.arm);
    decoupled(
        plan,
        METHOD,
        vec![slide(&k), joints_3_and_2(), real_roots()],
    )
}

/// The slide from the quartic.
fn slide(k: &Constants) -> Step {
    let [z0, zc, zs] = k.z;
    let [q0, qc, qs] = k.q;
    Step {
        title: "Joint 1 (the slide): a quartic".into(),
        text: "`e1` is the slide's direction, `f2` the foot on axis 2 of the common normal of \
               axes 2 and 3; joint 3 moves the wrist center to `r(θ3) = E3(θ3) c − f2 = r0 + \
               cos θ3 rc + sin θ3 rs`. The slide moves joints 2 and 3 along `e1`, so joint 2 \
               must turn `r(θ3)` onto `y = c_t − f2 − d1 e1`, keeping `h2 · r` and `|r|²`."
            .into(),
        equations: vec![
            "d0 = e1 · (c_t − f2),  y⊥ = c_t − f2 − d0 e1,  d1 = d0 + s,  y = y⊥ − s e1".into(),
            "h2 · y⊥ − (h2·e1) s = z0 + zc cos θ3 + zs sin θ3      (z = h2 · r)".into(),
            "|y⊥|² + s²          = q0 + qc cos θ3 + qs sin θ3      (q = |r|²)".into(),
            "L1 = h2 · y⊥ − z0 − (h2·e1) s,  L2 = |y⊥|² − q0 + s²,  Δ = zc qs − zs qc".into(),
            "cos θ3 = (qs L1 − zs L2)/Δ,  sin θ3 = (zc L2 − qc L1)/Δ".into(),
            "F(τ) = cos² θ3 + sin² θ3 − 1 = k0 τ⁴ + k1 τ³ + k2 τ² + k3 τ + k4 = 0,  s = ℓ τ".into(),
            "roots: Ferrari (resolvent cubic U³ + 2pU² + (p² − 4r)U − q² = 0, its largest root),"
                .into(),
            "       then two Newton steps τ ← τ − F(τ)/F′(τ), each kept when it lowers |F|".into(),
        ],
        after: String::new(),
        numbers: vec![
            vec![
                t("e1 = "),
                Part::direction(k.e1),
                t(",  h2 = "),
                Part::direction(k.h2),
                t(",  h3 = "),
                Part::direction(k.h3),
            ],
            vec![
                t("f2 = "),
                Part::point(k.f2),
                t(",  h2·e1 = "),
                Part::number(k.along),
                t(",  ℓ = "),
                Part::length(k.ell),
            ],
            vec![
                t("r0 = "),
                Part::point(k.r0),
                t(",  rc = "),
                Part::point(k.rc),
                t(",  rs = "),
                Part::point(k.rs),
            ],
            vec![
                t("z0 = "),
                Part::length(z0),
                t(",  zc = "),
                Part::length(zc),
                t(",  zs = "),
                Part::length(zs),
            ],
            vec![
                t("q0 = "),
                Part::Area(q0),
                t(",  qc = "),
                Part::Area(qc),
                t(",  qs = "),
                Part::Area(qs),
                t(",  Δ/ℓ³ = "),
                Part::number(k.delta / k.ell.powi(3)),
            ],
        ],
    }
}

/// Joints 3 and 2 for each root.
fn joints_3_and_2() -> Step {
    Step {
        title: "Joints 3 and 2: Cramer's rule, Paden–Kahan subproblem 1".into(),
        text: String::new(),
        equations: vec![
            "θ3 = atan2(zc L2 − qc L1, qs L1 − zs L2)".into(),
            "then one Newton step on (z(θ3) − h2·y, (q(θ3) − |y|²)/(2ℓ)) in (s, θ3), kept when \
             it is short and lowers the miss"
                .into(),
            "θ2 = atan2(h2 · (r⊥h2 × y), r⊥h2 · y)     (zero when the wrist center is on axis 2)"
                .into(),
            "d1 = d0 + s,  R1 R2 R3 = R(h2, θ2) R(h3, θ3)   (the slide does not turn)".into(),
        ],
        after: String::new(),
        numbers: Vec::new(),
    }
}

/// Which roots are real, and the labels.
fn real_roots() -> Step {
    Step {
        title: "Which roots are real".into(),
        text: "A complex pair of roots gives its real part (a root beyond reach, the nearest \
               value); every candidate is checked by its miss `|E1 E2 E3 c − c_t| = |R2 r − y|`, \
               zero for a real root (at most 1 of the length tolerance). Labels: the shoulder \
               is the side of the plane through `f2` ⟂ `e1` the wrist center (the slide undone) \
               is on, the elbow the sign of the position Jacobian `det[e1, h2 × (w − f2), \
               ∂w/∂θ3]`; each root goes to the candidate of its label (two roots with one \
               label: the second to a label no root has)."
            .into(),
        equations: Vec::new(),
        after: String::new(),
        numbers: Vec::new(),
    }
}
