//! Canvas plumbing: a sharp backing store at any device pixel ratio, and picking the
//! segment nearest the pointer. Drawing itself is `paint.rs` over the engine's scenes,
//! whose `Transform` maps world points to pixels.

use springline_statics::scene::force::distance_to_segment;
use springline_statics::scene::Px;
use wasm_bindgen::JsCast;
use web_sys::{CanvasRenderingContext2d, HtmlCanvasElement};

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
/// returns a context drawing in CSS pixels, not cleared: whoever paints fills the whole
/// background first (a clear before that fill only cost time). `None` when the canvas has
/// no size yet or no 2D context.
pub fn prepare(canvas: &HtmlCanvasElement) -> Option<Surface> {
    prepare_for(canvas, canvas.client_width() as f64, canvas.client_height() as f64)
}

/// [`prepare`] for a canvas known to be `width` x `height` CSS pixels (the size a scene
/// was built for), without reading the layout: reading an element's size after the page
/// changed forces the browser to lay the page out there and then, which took most of a
/// vehicle move's time.
pub fn prepare_for(canvas: &HtmlCanvasElement, width: f64, height: f64) -> Option<Surface> {
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
    Some(Surface { ctx, width, height })
}

/// The key of the segment nearest to `pointer` (CSS pixels) among `segments` (key, end,
/// end), if it lies within `tolerance` pixels (the engine's point-to-segment distance).
pub fn nearest_segment<K>(
    pointer: Px,
    segments: impl IntoIterator<Item = (K, Px, Px)>,
    tolerance: f64,
) -> Option<K> {
    segments
        .into_iter()
        .map(|(key, a, b)| (key, distance_to_segment(pointer, a, b)))
        .filter(|(_, d)| *d <= tolerance)
        .min_by(|x, y| x.1.total_cmp(&y.1))
        .map(|(key, _)| key)
}

/// The CSS size of the canvas behind `node`, kept by a `ResizeObserver`: `None` until the
/// browser first reports it, then updated whenever the layout changes it (a window
/// resize, a scroll bar appearing). Effects that draw read it instead of the element's
/// size, so drawing never forces a layout.
pub fn watch_size(
    node: leptos::prelude::NodeRef<leptos::html::Canvas>,
) -> leptos::prelude::RwSignal<Option<(f64, f64)>> {
    use leptos::prelude::*;
    use wasm_bindgen::closure::Closure;
    let size = RwSignal::new(None::<(f64, f64)>);
    Effect::new(move |_| {
        let Some(el) = node.get() else { return };
        let callback = Closure::<dyn FnMut(js_sys::Array)>::new(move |entries: js_sys::Array| {
            let Some(entry) = entries.get(0).dyn_into::<web_sys::ResizeObserverEntry>().ok() else { return };
            let rect = entry.content_rect();
            let now = Some((rect.width(), rect.height()));
            if size.get_untracked() != now {
                size.set(now);
            }
        });
        if let Ok(observer) = web_sys::ResizeObserver::new(callback.as_ref().unchecked_ref()) {
            observer.observe(&el);
            // the drawings' canvases live as long as the page: the observer and its
            // callback are kept for good
            std::mem::forget(observer);
        }
        callback.forget();
    });
    size
}
