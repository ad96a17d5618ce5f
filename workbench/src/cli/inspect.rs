//! `armforge inspect`: classify an arm and report the evidence, or why it has no decoupled
//! closed form. Exit 0 for a solvable arm, 3 for a geometry with no decoupled closed form,
//! 2 for a file that cannot be read.

use std::process::ExitCode;

use armforge_compiler::classify::{self, Tolerances};
use armforge_compiler::description;
use armforge_workbench::report;

/// Arguments of `armforge inspect`.
#[derive(clap::Args, Debug)]
#[command(
    after_help = "Exit status: 0 for an arm armforge can solve (kinematic decoupling at a \
    spherical wrist), 3 for a geometry with no decoupled closed form (the report says why and \
    where), 2 for a file that cannot be read or is not a valid description."
)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
    /// Print the report as JSON (same content, numbers in the file's units).
    #[arg(long)]
    pub json: bool,
    /// Largest miss between axes still counted as meeting, as a fraction of the arm's size.
    #[arg(long, value_name = "FRACTION", default_value_t = Tolerances::default().distance)]
    pub meet_tolerance: f64,
    /// Largest angle between axes still counted as parallel (or as perpendicular), radians.
    #[arg(long, value_name = "RADIANS", default_value_t = Tolerances::default().angle)]
    pub parallel_tolerance: f64,
}

/// Exit code of a solvable arm.
pub const SOLVABLE: u8 = 0;
/// Exit code of a file that cannot be read or is not a valid description.
pub const BAD_FILE: u8 = 2;
/// Exit code of a geometry with no decoupled closed form.
pub const NO_CLOSED_FORM: u8 = 3;

/// Runs `armforge inspect`.
pub fn run(args: Args) -> ExitCode {
    let tolerances = Tolerances {
        distance: args.meet_tolerance,
        angle: args.parallel_tolerance,
    };
    for (name, value) in [
        ("--meet-tolerance", tolerances.distance),
        ("--parallel-tolerance", tolerances.angle),
    ] {
        if !(value.is_finite() && value >= 0.0) {
            eprintln!("error: {name} must be a finite number ≥ 0, not {value}");
            return ExitCode::from(BAD_FILE);
        }
    }
    let model = match description::load_file(&args.arm) {
        Ok(model) => model,
        Err(diagnostics) => {
            eprint!("{diagnostics}");
            return ExitCode::from(BAD_FILE);
        }
    };
    let result = classify::classify(&model, &tolerances);
    let mut report = report::build(&model, &tolerances, &result);
    if let Ok(text) = std::fs::read_to_string(&args.arm) {
        report = report.with_source(&text);
    }
    if args.json {
        match serde_json::to_string_pretty(&report) {
            Ok(text) => println!("{text}"),
            Err(e) => {
                eprintln!("error: cannot write the report as JSON: {e}");
                return ExitCode::from(BAD_FILE);
            }
        }
    } else {
        print!("{}", report.to_text());
    }
    match &result {
        Ok(_) => ExitCode::from(SOLVABLE),
        Err(rejection) => {
            // The text report already ends with the rejection; JSON readers still get it on
            // stderr for people.
            if args.json {
                eprintln!("{rejection}");
            }
            ExitCode::from(if rejection.is_bad_input() {
                BAD_FILE
            } else {
                NO_CLOSED_FORM
            })
        }
    }
}
