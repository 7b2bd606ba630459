//! `springline influence DESIGN.json --of WHAT [--step M]`: one influence line of the
//! frame model as CSV.

use super::{print_line, read_design};
use crate::failure::Failure;
use springline_statics::arch::influence::{influence_of, ArchLine};
use springline_statics::{Design, StaticsError, ValidDesign};
use std::path::PathBuf;

/// Print an influence line of the frame model as CSV.
///
/// A unit load (1 kN down) marches along the deck from seat to seat; each row gives its
/// position x (m) and the value of the chosen quantity per unit load. The header line
/// names the quantity, its sign and its units. WHAT is `thrust` (left springing H,
/// outward push), `thrust-right`, `v-left`, `v-right` (vertical, downward push),
/// `m-left`, `m-right` (springing moments of a fixed rib), a member's name as the model
/// gives it (its axial force, tension positive; `springline model` lists the names), a
/// frame member's name with `/m-start` or `/m-end` (its end moment), or with `/m-mid` for
/// a member carrying the deck (its moment at mid-length). Values are for the whole
/// cross-section, for concept design only.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline influence design.json --of thrust
  springline influence design.json --of 'rib 0-1' --step 0.25
  springline demo | springline influence - --of v-right")]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: PathBuf,

    /// The quantity: thrust, thrust-right, v-left, v-right, m-left, m-right, a member's
    /// name, or a frame member's name with /m-start, /m-end or (deck members) /m-mid.
    #[arg(long, value_name = "WHAT")]
    of: String,

    /// Distance between load positions along the deck, m (every deck node is a position
    /// too).
    #[arg(long, value_name = "M", default_value_t = 0.5)]
    step: f64,
}

/// Reads the design, computes the influence line and prints it as CSV: a header line,
/// then one `x,value` row per load position. An unknown WHAT or a bad step is refused
/// (exit 1) with the accepted names.
pub fn run(args: Args) -> Result<(), Failure> {
    let design = read_design(&args.design)?;
    let (header, rows) = influence_table(&design, &args.of, args.step)?;
    let mut text = header;
    for (x, value) in rows {
        text.push('\n');
        text.push_str(&format!("{x:.3},{}", six_decimals(value)));
    }
    print_line(&text)
}

/// A value with six decimals, without a minus sign on a printed zero.
fn six_decimals(value: f64) -> String {
    let s = format!("{value:.6}");
    if s == "-0.000000" {
        "0.000000".to_string()
    } else {
        s
    }
}

/// The engine's influence line of the frame model: the CSV header line and the
/// (x, value) rows.
fn influence_table(
    design: &Design,
    what: &str,
    step: f64,
) -> Result<(String, Vec<(f64, f64)>), StaticsError> {
    let valid = ValidDesign::new(design)?;
    let generated = springline_statics::frame_model(&valid);
    // name the line before solving, so an unknown name is refused at once
    let line = ArchLine::parse(what, &generated)?;
    let influence = influence_of(generated, Some(step))?;
    let values = influence.ordinates(&line)?;
    let header = format!("x of the unit load along the deck (m),{}", line.header(&influence.generated));
    Ok((header, influence.lines.positions.iter().copied().zip(values).collect()))
}
