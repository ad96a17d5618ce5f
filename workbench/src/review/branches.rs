//! §5 The branches: which choices a pose leaves, how each label is read from the joints alone
//! (so a controller can hold one while it moves), and the plan's candidates.

use std::fmt::Write as _;

use armforge_runtime::internal::{ElbowRule, ShoulderRule};
use armforge_runtime::{Branch, Elbow, Shoulder};

use super::show::Show;
use armforge_compiler::plan::render::reference;
use armforge_compiler::plan::Plan;

/// Writes §5.
pub fn write(out: &mut String, plan: &Plan, s: &Show) {
    let [moved, meaning, wrist_normal] = plan.arm.family.module().label_words();
    let _ = writeln!(out, "## 5. Branches\n");
    let _ = writeln!(
        out,
        "A pose has up to one solution per branch (per turn of a joint whose range is wider \
         than a turn). Every label is a function of the joint values alone (`branch_of`), \
         agrees with what `solve` reports, and splits the solutions without overlap. `{moved}` \
         is {meaning}.\n"
    );
    let _ = writeln!(
        out,
        "| choice | labels | defined by | this arm |\n|---|---|---|---|"
    );
    let rule = &plan.rule;
    match rule.shoulder {
        ShoulderRule::Plane {
            normal,
            point,
            facing,
            ..
        } => {
            let _ = writeln!(
                out,
                "| shoulder | facing / across | the side of the plane through axis 1 spanned by \
                 axes 1 and 2 on which the wrist center lies: the sign of `(h1 × h2) · ({moved} \
                 − p1)`; facing is the side it has with every joint at zero, across the other \
                 side | `h1 × h2` = {}, `p1` = {}, facing when the sign is {} |",
                s.dir(&normal),
                s.point(&point),
                sign_word(facing)
            );
        }
        ShoulderRule::Radial {
            direction, point, ..
        } => {
            let _ = writeln!(
                out,
                "| shoulder | facing / across | the sign of the radial slide's reach along its \
                 own direction from the point of its line nearest axis 1: `D · ({moved} − p1)` \
                 ≥ 0 is facing (reaching out), < 0 across (through the other side of axis 1) | \
                 `D` = {}, `p1` = {} |",
                s.dir(&direction),
                s.point(&point)
            );
        }
        ShoulderRule::Only if solved(plan, |b| b.shoulder != Shoulder::Only) => {
            let _ = writeln!(out, "| shoulder | facing / across | {BY_SOLVING} | — |");
        }
        ShoulderRule::Only => {
            let _ = writeln!(out, "| shoulder | only | no choice (cartesian arm) | — |");
        }
    }
    match rule.elbow {
        ElbowRule::Bend {
            sense,
            stretched,
            up,
        } => {
            let _ = writeln!(
                out,
                "| elbow | up / down | the sign of the bend from the stretched arm, `bend = \
                 sign sin(s3 θ3 − φ0)`; up is the elbow on the side of the shoulder–wrist-center \
                 line toward axis 1's direction with the shoulder facing, and follows the arm \
                 when it reaches across: up when `bend × (+1 facing, −1 across)` equals \
                 the sign in the last column | `s3` = {}, `φ0` = {}, up when {} |",
                s.num(sense),
                s.angle(stretched),
                sign_word(up)
            );
        }
        ElbowRule::Slide { nearest } => {
            let _ = writeln!(
                out,
                "| elbow | extended / retracted | which root of the slide's quadratic: extended \
                 the longer (`θ3 ≥ −m`, past the wrist center's nearest approach to axis 2), \
                 retracted the shorter | `−m` = {} |",
                s.len(nearest)
            );
        }
        ElbowRule::Aspect { up } => {
            let _ = writeln!(
                out,
                "| elbow | up / down | the sign of the position Jacobian's determinant \
                 `det[h1 × (w − p1), h2 × (w − p2), h3 × (w − p3)]` (axes and wrist center `w` \
                 at the configuration, joint 1 undone): which side of the singular surfaces of \
                 joints 1–3 the configuration is on | up when {} |",
                sign_word(up)
            );
        }
        ElbowRule::Only if solved(plan, |b| b.elbow != Elbow::Only) => {
            let _ = writeln!(out, "| elbow | up / down | {BY_SOLVING} | — |");
        }
        ElbowRule::Only => {
            let _ = writeln!(
                out,
                "| elbow | only | no choice ({} arm) | — |",
                family(plan)
            );
        }
    }
    let w = rule.wrist;
    let _ = writeln!(
        out,
        "| wrist | leading / trailing | the side of the aligned position joint 5 is turned to: \
         leading when axis 6 leans toward `{wrist_normal}`, `({wrist_normal}) · R(h5, θ5) h6 ≥ 0` (vectors \
         at zero), trailing otherwise | `{wrist_normal}` = {}, `h5` = {}, \
         `h6` = {} |\n",
        s.dir(&w.normal),
        s.dir(&w.axis5),
        s.dir(&w.axis6)
    );
    candidates(out, plan);
}

/// The words for a label that only solving reads (no rule of joint values alone gives it).
const BY_SOLVING: &str = "read by solving: the label of the solution at `forward(q)` nearest \
                          the configuration (the family's own reading, above)";

/// True when the plan's labels are read by solving and some candidate carries a label `has`.
fn solved(plan: &Plan, has: impl Fn(&Branch) -> bool) -> bool {
    plan.labels_by_solving && plan.candidates.iter().any(|c| has(&c.branch))
}

fn family(plan: &Plan) -> &'static str {
    plan.arm.family.name()
}

fn sign_word(x: f64) -> &'static str {
    if x >= 0.0 {
        "+1"
    } else {
        "−1"
    }
}

fn candidates(out: &mut String, plan: &Plan) {
    let _ = writeln!(
        out,
        "The plan's {} candidates (the names are the steps in §9):\n",
        plan.candidates.len()
    );
    let _ = writeln!(
        out,
        "| # | branch | θ1 | θ2 | θ3 | θ4 | θ5 | θ6 |\n|---|---|---|---|---|---|---|---|"
    );
    for (i, c) in plan.candidates.iter().enumerate() {
        let names: Vec<String> = c
            .model_values
            .iter()
            .map(|&id| format!("`{}`", reference(&plan.graph, id)))
            .collect();
        let _ = writeln!(out, "| {} | {} | {} |", i + 1, c.branch, names.join(" | "));
    }
    let _ = writeln!(out);
}
