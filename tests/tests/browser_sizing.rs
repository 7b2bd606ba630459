//! The sizing view in headless Chromium over WebDriver (needs `dist/` built from this
//! tree): choosing Sizes in the load picker shows the engine's size report of the demo
//! (the rib's utilisation, the steel tonnage, the left springing's resultant) and its
//! thrust block's label on the elevation; "Use these sizes" puts the sized rib into the
//! design as one edit, and undo restores the typed rib.
//!
//! Expected values come from the engine (`arch::sizing::size_design` on the frame
//! model's traffic report), never from the page itself.

use serde_json::json;
use springline_statics::arch::sizing::{size_design, SizeReport};
use springline_statics::arch::traffic::traffic_envelopes;
use springline_statics::scene::sizing::resultant_words;
use springline_statics::units::{Quantity, Units};
use springline_statics::{Design, ModelKind, ValidDesign};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

/// The engine's size report of `design`.
fn size_report(design: &Design) -> SizeReport {
    let valid = ValidDesign::new(design).expect("the design validates");
    let traffic = traffic_envelopes(&valid, ModelKind::Frame).expect("envelopes").expect("a frame report");
    size_design(&valid, &traffic).expect("the design sizes")
}

/// Whether `shown` equals `expected` to four significant figures (within half a unit
/// of the fourth figure).
fn same_to_4_figures(shown: f64, expected: f64) -> bool {
    let unit = 10f64.powf(expected.abs().log10().floor() - 3.0);
    (shown - expected).abs() <= 0.5 * unit
}

/// Waits for element `id` and returns the SI value it carries.
fn data_value(s: &Session, id: &str) -> f64 {
    s.wait_for(&format!("#{id}"), &format!("return document.getElementById({}) !== null", json!(id)), WAIT);
    data_number(s, id, "value").unwrap_or_else(|| panic!("no value in #{id}"))
}

/// Waits until the input `id` shows `expected` (SI, shown in SI units) to four figures.
fn wait_input(s: &Session, id: &str, expected: f64) {
    s.wait_for(
        &format!("#{id} to show {expected}"),
        &format!(
            "const e = document.getElementById({}); if (!e) return false; const v = parseFloat(e.value);
             const unit = Math.pow(10, Math.floor(Math.log10(Math.abs({expected}))) - 3);
             return Math.abs(v - {expected}) <= 0.5 * unit;",
            json!(id)
        ),
        WAIT,
    );
}

#[test]
fn the_sizes_view_shows_the_engines_report_and_its_sizes_can_be_used_and_undone() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    let r = size_report(&demo);
    let rib = r.sizing.groups.iter().find(|g| g.group == "rib").expect("a rib group");
    let used = rib.utilisation.expect("the demo's rib is sized");
    let sized = rib.section.expect("the sized rib's section");
    assert!(
        (sized.a - demo.groups.rib.a).abs() > 1e-3 * demo.groups.rib.a,
        "the sized rib differs from the typed one: {} vs {} m2",
        sized.a,
        demo.groups.rib.a
    );
    let left = r.foundations.springings.iter().find(|s| s.side == "left").expect("a left springing");

    click_id(&s, "case-sizes");
    s.wait_for(
        "Sizes pressed",
        "return document.getElementById('case-sizes').getAttribute('aria-pressed') === 'true'",
        WAIT,
    );
    let shown = data_value(&s, "sizes-rib-utilisation");
    assert!(same_to_4_figures(shown, used), "rib utilisation {shown} vs the engine's {used}");
    assert_eq!(text_of(&s, "sizes-rib-utilisation"), Units::Si.show(Quantity::Ratio, used));
    let steel = data_value(&s, "sizes-steel");
    assert!(same_to_4_figures(steel, r.quantities.steel), "steel {steel} t vs {} t", r.quantities.steel);
    assert_eq!(text_of(&s, "sizes-steel"), Units::Si.show(Quantity::Mass, r.quantities.steel));
    let resultant = data_value(&s, "sizes-left-resultant");
    assert!(same_to_4_figures(resultant, left.resultant), "left R {resultant} vs {}", left.resultant);
    assert!(text_of(&s, "sizes-caution").contains("licensed engineer"));
    // the elevation draws the view: the left block's label, in the engine's words
    let words = resultant_words(left, Units::Si);
    s.wait_for(
        "the left block's label on the elevation",
        &format!(
            "const l = JSON.parse(window.springlineLabels('elevation') || '[]');
             return l.some(x => x.text.startsWith({w}) || (x.detail || '').startsWith({w}));",
            w = json!(words)
        ),
        WAIT,
    );
    // the elevation at the top of the window, the panel under it
    s.exec("document.getElementById('elevation').scrollIntoView({ block: 'start' });", vec![]);
    std::fs::write(screenshots_dir().join("sizing.png"), s.screenshot()).expect("screenshot");

    // use the sizes: the rib's area field shows the sized area; undo brings the typed one
    wait_input(&s, "section-rib-a", demo.groups.rib.a);
    click_id(&s, "sizes-adopt");
    wait_input(&s, "section-rib-a", sized.a);
    click_id(&s, "undo");
    wait_input(&s, "section-rib-a", demo.groups.rib.a);

    // settle the sizes: the massing loop's settled rib, in one undo step
    let settled = springline_statics::arch::massing::massing_loop(&demo, 12).expect("the loop runs");
    assert!(settled.converged, "{}", settled.last_change);
    click_id(&s, "sizes-settle");
    wait_input(&s, "section-rib-a", settled.design.groups.rib.a);
    let note = format!("Settled after {} passes", settled.passes);
    s.wait_for(
        "the loop's note",
        &format!("const n = document.getElementById('sizes-settle-note'); return !!n && n.textContent.startsWith({})", json!(note)),
        WAIT,
    );
    click_id(&s, "undo");
    wait_input(&s, "section-rib-a", demo.groups.rib.a);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

/// The four-figure comparison itself: within half a unit of the fourth figure only.
#[test]
fn four_figures_means_half_a_unit_of_the_fourth() {
    assert!(same_to_4_figures(17_023.4, 17_023.0));
    assert!(!same_to_4_figures(17_040.0, 17_023.0));
    assert!(same_to_4_figures(0.92345, 0.9234));
    assert!(!same_to_4_figures(0.9241, 0.9234));
}
