//! One file per subcommand, each with its arguments (clap derive) and its `run`; the
//! helpers they share for reading input and printing JSON.

pub mod analyze;
pub mod demo;
pub mod export;
pub mod influence;
pub mod link;
pub mod model;
pub mod modes;
pub mod seek;
pub mod size;
pub mod solve;
pub mod sweep;

use crate::failure::Failure;
use anyhow::anyhow;
use serde::Serialize;
use springline_statics::Design;
use std::io::{Read, Write};
use std::path::Path;

/// The subcommands of `springline`.
#[derive(clap::Subcommand)]
pub enum Command {
    Demo(demo::Args),
    Analyze(analyze::Args),
    Link(link::Args),
    Model(model::Args),
    Solve(solve::Args),
    Influence(influence::Args),
    Size(size::Args),
    Modes(modes::Args),
    Sweep(sweep::Args),
    Seek(seek::Args),
    Export(export::Args),
}

impl Command {
    /// Runs the chosen subcommand.
    pub fn run(self) -> Result<(), Failure> {
        match self {
            Command::Demo(args) => demo::run(args),
            Command::Analyze(args) => analyze::run(args),
            Command::Link(args) => link::run(args),
            Command::Model(args) => model::run(args),
            Command::Solve(args) => solve::run(args),
            Command::Influence(args) => influence::run(args),
            Command::Size(args) => size::run(args),
            Command::Modes(args) => modes::run(args),
            Command::Sweep(args) => sweep::run(args),
            Command::Seek(args) => seek::run(args),
            Command::Export(args) => export::run(args),
        }
    }
}

/// Units and sign conventions, stated in every JSON the CLI prints.
#[derive(Serialize)]
pub struct Conventions {
    pub units: &'static str,
    pub axes: &'static str,
    pub axial_force: &'static str,
    pub bending_moment: &'static str,
    pub caution: &'static str,
}

/// The conventions of the statics engine.
pub const CONVENTIONS: Conventions = Conventions {
    units: "lengths m, forces kN, moments kNm, distributed loads kN/m, E and stresses kN/m2, rotations rad",
    axes: "x to the right, y up; moments and rotations positive anticlockwise; reactions act on the structure",
    axial_force: "N: tension positive, compression negative",
    bending_moment: "M: positive when the fibre on the right of the member, looking from its start node to its end node, is in tension (sagging for members drawn left to right); V = dM/ds",
    caution: "results are for concept design; local codes and a licensed engineer govern",
};

/// Whether a path argument means standard input.
fn is_stdin(path: &Path) -> bool {
    path.as_os_str() == "-"
}

/// How a path argument is named in messages: `standard input` for `-`, else the
/// path in quotes.
pub fn source_name(path: &Path) -> String {
    if is_stdin(path) {
        "standard input".to_string()
    } else {
        format!("'{}'", path.display())
    }
}

/// Reads a whole file (`-`: standard input) as UTF-8 text.
///
/// A file that cannot be opened or read is an IO failure (exit 3) naming the path;
/// bytes that are not UTF-8 are content the command cannot use (exit 1).
pub fn read_text(path: &Path) -> Result<String, Failure> {
    let name = source_name(path);
    let bytes = if is_stdin(path) {
        let mut bytes = Vec::new();
        std::io::stdin()
            .read_to_end(&mut bytes)
            .map_err(|e| Failure::Io(anyhow!(e).context(format!("cannot read {name}"))))?;
        bytes
    } else {
        std::fs::read(path).map_err(|e| Failure::Io(anyhow!(e).context(format!("cannot read {name}"))))?
    };
    String::from_utf8(bytes)
        .map_err(|e| Failure::Refused(anyhow!(e).context(format!("{name} is not UTF-8 text"))))
}

/// Reads a design JSON file (`-`: standard input).
pub fn read_design(path: &Path) -> Result<Design, Failure> {
    let text = read_text(path)?;
    design_from_json(&text)
        .map_err(|e| Failure::Refused(e.context(format!("{} is not a valid design file", source_name(path)))))
}

/// The engine's reading of a design file's text: every earlier format version is
/// migrated to the current one.
fn design_from_json(text: &str) -> anyhow::Result<Design> {
    Ok(springline_statics::arch::design_file::read_design_json(text)?)
}

/// Prints a value as pretty JSON on standard output.
pub fn print_json<T: Serialize>(value: &T) -> Result<(), Failure> {
    let text = serde_json::to_string_pretty(value)
        .map_err(|e| Failure::Refused(anyhow!(e).context("the result cannot be written as JSON")))?;
    print_line(&text)
}

/// Prints one line on standard output. A closed pipe (for example `| head`) is not an
/// error; any other write failure is an IO failure (exit 3).
pub fn print_line(text: &str) -> Result<(), Failure> {
    let mut out = std::io::stdout().lock();
    match writeln!(out, "{text}").and_then(|()| out.flush()) {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        other => other.map_err(|e| Failure::Io(anyhow!(e).context("cannot write to standard output"))),
    }
}
