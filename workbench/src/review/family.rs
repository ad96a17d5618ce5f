//! §2 The family of joints 1–3 and the spherical wrist, with the measured evidence (the same
//! items `armforge inspect` reports) and the conditions each needs.

use std::fmt::Write as _;

use super::show::{self, Show};
use super::Facts;
use crate::report::{Outcome, Report};
use armforge_compiler::classify::{Family, Geometry};

/// Writes §2.
pub fn write(out: &mut String, report: &Report, geometry: &Geometry, facts: &Facts, s: &Show) {
    let _ = writeln!(out, "## 2. Classification\n");
    let Outcome::Solvable(solvable) = &report.outcome else {
        return;
    };
    let _ = writeln!(
        out,
        "Family of joints 1–3: **{}** ({}). Wrist: **spherical** (axes 4, 5 and 6 meet in \
         one point, the wrist center). Lines count as meeting within {} and as parallel or \
         perpendicular within {} (§8).\n",
        solvable.family,
        solvable.pattern,
        s.len(geometry.resolved.distance),
        s.angle(geometry.resolved.angle)
    );
    let _ = writeln!(out, "What the solve needs, as measured:\n");
    for line in conditions(geometry, facts, s) {
        let _ = writeln!(out, "- {line}");
    }
    let _ = writeln!(out, "\nEvidence for the family:\n");
    show::items(out, "measured", &solvable.family_evidence);
    let _ = writeln!(out, "\nEvidence for the wrist:\n");
    show::items(out, "measured", &solvable.wrist);
    let _ = writeln!(
        out,
        "\nSolutions to expect for one tool pose: up to {} ({} for joints 1–3 × {} for the \
         wrist; revolute values counted once per turn, more where a joint's range is wider \
         than a turn).\n",
        solvable.solutions.total, solvable.solutions.position, solvable.solutions.wrist
    );
}

fn conditions(g: &Geometry, f: &Facts, s: &Show) -> Vec<String> {
    let a = |i: usize, j: usize| s.angle(f.line_angle(i, j));
    let mut lines = vec![
        format!(
            "axes 4, 5, 6 meet: the wrist center is {} from the farthest of them",
            s.len(g.wrist.miss)
        ),
        format!(
            "axis 4 ∦ axis 5 and axis 5 ∦ axis 6: angles {} and {}",
            a(4, 5),
            a(5, 6)
        ),
    ];
    match g.family {
        Family::Elbow => {
            lines.push(format!("axis 1 ∦ axis 2: angle {}", a(1, 2)));
            lines.push(format!("axis 2 ∥ axis 3: angle {}", a(2, 3)));
            lines.push(format!(
                "an upper arm and a forearm: axes 2 and 3 are {} apart, the wrist center {} \
                 from axis 3",
                s.len(f.gap(2, 3)),
                s.len(f.distance_from_axis(3, &g.wrist_center))
            ));
        }
        Family::Polar => {
            lines.push(format!("axis 1 ∦ axis 2: angle {}", a(1, 2)));
            lines.push(format!("slide 3 ⟂ axis 2: angle {}", a(2, 3)));
        }
        Family::Cylindrical => {
            lines.push(format!("slide 2 ∦ slide 3: angle {}", a(2, 3)));
            lines.push(format!(
                "not both slides ⟂ axis 1: angles {} and {}",
                a(1, 2),
                a(1, 3)
            ));
        }
        Family::Cartesian => {
            lines.push(format!(
                "slides pairwise not parallel: angles {} (1–2), {} (1–3), {} (2–3)",
                a(1, 2),
                a(1, 3),
                a(2, 3)
            ));
            lines.push(format!(
                "slides independent: |det [u1 u2 u3]| = {}",
                s.num(f.slide_determinant())
            ));
        }
    }
    lines
}
