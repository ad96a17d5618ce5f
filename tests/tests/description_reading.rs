//! What the reader accepts and how it fills the model: inline tables, integers for floats,
//! rotations near the tolerance, names and locations.

use armforge_compiler::description::{load_str, ROTATION_TOLERANCE};
use armforge_compiler::diagnostics::Location;
use armforge_tests::pose_difference_of;

const WITH_HEADERS: &str = r#"name = "headers"
description = "two joints"
convention = "axes"

[[joint]]
name = "turn"
type = "revolute"
axis = [0, 0, 1]
point = [0, 0, 0]

[[joint]]
type = "prismatic"
axis = [1, 0, 0]
offset = 0.25

[tool]
translation = [0.5, 0, 0.1]
rpy = [0.1, 0.2, 0.3]
"#;

const INLINE: &str = r#"name = "inline"
convention = "axes"
joint = [
  { name = "turn", type = "revolute", axis = [0.0, 0.0, 1.0], point = [0, 0, 0] },
  { type = "prismatic", axis = [1, 0, 0], offset = 0.25 },
]
tool = { translation = [0.5, 0, 0.1], rpy = [0.1, 0.2, 0.3] }
"#;

#[test]
fn inline_tables_read_like_table_headers() {
    let a = load_str(WITH_HEADERS, "a.toml").unwrap_or_else(|d| panic!("{d}"));
    let b = load_str(INLINE, "b.toml").unwrap_or_else(|d| panic!("{d}"));
    assert_eq!(a.runtime_joints(), b.runtime_joints());
    assert_eq!(a.tool, b.tool);
    assert_eq!(a.joints[0].name, "turn");
    assert_eq!(a.joints[1].name, "joint 2");
    assert_eq!(a.description.as_deref(), Some("two joints"));
    assert_eq!(b.description, None);
}

#[test]
fn joints_remember_where_their_tables_start() {
    let model = load_str(WITH_HEADERS, "a.toml").unwrap();
    assert_eq!(model.joints[0].location, Location { line: 5, column: 1 });
    assert_eq!(
        model.joints[1].location,
        Location {
            line: 11,
            column: 1
        }
    );
    assert_eq!(model.joint_label(0), "joint 1 (\"turn\")");
    assert_eq!(model.source_path, "a.toml");
}

fn with_tool_rotation(rows: &str) -> String {
    format!(
        "name = \"r\"\nconvention = \"axes\"\n[[joint]]\ntype = \"revolute\"\naxis = [0, 0, 1]\npoint = [0, 0, 0]\n[tool]\nrotation = {rows}\n"
    )
}

#[test]
fn a_rotation_within_the_tolerance_is_accepted_and_made_exact() {
    assert_eq!(ROTATION_TOLERANCE, 1e-6);
    let model = load_str(
        &with_tool_rotation("[[1, 4e-7, 0], [0, 1, 0], [0, 0, 1]]"),
        "r.toml",
    )
    .unwrap_or_else(|d| panic!("{d}"));
    let r = model.tool.rotation;
    for i in 0..3 {
        for j in 0..3 {
            let dot: f64 = (0..3).map(|k| r[i][k] * r[j][k]).sum();
            let identity = if i == j { 1.0 } else { 0.0 };
            assert!((dot - identity).abs() < 1e-15);
        }
    }
    assert!(
        (r[0][1] - 2e-7).abs() < 1e-9,
        "split between the two rows: {r:?}"
    );
}

#[test]
fn a_rotation_beyond_the_tolerance_is_rejected_with_its_numbers() {
    let d = load_str(
        &with_tool_rotation("[[1, 3e-6, 0], [0, 1, 0], [0, 0, 1]]"),
        "r.toml",
    )
    .unwrap_err();
    assert_eq!(d.items.len(), 1);
    assert_eq!(d.items[0].key, "tool.rotation");
    assert_eq!(
        d.items[0].location,
        Location {
            line: 8,
            column: 12
        }
    );
    assert!(
        d.items[0].message.contains("3.000e-6 (tolerance 1e-6)"),
        "{}",
        d.items[0].message
    );
}

#[test]
fn integers_and_floats_are_the_same_numbers() {
    let ints = load_str(WITH_HEADERS, "a.toml").unwrap();
    let floats = load_str(
        &WITH_HEADERS
            .replace("[0, 0, 1]", "[0.0, 0.0, 1.0]")
            .replace("[0.5, 0, 0.1]", "[0.5, 0.0, 0.1]"),
        "b.toml",
    )
    .unwrap();
    let (r, t) = pose_difference_of(&ints.forward(&[0.3, 0.2]), &floats.forward(&[0.3, 0.2]));
    assert_eq!((r, t), (0.0, 0.0));
}

#[test]
fn a_huge_axis_is_normalised_without_overflow() {
    let text = "name = \"h\"\nconvention = \"axes\"\n[[joint]]\ntype = \"prismatic\"\naxis = [1e300, 0, 1e300]\n";
    let model = load_str(text, "h.toml").unwrap();
    let h = model.joints[0].joint.axis;
    assert!(
        (h[0] - std::f64::consts::FRAC_1_SQRT_2).abs() < 1e-15,
        "{h:?}"
    );
}
