//! Browser timing harness: how long the app takes, in headless Chromium, from an edit to
//! the next painted frame and to the results its pause brings from the background worker,
//! from page load to the first drawing, and the main-thread work of one move of a dragged
//! vehicle. Needs the release
//! build in `dist/` (`scripts/serve` or `trunk build --release`).
//!
//! Run: `cargo bench -p springline-tests --bench browser_timing`. Prints a table; it
//! asserts nothing (targets live here, not in timed unit tests).

use serde_json::json;
use springline_tests::page::{dist, open, set_field, WAIT};
use springline_tests::serve::StaticServer;
use springline_tests::stats::percentile;
use springline_tests::webdriver::Driver;
use std::time::Instant;

/// In the page, the start of each timed edit: the field `arguments[0]` set to
/// `arguments[1]` and committed (a change event), `t0` the time just before, `done` the
/// script's callback.
macro_rules! commit_field {
    () => {
        "
    const done = arguments[arguments.length - 1];
    const e = document.getElementById(arguments[0]);
    const t0 = performance.now();
    e.value = arguments[1];
    e.dispatchEvent(new Event('change', { bubbles: true }));
"
    };
}

/// In the page: set a field, commit it, and resolve after the second animation frame
/// (the frame that shows the change), with the elapsed milliseconds.
const EDIT_TO_FRAME: &str = concat!(
    commit_field!(),
    "
    requestAnimationFrame(() => requestAnimationFrame(() => done(performance.now() - t0)));
"
);

/// In the page: set a field, commit it, and resolve with the milliseconds until the
/// results the page asks of its background worker once edits pause (after 250 ms of
/// rest) are on screen: the traffic block's, then the stability block's (each block's
/// `data-current`, polled every 2 ms).
const EDIT_TO_RESULTS: &str = concat!(
    commit_field!(),
    "
    const current = (id) => { const b = document.getElementById(id); return b && b.dataset.current === 'true'; };
    let traffic = null;
    const poll = () => {
        const now = performance.now() - t0;
        if (traffic === null && current('traffic-results')) { traffic = now; }
        if (traffic !== null && current('stability-results')) { done([traffic, now]); }
        else if (now > 20000) { done([traffic, null]); }
        else { setTimeout(poll, 2); }
    };
    // the blocks turn stale with the edit's own frame
    requestAnimationFrame(() => setTimeout(poll, 0));
"
);

/// In the page: grab the vehicle on the elevation with a synthetic pointer, then move it
/// 0.5 m to the right `arguments[0]` times, one move per frame. For each move: the time
/// of the synchronous `dispatchEvent` (the handler), and the time from dispatching it to
/// a task queued right after (a MessageChannel message runs once the microtasks are done:
/// the memoised analysis, both canvases repainted, the readout and results updated). No
/// animation frame is inside either time.
const VEHICLE_MOVES: &str = "
    const done = arguments[arguments.length - 1];
    const n = arguments[0];
    const el = document.getElementById('elevation');
    const box = JSON.parse(el.dataset.vehicleBox);
    const r = el.getBoundingClientRect();
    const cx = r.left + box[0] + box[2] / 2, cy = r.top + box[1] + box[3] / 2;
    const scale = +el.dataset.scale;
    const at = (x) => ({ bubbles: true, composed: true, pointerId: 7, pointerType: 'mouse', isPrimary: true,
                         clientX: x, clientY: cy, button: 0, buttons: 1 });
    el.dispatchEvent(new PointerEvent('pointerdown', at(cx)));
    const sync = [], whole = [];
    const channel = new MessageChannel();
    let k = 0;
    const step = () => {
        k += 1;
        const x = cx + scale * 0.5 * k;
        const t0 = performance.now();
        el.dispatchEvent(new PointerEvent('pointermove', at(x)));
        sync.push(performance.now() - t0);
        channel.port1.onmessage = () => {
            whole.push(performance.now() - t0);
            if (k < n) {
                requestAnimationFrame(() => setTimeout(step, 0));
            } else {
                el.dispatchEvent(new PointerEvent('pointerup', at(x)));
                done({ sync, whole, x: +el.dataset.vehicleX });
            }
        };
        channel.port2.postMessage(0);
    };
    step();
";

/// In the page: run the sweep panel as set and resolve with the milliseconds from the
/// click on Run to the progress bar full (the worker's start, every option, and the
/// page's charts as the rows arrive).
const SWEEP_RUN: &str = "
    const done = arguments[arguments.length - 1];
    const n = arguments[0];
    const t0 = performance.now();
    document.getElementById('sweep-run').click();
    // the bar of an earlier run reads full until the new run's first update
    let started = false;
    const poll = () => {
        const p = document.getElementById('sweep-progress');
        if (p && +p.value < n) { started = true; }
        if (started && p && +p.max === n && +p.value === n) { done(performance.now() - t0); } else { setTimeout(poll, 5); }
    };
    poll();
";

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(|a, b| a.total_cmp(b));
    v[v.len() / 2]
}

fn numbers(v: &serde_json::Value) -> Vec<f64> {
    v.as_array().map(|a| a.iter().filter_map(|x| x.as_f64()).collect()).unwrap_or_default()
}

fn main() {
    if std::env::args().any(|a| a == "--list") {
        return;
    }
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    let t = Instant::now();
    open(&s, &server);
    println!(
        "page load to both canvases drawn: {:.0} ms (wall clock, includes polling)",
        t.elapsed().as_secs_f64() * 1e3
    );
    let first = s.exec("return performance.getEntriesByType('navigation')[0].loadEventEnd", vec![]);
    println!("navigation to load event: {:.0} ms", first.as_f64().unwrap_or(f64::NAN));
    println!("\nedit -> painted frame (median of 5), panel count changed:");
    println!("{:>8} {:>10}", "panels", "ms");
    for panels in [8, 16, 32, 64, 128] {
        let mut times = Vec::new();
        for k in 0..5 {
            // alternate with a neighbouring value so every commit is a real change
            let v = if k % 2 == 0 { panels } else { panels + 2 };
            let ms = s.exec_async(EDIT_TO_FRAME, vec![json!("panels"), json!(v.to_string())]);
            times.push(ms.as_f64().unwrap_or(f64::NAN));
        }
        println!("{panels:>8} {:>10.1}", median(times));
    }

    // the results of a pause, 16 <-> 18 panels, each edit left to rest until they are shown
    let (mut traffic, mut stability) = (Vec::new(), Vec::new());
    for k in 0..8 {
        let v = if k % 2 == 0 { "18" } else { "16" };
        let r = s.exec_async(EDIT_TO_RESULTS, vec![json!("panels"), json!(v)]);
        traffic.push(r[0].as_f64().unwrap_or(f64::NAN));
        stability.push(r[1].as_f64().unwrap_or(f64::NAN));
    }
    println!("\nedit -> the pause's results on screen, 16 <-> 18 panels (8 edits; 250 ms of rest included):");
    println!("{:>44} {:>8} {:>8}", "", "median", "p95");
    for (what, times) in [("traffic block (ms)", traffic), ("stability block (ms)", stability)] {
        println!("{what:>44} {:>8.0} {:>8.0}", median(times.clone()), percentile(times, 95.0));
    }

    // the vehicle dragged along the deck of a 16-panel design
    set_field(&s, "panels", "16");
    s.wait_for("16 panels", "return document.getElementById('panels').value === '16'", WAIT);
    s.exec("document.getElementById('case-vehicle').click();", vec![]);
    s.wait_for(
        "the vehicle drawn",
        "return document.getElementById('elevation').dataset.vehicleBox !== undefined",
        WAIT,
    );
    let moves = 100;
    let r = s.exec_async(VEHICLE_MOVES, vec![json!(moves)]);
    let (sync, whole) = (numbers(&r["sync"]), numbers(&r["whole"]));
    println!(
        "\nvehicle drag, 16 panels, {} moves of 0.5 m (leading axle ends at x = {} m):",
        whole.len(),
        r["x"]
    );
    println!("{:>44} {:>8} {:>8}", "", "median", "p95");
    println!(
        "{:>44} {:>8.2} {:>8.2}",
        "dispatchEvent, synchronous (ms)",
        median(sync.clone()),
        percentile(sync, 95.0)
    );
    println!(
        "{:>44} {:>8.2} {:>8.2}",
        "dispatch to end of the work it queues (ms)",
        median(whole.clone()),
        percentile(whole, 95.0)
    );

    // the 100-option sized rise sweep at 16 panels, in the background worker
    for (id, value) in [
        ("sweep-parameter", "rise-ratio"),
        ("sweep-a-from", "0.1"),
        ("sweep-a-to", "0.3"),
        ("sweep-a-count", "100"),
    ] {
        set_field(&s, id, value);
    }
    let mut runs = Vec::new();
    for _ in 0..3 {
        let ms = s.exec_async(SWEEP_RUN, vec![json!(100)]);
        runs.push(ms.as_f64().unwrap_or(f64::NAN));
    }
    println!(
        "\n100-option rise sweep with sizing, 16 panels, in the worker (3 runs, ms): {}",
        runs.iter().map(|v| format!("{v:.0}")).collect::<Vec<_>>().join(", ")
    );
    let _ = s.wait_for("idle", "return true", WAIT);
}
