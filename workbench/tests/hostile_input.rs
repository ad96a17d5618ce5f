//! Hostile input through the `armforge` binary: implausible or non-finite joint values are
//! refused with a clear message (never a drawing with NaN coordinates), a value on a limit is
//! inside it, and names and descriptions cannot add markup to the SVG drawing or the Markdown
//! review sheet.

use std::path::{Path, PathBuf};

use assert_cmd::Command;

fn workspace() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .parent()
        .unwrap()
        .to_path_buf()
}

fn scratch(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("armforge-hostile-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// Runs `armforge ARGS` with `stdin`: (exit code, stdout, stderr).
fn armforge(args: &[&str], stdin: &str) -> (i32, String, String) {
    let output = Command::cargo_bin("armforge")
        .unwrap()
        .args(args)
        .write_stdin(stdin)
        .output()
        .unwrap();
    (
        output.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&output.stdout).into_owned(),
        String::from_utf8_lossy(&output.stderr).into_owned(),
    )
}

fn arm(name: &str) -> String {
    workspace().join("arms").join(name).display().to_string()
}

#[test]
fn draw_refuses_an_implausible_slide_instead_of_drawing_nan() {
    let dir = scratch("draw-huge");
    let out = dir.join("huge.svg").display().to_string();
    let gantry = arm("tray-gantry-axes.toml");
    let (code, _, err) = armforge(
        &["draw", &gantry, "--joints", "1e300,0,0,0,0,0", "-o", &out],
        "",
    );
    assert_eq!(code, 2, "{err}");
    assert!(
        err.contains("--joints: the value of joint 1 (\"rail-x\"): 1e300 mm is implausible"),
        "{err}"
    );
    assert!(err.len() < 400, "{err}");
    assert!(!Path::new(&out).exists(), "nothing is written");
    // At the bound the drawing is made, with finite coordinates only.
    let (code, svg, err) = armforge(
        &["draw", &gantry, "--joints", "1e7,0,0,0,0,0", "-o", "-"],
        "",
    );
    assert_eq!(code, 0, "{err}");
    assert!(
        !svg.contains("NaN") && !svg.contains("inf"),
        "finite coordinates"
    );
    roxmltree::Document::parse(&svg).expect("valid XML");
}

#[test]
fn draw_refuses_a_thousand_and_one_turns() {
    let elbow = arm("bench-elbow-dh.toml");
    let (code, _, err) = armforge(
        &["draw", &elbow, "--joints", "0,0,360360.5,0,0,0", "-o", "-"],
        "",
    );
    assert_eq!(code, 2, "{err}");
    assert!(err.contains("360360.5° is implausible"), "{err}");
}

#[test]
fn a_value_on_a_limit_draws_without_a_warning() {
    // bench-elbow's joint 5 has limits [-120, 120] in degrees; 120° goes to radians and back.
    let elbow = arm("bench-elbow-dh.toml");
    for q5 in ["120", "-120"] {
        let joints = format!("0,0,0,0,{q5},0");
        let (code, _, err) = armforge(&["draw", &elbow, "--joints", &joints, "-o", "-"], "");
        assert_eq!(code, 0, "{err}");
        assert!(!err.contains("warning"), "{q5}: {err}");
    }
    let (_, _, err) = armforge(
        &["draw", &elbow, "--joints", "0,0,0,0,120.001,0", "-o", "-"],
        "",
    );
    assert!(
        err.contains("value 120.001 lies outside its limits [-120, 120]"),
        "{err}"
    );
}

#[test]
fn solve_refuses_nan_and_implausible_near_values() {
    let elbow = arm("bench-elbow-dh.toml");
    for (near, expected) in [
        (
            "nan,0,0,0,0,0",
            "--near: the value of joint 1 (\"waist\"): NaN is not a finite number",
        ),
        (
            "0,inf,0,0,0,0",
            "--near: the value of joint 2 (\"shoulder\"): inf is not a finite number",
        ),
        (
            "0,0,1e300,0,0,0",
            "--near: the value of joint 3 (\"elbow\"): 1e300° is implausible",
        ),
    ] {
        let (code, out, err) = armforge(&["solve", &elbow, "--near", near], "");
        assert_eq!(code, 2, "{near}: {err}");
        assert!(err.contains(expected), "{near}: {err}");
        assert!(out.is_empty());
    }
}

#[test]
fn forward_answers_an_implausible_joint_value_per_line_and_goes_on() {
    let elbow = arm("bench-elbow-dh.toml");
    let input = "{\"joints\": [0, 0, 0, 0, 0, 1e300]}\n{\"joints\": [0, 0, 0, 0, 0, 0]}\n";
    let (code, out, err) = armforge(&["forward", &elbow], input);
    assert_eq!(code, 1, "{err}");
    let lines: Vec<serde_json::Value> = out
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect();
    assert_eq!(lines.len(), 2, "{out}");
    let error = lines[0]["error"].as_str().unwrap();
    assert!(
        error.contains("joint 6 (\"flange-roll\"): 1e300° is implausible"),
        "{error}"
    );
    assert_eq!(lines[0]["line"], 1);
    assert!(lines[1].get("translation").is_some(), "{out}");
}

/// An arm whose names and description try to add markup: HTML, a Markdown table cell and
/// emphasis, an XML entity, a terminal escape and NUL (which XML 1.0 forbids, §2.2).
fn marked_up_arm(dir: &Path) -> PathBuf {
    let text = std::fs::read_to_string(workspace().join("arms/bench-elbow-dh.toml"))
        .unwrap()
        .replace(
            "description = \"Floor-standing",
            "description = \"# <script>alert(1)</script> \\u0000 \\u001b[31m *red* &amp; | cell | Floor-standing",
        )
        .replace("name = \"waist\"", "name = \"<b>waist</b> | *x* &lt;\"");
    let path = dir.join("marked-up.toml");
    std::fs::write(&path, text).unwrap();
    path
}

#[test]
fn the_drawing_shows_names_and_description_as_text() {
    let dir = scratch("svg");
    let path = marked_up_arm(&dir);
    let (code, svg, err) = armforge(&["draw", path.to_str().unwrap(), "-o", "-"], "");
    assert_eq!(code, 0, "{err}");
    let document = roxmltree::Document::parse(&svg).expect("valid XML");
    assert!(document
        .descendants()
        .all(|n| n.tag_name().name() != "script" && n.tag_name().name() != "b"));
    let texts: String = document
        .descendants()
        .filter(|n| n.is_text())
        .map(|n| n.text().unwrap_or_default())
        .collect();
    assert!(
        texts.contains("<b>waist</b> | *x* &lt;"),
        "the name as written"
    );
    assert!(
        texts.contains("<script>alert(1)</script> \\u{0} \\u{1b}[31m"),
        "{texts}"
    );
    assert!(!svg.contains('\0') && !svg.contains('\u{1b}'));
}

#[test]
fn the_review_sheet_shows_names_and_description_as_text() {
    let dir = scratch("sheet");
    let path = marked_up_arm(&dir);
    let (code, sheet, err) = armforge(&["explain", path.to_str().unwrap()], "");
    assert_eq!(code, 0, "{err}");
    assert!(
        !sheet.contains("<script>") && !sheet.contains("<b>"),
        "no raw HTML"
    );
    assert!(!sheet.contains('\0') && !sheet.contains('\u{1b}'));
    assert!(
        sheet.contains("\\# \\<script\\>alert(1)\\</script\\> \\\\u{0} \\\\u{1b}\\[31m \\*red\\* \\&amp; \\| cell \\| Floor-standing"),
        "{sheet}"
    );
    let row = sheet
        .lines()
        .find(|l| l.starts_with("| 1 |"))
        .expect("joint 1's row");
    assert!(
        row.starts_with("| 1 | \\<b\\>waist\\</b\\> \\| \\*x\\* \\&lt; | revolute |"),
        "{row}"
    );
    // The row has as many cells as the header: the name split none.
    let cells = |l: &str| l.replace("\\|", "").matches('|').count();
    let header = sheet.lines().find(|l| l.starts_with("| joint |")).unwrap();
    assert_eq!(cells(row), cells(header), "{row}");
}

/// `armforge inspect` on byte-level mutations of an example arm: exit 0 (still valid), 3
/// (rejected geometry) or 4 (not a valid description), and a refusal names the file with a
/// line and column. (The proptest harness in `tests/tests/properties.rs` runs many more
/// mutations through the library.)
#[test]
fn mutated_files_get_their_exit_code_and_a_place() {
    let dir = scratch("mutated");
    let original = std::fs::read(workspace().join("arms/bench-elbow-dh.toml")).unwrap();
    let mut state = 0x5eed_u64;
    let mut next = || {
        // SplitMix64 (Steele, Lea & Flood, OOPSLA 2014), a fixed sequence for the test.
        state = state.wrapping_add(0x9e37_79b9_7f4a_7c15);
        let mut z = state;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
        z ^ (z >> 31)
    };
    let mut codes = std::collections::BTreeSet::new();
    for case in 0..24 {
        let mut bytes = original.clone();
        // Past the header comment, where the keys are.
        let at = 900 + (next() as usize) % (bytes.len() - 900);
        bytes[at] = b"[]=\"#.\n\xff0x"[(next() % 10) as usize];
        let path = dir.join(format!("mutated-{case}.toml"));
        std::fs::write(&path, &bytes).unwrap();
        let shown = path.display().to_string();
        let (code, _, err) = armforge(&["inspect", &shown], "");
        codes.insert(code);
        match code {
            0 => {}
            3 | 4 => {
                let place = err.split(&format!("{shown}:")).nth(1).and_then(|rest| {
                    rest.split(':')
                        .take(2)
                        .map(str::parse::<usize>)
                        .collect::<Result<Vec<_>, _>>()
                        .ok()
                });
                assert!(
                    place.is_some_and(|p| p.len() == 2 && p[0] >= 1 && p[1] >= 1),
                    "case {case} (byte {at}): {err}"
                );
            }
            other => panic!("case {case}: exit {other}: {err}"),
        }
    }
    assert!(
        codes.contains(&4),
        "some mutations break the file: {codes:?}"
    );
}

/// Random byte lines into `solve` and `forward` (mutations of good lines, invalid UTF-8, deep
/// nesting, huge numbers): every non-blank line gets exactly one JSON answer with its line
/// number when it is an error, the stream goes on, and the exit code is 0 or 1 (never a panic).
#[test]
fn mutated_json_lines_get_one_answer_each_and_the_stream_goes_on() {
    let elbow = workspace().join("arms/bench-elbow-dh.toml");
    let good_joints = "{\"joints\": [10, 20, -30, 40, 50, 60]}";
    let good_pose =
        "{\"rotation\": [[0, 0, 1], [0, -1, 0], [1, 0, 0]], \"translation\": [710, 0, 925]}";
    let mut state = 0x1dea_u64;
    let mut next = move || {
        // SplitMix64 (Steele, Lea & Flood, OOPSLA 2014).
        state = state.wrapping_add(0x9e37_79b9_7f4a_7c15);
        let mut z = state;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
        z ^ (z >> 31)
    };
    for (command, good) in [("forward", good_joints), ("solve", good_pose)] {
        let mut input: Vec<u8> = Vec::new();
        let mut lines = 0;
        for case in 0..120 {
            let mut line = good.as_bytes().to_vec();
            match case % 6 {
                0 => {}
                1 => {
                    let at = (next() as usize) % line.len();
                    line[at] = b"[]{}\",:-e.9\xff\x00"[(next() % 13) as usize];
                }
                2 => line.truncate((next() as usize) % line.len()),
                3 => line = format!("{}1{}", "[".repeat(5000), "]".repeat(5000)).into_bytes(),
                4 => {
                    line = good
                        .replace("10", "1e999")
                        .replace("710", "1e999")
                        .into_bytes()
                }
                _ => line.splice(0..0, [0xc3u8, 0x28]).for_each(drop),
            }
            line.retain(|&b| b != b'\n');
            if line.iter().all(u8::is_ascii_whitespace) {
                continue;
            }
            input.extend_from_slice(&line);
            input.push(b'\n');
            lines += 1;
        }
        let output = Command::cargo_bin("armforge")
            .unwrap()
            .arg(command)
            .arg(&elbow)
            .write_stdin(input)
            .output()
            .unwrap();
        let code = output.status.code();
        let stderr = String::from_utf8_lossy(&output.stderr);
        assert!(
            matches!(code, Some(0 | 1)),
            "{command}: exit {code:?}: {stderr}"
        );
        let answers: Vec<serde_json::Value> = String::from_utf8(output.stdout)
            .unwrap()
            .lines()
            .map(|l| serde_json::from_str(l).expect("every answer is JSON"))
            .collect();
        assert_eq!(answers.len(), lines, "{command}: one answer per line");
        for (i, answer) in answers.iter().enumerate() {
            if answer.get("error").is_some() {
                assert_eq!(answer["line"], i + 1, "{command}: {answer}");
            }
        }
        assert!(
            answers.iter().any(|a| a.get("error").is_none()),
            "{command}: good lines answered"
        );
    }
}
