//! The review sheet's method and steps of a middle-slide arm, with the constants its plan is
//! built from ([`super::plan::constants`]): the quartic of a tilted slide, or joint 3 and a
//! quadratic of a level one ([`Layout`]).

use super::plan::{constants, Constants, Layout};
use crate::family::data::{axis_line, t};
use crate::family::data::{Part, Step, Steps};
use crate::family::decoupled_steps::decoupled;
use crate::plan::vec3::num;
use crate::plan::Plan;

/// §3's bullet on joints 1–3.
const METHOD: &str = "**Joints 1–3 (middle-slide family)**: joint 1 keeps the wrist center's \
    height along axis 1 and its distance from `p1`; the height is linear in the slide, which it \
    eliminates, and the distance leaves a **quartic** in the half-angle tangent of joint 3 \
    (Pieper 1968), solved by **Ferrari's method** (0–4 roots); with the slide ⟂ axis 1 the \
    height holds joint 3 alone (0–2 roots) and the distance is a quadratic in the slide (0–2 \
    each). One guarded Newton step per root; joint 1 by **Paden–Kahan subproblem 1** (Paden \
    1986; Murray, Li & Sastry 1994, §3.3).";

/// The method and the steps, as [`super::plan`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let k = constants(&plan.arm);
    let three = match k.layout {
        Layout::Tilted => tilted(&k),
        Layout::Level => level(&k),
    };
    decoupled(plan, METHOD, vec![three, joint_one(&k)])
}

/// The equations both layouts start from.
fn setup() -> Vec<String> {
    vec![
        "x(d2, θ3) = P(θ3) + d2 e2,  P(θ3) = p3 − p1 + E3(θ3) c − p3 = p0 + cos θ3 pc + sin θ3 ps"
            .into(),
        "u = c_t − p1,  ζ = h1 · u,  ρ = |u|²,  k = h1 · e2".into(),
        "(1)  h1 · P(θ3) + k d2 = ζ".into(),
        "(2)  |P(θ3)|² + 2 d2 e2 · P(θ3) + d2² = ρ".into(),
    ]
}

/// The constants both layouts list.
fn listed(k: &Constants) -> Vec<Vec<Part>> {
    vec![
        axis_line(1, k.h1, k.p1),
        vec![
            t("e2 = "),
            Part::direction(k.e2),
            t(",  k = h1 · e2 = "),
            Part::number(k.k),
        ],
        axis_line(3, k.h3, k.p3),
        vec![
            t("p0 = "),
            Part::point(k.p0),
            t(",  pc = "),
            Part::point(k.pc),
            t(",  ps = "),
            Part::point(k.ps),
        ],
    ]
}

const TEXT: &str = "Joint 1 turns about axis 1, so it keeps the wrist center's height along \
    `h1` and its distance from `p1`. With joint 1 undone, the slide moves the wrist center by \
    `d2 e2` and joint 3 turns it on a circle: `p0 = p3 − p1 + (h3·(c − p3)) h3`, \
    `pc = (c − p3)⊥h3`, `ps = h3 × (c − p3)`.";

fn tilted(k: &Constants) -> Step {
    let mut equations = setup();
    equations.extend([
        "d2(θ3) = (ζ − h1 · P(θ3)) / k".to_string(),
        "F(θ3) = |P|² + 2 d2 (e2 · P) + d2² − ρ = k0 + k1 cos θ3 + k2 sin θ3 + k3 cos 2θ3 + \
         k4 sin 2θ3 = 0"
            .to_string(),
        "t = tan((θ3 − γ)/2):  a quartic in t, Ferrari's method, two Newton steps per root"
            .to_string(),
    ]);
    Step {
        title: "Joint 3 and the slide: a quartic".into(),
        text: format!(
            "{TEXT} The slide is not ⟂ axis 1, so (1) gives the slide as a function of joint 3; \
             put into (2), it leaves one trigonometric equation of degree 2 in joint 3: up to 4 \
             roots (Pieper 1968)."
        ),
        equations,
        after: "A complex pair of roots gives its real part, which misses the target: every \
                candidate is checked by its residual `|E1 E2 E3 c − c_t|` (at most the length \
                tolerance for a real root)."
            .into(),
        numbers: listed(k),
    }
}

fn level(k: &Constants) -> Step {
    let mut equations = setup();
    equations.extend([
        "k = 0:  (h1·pc) cos θ3 + (h1·ps) sin θ3 = ζ − h1·p0     (two roots)".to_string(),
        "d2 = −β ± √(β² − γ),  β = e2 · P(θ3),  γ = |P(θ3)|² − ρ".to_string(),
    ]);
    let mut numbers = listed(k);
    numbers.push(vec![
        t("h1·pc = "),
        Part::length(num::dot(&k.h1, &k.pc)),
        t(",  h1·ps = "),
        Part::length(num::dot(&k.h1, &k.ps)),
        t(",  h1·p0 = "),
        Part::length(num::dot(&k.h1, &k.p0)),
    ]);
    Step {
        title: "Joint 3 from the height, the slide from the distance".into(),
        text: format!(
            "{TEXT} The slide is ⟂ axis 1, so it keeps the height: (1) holds joint 3 alone, and \
             for each of its two roots (2) is a quadratic in the slide: up to 2 × 2 = 4."
        ),
        equations,
        after: "A root beyond reach gives the nearest value, which misses the target: every \
                candidate is checked by its residual `|E1 E2 E3 c − c_t|`."
            .into(),
        numbers,
    }
}

/// Joint 1 by Paden–Kahan subproblem 1, and the labels.
fn joint_one(k: &Constants) -> Step {
    Step {
        title: "Joint 1 and the labels".into(),
        text: "Joint 1 turns `x` onto `u` about axis 1 (Paden–Kahan subproblem 1; the \
               reference on axis 1). Labels: the shoulder is the side of the plane through `p1` \
               ⟂ `e2` the wrist center (joint 1 undone) is on, the elbow the sign of the \
               position Jacobian; each root goes to the candidate of its label (two roots with \
               one label: the second to a label no root has)."
            .into(),
        equations: vec![
            "θ1 = atan2(h1 · (x⊥h1 × u), x⊥h1 · u)".into(),
            "shoulder: sign(e2 · x),  elbow: sign((h1 × x) · (e2 × P′(θ3))),  P′ = cos θ3 ps − \
             sin θ3 pc"
                .into(),
            "R1 R2 R3 = R(h1, θ1) R(h3, θ3)   (the slide does not turn)".into(),
        ],
        after: String::new(),
        numbers: vec![vec![
            t("Facing when sign(e2 · x) = "),
            Part::number(k.facing),
            t(",  Up when the Jacobian's sign = "),
            Part::number(k.up),
        ]],
    }
}
