//! Forward kinematics by the product of exponentials.
//!
//! `T(q) = B · E_1(q_1) ⋯ E_n(q_n) · M` (Brockett 1984; Murray, Li & Sastry, A Mathematical
//! Introduction to Robotic Manipulation, 1994, ch. 3), where `E_i` rotates about the line
//! `(p_i, h_i)` or translates along `h_i` by the joint's model value.

use crate::math::{dot, sin_cos, sub, Scalar};
use crate::model::{Joint, JointKind};
use crate::pose::Pose;

/// The rigid motion of one joint for a joint value: a rotation about the joint's axis line by
/// Rodrigues' formula, or a translation along its axis.
pub fn joint_motion<S: Scalar>(joint: &Joint<S>, joint_value: S) -> Pose<S> {
    let amount = joint.model_value(joint_value);
    let h = &joint.axis;
    match joint.kind {
        JointKind::Prismatic => Pose {
            rotation: Pose::IDENTITY.rotation,
            translation: [h[0] * amount, h[1] * amount, h[2] * amount],
        },
        JointKind::Revolute => {
            let (s, c) = sin_cos(amount);
            let v = S::ONE - c;
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
pub fn forward<S: Scalar>(
    joints: &[Joint<S>],
    base: &Pose<S>,
    tool_at_zero: &Pose<S>,
    joint_values: &[S],
) -> Pose<S> {
    let mut t = *base;
    for (joint, &q) in joints.iter().zip(joint_values.iter()) {
        t = t.compose(&joint_motion(joint, q));
    }
    t.compose(tool_at_zero)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn arm<S: Scalar>() -> [Joint<S>; 2] {
        let z = [S::ZERO, S::ZERO, S::ONE];
        let revolute = Joint {
            kind: JointKind::Revolute,
            axis: z,
            point: [S::of(0.4), S::ZERO, S::ZERO],
            direction: S::ONE,
            offset: S::ZERO,
            limits: [-S::PI, S::PI],
        };
        let slide = Joint {
            kind: JointKind::Prismatic,
            point: [S::ZERO; 3],
            ..revolute
        };
        [revolute, slide]
    }

    #[test]
    fn f32_forward_agrees_with_f64() {
        // A quarter turn about the vertical line through (0.4, 0, 0) takes the origin to
        // (0.4, −0.4, 0); a 0.25 m slide along z lifts it (right-hand rule, from memory).
        let q64 = [core::f64::consts::FRAC_PI_2, 0.25];
        let p64 = forward(&arm::<f64>(), &Pose::IDENTITY, &Pose::IDENTITY, &q64);
        let q32 = [core::f32::consts::FRAC_PI_2, 0.25];
        let p32 = forward(&arm::<f32>(), &Pose::IDENTITY, &Pose::IDENTITY, &q32);
        for (a, b) in p64.translation.iter().zip(p32.translation.iter()) {
            assert!((a - *b as f64).abs() < 1e-6);
        }
        assert!((p64.translation[0] - 0.4).abs() < 1e-12);
        assert!((p64.translation[1] + 0.4).abs() < 1e-12);
        assert!((p64.translation[2] - 0.25).abs() < 1e-12);
    }
}
