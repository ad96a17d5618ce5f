//! The review sheet's method and steps of a base-parallel arm, with the plan's constants
//! ([`Layout`]).

use super::axes_4_5::{Meeting, Parallel, Placement};
use super::plan::Layout;
use crate::family::data::{axis_line, t, Part, Step, Steps};
use crate::plan::Plan;

/// The method and the steps, as the plan builds them.
pub fn steps(plan: &Plan) -> Steps {
    match Placement::of_plan(plan) {
        Placement::Apart => apart(plan),
        placement => axes_4_5(plan, placement),
    }
}

/// Axes 4 and 5 apart: the plane–line quartic.
fn apart(plan: &Plan) -> Steps {
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

/// The first step (the target and the height to keep) and the last (joints 1–3), shared by
/// the two placements of [`axes_4_5`].
fn target_and_chain(plan: &Plan, kept: &str, point: [f64; 3]) -> (Step, Step) {
    let arm = &plan.arm;
    let k = Layout::of(arm);
    let (len_1, len_2) = k.two_link.lengths();
    let target = Step {
        title: format!("The target and the height of {kept}"),
        text: format!(
            "`G = B⁻¹ T M⁻¹ = E1 ⋯ E6` (rotation `R`); joints 1–3 keep heights along `h` and \
             turn about it, so `R4 R5 R6 n = h` with `n = Rᵀ h`, and {kept} `x`, kept by joint \
             4, must stay at its height: `n · (E6⁻¹ E5⁻¹ x − q) = 0`, `q = G⁻¹ x`."
        ),
        equations: vec!["G = B⁻¹ T M⁻¹,   n = Rᵀ h,   q = G⁻¹ x".into()],
        after: String::new(),
        numbers: vec![
            vec![t("h = "), Part::direction(k.h), t(" (axes 1–3)")],
            vec![t("x = "), Part::point(point)],
        ],
    };
    let chain = Step {
        title: "Joints 1, 2, 3: the planar chain".into(),
        text: "As for every base-parallel arm: the sum `Φ` read on a direction `x ⟂ h`, axis \
               3's point placed by joints 1 and 2 (law of cosines), joint 3 the rest of `Φ`."
            .into(),
        equations: vec![
            "Φ = atan2(h · (x × y), x · y),   y = R R6ᵀ R5ᵀ R4ᵀ x".into(),
            "d² = |L|² + |V|² + 2 |L| |V| cos ψ,   φ2 = φ0 ± ψ,   θ3 = s3 (Φ − θ1 − φ2)".into(),
        ],
        after: String::new(),
        numbers: vec![vec![
            t("|L| = "),
            Part::length(len_1),
            t(",  |V| = "),
            Part::length(len_2),
            t(",  φ0 = "),
            Part::angle(k.two_link.stretched),
        ]],
    };
    (target, chain)
}

/// Axes 4 and 5 meeting or parallel: joint 6 from one equation, then joints 4 and 5.
fn axes_4_5(plan: &Plan, placement: Placement) -> Steps {
    let arm = &plan.arm;
    let joint_6_equation = "a cos θ6 + b sin θ6 = e,   cos θ6 = (a e ∓ b k) / r²,   sin θ6 = \
                            (b e ± a k) / r²,   r² = a² + b²,   k = √(r² − e²)";
    let (method, steps) = if placement == Placement::Meeting {
        let c = Meeting::of(arm);
        let (target, chain) =
            target_and_chain(plan, "the meeting point `m` of axes 4 and 5", c.meet);
        let method = vec![
            "**Three parallel axes at the base, axes 4 and 5 meeting** (Pieper 1968): joints 4 \
             and 5 keep the meeting point `m`, so its height along `h` depends on joint 6 \
             alone: one equation `a cos θ6 + b sin θ6 = e` (2 roots)."
                .to_string(),
            "**Joints 4 and 5** by **Paden–Kahan subproblem 2** (Paden 1986; Murray, Li & \
             Sastry 1994, §3.2): `R4 R5 w = h`, `w = R6 n` (2 roots)."
                .to_string(),
            "**Joints 1–3** as a planar three-joint chain (law of cosines). Up to 2 × 2 × 2 = 8 \
             solutions; no step iterates (§9)."
                .to_string(),
        ];
        let six = Step {
            title: "Joint 6: the height of the meeting point".into(),
            text: "`E6⁻¹ m = p6 + R6ᵀ v`, `v = m − p6`, and `n · R6ᵀ v = (R6 n) · v`: one \
                   equation in joint 6; the shoulder label is its root (facing where \
                   `−a sin θ6 + b cos θ6 ≤ 0`)."
                .into(),
            equations: vec![
                "a = n · v⊥,   b = n · (v × h6),   e = n · (q − p6) − (h6 · n)(h6 · v)".into(),
                joint_6_equation.into(),
            ],
            after: String::new(),
            numbers: vec![
                axis_line(6, arm.axis(5), arm.point(5)),
                vec![
                    t("v⊥ = "),
                    Part::point(c.from_6_across),
                    t(",  h6 · v = "),
                    Part::length(c.from_6_along),
                ],
            ],
        };
        let four_five = Step {
            title: "Joints 4 and 5: Paden–Kahan subproblem 2".into(),
            text: "`z = R5 w = R4ᵀ h` lies on two cones: `h4 · z = h4 · h` and `h5 · z = h5 · w`; \
                   θ5 turns `w` onto `z` about `h5`, θ4 turns `z` onto `h` about `h4` (both \
                   subproblem 1). The wrist label is the sign of `γ`."
                .into(),
            equations: vec![
                "z = α h4 + β h5 ± γ (h4 × h5),   α = (h4·h − c h5·w) / (1 − c²),   β = (h5·w − \
                 c h4·h) / (1 − c²)"
                    .into(),
                "γ² (1 − c²) = |h5 × w|² − (h4·h − c h5·w)² / (1 − c²),   c = h4 · h5".into(),
            ],
            after: String::new(),
            numbers: vec![
                axis_line(4, arm.axis(3), arm.point(3)),
                axis_line(5, arm.axis(4), arm.point(4)),
                vec![
                    t("c = "),
                    Part::number(c.cos_45),
                    t(",  h4 · h = "),
                    Part::number(c.cos_4),
                ],
            ],
        };
        (method, vec![target, six, four_five, chain])
    } else {
        let c = Parallel::of(arm);
        let (target, chain) = target_and_chain(plan, "axis 4's point `p4`", arm.point(3));
        let method = vec![
            "**Three parallel axes at the base, axes 4 and 5 parallel** (Pieper 1968): joints 4 \
             and 5 turn about `g = h4` by `ψ = θ4 + s5 θ5`, so `g · R6 n = g · h`: one \
             equation in joint 6 (2 roots)."
                .to_string(),
            "**The sum ψ** by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & Sastry \
             1994, §3.3), then **joint 5** from the height of axis 4's point (2 roots), \
             `θ4 = ψ − s5 θ5`."
                .to_string(),
            "**Joints 1–3** as a planar three-joint chain (law of cosines). Up to 2 × 2 × 2 = 8 \
             solutions; no step iterates (§9)."
                .to_string(),
        ];
        let six = Step {
            title: "Joint 6: the direction along axes 4 and 5".into(),
            text: "`R4 R5` keeps `g`, so `R6 n` must make the angle of `h` with `g`: one \
                   equation in joint 6 (scaled by the arm's size `L`); the shoulder label is its \
                   root (facing where `−a sin θ6 + b cos θ6 ≤ 0`)."
                .into(),
            equations: vec![
                "a = L n · g⊥,   b = L n · (g × h6),   e = L (g · h − (h6 · g)(h6 · n))".into(),
                joint_6_equation.into(),
            ],
            after: String::new(),
            numbers: vec![
                axis_line(6, arm.axis(5), arm.point(5)),
                vec![
                    t("g = "),
                    Part::direction(c.g),
                    t(",  g · h = "),
                    Part::number(c.cos_g),
                    t(",  h6 · g = "),
                    Part::number(c.g_along),
                    t(",  L = "),
                    Part::length(arm.scale),
                ],
            ],
        };
        let four_five = Step {
            title: "Joints 4 and 5: the sum and the height of axis 4's point".into(),
            text: "ψ turns `w = R6 n` onto `h` about `g` (subproblem 1); axis 4's point must keep \
                   its height: `(R5 w) · d = n · (q − p6) − w · (p5 − p6)`, one equation in \
                   joint 5 (the wrist label is its root, leading where its derivative is \
                   `≤ 0`); joint 4 takes the rest of ψ."
                .into(),
            equations: vec![
                "ψ = atan2(g · (w⊥ × h), w⊥ · h)".into(),
                "a5 = w · d⊥,  b5 = w · (d × h5),  e5 = n · (q − p6) − w · (p5 − p6) − (h5 · w)(h5 \
                 · d)"
                    .into(),
                "θ4 = ψ − s5 θ5".into(),
            ],
            after: String::new(),
            numbers: vec![
                axis_line(4, arm.axis(3), arm.point(3)),
                axis_line(5, arm.axis(4), arm.point(4)),
                vec![
                    t("d = p4 − p5 = "),
                    Part::point(c.d),
                    t(",  s5 = "),
                    Part::number(c.sense5),
                ],
            ],
        };
        (method, vec![target, six, four_five, chain])
    };
    Steps {
        inputs: crate::family::data::INPUTS.to_string(),
        method,
        steps,
    }
}
