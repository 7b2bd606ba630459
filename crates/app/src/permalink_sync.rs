//! Keeps the URL fragment and the open design in step, and remembers the units.
//!
//! The design is read from the link on load and when a link is pasted (hashchange); the
//! fragment follows the design after a short pause, replacing the history entry so the
//! back button is not flooded. After the design payload the fragment carries a view
//! part (`#s2.xxxx~view:c=half-left;u=us`, `link::permalink::split_view`): the load case
//! shown, by its stable id, and the units. The view part is left out when it says nothing
//! new (dead-load case, SI units), so a default link is exactly the design link readers
//! from before the view part read. The unit choice the user makes (the units button) is
//! kept in the browser's storage, so a reload or a plain address opens in the units last
//! chosen; units that only arrive with a link are shown but not stored, so opening a
//! colleague's US link does not change one's own default.

use crate::format::Units;
use crate::options::OptionsState;
use crate::state::{AppState, ModeView};
use leptos::prelude::*;
use springline_statics::arch::actions::action_cases;
use springline_statics::arch::cases::{find_case, CaseKind, Pattern};
use springline_statics::link::comparison::{decode_comparison, is_comparison_link, Comparison};
use springline_statics::link::permalink::{self, split_view, with_view, ViewState};
use springline_statics::{analyze, Design};
use std::time::Duration;

/// Pause before the address bar follows an edit.
const URL_DEBOUNCE: Duration = Duration::from_millis(300);
/// The browser storage key of the unit choice (`si` or `us`).
const UNITS_KEY: &str = "springline.units";

/// What the page opens with: the link's design (or the demo with a notice when the link
/// is bad), what the link says about the view (kept even when its design part is bad:
/// the view part is read on its own), and the comparison a meeting link carries.
pub struct Opening {
    /// The design to open.
    pub design: Design,
    /// Why the link could not be opened, if it could not.
    pub notice: Option<String>,
    /// The link's view part.
    pub view: ViewState,
    /// The comparison of a meeting link (`o1.`), its open option being `design`.
    pub shared: Option<Comparison>,
}

/// Reads the address bar's fragment: a design link, a comparison link, or nothing.
pub fn initial_design() -> Opening {
    let hash = web_sys::window().and_then(|w| w.location().hash().ok()).unwrap_or_default();
    let (design_part, view) = split_view(&hash);
    let demo = |notice: Option<String>, view: ViewState| Opening {
        design: Design::demo(),
        notice,
        view,
        shared: None,
    };
    if design_part.trim_start_matches('#').is_empty() {
        return demo(None, view);
    }
    match open_link(design_part, |d| analyze(d).map(|_| ())) {
        Ok((design, shared)) => Opening { design, notice: None, view, shared },
        Err(e) => {
            demo(Some(format!("This link could not be opened ({e}). Showing the demo design instead.")), view)
        }
    }
}

/// Opens a design or comparison link: the design to show and, for a comparison, the
/// comparison. `check` must pass for the design shown (a link must hold a design that
/// analyses, not only one that validates).
fn open_link(
    link: &str,
    check: impl Fn(&Design) -> Result<(), springline_statics::StaticsError>,
) -> Result<(Design, Option<Comparison>), String> {
    let (design, shared) = if is_comparison_link(link) {
        let comparison = decode_comparison(link).map_err(|e| e.to_string())?;
        // the reader checks the open option is one of them
        let open = comparison.options.get(comparison.open).ok_or("it opens an option it does not hold")?;
        (open.design.clone(), Some(comparison))
    } else {
        (permalink::decode(link).map_err(|e| e.to_string())?, None)
    };
    check(&design).map_err(|e| format!("its design cannot be analysed: {e}"))?;
    Ok((design, shared))
}

/// The unit choice kept in the browser's storage; `None` when there is none or storage
/// is unavailable (private modes, blocked storage): the page then opens in SI.
fn stored_units() -> Option<Units> {
    let storage = web_sys::window()?.local_storage().ok()??;
    Units::from_key(&storage.get_item(UNITS_KEY).ok()??)
}

/// Keeps the unit choice in storage; silently does nothing when storage is unavailable.
fn store_units(units: Units) {
    if let Some(Ok(Some(storage))) = web_sys::window().map(|w| w.local_storage()) {
        let _ = storage.set_item(UNITS_KEY, units.key());
    }
}

/// Shows the case with link id `id` (or its family: a heavier panel at another panel
/// point) if the analysis has one; otherwise the choice stays.
fn show_case(state: AppState, id: &str) {
    let found = state.analysis.with_untracked(|a| {
        a.as_ref().ok().and_then(|a| find_case(a.load_cases.iter().map(|c| &c.description), id))
    });
    if let Some(index) = found {
        if state.case.get_untracked() != index {
            state.case.set(index);
        }
    }
}

/// Chooses, from its link id, a case the analysis only carries once chosen in the load
/// picker: one of the other actions (`temperature-rise`, ..., `erection`), a traffic
/// pattern (`full`, `half-right`, `quarter-N`), the vehicle (`vehicle-X`, its leading
/// axle at x = X m) or a mode drawn over the elevation (`buckling`, `vibration`). Anything else leaves the choice as it is.
fn choose_extra(state: AppState, id: &str) {
    let design = state.design.get_untracked();
    if let Some((view, _)) = MODE_IDS.iter().find(|(_, m)| *m == id) {
        state.choose_mode(*view);
    } else if action_cases(&design).iter().any(|c| c.kind.id() == id) {
        state.choose_case(0);
        state.action.set(Some(id.to_string()));
    } else if let Some(x) = id.strip_prefix("vehicle-").and_then(|x| x.parse::<f64>().ok()) {
        state.choose_vehicle();
        state.move_vehicle(x);
    } else if let Ok(pattern) = Pattern::parse(id) {
        if !matches!(pattern, Pattern::HeavyPanel(_) | Pattern::Vehicle(_)) {
            state.choose_case(0);
            state.pattern.set(Some(pattern));
        }
    }
}

/// Applies what a link says about the view (units, load case); what it does not say
/// stays as it is. Units set here are marked in `from_link`, so they are not stored as
/// the user's choice.
fn apply_view(state: AppState, view: &ViewState, from_link: StoredValue<Option<Units>>) {
    if let Some(units) = view.units {
        if state.units.get_untracked() != units {
            from_link.set_value(Some(units));
            state.units.set(units);
        }
    }
    if let Some(id) = &view.case {
        // a case only a choice in the load picker adds (an action, a pattern, the
        // vehicle) is chosen; one the analysis has is shown
        let known = state.analysis.with_untracked(|a| {
            a.as_ref().ok().and_then(|a| find_case(a.load_cases.iter().map(|c| &c.description), id)).is_some()
        });
        if known {
            show_case(state, id);
        } else {
            choose_extra(state, id);
        }
    }
}

/// Installs the two-way sync; `view` is what the opening link said about the view.
pub fn install(state: AppState, options: OptionsState, view: ViewState) {
    // units: the link's, else the stored choice, else SI. A change the user makes is
    // stored; units a link brought are not (the effect skips the change `from_link` marks)
    let from_link = StoredValue::new(view.units);
    if let Some(units) = view.units.or_else(stored_units) {
        state.units.set(units);
    }
    apply_view(state, &view, from_link);
    Effect::new(move |_| {
        let units = state.units.get();
        if from_link.get_value() == Some(units) {
            from_link.set_value(None);
        } else {
            store_units(units);
        }
    });
    // the case shown follows its id when the design changes (a new panel count moves the
    // heavier panel: the same kind of case stays shown)
    let shown_id = StoredValue::new(case_id(state));
    Effect::new(move |_| {
        state.case.track();
        shown_id.set_value(case_id(state));
    });
    Effect::new(move |_| {
        state.analysis.track();
        if let Some(id) = shown_id.get_value() {
            show_case(state, &id);
        }
    });
    // design and view -> fragment, debounced
    let generation = StoredValue::new(0u64);
    Effect::new(move |_| {
        state.settled_design.track();
        options.shared.track();
        state.case.track();
        state.units.track();
        state.mode_view.track();
        generation.update_value(|g| *g += 1);
        let mine = generation.get_value();
        set_timeout(
            move || {
                if generation.get_value() != mine {
                    return;
                }
                // encoded once the edits pause, not on every pointer move of a drag
                let fragment = current_fragment(state, options);
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
    // pasted link -> design (one undo step) and view; a bad link leaves the open design
    let handle = window_event_listener(leptos::ev::hashchange, move |_| {
        let hash = web_sys::window().and_then(|w| w.location().hash().ok()).unwrap_or_default();
        let current = current_fragment(state, options);
        if hash == current {
            return;
        }
        let (design_part, view) = split_view(&hash);
        if design_part == design_fragment(state, options) {
            apply_view(state, &view, from_link);
            return;
        }
        match open_link(design_part, |d| state.check(d)) {
            Ok((d, shared)) => {
                state.notice.set(None);
                if shared.is_some() {
                    options.shared.set(shared);
                }
                state.commit(d);
                apply_view(state, &view, from_link);
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

/// The link ids of the mode views (`choose_extra` reads them back).
const MODE_IDS: [(ModeView, &str); 2] = [(ModeView::Buckled, "buckling"), (ModeView::Vibration, "vibration")];

/// The stable id of the case shown (or of the mode drawn), if the design analyses.
fn case_id(state: AppState) -> Option<String> {
    let mode = state.mode_view.get_untracked();
    if let Some((_, id)) = MODE_IDS.iter().find(|(v, _)| *v == mode) {
        return Some((*id).to_string());
    }
    let index = state.case.get_untracked();
    state.analysis.with_untracked(|a| a.as_ref().ok()?.load_cases.get(index).map(|c| c.description.id()))
}

/// The fragment of the open design alone (`#s2.xxxx`).
fn design_fragment(state: AppState, options: OptionsState) -> String {
    state.design.with_untracked(|d| {
        // a comparison from a link stays in the address bar while one of its options is open
        let shared = options
            .shared
            .with_untracked(|s| s.as_ref().is_some_and(|c| c.options.iter().any(|o| o.design == *d)));
        match shared.then(|| options.comparison_payload(d)).flatten() {
            Some(payload) => format!("#{payload}"),
            None => format!("#{}", permalink::encode(d)),
        }
    })
}

/// What the fragment's view part says: the case shown and the units, each left out
/// when it is the default (dead-load case, SI units), so a default link carries no view
/// part at all and reads as before the view part existed.
fn view_of(state: AppState) -> ViewState {
    let case = case_id(state).filter(|id| id != &CaseKind::Dead.id());
    let units = Some(state.units.get_untracked()).filter(|u| *u != Units::Si);
    ViewState { case, units }
}

/// The URL fragment of the open design (or of the comparison from a link holding it) with
/// the view part.
fn current_fragment(state: AppState, options: OptionsState) -> String {
    with_view(&design_fragment(state, options), &view_of(state))
}

/// The whole link of the design on screen alone (never a comparison): this page's
/// address with the design encoded now, not the address bar's fragment, which follows an
/// edit only after a pause.
pub fn link_to_open_design(state: AppState) -> Option<String> {
    let href = web_sys::window()?.location().href().ok()?;
    let page = href.split('#').next().unwrap_or_default();
    let design = state.design.with_untracked(|d| format!("#{}", permalink::encode(d)));
    Some(format!("{page}{}", with_view(&design, &view_of(state))))
}

/// The whole meeting link: this page's address with the comparison of the options shown,
/// opening the design on screen when it is one of them (else the first).
pub fn link_to_comparison(state: AppState, options: OptionsState) -> Option<String> {
    let href = web_sys::window()?.location().href().ok()?;
    let page = href.split('#').next().unwrap_or_default();
    let payload = state.design.with_untracked(|d| options.comparison_payload(d))?;
    Some(format!("{page}#{payload}"))
}
