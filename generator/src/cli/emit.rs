//! `armforge emit`.

use std::process::ExitCode;

/// Arguments of `armforge emit`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge emit`.
pub fn run(_args: Args) -> ExitCode {
    eprintln!("armforge emit: not built yet");
    ExitCode::from(2)
}
