//! The two drawings: elevation and force diagram. Each redraws (an effect syncing the
//! canvas with the analysis, the pointer, the units and the window size) and maps the
//! pointer back to a member so hovering one highlights its partner in the other.

use crate::canvas::{self, View};
use crate::drag::{self, Handle};
use crate::elevation::{self, ElevationInput};
use crate::forces::{self, ForcePicture};
use crate::state::{AppState, DragReading};
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
        // an analysis error leaves the last drawing on screen
        let outcome = state.analysis.get();
        let design = state.design.get();
        if let Ok(a) = outcome {
            let Some(el) = node.get() else { return };
            let Some(s) = canvas::prepare(&el) else { return };
            let case = state.case.get();
            let v =
                elevation::draw(&s, &ElevationInput { design: &design, analysis: &a, hovered, units, case });
            v.publish(&el, "m");
            view.set_value(Some(v));
        }
    });
    // a drag: the handle, the design before it, the view it started in (kept fixed so
    // the mapping does not shift while the drawing refits) and the grab offset (world,
    // from the pointer to the handle, so the handle does not jump to the pointer)
    let dragging = StoredValue::new(None::<(Handle, springline_statics::Design, View, (f64, f64))>);
    let on_down = move |ev: web_sys::PointerEvent| {
        let (Some(el), Some(v)) = (node.get(), view.get_value()) else { return };
        let at = pointer_in(&el, &ev);
        let design = state.design.get_untracked();
        let grabbed = state.analysis.with_untracked(|o| {
            let a = o.as_ref().ok()?;
            let h = drag::handle_at(&design, a, &v, at)?;
            let p = h.point(&design, &a.form)?;
            let (wx, wy) = v.world(at.0, at.1);
            // the deck is grabbed where the pointer is along it: only its level counts
            let dx = if h == Handle::Deck { 0.0 } else { p.x - wx };
            Some((h, (dx, p.y - wy)))
        });
        if let Some((h, grab)) = grabbed {
            let _ = el.set_pointer_capture(ev.pointer_id());
            ev.prevent_default();
            state.drag_stop.set(None);
            state.dragging.set(true);
            state.drag_reading.set(h.reading(&design).map(|reading| DragReading {
                reading,
                client: (ev.client_x() as f64, ev.client_y() as f64),
            }));
            dragging.set_value(Some((h, design, v, grab)));
        }
    };
    let on_up = move |ev: web_sys::PointerEvent| {
        if let Some((_, before, _, _)) = dragging.get_value() {
            dragging.set_value(None);
            state.dragging.set(false);
            state.drag_reading.set(None);
            if let Some(el) = node.get() {
                let _ = el.release_pointer_capture(ev.pointer_id());
            }
            if state.design.with_untracked(|d| *d != before) {
                state.remember(before);
            }
        }
    };
    let on_move = move |ev: web_sys::PointerEvent| {
        let (Some(el), Some(v)) = (node.get(), view.get_value()) else { return };
        let at = pointer_in(&el, &ev);
        // dragging: map with the view the drag started in, snap unless Shift is held, and
        // past a limit keep the furthest valid position and say why in the status line
        let target = dragging.with_value(|d| {
            d.as_ref().map(|(h, _, start_view, grab)| {
                let (x, y) = start_view.world(at.0, at.1);
                (*h, x + grab.0, y + grab.1)
            })
        });
        if let Some((h, x, y)) = target {
            let stopped = state.drag_to(h, x, y, drag::snapping(ev.shift_key()));
            let units = state.units.get_untracked();
            state.design.with_untracked(|d| {
                if let Some(e) = stopped {
                    state.drag_stop.set(Some(drag::stop_message(h, d, &e, units)));
                }
                let client = (ev.client_x() as f64, ev.client_y() as f64);
                state.drag_reading.set(h.reading(d).map(|reading| DragReading { reading, client }));
            });
            return;
        }
        // hovering: a grab cursor over handles, and the truss member under the pointer
        let (grabbable, hit) = state.design.with_untracked(|design| {
            state.analysis.with_untracked(|o| {
                let Ok(a) = o.as_ref() else { return (false, None) };
                let grabbable = drag::handle_at(design, a, &v, at).is_some();
                let hit = a.truss.as_ref().and_then(|t| {
                    let segments = t.model.members.iter().enumerate().map(|(k, m)| {
                        let (p, q) = (&t.model.nodes[m.start], &t.model.nodes[m.end]);
                        (k, v.px(p.x, p.y), v.px(q.x, q.y))
                    });
                    canvas::nearest_segment(at, segments, PICK_TOLERANCE)
                });
                (grabbable, hit)
            })
        });
        let _ = web_sys::HtmlElement::style(&el)
            .set_property("cursor", if grabbable { "grab" } else { "default" });
        state.hover(hit);
    };
    view! {
        <canvas
            id="elevation"
            class="drawing"
            node_ref=node
            aria-label="Elevation of the deck arch with member forces; drag the crown, springings, deck or ground points"
            on:pointerdown=on_down
            on:pointerup=on_up
            on:pointercancel=on_up
            on:pointermove=on_move
            on:pointerleave=move |_| state.hover(None)
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
        Ok(a) => forces::picture(&a, state.case.get()),
        Err(e) => ForcePicture::Unavailable(e.to_string()),
    });
    Effect::new(move |_| {
        let _ = state.resized.get();
        let hovered = state.hovered.get().0;
        let units = state.units.get();
        // an analysis error leaves the last drawing on screen
        if state.analysis.with(|o| o.is_err()) {
            return;
        }
        let Some(el) = node.get() else { return };
        let Some(s) = canvas::prepare(&el) else { return };
        let v = picture.with(|p| forces::draw(&s, p, hovered, units));
        if let Some(v) = v {
            let unit =
                picture.with_untracked(|p| if matches!(p, ForcePicture::Thrust(_)) { "m" } else { "kN" });
            v.publish(&el, unit);
        }
        view.set_value(v);
    });
    let on_move = move |ev: web_sys::PointerEvent| {
        let (Some(el), Some(v)) = (node.get(), view.get_value()) else { return };
        let at = pointer_in(&el, &ev);
        state.hover(picture.with_untracked(|p| forces::member_at(p, &v, at, PICK_TOLERANCE)));
    };
    view! {
        <canvas
            id="forces"
            class="drawing"
            node_ref=node
            aria-label="Force diagram"
            on:pointermove=on_move
            on:pointerleave=move |_| state.hover(None)
        ></canvas>
    }
}
