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
    /// wrist center `w` at the configuration (joint 1 undone, which leaves the sign alone; a
    /// slide's column is its direction `hi`); `Up` when it equals `up` (zero counts as
    /// positive).
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

/// The velocity of the point `w` per unit of `joint`'s value, with the joint's axis `h`
/// through `p` where the configuration has carried it: `h × (w − p)` for a turn, `h` itself
/// for a slide (a column of the position Jacobian).
fn velocity_column<S: Scalar>(joint: &Joint<S>, h: &[S; 3], p: &[S; 3], w: &[S; 3]) -> [S; 3] {
    if joint.kind == crate::model::JointKind::Revolute {
        cross(h, &sub(w, p))
    } else {
        *h
    }
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
            let d1 = velocity_column(&joints[0], &joints[0].axis, &joints[0].point, &w);
            let d2 = velocity_column(&joints[1], &joints[1].axis, &joints[1].point, &w);
            let d3 = velocity_column(&joints[2], &h3, &p3, &w);
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

/// The rules of an elbow arm (shoulder [`ShoulderRule::Plane`], elbow [`ElbowRule::Bend`],
/// read forwards) with the joint table folded in, so that a label costs two `sin_cos` calls
/// and a few products instead of the forward kinematics of joints 2 and 3.
///
/// With `θi` the model values, `ci = cos θi`, `si = sin θi`:
/// - shoulder: `v = k₀ + k₁c₃ + k₂s₃ + c₂(g₀ + g₁c₃ + g₂s₃) + s₂(m₀ + m₁c₃ + m₂s₃)` is
///   `n · (E₂E₃c − p)` of [`ShoulderRule::Plane`] (Rodrigues' formula for each joint motion,
///   expanded); `Facing` when `sign v = facing`;
/// - elbow: `sin(sense·θ₃ − stretched) = e_s·s₃ + e_c·c₃` with `e_s = sense·cos(stretched)`,
///   `e_c = −sin(stretched)`;
/// - wrist: `n · R(h₅, θ₅) h₆ = w₀ + R cos(θ₅ − φ)`, which is `≥ 0` exactly when
///   `|θ₅ − φ|` wrapped into `[−π, π]` is at most `τ = acos(−w₀ / R)`: no call at all.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FoldedRule<S: Scalar = f64> {
    /// `[k₀, k₁, k₂, g₀, g₁, g₂, m₀, m₁, m₂]` of the shoulder value.
    pub shoulder: [S; 9],
    /// The sign of the shoulder value that means `Facing`.
    pub facing: S,
    /// `[e_s, e_c]` of the elbow bend.
    pub bend: [S; 2],
    /// The bend sign (times +1 facing, −1 across) that means `Up`.
    pub up: S,
    /// `φ` of the wrist rule (radians).
    pub wrist_phase: S,
    /// `τ` of the wrist rule (radians, in `[0, π]`).
    pub wrist_half_width: S,
}

/// The [`FoldedRule`] of `rule` for `joints`, when the rule is an elbow arm's (plane shoulder,
/// bend elbow, not mirrored) and exactly joints 2 and 3, both revolute, move the wrist center;
/// otherwise `None` (the generic [`branch_of`] applies).
pub fn fold_rule(rule: &BranchRule<f64>, joints: &[Joint<f64>; JOINTS]) -> Option<FoldedRule> {
    use crate::math::{atan2, scale, sqrt};
    use crate::model::JointKind;
    let ShoulderRule::Plane {
        normal: n,
        point,
        wrist_center: c,
        facing,
    } = rule.shoulder
    else {
        return None;
    };
    let ElbowRule::Bend {
        sense,
        stretched,
        up,
    } = rule.elbow
    else {
        return None;
    };
    let wrist_fixed = (3..JOINTS).all(|i| passes_through(&joints[i], &c));
    let (j2, j3) = (&joints[1], &joints[2]);
    let revolute = j2.kind == JointKind::Revolute && j3.kind == JointKind::Revolute;
    if rule.mirrored || !wrist_fixed || !revolute || passes_through(j3, &c) {
        return None;
    }
    // E₃c = p₃ + R(h₃, θ₃)(c − p₃) = a + c₃·b + s₃·e, then u = E₃c − p₂.
    let (h3, d) = (j3.axis, sub(&c, &j3.point));
    let along = scale(&h3, dot(&h3, &d));
    let a = crate::math::add(&j3.point, &along);
    let b = sub(&d, &along);
    let e = cross(&h3, &d);
    let u0 = sub(&a, &j2.point);
    // n · (p₂ + R(h₂, θ₂)u − p) = n·(p₂ − p) + k·u + c₂ g·u + s₂ m·u.
    let h2 = j2.axis;
    let k = scale(&h2, dot(&n, &h2));
    let g = sub(&n, &k);
    let m = cross(&n, &h2);
    let base = dot(&n, &sub(&j2.point, &point));
    let shoulder = [
        base + dot(&k, &u0),
        dot(&k, &b),
        dot(&k, &e),
        dot(&g, &u0),
        dot(&g, &b),
        dot(&g, &e),
        dot(&m, &u0),
        dot(&m, &b),
        dot(&m, &e),
    ];
    let (st_sin, st_cos) = sin_cos(stretched);
    let w = &rule.wrist;
    let w0 = dot(&w.axis5, &w.axis6) * dot(&w.normal, &w.axis5);
    let wc = dot(&w.normal, &w.axis6) - w0;
    let ws = dot(&w.normal, &cross(&w.axis5, &w.axis6));
    let r = sqrt(wc * wc + ws * ws);
    let x = if r > 0.0 {
        (-w0 / r).clamp(-1.0, 1.0)
    } else if w0 >= 0.0 {
        -1.0
    } else {
        1.0
    };
    Some(FoldedRule {
        shoulder,
        facing,
        bend: [sense * st_cos, -st_sin],
        up,
        wrist_phase: atan2(ws, wc),
        wrist_half_width: atan2(sqrt(1.0 - x * x), x),
    })
}

/// The branch label of a configuration by a [`FoldedRule`]; agrees with [`branch_of`] for the
/// rule it was folded from (up to rounding at the label boundaries).
#[inline(always)]
pub fn branch_of_folded<S: Scalar>(
    rule: &FoldedRule<S>,
    joints: &[Joint<S>; JOINTS],
    q: &[S; JOINTS],
) -> Branch {
    let (s2, c2) = sin_cos(joints[1].model_value(q[1]));
    let (s3, c3) = sin_cos(joints[2].model_value(q[2]));
    let k = &rule.shoulder;
    let v = k[0]
        + k[1] * c3
        + k[2] * s3
        + c2 * (k[3] + k[4] * c3 + k[5] * s3)
        + s2 * (k[6] + k[7] * c3 + k[8] * s3);
    let (shoulder, side) = if sign(v) == rule.facing {
        (Shoulder::Facing, S::ONE)
    } else {
        (Shoulder::Across, -S::ONE)
    };
    let bend = sign(rule.bend[0] * s3 + rule.bend[1] * c3);
    let elbow = if bend * side == rule.up {
        Elbow::Up
    } else {
        Elbow::Down
    };
    let off = super::wrap(joints[4].model_value(q[4]) - rule.wrist_phase, S::ZERO);
    let wrist = if crate::math::abs(off) <= rule.wrist_half_width {
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
