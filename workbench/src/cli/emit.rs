//! `armforge emit`: write the arm's solver as a Rust module.
//!
//! Without `-o` the module goes to stdout. With `-o FILE` it is written (atomically) only when
//! its content changed, so build tools see no new timestamp; with `--check` nothing is written
//! and the exit status says whether FILE is up to date (for CI in a user's repository). A FILE
//! that `cargo fmt` reformatted is still up to date: the check compares the code and its
//! comments, not the layout. `--sheet FILE.md` also writes (or, with `--check`, checks) the
//! review sheet beside it.

use std::path::{Path, PathBuf};

use armforge_compiler::classify::Tolerances;
use armforge_compiler::emit::ScalarType;
use armforge_compiler::pipeline::generate_module_in;
use armforge_workbench::review::review_sheet;

use super::io::files::{self, Replace};
use super::io::terminal::{fail, Outcome, Stopped};
use super::io::{exit, same_code};

/// Arguments of `armforge emit`.
#[derive(clap::Args, Debug)]
#[command(after_help = super::io::exit::TABLE)]
pub struct Args {
    /// The arm description file.
    pub arm: PathBuf,
    /// Write the module to FILE (only when its content changed) instead of stdout.
    #[arg(short = 'o', long = "output", value_name = "FILE")]
    pub output: Option<PathBuf>,
    /// Write nothing; exit 1 when FILE differs from what would be written, layout aside
    /// (needs -o).
    #[arg(long, requires = "output")]
    pub check: bool,
    /// Also write the Markdown review sheet (as `armforge explain` does) to FILE.md.
    #[arg(long, value_name = "FILE.md")]
    pub sheet: Option<PathBuf>,
    /// The scalar the solver computes in: f64, or f32 for a controller with a
    /// single-precision FPU.
    #[arg(long, value_name = "f64|f32", default_value = "f64", value_parser = parse_scalar)]
    pub scalar: ScalarType,
}

/// `f64` or `f32`.
fn parse_scalar(word: &str) -> Result<ScalarType, String> {
    ScalarType::from_name(word).ok_or_else(|| format!("expected f64 or f32, found `{word}`"))
}

/// Runs `armforge emit`.
pub fn run(args: Args) -> Outcome {
    let output = args.output.as_deref().unwrap_or(Path::new("-"));
    let mut inputs = vec![args.arm.as_path()];
    files::refuse_inputs(output, &inputs)?;
    if let Some(sheet) = &args.sheet {
        inputs.push(output);
        files::refuse_inputs(sheet, &inputs)?;
        inputs.pop();
    }
    let shown = files::shown(&args.arm);
    let generated = generate_module_in(&args.arm, &shown, &Tolerances::default(), args.scalar)
        .map_err(|e| files::report_at(&e, &args.arm))?;
    files::warn(&generated.warnings);
    let sheet = args.sheet.as_ref().map(|path| {
        let text = review_sheet(&generated.model, &generated.geometry, &generated.plan);
        (path, text)
    });
    if args.check {
        let module = check(output, &generated.source, same_code::same_module);
        let sheet = match &sheet {
            Some((file, text)) => check(file, text, |a, b| a == b),
            None => Ok(()),
        };
        module.and(sheet)?;
    } else {
        files::write(output, &generated.source, &inputs, Replace::IfChanged)?;
        if let Some((file, text)) = &sheet {
            files::write(file, text, &inputs, Replace::IfChanged)?;
        }
    }
    Ok(exit::code(exit::OK))
}

/// Whether `file` holds what would be written now (by `same`); a stale file gives
/// [`exit::FAILED`], an unreadable one [`exit::IO`].
fn check(file: &Path, text: &str, same: fn(&str, &str) -> bool) -> Result<(), Stopped> {
    let shown = files::shown(file);
    let meta = std::fs::metadata(file);
    if meta.is_err() {
        return Err(fail(
            exit::FAILED,
            &format!("{shown} is stale: it does not exist; run `armforge emit` without --check"),
        ));
    }
    if !meta.is_ok_and(|m| m.is_file()) {
        return Err(fail(
            exit::IO,
            &format!("--check compares with a file, and {shown} is not a regular file"),
        ));
    }
    let existing = files::read_small(file, (text.len() as u64).saturating_mul(4).max(1 << 20))
        .map_err(|e| fail(exit::IO, &e))?;
    if same(&existing, text) {
        return Ok(());
    }
    Err(fail(
        exit::FAILED,
        &format!(
            "{shown} is stale: it differs from what `armforge emit` writes now; run `armforge \
             emit` without --check to update it"
        ),
    ))
}
