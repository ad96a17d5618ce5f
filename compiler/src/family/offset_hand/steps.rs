//! The review sheet's method and steps of an offset-hand arm, with the plan's constants (the
//! three-parallel family's [`Layout`]).

use crate::family::data::{axis_line, t, Part, Step, Steps};
use crate::family::three_parallel::plan::Layout;
use crate::family::three_parallel::steps::planar_chain_step;
use crate::plan::vec3::num;
use crate::plan::Plan;

/// The method and the steps, as the plan builds them.
pub fn steps(plan: &Plan) -> Steps {
    let arm = &plan.arm;
    let k = Layout::of(arm);
    let (h1, p1) = (arm.axis(0), arm.point(0));
    let (h5, p5) = (arm.axis(4), arm.point(4));
    let (h6, p6) = (arm.axis(5), arm.point(5));
    let method = vec![
        "**Three parallel axes** (Pieper 1968: parallel axes meet at infinity): joints 2–4 \
         turn about lines parallel to `h = h2`, so they keep every plane ⟂ `h` a plane ⟂ `h` \
         at the same offset, and turn every direction about `h` by the sum \
         `Φ = θ2 + θ3 + θ4`."
            .to_string(),
        "**Joints 5 and 6** by the **plane–line quartic**: the plane `Π` ⟂ `h` through `p1`, \
         turned back by joint 5, and axis 1 seen from the tool, turned by joint 6, must keep \
         the cosine and the distance that joint 1 keeps; a trigonometric polynomial of degree \
         2 in `θ5`, solved by **Ferrari's method** (at most 4 roots), `θ6` by Cramer's rule, \
         one guarded Newton step on the two equations."
            .to_string(),
        "**Joint 1** by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & Sastry 1994, \
         §3.3): turn `h` onto `R R6ᵀ R5ᵀ h` about axis 1."
            .to_string(),
        "**Joints 2–4** as a planar three-joint chain: the sum `Φ` from the orientation, \
         joints 2 and 3 by the **law of cosines** placing axis 4 (0–2 roots), joint 4 the rest \
         of `Φ`. Up to 4 × 2 = 8 solutions; each root of the quartic goes to the slot of its \
         labels; no step iterates (§9)."
            .to_string(),
    ];
    let steps = vec![
        Step {
            title: "The target and axis 1 seen from the tool".into(),
            text: "`G = B⁻¹ T M⁻¹ = E1 ⋯ E6` (rotation `R`). Axis 1 seen from the tool is the \
                   line `ℓ` through `o = G⁻¹ p1` along `a = Rᵀ h1`."
                .into(),
            equations: vec!["G = B⁻¹ T M⁻¹,   a = Rᵀ h1,   o = G⁻¹ p1".into()],
            after: String::new(),
            numbers: vec![
                axis_line(1, h1, p1),
                vec![t("h = "), Part::direction(k.h), t(" (axes 2–4)")],
            ],
        },
        Step {
            title: "Joints 5 and 6: the plane–line quartic".into(),
            text: "`E1⁻¹ G E6⁻¹ E5⁻¹` must keep the plane `Π` (normal `h`, through `p1`), so \
                   `Π` turned by `E5⁻¹` and `ℓ` turned by `E6` keep the cosine `h · h1` and \
                   the distance 0 that `Π` and axis 1 have. With `m = R5ᵀ h`, `μ = h6 · m`, \
                   `b = o − p6` and the parts `⊥` to `h6`:"
                .into(),
            equations: vec![
                "α1 cos θ6 + β1 sin θ6 = P = h·h1 − (h6·a) μ,   α1 = m·a⊥,  β1 = m·(h6 × a)".into(),
                "α2 cos θ6 + β2 sin θ6 = Q = h·(p1 − p5) + m·(p5 − p6) − (h6·b) μ,   \
                 α2 = m·b⊥,  β2 = m·(h6 × b)"
                    .into(),
                "F(θ5) = |b⊥|² P² + |a⊥|² Q² − 2 (a⊥·b⊥) P Q − w² (1 − μ²) = 0,   \
                 w = h6 · (a × b)"
                    .into(),
                "(cos θ6, sin θ6) ∝ Δ (P β2 − Q β1, α1 Q − α2 P),   Δ = α1 β2 − β1 α2".into(),
            ],
            after: "A root whose two equations miss (a complex pair's real part) fails its \
                    residual check; where axis 6 lines up with `h` (`1 − μ² = 0`) joint 6 \
                    keeps the reference."
                .into(),
            numbers: vec![
                axis_line(5, h5, p5),
                axis_line(6, h6, p6),
                vec![
                    t("h · h1 = "),
                    Part::number(num::dot(&k.h, &h1)),
                    t(",  h · (p1 − p5) = "),
                    Part::length(num::dot(&k.h, &num::sub(&p1, &p5))),
                ],
            ],
        },
        Step {
            title: "Joint 1: the parallel axes' direction".into(),
            text: "Joint 1 must turn `h` onto the direction the target and joints 5, 6 give \
                   the parallel axes."
                .into(),
            equations: vec!["θ1: turn h⊥ onto R R6ᵀ R5ᵀ h about h1 (subproblem 1)".into()],
            after: String::new(),
            numbers: vec![vec![t("h1 · h = "), Part::number(num::dot(&h1, &k.h))]],
        },
        planar_chain_step(&k, "As in the three-parallel family. "),
    ];
    Steps {
        inputs: crate::family::data::INPUTS.to_string(),
        method,
        steps,
    }
}
