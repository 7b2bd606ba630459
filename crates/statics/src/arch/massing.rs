//! The massing loop: size the groups, adopt the sizes (their self-weight and stiffness
//! change the loads, the form and the forces), analyse and size again, until no sized
//! group's section changes.
//!
//! Each pass is validation (form finding for the new dead load), the frame model's
//! traffic report and the sizing (`arch::sizing::size_design`), then `adopt_sizes`. The
//! loop has settled when a pass adopts the very sections it started from; it stops at
//! the cap otherwise, saying what changed last (a size that keeps moving between two
//! values, or keeps growing), or at a pass whose design cannot be analysed or sized.
//! Groups kept as typed never change. Concept-design values: local codes and a licensed
//! engineer govern.

use crate::arch::analysis::CAUTION;
use crate::arch::design::Design;
use crate::arch::sizing::{adopt_sizes, frame_traffic, size_design, GroupOutcome, SizeReport};
use crate::arch::validate::ValidDesign;
use crate::error::{Location, Problem, StaticsError};
use serde::Serialize;

/// Default most passes of the loop.
pub const DEFAULT_MASSING_PASSES: usize = 12;

/// One pass of the loop.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MassingPass {
    /// 1 for the first pass (the design as given).
    pub pass: usize,
    /// Each sized group's section after this pass (`group: label`).
    pub sections: Vec<String>,
    /// Form thrust of the design this pass sized, kN.
    pub form_thrust: f64,
    /// Steel, t, and concrete, m3, of this pass's sizes.
    pub steel: f64,
    /// Concrete of the structure, m3.
    pub concrete: f64,
    /// What the pass changed (`rib: box 1450 x 870 -> box 1500 x 900`), or `nothing`.
    pub changed: String,
}

/// The outcome of the loop.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MassingReport {
    /// Whether a pass adopted the sections it started from.
    pub converged: bool,
    /// Passes made.
    pub passes: usize,
    /// What each pass did.
    pub history: Vec<MassingPass>,
    /// What changed last (when not converged: why it stopped).
    pub last_change: String,
    /// The design with the last pass's sizes adopted (a group that could not be sized
    /// keeps its typed section).
    #[serde(skip)]
    pub design: Design,
    /// The last pass's size report (of the design it sized).
    pub report: SizeReport,
    /// Caution.
    pub caution: String,
}

/// The sized groups' sections in words.
fn sections(report: &SizeReport) -> Vec<String> {
    report
        .sizing
        .groups
        .iter()
        .filter_map(|g| match &g.outcome {
            GroupOutcome::Sized { label, .. } => Some(format!("{}: {label}", g.group)),
            _ => None,
        })
        .collect()
}

/// Runs the massing loop on `design` for at most `passes` passes (see the module doc).
///
/// Errors: those of validation, analysis and sizing of the design as given; a later
/// pass's design that cannot be analysed or a group that cannot be sized stops the loop
/// with `converged` false and the reason in `last_change`. `passes` 0 is taken as 1.
pub fn massing_loop(design: &Design, passes: usize) -> Result<MassingReport, StaticsError> {
    let passes = passes.max(1);
    let mut current = design.clone();
    let mut history: Vec<MassingPass> = Vec::new();
    let mut last: Option<SizeReport> = None;
    let mut stop: Option<String> = None;
    for pass in 1..=passes {
        let attempt = (|| {
            let valid = ValidDesign::new(&current)?;
            let traffic = frame_traffic(&valid)?;
            let report = size_design(&valid, &traffic)?;
            Ok::<_, StaticsError>((valid.form().thrust, report))
        })();
        let (form_thrust, report) = match attempt {
            Ok(r) => r,
            // the design as given must work: its error is the caller's to see
            Err(e) if pass == 1 => return Err(e),
            Err(e) => {
                stop = Some(format!("pass {pass}: the design with the last sizes cannot be analysed: {e}"));
                break;
            }
        };
        let adopted = adopt_sizes(&current, &report.sizing);
        let now = sections(&report);
        let before = history.last().map(|h| h.sections.clone());
        let changed: Vec<String> = match &before {
            Some(b) => now.iter().filter(|s| !b.contains(s)).cloned().collect(),
            None => now.clone(),
        };
        let not_sized = report.not_sized();
        history.push(MassingPass {
            pass,
            sections: now,
            form_thrust,
            steel: report.quantities.steel,
            concrete: report.quantities.concrete,
            changed: if adopted.groups == current.groups { "nothing".into() } else { changed.join("; ") },
        });
        let settled = adopted.groups == current.groups;
        if settled && not_sized.is_empty() {
            // the sections it started from: settled
            return Ok(MassingReport {
                converged: true,
                passes: pass,
                last_change: history
                    .iter()
                    .rev()
                    .find(|h| h.changed != "nothing")
                    .map_or("nothing: the sizes given were already the sizes", |h| h.changed.as_str())
                    .to_string(),
                history,
                design: adopted,
                report,
                caution: CAUTION.into(),
            });
        }
        last = Some(report);
        current = adopted;
        if !not_sized.is_empty() {
            stop = Some(format!("pass {pass}: a group cannot be sized: {}", not_sized.join("; ")));
            break;
        }
    }
    let report = last.ok_or_else(|| {
        StaticsError::Invalid(vec![Problem::new(Location::Part("massing loop".into()), "no pass was made")])
    })?;
    let last_change = stop.unwrap_or_else(|| {
        let moving = history.last().map_or(String::new(), |h| h.changed.clone());
        format!(
            "not settled after {} passes (the cap): the last pass still changed {moving}; the sizes may be \
             alternating between two steps of a family, or the self-weight may keep growing: raise the cap, \
             choose another family or material, or shorten the span",
            history.len()
        )
    });
    Ok(MassingReport {
        converged: false,
        passes: history.len(),
        history,
        last_change,
        design: current,
        report,
        caution: CAUTION.into(),
    })
}
