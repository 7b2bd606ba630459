//! Funicular polygons for vertical loads: the three-point construction and the graphic
//! pole construction (load line, pole, rays, funicular polygon).
//!
//! Following the classical graphic statics of any structural analysis text (e.g.
//! Timoshenko & Young, Theory of Structures, ch. on arches and cables; from memory):
//! for vertical loads P_i at x_i between supports A = (x_A, y_A) and B = (x_B, y_B), let
//! M(x) be the sagging moment of a simply supported beam A-B under the same loads and
//! c(x) the chord A-B. For a horizontal thrust H > 0 the compression-only shape is
//!
//! ```text
//!     y(x) = c(x) + M(x) / H,
//! ```
//!
//! and requiring the rise f above the chord at x_C fixes H = M(x_C) / f.
//!
//! Units: x, y in m; loads P in kN, **positive downward** (the sense in which a load line
//! is drawn); H in kN (compression thrust of an arch, positive); moments kNm. Reactions
//! returned here are the forces the supports apply to the arch, y up.

use crate::error::StaticsError;
use crate::frame::model::Model;
use crate::frame::solver::CaseResult;
use crate::tolerance::SPAN_TOLERANCE;
use serde::{Deserialize, Serialize};

/// A vertical point load: position x (m) and magnitude p (kN, positive downward).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct VerticalLoad {
    /// Horizontal position, m.
    pub x: f64,
    /// Load, kN, positive downward.
    pub p: f64,
}

pub use crate::geom::Point;

/// Result of the three-point funicular construction.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ThreePointFunicular {
    /// Horizontal thrust H, kN (> 0: the arch is in compression).
    pub thrust: f64,
    /// Vertical reaction at A on the arch, kN, up positive.
    pub reaction_a: f64,
    /// Vertical reaction at B on the arch, kN, up positive.
    pub reaction_b: f64,
    /// Simple-beam reactions (R_A, R_B) of the same loads, kN, up positive.
    pub beam_reactions: (f64, f64),
    /// Level of the funicular under each load, m (in the order of the loads given).
    pub y: Vec<f64>,
}

fn invalid(location: &str, message: String) -> StaticsError {
    StaticsError::invalid(location, message)
}

fn check_span(a: Point, b: Point) -> Result<f64, StaticsError> {
    if !(a.x.is_finite() && a.y.is_finite() && b.x.is_finite() && b.y.is_finite()) {
        return Err(invalid("supports", "support coordinates must be finite numbers (m)".into()));
    }
    let l = b.x - a.x;
    if l.is_nan() || l <= 0.0 {
        return Err(invalid(
            "supports",
            format!("support B (x = {} m) must be to the right of A (x = {} m)", b.x, a.x),
        ));
    }
    Ok(l)
}

fn check_loads(a: Point, l: f64, loads: &[VerticalLoad]) -> Result<(), StaticsError> {
    for (k, q) in loads.iter().enumerate() {
        if !(q.x.is_finite() && q.p.is_finite()) {
            return Err(invalid("loads", format!("load {} is not a finite number", k + 1)));
        }
        let t = (q.x - a.x) / l;
        if !(-SPAN_TOLERANCE..=1.0 + SPAN_TOLERANCE).contains(&t) {
            return Err(invalid("loads", format!("load {} at x = {} m lies outside the span", k + 1, q.x)));
        }
    }
    Ok(())
}

/// Sagging bending moment (kNm) at `x` of a beam simply supported at `xa` and `xb` under
/// vertical loads (kN, positive down): M(x) = R_A (x - x_A) - sum over loads left of x of
/// P_i (x - x_i). Linear between loads, zero at both supports. Returns 0 outside the span
/// and for a zero-length span. (Any statics text.)
pub fn simple_beam_moment(xa: f64, xb: f64, loads: &[VerticalLoad], x: f64) -> f64 {
    let l = xb - xa;
    if l.is_nan() || l <= 0.0 || x <= xa || x >= xb {
        return 0.0;
    }
    // M(x) = sum_i P_i * influence(x, x_i), influence of a unit load at x_i on M at x
    let mut m = 0.0;
    for q in loads {
        let xi = q.x.clamp(xa, xb);
        m += q.p * if xi <= x { (xi - xa) * (xb - x) / l } else { (x - xa) * (xb - xi) / l };
    }
    m
}

/// [`simple_beam_moment`] at each of the points `at`, in their order: the same values (to
/// rounding) in O((n + m) log n) rather than n m: with the loads sorted by position,
/// M(x) = (x_B - x) / L sum_{x_i <= x} P_i (x_i - x_A) + (x - x_A) / L sum_{x_i > x} P_i (x_B - x_i)
/// from a running sum each way.
pub fn simple_beam_moments(xa: f64, xb: f64, loads: &[VerticalLoad], at: &[f64]) -> Vec<f64> {
    let l = xb - xa;
    if l.is_nan() || l <= 0.0 {
        return vec![0.0; at.len()];
    }
    let mut sorted: Vec<(f64, f64)> = loads.iter().map(|q| (q.x.clamp(xa, xb), q.p)).collect();
    crate::order::sort_by(&mut sorted, |a, b| a.0.total_cmp(&b.0));
    // before[k]: sum of P_i (x_i - x_A) over the first k loads; after[k]: of P_i (x_B - x_i)
    // over the loads from k on
    let mut before = vec![0.0; sorted.len() + 1];
    let mut after = vec![0.0; sorted.len() + 1];
    for (k, (xi, p)) in sorted.iter().enumerate() {
        before[k + 1] = before[k] + p * (xi - xa);
    }
    for (k, (xi, p)) in sorted.iter().enumerate().rev() {
        after[k] = after[k + 1] + p * (xb - xi);
    }
    at.iter()
        .map(|&x| {
            if x.is_nan() || x <= xa || x >= xb {
                return 0.0;
            }
            let k = sorted.partition_point(|(xi, _)| *xi <= x);
            ((xb - x) * before[k] + (x - xa) * after[k]) / l
        })
        .collect()
}

/// Simple-beam reactions (R_A, R_B), kN up, of vertical loads (kN down) on a beam from
/// `xa` to `xb`; (0, 0) for a zero-length span.
pub fn simple_beam_reactions(xa: f64, xb: f64, loads: &[VerticalLoad]) -> (f64, f64) {
    let l = xb - xa;
    if l.is_nan() || l <= 0.0 {
        return (0.0, 0.0);
    }
    let total: f64 = loads.iter().map(|q| q.p).sum();
    let rb: f64 = loads.iter().map(|q| q.p * (q.x - xa) / l).sum();
    (total - rb, rb)
}

/// The funicular through A, B and the crown point at `crown_x`, `rise` above the chord,
/// for vertical loads: y_i = c(x_i) + M(x_i) / H with H = M(x_C) / f.
///
/// Reactions on the arch: V_A = R_A + H (y_B - y_A) / L and V_B = R_B - H (y_B - y_A) / L
/// (moments about the other support), so the two splits of the load line differ by
/// H (y_B - y_A) / L. Loads on a support vertical go straight into that support.
///
/// Errors (never NaN): non-finite input, B not right of A, a load outside the span, crown
/// not strictly between the supports, rise not positive, or M(x_C) <= 0 (the loads do not
/// press the crown down: no compression funicular through the three points exists, e.g.
/// no load at all).
pub fn three_point(
    a: Point,
    b: Point,
    crown_x: f64,
    rise: f64,
    loads: &[VerticalLoad],
) -> Result<ThreePointFunicular, StaticsError> {
    let l = check_span(a, b)?;
    check_loads(a, l, loads)?;
    if !(crown_x.is_finite() && crown_x > a.x && crown_x < b.x) {
        return Err(invalid(
            "crown",
            format!("crown x = {crown_x} m must lie strictly between the supports"),
        ));
    }
    if !(rise.is_finite() && rise > 0.0) {
        return Err(invalid("crown", format!("rise {rise} m must be a positive number")));
    }
    let mc = simple_beam_moment(a.x, b.x, loads, crown_x);
    let scale: f64 = loads.iter().map(|q| q.p.abs()).sum::<f64>() * l;
    if mc.is_nan() || mc <= scale * f64::EPSILON {
        return Err(invalid(
            "loads",
            format!("the loads give a crown moment of {mc:.3e} kNm; a compression funicular needs loads that press the crown down"),
        ));
    }
    let h = mc / rise;
    let chord = |x: f64| a.y + (b.y - a.y) * (x - a.x) / l;
    let at: Vec<f64> = loads.iter().map(|q| q.x).collect();
    let y =
        at.iter().zip(simple_beam_moments(a.x, b.x, loads, &at)).map(|(&x, m)| chord(x) + m / h).collect();
    let (ra, rb) = simple_beam_reactions(a.x, b.x, loads);
    let shift = h * (b.y - a.y) / l;
    Ok(ThreePointFunicular {
        thrust: h,
        reaction_a: ra + shift,
        reaction_b: rb - shift,
        beam_reactions: (ra, rb),
        y,
    })
}

/// A point load with both components at a rib node: position x (m), horizontal component
/// `px` (kN, positive to the right) and vertical component `p` (kN, positive downward).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct NodeLoad {
    /// Horizontal position, m.
    pub x: f64,
    /// Horizontal component, kN, positive to the right.
    pub px: f64,
    /// Vertical component, kN, positive downward.
    pub p: f64,
}

/// Result of the three-point funicular of loads with horizontal components.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct InclinedFunicular {
    /// Horizontal thrust at A, kN: the force support A applies to the arch, to the right.
    pub thrust_a: f64,
    /// Horizontal thrust at B, kN: the force support B applies to the arch, to the left.
    pub thrust_b: f64,
    /// Vertical reaction at A on the arch, kN, up positive.
    pub reaction_a: f64,
    /// Vertical reaction at B on the arch, kN, up positive.
    pub reaction_b: f64,
    /// Level of the funicular under each load, m (in the order of the loads given).
    pub y: Vec<f64>,
}

/// The funicular polygon through A, B and the crown point (`rise` above the chord at
/// `crown_x`) for point loads with horizontal components.
///
/// Cut the polygon in the segment after the k-th load (loads left to right): the forces
/// left of the cut are the reaction at A, (H_A, V_A), and the loads, so the segment runs
/// along their resultant, with horizontal component H_k = H_A + (px_1 + ... + px_k) and
/// vertical V_k = V_A - (p_1 + ... + p_k), slope V_k / H_k; no segment bends (the
/// definition of a funicular; any statics text, e.g. Timoshenko & Young, Theory of
/// Structures, on arches and cables, from memory). The thrust therefore changes by each
/// horizontal load along the way and differs at the two springings. For a given H_A the
/// polygon reaches B for one V_A (the slopes are linear in V_A); H_A is then found so that
/// the polygon passes through the crown point, by bracketing and the Illinois variant of
/// regula falsi. With no horizontal components the result is [`three_point`]'s.
///
/// Errors (never NaN): those of [`three_point`] for the geometry and the vertical
/// components; no compression polygon through the three points (a segment would need a
/// horizontal component of zero or less).
pub fn three_point_inclined(
    a: Point,
    b: Point,
    crown_x: f64,
    rise: f64,
    loads: &[NodeLoad],
) -> Result<InclinedFunicular, StaticsError> {
    let vertical: Vec<VerticalLoad> = loads.iter().map(|q| VerticalLoad { x: q.x, p: q.p }).collect();
    if let Some(k) = loads.iter().position(|q| !q.px.is_finite()) {
        return Err(invalid("loads", format!("load {} is not a finite number", k + 1)));
    }
    // the geometry checks and the first guess: the funicular of the vertical components
    let guess = three_point(a, b, crown_x, rise, &vertical)?;
    let l = b.x - a.x;
    let mut order: Vec<usize> = (0..loads.len()).collect();
    crate::order::sort_by(&mut order, |&i, &j| loads[i].x.total_cmp(&loads[j].x));
    let sorted: Vec<NodeLoad> = order.iter().map(|&i| loads[i]).collect();
    // x at the start of each segment (A, then each load) and its length
    let xs: Vec<f64> = std::iter::once(a.x).chain(sorted.iter().map(|q| q.x)).collect();
    let dx: Vec<f64> = (0..xs.len()).map(|k| xs.get(k + 1).copied().unwrap_or(b.x) - xs[k]).collect();
    let mut sum_px = vec![0.0; xs.len()];
    let mut sum_p = vec![0.0; xs.len()];
    for (k, q) in sorted.iter().enumerate() {
        sum_px[k + 1] = sum_px[k] + q.px;
        sum_p[k + 1] = sum_p[k] + q.p;
    }
    let crown_y = a.y + (b.y - a.y) * (crown_x - a.x) / l + rise;
    // V_A and the node levels for a thrust h at A
    let polygon = |h: f64| -> (f64, Vec<f64>) {
        let flex: f64 = dx.iter().zip(&sum_px).map(|(d, s)| d / (h + s)).sum();
        let bent: f64 = dx.iter().zip(&sum_px).zip(&sum_p).map(|((d, s), p)| p * d / (h + s)).sum();
        let v_a = (b.y - a.y + bent) / flex;
        let mut y = vec![a.y; xs.len() + 1];
        for k in 0..xs.len() {
            y[k + 1] = y[k] + (v_a - sum_p[k]) / (h + sum_px[k]) * dx[k];
        }
        (v_a, y)
    };
    let miss = |h: f64| -> f64 {
        let (_, y) = polygon(h);
        // the segment holding the crown
        let k = xs.iter().rposition(|&x| x <= crown_x).unwrap_or(0);
        let t = if dx[k] > 0.0 { (crown_x - xs[k]) / dx[k] } else { 0.0 };
        y[k] + t * (y[k + 1] - y[k]) - crown_y
    };
    // every segment needs h + sum_px > 0; the crown drops towards the chord as h grows
    let floor = sum_px.iter().map(|s| -s).fold(0.0, f64::max);
    let scale = guess.thrust.max(floor).max(f64::MIN_POSITIVE);
    let none = || {
        invalid(
            "loads",
            "the loads with their horizontal components admit no compression funicular through the springings \
             and the crown point"
                .into(),
        )
    };
    let mut hi = floor + scale;
    let mut g_hi = miss(hi);
    let mut doublings = 0;
    while g_hi > 0.0 {
        doublings += 1;
        if doublings > 200 || !g_hi.is_finite() {
            return Err(none());
        }
        hi = floor + (hi - floor) * 2.0;
        g_hi = miss(hi);
    }
    let mut lo = floor + (hi - floor) * 1e-9;
    let mut g_lo = miss(lo);
    while g_lo < 0.0 {
        // closer to the floor, where the polygon rises without bound
        if lo - floor <= scale * 1e-15 || !g_lo.is_finite() {
            return Err(none());
        }
        (hi, g_hi) = (lo, g_lo);
        lo = floor + (lo - floor) * 1e-3;
        g_lo = miss(lo);
    }
    // Illinois regula falsi on [lo, hi] (g_lo >= 0 >= g_hi)
    let mut h = hi;
    let mut side = 0;
    for _ in 0..200 {
        if g_lo == 0.0 {
            h = lo;
            break;
        }
        if g_hi == 0.0 || hi - lo <= hi * 4.0 * f64::EPSILON {
            h = hi;
            break;
        }
        h = (lo * g_hi - hi * g_lo) / (g_hi - g_lo);
        if !(h > lo && h < hi) {
            h = 0.5 * (lo + hi);
        }
        let g = miss(h);
        if g > 0.0 {
            (lo, g_lo) = (h, g);
            if side == -1 {
                g_hi *= 0.5;
            }
            side = -1;
        } else {
            (hi, g_hi) = (h, g);
            if side == 1 {
                g_lo *= 0.5;
            }
            side = 1;
        }
    }
    let (v_a, y_sorted) = polygon(h);
    if !(h.is_finite() && v_a.is_finite()) {
        return Err(none());
    }
    let mut y = vec![0.0; loads.len()];
    for (k, &i) in order.iter().enumerate() {
        y[i] = y_sorted[k + 1];
    }
    let last = xs.len() - 1;
    Ok(InclinedFunicular {
        thrust_a: h,
        thrust_b: h + sum_px[last],
        reaction_a: v_a,
        reaction_b: sum_p[last] - v_a,
        y,
    })
}

/// The graphic construction for a given pole.
///
/// Force-diagram coordinates (kN): the load line is vertical at force-x 0, starting at
/// force-y 0 and running down by each load in turn (left to right): point k is at
/// -(P_1 + ... + P_k). The pole sits at (-H, -V_A): H to the left of the load line (for an
/// arch in compression; a hanging cable would have it on the right), and V_A below its
/// top, so the horizontal through the pole splits the load line into V_A (above) and
/// V_B (below).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct PoleConstruction {
    /// Load-line points, force units kN: (0, 0), (0, -P_1), ... (n + 1 points).
    pub load_line: Vec<Point>,
    /// The pole, kN.
    pub pole: Point,
    /// Rays from the pole to each load-line point (pole, point), kN. Ray k is parallel to
    /// polygon segment k (between load k and k + 1, segment 0 from A to load 1).
    pub rays: Vec<(Point, Point)>,
    /// The funicular polygon, m: the start point, a vertex on each load's vertical, and
    /// the end point on the vertical x = `end_x`.
    pub polygon: Vec<Point>,
    /// Load-line level (kN) cut by the horizontal through the pole: V_A above, V_B below.
    pub horizontal_split: f64,
    /// Load-line level (kN) cut by the ray parallel to the closing string (start to end
    /// of the polygon): it splits the load into the simple-beam reactions of a beam
    /// between those two points.
    pub closing_split: f64,
}

/// Draws the funicular polygon for the pole (thrust `h` kN > 0, vertical split `v_a` kN)
/// starting at `start` (m) and ending on the vertical `end_x`: segment k has slope
/// (V_A - P_1 - ... - P_k) / H.
///
/// The loads must lie between `start.x` and `end_x` (sorted or not: they are taken left
/// to right). Errors: non-finite input, H <= 0 (the pole on the load line gives vertical
/// strings), `end_x` not right of `start.x`, a load outside. Zero loads give a straight
/// polygon with slope V_A / H.
pub fn pole_construction(
    loads: &[VerticalLoad],
    h: f64,
    v_a: f64,
    start: Point,
    end_x: f64,
) -> Result<PoleConstruction, StaticsError> {
    let loads: Vec<NodeLoad> = loads.iter().map(|q| NodeLoad { x: q.x, px: 0.0, p: q.p }).collect();
    pole_construction_inclined(&loads, h, v_a, start, end_x)
}

/// [`pole_construction`] for loads with horizontal components: the load line is then a
/// polygon, point k at (px_1 + ... + px_k, -(P_1 + ... + P_k)), and segment k of the
/// funicular, parallel to ray k, has slope (V_A - P_1 - ... - P_k) / (H + px_1 + ... +
/// px_k) (the thrust changes by each horizontal load). H is the pole's horizontal distance
/// from the load line's first point. Errors: as [`pole_construction`], and a segment whose
/// horizontal component is not positive (that ray points back past the pole).
pub fn pole_construction_inclined(
    loads: &[NodeLoad],
    h: f64,
    v_a: f64,
    start: Point,
    end_x: f64,
) -> Result<PoleConstruction, StaticsError> {
    let end = Point { x: end_x, y: start.y };
    let l = check_span(start, end)?;
    let vertical: Vec<VerticalLoad> = loads.iter().map(|q| VerticalLoad { x: q.x, p: q.p }).collect();
    check_loads(start, l, &vertical)?;
    if let Some(k) = loads.iter().position(|q| !q.px.is_finite()) {
        return Err(invalid("loads", format!("load {} is not a finite number", k + 1)));
    }
    if !(h.is_finite() && h > 0.0) {
        return Err(invalid("pole", format!("pole distance H = {h} kN must be positive and finite")));
    }
    if !v_a.is_finite() {
        return Err(invalid("pole", "pole height must be finite".into()));
    }
    let mut sorted: Vec<NodeLoad> = loads.to_vec();
    crate::order::sort_by(&mut sorted, |p, q| p.x.total_cmp(&q.x));
    let mut load_line = vec![Point { x: 0.0, y: 0.0 }];
    let (mut across, mut acc) = (0.0, 0.0);
    for q in &sorted {
        across += q.px;
        acc -= q.p;
        load_line.push(Point { x: across, y: acc });
    }
    let pole = Point { x: -h, y: -v_a };
    let rays = load_line.iter().map(|&p| (pole, p)).collect();
    let mut polygon = vec![start];
    let (mut x, mut y, mut shear, mut thrust) = (start.x, start.y, v_a, h);
    for q in &sorted {
        y += shear / thrust * (q.x - x);
        x = q.x;
        polygon.push(Point { x, y });
        shear -= q.p;
        thrust += q.px;
        if thrust <= 0.0 {
            return Err(invalid(
                "loads",
                format!(
                    "after the load at x = {} m the thrust is {thrust:.3e} kN; a pole needs it positive",
                    q.x
                ),
            ));
        }
    }
    y += shear / thrust * (end_x - x);
    polygon.push(Point { x: end_x, y });
    // the ray parallel to the closing string: slope s = (y_end - y_start) / L from the
    // pole meets the load line at -v_a + s * h (a vertical load line), else where it
    // crosses the load polygon
    let slope = (y - start.y) / l;
    let closing_split = if sorted.iter().all(|q| q.px == 0.0) {
        -v_a + slope * h
    } else {
        let off = |p: &Point| (p.y - pole.y) - slope * (p.x - pole.x);
        load_line
            .windows(2)
            .find_map(|w| {
                let (d0, d1) = (off(&w[0]), off(&w[1]));
                (d0 * d1 <= 0.0 && d0 != d1).then(|| w[0].y + (w[1].y - w[0].y) * d0 / (d0 - d1))
            })
            .unwrap_or(-v_a + slope * h)
    };
    Ok(PoleConstruction { load_line, pole, rays, polygon, horizontal_split: -v_a, closing_split })
}

/// How the pole of a rib's funicular was placed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum FunicularMethod {
    /// The three-point construction through both springings and the crown point, from
    /// the loads alone (statics; exact for a three-hinged arch or truss).
    ThreePoint,
    /// The pole placed from the springing reactions of a stiffness solution (H, V_A and,
    /// for a fixed springing, M_A): the line of pressure of that solution.
    SolvedReactions,
}

/// Springing reactions of a stiffness solution, kN (forces the supports apply, y up).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct SolvedReactions {
    /// Horizontal reaction at the left springing, kN (the thrust H when positive).
    pub h: f64,
    /// Vertical reaction at the left springing, kN.
    pub v_a: f64,
    /// Vertical reaction at the right springing, kN.
    pub v_b: f64,
}

/// Pole and funicular of one load case on a rib (or on a structure acting as an arch):
/// load line, pole, rays, polygon and both split points.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RibFunicular {
    /// Load case name.
    pub case: String,
    /// Title of the model whose loads were used.
    pub model: String,
    /// How the pole was placed.
    pub method: FunicularMethod,
    /// Left springing, m.
    pub springing_left: Point,
    /// Right springing, m.
    pub springing_right: Point,
    /// The crown point the three-point construction passes through, m.
    pub crown: Option<Point>,
    /// The vertical loads, left to right (x m, p kN positive down): the load line.
    pub loads: Vec<VerticalLoad>,
    /// The loads' horizontal components, kN to the right, in the order of `loads`; empty
    /// when every load is vertical (the "panel loads" form; the "as built" form puts
    /// horizontal forces on the rib nodes).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub horizontal: Vec<f64>,
    /// Load line, pole, rays and funicular polygon (force-diagram coordinates as
    /// `PoleConstruction` says: load line down from 0, pole at (-H, -V_A)).
    pub construction: PoleConstruction,
    /// The pole distance H, kN.
    pub thrust: f64,
    /// (V_A, V_B), kN up: the load line split by the horizontal through the pole.
    pub vertical_reactions: (f64, f64),
    /// (R_A, R_B), kN up: the load line split by the ray parallel to the closing string
    /// (the springing chord for hinged springings): the simple-beam reactions.
    pub beam_reactions: (f64, f64),
    /// The stiffness solution's springing reactions for the same model and case, for
    /// comparison (`None` when the springings carry no reaction in the results).
    pub solver: Option<SolvedReactions>,
}

/// The vertical loads of load case `case_name` of `model` (kN positive down, at the x of
/// their nodes), left to right. Errors: the case does not exist, or it has horizontal
/// loads, couples or loads along members (the pole construction here is for vertical
/// point loads).
pub fn vertical_loads(model: &Model, case_name: &str) -> Result<Vec<VerticalLoad>, StaticsError> {
    let loads = node_loads(model, case_name)?;
    if let Some(q) = loads.iter().find(|q| q.px != 0.0) {
        return Err(invalid(
            "load case",
            format!(
                "'{case_name}' has a horizontal load at x = {} m; the pole construction needs vertical loads",
                q.x
            ),
        ));
    }
    Ok(loads.into_iter().map(|q| VerticalLoad { x: q.x, p: q.p }).collect())
}

/// The point loads at nodes of load case `case_name` of `model`, both components (x of
/// their nodes; `p` kN positive down, `px` kN to the right), left to right. Errors: the
/// case does not exist, or it has couples or loads along members, temperatures or
/// prescribed displacements.
pub fn node_loads(model: &Model, case_name: &str) -> Result<Vec<NodeLoad>, StaticsError> {
    let lc = model
        .load_cases
        .iter()
        .find(|l| l.name == case_name)
        .ok_or_else(|| invalid("load case", format!("the model has no load case '{case_name}'")))?;
    if !lc.member.is_empty() || !lc.temperature.is_empty() || !lc.prescribed.is_empty() {
        return Err(invalid(
            "load case",
            format!("'{case_name}' has member, temperature or displacement loads; the pole construction needs point loads at nodes"),
        ));
    }
    let mut loads = Vec::with_capacity(lc.nodal.len());
    for l in &lc.nodal {
        let n = model.nodes.get(l.node).ok_or_else(|| {
            invalid("load case", format!("a load acts on node {} which does not exist", l.node))
        })?;
        if l.mz != 0.0 {
            return Err(invalid(
                "load case",
                format!(
                    "'{case_name}' has a couple at node {}; the pole construction needs forces",
                    model.node_label(l.node)
                ),
            ));
        }
        if l.fy != 0.0 || l.fx != 0.0 {
            loads.push(NodeLoad { x: n.x, px: l.fx, p: -l.fy });
        }
    }
    crate::order::sort_by(&mut loads, |p, q| p.x.total_cmp(&q.x));
    Ok(loads)
}

/// Pole and funicular of load case `case` (solved on `model`) for an arch springing from
/// nodes `left` and `right`.
///
/// With `crown = Some(node)`: the three-point construction (`three_point`) through both
/// springings and that node, from the loads alone: H = M(x_C) / f; the pole at
/// (-H, -V_A). This is exact for a three-hinged rib, or a determinate three-hinged truss,
/// whose hinge is at that node. With `crown = None`: the pole from the solved reactions
/// (H = horizontal reaction at `left`, V_A its vertical one), the polygon starting at the
/// level y_A - M_A / H where the reaction's line of action crosses the springing vertical.
///
/// Both split points are reported as reactions: the horizontal through the pole gives
/// (V_A, V_B); the ray parallel to the closing string gives the simple-beam reactions
/// (R_A, R_B); for hinged springings at different levels they differ by
/// H (y_B - y_A) / L (moments about each support; any statics text). The stiffness solution's reactions are
/// attached for comparison. Units m, kN.
///
/// Errors: nodes that do not exist, `right` not to the right of `left`, loads that are not
/// vertical point loads at nodes or lie outside the span, a crown that admits no
/// compression funicular, or (solved reactions) a springing without a positive thrust.
pub fn rib_funicular(
    model: &Model,
    case: &CaseResult,
    left: usize,
    right: usize,
    crown: Option<usize>,
) -> Result<RibFunicular, StaticsError> {
    let node = |k: usize| -> Result<Point, StaticsError> {
        model
            .nodes
            .get(k)
            .map(|n| Point { x: n.x, y: n.y })
            .ok_or_else(|| invalid("funicular", format!("node {k} does not exist")))
    };
    let (a, b) = (node(left)?, node(right)?);
    let l = check_span(a, b)?;
    let all = node_loads(model, &case.name)?;
    let loads: Vec<VerticalLoad> = all.iter().map(|q| VerticalLoad { x: q.x, p: q.p }).collect();
    check_loads(a, l, &loads)?;
    let inclined = all.iter().any(|q| q.px != 0.0);
    let solver = match (case.reaction(left), case.reaction(right)) {
        (Some(ra), Some(rb)) => Some(SolvedReactions { h: ra.fx, v_a: ra.fy, v_b: rb.fy }),
        _ => None,
    };
    let total: f64 = loads.iter().map(|q| q.p).sum();
    let (method, crown_point, h, v_a, start) = match crown {
        Some(c) => {
            let cp = node(c)?;
            let rise = cp.y - (a.y + (b.y - a.y) * (cp.x - a.x) / l);
            let (h, v_a) = if inclined {
                let tp = three_point_inclined(a, b, cp.x, rise, &all)?;
                (tp.thrust_a, tp.reaction_a)
            } else {
                let tp = three_point(a, b, cp.x, rise, &loads)?;
                (tp.thrust, tp.reaction_a)
            };
            (FunicularMethod::ThreePoint, Some(cp), h, v_a, a)
        }
        None => {
            let r = case.reaction(left).ok_or_else(|| {
                invalid("funicular", "the left springing has no reaction in the results".into())
            })?;
            if !(r.fx.is_finite() && r.fx > 0.0) {
                return Err(invalid(
                    "funicular",
                    format!("the left springing thrust is {:.3e} kN; a pole needs a positive thrust", r.fx),
                ));
            }
            let start = Point { x: a.x, y: a.y - r.mz / r.fx };
            (FunicularMethod::SolvedReactions, None, r.fx, r.fy, start)
        }
    };
    let construction = pole_construction_inclined(&all, h, v_a, start, b.x)?;
    let r_a = -construction.closing_split;
    Ok(RibFunicular {
        case: case.name.clone(),
        model: model.title.clone(),
        method,
        springing_left: a,
        springing_right: b,
        crown: crown_point,
        loads,
        horizontal: if inclined { all.iter().map(|q| q.px).collect() } else { Vec::new() },
        thrust: h,
        vertical_reactions: (v_a, total - v_a),
        beam_reactions: (r_a, total - r_a),
        solver,
        construction,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn pt(x: f64, y: f64) -> Point {
        Point { x, y }
    }

    #[test]
    fn simple_beam_moment_matches_point_load_formula() {
        // M under a point load P at a on span L: P a b / L (any statics text).
        let loads = [VerticalLoad { x: 3.0, p: 10.0 }];
        assert!((simple_beam_moment(0.0, 10.0, &loads, 3.0) - 10.0 * 3.0 * 7.0 / 10.0).abs() < 1e-12);
        assert!((simple_beam_moment(0.0, 10.0, &loads, 8.0) - 10.0 * 3.0 * 2.0 / 10.0).abs() < 1e-12);
        assert_eq!(simple_beam_moment(0.0, 10.0, &loads, 0.0), 0.0);
    }

    /// The running-sum moments equal the direct sum at every point: loads unsorted, two
    /// at one place, one past a support (clamped to it), points at and beyond the
    /// supports and at the loads themselves.
    #[test]
    fn moments_by_running_sums_equal_the_direct_sum() {
        let loads = [
            VerticalLoad { x: 7.5, p: 12.0 },
            VerticalLoad { x: 2.0, p: 5.0 },
            VerticalLoad { x: 7.5, p: -3.0 },
            VerticalLoad { x: 11.0, p: 4.0 },
            VerticalLoad { x: 0.0, p: 9.0 },
            VerticalLoad { x: 4.25, p: 1.5 },
        ];
        let at = [-1.0, 0.0, 2.0, 3.0, 4.25, 5.0, 7.5, 9.99, 10.0, 12.0];
        let fast = simple_beam_moments(0.0, 10.0, &loads, &at);
        for (x, m) in at.iter().zip(&fast) {
            let direct = simple_beam_moment(0.0, 10.0, &loads, *x);
            assert!((m - direct).abs() <= 1e-12 * 100.0, "x = {x}: {m} against {direct}");
        }
        assert_eq!(simple_beam_moments(3.0, 3.0, &loads, &at), vec![0.0; at.len()]);
    }

    #[test]
    fn three_point_equal_loads_lie_on_parabola() {
        // Equal loads at equal spacing: vertices on the parabola through A, C, B
        // (uniform load per horizontal metre gives a parabola; any statics text).
        let (a, b) = (pt(0.0, 0.0), pt(40.0, 6.0));
        let n = 8;
        let loads: Vec<_> = (1..n).map(|i| VerticalLoad { x: 5.0 * i as f64, p: 100.0 }).collect();
        let f = 10.0;
        let r = three_point(a, b, 20.0, f, &loads).expect("valid");
        for (q, y) in loads.iter().zip(&r.y) {
            let para = 6.0 * q.x / 40.0 + 4.0 * f * q.x * (40.0 - q.x) / 1600.0;
            assert!((y - para).abs() < 1e-12, "{y} vs {para}");
        }
        // H = w L^2 / (8 f) with w = 100 / 5 kN/m (parabolic arch under a uniform load;
        // Timoshenko & Young, Theory of Structures, ch. 9, from memory)
        assert!((r.thrust - 20.0 * 1600.0 / 80.0).abs() < 1e-9);
        // V_A - V_B = 2 H (yB - yA) / L with equal simple-beam reactions
        assert!((r.reaction_a - r.reaction_b - 2.0 * r.thrust * 6.0 / 40.0).abs() < 1e-9);
    }

    /// With no horizontal components the inclined construction is the vertical one.
    #[test]
    fn inclined_funicular_of_vertical_loads_is_the_three_point_one() {
        let (a, b) = (pt(0.0, 0.0), pt(40.0, 6.0));
        let xs = [5.0, 12.0, 20.0, 27.0, 33.0];
        let ps = [80.0, 120.0, 95.0, 140.0, 60.0];
        let vertical: Vec<_> = xs.iter().zip(&ps).map(|(&x, &p)| VerticalLoad { x, p }).collect();
        // given out of order: the result follows the order given
        let inclined: Vec<_> = xs.iter().zip(&ps).rev().map(|(&x, &p)| NodeLoad { x, px: 0.0, p }).collect();
        let r = three_point(a, b, 20.0, 9.0, &vertical).expect("valid");
        let q = three_point_inclined(a, b, 20.0, 9.0, &inclined).expect("valid");
        assert!((q.thrust_a - r.thrust).abs() < 1e-12 * r.thrust && q.thrust_a == q.thrust_b);
        assert!((q.reaction_a - r.reaction_a).abs() < 1e-9 && (q.reaction_b - r.reaction_b).abs() < 1e-9);
        for (k, y) in r.y.iter().enumerate() {
            assert!((q.y[xs.len() - 1 - k] - y).abs() < 1e-10, "{k}");
        }
    }

    /// One inclined load at the crown of a three-hinged arch: both halves are straight
    /// struts to the crown, so each reaction lies along its half (statics of the
    /// three-hinged arch, any statics text): H_A = P L / (4 f) - Px / 2 and
    /// H_B = P L / (4 f) + Px / 2 for springings at one level; V_A = H_A 2 f / L.
    #[test]
    fn inclined_load_at_the_crown_splits_the_thrust() {
        let (l, f, p, px) = (30.0, 6.0, 500.0, 40.0);
        let (a, b) = (pt(0.0, 10.0), pt(l, 10.0));
        // a weightless node on each half keeps the halves straight
        let loads = [
            NodeLoad { x: 7.5, px: 0.0, p: 0.0 },
            NodeLoad { x: 15.0, px, p },
            NodeLoad { x: 22.0, px: 0.0, p: 0.0 },
        ];
        let r = three_point_inclined(a, b, 15.0, f, &loads).expect("valid");
        let (ha, hb) = (p * l / (4.0 * f) - px / 2.0, p * l / (4.0 * f) + px / 2.0);
        assert!((r.thrust_a - ha).abs() < 1e-9 * ha, "{} vs {ha}", r.thrust_a);
        assert!((r.thrust_b - hb).abs() < 1e-9 * hb, "{} vs {hb}", r.thrust_b);
        assert!((r.reaction_a - ha * 2.0 * f / l).abs() < 1e-9 * p);
        assert!((r.reaction_a + r.reaction_b - p).abs() < 1e-9 * p);
        assert!((r.y[0] - (10.0 + f / 2.0)).abs() < 1e-9 && (r.y[1] - (10.0 + f)).abs() < 1e-12);
    }

    /// Any loads: no moment at any node of the polygon, taken by statics from the forces
    /// on one side (the reaction at A and the loads left of the node), and overall
    /// equilibrium with the reaction at B.
    #[test]
    fn inclined_funicular_has_no_moment_at_its_nodes() {
        let (a, b) = (pt(0.0, 0.0), pt(50.0, -4.0));
        let loads: Vec<NodeLoad> = (1..10)
            .map(|k| {
                let x = 5.0 * k as f64;
                NodeLoad { x, px: 30.0 * (0.7 * x).sin(), p: 100.0 + 20.0 * (0.3 * x).cos() }
            })
            .collect();
        let r = three_point_inclined(a, b, 25.0, 8.0, &loads).expect("valid");
        for k in 0..loads.len() {
            let at = pt(loads[k].x, r.y[k]);
            // anticlockwise moment about the node of the forces left of it
            let mut m = -(a.y - at.y) * r.thrust_a + (a.x - at.x) * r.reaction_a;
            for (q, y) in loads[..k].iter().zip(&r.y) {
                m += -(y - at.y) * q.px - (q.x - at.x) * q.p;
            }
            assert!(m.abs() < 1e-8 * r.thrust_a * 8.0, "node {k}: {m}");
        }
        let total_px: f64 = loads.iter().map(|q| q.px).sum();
        assert!((r.thrust_b - r.thrust_a - total_px).abs() < 1e-9 * r.thrust_a);
        let total_p: f64 = loads.iter().map(|q| q.p).sum();
        assert!((r.reaction_a + r.reaction_b - total_p).abs() < 1e-9 * total_p);
        // the crown point and B are on the polygon
        assert!((r.y[4] - (-2.0 + 8.0)).abs() < 1e-9);
    }

    /// The error `invalid(location, message)` gives, to match a refusal exactly.
    fn refused(location: &str, message: &str) -> Result<ThreePointFunicular, StaticsError> {
        Err(invalid(location, message.into()))
    }

    /// Each degenerate input is refused by its own check, matched exactly (variant,
    /// location and message): an input let through to another check, or to a NaN
    /// answer, fails here.
    #[test]
    fn three_point_rejects_degenerate_input() {
        let (a, b) = (pt(0.0, 0.0), pt(10.0, 0.0));
        let one = [VerticalLoad { x: 5.0, p: 1.0 }];
        let no_press = "; a compression funicular needs loads that press the crown down";
        // no load: the crown moment is 0
        assert_eq!(
            three_point(a, b, 5.0, 2.0, &[]),
            refused("loads", &format!("the loads give a crown moment of 0.000e0 kNm{no_press}"))
        );
        // an upward load of 1 kN at mid-span: crown moment -P L / 4 = -2.5 kNm
        assert_eq!(
            three_point(a, b, 5.0, 1.0, &[VerticalLoad { x: 5.0, p: -1.0 }]),
            refused("loads", &format!("the loads give a crown moment of -2.500e0 kNm{no_press}"))
        );
        assert_eq!(three_point(a, b, 5.0, 0.0, &one), refused("crown", "rise 0 m must be a positive number"));
        assert_eq!(
            three_point(a, b, 5.0, f64::NAN, &one),
            refused("crown", "rise NaN m must be a positive number")
        );
        assert_eq!(
            three_point(a, b, 10.0, 2.0, &one),
            refused("crown", "crown x = 10 m must lie strictly between the supports")
        );
        assert_eq!(
            three_point(a, b, 5.0, 2.0, &[VerticalLoad { x: 11.0, p: 1.0 }]),
            refused("loads", "load 1 at x = 11 m lies outside the span")
        );
        assert_eq!(
            three_point(a, b, 5.0, 2.0, &[VerticalLoad { x: 5.0, p: f64::INFINITY }]),
            refused("loads", "load 1 is not a finite number")
        );
        assert_eq!(
            three_point(b, a, 5.0, 2.0, &one),
            refused("supports", "support B (x = 0 m) must be to the right of A (x = 10 m)")
        );
        assert_eq!(
            three_point(pt(f64::NAN, 0.0), b, 5.0, 2.0, &one),
            refused("supports", "support coordinates must be finite numbers (m)")
        );
    }

    #[test]
    fn rib_funicular_rejects_loads_it_cannot_draw() {
        // a horizontal load, a missing node, a springing pair in the wrong order: each
        // refused by its own check, matched exactly
        use crate::frame::model::{frame, LoadCase, NodalLoad, Support};
        let mut m = Model::default();
        for (x, y) in [(0.0, 0.0), (5.0, 4.0), (10.0, 0.0)] {
            m.add_node("", x, y);
        }
        let mut left = frame("", "rib", 0, 1, 2e8, 0.1, 0.01);
        left.release_end = true;
        m.add_member(left);
        m.add_member(frame("", "rib", 1, 2, 2e8, 0.1, 0.01));
        m.supports = vec![Support::pinned(0), Support::pinned(2)];
        m.load_cases = vec![LoadCase {
            name: "p".into(),
            nodal: vec![NodalLoad { node: 1, fx: 0.0, fy: -10.0, mz: 0.0 }],
            ..Default::default()
        }];
        let s = crate::frame::solver::solve(&m).expect("stable");
        let f = rib_funicular(&m, &s.cases[0], 0, 2, Some(1)).expect("three-hinged triangle");
        // crown load P on a three-hinged arch: H = P L / (4 f) (statics: moments about the
        // crown of the right half, V_B = P / 2)
        assert!((f.thrust - 10.0 * 10.0 / 16.0).abs() < 1e-12);
        let refused = |location: &str, message: &str| Err(invalid(location, message.into()));
        assert_eq!(
            rib_funicular(&m, &s.cases[0], 2, 0, Some(1)),
            refused("supports", "support B (x = 0 m) must be to the right of A (x = 10 m)")
        );
        assert_eq!(
            rib_funicular(&m, &s.cases[0], 0, 9, Some(1)),
            refused("funicular", "node 9 does not exist")
        );
        assert_eq!(
            rib_funicular(&m, &s.cases[0], 0, 2, Some(7)),
            refused("funicular", "node 7 does not exist")
        );
        // no crown given: the pole from the solved reactions of this (three-hinged) rib
        // also holds, with the same thrust (statics alone)
        let solved = rib_funicular(&m, &s.cases[0], 0, 2, None).expect("pole from reactions");
        assert!((solved.thrust - 10.0 * 10.0 / 16.0).abs() < 1e-9);
        m.load_cases[0].nodal[0].mz = 1.0;
        let s = crate::frame::solver::solve(&m).expect("stable");
        assert_eq!(
            rib_funicular(&m, &s.cases[0], 0, 2, Some(1)),
            refused("load case", "'p' has a couple at node #1; the pole construction needs forces")
        );
    }

    #[test]
    fn pole_construction_reproduces_three_point_polygon() {
        // With the pole at (-H, -V_A) of the three-point solution the polygon passes
        // through B, and the two splits differ by H (yB - yA) / L (moments about each
        // support; any statics text).
        let (a, b) = (pt(0.0, 2.0), pt(30.0, 5.0));
        let loads = [
            VerticalLoad { x: 7.0, p: 40.0 },
            VerticalLoad { x: 15.0, p: 25.0 },
            VerticalLoad { x: 22.0, p: 60.0 },
        ];
        let r = three_point(a, b, 15.0, 6.0, &loads).expect("valid");
        let c = pole_construction(&loads, r.thrust, r.reaction_a, a, b.x).expect("valid");
        let end = c.polygon.last().copied().expect("end");
        assert!((end.y - b.y).abs() < 1e-12);
        for (v, y) in c.polygon[1..4].iter().zip(&r.y) {
            assert!((v.y - y).abs() < 1e-12);
        }
        // closing split = -R_A (simple-beam reaction measured down the load line)
        assert!((c.closing_split + r.beam_reactions.0).abs() < 1e-9);
        assert!((c.closing_split - c.horizontal_split - r.thrust * 3.0 / 30.0).abs() < 1e-9);
        assert_eq!(c.rays.len(), 4);
        assert!((c.load_line[3].y + 125.0).abs() < 1e-12);
    }
}
