//! Stability and dynamics in the results panel: the arch's critical load factor
//! alpha_cr under the dead load with the verdict on it, the lowest mode of a member
//! buckling on its own, the first natural frequencies and, for a footbridge, the comfort
//! flag; and the choice of drawing the buckled shape or the first vibration mode over
//! the elevation (`scene::modes`).
//!
//! The numbers are the engine's (`arch::stability::arch_stability`), worked out in the
//! background worker once the edits pause (`crate::settled`), never while dragging: the
//! last results stay on screen, marked as for the design before the edit.

use crate::format::{Quantity, Units};
use crate::state::{AppState, ModeView};
use leptos::prelude::*;
use springline_statics::arch::stability::ArchStability;
use std::sync::Arc;

/// How many modes of each kind are found.
pub const SHOWN_MODES: usize = 3;

/// The results of the design the panels show (`settled_design`), when they are for it.
pub fn current(state: AppState) -> Option<Arc<(springline_statics::Design, crate::state::StabilityOutcome)>> {
    state.stability.get().filter(|s| state.settled_design.with(|d| *d == s.0))
}

/// The results of the design the drawings show (`design`, which a drag moves), when they
/// are for it: none while a drag has moved it (a mode shape's nodes are where they were).
pub fn drawn(state: AppState) -> Option<Arc<(springline_statics::Design, crate::state::StabilityOutcome)>> {
    state.stability.get().filter(|s| state.design.with(|d| *d == s.0))
}

/// The lines of the block: alpha_cr, the verdict, the lowest local mode, frequencies.
fn summary(s: &ArchStability, units: Units) -> impl IntoView {
    let arch = if s.arch.mode.is_some() {
        format!("{:.2}", s.arch.alpha_cr)
    } else {
        format!("above {:.2}", s.arch.alpha_cr)
    };
    let local = s
        .dead
        .modes
        .first()
        .zip(s.buckling_members.first().cloned().flatten())
        .map(|(m, member)| format!("{member} buckles on its own between its ends at {:.2} times the dead load (its member check in sizing covers it).", m.load_factor));
    let frequencies = s
        .vibration
        .modes
        .iter()
        .map(|m| {
            format!(
                "{:.2} Hz ({})",
                m.frequency,
                if m.vertical_share > 0.5 { "vertical" } else { "horizontal" }
            )
        })
        .collect::<Vec<_>>()
        .join(", ");
    let _ = units;
    view! {
        <table class="results">
            <tbody>
                <tr>
                    <th scope="row">"The arch's alpha_cr, dead load"</th>
                    <td id="stability-alpha" data-value=format!("{}", s.arch.alpha_cr) data-quantity=Quantity::Ratio.key()>{arch}</td>
                </tr>
                <tr>
                    <th scope="row">"First vertical frequency"</th>
                    <td id="stability-vertical-hz" data-value=s.first_vertical_hz.map(|f| f.to_string()).unwrap_or_default()>
                        {s.first_vertical_hz.map_or("none found".to_string(), |f| format!("{f:.2} Hz"))}
                    </td>
                </tr>
            </tbody>
        </table>
        <p id="stability-verdict">{s.verdict.clone()}</p>
        {local.map(|l| view! { <p class="hint" id="stability-local">{l}</p> })}
        <p class="hint" id="stability-frequencies">{format!("Natural frequencies: {frequencies}.")}</p>
        {s.footbridge.clone().map(|f| view! { <p class="warning" id="stability-footbridge" role="note">{format!("Footbridge: {f}")}</p> })}
        <p class="hint" id="stability-plane">"Out-of-plane buckling and lateral sway are beyond this plane model and are not covered."</p>
    }
}

/// The three-way choice of the mode drawn over the elevation.
#[component]
fn ModeChoice() -> impl IntoView {
    let state = expect_context::<AppState>();
    let choices = [
        (ModeView::Off, "mode-view-off", "no mode"),
        (ModeView::Buckled, "mode-view-buckled", "buckled shape"),
        (ModeView::Vibration, "mode-view-vibration", "first vibration mode"),
    ];
    let buttons = choices
        .into_iter()
        .map(|(view, id, words)| {
            view! {
                <button type="button" id=id class="small"
                    aria-pressed=move || (state.mode_view.get() == view).to_string()
                    on:click=move |_| if view == ModeView::Off { state.mode_view.set(view) } else { state.choose_mode(view) }>{words}</button>
            }
        })
        .collect_view();
    view! {
        <div class="mode-choice" role="group" aria-label="Draw a mode over the elevation">
            <span class="what">"Draw over the elevation: "</span>{buttons}
        </div>
    }
}

/// The Stability block of the results panel.
#[component]
pub fn StabilityResults() -> impl IntoView {
    let state = expect_context::<AppState>();
    let is_current = move || current(state).is_some();
    let body = move || {
        let units = state.units.get();
        let Some(s) = state.stability.get() else {
            return view! { <p class="hint" id="stability-working">"Finding the buckling and vibration modes..."</p> }
                .into_any();
        };
        match &s.1 {
            Ok(r) => summary(r, units).into_any(),
            Err(e) => view! { <p class="error" id="stability-error" role="alert">{format!("No stability results: {e}")}</p> }
                .into_any(),
        }
    };
    view! {
        <section class="traffic-results" id="stability-results" aria-labelledby="stability-title"
            class:stale=move || !is_current() data-current=move || is_current().to_string()>
            <h3 id="stability-title">"Stability and vibration, in the arch plane"</h3>
            <Show when=move || state.dragging.get()>
                <p class="hint" id="stability-pending">"Shown for the design before the drag: updates when you let go."</p>
            </Show>
            {body}
            <ModeChoice />
        </section>
    }
}
