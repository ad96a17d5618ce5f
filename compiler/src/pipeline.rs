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
use crate::diagnostics::{Diagnostic, Diagnostics, Location, Warnings};
use crate::emit::{emit_module, EmitOptions, ScalarType};
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
    /// Likely slips in the description that did not stop it (shown by the tools on stderr).
    pub warnings: Warnings,
}

/// Why the pipeline made no module.
#[derive(Clone, Debug)]
pub enum PipelineError {
    /// The file cannot be opened or read (one diagnostic without a place).
    Unreadable(Diagnostics),
    /// The file is not a valid description (every problem, located).
    Description(Diagnostics),
    /// The arm has no decoupled closed form (located at the offending joint).
    Rejected(Box<Rejection>),
}

impl PipelineError {
    /// True when the description itself is at fault (invalid, or a model no classification
    /// can start from); false when it is a valid arm whose geometry has no closed form or a
    /// file that cannot be read. Command-line tools map these to different exit codes.
    pub fn is_bad_description(&self) -> bool {
        match self {
            PipelineError::Unreadable(_) => false,
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
            PipelineError::Unreadable(d) | PipelineError::Description(d) => write!(f, "{d}"),
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
    generate_module_in(path, shown_path, tolerances, ScalarType::F64)
}

/// [`generate_module`] with a solver in the scalar `scalar` (`armforge emit --scalar`,
/// `solver!(…, scalar = f32)`).
pub fn generate_module_in(
    path: &Path,
    shown_path: &str,
    tolerances: &Tolerances,
    scalar: ScalarType,
) -> Result<Generated, PipelineError> {
    let text = read_description(path, shown_path)?;
    generate_from_str_in(&text, shown_path, tolerances, scalar)
}

/// [`generate_module`] for description text already in memory.
pub fn generate_from_str(
    text: &str,
    shown_path: &str,
    tolerances: &Tolerances,
) -> Result<Generated, PipelineError> {
    generate_from_str_in(text, shown_path, tolerances, ScalarType::F64)
}

/// [`generate_module_in`] for description text already in memory.
pub fn generate_from_str_in(
    text: &str,
    shown_path: &str,
    tolerances: &Tolerances,
    scalar: ScalarType,
) -> Result<Generated, PipelineError> {
    let (model, warnings) = description::load_str_with_warnings(text, shown_path)
        .map_err(PipelineError::Description)?;
    let geometry =
        classify::classify(&model, tolerances).map_err(|r| PipelineError::Rejected(Box::new(r)))?;
    let plan = build_plan(&model, &geometry);
    let options = EmitOptions {
        source_path: shown_path.to_string(),
        scalar,
        ..EmitOptions::default()
    };
    let source = emit_module(&model, &plan, &options);
    Ok(Generated {
        model,
        geometry,
        plan,
        source,
        warnings,
    })
}

/// Loads and classifies without planning or emitting (for `solve`, `explain`, `verify`).
pub fn load_and_classify(
    path: &Path,
    shown_path: &str,
    tolerances: &Tolerances,
) -> Result<(Model, Geometry), PipelineError> {
    classify_text(&read_description(path, shown_path)?, shown_path, tolerances)
}

/// Reads and loads the description at `path` into a model, without classifying it (for
/// `forward`, `inspect`, `draw`).
pub fn load_model(path: &Path, shown_path: &str) -> Result<Model, PipelineError> {
    let text = read_description(path, shown_path)?;
    description::load_str(&text, shown_path).map_err(PipelineError::Description)
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

/// The largest description file read, in bytes (1 MiB: a six-joint arm takes about 2 KiB).
pub const MAX_FILE_BYTES: u64 = 1 << 20;

/// The one way every tool reads a description file: at most [`MAX_FILE_BYTES`], as UTF-8.
///
/// `shown_path` names the file in messages. A file that cannot be opened or read, a file over
/// the cap (also an endless one such as `/dev/zero`) and a file that is not UTF-8 (located at
/// the first bad byte's line and column) each give one diagnostic: the first as
/// [`PipelineError::Unreadable`], the others as [`PipelineError::Description`].
pub fn read_description(path: &Path, shown_path: &str) -> Result<String, PipelineError> {
    use std::io::Read;
    let unreadable = |message: String| Diagnostics {
        path: shown_path.to_string(),
        items: vec![Diagnostic {
            location: Location::default(),
            key: String::new(),
            message,
            source_line: String::new(),
        }],
    };
    let mut bytes = Vec::new();
    std::fs::File::open(path)
        .and_then(|file| file.take(MAX_FILE_BYTES + 1).read_to_end(&mut bytes))
        .map_err(|e| PipelineError::Unreadable(unreadable(format!("cannot read the file: {e}"))))?;
    if bytes.len() as u64 > MAX_FILE_BYTES {
        return Err(PipelineError::Description(unreadable(format!(
            "the file is larger than {} KiB; a description is a few KiB",
            MAX_FILE_BYTES / 1024
        ))));
    }
    String::from_utf8(bytes).map_err(|e| PipelineError::Description(not_utf8(shown_path, e)))
}

/// The diagnostic for a file that is not UTF-8, at the first invalid byte.
fn not_utf8(shown_path: &str, e: std::string::FromUtf8Error) -> Diagnostics {
    let bytes = e.as_bytes();
    let valid = e.utf8_error().valid_up_to();
    // The prefix up to `valid` is UTF-8 by definition of `valid_up_to`.
    let before = std::str::from_utf8(&bytes[..valid]).unwrap_or_default();
    let line_start = before.rfind('\n').map_or(0, |i| i + 1);
    let line_text = &before[line_start..];
    Diagnostics {
        path: shown_path.to_string(),
        items: vec![Diagnostic {
            location: Location {
                line: before.matches('\n').count() + 1,
                column: line_text.chars().count() + 1,
            },
            key: String::new(),
            message: format!(
                "the file is not UTF-8 text: byte 0x{:02x} at offset {valid} starts no character",
                bytes.get(valid).copied().unwrap_or_default()
            ),
            source_line: line_text.to_string(),
        }],
    }
}
