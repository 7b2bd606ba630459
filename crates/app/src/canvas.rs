//! Canvas plumbing: a sharp backing store at any device pixel ratio, the world-to-pixel
//! transform (exposed on the element as data attributes), and drawing primitives.

use wasm_bindgen::JsCast;
use web_sys::{CanvasRenderingContext2d, HtmlCanvasElement};

/// Maps world coordinates (m, or kN in the force diagram; y up) to CSS pixels (y down):
/// `px = origin_x + scale * x`, `py = origin_y - scale * y`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct View {
    /// CSS pixels per world unit.
    pub scale: f64,
    /// CSS pixel x of the world origin.
    pub origin_x: f64,
    /// CSS pixel y of the world origin.
    pub origin_y: f64,
}

impl View {
    /// The largest equal-scale view of the box [x0, x1] x [y0, y1] inside a `width` x
    /// `height` CSS pixel area with `margin` pixels on every side (and `top` extra above).
    pub fn fit(bounds: (f64, f64, f64, f64), width: f64, height: f64, margin: f64, top: f64) -> View {
        let (x0, x1, y0, y1) = bounds;
        let bw = (x1 - x0).max(1e-9);
        let bh = (y1 - y0).max(1e-9);
        let aw = (width - 2.0 * margin).max(10.0);
        let ah = (height - 2.0 * margin - top).max(10.0);
        let scale = (aw / bw).min(ah / bh);
        let origin_x = margin + (aw - scale * bw) / 2.0 - scale * x0;
        let origin_y = margin + top + (ah - scale * bh) / 2.0 + scale * y1;
        View { scale, origin_x, origin_y }
    }
    /// World point to CSS pixels.
    pub fn px(&self, x: f64, y: f64) -> (f64, f64) {
        (self.origin_x + self.scale * x, self.origin_y - self.scale * y)
    }
    /// Writes the transform on the canvas element for tests and assistive tools.
    pub fn publish(&self, canvas: &HtmlCanvasElement, unit: &str) {
        let _ = canvas.set_attribute("data-scale", &format!("{}", self.scale));
        let _ = canvas.set_attribute("data-origin-x", &format!("{}", self.origin_x));
        let _ = canvas.set_attribute("data-origin-y", &format!("{}", self.origin_y));
        let _ = canvas.set_attribute("data-world-unit", unit);
    }
}

/// A 2D context whose units are CSS pixels, and the canvas size in CSS pixels.
pub struct Surface {
    /// The context (already scaled by the device pixel ratio).
    pub ctx: CanvasRenderingContext2d,
    /// Width in CSS pixels.
    pub width: f64,
    /// Height in CSS pixels.
    pub height: f64,
}

/// Sizes the backing store to the element's CSS size times the device pixel ratio and
/// returns a cleared context drawing in CSS pixels. `None` when the canvas has no size
/// yet or no 2D context.
pub fn prepare(canvas: &HtmlCanvasElement) -> Option<Surface> {
    let width = canvas.client_width() as f64;
    let height = canvas.client_height() as f64;
    if width <= 0.0 || height <= 0.0 {
        return None;
    }
    let dpr = web_sys::window().map(|w| w.device_pixel_ratio()).unwrap_or(1.0).max(0.5);
    let bw = (width * dpr).round() as u32;
    let bh = (height * dpr).round() as u32;
    if canvas.width() != bw {
        canvas.set_width(bw);
    }
    if canvas.height() != bh {
        canvas.set_height(bh);
    }
    let ctx = canvas.get_context("2d").ok()??.dyn_into::<CanvasRenderingContext2d>().ok()?;
    let _ = ctx.set_transform(dpr, 0.0, 0.0, dpr, 0.0, 0.0);
    ctx.clear_rect(0.0, 0.0, width, height);
    Some(Surface { ctx, width, height })
}

/// Stroke style and width, then a straight line between two CSS pixel points.
pub fn line(ctx: &CanvasRenderingContext2d, a: (f64, f64), b: (f64, f64), color: &str, width: f64) {
    polyline(ctx, &[a, b], color, width);
}

/// A polyline through CSS pixel points.
pub fn polyline(ctx: &CanvasRenderingContext2d, pts: &[(f64, f64)], color: &str, width: f64) {
    if pts.len() < 2 {
        return;
    }
    ctx.set_stroke_style_str(color);
    ctx.set_line_width(width);
    trace(ctx, pts);
    ctx.stroke();
}

/// A filled polygon.
pub fn fill_polygon(ctx: &CanvasRenderingContext2d, pts: &[(f64, f64)], color: &str) {
    if pts.len() < 3 {
        return;
    }
    ctx.set_fill_style_str(color);
    trace(ctx, pts);
    ctx.close_path();
    ctx.fill();
}

/// Starts a new path through `pts` (at least one point).
fn trace(ctx: &CanvasRenderingContext2d, pts: &[(f64, f64)]) {
    ctx.begin_path();
    ctx.move_to(pts[0].0, pts[0].1);
    for p in &pts[1..] {
        ctx.line_to(p.0, p.1);
    }
}

/// A filled circle.
pub fn dot(ctx: &CanvasRenderingContext2d, c: (f64, f64), r: f64, color: &str) {
    ctx.set_fill_style_str(color);
    circle(ctx, c, r);
    ctx.fill();
}

/// Starts a new path with a full circle.
fn circle(ctx: &CanvasRenderingContext2d, c: (f64, f64), r: f64) {
    ctx.begin_path();
    let _ = ctx.arc(c.0, c.1, r, 0.0, std::f64::consts::TAU);
}

/// An open circle (hinge).
pub fn ring(ctx: &CanvasRenderingContext2d, c: (f64, f64), r: f64, color: &str, fill: &str) {
    ctx.set_fill_style_str(fill);
    ctx.set_stroke_style_str(color);
    ctx.set_line_width(1.5);
    circle(ctx, c, r);
    ctx.fill();
    ctx.stroke();
}

/// Text at a CSS pixel point with a font, colour and alignment ("left", "center", "right").
pub fn text(ctx: &CanvasRenderingContext2d, s: &str, at: (f64, f64), font: &str, color: &str, align: &str) {
    ctx.set_font(font);
    ctx.set_fill_style_str(color);
    ctx.set_text_align(align);
    ctx.set_text_baseline("middle");
    let _ = ctx.fill_text(s, at.0, at.1);
}

/// Text on a light box so it stays legible over drawing.
pub fn label(ctx: &CanvasRenderingContext2d, s: &str, at: (f64, f64), font: &str, color: &str, align: &str) {
    ctx.set_font(font);
    let w = ctx.measure_text(s).map(|m| m.width()).unwrap_or(0.0);
    let x0 = match align {
        "center" => at.0 - w / 2.0,
        "right" => at.0 - w,
        _ => at.0,
    };
    ctx.set_fill_style_str("rgba(255,255,255,0.85)");
    ctx.fill_rect(x0 - 3.0, at.1 - 8.0, w + 6.0, 16.0);
    text(ctx, s, at, font, color, align);
}

/// The key of the segment nearest to `pointer` (CSS pixels) among `segments` (key, end,
/// end), if it lies within `tolerance` pixels.
pub fn nearest_segment<K>(
    pointer: (f64, f64),
    segments: impl IntoIterator<Item = (K, (f64, f64), (f64, f64))>,
    tolerance: f64,
) -> Option<K> {
    segments
        .into_iter()
        .map(|(key, a, b)| (key, distance_to_segment(pointer, a, b)))
        .filter(|(_, d)| *d <= tolerance)
        .min_by(|x, y| x.1.total_cmp(&y.1))
        .map(|(key, _)| key)
}

/// Distance from point p to the segment a-b, in the same units.
pub fn distance_to_segment(p: (f64, f64), a: (f64, f64), b: (f64, f64)) -> f64 {
    let (dx, dy) = (b.0 - a.0, b.1 - a.1);
    let l2 = dx * dx + dy * dy;
    let t = if l2 > 0.0 { (((p.0 - a.0) * dx + (p.1 - a.1) * dy) / l2).clamp(0.0, 1.0) } else { 0.0 };
    (p.0 - a.0 - t * dx).hypot(p.1 - a.1 - t * dy)
}
