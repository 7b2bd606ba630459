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
}

impl Combination {
    fn new(name: &str, clause: &str, g_sup: f64, g_inf: f64, uniform: f64, vehicle: f64) -> Combination {
        Combination {
            name: name.into(),
            clause: clause.into(),
            permanent_unfavourable: g_sup,
            permanent_favourable: g_inf,
            uniform,
            vehicle,
        }
    }

    /// The combinations a load model's family is checked with (presets):
    ///
    /// * EN 1991-2 LM1 and the user's model: ULS gr1a after EN 1990 A2 Table A2.4(B)
    ///   (eq. 6.10; gamma_G 1.35 / 1.00, gamma_Q 1.35 for road traffic), SLS characteristic
    ///   (A2.4.1, all factors 1.0), SLS frequent (psi_1 = 0.75 for the tandems and 0.40
    ///   for the UDL, EN 1990 Table A2.1). Traffic group gr1a: EN 1991-2 Table 4.4a.
    /// * Footbridge crowd: ULS (Table A2.4(B), gamma_Q 1.35 for pedestrian traffic), SLS
    ///   characteristic, SLS frequent (psi_1 = 0.40, EN 1990 Table A2.2, group gr1; from
    ///   memory).
    /// * AASHTO HL-93: Strength I (AASHTO LRFD Table 3.4.1-1, LL 1.75; DC gamma_p 1.25 /
    ///   0.90, Table 3.4.1-2) and Service I (all 1.0).
    pub fn presets(family: ModelFamily) -> Vec<Combination> {
        match family {
            ModelFamily::EnLm1 | ModelFamily::UserDefined => vec![
                Combination::new(
                    "ULS gr1a",
                    "EN 1990 A2 Table A2.4(B) eq. 6.10; EN 1991-2 Table 4.4a",
                    1.35,
                    1.0,
                    1.35,
                    1.35,
                ),
                Combination::new("SLS characteristic", "EN 1990 A2.4.1, Table A2.6", 1.0, 1.0, 1.0, 1.0),
                Combination::new(
                    "SLS frequent",
                    "EN 1990 Table A2.1 (psi_1: TS 0.75, UDL 0.40)",
                    1.0,
                    1.0,
                    0.40,
                    0.75,
                ),
            ],
            ModelFamily::Crowd => vec![
                Combination::new("ULS", "EN 1990 A2 Table A2.4(B) eq. 6.10", 1.35, 1.0, 1.35, 1.35),
                Combination::new("SLS characteristic", "EN 1990 A2.4.1", 1.0, 1.0, 1.0, 1.0),
                Combination::new(
                    "SLS frequent",
                    "EN 1990 Table A2.2 (psi_1 0.40, from memory)",
                    1.0,
                    1.0,
                    0.40,
                    0.40,
                ),
            ],
            ModelFamily::Hl93 => vec![
                Combination::new(
                    "Strength I",
                    "AASHTO LRFD Tables 3.4.1-1 and 3.4.1-2 (DC factors on all permanent load, surfacing included)",
                    1.25,
                    0.90,
                    1.75,
                    1.75,
                ),
                Combination::new("Service I", "AASHTO LRFD Table 3.4.1-1", 1.0, 1.0, 1.0, 1.0),
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
}
