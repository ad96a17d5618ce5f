//! `armforge emit --check` against the real rustfmt: a module that a user's `cargo fmt`
//! reformatted (with the default style or a very different one) is still up to date, and a
//! reformatted module whose code changed is still stale.

use std::path::{Path, PathBuf};
use std::process::Command;

fn armforge(args: &[&str]) -> (Option<i32>, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_armforge"))
        .args(args)
        .output()
        .expect("armforge runs");
    (
        out.status.code(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

fn arm(name: &str) -> String {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("../arms")
        .join(name)
        .display()
        .to_string()
}

fn scratch(name: &str) -> PathBuf {
    let dir = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join(name);
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("scratch folder");
    dir
}

/// Runs rustfmt on `file` with `config` (`key=value,…`); `false` when rustfmt is missing.
fn rustfmt(file: &Path, config: &str) -> bool {
    let mut command = Command::new("rustfmt");
    command.args(["--edition", "2021"]);
    if !config.is_empty() {
        command.args(["--config", config]);
    }
    match command.arg(file).output() {
        Ok(out) => {
            assert!(
                out.status.success(),
                "rustfmt failed: {}",
                String::from_utf8_lossy(&out.stderr)
            );
            true
        }
        Err(_) => false,
    }
}

#[test]
fn a_module_formatted_by_rustfmt_is_still_fresh() {
    if Command::new("rustfmt").arg("--version").output().is_err() {
        println!("note: rustfmt is not installed; this check was skipped (CI installs it)");
        return;
    }
    let dir = scratch("emit-rustfmt");
    for name in ["bench-elbow-dh.toml", "tray-gantry-axes.toml"] {
        let arm = arm(name);
        // The default style, and one far from it (tabs, narrow lines, one argument per line).
        for config in ["", "hard_tabs=true,max_width=60,fn_params_layout=Vertical"] {
            let file = dir.join(name.replace(".toml", ".rs"));
            let file_arg = file.display().to_string();
            assert_eq!(armforge(&["emit", &arm, "-o", &file_arg]).0, Some(0));
            let emitted = std::fs::read_to_string(&file).unwrap();
            assert!(rustfmt(&file, config), "rustfmt ran");
            let formatted = std::fs::read_to_string(&file).unwrap();
            if !config.is_empty() {
                assert_ne!(formatted, emitted, "{config} changes the layout");
            }
            let (code, stderr) = armforge(&["emit", &arm, "-o", &file_arg, "--check"]);
            assert_eq!(code, Some(0), "{name} after rustfmt {config:?}: {stderr}");
            // A real change survives formatting and is found.
            std::fs::write(
                &file,
                formatted.replacen("pub fn solve(", "pub fn solve_all(", 1),
            )
            .unwrap();
            assert!(rustfmt(&file, config));
            let (code, stderr) = armforge(&["emit", &arm, "-o", &file_arg, "--check"]);
            assert_eq!(
                code,
                Some(1),
                "{name}: a renamed function is stale: {stderr}"
            );
            std::fs::remove_file(&file).unwrap();
        }
    }
}
