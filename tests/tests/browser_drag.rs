//! Calm dragging in the browser: a drag past a limit stops at the last valid position,
//! says why in the fixed status line, moves nothing else on the page, and the message
//! clears once the design is valid again; drags land on the 0.1 m grid; the value being
//! dragged is shown beside the pointer. Same set-up as browser.rs (Debian's headless
//! Chromium over WebDriver, the release build in `dist/`).
//!
//! Expected values come from the engine (`arch::edit::largest_rise`, `analyze`), mapped
//! to pixels through the transform the elevation publishes.

use serde_json::{json, Value};
use springline_statics::arch::edit::{largest_rise, SNAP_STEP};
use springline_statics::{analyze, Design};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

/// The page's parts whose boxes must not move during a drag.
const PARTS: &str = "['header.top', 'aside.controls', 'section.scenarios', '#elevation', '#forces', '#drag-status', '#member-readout', '.results-panel']";

/// Every part's bounding box as [left, top, width, height], CSS pixels. The results
/// panel's height is left out (written 0): its content follows the design (a note appears
/// when the thrusts differ), and it is the last part of the page, so nothing moves with it.
fn boxes(s: &Session) -> Value {
    s.exec(
        &format!(
            "return {PARTS}.map(q => {{ const e = document.querySelector(q); if (!e) return null;
               const r = e.getBoundingClientRect(); return [r.left, r.top, r.width, q === '.results-panel' ? 0 : r.height]; }});"
        ),
        vec![],
    )
}

/// Records, at every pointer move from now on, the parts' boxes, the status line and the
/// readout the elevation draws beside the pointer (its words are published as
/// `data-readout`; the page has updated for the previous move by then).
fn record_during_drag(s: &Session) {
    s.exec(
        &format!(
            "window.__drag = [];
             document.addEventListener('pointermove', () => {{
               const boxes = {PARTS}.map(q => {{ const e = document.querySelector(q); if (!e) return null;
                 const r = e.getBoundingClientRect(); return [r.left, r.top, r.width, q === '.results-panel' ? 0 : r.height]; }});
               const st = document.getElementById('drag-status');
               const rd = document.getElementById('elevation').dataset.readout;
               window.__drag.push({{ boxes, status: st ? st.textContent : null,
                 stopped: st ? st.dataset.stopped : null, readout: rd === undefined ? null : rd }});
             }}, true);"
        ),
        vec![],
    );
}

fn recorded(s: &Session) -> Vec<Value> {
    s.exec("return window.__drag || [];", vec![]).as_array().cloned().unwrap_or_default()
}

fn same_boxes(a: &Value, b: &Value) -> bool {
    let (Some(a), Some(b)) = (a.as_array(), b.as_array()) else { return false };
    a.len() == b.len()
        && a.iter().zip(b).all(|(p, q)| match (p.as_array(), q.as_array()) {
            (Some(p), Some(q)) => p
                .iter()
                .zip(q)
                .all(|(u, v)| (u.as_f64().unwrap_or(f64::NAN) - v.as_f64().unwrap_or(f64::NAN)).abs() < 0.5),
            _ => false,
        })
}

/// The rise field's value, m.
fn rise_field(s: &Session) -> f64 {
    let v = s.exec("return document.getElementById('rise').value;", vec![]);
    let text = v.as_str().unwrap_or("").replace(',', ".");
    text.trim().parse().unwrap_or_else(|_| panic!("the rise field holds '{text}'"))
}

fn on_grid(v: f64) -> bool {
    let steps = v / SNAP_STEP;
    (steps - steps.round()).abs() < 1e-6
}

/// Viewport pixel of the crown of `design` on the elevation as drawn now.
fn crown_px(s: &Session, design: &Design) -> (f64, f64) {
    let a = analyze(design).expect("analyses");
    let t = transform(s, "elevation");
    let c = to_px(t, a.form.crown.x, a.form.crown.y);
    let o = canvas_origin(s, "elevation");
    ((o.0 + c.0).round(), (o.1 + c.1).round())
}

fn status(s: &Session) -> (String, String) {
    let v = s.exec(
        "const e = document.getElementById('drag-status'); return [e.textContent, e.dataset.stopped];",
        vec![],
    );
    (v[0].as_str().unwrap_or("").to_string(), v[1].as_str().unwrap_or("").to_string())
}

#[test]
fn a_crown_dragged_over_the_deck_stops_at_the_largest_rise_says_why_and_moves_nothing_else() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    let limit = largest_rise(&demo).expect("the demo is valid");
    let (idle, stopped) = status(&s);
    assert_eq!(stopped, "false");
    assert!(idle.contains("Shift"), "the idle status line says how to drag: {idle}");
    let before = boxes(&s);
    assert!(before.as_array().is_some_and(|b| b.iter().all(|p| !p.is_null())), "a part is missing: {before}");

    // from the crown to 10 m above the deck (the crown may not pass the deck axis)
    let t = transform(&s, "elevation");
    let from = crown_px(&s, &demo);
    let over = from.1 - t.0 * (demo.deck.level + 10.0 - demo.crown_level());
    record_during_drag(&s);
    s.drag(from, (from.0, over), 12);
    s.wait_for(
        "the status line to say why the drag stopped",
        "return document.getElementById('drag-status').dataset.stopped === 'true'",
        WAIT,
    );

    // held at the engine's largest rise, on the 0.1 m grid
    let rise = rise_field(&s);
    assert!(on_grid(rise), "rise {rise} m is not on the 0.1 m grid");
    assert!(
        rise <= limit.rise && limit.rise - rise < SNAP_STEP + 1e-9,
        "rise {rise} m, largest rise {} m",
        limit.rise
    );
    let (message, _) = status(&s);
    assert!(message.starts_with("Rise held at"), "{message}");
    assert!(message.contains("the largest rise the layout takes is"), "{message}");
    assert!(message.contains("not at mid-span"), "{message}");

    // nothing moved, during the drag or after it; the readout showed the rise
    let during = recorded(&s);
    assert!(during.len() >= 10, "pointer moves recorded: {}", during.len());
    for (k, snap) in during.iter().enumerate() {
        assert!(same_boxes(&snap["boxes"], &before), "move {k}: {} != {before}", snap["boxes"]);
    }
    assert!(same_boxes(&boxes(&s), &before), "after the drag: {} != {before}", boxes(&s));
    assert!(
        during.iter().any(|r| r["stopped"] == "true"),
        "the status line said why while dragging: {during:?}"
    );
    let readouts: Vec<&str> = during.iter().filter_map(|r| r["readout"].as_str()).collect();
    assert!(readouts.iter().any(|r| r.starts_with("rise ") && r.ends_with("\u{a0}m")), "{readouts:?}");
    std::fs::write(screenshots_dir().join("drag-stopped.png"), s.screenshot()).expect("screenshot");
    let hidden = s.exec("return document.getElementById('elevation').dataset.readout === undefined;", vec![]);
    assert_eq!(hidden, json!(true), "the readout goes when the drag ends");

    // back down 3 m into the valid range: the message clears, the rise is on the grid
    let mut held = demo.clone();
    held.set_rise(rise);
    let from = crown_px(&s, &held);
    let t = transform(&s, "elevation");
    s.drag(from, (from.0, from.1 + 3.0 * t.0), 6);
    s.wait_for(
        "the message to clear",
        "return document.getElementById('drag-status').dataset.stopped === 'false'",
        WAIT,
    );
    let back = rise_field(&s);
    assert!(on_grid(back), "rise {back} m is not on the 0.1 m grid");
    assert!(
        (back - (rise - 3.0)).abs() <= 1.0 / t.0 + SNAP_STEP,
        "rise {back} m after 3 m down from {rise} m"
    );
    let (message, _) = status(&s);
    assert_eq!(message, idle);
    assert!(same_boxes(&boxes(&s), &before), "after dragging back: {} != {before}", boxes(&s));
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

#[test]
fn a_rise_typed_over_the_largest_is_refused_and_told_the_largest_rise() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1024, 768, 1.0);
    open(&s, &server);
    let limit = largest_rise(&Design::demo()).expect("the demo is valid");
    let hint = |s: &Session| text_of(s, "rise-limit");
    assert_eq!(hint(&s), "", "no hint before a refused rise");
    // 21.9 m: under the input ceiling (crown at the deck, 22 m) but over the largest rise
    assert!(limit.rise < 21.9 && 21.9 < 22.0, "{limit:?}");
    set_field(&s, "rise", "21.9");
    s.wait_for(
        "the largest rise beside the rise field",
        "return document.getElementById('rise-limit').textContent.length > 0",
        WAIT,
    );
    let words = hint(&s);
    s.exec("document.getElementById('rise').scrollIntoView({ block: 'center' });", vec![]);
    std::fs::write(screenshots_dir().join("rise-limit.png"), s.screenshot()).expect("screenshot");
    let expected =
        format!("The largest rise the layout takes is {}", limit.rise.to_string().get(..4).unwrap_or(""));
    assert!(words.starts_with(&expected), "{words} (expected to start {expected})");
    assert!(words.contains("right of mid-span"), "{words}");
    // the design is unchanged (the results still show the demo's rise; the field keeps
    // the text typed, beside its message); a rise under the limit is accepted and the
    // hint goes
    assert_eq!(shown_number(&text_of(&s, "result-rise")), 19.5);
    set_field(&s, "rise", "21");
    s.wait_for("the hint to go", "return document.getElementById('rise-limit').textContent === ''", WAIT);
    assert_eq!(rise_field(&s), 21.0);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

/// `#forces`'s published scale, CSS px per kN.
fn force_scale(s: &Session) -> f64 {
    let v = s.exec("return +document.getElementById('forces').dataset.scale;", vec![]);
    v.as_f64().unwrap_or(f64::NAN)
}

#[test]
fn the_force_scale_is_held_while_the_crown_is_dragged_and_refits_after() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    let before = force_scale(&s);
    assert!(before.is_finite() && before > 0.0, "force scale {before}");
    // the crown 4 m down: a rise of 19.5 - 4 = 15.5 m, well above the least rise (see
    // `edit`'s tests), so the drag is never stopped; the flatter rib thrusts harder
    let (t, from) = (transform(&s, "elevation"), crown_px(&s, &demo));
    s.exec(
        "window.__scales = [];
         document.addEventListener('pointermove', () => {
           window.__scales.push([+document.getElementById('forces').dataset.scale,
                                 document.getElementById('rise').value,
                                 document.getElementById('elevation').dataset.readout]);
         }, true);",
        vec![],
    );
    s.drag(from, (from.0, from.1 + 4.0 * t.0), 10);
    let during = s.exec("return window.__scales;", vec![]).as_array().cloned().unwrap_or_default();
    assert!(during.len() >= 8, "pointer moves recorded: {}", during.len());
    // the design changed during the drag (the readout beside the pointer followed) while
    // the panels held the design from before it (the rise field among them) ...
    let readouts: Vec<&str> = during.iter().filter_map(|r| r[2].as_str()).collect();
    assert!(readouts.len() >= 8 && readouts.iter().all(|r| r.starts_with("rise ")), "{readouts:?}");
    assert!(readouts.first() != readouts.last(), "the rise did not change while dragging: {readouts:?}");
    let fields: Vec<&str> = during.iter().filter_map(|r| r[1].as_str()).collect();
    assert!(fields.iter().all(|f| *f == fields[0]), "the rise field moved during the drag: {fields:?}");
    // ... and the force diagram kept the scale it had when the drag started
    for (k, r) in during.iter().enumerate() {
        let scale = r[0].as_f64().unwrap_or(f64::NAN);
        assert!((scale - before).abs() <= 1e-9 * before, "move {k}: force scale {scale}, before {before}");
    }
    // released: the panels follow (the rise field shows the new rise) and the thrust
    // changed, so the diagram refits to a new scale
    let rise = rise_field(&s);
    assert!(
        fields[0].parse::<f64>().is_ok_and(|held| held != rise),
        "rise field {rise} after, {fields:?} during"
    );
    assert!((rise - 15.5).abs() <= 1.0 / t.0 + SNAP_STEP, "rise {rise} m after 4 m down from 19.5 m");
    // the thrust of the form (H, kN), from the engine
    let h = |d: &Design| analyze(d).expect("analyses").form.thrust;
    let mut dragged = demo.clone();
    dragged.set_rise(rise);
    assert!(h(&dragged) > h(&demo), "thrust {} kN, before {} kN", h(&dragged), h(&demo));
    s.wait_for(
        "the force diagram to refit after the drag",
        &format!(
            "return Math.abs(+document.getElementById('forces').dataset.scale - {before}) > {};",
            1e-6 * before
        ),
        WAIT,
    );
    let after = force_scale(&s);
    // a harder thrust draws wider at the held scale: the refit draws it smaller
    assert!(after < before, "force scale {after} after, {before} before");
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}
