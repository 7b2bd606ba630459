//! `springline analyze DESIGN.json` or `springline analyze --link LINK`: form finding and
//! analysis of a design under the standard load cases, read from a file or from a
//! permalink.

use super::{print_json, read_design};
use crate::failure::Failure;
use serde::Serialize;
use springline_statics::arch::actions::{action_cases, ActionResult, Braking};
use springline_statics::arch::analysis::analyze_with;
use springline_statics::arch::cases::{pattern_case, Pattern};
use springline_statics::arch::traffic::{
    placement_case, traffic_envelopes, Deflection, LineEnvelope, TrafficReport,
};
use springline_statics::link::permalink;
use springline_statics::{Analysis, CaseSpec, Design, ModelKind, StaticsError, Summary, ValidDesign};
use std::path::PathBuf;

/// Analyse a design: form, models, load cases, force diagram, thrust line (JSON).
///
/// Finds the rib that carries the deck in pure compression, generates the frame model,
/// the truss idealisation and the bare rib, and solves them under the dead load, the
/// traffic's uniform load on the left half and a doubled panel load. Then the traffic of the design's load
/// model: for every influence line of the frame model (and of the truss idealisation
/// when braced) the envelope of the traffic (max, min and the placement that governs
/// each), the permanent effect and the design extremes of every combination; springing
/// forces for the whole cross-section, member forces per rib line (the sharing rule is
/// in `traffic.frame.sharing.rule`). The design comes from a file or from a permalink
/// (`--link`), exactly one of the two.
#[derive(clap::Args)]
#[command(group(clap::ArgGroup::new("source").required(true).multiple(false).args(["design", "link"])))]
#[command(after_help = "\
Examples:
  springline analyze design.json
  springline demo | springline analyze -
  springline analyze --link '#s2.eNp1...'
  springline analyze --summary design.json
  springline analyze --pattern quarter-2 --pattern vehicle-at-60 design.json
  springline analyze --pattern governing:thrust:max design.json
  springline analyze --pattern temperature-rise --pattern erection design.json")]
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
    /// table shows, with the traffic's load model, lanes, sharing rule and thrust range.
    #[arg(long)]
    summary: bool,

    /// Add a load case of a named traffic pattern (repeatable): full, half-left,
    /// half-right, quarter-1 .. quarter-4, panel-N, vehicle-at-X (leading axle at x = X m),
    /// or governing:LINE:max / governing:LINE:min (the placement that gives that extreme
    /// of LINE's envelope in the frame model; LINE as `springline influence --of` takes it),
    /// or one of the other actions alone: temperature-rise, temperature-fall, deck-warmer,
    /// deck-cooler, springing-movement, braking, erection.
    #[arg(long = "pattern", value_name = "PATTERN")]
    patterns: Vec<String>,
}

/// The whole report: the analysis and the traffic envelopes.
#[derive(Serialize)]
struct Report<'a> {
    #[serde(flatten)]
    analysis: &'a Analysis,
    traffic: Traffic,
}

/// Traffic envelopes of the frame model and of the truss idealisation (braced designs).
#[derive(Serialize)]
struct Traffic {
    frame: TrafficReport,
    truss: Option<TrafficReport>,
}

/// The summary with the traffic's key numbers.
#[derive(Serialize)]
struct Brief<'a> {
    #[serde(flatten)]
    summary: &'a Summary,
    traffic: TrafficBrief<'a>,
    actions: ActionsBrief<'a>,
}

/// The other actions' key numbers: braking, each action's springing forces, the
/// live-load deflection.
#[derive(Serialize)]
struct ActionsBrief<'a> {
    braking: &'a Braking,
    cases: &'a [ActionResult],
    deflection: Option<&'a Deflection>,
}

/// The traffic's key numbers: what loads, how shared, the thrust range.
#[derive(Serialize)]
struct TrafficBrief<'a> {
    load_model: &'a str,
    lanes: &'a str,
    sharing_rule: &'a str,
    thrust: &'a LineEnvelope,
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
    let valid = ValidDesign::new(&design)?;
    let frame = traffic_envelopes(&valid, ModelKind::Frame)?
        .ok_or_else(|| Failure::refused("the design has no frame model"))?;
    let extra = args.patterns.iter().map(|p| pattern_of(&valid, &frame, p)).collect::<Result<Vec<_>, _>>()?;
    let analysis = analyze_with(&valid, &extra)?;
    if args.summary {
        let traffic = TrafficBrief {
            load_model: &frame.load_model,
            lanes: &frame.lanes,
            sharing_rule: &frame.sharing.rule,
            thrust: &frame.thrust,
        };
        let actions = ActionsBrief {
            braking: &analysis.actions.braking,
            cases: &analysis.actions.cases,
            deflection: frame.deflection.as_ref(),
        };
        return print_json(&Brief { summary: &analysis.summary, traffic, actions });
    }
    let truss = traffic_envelopes(&valid, ModelKind::Truss)?;
    print_json(&Report { analysis: &analysis, traffic: Traffic { frame, truss } })
}

/// The load case a `--pattern` names (see `Args::patterns`).
fn pattern_of(valid: &ValidDesign, frame: &TrafficReport, text: &str) -> Result<CaseSpec, Failure> {
    if let Some(rest) = text.strip_prefix("governing:") {
        let (line, extreme) = rest.rsplit_once(':').unwrap_or((rest, ""));
        let max = match extreme {
            "max" => true,
            "min" => false,
            _ => {
                return Err(Failure::refused(format!(
                    "'{text}': end a governing pattern with :max or :min, e.g. governing:thrust:max"
                )))
            }
        };
        let envelope = frame.line(line).ok_or_else(|| {
            Failure::refused(format!(
                "'{line}' names no line of the frame model; `springline influence DESIGN.json --of x` lists them"
            ))
        })?;
        return Ok(placement_case(valid, envelope, max));
    }
    if let Some(action) = action_cases(valid.design()).into_iter().find(|c| c.kind.id() == text) {
        return Ok(action);
    }
    Ok(pattern_case(valid, Pattern::parse(text)?)?)
}

/// The engine's reading of a permalink.
fn design_from_link(link: &str) -> Result<Design, StaticsError> {
    permalink::decode(link)
}
