//! The page: header with the caution, the design inputs, the load case buttons, the two
//! drawings and the results. Wide windows put the inputs in a column on the left; below
//! 1100 px the drawings come first and the inputs fold away behind one button
//! (`web/style.css` places the parts; the markup order is the reading order of a phone).

use crate::components::canvases::{ElevationCanvas, ForceCanvas};
use crate::components::controls::{ArchPanel, GroundPanel, LoadsPanel, RoadwayPanel, SectionsPanel};
use crate::components::readout::MemberReadout;
use crate::components::results::ResultsPanel;
use crate::components::scenarios::ScenarioButtons;
use crate::components::toolbar::Toolbar;
use crate::components::traffic::TrafficPanel;
use crate::permalink_sync;
use crate::state::AppState;
use leptos::prelude::*;

/// The whole app.
#[component]
pub fn App() -> impl IntoView {
    let opening = permalink_sync::initial_design();
    let state = AppState::new(opening.design);
    state.notice.set(opening.notice);
    provide_context(state);
    let options = crate::options::OptionsState::install(opening.shared);
    provide_context(options);
    permalink_sync::install(state, options, opening.view);
    crate::settled::install(state);
    crate::components::envelope::install(state);
    // canvases follow the window size
    let handle =
        window_event_listener(leptos::ev::resize, move |_| state.resized.update(|n| *n = n.wrapping_add(1)));
    on_cleanup(move || handle.remove());
    let name = move || state.settled_design.with(|d| d.name.clone());
    view! {
        <header class="top">
            <h1 class="brand">"Springline"</h1>
            <div class="design-name" id="design-name">{name}</div>
            <Toolbar />
            <crate::components::shortcuts::ShortcutList />
            <crate::components::shortcuts::ProjectorToggle />
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
            <section class="drawings" aria-label="Drawings">
                <ScenarioButtons />
                <div class="canvas-row">
                    <ElevationCanvas />
                    <ForceCanvas />
                </div>
                <crate::components::status::StatusLine />
                <MemberReadout />
                <crate::components::envelope::EnvelopePanel />
                <crate::components::sizing::SizingPanel />
                <crate::components::influence_chart::InfluenceChart />
                <crate::components::options::OptionsPanel />
                <crate::components::sweep::SweepPanel />
                <crate::components::exports::FilesPanel />
            </section>
            <DesignInputs />
            <ResultsPanel />
        </main>
        <crate::components::print_sheet::PrintSheet />
    }
}

/// The design input panels. In a narrow window they fold away behind the "Design
/// inputs" button (closed at first, so the drawings lead); in a wide one the button is
/// hidden and the panels always show (`web/style.css`).
#[component]
fn DesignInputs() -> impl IntoView {
    let open = RwSignal::new(false);
    view! {
        <aside class="controls" class:open=move || open.get() aria-labelledby="inputs-title">
            <h2 class="inputs-title" id="inputs-title">
                <button
                    type="button"
                    id="inputs-toggle"
                    aria-expanded=move || open.get().to_string()
                    aria-controls="inputs-body"
                    on:click=move |_| open.update(|o| *o = !*o)
                >
                    <span class="fold-mark" aria-hidden="true">{move || if open.get() { "▾" } else { "▸" }}</span>
                    "Design inputs"
                </button>
                <span class="inputs-label">"Design inputs"</span>
            </h2>
            <div class="inputs-body" id="inputs-body">
                <GroundPanel />
                <RoadwayPanel />
                <ArchPanel />
                <crate::components::seek::SeekPanel />
                <LoadsPanel />
                <TrafficPanel />
                <crate::components::actions::ActionsPanel />
                <SectionsPanel />
                <crate::components::massing::MassingPanel />
            </div>
        </aside>
    }
}
