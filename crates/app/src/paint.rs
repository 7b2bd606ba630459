//! Paints a [`Scene`] on a canvas and publishes what tests and assistive tools need: on
//! the element, the world transform (`data-scale`, `data-origin-x`, `data-origin-y`,
//! `data-world-unit`); on asking, every label's text, box and font
//! (`window.springlineLabels(id)`, JSON), so a browser test can measure each text with the
//! canvas and compare it with its box.
//!
//! The scene says everything (geometry, inks, patterns, placed labels); this module only
//! turns it into canvas calls. Colours come from `Ink::css`.

use crate::canvas::{self, Surface};
use springline_statics::scene::place::PAD_X;
use springline_statics::scene::{Ink, Item, Label, Pattern, Px, Rect, Scene, Shape, Stroke, TextSize};
use std::cell::{Cell, RefCell};
use web_sys::{CanvasRenderingContext2d, HtmlCanvasElement};

/// Paints `scene` on `canvas` (sharp at the device pixel ratio) and publishes its
/// transform and labels on the element. Does nothing while the canvas has no size.
pub fn paint(canvas: &HtmlCanvasElement, scene: &Scene) {
    let Some(surface) = canvas::prepare_for(canvas, scene.viewport.width, scene.viewport.height) else {
        return;
    };
    let Surface { ctx, width, height } = &surface;
    ctx.set_fill_style_str(Ink::Background.css());
    ctx.fill_rect(0.0, 0.0, *width, *height);
    // every setting below is made again after this: start from nothing known
    let mut pen = Pen::default();
    // consecutive plain lines in one stroke style are one path and one stroke: the order of
    // the items (what lies over what) stays, and each stroke call saved is a call out of
    // wasm and a paint operation fewer for the browser
    let mut open_lines: Option<Stroke> = None;
    for item in &scene.items {
        match (&item.shape, item.stroke, item.fill) {
            (Shape::Line { from, to }, Some(stroke), None) => {
                if open_lines != Some(stroke) {
                    if open_lines.is_some() {
                        ctx.stroke();
                    }
                    set_stroke(ctx, &mut pen, &stroke);
                    ctx.begin_path();
                    open_lines = Some(stroke);
                }
                ctx.move_to(from.x, from.y);
                ctx.line_to(to.x, to.y);
            }
            _ => {
                if open_lines.take().is_some() {
                    ctx.stroke();
                }
                paint_item(ctx, &mut pen, item);
            }
        }
    }
    if open_lines.is_some() {
        ctx.stroke();
    }
    ctx.set_text_align("left");
    ctx.set_text_baseline("middle");
    for label in &scene.labels {
        paint_label_ground(ctx, &mut pen, label);
    }
    // the texts one size after another: setting a canvas's font parses it, about 1 ms an
    // edit when the sizes alternated label by label (a Chromium profile of a panel-count
    // edit); a pass per size rather than a sort keeps the page free of one more sort
    for size in TEXT_SIZES {
        for label in scene.labels.iter().filter(|l| l.size == size) {
            paint_label_text(ctx, &mut pen, label);
        }
    }
    publish(canvas, scene);
    keep_labels(canvas, scene);
}

/// Every text size, in the order their labels are painted (a test checks each appears
/// once).
const TEXT_SIZES: [TextSize; 3] = [TextSize::Title, TextSize::Body, TextSize::Small];

/// What the canvas was last set to, so a scene of many shapes in few styles sets each
/// style once: every setting is a call out of wasm, and a dash pattern an allocation.
#[derive(Default)]
struct Pen {
    stroke: Option<&'static str>,
    fill: Option<&'static str>,
    width: Option<f64>,
    /// The dash pattern set and its lengths (`None`: unknown). Kept by length, not by
    /// line width: solid lines of every width share one setting, and a line weight that
    /// follows the force gives nearly every member its own width.
    dashes: Option<(Pattern, Option<[f64; 2]>)>,
    font: Option<&'static str>,
}

impl Pen {
    fn stroke_style(&mut self, ctx: &CanvasRenderingContext2d, css: &'static str) {
        if self.stroke != Some(css) {
            ctx.set_stroke_style_str(css);
            self.stroke = Some(css);
        }
    }
    fn fill_style(&mut self, ctx: &CanvasRenderingContext2d, css: &'static str) {
        if self.fill != Some(css) {
            ctx.set_fill_style_str(css);
            self.fill = Some(css);
        }
    }
    fn line_width(&mut self, ctx: &CanvasRenderingContext2d, width: f64) {
        if self.width != Some(width) {
            ctx.set_line_width(width);
            self.width = Some(width);
        }
    }
    /// The dash pattern (and its caps) of `pattern` at `width`.
    fn pattern(&mut self, ctx: &CanvasRenderingContext2d, pattern: Pattern, width: f64) {
        let lengths = pattern.dash_and_gap(width);
        if self.dashes == Some((pattern, lengths)) {
            return;
        }
        let dashes = js_sys::Array::new();
        for d in lengths.iter().flatten() {
            dashes.push(&(*d).into());
        }
        let _ = ctx.set_line_dash(&dashes);
        // dots read as dots with round caps; dashes keep square ends
        ctx.set_line_cap(if matches!(pattern, Pattern::Dotted) { "round" } else { "butt" });
        self.dashes = Some((pattern, lengths));
    }
    fn font(&mut self, ctx: &CanvasRenderingContext2d, font: &'static str) {
        if self.font != Some(font) {
            ctx.set_font(font);
            self.font = Some(font);
        }
    }
}

fn set_stroke(ctx: &CanvasRenderingContext2d, pen: &mut Pen, s: &Stroke) {
    pen.stroke_style(ctx, s.ink.css());
    pen.line_width(ctx, s.width);
    pen.pattern(ctx, s.pattern, s.width);
}

fn trace(ctx: &CanvasRenderingContext2d, pts: &[Px]) {
    ctx.begin_path();
    if let Some(first) = pts.first() {
        ctx.move_to(first.x, first.y);
    }
    for p in pts.iter().skip(1) {
        ctx.line_to(p.x, p.y);
    }
}

fn paint_item(ctx: &CanvasRenderingContext2d, pen: &mut Pen, item: &Item) {
    match &item.shape {
        Shape::Line { from, to } => {
            trace(ctx, &[*from, *to]);
            stroke_and_fill(ctx, pen, item, false);
        }
        Shape::Path { points, closed } => {
            if points.len() < 2 {
                return;
            }
            trace(ctx, points);
            if *closed {
                ctx.close_path();
            }
            stroke_and_fill(ctx, pen, item, *closed);
        }
        Shape::Circle { center, radius } => {
            ctx.begin_path();
            let _ = ctx.arc(center.x, center.y, *radius, 0.0, std::f64::consts::TAU);
            stroke_and_fill(ctx, pen, item, true);
        }
        Shape::Box { rect } => {
            ctx.begin_path();
            ctx.rect(rect.x, rect.y, rect.w, rect.h);
            stroke_and_fill(ctx, pen, item, true);
        }
        Shape::Arrow { tail, head, head_size } => {
            let (dx, dy) = (head.x - tail.x, head.y - tail.y);
            let l = dx.hypot(dy);
            if l <= 0.0 {
                return;
            }
            let (ux, uy) = (dx / l, dy / l);
            let size = head_size.min(l);
            let base = Px::new(head.x - ux * size, head.y - uy * size);
            if let Some(s) = &item.stroke {
                set_stroke(ctx, pen, s);
                trace(ctx, &[*tail, base]);
                ctx.stroke();
                // the head filled in the line's ink (a dash pattern does not touch fills)
                pen.fill_style(ctx, s.ink.css());
                let w = 0.45 * size;
                trace(
                    ctx,
                    &[
                        *head,
                        Px::new(base.x - uy * w, base.y + ux * w),
                        Px::new(base.x + uy * w, base.y - ux * w),
                    ],
                );
                ctx.close_path();
                ctx.fill();
            }
        }
    }
}

/// Fills (closed shapes with a fill) then strokes the current path.
fn stroke_and_fill(ctx: &CanvasRenderingContext2d, pen: &mut Pen, item: &Item, closed: bool) {
    if let (Some(fill), true) = (item.fill, closed) {
        pen.fill_style(ctx, fill.css());
        ctx.fill();
    }
    if let Some(s) = &item.stroke {
        set_stroke(ctx, pen, s);
        ctx.stroke();
    }
}

/// The point of `r`'s edge nearest to `p`.
fn nearest_on_rect(r: &Rect, p: Px) -> Px {
    Px::new(p.x.clamp(r.x, r.right()), p.y.clamp(r.y, r.bottom()))
}

/// Paints what lies under a label's text: its leader line and its box.
fn paint_label_ground(ctx: &CanvasRenderingContext2d, pen: &mut Pen, l: &Label) {
    if let Some(to) = l.leader {
        let from = nearest_on_rect(&l.rect, to);
        set_stroke(ctx, pen, &Stroke { ink: Ink::Secondary, width: 0.8, pattern: Pattern::Solid });
        trace(ctx, &[from, to]);
        ctx.stroke();
    }
    if l.boxed {
        pen.fill_style(ctx, Ink::LabelBox.css());
        ctx.fill_rect(l.rect.x, l.rect.y, l.rect.w, l.rect.h);
    }
}

/// Paints a label's text (left-aligned, baseline middle: set once by [`paint`]).
fn paint_label_text(ctx: &CanvasRenderingContext2d, pen: &mut Pen, l: &Label) {
    pen.font(ctx, l.size.css_font());
    pen.fill_style(ctx, l.ink.css());
    let _ = ctx.fill_text(&l.text, l.rect.x + PAD_X, l.rect.y + l.rect.h / 2.0);
}

/// JSON text of a string: quoted, with quotes, backslashes and control characters
/// escaped (RFC 8259, section 7).
fn json_string(s: &str) -> String {
    let mut out = String::with_capacity(s.len() + 2);
    out.push('"');
    for c in s.chars() {
        match c {
            '"' => out.push_str("\\\""),
            '\\' => out.push_str("\\\\"),
            c if (c as u32) < 0x20 => out.push_str(&format!("\\u{:04x}", c as u32)),
            c => out.push(c),
        }
    }
    out.push('"');
    out
}

/// Writes the scene's transform on the element: data-scale, data-origin-x, data-origin-y
/// (CSS px; removed when the scene draws no world) and data-world-unit.
fn publish(canvas: &HtmlCanvasElement, scene: &Scene) {
    match scene.transform {
        Some(t) => {
            let _ = canvas.set_attribute("data-scale", &format!("{}", t.scale));
            let _ = canvas.set_attribute("data-origin-x", &format!("{}", t.origin_x));
            let _ = canvas.set_attribute("data-origin-y", &format!("{}", t.origin_y));
        }
        None => {
            for a in ["data-scale", "data-origin-x", "data-origin-y"] {
                let _ = canvas.remove_attribute(a);
            }
        }
    }
    let _ = canvas.set_attribute("data-world-unit", scene.world_unit);
}

thread_local! {
    /// The labels last painted on each canvas with an id (id, labels). Kept rather than
    /// written on the element as JSON: writing it out cost about half a millisecond of
    /// every edit (a Chromium profile of a panel-count edit), and only a test reads it.
    static PAINTED_LABELS: RefCell<Vec<(String, Vec<Label>)>> = const { RefCell::new(Vec::new()) };
    /// Whether `window.springlineLabels` is installed.
    static LABEL_READER: Cell<bool> = const { Cell::new(false) };
}

/// Keeps `scene`'s labels as the last painted on `canvas` (when it has an id) and, the
/// first time, installs `window.springlineLabels(id)`: the JSON array of the labels last
/// painted on the canvas `id` (text, hover detail, box, padding and font of each), or
/// `undefined` before any.
fn keep_labels(canvas: &HtmlCanvasElement, scene: &Scene) {
    let id = canvas.id();
    if id.is_empty() {
        return;
    }
    PAINTED_LABELS.with(|kept| {
        let mut kept = kept.borrow_mut();
        match kept.iter_mut().find(|(k, _)| *k == id) {
            Some((_, labels)) => labels.clone_from(&scene.labels),
            None => kept.push((id, scene.labels.clone())),
        }
    });
    if LABEL_READER.with(|installed| installed.replace(true)) {
        return;
    }
    let read = wasm_bindgen::closure::Closure::<dyn Fn(String) -> Option<String>>::new(|id: String| {
        PAINTED_LABELS.with(|kept| kept.borrow().iter().find(|(k, _)| *k == id).map(|(_, l)| labels_json(l)))
    });
    if let Some(w) = web_sys::window() {
        let _ = js_sys::Reflect::set(&w, &"springlineLabels".into(), read.as_ref());
    }
    // the page's canvases live as long as the page: the reader is kept for good
    read.forget();
}

/// The JSON array of `labels`: text, hover detail, box (CSS px), padding and font of each.
fn labels_json(labels: &[Label]) -> String {
    let labels: Vec<String> = labels
        .iter()
        .map(|l| {
            format!(
                "{{\"text\":{},\"detail\":{},\"x\":{},\"y\":{},\"w\":{},\"h\":{},\"pad\":{},\"font\":{}}}",
                json_string(&l.text),
                l.detail.as_deref().map_or("null".to_string(), json_string),
                l.rect.x,
                l.rect.y,
                l.rect.w,
                l.rect.h,
                PAD_X,
                json_string(l.size.css_font())
            )
        })
        .collect();
    format!("[{}]", labels.join(","))
}

/// The member (tag) of the scene's member line nearest to `at` (CSS pixels) within
/// `tolerance` pixels; members drawn later (the highlight) count once.
pub fn member_at(scene: &Scene, at: (f64, f64), tolerance: f64) -> Option<usize> {
    let segments = scene.items.iter().filter_map(|i| match (&i.shape, i.tag) {
        (Shape::Line { from, to }, springline_statics::scene::Tag::Member { member }) => {
            Some((member, *from, *to))
        }
        _ => None,
    });
    canvas::nearest_segment(springline_statics::scene::Px::new(at.0, at.1), segments, tolerance)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The texts are painted a size at a time: a size missing from `TEXT_SIZES` would
    /// never be painted. The match stops compiling when the engine adds a size.
    #[test]
    fn every_text_size_is_painted_once() {
        let slot = |size: TextSize| match size {
            TextSize::Title => 0,
            TextSize::Body => 1,
            TextSize::Small => 2,
        };
        let mut painted = [0; TEXT_SIZES.len()];
        for size in TEXT_SIZES {
            painted[slot(size)] += 1;
        }
        assert_eq!(painted, [1; TEXT_SIZES.len()]);
    }
}
