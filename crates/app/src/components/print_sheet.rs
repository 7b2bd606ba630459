//! The print sheet: what the page prints (A4 or US Letter, one page; `web/style.css`'s
//! print rules hide the controls): the design's name, the elevation and the force diagram
//! as on screen, key numbers (and the design's warnings), the design's link as text and,
//! when it fits in one, as a QR code (`qrcode` crate, low error correction: up to 2,953
//! bytes; printed 40 mm wide), the date it is printed and the cautions. On screen the sheet
//! is hidden.

use crate::format::Quantity;
use crate::permalink_sync::link_to_open_design;
use crate::state::AppState;
use crate::timing::{timed, Step};
use leptos::html::Canvas;
use leptos::prelude::*;
use qrcode::{Color, EcLevel, QrCode};
use springline_statics::scene::Ink;

/// Backing-store pixels per QR module: whole pixels keep the modules sharp when the
/// canvas is printed at 40 mm (`web/style.css`).
const QR_MODULE_PX: u32 = 6;

/// How long the design rests before the sheet's link and numbers follow it.
const REST_DELAY: std::time::Duration = std::time::Duration::from_millis(400);

/// The sheet.
#[component]
pub fn PrintSheet() -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    // The sheet's link and numbers follow the design once it has rested (not on every
    // pointer move: the settled design holds while a drag is on), and again just before
    // printing: the sheet is hidden on screen, so the link's encoding (a few tenths of a
    // millisecond) need not be in an edit's frame. Its QR code is worked out only when
    // the page prints: choosing the code's mask (all eight scored, ISO/IEC 18004) took
    // 22-66 ms of the page's thread each time the link rested.
    let link = move || link_to_open_design(state).unwrap_or_default();
    let coded = RwSignal::new(String::new());
    // the sheet's numbers likewise: they are read when this changes
    let rested = RwSignal::new(0u32);
    let design_and_units = move || {
        state.settled_design.track();
        state.units.track();
        Some(())
    };
    crate::pause::when_rested(design_and_units, REST_DELAY, move |()| {
        coded.set(link());
        rested.update(|n| *n = n.wrapping_add(1));
    });
    let fits = RwSignal::new(true);
    // the text of the code on the canvas (none until the page first prints)
    let drawn = StoredValue::new(String::new());
    // called in the `beforeprint` handler itself: the print's layout follows it
    let draw_for_print = move |text: &str| {
        let Some(el) = node.get_untracked() else { return };
        // the same text is not coded twice (a second print of the same link)
        if drawn.with_value(|d| d == text) {
            return;
        }
        // a canvas without a context keeps nothing drawn, and is tried again next print
        if let Some(fitted) = timed(Step::Code, || draw_code(&el, text)) {
            drawn.set_value(text.to_string());
            fits.set(fitted);
        }
    };
    // the date the sheet is printed (not when the page was opened)
    let today = || {
        let d = js_sys::Date::new_0();
        format!("{:04}-{:02}-{:02}", d.get_full_year(), d.get_month() + 1, d.get_date())
    };
    let printed = RwSignal::new(today());
    let before_print =
        window_event_listener(leptos::ev::Custom::new("beforeprint"), move |_: web_sys::Event| {
            printed.set(today());
            // the code and numbers of the design as printed, without waiting for the rest
            // (the numbers and the link's text follow in the effects that run as this
            // handler returns, before a print the browser started is laid out; a print
            // the page itself started with `window.print()` would need them set first)
            let text = link();
            draw_for_print(&text);
            coded.set(text);
            rested.update(|n| *n = n.wrapping_add(1));
        });
    on_cleanup(move || before_print.remove());
    let warnings = move || {
        rested.track();
        state.settled_analysis.with_untracked(|a| {
            let a = a.as_ref().ok()?;
            (!a.warnings.is_empty()).then(|| {
                let items = a.warnings.iter().map(|w| view! { <li>{w.to_string()}</li> }).collect_view();
                view! { <ul class="print-warnings">{items}</ul> }
            })
        })
    };
    let numbers = move || {
        rested.track();
        let units = state.units.get_untracked();
        state.settled_analysis.with_untracked(|a| {
            let a = a.as_ref().ok()?;
            let s = &a.summary;
            let [left, right] = s.form_reactions;
            let rows = [
                ("span", units.show(Quantity::Length, s.span)),
                (
                    "rise",
                    format!("{} (rise / span {:.3})", units.show(Quantity::Length, s.rise), s.rise_over_span),
                ),
                ("form thrust (dead load)", units.show(Quantity::Force, s.form_thrust)),
                (
                    "left springing H, V",
                    format!(
                        "{}, {}",
                        units.show(Quantity::Force, left.fx.abs()),
                        units.show(Quantity::Force, left.fy.abs())
                    ),
                ),
                (
                    "right springing H, V",
                    format!(
                        "{}, {}",
                        units.show(Quantity::Force, right.fx.abs()),
                        units.show(Quantity::Force, right.fy.abs())
                    ),
                ),
                (
                    "panels, ribs",
                    format!(
                        "{}, {}",
                        state.settled_design.with_untracked(|d| d.panels),
                        state.settled_design.with_untracked(|d| d.deck.ribs)
                    ),
                ),
            ];
            Some(
                rows.into_iter()
                    .map(|(k, v)| view! { <tr><th scope="row">{k}</th><td>{v}</td></tr> })
                    .collect_view(),
            )
        })
    };
    view! {
        <section class="print-sheet" id="print-sheet" aria-hidden="true">
            <div class="print-columns">
                <div>
                    <h2>{move || { rested.track(); state.settled_design.with_untracked(|d| d.name.clone()) }}</h2>
                    <p>{move || format!("Springline concept design sheet, printed {}", printed.get())}</p>
                    <table class="print-numbers"><tbody>{numbers}</tbody></table>
                    {warnings}
                    <p class="print-caution">"Concept design only: these are first numbers for choosing between options. Local codes and a licensed engineer govern every design decision."</p>
                </div>
                <figure class="print-qr" style:background=Ink::Background.css()>
                    <canvas id="print-qr" node_ref=node></canvas>
                    <figcaption>{move || if fits.get() { "the design's link" } else { "the link is too long for a QR code" }}</figcaption>
                </figure>
            </div>
            <p class="print-link" id="print-link">{move || coded.get()}</p>
        </section>
    }
}

/// Draws `text` as a QR code (low error correction, ISO/IEC 18004; `QR_MODULE_PX` pixels a
/// module, a quiet zone of four modules all round) on `el`, sized to it. No text, or a
/// text too long for one code, leaves the canvas at one blank pixel (never the last
/// design's code). Returns whether the text fitted in a code (an empty text counts as
/// fitting: there is nothing to say about it), or `None` when the canvas gave no 2-d
/// context and nothing was drawn.
fn draw_code(el: &web_sys::HtmlCanvasElement, text: &str) -> Option<bool> {
    let ctx = el
        .get_context("2d")
        .ok()
        .flatten()
        .and_then(|c| wasm_bindgen::JsCast::dyn_into::<web_sys::CanvasRenderingContext2d>(c).ok())?;
    // no link (yet) draws no code, as a link too long for one
    let code =
        (!text.is_empty()).then(|| QrCode::with_error_correction_level(text.as_bytes(), EcLevel::L).ok());
    let Some(Some(code)) = code else {
        el.set_width(1);
        el.set_height(1);
        let _ = el.remove_attribute("data-modules");
        return Some(code.is_none());
    };
    let n = code.width() as u32;
    let side = (n + 8) * QR_MODULE_PX;
    el.set_width(side);
    el.set_height(side);
    ctx.set_fill_style_str("#ffffff");
    ctx.fill_rect(0.0, 0.0, side as f64, side as f64);
    // the dark modules as one path, filled once (rather than a fill per module)
    ctx.set_fill_style_str("#000000");
    ctx.begin_path();
    let m = QR_MODULE_PX as f64;
    for (k, color) in code.to_colors().into_iter().enumerate() {
        if color == Color::Dark {
            let (x, y) = ((k as u32 % n + 4) as f64, (k as u32 / n + 4) as f64);
            ctx.rect(x * m, y * m, m, m);
        }
    }
    ctx.fill();
    let _ = el.set_attribute("data-modules", &n.to_string());
    Some(true)
}
