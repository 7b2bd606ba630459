//! `springline modes DESIGN.json [--modes N] [--text]`: the frame model's buckling modes
//! under the dead load and its natural frequencies, with their shapes for plotting.

use super::{print_json, print_line, read_design};
use crate::failure::Failure;
use springline_statics::arch::stability::{arch_stability, ArchStability};
use springline_statics::frame::stability::MAX_MODES;
use springline_statics::ValidDesign;
use std::path::PathBuf;

/// Buckling modes under the dead load and natural frequencies of a design, in its plane.
///
/// The frame model with every member split into four elements: the critical load factors
/// alpha_cr of the dead load (linear buckling, elastic plus geometric stiffness) and the
/// natural frequencies with the dead load's masses (lumped, no rotational inertia), each
/// mode with its shape at the model's nodes and at the split members' inner nodes (for
/// plotting), the verdict on alpha_cr (EN 1993-1-1 5.2.1) and, for a footbridge crowd, the
/// comfort flag. Out-of-plane buckling and sway are not covered. For concept design only:
/// local codes and a licensed engineer govern.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline demo | springline modes -
  springline modes design.json --modes 5 --text")]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: PathBuf,

    /// How many modes of each kind.
    #[arg(long = "modes", value_name = "N", default_value_t = 3)]
    modes: usize,

    /// A short text summary instead of JSON.
    #[arg(long)]
    text: bool,
}

/// Reads the design, finds its modes and prints them.
pub fn run(args: Args) -> Result<(), Failure> {
    if !(1..=MAX_MODES).contains(&args.modes) {
        return Err(Failure::refused(format!("--modes {}: ask for 1 to {MAX_MODES} modes", args.modes)));
    }
    let design = read_design(&args.design)?;
    let valid = ValidDesign::new(&design)?;
    let s = arch_stability(&valid, args.modes)?;
    if args.text {
        print_line(&text_summary(&design.name, &s))
    } else {
        print_json(&s)
    }
}

/// A few lines for people: alpha_cr of each buckling mode, each frequency, the verdict,
/// the flag and the notes.
pub fn text_summary(name: &str, s: &ArchStability) -> String {
    let mut out = vec![format!("{name} — in-plane buckling (dead load) and natural frequencies")];
    for (k, m) in s.dead.modes.iter().enumerate() {
        let what = match s.buckling_members.get(k).cloned().flatten() {
            Some(member) => format!("{member} buckles between its ends"),
            None => "the arch as a whole".into(),
        };
        out.push(format!("  buckling mode {}: alpha_cr {:.3} ({what})", k + 1, m.load_factor));
    }
    match s.arch.mode {
        Some(_) => out.push(format!(
            "  the arch's own lowest mode (posts and diagonals kept whole): alpha_cr {:.3}",
            s.arch.alpha_cr
        )),
        None => out.push(format!(
            "  the arch's own lowest mode (posts and diagonals kept whole): alpha_cr above {:.3}",
            s.arch.alpha_cr
        )),
    }
    for (k, m) in s.vibration.modes.iter().enumerate() {
        let kind = if m.vertical_share > 0.5 { "vertical" } else { "horizontal" };
        out.push(format!(
            "  vibration mode {}: {:.3} Hz ({kind}, {:.0} % vertical)",
            k + 1,
            m.frequency,
            100.0 * m.vertical_share
        ));
    }
    out.push(s.verdict.clone());
    if let Some(flag) = &s.footbridge {
        out.push(format!("footbridge: {flag}"));
    }
    out.extend(s.notes.iter().cloned());
    out.push(format!("({})", s.caution));
    out.join("\n")
}
