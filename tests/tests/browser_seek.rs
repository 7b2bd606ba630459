//! "Find the rise" in headless Chromium over WebDriver (needs `dist/` built from this
//! tree): a thrust goal replaces the design with the engine's (the results show its
//! thrust, the link follows), one undo brings the demo back; a goal no rise meets says
//! so and changes nothing.
//!
//! Expected values come from the engine (`seek`, `analyze`), never from the page itself.

use springline_statics::arch::seek::{seek, Goal};
use springline_statics::link::permalink;
use springline_statics::{analyze, Design};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::Driver;

#[test]
fn a_thrust_goal_is_found_applied_linked_and_undone() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    let demo_thrust = analyze(&demo).expect("analyses").form.thrust;
    wait_value(&s, "result-thrust", demo_thrust);
    let found = seek(&demo, Goal::MaxThrust { thrust: 7500.0 }).expect("seeks");
    assert!(found.met);
    let thrust = analyze(&found.design).expect("analyses").form.thrust;
    s.exec("document.getElementById('seek-panel').open = true;", vec![]);
    set_field(&s, "seek-goal", "max-thrust");
    set_field(&s, "seek-target", "7500");
    click_id(&s, "seek-run");
    wait_value(&s, "result-thrust", thrust);
    s.wait_for(
        "the result line",
        "const e = document.getElementById('seek-result'); return !!e && e.textContent.startsWith('met: rise');",
        WAIT,
    );
    s.wait_for(
        "the link to follow",
        &format!(
            "return location.hash.startsWith({});",
            serde_json::json!(format!("#{}", permalink::encode(&found.design)))
        ),
        WAIT,
    );
    std::fs::write(screenshots_dir().join("seek.png"), s.screenshot()).expect("screenshot");
    click_id(&s, "undo");
    wait_value(&s, "result-thrust", demo_thrust);
    // no rise brings the thrust to 10 kN: the message, and the design stays
    set_field(&s, "seek-target", "10");
    click_id(&s, "seek-run");
    s.wait_for(
        "the refusal",
        "const e = document.getElementById('seek-result'); return !!e && e.textContent.includes('no rise') && e.textContent.includes('Nothing changed');",
        WAIT,
    );
    wait_value(&s, "result-thrust", demo_thrust);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}
