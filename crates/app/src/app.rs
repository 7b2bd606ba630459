//! The page: header with the caution, control panels, the two drawings and the results.

use crate::components::canvases::{ElevationCanvas, ForceCanvas};
use crate::components::controls::{ArchPanel, GroundPanel, LoadsPanel, RoadwayPanel, SectionsPanel};
use crate::components::results::ResultsPanel;
use crate::components::toolbar::Toolbar;
use crate::permalink_sync;
use crate::state::AppState;
use leptos::prelude::*;

/// The whole app.
#[component]
pub fn App() -> impl IntoView {
    let (design, notice) = permalink_sync::initial_design();
    let state = AppState::new(design);
    state.notice.set(notice);
    provide_context(state);
    permalink_sync::install(state);
    // canvases follow the window size
    let handle =
        window_event_listener(leptos::ev::resize, move |_| state.resized.update(|n| *n = n.wrapping_add(1)));
    on_cleanup(move || handle.remove());
    let name = move || state.design.with(|d| d.name.clone());
    view! {
        <header class="top">
            <div class="brand">"Springline"</div>
            <div class="design-name">{name}</div>
            <Toolbar />
            <p class="caution" role="note">
                "Concept design only: local codes and a licensed engineer govern."
            </p>
        </header>
        <Show when=move || state.notice.with(|n| n.is_some())>
            <div class="notice" id="notice" role="alert">
                {move || state.notice.get()}
                <button class="small" on:click=move |_| state.notice.set(None)>"dismiss"</button>
            </div>
        </Show>
        <main class="layout">
            <aside class="controls" aria-label="Design controls">
                <GroundPanel />
                <RoadwayPanel />
                <ArchPanel />
                <LoadsPanel />
                <SectionsPanel />
            </aside>
            <section class="drawings">
                <CaseSelector />
                <div class="canvas-row">
                    <ElevationCanvas />
                    <ForceCanvas />
                </div>
                <crate::components::status::StatusLine />
                <ResultsPanel />
            </section>
        </main>
    }
}

/// Chooses the load case the drawings show.
#[component]
fn CaseSelector() -> impl IntoView {
    let state = expect_context::<AppState>();
    let options = move || {
        state
            .analysis
            .get()
            .map(|a| {
                a.load_cases
                    .iter()
                    .enumerate()
                    .map(|(i, c)| view! { <option value=i.to_string() selected=move || state.case.get() == i>{c.description.to_string()}</option> })
                    .collect_view()
            })
            .ok()
    };
    view! {
        <div class="case-row">
            <label for="load-case">"Drawings show"</label>
            <select id="load-case" on:change=move |ev| state.case.set(event_target_value(&ev).parse().unwrap_or(0))>
                {options}
            </select>
            <span class="hint">"Tension teal, compression orange. Drag the crown, a springing, the deck or a ground point."</span>
        </div>
    }
}
