//! The `armforge` command line.

mod cli;

use std::process::ExitCode;

use clap::{Parser, Subcommand};

/// armforge: closed-form inverse-kinematics solvers from arm descriptions.
#[derive(Parser, Debug)]
#[command(name = "armforge", version, about, after_help = cli::io::exit::TABLE)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand, Debug)]
enum Command {
    /// Tool poses for joint values (JSON lines on stdin → JSON lines on stdout).
    Forward(cli::forward::Args),
    /// Classify an arm's geometry and report the evidence, or why it has no decoupled closed form.
    Inspect(cli::inspect::Args),
    /// Write the arm's solver as a Rust module.
    Emit(cli::emit::Args),
    /// Every joint solution for tool poses (JSON lines on stdin → JSON lines on stdout).
    Solve(cli::solve::Args),
    /// Write a Markdown review sheet of the arm's solver.
    Explain(cli::explain::Args),
    /// Round-trip random configurations through the solver and report the errors.
    Verify(cli::verify::Args),
    /// Draw the arm (and every solution of a pose) as SVG.
    Draw(cli::draw::Args),
    /// Write a commented starting description for a new arm.
    New(cli::new::Args),
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    let outcome = match cli.command {
        Command::Forward(a) => cli::forward::run(a),
        Command::Inspect(a) => cli::inspect::run(a),
        Command::Emit(a) => cli::emit::run(a),
        Command::Solve(a) => cli::solve::run(a),
        Command::Explain(a) => cli::explain::run(a),
        Command::Verify(a) => cli::verify::run(a),
        Command::Draw(a) => cli::draw::run(a),
        Command::New(a) => cli::new::run(a),
    };
    outcome.unwrap_or_else(|stopped| stopped)
}
