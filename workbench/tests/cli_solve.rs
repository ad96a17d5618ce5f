//! `armforge solve` end to end through the binary: poses made by `armforge forward` come back
//! with their joint values among the solutions (in the file's units), unreachable poses get a
//! reason with the amount in the file's units, malformed lines get `{"error": ...}` and exit 1,
//! and the file's problems exit 2 or 3 like `armforge inspect`.

use std::io::Write;
use std::process::{Command, Stdio};

use serde_json::Value;

const ARM: &str = "../arms/bench-elbow-dh.toml";
/// The same arm in metres and radians (tests/fixtures/units).
const ARM_SI: &str = "../tests/fixtures/units/bench-elbow-m-rad.toml";

/// Runs the binary with `stdin`; returns the exit code and the stdout lines as JSON.
fn run(args: &[&str], stdin: &str) -> (Option<i32>, Vec<Value>, String) {
    let mut child = Command::new(env!("CARGO_BIN_EXE_armforge"))
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("runs");
    // A run that stops before reading (a bad argument) closes its stdin: ignore a broken pipe.
    let _ = child
        .stdin
        .take()
        .expect("stdin")
        .write_all(stdin.as_bytes());
    let out = child.wait_with_output().expect("finishes");
    let lines = String::from_utf8(out.stdout)
        .expect("UTF-8")
        .lines()
        .map(|l| serde_json::from_str(l).unwrap_or_else(|e| panic!("not JSON: {l}: {e}")))
        .collect();
    (
        out.status.code(),
        lines,
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

/// The pose line `armforge forward` writes for joint values (file units).
fn pose_line(arm: &str, joints: &[f64]) -> String {
    let input = serde_json::json!({ "joints": joints }).to_string();
    let (code, lines, stderr) = run(&["forward", arm], &input);
    assert_eq!(code, Some(0), "{stderr}");
    lines[0].to_string()
}

fn joints_of(solution: &Value) -> Vec<f64> {
    solution["joints"]
        .as_array()
        .expect("joints")
        .iter()
        .map(|x| x.as_f64().expect("number"))
        .collect()
}

fn close_to(a: &[f64], b: &[f64], tol: f64) -> bool {
    a.len() == b.len() && a.iter().zip(b).all(|(x, y)| (x - y).abs() < tol)
}

#[test]
fn reachable_poses_come_back_with_their_joint_values_in_file_units() {
    // Degrees (the file's unit); every value inside the limits, away from singularities.
    let q = [10.0, 20.0, -30.0, 40.0, 50.0, 60.0];
    let (code, lines, stderr) = run(&["solve", ARM], &pose_line(ARM, &q));
    assert_eq!(code, Some(0), "{stderr}");
    let answer = &lines[0];
    assert_eq!(answer["status"], "ok");
    let solutions = answer["solutions"].as_array().expect("solutions");
    assert_eq!(answer["count"].as_u64(), Some(solutions.len() as u64));
    let original = solutions
        .iter()
        .find(|s| close_to(&joints_of(s), &q, 1e-9))
        .expect("the original among the solutions");
    // Joint 1 at 10° keeps the wrist center on its zero-configuration side: shoulder facing.
    assert_eq!(original["branch"]["shoulder"], "facing");
    for flag in ["wrist_aligned", "on_axis_1", "at_reach_limit"] {
        assert_eq!(original[flag], false, "{flag}");
    }
    // Every solution's pose, through `armforge forward`, is the target.
    let target: Value = serde_json::from_str(&pose_line(ARM, &q)).expect("JSON");
    for s in solutions {
        let back: Value = serde_json::from_str(&pose_line(ARM, &joints_of(s))).expect("JSON");
        for key in ["rotation", "translation"] {
            let a: Vec<f64> = flatten(&back[key]);
            let b: Vec<f64> = flatten(&target[key]);
            // Translation in mm: 1e-9 of a ~1 m arm is 1e-6 mm.
            assert!(close_to(&a, &b, 1e-6), "{key}: {a:?} vs {b:?}");
        }
    }
}

fn flatten(v: &Value) -> Vec<f64> {
    match v {
        Value::Array(items) => items.iter().flat_map(flatten).collect(),
        other => vec![other.as_f64().expect("number")],
    }
}

#[test]
fn joints_with_more_than_a_turn_list_their_other_values() {
    // Joint 6 of the bench arm turns ±270°: 200° is held as −160° (nearest the range's
    // center), and 200° is listed as its equivalent.
    let q = [10.0, 20.0, -30.0, 40.0, 50.0, 200.0];
    let (code, lines, stderr) = run(&["solve", ARM], &pose_line(ARM, &q));
    assert_eq!(code, Some(0), "{stderr}");
    let solutions = lines[0]["solutions"].as_array().expect("solutions");
    assert!(
        solutions.len() <= 8,
        "one solution per branch: {}",
        lines[0]
    );
    let held = [10.0, 20.0, -30.0, 40.0, 50.0, -160.0];
    let original = solutions
        .iter()
        .find(|s| close_to(&joints_of(s), &held, 1e-9))
        .expect("the original, joint 6 nearest the range's center");
    assert_eq!(original["equivalent_count"], 1, "{original}");
    let listed = &original["equivalents"][0];
    assert_eq!(listed[0], 6);
    assert!(
        (listed[1].as_f64().expect("value") - 200.0).abs() < 1e-9,
        "{listed}"
    );
    // With `--near` the original comes back itself.
    let (code, lines, _) = run(
        &["solve", ARM, "--near", "10,20,-30,40,50,199"],
        &pose_line(ARM, &q),
    );
    assert_eq!(code, Some(0));
    assert!(close_to(&joints_of(&lines[0]["solutions"][0]), &q, 1e-9));
}

#[test]
fn near_and_branch_give_one_solution() {
    let q = [10.0, 20.0, -30.0, 40.0, 50.0, 60.0];
    let line = pose_line(ARM, &q);
    let (code, lines, _) = run(&["solve", ARM, "--near", "11,19,-29,41,49,61"], &line);
    assert_eq!(code, Some(0));
    let near = &lines[0]["solutions"];
    assert_eq!(lines[0]["count"], 1);
    assert!(close_to(&joints_of(&near[0]), &q, 1e-9));
    let branch = &near[0]["branch"];
    let words = format!(
        "{},{},{}",
        branch["shoulder"].as_str().expect("word"),
        branch["elbow"].as_str().expect("word"),
        branch["wrist"].as_str().expect("word")
    );
    let (code, lines, _) = run(&["solve", ARM, "--branch", &words], &line);
    assert_eq!(code, Some(0));
    assert_eq!(lines[0]["count"], 1);
    assert_eq!(&lines[0]["solutions"][0]["branch"], branch);
    assert!(close_to(&joints_of(&lines[0]["solutions"][0]), &q, 1e-9));
    let (code, _, stderr) = run(
        &["solve", ARM, "--branch", "facing,sideways,leading"],
        &line,
    );
    assert_eq!(code, Some(2));
    assert!(stderr.contains("sideways"), "{stderr}");
    // An elbow word on a polar arm: a branch the arm never has, said so.
    let polar = "../arms/hotel-loader-axes.toml";
    let pose = r#"{"rotation": [[1,0,0],[0,1,0],[0,0,1]], "translation": [0.5, 0.2, 1.0]}"#;
    let (code, lines, _) = run(&["solve", polar, "--branch", "facing,up,leading"], pose);
    assert_eq!(code, Some(0));
    assert_eq!(lines[0]["status"], "no_such_branch", "{}", lines[0]);
    assert_eq!(lines[0]["reason"], "this arm has no such branch");
}

#[test]
fn solutions_print_the_joint_values_without_rounding_noise() {
    // The pose of 30° on every joint of the degree arm: the solution comes back as 30, not
    // 29.99999999999999, and no value is -0.
    let (_, forward, _) = run_forward(ARM, r#"{"joints": [30, 30, 30, 30, 30, 30]}"#);
    let pose = forward[0].to_string();
    let (code, lines, _) = run(&["solve", ARM], &pose);
    assert_eq!(code, Some(0));
    let text = lines[0].to_string();
    assert!(!text.contains("-0.0,") && !text.contains("-0.0]"), "{text}");
    let solutions = lines[0]["solutions"].as_array().expect("solutions");
    assert!(solutions
        .iter()
        .any(|s| joints_of(s).iter().all(|&x| x == 30.0)));
    for s in solutions {
        let joints = joints_of(s);
        assert!(
            joints.iter().all(|&x| x == 30.0 || (x - 30.0).abs() > 1e-9),
            "{joints:?}"
        );
    }
}

fn run_forward(arm: &str, stdin: &str) -> (Option<i32>, Vec<Value>, String) {
    run(&["forward", arm], stdin)
}

#[test]
fn unreachable_poses_say_why_with_numbers_in_file_units() {
    // Beyond reach: 5 m in front of a ~1 m arm. The same pose in the metre/radian twin of the
    // arm must report the same distance, 1000 times smaller.
    let far_mm = r#"{"rotation": [[1,0,0],[0,1,0],[0,0,1]], "translation": [5000, 0, 450]}"#;
    let far_m = r#"{"rotation": [[1,0,0],[0,1,0],[0,0,1]], "translation": [5, 0, 0.45]}"#;
    let (code, mm, _) = run(&["solve", ARM], far_mm);
    assert_eq!(code, Some(0), "an unreachable pose is not a malformed line");
    let (_, m, _) = run(&["solve", ARM_SI], far_m);
    assert_eq!(mm[0]["status"], "beyond_reach");
    assert_eq!(mm[0]["unit"], "mm");
    assert_eq!(m[0]["unit"], "m");
    let by_mm = mm[0]["by"].as_f64().expect("by");
    let by_m = m[0]["by"].as_f64().expect("by");
    assert!(
        by_mm > 3000.0 && (by_mm - 1000.0 * by_m).abs() < 1e-6,
        "{by_mm} {by_m}"
    );
    assert!(mm[0]["reason"].as_str().expect("reason").contains("mm"));
    assert_eq!(mm[0]["count"], 0);

    // Outside the limits (worked from the file: joint 1 "waist" limits ±170°, joint 5
    // "wrist-bend" ±120°): poses made with joint 1 at 179° or joint 5 at 125° are missed by
    // 9° and 5°.
    for (q, joint, by) in [
        ([179.0, 20.0, -30.0, 0.0, 50.0, 0.0], 1, 9.0),
        ([0.0, 20.0, -30.0, 0.0, 125.0, 0.0], 5, 5.0),
    ] {
        let (_, lines, _) = run(&["solve", ARM], &pose_line(ARM, &q));
        let a = &lines[0];
        assert_eq!(a["status"], "outside_limits", "{a}");
        assert_eq!(a["joint"], joint, "{a}");
        assert_eq!(a["unit"], "deg");
        assert!((a["by"].as_f64().expect("by") - by).abs() < 1e-9, "{a}");
    }

    // Not a rotation: reported as an invalid pose, not a malformed line.
    let skew = r#"{"rotation": [[1,0,0],[0,1,0],[0,0.1,1]], "translation": [500, 0, 450]}"#;
    let (code, lines, _) = run(&["solve", ARM], skew);
    assert_eq!(code, Some(0));
    assert_eq!(lines[0]["status"], "invalid_pose");
}

#[test]
fn malformed_lines_get_an_error_and_exit_1_while_the_rest_goes_on() {
    let good = pose_line(ARM, &[10.0, 20.0, -30.0, 40.0, 50.0, 60.0]);
    let input = format!(
        "{good}\nnot json\n\n{{\"rotation\": [[1,0,0],[0,1,0]], \"translation\": [0,0,0]}}\n\
         {{\"rotation\": [[1,0,0],[0,1,0],[0,0,1]], \"translation\": [0,0]}}\n\
         {{\"pose\": 1}}\n{good}\n"
    );
    let (code, lines, _) = run(&["solve", ARM], &input);
    assert_eq!(code, Some(1));
    assert_eq!(lines.len(), 6, "one line out per non-blank line in");
    assert_eq!(lines[0]["status"], "ok");
    let errors: Vec<&str> = lines[1..5]
        .iter()
        .map(|l| l["error"].as_str().expect("error"))
        .collect();
    assert!(errors[0].starts_with("not valid JSON"), "{errors:?}");
    assert_eq!(lines[1]["line"], 2);
    assert!(errors[1].contains("3 rows"), "{errors:?}");
    assert!(errors[2].contains("3 numbers"), "{errors:?}");
    assert!(errors[3].contains("unknown key \"pose\""), "{errors:?}");
    assert_eq!(lines[5]["status"], "ok");
}

#[test]
fn file_problems_exit_like_inspect() {
    let (code, lines, stderr) = run(&["solve", "../tests/fixtures/bad/malformed-toml.toml"], "");
    assert_eq!(code, Some(4));
    assert!(lines.is_empty());
    assert!(stderr.contains("malformed-toml.toml:"), "{stderr}");
    let (code, _, stderr) = run(&["solve", "../arms/rejected/offset-wrist.toml"], "");
    assert_eq!(code, Some(3));
    assert!(stderr.contains("offset-wrist.toml:"), "{stderr}");
}
