//! The evidence of an arm's family ([`ArmEvidence`], one variant holding each family's own
//! type, defined in its folder), what several families share (the shoulder, the reach, the
//! singular configurations), all measured on the joint lines (metres, radians).

use std::f64::consts::{FRAC_PI_2, PI};

use armforge_runtime::JointKind;
use nalgebra::{Point3, Vector3};

use super::context::Context;
use super::lines::closest_points;
use crate::family::{Judged, Value};

pub use crate::family::cartesian::CartesianEvidence;
pub use crate::family::cylindrical::CylindricalEvidence;
pub use crate::family::elbow::ElbowEvidence;
pub use crate::family::general::GeneralEvidence;
pub use crate::family::polar::PolarEvidence;

/// Joints 1 and 2 when both turn (elbow and polar).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Shoulder {
    /// True when axes 1 and 2 meet (common normal within the tolerance).
    pub axes_1_2_meet: bool,
    /// The shoulder offset: the length of the common normal of axes 1 and 2, metres.
    pub offset: f64,
    /// The angle between the lines of axes 1 and 2, `[0, π/2]`.
    pub angle_1_2: f64,
    /// The shoulder point: the foot of that common normal on axis 2, base frame, metres.
    pub point: [f64; 3],
    /// The foot of that common normal on axis 1, base frame, metres.
    pub point_on_axis_1: [f64; 3],
    /// The sideways offset: the distance of the wrist center from the plane through the
    /// shoulder point perpendicular to axis 2 (joints 2 and 3 never change it). For the elbow
    /// this plane also passes through the elbow point (the shoulder point's foot on axis 3).
    pub sideways_offset: f64,
}

/// The family's own evidence.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[cfg_attr(feature = "serde", serde(tag = "family", rename_all = "snake_case"))]
pub enum ArmEvidence {
    /// R R R.
    Elbow(ElbowEvidence),
    /// R R P.
    Polar(PolarEvidence),
    /// R P P.
    Cylindrical(CylindricalEvidence),
    /// P P P.
    Cartesian(CartesianEvidence),
    /// R R R of no named family.
    General(GeneralEvidence),
    /// Three parallel axes 2–4, axes 5 and 6 meeting.
    ThreeParallel(crate::family::three_parallel::ThreeParallelEvidence),
    /// Three parallel axes 2–4, axes 5 and 6 passing apart.
    OffsetHand(crate::family::offset_hand::OffsetHandEvidence),
    /// Axes 1–3 meet: the wrist at the base.
    BaseWrist(crate::family::base_wrist::BaseWristEvidence),
    /// Axes 2–4 meet: a wrist in the middle.
    MidWrist(crate::family::mid_wrist::MidWristEvidence),
    /// Axes 1–3 parallel.
    BaseParallel(crate::family::base_parallel::BaseParallelEvidence),
    /// P R R with axes 2 and 3 skew.
    BaseSlide(crate::family::base_slide::BaseSlideEvidence),
    /// R P R (joint 2 a slide).
    MiddleSlide(crate::family::middle_slide::MiddleSlideEvidence),
    /// Read from the tool: the mirrored arm solves any target.
    ToolFirst(crate::family::tool_first::ToolFirstEvidence),
    /// P P R: two slides, then a turn.
    Carriage(crate::family::carriage::CarriageEvidence),
    /// R R P of no named family (the slide not ⟂ axis 2).
    GeneralSlide(crate::family::general::slide::GeneralSlideEvidence),
}

/// What a reach is measured from.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[cfg_attr(feature = "serde", serde(rename_all = "snake_case"))]
pub enum ReachOrigin {
    /// The distance from the shoulder point (see [`Shoulder::point`]).
    ShoulderPoint,
    /// The distance from axis 1.
    Axis1,
}

/// The nearest and farthest the wrist center can get, ignoring revolute limits but keeping
/// slide limits (a slide's stroke is its reach).
#[derive(Clone, Copy, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Reach {
    /// What the distance is measured from.
    pub from: ReachOrigin,
    /// The smallest distance, metres.
    pub min: f64,
    /// The largest distance, metres (infinite for an unlimited slide).
    pub max: f64,
}

/// A singular configuration of the arm.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[cfg_attr(feature = "serde", serde(tag = "kind", rename_all = "snake_case"))]
pub enum Singularity {
    /// Axes 4 and 6 line up: joints 4 and 6 turn about one line.
    WristAligned {
        /// Joint-5 model values at which it happens (radians).
        joint_5_at: Vec<f64>,
    },
    /// Axes 4 and 6 never line up (the wrist's twists differ).
    WristNeverAligned,
    /// Joint 1 loses its meaning or its two solutions merge (elbow, polar).
    Shoulder {
        /// True when axes 1 and 2 are perpendicular.
        perpendicular: bool,
        /// `|h₂·(c − p₁)|`: the distance from axis 1 at which the two joint-1 solutions merge
        /// when the axes are perpendicular (zero: the wrist center on axis 1), metres.
        offset: f64,
        /// When the axes are not perpendicular: the point of axis 1 where joint 1 is free.
        free_point: Option<[f64; 3]>,
    },
    /// The wrist center on axis 1: joint 1 free.
    WristCenterOnAxis1 {
        /// Whether the slides' limits let it get there (cylindrical); `None` when not assessed.
        reachable: Option<bool>,
    },
    /// Stretched (joint 3 model value, radians): the elbow solutions merge.
    Stretched {
        /// Joint-3 model value.
        joint_3_at: f64,
    },
    /// Folded (joint 3 model value, radians): the elbow solutions merge.
    Folded {
        /// Joint-3 model value.
        joint_3_at: f64,
    },
    /// The slide where the wrist center passes closest to axis 2 (polar): the two slide
    /// solutions merge.
    SlideClosestToAxis2 {
        /// Joint-3 model value, metres.
        joint_3_at: f64,
    },
    /// A singular configuration a family describes in its own words (in the file's units).
    Described {
        /// A short name (as in JSON).
        name: &'static str,
        /// What and where, for people.
        text: String,
        /// The equation that defines it in the plan's terms and what the solver does there.
        equation: String,
    },
}

/// The coordinates of `v`.
pub fn arr(v: &Vector3<f64>) -> [f64; 3] {
    [v.x, v.y, v.z]
}

/// Model values `values` of joint `joint` (1-based) as the description writes that joint's
/// values (revolute ones wrapped into `(−π, π]`), joined by "and": for the texts of singular
/// configurations.
pub fn show_joint_values(model: &crate::model::Model, joint: usize, values: &[f64]) -> String {
    let u = &model.units;
    let j = &model.joints[joint - 1].joint;
    values
        .iter()
        .map(|&m| match j.kind {
            JointKind::Revolute => u.show_angle(wrap(j.joint_value(m))),
            JointKind::Prismatic => u.show_length(j.joint_value(m)),
        })
        .collect::<Vec<_>>()
        .join(" and ")
}

/// `angle` wrapped into `(−π, π]`.
pub fn wrap(angle: f64) -> f64 {
    let a = angle.rem_euclid(2.0 * PI);
    if a > PI {
        a - 2.0 * PI
    } else {
        a
    }
}

/// Measures joints 1 and 2 (both revolute) and the sideways offset.
pub fn shoulder(ctx: &Context, center: &Point3<f64>) -> Shoulder {
    let cp = closest_points(ctx.line(1), ctx.line(2), ctx.tol.angle);
    let h2 = ctx.line(2).direction.into_inner();
    Shoulder {
        axes_1_2_meet: cp.distance <= ctx.tol.distance,
        offset: cp.distance,
        angle_1_2: ctx.angle(1, 2),
        point: arr(&cp.on_second.coords),
        point_on_axis_1: arr(&cp.on_first.coords),
        sideways_offset: h2.dot(&(center - cp.on_second)).abs(),
    }
}

/// Everything measured for one family.
pub struct Measured {
    /// The family's evidence.
    pub arm: ArmEvidence,
    /// The reach of the wrist center, when it has a natural origin.
    pub reach: Option<Reach>,
    /// Singular configurations of joints 1–3.
    pub singularities: Vec<Singularity>,
}

/// The shoulder's singular configuration: where joint 1's two solutions merge, or the wrist
/// center on axis 1.
pub fn shoulder_singularity(ctx: &Context, s: &Shoulder, center: &Point3<f64>) -> Singularity {
    let h1 = ctx.line(1).direction.into_inner();
    let h2 = ctx.line(2).direction.into_inner();
    let p1 = Point3::from(s.point_on_axis_1);
    let e = h2.dot(&(center - p1));
    let perpendicular = s.angle_1_2 >= FRAC_PI_2 - ctx.tol.angle;
    // Undoing joint 1 must bring h₂·x to h₂·c; on axis 1 that holds only at h₁·h₂ t = e.
    if perpendicular && e.abs() <= ctx.tol.distance {
        return Singularity::WristCenterOnAxis1 { reachable: None };
    }
    let free_point = (!perpendicular).then(|| arr(&(p1.coords + h1 * (e / h1.dot(&h2)))));
    Singularity::Shoulder {
        perpendicular,
        offset: e.abs(),
        free_point,
    }
}

/// The reach from the shoulder point for distances `rho` from axis 2 and a sideways offset.
pub fn reach_from_shoulder(rho: [f64; 2], sideways: f64) -> Reach {
    Reach {
        from: ReachOrigin::ShoulderPoint,
        min: rho[0].hypot(sideways),
        max: rho[1].hypot(sideways),
    }
}

/// The `inspect` items of joints 1 and 2 (elbow and polar).
pub fn shoulder_items(s: &Shoulder) -> Vec<Judged> {
    vec![
        Judged::new(
            "axes_1_2_meet",
            "axes 1 and 2 meet",
            Value::Flag(s.axes_1_2_meet),
        ),
        Judged::new(
            "shoulder_offset",
            "shoulder offset (length of the common normal of axes 1 and 2)",
            Value::Length(s.offset),
        ),
        Judged::new(
            "angle_1_2",
            "angle between axes 1 and 2",
            Value::Angle(s.angle_1_2),
        ),
        Judged::new(
            "shoulder_point",
            "shoulder point (foot of that common normal on axis 2)",
            Value::Point(s.point),
        ),
        Judged::new(
            "sideways_offset",
            "sideways offset (distance of the wrist center from the plane through the shoulder \
             point perpendicular to axis 2)",
            Value::Length(s.sideways_offset),
        ),
    ]
}
