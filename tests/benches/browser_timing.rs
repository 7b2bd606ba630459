//! Browser timing harness: how long the app takes, in headless Chromium, from an edit to
//! the next painted frame, and from page load to the first drawing. Needs the release
//! build in `dist/` (`scripts/serve` or `trunk build --release`).
//!
//! Run: `cargo bench -p springline-tests --bench browser_timing`. Prints a table; it
//! asserts nothing (targets live here, not in timed unit tests).

use serde_json::json;
use springline_tests::page::{dist, open, WAIT};
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::Driver;
use std::time::Instant;

/// In the page: set a field, commit it, and resolve after the second animation frame
/// (the frame that shows the change), with the elapsed milliseconds.
const EDIT_TO_FRAME: &str = "
    const done = arguments[arguments.length - 1];
    const e = document.getElementById(arguments[0]);
    const t0 = performance.now();
    e.value = arguments[1];
    e.dispatchEvent(new Event('change', { bubbles: true }));
    requestAnimationFrame(() => requestAnimationFrame(() => done(performance.now() - t0)));
";

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(|a, b| a.total_cmp(b));
    v[v.len() / 2]
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
    let _ = s.wait_for("idle", "return true", WAIT);
}
