//! One file per subcommand.

pub mod analyze;
pub mod demo;
pub mod link;
pub mod model;
pub mod solve;

use anyhow::Context;
use serde::Serialize;

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

/// Reads a whole file as text, naming it in the error.
pub fn read_text(path: &str) -> anyhow::Result<String> {
    std::fs::read_to_string(path).with_context(|| format!("cannot read '{path}'"))
}

/// Prints a value as pretty JSON on standard output.
/// A closed pipe (for example `| head`) is not an error.
pub fn print_json<T: Serialize>(value: &T) -> anyhow::Result<()> {
    use std::io::Write;
    let text = serde_json::to_string_pretty(value)?;
    match writeln!(std::io::stdout().lock(), "{text}") {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        other => Ok(other?),
    }
}

/// Reads a design JSON file (`-` for standard input).
pub fn read_design(path: &str) -> anyhow::Result<springline_statics::Design> {
    let text = if path == "-" {
        let mut s = String::new();
        std::io::Read::read_to_string(&mut std::io::stdin(), &mut s)?;
        s
    } else {
        read_text(path)?
    };
    serde_json::from_str(&text).with_context(|| format!("'{path}' is not a valid design file"))
}
