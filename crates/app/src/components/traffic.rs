//! The Traffic panel: carriageway width, rib positions across the deck, the load model
//! (a family's preset with its combinations), the model's own values (folded away) and,
//! read-only, what the chosen model puts on the deck. Every edit goes through `AppState::try_edit`, so a refusal stays beside
//! the field with the last good design on screen, and undo covers it.

use crate::components::controls::{design_field, input_text, FieldProblems, NumberField};
use crate::format::{Quantity, Units};
use crate::state::{parse_number, AppState};
use leptos::prelude::*;
use springline_statics::error::Field;
use springline_statics::traffic::models::ModelFamily;
use springline_statics::traffic::TrafficDesign;

/// What the rib positions box shows for "no positions given".
const EVENLY_SPACED: &str = "evenly spaced";

/// The words the load model menu uses for a family.
pub fn family_words(family: ModelFamily) -> &'static str {
    match family {
        ModelFamily::EnLm1 => "EN 1991-2 Load Model 1",
        ModelFamily::Hl93 => "AASHTO LRFD HL-93",
        ModelFamily::Crowd => "Footbridge crowd (EN 1991-2 5.3.2.1)",
        ModelFamily::UserDefined => "Your own load",
    }
}

/// The rib positions (m from the deck centreline, SI) as the box shows them in `units`:
/// comma-separated, empty when none are given (the box's placeholder says "evenly
/// spaced").
pub fn positions_text(units: Units, positions: &[f64]) -> String {
    positions.iter().map(|&y| input_text(units, Quantity::Length, y, false)).collect::<Vec<_>>().join(", ")
}

/// Reads the rib positions typed in `units`: values separated by commas, or by
/// semicolons when the values use decimal commas; an empty box or "evenly spaced" gives
/// no positions (ribs evenly spaced). Returns SI metres in the order typed (the engine
/// checks count, order and that every rib stands under the deck), or what is wrong
/// with the text.
pub fn parse_positions(text: &str, units: Units) -> Result<Vec<f64>, String> {
    let text = text.trim();
    if text.is_empty() || text.eq_ignore_ascii_case(EVENLY_SPACED) {
        return Ok(Vec::new());
    }
    // the page writes negatives with a minus sign; accept it back
    let text = text.replace('\u{2212}', "-");
    let separator = if text.contains(';') { ';' } else { ',' };
    text.split(separator)
        .enumerate()
        .map(|(i, part)| {
            if part.trim().is_empty() {
                return Err(format!(
                    "position {} is empty: separate the values with commas, for example -2.75, 2.75",
                    i + 1
                ));
            }
            parse_number(part)
                .map(|v| units.to_si(Quantity::Length, v))
                .map_err(|e| format!("{e}: separate the values with commas, for example -2.75, 2.75"))
        })
        .collect()
}

/// Traffic: carriageway, rib positions, load model and what the model puts on the deck.
#[component]
pub fn TrafficPanel() -> impl IntoView {
    view! {
        <details class="panel" id="traffic-panel" open>
            <summary><h3>"Traffic"</h3></summary>
            {design_field("Carriageway width", "carriageway-width", Field::CarriagewayWidth, Quantity::Length, |d| d.traffic.carriageway_width, |d, v| d.traffic.carriageway_width = v, (0.5, 60.0), false)}
            <RibPositionsField />
            <LoadModelField />
            <ModelValues />
            <ModelDescription />
        </details>
    }
}

/// The chosen model's own numbers (lane width, axle loads, UDLs, adjustment factors,
/// impact ...), each a field in the display units, folded away: a preset's values are
/// the published ones, and a national annex or an owner changes some of them.
#[component]
fn ModelValues() -> impl IntoView {
    let state = expect_context::<AppState>();
    // which numbers there are: changes with the family (or a vehicle's axle count), not
    // with every edit, so the fields are not rebuilt while a value is typed
    let slots = state.design_value(|d| {
        d.traffic.load_model.values().into_iter().map(|v| (v.key, v.label, v.quantity)).collect::<Vec<_>>()
    });
    let fields = move || {
        slots
            .get()
            .into_iter()
            .map(|(key, label, quantity)| {
                let id = format!("model-{}", key.replace(['[', ']', '.', '_'], "-").trim_end_matches('-'));
                let read = key.clone();
                let value = state.design_number(move |d| {
                    d.traffic.load_model.values().into_iter().find(|v| v.key == read).map_or(0.0, |v| v.value)
                });
                let on_commit = Callback::new(move |v: f64| {
                    state.try_edit(Field::LoadModel, |d| {
                        d.traffic.load_model.set_value(&key, v);
                    })
                });
                let mut label = label;
                if let Some(first) = label.get(..1) {
                    label = first.to_uppercase() + &label[1..];
                }
                view! {
                    <NumberField label id field=Field::LoadModel quantity value on_commit min=0.0 max=1e6 shared_field=true />
                }
            })
            .collect_view()
    };
    view! {
        <details class="model-values" id="model-values">
            <summary>"Model values"</summary>
            {fields}
        </details>
    }
}

/// The rib positions across the deck, as a list typed in the display units.
#[component]
fn RibPositionsField() -> impl IntoView {
    let state = expect_context::<AppState>();
    let field = Field::RibPositions;
    // what is wrong with the text typed here; the engine's refusals come from the state
    let input_error = RwSignal::new(None::<String>);
    let positions = state.design_value(|d| d.traffic.rib_positions.clone());
    let shown = move || positions.with(|p| positions_text(state.units.get(), p));
    let commit = move |text: String| match parse_positions(&text, state.units.get_untracked()) {
        Ok(positions) => {
            input_error.set(None);
            // a refusal is recorded in the state and shown beside every field it involves
            let _ = state.try_edit(field, |d| d.traffic.rib_positions = positions);
        }
        Err(e) => {
            state.clear_refusal();
            input_error.set(Some(e));
        }
    };
    // once this field's refusal is cleared (undo, another good edit) the box shows the
    // design's positions again instead of the refused text (as `NumberField` does)
    let input: NodeRef<leptos::html::Input> = NodeRef::new();
    Effect::new(move |was_refused_here: Option<bool>| {
        let refused_here = state.refused.with(|r| r.as_ref().is_some_and(|r| r.edited == field));
        if was_refused_here == Some(true) && !refused_here && input_error.with_untracked(Option::is_none) {
            if let Some(el) = input.get_untracked() {
                el.set_value(&untrack(shown));
            }
        }
        refused_here
    });
    let involved = move || {
        input_error.with(Option::is_some)
            || state.refused.with(|r| r.as_ref().is_some_and(|r| !r.messages_for(field).is_empty()))
    };
    let unit = move || state.units.get().label(Quantity::Length);
    view! {
        <div class="field wide" class:invalid=involved>
            <label for="rib-positions">"Rib positions"</label>
            <input
                node_ref=input
                id="rib-positions"
                type="text"
                placeholder=EVENLY_SPACED
                aria-describedby="rib-positions-error rib-positions-hint"
                prop:value=shown
                on:change=move |ev| commit(event_target_value(&ev))
            />
            <span class="unit">{unit}</span>
            <FieldProblems field id="rib-positions-error" local=input_error />
        </div>
        <p class="hint" id="rib-positions-hint">
            "From the deck centreline, left to right, separated by commas (semicolons with decimal commas); empty: evenly spaced."
        </p>
    }
}

/// The load model menu: choosing a family replaces the model and its combinations with
/// the family's presets and keeps the carriageway and the rib positions.
#[component]
fn LoadModelField() -> impl IntoView {
    let state = expect_context::<AppState>();
    let family = state.design_value(|d| d.traffic.load_model.family().key());
    let family = move || family.get();
    let choose = move |ev: leptos::ev::Event| {
        let Some(family) = ModelFamily::from_key(&event_target_value(&ev)) else { return };
        // a refusal is shown beside the menu (and every field it involves)
        let _ = state.try_edit(Field::LoadModel, |d| {
            let t = &d.traffic;
            let positions = t.rib_positions.clone();
            d.traffic = TrafficDesign {
                rib_positions: positions,
                ..TrafficDesign::preset(family, t.carriageway_width)
            };
        });
    };
    view! {
        <div class="field wide">
            <label for="load-model">"Load model"</label>
            <select id="load-model" on:change=choose prop:value=family aria-describedby="load-model-error">
                {ModelFamily::ALL
                    .into_iter()
                    .map(|f| view! { <option value=f.key()>{family_words(f)}</option> })
                    .collect_view()}
            </select>
            <FieldProblems field=Field::LoadModel id="load-model-error" />
        </div>
        <FieldProblems field=Field::Combinations id="combinations-error" />
    }
}

/// What the chosen model puts on the deck (its lanes, in the engine's words) and the
/// combinations it is checked with, each with the clause its factors follow.
#[component]
fn ModelDescription() -> impl IntoView {
    let state = expect_context::<AppState>();
    // the span the crowd's loaded length needs: the analysed design's
    let span = Memo::new(move |_| state.settled_analysis.with(|a| a.as_ref().ok().map(|a| a.summary.span)));
    let lanes = move || {
        let span = span.get()?;
        let units = state.units.get();
        Some(state.settled_design.with(|d| {
            d.traffic.load_model.lane_layout(d.traffic.carriageway_width, span).words.describe(units)
        }))
    };
    let combinations = state.design_value(|d| d.traffic.combinations.clone());
    let combinations = move || {
        combinations.with(|all| {
            all.iter()
                .map(|c| view! { <li><span class="combination-name">{c.name.clone()}</span>" — "{c.clause.clone()}</li> })
                .collect_view()
        })
    };
    view! {
        <div class="model-notes" id="load-model-notes">
            <p id="load-model-lanes">{lanes}</p>
            <p class="notes-title">"Combinations"</p>
            <ul id="load-model-combinations">{combinations}</ul>
        </div>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// 1 ft = 0.3048 m exactly (NIST SP 811, appendix B).
    const M_PER_FT: f64 = 0.3048;

    #[test]
    fn positions_read_commas_semicolons_and_the_minus_sign() {
        assert_eq!(parse_positions(" -2.75, 2.75 ", Units::Si), Ok(vec![-2.75, 2.75]));
        assert_eq!(parse_positions("\u{2212}2.75, 2.75", Units::Si), Ok(vec![-2.75, 2.75]));
        // decimal commas when semicolons separate
        assert_eq!(parse_positions("-2,5; 0; 2,5", Units::Si), Ok(vec![-2.5, 0.0, 2.5]));
        // empty and the placeholder's words: evenly spaced
        assert_eq!(parse_positions("  ", Units::Si), Ok(vec![]));
        assert_eq!(parse_positions("Evenly spaced", Units::Si), Ok(vec![]));
        // feet typed in US units come back in metres: 10 ft = 3.048 m
        let us = parse_positions("-10, 10", Units::UsCustomary).expect("numbers");
        assert!((us[0] + 10.0 * M_PER_FT).abs() < 1e-12 && (us[1] - 10.0 * M_PER_FT).abs() < 1e-12, "{us:?}");
    }

    #[test]
    fn bad_position_text_says_what_is_wrong() {
        let e = parse_positions("-2.75 2.75", Units::Si).expect_err("spaces do not separate");
        assert!(e.contains("'-2.75 2.75' is not a number") && e.contains("commas"), "{e}");
        let e = parse_positions("-2.75,,2.75", Units::Si).expect_err("an empty entry");
        assert!(e.starts_with("position 2 is empty"), "{e}");
        assert!(parse_positions("left, right", Units::Si).is_err());
    }

    #[test]
    fn positions_text_reads_back_as_the_same_positions() {
        let positions = [-2.75, 0.5, 2.75];
        for units in [Units::Si, Units::UsCustomary] {
            let text = positions_text(units, &positions);
            let back = parse_positions(&text, units).expect("its own text");
            for (a, b) in positions.iter().zip(&back) {
                assert!((a - b).abs() < 1e-3, "{units:?}: {text} -> {back:?}");
            }
        }
        assert_eq!(positions_text(Units::Si, &positions), "-2.75, 0.5, 2.75");
        assert_eq!(positions_text(Units::Si, &[]), "");
    }

    #[test]
    fn every_family_has_words_of_its_own() {
        let words: Vec<&str> = ModelFamily::ALL.into_iter().map(family_words).collect();
        assert_eq!(words.len(), 4);
        for (i, w) in words.iter().enumerate() {
            assert!(!words[i + 1..].contains(w), "{w} twice");
        }
    }
}
