//! Forward kinematics by the product of exponentials.
//!
//! `T(q) = B · E_1(q_1) ⋯ E_n(q_n) · M` (Brockett 1984; Murray, Li & Sastry, A Mathematical
//! Introduction to Robotic Manipulation, 1994, ch. 3), where `E_i` rotates about the line
//! `(p_i, h_i)` or translates along `h_i` by the joint's model value.

use crate::math::{dot, sin_cos, sub};
use crate::model::{Joint, JointKind};
use crate::pose::Pose;

/// The rigid motion of one joint for a joint value: a rotation about the joint's axis line by
/// Rodrigues' formula, or a translation along its axis.
pub fn joint_motion(joint: &Joint, joint_value: f64) -> Pose {
    let amount = joint.model_value(joint_value);
    let h = &joint.axis;
    match joint.kind {
        JointKind::Prismatic => Pose {
            rotation: Pose::IDENTITY.rotation,
            translation: [h[0] * amount, h[1] * amount, h[2] * amount],
        },
        JointKind::Revolute => {
            let (s, c) = sin_cos(amount);
            let v = 1.0 - c;
            // Rodrigues: R = I + s [h]× + (1 − c) [h]×²  =  c I + s [h]× + (1 − c) h hᵀ.
            let rotation = [
                [
                    c + v * h[0] * h[0],
                    v * h[0] * h[1] - s * h[2],
                    v * h[0] * h[2] + s * h[1],
                ],
                [
                    v * h[1] * h[0] + s * h[2],
                    c + v * h[1] * h[1],
                    v * h[1] * h[2] - s * h[0],
                ],
                [
                    v * h[2] * h[0] - s * h[1],
                    v * h[2] * h[1] + s * h[0],
                    c + v * h[2] * h[2],
                ],
            ];
            // A rotation about a line through p: t = p − R p.
            let p = &joint.point;
            let rp = [
                dot(&rotation[0], p),
                dot(&rotation[1], p),
                dot(&rotation[2], p),
            ];
            Pose {
                rotation,
                translation: sub(p, &rp),
            }
        }
    }
}

/// Forward kinematics: the world pose of the tool frame for `joint_values`.
///
/// `base` is the arm's base frame in the world, `tool_at_zero` the tool frame in the base frame
/// with every model value at zero. Joints beyond the shorter of the two slices are left at zero.
pub fn forward(joints: &[Joint], base: &Pose, tool_at_zero: &Pose, joint_values: &[f64]) -> Pose {
    let mut t = *base;
    for (joint, &q) in joints.iter().zip(joint_values.iter()) {
        t = t.compose(&joint_motion(joint, q));
    }
    t.compose(tool_at_zero)
}
