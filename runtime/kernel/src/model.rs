//! The canonical joint-axis model: every description convention is converted into this.

use crate::math::Scalar;

/// Whether a joint turns about its axis or slides along it.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum JointKind {
    /// Turns about the axis line `(point, axis)`.
    Revolute,
    /// Slides along `axis`.
    Prismatic,
}

/// One joint of the canonical model, in the base frame with every model value at zero.
///
/// The joint's *model value* is `direction × joint value + offset` (radians for a revolute
/// joint, metres for a prismatic one); forward kinematics turns (or slides) the joint's axis by
/// the model value, measured from the configuration in which the model was written.
/// In the scalar `S` (`f64` unless said otherwise).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Joint<S: Scalar = f64> {
    /// Revolute or prismatic.
    pub kind: JointKind,
    /// Unit direction of the axis, base frame.
    pub axis: [S; 3],
    /// A point on the axis, base frame, metres (ignored for prismatic joints).
    pub point: [S; 3],
    /// `+1.0` or `-1.0`: the sign between the joint value and the model value.
    pub direction: S,
    /// Added to `direction × joint value` (radians or metres).
    pub offset: S,
    /// Allowed joint values `[min, max]` (radians or metres); may be infinite.
    pub limits: [S; 2],
}

impl<S: Scalar> Joint<S> {
    /// The model value (rotation angle or slide length) for a joint value.
    #[inline]
    pub fn model_value(&self, joint_value: S) -> S {
        self.direction * joint_value + self.offset
    }

    /// The joint value for a model value (the inverse of [`Joint::model_value`]).
    #[inline]
    pub fn joint_value(&self, model_value: S) -> S {
        (model_value - self.offset) * self.direction
    }
}
