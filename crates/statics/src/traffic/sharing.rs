//! Sharing traffic across the deck: what the whole cross-section carries, and what one
//! rib line carries by the lever rule.
//!
//! The plane models of a design carry every rib line together. Thrust, springing
//! reactions and foundations take the traffic of the **whole cross-section**; member
//! forces and sizing are **per rib line**: the permanent load divided by the number of
//! ribs plus the traffic times that rib's worst share.
//!
//! A rib's share follows the **lever rule**: the deck spans simply between neighbouring
//! ribs and cantilevers beyond the outer ones, so a load at y across the deck reaches rib
//! i with the factor r_i(y): 1 at rib i, falling linearly to 0 at its neighbours, rising
//! beyond an outer rib on its cantilever (and negative on the far cantilever of the
//! neighbour). AASHTO LRFD 4.6.2.2 names the method; any bridge text (e.g. Hambly,
//! Bridge Deck Behaviour, ch. 1) derives it. It ignores the deck's transverse stiffness
//! and torsion, so it overstates the share of the most loaded rib: conservative for a
//! concept.
//!
//! Lanes stand anywhere in the carriageway without overlapping (EN 1991-2 4.2.4: placed
//! for the most adverse effect); a lane's uniform load counts where r > 0, its vehicle
//! (wheels at +-gauge/2 of the lane centre, moved sideways where the model allows) where
//! the wheels' mean r is > 0. The search is exact on a grid of lane positions of at most
//! 5 cm that fits the lanes' width (dynamic programming over the lanes, the grid run from
//! either kerb); lanes that cannot fit the grid at all are each counted at their best
//! place, an upper bound. The
//! uniform loads and the vehicles are placed each at their own worst (an upper bound of
//! any single arrangement: conservative by a little), and with multiple presence factors
//! each number of loaded lanes is tried for each.
//!
//! Units: kN/m for line loads along the deck, kN per axle.

use crate::error::counted;
use crate::frame::envelope::{AxleGroup, Traffic};
use crate::traffic::models::{Applies, Lane, LaneLayout};
use crate::units::{Quantity, Units};
use serde::{Deserialize, Serialize};

/// Grid of lane positions across the carriageway, m (the largest step; `best` takes the
/// one that fits the lanes' width).
const GRID: f64 = 0.05;

/// One traffic arrangement along a line: the uniform load and the vehicle together.
#[derive(Debug, Clone, PartialEq)]
pub struct Alternative {
    /// Name (the vehicle's, or `uniform` when there is none).
    pub name: String,
    /// Where it counts.
    pub applies: Applies,
    /// The uniform line load (kN/m) and axle group (kN per axle) on the line.
    pub traffic: Traffic,
}

/// The traffic one line of the plane model receives.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LineTraffic {
    /// Uniform load the lanes add to the remaining area's, kN/m (before a vehicle's
    /// uniform factor; the lanes' own load where the remaining area carries none).
    pub lanes_uniform: f64,
    /// Uniform load from the remaining area and the footways, kN/m.
    pub other_uniform: f64,
    /// Multiplier on a lane vehicle's axle loads: the sum over lanes of the vehicle
    /// weight times its share (times the multiple presence factor).
    pub vehicle_weight: f64,
}

impl LineTraffic {
    /// The line's total uniform load, kN/m.
    pub fn uniform(&self) -> f64 {
        self.lanes_uniform + self.other_uniform
    }

    /// Every arrangement the line must be checked for (one per vehicle of the layout;
    /// one of uniform load only when the layout has no vehicle).
    pub fn alternatives(&self, layout: &LaneLayout) -> Vec<Alternative> {
        if layout.vehicles.is_empty() || self.vehicle_weight <= 0.0 {
            return vec![Alternative {
                name: "uniform".into(),
                applies: Applies::Everywhere,
                traffic: Traffic { uniform: self.uniform(), axles: None },
            }];
        }
        layout
            .vehicles
            .iter()
            .map(|v| Alternative {
                name: v.name.clone(),
                applies: v.applies,
                traffic: Traffic {
                    uniform: self.lanes_uniform * v.uniform_factor + self.other_uniform,
                    axles: Some(AxleGroup {
                        loads: v.axles.loads.iter().map(|q| q * self.vehicle_weight).collect(),
                        ..v.axles.clone()
                    }),
                },
            })
            .collect()
    }
}

/// The share of one rib line.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RibShare {
    /// Position of the rib across the deck, m from the deck centreline.
    pub position: f64,
    /// The traffic of this rib line at its worst.
    pub traffic: LineTraffic,
    /// Its uniform load as a fraction of the whole cross-section's.
    pub uniform_fraction: f64,
    /// Its vehicle weight as a fraction of the whole cross-section's.
    pub vehicle_fraction: f64,
}

/// How traffic is shared across the deck.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Sharing {
    /// The whole cross-section's traffic (every lane loaded at full share).
    pub whole: LineTraffic,
    /// Each rib line's worst share, left to right.
    pub ribs: Vec<RibShare>,
    /// Index of the rib with the largest share (uniform and vehicle fractions added).
    pub governing_rib: usize,
    /// The rule, in words, for every report that shows a result.
    pub rule: String,
}

/// Where ribs stand across a deck `deck_width` m wide: `given` when it is not empty,
/// otherwise `ribs` ribs evenly spaced (the centres of `ribs` equal strips of the deck:
/// +-w/4 for two ribs). m from the deck centreline, left to right.
pub fn rib_positions(deck_width: f64, ribs: usize, given: &[f64]) -> Vec<f64> {
    if !given.is_empty() {
        return given.to_vec();
    }
    let n = ribs.max(1) as f64;
    (0..ribs.max(1)).map(|i| -deck_width / 2.0 + (i as f64 + 0.5) * deck_width / n).collect()
}

/// The lever-rule factor r_i(y) of rib `i` of ribs at `positions` (m, increasing) for a
/// unit load at y (m): see the module doc. One rib takes everything (r = 1).
pub fn lever(positions: &[f64], i: usize, y: f64) -> f64 {
    let n = positions.len();
    if n <= 1 {
        return 1.0;
    }
    // the span (or cantilever, extended from the outer span) the load stands on
    let k = match positions.iter().position(|&p| y < p) {
        Some(0) => 0,
        Some(k) => k - 1,
        None => n - 2,
    };
    // k + 1 < n: the segment's two ribs exist
    let Some(&[a, b]) = positions.get(k..k + 2) else { return 0.0 };
    let t = (y - a) / (b - a);
    if i == k {
        1.0 - t
    } else if i == k + 1 {
        t
    } else {
        0.0
    }
}

/// A transverse influence function: the whole cross-section (1 everywhere) or one rib.
#[derive(Clone, Copy)]
enum Across<'a> {
    Whole,
    Rib(&'a [f64], usize),
}

impl Across<'_> {
    fn at(&self, y: f64) -> f64 {
        match self {
            Across::Whole => 1.0,
            Across::Rib(p, i) => lever(p, *i, y),
        }
    }

    /// Integral of max(r, 0) from a to b (exact: r is linear between rib positions).
    fn positive_integral(&self, a: f64, b: f64) -> f64 {
        if b <= a {
            return 0.0;
        }
        let mut cuts = vec![a];
        if let Across::Rib(p, _) = self {
            cuts.extend(p.iter().copied().filter(|&y| y > a && y < b));
        }
        cuts.push(b);
        cuts.iter()
            .zip(cuts.iter().skip(1))
            .map(|(&ya, &yb)| {
                let (ra, rb) = (self.at(ya), self.at(yb));
                let len = yb - ya;
                if ra >= 0.0 && rb >= 0.0 {
                    (ra + rb) / 2.0 * len
                } else if ra <= 0.0 && rb <= 0.0 {
                    0.0
                } else {
                    // the positive triangle of a piece that crosses zero
                    let pos = ra.max(rb);
                    let frac = pos / (ra.abs() + rb.abs());
                    pos * frac * len / 2.0
                }
            })
            .sum()
    }
}

/// The largest `f(u)` for a sideways move u in [-reach, reach] of something centred at
/// `centre` whose edges (or wheels) stand at `edges` from its centre: tried at both ends,
/// the middle, every move that puts an edge on a rib (a kink of the lever function) and
/// eight even steps between.
fn sideways(centre: f64, reach: f64, edges: &[f64], across: &Across, f: impl Fn(f64) -> f64) -> f64 {
    if reach <= 0.0 {
        return f(0.0);
    }
    let mut tries: Vec<f64> = (0..=8).map(|k| -reach + reach * k as f64 / 4.0).collect();
    if let Across::Rib(ribs, _) = across {
        for rib in ribs.iter() {
            for edge in edges {
                let u = rib - centre - edge;
                if u.abs() <= reach {
                    tries.push(u);
                }
            }
        }
    }
    tries.into_iter().map(f).fold(f64::NEG_INFINITY, f64::max)
}

/// Geometry across the deck, m from the deck centreline.
#[derive(Debug, Clone, Copy)]
struct Strip {
    deck_half: f64,
    carriageway_half: f64,
}

/// What lanes a search places: per kind of lane, the lane and how many.
fn lane_groups(lanes: &[Lane]) -> Vec<(Lane, usize)> {
    let mut groups: Vec<(Lane, usize)> = Vec::new();
    for lane in lanes {
        match groups.iter_mut().find(|(l, _)| l == lane) {
            Some((_, n)) => *n += 1,
            None => groups.push((lane.clone(), 1)),
        }
    }
    groups
}

/// Which part of the traffic a search maximises.
#[derive(Clone, Copy, PartialEq)]
enum Part {
    /// Uniform loads: the lanes' and the remaining area's (footways added outside).
    Uniform,
    /// Vehicle weights.
    Vehicle,
}

/// The largest `part` over lane placements of `groups` in the carriageway, for `across`:
/// (value from the lanes, value from the remaining area). Dynamic programming over grid
/// cells left to right, the state being how many lanes of each group are placed.
fn best(
    groups: &[(Lane, usize)],
    strip: Strip,
    across: Across,
    remaining: f64,
    gauge: f64,
    part: Part,
) -> (f64, f64) {
    let c0 = -strip.carriageway_half;
    let width = 2.0 * strip.carriageway_half;
    // a grid step that fits the lanes' width a whole number of times (every lane of a
    // layout is as wide as the first), so lanes that fill the carriageway fit it exactly
    let grid =
        groups
            .first()
            .map_or(GRID, |(l, _)| if l.width > 0.0 { l.width / (l.width / GRID).ceil() } else { GRID });
    let cells = (width / grid + 1e-9).floor() as usize;
    let rest = |a: f64, b: f64| {
        if part == Part::Uniform {
            remaining * across.positive_integral(a, b)
        } else {
            0.0
        }
    };
    let rest_all = rest(c0, c0 + width);
    if groups.is_empty() {
        return (0.0, rest_all);
    }
    // lane value and lost remaining area when a lane of group g starts at cell i
    let lane_cells: Vec<usize> =
        groups.iter().map(|(l, _)| ((l.width / grid) - 1e-6).ceil() as usize).collect();
    let value = |lane: &Lane, a: f64| -> (f64, f64) {
        let centre = a + lane.width / 2.0;
        let lane_part = match part {
            Part::Uniform => {
                let reach = ((lane.width - lane.uniform_width) / 2.0).max(0.0);
                let half = lane.uniform_width / 2.0;
                sideways(centre, reach, &[-half, half], &across, |u| {
                    across.positive_integral(centre + u - half, centre + u + half)
                }) * lane.uniform
            }
            Part::Vehicle => {
                let g = gauge / 2.0;
                let r = sideways(centre, lane.shift, &[-g, g], &across, |u| {
                    (across.at(centre + u - g) + across.at(centre + u + g)) / 2.0
                });
                lane.vehicle_weight * r.max(0.0)
            }
        };
        (lane_part, rest(a, a + lane.width))
    };
    // mixed-radix state: counts of placed lanes per group
    let radix: Vec<usize> = groups.iter().map(|(_, n)| n + 1).collect();
    let states: usize = radix.iter().product();
    let full = states - 1;
    let step = |s: usize, g: usize| -> Option<usize> {
        let mut place = 1;
        for r in radix.iter().take(g) {
            place *= r;
        }
        let size = *radix.get(g)?;
        let count = (s / place) % size;
        (count + 1 < size).then_some(s + place)
    };
    const NONE: f64 = f64::NEG_INFINITY;
    // the best net gain of lanes starting on the grid start + i grid
    let solve = |start: f64| -> f64 {
        // each lane's net gain at each cell, once (the state loop reuses it)
        let gains: Vec<Vec<f64>> = groups
            .iter()
            .map(|(lane, _)| {
                (0..cells)
                    .map(|i| {
                        let (lane_part, lost) = value(lane, start + i as f64 * grid);
                        lane_part - lost
                    })
                    .collect()
            })
            .collect();
        // f[i][s]: best (lane value - lost remaining) from cell i on, with state s so far
        // (NONE: no way to place every lane from there)
        let mut f = vec![vec![NONE; states]; cells + 1];
        let at =
            |f: &[Vec<f64>], i: usize, s: usize| f.get(i).and_then(|row| row.get(s)).copied().unwrap_or(NONE);
        if let Some(last) = f.get_mut(cells).and_then(|row| row.get_mut(full)) {
            *last = 0.0;
        }
        for i in (0..cells).rev() {
            let row: Vec<f64> = (0..states)
                .map(|s| {
                    let mut v = at(&f, i + 1, s);
                    for (g, (&lane_len, lane_gains)) in lane_cells.iter().zip(&gains).enumerate() {
                        let end = i + lane_len;
                        if end > cells {
                            continue;
                        }
                        if let (Some(next), Some(&gain)) = (step(s, g), lane_gains.get(i)) {
                            let tail = at(&f, end, next);
                            if tail > NONE {
                                v = v.max(gain + tail);
                            }
                        }
                    }
                    v
                })
                .collect();
            if let Some(slot) = f.get_mut(i) {
                *slot = row;
            }
        }
        at(&f, 0, 0)
    };
    // the grid from the left kerb, and shifted to end at the right kerb (the width need
    // not be a whole number of cells), so a mirrored deck gets mirrored shares
    let leftover = (width - cells as f64 * grid).max(0.0);
    let gain = solve(c0).max(if leftover > 1e-9 { solve(c0 + leftover) } else { NONE });
    if gain == NONE {
        // the lanes do not fit the grid (a carriageway a hair narrower than its lanes):
        // count every lane at its best anywhere, an upper bound
        let lanes_only: f64 = groups
            .iter()
            .map(|(lane, n)| {
                let best_one =
                    (0..=cells).map(|i| value(lane, c0 + i as f64 * grid).0).fold(0.0_f64, f64::max);
                best_one * *n as f64
            })
            .sum();
        return (lanes_only, rest_all);
    }
    // the lanes' net gain over the remaining area, and the remaining area as if unlaned
    (gain, rest_all)
}

/// The traffic of one line (`across`) of a layout at its worst.
fn line_traffic(layout: &LaneLayout, strip: Strip, across: Across) -> LineTraffic {
    let footway = layout.footway
        * (across.positive_integral(-strip.deck_half, -strip.carriageway_half)
            + across.positive_integral(strip.carriageway_half, strip.deck_half));
    let all = lane_groups(&layout.lanes);
    if layout.multiple_presence.is_empty() {
        let (lanes_u, rest) = best(&all, strip, across, layout.remaining, layout.wheel_gauge, Part::Uniform);
        let (lanes_v, _) = best(&all, strip, across, 0.0, layout.wheel_gauge, Part::Vehicle);
        return LineTraffic {
            lanes_uniform: lanes_u,
            other_uniform: rest + footway,
            vehicle_weight: lanes_v,
        };
    }
    // multiple presence: try every number of loaded lanes (identical lanes)
    let (mut lanes_u, mut lanes_v, mut rest) = (0.0_f64, 0.0_f64, 0.0_f64);
    let lane_count = layout.lanes.len();
    for k in 1..=lane_count {
        let m =
            layout.multiple_presence.get(k - 1).or(layout.multiple_presence.last()).copied().unwrap_or(1.0);
        let Some(first_lanes) = layout.lanes.get(..k) else { continue };
        let loaded = lane_groups(first_lanes);
        let (u, r) = best(&loaded, strip, across, layout.remaining, layout.wheel_gauge, Part::Uniform);
        let (v, _) = best(&loaded, strip, across, 0.0, layout.wheel_gauge, Part::Vehicle);
        lanes_u = lanes_u.max(m * u);
        lanes_v = lanes_v.max(m * v);
        rest = r;
    }
    LineTraffic { lanes_uniform: lanes_u, other_uniform: rest + footway, vehicle_weight: lanes_v }
}

/// How the traffic of `layout` is shared on a deck `deck_width` m wide with a centred
/// carriageway `carriageway_width` m wide and ribs at `positions` (m from the deck
/// centreline, increasing; see [`rib_positions`]).
///
/// The whole cross-section takes every lane (the lever function is 1 everywhere); each
/// rib its worst lever-rule share (module doc). Degenerate: one rib takes everything; a
/// carriageway of zero width has no lanes (footways only).
pub fn share(layout: &LaneLayout, deck_width: f64, carriageway_width: f64, positions: &[f64]) -> Sharing {
    let strip =
        Strip { deck_half: deck_width / 2.0, carriageway_half: carriageway_width.min(deck_width) / 2.0 };
    let whole = line_traffic(layout, strip, Across::Whole);
    let fraction = |part: f64, all: f64| if all > 0.0 { part / all } else { 0.0 };
    let ribs: Vec<RibShare> = positions
        .iter()
        .enumerate()
        .map(|(i, &position)| {
            let traffic = line_traffic(layout, strip, Across::Rib(positions, i));
            RibShare {
                position,
                uniform_fraction: fraction(traffic.uniform(), whole.uniform()),
                vehicle_fraction: fraction(traffic.vehicle_weight, whole.vehicle_weight),
                traffic,
            }
        })
        .collect();
    let governing_rib = ribs
        .iter()
        .enumerate()
        .max_by(|a, b| {
            (a.1.uniform_fraction + a.1.vehicle_fraction)
                .total_cmp(&(b.1.uniform_fraction + b.1.vehicle_fraction))
        })
        .map_or(0, |(i, _)| i);
    let mut sharing = Sharing { whole, ribs, governing_rib, rule: String::new() };
    sharing.rule = sharing.describe(Units::Si);
    sharing
}

impl Sharing {
    /// The sharing rule in words, the governing rib's position in `units`.
    pub fn describe(&self, units: Units) -> String {
        let rib = self.ribs.get(self.governing_rib);
        format!(
            "thrust, springing reactions and foundations for the whole cross-section; member forces per rib line = \
             permanent / {} + traffic × the rib's worst lever-rule share (largest: rib {} at {}, {:.0}% of the \
             uniform load, {:.0}% of the vehicles)",
            counted(self.ribs.len(), "rib", "ribs"),
            self.governing_rib + 1,
            units.show(Quantity::Length, rib.map_or(0.0, |r| r.position)),
            rib.map_or(100.0, |r| r.uniform_fraction * 100.0),
            rib.map_or(100.0, |r| r.vehicle_fraction * 100.0),
        )
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::traffic::models::{LoadModel, ModelFamily};

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol * (1.0 + b.abs())
    }

    #[test]
    fn lever_rule_of_two_ribs() {
        // ribs at -3 and +3: a load at -3 is all on rib 0, at 0 half each, at -4.5 (a
        // 1.5 m cantilever) 1.25 on rib 0 and -0.25 on rib 1 (statics of the lever)
        let p = [-3.0, 3.0];
        assert_eq!(lever(&p, 0, -3.0), 1.0);
        assert!(close(lever(&p, 0, 0.0), 0.5, 1e-12));
        assert!(close(lever(&p, 0, -4.5), 1.25, 1e-12));
        assert!(close(lever(&p, 1, -4.5), -0.25, 1e-12));
        // three ribs: the outer span 0..4 with its 1 m cantilever carries a load at 5:
        // 1.25 on the outer rib, -0.25 on the middle one, nothing on the far one
        let p = [-4.0, 0.0, 4.0];
        assert!(close(lever(&p, 1, 5.0), -0.25, 1e-12));
        assert_eq!(lever(&p, 0, 5.0), 0.0);
        assert!(close(lever(&p, 1, 2.0), 0.5, 1e-12));
        assert!(close(lever(&p, 2, 5.0), 1.25, 1e-12));
    }

    #[test]
    fn evenly_spaced_ribs() {
        assert_eq!(rib_positions(11.0, 2, &[]), vec![-2.75, 2.75]);
        assert_eq!(rib_positions(12.0, 3, &[]), vec![-4.0, 0.0, 4.0]);
        assert_eq!(rib_positions(12.0, 2, &[-5.0, 5.0]), vec![-5.0, 5.0]);
    }

    #[test]
    fn whole_cross_section_of_lm1_by_hand() {
        // EN 1991-2 Tables 4.1 and 4.2 on a 7.5 m carriageway of an 11 m deck:
        // 2 lanes of 3 m, remaining 1.5 m, footways 2 x 1.75 m at 3 kN/m2 (Table 4.4a):
        // lanes 9 x 3 + 2.5 x 3 = 34.5 kN/m; remaining 2.5 x 1.5 = 3.75; footways 3 x 3.5 = 10.5;
        // tandem axles 300 + 200 = 500 kN per axle line.
        let layout = LoadModel::preset(ModelFamily::EnLm1).lane_layout(7.5, 80.0);
        let s = share(&layout, 11.0, 7.5, &rib_positions(11.0, 2, &[]));
        assert!(close(s.whole.uniform(), 34.5 + 3.75 + 10.5, 1e-9), "{:?}", s.whole);
        // the lanes add (9 - 2.5) x 3 = 19.5 kN/m over the remaining-area load 2.5 x 7.5
        assert!(close(s.whole.lanes_uniform, 19.5, 1e-9), "{:?}", s.whole);
        assert!(close(s.whole.vehicle_weight, 500.0, 1e-9));
    }

    #[test]
    fn a_mirrored_deck_gets_mirrored_shares() {
        // 7.52 m is no whole number of 5 cm cells: the grid runs from either kerb
        for family in [ModelFamily::EnLm1, ModelFamily::Hl93] {
            let layout = LoadModel::preset(family).lane_layout(7.52, 80.0);
            let s = share(&layout, 11.0, 7.52, &[-3.1, 2.6]);
            let m = share(&layout, 11.0, 7.52, &[-2.6, 3.1]);
            for (a, b) in [(&s.ribs[0], &m.ribs[1]), (&s.ribs[1], &m.ribs[0])] {
                assert!(close(a.traffic.uniform(), b.traffic.uniform(), 1e-12), "{family:?}");
                assert!(close(a.traffic.vehicle_weight, b.traffic.vehicle_weight, 1e-12), "{family:?}");
            }
        }
    }

    #[test]
    fn the_users_uniform_load_covers_the_vehicles_lane_too() {
        // 4 kN/m2 over a 7.5 m carriageway = 30 kN/m, whatever lane the vehicle keeps to
        let layout = LoadModel::preset(ModelFamily::UserDefined).lane_layout(7.5, 80.0);
        let s = share(&layout, 7.5, 7.5, &[0.0]);
        assert!(close(s.whole.uniform(), 30.0, 1e-12), "{:?}", s.whole);
        assert!(close(s.whole.vehicle_weight, 1.0, 1e-12));
    }

    #[test]
    fn one_rib_takes_everything() {
        let layout = LoadModel::preset(ModelFamily::EnLm1).lane_layout(7.5, 80.0);
        let s = share(&layout, 11.0, 7.5, &[0.0]);
        assert!(close(s.ribs[0].traffic.uniform(), s.whole.uniform(), 1e-12));
        assert!(close(s.ribs[0].vehicle_fraction, 1.0, 1e-12));
    }

    #[test]
    fn lm1_share_of_a_rib_by_hand() {
        // ribs at +-2.75 m, carriageway +-3.75 m, deck +-5.5 m. The worst vehicle share of
        // the left rib: lane 1 hard against the left kerb (centre -2.25, wheels at -3.25
        // and -1.25): r = (1 + (2.75-3.25... ) by the lever rule r(y) = (2.75 - y) / 5.5,
        // so r(-3.25) = 6/5.5 and r(-1.25) = 4/5.5, mean 5/5.5 = 0.9091; lane 2 next to it
        // (centre 0.75, wheels -0.25 and 1.75): r = (3/5.5 + 1/5.5)/2 = 0.3636.
        // 300 x 0.9091 + 200 x 0.3636 = 345.45 kN per axle line. (Placing lane 1 further
        // left is impossible; moving lane 2 right lowers it; swapping lowers it.)
        let layout = LoadModel::preset(ModelFamily::EnLm1).lane_layout(7.5, 80.0);
        let s = share(&layout, 11.0, 7.5, &rib_positions(11.0, 2, &[]));
        let expected = 300.0 * 5.0 / 5.5 + 200.0 * 2.0 / 5.5;
        assert!(
            close(s.ribs[0].traffic.vehicle_weight, expected, 1e-9),
            "{} vs {expected}",
            s.ribs[0].traffic.vehicle_weight
        );
        // symmetric deck: both ribs alike
        assert!(close(s.ribs[1].traffic.vehicle_weight, expected, 1e-9));
        // uniform: lane 1 on [-3.75, -0.75]: 9 x integral of (2.75 - y)/5.5 = 9 x 3 x r(-2.25) = 27 x 5/5.5;
        // lane 2 on [-0.75, 2.25]: 2.5 x 3 x r(0.75) = 7.5 x 2/5.5; remaining area [2.25, 3.75]
        // where r > 0, up to the rib at 2.75: 2.5 x (0.5 x 0.5 x 0.5/5.5) = 2.5 x 0.125/5.5
        // (lane 2 and the remaining area carry the same 2.5 kN/m2, so their order does not
        // matter; lane 1 against the kerb is the worst): 24.545 + 2.727 + 0.057 = 27.33 kN/m;
        // footways: left [-5.5, -3.75]: 3 x 1.75 x r(-4.625) = 5.25 x 7.375/5.5 = 7.040;
        // right [3.75, 5.5]: r < 0, nothing. Total 34.31 kN/m.
        let lanes = 27.0 * 5.0 / 5.5 + 7.5 * 2.0 / 5.5 + 2.5 * 0.125 / 5.5;
        let footway = 5.25 * 7.375 / 5.5;
        let u = &s.ribs[0].traffic;
        assert!(close(u.uniform(), lanes + footway, 1e-6), "{u:?} vs {}", lanes + footway);
    }

    #[test]
    fn hl93_multiple_presence_picks_the_worst_count() {
        // one rib: the whole load. 2 lanes of 3.6 m in 7.5 m: m = 1.2 for one lane, 1.0
        // for two (Table 3.6.1.1.2-1): two lanes give 2 x 1.33 = 2.66 > 1.2 x 1.33 = 1.596
        let layout = LoadModel::preset(ModelFamily::Hl93).lane_layout(7.5, 80.0);
        let s = share(&layout, 7.5, 7.5, &[0.0]);
        assert!(close(s.whole.vehicle_weight, 2.66, 1e-9), "{:?}", s.whole);
        assert!(close(s.whole.lanes_uniform, 2.0 * 9.3, 1e-9));
        // ribs at +-3 m, r(y) = (3 - y) / 6 for the left one. The truck may move 0.3 m
        // sideways in its 3.6 m lane (wheels 0.6 m from the lane's edge, 3.6.1.3.1). One
        // lane against the left kerb, truck moved left (centre -2.25, wheels -3.15 and
        // -1.35): mean r = (6.15 + 4.35) / 12 = 0.875, x 1.2 x 1.33 = 1.3965. Two lanes, the
        // second beside it, its truck moved left too (wheels 0.45 and 2.25): mean r =
        // (2.55 + 0.75) / 12 = 0.275; (0.875 + 0.275) x 1.0 x 1.33 = 1.5295 governs.
        // The 3 m lane loads likewise: 9.3 x (0.875 + 0.275) = 10.695 kN/m.
        let s = share(&layout, 7.5, 7.5, &[-3.0, 3.0]);
        assert!(close(s.ribs[0].traffic.vehicle_weight, 1.15 * 1.33, 1e-9), "{:?}", s.ribs[0]);
        assert!(close(s.ribs[0].traffic.lanes_uniform, 9.3 * 1.15, 1e-9), "{:?}", s.ribs[0]);
    }
}
