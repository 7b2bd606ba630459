//! `springline analyze DESIGN.json`: form finding and dead-load analysis of a design.

use super::{print_json, read_design};
use springline_statics::analyze;

pub fn run(args: &[String]) -> anyhow::Result<()> {
    let [path] = args else { anyhow::bail!("usage: springline analyze DESIGN.json   (- reads standard input)") };
    let design = read_design(path)?;
    print_json(&analyze(&design)?)
}
