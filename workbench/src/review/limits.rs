//! §7 Reach and §8 tolerances: how near and far the wrist center gets, where solutions merge,
//! and every tolerance the classifier, the solver and `armforge verify` use.

use std::fmt::Write as _;

use super::show::{self, Show};
use crate::report::{Outcome, Report};
use crate::verify::Thresholds;
use armforge_compiler::classify::Geometry;
use armforge_compiler::plan::wrist::ALIGNED_SINE;
use armforge_compiler::plan::Plan;

/// Writes §7: the reach `inspect` reports, then the family's own lines
/// ([`armforge_compiler::family::FamilyModule::reach_lines`]).
pub fn reach(out: &mut String, report: &Report, geometry: &Geometry, plan: &Plan, s: &Show) {
    let _ = writeln!(out, "## 7. Reach\n");
    if let Outcome::Solvable(solvable) = &report.outcome {
        if let Some(item) = &solvable.reach {
            let _ = writeln!(out, "- {}: {}", item.label, show::minus(&item.shown));
        }
    }
    for line in geometry.family.module().reach_lines(plan, geometry) {
        let text: String = line.iter().map(|p| super::family::part(p, s)).collect();
        let _ = writeln!(out, "- {text}");
    }
    let _ = writeln!(
        out,
        "- joint limits cut these ranges further; the solver drops candidates beyond them and \
         reports the joint and the amount when none is left\n"
    );
}

/// Writes §8.
pub fn tolerances(out: &mut String, report: &Report, plan: &Plan, s: &Show) {
    let _ = writeln!(out, "## 8. Tolerances\n");
    let _ = writeln!(out, "Classification (`armforge inspect` uses the same):\n");
    show::items(out, "tolerance", &report.tolerances);
    let st = &plan.settings;
    let t = Thresholds::default();
    let _ = writeln!(out, "\nSolver (in the plan and the emitted module):\n");
    let _ = writeln!(out, "| tolerance | value |\n|---|---|");
    let rows = [
        (
            "a target this close to a reach boundary counts as on it (double root returned \
             once, flagged)",
            s.small_len(st.length_tolerance),
        ),
        (
            "wrist counted as aligned (joint 4 held at the reference) when `|z⊥h4|` is below",
            format!("{ALIGNED_SINE:e}"),
        ),
        (
            "wrist orientation counted as reachable down to `γ²` of",
            format!("−{:e}", st.angle_tolerance),
        ),
        (
            "joint values this far beyond a limit still count as within it",
            s.per_kind(st.limit_tolerance),
        ),
        (
            "two solutions closer than this in every joint are one",
            s.per_kind(st.duplicate_tolerance),
        ),
    ];
    for (what, value) in rows {
        let _ = writeln!(out, "| {} | {} |", what.replace('|', "\\|"), value);
    }
    let _ = writeln!(out, "\n`armforge verify` (round trips):\n");
    let _ = writeln!(out, "| threshold | value |\n|---|---|");
    let verify_rows = [
        (
            "position error of every solution (fraction of the arm's size) and rotation error \
             (Frobenius norm), away from singular configurations",
            format!("{:e}", t.pose),
        ),
        (
            "the same near singular configurations and reach boundaries",
            format!("{:e}", t.pose_near_singular),
        ),
        (
            "recovered: the original configuration within (a slide: that fraction of the \
             arm's size)",
            s.turning_or_fraction(t.joint),
        ),
        (
            "recovered at a reach boundary (the two roots merge there)",
            s.turning_or_fraction(t.joint_at_boundary),
        ),
    ];
    for (what, value) in verify_rows {
        let _ = writeln!(out, "| {what} | {value} |");
    }
    let _ = writeln!(out);
}
