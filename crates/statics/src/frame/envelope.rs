//! Envelopes of an influence line under a traffic action: a uniform line load where the
//! line is adverse and an axle group at its worst position.
//!
//! A pure function of one influence line (positions x, ordinates eta, linear between
//! positions, zero off the line: a load off the deck carries nothing). It knows nothing
//! of the model that gave the line.
//!
//! - Uniform load q (kN/m, downward positive like the unit load of the line): for the
//!   maximum it is placed on every part where eta > 0, for the minimum on every part
//!   where eta < 0; the effect is q times the integral of eta over those parts, exact for
//!   a piecewise-linear line (each segment split where it crosses zero).
//! - Axle group: the effect of loads P_j at positions x_j is sum P_j eta(x_j). For a
//!   piecewise-linear line it is piecewise linear in the group's position, so its
//!   extremes lie where some axle stands on a vertex of the line, or just beyond an end
//!   of it where the end ordinate drops to zero (Müller-Breslau and
//!   the usual "move the train until an axle sits on a peak" rule; Hibbeler, Structural
//!   Analysis, ch. 6, series of concentrated loads). Every such placement is tried, in
//!   both directions of travel. With one variable spacing (e.g. a truck's rear axle
//!   spacing, or the gap between two trucks) the axles ahead of the gap give F(u) and
//!   those behind it R(w), w within the spacing's window behind u; for each candidate u
//!   (an axle ahead of the gap on a vertex, or a window end on a vertex of R) the best R
//!   in the window is taken from R at the window's ends and a range maximum / minimum of
//!   R over its vertices inside (a sparse table), which is exact because between
//!   candidates F is linear and the best R convex (concave). About n log n per line
//!   instead of the n^2 of trying every pair of vertices.
//!
//! - A group that neglects relieving axles (AASHTO LRFD 3.6.1.3.1) counts, for the max,
//!   only the axles whose effect is positive and, for the min, only those whose effect is
//!   negative; the effect is then piecewise linear with kinks where an axle crosses a zero
//!   of the line as well, so those points are stops too.
//!
//! The uniform load and the axle group act together (both at their own worst), so the
//! extreme effect is the sum of the two extremes. Neither ever reduces an extreme: with
//! no adverse part the uniform load is left off (0), and the axle group may stay off the
//! line (0), which is then reported as no placement.
//!
//! Units follow the line: an ordinate in kN per kN (or kNm per kN) times kN (or kN/m
//! times m) gives kN (or kNm).

use crate::error::{Location, Problem, StaticsError};
use serde::{Deserialize, Serialize};

/// One variable spacing of an axle group, searched between its bounds.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct VariableSpacing {
    /// Which spacing of [`AxleGroup::spacings`] varies (0: between the first and second axle).
    pub index: usize,
    /// Shortest spacing, m.
    pub min: f64,
    /// Longest spacing, m (>= `min`).
    pub max: f64,
}

/// A group of axles that moves as one.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct AxleGroup {
    /// Axle loads, kN (downward positive), from the first (leading) axle to the last.
    pub loads: Vec<f64>,
    /// Spacings between consecutive axles, m (one fewer than `loads`); the entry of a
    /// variable spacing is ignored, its bounds are used.
    pub spacings: Vec<f64>,
    /// A spacing searched over a range, if any.
    pub variable: Option<VariableSpacing>,
    /// Axles that would relieve an extreme are left off it (AASHTO LRFD 3.6.1.3.1: "axles
    /// that do not contribute to the extreme force effect under consideration shall be
    /// neglected"); false: the group acts whole (an EN 1991-2 tandem).
    pub neglect_relieving: bool,
}

/// A traffic action: a uniform line load and an optional axle group, applied together.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Traffic {
    /// Uniform line load, kN/m (downward positive, >= 0).
    pub uniform: f64,
    /// An axle group, if any.
    pub axles: Option<AxleGroup>,
}

/// Direction of travel of the axle group along the line.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Travel {
    /// Towards larger x: the first axle is the rightmost, the others follow to its left.
    Rightward,
    /// Towards smaller x: the first axle is the leftmost, the others follow to its right.
    Leftward,
}

/// Where the axle group stands for an extreme.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct AxlePlacement {
    /// x of the first (leading) axle, m.
    pub first_axle: f64,
    /// Direction of travel.
    pub travel: Travel,
    /// The variable spacing used, m (`None` without a variable spacing).
    pub spacing: Option<f64>,
}

/// One extreme effect of the traffic and what produces it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Extreme {
    /// The total effect: `uniform_part + axle_part` (kN or kNm as the line's units).
    pub value: f64,
    /// The uniform load's part.
    pub uniform_part: f64,
    /// The axle group's part.
    pub axle_part: f64,
    /// The loaded intervals (from, to) of the uniform load, m, left to right (empty when
    /// no uniform load or no adverse part).
    pub loaded: Vec<(f64, f64)>,
    /// The axle group's placement (`None`: no axle group, or none helps: it stays off).
    pub axles: Option<AxlePlacement>,
}

/// The largest and smallest effect of a traffic action on one influence line.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Envelope {
    /// Largest effect (>= 0).
    pub max: Extreme,
    /// Smallest effect (<= 0).
    pub min: Extreme,
}

fn refuse(message: String) -> StaticsError {
    StaticsError::Invalid(vec![Problem::new(Location::Part("envelope".into()), message)])
}

/// The envelope (max and min effect with their placements) of `traffic` on the influence
/// line with ordinates `eta` at positions `x` (m, strictly increasing), linear between
/// positions and zero outside `[x[0], x[last]]`. See the module doc for the placement
/// rules and units; signs are the line's (a positive effect is the quantity's positive
/// sense).
///
/// Degenerate cases: an empty line (no positions) gives zero max and min with no
/// placement; a single position is a point where axles count and the uniform load does
/// not; an axle group longer than the line is placed with the axles off the line
/// carrying nothing; a line with no positive (negative) part has max (min) zero.
///
/// Errors: `Invalid` when `x` and `eta` differ in length, a value is not finite,
/// positions do not increase strictly, the uniform load is negative, the spacings are
/// not one fewer than the loads, a spacing or bound is negative, or the variable
/// spacing's index or bounds are out of order.
pub fn envelope(x: &[f64], eta: &[f64], traffic: &Traffic) -> Result<Envelope, StaticsError> {
    check(x, eta, traffic)?;
    let (uniform_max, loaded_max) = uniform_part(x, eta, traffic.uniform, 1.0);
    let (uniform_min, loaded_min) = uniform_part(x, eta, traffic.uniform, -1.0);
    let (mut axle_max, mut axle_min) = ((0.0, None), (0.0, None));
    if let Some(group) = &traffic.axles {
        if !x.is_empty() {
            search_axles(x, eta, group, &mut |value, placement| {
                if value > axle_max.0 {
                    axle_max = (value, Some(placement));
                }
                if value < axle_min.0 {
                    axle_min = (value, Some(placement));
                }
            });
        }
    }
    let extreme = |u: f64, loaded: Vec<(f64, f64)>, a: (f64, Option<AxlePlacement>)| Extreme {
        value: u + a.0,
        uniform_part: u,
        axle_part: a.0,
        loaded,
        axles: a.1,
    };
    Ok(Envelope {
        max: extreme(uniform_max, loaded_max, axle_max),
        min: extreme(uniform_min, loaded_min, axle_min),
    })
}

fn check(x: &[f64], eta: &[f64], traffic: &Traffic) -> Result<(), StaticsError> {
    if x.len() != eta.len() {
        return Err(refuse(format!("{} positions but {} ordinates", x.len(), eta.len())));
    }
    if x.iter().chain(eta).any(|v| !v.is_finite()) {
        return Err(refuse("the influence line has a value that is not a number".into()));
    }
    if x.windows(2).any(|w| w[1] <= w[0]) {
        return Err(refuse("positions must increase strictly from left to right".into()));
    }
    if !(traffic.uniform.is_finite() && traffic.uniform >= 0.0) {
        return Err(refuse(format!("uniform load {} kN/m must be zero or more", traffic.uniform)));
    }
    if let Some(g) = &traffic.axles {
        if g.loads.is_empty() || g.spacings.len() + 1 != g.loads.len() {
            return Err(refuse(format!(
                "an axle group of {} axles needs {} spacings, not {}",
                g.loads.len(),
                g.loads.len().saturating_sub(1),
                g.spacings.len()
            )));
        }
        if g.loads.iter().any(|p| !p.is_finite()) {
            return Err(refuse("an axle load is not a number".into()));
        }
        if g.spacings.iter().any(|s| !(s.is_finite() && *s >= 0.0)) {
            return Err(refuse("axle spacings must be zero or more".into()));
        }
        if let Some(v) = g.variable {
            if v.index >= g.spacings.len() {
                return Err(refuse(format!(
                    "variable spacing {} does not exist (the group has {} spacings)",
                    v.index + 1,
                    g.spacings.len()
                )));
            }
            if !(v.min.is_finite() && v.max.is_finite() && 0.0 <= v.min && v.min <= v.max) {
                return Err(refuse(format!(
                    "variable spacing from {} m to {} m: the bounds must be zero or more, shortest first",
                    v.min, v.max
                )));
            }
        }
    }
    Ok(())
}

/// `q` times the integral of the part of eta whose sign is `sign` (+1 or -1), and the
/// intervals of that part (merged where they touch). Ordinates within 1e-12 of the
/// line's largest |eta| count as zero, so rounding noise of a solve (a force that is
/// zero in exact arithmetic) loads no sliver of the deck.
fn uniform_part(x: &[f64], eta: &[f64], q: f64, sign: f64) -> (f64, Vec<(f64, f64)>) {
    let mut total = 0.0;
    let mut loaded: Vec<(f64, f64)> = Vec::new();
    if q == 0.0 {
        return (0.0, loaded);
    }
    let noise = 1e-12 * eta.iter().fold(0.0, |m: f64, e| m.max(e.abs()));
    let signed = |e: f64| if e.abs() <= noise { 0.0 } else { sign * e };
    for k in 1..x.len() {
        let (x0, x1, e0, e1) = (x[k - 1], x[k], signed(eta[k - 1]), signed(eta[k]));
        // the adverse part of the segment: where the signed ordinate is > 0
        let (from, to, area) = if e0 >= 0.0 && e1 >= 0.0 {
            (x0, x1, 0.5 * (e0 + e1) * (x1 - x0))
        } else if e0 > 0.0 {
            let xz = x0 + (x1 - x0) * e0 / (e0 - e1);
            (x0, xz, 0.5 * e0 * (xz - x0))
        } else if e1 > 0.0 {
            let xz = x0 + (x1 - x0) * e0 / (e0 - e1);
            (xz, x1, 0.5 * e1 * (x1 - xz))
        } else {
            continue;
        };
        if area <= 0.0 {
            continue;
        }
        total += area;
        match loaded.last_mut() {
            Some(last) if last.1 >= from => last.1 = to,
            _ => loaded.push((from, to)),
        }
    }
    (sign * q * total, loaded)
}

/// Each axle's effect P_j eta(x_j) with the group at `placement` on the line (`x`, `eta`
/// as for [`envelope`]), first axle first: which axles add to an extreme and which a
/// group that neglects relieving axles leaves off. Units: those of the line times kN. An
/// axle with no ordinate (a line `envelope` would refuse, or a position that is not a
/// number) has no effect (0).
pub fn axle_effects(x: &[f64], eta: &[f64], group: &AxleGroup, placement: &AxlePlacement) -> Vec<f64> {
    let d = offsets(group, placement.spacing);
    let sense = if placement.travel == Travel::Rightward { -1.0 } else { 1.0 };
    group
        .loads
        .iter()
        .zip(&d)
        .map(|(p, dj)| p * ordinate(x, eta, placement.first_axle + sense * dj))
        .collect()
}

/// eta at `at`, linear between positions, zero off the line. A position within 1e-12 of
/// the line's length of an end counts as on the line: an axle placed on the end vertex
/// through its offset from the first axle must not fall off by rounding (an axle meant
/// to be off stands 1e-9 of the length beyond, see `search_axles`).
///
/// Never panics: a position that is not a number (offsets that overflowed, or a placement
/// given by the caller) is on no line, and a line `envelope` would refuse (lengths that
/// differ, positions out of order) gives 0 where it has no ordinate.
fn ordinate(x: &[f64], eta: &[f64], at: f64) -> f64 {
    let Some(at) = on_line(x, at) else { return 0.0 };
    // first position >= at
    interpolate(x, eta, x.partition_point(|&xi| xi < at), at)
}

/// `at` moved onto the line `x` (within the snap of `ordinate`), or `None` off it.
fn on_line(x: &[f64], at: f64) -> Option<f64> {
    let (Some(&first), Some(&last)) = (x.first(), x.last()) else { return None };
    let snap = 1e-12 * (last - first).max(1.0);
    if at.is_nan() || at < first - snap || at > last + snap {
        return None;
    }
    // `clamp` for a line whose positions increase (and no panic for one whose do not)
    Some(at.max(first).min(last))
}

/// eta at `at` (on the line) from `k`, the first position >= `at`.
fn interpolate(x: &[f64], eta: &[f64], k: usize, at: f64) -> f64 {
    let (Some(&xk), Some(&ek)) = (x.get(k), eta.get(k)) else { return 0.0 };
    if xk == at {
        return ek;
    }
    let before = k.checked_sub(1).and_then(|j| x.get(j).zip(eta.get(j)));
    let Some((&xj, &ej)) = before else { return 0.0 };
    let t = (at - xj) / (xk - xj);
    ej + t * (ek - ej)
}

/// [`ordinate`] for a run of positions that mostly increase (an axle stepped from vertex
/// to vertex): the same value, bit for bit, with the first position >= `at` found by
/// stepping on from where the last one stood instead of a binary search each time (which
/// was most of an envelope's time). A position behind the last one searches afresh.
/// Only for lines whose positions increase strictly (`check`).
#[derive(Debug, Clone, Copy, Default)]
struct Cursor {
    k: usize,
}

impl Cursor {
    fn ordinate(&mut self, x: &[f64], eta: &[f64], at: f64) -> f64 {
        let Some(at) = on_line(x, at) else { return 0.0 };
        let mut k = self.k.min(x.len());
        if k > 0 && x[k - 1] >= at {
            k = x.partition_point(|&xi| xi < at);
        } else {
            while k < x.len() && x[k] < at {
                k += 1;
            }
        }
        self.k = k;
        interpolate(x, eta, k, at)
    }
}

/// Offsets of the axles behind the first one, m, for the variable spacing `s`.
fn offsets(group: &AxleGroup, s: Option<f64>) -> Vec<f64> {
    let mut d = Vec::with_capacity(group.loads.len());
    offsets_into(group, s, &mut d);
    d
}

/// [`offsets`] into a buffer (the placement search reuses one).
fn offsets_into(group: &AxleGroup, s: Option<f64>, d: &mut Vec<f64>) {
    d.clear();
    d.push(0.0);
    for (k, &sp) in group.spacings.iter().enumerate() {
        let gap = match (group.variable, s) {
            (Some(v), Some(s)) if v.index == k => s,
            _ => sp,
        };
        d.push(d[k] + gap);
    }
}

/// Calls `seen(effect, placement)` for every candidate placement of the group (see the
/// module doc).
fn search_axles(x: &[f64], eta: &[f64], group: &AxleGroup, seen: &mut dyn FnMut(f64, AxlePlacement)) {
    // Stops for an axle: every vertex, and just beyond each end of the line, where the
    // ordinate drops to zero (an axle that leaves the deck; where the end ordinate is not
    // zero the extreme may be an axle just off the line).
    let eps = 1e-9 * (x[x.len() - 1] - x[0]).max(1.0);
    let mut stops = Vec::with_capacity(x.len() + 2);
    stops.push(x[0] - eps);
    stops.extend_from_slice(x);
    stops.push(x[x.len() - 1] + eps);
    if !group.neglect_relieving {
        search_clamped(x, eta, group, &stops, Clamp::None, seen);
        return;
    }
    // each axle counts only where it adds to the extreme: the effect is then piecewise
    // linear with kinks where an axle crosses a zero of the line too, so those are stops
    for k in 1..x.len() {
        let (a, b) = (eta[k - 1], eta[k]);
        if a * b < 0.0 {
            stops.push(x[k - 1] + (x[k] - x[k - 1]) * a / (a - b));
        }
    }
    crate::order::sort_numbers(&mut stops);
    // the max with the adding axles only, then the min likewise (a clamped effect of one
    // sign never moves the other extreme)
    search_clamped(x, eta, group, &stops, Clamp::Adding, seen);
    search_clamped(x, eta, group, &stops, Clamp::Relieving, seen);
}

/// Which axle terms count.
#[derive(Clone, Copy, PartialEq)]
enum Clamp {
    /// Every axle.
    None,
    /// Only axles with a positive effect (for the max).
    Adding,
    /// Only axles with a negative effect (for the min).
    Relieving,
}

impl Clamp {
    fn term(self, v: f64) -> f64 {
        match self {
            Clamp::None => v,
            Clamp::Adding => v.max(0.0),
            Clamp::Relieving => v.min(0.0),
        }
    }
}

/// [`search_axles`] with the axles' terms clamped by `clamp`, the axles stopping at `stops`.
fn search_clamped(
    x: &[f64],
    eta: &[f64],
    group: &AxleGroup,
    stops: &[f64],
    clamp: Clamp,
    seen: &mut dyn FnMut(f64, AxlePlacement),
) {
    let axles = group.loads.len();
    // at a fixed spacing: every axle on every stop, both directions (a variable spacing's
    // bounds are the window's ends below)
    if group.variable.is_none() {
        let s = None;
        let d = offsets(group, s);
        for travel in [Travel::Rightward, Travel::Leftward] {
            let sense = if travel == Travel::Rightward { -1.0 } else { 1.0 };
            // axle j's position with axle `on` on the stop rises with the stop: one
            // cursor per pair
            let mut cursors = vec![Cursor::default(); axles * axles];
            for &xv in stops {
                for (on, dj) in d.iter().enumerate() {
                    let first = xv - sense * dj;
                    let pair = &mut cursors[on * axles..(on + 1) * axles];
                    let effect: f64 = group
                        .loads
                        .iter()
                        .zip(&d)
                        .zip(pair.iter_mut())
                        .map(|((p, dk), c)| clamp.term(p * c.ordinate(x, eta, first + sense * dk)))
                        .sum();
                    seen(effect, AxlePlacement { first_axle: first, travel, spacing: s });
                }
            }
        }
    }
    // inside the range: the axles ahead of the variable gap (0..=index) and those behind
    // it move apart. With u the first axle and w = u + sense s the axle just behind the gap
    // less its fixed offset, the effect is F(u) + R(w), w in the window [u + sense min,
    // u + sense max]. Between consecutive candidate u (a breakpoint of F, or a window end
    // on a breakpoint of R) F is linear and the best R over the window is the larger
    // (smaller) of its ends, linear in u, and of R at the breakpoints inside, fixed: a
    // convex (concave) function, so the max (min) of the sum lies at a candidate.
    let Some(v) = group.variable else { return };
    let base = offsets(group, Some(0.0));
    let split = v.index + 1;
    for travel in [Travel::Rightward, Travel::Leftward] {
        let sense = if travel == Travel::Rightward { -1.0 } else { 1.0 };
        // one cursor per axle for each run of positions: the rear's vertices, the
        // candidates' first axles and the two ends of their windows
        let part = |w: f64, axles: std::ops::Range<usize>, cursors: &mut [Cursor]| -> f64 {
            axles.map(|j| clamp.term(group.loads[j] * cursors[j].ordinate(x, eta, w + sense * base[j]))).sum()
        };
        let mut cursors = vec![Cursor::default(); 4 * axles];
        let (at_breaks, rest) = cursors.split_at_mut(axles);
        let (at_front, rest) = rest.split_at_mut(axles);
        let (at_low, at_high) = rest.split_at_mut(axles);
        let mut front = |u: f64| part(u, 0..split, at_front);
        let mut rear_low = |w: f64| part(w, split..axles, at_low);
        let mut rear_high = |w: f64| part(w, split..axles, at_high);
        // breakpoints of R in w, sorted, with R there, and range max / min over them
        let base = &base;
        let mut rear_breaks: Vec<f64> = (split..group.loads.len())
            .flat_map(|j| stops.iter().map(move |&xv| xv - sense * base[j]))
            .collect();
        crate::order::sort_numbers(&mut rear_breaks);
        rear_breaks.dedup();
        let rear_values: Vec<f64> = rear_breaks.iter().map(|&w| part(w, split..axles, at_breaks)).collect();
        let table = RangeExtremes::new(&rear_values);
        let mut candidates: Vec<f64> =
            (0..split).flat_map(|j| stops.iter().map(move |&xv| xv - sense * base[j])).collect();
        for &w in &rear_breaks {
            candidates.push(w - sense * v.min);
            candidates.push(w - sense * v.max);
        }
        for u in candidates {
            let (a, b) = (u + sense * v.min, u + sense * v.max);
            let (lo, hi) = if a <= b { (a, b) } else { (b, a) };
            let f = front(u);
            let ends = [(lo, rear_low(lo)), (hi, rear_high(hi))];
            let first_in = rear_breaks.partition_point(|&w| w <= lo);
            let past_in = rear_breaks.partition_point(|&w| w < hi);
            let inside = table.query(first_in, past_in);
            let mut best_max = if ends[0].1 >= ends[1].1 { ends[0] } else { ends[1] };
            let mut best_min = if ends[0].1 <= ends[1].1 { ends[0] } else { ends[1] };
            if let Some(((imax, vmax), (imin, vmin))) = inside {
                if vmax > best_max.1 {
                    best_max = (rear_breaks[imax], vmax);
                }
                if vmin < best_min.1 {
                    best_min = (rear_breaks[imin], vmin);
                }
            }
            for (w, r) in [best_max, best_min] {
                let spacing = (sense * (w - u)).clamp(v.min, v.max);
                seen(f + r, AxlePlacement { first_axle: u, travel, spacing: Some(spacing) });
            }
        }
    }
}

/// Range maximum and minimum queries over a fixed list (a sparse table: O(n log n) to
/// build, O(1) per query).
struct RangeExtremes {
    /// `levels[k][i]`: (index of the max, index of the min) of `values[i .. i + 2^k]`.
    levels: Vec<Vec<(usize, usize)>>,
    values: Vec<f64>,
}

impl RangeExtremes {
    fn new(values: &[f64]) -> RangeExtremes {
        let n = values.len();
        let mut levels = vec![(0..n).map(|i| (i, i)).collect::<Vec<_>>()];
        let mut width = 1;
        while 2 * width <= n {
            let prev = &levels[levels.len() - 1];
            let next: Vec<(usize, usize)> = (0..=n - 2 * width)
                .map(|i| {
                    let (a, b) = (prev[i], prev[i + width]);
                    (
                        if values[a.0] >= values[b.0] { a.0 } else { b.0 },
                        if values[a.1] <= values[b.1] { a.1 } else { b.1 },
                    )
                })
                .collect();
            levels.push(next);
            width *= 2;
        }
        RangeExtremes { levels, values: values.to_vec() }
    }

    /// ((index, value) of the max, (index, value) of the min) over `from..to`; `None` when
    /// empty.
    fn query(&self, from: usize, to: usize) -> Option<((usize, f64), (usize, f64))> {
        if from >= to || to > self.values.len() {
            return None;
        }
        let k = (usize::BITS - 1 - (to - from).leading_zeros()) as usize;
        let (a, b) = (self.levels[k][from], self.levels[k][to - (1 << k)]);
        let max = if self.values[a.0] >= self.values[b.0] { a.0 } else { b.0 };
        let min = if self.values[a.1] <= self.values[b.1] { a.1 } else { b.1 };
        Some(((max, self.values[max]), (min, self.values[min])))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn grid(l: f64, n: usize) -> Vec<f64> {
        (0..=n).map(|k| l * k as f64 / n as f64).collect()
    }

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() <= 1e-9 * b.abs().max(1.0)
    }

    /// The axle effect of a placement, recomputed from its description.
    fn replay(x: &[f64], eta: &[f64], group: &AxleGroup, p: &AxlePlacement) -> f64 {
        replay_clamped(x, eta, group, p, Clamp::None)
    }

    /// The checks of the sampling properties: both extremes are reached by their own
    /// placements, and no placement on a grid of `positions` first-axle places from
    /// `margin` m before the line to `margin` m after it, and of `steps` + 1 spacings
    /// across the variable range, both directions, does better (counting only adding or
    /// relieving axles when the group neglects relieving ones). The grid has no
    /// vertex-placement by design, so it checks the rule rather than repeating it.
    fn no_sample_beats(
        x: &[f64],
        eta: &[f64],
        group: &AxleGroup,
        e: &Envelope,
        margin: f64,
        positions: usize,
        steps: usize,
    ) -> Result<(), proptest::test_runner::TestCaseError> {
        let (up, down) = if group.neglect_relieving {
            (Clamp::Adding, Clamp::Relieving)
        } else {
            (Clamp::None, Clamp::None)
        };
        for (extreme, clamp) in [(&e.max, up), (&e.min, down)] {
            if let Some(p) = &extreme.axles {
                proptest::prop_assert!(close(replay_clamped(x, eta, group, p, clamp), extreme.axle_part));
            }
        }
        let v = group.variable.expect("a variable spacing");
        let (x0, x1) = (x[0] - margin, x[x.len() - 1] + margin);
        for i in 0..=positions {
            let first = x0 + (x1 - x0) * (i as f64 + 0.37) / (positions + 1) as f64;
            for j in 0..=steps {
                let s = v.min + (v.max - v.min) * j as f64 / steps as f64;
                for travel in [Travel::Rightward, Travel::Leftward] {
                    let p = AxlePlacement { first_axle: first, travel, spacing: Some(s) };
                    let (hi, lo) =
                        (replay_clamped(x, eta, group, &p, up), replay_clamped(x, eta, group, &p, down));
                    proptest::prop_assert!(hi <= e.max.value + 1e-9, "{hi} beats max {}", e.max.value);
                    proptest::prop_assert!(lo >= e.min.value - 1e-9, "{lo} beats min {}", e.min.value);
                }
            }
        }
        Ok(())
    }

    /// The effect of a placement with each axle's term clamped (`Clamp::Adding` keeps
    /// the adding axles, `Clamp::Relieving` the relieving ones).
    fn replay_clamped(x: &[f64], eta: &[f64], group: &AxleGroup, p: &AxlePlacement, clamp: Clamp) -> f64 {
        let d = offsets(group, p.spacing);
        let sense = if p.travel == Travel::Rightward { -1.0 } else { 1.0 };
        group
            .loads
            .iter()
            .zip(&d)
            .map(|(load, dj)| clamp.term(load * ordinate(x, eta, p.first_axle + sense * dj)))
            .sum()
    }

    #[test]
    fn relieving_axles_are_left_off_when_the_code_says_so() {
        // a zig-zag line 0, 1, -1, 1, 0 at x = 0..4 m and three 100 kN axles 1 m apart.
        // The whole group at 1, 2, 3 m gives 100 - 100 + 100 = 100, and no placement of
        // the whole group does better; leaving off the axle on the -1 (AASHTO LRFD
        // 3.6.1.3.1) gives 200. Its min: the axle on -1 alone, -100 (whole: -100 too,
        // the others off the line or on zeros).
        let x = vec![0.0, 1.0, 2.0, 3.0, 4.0];
        let eta = vec![0.0, 1.0, -1.0, 1.0, 0.0];
        let mut group = AxleGroup {
            loads: vec![100.0; 3],
            spacings: vec![1.0, 1.0],
            variable: None,
            neglect_relieving: false,
        };
        let whole = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(group.clone()) }).expect("valid");
        assert!(close(whole.max.value, 100.0), "{}", whole.max.value);
        group.neglect_relieving = true;
        let e = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(group.clone()) }).expect("valid");
        assert!(close(e.max.value, 200.0), "{}", e.max.value);
        assert!(close(e.min.value, -100.0), "{}", e.min.value);
        let at = e.max.axles.expect("placed");
        assert!(close(replay_clamped(&x, &eta, &group, &at, Clamp::Adding), 200.0));
    }

    /// Simple span L = 20 m, left reaction R_A, influence line 1 - x/L (any statics text).
    #[test]
    fn simple_span_reaction() {
        let (l, q, p, s) = (20.0, 9.3, 100.0, 3.0);
        let x = grid(l, 10);
        let eta: Vec<f64> = x.iter().map(|xi| 1.0 - xi / l).collect();
        // uniform q over the span: q L / 2 = 93 kN
        let only_q = envelope(&x, &eta, &Traffic { uniform: q, axles: None }).expect("valid");
        assert!(close(only_q.max.value, q * l / 2.0), "{}", only_q.max.value);
        assert_eq!(only_q.max.loaded, vec![(0.0, l)]);
        assert_eq!(only_q.min.value, 0.0);
        assert!(only_q.min.loaded.is_empty());
        // a single axle P at the support: P
        let one = AxleGroup { loads: vec![p], spacings: vec![], variable: None, neglect_relieving: false };
        let e = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(one) }).expect("valid");
        assert!(close(e.max.value, p));
        assert_eq!(e.max.axles.expect("placed").first_axle, 0.0);
        // two axles P, spacing s (s = 3 m is not a multiple of the 2 m grid): one at the
        // support, one at s: P (1 + (1 - s/L)) = 185 kN; with q added: + q L / 2
        let two =
            AxleGroup { loads: vec![p, p], spacings: vec![s], variable: None, neglect_relieving: false };
        let e = envelope(&x, &eta, &Traffic { uniform: q, axles: Some(two.clone()) }).expect("valid");
        assert!(close(e.max.axle_part, p * (2.0 - s / l)), "{}", e.max.axle_part);
        assert!(close(e.max.value, p * (2.0 - s / l) + q * l / 2.0));
        let at = e.max.axles.expect("placed");
        assert!(close(replay(&x, &eta, &two, &at), e.max.axle_part));
        assert_eq!(e.min.value, 0.0);
        assert!(e.min.axles.is_none());
    }

    /// Simple span L = 16 m, midspan moment: triangle with peak L/4 at L/2.
    #[test]
    fn simple_span_midspan_moment() {
        let (l, q, p) = (16.0, 10.0, 50.0);
        let x = grid(l, 8);
        let eta: Vec<f64> = x.iter().map(|xi| xi.min(l - xi) / 2.0).collect();
        let one = AxleGroup { loads: vec![p], spacings: vec![], variable: None, neglect_relieving: false };
        let e = envelope(&x, &eta, &Traffic { uniform: q, axles: Some(one) }).expect("valid");
        // q L^2 / 8 = 320 kNm and P L / 4 = 200 kNm (any statics text)
        assert!(close(e.max.uniform_part, q * l * l / 8.0));
        assert!(close(e.max.axle_part, p * l / 4.0));
        assert_eq!(e.max.axles.expect("placed").first_axle, l / 2.0);
    }

    /// HL-93 design truck, 35, 145, 145 kN, front spacing 4.3 m, rear 4.3 to 9.0 m
    /// (AASHTO LRFD 3.6.1.2.2; from memory), on a simple span L = 20 m, midspan moment.
    ///
    /// By hand: the middle axle at midspan (eta 5), the others 4.3 m either side
    /// (eta (10 - 4.3) / 2 = 2.85): 145 x 5 + 145 x 2.85 + 35 x 2.85 = 1238 kNm. A longer
    /// rear spacing lowers the rear axle's ordinate, so the search must keep 4.3 m.
    /// (The rear axle at midspan gives 145 x 5 + 145 x 2.85 + 35 x 0.7 = 1162.75 kNm.)
    #[test]
    fn hl93_truck_worst_rear_spacing_is_the_shortest_on_a_short_span() {
        let l = 20.0;
        let x = grid(l, 40);
        let eta: Vec<f64> = x.iter().map(|xi| xi.min(l - xi) / 2.0).collect();
        let truck = AxleGroup {
            loads: vec![35.0, 145.0, 145.0],
            spacings: vec![4.3, 4.3],
            variable: Some(VariableSpacing { index: 1, min: 4.3, max: 9.0 }),
            neglect_relieving: false,
        };
        let e = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(truck.clone()) }).expect("valid");
        assert!(close(e.max.value, 1238.0), "{}", e.max.value);
        let at = e.max.axles.expect("placed");
        assert!(close(at.spacing.expect("variable"), 4.3), "{at:?}");
        assert!(close(replay(&x, &eta, &truck, &at), 1238.0));
    }

    /// The same truck on the left reaction of a simple span L = 30 m (line 1 - x/L):
    /// by hand, travelling right (the 35 kN axle leading) with the last 145 kN axle on
    /// the support, rear spacing 4.3 m: 145 + 145 (1 - 4.3/30) + 35 (1 - 8.6/30) =
    /// 294.18 kN; travelling left the 35 kN axle would come first onto the support side
    /// (35 + 145 (1 - 4.3/30) + 145 (1 - 8.6/30) = 262.6 kN) or leave the span (145 +
    /// 145 (1 - 4.3/30) = 269.2 kN). The right reaction, 1 - (L - x)/L, is the mirror:
    /// the same value travelling left.
    #[test]
    fn hl93_truck_on_a_support_reaction_picks_its_direction() {
        let l = 30.0;
        let x = grid(l, 30);
        let truck = AxleGroup {
            loads: vec![35.0, 145.0, 145.0],
            spacings: vec![4.3, 4.3],
            variable: Some(VariableSpacing { index: 1, min: 4.3, max: 9.0 }),
            neglect_relieving: false,
        };
        let hand = 145.0 + 145.0 * (1.0 - 4.3 / l) + 35.0 * (1.0 - 8.6 / l);
        let left: Vec<f64> = x.iter().map(|xi| 1.0 - xi / l).collect();
        let right: Vec<f64> = x.iter().map(|xi| xi / l).collect();
        for (eta, travel) in [(left, Travel::Rightward), (right, Travel::Leftward)] {
            let e = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(truck.clone()) }).expect("valid");
            assert!(close(e.max.value, hand), "{} vs {hand}", e.max.value);
            let at = e.max.axles.expect("placed");
            assert_eq!(at.travel, travel);
            assert!(close(at.spacing.expect("variable"), 4.3));
            assert_eq!(e.min.value, 0.0);
        }
    }

    /// The search inside the range: two axles of 100 kN on a line with two peaks of 1 at
    /// 2 m and 9 m (zero at 0, 5.5 and 12 m), spacing 4 to 9 m. By hand: one axle on each
    /// peak at spacing 7 m gives 200 kN; the bounds give less (at 4 m: one axle on a peak,
    /// the other 0.5 m up the next slope, 100 (1 + 0.5/3.5) = 114.3 kN; at 9 m: one on
    /// the peak at 2 m, the other at 11 m, 100 (1 + 1/3) = 133.3 kN), so only the search
    /// inside the range finds it.
    #[test]
    fn spacing_search_inside_the_range() {
        let x = vec![0.0, 2.0, 5.5, 9.0, 12.0];
        let eta = vec![0.0, 1.0, 0.0, 1.0, 0.0];
        let pair = AxleGroup {
            loads: vec![100.0, 100.0],
            spacings: vec![4.0],
            variable: Some(VariableSpacing { index: 0, min: 4.0, max: 9.0 }),
            neglect_relieving: false,
        };
        let e = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(pair) }).expect("valid");
        assert!(close(e.max.value, 200.0), "{}", e.max.value);
        assert!(close(e.max.axles.expect("placed").spacing.expect("variable"), 7.0));
    }

    /// A line with both signs (the moment over the middle support of a beam, say):
    /// x = 0, 4, 10, 12 m, eta = 0, 2, -3, 0. Positive part: 0..4 (area 4) and 4..4.8
    /// (zero at 4 + 6 x 2/5 = 6.4: area 0.5 x 2 x 2.4 = 2.4); negative part 6.4..12
    /// (0.5 x 3 x 3.6 + 0.5 x 3 x 2 = 8.4). q = 10: max 64, min -84. One axle of 20 kN:
    /// +40 at x = 4, -60 at x = 10.
    #[test]
    fn a_line_of_both_signs_has_a_max_and_a_min_of_opposite_sign() {
        let x = vec![0.0, 4.0, 10.0, 12.0];
        let eta = vec![0.0, 2.0, -3.0, 0.0];
        let one = AxleGroup { loads: vec![20.0], spacings: vec![], variable: None, neglect_relieving: false };
        let e = envelope(&x, &eta, &Traffic { uniform: 10.0, axles: Some(one) }).expect("valid");
        assert!(close(e.max.value, 64.0 + 40.0), "{}", e.max.value);
        assert!(close(e.min.value, -84.0 - 60.0), "{}", e.min.value);
        assert_eq!(e.max.loaded.len(), 1);
        assert!(close(e.max.loaded[0].1, 6.4));
        assert!(close(e.min.loaded[0].0, 6.4) && e.min.loaded[0].1 == 12.0);
        assert_eq!(e.min.axles.expect("placed").first_axle, 10.0);
    }

    /// Rounding noise loads nothing: a line of 1 over 0..4 m and +-1e-17 elsewhere
    /// gives the max on 0..4 m only and a min of zero with no loaded interval.
    #[test]
    fn rounding_noise_loads_no_sliver() {
        let x = vec![0.0, 4.0, 6.0, 8.0, 10.0];
        let eta = vec![1.0, 1.0, 1e-17, -1e-17, 1e-17];
        let e = envelope(&x, &eta, &Traffic { uniform: 2.0, axles: None }).expect("valid");
        assert_eq!(e.max.loaded, vec![(0.0, 6.0)]);
        assert!(close(e.max.value, 2.0 * (4.0 + 1.0)));
        assert!(e.min.loaded.is_empty() && e.min.value == 0.0, "{:?}", e.min);
    }

    /// An axle group longer than the line: axles off the line carry nothing. Line of
    /// 2 m with eta = 1 throughout; two axles 10 m apart: only one can be on it.
    #[test]
    fn a_group_longer_than_the_line_counts_only_the_axles_on_it() {
        let x = vec![0.0, 2.0];
        let eta = vec![1.0, 1.0];
        let g = AxleGroup {
            loads: vec![30.0, 50.0],
            spacings: vec![10.0],
            variable: None,
            neglect_relieving: false,
        };
        let e = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(g) }).expect("valid");
        assert_eq!(e.max.value, 50.0);
        let empty = envelope(&[], &[], &Traffic { uniform: 5.0, axles: None }).expect("valid");
        assert_eq!((empty.max.value, empty.min.value), (0.0, 0.0));
    }

    /// `n` positions along a line at a k + b k^2, m (k = 0..n): the gaps widen along it,
    /// no two alike, so no search can lean on a regular grid.
    fn uneven_positions(n: usize, a: f64, b: f64) -> Vec<f64> {
        (0..n).map(|k| a * k as f64 + b * (k * k) as f64).collect()
    }

    proptest::proptest! {
        /// On any line, the searched extremes are reached by their placements and no
        /// placement on a fine grid of positions and spacings does better (a brute-force
        /// check of the vertex rule; the grid contains no vertex-placement by design, so
        /// it checks the rule rather than repeating it).
        #[test]
        fn no_sampled_placement_beats_the_search(
            eta in proptest::collection::vec(-2.0f64..2.0, 2..9),
            loads in proptest::collection::vec(0.0f64..100.0, 3),
            front in 0.5f64..3.0,
            (lo, width) in (0.5f64..3.0, 0.0f64..4.0),
        ) {
            let x = uneven_positions(eta.len(), 1.7, 0.13);
            let group = AxleGroup {
                loads,
                spacings: vec![front, lo],
                variable: Some(VariableSpacing { index: 1, min: lo, max: lo + width }),
                neglect_relieving: false,
            };
            let e = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(group.clone()) }).expect("valid");
            for extreme in [&e.max, &e.min] {
                if let Some(p) = &extreme.axles {
                    let s = p.spacing.expect("variable");
                    proptest::prop_assert!(s >= lo && s <= lo + width);
                }
            }
            no_sample_beats(&x, &eta, &group, &e, 12.0, 400, 6)?;
        }
    }

    proptest::proptest! {
        /// The same check for a long gap between two groups of several axles each (the
        /// two-truck load's shape: a window of spacings wider than the line).
        #[test]
        fn no_sampled_placement_beats_the_search_of_a_long_gap(
            eta in proptest::collection::vec(-2.0f64..2.0, 2..12),
            loads in proptest::collection::vec(0.0f64..100.0, 5),
            min in 0.5f64..6.0,
            width in 0.0f64..40.0,
        ) {
            let x = uneven_positions(eta.len(), 1.3, 0.11);
            let group = AxleGroup {
                loads,
                spacings: vec![0.9, min, 1.1, 0.7],
                variable: Some(VariableSpacing { index: 1, min, max: min + width }),
                neglect_relieving: false,
            };
            let e = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(group.clone()) }).expect("valid");
            no_sample_beats(&x, &eta, &group, &e, 50.0, 300, 12)?;
        }
    }

    proptest::proptest! {
        /// With relieving axles left off, no sampled placement's adding (relieving) axles
        /// do better than the searched max (min), and the placements reproduce them.
        #[test]
        fn no_sampled_placement_beats_the_search_without_relieving_axles(
            eta in proptest::collection::vec(-2.0f64..2.0, 2..10),
            loads in proptest::collection::vec(0.0f64..100.0, 4),
            min in 0.5f64..4.0,
            width in 0.0f64..20.0,
        ) {
            let x = uneven_positions(eta.len(), 1.5, 0.09);
            let group = AxleGroup {
                loads,
                spacings: vec![1.1, min, 0.8],
                variable: Some(VariableSpacing { index: 1, min, max: min + width }),
                neglect_relieving: true,
            };
            let e = envelope(&x, &eta, &Traffic { uniform: 0.0, axles: Some(group.clone()) }).expect("valid");
            no_sample_beats(&x, &eta, &group, &e, 30.0, 300, 8)?;
        }
    }

    proptest::proptest! {
        /// The cursor gives `ordinate`'s value bit for bit along any run of positions:
        /// rising, falling back, on vertices, off both ends and not a number.
        #[test]
        fn the_cursor_reads_what_the_search_reads(
            eta in proptest::collection::vec(-2.0f64..2.0, 1..12),
            steps in proptest::collection::vec(-3.0f64..4.0, 1..60),
            start in -2.0f64..2.0,
        ) {
            let x = uneven_positions(eta.len(), 1.4, 0.07);
            let mut cursor = Cursor::default();
            let mut at = start;
            for (i, step) in steps.iter().enumerate() {
                // every seventh query on a vertex, every eleventh not a number
                let query = match i % 11 {
                    10 => f64::NAN,
                    _ if i % 7 == 6 => x[i % x.len()],
                    _ => at,
                };
                let (got, want) = (cursor.ordinate(&x, &eta, query), ordinate(&x, &eta, query));
                proptest::prop_assert_eq!(got.to_bits(), want.to_bits(), "at {}", query);
                at += step;
            }
        }
    }

    proptest::proptest! {
        /// At a fixed spacing, every placement the search tries reports the effect its
        /// placement gives when worked out alone, bit for bit (the cursors change how an
        /// ordinate is found, never its value), with and without relieving axles.
        #[test]
        fn every_fixed_placement_reports_its_own_effect(
            eta in proptest::collection::vec(-2.0f64..2.0, 2..14),
            loads in proptest::collection::vec(0.0f64..100.0, 1..5),
            spacing in 0.2f64..6.0,
            neglect_relieving in proptest::bool::ANY,
        ) {
            let x = uneven_positions(eta.len(), 1.2, 0.1);
            let spacings = vec![spacing; loads.len() - 1];
            let group = AxleGroup { loads, spacings, variable: None, neglect_relieving };
            let clamps: &[Clamp] =
                if neglect_relieving { &[Clamp::Adding, Clamp::Relieving] } else { &[Clamp::None] };
            let mut tried = 0;
            for &clamp in clamps {
                let mut wrong = None;
                search_clamped(&x, &eta, &group, &x, clamp, &mut |value, p| {
                    tried += 1;
                    let alone = replay_clamped(&x, &eta, &group, &p, clamp);
                    if value.to_bits() != alone.to_bits() && wrong.is_none() {
                        wrong = Some((value, alone));
                    }
                });
                proptest::prop_assert!(wrong.is_none(), "{:?}", wrong);
            }
            proptest::prop_assert_eq!(tried, clamps.len() * 2 * x.len() * group.loads.len());
        }
    }

    #[test]
    fn bad_input_is_refused() {
        let t = Traffic { uniform: 1.0, axles: None };
        assert!(envelope(&[0.0, 1.0], &[1.0], &t).is_err());
        assert!(envelope(&[1.0, 0.0], &[1.0, 1.0], &t).is_err());
        assert!(envelope(&[0.0, 1.0], &[1.0, f64::NAN], &t).is_err());
        assert!(envelope(&[0.0, 1.0], &[1.0, 1.0], &Traffic { uniform: -1.0, axles: None }).is_err());
        let bad =
            AxleGroup { loads: vec![1.0, 1.0], spacings: vec![], variable: None, neglect_relieving: false };
        assert!(envelope(&[0.0, 1.0], &[1.0, 1.0], &Traffic { uniform: 0.0, axles: Some(bad) }).is_err());
        let bad = AxleGroup {
            loads: vec![1.0, 1.0],
            spacings: vec![1.0],
            variable: Some(VariableSpacing { index: 0, min: 3.0, max: 2.0 }),
            neglect_relieving: false,
        };
        assert!(envelope(&[0.0, 1.0], &[1.0, 1.0], &Traffic { uniform: 0.0, axles: Some(bad) }).is_err());
    }
}
