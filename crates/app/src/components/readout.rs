//! What the member under the pointer (or chosen with the keyboard) carries, in each model it
//! belongs to; the switch of the model the elevation draws; and the keys that step
//! through members on a drawing.

use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::arch::readout::{readout, MemberKey};
use springline_statics::{Analysis, MemberRole, ModelKind};

/// Whether the analysis has a solved truss idealisation the elevation can draw.
fn has_solved_truss(a: &Analysis) -> bool {
    a.truss.as_ref().is_some_and(|t| t.solution.is_some())
}

/// The model the elevation draws for the user's choice `chosen`: the truss idealisation
/// only where there is a solved one.
pub fn drawn_model(a: &Analysis, chosen: ModelKind) -> ModelKind {
    if chosen == ModelKind::Truss && has_solved_truss(a) {
        ModelKind::Truss
    } else {
        ModelKind::Frame
    }
}

/// The readout of the focused member: one line for the member and case, one per model;
/// a fixed height so nothing below it moves, read out politely by screen readers.
#[component]
pub fn MemberReadout() -> impl IntoView {
    let state = expect_context::<AppState>();
    let lines = Memo::new(move |_| {
        let key = state.focus.get()?;
        let case = state.case.get();
        let units = state.units.get();
        let ribs = state.settled_design.with(|d| d.deck.ribs);
        // a member the current layout no longer has reads as nothing pointed at
        state.settled_analysis.with(|o| {
            let r = readout(o.as_ref().ok()?, ribs, &key, case);
            (!r.in_no_model()).then(|| r.lines(units))
        })
    });
    view! {
        <div
            id="member-readout"
            class="member-readout"
            role="status"
            aria-live="polite"
        >
            {move || match lines.get() {
                Some(lines) => {
                    lines
                        .into_iter()
                        .enumerate()
                        .map(|(i, l)| {
                            view! { <div class="readout-line" class:readout-first=i == 0 data-line=i>{l}</div> }
                        })
                        .collect_view()
                        .into_any()
                }
                None => {
                    view! {
                        <div class="hint dim-text">
                            "Point at a member, or focus a drawing and use the arrow keys, to read its forces in each model (Escape clears)."
                        </div>
                    }
                        .into_any()
                }
            }}
        </div>
    }
}

/// Chooses the model the elevation draws: the frame model always, the truss idealisation
/// where the design has one (braced spandrels).
#[component]
pub fn ModelSwitch() -> impl IntoView {
    let state = expect_context::<AppState>();
    let has_truss =
        Memo::new(move |_| state.settled_analysis.with(|o| o.as_ref().is_ok_and(|a| has_solved_truss(a))));
    let truss_drawn = move || has_truss.get() && state.elevation_model.get() == ModelKind::Truss;
    view! {
        <div
            class="model-switch"
            role="radiogroup"
            aria-label="Model the elevation draws"
        >
            <span class="dim-text">"Elevation draws"</span>
            <label>
                <input
                    type="radio"
                    name="elevation-model"
                    id="model-frame"
                    prop:checked=move || !truss_drawn()
                    on:change=move |_| state.elevation_model.set(ModelKind::Frame)
                />
                " frame model"
            </label>
            <label title="braced spandrels only">
                <input
                    type="radio"
                    name="elevation-model"
                    id="model-truss"
                    prop:checked=truss_drawn
                    prop:disabled=move || !has_truss.get()
                    on:change=move |_| state.elevation_model.set(ModelKind::Truss)
                />
                " truss idealisation"
            </label>
        </div>
    }
}

/// Order in which the keyboard visits members: by role, then left to right.
const ROLE_ORDER: [MemberRole; 6] = [
    MemberRole::Rib,
    MemberRole::Deck,
    MemberRole::Post,
    MemberRole::Bracing,
    MemberRole::Pier,
    MemberRole::Approach,
];

/// The members of model `kind` in keyboard order, as keys.
fn members_in_order(a: &Analysis, kind: ModelKind) -> Vec<MemberKey> {
    let (model, map) = match kind {
        ModelKind::Truss => match a.truss.as_ref() {
            Some(t) => (&t.model, &t.map),
            None => return Vec::new(),
        },
        _ => (&a.frame.model, &a.frame.map),
    };
    let mut order: Vec<(usize, f64, usize)> = model
        .members
        .iter()
        .enumerate()
        .map(|(k, m)| {
            let role =
                ROLE_ORDER.iter().position(|r| Some(r) == map.roles.get(k)).unwrap_or(ROLE_ORDER.len());
            (role, 0.5 * (model.nodes[m.start].x + model.nodes[m.end].x), k)
        })
        .collect();
    springline_statics::order::sort_by(&mut order, |p, q| p.0.cmp(&q.0).then(p.1.total_cmp(&q.1)));
    order.into_iter().filter_map(|(_, _, k)| MemberKey::of(map, kind, k)).collect()
}

/// Steps the focused member through the members of model `kind` with the arrow keys
/// (right / down: next, left / up: previous, Home / End: first / last); Escape clears.
/// Handled keys do not scroll the page.
pub fn step_member(state: AppState, ev: &web_sys::KeyboardEvent, kind: ModelKind) {
    let key = ev.key();
    if key == "Escape" {
        state.focus_member(None);
        ev.prevent_default();
        return;
    }
    if !matches!(key.as_str(), "ArrowRight" | "ArrowDown" | "ArrowLeft" | "ArrowUp" | "Home" | "End") {
        return;
    }
    ev.prevent_default();
    let order =
        state.analysis.with_untracked(|o| o.as_ref().map(|a| members_in_order(a, kind)).unwrap_or_default());
    if order.is_empty() {
        return;
    }
    let last = order.len() - 1;
    let now = state.focus.get_untracked().and_then(|f| order.iter().position(|k| *k == f));
    let next = match (key.as_str(), now) {
        ("Home", _) | ("ArrowRight" | "ArrowDown", None) => 0,
        ("ArrowRight" | "ArrowDown", Some(i)) => (i + 1).min(last),
        ("ArrowLeft" | "ArrowUp", Some(i)) => i.saturating_sub(1),
        _ => last,
    };
    state.focus_member(order.get(next).copied());
}
