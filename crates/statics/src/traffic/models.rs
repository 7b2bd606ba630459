//! Traffic load models, stored in a design as editable presets: each gives the lanes of
//! a carriageway, what every lane carries (a uniform load over a width and a vehicle
//! weight) and the vehicles that move along the deck.
//!
//! The values of the presets are the published ones of the clauses named beside them;
//! where a value is quoted from memory the doc says so. National annexes and owners
//! change several of them (EN 1991-2 adjustment factors, AASHTO's impact allowance), so
//! every one is a field the user can edit. Concept-design loads: local codes and a
//! licensed engineer govern.
//!
//! Units: kN, m, kN/m2 for loads over an area, kN/m for line loads.

use crate::error::counted;
use crate::frame::envelope::{AxleGroup, VariableSpacing};
use crate::units::{Quantity, Units};
use serde::{Deserialize, Serialize};

/// A traffic load model with its values.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum LoadModel {
    /// After EN 1991-2 Load Model 1 (road bridges).
    EnLm1(EnLm1),
    /// After AASHTO LRFD HL-93 (road bridges).
    Hl93(Hl93),
    /// A crowd on a footbridge, after EN 1991-2 5.3.2.1.
    Crowd(Crowd),
    /// A uniform load and an axle group of the user's own.
    UserDefined(UserDefined),
}

/// EN 1991-2 Load Model 1: tandem systems (TS) and uniformly distributed loads (UDL) in
/// notional lanes, a UDL on the remaining area.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct EnLm1 {
    /// Width of a notional lane, m: 3.0 (EN 1991-2 4.2.3, Table 4.1).
    pub lane_width: f64,
    /// Axle load Q_ik of the tandem in lanes 1, 2, 3, kN per axle: 300, 200, 100; lanes
    /// beyond the third carry no tandem (EN 1991-2 4.3.2, Table 4.2).
    pub tandem_axle: [f64; 3],
    /// UDL q_1k of lane 1, kN/m2: 9.0 (Table 4.2).
    pub udl_lane_1: f64,
    /// UDL q_ik of every other lane, kN/m2: 2.5 (Table 4.2).
    pub udl_other_lanes: f64,
    /// UDL q_rk of the remaining area, kN/m2: 2.5 (Table 4.2).
    pub udl_remaining: f64,
    /// Adjustment factors alpha_Q1, alpha_Q2, alpha_Q3 of the tandems (EN 1991-2 4.3.2(3);
    /// the national annex chooses them, >= 0.8 for alpha_Q1 recommended; 1.0 here).
    pub alpha_tandem: [f64; 3],
    /// Adjustment factor alpha_q1 of lane 1's UDL (4.3.2(3); 1.0 here).
    pub alpha_udl_lane_1: f64,
    /// Adjustment factor alpha_qi (i > 1) and alpha_qr of the other lanes and the
    /// remaining area (4.3.2(3); 1.0 here).
    pub alpha_udl_other: f64,
    /// Spacing of a tandem's two axles, m: 1.2 (EN 1991-2 Figure 4.2a).
    pub axle_spacing: f64,
    /// Distance between a tandem's two wheels across the lane, m: 2.0 (Figure 4.2a).
    pub wheel_gauge: f64,
    /// Load on the footways in traffic group gr1a, kN/m2: 3.0, the combination value of
    /// the footway load (EN 1991-2 Table 4.4a, from memory). Acts on the deck outside
    /// the carriageway where it is adverse.
    pub footway_udl: f64,
}

impl Default for EnLm1 {
    fn default() -> Self {
        EnLm1 {
            lane_width: 3.0,
            tandem_axle: [300.0, 200.0, 100.0],
            udl_lane_1: 9.0,
            udl_other_lanes: 2.5,
            udl_remaining: 2.5,
            alpha_tandem: [1.0; 3],
            alpha_udl_lane_1: 1.0,
            alpha_udl_other: 1.0,
            axle_spacing: 1.2,
            wheel_gauge: 2.0,
            footway_udl: 3.0,
        }
    }
}

/// AASHTO LRFD HL-93: the design truck or the design tandem, with the design lane load,
/// in each loaded design lane.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Hl93 {
    /// Width of a design lane, m: the number of lanes is INT(w / 3.6 m) (AASHTO LRFD
    /// 3.6.1.1.1, 12 ft).
    pub lane_width: f64,
    /// Design truck axle loads, kN, front to rear: 35, 145, 145 (8, 32, 32 kip;
    /// AASHTO LRFD 3.6.1.2.2).
    pub truck_axles: [f64; 3],
    /// Spacing of the front and middle axle, m: 4.3 (14 ft, 3.6.1.2.2).
    pub truck_front_spacing: f64,
    /// Shortest rear-axle spacing, m: 4.3 (14 ft, 3.6.1.2.2).
    pub truck_rear_spacing_min: f64,
    /// Longest rear-axle spacing, m: 9.0 (30 ft, 3.6.1.2.2); searched for the worst effect.
    pub truck_rear_spacing_max: f64,
    /// Design tandem axle load, kN: 110 (25 kip, 3.6.1.2.3).
    pub tandem_axle: f64,
    /// Design tandem axle spacing, m: 1.2 (4 ft, 3.6.1.2.3).
    pub tandem_spacing: f64,
    /// Wheel gauge of truck and tandem, m: 1.8 (6 ft, 3.6.1.2.2).
    pub wheel_gauge: f64,
    /// Design lane load, kN/m: 9.3 (0.64 kip/ft, 3.6.1.2.4), spread over `lane_load_width`.
    pub lane_load: f64,
    /// Width the lane load spreads over, m: 3.0 (10 ft, 3.6.1.2.4).
    pub lane_load_width: f64,
    /// Dynamic load allowance IM on truck and tandem (not on the lane load): 0.33
    /// (AASHTO LRFD Table 3.6.2.1-1, all other components, all other limit states).
    pub impact: f64,
    /// Multiple presence factors m for 1, 2, 3 and more loaded lanes: 1.20, 1.00, 0.85,
    /// 0.65 (AASHTO LRFD Table 3.6.1.1.2-1).
    pub multiple_presence: [f64; 4],
    /// Factor of the two-truck load: 0.90 of two trucks and of the lane load (3.6.1.3.1),
    /// for deck negative moment and interior reactions only.
    pub two_truck_factor: f64,
    /// Shortest headway between the lead axle of one truck and the rear axle of the
    /// other, m: 15 (50 ft, 3.6.1.3.1).
    pub two_truck_headway: f64,
    /// Rear-axle spacing of both trucks in the two-truck load, m: 4.3 (14 ft, 3.6.1.3.1).
    pub two_truck_rear_spacing: f64,
    /// Pedestrian load on sidewalks wider than 0.6 m, kN/m2: 3.6 (0.075 ksf,
    /// AASHTO LRFD 3.6.1.6). Acts on the deck outside the carriageway where adverse.
    pub pedestrian_load: f64,
}

impl Default for Hl93 {
    fn default() -> Self {
        Hl93 {
            lane_width: 3.6,
            truck_axles: [35.0, 145.0, 145.0],
            truck_front_spacing: 4.3,
            truck_rear_spacing_min: 4.3,
            truck_rear_spacing_max: 9.0,
            tandem_axle: 110.0,
            tandem_spacing: 1.2,
            wheel_gauge: 1.8,
            lane_load: 9.3,
            lane_load_width: 3.0,
            impact: 0.33,
            multiple_presence: [1.2, 1.0, 0.85, 0.65],
            two_truck_factor: 0.9,
            two_truck_headway: 15.0,
            two_truck_rear_spacing: 4.3,
            pedestrian_load: 3.6,
        }
    }
}

/// A crowd on a footbridge: q_fk = a + b / (L + c), kept between `min` and `max`, with L
/// the loaded length (EN 1991-2 5.3.2.1(2), equation 5.1: 2.0 + 120 / (L + 30) kN/m2,
/// between 2.5 and 5.0 kN/m2; from memory). A fixed intensity (for example the 5.0
/// kN/m2 of a continuous dense crowd, 5.3.2.1(1)) replaces the formula when given.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Crowd {
    /// a, kN/m2: 2.0.
    pub constant: f64,
    /// b, kN/m: 120.
    pub numerator: f64,
    /// c, m: 30.
    pub length_offset: f64,
    /// Lower bound, kN/m2: 2.5.
    pub min: f64,
    /// Upper bound, kN/m2: 5.0.
    pub max: f64,
    /// A fixed intensity, kN/m2, instead of the formula.
    pub fixed: Option<f64>,
}

impl Default for Crowd {
    fn default() -> Self {
        Crowd { constant: 2.0, numerator: 120.0, length_offset: 30.0, min: 2.5, max: 5.0, fixed: None }
    }
}

impl Crowd {
    /// The crowd intensity q_fk for a loaded length `loaded_length` (m), kN/m2: the fixed
    /// value when given, else a + b / (L + c) clamped to [min, max] (EN 1991-2 5.3.2.1,
    /// eq. 5.1). Degenerate: a loaded length with L + c <= 0 gives `max`.
    pub fn intensity(&self, loaded_length: f64) -> f64 {
        if let Some(q) = self.fixed {
            return q;
        }
        let denominator = loaded_length + self.length_offset;
        if denominator <= 0.0 {
            return self.max;
        }
        (self.constant + self.numerator / denominator).clamp(self.min.min(self.max), self.max)
    }
}

/// A load of the user's own: a uniform load over the carriageway where adverse and one
/// vehicle (an axle group) in a lane.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct UserDefined {
    /// Uniform load over the carriageway, kN/m2.
    pub uniform: f64,
    /// Axle loads, kN, front to rear (empty: no vehicle).
    pub axles: Vec<f64>,
    /// Spacings between consecutive axles, m (one fewer than `axles`).
    pub spacings: Vec<f64>,
    /// One spacing searched between bounds: (index into `spacings`, shortest, longest), m.
    pub variable_spacing: Option<(usize, f64, f64)>,
    /// Width of the lane the vehicle keeps to, m.
    pub lane_width: f64,
    /// Wheel gauge, m.
    pub wheel_gauge: f64,
}

impl Default for UserDefined {
    fn default() -> Self {
        UserDefined {
            uniform: 4.0,
            axles: vec![100.0, 100.0],
            spacings: vec![1.5],
            variable_spacing: None,
            lane_width: 3.0,
            wheel_gauge: 2.0,
        }
    }
}

/// The kind of a load model, for choosing a preset.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum ModelFamily {
    /// EN 1991-2 Load Model 1.
    EnLm1,
    /// AASHTO LRFD HL-93.
    Hl93,
    /// Footbridge crowd.
    Crowd,
    /// The user's own.
    UserDefined,
}

impl ModelFamily {
    /// Every family, in the order a menu lists them.
    pub const ALL: [ModelFamily; 4] =
        [ModelFamily::EnLm1, ModelFamily::Hl93, ModelFamily::Crowd, ModelFamily::UserDefined];

    /// Stable key (`en-lm1`, `hl93`, `crowd`, `user`).
    pub fn key(self) -> &'static str {
        match self {
            ModelFamily::EnLm1 => "en-lm1",
            ModelFamily::Hl93 => "hl93",
            ModelFamily::Crowd => "crowd",
            ModelFamily::UserDefined => "user",
        }
    }

    /// The family of a key, `None` for an unknown key.
    pub fn from_key(key: &str) -> Option<ModelFamily> {
        ModelFamily::ALL.into_iter().find(|f| f.key() == key)
    }
}

impl LoadModel {
    /// The preset of a family with the published values.
    pub fn preset(family: ModelFamily) -> LoadModel {
        match family {
            ModelFamily::EnLm1 => LoadModel::EnLm1(EnLm1::default()),
            ModelFamily::Hl93 => LoadModel::Hl93(Hl93::default()),
            ModelFamily::Crowd => LoadModel::Crowd(Crowd::default()),
            ModelFamily::UserDefined => LoadModel::UserDefined(UserDefined::default()),
        }
    }

    /// Which family this model is.
    pub fn family(&self) -> ModelFamily {
        match self {
            LoadModel::EnLm1(_) => ModelFamily::EnLm1,
            LoadModel::Hl93(_) => ModelFamily::Hl93,
            LoadModel::Crowd(_) => ModelFamily::Crowd,
            LoadModel::UserDefined(_) => ModelFamily::UserDefined,
        }
    }

    /// The model's name and the standard it follows, for reports.
    pub fn title(&self) -> &'static str {
        match self {
            LoadModel::EnLm1(_) => "road traffic after EN 1991-2 Load Model 1 (4.3.2)",
            LoadModel::Hl93(_) => "road traffic after AASHTO LRFD HL-93 (3.6.1.2)",
            LoadModel::Crowd(_) => "footbridge crowd after EN 1991-2 5.3.2.1",
            LoadModel::UserDefined(_) => "user-defined uniform load and vehicle",
        }
    }

    /// Every number of the model with its path below `traffic.load_model` (for example
    /// `udl_lane_1`, `tandem_axle[0]`), for validation.
    pub(crate) fn numbers(&self) -> Vec<(String, f64)> {
        self.values().into_iter().map(|v| (v.key, v.value)).collect()
    }

    /// Every number a user may edit, in the order a panel lists them: its key (path below
    /// `traffic.load_model`), its name in words, its kind of quantity and its SI value.
    /// A crowd's fixed intensity is listed only when it is set; a vehicle's axles and
    /// spacings one by one.
    pub fn values(&self) -> Vec<ModelValue> {
        let mut copy = self.clone();
        copy.slots()
            .into_iter()
            .map(|(key, label, quantity, v)| ModelValue { key, label, quantity, value: *v })
            .collect()
    }

    /// Sets the number with key `key` (see [`LoadModel::values`]) to `value` (SI).
    /// Returns false, changing nothing, for a key the model does not have.
    pub fn set_value(&mut self, key: &str, value: f64) -> bool {
        match self.slots().into_iter().find(|(k, ..)| k == key) {
            Some((.., slot)) => {
                *slot = value;
                true
            }
            None => false,
        }
    }

    /// The editable numbers as (key, words, quantity, place): one list serves reading,
    /// writing and validation.
    fn slots(&mut self) -> Vec<(String, String, Quantity, &mut f64)> {
        use Quantity::{Count, Force, Length, LineLoad, Pressure};
        let mut out: Vec<(String, String, Quantity, &mut f64)> = Vec::new();
        // a macro, not a closure: each push holds its own mutable borrow of a field
        macro_rules! slot {
            ($key:expr, $label:expr, $q:expr, $v:expr) => {
                out.push(($key.to_string(), $label.to_string(), $q, $v))
            };
        }
        match self {
            LoadModel::EnLm1(m) => {
                slot!("lane_width", "notional lane width", Length, &mut m.lane_width);
                for (i, v) in m.tandem_axle.iter_mut().enumerate() {
                    slot!(
                        format!("tandem_axle[{i}]"),
                        format!("tandem axle load Q{}k, lane {}", i + 1, i + 1),
                        Force,
                        v
                    );
                }
                slot!("udl_lane_1", "UDL q1k, lane 1", Pressure, &mut m.udl_lane_1);
                slot!("udl_other_lanes", "UDL qik, other lanes", Pressure, &mut m.udl_other_lanes);
                slot!("udl_remaining", "UDL qrk, remaining area", Pressure, &mut m.udl_remaining);
                for (i, v) in m.alpha_tandem.iter_mut().enumerate() {
                    slot!(format!("alpha_tandem[{i}]"), format!("adjustment factor αQ{}", i + 1), Count, v);
                }
                slot!("alpha_udl_lane_1", "adjustment factor αq1", Count, &mut m.alpha_udl_lane_1);
                slot!("alpha_udl_other", "adjustment factor αqi, αqr", Count, &mut m.alpha_udl_other);
                slot!("axle_spacing", "tandem axle spacing", Length, &mut m.axle_spacing);
                slot!("wheel_gauge", "tandem wheel gauge", Length, &mut m.wheel_gauge);
                slot!("footway_udl", "footway load (gr1a)", Pressure, &mut m.footway_udl);
            }
            LoadModel::Hl93(m) => {
                slot!("lane_width", "design lane width", Length, &mut m.lane_width);
                for (i, v) in m.truck_axles.iter_mut().enumerate() {
                    slot!(format!("truck_axles[{i}]"), format!("truck axle {} load", i + 1), Force, v);
                }
                slot!("truck_front_spacing", "truck front axle spacing", Length, &mut m.truck_front_spacing);
                slot!(
                    "truck_rear_spacing_min",
                    "truck rear axle spacing, shortest",
                    Length,
                    &mut m.truck_rear_spacing_min
                );
                slot!(
                    "truck_rear_spacing_max",
                    "truck rear axle spacing, longest",
                    Length,
                    &mut m.truck_rear_spacing_max
                );
                slot!("tandem_axle", "tandem axle load", Force, &mut m.tandem_axle);
                slot!("tandem_spacing", "tandem axle spacing", Length, &mut m.tandem_spacing);
                slot!("wheel_gauge", "wheel gauge", Length, &mut m.wheel_gauge);
                slot!("lane_load", "design lane load", LineLoad, &mut m.lane_load);
                slot!("lane_load_width", "lane load width", Length, &mut m.lane_load_width);
                slot!("impact", "dynamic load allowance IM", Count, &mut m.impact);
                for (i, v) in m.multiple_presence.iter_mut().enumerate() {
                    let lanes = if i == 3 {
                        "4 or more loaded lanes".to_string()
                    } else {
                        format!("{} loaded lane{}", i + 1, if i == 0 { "" } else { "s" })
                    };
                    slot!(
                        format!("multiple_presence[{i}]"),
                        format!("multiple presence factor, {lanes}"),
                        Count,
                        v
                    );
                }
                slot!("two_truck_factor", "two-truck factor", Count, &mut m.two_truck_factor);
                slot!("two_truck_headway", "two-truck headway, shortest", Length, &mut m.two_truck_headway);
                slot!(
                    "two_truck_rear_spacing",
                    "two-truck rear axle spacing",
                    Length,
                    &mut m.two_truck_rear_spacing
                );
                slot!("pedestrian_load", "sidewalk pedestrian load", Pressure, &mut m.pedestrian_load);
            }
            LoadModel::Crowd(m) => {
                slot!("constant", "crowd formula: a", Pressure, &mut m.constant);
                slot!("numerator", "crowd formula: b", LineLoad, &mut m.numerator);
                slot!("length_offset", "crowd formula: c", Length, &mut m.length_offset);
                slot!("min", "crowd load, lower bound", Pressure, &mut m.min);
                slot!("max", "crowd load, upper bound", Pressure, &mut m.max);
                if let Some(q) = m.fixed.as_mut() {
                    slot!("fixed", "crowd load, fixed", Pressure, q);
                }
            }
            LoadModel::UserDefined(m) => {
                slot!("uniform", "uniform load", Pressure, &mut m.uniform);
                for (i, v) in m.axles.iter_mut().enumerate() {
                    slot!(format!("axles[{i}]"), format!("axle {} load", i + 1), Force, v);
                }
                for (i, v) in m.spacings.iter_mut().enumerate() {
                    slot!(
                        format!("spacings[{i}]"),
                        format!("spacing, axles {} to {}", i + 1, i + 2),
                        Length,
                        v
                    );
                }
                if let Some((_, lo, hi)) = m.variable_spacing.as_mut() {
                    slot!("variable_spacing.min", "variable spacing, shortest", Length, lo);
                    slot!("variable_spacing.max", "variable spacing, longest", Length, hi);
                }
                slot!("lane_width", "lane width", Length, &mut m.lane_width);
                slot!("wheel_gauge", "wheel gauge", Length, &mut m.wheel_gauge);
            }
        }
        out
    }
}

/// One editable number of a load model.
#[derive(Debug, Clone, PartialEq)]
pub struct ModelValue {
    /// Its path below `traffic.load_model` (`udl_lane_1`, `tandem_axle[0]`).
    pub key: String,
    /// Its name in words.
    pub label: String,
    /// What kind of quantity it is (its unit on screen).
    pub quantity: Quantity,
    /// Its value, SI.
    pub value: f64,
}

/// Where a traffic alternative counts.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Applies {
    /// To every effect.
    Everywhere,
    /// Only to deck negative (hogging) moments and to interior reactions of the deck
    /// (the posts and piers that carry it): AASHTO LRFD 3.6.1.3.1.
    HoggingAndInteriorReactions,
}

/// One vehicle arrangement a lane carries (the model's effect is the worst of them).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Vehicle {
    /// Name for reports (`tandem`, `truck`, `two trucks`).
    pub name: String,
    /// The axle group of one lane with weight 1 (kN per axle before the lane's weight).
    pub axles: AxleGroup,
    /// Factor on the lanes' uniform load when this vehicle is the one (0.9 for the
    /// two-truck load, 1 otherwise).
    pub uniform_factor: f64,
    /// Where the arrangement counts.
    pub applies: Applies,
}

/// One lane of a carriageway as a model loads it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Lane {
    /// Lane width, m (the strip it may stand in).
    pub width: f64,
    /// Uniform load, kN/m2, over `uniform_width` centred in the lane.
    pub uniform: f64,
    /// Width of the uniform load, m (<= `width`).
    pub uniform_width: f64,
    /// Weight of the lane's vehicle: the axle loads of [`Vehicle::axles`] times this
    /// (LM1: alpha_Qi Q_ik; HL-93: 1 + IM; 0: no vehicle).
    pub vehicle_weight: f64,
    /// How far the vehicle may move sideways from the lane's centre, m (LM1: 0, tandems
    /// travel centrally; HL-93: the wheels may come within 0.6 m of the lane's edge,
    /// AASHTO LRFD 3.6.1.3.1). A uniform load narrower than the lane lies anywhere in it.
    pub shift: f64,
}

/// How a model loads a carriageway across its width.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LaneLayout {
    /// The lanes, lane 1 first. Each may stand anywhere in the carriageway, lanes not
    /// overlapping (EN 1991-2 4.2.4: numbered and placed for the most adverse effect).
    pub lanes: Vec<Lane>,
    /// Uniform load on the carriageway outside the lanes, kN/m2 (EN's remaining area).
    pub remaining: f64,
    /// Uniform load on the deck outside the carriageway (footways), kN/m2.
    pub footway: f64,
    /// Wheel gauge of the vehicles, m (the wheels stand at +-gauge/2 of the lane centre).
    pub wheel_gauge: f64,
    /// Multiple presence factor for k loaded lanes (index k - 1); empty: 1 for any k and
    /// every lane is loaded. With factors, the search tries each number of loaded lanes.
    pub multiple_presence: Vec<f64>,
    /// The vehicle arrangements a lane carries.
    pub vehicles: Vec<Vehicle>,
    /// What the layout follows, in words (number of lanes and their rule), in SI.
    pub rule: String,
    /// The same, as numbers for [`LaneWords::describe`] in any units.
    pub words: LaneWords,
}

crate::json::tagged_in_json! {
    tag = "kind", remote = "LaneWords";
    /// The numbers of a lane rule, to say it in any units.
    #[derive(Debug, Clone, Copy, PartialEq)]
    pub enum LaneWords {
        /// EN 1991-2 notional lanes.
        En {
            /// Number of lanes.
            count: usize,
            /// Lane width, m.
            lane_width: f64,
            /// Carriageway width, m.
            carriageway: f64,
            /// Remaining area width, m.
            remaining: f64,
        },
        /// AASHTO design lanes.
        Aashto {
            /// Number of lanes.
            count: usize,
            /// Carriageway width, m.
            carriageway: f64,
            /// Design lane width, m.
            lane_width: f64,
            /// Dynamic load allowance (fraction).
            impact: f64,
        },
        /// A crowd.
        Crowd {
            /// Its intensity, kN/m2.
            intensity: f64,
            /// The loaded length, m (`None`: a fixed intensity).
            loaded_length: Option<f64>,
        },
        /// The user's own.
        User {
            /// Uniform load, kN/m2.
            uniform: f64,
        },
    }
}

impl LaneWords {
    /// The rule in words with its numbers in `units`.
    pub fn describe(&self, units: Units) -> String {
        let show = |q, v| units.show(q, v);
        match *self {
            LaneWords::En { count, lane_width, carriageway, remaining } => format!(
                "{} {} wide in a {} carriageway (EN 1991-2 Table 4.1), tandems centred in their lanes, remaining \
                 area {}",
                counted(count, "notional lane", "notional lanes"),
                show(Quantity::Length, lane_width),
                show(Quantity::Length, carriageway),
                show(Quantity::Length, remaining)
            ),
            LaneWords::Aashto { count, carriageway, lane_width, impact } => format!(
                "{} {} wide in a {} roadway (AASHTO LRFD 3.6.1.1.1), multiple presence factors \
                 (Table 3.6.1.1.2-1), IM = {:.0}% on truck and tandem",
                counted(count, "design lane", "design lanes"),
                show(Quantity::Length, lane_width),
                show(Quantity::Length, carriageway),
                impact * 100.0
            ),
            LaneWords::Crowd { intensity, loaded_length: Some(l) } => format!(
                "crowd {} for a loaded length of {} (EN 1991-2 5.3.2.1), over the deck where adverse",
                show(Quantity::Pressure, intensity),
                show(Quantity::Length, l)
            ),
            LaneWords::Crowd { intensity, loaded_length: None } => {
                format!("crowd {} over the deck where adverse", show(Quantity::Pressure, intensity))
            }
            LaneWords::User { uniform } => format!(
                "{} over the carriageway where adverse and one vehicle in a lane",
                show(Quantity::Pressure, uniform)
            ),
        }
    }
}

impl LoadModel {
    /// The lanes, loads and vehicles of this model on a carriageway `carriageway` m wide,
    /// the arch being `span` m long (the crowd's loaded length).
    ///
    /// EN 1991-2 Table 4.1: w < 5.4 m, one lane of 3 m and the rest remaining area;
    /// 5.4 <= w < 6 m, two lanes of w / 2; otherwise INT(w / 3) lanes of 3 m. AASHTO LRFD
    /// 3.6.1.1.1: INT(w / 3.6 m) design lanes (at least one: a carriageway narrower than
    /// a lane still carries one vehicle, common practice). Degenerate: a carriageway of
    /// zero width has no lanes.
    pub fn lane_layout(&self, carriageway: f64, span: f64) -> LaneLayout {
        match self {
            LoadModel::EnLm1(m) => en_layout(m, carriageway),
            LoadModel::Hl93(m) => hl93_layout(m, carriageway),
            LoadModel::Crowd(m) => LaneLayout {
                lanes: Vec::new(),
                remaining: m.intensity(span),
                footway: m.intensity(span),
                wheel_gauge: 0.0,
                multiple_presence: Vec::new(),
                vehicles: Vec::new(),
                rule: crowd_words(m, span).describe(Units::Si),
                words: crowd_words(m, span),
            },
            LoadModel::UserDefined(m) => {
                let vehicles = if m.axles.is_empty() {
                    Vec::new()
                } else {
                    vec![Vehicle {
                        name: "vehicle".into(),
                        axles: AxleGroup {
                            loads: m.axles.clone(),
                            spacings: m.spacings.clone(),
                            variable: m.variable_spacing.map(|(index, min, max)| VariableSpacing {
                                index,
                                min,
                                max,
                            }),
                            // the user's vehicle acts whole
                            neglect_relieving: false,
                        },
                        uniform_factor: 1.0,
                        applies: Applies::Everywhere,
                    }]
                };
                let lanes = if vehicles.is_empty() || carriageway <= 0.0 {
                    Vec::new()
                } else {
                    // the uniform load covers the vehicle's lane too
                    let width = m.lane_width.min(carriageway);
                    vec![Lane {
                        width,
                        uniform: m.uniform,
                        uniform_width: width,
                        vehicle_weight: 1.0,
                        shift: ((width - m.wheel_gauge) / 2.0).max(0.0),
                    }]
                };
                LaneLayout {
                    lanes,
                    remaining: m.uniform,
                    footway: 0.0,
                    wheel_gauge: m.wheel_gauge,
                    multiple_presence: Vec::new(),
                    vehicles,
                    rule: LaneWords::User { uniform: m.uniform }.describe(Units::Si),
                    words: LaneWords::User { uniform: m.uniform },
                }
            }
        }
    }
}

fn crowd_words(m: &Crowd, span: f64) -> LaneWords {
    LaneWords::Crowd { intensity: m.intensity(span), loaded_length: m.fixed.is_none().then_some(span) }
}

fn en_layout(m: &EnLm1, w: f64) -> LaneLayout {
    // Table 4.1 for 3 m lanes: below 5.4 m one lane, 5.4 to 6 m two of w / 2; the
    // thresholds follow an edited lane width (1.8 and 2 lane widths)
    let lw = m.lane_width;
    let (count, lane_width) = if w <= 0.0 {
        (0, lw)
    } else if w < 1.8 * lw {
        (1, lw.min(w))
    } else if w < 2.0 * lw {
        (2, w / 2.0)
    } else {
        ((w / lw + 1e-9).floor() as usize, lw)
    };
    let lanes = (0..count)
        .map(|i| Lane {
            width: lane_width,
            uniform: if i == 0 {
                m.alpha_udl_lane_1 * m.udl_lane_1
            } else {
                m.alpha_udl_other * m.udl_other_lanes
            },
            uniform_width: lane_width,
            vehicle_weight: m.tandem_axle.get(i).zip(m.alpha_tandem.get(i)).map_or(0.0, |(q, a)| q * a),
            shift: 0.0,
        })
        .collect();
    let words = LaneWords::En {
        count,
        lane_width,
        carriageway: w,
        remaining: (w - count as f64 * lane_width).max(0.0),
    };
    LaneLayout {
        lanes,
        remaining: m.alpha_udl_other * m.udl_remaining,
        footway: m.footway_udl,
        wheel_gauge: m.wheel_gauge,
        multiple_presence: Vec::new(),
        vehicles: vec![Vehicle {
            name: "tandem".into(),
            // a tandem acts whole
            axles: AxleGroup {
                loads: vec![1.0, 1.0],
                spacings: vec![m.axle_spacing],
                variable: None,
                neglect_relieving: false,
            },
            uniform_factor: 1.0,
            applies: Applies::Everywhere,
        }],
        rule: words.describe(Units::Si),
        words,
    }
}

fn hl93_layout(m: &Hl93, w: f64) -> LaneLayout {
    // 3.6.1.1.1: INT(w / 3.6 m) lanes; a roadway of 6.0 to 7.2 m (20 to 24 ft) has two
    // lanes of half its width; a narrower one still carries one vehicle (common practice)
    let (count, lane_width) = if w <= 0.0 {
        (0, m.lane_width)
    } else if (6.0..7.2).contains(&w) && m.lane_width >= 3.6 - 1e-9 {
        (2, w / 2.0)
    } else {
        (((w / m.lane_width + 1e-9).floor() as usize).max(1), m.lane_width.min(w))
    };
    let truck = AxleGroup {
        loads: m.truck_axles.to_vec(),
        spacings: vec![m.truck_front_spacing, m.truck_rear_spacing_min],
        variable: Some(VariableSpacing {
            index: 1,
            min: m.truck_rear_spacing_min,
            max: m.truck_rear_spacing_max,
        }),
        // 3.6.1.3.1: axles that do not contribute are neglected
        neglect_relieving: true,
    };
    let tandem = AxleGroup {
        loads: vec![m.tandem_axle, m.tandem_axle],
        spacings: vec![m.tandem_spacing],
        variable: None,
        neglect_relieving: true,
    };
    // two trucks, each with the fixed rear spacing, the gap between them searched from the
    // shortest headway to a length no deck of this tool reaches
    let two = m.two_truck_factor;
    let mut loads: Vec<f64> = m.truck_axles.iter().map(|q| q * two).collect();
    loads.extend(m.truck_axles.iter().map(|q| q * two));
    let two_trucks = AxleGroup {
        loads,
        spacings: vec![
            m.truck_front_spacing,
            m.two_truck_rear_spacing,
            m.two_truck_headway,
            m.truck_front_spacing,
            m.two_truck_rear_spacing,
        ],
        variable: Some(VariableSpacing {
            index: 2,
            min: m.two_truck_headway,
            max: m.two_truck_headway.max(TWO_TRUCK_LONGEST_GAP),
        }),
        neglect_relieving: true,
    };
    let lane_load_width = m.lane_load_width.min(lane_width);
    let words = LaneWords::Aashto { count, carriageway: w, lane_width, impact: m.impact };
    LaneLayout {
        lanes: (0..count)
            .map(|_| Lane {
                width: lane_width,
                uniform: if lane_load_width > 0.0 { m.lane_load / lane_load_width } else { 0.0 },
                uniform_width: lane_load_width,
                vehicle_weight: 1.0 + m.impact,
                // wheels no nearer than 0.6 m to the lane's edge (3.6.1.3.1)
                shift: (lane_width / 2.0 - 0.6 - m.wheel_gauge / 2.0).max(0.0),
            })
            .collect(),
        remaining: 0.0,
        footway: m.pedestrian_load,
        wheel_gauge: m.wheel_gauge,
        multiple_presence: m.multiple_presence.to_vec(),
        vehicles: vec![
            Vehicle { name: "truck".into(), axles: truck, uniform_factor: 1.0, applies: Applies::Everywhere },
            Vehicle {
                name: "tandem".into(),
                axles: tandem,
                uniform_factor: 1.0,
                applies: Applies::Everywhere,
            },
            Vehicle {
                name: "two trucks".into(),
                axles: two_trucks,
                uniform_factor: two,
                applies: Applies::HoggingAndInteriorReactions,
            },
        ],
        rule: words.describe(Units::Si),
        words,
    }
}

/// Longest gap between the two trucks of the two-truck load, m: longer than any deck, so
/// the second truck may stand anywhere behind the first (the search's cost does not grow
/// with it).
const TWO_TRUCK_LONGEST_GAP: f64 = 10_000.0;

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn en_lanes_follow_table_4_1() {
        // EN 1991-2 Table 4.1: w < 5.4: 1 lane of 3 m; 5.4 <= w < 6: 2 of w/2; else INT(w/3)
        let m = LoadModel::preset(ModelFamily::EnLm1);
        let l = m.lane_layout(5.0, 50.0);
        assert_eq!(l.lanes.len(), 1);
        assert_eq!(l.lanes[0].width, 3.0);
        let l = m.lane_layout(5.6, 50.0);
        assert_eq!(l.lanes.len(), 2);
        assert!((l.lanes[0].width - 2.8).abs() < 1e-12);
        let l = m.lane_layout(11.0, 50.0);
        assert_eq!(l.lanes.len(), 3);
        // lane 1: 9 kN/m2 and 300 kN axles; lane 2: 2.5 and 200; lane 3: 2.5 and 100 (Table 4.2)
        let u: Vec<f64> = l.lanes.iter().map(|x| x.uniform).collect();
        let v: Vec<f64> = l.lanes.iter().map(|x| x.vehicle_weight).collect();
        assert_eq!(u, vec![9.0, 2.5, 2.5]);
        assert_eq!(v, vec![300.0, 200.0, 100.0]);
        let l = m.lane_layout(13.0, 50.0);
        assert_eq!(l.lanes.len(), 4);
        assert_eq!(l.lanes[3].vehicle_weight, 0.0, "no tandem beyond lane 3");
    }

    #[test]
    fn hl93_lanes_are_int_w_over_3_6() {
        // AASHTO LRFD 3.6.1.1.1: INT(w / 12 ft), taken as 3.6 m
        let m = LoadModel::preset(ModelFamily::Hl93);
        assert_eq!(m.lane_layout(7.3, 50.0).lanes.len(), 2);
        // 6.0 to 7.2 m (20 to 24 ft): two lanes of half the width (3.6.1.1.1)
        let l = m.lane_layout(7.0, 50.0);
        assert_eq!(l.lanes.len(), 2);
        assert!((l.lanes[0].width - 3.5).abs() < 1e-12);
        assert_eq!(m.lane_layout(5.9, 50.0).lanes.len(), 1);
        assert_eq!(m.lane_layout(10.8, 50.0).lanes.len(), 3);
        assert_eq!(m.lane_layout(3.0, 50.0).lanes.len(), 1, "a narrow carriageway still carries one vehicle");
        let l = m.lane_layout(7.3, 50.0);
        // 9.3 kN/m over 3.0 m, truck x 1.33 (IM, Table 3.6.2.1-1)
        assert!((l.lanes[0].uniform * l.lanes[0].uniform_width - 9.3).abs() < 1e-12);
        assert!((l.lanes[0].vehicle_weight - 1.33).abs() < 1e-12);
        assert_eq!(l.vehicles.len(), 3);
        assert_eq!(l.vehicles[2].applies, Applies::HoggingAndInteriorReactions);
        // 90 % of two trucks: 0.9 x (35 + 145 + 145) x 2 = 585 kN
        let total: f64 = l.vehicles[2].axles.loads.iter().sum();
        assert!((total - 585.0).abs() < 1e-9);
    }

    #[test]
    fn every_value_reads_and_writes_by_its_key() {
        for family in ModelFamily::ALL {
            let mut m = LoadModel::preset(family);
            for (k, v) in m.values().into_iter().enumerate() {
                let new = v.value + 1.0 + k as f64;
                assert!(m.set_value(&v.key, new), "{:?} {}", family, v.key);
                let back = m.values().into_iter().find(|w| w.key == v.key).expect("still there");
                assert_eq!(back.value, new, "{:?} {}", family, v.key);
                assert!(!v.label.is_empty() && !v.label.contains('_'), "{}", v.label);
            }
            assert!(!m.set_value("no such value", 1.0));
        }
        // the keys validation names are the ones a file uses: HL-93's impact
        let mut m = LoadModel::preset(ModelFamily::Hl93);
        assert!(m.set_value("impact", 0.15));
        assert!(matches!(m, LoadModel::Hl93(Hl93 { impact, .. }) if impact == 0.15));
    }

    #[test]
    fn crowd_follows_equation_5_1() {
        // EN 1991-2 5.3.2.1 eq. 5.1: 2.0 + 120 / (L + 30), 2.5 <= q <= 5.0 (from memory)
        let c = Crowd::default();
        assert!((c.intensity(10.0) - 5.0).abs() < 1e-12); // 2 + 120/40 = 5.0
        assert!((c.intensity(50.0) - 3.5).abs() < 1e-12); // 2 + 120/80 = 3.5
        assert!((c.intensity(210.0) - 2.5).abs() < 1e-12); // 2 + 120/240 = 2.5
        assert!((c.intensity(1000.0) - 2.5).abs() < 1e-12); // bounded below
        assert!((c.intensity(0.0) - 5.0).abs() < 1e-12); // 2 + 4 = 6 bounded above
    }
}
