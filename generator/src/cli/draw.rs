//! `armforge draw`: a picture of the arm as SVG, for a reviewer to compare with the robot.
//!
//! `armforge draw ARM [--joints J1,J2,...] -o FILE.svg` draws one configuration (joint values
//! in the file's units, all zero by default) in side, top and front views to scale.
//! Exit status: 0; 1 if the joint values are malformed or the file cannot be written; 2 if the
//! arm file has problems.

use std::path::PathBuf;
use std::process::ExitCode;

use armforge_generator::description;
use armforge_generator::draw::Drawing;
use armforge_generator::model::Model;

/// Arguments of `armforge draw`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: PathBuf,
    /// Joint values in the file's units, comma-separated, one per joint (default: all zero).
    #[arg(long, value_name = "J1,J2,...", allow_hyphen_values = true)]
    pub joints: Option<String>,
    /// Where to write the SVG (`-` for standard output).
    #[arg(short = 'o', long = "output", value_name = "FILE.svg")]
    pub output: PathBuf,
}

/// Runs `armforge draw`.
pub fn run(args: Args) -> ExitCode {
    let model = match description::load_file(&args.arm) {
        Ok(model) => model,
        Err(diagnostics) => {
            eprint!("{diagnostics}");
            return ExitCode::from(2);
        }
    };
    let values = match args
        .joints
        .as_deref()
        .map(|s| parse_joint_values(&model, s))
    {
        None => vec![0.0; model.joints.len()],
        Some(Ok(values)) => values,
        Some(Err(message)) => {
            eprintln!("error: --joints: {message}");
            return ExitCode::from(1);
        }
    };
    for warning in limit_warnings(&model, &values) {
        eprintln!("warning: {warning}");
    }
    let svg = Drawing::configuration(&model, model.joint_values_to_si(&values)).to_svg();
    write_output(&args.output, &svg)
}

/// The joint values of `--joints`, one number per joint in the file's units.
fn parse_joint_values(model: &Model, text: &str) -> Result<Vec<f64>, String> {
    let items: Vec<&str> = text.split(',').map(str::trim).collect();
    let expected = model.joints.len();
    if items.len() != expected {
        return Err(format!(
            "expected {expected} comma-separated joint values for arm \"{}\", found {} in `{text}`",
            model.name,
            items.len()
        ));
    }
    items
        .iter()
        .enumerate()
        .map(|(i, item)| match item.parse::<f64>() {
            Ok(v) if v.is_finite() => Ok(v),
            _ => Err(format!(
                "the value of {} is not a finite number: `{item}`",
                model.joint_label(i)
            )),
        })
        .collect()
}

/// A warning for each joint value outside the joint's limits (the drawing is still made).
fn limit_warnings(model: &Model, values: &[f64]) -> Vec<String> {
    let units = &model.units;
    model
        .joints
        .iter()
        .zip(values)
        .enumerate()
        .filter_map(|(i, (j, &v))| {
            let kind = j.joint.kind;
            let [lo, hi] = j.joint.limits.map(|l| units.joint_from_si(kind, l));
            let show = |x: f64| armforge_generator::units::tidy(x);
            (v < lo || v > hi).then(|| {
                format!(
                    "{} value {} lies outside its limits [{}, {}] ({}); drawn anyway",
                    model.joint_label(i),
                    show(v),
                    show(lo),
                    show(hi),
                    unit_symbol(model, kind)
                )
            })
        })
        .collect()
}

fn unit_symbol(model: &Model, kind: armforge_runtime::JointKind) -> &'static str {
    match kind {
        armforge_runtime::JointKind::Revolute => model.units.angle.symbol(),
        armforge_runtime::JointKind::Prismatic => model.units.length.symbol(),
    }
}

fn write_output(path: &PathBuf, svg: &str) -> ExitCode {
    if path.as_os_str() == "-" {
        print!("{svg}");
        return ExitCode::SUCCESS;
    }
    match std::fs::write(path, svg) {
        Ok(()) => {
            eprintln!("wrote {}", path.display());
            ExitCode::SUCCESS
        }
        Err(e) => {
            eprintln!("error: cannot write {}: {e}", path.display());
            ExitCode::from(1)
        }
    }
}
