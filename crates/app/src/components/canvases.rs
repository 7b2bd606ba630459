//! The two drawings: elevation and force diagram. Each redraws (an effect syncing the
//! canvas with the analysis, the pointer, the units and the window size) and maps the
//! pointer back to a member so hovering one highlights its partner in the other.

use crate::canvas::{self, View};
use crate::components::readout::{drawn_model, step_member, ModelSwitch};
use crate::drag::{self, Handle};
use crate::forces::{self, ForcePicture};
use crate::paint;
use crate::state::AppState;
use leptos::html::Canvas;
use leptos::prelude::*;
use springline_statics::arch::readout::MemberKey;
use springline_statics::scene::elevation::{elevation, ElevationOptions};
use springline_statics::scene::{Px, Scene, Transform};
use springline_statics::ModelKind;

/// Pixels within which the pointer picks a member.
const PICK_TOLERANCE: f64 = 8.0;

fn pointer_in(canvas: &web_sys::HtmlCanvasElement, ev: &web_sys::PointerEvent) -> (f64, f64) {
    let r = canvas.get_bounding_client_rect();
    (ev.client_x() as f64 - r.left(), ev.client_y() as f64 - r.top())
}

/// The elevation canvas: the engine's elevation scene painted, the model switch under it,
/// hover and keyboard stepping through members, and the drag of handles.
#[component]
pub fn ElevationCanvas() -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    // the scene on screen and the model it draws (for pointer hits)
    let shown = StoredValue::new(None::<(Scene, ModelKind)>);
    // a drag: the handle, the design before it, and the transform it started in (kept
    // fixed so the mapping does not shift while the drawing would refit)
    let dragging = StoredValue::new(None::<(Handle, springline_statics::Design, Transform)>);
    Effect::new(move |_| {
        let _ = state.resized.get();
        let focus = state.focus.get();
        let units = state.units.get();
        let chosen = state.elevation_model.get();
        let case = state.case.get();
        // an analysis error leaves the last drawing on screen
        let Ok(a) = state.analysis.get() else { return };
        let Some(el) = node.get() else { return };
        let Some(viewport) = paint::viewport_of(&el) else { return };
        let model = drawn_model(&a, chosen);
        let map = match (model, a.truss.as_ref()) {
            (ModelKind::Truss, Some(t)) => &t.map,
            _ => &a.frame.map,
        };
        let highlight = focus.and_then(|k| k.member_in(map, model));
        let transform = dragging.with_value(|d| d.as_ref().map(|(_, _, t)| *t));
        let opts = ElevationOptions { units, case, model, highlight, transform };
        let scene = state.design.with(|d| elevation(&a, d, &opts, viewport));
        paint::paint(&el, &scene);
        shown.set_value(Some((scene, model)));
    });
    let transform_now = move || shown.with_value(|s| s.as_ref().and_then(|(s, _)| s.transform));
    let on_down = move |ev: web_sys::PointerEvent| {
        let (Some(el), Some(t)) = (node.get(), transform_now()) else { return };
        let at = pointer_in(&el, &ev);
        let design = state.design.get_untracked();
        let handle = state
            .analysis
            .with_untracked(|o| o.as_ref().ok().and_then(|a| drag::handle_at(&design, a, &view_of(t), at)));
        if let Some(h) = handle {
            let _ = el.set_pointer_capture(ev.pointer_id());
            ev.prevent_default();
            dragging.set_value(Some((h, design, t)));
            state.dragging.set(true);
        }
    };
    let on_up = move |ev: web_sys::PointerEvent| {
        if let Some((_, before, _)) = dragging.get_value() {
            dragging.set_value(None);
            state.dragging.set(false);
            if let Some(el) = node.get() {
                let _ = el.release_pointer_capture(ev.pointer_id());
            }
            if state.design.with_untracked(|d| *d != before) {
                state.remember(before);
            }
            // refit now the drag is over
            state.resized.update(|n| *n = n.wrapping_add(1));
        }
    };
    let on_move = move |ev: web_sys::PointerEvent| {
        let (Some(el), Some(t)) = (node.get(), transform_now()) else { return };
        let at = pointer_in(&el, &ev);
        // dragging: map with the transform the drag started in (no copy of the stored design)
        let candidate = dragging.with_value(|d| {
            d.as_ref().map(|(h, _, start)| {
                let (x, y) = start.world(Px::new(at.0, at.1));
                state.design.with_untracked(|design| drag::moved(design, *h, x, y))
            })
        });
        if let Some(candidate) = candidate {
            if state.preview(candidate) {
                state.notice.set(None);
            } else {
                state
                    .notice
                    .set(Some("That position is not a valid design; the last valid one is kept.".into()));
            }
            return;
        }
        // hovering: a grab cursor over handles, and the member under the pointer
        let grabbable = state.design.with_untracked(|design| {
            state.analysis.with_untracked(|o| {
                o.as_ref().ok().is_some_and(|a| drag::handle_at(design, a, &view_of(t), at).is_some())
            })
        });
        let _ = web_sys::HtmlElement::style(&el)
            .set_property("cursor", if grabbable { "grab" } else { "default" });
        let key = shown.with_value(|s| {
            let (scene, model) = s.as_ref()?;
            let k = paint::member_at(scene, at, PICK_TOLERANCE)?;
            state.analysis.with_untracked(|o| {
                let a = o.as_ref().ok()?;
                let map = match (model, a.truss.as_ref()) {
                    (ModelKind::Truss, Some(t)) => &t.map,
                    _ => &a.frame.map,
                };
                MemberKey::of(map, *model, k)
            })
        });
        state.focus_member(key);
    };
    let on_key = move |ev: web_sys::KeyboardEvent| {
        let model = shown.with_value(|s| s.as_ref().map_or(ModelKind::Frame, |(_, m)| *m));
        step_member(state, &ev, model);
    };
    view! {
        <div class="elevation-box">
            <canvas
                id="elevation"
                class="drawing"
                node_ref=node
                tabindex="0"
                aria-label="Elevation of the deck arch with member forces. Arrow keys step through the members and the readout below reads their forces; Escape clears. Drag the crown, a springing, the deck or a ground point to change the design."
                aria-describedby="member-readout"
                on:pointerdown=on_down
                on:pointerup=on_up
                on:pointercancel=on_up
                on:pointermove=on_move
                on:pointerleave=move |_| state.focus_member(None)
                on:keydown=on_key
            ></canvas>
            <ModelSwitch />
        </div>
    }
}

/// The drag helpers' view of a scene transform (the same mapping).
fn view_of(t: Transform) -> View {
    View { scale: t.scale, origin_x: t.origin_x, origin_y: t.origin_y }
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
            tabindex="0"
            aria-label="Force diagram. Arrow keys step through the members of the truss idealisation and the readout below reads their forces; Escape clears."
            aria-describedby="member-readout"
            on:keydown=move |ev| step_member(state, &ev, ModelKind::Truss)
            on:pointermove=on_move
            on:pointerleave=move |_| state.hover(None)
        ></canvas>
    }
}
