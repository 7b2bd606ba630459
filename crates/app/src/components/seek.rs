//! "Find the rise": goal seek on the rise (`arch::seek`), one goal at a time. The design
//! found replaces the one on screen as one undo step; a goal no rise meets says so with
//! the nearest value and changes nothing.
//!
//! The thrust, angle and clearance goals take a few dozen validations (milliseconds);
//! the least cost and least steel goals size every rise they try (seconds): every goal
//! runs in the background worker, so the page keeps answering, and "Finding..." shows
//! until the answer comes. An edit made meanwhile wins: the answer is then dropped.

use crate::format::{Quantity, Units};
use crate::state::{parse_number, AppState};
use crate::worker_job::{finish, Job};
use leptos::prelude::*;
use springline_statics::arch::seek::{Goal, Measure, Side};
use springline_statics::error::Field;
use springline_statics::link::permalink;
use springline_worker::{Reply, Request};

/// The goals the select offers: value, words, the target's quantity (none for least).
const GOALS: [(&str, &str, Option<Quantity>); 6] = [
    ("max-thrust", "form thrust at most", Some(Quantity::Force)),
    ("angle-left", "left springing resultant at (degrees below horizontal)", Some(Quantity::Angle)),
    ("angle-right", "right springing resultant at (degrees below horizontal)", Some(Quantity::Angle)),
    ("min-clearance", "clear gap between rib and deck at least", Some(Quantity::Length)),
    ("least-cost", "least cost index (sizes every rise: seconds)", None),
    ("least-steel", "least steel (sizes every rise: seconds)", None),
];

/// The goal of select value `key` with the target `si` (SI units).
pub fn goal_of(key: &str, si: f64) -> Option<Goal> {
    Some(match key {
        "max-thrust" => Goal::MaxThrust { thrust: si },
        "angle-left" => Goal::SpringingAngle { degrees: si, side: Side::Left },
        "angle-right" => Goal::SpringingAngle { degrees: si, side: Side::Right },
        "min-clearance" => Goal::MinClearance { gap: si },
        "least-cost" => Goal::Least { measure: Measure::Cost },
        "least-steel" => Goal::Least { measure: Measure::Steel },
        _ => return None,
    })
}

/// The panel.
#[component]
pub fn SeekPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let chosen = RwSignal::new("max-thrust".to_string());
    let target = RwSignal::new(String::new());
    let outcome = RwSignal::new(None::<(bool, String)>);
    let working = RwSignal::new(false);
    let job = StoredValue::new_local(None::<Job>);
    let quantity = move || chosen.with(|c| GOALS.iter().find(|g| g.0 == c).and_then(|g| g.2));
    let unit = move || quantity().map(|q| state.units.get().label(q)).unwrap_or_default();
    let run = move |_| {
        let key = chosen.get_untracked();
        let units: Units = state.units.get_untracked();
        let si = match quantity() {
            Some(q) => match parse_number(&target.get_untracked()) {
                Ok(v) => units.to_si(q, v),
                Err(e) => {
                    outcome.set(Some((false, format!("The target: {e}"))));
                    return;
                }
            },
            None => 0.0,
        };
        let Some(goal) = goal_of(&key, si) else { return };
        working.set(true);
        outcome.set(None);
        // in the background worker: the least-cost goal sizes every rise it tries
        let design = state.design.get_untracked();
        let request = Request::Seek { link: permalink::encode(&design), goal };
        let started = Job::start(&request, move |reply| {
            working.set(false);
            finish(job);
            match reply {
                Reply::Sought { met, message, evaluations, link } => {
                    if state.design.with_untracked(|d| *d != design) {
                        outcome.set(Some((
                            false,
                            "The design changed while the rise was sought; nothing changed. Find again."
                                .into(),
                        )));
                        return;
                    }
                    if !met {
                        outcome.set(Some((false, format!("{message} Nothing changed."))));
                        return;
                    }
                    let found = match permalink::decode(&link) {
                        Ok(found) => found,
                        Err(e) => {
                            return outcome
                                .set(Some((false, format!("The design found cannot be read: {e}"))))
                        }
                    };
                    if found != design {
                        if let Err(e) = state.try_edit(Field::CrownRise, |d| *d = found.clone()) {
                            outcome.set(Some((false, format!("The design found is refused: {e}"))));
                            return;
                        }
                    }
                    outcome.set(Some((true, format!("{message} ({evaluations} designs tried)."))));
                }
                Reply::Failed { message } => outcome.set(Some((false, format!("Cannot seek: {message}")))),
                _ => {}
            }
        });
        match started {
            Ok(j) => job.set_value(Some(j)),
            Err(e) => {
                working.set(false);
                outcome.set(Some((false, format!("Cannot seek: {e}"))));
            }
        }
    };
    let options =
        GOALS.iter().map(|(key, words, _)| view! { <option value=*key>{*words}</option> }).collect_view();
    view! {
        <details class="panel" id="seek-panel">
            <summary><h3>"Find the rise"</h3></summary>
            <p class="hint">"The rise that meets one goal, everything else held; the crown follows. One undo step."</p>
            <div class="field">
                <label for="seek-goal">"Goal"</label>
                <select id="seek-goal" prop:value=move || chosen.get()
                    on:change=move |ev| { chosen.set(event_target_value(&ev)); outcome.set(None); }>
                    {options}
                </select>
            </div>
            <Show when=move || quantity().is_some()>
                <div class="field">
                    <label for="seek-target">"Target"</label>
                    <input id="seek-target" type="text" inputmode="decimal" prop:value=move || target.get()
                        on:change=move |ev| target.set(event_target_value(&ev)) />
                    <span class="unit">{unit}</span>
                </div>
            </Show>
            <button type="button" id="seek-run" on:click=run disabled=move || working.get()>
                {move || if working.get() { "Finding..." } else { "Find" }}
            </button>
            {move || outcome.get().map(|(ok, words)| view! {
                <p id="seek-result" class=if ok { "hint" } else { "error" } role="status">{words}</p>
            })}
        </details>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Every goal of the select builds its engine goal with the target given.
    #[test]
    fn every_goal_of_the_select_builds() {
        for (key, _, q) in GOALS {
            let g = goal_of(key, 12.5).unwrap_or_else(|| panic!("{key}"));
            match (g, q) {
                (Goal::MaxThrust { thrust }, Some(Quantity::Force)) => assert_eq!(thrust, 12.5),
                (Goal::SpringingAngle { degrees, .. }, Some(Quantity::Angle)) => assert_eq!(degrees, 12.5),
                (Goal::MinClearance { gap }, Some(Quantity::Length)) => assert_eq!(gap, 12.5),
                (Goal::Least { .. }, None) => {}
                other => panic!("{key}: {other:?}"),
            }
        }
        assert_eq!(goal_of("no such goal", 1.0), None);
    }
}
