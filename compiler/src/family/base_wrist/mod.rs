//! The wrist at the base: the axes of joints 1–3 meet in a point and those of 4–6 do not.
//! Mirrored decoupling (Pieper 1968, read from the tool end): the arm seen from its tool,
//! joint `i` being joint `7 − i` about the reversed axis, has its spherical wrist at the end,
//! and its joints 1–3 (the arm's 6, 5, 4) are one of the decoupled families — any of them,
//! whichever the registry recognises. Recognition and evidence here; the plan in [`plan`].

pub mod plan;
mod steps;

use armforge_runtime::Joint;

use super::data::{Judged, Part, Steps, Value, VerifyHints};
use super::mirror;
use super::{Family, FamilyModule, Found, Recognition};
use crate::classify::context::Context;
use crate::classify::decoupled::line_angle;
use crate::classify::reject::{Reason, Rejection};
use crate::classify::{ArmEvidence, Geometry, Singularity, WristEvidence};
use crate::model::Model;
use crate::plan::Plan;

/// The wrist-at-base family.
pub struct BaseWrist;

/// The registry's entry.
pub static BASE_WRIST: BaseWrist = BaseWrist;

/// Evidence of an arm with its wrist at the base.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct BaseWristEvidence {
    /// The family of joints 6, 5, 4 read from the tool (the mirrored arm's joints 1–3).
    pub hand: Family,
    /// The wrist of axes 1–3, measured on the mirrored arm (its axes 4, 5, 6 are the arm's 3,
    /// 2, 1): the meeting point, how far it misses, the angles.
    pub wrist: WristEvidence,
    /// The mirrored arm's classification (its numbering: joint `i` is the arm's `7 − i`).
    pub mirrored: Box<Geometry>,
}

/// The arm seen from its tool classified by the families with a spherical wrist at joints 4–6
/// only (so the mirror of a mirror is never tried).
fn classify_mirrored(ctx: &Context) -> Result<Geometry, Option<Rejection>> {
    mirror::classify_mirrored(ctx, |m| m.position_step().is_some()).map_err(|m| m.reason())
}

/// Why the hand (joints 6, 5, 4 read from the tool) is no family armforge solves, in the
/// arm's numbering where it matters: the mirrored arm's reason, said as such.
fn hand_unsolved(ctx: &Context, inner: Option<Rejection>) -> Recognition {
    let why = inner.map_or_else(
        || "no family of joints 1–3 matches".to_string(),
        |r| r.message,
    );
    let message = format!(
        "the axes of joints 1, 2 and 3 meet in one point (a wrist at the base), but joints 6, 5 \
         and 4 read from the tool are no family armforge solves; seen from the tool (joint i \
         there is joint 7 − i here): {why}"
    );
    let reason = Reason::Family {
        name: "base_wrist_hand_unsolved",
        message,
        measures: Vec::new(),
    };
    Recognition::Degenerate(ctx.reject(reason, 4, Vec::new()))
}

/// The mirrored arm's singular configuration in the arm's numbering.
fn renumbered(model: &Model, s: &Singularity) -> Singularity {
    let u = &model.units;
    let at = |joint: usize, values: &[f64]| {
        crate::classify::evidence::show_joint_values(model, joint, values)
    };
    let (name, text) = match s {
        Singularity::WristAligned { joint_5_at } => (
            "base_wrist_aligned",
            format!(
                "base wrist aligned: axes 1 and 3 in one line, joints 1 and 3 turn together, at \
                 joint 2 = {}",
                at(2, joint_5_at)
            ),
        ),
        Singularity::WristNeverAligned => (
            "base_wrist_never_aligned",
            "base wrist never aligned: axes 1 and 3 cannot line up (the twists of axes 1–2 and \
             2–3 differ)"
                .to_string(),
        ),
        Singularity::Shoulder {
            perpendicular: true,
            offset,
            ..
        } => (
            "hand_shoulder",
            format!(
                "meeting point of axes 1–3, seen from the tool, {} from axis 6: the two joint-6 \
                 solutions merge; it cannot come nearer axis 6",
                u.show_length(*offset)
            ),
        ),
        Singularity::Shoulder { .. } => (
            "hand_shoulder",
            "meeting point of axes 1–3, seen from the tool, on axis 6: joint 6 is free; around \
             it the two joint-6 solutions merge on a cone about axis 6 (axes 6 and 5 are not \
             perpendicular)"
                .to_string(),
        ),
        Singularity::WristCenterOnAxis1 { .. } => (
            "hand_on_axis",
            "meeting point of axes 1–3, seen from the tool, on axis 6: joint 6 is free".into(),
        ),
        Singularity::Stretched { joint_3_at } => (
            "hand_stretched",
            format!(
                "joints 5–4 stretched at joint 4 = {}: the two elbow solutions merge",
                at(4, &[*joint_3_at])
            ),
        ),
        Singularity::Folded { joint_3_at } => (
            "hand_folded",
            format!(
                "joints 5–4 folded at joint 4 = {}: the two elbow solutions merge",
                at(4, &[*joint_3_at])
            ),
        ),
        Singularity::SlideClosestToAxis2 { joint_3_at } => (
            "hand_slide_closest",
            format!(
                "slide of joint 4 at {} where the meeting point passes nearest axis 5: the two \
                 slide solutions merge",
                at(4, &[*joint_3_at])
            ),
        ),
        Singularity::Described { name, text, .. } => (*name, text.clone()),
    };
    let equation = match s {
        Singularity::Described { equation, .. } => equation.clone(),
        _ => "the mirrored arm's equation (its joints 1–3 are the arm's 6, 5, 4, its wrist the \
              arm's joints 3, 2, 1): the solver flags and holds the free joint as that family \
              does"
            .to_string(),
    };
    Singularity::Described {
        name,
        text,
        equation,
    }
}

impl FamilyModule for BaseWrist {
    fn family(&self) -> Family {
        Family::BaseWrist
    }

    fn name(&self) -> &'static str {
        "wrist-at-base"
    }

    fn pattern(&self) -> &'static str {
        "R R R + any"
    }

    /// Joints 6, 5, 4 have up to four solutions (elbow, polar), the base wrist two each.
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        if !ctx.three_meet(1) {
            return Recognition::NotMine(None);
        }
        let inner = match classify_mirrored(ctx) {
            Ok(g) => g,
            Err(reason) => return hand_unsolved(ctx, reason),
        };
        let Some(wrist) = inner.wrist.clone() else {
            return Recognition::NotMine(None);
        };
        let singularities = inner
            .singularities
            .iter()
            .map(|s| renumbered(ctx.model, s))
            .collect();
        Recognition::Mine(Found {
            center: inner.wrist_center,
            wrist: None,
            reach: None,
            singularities,
            solutions: [inner.solutions.position, inner.solutions.wrist],
            arm: ArmEvidence::BaseWrist(BaseWristEvidence {
                hand: inner.family,
                wrist,
                mirrored: Box::new(inner),
            }),
        })
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        let fallback = super::elbow::position;
        let ArmEvidence::BaseWrist(e) = &geometry.arm else {
            return crate::plan::decoupled_plan(model, geometry, fallback);
        };
        let inner = &e.mirrored;
        let hand = inner.family.module();
        let step = hand.position_step().unwrap_or(fallback);
        let mut plan = plan::build(model, inner, Family::BaseWrist, step);
        // The hand's labels are the plan's: read by solving when the hand's are.
        plan.labels_by_solving = hand.labels_by_solving();
        plan
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::BaseWrist(e) = arm else {
            return Vec::new();
        };
        let w = &e.wrist;
        let mut items = vec![
            Judged::new(
                "base_wrist_center",
                "base wrist center: where axes 1, 2, 3 meet (base frame, every joint at zero)",
                Value::Point(w.center),
            ),
            Judged::new(
                "base_wrist_miss",
                "largest distance of that point from axes 1, 2, 3",
                Value::Length(w.miss),
            ),
            Judged::new(
                "angle_1_2",
                "angle between axes 1 and 2",
                Value::Angle(w.angle_5_6),
            ),
            Judged::new(
                "angle_2_3",
                "angle between axes 2 and 3",
                Value::Angle(w.angle_4_5),
            ),
            Judged::new(
                "base_wrist_reaches_every_orientation",
                "the base wrist reaches every orientation",
                Value::Flag(w.reaches_every_orientation),
            ),
        ];
        items.extend(
            e.hand
                .module()
                .evidence(&e.mirrored.arm)
                .into_iter()
                .map(|j| Judged {
                    key: j.key,
                    label: format!(
                        "seen from the tool (joint i of the mirrored arm is joint 7 − i): {}",
                        j.label
                    ),
                    value: j.value,
                }),
        );
        items
    }

    fn label_words(&self) -> [&'static str; 3] {
        [
            "E'2 E'3 b",
            "the labels read on the mirrored arm (its joint i is joint 7 − i here, about the \
             reversed axis, with the same value): the meeting point b of axes 1–3 moved by its \
             joints 2 and 3 (joints 5 and 4 here), its axes written h' and numbered as its own",
            "h'4 × h'5",
        ]
    }

    fn placed_point(&self) -> &'static str {
        "meeting point of axes 1–3 seen from the tool"
    }

    fn summary(&self) -> &'static str {
        "wrist at the base: axes 1, 2, 3 meet in one point (mirrored decoupling)"
    }

    fn solution_parts(&self) -> [&'static str; 2] {
        ["joints 6–4", "joints 1–3"]
    }

    fn steps(&self, plan: &Plan) -> Steps {
        steps::steps(plan)
    }

    fn decoupling(&self) -> &'static str {
        "Wrist: **at the base** (axes 1, 2 and 3 meet in one point; axes 4, 5 and 6 do not), \
         solved by mirrored decoupling."
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let a = |i: usize, j: usize| Part::angle(line_angle(arm, i, j));
        let mut lines = Vec::new();
        if let ArmEvidence::BaseWrist(e) = &geometry.arm {
            lines.push(vec![
                Part::text("axes 1, 2, 3 meet: their meeting point is "),
                Part::length(e.wrist.miss),
                Part::text(" from the farthest of them"),
            ]);
            lines.push(vec![
                Part::text("axis 1 ∦ axis 2 and axis 2 ∦ axis 3: angles "),
                a(1, 2),
                Part::text(" and "),
                a(2, 3),
            ]);
            lines.push(vec![Part::text(format!(
                "joints 6, 5, 4 seen from the tool are a {} arm ({}): its conditions hold on \
                 the mirrored arm",
                e.hand.name(),
                e.hand.pattern()
            ))]);
        }
        lines
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        let ArmEvidence::BaseWrist(e) = &geometry.arm else {
            return crate::classify::decoupled::verify_hints(joints, geometry);
        };
        let mirrored = mirror::mirrored_joints(joints);
        let inner = e.hand.module().verify_hints(&mirrored, &e.mirrored);
        mirror::renumber_hints(inner)
    }
}
