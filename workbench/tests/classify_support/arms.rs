//! Invented arms for the classification tests, built straight from joint lines (metres).

use std::f64::consts::FRAC_PI_3;

use armforge_compiler::model::Model;

use super::{arm, p, r};

/// An upright elbow arm without offsets: shoulder 0.4 m up, upper arm 0.35 m, forearm 0.4 m,
/// roll–pitch–roll wrist.
pub fn plain_elbow() -> Model {
    arm(
        &[
            r([0.0, 0.0, 1.0], [0.0, 0.0, 0.0]),
            r([0.0, 1.0, 0.0], [0.0, 0.0, 0.4]),
            r([0.0, 1.0, 0.0], [0.0, 0.0, 0.75]),
            r([1.0, 0.0, 0.0], [0.1, 0.0, 0.75]),
            r([0.0, 1.0, 0.0], [0.4, 0.0, 0.75]),
            r([1.0, 0.0, 0.0], [0.4, 0.0, 0.75]),
        ],
        [0.5, 0.0, 0.75],
    )
}

/// An elbow arm with a 0.1 m shoulder offset, axis 2 at 60° to axis 1, a 0.3 m upper arm, a
/// 0.35 m forearm and the wrist center 0.05 m sideways along axis 2.
pub fn offset_tilted_elbow() -> Model {
    let h2 = [0.0, (FRAC_PI_3).sin(), (FRAC_PI_3).cos()];
    let n = [0.0, -(FRAC_PI_3).cos(), (FRAC_PI_3).sin()]; // ⟂ h2
    let p2 = [0.1, 0.0, 0.4];
    let p3 = [p2[0], p2[1] + 0.3 * n[1], p2[2] + 0.3 * n[2]];
    let c = [p3[0] + 0.35, p3[1] + 0.05 * h2[1], p3[2] + 0.05 * h2[2]];
    arm(
        &[
            r([0.0, 0.0, 1.0], [0.0, 0.0, 0.0]),
            r(h2, p2),
            r(h2, p3),
            r([1.0, 0.0, 0.0], c),
            r(h2, c),
            r([1.0, 0.0, 0.0], c),
        ],
        [c[0] + 0.1, c[1], c[2]],
    )
}

pub fn polar_arm(h2: [f64; 3], slide: [f64; 3]) -> Model {
    let c = [0.1, 0.05, 0.35];
    arm(
        &[
            r([0.0, 0.0, 1.0], [0.0, 0.0, 0.0]),
            r(h2, [0.0, 0.0, 0.3]),
            p(slide, [0.2, 0.9]),
            r([1.0, 0.0, 0.0], c),
            r([0.0, 0.0, 1.0], c),
            r([1.0, 0.0, 0.0], c),
        ],
        [0.2, 0.05, 0.35],
    )
}

pub fn cylindrical_arm(s2: [f64; 3], s3: [f64; 3]) -> Model {
    let c = [0.2, 0.0, 0.3];
    arm(
        &[
            r([0.0, 0.0, 1.0], [0.0, 0.0, 0.0]),
            p(s2, [0.0, 0.5]),
            p(s3, [0.1, 0.6]),
            r([1.0, 0.0, 0.0], c),
            r([0.0, 1.0, 0.0], c),
            r([1.0, 0.0, 0.0], c),
        ],
        [0.3, 0.0, 0.3],
    )
}

pub fn cartesian_arm(s: [[f64; 3]; 3]) -> Model {
    let c = [0.5, 0.4, 0.3];
    arm(
        &[
            p(s[0], [0.0, 1.0]),
            p(s[1], [0.0, 1.0]),
            p(s[2], [0.0, 0.5]),
            r([0.0, 0.0, 1.0], c),
            r([1.0, 0.0, 0.0], c),
            r([0.0, 0.0, 1.0], c),
        ],
        [0.5, 0.4, 0.2],
    )
}

/// Every solvable test arm, named: each family, with perpendicular and tilted axes.
pub fn solvable() -> Vec<(&'static str, Model)> {
    let t70 = 70f64.to_radians();
    let t10 = 10f64.to_radians();
    vec![
        ("plain elbow", plain_elbow()),
        ("offset tilted elbow", offset_tilted_elbow()),
        ("oblique-wrist elbow", oblique_wrist_elbow()),
        ("polar", polar_arm([0.0, 1.0, 0.0], [1.0, 0.0, 0.0])),
        (
            "tilted polar",
            polar_arm([0.0, t70.sin(), t70.cos()], [1.0, 0.0, 0.0]),
        ),
        (
            "cylindrical",
            cylindrical_arm([0.0, 0.0, 1.0], [1.0, 0.0, 0.0]),
        ),
        (
            "tilted cylindrical",
            cylindrical_arm([t10.sin(), 0.0, t10.cos()], [1.0, 0.0, 0.2]),
        ),
        (
            "cartesian",
            cartesian_arm([[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]]),
        ),
        (
            "oblique cartesian",
            cartesian_arm([[1.0, 0.0, 0.0], [1.0, 1.0, 0.0], [0.0, 1.0, 1.0]]),
        ),
        ("three-parallel", three_parallel()),
        ("offset hand", three_parallel_skew()),
    ]
}

/// The plain elbow with a wrist of 60° and 45° twists.
pub fn oblique_wrist_elbow() -> Model {
    let c = [0.4, 0.0, 0.75];
    let h5 = [FRAC_PI_3.cos(), FRAC_PI_3.sin(), 0.0];
    let b = std::f64::consts::FRAC_PI_4;
    let h6 = [h5[0] * b.cos(), h5[1] * b.cos(), b.sin()];
    let mut m = plain_elbow();
    m.joints[4].joint.axis = h5;
    m.joints[4].joint.point = c;
    m.joints[5].joint.axis = h6;
    m.joints[5].joint.point = c;
    m
}

/// The plain elbow whose axis 6 passes `offset` metres beside the wrist center (along y).
pub fn offset_wrist(offset: f64) -> Model {
    let mut m = plain_elbow();
    m.joints[5].joint.point = [0.4, offset, 0.75];
    m
}

/// Axes 2, 3 and 4 parallel, axis 5 vertical, axis 6 parallel to 4 again (at zero) and
/// meeting axis 5: no spherical wrist, the three-parallel family.
pub fn three_parallel() -> Model {
    arm(
        &[
            r([0.0, 0.0, 1.0], [0.0, 0.0, 0.0]),
            r([0.0, 1.0, 0.0], [0.0, 0.1, 0.15]),
            r([0.0, 1.0, 0.0], [0.4, 0.1, 0.15]),
            r([0.0, 1.0, 0.0], [0.75, 0.1, 0.15]),
            r([0.0, 0.0, -1.0], [0.75, 0.2, 0.15]),
            r([0.0, 1.0, 0.0], [0.75, 0.2, 0.05]),
        ],
        [0.75, 0.3, 0.05],
    )
}

/// [`three_parallel`] with axis 6 moved 0.05 m along x, off axis 5: axes 5 and 6 pass apart
/// (the offset-hand family's).
pub fn three_parallel_skew() -> Model {
    let mut m = three_parallel();
    m.joints[5].joint.point = [0.8, 0.2, 0.05];
    m
}

/// The plain elbow with axis 5 turned parallel to axis 4, 0.1 m below it, and axis 6 across
/// both: a degenerate wrist.
pub fn degenerate_wrist() -> Model {
    let mut m = plain_elbow();
    m.joints[4].joint.axis = [1.0, 0.0, 0.0];
    m.joints[4].joint.point = [0.4, 0.0, 0.65];
    m.joints[5].joint.axis = [0.0, 1.0, 0.0];
    m
}

/// An elbow-like first three joints and axes 4, 5, 6 parallel (along x), apart.
pub fn last_three_parallel() -> Model {
    arm(
        &[
            r([0.0, 0.0, 1.0], [0.0, 0.0, 0.0]),
            r([0.0, 1.0, 0.0], [0.0, 0.0, 0.4]),
            r([0.0, 1.0, 0.0], [0.3, 0.0, 0.4]),
            r([1.0, 0.0, 0.0], [0.6, 0.0, 0.4]),
            r([1.0, 0.0, 0.0], [0.6, 0.2, 0.4]),
            r([1.0, 0.0, 0.0], [0.6, 0.2, 0.6]),
        ],
        [0.8, 0.2, 0.6],
    )
}

/// Axes 2, 3, 4 meet at (0, 0, 0.5); axes 5 and 6 are an offset chain: no decoupling at
/// either end.
pub fn middle_three_meet() -> Model {
    arm(
        &[
            r([0.0, 0.0, 1.0], [0.0, 0.1, 0.0]),
            r([1.0, 0.0, 0.0], [0.0, 0.0, 0.5]),
            r([0.0, 1.0, 0.0], [0.0, 0.0, 0.5]),
            r([1.0, 1.0, 0.0], [0.0, 0.0, 0.5]),
            r([0.0, 0.0, 1.0], [0.5, 0.2, 0.5]),
            r([1.0, 0.0, 0.0], [0.7, 0.2, 0.6]),
        ],
        [0.8, 0.2, 0.6],
    )
}

/// Axes 1, 2, 3 meet at the origin; the last three are an offset chain.
pub fn first_three_meet() -> Model {
    arm(
        &[
            r([0.0, 0.0, 1.0], [0.0, 0.0, 0.0]),
            r([0.0, 1.0, 0.0], [0.0, 0.0, 0.0]),
            r([1.0, 0.0, 0.0], [0.0, 0.0, 0.0]),
            r([0.0, 1.0, 0.0], [0.3, 0.0, 0.0]),
            r([0.0, 0.0, 1.0], [0.6, 0.0, 0.0]),
            r([1.0, 0.0, 0.0], [0.6, 0.05, 0.1]),
        ],
        [0.7, 0.05, 0.1],
    )
}

/// The plain elbow without its last joint.
pub fn five_joints() -> Model {
    let mut m = plain_elbow();
    m.joints.pop();
    m
}

/// The plain elbow with axis 3 tilted by `angle` about x: R R R with axis 2 ∦ axis 3.
pub fn tilted_axis_3(angle: f64) -> Model {
    let mut m = plain_elbow();
    m.joints[2].joint.axis = [0.0, angle.cos(), angle.sin()];
    m
}

/// Joint 1 slides (P R R): no family of ours.
pub fn slide_first() -> Model {
    let mut m = plain_elbow();
    m.joints[0].joint.kind = armforge_runtime::JointKind::Prismatic;
    m.joints[0].joint.limits = [0.0, 0.5];
    m
}

/// Six revolute joints, every pair skew, nothing meets.
pub fn general_six_revolute() -> Model {
    arm(
        &[
            r([0.0, 0.0, 1.0], [0.0, 0.0, 0.0]),
            r([0.0, 1.0, 0.0], [0.1, 0.0, 0.3]),
            r([0.0, 0.3, 1.0], [0.4, 0.0, 0.3]),
            r([1.0, 0.0, 0.0], [0.4, 0.1, 0.6]),
            r([0.0, 1.0, 0.2], [0.7, 0.0, 0.65]),
            r([1.0, 0.5, 0.0], [0.7, 0.1, 0.8]),
        ],
        [0.9, 0.1, 0.8],
    )
}
