//! Canvas plumbing: a sharp backing store at any device pixel ratio, the world-to-pixel
//! mapping pointers use, and the geometry of picking a segment. Drawing itself is
//! `paint.rs` over the engine's scenes.

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
    /// World point to CSS pixels.
    pub fn px(&self, x: f64, y: f64) -> (f64, f64) {
        (self.origin_x + self.scale * x, self.origin_y - self.scale * y)
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
