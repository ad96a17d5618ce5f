//! The cylindrical family: R P P with the slides not parallel and not both ⟂ axis 1, a
//! spherical wrist. Recognition and evidence here, the plan in [`plan`].

pub mod plan;
pub mod steps;

use armforge_runtime::Joint;
use nalgebra::Point3;

use super::data::{Judged, Part, Value, VerifyHints};
use super::{Family, FamilyModule, Recognition};
use crate::classify::context::Context;
use crate::classify::evidence::{arr, Measured};
use crate::classify::reach::{model_range, plane_norm_range};
use crate::classify::reject::{Reason, Rejection};
use crate::classify::{decoupled, ArmEvidence, Geometry};
use crate::classify::{Reach, ReachOrigin, Singularity};
use crate::model::Model;
use crate::plan::Plan;

pub use crate::classify::evidence::CylindricalEvidence;

/// The cylindrical family.
pub struct Cylindrical;

/// The registry's entry.
pub static CYLINDRICAL: Cylindrical = Cylindrical;

/// Cylindrical: the component of the wrist center along axis 1 is `h₁·s₂ d₂ + h₁·s₃ d₃` plus a
/// constant, its distance from axis 1 a quadratic. The solve is well-posed when the slides are
/// independent (the quadratic's leading coefficient is then the squared length of the
/// combination ⟂ axis 1, which is not zero) and one slide has a component along axis 1 (so the
/// linear equation can be solved for it).
fn check(ctx: &Context, _center: &Point3<f64>) -> Result<(), Rejection> {
    if ctx.parallel(2, 3) {
        let angle = ctx.angle(2, 3);
        return Err(ctx.reject(Reason::CylindricalSlidesParallel { angle }, 3, Vec::new()));
    }
    let perpendicular = |n: usize| ctx.angle(1, n) >= std::f64::consts::FRAC_PI_2 - ctx.tol.angle;
    if perpendicular(2) && perpendicular(3) {
        let angles = [ctx.angle(1, 2), ctx.angle(1, 3)];
        return Err(ctx.reject(
            Reason::CylindricalSlidesPerpendicularToAxis1 { angles },
            3,
            Vec::new(),
        ));
    }
    Ok(())
}

fn measure(ctx: &Context, center: &Point3<f64>) -> Measured {
    let axis1 = ctx.line(1);
    let projector = axis1.perpendicular_projector();
    let s2 = ctx.line(2).direction.into_inner();
    let s3 = ctx.line(3).direction.into_inner();
    let w = center - axis1.project(center);
    let ranges = [
        model_range(&ctx.model.joints[1].joint),
        model_range(&ctx.model.joints[2].joint),
    ];
    let r = plane_norm_range(&w, [&(projector * s2), &(projector * s3)], ranges);
    Measured {
        arm: ArmEvidence::Cylindrical(CylindricalEvidence {
            slide_directions: [arr(&s2), arr(&s3)],
            slide_angles_to_axis_1: [ctx.angle(1, 2), ctx.angle(1, 3)],
            angle_between_slides: ctx.angle(2, 3),
            distance_from_axis_1: w.norm(),
        }),
        reach: Some(Reach {
            from: ReachOrigin::Axis1,
            min: r[0],
            max: r[1],
        }),
        singularities: vec![Singularity::WristCenterOnAxis1 {
            reachable: Some(r[0] <= ctx.tol.distance),
        }],
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

impl FamilyModule for Cylindrical {
    fn family(&self) -> Family {
        Family::Cylindrical
    }

    fn name(&self) -> &'static str {
        "cylindrical"
    }

    fn pattern(&self) -> &'static str {
        "R P P"
    }

    /// The two roots of one quadratic.
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
        let ArmEvidence::Cylindrical(c) = arm else {
            return Vec::new();
        };
        vec![
            Judged::new(
                "slide_2_direction",
                "slide of joint 2 (direction at zero)",
                Value::Direction(c.slide_directions[0]),
            ),
            Judged::new(
                "slide_3_direction",
                "slide of joint 3 (direction at zero)",
                Value::Direction(c.slide_directions[1]),
            ),
            Judged::new(
                "slide_2_angle_to_axis_1",
                "angle between slide 2 and axis 1",
                Value::Angle(c.slide_angles_to_axis_1[0]),
            ),
            Judged::new(
                "slide_3_angle_to_axis_1",
                "angle between slide 3 and axis 1",
                Value::Angle(c.slide_angles_to_axis_1[1]),
            ),
            Judged::new(
                "angle_between_slides",
                "angle between slides 2 and 3",
                Value::Angle(c.angle_between_slides),
            ),
            Judged::new(
                "distance_from_axis_1",
                "distance of the wrist center from axis 1 at zero",
                Value::Length(c.distance_from_axis_1),
            ),
        ]
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let mut lines = decoupled::wrist_conditions(geometry);
        lines.push(vec![
            Part::text("slide 2 ∦ slide 3: angle "),
            Part::angle(decoupled::line_angle(arm, 2, 3)),
        ]);
        lines.push(vec![
            Part::text("not both slides ⟂ axis 1: angles "),
            Part::angle(decoupled::line_angle(arm, 1, 2)),
            Part::text(" and "),
            Part::angle(decoupled::line_angle(arm, 1, 3)),
        ]);
        lines
    }

    fn steps(&self, plan: &Plan) -> crate::family::Steps {
        steps::steps(plan)
    }

    fn reach_lines(&self, plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        let d = plan::constants(&plan.arm).d;
        vec![vec![
            Part::text("the slide's two roots merge where `ρ² = |W⊥D|²` (`|D|²` = "),
            Part::number(crate::plan::vec3::num::dot(&d, &d)),
            Part::text("); nearer axis 1 than `|W⊥D|` the target is out of reach"),
        ]]
    }

    fn on_axis_1_quantity(&self) -> &'static str {
        "`ρ² = 0`"
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        decoupled::verify_hints(joints, geometry)
    }

    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        Some(position)
    }
}
