//! `springline`: the command-line front end. Each subcommand lives in its own file and
//! only translates between files / terminal and the statics engine.

mod commands;

use std::process::ExitCode;

const USAGE: &str = "\
springline: concept design of deck-arch bridges (results are for concept design only;
local codes and a licensed engineer govern)

usage:
  springline demo                        print the demo design (JSON)
  springline analyze DESIGN.json         form finding + dead-load analysis of a design (JSON)
  springline analyze --link LINK         the same for the design in a permalink (URL or '#s1...', quoted)
  springline link DESIGN.json            print the permalink fragment ('#s1...') of a design
  springline model DESIGN.json [--truss|--rib]
                                         export a generated model (frame by default) as neutral JSON
  springline solve MODEL.json            solve a neutral analysis model, print results JSON
  springline help                        this text
";

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let result = match args.first().map(String::as_str) {
        Some("demo") => commands::demo::run(&args[1..]),
        Some("analyze") => commands::analyze::run(&args[1..]),
        Some("link") => commands::link::run(&args[1..]),
        Some("model") => commands::model::run(&args[1..]),
        Some("solve") => commands::solve::run(&args[1..]),
        Some("help") | Some("--help") | Some("-h") | None => {
            print!("{USAGE}");
            Ok(())
        }
        Some(other) => Err(anyhow::anyhow!("unknown command '{other}'\n\n{USAGE}")),
    };
    match result {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("springline: {e:#}");
            ExitCode::FAILURE
        }
    }
}
