//! Design options side by side: each option's key numbers and the comparison table the
//! meeting reads (what differs from the first option, and which option is best in each row
//! that has a better direction).
//!
//! The key numbers are those a sweep row carries (`arch::sweep`) and more: the geometry,
//! the thrusts, the springing reactions and their angles, the largest member forces, the
//! arch's alpha_cr with the sized rib, and the quantities. `springline size --key-numbers`
//! prints them for one design, so the screen's comparison and the command line agree by
//! construction. Concept-design values: local codes and a licensed engineer govern.

use crate::arch::analysis::analyze_valid;
use crate::arch::design::Design;
use crate::arch::generate::{frame_model, MemberRole};
use crate::arch::influence::ArchLine;
use crate::arch::sizing::{frame_traffic, is_ultimate, size_and_weigh};
use crate::arch::traffic::{LineEnvelope, TrafficReport};
use crate::arch::validate::ValidDesign;
use crate::error::{Location, Problem, StaticsError};
use crate::units::Quantity;
use serde::{Deserialize, Serialize};

/// Most options compared side by side (and carried by one comparison link).
pub const MAX_COMPARED: usize = 4;

/// One springing's characteristic demand (the foundations' SLS characteristic
/// combination, `arch::foundation`): the rib's largest push on the abutment for the whole
/// cross-section, its horizontal part outward positive and its vertical part downward
/// positive, kN, and the resultant's angle below the horizontal, degrees.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SpringingNumbers {
    /// `left` or `right`.
    pub side: String,
    /// Horizontal push (thrust), outward positive, kN.
    pub thrust: f64,
    /// Vertical push, downward positive, kN.
    pub vertical: f64,
    /// The resultant's angle below the horizontal, degrees.
    pub angle: f64,
}

/// The key numbers of one design option. Every number is `None` where it does not apply
/// or could not be found (an option that fails stops at the step that failed: its
/// geometry may be there, its quantities not).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, Default)]
pub struct KeyNumbers {
    /// Whether the option validates, analyses and (when sized) every group passes.
    pub feasible: bool,
    /// Why not, in the engine's words.
    pub reason: Option<String>,
    /// Span between the springings, m.
    pub span: Option<f64>,
    /// Rise of the crown above the springings' chord, m.
    pub rise: Option<f64>,
    /// Rise over span.
    pub rise_ratio: Option<f64>,
    /// Number of arch panels.
    pub panels: Option<f64>,
    /// Form thrust (the dead load's horizontal thrust of the form), kN.
    pub form_thrust: Option<f64>,
    /// Least and greatest design thrust over the ultimate combinations, kN (whole
    /// cross-section; the horizontal push on the abutment, outward positive).
    pub thrust_range: Option<[f64; 2]>,
    /// Characteristic springing demand, left then right (with sizing; empty without).
    pub springings: Vec<SpringingNumbers>,
    /// Largest design |N| of a rib member per rib line over the ultimate combinations, kN
    /// (a magnitude: tension or compression).
    pub rib_force: Option<f64>,
    /// As `rib_force`, posts.
    pub post_force: Option<f64>,
    /// As `rib_force`, bracing (`None` for an unbraced arch).
    pub bracing_force: Option<f64>,
    /// The arch's least alpha_cr over the sizing's cases with the sized rib (`None`
    /// without sizing, or when the buckling analysis found none).
    pub alpha_cr: Option<f64>,
    /// Steel, t (with sizing; `None` without, as are concrete and the cost index).
    pub steel: Option<f64>,
    /// Concrete, m3 (with sizing).
    pub concrete: Option<f64>,
    /// Cost index, in the units of the design's rates (with sizing).
    pub cost_index: Option<f64>,
}

/// The key numbers of `design`: validated, analysed, its traffic envelopes found on the
/// frame model and, with `size`, every group sized (`arch::sizing::size_and_weigh`: `size_design` without its modes).
///
/// Never fails: an option that does not validate, analyse or size is `feasible: false`
/// with the reason, keeping the numbers found before the step that failed. A sized
/// option with a group that cannot be sized is infeasible ("a group cannot be sized:
/// ..."), its quantities kept. Units: m, kN, degrees, t, m3.
pub fn key_numbers(design: &Design, size: bool) -> KeyNumbers {
    let mut numbers = KeyNumbers::default();
    match fill(design, size, &mut numbers) {
        Ok(()) => numbers.feasible = true,
        Err(e) => numbers.reason = Some(e.to_string()),
    }
    numbers
}

fn fill(design: &Design, size: bool, n: &mut KeyNumbers) -> Result<(), StaticsError> {
    let valid = ValidDesign::new(design)?;
    n.panels = Some(design.panels as f64);
    let analysis = analyze_valid(&valid)?;
    n.span = Some(analysis.summary.span);
    n.rise = Some(analysis.summary.rise);
    n.rise_ratio = Some(analysis.summary.rise_over_span);
    n.form_thrust = Some(analysis.summary.form_thrust);
    let traffic = frame_traffic(&valid)?;
    let ultimate = |l: &LineEnvelope| ultimate_extremes(design, l);
    let thrust = ultimate(&traffic.thrust);
    if !thrust.is_empty() {
        let lo = thrust.iter().map(|r| r.1).fold(f64::INFINITY, f64::min);
        let hi = thrust.iter().map(|r| r.0).fold(f64::NEG_INFINITY, f64::max);
        n.thrust_range = Some([lo, hi]);
    }
    n.rib_force = largest_force(&valid, &traffic, MemberRole::Rib);
    n.post_force = largest_force(&valid, &traffic, MemberRole::Post);
    n.bracing_force = largest_force(&valid, &traffic, MemberRole::Bracing);
    if size {
        // the same sizing, foundations and quantities as `springline size`, without its
        // dead-load modes and frequencies (no key number comes from them)
        let (sizing, foundations, quantities) = size_and_weigh(&valid, &traffic)?;
        n.springings = foundations
            .springings
            .iter()
            .map(|s| SpringingNumbers {
                side: s.side.clone(),
                thrust: s.thrust,
                vertical: s.vertical,
                angle: s.angle,
            })
            .collect();
        n.steel = Some(quantities.steel);
        n.concrete = Some(quantities.concrete);
        n.cost_index = Some(quantities.cost_index);
        // nothing bounds it (infinite): none found, as the field says (a sweep's chart and
        // tables take only numbers)
        n.alpha_cr = sizing.rib_alpha_cr.filter(|a| a.is_finite());
        let not_sized = sizing.not_sized();
        if !not_sized.is_empty() {
            return Err(StaticsError::Invalid(vec![Problem::new(
                Location::Part("sizing".into()),
                format!("a group cannot be sized: {}", not_sized.join("; ")),
            )]));
        }
    }
    Ok(())
}

/// The (max, min) design values of a line over the design's ultimate combinations.
fn ultimate_extremes(design: &Design, line: &LineEnvelope) -> Vec<(f64, f64)> {
    let ultimate: Vec<&str> =
        design.traffic.combinations.iter().filter(|c| is_ultimate(c)).map(|c| c.name.as_str()).collect();
    line.design
        .iter()
        .filter(|r| ultimate.contains(&r.combination.as_str()))
        .map(|r| (r.max, r.min))
        .collect()
}

/// Largest design |N| over the ultimate combinations of the frame model's members of
/// `role`, per rib line; `None` when there is no such member.
fn largest_force(valid: &ValidDesign, traffic: &TrafficReport, role: MemberRole) -> Option<f64> {
    let generated = frame_model(valid);
    generated
        .map
        .roles
        .iter()
        .enumerate()
        .filter(|(_, r)| **r == role)
        .filter_map(|(k, _)| traffic.line(&ArchLine::Axial(k).name(&generated)))
        .flat_map(|line| ultimate_extremes(valid.design(), line))
        .map(|(max, min)| max.abs().max(min.abs()))
        .reduce(f64::max)
}

/// Which way a row of the comparison is better.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Better {
    /// Lower is better (thrusts, forces, quantities, cost).
    Lower,
    /// Higher is better (alpha_cr).
    Higher,
    /// Neither: geometry and angles are choices, not scores.
    Neither,
}

/// One row of the comparison: what it shows, in which quantity, and which way is better.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Metric {
    /// A stable id (tests and the screen's element ids): `span`, `form-thrust`, ...
    pub id: &'static str,
    /// The row's words on screen.
    pub label: &'static str,
    /// The quantity (display units follow it).
    pub quantity: Quantity,
    /// Which way is better.
    pub better: Better,
}

const fn metric(id: &'static str, label: &'static str, quantity: Quantity, better: Better) -> Metric {
    Metric { id, label, quantity, better }
}

/// The comparison's rows, in order.
pub const METRICS: [Metric; 20] = [
    metric("span", "span", Quantity::Length, Better::Neither),
    metric("rise", "rise", Quantity::Length, Better::Neither),
    metric("rise-ratio", "rise / span", Quantity::Ratio, Better::Neither),
    metric("panels", "panels", Quantity::Count, Better::Neither),
    metric("form-thrust", "form thrust", Quantity::Force, Better::Lower),
    // the least thrust is a check (the arch stays in compression), not a score
    metric("thrust-min", "least design thrust (ULS)", Quantity::Force, Better::Neither),
    metric("thrust-max", "greatest design thrust (ULS)", Quantity::Force, Better::Lower),
    metric("left-h", "left springing H (characteristic)", Quantity::Force, Better::Lower),
    metric("left-v", "left springing V (characteristic)", Quantity::Force, Better::Lower),
    metric("left-angle", "left springing resultant angle", Quantity::Angle, Better::Neither),
    metric("right-h", "right springing H (characteristic)", Quantity::Force, Better::Lower),
    metric("right-v", "right springing V (characteristic)", Quantity::Force, Better::Lower),
    metric("right-angle", "right springing resultant angle", Quantity::Angle, Better::Neither),
    metric("rib-force", "largest rib force per rib (ULS)", Quantity::Force, Better::Lower),
    metric("post-force", "largest post force per rib (ULS)", Quantity::Force, Better::Lower),
    metric("bracing-force", "largest bracing force per rib (ULS)", Quantity::Force, Better::Lower),
    metric("alpha-cr", "alpha_cr of the arch (sized rib)", Quantity::Ratio, Better::Higher),
    metric("steel", "steel", Quantity::Mass, Better::Lower),
    metric("concrete", "concrete", Quantity::Volume, Better::Lower),
    metric("cost-index", "cost index", Quantity::Count, Better::Lower),
];

impl Metric {
    /// This row's value for one option (SI: m, kN, degrees, t, m3).
    pub fn value(&self, n: &KeyNumbers) -> Option<f64> {
        let side = |name: &str| n.springings.iter().find(|s| s.side == name);
        match self.id {
            "span" => n.span,
            "rise" => n.rise,
            "rise-ratio" => n.rise_ratio,
            "panels" => n.panels,
            "form-thrust" => n.form_thrust,
            "thrust-min" => n.thrust_range.map(|t| t[0]),
            "thrust-max" => n.thrust_range.map(|t| t[1]),
            "left-h" => side("left").map(|s| s.thrust),
            "left-v" => side("left").map(|s| s.vertical),
            "left-angle" => side("left").map(|s| s.angle),
            "right-h" => side("right").map(|s| s.thrust),
            "right-v" => side("right").map(|s| s.vertical),
            "right-angle" => side("right").map(|s| s.angle),
            "rib-force" => n.rib_force,
            "post-force" => n.post_force,
            "bracing-force" => n.bracing_force,
            "alpha-cr" => n.alpha_cr,
            "steel" => n.steel,
            "concrete" => n.concrete,
            "cost-index" => n.cost_index,
            _ => None,
        }
    }
}

/// One cell of the comparison.
#[derive(Debug, Clone, PartialEq)]
pub struct Cell {
    /// The option's value (SI), `None` where it has none.
    pub value: Option<f64>,
    /// The value minus the first option's (SI); `None` in the first column or where
    /// either has no value.
    pub difference: Option<f64>,
    /// Whether this is the best value of a row that has a direction, among the feasible
    /// options (every equal best is marked; nothing is marked with fewer than two
    /// feasible values).
    pub best: bool,
}

/// One row of the comparison.
#[derive(Debug, Clone, PartialEq)]
pub struct Row {
    /// The metric.
    pub metric: Metric,
    /// One cell per option, in the options' order.
    pub cells: Vec<Cell>,
}

/// Values within this relative margin of the best are marked best too (rounding noise
/// between two options that are the same design must not pick one).
const BEST_TOLERANCE: f64 = 1e-9;

/// The comparison table of `options` (each option's key numbers, in order): one row per
/// [`METRICS`] entry, each cell with its difference from the first option and the best
/// mark. Options that are not feasible show their values but are never marked best.
/// An empty slice gives rows without cells.
pub fn compare(options: &[KeyNumbers]) -> Vec<Row> {
    METRICS
        .iter()
        .map(|metric| {
            let values: Vec<Option<f64>> =
                options.iter().map(|n| metric.value(n).filter(|v| v.is_finite())).collect();
            let scored: Vec<f64> =
                options.iter().zip(&values).filter(|(n, _)| n.feasible).filter_map(|(_, v)| *v).collect();
            let best = match metric.better {
                _ if scored.len() < 2 => None,
                Better::Lower => scored.iter().copied().reduce(f64::min),
                Better::Higher => scored.iter().copied().reduce(f64::max),
                Better::Neither => None,
            };
            let first = values.first().copied().flatten();
            let cells = options
                .iter()
                .zip(&values)
                .enumerate()
                .map(|(k, (n, v))| Cell {
                    value: *v,
                    difference: match (k, first, v) {
                        (0, _, _) => None,
                        (_, Some(f), Some(v)) => Some(v - f),
                        _ => None,
                    },
                    best: match (best, v) {
                        (Some(b), Some(v)) if n.feasible => {
                            (v - b).abs() <= BEST_TOLERANCE * b.abs().max(1.0)
                        }
                        _ => false,
                    },
                })
                .collect();
            Row { metric: *metric, cells }
        })
        .collect()
}
