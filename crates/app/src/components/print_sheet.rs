//! The print sheet: what the page prints (A4 or US Letter, one page; `web/style.css`'s
//! print rules hide the controls): the design's name, the elevation and the force diagram
//! as on screen, key numbers, the design's link as text and, when it fits in one, as a QR
//! code (`qrcode` crate, low error correction: up to 2,953 bytes), the date and the
//! cautions. On screen the sheet is hidden.

use crate::canvas;
use crate::format::Quantity;
use crate::permalink_sync::link_to_open_design;
use crate::state::AppState;
use leptos::html::Canvas;
use leptos::prelude::*;
use qrcode::{Color, EcLevel, QrCode};
use springline_statics::scene::Ink;

/// The QR code's side on the sheet, CSS pixels (about 50 mm printed).
const QR_SIDE: f64 = 190.0;

/// The sheet.
#[component]
pub fn PrintSheet() -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    // the link once a drag ends (not on every pointer move)
    let link = Memo::new(move |previous: Option<&String>| {
        if state.dragging.get() {
            if let Some(p) = previous {
                return p.clone();
            }
        }
        state.design.track();
        state.units.track();
        link_to_open_design(state).unwrap_or_default()
    });
    let fits = RwSignal::new(true);
    Effect::new(move |_| {
        let text = link.get();
        let Some(el) = node.get() else { return };
        let code = QrCode::with_error_correction_level(text.as_bytes(), EcLevel::L);
        fits.set(code.is_ok());
        let Ok(code) = code else { return };
        let Some(s) = canvas::prepare_for(&el, QR_SIDE, QR_SIDE) else { return };
        let n = code.width();
        // a quiet zone of four modules all round (ISO/IEC 18004)
        let module = QR_SIDE / (n + 8) as f64;
        s.ctx.set_fill_style_str("#ffffff");
        s.ctx.fill_rect(0.0, 0.0, QR_SIDE, QR_SIDE);
        s.ctx.set_fill_style_str("#000000");
        for (k, color) in code.to_colors().into_iter().enumerate() {
            if color == Color::Dark {
                let (x, y) = ((k % n + 4) as f64, (k / n + 4) as f64);
                s.ctx.fill_rect(x * module, y * module, module + 0.02, module + 0.02);
            }
        }
        let _ = el.set_attribute("data-modules", &n.to_string());
    });
    let date = move || {
        let d = js_sys::Date::new_0();
        format!("{:04}-{:02}-{:02}", d.get_full_year(), d.get_month() + 1, d.get_date())
    };
    let numbers = move || {
        let units = state.units.get();
        state.analysis.with(|a| {
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
                    format!("{}, {}", state.design.with(|d| d.panels), state.design.with(|d| d.deck.ribs)),
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
                    <h2>{move || state.design.with(|d| d.name.clone())}</h2>
                    <p>{move || format!("Springline concept design sheet, printed {}", date())}</p>
                    <table class="print-numbers"><tbody>{numbers}</tbody></table>
                    <p class="print-caution">"Concept design only: these are first numbers for choosing between options. Local codes and a licensed engineer govern every design decision."</p>
                </div>
                <figure class="print-qr" style:background=Ink::Background.css()>
                    <canvas id="print-qr" node_ref=node style=format!("width:{QR_SIDE}px;height:{QR_SIDE}px")></canvas>
                    <figcaption>{move || if fits.get() { "the design's link" } else { "the link is too long for a QR code" }}</figcaption>
                </figure>
            </div>
            <p class="print-link" id="print-link">{move || link.get()}</p>
        </section>
    }
}
