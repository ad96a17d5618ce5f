//! A readable, deterministic text rendering of a plan (for snapshots and `explain`-style
//! output): one line per step, then the candidates and the label rules.

use std::fmt::{self, Write};

use armforge_runtime::plan::Op;

use super::graph::{Graph, Id};
use super::Plan;

/// `n` and the noun, singular for one: `1 division`, `3 divisions` (`many` is the plural).
pub fn counted(n: usize, one: &str, many: &str) -> String {
    if n == 1 {
        format!("1 {one}")
    } else {
        format!("{n} {many}")
    }
}

/// How a node is referred to: its name, `tN` for an unnamed node, or a constant's literal.
pub fn reference(g: &Graph, id: Id) -> String {
    let node = &g.nodes()[id as usize];
    match (&node.op, &node.name) {
        (Op::Const(c), _) => format!("{c:?}"),
        (_, Some(name)) => name.clone(),
        _ => format!("t{id}"),
    }
}

fn expression(g: &Graph, op: &Op) -> String {
    let r = |id: Id| reference(g, id);
    match *op {
        Op::Input(slot) => format!("input[{slot}]"),
        Op::Const(c) => format!("{c:?}"),
        Op::Add(a, b) => format!("{} + {}", r(a), r(b)),
        Op::Sub(a, b) => format!("{} - {}", r(a), r(b)),
        Op::Mul(a, b) => format!("{} * {}", r(a), r(b)),
        Op::Div(a, b) => format!("{} / {}", r(a), r(b)),
        Op::Neg(a) => format!("-{}", r(a)),
        Op::Abs(a) => format!("abs({})", r(a)),
        Op::Sqrt(a) => format!("sqrt({})", r(a)),
        Op::Cbrt(a) => format!("cbrt({})", r(a)),
        Op::Cos(a) => format!("cos({})", r(a)),
        Op::Atan2(y, x) => format!("atan2({}, {})", r(y), r(x)),
        Op::Min(a, b) => format!("min({}, {})", r(a), r(b)),
        Op::Max(a, b) => format!("max({}, {})", r(a), r(b)),
        Op::Select(c, a, b) => format!("if {} >= 0 {{ {} }} else {{ {} }}", r(c), r(a), r(b)),
    }
}

impl fmt::Display for Plan {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let counts = self.op_counts();
        writeln!(
            f,
            "plan: family {:?}, {} candidates, capacity {}",
            self.arm.family,
            self.candidates.len(),
            self.capacity
        )?;
        writeln!(
            f,
            "cost per solve: {} sqrt, {} atan2{}, {} div, {} mul, {} add/sub/neg, {} select/min/max/abs",
            counts.sqrt,
            counts.atan2,
            counts.rare(),
            counts.div,
            counts.mul,
            counts.add,
            counts.select
        )?;
        writeln!(f, "steps:")?;
        let g = &self.graph;
        for (i, node) in g.nodes().iter().enumerate() {
            if matches!(node.op, Op::Const(_)) {
                continue;
            }
            let mut line = format!("  {} = {}", reference(g, i as Id), expression(g, &node.op));
            if let Some(note) = &node.note {
                let _ = write!(line, "    // {note}");
            }
            writeln!(f, "{line}")?;
        }
        writeln!(f, "candidates:")?;
        for (i, c) in self.candidates.iter().enumerate() {
            let joints: Vec<String> = c.model_values.iter().map(|&id| reference(g, id)).collect();
            writeln!(f, "  {}: {} -> [{}]", i + 1, c.branch, joints.join(", "))?;
            for ch in c.checks.iter().flatten() {
                writeln!(
                    f,
                    "     check {:?}: {} against {}",
                    ch.kind,
                    reference(g, ch.have_squared),
                    reference(g, ch.limit)
                )?;
            }
        }
        writeln!(f, "labels: {:?}", self.rule)?;
        writeln!(f, "settings: {:?}", self.settings)
    }
}
