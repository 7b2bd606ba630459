//! The actions besides the dead load and traffic: temperature, springing movement,
//! braking, the erection stage of the bare rib, and the live-load deflection limit.
//!
//! What a design stores is [`ActionsDesign`] (design format 4): temperature ranges and
//! the thermal coefficient, the springing movement, the deflection limit. Braking is not
//! stored: it follows from the load model and the deck length ([`braking`]).
//!
//! Each action becomes a named load case of the generated models ([`action_cases`]),
//! alone (no dead load), so its effect can be shown and combined:
//!
//! - uniform temperature, rise and fall: every member warms or cools by the same amount;
//! - deck warmer and cooler than the rib: the deck members (and approach spans) alone;
//! - springing movement: each springing moves outward by half the spread and down by its
//!   settlement (imposed displacements of the supports);
//! - braking: a horizontal force along the deck, spread over the deck nodes by their
//!   tributary length, acting to the right (its mirror gives the same effects with the
//!   opposite sign, which the envelopes use);
//! - erection: the bare rib under its own weight alone, before posts and deck (a
//!   construction-stage check of its own, never combined with traffic).
//!
//! Concept-design values: local codes and a licensed engineer govern.

use crate::arch::cases::{add_cases, CaseKind, CaseSpec, Imposed};
use crate::arch::design::Design;
use crate::arch::generate::{bare_rib_model, frame_model, ModelKind, ModelMap};
use crate::arch::summary::SpringingForce;
use crate::arch::validate::ValidDesign;
use crate::error::{Field, Problem, StaticsError};
use crate::frame::results::CaseResult;
use crate::frame::solver::solve;
use crate::traffic::models::{LoadModel, ModelFamily};
use serde::{Deserialize, Serialize};

/// The other actions of a design.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ActionsDesign {
    /// Temperature: ranges and the thermal coefficient.
    pub temperature: Temperature,
    /// Movement of the springings (foundation advice).
    pub springing: SpringingMovement,
    /// Live-load deflection limit as span / `deflection_limit` (800: span / 800).
    pub deflection_limit: f64,
}

/// Temperature actions, after EN 1991-1-5 or AASHTO LRFD 3.12.2 (see
/// [`TemperaturePreset`]).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Temperature {
    /// Where the numbers come from, in words.
    pub clause: String,
    /// Coefficient of thermal expansion of every member, 1/K.
    pub alpha: f64,
    /// Uniform rise from the temperature at which the structure is made fast, K (>= 0).
    pub expansion: f64,
    /// Uniform fall, K (>= 0).
    pub contraction: f64,
    /// Difference between the deck and the rib, K (>= 0; 0 = none): the deck alone
    /// warmer, and cooler, by this much.
    pub deck_rib_difference: f64,
}

/// The temperature presets.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum TemperaturePreset {
    /// EN 1991-1-5 for a steel deck (Type 1).
    EnSteel,
    /// AASHTO LRFD 3.12.2.1.1 Procedure A, steel, moderate climate.
    AashtoModerateSteel,
    /// AASHTO LRFD 3.12.2.1.1 Procedure A, steel, cold climate.
    AashtoColdSteel,
}

impl TemperaturePreset {
    /// Every preset.
    pub const ALL: [TemperaturePreset; 3] = [
        TemperaturePreset::EnSteel,
        TemperaturePreset::AashtoModerateSteel,
        TemperaturePreset::AashtoColdSteel,
    ];

    /// The preset's key (a button, a CLI value).
    pub fn key(self) -> &'static str {
        match self {
            TemperaturePreset::EnSteel => "en-steel",
            TemperaturePreset::AashtoModerateSteel => "aashto-moderate-steel",
            TemperaturePreset::AashtoColdSteel => "aashto-cold-steel",
        }
    }

    /// The preset named by `key`, if any.
    pub fn from_key(key: &str) -> Option<TemperaturePreset> {
        TemperaturePreset::ALL.into_iter().find(|p| p.key() == key)
    }
}

/// Converts a temperature difference in degrees Fahrenheit to kelvin.
fn fahrenheit_difference(df: f64) -> f64 {
    df * 5.0 / 9.0
}

impl Temperature {
    /// A preset's values.
    ///
    /// * EN steel: EN 1991-1-5 6.1.3.1, Figure 6.1 for a steel deck (Type 1): effective
    ///   temperatures T_e,max = T_max + 16 and T_e,min = T_min - 3 (from memory), with shade
    ///   air temperatures T_max = +35 C and T_min = -20 C (a mid-European site, illustrative:
    ///   the national annex's maps govern) and the initial temperature T_0 = +10 C (Annex A.1
    ///   (3)): expansion 51 - 10 = 41 K, contraction 10 + 23 = 33 K. Deck-rib difference
    ///   15 K (6.1.6, between main structural elements; from memory). alpha 12e-6 /K
    ///   (Table C.1, steel).
    /// * AASHTO moderate, steel: Table 3.12.2.1.1-1, 0 to 120 F, set at 60 F (common
    ///   practice): +-60 F = 33.3 K each way. alpha 6.5e-6 /F = 11.7e-6 /K (6.4.1). No
    ///   deck-rib difference rule (0; give one if the project asks).
    /// * AASHTO cold, steel: -30 to 120 F, set at 60 F: +60 F = 33.3 K, -90 F = 50 K.
    pub fn preset(preset: TemperaturePreset) -> Temperature {
        match preset {
            TemperaturePreset::EnSteel => Temperature {
                clause: "EN 1991-1-5 6.1.3 (steel deck, T_max +35 C, T_min -20 C, T_0 +10 C; illustrative site) \
                         and 6.1.6 (15 K, from memory); alpha: Table C.1"
                    .into(),
                alpha: 12e-6,
                expansion: 41.0,
                contraction: 33.0,
                deck_rib_difference: 15.0,
            },
            TemperaturePreset::AashtoModerateSteel => Temperature {
                clause: "AASHTO LRFD Table 3.12.2.1.1-1, steel, moderate climate (0 to 120 F, set at 60 F); alpha: 6.4.1"
                    .into(),
                alpha: 11.7e-6,
                expansion: fahrenheit_difference(60.0),
                contraction: fahrenheit_difference(60.0),
                deck_rib_difference: 0.0,
            },
            TemperaturePreset::AashtoColdSteel => Temperature {
                clause: "AASHTO LRFD Table 3.12.2.1.1-1, steel, cold climate (-30 to 120 F, set at 60 F); alpha: 6.4.1"
                    .into(),
                alpha: 11.7e-6,
                expansion: fahrenheit_difference(60.0),
                contraction: fahrenheit_difference(90.0),
                deck_rib_difference: 0.0,
            },
        }
    }
}

/// Movement of the springings, m.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct SpringingMovement {
    /// Horizontal spread of the springings, m (positive apart): each moves outward by half.
    pub spread: f64,
    /// Settlement of the left springing, m, positive down.
    pub settlement_left: f64,
    /// Settlement of the right springing, m, positive down.
    pub settlement_right: f64,
}

/// Deflection limit of the presets: span / 800 (AASHTO LRFD 2.5.2.6.2, vehicular load,
/// general; EN 1990 A2.4.2 leaves road-bridge limits to the project, so the same figure
/// is offered there as common practice).
pub const DEFAULT_DEFLECTION_LIMIT: f64 = 800.0;

impl ActionsDesign {
    /// The actions a load model's family starts with: EN steel temperatures for the EN
    /// models and the user's own, AASHTO moderate steel for HL-93; a springing spread of
    /// 10 mm and a 10 mm settlement of the right springing (illustrative: foundation
    /// advice governs); deflection span / 800.
    pub fn preset(family: ModelFamily) -> ActionsDesign {
        let temperature = match family {
            ModelFamily::Hl93 => Temperature::preset(TemperaturePreset::AashtoModerateSteel),
            _ => Temperature::preset(TemperaturePreset::EnSteel),
        };
        ActionsDesign {
            temperature,
            springing: SpringingMovement { spread: 0.010, settlement_left: 0.0, settlement_right: 0.010 },
            deflection_limit: DEFAULT_DEFLECTION_LIMIT,
        }
    }

    /// Problems of the inputs (each names its field).
    pub(crate) fn problems(&self) -> Vec<Problem> {
        let mut out = Vec::new();
        let t = &self.temperature;
        let temps = [
            ("expansion", t.expansion),
            ("contraction", t.contraction),
            ("deck-rib difference", t.deck_rib_difference),
        ];
        for (name, v) in temps {
            if !(v.is_finite() && (0.0..=200.0).contains(&v)) {
                out.push(Problem::new(
                    Field::Temperature,
                    format!("the temperature {name} ({v} K) must be between 0 and 200 K"),
                ));
            }
        }
        if !(t.alpha.is_finite() && (0.0..=1e-4).contains(&t.alpha)) {
            out.push(Problem::new(
                Field::Temperature,
                format!("the thermal coefficient {} /K must be between 0 and 1e-4 /K (steel 12e-6)", t.alpha),
            ));
        }
        let s = &self.springing;
        for (name, v) in [
            ("spread", s.spread),
            ("left settlement", s.settlement_left),
            ("right settlement", s.settlement_right),
        ] {
            if !(v.is_finite() && v.abs() <= 1.0) {
                out.push(Problem::new(
                    Field::SpringingMovement,
                    format!("the springing {name} ({v} m) must be a number within +-1 m"),
                ));
            }
        }
        let l = self.deflection_limit;
        if !(l.is_finite() && l >= 1.0) {
            out.push(Problem::new(
                Field::DeflectionLimit,
                format!("the deflection limit span / {l} needs a number of at least 1 (e.g. 800)"),
            ));
        }
        out
    }
}

/// The braking force of a design's load model along the deck, with its working.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Braking {
    /// Total characteristic braking force, kN (0 where the model has none).
    pub force: f64,
    /// The rule and clause.
    pub clause: String,
    /// The rule worked with the design's numbers, in words (SI).
    pub working: String,
}

/// The characteristic braking force of `design`'s load model on its deck (length L =
/// seat to seat, m), kN:
///
/// * EN 1991-2 LM1, 4.4.1(2) eq. 4.6: Q_lk = 0.6 alpha_Q1 (2 Q_1k) + 0.10 alpha_q1 q_1k
///   w_1 L, limited to 180 alpha_Q1 <= Q_lk <= 900 kN (w_1 the notional lane width).
/// * AASHTO LRFD 3.6.4: per design lane the greatest of 25 % of the axle weights of the
///   design truck or tandem and 5 % of the truck or the tandem plus the lane load over
///   L, times the number of lanes (all taken as one direction, as 3.6.4 asks of lanes
///   likely to become one-directional) and the multiple presence factor; no dynamic
///   allowance.
/// * Footbridge crowd and the user's own model: none (0; a footbridge's service vehicle
///   is not modelled).
pub fn braking(design: &Design) -> Braking {
    let length = (design.deck.right_seat_x - design.deck.left_seat_x).max(0.0);
    let t = &design.traffic;
    match &t.load_model {
        LoadModel::EnLm1(m) => {
            let (aq1, q1k) = (m.alpha_tandem[0], m.tandem_axle[0]);
            let (aq, qk, w1) = (m.alpha_udl_lane_1, m.udl_lane_1, m.lane_width);
            let raw = 0.6 * aq1 * 2.0 * q1k + 0.10 * aq * qk * w1 * length;
            let lower = 180.0 * aq1;
            let force = raw.max(lower).min(900.0);
            Braking {
                force,
                clause: "EN 1991-2 4.4.1(2) eq. 4.6, 180 alpha_Q1 <= Q_lk <= 900 kN".into(),
                working: format!(
                    "0.6 x {aq1} x 2 x {q1k} kN + 0.10 x {aq} x {qk} kN/m2 x {w1} m x {length:.1} m = {raw:.1} kN, \
                     within [{lower:.0}, 900] kN: {force:.1} kN"
                ),
            }
        }
        LoadModel::Hl93(m) => {
            let lanes = t.load_model.lane_layout(t.carriageway_width, length).lanes.len();
            let truck: f64 = m.truck_axles.iter().sum();
            let tandem = 2.0 * m.tandem_axle;
            let lane = m.lane_load * length;
            let per_lane =
                (0.25 * truck).max(0.25 * tandem).max(0.05 * (truck + lane)).max(0.05 * (tandem + lane));
            let presence = m.multiple_presence.get(lanes.clamp(1, 4) - 1).copied().unwrap_or(1.0);
            let force = per_lane * lanes as f64 * presence;
            Braking {
                force,
                clause: "AASHTO LRFD 3.6.4 (per lane, all lanes one way, multiple presence 3.6.1.1.2)".into(),
                working: format!(
                    "max(25 % of {truck:.0} kN, 25 % of {tandem:.0} kN, 5 % of ({truck:.0} + {:.0}) kN, 5 % of \
                     ({tandem:.0} + {:.0}) kN) = {per_lane:.1} kN per lane x {lanes} lanes x m {presence} = {force:.1} kN",
                    lane, lane
                ),
            }
        }
        LoadModel::Crowd(_) | LoadModel::UserDefined(_) => Braking {
            force: 0.0,
            clause: "none for this load model".into(),
            working: "the load model has no braking rule: none applied".into(),
        },
    }
}

/// Name of each action case (also its place in a model's load cases).
pub const TEMPERATURE_RISE: &str = "temperature rise";
/// Uniform fall.
pub const TEMPERATURE_FALL: &str = "temperature fall";
/// Deck warmer than the rib.
pub const DECK_WARMER: &str = "deck warmer than rib";
/// Deck cooler than the rib.
pub const DECK_COOLER: &str = "deck cooler than rib";
/// Springing movement.
pub const SPRINGING_MOVEMENT: &str = "springing movement";
/// Braking to the right.
pub const BRAKING: &str = "braking";
/// Erection of the bare rib.
pub const ERECTION: &str = "erection (bare rib)";

/// Whether `name` is the name of an action case (they carry no dead load).
pub fn is_action_case(name: &str) -> bool {
    [TEMPERATURE_RISE, TEMPERATURE_FALL, DECK_WARMER, DECK_COOLER, SPRINGING_MOVEMENT, BRAKING, ERECTION]
        .contains(&name)
}

/// The action cases of a design, each alone (no dead load), in this order: temperature
/// rise and fall, deck warmer and cooler than the rib (when the difference is not 0),
/// springing movement, braking (when the model has any), erection. Every case can be
/// built for every generated model: one that has nothing to take the action (braking on
/// the bare rib, erection on the frame model and the truss) gets an empty case.
pub fn action_cases(design: &Design) -> Vec<CaseSpec> {
    let a = &design.actions;
    let t = &a.temperature;
    let spec = |name: &str, kind: CaseKind, imposed: Imposed| CaseSpec {
        name: name.into(),
        kind,
        with_dead: false,
        loads: Vec::new(),
        imposed: vec![imposed],
    };
    let mut out = vec![
        spec(
            TEMPERATURE_RISE,
            CaseKind::Temperature { delta_t: t.expansion },
            Imposed::Temperature { delta_t: t.expansion, deck_only: false },
        ),
        spec(
            TEMPERATURE_FALL,
            CaseKind::Temperature { delta_t: -t.contraction },
            Imposed::Temperature { delta_t: -t.contraction, deck_only: false },
        ),
    ];
    if t.deck_rib_difference != 0.0 {
        let d = t.deck_rib_difference;
        out.push(spec(
            DECK_WARMER,
            CaseKind::DeckTemperature { delta_t: d },
            Imposed::Temperature { delta_t: d, deck_only: true },
        ));
        out.push(spec(
            DECK_COOLER,
            CaseKind::DeckTemperature { delta_t: -d },
            Imposed::Temperature { delta_t: -d, deck_only: true },
        ));
    }
    let s = a.springing;
    out.push(spec(
        SPRINGING_MOVEMENT,
        CaseKind::SpringingMovement {
            spread: s.spread,
            settlement_left: s.settlement_left,
            settlement_right: s.settlement_right,
        },
        Imposed::SpringingMovement {
            spread: s.spread,
            settlement_left: s.settlement_left,
            settlement_right: s.settlement_right,
        },
    ));
    let b = braking(design);
    if b.force > 0.0 {
        out.push(spec(BRAKING, CaseKind::Braking { force: b.force }, Imposed::Braking { force: b.force }));
    }
    out.push(spec(ERECTION, CaseKind::Erection, Imposed::RibSelfWeight));
    out
}

/// What one action does alone in a model: the springing forces (with the moments of a
/// fixed rib) and the largest member forces.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ActionResult {
    /// The case's name.
    pub case: String,
    /// What the action is.
    pub kind: CaseKind,
    /// The model it was solved in (the frame model; the bare rib for erection).
    pub model: ModelKind,
    /// Left springing force (moment included), whole cross-section.
    pub left: SpringingForce,
    /// Right springing force.
    pub right: SpringingForce,
    /// Largest rib moment, kNm, whole cross-section, either sign (the larger magnitude).
    pub rib_moment: f64,
    /// Largest tension of any member, kN (>= 0), whole cross-section.
    pub max_tension: f64,
    /// Largest compression of any member, kN (<= 0), whole cross-section.
    pub max_compression: f64,
}

/// The other actions of a design, each alone: braking's working and the effect of each
/// action case ([`action_cases`]) in the frame model, erection in the bare rib.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ActionsReport {
    /// The design's temperature inputs (their clause included).
    pub temperature: Temperature,
    /// The braking force with its rule.
    pub braking: Braking,
    /// Each action case.
    pub cases: Vec<ActionResult>,
}

/// Solves every action case of a validated design alone: the frame model for
/// temperature, springing movement and braking, the bare rib for erection (units kN, kNm;
/// signs of `SpringingForce` and the solver).
///
/// Errors: those of the solver (a model that cannot stand) and of a case that cannot be
/// built (a value that is not finite).
///
/// Worked out once per validated design and kept with it (a clone is returned); a whole
/// analysis of the design (`arch::analysis::analyze_to`) works it out with its own cases
/// and keeps it likewise.
pub fn action_results(valid: &ValidDesign) -> Result<ActionsReport, StaticsError> {
    valid.actions_or_init(|| solve_actions(valid)).clone()
}

fn solve_actions(valid: &ValidDesign) -> Result<ActionsReport, StaticsError> {
    let specs = action_cases(valid.design());
    let mut solved = Vec::new();
    for (kind, mut generated) in
        [(ModelKind::Frame, frame_model(valid)), (ModelKind::BareRib, bare_rib_model(valid))]
    {
        let mine = specs_in(&specs, kind);
        generated.model.load_cases.clear();
        add_cases(valid, &mut generated, &mine)?;
        let solution = solve(&generated.model)?;
        solved.push((kind, generated.map, mine, solution.cases));
    }
    Ok(actions_report(valid.design(), solved.iter().map(|(k, m, s, c)| (*k, m, s.as_slice(), c.as_slice()))))
}

/// The action cases of `specs` that model `kind` takes: erection in the bare rib, the
/// others in the frame model.
pub(crate) fn specs_in(specs: &[CaseSpec], kind: ModelKind) -> Vec<CaseSpec> {
    specs.iter().filter(|s| (s.kind == CaseKind::Erection) == (kind == ModelKind::BareRib)).cloned().collect()
}

/// The report of the action cases solved in each model: per model its kind, its map, the
/// cases' specs and their results (found by name; a spec without a result is left out).
pub(crate) fn actions_report<'a>(
    design: &Design,
    solved: impl IntoIterator<Item = (ModelKind, &'a ModelMap, &'a [CaseSpec], &'a [CaseResult])>,
) -> ActionsReport {
    let mut out = Vec::new();
    for (kind, map, specs, results) in solved {
        for spec in specs {
            let Some(case) = results.iter().find(|c| c.name == spec.name) else { continue };
            let side = |node: usize, left: bool| {
                let r = case.reaction(node);
                let (fx, fy, mz) = r.map_or((0.0, 0.0, 0.0), |r| (r.fx, r.fy, r.mz));
                SpringingForce::from_reaction(fx, fy, mz, left)
            };
            let [l, r] = map.springings;
            let rib_moment = map
                .rib_members
                .iter()
                .filter_map(|&k| case.members.get(k))
                .flat_map(|m| [m.start.m, m.end.m])
                .fold(0.0_f64, |m, v| if v.abs() > m.abs() { v } else { m });
            let n = case.members.iter().flat_map(|m| [m.start.n, m.end.n]);
            let (max_tension, max_compression) = n.fold((0.0_f64, 0.0_f64), |(t, c), v| (t.max(v), c.min(v)));
            out.push(ActionResult {
                case: spec.name.clone(),
                kind: spec.kind,
                model: kind,
                left: side(l, true),
                right: side(r, false),
                rib_moment,
                max_tension,
                max_compression,
            });
        }
    }
    ActionsReport { temperature: design.actions.temperature.clone(), braking: braking(design), cases: out }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::traffic::TrafficDesign;

    /// A range of 0 K is a valid input (the page's fields take 0 to 200 K): its case is
    /// still the fall (or the cooler deck), told apart from the rise by the sign of its 0
    /// (the ids name the rows of the actions table and the page's buttons, so two alike
    /// would collide). Check values: the ids' own definition, a fall is the negative
    /// change (no outside value applies).
    #[test]
    fn a_zero_fall_is_still_the_fall_and_every_action_id_is_its_own() {
        let mut d = Design::demo();
        d.actions.temperature.expansion = 0.0;
        d.actions.temperature.contraction = 0.0;
        let ids: Vec<String> = action_cases(&d).iter().map(|c| c.kind.id()).collect();
        assert!(
            ids.contains(&"temperature-rise".to_string()) && ids.contains(&"temperature-fall".to_string())
        );
        let titles: Vec<String> = action_cases(&d).iter().map(|c| c.kind.title()).collect();
        for (k, id) in ids.iter().enumerate() {
            assert!(!ids[k + 1..].contains(id), "{id} twice in {ids:?}");
            assert!(!titles[k + 1..].contains(&titles[k]), "{} twice", titles[k]);
        }
    }

    #[test]
    fn en_braking_of_the_demo_worked_by_hand() {
        // EN 1991-2 4.4.1(2) eq. 4.6 on the demo: deck from seat x = 2 m to 166 m, L = 164 m;
        // LM1 lane 1: alpha_Q1 = 1.0, Q_1k = 300 kN, alpha_q1 = 1.0, q_1k = 9 kN/m2, w_1 = 3 m:
        // Q_lk = 0.6 x 1.0 x 2 x 300 + 0.10 x 1.0 x 9 x 3 x 164 = 360 + 442.8 = 802.8 kN,
        // inside 180 alpha_Q1 = 180 kN <= Q_lk <= 900 kN.
        let d = Design::demo();
        let b = braking(&d);
        assert!((b.force - 802.8).abs() < 1e-9, "{}", b.force);
        assert!(b.working.contains("802.8 kN"), "{}", b.working);
        // a long deck meets the 900 kN cap: 360 + 2.7 L > 900 for L > 200 m
        let mut long = d.clone();
        long.deck.right_seat_x = long.deck.left_seat_x + 250.0;
        assert_eq!(braking(&long).force, 900.0);
        // the lower bound governs only with a lighter tandem: Q_1k = 100 kN and no UDL
        // give 0.6 x 1.0 x 2 x 100 = 120 kN < 180 x 1.0 = 180 kN
        let mut light = d.clone();
        if let LoadModel::EnLm1(m) = &mut light.traffic.load_model {
            m.tandem_axle[0] = 100.0;
            m.alpha_udl_lane_1 = 0.0;
        }
        assert_eq!(braking(&light).force, 180.0);
    }

    #[test]
    fn aashto_braking_per_lane() {
        // AASHTO LRFD 3.6.4 on a 7.5 m roadway: INT(7.5 / 3.6) = 2 lanes, m = 1.00;
        // L = 164 m: 5 % of (325 + 9.3 x 164) = 5 % of 1850.2 = 92.51 kN per lane beats
        // 25 % of the truck (81.25 kN); 2 x 92.51 = 185.02 kN
        let mut d = Design::demo();
        d.traffic = TrafficDesign::preset(ModelFamily::Hl93, 7.5);
        let b = braking(&d);
        assert!((b.force - 185.02).abs() < 1e-9, "{}", b.force);
        // crowd: none
        d.traffic = TrafficDesign::preset(ModelFamily::Crowd, 7.5);
        assert_eq!(braking(&d).force, 0.0);
    }

    #[test]
    fn presets_and_problems() {
        let t = Temperature::preset(TemperaturePreset::AashtoColdSteel);
        // 90 F = 50 K; 60 F = 33.33 K
        assert!((t.contraction - 50.0).abs() < 1e-12 && (t.expansion - 100.0 / 3.0).abs() < 1e-12);
        let mut a = ActionsDesign::preset(ModelFamily::EnLm1);
        assert!(a.problems().is_empty());
        a.temperature.expansion = -5.0;
        a.springing.spread = f64::NAN;
        a.deflection_limit = 0.0;
        let p = a.problems();
        assert_eq!(p.len(), 3, "{p:?}");
        assert!(p[0].involves(Field::Temperature) && p[1].involves(Field::SpringingMovement));
        assert!(p[2].involves(Field::DeflectionLimit));
        for preset in TemperaturePreset::ALL {
            assert_eq!(TemperaturePreset::from_key(preset.key()), Some(preset));
        }
    }
}
