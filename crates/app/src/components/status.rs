//! The status line under the drawings (why a drag stopped, else how to drag) and the
//! largest-rise hint beside the rise field. (The value being dragged is drawn on the
//! elevation beside the pointer: `scene::readout`.)
//!
//! Neither moves anything on the page: the status line keeps one fixed height whatever
//! it says, and the hint sits in the rise field's own message area.

use crate::drag::drag_hint;
use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::arch::edit::largest_rise;
use springline_statics::error::Field;

/// The fixed-height status line (three lines of text, style.css).
#[component]
pub fn StatusLine() -> impl IntoView {
    let state = expect_context::<AppState>();
    let stopped = move || state.drag_stop.with(Option::is_some);
    // with the vehicle on the deck: where its leading axle stands, held while it is dragged
    // (the readout beside the pointer follows every move; a line of the page rewritten per
    // move would have the browser lay out and repaint the page each time)
    let vehicle =
        crate::state::held(move || state.vehicle_dragging.get(), move || state.vehicle.get(), |a, b| a != b);
    let text = move || {
        state.drag_stop.get().unwrap_or_else(|| match vehicle.get() {
            Some(x) => vehicle_words(x, state.units.get()),
            None => drag_hint(state.units.get()),
        })
    };
    view! {
        <p id="drag-status" class="status-line" role="status" aria-live="polite" data-stopped=move || stopped().to_string() class:stopped=stopped>
            {text}
        </p>
    }
}

/// The status line with the vehicle on the deck: its leading axle's x in `units`, and how
/// to move it.
fn vehicle_words(x: f64, units: crate::format::Units) -> String {
    format!(
        "Vehicle: {}. Drag it along the deck, or focus the elevation and use the left and right arrow keys \
         (Shift: one panel); the crown, springings, deck and ground points drag as before.",
        crate::drag::leading_axle(x, units)
    )
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
