//! Stability and dynamics of a deck arch in its plane, first numbers: the critical load
//! factor alpha_cr of the frame model under the dead load with its buckled shapes, and
//! the natural frequencies of the frame model with the dead load's masses.
//!
//! Both come from `frame::stability` on the frame model with every member split into
//! four elements (so a post or a diagonal can buckle on its own between its ends): the
//! elastic plus geometric stiffness from the dead load's axial forces, and lumped masses
//! from the dead load over g (no rotational inertia). Out-of-plane buckling and lateral
//! sway are beyond a plane model and are not covered: every report says so.
//!
//! A mode whose largest movement lies inside a post, a diagonal, a pier or the deck
//! between its ends is that member buckling on its own: its member check in sizing covers
//! it (with its own buckling length), and it says nothing of the arch's stability. The
//! arch's alpha_cr, which the verdict and the second-order amplification of the rib
//! (`arch::sizing`) take, is the lowest mode that is not such a local one (its peak at a
//! node of the model or inside the rib). The sizing's governing placements (the factored
//! ultimate combinations with the traffic where it gives each rib member its largest
//! compression and moment) are analysed by [`placement_stability`]. Concept-design
//! values: local codes and a licensed engineer govern.

use crate::arch::analysis::CAUTION;
use crate::arch::cases::{build_case, CaseSpec, DeckLoad};
use crate::arch::generate::{frame_model, Generated, MemberRole, DEAD};
use crate::arch::traffic::{placement_case, LineEnvelope};
use crate::arch::validate::ValidDesign;
use crate::error::StaticsError;
use crate::frame::model::LoadCase;
use crate::frame::stability::{
    BucklingMode, CaseBuckling, EigenSolver, Stability, StabilitySettings, Vibration,
};
use crate::traffic::combination::Combination;
use crate::traffic::models::ModelFamily;
use serde::{Deserialize, Serialize};

/// How many buckling modes of the arch are found per load case (posts and diagonals
/// kept whole, [`arch_only`]): enough that the arch's own mode shows above a pier or the
/// deck buckling on its own in most designs (when it does not, the highest mode found
/// is its lower bound and the report says so). The governing placements of sizing find
/// one mode first and these only when that one is not the arch's
/// ([`placement_stability`]).
pub const ARCH_MODES: usize = 3;

/// The refinement of the arch's own modes: two elements per member. The arch's modes
/// span several panels, so two cubic elements per rib segment find them closely (the
/// demo's alpha_cr agrees with four elements' to 0.2 %) at a quarter of the cost; a
/// rib segment buckling on its own between its nodes comes out about 0.75 % high (a
/// pin-ended column on two cubic elements, from memory), on the unsafe side by that
/// much.
pub const ARCH_SETTINGS: StabilitySettings = StabilitySettings { parts: 2, solver: EigenSolver::Subspace };

/// alpha_cr at or above which a first-order analysis is acceptable (EN 1993-1-1
/// 5.2.1(3), elastic analysis: alpha_cr >= 10).
pub const FIRST_ORDER_ALPHA: f64 = 10.0;
/// alpha_cr below which amplifying first-order moments is no longer acceptable (EN
/// 1993-1-1 5.2.2(5), from memory: the amplification 1 / (1 - 1/alpha_cr) only for
/// alpha_cr >= 3).
pub const AMPLIFICATION_LEAST_ALPHA: f64 = 3.0;
/// Vertical frequency below which a footbridge needs a comfort check, Hz (EN 1990 Annex
/// A2, A2.4.3.2, from memory: 5 Hz for vertical vibrations).
pub const FOOTBRIDGE_COMFORT_HZ: f64 = 5.0;
/// The range of vertical frequencies that walkers excite most, Hz (common practice:
/// about 1.6 to 2.4 Hz, the pace frequencies of walking).
pub const WALKING_RANGE_HZ: [f64; 2] = [1.6, 2.4];

/// What the stability analysis says, in words for the screen and the CLI.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ArchStability {
    /// The dead load's buckling: alpha_cr of each mode and its shape (original and
    /// refined nodes).
    pub dead: CaseBuckling,
    /// alpha_cr of the dead load (the lowest mode, local or not).
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub alpha_cr: f64,
    /// The arch's alpha_cr under the dead load: its lowest mode that is not a member
    /// buckling on its own (module doc); what the verdict takes.
    pub arch: ArchMode,
    /// The arch's modes under the dead load with the posts and diagonals kept whole
    /// ([`arch_only`]), up to and with the arch's lowest: its shape is the arch's
    /// buckled shape.
    pub arch_dead: CaseBuckling,
    /// Per buckling mode, the member that buckles on its own between its ends (the mode's
    /// largest movement inside it), or `None` for a mode of the whole arch.
    pub buckling_members: Vec<Option<String>>,
    /// What alpha_cr means for the analysis, in words.
    pub verdict: String,
    /// The natural frequencies with the dead load's masses.
    pub vibration: Vibration,
    /// The arch's lowest buckled shape (of `arch_dead`) along every member, to draw.
    pub buckled_shape: Option<ModeDrawing>,
    /// The first vibration mode's shape along every member, to draw.
    pub vibration_shape: Option<ModeDrawing>,
    /// The lowest mostly vertical frequency, Hz (`None` when no mode found is vertical).
    pub first_vertical_hz: Option<f64>,
    /// The footbridge comfort flag, when the traffic is a footbridge crowd (`None` for
    /// road traffic).
    pub footbridge: Option<String>,
    /// How the numbers were found and what they leave out.
    pub notes: Vec<String>,
    /// Caution.
    pub caution: String,
}

/// The arch's lowest buckling mode among those found (module doc).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct ArchMode {
    /// Its alpha_cr; when no mode found is the arch's, the highest found (a lower bound).
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub alpha_cr: f64,
    /// Its index among the modes found (`None`: not among them).
    pub mode: Option<usize>,
}

/// Whether buckling `mode` of the frame model `generated` is the arch's: its peak at a
/// node of the model or inside a rib member, not inside another member between its
/// ends.
pub fn is_arch_mode(generated: &Generated, mode: &BucklingMode) -> bool {
    match mode.shape.peak_member {
        None => true,
        Some(k) => generated.map.roles.get(k) == Some(&MemberRole::Rib),
    }
}

/// The arch's lowest mode among `buckling`'s (see [`ArchMode`]); `None` without modes.
pub fn arch_mode(generated: &Generated, buckling: &CaseBuckling) -> Option<ArchMode> {
    let found = buckling.modes.iter().enumerate().find(|(_, m)| is_arch_mode(generated, m));
    match found {
        Some((i, m)) => Some(ArchMode { alpha_cr: m.load_factor, mode: Some(i) }),
        None => buckling.modes.last().map(|m| ArchMode { alpha_cr: m.load_factor, mode: None }),
    }
}

/// A buckling mode in words: the member that buckles on its own between its ends, or
/// the arch.
pub fn mode_words(generated: &Generated, mode: &BucklingMode) -> String {
    match mode.shape.peak_member {
        Some(k) if !is_arch_mode(generated, mode) => {
            format!("{} buckles between its ends", generated.model.member_label(k))
        }
        _ => "the arch".into(),
    }
}

/// A mode shape along the members of the frame model, to draw over the elevation.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ModeDrawing {
    /// What it is, in words, with its factor or frequency (`buckled shape: alpha_cr
    /// 17.40, dead load`).
    pub title: String,
    /// Per member of the frame model (model order), the points along it from its start
    /// to its end (its ends and the refined nodes inside it): (x, y) in m and the mode's
    /// (ux, uy), the largest translation of the mode being 1.
    pub members: Vec<Vec<[f64; 4]>>,
}

/// The drawing of `shape` over the refined model of `prepared` (see [`ModeDrawing`]).
fn mode_drawing(
    prepared: &Stability,
    shape: &crate::frame::stability::ModeShape,
    title: String,
) -> ModeDrawing {
    let refined = prepared.refined();
    let model = &refined.model;
    let at = |node: usize| -> [f64; 4] {
        let (x, y) = model.nodes.get(node).map_or((0.0, 0.0), |n| (n.x, n.y));
        let (ux, uy) = shape.refined.get(node).map_or((0.0, 0.0), |d| (d.ux, d.uy));
        [x, y, ux, uy]
    };
    let members = refined
        .members
        .iter()
        .map(|elements| {
            let mut points = Vec::with_capacity(elements.len() + 1);
            for (j, &e) in elements.iter().enumerate() {
                let Some(m) = model.members.get(e) else { continue };
                if j == 0 {
                    points.push(at(m.start));
                }
                points.push(at(m.end));
            }
            points
        })
        .collect();
    ModeDrawing { title, members }
}

/// One natural frequency, for summaries.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Frequency {
    /// Hz.
    pub hz: f64,
    /// Share of the mode's kinetic energy in vertical motion, 0 to 1.
    pub vertical_share: f64,
}

/// [`ArchStability`] without its shapes: what the size report carries.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct StabilitySummary {
    /// The arch's alpha_cr under the (unfactored) dead load.
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub dead_alpha_cr: f64,
    /// The lowest dead-load mode (local or not) and what buckles in it.
    pub first_mode: String,
    /// Its alpha_cr.
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub first_alpha_cr: f64,
    /// The verdict on the arch's alpha_cr.
    pub verdict: String,
    /// The lowest natural frequencies.
    pub frequencies: Vec<Frequency>,
    /// The lowest mostly vertical frequency, Hz.
    pub first_vertical_hz: Option<f64>,
    /// The footbridge comfort flag (a footbridge crowd only).
    pub footbridge: Option<String>,
    /// How the numbers were found and what they leave out.
    pub notes: Vec<String>,
}

impl ArchStability {
    /// The summary (no shapes).
    pub fn summary(&self) -> StabilitySummary {
        StabilitySummary {
            dead_alpha_cr: self.arch.alpha_cr,
            first_mode: match self.buckling_members.first().cloned().flatten() {
                Some(m) => format!("{m} buckles between its ends"),
                None => "the arch".into(),
            },
            first_alpha_cr: self.alpha_cr,
            verdict: self.verdict.clone(),
            frequencies: self
                .vibration
                .modes
                .iter()
                .map(|m| Frequency { hz: m.frequency, vertical_share: m.vertical_share })
                .collect(),
            first_vertical_hz: self.first_vertical_hz,
            footbridge: self.footbridge.clone(),
            notes: self.notes.clone(),
        }
    }
}

/// The verdict on alpha_cr (see the constants for the limits and their sources).
pub fn verdict(alpha_cr: f64) -> String {
    if alpha_cr >= FIRST_ORDER_ALPHA {
        format!("alpha_cr {alpha_cr:.2} >= 10: a first-order analysis is acceptable (EN 1993-1-1 5.2.1(3))")
    } else if alpha_cr >= AMPLIFICATION_LEAST_ALPHA {
        format!(
            "alpha_cr {alpha_cr:.2} below 10: second-order effects count; the first-order moments amplified by \
             1 / (1 - 1/alpha_cr) = {:.2} (EN 1993-1-1 5.2.2, from memory)",
            1.0 / (1.0 - 1.0 / alpha_cr)
        )
    } else {
        format!(
            "alpha_cr {alpha_cr:.2} below 3: too slender for amplified first-order moments; stiffen the rib or \
             raise the rise"
        )
    }
}

/// The footbridge flag for the lowest vertical frequency `f` (Hz), or `None` when none.
pub fn footbridge_flag(f: f64) -> String {
    let [low, high] = WALKING_RANGE_HZ;
    if (low..=high).contains(&f) {
        format!(
            "first vertical frequency {f:.2} Hz lies in the walking range {low}-{high} Hz (common practice: avoid); \
             below {FOOTBRIDGE_COMFORT_HZ} Hz a comfort check is required (EN 1990 A2.4.3.2, from memory)"
        )
    } else if f < FOOTBRIDGE_COMFORT_HZ {
        format!(
            "first vertical frequency {f:.2} Hz below {FOOTBRIDGE_COMFORT_HZ} Hz: a comfort check is required (EN \
             1990 A2.4.3.2, from memory)"
        )
    } else {
        format!("first vertical frequency {f:.2} Hz at or above {FOOTBRIDGE_COMFORT_HZ} Hz: no comfort check needed")
    }
}

/// Buckling under the dead load (the lowest `modes` modes, local ones included, and the
/// arch's own lowest mode) and the lowest `modes` natural frequencies of the frame model of `valid` (see the module doc).
///
/// Errors: those of `frame::stability` (a dead load that compresses nothing, a model
/// without mass, a mechanism).
pub fn arch_stability(valid: &ValidDesign, modes: usize) -> Result<ArchStability, StaticsError> {
    let generated = frame_model(valid);
    let settings = StabilitySettings::default();
    let prepared = Stability::new(&generated.model, settings)?;
    let dead_case = dead_of(&generated)?;
    let dead = prepared.buckling(dead_case, modes)?;
    let alpha_cr = dead.critical().unwrap_or(f64::INFINITY);
    let buckling_members = dead
        .modes
        .iter()
        .map(|m| {
            (!is_arch_mode(&generated, m))
                .then(|| m.shape.peak_member.map(|k| generated.model.member_label(k)))
                .flatten()
        })
        .collect();
    // the arch's own modes: posts and diagonals kept whole
    let arch_prepared = Stability::new(&arch_only(&generated), ARCH_SETTINGS)?;
    let mut arch_dead = arch_prepared.buckling(dead_case, ARCH_MODES)?;
    let arch = arch_mode(&generated, &arch_dead).unwrap_or(ArchMode { alpha_cr, mode: None });
    arch_dead.modes.truncate(arch.mode.map_or(arch_dead.modes.len(), |i| i + 1));
    let vibration = prepared.frequencies(dead_case, modes)?;
    let buckled_shape = arch_dead.modes.last().map(|m| {
        let bound = if arch.mode.is_some() { "" } else { " (not the arch's: a pier or the deck)" };
        mode_drawing(
            &arch_prepared,
            &m.shape,
            format!("buckled shape{bound}: alpha_cr {:.2} of the dead load", m.load_factor),
        )
    });
    let vibration_shape = vibration.modes.first().map(|m| {
        let kind = if m.vertical_share > 0.5 { "mostly vertical" } else { "mostly horizontal" };
        mode_drawing(&prepared, &m.shape, format!("first vibration mode: {:.2} Hz, {kind}", m.frequency))
    });
    let first_vertical_hz = vibration.modes.iter().find(|m| m.vertical_share > 0.5).map(|m| m.frequency);
    let footbridge = (valid.design().traffic.load_model.family() == ModelFamily::Crowd)
        .then(|| first_vertical_hz.map_or("no vertical mode among those found".to_string(), footbridge_flag));
    let notes = vec![
        format!(
            "frame model, every member split into {} elements (a post or diagonal can buckle on its own); elastic \
             plus geometric stiffness from the dead load's axial forces; linear buckling",
            settings.parts
        ),
        "a mode inside a post, diagonal, pier or the deck between its ends is that member buckling on its own \
         (its member check covers it); the arch's alpha_cr is the lowest mode with the posts and diagonals kept \
         whole (one bar each, unable to buckle on their own) and the other members split in two"
            .into(),
        "masses lumped from the dead load over g = 9.81 m/s2, no rotational inertia; a mode is vertical when more \
         than half its kinetic energy is in vertical motion"
            .into(),
        "out-of-plane buckling and lateral sway are beyond this plane model and are not covered".into(),
    ];
    let mut verdict = verdict(arch.alpha_cr);
    if arch.mode.is_none() {
        verdict = format!(
            "{verdict} (a lower bound: the lowest {} modes are piers or the deck buckling on their own)",
            arch_dead.modes.len()
        );
    }
    Ok(ArchStability {
        verdict,
        dead,
        arch_dead,
        alpha_cr,
        arch,
        buckling_members,
        vibration,
        buckled_shape,
        vibration_shape,
        first_vertical_hz,
        footbridge,
        notes,
        caution: CAUTION.into(),
    })
}

/// The frame model of `generated` for the arch's own modes: its posts and diagonals
/// (pin-ended bars) with I = 0, so that the refinement keeps each one bar
/// (`frame::stability::subdivide`) and none can buckle on its own between its ends: the
/// lowest modes are then the arch's (or a pier's or the deck's, which `is_arch_mode`
/// tells apart). The axial forces are those of the frame model (a pin-ended bar's I only
/// bends it under its own weight, whose reactions at its pins are the same).
pub fn arch_only(generated: &Generated) -> crate::frame::model::Model {
    let mut model = generated.model.clone();
    for (m, role) in model.members.iter_mut().zip(&generated.map.roles) {
        if matches!(role, MemberRole::Post | MemberRole::Bracing)
            && m.kind == crate::frame::model::MemberKind::Truss
        {
            m.i = 0.0;
        }
    }
    model
}

/// One factored load case of the sizing to analyse for buckling: a combination with the
/// traffic where one envelope extreme puts it.
#[derive(Debug, Clone, PartialEq)]
pub struct FactoredCase {
    /// The combination's name.
    pub combination: String,
    /// Where the traffic stands, in words (`arch::sizing::placement_words`).
    pub placement: String,
    /// The frame model's load case: the combination's unfavourable permanent factor times
    /// the dead load plus its traffic factors times the traffic, per rib line scaled to
    /// the whole cross-section (see [`factored_placement`]).
    pub case: LoadCase,
}

/// The factored load case of one extreme (`max` or min) of `line`'s envelope under
/// `combination` on the frame model `generated` of `valid`: gamma_G,sup times the dead
/// load plus the combination's uniform and vehicle factors times the traffic of
/// `arch::traffic::placement_case`. The frame model is the whole cross-section (every
/// section times the number of ribs) and a rib line's extreme is for that rib's share of
/// the traffic: that share is taken once per rib, so that each rib line of the model
/// carries its share and its part of the dead load, and a member's force per rib line
/// is the model's over the number of ribs. The other actions (temperature, springing
/// movement, braking) are left out: they add little axial force to the rib.
///
/// Errors: those of `arch::cases::build_case`.
pub fn factored_placement(
    valid: &ValidDesign,
    generated: &Generated,
    line: &LineEnvelope,
    max: bool,
    combination: &Combination,
) -> Result<LoadCase, StaticsError> {
    let spec = placement_case(valid, line, max);
    let extreme = if max { &line.traffic_max } else { &line.traffic_min };
    let ribs = if extreme.rib.is_some() { valid.design().deck.ribs.max(1) as f64 } else { 1.0 };
    let (uniform, vehicle) = (combination.uniform * ribs, combination.vehicle * ribs);
    let loads = spec
        .loads
        .iter()
        .map(|l| match *l {
            DeckLoad::Strip { w, x0, x1 } => DeckLoad::Strip { w: w * uniform, x0, x1 },
            DeckLoad::Point { x, p } => DeckLoad::Point { x, p: p * vehicle },
            DeckLoad::PanelPoint { panel, p } => DeckLoad::PanelPoint { panel, p: p * vehicle },
        })
        .collect();
    let traffic = build_case(valid, generated, &CaseSpec { with_dead: false, loads, ..spec.clone() })?;
    let mut case = factored_dead(generated, combination)?;
    case.name = format!("{}: {}", combination.name, spec.name);
    case.nodal.extend(traffic.nodal);
    case.member.extend(traffic.member);
    Ok(case)
}

/// The factored dead load alone: `combination`'s gamma_G,sup times the frame model's
/// dead case.
///
/// Errors: `Invalid` when the model has no dead case.
pub fn factored_dead(generated: &Generated, combination: &Combination) -> Result<LoadCase, StaticsError> {
    let mut case = scaled(dead_of(generated)?, combination.permanent_unfavourable);
    case.name = format!("{}: dead load alone", combination.name);
    Ok(case)
}

/// The dead load case of the frame model `generated`.
///
/// Errors: `Invalid` when the model has none.
fn dead_of(generated: &Generated) -> Result<&LoadCase, StaticsError> {
    generated
        .model
        .load_cases
        .iter()
        .find(|c| c.name == DEAD)
        .ok_or_else(|| StaticsError::invalid("frame model", "has no dead load case"))
}

/// `case` with every force, moment, temperature change and imposed displacement times
/// `factor`.
fn scaled(case: &LoadCase, factor: f64) -> LoadCase {
    use crate::frame::model::MemberLoad;
    let mut out = case.clone();
    for n in &mut out.nodal {
        n.fx *= factor;
        n.fy *= factor;
        n.mz *= factor;
    }
    for m in &mut out.member {
        match m {
            MemberLoad::Uniform { w, .. } => *w *= factor,
            MemberLoad::Point { p, .. } => *p *= factor,
        }
    }
    for t in &mut out.temperature {
        t.delta_t *= factor;
    }
    for d in &mut out.prescribed {
        d.value *= factor;
    }
    out
}

/// The buckling of one factored case, summarised.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CaseStability {
    /// The combination's name.
    pub combination: String,
    /// Where the traffic stands, in words.
    pub placement: String,
    /// The lowest critical load factor, local or not.
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub alpha_cr: f64,
    /// The lowest mode in words (`the arch`, or the member buckling on its own).
    pub first_mode: String,
    /// The arch's lowest mode (module doc).
    pub arch: ArchMode,
    /// Axial force of every member of the frame model (the whole cross-section) under
    /// the case, kN, tension positive (the mean over its elements).
    #[serde(skip)]
    pub member_axial: Vec<f64>,
}

/// The buckling of each of `cases` on the frame model `generated` with its posts and
/// diagonals kept whole ([`arch_only`]: their own buckling is their member checks'),
/// refined by [`ARCH_SETTINGS`], prepared once, warm starts from case to case: one result
/// per case, in order. Each case is buckled for its lowest mode first; when that mode is
/// not the arch's (a pier or the deck buckling on its own) the case is buckled again for
/// [`ARCH_MODES`] modes, and so is every later case at once
/// (`frame::stability::Stability::buckling_cases_widening`). The lowest mode and the
/// arch's are then those [`ARCH_MODES`] modes from the start would give, to the eigen
/// solution's tolerance: the arch's lowest mode is the first of the modes found that is
/// the arch's. Measured on the governing placements of the demo, where the lowest mode
/// is the arch's in every case: about a quarter fewer instructions at 16 and 32 panels.
///
/// Errors: those of `frame::stability::Stability::new`; a case's own failure (nothing
/// compressed, no convergence) is its own error.
pub fn placement_stability(
    generated: &Generated,
    cases: &[FactoredCase],
) -> Result<Vec<Result<CaseStability, StaticsError>>, StaticsError> {
    let prepared = Stability::new(&arch_only(generated), ARCH_SETTINGS)?;
    let refined = prepared.refined();
    let load_cases: Vec<LoadCase> = cases.iter().map(|c| c.case.clone()).collect();
    // a case whose lowest mode is not the arch's needs the arch's among more modes
    let found = prepared.buckling_cases_widening(&load_cases, 1, ARCH_MODES, |b| {
        arch_mode(generated, b).is_some_and(|a| a.mode == Some(0))
    });
    Ok(found
        .into_iter()
        .zip(cases)
        .map(|(result, c)| {
            let b = result?;
            let alpha_cr = b.critical().unwrap_or(f64::INFINITY);
            let first_mode = b.modes.first().map_or_else(|| "no mode".into(), |m| mode_words(generated, m));
            let arch = arch_mode(generated, &b).unwrap_or(ArchMode { alpha_cr, mode: None });
            let member_axial = refined
                .members
                .iter()
                .map(|parts| {
                    let sum: f64 = parts.iter().filter_map(|&e| b.axial_forces.get(e)).sum();
                    sum / parts.len().max(1) as f64
                })
                .collect();
            Ok(CaseStability {
                combination: c.combination.clone(),
                placement: c.placement.clone(),
                alpha_cr,
                first_mode,
                arch,
                member_axial,
            })
        })
        .collect())
}
