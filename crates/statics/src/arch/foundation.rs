//! Foundation demand at each springing and a thrust block sized for it.
//!
//! From the frame model's springing envelopes (whole cross-section, `arch::traffic`):
//! thrust H, vertical V and (fixed rib) moment M. The characteristic values are those of
//! the serviceability combination with the largest traffic factors (EN 1990 6.5.3 eq.
//! 6.14b, the characteristic combination; AASHTO Service I); the largest H and the
//! largest V are taken together although they need not occur together (conservative).
//! The angle of the resultant below the horizontal is given under the dead load, and its
//! range over every combination from the extremes of H and V.
//!
//! The thrust block (a concrete block under all ribs of one springing):
//! - its bearing face is normal to the characteristic resultant R_k;
//! - bearing area A = R_k / q_allow, the allowable bearing pressure of the ground;
//! - across the bridge the face is the deck width B (one block ties the ribs), so along
//!   the resultant's plane L = A / B, lengthened by 2 e for a fixed rib's moment (the
//!   effective area of an eccentric load, EN 1997-1 Annex D.1 form, common practice), and
//!   never shorter than the rib's depth;
//! - its thickness along the resultant spreads each rib's load over its share of the face
//!   both ways (the spread of a partially loaded area, EN 1992-1-1 6.7(3): h >= b2 - b1):
//!   the larger of L - d (d the rib's depth) and B / ribs - w (w the rib's width), at
//!   least the design's least thickness;
//! - a fixed rib's moment is taken with the dead-load resultant (the smallest it may
//!   meet), e = M_k / R_dead;
//! - bearing only: sliding along the face, overturning and the rock's checks are not made.
//!
//! Concept-design values: the site's ground investigation, local codes and a licensed
//! engineer govern.

use crate::arch::traffic::{LineEnvelope, TrafficReport};
use crate::arch::validate::ValidDesign;
use crate::traffic::combination::Combination;
use serde::{Deserialize, Serialize};

/// The springing forces of one combination's extremes.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct AngleRange {
    /// Smallest angle of the resultant below the horizontal, degrees.
    pub min: f64,
    /// Largest, degrees.
    pub max: f64,
}

/// A thrust block.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ThrustBlock {
    /// Bearing area needed, m2.
    pub bearing_area: f64,
    /// Face width across the bridge, m.
    pub width: f64,
    /// Face length in the arch plane, m (with 2 e for an eccentric load).
    pub length: f64,
    /// Eccentricity of the resultant on the face, m (fixed rib: M_k / R_k).
    pub eccentricity: f64,
    /// Thickness along the resultant, m.
    pub thickness: f64,
    /// Volume, m3.
    pub volume: f64,
    /// Angle of the face's normal (the resultant) below the horizontal, degrees.
    pub face_angle: f64,
}

/// The demand at one springing, whole cross-section.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SpringingDemand {
    /// `left` or `right`.
    pub side: String,
    /// Dead-load thrust H, kN (outward positive).
    pub dead_thrust: f64,
    /// Dead-load vertical V, kN (downward positive).
    pub dead_vertical: f64,
    /// Characteristic largest thrust, kN.
    pub thrust: f64,
    /// Characteristic largest vertical force, kN.
    pub vertical: f64,
    /// Characteristic resultant sqrt(H^2 + V^2), kN.
    pub resultant: f64,
    /// Its angle below the horizontal, degrees.
    pub angle: f64,
    /// The dead-load resultant's angle, degrees.
    pub dead_angle: f64,
    /// Range of the angle over every combination, degrees.
    pub angle_range: AngleRange,
    /// Characteristic largest |M| of a fixed rib at the springing, kNm (`None` for a
    /// hinged springing).
    pub fixed_moment: Option<f64>,
    /// Largest design thrust over the ultimate combinations, kN.
    pub design_thrust: f64,
    /// The thrust block.
    pub block: ThrustBlock,
}

/// Foundation demand at both springings.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Foundations {
    /// The combination taken as characteristic.
    pub characteristic: String,
    /// Left and right.
    pub springings: Vec<SpringingDemand>,
    /// The allowable bearing pressure used, kN/m2.
    pub allowable_bearing: f64,
    /// The rules, in words.
    pub basis: String,
}

/// The serviceability combination (unfavourable permanent factor 1) with the largest
/// traffic factors: the characteristic one. `None` when the design has none.
pub fn characteristic_combination(combinations: &[Combination]) -> Option<&Combination> {
    combinations
        .iter()
        .filter(|c| (c.permanent_unfavourable - 1.0).abs() <= 1e-9)
        .max_by(|a, b| (a.uniform + a.vehicle).total_cmp(&(b.uniform + b.vehicle)))
}

fn range_of(line: Option<&LineEnvelope>, combination: &str) -> Option<(f64, f64)> {
    let l = line?;
    l.design.iter().find(|r| r.combination == combination).map(|r| (r.max, r.min))
}

/// The foundation demand of a design from its frame model's traffic report (see the
/// module doc), for a rib of (depth, width) `rib`, m (the sized rib's, or the typed one).
/// Without a serviceability combination the characteristic values are the permanent
/// effect plus the characteristic traffic alone (the basis says so).
pub fn foundations(valid: &ValidDesign, report: &TrafficReport, rib: (f64, f64)) -> Foundations {
    let design = valid.design();
    let sizing = &design.sizing.foundation;
    let characteristic = characteristic_combination(&design.traffic.combinations);
    let name = characteristic.map_or("permanent + characteristic traffic".to_string(), |c| c.name.clone());
    let ultimate: Vec<&str> = design
        .traffic
        .combinations
        .iter()
        .filter(|c| crate::arch::sizing::is_ultimate(c))
        .map(|c| c.name.as_str())
        .collect();
    let fixed = design.rib_system == crate::arch::design::RibSystem::Fixed;
    let (depth, rib_width) = rib;
    let ribs = design.deck.ribs.max(1) as f64;
    let springings =
        [("left", "thrust", "v-left", "m-left"), ("right", "thrust-right", "v-right", "m-right")]
            .into_iter()
            .map(|(side, h_line, v_line, m_line)| {
                let (h, v, m) = (report.line(h_line), report.line(v_line), report.line(m_line));
                let permanent = |l: Option<&LineEnvelope>| l.map_or(0.0, |l| l.permanent);
                // characteristic extremes: the combination's, or G + Q_k
                let extremes = |l: Option<&LineEnvelope>| match characteristic {
                    Some(c) => range_of(l, &c.name).unwrap_or((0.0, 0.0)),
                    None => l.map_or((0.0, 0.0), |l| {
                        (l.permanent + l.traffic_max.value, l.permanent + l.traffic_min.value)
                    }),
                };
                let (h_max, _) = extremes(h);
                let (v_max, _) = extremes(v);
                let (m_max, m_min) = extremes(m);
                let resultant = h_max.hypot(v_max);
                let angle = v_max.atan2(h_max).to_degrees();
                let (dead_h, dead_v) = (permanent(h), permanent(v));
                // the angle's range: every combination's corners of (H, V)
                let mut lo = f64::INFINITY;
                let mut hi = f64::NEG_INFINITY;
                for c in &design.traffic.combinations {
                    if let (Some((h1, h0)), Some((v1, v0))) = (range_of(h, &c.name), range_of(v, &c.name)) {
                        for (hh, vv) in [(h1, v1), (h1, v0), (h0, v1), (h0, v0)] {
                            let a = vv.atan2(hh).to_degrees();
                            lo = lo.min(a);
                            hi = hi.max(a);
                        }
                    }
                }
                let dead_angle = dead_v.atan2(dead_h).to_degrees();
                if !lo.is_finite() {
                    (lo, hi) = (dead_angle, dead_angle);
                }
                let fixed_moment = fixed.then(|| m_max.abs().max(m_min.abs()));
                let design_thrust =
                    ultimate.iter().filter_map(|c| range_of(h, c)).map(|(max, _)| max).fold(h_max, f64::max);
                let bearing_area = resultant / sizing.allowable_bearing;
                let width = design.deck.width;
                // the moment taken with the smallest resultant it may meet, the dead load's
                // (the envelope does not say which resultant goes with it): the larger e
                let dead_resultant = dead_h.hypot(dead_v);
                let eccentricity = match fixed_moment {
                    Some(m) if dead_resultant > 0.0 => m / dead_resultant,
                    _ => 0.0,
                };
                let length = (bearing_area / width + 2.0 * eccentricity).max(depth);
                // the spread from each rib to its share of the face, both ways (EN 1992-1-1
                // 6.7(3): h >= b2 - b1): along the arch L - d, across B / ribs - rib width
                let along = length - depth;
                let across = width / ribs - rib_width;
                let thickness = along.max(across).max(sizing.min_thickness);
                SpringingDemand {
                    side: side.into(),
                    dead_thrust: dead_h,
                    dead_vertical: dead_v,
                    thrust: h_max,
                    vertical: v_max,
                    resultant,
                    angle,
                    dead_angle,
                    angle_range: AngleRange { min: lo, max: hi },
                    fixed_moment,
                    design_thrust,
                    block: ThrustBlock {
                        bearing_area,
                        width,
                        length,
                        eccentricity,
                        thickness,
                        volume: width * length * thickness,
                        face_angle: angle,
                    },
                }
            })
            .collect();
    Foundations {
        characteristic: name.clone(),
        springings,
        allowable_bearing: sizing.allowable_bearing,
        basis: format!(
            "Whole cross-section, frame model. Characteristic values: the combination '{name}'; largest H and \
             largest V taken together (conservative). Thrust block: bearing area R_k / q_allow on a face normal \
             to the resultant, the deck width across, the length in the arch plane A / B + 2 e (e = M_k / R_dead \
             of a fixed rib, with the dead-load resultant; effective area after EN 1997-1 Annex D.1) and at least \
             the rib depth; thickness along the resultant the larger of L - d and B / ribs - rib width (the \
             spread of a partially loaded area both ways, EN 1992-1-1 6.7(3)), at least {:.2} m. Bearing only: \
             sliding along the face, overturning and the rock's own checks are not made. The site's ground \
             investigation, local codes and a licensed engineer govern.",
            sizing.min_thickness
        ),
    }
}
