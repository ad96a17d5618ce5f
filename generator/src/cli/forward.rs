//! `armforge forward`.

use std::process::ExitCode;

/// Arguments of `armforge forward`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge forward`.
pub fn run(_args: Args) -> ExitCode {
    eprintln!("armforge forward: not built yet");
    ExitCode::from(2)
}
