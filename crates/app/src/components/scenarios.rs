//! The load case picker: one named button per load case of the analysis, each with a
//! small pictogram of its load pattern drawn from the case kind, the chosen one pressed.
//! The drawings and the results table show the chosen case. The last button puts the
//! load model's vehicle on the deck (its case joins the analysis while it is chosen, and
//! the elevation lets it be dragged along the deck).

use crate::format::Units;
use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::arch::cases::{CaseKind, Half};

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

/// The pictogram's light arrows (the dead load, in every case) and heavy arrows (what
/// the case adds), as SVG path data. `panels` places a heavier panel point.
fn arrows(kind: &CaseKind, panels: usize) -> (String, String) {
    let light: String = (0..LIGHT_ARROWS).map(|k| arrow(spread(k, LIGHT_ARROWS, 0.0, 1.0), 6.0)).collect();
    let heavy: String = match *kind {
        CaseKind::Dead | CaseKind::Other => String::new(),
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
    };
    (light, heavy)
}

/// The small drawing of a case's load pattern: deck, arch, light dead-load arrows and
/// the case's heavier arrows. Decorative: the button's words say the same.
#[component]
fn Pictogram(kind: CaseKind, panels: usize) -> impl IntoView {
    let (light, heavy) = arrows(&kind, panels);
    let arch = format!(
        "M{ARCH_X0} {:.1}Q{:.1} {:.1} {ARCH_X1} {:.1}",
        PICTO_H - 2.0,
        0.5 * (ARCH_X0 + ARCH_X1),
        DECK_Y - 4.0,
        PICTO_H - 2.0
    );
    view! {
        <svg class="picto" aria-hidden="true" focusable="false" width=PICTO_W height=PICTO_H
            viewBox=format!("0 0 {PICTO_W} {PICTO_H}")>
            <path class="picto-structure" d=format!("M1 {DECK_Y}H{}", PICTO_W - 1.0) />
            <path class="picto-structure" d=arch />
            <path class="picto-light" d=light />
            <path class="picto-heavy" d=heavy />
        </svg>
    }
}

/// The vehicle button's pictogram (a style of its own: the vehicle outlined on the deck
/// with a two-headed arrow over it, as it can be moved along): deck, arch and the light
/// dead-load arrows as in the other pictograms.
#[component]
fn VehiclePictogram() -> impl IntoView {
    let (light, _) = arrows(&CaseKind::Dead, 0);
    let arch = format!(
        "M{ARCH_X0} {:.1}Q{:.1} {:.1} {ARCH_X1} {:.1}",
        PICTO_H - 2.0,
        0.5 * (ARCH_X0 + ARCH_X1),
        DECK_Y - 4.0,
        PICTO_H - 2.0
    );
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

/// One button per load case; the chosen case (aria-pressed) is what the drawings and
/// the results show; its description, in the chosen units, is written under the row. The
/// vehicle's case (while a vehicle is on the deck) has the last button, "Vehicle", which
/// stays in its place whether or not the vehicle is chosen.
#[component]
pub fn ScenarioButtons() -> impl IntoView {
    let state = expect_context::<AppState>();
    let kinds = Memo::new(move |_| {
        state
            .analysis
            .with(|a| {
                a.as_ref()
                    .map(|a| {
                        // the vehicle's case has its own button, which moving it does not rebuild
                        let kinds = a.load_cases.iter().map(|c| c.description);
                        kinds.filter(|k| !matches!(k, CaseKind::Vehicle { .. })).collect::<Vec<_>>()
                    })
                    .ok()
            })
            .unwrap_or_default()
    });
    let vehicle_chosen = Memo::new(move |_| state.vehicle.with(Option::is_some));
    let panels = Memo::new(move |_| state.design.with(|d| d.panels));
    let buttons = move || {
        let units: Units = state.units.get();
        kinds
            .get()
            .into_iter()
            .enumerate()
            .map(|(i, kind)| {
                let pressed = move || (!vehicle_chosen.get() && state.case.get() == i).to_string();
                view! {
                    <button
                        type="button"
                        class="scenario"
                        id=format!("case-{}", kind.id())
                        data-case-index=i.to_string()
                        aria-pressed=pressed
                        title=kind.describe(units)
                        on:click=move |_| state.choose_case(i)
                    >
                        <Pictogram kind panels=panels.get() />
                        <span>{kind.title()}</span>
                    </button>
                }
            })
            .collect_view()
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
        kinds.with(|k| k.get(state.case.get()).map(|k| k.describe(units))).unwrap_or_default()
    };
    view! {
        <section class="scenarios" aria-labelledby="scenarios-title">
            <h2 id="scenarios-title">"Load case"</h2>
            <div class="scenario-row" role="group" aria-labelledby="scenarios-title">{buttons}{vehicle_button}</div>
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
        let (light, heavy) = arrows(&CaseKind::DoubledPanel { panel: 3, load: 900.0, x: 56.6 }, 12);
        assert!(heavy.starts_with("M14.5 "), "{heavy}");
        assert_eq!(light.matches('M').count(), 2 * LIGHT_ARROWS, "two strokes per arrow: shaft, head");
        let (_, none) = arrows(&CaseKind::Dead, 12);
        assert!(none.is_empty());
        // a left half load: four arrows, all left of mid-span (x = 24)
        let (_, left) = arrows(
            &CaseKind::HalfSpan { half: Half::Left, intensity: 5.0, line_load: 55.0, x0: 30.0, x1: 83.2 },
            12,
        );
        let xs: Vec<f64> =
            left.split('M').filter_map(|p| p.split(' ').next()?.parse().ok()).step_by(2).collect();
        assert_eq!(xs.len(), 4, "{left}");
        assert!(xs.iter().all(|x| *x <= 24.1), "{xs:?}");
    }
}
