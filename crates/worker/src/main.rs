//! The web worker: posts `Ready`, then answers each request the page posts (JSON text in,
//! JSON text replies out; `springline_worker::run_text`). A panic is logged to the
//! console; the page sees the worker's error event and says so.

#[cfg(target_arch = "wasm32")]
fn main() {
    use wasm_bindgen::closure::Closure;
    use wasm_bindgen::{JsCast, JsValue};
    console_error_panic_hook::set_once();
    let scope: web_sys::DedicatedWorkerGlobalScope = js_sys::global().unchecked_into();
    let poster = scope.clone();
    let post = move |text: String| {
        let _ = poster.post_message(&JsValue::from_str(&text));
    };
    let answer = post.clone();
    let on_message = Closure::<dyn FnMut(web_sys::MessageEvent)>::new(move |event: web_sys::MessageEvent| {
        let request = event.data().as_string().unwrap_or_default();
        springline_worker::run_text(&request, &mut |reply| answer(reply));
    });
    scope.set_onmessage(Some(on_message.as_ref().unchecked_ref()));
    // the handler lives as long as the worker
    on_message.forget();
    post(serde_json::to_string(&springline_worker::Reply::Ready).unwrap_or_default());
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("springline-worker runs in the browser as a web worker (trunk builds it with the app)");
}
