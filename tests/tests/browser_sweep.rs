//! The sweep panel in headless Chromium over WebDriver (needs `dist/` built from this
//! tree): a sized rise sweep runs in the background worker while the page keeps answering
//! (animation frames and timers within 100 ms) and the progress bar advances; a click on
//! a chart opens that option (the address and the results change to its values, one undo
//! step); Cancel stops the worker.
//!
//! Expected values come from the engine (`sweep::apply`, `analyze`), never from the page.

use serde_json::json;
use springline_statics::arch::sweep::{apply, Parameter};
use springline_statics::link::permalink;
use springline_statics::{analyze, Design};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};
use std::sync::Mutex;
use std::time::{Duration, Instant};

/// One sweep at a time: each runs a worker at full speed, and two at once on a 2-core
/// machine would measure the machine, not the page.
static ONE_SWEEP_AT_A_TIME: Mutex<()> = Mutex::new(());

/// Sets the first axis of the sweep: rise over span from `from` to `to` in `count` steps.
fn set_rise_sweep(s: &Session, from: &str, to: &str, count: &str) {
    set_field(s, "sweep-parameter", "rise-ratio");
    set_field(s, "sweep-a-from", from);
    set_field(s, "sweep-a-to", to);
    set_field(s, "sweep-a-count", count);
}

/// (options done, options in all) from the progress bar; (0, 0) before it shows.
fn progress(s: &Session) -> (u64, u64) {
    let v = s.exec(
        "const p = document.getElementById('sweep-progress'); return p ? [+p.value, +p.max] : [0, 0];",
        vec![],
    );
    (v[0].as_f64().unwrap_or(0.0) as u64, v[1].as_f64().unwrap_or(0.0) as u64)
}

/// How long the page takes to run an animation frame and a timer, ms (the larger).
fn answer_time(s: &Session) -> f64 {
    let v = s.exec_async(
        "const done = arguments[arguments.length - 1]; const t0 = performance.now(); let frame = null;
         requestAnimationFrame(() => { frame = performance.now() - t0;
           setTimeout(() => done([frame, performance.now() - t0 - frame]), 0); });",
        vec![],
    );
    v[0].as_f64().unwrap_or(f64::INFINITY).max(v[1].as_f64().unwrap_or(f64::INFINITY))
}

#[test]
fn a_sized_sweep_keeps_the_page_answering_and_a_click_opens_the_option() {
    let _one = ONE_SWEEP_AT_A_TIME.lock().unwrap_or_else(|e| e.into_inner());
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1100, 1.0);
    open(&s, &server);
    set_rise_sweep(&s, "0.14", "0.2", "7");
    click_id(&s, "sweep-run");
    // while the worker sizes the options, the page answers and the bar moves on
    let deadline = Instant::now() + Duration::from_secs(120);
    let mut seen = Vec::new();
    let mut answers: Vec<f64> = Vec::new();
    loop {
        let (done, total) = progress(&s);
        if total > 0 && done == total {
            break;
        }
        assert!(Instant::now() < deadline, "the sweep did not finish: {done} of {total}");
        answers.push(answer_time(&s));
        if seen.last() != Some(&done) {
            seen.push(done);
        }
        std::thread::sleep(Duration::from_millis(40));
    }
    // Answering within 100 ms is the common limit for a response to feel immediate (the
    // 0.1 s limit of Nielsen, Usability Engineering, 1993, ch. 5, from memory; the 250 ms
    // bound for a single sample is our own, common practice for a shared machine). One
    // sample may miss it without the page being busy: on a 2-core machine the worker and
    // the browser's compile threads can hold both cores while the page's thread waits
    // (one CI run saw 103 ms once; quiet runs 13-17 ms at most). Work of the page's own
    // on each row would be slow in every sample taken during it.
    answers.sort_by(f64::total_cmp);
    let slow = answers.iter().filter(|&&t| t >= 100.0).count();
    let slowest = answers.last().copied().unwrap_or(0.0);
    assert!(slow <= 1 && slowest < 250.0, "the page took {answers:?} ms to answer while the sweep ran");
    assert!(seen.len() >= 3, "the progress bar should advance step by step: {seen:?}");
    assert_eq!(progress(&s), (7, 7));
    assert!(text_of(&s, "sweep-held").contains("springings, span, deck and valley fixed"));
    std::fs::write(screenshots_dir().join("sweep.png"), s.screenshot()).expect("screenshot");

    // a click on the steel chart at rise/span 0.16 opens that option
    let id = "sweep-chart-steel";
    s.wait_for("the chart", &format!("return document.getElementById('{id}').dataset.count === '7';"), WAIT);
    let n = |key: &str| data_number(&s, id, key).expect(key);
    let (left, right, top, bottom) = (n("plotLeft"), n("plotRight"), n("plotTop"), n("plotBottom"));
    let (x0, x1) = (n("xMin"), n("xMax"));
    let value = 0.16;
    let origin = canvas_origin(&s, id);
    let at = (origin.0 + left + (value - x0) / (x1 - x0) * (right - left), origin.1 + (top + bottom) / 2.0);
    s.exec("document.getElementById(arguments[0]).scrollIntoView({block: 'center'});", vec![json!(id)]);
    let origin_after = canvas_origin(&s, id);
    click(&s, (at.0 - origin.0 + origin_after.0, at.1 - origin.1 + origin_after.1));
    let chosen = apply(&Design::demo(), Parameter::RiseRatio, value);
    wait_value(&s, "result-thrust", analyze(&chosen).expect("analyses").form.thrust);
    s.wait_for(
        "the address to follow",
        &format!("return location.hash.startsWith({});", json!(format!("#{}", permalink::encode(&chosen)))),
        WAIT,
    );
    // one undo step back to the demo
    click_id(&s, "undo");
    wait_value(&s, "result-thrust", analyze(&Design::demo()).expect("analyses").form.thrust);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

#[test]
fn cancel_stops_the_sweep_and_keeps_what_it_found() {
    let _one = ONE_SWEEP_AT_A_TIME.lock().unwrap_or_else(|e| e.into_inner());
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1400, 1000, 1.0);
    open(&s, &server);
    set_rise_sweep(&s, "0.12", "0.3", "40");
    click_id(&s, "sweep-run");
    s.wait_for(
        "a first option",
        "const p = document.getElementById('sweep-progress'); return !!p && +p.value >= 1;",
        WAIT,
    );
    // Escape cancels (a shortcut of the page)
    s.exec("document.body.dispatchEvent(new KeyboardEvent('keydown', {key: 'Escape', code: 'Escape', bubbles: true}));", vec![]);
    s.wait_for(
        "the cancel message",
        "const e = document.getElementById('sweep-message'); return !!e && e.textContent.startsWith('Cancelled');",
        WAIT,
    );
    // the rows the charts hold (the bar's value cannot pass its max, so the charts count)
    let rows = || data_number(&s, "sweep-chart-thrust", "count").unwrap_or(0.0) as u64;
    let done = rows();
    assert!((1..40).contains(&done), "{done} rows when cancelled");
    assert_eq!(text_of(&s, "sweep-count"), format!("{done} of {done} options"));
    std::thread::sleep(Duration::from_millis(1500));
    assert_eq!(rows(), done, "a cancelled worker must post nothing more");
    // the page runs a new sweep afterwards
    set_rise_sweep(&s, "0.16", "0.18", "2");
    click_id(&s, "sweep-run");
    s.wait_for(
        "the new sweep",
        "const p = document.getElementById('sweep-progress'); return !!p && +p.max === 2 && +p.value === 2;",
        Duration::from_secs(60),
    );
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}
