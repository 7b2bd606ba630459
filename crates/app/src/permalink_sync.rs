//! Keeps the URL fragment and the design in step: the design is read from the link on
//! load and when a link is pasted (hashchange); the fragment follows the design after a
//! short pause, replacing the history entry so the back button is not flooded.

use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::link::permalink;
use springline_statics::{analyze, Design};
use std::time::Duration;

/// Pause before the address bar follows an edit.
const URL_DEBOUNCE: Duration = Duration::from_millis(300);

/// The design to open first: the link's, or the demo with a notice when the link is bad.
pub fn initial_design() -> (Design, Option<String>) {
    let hash = web_sys::window().and_then(|w| w.location().hash().ok()).unwrap_or_default();
    if hash.trim_start_matches('#').is_empty() {
        return (Design::demo(), None);
    }
    // a link must hold a design that analyses, not only one that validates
    let opened = permalink::decode(&hash).map_err(|e| e.to_string()).and_then(|d| match analyze(&d) {
        Ok(_) => Ok(d),
        Err(e) => Err(format!("its design cannot be analysed: {e}")),
    });
    match opened {
        Ok(d) => (d, None),
        Err(e) => (
            Design::demo(),
            Some(format!("This link could not be opened ({e}). Showing the demo design instead.")),
        ),
    }
}

/// Installs the two-way sync.
pub fn install(state: AppState) {
    // design -> fragment, debounced
    let generation = StoredValue::new(0u64);
    Effect::new(move |_| {
        state.design.track();
        generation.update_value(|g| *g += 1);
        let mine = generation.get_value();
        set_timeout(
            move || {
                if generation.get_value() != mine {
                    return;
                }
                // encoded once the edits pause, not on every pointer move of a drag
                let fragment = current_fragment(state);
                let Some(w) = web_sys::window() else { return };
                if w.location().hash().ok().as_deref() == Some(fragment.as_str()) {
                    return;
                }
                if let Ok(h) = w.history() {
                    let _ = h.replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&fragment));
                }
            },
            URL_DEBOUNCE,
        );
    });
    // pasted link -> design (one undo step); a bad link leaves the open design as it is
    let handle = window_event_listener(leptos::ev::hashchange, move |_| {
        let hash = web_sys::window().and_then(|w| w.location().hash().ok()).unwrap_or_default();
        let current = current_fragment(state);
        if hash == current {
            return;
        }
        let opened = permalink::decode(&hash).map_err(|e| e.to_string()).and_then(|d| {
            state.check(&d).map_err(|e| format!("its design cannot be analysed: {e}"))?;
            Ok(d)
        });
        match opened {
            Ok(d) => {
                state.notice.set(None);
                state.commit(d);
            }
            Err(e) => {
                state
                    .notice
                    .set(Some(format!("This link could not be opened ({e}). The open design is unchanged.")));
                // the address bar goes back to the open design's link
                if let Some(h) = web_sys::window().and_then(|w| w.history().ok()) {
                    let _ = h.replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&current));
                }
            }
        }
    });
    on_cleanup(move || handle.remove());
}

/// The URL fragment of the open design.
fn current_fragment(state: AppState) -> String {
    state.design.with_untracked(|d| format!("#{}", permalink::encode(d)))
}

/// The whole link of the design on screen: this page's address with the design encoded
/// now, not the address bar's fragment, which follows an edit only after a pause.
pub fn link_to_open_design(state: AppState) -> Option<String> {
    let href = web_sys::window()?.location().href().ok()?;
    let page = href.split('#').next().unwrap_or_default();
    Some(format!("{page}{}", current_fragment(state)))
}
