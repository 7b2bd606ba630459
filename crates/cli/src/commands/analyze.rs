//! `springline analyze DESIGN.json` or `springline analyze --link LINK`: form finding and
//! analysis of a design under the standard load cases, read from a file or from a
//! permalink.

use super::{print_json, read_design};
use crate::failure::Failure;
use springline_statics::link::permalink;
use springline_statics::{analyze, Analysis, Design, StaticsError};
use std::path::PathBuf;

/// Analyse a design: form, models, load cases, force diagram, thrust line (JSON).
///
/// Finds the rib that carries the deck in pure compression, generates the frame model,
/// the truss idealisation and the bare rib, and solves them under the dead load, a
/// half-span live load and a doubled panel load. The design comes from a file or from a
/// permalink (`--link`), exactly one of the two.
#[derive(clap::Args)]
#[command(group(clap::ArgGroup::new("source").required(true).multiple(false).args(["design", "link"])))]
#[command(after_help = "\
Examples:
  springline analyze design.json
  springline demo | springline analyze -
  springline analyze --link '#s2.eNp1...'
  springline analyze --summary design.json")]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: Option<PathBuf>,

    /// Read the design from a permalink instead: a whole URL, its `#s2...` fragment or
    /// the payload alone (quote it in the shell).
    #[arg(long, value_name = "LINK")]
    link: Option<String>,

    /// Print only the summary: the key numbers (span, rise, form thrust, springing thrust
    /// per case and side, thrust range, largest member forces, ...) that the app's results
    /// table shows.
    #[arg(long)]
    summary: bool,
}

/// Reads the design (file, standard input or permalink), analyses it and prints the
/// analysis as pretty JSON. A refused design or link is exit 1, an unreadable file exit 3.
pub fn run(args: Args) -> Result<(), Failure> {
    let design = match (args.design, args.link) {
        (_, Some(link)) => design_from_link(&link)?,
        (Some(path), None) => read_design(&path)?,
        // clap lets exactly one of the two through (group `source`); this arm only keeps
        // the match total
        (None, None) => return Err(Failure::refused("give a design file or --link")),
    };
    let analysis = analysis_of(&design)?;
    if args.summary {
        print_json(&analysis.summary)
    } else {
        print_json(&analysis)
    }
}

/// The engine's reading of a permalink.
fn design_from_link(link: &str) -> Result<Design, StaticsError> {
    permalink::decode(link)
}

/// The engine's analysis of a design.
fn analysis_of(design: &Design) -> Result<Analysis, StaticsError> {
    analyze(design)
}
