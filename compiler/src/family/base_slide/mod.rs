//! The base-slide family: P R R (joint 1 a slide, axes 2 and 3 skew), a spherical wrist.
//! Joints 1–3 are solved through a quartic in the slide (Pieper 1968), see [`plan`]; the
//! review sheet's steps in [`steps`].
//!
//! Covered: any slide direction, axes 2 and 3 neither parallel nor meeting, the wrist center
//! off axis 3. Rejected with the reason: the wrist center on axis 3 (joint 3 does not move it:
//! a degenerate arm); axes 2 and 3 parallel with the slide ⟂ them (nothing changes the wrist
//! center's height along them: degenerate); axes 2 and 3 parallel otherwise (a lift then two
//! parallel hinges) or meeting (the distance from their meeting point is fixed): these have
//! closed forms by other equations (a line then the law of cosines; a quadratic then a
//! trigonometric-linear equation), not built (`Δ = 0` removes the quartic).

pub mod plan;
pub mod steps;

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

/// Evidence of a base-slide arm (P R R, axes 2 and 3 skew).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct BaseSlideEvidence {
    /// The unit slide direction of joint 1, base frame.
    pub slide_direction: [f64; 3],
    /// The angle between the slide and axis 2, `[0, π/2]`.
    pub slide_angle_to_axis_2: f64,
    /// The length of the common normal of axes 2 and 3, metres.
    pub common_normal_2_3: f64,
    /// The angle between the lines of axes 2 and 3, `(0, π/2]`.
    pub angle_2_3: f64,
    /// The distance of the wrist center from axis 3, metres.
    pub wrist_center_from_axis_3: f64,
}

/// The base-slide family.
pub struct BaseSlide;

/// The registry's entry.
pub static BASE_SLIDE: BaseSlide = BaseSlide;

/// Degenerate base-slide arms: the wrist center on axis 3, or axes 2 and 3 parallel and ⟂
/// the slide.
fn check(ctx: &Context, center: &Point3<f64>) -> Result<(), Rejection> {
    let u = &ctx.model.units;
    let label = |n: usize| ctx.model.joint_label(n - 1);
    let distance = ctx.line(3).distance_to(center);
    if distance <= ctx.tol.distance {
        return Err(ctx.reject_family(
            "base_slide_wrist_center_on_axis_3",
            3,
            format!(
                "the wrist center is {} from the axis of {}: turning that joint does not move \
                 it, so joints 1–3 place it with two degrees of freedom, not three (a \
                 degenerate arm)",
                u.show_length(distance),
                label(3)
            ),
            vec![("distance", Quantity::Length(distance))],
        ));
    }
    let slide_angle = ctx.angle(1, 2);
    if ctx.parallel(2, 3) && slide_angle >= std::f64::consts::FRAC_PI_2 - ctx.tol.angle {
        return Err(ctx.reject_family(
            "base_slide_no_height",
            1,
            format!(
                "the axes of {} and {} are parallel ({} apart in angle) and the slide of {} is \
                 at {} to them: no joint changes the wrist center's height along the parallel \
                 axes, so the arm reaches only one plane (a degenerate arm)",
                label(2),
                label(3),
                u.show_angle(ctx.angle(2, 3)),
                label(1),
                u.show_angle(slide_angle)
            ),
            vec![
                ("angle_2_3", Quantity::Angle(ctx.angle(2, 3))),
                ("slide_angle_to_axis_2", Quantity::Angle(slide_angle)),
            ],
        ));
    }
    Ok(())
}

/// Layouts with closed forms the family does not build: axes 2 and 3 parallel or meeting.
fn not_built(ctx: &Context) -> Option<Rejection> {
    let u = &ctx.model.units;
    let label = |n: usize| ctx.model.joint_label(n - 1);
    if ctx.parallel(2, 3) {
        let angle = ctx.angle(2, 3);
        return Some(ctx.reject_family(
            "base_slide_parallel_hinges",
            3,
            format!(
                "joints 1–3 are P R R with the axes of {} and {} parallel ({} apart in angle): \
                 a lift then two parallel hinges, solvable by a line and the law of cosines, \
                 which armforge does not build yet; its base-slide family needs axes 2 and 3 \
                 skew (a quartic in the slide)",
                label(2),
                label(3),
                u.show_angle(angle)
            ),
            vec![("angle_2_3", Quantity::Angle(angle))],
        ));
    }
    let gap = ctx.gap(2, 3);
    if gap <= ctx.tol.distance {
        return Some(ctx.reject_family(
            "base_slide_axes_2_3_meet",
            3,
            format!(
                "joints 1–3 are P R R with the axes of {} and {} meeting (common normal {}): \
                 the wrist center's distance from the meeting point is fixed, so the slide \
                 solves a quadratic and joint 3 a trigonometric-linear equation, which armforge \
                 does not build yet; its base-slide family needs axes 2 and 3 skew (a quartic \
                 in the slide)",
                label(2),
                label(3),
                u.show_length(gap)
            ),
            vec![("common_normal_2_3", Quantity::Length(gap))],
        ));
    }
    None
}

fn measure(ctx: &Context, center: &Point3<f64>) -> Measured {
    Measured {
        arm: ArmEvidence::BaseSlide(BaseSlideEvidence {
            slide_direction: arr(&ctx.line(1).direction.into_inner()),
            slide_angle_to_axis_2: ctx.angle(1, 2),
            common_normal_2_3: ctx.gap(2, 3),
            angle_2_3: ctx.angle(2, 3),
            wrist_center_from_axis_3: ctx.line(3).distance_to(center),
        }),
        reach: None,
        singularities: vec![
            Singularity::Described {
                name: "wrist_center_on_axis_2",
                text: "the wrist center on axis 2: joint 2 does not move it (joint 2 free)".into(),
                equation: "`|y⊥h2| = 0` with `y = c_t − f2 − d1 e1`: the solver sets joint 2 to \
                           zero there"
                    .into(),
            },
            Singularity::Described {
                name: "slide_roots_merge",
                text: "two roots of the slide's quartic merge: two solutions meet (the \
                       position Jacobian is singular)"
                    .into(),
                equation: "`det[e1, h2 × (w − f2), ∂w/∂θ3] = 0`: a double root of `F(τ)`; \
                           both candidates are flagged at the reach boundary"
                    .into(),
            },
        ],
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

impl FamilyModule for BaseSlide {
    fn family(&self) -> Family {
        Family::BaseSlide
    }

    fn name(&self) -> &'static str {
        "base-slide"
    }

    fn pattern(&self) -> &'static str {
        "P R R"
    }

    /// A line meets the surface the wrist center sweeps about axes 2 and 3 in at most 4
    /// points: the four real roots of a quartic (Pieper 1968).
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        match decoupled::recognise(ctx, self, check, measure) {
            Recognition::Mine(found) => match not_built(ctx) {
                Some(r) => Recognition::NotMine(Some(r)),
                None => Recognition::Mine(found),
            },
            other => other,
        }
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
        let ArmEvidence::BaseSlide(e) = arm else {
            return Vec::new();
        };
        vec![
            Judged::new(
                "slide_1_direction",
                "slide of joint 1 (direction at zero)",
                Value::Direction(e.slide_direction),
            ),
            Judged::new(
                "slide_angle_to_axis_2",
                "angle between slide 1 and axis 2",
                Value::Angle(e.slide_angle_to_axis_2),
            ),
            Judged::new(
                "common_normal_2_3",
                "common normal of axes 2 and 3 (not meeting)",
                Value::Length(e.common_normal_2_3),
            ),
            Judged::new(
                "angle_2_3",
                "angle between axes 2 and 3 (not parallel)",
                Value::Angle(e.angle_2_3),
            ),
            Judged::new(
                "wrist_center_from_axis_3",
                "distance of the wrist center from axis 3",
                Value::Length(e.wrist_center_from_axis_3),
            ),
        ]
    }

    fn label_words(&self) -> [&'static str; 3] {
        [
            "E2 E3 c",
            "the wrist center moved by joints 2 and 3 (the slide undone)",
            "h4 × h5",
        ]
    }

    fn decoupling(&self) -> &'static str {
        "Wrist: **spherical** (axes 4, 5 and 6 meet in one point, the wrist center); joints 1–3 \
         P R R with axes 2 and 3 skew: the wrist center's height along axis 2 and its distance \
         from a point of it give a quartic in the slide (Pieper 1968), solved by Ferrari's \
         method."
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let mut lines = decoupled::wrist_conditions(geometry);
        lines.push(vec![
            Part::text("axis 2 ∦ axis 3: angle "),
            Part::angle(decoupled::line_angle(arm, 2, 3)),
        ]);
        lines.push(vec![
            Part::text("axes 2 and 3 apart: common normal "),
            Part::length(decoupled::gap(arm, 2, 3)),
        ]);
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
        let stroke = crate::classify::reach::model_range(&plan.arm.joints[0]);
        vec![
            vec![Part::text(
                "the reach of a base-slide arm has no simple closed form: where two roots of the \
                 slide's quartic merge, two solutions meet (the position Jacobian is singular \
                 there)",
            )],
            vec![
                Part::text("the slide's stroke bounds it along the slide: model values "),
                Part::length(stroke[0]),
                Part::text(" to "),
                Part::length(stroke[1]),
            ],
        ]
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        decoupled::verify_hints(joints, geometry)
    }

    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        Some(position)
    }
}
