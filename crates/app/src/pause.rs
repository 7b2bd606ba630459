//! Work that waits for the edits to pause: results that take longer than an edit's
//! redraw (the traffic envelopes, the buckling and vibration modes) are computed in a
//! task of their own once the design has rested, never while a point is dragged.

use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::Design;
use std::time::Duration;

/// Runs `task` with the design on screen once it has rested for `delay`: an effect
/// schedules it on every edit, and a newer edit makes an older pending run skip. While
/// dragging nothing is scheduled (the design is not even read), so the last results
/// stay. Installed once, with the state, so the results outlive any redraw.
pub fn when_edits_pause(state: AppState, delay: Duration, task: impl Fn(Design) + Copy + 'static) {
    when_rested(move || (!state.dragging.get()).then(|| state.design.get()), delay, task);
}

/// Runs `task` with the value `watch` gives once that value has rested for `delay`: an
/// effect reads it on every change it tracks and schedules the run, and a newer change
/// makes an older pending run skip. `None` schedules nothing.
pub fn when_rested<T: 'static>(
    watch: impl Fn() -> Option<T> + 'static,
    delay: Duration,
    task: impl Fn(T) + Copy + 'static,
) {
    let generation = StoredValue::new(0u64);
    Effect::new(move |_| {
        let Some(value) = watch() else { return };
        let this = generation.get_value().wrapping_add(1);
        generation.set_value(this);
        set_timeout(
            move || {
                if generation.get_value() == this {
                    task(value);
                }
            },
            delay,
        );
    });
}
