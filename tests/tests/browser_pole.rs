//! Dragging the pole of the rib's pole construction in headless Chromium over WebDriver
//! (needs `dist/` built from this tree): the thrust follows the pole's distance from the
//! load line and the rise follows the thrust (the engine's `shape_for_thrust` of the
//! thrust shown gives the rise shown), the link follows, and one undo brings the demo
//! back.
//!
//! Expected values come from the engine, never from the page itself.

use springline_statics::arch::seek::shape_for_thrust;
use springline_statics::link::permalink;
use springline_statics::{analyze, Design};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::Driver;

fn data_value(s: &springline_tests::webdriver::Session, id: &str) -> f64 {
    data_number(s, id, "value").unwrap_or_else(|| panic!("#{id} has no value"))
}

#[test]
fn dragging_the_pole_sets_the_thrust_and_the_rise_follows() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    let demo_a = analyze(&demo).expect("analyses");
    wait_value(&s, "result-thrust", demo_a.form.thrust);
    let from = pole_position(&s);
    let hash_before = s.exec("return location.hash;", vec![]).as_str().unwrap_or("").to_string();
    // the pole moved away from the load line (to the left): a larger thrust, a lower rise
    s.drag(from, (from.0 - 30.0, from.1), 8);
    s.wait_for(
        "a larger thrust",
        &format!(
            "return +document.getElementById('result-thrust').dataset.value > {} + 1;",
            demo_a.form.thrust
        ),
        WAIT,
    );
    let thrust = data_value(&s, "result-thrust");
    let rise = data_value(&s, "result-rise");
    assert!(rise < demo.rise(), "{rise}");
    let shaped = shape_for_thrust(&demo, thrust).expect("shapes");
    assert!((shaped.rise - rise).abs() < 1e-6, "{} vs {rise}", shaped.rise);
    // the link follows once the edits pause: it opens to the rise shown
    let deadline = std::time::Instant::now() + WAIT;
    loop {
        let hash = s.exec("return location.hash;", vec![]).as_str().unwrap_or("").to_string();
        let linked = (hash != hash_before).then(|| permalink::decode(&hash).ok()).flatten();
        if linked.is_some_and(|d| (d.rise() - rise).abs() < 1e-6) {
            break;
        }
        assert!(std::time::Instant::now() < deadline, "the link did not follow the drag: {hash}");
        std::thread::sleep(std::time::Duration::from_millis(100));
    }
    std::fs::write(screenshots_dir().join("pole-drag.png"), s.screenshot()).expect("screenshot");
    // one drag, one undo step
    click_id(&s, "undo");
    wait_value(&s, "result-thrust", demo_a.form.thrust);
    wait_value(&s, "result-rise", demo_a.form.rise);
    // towards the load line, past the thrust of the largest rise the layout takes: the
    // pole stops there and the status line says why
    let largest = springline_statics::arch::edit::largest_rise(&demo).expect("a largest rise");
    let limit_thrust = analyze(&with_rise(&demo, largest.rise)).expect("analyses").form.thrust;
    let per_px = 1.0 / pole_scale(&s);
    let dx = (demo_a.form.thrust - 0.5 * limit_thrust) / per_px;
    s.drag(from, (from.0 + dx.min(400.0), from.1), 8);
    s.wait_for(
        "the stop in the status line",
        "const e = document.getElementById('drag-status'); return !!e && e.textContent.includes('Pole held') && e.textContent.includes('largest rise');",
        WAIT,
    );
    let rise = data_value(&s, "result-rise");
    assert!((rise - largest.rise).abs() < 1e-6, "{rise} vs {}", largest.rise);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

/// The pole's position in viewport CSS pixels, once the force canvas publishes it.
fn pole_position(s: &springline_tests::webdriver::Session) -> (f64, f64) {
    s.wait_for(
        "the pole on the force canvas",
        "return !!document.getElementById('forces').dataset.pole;",
        WAIT,
    );
    let pole: Vec<f64> = serde_json::from_str(
        s.exec("return document.getElementById('forces').dataset.pole;", vec![]).as_str().unwrap_or("[]"),
    )
    .expect("a pole position");
    let origin = canvas_origin(s, "forces");
    (origin.0 + pole[0], origin.1 + pole[1])
}

fn with_rise(d: &Design, rise: f64) -> Design {
    let mut o = d.clone();
    o.set_rise(rise);
    o
}

/// The pole area's scale, px per kN: the pole's distance from the load line (both
/// published on the canvas) over the thrust it stands for.
fn pole_scale(s: &springline_tests::webdriver::Session) -> f64 {
    let v = s.exec(
        "const c = document.getElementById('forces'); return [JSON.parse(c.dataset.pole)[0], +c.dataset.poleThrust, +(c.dataset.loadLineX || 'NaN')];",
        vec![],
    );
    let (pole_x, thrust, line_x) =
        (v[0].as_f64().unwrap_or(0.0), v[1].as_f64().unwrap_or(1.0), v[2].as_f64().unwrap_or(f64::NAN));
    (line_x - pole_x) / thrust
}

/// A two-hinged rib: the handle is the form's pole (drawn beside the solver's); an
/// unbraced rib: the pole construction beside the thrust line. Dragging the pole towards
/// the load line lowers the form thrust and raises the rise, as the engine shapes it.
#[test]
fn a_two_hinged_and_an_unbraced_ribs_pole_is_dragged() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let mut two = Design::demo();
    two.rib_system = springline_statics::arch::design::RibSystem::TwoHinged;
    let mut unbraced = Design::demo();
    unbraced.bracing = springline_statics::arch::design::Bracing::None;
    for design in [two, unbraced] {
        let s = driver.session(1500, 1000, 1.0);
        let a = analyze(&design).expect("analyses");
        open_url(&s, &format!("{}#{}", server.url(), permalink::encode(&design)));
        wait_value(&s, "result-thrust", a.form.thrust);
        let from = pole_position(&s);
        s.drag(from, (from.0 + 12.0, from.1), 6);
        s.wait_for(
            "a smaller thrust",
            &format!(
                "return +document.getElementById('result-thrust').dataset.value < {} - 1;",
                a.form.thrust
            ),
            WAIT,
        );
        let thrust = data_value(&s, "result-thrust");
        let rise = data_value(&s, "result-rise");
        assert!(rise > design.rise(), "{rise}");
        let shaped = shape_for_thrust(&design, thrust).expect("shapes");
        assert!((shaped.rise - rise).abs() < 1e-6, "{} vs {rise}", shaped.rise);
        let errors = severe(&s);
        assert!(errors.is_empty(), "{errors:?}");
    }
}
