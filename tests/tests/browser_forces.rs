//! The force canvas in the browser: zoom buttons, wheel zoom about the pointer, and drag
//! to pan, read through the transform the canvas publishes (`data-scale`,
//! `data-origin-x`, `data-origin-y`: the reciprocal figure's, in kN). Needs the release
//! build in `dist/`, like the other browser tests.

use serde_json::json;
use springline_statics::{analyze, Design, SegmentOf};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

/// The zoom buttons' factor (components/canvases.rs `BUTTON_ZOOM`).
const BUTTON_ZOOM: f64 = 1.25;

fn click(s: &Session, id: &str) {
    s.exec("document.getElementById(arguments[0]).click();", vec![json!(id)]);
}

/// Waits until the published scale differs from `old`, and returns the new transform.
fn next_transform(s: &Session, old: f64) -> (f64, f64, f64) {
    s.wait_for(
        "the force canvas to redraw at a new scale",
        &format!("return +document.getElementById('forces').dataset.scale !== {old};"),
        WAIT,
    );
    transform(s, "forces")
}

/// A point of the figure inside the canvas: the middle of the demo's load line (the
/// external load segments of the truss idealisation's reciprocal figure).
fn load_line_middle() -> (f64, f64) {
    let a = analyze(&Design::demo()).expect("demo");
    let fd = a.load_cases[0].force_diagram.as_ref().expect("figure");
    let loads: Vec<_> = fd.segments.iter().filter(|g| matches!(g.of, SegmentOf::Load { .. })).collect();
    let mid = loads[loads.len() / 2];
    let (l, r) = (fd.spaces[mid.left].point, fd.spaces[mid.right].point);
    ((l.x + r.x) / 2.0, (l.y + r.y) / 2.0)
}

#[test]
fn zoom_buttons_scale_the_figure_and_fit_restores_it() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let (s0, x0, y0) = transform(&s, "forces");
    click(&s, "forces-zoom-in");
    let (s1, _, _) = next_transform(&s, s0);
    assert!((s1 / s0 - BUTTON_ZOOM).abs() < 1e-9, "zoom in: {s1} / {s0}");
    click(&s, "forces-zoom-out");
    let (s2, _, _) = next_transform(&s, s1);
    assert!((s2 / s0 - 1.0).abs() < 1e-9, "zoom out undoes zoom in: {s2} vs {s0}");
    click(&s, "forces-zoom-out");
    let (s3, _, _) = next_transform(&s, s2);
    assert!((s3 * BUTTON_ZOOM / s0 - 1.0).abs() < 1e-9, "zoom out: {s3} vs {s0}");
    click(&s, "forces-fit");
    let (s4, x4, y4) = next_transform(&s, s3);
    assert!(
        (s4 / s0 - 1.0).abs() < 1e-12 && (x4 - x0).abs() < 1e-6 && (y4 - y0).abs() < 1e-6,
        "fit restores"
    );
    // the buttons say what they do
    let labels = s.exec(
        "return ['forces-zoom-in','forces-zoom-out','forces-fit'].map(id => document.getElementById(id).getAttribute('aria-label'));",
        vec![],
    );
    for l in labels.as_array().cloned().unwrap_or_default() {
        assert!(l.as_str().is_some_and(|t| t.contains("force diagram")), "aria-label {l}");
    }
    assert!(severe(&s).is_empty(), "no console errors");
}

#[test]
fn the_wheel_zooms_about_the_pointer() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let t0 = transform(&s, "forces");
    let near = load_line_middle();
    let origin = canvas_origin(&s, "forces");
    // the app reads whole client pixels (MouseEvent.clientX as an integer): aim at one,
    // and take the world point under it
    let guess = to_px(t0, near.0, near.1);
    let client = ((origin.0 + guess.0).round(), (origin.1 + guess.1).round());
    let at = (client.0 - origin.0, client.1 - origin.1);
    let world = ((at.0 - t0.1) / t0.0, (t0.2 - at.1) / t0.0);
    s.exec(
        "document.getElementById('forces').dispatchEvent(new WheelEvent('wheel',
           { clientX: arguments[0], clientY: arguments[1], deltaY: -200, deltaMode: 0, bubbles: true, cancelable: true }));",
        vec![json!(client.0), json!(client.1)],
    );
    let t1 = next_transform(&s, t0.0);
    // 200 px of wheel: the factor exp(200 * 0.0015) (components/canvases.rs)
    assert!((t1.0 / t0.0 - (0.3f64).exp()).abs() < 1e-9, "wheel up zooms in: {} -> {}", t0.0, t1.0);
    let after = to_px(t1, world.0, world.1);
    assert!((after.0 - at.0).abs() < 1e-6 && (after.1 - at.1).abs() < 1e-6, "{at:?} -> {after:?}");
}

#[test]
fn dragging_the_figure_pans_it() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let t0 = transform(&s, "forces");
    let world = load_line_middle();
    let at = to_px(t0, world.0, world.1);
    let origin = canvas_origin(&s, "forces");
    let from = ((origin.0 + at.0).round(), (origin.1 + at.1).round());
    s.drag(from, (from.0 - 30.0, from.1 + 20.0), 5);
    s.wait_for(
        "the figure to move",
        &format!("return +document.getElementById('forces').dataset.originX !== {};", t0.1),
        WAIT,
    );
    let t1 = transform(&s, "forces");
    assert_eq!(t1.0, t0.0, "panning keeps the scale");
    assert!((t1.1 - t0.1 + 30.0).abs() < 1e-6 && (t1.2 - t0.2 - 20.0).abs() < 1e-6, "{t0:?} -> {t1:?}");
}

/// Resting the pointer on a space label shows its full list (the canvas's title): the
/// labels and their hover texts are published (`window.springlineLabels`).
#[test]
fn a_space_label_shows_its_full_list_on_hover() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let labels = s.exec("return JSON.parse(window.springlineLabels('forces'));", vec![]);
    let label = labels
        .as_array()
        .cloned()
        .unwrap_or_default()
        .into_iter()
        .filter(|l| l["detail"].as_str().is_some_and(|d| d.starts_with("spaces ") && d.contains(',')))
        .max_by(|a, b| a["w"].as_f64().unwrap_or(0.0).total_cmp(&b["w"].as_f64().unwrap_or(0.0)))
        .expect("the demo's figure has spaces sharing a point");
    let detail = label["detail"].as_str().unwrap_or("").to_string();
    let n = |k: &str| label[k].as_f64().unwrap_or(f64::NAN);
    let origin = canvas_origin(&s, "forces");
    s.hover((origin.0 + n("x") + n("w") / 2.0, origin.1 + n("y") + n("h") / 2.0));
    let title = s.wait_for(
        "the full list as the canvas's title",
        "const t = document.getElementById('forces').getAttribute('title'); return t ? t : null;",
        WAIT,
    );
    assert_eq!(title.as_str(), Some(detail.as_str()));
}

/// Two pointers pinch: moving one away from the other zooms by the ratio of their
/// distances, about their middle (synthetic pointer events, as a touch screen sends).
#[test]
fn a_pinch_zooms_about_the_fingers_middle() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let t0 = transform(&s, "forces");
    let near = load_line_middle();
    let origin = canvas_origin(&s, "forces");
    let guess = to_px(t0, near.0, near.1);
    // whole client pixels, the first finger left of the second
    let c = ((origin.0 + guess.0).round() - 60.0, (origin.1 + guess.1).round());
    let (f1, f2, f2_to) = ((c.0 - 40.0, c.1), (c.0 + 40.0, c.1), (c.0 + 80.0, c.1));
    s.exec(
        "const el = document.getElementById('forces');
         const ev = (type, id, x, y) => el.dispatchEvent(new PointerEvent(type,
           { pointerId: id, pointerType: 'touch', isPrimary: id === 1, clientX: x, clientY: y, bubbles: true, cancelable: true }));
         ev('pointerdown', 1, arguments[0], arguments[1]);
         ev('pointerdown', 2, arguments[2], arguments[3]);
         ev('pointermove', 2, arguments[4], arguments[5]);
         ev('pointerup', 2, arguments[4], arguments[5]);
         ev('pointerup', 1, arguments[0], arguments[1]);",
        vec![json!(f1.0), json!(f1.1), json!(f2.0), json!(f2.1), json!(f2_to.0), json!(f2_to.1)],
    );
    let t1 = next_transform(&s, t0.0);
    // 80 px apart, then 120 px: 1.5 times the scale
    assert!((t1.0 / t0.0 - 1.5).abs() < 1e-9, "pinch: {} -> {}", t0.0, t1.0);
    // the point between the fingers (after the move) stays where it was
    let mid = ((f1.0 + f2_to.0) / 2.0 - origin.0, (f1.1 + f2_to.1) / 2.0 - origin.1);
    let world = ((mid.0 - t0.1) / t0.0, (t0.2 - mid.1) / t0.0);
    let after = to_px(t1, world.0, world.1);
    assert!((after.0 - mid.0).abs() < 1e-6 && (after.1 - mid.1).abs() < 1e-6, "{mid:?} -> {after:?}");
}

/// The browser's measured width of every force-canvas label fits the box the scene gave
/// it (the box is the estimated text width plus 3 px padding each side), so the native
/// tests' width estimate cannot hide an overlap; checked in both unit systems.
#[test]
fn every_force_label_fits_its_box_as_the_browser_measures_it() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let measure = "const c = document.getElementById('forces'); const ctx = c.getContext('2d');
         return JSON.parse(window.springlineLabels('forces')).map(l => { ctx.font = l.font; return [l.text, ctx.measureText(l.text).width, l.w, l.pad]; });";
    let check = |s: &Session| {
        let rows = s.exec(measure, vec![]);
        let rows = rows.as_array().cloned().unwrap_or_default();
        assert!(rows.len() > 10, "labels published: {}", rows.len());
        let mut too_wide = Vec::new();
        for r in rows {
            let (text, measured, w, pad) = (
                r[0].as_str().unwrap_or(""),
                r[1].as_f64().unwrap_or(f64::NAN),
                r[2].as_f64().unwrap_or(0.0),
                r[3].as_f64().unwrap_or(f64::NAN),
            );
            // the text and its padding either side must fit the box (the rule of
            // `browser_scene`'s label check)
            if measured.is_nan() || pad.is_nan() || measured + 2.0 * pad > w + 0.01 {
                too_wide.push(format!(
                    "'{text}' measures {measured:.1} px with {pad} px padding either side in a {w:.1} px box"
                ));
            }
        }
        assert!(too_wide.is_empty(), "labels wider than their boxes: {too_wide:#?}");
    };
    check(&s);
    let before = s.exec("return window.springlineLabels('forces');", vec![]);
    s.exec(
        "[...document.querySelectorAll('button')].find(b => b.textContent.includes('units')).click();",
        vec![],
    );
    s.wait_for(
        "the labels in the other units",
        &format!("return window.springlineLabels('forces') !== {};", before),
        WAIT,
    );
    check(&s);
}
