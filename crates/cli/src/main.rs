//! `springline`: the command-line front end. Each subcommand lives in its own file under
//! `commands/` and only translates between files / terminal and the statics engine.

mod commands;
mod failure;

use clap::Parser;
use failure::{EXIT_SUCCESS, EXIT_USAGE};
use std::process::ExitCode;

/// Concept design of deck-arch bridges: form finding, analysis, sizing, models and permalinks.
#[derive(Parser)]
#[command(
    name = "springline",
    version,
    about = "Concept design of deck-arch bridges: form finding, analysis, models and permalinks.\n\
             Results are for concept design only; local codes and a licensed engineer govern.",
    after_help = "\
A path given as `-` reads standard input. Output is JSON (a link for `link`, CSV for `influence`) on standard output;
messages go to standard error as `springline: <message>`.

Exit codes:
  0  success
  1  the engine refused the input: an invalid design or model, a mechanism, an unreadable
     link, or file content that is not a design or model
  2  usage error: unknown command, missing, unknown or conflicting arguments
  3  a file, standard input or standard output could not be read or written",
    max_term_width = 100,
    subcommand_required = true,
    arg_required_else_help = true
)]
struct Cli {
    #[command(subcommand)]
    command: commands::Command,
}

fn main() -> ExitCode {
    let cli = match Cli::try_parse() {
        Ok(cli) => cli,
        // help and version go to stdout and succeed; every other clap error is a usage error
        Err(e) => {
            let _ = e.print();
            return ExitCode::from(if e.use_stderr() { EXIT_USAGE } else { EXIT_SUCCESS });
        }
    };
    match cli.command.run() {
        Ok(()) => ExitCode::SUCCESS,
        Err(failure) => {
            eprintln!("springline: {failure}");
            failure.exit_code()
        }
    }
}
