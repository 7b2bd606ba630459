//! The force canvas: the engine builds the scene (`scene::force`), this module paints it
//! and publishes what tests and assistive tools read on the element.
//!
//! The painter below is a stopgap: it is to be replaced by the shared scene painter
//! (`paint.rs`) when the two branches meet; it publishes the same attributes
//! (data-scale, data-origin-x, data-origin-y, data-world-unit, data-labels).

use crate::canvas::{self, Surface};
use springline_statics::scene::force::{force_drawing, ForceDrawing, ForceOptions};
use springline_statics::scene::place::PAD_X;
use springline_statics::scene::{Ink, Item, Label, Px, Scene, Shape, Viewport};
use springline_statics::Analysis;
use web_sys::{CanvasRenderingContext2d, HtmlCanvasElement};

/// The force drawing of load case `case` for a canvas of the surface's size.
pub fn drawing(a: &Analysis, case: usize, opts: &ForceOptions, s: &Surface) -> ForceDrawing {
    force_drawing(a, case, opts, Viewport::new(s.width, s.height))
}

/// Paints `scene` on the surface: background, shapes in order, then labels with their
/// boxes and leaders. (Stopgap for the shared painter, see the module docs.)
pub fn paint(s: &Surface, scene: &Scene) {
    let ctx = &s.ctx;
    ctx.set_fill_style_str(Ink::Background.css());
    ctx.fill_rect(0.0, 0.0, s.width, s.height);
    for item in &scene.items {
        paint_item(ctx, item);
    }
    for label in &scene.labels {
        paint_label(ctx, label);
    }
}

fn dash(ctx: &CanvasRenderingContext2d, pattern: &[f64]) {
    let a = js_sys::Array::new();
    for d in pattern {
        a.push(&(*d).into());
    }
    let _ = ctx.set_line_dash(&a);
}

fn paint_item(ctx: &CanvasRenderingContext2d, item: &Item) {
    let trace = |pts: &[Px], closed: bool| {
        ctx.begin_path();
        if let Some(first) = pts.first() {
            ctx.move_to(first.x, first.y);
        }
        for p in pts.iter().skip(1) {
            ctx.line_to(p.x, p.y);
        }
        if closed {
            ctx.close_path();
        }
    };
    match &item.shape {
        Shape::Line { from, to } => trace(&[*from, *to], false),
        Shape::Path { points, closed } => trace(points, *closed),
        Shape::Circle { center, radius } => {
            ctx.begin_path();
            let _ = ctx.arc(center.x, center.y, *radius, 0.0, std::f64::consts::TAU);
        }
        Shape::Box { rect } => {
            ctx.begin_path();
            ctx.rect(rect.x, rect.y, rect.w, rect.h);
        }
        Shape::Arrow { tail, head, head_size } => {
            let ink = item.stroke.map(|s| s.ink).or(item.fill).unwrap_or(Ink::Text);
            canvas::arrow(
                ctx,
                (tail.x, tail.y),
                (head.x, head.y),
                ink.css(),
                item.stroke.map_or(1.5, |s| s.width),
                *head_size,
            );
            return;
        }
    }
    if let Some(fill) = item.fill {
        ctx.set_fill_style_str(fill.css());
        ctx.fill();
    }
    if let Some(stroke) = item.stroke {
        ctx.set_stroke_style_str(stroke.ink.css());
        ctx.set_line_width(stroke.width);
        dash(ctx, &stroke.pattern.dashes(stroke.width));
        ctx.stroke();
        dash(ctx, &[]);
    }
}

fn paint_label(ctx: &CanvasRenderingContext2d, l: &Label) {
    let r = l.rect;
    if let Some(p) = l.leader {
        // from the nearest point of the box to the point it names
        let q = Px::new(p.x.clamp(r.x, r.right()), p.y.clamp(r.y, r.bottom()));
        canvas::line(ctx, (q.x, q.y), (p.x, p.y), Ink::Secondary.css(), 0.8);
    }
    if l.boxed {
        ctx.set_fill_style_str(Ink::LabelBox.css());
        ctx.fill_rect(r.x, r.y, r.w, r.h);
    }
    canvas::text(ctx, &l.text, (r.x + PAD_X, r.y + r.h / 2.0), l.size.css_font(), l.ink.css(), "left");
}

/// Writes the scene's transform and labels on the canvas element: data-scale,
/// data-origin-x, data-origin-y (CSS px; removed when the scene draws no world),
/// data-world-unit, and data-labels (JSON: text, hover detail, font and box of every
/// label, so a test can measure the text against its box).
pub fn publish(el: &HtmlCanvasElement, scene: &Scene) {
    match scene.transform {
        Some(t) => {
            let _ = el.set_attribute("data-scale", &format!("{}", t.scale));
            let _ = el.set_attribute("data-origin-x", &format!("{}", t.origin_x));
            let _ = el.set_attribute("data-origin-y", &format!("{}", t.origin_y));
        }
        None => {
            for a in ["data-scale", "data-origin-x", "data-origin-y"] {
                let _ = el.remove_attribute(a);
            }
        }
    }
    let _ = el.set_attribute("data-world-unit", scene.world_unit);
    let labels: Vec<String> = scene
        .labels
        .iter()
        .map(|l| {
            format!(
                "{{\"text\":{},\"detail\":{},\"font\":{},\"x\":{},\"y\":{},\"w\":{},\"h\":{}}}",
                json_string(&l.text),
                l.detail.as_deref().map_or("null".to_string(), json_string),
                json_string(l.size.css_font()),
                l.rect.x,
                l.rect.y,
                l.rect.w,
                l.rect.h
            )
        })
        .collect();
    let _ = el.set_attribute("data-labels", &format!("[{}]", labels.join(",")));
}

/// `s` as a JSON string literal.
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
