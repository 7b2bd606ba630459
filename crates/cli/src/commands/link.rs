//! `springline link DESIGN.json`: print the permalink fragment of a design.

use super::read_design;
use anyhow::Context;
use springline_statics::link::permalink;
use springline_statics::validate_design;

pub fn run(args: &[String]) -> anyhow::Result<()> {
    let [path] = args else { anyhow::bail!("usage: springline link DESIGN.json   (- reads standard input)") };
    let design = read_design(path)?;
    // a link opens only a valid design: refuse to print one that would not open
    validate_design(&design).with_context(|| format!("'{path}' cannot be linked: fix the design first"))?;
    use std::io::Write;
    match writeln!(std::io::stdout().lock(), "#{}", permalink::encode(&design)) {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        other => Ok(other?),
    }
}
