//! §9 The plan as the solver runs it: the operation count and every named step with the
//! equation the plan builder recorded for it (the emitted module's `let`s and comments).

use std::fmt::Write as _;

use armforge_runtime::plan::Op;

use armforge_compiler::plan::render::{counted, reference};
use armforge_compiler::plan::Plan;

use super::show::Show;

/// Writes §9.
pub fn write(out: &mut String, plan: &Plan, show: &Show) {
    let c = plan.op_counts();
    let _ = writeln!(out, "## 9. The plan as evaluated\n");
    let _ = writeln!(
        out,
        "One evaluation, every branch at once, no loop: {}, {}, {}, {}, {}, {} (min, max, \
         abs, select). The named steps, in evaluation order (unnamed steps are the sums and \
         products between them):\n",
        counted(c.sqrt, "square root", "square roots"),
        counted(c.atan2, "arc tangent", "arc tangents"),
        counted(c.div, "division", "divisions"),
        counted(c.mul, "multiplication", "multiplications"),
        counted(
            c.add,
            "addition/subtraction/negation",
            "additions/subtractions/negations"
        ),
        counted(c.select, "selection", "selections"),
    );
    let _ = writeln!(out, "```text");
    let g = &plan.graph;
    for (i, node) in g.nodes().iter().enumerate() {
        if matches!(node.op, Op::Input(_) | Op::Const(_)) {
            continue;
        }
        if let (Some(name), Some(note)) = (&node.name, &node.note) {
            let id = u32::try_from(i).unwrap_or(u32::MAX);
            let _ = writeln!(out, "{:<16} {}", reference(g, id), show.in_file_units(note));
            debug_assert_eq!(&reference(g, id), name);
        }
    }
    let _ = writeln!(out, "```");
}
