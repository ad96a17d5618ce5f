//! A checked [`Description`] converted into the canonical [`Model`]: SI units, every joint's
//! axis and point in the base frame with every model value at zero.
//!
//! Standard DH (`Rz(θ)·Tz(d)·Tx(a)·Rx(α)`; Spong, Hutchinson & Vidyasagar 2006, §3.2) and
//! modified DH (`Rx(α)·Tx(a)·Rz(θ)·Tz(d)`; Craig 2005, §3.4) are converted by walking the link
//! frames with every joint value at zero. Joint `i` turns about (or slides along) the z axis of
//! frame `i−1` in standard DH, and of frame `i` in modified DH. Because the joint value is
//! added to `θ` (or `d`), which is the last factor about z before (standard) or the factor
//! right after (modified) that frame, `Rz(θ + direction·q)` equals the walked frame followed by
//! a rotation about that frame's z axis by `direction·q`: the runtime joint's offset is zero.

use armforge_runtime::{Joint, JointKind, Pose};
use nalgebra::Matrix3;

use super::schema::{Convention, Description, DhParameters, FrameEntry, JointEntry};
use super::source::Source;
use crate::model::{Model, ModelJoint};
use crate::units::Units;

/// Converts a description that passed every check.
pub(crate) fn to_model(source: &Source, description: &Description, path: &str) -> Model {
    let units = description.units;
    let convention = description.convention.unwrap_or(Convention::Axes);
    let tool_in_file = frame_pose(description.tool.as_ref(), units);
    let (axes, tool) = match convention {
        Convention::Dh | Convention::ModifiedDh => {
            walk_dh(&description.joints, units, convention, &tool_in_file)
        }
        Convention::Axes => (
            description
                .joints
                .iter()
                .map(|j| given_axis(j, units))
                .collect(),
            tool_in_file,
        ),
    };
    let joints = description
        .joints
        .iter()
        .zip(axes)
        .enumerate()
        .map(|(i, (entry, joint))| ModelJoint {
            joint,
            name: entry
                .name
                .as_ref()
                .map_or_else(|| format!("joint {}", i + 1), |n| n.value.clone()),
            location: source.location(entry.span.start),
        })
        .collect();
    Model {
        name: description.name.clone(),
        description: description.description.clone(),
        units,
        joints,
        tool,
        base: frame_pose(description.base.as_ref(), units),
        source_path: path.to_string(),
    }
}

/// The runtime joint for a joint entry, with axis and point still to be filled in.
fn joint_shell(entry: &JointEntry, units: Units) -> Joint {
    let kind = entry.kind.unwrap_or(JointKind::Revolute);
    let limits = match (&entry.limits, kind) {
        (Some(l), _) => [
            units.joint_to_si(kind, l.value[0]),
            units.joint_to_si(kind, l.value[1]),
        ],
        // One turn, (−180°, 180°].
        (None, JointKind::Revolute) => [-core::f64::consts::PI, core::f64::consts::PI],
        (None, JointKind::Prismatic) => [f64::NEG_INFINITY, f64::INFINITY],
    };
    Joint {
        kind,
        axis: [0.0, 0.0, 1.0],
        point: [0.0; 3],
        direction: entry.direction,
        offset: 0.0,
        limits,
    }
}

fn given_axis(entry: &JointEntry, units: Units) -> Joint {
    let mut joint = joint_shell(entry, units);
    let axis = entry.axis.as_ref().map_or([0.0, 0.0, 1.0], |a| a.value);
    joint.axis = unit_vector(axis);
    joint.point = entry
        .point
        .as_ref()
        .map_or([0.0; 3], |p| p.value.map(|x| units.length_to_si(x)));
    joint.offset = units.joint_to_si(joint.kind, entry.offset);
    joint
}

/// A nonzero vector scaled to unit length; scaled by its largest component first so that
/// neither tiny nor huge components underflow or overflow.
fn unit_vector(v: [f64; 3]) -> [f64; 3] {
    let largest = v.iter().fold(0.0f64, |m, x| m.max(x.abs()));
    let v = v.map(|x| x / largest);
    let length = (v[0] * v[0] + v[1] * v[1] + v[2] * v[2]).sqrt();
    v.map(|x| x / length)
}

/// Walks the DH frames at zero: the joints' axes and the tool pose in the base frame.
fn walk_dh(
    entries: &[JointEntry],
    units: Units,
    convention: Convention,
    tool_in_last_frame: &Pose,
) -> (Vec<Joint>, Pose) {
    let mut frame = Pose::IDENTITY;
    let mut joints = Vec::with_capacity(entries.len());
    for entry in entries {
        let link = dh_link(&entry.dh, units, convention);
        if convention == Convention::ModifiedDh {
            frame = frame.compose(&link);
        }
        let mut joint = joint_shell(entry, units);
        joint.axis = [
            frame.rotation[0][2],
            frame.rotation[1][2],
            frame.rotation[2][2],
        ];
        joint.point = frame.translation;
        joints.push(joint);
        if convention == Convention::Dh {
            frame = frame.compose(&link);
        }
    }
    (joints, frame.compose(tool_in_last_frame))
}

/// One link transform at joint value zero, in SI units.
fn dh_link(p: &DhParameters, units: Units, convention: Convention) -> Pose {
    let a = translation([units.length_to_si(p.a), 0.0, 0.0]);
    let d = translation([0.0, 0.0, units.length_to_si(p.d)]);
    let alpha = rotation_x(units.angle_to_si(p.alpha));
    let theta = rotation_z(units.angle_to_si(p.theta));
    match convention {
        // Rz(θ)·Tz(d)·Tx(a)·Rx(α)
        Convention::Dh => theta.compose(&d).compose(&a).compose(&alpha),
        // Rx(α)·Tx(a)·Rz(θ)·Tz(d)
        _ => alpha.compose(&a).compose(&theta).compose(&d),
    }
}

fn translation(t: [f64; 3]) -> Pose {
    Pose {
        translation: t,
        ..Pose::IDENTITY
    }
}

fn rotation_x(angle: f64) -> Pose {
    let (s, c) = angle.sin_cos();
    Pose {
        rotation: [[1.0, 0.0, 0.0], [0.0, c, -s], [0.0, s, c]],
        translation: [0.0; 3],
    }
}

fn rotation_y(angle: f64) -> Pose {
    let (s, c) = angle.sin_cos();
    Pose {
        rotation: [[c, 0.0, s], [0.0, 1.0, 0.0], [-s, 0.0, c]],
        translation: [0.0; 3],
    }
}

fn rotation_z(angle: f64) -> Pose {
    let (s, c) = angle.sin_cos();
    Pose {
        rotation: [[c, -s, 0.0], [s, c, 0.0], [0.0, 0.0, 1.0]],
        translation: [0.0; 3],
    }
}

/// The pose a `[tool]` or `[base]` table describes, in SI units (identity when absent).
fn frame_pose(frame: Option<&FrameEntry>, units: Units) -> Pose {
    let Some(frame) = frame else {
        return Pose::IDENTITY;
    };
    let rotation = if let Some(rpy) = &frame.rpy {
        let [roll, pitch, yaw] = rpy.value.map(|x| units.angle_to_si(x));
        // R = Rz(yaw)·Ry(pitch)·Rx(roll)
        rotation_z(yaw)
            .compose(&rotation_y(pitch))
            .compose(&rotation_x(roll))
            .rotation
    } else if let Some(r) = &frame.rotation {
        nearest_rotation(&r.value)
    } else {
        Pose::IDENTITY.rotation
    };
    Pose {
        rotation,
        translation: frame.translation.map(|x| units.length_to_si(x)),
    }
}

/// The rotation nearest a matrix that is already orthonormal within the reading tolerance, so
/// that rounding in the file does not leave a slightly skewed tool or base frame: the
/// iteration `R ← (3R − R·Rᵀ·R)/2` converges quadratically to the orthogonal polar factor
/// (Björck & Bowie, SIAM J. Numer. Anal. 8, 1971); three steps take an error of 1e-6 below
/// rounding.
fn nearest_rotation(r: &[[f64; 3]; 3]) -> [[f64; 3]; 3] {
    let mut m = Matrix3::from_fn(|i, j| r[i][j]);
    for _ in 0..3 {
        m = (m * 3.0 - m * m.transpose() * m) * 0.5;
    }
    [
        [m[(0, 0)], m[(0, 1)], m[(0, 2)]],
        [m[(1, 0)], m[(1, 1)], m[(1, 2)]],
        [m[(2, 0)], m[(2, 1)], m[(2, 2)]],
    ]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn unit_vector_survives_tiny_and_huge_components() {
        assert_eq!(unit_vector([1e-300, 0.0, 0.0]), [1.0, 0.0, 0.0]);
        assert_eq!(unit_vector([0.0, -1e300, 0.0]), [0.0, -1.0, 0.0]);
        let v = unit_vector([3.0, 0.0, 4.0]);
        assert!((v[0] - 0.6).abs() < 1e-16 && (v[2] - 0.8).abs() < 1e-16);
    }

    #[test]
    fn nearest_rotation_removes_a_small_skew() {
        let skewed = [[1.0, 4e-7, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0 - 3e-7]];
        let r = nearest_rotation(&skewed);
        for i in 0..3 {
            for j in 0..3 {
                let dot: f64 = (0..3).map(|k| r[i][k] * r[j][k]).sum();
                let identity = if i == j { 1.0 } else { 0.0 };
                assert!((dot - identity).abs() < 1e-15, "{r:?}");
            }
        }
    }
}
