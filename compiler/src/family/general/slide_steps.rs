//! The review sheet's steps of joints 1–3 when joint 3 slides (the general-slide family,
//! [`super::slide`]), read from the plan's constants ([`super::plan::constants`]): the
//! slide's equations as [`super::plan`] and [`super::axes_1_2`] build them.

use super::plan::{Constants, Layout};
use crate::family::data::t;
use crate::family::data::{Part, Step};
use crate::plan::vec3::num;

/// The constants every general-slide page lists.
fn listed(k: &Constants) -> Vec<Vec<Part>> {
    vec![
        vec![
            t("f1 = "),
            Part::point(k.f1),
            t(",  n = "),
            Part::direction(k.n),
            t(",  ℓ = "),
            Part::direction(k.ell),
        ],
        vec![
            t("a  = "),
            Part::length(k.a),
            t(",  cos α = "),
            Part::number(k.cos_a),
            t(",  sin α = "),
            Part::number(k.sin_a),
            t(",  μ = "),
            Part::number(k.mu),
        ],
        vec![
            t("r0 = "),
            Part::point(k.r0),
            t(",  e3 = "),
            Part::direction(k.rs),
            t(",  r0·e3 = "),
            Part::length(num::dot(&k.r0, &k.rs)),
            t(",  h2·e3 = "),
            Part::number(num::dot(&k.h2, &k.rs)),
        ],
    ]
}

/// The two steps of the position problem (joint 3, then joints 2 and 1) for `layout`.
pub(super) fn steps(k: &Constants, layout: Layout, joint_1_line: &str) -> [Step; 2] {
    let line = "Joint 3 slides along `e3` (fixed in link 2), so it moves the wrist center on a \
                line: `r(d3) = c − f2 + d3 e3 = r0 + d3 e3` (from `f2`, the foot on axis 2 of \
                the common normal of axes 1 and 2).";
    match layout {
        Layout::Skew => [
            Step {
                title: "Joint 3: a quartic in the slide".into(),
                text: format!(
                    "{line} Joint 1 keeps `ρ = |c_t − f1|²` and `ζ = h1 · (c_t − f1)`; joint 2 \
                     keeps `Z = h2 · r` and `|r|`. `Z`, `Y` are linear in `d3`, `|r|²` and `X` \
                     quadratic: `4a² F` is a monic quartic."
                ),
                equations: vec![
                    "u = c_t − f1,  ρ = |u|²,  ζ = h1 · u".into(),
                    "|r|² = |r0|² + 2 (r0·e3) d3 + d3²,  Z = h2·r0 + (h2·e3) d3".into(),
                    "W = 2aX = ρ − a² − |r|²,  Y = (ζ − cos α Z) / sin α".into(),
                    "4a² F(d3) = W² + 4a² (Y² + Z² − |r|²) = d3⁴ + c3 d3³ + c2 d3² + c1 d3 + c0 = 0"
                        .into(),
                    "roots: Ferrari (resolvent cubic U³ + 2pU² + (p² − 4r)U − q² = 0, its largest \
                     root), then two Newton steps d ← d − P(d)/P′(d), each kept when it lowers |P|"
                        .into(),
                ],
                after: String::new(),
                numbers: listed(k),
            },
            Step {
                title: "Joints 2 and 1: Paden–Kahan subproblem 1".into(),
                text: String::new(),
                equations: vec![
                    "θ2 = atan2((n·r) μY − (ℓ·r) X, (n·r) X + (ℓ·r) μY)      (r⊥h2 onto (X, μY))"
                        .into(),
                    "then one Newton step on (|w − f1|² − ρ, h1·(w − f1) − ζ) in (θ2, d3), kept \
                     when it lowers the miss"
                        .into(),
                    "w − f1 = (a + n·R2 r) n + (ℓ·R2 r) ℓ + Z h2".into(),
                    joint_1_line.into(),
                ],
                after: String::new(),
                numbers: Vec::new(),
            },
        ],
        Layout::Meet => [
            Step {
                title: "Joint 3: axes 1 and 2 meet, a quadratic in the slide".into(),
                text: format!(
                    "{line} Axes 1 and 2 meet at `f1`; joints 1 and 2 turn about lines through \
                     it, so they keep the distance from it: one equation in the slide alone, \
                     0–2 roots."
                ),
                equations: vec![
                    "u = c_t − f1,  ρ = |u|²,  ζ = h1 · u".into(),
                    "|r(d3)|² = d3² + 2 (r0·e3) d3 + |r0|² = ρ".into(),
                    "d3 = −r0·e3 ± √max((r0·e3)² − |r0|² + ρ, 0)".into(),
                ],
                after: String::new(),
                numbers: listed(k),
            },
            Step {
                title: "Joints 2 and 1: Paden–Kahan subproblems 2 and 1".into(),
                text: String::new(),
                equations: vec![
                    "Z = h2 · r,  α' = (cos α Z − ζ)/(cos² α − 1),  β' = (cos α ζ − Z)/(cos² α − 1)"
                        .into(),
                    "γ' = ±√max((|r|² − α'² − β'² − 2 α'β' cos α) / sin² α, 0)".into(),
                    "z = α' h1 + β' h2 + γ' (h1 × h2)      (the wrist center between the two turns)"
                        .into(),
                    "θ2 = atan2(h2 · (r⊥h2 × z), r⊥h2 · z)     (turns r onto z about axis 2)"
                        .into(),
                    "w − f1 = R2 r".into(),
                    joint_1_line.into(),
                ],
                after: String::new(),
                numbers: Vec::new(),
            },
        ],
        Layout::Parallel => [
            Step {
                title: "Joint 3: axes 1 and 2 parallel, the height fixes the slide".into(),
                text: format!(
                    "{line} Axes 1 and 2 are parallel, `a` apart along `n`; joints 1 and 2 keep \
                     the wrist center's height along them, and the slide is not ⟂ them: one \
                     root."
                ),
                equations: vec![
                    "u = c_t − f1,  ρ = |u|²,  ζ = h1 · u,  h1 = ±h2 (cos α = ±1)".into(),
                    "h2 · r(d3) = cos α ζ:  d3 = (cos α ζ − h2·r0) / (h2·e3)".into(),
                ],
                after: String::new(),
                numbers: listed(k),
            },
            Step {
                title: "Joints 2 and 1: the law of cosines, Paden–Kahan subproblem 1".into(),
                text: String::new(),
                equations: vec![
                    "X = (ρ − ζ² − a² − |r⊥h2|²) / (2a)     (= n · R2 r)".into(),
                    "Y = ±√max(|r⊥h2|² − X², 0)           (= ℓ · R2 r)".into(),
                    "θ2 = atan2((n·r) Y − (ℓ·r) X, (n·r) X + (ℓ·r) Y)".into(),
                    "w − f1 = (a + n·R2 r) n + (ℓ·R2 r) ℓ + Z h2".into(),
                    joint_1_line.into(),
                ],
                after: String::new(),
                numbers: Vec::new(),
            },
        ],
    }
}
