//! One file per subcommand.

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
pub fn print_json<T: Serialize>(value: &T) -> anyhow::Result<()> {
    println!("{}", serde_json::to_string_pretty(value)?);
    Ok(())
}
