//! The carriage family: P P R (two slides that are not parallel, then a turn) with a spherical
//! wrist: a two-slide carriage carrying a hinge. Joint 3 alone sets the wrist center's height
//! across the slides (one trigonometric equation, 0–2 roots), the slides carry the rest; see
//! [`plan`]. Recognition and evidence here.

pub mod plan;
pub mod steps;

use armforge_runtime::Joint;
use nalgebra::Point3;

use super::data::{Judged, Part, Value, VerifyHints};
use super::{Family, FamilyModule, Recognition};
use crate::classify::context::Context;
use crate::classify::evidence::{show_joint_values, wrap, Measured};
use crate::classify::reject::{Quantity, Rejection};
use crate::classify::{decoupled, ArmEvidence, Geometry, Singularity};
use crate::model::Model;
use crate::plan::{Arm, Plan};

/// Evidence of a carriage arm (P P R).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct CarriageEvidence {
    /// The angle between the two slides, `(0, π/2]`.
    pub angle_between_slides: f64,
    /// The angle between axis 3 and the slides' normal, `[0, π/2]` (not zero: joint 3 must
    /// move the wrist center across the slides).
    pub axis_3_to_normal: f64,
    /// The distance of the wrist center from axis 3, metres.
    pub wrist_center_from_axis_3: f64,
    /// `R`: how far joint 3 moves the wrist center across the slides, each way, metres.
    pub swing: f64,
    /// Joint-3 model values (radians) of the highest and the lowest wrist center across the
    /// slides, where the two solutions merge.
    pub extremes: [f64; 2],
}

/// The carriage family.
pub struct Carriage;

/// The registry's entry.
pub static CARRIAGE: Carriage = Carriage;

/// Carriage: the slides not parallel (they must span a plane), the wrist center off axis 3
/// and axis 3 not ⟂ both slides (joint 3 must move the wrist center across them).
fn check(ctx: &Context, center: &Point3<f64>) -> Result<(), Rejection> {
    let u = &ctx.model.units;
    let label = |n: usize| ctx.model.joint_label(n - 1);
    if ctx.parallel(1, 2) {
        let angle = ctx.angle(1, 2);
        return Err(ctx.reject_family(
            "carriage_slides_parallel",
            2,
            format!(
                "the slides of {} and {} are parallel (angle {}): they move the wrist center \
                 along one line, so with one turn the arm cannot place it in space",
                label(1),
                label(2),
                u.show_angle(angle)
            ),
            vec![("angle", Quantity::Angle(angle))],
        ));
    }
    let distance = ctx.line(3).distance_to(center);
    if distance <= ctx.tol.distance {
        return Err(ctx.reject_family(
            "carriage_wrist_center_on_axis_3",
            3,
            format!(
                "the wrist center is on the axis of {} ({} away): the turn does not move it, \
                 so two slides cannot place it in space",
                label(3),
                u.show_length(distance)
            ),
            vec![("distance", Quantity::Length(distance))],
        ));
    }
    let normal = ctx
        .line(1)
        .direction
        .cross(&ctx.line(2).direction)
        .normalize();
    let sine = ctx.line(3).direction.cross(&normal).norm();
    if sine <= ctx.tol.angle {
        let angle = sine.min(1.0).asin();
        return Err(ctx.reject_family(
            "carriage_axis_3_across_slides",
            3,
            format!(
                "the axis of {} is perpendicular to both slides (it makes {} with their \
                 normal): the turn keeps the wrist center's height across the slides, so \
                 nothing changes it",
                label(3),
                u.show_angle(angle)
            ),
            vec![("angle", Quantity::Angle(angle))],
        ));
    }
    Ok(())
}

fn measure(ctx: &Context, center: &Point3<f64>) -> Measured {
    let arm = Arm::with_center(ctx.model, Family::Carriage, [center.x, center.y, center.z]);
    let k = plan::constants(&arm);
    let normal = nalgebra::Vector3::from(k.n);
    let along = ctx.line(3).direction.dot(&normal).abs().min(1.0);
    let evidence = CarriageEvidence {
        angle_between_slides: ctx.angle(1, 2),
        axis_3_to_normal: along.acos(),
        wrist_center_from_axis_3: ctx.line(3).distance_to(center),
        swing: k.swing,
        extremes: [k.phase, wrap(k.phase + std::f64::consts::PI)],
    };
    Measured {
        singularities: singularities(ctx.model, &evidence),
        arm: ArmEvidence::Carriage(evidence),
        reach: None,
    }
}

/// Where the two solutions merge: the wrist center at its highest or lowest across the slides.
fn singularities(model: &Model, e: &CarriageEvidence) -> Vec<Singularity> {
    let u = &model.units;
    [
        ("swing_highest", e.extremes[0], "e = R"),
        ("swing_lowest", e.extremes[1], "e = −R"),
    ]
    .into_iter()
    .map(|(name, at, equation)| Singularity::Described {
        name,
        text: format!(
            "joint 3 = {}: the wrist center at its {} across the slides (R = {} {} the \
                 height of axis 3's circle), where the two solutions merge",
            show_joint_values(model, 3, &[at]),
            if name == "swing_highest" {
                "highest"
            } else {
                "lowest"
            },
            u.show_length(e.swing),
            if name == "swing_highest" {
                "above"
            } else {
                "below"
            },
        ),
        equation: format!(
            "`{equation}`: `√(R² − e²) = 0`, the two roots of joint 3 are one and the \
                 solver returns it twice with both labels; beyond it the target is out of reach"
        ),
    })
    .collect()
}

fn position(
    g: &mut crate::plan::graph::Graph,
    arm: &Arm,
    _t: &crate::plan::Target,
    ct: crate::plan::vec3::V3,
) -> crate::plan::Position {
    let k = plan::constants(arm);
    let (shoulder, elbow) = plan::rules(&k);
    crate::plan::Position {
        solutions: plan::solve(g, &k, ct),
        shoulder,
        elbow,
    }
}

impl FamilyModule for Carriage {
    fn family(&self) -> Family {
        Family::Carriage
    }

    fn name(&self) -> &'static str {
        "carriage"
    }

    fn pattern(&self) -> &'static str {
        "P P R"
    }

    /// The two roots of one trigonometric equation in joint 3.
    fn position_solutions(&self) -> u32 {
        2
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        decoupled::recognise(ctx, self, check, measure)
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        crate::plan::decoupled_plan(model, geometry, position)
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::Carriage(e) = arm else {
            return Vec::new();
        };
        vec![
            Judged::new(
                "angle_between_slides",
                "angle between slides 1 and 2",
                Value::Angle(e.angle_between_slides),
            ),
            Judged::new(
                "axis_3_to_normal",
                "angle between axis 3 and the slides' normal (not 0°: joint 3 moves the \
                 wrist center across the slides)",
                Value::Angle(e.axis_3_to_normal),
            ),
            Judged::new(
                "wrist_center_from_axis_3",
                "distance of the wrist center from axis 3",
                Value::Length(e.wrist_center_from_axis_3),
            ),
            Judged::new(
                "swing",
                "how far joint 3 moves the wrist center across the slides, each way (R)",
                Value::Length(e.swing),
            ),
        ]
    }

    fn decoupling(&self) -> &'static str {
        "Wrist: **spherical** (axes 4, 5 and 6 meet in one point, the wrist center); joints \
         1–3 are two slides and a turn (carriage family): the turn alone sets the wrist \
         center's height across the slides, the slides carry the rest."
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let k = plan::constants(arm);
        let mut lines = decoupled::wrist_conditions(geometry);
        lines.push(vec![
            Part::text("slide 1 ∦ slide 2: angle "),
            Part::angle(decoupled::line_angle(arm, 1, 2)),
        ]);
        lines.push(vec![
            Part::text("joint 3 moves the wrist center across the slides: R = "),
            Part::length(k.swing),
        ]);
        lines
    }

    fn steps(&self, plan: &Plan) -> crate::family::Steps {
        steps::steps(plan)
    }

    fn reach_lines(&self, plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        let k = plan::constants(&plan.arm);
        vec![vec![
            Part::text("the wrist center's height across the slides stays within `k0 ± R` ("),
            Part::length(k.k0),
            Part::text(" ± "),
            Part::length(k.swing),
            Part::text("); the slides' strokes bound the rest"),
        ]]
    }

    fn on_axis_1_quantity(&self) -> &'static str {
        "(none: joint 1 slides)"
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        decoupled::verify_hints(joints, geometry)
    }

    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        Some(position)
    }
}
