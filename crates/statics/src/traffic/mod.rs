//! Traffic on the deck: the cross-section (carriageway and rib positions), the load
//! model, how its lanes are shared between the ribs, and the combinations with the
//! permanent actions. What a design stores is [`TrafficDesign`]; the envelopes along
//! the span come from `frame::envelope` over the influence lines (`arch::traffic`).
//!
//! Concept-design loads and factors: local codes and a licensed engineer govern.

pub mod combination;
pub mod models;
pub mod sharing;

use crate::error::{Field, Problem};
use combination::Combination;
use models::{LoadModel, ModelFamily};
use serde::{Deserialize, Serialize};

/// The traffic part of a design.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TrafficDesign {
    /// Carriageway width between kerbs, m, centred on the deck: the lanes come from it;
    /// the deck outside it (footways) carries the footway load of the model.
    pub carriageway_width: f64,
    /// Positions of the ribs across the deck, m from the deck centreline, left to right;
    /// empty: evenly spaced across the deck width (`sharing::rib_positions`).
    #[serde(default)]
    pub rib_positions: Vec<f64>,
    /// The load model with its values.
    pub load_model: LoadModel,
    /// The combinations the envelopes are reported for.
    pub combinations: Vec<Combination>,
}

impl TrafficDesign {
    /// A family's preset on a carriageway `carriageway_width` m wide: the model with its
    /// published values and its combinations, ribs evenly spaced.
    pub fn preset(family: ModelFamily, carriageway_width: f64) -> TrafficDesign {
        TrafficDesign {
            carriageway_width,
            rib_positions: Vec::new(),
            load_model: LoadModel::preset(family),
            combinations: Combination::presets(family),
        }
    }

    /// The traffic of a design that names none (written before traffic was part of the
    /// format): EN 1991-2 Load Model 1 over the whole deck width as carriageway (at most
    /// [`MAX_CARRIAGEWAY`]).
    pub fn for_deck_width(deck_width: f64) -> TrafficDesign {
        TrafficDesign::preset(ModelFamily::EnLm1, deck_width.min(MAX_CARRIAGEWAY))
    }
}

/// Widest carriageway, m: twelve 3.3 m lanes, more than any arch deck carries; the lane
/// search's time grows with the number of lanes (common practice for the bound).
pub const MAX_CARRIAGEWAY: f64 = 40.0;
/// Narrowest lane a model may have, m: below it no road vehicle fits (EN 1991-2 and
/// AASHTO lanes are 3 m and 3.6 m; common practice for the bound).
pub const MIN_LANE_WIDTH: f64 = 2.5;

impl TrafficDesign {
    /// Problems of the traffic inputs on a deck `deck_width` m wide with `ribs` ribs.
    pub(crate) fn problems(&self, deck_width: f64, ribs: usize) -> Vec<Problem> {
        let mut out = Vec::new();
        let finite = |v: f64| v.is_finite();
        let w = self.carriageway_width;
        if !(finite(w) && w > 0.0) {
            out.push(Problem::new(
                Field::CarriagewayWidth,
                format!("the carriageway width {w} m must be a positive number"),
            ));
        } else if w > MAX_CARRIAGEWAY {
            out.push(Problem::new(
                Field::CarriagewayWidth,
                format!("the carriageway ({w} m) is wider than {MAX_CARRIAGEWAY} m; model a wider road as two decks"),
            ));
        } else if deck_width.is_finite() && w > deck_width + 1e-9 {
            out.push(
                Problem::new(
                    Field::CarriagewayWidth,
                    format!("the carriageway ({w} m) is wider than the deck ({deck_width} m); narrow it or widen the deck"),
                )
                .involving([Field::DeckWidth]),
            );
        }
        let p = &self.rib_positions;
        if !p.is_empty() {
            if p.len() != ribs {
                out.push(
                    Problem::new(
                        Field::RibPositions,
                        format!(
                            "{} rib positions are given for {ribs} ribs; give one per rib or none (evenly spaced)",
                            p.len()
                        ),
                    )
                    .involving([Field::Ribs]),
                );
            } else if p.iter().any(|y| !y.is_finite() || y.abs() > deck_width / 2.0 + 1e-9) {
                out.push(
                    Problem::new(
                        Field::RibPositions,
                        format!(
                            "every rib must stand under the deck, within +-{} m of its centreline",
                            deck_width / 2.0
                        ),
                    )
                    .involving([Field::DeckWidth]),
                );
            } else if p.iter().zip(p.iter().skip(1)).any(|(a, b)| b <= a) {
                out.push(Problem::new(
                    Field::RibPositions,
                    "list the rib positions from left to right, each further right than the one before",
                ));
            }
        }
        for (name, v) in self.load_model.numbers() {
            if !(finite(v) && v >= 0.0) {
                out.push(Problem::new(
                    Field::LoadModel,
                    format!("the load model's {name} ({v}) must be zero or a positive number"),
                ));
            }
        }
        out.extend(self.model_shape_problems());
        for (i, c) in self.combinations.iter().enumerate() {
            let factors = [
                c.permanent_unfavourable,
                c.permanent_favourable,
                c.uniform,
                c.vehicle,
                c.temperature,
                c.settlement,
                c.braking,
            ];
            if factors.iter().any(|f| !(f.is_finite() && *f >= 0.0)) {
                out.push(Problem::new(
                    Field::Combinations,
                    format!("combination {} ('{}') has a factor that is not zero or positive", i + 1, c.name),
                ));
            }
        }
        out
    }

    /// Problems of the shape of a model (lane widths, axle lists).
    fn model_shape_problems(&self) -> Vec<Problem> {
        let mut out = Vec::new();
        let mut add = |m: String| out.push(Problem::new(Field::LoadModel, m));
        let narrow = |w: f64| w.is_finite() && w < MIN_LANE_WIDTH;
        match &self.load_model {
            LoadModel::EnLm1(m) if narrow(m.lane_width) => {
                add(format!("the notional lane width {} m is below {MIN_LANE_WIDTH} m", m.lane_width))
            }
            LoadModel::Hl93(m) => {
                if narrow(m.lane_width) {
                    add(format!("the design lane width {} m is below {MIN_LANE_WIDTH} m", m.lane_width));
                }
                if m.truck_rear_spacing_max < m.truck_rear_spacing_min {
                    add("the truck's longest rear-axle spacing is shorter than its shortest".into());
                }
            }
            LoadModel::Crowd(m) if m.max < m.min => {
                add("the crowd load's upper bound is below its lower bound".into())
            }
            LoadModel::UserDefined(m) => {
                if !m.axles.is_empty() && m.spacings.len() + 1 != m.axles.len() {
                    add(format!(
                        "{} axles need {} spacings; {} are given",
                        m.axles.len(),
                        m.axles.len() - 1,
                        m.spacings.len()
                    ));
                }
                if let Some((index, lo, hi)) = m.variable_spacing {
                    if index >= m.spacings.len() || hi < lo {
                        add("the variable spacing names no spacing of the vehicle, or its bounds are out of order".into());
                    }
                }
                if !m.axles.is_empty() && (narrow(m.lane_width) || m.lane_width < m.wheel_gauge) {
                    add(format!(
                        "the vehicle's lane ({} m) must be at least {MIN_LANE_WIDTH} m and as wide as its wheel gauge ({} m)",
                        m.lane_width, m.wheel_gauge
                    ));
                }
            }
            _ => {}
        }
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn inputs_are_checked() {
        let mut t = TrafficDesign::preset(ModelFamily::EnLm1, 7.5);
        assert!(t.problems(11.0, 2).is_empty());
        t.carriageway_width = 12.0;
        t.rib_positions = vec![2.0, -2.0];
        let p = t.problems(11.0, 2);
        assert_eq!(p.len(), 2, "{p:?}");
        assert!(p[0].involves(Field::CarriagewayWidth) && p[0].involves(Field::DeckWidth));
        assert!(p[1].involves(Field::RibPositions));
        t = TrafficDesign::preset(ModelFamily::Hl93, 7.5);
        if let LoadModel::Hl93(m) = &mut t.load_model {
            m.impact = f64::NAN;
        }
        t.combinations[0].vehicle = -1.0;
        let p = t.problems(11.0, 2);
        assert_eq!(p.len(), 2, "{p:?}");
        assert!(p[0].message.contains("impact"));
        // bounds that keep the lane search small
        let mut t = TrafficDesign::preset(ModelFamily::EnLm1, 45.0);
        assert!(t.problems(60.0, 2)[0].message.contains("40 m"));
        t.carriageway_width = 7.5;
        t.load_model.set_value("lane_width", 1e-9);
        assert!(t.problems(11.0, 2)[0].message.contains("below 2.5 m"));
    }
}
