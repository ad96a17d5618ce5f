//! `armforge explain`: the arm's review sheet (Markdown) on stdout or in a file. Exit 0 for a
//! solvable arm, 3 for a geometry with no decoupled closed form, 2 for a file that cannot be
//! read or written.

use std::process::ExitCode;

use armforge_generator::classify::Tolerances;
use armforge_generator::pipeline::{display_path, load_and_classify};
use armforge_generator::plan::build_plan;
use armforge_generator::review::review_sheet;

/// Arguments of `armforge explain`.
#[derive(clap::Args, Debug)]
#[command(
    after_help = "Exit status: 0 when the sheet was written, 3 for a geometry with no decoupled \
    closed form, 2 for a file that cannot be read or written."
)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
    /// Write the sheet to this file instead of stdout.
    #[arg(short, long, value_name = "FILE.md")]
    pub output: Option<std::path::PathBuf>,
}

/// Exit code when the sheet was written.
pub const WRITTEN: u8 = 0;
/// Exit code of a file that cannot be read or written.
pub const BAD_FILE: u8 = 2;

/// Runs `armforge explain`.
pub fn run(args: Args) -> ExitCode {
    let shown = display_path(&args.arm.to_string_lossy());
    let (model, geometry) = match load_and_classify(&args.arm, &shown, &Tolerances::default()) {
        Ok(loaded) => loaded,
        Err(e) => {
            eprint!("{e}");
            return ExitCode::from(e.exit_code());
        }
    };
    let plan = build_plan(&model, &geometry);
    let sheet = review_sheet(&model, &geometry, &plan);
    match &args.output {
        None => print!("{sheet}"),
        Some(path) => {
            if let Err(e) = std::fs::write(path, sheet) {
                eprintln!("error: cannot write {}: {e}", path.display());
                return ExitCode::from(BAD_FILE);
            }
        }
    }
    ExitCode::from(WRITTEN)
}
