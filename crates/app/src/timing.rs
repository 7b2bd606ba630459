//! Timings of the page's own work, for the browser benchmark: when the page's address
//! carries `?timing` (the query, not the design link after `#`), every timed step adds
//! `{ what, ms, at }` to the array `window.springlineTimings` (its name, how long it took
//! and when it ended, ms since the navigation began, from `performance.now()`), which
//! the benchmark reads and empties. Without the flag a step costs one check of a cached
//! boolean.

use std::cell::Cell;
use wasm_bindgen::{JsCast, JsValue};

thread_local! {
    /// Whether timings are recorded: unknown until first asked, then fixed for the page.
    static RECORDING: Cell<Option<bool>> = const { Cell::new(None) };
}

/// What a timed step is: the engine's computation (validation, analysis), the building of
/// a drawing's scene, painting it on a canvas, or the print sheet's QR code.
#[derive(Debug, Clone, Copy)]
pub enum Step {
    /// Validation and analysis (`ValidDesign::new`, `analyze_reusing`).
    Compute,
    /// A drawing's scene built by the engine (geometry, labels placed).
    Scene,
    /// A scene painted on its canvas (the canvas's id).
    Paint(&'static str),
    /// The print sheet's QR code worked out and drawn (as the page prints).
    Code,
}

impl Step {
    fn name(self) -> &'static str {
        match self {
            Step::Compute => "compute",
            Step::Scene => "scene",
            Step::Paint("elevation") => "paint-elevation",
            Step::Paint("forces") => "paint-forces",
            Step::Paint(_) => "paint",
            Step::Code => "code",
        }
    }
}

fn recording() -> bool {
    RECORDING.with(|r| {
        if let Some(on) = r.get() {
            return on;
        }
        let on = web_sys::window()
            .and_then(|w| w.location().search().ok())
            .is_some_and(|q| q.trim_start_matches('?').split('&').any(|p| p == "timing"));
        if on {
            if let Some(w) = web_sys::window() {
                let _ = js_sys::Reflect::set(&w, &"springlineTimings".into(), &js_sys::Array::new());
            }
        }
        r.set(Some(on));
        on
    })
}

/// Runs `work`, and when the page records timings, adds how long it took (ms, from
/// `performance.now()`) under `step`.
pub fn timed<T>(step: Step, work: impl FnOnce() -> T) -> T {
    if !recording() {
        return work();
    }
    let performance = web_sys::window().and_then(|w| w.performance());
    let start = performance.as_ref().map_or(0.0, |p| p.now());
    let out = work();
    let end = performance.as_ref().map_or(0.0, |p| p.now());
    record(step, end - start, end);
    out
}

fn record(step: Step, ms: f64, at: f64) {
    let Some(w) = web_sys::window() else { return };
    let Ok(list) = js_sys::Reflect::get(&w, &"springlineTimings".into()) else { return };
    // whatever else a script may have put there is left alone
    let Ok(list) = list.dyn_into::<js_sys::Array>() else { return };
    let entry = js_sys::Object::new();
    let _ = js_sys::Reflect::set(&entry, &"what".into(), &step.name().into());
    let _ = js_sys::Reflect::set(&entry, &"ms".into(), &JsValue::from_f64(ms));
    let _ = js_sys::Reflect::set(&entry, &"at".into(), &JsValue::from_f64(at));
    list.push(&entry);
}
