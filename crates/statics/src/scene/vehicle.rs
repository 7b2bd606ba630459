//! The vehicle on the deck: the axle group of the design's load model (its first vehicle,
//! every lane's side by side: `arch::cases::Pattern::Vehicle`) where a user has put it,
//! and its glyph on the elevation, which is also the handle a pointer drags.
//!
//! The glyph is our own: white wheels on the deck line, a white body with a slanted front
//! (the vehicle travels right, leading axle first) outlined like the elevation's other
//! handles, one downward arrow per axle whose length grows with the axle's load, and a
//! label with the vehicle's total load across the section.
//!
//! Units: x in m along the elevation, loads in kN positive downward (as on a load line),
//! pixels in CSS pixels of the scene (y down).

use super::place::{self, PAD_X};
use super::{Ink, Item, Label, Px, Rect, Scene, Shape, Stroke, Tag, TextSize};
use crate::arch::cases::{pattern_case, CaseKind, CaseSpec, DeckLoad, Pattern};
use crate::arch::validate::ValidDesign;
use crate::error::StaticsError;
use crate::units::{Quantity, Units};

/// One axle of the vehicle: where it stands and what it carries across the section.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Axle {
    /// x of the axle, m.
    pub x: f64,
    /// Load of the axle, all lanes together, kN, positive downward.
    pub load: f64,
}

/// The vehicle of a load case: its leading axle, every axle, the total.
#[derive(Debug, Clone, PartialEq)]
pub struct VehicleOnDeck {
    /// x of the leading axle (the rightmost: the vehicle travels right), m.
    pub first_axle: f64,
    /// The axles, leading axle first.
    pub axles: Vec<Axle>,
    /// The vehicle's total load across the section, kN (the axles' sum).
    pub total: f64,
}

impl VehicleOnDeck {
    /// The vehicle of `spec`, a case of kind [`CaseKind::Vehicle`] whose deck loads are the
    /// axles as point loads (as `arch::cases::pattern_case` builds it); `None` for any
    /// other case or a vehicle without axles (a load model with no vehicle).
    pub fn from_case(spec: &CaseSpec) -> Option<VehicleOnDeck> {
        let CaseKind::Vehicle { first_axle, total, .. } = spec.kind else { return None };
        let axles: Vec<Axle> = spec
            .loads
            .iter()
            .filter_map(|l| match *l {
                DeckLoad::Point { x, p } => Some(Axle { x, load: p }),
                _ => None,
            })
            .collect();
        (!axles.is_empty()).then_some(VehicleOnDeck { first_axle, axles, total })
    }

    /// Distance from the leading axle to the last, m (0 for a single axle).
    pub fn length(&self) -> f64 {
        self.axles.iter().map(|a| self.first_axle - a.x).fold(0.0, f64::max)
    }
}

/// The case "dead load + the load model's vehicle with its leading axle at `first_axle`"
/// (m) on `valid`: `arch::cases::pattern_case` with [`Pattern::Vehicle`]; axles off the
/// arch span are left out of the loads. Errors: those of `pattern_case` (none for a
/// vehicle today).
pub fn vehicle_case(valid: &ValidDesign, first_axle: f64) -> Result<CaseSpec, StaticsError> {
    pattern_case(valid, Pattern::Vehicle(first_axle))
}

/// Where the leading axle may go, m: from the left springing vertical (the vehicle
/// entering the arch span) to the right one plus the vehicle's length `length` (its last
/// axle leaving). A negative or non-finite length counts as 0.
pub fn travel(valid: &ValidDesign, length: f64) -> (f64, f64) {
    let f = valid.layout();
    let length = if length.is_finite() { length.max(0.0) } else { 0.0 };
    (f.a.x, f.b.x + length)
}

/// Where a chosen vehicle is first put: its leading axle at the left quarter point of the
/// arch span, m (the classic position for unsymmetric loading of an arch).
pub fn start_position(valid: &ValidDesign) -> f64 {
    let f = valid.layout();
    f.a.x + 0.25 * f.span()
}

/// Wheel radius, body height, gap between the body and the wheels, CSS pixels.
const WHEEL: f64 = 3.0;
const BODY: f64 = 12.0;
/// Least body width, CSS pixels (a tandem 1.2 m long is a few pixels at a small scale).
const BODY_MIN: f64 = 26.0;
/// Arrow length for a weightless and for the heaviest axle, CSS pixels.
const ARROW_MIN: f64 = 9.0;
const ARROW_MAX: f64 = 26.0;
/// Pixels around the glyph that still catch a pointer.
pub const REACH: f64 = 4.0;

/// What [`add_vehicle`] drew: the box a pointer grabs, and the arrows' lengths (leading
/// axle first, CSS pixels), for tests.
#[derive(Debug, Clone, PartialEq)]
pub struct VehicleGlyph {
    /// The glyph's box (wheels, body and arrows), CSS pixels; a pointer within [`REACH`]
    /// of it grabs the vehicle ([`VehicleGlyph::grabs`]).
    pub handle: Rect,
    /// Each axle's arrow length, CSS pixels.
    pub arrows: Vec<f64>,
    /// The index of the total's label in the scene, if it found room.
    pub label: Option<usize>,
}

impl VehicleGlyph {
    /// Whether CSS pixel `at` grabs the vehicle (inside its box grown by [`REACH`]).
    pub fn grabs(&self, at: Px) -> bool {
        self.handle.grown(REACH).contains(&Rect::new(at.x, at.y, 0.0, 0.0))
    }
}

/// Draws `vehicle` on the deck at level `deck_level` (m) into `scene`, whose transform
/// maps the elevation (a scene without one is left alone, `None`): see the module
/// documentation. The total's label goes above the arrows where no other label is, else
/// beside them, else is left out; it reads the total in `units`.
pub fn add_vehicle(
    scene: &mut Scene,
    vehicle: &VehicleOnDeck,
    deck_level: f64,
    units: Units,
) -> Option<VehicleGlyph> {
    let t = scene.transform?;
    let deck_y = t.px(vehicle.first_axle, deck_level).y;
    let xs: Vec<f64> = vehicle.axles.iter().map(|a| t.px(a.x, deck_level).x).collect();
    let (lo, hi) = xs.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(l, h), &x| (l.min(x), h.max(x)));
    let overhang = (0.15 * (hi - lo)).max(6.0);
    let (mut x0, mut x1) = (lo - overhang, hi + overhang);
    if x1 - x0 < BODY_MIN {
        let mid = 0.5 * (x0 + x1);
        (x0, x1) = (mid - BODY_MIN / 2.0, mid + BODY_MIN / 2.0);
    }
    let wheel_y = deck_y - 2.0 - WHEEL;
    let body_bottom = wheel_y - WHEEL + 1.0;
    let body_top = body_bottom - BODY;
    let outline = Stroke::solid(Ink::Text, 1.4);
    // body: a box with the front (right) top corner cut, so the direction of travel reads
    let cut = (0.35 * BODY).min(0.3 * (x1 - x0));
    let body = vec![
        Px::new(x0, body_bottom),
        Px::new(x1, body_bottom),
        Px::new(x1, body_top + cut),
        Px::new(x1 - cut, body_top),
        Px::new(x0, body_top),
    ];
    scene.items.push(Item {
        shape: Shape::Path { points: body, closed: true },
        stroke: Some(outline),
        fill: Some(Ink::Handle),
        tag: Tag::Handle,
    });
    for &x in &xs {
        scene.items.push(Item {
            shape: Shape::Circle { center: Px::new(x, wheel_y), radius: WHEEL },
            stroke: Some(outline),
            fill: Some(Ink::Handle),
            tag: Tag::Handle,
        });
    }
    // one arrow per axle onto the body, its length growing with the axle's load
    let heaviest = vehicle.axles.iter().map(|a| a.load.abs()).fold(0.0, f64::max);
    let mut arrows = Vec::with_capacity(xs.len());
    let mut top = body_top;
    for (a, &x) in vehicle.axles.iter().zip(&xs) {
        let share = if heaviest > 0.0 { a.load.abs() / heaviest } else { 0.0 };
        let len = ARROW_MIN + (ARROW_MAX - ARROW_MIN) * share;
        let head = Px::new(x, body_top - 1.0);
        let tail = Px::new(x, head.y - len);
        top = top.min(tail.y);
        scene
            .items
            .push(Item::stroked(Shape::Arrow { tail, head, head_size: 6.0 }, Stroke::solid(Ink::Load, 2.0)));
        arrows.push(len);
    }
    let handle = Rect::new(x0, top, x1 - x0, deck_y - top);
    let label = total_label(scene, vehicle, units, handle);
    Some(VehicleGlyph { handle, arrows, label })
}

/// Places the total's label near `glyph` where it overlaps no label of the scene and stays
/// on the canvas: above, then to either side, then higher up. Returns its index.
fn total_label(scene: &mut Scene, vehicle: &VehicleOnDeck, units: Units, glyph: Rect) -> Option<usize> {
    let size = TextSize::Body;
    let text = format!("vehicle {}", units.show(Quantity::Force, vehicle.total));
    let (w, h) = (place::text_width(&text, size) + 2.0 * PAD_X, size.box_height());
    let mid = glyph.x + glyph.w / 2.0;
    let frame = scene.viewport.frame().grown(-1.0);
    let mut candidates = vec![
        (mid - w / 2.0, glyph.y - h - 3.0),
        (glyph.right() + 4.0, glyph.y),
        (glyph.x - w - 4.0, glyph.y),
    ];
    for k in 1..=4 {
        candidates.push((mid - w / 2.0, glyph.y - h - 3.0 - k as f64 * (h + 2.0)));
    }
    let free = |r: &Rect| frame.contains(r) && !scene.labels.iter().any(|l| l.rect.overlaps(r));
    let rect = candidates.into_iter().map(|(x, y)| Rect::new(x, y, w, h)).find(|r| free(r))?;
    scene.labels.push(Label {
        text,
        size,
        ink: Ink::Load,
        rect,
        boxed: true,
        leader: None,
        detail: Some(format!(
            "the load model's vehicle, every lane's side by side: {} in all, leading axle at x = {}",
            units.show(Quantity::Force, vehicle.total),
            units.show(Quantity::Length, vehicle.first_axle)
        )),
    });
    Some(scene.labels.len() - 1)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::analysis::analyze_with;
    use crate::arch::design::Design;
    use crate::scene::elevation::{elevation, ElevationOptions};
    use crate::scene::Viewport;

    /// The demo's vehicle is the EN 1991-2 LM1 tandem: two axles 1.2 m apart (EN 1991-2
    /// 4.3.2, from memory), each carrying the lanes' axle loads together; the case puts
    /// the leading axle where asked and the total is the axles' sum.
    #[test]
    fn the_demo_vehicle_is_a_tandem_at_the_asked_position() {
        let v = ValidDesign::new(&Design::demo()).expect("demo");
        let x = start_position(&v);
        // the demo's arch span: springings at x = 30 m and 136.428571 m (see arch::cases)
        assert!((x - (30.0 + 106.428_571_428_571 / 4.0)).abs() < 1e-6, "{x}");
        let spec = vehicle_case(&v, x).expect("case");
        let car = VehicleOnDeck::from_case(&spec).expect("a vehicle");
        assert_eq!(car.axles.len(), 2);
        assert!((car.axles[0].x - x).abs() < 1e-12);
        assert!((car.length() - 1.2).abs() < 1e-12, "{}", car.length());
        let sum: f64 = car.axles.iter().map(|a| a.load).sum();
        assert!((sum - car.total).abs() < 1e-9 && car.total > 0.0);
        // entering at the left springing, leaving when the last axle passes the right one
        let (lo, hi) = travel(&v, car.length());
        assert!((lo - 30.0).abs() < 1e-6 && (hi - (136.428_571_428_571 + 1.2)).abs() < 1e-6, "{lo} {hi}");
        // any other case has no vehicle
        assert!(VehicleOnDeck::from_case(&pattern_case(&v, Pattern::FullSpan).expect("full")).is_none());
    }

    /// On the elevation: one arrow per axle (equal axles, equal arrows), the glyph on the
    /// deck under the leading axle, its total labelled clear of every other label, and
    /// the pointer caught on the glyph, not a body length away.
    #[test]
    fn the_glyph_sits_on_the_deck_under_its_axles_and_is_grabbed_there() {
        let d = Design::demo();
        let v = ValidDesign::new(&d).expect("demo");
        let spec = vehicle_case(&v, 70.0).expect("case");
        let car = VehicleOnDeck::from_case(&spec).expect("a vehicle");
        let a = analyze_with(&v, &[spec]).expect("analyses");
        let case = a.load_cases.len() - 1;
        let opts = ElevationOptions { case, ..Default::default() };
        let mut scene = elevation(&a, &d, &opts, Viewport::new(1000.0, 460.0));
        let before = scene.labels.len();
        let glyph = add_vehicle(&mut scene, &car, d.deck.level, Units::Si).expect("drawn");
        assert_eq!(glyph.arrows.len(), 2);
        assert!(
            (glyph.arrows[0] - glyph.arrows[1]).abs() < 1e-9 && (glyph.arrows[0] - ARROW_MAX).abs() < 1e-9
        );
        let t = scene.transform.expect("a world");
        let axle = t.px(70.0, d.deck.level);
        assert!(glyph.handle.x < axle.x && axle.x < glyph.handle.right());
        assert!(glyph.handle.bottom() <= axle.y + 1e-9 && glyph.handle.bottom() > axle.y - 1.0);
        assert!(glyph.grabs(Px::new(axle.x, axle.y - 10.0)));
        assert!(!glyph.grabs(Px::new(axle.x + glyph.handle.w + 2.0 * REACH, axle.y - 10.0)));
        let k = glyph.label.expect("the total found room");
        assert_eq!(k, before);
        let total = format!("vehicle {}", Units::Si.show(Quantity::Force, car.total));
        assert_eq!(scene.labels[k].text, total);
        assert!(scene.overlapping_labels().is_empty(), "{:?}", scene.overlapping_labels());
        assert!(scene.labels_outside().is_empty());
    }
}
