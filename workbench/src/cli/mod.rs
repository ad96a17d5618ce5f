//! The `armforge` command line: one module per subcommand, each a thin shell over the library.

pub mod draw;
pub mod emit;
pub mod exit;
pub mod explain;
pub mod forward;
pub mod inspect;
pub mod lines;
pub mod new;
pub mod solve;
pub mod verify;

use std::path::Path;
use std::process::ExitCode;

use armforge_compiler::classify::{Geometry, Tolerances};
use armforge_compiler::model::Model;
use armforge_compiler::pipeline::{display_path, load_and_classify};

/// Loads and classifies the arm at `arm` with the default tolerances; on failure prints the
/// located problem and returns the exit code (2 bad file, 3 no decoupled closed form).
pub fn load_classified(arm: &Path) -> Result<(Model, Geometry), ExitCode> {
    let shown = display_path(&arm.to_string_lossy());
    load_and_classify(arm, &shown, &Tolerances::default()).map_err(|e| {
        eprint!("{e}");
        exit::of_pipeline(&e)
    })
}
