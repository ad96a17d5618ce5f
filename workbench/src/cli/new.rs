//! `armforge new`: write a commented starting description for a new arm.

use std::path::PathBuf;
use std::process::ExitCode;

use armforge_workbench::scaffold::{
    arm_name_problem, parse_convention, starting_description, Convention,
};

/// Arguments of `armforge new`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm's name (letters, digits, '-' and '_', starting with a letter; not a Rust keyword).
    pub name: String,
    /// How the joints are described.
    #[arg(long, value_parser = parse_convention, default_value = "dh")]
    pub convention: Convention,
    /// Where to write the file (default: NAME.toml; `-` for standard output).
    #[arg(short = 'o', long = "output")]
    pub output: Option<PathBuf>,
    /// Replace the file if it exists.
    #[arg(long)]
    pub force: bool,
}

/// Runs `armforge new`.
pub fn run(args: Args) -> ExitCode {
    if let Some(problem) = arm_name_problem(&args.name) {
        eprintln!("error: arm name: {problem} (it becomes a Rust module name)");
        return ExitCode::from(2);
    }
    let text = starting_description(&args.name, args.convention);
    let path = args
        .output
        .unwrap_or_else(|| PathBuf::from(format!("{}.toml", args.name)));
    if path.as_os_str() == "-" {
        print!("{text}");
        return ExitCode::SUCCESS;
    }
    if path.exists() && !args.force {
        eprintln!(
            "error: {} exists; pass --force to replace it",
            path.display()
        );
        return ExitCode::from(2);
    }
    match std::fs::write(&path, text) {
        Ok(()) => {
            eprintln!(
                "wrote {} ({} convention); next: armforge inspect {}",
                path.display(),
                args.convention.word(),
                path.display()
            );
            ExitCode::SUCCESS
        }
        Err(e) => {
            eprintln!("error: cannot write {}: {e}", path.display());
            ExitCode::from(2)
        }
    }
}
