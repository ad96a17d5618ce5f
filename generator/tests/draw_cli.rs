//! `armforge draw` from the command line: a starting arm from `armforge new` (standard DH,
//! millimetres, degrees) is drawn, and the drawing agrees with `armforge forward`.

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

fn armforge(args: &[&str], dir: &Path) -> Output {
    Command::new(env!("CARGO_BIN_EXE_armforge"))
        .args(args)
        .current_dir(dir)
        .output()
        .expect("armforge runs")
}

/// A fresh directory with the starting arm `lab.toml` in it.
fn workspace(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("armforge-draw-cli-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    let out = armforge(&["new", "lab-arm", "-o", "lab.toml"], &dir);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    dir
}

fn has_class(node: &roxmltree::Node, class: &str) -> bool {
    node.attribute("class")
        .is_some_and(|c| c.split(' ').any(|w| w == class))
}

#[test]
fn the_tool_origin_is_drawn_where_armforge_forward_puts_it() {
    let dir = workspace("forward");
    let out = armforge(
        &[
            "draw",
            "lab.toml",
            "--joints",
            "-30,20,-45,10,60,-90",
            "-o",
            "lab.svg",
        ],
        &dir,
    );
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let svg = std::fs::read_to_string(dir.join("lab.svg")).unwrap();
    let doc = roxmltree::Document::parse(&svg).expect("well-formed SVG");

    let mut forward = Command::new(env!("CARGO_BIN_EXE_armforge"))
        .args(["forward", "lab.toml"])
        .current_dir(&dir)
        .stdin(std::process::Stdio::piped())
        .stdout(std::process::Stdio::piped())
        .spawn()
        .unwrap();
    use std::io::Write;
    forward
        .stdin
        .take()
        .unwrap()
        .write_all(b"{\"joints\": [-30, 20, -45, 10, 60, -90]}\n")
        .unwrap();
    let answer: serde_json::Value =
        serde_json::from_slice(&forward.wait_with_output().unwrap().stdout).unwrap();
    let mm: Vec<f64> = answer["translation"]
        .as_array()
        .unwrap()
        .iter()
        .map(|v| v.as_f64().unwrap())
        .collect();

    let views: Vec<_> = doc.descendants().filter(|n| has_class(n, "view")).collect();
    assert_eq!(views.len(), 3);
    for view in views {
        let f = |name: &str| view.attribute(name).unwrap().parse::<f64>().unwrap();
        let (scale, ox, oy) = (f("data-scale"), f("data-origin-x"), f("data-origin-y"));
        let (u, v) = match view.attribute("data-view").unwrap() {
            "side" => (mm[0], mm[2]),
            "top" => (mm[0], mm[1]),
            _ => (mm[1], mm[2]),
        };
        let dot = view
            .descendants()
            .find(|n| has_class(n, "tool-origin"))
            .unwrap();
        let cx: f64 = dot.attribute("cx").unwrap().parse().unwrap();
        let cy: f64 = dot.attribute("cy").unwrap().parse().unwrap();
        assert!((cx - (ox + scale * u / 1000.0)).abs() < 0.011);
        assert!((cy - (oy - scale * v / 1000.0)).abs() < 0.011);
    }
    // The caption shows the joint values in the file's units.
    assert!(svg.contains("q1–q6: -30°, 20°, -45°, 10°, 60°, -90°"));
}

#[test]
fn default_joint_values_are_zero_and_stdout_works() {
    let dir = workspace("stdout");
    let out = armforge(&["draw", "lab.toml", "-o", "-"], &dir);
    assert!(out.status.success());
    let svg = String::from_utf8(out.stdout).unwrap();
    assert!(svg.contains("q1–q6: 0°, 0°, 0°, 0°, 0°, 0°"));
    roxmltree::Document::parse(&svg).unwrap();
}

#[test]
fn malformed_joint_values_are_reported_with_the_joint() {
    let dir = workspace("malformed");
    let out = armforge(
        &["draw", "lab.toml", "--joints", "1,2,3", "-o", "x.svg"],
        &dir,
    );
    assert_eq!(out.status.code(), Some(1));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains("expected 6 comma-separated joint values"),
        "{err}"
    );
    let out = armforge(
        &["draw", "lab.toml", "--joints", "1,2,x,4,5,6", "-o", "x.svg"],
        &dir,
    );
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains("joint 3 (\"elbow\")") && err.contains("`x`"),
        "{err}"
    );
    assert!(!dir.join("x.svg").exists());
}

#[test]
fn values_outside_the_limits_are_drawn_with_a_warning() {
    let dir = workspace("limits");
    let out = armforge(
        &[
            "draw",
            "lab.toml",
            "--joints",
            "0,0,0,0,170,0",
            "-o",
            "w.svg",
        ],
        &dir,
    );
    assert!(out.status.success());
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains(
            "warning: joint 5 (\"wrist-bend\") value 170 lies outside its limits [-125, 125] (deg)"
        ),
        "{err}"
    );
    assert!(dir.join("w.svg").exists());
}

#[test]
fn a_broken_arm_file_gives_its_diagnostics_and_status_2() {
    let dir = workspace("broken");
    std::fs::write(
        dir.join("bad.toml"),
        "name = \"bad\"\nconvention = \"dh\"\n",
    )
    .unwrap();
    let out = armforge(&["draw", "bad.toml", "-o", "bad.svg"], &dir);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&out.stderr).contains("bad.toml"));
}
