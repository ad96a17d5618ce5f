//! The review sheet's method and steps of a base-parallel arm, with the plan's constants
//! ([`Layout`]).

use super::plan::Layout;
use crate::family::data::{axis_line, t, Part, Step, Steps};
use crate::plan::Plan;

/// The method and the steps, as the plan builds them.
pub fn steps(plan: &Plan) -> Steps {
    let arm = &plan.arm;
    let k = Layout::of(arm);
    let (len_1, len_2) = k.two_link.lengths();
    let method = vec![
        "**Three parallel axes at the base** (Pieper 1968: parallel axes meet at infinity): \
         joints 1–3 turn about lines parallel to `h = h1`, so `A = E1 E2 E3` keeps every \
         point's component along `h` and turns every direction about `h` by \
         `Φ = θ1 + s2 θ2 + s3 θ3`. The plane `Π0` through axis 4's point `p4` ⟂ `h` is kept \
         by `A`, so `E4 E5 E6 (G⁻¹ Π0) = Π0`."
            .to_string(),
        "**Joints 5 and 6** by the **plane–line step** (a quartic in θ6 by Ferrari's method, θ5 \
         by Cramer's rule, one Newton step each; up to 4 roots): the plane `G⁻¹ Π0` turned by \
         joint 6 and axis 4 turned back by joint 5 must keep the cosine `h · h4` and pass \
         through axis 4's point."
            .to_string(),
        "**Joint 4** by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & Sastry 1994, \
         §3.3), turning `R5 R6 Rᵀ h` onto `h`."
            .to_string(),
        "**Joints 1–3** as a planar three-joint chain: the sum `Φ` from the orientation, joints \
         1 and 2 by the **law of cosines** placing axis 3 (0–2 roots), joint 3 the rest of `Φ`. \
         Up to 4 × 2 = 8 solutions; no step iterates (§9)."
            .to_string(),
    ];
    let steps = vec![
        Step {
            title: "The target and the plane of axis 4's point".into(),
            text: "`G = B⁻¹ T M⁻¹ = E1 ⋯ E6` (rotation `R`); `Π0 = {y : h · y = h · p4}`; \
                   `π = G⁻¹ Π0` has the normal `n = Rᵀ h` and the point `q = G⁻¹ p4`."
                .into(),
            equations: vec!["G = B⁻¹ T M⁻¹,   n = Rᵀ h,   q = G⁻¹ p4".into()],
            after: String::new(),
            numbers: vec![
                vec![t("h = "), Part::direction(k.h), t(" (axes 1–3)")],
                axis_line(4, arm.axis(3), k.on_axis_4),
            ],
        },
        Step {
            title: "Joints 5 and 6: the plane–line quartic".into(),
            text: "Joint 4 keeps a plane's cosine to axis 4 and the signed distance of `p4` from \
                   it, so `E6 π` and axis 4 turned by `E5⁻¹` must reach both; each equation is \
                   linear in joint 5's turn, and eliminating it leaves a trigonometric \
                   polynomial of degree 2 in θ6 (a quartic in its half-angle tangent)."
                .into(),
            equations: vec![
                "n′ · a′ = h · h4,   n′ · (o′ − q′) = 0".into(),
                "n′ = R6 n,  q′ = E6 q,  a′ = R5ᵀ h4,  o′ = E5⁻¹ p4".into(),
                "F(θ6) = |b⊥|² P² + |a⊥|² Q² − 2 (a⊥ · b⊥) P Q − w² (1 − μ²) = 0".into(),
            ],
            after: "The roots go to four labelled slots by the sign of the two equations' \
                    Jacobian determinant and the side of `R5 h6` relative to the plane of \
                    axes 4 and 5 (`h4 × h5`)."
                .into(),
            numbers: vec![
                axis_line(5, arm.axis(4), arm.point(4)),
                axis_line(6, arm.axis(5), arm.point(5)),
                vec![
                    t("h · h4 = "),
                    Part::number(k.cos_4),
                    t(",  h4 × h5 = "),
                    Part::direction(k.side_normal),
                ],
            ],
        },
        Step {
            title: "Joint 4: Paden–Kahan subproblem 1".into(),
            text: "Joint 4 turns the normal `R5 R6 n` onto `h` about `h4`; both have the \
                   component `h · h4` along `h4`, so the parts ⟂ `h4` have the same length."
                .into(),
            equations: vec!["θ4 = atan2(h4 · (x⊥ × h), x⊥ · h),   x = R5 R6 n".into()],
            after: String::new(),
            numbers: Vec::new(),
        },
        Step {
            title: "Joints 1, 2, 3: the planar chain".into(),
            text: "The sum `Φ` is read on a direction `x ⟂ h`; axis 3's point `p3` must reach \
                   `w3 = G E6(−θ6) E5(−θ5) E4(−θ4) p3`, whose distance `d` from axis 1 sets \
                   joint 2 by the law of cosines; joint 1 turns the chain onto `w3` \
                   (subproblem 1) and joint 3 takes the rest of `Φ`."
                .into(),
            equations: vec![
                "Φ = atan2(h · (x × y), x · y),   y = R R6ᵀ R5ᵀ R4ᵀ x".into(),
                "d² = |L|² + |V|² + 2 |L| |V| cos ψ,   φ2 = φ0 ± ψ,   θ2 = s2 φ2".into(),
                "θ3 = s3 (Φ − θ1 − φ2)".into(),
            ],
            after: String::new(),
            numbers: vec![
                vec![
                    t("x = "),
                    Part::direction(k.across),
                    t(",  p3 = "),
                    Part::point(k.on_axis_3),
                ],
                vec![
                    t("|L| = "),
                    Part::length(len_1),
                    t(" (axis 1 to axis 2),  |V| = "),
                    Part::length(len_2),
                    t(" (axis 2 to axis 3)"),
                ],
                vec![
                    t("φ0 = "),
                    Part::angle(k.two_link.stretched),
                    t(",  s2 = "),
                    Part::number(k.two_link.sense),
                    t(",  s3 = "),
                    Part::number(k.sense3),
                ],
            ],
        },
    ];
    Steps {
        inputs: crate::family::data::INPUTS.to_string(),
        method,
        steps,
    }
}
