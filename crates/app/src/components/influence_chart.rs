//! The influence-line chart: for the line picked (a member clicked on the elevation, or
//! a springing force chosen with the buttons above the chart), the frame model's
//! influence line along the deck (`arch::influence`, the unit load every
//! `arch::traffic::TRAFFIC_STEP` m and at every deck node, as the traffic report uses),
//! drawn with plotters on a canvas: the adverse parts shaded (the ordinates of the sign
//! of the extreme shown), the governing placement of that extreme marked (the loaded
//! stretches as a bar along the top, each axle as a line down to the curve).
//!
//! Axes speak the user's units: the load's position in m or ft; the ordinate in kN per
//! kN (kip per kip, the same number) for forces, in m or ft (kNm per kN) for moments.
//! The canvas publishes the peak (the ordinate of largest magnitude, SI) and its x (m)
//! as `data-peak-value` and `data-peak-x`, the line as `data-line`, for tests.

use crate::canvas;
use crate::components::envelope::settled_report;
use crate::format::{Quantity, Units};
use crate::state::AppState;
use leptos::html::Canvas;
use leptos::prelude::*;
use plotters::prelude::*;
use plotters_canvas::CanvasBackend;
use springline_statics::arch::cases::DeckLoad;
use springline_statics::arch::influence::{influence_of, ArchInfluence, ArchLine};
use springline_statics::arch::traffic::{placement_case, TRAFFIC_STEP};
use springline_statics::arch::validate::ValidDesign;
use springline_statics::scene::Ink;
use springline_statics::Design;
use std::sync::Arc;

/// The influence lines of one design's frame model, compared by identity (the memo
/// holding them must not compare every ordinate).
#[derive(Clone)]
struct Lines(Arc<(Design, ArchInfluence)>);

impl PartialEq for Lines {
    fn eq(&self, other: &Self) -> bool {
        Arc::ptr_eq(&self.0, &other.0)
    }
}

/// The position and value of the ordinate of largest magnitude (the first of equals),
/// units of the inputs; `None` for an empty line.
pub fn peak(x: &[f64], eta: &[f64]) -> Option<(f64, f64)> {
    x.iter().zip(eta).fold(None, |best: Option<(f64, f64)>, (&x, &e)| match best {
        Some((_, b)) if b.abs() >= e.abs() => best,
        _ => Some((x, e)),
    })
}

/// What the chart draws, in SI: positions (m), ordinates, whether the line is a moment
/// (kNm per kN), the governing placement's loaded stretches and axle positions (m).
#[derive(Debug, Clone, PartialEq)]
pub struct ChartData {
    /// The line's name.
    pub line: String,
    /// Its header: what it is, sign and units.
    pub header: String,
    /// Unit load positions, m.
    pub x: Vec<f64>,
    /// Ordinates per unit load.
    pub eta: Vec<f64>,
    /// A moment line (kNm per kN) rather than a force line (kN per kN).
    pub moment: bool,
    /// Loaded stretches of the extreme's uniform load, m.
    pub loaded: Vec<(f64, f64)>,
    /// Axle positions of the extreme's vehicle, m.
    pub axles: Vec<f64>,
    /// The extreme shown is the largest (adverse = positive ordinates).
    pub largest: bool,
}

/// The colour of an opaque ink of our palette (`Ink::css`, `#rrggbb`).
pub(crate) fn rgb(ink: Ink) -> RGBColor {
    let hex = ink.css().trim_start_matches('#');
    let part = |i: usize| hex.get(i..i + 2).and_then(|h| u8::from_str_radix(h, 16).ok()).unwrap_or(0);
    RGBColor(part(0), part(2), part(4))
}

/// Draws `data` on `el` in `units`; an error in words (never a panic).
fn draw(el: &web_sys::HtmlCanvasElement, data: &ChartData, units: Units) -> Result<(), String> {
    let Some(surface) = canvas::prepare(el) else { return Ok(()) };
    // plotters draws in backing-store pixels: undo the CSS-pixel scale, scale sizes instead
    let dpr = el.width() as f64 / surface.width.max(1.0);
    let _ = surface.ctx.set_transform(1.0, 0.0, 0.0, 1.0, 0.0, 0.0);
    let px = |v: f64| (v * dpr).round() as u32;
    let root = CanvasBackend::with_canvas_object(el.clone()).ok_or("no canvas context")?.into_drawing_area();
    root.fill(&rgb(Ink::Background)).map_err(|e| e.to_string())?;
    let sx = |x: f64| units.to_shown(Quantity::Length, x);
    let sy = |e: f64| if data.moment { units.to_shown(Quantity::Length, e) } else { e };
    let (x0, x1) = (data.x.first().copied().unwrap_or(0.0), data.x.last().copied().unwrap_or(1.0));
    let lo = data.eta.iter().copied().fold(0.0, f64::min);
    let hi = data.eta.iter().copied().fold(0.0, f64::max);
    let pad = 0.12 * (hi - lo).max(1e-9);
    let (y0, y1) = (sy(lo - pad), sy(hi + pad));
    let font = |size: f64, ink: Ink| ("sans-serif", size * dpr).into_font().color(&rgb(ink));
    let y_unit = if data.moment {
        format!("{} per {}", units.label(Quantity::Moment), units.label(Quantity::Force))
    } else {
        format!("{} per {}", units.label(Quantity::Force), units.label(Quantity::Force))
    };
    let mut chart = ChartBuilder::on(&root)
        .margin(px(10.0))
        .x_label_area_size(px(38.0))
        .y_label_area_size(px(62.0))
        .build_cartesian_2d(sx(x0)..sx(x1), y0.min(y1)..y1.max(y0))
        .map_err(|e| e.to_string())?;
    chart
        .configure_mesh()
        .x_desc(format!("position of the unit load along the deck ({})", units.label(Quantity::Length)))
        .y_desc(format!("ordinate ({y_unit})"))
        .label_style(font(11.0, Ink::Secondary))
        .axis_desc_style(font(12.0, Ink::Text))
        .bold_line_style(rgb(Ink::Concrete).mix(0.35))
        .light_line_style(TRANSPARENT)
        .x_labels(10)
        .y_labels(6)
        .x_label_formatter(&|v| format!("{v:.0}"))
        .draw()
        .map_err(|e| e.to_string())?;
    let points = || data.x.iter().zip(&data.eta).map(|(&x, &e)| (sx(x), sy(e)));
    // the adverse part: ordinates of the extreme's sign
    let (adverse_ink, sign) = if data.largest { (Ink::Tension, 1.0) } else { (Ink::Compression, -1.0) };
    chart
        .draw_series(AreaSeries::new(
            points().map(|(x, e)| (x, if sign * e > 0.0 { e } else { 0.0 })),
            0.0,
            rgb(adverse_ink).mix(0.28),
        ))
        .map_err(|e| e.to_string())?;
    chart
        .draw_series(LineSeries::new(
            [(sx(x0), 0.0), (sx(x1), 0.0)],
            rgb(Ink::Secondary).stroke_width(px(1.0)),
        ))
        .map_err(|e| e.to_string())?;
    chart
        .draw_series(LineSeries::new(points(), rgb(Ink::Text).stroke_width(px(2.0))))
        .map_err(|e| e.to_string())?;
    // the governing placement: loaded stretches along the top, axles down to the curve
    let top = y1.max(y0);
    let band = 0.05 * (y1 - y0).abs();
    chart
        .draw_series(data.loaded.iter().map(|&(a, b)| {
            Rectangle::new([(sx(a), top - band), (sx(b), top)], rgb(Ink::Load).mix(0.55).filled())
        }))
        .map_err(|e| e.to_string())?;
    let at = |x: f64| {
        let k = data.x.partition_point(|p| *p < x).min(data.x.len().saturating_sub(1));
        match (k.checked_sub(1).and_then(|i| data.x.get(i)), data.x.get(k)) {
            (Some(&xa), Some(&xb)) if xb > xa => {
                let t = ((x - xa) / (xb - xa)).clamp(0.0, 1.0);
                data.eta[k - 1] + t * (data.eta[k] - data.eta[k - 1])
            }
            _ => data.eta.get(k).copied().unwrap_or(0.0),
        }
    };
    let load = rgb(Ink::Load);
    chart
        .draw_series(
            data.axles.iter().map(|&x| {
                PathElement::new(vec![(sx(x), top), (sx(x), sy(at(x)))], load.stroke_width(px(2.0)))
            }),
        )
        .map_err(|e| e.to_string())?;
    chart
        .draw_series(data.axles.iter().map(|&x| Circle::new((sx(x), sy(at(x))), px(3.5), load.filled())))
        .map_err(|e| e.to_string())?;
    root.present().map_err(|e| e.to_string())?;
    if let Some((x, v)) = peak(&data.x, &data.eta) {
        let _ = el.set_attribute("data-peak-value", &format!("{v}"));
        let _ = el.set_attribute("data-peak-x", &format!("{x}"));
    }
    let _ = el.set_attribute("data-line", &data.line);
    Ok(())
}

/// The springing lines the buttons offer: (line name, words).
const SPRINGINGS: [(&str, &str); 6] = [
    ("thrust", "H left"),
    ("thrust-right", "H right"),
    ("v-left", "V left"),
    ("v-right", "V right"),
    ("m-left", "M left"),
    ("m-right", "M right"),
];

/// The chart panel: springing buttons, the line's title and its traffic extremes, the
/// canvas.
#[component]
pub fn InfluenceChart() -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    let error = RwSignal::new(None::<String>);
    // the frame model's influence lines, once per design while a line is picked
    let active = Memo::new(move |_| state.picked.with(Option::is_some) && !state.dragging.get());
    let lines = Memo::new(move |_| {
        if !active.get() {
            return None;
        }
        let design = state.settled_design.get();
        let valid = ValidDesign::new(&design).ok()?;
        let generated = springline_statics::frame_model(&valid);
        let inf = influence_of(generated, Some(TRAFFIC_STEP)).ok()?;
        Some(Lines(Arc::new((design, inf))))
    });
    let data = Memo::new(move |_| {
        let Lines(held) = lines.get()?;
        let (design, inf) = &*held;
        let name = state.picked.get()?;
        let largest = state.largest.get();
        let line = ArchLine::parse(&name, &inf.generated).ok()?;
        let eta = inf.ordinates(&line).ok()?;
        let (mut loaded, mut axles) = (Vec::new(), Vec::new());
        if let (Some(report), Ok(valid)) = (settled_report(state), ValidDesign::new(design)) {
            if let Some(l) = report.1.line(&name) {
                for load in placement_case(&valid, l, largest).loads {
                    match load {
                        DeckLoad::Strip { x0, x1, .. } => loaded.push((x0, x1)),
                        DeckLoad::Point { x, .. } => axles.push(x),
                        DeckLoad::PanelPoint { .. } => {}
                    }
                }
            }
        }
        Some(ChartData {
            line: name,
            header: line.header(&inf.generated),
            x: inf.lines.positions.clone(),
            eta,
            moment: matches!(
                line,
                ArchLine::Moment(..) | ArchLine::MidMoment(_) | ArchLine::SpringingMoment(..)
            ),
            loaded,
            axles,
            largest,
        })
    });
    Effect::new(move |_| {
        let _ = state.resized.get();
        let units = state.units.get();
        let Some(el) = node.get() else { return };
        match data.get() {
            Some(d) => error.set(draw(&el, &d, units).err()),
            None => {
                if let Some(s) = canvas::prepare(&el) {
                    s.ctx.set_fill_style_str(Ink::Background.css());
                    s.ctx.fill_rect(0.0, 0.0, s.width, s.height);
                }
                let _ = el.remove_attribute("data-peak-value");
            }
        }
    });
    let fixed = Memo::new(move |_| {
        state.settled_analysis.with(|a| {
            a.as_ref().ok().is_some_and(|a| {
                a.frame.model.supports.iter().any(|s| s.rz && a.frame.map.springings.contains(&s.node))
            })
        })
    });
    let buttons = move || {
        SPRINGINGS
            .iter()
            .filter(|(name, _)| fixed.get() || !name.starts_with("m-"))
            .map(|&(name, words)| {
                view! {
                    <button type="button" class="small" id=format!("influence-{name}")
                        aria-pressed=move || state.picked.with(|p| p.as_deref() == Some(name)).to_string()
                        on:click=move |_| state.picked.set(Some(name.to_string()))>{words}</button>
                }
            })
            .collect_view()
    };
    let extreme_button = move |largest: bool, words: &'static str| {
        view! {
            <button type="button" class="small" id=if largest { "influence-largest" } else { "influence-smallest" }
                aria-pressed=move || (state.largest.get() == largest).to_string()
                on:click=move |_| state.largest.set(largest)>{words}</button>
        }
    };
    let title = move || match data.get() {
        Some(d) => d.header,
        None if state.picked.with(Option::is_some) => "Working out the influence line...".into(),
        None => {
            "Click a member on the elevation, or choose a springing force, for its influence line.".into()
        }
    };
    let extremes = move || {
        let units = state.units.get();
        let name = state.picked.get()?;
        let report = settled_report(state)?;
        let l = report.1.line(&name)?;
        let q =
            if name.contains("/m-") || name.starts_with("m-") { Quantity::Moment } else { Quantity::Force };
        Some(format!(
            "Characteristic traffic on it: largest {} ({}), smallest {} ({}); {}.",
            units.show(q, l.traffic_max.value),
            l.traffic_max.arrangement,
            units.show(q, l.traffic_min.value),
            l.traffic_min.arrangement,
            if state.largest.get() {
                "shaded where a load raises it"
            } else {
                "shaded where a load lowers it"
            }
        ))
    };
    view! {
        <section class="influence-panel" id="influence-panel" aria-labelledby="influence-title">
            <div class="influence-head">
                <h3 id="influence-title">"Influence line"</h3>
                <span class="influence-springings" role="group" aria-label="Springing forces">{buttons}</span>
                <span class="influence-which" role="group" aria-label="Extreme marked">
                    "marked: the "{extreme_button(true, "largest")}{extreme_button(false, "smallest")}" effect"
                </span>
            </div>
            <p class="influence-line" id="influence-line">{title}</p>
            <p class="hint" id="influence-extremes">{extremes}</p>
            <canvas id="influence-chart" class="chart" node_ref=node
                role="img" aria-labelledby="influence-line"></canvas>
            {move || error.get().map(|e| view! { <p class="error" role="alert">{format!("The chart could not be drawn: {e}")}</p> })}
        </section>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_peak_is_the_largest_magnitude_first_of_equals() {
        assert_eq!(peak(&[0.0, 1.0, 2.0, 3.0], &[0.1, -0.7, 0.7, 0.2]), Some((1.0, -0.7)));
        assert_eq!(peak(&[], &[]), None);
    }

    #[test]
    fn palette_inks_read_as_their_colours() {
        assert_eq!(rgb(Ink::Tension), RGBColor(0x0f, 0x7c, 0x86));
        assert_eq!(rgb(Ink::Load), RGBColor(0x6a, 0x4c, 0x93));
    }
}
