//! How close is "meets" and "parallel": tolerances relative to the arm's size.

use armforge_runtime::JointKind;
use nalgebra::Point3;

use super::lines::Line;
use crate::model::Model;

/// The tolerances of classification.
///
/// Two lines *meet* when they pass within `distance × arm size` of each other (see
/// [`arm_size`]); two axes are *parallel* (or *perpendicular*) when their angle is within
/// `angle` radians of 0 (or of 90°).
///
/// **Why the defaults (`1e-6` of the arm's size, `1e-6` rad).** A tolerance is also the error
/// the decoupled solver accepts: treating axes that miss by `δ` as meeting, or axes at `ε` as
/// parallel, puts the tool off by about `δ`, or `ε` × the arm's size. One part in a million is
/// 1 µm on a 1 m arm: far below what an arm repeats to (tens of µm is common practice for
/// small lab arms) and below the resolution of any dimension a person writes in a file
/// (0.01 mm, 0.001°), while it is about ten orders of magnitude above the round-off that
/// converting a description into axes leaves behind (`f64` trigonometry: ~1e-16 relative).
/// So an offset written on purpose is always seen, and conversion noise never is.
#[derive(Clone, Copy, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Tolerances {
    /// Largest miss that still counts as meeting, as a fraction of the arm's size.
    pub distance: f64,
    /// Largest angle (radians) that still counts as parallel, or as perpendicular.
    pub angle: f64,
}

impl Default for Tolerances {
    fn default() -> Self {
        Tolerances {
            distance: 1e-6,
            angle: 1e-6,
        }
    }
}

/// The size used when an arm has no length at all (every revolute axis through the tool point
/// and no finite slide stroke): one metre, so relative tolerances stay meaningful.
pub const SIZE_OF_AN_ARM_WITHOUT_LENGTH: f64 = 1.0;

/// The arm's size in metres, independent of where the file put its frames or its base.
///
/// Starting from the tool point at zero, walk back to joint 1: the foot of the perpendicular
/// on each revolute axis from the previous point. The size is the largest distance between any
/// two of these points (the tool point and the feet), plus the finite strokes of the slides.
/// Every step is defined by the lines alone, so moving or re-describing the arm does not
/// change it.
pub fn arm_size(model: &Model) -> f64 {
    let mut landmarks = vec![Point3::from(model.tool.translation)];
    let mut stroke = 0.0;
    for joint in model.joints.iter().rev().map(|j| &j.joint) {
        match joint.kind {
            JointKind::Revolute => {
                if let (Some(line), Some(last)) =
                    (Line::new(joint.point, joint.axis), landmarks.last())
                {
                    landmarks.push(line.project(last));
                }
            }
            JointKind::Prismatic => {
                let span = joint.limits[1] - joint.limits[0];
                if span.is_finite() && span > 0.0 {
                    stroke += span;
                }
            }
        }
    }
    let mut diameter: f64 = 0.0;
    for (i, a) in landmarks.iter().enumerate() {
        for b in &landmarks[i + 1..] {
            diameter = diameter.max((a - b).norm());
        }
    }
    let size = diameter + stroke;
    if size.is_finite() && size > 0.0 {
        size
    } else {
        SIZE_OF_AN_ARM_WITHOUT_LENGTH
    }
}

/// Tolerances resolved for one arm: absolute distance (metres) and angle (radians).
#[derive(Clone, Copy, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Resolved {
    /// The arm's size, metres.
    pub arm_size: f64,
    /// Largest miss that counts as meeting, metres.
    pub distance: f64,
    /// Largest angle that counts as parallel or perpendicular, radians.
    pub angle: f64,
}

impl Resolved {
    /// Resolves `tolerances` for `model`.
    pub fn for_model(model: &Model, tolerances: &Tolerances) -> Resolved {
        let arm_size = arm_size(model);
        Resolved {
            arm_size,
            distance: tolerances.distance * arm_size,
            angle: tolerances.angle,
        }
    }
}
