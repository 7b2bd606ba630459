//! `springline demo`: print the demo design as JSON.

use super::print_json;
use crate::failure::Failure;
use springline_statics::Design;

/// Print the demo design as JSON.
///
/// The demo is the invented Tarnvale Gorge road bridge; save it as a starting point for
/// a design of your own.
#[derive(clap::Args)]
#[command(after_help = "Example:\n  springline demo > design.json")]
pub struct Args {}

/// Prints the demo design as pretty JSON on standard output.
pub fn run(Args {}: Args) -> Result<(), Failure> {
    print_json(&demo_design())
}

/// The engine's demo design.
fn demo_design() -> Design {
    Design::demo()
}
