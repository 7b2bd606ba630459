//! End-to-end tests of the browser app in Debian's headless Chromium, driven over
//! WebDriver. They need the release build in `dist/` (scripts/test runs
//! `trunk build --release` first) and fail, never skip, when the browser is missing.
//!
//! Expected values come from the engine itself (`springline_statics::analyze`, the same
//! function `springline analyze` prints), mapped to pixels through the drawing transform
//! each canvas publishes in its data attributes.

use serde_json::json;
use springline_statics::arch::design::{Bracing, RibSystem};
use springline_statics::arch::generate::DEAD;
use springline_statics::error::{Field, Location};
use springline_statics::graphic::reciprocal::{force_diagram, SegmentOf};
use springline_statics::{analyze, Design, MemberRole, Problem};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

#[test]
fn loads_without_errors_and_draws_rib_and_load_line() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let errors = severe(&s);
    assert!(errors.is_empty(), "console errors on load: {errors:?}");

    let a = analyze(&Design::demo()).expect("demo analyses");
    // the rib: midpoints of rib members of the frame model, through the elevation transform
    let t = transform(&s, "elevation");
    let m = &a.frame.model;
    let mut rib_hits = 0;
    for mem in a.frame.map.rib_members.iter().map(|&k| &m.members[k]) {
        let (p, q) = (&m.nodes[mem.start], &m.nodes[mem.end]);
        let mid = to_px(t, (p.x + q.x) / 2.0, (p.y + q.y) / 2.0);
        if drawn_near(&s, "elevation", mid, 1.5) {
            rib_hits += 1;
        }
    }
    assert_eq!(rib_hits, a.frame.map.rib_members.len(), "every rib member drawn");

    // the load line: each external load segment of the reciprocal figure of the truss
    let truss = a.truss.as_ref().expect("demo is braced");
    let fd = force_diagram(&truss.model, &truss.solution.as_ref().expect("solved").cases[0]).expect("figure");
    let tf = transform(&s, "forces");
    let mut loads = 0;
    for seg in fd.segments.iter().filter(|g| matches!(g.of, SegmentOf::Load { .. })) {
        let (l, r) = (fd.spaces[seg.left].point, fd.spaces[seg.right].point);
        let mid = to_px(tf, (l.x + r.x) / 2.0, (l.y + r.y) / 2.0);
        assert!(
            drawn_near(&s, "forces", mid, 1.5),
            "load segment drawn at {mid:?}: pixel {:?}",
            pixel(&s, "forces", mid)
        );
        loads += 1;
    }
    assert!(loads >= 10, "the demo has a load at every deck panel point");
    std::fs::write(screenshots_dir().join("default-view.png"), s.screenshot()).expect("screenshot");
}

#[test]
fn panel_count_changes_the_thrust_to_the_engine_value() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let before = text_of(&s, "result-thrust");
    set_field(&s, "panels", "16");
    s.wait_for(
        "the thrust to change",
        &format!("return document.getElementById('result-thrust').textContent !== {}", json!(before)),
        WAIT,
    );
    let mut d = Design::demo();
    d.panels = 16;
    let expected = analyze(&d).expect("16 panels analyse").form.thrust;
    let shown = shown_number(&text_of(&s, "result-thrust"));
    // four significant figures on screen
    assert!(
        (shown - expected).abs() <= 0.5 * 10f64.powi(expected.abs().log10().floor() as i32 - 3),
        "{shown} vs {expected}"
    );
    let raw: f64 = s
        .exec("return +document.getElementById('result-thrust').dataset.value", vec![])
        .as_f64()
        .unwrap_or(f64::NAN);
    assert!((raw - expected).abs() <= 1e-9 * expected.abs(), "data-value {raw} vs {expected}");
}

#[test]
fn invalid_value_shows_its_message_and_leaves_the_drawing_unchanged() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let elevation = canvas_data_url(&s, "elevation");
    let forces = canvas_data_url(&s, "forces");
    let thrust = text_of(&s, "result-thrust");
    // a deck below the springings cannot carry an arch
    set_field(&s, "deck-level", "60");
    let msg = s.wait_for(
        "the message beside the field",
        "const e = document.getElementById('deck-level-error'); return e && e.textContent.length > 0 ? e.textContent : null;",
        WAIT,
    );
    assert!(msg.as_str().unwrap_or("").len() > 10, "a message a user can act on: {msg}");
    assert_eq!(canvas_data_url(&s, "elevation"), elevation, "elevation pixel-identical");
    assert_eq!(canvas_data_url(&s, "forces"), forces, "force diagram pixel-identical");
    assert_eq!(text_of(&s, "result-thrust"), thrust);
    // not a number at all
    set_field(&s, "panels", "twelve");
    s.wait_for(
        "the panels message",
        "return document.getElementById('panels-error').textContent.includes('not a number')",
        WAIT,
    );
    assert_eq!(canvas_data_url(&s, "elevation"), elevation);
    assert!(severe(&s).is_empty(), "no panic or console error");
}

#[test]
fn hovering_a_member_highlights_its_segment_in_the_force_diagram() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let a = analyze(&Design::demo()).expect("demo");
    let truss = a.truss.as_ref().expect("braced");
    let fd = force_diagram(&truss.model, &truss.solution.as_ref().expect("solved").cases[0]).expect("figure");
    // a rib member with a long segment in the figure, away from other segments' ends
    let (k, seg) = fd
        .segments
        .iter()
        .filter_map(|g| match g.of {
            SegmentOf::Member { member } if truss.map.roles[member] == MemberRole::Rib => Some((member, g)),
            _ => None,
        })
        .max_by(|x, y| x.1.force.abs().total_cmp(&y.1.force.abs()))
        .expect("rib segments");
    let tf = transform(&s, "forces");
    let (l, r) = (fd.spaces[seg.left].point, fd.spaces[seg.right].point);
    let probe = to_px(tf, l.x + 0.3 * (r.x - l.x), l.y + 0.3 * (r.y - l.y));
    let before = pixel(&s, "forces", probe);
    let te = transform(&s, "elevation");
    let mem = &truss.model.members[k];
    let (p, q) = (&truss.model.nodes[mem.start], &truss.model.nodes[mem.end]);
    let r_el = s.exec(
        "const r = document.getElementById('elevation').getBoundingClientRect(); return [r.left, r.top];",
        vec![],
    );
    let mid = to_px(te, (p.x + q.x) / 2.0, (p.y + q.y) / 2.0);
    let at = (mid.0 + r_el[0].as_f64().unwrap_or(0.0), mid.1 + r_el[1].as_f64().unwrap_or(0.0));
    s.hover(at);
    s.wait_for(
        "the highlight",
        &format!(
            "const c = document.getElementById('forces'); const k = window.devicePixelRatio;
             const d = c.getContext('2d').getImageData(Math.round({} * k), Math.round({} * k), 1, 1).data;
             return d[0] !== {} || d[1] !== {} || d[2] !== {};",
            probe.0, probe.1, before[0], before[1], before[2]
        ),
        WAIT,
    );
    let after = pixel(&s, "forces", probe);
    assert_ne!(before, after, "segment pixels change on hover");
}

#[test]
fn canvases_are_sharp_at_device_pixel_ratio_two_and_follow_resizes() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1400, 900, 2.0);
    open(&s, &server);
    let sizes = |s: &Session| {
        s.exec(
            "const c = document.getElementById('elevation'); return [c.width, c.height, c.clientWidth, c.clientHeight, window.devicePixelRatio];",
            vec![],
        )
    };
    let v = sizes(&s);
    assert_eq!(v[4].as_f64(), Some(2.0));
    assert_eq!(v[0].as_f64(), v[2].as_f64().map(|w| 2.0 * w), "backing store twice the CSS width: {v}");
    assert_eq!(v[1].as_f64(), v[3].as_f64().map(|h| 2.0 * h), "backing store twice the CSS height: {v}");
    let old_width = v[0].as_f64().unwrap_or(0.0);
    s.set_window(1000, 900);
    s.wait_for(
        "the redraw at the new size",
        &format!("const c = document.getElementById('elevation'); return c.width !== {old_width} && c.width === 2 * c.clientWidth;"),
        WAIT,
    );
    let after = sizes(&s);
    // at 1000 px the layout stacks, so the canvas changes width (wider here)
    assert_ne!(after[0].as_f64().unwrap_or(0.0), old_width, "canvas follows the window: {after}");
    // redrawn with a new transform: the rib is where the new one puts it (midpoints of
    // rib members; the crown itself carries a white drag handle)
    let a = analyze(&Design::demo()).expect("demo");
    let t = transform(&s, "elevation");
    let m = &a.frame.model;
    for mem in a.frame.map.rib_members.iter().map(|&k| &m.members[k]) {
        let (p, q) = (&m.nodes[mem.start], &m.nodes[mem.end]);
        let mid = to_px(t, (p.x + q.x) / 2.0, (p.y + q.y) / 2.0);
        assert!(drawn_near(&s, "elevation", mid, 1.5), "rib redrawn after resize at {mid:?}");
    }
}

#[test]
fn the_page_requests_nothing_from_other_origins() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1400, 900, 1.0);
    open(&s, &server);
    let entries = s.exec(
        "return performance.getEntriesByType('resource').map(e => e.name).concat([location.href]);",
        vec![],
    );
    let origin = server.url();
    for e in entries.as_array().cloned().unwrap_or_default() {
        let url = e.as_str().unwrap_or("");
        assert!(url.starts_with(&origin) || url.starts_with("data:"), "request to another origin: {url}");
    }
    assert!(!server.requests().is_empty());
}

/// The SI value a results cell carries (`data-value`), NaN when there is none.
fn data_value(s: &Session, id: &str) -> f64 {
    s.exec(
        "const e = document.getElementById(arguments[0]); return e ? +e.dataset.value : null;",
        vec![json!(id)],
    )
    .as_f64()
    .unwrap_or(f64::NAN)
}

/// Checks results cell `id` against the engine's value: its `data-value` to 1e-9 of it
/// (the wasm build runs the same engine; only the last digits of library functions may
/// differ), and the number on screen to the four significant figures it is shown with.
fn assert_result(s: &Session, id: &str, expected: f64) {
    let raw = data_value(s, id);
    assert!((raw - expected).abs() <= 1e-9 * expected.abs(), "{id}: data-value {raw} vs engine {expected}");
    let shown = shown_number(&text_of(s, id));
    let half_unit = 0.5 * 10f64.powi(expected.abs().log10().floor() as i32 - 3);
    assert!((shown - expected).abs() <= half_unit, "{id}: shown {shown} vs engine {expected}");
}

/// The results table follows the load case the drawings show: choosing the half-span
/// case shows the springing thrusts `analyze()` gives for that case (they differ from
/// the dead case's), and going back shows the dead case's again.
#[test]
fn results_follow_the_load_case_the_drawings_show() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let a = analyze(&Design::demo()).expect("demo analyses");
    let dead = a.summary.springings_of(DEAD).expect("dead").clone();
    let half = a.summary.springings[1].clone();
    assert!((half.left.thrust - dead.left.thrust).abs() > 1.0, "the cases differ");
    assert_result(&s, "result-left-h", dead.left.thrust);
    s.exec("document.querySelector('button.scenario[data-case-index=\"1\"]').click();", vec![]);
    s.wait_for(
        "the table to follow the case",
        &format!(
            "return Math.abs(+document.getElementById('result-left-h').dataset.value - {}) <= 1e-6 * {};",
            half.left.thrust,
            half.left.thrust.abs()
        ),
        WAIT,
    );
    for (id, value) in [
        ("result-left-h", half.left.thrust),
        ("result-right-h", half.right.thrust),
        ("result-left-v", half.left.vertical),
        ("result-right-v", half.right.vertical),
    ] {
        assert_result(&s, id, value);
    }
    s.exec("document.querySelector('button.scenario[data-case-index=\"0\"]').click();", vec![]);
    s.wait_for(
        "the table to return to the dead case",
        &format!(
            "return Math.abs(+document.getElementById('result-left-h').dataset.value - {}) <= 1e-6 * {};",
            dead.left.thrust,
            dead.left.thrust.abs()
        ),
        WAIT,
    );
    assert_result(&s, "result-right-h", dead.right.thrust);
}

/// A design an engineer would question is allowed but says so beside the field: 4 panels
/// over the demo's 106 m span (26.6 m each, over a fifth of the span, common practice)
/// show the engine's warning beside the panel count, and 12 panels clear it.
#[test]
fn a_questionable_value_gets_its_warning_beside_the_field() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    assert_eq!(text_of(&s, "panels-caution"), "", "the demo has no warnings");
    set_field(&s, "panels", "4");
    s.wait_for(
        "the warning beside the panel count",
        "const e = document.getElementById('panels-caution'); return !!e && e.textContent.length > 0;",
        WAIT,
    );
    let mut d = Design::demo();
    d.panels = 4;
    let warning = springline_statics::validate_design(&d).expect("allowed");
    let expected: Vec<&str> =
        warning.iter().filter(|w| w.involves(Field::Panels)).map(|w| w.message.as_str()).collect();
    assert_eq!(expected.len(), 1, "{warning:?}");
    assert_eq!(text_of(&s, "panels-caution"), expected[0]);
    assert_eq!(text_of(&s, "panels-error"), "", "a warning, not a refusal");
    set_field(&s, "panels", "12");
    s.wait_for(
        "the warning to clear",
        "return document.getElementById('panels-caution').textContent === '';",
        WAIT,
    );
}

/// The second design of the README (two-hinged rib, crossed bracing, springings at 76 m
/// and 86 m, 10 panels), entered field by field: once the page has followed every edit,
/// the thrusts in the results table (form thrust, each springing's thrust, the range over
/// the cases) and the truss's determinacy are those `analyze()` gives for the same design.
#[test]
fn second_design_unequal_springings_braced_renders_and_is_captured() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    for (id, v) in [("springing-right", "86"), ("panels", "10")] {
        let before = text_of(&s, "result-thrust");
        set_field(&s, id, v);
        s.wait_for(
            "the change",
            &format!("return document.getElementById('result-thrust').textContent !== {}", json!(before)),
            WAIT,
        );
    }
    s.exec(
        "const e = document.getElementById('bracing'); e.value = 'crossed'; e.dispatchEvent(new Event('change', { bubbles: true }));",
        vec![],
    );
    s.exec(
        "const e = document.getElementById('rib-system'); e.value = 'two'; e.dispatchEvent(new Event('change', { bubbles: true }));",
        vec![],
    );
    let mut d = Design::demo();
    d.springing_right_level = 86.0;
    d.panels = 10;
    d.bracing = Bracing::Crossed;
    d.rib_system = RibSystem::TwoHinged;
    let a = analyze(&d).expect("the second design analyses");
    let determinacy = a.truss.as_ref().expect("braced").determinacy.describe();
    assert!(determinacy.contains("indeterminate"), "crossed pairs: {determinacy}");
    // wait for the last edit (the rib system changes the springing thrusts, not the form)
    let left = a.summary.springings_of(DEAD).expect("dead-load springings").left.thrust;
    s.wait_for(
        "the second design's results",
        &format!(
            "return document.getElementById('result-determinacy').textContent === {} &&
                    Math.abs(+document.getElementById('result-left-h').dataset.value - {left}) <= 1e-9 * {};",
            json!(determinacy),
            left.abs()
        ),
        WAIT,
    );
    let dead = a.summary.springings_of(DEAD).expect("dead-load springings");
    for (id, expected) in [
        ("result-thrust", a.summary.form_thrust),
        ("result-left-h", dead.left.thrust),
        ("result-right-h", dead.right.thrust),
        ("result-thrust-min", a.summary.thrust_range[0]),
        ("result-thrust-max", a.summary.thrust_range[1]),
    ] {
        assert_result(&s, id, expected);
    }
    assert!(severe(&s).is_empty());
    std::fs::write(screenshots_dir().join("second-design.png"), s.screenshot()).expect("screenshot");
}

/// The problem messages shown in the error element of field `id`, one per paragraph.
fn problems_beside(s: &Session, id: &str) -> Vec<String> {
    let v = s.exec(
        "const e = document.getElementById(arguments[0] + '-error');
         return e ? [...e.querySelectorAll('p')].map(p => p.textContent) : null;",
        vec![json!(id)],
    );
    assert!(v.is_array(), "an error element beside field {id}");
    v.as_array().cloned().unwrap_or_default().iter().map(|m| m.as_str().unwrap_or("").to_string()).collect()
}

/// How a problem reads beside a field: a design field's message alone, any other place
/// named first.
fn as_shown(p: &Problem) -> String {
    match p.location {
        Location::Field(_) => p.message.clone(),
        _ => format!("{}: {}", p.location, p.message),
    }
}

/// Waits until no field shows a problem.
fn wait_all_clear(s: &Session, after: &str) {
    s.wait_for(
        &format!("every field's problems to clear after {after}"),
        "return document.querySelectorAll('.error p').length === 0",
        WAIT,
    );
}

/// The deck at 60 m under the demo's springings at 76 m and 80 m (README, the demo
/// scenario): each problem beside every field it involves, all of them beside the deck
/// level; cleared by the next good edit and by undo. Then a springing raised above the
/// deck, whose problem the engine did not tie to the deck level before.
#[test]
fn a_refused_edit_shows_each_problem_beside_every_field_it_involves() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    // tall enough that the screenshot holds the Roadway and Arch panels together
    let s = driver.session(1400, 1100, 1.0);
    open(&s, &server);
    let mut d = Design::demo();
    d.deck.level = 60.0;
    let problems = analyze(&d).expect_err("a deck below the springings is refused").problems().to_vec();
    set_field(&s, "deck-level", "60");
    s.wait_for(
        "the deck level's problems",
        &format!("return document.querySelectorAll('#deck-level-error p').length === {}", problems.len()),
        WAIT,
    );
    assert_eq!(problems_beside(&s, "deck-level"), problems.iter().map(as_shown).collect::<Vec<_>>());
    for (id, field, side, level) in [
        ("springing-left", Field::SpringingLeftLevel, "left", 76),
        ("springing-right", Field::SpringingRightLevel, "right", 80),
    ] {
        let beside = problems_beside(&s, id);
        let expected: Vec<String> = problems.iter().filter(|p| p.involves(field)).map(as_shown).collect();
        assert_eq!(beside, expected, "{id}");
        assert!(
            beside
                .iter()
                .any(|m| m.contains(&format!("{side} springing ({level} m) is at or above the deck (60 m)"))),
            "{id}: {beside:?}"
        );
    }
    // the demo gives its crown by level: that field shows the crown's problem
    let crown = problems_beside(&s, "crown-level");
    assert!(crown.iter().any(|m| m.contains("crown (97.500 m) is above the deck (60 m)")), "{crown:?}");
    for id in ["panels", "deck-width", "section-rib-e", "min-post"] {
        assert!(problems_beside(&s, id).is_empty(), "{id} is not involved");
    }
    let invalid = s.exec(
        "return ['deck-level', 'springing-left', 'springing-right'].every(id => document.getElementById(id).closest('.field').classList.contains('invalid'))",
        vec![],
    );
    assert_eq!(invalid, json!(true), "the involved fields are marked");
    // the Ground panel folded, so the Roadway and Arch panels show together
    s.exec("document.querySelector('.controls .panel > summary').click();", vec![]);
    std::fs::write(screenshots_dir().join("refused-deck-level.png"), s.screenshot()).expect("screenshot");

    // the next good edit clears them
    set_field(&s, "panels", "14");
    wait_all_clear(&s, "a good edit");
    // so does undo
    set_field(&s, "deck-level", "60");
    s.wait_for(
        "the problems again",
        "return document.querySelectorAll('#deck-level-error p').length > 0",
        WAIT,
    );
    s.exec("document.getElementById('undo').click();", vec![]);
    wait_all_clear(&s, "undo");
    // and the refused text leaves the box: it shows the design's deck level again
    s.wait_for(
        "the deck level box to show the design's 100 m",
        "return document.getElementById('deck-level').value === '100'",
        WAIT,
    );

    // a springing above the deck (at 100 m) is shown beside the deck level too
    set_field(&s, "springing-left", "100.5");
    s.wait_for(
        "the springing's problem",
        "return document.querySelectorAll('#deck-level-error p').length > 0",
        WAIT,
    );
    let deck = problems_beside(&s, "deck-level");
    assert!(
        deck.iter().any(|m| m.contains("left springing (100.5 m) is at or above the deck (100 m)")),
        "{deck:?}"
    );
    assert!(problems_beside(&s, "springing-right").is_empty());

    // a ground point's x and y are one design field: its problems show once, under its row
    s.exec("document.querySelector('.controls .panel > summary').click();", vec![]);
    set_field(&s, "ground-3-x", "50"); // the next point is at x = 45 m
    s.wait_for(
        "the ground point's problem",
        "return document.querySelectorAll('#ground-3-error p').length > 0",
        WAIT,
    );
    let point = problems_beside(&s, "ground-3");
    assert!(
        point.iter().any(|m| m.contains("ground point 5 (x = 45 m) is not to the right of point 4")),
        "{point:?}"
    );
    for id in ["ground-3-x", "ground-3-y", "ground", "deck-level"] {
        assert!(problems_beside(&s, id).is_empty(), "{id} repeats nothing");
    }
    assert!(severe(&s).is_empty(), "no panic or console error");
}
