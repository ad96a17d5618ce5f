//! Fixtures shared by the workbench's tests: where the workspace is, the example arms, and a
//! description loaded and classified. Each test binary uses a subset, so unused ones are allowed.
#![allow(dead_code)]

use std::path::{Path, PathBuf};

use armforge_compiler::classify::{classify, Geometry, Tolerances};
use armforge_compiler::description::load_str;
use armforge_compiler::model::Model;

/// The workspace root (the parent of the workbench crate).
pub fn workspace() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .parent()
        .expect("the workbench crate sits in the workspace")
        .to_path_buf()
}

/// The `.toml` files of `arms/<dir>` (`""` for `arms/` itself), sorted, as (path relative to
/// the workspace, text).
pub fn arm_files(dir: &str) -> Vec<(String, String)> {
    let folder = workspace().join("arms").join(dir);
    let mut files: Vec<PathBuf> = std::fs::read_dir(&folder)
        .map(|entries| {
            entries
                .filter_map(|e| e.ok().map(|e| e.path()))
                .filter(|p| p.extension().is_some_and(|x| x == "toml"))
                .collect()
        })
        .unwrap_or_default();
    files.sort();
    files
        .into_iter()
        .map(|p| {
            let rel = p
                .strip_prefix(workspace())
                .expect("inside the workspace")
                .to_string_lossy()
                .replace('\\', "/");
            let text = std::fs::read_to_string(&p).expect("readable arm file");
            (rel, text)
        })
        .collect()
}

/// The example arms `arms/*.toml`.
pub fn examples() -> Vec<(String, String)> {
    arm_files("")
}

/// The description `text` (named `path` in messages) loaded and classified; panics with the
/// reason otherwise.
pub fn classified(path: &str, text: &str) -> (Model, Geometry) {
    let model = load_str(text, path).unwrap_or_else(|d| panic!("{path} does not load:\n{d}"));
    let geometry = classify(&model, &Tolerances::default())
        .unwrap_or_else(|r| panic!("{path} does not classify: {r}"));
    (model, geometry)
}
