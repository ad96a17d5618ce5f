//! `armforge draw`.

use std::process::ExitCode;

/// Arguments of `armforge draw`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge draw`.
pub fn run(_args: Args) -> ExitCode {
    eprintln!("armforge draw: not built yet");
    ExitCode::from(2)
}
