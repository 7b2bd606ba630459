//! The other actions: their inputs (the Actions panel: temperature preset and values,
//! springing movement, deflection limit) and what each does alone (the Actions block of
//! the results: braking with its rule, every action's springing forces and largest
//! member forces, erection, the live-load deflection check). Every edit goes through
//! `AppState::try_edit`.

use crate::components::controls::{FieldProblems, NumberField};
use crate::format::{Quantity, Units};
use crate::state::{AppState, TrafficOutcome};
use leptos::prelude::*;
use springline_statics::arch::actions::{
    ActionResult, ActionsReport, Braking, Temperature, TemperaturePreset,
};
use springline_statics::arch::design::{Design, RibSystem};
use springline_statics::error::Field;
use std::sync::Arc;

/// The words of a temperature preset.
pub fn preset_words(preset: TemperaturePreset) -> &'static str {
    match preset {
        TemperaturePreset::EnSteel => "EN 1991-1-5, steel deck",
        TemperaturePreset::AashtoModerateSteel => "AASHTO LRFD 3.12.2, steel, moderate climate",
        TemperaturePreset::AashtoColdSteel => "AASHTO LRFD 3.12.2, steel, cold climate",
    }
}

/// The preset whose values the design's temperature still holds, if any.
pub fn preset_of(t: &Temperature) -> Option<TemperaturePreset> {
    TemperaturePreset::ALL.into_iter().find(|p| Temperature::preset(*p) == *t)
}

/// Marks a temperature as the user's own once a value is edited: the clause says which
/// preset it started from.
fn edited(t: &mut Temperature) {
    if TemperaturePreset::ALL.iter().any(|p| Temperature::preset(*p).clause == t.clause) {
        t.clause = format!("own values, edited from: {}", t.clause);
    }
}

/// One number of the actions, shown in `quantity` with `scale` (SI value x scale) and
/// committed through `try_edit` on `field`.
#[allow(clippy::too_many_arguments)]
fn action_field(
    label: &'static str,
    id: &'static str,
    field: Field,
    quantity: Quantity,
    scale: f64,
    get: fn(&Design) -> f64,
    set: fn(&mut Design, f64),
    range: (f64, f64),
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let value = state.design_number(move |d| get(d) * scale);
    let on_commit = Callback::new(move |v: f64| state.try_edit(field, |d| set(d, v / scale)));
    view! { <NumberField label id field quantity value on_commit min=range.0 max=range.1 shared_field=true /> }
}

/// The Actions panel: temperature, springing movement, deflection limit.
#[component]
pub fn ActionsPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let chosen = move || {
        state
            .settled_design
            .with(|d| preset_of(&d.actions.temperature).map_or("own".to_string(), |p| p.key().to_string()))
    };
    let on_preset = move |ev: leptos::ev::Event| {
        let key = event_target_value(&ev);
        if let Some(preset) = TemperaturePreset::from_key(&key) {
            let _ =
                state.try_edit(Field::Temperature, |d| d.actions.temperature = Temperature::preset(preset));
        }
    };
    let options = TemperaturePreset::ALL
        .into_iter()
        .map(|p| view! { <option value=p.key() selected=move || chosen() == p.key()>{preset_words(p)}</option> })
        .collect_view();
    let clause = move || state.settled_design.with(|d| d.actions.temperature.clause.clone());
    view! {
        <details class="panel" id="actions-panel">
            <summary><h3>"Temperature and other actions"</h3></summary>
            <label class="field" for="temperature-preset">
                <span class="label">"Temperature preset"</span>
                <select id="temperature-preset" on:change=on_preset>
                    {options}
                    <option value="own" selected=move || chosen() == "own" disabled=true>"Own values"</option>
                </select>
            </label>
            <p class="hint" id="temperature-clause">{clause}</p>
            <p class="hint">"The temperatures stay as they are when the load model changes: choose the preset for the site here."</p>
            {action_field("Uniform rise (K)", "temperature-rise", Field::Temperature, Quantity::Count, 1.0,
                |d| d.actions.temperature.expansion,
                |d, v| { d.actions.temperature.expansion = v; edited(&mut d.actions.temperature) }, (0.0, 200.0))}
            {action_field("Uniform fall (K)", "temperature-fall", Field::Temperature, Quantity::Count, 1.0,
                |d| d.actions.temperature.contraction,
                |d, v| { d.actions.temperature.contraction = v; edited(&mut d.actions.temperature) }, (0.0, 200.0))}
            {action_field("Deck warmer or cooler than rib (K)", "temperature-difference", Field::Temperature, Quantity::Count, 1.0,
                |d| d.actions.temperature.deck_rib_difference,
                |d, v| { d.actions.temperature.deck_rib_difference = v; edited(&mut d.actions.temperature) }, (0.0, 200.0))}
            {action_field("Thermal coefficient (10⁻⁶/K)", "temperature-alpha", Field::Temperature, Quantity::Count, 1e6,
                |d| d.actions.temperature.alpha,
                |d, v| { d.actions.temperature.alpha = v; edited(&mut d.actions.temperature) }, (0.0, 100.0))}
            <FieldProblems field=Field::Temperature id="temperature-problems" />
            {action_field("Springing spread", "springing-spread", Field::SpringingMovement, Quantity::SectionDepth, 1.0,
                |d| d.actions.springing.spread, |d, v| d.actions.springing.spread = v, (-1.0, 1.0))}
            {action_field("Left springing settles", "settlement-left", Field::SpringingMovement, Quantity::SectionDepth, 1.0,
                |d| d.actions.springing.settlement_left, |d, v| d.actions.springing.settlement_left = v, (-1.0, 1.0))}
            {action_field("Right springing settles", "settlement-right", Field::SpringingMovement, Quantity::SectionDepth, 1.0,
                |d| d.actions.springing.settlement_right, |d, v| d.actions.springing.settlement_right = v, (-1.0, 1.0))}
            <FieldProblems field=Field::SpringingMovement id="springing-problems" />
            {action_field("Deflection limit: span /", "deflection-limit", Field::DeflectionLimit, Quantity::Count, 1.0,
                |d| d.actions.deflection_limit, |d, v| d.actions.deflection_limit = v, (1.0, 100_000.0))}
            <FieldProblems field=Field::DeflectionLimit id="deflection-problems" />
            <p class="hint">"Braking follows from the load model and the deck length (see the results)."</p>
        </details>
    }
}

/// One row of the actions table: the case's title and its numbers (SI).
#[derive(Debug, Clone, PartialEq)]
pub struct ActionRow {
    /// The case's title.
    pub title: String,
    /// The case's link id (row ids in the page).
    pub id: String,
    /// Left and right thrust, kN.
    pub thrust: (f64, f64),
    /// Left and right springing moments, kNm (fixed rib).
    pub moment: (f64, f64),
    /// Largest rib moment, kNm.
    pub rib_moment: f64,
    /// Largest compression, kN (<= 0).
    pub compression: f64,
}

/// The rows of the actions table, one per action case of the report.
pub fn action_rows(report: &ActionsReport) -> Vec<ActionRow> {
    report
        .cases
        .iter()
        .map(|c: &ActionResult| ActionRow {
            title: c.kind.title(),
            id: c.kind.id(),
            thrust: (c.left.thrust, c.right.thrust),
            moment: (c.left.moment, c.right.moment),
            rib_moment: c.rib_moment,
            compression: c.max_compression,
        })
        .collect()
}

/// The value cells of a row: each cell's id, quantity and SI value, in column order
/// (the springing moments only for a fixed rib).
fn row_cells(row: &ActionRow, fixed: bool) -> Vec<(String, Quantity, f64)> {
    let id = &row.id;
    let mut cells = vec![
        (format!("action-{id}-h-left"), Quantity::Force, row.thrust.0),
        (format!("action-{id}-h-right"), Quantity::Force, row.thrust.1),
    ];
    if fixed {
        cells.push((format!("action-{id}-m-left"), Quantity::Moment, row.moment.0));
        cells.push((format!("action-{id}-m-right"), Quantity::Moment, row.moment.1));
    }
    cells.push((format!("action-{id}-rib-m"), Quantity::Moment, row.rib_moment));
    cells.push((format!("action-{id}-compression"), Quantity::Force, row.compression));
    cells
}

/// A cell's text and `data-value`: the number in `units` (a round-off below 1e-6 shows
/// as 0), its SI value.
fn cell_texts(units: Units, quantity: Quantity, si: f64) -> (String, String) {
    (units.show(quantity, if si.abs() < 1e-6 { 0.0 } else { si }), si.to_string())
}

/// The braking line: the force, its clause and its working.
fn braking_text(units: Units, braking: &Braking) -> String {
    format!(
        "Braking: {} ({}). {}",
        units.show(Quantity::Force, braking.force),
        braking.clause,
        braking.working
    )
}

/// The Actions block of the results panel.
#[component]
pub fn ActionsResults() -> impl IntoView {
    let state = expect_context::<AppState>();
    // the actions depend on the design alone: a vehicle move or another case shown does
    // not rebuild the block
    let report =
        Memo::new(move |_| state.settled_analysis.with(|a| a.as_ref().ok().map(|a| a.actions.clone())));
    // what the table's elements depend on: whether the moments have columns and which rows
    // there are; an edit that only changes the numbers keeps the elements, and one effect
    // below writes the numbers that changed (rebuilding the table set every cell's
    // attributes again, some 200 of them an edit)
    let fixed = state.design_value(|d| d.rib_system == RibSystem::Fixed);
    let shape = Memo::new(move |_| {
        report.with(|r| {
            r.as_ref().map(|r| action_rows(r).into_iter().map(|row| (row.id, row.title)).collect::<Vec<_>>())
        })
    });
    let body = move || {
        let units = state.units.get();
        let fixed = fixed.get();
        shape.track();
        // the numbers as they are now; later ones come from the effect below
        let numbers = report.with_untracked(|r| {
            r.as_ref().map(|r| (action_rows(r), braking_text(units, &r.braking), r.braking.force))
        });
        let Some((rows, braking_line, braking_force)) = numbers else {
            return view! { <p class="hint">"No results for actions while the design is refused."</p> }
                .into_any();
        };
        let rows = rows
            .into_iter()
            .map(|row| {
                let cells = row_cells(&row, fixed)
                    .into_iter()
                    .map(|(id, q, si)| {
                        let (shown, data) = cell_texts(units, q, si);
                        view! { <td class="num" id=id data-value=data>{shown}</td> }
                    })
                    .collect_view();
                view! {
                    <tr id=format!("action-{}", row.id)>
                        <th scope="row">{row.title}</th>
                        {cells}
                    </tr>
                }
            })
            .collect_view();
        let moment_heads =
            fixed.then(|| view! { <th scope="col">"M left"</th><th scope="col">"M right"</th> });
        view! {
            <p class="hint" id="actions-braking" data-value=braking_force.to_string()>{braking_line}</p>
            <div class="table-scroll">
            <table class="results actions" id="actions-table">
                <thead><tr>
                    <th scope="col">"Action, alone"</th>
                    <th scope="col">"H left"</th><th scope="col">"H right"</th>
                    {moment_heads}
                    <th scope="col">"Largest rib moment"</th><th scope="col">"Largest compression"</th>
                </tr></thead>
                <tbody>{rows}</tbody>
            </table>
            </div>
            <p class="hint">"Whole cross-section. Temperature, movement and braking in the frame model; erection \
                in the bare rib, a stage of its own, not combined with traffic. The envelopes of the Traffic \
                block combine the other actions with the factors of each combination."</p>
        }
        .into_any()
    };
    // the numbers of a report whose table keeps its elements: each cell's text and
    // data-value set when they differ from what this effect wrote last (a rebuilt table
    // holds the numbers it was built with, so writing them again is harmless)
    // (it reads the report alone, not `shape` too: a memo read beside the memo it derives
    // from can hide the change from the effect when the derived one stays the same)
    Effect::new(move |written: Option<Vec<(String, String, String)>>| {
        let units = state.units.get();
        let fixed = fixed.get();
        let Some(document) = web_sys::window().and_then(|w| w.document()) else { return Vec::new() };
        report.with(|r| {
            let Some(r) = r else { return Vec::new() };
            let mut now: Vec<(String, String, String)> = action_rows(r)
                .iter()
                .flat_map(|row| row_cells(row, fixed))
                .map(|(id, q, si)| {
                    let (shown, data) = cell_texts(units, q, si);
                    (id, shown, data)
                })
                .collect();
            now.push((
                "actions-braking".into(),
                braking_text(units, &r.braking),
                r.braking.force.to_string(),
            ));
            for (k, (id, shown, data)) in now.iter().enumerate() {
                let before = written.as_ref().and_then(|w| w.get(k)).filter(|w| w.0 == *id);
                let text_changed = before.is_none_or(|b| b.1 != *shown);
                let data_changed = before.is_none_or(|b| b.2 != *data);
                if !(text_changed || data_changed) {
                    continue;
                }
                let Some(el) = document.get_element_by_id(id) else { continue };
                if text_changed {
                    crate::dom::write_text(&el, shown);
                }
                if data_changed {
                    let _ = el.set_attribute("data-value", data);
                }
            }
            now
        })
    });
    let deflection = move || {
        let units = state.units.get();
        // the report of the design the panels show only (an older one waits for its own)
        let current = |t: &&Arc<(Design, TrafficOutcome)>| state.settled_design.with(|d| *d == t.0);
        state.traffic.with(|t| match t.as_ref().filter(current).map(|t| &t.1) {
            Some(Ok(Some(report))) => report.deflection.as_ref().map(|d| {
                let verdict = if d.within { "within" } else { "beyond" };
                let text = format!(
                    "Live-load deflection: largest {} at x = {}, {verdict} span / {} = {}.",
                    units.show(Quantity::SectionDepth, d.worst),
                    units.show(Quantity::Length, d.at),
                    d.ratio,
                    units.show(Quantity::SectionDepth, d.allowed)
                );
                view! { <p id="deflection-check" class:beyond=!d.within data-value=d.worst.to_string()>{text}</p> }
            }),
            _ => None,
        })
    };
    view! {
        <section class="actions-results" id="actions-results" aria-labelledby="actions-title">
            <h3 id="actions-title">"Other actions"</h3>
            {body}
            {deflection}
        </section>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use springline_statics::arch::actions::action_results;
    use springline_statics::ValidDesign;

    /// The rows are the engine's action report, one per case, titles in words.
    #[test]
    fn rows_are_the_engines_action_cases() {
        let d = Design::demo();
        let r = action_results(&ValidDesign::new(&d).expect("valid")).expect("solves");
        let rows = action_rows(&r);
        assert_eq!(rows.len(), r.cases.len());
        let titles: Vec<&str> = rows.iter().map(|r| r.title.as_str()).collect();
        assert_eq!(
            titles,
            [
                "Temperature rise",
                "Temperature fall",
                "Deck warmer",
                "Deck cooler",
                "Springing movement",
                "Braking",
                "Erection"
            ]
        );
        assert_eq!(rows[6].thrust.0, r.cases[6].left.thrust);
    }

    /// A value edited by hand makes the temperature the user's own: the clause says so
    /// and no preset is shown as chosen.
    #[test]
    fn an_edit_makes_the_temperature_the_users_own() {
        let mut t = Temperature::preset(TemperaturePreset::EnSteel);
        assert_eq!(preset_of(&t), Some(TemperaturePreset::EnSteel));
        t.expansion = 30.0;
        edited(&mut t);
        assert!(t.clause.starts_with("own values, edited from: EN 1991-1-5"), "{}", t.clause);
        assert_eq!(preset_of(&t), None);
        let once = t.clause.clone();
        edited(&mut t);
        assert_eq!(t.clause, once, "marked once");
    }
}
