//! `armforge inspect`.

use std::process::ExitCode;

/// Arguments of `armforge inspect`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge inspect`.
pub fn run(_args: Args) -> ExitCode {
    eprintln!("armforge inspect: not built yet");
    ExitCode::from(2)
}
