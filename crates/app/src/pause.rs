//! Work that waits for the edits to pause: what takes longer than an edit's redraw (the
//! results asked of the background worker, `crate::settled`; the print sheet's link and
//! numbers) is started once the value it follows has rested.

use leptos::prelude::*;
use std::time::Duration;

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
