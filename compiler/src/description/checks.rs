//! Checks across values of a [`Description`]: the joint count, the keys a convention needs
//! and forbids, axes, limit pairs and tool/base rotations.

use std::ops::Range;

use armforge_runtime::JointKind;

use super::reader::{Quantity, Spanned};
use super::schema::{report_missing, Convention, Description, FrameEntry, JointEntry};
use super::source::Source;
use crate::units::{tidy, AngleUnit};

/// The most joints a file may have.
pub const MAX_JOINTS: usize = 16;

/// Tolerance on `R·Rᵀ − I` for a rotation written in the file.
pub const ROTATION_TOLERANCE: f64 = 1e-6;

/// Runs every cross-value check, reporting each problem.
pub(crate) fn check(source: &mut Source, description: &Description) {
    joint_count(source, description);
    joint_names(source, description);
    for (i, joint) in description.joints.iter().enumerate() {
        let path = format!("joint[{}]", i + 1);
        if let Some(convention) = description.convention {
            convention_keys(source, joint, convention, &path);
        }
        axis(source, joint, description.convention, &path);
        limits(source, joint, description, &path);
    }
    for frame in description.tool.iter().chain(description.base.iter()) {
        frame_orientation(source, frame);
    }
}

fn joint_count(source: &mut Source, description: &Description) {
    let n = description.joints.len();
    if description.joints_malformed {
        // Already reported where `joint` was read.
    } else if n == 0 {
        source.report(
            &description.joints_span,
            "joint",
            "the arm has no joints; add one `[[joint]]` table per joint, base to tool",
        );
    } else if n > MAX_JOINTS {
        let message = format!("the arm has {n} joints; armforge reads at most {MAX_JOINTS}");
        source.report(&description.joints[MAX_JOINTS].span, "joint", message);
    }
}

/// Joint names must be unique, also against the `joint N` a joint without a name is called.
fn joint_names(source: &mut Source, description: &Description) {
    let called = |i: usize, joint: &JointEntry| {
        joint
            .name
            .as_ref()
            .map_or_else(|| format!("joint {}", i + 1), |n| n.value.clone())
    };
    for (i, joint) in description.joints.iter().enumerate() {
        let Some(name) = &joint.name else {
            continue;
        };
        let other = description.joints.iter().enumerate().find(|&(k, other)| {
            k != i && called(k, other) == name.value && (k < i || other.name.is_none())
        });
        if let Some((k, other)) = other {
            let whose = if other.name.is_some() {
                format!("joint {}'s name", k + 1)
            } else {
                format!("the name joint {} has by default", k + 1)
            };
            let message = format!(
                "the joint name \"{}\" is also {whose}; joint names must be unique",
                super::reader::shown(&name.value)
            );
            source.report(&name.span, &format!("joint[{}].name", i + 1), message);
        }
    }
}

fn convention_keys(source: &mut Source, joint: &JointEntry, convention: Convention, path: &str) {
    let others = [Convention::Dh, Convention::Axes]
        .into_iter()
        .filter(|c| c.own_keys() != convention.own_keys());
    for other in others {
        for (key, span) in joint
            .keys
            .iter()
            .filter(|(k, _)| other.own_keys().contains(&k.as_str()))
        {
            let own = convention
                .own_keys()
                .iter()
                .map(|k| format!("`{k}`"))
                .collect::<Vec<_>>()
                .join(", ");
            let message = format!(
                "`{key}` belongs to the `{}` convention, but this file uses `{}` (its joint keys are {own})",
                other.word(),
                convention.word()
            );
            source.report(span, &format!("{path}.{key}"), message);
        }
    }
}

fn axis(source: &mut Source, joint: &JointEntry, convention: Option<Convention>, path: &str) {
    if convention == Some(Convention::Axes) {
        if !has_key(joint, "axis") {
            report_missing(
                source,
                &joint.span,
                &format!("{path}.axis"),
                "this joint",
                "axis = [0, 0, 1]",
            );
        }
        if joint.kind == Some(JointKind::Revolute) && !has_key(joint, "point") {
            let message =
                "missing required key for a revolute joint in `axes`: give any point on the axis, e.g. `point = [0, 0, 0]`";
            source.report(&joint.span, &format!("{path}.point"), message);
        }
    }
    if let Some(axis) = &joint.axis {
        let [x, y, z] = axis.value;
        if x == 0.0 && y == 0.0 && z == 0.0 {
            let message = format!(
                "the axis [{}, {}, {}] has zero length; give its direction",
                tidy(x),
                tidy(y),
                tidy(z)
            );
            source.report(&axis.span, &format!("{path}.axis"), message);
        }
    }
}

fn has_key(joint: &JointEntry, key: &str) -> bool {
    joint.keys.iter().any(|(k, _)| k == key)
}

fn limits(source: &mut Source, joint: &JointEntry, description: &Description, path: &str) {
    let Some(limits) = &joint.limits else {
        return;
    };
    let [min, max] = limits.value;
    if min >= max {
        let quantity = match joint.kind {
            Some(JointKind::Revolute) => Quantity::Angle(description.units.angle),
            Some(JointKind::Prismatic) => Quantity::Length(description.units.length),
            None => Quantity::Plain,
        };
        let message = format!(
            "min {} is not less than max {}; write `limits = [min, max]` with min < max",
            quantity.show(min),
            quantity.show(max)
        );
        source.report(&limits.span, &format!("{path}.limits"), message);
    } else if joint.kind == Some(JointKind::Revolute) {
        turns(source, limits, description.units.angle, path);
    }
}

/// The widest revolute range a description may give: 16 turns. A solver holds one value per
/// joint and lists the others lazily, so the limit guards against slips (a range in degrees
/// read as radians), not against the size of the solution set.
pub const MAX_RANGE_TURNS: f64 = 16.0;

/// A revolute range wider than [`MAX_RANGE_TURNS`] is an error that says how many turns it
/// spans; in a radian file, a hint that the numbers look like degrees.
fn turns(source: &mut Source, limits: &Spanned<[f64; 2]>, unit: AngleUnit, path: &str) {
    let [min, max] = limits.value;
    let radians = match unit {
        AngleUnit::Radian => max - min,
        AngleUnit::Degree => (max - min).to_radians(),
    };
    let spanned = radians / std::f64::consts::TAU;
    if spanned <= MAX_RANGE_TURNS {
        degrees_in_radians(source, limits, unit, path);
        return;
    }
    let quantity = Quantity::Angle(unit);
    let mut message = format!(
        "the range {} to {} spans {} turns; a revolute joint may span at most {} turns",
        quantity.show(min),
        quantity.show(max),
        tidy((spanned * 10.0).round() / 10.0),
        MAX_RANGE_TURNS
    );
    if unit == AngleUnit::Radian && (max - min).to_radians() <= 4.0 * std::f64::consts::TAU {
        message.push_str(
            "; these numbers look like degrees: the file's angle_unit is rad, write \
             `angle_unit = \"deg\"` if they are",
        );
    }
    source.report(&limits.span, &format!("{path}.limits"), message);
}

/// A warning for revolute limits in a radian file that look like degrees: beyond a turn
/// (2π) and whole numbers, as `[-170, 170]` would be. Two turns written as `±12.566` does not
/// trip it.
fn degrees_in_radians(
    source: &mut Source,
    limits: &Spanned<[f64; 2]>,
    unit: AngleUnit,
    path: &str,
) {
    let [min, max] = limits.value;
    let whole = |x: f64| x == x.round();
    let beyond_a_turn = min.abs().max(max.abs()) > std::f64::consts::TAU;
    if unit != AngleUnit::Radian || !beyond_a_turn || !(whole(min) && whole(max)) {
        return;
    }
    let quantity = Quantity::Angle(unit);
    let turns = (max - min) / std::f64::consts::TAU;
    let message = format!(
        "the range {} to {} spans {} turns; whole numbers beyond 2π look like degrees: the \
         file's angle_unit is rad, write `angle_unit = \"deg\"` if they are",
        quantity.show(min),
        quantity.show(max),
        tidy((turns * 10.0).round() / 10.0),
    );
    source.warn(&limits.span, &format!("{path}.limits"), message);
}

fn frame_orientation(source: &mut Source, frame: &FrameEntry) {
    let span_of = |key: &str| -> Option<Range<usize>> {
        frame
            .keys
            .iter()
            .find(|(k, _)| k == key)
            .map(|(_, s)| s.clone())
    };
    if let (Some(_), Some(second)) = (span_of("rpy"), span_of("rotation")) {
        let message = "both `rpy` and `rotation` are given; keep one of them";
        source.report(&second, &format!("{}.rotation", frame.path), message);
    }
    if let Some(rotation) = &frame.rotation {
        if let Some(problem) = rotation_problem(&rotation.value) {
            source.report(&rotation.span, &format!("{}.rotation", frame.path), problem);
        }
    }
}

/// What is wrong with a matrix meant to be a rotation, if anything.
pub(crate) fn rotation_problem(r: &[[f64; 3]; 3]) -> Option<String> {
    let mut worst: f64 = 0.0;
    for i in 0..3 {
        for j in 0..3 {
            let dot: f64 = (0..3).map(|k| r[i][k] * r[j][k]).sum();
            let identity = if i == j { 1.0 } else { 0.0 };
            worst = worst.max((dot - identity).abs());
        }
    }
    let det = determinant(r);
    if worst > ROTATION_TOLERANCE {
        Some(format!(
            "the rows are not orthonormal: the largest entry of R·Rᵀ − I is {:.3e} (tolerance {ROTATION_TOLERANCE:e}); determinant {}",
            worst,
            tidy(det)
        ))
    } else if det < 0.0 {
        Some(format!(
            "the determinant is {} (a reflection, not a rotation); flip the sign of one row or column",
            tidy(det)
        ))
    } else {
        None
    }
}

fn determinant(r: &[[f64; 3]; 3]) -> f64 {
    r[0][0] * (r[1][1] * r[2][2] - r[1][2] * r[2][1])
        - r[0][1] * (r[1][0] * r[2][2] - r[1][2] * r[2][0])
        + r[0][2] * (r[1][0] * r[2][1] - r[1][1] * r[2][0])
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_rotation_about_z_passes() {
        let (s, c) = 0.3f64.sin_cos();
        assert_eq!(
            rotation_problem(&[[c, -s, 0.0], [s, c, 0.0], [0.0, 0.0, 1.0]]),
            None
        );
    }

    #[test]
    fn a_mirror_and_a_stretch_are_reported() {
        let mirror = [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, -1.0]];
        assert!(rotation_problem(&mirror)
            .unwrap()
            .contains("determinant is -1"));
        let stretch = [[1.001, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]];
        assert!(rotation_problem(&stretch)
            .unwrap()
            .contains("not orthonormal"));
    }
}
