//! The review sheet's method and steps of a mid-wrist arm, with the constants its plan is
//! built from ([`super::plan::chain`]).

use super::plan::chain;
use crate::family::data::{t, Part, Step, Steps, INPUTS};
use crate::family::general::steps::position_steps;
use crate::plan::Plan;

/// The method and the steps, as [`super::plan::build`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let arm = &plan.arm;
    let b = arm.wrist_center;
    let k = chain(arm);
    let method = vec![
        "**The point where axes 2–4 meet** (Pieper 1968, three consecutive axes meeting): \
         joints 2–4 turn about lines through `b`, so with `G = B⁻¹ T M⁻¹ = E1 ⋯ E6`, \
         `b = E5(θ5) E6(θ6) G⁻¹ E1(θ1) b`: joint 1 moves `b` on a circle, `G⁻¹` carries the \
         circle, joints 6 and 5 bring it back onto `b`."
            .to_string(),
        "**Joints 5, 6, 1** as the general family's joints 1, 2, 3 (Pieper's quartic, solved by \
         **Ferrari's method**, or quadratics when axes 5 and 6 meet or are parallel): the target \
         is `b`, and joint 3's circle `r(θ1) = G⁻¹ E1(θ1) b − f2` follows the target. Up to 4 \
         roots."
            .to_string(),
        "**Joints 2–4** as a spherical wrist: `R2 R3 R4 = R1ᵀ rot(G) R6ᵀ R5ᵀ`, **Paden–Kahan \
         subproblem 2** for joints 2 and 3, subproblem 1 for joint 4 (Paden 1986; Murray, Li & \
         Sastry 1994, §3.3). Up to 4 × 2 = 8 solutions; no step iterates (§9)."
            .to_string(),
    ];
    let circle = Step {
        title: "The circle of b".into(),
        text: "Joint 1 turns `b` about axis 1; the target's inverse carries that circle to where \
               axes 5 and 6 keep their zero positions. In the steps below, the general family's \
               joints 1, 2, 3 are joints 5, 6, 1 here, its `c_t` is `b`, and its `r0`, `rc`, \
               `rs` are this circle's (the numbers listed are those at `G = I`)."
            .into(),
        equations: vec![
            "G = B⁻¹ T M⁻¹ = (R, t),  v = b − p1,  o1 = p1 + (h1 · v) h1,  v⊥ = v − (h1 · v) h1"
                .into(),
            "r(θ1) = G⁻¹ E1(θ1) b − f2 = r0 + cos θ1 rc + sin θ1 rs".into(),
            "r0 = Rᵀ (o1 − t) − f2,  rc = Rᵀ v⊥,  rs = Rᵀ (h1 × v⊥)".into(),
        ],
        after: String::new(),
        numbers: vec![
            vec![t("b = "), Part::point(b)],
            vec![
                t("axis 1: h1 = "),
                Part::direction(arm.axis(0)),
                t(",  p1 = "),
                Part::point(arm.point(0)),
            ],
        ],
    };
    let [quartic, back] = position_steps(&k);
    let polish = Step {
        title: "Each root polished, joint 6 held where it is free".into(),
        text: "Where `b` nears axis 6, joint 6 can hardly move it: the two equations above lose \
               joint 6's column and the roots are double. Two Newton steps on the three \
               position equations move joints 5 and 1 where they help; joint 6 is fitted \
               again after each. \
               Roots closer than about 1e-7 rad are one root (joints 2–4 follow the chain, and \
               near the aligned middle wrist they magnify its differences)."
            .into(),
        equations: vec![
            "x = E5(θ5) E6(θ6) m(θ1),  F = x − b,  J = [h5 × (x − p5), R5 (h6 × (E6 m − p6)), \
             R5 R6 ∂m/∂θ1]"
                .into(),
            "(δ5, δ6, δ1) = −J⁻¹ F;  θ5, θ1 take their steps when |δ|² ≤ 1e-12 and the miss \
             drops"
                .into(),
            "θ6 = atan2(h6 · ((m − p6)⊥h6 × (E5(−θ5) b − p6)), (m − p6)⊥h6 · (E5(−θ5) b − p6))"
                .into(),
            "|(m − p6)⊥h6| ≤ tolerance: θ6 = its reference (joint 6 free, flagged)".into(),
            "the check: |x − b| within the length tolerance (within 5e-9 of the arm's size when \
             m is within 1e-6 of it from axis 6, flagged at the reach limit)"
                .into(),
        ],
        after: String::new(),
        numbers: vec![
            vec![
                t("axis 5: h5 = "),
                Part::direction(arm.axis(4)),
                t(",  p5 = "),
                Part::point(arm.point(4)),
            ],
            vec![
                t("axis 6: h6 = "),
                Part::direction(arm.axis(5)),
                t(",  p6 = "),
                Part::point(arm.point(5)),
            ],
        ],
    };
    let wrist = Step {
        title: "Joints 2–4: the middle wrist".into(),
        text: "What joints 1, 5 and 6 leave of the rotation is turned by the wrist of axes 2, \
               3, 4, as a spherical wrist at the end is."
            .into(),
        equations: vec![
            "R2 R3 R4 = R1ᵀ rot(G) R6ᵀ R5ᵀ,   v = R2 R3 R4 h4".into(),
            "z = R3 h4 = α h2 + β h3 ± γ (h2 × h3):  θ3 turns h4 onto z, θ2 turns z onto v \
             (subproblem 2)"
                .into(),
            "θ4: subproblem 1 on a direction ⟂ h4".into(),
        ],
        after: String::new(),
        numbers: [1, 2, 3]
            .map(|i| {
                vec![
                    t(&format!("joint {}: h = ", i + 1)),
                    Part::direction(arm.axis(i)),
                    t(",  p = "),
                    Part::point(arm.point(i)),
                ]
            })
            .to_vec(),
    };
    Steps {
        inputs: INPUTS.to_string(),
        method,
        steps: vec![circle, quartic, back, polish, wrist],
    }
}
