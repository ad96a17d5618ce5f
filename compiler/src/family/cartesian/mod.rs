//! The cartesian family: P P P with independent slides, a spherical wrist. Recognition and
//! evidence here, the plan in [`plan`].

pub mod plan;
pub mod steps;

use armforge_runtime::Joint;
use nalgebra::{Matrix3, Point3};

use super::data::{Judged, Part, Value, VerifyHints};
use super::{Family, FamilyModule, Recognition};
use crate::classify::context::Context;
use crate::classify::evidence::{arr, Measured};
use crate::classify::lines::angle_between_directions;
use crate::classify::reject::{Reason, Rejection};
use crate::classify::{decoupled, ArmEvidence, Geometry};
use crate::model::Model;
use crate::plan::Plan;

pub use crate::classify::evidence::CartesianEvidence;

/// The cartesian family.
pub struct Cartesian;

/// The registry's entry.
pub static CARTESIAN: Cartesian = Cartesian;

/// Cartesian: the three slides must be linearly independent (a 3×3 linear system).
fn check(ctx: &Context, _center: &Point3<f64>) -> Result<(), Rejection> {
    for (a, b) in [(1, 2), (1, 3), (2, 3)] {
        if ctx.parallel(a, b) {
            let reason = Reason::CartesianSlidesDependent {
                parallel_pair: Some([a, b]),
                angle: ctx.angle(a, b),
            };
            return Err(ctx.reject(reason, b, Vec::new()));
        }
    }
    let angle = slide_3_out_of_plane(ctx);
    if angle <= ctx.tol.angle {
        let reason = Reason::CartesianSlidesDependent {
            parallel_pair: None,
            angle,
        };
        return Err(ctx.reject(reason, 3, Vec::new()));
    }
    Ok(())
}

/// The angle by which slide 3 leaves the plane of slides 1 and 2 (which are not parallel).
pub fn slide_3_out_of_plane(ctx: &Context) -> f64 {
    let s1 = ctx.line(1).direction.into_inner();
    let s2 = ctx.line(2).direction.into_inner();
    let s3 = ctx.line(3).direction.into_inner();
    let normal = s1.cross(&s2);
    let in_plane = angle_between_directions(&normal, &s3);
    (std::f64::consts::FRAC_PI_2 - in_plane).abs()
}

/// The smallest singular value of the matrix of the three unit slide directions: zero when
/// they are dependent (nalgebra SVD).
pub fn slide_independence(ctx: &Context) -> f64 {
    let m = Matrix3::from_columns(&[
        ctx.line(1).direction.into_inner(),
        ctx.line(2).direction.into_inner(),
        ctx.line(3).direction.into_inner(),
    ]);
    m.singular_values().min()
}

fn measure(ctx: &Context, _center: &Point3<f64>) -> Measured {
    let d = |n: usize| arr(&ctx.line(n).direction.into_inner());
    Measured {
        arm: ArmEvidence::Cartesian(CartesianEvidence {
            slide_directions: [d(1), d(2), d(3)],
            angles: [ctx.angle(1, 2), ctx.angle(1, 3), ctx.angle(2, 3)],
            slide_3_out_of_plane: slide_3_out_of_plane(ctx),
            independence: slide_independence(ctx),
        }),
        reach: None,
        singularities: Vec::new(),
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

impl FamilyModule for Cartesian {
    fn family(&self) -> Family {
        Family::Cartesian
    }

    fn name(&self) -> &'static str {
        "cartesian"
    }

    fn pattern(&self) -> &'static str {
        "P P P"
    }

    /// One linear solve.
    fn position_solutions(&self) -> u32 {
        1
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        decoupled::recognise(ctx, self, check, measure)
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        crate::plan::decoupled_plan(model, geometry, position)
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::Cartesian(c) = arm else {
            return Vec::new();
        };
        vec![
            Judged::new(
                "slide_1_direction",
                "slide of joint 1",
                Value::Direction(c.slide_directions[0]),
            ),
            Judged::new(
                "slide_2_direction",
                "slide of joint 2",
                Value::Direction(c.slide_directions[1]),
            ),
            Judged::new(
                "slide_3_direction",
                "slide of joint 3",
                Value::Direction(c.slide_directions[2]),
            ),
            Judged::new(
                "angle_1_2",
                "angle between slides 1 and 2",
                Value::Angle(c.angles[0]),
            ),
            Judged::new(
                "angle_1_3",
                "angle between slides 1 and 3",
                Value::Angle(c.angles[1]),
            ),
            Judged::new(
                "angle_2_3",
                "angle between slides 2 and 3",
                Value::Angle(c.angles[2]),
            ),
            Judged::new(
                "slide_3_out_of_plane",
                "angle of slide 3 out of the plane of slides 1 and 2",
                Value::Angle(c.slide_3_out_of_plane),
            ),
        ]
    }

    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let a = |i: usize, j: usize| Part::angle(decoupled::line_angle(arm, i, j));
        let mut lines = decoupled::wrist_conditions(geometry);
        lines.push(vec![
            Part::text("slides pairwise not parallel: angles "),
            a(1, 2),
            Part::text(" (1–2), "),
            a(1, 3),
            Part::text(" (1–3), "),
            a(2, 3),
            Part::text(" (2–3)"),
        ]);
        let det = crate::plan::vec3::num::dot(
            &arm.axis(0),
            &crate::plan::vec3::num::cross(&arm.axis(1), &arm.axis(2)),
        );
        lines.push(vec![
            Part::text("slides independent: |det [u1 u2 u3]| = "),
            Part::number(det),
        ]);
        lines
    }

    fn steps(&self, plan: &Plan) -> crate::family::Steps {
        steps::steps(plan)
    }

    fn reach_lines(&self, _plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        vec![vec![Part::text(
            "the wrist center moves in the box the three slides span (their limits in §1)",
        )]]
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        decoupled::verify_hints(joints, geometry)
    }

    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        Some(position)
    }
}
