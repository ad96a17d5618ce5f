//! The elbow family: R R R with axis 2 ∥ axis 3 and axis 1 ∦ axis 2, a spherical wrist.
//! Recognition and evidence here, the plan in [`plan`].

pub mod plan;
pub mod steps;

use std::f64::consts::PI;

use armforge_runtime::Joint;
use nalgebra::Point3;

use super::data::{Judged, Part, SamplerBoundary, Value, VerifyHints};
use super::{Family, FamilyModule, Recognition};
use crate::classify::context::Context;
use crate::classify::evidence::{
    reach_from_shoulder, shoulder, shoulder_items, shoulder_singularity, wrap, Measured,
};
use crate::classify::family::check_axis_1_not_parallel_to_2;
use crate::classify::lines::signed_angle_about;
use crate::classify::reject::{Note, Reason, Rejection};
use crate::classify::{decoupled, ArmEvidence, Geometry, Singularity};
use crate::model::Model;
use crate::plan::Plan;

pub use crate::classify::evidence::ElbowEvidence;

/// The elbow family.
pub struct Elbow;

/// The registry's entry.
pub static ELBOW: Elbow = Elbow;

/// Elbow: axis 1 ∦ axis 2, axis 2 ∥ axis 3, an upper arm (axes 2 and 3 apart) and a forearm
/// (wrist center off axis 3), so the law of cosines sets joint 3.
fn check(ctx: &Context, center: &Point3<f64>) -> Result<(), Rejection> {
    check_axis_1_not_parallel_to_2(ctx)?;
    if !ctx.parallel(2, 3) {
        let angle = ctx.angle(2, 3);
        let notes = vec![Note::PieperQuartic];
        return Err(ctx.reject(Reason::ElbowAxes2And3NotParallel { angle }, 3, notes));
    }
    let distance = ctx.gap(2, 3);
    if distance <= ctx.tol.distance {
        return Err(ctx.reject(Reason::ElbowAxes2And3Coincide { distance }, 3, Vec::new()));
    }
    let distance = ctx.line(3).distance_to(center);
    if distance <= ctx.tol.distance {
        return Err(ctx.reject(Reason::WristCenterOnAxis3 { distance }, 3, Vec::new()));
    }
    Ok(())
}

fn measure(ctx: &Context, center: &Point3<f64>) -> Measured {
    let s = shoulder(ctx, center);
    let axis3 = ctx.line(3);
    let on_3 = axis3.project(center);
    let upper_arm = ctx.gap(2, 3);
    let forearm = (center - on_3).norm();
    let upper = on_3 - ctx.line(2).project(&on_3);
    let fore = center - on_3;
    let stretched_at =
        signed_angle_about(&axis3.direction, &fore, &upper, ctx.tol.distance).unwrap_or(0.0);
    let rho = [(upper_arm - forearm).abs(), upper_arm + forearm];
    let reach = reach_from_shoulder(rho, s.sideways_offset);
    let singularities = vec![
        shoulder_singularity(ctx, &s, center),
        Singularity::Stretched {
            joint_3_at: stretched_at,
        },
        Singularity::Folded {
            joint_3_at: wrap(stretched_at + PI),
        },
    ];
    Measured {
        arm: ArmEvidence::Elbow(ElbowEvidence {
            shoulder: s,
            upper_arm,
            forearm,
            stretched_at,
            folded_at: wrap(stretched_at + PI),
            reach_from_axis_2: rho,
        }),
        reach: Some(reach),
        singularities,
    }
}

/// The elbow family's position step.
pub fn position(
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

impl FamilyModule for Elbow {
    fn family(&self) -> Family {
        Family::Elbow
    }

    fn name(&self) -> &'static str {
        "elbow"
    }

    fn pattern(&self) -> &'static str {
        "R R R"
    }

    /// Two roots of joint 1 × two of joint 3.
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        match decoupled::recognise(ctx, self, check, measure) {
            // With axes 2 and 3 not parallel the arm is no elbow arm, degenerate or not: the
            // general family solves it, or says why it is degenerate.
            Recognition::Degenerate(r) if !ctx.parallel(2, 3) => Recognition::NotMine(Some(r)),
            other => other,
        }
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        crate::plan::decoupled_plan(model, geometry, position)
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::Elbow(e) = arm else {
            return Vec::new();
        };
        let mut items = shoulder_items(&e.shoulder);
        items.push(Judged::new(
            "upper_arm",
            "upper arm (distance between axes 2 and 3)",
            Value::Length(e.upper_arm),
        ));
        items.push(Judged::new(
            "forearm",
            "forearm (distance of the wrist center from axis 3)",
            Value::Length(e.forearm),
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
            Part::text("axis 2 ∥ axis 3: angle "),
            Part::angle(decoupled::line_angle(arm, 2, 3)),
        ]);
        lines.push(vec![
            Part::text("an upper arm and a forearm: axes 2 and 3 are "),
            Part::length(decoupled::gap(arm, 2, 3)),
            Part::text(" apart, the wrist center "),
            Part::length(decoupled::distance_from_axis(
                arm,
                3,
                &geometry.wrist_center,
            )),
            Part::text(" from axis 3"),
        ]);
        lines
    }

    fn steps(&self, plan: &Plan) -> crate::family::Steps {
        steps::steps(plan)
    }

    fn reach_lines(&self, _plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>> {
        let ArmEvidence::Elbow(e) = &geometry.arm else {
            return Vec::new();
        };
        let mut lines = vec![vec![
            Part::text("distance `d` of the wrist center from axis 2: "),
            Part::length(e.reach_from_axis_2[0]),
            Part::text(" (folded, `||L| − |V||`) to "),
            Part::length(e.reach_from_axis_2[1]),
            Part::text(
                " (stretched, `|L| + |V|`); beyond them no elbow solution (`cos ψ` outside \
                 [−1, 1])",
            ),
        ]];
        if !e.shoulder.axes_1_2_meet {
            lines.push(vec![
                Part::text("shoulder offset "),
                Part::length(e.shoulder.offset),
                Part::text(
                    ": the back posture (reaching over axis 1) may reach less far than the \
                     front one",
                ),
            ]);
        }
        lines
    }

    fn singular_equation(&self, plan: &Plan, singularity: &Singularity) -> Option<Vec<Part>> {
        let (upper, fore) = plan::constants(&plan.arm).two_link.lengths();
        let joint_3 = |at: f64| Part::angle(plan.arm.joints[2].joint_value(at));
        match *singularity {
            Singularity::Stretched { joint_3_at } => Some(vec![
                Part::text("`cos ψ = 1`: `d = |L| + |V|` = "),
                Part::length(upper + fore),
                Part::text(" from axis 2, `θ3 = s3 φ0` = "),
                Part::angle(joint_3_at),
                Part::text(" (model value; joint value "),
                joint_3(joint_3_at),
                Part::text("); the elbow's two roots merge."),
            ]),
            Singularity::Folded { joint_3_at } => Some(vec![
                Part::text("`cos ψ = −1`: `d = ||L| − |V||` = "),
                Part::length((upper - fore).abs()),
                Part::text(" from axis 2, `θ3` = "),
                Part::angle(joint_3_at),
                Part::text(" (model value; joint value "),
                joint_3(joint_3_at),
                Part::text("); the elbow's two roots merge."),
            ]),
            _ => None,
        }
    }

    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        let mut hints = decoupled::verify_hints(joints, geometry);
        if let ArmEvidence::Elbow(e) = &geometry.arm {
            for (at, side) in [
                (e.reach_from_axis_2[1], -1.0),
                (e.reach_from_axis_2[0], 1.0),
            ] {
                hints.boundaries.push(SamplerBoundary {
                    distance: decoupled::center_distance(geometry, 1),
                    joint: 2,
                    at,
                    side,
                });
            }
        }
        hints
    }

    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        Some(position)
    }
}
