//! `springline sweep DESIGN.json --vary NAME=RANGE [--vary NAME=RANGE] [--size] [--json]`:
//! the key numbers of every option of a one-parameter sweep or a two-parameter grid.

use super::{print_json, print_line, read_design};
use crate::failure::Failure;
use springline_statics::arch::sweep::{parse_axis, sweep, to_csv, Axis};
use std::path::PathBuf;

/// Sweep one parameter of a design (or two as a grid) and print each option's key numbers.
///
/// NAME is rise-ratio, panels, springing-level, ribs or rib-system; RANGE is FROM:TO:COUNT
/// (COUNT values, both ends included) or a list V1,V2,... (rib systems by name:
/// three-hinged, two-hinged, fixed). Each option is validated, analysed and its traffic
/// envelopes found: form thrust, the design thrust range and the largest design force of
/// a rib, post and bracing member over the ultimate combinations; with --size also steel,
/// concrete and the cost index. An option that fails is a row with its reason. What stays
/// fixed and what follows is in the JSON's `held` and the README. CSV by default (columns
/// named with their units), JSON with --json. For concept design only: local codes and a
/// licensed engineer govern.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline sweep design.json --vary rise-ratio=0.10:0.20:21
  springline sweep design.json --vary panels=8:16:5 --vary rib-system=two-hinged,fixed --size
  springline demo | springline sweep - --vary ribs=1,2,3 --json")]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: PathBuf,

    /// A parameter and its values: NAME=FROM:TO:COUNT or NAME=V1,V2,... (once, or twice
    /// for a grid).
    #[arg(long = "vary", value_name = "NAME=RANGE", required = true, num_args = 1)]
    vary: Vec<String>,

    /// Size each option too (steel, concrete, cost index).
    #[arg(long)]
    size: bool,

    /// JSON instead of CSV.
    #[arg(long)]
    json: bool,
}

/// Reads the design and the ranges, sweeps and prints.
pub fn run(args: Args) -> Result<(), Failure> {
    let design = read_design(&args.design)?;
    let axes: Vec<Axis> = args.vary.iter().map(|v| parse_axis(v)).collect::<Result<_, _>>()?;
    let result = sweep(&design, &axes, args.size)?;
    if args.json {
        print_json(&result)
    } else {
        print_line(&to_csv(&result))
    }
}
