//! "Files": the design taken out of the meeting and brought back. Drawings as SVG (the
//! engine's scenes through `scene::svg`, at the canvases' sizes) and PNG (the canvases at
//! the screen's pixel ratio), the member table (CSV), the options compared (CSV) and the
//! design file with its summary (JSON): the table, the design file and the drawings are
//! made in the background worker by `springline_statics::export`, the same function
//! `springline export` runs, so the files are the same bytes. A design file of any
//! version opens from the file button or dropped anywhere on the page (read in the worker,
//! which sends the design back); a file that does not open says why and the design on
//! screen stays.

use crate::options::OptionsState;
use crate::state::AppState;
use crate::worker_job::{finish, Job, WORKER_STOPPED};
use leptos::prelude::*;
use springline_statics::arch::tables::comparison_csv;
use springline_statics::export::Export;
use springline_statics::link::permalink;
use springline_worker::{Reply, Request};
use wasm_bindgen::closure::Closure;
use wasm_bindgen::{JsCast, JsValue};

/// Offers `text` as a download named `file_name` of type `mime`. Errors in words.
fn download_text(file_name: &str, text: &str, mime: &str) -> Result<(), String> {
    let parts = js_sys::Array::of1(&JsValue::from_str(text));
    let options = web_sys::BlobPropertyBag::new();
    options.set_type(mime);
    let blob = web_sys::Blob::new_with_str_sequence_and_options(&parts, &options)
        .map_err(|_| "the browser refused to make the file".to_string())?;
    let url =
        web_sys::Url::create_object_url_with_blob(&blob).map_err(|_| "the browser refused a file link")?;
    if let Err(e) = download_url(file_name, &url) {
        let _ = web_sys::Url::revoke_object_url(&url);
        return Err(e);
    }
    // the link is freed once the download has surely started
    let freed = url.clone();
    set_timeout(
        move || {
            let _ = web_sys::Url::revoke_object_url(&freed);
        },
        std::time::Duration::from_secs(30),
    );
    Ok(())
}

/// Offers the resource at `url` (an object or data URL) as a download named `file_name`.
fn download_url(file_name: &str, url: &str) -> Result<(), String> {
    let document = web_sys::window().and_then(|w| w.document()).ok_or("no page")?;
    let anchor = document
        .create_element("a")
        .ok()
        .and_then(|e| e.dyn_into::<web_sys::HtmlAnchorElement>().ok())
        .ok_or("the browser refused a download link")?;
    anchor.set_href(url);
    anchor.set_download(file_name);
    anchor.click();
    Ok(())
}

/// The PNG of canvas `id` (its backing store: the screen's pixel ratio) as a download.
fn download_png(id: &str, file_name: &str) -> Result<(), String> {
    let canvas = web_sys::window()
        .and_then(|w| w.document())
        .and_then(|d| d.get_element_by_id(id))
        .and_then(|e| e.dyn_into::<web_sys::HtmlCanvasElement>().ok())
        .ok_or("the drawing is not on the page")?;
    let url =
        canvas.to_data_url_with_type("image/png").map_err(|_| "the browser refused the drawing's image")?;
    download_url(file_name, &url)
}

/// The CSS size of canvas `id` (what an SVG of it is drawn at).
fn canvas_size(id: &str) -> (f64, f64) {
    web_sys::window()
        .and_then(|w| w.document())
        .and_then(|d| d.get_element_by_id(id))
        .map(|e| (e.client_width() as f64, e.client_height() as f64))
        .filter(|(w, h)| *w >= 1.0 && *h >= 1.0)
        .unwrap_or(springline_statics::export::DRAWING_SIZE)
}

/// What the Files panel says (`true`: done; `false`: refused, in the error style).
type Message = RwSignal<Option<(bool, String)>>;

/// Opens the design the worker read from the file `source` (`permalink::to_transfer`
/// text) as one undo step, or says why not (the design stays).
fn open_read_design(state: AppState, text: &str, source: &str) -> Result<(), String> {
    let design = permalink::from_transfer(text).map_err(|e| format!("{source} could not be opened ({e})"))?;
    state.check(&design).map_err(|e| format!("{source} holds a design that cannot be analysed ({e})"))?;
    state.commit(design);
    Ok(())
}

/// Opens the design file `text` (named `source` in the words): the background worker
/// reads it (the page carries no design-file reader: about a ninth of its bundle) and
/// sends the design back, which opens as one undo step. The outcome goes to `message`;
/// `job` keeps the worker until it replies.
fn open_design_text(state: AppState, text: String, source: String, message: Message, job: OpenJob) {
    message.set(Some((true, format!("Opening {source}..."))));
    let say = move |result: Result<String, String>| match result {
        Ok(done) => message.set(Some((true, done))),
        Err(e) => message.set(Some((false, format!("{e}. The design on screen is unchanged.")))),
    };
    let named = source.clone();
    let started = Job::start(&Request::Open { text }, move |reply| {
        let result = match reply {
            Reply::Opened { design } => open_read_design(state, &design, &named),
            // a worker that stopped says itself that the design stays
            Reply::Failed { message: why } if why == WORKER_STOPPED => {
                finish(job);
                return message.set(Some((false, format!("{named} could not be opened ({why})"))));
            }
            Reply::Failed { message: why } => Err(format!("{named} could not be opened ({why})")),
            _ => return,
        };
        finish(job);
        say(result.map(|()| format!("Opened {named}.")));
    });
    match started {
        Ok(started) => job.set_value(Some(started)),
        Err(e) => say(Err(format!("{source} could not be opened: {e}"))),
    }
}

/// The callbacks of the last file read (kept alive until the next).
type Held = StoredValue<Option<(Closure<dyn FnMut(JsValue)>, Closure<dyn FnMut(JsValue)>)>, LocalStorage>;

/// The worker reading the last design file, until it replies.
type OpenJob = StoredValue<Option<Job>, LocalStorage>;

/// Reads `file` and opens it; the outcome goes to `message`.
fn open_file(state: AppState, file: web_sys::File, message: Message, held: Held, opening: OpenJob) {
    let name = file.name();
    if file.size() > 4.0 * 1024.0 * 1024.0 {
        message.set(Some((
            false,
            format!("'{name}' is {:.1} MB; a design file is a few kB. Nothing changed.", file.size() / 1e6),
        )));
        return;
    }
    let source = format!("'{name}'");
    let done = Closure::once(move |value: JsValue| {
        open_design_text(state, value.as_string().unwrap_or_default(), source, message, opening);
    });
    let failed = Closure::once(move |_: JsValue| {
        message.set(Some((false, "The file could not be read. The design on screen is unchanged.".into())))
    });
    let _ = file.text().then2(&done, &failed);
    // the callbacks live until the next file is opened (by then this promise has settled)
    held.set_value(Some((done, failed)));
}

/// The panel.
#[component]
pub fn FilesPanel() -> impl IntoView {
    let state = expect_context::<AppState>();
    let options = expect_context::<OptionsState>();
    let message: Message = RwSignal::new(None);
    let job = StoredValue::new_local(None::<Job>);
    let held: Held = StoredValue::new_local(None);
    let opening: OpenJob = StoredValue::new_local(None);
    let working = RwSignal::new(false);
    let make = move |what: Export| {
        let link = state.design.with_untracked(permalink::encode);
        working.set(true);
        message.set(None);
        let started = Job::start(&Request::Export { link, export: what }, move |reply| {
            working.set(false);
            finish(job);
            match reply {
                Reply::Exported { file_name, text } => {
                    let mime = match what {
                        Export::MemberTable => "text/csv",
                        Export::DesignFile => "application/json",
                        Export::ElevationSvg { .. } | Export::ForceSvg { .. } => "image/svg+xml",
                    };
                    match download_text(&file_name, &text, mime) {
                        Ok(()) => message.set(Some((true, format!("Saved {file_name}.")))),
                        Err(e) => message.set(Some((false, format!("{file_name} could not be saved: {e}.")))),
                    }
                }
                Reply::Failed { message: why } => {
                    message.set(Some((false, format!("The file could not be made: {why}"))))
                }
                _ => {}
            }
        });
        match started {
            Ok(j) => job.set_value(Some(j)),
            Err(e) => {
                working.set(false);
                message.set(Some((false, format!("The file could not be made: {e}"))));
            }
        }
    };
    let svg = move |id: &'static str| {
        let (width, height) = canvas_size(id);
        if id == "elevation" {
            Export::ElevationSvg { width, height }
        } else {
            Export::ForceSvg { width, height }
        }
    };
    let stem = move || {
        Export::MemberTable
            .file_name(&state.design.with_untracked(|d| d.name.clone()))
            .replace("-members.csv", "")
    };
    let png = move |id: &'static str, what: &str| {
        let name = format!("{}-{what}.png", stem());
        match download_png(id, &name) {
            Ok(()) => message.set(Some((true, format!("Saved {name}.")))),
            Err(e) => message.set(Some((false, format!("{name} could not be saved: {e}.")))),
        }
    };
    let options_csv = move |_| {
        let shown = options.shown();
        let numbers: Option<Vec<_>> = options.numbers.with_untracked(|n| {
            shown.iter().map(|o| n.get(&permalink::encode(&o.design)).cloned()).collect()
        });
        match numbers {
            _ if shown.is_empty() => {
                message.set(Some((false, "No options yet: save one first (Alt+S), then export them.".into())))
            }
            Some(numbers) => {
                let names: Vec<String> = shown.iter().map(|o| o.name.clone()).collect();
                let name = format!("{}-options.csv", stem());
                match download_text(&name, &comparison_csv(&names, &numbers), "text/csv") {
                    Ok(()) => message.set(Some((true, format!("Saved {name}.")))),
                    Err(e) => message.set(Some((false, format!("{name} could not be saved: {e}.")))),
                }
            }
            None => message.set(Some((
                false,
                "The options' numbers are still being worked out; export again in a moment.".into(),
            ))),
        }
    };
    let on_file = move |ev: leptos::ev::Event| {
        let input = ev.target().and_then(|t| t.dyn_into::<web_sys::HtmlInputElement>().ok());
        if let Some(file) = input.as_ref().and_then(|i| i.files()).and_then(|f| f.get(0)) {
            open_file(state, file, message, held, opening);
        }
        if let Some(i) = input {
            // the same file can be chosen again
            i.set_value("");
        }
    };
    // a design file dropped anywhere on the page opens; other drops (text into a field)
    // keep the browser's own handling
    let carries_files = |ev: &web_sys::DragEvent| {
        ev.data_transfer().is_some_and(|d| d.types().includes(&JsValue::from_str("Files"), 0))
    };
    let over = window_event_listener(leptos::ev::dragover, move |ev: web_sys::DragEvent| {
        if carries_files(&ev) {
            ev.prevent_default();
        }
    });
    let drop = window_event_listener(leptos::ev::drop, move |ev: web_sys::DragEvent| {
        if !carries_files(&ev) {
            return;
        }
        ev.prevent_default();
        let Some(files) = ev.data_transfer().and_then(|d| d.files()) else { return };
        if let Some(file) = files.get(0) {
            open_file(state, file, message, held, opening);
            if files.length() > 1 {
                message.set(Some((true, "Several files were dropped: the first one is opened.".into())));
            }
        }
    });
    on_cleanup(move || {
        over.remove();
        drop.remove();
    });
    view! {
        <section class="files-panel" id="files-panel" aria-labelledby="files-title">
            <div class="files-head">
                <h3 id="files-title">"Files"</h3>
                <span class="files-group" role="group" aria-label="Drawings">
                    <button type="button" class="small" id="export-elevation-svg" on:click=move |_| make(svg("elevation"))>"elevation SVG"</button>
                    <button type="button" class="small" id="export-elevation-png" on:click=move |_| png("elevation", "elevation")>"elevation PNG"</button>
                    <button type="button" class="small" id="export-force-svg" on:click=move |_| make(svg("forces"))>"force diagram SVG"</button>
                    <button type="button" class="small" id="export-force-png" on:click=move |_| png("forces", "forces")>"force diagram PNG"</button>
                </span>
                <span class="files-group" role="group" aria-label="Tables and the design">
                    <button type="button" class="small" id="export-members-csv" on:click=move |_| make(Export::MemberTable)>"member table CSV"</button>
                    <button type="button" class="small" id="export-options-csv" on:click=options_csv>"options CSV"</button>
                    <button type="button" class="small" id="export-design-json" on:click=move |_| make(Export::DesignFile)>"design file JSON"</button>
                </span>
                <label class="import">
                    "open a design file "
                    <input type="file" id="import-file" accept=".json,application/json" on:change=on_file />
                </label>
            </div>
            <p class="hint">"Design files of every Springline version open here (or drop one on the page). Concept-design values: local codes and a licensed engineer govern."</p>
            {move || working.get().then(|| view! { <p class="hint" id="export-working">"Making the file..."</p> })}
            {move || message.get().map(|(ok, m)| view! {
                <p id="files-message" class=if ok { "hint" } else { "error" } role="status">{m}</p>
            })}
        </section>
    }
}
