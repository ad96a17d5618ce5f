//! The general-slide family: R R P whose slide is not ⟂ axis 2 (no named family: the polar
//! family takes the slide ⟂ axis 2), a spherical wrist. It is the general family with joint 3
//! a slide: the same reduction, the same back substitution, the same labels and routing
//! ([`super::plan`], [`super::axes_1_2`]), with the equations in joint 3 polynomials in the
//! slide's value `d3` instead of trigonometric polynomials in `θ3`.
//!
//! # The equations (verified in `compiler/tests/solver_general_slide.rs`)
//!
//! With the slide's direction `e3` (fixed in link 2) and the wrist center `c` at zero, joint 3
//! moves the wrist center to `r(d3) = (c − f2) + d3 e3 = r0 + d3 e3` (from `f2`, the foot of
//! the common normal on axis 2), linear in `d3`. So, in the general family's symbols:
//!
//! * axes 1 and 2 apart and not parallel: `Z = h2 · r` and `Y = (ζ − cos α Z)/sin α` are
//!   linear, `|r|² = |r0|² + 2 (r0 · e3) d3 + d3²` is monic quadratic, `X = (ρ − a² − |r|²)/(2a)`
//!   quadratic, and `4a² F(d3) = (2aX)² + 4a² (Y² + Z² − |r|²)` is a monic quartic in `d3`
//!   (its leading term is `d3⁴`, from `(2aX)²`): at most 4 real roots (Pieper 1968), by
//!   Ferrari's method; joint 2 by Paden–Kahan subproblem 1 in the plane ⟂ `h2`, joint 1 about
//!   `h1`, unchanged;
//! * axes 1 and 2 meeting at `O`: joints 1 and 2 keep the distance from `O`, `|r(d3)|² = ρ`, a
//!   monic quadratic in `d3` (2 roots), then joints 2 and 1 by Paden–Kahan subproblem 2 (2 each):
//!   at most 4;
//! * axes 1 and 2 parallel: joints 1 and 2 keep the height along the axes, `Z(d3) = ±ζ`,
//!   linear in `d3` with slope `h2 · e3` (1 root, when the slide is not ⟂ the axes), then the
//!   law of cosines in the plane ⟂ the axes (2 solutions): at most 2.
//!
//! # Degenerate arms (rejected with the numbers)
//!
//! * axes 1 and 2 one line: joints 1 and 2 turn the arm alike;
//! * axes 1 and 2 parallel and the slide ⟂ them: no joint changes the wrist center's height
//!   along axis 1;
//! * the slide along axis 2 (parallel) with the wrist center on axis 2: joint 2 cannot move it.
//!
//! In every other R R P arm with a spherical wrist the position Jacobian
//! `[h1 × (w − p1), h2 × (w − p2), R2 e3]` is regular somewhere, and the equations above keep
//! all three joints.

use armforge_runtime::Joint;
use nalgebra::Point3;

use super::super::data::{Judged, Part, Value, VerifyHints};
use super::super::{Family, FamilyModule, Recognition};
use crate::classify::context::Context;
use crate::classify::evidence::Measured;
use crate::classify::reject::{Quantity, Reason, Rejection};
use crate::classify::{decoupled, ArmEvidence, Geometry, Singularity};
use crate::model::Model;
use crate::plan::vec3::num;
use crate::plan::Plan;

/// Evidence of a general-slide arm (R R P with the slide not ⟂ axis 2).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct GeneralSlideEvidence {
    /// The length of the common normal of axes 1 and 2 (`a`), metres.
    pub common_normal_1_2: f64,
    /// The angle between the lines of axes 1 and 2 (`α`), `[0, π/2]`.
    pub angle_1_2: f64,
    /// The unit direction of the slide of joint 3, base frame at zero.
    pub slide_direction: [f64; 3],
    /// The angle between the slide and axis 2, `[0, π/2)`.
    pub slide_angle_to_axis_2: f64,
    /// The distance of the wrist center from axis 2 at zero, metres.
    pub wrist_center_from_axis_2: f64,
}

/// The general-slide family.
pub struct GeneralSlide;

/// The registry's entry.
pub static GENERAL_SLIDE: GeneralSlide = GeneralSlide;

/// The polar family's shape: axis 1 ∦ axis 2 and the slide ⟂ axis 2 (that family solves it).
fn polar_shape(ctx: &Context) -> bool {
    !ctx.parallel(1, 2) && ctx.angle(2, 3) >= std::f64::consts::FRAC_PI_2 - ctx.tol.angle
}

/// The conditions the slide's equations need (see the module doc).
fn check(ctx: &Context, center: &Point3<f64>) -> Result<(), Rejection> {
    let u = &ctx.model.units;
    let label = |n: usize| ctx.model.joint_label(n - 1);
    if ctx.parallel(1, 2) {
        let distance = ctx.gap(1, 2);
        if distance <= ctx.tol.distance {
            return Err(ctx.reject(Reason::GeneralAxes1And2OneLine { distance }, 2, Vec::new()));
        }
        let angle = ctx.angle(2, 3);
        if angle >= std::f64::consts::FRAC_PI_2 - ctx.tol.angle {
            return Err(ctx.reject_family(
                "general_slide_no_height",
                3,
                format!(
                    "the axes of {} and {} are parallel and the slide of {} makes {} with them: \
                     no joint changes the wrist center's height along axis 1, so joints 1–3 \
                     cannot place it in space",
                    label(1),
                    label(2),
                    label(3),
                    u.show_angle(angle)
                ),
                vec![("angle", Quantity::Angle(angle))],
            ));
        }
    }
    if ctx.parallel(2, 3) {
        let distance = ctx.line(2).distance_to(center);
        if distance <= ctx.tol.distance {
            return Err(ctx.reject_family(
                "general_slide_along_axis_2",
                3,
                format!(
                    "the slide of {} runs along the axis of {} (angle {}) and the wrist center \
                     is on that axis ({} away): joint 2 cannot move the wrist center, so \
                     joints 1–3 cannot place it in space",
                    label(3),
                    label(2),
                    u.show_angle(ctx.angle(2, 3)),
                    u.show_length(distance)
                ),
                vec![("distance", Quantity::Length(distance))],
            ));
        }
    }
    Ok(())
}

fn measure(ctx: &Context, center: &Point3<f64>) -> Measured {
    let slide = ctx.line(3).direction.into_inner();
    Measured {
        arm: ArmEvidence::GeneralSlide(GeneralSlideEvidence {
            common_normal_1_2: ctx.gap(1, 2),
            angle_1_2: ctx.angle(1, 2),
            slide_direction: [slide.x, slide.y, slide.z],
            slide_angle_to_axis_2: ctx.angle(2, 3),
            wrist_center_from_axis_2: ctx.line(2).distance_to(center),
        }),
        reach: None,
        singularities: vec![Singularity::WristCenterOnAxis1 { reachable: None }],
    }
}

impl FamilyModule for GeneralSlide {
    fn family(&self) -> Family {
        Family::GeneralSlide
    }

    fn name(&self) -> &'static str {
        "general-slide"
    }

    fn pattern(&self) -> &'static str {
        "R R P"
    }

    /// The four real roots a quartic can have (Pieper 1968).
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        // The polar family's shape: its plan (or its rejection) stands.
        if polar_shape(ctx) {
            return Recognition::NotMine(None);
        }
        decoupled::recognise(ctx, self, check, measure)
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        let mut plan = crate::plan::decoupled_plan(model, geometry, super::position);
        plan.labels_by_solving = self.labels_by_solving();
        plan
    }

    fn labels_by_solving(&self) -> bool {
        true
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::GeneralSlide(e) = arm else {
            return Vec::new();
        };
        vec![
            Judged::new(
                "common_normal_1_2",
                "common normal of axes 1 and 2 (a)",
                Value::Length(e.common_normal_1_2),
            ),
            Judged::new(
                "angle_1_2",
                "angle between axes 1 and 2 (α)",
                Value::Angle(e.angle_1_2),
            ),
            Judged::new(
                "slide_direction",
                "slide of joint 3 (direction at zero)",
                Value::Direction(e.slide_direction),
            ),
            Judged::new(
                "slide_angle_to_axis_2",
                "angle between the slide and axis 2 (not 90°: no named family)",
                Value::Angle(e.slide_angle_to_axis_2),
            ),
            Judged::new(
                "wrist_center_from_axis_2",
                "distance of the wrist center from axis 2 at zero",
                Value::Length(e.wrist_center_from_axis_2),
            ),
        ]
    }

    fn decoupling(&self) -> &'static str {
        "Wrist: **spherical** (axes 4, 5 and 6 meet in one point, the wrist center); joints 1–3 \
         R R P of no named family (the slide not ⟂ axis 2): the wrist center's distance from \
         axis 1's foot and its height along axis 1 give a quartic in the slide's value \
         (Pieper 1968), solved by Ferrari's method."
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let mut lines = decoupled::wrist_conditions(geometry);
        lines.push(vec![
            Part::text("axes 1 and 2 not one line: angle "),
            Part::angle(decoupled::line_angle(arm, 1, 2)),
            Part::text(", common normal "),
            Part::length(decoupled::gap(arm, 1, 2)),
        ]);
        lines.push(vec![
            Part::text("slide 3 not ⟂ axis 2 (no named family): angle "),
            Part::angle(decoupled::line_angle(arm, 2, 3)),
        ]);
        lines.push(vec![
            Part::text("the wrist center off axis 2: "),
            Part::length(decoupled::distance_from_axis(
                arm,
                2,
                &geometry.wrist_center,
            )),
        ]);
        lines
    }

    fn steps(&self, plan: &Plan) -> crate::family::Steps {
        super::steps::steps(plan)
    }

    fn reach_lines(&self, plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        let j3 = &plan.arm.joints[2];
        let stroke = [j3.model_value(j3.limits[0]), j3.model_value(j3.limits[1])];
        let along = num::dot(&plan.arm.axis(1), &plan.arm.axis(2));
        vec![
            vec![Part::text(
                "the reach of a general-slide arm has no simple closed form: where two roots of \
                 the slide's equation merge, two solutions meet (the position Jacobian is \
                 singular there)",
            )],
            vec![
                Part::text("the slide's stroke (model values of `d3`): "),
                Part::length(stroke[0].min(stroke[1])),
                Part::text(" to "),
                Part::length(stroke[0].max(stroke[1])),
                Part::text(format!(
                    "; a root outside it is dropped by the limits (`h2 · e3` = {})",
                    crate::units::tidy(along)
                )),
            ],
        ]
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        decoupled::verify_hints(joints, geometry)
    }

    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        Some(super::position)
    }
}
