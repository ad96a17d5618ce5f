//! `armforge draw`: a picture of the arm as SVG, for a reviewer to compare with the robot.
//!
//! `armforge draw ARM [--joints J1,J2,...] -o FILE.svg` draws one configuration (joint values
//! in the file's units, all zero by default) in side, top and front views to scale.
//!
//! `armforge draw ARM --pose FILE.json -o FILE.svg` draws every solution for a tool pose, one
//! panel each, labelled with its branch. The pose file holds the world pose of the tool frame
//! in the file's units: `{"rotation": [[r11, r12, r13], [r21, r22, r23], [r31, r32, r33]],
//! "translation": [x, y, z]}` (rotation row-major).
//!
//! Joint values outside their limits are drawn with a warning; a pose with no solution exits 1.

use std::path::{Path, PathBuf};

use armforge_compiler::classify::{classify, Geometry, Tolerances};
use armforge_compiler::model::Model;
use armforge_compiler::solver::Solver;
use armforge_runtime::JointKind;
use armforge_workbench::draw::{solution_panels, Drawing};

use super::io::files::{self, Replace};
use super::io::terminal::{fail, say, Outcome};
use super::io::{exit, unreachable, values};

/// Arguments of `armforge draw`.
#[derive(clap::Args, Debug)]
#[command(after_help = super::io::exit::TABLE)]
pub struct Args {
    /// The arm description file.
    pub arm: PathBuf,
    /// Joint values in the file's units, comma-separated, one per joint (default: all zero).
    #[arg(long, value_name = "J1,J2,...", allow_hyphen_values = true)]
    pub joints: Option<String>,
    /// A JSON file with a world pose of the tool frame in the file's units: draw every
    /// solution for it.
    #[arg(long, value_name = "FILE.json", conflicts_with = "joints")]
    pub pose: Option<PathBuf>,
    /// Where to write the SVG (`-` for standard output).
    #[arg(short = 'o', long = "output", value_name = "FILE.svg")]
    pub output: PathBuf,
}

/// Runs `armforge draw`.
pub fn run(args: Args) -> Outcome {
    let inputs: Vec<&Path> = [Some(args.arm.as_path()), args.pose.as_deref()]
        .into_iter()
        .flatten()
        .collect();
    files::refuse_inputs(&args.output, &inputs)?;
    let model = files::load(&args.arm)?.model;
    let geometry = classify(&model, &Tolerances::default());
    let drawing = match &args.pose {
        Some(pose_path) => {
            let geometry = geometry.map_err(|rejection| {
                say(&rejection.to_string());
                exit::code(if rejection.is_bad_input() {
                    exit::BAD_DESCRIPTION
                } else {
                    exit::REJECTED
                })
            })?;
            solutions_drawing(&model, &geometry, pose_path)?
        }
        None => {
            let values = match args.joints.as_deref() {
                None => vec![0.0; model.joints.len()],
                Some(text) => values::joints_option(&model, "--joints", text)
                    .map_err(|message| fail(exit::USAGE, &message))?,
            };
            for warning in limit_warnings(&model, &values) {
                say(&format!("warning: {warning}"));
            }
            let drawing = Drawing::configuration(&model, model.joint_values_to_si(&values));
            match geometry {
                Ok(geometry) => drawing.with_wrist_center(Some(geometry.wrist_center)),
                Err(_) => drawing,
            }
        }
    };
    files::write(&args.output, &drawing.to_svg(), &inputs, Replace::Yes)?;
    Ok(exit::code(exit::OK))
}

/// One panel per solution of the pose in `pose_path`, labelled with its branch.
fn solutions_drawing<'a>(
    model: &'a Model,
    geometry: &Geometry,
    pose_path: &Path,
) -> Result<Drawing<'a>, super::io::terminal::Stopped> {
    let shown = files::shown(pose_path);
    let text = files::read_small(pose_path, 1 << 20).map_err(|e| fail(exit::IO, &e))?;
    let pose =
        values::pose(&text, true).map_err(|e| fail(exit::FAILED, &format!("{shown}: {e}")))?;
    let target = model.units.pose_to_si(&pose);
    let solutions = Solver::new(model, geometry).solve(&target).map_err(|why| {
        let reason = unreachable::reason(model, &why);
        fail(
            exit::FAILED,
            &format!("{shown}: no solution for this pose: {}", reason.text),
        )
    })?;
    let panels = solution_panels(model, &solutions);
    Ok(Drawing::solutions(model, target, panels).with_wrist_center(Some(geometry.wrist_center)))
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
            let show = |x: f64| armforge_compiler::units::tidy(x);
            // The limits went file units → SI → file units: 120° may come back as
            // 119.99999999999999, so a value on a limit is inside it.
            let slack = 1e-9 * (1.0 + lo.abs().max(hi.abs()));
            (v < lo - slack || v > hi + slack).then(|| {
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

fn unit_symbol(model: &Model, kind: JointKind) -> &'static str {
    match kind {
        JointKind::Revolute => model.units.angle.symbol(),
        JointKind::Prismatic => model.units.length.symbol(),
    }
}
