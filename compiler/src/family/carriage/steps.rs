//! The review sheet's method and steps of a carriage arm, with the constants its plan is
//! built from ([`super::plan::constants`]).

use super::plan::{constants, Constants};
use crate::family::data::{axis_line, t};
use crate::family::data::{Part, Step, Steps};
use crate::family::decoupled_steps::decoupled;
use crate::plan::Plan;

/// §3's bullet on joints 1–3.
const METHOD: &str = "**Joints 1–3 (carriage family)**: the slides keep the wrist center's \
    height across them, so joint 3 alone sets it: one equation `a cos θ3 + b sin θ3 = e` (0–2 \
    roots); the slides carry the rest, solved with their dual directions.";

/// The method and the steps, as [`super::plan`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let k = constants(&plan.arm);
    decoupled(plan, METHOD, vec![turn(&k), slides(&k)])
}

/// Joint 3 from the height across the slides.
fn turn(k: &Constants) -> Step {
    Step {
        title: "Joint 3: the height across the slides".into(),
        text: "The slides move the wrist center within planes parallel to both; only joint 3 \
               changes its height along their normal `n`. Joint 3 turns it on a circle about \
               axis 3 (center `hub`, radius vector `v⊥`), so the height is one trigonometric \
               equation in joint 3."
            .into(),
        equations: vec![
            "n = e1 × e2 / |e1 × e2|".into(),
            "E3(θ3) c = hub + cos θ3 v⊥ + sin θ3 (h3 × v⊥)".into(),
            "e = n · c_t − k0,  k0 = n · hub,  a = n · v⊥,  b = n · (h3 × v⊥),  R² = a² + b²"
                .into(),
            "a cos θ3 + b sin θ3 = e".into(),
            "cos θ3 = (a e ∓ b √(R² − e²)) / R²,  sin θ3 = (b e ± a √(R² − e²)) / R²".into(),
        ],
        after: "Real when `|e| ≤ R`; the two roots merge where `|e| = R` (joint 3 at `φ = \
                atan2(b, a)` or `φ + π`). Label: `Up` where `sin(θ3 − φ)` has the zero \
                configuration's sign."
            .into(),
        numbers: vec![
            axis_line(3, k.h3, k.p3),
            vec![t("n = "), Part::direction(k.n)],
            vec![
                t("hub = "),
                Part::point(k.hub),
                t(",  v⊥ = "),
                Part::point(k.spoke),
            ],
            vec![
                t("k0 = "),
                Part::length(k.k0),
                t(",  a = "),
                Part::length(k.a),
                t(",  b = "),
                Part::length(k.b),
                t(",  R = "),
                Part::length(k.swing),
                t(",  φ = "),
                Part::angle(k.phase),
            ],
        ],
    }
}

/// The slides from what is left.
fn slides(k: &Constants) -> Step {
    Step {
        title: "Joints 1 and 2: the slides carry the rest".into(),
        text: "With joint 3 known, the rest `δ` lies in the plane of the slides; the dual \
               directions `f1`, `f2` (`fi · ej` = 1 when `i = j`, else 0) read the two slides \
               off it. Slides do not turn: the wrist's rotation before joint 4 is joint 3's."
            .into(),
        equations: vec![
            "δ = c_t − E3(θ3) c".into(),
            "g = e1 · e2,  f1 = (e1 − g e2) / (1 − g²),  f2 = (e2 − g e1) / (1 − g²)".into(),
            "d1 = f1 · δ,  d2 = f2 · δ".into(),
            "R1 R2 R3 = R(h3, θ3)".into(),
        ],
        after: String::new(),
        numbers: vec![
            vec![
                t("e1 = "),
                Part::direction(k.e1),
                t(",  e2 = "),
                Part::direction(k.e2),
            ],
            vec![
                t("f1 = "),
                Part::direction(k.f1),
                t(",  f2 = "),
                Part::direction(k.f2),
            ],
        ],
    }
}
