//! `armforge verify`: round trips through the arm's solver (the interpreter of its plan) on
//! random configurations within the limits and near singular configurations and reach
//! boundaries. Exit 0 when every sample passes, 1 when one fails (the table in
//! [`super::io::exit`] for the rest).

use std::io::IsTerminal;

use armforge_compiler::solver::Solver;
use armforge_workbench::verify::{self, Options};
use indicatif::{ProgressBar, ProgressStyle};

use super::io::terminal::{fail, out, report, Outcome};
use super::io::{exit, files};

/// Arguments of `armforge verify`.
#[derive(clap::Args, Debug)]
#[command(after_help = super::io::exit::TABLE)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
    /// Configurations drawn uniformly within the joint limits (one in twenty more of each kind
    /// near singular configurations, reach boundaries and joint limits); 1 to 10,000,000.
    #[arg(
        long,
        value_name = "N",
        default_value_t = Options::default().samples,
        value_parser = clap::value_parser!(u64).range(verify::SAMPLES_MIN..=verify::SAMPLES_MAX)
    )]
    pub samples: u64,
    /// The seed of the random draws (same seed, same samples).
    #[arg(long, value_name = "S", default_value_t = Options::default().seed)]
    pub seed: u64,
    /// Print the findings as JSON.
    #[arg(long)]
    pub json: bool,
}

/// Runs `armforge verify`.
pub fn run(args: Args) -> Outcome {
    let (model, geometry) = files::load_classified(&args.arm)?;
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
        Err(e @ verify::Error::Samples(_)) => return Err(fail(exit::USAGE, &e.to_string())),
        Err(e) => return Err(fail(exit::BAD_DESCRIPTION, &e.to_string())),
    };
    if let Some(b) = bar {
        b.finish_and_clear();
    }
    if args.json {
        let text = serde_json::to_string_pretty(&summary)
            .map_err(|e| fail(exit::IO, &format!("cannot write the findings as JSON: {e}")))?;
        out(&format!("{text}\n"))?;
    } else {
        report(&summary.to_text(&model))?;
    }
    Ok(exit::code(if summary.passed {
        exit::OK
    } else {
        exit::FAILED
    }))
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
