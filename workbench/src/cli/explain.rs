//! `armforge explain`: the arm's review sheet (Markdown) on stdout or in a file.

use armforge_compiler::plan::build_plan;
use armforge_workbench::review::review_sheet;

use super::io::{exit, files, terminal::Outcome};

/// Arguments of `armforge explain`.
#[derive(clap::Args, Debug)]
#[command(after_help = super::io::exit::TABLE)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
    /// Write the sheet to this file instead of stdout (`-` for stdout).
    #[arg(short, long, value_name = "FILE.md")]
    pub output: Option<std::path::PathBuf>,
}

/// Runs `armforge explain`.
pub fn run(args: Args) -> Outcome {
    let output = args.output.as_deref().unwrap_or(std::path::Path::new("-"));
    files::refuse_inputs(output, &[&args.arm])?;
    let (model, geometry) = files::load_classified(&args.arm)?;
    let plan = build_plan(&model, &geometry);
    let sheet = review_sheet(&model, &geometry, &plan);
    files::write(output, &sheet, &[&args.arm], files::Replace::Yes)?;
    Ok(exit::code(exit::OK))
}
