//! `armforge inspect` on every example arm (`arms/*.toml`) and every rejected arm
//! (`arms/rejected/*.toml`): insta snapshots of the text report, so wording changes show in
//! review; every example classifies, every rejected arm is rejected with a located, numeric
//! reason; the binary's exit codes are 0, 3 and 2.

mod common;

use common::{arm_files, workspace};

use std::process::Command;

use armforge_compiler::classify::{classify, Family, Tolerances};
use armforge_compiler::description::load_str;
use armforge_compiler::model::Model;
use armforge_workbench::report;

fn load(path: &str, text: &str) -> Model {
    load_str(text, path).unwrap_or_else(|d| panic!("{path} does not load:\n{d}"))
}

fn snapshot_name(path: &str) -> String {
    path.trim_start_matches("arms/")
        .trim_end_matches(".toml")
        .replace('/', "-")
}

#[test]
fn every_example_arm_classifies() {
    let mut families = std::collections::BTreeSet::new();
    for (path, text) in arm_files("") {
        let model = load(&path, &text);
        let result = classify(&model, &Tolerances::default());
        match &result {
            Ok(g) => families.insert(g.family),
            Err(e) => panic!("{path} should be solvable:\n{e}"),
        };
        let report = report::build(&model, &Tolerances::default(), &result);
        insta::assert_snapshot!(snapshot_name(&path), report.to_text());
    }
    // The examples show every family of the registry.
    // (In the enum's order, which the set keeps: families added later may sit elsewhere in
    // the registry.)
    let mut registry: Vec<Family> = armforge_compiler::family::REGISTRY
        .iter()
        .map(|m| m.family())
        .collect();
    registry.sort();
    assert_eq!(families.into_iter().collect::<Vec<_>>(), registry);
}

#[test]
fn every_rejected_arm_is_rejected_with_a_located_numeric_reason() {
    let files = arm_files("rejected");
    assert!(files.len() >= 3, "the rejected examples are there");
    for (path, text) in files {
        let model = load(&path, &text);
        let result = classify(&model, &Tolerances::default());
        let Err(e) = &result else {
            panic!("{path} should be rejected")
        };
        let shown = e.to_string();
        let located = format!("error: {path}:{}:{}: ", e.location.line, e.location.column);
        assert!(shown.starts_with(&located), "{shown}");
        assert!(e.location.line > 1, "{path}: points at a joint's table");
        let line = text.lines().nth(e.location.line - 1).unwrap_or_default();
        assert_eq!(
            line.trim(),
            "[[joint]]",
            "{path}: points at a joint's table"
        );
        assert!(shown.chars().any(|c| c.is_ascii_digit()), "{shown}");
        assert!(!e.reason.kind().is_empty());
        let report = report::build(&model, &Tolerances::default(), &result).with_source(&text);
        insta::assert_snapshot!(snapshot_name(&path), report.to_text());
    }
}

#[test]
fn json_reports() {
    for path in [
        "arms/bench-elbow-dh.toml",
        "arms/rejected/offset-wrist.toml",
        "arms/rejected/five-joints.toml",
    ] {
        let text = std::fs::read_to_string(workspace().join(path)).expect("readable");
        let model = load(path, &text);
        let result = classify(&model, &Tolerances::default());
        let report = report::build(&model, &Tolerances::default(), &result);
        let json = serde_json::to_string_pretty(&report).expect("serialisable");
        insta::assert_snapshot!(format!("{}-json", snapshot_name(path)), json);
    }
}

fn armforge(args: &[&str]) -> (i32, String, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_armforge"))
        .args(args)
        .current_dir(workspace())
        .output()
        .expect("armforge runs");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

#[test]
fn exit_codes() {
    for (path, _) in arm_files("") {
        let (code, out, _) = armforge(&["inspect", &path]);
        assert_eq!(code, 0, "{path}:\n{out}");
        assert!(out.contains("family: "), "{out}");
    }
    for (path, _) in arm_files("rejected") {
        let (code, out, _) = armforge(&["inspect", &path]);
        assert_eq!(code, 3, "{path}:\n{out}");
        assert!(out.contains("no decoupled closed form: "), "{out}");
        let (code, out, err) = armforge(&["inspect", "--json", &path]);
        assert_eq!(code, 3);
        let v: serde_json::Value = serde_json::from_str(&out).expect("JSON on stdout");
        assert_eq!(v["outcome"]["status"], "rejected");
        assert!(err.starts_with(&format!("error: {path}:")), "{err}");
    }
    // The exit-code table of `armforge --help` (workbench/src/cli/io/exit.rs): 5 for a file
    // that cannot be read, 4 for one that is not a description, 2 for a usage error.
    let (code, _, err) = armforge(&["inspect", "arms/rejected/no-such-arm.toml"]);
    assert_eq!(code, 5, "{err}");
    let bad = std::env::temp_dir().join(format!("armforge-inspect-{}.toml", std::process::id()));
    std::fs::write(&bad, "name = \"x\"\nconvention = \"sideways\"\n").expect("temp file");
    let (code, _, err) = armforge(&["inspect", &bad.to_string_lossy()]);
    let _ = std::fs::remove_file(&bad);
    assert_eq!(code, 4, "{err}");
    assert!(err.contains("error: "), "{err}");
}

#[test]
fn tolerance_options_change_the_verdict() {
    // The offset wrist misses by 20 mm: a tolerance of 5 % of the arm's size accepts it.
    let path = "arms/rejected/offset-wrist.toml";
    let (code, _, _) = armforge(&["inspect", path]);
    assert_eq!(code, 3);
    let (code, out, _) = armforge(&["inspect", "--meet-tolerance", "0.05", path]);
    assert_eq!(code, 0, "{out}");
    let (code, _, err) = armforge(&["inspect", "--parallel-tolerance", "-1", path]);
    assert_eq!(code, 2, "{err}");
    // The parallel tolerance is in the file's angle unit: the hood corner's axes 2 and 3
    // make 10°, so 11 (degrees, as the file says) counts them parallel (an elbow arm), and 9
    // does not (the general family). Read as radians, 9 would have made it an elbow arm.
    let tilted = "arms/hood-corner-axes.toml";
    let (code, out, _) = armforge(&["inspect", "--parallel-tolerance", "11", tilted]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("family: elbow"), "{out}");
    let (code, out, _) = armforge(&["inspect", "--parallel-tolerance", "9", tilted]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("family: general"), "{out}");
}
