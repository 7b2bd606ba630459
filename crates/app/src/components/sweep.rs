//! "Sweep": one parameter of the design on screen over a range (or two as a grid), each
//! option analysed and (by default) sized in background workers (one per processor core,
//! each taking every n-th option), the rows drawn as they come: thrust, total steel,
//! cost index and alpha_cr against the parameter (a pair as a shaded grid per
//! quantity), the design on screen marked, options that fail shown
//! as gaps (their reason on hover), what stays fixed stated under the charts. A click on
//! a chart (or Enter on the focused chart, arrows to move) adopts that option as one undo
//! step. A progress bar follows the workers; Cancel ends them at once.
//!
//! Each chart publishes its plotting area (CSS pixels) and axis range as `data-plot-*`
//! and `data-x-*` / `data-y-*` attributes, and the options it draws as `data-count`, for
//! tests and assistive tools.

use crate::canvas;
use crate::components::influence_chart::rgb;
use crate::format::{Quantity, Units};
use crate::state::{parse_number, AppState};
use crate::worker_job::{finish_one, Job};
use leptos::html::Canvas;
use leptos::prelude::*;
use plotters::prelude::*;
use plotters_canvas::CanvasBackend;
use springline_statics::arch::sweep::{
    apply, category_names, current_value, held, option_count, parse_axis, Axis, Parameter, Share, SweepRow,
};
use springline_statics::link::permalink;
use springline_statics::scene::Ink;
use springline_statics::units::round_for_display;
use springline_statics::Design;
use springline_worker::{Reply, Request};

/// The parameters offered: the parameter, its words, and the quantity its range is typed
/// in (`None` for a category: every value is swept).
const PARAMETERS: [(Parameter, &str, Option<Quantity>); 6] = [
    (Parameter::RiseRatio, "rise / span", Some(Quantity::Ratio)),
    (Parameter::Panels, "panels", Some(Quantity::Count)),
    (Parameter::SpringingLevel, "springing level (both move)", Some(Quantity::Length)),
    (Parameter::Ribs, "ribs", Some(Quantity::Count)),
    (Parameter::RibSystem, "rib system", None),
    (Parameter::FormBasis, "form basis", None),
];

/// The quantities charted: id, title, quantity, and the row's value.
type Pick = fn(&SweepRow) -> Option<f64>;
const CHARTS: [(&str, &str, Quantity, Pick); 4] = [
    ("thrust", "greatest design thrust (ULS)", Quantity::Force, |r| r.thrust_range.map(|t| t[1])),
    ("steel", "steel", Quantity::Mass, |r| r.steel),
    ("cost", "cost index", Quantity::Count, |r| r.cost_index),
    ("alpha", "alpha_cr of the arch", Quantity::Ratio, |r| r.alpha_cr),
];

fn parameter_of(key: &str) -> Option<Parameter> {
    Parameter::ALL.iter().find(|(_, k)| *k == key).map(|(p, _)| *p)
}

fn words_of(p: Parameter) -> &'static str {
    PARAMETERS.iter().find(|(q, _, _)| *q == p).map_or("?", |(_, w, _)| w)
}

fn quantity_of(p: Parameter) -> Option<Quantity> {
    PARAMETERS.iter().find(|(q, _, _)| *q == p).and_then(|(_, _, q)| *q)
}

/// A sensible range for `p` around the design on screen (SI): from, to, count.
fn default_range(p: Parameter, design: &Design) -> (f64, f64, usize) {
    match p {
        Parameter::RiseRatio => (0.12, 0.3, 10),
        Parameter::Panels => (8.0, 20.0, 7),
        Parameter::SpringingLevel => {
            (design.springing_left_level - 8.0, design.springing_left_level + 4.0, 7)
        }
        Parameter::Ribs => (1.0, 4.0, 4),
        Parameter::RibSystem => (0.0, 2.0, 3),
        Parameter::FormBasis => (0.0, 1.0, 2),
    }
}

/// The range inputs of one axis (text as typed, in display units).
#[derive(Clone, Copy)]
struct AxisInputs {
    key: RwSignal<String>,
    from: RwSignal<String>,
    to: RwSignal<String>,
    count: RwSignal<String>,
}

impl AxisInputs {
    fn new(key: &str) -> AxisInputs {
        AxisInputs {
            key: RwSignal::new(key.to_string()),
            from: RwSignal::new(String::new()),
            to: RwSignal::new(String::new()),
            count: RwSignal::new(String::new()),
        }
    }

    /// Fills the range with the parameter's default around `design`.
    fn reset(&self, design: &Design, units: Units) {
        let Some(p) = parameter_of(&self.key.get_untracked()) else { return };
        let (a, b, n) = default_range(p, design);
        let q = quantity_of(p).unwrap_or(Quantity::Count);
        let shown = |v: f64| {
            let t = format!("{:.4}", units.to_shown(q, v));
            t.trim_end_matches('0').trim_end_matches('.').to_string()
        };
        self.from.set(shown(a));
        self.to.set(shown(b));
        self.count.set(n.to_string());
    }

    /// The engine's axis from the inputs, or what is wrong in words.
    fn axis(&self, units: Units) -> Result<Option<Axis>, String> {
        let key = self.key.get_untracked();
        let Some(p) = parameter_of(&key) else { return Ok(None) };
        let spec = match (quantity_of(p), category_names(p)) {
            (_, Some(names)) => format!("{key}={}", names.join(",")),
            (Some(q), None) => {
                let read = |s: RwSignal<String>, what: &str| {
                    parse_number(&s.get_untracked()).map_err(|e| format!("{} {what}: {e}", words_of(p)))
                };
                let from = units.to_si(q, read(self.from, "from")?);
                let to = units.to_si(q, read(self.to, "to")?);
                let count = read(self.count, "count")?;
                format!("{key}={from}:{to}:{count}")
            }
            (None, None) => return Ok(None),
        };
        parse_axis(&spec).map(Some).map_err(|e| e.to_string())
    }
}

/// At most this many workers share a sweep: one per processor core the browser reports,
/// each taking every n-th option (`arch::sweep::Share`). More would each load the engine
/// for a smaller share and hold its memory.
const MOST_SHARES: usize = 4;

/// How often the charts follow a running sweep's rows.
const CHART_EVERY: std::time::Duration = std::time::Duration::from_millis(250);

/// A sweep on the page: the design it varies, its axes, the rows so far (in row order,
/// with no gap: a row that comes ahead of one still being worked out waits).
#[derive(Clone, PartialEq)]
struct Run {
    base: Design,
    axes: Vec<Axis>,
    rows: Vec<SweepRow>,
    /// Rows that came ahead of a row still missing before them: (index, row).
    waiting: Vec<(usize, SweepRow)>,
    total: usize,
    /// Shares (workers) in all, and those done.
    shares: usize,
    shares_done: usize,
    finished: bool,
}

impl Run {
    /// Takes the row at `index` of the whole sweep: after the rows before it, or to wait
    /// for them.
    fn place(&mut self, index: usize, row: SweepRow) {
        if index != self.rows.len() {
            self.waiting.push((index, row));
            return;
        }
        self.rows.push(row);
        while let Some(k) = self.waiting.iter().position(|(i, _)| *i == self.rows.len()) {
            let (_, next) = self.waiting.swap_remove(k);
            self.rows.push(next);
        }
    }
}

/// How many workers share a sweep of `options` options: one per core the browser
/// reports, at least one, at most [`MOST_SHARES`] and one per option.
fn shares_for(options: usize) -> usize {
    let cores = web_sys::window().map_or(1.0, |w| w.navigator().hardware_concurrency());
    let cores = if cores.is_finite() && cores >= 1.0 { cores as usize } else { 1 };
    cores.clamp(1, MOST_SHARES).min(options.max(1))
}

/// Where a chart drew its plotting area (CSS pixels) and its axis ranges.
#[derive(Clone, Copy, Debug, Default)]
struct Geometry {
    left: f64,
    right: f64,
    top: f64,
    bottom: f64,
    x: (f64, f64),
    y: (f64, f64),
}

impl Geometry {
    /// From a plotting area's backing-store pixel ranges (plotters) and the axis ranges.
    fn of(
        (xr, yr): (std::ops::Range<i32>, std::ops::Range<i32>),
        dpr: f64,
        x: (f64, f64),
        y: (f64, f64),
    ) -> Geometry {
        Geometry {
            left: xr.start as f64 / dpr,
            right: xr.end as f64 / dpr,
            top: yr.start as f64 / dpr,
            bottom: yr.end as f64 / dpr,
            x,
            y,
        }
    }
}

/// A tick label of a sweep axis: a category's name at its whole-number value (nothing in
/// between), or the number in the user's units without trailing zeros.
fn tick_label(units: Units, p: Parameter, names: Option<&[&str]>, v: f64) -> String {
    match names {
        Some(n) => n
            .get(v.round() as usize)
            .filter(|_| (v - v.round()).abs() < 1e-6)
            .copied()
            .unwrap_or("")
            .to_string(),
        None => {
            let shown = units.to_shown(quantity_of(p).unwrap_or(Quantity::Count), v);
            let t = format!("{shown:.3}");
            t.trim_end_matches('0').trim_end_matches('.').to_string()
        }
    }
}

/// The panel.
#[component]
pub fn SweepPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let first = AxisInputs::new("rise-ratio");
    let second = AxisInputs::new("");
    let size = RwSignal::new(true);
    let run = RwSignal::new(None::<Run>);
    let error = RwSignal::new(None::<String>);
    let pointed = RwSignal::new(None::<usize>);
    let jobs = StoredValue::new_local(Vec::<Option<Job>>::new());
    // the ranges start from the design on screen, and again when a parameter changes
    Effect::new(move |_| {
        first.key.track();
        first.reset(&state.design.get_untracked(), state.units.get_untracked());
    });
    Effect::new(move |_| {
        second.key.track();
        second.reset(&state.design.get_untracked(), state.units.get_untracked());
    });
    // While rows come, the charts draw what has arrived at most every CHART_EVERY (then in
    // an animation frame); a sweep just started (no row yet: the last sweep's charts go),
    // done or cancelled is drawn at the next frame. Drawn at every frame, the four charts
    // took the page's thread about twice as long over a sweep, time the workers on a
    // small machine's other cores need.
    let drawn = RwSignal::new(None::<Run>);
    let draw_pending = StoredValue::new(false);
    let ended = move || run.with_untracked(|r| r.as_ref().is_none_or(|r| r.finished));
    Effect::new(move |_| {
        run.track();
        if ended() || run.with_untracked(|r| r.as_ref().is_some_and(|r| r.rows.is_empty())) {
            request_animation_frame(move || drawn.set(run.get_untracked()));
            return;
        }
        if draw_pending.get_value() {
            return;
        }
        draw_pending.set_value(true);
        set_timeout(
            move || {
                draw_pending.set_value(false);
                // an ended sweep was drawn as it ended
                if !ended() {
                    request_animation_frame(move || drawn.set(run.get_untracked()));
                }
            },
            CHART_EVERY,
        );
    });
    let running = move || run.with(|r| r.as_ref().is_some_and(|r| !r.finished));
    let start = move || {
        if running() {
            return;
        }
        let units = state.units.get_untracked();
        let axes = match (first.axis(units), second.axis(units)) {
            (Ok(Some(a)), Ok(b)) => {
                let mut axes = vec![a];
                axes.extend(b);
                axes
            }
            (Err(e), _) | (_, Err(e)) => return error.set(Some(e)),
            (Ok(None), _) => return error.set(Some("Choose the parameter to vary.".into())),
        };
        if axes.len() == 2 && axes[0].parameter == axes[1].parameter {
            return error.set(Some("Vary two different parameters, or only one.".into()));
        }
        let base = state.design.get_untracked();
        let total = option_count(&axes);
        let parts = shares_for(total);
        error.set(None);
        pointed.set(None);
        run.set(Some(Run {
            base: base.clone(),
            axes: axes.clone(),
            rows: Vec::new(),
            waiting: Vec::new(),
            total,
            shares: parts,
            shares_done: 0,
            finished: false,
        }));
        let link = permalink::encode(&base);
        let size = size.get_untracked();
        let stop = move |message: String| {
            error.set(Some(message));
            run.update(|r| {
                if let Some(r) = r {
                    r.finished = true;
                    r.waiting.clear();
                }
            });
            // every share's worker ends: a sweep with a share missing is not one
            jobs.set_value(Vec::new());
        };
        jobs.set_value((0..parts).map(|_| None).collect());
        for part in 0..parts {
            let request =
                Request::Sweep { link: link.clone(), axes: axes.clone(), size, share: Share { part, parts } };
            let started = Job::start(&request, move |reply| match reply {
                Reply::Row { index, row, .. } => run.update(|r| {
                    if let Some(r) = r {
                        r.place(index, row);
                    }
                }),
                Reply::Swept { .. } => {
                    run.update(|r| {
                        if let Some(r) = r {
                            r.shares_done += 1;
                            r.finished = r.shares_done == r.shares;
                        }
                    });
                    finish_one(jobs, part);
                }
                Reply::Failed { message } => stop(message),
                _ => {}
            });
            match started {
                Ok(j) => jobs.update_value(|js| {
                    if let Some(slot) = js.get_mut(part) {
                        *slot = Some(j);
                    }
                }),
                Err(e) => return stop(format!("The sweep cannot start: {e}")),
            }
        }
    };
    let cancel = move || {
        if !running() {
            return;
        }
        jobs.set_value(Vec::new());
        run.update(|r| {
            if let Some(r) = r {
                r.finished = true;
                r.total = r.rows.len();
                r.waiting.clear();
            }
        });
        error.set(Some("Cancelled; the options found so far stay on the charts.".into()));
    };
    // Alt+W runs the sweep, Escape cancels it (`components::shortcuts` lists them)
    let keys = window_event_listener(leptos::ev::keydown, move |ev: web_sys::KeyboardEvent| {
        match crate::components::shortcuts::page_key(&ev) {
            Some("KeyW") => start(),
            Some("Escape") if running() => cancel(),
            _ => return,
        }
        ev.prevent_default();
    });
    on_cleanup(move || keys.remove());
    // the option as drawn: a click maps through the charts on screen
    let adopt = move |k: usize| {
        let Some((base, axes, values)) = drawn.with_untracked(|r| {
            r.as_ref().and_then(|r| Some((r.base.clone(), r.axes.clone(), r.rows.get(k)?.values.clone())))
        }) else {
            return;
        };
        let mut d = base;
        for (a, v) in axes.iter().zip(&values) {
            d = apply(&d, a.parameter, *v);
        }
        match state.check(&d) {
            Ok(()) => {
                if state.design.with_untracked(|cur| *cur != d) {
                    state.commit(d);
                }
            }
            Err(e) => error.set(Some(format!("That option cannot be opened: {e}"))),
        }
    };
    let progress = move || run.with(|r| r.as_ref().map(|r| (r.rows.len(), r.total)));
    let selector = move |axis: AxisInputs, id: &'static str, allow_none: bool| {
        let choices = PARAMETERS
            .iter()
            .map(|(p, words, _)| {
                let key = p.key();
                view! { <option value=key selected=move || axis.key.with(|k| k == key)>{*words}</option> }
            })
            .collect_view();
        view! {
            <select id=id aria-label=if allow_none { "Second parameter (a grid)" } else { "Parameter to vary" }
                on:change=move |ev| axis.key.set(event_target_value(&ev))>
                {allow_none.then(|| view! { <option value="" selected=move || axis.key.with(String::is_empty)>"none"</option> })}
                {choices}
            </select>
        }
    };
    let range = move |axis: AxisInputs, id: &'static str| {
        let numeric = move || parameter_of(&axis.key.get()).is_some_and(|p| p.is_numeric());
        let unit = move || {
            parameter_of(&axis.key.get())
                .and_then(quantity_of)
                .map(|q| state.units.get().label(q))
                .unwrap_or_default()
        };
        view! {
            <Show when=numeric fallback=move || view! {
                <span class="hint">{move || if axis.key.with(String::is_empty) { "" } else { "every value" }}</span>
            }>
                <label>"from "<input type="text" inputmode="decimal" class="short" id=format!("{id}-from")
                    prop:value=move || axis.from.get() on:change=move |ev| axis.from.set(event_target_value(&ev)) /></label>
                <label>" to "<input type="text" inputmode="decimal" class="short" id=format!("{id}-to")
                    prop:value=move || axis.to.get() on:change=move |ev| axis.to.set(event_target_value(&ev)) /></label>
                <span class="unit">{unit}</span>
                <label>" in "<input type="text" inputmode="numeric" class="short" id=format!("{id}-count")
                    prop:value=move || axis.count.get() on:change=move |ev| axis.count.set(event_target_value(&ev)) />" steps"</label>
            </Show>
        }
    };
    let held_text = move || {
        run.with(|r| r.as_ref().map(|r| format!("Held fixed: {}. Concept-design values.", held(&r.axes))))
    };
    let readout = move || {
        let units = state.units.get();
        drawn.with(|r| {
            let r = r.as_ref()?;
            let k = pointed.get()?;
            let row = r.rows.get(k)?;
            Some(describe(units, &r.axes, row))
        })
    };
    let charts = CHARTS
        .iter()
        .map(|&(id, title, q, pick)| view! { <SweepChart id=id title=title quantity=q pick=pick run=drawn pointed=pointed adopt=adopt /> })
        .collect_view();
    view! {
        <section class="sweep-panel" id="sweep-panel" aria-labelledby="sweep-title">
            <div class="sweep-head">
                <h3 id="sweep-title">"Sweep"</h3>
                <span class="sweep-axis">"vary "{selector(first, "sweep-parameter", false)}{range(first, "sweep-a")}</span>
                <span class="sweep-axis">"and "{selector(second, "sweep-second", true)}{range(second, "sweep-b")}</span>
                <label><input type="checkbox" id="sweep-size" prop:checked=move || size.get()
                    on:change=move |ev| size.set(event_target_checked(&ev)) />" size each option"</label>
                <button type="button" id="sweep-run" title="Run the sweep (Alt+W)" prop:disabled=running on:click=move |_| start()>"Run"</button>
                <button type="button" id="sweep-cancel" title="Cancel the sweep (Escape)" prop:disabled=move || !running() on:click=move |_| cancel()>"Cancel"</button>
            </div>
            {move || progress().map(|(done, total)| view! {
                <div class="sweep-progress">
                    <progress id="sweep-progress" max=total value=done aria-label="Options done"></progress>
                    <span id="sweep-count">{format!("{done} of {total} options")}</span>
                </div>
            })}
            {move || error.get().map(|e| view! { <p class="hint" id="sweep-message" role="status">{e}</p> })}
            <div class="sweep-charts" class:hidden=move || run.with(Option::is_none)>{charts}</div>
            <p class="hint sweep-key" class:hidden=move || run.with(Option::is_none)>
                <span class="key-line"></span>" the design on screen · "<span class="key-cross">"×"</span>
                " an option that fails (point at it for why) · click a point, or focus a chart and use the arrows and Enter, to open that option"
            </p>
            <p class="hint" id="sweep-readout" aria-live="polite">{readout}</p>
            <p class="hint" id="sweep-held">{held_text}</p>
        </section>
    }
}

/// One option in words: its values, and its numbers or why it fails.
fn describe(units: Units, axes: &[Axis], row: &SweepRow) -> String {
    let values: Vec<String> =
        axes.iter().zip(&row.values).map(|(a, v)| value_words(units, a.parameter, *v)).collect();
    let head = values.join(", ");
    if !row.feasible {
        return format!("{head}: not feasible: {}", row.reason.clone().unwrap_or_default());
    }
    let mut parts = Vec::new();
    for (_, title, q, pick) in CHARTS {
        if let Some(v) = pick(row) {
            parts.push(format!("{title} {}", units.show(q, v)));
        }
    }
    format!("{head}: {}. Click or press Enter to open it.", parts.join(", "))
}

/// A parameter's value in words: "rise / span 0.18", "rib system two-hinged".
fn value_words(units: Units, p: Parameter, v: f64) -> String {
    match (category_names(p), quantity_of(p)) {
        (Some(names), _) => format!("{} {}", words_of(p), names.get(v as usize).copied().unwrap_or("?")),
        (None, Some(q)) => format!("{} {}", words_of(p), units.show(q, v)),
        (None, None) => format!("{} {v}", words_of(p)),
    }
}

/// One chart of the sweep.
#[component]
fn SweepChart(
    id: &'static str,
    title: &'static str,
    quantity: Quantity,
    pick: Pick,
    run: RwSignal<Option<Run>>,
    pointed: RwSignal<Option<usize>>,
    adopt: impl Fn(usize) + Copy + 'static,
) -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    let geometry = StoredValue::new(None::<Geometry>);
    let failed = RwSignal::new(None::<String>);
    Effect::new(move |_| {
        let _ = state.resized.get();
        let units = state.units.get();
        let current = state.settled_design.get();
        let Some(el) = node.get() else { return };
        run.with(|r| {
            let Some(r) = r else { return };
            match draw(&el, r, &current, units, (title, quantity, pick), pointed.get()) {
                Ok(g) => {
                    geometry.set_value(Some(g));
                    publish(&el, &g, r.rows.len());
                    failed.set(None);
                }
                Err(e) => {
                    // a click must not map through a drawing that is not there
                    geometry.set_value(None);
                    failed.set(Some(e));
                }
            }
        });
    });
    // the option under a pointer (CSS pixels in the canvas)
    let nearest = move |x: f64, y: f64| -> Option<usize> {
        let g = geometry.get_value()?;
        run.with_untracked(|r| nearest_option(r.as_ref()?, &g, x, y))
    };
    let on_move = move |ev: web_sys::PointerEvent| {
        let k = nearest(ev.offset_x() as f64, ev.offset_y() as f64);
        // every chart redraws when the pointed option changes, not on every move
        if pointed.get_untracked() != k {
            pointed.set(k);
        }
    };
    let on_click = move |ev: web_sys::MouseEvent| {
        if let Some(k) = nearest(ev.offset_x() as f64, ev.offset_y() as f64) {
            pointed.set(Some(k));
            adopt(k);
        }
    };
    let on_key = move |ev: web_sys::KeyboardEvent| {
        let (count, stride) = run.with_untracked(|r| {
            r.as_ref().map_or((0, 1), |r| (r.rows.len(), r.axes.get(1).map_or(1, |a| a.values.len().max(1))))
        });
        if count == 0 {
            return;
        }
        let k = pointed.get_untracked().unwrap_or(0).min(count - 1);
        // rows run along the second axis fastest: left and right step the first axis (a
        // grid's columns), up and down the second (its rows; along a line, the same as
        // right and left)
        let to = |next: Option<usize>| pointed.set(Some(next.filter(|n| *n < count).unwrap_or(k)));
        match ev.key().as_str() {
            "ArrowRight" => to(k.checked_add(stride)),
            "ArrowLeft" => to(k.checked_sub(stride)),
            "ArrowUp" => to(k.checked_add(1)),
            "ArrowDown" => to(k.checked_sub(1)),
            "Home" => pointed.set(Some(0)),
            "End" => pointed.set(Some(count - 1)),
            "Enter" | " " => adopt(k),
            _ => return,
        }
        ev.prevent_default();
    };
    view! {
        <figure class="sweep-chart">
            <canvas id=format!("sweep-chart-{id}") class="chart" node_ref=node tabindex="0" role="img"
                aria-label=format!("{title} against the varied parameter; arrows pick an option, Enter opens it")
                on:pointermove=on_move on:pointerleave=move |_| if pointed.get_untracked().is_some() { pointed.set(None) } on:click=on_click on:keydown=on_key></canvas>
            {move || failed.get().map(|e| view! { <p class="error" role="alert">{format!("The chart could not be drawn: {e}")}</p> })}
        </figure>
    }
}

/// The option nearest a point of the plotting area: along x for one axis, the nearest
/// cell for a grid. `None` outside the plotting area or with no rows.
fn nearest_option(r: &Run, g: &Geometry, x: f64, y: f64) -> Option<usize> {
    if x < g.left - 6.0 || x > g.right + 6.0 || y < g.top - 6.0 || y > g.bottom + 6.0 || r.rows.is_empty() {
        return None;
    }
    let wx = g.x.0 + (x - g.left) / (g.right - g.left).max(1.0) * (g.x.1 - g.x.0);
    let wy = g.y.1 - (y - g.top) / (g.bottom - g.top).max(1.0) * (g.y.1 - g.y.0);
    let sx = (g.x.1 - g.x.0).abs().max(1e-12);
    let sy = (g.y.1 - g.y.0).abs().max(1e-12);
    let distance = |row: &SweepRow| {
        let dx = (row.values[0] - wx) / sx;
        match (r.axes.len(), row.values.get(1)) {
            (2, Some(v)) => dx.hypot((v - wy) / sy),
            _ => dx.abs(),
        }
    };
    r.rows.iter().enumerate().min_by(|a, b| distance(a.1).total_cmp(&distance(b.1))).map(|(k, _)| k)
}

/// Puts a chart's geometry on its element.
fn publish(el: &web_sys::HtmlCanvasElement, g: &Geometry, count: usize) {
    for (name, v) in [
        ("data-plot-left", g.left),
        ("data-plot-right", g.right),
        ("data-plot-top", g.top),
        ("data-plot-bottom", g.bottom),
        ("data-x-min", g.x.0),
        ("data-x-max", g.x.1),
        ("data-y-min", g.y.0),
        ("data-y-max", g.y.1),
    ] {
        let _ = el.set_attribute(name, &format!("{v}"));
    }
    let _ = el.set_attribute("data-count", &count.to_string());
}

/// The axis range of a sweep axis's values, padded a little (categories by index).
fn span_of(values: &[f64]) -> (f64, f64) {
    let lo = values.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = values.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    if !lo.is_finite() || !hi.is_finite() {
        return (0.0, 1.0);
    }
    let pad = if hi > lo { 0.04 * (hi - lo) } else { 0.5 };
    (lo - pad, hi + pad)
}

/// Draws one chart; returns its geometry in CSS pixels.
fn draw(
    el: &web_sys::HtmlCanvasElement,
    r: &Run,
    current: &Design,
    units: Units,
    (title, q, pick): (&str, Quantity, Pick),
    pointed: Option<usize>,
) -> Result<Geometry, String> {
    let surface = canvas::prepare(el).ok_or("the chart has no size yet")?;
    let dpr = el.width() as f64 / surface.width.max(1.0);
    let _ = surface.ctx.set_transform(1.0, 0.0, 0.0, 1.0, 0.0, 0.0);
    let px = |v: f64| (v * dpr).round() as u32;
    let root = CanvasBackend::with_canvas_object(el.clone()).ok_or("no canvas context")?.into_drawing_area();
    root.fill(&rgb(Ink::Background)).map_err(|e| e.to_string())?;
    let font = |size: f64, ink: Ink| ("sans-serif", size * dpr).into_font().color(&rgb(ink));
    let first = &r.axes[0];
    let x_values: Vec<f64> = first.values.clone();
    let (x0, x1) = span_of(&x_values);
    let names_x = category_names(first.parameter);
    let x_label = |v: &f64| tick_label(units, first.parameter, names_x.as_deref(), *v);
    let x_desc = match quantity_of(first.parameter) {
        Some(fq) if !units.label(fq).is_empty() => {
            format!("{} ({})", words_of(first.parameter), units.label(fq))
        }
        _ => words_of(first.parameter).to_string(),
    };
    let unit = units.label(q);
    let caption = if unit.is_empty() { title.to_string() } else { format!("{title} ({unit})") };
    let values: Vec<Option<f64>> =
        r.rows.iter().map(|row| if row.feasible { pick(row) } else { None }).collect();
    // a cross marks an option that fails; a feasible one without this number (not sized)
    // is simply not drawn
    let failing = |row: &SweepRow| !row.feasible;
    let none_sized = !r.rows.is_empty() && r.rows.iter().all(|row| row.feasible && pick(row).is_none());
    let caption = if none_sized { format!("{caption}: size each option to chart it") } else { caption };
    let mark = |axis: &Axis| current_value(current, axis.parameter);
    let geometry = if r.axes.len() == 1 {
        let shown: Vec<f64> = values.iter().flatten().map(|v| units.to_shown(q, *v)).collect();
        let lo = shown.iter().copied().fold(f64::INFINITY, f64::min);
        let hi = shown.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        let (y0, y1) = if lo.is_finite() && hi.is_finite() {
            let pad = if hi > lo { 0.1 * (hi - lo) } else { 0.1 * hi.abs().max(1.0) };
            (lo - pad, hi + pad)
        } else {
            (0.0, 1.0)
        };
        let mut chart = ChartBuilder::on(&root)
            .caption(&caption, font(13.0, Ink::Text))
            .margin(px(8.0))
            .x_label_area_size(px(34.0))
            .y_label_area_size(px(58.0))
            .build_cartesian_2d(x0..x1, y0..y1)
            .map_err(|e| e.to_string())?;
        chart
            .configure_mesh()
            .x_desc(x_desc)
            .label_style(font(11.0, Ink::Secondary))
            .axis_desc_style(font(11.0, Ink::Text))
            .bold_line_style(rgb(Ink::Concrete).mix(0.3))
            .light_line_style(TRANSPARENT)
            .x_labels(if names_x.is_some() { x_values.len() * 2 + 1 } else { 6 })
            .y_labels(5)
            .x_label_formatter(&x_label)
            .y_label_formatter(&|v| round_for_display(*v))
            .draw()
            .map_err(|e| e.to_string())?;
        // the design on screen
        if let Some(v) = mark(first).filter(|v| (x0..=x1).contains(v)) {
            chart
                .draw_series(LineSeries::new([(v, y0), (v, y1)], rgb(Ink::Load).stroke_width(px(2.0))))
                .map_err(|e| e.to_string())?
                .label("design on screen");
        }
        // feasible runs as lines; a failing option breaks the line
        let mut run_points: Vec<(f64, f64)> = Vec::new();
        let mut runs: Vec<Vec<(f64, f64)>> = Vec::new();
        for (row, v) in r.rows.iter().zip(&values) {
            match v {
                Some(v) => run_points.push((row.values[0], units.to_shown(q, *v))),
                None => runs.push(std::mem::take(&mut run_points)),
            }
        }
        runs.push(run_points);
        let ink = rgb(Ink::Text);
        for points in runs.iter().filter(|p| !p.is_empty()) {
            chart
                .draw_series(LineSeries::new(points.iter().copied(), ink.stroke_width(px(2.0))))
                .map_err(|e| e.to_string())?;
            chart
                .draw_series(points.iter().map(|&p| Circle::new(p, px(3.0), ink.filled())))
                .map_err(|e| e.to_string())?;
        }
        // failing options: a cross on the axis
        let bad = rgb(Ink::Compression);
        chart
            .draw_series(r.rows.iter().filter(|row| failing(row)).map(|row| {
                Cross::new((row.values[0], y0 + 0.04 * (y1 - y0)), px(5.0), bad.stroke_width(px(2.0)))
            }))
            .map_err(|e| e.to_string())?;
        if let Some(k) = pointed {
            if let Some((row, v)) = r.rows.get(k).zip(values.get(k)) {
                let y = v.map_or(y0 + 0.04 * (y1 - y0), |v| units.to_shown(q, v));
                chart
                    .draw_series([Circle::new(
                        (row.values[0], y),
                        px(6.0),
                        rgb(Ink::Load).stroke_width(px(2.0)),
                    )])
                    .map_err(|e| e.to_string())?;
            }
        }
        Geometry::of(chart.plotting_area().get_pixel_range(), dpr, (x0, x1), (y0, y1))
    } else {
        let second = &r.axes[1];
        let (y0, y1) = span_of(&second.values);
        let names_y = category_names(second.parameter);
        let y_label = |v: &f64| tick_label(units, second.parameter, names_y.as_deref(), *v);
        let lo = values.iter().flatten().copied().fold(f64::INFINITY, f64::min);
        let hi = values.iter().flatten().copied().fold(f64::NEG_INFINITY, f64::max);
        let scale_words = if lo.is_finite() && hi.is_finite() {
            format!(
                "{caption}: {} (light) to {} (dark)",
                round_for_display(units.to_shown(q, lo)),
                round_for_display(units.to_shown(q, hi))
            )
        } else {
            caption.clone()
        };
        let mut chart = ChartBuilder::on(&root)
            .caption(scale_words, font(13.0, Ink::Text))
            .margin(px(8.0))
            .x_label_area_size(px(34.0))
            .y_label_area_size(px(58.0))
            .build_cartesian_2d(x0..x1, y0..y1)
            .map_err(|e| e.to_string())?;
        chart
            .configure_mesh()
            .x_desc(x_desc)
            .y_desc(words_of(second.parameter))
            .label_style(font(11.0, Ink::Secondary))
            .axis_desc_style(font(11.0, Ink::Text))
            .disable_mesh()
            .x_labels(if names_x.is_some() { x_values.len() * 2 + 1 } else { 6 })
            .y_labels(if names_y.is_some() { second.values.len() * 2 + 1 } else { 6 })
            .x_label_formatter(&x_label)
            .y_label_formatter(&y_label)
            .draw()
            .map_err(|e| e.to_string())?;
        let half = |vals: &[f64], v: f64| {
            // half the gap to the neighbours, so the cells tile the grid
            let k = vals.iter().position(|x| *x == v).unwrap_or(0);
            let prev = k.checked_sub(1).and_then(|i| vals.get(i)).map(|p| (v - p) / 2.0);
            let next = vals.get(k + 1).map(|n| (n - v) / 2.0);
            let g = prev.or(next).unwrap_or(0.5);
            (v - prev.unwrap_or(g), v + next.unwrap_or(g))
        };
        let base = rgb(Ink::Tension);
        for (row, v) in r.rows.iter().zip(&values) {
            let (Some(&a), Some(&b)) = (row.values.first(), row.values.get(1)) else { continue };
            let (ax0, ax1) = half(&first.values, a);
            let (by0, by1) = half(&second.values, b);
            match v {
                Some(v) => {
                    let t = if hi > lo { (v - lo) / (hi - lo) } else { 0.5 };
                    chart
                        .draw_series([Rectangle::new(
                            [(ax0, by0), (ax1, by1)],
                            base.mix(0.15 + 0.8 * t).filled(),
                        )])
                        .map_err(|e| e.to_string())?;
                }
                None if failing(row) => {
                    chart
                        .draw_series([Cross::new(
                            (a, b),
                            px(5.0),
                            rgb(Ink::Compression).stroke_width(px(2.0)),
                        )])
                        .map_err(|e| e.to_string())?;
                }
                None => {}
            }
        }
        if let (Some(a), Some(b)) = (mark(first), mark(second)) {
            chart
                .draw_series([Circle::new((a, b), px(7.0), rgb(Ink::Load).stroke_width(px(3.0)))])
                .map_err(|e| e.to_string())?;
        }
        if let Some(row) = pointed.and_then(|k| r.rows.get(k)) {
            if let (Some(&a), Some(&b)) = (row.values.first(), row.values.get(1)) {
                chart
                    .draw_series([Circle::new((a, b), px(5.0), rgb(Ink::Text).stroke_width(px(2.0)))])
                    .map_err(|e| e.to_string())?;
            }
        }
        Geometry::of(chart.plotting_area().get_pixel_range(), dpr, (x0, x1), (y0, y1))
    };
    root.present().map_err(|e| e.to_string())?;
    Ok(geometry)
}
