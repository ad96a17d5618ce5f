//! §6 The singular configurations: where each is, the equation that defines it in the plan's
//! terms, and what the solver does there.

use std::fmt::Write as _;

use super::show::{self, Show};
use armforge_compiler::classify::{Geometry, Singularity};
use armforge_compiler::family::decoupled_steps::aligned_at;
use armforge_compiler::plan::wrist::{WristAxes, ALIGNED_SINE};
use armforge_compiler::plan::Plan;

/// Writes §6.
pub fn write(out: &mut String, geometry: &Geometry, plan: &Plan, texts: &[String], s: &Show) {
    let _ = writeln!(out, "## 6. Singular configurations\n");
    let _ = writeln!(
        out,
        "Where the equations of §4 lose a joint or two solutions merge. The solver flags every \
         solution found there (`WRIST_ALIGNED`, `ON_AXIS_1`, `AT_REACH_LIMIT`).\n"
    );
    for (sing, text) in geometry.singularities.iter().zip(texts) {
        let _ = writeln!(out, "- **{}**", show::minus(text));
        let _ = writeln!(out, "  - {}", equation(geometry, sing, plan, s));
    }
    let _ = writeln!(out);
}

/// The equation of a singular configuration: the family's own words for its own, else the
/// shared ones.
fn equation(geometry: &Geometry, sing: &Singularity, plan: &Plan, s: &Show) -> String {
    let module = geometry.family.module();
    if let Some(parts) = module.singular_equation(plan, sing) {
        return parts.iter().map(|p| super::family::part(p, s)).collect();
    }
    let length_tol = s.small_len(plan.settings.length_tolerance);
    match sing {
        Singularity::WristAligned { .. } => format!(
            "`z ∥ h4`, i.e. `γ = 0` and `θ5 = θa` (mod a half turn), `θa = atan2(h5·(h6 × h4), \
             h6·h4)` = {} (model value). Only `θ4 ± θ6` is fixed there: when `|z⊥h4|` < \
             {ALIGNED_SINE:e} the solver keeps joint 4 at the reference (plus a half turn for \
             the second representative) and solves joint 6.",
            s.angle(aligned_at(&WristAxes::of(&plan.arm)))
        ),
        Singularity::WristNeverAligned => {
            "the twists of the wrist differ, so `z` never lines up with `h4`: no wrist \
             singularity."
                .into()
        }
        Singularity::WristCenterOnAxis1 { reachable } => {
            let quantity = module.on_axis_1_quantity();
            let reach = match reachable {
                Some(false) => " The slides' limits keep the wrist center from getting there.",
                _ => "",
            };
            format!(
                "{quantity}: the wrist-center target on axis 1, so joint 1 does not move it. \
                 Within {length_tol} of axis 1 the solver keeps joint 1 at the reference (plus \
                 a half turn for the second root).{reach}"
            )
        }
        Singularity::Shoulder {
            perpendicular: true,
            offset,
            ..
        } => format!(
            "`k² = r² − e² = 0`: the two roots of joint 1 merge; with axes 1 and 2 \
             perpendicular `e = h2·(c − p1)` is constant, so it happens at the distance \
             `|e|` = {} from axis 1; nearer is out of reach.",
            s.len(*offset)
        ),
        Singularity::Shoulder { free_point, .. } => format!(
            "`r² = 0` and `e = 0` together: the wrist center at {} on axis 1 (axes 1 and 2 \
             not perpendicular); around it `k² = r² − e² = 0` on a cone about axis 1.",
            free_point.map_or_else(|| "a point".to_string(), |p| s.point(&p))
        ),
        Singularity::Described { equation, .. } => equation.clone(),
        Singularity::Stretched { .. }
        | Singularity::Folded { .. }
        | Singularity::SlideClosestToAxis2 { .. } => {
            "where the family's equations of §4 lose a joint (its reach boundaries, §7).".into()
        }
    }
}
