//! `armforge emit`: write the arm's solver as a Rust module.
//!
//! Without `-o` the module goes to stdout. With `-o FILE` it is written only when its content
//! changed (so build tools see no new timestamp); with `--check` nothing is written and the
//! exit status says whether FILE is up to date (for CI in a user's repository).
//! `--sheet FILE.md` also writes (or, with `--check`, checks) the review sheet beside it.
//! Exit status: 0; 1 when `--check` finds FILE stale or missing, or FILE cannot be written;
//! 2 for a file that is not a valid description; 3 for a geometry with no decoupled closed
//! form (the codes of `armforge inspect`).

use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;

use armforge_compiler::classify::Tolerances;
use armforge_compiler::pipeline::{display_path, generate_module};
use armforge_workbench::review::review_sheet;

/// Arguments of `armforge emit`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: PathBuf,
    /// Write the module to FILE (only when its content changed) instead of stdout.
    #[arg(short = 'o', long = "output", value_name = "FILE")]
    pub output: Option<PathBuf>,
    /// Write nothing; exit 1 when FILE differs from what would be written (needs -o).
    #[arg(long, requires = "output")]
    pub check: bool,
    /// Also write the Markdown review sheet (as `armforge explain` does) to FILE.md.
    #[arg(long, value_name = "FILE.md")]
    pub sheet: Option<PathBuf>,
}

/// Exit code when `--check` finds the file stale, or the output cannot be written.
const STALE_OR_UNWRITABLE: u8 = 1;

/// Runs `armforge emit`.
pub fn run(args: Args) -> ExitCode {
    let shown = display_path(&args.arm.to_string_lossy());
    let generated = match generate_module(&args.arm, &shown, &Tolerances::default()) {
        Ok(generated) => generated,
        Err(e) => {
            eprint!("{e}");
            return super::exit::of_pipeline(&e);
        }
    };
    let sheet = args.sheet.as_ref().map(|path| {
        let text = review_sheet(&generated.model, &generated.geometry, &generated.plan);
        (path, text)
    });
    let module = match (&args.output, args.check) {
        (None, _) => to_stdout(&generated.source),
        (Some(file), true) => check(file, &generated.source),
        (Some(file), false) => write_if_changed(file, &generated.source),
    };
    let sheet = match &sheet {
        None => ExitCode::SUCCESS,
        Some((file, text)) if args.check => check(file, text),
        Some((file, text)) => write_if_changed(file, text),
    };
    if module == ExitCode::SUCCESS {
        sheet
    } else {
        module
    }
}

fn to_stdout(text: &str) -> ExitCode {
    let mut out = std::io::stdout().lock();
    match out.write_all(text.as_bytes()).and_then(|()| out.flush()) {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("error: cannot write to stdout: {e}");
            ExitCode::from(STALE_OR_UNWRITABLE)
        }
    }
}

fn check(file: &Path, text: &str) -> ExitCode {
    match std::fs::read(file) {
        Ok(existing) if existing == text.as_bytes() => ExitCode::SUCCESS,
        Ok(_) => {
            eprintln!(
                "error: {} is stale: it differs from what `armforge emit` writes now; \
                 run `armforge emit` without --check to update it",
                file.display()
            );
            ExitCode::from(STALE_OR_UNWRITABLE)
        }
        Err(e) => {
            eprintln!("error: cannot read {}: {e}", file.display());
            ExitCode::from(STALE_OR_UNWRITABLE)
        }
    }
}

fn write_if_changed(file: &Path, text: &str) -> ExitCode {
    if std::fs::read(file).is_ok_and(|existing| existing == text.as_bytes()) {
        eprintln!("{} is up to date", file.display());
        return ExitCode::SUCCESS;
    }
    match std::fs::write(file, text) {
        Ok(()) => {
            eprintln!("wrote {}", file.display());
            ExitCode::SUCCESS
        }
        Err(e) => {
            eprintln!("error: cannot write {}: {e}", file.display());
            ExitCode::from(STALE_OR_UNWRITABLE)
        }
    }
}
