//! The review sheet's method and steps of a three-parallel arm, with the plan's constants
//! ([`Layout`]).

use super::plan::Layout;
use crate::family::data::{axis_line, t, Part, Step, Steps};
use crate::plan::vec3::num;
use crate::plan::Plan;

/// The method and the steps, as the plan builds them.
pub fn steps(plan: &Plan) -> Steps {
    let arm = &plan.arm;
    let k = Layout::of(arm);
    let (h1, p1) = (arm.axis(0), arm.point(0));
    let (h5, h6) = (arm.axis(4), arm.axis(5));
    let c56 = num::dot(&h5, &h6);
    let h6_perp = num::sub(&h6, &num::scale(&h5, c56));
    let a5 = num::dot(&h6_perp, &k.h);
    let b5 = num::dot(&num::cross(&h5, &h6), &k.h);
    let shift = c56 * num::dot(&h5, &k.h);
    let method = vec![
        "**Three parallel axes** (Pieper 1968: parallel axes meet at infinity): joints 2–4 \
         turn about lines parallel to `h = h2`, so they keep every point's component along `h` \
         and turn every direction about `h` by the sum `Φ = θ2 + θ3 + θ4`. Axes 5 and 6 meet \
         in `q`, which joints 5 and 6 never move."
            .to_string(),
        "**Joint 1** by *rotating a point into a plane* (`a cos θ + b sin θ = e`, 0–2 roots): \
         `h · E1(−θ1) G q = h · q`."
            .to_string(),
        "**Joint 5** by rotating into a plane again (0–2 roots): `h · R5 h6 = h6 · w`, \
         `w = Rᵀ R1 h`; **joint 6** by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & \
         Sastry 1994, §3.3), turning `w` onto `R5ᵀ h` about `h6`."
            .to_string(),
        "**Joints 2–4** as a planar three-joint chain: the sum `Φ` from the orientation, \
         joints 2 and 3 by the **law of cosines** placing axis 4 (0–2 roots), joint 4 the rest \
         of `Φ`. Up to 2 × 2 × 2 = 8 solutions; no step iterates (§9)."
            .to_string(),
    ];
    let steps = vec![
        Step {
            title: "The target and the meeting point of axes 5 and 6".into(),
            text: "`G = B⁻¹ T M⁻¹ = E1 ⋯ E6` (rotation `R`); `q` is where axes 5 and 6 meet at \
                   zero; `G q` is where the target puts it."
                .into(),
            equations: vec!["G = B⁻¹ T M⁻¹,   q_t = G q".into()],
            after: String::new(),
            numbers: vec![
                vec![t("q = "), Part::point(k.meeting)],
                vec![t("h = "), Part::direction(k.h), t(" (axes 2–4)")],
            ],
        },
        Step {
            title: "Joint 1: the parallel planes".into(),
            text: "Joints 2–6 keep `q`'s component along `h` (joints 5 and 6 do not move `q`, \
                   joints 2–4 move it in planes ⟂ `h`), so undoing joint 1 must bring `q_t` to \
                   the same component."
                .into(),
            equations: vec![
                "h · (E1(−θ1) q_t − p1) = h · (q − p1)".into(),
                "a cos θ1 + b sin θ1 = e,   u = q_t − p1".into(),
                "a = (h − (h1·h) h1) · u,  b = (h1 × h) · u,  e = h·(q − p1) − (h1·h)(h1·u)".into(),
                "cos θ1 = (a e − σ b k) / r²,  sin θ1 = (b e + σ a k) / r²,  r² = a² + b², \
                 k = √(r² − e²),  σ = ±1"
                    .into(),
            ],
            after: String::new(),
            numbers: vec![
                axis_line(1, h1, p1),
                vec![
                    t("h · (q − p1) = "),
                    Part::length(num::dot(&k.h, &num::sub(&k.meeting, &p1))),
                    t(",  h1 · h = "),
                    Part::number(num::dot(&h1, &k.h)),
                ],
            ],
        },
        Step {
            title: "Joints 5 and 6: the orientation".into(),
            text: "`w = Rᵀ R1 h` is the parallel axes' direction seen from the tool, \
                   `w = R6ᵀ R5ᵀ h`; joint 6 keeps the component along `h6`."
                .into(),
            equations: vec![
                "a5 cos θ5 + b5 sin θ5 = h6 · w − (h5·h6)(h5·h)".into(),
                "a5 = (h6 − (h5·h6) h5) · h,  b5 = (h5 × h6) · h".into(),
                "θ6: turn w⊥ onto (R5ᵀ h)⊥ about h6 (subproblem 1)".into(),
            ],
            after: String::new(),
            numbers: vec![
                vec![
                    t("h5 = "),
                    Part::direction(h5),
                    t(",  h6 = "),
                    Part::direction(h6),
                ],
                vec![
                    t("a5 = "),
                    Part::number(a5),
                    t(",  b5 = "),
                    Part::number(b5),
                    t(",  (h5·h6)(h5·h) = "),
                    Part::number(shift),
                ],
            ],
        },
        planar_chain_step(&k, ""),
    ];
    Steps {
        inputs: crate::family::data::INPUTS.to_string(),
        method,
        steps,
    }
}

/// The review step of joints 2–4 (this family's and the offset-hand family's), with the plan's
/// constants; `lead` opens its text.
pub(crate) fn planar_chain_step(k: &Layout, lead: &str) -> Step {
    let (upper, fore) = k.two_link.lengths();
    Step {
        title: "Joints 2, 3, 4: the planar chain".into(),
        text: format!(
            "{lead}The sum `Φ` is read on a direction `x ⟂ h`; the point `o4` of axis 4 \
             must reach `w4 = E1(−θ1) G E6(−θ6) E5(−θ5) o4`, whose distance `d` from axis \
             2 sets joint 3 by the law of cosines; joint 2 turns the chain onto `w4` \
             (subproblem 1) and joint 4 takes the rest of `Φ`."
        ),
        equations: vec![
            "Φ = atan2(h · (x × y), x · y),   y = R1ᵀ R R6ᵀ R5ᵀ x".into(),
            "d² = |L|² + |V|² + 2 |L| |V| cos ψ,   φ3 = φ0 ± ψ,   θ3 = s3 φ3".into(),
            "θ4 = s4 (Φ − θ2 − φ3)".into(),
        ],
        after: String::new(),
        numbers: vec![
            vec![
                t("x = "),
                Part::direction(k.across),
                t(",  o4 = "),
                Part::point(k.on_axis_4),
            ],
            vec![
                t("|L| = "),
                Part::length(upper),
                t(" (axis 2 to axis 3),  |V| = "),
                Part::length(fore),
                t(" (axis 3 to axis 4)"),
            ],
            vec![
                t("φ0 = "),
                Part::angle(k.two_link.stretched),
                t(",  s3 = "),
                Part::number(k.two_link.sense),
                t(",  s4 = "),
                Part::number(k.sense4),
            ],
        ],
    }
}
