//! §2 The family of joints 1–3 and the spherical wrist, with the measured evidence (the same
//! items `armforge inspect` reports) and the conditions each needs.

use std::fmt::Write as _;

use super::show::{self, Show};
use crate::report::{Outcome, Report};
use armforge_compiler::classify::Geometry;
use armforge_compiler::family::{Part, Value};
use armforge_compiler::plan::Plan;

/// Writes §2.
pub fn write(out: &mut String, report: &Report, geometry: &Geometry, plan: &Plan, s: &Show) {
    let _ = writeln!(out, "## 2. Classification\n");
    let Outcome::Solvable(solvable) = &report.outcome else {
        return;
    };
    // "of joints 1–3" where a spherical wrist takes the other three.
    let of = if geometry.wrist.is_some() {
        " of joints 1–3"
    } else {
        ""
    };
    let _ = writeln!(
        out,
        "Family{of}: **{}** ({}). {} Lines count as meeting within {} and as parallel or \
         perpendicular within {} (§8).\n",
        solvable.family,
        solvable.pattern,
        geometry.family.module().decoupling(),
        s.len(geometry.resolved.distance),
        s.angle(geometry.resolved.angle)
    );
    let _ = writeln!(out, "What the solve needs, as measured:\n");
    for line in conditions(plan, geometry, s) {
        let _ = writeln!(out, "- {line}");
    }
    let _ = writeln!(out, "\nEvidence for the family:\n");
    show::items(out, "measured", &solvable.family_evidence);
    if !solvable.wrist.is_empty() {
        let _ = writeln!(out, "\nEvidence for the wrist:\n");
        show::items(out, "measured", &solvable.wrist);
    }
    let [first, second] = solvable.solution_parts;
    let _ = writeln!(
        out,
        "\nSolutions to expect for one tool pose: up to {} ({} for {first} × {} for {second}; \
         revolute values counted once per turn, more where a joint's range is wider than a \
         turn).\n",
        solvable.solutions.total, solvable.solutions.position, solvable.solutions.wrist
    );
}

/// The family's conditions ([`armforge_compiler::family::FamilyModule::conditions`]), each a
/// line of words and numbers shown in the file's units.
fn conditions(plan: &Plan, g: &Geometry, s: &Show) -> Vec<String> {
    g.family
        .module()
        .conditions(plan, g)
        .iter()
        .map(|parts| parts.iter().map(|p| part(p, s)).collect())
        .collect()
}

/// One part of a line in the file's units.
pub fn part(p: &Part, s: &Show) -> String {
    match p {
        Part::Text(t) => t.clone(),
        Part::Value(v) => match *v {
            Value::Flag(yes) => if yes { "yes" } else { "no" }.to_string(),
            Value::Length(m) => s.len(m),
            Value::Angle(a) => s.angle(a),
            Value::Direction(d) => s.dir(&d),
            Value::Point(x) => s.point(&x),
            Value::Number(x) => s.num(x),
        },
        Part::Area(x) => s.area(*x),
        Part::Rows(m) => s.rows(m),
    }
}
