//! Traffic envelopes of a deck arch: every influence line of a generated model under the
//! design's load model, combined with the permanent actions.
//!
//! For each line (`arch::influence::ArchLine`: springing H, V and M, every member's N and
//! the end moments of frame members, so the rib and deck moments on both sides of every
//! node):
//!
//! 1. the permanent effect G: the model's dead-load case, the same loads the analysis
//!    solves;
//! 2. the traffic extremes: `frame::envelope` with the uniform load where the line is
//!    adverse and the vehicle at its worst, for each vehicle arrangement of the load
//!    model (`traffic::models`), keeping the worst and where it stands. The AASHTO
//!    two-truck load counts only for deck negative moments and for the posts and piers
//!    that carry the deck (its interior reactions), AASHTO LRFD 3.6.1.3.1;
//!    A crowd's intensity follows the loaded length of each extreme (EN 1991-2 eq. 5.1).
//! 3. sharing (`traffic::sharing`): springing forces are for the whole cross-section
//!    (permanent + the whole section's traffic); member forces are per rib line
//!    (permanent / ribs + the traffic of the rib with the worst share, every rib tried);
//! 4. the design extremes of every combination (`traffic::combination`), the permanent
//!    effect factored as a whole.
//!
//! Units: kN and kNm; signs those of the line (`ArchLine`). Concept-design values: local
//! codes and a licensed engineer govern.

use crate::arch::actions::{action_cases, braking, Braking};
use crate::arch::analysis::CAUTION;
use crate::arch::cases::add_cases;
use crate::arch::cases::{CaseKind, CaseSpec, DeckLoad};
use crate::arch::generate::{model_of, Generated, MemberRole, ModelKind, DEAD};
use crate::arch::influence::{influence_of, values_of, ArchInfluence, ArchLine};
use crate::arch::validate::ValidDesign;
use crate::error::{Location, Problem, StaticsError};
use crate::frame::envelope::{axle_effects, envelope, AxleGroup, AxlePlacement, Envelope, Extreme, Travel};
use crate::frame::influence::InfluenceLines;
use crate::frame::influence::Quantity;
use crate::frame::model::Dof;
use crate::frame::results::Solution;
use crate::frame::solver::solve;
use crate::traffic::combination::Combination;
use crate::traffic::models::{Applies, Crowd, LaneLayout, LaneWords, LoadModel};
use crate::traffic::sharing::{rib_positions, share, Alternative, LineTraffic, Sharing};
use serde::{Deserialize, Serialize};

/// Step of the unit load along the deck for the envelopes, m (and at every node).
pub const TRAFFIC_STEP: f64 = 1.0;

/// Whom a value is for.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Per {
    /// Every rib line together (springing forces, foundations).
    WholeCrossSection,
    /// One rib line (member forces, sizing).
    RibLine,
}

/// One extreme of the characteristic traffic and what produces it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Governing {
    /// The traffic effect (uniform part + vehicle part), kN or kNm.
    pub value: f64,
    /// The uniform load's part.
    pub uniform_part: f64,
    /// The vehicle's part.
    pub vehicle_part: f64,
    /// Which vehicle arrangement (`tandem`, `truck`, `two trucks`, `uniform`).
    pub arrangement: String,
    /// The rib line whose share governs (0-based, left to right; `None` for the whole
    /// cross-section).
    pub rib: Option<usize>,
    /// Where the uniform load lies: (from, to) along the deck, m.
    pub loaded: Vec<(f64, f64)>,
    /// Where the vehicle stands (`None`: no vehicle, or none makes it worse).
    pub vehicle: Option<AxlePlacement>,
    /// Axles of the vehicle left off because they would relieve this extreme (AASHTO
    /// LRFD 3.6.1.3.1), 0 = the leading axle; empty for a vehicle that acts whole.
    pub axles_left_off: Vec<usize>,
}

/// The design extremes of one combination.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct DesignRange {
    /// The combination's name.
    pub combination: String,
    /// Largest design effect.
    pub max: f64,
    /// Smallest design effect.
    pub min: f64,
}

/// The envelope of one line.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LineEnvelope {
    /// The line's name (what `springline influence --of` takes).
    pub line: String,
    /// What it is, with sign and units.
    pub label: String,
    /// Whole cross-section or one rib line.
    pub per: Per,
    /// Permanent effect (dead load), for `per`.
    pub permanent: f64,
    /// Largest characteristic traffic effect (>= 0).
    pub traffic_max: Governing,
    /// Smallest characteristic traffic effect (<= 0).
    pub traffic_min: Governing,
    /// The effect of each other action alone (temperature, springing movement, braking
    /// to the right; `arch::actions::action_cases` less the erection stage), for `per`.
    pub actions: Vec<ActionEffect>,
    /// Design extremes per combination: permanent, traffic and the other actions.
    pub design: Vec<DesignRange>,
}

/// The effect of one other action on a line, kN or kNm, signs those of the line.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ActionEffect {
    /// The action case's name (`arch::actions`).
    pub case: String,
    /// What the action is.
    pub kind: CaseKind,
    /// Its effect.
    pub value: f64,
}

/// The factored parts of the other actions in a combination's (max, min): the worse of
/// the uniform rise and fall and the worse of the deck warmer and cooler (each where it
/// adds), times the temperature factor; the springing movement where it adds (it never
/// relieves), times the settlement factor; braking either way along the deck (its effect
/// with either sign), times the braking factor. The uniform part and the deck-rib
/// difference are taken together at full value, no reduction (EN 1991-1-5 6.1.6 gives
/// no simultaneity rule for them; conservative, common practice at concept stage).
pub fn action_parts(combination: &Combination, effects: &[ActionEffect]) -> (f64, f64) {
    let (mut up, mut down) = (0.0, 0.0);
    let worst = |pick: &dyn Fn(&CaseKind) -> bool| {
        effects
            .iter()
            .filter(|e| pick(&e.kind))
            .fold((0.0_f64, 0.0_f64), |(hi, lo), e| (hi.max(e.value), lo.min(e.value)))
    };
    let uniform = worst(&|k| matches!(k, CaseKind::Temperature { .. }));
    let deck = worst(&|k| matches!(k, CaseKind::DeckTemperature { .. }));
    let movement = worst(&|k| matches!(k, CaseKind::SpringingMovement { .. }));
    let braking = effects
        .iter()
        .filter(|e| matches!(e.kind, CaseKind::Braking { .. }))
        .fold(0.0_f64, |m, e| m.max(e.value.abs()));
    for (factor, (hi, lo)) in [
        (combination.temperature, uniform),
        (combination.temperature, deck),
        (combination.settlement, movement),
    ] {
        up += factor * hi;
        down += factor * lo;
    }
    up += combination.braking * braking;
    down -= combination.braking * braking;
    (up, down)
}

/// The traffic report of one model of a design.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TrafficReport {
    /// Which model.
    pub model: ModelKind,
    /// The load model's title.
    pub load_model: String,
    /// Its lanes in words (SI).
    pub lanes: String,
    /// The lanes' numbers, to say them in any units (`LaneWords::describe`).
    pub lane_words: LaneWords,
    /// How the traffic is shared between the ribs.
    pub sharing: Sharing,
    /// The combinations reported.
    pub combinations: Vec<Combination>,
    /// Step of the unit load along the deck, m.
    pub step: f64,
    /// The left springing's thrust (whole cross-section): the range of the arch's thrust.
    pub thrust: LineEnvelope,
    /// Every line: springing forces first, then members in model order.
    pub lines: Vec<LineEnvelope>,
    /// The braking force of the load model with its rule and working (`arch::actions`).
    pub braking: Braking,
    /// The live-load deflection of the deck (the frame model only).
    pub deflection: Option<Deflection>,
    /// Caution.
    pub caution: String,
}

impl TrafficReport {
    /// The envelope of the line named `name` (see [`LineEnvelope::line`]).
    pub fn line(&self, name: &str) -> Option<&LineEnvelope> {
        self.lines.iter().find(|l| l.line == name)
    }
}

/// Which sense of a line the AASHTO two-truck load may govern, if any.
fn two_truck_sense(generated: &Generated, line: &ArchLine) -> Option<f64> {
    let role = |k: usize| generated.map.roles.get(k).copied();
    match line {
        // hogging: negative for a deck member drawn left to right (sagging positive)
        ArchLine::Moment(k, _) | ArchLine::MidMoment(k)
            if matches!(role(*k), Some(MemberRole::Deck | MemberRole::Approach)) =>
        {
            let (a, b) = generated.model.members.get(*k).and_then(|m| generated.model.ends(m))?;
            Some(if a.x <= b.x { -1.0 } else { 1.0 })
        }
        // the deck's interior reactions: compression in its posts and piers
        ArchLine::Axial(k) if matches!(role(*k), Some(MemberRole::Post | MemberRole::Pier)) => Some(-1.0),
        _ => None,
    }
}

/// Envelope of one line under one rib's (or the whole section's) traffic: every
/// arrangement tried, the max and min kept with the arrangement's name. Also returns,
/// per combination, the design parts (the factored extremes over arrangements).
struct Candidate {
    envelope: Envelope,
    name: String,
    axles: Option<AxleGroup>,
    counts_for_max: bool,
    counts_for_min: bool,
}

/// `crowd`: a crowd model with a formula and the span its layout was made for: each
/// extreme's uniform part is rescaled to the intensity of its own loaded length.
fn candidates(
    x: &[f64],
    eta: &[f64],
    alternatives: &[Alternative],
    two_truck: Option<f64>,
    crowd: Option<(&Crowd, f64)>,
) -> Result<Vec<Candidate>, StaticsError> {
    let mut out = Vec::new();
    for alt in alternatives {
        let (counts_for_max, counts_for_min) = match (alt.applies, two_truck) {
            (Applies::Everywhere, _) => (true, true),
            (Applies::HoggingAndInteriorReactions, Some(sense)) => (sense > 0.0, sense < 0.0),
            (Applies::HoggingAndInteriorReactions, None) => (false, false),
        };
        if !(counts_for_max || counts_for_min) {
            continue;
        }
        let mut envelope = envelope(x, eta, &alt.traffic)?;
        if let Some((crowd, span)) = crowd {
            // EN 1991-2 eq. 5.1 takes L as the loaded length: the adverse part's
            for extreme in [&mut envelope.max, &mut envelope.min] {
                let loaded: f64 = extreme.loaded.iter().map(|(a, b)| b - a).sum();
                let used = crowd.intensity(span);
                if used > 0.0 && loaded > 0.0 {
                    let factor = crowd.intensity(loaded) / used;
                    extreme.uniform_part *= factor;
                    extreme.value = extreme.uniform_part + extreme.axle_part;
                }
            }
        }
        out.push(Candidate {
            envelope,
            name: alt.name.clone(),
            axles: alt.traffic.axles.clone(),
            counts_for_max,
            counts_for_min,
        });
    }
    Ok(out)
}

/// The extreme `e` (of sign `sign`) of candidate `c` as reported, with the axles a group
/// that neglects relieving axles left off at its placement.
fn governing(e: &Extreme, c: &Candidate, rib: Option<usize>, line: (&[f64], &[f64]), sign: f64) -> Governing {
    let axles_left_off = match (&c.axles, &e.axles) {
        (Some(group), Some(at)) if group.neglect_relieving => axle_effects(line.0, line.1, group, at)
            .iter()
            .enumerate()
            .filter(|(_, v)| sign * **v < 0.0)
            .map(|(k, _)| k)
            .collect(),
        _ => Vec::new(),
    };
    let name = &c.name;
    Governing {
        value: e.value,
        uniform_part: e.uniform_part,
        vehicle_part: e.axle_part,
        arrangement: name.to_string(),
        rib,
        loaded: e.loaded.clone(),
        vehicle: e.axles,
        axles_left_off,
    }
}

/// The envelope of one line over every traffic it may take (one per rib, or the whole
/// section's), with the permanent effect `permanent` of the same `per`.
fn line_envelope(
    x: &[f64],
    eta: &[f64],
    traffics: &[(Option<usize>, Vec<Alternative>)],
    two_truck: Option<f64>,
    permanent: f64,
    combinations: &[Combination],
    crowd: Option<(&Crowd, f64)>,
) -> Result<(Governing, Governing, Vec<DesignRange>), StaticsError> {
    let none = |rib| Governing {
        value: 0.0,
        uniform_part: 0.0,
        vehicle_part: 0.0,
        arrangement: "none".into(),
        rib,
        loaded: Vec::new(),
        vehicle: None,
        axles_left_off: Vec::new(),
    };
    let mut max = none(None);
    let mut min = none(None);
    // effects below rounding noise of the permanent effect's size are no effect: no
    // placement is reported for a line the traffic cannot move (the solver's zero)
    let noise = 1e-9 * permanent.abs().max(1.0);
    // per combination: the largest and smallest factored traffic over arrangements and ribs
    let mut design: Vec<(f64, f64)> = vec![(0.0, 0.0); combinations.len()];
    for (rib, alternatives) in traffics {
        for c in candidates(x, eta, alternatives, two_truck, crowd)? {
            if c.counts_for_max && c.envelope.max.value > max.value.max(noise) {
                max = governing(&c.envelope.max, &c, *rib, (x, eta), 1.0);
            }
            if c.counts_for_min && c.envelope.min.value < min.value.min(-noise) {
                min = governing(&c.envelope.min, &c, *rib, (x, eta), -1.0);
            }
            for (comb, range) in combinations.iter().zip(design.iter_mut()) {
                if c.counts_for_max {
                    let v =
                        comb.uniform * c.envelope.max.uniform_part + comb.vehicle * c.envelope.max.axle_part;
                    range.0 = range.0.max(v);
                }
                if c.counts_for_min {
                    let v =
                        comb.uniform * c.envelope.min.uniform_part + comb.vehicle * c.envelope.min.axle_part;
                    range.1 = range.1.min(v);
                }
            }
        }
    }
    let design = combinations
        .iter()
        .zip(design)
        .map(|(comb, (q_max, q_min))| {
            // the permanent factor for the whole effect (Combination::design); the
            // traffic parts are factored already
            let (g_max, g_min) = comb.design(permanent, (0.0, 0.0), (0.0, 0.0));
            DesignRange { combination: comb.name.clone(), max: g_max + q_max, min: g_min + q_min }
        })
        .collect();
    Ok((max, min, design))
}

/// The rib lines' traffics, identical ones once (a symmetric deck has two alike).
fn rib_traffics(sharing: &Sharing, layout: &LaneLayout) -> Vec<(Option<usize>, Vec<Alternative>)> {
    let mut seen: Vec<&LineTraffic> = Vec::new();
    let mut out = Vec::new();
    for (i, rib) in sharing.ribs.iter().enumerate() {
        let alike = |t: &LineTraffic| {
            let near = |a: f64, b: f64| (a - b).abs() <= 1e-9 * (1.0 + a.abs().max(b.abs()));
            near(t.lanes_uniform, rib.traffic.lanes_uniform)
                && near(t.other_uniform, rib.traffic.other_uniform)
                && near(t.vehicle_weight, rib.traffic.vehicle_weight)
        };
        if seen.iter().any(|t| alike(t)) {
            continue;
        }
        seen.push(&rib.traffic);
        out.push((Some(i), rib.traffic.alternatives(layout)));
    }
    out
}

/// The traffic envelopes of a design's model `kind` (frame model, truss idealisation or
/// bare rib): see the module doc. The unit load runs every [`TRAFFIC_STEP`] m along the
/// deck and at every node (the bare rib: at its rib nodes).
///
/// Ok(None) for the truss idealisation of an unbraced design. Errors: those of the
/// influence lines and the solver (a model that cannot be solved).
pub fn traffic_envelopes(
    valid: &ValidDesign,
    kind: ModelKind,
) -> Result<Option<TrafficReport>, StaticsError> {
    let Some(generated) = model_of(valid, kind) else { return Ok(None) };
    let step = (kind != ModelKind::BareRib).then_some(TRAFFIC_STEP);
    let (permanent, actions) = fixed_cases(valid, &generated)?;
    let influence = influence_of(generated, step)?;
    let mut report = report(valid, kind, &influence, &permanent, &actions)?;
    if kind == ModelKind::Frame {
        report.deflection = Some(deflection(valid, &influence)?);
    }
    Ok(Some(report))
}

/// The dead-load case and the other actions' cases of a model (less the erection stage,
/// which is not combined), each wrapped as a one-position line set so the lines' own
/// reader gives its values.
#[allow(clippy::type_complexity)]
fn fixed_cases(
    valid: &ValidDesign,
    generated: &Generated,
) -> Result<(InfluenceLines, Vec<(String, CaseKind, InfluenceLines)>), StaticsError> {
    let mut with_actions = generated.clone();
    let specs: Vec<CaseSpec> =
        action_cases(valid.design()).into_iter().filter(|c| c.kind != CaseKind::Erection).collect();
    add_cases(valid, &mut with_actions, &specs)?;
    let solution = solve(&with_actions.model)?;
    let wrap = |name: &str| InfluenceLines {
        positions: vec![0.0],
        solution: Solution {
            cases: solution.cases.iter().filter(|c| c.name == name).cloned().collect(),
            free_dofs: solution.free_dofs,
            bandwidth: solution.bandwidth,
        },
    };
    let actions = specs.iter().map(|s| (s.name.clone(), s.kind, wrap(&s.name))).collect();
    Ok((wrap(DEAD), actions))
}

/// Live-load deflection of the deck over the arch.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Deflection {
    /// The limit as span / `ratio`.
    pub ratio: f64,
    /// The arch span, m.
    pub span: f64,
    /// The allowed deflection, span / ratio, m.
    pub allowed: f64,
    /// Per deck node over the arch: (x m, largest downward movement m >= 0, largest
    /// upward movement m >= 0) under the characteristic traffic of the whole section.
    pub along: Vec<(f64, f64, f64)>,
    /// The largest movement either way, m.
    pub worst: f64,
    /// Where it is, m.
    pub at: f64,
    /// `worst` within `allowed`.
    pub within: bool,
    /// How the check is made, in words.
    pub basis: String,
}

/// The live-load deflection of the frame model's deck over the arch: at every deck node
/// between the springing verticals, the envelope of its vertical movement's influence
/// line under the characteristic traffic of the whole cross-section (the load model's
/// uniform load where adverse and its vehicles at their worst, the same envelope as the
/// forces), against span / `actions.deflection_limit`. For HL-93 this takes the full
/// vehicular load, more than AASHTO LRFD 3.6.1.3.2's deflection loading (truck alone,
/// or 25 % of it with the lane load): conservative.
fn deflection(valid: &ValidDesign, influence: &ArchInfluence) -> Result<Deflection, StaticsError> {
    let design = valid.design();
    let f = valid.layout();
    let (layout, sharing) = traffic_of(valid);
    let alternatives = sharing.whole.alternatives(&layout);
    let crowd = match &design.traffic.load_model {
        LoadModel::Crowd(c) if c.fixed.is_none() => Some((c, f.span())),
        _ => None,
    };
    let x = &influence.lines.positions;
    let mut along = Vec::new();
    for (i, node) in influence.generated.map.deck_nodes.iter().enumerate() {
        let Some(node) = *node else { continue };
        let at = f.panel_x.get(i).copied().unwrap_or(f64::NAN);
        let eta = influence.lines.ordinates(Quantity::Displacement { node, dof: Dof::Y })?;
        let (mut down, mut up) = (0.0_f64, 0.0_f64);
        for c in candidates(x, &eta, &alternatives, None, crowd)? {
            down = down.max(-c.envelope.min.value);
            up = up.max(c.envelope.max.value);
        }
        along.push((at, down, up));
    }
    let ratio = design.actions.deflection_limit;
    let allowed = f.span() / ratio;
    // the first node when nothing moves (a model without loads): never an x of NaN
    let first = along.first().map_or(f.a.x, |p| p.0);
    let (at, worst) = along.iter().map(|&(x, d, u)| (x, d.max(u))).fold((first, 0.0), |(bx, bw), (x, w)| {
        if w > bw {
            (x, w)
        } else {
            (bx, bw)
        }
    });
    Ok(Deflection {
        ratio,
        span: f.span(),
        allowed,
        along,
        worst,
        at,
        within: worst <= allowed,
        basis: format!(
            "characteristic traffic of the whole cross-section ({}) on the frame model, against span / {ratio} \
             (AASHTO LRFD 2.5.2.6.2 vehicular limit; for EN designs common practice)",
            design.traffic.load_model.title()
        ),
    })
}

/// The load case that reproduces one extreme of a line's envelope (`max` or min): the
/// dead load, the uniform load over the extreme's loaded intervals and its vehicle where
/// it stands (less the axles it left off as relieving), with the traffic the extreme was
/// found for (the whole section's, or the
/// share of the rib line that governs). Strips reach the deck joints as panel reactions
/// and axles by the lever rule (`arch::cases`), and loads off the arch span are left out,
/// so the case's effect equals the envelope's where the deck carries loads as simple
/// spans and the extreme's loads lie on the arch span; elsewhere it is close.
pub fn placement_case(valid: &ValidDesign, line: &LineEnvelope, max: bool) -> CaseSpec {
    let (layout, sharing) = traffic_of(valid);
    let extreme = if max { &line.traffic_max } else { &line.traffic_min };
    let traffic = match extreme.rib.and_then(|r| sharing.ribs.get(r)) {
        Some(rib) => &rib.traffic,
        None => &sharing.whole,
    };
    let alternative = traffic.alternatives(&layout).into_iter().find(|a| a.name == extreme.arrangement);
    let mut loads = Vec::new();
    if let Some(alt) = alternative {
        loads.extend(extreme.loaded.iter().map(|&(x0, x1)| DeckLoad::Strip {
            w: alt.traffic.uniform,
            x0,
            x1,
        }));
        if let (Some(group), Some(at)) = (&alt.traffic.axles, &extreme.vehicle) {
            let behind = if at.travel == Travel::Rightward { -1.0 } else { 1.0 };
            let mut x = at.first_axle;
            for (k, q) in group.loads.iter().enumerate() {
                if !extreme.axles_left_off.contains(&k) {
                    loads.push(DeckLoad::Point { x, p: *q });
                }
                let spacing = match (group.variable, at.spacing) {
                    (Some(v), Some(s)) if v.index == k => s,
                    _ => group.spacings.get(k).copied().unwrap_or(0.0),
                };
                x += behind * spacing;
            }
        }
    }
    // a rib line's extreme is loaded with that rib's share on the whole cross-section's
    // model: its member then carries the rib line's traffic (and all ribs' dead load)
    let whose = match extreme.rib {
        Some(r) => format!(", traffic of rib line {}", r + 1),
        None => String::new(),
    };
    CaseSpec {
        name: format!(
            "dead + traffic for the {} of {}{whose}",
            if max { "largest" } else { "smallest" },
            line.line
        ),
        kind: CaseKind::Placement { max },
        with_dead: true,
        loads,
        imposed: Vec::new(),
    }
}

/// The lanes of the design's load model on its carriageway and how they are shared
/// between its ribs (`traffic::sharing::share`): what every traffic case and envelope of
/// the design loads.
///
/// Worked out once per validated design and kept with it (a clone is returned).
pub fn traffic_of(valid: &ValidDesign) -> (LaneLayout, Sharing) {
    valid
        .lanes_or_init(|| {
            let design = valid.design();
            let t = &design.traffic;
            let layout = t.load_model.lane_layout(t.carriageway_width, valid.layout().span());
            let positions = rib_positions(design.deck.width, design.deck.ribs, &t.rib_positions);
            let sharing = share(&layout, design.deck.width, t.carriageway_width, &positions);
            (layout, sharing)
        })
        .clone()
}

/// Whether [`traffic_of`] gives the same lanes and sharing for `a` as for `b`: the same
/// load model, carriageway, deck width, ribs, rib positions and span (what it reads).
pub(crate) fn same_lanes(a: &ValidDesign, b: &ValidDesign) -> bool {
    let inputs = |v: &ValidDesign| {
        let d = v.design();
        let t = &d.traffic;
        (v.layout().span(), d.deck.width, d.deck.ribs, t.carriageway_width)
    };
    let (da, db) = (a.design(), b.design());
    inputs(a) == inputs(b)
        && da.traffic.load_model == db.traffic.load_model
        && da.traffic.rib_positions == db.traffic.rib_positions
}

fn report(
    valid: &ValidDesign,
    kind: ModelKind,
    influence: &ArchInfluence,
    permanent: &InfluenceLines,
    action_lines: &[(String, CaseKind, InfluenceLines)],
) -> Result<TrafficReport, StaticsError> {
    let design = valid.design();
    let t = &design.traffic;
    let (layout, sharing) = traffic_of(valid);
    let whole = vec![(None, sharing.whole.alternatives(&layout))];
    let ribs = rib_traffics(&sharing, &layout);
    let rib_count = design.deck.ribs.max(1) as f64;
    let crowd = match &t.load_model {
        LoadModel::Crowd(c) if c.fixed.is_none() => Some((c, valid.layout().span())),
        _ => None,
    };
    let generated = &influence.generated;
    let x = &influence.lines.positions;
    let mut lines = Vec::new();
    for line in ArchLine::every(generated) {
        let eta = influence.ordinates(&line)?;
        let g_whole = values_of(generated, permanent, &line)?.first().copied().unwrap_or(0.0);
        let per = match line {
            ArchLine::Thrust(_) | ArchLine::Vertical(_) | ArchLine::SpringingMoment(_) => {
                Per::WholeCrossSection
            }
            ArchLine::Axial(_) | ArchLine::Moment(..) | ArchLine::MidMoment(_) => Per::RibLine,
        };
        let (traffics, g) = match per {
            Per::WholeCrossSection => (&whole, g_whole),
            Per::RibLine => (&ribs, g_whole / rib_count),
        };
        let (traffic_max, traffic_min, mut design_ranges) =
            line_envelope(x, &eta, traffics, two_truck_sense(generated, &line), g, &t.combinations, crowd)?;
        let share = if per == Per::RibLine { 1.0 / rib_count } else { 1.0 };
        let actions: Vec<ActionEffect> = action_lines
            .iter()
            .map(|(case, kind, lines)| {
                let v = values_of(generated, lines, &line)?.first().copied().unwrap_or(0.0);
                Ok(ActionEffect { case: case.clone(), kind: *kind, value: v * share })
            })
            .collect::<Result<_, StaticsError>>()?;
        for (range, comb) in design_ranges.iter_mut().zip(&t.combinations) {
            let (up, down) = action_parts(comb, &actions);
            range.max += up;
            range.min += down;
        }
        lines.push(LineEnvelope {
            line: line.name(generated),
            label: line.header(generated),
            per,
            permanent: g,
            traffic_max,
            traffic_min,
            actions,
            design: design_ranges,
        });
    }
    let thrust = lines.iter().find(|l| l.line == "thrust").cloned().ok_or_else(|| {
        StaticsError::Invalid(vec![Problem::new(
            Location::Part("traffic".into()),
            "the model has no left springing",
        )])
    })?;
    Ok(TrafficReport {
        model: kind,
        load_model: t.load_model.title().to_string(),
        lanes: layout.rule.clone(),
        lane_words: layout.words,
        sharing,
        combinations: t.combinations.clone(),
        step: if kind == ModelKind::BareRib { 0.0 } else { TRAFFIC_STEP },
        thrust,
        lines,
        braking: braking(design),
        deflection: None,
        caution: CAUTION.to_string(),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::design::{Bracing, Design, RibSystem};
    use crate::arch::generate::{frame_model, truss_model};
    use crate::arch::influence::load_path;
    use crate::frame::influence::unit_load_case;
    use crate::frame::model::LoadCase;
    use crate::traffic::models::ModelFamily;
    use crate::traffic::TrafficDesign;

    fn report_of(d: &Design, kind: ModelKind) -> TrafficReport {
        let valid = ValidDesign::new(d).expect("valid design");
        traffic_envelopes(&valid, kind).expect("solves").expect("model exists")
    }

    /// Loads along the frame model's deck as the influence lines carry them: point loads
    /// (x, kN down) and a uniform load over intervals, as point loads every 5 cm (midpoint
    /// rule), each through the unit-load rule of `frame::influence`.
    fn deck_case(g: &Generated, points: &[(f64, f64)], uniform: f64, loaded: &[(f64, f64)]) -> LoadCase {
        let path = load_path(g);
        let xs: Vec<f64> = path.iter().map(|&n| g.model.nodes[n].x).collect();
        let tol = 1e-9 * (xs[xs.len() - 1] - xs[0]);
        let mut all: Vec<(f64, f64)> = points.to_vec();
        for &(a, b) in loaded {
            let pieces = ((b - a) / 0.05).ceil().max(1.0) as usize;
            let h = (b - a) / pieces as f64;
            all.extend((0..pieces).map(|k| (a + (k as f64 + 0.5) * h, uniform * h)));
        }
        let mut case = LoadCase { name: "placement".into(), ..LoadCase::default() };
        for (k, &(x, p)) in all.iter().enumerate() {
            if x < xs[0] - tol || x > xs[xs.len() - 1] + tol {
                continue; // an axle off the deck carries nothing
            }
            let unit = unit_load_case(&g.model, &path, &xs, x, tol, k);
            case.nodal
                .extend(unit.nodal.iter().map(|n| crate::frame::model::NodalLoad { fy: n.fy * p, ..*n }));
            case.member.extend(unit.member.iter().map(|m| match *m {
                MemberLoad::Point { member, p: unit_p, a, direction } => {
                    MemberLoad::Point { member, p: unit_p * p, a, direction }
                }
                other => other,
            }));
        }
        case
    }

    use crate::frame::model::MemberLoad;

    /// The deflection check: each node's envelope is at least what any one placement of
    /// the same traffic does to it (here the uniform load of the whole section over the
    /// arch span alone, solved directly), its worst within a bound it cannot pass (all
    /// of the traffic's uniform load and vehicles over the whole deck at the largest
    /// ordinate), and the limit is span / 800 (AASHTO LRFD 2.5.2.6.2, the preset) of the demo's span (106.43 m / 800 =
    /// 0.133 m).
    #[test]
    fn live_load_deflection_envelope_bounds_a_direct_placement() {
        let d = Design::demo();
        let r = report_of(&d, ModelKind::Frame);
        let valid = ValidDesign::new(&d).expect("valid");
        let defl = r.deflection.clone().expect("frame model has one");
        assert!((defl.allowed - valid.layout().span() / 800.0).abs() < 1e-12);
        assert!((defl.allowed - 0.133_035_714).abs() < 1e-6, "{}", defl.allowed);
        let mut g = frame_model(&valid);
        assert_eq!(defl.along.len(), g.map.deck_nodes.iter().flatten().count());
        let (_, sharing) = traffic_of(&valid);
        let f = valid.layout();
        let uniform = sharing.whole.uniform();
        g.model.load_cases = vec![deck_case(&g, &[], uniform, &[(f.a.x, f.b.x)])];
        let solution = solve(&g.model).expect("solves");
        let mut largest_direct = 0.0_f64;
        for (i, node) in g.map.deck_nodes.iter().enumerate() {
            let Some(node) = *node else { continue };
            let uy = solution.cases[0].displacements[node].uy;
            let (x, down, up) =
                defl.along.iter().copied().find(|p| (p.0 - f.panel_x[i]).abs() < 1e-9).expect("node");
            assert!(down + 1e-12 >= -uy && up + 1e-12 >= uy, "x = {x}: {down} / {up} vs direct {uy}");
            largest_direct = largest_direct.max(uy.abs());
        }
        assert!(defl.worst >= largest_direct && largest_direct > 1e-4, "{} vs {largest_direct}", defl.worst);
        // ... and no more than all of the traffic at once: the uniform load over every
        // metre of the line (its absolute ordinates, trapezoids) plus the whole vehicle
        // at the largest ordinate
        let node = g
            .map
            .deck_nodes
            .iter()
            .enumerate()
            .find(|(i, n)| n.is_some() && (f.panel_x[*i] - defl.at).abs() < 1e-9)
            .and_then(|(_, n)| *n)
            .expect("the worst node");
        let inf = influence_of(frame_model(&valid), Some(TRAFFIC_STEP)).expect("lines");
        let eta = inf.lines.ordinates(Quantity::Displacement { node, dof: Dof::Y }).expect("eta");
        let x = &inf.lines.positions;
        let area: f64 =
            (1..x.len()).map(|k| 0.5 * (eta[k].abs() + eta[k - 1].abs()) * (x[k] - x[k - 1])).sum();
        let peak = eta.iter().fold(0.0_f64, |m, v| m.max(v.abs()));
        let (layout, _) = traffic_of(&valid);
        let vehicle: f64 = layout.vehicles.first().map_or(0.0, |v| v.axles.loads.iter().sum::<f64>())
            * sharing.whole.vehicle_weight;
        let bound = uniform * area + vehicle * peak;
        assert!(vehicle > 0.0 && defl.worst <= bound * (1.0 + 1e-9), "{} vs bound {bound}", defl.worst);
        // the limit check says what the numbers say
        assert_eq!(defl.within, defl.worst <= defl.allowed);
    }

    /// The axle positions of a placement (first axle at `first`, followers behind it).
    fn axle_positions(p: &AxlePlacement, spacings: &[f64]) -> Vec<f64> {
        let dir = if p.travel == Travel::Rightward { -1.0 } else { 1.0 };
        let mut x = vec![p.first_axle];
        for s in spacings {
            let last = x[x.len() - 1];
            x.push(last + dir * s);
        }
        x
    }

    #[test]
    fn the_governing_placement_solved_directly_gives_the_envelope() {
        // Independent check of influence line + envelope: the placement that gives the
        // largest thrust and the largest hogging at a rib end, loaded on the frame model
        // and solved directly, gives the same effect (within the 1 m interpolation of
        // the line: 1 %). EN LM1 on the demo: tandem axles 1.2 m apart.
        let d = Design::demo();
        let valid = ValidDesign::new(&d).expect("valid");
        let g = frame_model(&valid);
        let r = report_of(&d, ModelKind::Frame);
        let whole = &r.sharing.whole;
        let k = g.map.rib_members[2];
        for (name, extreme, traffic) in [
            ("thrust", &r.thrust.traffic_max, whole.clone()),
            (
                &*format!("{}/m-start", g.model.members[k].name),
                &r.line(&format!("{}/m-start", g.model.members[k].name)).expect("line").traffic_min,
                r.sharing.ribs[0].traffic.clone(),
            ),
        ] {
            let vehicle = traffic.vehicle_weight;
            let mut points = Vec::new();
            if let Some(p) = &extreme.vehicle {
                points = axle_positions(p, &[1.2]).into_iter().map(|x| (x, vehicle)).collect();
            }
            let mut model = g.model.clone();
            model.load_cases = vec![deck_case(&g, &points, traffic.uniform(), &extreme.loaded)];
            let solution = solve(&model).expect("solves");
            let lines = InfluenceLines { positions: vec![0.0], solution };
            let line = ArchLine::parse(name, &g).expect("line");
            let direct = values_of(&g, &lines, &line).expect("value")[0];
            assert!(
                (direct - extreme.value).abs() <= 0.01 * extreme.value.abs(),
                "{name}: solved {direct} vs envelope {}",
                extreme.value
            );
            assert!(extreme.value.abs() > 1.0, "{name}: a real effect");
        }
    }

    #[test]
    fn axles_left_off_as_relieving_are_off_the_direct_solve_too() {
        // AASHTO LRFD 3.6.1.3.1 on the demo's frame model: the deck moments beside the
        // crown posts, where a truck or the two-truck load has an axle on the relieving
        // side. The loads of the extreme without those axles, solved directly, give the
        // envelope's value (within the 1 m interpolation of the line: 2 %).
        let mut d = Design::demo();
        d.traffic = TrafficDesign::preset(ModelFamily::Hl93, 7.5);
        let valid = ValidDesign::new(&d).expect("valid");
        let g = frame_model(&valid);
        let r = report_of(&d, ModelKind::Frame);
        let (layout, _) = traffic_of(&valid);
        let mut checked = 0;
        for line in &r.lines {
            for extreme in [&line.traffic_max, &line.traffic_min] {
                let (Some(at), false) = (&extreme.vehicle, extreme.axles_left_off.is_empty()) else {
                    continue;
                };
                let traffic = &r.sharing.ribs[extreme.rib.expect("a member: a rib line")].traffic;
                let alt = traffic
                    .alternatives(&layout)
                    .into_iter()
                    .find(|a| a.name == extreme.arrangement)
                    .expect("the arrangement");
                let group = alt.traffic.axles.as_ref().expect("a vehicle");
                let mut spacings = group.spacings.clone();
                if let (Some(v), Some(s)) = (group.variable, at.spacing) {
                    spacings[v.index] = s;
                }
                let points: Vec<(f64, f64)> = axle_positions(at, &spacings)
                    .into_iter()
                    .zip(&group.loads)
                    .enumerate()
                    .filter(|(k, _)| !extreme.axles_left_off.contains(k))
                    .map(|(_, (x, p))| (x, *p))
                    .collect();
                let mut model = g.model.clone();
                model.load_cases = vec![deck_case(&g, &points, alt.traffic.uniform, &extreme.loaded)];
                let solution = solve(&model).expect("solves");
                let lines = InfluenceLines { positions: vec![0.0], solution };
                let direct =
                    values_of(&g, &lines, &ArchLine::parse(&line.line, &g).expect("line")).expect("value")[0];
                assert!(
                    (direct - extreme.value).abs() <= 0.02 * extreme.value.abs(),
                    "{} ({}): solved {direct} vs envelope {}",
                    line.line,
                    extreme.arrangement,
                    extreme.value
                );
                checked += 1;
            }
        }
        assert!(checked >= 2, "{checked} extremes with axles left off");
    }

    #[test]
    fn springings_take_the_whole_section_and_members_a_rib_line() {
        // the demo: 2 ribs, LM1 on 7.5 m of an 11 m deck
        let d = Design::demo();
        let r = report_of(&d, ModelKind::Frame);
        let valid = ValidDesign::new(&d).expect("valid");
        let g = frame_model(&valid);
        let dead = fixed_cases(&valid, &g).expect("dead").0;
        let inf = influence_of(g.clone(), Some(TRAFFIC_STEP)).expect("lines");
        // the thrust: G for the whole section, traffic of the whole section
        let thrust = ArchLine::parse("thrust", &g).expect("thrust");
        let g_thrust = values_of(&g, &dead, &thrust).expect("g")[0];
        assert_eq!(r.thrust.per, Per::WholeCrossSection);
        assert!((r.thrust.permanent - g_thrust).abs() < 1e-9 * g_thrust.abs());
        let layout = d.traffic.load_model.lane_layout(d.traffic.carriageway_width, valid.layout().span());
        let alt = &r.sharing.whole.alternatives(&layout)[0];
        let e =
            envelope(&inf.lines.positions, &inf.ordinates(&thrust).expect("eta"), &alt.traffic).expect("env");
        assert!((r.thrust.traffic_max.value - e.max.value).abs() < 1e-9 * e.max.value);
        // a rib member: G / 2 and the rib's share, which is less than the whole
        let k = g.map.rib_members[3];
        let line = r.line(&g.model.members[k].name).expect("rib member");
        assert_eq!(line.per, Per::RibLine);
        let g_rib = values_of(&g, &dead, &ArchLine::Axial(k)).expect("g")[0];
        assert!((line.permanent - g_rib / 2.0).abs() < 1e-9 * g_rib.abs());
        let rib = &r.sharing.ribs[0].traffic;
        let alt = &rib.alternatives(&layout)[0];
        let e =
            envelope(&inf.lines.positions, &inf.ordinates(&ArchLine::Axial(k)).expect("eta"), &alt.traffic)
                .expect("env");
        assert!((line.traffic_min.value - e.min.value).abs() < 1e-9 * e.min.value.abs());
        assert!(r.sharing.ribs[0].uniform_fraction > 0.5 && r.sharing.ribs[0].uniform_fraction < 1.0);
        // the other actions alone, by name: rise, fall, deck warmer, deck cooler, springing
        // movement, braking (EN LM1 on the demo: 802.8 kN)
        let effect = |name: &str| line.actions.iter().find(|a| a.case == name).map(|a| a.value).expect(name);
        let (rise, fall) = (effect("temperature rise"), effect("temperature fall"));
        let (warmer, cooler) = (effect("deck warmer than rib"), effect("deck cooler than rib"));
        let (movement, braking) = (effect("springing movement"), effect("braking"));
        // the demo is three-hinged with sliding seats: a uniform temperature moves it
        // freely (statically determinate), the deck-rib difference does not
        assert!(rise.abs() < 1e-6 && fall.abs() < 1e-6, "{rise} {fall}");
        assert!(warmer.abs() > 1.0 && (warmer + cooler).abs() < 1e-9 * warmer.abs(), "{warmer} {cooler}");
        // ULS gr1a on a compressed rib member: 1.35 G + 1.35 (uniform + tandem) at the
        // min, with temperature at gamma_Q psi_0 = 0.9 and the springing movement at
        // gamma_Gset = 1.2 where they add (EN 1990 A2 Table A2.4(B), Table A2.1)
        let adds = |v: f64, f: fn(f64, f64) -> f64| f(v, 0.0);
        let down = 0.9 * adds(rise, f64::min).min(adds(fall, f64::min))
            + 0.9 * adds(warmer, f64::min).min(adds(cooler, f64::min))
            + 1.2 * adds(movement, f64::min);
        let up = 0.9 * rise.max(fall).max(0.0) + 0.9 * warmer.max(cooler).max(0.0) + 1.2 * movement.max(0.0);
        let uls = &line.design[0];
        let expected = 1.35 * line.permanent + 1.35 * line.traffic_min.value + down;
        assert!((uls.min - expected).abs() < 1e-9 * expected.abs(), "{} vs {expected}", uls.min);
        // and the max: the whole dead load with 1.00 (favourable) plus the traffic max
        let expected = line.permanent + 1.35 * line.traffic_max.value + up;
        assert!((uls.max - expected).abs() < 1e-9 * expected.abs(), "{} vs {expected}", uls.max);
        // ULS gr2: braking at 1.35 either way, the traffic at its frequent values x 1.35
        let gr2 = &line.design[3];
        assert_eq!(gr2.combination, "ULS gr2");
        assert!(braking != 0.0);
        let q = 1.35 * (0.40 * line.traffic_min.uniform_part + 0.75 * line.traffic_min.vehicle_part);
        let expected = 1.35 * line.permanent + q + down - 1.35 * braking.abs();
        assert!((gr2.min - expected).abs() < 1e-6 * expected.abs(), "{} vs {expected}", gr2.min);
    }

    #[test]
    fn braced_truss_diagonals_idle_under_dead_load_take_traffic_of_both_signs() {
        // three-hinged, braced: the dead load is the form-finding load, so the diagonals
        // carry nothing under it (1e-9 of the largest force) and both signs under traffic
        let d = Design::demo();
        assert!(matches!(d.rib_system, RibSystem::ThreeHinged) && !matches!(d.bracing, Bracing::None));
        let r = report_of(&d, ModelKind::Truss);
        let valid = ValidDesign::new(&d).expect("valid");
        let g = truss_model(&valid).expect("braced");
        let largest = r.lines.iter().map(|l| l.permanent.abs()).fold(0.0, f64::max);
        let diagonals: Vec<&LineEnvelope> = g
            .map
            .members_with(MemberRole::Bracing)
            .map(|k| r.line(&g.model.members[k].name).expect("diagonal"))
            .collect();
        assert!(!diagonals.is_empty());
        for l in &diagonals {
            assert!(l.permanent.abs() <= 1e-9 * largest, "{}: {}", l.line, l.permanent);
            assert!(
                l.traffic_max.value > 1.0 && l.traffic_min.value < -1.0,
                "{}: {:?}",
                l.line,
                (l.traffic_max.value, l.traffic_min.value)
            );
        }
    }

    #[test]
    fn a_crowd_takes_the_intensity_of_its_loaded_length() {
        // EN 1991-2 5.3.2.1 eq. 5.1: q = 2 + 120 / (L + 30) kN/m2 with L the loaded length
        // (from memory). A rib segment's largest compression loads only part of the span,
        // so its crowd is denser than the whole span's: q(L) / q(span) times the uniform
        // effect at q(span).
        let mut d = Design::demo();
        d.traffic = TrafficDesign::preset(ModelFamily::Crowd, 7.5);
        let valid = ValidDesign::new(&d).expect("valid");
        let r = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("frame");
        let g = frame_model(&valid);
        let inf = influence_of(g.clone(), Some(TRAFFIC_STEP)).expect("lines");
        let k = g.map.rib_members[3];
        let line = r.line(&g.model.members[k].name).expect("rib member");
        let eta = inf.ordinates(&ArchLine::Axial(k)).expect("eta");
        let unit = envelope(
            &inf.lines.positions,
            &eta,
            &crate::frame::envelope::Traffic { uniform: 1.0, axles: None },
        )
        .expect("unit envelope");
        let loaded: f64 = line.traffic_min.loaded.iter().map(|(a, b)| b - a).sum();
        let span = valid.layout().span();
        assert!(loaded < 0.9 * span, "a part of the span: {loaded} of {span}");
        let crowd = crate::traffic::models::Crowd::default();
        let (q_l, q_span) = (crowd.intensity(loaded), crowd.intensity(span));
        assert!(q_l > q_span + 0.1, "{q_l} vs {q_span}");
        // the rib line's uniform load at q(span), kN/m, rescaled to q(L)
        let rib = r.sharing.ribs[line.traffic_min.rib.expect("a rib line")].traffic.uniform();
        let expected = unit.min.value * rib * q_l / q_span;
        assert!(
            (line.traffic_min.value - expected).abs() < 1e-9 * expected.abs(),
            "{} vs {expected}",
            line.traffic_min.value
        );
    }

    #[test]
    fn the_two_truck_load_counts_only_for_deck_hogging_and_the_deck_supports() {
        // AASHTO LRFD 3.6.1.3.1: 90 % of two trucks for negative moment and interior
        // reactions only
        let mut d = Design::demo();
        d.traffic = TrafficDesign::preset(ModelFamily::Hl93, 7.5);
        let r = report_of(&d, ModelKind::Frame);
        let valid = ValidDesign::new(&d).expect("valid");
        let g = frame_model(&valid);
        let role_of = |name: &str| {
            let member = name.split('/').next().unwrap_or(name);
            g.model.members.iter().position(|m| m.name == member).map(|k| g.map.roles[k])
        };
        for l in &r.lines {
            let role = role_of(&l.line);
            if l.traffic_max.arrangement == "two trucks" {
                panic!("{}: two trucks govern a maximum", l.line);
            }
            if l.traffic_min.arrangement == "two trucks" {
                let deck_moment =
                    l.line.contains("/m-") && matches!(role, Some(MemberRole::Deck | MemberRole::Approach));
                let support =
                    !l.line.contains("/m-") && matches!(role, Some(MemberRole::Post | MemberRole::Pier));
                assert!(deck_moment || support, "{}: two trucks where the code does not apply them", l.line);
            }
        }
        // truck rear spacing lies in 4.3..9.0 wherever a truck governs
        for l in &r.lines {
            for e in [&l.traffic_max, &l.traffic_min] {
                if let (Some(p), "truck") = (&e.vehicle, e.arrangement.as_str()) {
                    let s = p.spacing.expect("searched spacing");
                    assert!((4.3 - 1e-9..=9.0 + 1e-9).contains(&s), "{s}");
                }
            }
        }
    }
}

#[cfg(test)]
mod placement_tests {
    use super::*;
    use crate::arch::cases::{build_case, pattern_case, Pattern};
    use crate::arch::design::Design;
    use crate::arch::generate::{frame_model, truss_model};
    use crate::traffic::models::ModelFamily;
    use crate::traffic::TrafficDesign;

    #[test]
    fn a_governing_placement_as_a_load_case_gives_the_envelope_exactly_on_the_truss() {
        // The truss idealisation carries deck loads as simple spans between panel points,
        // as load cases do, so the placement case of an extreme, solved, must give the
        // dead-load value plus the extreme (per rib line: the case carries that rib's
        // traffic on the whole-section model, whose member force is the rib line's). With
        // HL-93 the axles the envelope left off as relieving are left off the case too.
        for family in [ModelFamily::EnLm1, ModelFamily::Hl93] {
            let mut left_off = 0;
            let mut d = Design::demo();
            d.traffic = TrafficDesign::preset(family, 7.5);
            let valid = ValidDesign::new(&d).expect("valid");
            let r = traffic_envelopes(&valid, ModelKind::Truss).expect("solves").expect("braced");
            let mut g = truss_model(&valid).expect("braced");
            for diagonal in g.map.members_with(MemberRole::Bracing).step_by(3).collect::<Vec<_>>() {
                let name = g.model.members[diagonal].name.clone();
                let line = r.line(&name).expect("diagonal line").clone();
                let dead_cases = g.model.load_cases.len();
                for max in [true, false] {
                    let spec = placement_case(&valid, &line, max);
                    let case = build_case(&valid, &g, &spec).expect("case");
                    g.model.load_cases.push(case);
                }
                let solution = solve(&g.model).expect("solves");
                g.model.load_cases.truncate(dead_cases);
                let n = |case: usize| solution.cases[case].members[diagonal].start.n;
                let dead = n(0);
                for (case, extreme) in [(dead_cases, &line.traffic_max), (dead_cases + 1, &line.traffic_min)]
                {
                    left_off += extreme.axles_left_off.len();
                    let traffic = n(case) - dead;
                    assert!(
                        (traffic - extreme.value).abs() <= 1e-6 * extreme.value.abs().max(1.0),
                        "{family:?} {name}: case {traffic} vs envelope {} ({:?})",
                        extreme.value,
                        extreme
                    );
                }
                assert!((line.permanent - dead / d.deck.ribs as f64).abs() <= 1e-9 * dead.abs().max(1.0));
            }
            // an EN tandem acts whole (the frame test below checks axles left off)
            if family == ModelFamily::EnLm1 {
                assert_eq!(left_off, 0);
            }
        }
    }

    #[test]
    fn named_patterns_carry_the_load_models_traffic() {
        // the demo: EN LM1 on a 7.5 m carriageway, footways 1.75 m: the whole section
        // carries 34.5 + 3.75 + 10.5 = 48.75 kN/m (EN 1991-2 Tables 4.2 and 4.4a; worked
        // in traffic::sharing) and tandems of 300 + 200 kN per axle, two axles 1.2 m apart
        let d = Design::demo();
        let valid = ValidDesign::new(&d).expect("valid");
        let f = valid.layout();
        let full = pattern_case(&valid, Pattern::FullSpan).expect("full");
        let total = |spec: &CaseSpec| -> f64 {
            let g = frame_model(&valid);
            let case = build_case(&valid, &g, &CaseSpec { with_dead: false, ..spec.clone() }).expect("case");
            -case.nodal.iter().map(|l| l.fy).sum::<f64>()
        };
        assert!((total(&full) - 48.75 * f.span()).abs() < 1e-6 * 48.75 * f.span());
        let quarters: f64 =
            (1..=4).map(|q| total(&pattern_case(&valid, Pattern::Quarter(q)).expect("quarter"))).sum();
        assert!((quarters - total(&full)).abs() < 1e-6 * quarters);
        let vehicle = pattern_case(&valid, Pattern::Vehicle(f.xc)).expect("vehicle");
        assert!((total(&vehicle) - 1000.0).abs() < 1e-9, "{}", total(&vehicle));
        assert_eq!(vehicle.kind.id(), format!("vehicle-{}", f.xc.round() as u64));
        assert!(pattern_case(&valid, Pattern::HeavyPanel(0)).is_err());
        for text in ["full", "half-left", "half-right", "quarter-3", "panel-4", "vehicle-at-52.5"] {
            assert!(Pattern::parse(text).is_ok(), "{text}");
        }
        let err = Pattern::parse("quarter-5").expect_err("no fifth quarter").to_string();
        assert!(err.contains("quarter-1 to quarter-4"), "{err}");
    }
}
