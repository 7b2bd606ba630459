//! The load case picker: one named button per load case of the analysis, each with a
//! small pictogram of its load pattern drawn from the case kind, the chosen one pressed.
//! The drawings and the results table show the chosen case. Then the named traffic
//! patterns, each of the other actions alone, the envelope, the sizes, and the load model's vehicle
//! (its case joins the analysis while it is chosen, and the elevation lets it be dragged
//! along the deck).

use crate::format::Units;
use crate::state::{AppState, ModeView};
use leptos::prelude::*;
use springline_statics::arch::actions::action_cases;
use springline_statics::arch::cases::{standard_cases, CaseKind, Half, Pattern};

/// Pictogram width and height (SVG user units; shown at this size in CSS pixels).
const PICTO_W: f64 = 48.0;
const PICTO_H: f64 = 30.0;
/// Deck line level and the left / right ends of the arch in the pictogram.
const DECK_Y: f64 = 13.0;
const ARCH_X0: f64 = 5.0;
const ARCH_X1: f64 = 43.0;
/// Light (dead load) arrows along the deck.
const LIGHT_ARROWS: usize = 7;

/// Path data of one downward arrow at `x` from `top` to the deck line.
fn arrow(x: f64, top: f64) -> String {
    let tip = DECK_Y - 1.0;
    format!(
        "M{x:.1} {top:.1}V{tip:.1}M{:.1} {:.1}L{x:.1} {tip:.1}L{:.1} {:.1}",
        x - 2.0,
        tip - 3.0,
        x + 2.0,
        tip - 3.0
    )
}

/// The x of arrow `k` of `n` spread evenly over the arch between `from` and `to`
/// (fractions of the span).
fn spread(k: usize, n: usize, from: f64, to: f64) -> f64 {
    let t = if n <= 1 { 0.5 } else { k as f64 / (n - 1) as f64 };
    ARCH_X0 + (ARCH_X1 - ARCH_X0) * (from + (to - from) * t)
}

/// The dead load's light arrows, as SVG path data.
fn light_arrows() -> String {
    (0..LIGHT_ARROWS).map(|k| arrow(spread(k, LIGHT_ARROWS, 0.0, 1.0), 6.0)).collect()
}

/// What `kind` adds to the dead load, as the pictogram's heavy arrows (SVG path data).
/// `panels` places a heavier panel point.
fn heavy_arrows(kind: &CaseKind, panels: usize) -> String {
    match *kind {
        CaseKind::Dead
        | CaseKind::Other
        | CaseKind::Temperature { .. }
        | CaseKind::DeckTemperature { .. }
        | CaseKind::SpringingMovement { .. }
        | CaseKind::Braking { .. }
        | CaseKind::Erection => String::new(),
        CaseKind::FullSpan { .. } | CaseKind::Placement { .. } => {
            (0..6).map(|k| arrow(spread(k, 6, 0.0, 1.0), 1.0)).collect()
        }
        CaseKind::Quarter { quarter, .. } => {
            let q = quarter.clamp(1, 4) as f64;
            (0..2).map(|k| arrow(spread(k, 2, (q - 1.0) / 4.0, q / 4.0), 1.0)).collect()
        }
        CaseKind::Vehicle { along, .. } => arrow(ARCH_X0 + (ARCH_X1 - ARCH_X0) * along.clamp(0.0, 1.0), 0.5),
        CaseKind::HalfSpan { half, .. } => {
            let (from, to) = match half {
                Half::Left => (0.0, 0.5),
                Half::Right => (0.5, 1.0),
            };
            (0..4).map(|k| arrow(spread(k, 4, from, to), 1.0)).collect()
        }
        CaseKind::DoubledPanel { panel, .. } => {
            let t = if panels == 0 { 0.5 } else { panel as f64 / panels as f64 };
            arrow(ARCH_X0 + (ARCH_X1 - ARCH_X0) * t, 0.5)
        }
    }
}

/// SVG path data of the pictograms' arch, raised by `lift` (an envelope band beside it).
fn arch_path(lift: f64) -> String {
    format!(
        "M{ARCH_X0} {:.1}Q{:.1} {:.1} {ARCH_X1} {:.1}",
        PICTO_H - 2.0 - lift,
        0.5 * (ARCH_X0 + ARCH_X1),
        DECK_Y - 4.0 - lift,
        PICTO_H - 2.0 - lift
    )
}

/// The small drawing of a case's load pattern: deck, arch, light dead-load arrows and
/// the case's heavier arrows. Decorative: the button's words say the same.
/// `heavy`: the case's heavier arrows (`heavy_arrows`); they follow the signal, so a
/// heavier panel point moved by a panel-count edit moves its arrow and builds nothing.
#[component]
fn Pictogram(#[prop(into)] heavy: Signal<String>) -> impl IntoView {
    let light = light_arrows();
    let arch = arch_path(0.0);
    view! {
        <svg class="picto" aria-hidden="true" focusable="false" width=PICTO_W height=PICTO_H
            viewBox=format!("0 0 {PICTO_W} {PICTO_H}")>
            <path class="picto-structure" d=format!("M1 {DECK_Y}H{}", PICTO_W - 1.0) />
            <path class="picto-structure" d=arch />
            <path class="picto-light" d=light />
            <path class="picto-heavy" d=move || heavy.get() />
        </svg>
    }
}

/// The named traffic patterns the picker offers besides the analysis's own cases
/// (`arch::cases::Pattern`; the left half is one of the analysis's own), each with the
/// case kind its pictogram and title are drawn from (numbers unused).
fn patterns() -> Vec<(Pattern, CaseKind)> {
    let strip = CaseKind::FullSpan { line_load: 0.0, x0: 0.0, x1: 0.0 };
    let mut out = vec![
        (Pattern::FullSpan, strip),
        (
            Pattern::Half(Half::Right),
            CaseKind::HalfSpan { half: Half::Right, intensity: 0.0, line_load: 0.0, x0: 0.0, x1: 0.0 },
        ),
    ];
    out.extend(
        (1..=4).map(|q| {
            (Pattern::Quarter(q), CaseKind::Quarter { quarter: q, line_load: 0.0, x0: 0.0, x1: 0.0 })
        }),
    );
    out
}

/// What a case button is built from: the row's `<For>` is keyed on the case's place and
/// kind; its id, words, tooltip and pictogram's heavier arrows follow the case in place
/// (a panel-count edit moves the heavier panel, which changes all four, and building
/// that button again, its pictogram with it, was most of the row's work per edit).
#[derive(Clone, PartialEq, Eq, Hash)]
struct CaseButton {
    index: usize,
    kind: std::mem::Discriminant<CaseKind>,
}

/// The envelope's pictogram: deck and arch with a band either side of the rib.
#[component]
fn EnvelopePictogram() -> impl IntoView {
    let arch = arch_path;
    view! {
        <svg class="picto" aria-hidden="true" focusable="false" width=PICTO_W height=PICTO_H
            viewBox=format!("0 0 {PICTO_W} {PICTO_H}")>
            <path class="picto-structure" d=format!("M1 {DECK_Y}H{}", PICTO_W - 1.0) />
            <path class="picto-heavy" d=arch(2.5) />
            <path class="picto-structure" d=arch(0.0) />
            <path class="picto-light" d=arch(-2.5) />
        </svg>
    }
}

/// The sizes button's pictogram (a style of its own): the rib drawn
/// light and heavy (its left part heavier, in another ink), as the view strokes members
/// by how much they are used, and a block under each springing.
#[component]
fn SizesPictogram() -> impl IntoView {
    let arch = arch_path(0.0);
    let block = |x: f64| format!("M{:.1} {:.1}h5v3.5h-5Z", x - 2.5, PICTO_H - 3.5);
    view! {
        <svg class="picto" aria-hidden="true" focusable="false" width=PICTO_W height=PICTO_H
            viewBox=format!("0 0 {PICTO_W} {PICTO_H}")>
            <path class="picto-structure" d=format!("M1 {DECK_Y}H{}", PICTO_W - 1.0) />
            <path d=arch fill="none" stroke="#2f6db5" stroke-width="1.4" />
            <path d=arch_path(0.0) fill="none" stroke="#b8560f" stroke-width="3" stroke-dasharray="15 200" />
            <path d=block(ARCH_X0) fill="#b9b4aa" stroke="#8c7b5a" stroke-width="0.8" />
            <path d=block(ARCH_X1) fill="#b9b4aa" stroke="#8c7b5a" stroke-width="0.8" />
        </svg>
    }
}

/// A mode button's pictogram (a style of its own): the arch at rest, light, and moved
/// in the mode's shape (an S for the antisymmetric buckled shape, a sag for the first
/// vertical vibration), in the mode ink.
#[component]
fn ModePictogram(buckled: bool) -> impl IntoView {
    let rest = arch_path(0.0);
    let (x0, x1, y0) = (ARCH_X0, ARCH_X1, PICTO_H - 2.0);
    let xm = 0.5 * (x0 + x1);
    let top = DECK_Y - 4.0;
    let moved = if buckled {
        // the left half lifted, the right half pressed down
        format!(
            "M{x0} {y0}C{:.1} {:.1} {:.1} {:.1} {xm:.1} {:.1}S{:.1} {:.1} {x1} {y0}",
            x0 + 4.0,
            top - 10.0,
            xm - 8.0,
            top - 2.0,
            top + 5.0,
            x1 - 4.0,
            top + 14.0
        )
    } else {
        format!("M{x0} {y0}Q{xm:.1} {:.1} {x1} {y0}", top + 9.0)
    };
    view! {
        <svg class="picto" aria-hidden="true" focusable="false" width=PICTO_W height=PICTO_H
            viewBox=format!("0 0 {PICTO_W} {PICTO_H}")>
            <path class="picto-structure" d=format!("M1 {DECK_Y}H{}", PICTO_W - 1.0) />
            <path class="picto-light" d=rest stroke-dasharray="2 2" />
            <path d=moved fill="none" stroke="#2a6e3f" stroke-width="1.8" />
        </svg>
    }
}

/// The vehicle button's pictogram (a style of its own: the vehicle outlined on the deck
/// with a two-headed arrow over it, as it can be moved along): deck, arch and the light
/// dead-load arrows as in the other pictograms.
#[component]
fn VehiclePictogram() -> impl IntoView {
    let light = light_arrows();
    let arch = arch_path(0.0);
    // body with its front (right) corner cut, wheels on the deck line
    let (x0, x1, top, bottom) = (12.0, 25.0, DECK_Y - 9.5, DECK_Y - 3.5);
    let body = format!("M{x0} {bottom}H{x1}V{:.1}L{:.1} {top}H{x0}Z", top + 2.5, x1 - 2.5);
    let travel = format!(
        "M{:.1} 2.5H{:.1}M{:.1} 0.8L{:.1} 2.5L{:.1} 4.2M{:.1} 0.8L{:.1} 2.5L{:.1} 4.2",
        x0 - 4.0,
        x1 + 4.0,
        x0 - 2.3,
        x0 - 4.0,
        x0 - 2.3,
        x1 + 2.3,
        x1 + 4.0,
        x1 + 2.3
    );
    view! {
        <svg class="picto" aria-hidden="true" focusable="false" width=PICTO_W height=PICTO_H
            viewBox=format!("0 0 {PICTO_W} {PICTO_H}")>
            <path class="picto-structure" d=format!("M1 {DECK_Y}H{}", PICTO_W - 1.0) />
            <path class="picto-structure" d=arch />
            <path class="picto-light" d=light />
            <path d=body fill="#ffffff" stroke="#1f2a33" stroke-width="1.3" stroke-linejoin="round" />
            <circle cx=x0 + 2.5 cy=DECK_Y - 2.0 r="1.6" fill="#ffffff" stroke="#1f2a33" stroke-width="1.1" />
            <circle cx=x1 - 2.5 cy=DECK_Y - 2.0 r="1.6" fill="#ffffff" stroke="#1f2a33" stroke-width="1.1" />
            <path d=travel fill="none" stroke="#6a4c93" stroke-width="1.2" stroke-linecap="round" />
        </svg>
    }
}

/// The pictogram of one of the other actions (a style of its own): the arch and deck,
/// with a thermometer for temperature (filled dark for a rise, open for a fall), the deck
/// drawn heavy for a deck-rib difference, outward and downward arrows at the springings
/// for their movement, an arrow along the deck for braking, the bare rib alone for
/// erection.
#[component]
fn ActionPictogram(kind: CaseKind) -> impl IntoView {
    let arch = arch_path(0.0);
    let deck = format!("M1 {DECK_Y}H{}", PICTO_W - 1.0);
    let thermometer = |warm: bool| {
        view! {
            <path class="picto-structure" d="M40 2.5V9" />
            <circle cx="40" cy="10.5" r="2.2" class=if warm { "picto-fill" } else { "picto-open" } />
        }
    };
    let extra = match kind {
        CaseKind::Temperature { delta_t } => {
            view! { <path class="picto-structure" d=deck.clone() />{thermometer(!delta_t.is_sign_negative())} }.into_any()
        }
        CaseKind::DeckTemperature { delta_t } => {
            view! { <path class="picto-heavy" d=deck.clone() />{thermometer(!delta_t.is_sign_negative())} }.into_any()
        }
        CaseKind::SpringingMovement { .. } => view! {
            <path class="picto-structure" d=deck.clone() />
            <path class="picto-heavy" d=format!("M{ARCH_X0} {y}l-4 0m1.5 -1.5l-1.5 1.5l1.5 1.5M{ARCH_X1} {y}l4 0m-1.5 -1.5l1.5 1.5l-1.5 1.5",
                y = PICTO_H - 3.0) />
        }
        .into_any(),
        CaseKind::Braking { .. } => view! {
            <path class="picto-structure" d=deck.clone() />
            <path class="picto-heavy" d=format!("M14 {y}H36m-3 -2.5l3 2.5l-3 2.5", y = DECK_Y - 4.0) />
        }
        .into_any(),
        _ => view! { <g></g> }.into_any(),
    };
    let rib = if kind == CaseKind::Erection { "picto-heavy" } else { "picto-structure" };
    view! {
        <svg class="picto" aria-hidden="true" focusable="false" width=PICTO_W height=PICTO_H
            viewBox=format!("0 0 {PICTO_W} {PICTO_H}")>
            <path class=rib d=arch />
            {extra}
        </svg>
    }
}

/// One button per load case of the analysis, then the named traffic patterns, the other
/// actions, the traffic envelope and the vehicle; the chosen one (aria-pressed) is what
/// the drawings and the results show; its description, in the chosen units, is written
/// under the row. The extra cases a choice adds come after the analysis's own, so the
/// own buttons stay as they are while the vehicle moves.
#[component]
pub fn ScenarioButtons() -> impl IntoView {
    let state = expect_context::<AppState>();
    // the analysis's own cases (the extra cases a pattern or a placement adds come after)
    let kinds = Memo::new(move |_| {
        let own = state.settled_valid.with(|v| v.as_ref().map_or(0, |v| standard_cases(v).len() + 1));
        state
            .settled_analysis
            .with(|a| {
                a.as_ref()
                    .map(|a| a.load_cases.iter().take(own).map(|c| c.description).collect::<Vec<_>>())
                    .ok()
            })
            .unwrap_or_default()
    });
    let vehicle_chosen = Memo::new(move |_| state.vehicle.with(Option::is_some));
    let plain = move || {
        state.pattern.with(Option::is_none)
            && state.action.with(Option::is_none)
            && !state.envelope.get()
            && !state.sizes.get()
            && state.mode_view.get() == ModeView::Off
            && !vehicle_chosen.get()
    };
    let panels = Memo::new(move |_| state.settled_design.with(|d| d.panels));
    // the row is keyed on each button's place and kind of case: an edit that changes
    // only numbers or the panel count rebuilds no button
    let own_buttons = Memo::new(move |_| {
        kinds.with(|kinds| {
            kinds
                .iter()
                .enumerate()
                .map(|(index, kind)| CaseButton { index, kind: std::mem::discriminant(kind) })
                .collect::<Vec<_>>()
        })
    });
    let buttons = view! {
        <For
            each=move || own_buttons.get()
            key=CaseButton::clone
            children=move |button| {
                let i = button.index;
                let kind = Memo::new(move |_| kinds.with(|kinds| kinds.get(i).copied()));
                let id = move || kind.get().map(|k| format!("case-{}", k.id())).unwrap_or_default();
                let title = move || kind.get().map(|k| k.title()).unwrap_or_default();
                let heavy = Memo::new(move |_| kind.get().map(|k| heavy_arrows(&k, panels.get())).unwrap_or_default());
                let pressed = move || (plain() && state.case.get() == i).to_string();
                let described = move || {
                    let units: Units = state.units.get();
                    kind.get().map(|k| k.describe(units)).unwrap_or_default()
                };
                view! {
                    <button
                        type="button"
                        class="scenario"
                        id=id
                        data-case-index=i.to_string()
                        aria-pressed=pressed
                        title=described
                        on:click=move |_| state.choose_case(i)
                    >
                        <Pictogram heavy=heavy />
                        <span>{title}</span>
                    </button>
                }
            }
        />
    };
    // the patterns' pictograms place no panel: built once
    let pattern_buttons = patterns()
        .into_iter()
        .map(|(pattern, kind)| {
            let pressed = move || (!state.envelope.get() && state.pattern.get() == Some(pattern)).to_string();
            view! {
                <button
                    type="button"
                    class="scenario"
                    id=format!("case-{}", kind.id())
                    aria-pressed=pressed
                    on:click=move |_| {
                        state.choose_case(0);
                        state.pattern.set(Some(pattern));
                    }
                >
                    <Pictogram heavy=heavy_arrows(&kind, 0) />
                    <span>{kind.title()}</span>
                </button>
            }
        })
        .collect_view();
    let envelope_button = view! {
        <button
            type="button"
            class="scenario"
            id="case-envelope"
            aria-pressed=move || state.envelope.get().to_string()
            title="The largest and smallest member forces under the traffic anywhere on the deck"
            on:click=move |_| {
                state.choose_case(0);
                state.envelope.set(true);
            }
        >
            <EnvelopePictogram />
            <span>"Envelope"</span>
        </button>
    };
    let sizes_button = view! {
        <button
            type="button"
            class="scenario"
            id="case-sizes"
            aria-pressed=move || state.sizes.get().to_string()
            title="Each member group sized from the ultimate envelopes, its utilisation on the elevation, the quantities and the thrust blocks"
            on:click=move |_| {
                state.choose_case(0);
                state.sizes.set(true);
            }
        >
            <SizesPictogram />
            <span>"Sizes"</span>
        </button>
    };
    let mode_button = move |view: ModeView, id: &'static str, words: &'static str, title: &'static str| {
        view! {
            <button
                type="button"
                class="scenario"
                id=id
                aria-pressed=move || (state.mode_view.get() == view).to_string()
                title=title
                on:click=move |_| state.choose_mode(view)
            >
                <ModePictogram buckled=view == ModeView::Buckled />
                <span>{words}</span>
            </button>
        }
    };
    let mode_buttons = view! {
        {mode_button(ModeView::Buckled, "case-buckling", "Buckling",
            "The arch's lowest buckled shape under the dead load, with its critical load factor alpha_cr")}
        {mode_button(ModeView::Vibration, "case-vibration", "Vibration",
            "The first mode of free vibration with the dead load's masses, with its frequency")}
    };
    let action_kinds = Memo::new(move |_| {
        state.settled_design.with(|d| action_cases(d).into_iter().map(|c| c.kind).collect::<Vec<_>>())
    });
    // keyed on place, id and words as the case buttons are (a pictogram follows from the
    // id): the tooltips follow the numbers without rebuilding a button
    let action_buttons = view! {
        <For
            each=move || {
                action_kinds.with(|kinds| {
                    kinds.iter().enumerate().map(|(i, k)| (i, k.id(), k.title())).collect::<Vec<_>>()
                })
            }
            key=Clone::clone
            children=move |(i, id, title)| {
                let kind_of = move || action_kinds.with(|kinds| kinds.get(i).copied());
                let picto = kind_of().map(|kind| view! { <ActionPictogram kind /> });
                let described = move || {
                    let units = state.units.get();
                    kind_of().map(|k| k.describe(units)).unwrap_or_default()
                };
                let chosen = id.clone();
                let pressed = move || {
                    (!state.envelope.get() && state.action.with(|a| a.as_deref() == Some(chosen.as_str())))
                        .to_string()
                };
                view! {
                    <button
                        type="button"
                        class="scenario action"
                        id=format!("case-{id}")
                        aria-pressed=pressed
                        title=described
                        on:click=move |_| {
                            state.choose_case(0);
                            state.action.set(Some(id.clone()));
                        }
                    >
                        {picto}
                        <span>{title}</span>
                    </button>
                }
            }
        />
    };
    let vehicle_button = move || {
        view! {
            <button
                type="button"
                class="scenario"
                id="case-vehicle"
                aria-pressed=move || vehicle_chosen.get().to_string()
                title="The load model's vehicle on the deck: drag it along the elevation, or focus the elevation and use the left and right arrow keys (Shift: one panel)"
                on:click=move |_| state.choose_vehicle()
            >
                <VehiclePictogram />
                <span>"Vehicle"</span>
            </button>
        }
    };
    let described = move || {
        let units = state.units.get();
        match state.mode_view.get() {
            ModeView::Buckled => {
                return "the arch's lowest buckled shape under the dead load (posts and diagonals held straight: \
                        their own buckling is their member check's), in its plane; its size is not to scale"
                    .to_string()
            }
            ModeView::Vibration => {
                return "the first mode of free vibration with the dead load's masses, in the arch plane; its \
                        size is not to scale"
                    .to_string()
            }
            ModeView::Off => {}
        }
        if state.sizes.get() {
            return "every member group sized from the ultimate envelopes, one section per group, drawn by how \
                    much of its resistance it uses; the thrust blocks to scale"
                .to_string();
        }
        if state.envelope.get() && state.picked.with(Option::is_none) {
            return "the largest and smallest forces of every member under the load model's traffic placed where \
                    it is worst; click a member for the placement that governs it"
                .to_string();
        }
        state
            .settled_analysis
            .with(|a| {
                let a = a.as_ref().ok()?;
                Some(a.load_cases.get(state.case.get())?.description.describe(units))
            })
            .unwrap_or_default()
    };
    view! {
        <section class="scenarios" aria-labelledby="scenarios-title">
            <h2 id="scenarios-title">"Load case"</h2>
            <div class="scenario-row" role="group" aria-labelledby="scenarios-title">
                {buttons}{pattern_buttons}{action_buttons}{envelope_button}{sizes_button}{mode_buttons}{vehicle_button}
            </div>
            <p class="case-description" id="case-description">{described}</p>
        </section>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The heavier panel's arrow stands over its panel point: panel 3 of 12 is a quarter
    /// of the way along the arch (5 + 38 / 4 = 14.5 in the pictogram).
    #[test]
    fn the_heavier_panel_arrow_stands_over_its_panel_point() {
        let (light, heavy) =
            (light_arrows(), heavy_arrows(&CaseKind::DoubledPanel { panel: 3, load: 900.0, x: 56.6 }, 12));
        assert!(heavy.starts_with("M14.5 "), "{heavy}");
        assert_eq!(light.matches('M').count(), 2 * LIGHT_ARROWS, "two strokes per arrow: shaft, head");
        let none = heavy_arrows(&CaseKind::Dead, 12);
        assert!(none.is_empty());
        // a left half load: four arrows, all left of mid-span (x = 24)
        let left = heavy_arrows(
            &CaseKind::HalfSpan { half: Half::Left, intensity: 5.0, line_load: 55.0, x0: 30.0, x1: 83.2 },
            12,
        );
        let xs: Vec<f64> =
            left.split('M').filter_map(|p| p.split(' ').next()?.parse().ok()).step_by(2).collect();
        assert_eq!(xs.len(), 4, "{left}");
        assert!(xs.iter().all(|x| *x <= 24.1), "{xs:?}");
    }
}
