//! §3 The method and §4 the solve, step by step: each equation with symbols, then with this
//! arm's numbers. The family gives both as data, read from the constants its plan is built
//! from ([`armforge_compiler::family::FamilyModule::steps`]); this file renders them in the
//! file's units and adds the last step every family shares.

use std::fmt::Write as _;

use super::show::Show;
use armforge_compiler::family::Steps;
use armforge_compiler::plan::Plan;

/// Writes §3 (the method) and §4 (the steps).
pub fn write(out: &mut String, plan: &Plan, s: &Show) {
    given(out, &plan.arm.family.module().steps(plan), s);
    finishing(out, plan, s);
}

/// §3 and §4 as the family gives them.
fn given(out: &mut String, steps: &Steps, s: &Show) {
    let _ = writeln!(out, "## 3. The method\n");
    for m in &steps.method {
        let _ = writeln!(out, "- {m}");
    }
    let _ = writeln!(out, "\n## 4. The solve, step by step\n");
    let _ = writeln!(
        out,
        "{} Lengths below are in {}.\n",
        steps.inputs,
        s.units.length.symbol()
    );
    for (i, step) in steps.steps.iter().enumerate() {
        let _ = writeln!(out, "### 4.{} {}\n", i + 1, step.title);
        if !step.text.is_empty() {
            let _ = writeln!(out, "{}\n", step.text);
        }
        if !step.equations.is_empty() {
            block(out, &step.equations);
        }
        let this_arm = if step.numbers.is_empty() {
            ""
        } else if step.after.is_empty() {
            "This arm:"
        } else {
            " This arm:"
        };
        if !step.after.is_empty() || !this_arm.is_empty() {
            let _ = writeln!(out, "{}{this_arm}\n", step.after);
        }
        if !step.numbers.is_empty() {
            let numbers: Vec<String> = step
                .numbers
                .iter()
                .map(|line| line.iter().map(|p| super::family::part(p, s)).collect())
                .collect();
            block(out, &numbers);
        }
    }
}

fn block(out: &mut String, lines: &[String]) {
    let _ = writeln!(out, "```text");
    for l in lines {
        let _ = writeln!(out, "{l}");
    }
    let _ = writeln!(out, "```\n");
}

fn finishing(out: &mut String, plan: &Plan, s: &Show) {
    let _ = writeln!(out, "### Last step: joint values, limits, duplicates\n");
    let _ = writeln!(
        out,
        "Each candidate's model values become joint values `q_i = (θ_i − offset_i) · \
         direction_i` (§1). A revolute value is wrapped by whole turns to within half a \
         turn of the range's center (where the range is wider than one turn, the other \
         values inside it are listed on request, not stored: one solution per branch). Candidates \
         with a joint beyond its limits by more than {} are dropped; two solutions closer \
         than {} in every joint are returned once. With nothing left the solver says why: \
         beyond reach, inside the unreachable region near the shoulder, wrist orientation out \
         of reach, or outside the limits (joint and amount).\n",
        s.per_kind(plan.settings.limit_tolerance),
        s.per_kind(plan.settings.duplicate_tolerance)
    );
}
