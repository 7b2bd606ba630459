//! `springline export DESIGN.json --svg FILE --csv FILE ...`: the files a design is taken
//! out of the meeting in, the same bytes the app's Export panel writes.

use super::read_design;
use crate::failure::Failure;
use springline_statics::export::{export, Export, DRAWING_SIZE};
use std::path::{Path, PathBuf};

/// Write the design's drawings (SVG), member table (CSV) and design file with its summary
/// (JSON).
///
/// The elevation and the force diagram are drawn under the dead load at 1200 x 640 CSS px
/// in SI units, every member an element named as in `springline model` (id
/// `member-NAME`, its group in `data-group`), with the key, dimensions, scale and
/// caution. The member table has one row per frame-model member: its axial force under
/// each load case, its ULS envelope, section, utilisation, governing mode, combination
/// and traffic placement, every unit in the header. The design file reads back in any
/// version of Springline; its `summary` (key numbers, quantities, foundation demand,
/// stability) is for people. For concept design only: local codes and a licensed engineer
/// govern.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline export design.json --svg elevation.svg --csv members.csv
  springline export design.json --force-svg forces.svg --json design-with-summary.json")]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: PathBuf,

    /// The elevation as SVG, written here.
    #[arg(long, value_name = "FILE.svg")]
    svg: Option<PathBuf>,

    /// The force diagram as SVG, written here.
    #[arg(long, value_name = "FILE.svg")]
    force_svg: Option<PathBuf>,

    /// The member table as CSV, written here.
    #[arg(long, value_name = "FILE.csv")]
    csv: Option<PathBuf>,

    /// The design file with its summary as JSON, written here.
    #[arg(long, value_name = "FILE.json")]
    json: Option<PathBuf>,
}

/// Reads the design and writes every file asked for (at least one).
pub fn run(args: Args) -> Result<(), Failure> {
    let (w, h) = DRAWING_SIZE;
    let wanted: Vec<(&Path, Export)> = [
        (args.svg.as_deref(), Export::ElevationSvg { width: w, height: h }),
        (args.force_svg.as_deref(), Export::ForceSvg { width: w, height: h }),
        (args.csv.as_deref(), Export::MemberTable),
        (args.json.as_deref(), Export::DesignFile),
    ]
    .into_iter()
    .filter_map(|(path, what)| Some((path?, what)))
    .collect();
    if wanted.is_empty() {
        return Err(Failure::Refused(anyhow::anyhow!(
            "nothing to export: give --svg, --force-svg, --csv or --json with a file name"
        )));
    }
    let design = read_design(&args.design)?;
    // every file made before any is written: a refused export leaves no partial set
    let texts: Vec<(&Path, String)> = wanted
        .into_iter()
        .map(|(path, what)| Ok((path, export(&design, what)?)))
        .collect::<Result<_, Failure>>()?;
    for (path, text) in texts {
        std::fs::write(path, text)
            .map_err(|e| Failure::Io(anyhow::anyhow!("cannot write '{}': {e}", path.display())))?;
    }
    Ok(())
}
