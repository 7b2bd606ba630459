//! The Traffic block of the results: the load model, how the traffic is shared between
//! the ribs, and the range of the arch's thrust (left springing, whole cross-section):
//! permanent, characteristic traffic and each combination's design values, from the
//! engine's traffic envelopes of the frame model. They are worked out in the background
//! worker once the edits pause (`crate::settled`), not while a point is being dragged: the
//! block shows the last report and says it updates when the pointer lets go.

use crate::format::{Quantity, Units};
use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::arch::traffic::TrafficReport;

/// One row of the thrust table: a label and the largest and smallest values, kN (SI);
/// `min` is `None` for a single value (the permanent thrust, one cell with id `id`).
#[derive(Debug, Clone, PartialEq)]
pub struct ThrustRow {
    /// Element id stem of the row's cells (`-max`, `-min` appended).
    pub id: String,
    /// What the row is, in words.
    pub label: String,
    /// Largest value, kN.
    pub max: f64,
    /// Smallest value, kN (`None`: one value only).
    pub min: Option<f64>,
}

/// The rows of the thrust table of `report`: the permanent thrust (dead load), the
/// characteristic traffic's largest and smallest thrust, then each combination's design
/// range, all for the whole cross-section, kN, outward push positive (the engine's
/// `TrafficReport::thrust`).
pub fn thrust_rows(report: &TrafficReport) -> Vec<ThrustRow> {
    let t = &report.thrust;
    let mut rows = vec![
        ThrustRow {
            id: "traffic-permanent".into(),
            label: "Permanent (dead load)".into(),
            max: t.permanent,
            min: None,
        },
        ThrustRow {
            id: "traffic-characteristic".into(),
            label: "Traffic alone, characteristic".into(),
            max: t.traffic_max.value,
            min: Some(t.traffic_min.value),
        },
    ];
    rows.extend(t.design.iter().enumerate().map(|(i, d)| ThrustRow {
        id: format!("traffic-design-{i}"),
        label: format!("{}, design", d.combination),
        max: d.max,
        min: Some(d.min),
    }));
    rows
}

/// `v` as the table shows it: a value within rounding noise of zero next to the table's
/// largest magnitude `scale` (below 1e-9 of it; a thrust that traffic cannot lower
/// comes out as -5e-13 kN) reads 0, not in scientific notation.
pub fn for_display(v: f64, scale: f64) -> f64 {
    if v.abs() <= 1e-9 * scale.abs() {
        0.0
    } else {
        v
    }
}

/// Which arrangement of the traffic gives the largest and the smallest thrust, in words;
/// an extreme that is zero (within `for_display` of `scale`) has no arrangement: no
/// placement of the traffic moves the thrust that way.
fn governing_words(report: &TrafficReport, scale: f64) -> String {
    let t = &report.thrust;
    let part = |value: f64, arrangement: &str, sense: &str| {
        if for_display(value, scale) == 0.0 {
            format!("none (no placement {sense} the thrust)")
        } else {
            arrangement.to_string()
        }
    };
    format!(
        "Governing traffic arrangement: largest — {}; smallest — {}.",
        part(t.traffic_max.value, &t.traffic_max.arrangement, "raises"),
        part(t.traffic_min.value, &t.traffic_min.arrangement, "lowers")
    )
}

/// A value cell: shown in `units` (noise against `scale` shown as 0, `for_display`),
/// the engine's SI value in `data-value`; `span` columns wide.
fn cell(id: String, si: f64, scale: f64, units: Units, span: u8) -> impl IntoView {
    let shown = units.show(Quantity::Force, for_display(si, scale));
    view! { <td id=id colspan=span data-value=format!("{si}") data-quantity=Quantity::Force.key()>{shown}</td> }
}

/// The thrust table of `report` in `units`; `ribs` the design's rib count.
fn thrust_table(report: &TrafficReport, ribs: usize, units: Units) -> impl IntoView {
    let all_ribs = if ribs == 1 { "the one rib".to_string() } else { format!("all {ribs} ribs together") };
    let rows = thrust_rows(report);
    let scale = rows.iter().flat_map(|r| [r.max, r.min.unwrap_or(0.0)]).fold(0.0, |a: f64, v| a.max(v.abs()));
    let rows = rows
        .into_iter()
        .map(|r| {
            let cells = match r.min {
                Some(min) => view! {
                    {cell(format!("{}-max", r.id), r.max, scale, units, 1)}
                    {cell(format!("{}-min", r.id), min, scale, units, 1)}
                }
                .into_any(),
                // one value, under both headings
                None => cell(r.id, r.max, scale, units, 2).into_any(),
            };
            view! { <tr><th scope="row">{r.label}</th>{cells}</tr> }
        })
        .collect_view();
    let governing = governing_words(report, scale);
    view! {
        <table class="results traffic-table" id="traffic-thrust">
            <caption>
                {format!("Thrust H at the left springing, {all_ribs} (frame model); outward push positive")}
            </caption>
            <thead>
                <tr><td></td><th scope="col">"largest"</th><th scope="col">"smallest"</th></tr>
            </thead>
            <tbody>{rows}</tbody>
        </table>
        <p class="convention" id="traffic-governing">{governing}</p>
    }
}

/// The Traffic block of the results panel.
#[component]
pub fn TrafficResults() -> impl IntoView {
    let state = expect_context::<AppState>();
    // whether the report shown is for the design on screen
    let current =
        move || state.traffic.with(|t| t.as_ref().is_some_and(|t| state.settled_design.with(|d| *d == t.0)));
    let body = move || {
        let units = state.units.get();
        let ribs = state.design.with_untracked(|d| d.deck.ribs);
        let Some(report) = state.traffic.get() else {
            return view! { <p class="hint" id="traffic-working">"Computing the traffic envelopes..."</p> }
                .into_any();
        };
        match &report.1 {
            Ok(Some(r)) => view! {
                <p id="traffic-model"><span class="what">"Load model: "</span>{r.load_model.clone()}</p>
                <p class="hint" id="traffic-lanes">{r.lane_words.describe(units)}</p>
                <p class="hint" id="traffic-sharing">{format!("Sharing: {}", r.sharing.describe(units))}</p>
                {thrust_table(r, ribs, units)}
            }
            .into_any(),
            Ok(None) => view! { <p id="traffic-none">"No traffic report for this model."</p> }.into_any(),
            Err(e) => view! { <p class="error" id="traffic-error" role="alert">{format!("No traffic results: {e}")}</p> }
                .into_any(),
        }
    };
    view! {
        <section class="traffic-results" id="traffic-results" aria-labelledby="traffic-title"
            class:stale=move || !current() data-current=move || current().to_string()>
            <h3 id="traffic-title">"Traffic"</h3>
            <Show when=move || state.dragging.get()>
                <p class="hint" id="traffic-pending">"Shown for the design before the drag: updates when you let go."</p>
            </Show>
            <Show when=move || !state.dragging.get() && state.traffic.with(Option::is_some) && !current()>
                <p class="hint" id="traffic-updating">"Updating for the latest edit..."</p>
            </Show>
            {body}
        </section>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use springline_statics::traffic::models::ModelFamily;
    use springline_statics::traffic::TrafficDesign;
    use springline_statics::Design;
    use springline_worker::TrafficOutcome;

    /// The report the worker gives the page for `design`.
    fn traffic_of(design: &Design) -> TrafficOutcome {
        springline_worker::traffic_report(&springline_worker::validated(design))
    }

    /// The demo (EN 1991-2 LM1, three combinations): the table lists permanent,
    /// characteristic traffic and one row per combination, each value the engine's
    /// thrust envelope's; the characteristic range straddles or touches zero (traffic
    /// max >= 0 >= min, `arch::traffic::LineEnvelope`).
    #[test]
    fn the_demo_thrust_rows_are_the_engines_envelope() {
        let r = traffic_of(&Design::demo()).expect("demo analyses").expect("a frame report");
        let rows = thrust_rows(&r);
        assert_eq!(rows.len(), 2 + r.thrust.design.len());
        assert_eq!(
            r.thrust.design.len(),
            5,
            "LM1 presets: ULS gr1a, SLS characteristic, SLS frequent, ULS gr2, ULS temperature leading"
        );
        assert_eq!(rows[0].max, r.thrust.permanent);
        assert!(rows[0].max > 0.0, "dead load pushes the springing outward: {}", rows[0].max);
        assert_eq!(rows[1].max, r.thrust.traffic_max.value);
        assert_eq!(rows[1].min, Some(r.thrust.traffic_min.value));
        assert!(rows[1].max >= 0.0 && rows[1].min.is_some_and(|m| m <= 0.0));
        assert_eq!(rows[2].label, "ULS gr1a, design");
        assert_eq!(rows[2].max, r.thrust.design[0].max);
        // SLS characteristic (all factors 1.0, EN 1990 A2.4.1): G + traffic extremes
        let sls = &rows[3];
        assert!((sls.max - (rows[0].max + rows[1].max)).abs() <= 1e-9 * sls.max.abs(), "{sls:?}");
    }

    #[test]
    fn rounding_noise_reads_zero_and_real_values_stay() {
        assert_eq!(for_display(-5.551e-13, 17_171.0), 0.0);
        assert_eq!(for_display(-0.5, 17_171.0), -0.5);
        assert_eq!(for_display(8140.0, 17_171.0), 8140.0);
        // a table of zeros stays zero
        assert_eq!(for_display(0.0, 0.0), 0.0);
    }

    /// HL-93 brings its own two combinations, named after AASHTO LRFD Table 3.4.1-1.
    #[test]
    fn hl93_rows_name_its_combinations() {
        let mut d = Design::demo();
        d.traffic = TrafficDesign::preset(ModelFamily::Hl93, d.traffic.carriageway_width);
        let r = traffic_of(&d).expect("analyses").expect("report");
        let labels: Vec<String> = thrust_rows(&r).into_iter().map(|r| r.label).collect();
        assert_eq!(labels[2..], ["Strength I, design".to_string(), "Service I, design".to_string()]);
        assert!(r.load_model.contains("HL-93"), "{}", r.load_model);
    }

    /// The demo's thrust: the tandem raises it most (an adverse line everywhere, so the
    /// engine's smallest traffic thrust is rounding noise): no arrangement is named for
    /// the smallest.
    #[test]
    fn a_zero_extreme_names_no_arrangement() {
        let r = traffic_of(&Design::demo()).expect("demo analyses").expect("a frame report");
        let scale = r.thrust.design.iter().fold(0.0, |a: f64, d| a.max(d.max.abs()).max(d.min.abs()));
        assert!(r.thrust.traffic_min.value.abs() <= 1e-9 * scale, "{}", r.thrust.traffic_min.value);
        let words = governing_words(&r, scale);
        assert_eq!(
            words,
            format!(
                "Governing traffic arrangement: largest — {}; smallest — none (no placement lowers the thrust).",
                r.thrust.traffic_max.arrangement
            )
        );
    }

    /// A design the engine refuses is an error, never a panic.
    #[test]
    fn a_refused_design_is_an_error() {
        let mut d = Design::demo();
        d.traffic.carriageway_width = 2.0 * d.deck.width;
        let e = traffic_of(&d).expect_err("wider than the deck");
        assert!(e.to_string().contains("wider than the deck"), "{e}");
    }
}
