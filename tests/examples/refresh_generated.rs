//! Rewrites the checked-in emitted modules of the sample-arm fixtures
//! (`tests/tests/generated/NAME.rs`) after a deliberate change to the emitter; writes only the
//! files whose content changed and names them. `tests/tests/generated_fresh.rs` fails until
//! this has run.
//!
//! `cargo run --release -p armforge-tests --example refresh_generated`

use std::process::ExitCode;

use armforge_compiler::emit::emit_fixture;
use armforge_compiler::plan::samples::fixtures;
use armforge_tests::generated_dir;

fn main() -> ExitCode {
    let dir = generated_dir();
    if let Err(e) = std::fs::create_dir_all(&dir) {
        eprintln!("error: cannot create {}: {e}", dir.display());
        return ExitCode::FAILURE;
    }
    for fixture in fixtures() {
        let path = dir.join(format!("{}.rs", fixture.name));
        let text = emit_fixture(&fixture);
        if std::fs::read_to_string(&path).ok().as_deref() == Some(text.as_str()) {
            continue;
        }
        if let Err(e) = std::fs::write(&path, &text) {
            eprintln!("error: cannot write {}: {e}", path.display());
            return ExitCode::FAILURE;
        }
        println!("refreshed {}", path.display());
    }
    ExitCode::SUCCESS
}
