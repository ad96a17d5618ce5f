//! The polar family: R R P with the slide ⟂ axis 2 and axis 1 ∦ axis 2, a spherical wrist.
//! Recognition and evidence here, the plan in [`plan`].

pub mod plan;
pub mod steps;

use armforge_runtime::Joint;
use nalgebra::Point3;

use super::data::{Judged, Part, SamplerBoundary, Value, VerifyHints};
use super::{Family, FamilyModule, Recognition};
use crate::classify::context::Context;
use crate::classify::evidence::{
    reach_from_shoulder, shoulder, shoulder_items, shoulder_singularity, Measured,
};
use crate::classify::family::check_axis_1_not_parallel_to_2;
use crate::classify::reach::{line_norm_range, model_range};
use crate::classify::reject::{Reason, Rejection};
use crate::classify::Singularity;
use crate::classify::{decoupled, ArmEvidence, Geometry};
use crate::model::Model;
use crate::plan::Plan;

/// Evidence of a polar arm (R R P, slide ⟂ axis 2).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct PolarEvidence {
    /// Joints 1 and 2.
    pub shoulder: crate::classify::evidence::Shoulder,
    /// The unit direction of the slide of joint 3, base frame at zero.
    pub slide_direction: [f64; 3],
    /// The angle between the slide and axis 2 (π/2 for this family).
    pub slide_angle_to_axis_2: f64,
    /// How close the wrist center's line of travel passes to axis 2, metres.
    pub closest_to_axis_2: f64,
    /// The model value of joint 3 (metres) at which it passes closest.
    pub closest_at: f64,
    /// The distance of the wrist center from axis 2 within the slide's limits, metres.
    pub reach_from_axis_2: [f64; 2],
}

/// The polar family.
pub struct Polar;

/// The registry's entry.
pub static POLAR: Polar = Polar;

/// Polar: axis 1 ∦ axis 2 and the slide ⟂ axis 2, so the wrist center's component along
/// axis 2 stays fixed while joints 2 and 3 move.
fn check(ctx: &Context, _center: &Point3<f64>) -> Result<(), Rejection> {
    check_axis_1_not_parallel_to_2(ctx)?;
    let angle = ctx.angle(2, 3);
    if angle < std::f64::consts::FRAC_PI_2 - ctx.tol.angle {
        return Err(ctx.reject(Reason::PolarSlideNotPerpendicular { angle }, 3, Vec::new()));
    }
    Ok(())
}

fn measure(ctx: &Context, center: &Point3<f64>) -> Measured {
    let s = shoulder(ctx, center);
    let axis2 = ctx.line(2);
    let slide = ctx.line(3).direction.into_inner();
    let w = center - axis2.project(center);
    let closest_at = -w.dot(&slide);
    let closest = (w + slide * closest_at).norm();
    let range = model_range(&ctx.model.joints[2].joint);
    let rho = line_norm_range(&w, &slide, range);
    let singularities = vec![
        shoulder_singularity(ctx, &s, center),
        Singularity::SlideClosestToAxis2 {
            joint_3_at: closest_at,
        },
    ];
    let reach = reach_from_shoulder(rho, s.sideways_offset);
    Measured {
        arm: ArmEvidence::Polar(PolarEvidence {
            shoulder: s,
            slide_direction: [slide.x, slide.y, slide.z],
            slide_angle_to_axis_2: ctx.angle(2, 3),
            closest_to_axis_2: closest,
            closest_at,
            reach_from_axis_2: rho,
        }),
        reach: Some(reach),
        singularities,
    }
}

fn position(
    g: &mut crate::plan::graph::Graph,
    arm: &crate::plan::Arm,
    t: &crate::plan::Target,
    ct: crate::plan::vec3::V3,
) -> crate::plan::Position {
    let (shoulder, elbow) = plan::rules(arm);
    crate::plan::Position {
        solutions: plan::solve(g, arm, t, ct),
        shoulder,
        elbow,
    }
}

impl FamilyModule for Polar {
    fn family(&self) -> Family {
        Family::Polar
    }

    fn name(&self) -> &'static str {
        "polar"
    }

    fn pattern(&self) -> &'static str {
        "R R P"
    }

    /// Two roots of joint 1 × two of the slide.
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        // An R R P arm that fails the polar conditions is not degenerate: the general-slide
        // family (`family::general::slide`) solves it or says precisely why not.
        match decoupled::recognise(ctx, self, check, measure) {
            Recognition::Degenerate(r) => Recognition::NotMine(Some(r)),
            other => other,
        }
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        crate::plan::decoupled_plan(model, geometry, position)
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::Polar(p) = arm else {
            return Vec::new();
        };
        let mut items = shoulder_items(&p.shoulder);
        items.push(Judged::new(
            "slide_direction",
            "slide of joint 3 (direction at zero)",
            Value::Direction(p.slide_direction),
        ));
        items.push(Judged::new(
            "slide_angle_to_axis_2",
            "angle between the slide and axis 2",
            Value::Angle(p.slide_angle_to_axis_2),
        ));
        items.push(Judged::new(
            "closest_to_axis_2",
            "closest approach of the wrist center's line of travel to axis 2",
            Value::Length(p.closest_to_axis_2),
        ));
        items
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let mut lines = decoupled::wrist_conditions(geometry);
        lines.push(vec![
            Part::text("axis 1 ∦ axis 2: angle "),
            Part::angle(decoupled::line_angle(arm, 1, 2)),
        ]);
        lines.push(vec![
            Part::text("slide 3 ⟂ axis 2: angle "),
            Part::angle(decoupled::line_angle(arm, 2, 3)),
        ]);
        lines
    }

    fn steps(&self, plan: &Plan) -> crate::family::Steps {
        steps::steps(plan)
    }

    fn reach_lines(&self, _plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let ArmEvidence::Polar(p) = &geometry.arm else {
            return Vec::new();
        };
        vec![vec![
            Part::text("distance `d` of the wrist center from axis 2 within the slide's limits: "),
            Part::length(p.reach_from_axis_2[0]),
            Part::text(" to "),
            Part::length(p.reach_from_axis_2[1]),
            Part::text("; nearest approach of its line of travel "),
            Part::length(p.closest_to_axis_2),
            Part::text(" (the slide's roots merge)"),
        ]]
    }

    fn singular_equation(&self, plan: &Plan, singularity: &Singularity) -> Option<Vec<Part>> {
        let Singularity::SlideClosestToAxis2 { joint_3_at } = *singularity else {
            return None;
        };
        let k = plan::constants(&plan.arm);
        let nearest = (crate::plan::vec3::num::dot(&k.p, &k.p) - k.m * k.m)
            .max(0.0)
            .sqrt();
        Some(vec![
            Part::text("`d² = |P|² − m²` (`d` = "),
            Part::length(nearest),
            Part::text("): the slide's two roots merge at `s = −m` = "),
            Part::length(joint_3_at),
            Part::text("."),
        ])
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        let mut hints = decoupled::verify_hints(joints, geometry);
        if let ArmEvidence::Polar(p) = &geometry.arm {
            hints.boundaries.push(SamplerBoundary {
                distance: decoupled::center_distance(geometry, 1),
                joint: 2,
                at: p.closest_to_axis_2,
                side: 1.0,
            });
        }
        hints
    }

    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        Some(position)
    }
}
