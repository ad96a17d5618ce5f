//! The mid-wrist family: six revolute joints whose axes 2, 3 and 4 meet in one point `b`, a
//! wrist in the middle of the arm (Pieper 1968: three consecutive axes meeting). The point
//! `b` is fixed in link 1 and in link 4, so joints 1, 5 and 6 place it (Pieper's quartic, read
//! through the target) and joints 2–4 turn the rest. Recognition and evidence here; the plan
//! in [`plan`], the review sheet's steps in [`steps`].
//!
//! Covered: axes 5 and 6 at any angle and offset (apart, meeting or parallel, not one line),
//! axis 1 anywhere that misses `b`, a middle wrist at any angles (one whose angles differ
//! reaches fewer orientations: its candidates say so by their check, as a wrist at joints 4–6
//! does). Rejected with the reason: `b` on axis 1 or on axis 5 (four axes through one point
//! leave a joint that moves nothing), a sliding joint 1, 5 or 6.

pub mod plan;
mod polish;
mod steps;

use armforge_runtime::Joint;

use super::data::{Distance, Judged, Part, Role, SamplerBoundary, Steps, Value, VerifyHints};
use super::{Family, FamilyModule, Found, Recognition};
use crate::classify::context::Context;
use crate::classify::decoupled::{gap, line_angle};
use crate::classify::reject::{Quantity, Reason};
use crate::classify::{ArmEvidence, Geometry, Singularity, WristEvidence};
use crate::model::Model;
use crate::plan::Plan;

/// The mid-wrist family.
pub struct MidWrist;

/// The registry's entry.
pub static MID_WRIST: MidWrist = MidWrist;

/// Evidence of an arm with a wrist in the middle, measured on the joint lines (metres,
/// radians).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct MidWristEvidence {
    /// The middle wrist, axes 2–4, measured as a wrist (its axes 4, 5, 6 are the arm's 2, 3,
    /// 4; its joint-5 values are joint 3's): the meeting point `b`, how far it misses, the
    /// angles, where axes 2 and 4 line up.
    pub wrist: WristEvidence,
    /// The distance of `b` from axis 1.
    pub center_from_axis_1: f64,
    /// The distance of `b` from axis 5.
    pub center_from_axis_5: f64,
    /// The length of the common normal of axes 5 and 6.
    pub common_normal_5_6: f64,
    /// The angle between the lines of axes 5 and 6, `[0, π/2]`.
    pub angle_5_6: f64,
}

/// The arm with joints 2–4 in the places of a wrist (joints 4–6), for the wrist's own
/// analysis; the other places hold joints 1, 5, 6.
fn wrist_model(model: &Model) -> Model {
    let j = &model.joints;
    let mut m = model.clone();
    m.joints = [0, 4, 5, 1, 2, 3].iter().map(|&i| j[i].clone()).collect();
    m
}

/// A rejection with the family's own words.
fn reject(
    ctx: &Context,
    name: &'static str,
    joint: usize,
    message: String,
    measures: Vec<(&'static str, Quantity)>,
) -> Recognition {
    let reason = Reason::Family {
        name,
        message,
        measures,
    };
    Recognition::Degenerate(ctx.reject(reason, joint, Vec::new()))
}

/// The conditions of the family on an arm whose axes 2–4 meet at `b`.
fn check(ctx: &Context, wrist: &WristEvidence) -> Option<Recognition> {
    let u = &ctx.model.units;
    if let Some(n) = [1, 5, 6].into_iter().find(|&n| !ctx.revolute(n)) {
        return Some(reject(
            ctx,
            "mid_wrist_slide",
            n,
            format!(
                "the axes of joints 2, 3 and 4 meet in one point (a wrist in the middle), but \
                 joint {n} slides: the mid-wrist family places the meeting point with joints \
                 1, 5 and 6 turning"
            ),
            Vec::new(),
        ));
    }
    let b = nalgebra::Point3::from(wrist.center);
    let tol = ctx.tol.distance;
    for (n, name) in [(1, "mid_wrist_on_axis_1"), (5, "mid_wrist_on_axis_5")] {
        let d = ctx.line(n).distance_to(&b);
        if d <= tol {
            return Some(reject(
                ctx,
                name,
                n,
                format!(
                    "the axes of joints 2, 3 and 4 meet in one point and axis {n} passes \
                     through it too ({} away, tolerance {}): joint {n} cannot move that point, \
                     so joints 1, 5 and 6 cannot place it",
                    u.show_length(d),
                    u.show_length(tol)
                ),
                vec![("distance", Quantity::Length(d))],
            ));
        }
    }
    if ctx.gap(5, 6) <= tol && ctx.parallel(5, 6) {
        return Some(reject(
            ctx,
            "mid_wrist_axes_5_6_one_line",
            6,
            "axes 5 and 6 are one line: joints 5 and 6 turn about the same line".to_string(),
            vec![("distance", Quantity::Length(ctx.gap(5, 6)))],
        ));
    }
    None
}

/// The family's singular configurations: the middle wrist lined up, and the position chain's
/// merging roots.
fn singularities(model: &Model, wrist: &WristEvidence) -> Vec<Singularity> {
    let aligned = if wrist.aligned_at.is_empty() {
        Singularity::Described {
            name: "mid_wrist_never_aligned",
            text: "middle wrist never aligned: axes 2 and 4 cannot line up (the angles of axes \
                   2–3 and 3–4 differ)"
                .to_string(),
            equation: "none: joint 3 never lines axis 4 up with axis 2".to_string(),
        }
    } else {
        Singularity::Described {
            name: "mid_wrist_aligned",
            text: format!(
                "middle wrist aligned: axes 2 and 4 in one line, joints 2 and 4 turn together, \
                 at joint 3 = {}",
                crate::classify::evidence::show_joint_values(model, 3, &wrist.aligned_at)
            ),
            equation: "|h2 × R3 h4| = 0 (below 1e-10): joint 2 is held at its reference \
                       (`solve_near`: its current value), joint 4 takes the rest; the \
                       candidates are flagged"
                .to_string(),
        }
    };
    let merge = Singularity::Described {
        name: "mid_wrist_chain_merge",
        text: "two placements of the meeting point of axes 2–4 by joints 1, 5 and 6 merge (a \
               double root of the quartic): the pose is at a reach boundary of that point"
            .to_string(),
        equation: "det[∂w/∂θ5, ∂w/∂θ6, ∂w/∂θ1] = 0 for the point w the chain places: the \
                   candidate's residual is then allowed up to det² / scale⁵ and it is flagged \
                   at the reach limit"
            .to_string(),
    };
    vec![aligned, merge]
}

fn measure(ctx: &Context, wrist: WristEvidence) -> Found {
    let b = nalgebra::Point3::from(wrist.center);
    let singularities = singularities(ctx.model, &wrist);
    Found {
        center: wrist.center,
        wrist: None,
        reach: None,
        singularities,
        solutions: [4, 2],
        arm: ArmEvidence::MidWrist(MidWristEvidence {
            center_from_axis_1: ctx.line(1).distance_to(&b),
            center_from_axis_5: ctx.line(5).distance_to(&b),
            common_normal_5_6: ctx.gap(5, 6),
            angle_5_6: ctx.angle(5, 6),
            wrist,
        }),
    }
}

impl FamilyModule for MidWrist {
    fn family(&self) -> Family {
        Family::MidWrist
    }

    fn name(&self) -> &'static str {
        "mid-wrist"
    }

    fn pattern(&self) -> &'static str {
        "R R R R R R"
    }

    /// Pieper's quartic: at most 4 placements of the meeting point.
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        if !ctx.three_meet(2) || ctx.three_meet(1) {
            return Recognition::NotMine(None);
        }
        let moved = wrist_model(ctx.model);
        let Ok(wctx) = Context::new(&moved, &ctx.tolerances) else {
            return Recognition::NotMine(None);
        };
        let Ok(wrist) = crate::classify::wrist::analyse(&wctx) else {
            return Recognition::NotMine(None);
        };
        if let Some(rejected) = check(ctx, &wrist) {
            return rejected;
        }
        Recognition::Mine(measure(ctx, wrist))
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        plan::build(model, geometry)
    }

    fn target_step(&self) -> Option<super::TargetStep> {
        Some(plan::target_step)
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::MidWrist(e) = arm else {
            return Vec::new();
        };
        let w = &e.wrist;
        vec![
            Judged::new(
                "mid_wrist_center",
                "middle wrist center b: where axes 2, 3, 4 meet (base frame, every joint at \
                 zero)",
                Value::Point(w.center),
            ),
            Judged::new(
                "mid_wrist_miss",
                "largest distance of that point from axes 2, 3, 4",
                Value::Length(w.miss),
            ),
            Judged::new(
                "angle_2_3",
                "angle between axes 2 and 3",
                Value::Angle(w.angle_4_5),
            ),
            Judged::new(
                "angle_3_4",
                "angle between axes 3 and 4",
                Value::Angle(w.angle_5_6),
            ),
            Judged::new(
                "mid_wrist_reaches_every_orientation",
                "the middle wrist reaches every orientation",
                Value::Flag(w.reaches_every_orientation),
            ),
            Judged::new(
                "center_from_axis_1",
                "distance of b from axis 1 (the radius joint 1 moves it on)",
                Value::Length(e.center_from_axis_1),
            ),
            Judged::new(
                "center_from_axis_5",
                "distance of b from axis 5",
                Value::Length(e.center_from_axis_5),
            ),
            Judged::new(
                "common_normal_5_6",
                "common normal of axes 5 and 6 (a, in the quartic)",
                Value::Length(e.common_normal_5_6),
            ),
            Judged::new(
                "angle_5_6",
                "angle between axes 5 and 6 (α, in the quartic)",
                Value::Angle(e.angle_5_6),
            ),
        ]
    }

    fn placed_point(&self) -> &'static str {
        "meeting point of axes 2–4"
    }

    fn summary(&self) -> &'static str {
        "wrist in the middle: axes 2, 3, 4 meet in one point (placed by joints 1, 5, 6)"
    }

    fn solution_parts(&self) -> [&'static str; 2] {
        ["joints 1, 5, 6", "joints 2–4"]
    }

    fn label_words(&self) -> [&'static str; 3] {
        [
            "E6 G⁻¹ E1 b",
            "the meeting point b of axes 2–4 carried by joint 1, the target's inverse and joint \
             6 (the position chain read in the general family's terms, axis 5 its first); the \
             labels are read by solving",
            "h2 × h3",
        ]
    }

    fn decoupling(&self) -> &'static str {
        "Wrist: **in the middle** (axes 2, 3 and 4 meet in one point `b`); joints 1, 5 and 6 \
         place `b` (Pieper's quartic), joints 2–4 turn the rest."
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let a = |i: usize, j: usize| Part::angle(line_angle(arm, i, j));
        let mut lines = Vec::new();
        if let ArmEvidence::MidWrist(e) = &geometry.arm {
            lines.push(vec![
                Part::text("axes 2, 3, 4 meet: their meeting point is "),
                Part::length(e.wrist.miss),
                Part::text(" from the farthest of them"),
            ]);
            lines.push(vec![
                Part::text("axis 2 ∦ axis 3 and axis 3 ∦ axis 4: angles "),
                a(2, 3),
                Part::text(" and "),
                a(3, 4),
            ]);
            lines.push(vec![
                Part::text("b off axis 1 and off axis 5: "),
                Part::length(e.center_from_axis_1),
                Part::text(" and "),
                Part::length(e.center_from_axis_5),
            ]);
            lines.push(vec![
                Part::text("axes 5 and 6 not one line: "),
                Part::length(gap(arm, 5, 6)),
                Part::text(" apart, at angle "),
                a(5, 6),
            ]);
        }
        lines
    }

    fn steps(&self, plan: &Plan) -> Steps {
        steps::steps(plan)
    }

    fn labels_by_solving(&self) -> bool {
        true
    }

    /// As the general family's hints for its chain (axes 5, 6 and joint 1's circle): the
    /// meeting point's distance from axis 6 conditions joint 6 (on it, joint 6 cannot move the
    /// point and is free); its distance from axis 5 is fixed (no hint).
    fn verify_hints(&self, _joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        let aligned_at = match &geometry.arm {
            ArmEvidence::MidWrist(e) => e.wrist.aligned_at.clone(),
            _ => Vec::new(),
        };
        let from_axis_6 = Distance {
            point: geometry.wrist_center,
            moved_by: vec![(4, true)],
            axis: 5,
        };
        VerifyHints {
            aligned_joint: 2,
            aligned_at,
            axes: [None, Some(from_axis_6.clone())],
            on_axis: Some(SamplerBoundary {
                distance: from_axis_6,
                joint: 4,
                at: 0.0,
                side: 1.0,
            }),
            boundaries: Vec::new(),
            // The middle wrist's rotation comes after the chain, so its joints take the
            // chain's errors too (the wrist roles include them); and where the middle wrist
            // lines up the chain may be at a fold as well (in a right-angled arm whose axis 1
            // is perpendicular to the plane of axes 5 and 6's motions, say), so joints 1, 5
            // and 6 are split there too.
            roles: [
                Role::BendAndSplit,
                Role::WristSplit,
                Role::WristMiddle,
                Role::WristSplit,
                Role::AxisAndSplit(0),
                Role::AxisAndSplit(1),
            ],
        }
    }
}
