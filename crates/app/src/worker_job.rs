//! One piece of long work in a web worker (`springline_worker`): the worker is started for
//! the job, the request posted once it says it is ready, and each reply handed to the
//! caller on the page's thread. Dropping the job (or cancelling it) ends the worker, so a
//! cancelled sweep stops at once and never posts again.

use springline_worker::{Reply, Request};
use wasm_bindgen::closure::Closure;
use wasm_bindgen::{JsCast, JsValue};
use web_sys::{MessageEvent, Worker};

/// The worker's loader script, written by trunk next to the page (`web/index.html`).
const WORKER_SCRIPT: &str = "./springline-worker_loader.js";

/// The words of the `Reply::Failed` a job gives when its worker stops with an error (they
/// say the design stays, so a caller need not).
pub const WORKER_STOPPED: &str =
    "the background worker stopped with an error (see the browser console); the design on screen is unchanged";

/// A running job; ends its worker when dropped.
pub struct Job {
    worker: Worker,
    // kept so the handlers live as long as the worker
    _on_message: Closure<dyn FnMut(MessageEvent)>,
    _on_error: Closure<dyn FnMut(web_sys::Event)>,
}

impl Job {
    /// Starts a worker for `request`; `on_reply` gets each reply (a worker that fails to
    /// load or stops with an error gives one `Reply::Failed`).
    pub fn start(request: &Request, on_reply: impl Fn(Reply) + Clone + 'static) -> Result<Job, String> {
        let text = serde_json::to_string(request).map_err(|e| e.to_string())?;
        let worker = Worker::new(WORKER_SCRIPT).map_err(|_| {
            "the browser did not start the page's background worker; reload the page and try again"
                .to_string()
        })?;
        let poster = worker.clone();
        let reply = on_reply.clone();
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
                Err(message) => reply(Reply::Failed { message }),
            }
        });
        let on_error = Closure::<dyn FnMut(web_sys::Event)>::new(move |_event: web_sys::Event| {
            on_reply(Reply::Failed { message: WORKER_STOPPED.into() })
        });
        worker.set_onmessage(Some(on_message.as_ref().unchecked_ref()));
        worker.set_onerror(Some(on_error.as_ref().unchecked_ref()));
        Ok(Job { worker, _on_message: on_message, _on_error: on_error })
    }
}

impl Drop for Job {
    fn drop(&mut self) {
        self.worker.set_onmessage(None);
        self.worker.set_onerror(None);
        self.worker.terminate();
    }
}
