//! `armforge forward`: the world pose of the tool for joint values.
//!
//! Reads JSON lines `{"joints": [...]}` (joint values in the file's units) from stdin and writes
//! one line `{"rotation": [[...], [...], [...]], "translation": [x, y, z]}` per input line
//! (rotation row-major, translation in the file's length unit). A malformed line gets
//! `{"error": "..."}` and the rest goes on; blank lines are skipped.
//! Exit status: 0, or 1 if any line was malformed, or 2 if the arm file has problems.

use std::process::ExitCode;

use armforge_compiler::description;
use armforge_compiler::model::Model;
use serde_json::{json, Value};

/// Arguments of `armforge forward`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge forward`.
pub fn run(args: Args) -> ExitCode {
    let model = match description::load_file(&args.arm) {
        Ok(model) => model,
        Err(diagnostics) => {
            eprint!("{diagnostics}");
            return ExitCode::from(2);
        }
    };
    super::lines::answer_lines(|line| pose_for_line(&model, line))
}

/// The answer for one input line, or what is wrong with it.
fn pose_for_line(model: &Model, line: &str) -> Result<Value, String> {
    let joints = joint_values(model, line)?;
    let pose = model.forward_in_file_units(&joints);
    if !pose.is_finite() {
        return Err("the pose for these joint values is not finite".to_string());
    }
    Ok(json!({ "rotation": pose.rotation, "translation": pose.translation }))
}

/// The joint values of one input line, checked against the arm.
fn joint_values(model: &Model, line: &str) -> Result<Vec<f64>, String> {
    let value: Value = serde_json::from_str(line).map_err(|e| format!("not valid JSON: {e}"))?;
    let Value::Object(object) = value else {
        return Err("expected an object {\"joints\": [...]}".to_string());
    };
    if let Some(other) = object.keys().find(|k| k.as_str() != "joints") {
        return Err(format!("unknown key \"{other}\"; expected only \"joints\""));
    }
    let Some(Value::Array(items)) = object.get("joints") else {
        return Err("expected \"joints\": an array of joint values".to_string());
    };
    let expected = model.joints.len();
    if items.len() != expected {
        return Err(format!(
            "expected {expected} joint values for arm \"{}\", found {}",
            model.name,
            items.len()
        ));
    }
    items
        .iter()
        .enumerate()
        .map(|(i, item)| {
            item.as_f64()
                .ok_or_else(|| format!("{} is not a number: {item}", model.joint_label(i)))
        })
        .collect()
}
