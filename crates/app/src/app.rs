//! The page: header with the caution, control panels, the two drawings and the results.

use crate::components::canvases::{ElevationCanvas, ForceCanvas};
use crate::components::controls::{ArchPanel, GroundPanel, LoadsPanel, RoadwayPanel, SectionsPanel};
use crate::components::results::ResultsPanel;
use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::Design;

/// The whole app.
#[component]
pub fn App() -> impl IntoView {
    let state = AppState::new(Design::demo());
    provide_context(state);
    // canvases follow the window size
    let handle = window_event_listener(leptos::ev::resize, move |_| state.resized.update(|n| *n = n.wrapping_add(1)));
    on_cleanup(move || handle.remove());
    let name = move || state.design.with(|d| d.name.clone());
    view! {
        <header class="top">
            <div class="brand">"Springline"</div>
            <div class="design-name">{name}</div>
            <p class="caution" role="note">
                "Concept design only: local codes and a licensed engineer govern."
            </p>
        </header>
        <main class="layout">
            <aside class="controls" aria-label="Design controls">
                <GroundPanel />
                <RoadwayPanel />
                <ArchPanel />
                <LoadsPanel />
                <SectionsPanel />
            </aside>
            <section class="drawings">
                <div class="canvas-row">
                    <ElevationCanvas />
                    <ForceCanvas />
                </div>
                <ResultsPanel />
            </section>
        </main>
    }
}
