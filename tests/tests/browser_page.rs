//! The page in any window and any hand, in headless Chromium over WebDriver (needs
//! `dist/` built from this tree): a phone shows the drawings first with the header
//! whole; US customary shows area loads in psf and depths in inches; the units and the
//! load case survive a reload (storage and the link's view part); the results table
//! follows the scenario buttons. Screenshots at three window sizes go to
//! `tests/screenshots/`.
//!
//! Expected values come from the engine (`analyze`) and from defined unit factors
//! (NIST SP 811, appendix B), never from the page itself.

use serde_json::json;
use springline_statics::{analyze, Design};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

/// 1 psf in kN/m2: 1 lbf (4.448 221 615 260 5 N) over 1 ft2 (0.092 903 04 m2), exact
/// definitions (NIST SP 811, appendix B), typed here, not taken from the code under test.
const KN_PER_M2_PER_PSF: f64 = 0.047_880_258_980_335_84;
/// 1 in in m (exact).
const M_PER_IN: f64 = 0.0254;

/// The bounding box of the element `selector` (left, top, right, bottom), CSS pixels.
fn rect(s: &Session, selector: &str) -> [f64; 4] {
    let v = s.exec(
        "const e = document.querySelector(arguments[0]); if (!e) return null;
         const r = e.getBoundingClientRect(); return [r.left, r.top, r.right, r.bottom];",
        vec![json!(selector)],
    );
    let n = |i: usize| v[i].as_f64().unwrap_or_else(|| panic!("no box for {selector}: {v}"));
    [n(0), n(1), n(2), n(3)]
}

fn attribute(s: &Session, selector: &str, name: &str) -> String {
    s.exec(
        "const e = document.querySelector(arguments[0]); return e ? e.getAttribute(arguments[1]) : null;",
        vec![json!(selector), json!(name)],
    )
    .as_str()
    .unwrap_or("")
    .to_string()
}

fn click(s: &Session, selector: &str) {
    s.exec("document.querySelector(arguments[0]).click();", vec![json!(selector)]);
}

/// The value typed in input `id`, as a number.
fn input_value(s: &Session, id: &str) -> f64 {
    let v = s.exec("return document.getElementById(arguments[0]).value;", vec![json!(id)]);
    v.as_str().and_then(|t| t.parse().ok()).unwrap_or(f64::NAN)
}

/// The unit shown beside input `id`.
fn unit_beside(s: &Session, id: &str) -> String {
    s.exec(
        "return document.getElementById(arguments[0]).parentElement.querySelector('.unit').textContent;",
        vec![json!(id)],
    )
    .as_str()
    .unwrap_or("")
    .to_string()
}

/// Waits until the springing thrust on the left shows the engine's `expected` (kN).
fn wait_left_thrust(s: &Session, what: &str, expected: f64) {
    s.wait_for(
        what,
        &format!(
            "const e = document.getElementById('result-left-h');
             return e && Math.abs(+e.dataset.value - {expected}) <= 1e-9 * {};",
            expected.abs()
        ),
        WAIT,
    );
}

#[test]
fn a_phone_shows_the_drawings_first_with_the_header_whole() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(390, 844, 2.0);
    open(&s, &server);
    let size = s.exec("return [window.innerWidth, window.innerHeight];", vec![]);
    let (w, h) = (size[0].as_f64().unwrap_or(0.0), size[1].as_f64().unwrap_or(0.0));
    assert!(w <= 400.0, "a phone-sized viewport: {size}");
    // the drawings come before the inputs
    let canvas = rect(&s, "#elevation");
    let inputs = rect(&s, "aside.controls");
    assert!(canvas[1] < inputs[1], "elevation top {} above the inputs' top {}", canvas[1], inputs[1]);
    assert!(canvas[2] <= w + 0.5, "the elevation fits the width: {canvas:?}");
    // the header is whole: copy link visible inside the viewport, nothing wider than it
    let copy = rect(&s, "#copy-link");
    assert!(copy[2] - copy[0] > 20.0 && copy[3] - copy[1] > 10.0, "copy link has a size: {copy:?}");
    assert!(copy[0] >= 0.0 && copy[2] <= w && copy[1] >= 0.0 && copy[3] <= h, "copy link inside: {copy:?}");
    // nothing of the header is cut or hidden behind the page's edge
    let header = rect(&s, "header.top");
    assert!(header[2] <= w + 0.5 && header[3] < h / 2.0, "header box {header:?}");
    let overflow = s.exec(
        "const hd = document.querySelector('header.top');
         const page = document.documentElement;
         return [hd.scrollWidth - hd.clientWidth, page.scrollWidth - page.clientWidth];",
        vec![],
    );
    assert_eq!(overflow, json!([0, 0]), "header and page wider than the screen");
    assert_eq!(s.exec("return document.querySelectorAll('h1').length", vec![]), json!(1));
    // the inputs are folded; the button opens them
    assert_eq!(attribute(&s, "#inputs-toggle", "aria-expanded"), "false");
    assert_eq!(rect(&s, "#deck-level")[3] - rect(&s, "#deck-level")[1], 0.0, "inputs folded away");
    click(&s, "#inputs-toggle");
    s.wait_for(
        "the inputs to open",
        "return document.getElementById('deck-level').getBoundingClientRect().height > 0",
        WAIT,
    );
    assert_eq!(attribute(&s, "#inputs-toggle", "aria-expanded"), "true");
    s.exec("document.getElementById('inputs-toggle').scrollIntoView();", vec![]);
    std::fs::write(screenshots_dir().join("page-390x844-inputs.png"), s.screenshot()).expect("screenshot");
    click(&s, "#inputs-toggle");
    s.exec("window.scrollTo(0, 0);", vec![]);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
    std::fs::write(screenshots_dir().join("page-390x844.png"), s.screenshot()).expect("screenshot");
}

/// Every input says what it is: a label element (pointing at it or wrapping it), or an aria-label when the visible label
/// is short; the ground points' remove buttons name their point; one heading per panel.
#[test]
fn every_input_and_button_says_what_it_is() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    open(&s, &server);
    let unnamed = s.exec(
        "return [...document.querySelectorAll('input, select, button')].filter(e => {
             const label = (e.id && document.querySelector(`label[for=\"${e.id}\"]`)) || e.closest('label');
             const named = e.getAttribute('aria-label') || (label && label.textContent.trim()) || e.textContent.trim();
             return !named; }).map(e => e.outerHTML.slice(0, 80));",
        vec![],
    );
    assert_eq!(unnamed, json!([]), "inputs without a name");
    assert_eq!(attribute(&s, "#ground-2-x", "aria-label"), "Ground point 3, x");
    assert_eq!(attribute(&s, "#ground-2-remove", "aria-label"), "Remove ground point 3");
    let headings =
        s.exec("return [...document.querySelectorAll('aside.controls h3')].map(h => h.textContent);", vec![]);
    assert_eq!(
        headings,
        json!([
            "Ground",
            "Roadway",
            "Arch",
            "Find the rise",
            "Loads",
            "Traffic",
            "Temperature and other actions",
            "Sections",
            "Deck, rates and ground"
        ])
    );
    std::fs::write(screenshots_dir().join("page-1500x900.png"), s.screenshot()).expect("screenshot");
}

#[test]
fn us_units_show_psf_on_the_loads_fields_and_inches_on_depths() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    assert_eq!(unit_beside(&s, "dead-load"), "kN/m²");
    let before = results_text(&s);
    click(&s, "#units");
    s.wait_for(
        "the results in US units",
        &format!("return document.querySelector('.results-panel').innerText !== {}", json!(before)),
        WAIT,
    );
    for (id, si) in [("dead-load", demo.deck.dead_load), ("surfacing", demo.deck.surfacing)] {
        assert_eq!(unit_beside(&s, id), "psf", "{id}");
        let expected = si / KN_PER_M2_PER_PSF;
        let shown = input_value(&s, id);
        assert!((shown - expected).abs() <= 1e-3 * expected, "{id}: {shown} psf, expected {expected}");
    }
    assert_eq!(unit_beside(&s, "section-rib-depth"), "in");
    let depth = demo.groups.rib.depth / M_PER_IN;
    assert!((input_value(&s, "section-rib-depth") - depth).abs() <= 1e-3 * depth);
    // the half-span case's words convert too: psf and kip/ft, no kN
    click(&s, "#case-half-left");
    s.wait_for(
        "the half-span description",
        "return document.getElementById('case-description').textContent.includes('psf')",
        WAIT,
    );
    let words = text_of(&s, "case-description");
    assert!(words.contains("kip/ft") && !words.contains("kN"), "{words}");
    assert!(text_of(&s, "result-form").contains("ft"), "{}", text_of(&s, "result-form"));
    assert!(severe(&s).is_empty());
}

#[test]
fn a_reload_keeps_the_units_and_the_load_case() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    open(&s, &server);
    let a = analyze(&Design::demo()).expect("demo analyses");
    let half = a.load_cases.iter().position(|c| c.description.id() == "half-left").expect("half case");
    let half_h = a.summary.springings_of(&a.load_cases[half].case).expect("half").left.thrust;
    click(&s, "#units");
    click(&s, "#case-half-left");
    wait_left_thrust(&s, "the half-span case", half_h);
    s.wait_for(
        "the address to carry the view",
        "return location.hash.endsWith('~view:c=half-left;u=us')",
        WAIT,
    );
    // a marker the reload clears, so the waits below see the new page, not the old one
    s.exec("window.beforeReload = true; location.reload();", vec![]);
    s.wait_for(
        "the reloaded page",
        "return window.beforeReload === undefined && document.getElementById('result-left-h') !== null",
        WAIT,
    );
    wait_left_thrust(&s, "the half-span case after the reload", half_h);
    assert_eq!(attribute(&s, "#case-half-left", "aria-pressed"), "true");
    assert_eq!(attribute(&s, "#case-dead", "aria-pressed"), "false");
    assert!(text_of(&s, "result-left-h").ends_with("kip"), "{}", text_of(&s, "result-left-h"));
    // the plain address (no link) opens in the units last chosen: the browser kept them
    open(&s, &server);
    assert!(text_of(&s, "result-span").ends_with("ft"), "{}", text_of(&s, "result-span"));
    assert!(severe(&s).is_empty());
    // a bad view part is ignored without a word: the design opens, no notice
    let fresh = driver.session(1500, 900, 1.0);
    let payload = springline_statics::link::permalink::encode(&Design::demo());
    open_url(&fresh, &format!("{}#{payload}~view:c=No%20Such;u=metric", server.url()));
    assert_eq!(fresh.exec("return document.getElementById('notice') === null", vec![]), json!(true));
    assert_eq!(attribute(&fresh, "#case-dead", "aria-pressed"), "true");
    assert!(text_of(&fresh, "result-span").ends_with("m"), "{}", text_of(&fresh, "result-span"));
    assert!(severe(&fresh).is_empty());
}

/// A default view (dead load, SI) adds nothing to the link, so it reads as links from
/// before the view part did; a link's `u=us` shows US units without becoming the
/// reader's stored choice, which only the units button changes.
#[test]
fn a_default_link_has_no_view_part_and_a_links_units_are_not_stored() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    open(&s, &server);
    let payload = springline_statics::link::permalink::encode(&Design::demo());
    s.wait_for(
        "the address to carry the design alone",
        &format!("return location.hash === {}", json!(format!("#{payload}"))),
        WAIT,
    );
    // a link in US units shows US units (a link differing only in its fragment is read
    // by the page's hashchange listener, so each check waits for the page to follow)
    open_url(&s, &format!("{}#{payload}~view:u=us", server.url()));
    wait_for_span_unit(&s, "ft");
    // ... but the plain address still opens in the reader's own (here never chosen: SI)
    open(&s, &server);
    wait_for_span_unit(&s, "m");
    // the units button is the reader's choice: kept
    click(&s, "#units");
    wait_for_span_unit(&s, "ft");
    open(&s, &server);
    wait_for_span_unit(&s, "ft");
    // and a link saying SI shows SI without undoing that choice
    open_url(&s, &format!("{}#{payload}~view:u=si", server.url()));
    wait_for_span_unit(&s, "m");
    open(&s, &server);
    wait_for_span_unit(&s, "ft");
    assert!(severe(&s).is_empty());
}

/// Waits until the results' span is shown in `unit` (its text ends with it).
fn wait_for_span_unit(s: &Session, unit: &str) {
    s.wait_for(
        &format!("the span in {unit}"),
        &format!("return document.getElementById('result-span').textContent.endsWith({})", json!(unit)),
        WAIT,
    );
}

/// A panel-count edit moves the heavier panel in place: its button is the same element
/// (nothing built again) and now carries the engine's case for the new count: its id,
/// its words and its pictogram's arrow. Check values: the engine's load cases for the
/// edited demo (`analyze`); no outside value.
#[test]
fn a_panel_count_edit_moves_the_heavier_panel_in_place() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let heavier = "button[id^='case-panel-']";
    let arrow = format!("{heavier} path.picto-heavy");
    let before = attribute(&s, &arrow, "d");
    assert!(!before.is_empty(), "the heavier panel's arrow is drawn");
    s.exec(&format!("window.heavierButton = document.querySelector({});", json!(heavier)), vec![]);
    let mut design = Design::demo();
    design.panels += 6;
    set_field(&s, "panels", &design.panels.to_string());
    s.wait_for(
        "the heavier panel's arrow moved",
        &format!(
            "const p = document.querySelector({}); return p !== null && p.getAttribute('d') !== {};",
            json!(arrow),
            json!(before)
        ),
        WAIT,
    );
    let a = analyze(&design).expect("the edited demo analyses");
    let case = a
        .load_cases
        .iter()
        .map(|c| c.description)
        .find(|k| k.id().starts_with("panel-"))
        .expect("a heavier panel case");
    let id = attribute(&s, heavier, "id");
    assert_eq!(id, format!("case-{}", case.id()));
    let words = s.exec(&format!("return document.querySelector({}).textContent;", json!(heavier)), vec![]);
    assert_eq!(words.as_str().map(str::trim), Some(case.title().as_str()));
    let same = s.exec(
        &format!("return document.querySelector({}) === window.heavierButton;", json!(heavier)),
        vec![],
    );
    assert_eq!(same, json!(true), "the heavier panel's button was built again");
    assert!(severe(&s).is_empty());
}

/// Each scenario button shows its case in the drawings and the table: the springing
/// forces are the engine's for that case, the caption names it in words, the button is
/// pressed and the others are not.
#[test]
fn the_results_table_follows_the_scenario_buttons() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1024, 768, 1.0);
    open(&s, &server);
    let a = analyze(&Design::demo()).expect("demo analyses");
    let ids: Vec<String> = a.load_cases.iter().map(|c| c.description.id()).collect();
    assert_eq!(ids.len(), 3, "{ids:?}");
    for case in a.load_cases.iter().rev() {
        let id = case.description.id();
        let springs = a.summary.springings_of(&case.case).expect("springings");
        click(&s, &format!("#case-{id}"));
        wait_left_thrust(&s, &format!("the {id} case"), springs.left.thrust);
        let right = shown_number(&text_of(&s, "result-right-h"));
        assert!(
            (right - springs.right.thrust).abs() <= 1e-3 * springs.right.thrust.abs(),
            "{id}: right H {right} vs {}",
            springs.right.thrust
        );
        let caption = text_of(&s, "results-caption");
        assert!(caption.starts_with(&case.description.title()), "{id}: {caption}");
        for other in &ids {
            let pressed = attribute(&s, &format!("#case-{other}"), "aria-pressed");
            assert_eq!(pressed, (other == &id).to_string(), "{other} while {id} is shown");
        }
    }
    assert!(!text_of(&s, "results-convention").is_empty());
    assert!(severe(&s).is_empty());
    std::fs::write(screenshots_dir().join("page-1024x768.png"), s.screenshot()).expect("screenshot");
}
