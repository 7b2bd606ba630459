//! `springline demo`: print the demo design as JSON.

use super::print_json;
use springline_statics::Design;

pub fn run(args: &[String]) -> anyhow::Result<()> {
    anyhow::ensure!(args.is_empty(), "usage: springline demo");
    print_json(&Design::demo())
}
