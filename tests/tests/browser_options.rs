//! Options side by side in headless Chromium over WebDriver (needs `dist/` built from this
//! tree): two saved options show the key numbers `springline size --key-numbers` prints
//! for each; a reload keeps them; the comparison's link opened in a fresh browser profile
//! shows the same comparison without touching that browser's own options until asked;
//! stored options that cannot be read are set aside under another key with a message, and
//! the app goes on working.
//!
//! Expected values come from the `springline` binary and the engine, never from the page.

use serde_json::{json, Value};
use springline_statics::arch::design::Crown;
use springline_statics::arch::design_file::write_design_json;
use springline_statics::arch::options::METRICS;
use springline_statics::link::comparison::decode_comparison;
use springline_statics::{analyze, Design};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

/// The demo with another rise (a second option).
fn higher() -> Design {
    let mut d = Design::demo();
    d.crown = Crown::Rise { rise: 21.0 };
    d
}

/// What `springline size --key-numbers` prints for `design`.
fn cli_numbers(design: &Design) -> Value {
    let out = springline_tests::cli::run(&["size", "-", "--key-numbers"], &write_design_json(design));
    serde_json::from_str(&out).expect("key numbers JSON")
}

/// The CLI's value of a comparison row (the metric ids of `arch::options::METRICS`).
fn cli_value(n: &Value, id: &str) -> Option<f64> {
    let side = |name: &str, key: &str| {
        n["springings"].as_array()?.iter().find(|s| s["side"] == name).and_then(|s| s[key].as_f64())
    };
    match id {
        "span" | "rise" | "rise-ratio" | "panels" | "form-thrust" | "rib-force" | "post-force"
        | "bracing-force" | "alpha-cr" | "steel" | "concrete" | "cost-index" => {
            let key = match id {
                "rise-ratio" => "rise_ratio",
                "form-thrust" => "form_thrust",
                "rib-force" => "rib_force",
                "post-force" => "post_force",
                "bracing-force" => "bracing_force",
                "alpha-cr" => "alpha_cr",
                "cost-index" => "cost_index",
                other => other,
            };
            n[key].as_f64()
        }
        "thrust-min" => n["thrust_range"][0].as_f64(),
        "thrust-max" => n["thrust_range"][1].as_f64(),
        "left-h" => side("left", "thrust"),
        "left-v" => side("left", "vertical"),
        "left-angle" => side("left", "angle"),
        "right-h" => side("right", "thrust"),
        "right-v" => side("right", "vertical"),
        "right-angle" => side("right", "angle"),
        other => panic!("no CLI value for {other}"),
    }
}

/// Waits until the comparison shows `count` options with every key number worked out.
fn wait_comparison(s: &Session, count: usize) {
    s.wait_for(
        &format!("the comparison of {count} options"),
        &format!(
            "for (let k = 0; k < {count}; k++) {{ const e = document.getElementById('cmp-cost-index-' + k);
               if (!e || e.dataset.value === undefined || e.dataset.value === '') return false; }}
             return !document.getElementById('cmp-name-{count}');"
        ),
        std::time::Duration::from_secs(90),
    );
}

/// Every row of column `k` against the CLI's numbers (relative 1e-6: the browser's
/// WebAssembly and the native binary may differ in the last bits of a sine).
fn assert_column(s: &Session, k: usize, design: &Design) {
    let n = cli_numbers(design);
    assert_eq!(n["feasible"], json!(true), "{n}");
    for metric in METRICS {
        let id = format!("cmp-{}-{k}", metric.id);
        let shown = s.exec(
            "const e = document.getElementById(arguments[0]); return e ? e.dataset.value : null;",
            vec![json!(id)],
        );
        let expected = cli_value(&n, metric.id);
        match (shown.as_str().filter(|t| !t.is_empty()), expected) {
            (Some(t), Some(e)) => {
                let v: f64 = t.parse().expect("a number");
                assert!((v - e).abs() <= 1e-6 * e.abs().max(1.0), "{id}: page {v}, springline size {e}");
            }
            (None, None) => {}
            (page, cli) => panic!("{id}: page {page:?}, springline size {cli:?}"),
        }
    }
    assert_eq!(text_of(s, &format!("cmp-feasible-{k}")), "yes");
}

fn stored(s: &Session, key: &str) -> Value {
    s.exec("return localStorage.getItem(arguments[0]);", vec![json!(key)])
}

#[test]
fn saved_options_compare_with_the_cli_survive_a_reload_and_travel_in_one_link() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1100, 1.0);
    open(&s, &server);
    set_field(&s, "option-name", "Base");
    s.exec("document.getElementById('option-name').dispatchEvent(new Event('input'));", vec![]);
    click_id(&s, "save-option");
    set_field(&s, "rise", "21");
    wait_value(&s, "result-thrust", analyze(&higher()).expect("analyses").form.thrust);
    set_field(&s, "option-name", "Higher");
    s.exec("document.getElementById('option-name').dispatchEvent(new Event('input'));", vec![]);
    click_id(&s, "save-option");
    wait_comparison(&s, 2);
    assert_eq!(text_of(&s, "cmp-name-0"), "Base");
    assert_eq!(text_of(&s, "cmp-name-1"), "Higher");
    assert_column(&s, 0, &Design::demo());
    assert_column(&s, 1, &higher());
    // the cheaper option by the CLI's numbers is the one marked best, and the second
    // column says how it differs
    let cost = |d: &Design| cli_numbers(d)["cost_index"].as_f64().expect("cost index");
    let cheaper = if cost(&higher()) < cost(&Design::demo()) { 1 } else { 0 };
    let is_best = |k: usize| {
        s.exec(
            "return document.getElementById(arguments[0]).classList.contains('best');",
            vec![json!(format!("cmp-cost-index-{k}"))],
        )
    };
    assert_eq!((is_best(cheaper), is_best(1 - cheaper)), (json!(true), json!(false)));
    assert!(text_of(&s, "cmp-rise-1").contains('+'), "{}", text_of(&s, "cmp-rise-1"));
    std::fs::write(screenshots_dir().join("options.png"), s.screenshot()).expect("screenshot");

    // a reload keeps them
    s.goto(&server.url());
    wait_comparison(&s, 2);
    assert_eq!(text_of(&s, "cmp-name-1"), "Higher");
    assert_column(&s, 1, &higher());

    // the comparison's link, opened in a fresh profile: the same comparison, that
    // browser's own options untouched until the user adds these
    let link = s.exec("return document.getElementById('meeting-link').value;", vec![]);
    let link = link.as_str().expect("a link").to_string();
    assert!(link.contains("#o1."), "{link}");
    let carried = decode_comparison(&link).expect("the engine reads it");
    assert_eq!(carried.options.len(), 2);
    let fresh = driver.session(1500, 1100, 1.0);
    open_url(&fresh, &link);
    wait_comparison(&fresh, 2);
    assert!(text_of(&fresh, "shared-banner").contains("2 options"));
    assert_eq!(text_of(&fresh, "cmp-name-0"), "Base");
    assert_column(&fresh, 0, &Design::demo());
    assert_column(&fresh, 1, &higher());
    let own = stored(&fresh, "springline.options");
    let own: Value = serde_json::from_str(own.as_str().unwrap_or("{}")).expect("stored JSON");
    assert_eq!(own["options"], json!([]), "the link must not touch saved options: {own}");
    click_id(&fresh, "adopt-shared");
    fresh.wait_for(
        "the link's options saved",
        "const v = JSON.parse(localStorage.getItem('springline.options') || '{}'); return v.options && v.options.length === 2;",
        WAIT,
    );
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
    assert!(severe(&fresh).is_empty(), "{:?}", severe(&fresh));
}

#[test]
fn unreadable_stored_options_are_set_aside_with_a_message_and_the_app_goes_on() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1400, 1000, 1.0);
    open(&s, &server);
    let foreign =
        r#"{"kind":"springline-options","version":99,"options":[{"name":"from the future","link":"s9.x"}]}"#;
    s.exec("localStorage.setItem('springline.options', arguments[0]);", vec![json!(foreign)]);
    open(&s, &server);
    s.wait_for(
        "the set-aside message",
        "const e = document.getElementById('options-message'); return !!e && e.textContent.includes('could not be read');",
        WAIT,
    );
    let message = text_of(&s, "options-message");
    assert!(
        message.contains("another version of Springline")
            && message.contains("springline.options.set-aside.1"),
        "{message}"
    );
    assert_eq!(stored(&s, "springline.options.set-aside.1"), json!(foreign));
    // damaged JSON goes to the next key, the first stays
    s.exec("localStorage.setItem('springline.options', '{\"kind\": \"springline-opt');", vec![]);
    open(&s, &server);
    s.wait_for(
        "the second set-aside message",
        "const e = document.getElementById('options-message'); return !!e && e.textContent.includes('set-aside.2');",
        WAIT,
    );
    assert_eq!(stored(&s, "springline.options.set-aside.1"), json!(foreign));
    assert_eq!(stored(&s, "springline.options.set-aside.2"), json!("{\"kind\": \"springline-opt"));
    // one bad option among good ones: only it is set aside
    let good = springline_statics::link::permalink::encode(&Design::demo());
    let mixed = json!({"kind": "springline-options", "version": 1, "options": [
        {"name": "good", "link": good}, {"name": "cut", "link": &good[..good.len() / 2]}]})
    .to_string();
    s.exec("localStorage.setItem('springline.options', arguments[0]);", vec![json!(mixed)]);
    open(&s, &server);
    wait_comparison(&s, 1);
    assert_eq!(text_of(&s, "cmp-name-0"), "good");
    assert!(text_of(&s, "options-message").contains("'cut'"), "{}", text_of(&s, "options-message"));
    // the app still works: an edit, and a new option saved
    set_field(&s, "rise", "21");
    wait_value(&s, "result-thrust", analyze(&higher()).expect("analyses").form.thrust);
    click_id(&s, "save-option");
    wait_comparison(&s, 2);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

/// Presses a key on the page (a keydown on the body, as a keyboard gives it).
fn press(s: &Session, key: &str, code: &str, alt: bool) {
    s.exec(
        "document.body.dispatchEvent(new KeyboardEvent('keydown', {key: arguments[0], code: arguments[1], altKey: arguments[2], bubbles: true}));",
        vec![json!(key), json!(code), json!(alt)],
    );
}

#[test]
fn the_keyboard_saves_and_opens_options_and_lists_the_shortcuts() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1400, 1000, 1.0);
    open(&s, &server);
    let saved = |n: usize| {
        format!(
            "const v = JSON.parse(localStorage.getItem('springline.options') || '{{}}'); return !!v.options && v.options.length === {n};"
        )
    };
    press(&s, "s", "KeyS", true);
    s.wait_for("one option saved", &saved(1), WAIT);
    set_field(&s, "rise", "21");
    wait_value(&s, "result-thrust", analyze(&higher()).expect("analyses").form.thrust);
    press(&s, "s", "KeyS", true);
    s.wait_for("two options saved", &saved(2), WAIT);
    // Alt+P opens the previous option (the demo), Alt+N the next again
    press(&s, "p", "KeyP", true);
    wait_value(&s, "result-thrust", analyze(&Design::demo()).expect("analyses").form.thrust);
    press(&s, "n", "KeyN", true);
    wait_value(&s, "result-thrust", analyze(&higher()).expect("analyses").form.thrust);
    // a letter typed in a field is not a command
    s.exec(
        "document.getElementById('option-name').dispatchEvent(new KeyboardEvent('keydown', {key: 's', code: 'KeyS', altKey: true, bubbles: true}));",
        vec![],
    );
    std::thread::sleep(std::time::Duration::from_millis(300));
    assert!(s.exec(&saved(2), vec![]).as_bool().unwrap_or(false), "typing must not save");
    // "?" shows the list, with every shortcut of the page
    let hidden = "return document.getElementById('shortcuts').classList.contains('hidden');";
    assert_eq!(s.exec(hidden, vec![]), json!(true));
    press(&s, "?", "Slash", false);
    s.wait_for(
        "the shortcut list",
        "return !document.getElementById('shortcuts').classList.contains('hidden');",
        WAIT,
    );
    let list = text_of(&s, "shortcuts");
    for key in ["Alt+S", "Alt+N / Alt+P", "Alt+L", "Alt+A", "Alt+W", "Escape", "Ctrl+Z"] {
        assert!(list.contains(key), "{key} missing from the list: {list}");
    }
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}
