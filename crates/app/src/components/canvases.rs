//! The two drawings: elevation and force diagram. Each redraws (an effect syncing the
//! canvas with the analysis, the pointer, the units and the window size) and maps the
//! pointer back to a member so hovering one highlights its partner in the other.

use crate::components::envelope;
use crate::components::readout::{drawn_model, step_member, ModelSwitch};
use crate::drag::{self, Drag, Handle};
use crate::forces;
use crate::paint;
use crate::state::{AppState, DragReading, ModeView, SizeView};
use crate::timing::{timed, Step};
use leptos::html::Canvas;
use leptos::prelude::*;
use springline_statics::arch::readout::MemberKey;
use springline_statics::arch::seek::shape_for_thrust;
use springline_statics::scene::elevation::{elevation, ElevationOptions};
use springline_statics::scene::envelope::{envelope_elevation, EnvelopeOptions};
use springline_statics::scene::force::{AreaKind, AreaView, FixedScale, ForceDrawing, ForceOptions};
use springline_statics::scene::modes::{mode_elevation, ModeOptions};
use springline_statics::scene::readout::add_pointer_readout;
use springline_statics::scene::sizing::{sizing_elevation, SizingOptions};
use springline_statics::scene::vehicle::{add_vehicle, VehicleGlyph};
use springline_statics::scene::{Px, Scene, Transform, Viewport};
use springline_statics::{Design, ModelKind};

/// Pixels within which the pointer picks a member.
const PICK_TOLERANCE: f64 = 8.0;

fn pointer_in(canvas: &web_sys::HtmlCanvasElement, ev: &web_sys::PointerEvent) -> (f64, f64) {
    let r = canvas.get_bounding_client_rect();
    (ev.client_x() as f64 - r.left(), ev.client_y() as f64 - r.top())
}

/// Snap step of a dragged vehicle's leading axle, m (free with Shift), and its step with
/// the left and right arrow keys (with Shift: one panel).
const VEHICLE_SNAP: f64 = 0.1;
const VEHICLE_KEY_STEP: f64 = 0.5;

/// The elevation canvas: the engine's elevation scene painted, the model switch under it,
/// hover and keyboard stepping through members, the drag of handles, and the vehicle on
/// the deck (dragged, or moved with the left and right arrow keys) when it is chosen.
#[component]
pub fn ElevationCanvas() -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    let size = crate::canvas::watch_size(node);
    // the scene on screen and the model it draws (for pointer hits)
    let shown = StoredValue::new(None::<(Scene, ModelKind)>);
    let dragging = StoredValue::new(None::<HandleDrag>);
    // the vehicle's glyph on screen (for pointer hits) and a drag of it in progress
    let glyph = StoredValue::new(None::<VehicleGlyph>);
    let vehicle_drag = StoredValue::new(None::<VehicleDrag>);
    Effect::new(move |_| {
        let _ = state.resized.get();
        let focus = state.focus.get();
        let units = state.units.get();
        let chosen = state.elevation_model.get();
        let case = state.case.get();
        // an analysis error leaves the last drawing on screen
        let Ok(a) = state.analysis.get() else { return };
        let Some(el) = node.get() else { return };
        let Some(viewport) =
            size.get().filter(|(w, h)| *w > 0.0 && *h > 0.0).map(|(w, h)| Viewport::new(w, h))
        else {
            return;
        };
        let model = drawn_model(&a, chosen);
        let map = match (model, a.truss.as_ref()) {
            (ModelKind::Truss, Some(t)) => &t.map,
            _ => &a.frame.map,
        };
        let highlight = focus.and_then(|k| k.member_in(map, model));
        let transform = dragging.with_value(|d| d.as_ref().map(|d| d.transform));
        // the envelope view draws the frame model over the report of the design on screen
        let report = if state.envelope.get() { envelope::current_report(state) } else { None };
        // the sizing view draws the frame model over the size report of the design on
        // screen (the plain elevation while it is computed)
        let sized = match state.size_report.get() {
            SizeView::Ready(r) => Some(r),
            _ => None,
        };
        // a mode shape asked for, of the design on screen (computed once edits pause)
        let mode_view = state.mode_view.get();
        let mode = match mode_view {
            ModeView::Off => None,
            _ => crate::components::stability::drawn(state).and_then(|s| {
                let r = s.1.as_ref().ok()?;
                let drawing =
                    if mode_view == ModeView::Buckled { &r.buckled_shape } else { &r.vibration_shape };
                drawing.clone()
            }),
        };
        let enveloped = report.is_some() || sized.is_some() || mode.is_some();
        if let Some(drawing) = &mode {
            let _ = el.set_attribute("data-mode", &drawing.title);
        } else {
            let _ = el.remove_attribute("data-mode");
        }
        let mut scene = timed(Step::Scene, || match (mode.as_ref(), report, sized) {
            (Some(drawing), _, _) => {
                let opts = ModeOptions { units, case, transform };
                state.design.with(|d| mode_elevation(&a, d, drawing, &opts, viewport))
            }
            (None, _, Some(sized)) => {
                let highlight = focus.and_then(|k| k.member_in(&a.frame.map, ModelKind::Frame));
                let opts = SizingOptions { units, case, highlight, transform };
                state.design.with(|d| sizing_elevation(&a, d, &sized, &opts, viewport))
            }
            (None, Some(report), None) => {
                let highlight = focus.and_then(|k| k.member_in(&a.frame.map, ModelKind::Frame));
                let picked =
                    state.picked.with(|p| p.as_deref().and_then(|l| envelope::member_of_line(&a, l)));
                let largest = state.largest.get();
                let extra = state.extra.get();
                let placement = extra
                    .as_ref()
                    .filter(|e| e.1.len() == 2 && state.design.with(|d| *d == e.0))
                    .and_then(|e| e.1.get(usize::from(!largest)));
                let basis = state.basis.get();
                let opts = EnvelopeOptions { units, basis, case, highlight, picked, transform };
                state.design.with(|d| envelope_elevation(&a, d, &report.1, placement, &opts, viewport))
            }
            (None, None, None) => {
                let opts = ElevationOptions { units, case, model, highlight, transform };
                state.design.with(|d| elevation(&a, d, &opts, viewport))
            }
        });
        let model = if enveloped { ModelKind::Frame } else { model };
        // the vehicle on the deck (never in the envelope or sizing view, which choose no
        // vehicle)
        let car = if enveloped { None } else { state.vehicle_on_deck() };
        let deck_level = state.design.with(|d| d.deck.level);
        let drawn_car = car.as_ref().and_then(|c| add_vehicle(&mut scene, c, deck_level, units));
        // the value being dragged beside the pointer, last so it is drawn over the rest
        let readout = state.drag_reading.get();
        if let Some(r) = &readout {
            add_pointer_readout(&mut scene, r.text.clone(), Px::new(r.at.0, r.at.1));
        }
        timed(Step::Paint("elevation"), || paint::paint(&el, &scene));
        // the readout's words, for tests and assistive tools
        let _ = match &readout {
            Some(r) => el.set_attribute("data-readout", &r.text),
            None => el.remove_attribute("data-readout"),
        };
        // the vehicle's leading axle and grab box, for tests and assistive tools
        match (&car, &drawn_car) {
            (Some(c), Some(g)) => {
                let r = g.handle;
                let _ = el.set_attribute("data-vehicle-x", &format!("{}", c.first_axle));
                let _ = el.set_attribute("data-vehicle-box", &format!("[{},{},{},{}]", r.x, r.y, r.w, r.h));
            }
            _ => {
                let _ = el.remove_attribute("data-vehicle-x");
                let _ = el.remove_attribute("data-vehicle-box");
            }
        }
        glyph.set_value(drawn_car);
        shown.set_value(Some((scene, model)));
    });
    let transform_now = move || shown.with_value(|s| s.as_ref().and_then(|(s, _)| s.transform));
    // the member under `at` (canvas pixels) in the drawing on screen
    let key_at = move |at: (f64, f64)| {
        shown.with_value(|s| {
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
        })
    };
    let pick_at = move |at: (f64, f64)| envelope::pick_member(state, key_at(at));
    let on_down = move |ev: web_sys::PointerEvent| {
        // a second pointer (another finger) while a drag is on does not take it over:
        // the drag's saved design would be mid-drag and undo would lose its start
        if dragging.with_value(Option::is_some) {
            return;
        }
        let (Some(el), Some(t)) = (node.get(), transform_now()) else { return };
        let at = pointer_in(&el, &ev);
        if vehicle_drag.with_value(Option::is_some) {
            return;
        }
        // the vehicle first: it stands over the deck, whose line is a handle too
        let on_vehicle = glyph.with_value(|g| g.as_ref().is_some_and(|g| g.grabs(Px::new(at.0, at.1))));
        if let (true, Some(x)) = (on_vehicle, state.vehicle.get_untracked()) {
            let _ = el.set_pointer_capture(ev.pointer_id());
            ev.prevent_default();
            let grab = x - t.world(Px::new(at.0, at.1)).0;
            vehicle_drag.set_value(Some(VehicleDrag { pointer: ev.pointer_id(), grab, transform: t }));
            state.vehicle_dragging.set(true);
            state.drag_reading.set(Some(vehicle_reading(state, x, at)));
            return;
        }
        let design = state.design.get_untracked();
        let grabbed = state.analysis.with_untracked(|o| {
            let a = o.as_ref().ok()?;
            let h = drag::handle_at(&design, a, &t, Px::new(at.0, at.1))?;
            let p = h.point(&design, &a.form)?;
            let (wx, wy) = t.world(Px::new(at.0, at.1));
            // the deck is grabbed where the pointer is along it: only its level counts
            let dx = if h == Handle::Deck { 0.0 } else { p.x - wx };
            Some((h, (dx, p.y - wy)))
        });
        if let Some((h, grab)) = grabbed {
            let _ = el.set_pointer_capture(ev.pointer_id());
            ev.prevent_default();
            state.drag_stop.set(None);
            state.dragging.set(true);
            state.drag_reading.set(handle_reading(state, h, &design, at));
            dragging.set_value(Some(HandleDrag {
                pointer: ev.pointer_id(),
                drag: Drag::new(h),
                before: design,
                transform: t,
                grab,
            }));
        } else {
            // a click on a member picks it (its influence line, its governing placement)
            pick_at(at);
        }
    };
    let on_up = move |ev: web_sys::PointerEvent| {
        if vehicle_drag.with_value(|d| d.as_ref().is_some_and(|d| d.pointer == ev.pointer_id())) {
            vehicle_drag.set_value(None);
            state.vehicle_dragging.set(false);
            state.drag_reading.set(None);
            if let Some(el) = node.get() {
                let _ = el.release_pointer_capture(ev.pointer_id());
            }
            return;
        }
        let ours = dragging.with_value(|d| d.as_ref().is_some_and(|d| d.pointer == ev.pointer_id()));
        if let Some(HandleDrag { before, .. }) = dragging.get_value().filter(|_| ours) {
            dragging.set_value(None);
            if let Some(el) = node.get() {
                let _ = el.release_pointer_capture(ev.pointer_id());
            }
            state.end_drag(before);
            // refit now the drag is over
            state.resized.update(|n| *n = n.wrapping_add(1));
        }
    };
    let on_move = move |ev: web_sys::PointerEvent| {
        // while a drag is on, other pointers neither move it nor hover
        let drag_pointer = dragging.with_value(|d| d.as_ref().map(|d| d.pointer));
        if drag_pointer.is_some_and(|id| id != ev.pointer_id()) {
            return;
        }
        let (Some(el), Some(t)) = (node.get(), transform_now()) else { return };
        let at = pointer_in(&el, &ev);
        // moving the vehicle: its leading axle follows the pointer along the deck, on the
        // 0.1 m grid unless Shift is held, within its travel (not a design edit)
        if let Some(d) = vehicle_drag.get_value() {
            if d.pointer != ev.pointer_id() {
                return;
            }
            let x = d.transform.world(Px::new(at.0, at.1)).0 + d.grab;
            let x = if ev.shift_key() { x } else { (x / VEHICLE_SNAP).round() * VEHICLE_SNAP };
            if let Some(x) = state.move_vehicle(x) {
                state.drag_reading.set(Some(vehicle_reading(state, x, at)));
            }
            return;
        }
        // dragging: map with the transform the drag started in, snap unless Shift is held,
        // and past a limit keep the furthest valid position and say why in the status line
        // (the drag's state is taken out for the step and put back: the step runs the
        // analysis, which must not hold the stored value borrowed)
        if let Some(mut held) = dragging.try_update_value(Option::take).flatten() {
            let (x, y) = held.transform.world(Px::new(at.0, at.1));
            let (x, y) = (x + held.grab.0, y + held.grab.1);
            let stop = state.drag_step(&mut held.drag, x, y, drag::snapping(ev.shift_key()));
            let h = held.drag.handle;
            dragging.set_value(Some(held));
            let units = state.units.get_untracked();
            state.design.with_untracked(|d| {
                if let Some(stop) = stop {
                    state.drag_stop.set(Some(drag::stop_message(h, d, &stop, units)));
                }
                state.drag_reading.set(handle_reading(state, h, d, at));
            });
            return;
        }
        // hovering: a grab cursor over handles, and the member under the pointer
        let on_vehicle = glyph.with_value(|g| g.as_ref().is_some_and(|g| g.grabs(Px::new(at.0, at.1))));
        let grabbable = on_vehicle
            || state.design.with_untracked(|design| {
                state.analysis.with_untracked(|o| {
                    o.as_ref()
                        .ok()
                        .is_some_and(|a| drag::handle_at(design, a, &t, Px::new(at.0, at.1)).is_some())
                })
            });
        let _ = web_sys::HtmlElement::style(&el)
            .set_property("cursor", if grabbable { "grab" } else { "default" });
        state.focus_member(key_at(at));
    };
    let on_key = move |ev: web_sys::KeyboardEvent| {
        // with the vehicle on the deck, left and right move it (Shift: one panel); up and
        // down still step through the members
        let key = ev.key();
        if state.vehicle.get_untracked().is_some() && matches!(key.as_str(), "ArrowLeft" | "ArrowRight") {
            ev.prevent_default();
            let step = if ev.shift_key() {
                state.panel_length().unwrap_or(VEHICLE_KEY_STEP)
            } else {
                VEHICLE_KEY_STEP
            };
            let sign = if key == "ArrowLeft" { -1.0 } else { 1.0 };
            if let Some(x) = state.vehicle.get_untracked() {
                state.move_vehicle(x + sign * step);
            }
            return;
        }
        let model = shown.with_value(|s| s.as_ref().map_or(ModelKind::Frame, |(_, m)| *m));
        // Enter picks the member stepped to, as a click does
        if ev.key() == "Enter" {
            envelope::pick_member(state, state.focus.get_untracked());
            return;
        }
        step_member(state, &ev, model);
    };
    view! {
        <div class="elevation-box">
            <canvas
                id="elevation"
                class="drawing"
                node_ref=node
                tabindex="0"
                aria-label="Elevation of the deck arch with member forces. Arrow keys step through the members and the readout below reads their forces; Escape clears. Drag the crown, a springing, the deck or a ground point to change the design. With the vehicle chosen, drag it along the deck, or move it with the left and right arrow keys (Shift: one panel)."
                aria-describedby="member-readout"
                on:pointerdown=on_down
                on:pointerup=on_up
                on:pointercancel=on_up
                on:lostpointercapture=on_up
                on:pointermove=on_move
                on:pointerleave=move |_| state.focus_member(None)
                on:keydown=on_key
            ></canvas>
            <ModelSwitch />
        </div>
    }
}

/// A drag of an elevation handle in progress.
#[derive(Clone)]
struct HandleDrag {
    /// The pointer that holds the handle: other pointers are ignored until it is up.
    pointer: i32,
    /// The engine's drag (the handle, and the limit it works out once).
    drag: Drag,
    /// The design before the drag (one undo step returns to it).
    before: springline_statics::Design,
    /// The transform the drag started in, kept fixed so the mapping does not shift
    /// while the drawing would refit.
    transform: Transform,
    /// World offset from the pointer to the handle, so the handle does not jump to the
    /// pointer.
    grab: (f64, f64),
}

/// A drag of the vehicle in progress.
#[derive(Clone, Copy)]
struct VehicleDrag {
    /// The pointer that holds the vehicle.
    pointer: i32,
    /// World x from the pointer to the leading axle, m, so the vehicle does not jump.
    grab: f64,
    /// The transform the drag started in.
    transform: Transform,
}

/// Zoom factor of one press of the zoom buttons.
const BUTTON_ZOOM: f64 = 1.25;

/// A drag of the pole of the rib's pole construction in progress.
#[derive(Clone)]
struct PoleDrag {
    /// The pointer that holds the pole.
    pointer: i32,
    /// The design when the drag started (what the shapes are found from, and the undo
    /// step's).
    before: springline_statics::Design,
    /// The pole area's transform when the drag started (kN).
    transform: Transform,
    /// World x from the pointer to the pole, kN, so the pole does not jump.
    grab: f64,
}

/// The pole of the rib's pole construction on the force canvas (CSS pixels) with its
/// area's transform, when the drawing shows it for the dead load (the case the pole
/// drag shapes): the form's pole, which for a two-hinged or fixed rib is drawn beside
/// the solver's.
fn pole_on_canvas(
    a: &springline_statics::Analysis,
    case: usize,
    d: &ForceDrawing,
) -> Option<(Px, Transform)> {
    let figs = a.load_cases.get(case)?;
    if figs.description != springline_statics::arch::cases::CaseKind::Dead {
        return None;
    }
    // a rib that is not three-hinged: the form's pole (the one the drag sets)
    let pole = figs.form_pole.or_else(|| figs.rib_funicular.as_ref().map(|r| r.construction.pole))?;
    let area = d.areas.iter().find(|x| x.kind == AreaKind::Pole)?;
    let p = area.transform.px(pole.x, pole.y);
    area.rect
        .contains(&springline_statics::scene::Rect::new(p.x, p.y, 0.0, 0.0))
        .then_some((p, area.transform))
}

/// The force-diagram canvas with its zoom buttons. Wheel zooms about the pointer, two
/// pointers pinch, one pointer drags to pan the area it started in; "fit" restores the
/// fitted view. While the elevation is being dragged (`state.dragging`) the force scale
/// is held, so a larger thrust draws longer; it refits when the drag ends.
#[component]
pub fn ForceCanvas() -> impl IntoView {
    let state = expect_context::<AppState>();
    let node: NodeRef<Canvas> = NodeRef::new();
    let size = crate::canvas::watch_size(node);
    let views = RwSignal::new([AreaView::FIT; 2]);
    let drawn = StoredValue::new(None::<ForceDrawing>);
    let held = StoredValue::new(None::<FixedScale>);
    // pointers down on the canvas: (id, last position), and whether the pointer moved
    let pointers = StoredValue::new(Vec::<(i32, Px)>::new());
    let pole_drag = StoredValue::new(None::<PoleDrag>);
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
        // an analysis error leaves the last drawing on screen; the figures are the shown case's
        let Ok(a) = state.drawn.get() else { return };
        let Some(viewport) =
            size.get().filter(|(w, h)| *w > 0.0 && *h > 0.0).map(|(w, h)| Viewport::new(w, h))
        else {
            return;
        };
        let opts = ForceOptions { units, highlight, views, fixed_scale: held.get_value() };
        let d = timed(Step::Scene, || forces::drawing(&a, case, &opts, viewport));
        timed(Step::Paint("forces"), || paint::paint(&el, &d.scene));
        // the pole one can drag, for tests and assistive tools
        match pole_on_canvas(&a, case, &d) {
            Some((p, t)) => {
                let _ = el.set_attribute("data-pole", &format!("[{},{}]", p.x, p.y));
                let _ = el.set_attribute("data-pole-thrust", &format!("{}", a.form.thrust));
                let _ = el.set_attribute("data-load-line-x", &format!("{}", t.px(0.0, 0.0).x));
            }
            None => {
                for name in ["data-pole", "data-pole-thrust", "data-load-line-x"] {
                    let _ = el.remove_attribute(name);
                }
            }
        }
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
    // the pole of the drawing on screen, if it shows one to drag
    let pole_now = move || {
        let case = state.case.get_untracked();
        state.drawn.with_untracked(|o| {
            let a = o.as_ref().ok()?;
            drawn.with_value(|d| d.as_ref().and_then(|d| pole_on_canvas(a, case, d)))
        })
    };
    let on_down = move |ev: web_sys::PointerEvent| {
        let Some(at) = px_of(&ev) else { return };
        if let Some(el) = node.get() {
            let _ = el.set_pointer_capture(ev.pointer_id());
        }
        // on the pole: drag it (the thrust, and the shape with it)
        if let Some((p, t)) = pole_now().filter(|(p, _)| (p.x - at.x).hypot(p.y - at.y) <= drag::POINT_REACH)
        {
            ev.prevent_default();
            let (wx, _) = t.world(at);
            let (px, _) = t.world(p);
            state.drag_stop.set(None);
            state.dragging.set(true);
            pole_drag.set_value(Some(PoleDrag {
                pointer: ev.pointer_id(),
                before: state.design.get_untracked(),
                transform: t,
                grab: px - wx,
            }));
            return;
        }
        pointers.update_value(|p| {
            p.retain(|(id, _)| *id != ev.pointer_id());
            p.push((ev.pointer_id(), at));
        });
    };
    // up, cancelled or capture lost (a touch the browser took over): the pointer is gone,
    // so a later single pointer pans instead of pinching with a stale one
    let on_up = move |ev: web_sys::PointerEvent| {
        if let Some(d) = pole_drag.get_value().filter(|d| d.pointer == ev.pointer_id()) {
            pole_drag.set_value(None);
            state.end_drag(d.before);
            state.resized.update(|n| *n = n.wrapping_add(1));
        }
        pointers.update_value(|p| p.retain(|(id, _)| *id != ev.pointer_id()));
        if let Some(el) = node.get() {
            if el.has_pointer_capture(ev.pointer_id()) {
                let _ = el.release_pointer_capture(ev.pointer_id());
            }
        }
    };
    let on_move = move |ev: web_sys::PointerEvent| {
        let Some(at) = px_of(&ev) else { return };
        // dragging the pole: its distance from the load line is the thrust H; the rise
        // follows (`arch::seek::shape_for_thrust`), stopping at the layout's limits
        if let Some(d) = pole_drag.get_value() {
            if d.pointer != ev.pointer_id() {
                return;
            }
            let thrust = -(d.transform.world(at).0 + d.grab);
            if thrust <= 0.0 {
                return;
            }
            let units = state.units.get_untracked();
            match shape_for_thrust(&d.before, thrust) {
                Ok(shaped) => {
                    let stopped = shaped.limit.as_ref().map(|l| format!("Pole held: {}", l.describe(units)));
                    if let Err(e) = state.show_during_drag(shaped.design) {
                        state.drag_stop.set(Some(format!("Pole held: {e}")));
                    } else if let Some(words) = stopped {
                        state.drag_stop.set(Some(words));
                    }
                }
                Err(e) => state.drag_stop.set(Some(format!("Pole held: {e}"))),
            }
            return;
        }
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
        // a grab cursor over the pole
        let grab = pole_now().is_some_and(|(p, _)| (p.x - at.x).hypot(p.y - at.y) <= drag::POINT_REACH);
        if let Some(el) = node.get() {
            let _ = web_sys::HtmlElement::style(&el)
                .set_property("cursor", if grab { "grab" } else { "default" });
        }
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
        <div class="force-canvas">
            <canvas
                id="forces"
                class="drawing"
                node_ref=node
                tabindex="0"
                aria-label="Force diagram: reciprocal figure and pole construction, or the thrust line; wheel or pinch to zoom, drag to pan; under dead load, drag the pole to set the thrust (the rise follows). Arrow keys step through the members of the truss idealisation and the readout below reads their forces; Escape clears."
                aria-describedby="member-readout"
                on:keydown=move |ev| step_member(state, &ev, ModelKind::Truss)
                on:pointerdown=on_down
                on:pointerup=on_up
                on:pointercancel=on_up
                on:lostpointercapture=on_up
                on:pointermove=on_move
                on:pointerleave=move |_| state.hover(None)
                on:wheel=on_wheel
            ></canvas>
            <div
                class="force-zoom"
                role="toolbar"
                aria-label="Force diagram view"
            >
                <button id="forces-zoom-in" type="button" aria-label="Zoom the force diagram in" title="Zoom in" class="force-zoom-button" on:click=move |_| zoom_all(BUTTON_ZOOM)>"+"</button>
                <button id="forces-zoom-out" type="button" aria-label="Zoom the force diagram out" title="Zoom out" class="force-zoom-button" on:click=move |_| zoom_all(1.0 / BUTTON_ZOOM)>"−"</button>
                <button id="forces-fit" type="button" aria-label="Fit the force diagram to the canvas" title="Fit" class="force-zoom-button" on:click=move |_| views.set([AreaView::FIT; 2])>"fit"</button>
            </div>
        </div>
    }
}

/// The readout of a vehicle drag: where the leading axle stands (`x`, m), beside the
/// pointer at `at` (CSS pixels of the elevation).
fn vehicle_reading(state: AppState, x: f64, at: (f64, f64)) -> DragReading {
    DragReading { text: drag::leading_axle(x, state.units.get_untracked()), at }
}

/// The readout of a drag of `handle` on `design`: the value it sets, beside the pointer at
/// `at` (CSS pixels of the elevation); `None` for a handle with no value of its own.
fn handle_reading(state: AppState, handle: Handle, design: &Design, at: (f64, f64)) -> Option<DragReading> {
    let units = state.units.get_untracked();
    handle.reading(design).map(|r| DragReading { text: r.describe(units), at })
}
