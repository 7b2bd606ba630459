//! Combinations of the permanent actions with traffic, with editable factors.
//!
//! Permanent actions from one source are factored **as a whole**: one factor on the whole
//! dead-load effect in a combination (the larger or smaller of its two factors, whichever
//! gives the extreme), never one factor on the adverse parts of an influence line and
//! another on the relieving parts. On an arch whose form is the funicular of its dead
//! load, splitting the dead load that way would invent bending the structure never sees
//! (the "single source" principle of the notes to EN 1990 Table A2.4(B), quoted from
//! memory; AASHTO LRFD 3.4.1 likewise applies one gamma_p to a whole load).
//!
//! The traffic's uniform part and vehicle part have factors of their own because the
//! frequent combination of EN 1990 reduces them differently (psi_1 = 0.75 for tandems,
//! 0.40 for the UDL, Table A2.1). Each part is placed at its own worst, so the design
//! extreme is the factored sum of the parts' extremes (both factors >= 0).

use crate::traffic::models::ModelFamily;
use serde::{Deserialize, Serialize};

/// One combination: its factors and where they come from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Combination {
    /// Name (`ULS gr1a`, `Strength I`).
    pub name: String,
    /// The standard and clause the factors follow.
    pub clause: String,
    /// Factor on the permanent actions where they are unfavourable (gamma_G,sup).
    pub permanent_unfavourable: f64,
    /// Factor on the permanent actions where they are favourable (gamma_G,inf).
    pub permanent_favourable: f64,
    /// Factor on the traffic's uniform part (gamma_Q, or gamma_Q psi).
    pub uniform: f64,
    /// Factor on the traffic's vehicles (gamma_Q, or gamma_Q psi).
    pub vehicle: f64,
    /// Factor on the temperature actions (gamma_Q psi_0 as an accompanying action, or
    /// psi_2 in the frequent combination; AASHTO gamma_TU). 0: left out (design format 4).
    #[serde(default)]
    pub temperature: f64,
    /// Factor on the springing movement where it is adverse (EN gamma_Gset; AASHTO
    /// gamma_SE); never taken where it relieves. 0: left out (design format 4).
    #[serde(default)]
    pub settlement: f64,
    /// Factor on braking (gamma_Q in traffic group gr2; AASHTO BR with LL). 0: left out
    /// (design format 4).
    #[serde(default)]
    pub braking: f64,
}

/// The name of the EN combination of traffic group gr2 (braking).
pub const BRAKING_GROUP: &str = "ULS gr2";
/// The name of the EN combination with temperature as the leading variable action.
pub const TEMPERATURE_LEADING: &str = "ULS temperature leading";
/// The combinations design format 4 added to the EN presets: a design of format 3 gets
/// them (`Combination::add_action_factors`).
const ADDED_IN_FORMAT_4: [&str; 2] = [BRAKING_GROUP, TEMPERATURE_LEADING];

/// The factors of the other actions in one combination: (temperature, settlement,
/// braking), see [`Combination`].
pub type ActionFactors = (f64, f64, f64);

impl Combination {
    fn new(name: &str, clause: &str, g_sup: f64, g_inf: f64, uniform: f64, vehicle: f64) -> Combination {
        Combination {
            name: name.into(),
            clause: clause.into(),
            permanent_unfavourable: g_sup,
            permanent_favourable: g_inf,
            uniform,
            vehicle,
            temperature: 0.0,
            settlement: 0.0,
            braking: 0.0,
        }
    }

    fn with_actions(self, (temperature, settlement, braking): ActionFactors) -> Combination {
        Combination { temperature, settlement, braking, ..self }
    }

    /// The factors of the other actions.
    pub fn action_factors(&self) -> ActionFactors {
        (self.temperature, self.settlement, self.braking)
    }

    /// Gives every combination of `combinations` that bears a preset's name of `family`
    /// that preset's factors of the other actions, and adds the family's presets that
    /// came with them (EN traffic group gr2, temperature leading) when missing: what a
    /// design written before the other actions existed (design format 3) opens with.
    pub fn add_action_factors(family: ModelFamily, combinations: &mut Vec<Combination>) {
        let presets = Combination::presets(family);
        for c in combinations.iter_mut() {
            if let Some(p) = presets.iter().find(|p| p.name == c.name) {
                (c.temperature, c.settlement, c.braking) = p.action_factors();
            }
        }
        for p in presets {
            if ADDED_IN_FORMAT_4.contains(&p.name.as_str()) && !combinations.iter().any(|c| c.name == p.name)
            {
                combinations.push(p);
            }
        }
    }

    /// The combinations a load model's family is checked with (presets):
    ///
    /// * EN 1991-2 LM1 and the user's model: ULS gr1a after EN 1990 A2 Table A2.4(B)
    ///   (eq. 6.10; gamma_G 1.35 / 1.00, gamma_Q 1.35 for road traffic), SLS characteristic
    ///   (A2.4.1, all factors 1.0), SLS frequent (psi_1 = 0.75 for the tandems and 0.40
    ///   for the UDL, EN 1990 Table A2.1). Traffic group gr1a: EN 1991-2 Table 4.4a.
    ///   ULS gr2 for LM1: braking with the frequent values of the rest of the traffic
    ///   (EN 1991-2 Table 4.4a: gr2 = Q_lk + psi_1 LM1), all times gamma_Q 1.35.
    ///   Temperature accompanies: gamma_Q psi_0 = 1.5 x 0.6 = 0.9 at ULS, psi_0 = 0.6 in
    ///   the characteristic and psi_2 = 0.5 in the frequent combination (Table A2.1,
    ///   T_k). Eq. 6.10 takes each variable action as the leading one in turn, so ULS
    ///   temperature leading has temperature at gamma_Q 1.5 and LM1 as accompanying at
    ///   gamma_Q psi_0 (1.35 x 0.75 on the tandems, 1.35 x 0.40 on the UDLs, Table A2.1):
    ///   it governs where the temperature effects are large beside the traffic's (near
    ///   the springings of a fixed or two-hinged rib). Springing movement (settlement): gamma_Gset = 1.20 at ULS for linear
    ///   analysis (Table A2.4(B) note, from memory), 1.0 at SLS.
    /// * Footbridge crowd: ULS (Table A2.4(B), gamma_Q 1.35 for pedestrian traffic), SLS
    ///   characteristic, SLS frequent (psi_1 = 0.40, EN 1990 Table A2.2, group gr1; from
    ///   memory); temperature and settlement as above (psi_0 0.6, psi_2 0.5 for
    ///   footbridges, Table A2.2, from memory), and temperature leading likewise; no
    ///   braking.
    /// * AASHTO HL-93: Strength I (AASHTO LRFD Table 3.4.1-1, LL and BR 1.75; DC gamma_p
    ///   1.25 / 0.90, Table 3.4.1-2; TU 0.50, the value for force effects; SE 1.0) and
    ///   Service I (all 1.0, TU 1.00).
    pub fn presets(family: ModelFamily) -> Vec<Combination> {
        match family {
            ModelFamily::EnLm1 | ModelFamily::UserDefined => {
                let mut out = vec![
                    Combination::new(
                        "ULS gr1a",
                        "EN 1990 A2 Table A2.4(B) eq. 6.10; EN 1991-2 Table 4.4a",
                        1.35,
                        1.0,
                        1.35,
                        1.35,
                    )
                    .with_actions((0.9, 1.2, 0.0)),
                    Combination::new("SLS characteristic", "EN 1990 A2.4.1, Table A2.6", 1.0, 1.0, 1.0, 1.0)
                        .with_actions((0.6, 1.0, 0.0)),
                    Combination::new(
                        "SLS frequent",
                        "EN 1990 Table A2.1 (psi_1: TS 0.75, UDL 0.40; psi_2 temperature 0.5)",
                        1.0,
                        1.0,
                        0.40,
                        0.75,
                    )
                    .with_actions((0.5, 1.0, 0.0)),
                ];
                if family == ModelFamily::EnLm1 {
                    out.push(
                        Combination::new(
                            BRAKING_GROUP,
                            "EN 1991-2 Table 4.4a gr2 (braking + psi_1 LM1); EN 1990 A2 Table A2.4(B)",
                            1.35,
                            1.0,
                            1.35 * 0.40,
                            1.35 * 0.75,
                        )
                        .with_actions((0.9, 1.2, 1.35)),
                    );
                }
                out.push(
                    Combination::new(
                        TEMPERATURE_LEADING,
                        "EN 1990 eq. 6.10 with T_k leading (gamma_Q 1.5), traffic at psi_0 (Table A2.1)",
                        1.35,
                        1.0,
                        1.35 * 0.40,
                        1.35 * 0.75,
                    )
                    .with_actions((1.5, 1.2, 0.0)),
                );
                out
            }
            ModelFamily::Crowd => vec![
                Combination::new("ULS", "EN 1990 A2 Table A2.4(B) eq. 6.10", 1.35, 1.0, 1.35, 1.35)
                    .with_actions((0.9, 1.2, 0.0)),
                Combination::new("SLS characteristic", "EN 1990 A2.4.1", 1.0, 1.0, 1.0, 1.0)
                    .with_actions((0.6, 1.0, 0.0)),
                Combination::new(
                    "SLS frequent",
                    "EN 1990 Table A2.2 (psi_1 0.40, from memory)",
                    1.0,
                    1.0,
                    0.40,
                    0.40,
                )
                .with_actions((0.5, 1.0, 0.0)),
                Combination::new(
                    TEMPERATURE_LEADING,
                    "EN 1990 eq. 6.10 with T_k leading (gamma_Q 1.5), the crowd at psi_0 0.40 (Table A2.2, from memory)",
                    1.35,
                    1.0,
                    1.35 * 0.40,
                    1.35 * 0.40,
                )
                .with_actions((1.5, 1.2, 0.0)),
            ],
            ModelFamily::Hl93 => vec![
                Combination::new(
                    "Strength I",
                    "AASHTO LRFD Tables 3.4.1-1 and 3.4.1-2 (DC factors on all permanent load, surfacing included)",
                    1.25,
                    0.90,
                    1.75,
                    1.75,
                )
                .with_actions((0.5, 1.0, 1.75)),
                Combination::new("Service I", "AASHTO LRFD Table 3.4.1-1", 1.0, 1.0, 1.0, 1.0)
                    .with_actions((1.0, 1.0, 1.0)),
            ],
        }
    }

    /// The design extremes (max, min) of an effect: permanent effect `permanent`, and the
    /// traffic's extremes split in their uniform and vehicle parts (`max_parts`, each >=
    /// 0, and `min_parts`, each <= 0). Units those of the effect.
    ///
    /// max = max(g_sup G, g_inf G) + u U_max + v A_max, min = min(g_sup G, g_inf G) +
    /// u U_min + v A_min: the permanent factor is chosen for the whole effect (module doc).
    pub fn design(&self, permanent: f64, max_parts: (f64, f64), min_parts: (f64, f64)) -> (f64, f64) {
        let (a, b) = (self.permanent_unfavourable * permanent, self.permanent_favourable * permanent);
        (
            a.max(b) + self.uniform * max_parts.0 + self.vehicle * max_parts.1,
            a.min(b) + self.uniform * min_parts.0 + self.vehicle * min_parts.1,
        )
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_permanent_factor_goes_with_the_whole_effect() {
        // ULS gr1a: G = -1000 kN (compression), traffic +50 / -300 (uniform -100, tandem -200)
        // max = max(1.35 x -1000, 1.0 x -1000) + 1.35 x 50 = -1000 + 67.5 = -932.5
        // min = -1350 + 1.35 x (-100 - 200) = -1755
        let uls = &Combination::presets(ModelFamily::EnLm1)[0];
        let (max, min) = uls.design(-1000.0, (50.0, 0.0), (-100.0, -200.0));
        assert!((max + 932.5).abs() < 1e-9);
        assert!((min + 1755.0).abs() < 1e-9);
        // frequent: psi_1 0.40 on the UDL, 0.75 on the tandem: -1000 - 40 - 150 = -1190
        let frequent = &Combination::presets(ModelFamily::EnLm1)[2];
        let (_, min) = frequent.design(-1000.0, (0.0, 0.0), (-100.0, -200.0));
        assert!((min + 1190.0).abs() < 1e-9);
        // Strength I: 1.25 / 0.90 and 1.75
        let strength = &Combination::presets(ModelFamily::Hl93)[0];
        let (max, _) = strength.design(400.0, (10.0, 20.0), (0.0, 0.0));
        assert!((max - (500.0 + 52.5)).abs() < 1e-9);
    }

    #[test]
    fn a_design_without_action_factors_gets_the_presets() {
        // a format-3 EN design: three combinations with no action factors
        let mut old: Vec<Combination> = Combination::presets(ModelFamily::EnLm1)
            .into_iter()
            .take(3)
            .map(|c| Combination { temperature: 0.0, settlement: 0.0, braking: 0.0, ..c })
            .collect();
        old[1].name = "my own".into();
        Combination::add_action_factors(ModelFamily::EnLm1, &mut old);
        // ULS gr1a: gamma_Q psi_0 = 1.5 x 0.6 = 0.9 (EN 1990 Table A2.1), gamma_Gset 1.2
        assert_eq!(old[0].action_factors(), (0.9, 1.2, 0.0));
        assert_eq!(old[1].action_factors(), (0.0, 0.0, 0.0), "a renamed one is the user's");
        // gr2 added: braking 1.35, the tandem at 1.35 x 0.75; temperature leading at 1.5
        // with the tandem at psi_0 (1.35 x 0.75) and the UDL at 1.35 x 0.40
        assert_eq!(old.len(), 5);
        assert_eq!(old[3].name, "ULS gr2");
        assert!((old[3].vehicle - 1.0125).abs() < 1e-12 && old[3].braking == 1.35);
        assert_eq!(old[4].name, "ULS temperature leading");
        assert!(old[4].temperature == 1.5 && (old[4].uniform - 0.54).abs() < 1e-12);
        Combination::add_action_factors(ModelFamily::EnLm1, &mut old);
        assert_eq!(old.len(), 5, "once");
    }
}
