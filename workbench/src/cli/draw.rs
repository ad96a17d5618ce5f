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
//! Exit status: 0; 1 if the joint values or the pose are malformed, the pose has no solution
//! or the file cannot be written; 2 if the arm file has problems or the arm has no closed-form
//! solver.

use std::path::{Path, PathBuf};
use std::process::ExitCode;

use armforge_compiler::classify::{classify, Geometry, Tolerances};
use armforge_compiler::description;
use armforge_compiler::model::Model;
use armforge_compiler::solver::Solver;
use armforge_runtime::{JointKind, Pose, Unreachable};
use armforge_workbench::draw::{solution_panels, Drawing};
use serde_json::Value;

/// Arguments of `armforge draw`.
#[derive(clap::Args, Debug)]
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
pub fn run(args: Args) -> ExitCode {
    let model = match description::load_file(&args.arm) {
        Ok(model) => model,
        Err(diagnostics) => {
            eprint!("{diagnostics}");
            return ExitCode::from(2);
        }
    };
    let geometry = classify(&model, &Tolerances::default());
    let drawing = match &args.pose {
        Some(pose_path) => {
            let geometry = match geometry {
                Ok(geometry) => geometry,
                Err(rejection) => {
                    eprintln!("{rejection}");
                    return ExitCode::from(2);
                }
            };
            match solutions_drawing(&model, &geometry, pose_path) {
                Ok(drawing) => drawing,
                Err(message) => {
                    eprintln!("error: {message}");
                    return ExitCode::from(1);
                }
            }
        }
        None => {
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
            let drawing = Drawing::configuration(&model, model.joint_values_to_si(&values));
            match geometry {
                Ok(geometry) => drawing.with_wrist_center(Some(geometry.wrist_center)),
                Err(_) => drawing,
            }
        }
    };
    write_output(&args.output, &drawing.to_svg())
}

/// One panel per solution of the pose in `pose_path`, labelled with its branch.
fn solutions_drawing<'a>(
    model: &'a Model,
    geometry: &Geometry,
    pose_path: &Path,
) -> Result<Drawing<'a>, String> {
    let shown = pose_path.display();
    let text =
        std::fs::read_to_string(pose_path).map_err(|e| format!("cannot read {shown}: {e}"))?;
    let pose = parse_pose(&text).map_err(|e| format!("{shown}: {e}"))?;
    let target = model.units.pose_to_si(&pose);
    let solutions = Solver::new(model, geometry).solve(&target).map_err(|why| {
        format!(
            "{shown}: no solution for this pose: {}",
            unreachable(model, &why)
        )
    })?;
    let panels = solution_panels(model, &solutions);
    Ok(Drawing::solutions(model, target, panels).with_wrist_center(Some(geometry.wrist_center)))
}

/// Why a pose has no solution, with distances and angles in the file's units.
fn unreachable(model: &Model, why: &Unreachable) -> String {
    let units = &model.units;
    match *why {
        Unreachable::BeyondReach { by } => format!(
            "the wrist center lies {} beyond the arm's reach",
            units.show_length(by)
        ),
        Unreachable::InsideHole { by } => format!(
            "the wrist center lies {} inside the region the arm cannot reach near its shoulder",
            units.show_length(by)
        ),
        Unreachable::WristOrientation { by } => format!(
            "the wrist cannot turn the tool to this orientation: axis 6 misses the cone it can reach by {}",
            units.show_angle(by)
        ),
        Unreachable::OutsideLimits { joint, by } => {
            let shown = match model.joints.get(joint).map(|j| j.joint.kind) {
                Some(JointKind::Prismatic) => units.show_length(by),
                _ => units.show_angle(by),
            };
            format!(
                "every solution has a joint outside its limits; the closest misses the limits of {} by {shown}",
                model.joint_label(joint)
            )
        }
        _ => why.to_string(),
    }
}

/// A pose from JSON: `{"rotation": [[...], [...], [...]], "translation": [x, y, z]}`.
fn parse_pose(text: &str) -> Result<Pose, String> {
    let value: Value = serde_json::from_str(text).map_err(|e| format!("not valid JSON: {e}"))?;
    let Value::Object(object) = value else {
        return Err("expected an object {\"rotation\": [[...]], \"translation\": [...]}".into());
    };
    if let Some(other) = object
        .keys()
        .find(|k| k.as_str() != "rotation" && k.as_str() != "translation")
    {
        return Err(format!(
            "unknown key \"{other}\"; expected \"rotation\" and \"translation\""
        ));
    }
    let rows = array(object.get("rotation"), "rotation", 3)?;
    let mut rotation = [[0.0; 3]; 3];
    for (r, row) in rows.iter().enumerate() {
        let row = array(Some(row), &format!("rotation row {}", r + 1), 3)?;
        for (c, x) in row.iter().enumerate() {
            rotation[r][c] = number(x, &format!("rotation[{r}][{c}]"))?;
        }
    }
    let items = array(object.get("translation"), "translation", 3)?;
    let mut translation = [0.0; 3];
    for (k, x) in items.iter().enumerate() {
        translation[k] = number(x, &format!("translation[{k}]"))?;
    }
    Ok(Pose {
        rotation,
        translation,
    })
}

/// The items of a JSON array that must have `len` entries.
fn array<'v>(value: Option<&'v Value>, what: &str, len: usize) -> Result<&'v Vec<Value>, String> {
    match value {
        Some(Value::Array(items)) if items.len() == len => Ok(items),
        Some(Value::Array(items)) => Err(format!(
            "\"{what}\" has {} entries, expected {len}",
            items.len()
        )),
        Some(other) => Err(format!("\"{what}\" is not an array: {other}")),
        None => Err(format!("\"{what}\" is missing")),
    }
}

fn number(value: &Value, what: &str) -> Result<f64, String> {
    match value.as_f64() {
        Some(x) if x.is_finite() => Ok(x),
        _ => Err(format!("{what} is not a finite number: {value}")),
    }
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
            let show = |x: f64| armforge_compiler::units::tidy(x);
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

fn unit_symbol(model: &Model, kind: JointKind) -> &'static str {
    match kind {
        JointKind::Revolute => model.units.angle.symbol(),
        JointKind::Prismatic => model.units.length.symbol(),
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
