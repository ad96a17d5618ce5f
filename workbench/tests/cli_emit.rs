//! `armforge emit` and the `solver!` macro produce the same module for every example arm
//! (`arms/*.toml`).
//!
//! The binary's output (run from `generator/` with the path the macro call writes) is byte for
//! byte the library's `pipeline::generate_module` text, twice in a row (determinism); and the
//! macro's expansion (`armforge_compiler::expand`, the function the proc macro calls) holds
//! exactly the items of that text, plus the `include_bytes!` that makes Cargo rebuild on a
//! change. Also: `-o` writes only when the content changed, `--check` and the exit codes.

use std::path::{Path, PathBuf};

use armforge_compiler::classify::Tolerances;
use armforge_compiler::expand::solver_macro;
use armforge_compiler::pipeline::generate_module;
use quote::{quote, ToTokens};
use std::process::Command;

/// The generator's folder: the CLI runs here and the macro resolves paths from here.
fn tests_dir() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// Every example arm as `../arms/NAME.toml` (relative to the generator's folder), sorted.
fn example_arms() -> Vec<String> {
    let mut names: Vec<String> = std::fs::read_dir(tests_dir().join("../arms"))
        .expect("arms/")
        .map(|e| e.expect("entry").file_name().to_string_lossy().into_owned())
        .filter(|n| n.ends_with(".toml"))
        .map(|n| format!("../arms/{n}"))
        .collect();
    names.sort();
    assert!(names.len() >= 5, "the example arms are there");
    names
}

fn armforge() -> Command {
    let mut cmd = Command::new(env!("CARGO_BIN_EXE_armforge"));
    cmd.current_dir(tests_dir());
    cmd
}

fn cli_output(path: &str) -> String {
    let out = armforge().args(["emit", path]).output().expect("runs");
    assert!(
        out.status.success(),
        "{path}: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8(out.stdout).expect("UTF-8")
}

#[test]
fn the_cli_writes_the_library_module_byte_for_byte_and_deterministically() {
    for path in example_arms() {
        let first = cli_output(&path);
        let second = cli_output(&path);
        assert_eq!(first, second, "{path}: two runs differ");
        let library = generate_module(&tests_dir().join(&path), &path, &Tolerances::default())
            .unwrap_or_else(|e| panic!("{e}"))
            .source;
        assert_eq!(first, library, "{path}");
        assert!(first.contains(&path), "{path}: the header names the file");
    }
}

#[test]
fn the_macro_expands_exactly_the_items_the_cli_writes() {
    for path in example_arms() {
        let cli = syn::parse_file(&cli_output(&path)).expect("the CLI writes valid Rust");
        let expanded = solver_macro(quote!(pub mod m = #path;), Some(&tests_dir()));
        let module: syn::ItemMod = syn::parse2(expanded).expect("the macro expands to a module");
        let (_, items) = module.content.expect("an inline module");
        let (last, items) = items.split_last().expect("items");
        let written: Vec<String> = cli.items.iter().map(tokens).collect();
        let expanded: Vec<String> = items.iter().map(tokens).collect();
        assert_eq!(written, expanded, "{path}");
        let include = tokens(last);
        let absolute = tests_dir().join(&path);
        assert!(
            include.contains("include_bytes") && include.contains(&*absolute.to_string_lossy()),
            "{path}: {include}"
        );
    }
}

fn tokens(item: &syn::Item) -> String {
    item.to_token_stream().to_string()
}

/// A scratch folder under the target directory, new for each test.
fn scratch(name: &str) -> PathBuf {
    let dir = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join(name);
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("scratch folder");
    dir
}

fn modified(path: &Path) -> std::time::SystemTime {
    std::fs::metadata(path)
        .and_then(|m| m.modified())
        .expect("mtime")
}

#[test]
fn output_file_is_written_only_when_changed_and_check_finds_stale_files() {
    let dir = scratch("emit-output");
    let file = dir.join("bench_elbow.rs");
    let file_arg = file.to_string_lossy().to_string();
    let arm = "../arms/bench-elbow-dh.toml";
    // --check on a missing file: stale.
    assert_eq!(run(&["emit", arm, "-o", &file_arg, "--check"]).0, Some(1));
    assert_eq!(run(&["emit", arm, "-o", &file_arg]).0, Some(0));
    let written = std::fs::read_to_string(&file).expect("written");
    assert_eq!(written, cli_output(arm));
    let before = modified(&file);
    std::thread::sleep(std::time::Duration::from_millis(20));
    let (code, stderr) = run(&["emit", arm, "-o", &file_arg]);
    assert_eq!(code, Some(0));
    assert!(stderr.contains("up to date"), "{stderr}");
    assert_eq!(
        modified(&file),
        before,
        "an unchanged module is not rewritten"
    );
    assert_eq!(run(&["emit", arm, "-o", &file_arg, "--check"]).0, Some(0));
    std::fs::write(&file, written.replace("pub fn solve(", "pub fn solve_old(")).expect("edit");
    let (code, stderr) = run(&["emit", arm, "-o", &file_arg, "--check"]);
    assert_eq!(code, Some(1));
    assert!(stderr.contains("stale"), "{stderr}");
    // --check wrote nothing.
    assert!(std::fs::read_to_string(&file)
        .expect("still there")
        .contains("solve_old"));
}

/// Exit code and stderr of one run.
fn run(args: &[&str]) -> (Option<i32>, String) {
    let out = armforge().args(args).output().expect("runs");
    (
        out.status.code(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

#[test]
fn emit_exit_codes_match_inspect() {
    let root = "..";
    for (file, code, needle) in [
        (
            "tests/fixtures/bad/malformed-toml.toml",
            4,
            "malformed-toml.toml:",
        ),
        (
            "tests/fixtures/bad/does-not-exist.toml",
            5,
            "cannot read the file",
        ),
        ("arms/rejected/offset-wrist.toml", 3, "offset-wrist.toml:"),
    ] {
        let path = format!("{root}/{file}");
        let out = armforge().args(["emit", &path]).output().expect("runs");
        assert_eq!(out.status.code(), Some(code), "{file}");
        assert!(out.stdout.is_empty(), "{file}: nothing on stdout");
        let stderr = String::from_utf8_lossy(&out.stderr);
        assert!(stderr.contains(needle), "{file}: {stderr}");
        let inspect = armforge().args(["inspect", &path]).output().expect("runs");
        assert_eq!(inspect.status.code(), Some(code), "inspect {file}");
        if code == 3 {
            // A rejection shows the offending line and a caret under it, as inspect does.
            assert!(stderr.contains("| [[joint]]"), "{file}: {stderr}");
            assert!(stderr.contains("| ^"), "{file}: {stderr}");
        }
    }
}

#[test]
fn the_macro_reports_problems_at_the_path_with_the_cli_message() {
    for (file, needle) in [
        (
            "../tests/fixtures/bad/malformed-toml.toml",
            "malformed-toml.toml:",
        ),
        (
            "../tests/fixtures/bad/does-not-exist.toml",
            "cannot read the file",
        ),
        ("../arms/rejected/offset-wrist.toml", "offset-wrist.toml:"),
    ] {
        let expanded = solver_macro(quote!(mod m = #file;), Some(&tests_dir())).to_string();
        assert!(expanded.contains("compile_error"), "{file}: {expanded}");
        let cli = armforge().args(["emit", file]).output().expect("runs");
        let message = String::from_utf8_lossy(&cli.stderr);
        let first_line = message
            .lines()
            .next()
            .and_then(|l| l.strip_prefix("error: "))
            .expect("an error line");
        // The compile error carries the CLI's first line (as a string literal, escaped).
        let escaped = format!("{:?}", first_line);
        let escaped = escaped.trim_matches('"');
        assert!(
            expanded.contains(escaped),
            "{file}: {expanded} lacks {escaped}"
        );
        assert!(expanded.contains(needle), "{file}");
    }
    let wrong = solver_macro(
        quote!(mod m "../arms/bench-elbow-dh.toml"),
        Some(&tests_dir()),
    );
    assert!(wrong.to_string().contains("compile_error"));
    let unset = solver_macro(quote!(mod m = "../arms/bench-elbow-dh.toml";), None);
    assert!(unset.to_string().contains("CARGO_MANIFEST_DIR"));
}

/// `--sheet` writes the same review sheet as `armforge explain`, and `--check` checks it too.
#[test]
fn sheet_beside_the_module_is_the_explain_sheet() {
    let dir = std::env::temp_dir().join(format!("armforge-sheet-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp dir");
    let module = dir.join("bench_elbow.rs");
    let sheet = dir.join("bench_elbow.md");
    let arm = "../arms/bench-elbow-dh.toml";
    let emit = |check: bool| {
        let mut cmd = armforge();
        cmd.args(["emit", arm, "-o"])
            .arg(&module)
            .arg("--sheet")
            .arg(&sheet);
        if check {
            cmd.arg("--check");
        }
        cmd.status().expect("runs").success()
    };
    assert!(emit(false));
    let explained = armforge().args(["explain", arm]).output().expect("runs");
    assert_eq!(
        std::fs::read(&sheet).expect("sheet written"),
        explained.stdout
    );
    assert!(emit(true), "a fresh sheet passes --check");
    std::fs::write(&sheet, "edited by hand\n").expect("write");
    assert!(!emit(true), "an edited sheet fails --check");
    std::fs::remove_dir_all(&dir).ok();
}

#[test]
fn limits_in_a_radian_file_that_look_like_degrees_get_a_warning() {
    // The bench arm in metres and radians with joint 1's limits written as ±45: whole numbers
    // beyond a turn, likely degrees. The file still loads; inspect, emit and verify warn.
    let dir = scratch("degree-slip");
    let text =
        std::fs::read_to_string(tests_dir().join("../tests/fixtures/units/bench-elbow-m-rad.toml"))
            .expect("fixture");
    let slipped = text.replacen(
        "limits = [-2.9670597283903604, 2.9670597283903604]",
        "limits = [-45, 45]",
        1,
    );
    assert_ne!(
        slipped, text,
        "the fixture's joint 1 limits are where the test expects"
    );
    let file = dir.join("slip.toml");
    std::fs::write(&file, &slipped).expect("write");
    let path = file.to_string_lossy().into_owned();
    for args in [
        vec!["inspect", path.as_str()],
        vec!["emit", path.as_str(), "-o", "-"],
        vec!["verify", path.as_str(), "--samples", "10"],
    ] {
        let (code, stderr) = run(&args);
        assert_eq!(code, Some(0), "{args:?}: {stderr}");
        assert!(
            stderr.contains("warning:")
                && stderr.contains("slip.toml:11:")
                && stderr.contains("angle_unit = \"deg\"")
                && stderr.contains("14.3 turns"),
            "{args:?}: {stderr}"
        );
    }
    // The arm as written (radians below a turn) gets none.
    let (code, stderr) = run(&["inspect", "../tests/fixtures/units/bench-elbow-m-rad.toml"]);
    assert_eq!(code, Some(0));
    assert!(!stderr.contains("warning"), "{stderr}");
}
