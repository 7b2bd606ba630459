//! The influence-line chart and the envelope view in headless Chromium over WebDriver
//! (needs `dist/` built from this tree, and the `springline` binary that `cargo test
//! --workspace` builds): a member clicked on the elevation gets its influence line, whose
//! published peak is the one `springline influence` prints for it; a springing force
//! chosen with its button likewise; choosing Envelope shows the engine's envelope values
//! and the picked member's governing placement as the case shown.
//!
//! Expected values come from the CLI (a separate process) and the engine
//! (`arch::traffic::traffic_envelopes`), never from the page.

use springline_statics::arch::traffic::traffic_envelopes;
use springline_statics::arch::validate::ValidDesign;
use springline_statics::{analyze, Design, ModelKind};
use springline_tests::cli;
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

/// The CLI's influence line `what` of the demo, the unit load every 1 m (the app's step,
/// `arch::traffic::TRAFFIC_STEP`) and at every node: its peak value (the row of largest
/// magnitude, the first of equals) and every x where the line reaches it to rounding (a
/// symmetric line, the thrust's, peaks twice; which of the two rounds highest may differ
/// between the page's WebAssembly and the native build, whose libm differ in the last
/// bit).
fn cli_peak(what: &str) -> (Vec<f64>, f64) {
    let demo = cli::run(&["demo"], "");
    let csv = cli::run(&["influence", "-", "--of", what, "--step", "1"], &demo);
    let rows = cli::influence_rows(&csv);
    assert!(rows.len() > 50, "{what}: {} rows from the CLI", rows.len());
    let peak = rows
        .iter()
        .fold(None, |best: Option<f64>, &(_, v)| match best {
            Some(b) if b.abs() >= v.abs() => best,
            _ => Some(v),
        })
        .expect("rows");
    let at = rows.iter().filter(|(_, v)| (v - peak).abs() <= 1e-12 * peak.abs()).map(|(x, _)| *x).collect();
    (at, peak)
}

/// Waits until the chart shows line `line` and returns its published peak (x, value).
fn chart_peak(s: &Session, line: &str) -> (f64, f64) {
    s.wait_for(
        &format!("the chart to draw '{line}'"),
        &format!(
            "const c = document.getElementById('influence-chart');
             return c && c.dataset.line === {} && c.dataset.peakValue !== undefined",
            serde_json::json!(line)
        ),
        WAIT,
    );
    let x = data_number(s, "influence-chart", "peakX").expect("peak x");
    let v = data_number(s, "influence-chart", "peakValue").expect("peak value");
    (x, v)
}

/// The peak agrees with the CLI's within its printing (6 decimals), at one of the places
/// the CLI's line peaks (x to 1 mm).
fn assert_same_peak(what: &str, shown: (f64, f64), cli: (Vec<f64>, f64)) {
    assert!((shown.1 - cli.1).abs() <= 1e-6, "{what}: chart peak {} vs CLI {}", shown.1, cli.1);
    assert!(
        cli.0.iter().any(|x| (shown.0 - x).abs() <= 1e-3),
        "{what}: chart peak at x = {} vs CLI {:?}",
        shown.0,
        cli.0
    );
}

#[test]
fn a_picked_member_and_a_springing_chart_the_clis_influence_lines() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    open(&s, &server);
    // a rib member of the frame model, clicked at its middle
    let a = analyze(&Design::demo()).expect("demo analyses");
    let m = &a.frame.model;
    let k = a.frame.map.rib_members[3];
    let member = &m.members[k];
    let (p, q) = (&m.nodes[member.start], &m.nodes[member.end]);
    let t = transform(&s, "elevation");
    let (ox, oy) = canvas_origin(&s, "elevation");
    let mid = to_px(t, 0.5 * (p.x + q.x), 0.5 * (p.y + q.y));
    click(&s, (ox + mid.0, oy + mid.1));
    let shown = chart_peak(&s, &member.name);
    assert_same_peak(&member.name, shown, cli_peak(&member.name));
    assert!(text_of(&s, "influence-line").contains(&member.name), "{}", text_of(&s, "influence-line"));
    s.exec("document.getElementById('influence-panel').scrollIntoView({block: 'center'});", vec![]);
    std::fs::write(screenshots_dir().join("influence.png"), s.screenshot()).expect("screenshot");
    // the left springing's thrust, by its button
    click_id(&s, "influence-thrust");
    let shown = chart_peak(&s, "thrust");
    assert_same_peak("thrust", shown, cli_peak("thrust"));
    assert!(shown.1 > 0.0, "a load anywhere pushes the springing outward: {}", shown.1);
    let errors = severe(&s);
    assert!(errors.is_empty(), "console errors: {errors:?}");
}

/// The page's value (computed in wasm) equals the engine's natively, to round-off.
fn close(what: &str, shown: f64, expected: f64) {
    assert!(
        (shown - expected).abs() <= 1e-9 * expected.abs().max(1.0),
        "{what}: shown {shown} vs {expected}"
    );
}

#[test]
fn the_envelope_shows_the_engines_values_and_the_picked_members_placement() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    open(&s, &server);
    let d = Design::demo();
    let valid = ValidDesign::new(&d).expect("valid");
    let report = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("a frame report");
    click_id(&s, "case-envelope");
    s.wait_for(
        "the envelope's largest compression",
        "return document.getElementById('envelope-compression') !== null",
        WAIT,
    );
    // the largest compression shown: the member named, its ULS design minimum (the first
    // combination, the view's default) the report's
    let member = s
        .exec("return document.getElementById('envelope-compression').parentElement.dataset.member;", vec![])
        .as_str()
        .unwrap_or("")
        .to_string();
    let line = report.line(&member).unwrap_or_else(|| panic!("a report line for '{member}'"));
    let shown = data_number(&s, "envelope-compression", "value").expect("a value");
    close(&member, shown, line.design[0].min);
    let lowest = report.lines.iter().filter(|l| l.label.contains("axial")).map(|l| l.design[0].min);
    assert!(lowest.fold(f64::INFINITY, f64::min) >= shown - 1e-9 * shown.abs(), "the lowest of any member");
    // pick a rib member: its range, and its placement for the smallest effect as the case
    let a = analyze(&d).expect("demo analyses");
    let m = &a.frame.model;
    let k = a.frame.map.rib_members[2];
    let (p, q) = (&m.nodes[m.members[k].start], &m.nodes[m.members[k].end]);
    let t = transform(&s, "elevation");
    let (ox, oy) = canvas_origin(&s, "elevation");
    let mid = to_px(t, 0.5 * (p.x + q.x), 0.5 * (p.y + q.y));
    click(&s, (ox + mid.0, oy + mid.1));
    s.wait_for(
        "the picked member's range",
        "return document.getElementById('envelope-picked-min') !== null",
        WAIT,
    );
    let line = report.line(&m.members[k].name).expect("rib line");
    let shown = |id: &str| data_number(&s, id, "value").unwrap_or_else(|| panic!("no value in #{id}"));
    close(&line.line, shown("envelope-picked-min"), line.design[0].min);
    close(&line.line, shown("envelope-picked-max"), line.design[0].max);
    s.wait_for(
        "the placement case described",
        "const e = document.getElementById('case-description');
         return e && e.textContent.includes('smallest effect')",
        WAIT,
    );
    std::fs::write(screenshots_dir().join("envelope.png"), s.screenshot()).expect("screenshot");
    let errors = severe(&s);
    assert!(errors.is_empty(), "console errors: {errors:?}");
}
