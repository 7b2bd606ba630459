//! The "Deck, rates and ground" panel: the deck's cross-section (and which deck weight
//! the analysis counts), the unit rates of the cost index and the ground under the
//! thrust blocks (`arch::sizing::{DeckCrossSection, UnitRates, FoundationDesign}`).
//! Every edit goes through `AppState::try_edit`; the engine's refusals show under each
//! block's fields.

use crate::components::controls::{FieldProblems, NumberField};
use crate::format::Quantity;
use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::arch::sizing::DeckWeight;
use springline_statics::error::Field;
use springline_statics::Design;

/// One number of the panel, committed through `try_edit` on `field` (the block's
/// problems are shown once, under its fields). `range` only bounds the typed text; the
/// engine's checks give the real limits and their reasons.
fn massing_field(
    label: &'static str,
    id: &'static str,
    field: Field,
    quantity: Quantity,
    get: fn(&Design) -> f64,
    set: fn(&mut Design, f64),
    range: (f64, f64),
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let value = state.design_number(get);
    let on_commit = Callback::new(move |v: f64| state.try_edit(field, |d| set(d, v)));
    view! { <NumberField label id field quantity value on_commit min=range.0 max=range.1 shared_field=true /> }
}

/// The select value of a deck weight basis.
fn weight_key(weight: DeckWeight) -> &'static str {
    match weight {
        DeckWeight::TypedLoad => "typed",
        DeckWeight::CrossSection => "cross-section",
    }
}

/// The deck weight basis select and the words on what the analysis counts.
#[component]
fn DeckWeightChoice() -> impl IntoView {
    let state = expect_context::<AppState>();
    let chosen = state.design_value(|d| weight_key(d.sizing.deck_section.weight));
    let on_change = move |ev: leptos::ev::Event| {
        let weight = match event_target_value(&ev).as_str() {
            "cross-section" => DeckWeight::CrossSection,
            _ => DeckWeight::TypedLoad,
        };
        let _ = state.try_edit(Field::DeckCrossSection, |d| d.sizing.deck_section.weight = weight);
    };
    let options = [
        (DeckWeight::TypedLoad, "typed deck dead load"),
        (DeckWeight::CrossSection, "slab and cross-girders below"),
    ]
    .into_iter()
    .map(|(w, words)| {
        let value = weight_key(w);
        view! { <option value=value prop:selected=move || chosen.get() == value>{words}</option> }
    })
    .collect_view();
    let counted = move || {
        let units = state.units.get();
        state.settled_design.with(|d| {
            let load = units.show(Quantity::Pressure, d.deck_dead_load());
            match d.sizing.deck_section.weight {
                DeckWeight::TypedLoad => format!(
                    "The analysis counts the Loads panel's deck dead load, {load}; the slab and cross-girders count \
                     in the quantities only."
                ),
                DeckWeight::CrossSection => format!(
                    "The slab, the cross-girders and the other dead load replace the Loads panel's deck dead load: \
                     {load} in all."
                ),
            }
        })
    };
    view! {
        <div class="field wide">
            <label for="deck-weight">"Deck weight in the analysis"</label>
            <select id="deck-weight" on:change=on_change>{options}</select>
        </div>
        <p class="hint" id="deck-weight-counted">{counted}</p>
    }
}

/// The panel: deck cross-section, unit rates, ground.
#[component]
pub fn MassingPanel() -> impl IntoView {
    use Field::{DeckCrossSection as Deck, Foundation, UnitRates as Rates};
    use Quantity::{Area, Count, Length, Pressure, SectionDepth, UnitWeight};
    view! {
        <details class="panel" id="massing-panel">
            <summary><h3>"Deck, rates and ground"</h3></summary>
            <fieldset class="section-group">
                <legend>"Deck cross-section"</legend>
                <DeckWeightChoice />
                {massing_field("Slab thickness", "deck-slab-thickness", Deck, SectionDepth,
                    |d| d.sizing.deck_section.slab_thickness, |d, v| d.sizing.deck_section.slab_thickness = v, (0.0, 100.0))}
                {massing_field("Slab unit weight", "deck-slab-weight", Deck, UnitWeight,
                    |d| d.sizing.deck_section.slab_unit_weight, |d, v| d.sizing.deck_section.slab_unit_weight = v, (0.0, 1000.0))}
                {massing_field("Cross-girder spacing", "deck-girder-spacing", Deck, Length,
                    |d| d.sizing.deck_section.cross_girder_spacing, |d, v| d.sizing.deck_section.cross_girder_spacing = v, (0.0, 1000.0))}
                {massing_field("Cross-girder area", "deck-girder-area", Deck, Area,
                    |d| d.sizing.deck_section.cross_girder_area, |d, v| d.sizing.deck_section.cross_girder_area = v, (0.0, 100.0))}
                {massing_field("Cross-girder unit weight", "deck-girder-weight", Deck, UnitWeight,
                    |d| d.sizing.deck_section.cross_girder_unit_weight, |d, v| d.sizing.deck_section.cross_girder_unit_weight = v, (0.0, 1000.0))}
                {massing_field("Other dead load", "deck-other-load", Deck, Pressure,
                    |d| d.sizing.deck_section.other_dead_load, |d, v| d.sizing.deck_section.other_dead_load = v, (0.0, 1000.0))}
                <p class="hint">"Each cross-girder spans the deck width; the other dead load (parapets, services) counts only with the slab and cross-girders."</p>
                <div class="field"><FieldProblems field=Deck id="deck-section-error" /></div>
            </fieldset>
            <fieldset class="section-group">
                <legend>"Unit rates"</legend>
                <p class="hint">"In cost units of your choosing; only their ratios shape the cost index."</p>
                {massing_field("Steel, per tonne", "rate-steel", Rates, Count,
                    |d| d.sizing.rates.steel_per_t, |d, v| d.sizing.rates.steel_per_t = v, (0.0, 1e12))}
                {massing_field("Concrete, per m³", "rate-concrete", Rates, Count,
                    |d| d.sizing.rates.concrete_per_m3, |d, v| d.sizing.rates.concrete_per_m3 = v, (0.0, 1e12))}
                {massing_field("Glulam, per m³", "rate-glulam", Rates, Count,
                    |d| d.sizing.rates.glulam_per_m3, |d, v| d.sizing.rates.glulam_per_m3 = v, (0.0, 1e12))}
                {massing_field("Thrust blocks, per m³", "rate-foundation", Rates, Count,
                    |d| d.sizing.rates.foundation_per_m3, |d, v| d.sizing.rates.foundation_per_m3 = v, (0.0, 1e12))}
                <div class="field"><FieldProblems field=Rates id="rates-error" /></div>
            </fieldset>
            <fieldset class="section-group">
                <legend>"Ground"</legend>
                {massing_field("Allowable bearing pressure", "foundation-bearing", Foundation, Pressure,
                    |d| d.sizing.foundation.allowable_bearing, |d, v| d.sizing.foundation.allowable_bearing = v, (0.0, 1e7))}
                {massing_field("Least thrust-block thickness", "foundation-thickness", Foundation, Length,
                    |d| d.sizing.foundation.min_thickness, |d, v| d.sizing.foundation.min_thickness = v, (0.0, 1000.0))}
                <p class="hint">"The allowable bearing comes from the site's ground investigation; it is not a value to guess."</p>
                <div class="field"><FieldProblems field=Foundation id="foundation-error" /></div>
            </fieldset>
        </details>
    }
}
