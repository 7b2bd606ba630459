//! The force canvas as a scene. What it shows depends on the design:
//!
//! - braced spandrels: the reciprocal figure of the truss idealisation (Bow's notation)
//!   and, in an area of its own, the pole construction of the same case's loads on the
//!   bare rib (load line, pole, rays, pole distance H). Each area is fitted, zoomed and
//!   panned on its own, so neither is squeezed by the other's scale; they sit side by
//!   side or stacked, whichever gives the figures the larger scale;
//! - unbraced spandrels: the thrust line of the frame model's rib against the rib depth
//!   and its middle third (offsets exaggerated so the depth reads);
//! - otherwise: why nothing can be drawn, wrapped to the width.
//!
//! Shapes are clipped to their area (a zoomed figure never spills into the other area);
//! labels are placed by [`place::Placer`] inside their area and never cover each other.
//!
//! Naming: Bow's notation names spaces with capital letters (outside) and numerals
//! (inside), so the pole of the rib's construction is called [`POLE_NAME`], a lower-case
//! word no space label can be.

use super::place::{self, Placer, Request, Side, PAD_X};
use super::{
    group_by_stroke, stepped_width, Ink, Item, Label, Pattern, Px, Rect, Scene, Shape, Stroke, Tag, TextSize,
    Transform, Viewport,
};
use crate::arch::analysis::Analysis;
use crate::geom::Vector;
use crate::graphic::funicular::PoleConstruction;
use crate::graphic::reciprocal::{ForceDiagram, Segment, SegmentOf, SpaceKind};
use crate::graphic::thrust_line::{PressurePoint, ThrustLine};
use crate::tolerance::ZERO_FORCE;
use crate::units::{Quantity, Units};
use serde::Serialize;

/// The name written at the pole of the rib's pole construction. Bow's labels are capital
/// letters and numerals, so a lower-case word can never clash with a space's name (the
/// pole used to be called "O", which is also a space letter in larger figures).
pub const POLE_NAME: &str = "pole";

/// Width of the top-right corner the scene keeps free for the app's zoom buttons, CSS px.
pub const CONTROLS_WIDTH: f64 = 100.0;
/// Height of that corner, CSS px.
pub const CONTROLS_HEIGHT: f64 = 32.0;

/// Smallest and largest zoom factor relative to the fitted (or fixed) scale.
pub const ZOOM_LIMITS: (f64, f64) = (0.2, 40.0);

/// Margin around the drawing, CSS px.
const MARGIN: f64 = 8.0;
/// Gap between the two areas, CSS px.
const AREA_GAP: f64 = 8.0;
/// Canvases lower than this (CSS px) leave out the header's reading hint.
const SHORT_CANVAS: f64 = 360.0;
/// Room kept inside an area around the fitted figure for its labels, CSS px.
const AREA_PAD: f64 = 14.0;

/// What an area of the force canvas shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum AreaKind {
    /// The reciprocal figure of the truss idealisation (world unit kN).
    Figure,
    /// The pole construction of the rib's loads (world unit kN).
    Pole,
    /// The thrust line of the frame model's rib (world unit m).
    ThrustLine,
}

/// The user's zoom and pan of one area: the fitted (or fixed) scale times `zoom`, about
/// the area's centre, then shifted by the pan in CSS pixels.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct AreaView {
    /// Factor on the fitted scale (1 = fit), within [`ZOOM_LIMITS`].
    pub zoom: f64,
    /// Shift to the right, CSS px.
    pub pan_x: f64,
    /// Shift down, CSS px.
    pub pan_y: f64,
}

impl Default for AreaView {
    fn default() -> Self {
        AreaView::FIT
    }
}

impl AreaView {
    /// Fitted: no zoom, no pan.
    pub const FIT: AreaView = AreaView { zoom: 1.0, pan_x: 0.0, pan_y: 0.0 };

    /// The view zoomed by `factor` about the CSS pixel `pointer` of `area` (the area's
    /// rectangle, [`ForceArea::rect`]): the world point under the pointer stays under it.
    /// The zoom is clamped to [`ZOOM_LIMITS`] (the factor actually applied shrinks to
    /// match, so the pointer's point still stays put). A factor that is not finite or
    /// not positive leaves the view as it is.
    pub fn zoomed_about(self, factor: f64, pointer: Px, area: Rect) -> AreaView {
        if !(factor.is_finite() && factor > 0.0) {
            return self;
        }
        let zoom = (self.zoom * factor).clamp(ZOOM_LIMITS.0, ZOOM_LIMITS.1);
        let k = zoom / self.zoom;
        let (cx, cy) = centre(area);
        // origin' = c + zoom (origin_fit - c) + pan; keeping the pointer's world point
        // fixed gives pan' = (1 - k)(p - c) + k pan, whatever the fitted origin
        AreaView {
            zoom,
            pan_x: (1.0 - k) * (pointer.x - cx) + k * self.pan_x,
            pan_y: (1.0 - k) * (pointer.y - cy) + k * self.pan_y,
        }
    }

    /// The view moved by (dx, dy) CSS pixels.
    pub fn panned(self, dx: f64, dy: f64) -> AreaView {
        AreaView { pan_x: self.pan_x + dx, pan_y: self.pan_y + dy, ..self }
    }

    /// `transform` (fitted to `area`) with this view's zoom and pan applied.
    fn apply(self, fitted: Transform, area: Rect) -> Transform {
        let (cx, cy) = centre(area);
        Transform {
            scale: fitted.scale * self.zoom,
            origin_x: cx + self.zoom * (fitted.origin_x - cx) + self.pan_x,
            origin_y: cy + self.zoom * (fitted.origin_y - cy) + self.pan_y,
        }
    }
}

fn centre(r: Rect) -> (f64, f64) {
    (r.x + r.w / 2.0, r.y + r.h / 2.0)
}

/// Force scales to keep (kN per CSS pixel, before zoom) instead of fitting: while the
/// user drags the design, the figure keeps its scale so a larger thrust draws longer.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct FixedScale {
    /// The reciprocal figure's scale, kN per px.
    pub figure: f64,
    /// The pole construction's scale, kN per px.
    pub pole: f64,
}

/// What the user asked of the force canvas.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ForceOptions {
    /// Display units of the numbers.
    pub units: Units,
    /// The truss member to highlight (index into the truss idealisation's members).
    pub highlight: Option<usize>,
    /// Zoom and pan per area, in area order ([`ForceDrawing::areas`]): the figure (or the
    /// thrust line) first, the pole construction second.
    pub views: [AreaView; 2],
    /// Scales to keep instead of fitting (force areas only; the thrust line, drawn in
    /// metres, always fits). `None` fits.
    pub fixed_scale: Option<FixedScale>,
}

impl Default for ForceOptions {
    fn default() -> Self {
        ForceOptions { units: Units::Si, highlight: None, views: [AreaView::FIT; 2], fixed_scale: None }
    }
}

/// One area of the force canvas with the transform it was drawn with.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ForceArea {
    /// What it shows.
    pub kind: AreaKind,
    /// Its rectangle on the canvas, CSS px (shapes are clipped to it).
    pub rect: Rect,
    /// World (kN, or m for the thrust line) to CSS px, zoom and pan included.
    pub transform: Transform,
    /// Pixels per world unit before zoom: fitted, or the fixed scale's.
    pub base_scale: f64,
}

/// A force scene with what the app needs to map a pointer back: the areas and their
/// transforms, and the labels that found no room.
#[derive(Debug, Clone, PartialEq)]
pub struct ForceDrawing {
    /// The scene; its `transform` is the first area's (the figure or the thrust line).
    pub scene: Scene,
    /// The areas, in the order of [`ForceOptions::views`].
    pub areas: Vec<ForceArea>,
    /// Texts of labels that found no room even in their short form.
    pub dropped: Vec<String>,
}

impl ForceDrawing {
    /// Index of the area under the CSS pixel `p`.
    pub fn area_at(&self, p: Px) -> Option<usize> {
        self.areas.iter().position(|a| a.rect.contains(&Rect::new(p.x, p.y, 0.0, 0.0)))
    }

    /// The truss member whose drawn segment (or zero-force ring) is within `tolerance`
    /// CSS pixels of `p`, nearest first; `None` when none is.
    pub fn member_at(&self, p: Px, tolerance: f64) -> Option<usize> {
        self.scene
            .items
            .iter()
            .filter_map(|it| {
                let Tag::Member { member } = it.tag else { return None };
                let d = match &it.shape {
                    Shape::Line { from, to } => distance_to_segment(p, *from, *to),
                    Shape::Circle { center, radius } => {
                        ((p.x - center.x).hypot(p.y - center.y) - radius).max(0.0)
                    }
                    _ => return None,
                };
                (d <= tolerance).then_some((member, d))
            })
            .min_by(|a, b| a.1.total_cmp(&b.1))
            .map(|(m, _)| m)
    }

    /// The label whose box holds `p` (the last painted on top), if any.
    pub fn label_at(&self, p: Px) -> Option<&Label> {
        self.scene.labels.iter().rev().find(|l| l.rect.contains(&Rect::new(p.x, p.y, 0.0, 0.0)))
    }

    /// The force scales now drawn (before zoom), to keep fixed during a drag; `None`
    /// when no force area is drawn (a thrust line alone, or a message). A missing pole
    /// area keeps the figure's scale for both, a missing figure the pole's.
    pub fn fixed_scale(&self) -> Option<FixedScale> {
        let per_px = |k: AreaKind| self.areas.iter().find(|a| a.kind == k).map(|a| 1.0 / a.base_scale);
        let figure = per_px(AreaKind::Figure).or_else(|| per_px(AreaKind::Pole))?;
        Some(FixedScale { figure, pole: per_px(AreaKind::Pole).unwrap_or(figure) })
    }
}

/// The force canvas of load case `case` (index into `analysis.load_cases`) for a canvas
/// `viewport`, as a scene. See [`force_drawing`].
pub fn force_scene(analysis: &Analysis, case: usize, opts: &ForceOptions, viewport: Viewport) -> Scene {
    force_drawing(analysis, case, opts, viewport).scene
}

/// The force canvas of load case `case` (index into `analysis.load_cases`) for a canvas
/// `viewport` (CSS px): for braced designs the truss idealisation's reciprocal figure and
/// the bare rib's pole construction in two areas; for unbraced ones the frame model's
/// thrust line; otherwise the reason nothing is drawn. Forces in kN (shown in
/// `opts.units`), tension positive; members drawn by sign (tension dashed, compression
/// solid, zero-force a ring at its point). A case index that does not exist gives the
/// message scene.
pub fn force_drawing(
    analysis: &Analysis,
    case: usize,
    opts: &ForceOptions,
    viewport: Viewport,
) -> ForceDrawing {
    let Some(figs) = analysis.load_cases.get(case) else {
        return message(viewport, "Force diagram not available", "there is no such load case");
    };
    // the case's one title on the canvas, its full description (in the chosen units) on hover
    let case_words = (figs.description.title(), figs.description.describe(opts.units));
    let why = || figs.notes.iter().map(|n| n.to_string()).collect::<Vec<_>>().join("; ");
    if analysis.truss.is_some() {
        match &figs.force_diagram {
            Some(figure) => braced(
                figure,
                figs.rib_funicular.as_ref().map(|r| (&r.construction, figs.form_pole)),
                (&case_words.0, &case_words.1),
                opts,
                viewport,
            ),
            None => message(viewport, "Force diagram not available", &why()),
        }
    } else {
        match &figs.thrust_line {
            Some(tl) => thrust(
                tl,
                figs.rib_funicular.as_ref().map(|r| (&r.construction, figs.form_pole)),
                (&case_words.0, &case_words.1),
                opts,
                viewport,
            ),
            None => message(viewport, "Thrust line not available", &why()),
        }
    }
}

// ---------------------------------------------------------------------------------------
// header: title, case and key lines at the top, clear of the app's buttons

/// Lays out header lines from the top; returns the labels and the bottom of the header.
struct Header {
    labels: Vec<Label>,
    items: Vec<Item>,
    y: f64,
    width: f64,
}

impl Header {
    fn new(viewport: Viewport) -> Header {
        Header { labels: Vec::new(), items: Vec::new(), y: MARGIN, width: viewport.width }
    }

    /// A header opened with the drawing's title and the load case line (its short title,
    /// the full description on hover).
    fn titled(viewport: Viewport, title: &str, case_words: (&str, &str)) -> Header {
        let mut h = Header::new(viewport);
        h.line(title, TextSize::Title, Ink::Text);
        h.line_with_detail(case_words, TextSize::Small, Ink::Secondary);
        h
    }

    /// Width available to a line starting at the current height (narrower beside the
    /// buttons' corner).
    fn line_width(&self) -> f64 {
        let full = self.width - 2.0 * MARGIN;
        if self.y < CONTROLS_HEIGHT + 4.0 { full - CONTROLS_WIDTH } else { full }.max(20.0)
    }

    /// One line, shortened with "…" when it does not fit (the full text goes to hover).
    fn line(&mut self, text: &str, size: TextSize, ink: Ink) {
        let w = self.line_width();
        let shown = place::fit_text(text, size, w);
        let rect = place::text_box(&shown, size, MARGIN, self.y + size.box_height() / 2.0);
        let detail = (shown != text).then(|| text.to_string());
        self.labels.push(Label { text: shown, size, ink, rect, boxed: false, leader: None, detail });
        self.y += size.box_height();
    }

    /// One line `text` (shortened with "…" when it does not fit) whose hover shows
    /// `detail` (a case's title shown, its full description on hover).
    fn line_with_detail(&mut self, (text, detail): (&str, &str), size: TextSize, ink: Ink) {
        self.line(text, size, ink);
        if let Some(l) = self.labels.last_mut() {
            l.detail = Some(detail.to_string());
        }
    }

    /// A paragraph wrapped at spaces to the width.
    fn paragraph(&mut self, text: &str, size: TextSize, ink: Ink) {
        let mut line = String::new();
        for word in text.split(' ') {
            let candidate = if line.is_empty() { word.to_string() } else { format!("{line} {word}") };
            if !line.is_empty() && place::text_width(&candidate, size) + 2.0 * PAD_X > self.line_width() {
                let done = std::mem::replace(&mut line, word.to_string());
                self.line(&done, size, ink);
            } else {
                line = candidate;
            }
        }
        if !line.is_empty() {
            self.line(&line, size, ink);
        }
    }

    /// A key: sample strokes followed by words, wrapped like [`place::flow`].
    fn key(&mut self, entries: &[(Sample, &str)]) {
        const SAMPLE: f64 = 20.0;
        let size = TextSize::Small;
        let h = size.box_height();
        let mut x = MARGIN;
        let mut started = false;
        for (sample, text) in entries {
            let w = SAMPLE + place::text_width(text, size) + 2.0 * PAD_X;
            if started && x + w > MARGIN + self.line_width() {
                x = MARGIN;
                self.y += h;
            }
            started = true;
            let mid = self.y + h / 2.0;
            let (a, b) = (Px::new(x + 2.0, mid), Px::new(x + SAMPLE - 3.0, mid));
            match sample {
                Sample::Line(stroke) => {
                    self.items.push(Item::stroked(Shape::Line { from: a, to: b }, *stroke))
                }
                Sample::Ring => self.items.push(ring(Px::new(x + SAMPLE / 2.0, mid), 3.5)),
            }
            let rect = place::text_box(text, size, x + SAMPLE, mid);
            self.labels.push(Label {
                text: text.to_string(),
                size,
                ink: Ink::Secondary,
                rect,
                boxed: false,
                leader: None,
                detail: None,
            });
            x += w + 8.0;
        }
        if started {
            self.y += h;
        }
    }
}

enum Sample {
    Line(Stroke),
    Ring,
}

fn ring(center: Px, radius: f64) -> Item {
    Item {
        shape: Shape::Circle { center, radius },
        stroke: Some(Stroke::solid(Ink::Zero, 1.5)),
        fill: Some(Ink::Background),
        tag: Tag::None,
    }
}

fn message(viewport: Viewport, title: &str, why: &str) -> ForceDrawing {
    let mut h = Header::new(viewport);
    h.line(title, TextSize::Title, Ink::Text);
    h.paragraph(if why.is_empty() { "no reason was given" } else { why }, TextSize::Body, Ink::Secondary);
    let mut scene = Scene::new(viewport);
    scene.world_unit = "kN";
    scene.items = h.items;
    scene.labels = h.labels;
    ForceDrawing { scene, areas: Vec::new(), dropped: Vec::new() }
}

// ---------------------------------------------------------------------------------------
// braced: reciprocal figure and pole construction

/// Member stroke by sign: tension dashed teal, compression solid orange; width grows
/// with the square root of the force's share of the largest, in quarter-pixel steps (see
/// [`stepped_width`]).
fn member_stroke(force: f64, largest: f64) -> Stroke {
    let width = stepped_width(1.0 + 1.5 * (force.abs() / largest.max(1e-300)).sqrt(), 0.25);
    if force > 0.0 {
        Stroke::patterned(Ink::Tension, width, Pattern::Dashed)
    } else {
        Stroke::solid(Ink::Compression, width)
    }
}

fn bounds(points: impl IntoIterator<Item = (f64, f64)>) -> Option<(f64, f64, f64, f64)> {
    let b = points
        .into_iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY, f64::INFINITY, f64::NEG_INFINITY), |b, p| {
            (b.0.min(p.0), b.1.max(p.0), b.2.min(p.1), b.3.max(p.1))
        });
    (b.0.is_finite() && b.2.is_finite()).then_some(b)
}

/// A box of zero width or height is widened to a tenth of the other side, so a straight
/// load line still gets a sensible scale.
fn padded(b: (f64, f64, f64, f64)) -> (f64, f64, f64, f64) {
    let (w, h) = (b.1 - b.0, b.3 - b.2);
    let least = 0.1 * w.max(h).max(1e-9);
    let (dx, dy) = (((least - w) / 2.0).max(0.0), ((least - h) / 2.0).max(0.0));
    (b.0 - dx, b.1 + dx, b.2 - dy, b.3 + dy)
}

/// The transform of world box `b` in `inner`: fitted, or at `fixed_per_px` (kN per px)
/// centred on the box.
fn fitted(b: (f64, f64, f64, f64), inner: Rect, fixed_per_px: Option<f64>) -> Transform {
    let fit = Transform::fit(padded(b), inner);
    match fixed_per_px {
        Some(k) if k.is_finite() && k > 0.0 => {
            let scale = 1.0 / k;
            let (cx, cy) = centre(inner);
            let (mx, my) = ((b.0 + b.1) / 2.0, (b.2 + b.3) / 2.0);
            Transform { scale, origin_x: cx - scale * mx, origin_y: cy + scale * my }
        }
        _ => fit,
    }
}

/// The two areas for the body: side by side or stacked, whichever gives the smaller of
/// the two fitted scales the larger value.
fn split(body: Rect, first: (f64, f64, f64, f64), second: (f64, f64, f64, f64)) -> (Rect, Rect) {
    let side = {
        let w1 = ((body.w - AREA_GAP) * 0.58).floor();
        (
            Rect::new(body.x, body.y, w1, body.h),
            Rect::new(body.x + w1 + AREA_GAP, body.y, body.w - w1 - AREA_GAP, body.h),
        )
    };
    let stacked = {
        let h1 = ((body.h - AREA_GAP) * 0.58).floor();
        (
            Rect::new(body.x, body.y, body.w, h1),
            Rect::new(body.x, body.y + h1 + AREA_GAP, body.w, body.h - h1 - AREA_GAP),
        )
    };
    let worst = |(a, b): (Rect, Rect)| {
        let s = |r: Rect, bx| Transform::fit(padded(bx), inner_of(r, TextSize::Small.box_height())).scale;
        s(a, first).min(s(b, second))
    };
    if worst(side) >= worst(stacked) {
        side
    } else {
        stacked
    }
}

/// The canvas below the header lines that end at `top`, inside the margin (at least
/// 20 px tall, so a tiny canvas still gets a drawing area).
fn body_below(top: f64, viewport: Viewport) -> Rect {
    Rect::new(
        MARGIN,
        top + 4.0,
        viewport.width - 2.0 * MARGIN,
        (viewport.height - top - 4.0 - MARGIN).max(20.0),
    )
}

/// The note for `hidden` space labels that found no room in `area`, and its box in the
/// area's bottom-left corner: "3 labels hidden: zoom in".
fn hidden_note(hidden: usize, area: Rect) -> (String, Rect) {
    let text = format!("{} hidden: zoom in", crate::error::counted(hidden, "label", "labels"));
    let size = TextSize::Small;
    let rect = place::text_box(&text, size, area.x + 4.0, area.bottom() - 2.0 - size.box_height() / 2.0);
    (text, rect)
}

/// When `hidden` space labels found no room in `area`, says so in the area's bottom-left
/// corner ("3 labels hidden: zoom in"), making room by leaving out the space labels
/// (indices `space_labels` into `placed`) under the note, which are then counted and
/// listed in `dropped` too. Without room even so (another kind of label there), no note.
fn say_hidden(
    placed: &mut Vec<Label>,
    space_labels: &[usize],
    mut hidden: usize,
    area: Rect,
    dropped: &mut Vec<String>,
) {
    if hidden == 0 {
        return;
    }
    let mut is_space: Vec<bool> = (0..placed.len()).map(|i| space_labels.contains(&i)).collect();
    // the note grows with the count it says; a few rounds settle it
    for _ in 0..4 {
        let (text, rect) = hidden_note(hidden, area);
        let under: Vec<usize> = placed
            .iter()
            .enumerate()
            .filter(|(_, l)| l.rect.grown(1.0).overlaps(&rect))
            .map(|(i, _)| i)
            .collect();
        // an area too narrow for the note, or another kind of label under it: no note
        if rect.right() > area.right() - 2.0
            || under.iter().any(|&i| !is_space.get(i).copied().unwrap_or(false))
        {
            return;
        }
        if under.is_empty() {
            let size = TextSize::Small;
            placed.push(Label {
                text,
                size,
                ink: Ink::Secondary,
                rect,
                boxed: true,
                leader: None,
                detail: None,
            });
            return;
        }
        for &i in under.iter().rev() {
            dropped.push(placed.remove(i).text);
            is_space.remove(i);
            hidden += 1;
        }
    }
}

/// The drawing room of an area below its caption line.
fn inner_of(area: Rect, caption: f64) -> Rect {
    Rect::new(
        area.x + AREA_PAD,
        area.y + caption + AREA_PAD,
        (area.w - 2.0 * AREA_PAD).max(10.0),
        (area.h - caption - 2.0 * AREA_PAD).max(10.0),
    )
}

/// Collects the shapes of one area, clipped to it.
struct Painter {
    clip: Rect,
    items: Vec<Item>,
}

impl Painter {
    fn line(&mut self, a: Px, b: Px, stroke: Stroke, tag: Tag) {
        if let Some((p, q)) = clip_segment(a, b, self.clip) {
            self.items.push(Item::stroked(Shape::Line { from: p, to: q }, stroke).tagged(tag));
        }
    }
    fn path(&mut self, points: &[Px], stroke: Stroke) {
        for run in clip_polyline(points, self.clip) {
            self.items.push(Item::stroked(Shape::Path { points: run, closed: false }, stroke));
        }
    }
    fn polygon(&mut self, points: &[Px], fill: Ink) {
        let clipped = clip_polygon(points, self.clip);
        if clipped.len() >= 3 {
            self.items.push(Item::filled(Shape::Path { points: clipped, closed: true }, fill));
        }
    }
    fn circle(&mut self, center: Px, radius: f64, stroke: Option<Stroke>, fill: Option<Ink>, tag: Tag) {
        if self.clip.contains(&Rect::new(center.x, center.y, 0.0, 0.0)) {
            self.items.push(Item { shape: Shape::Circle { center, radius }, stroke, fill, tag });
        }
    }
    fn inside(&self, p: Px) -> bool {
        self.clip.contains(&Rect::new(p.x, p.y, 0.0, 0.0))
    }
}

/// An area's frame, its caption (the first of `captions` that fits the width, else the
/// last shortened; the full first one on hover) and a placer for its labels that keeps
/// the caption free.
fn open_area(area: Rect, captions: &[String]) -> (Item, Label, Placer) {
    let frame = Item::stroked(Shape::Box { rect: area }, Stroke::solid(Ink::Ray, 1.0));
    let mut placer = Placer::new(area);
    let size = TextSize::Small;
    let room = area.w - 8.0;
    let full = captions.first().cloned().unwrap_or_default();
    let shown = captions
        .iter()
        .find(|c| place::text_width(c, size) + 2.0 * PAD_X <= room)
        .cloned()
        .unwrap_or_else(|| place::fit_text(captions.last().map_or("", |c| c.as_str()), size, room));
    let rect = place::text_box(&shown, size, area.x + 4.0, area.y + 2.0 + size.box_height() / 2.0);
    let detail = (shown != full).then_some(full);
    placer.reserve(rect);
    let label = Label { text: shown, size, ink: Ink::Secondary, rect, boxed: true, leader: None, detail };
    (frame, label, placer)
}

fn braced(
    figure: &ForceDiagram,
    pole: Option<(&PoleConstruction, Option<crate::geom::Point>)>,
    case_words: (&str, &str),
    opts: &ForceOptions,
    viewport: Viewport,
) -> ForceDrawing {
    let units = opts.units;
    let mut h = Header::titled(viewport, "Force diagram · truss idealisation", case_words);
    let largest = figure.largest_force.max(1e-9);
    h.key(&[
        (Sample::Line(Stroke::patterned(Ink::Tension, 2.0, Pattern::Dashed)), "tension"),
        (Sample::Line(Stroke::solid(Ink::Compression, 2.0)), "compression"),
        (Sample::Ring, "zero force"),
        (Sample::Line(Stroke::solid(Ink::Load, 3.0)), "loads"),
        (Sample::Line(Stroke::solid(Ink::Reaction, 3.0)), "reactions"),
    ]);
    // on a short canvas the figure needs the room more than the reading hint
    if viewport.height >= SHORT_CANVAS {
        h.line("letters: spaces between external forces · numbers: panels", TextSize::Small, Ink::Secondary);
    }
    if figure.pass_through {
        h.line(
            "crossed bracing: drawn through pass-through joints at the crossings",
            TextSize::Small,
            Ink::Secondary,
        );
    }
    let body = body_below(h.y, viewport);
    let fig_box =
        bounds(figure.spaces.iter().map(|s| (s.point.x, s.point.y))).unwrap_or((0.0, 1.0, 0.0, 1.0));
    let (pole, form_pole) = match pole {
        Some((pc, form)) => (Some(pc), form),
        None => (None, None),
    };
    let pole_box = pole.and_then(|pc| pole_bounds(pc, form_pole));
    let (fig_rect, pole_rect) = match pole_box {
        Some(pb) => {
            let (a, b) = split(body, fig_box, pb);
            (a, Some(b))
        }
        None => (body, None),
    };
    let caption_h = TextSize::Small.box_height();
    let mut drawing_items = h.items;
    let mut labels = h.labels;
    let mut dropped = Vec::new();
    let mut areas = Vec::new();

    // the reciprocal figure
    let fit = fitted(fig_box, inner_of(fig_rect, caption_h), opts.fixed_scale.map(|f| f.figure));
    let t = opts.views[0].apply(fit, fig_rect);
    areas.push(ForceArea { kind: AreaKind::Figure, rect: fig_rect, transform: t, base_scale: fit.scale });
    let per50 = units.show(Quantity::Force, 50.0 / t.scale);
    let captions = [
        format!("reciprocal figure · 50 px = {per50}"),
        format!("figure · 50 px = {per50}"),
        format!("50 px = {per50}"),
    ];
    let (frame, caption, mut placer) = open_area(fig_rect, &captions);
    drawing_items.push(frame);
    labels.push(caption);
    let mut pen = Painter { clip: fig_rect, items: Vec::new() };
    // over the members' lines: the rings of zero-force members, then the highlighted member
    let mut rings = Painter { clip: fig_rect, items: Vec::new() };
    let mut highlighted = Painter { clip: fig_rect, items: Vec::new() };
    let at = |p: crate::geom::Point| t.px(p.x, p.y);
    // a segment's two ends on the canvas (its spaces are the figure's own)
    let ends = |seg: &Segment| {
        Some((at(figure.spaces.get(seg.left)?.point), at(figure.spaces.get(seg.right)?.point)))
    };
    for seg in &figure.segments {
        let SegmentOf::Member { member } = seg.of else { continue };
        let Some((l, r)) = ends(seg) else { continue };
        let tag = Tag::Member { member };
        if opts.highlight == Some(member) {
            highlighted.line(l, r, Stroke::solid(Ink::HighlightHalo, 11.0), Tag::None);
            highlighted.line(l, r, Stroke::solid(Ink::Highlight, 3.0), tag);
            if seg.zero {
                highlighted.circle(
                    l,
                    5.0,
                    Some(Stroke::solid(Ink::Highlight, 2.0)),
                    Some(Ink::Background),
                    tag,
                );
            }
        } else if seg.zero {
            // a zero-force member is a point of the figure: an open ring marks it
            rings.circle(l, 3.0, Some(Stroke::solid(Ink::Zero, 1.5)), Some(Ink::Background), tag);
        } else {
            pen.line(l, r, member_stroke(seg.force, largest), tag);
        }
    }
    // the figure's lines meet only at its points: drawn a weight at a time, each one path
    group_by_stroke(&mut pen.items);
    pen.items.append(&mut rings.items);
    pen.items.append(&mut highlighted.items);
    // external forces on top: the load line must stay visible however short
    for seg in &figure.segments {
        let ink = match seg.of {
            SegmentOf::Load { .. } => Ink::Load,
            SegmentOf::Reaction { .. } => Ink::Reaction,
            SegmentOf::Member { .. } => continue,
        };
        let Some((l, r)) = ends(seg) else { continue };
        pen.line(r, l, Stroke::solid(ink, 3.0), Tag::None);
    }
    // the highlighted member's force first: it is what the user is looking at
    if let Some(k) = opts.highlight {
        let segs: Vec<_> =
            figure.segments.iter().filter(|s| s.of == SegmentOf::Member { member: k }).collect();
        if let Some((seg, (l, r))) = segs.first().and_then(|seg| Some((seg, ends(seg)?))) {
            let mid = Px::new((l.x + r.x) / 2.0, (l.y + r.y) / 2.0);
            let n = if seg.zero || seg.force.abs() <= ZERO_FORCE * largest { 0.0 } else { seg.force };
            let text = format!("{} N = {} · all ribs together", seg.name, signed(units, n));
            if pen.inside(mid) {
                let req = Request::new(text.clone(), TextSize::Body, Ink::Highlight, mid)
                    .short(format!("N = {}", signed(units, n)));
                if placer.place(req).is_none() {
                    dropped.push(text);
                }
            }
        }
    }
    let (mut hidden, mut space_labels) = (0usize, Vec::new());
    for group in space_groups(figure, at) {
        if !pen.inside(group.at) {
            continue;
        }
        let ink = if group.outside.is_empty() { Ink::Secondary } else { Ink::Text };
        let (text, short) = group.texts();
        let mut req = Request::new(text.clone(), TextSize::Small, ink, group.at)
            .gap(4.0)
            .detail(format!("spaces {text}"));
        if let Some(short) = short {
            req = req.short(short);
        }
        match placer.place(req) {
            Some(i) => space_labels.push(i),
            None => {
                dropped.push(text);
                hidden += 1;
            }
        }
    }
    drawing_items.extend(pen.items);
    let mut placed = placer.finish();
    // space labels that found no room are said to be there, in the area's bottom corner
    say_hidden(&mut placed, &space_labels, hidden, fig_rect, &mut dropped);
    labels.extend(placed);

    // the pole construction
    if let (Some(pc), Some(rect), Some(pb)) = (pole, pole_rect, pole_box) {
        let (area, items, placed, lost) = pole_area(pc, form_pole, rect, pb, opts);
        areas.push(area);
        drawing_items.extend(items);
        labels.extend(placed);
        dropped.extend(lost);
    }
    let mut scene = Scene::new(viewport);
    scene.world_unit = "kN";
    scene.transform = Some(t);
    scene.items = drawing_items;
    scene.labels = labels;
    ForceDrawing { scene, areas, dropped }
}

/// A signed force for labels: "−1 234 kN" (compression) or "+1 234 kN" (tension).
fn signed(units: Units, n: f64) -> String {
    let s = units.show(Quantity::Force, n);
    if n > 0.0 {
        format!("+{s}")
    } else {
        s
    }
}

/// Runs of consecutive keys written "first–last": A, B, C, D -> "A–D"; 3, 4 -> "3, 4".
/// Returns each run's text and how many names it holds.
fn runs(mut items: Vec<(usize, String)>) -> Vec<(String, usize)> {
    crate::order::sort_by_key(&mut items, |i| i.0);
    // each run: its first and last item and how many it holds
    type Keyed = (usize, String);
    let mut found: Vec<(&Keyed, &Keyed, usize)> = Vec::new();
    for item in &items {
        match found.last_mut() {
            Some((_, last, count)) if item.0 == last.0 + 1 => {
                *last = item;
                *count += 1;
            }
            _ => found.push((item, item, 1)),
        }
    }
    found
        .into_iter()
        .map(|(first, last, count)| match count {
            1 => (first.1.clone(), 1),
            2 => (format!("{}, {}", first.1, last.1), 2),
            n => (format!("{}–{}", first.1, last.1), n),
        })
        .collect()
}

/// Spaces written as one label: those at one point of the figure, or so close on screen
/// that separate labels would pile up.
#[derive(Debug, Clone, PartialEq)]
struct SpaceGroup {
    /// Outside spaces: (order around the structure, letter).
    outside: Vec<(usize, String)>,
    /// Inside spaces: (number, label).
    inside: Vec<(usize, String)>,
    /// Where the label points, CSS px (the first space's point).
    at: Px,
}

impl SpaceGroup {
    /// Runs of the names ("O–Q, 3, 4") and, when there is more than one run, the first
    /// run with a count of the rest ("O–Q +2").
    fn texts(&self) -> (String, Option<String>) {
        let total = self.outside.len() + self.inside.len();
        let mut parts = runs(self.outside.clone());
        parts.extend(runs(self.inside.clone()));
        let text = parts.iter().map(|p| p.0.as_str()).collect::<Vec<_>>().join(", ");
        let short = parts
            .first()
            .filter(|_| parts.len() > 1)
            .map(|first| format!("{} +{}", first.0, total - first.1));
        (text, short)
    }
}

/// Pixels within which space points share one label.
const CLUSTER_PX: f64 = 9.0;

/// The figure's spaces grouped for labelling: spaces at one point (within `ZERO_FORCE`
/// of the largest force) always, and points closer than [`CLUSTER_PX`] on screen (`at`
/// maps a point to pixels) too, so a crowded figure shows one label per cluster and
/// zooming in separates them.
fn space_groups(figure: &ForceDiagram, at: impl Fn(crate::geom::Point) -> Px) -> Vec<SpaceGroup> {
    let tol = ZERO_FORCE * figure.largest_force.max(1e-9);
    let mut groups: Vec<(SpaceGroup, crate::geom::Point)> = Vec::new();
    let mut n_out = 0usize;
    for (index, sp) in figure.spaces.iter().enumerate() {
        let p = sp.point;
        let q = at(p);
        let found = groups.iter().position(|(g, w)| {
            ((w.x - p.x).abs() <= tol && (w.y - p.y).abs() <= tol)
                || (g.at.x - q.x).hypot(g.at.y - q.y) < CLUSTER_PX
        });
        let k = match found {
            Some(k) => k,
            None => {
                groups.push((SpaceGroup { outside: Vec::new(), inside: Vec::new(), at: q }, p));
                groups.len() - 1
            }
        };
        let Some((group, _)) = groups.get_mut(k) else { continue };
        if sp.kind == SpaceKind::Outside {
            group.outside.push((n_out, sp.label.clone()));
            n_out += 1;
        } else {
            // inside faces are numbered in order, so the number is the key
            let key = sp.label.parse::<usize>().unwrap_or(index);
            group.inside.push((key, sp.label.clone()));
        }
    }
    groups.into_iter().map(|(g, _)| g).collect()
}

// ---------------------------------------------------------------------------------------
// unbraced: the thrust line

/// Draws the rib's pole construction `pc` (and, for a rib that is not three-hinged, the
/// form's pole `form_pole` beside the solver's) in `rect`, fitted to `pb` (its bounds)
/// with the second area view; returns the area, its items, labels and dropped texts.
fn pole_area(
    pc: &PoleConstruction,
    form_pole: Option<crate::geom::Point>,
    rect: Rect,
    pb: (f64, f64, f64, f64),
    opts: &ForceOptions,
) -> (ForceArea, Vec<Item>, Vec<Label>, Vec<String>) {
    let units = opts.units;
    let caption_h = TextSize::Small.box_height();
    let mut drawing_items = Vec::new();
    let mut labels = Vec::new();
    let mut dropped = Vec::new();
    let fit = fitted(pb, inner_of(rect, caption_h), opts.fixed_scale.map(|f| f.pole));
    let tp = opts.views[1].apply(fit, rect);
    let area = ForceArea { kind: AreaKind::Pole, rect, transform: tp, base_scale: fit.scale };
    let per50 = units.show(Quantity::Force, 50.0 / tp.scale);
    let captions = [
        format!("rib's pole construction · bare rib · 50 px = {per50}"),
        format!("bare rib's poles · 50 px = {per50}"),
        format!("bare rib · 50 px = {per50}"),
        format!("50 px = {per50}"),
    ];
    let (frame, caption, mut placer) = open_area(rect, &captions);
    drawing_items.push(frame);
    labels.push(caption);
    let mut pen = Painter { clip: rect, items: Vec::new() };
    let at = |p: crate::geom::Point| tp.px(p.x, p.y);
    let pp = at(pc.pole);
    for (_, q) in &pc.rays {
        pen.line(pp, at(*q), Stroke::solid(Ink::Ray, 0.8), Tag::None);
    }
    let ll: Vec<Px> = pc.load_line.iter().map(|q| at(*q)).collect();
    pen.path(&ll, Stroke::solid(Ink::Load, 2.5));
    // the pole distance H: from the pole across to the load line
    let foot = tp.px(0.0, pc.pole.y);
    pen.line(pp, foot, Stroke::solid(Ink::Reaction, 2.0), Tag::None);
    pen.circle(pp, 3.5, None, Some(Ink::Text), Tag::None);
    // a rib that is not three-hinged: the form's pole too (the three-point construction
    // through the crown), hollow, with its thrust; the one the drag moves
    if let Some(f) = form_pole {
        let fp = at(f);
        pen.line(fp, tp.px(0.0, f.y), Stroke::patterned(Ink::Reaction, 1.2, Pattern::Dashed), Tag::None);
        pen.circle(fp, 4.5, Some(Stroke::solid(Ink::Text, 1.5)), Some(Ink::Background), Tag::None);
        if pen.inside(fp) {
            let text = format!("form's pole, H = {}", units.show(Quantity::Force, -f.x));
            let req = Request::new(text.clone(), TextSize::Small, Ink::Text, fp)
                .sides(&[Side::Below, Side::BelowLeft, Side::Above, Side::AboveLeft])
                .short("form's pole".to_string());
            if placer.place(req).is_none() {
                dropped.push(text);
            }
        }
    }
    if pen.inside(pp) {
        let req = Request::new(POLE_NAME, TextSize::Small, Ink::Text, pp).sides(&[
            Side::Left,
            Side::BelowLeft,
            Side::AboveLeft,
            Side::Below,
            Side::Above,
        ]);
        if placer.place(req).is_none() {
            dropped.push(POLE_NAME.to_string());
        }
    }
    let mid = Px::new((pp.x + foot.x) / 2.0, pp.y);
    if pen.inside(mid) {
        let h_text = format!("pole distance H = {}", units.show(Quantity::Force, -pc.pole.x));
        let req = Request::new(h_text.clone(), TextSize::Small, Ink::Reaction, mid)
            .sides(&[
                Side::Above,
                Side::Below,
                Side::AboveRight,
                Side::BelowRight,
                Side::AboveLeft,
                Side::BelowLeft,
            ])
            .short(format!("H = {}", units.show(Quantity::Force, -pc.pole.x)));
        if placer.place(req).is_none() {
            dropped.push(h_text);
        }
    }
    if let (Some(top), Some(bottom)) = (ll.first(), ll.last()) {
        let total = pc.load_line.first().map(|a| a.y).unwrap_or(0.0)
            - pc.load_line.last().map(|b| b.y).unwrap_or(0.0);
        let mid = Px::new(top.x, (top.y + bottom.y) / 2.0);
        if pen.inside(mid) {
            let text = format!("rib loads ΣP = {}", units.show(Quantity::Force, total));
            let req = Request::new(text.clone(), TextSize::Small, Ink::Load, mid)
                .sides(&[Side::Right, Side::AboveRight, Side::BelowRight])
                .short(format!("ΣP = {}", units.show(Quantity::Force, total)));
            if placer.place(req).is_none() {
                dropped.push(text);
            }
        }
    }
    drawing_items.extend(pen.items);
    labels.extend(placer.finish());
    (area, drawing_items, labels, dropped)
}

/// The bounds of a pole construction with the form's pole, kN.
fn pole_bounds(pc: &PoleConstruction, form_pole: Option<crate::geom::Point>) -> Option<(f64, f64, f64, f64)> {
    bounds(
        pc.load_line
            .iter()
            .map(|q| (q.x, q.y))
            .chain(std::iter::once((pc.pole.x, pc.pole.y)))
            .chain(form_pole.map(|f| (f.x, f.y))),
    )
}

fn thrust(
    tl: &ThrustLine,
    pole: Option<(&PoleConstruction, Option<crate::geom::Point>)>,
    case_words: (&str, &str),
    opts: &ForceOptions,
    viewport: Viewport,
) -> ForceDrawing {
    let units = opts.units;
    let mut h = Header::titled(viewport, "Thrust line · frame model rib", case_words);
    let axis: Vec<(f64, f64)> = tl.sections.iter().map(|s| (s.axis.x, s.axis.y)).collect();
    let b = bounds(axis.iter().copied()).unwrap_or((0.0, 1.0, 0.0, 1.0));
    // the header's height depends on the notes, which depend on the scale: lay the notes
    // out with the scale of a provisional body first (the exaggeration is rounded, so a
    // few pixels of header rarely change it)
    let provisional = Rect::new(
        MARGIN,
        h.y + 4.0 * TextSize::Small.box_height(),
        viewport.width - 2.0 * MARGIN,
        viewport.height,
    );
    let body_guess = Rect::new(
        provisional.x,
        provisional.y,
        provisional.w,
        (viewport.height - provisional.y - MARGIN).max(20.0),
    );
    let scale_guess = Transform::fit(padded(b), inner_of(body_guess, 0.0)).scale;
    let exaggeration = (24.0 / (tl.depth * scale_guess)).max(1.0).round();
    let gsf = tl.geometric_safety_factor.map(|g| format!("{g:.1}")).unwrap_or_else(|| "∞".into());
    h.paragraph(
        &format!(
            "offsets drawn ×{exaggeration:.0} · light band: rib depth {} · dark band: middle third",
            units.show(Quantity::Length, tl.depth)
        ),
        TextSize::Small,
        Ink::Secondary,
    );
    let verdict = if tl.inside_middle_third {
        "inside the middle third"
    } else if tl.inside_depth {
        "outside the middle third, inside the depth"
    } else {
        "outside the rib depth"
    };
    h.paragraph(
        &format!(
            "worst offset {} (circle) · {verdict} · geometric safety factor {gsf}",
            units.show(Quantity::Length, tl.max_offset)
        ),
        TextSize::Small,
        Ink::Secondary,
    );
    let body = body_below(h.y, viewport);
    // the rib's pole construction beside it (the pole one drags), in a third of the width
    let pole = pole.and_then(|(pc, form)| Some((pc, form, pole_bounds(pc, form)?)));
    let (rect, pole_rect) = match pole {
        Some(_) => {
            let w = (body.w * POLE_SHARE).max(0.0);
            (
                Rect::new(body.x, body.y, body.w - w - AREA_GAP, body.h),
                Some(Rect::new(body.x + body.w - w, body.y, w, body.h)),
            )
        }
        None => (body, None),
    };
    let fit = Transform::fit(padded(b), inner_of(rect, 0.0));
    let t = opts.views[0].apply(fit, rect);
    let normals = tl.section_normals();
    // offsets drawn larger by the exaggeration, in world metres along the normals
    // each section with its normal (one normal per section)
    let along = || tl.sections.iter().zip(&normals);
    let off = |(section, n): (&PressurePoint, &Vector), e: f64| {
        let a = section.axis;
        t.px(a.x + n.x * e * exaggeration, a.y + n.y * e * exaggeration)
    };
    let band =
        |e: f64| -> Vec<Px> { along().map(|s| off(s, e)).chain(along().rev().map(|s| off(s, -e))).collect() };
    let mut pen = Painter { clip: rect, items: Vec::new() };
    pen.polygon(&band(tl.depth / 2.0), Ink::DepthBand);
    pen.polygon(&band(tl.depth / 6.0), Ink::MiddleThird);
    let ax: Vec<Px> = along().map(|s| off(s, 0.0)).collect();
    pen.path(&ax, Stroke::solid(Ink::Compression, 1.0));
    let line: Vec<Px> = along().map(|s| off(s, s.0.offset)).collect();
    pen.path(&line, Stroke::solid(Ink::ThrustLine, 2.2));
    let mut placer = Placer::new(rect);
    let mut dropped = Vec::new();
    if let Some(w) = line.get(tl.worst).copied() {
        pen.circle(w, 5.0, Some(Stroke::solid(Ink::ThrustLine, 1.5)), Some(Ink::Background), Tag::None);
        if pen.inside(w) {
            let text = format!("worst offset {}", units.show(Quantity::Length, tl.max_offset));
            let req = Request::new(text.clone(), TextSize::Small, Ink::ThrustLine, w).gap(8.0);
            if placer.place(req).is_none() {
                dropped.push(text);
            }
        }
    }
    let mut items = h.items;
    items.extend(pen.items);
    let mut labels = h.labels;
    labels.extend(placer.finish());
    let mut areas = vec![ForceArea { kind: AreaKind::ThrustLine, rect, transform: t, base_scale: fit.scale }];
    if let (Some((pc, form, pb)), Some(r)) = (pole, pole_rect) {
        let (area, more, placed, lost) = pole_area(pc, form, r, pb, opts);
        areas.push(area);
        items.extend(more);
        labels.extend(placed);
        dropped.extend(lost);
    }
    let mut scene = Scene::new(viewport);
    scene.world_unit = "m";
    scene.transform = Some(t);
    scene.items = items;
    scene.labels = labels;
    ForceDrawing { scene, areas, dropped }
}

/// The share of the width the pole construction takes beside the thrust line.
const POLE_SHARE: f64 = 0.34;

// ---------------------------------------------------------------------------------------
// geometry: clipping to an area and distances

/// Distance from `p` to the segment a-b, CSS px.
pub fn distance_to_segment(p: Px, a: Px, b: Px) -> f64 {
    let (dx, dy) = (b.x - a.x, b.y - a.y);
    let l2 = dx * dx + dy * dy;
    let t = if l2 > 0.0 { (((p.x - a.x) * dx + (p.y - a.y) * dy) / l2).clamp(0.0, 1.0) } else { 0.0 };
    (p.x - a.x - t * dx).hypot(p.y - a.y - t * dy)
}

/// The part of segment a-b inside `r` (Liang–Barsky line clipping); `None` when none is.
fn clip_segment(a: Px, b: Px, r: Rect) -> Option<(Px, Px)> {
    let (dx, dy) = (b.x - a.x, b.y - a.y);
    let (mut t0, mut t1) = (0.0f64, 1.0f64);
    for (p, q) in [(-dx, a.x - r.x), (dx, r.right() - a.x), (-dy, a.y - r.y), (dy, r.bottom() - a.y)] {
        if p == 0.0 {
            if q < 0.0 {
                return None;
            }
        } else {
            let t = q / p;
            if p < 0.0 {
                t0 = t0.max(t);
            } else {
                t1 = t1.min(t);
            }
        }
    }
    if t0 > t1 || !t0.is_finite() || !t1.is_finite() {
        return None;
    }
    let at = |t: f64| Px::new(a.x + t * dx, a.y + t * dy);
    Some((if t0 > 0.0 { at(t0) } else { a }, if t1 < 1.0 { at(t1) } else { b }))
}

/// The runs of a polyline inside `r`, each a polyline of its own.
fn clip_polyline(points: &[Px], r: Rect) -> Vec<Vec<Px>> {
    let mut runs: Vec<Vec<Px>> = Vec::new();
    let mut current: Vec<Px> = Vec::new();
    for (&a, &b) in points.iter().zip(points.iter().skip(1)) {
        match clip_segment(a, b, r) {
            Some((p, q)) => {
                if current.last() != Some(&p) {
                    if current.len() >= 2 {
                        runs.push(std::mem::take(&mut current));
                    }
                    current = vec![p];
                }
                current.push(q);
            }
            None => {
                if current.len() >= 2 {
                    runs.push(std::mem::take(&mut current));
                }
                current.clear();
            }
        }
    }
    if current.len() >= 2 {
        runs.push(current);
    }
    runs
}

/// A polygon clipped to `r` (Sutherland–Hodgman); empty when nothing is inside.
fn clip_polygon(points: &[Px], r: Rect) -> Vec<Px> {
    type Inside = fn(Px, Rect) -> bool;
    type Cut = fn(Px, Px, Rect) -> Px;
    let edges: [(Inside, Cut); 4] = [
        (|p, r| p.x >= r.x, |a, b, r| cut_x(a, b, r.x)),
        (|p, r| p.x <= r.right(), |a, b, r| cut_x(a, b, r.right())),
        (|p, r| p.y >= r.y, |a, b, r| cut_y(a, b, r.y)),
        (|p, r| p.y <= r.bottom(), |a, b, r| cut_y(a, b, r.bottom())),
    ];
    let mut out: Vec<Px> = points.to_vec();
    for (inside, cut) in edges {
        if out.is_empty() {
            break;
        }
        let input = std::mem::take(&mut out);
        let Some(mut prev) = input.last().copied() else { break };
        for &p in &input {
            match (inside(p, r), inside(prev, r)) {
                (true, true) => out.push(p),
                (true, false) => {
                    out.push(cut(prev, p, r));
                    out.push(p);
                }
                (false, true) => out.push(cut(prev, p, r)),
                (false, false) => {}
            }
            prev = p;
        }
    }
    out
}

fn cut_x(a: Px, b: Px, x: f64) -> Px {
    let t = if b.x != a.x { (x - a.x) / (b.x - a.x) } else { 0.0 };
    Px::new(x, a.y + t * (b.y - a.y))
}

fn cut_y(a: Px, b: Px, y: f64) -> Px {
    let t = if b.y != a.y { (y - a.y) / (b.y - a.y) } else { 0.0 };
    Px::new(a.x + t * (b.x - a.x), y)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The case line of the header follows the units: a US half-span case in psf, kip/ft
    /// and ft, no SI unit left. The demo's traffic is 48.75 kN/m over the section (EN LM1,
    /// worked in `traffic::sharing`): 48.75 / 14.594 = 3.34 kip/ft, and over the 11 m deck
    /// 4.432 kN/m² / 0.04788 = 92.56 psf (NIST SP 811 factors).
    #[test]
    fn the_case_line_speaks_the_chosen_units() {
        use crate::arch::analysis::analyze;
        use crate::arch::design::Design;
        let a = analyze(&Design::demo()).expect("demo");
        let half = a
            .load_cases
            .iter()
            .position(|c| matches!(c.description, crate::arch::cases::CaseKind::HalfSpan { .. }))
            .expect("a half-span case");
        let opts = ForceOptions { units: Units::UsCustomary, ..Default::default() };
        let s = force_scene(&a, half, &opts, Viewport::new(900.0, 600.0));
        let line = s
            .labels
            .iter()
            .find(|l| l.text == "Traffic, left half")
            .and_then(|l| l.detail.clone())
            .expect("the case line, its title shown and its description on hover");
        assert!(line.contains("92.56\u{a0}psf") && line.contains("3.340\u{a0}kip/ft"), "{line}");
        assert!(line.contains("kip/ft") && line.contains("\u{a0}ft)"), "{line}");
        assert!(!line.contains("kN") && !line.contains("\u{a0}m)"), "{line}");
    }

    #[test]
    fn consecutive_labels_collapse_into_ranges() {
        let items = |v: &[(usize, &str)]| v.iter().map(|(k, s)| (*k, s.to_string())).collect::<Vec<_>>();
        assert_eq!(
            runs(items(&[(14, "O"), (15, "P"), (16, "Q"), (26, "AA")])),
            vec![("O–Q".to_string(), 3), ("AA".to_string(), 1)]
        );
        assert_eq!(runs(items(&[(3, "3"), (4, "4")])), vec![("3, 4".to_string(), 2)]);
        assert_eq!(runs(items(&[(7, "7")])), vec![("7".to_string(), 1)]);
    }

    #[test]
    fn zooming_about_a_point_keeps_the_world_point_under_it() {
        let area = Rect::new(10.0, 20.0, 300.0, 200.0);
        let fitted = Transform { scale: 0.05, origin_x: 140.0, origin_y: 90.0 };
        let pointer = Px::new(77.0, 150.0);
        let v0 = AreaView::FIT.panned(13.0, -4.0);
        let before = v0.apply(fitted, area).world(pointer);
        let v1 = v0.zoomed_about(1.7, pointer, area);
        let t1 = v1.apply(fitted, area);
        let after = t1.world(pointer);
        assert!(
            (before.0 - after.0).abs() < 1e-9 && (before.1 - after.1).abs() < 1e-9,
            "{before:?} {after:?}"
        );
        assert!((t1.scale - 0.05 * 1.7).abs() < 1e-15);
        // clamped at the limit: the pointer's point still stays put
        let v2 = v1.zoomed_about(1e6, pointer, area);
        assert_eq!(v2.zoom, ZOOM_LIMITS.1);
        let after = v2.apply(fitted, area).world(pointer);
        assert!((before.0 - after.0).abs() < 1e-9 && (before.1 - after.1).abs() < 1e-9);
        assert_eq!(v1.zoomed_about(f64::NAN, pointer, area), v1);
    }

    #[test]
    fn clipping_keeps_only_what_lies_inside() {
        let r = Rect::new(0.0, 0.0, 10.0, 10.0);
        let (p, q) = clip_segment(Px::new(-5.0, 5.0), Px::new(15.0, 5.0), r).expect("crosses");
        assert_eq!((p, q), (Px::new(0.0, 5.0), Px::new(10.0, 5.0)));
        assert_eq!(clip_segment(Px::new(-5.0, -1.0), Px::new(15.0, -1.0), r), None);
        let inside = (Px::new(1.0, 1.0), Px::new(2.0, 3.0));
        assert_eq!(clip_segment(inside.0, inside.1, r), Some(inside));
        // a path leaving and re-entering gives two runs
        let runs =
            clip_polyline(&[Px::new(1.0, 1.0), Px::new(20.0, 1.0), Px::new(20.0, 8.0), Px::new(1.0, 8.0)], r);
        assert_eq!(runs.len(), 2);
        // a square larger than the rectangle clips to the rectangle
        let poly = clip_polygon(
            &[Px::new(-5.0, -5.0), Px::new(15.0, -5.0), Px::new(15.0, 15.0), Px::new(-5.0, 15.0)],
            r,
        );
        let area: f64 = (0..poly.len())
            .map(|i| {
                let (a, b) = (poly[i], poly[(i + 1) % poly.len()]);
                a.x * b.y - b.x * a.y
            })
            .sum::<f64>()
            / 2.0;
        assert!((area.abs() - 100.0).abs() < 1e-9, "{poly:?}");
        assert!(clip_polygon(&[Px::new(20.0, 20.0), Px::new(30.0, 20.0), Px::new(30.0, 30.0)], r).is_empty());
    }

    #[test]
    fn the_pole_name_cannot_be_a_space_label() {
        // Bow's labels are capital letters or numerals
        assert!(POLE_NAME.chars().any(|c| c.is_ascii_lowercase()));
        assert!(!POLE_NAME.chars().all(|c| c.is_ascii_uppercase() || c.is_ascii_digit()));
    }
}
