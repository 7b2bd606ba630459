//! The envelope view: which extra load cases the analysis carries (a named traffic
//! pattern chosen in the load picker, or the governing placements of the picked line),
//! the member picked on the elevation, and the panel under the drawings that says what
//! the envelope shows (the basis, the picked member's range, the largest tension and
//! compression) with the choice of the largest or smallest effect's placement.
//!
//! The numbers are the engine's traffic report (`arch::traffic`), computed once edits
//! pause; the envelope and the placement follow the report of the design on screen.

use crate::format::{Quantity, Units};
use crate::state::AppState;
use leptos::prelude::*;
use springline_statics::arch::actions::action_cases;
use springline_statics::arch::cases::{pattern_case, standard_cases, CaseSpec};
use springline_statics::arch::readout::MemberKey;
use springline_statics::arch::traffic::{placement_case, TrafficReport};
use springline_statics::arch::validate::ValidDesign;
use springline_statics::scene::envelope::{extreme_member, member_ranges, range_of, Basis};
use springline_statics::{Analysis, ModelKind};
use std::sync::Arc;

/// The traffic report of the design the drawings show (`design`, which a drag moves), if
/// it is ready and the engine has one.
pub fn current_report(state: AppState) -> Option<Arc<(springline_statics::Design, TrafficReport)>> {
    report_for(state, state.design.get())
}

/// The traffic report of the design the panels show (`settled_design`, held during a
/// drag), if it is ready and the engine has one.
pub fn settled_report(state: AppState) -> Option<Arc<(springline_statics::Design, TrafficReport)>> {
    report_for(state, state.settled_design.get())
}

fn report_for(
    state: AppState,
    design: springline_statics::Design,
) -> Option<Arc<(springline_statics::Design, TrafficReport)>> {
    let traffic = state.traffic.get()?;
    if traffic.0 != design {
        return None;
    }
    let report = traffic.1.as_ref().ok()?.as_ref()?.clone();
    Some(Arc::new((design, report)))
}

/// The load cases the analysis carries besides its own, and the case to show: a named
/// pattern (shown), else one of the other actions by its case id (shown; `arch::actions`),
/// else in the envelope view the governing placements of line `picked`
/// of `report` (largest first; the one of `largest` shown, the dead load while there is
/// none). `standard` is the number of the analysis's own cases.
pub fn extra_cases(
    valid: &ValidDesign,
    pattern: Option<springline_statics::arch::cases::Pattern>,
    action: Option<&str>,
    envelope: Option<(Option<&TrafficReport>, Option<&str>, bool)>,
) -> (Vec<CaseSpec>, Option<usize>) {
    let standard = standard_cases(valid).len() + 1;
    if let Some(p) = pattern {
        return match pattern_case(valid, p) {
            Ok(spec) => (vec![spec], Some(standard)),
            Err(_) => (Vec::new(), Some(0)),
        };
    }
    if let Some(id) = action {
        return match action_cases(valid.design()).into_iter().find(|c| c.kind.id() == id) {
            Some(spec) => (vec![spec], Some(standard)),
            None => (Vec::new(), Some(0)),
        };
    }
    let Some((report, picked, largest)) = envelope else { return (Vec::new(), None) };
    match report.zip(picked).and_then(|(r, name)| r.line(name)) {
        Some(line) => (
            vec![placement_case(valid, line, true), placement_case(valid, line, false)],
            Some(standard + usize::from(!largest)),
        ),
        None => (Vec::new(), Some(0)),
    }
}

/// Keeps `state.extra` and the case shown in step with the load picker's choice, the
/// picked line and the traffic report (not while dragging: the analysis of each dragged
/// design stays the plain one).
pub fn install(state: AppState) {
    Effect::new(move |_| {
        if state.dragging.get() {
            return;
        }
        let design = state.design.get();
        let pattern = state.pattern.get();
        let action = state.action.get();
        let envelope = state.envelope.get();
        let picked = state.picked.get();
        let largest = state.largest.get();
        let report = current_report(state);
        // the validation the state keeps (form finding is not repeated here)
        let Ok(valid) = state.valid.get() else { return };
        let (specs, case) = extra_cases(
            &valid,
            pattern,
            action.as_deref(),
            envelope.then(|| (report.as_ref().map(|r| &r.1), picked.as_deref(), largest)),
        );
        let extra = (!specs.is_empty()).then(|| Arc::new((design, specs)));
        if state.extra.with_untracked(|e| *e != extra) {
            state.extra.set(extra);
        }
        // the case is tracked too: the link sync puts back the case it knew when the
        // analysis changes, and this puts the chosen one back once more
        if let Some(case) = case.filter(|c| *c != state.case.get()) {
            state.case.set(case);
        }
    });
}

/// The frame model's line name of the member `key` is (its axial force), if the frame
/// model has it.
pub fn line_of_member(a: &Analysis, key: MemberKey) -> Option<String> {
    let k = key.member_in(&a.frame.map, ModelKind::Frame)?;
    Some(a.frame.model.members.get(k)?.name.clone())
}

/// Picks the member `key` (its axial force line), when the frame model has it.
pub fn pick_member(state: AppState, key: Option<MemberKey>) {
    let Some(key) = key else { return };
    let name = state.analysis.with_untracked(|o| line_of_member(o.as_ref().ok()?, key));
    if name.is_some() && state.picked.get_untracked() != name {
        state.picked.set(name);
    }
}

/// The frame member index a line name is the axial force of.
pub fn member_of_line(a: &Analysis, line: &str) -> Option<usize> {
    a.frame.model.members.iter().position(|m| m.name == line)
}

/// A value with its SI number in `data-value` (for tests), shown in `units`.
fn force(id: &'static str, si: f64, units: Units) -> impl IntoView {
    view! { <strong id=id data-value=format!("{si}")>{units.show(Quantity::Force, si)}</strong> }
}

/// The panel of the envelope view, under the drawings.
#[component]
pub fn EnvelopePanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let body = move || {
        let units = state.units.get();
        let basis = state.basis.get();
        let Some(report) = settled_report(state) else {
            return view! { <p class="hint" id="envelope-waiting">"Computing the traffic envelopes..."</p> }
                .into_any();
        };
        let r = &report.1;
        let Ok(a) = state.settled_analysis.get() else { return ().into_any() };
        let ranges = member_ranges(&a, r, basis);
        let name = |k: usize| a.frame.model.member_label(k);
        let extreme = |tension: bool, id: &'static str, words: &'static str| {
            extreme_member(&ranges, tension).map(|(k, v)| {
                view! { <li data-member=name(k)>{words}" "{force(id, v, units)}" in "{name(k)}</li> }
            })
        };
        let picked = state.picked.get().and_then(|line| {
            let l = r.line(&line)?;
            let (max, min) = range_of(l, basis)?;
            let extreme = if state.largest.get() { &l.traffic_max } else { &l.traffic_min };
            let rib = extreme
                .rib
                .map_or_else(|| "the whole cross-section".to_string(), |r| format!("rib line {}", r + 1));
            Some(view! {
                <p id="envelope-picked" data-line=line.clone()>
                    <span class="what">{line.clone()}": "</span>
                    "largest "{force("envelope-picked-max", max, units)}", smallest "
                    {force("envelope-picked-min", min, units)}
                    {format!(
                        ". Drawn: the traffic for its {} effect ({}, {rib}).",
                        if state.largest.get() { "largest" } else { "smallest" },
                        extreme.arrangement
                    )}
                </p>
            })
        });
        let options = std::iter::once((Basis::Characteristic, Basis::Characteristic.words(r)))
            .chain((0..r.combinations.len()).map(|k| (Basis::Design(k), Basis::Design(k).words(r))))
            .enumerate()
            .map(|(i, (b, words))| view! { <option value=i.to_string() selected=b == basis>{words}</option> })
            .collect_view();
        let on_basis = move |ev: leptos::ev::Event| {
            let i: usize = event_target_value(&ev).parse().unwrap_or(0);
            state.basis.set(if i == 0 { Basis::Characteristic } else { Basis::Design(i - 1) });
        };
        view! {
            <label class="envelope-basis">"Values: "
                <select id="envelope-basis" on:change=on_basis>{options}</select>
            </label>
            <ul class="envelope-extremes">
                {extreme(false, "envelope-compression", "Largest compression")}
                {extreme(true, "envelope-tension", "Largest tension")}
            </ul>
            {match picked {
                Some(p) => p.into_any(),
                None => view! {
                    <p class="hint" id="envelope-hint">"Click a member on the elevation to see where the traffic governs it."</p>
                }.into_any(),
            }}
        }
        .into_any()
    };
    let extreme_button = move |largest: bool, words: &'static str| {
        view! {
            <button type="button" class="small" id=if largest { "envelope-largest" } else { "envelope-smallest" }
                aria-pressed=move || (state.largest.get() == largest).to_string()
                on:click=move |_| state.largest.set(largest)>{words}</button>
        }
    };
    view! {
        <Show when=move || state.envelope.get()>
            <section class="envelope-panel" id="envelope-panel" aria-label="Traffic envelope">
                <div class="envelope-row">
                    {body}
                    <span class="envelope-which" role="group" aria-label="Placement shown">
                        "Placement for the "
                        {extreme_button(true, "largest")}
                        {extreme_button(false, "smallest")}
                        " effect"
                    </span>
                </div>
                <p class="hint">"Per rib line, tension positive. Concept design only."</p>
            </section>
        </Show>
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use springline_statics::arch::cases::{CaseKind, Pattern};
    use springline_statics::arch::traffic::traffic_envelopes;
    use springline_statics::Design;

    /// A pattern is one extra case shown after the analysis's own three (dead, left half,
    /// heavier panel); the envelope with a picked member brings both its placements, the
    /// smallest's shown when asked; without a report or a pick, the dead load.
    #[test]
    fn extra_cases_follow_the_choice() {
        let d = Design::demo();
        let valid = ValidDesign::new(&d).expect("valid");
        let (specs, case) = extra_cases(&valid, Some(Pattern::Quarter(2)), None, None);
        assert_eq!(case, Some(3));
        assert!(matches!(specs[0].kind, CaseKind::Quarter { quarter: 2, .. }), "{:?}", specs[0].kind);
        // an action alone, by its id: the erection stage
        let (specs, case) = extra_cases(&valid, None, Some("erection"), None);
        assert_eq!(case, Some(3));
        assert_eq!(specs[0].kind, CaseKind::Erection);
        assert_eq!(extra_cases(&valid, None, Some("no-such-action"), None), (Vec::new(), Some(0)));
        let r = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("frame");
        let (specs, case) = extra_cases(&valid, None, None, Some((Some(&r), Some("rib 3-4"), false)));
        assert_eq!(case, Some(4));
        assert_eq!(specs.len(), 2);
        assert_eq!(specs[0].kind, CaseKind::Placement { max: true });
        assert_eq!(specs[1], placement_case(&valid, r.line("rib 3-4").expect("line"), false));
        assert_eq!(extra_cases(&valid, None, None, Some((Some(&r), None, true))), (Vec::new(), Some(0)));
        assert_eq!(extra_cases(&valid, None, None, None), (Vec::new(), None));
    }
}
