//! `armforge forward`: the world pose of the tool for joint values.
//!
//! Reads JSON lines `{"joints": [...]}` (joint values in the file's units) from stdin and writes
//! one line `{"rotation": [[...], [...], [...]], "translation": [x, y, z]}` per input line
//! (rotation row-major, translation in the file's length unit). A malformed line gets
//! `{"error": "...", "line": N}` and the rest goes on; blank lines are skipped.

use armforge_compiler::model::Model;
use serde_json::{json, Value};

use super::io::{files, lines, terminal::Outcome, values};

/// Arguments of `armforge forward`.
#[derive(clap::Args, Debug)]
#[command(after_help = super::io::exit::TABLE)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge forward`.
pub fn run(args: Args) -> Outcome {
    let model = files::load(&args.arm)?.model;
    lines::answer_lines(|line| pose_for_line(&model, line))
}

/// The answer for one input line, or what is wrong with it.
fn pose_for_line(model: &Model, line: &str) -> Result<Value, String> {
    let joints = values::joints_line(model, line)?;
    let pose = model.forward_in_file_units(&joints);
    if !pose.is_finite() {
        return Err("the pose for these joint values is not finite".to_string());
    }
    Ok(json!({ "rotation": pose.rotation, "translation": pose.translation }))
}
