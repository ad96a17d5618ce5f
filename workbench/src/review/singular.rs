//! §6 The singular configurations: where each is, the equation that defines it in the plan's
//! terms, and what the solver does there.

use std::fmt::Write as _;

use super::facts::Facts;
use super::show::{self, Show};
use armforge_compiler::classify::{Geometry, Singularity};
use armforge_compiler::model::Model;
use armforge_compiler::plan::vec3::num;
use armforge_compiler::plan::wrist::ALIGNED_SINE;
use armforge_compiler::plan::Plan;

/// Writes §6.
pub fn write(
    out: &mut String,
    model: &Model,
    geometry: &Geometry,
    plan: &Plan,
    texts: &[String],
    facts: &Facts,
    s: &Show,
) {
    let _ = writeln!(out, "## 6. Singular configurations\n");
    let _ = writeln!(
        out,
        "Where the equations of §4 lose a joint or two solutions merge. The solver flags every \
         solution found there (`WRIST_ALIGNED`, `ON_AXIS_1`, `AT_REACH_LIMIT`).\n"
    );
    for (sing, text) in geometry.singularities.iter().zip(texts) {
        let _ = writeln!(out, "- **{}**", show::minus(text));
        let _ = writeln!(out, "  - {}", equation(model, sing, plan, facts, s));
    }
    let _ = writeln!(out);
}

fn equation(model: &Model, sing: &Singularity, plan: &Plan, f: &Facts, s: &Show) -> String {
    let length_tol = s.small_len(plan.settings.length_tolerance);
    match sing {
        Singularity::WristAligned { .. } => format!(
            "`z ∥ h4`, i.e. `γ = 0` and `θ5 = θa` (mod a half turn), `θa = atan2(h5·(h6 × h4), \
             h6·h4)` = {} (model value). Only `θ4 ± θ6` is fixed there: when `|z⊥h4|` < \
             {ALIGNED_SINE:e} the solver keeps joint 4 at the reference (plus a half turn for \
             the second representative) and solves joint 6.",
            s.angle(f.aligned_at())
        ),
        Singularity::WristNeverAligned => {
            "the twists of the wrist differ, so `z` never lines up with `h4`: no wrist \
             singularity."
                .into()
        }
        Singularity::WristCenterOnAxis1 { reachable } => {
            let family = f.arm.family;
            let quantity = if matches!(family, armforge_compiler::classify::Family::Cylindrical) {
                "`ρ² = 0`"
            } else {
                "`r² = a² + b² = 0`"
            };
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
        Singularity::Stretched { joint_3_at } => {
            let k = f.elbow();
            let (l, v) = (num::norm(&k.l), num::norm(&k.v));
            format!(
                "`cos ψ = 1`: `d = |L| + |V|` = {} from axis 2, `θ3 = s3 φ0` = {} (model \
                 value; joint value {}); the elbow's two roots merge.",
                s.len(l + v),
                s.angle(*joint_3_at),
                joint(model, 2, *joint_3_at, s)
            )
        }
        Singularity::Folded { joint_3_at } => {
            let k = f.elbow();
            let (l, v) = (num::norm(&k.l), num::norm(&k.v));
            format!(
                "`cos ψ = −1`: `d = ||L| − |V||` = {} from axis 2, `θ3` = {} (model value; \
                 joint value {}); the elbow's two roots merge.",
                s.len((l - v).abs()),
                s.angle(*joint_3_at),
                joint(model, 2, *joint_3_at, s)
            )
        }
        Singularity::Described { equation, .. } => equation.clone(),
        Singularity::SlideClosestToAxis2 { joint_3_at } => {
            let k = f.polar();
            let nearest = (num::dot(&k.p, &k.p) - k.m * k.m).max(0.0).sqrt();
            format!(
                "`d² = |P|² − m²` (`d` = {}): the slide's two roots merge at `s = −m` = {}.",
                s.len(nearest),
                s.len(*joint_3_at)
            )
        }
    }
}

fn joint(model: &Model, index: usize, model_value: f64, s: &Show) -> String {
    match model.joints.get(index) {
        Some(j) => s.joint_value(&j.joint, j.joint.joint_value(model_value)),
        None => s.num(model_value),
    }
}
