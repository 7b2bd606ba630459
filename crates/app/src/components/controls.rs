//! The control panels: Ground, Roadway, Arch, Loads and Sections. Every field has a unit
//! and a valid range; a value the engine refuses shows why beside the field and the last
//! good design stays on screen.

use crate::format::{Quantity, Units};
use crate::state::{parse_number, AppState};
use leptos::prelude::*;
use springline_statics::arch::design::{Bracing, Crown, GroundPoint, RibSystem, Section};
use springline_statics::Design;

/// Formats an SI value for an input box in the chosen units (no digit grouping).
fn input_text(units: Units, q: Quantity, si: f64, integer: bool) -> String {
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
    /// What kind of quantity it is (sets the unit).
    quantity: Quantity,
    /// The current SI value.
    #[prop(into)]
    value: Signal<f64>,
    /// Applies an SI value to the design; `Err` carries the engine's message.
    on_commit: Callback<f64, Result<(), String>>,
    /// Smallest allowed SI value.
    min: f64,
    /// Largest allowed SI value.
    max: f64,
    /// Whole numbers only.
    #[prop(optional)]
    integer: bool,
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let error = RwSignal::new(None::<String>);
    let error_id = format!("{id}-error");
    let commit = move |text: String| {
        let units = state.units.get_untracked();
        let shown = match parse_number(&text) {
            Ok(v) => v,
            Err(e) => {
                error.set(Some(e));
                return;
            }
        };
        if integer && shown.fract() != 0.0 {
            error.set(Some("must be a whole number".into()));
            return;
        }
        let si = if integer { shown } else { units.to_si(quantity, shown) };
        if si < min || si > max {
            let (lo, hi) = if integer {
                (format!("{min}"), format!("{max}"))
            } else {
                (units.show(quantity, min), units.show(quantity, max))
            };
            error.set(Some(format!("must be between {lo} and {hi}")));
            return;
        }
        error.set(on_commit.run(si).err());
    };
    let unit = move || if integer { String::new() } else { state.units.get().label(quantity).to_string() };
    view! {
        <div class="field" class:invalid=move || error.get().is_some()>
            <label for=id.clone()>{label}</label>
            <input
                id=id.clone()
                type="text"
                inputmode="decimal"
                aria-describedby=error_id.clone()
                prop:value=move || input_text(state.units.get(), quantity, value.get(), integer)
                on:change=move |ev| commit(event_target_value(&ev))
            />
            <span class="unit">{unit}</span>
            <p class="error" id=error_id role="alert">{move || error.get()}</p>
        </div>
    }
}

/// A field editing `get`/`set` of the design through `AppState::try_edit`.
fn design_field(
    label: &'static str,
    id: &'static str,
    quantity: Quantity,
    get: fn(&Design) -> f64,
    set: fn(&mut Design, f64),
    range: (f64, f64),
    integer: bool,
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let value = Signal::derive(move || state.design.with(get));
    let on_commit = Callback::new(move |v: f64| state.try_edit(|d| set(d, v)));
    view! { <NumberField label id quantity value on_commit min=range.0 max=range.1 integer /> }
}

/// Ground: the valley section as a list of points, with invented presets.
#[component]
pub fn GroundPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let count = Memo::new(move |_| state.design.with(|d| d.valley.len()));
    let message = RwSignal::new(None::<String>);
    let rows = move || {
        (0..count.get())
            .map(|i| {
                let x = Signal::derive(move || state.design.with(|d| d.valley.get(i).map(|p| p.x).unwrap_or(0.0)));
                let y = Signal::derive(move || state.design.with(|d| d.valley.get(i).map(|p| p.y).unwrap_or(0.0)));
                let set_x = Callback::new(move |v: f64| {
                    state.try_edit(|d| {
                        if let Some(p) = d.valley.get_mut(i) {
                            p.x = v;
                        }
                    })
                });
                let set_y = Callback::new(move |v: f64| {
                    state.try_edit(|d| {
                        if let Some(p) = d.valley.get_mut(i) {
                            p.y = v;
                        }
                    })
                });
                let remove = move |_| {
                    message.set(
                        state
                            .try_edit(|d| {
                                if d.valley.len() > 3 {
                                    d.valley.remove(i);
                                }
                            })
                            .err(),
                    )
                };
                view! {
                    <div class="ground-row">
                        <span class="index">{i + 1}</span>
                        <NumberField label="x" id=format!("ground-{i}-x") quantity=Quantity::Length value=x on_commit=set_x min=-1e5 max=1e5 />
                        <NumberField label="y" id=format!("ground-{i}-y") quantity=Quantity::Length value=y on_commit=set_y min=-1e4 max=1e4 />
                        <button class="small" title="remove this ground point" on:click=remove>"×"</button>
                    </div>
                }
            })
            .collect_view()
    };
    let add = move |_| {
        message.set(
            state
                .try_edit(|d| {
                    if let (Some(a), Some(b)) =
                        (d.valley.get(d.valley.len().saturating_sub(2)).copied(), d.valley.last().copied())
                    {
                        d.valley.push(GroundPoint { x: b.x + (b.x - a.x).abs().max(5.0), y: b.y });
                    }
                })
                .err(),
        )
    };
    let preset = move |ev: leptos::ev::Event| {
        let name = event_target_value(&ev);
        if let Some(valley) = presets().into_iter().find(|(n, _)| *n == name).map(|(_, v)| v) {
            message.set(state.try_edit(|d| d.valley = valley).err());
        }
    };
    view! {
        <details class="panel" open>
            <summary>"Ground"</summary>
            <p class="hint">"Valley section, left to right (x along the crossing, y level)."</p>
            <div class="field">
                <label for="ground-preset">"Preset"</label>
                <select id="ground-preset" on:change=preset>
                    <option value="">"— choose —"</option>
                    {presets().into_iter().map(|(n, _)| view! { <option value=n>{n}</option> }).collect_view()}
                </select>
            </div>
            {rows}
            <button class="small" on:click=add>"add ground point"</button>
            <p class="error" role="alert">{move || message.get()}</p>
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
            <summary>"Roadway"</summary>
            {design_field("Deck level", "deck-level", Quantity::Length, |d| d.deck.level, |d, v| d.deck.level = v, (-1e4, 1e4), false)}
            {design_field("Left seat x", "seat-left", Quantity::Length, |d| d.deck.left_seat_x, |d, v| d.deck.left_seat_x = v, (-1e5, 1e5), false)}
            {design_field("Right seat x", "seat-right", Quantity::Length, |d| d.deck.right_seat_x, |d, v| d.deck.right_seat_x = v, (-1e5, 1e5), false)}
            {design_field("Deck width", "deck-width", Quantity::Length, |d| d.deck.width, |d, v| d.deck.width = v, (1.0, 60.0), false)}
            {design_field("Ribs", "ribs", Quantity::Count, |d| d.deck.ribs as f64, |d, v| d.deck.ribs = v as usize, (1.0, 100.0), true)}
            {design_field("Arch panels", "panels", Quantity::Count, |d| d.panels as f64, |d, v| d.panels = v as usize, (2.0, 200.0), true)}
            {design_field("Approach piers, left", "piers-left", Quantity::Count, |d| d.approach_piers_left as f64, |d, v| d.approach_piers_left = v as usize, (0.0, 50.0), true)}
            {design_field("Approach piers, right", "piers-right", Quantity::Count, |d| d.approach_piers_right as f64, |d, v| d.approach_piers_right = v as usize, (0.0, 50.0), true)}
        </details>
    }
}

/// Arch: springings, crown, minimum post, rib system, bracing.
#[component]
pub fn ArchPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let message = RwSignal::new(None::<String>);
    let rib = move || {
        state.design.with(|d| match d.rib_system {
            RibSystem::ThreeHinged => "three",
            RibSystem::TwoHinged => "two",
            RibSystem::Fixed => "fixed",
        })
    };
    let set_rib = move |ev: leptos::ev::Event| {
        let v = event_target_value(&ev);
        let sys = match v.as_str() {
            "two" => RibSystem::TwoHinged,
            "fixed" => RibSystem::Fixed,
            _ => RibSystem::ThreeHinged,
        };
        message.set(state.try_edit(|d| d.rib_system = sys).err());
    };
    let bracing = move || {
        state.design.with(|d| match d.bracing {
            Bracing::None => "none",
            Bracing::Single { flipped: false } => "single",
            Bracing::Single { flipped: true } => "flipped",
            Bracing::Crossed => "crossed",
        })
    };
    let set_bracing = move |ev: leptos::ev::Event| {
        let b = match event_target_value(&ev).as_str() {
            "none" => Bracing::None,
            "flipped" => Bracing::Single { flipped: true },
            "crossed" => Bracing::Crossed,
            _ => Bracing::Single { flipped: false },
        };
        message.set(state.try_edit(|d| d.bracing = b).err());
    };
    let crown_value = Signal::derive(move || state.design.with(|d| d.rise()));
    let set_rise = Callback::new(move |v: f64| {
        state.try_edit(|d| {
            // keep the user's choice of how the crown is given
            d.crown = match d.crown {
                Crown::Rise { .. } => Crown::Rise { rise: v },
                Crown::Level { .. } => {
                    Crown::Level { level: 0.5 * (d.springing_left_level + d.springing_right_level) + v }
                }
            }
        })
    });
    view! {
        <details class="panel" open>
            <summary>"Arch"</summary>
            {design_field("Left springing level", "springing-left", Quantity::Length, |d| d.springing_left_level, |d, v| d.springing_left_level = v, (-1e4, 1e4), false)}
            {design_field("Right springing level", "springing-right", Quantity::Length, |d| d.springing_right_level, |d, v| d.springing_right_level = v, (-1e4, 1e4), false)}
            <NumberField label="Rise" id="rise" quantity=Quantity::Length value=crown_value on_commit=set_rise min=0.0 max=1e4 />
            {design_field("Crown level", "crown-level", Quantity::Length, |d| d.crown_level(), |d, v| d.crown = Crown::Level { level: v }, (-1e4, 1e4), false)}
            {design_field("Shortest post", "min-post", Quantity::Length, |d| d.min_post_length, |d, v| d.min_post_length = v, (0.0, 50.0), false)}
            <div class="field">
                <label for="rib-system">"Rib"</label>
                <select id="rib-system" on:change=set_rib prop:value=rib>
                    <option value="three">"three-hinged"</option>
                    <option value="two">"two-hinged"</option>
                    <option value="fixed">"fixed"</option>
                </select>
            </div>
            <div class="field">
                <label for="bracing">"Spandrel bracing"</label>
                <select id="bracing" on:change=set_bracing prop:value=bracing>
                    <option value="none">"none"</option>
                    <option value="single">"single diagonals"</option>
                    <option value="flipped">"single diagonals, flipped"</option>
                    <option value="crossed">"crossed pairs"</option>
                </select>
            </div>
            <p class="error" role="alert">{move || message.get()}</p>
        </details>
    }
}

/// Loads: the dead loads of the deck.
#[component]
pub fn LoadsPanel() -> impl IntoView {
    view! {
        <details class="panel" open>
            <summary>"Loads"</summary>
            {design_field("Deck dead load", "dead-load", Quantity::Pressure, |d| d.deck.dead_load, |d, v| d.deck.dead_load = v, (0.0, 100.0), false)}
            {design_field("Surfacing", "surfacing", Quantity::Pressure, |d| d.deck.surfacing, |d, v| d.deck.surfacing = v, (0.0, 50.0), false)}
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
    let groups: [(&'static str, &'static str, SectionGet, SectionSet); 5] = [
        ("Rib", "rib", |d| &d.groups.rib, |d| &mut d.groups.rib),
        ("Deck", "deck", |d| &d.groups.deck, |d| &mut d.groups.deck),
        ("Posts", "posts", |d| &d.groups.posts, |d| &mut d.groups.posts),
        ("Piers", "piers", |d| &d.groups.piers, |d| &mut d.groups.piers),
        ("Bracing", "bracing", |d| &d.groups.bracing, |d| &mut d.groups.bracing),
    ];
    type Prop =
        (&'static str, &'static str, Quantity, fn(&Section) -> f64, fn(&mut Section, f64), (f64, f64));
    let props: [Prop; 5] = [
        ("E", "e", Quantity::Modulus, |s| s.e, |s, v| s.e = v, (1e5, 1e9)),
        ("A", "a", Quantity::Area, |s| s.a, |s, v| s.a = v, (1e-5, 100.0)),
        ("I", "i", Quantity::Inertia, |s| s.i, |s, v| s.i = v, (1e-10, 1000.0)),
        ("depth", "depth", Quantity::Length, |s| s.depth, |s, v| s.depth = v, (0.01, 20.0)),
        ("weight", "w", Quantity::UnitWeight, |s| s.unit_weight, |s, v| s.unit_weight = v, (0.0, 100.0)),
    ];
    let rows = groups
        .into_iter()
        .map(|(name, key, get, set)| {
            let cells = props
                .into_iter()
                .map(|(label, pkey, q, pget, pset, range)| {
                    let value = Signal::derive(move || state.design.with(|d| pget(get(d))));
                    let on_commit = Callback::new(move |v: f64| state.try_edit(|d| pset(set(d), v)));
                    view! {
                        <NumberField label id=format!("section-{key}-{pkey}") quantity=q value on_commit min=range.0 max=range.1 />
                    }
                })
                .collect_view();
            view! { <fieldset class="section-group"><legend>{name}</legend>{cells}</fieldset> }
        })
        .collect_view();
    view! {
        <details class="panel">
            <summary>"Sections"</summary>
            <p class="hint">"Per rib line; the plane model carries all ribs together."</p>
            {rows}
        </details>
    }
}
