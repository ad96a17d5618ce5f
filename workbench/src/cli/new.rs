//! `armforge new`: write a commented starting description for a new arm.

use std::path::PathBuf;

use armforge_workbench::scaffold::{
    arm_name_problem, parse_convention, starting_description, Convention,
};

use super::io::exit;
use super::io::files::{self, Replace, Written};
use super::io::terminal::{fail, say, Outcome};

/// Arguments of `armforge new`.
#[derive(clap::Args, Debug)]
#[command(after_help = super::io::exit::TABLE)]
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
pub fn run(args: Args) -> Outcome {
    if let Some(problem) = arm_name_problem(&args.name) {
        return Err(fail(
            exit::USAGE,
            &format!("arm name: {problem} (it becomes a Rust module name)"),
        ));
    }
    let text = starting_description(&args.name, args.convention);
    let path = args
        .output
        .unwrap_or_else(|| PathBuf::from(format!("{}.toml", args.name)));
    let replace = if args.force {
        Replace::Yes
    } else {
        Replace::No
    };
    let written = files::write(&path, &text, &[], replace)?;
    if written == Written::Written && files::Destination::of(&path) != files::Destination::Stdout {
        say(&format!(
            "{} convention; next: armforge inspect {}",
            args.convention.word(),
            files::shown(&path)
        ));
    }
    Ok(exit::code(exit::OK))
}
