//! `armforge explain`.

use std::process::ExitCode;

/// Arguments of `armforge explain`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
}

/// Runs `armforge explain`.
pub fn run(_args: Args) -> ExitCode {
    eprintln!("armforge explain: not built yet");
    ExitCode::from(2)
}
