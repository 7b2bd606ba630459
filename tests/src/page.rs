//! Helpers shared by the browser tests: opening the app, reading canvas transforms and
//! pixels, setting fields, reading results.

use crate::serve::StaticServer;
use crate::webdriver::Session;
use crate::workspace_root;
use serde_json::{json, Value};
use std::time::Duration;

pub const WAIT: Duration = Duration::from_secs(30);

pub fn dist() -> std::path::PathBuf {
    workspace_root().join("dist")
}

/// Opens the app and waits until the results are shown.
pub fn open(session: &Session, server: &StaticServer) {
    open_url(session, &server.url());
}

/// Opens `url` (the app, perhaps with a link fragment) and waits for results and drawings.
pub fn open_url(session: &Session, url: &str) {
    session.goto(url);
    session.wait_for("the results panel", "return document.getElementById('result-thrust') !== null", WAIT);
    // let the canvases draw after layout
    session.wait_for(
        "both canvases drawn",
        "return ['elevation','forces'].every(id => { const c = document.getElementById(id); return c && c.dataset.scale; })",
        WAIT,
    );
}

/// The transform a canvas publishes: (scale, origin x, origin y).
pub fn transform(session: &Session, id: &str) -> (f64, f64, f64) {
    let v = session.exec(
        "const c = document.getElementById(arguments[0]); return [+c.dataset.scale, +c.dataset.originX, +c.dataset.originY];",
        vec![json!(id)],
    );
    let n = |i: usize| v[i].as_f64().unwrap_or(f64::NAN);
    (n(0), n(1), n(2))
}

pub fn to_px(t: (f64, f64, f64), x: f64, y: f64) -> (f64, f64) {
    (t.1 + t.0 * x, t.2 - t.0 * y)
}

/// RGBA of the backing-store pixel under CSS pixel (x, y) of a canvas.
pub fn pixel(session: &Session, id: &str, at: (f64, f64)) -> [u8; 4] {
    let v = session.exec(
        "const c = document.getElementById(arguments[0]); const r = window.devicePixelRatio;
         const d = c.getContext('2d').getImageData(Math.round(arguments[1] * r), Math.round(arguments[2] * r), 1, 1).data;
         return [d[0], d[1], d[2], d[3]];",
        vec![json!(id), json!(at.0), json!(at.1)],
    );
    let c = |i: usize| v[i].as_u64().unwrap_or(0) as u8;
    [c(0), c(1), c(2), c(3)]
}

/// True when some pixel within `r` CSS pixels of `at` differs from the background.
pub fn drawn_near(session: &Session, id: &str, at: (f64, f64), r: f64) -> bool {
    let v = session.exec(
        "const c = document.getElementById(arguments[0]); const k = window.devicePixelRatio;
         const x = Math.round((arguments[1] - arguments[3]) * k), y = Math.round((arguments[2] - arguments[3]) * k);
         const n = Math.max(1, Math.round(2 * arguments[3] * k));
         const d = c.getContext('2d').getImageData(x, y, n, n).data;
         for (let i = 0; i < d.length; i += 4) {
           const bg = d[i] > 240 && d[i+1] > 240 && d[i+2] > 235;
           if (d[i+3] > 0 && !bg) return true;
         }
         return false;",
        vec![json!(id), json!(at.0), json!(at.1), json!(r)],
    );
    v == Value::Bool(true)
}

pub fn canvas_data_url(session: &Session, id: &str) -> String {
    session
        .exec("return document.getElementById(arguments[0]).toDataURL();", vec![json!(id)])
        .as_str()
        .unwrap_or("")
        .to_string()
}

/// Types `value` into the field `id` and commits it (the change event).
pub fn set_field(session: &Session, id: &str, value: &str) {
    session.exec(
        "const e = document.getElementById(arguments[0]); e.value = arguments[1];
         e.dispatchEvent(new Event('change', { bubbles: true }));",
        vec![json!(id), json!(value)],
    );
}

pub fn text_of(session: &Session, id: &str) -> String {
    session
        .exec(
            "const e = document.getElementById(arguments[0]); return e ? e.textContent : null;",
            vec![json!(id)],
        )
        .as_str()
        .unwrap_or("")
        .to_string()
}

pub fn shown_number(text: &str) -> f64 {
    let t: String = text
        .split_whitespace()
        .next()
        .unwrap_or("")
        .chars()
        .filter(|c| !matches!(c, '\u{2009}' | '\u{a0}'))
        .collect();
    let first: String = text
        .replace(['\u{2009}', '\u{a0}'], "")
        .replace('−', "-")
        .chars()
        .take_while(|c| c.is_ascii_digit() || *c == '.' || *c == '-')
        .collect();
    first.parse().unwrap_or_else(|_| panic!("no number in '{text}' ({t})"))
}

pub fn severe(session: &Session) -> Vec<String> {
    session.console().into_iter().filter(|(level, _)| level == "SEVERE").map(|(_, m)| m).collect()
}

pub fn screenshots_dir() -> std::path::PathBuf {
    let d = workspace_root().join("tests").join("screenshots");
    let _ = std::fs::create_dir_all(&d);
    d
}

/// The whole results panel as text (what a user reads).
///
/// The traffic and stability blocks are computed once edits pause: this waits (up to 20 s)
/// until both are for the design on screen, unless a drag holds them.
pub fn results_text(session: &Session) -> String {
    session.wait_for(
        "the traffic and stability blocks to follow the design",
        "const t = document.getElementById('traffic-results');
         const s = document.getElementById('stability-results');
         const traffic = !t || t.dataset.current === 'true' || document.getElementById('traffic-pending') !== null;
         const stability = !s || s.dataset.current === 'true' || document.getElementById('stability-pending') !== null;
         return traffic && stability;",
        std::time::Duration::from_secs(20),
    );
    session
        .exec("const e = document.querySelector('.results-panel'); return e ? e.innerText : '';", vec![])
        .as_str()
        .unwrap_or("")
        .to_string()
}

/// Viewport position of a canvas's top-left corner, CSS pixels.
pub fn canvas_origin(session: &Session, id: &str) -> (f64, f64) {
    let v = session.exec(
        "const r = document.getElementById(arguments[0]).getBoundingClientRect(); return [r.left, r.top];",
        vec![json!(id)],
    );
    (v[0].as_f64().unwrap_or(0.0), v[1].as_f64().unwrap_or(0.0))
}

/// Clicks with the mouse at (x, y) in viewport CSS pixels.
pub fn click(session: &Session, at: (f64, f64)) {
    session.pointer(
        "mouse",
        vec![
            json!({"type": "pointerMove", "duration": 0, "x": at.0.round() as i64, "y": at.1.round() as i64}),
            json!({"type": "pointerDown", "button": 0}),
            json!({"type": "pointerUp", "button": 0}),
        ],
    );
}

/// Clicks the element with id `id` (its own click handler, as a press of the button).
pub fn click_id(session: &Session, id: &str) {
    session.exec("document.getElementById(arguments[0]).click();", vec![json!(id)]);
}

/// The number in data attribute `key` (camel case, as `dataset` names it) of element
/// `id`, if any.
pub fn data_number(session: &Session, id: &str, key: &str) -> Option<f64> {
    session
        .exec(
            "const e = document.getElementById(arguments[0]); const v = e && e.dataset[arguments[1]];
             return v === undefined || v === null ? null : +v;",
            vec![json!(id), json!(key)],
        )
        .as_f64()
}

/// Waits until the results cell `id` carries `expected` in its `data-value` (the SI
/// value, relative 1e-9).
pub fn wait_value(session: &Session, id: &str, expected: f64) {
    session.wait_for(
        &format!("#{id} to read {expected}"),
        &format!(
            "const e = document.getElementById({}); return e && Math.abs(+e.dataset.value - {expected}) <= 1e-9 * Math.max(1, Math.abs({expected}));",
            json!(id)
        ),
        WAIT,
    );
}
