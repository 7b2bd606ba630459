//! The sizing view's panel under the drawings (the load picker's "Sizes"): each member
//! group's section and largest utilisation with the member, combination and traffic
//! placement that govern it; the quantities and totals; the demand at each springing
//! and its thrust block; the report's caution; and "Use these sizes", which puts every
//! sized group's section into the design as one undoable edit.
//!
//! The numbers are the engine's size report (`arch::sizing::size_design`) of the design
//! on screen, worked out with its traffic report in the background worker once edits
//! pause (`crate::settled`, `AppState::sized`; the view reads `AppState::size_report`). Every value is shown in the chosen units and carries its SI value in
//! `data-value`.

use crate::format::{Quantity, Units};
use crate::state::{AppState, SizeView};
use crate::worker_job::{finish, Job};
use leptos::prelude::*;
use springline_statics::arch::foundation::SpringingDemand;
use springline_statics::arch::massing::DEFAULT_MASSING_PASSES;
use springline_statics::arch::sizing::{adopt_sizes, GroupOutcome, SizeReport};
use springline_statics::error::{Field, GroupName};
use springline_statics::link::permalink;
use springline_worker::{Reply, Request};

/// A table cell with `si` shown in `units` as quantity `q`, the SI value in
/// `data-value`, id `id`.
fn value_cell(id: String, q: Quantity, si: f64, units: Units) -> impl IntoView {
    view! { <td id=id data-value=format!("{si}") data-quantity=q.key()>{units.show(q, si)}</td> }
}

/// A value inside text (a span), as [`value_cell`].
fn value_span(id: String, q: Quantity, si: f64, units: Units) -> impl IntoView {
    view! { <span id=id data-value=format!("{si}") data-quantity=q.key()>{units.show(q, si)}</span> }
}

/// A group's section in words: the sized section's label, "as typed", or "not sized:"
/// and the engine's reason.
pub fn section_words(outcome: &GroupOutcome) -> String {
    match outcome {
        GroupOutcome::Sized { label, .. } => label.clone(),
        GroupOutcome::AsTyped => "as typed".into(),
        GroupOutcome::NotSized { reason } => format!("not sized: {reason}"),
        GroupOutcome::NoMembers => "no members in this design".into(),
    }
}

/// The groups table: section, material, largest utilisation and what governs it.
fn groups_table(r: &SizeReport, units: Units) -> impl IntoView {
    let rows = r
        .sizing
        .groups
        .iter()
        .map(|g| {
            let governing = g
                .governing_member
                .as_ref()
                .and_then(|name| r.sizing.members.iter().find(|m| &m.member == name));
            let used = match g.utilisation {
                Some(u) => {
                    value_cell(format!("sizes-{}-utilisation", g.group), Quantity::Ratio, u, units).into_any()
                }
                None => view! { <td id=format!("sizes-{}-utilisation", g.group)>"—"</td> }.into_any(),
            };
            let (member, combination, placement) = match governing {
                Some(m) => (m.member.clone(), m.combination.clone(), m.placement.clone()),
                None => ("—".into(), "—".into(), "—".into()),
            };
            let fails = g.utilisation.is_some_and(|u| u > 1.0);
            view! {
                <tr class:fails=fails>
                    <th scope="row">{g.group.clone()}</th>
                    <td id=format!("sizes-{}-section", g.group)>{section_words(&g.outcome)}</td>
                    <td>{g.material.clone()}</td>
                    {used}
                    <td id=format!("sizes-{}-member", g.group)>{member}</td>
                    <td>{combination}</td>
                    <td class="placement">{placement}</td>
                </tr>
            }
        })
        .collect_view();
    view! {
        <div class="table-scroll">
            <table class="results sizing-table" id="sizes-groups">
                <caption>"Member groups, one section each, per rib line (utilisation = demand / resistance)"</caption>
                <thead>
                    <tr>
                        <th scope="col">"group"</th><th scope="col">"section"</th><th scope="col">"material"</th>
                        <th scope="col">"largest utilisation"</th><th scope="col">"in member"</th>
                        <th scope="col">"combination"</th><th scope="col">"traffic placement"</th>
                    </tr>
                </thead>
                <tbody>{rows}</tbody>
            </table>
        </div>
    }
}

/// The quantities table and the totals, with the deck-weight sentence.
fn quantities_table(r: &SizeReport, units: Units) -> impl IntoView {
    let q = &r.quantities;
    let rows = q
        .lines
        .iter()
        .enumerate()
        .map(|(i, l)| {
            let length = if l.length > 0.0 {
                value_cell(format!("sizes-q{i}-length"), Quantity::Length, l.length, units).into_any()
            } else {
                view! { <td>"—"</td> }.into_any()
            };
            view! {
                <tr>
                    <th scope="row">{l.item.clone()}</th>
                    {length}
                    {value_cell(format!("sizes-q{i}-volume"), Quantity::Volume, l.volume, units)}
                    {value_cell(format!("sizes-q{i}-mass"), Quantity::Mass, l.mass, units)}
                    {value_cell(format!("sizes-q{i}-cost"), Quantity::Count, l.cost, units)}
                </tr>
            }
        })
        .collect_view();
    view! {
        <div class="table-scroll">
            <table class="results sizing-table" id="sizes-quantities">
                <caption>"Quantities, all rib lines"</caption>
                <thead>
                    <tr>
                        <th scope="col">"item"</th><th scope="col">"length"</th><th scope="col">"volume"</th>
                        <th scope="col">"mass"</th><th scope="col">"cost"</th>
                    </tr>
                </thead>
                <tbody>{rows}</tbody>
            </table>
        </div>
        <p class="sizing-totals" id="sizes-totals">
            "Steel "{value_span("sizes-steel".into(), Quantity::Mass, q.steel, units)}
            ", concrete "{value_span("sizes-concrete".into(), Quantity::Volume, q.concrete, units)}
            ", glulam "{value_span("sizes-glulam".into(), Quantity::Volume, q.glulam, units)}
            ", thrust blocks "{value_span("sizes-blocks".into(), Quantity::Volume, q.foundation, units)}
            "; cost index "{value_span("sizes-cost".into(), Quantity::Count, q.cost_index, units)}
            " (in the units of the design's rates)."
        </p>
        <p class="hint" id="sizes-deck-weight">{q.deck_weight.clone()}</p>
    }
}

/// One springing's row of the foundations table.
fn springing_row(s: &SpringingDemand, units: Units) -> impl IntoView {
    let id = |what: &str| format!("sizes-{}-{what}", s.side);
    let b = &s.block;
    let moment = match s.fixed_moment {
        Some(m) => value_cell(id("moment"), Quantity::Moment, m, units).into_any(),
        None => view! { <td id=id("moment")>"— (hinged)"</td> }.into_any(),
    };
    view! {
        <tr>
            <th scope="row">{s.side.clone()}</th>
            {value_cell(id("thrust"), Quantity::Force, s.thrust, units)}
            {value_cell(id("vertical"), Quantity::Force, s.vertical, units)}
            {value_cell(id("resultant"), Quantity::Force, s.resultant, units)}
            {value_cell(id("angle"), Quantity::Angle, s.angle, units)}
            <td>
                {value_span(id("angle-min"), Quantity::Angle, s.angle_range.min, units)}" to "
                {value_span(id("angle-max"), Quantity::Angle, s.angle_range.max, units)}
            </td>
            {moment}
            <td>
                {value_span(id("block-width"), Quantity::Length, b.width, units)}" × "
                {value_span(id("block-length"), Quantity::Length, b.length, units)}" × "
                {value_span(id("block-thickness"), Quantity::Length, b.thickness, units)}
            </td>
            {value_cell(id("block-volume"), Quantity::Volume, b.volume, units)}
            {value_cell(id("bearing-area"), Quantity::Area, b.bearing_area, units)}
        </tr>
    }
}

/// The foundations table: the demand at each springing and its thrust block.
fn foundations_table(r: &SizeReport, units: Units) -> impl IntoView {
    let f = &r.foundations;
    let rows = f.springings.iter().map(|s| springing_row(s, units)).collect_view();
    let caption = format!(
        "Springings, whole cross-section, characteristic ({}); blocks on {}",
        f.characteristic,
        units.show(Quantity::Pressure, f.allowable_bearing)
    );
    view! {
        <div class="table-scroll">
            <table class="results sizing-table" id="sizes-foundations">
                <caption>{caption}</caption>
                <thead>
                    <tr>
                        <th scope="col">"springing"</th><th scope="col">"H"</th><th scope="col">"V"</th>
                        <th scope="col">"resultant R"</th><th scope="col">"angle below horizontal"</th>
                        <th scope="col">"angle range"</th><th scope="col">"fixed moment"</th>
                        <th scope="col">"block B × L × t"</th><th scope="col">"volume"</th>
                        <th scope="col">"bearing area"</th>
                    </tr>
                </thead>
                <tbody>{rows}</tbody>
            </table>
        </div>
    }
}

/// The rib's in-plane stability: the arch's alpha_cr with the rib's section, the least
/// accepted, each analysed case's alpha_cr (the factored dead load and every governing
/// placement), and the dead load's frequencies and footbridge flag.
fn stability_table(r: &SizeReport, units: Units) -> impl IntoView {
    let rib = match (&r.sizing.rib_stability, &r.sizing.rib_stability_failure) {
        (Some(st), _) => {
            let at_section = r.sizing.rib_alpha_cr.unwrap_or(st.alpha_cr);
            let rows = st
                .cases
                .iter()
                .enumerate()
                .map(|(i, c)| {
                    let arch = if c.arch.mode.is_some() {
                        value_cell(format!("sizes-case{i}-alpha"), Quantity::Ratio, c.arch.alpha_cr, units).into_any()
                    } else {
                        view! { <td id=format!("sizes-case{i}-alpha") data-value=format!("{}", c.arch.alpha_cr)>
                            {format!("above {:.2}", c.arch.alpha_cr)}</td> }
                        .into_any()
                    };
                    view! {
                        <tr class:fails=c.arch.alpha_cr < st.least>
                            <th scope="row">{c.combination.clone()}</th>
                            <td class="placement">{c.placement.clone()}</td>
                            {arch}
                        </tr>
                    }
                })
                .collect_view();
            let fails = at_section < st.least;
            view! {
                <p class="sizing-totals" id="sizes-alpha" class:fails=fails>
                    "The arch's alpha_cr with the rib's section: "
                    {value_span("sizes-alpha-cr".into(), Quantity::Ratio, at_section, units)}
                    {format!(" (at least {} accepted{}); analysed with the sections on screen: ", st.least,
                        if st.least >= 10.0 { ", first-order analysis" } else { ", moments amplified" })}
                    {value_span("sizes-alpha-analysed".into(), Quantity::Ratio, st.alpha_cr, units)}
                    "."
                </p>
                <details class="sizing-basis" id="sizes-cases">
                    <summary>{format!("alpha_cr of the {} cases analysed", st.cases.len())}</summary>
                    <div class="table-scroll">
                        <table class="results sizing-table" id="sizes-alpha-cases">
                            <caption>"The arch's critical load factor per factored case (posts and diagonals kept whole)"</caption>
                            <thead>
                                <tr><th scope="col">"combination"</th><th scope="col">"traffic placement"</th>
                                    <th scope="col">"alpha_cr"</th></tr>
                            </thead>
                            <tbody>{rows}</tbody>
                        </table>
                    </div>
                </details>
            }
            .into_any()
        }
        (None, Some(why)) => view! {
            <p class="hint" id="sizes-alpha">{format!("The rib's stability could not be analysed ({why}): the arch table's buckling length is used.")}</p>
        }
        .into_any(),
        (None, None) => ().into_any(),
    };
    let dynamics = r.stability.as_ref().map(|s| {
        let frequencies = s
            .frequencies
            .iter()
            .map(|f| format!("{:.2} Hz ({})", f.hz, if f.vertical_share > 0.5 { "vertical" } else { "horizontal" }))
            .collect::<Vec<_>>()
            .join(", ");
        view! {
            <p class="hint" id="sizes-frequencies">{format!("Natural frequencies with the dead load's masses: {frequencies}.")}</p>
            {s.footbridge.clone().map(|f| view! { <p class="warning" id="sizes-footbridge">{format!("Footbridge: {f}")}</p> })}
            <p class="hint" id="sizes-plane">"In the arch plane only: out-of-plane buckling and lateral sway are beyond this plane model and are not covered."</p>
        }
    });
    view! { {rib} {dynamics} }
}

/// How the numbers are found, folded.
fn basis(r: &SizeReport) -> impl IntoView {
    view! {
        <details class="sizing-basis" id="sizes-basis">
            <summary>"How these are found"</summary>
            <p>{r.sizing.basis.clone()}</p>
            <p>{r.quantities.basis.clone()}</p>
            <p>{r.foundations.basis.clone()}</p>
        </details>
    }
}

/// The "Use these sizes" button: every sized group's section into the design, one undo
/// step; says so when the design already uses them, and shows the engine's refusal.
#[component]
fn AdoptButton() -> impl IntoView {
    let state = expect_context::<AppState>();
    let refusal = RwSignal::new(None::<String>);
    // the design with the sizes adopted, when it differs from the design on screen
    let adopted = move || match state.settled_size_report.get() {
        SizeView::Ready(r) => {
            state.settled_design.with(|d| Some(adopt_sizes(d, &r.sizing)).filter(|a| a != d))
        }
        _ => None,
    };
    let adopt = move |_| {
        let Some(design) = adopted() else { return };
        match state.try_edit(Field::Sizing(GroupName::Rib), |d| *d = design) {
            Ok(()) => refusal.set(None),
            Err(e) => refusal.set(Some(format!("The sized design is refused: {e}"))),
        }
    };
    view! {
        <div class="sizing-adopt">
            <button type="button" id="sizes-adopt" disabled=move || adopted().is_none() on:click=adopt>
                "Use these sizes"
            </button>
            <span class="hint" id="sizes-adopt-note">
                {move || if adopted().is_some() {
                    "Puts each sized group's area, I, depth, E and unit weight into the design (one undo step); the self-weight then changes, so the sizes may change again."
                } else {
                    "The design uses these sizes."
                }}
            </span>
            <Show when=move || refusal.with(Option::is_some)>
                <p class="error" id="sizes-adopt-error" role="alert">{move || refusal.get()}</p>
            </Show>
        </div>
    }
}

/// What the massing loop did, in words: the passes, the form thrust (kN) and the steel
/// (t) it settled at, or why it stopped.
fn massed_words(converged: bool, passes: usize, form_thrust: f64, steel: f64, last_change: &str) -> String {
    if converged {
        format!(
            "Settled after {passes} pass{}: form thrust {form_thrust:.0} kN, steel {steel:.1} t.",
            if passes == 1 { "" } else { "es" }
        )
    } else {
        format!("Not settled: {last_change}")
    }
}

/// The "Settle the sizes" button: the massing loop (`arch::massing`: size, adopt,
/// analyse and size again until the sections stop changing) from the design on screen,
/// run in the background worker (seconds with many panels), its result put into the
/// design as one undo step, with what the loop did in words. An edit made meanwhile is
/// kept: the loop's design replaces only the design it started from.
#[component]
fn SettleButton() -> impl IntoView {
    let state = expect_context::<AppState>();
    let outcome = RwSignal::new(None::<(bool, String)>);
    let job = StoredValue::new_local(None::<Job>);
    let working = RwSignal::new(false);
    let settle = move |_| {
        let start = state.design.get_untracked();
        let request =
            Request::Massing { design: permalink::to_transfer(&start), passes: DEFAULT_MASSING_PASSES };
        let started = Job::start(&request, move |reply| {
            working.set(false);
            finish(job);
            let (converged, passes, form_thrust, steel, last_change, text) = match reply {
                Reply::Massed { converged, passes, form_thrust, steel, last_change, design } => {
                    (converged, passes, form_thrust, steel, last_change, design)
                }
                Reply::Failed { message } => {
                    outcome.set(Some((false, format!("The sizes cannot be settled: {message}"))));
                    return;
                }
                _ => return,
            };
            if state.design.with_untracked(|d| *d != start) {
                outcome.set(Some((
                    false,
                    "The design changed while the sizes were settling; settle again.".into(),
                )));
                return;
            }
            let design = match permalink::from_transfer(&text) {
                Ok(design) => design,
                Err(e) => {
                    outcome.set(Some((false, format!("The sizes cannot be settled: {e}"))));
                    return;
                }
            };
            if design != start {
                if let Err(e) = state.try_edit(Field::Sizing(GroupName::Rib), |d| *d = design) {
                    outcome.set(Some((false, format!("The settled design is refused: {e}"))));
                    return;
                }
            }
            outcome.set(Some((converged, massed_words(converged, passes, form_thrust, steel, &last_change))));
        });
        match started {
            Ok(started) => {
                job.set_value(Some(started));
                working.set(true);
                outcome.set(None);
            }
            Err(message) => outcome.set(Some((false, format!("The sizes cannot be settled: {message}")))),
        }
    };
    view! {
        <div class="sizing-adopt">
            <button type="button" id="sizes-settle" on:click=settle disabled=move || working.get()>
                "Settle the sizes"
            </button>
            <span class="hint">
                "Sizes, adopts and sizes again until no section changes (their weight changes the form and the forces); one undo step."
            </span>
            <Show when=move || working.get()>
                <p class="hint" id="sizes-settling" role="status">"Settling the sizes..."</p>
            </Show>
            {move || outcome.get().map(|(ok, words)| {
                let class = if ok { "hint" } else { "error" };
                view! { <p class=class id="sizes-settle-note" role="status">{words}</p> }
            })}
        </div>
    }
}

/// The panel of the sizing view, under the drawings.
#[component]
pub fn SizingPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let body = move || {
        let units = state.units.get();
        match state.settled_size_report.get() {
            SizeView::Off => ().into_any(),
            SizeView::Waiting => {
                view! { <p class="hint" id="sizes-waiting">"Computing the traffic envelopes and sizes..."</p> }
                    .into_any()
            }
            SizeView::Failed(e) => {
                view! { <p class="error" id="sizes-error" role="alert">{format!("Cannot size this design: {e}")}</p> }
                    .into_any()
            }
            SizeView::Ready(r) => view! {
                {groups_table(&r, units)}
                {stability_table(&r, units)}
                {quantities_table(&r, units)}
                {foundations_table(&r, units)}
                {basis(&r)}
                <p class="caution" id="sizes-caution" role="note">{r.caution.clone()}</p>
            }
            .into_any(),
        }
    };
    view! {
        <Show when=move || state.sizes.get()>
            <section class="envelope-panel sizing-panel" id="sizing-panel" aria-label="Sizes and quantities">
                {body}
                <AdoptButton />
                <SettleButton />
            </section>
        </Show>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::state::size_view;
    use springline_statics::Design;
    use std::sync::Arc;

    /// The demo sizes (every group sized in steel, `SizingDesign::steel`): the view
    /// holds the engine's report; a design without an ultimate combination gives the
    /// engine's error in words, never a panic.
    #[test]
    fn the_size_view_is_the_engines_report_or_its_error() {
        // what the worker sends the page for a design (`springline_worker::sized`)
        let view_of = |d: &Design| {
            let valid = springline_worker::validated(d);
            let traffic = springline_worker::traffic_report(&valid);
            size_view(&springline_worker::sized(&valid, &traffic).map(Arc::new))
        };
        let d = Design::demo();
        let SizeView::Ready(r) = view_of(&d) else { panic!("the demo sizes") };
        let rib = r.sizing.groups.iter().find(|g| g.group == "rib").expect("rib");
        assert!(matches!(rib.outcome, GroupOutcome::Sized { .. }), "{:?}", rib.outcome);
        assert!(!section_words(&rib.outcome).is_empty());
        // no ultimate combination: the engine says what to do
        let mut none = d.clone();
        none.traffic.combinations.retain(|c| c.permanent_unfavourable <= 1.0);
        match view_of(&none) {
            SizeView::Failed(e) => assert!(e.contains("no ultimate combination"), "{e}"),
            other => panic!("expected the engine's error, got {other:?}"),
        }
        // what the massing loop did, as the Settle button says it
        assert_eq!(
            massed_words(true, 1, 8140.4, 558.16, ""),
            "Settled after 1 pass: form thrust 8140 kN, steel 558.2 t."
        );
        assert_eq!(
            massed_words(true, 3, 8140.6, 558.0, ""),
            "Settled after 3 passes: form thrust 8141 kN, steel 558.0 t."
        );
        assert_eq!(
            massed_words(false, 12, 1.0, 1.0, "rib keeps changing"),
            "Not settled: rib keeps changing"
        );
        assert_eq!(
            section_words(&GroupOutcome::NotSized { reason: "member rib 1-2: too slender".into() }),
            "not sized: member rib 1-2: too slender"
        );
    }
}
