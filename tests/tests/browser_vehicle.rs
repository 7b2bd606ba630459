//! The vehicle on the deck in the browser: choosing it puts the load model's vehicle at
//! the left quarter of the arch span; dragged across the span with the pointer, the
//! drawings, the member readout and the results table follow it, and a bracing diagonal
//! turns from tension to compression; the arrow keys move it in 0.5 m steps (Shift: a
//! panel); choosing another case takes it off the deck. Same set-up as browser.rs
//! (Debian's headless Chromium over WebDriver, the release build in `dist/`).
//!
//! Expected values come from the engine for the same vehicle position, read back from
//! the `data-vehicle-x` the elevation publishes: `arch::analysis::analyze_with` with
//! `scene::vehicle::vehicle_case`, and `arch::readout::readout` for the member readout.

use serde_json::json;
use springline_statics::arch::analysis::analyze_with;
use springline_statics::arch::readout::{readout, MemberKey};
use springline_statics::scene::vehicle::{start_position, vehicle_case};
use springline_statics::units::{Quantity, Units};
use springline_statics::{Analysis, Design, MemberRole, ModelKind, ValidDesign};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

fn click(s: &Session, id: &str) {
    s.exec("document.getElementById(arguments[0]).click();", vec![json!(id)]);
}

/// The leading axle's x the elevation publishes, m (`None` without a vehicle).
fn vehicle_x(s: &Session) -> Option<f64> {
    s.exec("return document.getElementById('elevation').dataset.vehicleX ?? null;", vec![])
        .as_str()
        .and_then(|t| t.parse().ok())
}

/// Waits until the published vehicle x differs from `old` and returns it.
fn next_vehicle_x(s: &Session, old: Option<f64>) -> f64 {
    let old = old.map_or("undefined".to_string(), |x| format!("'{x}'"));
    s.wait_for(
        "the elevation to redraw the vehicle",
        &format!(
            "const v = document.getElementById('elevation').dataset.vehicleX; return v !== undefined && v !== {old};"
        ),
        WAIT,
    );
    vehicle_x(s).expect("a vehicle x")
}

/// Waits until the results table's row of the member in focus carries `n` (kN,
/// relative 1e-9): its sign is the member's in the shown case.
fn wait_focus_row(s: &Session, n: f64) {
    s.wait_for(
        &format!("the focused member's row to read {n} kN"),
        &format!(
            "const e = document.getElementById('result-focus-n'); return e && Math.abs(+e.dataset.value - ({n})) <= 1e-9 * Math.max(1, Math.abs({n}));"
        ),
        WAIT,
    );
}

/// The centre of the vehicle's grab box, viewport CSS pixels.
fn vehicle_centre(s: &Session) -> (f64, f64) {
    let v = s.exec("return JSON.parse(document.getElementById('elevation').dataset.vehicleBox);", vec![]);
    let n = |i: usize| v[i].as_f64().expect("a box of four numbers");
    let origin = canvas_origin(s, "elevation");
    (origin.0 + n(0) + n(2) / 2.0, origin.1 + n(1) + n(3) / 2.0)
}

/// The engine's analysis of the demo with the vehicle's leading axle at `x`; its case is
/// the last.
fn engine_at(valid: &ValidDesign, x: f64) -> Analysis {
    analyze_with(valid, &[vehicle_case(valid, x).expect("vehicle case")]).expect("analyses")
}

/// Mean axial force (kN) of frame member `k` in the analysis's last case.
fn n_of(a: &Analysis, k: usize) -> f64 {
    let case = a.frame.solution.cases.last().expect("cases");
    0.5 * (case.members[k].start.n + case.members[k].end.n)
}

/// The frame's bracing member with the most tension in the last case.
fn most_tension(a: &Analysis) -> usize {
    a.frame
        .map
        .members_with(MemberRole::Bracing)
        .max_by(|p, q| n_of(a, *p).total_cmp(&n_of(a, *q)))
        .expect("braced")
}

fn readout_lines(s: &Session) -> Vec<String> {
    let v = s.exec(
        "return [...document.querySelectorAll('#member-readout .readout-line')].map(e => e.textContent);",
        vec![],
    );
    v.as_array().map(|a| a.iter().filter_map(|x| x.as_str().map(String::from)).collect()).unwrap_or_default()
}

/// Points at frame member `k` of `a` on the elevation and returns the readout once it
/// reads what the engine's readout of that member in the vehicle's case says.
fn read_member(s: &Session, a: &Analysis, k: usize) -> Vec<String> {
    let key = MemberKey::of(&a.frame.map, ModelKind::Frame, k).expect("a member between joints");
    let expected = readout(a, Design::demo().deck.ribs, &key, a.load_cases.len() - 1).lines(Units::Si);
    let m = &a.frame.model.members[k];
    let (p, q) = (&a.frame.model.nodes[m.start], &a.frame.model.nodes[m.end]);
    let mid = to_px(transform(s, "elevation"), 0.5 * (p.x + q.x), 0.5 * (p.y + q.y));
    let origin = canvas_origin(s, "elevation");
    // leave the canvas first, so the hover is new
    s.hover((origin.0 - 5.0, origin.1 - 5.0));
    s.hover((origin.0 + mid.0, origin.1 + mid.1));
    s.wait_for(
        "the readout of the member in the vehicle's case",
        &format!(
            "return [...document.querySelectorAll('#member-readout .readout-line')].map(e => e.textContent).join('|') === {};",
            json!(expected.join("|"))
        ),
        WAIT,
    );
    readout_lines(s)
}

/// The frame model's N in the readout (its first number: at the start of the member when
/// self-weight makes N vary along it), kN.
fn frame_n(lines: &[String]) -> f64 {
    let line =
        lines.iter().find_map(|l| l.strip_prefix("frame model: N = ")).expect("the frame model's line");
    shown_number(line)
}

/// A results cell's SI value (`data-value`).
fn cell(s: &Session, id: &str) -> f64 {
    let v = s.exec(
        "const e = document.getElementById(arguments[0]); return e ? e.dataset.value : null;",
        vec![json!(id)],
    );
    v.as_str().and_then(|t| t.parse().ok()).unwrap_or_else(|| panic!("no value in #{id}: {v}"))
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-9 * a.abs().max(b.abs()).max(1.0)
}

#[test]
fn dragging_the_vehicle_across_the_span_turns_a_diagonal_from_tension_to_compression() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let valid = ValidDesign::new(&Design::demo()).expect("demo");

    // chosen: at the left quarter of the arch span, its button pressed, its case named
    assert_eq!(vehicle_x(&s), None, "no vehicle before it is chosen");
    click(&s, "case-vehicle");
    let x0 = next_vehicle_x(&s, None);
    assert!(close(x0, start_position(&valid)), "{x0}");
    let pressed =
        s.exec("return document.getElementById('case-vehicle').getAttribute('aria-pressed');", vec![]);
    assert_eq!(pressed, json!("true"));
    s.wait_for(
        "the results table to name the vehicle's case",
        "return document.getElementById('results-caption').textContent.startsWith('Vehicle:');",
        WAIT,
    );
    let status = text_of(&s, "drag-status");
    assert!(status.contains(&Units::Si.show(Quantity::Length, x0)), "{status}");

    // the diagonal with the most tension at the left quarter (the panel under the
    // vehicle), on screen and in the results table
    let a0 = engine_at(&valid, x0);
    let k = most_tension(&a0);
    let key = MemberKey::of(&a0.frame.map, ModelKind::Frame, k).expect("a diagonal");
    let n0 = n_of(&a0, k);
    assert!(n0 > 0.0, "{key}: {n0}");
    let lines = read_member(&s, &a0, k);
    assert!((frame_n(&lines) - n0).abs() < 0.01 * n0.abs(), "{n0} kN: {lines:?}");
    // the member in focus has a row of its own in the results table: tension here
    wait_focus_row(&s, n0);
    assert!(close(cell(&s, "result-case-bracing-tension"), n0));
    let row_label = s.exec(
        "return document.getElementById('result-case-bracing-tension').parentElement.querySelector('th').textContent;",
        vec![],
    );
    assert!(row_label.as_str().is_some_and(|l| l.ends_with(&format!("): {key}"))), "{row_label}");
    let h0 = a0.summary.springings.last().expect("vehicle case").left.thrust;
    assert!(close(cell(&s, "result-left-h"), h0));

    // dragged with the pointer to x = 110 m (three quarters of the span, near enough),
    // the readout the elevation draws beside the pointer saying where it is on the way
    // (the status line holds until the drag ends)
    let scale = transform(&s, "elevation").0;
    let from = vehicle_centre(&s);
    let to = (from.0 + (110.0 - x0) * scale, from.1);
    s.exec(
        "window.__status = [];
         document.addEventListener('pointermove', () => window.__status.push(
           [document.getElementById('elevation').dataset.readout || null, document.getElementById('drag-status').textContent]), true);",
        vec![],
    );
    s.drag(from, to, 16);
    let x1 = next_vehicle_x(&s, Some(x0));
    assert!((x1 - 110.0).abs() < 1.0, "dragged to {x1}");
    assert!(((x1 * 10.0).round() - x1 * 10.0).abs() < 1e-6, "on the 0.1 m grid: {x1}");
    let during = s.exec("return window.__status;", vec![]);
    let during = during.as_array().cloned().unwrap_or_default();
    let readouts: std::collections::BTreeSet<&str> = during.iter().filter_map(|v| v[0].as_str()).collect();
    assert!(readouts.len() >= 4, "the readout followed the drag: {readouts:?}");
    assert!(readouts.iter().all(|r| r.starts_with("leading axle at x = ")), "{readouts:?}");
    let statuses: std::collections::BTreeSet<&str> = during.iter().filter_map(|v| v[1].as_str()).collect();
    assert_eq!(statuses.len(), 1, "the status line held during the drag: {statuses:?}");
    // and says where the vehicle stands once it ends
    s.wait_for(
        "the status line to follow the drag's end",
        &format!(
            "return document.getElementById('drag-status').textContent.includes({:?});",
            Units::Si.show(Quantity::Length, x1)
        ),
        WAIT,
    );

    // the same diagonal is now in compression: on screen, and the table follows the case
    let a1 = engine_at(&valid, x1);
    let n1 = n_of(&a1, k);
    assert!(n1 < 0.0, "{key} at x = {x1} m: {n1} kN");
    let lines = read_member(&s, &a1, k);
    assert!((frame_n(&lines) - n1).abs() < 0.01 * n1.abs(), "{n1} kN: {lines:?}");
    assert!(lines[1].contains('−'), "compression shows its sign: {lines:?}");
    // ... and the results table's row of the member in focus turned to compression
    wait_focus_row(&s, n1);
    let h1 = a1.summary.springings.last().expect("vehicle case").left.thrust;
    assert!(close(cell(&s, "result-left-h"), h1), "{} vs {h1}", cell(&s, "result-left-h"));
    let k1 = most_tension(&a1);
    assert_ne!(k1, k, "the most tension moved to another diagonal");
    assert!(close(cell(&s, "result-case-bracing-tension"), n_of(&a1, k1)));
    let least =
        a1.frame.map.members_with(MemberRole::Bracing).map(|m| n_of(&a1, m)).fold(f64::INFINITY, f64::min);
    assert!(close(cell(&s, "result-case-bracing-compression"), least));

    // keys: left moves 0.5 m back, Shift+left one panel (106.428571 m / 12 on the demo)
    let key_press = |shift: bool| {
        s.exec(
            "const e = document.getElementById('elevation'); e.focus();
             e.dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowLeft', shiftKey: arguments[0], bubbles: true }));",
            vec![json!(shift)],
        );
    };
    key_press(false);
    let x2 = next_vehicle_x(&s, Some(x1));
    assert!(close(x2, x1 - 0.5), "{x2}");
    key_press(true);
    let x3 = next_vehicle_x(&s, Some(x2));
    assert!((x3 - (x2 - 106.428_571_428_571 / 12.0)).abs() < 1e-6, "{x3}");

    // at mid-span (the demo's crown at x = 83.2 m) in the README's window, for its
    // screenshot; then another case takes it off the deck
    s.set_window(1500, 900);
    s.wait_for("the smaller window", "return window.innerHeight < 900;", WAIT);
    // the redraw after the resize
    s.exec_async(
        "const done = arguments[0]; setTimeout(() => requestAnimationFrame(() => done(0)), 200);",
        vec![],
    );
    let scale = transform(&s, "elevation").0;
    let from = vehicle_centre(&s);
    s.drag(from, (from.0 + (83.8 - x3) * scale, from.1), 8);
    let x4 = next_vehicle_x(&s, Some(x3));
    assert!((x4 - 83.8).abs() < 1.0, "{x4}");
    std::fs::write(screenshots_dir().join("vehicle.png"), s.screenshot()).expect("screenshot");
    click(&s, "case-dead");
    s.wait_for(
        "the vehicle to leave",
        "return document.getElementById('elevation').dataset.vehicleX === undefined;",
        WAIT,
    );
    assert_eq!(
        s.exec("return document.getElementById('case-vehicle').getAttribute('aria-pressed');", vec![]),
        json!("false")
    );
    assert!(text_of(&s, "drag-status").contains("Shift"), "the idle hint again");
    assert!(severe(&s).is_empty(), "console errors {:?}", severe(&s));
}
