//! The web worker: posts `Ready`, then answers each request the page posts (JSON text in,
//! replies out as bytes, a `Uint8Array` each; `springline_worker::run_text`). A panic is logged to the
//! console; the page sees the worker's error event and says so.

/// The worker's allocator, as the page's (`crates/app/Cargo.toml` says why).
#[cfg(target_arch = "wasm32")]
#[global_allocator]
static ALLOCATOR: talc::wasm::WasmDynamicTalc = talc::wasm::new_wasm_dynamic_allocator();

#[cfg(target_arch = "wasm32")]
fn main() {
    use wasm_bindgen::closure::Closure;
    use wasm_bindgen::JsCast;
    console_error_panic_hook::set_once();
    let scope: web_sys::DedicatedWorkerGlobalScope = js_sys::global().unchecked_into();
    let poster = scope.clone();
    let post = move |bytes: Vec<u8>| {
        let _ = poster.post_message(&js_sys::Uint8Array::from(bytes.as_slice()));
    };
    let answer = post.clone();
    let on_message = Closure::<dyn FnMut(web_sys::MessageEvent)>::new(move |event: web_sys::MessageEvent| {
        let request = event.data().as_string().unwrap_or_default();
        springline_worker::run_text(&request, &mut |reply| answer(reply));
    });
    scope.set_onmessage(Some(on_message.as_ref().unchecked_ref()));
    // the handler lives as long as the worker
    on_message.forget();
    post(springline_worker::reply_bytes(&springline_worker::Reply::Ready));
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("springline-worker runs in the browser as a web worker (trunk builds it with the app)");
}
