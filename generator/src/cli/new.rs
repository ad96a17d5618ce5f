//! `armforge new`.

use std::process::ExitCode;

/// Arguments of `armforge new`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge new`.
pub fn run(_args: Args) -> ExitCode {
    eprintln!("armforge new: not built yet");
    ExitCode::from(2)
}
