//! The checked-in emitted modules of the sample-arm fixtures (`generated/`, compiled by
//! `solver_emitted.rs`) are what the emitter writes today. Refresh them with
//! `cargo run --release -p armforge-tests --example refresh_generated`.

use armforge_compiler::emit::emit_fixture;
use armforge_compiler::plan::samples::fixtures;
use armforge_tests::generated_dir;

#[test]
fn generated_fixtures_are_fresh() {
    let dir = generated_dir();
    for fixture in fixtures() {
        let path = dir.join(format!("{}.rs", fixture.name));
        let on_disk = std::fs::read_to_string(&path)
            .unwrap_or_else(|e| panic!("cannot read {}: {e}", path.display()));
        assert!(
            on_disk == emit_fixture(&fixture),
            "{} is stale: run cargo run --release -p armforge-tests --example refresh_generated",
            path.display()
        );
    }
}

/// Nothing in `generated/` that the table does not name (a renamed fixture leaves no orphan).
#[test]
fn every_generated_file_is_in_the_fixture_table() {
    let names: Vec<String> = fixtures()
        .iter()
        .map(|f| format!("{}.rs", f.name))
        .collect();
    let mut found = 0;
    for entry in std::fs::read_dir(generated_dir()).expect("tests/tests/generated exists") {
        let file = entry.expect("a directory entry").file_name();
        let file = file.to_string_lossy();
        assert!(names.contains(&file.to_string()), "{file} is in no fixture");
        found += 1;
    }
    assert_eq!(found, names.len());
}
