//! Drawings as data. A [`Scene`] is everything one drawing shows, in CSS pixels of a canvas
//! of a given size (x right, y down): shapes with a typed stroke and fill, and labels
//! already placed so that no text covers other text or leaves the frame. The app paints a
//! scene on a canvas and does nothing else; a future SVG export writes the same scene.
//!
//! Builders (the elevation, the force diagram) take the analysis and a [`Viewport`]
//! and return a scene; [`place`] gives them the label placement.
//!
//! Colours are named by what they mean ([`Ink`]); [`Ink::css`] gives our palette.

pub mod elevation;
pub mod envelope;
pub mod force;
pub mod modes;
pub mod place;
pub mod readout;
pub mod sizing;
pub mod svg;
pub mod vehicle;

use serde::Serialize;

/// A point in CSS pixels, x right, y down.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Px {
    /// Pixels from the left edge.
    pub x: f64,
    /// Pixels from the top edge.
    pub y: f64,
}

impl Px {
    /// The point (x, y).
    pub const fn new(x: f64, y: f64) -> Px {
        Px { x, y }
    }
}

/// An axis-aligned rectangle in CSS pixels.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Rect {
    /// Left edge.
    pub x: f64,
    /// Top edge.
    pub y: f64,
    /// Width (not negative).
    pub w: f64,
    /// Height (not negative).
    pub h: f64,
}

impl Rect {
    /// The rectangle with top-left corner (x, y), width w and height h.
    pub const fn new(x: f64, y: f64, w: f64, h: f64) -> Rect {
        Rect { x, y, w, h }
    }
    /// Right edge.
    pub fn right(&self) -> f64 {
        self.x + self.w
    }
    /// Bottom edge.
    pub fn bottom(&self) -> f64 {
        self.y + self.h
    }
    /// Whether the interiors of the two rectangles overlap (touching edges do not).
    pub fn overlaps(&self, other: &Rect) -> bool {
        self.x < other.right() && other.x < self.right() && self.y < other.bottom() && other.y < self.bottom()
    }
    /// Whether `inner` lies wholly inside this rectangle (edges included).
    pub fn contains(&self, inner: &Rect) -> bool {
        inner.x >= self.x
            && inner.y >= self.y
            && inner.right() <= self.right()
            && inner.bottom() <= self.bottom()
    }
    /// Grown by `d` pixels on every side.
    pub fn grown(&self, d: f64) -> Rect {
        Rect::new(self.x - d, self.y - d, self.w + 2.0 * d, self.h + 2.0 * d)
    }
}

/// What a colour means. The painter (and any export) maps each to a colour with
/// [`Ink::css`]; meaning, not hue, is what the builders choose.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Ink {
    /// Canvas background.
    Background,
    /// Main text and joints.
    Text,
    /// Dimensions and secondary text.
    Secondary,
    /// Members in tension.
    Tension,
    /// Members in compression.
    Compression,
    /// Members with no force (below the solver's zero).
    Zero,
    /// Ground fill.
    GroundFill,
    /// Ground outline and points.
    Ground,
    /// Thrust blocks and abutments.
    Concrete,
    /// Applied loads.
    Load,
    /// Reactions.
    Reaction,
    /// Hover or keyboard highlight.
    Highlight,
    /// The translucent halo under a highlighted member.
    HighlightHalo,
    /// The thrust line.
    ThrustLine,
    /// The rib's depth band (translucent).
    DepthBand,
    /// The middle third band (translucent).
    MiddleThird,
    /// Rays of a pole construction (translucent).
    Ray,
    /// The light box behind a label.
    LabelBox,
    /// Handles the user can drag (fill).
    Handle,
    /// A member used below half its resistance (utilisation under 0.5).
    UseLight,
    /// Utilisation 0.5 to 0.7.
    UseModerate,
    /// Utilisation 0.7 to 0.9.
    UseHigh,
    /// Utilisation 0.9 to 1.0: nearly fully used, still passing.
    UseFull,
    /// Utilisation above 1.0: the member fails.
    UseOver,
    /// A member of a group that could not be sized (no utilisation).
    Unsized,
    /// A mode shape (buckled or vibrating) drawn over the elevation.
    ModeShape,
}

impl Ink {
    /// Every ink, for palette checks.
    pub const ALL: [Ink; 26] = [
        Ink::Background,
        Ink::Text,
        Ink::Secondary,
        Ink::Tension,
        Ink::Compression,
        Ink::Zero,
        Ink::GroundFill,
        Ink::Ground,
        Ink::Concrete,
        Ink::Load,
        Ink::Reaction,
        Ink::Highlight,
        Ink::HighlightHalo,
        Ink::ThrustLine,
        Ink::DepthBand,
        Ink::MiddleThird,
        Ink::Ray,
        Ink::LabelBox,
        Ink::Handle,
        Ink::UseLight,
        Ink::UseModerate,
        Ink::UseHigh,
        Ink::UseFull,
        Ink::UseOver,
        Ink::Unsized,
        Ink::ModeShape,
    ];

    /// Our palette (our own scheme): tension deep teal, compression burnt orange, quiet
    /// greys and earth tones for everything else so forces stand out. The zero-force grey
    /// and the highlight reach 3:1 contrast against the background (WCAG 2.1, 1.4.11
    /// non-text contrast), checked by a test.
    ///
    /// The utilisation scale (our own): grey-blue, blue, violet, burnt orange, deep
    /// crimson from light use to failure. Hue runs along the blue-orange axis that the
    /// common colour-vision deficiencies keep, lightness falls from the second band on,
    /// and the sizing view widens the line band by band, so the order reads without
    /// colour too; every band reaches 3:1 against the background.
    pub const fn css(self) -> &'static str {
        match self {
            Ink::Background => "#fbfaf7",
            Ink::Text => "#1f2a33",
            Ink::Secondary => "#4f5b64",
            Ink::Tension => "#0f7c86",
            Ink::Compression => "#c8611e",
            Ink::Zero => "#7b858b",
            Ink::GroundFill => "#e4dccb",
            Ink::Ground => "#8c7b5a",
            Ink::Concrete => "#b9b4aa",
            Ink::Load => "#6a4c93",
            Ink::Reaction => "#2d4f8a",
            Ink::Highlight => "#a8158f",
            Ink::HighlightHalo => "rgba(168,21,143,0.22)",
            Ink::ThrustLine => "#b0276b",
            Ink::DepthBand => "rgba(200,97,30,0.14)",
            Ink::MiddleThird => "rgba(200,97,30,0.28)",
            Ink::Ray => "rgba(79,91,100,0.45)",
            Ink::LabelBox => "rgba(251,250,247,0.88)",
            Ink::Handle => "#ffffff",
            Ink::UseLight => "#5b8fae",
            Ink::UseModerate => "#2f6db5",
            Ink::UseHigh => "#6a45a6",
            Ink::UseFull => "#b8560f",
            Ink::UseOver => "#8c0f2a",
            Ink::Unsized => "#7b858b",
            Ink::ModeShape => "#2a6e3f",
        }
    }
}

/// How a line is drawn along its length. Tension and compression differ in pattern as
/// well as colour, so a colour-blind reader or a grey print still tells them apart.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Pattern {
    /// A continuous line.
    Solid,
    /// Long dashes: dash and gap lengths in multiples of the line width.
    Dashed,
    /// Short dots.
    Dotted,
}

impl Pattern {
    /// Dash and gap lengths in CSS pixels for a line `width` pixels wide; empty for solid.
    pub fn dashes(self, width: f64) -> Vec<f64> {
        self.dash_and_gap(width).map_or_else(Vec::new, Vec::from)
    }

    /// [`Pattern::dashes`] without a list: the dash and the gap, `None` for solid (for a
    /// painter that compares them on every line).
    pub fn dash_and_gap(self, width: f64) -> Option<[f64; 2]> {
        match self {
            Pattern::Solid => None,
            Pattern::Dashed => Some([(3.0 * width).max(6.0), (1.6 * width).max(3.0)]),
            Pattern::Dotted => Some([width.max(1.5), (1.5 * width).max(3.0)]),
        }
    }
}

/// A stroke: ink, width in CSS pixels and pattern.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Stroke {
    /// Colour by meaning.
    pub ink: Ink,
    /// Width, CSS pixels.
    pub width: f64,
    /// Pattern along the line.
    pub pattern: Pattern,
}

impl Stroke {
    /// A solid stroke.
    pub const fn solid(ink: Ink, width: f64) -> Stroke {
        Stroke { ink, width, pattern: Pattern::Solid }
    }
    /// A stroke with a pattern.
    pub const fn patterned(ink: Ink, width: f64, pattern: Pattern) -> Stroke {
        Stroke { ink, width, pattern }
    }
}

/// `width` (CSS px) to the nearest multiple of `step` (px): a line weight graded by force
/// in steps, so members of like force share one stroke and a painter draws each step's
/// members as one path (the demo's elevation drew its 52 members in 52 stroke calls, each
/// in its own width; in steps and grouped, 11). A step of a quarter or half pixel is
/// finer than the eye reads a line's weight. A `step` of zero or less leaves the width as
/// it is.
pub fn stepped_width(width: f64, step: f64) -> f64 {
    if step > 0.0 {
        (width / step).round() * step
    } else {
        width
    }
}

/// Reorders `items` so that items of equal stroke (ink, width, pattern) follow one
/// another: the strokes in the order they first appear, each stroke's items in their
/// order (a stable grouping). For a layer whose items may overlap in any order (the
/// members of a drawing, which meet only at their joints): consecutive lines in one
/// stroke are one path and one stroke call for a painter. Other layers keep their order.
pub fn group_by_stroke(items: &mut [Item]) {
    let mut strokes: Vec<Option<Stroke>> = Vec::new();
    for item in items.iter() {
        if !strokes.contains(&item.stroke) {
            strokes.push(item.stroke);
        }
    }
    // the engine's one stable sort, keyed on the order each stroke first appears in
    crate::order::sort_by_key(items, |item| strokes.iter().position(|s| *s == item.stroke));
}

/// A geometric shape in CSS pixels.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "shape", rename_all = "snake_case")]
pub enum Shape {
    /// A straight line.
    Line {
        /// Start.
        from: Px,
        /// End.
        to: Px,
    },
    /// Connected straight lines; closed back to the first point when `closed`.
    Path {
        /// Points in order.
        points: Vec<Px>,
        /// Whether the last point joins the first (a polygon).
        closed: bool,
    },
    /// A circle.
    Circle {
        /// Centre.
        center: Px,
        /// Radius, pixels.
        radius: f64,
    },
    /// An arrow: a line from `tail` to `head` with a filled head `head_size` pixels long.
    Arrow {
        /// Tail.
        tail: Px,
        /// Tip.
        head: Px,
        /// Head length, pixels.
        head_size: f64,
    },
    /// A rectangle.
    Box {
        /// The rectangle.
        rect: Rect,
    },
}

/// What a shape stands for, so a painter, a test or a pointer can find it.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Tag {
    /// Decoration (ground, blocks, dimension lines).
    None,
    /// Member `member` of the model the drawing shows.
    Member {
        /// Index into that model's members.
        member: usize,
    },
    /// Something the user can drag.
    Handle,
}

/// A shape with its stroke and fill (either may be absent).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Item {
    /// The geometry.
    #[serde(flatten)]
    pub shape: Shape,
    /// Outline or line; `None` for fill only.
    pub stroke: Option<Stroke>,
    /// Fill; `None` for lines and outlines.
    pub fill: Option<Ink>,
    /// What it stands for.
    pub tag: Tag,
}

impl Item {
    /// A stroked shape without fill.
    pub fn stroked(shape: Shape, stroke: Stroke) -> Item {
        Item { shape, stroke: Some(stroke), fill: None, tag: Tag::None }
    }
    /// A filled shape without outline.
    pub fn filled(shape: Shape, fill: Ink) -> Item {
        Item { shape, stroke: None, fill: Some(fill), tag: Tag::None }
    }
    /// The same item tagged.
    pub fn tagged(mut self, tag: Tag) -> Item {
        self.tag = tag;
        self
    }
}

/// Text sizes of the drawings (CSS pixels, system sans-serif).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum TextSize {
    /// Drawing titles: 13 px, semibold.
    Title,
    /// Labels of the drawing: 12 px.
    Body,
    /// Notes and keys: 11 px.
    Small,
}

impl TextSize {
    /// Font size, CSS pixels.
    pub const fn px(self) -> f64 {
        match self {
            TextSize::Title => 13.0,
            TextSize::Body => 12.0,
            TextSize::Small => 11.0,
        }
    }
    /// A CSS font shorthand for this size.
    pub const fn css_font(self) -> &'static str {
        match self {
            TextSize::Title => "600 13px system-ui, sans-serif",
            TextSize::Body => "12px system-ui, sans-serif",
            TextSize::Small => "11px system-ui, sans-serif",
        }
    }
    /// Height of a label's box, CSS pixels.
    pub fn box_height(self) -> f64 {
        (self.px() * 1.4).round()
    }
}

/// Placed text: its box (the painter draws the text left-aligned and vertically centred
/// in it, over a light [`Ink::LabelBox`] when `boxed`), and an optional leader line from the
/// box to the point the text speaks of.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Label {
    /// The text as shown.
    pub text: String,
    /// Size.
    pub size: TextSize,
    /// Colour.
    pub ink: Ink,
    /// The box the text must fit (its estimated width plus padding).
    pub rect: Rect,
    /// Whether a light box is painted under the text (labels over the drawing).
    pub boxed: bool,
    /// A thin line from the box's nearest edge to this point, when the label had to move
    /// away from what it names.
    pub leader: Option<Px>,
    /// More text for a pointer resting on the label (the full list behind a shortened one).
    pub detail: Option<String>,
}

/// The canvas a scene is built for, and what the user has asked of it.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Viewport {
    /// Width, CSS pixels.
    pub width: f64,
    /// Height, CSS pixels.
    pub height: f64,
}

impl Viewport {
    /// A canvas `width` x `height` CSS pixels.
    pub const fn new(width: f64, height: f64) -> Viewport {
        Viewport { width, height }
    }
    /// The whole canvas as a rectangle.
    pub fn frame(&self) -> Rect {
        Rect::new(0.0, 0.0, self.width, self.height)
    }
}

/// The mapping from world coordinates (m in the elevation, kN in a force figure; y up) to
/// CSS pixels (y down): `px = origin_x + scale x`, `py = origin_y - scale y`.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Transform {
    /// CSS pixels per world unit.
    pub scale: f64,
    /// CSS pixel x of the world origin.
    pub origin_x: f64,
    /// CSS pixel y of the world origin.
    pub origin_y: f64,
}

impl Transform {
    /// The largest equal-scale transform that shows the world box `[x0, x1] x [y0, y1]`
    /// inside `area` (CSS pixels), centred. A box of zero size is treated as 1e-9 wide.
    pub fn fit(bounds: (f64, f64, f64, f64), area: Rect) -> Transform {
        let (x0, x1, y0, y1) = bounds;
        let bw = (x1 - x0).max(1e-9);
        let bh = (y1 - y0).max(1e-9);
        let aw = area.w.max(10.0);
        let ah = area.h.max(10.0);
        let scale = (aw / bw).min(ah / bh);
        let origin_x = area.x + (aw - scale * bw) / 2.0 - scale * x0;
        let origin_y = area.y + (ah - scale * bh) / 2.0 + scale * y1;
        Transform { scale, origin_x, origin_y }
    }
    /// One transform per world box `(x0, x1, y0, y1)` (world units, m for an elevation),
    /// all at one scale (the largest at which every box fits `area`, CSS pixels), each
    /// box centred in `area`: drawings side by side at a common scale, so a longer span
    /// looks longer. Empty for no boxes; boxes of zero size as in [`Transform::fit`]. The
    /// boxes must be finite (an elevation's `bounds` of a validated design are).
    pub fn fit_all(bounds: &[(f64, f64, f64, f64)], area: Rect) -> Vec<Transform> {
        let scale = bounds.iter().map(|b| Transform::fit(*b, area).scale).fold(f64::INFINITY, f64::min);
        bounds
            .iter()
            .map(|&(x0, x1, y0, y1)| {
                let (bw, bh) = ((x1 - x0).max(1e-9), (y1 - y0).max(1e-9));
                let (aw, ah) = (area.w.max(10.0), area.h.max(10.0));
                Transform {
                    scale,
                    origin_x: area.x + (aw - scale * bw) / 2.0 - scale * x0,
                    origin_y: area.y + (ah - scale * bh) / 2.0 + scale * y1,
                }
            })
            .collect()
    }
    /// World point to CSS pixels.
    pub fn px(&self, x: f64, y: f64) -> Px {
        Px::new(self.origin_x + self.scale * x, self.origin_y - self.scale * y)
    }
    /// CSS pixels to world point (x, y).
    pub fn world(&self, p: Px) -> (f64, f64) {
        ((p.x - self.origin_x) / self.scale, (self.origin_y - p.y) / self.scale)
    }
}

/// One drawing: the canvas size, the world transform (for pointers and tests), the shapes
/// in painting order, then the labels on top.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Scene {
    /// The canvas it was built for.
    pub viewport: Viewport,
    /// World to pixels; `None` when the scene draws no world (a message only).
    pub transform: Option<Transform>,
    /// World unit of the transform ("m" or "kN").
    pub world_unit: &'static str,
    /// Shapes, painted in order.
    pub items: Vec<Item>,
    /// Text, painted after every shape.
    pub labels: Vec<Label>,
}

impl Scene {
    /// An empty scene for `viewport`.
    pub fn new(viewport: Viewport) -> Scene {
        Scene { viewport, transform: None, world_unit: "m", items: Vec::new(), labels: Vec::new() }
    }
    /// Pairs of labels whose boxes overlap (indices), for tests and debugging.
    pub fn overlapping_labels(&self) -> Vec<(usize, usize)> {
        let mut out = Vec::new();
        for (i, a) in self.labels.iter().enumerate() {
            for (j, b) in self.labels.iter().enumerate().skip(i + 1) {
                if a.rect.overlaps(&b.rect) {
                    out.push((i, j));
                }
            }
        }
        out
    }
    /// Labels whose box is not wholly inside the canvas (indices).
    pub fn labels_outside(&self) -> Vec<usize> {
        let frame = self.viewport.frame();
        self.labels.iter().enumerate().filter(|(_, l)| !frame.contains(&l.rect)).map(|(i, _)| i).collect()
    }
}

/// WCAG 2.1 contrast ratio of two opaque `#rrggbb` colours (relative luminance of sRGB,
/// WCAG 2.1 definitions "contrast ratio" and "relative luminance"). `None` for any other
/// form.
pub fn contrast_ratio(a: &str, b: &str) -> Option<f64> {
    let la = relative_luminance(a)?;
    let lb = relative_luminance(b)?;
    let (hi, lo) = if la >= lb { (la, lb) } else { (lb, la) };
    Some((hi + 0.05) / (lo + 0.05))
}

fn relative_luminance(hex: &str) -> Option<f64> {
    let h = hex.strip_prefix('#')?;
    if h.len() != 6 {
        return None;
    }
    let channel = |i: usize| -> Option<f64> {
        let v = u8::from_str_radix(h.get(i..i + 2)?, 16).ok()? as f64 / 255.0;
        Some(if v <= 0.04045 { v / 12.92 } else { ((v + 0.055) / 1.055).powf(2.4) })
    };
    Some(0.2126 * channel(0)? + 0.7152 * channel(2)? + 0.0722 * channel(4)?)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Steps by arithmetic: 1.37 px to the nearest half pixel is 1.5, 1.2 is 1.0, 7.2 is
    /// 7.0; to the nearest quarter 1.37 is 1.25; a step of zero keeps the width.
    #[test]
    fn a_stepped_width_is_the_nearest_multiple_of_its_step() {
        assert_eq!(stepped_width(1.37, 0.5), 1.5);
        assert_eq!(stepped_width(1.2, 0.5), 1.0);
        assert_eq!(stepped_width(7.2, 0.5), 7.0);
        assert_eq!(stepped_width(1.37, 0.25), 1.25);
        assert_eq!(stepped_width(1.37, 0.0), 1.37);
    }

    /// Strokes A B A C B (tags 0-4) group as A A B B C, in the order the strokes first
    /// appear and each stroke's items in their own order (tags 0 2, 1 4, 3); a list
    /// already grouped, and one of a single stroke, stay as they are.
    #[test]
    fn grouping_by_stroke_is_stable_and_keeps_first_appearance_order() {
        let a = Stroke::solid(Ink::Compression, 2.0);
        let b = Stroke::patterned(Ink::Tension, 2.0, Pattern::Dashed);
        let c = Stroke::solid(Ink::Compression, 2.5);
        let line = |s: Stroke, k: usize| {
            Item::stroked(Shape::Line { from: Px::new(0.0, 0.0), to: Px::new(1.0, 1.0) }, s)
                .tagged(Tag::Member { member: k })
        };
        let tags = |items: &[Item]| {
            items
                .iter()
                .map(|i| if let Tag::Member { member } = i.tag { member } else { 99 })
                .collect::<Vec<_>>()
        };
        let mut items = vec![line(a, 0), line(b, 1), line(a, 2), line(c, 3), line(b, 4)];
        group_by_stroke(&mut items);
        assert_eq!(tags(&items), [0, 2, 1, 4, 3]);
        let strokes: Vec<Stroke> = items.iter().filter_map(|i| i.stroke).collect();
        assert_eq!(strokes, [a, a, b, b, c]);
        group_by_stroke(&mut items);
        assert_eq!(tags(&items), [0, 2, 1, 4, 3]);
        let mut one = vec![line(a, 5), line(a, 6)];
        group_by_stroke(&mut one);
        assert_eq!(tags(&one), [5, 6]);
    }

    /// Two boxes, 100 m and 50 m wide, in a 200 x 120 px area: the wider one sets the
    /// scale (200 px / 100 m = 2 px/m; the height would allow 120 / 40 = 3), and both are
    /// centred at it.
    #[test]
    fn fit_all_draws_every_box_at_the_scale_of_the_largest() {
        let area = Rect::new(10.0, 0.0, 200.0, 120.0);
        let t = Transform::fit_all(&[(0.0, 100.0, 0.0, 40.0), (0.0, 50.0, 0.0, 20.0)], area);
        assert_eq!(t.len(), 2);
        assert!((t[0].scale - 2.0).abs() < 1e-12 && (t[1].scale - 2.0).abs() < 1e-12, "{t:?}");
        // the small box's centre (25, 10) at the area's centre (110, 60)
        let c = t[1].px(25.0, 10.0);
        assert!((c.x - 110.0).abs() < 1e-9 && (c.y - 60.0).abs() < 1e-9, "{c:?}");
        assert!(Transform::fit_all(&[], area).is_empty());
    }

    /// Known ratios: black on white is 21:1, white on white 1:1 (WCAG 2.1 definition).
    #[test]
    fn contrast_ratio_matches_the_wcag_extremes() {
        assert!((contrast_ratio("#000000", "#ffffff").expect("opaque hex") - 21.0).abs() < 1e-9);
        assert!((contrast_ratio("#ffffff", "#ffffff").expect("opaque hex") - 1.0).abs() < 1e-12);
        // #767676 on white is the well-known lightest grey reaching 4.5:1 (from memory:
        // 4.54:1)
        let g = contrast_ratio("#767676", "#ffffff").expect("opaque hex");
        assert!((g - 4.54).abs() < 0.01, "{g}");
        assert_eq!(contrast_ratio("rgba(0,0,0,1)", "#ffffff"), None);
    }

    /// WCAG 2.1 success criterion 1.4.11 (non-text contrast) asks 3:1 for the parts of a
    /// graphic needed to understand it: force colours, the zero-force grey and the
    /// highlight against the background; text inks reach 4.5:1 (1.4.3).
    #[test]
    fn drawing_inks_reach_their_contrast_against_the_background() {
        let bg = Ink::Background.css();
        for ink in [
            Ink::Tension,
            Ink::Compression,
            Ink::Zero,
            Ink::Highlight,
            Ink::Load,
            Ink::Reaction,
            Ink::UseLight,
            Ink::UseModerate,
            Ink::UseHigh,
            Ink::UseFull,
            Ink::UseOver,
            Ink::Unsized,
            Ink::ModeShape,
        ] {
            let c = contrast_ratio(ink.css(), bg).expect("opaque hex");
            assert!(c >= 3.0, "{ink:?} {} has {c:.2}:1 against the background", ink.css());
        }
        for ink in [Ink::Text, Ink::Secondary] {
            let c = contrast_ratio(ink.css(), bg).expect("opaque hex");
            assert!(c >= 4.5, "{ink:?} text has {c:.2}:1 against the background");
        }
    }

    #[test]
    fn rectangles_overlap_only_in_their_interiors() {
        let a = Rect::new(0.0, 0.0, 10.0, 10.0);
        assert!(a.overlaps(&Rect::new(5.0, 5.0, 10.0, 10.0)));
        assert!(!a.overlaps(&Rect::new(10.0, 0.0, 5.0, 5.0)), "touching edges");
        assert!(a.contains(&Rect::new(0.0, 0.0, 10.0, 10.0)));
        assert!(!a.contains(&Rect::new(-0.5, 0.0, 5.0, 5.0)));
    }

    #[test]
    fn a_fitted_transform_maps_the_box_inside_the_area_and_back() {
        let area = Rect::new(20.0, 40.0, 400.0, 200.0);
        let t = Transform::fit((0.0, 100.0, 50.0, 80.0), area);
        assert!((t.scale - 4.0).abs() < 1e-12, "width governs: 400 px / 100 m");
        let p = t.px(0.0, 80.0);
        assert!((p.x - 20.0).abs() < 1e-9 && p.y >= 40.0);
        let (x, y) = t.world(t.px(37.5, 61.0));
        assert!((x - 37.5).abs() < 1e-9 && (y - 61.0).abs() < 1e-9);
    }
}
