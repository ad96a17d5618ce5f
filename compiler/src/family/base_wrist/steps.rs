//! The review sheet's method and steps of an arm with its wrist at the base, with the plan's
//! constants.

use crate::family::data::{t, Part, Step, Steps};
use crate::plan::Plan;

/// The method and the steps, as [`super::plan::build`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let arm = &plan.arm;
    let b = arm.wrist_center;
    let method = vec![
        "**Mirrored decoupling** (Pieper 1968, read from the tool end): with `G = B⁻¹ T M⁻¹ = \
         E1 ⋯ E6`, `G⁻¹ = E6(−θ6) ⋯ E1(−θ1)` and `E(h, −θ) = E(−h, θ)`, so `G⁻¹` is the forward \
         kinematics of the *mirrored arm*, whose joint `i` is joint `7 − i` about the reversed \
         axis, with the same value. Its joints 4–6 (the arm's 3, 2, 1) meet in `b`: a spherical \
         wrist."
            .to_string(),
        "**Joints 6, 5, 4** as joints 1–3 of the mirrored arm, by their own family's steps \
         (§2 names it): the point `b` seen from the tool, `G⁻¹ b`, depends on them only."
            .to_string(),
        "**Joints 3, 2, 1** as the mirrored arm's spherical wrist: **Paden–Kahan subproblem 2** \
         for two of them, subproblem 1 for the last (Paden 1986; Murray, Li & Sastry 1994, \
         §3.3). Up to 4 × 2 = 8 solutions; no step iterates (§9)."
            .to_string(),
    ];
    let axis = |i: usize| {
        vec![
            t(&format!("joint {}: h = ", i + 1)),
            Part::direction(arm.axis(i)),
            t(",  p = "),
            Part::point(arm.point(i)),
        ]
    };
    let steps = vec![
        Step {
            title: "The mirrored target".into(),
            text: "The mirrored arm has no base and no tool frame: its target is `G⁻¹`, its \
                   wrist center `b` where axes 1–3 meet."
                .into(),
            equations: vec![
                "G = B⁻¹ T M⁻¹,   G⁻¹ = E6(−θ6) E5(−θ5) E4(−θ4) E3(−θ3) E2(−θ2) E1(−θ1)".into(),
                "b_t = G⁻¹ b   (the mirrored arm's wrist-center target)".into(),
            ],
            after: String::new(),
            numbers: vec![vec![t("b = "), Part::point(b)]],
        },
        Step {
            title: "Joints 6, 5, 4 (the mirrored arm's joints 1–3)".into(),
            text: "The mirrored arm's joint `i` turns about `−h_{7−i}` through `p_{7−i}`; its \
                   joints 1–3 place `b` at `b_t` by the equations of their family."
                .into(),
            equations: vec!["E'_i(θ) = E_{7−i}(−θ),   i = 1, 2, 3".into()],
            after: String::new(),
            numbers: vec![axis(5), axis(4), axis(3)],
        },
        Step {
            title: "Joints 3, 2, 1 (the mirrored arm's wrist)".into(),
            text: "What joints 6–4 leave of `G⁻¹`'s rotation is turned by the base wrist, axes \
                   3, 2, 1 in the mirrored order."
                .into(),
            equations: vec![
                "R'456 = (R'1 R'2 R'3)ᵀ rot(G⁻¹)".into(),
                "θ3, θ2: subproblem 2;  θ1: subproblem 1".into(),
            ],
            after: String::new(),
            numbers: vec![axis(2), axis(1), axis(0)],
        },
    ];
    Steps {
        inputs: crate::family::data::INPUTS.to_string(),
        method,
        steps,
    }
}
