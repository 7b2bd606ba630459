//! The two drawings: elevation and force diagram. Each redraws (an effect syncing the
//! canvas with the analysis, the pointer, the units and the window size) and maps the
//! pointer back to a member so hovering one highlights its partner in the other.

use crate::canvas::{self, View};
use crate::drag::{self, Handle};
use crate::elevation::{self, ElevationInput};
use crate::forces;
use crate::state::{AppState, DragReading};
use leptos::html::Canvas;
use leptos::prelude::*;
use springline_statics::scene::force::{AreaView, FixedScale, ForceDrawing, ForceOptions};
use springline_statics::scene::Px;

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

/// Zoom factor of one press of the zoom buttons.
const BUTTON_ZOOM: f64 = 1.25;

/// The force-diagram canvas with its zoom buttons. Wheel zooms about the pointer, two
/// pointers pinch, one pointer drags to pan the area it started in; "fit" restores the
/// fitted view. While the elevation is being dragged (`state.dragging`) the force scale
/// is held, so a larger thrust draws longer; it refits when the drag ends.
#[component]
pub fn ForceCanvas() -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    let views = RwSignal::new([AreaView::FIT; 2]);
    let drawn = StoredValue::new(None::<ForceDrawing>);
    let held = StoredValue::new(None::<FixedScale>);
    // pointers down on the canvas: (id, last position), and whether the pointer moved
    let pointers = StoredValue::new(Vec::<(i32, Px)>::new());
    Effect::new(move |_| {
        let _ = state.resized.get();
        let highlight = state.hovered.get().0;
        let units = state.units.get();
        let case = state.case.get();
        let views = views.get();
        // hold the scale from the drawing on screen when a drag starts; refit after
        if state.dragging.get() {
            if held.get_value().is_none() {
                held.set_value(drawn.with_value(|d| d.as_ref().and_then(|d| d.fixed_scale())));
            }
        } else {
            held.set_value(None);
        }
        let Some(el) = node.get() else { return };
        // an analysis error leaves the last drawing on screen
        let Ok(a) = state.analysis.get() else { return };
        let Some(s) = canvas::prepare(&el) else { return };
        let opts = ForceOptions { units, highlight, views, fixed_scale: held.get_value() };
        let d = forces::drawing(&a, case, &opts, &s);
        forces::paint(&s, &d.scene);
        forces::publish(&el, &d.scene);
        drawn.set_value(Some(d));
    });
    // zoom every area about its centre (buttons), or reset
    let zoom_all = move |factor: f64| {
        let areas: Vec<_> = drawn.with_value(|d| d.as_ref().map(|d| d.areas.clone()).unwrap_or_default());
        views.update(|v| {
            for (k, area) in areas.iter().enumerate().take(2) {
                let c = Px::new(area.rect.x + area.rect.w / 2.0, area.rect.y + area.rect.h / 2.0);
                v[k] = v[k].zoomed_about(factor, c, area.rect);
            }
        });
    };
    // zoom the area under `at` about `at`
    let zoom_at = move |factor: f64, at: Px| {
        let hit = drawn.with_value(|d| d.as_ref().and_then(|d| d.area_at(at).map(|k| (k, d.areas[k].rect))));
        if let Some((k, rect)) = hit.filter(|h| h.0 < 2) {
            views.update(|v| v[k] = v[k].zoomed_about(factor, at, rect));
        }
    };
    let px_of = move |ev: &web_sys::PointerEvent| -> Option<Px> {
        let el = node.get()?;
        let (x, y) = pointer_in(&el, ev);
        Some(Px::new(x, y))
    };
    let on_down = move |ev: web_sys::PointerEvent| {
        let Some(at) = px_of(&ev) else { return };
        if let Some(el) = node.get() {
            let _ = el.set_pointer_capture(ev.pointer_id());
        }
        pointers.update_value(|p| {
            p.retain(|(id, _)| *id != ev.pointer_id());
            p.push((ev.pointer_id(), at));
        });
    };
    let on_up = move |ev: web_sys::PointerEvent| {
        pointers.update_value(|p| p.retain(|(id, _)| *id != ev.pointer_id()));
        if let Some(el) = node.get() {
            let _ = el.release_pointer_capture(ev.pointer_id());
        }
    };
    let on_move = move |ev: web_sys::PointerEvent| {
        let Some(at) = px_of(&ev) else { return };
        let down = pointers.get_value();
        let id = ev.pointer_id();
        if let Some(k) = down.iter().position(|(p, _)| *p == id) {
            let before = down[k].1;
            match down.len() {
                // one pointer: pan the area the pointer is over
                1 => {
                    let hit = drawn.with_value(|d| d.as_ref().and_then(|d| d.area_at(before)));
                    if let Some(area) = hit.filter(|a| *a < 2) {
                        views.update(|v| v[area] = v[area].panned(at.x - before.x, at.y - before.y));
                    }
                }
                // two pointers: pinch about their middle
                2 => {
                    let other = down[1 - k].1;
                    let (d0, d1) = (
                        (before.x - other.x).hypot(before.y - other.y),
                        (at.x - other.x).hypot(at.y - other.y),
                    );
                    if d0 > 1.0 {
                        zoom_at(d1 / d0, Px::new((at.x + other.x) / 2.0, (at.y + other.y) / 2.0));
                    }
                }
                _ => {}
            }
            pointers.update_value(|p| p[k].1 = at);
            return;
        }
        // hovering: the member under the pointer, and a shortened label's full text
        let (member, detail) = drawn.with_value(|d| match d {
            Some(d) => (d.member_at(at, PICK_TOLERANCE), d.label_at(at).and_then(|l| l.detail.clone())),
            None => (None, None),
        });
        if let Some(el) = node.get() {
            match detail {
                Some(t) => {
                    let _ = el.set_attribute("title", &t);
                }
                None => {
                    let _ = el.remove_attribute("title");
                }
            }
        }
        state.hover(member);
    };
    let on_wheel = move |ev: web_sys::WheelEvent| {
        let Some(el) = node.get() else { return };
        ev.prevent_default();
        let r = el.get_bounding_client_rect();
        let at = Px::new(ev.client_x() as f64 - r.left(), ev.client_y() as f64 - r.top());
        // lines and pages count as 16 and 400 px
        let dy = ev.delta_y()
            * match ev.delta_mode() {
                1 => 16.0,
                2 => 400.0,
                _ => 1.0,
            };
        zoom_at((-dy * 0.0015).exp(), at);
    };
    view! {
        <div class="force-canvas" style="position: relative; min-width: 0;">
            <canvas
                id="forces"
                class="drawing"
                node_ref=node
                aria-label="Force diagram: reciprocal figure and pole construction, or the thrust line; wheel or pinch to zoom, drag to pan"
                on:pointerdown=on_down
                on:pointerup=on_up
                on:pointercancel=on_up
                on:pointermove=on_move
                on:pointerleave=move |_| state.hover(None)
                on:wheel=on_wheel
            ></canvas>
            <div
                class="force-zoom"
                role="toolbar"
                aria-label="Force diagram view"
                style="position: absolute; top: 5px; right: 6px; display: flex; gap: 3px;"
            >
                <button id="forces-zoom-in" type="button" aria-label="Zoom the force diagram in" title="Zoom in" style=BUTTON_STYLE on:click=move |_| zoom_all(BUTTON_ZOOM)>"+"</button>
                <button id="forces-zoom-out" type="button" aria-label="Zoom the force diagram out" title="Zoom out" style=BUTTON_STYLE on:click=move |_| zoom_all(1.0 / BUTTON_ZOOM)>"−"</button>
                <button id="forces-fit" type="button" aria-label="Fit the force diagram to the canvas" title="Fit" style=BUTTON_STYLE on:click=move |_| views.set([AreaView::FIT; 2])>"fit"</button>
            </div>
        </div>
    }
}

/// The zoom buttons' look, kept here until the page's style sheet takes them.
const BUTTON_STYLE: &str =
    "min-width: 28px; height: 24px; padding: 0 6px; font: 13px system-ui, sans-serif; \
     background: #ffffff; color: #1f2a33; border: 1px solid #b9b4aa; border-radius: 4px; cursor: pointer;";
