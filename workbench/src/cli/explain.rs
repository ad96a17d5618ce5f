//! `armforge explain`: the arm's review sheet (Markdown) on stdout or in a file. Exit 0 for a
//! solvable arm, 3 for a geometry with no decoupled closed form, 2 for a file that cannot be
//! read or written.

use std::process::ExitCode;

use armforge_compiler::plan::build_plan;
use armforge_workbench::review::review_sheet;

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

/// Runs `armforge explain`.
pub fn run(args: Args) -> ExitCode {
    let (model, geometry) = match super::load_classified(&args.arm) {
        Ok(loaded) => loaded,
        Err(code) => return code,
    };
    let plan = build_plan(&model, &geometry);
    let sheet = review_sheet(&model, &geometry, &plan);
    match &args.output {
        None => print!("{sheet}"),
        Some(path) => {
            if let Err(e) = std::fs::write(path, sheet) {
                eprintln!("error: cannot write {}: {e}", path.display());
                return ExitCode::from(super::exit::BAD_FILE);
            }
        }
    }
    ExitCode::from(WRITTEN)
}
