//! The review sheet's method and steps of a tool-first arm: the mirroring, then the mirrored
//! arm's own family's method and steps (in its numbering, said so).

use crate::classify::Geometry;
use crate::family::data::{t, Part, Step, Steps};
use crate::plan::Plan;

/// The method and the steps, as [`super::plan::build`] builds them; `inner` is the mirrored
/// arm's classification and plan.
pub fn steps(plan: &Plan, inner: Option<(Geometry, Plan)>) -> Steps {
    let arm = &plan.arm;
    let (family, inner_steps) = match &inner {
        Some((g, p)) => (g.family.name(), Some(g.family.module().steps(p))),
        None => ("its", None),
    };
    let mut method = vec![
        "**Mirrored decoupling** (Pieper 1968, read from the tool end): with `G = B⁻¹ T M⁻¹ = \
         E1 ⋯ E6`, `G⁻¹ = E6(−θ6) ⋯ E1(−θ1)` and `E(h, −θ) = E(−h, θ)`, so `G⁻¹` is the forward \
         kinematics of the *mirrored arm*, whose joint `i` is joint `7 − i` about the reversed \
         axis, with the same value, and no base and no tool."
            .to_string(),
        format!(
            "The mirrored arm is solved whole by the **{family}** family's steps with the target \
             `G⁻¹`, and its solutions are read back in this arm's order (the values reversed). \
             Its method, in its own numbering:"
        ),
    ];
    let axis = |i: usize| {
        vec![
            t(&format!(
                "joint {} (the mirrored arm's {}): −h = ",
                i + 1,
                6 - i
            )),
            Part::direction(arm.axis(i).map(|x| -x)),
            t(",  p = "),
            Part::point(arm.point(i)),
        ]
    };
    let mut steps = vec![Step {
        title: "The mirrored arm and its target".into(),
        text: "The mirrored arm's joint `i` turns about `−h_{7−i}` through `p_{7−i}`; its target \
               is `G⁻¹`. The steps that follow are the mirrored arm's, in its numbering: its \
               joint `i` is this arm's joint `7 − i`, its `G` is this arm's `G⁻¹`."
            .into(),
        equations: vec![
            "G = B⁻¹ T M⁻¹,   G⁻¹ = E6(−θ6) E5(−θ5) E4(−θ4) E3(−θ3) E2(−θ2) E1(−θ1)".into(),
            "E'_i(θ) = E_{7−i}(−θ),   i = 1, …, 6".into(),
        ],
        after: String::new(),
        numbers: (0..6).rev().map(axis).collect(),
    }];
    let inputs = match inner_steps {
        Some(s) => {
            method.extend(s.method.into_iter().map(|m| format!("Mirrored arm: {m}")));
            steps.extend(s.steps.into_iter().map(|st| Step {
                title: format!("Mirrored arm: {}", st.title),
                ..st
            }));
            s.inputs
        }
        None => crate::family::data::INPUTS.to_string(),
    };
    Steps {
        inputs,
        method,
        steps,
    }
}
