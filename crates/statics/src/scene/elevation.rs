//! The elevation as a scene: valley, thrust blocks, abutment seats, the members of the
//! model drawn (frame model, or the truss idealisation where the design has one) by the
//! sign of their axial force, hinges, supports, loads, the rib's push on each abutment
//! (H, V, angle and, for a fixed rib, the moment), dimensions (span, rise, deck level),
//! the handles a pointer can drag, a title naming the model and the load case in words,
//! and a key.
//!
//! Member styles (tension dashed, compression solid, zero dotted, so that sign reads
//! without colour; colour by [`Ink`]): line width 1.2 px + 6 px x sqrt(|N| / largest
//! |N| drawn) to the nearest half pixel, N the mean of the end forces; |N| at or below
//! the solver's zero (`ZERO_FORCE` of the case's largest force) counts as no force.
//!
//! Springing forces are [`SpringingForce`] values of the model drawn (the frame model's
//! are the numbers of the results table; with the truss idealisation drawn, its own
//! reactions at its pinned springings): thrust H positive when the rib pushes its
//! abutment outward, V positive when it pushes it down, the angle of that push below the
//! horizontal, the moment on the abutment (a fixed rib, frame model only). The arrow
//! drawn is that push, from the springing into the abutment.

use super::place::{self, Placer, Request, Side, PAD_X};
use super::{
    group_by_stroke, stepped_width, Ink, Item, Label, Pattern, Px, Rect, Scene, Shape, Stroke, Tag, TextSize,
    Transform, Viewport,
};
use crate::arch::analysis::{drawn_case, Analysis};
use crate::arch::cases::CaseKind;
use crate::arch::design::{Design, RibSystem};
use crate::arch::generate::{MemberRole, ModelKind, ModelMap};
use crate::arch::readout::MemberKey;
use crate::arch::summary::SpringingForce;
use crate::frame::model::{LoadDirection, MemberLoad, Model};
use crate::frame::results::CaseResult;
use crate::tolerance::ZERO_FORCE;
use crate::units::{Quantity, Units};

/// What the elevation shows besides the analysis.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ElevationOptions {
    /// Display units of every number.
    pub units: Units,
    /// Load case (index into `Analysis::load_cases`; out of range reads the dead load).
    pub case: usize,
    /// The model whose members and forces are drawn: `ModelKind::Truss` where the design
    /// has a solved truss idealisation, otherwise the frame model is drawn.
    pub model: ModelKind,
    /// Member to highlight, index into the drawn model's members.
    pub highlight: Option<usize>,
    /// A transform to keep (during a drag, so the mapping under the pointer stays put);
    /// `None` fits the valley to the canvas.
    pub transform: Option<Transform>,
}

impl Default for ElevationOptions {
    fn default() -> Self {
        ElevationOptions {
            units: Units::Si,
            case: 0,
            model: ModelKind::Frame,
            highlight: None,
            transform: None,
        }
    }
}

/// One entry of the elevation's key: a swatch (`None`: words only) and its words.
#[derive(Debug, Clone, PartialEq)]
pub struct KeyEntry {
    /// The line drawn before the words (an arrow for the reaction ink).
    pub swatch: Option<Stroke>,
    /// The words.
    pub text: String,
    /// The words' ink.
    pub ink: Ink,
}

/// Another reading drawn over the elevation's ground, blocks, joints, handles, springing
/// forces and dimensions, in place of the members by force and the case's loads (the
/// traffic envelope of `scene::envelope`).
pub struct Overlay<'a> {
    /// What the title says after the model (in place of the case's title).
    pub title: String,
    /// The key, in place of the member force key.
    pub keys: Vec<KeyEntry>,
    /// Draws the members and loads with the drawing's transform, placing its labels with
    /// the placer (after the header, before the springing blocks and dimensions).
    pub draw: &'a dyn Fn(&Transform, &mut Vec<Item>, &mut Placer),
}

/// Margin between the canvas edge and the drawing or text, CSS pixels.
const MARGIN: f64 = 8.0;
/// Length of a legend swatch, CSS pixels.
const SWATCH: f64 = 20.0;
/// Length of a reaction arrow, CSS pixels.
const REACTION_ARROW: f64 = 46.0;
/// How many of a block's preferred sides count as beside its point (no leader) on a wide
/// canvas.
const NEAR_SIDES: usize = 3;
/// Width from which a canvas counts as wide, CSS pixels.
const WIDE: f64 = 560.0;
/// Half the side of a square handle, CSS pixels.
const HANDLE: f64 = 4.0;

/// World bounds of the elevation, m: the valley's extent and the deck over it, with room
/// below the lowest ground for the span dimension (x0, x1, y0, y1).
pub fn bounds(design: &Design) -> (f64, f64, f64, f64) {
    let xs = design.valley.iter().map(|p| p.x);
    let ys = design.valley.iter().map(|p| p.y);
    let x0 = xs.clone().fold(f64::INFINITY, f64::min);
    let x1 = xs.fold(f64::NEG_INFINITY, f64::max);
    let y0 = ys.clone().fold(f64::INFINITY, f64::min);
    let y1 = design.deck.level.max(ys.fold(f64::NEG_INFINITY, f64::max));
    let pad = 0.04 * (x1 - x0);
    (x0, x1, y0 - 2.0 * pad, y1 + pad)
}

/// A small elevation for options side by side: the ground, the abutments and the frame
/// model's members under the dead load (tension and compression inks, line weight by
/// force), with no title, key, loads, labels or dimensions, drawn with `transform`
/// (`Transform::fit_all` over [`thumbnail_area`] puts several at one scale).
pub fn thumbnail(analysis: &Analysis, design: &Design, transform: Transform, viewport: Viewport) -> Scene {
    let a = analysis;
    let mut scene = Scene::new(viewport);
    scene.items.push(Item::filled(Shape::Box { rect: viewport.frame() }, Ink::Background));
    scene.transform = Some(transform);
    scene.world_unit = "m";
    ground(&mut scene, design, &transform, viewport);
    abutments(&mut scene, design, &a.form, &transform);
    // the dead load is the first case solved (an analysis without it has no members to draw)
    if let Some(case) = a.frame.solution.cases.first() {
        let drawn = Drawn { kind: ModelKind::Frame, model: &a.frame.model, map: &a.frame.map, case };
        members(&mut scene, &drawn, &transform, None);
        joints(&mut scene, &drawn, &transform);
    }
    scene
}

/// The part of a thumbnail's canvas the drawing takes, CSS pixels (4 px margin all round;
/// at least 10 px each way).
pub fn thumbnail_area(viewport: Viewport) -> Rect {
    Rect::new(4.0, 4.0, (viewport.width - 8.0).max(10.0), (viewport.height - 8.0).max(10.0))
}

/// The model drawn: its kind, model, map and the solved case.
struct Drawn<'a> {
    kind: ModelKind,
    model: &'a Model,
    map: &'a ModelMap,
    case: &'a CaseResult,
}

/// The elevation of `design` (already analysed as `analysis`) for a canvas of `viewport`:
/// see the module documentation. Labels that found no room are left out: see
/// [`elevation_with_dropped`].
pub fn elevation(analysis: &Analysis, design: &Design, opts: &ElevationOptions, viewport: Viewport) -> Scene {
    elevation_with_dropped(analysis, design, opts, viewport).0
}

/// [`elevation`] and the texts of labels that found no room (none on a usable canvas).
pub fn elevation_with_dropped(
    analysis: &Analysis,
    design: &Design,
    opts: &ElevationOptions,
    viewport: Viewport,
) -> (Scene, Vec<String>) {
    elevation_with_overlay(analysis, design, opts, viewport, None)
}

/// [`elevation_with_dropped`] with `overlay` (when given) drawing the members and loads,
/// its title and its key in place of the members by force, the case's loads, the case's
/// title and the force key. `opts.highlight` is left to the overlay.
pub fn elevation_with_overlay(
    analysis: &Analysis,
    design: &Design,
    opts: &ElevationOptions,
    viewport: Viewport,
    overlay: Option<&Overlay>,
) -> (Scene, Vec<String>) {
    let a = analysis;
    let units = opts.units;
    let case_index = drawn_case(opts.case, a.frame.solution.cases.len());
    let Some(frame_case) = a.frame.solution.cases.get(case_index) else {
        // an analysis always solves the dead load; without any case there is nothing to draw
        let mut scene = Scene::new(viewport);
        scene.items.push(Item::filled(Shape::Box { rect: viewport.frame() }, Ink::Background));
        return (scene, Vec::new());
    };
    let truss = a.truss.as_ref().and_then(|t| Some((t, t.solution.as_ref()?.cases.get(case_index)?)));
    // the erection stage is the bare rib's: it is drawn whatever model was chosen
    let erection = a
        .load_cases
        .get(case_index)
        .filter(|c| c.description == CaseKind::Erection)
        .and_then(|_| a.bare_rib.solution.cases.get(case_index));
    let drawn = match (opts.model, truss, erection) {
        (_, _, Some(c)) => {
            Drawn { kind: ModelKind::BareRib, model: &a.bare_rib.model, map: &a.bare_rib.map, case: c }
        }
        (ModelKind::Truss, Some((t, c)), None) => {
            Drawn { kind: ModelKind::Truss, model: &t.model, map: &t.map, case: c }
        }
        _ => Drawn { kind: ModelKind::Frame, model: &a.frame.model, map: &a.frame.map, case: frame_case },
    };

    let mut scene = Scene::new(viewport);
    let frame = viewport.frame();
    let mut placer =
        Placer::new(Rect::new(1.0, 1.0, (viewport.width - 2.0).max(0.0), (viewport.height - 2.0).max(0.0)));
    scene.items.push(Item::filled(Shape::Box { rect: frame }, Ink::Background));

    // title and key first: they take their own lines at the top
    let case_words = match overlay {
        Some(o) => o.title.clone(),
        None => {
            a.load_cases.get(case_index).map_or_else(|| CaseKind::Dead.title(), |c| c.description.title())
        }
    };
    let case_detail = a.load_cases.get(case_index).map(|c| c.description.describe(units));
    let frame_only = drawn.kind == ModelKind::Truss;
    // texts laid out by the builder that found no room (never expected; tests check)
    let mut lost = Vec::new();
    let (header_bottom, case_label) = header(
        &mut scene,
        &mut placer,
        viewport,
        (drawn.kind, &case_words),
        (design.deck.ribs, frame_only),
        overlay.map(|o| o.keys.as_slice()),
        &mut lost,
    );

    // the drawing below the header
    let area = Rect::new(
        MARGIN + 8.0,
        header_bottom + 6.0,
        (viewport.width - 2.0 * MARGIN - 16.0).max(10.0),
        (viewport.height - header_bottom - 6.0 - MARGIN).max(10.0),
    );
    let t = opts.transform.unwrap_or_else(|| Transform::fit(bounds(design), area));
    scene.transform = Some(t);
    scene.world_unit = "m";
    let p = |x: f64, y: f64| t.px(x, y);

    ground(&mut scene, design, &t, viewport);
    abutments(&mut scene, design, &a.form, &t);

    // members the drawn truss idealisation leaves out: faint, named in the key
    if frame_only {
        let fm = &a.frame.model;
        for (k, m) in fm.members.iter().enumerate() {
            let in_truss = MemberKey::of(&a.frame.map, ModelKind::Frame, k)
                .is_some_and(|key| key.member_in(drawn.map, ModelKind::Truss).is_some());
            if let (false, Some((na, nb))) = (in_truss, fm.ends(m)) {
                scene.items.push(Item::stroked(
                    Shape::Line { from: p(na.x, na.y), to: p(nb.x, nb.y) },
                    Stroke::solid(Ink::Concrete, 2.0),
                ));
            }
        }
    }
    match overlay {
        Some(o) => {
            (o.draw)(&t, &mut scene.items, &mut placer);
            joints(&mut scene, &drawn, &t);
        }
        None => {
            members(&mut scene, &drawn, &t, opts.highlight);
            joints(&mut scene, &drawn, &t);
            loads(&mut scene, &drawn, &t);
        }
    }

    // handles: crown and springings (squares), kept free of labels
    let f = &a.form;
    for q in [f.crown, f.springing_left, f.springing_right] {
        let c = p(q.x, q.y);
        let rect = Rect::new(c.x - HANDLE, c.y - HANDLE, 2.0 * HANDLE, 2.0 * HANDLE);
        scene.items.push(Item {
            shape: Shape::Box { rect },
            stroke: Some(Stroke::solid(Ink::Text, 1.2)),
            fill: Some(Ink::Handle),
            tag: Tag::Handle,
        });
        placer.reserve(rect.grown(2.0));
    }

    let boxed = springing_forces(&mut scene, &mut placer, &drawn, design, (&t, units, viewport));
    dimensions(&mut scene, &mut placer, a, design, &t, units, viewport);

    let mut dropped = lost;
    dropped.extend(placer.dropped().iter().cloned());
    let mut labels = placer.finish();
    // the full description of the case for a pointer resting on the title
    if let Some(l) = case_label.and_then(|k| labels.get_mut(k)) {
        l.detail = case_detail;
    }
    // the springing blocks sit over ground and blocks: a light box under each line, and a
    // leader from a block placed away from its springing
    for (k, leader) in boxed {
        if let Some(l) = labels.get_mut(k) {
            l.boxed = true;
            l.leader = leader;
        }
    }
    scene.labels.extend(labels);
    (scene, dropped)
}

/// Title (model and case in words) and key, as lines from the top left; returns the
/// bottom of the last line and the label holding the case. `ribs` is the number of rib
/// lines the forces are for; `frame_only` adds the key of members the drawn truss
/// idealisation leaves out; `own_keys` replace the force key (an overlay's). Texts that
/// found no room go to `lost`.
fn header(
    scene: &mut Scene,
    placer: &mut Placer,
    viewport: Viewport,
    (kind, case_words): (ModelKind, &str),
    (ribs, frame_only): (usize, bool),
    own_keys: Option<&[KeyEntry]>,
    lost: &mut Vec<String>,
) -> (f64, Option<usize>) {
    let area = Rect::new(MARGIN, MARGIN - 2.0, (viewport.width - 2.0 * MARGIN).max(10.0), viewport.height);
    let whole = format!("Elevation · {kind} · {case_words}");
    let title_items: Vec<(String, TextSize)> =
        if place::text_width(&whole, TextSize::Title) + 2.0 * PAD_X <= area.w {
            vec![(whole, TextSize::Title)]
        } else {
            vec![
                (place::fit_text(&format!("Elevation · {kind}"), TextSize::Title, area.w), TextSize::Title),
                (place::fit_text(case_words, TextSize::Title, area.w), TextSize::Title),
            ]
        };
    let (boxes, flow_bottom) = place::flow(&title_items, area, 8.0);
    let line_h = TextSize::Title.box_height();
    let mut bottom = flow_bottom;
    let mut case_label = None;
    for ((text, size), rect) in title_items.iter().zip(&boxes) {
        // lines a little apart, so the placer's clearance between boxes holds
        let line = ((rect.y - area.y) / line_h).round();
        let rect = Rect::new(rect.x, rect.y + 2.0 * line, rect.w, rect.h);
        bottom = bottom.max(rect.bottom());
        // the last title item holds the case
        case_label = placer.place_at(text.clone(), *size, Ink::Text, rect);
        if case_label.is_none() {
            lost.push(text.clone());
        }
    }

    // the key: swatch and words per entry, wrapping like words
    let all = if ribs == 1 { "one rib".to_string() } else { format!("all {ribs} ribs together") };
    let mut keys: Vec<(Option<Stroke>, String, Ink)> = vec![
        (Some(Stroke::patterned(Ink::Tension, 3.0, Pattern::Dashed)), "tension (N > 0)".into(), Ink::Text),
        (
            Some(Stroke::patterned(Ink::Compression, 3.0, Pattern::Solid)),
            "compression (N < 0)".into(),
            Ink::Text,
        ),
        (Some(Stroke::patterned(Ink::Zero, 2.0, Pattern::Dotted)), "no force".into(), Ink::Text),
        (None, format!("line weight ∝ |N|, {all}"), Ink::Secondary),
        (Some(Stroke::solid(Ink::Reaction, 2.0)), "rib's push on abutment".into(), Ink::Text),
    ];
    if frame_only {
        keys.push((
            Some(Stroke::solid(Ink::Concrete, 2.0)),
            "faint: not in the truss idealisation".into(),
            Ink::Secondary,
        ));
    }
    if let Some(own) = own_keys {
        keys = own.iter().map(|k| (k.swatch, k.text.clone(), k.ink)).collect();
    }
    let size = TextSize::Small;
    let h = size.box_height();
    let (mut x, mut y) = (area.x, bottom + 2.0);
    for (swatch, text, ink) in keys {
        let text_w = place::text_width(&text, size) + 2.0 * PAD_X;
        let sw = if swatch.is_some() { SWATCH + 2.0 } else { 0.0 };
        let (text, text_w) = if sw + text_w > area.w {
            let t = place::fit_text(&text, size, area.w - sw);
            let w = place::text_width(&t, size) + 2.0 * PAD_X;
            (t, w)
        } else {
            (text, text_w)
        };
        if x > area.x && x + sw + text_w > area.right() {
            x = area.x;
            y += h + 2.0;
        }
        if let Some(stroke) = swatch {
            let mid = y + h / 2.0;
            let shape = if stroke.ink == Ink::Reaction {
                Shape::Arrow { tail: Px::new(x, mid), head: Px::new(x + SWATCH, mid), head_size: 6.0 }
            } else {
                Shape::Line { from: Px::new(x, mid), to: Px::new(x + SWATCH, mid) }
            };
            scene.items.push(Item::stroked(shape, stroke));
        }
        let rect = Rect::new(x + sw, y, text_w, h);
        if placer.place_at(text.clone(), size, ink, rect).is_none() {
            lost.push(text);
        }
        x += sw + text_w + 10.0;
    }
    bottom = y + h;
    // keep the header clear of drawing labels
    placer.reserve(Rect::new(0.0, 0.0, viewport.width, bottom));
    (bottom, case_label)
}

/// The valley: ground filled to the bottom edge, its outline, and its points (handles).
fn ground(scene: &mut Scene, design: &Design, t: &Transform, viewport: Viewport) {
    let line: Vec<Px> = design.valley.iter().map(|g| t.px(g.x, g.y)).collect();
    let (Some(first), Some(last)) = (line.first().copied(), line.last().copied()) else { return };
    let mut fill = line.clone();
    let bottom = viewport.height.max(last.y).max(first.y);
    fill.push(Px::new(last.x, bottom));
    fill.push(Px::new(first.x, bottom));
    scene.items.push(Item::filled(Shape::Path { points: fill, closed: true }, Ink::GroundFill));
    scene.items.push(Item::stroked(
        Shape::Path { points: line.clone(), closed: false },
        Stroke::solid(Ink::Ground, 1.5),
    ));
    for c in line {
        scene
            .items
            .push(Item::filled(Shape::Circle { center: c, radius: 2.5 }, Ink::Ground).tagged(Tag::Handle));
    }
}

/// The axial force shown for a member: the mean of its end forces, kN.
fn mean_n(case: &CaseResult, k: usize) -> f64 {
    case.members.get(k).map_or(0.0, |m| 0.5 * (m.start.n + m.end.n))
}

/// The step of the members' line weights, CSS px (see [`stepped_width`]).
const WEIGHT_STEP: f64 = 0.5;

/// The stroke of a member with axial force `n` (kN) when the largest drawn is `n_max` and
/// the solver's zero is `zero`.
pub fn member_stroke(n: f64, n_max: f64, zero: f64) -> Stroke {
    if n.abs() <= zero || n_max <= 0.0 {
        return Stroke::patterned(Ink::Zero, 1.5, Pattern::Dotted);
    }
    let width = stepped_width(1.2 + 6.0 * (n.abs() / n_max).min(1.0).sqrt(), WEIGHT_STEP);
    if n > 0.0 {
        Stroke::patterned(Ink::Tension, width, Pattern::Dashed)
    } else {
        Stroke::patterned(Ink::Compression, width, Pattern::Solid)
    }
}

fn members(scene: &mut Scene, d: &Drawn, t: &Transform, highlight: Option<usize>) {
    let zero = ZERO_FORCE * d.case.equilibrium.reference;
    let n_max = (0..d.model.members.len()).map(|k| mean_n(d.case, k).abs()).fold(0.0, f64::max);
    let mut lines = Vec::with_capacity(d.model.members.len());
    for (k, m) in d.model.members.iter().enumerate() {
        let Some((na, nb)) = d.model.ends(m) else { continue };
        let stroke = member_stroke(mean_n(d.case, k), n_max, zero);
        lines.push(
            Item::stroked(Shape::Line { from: t.px(na.x, na.y), to: t.px(nb.x, nb.y) }, stroke)
                .tagged(Tag::Member { member: k }),
        );
    }
    // members meet only at joints: drawn a weight at a time, each weight one path
    group_by_stroke(&mut lines);
    scene.items.append(&mut lines);
    let highlighted =
        highlight.and_then(|k| d.model.members.get(k).and_then(|m| d.model.ends(m)).map(|e| (k, e)));
    if let Some((k, (na, nb))) = highlighted {
        let line = Shape::Line { from: t.px(na.x, na.y), to: t.px(nb.x, nb.y) };
        scene.items.push(
            Item::stroked(line.clone(), Stroke::solid(Ink::HighlightHalo, 11.0))
                .tagged(Tag::Member { member: k }),
        );
        scene
            .items
            .push(Item::stroked(line, Stroke::solid(Ink::Highlight, 3.0)).tagged(Tag::Member { member: k }));
    }
}

/// Deck joints (dots), rib hinges (open rings) and supports (triangles; a bar under a
/// roller, a thick bar under a fixed support).
fn joints(scene: &mut Scene, d: &Drawn, t: &Transform) {
    let node = |k: usize| d.model.nodes.get(k).map(|n| t.px(n.x, n.y));
    for center in d.map.deck_nodes.iter().flatten().filter_map(|&k| node(k)) {
        scene.items.push(Item::filled(Shape::Circle { center, radius: 2.6 }, Ink::Text));
    }
    for m in d.map.rib_members.iter().filter_map(|&k| d.model.members.get(k)) {
        for (released, n) in [(m.release_start, m.start), (m.release_end, m.end)] {
            if let (true, Some(center)) = (released, node(n)) {
                scene.items.push(Item {
                    shape: Shape::Circle { center, radius: 4.0 },
                    stroke: Some(Stroke::solid(Ink::Text, 1.5)),
                    fill: Some(Ink::Background),
                    tag: Tag::None,
                });
            }
        }
    }
    for s in &d.model.supports {
        let Some(c) = node(s.node) else { continue };
        let tri = vec![c, Px::new(c.x - 6.0, c.y + 10.0), Px::new(c.x + 6.0, c.y + 10.0)];
        scene.items.push(Item::filled(Shape::Path { points: tri, closed: true }, Ink::Text));
        if !s.x {
            let bar =
                Shape::Line { from: Px::new(c.x - 8.0, c.y + 13.0), to: Px::new(c.x + 8.0, c.y + 13.0) };
            scene.items.push(Item::stroked(bar, Stroke::solid(Ink::Text, 1.5)));
        }
        if s.rz {
            let bar =
                Shape::Line { from: Px::new(c.x - 9.0, c.y + 10.0), to: Px::new(c.x + 9.0, c.y + 10.0) };
            scene.items.push(Item::stroked(bar, Stroke::solid(Ink::Text, 3.0)));
        }
    }
}

/// Loads of the drawn case on the deck: arrows at the deck joints (length grows with the
/// load) and, for line loads on deck members, small arrows along the member.
fn loads(scene: &mut Scene, d: &Drawn, t: &Transform) {
    let Some(lc) = d.model.load_cases.iter().find(|l| l.name == d.case.name) else { return };
    let mut on_deck = vec![false; d.model.nodes.len()];
    for &k in d.map.deck_nodes.iter().flatten() {
        if let Some(slot) = on_deck.get_mut(k) {
            *slot = true;
        }
    }
    let f_max = lc.nodal.iter().map(|l| l.fy.abs()).fold(0.0, f64::max);
    for l in &lc.nodal {
        let Some(n) = d.model.nodes.get(l.node) else { continue };
        if !on_deck.get(l.node).copied().unwrap_or(false) || l.fy >= 0.0 || f_max <= 0.0 {
            continue;
        }
        let head = t.px(n.x, n.y);
        let len = 8.0 + 14.0 * l.fy.abs() / f_max;
        scene.items.push(Item::stroked(
            Shape::Arrow {
                tail: Px::new(head.x, head.y - 3.0 - len),
                head: Px::new(head.x, head.y - 3.0),
                head_size: 5.0,
            },
            Stroke::solid(Ink::Load, 1.2),
        ));
    }
    for ml in &lc.member {
        let MemberLoad::Uniform { member, w, direction: LoadDirection::GlobalY, .. } = *ml else { continue };
        let on_road = matches!(d.map.roles.get(member), Some(MemberRole::Deck | MemberRole::Approach));
        if !on_road || w >= 0.0 {
            continue;
        }
        let Some((na, nb)) = d.model.members.get(member).and_then(|m| d.model.ends(m)) else { continue };
        let (a, b) = (t.px(na.x, na.y), t.px(nb.x, nb.y));
        let lift = 14.0;
        scene.items.push(Item::stroked(
            Shape::Line { from: Px::new(a.x, a.y - lift), to: Px::new(b.x, b.y - lift) },
            Stroke::solid(Ink::Load, 1.0),
        ));
        for s in [0.25, 0.75] {
            let at = Px::new(a.x + s * (b.x - a.x), a.y + s * (b.y - a.y));
            scene.items.push(Item::stroked(
                Shape::Arrow {
                    tail: Px::new(at.x, at.y - lift),
                    head: Px::new(at.x, at.y - 3.0),
                    head_size: 4.0,
                },
                Stroke::solid(Ink::Load, 1.0),
            ));
        }
    }
}

/// The rib's push on each abutment: an arrow and the lines H, V, angle (and M for a
/// fixed rib), placed as a block beside the springing. Returns the labels placed as
/// blocks and their leaders.
fn springing_forces(
    scene: &mut Scene,
    placer: &mut Placer,
    drawn: &Drawn,
    design: &Design,
    (t, units, viewport): (&Transform, Units, Viewport),
) -> Vec<(usize, Option<Px>)> {
    let frame = Rect::new(1.0, 1.0, (viewport.width - 2.0).max(0.0), (viewport.height - 2.0).max(0.0));
    let mut placed = Vec::new();
    let (map, model, case) = (drawn.map, drawn.model, drawn.case);
    // the truss idealisation's springings are pinned: a moment only in the frame model
    let shows_moment = design.rib_system == RibSystem::Fixed && drawn.kind == ModelKind::Frame;
    let reference = case.equilibrium.reference;
    let clean = |v: f64, r: f64| if v.abs() <= ZERO_FORCE * r { 0.0 } else { v };
    for (node, left) in [(map.springings[0], true), (map.springings[1], false)] {
        let Some(r) = case.reaction(node) else { continue };
        let s = SpringingForce::from_reaction(r.fx, r.fy, r.mz, left);
        let (h, v) = (clean(s.thrust, reference), clean(s.vertical, reference));
        let m = clean(s.moment, reference * case.equilibrium.characteristic_length);
        let Some(at) = model.nodes.get(node) else { continue };
        let c = t.px(at.x, at.y);
        // the push on the abutment: outward by H, down by V (pixels: y down)
        let (dx, dy) = (if left { -h } else { h }, v);
        let mag = dx.hypot(dy);
        if mag > 0.0 {
            let head = Px::new(c.x + REACTION_ARROW * dx / mag, c.y + REACTION_ARROW * dy / mag);
            scene.items.push(Item::stroked(
                Shape::Arrow { tail: c, head, head_size: 9.0 },
                Stroke::solid(Ink::Reaction, 2.2),
            ));
            // the head stays visible; a label may cross the shaft on its light box
            placer.reserve(Rect::new(head.x - 6.0, head.y - 6.0, 12.0, 12.0));
        }
        let angle = if mag > 0.0 { s.angle_deg } else { 0.0 };
        let mut lines = vec![
            format!("H = {}", units.show(Quantity::Force, h)),
            format!("V = {}", units.show(Quantity::Force, v)),
            if viewport.width >= WIDE {
                format!("{} below horizontal", units.show(Quantity::Angle, angle))
            } else {
                format!("{} below horiz.", units.show(Quantity::Angle, angle))
            },
        ];
        if shows_moment {
            lines.push(format!("M = {}", units.show(Quantity::Moment, m)));
        }
        let sides: &[Side] = if left {
            &[Side::BelowLeft, Side::Left, Side::Below, Side::AboveLeft, Side::BelowRight]
        } else {
            &[Side::BelowRight, Side::Right, Side::Below, Side::AboveRight, Side::BelowLeft]
        };
        placed.extend(block(placer, frame, &lines, (Ink::Reaction, c), sides, left));
    }
    placed
}

/// Places `lines` (body text in `ink`, speaking of point `at`) as a block, left-aligned,
/// one under the other: beside `at` on the first three of the preferred `sides` when there
/// is room, else in the bottom corner of `frame` on the side of `toward_left` (ground,
/// where nothing else is drawn), else on the other sides and further out, the first line
/// with a leader back to `at` whenever the block is not beside it. When no place holds
/// the whole block, each line is placed on its own. Returns the labels placed as a block,
/// with the leader of each (unboxed so far; boxed by the caller).
fn block(
    placer: &mut Placer,
    frame: Rect,
    lines: &[String],
    (ink, at): (Ink, Px),
    sides: &[Side],
    toward_left: bool,
) -> Vec<(usize, Option<Px>)> {
    let (size, gap) = (TextSize::Body, 14.0);
    // the whole block's height decides the first line's place: try each side for the
    // tallest line box stack, then fall back on line-by-line placement
    let w = lines.iter().map(|l| place::text_width(l, size) + 2.0 * PAD_X).fold(0.0, f64::max);
    let h = size.box_height();
    let total = h * lines.len() as f64 + (lines.len().saturating_sub(1)) as f64 * 1.5;
    let mut candidates: Vec<(f64, f64)> = sides.iter().map(|side| side.corner(at, w, total, gap)).collect();
    // the bottom corner of the canvas, after the nearest sides (two on a narrow canvas, where
    // the two blocks need both corners)
    let near = if frame.w >= WIDE { NEAR_SIDES } else { NEAR_SIDES - 1 }.min(sides.len());
    let corner_x = if toward_left { frame.x + 2.0 } else { frame.right() - w - 2.0 };
    // along the bottom edge from the corner towards the middle, clear of arrow heads
    let bottom_row = (0..12).map(|k| {
        let shift = 8.0 * k as f64;
        (if toward_left { corner_x + shift } else { corner_x - shift }, frame.bottom() - total - 2.0)
    });
    let tail = candidates.split_off(near);
    candidates.extend(bottom_row);
    candidates.extend(tail);
    // then further out, straight down and sideways, before giving up on the block
    for k in 1..=8 {
        let d = gap + 12.0 * k as f64;
        candidates.push((at.x - w / 2.0, at.y + d));
        candidates.push((at.x - w - d, at.y - total / 2.0));
        candidates.push((at.x + d, at.y - total / 2.0));
        candidates.push((at.x - w / 2.0, at.y - d - total));
    }
    let fits = |x: f64, y: f64| {
        (0..lines.len()).all(|i| placer.is_free(&Rect::new(x, y + i as f64 * (h + 1.5), w, h)))
    };
    if let Some((n, &(x, y))) = candidates.iter().enumerate().find(|(_, &(x, y))| fits(x, y)) {
        let beside = n < near;
        return lines
            .iter()
            .enumerate()
            .filter_map(|(i, l)| {
                let text_w = place::text_width(l, size) + 2.0 * PAD_X;
                let rect = Rect::new(x, y + i as f64 * (h + 1.5), text_w, h);
                let k = placer.place_at(l.clone(), size, ink, rect)?;
                Some((k, (i == 0 && !beside).then_some(at)))
            })
            .collect();
    }
    for l in lines {
        placer.place(Request::new(l.clone(), size, ink, at).sides(sides).gap(gap));
    }
    Vec::new()
}

/// Span under the springings, rise at the crown over the springing chord, deck level.
fn dimensions(
    scene: &mut Scene,
    placer: &mut Placer,
    a: &Analysis,
    design: &Design,
    t: &Transform,
    units: Units,
    viewport: Viewport,
) {
    let f = &a.form;
    let secondary = |w: f64| Stroke::solid(Ink::Secondary, w);
    let low = t.px(0.0, f.springing_left.y.min(f.springing_right.y)).y;
    let dim_y = (low + 40.0).min(viewport.height - 16.0);
    let (l0, l1) = (t.px(f.springing_left.x, 0.0).x, t.px(f.springing_right.x, 0.0).x);
    scene.items.push(Item::stroked(
        Shape::Line { from: Px::new(l0, dim_y), to: Px::new(l1, dim_y) },
        secondary(1.0),
    ));
    for x in [l0, l1] {
        scene.items.push(Item::stroked(
            Shape::Line { from: Px::new(x, dim_y - 5.0), to: Px::new(x, dim_y + 5.0) },
            secondary(1.0),
        ));
    }
    placer.place(
        Request::new(
            format!("span {}", units.show(Quantity::Length, f.span)),
            TextSize::Body,
            Ink::Secondary,
            Px::new(0.5 * (l0 + l1), dim_y),
        )
        .sides(&[Side::Centre, Side::Above, Side::Below]),
    );

    // rise: the chord between the springings (dashed) and the crown above it
    let chord = design.chord_level_at_crown();
    let (sl, sr) =
        (t.px(f.springing_left.x, f.springing_left.y), t.px(f.springing_right.x, f.springing_right.y));
    scene.items.push(Item::stroked(
        Shape::Line { from: sl, to: sr },
        Stroke::patterned(Ink::Secondary, 1.0, Pattern::Dashed),
    ));
    let top = t.px(f.crown.x, f.crown.y);
    let foot = t.px(f.crown.x, chord);
    scene.items.push(Item::stroked(Shape::Line { from: top, to: foot }, secondary(1.0)));
    placer.place(
        Request::new(
            format!("rise {}", units.show(Quantity::Length, f.rise)),
            TextSize::Body,
            Ink::Secondary,
            Px::new(top.x, 0.5 * (top.y + foot.y)),
        )
        .sides(&[Side::Right, Side::Left]),
    );

    let deck_left = t.px(design.deck.left_seat_x, design.deck.level);
    placer.place(
        Request::new(
            format!("deck level {}", units.show(Quantity::Length, design.deck.level)),
            TextSize::Body,
            Ink::Secondary,
            deck_left,
        )
        .sides(&[Side::AboveRight, Side::Above, Side::BelowRight])
        .gap(10.0)
        .short(format!("deck {}", units.show(Quantity::Length, design.deck.level))),
    );
}

/// The springing blocks and the deck's seats, in concrete.
fn abutments(scene: &mut Scene, design: &Design, f: &crate::arch::form::Form, t: &Transform) {
    let p = |x: f64, y: f64| t.px(x, y);
    let (x_min, x_max) = design
        .valley
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), g| (lo.min(g.x), hi.max(g.x)));
    let block = 0.035 * (x_max - x_min).max(1.0);
    for (sp, dir) in [(f.springing_left, -1.0), (f.springing_right, 1.0)] {
        let pts = vec![
            p(sp.x - dir * block * 0.3, sp.y + block * 0.25),
            p(sp.x + dir * block * 0.9, sp.y + block * 0.25),
            p(sp.x + dir * block * 1.1, sp.y - block * 0.9),
            p(sp.x - dir * block * 0.5, sp.y - block * 0.9),
        ];
        scene.items.push(Item::filled(Shape::Path { points: pts, closed: true }, Ink::Concrete));
    }
    for x in [design.deck.left_seat_x, design.deck.right_seat_x] {
        let top = design.deck.level - 0.2 * block;
        let r0 = p(x - 0.5 * block, top);
        let r1 = p(x + 0.5 * block, top - block);
        scene.items.push(Item::filled(
            Shape::Box { rect: Rect::new(r0.x, r0.y, r1.x - r0.x, r1.y - r0.y) },
            Ink::Concrete,
        ));
    }
}

/// Labels of a scene by text, for tests: the first label whose text starts with `prefix`.
pub fn label_starting<'a>(scene: &'a Scene, prefix: &str) -> Option<&'a Label> {
    scene.labels.iter().find(|l| l.text.starts_with(prefix))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::analysis::analyze;

    /// The demo's members under a half-span load: every member drawn once, in half-pixel
    /// weights, each stroke's members one after another (so a painter draws a weight as
    /// one path), in fewer strokes than members. Check values: the frame model's own
    /// member count and the drawing's own strokes (a property of the scene, no outside
    /// value).
    #[test]
    fn the_members_are_drawn_a_stroke_at_a_time() {
        let d = Design::demo();
        let a = analyze(&d).expect("demo");
        let s = elevation(
            &a,
            &d,
            &ElevationOptions { case: 1, ..Default::default() },
            Viewport::new(900.0, 440.0),
        );
        let members: Vec<&Item> = s
            .items
            .iter()
            .filter(|i| matches!((&i.shape, i.tag), (Shape::Line { .. }, Tag::Member { .. })))
            .collect();
        let mut drawn: Vec<usize> = members
            .iter()
            .filter_map(|i| if let Tag::Member { member } = i.tag { Some(member) } else { None })
            .collect();
        drawn.sort_unstable();
        drawn.dedup();
        assert_eq!(drawn.len(), members.len(), "each member once");
        assert_eq!(drawn.len(), a.frame.model.members.len(), "every member of the frame model");
        let strokes: Vec<Stroke> = members.iter().filter_map(|i| i.stroke).collect();
        for s in &strokes {
            assert_eq!(s.width * 2.0, (s.width * 2.0).round(), "a half-pixel weight: {s:?}");
        }
        let runs = 1 + strokes.windows(2).filter(|w| w[0] != w[1]).count();
        let mut distinct: Vec<Stroke> = Vec::new();
        for s in &strokes {
            if !distinct.contains(s) {
                distinct.push(*s);
            }
        }
        assert_eq!(runs, distinct.len(), "each stroke's members together");
        assert!(runs < members.len() / 2, "{runs} strokes for {} members", members.len());
    }

    #[test]
    fn the_title_names_the_model_and_the_case_in_words() {
        let d = Design::demo();
        let a = analyze(&d).expect("demo");
        let s = elevation(&a, &d, &ElevationOptions::default(), Viewport::new(900.0, 440.0));
        assert!(label_starting(&s, "Elevation · frame model · Dead load").is_some(), "{:?}", s.labels);
        let truss = ElevationOptions { model: ModelKind::Truss, case: 1, ..Default::default() };
        let s = elevation(&a, &d, &truss, Viewport::new(900.0, 440.0));
        let title = label_starting(&s, "Elevation · truss idealisation").expect("truss title");
        assert!(title.text.contains("Traffic, left half"), "{}", title.text);
        assert!(s.labels.iter().any(|l| l.text.contains("not in the truss idealisation")));
    }

    /// With the truss idealisation drawn, the springing blocks show the truss's own
    /// reactions (its pinned springings), not the frame model's under the truss's title.
    #[test]
    fn the_truss_drawn_shows_its_own_springing_reactions() {
        // two-hinged: indeterminate, so the two models' thrusts differ
        let mut d = Design::demo();
        d.rib_system = RibSystem::TwoHinged;
        let a = analyze(&d).expect("two-hinged demo");
        let t = a.truss.as_ref().expect("braced");
        let case = t.solution.as_ref().expect("solved").cases.get(1).expect("a second case");
        let opts = ElevationOptions { model: ModelKind::Truss, case: 1, ..Default::default() };
        let s = elevation(&a, &d, &opts, Viewport::new(900.0, 440.0));
        let texts: Vec<&str> = s.labels.iter().map(|l| l.text.as_str()).collect();
        let frame = a.summary.springings.get(1).expect("frame case 1");
        for (node, left, frame_side) in
            [(t.map.springings[0], true, frame.left), (t.map.springings[1], false, frame.right)]
        {
            let r = case.reaction(node).expect("a springing support");
            // outward push: fx at the left, -fx at the right (the rib pushes back on the abutment)
            let h = if left { r.fx } else { -r.fx };
            let shown = format!("H = {}", Units::Si.show(Quantity::Force, h));
            assert!(texts.contains(&shown.as_str()), "{shown} in {texts:?}");
            // the frame's H (the results table's) differs here and is not the one shown
            let frame_h = format!("H = {}", Units::Si.show(Quantity::Force, frame_side.thrust));
            assert_ne!(frame_h, shown, "the models' thrusts differ for a two-hinged rib");
            assert!(!texts.contains(&frame_h.as_str()), "{frame_h} shown under the truss title");
        }
    }

    /// The title's full case description (shown on hover) follows the units: a US
    /// half-span case in psf and ft: the demo's traffic (EN LM1, 48.75 kN/m over the
    /// section, worked in `traffic::sharing`) over its 11 m deck is 4.432 kN/m², 92.56 psf
    /// (1 psf = 0.04788 kN/m², NIST SP 811).
    #[test]
    fn the_case_detail_speaks_the_chosen_units() {
        let d = Design::demo();
        let a = analyze(&d).expect("demo");
        let half = a
            .load_cases
            .iter()
            .position(|c| matches!(c.description, crate::arch::cases::CaseKind::HalfSpan { .. }))
            .expect("a half-span case");
        let opts = ElevationOptions { units: Units::UsCustomary, case: half, ..Default::default() };
        let s = elevation(&a, &d, &opts, Viewport::new(900.0, 440.0));
        let detail = s.labels.iter().find_map(|l| l.detail.clone()).expect("the title's detail");
        assert!(detail.contains("92.56\u{a0}psf"), "{detail}");
        assert!(detail.contains("\u{a0}ft") && !detail.contains("kN"), "{detail}");
    }

    /// Springing labels carry the summary's numbers (the results table's), shown.
    #[test]
    fn springing_labels_show_the_summary_values() {
        let d = Design::demo();
        let a = analyze(&d).expect("demo");
        let s = elevation(&a, &d, &ElevationOptions::default(), Viewport::new(900.0, 440.0));
        let dead = a.summary.springings_of("dead").expect("dead");
        for side in [dead.left, dead.right] {
            let h = format!("H = {}", Units::Si.show(Quantity::Force, side.thrust));
            assert!(
                s.labels.iter().any(|l| l.text == h),
                "{h} in {:?}",
                s.labels.iter().map(|l| &l.text).collect::<Vec<_>>()
            );
            let ang = format!("{} below horizontal", Units::Si.show(Quantity::Angle, side.angle_deg));
            assert!(s.labels.iter().any(|l| l.text == ang), "{ang}");
        }
        assert!(dead.right.thrust > 0.0, "the right push is outward, positive like the left");
    }
}
