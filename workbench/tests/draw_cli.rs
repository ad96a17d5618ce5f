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

/// `armforge draw ARM --pose POSE -o OUT` in `dir`.
fn draw_pose(dir: &Path, arm: &Path, pose: &str, out: &str) -> Output {
    armforge(
        &["draw", arm.to_str().unwrap(), "--pose", pose, "-o", out],
        dir,
    )
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
    assert_eq!(out.status.code(), Some(2), "a usage error");
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("--joints: expected 6 joint values"), "{err}");
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
    assert_eq!(out.status.code(), Some(4));
    assert!(String::from_utf8_lossy(&out.stderr).contains("bad.toml"));
}

/// The example arm `arms/bench-elbow-dh.toml` (standard DH, mm, degrees).
fn bench_elbow() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../arms/bench-elbow-dh.toml")
}

/// The world pose of the tool for joint values, from `armforge forward`, as a pose file.
fn pose_file(dir: &Path, arm: &Path, joints: &str) -> PathBuf {
    use std::io::Write;
    let mut forward = Command::new(env!("CARGO_BIN_EXE_armforge"))
        .arg("forward")
        .arg(arm)
        .stdin(std::process::Stdio::piped())
        .stdout(std::process::Stdio::piped())
        .spawn()
        .unwrap();
    forward
        .stdin
        .take()
        .unwrap()
        .write_all(format!("{{\"joints\": [{joints}]}}\n").as_bytes())
        .unwrap();
    let out = forward.wait_with_output().unwrap();
    let path = dir.join("pose.json");
    std::fs::write(&path, &out.stdout).unwrap();
    path
}

#[test]
fn every_solution_of_a_pose_gets_a_panel_with_its_tool_on_the_target() {
    let dir = workspace("pose");
    let arm = bench_elbow();
    let pose = pose_file(&dir, &arm, "30, -20, 15, 0, 45, 90");
    let out = armforge(
        &[
            "draw",
            arm.to_str().unwrap(),
            "--pose",
            pose.to_str().unwrap(),
            "-o",
            "solutions.svg",
        ],
        &dir,
    );
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let svg = std::fs::read_to_string(dir.join("solutions.svg")).unwrap();
    let doc = roxmltree::Document::parse(&svg).unwrap();
    let target: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&pose).unwrap()).unwrap();
    let mm: Vec<f64> = target["translation"]
        .as_array()
        .unwrap()
        .iter()
        .map(|v| v.as_f64().unwrap())
        .collect();
    // Each caption: the bold heading (possibly wrapped), then the joint value lines.
    let captions: Vec<(String, Vec<String>)> = doc
        .descendants()
        .filter(|n| has_class(n, "caption"))
        .map(|c| {
            let texts: Vec<_> = c
                .children()
                .filter(|t| t.tag_name().name() == "text")
                .collect();
            let line = |t: &roxmltree::Node| t.text().unwrap().trim().to_string();
            let bold = |t: &&roxmltree::Node| t.attribute("font-weight") == Some("bold");
            let heading: Vec<String> = texts.iter().filter(bold).map(line).collect();
            let values: Vec<String> = texts.iter().filter(|t| !bold(t)).map(line).collect();
            (heading.join(" "), values)
        })
        .collect();
    // An elbow arm with a spherical wrist has at most 8 configurations for a pose (Pieper
    // 1968; common practice); this pose is reachable, so at least the one it came from.
    // Solutions that differ by whole turns of a joint share a panel.
    assert!(!captions.is_empty() && captions.len() <= 8, "{captions:?}");
    let labels: Vec<&str> = captions
        .iter()
        .map(|(heading, _)| heading.split_once(": ").unwrap().1)
        .collect();
    let mut distinct = labels.clone();
    distinct.sort();
    distinct.dedup();
    assert_eq!(
        distinct.len(),
        labels.len(),
        "one panel per branch: {labels:?}"
    );
    // The configuration the pose came from is among them; joint 6 turns ±360°, so its
    // panel names the equivalent value too.
    let expected = [
        "q1–q3: 30°, -20°, 15°",
        "q4–q6: 0°, 45°, 90°",
        "also q6 = -270°",
    ];
    assert!(
        captions.iter().any(|(_, values)| values == &expected),
        "{captions:?}"
    );
    // In every view of every panel, the tool origin is drawn on the target.
    let views: Vec<_> = doc.descendants().filter(|n| has_class(n, "view")).collect();
    assert_eq!(views.len(), 2 * captions.len());
    for view in views {
        let f = |name: &str| view.attribute(name).unwrap().parse::<f64>().unwrap();
        let (scale, ox, oy) = (f("data-scale"), f("data-origin-x"), f("data-origin-y"));
        let (u, v) = match view.attribute("data-view").unwrap() {
            "side" => (mm[0], mm[2]),
            _ => (mm[0], mm[1]),
        };
        let dot = view
            .descendants()
            .find(|n| has_class(n, "tool-origin"))
            .unwrap();
        let cx: f64 = dot.attribute("cx").unwrap().parse().unwrap();
        let cy: f64 = dot.attribute("cy").unwrap().parse().unwrap();
        assert!(
            (cx - (ox + scale * u / 1000.0)).abs() < 0.02,
            "{cx} vs target"
        );
        assert!(
            (cy - (oy - scale * v / 1000.0)).abs() < 0.02,
            "{cy} vs target"
        );
    }
}

#[test]
fn a_pose_out_of_reach_or_malformed_is_reported() {
    let dir = workspace("bad-pose");
    let arm = bench_elbow();
    let far = dir.join("far.json");
    std::fs::write(
        &far,
        r#"{"rotation": [[1, 0, 0], [0, 1, 0], [0, 0, 1]], "translation": [5000, 0, 500]}"#,
    )
    .unwrap();
    let out = draw_pose(&dir, &arm, "far.json", "f.svg");
    assert_eq!(out.status.code(), Some(1));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("far.json: no solution for this pose"), "{err}");
    assert!(
        err.contains("beyond the arm's reach by ") && err.contains(" mm"),
        "in the file's unit: {err}"
    );
    assert!(!dir.join("f.svg").exists());

    std::fs::write(
        dir.join("half.json"),
        r#"{"rotation": [[1, 0, 0], [0, 1, 0]]}"#,
    )
    .unwrap();
    let out = draw_pose(&dir, &arm, "half.json", "h.svg");
    assert_eq!(out.status.code(), Some(1));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("\"rotation\" needs 3 rows, found 2"), "{err}");

    let out = armforge(
        &[
            "draw",
            arm.to_str().unwrap(),
            "--pose",
            "far.json",
            "--joints",
            "0,0,0,0,0,0",
            "-o",
            "x.svg",
        ],
        &dir,
    );
    assert_eq!(
        out.status.code(),
        Some(2),
        "--pose and --joints exclude each other"
    );
}
