//! The middle-slide family: R P R (joint 2 a slide, joints 1 and 3 turning about any axes)
//! with a spherical wrist. Pieper's criterion holds (axes 4–6 meet); joints 1–3 are solved
//! through a quartic in joint 3, or through a quadratic when the slide is ⟂ axis 1 (see
//! [`plan`]). Recognition and evidence here, the review sheet's steps in [`steps`].
//!
//! Rejected with the reason: the wrist center on axis 3 (joint 3 cannot move it); a slide ⟂
//! axis 1 with axis 3 ∥ axis 1 (no joint changes the height along axis 1); a slide along
//! axis 1 with axis 3 on axis 1 (joints 1 and 3 turn about one line).

pub mod plan;
mod steps;

use std::f64::consts::FRAC_PI_2;

use armforge_runtime::Joint;
use nalgebra::Point3;

use super::data::{Judged, Part, Value, VerifyHints};
use super::{Family, FamilyModule, Recognition};
use crate::classify::context::Context;
use crate::classify::evidence::{arr, Measured};
use crate::classify::reject::{Quantity, Rejection};
use crate::classify::{decoupled, ArmEvidence, Geometry, Singularity};
use crate::model::Model;
use crate::plan::Plan;

/// Evidence of a middle-slide arm (R P R), measured on the joint lines at zero.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct MiddleSlideEvidence {
    /// The unit slide direction of joint 2.
    pub slide_direction: [f64; 3],
    /// The angle between the slide and axis 1, `[0, π/2]`.
    pub slide_angle_to_axis_1: f64,
    /// True when the slide is ⟂ axis 1 (within the angle tolerance): it keeps the height along
    /// axis 1, and joint 3 alone sets it.
    pub level: bool,
    /// The angle between axes 1 and 3, `[0, π/2]`.
    pub angle_1_3: f64,
    /// The length of the common normal of axes 1 and 3 at zero, metres.
    pub common_normal_1_3: f64,
    /// The distance of the wrist center from axis 3, metres.
    pub wrist_center_from_axis_3: f64,
}

/// The middle-slide family.
pub struct MiddleSlide;

/// The registry's entry.
pub static MIDDLE_SLIDE: MiddleSlide = MiddleSlide;

/// True when the slide is ⟂ axis 1 within the angle tolerance.
fn level(ctx: &Context) -> bool {
    ctx.angle(1, 2) >= FRAC_PI_2 - ctx.tol.angle
}

/// Middle slide: the wrist center off axis 3 (joint 3 moves it); a level slide with axis 3
/// not ∥ axis 1 (something changes the height along axis 1); a slide along axis 1 with axis 3
/// not on axis 1 (joints 1 and 3 not about one line).
fn check(ctx: &Context, center: &Point3<f64>) -> Result<(), Rejection> {
    let u = &ctx.model.units;
    let label = |n: usize| ctx.model.joint_label(n - 1);
    let distance = ctx.line(3).distance_to(center);
    if distance <= ctx.tol.distance {
        return Err(ctx.reject_family(
            "middle_slide_wrist_center_on_axis_3",
            3,
            format!(
                "joints 1–3 are R P R and the wrist center lies on the axis of {} ({} from \
                 it): joint 3 cannot move the wrist center, so joints 1 and 2 alone must place \
                 it in space and the arm lacks one degree of freedom everywhere (a degenerate \
                 arm)",
                label(3),
                u.show_length(distance)
            ),
            vec![("distance", Quantity::Length(distance))],
        ));
    }
    if level(ctx) && ctx.parallel(1, 3) {
        let angles = [ctx.angle(1, 2), ctx.angle(1, 3)];
        return Err(ctx.reject_family(
            "middle_slide_height_fixed",
            3,
            format!(
                "joints 1–3 are R P R, the slide of {} is ⟂ axis 1 ({} to it) and the axis of \
                 {} is ∥ axis 1 ({} to it): no joint changes the wrist center's height along \
                 axis 1, so the arm reaches only one height (a degenerate arm)",
                label(2),
                u.show_angle(angles[0]),
                label(3),
                u.show_angle(angles[1])
            ),
            vec![
                ("slide_angle", Quantity::Angle(angles[0])),
                ("axis_3_angle", Quantity::Angle(angles[1])),
            ],
        ));
    }
    if ctx.parallel(1, 2) && ctx.parallel(1, 3) {
        let distance = ctx.gap(1, 3);
        if distance <= ctx.tol.distance {
            return Err(ctx.reject_family(
                "middle_slide_axes_1_and_3_one_line",
                3,
                format!(
                    "joints 1–3 are R P R, the slide of {} runs along axis 1 and the axis of {} \
                     is axis 1 ({} apart): joints 1 and 3 turn about one line, so the arm lacks \
                     one degree of freedom everywhere (a degenerate arm)",
                    label(2),
                    label(3),
                    u.show_length(distance)
                ),
                vec![("distance", Quantity::Length(distance))],
            ));
        }
    }
    Ok(())
}

fn measure(ctx: &Context, center: &Point3<f64>) -> Measured {
    Measured {
        arm: ArmEvidence::MiddleSlide(MiddleSlideEvidence {
            slide_direction: arr(&ctx.line(2).direction.into_inner()),
            slide_angle_to_axis_1: ctx.angle(1, 2),
            level: level(ctx),
            angle_1_3: ctx.angle(1, 3),
            common_normal_1_3: ctx.gap(1, 3),
            wrist_center_from_axis_3: ctx.line(3).distance_to(center),
        }),
        reach: None,
        singularities: vec![Singularity::WristCenterOnAxis1 { reachable: None }],
    }
}

fn position(
    g: &mut crate::plan::graph::Graph,
    arm: &crate::plan::Arm,
    t: &crate::plan::Target,
    ct: crate::plan::vec3::V3,
) -> crate::plan::Position {
    let k = plan::constants(arm);
    let (shoulder, elbow) = plan::rules(arm, &k);
    crate::plan::Position {
        solutions: plan::solve(g, arm, &k, t, ct),
        shoulder,
        elbow,
    }
}

impl FamilyModule for MiddleSlide {
    fn family(&self) -> Family {
        Family::MiddleSlide
    }

    fn name(&self) -> &'static str {
        "middle-slide"
    }

    fn pattern(&self) -> &'static str {
        "R P R"
    }

    /// The four real roots a quartic can have (Pieper 1968); a level slide: 2 × 2.
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        decoupled::recognise(ctx, self, check, measure)
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        let mut plan = crate::plan::decoupled_plan(model, geometry, position);
        plan.labels_by_solving = self.labels_by_solving();
        plan
    }

    fn labels_by_solving(&self) -> bool {
        true
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::MiddleSlide(e) = arm else {
            return Vec::new();
        };
        vec![
            Judged::new(
                "slide_2_direction",
                "slide of joint 2 (direction at zero)",
                Value::Direction(e.slide_direction),
            ),
            Judged::new(
                "slide_2_angle_to_axis_1",
                if e.level {
                    "angle between slide 2 and axis 1 (⟂: joint 3 alone sets the height)"
                } else {
                    "angle between slide 2 and axis 1 (not ⟂: a quartic in joint 3)"
                },
                Value::Angle(e.slide_angle_to_axis_1),
            ),
            Judged::new(
                "angle_1_3",
                "angle between axes 1 and 3",
                Value::Angle(e.angle_1_3),
            ),
            Judged::new(
                "common_normal_1_3",
                "common normal of axes 1 and 3 at zero",
                Value::Length(e.common_normal_1_3),
            ),
            Judged::new(
                "wrist_center_from_axis_3",
                "distance of the wrist center from axis 3",
                Value::Length(e.wrist_center_from_axis_3),
            ),
        ]
    }

    fn decoupling(&self) -> &'static str {
        "Wrist: **spherical** (axes 4, 5 and 6 meet in one point, the wrist center); joints 1–3 \
         are R P R: the wrist center's height along axis 1 and its distance from axis 1's \
         point give a quartic in joint 3 (Pieper 1968), solved by Ferrari's method, or, with \
         the slide ⟂ axis 1, one equation in joint 3 and a quadratic in the slide."
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let mut lines = decoupled::wrist_conditions(geometry);
        let k = plan::constants(arm);
        lines.push(vec![
            Part::text(match k.layout {
                plan::Layout::Tilted => "slide 2 not ⟂ axis 1 (a quartic in joint 3): angle ",
                plan::Layout::Level => "slide 2 ⟂ axis 1 (joint 3 alone sets the height): angle ",
            }),
            Part::angle(decoupled::line_angle(arm, 1, 2)),
        ]);
        if k.layout == plan::Layout::Level {
            lines.push(vec![
                Part::text("axis 3 ∦ axis 1 (joint 3 changes the height): angle "),
                Part::angle(decoupled::line_angle(arm, 1, 3)),
            ]);
        }
        lines.push(vec![
            Part::text("the wrist center off axis 3: "),
            Part::length(decoupled::distance_from_axis(
                arm,
                3,
                &geometry.wrist_center,
            )),
        ]);
        lines
    }

    fn steps(&self, plan: &Plan) -> crate::family::Steps {
        steps::steps(plan)
    }

    fn reach_lines(&self, plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        let k = plan::constants(&plan.arm);
        let mut lines = vec![vec![Part::text(
            "where two roots merge, two solutions meet (the position Jacobian \
             `(h1 × x) · (e2 × P′)` vanishes there); the slide's stroke bounds the reach",
        )]];
        if k.layout == plan::Layout::Level {
            use crate::plan::vec3::num::dot;
            let radius = dot(&k.h1, &k.pc).hypot(dot(&k.h1, &k.ps));
            lines.push(vec![
                Part::text("joint 3 alone sets the height along axis 1: `|ζ − h1·p0|` at most "),
                Part::length(radius),
                Part::text(" (`h1·p0` = "),
                Part::length(dot(&k.h1, &k.p0)),
                Part::text(")"),
            ]);
        }
        lines
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        decoupled::verify_hints(joints, geometry)
    }

    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        Some(position)
    }
}
