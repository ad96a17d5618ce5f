//! `armforge verify`: round trips through the arm's solver (the interpreter of its plan) on
//! random configurations within the limits and near singular configurations and reach
//! boundaries. Exit 0 when every sample passes, 1 when one fails, 2 for a file that cannot be
//! read, 3 for a geometry with no decoupled closed form.

use std::io::IsTerminal;
use std::process::ExitCode;

use armforge_compiler::solver::Solver;
use armforge_workbench::verify::{self, Options};
use indicatif::{ProgressBar, ProgressStyle};

/// Arguments of `armforge verify`.
#[derive(clap::Args, Debug)]
#[command(
    after_help = "Exit status: 0 when every configuration is recovered and every error is within \
    its limit, 1 when a sample fails (the failing samples are named), 2 for a file that cannot \
    be read, 3 for a geometry with no decoupled closed form."
)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
    /// Configurations drawn uniformly within the joint limits (one in twenty more of each kind
    /// near singular configurations, reach boundaries and joint limits).
    #[arg(long, value_name = "N", default_value_t = Options::default().samples)]
    pub samples: u64,
    /// The seed of the random draws (same seed, same samples).
    #[arg(long, value_name = "S", default_value_t = Options::default().seed)]
    pub seed: u64,
    /// Print the findings as JSON.
    #[arg(long)]
    pub json: bool,
}

/// Exit code when every sample passes.
pub const PASSED: u8 = 0;
/// Exit code when a sample fails.
pub const FAILED: u8 = 1;

/// Runs `armforge verify`.
pub fn run(args: Args) -> ExitCode {
    let (model, geometry) = match super::load_classified(&args.arm) {
        Ok(loaded) => loaded,
        Err(code) => return code,
    };
    let solver = Solver::new(&model, &geometry);
    let options = Options {
        samples: args.samples,
        seed: args.seed,
        ..Options::default()
    };
    let bar = progress_bar(verify::planned_samples(&model, &geometry, options.samples));
    let summary = match verify::verify(&model, &geometry, &solver, &options, &|n| {
        if let Some(b) = &bar {
            b.inc(n);
        }
    }) {
        Ok(s) => s,
        Err(e) => {
            eprintln!("error: {e}");
            return ExitCode::from(super::exit::BAD_FILE);
        }
    };
    if let Some(b) = bar {
        b.finish_and_clear();
    }
    if args.json {
        match serde_json::to_string_pretty(&summary) {
            Ok(text) => println!("{text}"),
            Err(e) => {
                eprintln!("error: cannot write the findings as JSON: {e}");
                return ExitCode::from(FAILED);
            }
        }
    } else {
        print!("{}", summary.to_text(&model));
    }
    ExitCode::from(if summary.passed { PASSED } else { FAILED })
}

/// A progress bar on stderr when stdout is a terminal (a person is watching).
fn progress_bar(total: u64) -> Option<ProgressBar> {
    if !std::io::stdout().is_terminal() {
        return None;
    }
    let bar = ProgressBar::new(total);
    if let Ok(style) = ProgressStyle::with_template(
        "{spinner} verifying [{bar:40}] {pos}/{len} configurations ({eta} left)",
    ) {
        bar.set_style(style.progress_chars("=> "));
    }
    Some(bar)
}
