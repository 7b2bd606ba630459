//! Editing a design by moving its points: the drag handles of the elevation, the design
//! after a handle moves (snapped to a grid or free), the furthest valid position along
//! the way to a refused one, and the range of rise the layout accepts.
//!
//! Everything here is a pure function of the design; the app wires it to the pointer.
//! Units: m. Axes x right, y up.

use crate::arch::analysis::analyze;
use crate::arch::design::Design;
use crate::arch::form::Form;
use crate::arch::validate::ValidDesign;
use crate::error::{Field, Location, Problem, StaticsError};
use crate::geom::Point;
use crate::units::{Quantity, Units};
use std::fmt;

/// Grid of a snapped drag, m: levels, rise and ground points move in steps of 0.1 m
/// (a concept design reads levels to the decimetre; common practice for sketch levels).
pub const SNAP_STEP: f64 = 0.1;

/// Resolution of the searches for a limit (the last valid drag position, the least and
/// largest rise), m: a tenth of a millimetre, well under anything shown (levels are
/// shown to the centimetre at most) and reached in under 20 bisections for any span.
pub const LIMIT_RESOLUTION: f64 = 1e-4;

/// Most bisection steps of a search for a limit (a guard: `LIMIT_RESOLUTION` is reached
/// long before for any distance below 100 km).
const MAX_BISECTIONS: usize = 60;

/// How close below the deck axis a rib node at the largest rise counts as reaching it,
/// m: ten times `LIMIT_RESOLUTION` (a node's level changes by about the change of rise
/// or less, so the node that stopped the search is within the resolution of the deck).
const AT_DECK: f64 = 10.0 * LIMIT_RESOLUTION;

/// Something on the elevation that a drag moves.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Handle {
    /// The crown: moves the rise (the crown level follows; the design keeps the way it
    /// gives the crown).
    Crown,
    /// A springing: moves its level; its x follows the valley wall.
    Springing {
        /// Left springing when true.
        left: bool,
    },
    /// The deck: moves its level (a line handle, grabbed anywhere between the seats).
    Deck,
    /// A ground point of the valley section (0-based index).
    Ground(usize),
}

impl Handle {
    /// The design field the handle edits, as the panels name it (`Field::label`): the
    /// crown edits the rise.
    pub fn field(self) -> Field {
        match self {
            Handle::Crown => Field::CrownRise,
            Handle::Springing { left: true } => Field::SpringingLeftLevel,
            Handle::Springing { left: false } => Field::SpringingRightLevel,
            Handle::Deck => Field::DeckLevel,
            Handle::Ground(i) => Field::ValleyPoint(i),
        }
    }

    /// The value the handle sets in `design`, m: the rise for the crown, the level for a
    /// springing or the deck (`x` is `None` for these), both coordinates for a ground
    /// point (`None` when the design has no such point).
    pub fn reading(self, design: &Design) -> Option<Reading> {
        let level = |y: f64| Some(Reading { field: self.field(), x: None, y });
        match self {
            Handle::Crown => level(design.rise()),
            Handle::Springing { left: true } => level(design.springing_left_level),
            Handle::Springing { left: false } => level(design.springing_right_level),
            Handle::Deck => level(design.deck.level),
            Handle::Ground(i) => {
                design.valley.get(i).map(|p| Reading { field: self.field(), x: Some(p.x), y: p.y })
            }
        }
    }

    /// Where the handle is drawn, m: the crown and springings of the found form, a ground
    /// point of the valley; the deck at the mid-point between its seats. `None` for a
    /// ground point the design does not have.
    pub fn point(self, design: &Design, form: &Form) -> Option<Point> {
        match self {
            Handle::Crown => Some(form.crown),
            Handle::Springing { left: true } => Some(form.springing_left),
            Handle::Springing { left: false } => Some(form.springing_right),
            Handle::Deck => Some(Point::new(
                0.5 * (design.deck.left_seat_x + design.deck.right_seat_x),
                design.deck.level,
            )),
            Handle::Ground(i) => design.valley.get(i).map(|p| Point::new(p.x, p.y)),
        }
    }
}

/// What a drag sets, for showing beside the pointer: the design field and its value(s), m.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Reading {
    /// The design field.
    pub field: Field,
    /// The horizontal position, for a ground point; `None` for a level or the rise.
    pub x: Option<f64>,
    /// The level (or the rise, for the crown), m.
    pub y: f64,
}

impl Reading {
    /// In words, in `units`: "rise 22.40 m", "ground point 4: x 30.00 m, y 76.00 m".
    pub fn describe(&self, units: Units) -> String {
        let length = |v: f64| units.show(Quantity::Length, v);
        match self.x {
            None => format!("{} {}", self.field, length(self.y)),
            Some(x) => format!("{}: x {}, y {}", self.field, length(x), length(self.y)),
        }
    }
}

/// The point handles of a design whose form is `form`: crown, springings, then every
/// ground point, each with where it is drawn (m). The deck is a line handle: see
/// [`deck_line`].
pub fn point_handles(design: &Design, form: &Form) -> Vec<(Handle, Point)> {
    let mut handles = vec![
        (Handle::Crown, form.crown),
        (Handle::Springing { left: true }, form.springing_left),
        (Handle::Springing { left: false }, form.springing_right),
    ];
    handles.extend(design.valley.iter().enumerate().map(|(i, g)| (Handle::Ground(i), Point::new(g.x, g.y))));
    handles
}

/// The deck's line handle: the deck axis from the left seat to the right seat, m.
pub fn deck_line(design: &Design) -> (Point, Point) {
    (
        Point::new(design.deck.left_seat_x, design.deck.level),
        Point::new(design.deck.right_seat_x, design.deck.level),
    )
}

/// How a drag places the value it sets.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Snapping {
    /// On multiples of [`SNAP_STEP`] (the rise for the crown, the level for a springing or
    /// the deck, both coordinates of a ground point).
    ToGrid,
    /// Where the pointer is.
    Free,
}

impl Snapping {
    fn apply(self, v: f64) -> f64 {
        match self {
            Snapping::ToGrid => snap(v),
            Snapping::Free => v,
        }
    }
}

/// `v` rounded to the nearest multiple of [`SNAP_STEP`], m (computed as a whole count of
/// steps divided by the step count per metre, so 22.4 comes out as the nearest double to
/// 22.4, not 22.400000000000002). Non-finite values pass unchanged.
pub fn snap(v: f64) -> f64 {
    let per_metre = 1.0 / SNAP_STEP;
    (v * per_metre).round() / per_metre
}

/// The nearest multiple of [`SNAP_STEP`] from `v` towards `towards` (or `v` itself when it
/// is one), m: the grid value that does not pass `v` going away from `towards`.
fn snap_towards(v: f64, towards: f64) -> f64 {
    let per_metre = 1.0 / SNAP_STEP;
    let steps = v * per_metre;
    // a value within round-off of a grid point is that grid point
    let nearest = steps.round();
    if (steps - nearest).abs() < 1e-9 {
        return nearest / per_metre;
    }
    let steps = if towards < v { steps.floor() } else { steps.ceil() };
    steps / per_metre
}

/// The design after moving `handle` to world point (x, y), m (x matters only for a
/// ground point). The crown sets the rise to y minus the chord level at the crown
/// (`Design::set_rise`, which keeps the way the crown is given); a springing or the deck
/// sets its level to y; a ground point moves to (x, y). With `Snapping::ToGrid` the value
/// set is rounded to [`SNAP_STEP`]. A ground point the design does not have changes
/// nothing. No validation: see [`drag_to`].
pub fn moved(design: &Design, handle: Handle, x: f64, y: f64, snapping: Snapping) -> Design {
    let mut d = design.clone();
    match handle {
        Handle::Crown => {
            let rise = snapping.apply(y - d.chord_level_at_crown());
            d.set_rise(rise);
        }
        Handle::Springing { left: true } => d.springing_left_level = snapping.apply(y),
        Handle::Springing { left: false } => d.springing_right_level = snapping.apply(y),
        Handle::Deck => d.deck.level = snapping.apply(y),
        Handle::Ground(i) => {
            if let Some(p) = d.valley.get_mut(i) {
                p.x = snapping.apply(x);
                p.y = snapping.apply(y);
            }
        }
    }
    d
}

/// The result of one step of a drag.
#[derive(Debug, Clone, PartialEq)]
pub struct DragStep {
    /// The design to show: the moved design when it is accepted, otherwise the furthest
    /// accepted one on the way there (the design the drag started from when none is).
    pub design: Design,
    /// Why the drag stopped short: the refusal just past the furthest accepted position
    /// (the limit that governs there). `None` when the moved design is accepted.
    pub stopped: Option<StaticsError>,
}

/// One step of a drag: moves `handle` of `from` (an accepted design) towards world point
/// (x, y), m, and returns the moved design when `accept` takes it. Otherwise it bisects
/// on the handle's coordinate(s) along the straight path from where the handle is in
/// `from` to (x, y) for the furthest position `accept` takes, to [`LIMIT_RESOLUTION`],
/// so a drag past a limit stops at the limit instead of at the last pointer event. With
/// `Snapping::ToGrid` that position is then moved back towards `from` onto the grid
/// (and checked again); when no grid value lies between, `from` is returned. The refusal
/// returned is the one just past the furthest accepted position.
///
/// `accept` is the check the caller keeps designs by (`analyze` in the app, see
/// [`drag_to`]); it is assumed to take `from`. Bisection finds one boundary on the path:
/// where validity changes more than once along it, the position found is accepted but
/// not necessarily the furthest of all.
pub fn drag_to_with(
    from: &Design,
    handle: Handle,
    x: f64,
    y: f64,
    snapping: Snapping,
    mut accept: impl FnMut(&Design) -> Result<(), StaticsError>,
) -> DragStep {
    let candidate = moved(from, handle, x, y, snapping);
    let refusal = match accept(&candidate) {
        Ok(()) => return DragStep { design: candidate, stopped: None },
        Err(e) => e,
    };
    // the handle's coordinates in `from`, in the space `moved` takes (the crown by its
    // level, found from the rise so that a crown given by rise moves alike)
    let start = match handle {
        Handle::Crown => (x, from.crown_level()),
        Handle::Springing { left: true } => (x, from.springing_left_level),
        Handle::Springing { left: false } => (x, from.springing_right_level),
        Handle::Deck => (x, from.deck.level),
        Handle::Ground(i) => match from.valley.get(i) {
            Some(p) => (p.x, p.y),
            None => return DragStep { design: from.clone(), stopped: Some(refusal) },
        },
    };
    let along = |t: f64| (start.0 + t * (x - start.0), start.1 + t * (y - start.1));
    let distance = (x - start.0).hypot(y - start.1);
    if !distance.is_finite() {
        return DragStep { design: from.clone(), stopped: Some(refusal) };
    }
    // t = 0 is accepted (`from`), t = 1 refused
    let (mut lo, mut hi, mut beyond) = (0.0f64, 1.0f64, refusal);
    for _ in 0..MAX_BISECTIONS {
        if (hi - lo) * distance <= LIMIT_RESOLUTION {
            break;
        }
        let mid = 0.5 * (lo + hi);
        let (px, py) = along(mid);
        match accept(&moved(from, handle, px, py, Snapping::Free)) {
            Ok(()) => lo = mid,
            Err(e) => {
                hi = mid;
                beyond = e;
            }
        }
    }
    let (px, py) = along(lo);
    let stopped = Some(beyond);
    match snapping {
        Snapping::Free if lo == 0.0 => DragStep { design: from.clone(), stopped },
        Snapping::Free => DragStep { design: moved(from, handle, px, py, Snapping::Free), stopped },
        Snapping::ToGrid => {
            // the grid value between `from` and the limit nearest the limit (for the crown
            // the grid is on the rise); none when the nearest lies behind the start
            let behind = |g: f64, s: f64, v: f64| (g - s) * (v - s) < 0.0;
            if let Handle::Ground(_) = handle {
                let (gx, gy) = (snap_towards(px, start.0), snap_towards(py, start.1));
                let grid = moved(from, handle, gx, gy, Snapping::Free);
                let back = behind(gx, start.0, px) || behind(gy, start.1, py);
                let design =
                    if !back && grid != *from && accept(&grid).is_ok() { grid } else { from.clone() };
                // the refusal the user reads: one grid step further along each coordinate
                // that moves (round numbers), as for a level below
                let further = |g: f64, s: f64, target: f64| {
                    if target == s {
                        g
                    } else {
                        snap(g + SNAP_STEP.copysign(target - s))
                    }
                };
                let next =
                    moved(from, handle, further(gx, start.0, x), further(gy, start.1, y), Snapping::Free);
                let stopped = match accept(&next) {
                    Err(e) => Some(e),
                    Ok(()) => stopped,
                };
                return DragStep { design, stopped };
            }
            // one value: the rise for the crown, a level otherwise
            let offset = if handle == Handle::Crown { from.chord_level_at_crown() } else { 0.0 };
            let set = |value: f64| {
                let mut d = from.clone();
                match handle {
                    Handle::Crown => d.set_rise(value),
                    _ => d = moved(from, handle, px, value, Snapping::Free),
                }
                d
            };
            let (s, v, target) = (start.1 - offset, py - offset, y - offset);
            let g = snap_towards(v, s);
            let grid = set(g);
            let design =
                if !behind(g, s, v) && grid != *from && accept(&grid).is_ok() { grid } else { from.clone() };
            // the refusal the user reads: of the next grid value, a round number, rather
            // than of the bisection's last point
            let next = snap(g + SNAP_STEP.copysign(target - s));
            let stopped = match accept(&set(next)) {
                Err(e) => Some(e),
                Ok(()) => stopped,
            };
            DragStep { design, stopped }
        }
    }
}

/// [`drag_to_with`] keeping the designs that `analyse` takes, as the app does: the moved
/// design and the position found are analysed (in the app `analyze`, through its cache,
/// so a design shown is analysed once; validation, the models and their solution); the
/// search between them validates only (`ValidDesign::new`, some hundred times cheaper,
/// and what decides a position in all but a mechanism). A position found that validates
/// but is not analysed leaves the drag at `from`. `analyse` is called at most twice, and
/// last on the design returned when that is not `from`.
pub fn drag_to(
    from: &Design,
    handle: Handle,
    x: f64,
    y: f64,
    snapping: Snapping,
    mut analyse: impl FnMut(&Design) -> Result<(), StaticsError>,
) -> DragStep {
    let candidate = moved(from, handle, x, y, snapping);
    let refusal = match analyse(&candidate) {
        Ok(()) => return DragStep { design: candidate, stopped: None },
        Err(e) => e,
    };
    let step = drag_to_with(from, handle, x, y, snapping, |d| ValidDesign::new(d).map(|_| ()));
    let stopped = Some(step.stopped.unwrap_or(refusal));
    if step.design == *from || analyse(&step.design).is_ok() {
        DragStep { design: step.design, stopped }
    } else {
        DragStep { design: from.clone(), stopped }
    }
}

/// `analyze` as a check for [`drag_to`]: the design's refusal, or nothing.
pub fn analyses(design: &Design) -> Result<(), StaticsError> {
    analyze(design).map(|_| ())
}

/// Why a drag stopped short of the pointer.
#[derive(Debug, Clone, PartialEq)]
pub enum DragStop {
    /// The crown is held within a grid step below the largest rise the layout takes
    /// (what governs it and where the funicular's highest point is are in the limit).
    LargestRise(RiseLimit),
    /// The design just past the position held is refused, for this reason.
    Refused(StaticsError),
}

/// One step of a [`Drag`]: the design to show and why it stops short of the pointer.
#[derive(Debug, Clone, PartialEq)]
pub struct DragOutcome {
    /// The design to show (as [`DragStep::design`]).
    pub design: Design,
    /// Why it stops short of the pointer; `None` when the pointer's position is taken.
    pub stop: Option<DragStop>,
}

/// A drag of one handle, from pointer down to pointer up. It keeps what a drag works out
/// once: the crown's largest rise, sought at the first stop above the crown (only the
/// rise changes during a crown drag, so the limit holds for the whole drag; the search
/// costs some twenty validations and a drag held past the limit steps on every pointer
/// move).
#[derive(Debug, Clone, PartialEq)]
pub struct Drag {
    /// The handle dragged.
    pub handle: Handle,
    /// The largest rise, once sought (`None` inside when the design shown had none: it
    /// was refused, which a design shown never is).
    largest: Option<Option<RiseLimit>>,
}

impl Drag {
    /// A drag of `handle`, nothing worked out yet.
    pub fn new(handle: Handle) -> Drag {
        Drag { handle, largest: None }
    }

    /// The crown's largest rise, once a stop has needed it.
    pub fn largest_rise(&self) -> Option<&RiseLimit> {
        self.largest.as_ref().and_then(Option::as_ref)
    }

    /// One step: [`drag_to`] from `from` (the design shown) towards world point (x, y), m,
    /// with `analyse` as its check, and the reason for a stop. A crown stopped on its way
    /// up within a grid step ([`SNAP_STEP`], plus the search's resolution) below the
    /// largest rise is held by that limit, told as [`DragStop::LargestRise`]; any other
    /// stop gives the refusal just past the position held.
    pub fn step(
        &mut self,
        from: &Design,
        x: f64,
        y: f64,
        snapping: Snapping,
        analyse: impl FnMut(&Design) -> Result<(), StaticsError>,
    ) -> DragOutcome {
        let step = drag_to(from, self.handle, x, y, snapping, analyse);
        let Some(refusal) = step.stopped else {
            return DragOutcome { design: step.design, stop: None };
        };
        let shown = &step.design;
        // the crown on its way up: the moved rise is y less the chord level at the crown
        let upward = self.handle == Handle::Crown && y > shown.crown_level();
        if upward {
            let limit = self.largest.get_or_insert_with(|| largest_rise(shown).ok());
            if let Some(limit) = limit {
                if shown.rise() >= limit.rise - SNAP_STEP - LIMIT_RESOLUTION {
                    let stop = Some(DragStop::LargestRise(limit.clone()));
                    return DragOutcome { design: step.design, stop };
                }
            }
        }
        DragOutcome { design: step.design, stop: Some(DragStop::Refused(refusal)) }
    }
}

/// What stops the rise from going further.
#[derive(Debug, Clone, PartialEq)]
pub enum RiseBound {
    /// The crown reaches the deck level: the rib axis may rise to the deck axis at the
    /// crown and no further (a largest rise only).
    CrownAtDeck,
    /// A rib node off the crown reaches the deck axis first (the funicular's highest
    /// point is not at the crown x, as with unequal springings): a largest rise only.
    RibAtDeck {
        /// x of that rib node, m.
        x: f64,
    },
    /// The rise must stay positive (a least rise only, when every smaller positive rise
    /// down to [`LIMIT_RESOLUTION`] is accepted).
    PositiveRise,
    /// Just past the limit validation refuses the design with these problems (the rib
    /// below the ground, the shortest post leaving no spandrel, ...).
    Refused(Vec<Problem>),
    /// Just past the limit form finding does not settle (or another refusal that is not
    /// a list of problems), in words.
    Other(String),
}

/// A limit of the rise the layout accepts with everything else as given.
#[derive(Debug, Clone, PartialEq)]
pub struct RiseLimit {
    /// The rise at the limit, m (accepted by validation, to [`LIMIT_RESOLUTION`]).
    pub rise: f64,
    /// The crown level at the limit, m.
    pub crown_level: f64,
    /// True for the largest rise, false for the least.
    pub largest: bool,
    /// What stops the rise going further.
    pub bound: RiseBound,
    /// The highest point of the rib's funicular at the limit: its highest rib node (a
    /// springing when the rib hardly rises above the higher one), m.
    pub highest: Point,
    /// The crown x, midway between the springings, m (where the rise is measured).
    pub mid_span_x: f64,
    /// True when the springings are at different levels: the funicular's highest point
    /// is then off mid-span (the rise is still measured at mid-span, from the chord).
    pub unequal_springings: bool,
}

impl RiseLimit {
    /// The limit in words, in `units`, for a hint beside the rise or a status line, e.g.
    /// "the largest rise the layout takes is 21.72 m (crown level 99.72 m): above it the
    /// rib reaches the deck at x = 92.08 m, right of mid-span (x = 83.21 m); with unequal
    /// springings the funicular's highest point is not at mid-span".
    pub fn describe(&self, units: Units) -> String {
        let length = |v: f64| units.show(Quantity::Length, v);
        let (which, past) = if self.largest { ("largest", "above") } else { ("least", "below") };
        let mut s = format!(
            "the {which} rise the layout takes is {} (crown level {})",
            length(self.rise),
            length(self.crown_level)
        );
        match &self.bound {
            RiseBound::CrownAtDeck => s.push_str(": there the crown reaches the deck"),
            RiseBound::RibAtDeck { x } => {
                let side = if *x > self.mid_span_x { "right" } else { "left" };
                s.push_str(&format!(
                    ": {past} it the rib reaches the deck at x = {}, {side} of mid-span (x = {})",
                    length(*x),
                    length(self.mid_span_x)
                ));
                if self.unequal_springings {
                    s.push_str("; with unequal springings the funicular's highest point is not at mid-span");
                }
            }
            RiseBound::PositiveRise => s.push_str(": the rise must stay positive"),
            RiseBound::Refused(problems) => {
                if let Some(p) = problems.first() {
                    s.push_str(&format!(": {past} it, {}", in_words(p)));
                }
            }
            RiseBound::Other(why) => s.push_str(&format!(": {past} it, {why}")),
        }
        s
    }
}

/// A problem as a status line says it: a design field's problem by its message alone
/// (the message names what it is about), any other place named first.
fn in_words(p: &Problem) -> String {
    match &p.location {
        Location::Field(_) => p.message.clone(),
        other => format!("{other}: {}", p.message),
    }
}

/// The largest rise the layout accepts, everything else as `design` gives it (the
/// springings stay; the crown keeps the way it is given): the rise, the limit that
/// governs it and where the funicular's highest point is then. Found by bisection on
/// the rise against validation (`ValidDesign::new`) between the design's own rise and
/// the rise that puts the crown at the deck (the input check's ceiling), to
/// [`LIMIT_RESOLUTION`].
///
/// Errors: the design's own refusal when it is not valid (there is no accepted rise to
/// start from).
pub fn largest_rise(design: &Design) -> Result<RiseLimit, StaticsError> {
    rise_limit(design, true)
}

/// The least rise the layout accepts, as [`largest_rise`] but downwards (between a rise
/// of zero, always refused, and the design's own).
///
/// Errors: the design's own refusal when it is not valid.
pub fn least_rise(design: &Design) -> Result<RiseLimit, StaticsError> {
    rise_limit(design, false)
}

fn with_rise(design: &Design, rise: f64) -> Design {
    let mut d = design.clone();
    d.set_rise(rise);
    d
}

fn rise_limit(design: &Design, largest: bool) -> Result<RiseLimit, StaticsError> {
    let own = ValidDesign::new(design)?;
    let own_rise = design.rise();
    // the far end of the search: the crown at the deck (largest), a zero rise (least)
    let far = if largest { design.deck.level - design.chord_level_at_crown() } else { 0.0 };
    let (mut ok, mut ok_valid) = (own_rise, own);
    let mut bound = if largest { RiseBound::CrownAtDeck } else { RiseBound::PositiveRise };
    let mut refused_at = far;
    match ValidDesign::new(&with_rise(design, far)) {
        Ok(v) if largest => {
            ok = far;
            ok_valid = v;
        }
        Err(e) if largest => bound = bound_of(e),
        // a zero rise is refused by the input check whatever else; what governs the least
        // rise is found on the way down (or it is that check)
        _ => {}
    }
    if ok != far {
        for _ in 0..MAX_BISECTIONS {
            if (refused_at - ok).abs() <= LIMIT_RESOLUTION {
                break;
            }
            let mid = 0.5 * (ok + refused_at);
            match ValidDesign::new(&with_rise(design, mid)) {
                Ok(v) => {
                    ok = mid;
                    ok_valid = v;
                }
                Err(e) => {
                    refused_at = mid;
                    bound = bound_of(e);
                }
            }
        }
    }
    let form = ok_valid.form();
    let last = form.rib.len().saturating_sub(1);
    // the funicular's highest point: its highest rib node (a springing when the rib
    // hardly rises above the higher one)
    let highest = form
        .rib
        .iter()
        .map(|n| Point::new(n.x, n.y))
        .max_by(|a, b| a.y.total_cmp(&b.y))
        .unwrap_or(form.crown);
    // a rib node off the crown at the deck: that is what refused the next rise
    if largest && matches!(bound, RiseBound::Refused(_)) {
        let at_deck = form
            .rib
            .iter()
            .take(last.max(1))
            .skip(1)
            .enumerate()
            .filter(|&(k, n)| k + 1 != form.crown_node && design.deck.level - n.y <= AT_DECK)
            .map(|(_, n)| n.x)
            .next();
        if let Some(x) = at_deck {
            bound = RiseBound::RibAtDeck { x };
        }
    }
    Ok(RiseLimit {
        rise: ok,
        crown_level: ok_valid.design().crown_level(),
        largest,
        bound,
        highest,
        mid_span_x: form.crown.x,
        unequal_springings: design.springing_left_level != design.springing_right_level,
    })
}

fn bound_of(e: StaticsError) -> RiseBound {
    match e {
        StaticsError::Invalid(problems) => RiseBound::Refused(problems),
        other => RiseBound::Other(other.to_string()),
    }
}

impl fmt::Display for RiseLimit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.describe(Units::Si))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::design::Crown;

    // Check values: the demo scenario (`Design::demo`: deck axis at 100 m, springings at
    // 76 m left and 80 m right, so the chord at the crown is at 78 m; crown at 97.5 m, a
    // rise of 19.5 m; abutment height 10 m) and this crate's validation rules. Limits
    // are found by the functions under test and then checked against validation and
    // analysis directly, a centimetre either side.

    fn demo_with_rise(rise: f64) -> Design {
        with_rise(&Design::demo(), rise)
    }

    #[test]
    fn snapping_rounds_to_tenths_of_a_metre() {
        assert_eq!(snap(22.43), 22.4);
        assert_eq!(snap(22.46), 22.5);
        assert_eq!(snap(-3.04), -3.0);
        // 224 steps of a tenth are the double nearest to 22.4, not 22.400000000000002
        assert_eq!(snap(22.4 + 1e-12), 22.4);
        assert_eq!(snap_towards(21.725, 19.5), 21.7);
        assert_eq!(snap_towards(21.725, 30.0), 21.8);
        assert_eq!(snap_towards(21.7 + 1e-12, 30.0), 21.7);
    }

    #[test]
    fn dragging_the_crown_changes_the_rise_by_the_distance_moved_and_keeps_the_crown_by_level() {
        let d = Design::demo();
        let m = moved(&d, Handle::Crown, 80.0, d.crown_level() + 2.5, Snapping::Free);
        assert!((m.rise() - d.rise() - 2.5).abs() < 1e-12);
        assert!(matches!(m.crown, Crown::Level { .. }), "{:?}", m.crown);
        // snapped: the rise lands on a tenth (19.5 + 1.23 = 20.73 -> 20.7)
        let m = moved(&d, Handle::Crown, 80.0, d.crown_level() + 1.23, Snapping::ToGrid);
        assert!((m.rise() - 20.7).abs() < 1e-12, "{}", m.rise());
        // a crown given by rise stores the snapped rise exactly
        let mut r = d.clone();
        r.crown = Crown::Rise { rise: 19.5 };
        let m = moved(&r, Handle::Crown, 80.0, 78.0 + 20.73, Snapping::ToGrid);
        assert_eq!(m.crown, Crown::Rise { rise: 20.7 });
    }

    #[test]
    fn each_handle_moves_its_own_field_and_reads_it_in_the_panels_words() {
        let d = Design::demo();
        let deck = moved(&d, Handle::Deck, 10.0, 101.27, Snapping::ToGrid);
        assert_eq!(deck.deck.level, 101.3);
        let left = moved(&d, Handle::Springing { left: true }, 0.0, 74.04, Snapping::ToGrid);
        assert_eq!(left.springing_left_level, 74.0);
        assert_eq!(left.springing_right_level, 80.0);
        let ground = moved(&d, Handle::Ground(5), 61.26, 59.94, Snapping::ToGrid);
        assert_eq!((ground.valley[5].x, ground.valley[5].y), (61.3, 59.9));
        let free = moved(&d, Handle::Ground(5), 61.26, 59.94, Snapping::Free);
        assert_eq!((free.valley[5].x, free.valley[5].y), (61.26, 59.94));
        // a ground point the design does not have changes nothing
        assert_eq!(moved(&d, Handle::Ground(99), 1.0, 2.0, Snapping::Free), d);
        let crown = Handle::Crown.reading(&d).map(|r| r.describe(Units::Si));
        assert_eq!(crown.as_deref(), Some("rise 19.50\u{a0}m"));
        let point = Handle::Ground(3).reading(&d).map(|r| r.describe(Units::Si));
        assert_eq!(point.as_deref(), Some("ground point 4: x 30.00\u{a0}m, y 76.00\u{a0}m"));
        // 100 m = 328.08 ft (1 ft = 0.3048 m exactly)
        let us = Handle::Deck.reading(&d).map(|r| r.describe(Units::UsCustomary));
        assert_eq!(us.as_deref(), Some("deck level 328.1\u{a0}ft"));
    }

    #[test]
    fn the_handles_sit_on_the_form_and_the_valley() {
        let d = Design::demo();
        let v = ValidDesign::new(&d).expect("the demo is valid");
        let handles = point_handles(&d, v.form());
        assert_eq!(handles.len(), 3 + d.valley.len());
        assert_eq!(handles[0], (Handle::Crown, v.form().crown));
        assert!((v.form().crown.y - 97.5).abs() < 1e-9);
        assert_eq!(Handle::Springing { left: false }.point(&d, v.form()), Some(v.form().springing_right));
        assert_eq!(handles[3 + 4].1, Point::new(45.0, 66.0));
        assert_eq!(deck_line(&d), (Point::new(2.0, 100.0), Point::new(166.0, 100.0)));
    }

    #[test]
    fn the_demos_largest_rise_is_accepted_and_a_centimetre_more_is_refused_by_the_rib_at_the_deck() {
        let d = Design::demo();
        let limit = largest_rise(&d).expect("the demo is valid");
        // below the input ceiling (crown at the deck: 100 - 78 = 22 m) and above the
        // demo's own 19.5 m: the demo leaves room to raise the crown
        assert!(limit.rise > 19.5 + 2.0 && limit.rise < 22.0, "{limit:?}");
        assert!(analyze(&demo_with_rise(limit.rise)).is_ok());
        let above = analyze(&demo_with_rise(limit.rise + 0.01)).expect_err("a centimetre more is refused");
        let RiseBound::RibAtDeck { x } = limit.bound else { panic!("{limit:?}") };
        // the refusal a centimetre up names that rib node, above the deck
        let p = &above.problems()[0];
        assert_eq!(p.location.to_string(), format!("rib node at x = {x:.3} m"));
        assert!(p.message.contains("above the deck"), "{}", p.message);
        // the right springing is 4 m higher: the highest point is right of mid-span,
        // at the deck
        assert!(x > limit.mid_span_x + 5.0, "{limit:?}");
        assert_eq!(limit.highest.x, x);
        assert!((limit.highest.y - 100.0).abs() <= AT_DECK);
        assert!((limit.crown_level - (78.0 + limit.rise)).abs() < 1e-9);
        let words = limit.describe(Units::Si);
        assert!(words.starts_with("the largest rise the layout takes is 21."), "{words}");
        assert!(words.contains("right of mid-span"), "{words}");
        assert!(
            words.contains("with unequal springings the funicular's highest point is not at mid-span"),
            "{words}"
        );
    }

    #[test]
    fn with_equal_springings_the_crown_reaches_the_deck() {
        let mut d = Design::demo();
        d.springing_right_level = 76.0;
        let limit = largest_rise(&d).expect("valid");
        // chord at 76 m, deck at 100 m: the input ceiling 24 m is accepted
        assert_eq!(limit.bound, RiseBound::CrownAtDeck);
        assert_eq!(limit.rise, 24.0);
        assert!(!limit.unequal_springings);
        // the funicular's highest point is the crown, at mid-span
        assert!((limit.highest.x - limit.mid_span_x).abs() < 1e-9, "{limit:?}");
        assert_eq!(
            limit.describe(Units::Si),
            "the largest rise the layout takes is 24.00\u{a0}m (crown level 100.0\u{a0}m): there the crown reaches the deck"
        );
    }

    #[test]
    fn the_least_rise_is_accepted_and_a_design_refused_has_no_limit() {
        let d = Design::demo();
        let least = least_rise(&d).expect("valid");
        assert!(least.rise > 0.0 && least.rise < 19.5, "{least:?}");
        assert!(ValidDesign::new(&demo_with_rise(least.rise)).is_ok());
        // a rib on the demo's walls stays above the valley floor (57 m) however flat:
        // only the positive rise stops it
        assert_eq!(least.bound, RiseBound::PositiveRise);
        assert!(least.rise <= LIMIT_RESOLUTION);
        let mut bad = Design::demo();
        bad.deck.level = 60.0;
        assert!(largest_rise(&bad).is_err());
    }

    #[test]
    fn a_crown_dragged_past_its_limit_stops_at_the_largest_rise_on_the_grid() {
        let d = Design::demo();
        let largest = largest_rise(&d).expect("valid").rise;
        let step = drag_to(&d, Handle::Crown, 80.0, 110.0, Snapping::ToGrid, analyses);
        // 21.72.. m floored to the grid
        assert!((step.design.rise() - 21.7).abs() < 1e-9, "{}", step.design.rise());
        assert!(largest - step.design.rise() < SNAP_STEP);
        let stopped = step.stopped.expect("stopped short");
        assert!(stopped.problems()[0].message.contains("above the deck"), "{stopped}");
        // free: within the search's resolution of the largest rise
        let free = drag_to(&d, Handle::Crown, 80.0, 110.0, Snapping::Free, analyses);
        assert!((free.design.rise() - largest).abs() <= 2.0 * LIMIT_RESOLUTION, "{}", free.design.rise());
        // dragging on from the limit keeps it; dragging back into the valid range clears
        let on = drag_to(&step.design, Handle::Crown, 80.0, 112.0, Snapping::ToGrid, analyses);
        assert_eq!(on.design, step.design);
        assert!(on.stopped.is_some());
        let back = drag_to(&step.design, Handle::Crown, 80.0, 96.04, Snapping::ToGrid, analyses);
        assert_eq!(back.stopped, None);
        assert!((back.design.rise() - 18.0).abs() < 1e-9, "{}", back.design.rise());
    }

    #[test]
    fn a_crown_drag_held_at_the_largest_rise_says_so_and_seeks_the_limit_once() {
        let d = Design::demo();
        let largest = largest_rise(&d).expect("valid");
        let mut drag = Drag::new(Handle::Crown);
        let mut analysed = 0;
        let first = drag.step(&d, 80.0, 110.0, Snapping::ToGrid, |c| {
            analysed += 1;
            analyses(c)
        });
        // the pointer's position and the position held, each analysed once
        assert_eq!(analysed, 2);
        assert!((first.design.rise() - 21.7).abs() < 1e-9, "{}", first.design.rise());
        let Some(DragStop::LargestRise(limit)) = first.stop.clone() else { panic!("{:?}", first.stop) };
        // sought from 21.7 m rather than 19.5 m: the same limit to the search's resolution
        assert!((limit.rise - largest.rise).abs() <= 2.0 * LIMIT_RESOLUTION, "{limit:?} {largest:?}");
        assert!(matches!(limit.bound, RiseBound::RibAtDeck { .. }), "{limit:?}");
        assert_eq!(drag.largest_rise(), Some(&limit));
        // held on past the limit: the design stays (only the pointer's position is
        // analysed) and the limit kept is told again
        let mut analysed = 0;
        let on = drag.step(&first.design, 80.0, 112.0, Snapping::ToGrid, |c| {
            analysed += 1;
            analyses(c)
        });
        assert_eq!(analysed, 1);
        assert_eq!(on.design, first.design);
        assert_eq!(on.stop, Some(DragStop::LargestRise(limit)));
        // back into the valid range: no stop
        let back = drag.step(&on.design, 80.0, 96.04, Snapping::ToGrid, analyses);
        assert_eq!(back.stop, None);
        assert!((back.design.rise() - 18.0).abs() < 1e-9, "{}", back.design.rise());
    }

    #[test]
    fn a_crown_dragged_below_the_chord_is_refused_without_seeking_the_largest_rise() {
        let d = Design::demo();
        let mut drag = Drag::new(Handle::Crown);
        // the chord at the crown is at 78 m: y = 70 m asks for a rise of -8 m
        let down = drag.step(&d, 80.0, 70.0, Snapping::ToGrid, analyses);
        // held at the least rise on the grid, 0.1 m (the least rise is under 1e-4 m,
        // see `the_least_rise_is_accepted_and_a_design_refused_has_no_limit`)
        assert!((down.design.rise() - 0.1).abs() < 1e-9, "{}", down.design.rise());
        let Some(DragStop::Refused(e)) = &down.stop else { panic!("{:?}", down.stop) };
        // the refusal of the next grid value, a rise of zero
        assert_eq!(Some(e.clone()), analyses(&demo_with_rise(0.0)).err());
        assert!(drag.largest_rise().is_none());
    }

    #[test]
    fn a_deck_dragged_up_stops_at_the_abutment_height_and_says_so() {
        let d = Design::demo();
        let step = drag_to(&d, Handle::Deck, 80.0, 125.0, Snapping::ToGrid, analyses);
        let level = step.design.deck.level;
        assert!(level > 100.0 && level < 125.0, "{level}");
        assert_eq!(snap(level), level);
        // the level found is accepted, a tenth more is refused with the reason returned
        assert!(analyze(&step.design).is_ok());
        let mut more = d.clone();
        more.deck.level = snap(level + SNAP_STEP);
        let refused = analyze(&more).expect_err("refused");
        assert_eq!(step.stopped, Some(refused.clone()));
        assert!(refused.problems()[0].involves(Field::AbutmentHeight), "{refused}");
        // the demo's deck sits on the right rim (ground 100 m at x = 166 m): down it
        // cannot go at all, and the reason names the deck at the next tenth down
        let down = drag_to(&d, Handle::Deck, 80.0, 90.0, Snapping::ToGrid, analyses);
        assert_eq!(down.design, d);
        let why = down.stopped.expect("refused").to_string();
        assert!(why.contains("above the deck axis (99.9 m)"), "{why}");
    }

    #[test]
    fn a_ground_point_dragged_into_its_neighbour_stops_before_it() {
        let d = Design::demo();
        // point 5 (45, 66) dragged right past point 6 (60, 60): the profile must keep
        // increasing x, so it stops short of x = 60 m
        let step = drag_to(&d, Handle::Ground(4), 70.0, 66.0, Snapping::ToGrid, analyses);
        let p = step.design.valley[4];
        assert!(p.x < 60.0 && p.x >= 45.0, "{p:?}");
        assert_eq!((snap(p.x), p.y), (p.x, 66.0));
        // the reason given is that of the next grid step, where x reaches the next point
        let mut next = d.clone();
        next.valley[4].x = snap(p.x + SNAP_STEP);
        assert_eq!(step.stopped, analyze(&next).err());
        assert!(step.stopped.is_some());
        assert!(analyze(&step.design).is_ok());
    }

    #[test]
    fn a_search_counts_its_checks() {
        // the bisection stops at the resolution: a 30 m drag needs about
        // log2(30 / 1e-4) = 18 checks, plus the candidate, the grid value and the next one
        let d = Design::demo();
        let mut checks = 0;
        let step = drag_to_with(&d, Handle::Crown, 80.0, 110.0, Snapping::ToGrid, |c| {
            checks += 1;
            ValidDesign::new(c).map(|_| ())
        });
        assert!(step.stopped.is_some());
        assert!((18..=22).contains(&checks), "{checks}");
    }
}
