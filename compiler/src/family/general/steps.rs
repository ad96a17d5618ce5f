//! The review sheet's method and steps of a general arm, with the constants its plan is built
//! from ([`super::plan::constants`]): the quartic, or the quadratics when axes 1 and 2 meet or
//! are parallel ([`Layout`]).

use super::plan::{constants, Constants, Layout};
use crate::family::data::t;
use crate::family::data::{Part, Step, Steps};
use crate::family::decoupled_steps::decoupled;
use crate::plan::vec3::num;
use crate::plan::Plan;

/// §3's bullet on joints 1–3.
const METHOD: &str = "**Joints 1–3 (general family)**: joint 1 keeps the wrist center's \
    distance from a point of axis 1 and its height along axis 1; eliminating joint 2 from those \
    two equations leaves a **quartic** in the half-angle tangent of joint 3 (Pieper 1968), \
    solved by **Ferrari's method** with two Newton steps per root (0–4 roots); joints 2 and 1 \
    by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & Sastry 1994, §3.3).";

/// §3's bullet on joints 1–3 when joint 3 slides (the general-slide family).
const METHOD_SLIDE: &str = "**Joints 1–3 (general-slide family)**: joint 1 keeps the wrist \
    center's distance from a point of axis 1 and its height along axis 1; the slide moves the \
    wrist center along a line, so eliminating joint 2 leaves a **quartic** in the slide's value \
    `d3` (Pieper 1968), solved by **Ferrari's method** with two Newton steps per root (0–4 \
    roots), or a quadratic (axes 1 and 2 meeting) or a linear equation (axes 1 and 2 \
    parallel); joints 2 and 1 by **Paden–Kahan subproblems 1 and 2** (Paden 1986; Murray, Li & \
    Sastry 1994, §3.3).";

/// Joint 1 by subproblem 1, the same line for every general page.
const JOINT_1_LINE: &str =
    "θ1 = atan2(h1 · ((w − f1)⊥h1 × u), (w − f1)⊥h1 · u)     (the reference on axis 1)";

/// The method and the steps, as [`super::plan`] builds them.
pub fn steps(plan: &Plan) -> Steps {
    let k = constants(&plan.arm);
    let [three, two_one] = position_steps(&k);
    let method = if k.slide { METHOD_SLIDE } else { METHOD };
    decoupled(plan, method, vec![three, two_one, real_roots(&k)])
}

/// The two steps of the position problem for the lines of `k` (the quartic, or the
/// quadratics when its axes 1 and 2 meet or are parallel), in the general family's symbols;
/// the mid-wrist family shows them for its chain.
pub(crate) fn position_steps(k: &Constants) -> [Step; 2] {
    match (k.layout, k.slide) {
        (Layout::Skew, false) => quartic(k),
        (Layout::Meet, false) => meeting(k),
        (Layout::Parallel, false) => parallel(k),
        (layout, true) => super::slide_steps::steps(k, layout, JOINT_1_LINE),
    }
}

/// Which roots are real, and the labels.
fn real_roots(k: &Constants) -> Step {
    let normal = if k.layout == Layout::Parallel {
        "ℓ"
    } else {
        "n"
    };
    Step {
        title: "Which roots are real".into(),
        text: format!(
            "A complex pair of roots gives its real part (a root beyond reach, the nearest \
             value); every candidate is checked by its miss `|E1 E2 E3 c − c_t|`, zero for a \
             real root (at most 1 of the length tolerance). Labels: the shoulder is the side of \
             the plane through axis 1 ⟂ `{normal}` the wrist center (joint 1 undone) is on, the \
             elbow the sign of the position Jacobian; each root goes to the candidate of its \
             label (two roots with one label: the second to a label no root has)."
        ),
        equations: Vec::new(),
        after: String::new(),
        numbers: Vec::new(),
    }
}

/// The constants every general page lists.
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
            t(",  rc = "),
            Part::point(k.rc),
            t(",  rs = "),
            Part::point(k.rs),
        ],
    ]
}

fn meeting(k: &Constants) -> [Step; 2] {
    let mut numbers = listed(k);
    numbers.push(vec![
        t("K0 = "),
        Part::Area(num::dot(&k.r0, &k.r0) + num::dot(&k.rc, &k.rc)),
        t(",  K1 = "),
        Part::Area(2.0 * num::dot(&k.r0, &k.rc)),
        t(",  K2 = "),
        Part::Area(2.0 * num::dot(&k.r0, &k.rs)),
    ]);
    [
        Step {
            title: "Joint 3: axes 1 and 2 meet".into(),
            text: "Axes 1 and 2 meet at `f1`; `n = h1 × h2 / sin α`, `ℓ = h2 × n`. Joint 3 moves \
                   the wrist center to `r(θ3) = E3(θ3) c − f1 = r0 + cos θ3 rc + sin θ3 rs`. \
                   Joints 1 and 2 turn about lines through `f1`, so they keep the distance from \
                   it (Paden–Kahan subproblem 3): one equation in joint 3 alone, 0–2 roots."
                .into(),
            equations: vec![
                "u = c_t − f1,  ρ = |u|²,  ζ = h1 · u".into(),
                "|r(θ3)|² = K0 + K1 cos θ3 + K2 sin θ3 = ρ,  K0 = |r0|² + |rc|²,  K1 = 2 r0·rc,  \
                 K2 = 2 r0·rs"
                    .into(),
                "K1 cos θ3 + K2 sin θ3 = e := ρ − K0:  cos θ3 = (K1 e ∓ K2 k)/R²,  \
                 sin θ3 = (K2 e ± K1 k)/R²,  R² = K1² + K2²,  k = √max(R² − e², 0)"
                    .into(),
            ],
            after: String::new(),
            numbers,
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
                "θ2 = atan2(h2 · (r⊥h2 × z), r⊥h2 · z)     (turns r onto z about axis 2)".into(),
                "w − f1 = R2 r".into(),
                JOINT_1_LINE.into(),
            ],
            after: String::new(),
            numbers: Vec::new(),
        },
    ]
}

fn parallel(k: &Constants) -> [Step; 2] {
    [
        Step {
            title: "Joint 3: axes 1 and 2 parallel".into(),
            text: "Axes 1 and 2 are parallel, `a` apart along `n` (from `f1` on axis 1 to `f2` \
                   on axis 2), `ℓ = h2 × n`. Joint 3 moves the wrist center to `r(θ3) = \
                   E3(θ3) c − f2 = r0 + cos θ3 rc + sin θ3 rs`. Joints 1 and 2 keep its height \
                   along the axes: one equation in joint 3 alone, 0–2 roots."
                .into(),
            equations: vec![
                "u = c_t − f1,  ρ = |u|²,  ζ = h1 · u,  h1 = ±h2 (cos α = ±1)".into(),
                "h2 · r(θ3) = cos α ζ:  (h2·rc) cos θ3 + (h2·rs) sin θ3 = e := cos α ζ − h2·r0"
                    .into(),
                "cos θ3 = (A e ∓ B k)/R²,  sin θ3 = (B e ± A k)/R²,  A = h2·rc,  B = h2·rs,  \
                 R² = A² + B²,  k = √max(R² − e², 0)"
                    .into(),
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
                JOINT_1_LINE.into(),
            ],
            after: String::new(),
            numbers: Vec::new(),
        },
    ]
}

fn quartic(k: &Constants) -> [Step; 2] {
    [
        Step {
            title: "Joint 3: a quartic".into(),
            text: "`f1` is the foot on axis 1 of the common normal of axes 1 and 2, `a` its \
                   length, `n` its direction, `ℓ = h2 × n`, `α` the angle between the axes; \
                   joint 3 moves the wrist center to `r(θ3) = E3(θ3) c − f2 = r0 + cos θ3 rc + \
                   sin θ3 rs` (from the normal's foot `f2` on axis 2). Joint 1 keeps `ρ = |c_t − \
                   f1|²` and `ζ = h1 · (c_t − f1)`; joint 2 keeps `Z = h2 · r` and `|r|`."
                .into(),
            equations: vec![
                "u = c_t − f1,  ρ = |u|²,  ζ = h1 · u".into(),
                "X = (ρ − a² − |r|²) / (2a)         (= n · R2 r)".into(),
                "Y = (ζ − cos α Z) / sin α          (= m · R2 r,  m = (h1 − cos α h2)/sin α = μ ℓ)"
                    .into(),
                "F(θ3) = X² + Y² + Z² − |r|² = k0 + k1 cos θ3 + k2 sin θ3 + k3 cos 2θ3 + k4 sin 2θ3 = 0"
                    .into(),
                "t = tan((θ3 − γ)/2):  (1 + t²)² F = a4 t⁴ + a3 t³ + a2 t² + a1 t + a0,  a4 = F(γ + π)"
                    .into(),
                "γ ∈ {−π, −2π/3, …, 2π/3}: the one with the largest |F(γ + π)|".into(),
                "roots: Ferrari (resolvent cubic U³ + 2pU² + (p² − 4r)U − q² = 0, its largest root),"
                    .into(),
                "       then two Newton steps t ← t − P(t)/P′(t), each kept when it lowers |P|"
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
                "then one Newton step on (|w − f1|² − ρ, h1·(w − f1) − ζ) in (θ2, θ3), kept when \
                 it lowers the miss"
                    .into(),
                "w − f1 = (a + n·R2 r) n + (ℓ·R2 r) ℓ + Z h2".into(),
                JOINT_1_LINE.into(),
            ],
            after: String::new(),
            numbers: Vec::new(),
        },
    ]
}
