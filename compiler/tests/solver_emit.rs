//! The emitter: deterministic output for every sample arm with a checked-in fixture (the
//! fixtures' freshness is checked by the tests crate that owns them,
//! `tests/tests/generated_fresh.rs`).

use armforge_compiler::emit::emit_fixture;
use armforge_compiler::plan::samples::fixtures;

#[test]
fn emission_is_deterministic() {
    for fixture in fixtures() {
        let a = emit_fixture(&fixture);
        let b = emit_fixture(&fixture);
        assert!(
            a.contains("pub fn solve("),
            "{}: no solve in\n{a}",
            fixture.name
        );
        assert_eq!(a, b, "{}: two emissions differ", fixture.name);
    }
}
