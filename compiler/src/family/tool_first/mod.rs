//! The tool-first family: arms solved whole from their tool. The mirrored arm (joint `i` of it
//! is joint `7 − i` about the reversed axis, base and tool at the identity) is an arm of a
//! family that solves any target ([`super::FamilyModule::target_step`]); that family's plan
//! for the target `G⁻¹` solves the arm (mirrored decoupling, Pieper 1968, read from the tool
//! end). Today: arms whose axes 3, 4 and 5 are parallel and axes 1 and 2 meet (the mirror is a
//! three-parallel arm), and arms whose axes 3, 4 and 5 meet (the mirror is a mid-wrist arm);
//! any family that offers the step later is picked up the same way.
//!
//! Recognition, evidence, the review's conditions and `verify` hints here (the mirrored
//! family's, renumbered into the arm's numbering); the plan in [`plan`].

pub mod plan;
mod steps;

use armforge_runtime::Joint;

use super::data::{Judged, Part, Steps, Value, VerifyHints};
use super::mirror::{self, renumber_text};
use super::{Family, FamilyModule, Found, Recognition};
use crate::classify::context::Context;
use crate::classify::reject::{Reason, Rejection};
use crate::classify::{ArmEvidence, Geometry, Singularity};
use crate::model::Model;
use crate::plan::Plan;

/// The tool-first family.
pub struct ToolFirst;

/// The registry's entry.
pub static TOOL_FIRST: ToolFirst = ToolFirst;

/// Evidence of a tool-first arm: the mirrored arm's classification.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct ToolFirstEvidence {
    /// The family of the mirrored arm (joint `i` of it is joint `7 − i`).
    pub mirrored_family: Family,
    /// The mirrored arm's classification (its numbering).
    pub mirrored: Box<Geometry>,
}

/// Whether a family solves any target, so that it can solve a mirrored arm.
fn offers_target_step(module: &dyn FamilyModule) -> bool {
    module.target_step().is_some()
}

/// The arm's rejection for a degenerate mirrored arm: the mirrored family's reason in the
/// arm's numbering, pointing at the arm's joint.
fn degenerate(ctx: &Context, family: Family, inner: Rejection) -> Recognition {
    let message = format!(
        "read from its tool (the mirrored arm: joint i there is joint 7 − i here, about the \
         reversed axis), this arm has the shape of a {} arm but fails one of its conditions; \
         in this arm's numbering: {}",
        family.name(),
        renumber_text(&inner.message)
    );
    let name = mirror::renumber_name(inner.reason.kind());
    let measures = match inner.reason {
        Reason::Family { measures, .. } => measures,
        _ => Vec::new(),
    };
    let reason = Reason::Family {
        name,
        message,
        measures,
    };
    let joint = inner.joint.map_or(1, |j| 7 - j.clamp(1, 6));
    Recognition::Degenerate(ctx.reject(reason, joint, Vec::new()))
}

/// The mirrored arm's singular configuration in the arm's numbering: its text renumbered, its
/// equation (in the mirrored arm's symbols) said to be read there.
fn renumbered(s: &Singularity) -> Singularity {
    let seen = "read on the mirrored arm (its joint i is joint 7 − i here, its symbols numbered \
                as its own)";
    match s {
        Singularity::Described {
            name,
            text,
            equation,
        } => Singularity::Described {
            name: mirror::renumber_name(name),
            text: renumber_text(text),
            equation: format!("{seen}: {equation}"),
        },
        other => Singularity::Described {
            name: "mirrored_arm",
            text: format!(
                "the mirrored arm's {} configuration, in its numbering (its joint i is joint \
                 7 − i here)",
                shared_words(other)
            ),
            equation: format!("{seen}: the solver flags it and holds the free joint there"),
        },
    }
}

/// Words for a shared singular configuration (families offering the target step describe
/// their own, [`Singularity::Described`]).
fn shared_words(s: &Singularity) -> &'static str {
    match s {
        Singularity::WristAligned { .. } => "wrist-aligned",
        Singularity::WristNeverAligned => "never-aligned wrist",
        Singularity::Shoulder { .. } => "shoulder",
        Singularity::WristCenterOnAxis1 { .. } => "placed-point-on-axis-1",
        Singularity::Stretched { .. } => "stretched",
        Singularity::Folded { .. } => "folded",
        Singularity::SlideClosestToAxis2 { .. } => "slide-closest-to-axis-2",
        Singularity::Described { .. } => "own",
    }
}

/// A line of parts with its words in the arm's numbering.
fn renumber_line(line: Vec<Part>) -> Vec<Part> {
    line.into_iter()
        .map(|p| match p {
            Part::Text(s) => Part::Text(renumber_text(&s)),
            other => other,
        })
        .collect()
}

/// The mirrored arm's model, classification and plan, rebuilt from a tool-first plan's arm.
fn mirrored_plan(plan: &Plan) -> Option<(Geometry, Plan)> {
    let model = plan::mirrored_model_of(&plan.arm);
    let ctx = Context::new(&model, &Default::default()).ok()?;
    super::REGISTRY
        .iter()
        .filter(|m| offers_target_step(**m))
        .find_map(|m| match m.recognise(&ctx) {
            Recognition::Mine(found) => {
                let g = crate::classify::geometry_of(&ctx, m.family(), found);
                let p = m.build_plan(&model, &g);
                Some((g, p))
            }
            _ => None,
        })
}

impl FamilyModule for ToolFirst {
    fn family(&self) -> Family {
        Family::ToolFirst
    }

    fn name(&self) -> &'static str {
        "tool-first"
    }

    fn pattern(&self) -> &'static str {
        "R R R R R R, read from the tool"
    }

    /// As the three-parallel mirror: two roots of joint 6 × two bends of joints 5–4.
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        let inner = match mirror::classify_mirrored(ctx, offers_target_step) {
            Ok(g) => g,
            Err(miss) => {
                return match miss.degenerate {
                    Some((family, r)) => degenerate(ctx, family, r),
                    None => Recognition::NotMine(None),
                }
            }
        };
        let singularities = inner.singularities.iter().map(renumbered).collect();
        Recognition::Mine(Found {
            center: inner.wrist_center,
            wrist: None,
            reach: None,
            singularities,
            solutions: [inner.solutions.position, inner.solutions.wrist],
            arm: ArmEvidence::ToolFirst(ToolFirstEvidence {
                mirrored_family: inner.family,
                mirrored: Box::new(inner),
            }),
        })
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        let fallback = || crate::plan::decoupled_plan(model, geometry, super::elbow::position);
        let ArmEvidence::ToolFirst(e) = &geometry.arm else {
            return fallback();
        };
        let module = e.mirrored_family.module();
        let Some(step) = module.target_step() else {
            return fallback();
        };
        let mut plan = plan::build(model, &e.mirrored, step);
        plan.labels_by_solving = module.labels_by_solving();
        plan
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::ToolFirst(e) = arm else {
            return Vec::new();
        };
        let mut items = vec![Judged::new(
            "mirrored_point",
            "point the mirrored arm's family places (base frame, every joint at zero)",
            Value::Point(e.mirrored.wrist_center),
        )];
        items.extend(
            e.mirrored_family
                .module()
                .evidence(&e.mirrored.arm)
                .into_iter()
                .map(|j| Judged {
                    key: mirror::renumber_name(j.key),
                    label: format!(
                        "read from the tool ({}): {}",
                        e.mirrored_family.name(),
                        renumber_text(&j.label)
                    ),
                    value: j.value,
                }),
        );
        items
    }

    fn placed_point(&self) -> &'static str {
        "point placed by the arm read from its tool"
    }

    fn summary(&self) -> &'static str {
        "read from the tool: the mirrored arm (joint i is joint 7 − i about the reversed axis) \
         is solved whole by its own family, named with its evidence above (axes 3, 4, 5 \
         parallel and axes 1, 2 meeting: a three-parallel arm read from its tool; axes 3, 4, 5 \
         meeting: a mid-wrist arm read from its tool)"
    }

    fn solution_parts(&self) -> [&'static str; 2] {
        [
            "the mirrored arm's first step",
            "the mirrored arm's second step",
        ]
    }

    fn label_words(&self) -> [&'static str; 3] {
        [
            "E'2 E'3 E'4 q'",
            "the labels read on the mirrored arm (its joint i is joint 7 − i here, about the \
             reversed axis, with the same value) by its family's rule: for a three-parallel \
             mirror, the meeting point q' of axes 1 and 2 moved by its joints 2–4 (joints 5, 4, \
             3 here); for a mid-wrist mirror, read by solving; its axes written h' and \
             numbered as its own",
            "h'5 × h'2",
        ]
    }

    fn decoupling(&self) -> &'static str {
        "Read from the tool: the mirrored arm (joint i is joint 7 − i about the reversed axis) \
         is an arm armforge solves whole, of the family the first condition below names \
         (mirrored decoupling, Pieper 1968); axes 3, 4 and 5 parallel with axes 1 and 2 \
         meeting make it a three-parallel arm, axes 3, 4 and 5 meeting a mid-wrist arm."
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let ArmEvidence::ToolFirst(e) = &geometry.arm else {
            return Vec::new();
        };
        let mut lines = vec![vec![Part::text(format!(
            "read from the tool, the arm is a {} arm ({}); its conditions, in this arm's \
             numbering:",
            e.mirrored_family.name(),
            e.mirrored_family.pattern()
        ))]];
        if let Some((g, inner)) = mirrored_plan(plan) {
            let module = g.family.module();
            lines.extend(module.conditions(&inner, &g).into_iter().map(renumber_line));
        }
        lines
    }

    fn reach_lines(&self, plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        let Some((g, inner)) = mirrored_plan(plan) else {
            return Vec::new();
        };
        let module = g.family.module();
        module
            .reach_lines(&inner, &g)
            .into_iter()
            .map(renumber_line)
            .collect()
    }

    fn on_axis_1_quantity(&self) -> &'static str {
        "`r² = a² + b² = 0` (the mirrored arm's joint-1 equation: joint 6 here)"
    }

    fn steps(&self, plan: &Plan) -> Steps {
        steps::steps(plan, mirrored_plan(plan))
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        let ArmEvidence::ToolFirst(e) = &geometry.arm else {
            return crate::classify::decoupled::verify_hints(joints, geometry);
        };
        let mirrored = mirror::mirrored_joints(joints);
        let inner = e
            .mirrored_family
            .module()
            .verify_hints(&mirrored, &e.mirrored);
        mirror::renumber_hints(inner)
    }
}
