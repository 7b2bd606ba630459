//! Goal seek on the rise: the rise that meets one goal, everything else held.
//!
//! The rise ranges over what the layout accepts (`arch::edit::least_rise` to
//! `largest_rise`); the crown keeps the way it is given (a rise, or a level that follows
//! the rise). The quantities are monotonic in the rise over most of that range but not
//! all of it, so each search scans the range first ([`SCAN_STEPS`] rises, evenly spaced)
//! and then refines by bisection inside the bracket the scan found ([`RISE_RESOLUTION`]):
//!
//! - `MaxThrust(H)`: the lowest rise whose form thrust (the larger springing's
//!   horizontal reaction of the form, `arch::form::Form::thrust`, dead load) is at most H;
//! - `SpringingAngle { degrees, side }`: the rise whose dead-load springing resultant at
//!   that springing (the form's reaction, end post and approach span loads included, as
//!   the thrust block receives it) stands at that angle below the horizontal;
//! - `Least(Measure)`: the rise of least cost index or least steel among the rises whose
//!   every member group is sized and passes (the rib's alpha_cr above its least, as
//!   sizing asks); the scan's best, then a golden-section search around it, the best
//!   evaluation of all kept (the measures step with the families' sizes);
//! - `MinClearance(gap)`: the largest rise whose least clear gap between the rib's top
//!   (its extrados: the axis plus half the depth, normal to it) and the deck's underside
//!   (the deck level less the deck girder's depth) over the arch span is at least `gap`.
//!
//! A goal no rise in the range meets is not an error: the report says so with the
//! nearest value and its rise. Concept-design values: local codes and a licensed
//! engineer govern.

use crate::arch::analysis::CAUTION;
use crate::arch::design::Design;
use crate::arch::edit::{largest_rise, least_rise};
use crate::arch::sizing::{frame_traffic, size_design, GroupOutcome};
use crate::arch::validate::ValidDesign;
use crate::error::StaticsError;
use serde::{Deserialize, Serialize};

/// Rises the scan evaluates, evenly spaced from the least to the largest.
pub const SCAN_STEPS: usize = 31;
/// The bisection stops when the bracket is this narrow, m.
pub const RISE_RESOLUTION: f64 = 1e-4;
/// Most bisection or golden-section steps.
const MAX_STEPS: usize = 60;

/// Which springing.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Side {
    /// The left springing.
    Left,
    /// The right springing.
    Right,
}

/// What the least-cost goal minimises.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Measure {
    /// The cost index (`arch::quantities`).
    Cost,
    /// The steel tonnage.
    Steel,
}

/// One goal (module doc).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "goal", rename_all = "snake_case")]
pub enum Goal {
    /// The form thrust at most this, kN.
    MaxThrust {
        /// kN.
        thrust: f64,
    },
    /// The dead-load springing resultant at this angle below the horizontal, degrees.
    SpringingAngle {
        /// Degrees.
        degrees: f64,
        /// At which springing.
        side: Side,
    },
    /// The least cost index or steel.
    Least {
        /// Which.
        measure: Measure,
    },
    /// The least clear gap between rib and deck at least this, m.
    MinClearance {
        /// m.
        gap: f64,
    },
}

impl Goal {
    /// The goal in words.
    pub fn words(&self) -> String {
        match *self {
            Goal::MaxThrust { thrust } => {
                format!(
                    "form thrust (the larger springing's horizontal reaction, dead load) at most {thrust:.1} kN (the \
                     lowest such rise)"
                )
            }
            Goal::SpringingAngle { degrees, side } => format!(
                "dead-load resultant at the {} springing {degrees:.2} degrees below the horizontal",
                if side == Side::Left { "left" } else { "right" }
            ),
            Goal::Least { measure: Measure::Cost } => {
                "least cost index, every group sized and passing".into()
            }
            Goal::Least { measure: Measure::Steel } => "least steel, every group sized and passing".into(),
            Goal::MinClearance { gap } => {
                format!("clear gap between rib and deck at least {gap:.3} m (the largest such rise)")
            }
        }
    }

    /// The unit of the goal's value.
    pub fn unit(&self) -> &'static str {
        match self {
            Goal::MaxThrust { .. } => "kN",
            Goal::SpringingAngle { .. } => "degrees",
            Goal::Least { measure: Measure::Cost } => "(cost index)",
            Goal::Least { measure: Measure::Steel } => "t",
            Goal::MinClearance { .. } => "m",
        }
    }
}

/// What a seek found.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SeekReport {
    /// The goal.
    pub goal: Goal,
    /// The goal in words.
    pub goal_words: String,
    /// Whether a rise in the range meets it.
    pub met: bool,
    /// The rise found (or the nearest), m.
    pub rise: f64,
    /// The goal's quantity at that rise, in the goal's unit.
    pub value: f64,
    /// The range searched, m: the least and largest rise the layout accepts.
    pub range: [f64; 2],
    /// Designs evaluated.
    pub evaluations: usize,
    /// What was held, in words.
    pub held: String,
    /// The outcome in words: how close it got, or why it could not.
    pub message: String,
    /// The design at `rise` (the one found, or the nearest).
    #[serde(skip)]
    pub design: Design,
    /// Caution.
    pub caution: String,
}

/// The least clear gap between the rib's extrados and the deck's underside over the arch
/// span of `valid`, m (module doc): at both ends of every rib segment, the extrados being
/// the segment's axis moved up by half the rib's depth normal to it.
pub fn clearance(valid: &ValidDesign) -> f64 {
    let d = valid.design();
    let underside = d.deck.level - d.groups.deck.depth;
    let half = 0.5 * d.groups.rib.depth;
    let rib = &valid.form().rib;
    rib.iter()
        .zip(rib.iter().skip(1))
        .flat_map(|(a, b)| {
            let (dx, dy) = (b.x - a.x, b.y - a.y);
            let length = dx.hypot(dy);
            let up = if length > 0.0 { half * length / dx.abs().max(1e-12) } else { half };
            // vertical offset of the extrados: half the depth over the cosine
            [underside - (a.y + up), underside - (b.y + up)]
        })
        .fold(f64::INFINITY, f64::min)
}

/// The goal's quantity for `design`, or why it has none (does not validate, or a group
/// is not sized or fails).
fn quantity(design: &Design, goal: &Goal) -> Result<f64, String> {
    let valid = ValidDesign::new(design).map_err(|e| e.to_string())?;
    match *goal {
        Goal::MaxThrust { .. } => Ok(valid.form().thrust),
        Goal::SpringingAngle { side, .. } => {
            let r = if side == Side::Left { valid.form().reaction_left } else { valid.form().reaction_right };
            Ok(r.fy.atan2(r.fx.abs()).to_degrees())
        }
        Goal::MinClearance { .. } => Ok(clearance(&valid)),
        Goal::Least { measure } => {
            // sized from the validation above (`size_of` would validate again)
            let traffic = frame_traffic(&valid).map_err(|e| e.to_string())?;
            let report = size_design(&valid, &traffic).map_err(|e| e.to_string())?;
            for g in &report.sizing.groups {
                if let GroupOutcome::NotSized { reason } = &g.outcome {
                    return Err(format!("{}: {reason}", g.group));
                }
                if g.utilisation.is_some_and(|u| u > 1.0) {
                    return Err(format!("{} fails its checks", g.group));
                }
            }
            Ok(match measure {
                Measure::Cost => report.quantities.cost_index,
                Measure::Steel => report.quantities.steel,
            })
        }
    }
}

fn with_rise(design: &Design, rise: f64) -> Design {
    let mut d = design.clone();
    d.set_rise(rise);
    d
}

/// Seeks the rise of `design` that meets `goal` (module doc).
///
/// Errors: `design` itself does not validate (no range to search), or a goal's target is
/// not a finite number (a gap below zero or an angle outside 0 to 90 degrees included).
pub fn seek(design: &Design, goal: Goal) -> Result<SeekReport, StaticsError> {
    let refuse = |why: String| StaticsError::invalid("goal", why);
    match goal {
        Goal::MaxThrust { thrust } if !(thrust.is_finite() && thrust > 0.0) => {
            return Err(refuse(format!("a thrust of {thrust} kN: give a positive number")));
        }
        Goal::SpringingAngle { degrees, .. } if !(degrees.is_finite() && degrees > 0.0 && degrees < 90.0) => {
            return Err(refuse(format!("an angle of {degrees} degrees: give one between 0 and 90")));
        }
        Goal::MinClearance { gap } if !(gap.is_finite() && gap >= 0.0) => {
            return Err(refuse(format!("a clear gap of {gap} m: give zero or more")));
        }
        _ => {}
    }
    let low = least_rise(design)?.rise;
    let high = largest_rise(design)?.rise;
    let mut evaluations = 0usize;
    let mut eval = |rise: f64| {
        evaluations += 1;
        quantity(&with_rise(design, rise), &goal)
    };
    let rises: Vec<f64> =
        (0..SCAN_STEPS).map(|i| low + (high - low) * i as f64 / (SCAN_STEPS - 1) as f64).collect();
    let scan: Vec<(f64, Result<f64, String>)> = rises.iter().map(|&r| (r, eval(r))).collect();
    let ok: Vec<(f64, f64)> = scan.iter().filter_map(|(r, v)| v.as_ref().ok().map(|v| (*r, *v))).collect();
    let Some(&first) = ok.first() else {
        let why = scan.iter().find_map(|(_, v)| v.as_ref().err().cloned()).unwrap_or_default();
        return Err(refuse(format!("no rise from {low:.3} to {high:.3} m can be evaluated: {why}")));
    };
    // the outcome: (met, rise, value, how)
    let (met, rise, value) = match goal {
        Goal::MaxThrust { thrust } => {
            // the lowest rise at or below the thrust: the first scan point that is, and
            // the boundary between it and the point before
            match ok.iter().enumerate().find(|(_, (_, h))| *h <= thrust) {
                None => {
                    let (r, h) =
                        ok.iter()
                            .copied()
                            .fold((f64::NAN, f64::INFINITY), |b, p| if p.1 < b.1 { p } else { b });
                    (false, r, h)
                }
                Some((i, &at)) => match i.checked_sub(1).and_then(|before| ok.get(before)) {
                    None => (true, at.0, at.1),
                    Some(&before) => {
                        let (r, h) = boundary(before, at, &mut eval, |h| h <= thrust);
                        (true, r, h)
                    }
                },
            }
        }
        Goal::SpringingAngle { degrees, .. } => {
            let crossing =
                ok.iter().zip(ok.iter().skip(1)).find(|(p, q)| (p.1 - degrees) * (q.1 - degrees) <= 0.0);
            match crossing {
                Some((&p, &q)) => {
                    let rising = q.1 >= p.1;
                    let (a, b) = boundary(p, q, &mut eval, |v| (v >= degrees) == rising);
                    // the nearer of the two sides of the final bracket is within it
                    (true, a, b)
                }
                None => {
                    let p = ok.iter().copied().fold((f64::NAN, f64::INFINITY), |best, p| {
                        if (p.1 - degrees).abs() < (best.1 - degrees).abs() {
                            p
                        } else {
                            best
                        }
                    });
                    (false, p.0, p.1)
                }
            }
        }
        Goal::MinClearance { gap } => match ok.iter().enumerate().rev().find(|(_, (_, g))| *g >= gap) {
            None => {
                let p = ok
                    .iter()
                    .copied()
                    .fold((f64::NAN, f64::NEG_INFINITY), |b, p| if p.1 > b.1 { p } else { b });
                (false, p.0, p.1)
            }
            Some((i, &at)) => match ok.get(i + 1) {
                None => (true, at.0, at.1),
                Some(&after) => {
                    // the last rise keeping the gap: the boundary from the other side
                    let (r, g) = boundary(after, at, &mut eval, |g| g >= gap);
                    (true, r, g)
                }
            },
        },
        Goal::Least { .. } => {
            // the first least value
            let (i, best) = ok
                .iter()
                .enumerate()
                .fold((0, first), |(b, bp), (i, &p)| if p.1 < bp.1 { (i, p) } else { (b, bp) });
            let lo = i.checked_sub(1).and_then(|before| ok.get(before)).unwrap_or(&best).0;
            let hi = ok.get(i + 1).unwrap_or(&best).0;
            let (r, v) = golden(lo, hi, best, &mut eval);
            (true, r, v)
        }
    };
    let found = with_rise(design, rise);
    let held = "everything but the rise held (springings, span, deck, panels, sections, loads); the crown follows the \
                rise"
        .to_string();
    let unit = goal.unit();
    let message = if met {
        match goal {
            Goal::MaxThrust { thrust } if rise <= low + 1e-9 && value < thrust => format!(
                "met at the least rise the layout accepts, {rise:.3} m: the form thrust is {value:.1} kN, under \
                 {thrust:.1} kN"
            ),
            Goal::MaxThrust { thrust } => {
                format!("met: rise {rise:.4} m, form thrust {value:.1} kN (target at most {thrust:.1} kN)")
            }
            Goal::SpringingAngle { degrees, .. } => {
                format!("met: rise {rise:.4} m, resultant at {value:.4} degrees (target {degrees:.4})")
            }
            Goal::MinClearance { gap } if rise >= high - 1e-9 => format!(
                "met at the largest rise the layout accepts, {rise:.3} m: the least clear gap is {value:.3} m \
                 (target at least {gap:.3} m)"
            ),
            Goal::MinClearance { gap } => {
                format!("met: rise {rise:.4} m, least clear gap {value:.4} m (target at least {gap:.3} m)")
            }
            Goal::Least { .. } => format!(
                "least at rise {rise:.3} m: {value:.2} {unit} (of {} designs evaluated; the best of a {SCAN_STEPS}-rise \
                 scan, refined around it)",
                evaluations
            ),
        }
    } else {
        format!(
            "no rise from {low:.3} to {high:.3} m meets the goal: the nearest is {value:.3} {unit} at rise {rise:.3} \
             m"
        )
    };
    Ok(SeekReport {
        goal,
        goal_words: goal.words(),
        met,
        rise,
        value,
        range: [low, high],
        evaluations,
        held,
        message,
        design: found,
        caution: CAUTION.into(),
    })
}

/// Bisection between `outside` (the goal's test false) and `inside` (true), on the rise;
/// returns the last rise found inside, with its value. A rise that cannot be evaluated
/// counts as outside.
fn boundary(
    outside: (f64, f64),
    inside: (f64, f64),
    eval: &mut impl FnMut(f64) -> Result<f64, String>,
    test: impl Fn(f64) -> bool,
) -> (f64, f64) {
    let (mut out, mut inn) = (outside.0, inside);
    for _ in 0..MAX_STEPS {
        if (inn.0 - out).abs() <= RISE_RESOLUTION {
            break;
        }
        let mid = 0.5 * (out + inn.0);
        match eval(mid) {
            Ok(v) if test(v) => inn = (mid, v),
            _ => out = mid,
        }
    }
    inn
}

/// Golden-section search for the least value on [lo, hi], starting from `best`; returns
/// the best evaluation of all (a step function is not unimodal: the search only ever
/// improves on `best`). Rises that cannot be evaluated count as no better.
fn golden(
    lo: f64,
    hi: f64,
    best: (f64, f64),
    eval: &mut impl FnMut(f64) -> Result<f64, String>,
) -> (f64, f64) {
    let ratio = (5f64.sqrt() - 1.0) / 2.0;
    let mut best = best;
    let (mut a, mut b) = (lo, hi);
    let mut value = |r: f64, best: &mut (f64, f64)| {
        let v = eval(r).unwrap_or(f64::INFINITY);
        if v < best.1 {
            *best = (r, v);
        }
        v
    };
    let mut c = b - ratio * (b - a);
    let mut d = a + ratio * (b - a);
    let (mut fc, mut fd) = (value(c, &mut best), value(d, &mut best));
    for _ in 0..MAX_STEPS {
        if (b - a).abs() <= 1e-3 {
            break;
        }
        if fc <= fd {
            b = d;
            d = c;
            fd = fc;
            c = b - ratio * (b - a);
            fc = value(c, &mut best);
        } else {
            a = c;
            c = d;
            fc = fd;
            d = a + ratio * (b - a);
            fd = value(d, &mut best);
        }
    }
    best
}

/// A design shaped to a form thrust: what dragging the pole of the rib's force diagram
/// asks for.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ShapedByThrust {
    /// The thrust asked for, kN.
    pub asked: f64,
    /// The form thrust of the design, kN (the asked one unless a limit stopped it).
    pub thrust: f64,
    /// Its rise, m.
    pub rise: f64,
    /// Fixed-point steps taken.
    pub steps: usize,
    /// Why the thrust asked for cannot be reached (the pole stops at the limit of the
    /// rise), in words (SI); `None` when it is reached.
    pub stopped: Option<String>,
    /// The limit that stopped it (to say it in other units).
    #[serde(skip)]
    pub limit: Option<crate::arch::edit::RiseLimit>,
    /// The design.
    #[serde(skip)]
    pub design: Design,
}

/// Relative thrust tolerance of [`shape_for_thrust`].
pub const THRUST_TOLERANCE: f64 = 1e-10;

/// The rise of `design` whose form thrust is `thrust` (kN), everything else held: the
/// pole of the rib's load line moved to distance H from it, the funicular through the
/// springings and the crown point following (f = M0 / H with M0 the simple-beam moment
/// at the crown x of the loads, for a three-point funicular; any graphic statics text).
/// The loads follow the shape (the rib's self-weight, the posts' lengths), so the rise
/// is found by the fixed point f_(k+1) = f_k H(f_k) / H, exact where M0 does not depend
/// on the shape, to [`THRUST_TOLERANCE`] relative. A thrust below what the largest
/// rise gives (or above what the least gives) stops at that rise, saying why.
///
/// Errors: `design` does not validate, or the thrust is not a positive number.
pub fn shape_for_thrust(design: &Design, thrust: f64) -> Result<ShapedByThrust, StaticsError> {
    if !(thrust.is_finite() && thrust > 0.0) {
        return Err(StaticsError::invalid(
            "thrust",
            format!("a thrust of {thrust} kN: give a positive number"),
        ));
    }
    let mut rise = design.rise();
    let mut current = ValidDesign::new(design)?.form().thrust;
    let mut steps = 0;
    let mut stopped = None;
    let mut limit_reached = None;
    let mut shaped = design.clone();
    for _ in 0..MAX_STEPS {
        if (current - thrust).abs() <= THRUST_TOLERANCE * thrust {
            break;
        }
        steps += 1;
        let next = rise * current / thrust;
        let candidate = with_rise(design, next);
        match ValidDesign::new(&candidate) {
            Ok(v) => {
                rise = next;
                current = v.form().thrust;
                shaped = candidate;
            }
            Err(_) => {
                // beyond what the layout accepts: stop at its limit
                let limit = if next > rise { largest_rise(design)? } else { least_rise(design)? };
                let at = with_rise(design, limit.rise);
                current = ValidDesign::new(&at)?.form().thrust;
                rise = limit.rise;
                shaped = at;
                stopped = Some(limit.describe(crate::units::Units::Si));
                limit_reached = Some(limit);
                break;
            }
        }
    }
    Ok(ShapedByThrust {
        asked: thrust,
        thrust: current,
        rise,
        steps,
        stopped,
        limit: limit_reached,
        design: shaped,
    })
}
