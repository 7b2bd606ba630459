//! `springline size DESIGN.json [--text | --adopted]`: member sizes and utilisations from
//! the traffic envelopes, quantities and cost index, foundation demand and thrust blocks.

use super::{print_json, print_line, read_design};
use crate::failure::Failure;
use springline_statics::arch::design_file::write_design_json;
use springline_statics::arch::massing::{massing_loop, MassingReport, DEFAULT_MASSING_PASSES};
use springline_statics::arch::options::key_numbers;
use springline_statics::arch::sizing::{adopt_sizes, size_of, GroupOutcome, SizeReport};
use std::path::PathBuf;

/// Size the member groups, weigh the design and size its thrust blocks.
///
/// Each group is sized in its family and material (the design's `sizing`), one section
/// per group, from the frame model's envelopes over the ultimate combinations, per rib
/// line; a group kept as typed is checked. Prints JSON: every group's section and largest
/// utilisation, every member's demand, buckling lengths, utilisation, governing mode,
/// combination and traffic placement; quantities (length, volume, mass per group; deck
/// slab, cross-girders, thrust blocks; steel tonnage, concrete and glulam volume, cost
/// index); foundation demand at each springing (thrust, vertical, resultant and its
/// angle and range, a fixed rib's moment) with its thrust block. For concept design only:
/// local codes and a licensed engineer govern.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline demo | springline size -
  springline size design.json --text
  springline size design.json --adopted > sized.json
  springline size design.json --key-numbers")]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: PathBuf,

    /// A short text summary instead of JSON.
    #[arg(long, conflicts_with = "adopted")]
    text: bool,

    /// Print the design file with every sized group's section adopted (area, I, depth, E
    /// and unit weight), instead of the report.
    #[arg(long)]
    adopted: bool,

    /// Print only the design's key numbers as the app's comparison of options shows them
    /// (geometry, thrusts, springing demand, largest forces, alpha_cr, quantities,
    /// feasible or why not).
    #[arg(long, conflicts_with_all = ["text", "adopted", "settle"])]
    key_numbers: bool,

    /// Size, adopt the sizes and size again (their weight changes the form and the
    /// forces) until no section changes or PASSES passes are made; reports every pass.
    #[arg(long)]
    settle: bool,

    /// Most passes with --settle.
    #[arg(long, value_name = "PASSES", default_value_t = DEFAULT_MASSING_PASSES, requires = "settle")]
    passes: usize,
}

/// Reads the design, sizes it and prints the report (or the adopted design); with
/// `--settle`, the massing loop's passes and its last report.
pub fn run(args: Args) -> Result<(), Failure> {
    let design = read_design(&args.design)?;
    if args.key_numbers {
        return print_json(&key_numbers(&design, true));
    }
    if args.settle {
        let settled = massing_loop(&design, args.passes)?;
        return if args.adopted {
            print_line(write_design_json(&settled.design).trim_end())
        } else if args.text {
            print_line(&settled_summary(&settled))
        } else {
            print_json(&settled)
        };
    }
    let report = size_of(&design)?;
    if args.adopted {
        print_line(write_design_json(&adopt_sizes(&design, &report.sizing)).trim_end())
    } else if args.text {
        print_line(&text_summary(&report))
    } else {
        print_json(&report)
    }
}

/// A few lines for people: each group's section and utilisation, the totals, and each
/// springing's demand and block.
pub fn text_summary(r: &SizeReport) -> String {
    let mut out = vec![format!(
        "{} — sizing (per rib line, {}; form found for {})",
        r.design,
        r.sizing.combinations.join(", "),
        r.form_basis
    )];
    for g in &r.sizing.groups {
        let section = match &g.outcome {
            GroupOutcome::Sized { label, .. } => format!("{label} ({})", g.material),
            GroupOutcome::AsTyped => format!("as typed ({})", g.material),
            GroupOutcome::NoMembers => "no members in this design".into(),
            GroupOutcome::NotSized { reason } => format!("NOT SIZED: {reason}"),
        };
        let used = match (&g.utilisation, &g.governing_member) {
            (Some(u), Some(m)) => format!("utilisation {u:.2} ({m})"),
            _ => "no utilisation".into(),
        };
        out.push(format!("  {:<8} {section}; {used}", g.group));
    }
    out.extend(stability_lines(r));
    let q = &r.quantities;
    out.push(format!(
        "quantities: steel {:.1} t, concrete {:.1} m3, glulam {:.1} m3, thrust blocks {:.1} m3; cost index {:.0}",
        q.steel, q.concrete, q.glulam, q.foundation, q.cost_index
    ));
    for s in &r.foundations.springings {
        out.push(format!(
            "{} springing: H {:.0} kN, V {:.0} kN, R {:.0} kN at {:.1} deg (range {:.1} to {:.1} deg); block {:.1} x {:.1} \
             x {:.1} m = {:.0} m3 ({:.1} m2 at {:.0} kN/m2)",
            s.side,
            s.thrust,
            s.vertical,
            s.resultant,
            s.angle,
            s.angle_range.min,
            s.angle_range.max,
            s.block.width,
            s.block.length,
            s.block.thickness,
            s.block.volume,
            s.block.bearing_area,
            r.foundations.allowable_bearing
        ));
    }
    out.push(format!("({}; {})", r.units, r.caution));
    out.join("\n")
}

/// The stability part of the text summary: the arch's alpha_cr at the rib's section,
/// each analysed case's, the dead load's and the lowest frequencies.
fn stability_lines(r: &SizeReport) -> Vec<String> {
    let mut out = Vec::new();
    match (&r.sizing.rib_stability, &r.sizing.rib_stability_failure) {
        (Some(st), _) => {
            let at_section = r.sizing.rib_alpha_cr.unwrap_or(st.alpha_cr);
            out.push(format!(
                "rib stability: the arch's alpha_cr {at_section:.2} with the rib's section (analysed {:.2}; at least \
                 {} accepted); per case analysed:",
                st.alpha_cr, st.least
            ));
            for c in &st.cases {
                let arch = match c.arch.mode {
                    Some(_) => format!("{:.2}", c.arch.alpha_cr),
                    None => format!("above {:.2}", c.arch.alpha_cr),
                };
                out.push(format!(
                    "  arch alpha_cr {arch}; lowest {:.2} ({}) — {}: {}",
                    c.alpha_cr, c.first_mode, c.combination, c.placement
                ));
            }
        }
        (None, Some(why)) => {
            out.push(format!("rib stability not analysed ({why}): the arch table's length is used"))
        }
        (None, None) => {}
    }
    match (&r.stability, &r.stability_failure) {
        (Some(s), _) => {
            out.push(format!("dead load: {}", s.verdict));
            let f: Vec<String> = s
                .frequencies
                .iter()
                .map(|f| {
                    format!(
                        "{:.2} Hz ({})",
                        f.hz,
                        if f.vertical_share > 0.5 { "vertical" } else { "horizontal" }
                    )
                })
                .collect();
            out.push(format!("natural frequencies: {}", f.join(", ")));
            if let Some(flag) = &s.footbridge {
                out.push(format!("footbridge: {flag}"));
            }
            out.push(
                "out-of-plane buckling and lateral sway are beyond this plane model: not covered".into(),
            );
        }
        (None, Some(why)) => out.push(format!("buckling and frequencies not found: {why}")),
        (None, None) => {}
    }
    out
}

/// The massing loop for people: each pass's thrust, steel and what it changed, whether it
/// settled, then the last pass's summary.
pub fn settled_summary(m: &MassingReport) -> String {
    let mut out = vec![format!(
        "massing loop: {} after {} pass{}",
        if m.converged { "settled" } else { "NOT settled" },
        m.passes,
        if m.passes == 1 { "" } else { "es" }
    )];
    for p in &m.history {
        out.push(format!(
            "  pass {}: form thrust {:.0} kN, steel {:.1} t, concrete {:.1} m3; changed {}",
            p.pass, p.form_thrust, p.steel, p.concrete, p.changed
        ));
    }
    if !m.converged {
        out.push(format!("stopped: {}", m.last_change));
    }
    out.push(text_summary(&m.report));
    out.join("\n")
}
