//! The review sheet's method and steps of a polar arm, with the constants its plan is built
//! from ([`super::plan::constants`]; joint 1 is the elbow family's).

use super::plan::{constants, Constants};
use crate::family::data::t;
use crate::family::data::{Part, Step, Steps};
use crate::family::decoupled_steps::decoupled;
use crate::family::elbow;
use crate::plan::vec3::num;
use crate::plan::Plan;

/// §3's bullet on joints 1–3.
const METHOD: &str = "**Joints 1–3 (polar family)**: joint 1 by *rotating a point into a \
    plane* (0–2 roots); the slide from the distance to axis 2 (a quadratic, 0–2 roots); joint \
    2 by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & Sastry 1994, §3.3).";

/// The method and the steps, as [`super::plan`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let k = constants(&plan.arm);
    let one = elbow::plan::constants(&plan.arm);
    decoupled(
        plan,
        METHOD,
        vec![elbow::steps::joint_one(&one), slide(&k), joint_two()],
    )
}

/// Joint 3, the slide, from the distance to axis 2.
fn slide(k: &Constants) -> Step {
    let pp = num::dot(&k.p, &k.p);
    Step {
        title: "Joint 3: the slide from the distance to axis 2".into(),
        text: "`P` is the wrist center's offset from axis 2 at zero (perpendicular to `h2`), \
               `u3` the slide's direction; the slide `s` moves the wrist center to `P + s u3`."
            .into(),
        equations: vec![
            "|P + s u3|² = d²".into(),
            "s = −m ± √(d² − (|P|² − m²)),  m = P · u3   (+ extended, − retracted)".into(),
            "θ3 = s".into(),
        ],
        after: String::new(),
        numbers: vec![
            vec![
                t("P = "),
                Part::point(k.p),
                t(",  u3 = "),
                Part::direction(k.u3),
            ],
            vec![
                t("m = "),
                Part::length(k.m),
                t(",  |P|² − m² = "),
                Part::Area((pp - k.m * k.m).max(0.0)),
            ],
        ],
    }
}

/// Joint 2 by Paden–Kahan subproblem 1.
fn joint_two() -> Step {
    Step {
        title: "Joint 2: rotate a point onto a point (Paden–Kahan 1)".into(),
        text: String::new(),
        equations: vec![
            "x  = P + s u3".into(),
            "θ2 = atan2(h2 · (x × w), x · w)".into(),
            "R1 R2 R3 = R(h1, θ1) R(h2, θ2)".into(),
        ],
        after: String::new(),
        numbers: Vec::new(),
    }
}
