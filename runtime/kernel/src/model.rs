//! The canonical joint-axis model: every description convention is converted into this.

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
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Joint {
    /// Revolute or prismatic.
    pub kind: JointKind,
    /// Unit direction of the axis, base frame.
    pub axis: [f64; 3],
    /// A point on the axis, base frame, metres (ignored for prismatic joints).
    pub point: [f64; 3],
    /// `+1.0` or `-1.0`: the sign between the joint value and the model value.
    pub direction: f64,
    /// Added to `direction × joint value` (radians or metres).
    pub offset: f64,
    /// Allowed joint values `[min, max]` (radians or metres); may be infinite.
    pub limits: [f64; 2],
}

impl Joint {
    /// The model value (rotation angle or slide length) for a joint value.
    #[inline]
    pub fn model_value(&self, joint_value: f64) -> f64 {
        self.direction * joint_value + self.offset
    }

    /// The joint value for a model value (the inverse of [`Joint::model_value`]).
    #[inline]
    pub fn joint_value(&self, model_value: f64) -> f64 {
        (model_value - self.offset) * self.direction
    }
}
