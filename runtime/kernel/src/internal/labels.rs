//! Branch labels read back from joint values: the geometric definitions of the shoulder, elbow
//! and wrist choices (documented on [`crate::Shoulder`], [`crate::Elbow`], [`crate::Wrist`]),
//! which every solver's `branch_of` applies and `solve`'s labels agree with.

use crate::fk::joint_motion;
use crate::math::{cross, dot, sin_cos, sub, tolerance, Growth, Scalar};
use crate::model::Joint;
use crate::solution::{Branch, Elbow, Shoulder, Wrist, JOINTS};

/// How the shoulder label is read from joint values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ShoulderRule<S: Scalar = f64> {
    /// Elbow and polar arms: the sign of `normal · (E2 E3 c − point)`; `Facing` when it
    /// equals `facing` (`±1`; zero counts as positive).
    Plane {
        /// `h1 × h2`.
        normal: [S; 3],
        /// A point on axis 1.
        point: [S; 3],
        /// The wrist center at zero.
        wrist_center: [S; 3],
        /// The sign that means `Facing`.
        facing: S,
    },
    /// Cylindrical arms: the sign of `direction · (E2 E3 c − point)`; `Facing` when `≥ 0`.
    Radial {
        /// The radial direction of the solved slide, ⟂ axis 1.
        direction: [S; 3],
        /// The point of the slide's line nearest axis 1 at zero, shifted by the slides.
        point: [S; 3],
        /// The wrist center at zero.
        wrist_center: [S; 3],
    },
    /// No shoulder choice.
    Only,
}

/// How the elbow label is read from joint values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ElbowRule<S: Scalar = f64> {
    /// Elbow arms: bend `= sign sin(sense · θ3 − stretched)` (θ3 the model value); `Up` when
    /// bend × (+1 facing, −1 across) equals `up`.
    Bend {
        /// `±1`: axis 3's direction relative to axis 2.
        sense: S,
        /// The angle of the stretched configuration about axis 2.
        stretched: S,
        /// The sign that means `Up` with the shoulder `Facing`.
        up: S,
    },
    /// Polar arms: `Extended` when the slide's model value is at least `nearest` (the value at
    /// the nearest approach to axis 2).
    Slide {
        /// The slide value of the nearest approach.
        nearest: S,
    },
    /// General arms (joints 1–3 of no named family): the sign of the position Jacobian's
    /// determinant `det[h1 × (w − p1), h2 × (w − p2), h3 × (w − p3)]` with the axes and the
    /// wrist center `w` at the configuration (joint 1 undone, which leaves the sign alone);
    /// `Up` when it equals `up` (zero counts as positive).
    Aspect {
        /// The sign that means `Up`.
        up: S,
    },
    /// No elbow choice.
    Only,
}

/// How the wrist label is read from joint values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WristRule<S: Scalar = f64> {
    /// `h4 × h5` at zero.
    pub normal: [S; 3],
    /// `h5` at zero.
    pub axis5: [S; 3],
    /// `h6` at zero.
    pub axis6: [S; 3],
}

/// The rules that read a branch label from joint values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct BranchRule<S: Scalar = f64> {
    /// Shoulder rule.
    pub shoulder: ShoulderRule<S>,
    /// Elbow rule.
    pub elbow: ElbowRule<S>,
    /// Wrist rule.
    pub wrist: WristRule<S>,
    /// The rules read the arm backwards: for an arm whose axes 1–3 meet (the wrist at the
    /// base), they are the rules of the mirrored arm, whose joint `i` is joint `7 − i` turning
    /// about the reversed axis (same joint values).
    pub mirrored: bool,
}

/// The mirrored arm of [`BranchRule::mirrored`]: joints in reverse order, axes reversed, and
/// the joint values in reverse order. `E(−h, θ) = E(h, −θ)`, so the mirrored arm's forward
/// kinematics with the reversed values is the inverse of the arm's joint motions.
pub fn mirror<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    q: &[S; JOINTS],
) -> ([Joint<S>; JOINTS], [S; JOINTS]) {
    let mut mj = *joints;
    let mut mq = *q;
    for i in 0..JOINTS {
        let j = joints[JOINTS - 1 - i];
        mj[i] = Joint {
            axis: [-j.axis[0], -j.axis[1], -j.axis[2]],
            ..j
        };
        mq[i] = q[JOINTS - 1 - i];
    }
    (mj, mq)
}

fn sign<S: Scalar>(x: S) -> S {
    if x >= S::ZERO {
        S::ONE
    } else {
        -S::ONE
    }
}

/// True when `joint` is revolute and its axis passes through `c` (to 1e-12 of the distance
/// from the axis point, or 1e-12 m, for `f64`; carried to other scalars by the ratio of the
/// epsilons): turning the joint leaves `c` where it is.
fn passes_through<S: Scalar>(joint: &Joint<S>, c: &[S; 3]) -> bool {
    if joint.kind != crate::model::JointKind::Revolute {
        return false;
    }
    let d = sub(c, &joint.point);
    let off = cross(&joint.axis, &d);
    let scale = dot(&d, &d).max(S::ONE);
    dot(&off, &off) <= tolerance::<S>(1e-24, Growth::Linear) * scale
}

/// Rodrigues' rotation of `v` about unit `h` by `angle`.
fn rotate<S: Scalar>(h: &[S; 3], angle: S, v: &[S; 3]) -> [S; 3] {
    let (s, c) = sin_cos(angle);
    let k = dot(h, v) * (S::ONE - c);
    let hv = cross(h, v);
    [
        c * v[0] + s * hv[0] + k * h[0],
        c * v[1] + s * hv[1] + k * h[1],
        c * v[2] + s * hv[2] + k * h[2],
    ]
}

/// The wrist center at zero a shoulder rule carries (the origin for [`ShoulderRule::Only`]).
fn wrist_center_of<S: Scalar>(rule: &ShoulderRule<S>) -> [S; 3] {
    match *rule {
        ShoulderRule::Plane { wrist_center, .. } | ShoulderRule::Radial { wrist_center, .. } => {
            wrist_center
        }
        ShoulderRule::Only => [S::ZERO; 3],
    }
}

/// The branch label of a configuration, read by the arm's rules.
#[inline(always)]
pub fn branch_of<S: Scalar>(
    rule: &BranchRule<S>,
    joints: &[Joint<S>; JOINTS],
    q: &[S; JOINTS],
) -> Branch {
    if rule.mirrored {
        let (mj, mq) = mirror(joints, q);
        branch_read_forward(rule, &mj, &mq)
    } else {
        branch_read_forward(rule, joints, q)
    }
}

/// [`branch_of`] with the rules read forwards (no recursion: the mirrored arm is worked out
/// by the caller). Inlined so that, with an emitted module's constant rule and joint table,
/// which joints move the wrist center is settled at compile time.
#[inline(always)]
fn branch_read_forward<S: Scalar>(
    rule: &BranchRule<S>,
    joints: &[Joint<S>; JOINTS],
    q: &[S; JOINTS],
) -> Branch {
    // The point joints 2–6 carry (a wrist center is fixed by joints 4–6; the meeting point of
    // axes 5 and 6 of a three-parallel arm is moved by joint 4).
    // Trailing revolute joints whose axes pass through the point at zero leave it in place
    // (the wrist joints of a spherical wrist): only the joints before them move it. Which
    // joints those are depends on the arm alone, never on `q`.
    let moved_center = |c: &[S; 3]| {
        let mut w = *c;
        let mut fixed = true;
        for i in (1..JOINTS).rev() {
            fixed = fixed && passes_through(&joints[i], c);
            if !fixed {
                w = joint_motion(&joints[i], q[i]).transform_point(&w);
            }
        }
        w
    };
    let shoulder = match rule.shoulder {
        ShoulderRule::Plane {
            normal,
            point,
            wrist_center,
            facing,
        } => {
            let w = moved_center(&wrist_center);
            if sign(dot(&normal, &sub(&w, &point))) == facing {
                Shoulder::Facing
            } else {
                Shoulder::Across
            }
        }
        ShoulderRule::Radial {
            direction,
            point,
            wrist_center,
        } => {
            let w = moved_center(&wrist_center);
            if dot(&direction, &sub(&w, &point)) >= S::ZERO {
                Shoulder::Facing
            } else {
                Shoulder::Across
            }
        }
        ShoulderRule::Only => Shoulder::Only,
    };
    let elbow = match rule.elbow {
        ElbowRule::Bend {
            sense,
            stretched,
            up,
        } => {
            let theta3 = joints[2].model_value(q[2]);
            let bend = sign(crate::math::sin(sense * theta3 - stretched));
            let side = if shoulder == Shoulder::Across {
                -S::ONE
            } else {
                S::ONE
            };
            if bend * side == up {
                Elbow::Up
            } else {
                Elbow::Down
            }
        }
        ElbowRule::Slide { nearest } => {
            if joints[2].model_value(q[2]) >= nearest {
                Elbow::Extended
            } else {
                Elbow::Retracted
            }
        }
        ElbowRule::Aspect { up } => {
            // Joint 1 undone: w = E2 E3 c, axis 3 carried by joint 2.
            let w = moved_center(&wrist_center_of(&rule.shoulder));
            let e2 = joint_motion(&joints[1], q[1]);
            let h3 = e2.rotate(&joints[2].axis);
            let p3 = e2.transform_point(&joints[2].point);
            let d1 = cross(&joints[0].axis, &sub(&w, &joints[0].point));
            let d2 = cross(&joints[1].axis, &sub(&w, &joints[1].point));
            let d3 = cross(&h3, &sub(&w, &p3));
            if sign(dot(&d1, &cross(&d2, &d3))) == up {
                Elbow::Up
            } else {
                Elbow::Down
            }
        }
        ElbowRule::Only => Elbow::Only,
    };
    let theta5 = joints[4].model_value(q[4]);
    let w = &rule.wrist;
    let turned = rotate(&w.axis5, theta5, &w.axis6);
    let wrist = if dot(&w.normal, &turned) >= S::ZERO {
        Wrist::Leading
    } else {
        Wrist::Trailing
    };
    Branch {
        shoulder,
        elbow,
        wrist,
    }
}
