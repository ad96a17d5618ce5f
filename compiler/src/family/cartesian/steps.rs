//! The review sheet's method and steps of a cartesian arm, with the inverse its plan holds
//! ([`super::plan::slides_inverse`]).

use crate::family::data::t;
use crate::family::data::{Part, Step, Steps};
use crate::family::decoupled_steps::decoupled;
use crate::plan::Plan;

/// §3's bullet on joints 1–3.
const METHOD: &str = "**Joints 1–3 (cartesian family)**: a 3×3 linear system, inverted once by \
    Cramer's rule when the solver is generated.";

/// The method and the steps, as [`super::plan`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let inv = super::plan::slides_inverse(&plan.arm);
    let row = |i: usize| {
        vec![
            t(&format!("θ{} = ", i + 1)),
            Part::direction(inv[i]),
            t(" · (c_t − c)"),
        ]
    };
    let slides = Step {
        title: "The slides: a linear system".into(),
        text: String::new(),
        equations: vec![
            "c_t − c = U s,  U = [u1 u2 u3]".into(),
            "s = U⁻¹ (c_t − c),  rows of U⁻¹ = (u2 × u3, u3 × u1, u1 × u2) / det U".into(),
            "R1 R2 R3 = I   (slides do not turn)".into(),
        ],
        after: String::new(),
        numbers: vec![
            vec![t("c = "), Part::point(plan.arm.wrist_center)],
            row(0),
            row(1),
            row(2),
        ],
    };
    decoupled(plan, METHOD, vec![slides])
}
