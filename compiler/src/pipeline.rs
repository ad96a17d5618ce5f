//! The one pipeline behind `armforge emit` and the `solver!` macro: read → load → classify →
//! plan → emit.
//!
//! Both shells call [`generate_module`] with the description's path as the user wrote it, so a
//! module checked in with the CLI and a module expanded by the macro come from the same bytes
//! of the same function and cannot drift apart.

use std::fmt;
use std::path::Path;

use crate::classify::{self, Geometry, Rejection, Tolerances};
use crate::description;
use crate::diagnostics::{Diagnostic, Diagnostics, Location};
use crate::emit::{emit_module, EmitOptions};
use crate::model::Model;
use crate::plan::{build_plan, Plan};

/// Everything the pipeline made for one description file.
#[derive(Clone, Debug)]
pub struct Generated {
    /// The arm's model (SI units).
    pub model: Model,
    /// The classified geometry.
    pub geometry: Geometry,
    /// The solve plan.
    pub plan: Plan,
    /// The emitted Rust module, formatted (a file body).
    pub source: String,
}

/// Why the pipeline made no module.
#[derive(Clone, Debug)]
pub enum PipelineError {
    /// The file cannot be read or is not a valid description (every problem, located).
    Description(Diagnostics),
    /// The arm has no decoupled closed form (located at the offending joint).
    Rejected(Box<Rejection>),
}

impl PipelineError {
    /// True when the description itself is at fault (unreadable, invalid, or a model no
    /// classification can start from); false when it is a valid arm whose geometry has no
    /// closed form. Command-line tools map the two to different exit codes.
    pub fn is_bad_description(&self) -> bool {
        match self {
            PipelineError::Description(_) => true,
            PipelineError::Rejected(r) => r.is_bad_input(),
        }
    }

    /// The message without the leading `error: ` (for a compiler diagnostic, which adds its
    /// own), keeping the location and the caret display.
    pub fn message_without_prefix(&self) -> String {
        let text = self.to_string();
        let text = text.trim_end();
        text.strip_prefix("error: ").unwrap_or(text).to_string()
    }
}

impl fmt::Display for PipelineError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            PipelineError::Description(d) => write!(f, "{d}"),
            PipelineError::Rejected(r) => writeln!(f, "{r}"),
        }
    }
}

impl std::error::Error for PipelineError {}

/// The path as shown in the emitted header and in messages: as the user wrote it, with `/`
/// separators so the output is the same on every platform.
pub fn display_path(written: &str) -> String {
    written.replace('\\', "/")
}

/// Reads the description at `path`, classifies it, plans and emits the solver module.
///
/// `shown_path` names the file in the header and in messages (the path as the user wrote it,
/// see [`display_path`]); `path` is where to read it. Never panics on any file.
pub fn generate_module(
    path: &Path,
    shown_path: &str,
    tolerances: &Tolerances,
) -> Result<Generated, PipelineError> {
    let text = read(path, shown_path)?;
    generate_from_str(&text, shown_path, tolerances)
}

/// [`generate_module`] for description text already in memory.
pub fn generate_from_str(
    text: &str,
    shown_path: &str,
    tolerances: &Tolerances,
) -> Result<Generated, PipelineError> {
    let (model, geometry) = classify_text(text, shown_path, tolerances)?;
    let plan = build_plan(&model, &geometry);
    let options = EmitOptions {
        source_path: shown_path.to_string(),
        ..EmitOptions::default()
    };
    let source = emit_module(&model, &plan, &options);
    Ok(Generated {
        model,
        geometry,
        plan,
        source,
    })
}

/// Loads and classifies without planning or emitting (for `solve`, `explain`, `verify`).
pub fn load_and_classify(
    path: &Path,
    shown_path: &str,
    tolerances: &Tolerances,
) -> Result<(Model, Geometry), PipelineError> {
    classify_text(&read(path, shown_path)?, shown_path, tolerances)
}

/// Reads description text and classifies the arm.
fn classify_text(
    text: &str,
    shown_path: &str,
    tolerances: &Tolerances,
) -> Result<(Model, Geometry), PipelineError> {
    let model = description::load_str(text, shown_path).map_err(PipelineError::Description)?;
    let geometry =
        classify::classify(&model, tolerances).map_err(|r| PipelineError::Rejected(Box::new(r)))?;
    Ok((model, geometry))
}

/// The file's text, or one unlocated diagnostic saying why it cannot be read.
fn read(path: &Path, shown_path: &str) -> Result<String, PipelineError> {
    std::fs::read_to_string(path).map_err(|e| {
        PipelineError::Description(Diagnostics {
            path: shown_path.to_string(),
            items: vec![Diagnostic {
                location: Location::default(),
                key: String::new(),
                message: format!("cannot read the file: {e}"),
                source_line: String::new(),
            }],
        })
    })
}
