//! `springline link DESIGN.json`: print the permalink fragment of a design.

use super::{print_line, read_design, source_name};
use crate::failure::Failure;
use springline_statics::link::permalink;
use springline_statics::{validate_design, Design, StaticsError};
use std::path::PathBuf;

/// Print the permalink fragment of a design.
///
/// The fragment (`#s2...`) holds the whole design: `analyze --link` and the app open it
/// to the same numbers. A design that fails validation is refused, since its link would
/// not open.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline link design.json
  springline demo | springline link -")]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: PathBuf,
}

/// Reads and validates a design and prints its permalink fragment (`#s2...`) as one
/// line. A design that fails validation is refused (exit 1): its link would not open.
pub fn run(args: Args) -> Result<(), Failure> {
    let design = read_design(&args.design)?;
    let fragment = link_of(&design).map_err(|e| {
        Failure::Refused(
            anyhow::Error::new(e)
                .context(format!("{} cannot be linked: fix the design first", source_name(&args.design))),
        )
    })?;
    print_line(&format!("#{fragment}"))
}

/// The engine's permalink payload of a design, after the validation that makes sure the
/// link opens again.
fn link_of(design: &Design) -> Result<String, StaticsError> {
    validate_design(design)?;
    Ok(permalink::encode(design))
}
