//! Extra load cases for the generated models of a design: the traffic's uniform load on
//! part of the span (full, halves, quarters), a heavier panel, a vehicle at a given x,
//! the placement that governs an envelope, added alongside the dead load.
//!
//! Generated models carry one case, "dead". The force diagram and the thrust line show
//! what happens when the load departs from the funicular of the dead load, so they need
//! cases that do. This module builds them the same way for the three models of a design:
//!
//! - deck loads reach the deck joints as **simple-span panel reactions** of the deck spans
//!   over the arch (the classical panel-point idealisation; the drop-in span over a
//!   three-hinged crown delivers its reactions to its end joints);
//! - the truss idealisation and the frame model receive these joint loads at their deck
//!   joints (a joint shared by rib and deck is the rib node); the bare rib receives them
//!   at the rib node under each deck joint (carried down its post).
//!
//! So the three models of one design carry the same vertical loads at the same x, which
//! is what lets the graphic constructions and the stiffness solutions be compared.
//!
//! Units: kN, m; load intensities and loads are **positive downward** here (as on a load
//! line) and enter the models as negative `fy` (y up). Loads are limited to the arch span
//! (between the springing verticals); the approach spans are not loaded.

use crate::arch::generate::{Generated, DEAD};
use crate::arch::generate::{MemberRole, ModelKind};
use crate::arch::influence::load_path;
use crate::arch::layout::{position, Joint, Layout, Topology};
use crate::arch::traffic::traffic_of;
use crate::arch::validate::ValidDesign;
use crate::error::{Location, StaticsError};
use crate::frame::model::{
    Dof, LoadCase, LoadDirection, MemberLoad, NodalLoad, PrescribedDisplacement, TemperatureLoad,
};
use crate::units::{Quantity, Units};
use serde::{Deserialize, Serialize};
use std::fmt;

/// Name of the standard half-span case.
pub const HALF_SPAN: &str = "dead + half-span live (left)";
/// Name of the standard heavier-panel case.
pub const DOUBLED_PANEL: &str = "dead + doubled panel load";

/// One extra load on the deck over the arch (kN, m; positive downward).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum DeckLoad {
    /// A line load `w` (kN per horizontal metre of deck, the whole width) from `x0` to
    /// `x1` (m), clipped to the arch span.
    Strip {
        /// Intensity, kN/m, positive downward.
        w: f64,
        /// Start, m.
        x0: f64,
        /// End, m (greater than `x0`).
        x1: f64,
    },
    /// A point load `p` (kN, positive downward) on the deck at panel point `panel`
    /// (0 = over the left springing).
    PanelPoint {
        /// Panel point index, 0..=panels.
        panel: usize,
        /// Load, kN, positive downward.
        p: f64,
    },
    /// A point load `p` (kN, positive downward) on the deck at `x` (m), shared between
    /// the deck joints on either side by the lever rule (a simple deck span); ignored off
    /// the arch span.
    Point {
        /// Position, m.
        x: f64,
        /// Load, kN, positive downward.
        p: f64,
    },
}

/// A load case to add to the models of a design.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CaseSpec {
    /// Name of the case.
    pub name: String,
    /// What the case is (its `Display` says it in words for the screen).
    pub kind: CaseKind,
    /// Include the model's own dead load case ("dead") in this case.
    pub with_dead: bool,
    /// The deck loads of the case.
    pub loads: Vec<DeckLoad>,
    /// Imposed actions of the case (temperature, springing movement, braking, the rib's
    /// own weight alone): see [`Imposed`].
    #[serde(default)]
    pub imposed: Vec<Imposed>,
}

/// An action of a case that is not a vertical deck load. How each reaches a model is
/// in [`build_case`].
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Imposed {
    /// A uniform temperature change `delta_t` (K, positive warmer) of every member, or of
    /// the deck members (deck and approach spans, the truss's deck chord) alone; the
    /// members' thermal coefficient is the design's.
    Temperature {
        /// Change, K.
        delta_t: f64,
        /// The deck alone (a deck-rib difference).
        deck_only: bool,
    },
    /// The springings move: each outward by half `spread` (m) and down by its settlement
    /// (m, positive down).
    SpringingMovement {
        /// Spread, m, positive apart.
        spread: f64,
        /// Left settlement, m, positive down.
        settlement_left: f64,
        /// Right settlement, m, positive down.
        settlement_right: f64,
    },
    /// A horizontal force along the deck, kN in all, positive to the right, shared by the
    /// deck nodes of the load path in proportion to their tributary lengths (models
    /// without a deck take nothing).
    Braking {
        /// Total force, kN.
        force: f64,
    },
    /// The rib's own weight alone, per metre along the rib (unit weight x area x ribs),
    /// on the bare rib only: the erection stage before posts and deck (other models take
    /// nothing).
    RibSelfWeight,
}

/// Left or right half of the arch span.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Half {
    /// From the left springing vertical to the crown.
    Left,
    /// From the crown to the right springing vertical.
    Right,
}

crate::json::tagged_in_json! {
    tag = "kind", remote = "CaseKind";
    /// What a load case is, with the numbers that say it.
    #[derive(Debug, Clone, Copy, PartialEq)]
    pub enum CaseKind {
        /// The dead load, which is also the form-finding load.
        Dead,
        /// Dead load plus a uniform traffic load on one half of the arch span.
        HalfSpan {
            /// Which half.
            half: Half,
            /// Intensity, kN/m2 over the deck width.
            intensity: f64,
            /// The same as a line load, kN/m.
            line_load: f64,
            /// Loaded from, m.
            x0: f64,
            /// Loaded to, m.
            x1: f64,
        },
        /// Dead load plus the deck panel load again at one panel point.
        DoubledPanel {
            /// Panel point index.
            panel: usize,
            /// The extra load, kN.
            load: f64,
            /// Its x, m.
            x: f64,
        },
        /// Dead load plus the traffic's uniform load over the whole arch span.
        FullSpan {
            /// The whole cross-section's uniform traffic load, kN/m.
            line_load: f64,
            /// Loaded from, m.
            x0: f64,
            /// Loaded to, m.
            x1: f64,
        },
        /// Dead load plus the traffic's uniform load over one quarter of the arch span.
        Quarter {
            /// Which quarter, 1 (left) to 4.
            quarter: usize,
            /// The whole cross-section's uniform traffic load, kN/m.
            line_load: f64,
            /// Loaded from, m.
            x0: f64,
            /// Loaded to, m.
            x1: f64,
        },
        /// Dead load plus the load model's vehicle (all lanes' vehicles side by side).
        Vehicle {
            /// x of the leading axle, m (the vehicle travels to the right, the others behind).
            first_axle: f64,
            /// The vehicle's total load across the section, kN.
            total: f64,
            /// Where the leading axle stands along the arch span, 0 (left springing) to 1.
            along: f64,
        },
        /// Dead load plus the traffic placed where it gives one extreme of an envelope.
        Placement {
            /// The largest (true) or the smallest effect.
            max: bool,
        },
        /// A uniform temperature change of every member (no dead load).
        Temperature {
            /// Change, K (positive warmer).
            delta_t: f64,
        },
        /// The deck warmer (positive) or cooler than the rib (no dead load).
        DeckTemperature {
            /// The deck's change, K.
            delta_t: f64,
        },
        /// The springings spread and settle (no dead load).
        SpringingMovement {
            /// Spread, m.
            spread: f64,
            /// Left settlement, m, down.
            settlement_left: f64,
            /// Right settlement, m, down.
            settlement_right: f64,
        },
        /// Braking along the deck, to the right (no dead load).
        Braking {
            /// Total force, kN.
            force: f64,
        },
        /// The bare rib under its own weight before posts and deck (erection stage).
        Erection,
        /// Any other case, built from deck loads.
        Other,
    }
}

impl fmt::Display for CaseKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match *self {
            CaseKind::Dead => f.write_str("dead load: deck, surfacing and self-weight (the form-finding load)"),
            CaseKind::HalfSpan { half, intensity, line_load, x0, x1 } => write!(
                f,
                "dead load plus {line_load:.2} kN/m ({intensity:.2} kN/m2 over the deck width) on the {half} half of \
                 the arch span (x = {x0:.3} to {x1:.3} m), reaching the deck joints as panel reactions"
            ),
            CaseKind::DoubledPanel { panel, load, x } => write!(
                f,
                "dead load plus the deck panel load again ({load:.2} kN) at panel point {panel} (x = {x:.3} m): \
                 that panel load doubled"
            ),
            CaseKind::FullSpan { line_load, x0, x1 } => write!(
                f,
                "dead load plus the traffic's uniform load ({line_load:.2} kN/m over the cross-section) on the whole \
                 arch span (x = {x0:.3} to {x1:.3} m), reaching the deck joints as panel reactions"
            ),
            CaseKind::Quarter { quarter, line_load, x0, x1 } => write!(
                f,
                "dead load plus the traffic's uniform load ({line_load:.2} kN/m over the cross-section) on quarter \
                 {quarter} of the arch span (x = {x0:.3} to {x1:.3} m), reaching the deck joints as panel reactions"
            ),
            CaseKind::Vehicle { first_axle, total, .. } => write!(
                f,
                "dead load plus the load model's vehicles across the section ({total:.1} kN in all), leading axle \
                 at x = {first_axle:.3} m, travelling right"
            ),
            CaseKind::Placement { max } => write!(
                f,
                "dead load plus the traffic where it gives the {} of an envelope",
                if max { "largest effect" } else { "smallest effect" }
            ),
            CaseKind::Temperature { delta_t } => write!(
                f,
                "uniform temperature {} of every member by {:.1} K (alone, no dead load)",
                if delta_t.is_sign_negative() { "fall" } else { "rise" },
                delta_t.abs()
            ),
            CaseKind::DeckTemperature { delta_t } => write!(
                f,
                "the deck {:.1} K {} than the rib (alone, no dead load)",
                delta_t.abs(),
                if delta_t.is_sign_negative() { "cooler" } else { "warmer" }
            ),
            CaseKind::SpringingMovement { spread, settlement_left, settlement_right } => write!(
                f,
                "the springings spread {:.1} mm and settle {:.1} mm (left) and {:.1} mm (right) (alone, no dead load)",
                spread * 1e3,
                settlement_left * 1e3,
                settlement_right * 1e3
            ),
            CaseKind::Braking { force } => write!(
                f,
                "braking: {force:.1} kN along the deck, to the right (alone, no dead load)"
            ),
            CaseKind::Erection => f.write_str(
                "erection: the bare rib under its own weight before posts and deck (a stage of its own)",
            ),
            CaseKind::Other => f.write_str("deck loads"),
        }
    }
}

impl CaseKind {
    /// The case's id in links: stable when more cases arrive, because it is built from
    /// what the case is, never from its place in a list. `dead`, `half-left`,
    /// `half-right`, `panel-N` (N the panel point, 0 over the left springing), `full`,
    /// `quarter-N` (1 to 4), `vehicle-X` (X the leading axle's x in whole metres),
    /// `placement-max`, `placement-min`, `deck-loads` for any other case. Lower-case ASCII letters, digits and `-` only, so it travels in
    /// a URL fragment as it is.
    pub fn id(&self) -> String {
        match *self {
            CaseKind::Dead => "dead".into(),
            CaseKind::HalfSpan { half, .. } => format!("half-{half}"),
            CaseKind::DoubledPanel { panel, .. } => format!("panel-{panel}"),
            CaseKind::FullSpan { .. } => "full".into(),
            CaseKind::Quarter { quarter, .. } => format!("quarter-{quarter}"),
            CaseKind::Vehicle { first_axle, .. } => format!("vehicle-{}", first_axle.round().max(0.0) as u64),
            CaseKind::Placement { max } => if max { "placement-max" } else { "placement-min" }.into(),
            CaseKind::Temperature { delta_t } => {
                if delta_t.is_sign_negative() { "temperature-fall" } else { "temperature-rise" }.into()
            }
            CaseKind::DeckTemperature { delta_t } => {
                if delta_t.is_sign_negative() { "deck-cooler" } else { "deck-warmer" }.into()
            }
            CaseKind::SpringingMovement { .. } => "springing-movement".into(),
            CaseKind::Braking { .. } => "braking".into(),
            CaseKind::Erection => "erection".into(),
            CaseKind::Other => "deck-loads".into(),
        }
    }

    /// The family of the id (`dead`, `half-left`, `half-right`, `panel`, `deck-loads`):
    /// what stays the same when a design change moves the loaded panel point.
    fn family(&self) -> String {
        match self {
            CaseKind::DoubledPanel { .. } => "panel".into(),
            CaseKind::Vehicle { .. } => "vehicle".into(),
            other => other.id(),
        }
    }

    /// A short title in words, without numbers or units (a button, a table caption):
    /// "Dead load", "Traffic, left half", "Heavier panel 3", "Deck loads".
    pub fn title(&self) -> String {
        match *self {
            CaseKind::Dead => "Dead load".into(),
            CaseKind::HalfSpan { half, .. } => format!("Traffic, {half} half"),
            CaseKind::DoubledPanel { panel, .. } => format!("Heavier panel {panel}"),
            CaseKind::FullSpan { .. } => "Traffic, full span".into(),
            CaseKind::Quarter { quarter, .. } => format!("Traffic, quarter {quarter}"),
            CaseKind::Vehicle { .. } => "Vehicle".into(),
            CaseKind::Placement { max: true } => "Worst placement, largest".into(),
            CaseKind::Placement { max: false } => "Worst placement, smallest".into(),
            CaseKind::Temperature { delta_t } => {
                if delta_t.is_sign_negative() { "Temperature fall" } else { "Temperature rise" }.into()
            }
            CaseKind::DeckTemperature { delta_t } => {
                if delta_t.is_sign_negative() { "Deck cooler" } else { "Deck warmer" }.into()
            }
            CaseKind::SpringingMovement { .. } => "Springing movement".into(),
            CaseKind::Braking { .. } => "Braking".into(),
            CaseKind::Erection => "Erection".into(),
            CaseKind::Other => "Deck loads".into(),
        }
    }

    /// The case in words with its numbers shown in `units` (area load, line load, load,
    /// positions): what `Display` says in SI, for a screen that may show US customary.
    pub fn describe(&self, units: Units) -> String {
        let show = |q, v| units.show(q, v);
        match *self {
            CaseKind::HalfSpan { half, intensity, line_load, x0, x1 } => format!(
                "dead load plus {} ({} over the deck width) on the {half} half of the arch span \
                 (x = {} to {}), reaching the deck joints as panel reactions",
                show(Quantity::LineLoad, line_load),
                show(Quantity::Pressure, intensity),
                show(Quantity::Length, x0),
                show(Quantity::Length, x1),
            ),
            CaseKind::DoubledPanel { panel, load, x } => format!(
                "dead load plus the deck panel load again ({}) at panel point {panel} (x = {}): \
                 that panel load doubled",
                show(Quantity::Force, load),
                show(Quantity::Length, x),
            ),
            CaseKind::FullSpan { line_load, x0, x1 } | CaseKind::Quarter { line_load, x0, x1, .. } => format!(
                "dead load plus the traffic's uniform load ({} over the cross-section) on {} \
                 (x = {} to {}), reaching the deck joints as panel reactions",
                show(Quantity::LineLoad, line_load),
                match *self {
                    CaseKind::Quarter { quarter, .. } => format!("quarter {quarter} of the arch span"),
                    _ => "the whole arch span".into(),
                },
                show(Quantity::Length, x0),
                show(Quantity::Length, x1),
            ),
            CaseKind::Vehicle { first_axle, total, .. } => format!(
                "dead load plus the load model's vehicles across the section ({} in all), leading axle at x = {}, \
                 travelling right",
                show(Quantity::Force, total),
                show(Quantity::Length, first_axle),
            ),
            CaseKind::SpringingMovement { spread, settlement_left, settlement_right } => format!(
                "the springings spread {} and settle {} (left) and {} (right) (alone, no dead load)",
                show(Quantity::SectionDepth, spread),
                show(Quantity::SectionDepth, settlement_left),
                show(Quantity::SectionDepth, settlement_right),
            ),
            CaseKind::Braking { force } => format!(
                "braking: {} along the deck, to the right (alone, no dead load)",
                show(Quantity::Force, force)
            ),
            other => other.to_string(),
        }
    }
}

/// The index of the case with link id `id` among `kinds` (in the analysis's order): the
/// case with that id, else the first of the same family (a heavier panel that moved to
/// another panel point when the panel count changed), else `None` (the caller shows the
/// first case).
pub fn find_case<'a>(kinds: impl IntoIterator<Item = &'a CaseKind>, id: &str) -> Option<usize> {
    let kinds: Vec<&CaseKind> = kinds.into_iter().collect();
    kinds.iter().position(|k| k.id() == id).or_else(|| {
        let family = id.split_once('-').filter(|(f, n)| *f == "panel" && n.parse::<usize>().is_ok());
        let family = family.map_or(id, |(f, _)| f);
        kinds.iter().position(|k| k.family() == family)
    })
}

impl fmt::Display for Half {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Half::Left => "left",
            Half::Right => "right",
        })
    }
}

/// A case with the dead load plus `w` kN/m2 (positive down) over the deck width on one
/// half of the arch span (springing vertical to crown x). The classic unsymmetric load of
/// an arch: for a parabolic rib it gives the largest rib moments near the quarter points
/// (Timoshenko & Young, Theory of Structures, ch. 9, from memory). Errors: `w` not
/// finite.
pub fn half_span(valid: &ValidDesign, half: Half, w: f64) -> Result<CaseSpec, StaticsError> {
    if !w.is_finite() {
        return Err(StaticsError::invalid("half-span load", format!("intensity {w} kN/m2 must be finite")));
    }
    Ok(half_span_spec(valid, half, w))
}

fn half_span_spec(valid: &ValidDesign, half: Half, w: f64) -> CaseSpec {
    half_span_line(valid, half, w * valid.design().deck.width)
}

/// The half-span case with a line load `line` kN/m (its intensity over the deck width
/// is `line` / width).
fn half_span_line(valid: &ValidDesign, half: Half, line: f64) -> CaseSpec {
    let f = valid.layout();
    let width = valid.design().deck.width;
    let w = if width > 0.0 { line / width } else { 0.0 };
    let (x0, x1) = match half {
        Half::Left => (f.a.x, f.xc),
        Half::Right => (f.xc, f.b.x),
    };
    CaseSpec {
        name: if half == Half::Left { HALF_SPAN.into() } else { "dead + half-span live (right)".into() },
        kind: CaseKind::HalfSpan { half, intensity: w, line_load: line, x0, x1 },
        with_dead: true,
        loads: vec![DeckLoad::Strip { w: line, x0, x1 }],
        imposed: Vec::new(),
    }
}

/// A case with the dead load plus the deck's panel load added again at panel point
/// `panel`: the deck line load (`Design::deck_line_load`, kN/m) times the panel length,
/// so the deck load of that panel point is doubled. Errors: a panel point that is not
/// inside the arch (1 to panels - 1).
pub fn doubled_panel(valid: &ValidDesign, panel: usize) -> Result<CaseSpec, StaticsError> {
    let f = valid.layout();
    if panel == 0 || panel >= f.panels {
        return Err(StaticsError::invalid(
            "doubled panel load",
            format!("panel point {panel} must lie inside the arch (1 to {})", f.panels - 1),
        ));
    }
    Ok(doubled_panel_spec(valid, panel))
}

/// The doubled panel case at `panel`, which must lie inside the arch (1 to panels - 1).
fn doubled_panel_spec(valid: &ValidDesign, panel: usize) -> CaseSpec {
    let f = valid.layout();
    let p = valid.design().deck_line_load() * f.span() / f.panels as f64;
    // the panel point's x (a layout has every panel point from 0 to panels)
    let x = f.panel_x.get(panel).copied().unwrap_or(f64::NAN);
    CaseSpec {
        name: DOUBLED_PANEL.into(),
        kind: CaseKind::DoubledPanel { panel, load: p, x },
        with_dead: true,
        loads: vec![DeckLoad::PanelPoint { panel, p }],
        imposed: Vec::new(),
    }
}

/// The standard extra cases `analyze` adds to every model: dead + the traffic's uniform
/// load (the whole cross-section's, `arch::traffic::traffic_of`) on the left half of the
/// span, and dead + a doubled panel load at the panel point nearest the left quarter
/// point (at least 1, at most panels - 1). Total on a validated design.
pub fn standard_cases(valid: &ValidDesign) -> Vec<CaseSpec> {
    let panels = valid.layout().panels;
    let quarter = ((panels as f64) / 4.0).round().max(1.0) as usize;
    let (_, sharing) = traffic_of(valid);
    vec![
        half_span_line(valid, Half::Left, sharing.whole.uniform()),
        doubled_panel_spec(valid, quarter.min(panels - 1)),
    ]
}

/// A named traffic pattern: the whole cross-section's traffic of the design's load model
/// (`arch::traffic::traffic_of`) on part of the arch span, with the dead load.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Pattern {
    /// The uniform load over the whole arch span.
    FullSpan,
    /// The uniform load over one half.
    Half(Half),
    /// The uniform load over one quarter (1 = left to 4).
    Quarter(usize),
    /// The deck panel load again at one panel point (1 to panels - 1).
    HeavyPanel(usize),
    /// The load model's first vehicle (every lane's side by side), leading axle at this
    /// x (m), travelling right; a variable spacing at its shortest.
    Vehicle(f64),
}

impl Pattern {
    /// The pattern a user names: `full`, `half-left`, `half-right`, `quarter-1` to
    /// `quarter-4`, `panel-N`, `vehicle-at-X` (X in m, e.g. `vehicle-at-52.5`).
    ///
    /// Errors: `Invalid` naming every accepted form.
    pub fn parse(text: &str) -> Result<Pattern, StaticsError> {
        let number = |prefix: &str| text.strip_prefix(prefix).and_then(|n| n.parse::<f64>().ok());
        let whole = |prefix: &str| text.strip_prefix(prefix).and_then(|n| n.parse::<usize>().ok());
        let pattern = match text {
            "full" => Some(Pattern::FullSpan),
            "half-left" => Some(Pattern::Half(Half::Left)),
            "half-right" => Some(Pattern::Half(Half::Right)),
            _ => whole("quarter-")
                .filter(|q| (1..=4).contains(q))
                .map(Pattern::Quarter)
                .or_else(|| whole("panel-").map(Pattern::HeavyPanel))
                .or_else(|| number("vehicle-at-").filter(|x| x.is_finite()).map(Pattern::Vehicle)),
        };
        pattern.ok_or_else(|| {
            StaticsError::invalid(
                "load pattern",
                format!(
                    "'{text}' names no pattern; give full, half-left, half-right, quarter-1 to quarter-4, panel-N \
                     (N a panel point inside the arch) or vehicle-at-X (X the leading axle's x in m)"
                ),
            )
        })
    }
}

/// The load case of a named pattern on a validated design (see [`Pattern`]); strips reach
/// the deck joints as panel reactions, axles by the lever rule between joints (loads off
/// the arch span are left out, as in every case of this module).
///
/// Errors: a heavy panel outside 1 to panels - 1.
pub fn pattern_case(valid: &ValidDesign, pattern: Pattern) -> Result<CaseSpec, StaticsError> {
    let f = valid.layout();
    let (layout, sharing) = traffic_of(valid);
    let line = sharing.whole.uniform();
    let strip = |name: String, kind: CaseKind, x0: f64, x1: f64| CaseSpec {
        name,
        kind,
        with_dead: true,
        loads: vec![DeckLoad::Strip { w: line, x0, x1 }],
        imposed: Vec::new(),
    };
    Ok(match pattern {
        Pattern::FullSpan => {
            let (x0, x1) = (f.a.x, f.b.x);
            strip("dead + traffic, full span".into(), CaseKind::FullSpan { line_load: line, x0, x1 }, x0, x1)
        }
        Pattern::Half(half) => half_span_line(valid, half, line),
        Pattern::Quarter(quarter) => {
            let q = quarter.clamp(1, 4) as f64;
            let (x0, x1) = (f.a.x + (q - 1.0) / 4.0 * f.span(), f.a.x + q / 4.0 * f.span());
            let kind = CaseKind::Quarter { quarter: quarter.clamp(1, 4), line_load: line, x0, x1 };
            strip(format!("dead + traffic, quarter {}", quarter.clamp(1, 4)), kind, x0, x1)
        }
        Pattern::HeavyPanel(panel) => doubled_panel(valid, panel)?,
        Pattern::Vehicle(first_axle) => {
            let mut loads = Vec::new();
            if let Some(vehicle) = layout.vehicles.first() {
                let group = &vehicle.axles;
                let mut x = first_axle;
                for (k, q) in group.loads.iter().enumerate() {
                    loads.push(DeckLoad::Point { x, p: q * sharing.whole.vehicle_weight });
                    let spacing = match group.variable {
                        Some(v) if v.index == k => v.min,
                        _ => group.spacings.get(k).copied().unwrap_or(0.0),
                    };
                    x -= spacing;
                }
            }
            let total = loads.iter().map(|l| if let DeckLoad::Point { p, .. } = l { *p } else { 0.0 }).sum();
            let along = if f.span() > 0.0 { (first_axle - f.a.x) / f.span() } else { 0.0 };
            CaseSpec {
                name: format!("dead + vehicle at x = {first_axle:.1} m"),
                kind: CaseKind::Vehicle { first_axle, total, along },
                with_dead: true,
                loads,
                imposed: Vec::new(),
            }
        }
    })
}

/// The joint loads (joint, kN down) of one deck load: panel reactions of the deck spans.
fn joint_loads(f: &Layout, topo: &Topology, rib_y: &[f64], load: &DeckLoad) -> Vec<(Joint, f64)> {
    let mut spans: Vec<(Joint, Joint)> = topo.deck.iter().chain(topo.drop_in.iter()).copied().collect();
    crate::order::sort_by(&mut spans, |p, q| position(f, rib_y, p.0).x.total_cmp(&position(f, rib_y, q.0).x));
    let mut out = Vec::new();
    match *load {
        DeckLoad::Strip { w, x0, x1 } => {
            for &(j, k) in &spans {
                let (xj, xk) = (position(f, rib_y, j).x, position(f, rib_y, k).x);
                let (lo, hi) = (x0.max(xj), x1.min(xk));
                let len = xk - xj;
                if hi <= lo || len <= 0.0 {
                    continue;
                }
                let (resultant, centre) = (w * (hi - lo), 0.5 * (lo + hi));
                out.push((j, resultant * (xk - centre) / len));
                out.push((k, resultant * (centre - xj) / len));
            }
        }
        DeckLoad::PanelPoint { panel, p } => {
            let x = f.panel_x.get(panel).copied().unwrap_or(f64::NAN);
            out.extend(point_on_spans(f, rib_y, &spans, x, p));
        }
        DeckLoad::Point { x, p } => out.extend(point_on_spans(f, rib_y, &spans, x, p)),
    }
    out.retain(|(_, p)| *p != 0.0);
    out
}

/// A point load `p` at `x` on the first deck span holding x (a joint at x takes it all),
/// shared between the span's joints by the lever rule; nothing off the spans.
fn point_on_spans(f: &Layout, rib_y: &[f64], spans: &[(Joint, Joint)], x: f64, p: f64) -> Vec<(Joint, f64)> {
    let at = |j: Joint| position(f, rib_y, j).x;
    match spans.iter().find(|&&(j, k)| at(j) <= x && x <= at(k)) {
        Some(&(j, k)) if at(k) > at(j) => {
            let (xj, xk) = (at(j), at(k));
            vec![(j, p * (xk - x) / (xk - xj)), (k, p * (x - xj) / (xk - xj))]
        }
        _ => Vec::new(),
    }
}

/// Builds the load case `spec` for `generated`, a model generated from `valid` (frame
/// model, truss idealisation or bare rib): its dead case (when `with_dead`) plus the deck
/// loads as nodal loads at the deck joints, or, where the model has no node at a deck
/// joint (the bare rib), at the rib node under it.
///
/// Errors: a model without a "dead" case when one is asked for, a non-finite load, a
/// panel point that does not exist.
pub fn build_case(
    valid: &ValidDesign,
    generated: &Generated,
    spec: &CaseSpec,
) -> Result<LoadCase, StaticsError> {
    let f = valid.layout();
    let rib_y = valid.form().rib_y();
    let topo = valid.topology();
    let model = &generated.model;
    let at_case = || Location::LoadCase(spec.name.clone());
    let mut lc = if spec.with_dead {
        let dead =
            model.load_cases.iter().find(|c| c.name == DEAD).ok_or_else(|| {
                StaticsError::invalid(at_case(), "the model has no dead load case to include")
            })?;
        LoadCase { name: spec.name.clone(), ..dead.clone() }
    } else {
        LoadCase { name: spec.name.clone(), ..LoadCase::default() }
    };
    for load in &spec.loads {
        let finite = match *load {
            DeckLoad::Strip { w, x0, x1 } => w.is_finite() && x0.is_finite() && x1.is_finite(),
            DeckLoad::PanelPoint { p, .. } => p.is_finite(),
            DeckLoad::Point { x, p } => x.is_finite() && p.is_finite(),
        };
        if !finite {
            return Err(StaticsError::invalid(at_case(), "a deck load is not finite"));
        }
        if let DeckLoad::PanelPoint { panel, .. } = *load {
            if panel > f.panels {
                return Err(StaticsError::invalid(
                    at_case(),
                    format!("panel point {panel} does not exist (the arch has {} panels)", f.panels),
                ));
            }
        }
        for (j, p) in joint_loads(f, topo, &rib_y, load) {
            // a deck joint the model lacks (the bare rib) passes its load down its post
            let node = generated
                .map
                .node_of(j)
                .or_else(|| generated.map.node_of(Joint::Rib(topo.rib_of(f, j))))
                .ok_or_else(|| {
                    StaticsError::invalid(
                        at_case(),
                        "the model has no node at a loaded deck joint or the rib node under it; build the case \
                         for a model generated from this design",
                    )
                })?;
            if let Some(l) = lc.nodal.iter_mut().find(|l| l.node == node) {
                l.fy -= p;
            } else {
                lc.nodal.push(NodalLoad { node, fx: 0.0, fy: -p, mz: 0.0 });
            }
        }
    }
    for imposed in &spec.imposed {
        add_imposed(valid, generated, &mut lc, imposed).map_err(|m| StaticsError::invalid(at_case(), m))?;
    }
    Ok(lc)
}

/// Adds one imposed action to `lc` of `generated` (see [`Imposed`]). Err: the words of
/// a value that is not finite.
fn add_imposed(
    valid: &ValidDesign,
    generated: &Generated,
    lc: &mut LoadCase,
    imposed: &Imposed,
) -> Result<(), String> {
    let model = &generated.model;
    match *imposed {
        Imposed::Temperature { delta_t, deck_only } => {
            if !delta_t.is_finite() {
                return Err(format!("the temperature change {delta_t} K is not a number"));
            }
            let on_deck = |k: usize| {
                matches!(generated.map.roles.get(k), Some(MemberRole::Deck | MemberRole::Approach))
            };
            lc.temperature.extend(
                (0..model.members.len())
                    .filter(|&k| !deck_only || on_deck(k))
                    .map(|member| TemperatureLoad { member, delta_t }),
            );
        }
        Imposed::SpringingMovement { spread, settlement_left, settlement_right } => {
            if ![spread, settlement_left, settlement_right].iter().all(|v| v.is_finite()) {
                return Err("a springing movement is not a number".into());
            }
            let [left, right] = generated.map.springings;
            for (node, dx, down) in
                [(left, -spread / 2.0, settlement_left), (right, spread / 2.0, settlement_right)]
            {
                for (dof, value) in [(Dof::X, dx), (Dof::Y, -down)] {
                    if value != 0.0 {
                        lc.prescribed.push(PrescribedDisplacement { node, dof, value });
                    }
                }
            }
        }
        Imposed::Braking { force } => {
            if !force.is_finite() {
                return Err(format!("the braking force {force} kN is not a number"));
            }
            if generated.kind == ModelKind::BareRib {
                return Ok(());
            }
            let path = load_path(generated);
            let x: Vec<f64> = path.iter().map(|&n| model.nodes.get(n).map_or(f64::NAN, |p| p.x)).collect();
            let length = match (x.first(), x.last()) {
                (Some(a), Some(b)) if b > a => b - a,
                _ => return Ok(()),
            };
            // each node's x with its neighbours' (its own where it has none)
            let before = std::iter::once(None).chain(x.iter().map(Some));
            let after = x.iter().skip(1).map(Some).chain(std::iter::repeat(None));
            for ((&node, &xi), (left, right)) in path.iter().zip(&x).zip(before.zip(after)) {
                let before = left.map_or(0.0, |l| xi - l);
                let after = right.map_or(0.0, |r| r - xi);
                let fx = force * 0.5 * (before + after) / length;
                match lc.nodal.iter_mut().find(|l| l.node == node) {
                    Some(l) => l.fx += fx,
                    None => lc.nodal.push(NodalLoad { node, fx, fy: 0.0, mz: 0.0 }),
                }
            }
        }
        Imposed::RibSelfWeight => {
            if generated.kind != ModelKind::BareRib {
                return Ok(());
            }
            let unit_weight = valid.design().groups.rib.unit_weight;
            for &member in &generated.map.rib_members {
                let Some(m) = model.members.get(member) else { continue };
                let w = -unit_weight * m.a;
                lc.member.push(MemberLoad::Uniform {
                    member,
                    w,
                    direction: LoadDirection::GlobalY,
                    projected: false,
                });
            }
        }
    }
    Ok(())
}

/// Adds every case of `specs` to `generated` (see [`build_case`]), after its existing
/// cases. Errors as `build_case`; on error the model is left unchanged.
pub fn add_cases(
    valid: &ValidDesign,
    generated: &mut Generated,
    specs: &[CaseSpec],
) -> Result<(), StaticsError> {
    let built: Result<Vec<LoadCase>, StaticsError> =
        specs.iter().map(|s| build_case(valid, generated, s)).collect();
    generated.model.load_cases.extend(built?);
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::design::{Bracing, Design, RibSystem};
    use crate::arch::generate::{bare_rib_model, frame_model, truss_model};

    fn total_fy(lc: &LoadCase) -> f64 {
        lc.nodal.iter().map(|l| l.fy).sum()
    }

    #[test]
    fn half_span_load_reaches_every_model_in_full() {
        // the strip's resultant reaches each model, whichever joints take it (statics of
        // simple spans): 4 kN/m2 x 11 m deck width x half the demo span (106.428571 m
        // between the springings at x = 30 m and 136.428571 m) = 2,341.428571 kN
        for (n, system) in
            [(12, RibSystem::ThreeHinged), (7, RibSystem::ThreeHinged), (8, RibSystem::TwoHinged)]
        {
            let mut d = Design::demo();
            d.panels = n;
            d.rib_system = system;
            d.bracing = Bracing::Single { flipped: false };
            let v = ValidDesign::new(&d).expect("valid");
            let spec = CaseSpec { with_dead: false, ..half_span(&v, Half::Left, 4.0).expect("spec") };
            let expected = -2_341.428_571_428_571;
            let truss = truss_model(&v).expect("braced");
            for model in [frame_model(&v), truss, bare_rib_model(&v)] {
                let lc = build_case(&v, &model, &spec).expect("case");
                assert!((total_fy(&lc) - expected).abs() < 1e-9 * expected.abs(), "{n}: {}", model.kind);
                // nothing right of the crown panel (crown at x = 83.214 m)
                let panel = v.form().span / n as f64;
                assert!(lc.nodal.iter().all(|l| model.model.nodes[l.node].x <= 83.214_285_8 + panel));
            }
        }
    }

    #[test]
    fn doubled_panel_adds_one_deck_panel_load() {
        let d = Design::demo();
        let v = ValidDesign::new(&d).expect("valid");
        let model = truss_model(&v).expect("braced");
        let spec = doubled_panel(&v, 3).expect("spec");
        let lc = build_case(&v, &model, &spec).expect("case");
        let dead = total_fy(&model.model.load_cases[0]);
        // worked by hand from the demo: deck line load (6.25 + 2.4) kN/m2 x 11 m + 2 ribs x
        // 78.5 kN/m3 x 0.05 m2 = 103.0 kN/m; panel 106.428571 m / 12 = 8.869048 m;
        // 103.0 x 8.869048 = 913.511905 kN
        let extra = 913.511_904_761_9;
        assert!((total_fy(&lc) - dead + extra).abs() < 1e-9 * extra, "{}", dead - total_fy(&lc));
        assert!(doubled_panel(&v, 0).is_err() && doubled_panel(&v, d.panels).is_err());
        let bad = CaseSpec { loads: vec![DeckLoad::PanelPoint { panel: 99, p: 1.0 }], ..spec };
        assert!(build_case(&v, &model, &bad).is_err());
    }

    #[test]
    fn case_ids_name_what_the_case_is_and_survive_a_new_panel_count() {
        let v = ValidDesign::new(&Design::demo()).expect("valid");
        let kinds: Vec<CaseKind> =
            std::iter::once(CaseKind::Dead).chain(standard_cases(&v).into_iter().map(|c| c.kind)).collect();
        let ids: Vec<String> = kinds.iter().map(CaseKind::id).collect();
        // the demo's 12 panels: the quarter point is panel point 12 / 4 = 3
        assert_eq!(ids, ["dead", "half-left", "panel-3"]);
        assert_eq!(find_case(&kinds, "panel-3"), Some(2));
        assert_eq!(find_case(&kinds, "half-left"), Some(1));
        // a link of an 8-panel design (panel 2) opened on this one: the heavier panel
        assert_eq!(find_case(&kinds, "panel-2"), Some(2));
        // more cases in front do not move an id
        let more: Vec<CaseKind> = std::iter::once(CaseKind::Other).chain(kinds.iter().copied()).collect();
        assert_eq!(find_case(&more, "half-left"), Some(2));
        // not a case of this analysis, or not an id at all
        assert_eq!(find_case(&kinds, "half-right"), None);
        assert_eq!(find_case(&kinds, "panel-x"), None);
        assert_eq!(find_case(&kinds, ""), None);
        assert!(ids
            .iter()
            .all(|id| id.bytes().all(|b| b.is_ascii_lowercase() || b.is_ascii_digit() || b == b'-')));
    }

    #[test]
    fn case_titles_are_words_and_descriptions_convert_units() {
        let half =
            CaseKind::HalfSpan { half: Half::Left, intensity: 5.0, line_load: 55.0, x0: 30.0, x1: 83.2 };
        assert_eq!(half.title(), "Traffic, left half");
        assert_eq!(CaseKind::DoubledPanel { panel: 3, load: 913.5, x: 56.6 }.title(), "Heavier panel 3");
        let us = half.describe(Units::UsCustomary);
        // 5.0 kN/m2 = 104.4 psf; 55 kN/m = 3.769 kip/ft; 30 m = 98.43 ft (NIST SP 811 factors)
        assert!(us.contains("104.4\u{a0}psf") && us.contains("3.769\u{a0}kip/ft"), "{us}");
        assert!(us.contains("x = 98.43\u{a0}ft"), "{us}");
        assert!(!us.contains("kN") && !us.contains(" m "), "{us}");
        let si = half.describe(Units::Si);
        assert!(si.contains("(5.000\u{a0}kN/m²") && si.contains("55.00\u{a0}kN/m "), "{si}");
    }
}
