//! `armforge solve`.

use std::process::ExitCode;

/// Arguments of `armforge solve`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge solve`.
pub fn run(_args: Args) -> ExitCode {
    eprintln!("armforge solve: not built yet");
    ExitCode::from(2)
}
