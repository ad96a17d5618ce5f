//! `armforge verify`.

use std::process::ExitCode;

/// Arguments of `armforge verify`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge verify`.
pub fn run(_args: Args) -> ExitCode {
    eprintln!("armforge verify: not built yet");
    ExitCode::from(2)
}
