//! The review sheet's pages every family with a spherical wrist at joints 4–6 shares
//! (kinematic decoupling): the opening of §3, the wrist-center target (§4.1) and the wrist
//! (the last step), with the plan's own constants ([`crate::plan::decouple`],
//! [`crate::plan::wrist::WristAxes`]). A family adds its method bullet and its steps for
//! joints 1–3 ([`decoupled`]).

use crate::family::data::{t, Part, Step, Steps};
use crate::plan::vec3::num;
use crate::plan::wrist::WristAxes;
use crate::plan::Plan;

/// §4's inputs and symbols for a decoupled arm (followed by the length unit).
pub const INPUTS: &str = "Inputs: the target pose `T` (rotation `R_T`, translation `t_T`, \
    world frame) and two reference angles (the current joints 1 and 4 in `solve_near`, zero \
    otherwise), used only where a joint is free (§6). Symbols: `h_i` axis of joint i, `p_i` its \
    point nearest the base origin, `θ_i` its model value (§1), `c` the wrist center at zero, \
    `E_i(θ)` the motion of joint i, `R_i` its rotation, `x⊥h` the part of `x` perpendicular to \
    `h`.";

/// The review pages of a decoupled arm: `method` says how joints 1–3 are solved (one bullet),
/// `position` are their steps, between the wrist-center target and the wrist.
pub fn decoupled(plan: &Plan, method: &str, position: Vec<Step>) -> Steps {
    let mut steps = vec![wrist_center(plan)];
    steps.extend(position);
    steps.push(wrist(plan));
    Steps {
        inputs: INPUTS.to_string(),
        method: vec![
            "**Kinematic decoupling** (Pieper 1968): the axes of joints 4–6 meet in the wrist \
             center `c`, so joints 4–6 never move it. Its target position depends on joints \
             1–3 only; they are solved first, then joints 4–6 for each of their solutions."
                .to_string(),
            method.to_string(),
            "**Joints 4–6 (spherical wrist)**: joints 4 and 5 by **Paden–Kahan subproblem 2** \
             (two rotations taking axis 6 onto its target direction, 0–2 solutions), joint 6 \
             by subproblem 1."
                .to_string(),
            "No step iterates: the operation count is fixed (§9).".to_string(),
        ],
        steps,
    }
}

/// §4.1: the wrist-center target, from the plan's wrist center and frames.
fn wrist_center(plan: &Plan) -> Step {
    let arm = &plan.arm;
    Step {
        title: "The wrist-center target".into(),
        text: String::new(),
        equations: vec![
            "G   = B⁻¹ T M⁻¹".into(),
            "c_t = G c = B_Rᵀ (R_T c_tool + t_T − B_t),   c_tool = M_Rᵀ (c − M_t)".into(),
            "R456 = (R1 R2 R3)ᵀ rot(G)           (what is left for joints 4–6)".into(),
        ],
        after: String::new(),
        numbers: vec![
            vec![t("c      = "), Part::point(arm.wrist_center)],
            vec![
                t("c_tool = "),
                Part::point(crate::plan::decouple::wrist_center_in_tool(arm)),
            ],
            vec![
                t("B_R    = "),
                Part::Rows(arm.base.rotation),
                t(",  B_t = "),
                Part::point(arm.base.translation),
            ],
        ],
    }
}

/// The wrist's model value of joint 5 where it lines up: `θa = atan2(h5·(h6 × h4), h6·h4)`.
pub fn aligned_at(w: &WristAxes) -> f64 {
    num::dot(&w.h5, &num::cross(&w.h6, &w.h4)).atan2(num::dot(&w.h6, &w.h4))
}

/// The last step: joints 4–6 by Paden–Kahan subproblems 2 and 1, with the plan's wrist axes.
fn wrist(plan: &Plan) -> Step {
    let w = WristAxes::of(&plan.arm);
    let c45 = num::dot(&w.h4, &w.h5);
    let b = num::dot(&w.h5, &w.h6);
    let mut numbers = vec![
        vec![
            t("h4 = "),
            Part::direction(w.h4),
            t(",  h5 = "),
            Part::direction(w.h5),
            t(",  h6 = "),
            Part::direction(w.h6),
        ],
        vec![
            t("h4·h5 = "),
            Part::number(c45),
            t(",  h5·h6 = "),
            Part::number(b),
            t(",  h4 × h5 = "),
            Part::direction(num::cross(&w.h4, &w.h5)),
        ],
        vec![t("x6 = "), Part::direction(w.x6)],
    ];
    if w.is_orthogonal() {
        numbers.push(vec![
            t(
                "right-angled wrist: α = a, β = 0, and the trailing branch is (θ4 + 180°, \
                 2 θa − θ5, θ6 + 180°) with θa = ",
            ),
            Part::angle(aligned_at(&w)),
        ]);
    }
    Step {
        title: "Joints 4–6: the spherical wrist".into(),
        text: "`v` is where the target sends axis 6, seen after joints 1–3. Joints 4 and 5 take \
               `h6` onto `v` (Paden–Kahan 2): the intermediate `z = R5 h6 = R4ᵀ v` keeps its \
               component along `h4` (`h4·z = h4·v`) and along `h5` (`h5·z = h5·h6`), and \
               `|z| = 1`."
            .into(),
        equations: vec![
            "v  = R456 h6 = (R1 R2 R3)ᵀ rot(G) h6,   a = h4 · v".into(),
            "α  = (a − (h4·h5)(h5·h6)) / (1 − (h4·h5)²)".into(),
            "β  = ((h5·h6) − (h4·h5) a) / (1 − (h4·h5)²)".into(),
            "γ² (1 − (h4·h5)²) = 1 − α² − β² − 2 α β (h4·h5)                  (|z| = 1)".into(),
            "                  = |h4 × v|² − ((h5·h6) − (h4·h5) a)² / (1 − (h4·h5)²)".into(),
            "z  = α h4 + β h5 ± γ (h4 × h5)          (+ leading, − trailing)".into(),
            "θ5 = atan2(h5 · (h6 × z), h6⊥h5 · z)     (Paden–Kahan 1: h6 onto z about h5)".into(),
            "θ4 = atan2(h4 · (z × v), z · v − a²)     (Paden–Kahan 1: z onto v about h4)".into(),
            "y  = R5ᵀ R4ᵀ R456 x6,  θ6 = atan2(h6 · (x6 × y), x6 · y)   (x6 ⟂ h6)".into(),
        ],
        after: "Real when `γ² ≥ 0` (else the wrist cannot point axis 6 that way). The two forms \
                of `γ²` are equal; the second keeps its digits near the aligned wrist (`v` \
                nearly along `h4`), and §9 names the form the plan evaluates."
            .into(),
        numbers,
    }
}
