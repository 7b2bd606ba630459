//! Springline in the browser: mounts the app. A panic hook reports any panic on the page
//! as the last line of defence (the app validates input so none should happen).

mod app;
mod canvas;
mod components;
mod dom;
mod drag;
mod forces;
mod format;
mod options;
mod paint;
mod pause;
mod permalink_sync;
mod settled;
mod state;
mod timing;
mod worker_job;

/// The page's allocator: talc rather than the standard library's dlmalloc, as fast here
/// and smaller (`Cargo.toml`).
#[cfg(target_arch = "wasm32")]
#[global_allocator]
static ALLOCATOR: talc::wasm::WasmDynamicTalc = talc::wasm::new_wasm_dynamic_allocator();

fn main() {
    console_error_panic_hook::set_once();
    std::panic::set_hook(Box::new(|info| {
        console_error_panic_hook::hook(info);
        show_panic(&info.to_string());
    }));
    leptos::mount::mount_to_body(app::App);
}

/// Puts a visible message on the page after a panic.
fn show_panic(message: &str) {
    let Some(doc) = web_sys::window().and_then(|w| w.document()) else { return };
    let Ok(div) = doc.create_element("div") else { return };
    div.set_class_name("panic");
    div.set_text_content(Some(&format!(
        "Something went wrong inside Springline and the page stopped updating. Reload to continue; your \
         design is in the address bar. Details: {message}"
    )));
    if let Some(body) = doc.body() {
        let _ = body.append_child(&div);
    }
}
