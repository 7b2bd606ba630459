//! The status line under the drawings (why a drag stopped, else how to drag), the value
//! being dragged beside the pointer, and the largest-rise hint beside the rise field.
//!
//! None of them moves anything on the page: the status line keeps one fixed height
//! whatever it says, the readout floats over the page (fixed position, no pointer
//! events), and the hint sits in the rise field's own message area.

use crate::drag::drag_hint;
use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::arch::edit::largest_rise;
use springline_statics::error::Field;

/// The fixed-height status line (three lines of text, style.css), with the pointer readout.
#[component]
pub fn StatusLine() -> impl IntoView {
    let state = expect_context::<AppState>();
    let stopped = move || state.drag_stop.with(Option::is_some);
    // with the vehicle on the deck: where its leading axle stands (it follows every move)
    let text = move || {
        state.drag_stop.get().unwrap_or_else(|| match state.vehicle.get() {
            Some(x) => vehicle_words(x, state.units.get()),
            None => drag_hint(state.units.get()),
        })
    };
    view! {
        <p id="drag-status" class="status-line" role="status" aria-live="polite" data-stopped=move || stopped().to_string() class:stopped=stopped>
            {text}
        </p>
        <PointerReadout />
    }
}

/// The status line with the vehicle on the deck: its leading axle's x in `units`, and how
/// to move it.
fn vehicle_words(x: f64, units: crate::format::Units) -> String {
    format!(
        "Vehicle: leading axle at x = {}. Drag it along the deck, or focus the elevation and use the left and \
         right arrow keys (Shift: one panel); the crown, springings, deck and ground points drag as before.",
        units.show(crate::format::Quantity::Length, x)
    )
}

/// Distance of the readout from the pointer, CSS pixels (right of and above it).
const READOUT_OFFSET: (f64, f64) = (16.0, -30.0);
/// Room the readout needs to the right of the pointer before it flips to the left, CSS
/// pixels.
const READOUT_ROOM: f64 = 240.0;

/// The value being dragged, beside the pointer; hidden when not dragging.
#[component]
fn PointerReadout() -> impl IntoView {
    let state = expect_context::<AppState>();
    let text = move || {
        let units = state.units.get();
        state.drag_reading.with(|r| r.map(|r| r.reading.describe(units)).unwrap_or_default())
    };
    // placed through the element's style properties, its look in style.css; worked out
    // once per pointer move: (left, right, top, display)
    let place = Memo::new(move |_| match state.drag_reading.get() {
        Some(r) => {
            let width = window().inner_width().ok().and_then(|w| w.as_f64()).unwrap_or(f64::INFINITY);
            let (x, y) = r.client;
            let top = format!("{}px", (y + READOUT_OFFSET.1).max(0.0));
            // near the right edge the readout goes left of the pointer
            if x + READOUT_ROOM > width {
                ("auto".to_string(), format!("{}px", (width - x + READOUT_OFFSET.0).max(0.0)), top, "block")
            } else {
                (format!("{}px", x + READOUT_OFFSET.0), "auto".to_string(), top, "block")
            }
        }
        None => ("auto".to_string(), "auto".to_string(), "0px".to_string(), "none"),
    });
    let left = move || place.with(|p| p.0.clone());
    let right = move || place.with(|p| p.1.clone());
    let top = move || place.with(|p| p.2.clone());
    let display = move || place.with(|p| p.3);
    view! {
        <div id="drag-value" class="drag-value" aria-hidden="true"
            style:left=left style:right=right style:top=top style:display=display>{text}</div>
    }
}

/// Beside the rise: when an edit of the rise or the crown level was refused for a rise
/// over the largest the layout takes, that largest rise (what governs it, where the
/// funicular's highest point is). Nothing otherwise.
#[component]
pub fn RiseLimitHint() -> impl IntoView {
    let state = expect_context::<AppState>();
    let hint = Memo::new(move |_| {
        let units = state.units.get();
        state.refused.with(|r| {
            let r = r.as_ref()?;
            if !matches!(r.edited, Field::CrownRise | Field::CrownLevel) {
                return None;
            }
            let limit = state.design.with(largest_rise).ok()?;
            (r.candidate.rise() > limit.rise).then(|| {
                let words = limit.describe(units);
                let mut c = words.chars();
                c.next().map(|f| f.to_uppercase().chain(c).collect::<String>() + ".").unwrap_or_default()
            })
        })
    });
    view! {
        // the look of the advice inside a field (it stands between two fields)
        <div class="advice rise-limit" id="rise-limit">
            {move || hint.get().map(|h| view! { <p>{h}</p> })}
        </div>
    }
}
