//! The control panels: Ground, Roadway, Arch, Loads and Sections with each group's
//! sizing (Traffic is in `traffic.rs`; the deck cross-section, rates and ground in
//! `massing.rs`). Every field has a unit,
//! a valid range and its design field (`Field`); when the engine refuses an edit, each of
//! its problems is shown beside every field it involves (all of them beside the edited
//! field) and the last good design stays on screen.

use crate::format::{Quantity, Units};
use crate::state::{parse_number, AppState};
use leptos::prelude::*;
use springline_statics::arch::design::{
    Bracing, Crown, GroundPoint, RibSystem, Section, MAX_APPROACH_PIERS, MAX_PANELS, MAX_RIBS, MIN_PANELS,
};
use springline_statics::arch::form::Basis;
use springline_statics::arch::sizing::GroupSizing;
use springline_statics::error::{Field, GroupName, SectionProperty, StaticsError};
use springline_statics::sizing::materials::{material_preset, material_presets, Material};
use springline_statics::sizing::sections::Family;
use springline_statics::Design;

/// Fewest ribs the engine accepts (it refuses a deck on no ribs; `MAX_RIBS` is the most).
const MIN_RIBS: usize = 1;

/// The range of a count field, as the SI bounds a `NumberField` takes.
fn count_range(min: usize, max: usize) -> (f64, f64) {
    (min as f64, max as f64)
}

/// The problems of the last refused edit that involve `field` (every one beside the edited
/// field), one paragraph each, after the field's own input message (`local`: not a number,
/// out of range). Its element id is `id`; tests and `aria-describedby` use it.
#[component]
pub fn FieldProblems(
    /// The design field the element stands beside.
    field: Field,
    /// Element id.
    #[prop(into)]
    id: String,
    /// The field's own message about its input text, if any.
    #[prop(optional, into)]
    local: Option<Signal<Option<String>>>,
    /// Only the input message: the refused edit's problems are shown once elsewhere for
    /// every input of this design field (a ground point's x and y share one).
    #[prop(optional)]
    input_only: bool,
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let messages = Memo::new(move |_| {
        let mut shown: Vec<String> = local.and_then(|l| l.get()).into_iter().collect();
        if !input_only {
            state.refused.with(|r| {
                if let Some(r) = r {
                    shown.extend(r.messages_for(field));
                }
            });
        }
        shown
    });
    // the design's warnings (allowed but unusual: common-practice limits) that involve
    // this field, beside it, until the design changes; the validation's, so a move of the
    // vehicle (a new analysis of the same design) leaves them be
    let cautions = Memo::new(move |_| {
        if input_only {
            return Vec::new();
        }
        state
            .settled_warnings
            .with(|w| w.iter().filter(|w| w.involves(field)).map(|w| w.message.clone()).collect())
    });
    let caution_id = format!("{}-caution", id.strip_suffix("-error").unwrap_or(&id));
    view! {
        <div class="error" id=id role="alert">
            {move || messages.get().into_iter().map(|m| view! { <p>{m}</p> }).collect_view()}
        </div>
        <div class="advice" id=caution_id>
            {move || cautions.get().into_iter().map(|m| view! { <p>{m}</p> }).collect_view()}
        </div>
    }
}

/// Formats an SI value for an input box in the chosen units (no digit grouping).
pub(crate) fn input_text(units: Units, q: Quantity, si: f64, integer: bool) -> String {
    if integer {
        return format!("{}", si.round() as i64);
    }
    let v = units.to_shown(q, si);
    if v == 0.0 {
        return "0".into();
    }
    let mag = v.abs().log10().floor() as i32;
    if !(-3..6).contains(&mag) {
        return format!("{v:e}");
    }
    let decimals = (4 - mag).clamp(0, 6) as usize;
    let s = format!("{v:.decimals$}");
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// A number field bound to one value of the design.
#[component]
pub fn NumberField(
    /// Text before the field.
    #[prop(into)]
    label: String,
    /// Element id (for labels and tests).
    #[prop(into)]
    id: String,
    /// The design field it edits (its problems are shown beside it).
    field: Field,
    /// What kind of quantity it is (sets the unit).
    quantity: Quantity,
    /// The current SI value.
    #[prop(into)]
    value: Signal<f64>,
    /// Applies an SI value to the design through `AppState::try_edit` (which shows a
    /// refusal beside every field it involves); `Err` carries the engine's error.
    on_commit: Callback<f64, Result<(), StaticsError>>,
    /// Smallest allowed SI value.
    min: f64,
    /// Largest allowed SI value.
    max: f64,
    /// Whole numbers only.
    #[prop(optional)]
    integer: bool,
    /// Another input edits the same design field (a ground point's x and y): the refused
    /// edit's problems are shown once by the caller, not beside each input.
    #[prop(optional)]
    shared_field: bool,
    /// What the field is, in full, for assistive tools when the visible label is short
    /// ("Ground point 3, x" beside a visible "x").
    #[prop(optional, into)]
    spoken: Option<String>,
) -> impl IntoView {
    let state = expect_context::<AppState>();
    // what is wrong with the text typed here (not a number, out of range); the engine's
    // refusals come from the state, as they may involve other fields too
    let input_error = RwSignal::new(None::<String>);
    let error_id = format!("{id}-error");
    // the SI value of the typed text, or what is wrong with it
    let parse_input = move |text: &str| -> Result<f64, String> {
        let units = state.units.get_untracked();
        let shown = parse_number(text)?;
        if integer && shown.fract() != 0.0 {
            return Err("must be a whole number".into());
        }
        let si = if integer { shown } else { units.to_si(quantity, shown) };
        if si < min || si > max {
            let (lo, hi) = if integer {
                (format!("{min}"), format!("{max}"))
            } else {
                (units.show(quantity, min), units.show(quantity, max))
            };
            return Err(format!("must be between {lo} and {hi}"));
        }
        Ok(si)
    };
    let commit = move |text: String| match parse_input(&text) {
        Ok(si) => {
            input_error.set(None);
            // a refusal is recorded in the state and shown beside every field it involves
            let _ = on_commit.run(si);
        }
        Err(e) => {
            // this attempt replaces the last refused one: its messages would be stale
            state.clear_refusal();
            input_error.set(Some(e));
        }
    };
    let involved = move || {
        input_error.with(Option::is_some)
            || state.refused.with(|r| r.as_ref().is_some_and(|r| !r.messages_for(field).is_empty()))
    };
    let shown_value = move || input_text(state.units.get(), quantity, value.get(), integer);
    // When this field's refused edit is cleared (undo, redo, another good edit, a link),
    // its box shows the design's value again instead of the refused text: the value itself
    // did not change, so the binding below does not rewrite the box.
    let input: NodeRef<leptos::html::Input> = NodeRef::new();
    Effect::new(move |was_refused_here: Option<bool>| {
        let refused_here = state.refused.with(|r| r.as_ref().is_some_and(|r| r.edited == field));
        // a text that is not a number stays with its message until it is edited
        if was_refused_here == Some(true) && !refused_here && input_error.with_untracked(Option::is_none) {
            if let Some(el) = input.get_untracked() {
                el.set_value(&untrack(shown_value));
            }
        }
        refused_here
    });
    let unit = move || if integer { String::new() } else { state.units.get().label(quantity).to_string() };
    view! {
        <div class="field" class:invalid=involved>
            <label for=id.clone()>{label}</label>
            <input
                node_ref=input
                id=id.clone()
                type="text"
                inputmode="decimal"
                aria-label=spoken
                aria-describedby=error_id.clone()
                prop:value=shown_value
                on:change=move |ev| commit(event_target_value(&ev))
            />
            <span class="unit">{unit}</span>
            <FieldProblems field id=error_id local=input_error input_only=shared_field />
        </div>
    }
}

/// A field editing `get`/`set` of the design (design field `field`) through
/// `AppState::try_edit`.
// one call per row keeps each field's label, id, path, unit, accessors and range together
#[allow(clippy::too_many_arguments)]
pub(crate) fn design_field(
    label: &'static str,
    id: &'static str,
    field: Field,
    quantity: Quantity,
    get: fn(&Design) -> f64,
    set: fn(&mut Design, f64),
    range: (f64, f64),
    integer: bool,
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let value = state.design_number(get);
    let on_commit = Callback::new(move |v: f64| state.try_edit(field, |d| set(d, v)));
    view! { <NumberField label id field quantity value on_commit min=range.0 max=range.1 integer /> }
}

/// Ground: the valley section as a list of points, with invented presets.
#[component]
pub fn GroundPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let count = state.design_value(|d| d.valley.len());
    let rows = move || {
        (0..count.get())
            .map(|i| {
                let x = state.design_number(move |d| d.valley.get(i).map(|p| p.x).unwrap_or(0.0));
                let y = state.design_number(move |d| d.valley.get(i).map(|p| p.y).unwrap_or(0.0));
                let set_x = Callback::new(move |v: f64| {
                    state.try_edit(Field::ValleyPoint(i), |d| {
                        if let Some(p) = d.valley.get_mut(i) {
                            p.x = v;
                        }
                    })
                });
                let set_y = Callback::new(move |v: f64| {
                    state.try_edit(Field::ValleyPoint(i), |d| {
                        if let Some(p) = d.valley.get_mut(i) {
                            p.y = v;
                        }
                    })
                });
                // a refusal is shown beside the ground points (the valley as a whole)
                let remove = move |_| {
                    let _ = state.try_edit(Field::Valley, |d| {
                        if d.valley.len() > 3 {
                            d.valley.remove(i);
                        }
                    });
                };
                // x and y are one design field: its problems show once, under the row
                let point = i + 1;
                let remove_label = format!("Remove ground point {point}");
                view! {
                    <div class="ground-row" role="group" aria-label=format!("Ground point {point}")>
                        <span class="index" aria-hidden="true">{point}</span>
                        <NumberField label="x" spoken=format!("Ground point {point}, x") id=format!("ground-{i}-x") field=Field::ValleyPoint(i) quantity=Quantity::Length value=x on_commit=set_x min=-1e5 max=1e5 shared_field=true />
                        <NumberField label="y" spoken=format!("Ground point {point}, y (level)") id=format!("ground-{i}-y") field=Field::ValleyPoint(i) quantity=Quantity::Length value=y on_commit=set_y min=-1e4 max=1e4 shared_field=true />
                        <button type="button" class="small remove" id=format!("ground-{i}-remove") title=remove_label.clone() aria-label=remove_label on:click=remove>
                            <span aria-hidden="true">"×"</span>
                        </button>
                    </div>
                    <FieldProblems field=Field::ValleyPoint(i) id=format!("ground-{i}-error") />
                }
            })
            .collect_view()
    };
    let add = move |_| {
        let _ = state.try_edit(Field::Valley, |d| {
            if let (Some(a), Some(b)) =
                (d.valley.get(d.valley.len().saturating_sub(2)).copied(), d.valley.last().copied())
            {
                d.valley.push(GroundPoint { x: b.x + (b.x - a.x).abs().max(5.0), y: b.y });
            }
        });
    };
    let preset = move |ev: leptos::ev::Event| {
        let name = event_target_value(&ev);
        if let Some(valley) = presets().into_iter().find(|(n, _)| *n == name).map(|(_, v)| v) {
            let _ = state.try_edit(Field::Valley, |d| d.valley = valley);
        }
    };
    view! {
        <details class="panel" open>
            <summary><h3>"Ground"</h3></summary>
            <p class="hint">"Valley section, left to right (x along the crossing, y level)."</p>
            <div class="field">
                <label for="ground-preset">"Preset"</label>
                <select id="ground-preset" on:change=preset>
                    <option value="">"— choose —"</option>
                    {presets().into_iter().map(|(n, _)| view! { <option value=n>{n}</option> }).collect_view()}
                </select>
            </div>
            {rows}
            <button type="button" class="small" id="ground-add" on:click=add>"add ground point"</button>
            <FieldProblems field=Field::Valley id="ground-error" />
        </details>
    }
}

/// Invented valley sections (our own scenarios), each fitting the demo deck.
pub fn presets() -> Vec<(&'static str, Vec<GroundPoint>)> {
    let mk = |pts: &[(f64, f64)]| pts.iter().map(|&(x, y)| GroundPoint { x, y }).collect::<Vec<_>>();
    vec![
        ("Tarnvale Gorge (demo)", Design::demo().valley),
        (
            "Steep gorge",
            mk(&[
                (-10.0, 101.0),
                (0.0, 100.5),
                (20.0, 90.0),
                (35.0, 70.0),
                (55.0, 55.0),
                (83.0, 50.0),
                (110.0, 55.0),
                (130.0, 70.0),
                (148.0, 88.0),
                (168.0, 100.5),
                (180.0, 101.0),
            ]),
        ),
        (
            "Broad valley",
            mk(&[
                (-10.0, 101.0),
                (0.0, 100.5),
                (20.0, 86.0),
                (40.0, 76.0),
                (60.0, 72.0),
                (83.0, 70.0),
                (105.0, 72.0),
                (125.0, 77.0),
                (145.0, 87.0),
                (166.0, 100.5),
                (180.0, 101.0),
            ]),
        ),
    ]
}

/// Roadway: deck level, abutment seats, width, ribs, panels, approach piers.
#[component]
pub fn RoadwayPanel() -> impl IntoView {
    view! {
        <details class="panel" open>
            <summary><h3>"Roadway"</h3></summary>
            {design_field("Deck level", "deck-level", Field::DeckLevel, Quantity::Length, |d| d.deck.level, |d, v| d.deck.level = v, (-1e4, 1e4), false)}
            {design_field("Left seat x", "seat-left", Field::LeftSeatX, Quantity::Length, |d| d.deck.left_seat_x, |d, v| d.deck.left_seat_x = v, (-1e5, 1e5), false)}
            {design_field("Right seat x", "seat-right", Field::RightSeatX, Quantity::Length, |d| d.deck.right_seat_x, |d, v| d.deck.right_seat_x = v, (-1e5, 1e5), false)}
            {design_field("Deck width", "deck-width", Field::DeckWidth, Quantity::Length, |d| d.deck.width, |d, v| d.deck.width = v, (1.0, 60.0), false)}
            {design_field("Ribs", "ribs", Field::Ribs, Quantity::Count, |d| d.deck.ribs as f64, |d, v| d.deck.ribs = v as usize, count_range(MIN_RIBS, MAX_RIBS), true)}
            {design_field("Arch panels", "panels", Field::Panels, Quantity::Count, |d| d.panels as f64, |d, v| d.panels = v as usize, count_range(MIN_PANELS, MAX_PANELS), true)}
            {design_field("Approach piers, left", "piers-left", Field::ApproachPiersLeft, Quantity::Count, |d| d.approach_piers_left as f64, |d, v| d.approach_piers_left = v as usize, count_range(0, MAX_APPROACH_PIERS), true)}
            {design_field("Approach piers, right", "piers-right", Field::ApproachPiersRight, Quantity::Count, |d| d.approach_piers_right as f64, |d, v| d.approach_piers_right = v as usize, count_range(0, MAX_APPROACH_PIERS), true)}
        </details>
    }
}

/// The select value of a form-finding basis.
fn basis_key(basis: Basis) -> &'static str {
    match basis {
        Basis::PanelLoads => "panel-loads",
        Basis::AsBuilt => "as-built",
    }
}

/// Arch: springings, crown, minimum post, rib system, bracing, what the form is found for.
#[component]
pub fn ArchPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let rib = state.design_value(|d| match d.rib_system {
        RibSystem::ThreeHinged => "three",
        RibSystem::TwoHinged => "two",
        RibSystem::Fixed => "fixed",
    });
    let rib = move || rib.get();
    let set_rib = move |ev: leptos::ev::Event| {
        let v = event_target_value(&ev);
        let sys = match v.as_str() {
            "two" => RibSystem::TwoHinged,
            "fixed" => RibSystem::Fixed,
            _ => RibSystem::ThreeHinged,
        };
        // a refusal is shown beside the select (and every field it involves)
        let _ = state.try_edit(Field::RibSystem, |d| d.rib_system = sys);
    };
    let bracing = state.design_value(|d| match d.bracing {
        Bracing::None => "none",
        Bracing::Single { flipped: false } => "single",
        Bracing::Single { flipped: true } => "flipped",
        Bracing::Crossed => "crossed",
    });
    let bracing = move || bracing.get();
    let set_bracing = move |ev: leptos::ev::Event| {
        let b = match event_target_value(&ev).as_str() {
            "none" => Bracing::None,
            "flipped" => Bracing::Single { flipped: true },
            "crossed" => Bracing::Crossed,
            _ => Bracing::Single { flipped: false },
        };
        let _ = state.try_edit(Field::Bracing, |d| d.bracing = b);
    };
    let basis = state.design_value(|d| basis_key(d.form.basis));
    let basis = move || basis.get();
    let set_basis = move |ev: leptos::ev::Event| {
        let key = event_target_value(&ev);
        let chosen = Basis::ALL.into_iter().find(|b| basis_key(*b) == key).unwrap_or_default();
        let _ = state.try_edit(Field::FormBasis, |d| d.form.basis = chosen);
    };
    let basis_words = state.design_value(|d| {
        let name = d.form.basis.name();
        let mut words = format!("{}{}: {}.", name[..1].to_uppercase(), &name[1..], d.form.basis.describe());
        if d.form.basis == Basis::AsBuilt && d.bracing.is_braced() {
            words.push_str(
                " With braced spandrels the rib is freed of dead-load bending at its nodes, but the bracing, \
                 deck and rib then share the dead load: the diagonals may carry more of it than on panel loads \
                 (see the elevation).",
            );
        }
            words
    });
    let basis_words = move || basis_words.get();
    let crown_value = state.design_number(|d| d.rise());
    let set_rise = Callback::new(move |v: f64| {
        // keeps the user's choice of how the crown is given
        state.try_edit(Field::CrownRise, |d| d.set_rise(v))
    });
    view! {
        <details class="panel" open>
            <summary><h3>"Arch"</h3></summary>
            {design_field("Left springing level", "springing-left", Field::SpringingLeftLevel, Quantity::Length, |d| d.springing_left_level, |d, v| d.springing_left_level = v, (-1e4, 1e4), false)}
            {design_field("Right springing level", "springing-right", Field::SpringingRightLevel, Quantity::Length, |d| d.springing_right_level, |d, v| d.springing_right_level = v, (-1e4, 1e4), false)}
            <NumberField label="Rise" id="rise" field=Field::CrownRise quantity=Quantity::Length value=crown_value on_commit=set_rise min=0.0 max=1e4 />
            <crate::components::status::RiseLimitHint />
            {design_field("Crown level", "crown-level", Field::CrownLevel, Quantity::Length, |d| d.crown_level(), |d, v| d.crown = Crown::Level { level: v }, (-1e4, 1e4), false)}
            {design_field("Shortest post", "min-post", Field::MinPostLength, Quantity::Length, |d| d.min_post_length, |d, v| d.min_post_length = v, (0.0, 50.0), false)}
            <div class="field">
                <label for="rib-system">"Rib"</label>
                <select id="rib-system" on:change=set_rib prop:value=rib>
                    <option value="three">"three-hinged"</option>
                    <option value="two">"two-hinged"</option>
                    <option value="fixed">"fixed"</option>
                </select>
                <FieldProblems field=Field::RibSystem id="rib-system-error" />
            </div>
            <div class="field">
                <label for="bracing">"Spandrel bracing"</label>
                <select id="bracing" on:change=set_bracing prop:value=bracing>
                    <option value="none">"none"</option>
                    <option value="single">"single diagonals"</option>
                    <option value="flipped">"single diagonals, flipped"</option>
                    <option value="crossed">"crossed pairs"</option>
                </select>
                <FieldProblems field=Field::Bracing id="bracing-error" />
            </div>
            <div class="field">
                <label for="form-basis">"Form found for"</label>
                <select id="form-basis" on:change=set_basis prop:value=basis>
                    <option value="panel-loads">"panel loads"</option>
                    <option value="as-built">"as built"</option>
                </select>
                <FieldProblems field=Field::FormBasis id="form-basis-error" />
            </div>
            <p class="hint" id="form-basis-words">{basis_words}</p>
        </details>
    }
}

/// Loads: the dead loads of the deck.
#[component]
pub fn LoadsPanel() -> impl IntoView {
    view! {
        <details class="panel" open>
            <summary><h3>"Loads"</h3></summary>
            {design_field("Deck dead load", "dead-load", Field::DeadLoad, Quantity::Pressure, |d| d.deck.dead_load, |d, v| d.deck.dead_load = v, (0.0, 100.0), false)}
            {design_field("Surfacing", "surfacing", Field::Surfacing, Quantity::Pressure, |d| d.deck.surfacing, |d, v| d.deck.surfacing = v, (0.0, 50.0), false)}
            <p class="hint">"Self-weights of rib, posts, bracing and deck girder follow from the sections."</p>
        </details>
    }
}

type SectionGet = fn(&Design) -> &Section;
type SectionSet = fn(&mut Design) -> &mut Section;

/// Sections: E, A, I, depth and unit weight of each member group (per rib line).
#[component]
pub fn SectionsPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let groups: [(&'static str, &'static str, GroupName, SectionGet, SectionSet); 5] = [
        ("Rib", "rib", GroupName::Rib, |d| &d.groups.rib, |d| &mut d.groups.rib),
        ("Deck", "deck", GroupName::Deck, |d| &d.groups.deck, |d| &mut d.groups.deck),
        ("Posts", "posts", GroupName::Posts, |d| &d.groups.posts, |d| &mut d.groups.posts),
        ("Piers", "piers", GroupName::Piers, |d| &d.groups.piers, |d| &mut d.groups.piers),
        ("Bracing", "bracing", GroupName::Bracing, |d| &d.groups.bracing, |d| &mut d.groups.bracing),
    ];
    type Prop = (
        &'static str,
        &'static str,
        &'static str,
        SectionProperty,
        Quantity,
        fn(&Section) -> f64,
        fn(&mut Section, f64),
        (f64, f64),
    );
    let props: [Prop; 5] = [
        (
            "E",
            "Young's modulus E",
            "e",
            SectionProperty::E,
            Quantity::Modulus,
            |s| s.e,
            |s, v| s.e = v,
            (1e5, 1e9),
        ),
        ("A", "area A", "a", SectionProperty::A, Quantity::Area, |s| s.a, |s, v| s.a = v, (1e-5, 100.0)),
        (
            "I",
            "second moment of area I",
            "i",
            SectionProperty::I,
            Quantity::Inertia,
            |s| s.i,
            |s, v| s.i = v,
            (1e-10, 1000.0),
        ),
        (
            "depth",
            "depth",
            "depth",
            SectionProperty::Depth,
            Quantity::SectionDepth,
            |s| s.depth,
            |s, v| s.depth = v,
            (0.01, 20.0),
        ),
        (
            "weight",
            "unit weight",
            "w",
            SectionProperty::UnitWeight,
            Quantity::UnitWeight,
            |s| s.unit_weight,
            |s, v| s.unit_weight = v,
            (0.0, 100.0),
        ),
    ];
    let rows = groups
        .into_iter()
        .map(|(name, key, group, get, set)| {
            let cells = props
                .into_iter()
                .map(|(label, what, pkey, property, q, pget, pset, range)| {
                    let field = Field::Section(group, property);
                    let value = state.design_number(move |d| pget(get(d)));
                    let on_commit = Callback::new(move |v: f64| state.try_edit(field, |d| pset(set(d), v)));
                    view! {
                        <NumberField label spoken=format!("{name}, {what} (per rib line)") id=format!("section-{key}-{pkey}") field quantity=q value on_commit min=range.0 max=range.1 />
                    }
                })
                .collect_view();
            view! {
                <fieldset class="section-group">
                    <legend>{name}</legend>
                    <GroupSizingFields group name />
                    {cells}
                </fieldset>
            }
        })
        .collect_view();
    view! {
        <details class="panel">
            <summary><h3>"Sections"</h3></summary>
            <p class="hint">"Per rib line; the plane model carries all ribs together. Size a group in a family and material, or keep the typed values and have them checked."</p>
            {rows}
        </details>
    }
}

/// The select value of "as typed" (no family).
const AS_TYPED: &str = "typed";
/// Where a group's refusals show when no input of the group was edited last: under its
/// buckling length, the last of its sizing inputs.
const END_SLOT: &str = "end";
/// The select value of a material that is no preset (edited in a design file).
const OWN_MATERIAL: &str = "own";

/// The key of the family preset of `family`'s kind (`chs`, `shs`, `box`, `concrete`,
/// `concrete-box`, `glulam`): the presets hold one family of each kind.
fn family_key(family: &Family) -> &'static str {
    Family::family_presets()
        .into_iter()
        .find(|(_, preset)| std::mem::discriminant(preset) == std::mem::discriminant(family))
        .map_or(AS_TYPED, |(key, _)| key)
}

/// The key of the material preset equal to `material`, or `OWN_MATERIAL`.
fn material_key(material: &Material) -> &'static str {
    material_presets_once().iter().find(|(_, m, _)| m == material).map_or(OWN_MATERIAL, |(key, _, _)| key)
}

/// The material presets (`material_presets`), built once: `material_key` runs for every
/// member group on every edit, and building the presets' names each time was about a
/// fifth of a millisecond of it (a profile of a panel-count edit).
fn material_presets_once() -> &'static [(&'static str, Material, &'static str)] {
    static PRESETS: std::sync::OnceLock<Vec<(&'static str, Material, &'static str)>> =
        std::sync::OnceLock::new();
    PRESETS.get_or_init(material_presets)
}

/// A group's sizing after the "Sized as" select chose `key`: `AS_TYPED` keeps the typed
/// section (and the material it is checked as); a family keeps its ratios when the kind
/// stays, else takes the preset's, and the material becomes the first preset the family
/// suits when the current one does not suit it (one edit, so the design never holds a
/// family of the wrong material).
pub(crate) fn choose_family(sizing: &mut GroupSizing, key: &str) {
    if key == AS_TYPED {
        sizing.family = None;
        return;
    }
    let Some(family) = Family::family_presets().into_iter().find(|(k, _)| *k == key).map(|(_, f)| f) else {
        return;
    };
    if sizing.family.as_ref().map(family_key) != Some(key) {
        sizing.family = Some(family);
    }
    if !family.suits(&sizing.material) {
        if let Some((_, material, _)) = material_presets().into_iter().find(|(_, m, _)| family.suits(m)) {
            sizing.material = material;
        }
    }
}

/// One ratio of a section family: its words, id suffix, unit and where it sits in the
/// families that have it.
struct FamilyRatio {
    label: &'static str,
    key: &'static str,
    quantity: Quantity,
    get: fn(&Family) -> Option<f64>,
    set: fn(&mut Family, f64),
    /// Local bounds of the typed number (the engine's checks give the real limits).
    range: (f64, f64),
}

/// The ratios of every family, in the order shown; each family shows those whose `get`
/// answers.
const FAMILY_RATIOS: [FamilyRatio; 8] = [
    FamilyRatio {
        label: "Diameter / wall, D/t",
        key: "d-over-t",
        quantity: Quantity::Ratio,
        get: |f| if let Family::Chs { d_over_t } = f { Some(*d_over_t) } else { None },
        set: |f, v| {
            if let Family::Chs { d_over_t } = f {
                *d_over_t = v;
            }
        },
        range: (0.0, 1000.0),
    },
    FamilyRatio {
        label: "Width / wall, b/t",
        key: "b-over-t",
        quantity: Quantity::Ratio,
        get: |f| if let Family::Shs { b_over_t } = f { Some(*b_over_t) } else { None },
        set: |f, v| {
            if let Family::Shs { b_over_t } = f {
                *b_over_t = v;
            }
        },
        range: (0.0, 1000.0),
    },
    FamilyRatio {
        label: "Width / depth",
        key: "width-over-depth",
        quantity: Quantity::Ratio,
        get: |f| match f {
            Family::WeldedBox { width_over_depth, .. }
            | Family::ConcreteRect { width_over_depth, .. }
            | Family::ConcreteBox { width_over_depth, .. }
            | Family::GlulamRect { width_over_depth } => Some(*width_over_depth),
            _ => None,
        },
        set: |f, v| match f {
            Family::WeldedBox { width_over_depth, .. }
            | Family::ConcreteRect { width_over_depth, .. }
            | Family::ConcreteBox { width_over_depth, .. }
            | Family::GlulamRect { width_over_depth } => *width_over_depth = v,
            _ => {}
        },
        range: (0.0, 20.0),
    },
    FamilyRatio {
        label: "Width / flange thickness",
        key: "flange-ratio",
        quantity: Quantity::Ratio,
        get: |f| if let Family::WeldedBox { flange_ratio, .. } = f { Some(*flange_ratio) } else { None },
        set: |f, v| {
            if let Family::WeldedBox { flange_ratio, .. } = f {
                *flange_ratio = v;
            }
        },
        range: (0.0, 1000.0),
    },
    FamilyRatio {
        label: "Depth / web thickness",
        key: "web-ratio",
        quantity: Quantity::Ratio,
        get: |f| if let Family::WeldedBox { web_ratio, .. } = f { Some(*web_ratio) } else { None },
        set: |f, v| {
            if let Family::WeldedBox { web_ratio, .. } = f {
                *web_ratio = v;
            }
        },
        range: (0.0, 1000.0),
    },
    FamilyRatio {
        label: "Walls / depth",
        key: "wall-over-depth",
        quantity: Quantity::Ratio,
        get: |f| {
            if let Family::ConcreteBox { wall_over_depth, .. } = f {
                Some(*wall_over_depth)
            } else {
                None
            }
        },
        set: |f, v| {
            if let Family::ConcreteBox { wall_over_depth, .. } = f {
                *wall_over_depth = v;
            }
        },
        range: (0.0, 0.5),
    },
    FamilyRatio {
        label: "Reinforcement, A_s / A_c",
        key: "reinforcement",
        quantity: Quantity::Ratio,
        get: |f| match f {
            Family::ConcreteRect { reinforcement_ratio, .. }
            | Family::ConcreteBox { reinforcement_ratio, .. } => Some(*reinforcement_ratio),
            _ => None,
        },
        set: |f, v| match f {
            Family::ConcreteRect { reinforcement_ratio, .. }
            | Family::ConcreteBox { reinforcement_ratio, .. } => *reinforcement_ratio = v,
            _ => {}
        },
        range: (0.0, 1.0),
    },
    FamilyRatio {
        label: "Cover to bar centres",
        key: "cover",
        quantity: Quantity::SectionDepth,
        get: |f| match f {
            Family::ConcreteRect { cover, .. } | Family::ConcreteBox { cover, .. } => Some(*cover),
            _ => None,
        },
        set: |f, v| match f {
            Family::ConcreteRect { cover, .. } | Family::ConcreteBox { cover, .. } => *cover = v,
            _ => {}
        },
        range: (0.0, 10.0),
    },
];

/// A group's sizing inputs above its typed section: the family ("Sized as"), the
/// material, the family's ratios, the buckling length (factor K, or the rib's length out
/// of its plane) and, when sized, what the analysis uses meanwhile. Every edit is
/// `Field::Sizing(group)`; its refusals show once, under the input last edited.
#[component]
fn GroupSizingFields(
    /// The member group.
    group: GroupName,
    /// The group's name as its fieldset heads it.
    name: &'static str,
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let field = Field::Sizing(group);
    let key = group.key();
    // keys only: a ratio edited keeps the same fields (and focus) on screen
    let chosen_family =
        state.design_value(move |d| d.sizing.group(group).family.as_ref().map_or(AS_TYPED, family_key));
    let chosen_material = state.design_value(move |d| material_key(&d.sizing.group(group).material));
    // the name of a material that is no preset (a design file's own values)
    let own_name = state.design_value(move |d| d.sizing.group(group).material.name().to_string());
    // where the group's refusals show: under the input last edited ("select", a ratio's
    // key, or END_SLOT), so a message stands beside what caused it
    let edited_at = RwSignal::new(END_SLOT);
    let problems_at = move |slot: &'static str| {
        move || {
            (edited_at.get() == slot).then(|| {
                view! { <div class="field"><FieldProblems field id=format!("sizing-{key}-error") /></div> }
            })
        }
    };
    let on_family = move |ev: leptos::ev::Event| {
        let chosen = event_target_value(&ev);
        edited_at.set("select");
        let _ = state.try_edit(field, |d| choose_family(d.sizing.group_mut(group), &chosen));
    };
    let on_material = move |ev: leptos::ev::Event| {
        if let Some(material) = material_preset(&event_target_value(&ev)) {
            edited_at.set("select");
            let _ = state.try_edit(field, |d| d.sizing.group_mut(group).material = material);
        }
    };
    let family_options = std::iter::once((AS_TYPED, "as typed"))
        .chain(Family::family_presets().into_iter().map(|(k, f)| (k, f.name())))
        .map(|(value, words)| {
            view! { <option value=value prop:selected=move || chosen_family.get() == value>{words}</option> }
        })
        .collect_view();
    let material_options = move || {
        let family =
            Family::family_presets().into_iter().find(|(k, _)| *k == chosen_family.get()).map(|(_, f)| f);
        let own = (chosen_material.get() == OWN_MATERIAL).then(|| {
            let words = format!("own: {}", own_name.get());
            view! { <option value=OWN_MATERIAL selected=true disabled=true>{words}</option> }
        });
        let presets = material_presets()
            .into_iter()
            .filter(|(_, m, _)| family.is_none_or(|f| f.suits(m)))
            .map(|(value, m, source)| {
                view! {
                    <option value=value title=source prop:selected=move || chosen_material.get() == value>
                        {m.name().to_string()}
                    </option>
                }
            })
            .collect_view();
        view! { {presets}{own} }
    };
    let ratios = move || {
        let family =
            Family::family_presets().into_iter().find(|(k, _)| *k == chosen_family.get()).map(|(_, f)| f);
        let Some(family) = family else { return ().into_any() };
        FAMILY_RATIOS
            .iter()
            .filter(|r| (r.get)(&family).is_some())
            .map(|r| {
                let (get, set, slot) = (r.get, r.set, r.key);
                let value = state
                    .design_number(move |d| d.sizing.group(group).family.as_ref().and_then(get).unwrap_or(f64::NAN));
                let on_commit = Callback::new(move |v: f64| {
                    edited_at.set(slot);
                    state.try_edit(field, |d| {
                        if let Some(f) = d.sizing.group_mut(group).family.as_mut() {
                            set(f, v);
                        }
                    })
                });
                view! {
                    <NumberField label=r.label spoken=format!("{name}, {}", r.label) id=format!("sizing-{key}-{}", r.key) field quantity=r.quantity value on_commit min=r.range.0 max=r.range.1 shared_field=true />
                    {problems_at(slot)}
                }
            })
            .collect_view()
            .into_any()
    };
    let length = if group == GroupName::Rib {
        view! {
            <RibOutOfPlaneField edited_at />
            <FirstOrderRibField edited_at />
            <p class="hint">"Out of plane, empty: each rib segment with two or more ribs (held sideways at every rib node by bracing between them, assumed), the whole rib with one. In its plane the rib buckles as a whole arch, over a length that follows from rise and span."</p>
        }
        .into_any()
    } else {
        let value = state.design_number(move |d| d.sizing.group(group).length_factor);
        let on_commit = Callback::new(move |v: f64| {
            edited_at.set(END_SLOT);
            state.try_edit(field, |d| d.sizing.group_mut(group).length_factor = v)
        });
        let label = if group == GroupName::Deck {
            "Buckling length factor K (in plane)"
        } else {
            "Buckling length factor K"
        };
        view! {
            <NumberField label spoken=format!("{name}, buckling length factor K") id=format!("sizing-{key}-k") field quantity=Quantity::Ratio value on_commit min=0.0 max=100.0 shared_field=true />
        }
        .into_any()
    };
    let adopted_hint = move || {
        (chosen_family.get() != AS_TYPED).then(|| {
            view! {
                <p class="hint" id=format!("sizing-{key}-hint")>
                    "Analysed with the typed values below until the sizes are adopted (Sizes view, “Use these sizes”)."
                </p>
            }
        })
    };
    let typed_hint = move || {
        (chosen_family.get() == AS_TYPED)
            .then(|| view! { <p class="hint">"The typed values below are analysed and checked as this material."</p> })
    };
    view! {
        // wide: the family names are long ("concrete rectangle")
        <div class="field wide">
            <label for=format!("sizing-{key}-family")>"Sized as"</label>
            <select id=format!("sizing-{key}-family") aria-label=format!("{name}, sized as") on:change=on_family>
                {family_options}
            </select>
        </div>
        <div class="field">
            <label for=format!("sizing-{key}-material")>"Material"</label>
            <select id=format!("sizing-{key}-material") aria-label=format!("{name}, material") on:change=on_material>
                {material_options}
            </select>
        </div>
        {problems_at("select")}
        {ratios}
        {length}
        {problems_at(END_SLOT)}
        {adopted_hint}
        {typed_hint}
    }
}

/// The rib's buckling length out of its plane: a length, or empty for each rib
/// segment's own length (the rib held sideways at every rib node).
#[component]
fn RibOutOfPlaneField(
    /// Where the rib group's refusals show: set to `END_SLOT` (under this field) on commit.
    edited_at: RwSignal<&'static str>,
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let field = Field::Sizing(GroupName::Rib);
    let id = "sizing-rib-out-of-plane";
    let input_error = RwSignal::new(None::<String>);
    let length = state.design_value(|d| d.sizing.rib_out_of_plane);
    let shown = move || {
        let units = state.units.get();
        length.get().map_or(String::new(), |l| input_text(units, Quantity::Length, l, false))
    };
    let commit = move |text: String| {
        let length = if text.trim().is_empty() {
            Ok(None)
        } else {
            parse_number(&text).map(|v| Some(state.units.get_untracked().to_si(Quantity::Length, v)))
        };
        match length {
            Ok(length) => {
                input_error.set(None);
                edited_at.set(END_SLOT);
                // a refusal is recorded in the state and shown under the group's inputs
                let _ = state.try_edit(field, |d| d.sizing.rib_out_of_plane = length);
            }
            Err(e) => {
                state.clear_refusal();
                input_error.set(Some(e));
            }
        }
    };
    let unit = move || state.units.get().label(Quantity::Length);
    view! {
        <div class="field" class:invalid=move || input_error.with(Option::is_some)>
            <label for=id>"Buckling length, out of plane"</label>
            <input
                id=id
                type="text"
                inputmode="decimal"
                placeholder="segment"
                aria-label="Rib, buckling length out of its plane (empty: each rib segment, or the whole rib when there is one rib)"
                aria-describedby=format!("{id}-error")
                prop:value=shown
                on:change=move |ev| commit(event_target_value(&ev))
            />
            <span class="unit">{unit}</span>
            <FieldProblems field id=format!("{id}-error") local=input_error input_only=true />
        </div>
    }
}

/// Whether the rib is sized so that the arch's alpha_cr reaches 10 (a first-order
/// analysis acceptable, EN 1993-1-1 5.2.1(3)) rather than 3 with amplified moments.
#[component]
fn FirstOrderRibField(
    /// Where the rib group's refusals show: set to `END_SLOT` (under this field) on commit.
    edited_at: RwSignal<&'static str>,
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let id = "sizing-rib-first-order";
    let checked = state.design_value(|d| d.sizing.rib_for_first_order);
    let checked = move || checked.get();
    let toggle = move |ev: leptos::ev::Event| {
        let on = event_target_checked(&ev);
        edited_at.set(END_SLOT);
        let _ = state.try_edit(Field::Sizing(GroupName::Rib), |d| d.sizing.rib_for_first_order = on);
    };
    view! {
        <div class="field checkbox-field">
            <input id=id type="checkbox" prop:checked=checked on:change=toggle />
            <label for=id>"Size the rib for alpha_cr ≥ 10 (first-order analysis acceptable)"</label>
        </div>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn preset(key: &str) -> Material {
        material_preset(key).unwrap_or_else(|| panic!("preset {key}"))
    }

    #[test]
    fn choosing_a_family_keeps_or_switches_the_material_in_one_edit() {
        // the demo's rib: a welded box of S355 (`SizingDesign::steel`)
        let mut rib = Design::demo().sizing.rib;
        choose_family(&mut rib, "chs");
        assert_eq!(rib.family, Some(Family::Chs { d_over_t: 40.0 }));
        assert_eq!(rib.material, preset("s355"), "a steel family keeps a steel material");
        // concrete does not suit S355: the first concrete preset, C30/37, comes with it
        choose_family(&mut rib, "concrete");
        assert!(matches!(rib.family, Some(Family::ConcreteRect { .. })));
        assert_eq!(rib.material, preset("c30-37"));
        assert_eq!(family_key(rib.family.as_ref().expect("family")), "concrete");
        // the concrete box keeps the concrete material, and takes its preset's ratios
        choose_family(&mut rib, "concrete-box");
        assert_eq!(
            rib.family,
            Some(Family::ConcreteBox {
                width_over_depth: 2.0,
                wall_over_depth: 0.12,
                reinforcement_ratio: 0.015,
                cover: 0.07
            })
        );
        assert_eq!(rib.material, preset("c30-37"));
        assert_eq!(family_key(rib.family.as_ref().expect("family")), "concrete-box");
        // as typed keeps the material the typed section is checked as
        choose_family(&mut rib, AS_TYPED);
        assert_eq!((rib.family, rib.material.clone()), (None, preset("c30-37")));
        // an unknown key changes nothing
        let before = rib.clone();
        choose_family(&mut rib, "granite");
        assert_eq!(rib, before);
    }

    #[test]
    fn choosing_the_same_kind_keeps_the_edited_ratios() {
        let mut rib = Design::demo().sizing.rib;
        rib.family = Some(Family::WeldedBox { width_over_depth: 0.8, flange_ratio: 25.0, web_ratio: 40.0 });
        choose_family(&mut rib, "box");
        assert_eq!(
            rib.family,
            Some(Family::WeldedBox { width_over_depth: 0.8, flange_ratio: 25.0, web_ratio: 40.0 })
        );
    }

    #[test]
    fn materials_not_among_the_presets_read_as_own() {
        assert_eq!(material_key(&preset("gl28h")), "gl28h");
        let Material::Steel(mut steel) = preset("s355") else { panic!("steel") };
        steel.fy = 345e3;
        assert_eq!(material_key(&Material::Steel(steel)), OWN_MATERIAL);
    }

    #[test]
    fn every_family_shows_its_own_ratios() {
        for (key, family) in Family::family_presets() {
            let shown: Vec<&str> =
                FAMILY_RATIOS.iter().filter(|r| (r.get)(&family).is_some()).map(|r| r.key).collect();
            let expected: &[&str] = match key {
                "chs" => &["d-over-t"],
                "shs" => &["b-over-t"],
                "box" => &["width-over-depth", "flange-ratio", "web-ratio"],
                "concrete" => &["width-over-depth", "reinforcement", "cover"],
                "concrete-box" => &["width-over-depth", "wall-over-depth", "reinforcement", "cover"],
                "glulam" => &["width-over-depth"],
                other => panic!("a family preset {other} without its ratios listed here"),
            };
            assert_eq!(shown, expected, "{key}");
            // each setter writes what its getter reads
            for r in FAMILY_RATIOS.iter().filter(|r| (r.get)(&family).is_some()) {
                let mut f = family;
                (r.set)(&mut f, 0.123);
                assert_eq!((r.get)(&f), Some(0.123), "{key} {}", r.key);
            }
        }
    }
}
