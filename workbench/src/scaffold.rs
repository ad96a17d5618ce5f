//! Starting descriptions for a new arm (`armforge new`): a valid, commented six-joint elbow arm
//! with a spherical wrist, in any of the three conventions.
//!
//! The three texts describe the same invented arm, so a user can compare conventions side by
//! side; the tests check that they give the same forward kinematics.

use std::fmt::Write as _;

pub use armforge_compiler::description::{arm_name_problem, Convention};

/// The convention a command-line word names (the file's words: `dh`, `modified-dh`, `axes`),
/// or what the valid words are.
pub fn parse_convention(word: &str) -> Result<Convention, String> {
    Convention::from_word(word).ok_or_else(|| {
        let words: Vec<&str> = Convention::ALL.iter().map(|c| c.word()).collect();
        format!("expected one of {}", words.join(", "))
    })
}

/// Joint names, limits (degrees) and purpose of the starting arm, base to tool.
const JOINTS: [(&str, [f64; 2], &str); 6] = [
    (
        "waist",
        [-170.0, 170.0],
        "turns the whole arm about the vertical axis",
    ),
    ("shoulder", [-110.0, 130.0], "lifts the upper arm"),
    ("elbow", [-150.0, 150.0], "bends the forearm"),
    (
        "forearm-roll",
        [-180.0, 180.0],
        "first wrist axis, along the forearm",
    ),
    ("wrist-bend", [-125.0, 125.0], "second wrist axis"),
    (
        "flange-roll",
        [-360.0, 360.0],
        "third wrist axis; two turns of travel",
    ),
];

/// Per-convention geometry rows for the six joints (keys and values in mm and degrees).
fn geometry_rows(convention: Convention) -> [&'static str; 6] {
    match convention {
        Convention::Dh => [
            "a = 50.0\nalpha = 90.0\nd = 400.0\ntheta = 0.0",
            "a = 350.0\nalpha = 0.0\nd = 0.0\ntheta = 90.0",
            "a = 40.0\nalpha = 90.0\nd = 0.0\ntheta = 0.0",
            "a = 0.0\nalpha = -90.0\nd = 380.0\ntheta = 0.0",
            "a = 0.0\nalpha = 90.0\nd = 0.0\ntheta = 0.0",
            "a = 0.0\nalpha = 0.0\nd = 90.0\ntheta = 0.0",
        ],
        Convention::ModifiedDh => [
            "alpha = 0.0\na = 0.0\ntheta = 0.0\nd = 400.0",
            "alpha = 90.0\na = 50.0\ntheta = 90.0\nd = 0.0",
            "alpha = 0.0\na = 350.0\ntheta = 0.0\nd = 0.0",
            "alpha = 90.0\na = 40.0\ntheta = 0.0\nd = 380.0",
            "alpha = -90.0\na = 0.0\ntheta = 0.0\nd = 0.0",
            "alpha = 90.0\na = 0.0\ntheta = 0.0\nd = 0.0",
        ],
        Convention::Axes => [
            "axis = [0.0, 0.0, 1.0]\npoint = [0.0, 0.0, 0.0]",
            "axis = [0.0, -1.0, 0.0]\npoint = [50.0, 0.0, 400.0]",
            "axis = [0.0, -1.0, 0.0]\npoint = [50.0, 0.0, 750.0]",
            "axis = [1.0, 0.0, 0.0]\npoint = [50.0, 0.0, 790.0]",
            "axis = [0.0, -1.0, 0.0]\npoint = [430.0, 0.0, 790.0]",
            "axis = [1.0, 0.0, 0.0]\npoint = [430.0, 0.0, 790.0]",
        ],
    }
}

/// What the convention's joint keys mean, as comment lines.
fn convention_help(convention: Convention) -> &'static str {
    match convention {
        Convention::Dh => {
            "# Standard Denavit–Hartenberg parameters (Spong, Hutchinson & Vidyasagar 2006): the link
# transform of joint i is Rz(theta + direction × q) · Tz(d) · Tx(a) · Rx(alpha).
#   a      link length along the new x axis (mm)
#   alpha  twist about the new x axis (degrees)
#   d      offset along the joint axis (mm); a prismatic joint adds direction × q to it
#   theta  angle about the joint axis at joint value zero (degrees)"
        }
        Convention::ModifiedDh => {
            "# Modified Denavit–Hartenberg parameters (Craig, Introduction to Robotics, 3rd ed., 2005):
# the transform into joint i's frame is Rx(alpha) · Tx(a) · Rz(theta + direction × q) · Tz(d),
# where alpha and a describe the step from the previous joint axis to this one.
#   alpha  twist from the previous axis about the previous x axis (degrees)
#   a      distance from the previous axis along the previous x axis (mm)
#   theta  angle about this joint's axis at joint value zero (degrees)
#   d      offset along this joint's axis (mm); a prismatic joint adds direction × q to it"
        }
        Convention::Axes => {
            "# Joint axes in the base frame with every joint at zero (the product-of-exponentials
# form, Murray, Li & Sastry 1994, ch. 3).
#   axis    direction of the joint axis (any length; normalised on reading)
#   point   any point on the axis (mm); required for revolute joints
#   offset  added to direction × q (degrees or mm), default 0"
        }
    }
}

/// The tool table for the convention: the flange frame relative to the last joint's frame
/// (`dh`, `modified-dh`) or in the base frame at zero (`axes`).
fn tool_table(convention: Convention) -> &'static str {
    match convention {
        Convention::Dh => {
            "# The tool frame relative to joint 6's frame. Here it is the flange itself; put the
# gripper's tool point here (translation in mm; rpy = [roll, pitch, yaw] in degrees with
# R = Rz(yaw)·Ry(pitch)·Rx(roll), or rotation = a 3×3 row-major matrix instead of rpy).
[tool]
translation = [0.0, 0.0, 0.0]
rpy = [0.0, 0.0, 0.0]"
        }
        Convention::ModifiedDh => {
            "# The tool frame relative to joint 6's frame: the flange sits 90 mm along joint 6's
# axis (translation in mm; rpy = [roll, pitch, yaw] in degrees with
# R = Rz(yaw)·Ry(pitch)·Rx(roll), or rotation = a 3×3 row-major matrix instead of rpy).
[tool]
translation = [0.0, 0.0, 90.0]
rpy = [0.0, 0.0, 0.0]"
        }
        Convention::Axes => {
            "# The tool frame in the base frame with every joint at zero: the flange, 90 mm beyond
# the wrist center, its z axis along the forearm (rotation rows, row-major; or
# rpy = [roll, pitch, yaw] in degrees with R = Rz(yaw)·Ry(pitch)·Rx(roll)).
[tool]
translation = [520.0, 0.0, 790.0]
rotation = [[0.0, 0.0, 1.0], [0.0, -1.0, 0.0], [1.0, 0.0, 0.0]]"
        }
    }
}

/// A commented, valid starting description named `name` in `convention`.
///
/// The arm is invented: a floor-standing six-joint elbow arm with a 50 mm shoulder offset, a
/// 350 mm upper arm, a 40 mm elbow step, a 380 mm forearm and a spherical wrist.
pub fn starting_description(name: &str, convention: Convention) -> String {
    let mut out = String::new();
    let _ = write!(
        out,
        "# {name}: a starting arm description written by `armforge new`.
#
# Replace the numbers with your arm's own, then run `armforge inspect` on this file. Every key
# is explained where it first appears; the full reference is in armforge's README.
#
# The arm below is invented: a floor-standing six-joint elbow arm (50 mm shoulder offset,
# 350 mm upper arm, 40 mm elbow step, 380 mm forearm) with a spherical wrist whose three
# axes meet 90 mm behind the flange.
#
# Safety: a generated solver is not a safety function. Validate it on the real machine at
# reduced speed in a safeguarded cell, and defer to local regulations, the applicable robot
# safety standards (e.g. ISO 10218) and licensed practice.

# The arm's name; it becomes a Rust module name (letters, digits, '-' and '_').
name = \"{name}\"
# Free text for people.
description = \"Six-joint elbow arm with a spherical wrist (starting template)\"
# Unit of every length in this file: \"m\" or \"mm\".
length_unit = \"mm\"
# Unit of every angle in this file: \"rad\" or \"deg\".
angle_unit = \"deg\"
# How joints are described: \"dh\", \"modified-dh\" or \"axes\".
convention = \"{convention}\"

# Where the arm's base frame sits in the world (the cell). Poses given to and returned by the
# solver are world poses of the tool frame. Here the base is bolted to the floor at the origin.
[base]
translation = [0.0, 0.0, 0.0]
rpy = [0.0, 0.0, 0.0]

{help}
#
# Every joint, base to tool, has:
#   type       \"revolute\" or \"prismatic\"
#   name       optional, used in messages and reports
#   direction  1 or -1: the sign between the controller's joint value and the geometry
#   limits     [min, max] joint values (degrees or mm); without it a revolute joint has one
#              turn (-180°, 180°] and a prismatic joint is unlimited. A revolute range wider
#              than one turn allows several equivalent angles.
",
        convention = convention.word(),
        help = convention_help(convention),
    );
    for ((joint_name, limits, purpose), geometry) in JOINTS.iter().zip(geometry_rows(convention)) {
        let _ = write!(
            out,
            "
# {purpose}
[[joint]]
type = \"revolute\"
name = \"{joint_name}\"
direction = 1
limits = [{:.1}, {:.1}]
{geometry}
",
            limits[0], limits[1],
        );
    }
    let _ = write!(out, "\n{}\n", tool_table(convention));
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn arm_names_follow_the_rust_module_rule() {
        assert_eq!(arm_name_problem("tray-arm_2"), None);
        assert!(arm_name_problem("2arm").is_some());
        assert!(arm_name_problem("tray arm").is_some());
        assert!(arm_name_problem("").is_some());
        // A module cannot be named with a keyword (The Rust Reference, "Keywords").
        assert!(arm_name_problem("fn").is_some());
    }

    #[test]
    fn starting_description_names_its_convention() {
        let text = starting_description("bench-arm", Convention::ModifiedDh);
        assert!(text.contains("convention = \"modified-dh\""));
        assert!(text.contains("name = \"bench-arm\""));
        assert_eq!(text.matches("[[joint]]").count(), 6);
    }
}
