//! The two drawings: elevation and force diagram. Each redraws (an effect syncing the
//! canvas with the analysis, the pointer, the units and the window size) and maps the
//! pointer back to a member so hovering one highlights its partner in the other.

use crate::canvas::{self, View};
use crate::elevation::{self, ElevationInput};
use crate::forces::{self, ForcePicture};
use crate::state::{AppState, Hovered};
use leptos::html::Canvas;
use leptos::prelude::*;

/// Pixels within which the pointer picks a member.
const PICK_TOLERANCE: f64 = 8.0;

fn pointer_in(canvas: &web_sys::HtmlCanvasElement, ev: &web_sys::PointerEvent) -> (f64, f64) {
    let r = canvas.get_bounding_client_rect();
    (ev.client_x() as f64 - r.left(), ev.client_y() as f64 - r.top())
}

/// The elevation canvas.
#[component]
pub fn ElevationCanvas() -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    let view = StoredValue::new(None::<View>);
    Effect::new(move |_| {
        let _ = state.resized.get();
        let hovered = state.hovered.get().0;
        let units = state.units.get();
        let Some(el) = node.get() else { return };
        let Some(s) = canvas::prepare(&el) else { return };
        let outcome = state.analysis.get();
        let design = state.design.get();
        if let Ok(a) = outcome {
            let v = elevation::draw(&s, &ElevationInput { design: &design, analysis: &a, hovered, units });
            v.publish(&el, "m");
            view.set_value(Some(v));
        }
    });
    let on_move = move |ev: web_sys::PointerEvent| {
        let (Some(el), Some(v)) = (node.get(), view.get_value()) else { return };
        let at = pointer_in(&el, &ev);
        let hit = state.analysis.with_untracked(|o| {
            let a = o.as_ref().ok()?;
            let t = a.truss.as_ref()?;
            let mut best: Option<(usize, f64)> = None;
            for (k, m) in t.model.members.iter().enumerate() {
                let (p, q) = (&t.model.nodes[m.start], &t.model.nodes[m.end]);
                let d = canvas::distance_to_segment(at, v.px(p.x, p.y), v.px(q.x, q.y));
                if d <= PICK_TOLERANCE && best.is_none_or(|b| d < b.1) {
                    best = Some((k, d));
                }
            }
            best.map(|b| b.0)
        });
        if state.hovered.get_untracked().0 != hit {
            state.hovered.set(Hovered(hit));
        }
    };
    view! {
        <canvas
            id="elevation"
            class="drawing"
            node_ref=node
            aria-label="Elevation of the deck arch with member forces"
            on:pointermove=on_move
            on:pointerleave=move |_| state.hovered.set(Hovered(None))
        ></canvas>
    }
}

/// The force-diagram canvas.
#[component]
pub fn ForceCanvas() -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    let view = StoredValue::new(None::<View>);
    let picture = Memo::new(move |_| match state.analysis.get() {
        Ok(a) => state.design.with(|d| forces::picture(d, &a)),
        Err(e) => ForcePicture::Unavailable(e),
    });
    Effect::new(move |_| {
        let _ = state.resized.get();
        let hovered = state.hovered.get().0;
        let units = state.units.get();
        let Some(el) = node.get() else { return };
        let Some(s) = canvas::prepare(&el) else { return };
        let Ok(a) = state.analysis.get() else { return };
        let v = picture.with(|p| forces::draw(&s, p, &a, hovered, units));
        if let Some(v) = v {
            let unit = picture.with_untracked(|p| if matches!(p, ForcePicture::Thrust(_)) { "m" } else { "kN" });
            v.publish(&el, unit);
        }
        view.set_value(v);
    });
    let on_move = move |ev: web_sys::PointerEvent| {
        let (Some(el), Some(v)) = (node.get(), view.get_value()) else { return };
        let at = pointer_in(&el, &ev);
        let hit = picture.with_untracked(|p| forces::member_at(p, &v, at, PICK_TOLERANCE));
        if state.hovered.get_untracked().0 != hit {
            state.hovered.set(Hovered(hit));
        }
    };
    view! {
        <canvas
            id="forces"
            class="drawing"
            node_ref=node
            aria-label="Force diagram"
            on:pointermove=on_move
            on:pointerleave=move |_| state.hovered.set(Hovered(None))
        ></canvas>
    }
}
