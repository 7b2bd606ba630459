//! The header's tools: undo / redo (with the usual shortcuts), units, and copy link.

use crate::format::Units;
use crate::permalink_sync::link_to_open_design;
use crate::state::AppState;
use leptos::prelude::*;

/// Undo, redo, unit system and the copy-link button.
#[component]
pub fn Toolbar() -> impl IntoView {
    let state = expect_context::<AppState>();
    let copied = RwSignal::new(false);
    // Ctrl/Cmd+Z undo; Ctrl/Cmd+Shift+Z or Ctrl+Y redo (not while typing in a field)
    let keys = window_event_listener(leptos::ev::keydown, move |ev: web_sys::KeyboardEvent| {
        if !(ev.ctrl_key() || ev.meta_key()) {
            return;
        }
        let typing = ev
            .target()
            .and_then(|t| wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlElement>(t).ok())
            .map(|e| e.tag_name() == "INPUT")
            .unwrap_or(false);
        if typing {
            return;
        }
        let key = ev.key().to_lowercase();
        let done = match (key.as_str(), ev.shift_key()) {
            ("z", false) => state.undo(),
            ("z", true) | ("y", _) => state.redo(),
            _ => return,
        };
        if done {
            ev.prevent_default();
        }
    });
    on_cleanup(move || keys.remove());
    let copy = move |_| {
        let Some(w) = web_sys::window() else { return };
        // the design on screen, even when the address bar has not caught up with an edit
        let Some(link) = link_to_open_design(state) else { return };
        let _ = w.navigator().clipboard().write_text(&link);
        copied.set(true);
        set_timeout(move || copied.set(false), std::time::Duration::from_millis(1500));
    };
    let units_label = move || match state.units.get() {
        Units::Si => "units: SI",
        Units::UsCustomary => "units: US",
    };
    let units_spoken = move || match state.units.get() {
        Units::Si => "Units: SI. Switch to US customary",
        Units::UsCustomary => "Units: US customary. Switch to SI",
    };
    // the choice is kept in the browser's storage and the link (`permalink_sync`)
    let toggle_units = move |_| state.units.update(|u| *u = u.other());
    view! {
        <div class="toolbar" role="toolbar" aria-label="Design tools">
            <button type="button" id="undo" title="Undo (Ctrl+Z)" aria-label="Undo" on:click=move |_| { state.undo(); }
                prop:disabled=move || state.past.with(|p| p.is_empty())><span aria-hidden="true">"↶ "</span>"undo"</button>
            <button type="button" id="redo" title="Redo (Ctrl+Shift+Z)" aria-label="Redo" on:click=move |_| { state.redo(); }
                prop:disabled=move || state.future.with(|f| f.is_empty())><span aria-hidden="true">"↷ "</span>"redo"</button>
            <button type="button" id="units" title="Switch SI / US customary" aria-label=units_spoken on:click=toggle_units>{units_label}</button>
            <button type="button" id="copy-link" title="Copy a link that opens this design, with the load case and units shown" on:click=copy>
                {move || if copied.get() { "link copied" } else { "copy link" }}
            </button>
            <span class="visually-hidden" role="status">{move || if copied.get() { "Link copied" } else { "" }}</span>
        </div>
    }
}
