//! The emitter: writes a plan as a Rust module (placeholder until the emitter lands).

/// Options of the emitted module.
#[derive(Clone, Debug, Default)]
pub struct EmitOptions {
    /// The description file's path as shown in the header.
    pub source_path: String,
}
