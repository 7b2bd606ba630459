//! The results shown once edits pause: the traffic envelopes of the frame model, the
//! stability under the dead load and, while the sizing view is on, the size report. They
//! are worked out in the background worker (`springline_worker`, `Request::Settled`), not
//! on the page's thread: about 0.1 s at 16 panels and seconds at 64 with the sizing,
//! which on the page's thread were a pause a click or a key press could fall into.
//! Nothing is asked while a point is dragged; the last results stay on screen, marked as
//! for the design before the edit, until the new ones come.

use crate::components::stability::SHOWN_MODES;
use crate::state::AppState;
use crate::worker_job::{finish, Job, WORKER_STOPPED};
use leptos::prelude::*;
use springline_statics::link::permalink;
use springline_statics::Design;
use springline_worker::{Reply, Request};
use std::sync::Arc;
use std::time::Duration;

/// How long the design must rest before its results are asked for: longer than an edit
/// takes to paint, short enough to feel immediate.
const SETTLE_DELAY: Duration = Duration::from_millis(250);

/// Keeps `state.traffic`, `state.stability` and (while the sizing view is on)
/// `state.sized` for the design on screen: once the design and the view have rested for
/// `SETTLE_DELAY` (`pause::when_rested`; nothing while a point is dragged) a job is
/// started for the design (in the worker the last job left waiting, if any:
/// `worker_job::finish`), and its replies set them; a newer pause ends a worker still at
/// work on an older design. Turning the sizing view off asks nothing when the other two
/// are there. Installed once, with the state.
pub fn install(state: AppState) {
    let job = StoredValue::new_local(None::<Job>);
    let watch = move || (!state.dragging.get()).then(|| (state.design.get(), state.sizes.get()));
    crate::pause::when_rested(watch, SETTLE_DELAY, move |(design, size)| {
        let has = |d: Option<&Design>| d == Some(&design);
        let shown = state.traffic.with_untracked(|t| has(t.as_ref().map(|t| &t.0)))
            && state.stability.with_untracked(|s| has(s.as_ref().map(|s| &s.0)));
        if shown && (!size || state.sized.with_untracked(|s| has(s.as_ref().map(|s| &s.0)))) {
            // back to a design whose results are here (an undo): a job still at work on
            // another design ends, so its replies cannot replace these
            job.set_value(None);
            return;
        }
        let request = Request::Settled { design: permalink::to_transfer(&design), modes: SHOWN_MODES, size };
        let asked = design.clone();
        let started = Job::start(&request, move |reply| match reply {
            Reply::Traffic { outcome } => state.traffic.set(Some(Arc::new((asked.clone(), outcome)))),
            Reply::Stability { outcome } => {
                state.stability.set(Some(Arc::new((asked.clone(), outcome))));
                if !size {
                    finish(job);
                }
            }
            Reply::Sized { outcome } => {
                state.sized.set(Some(Arc::new((asked.clone(), outcome.map(Arc::new)))));
                finish(job);
            }
            Reply::Failed { message } => {
                failed(state, &asked, size, &worker_words(&message));
                job.set_value(None);
            }
            _ => {}
        });
        match started {
            // an older job still at work ends as it is dropped
            Ok(started) => job.set_value(Some(started)),
            Err(message) => failed(state, &design, size, &worker_words(&message)),
        }
    });
}

/// Why the worker gave no results, as the blocks that wait for them say it, with what to
/// do about it.
fn worker_words(message: &str) -> String {
    let why = if message == WORKER_STOPPED {
        "the background worker stopped with an error (see the browser console)"
    } else {
        message
    };
    format!("{why}; edit the design or reload the page to try again")
}

/// The results of `design` the worker did not give are `message` (a traffic report that
/// came before the worker failed stays); the size report too when `size`.
fn failed(state: AppState, design: &Design, size: bool, message: &str) {
    let has = |d: Option<&Design>| d == Some(design);
    if size && !state.sized.with_untracked(|s| has(s.as_ref().map(|s| &s.0))) {
        state.sized.set(Some(Arc::new((design.clone(), Err(message.to_string())))));
    }
    if !state.traffic.with_untracked(|t| has(t.as_ref().map(|t| &t.0))) {
        state.traffic.set(Some(Arc::new((design.clone(), Err(message.to_string())))));
    }
    if !state.stability.with_untracked(|s| has(s.as_ref().map(|s| &s.0))) {
        state.stability.set(Some(Arc::new((design.clone(), Err(message.to_string())))));
    }
}
