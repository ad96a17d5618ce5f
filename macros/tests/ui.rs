//! Compile errors of `solver!`, checked against the compiler's own output (`.stderr` files),
//! in folders by kind: a missing file, malformed TOML, a rejected geometry, wrong syntax.
//!
//! trybuild compiles each case in a crate under `<target>/tests/trybuild/armforge-macros/`,
//! which is then the `CARGO_MANIFEST_DIR` the macro resolves paths from; the description
//! files the cases name are copied there first, under `fixtures/`, so the messages hold
//! the same relative paths on every machine.
//!
//! To accept new output: `TRYBUILD=overwrite cargo test -p armforge-macros --test ui`, then
//! review the `.stderr` diff.

use std::path::{Path, PathBuf};

/// The files the cases name, from the workspace (source, name under `fixtures/`).
const FIXTURES: [(&str, &str); 2] = [
    (
        "../tests/fixtures/bad/malformed-toml.toml",
        "malformed-toml.toml",
    ),
    ("../arms/rejected/offset-wrist.toml", "offset-wrist.toml"),
];

fn trybuild_project_dir() -> PathBuf {
    // CARGO_TARGET_TMPDIR is `<target>/tmp`; trybuild builds in `<target>/tests/trybuild/`.
    Path::new(env!("CARGO_TARGET_TMPDIR"))
        .join("..")
        .join("tests")
        .join("trybuild")
        .join(env!("CARGO_PKG_NAME"))
}

#[test]
fn compile_errors() {
    let fixtures = trybuild_project_dir().join("fixtures");
    std::fs::create_dir_all(&fixtures).expect("fixture folder");
    for (source, name) in FIXTURES {
        let from = Path::new(env!("CARGO_MANIFEST_DIR")).join(source);
        std::fs::copy(&from, fixtures.join(name))
            .unwrap_or_else(|e| panic!("copy {}: {e}", from.display()));
    }
    let cases = trybuild::TestCases::new();
    cases.compile_fail("tests/ui/missing-file/*.rs");
    cases.compile_fail("tests/ui/malformed-toml/*.rs");
    cases.compile_fail("tests/ui/rejected-geometry/*.rs");
    cases.compile_fail("tests/ui/syntax/*.rs");
}
