//! The page's keyboard shortcuts: which key event counts as one (never while typing in a
//! field), and the list on screen ("?" or the Keys button shows it).

use leptos::prelude::*;

/// The physical key of a page shortcut: Alt with a letter (`KeyS`, by its place on the
/// keyboard, so any layout and macOS's Option characters work), or Escape; `None` for
/// other keys, and for any key while a text field or a select has the focus (typing is not
/// a command).
pub fn page_key(ev: &web_sys::KeyboardEvent) -> Option<&'static str> {
    // a held key repeats: one press, one action
    if typing(ev) || ev.repeat() {
        return None;
    }
    let code = ev.code();
    if code == "Escape" {
        return Some("Escape");
    }
    if !ev.alt_key() || ev.ctrl_key() || ev.meta_key() {
        return None;
    }
    ["KeyS", "KeyL", "KeyN", "KeyP", "KeyA", "KeyW", "KeyB"].into_iter().find(|k| *k == code)
}

/// Whether the key went to a text field or a select.
fn typing(ev: &web_sys::KeyboardEvent) -> bool {
    ev.target()
        .and_then(|t| wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlElement>(t).ok())
        .is_some_and(|e| matches!(e.tag_name().as_str(), "INPUT" | "SELECT" | "TEXTAREA"))
}

/// Every shortcut: keys, what it does.
pub const SHORTCUTS: [(&str, &str); 14] = [
    ("Ctrl+Z", "undo"),
    ("Ctrl+Shift+Z or Ctrl+Y", "redo"),
    ("Alt+S", "save the design on screen as an option"),
    ("Alt+N / Alt+P", "open the next / previous option"),
    ("Alt+L", "copy the comparison's link"),
    ("Alt+A", "add a linked comparison's options to yours"),
    ("Alt+W", "run the sweep"),
    ("Escape", "cancel the sweep"),
    ("Alt+B", "projector mode on or off: large type, high contrast, controls hidden"),
    ("Arrows, then Enter", "on a sweep chart: pick an option, open it"),
    ("Tab / Shift+Tab", "move between controls, drawings and charts"),
    ("Arrows on the elevation", "step through the members (vehicle chosen: move it; Shift: a panel)"),
    ("Enter on the elevation", "pick the member stepped to: its influence line"),
    ("?", "show or hide this list"),
];

/// The Keys button and the list it shows.
#[component]
pub fn ShortcutList() -> impl IntoView {
    let open = RwSignal::new(false);
    let keys = window_event_listener(leptos::ev::keydown, move |ev: web_sys::KeyboardEvent| {
        if ev.key() == "?" && !typing(&ev) {
            open.update(|o| *o = !*o);
            ev.prevent_default();
        } else if ev.key() == "Escape" && open.get_untracked() {
            // Escape closes the list only (a running sweep waits for the next press)
            open.set(false);
            ev.stop_immediate_propagation();
        }
    });
    on_cleanup(move || keys.remove());
    let rows = SHORTCUTS
        .iter()
        .map(|(k, what)| view! { <tr><th scope="row"><kbd>{*k}</kbd></th><td>{*what}</td></tr> })
        .collect_view();
    view! {
        <button type="button" id="shortcuts-toggle" class="small" aria-expanded=move || open.get().to_string()
            aria-controls="shortcuts" title="Keyboard shortcuts (?)" on:click=move |_| open.update(|o| *o = !*o)>
            "keys"
        </button>
        <div class="shortcuts" id="shortcuts" role="dialog" aria-label="Keyboard shortcuts" class:hidden=move || !open.get()>
            <table><caption>"Keyboard shortcuts"</caption><tbody>{rows}</tbody></table>
            <button type="button" class="small" on:click=move |_| open.set(false)>"close"</button>
        </div>
    }
}

/// The projector mode button: large type, high contrast, the controls hidden and the
/// drawings enlarged (a class on the page's body, `web/style.css`); Alt+B toggles it too.
#[component]
pub fn ProjectorToggle() -> impl IntoView {
    let on = RwSignal::new(false);
    let keys = window_event_listener(leptos::ev::keydown, move |ev: web_sys::KeyboardEvent| {
        if page_key(&ev) == Some("KeyB") {
            on.update(|o| *o = !*o);
            ev.prevent_default();
        }
    });
    on_cleanup(move || keys.remove());
    // the body's class follows (outside the app's own elements)
    Effect::new(move |_| {
        let wanted = on.get();
        if let Some(body) = web_sys::window().and_then(|w| w.document()).and_then(|d| d.body()) {
            let _ = body.class_list().toggle_with_force("projector", wanted);
        }
        // the canvases take their new size
        if let (Some(w), Ok(resize)) = (web_sys::window(), web_sys::Event::new("resize")) {
            let _ = w.dispatch_event(&resize);
        }
    });
    view! {
        <button type="button" id="projector-toggle" class="small" aria-pressed=move || on.get().to_string()
            title="Projector mode: large type, controls hidden (Alt+B)" on:click=move |_| on.update(|o| *o = !*o)>
            {move || if on.get() { "leave projector mode" } else { "projector" }}
        </button>
    }
}
