//! The offset-hand family: six revolute joints, axes 2, 3 and 4 parallel, axes 5 and 6
//! passing apart (at any angle, parallel included). Pieper (1968): parallel axes meet at
//! infinity, so the arm has a closed form, here through a quartic in joint 5 (the shared
//! plane–line step). Recognition, evidence, the review's conditions and `verify` hints here;
//! the plan in [`plan`], the review sheet's steps in [`steps`].
//!
//! The arms whose axes 5 and 6 meet are the three-parallel family's (simpler equations, no
//! quartic); both families share its degeneracy checks, its planar chain of joints 2–4 and its
//! label rules. Axes 3–5 parallel with axes 1 and 2 apart are this family's arms read from the
//! tool: the tool-first family solves them through [`plan::target_step`].

pub mod plan;
mod steps;

use armforge_runtime::{Joint, JointKind};

use super::data::{Distance, Judged, Part, Role, SamplerBoundary, Steps, Value, VerifyHints};
use super::three_parallel::{self, aligned_at, bend_singularities, chain};
use super::{Family, FamilyModule, Found, Recognition};
use crate::classify::context::Context;
use crate::classify::decoupled::{gap, line_angle};
use crate::classify::evidence::{arr, show_joint_values};
use crate::classify::{ArmEvidence, Geometry, Singularity};
use crate::model::Model;
use crate::plan::wrist::ALIGNED_SINE;
use crate::plan::Plan;

/// The offset-hand family.
pub struct OffsetHand;

/// The registry's entry.
pub static OFFSET_HAND: OffsetHand = OffsetHand;

/// Evidence of an offset-hand arm, measured on the joint lines (metres, radians).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct OffsetHandEvidence {
    /// The common direction of axes 2, 3 and 4 (axis 2's), base frame.
    pub direction: [f64; 3],
    /// The largest angle between axes 2–3 and 3–4 (zero for exactly parallel axes).
    pub parallel_miss: f64,
    /// The angle between axis 1 and the parallel axes.
    pub angle_1_to_parallel: f64,
    /// The angle between axis 5 and the parallel axes, `[0, π/2]`.
    pub angle_5_to_parallel: f64,
    /// The angle between axes 5 and 6, `[0, π/2]`.
    pub angle_5_6: f64,
    /// How far axes 5 and 6 pass apart, metres.
    pub gap_5_6: f64,
    /// The midpoint of the common normal of axes 5 and 6 (the point the shoulder label
    /// follows), base frame at zero, metres.
    pub hand_point: [f64; 3],
    /// Upper arm: the distance between axes 2 and 3, metres.
    pub upper_arm: f64,
    /// Forearm: the distance between axes 3 and 4, metres.
    pub forearm: f64,
    /// A point of axis 4 at zero (the one nearest axis 3's point), metres.
    pub axis_4_point: [f64; 3],
    /// The distance of axis 4 from axis 2, `[|upper − fore|, upper + fore]`, metres.
    pub reach_from_axis_2: [f64; 2],
    /// Model values of joint 5 (radians) at which axis 6 is parallel to axes 2–4.
    pub aligned_at: Vec<f64>,
}

/// The family's singular configurations: axis 6 along the parallel axes, axes 1 and 6 in one
/// plane, the planar chain stretched or folded.
fn singularities(ctx: &Context, aligned: &[f64]) -> Vec<Singularity> {
    let mut out = vec![if aligned.is_empty() {
        Singularity::Described {
            name: "axis_6_never_parallel",
            text: "axis 6 never parallel to axes 2–4 (the angles of axes 5–6 and 5–2 differ)"
                .into(),
            equation: "`1 − μ² = |m⊥|²` never reaches 0 (`μ = h6 · R5ᵀ h`): joint 6 always \
                       turns axis 1's line."
                .into(),
        }
    } else {
        Singularity::Described {
            name: "axis_6_parallel",
            text: format!(
                "axis 6 parallel to axes 2–4 at joint 5 = {}: joint 6 and the sum of joints \
                 2–4 turn about parallel axes, only their sum is fixed",
                show_joint_values(ctx.model, 5, aligned)
            ),
            equation: format!(
                "`1 − μ² = 0` (`μ = h6 · R5ᵀ h`): within a sine of {ALIGNED_SINE:e} the solver \
                 keeps joint 6 at the reference and the sum `Φ` takes the rest."
            ),
        }
    }];
    out.push(Singularity::Described {
        name: "axes_1_and_6_coplanar",
        text: "axis 1 and axis 6 in one plane (meeting or parallel): a force along the \
               parallel axes through their meeting point meets every axis, two solutions merge"
            .into(),
        equation: "`w = h6 · (a × b) = 0` makes the quartic a perfect square: its roots are \
                   double, each root gets one Newton step on the two equations and a copy of \
                   a real root is dropped."
            .into(),
    });
    out.extend(bend_singularities(ctx, &chain(ctx)));
    out
}

fn measure(ctx: &Context) -> Found {
    let h = ctx.line(2).direction.into_inner();
    let q = three_parallel::plan::meeting_point(
        arr(&ctx.line(5).point.coords),
        arr(&ctx.line(5).direction.into_inner()),
        arr(&ctx.line(6).point.coords),
        arr(&ctx.line(6).direction.into_inner()),
    );
    let planar = chain(ctx);
    let aligned = aligned_at(ctx, &h);
    let singularities = singularities(ctx, &aligned);
    let evidence = OffsetHandEvidence {
        direction: arr(&h),
        parallel_miss: ctx.angle(2, 3).max(ctx.angle(3, 4)),
        angle_1_to_parallel: ctx.angle(1, 2),
        angle_5_to_parallel: ctx.angle(5, 2),
        angle_5_6: ctx.angle(5, 6),
        gap_5_6: ctx.gap(5, 6),
        hand_point: q,
        upper_arm: planar.upper_arm,
        forearm: planar.forearm,
        axis_4_point: arr(&planar.on_4.coords),
        reach_from_axis_2: planar.rho,
        aligned_at: aligned,
    };
    Found {
        center: q,
        wrist: None,
        arm: ArmEvidence::OffsetHand(evidence),
        reach: None,
        singularities,
        solutions: [4, 2],
    }
}

impl FamilyModule for OffsetHand {
    fn family(&self) -> Family {
        Family::OffsetHand
    }

    fn name(&self) -> &'static str {
        "offset-hand"
    }

    fn pattern(&self) -> &'static str {
        "R R R R R R"
    }

    /// Four roots of the quartic in joint 5 (each with its joints 6 and 1).
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        let all_turn = (1..=6).all(|n| ctx.kind(n) == JointKind::Revolute);
        if !all_turn || !ctx.three_parallel(2) || !three_parallel::axes_5_6_apart(ctx) {
            return Recognition::NotMine(None);
        }
        if let Some(rejected) = three_parallel::degenerate(ctx) {
            return rejected;
        }
        Recognition::Mine(measure(ctx))
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        plan::build(model, geometry)
    }

    fn target_step(&self) -> Option<super::TargetStep> {
        Some(plan::target_step)
    }

    fn labels_by_solving(&self) -> bool {
        true
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::OffsetHand(e) = arm else {
            return Vec::new();
        };
        vec![
            Judged::new(
                "parallel_direction",
                "direction of the parallel axes 2, 3 and 4",
                Value::Direction(e.direction),
            ),
            Judged::new(
                "parallel_miss",
                "largest angle between axes 2–3 and 3–4",
                Value::Angle(e.parallel_miss),
            ),
            Judged::new(
                "angle_1_2",
                "angle between axis 1 and the parallel axes",
                Value::Angle(e.angle_1_to_parallel),
            ),
            Judged::new(
                "upper_arm",
                "upper arm (distance between axes 2 and 3)",
                Value::Length(e.upper_arm),
            ),
            Judged::new(
                "forearm",
                "forearm (distance between axes 3 and 4)",
                Value::Length(e.forearm),
            ),
            Judged::new(
                "angle_5_to_parallel",
                "angle between axis 5 and the parallel axes",
                Value::Angle(e.angle_5_to_parallel),
            ),
            Judged::new(
                "angle_5_6",
                "angle between axes 5 and 6",
                Value::Angle(e.angle_5_6),
            ),
            Judged::new(
                "gap_5_6",
                "common normal of axes 5 and 6 (how far they pass apart)",
                Value::Length(e.gap_5_6),
            ),
            Judged::new(
                "hand_point",
                "midpoint of the common normal of axes 5 and 6 (base frame, every joint at \
                 zero)",
                Value::Point(e.hand_point),
            ),
        ]
    }

    fn placed_point(&self) -> &'static str {
        "plane ⟂ the parallel axes"
    }

    fn label_words(&self) -> [&'static str; 3] {
        [
            "E2 ⋯ E6 q",
            "the midpoint of the common normal of axes 5 and 6 moved by joints 2–6 (joint 1 \
             undone); the elbow label reads the bend of joints 2–3 placing axis 4. The labels \
             are read by solving: the wrist label of a root of the quartic is the sign of its \
             two equations' Jacobian in (θ6, −θ5), which changes only where two roots merge; \
             the wrist rule below is the fallback",
            "h5 × h2",
        ]
    }

    fn summary(&self) -> &'static str {
        "no spherical wrist: axes 2, 3, 4 parallel, axes 5 and 6 pass apart (an offset hand)"
    }

    fn solution_parts(&self) -> [&'static str; 2] {
        ["joints 1, 5, 6 (the quartic)", "joints 2–4"]
    }

    fn decoupling(&self) -> &'static str {
        "No spherical wrist: axes 2, 3 and 4 are parallel (they meet at infinity, Pieper 1968) \
         and axes 5 and 6 pass apart: joints 1, 5 and 6 through a quartic, joints 2–4 as a \
         planar chain."
    }

    fn conditions(&self, plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        three_parallel::parallel_conditions(
            plan,
            vec![
                Part::text("axes 5 and 6 pass apart: "),
                Part::length(gap(arm, 5, 6)),
                Part::text(", at angle "),
                Part::angle(line_angle(arm, 5, 6)),
            ],
        )
    }

    fn steps(&self, plan: &Plan) -> Steps {
        steps::steps(plan)
    }

    fn verify_hints(&self, _joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        let ArmEvidence::OffsetHand(e) = &geometry.arm else {
            return VerifyHints {
                aligned_joint: 4,
                aligned_at: Vec::new(),
                axes: [None, None],
                on_axis: None,
                boundaries: Vec::new(),
                roles: crate::classify::decoupled::ROLES,
            };
        };
        // Axis 4's point moves with joints 3 and 2 (its distance from axis 2 sets the bend);
        // the hand point's distance from axis 1 conditions joint 1 as in the three-parallel
        // family, though joint 1 is never free here (it turns a direction, not a point).
        let from_axis_1 = Distance {
            point: e.hand_point,
            moved_by: vec![(5, false), (4, false), (3, false), (2, false), (1, false)],
            axis: 0,
        };
        let from_axis_2 = Distance {
            point: e.axis_4_point,
            moved_by: vec![(2, false), (1, false)],
            axis: 1,
        };
        let boundaries = [
            (e.reach_from_axis_2[1], -1.0),
            (e.reach_from_axis_2[0], 1.0),
        ]
        .into_iter()
        .map(|(at, side)| SamplerBoundary {
            distance: from_axis_2.clone(),
            joint: 2,
            at,
            side,
        })
        .collect();
        VerifyHints {
            aligned_joint: 4,
            aligned_at: e.aligned_at.clone(),
            axes: [Some(from_axis_1), Some(from_axis_2)],
            on_axis: None,
            boundaries,
            // Where axis 6 lines up with axes 2–4, joint 6 joins the planar chain of joints
            // 2–4; joints 1, 5, 6 come from one quartic whose roots merge together.
            roles: [
                Role::Axis(0),
                Role::AxisAndSplit(1),
                Role::BendAndSplit,
                Role::WristSplit,
                Role::WristMiddle,
                Role::WristSplit,
            ],
        }
    }
}
