//! The arm as the planner sees it: the model's joints with each axis point moved to the foot
//! of the perpendicular from the origin (the same lines, smaller numbers, more zeros to fold),
//! the wrist center, a length scale for tolerances.

use armforge_runtime::{Joint, JointKind, Pose};

use super::vec3::num;
use crate::classify::{Family, Geometry};
use crate::model::Model;
use crate::units::snap3;

/// The planner's view of an arm.
#[derive(Clone, Debug, PartialEq)]
pub struct Arm {
    /// The family of joints 1–3.
    pub family: Family,
    /// The six joints, axis points canonical.
    pub joints: [Joint; 6],
    /// The base frame in the world.
    pub base: Pose,
    /// The tool frame at zero, in the base frame.
    pub tool: Pose,
    /// The wrist center at zero, base frame.
    pub wrist_center: [f64; 3],
    /// A characteristic length of the arm (metres) for tolerances.
    pub scale: f64,
}

fn canonical(joint: &Joint) -> Joint {
    let mut j = *joint;
    j.axis = num::unit(&j.axis);
    j.point = match j.kind {
        JointKind::Revolute => num::perpendicular(&j.point, &j.axis),
        JointKind::Prismatic => [0.0; 3],
    };
    j
}

impl Arm {
    /// The planner's arm for a six-joint model and its geometry. Models with other joint
    /// counts are padded with fixed joints or cut (the classifier rejects them first).
    pub fn new(model: &Model, geometry: &Geometry) -> Arm {
        Arm::with_center(model, geometry.family, geometry.wrist_center)
    }

    /// The planner's arm with `center` as the point the family's position step places (the
    /// wrist center of a decoupled arm).
    pub fn with_center(model: &Model, family: Family, center: [f64; 3]) -> Arm {
        let mut joints = [Joint {
            kind: JointKind::Revolute,
            axis: [0.0, 0.0, 1.0],
            point: [0.0; 3],
            direction: 1.0,
            offset: 0.0,
            limits: [0.0, 0.0],
        }; 6];
        for (out, j) in joints.iter_mut().zip(model.joints.iter()) {
            *out = canonical(&j.joint);
        }
        // The classifier finds the wrist center by least squares: drop its last-digit noise
        // so the plan shows the description's numbers.
        let c = snap3(center, model.extent());
        let mut scale = 0.0;
        let mut last = joints[0].point;
        for j in &joints[..3] {
            if j.kind == JointKind::Revolute {
                scale += num::norm(&num::sub(&j.point, &last));
                last = j.point;
            } else {
                let [lo, hi] = j.limits;
                if lo.is_finite() && hi.is_finite() {
                    scale += hi.abs().max(lo.abs());
                }
            }
        }
        scale += num::norm(&num::sub(&c, &last));
        scale += num::norm(&num::sub(&model.tool.translation, &c));
        Arm {
            family,
            joints,
            base: model.base,
            tool: model.tool,
            wrist_center: c,
            scale: scale.max(1e-3),
        }
    }

    /// Axis of joint `i` (0-based).
    pub fn axis(&self, i: usize) -> [f64; 3] {
        self.joints[i].axis
    }

    /// Canonical point of joint `i` (0-based).
    pub fn point(&self, i: usize) -> [f64; 3] {
        self.joints[i].point
    }
}
