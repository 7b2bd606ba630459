//! "Options": save the design on screen as a named option, compare up to four side by
//! side (small elevations at one common scale, and the key numbers of
//! `arch::options::compare`: differences from the first option, the best of each row that
//! has a direction marked), open one, and copy one link that carries the whole comparison.
//! A comparison opened from such a link is shown in place of the saved options until the
//! user adds it to them or goes back to them; the saved ones are never touched by a link.
//!
//! Each cell publishes its SI value as `data-value` (id `cmp-METRIC-K`) for tests.

use crate::canvas;
use crate::format::{Quantity, Units};
use crate::options::OptionsState;
use crate::paint::paint;
use crate::permalink_sync::link_to_comparison;
use crate::state::AppState;
use leptos::html::Canvas;
use leptos::prelude::*;
use springline_statics::analyze;
use springline_statics::arch::options::{compare, Better, KeyNumbers, Row};
use springline_statics::link::comparison::NamedDesign;
use springline_statics::link::permalink;
use springline_statics::scene::elevation::{bounds, thumbnail, thumbnail_area};
use springline_statics::scene::{Transform, Viewport};

/// The size of each small elevation, CSS pixels.
const THUMB: (f64, f64) = (300.0, 120.0);

/// The key numbers of each option shown, in order, once all are known.
fn numbers_of(options: OptionsState, shown: &[NamedDesign]) -> Option<Vec<KeyNumbers>> {
    options.numbers.with(|n| shown.iter().map(|o| n.get(&permalink::encode(&o.design)).cloned()).collect())
}

/// A value for people in the user's units; whole counts (panels) without decimals.
fn shown(units: Units, q: Quantity, v: f64) -> String {
    if q == Quantity::Count && v.fract() == 0.0 && v.abs() < 1000.0 {
        format!("{v:.0}")
    } else {
        units.show(q, v)
    }
}

/// A difference for people: "+1.2 kN", "−3 t", "same".
fn difference(units: Units, q: Quantity, d: f64) -> String {
    let shown = shown(units, q, d.abs());
    // a difference that rounds to nothing on screen reads as the same
    if shown == self::shown(units, q, 0.0) {
        "same".into()
    } else if d > 0.0 {
        format!("+{shown}")
    } else {
        format!("\u{2212}{shown}")
    }
}

/// Makes `option` the design on screen (one undo step) when it analyses; otherwise the
/// panel says why and the design on screen stays.
fn open_option(state: AppState, options: OptionsState, option: &NamedDesign) {
    if state.design.with_untracked(|d| *d == option.design) {
        return;
    }
    match state.check(&option.design) {
        Ok(()) => state.commit(option.design.clone()),
        Err(e) => options.message.set(Some(format!(
            "'{}' cannot be opened: its design does not analyse ({e}). The design on screen is unchanged.",
            option.name
        ))),
    }
}

/// The panel.
#[component]
pub fn OptionsPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let options = expect_context::<OptionsState>();
    let name = RwSignal::new(String::new());
    let copied = RwSignal::new(false);
    let save = move || {
        let typed = name.get_untracked();
        let n = options.saved.with_untracked(Vec::len) + 1;
        let chosen = if typed.trim().is_empty() { format!("Option {n}") } else { typed };
        let design = state.design.get_untracked();
        let from_link = options.shared.with_untracked(Option::is_some);
        match options.save(&chosen, &design) {
            Ok(saved) => {
                // a saved option belongs to one's own list: show it
                options.shared.set(None);
                options.message.set(Some(if from_link {
                    format!("Saved '{saved}' to your options, shown now in place of the link's comparison (open the link again to see that).")
                } else {
                    format!("Saved '{saved}'.")
                }));
                name.set(String::new());
            }
            Err(e) => options.message.set(Some(e)),
        }
    };
    // encoded once a drag ends, not on every pointer move (the settled design holds)
    let meeting_link = Memo::new(move |_| {
        state.settled_design.track();
        options.saved.track();
        options.shared.track();
        link_to_comparison(state, options).unwrap_or_default()
    });
    let copy = move |_: ()| {
        let Some(w) = web_sys::window() else { return };
        let link = meeting_link.get_untracked();
        if link.is_empty() {
            return;
        }
        // the field shows the link selected, for Ctrl+C where the page may not write the
        // clipboard (a page served over plain http from another machine)
        if let Some(field) = w
            .document()
            .and_then(|d| d.get_element_by_id("meeting-link"))
            .and_then(|e| wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlInputElement>(e).ok())
        {
            let _ = field.focus();
            field.select();
        }
        let navigator = w.navigator();
        let has_clipboard =
            js_sys::Reflect::get(&navigator, &"clipboard".into()).is_ok_and(|c| !c.is_undefined());
        if has_clipboard {
            let _ = navigator.clipboard().write_text(&link);
            copied.set(true);
            set_timeout(move || copied.set(false), std::time::Duration::from_millis(1500));
        } else {
            options.message.set(Some("This page cannot write the clipboard here: the link is selected in the field above, press Ctrl+C (Cmd+C) to copy it.".into()));
        }
    };
    let shown = Memo::new(move |_| options.shown());
    // Alt+S saves, Alt+L copies the link, Alt+N / Alt+P open the next / previous option,
    // Alt+A adds a link's options to one's own (`components::shortcuts` lists them)
    let step = move |by: isize| {
        let list = shown.get_untracked();
        if list.is_empty() {
            return;
        }
        let here = state.design.with_untracked(|d| list.iter().position(|o| o.design == *d));
        let n = list.len() as isize;
        let next = match here {
            Some(k) => (k as isize + by).rem_euclid(n),
            None if by > 0 => 0,
            None => n - 1,
        };
        if let Some(option) = list.get(next as usize) {
            open_option(state, options, option);
        }
    };
    let keys = window_event_listener(leptos::ev::keydown, move |ev: web_sys::KeyboardEvent| {
        match crate::components::shortcuts::page_key(&ev) {
            Some("KeyS") => save(),
            Some("KeyL") => copy(()),
            Some("KeyN") => step(1),
            Some("KeyP") => step(-1),
            Some("KeyA") => options.adopt_shared(),
            _ => return,
        }
        ev.prevent_default();
    });
    on_cleanup(move || keys.remove());
    let shared_banner = move || {
        options.shared.with(|s| s.as_ref().map(|c| c.options.len())).map(|count| {
            view! {
                <div class="shared-banner" id="shared-banner" role="status">
                    {format!(
                        "A comparison from a link: {}. Your own saved options are untouched.",
                        springline_statics::error::counted(count, "option", "options")
                    )}
                    <button type="button" class="small" id="adopt-shared" on:click=move |_| options.adopt_shared()>
                        "Add these to my options"
                    </button>
                    <button type="button" class="small" id="close-shared" on:click=move |_| options.shared.set(None)>
                        "Show my options"
                    </button>
                </div>
            }
        })
    };
    view! {
        <section class="options-panel" id="options-panel" aria-labelledby="options-title">
            <div class="options-head">
                <h3 id="options-title">"Options"</h3>
                <label class="option-name">
                    <span class="visually-hidden">"Name of the option"</span>
                    <input type="text" id="option-name" maxlength="60" placeholder="name this option"
                        prop:value=move || name.get()
                        on:input=move |ev| name.set(event_target_value(&ev))
                        on:keydown=move |ev: web_sys::KeyboardEvent| if ev.key() == "Enter" { save() } />
                </label>
                <button type="button" id="save-option" title="Save the design on screen as an option (Alt+S)"
                    on:click=move |_| save()>"Save as option"</button>
                <button type="button" id="copy-meeting-link" title="Copy one link that opens this comparison (Alt+L)"
                    prop:disabled=move || shown.with(Vec::is_empty) on:click=move |_| copy(())>
                    {move || if copied.get() { "link copied" } else { "copy the comparison's link" }}
                </button>
            </div>
            <input type="text" id="meeting-link" class="meeting-link" readonly aria-label="The comparison's link"
                class:hidden=move || shown.with(Vec::is_empty) prop:value=move || meeting_link.get() />
            {shared_banner}
            {move || options.message.get().map(|m| view! {
                <p class="hint" id="options-message" role="status">{m}
                    <button type="button" class="small" on:click=move |_| options.message.set(None)>"dismiss"</button>
                </p>
            })}
            <Comparison shown=shown />
        </section>
    }
}

/// The small elevations and the table.
#[component]
fn Comparison(shown: Memo<Vec<NamedDesign>>) -> impl IntoView {
    let state = expect_context::<AppState>();
    let options = expect_context::<OptionsState>();
    let table = Memo::new(move |_| shown.with(|s| numbers_of(options, s).map(|n| (compare(&n), n))));
    let thumbs = move || {
        let list = shown.get();
        let boxes: Vec<_> = list.iter().map(|o| bounds(&o.design)).collect();
        let transforms = Transform::fit_all(&boxes, thumbnail_area(Viewport::new(THUMB.0, THUMB.1)));
        let from_link = options.shared.with(Option::is_some);
        list.into_iter()
            .zip(transforms)
            .enumerate()
            .map(|(k, (option, transform))| {
                view! { <Thumb index=k option=option transform=transform from_link=from_link /> }
            })
            .collect_view()
    };
    let open_index = Memo::new(move |_| {
        state.settled_design.with(|d| shown.with(|s| s.iter().position(|o| o.design == *d)))
    });
    let header = move || {
        shown
            .get()
            .into_iter()
            .enumerate()
            .map(|(k, o)| {
                let open = move || open_index.get() == Some(k);
                view! { <th scope="col" id=format!("cmp-name-{k}") class:open-option=open>{o.name}</th> }
            })
            .collect_view()
    };
    let rows = move || {
        let units = state.units.get();
        let (rows, numbers) = table.get()?;
        let body = rows.into_iter().map(|row| table_row(units, row)).collect_view();
        let feasible = numbers
            .iter()
            .enumerate()
            .map(|(k, n)| {
                let words = if n.feasible {
                    "yes".to_string()
                } else {
                    format!("no: {}", n.reason.clone().unwrap_or_default())
                };
                view! { <td id=format!("cmp-feasible-{k}") class:infeasible=!n.feasible>{words}</td> }
            })
            .collect_view();
        Some(view! {
            {body}
            <tr><th scope="row">"feasible"</th>{feasible}</tr>
        })
    };
    let waiting = move || {
        (!shown.with(Vec::is_empty) && table.with(Option::is_none))
            .then(|| view! { <p class="hint" id="comparison-working">"Working out each option's key numbers (each is sized)..."</p> })
    };
    view! {
        <Show when=move || !shown.with(Vec::is_empty)
            fallback=|| view! { <p class="hint" id="no-options">"No options yet: save the design on screen as an option, change it, and save again to compare them side by side."</p> }>
            <div class="option-thumbs" id="option-thumbs">{thumbs}</div>
            {waiting}
            <div class="table-scroll">
                <table class="comparison" id="comparison">
                    <caption>"Key numbers per rib line where stated, otherwise the whole bridge; differences from the first option; the best of each row that has a better direction marked. Concept-design values."</caption>
                    <thead><tr><th scope="col">"quantity"</th>{header}</tr></thead>
                    <tbody>{rows}</tbody>
                </table>
            </div>
        </Show>
    }
}

/// One row of the table.
fn table_row(units: Units, row: Row) -> impl IntoView {
    let q = row.metric.quantity;
    let id = row.metric.id;
    let direction = match row.metric.better {
        Better::Lower => " (lower is better)",
        Better::Higher => " (higher is better)",
        Better::Neither => "",
    };
    let cells = row
        .cells
        .into_iter()
        .enumerate()
        .map(|(k, cell)| {
            let text = cell.value.map_or("–".to_string(), |v| shown(units, q, v));
            let diff = cell.difference.map(|d| difference(units, q, d));
            view! {
                <td id=format!("cmp-{id}-{k}") class:best=cell.best
                    data-value=cell.value.map(|v| format!("{v}")).unwrap_or_default()>
                    {text}
                    {cell.best.then(|| view! { <span class="best-mark" title="best of the feasible options">" ★ best"</span> })}
                    {diff.map(|d| view! { <span class="difference">{d}</span> })}
                </td>
            }
        })
        .collect_view();
    view! { <tr><th scope="row">{row.metric.label}<span class="direction">{direction}</span></th>{cells}</tr> }
}

/// One option's small elevation with its name and buttons.
#[component]
fn Thumb(index: usize, option: NamedDesign, transform: Transform, from_link: bool) -> impl IntoView {
    let state = expect_context::<AppState>();
    let options = expect_context::<OptionsState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    let design = option.design.clone();
    Effect::new(move |_| {
        let Some(el) = node.get() else { return };
        let Ok(analysis) = analyze(&design) else { return };
        let scene = thumbnail(&analysis, &design, transform, Viewport::new(THUMB.0, THUMB.1));
        if canvas::prepare_for(&el, THUMB.0, THUMB.1).is_some() {
            paint(&el, &scene);
        }
    });
    let opened = option.clone();
    let open = move |_| open_option(state, options, &opened);
    let is_open = {
        let d = option.design.clone();
        Memo::new(move |_| state.settled_design.with(|current| *current == d))
    };
    let remove = move |_| {
        options.saved.update(|s| {
            if index < s.len() {
                s.remove(index);
            }
        });
    };
    view! {
        <figure class="option-thumb" class:open-option=move || is_open.get() id=format!("option-{index}")>
            <figcaption>
                <span class="option-label">{format!("{}. {}", index + 1, option.name)}</span>
                <button type="button" class="small" id=format!("open-option-{index}")
                    title="Open this option (Alt+N / Alt+P step through them)"
                    prop:disabled=move || is_open.get() on:click=open>"open"</button>
                {(!from_link).then(|| view! {
                    <button type="button" class="small" id=format!("remove-option-{index}") on:click=remove>"remove"</button>
                })}
            </figcaption>
            <canvas class="option-elevation" node_ref=node role="img"
                aria-label=format!("Elevation of option {}, at the comparison's common scale", index + 1)
                style:width=format!("{}px", THUMB.0) style:height=format!("{}px", THUMB.1)></canvas>
        </figure>
    }
}
