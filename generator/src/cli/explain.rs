//! `armforge explain`: the arm's review sheet (Markdown) on stdout or in a file. Exit 0 for a
//! solvable arm, 3 for a geometry with no decoupled closed form, 2 for a file that cannot be
//! read or written.

use std::process::ExitCode;

use armforge_generator::classify::{self, Tolerances};
use armforge_generator::description;
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
/// Exit code of a geometry with no decoupled closed form.
pub const NO_CLOSED_FORM: u8 = 3;

/// Runs `armforge explain`.
pub fn run(args: Args) -> ExitCode {
    let model = match description::load_file(&args.arm) {
        Ok(model) => model,
        Err(diagnostics) => {
            eprint!("{diagnostics}");
            return ExitCode::from(BAD_FILE);
        }
    };
    let geometry = match classify::classify(&model, &Tolerances::default()) {
        Ok(g) => g,
        Err(rejection) => {
            eprintln!("{rejection}");
            return ExitCode::from(if rejection.is_bad_input() {
                BAD_FILE
            } else {
                NO_CLOSED_FORM
            });
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
