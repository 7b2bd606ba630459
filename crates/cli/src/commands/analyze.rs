//! `springline analyze DESIGN.json` or `springline analyze --link LINK`: form finding and
//! dead-load analysis of a design, read from a file or from a permalink.

use super::{print_json, read_design};
use springline_statics::analyze;
use springline_statics::link::permalink;

pub fn run(args: &[String]) -> anyhow::Result<()> {
    let design = match args {
        [flag, link] if flag == "--link" => permalink::decode(link)?,
        [path] if path != "--link" => read_design(path)?,
        _ => anyhow::bail!(
            "usage: springline analyze DESIGN.json   (- reads standard input)\n       \
             springline analyze --link LINK      (a whole URL or its '#s1...' fragment, quoted)"
        ),
    };
    print_json(&analyze(&design)?)
}
