//! The general family: R R R whose axes fit no named family (axes 2 and 3 not parallel), a
//! spherical wrist. Joints 1–3 are solved through a quartic (Pieper 1968), see [`plan`], or,
//! when axes 1 and 2 meet or are parallel, through quadratics, see [`axes_1_2`].
//! It comes last in the registry: a named family's plan has simpler equations and better
//! numbers, so an arm that one of them recognises never reaches this one.
//!
//! The general-slide family ([`slide`]: R R P whose slide is not ⟂ axis 2) is this family with
//! joint 3 a slide: [`plan::Constants::slide`] switches the equations in joint 3 from
//! trigonometric polynomials in `θ3` to polynomials in the slide's value; everything else (the
//! back substitution, labels, routing and checks) is shared.

pub mod axes_1_2;
pub mod plan;
pub mod slide;
mod slide_steps;
pub mod steps;

use armforge_runtime::Joint;
use nalgebra::Point3;

use super::data::{Judged, Part, Value, VerifyHints};
use super::{Family, FamilyModule, Recognition};
use crate::classify::context::Context;
use crate::classify::evidence::Measured;
use crate::classify::reject::{Reason, Rejection};
use crate::classify::{decoupled, ArmEvidence, Geometry, Singularity};
use crate::model::Model;
use crate::plan::Plan;

/// Evidence of a general arm (R R R with axes of no named family).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct GeneralEvidence {
    /// The length of the common normal of axes 1 and 2 (`a`), metres.
    pub common_normal_1_2: f64,
    /// The angle between the lines of axes 1 and 2 (`α`), `[0, π/2]`.
    pub angle_1_2: f64,
    /// The length of the common normal of axes 2 and 3, metres.
    pub common_normal_2_3: f64,
    /// The angle between the lines of axes 2 and 3, `(0, π/2]`.
    pub angle_2_3: f64,
    /// The distance of the wrist center from axis 3, metres.
    pub wrist_center_from_axis_3: f64,
}

/// The general family.
pub struct General;

/// The registry's entry.
pub static GENERAL: General = General;

/// General: axes 1 and 2 not one line; when they meet, axis 3 away from their meeting point
/// (joint 3 must change the wrist center's distance from it); the wrist center off axis 3
/// (joint 3 moves it).
fn check(ctx: &Context, center: &Point3<f64>) -> Result<(), Rejection> {
    let distance = ctx.gap(1, 2);
    if distance <= ctx.tol.distance {
        if ctx.parallel(1, 2) {
            return Err(ctx.reject(Reason::GeneralAxes1And2OneLine { distance }, 2, Vec::new()));
        }
        if let Some(meeting) = ctx.meeting(&[1, 2]) {
            let distance = ctx.line(3).distance_to(&meeting.point);
            if distance <= ctx.tol.distance {
                return Err(ctx.reject(Reason::GeneralAxes1To3Meet { distance }, 3, Vec::new()));
            }
        }
    }
    let distance = ctx.line(3).distance_to(center);
    if distance <= ctx.tol.distance {
        return Err(ctx.reject(
            Reason::GeneralWristCenterOnAxis3 { distance },
            3,
            Vec::new(),
        ));
    }
    Ok(())
}

fn measure(ctx: &Context, center: &Point3<f64>) -> Measured {
    Measured {
        arm: ArmEvidence::General(GeneralEvidence {
            common_normal_1_2: ctx.gap(1, 2),
            angle_1_2: ctx.angle(1, 2),
            common_normal_2_3: ctx.gap(2, 3),
            angle_2_3: ctx.angle(2, 3),
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

impl FamilyModule for General {
    fn family(&self) -> Family {
        Family::General
    }

    fn name(&self) -> &'static str {
        "general"
    }

    fn pattern(&self) -> &'static str {
        "R R R"
    }

    /// The four real roots a quartic can have (Pieper 1968).
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        // Axes 2 and 3 parallel is the elbow family's shape: its rejection stands.
        if ctx.parallel(2, 3) {
            return Recognition::NotMine(None);
        }
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
        let ArmEvidence::General(e) = arm else {
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
                "common_normal_2_3",
                "common normal of axes 2 and 3",
                Value::Length(e.common_normal_2_3),
            ),
            Judged::new(
                "angle_2_3",
                "angle between axes 2 and 3 (not parallel: no named family)",
                Value::Angle(e.angle_2_3),
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
         of no named family: the wrist center's distance from axis 1's foot and its height \
         along axis 1 give a quartic in joint 3 (Pieper 1968), solved by Ferrari's method."
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let mut lines = decoupled::wrist_conditions(geometry);
        lines.push(vec![
            Part::text("axis 1 ∦ axis 2: angle "),
            Part::angle(decoupled::line_angle(arm, 1, 2)),
        ]);
        lines.push(vec![
            Part::text("axes 1 and 2 apart: common normal "),
            Part::length(decoupled::gap(arm, 1, 2)),
        ]);
        lines.push(vec![
            Part::text("axis 2 ∦ axis 3 (no named family): angle "),
            Part::angle(decoupled::line_angle(arm, 2, 3)),
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

    fn reach_lines(&self, _plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        vec![vec![Part::text(
            "the reach of a general arm has no simple closed form: where two roots of the \
             quartic merge, two solutions meet (the position Jacobian is singular there)",
        )]]
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        decoupled::verify_hints(joints, geometry)
    }

    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        Some(position)
    }
}
