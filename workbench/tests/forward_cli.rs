//! `armforge forward` end to end through the binary: JSON lines in, poses out in the file's
//! units; malformed lines answered with an error and exit 1; bad files reported with exit 2.

mod common;

use common::workspace;

use std::path::{Path, PathBuf};

use armforge_compiler::pipeline::load_model;
use assert_cmd::Command;
use serde_json::Value;

fn forward(arm: &Path, stdin: &str) -> (i32, Vec<Value>, String) {
    let output = Command::cargo_bin("armforge")
        .unwrap()
        .arg("forward")
        .arg(arm)
        .write_stdin(stdin)
        .output()
        .unwrap();
    let stdout = String::from_utf8(output.stdout).unwrap();
    let lines = stdout
        .lines()
        .map(|l| serde_json::from_str(l).expect("every output line is JSON"))
        .collect();
    (
        output.status.code().unwrap(),
        lines,
        String::from_utf8(output.stderr).unwrap(),
    )
}

fn numbers(v: &Value) -> Vec<f64> {
    match v {
        Value::Array(items) => items.iter().flat_map(numbers).collect(),
        Value::Number(n) => vec![n.as_f64().unwrap()],
        other => panic!("not a number: {other}"),
    }
}

/// Equal within `tolerance` (JSON printing and reading may move the last digit).
fn assert_close(found: &[f64], expected: &[f64], tolerance: f64) {
    assert_eq!(found.len(), expected.len());
    for (f, e) in found.iter().zip(expected) {
        assert!(
            (f - e).abs() <= tolerance * e.abs().max(1.0),
            "{found:?} vs {expected:?}"
        );
    }
}

#[test]
fn the_bundled_sample_gives_one_pose_per_line_in_the_file_units() {
    let arm = workspace().join("arms/bench-elbow-dh.toml");
    let sample =
        std::fs::read_to_string(workspace().join("arms/bench-elbow-joints.jsonl")).unwrap();
    let (code, lines, stderr) = forward(&arm, &sample);
    assert_eq!(code, 0, "{stderr}");
    let model = load_model(&arm, "arm").unwrap();
    let inputs: Vec<&str> = sample.lines().collect();
    assert_eq!(lines.len(), inputs.len());
    for (input, output) in inputs.iter().zip(&lines) {
        let q = numbers(&serde_json::from_str::<Value>(input).unwrap()["joints"]);
        let pose = model.forward_in_file_units(&q);
        let rotation = numbers(&output["rotation"]);
        let translation = numbers(&output["translation"]);
        assert_close(&rotation, &pose.rotation.concat(), 1e-15);
        assert_close(&translation, &pose.translation, 1e-12);
    }
    // The first sample line is the zero configuration: by hand from the DH table,
    // (a1 + d4 + d6 + tool, 0, d1 + a2 + a3) = (710, 0, 925) mm.
    let zero = numbers(&lines[0]["translation"]);
    assert!(
        (zero[0] - 710.0).abs() < 1e-9 && zero[1].abs() < 1e-9 && (zero[2] - 925.0).abs() < 1e-9
    );
}

#[test]
fn malformed_lines_get_an_error_and_the_rest_goes_on_with_exit_1() {
    let arm = workspace().join("arms/tray-gantry-axes.toml");
    let input = [
        r#"{"joints": [100, 200, 300, 0, 0, 0]}"#,
        r#"{"joints": [1, 2, 3]}"#,
        r#"{"joints": [1, 2, 3, 4, 5, "six"]}"#,
        r#"not json"#,
        "",
        r#"{"joint": [0, 0, 0, 0, 0, 0]}"#,
        r#"[0, 0, 0, 0, 0, 0]"#,
        r#"{"joints": [0, 0, 0, 0, 0, 0]}"#,
    ]
    .join("\n");
    let (code, lines, _) = forward(&arm, &input);
    assert_eq!(code, 1);
    assert_eq!(lines.len(), 7, "one answer per non-blank line");
    let error = |i: usize| lines[i]["error"].as_str().unwrap_or_default().to_string();
    assert!(lines[0].get("translation").is_some());
    // By hand: base (0, 0, 2000) + tool at zero (150, 100, -510) + slides (100, 200, -300) mm.
    assert_close(
        &numbers(&lines[0]["translation"]),
        &[250.0, 300.0, 1190.0],
        1e-9,
    );
    assert!(
        error(1).contains("expected 6 joint values") && lines[1]["line"] == 2,
        "{}",
        error(1)
    );
    assert!(
        error(2).contains("joint 6 (\"tray-turn\") is not a finite number")
            && lines[2]["line"] == 3,
        "{}",
        error(2)
    );
    assert!(
        error(3).contains("not valid JSON") && lines[3]["line"] == 4,
        "{}",
        error(3)
    );
    assert!(
        error(4).contains("unknown key \"joint\"") && lines[4]["line"] == 6,
        "{}",
        error(4)
    );
    assert!(
        error(5).contains("expected an object") && lines[5]["line"] == 7,
        "{}",
        error(5)
    );
    assert!(lines[6].get("translation").is_some());
}

#[test]
fn every_bad_file_gives_exit_2_its_diagnostics_and_no_output() {
    let folder = workspace().join("tests/fixtures/bad");
    let mut files: Vec<PathBuf> = std::fs::read_dir(&folder)
        .unwrap()
        .map(|e| e.unwrap().path())
        .collect();
    files.sort();
    assert!(files.len() >= 20);
    for path in files {
        let (code, lines, stderr) = forward(&path, "{\"joints\": [0]}\n");
        assert_eq!(code, 4, "{}", path.display());
        assert!(lines.is_empty(), "{}: nothing written", path.display());
        let text = std::fs::read_to_string(&path).unwrap();
        for expectation in text.lines().filter_map(|l| l.strip_prefix("# expect: ")) {
            let (place_key, _) = expectation.split_once(" | ").unwrap();
            let (place, key) = place_key.split_once(' ').unwrap();
            let head = if key == "-" {
                format!("error: {}:{place}: ", path.display())
            } else {
                format!("error: {}:{place}: `{key}`: ", path.display())
            };
            assert!(
                stderr.contains(&head),
                "{}: no `{head}` in\n{stderr}",
                path.display()
            );
        }
        assert!(!stderr.contains("panicked"));
    }
}

#[test]
fn a_missing_file_gives_exit_2() {
    let (code, lines, stderr) = forward(Path::new("/nonexistent/arm.toml"), "");
    assert_eq!(code, 5, "an I/O failure");
    assert!(lines.is_empty());
    assert!(stderr.contains("cannot read the file"), "{stderr}");
}
