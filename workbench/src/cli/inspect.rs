//! `armforge inspect`: classify an arm and report the evidence, or why it has no decoupled
//! closed form.

use armforge_compiler::classify::{self, Tolerances};
use armforge_workbench::report;

use super::io::terminal::{fail, out, report as report_text, say, Outcome};
use super::io::{exit, files};

/// Arguments of `armforge inspect`.
#[derive(clap::Args, Debug)]
#[command(after_help = super::io::exit::TABLE)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
    /// Print the report as JSON (same content, numbers in the file's units).
    #[arg(long)]
    pub json: bool,
    /// Largest miss between axes still counted as meeting, as a fraction of the arm's size.
    #[arg(long, value_name = "FRACTION", default_value_t = Tolerances::default().distance)]
    pub meet_tolerance: f64,
    /// Largest angle between axes still counted as parallel (or as perpendicular), in the
    /// file's angle unit (default 1e-6 rad, which is 0.0000573 deg).
    #[arg(long, value_name = "ANGLE", allow_hyphen_values = true)]
    pub parallel_tolerance: Option<f64>,
}

/// Runs `armforge inspect`.
pub fn run(args: Args) -> Outcome {
    for (name, value) in [
        ("--meet-tolerance", args.meet_tolerance),
        (
            "--parallel-tolerance",
            args.parallel_tolerance.unwrap_or(0.0),
        ),
    ] {
        if !(value.is_finite() && value >= 0.0) {
            return Err(fail(
                exit::USAGE,
                &format!("{name} must be a finite number ≥ 0, not {value}"),
            ));
        }
    }
    let loaded = files::load(&args.arm)?;
    let model = &loaded.model;
    let tolerances = Tolerances {
        distance: args.meet_tolerance,
        angle: args
            .parallel_tolerance
            .map_or(Tolerances::default().angle, |a| model.units.angle_to_si(a)),
    };
    let result = classify::classify(model, &tolerances);
    let report = report::build(model, &tolerances, &result).with_source(&loaded.text);
    if args.json {
        let text = serde_json::to_string_pretty(&report)
            .map_err(|e| fail(exit::IO, &format!("cannot write the report as JSON: {e}")))?;
        out(&format!("{text}\n"))?;
    } else {
        report_text(&report.to_text())?;
    }
    Ok(exit::code(match &result {
        Ok(_) => exit::OK,
        Err(rejection) => {
            // The text report already ends with the rejection; JSON readers still get it on
            // stderr for people.
            if args.json {
                say(&rejection.to_string());
            }
            if rejection.is_bad_input() {
                exit::BAD_DESCRIPTION
            } else {
                exit::REJECTED
            }
        }
    }))
}
