//! One piece of long work in a web worker (`springline_worker`): the request is posted to a
//! worker once it says it is ready, and each reply handed to the caller on the page's
//! thread. Dropping the job (or cancelling it) ends the worker, so a cancelled sweep stops
//! at once and never posts again; a job ended by [`finish`] after its last reply leaves
//! its worker waiting, idle, for the next job.
//!
//! Why workers are kept: a fresh worker loads and compiles the engine (about 25 ms here)
//! and then runs it in the browser's first, unoptimised tier. Measured in headless
//! Chromium at 16 panels, one worker asked for the same sized design seven times answered
//! in about 245, 165, 105, 85, 90, 90 ms: the first answer of every fresh worker costs
//! nearly three times a warm one. The results shown once edits pause are asked for at
//! every pause, so they come from a warm worker after the first.

use leptos::prelude::{LocalStorage, StoredValue, UpdateValue};
use springline_worker::{Reply, Request};
use std::cell::{Cell, RefCell};
use std::rc::Rc;
use wasm_bindgen::closure::Closure;
use wasm_bindgen::{JsCast, JsValue};
use web_sys::{MessageEvent, Worker};

/// The worker's loader script, written by trunk next to the page (`web/index.html`).
const WORKER_SCRIPT: &str = "./springline-worker_loader.js";

/// The words of the `Reply::Failed` a job gives when its worker stops with an error (they
/// say the design stays, so a caller need not).
pub const WORKER_STOPPED: &str =
    "the background worker stopped with an error (see the browser console); the design on screen is unchanged";

/// How many idle workers wait for a job: one serves the pauses' results, one job after
/// another; a second job at the same time (an option's numbers) starts its own worker,
/// ended when it finishes while another waits.
const MOST_IDLE: usize = 1;

thread_local! {
    /// The workers whose last job finished, each ready for a request.
    static IDLE: RefCell<Vec<Worker>> = const { RefCell::new(Vec::new()) };
}

/// A running job; ends its worker when dropped.
pub struct Job {
    worker: Worker,
    /// Set when the worker stopped with an error or sent a reply that cannot be read: it
    /// is ended, never kept.
    stopped: Rc<Cell<bool>>,
    /// Set by `release`: the worker is kept idle, not ended, as the job drops.
    kept: bool,
    // kept so the handlers live as long as the worker
    _on_message: Closure<dyn FnMut(MessageEvent)>,
    _on_error: Closure<dyn FnMut(web_sys::Event)>,
}

impl Job {
    /// Starts a worker for `request`; `on_reply` gets each reply (a worker that fails to
    /// load or stops with an error gives one `Reply::Failed`).
    pub fn start(request: &Request, on_reply: impl Fn(Reply) + Clone + 'static) -> Result<Job, String> {
        let text = serde_json::to_string(request).map_err(|e| e.to_string())?;
        let idle = IDLE.with(|idle| idle.borrow_mut().pop());
        let ready = idle.is_some();
        let worker = match idle {
            Some(worker) => worker,
            None => Worker::new(WORKER_SCRIPT).map_err(|_| {
                "the browser did not start the page's background worker; reload the page and try again"
                    .to_string()
            })?,
        };
        // a kept worker said it was ready long ago: the request goes once the handlers are on
        let at_once = ready.then(|| JsValue::from_str(&text));
        let poster = worker.clone();
        let reply = on_reply.clone();
        let stopped = Rc::new(Cell::new(false));
        let unreadable = stopped.clone();
        let on_message = Closure::<dyn FnMut(MessageEvent)>::new(move |event: MessageEvent| {
            let parsed = match event.data().dyn_into::<js_sys::Uint8Array>() {
                Ok(bytes) => springline_worker::read_reply(&bytes.to_vec()),
                Err(_) => Err(springline_worker::UNREADABLE_REPLY.into()),
            };
            match parsed {
                Ok(Reply::Ready) => {
                    let _ = poster.post_message(&JsValue::from_str(&text));
                }
                Ok(other) => reply(other),
                Err(message) => {
                    // a worker whose replies cannot be read (another build's) is not kept
                    unreadable.set(true);
                    reply(Reply::Failed { message })
                }
            }
        });
        let marked = stopped.clone();
        let on_error = Closure::<dyn FnMut(web_sys::Event)>::new(move |_event: web_sys::Event| {
            marked.set(true);
            on_reply(Reply::Failed { message: WORKER_STOPPED.into() })
        });
        worker.set_onmessage(Some(on_message.as_ref().unchecked_ref()));
        worker.set_onerror(Some(on_error.as_ref().unchecked_ref()));
        if let Some(request) = at_once {
            let _ = worker.post_message(&request);
        }
        Ok(Job { worker, stopped, kept: false, _on_message: on_message, _on_error: on_error })
    }

    /// Ends the job after its last reply, its worker kept idle for the next job (unless
    /// it stopped with an error, or another worker already waits: then it ends).
    fn release(mut self) {
        if self.stopped.get() {
            return;
        }
        IDLE.with(|idle| {
            let mut idle = idle.borrow_mut();
            if idle.len() < MOST_IDLE {
                idle.push(self.worker.clone());
                self.kept = true;
            }
        });
    }
}

/// Ends the job held in `slot` after its last reply (the replies it was asked for have all
/// come): its worker waits, idle, for the next job. Dropping the job instead (setting the
/// slot to `None`) ends the worker, which is how work still under way is cancelled.
pub fn finish(slot: StoredValue<Option<Job>, LocalStorage>) {
    if let Some(job) = slot.try_update_value(Option::take).flatten() {
        job.release();
    }
}

/// [`finish`] for the job at `index` of jobs running side by side (the shares of a
/// sweep): the others run on.
pub fn finish_one(slots: StoredValue<Vec<Option<Job>>, LocalStorage>, index: usize) {
    if let Some(job) = slots.try_update_value(|jobs| jobs.get_mut(index).and_then(Option::take)).flatten() {
        job.release();
    }
}

impl Drop for Job {
    fn drop(&mut self) {
        self.worker.set_onmessage(None);
        self.worker.set_onerror(None);
        if !self.kept {
            self.worker.terminate();
        }
    }
}
