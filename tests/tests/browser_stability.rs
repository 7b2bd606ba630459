//! Stability and vibration on screen, in headless Chromium over WebDriver (needs `dist/`
//! built from this tree): the results show the arch's alpha_cr under the dead load and
//! the first vertical frequency the engine finds; the load picker's "Buckling" and
//! "Vibration" draw the mode over the elevation (the canvas names it) and the link
//! carries the choice; a footbridge crowd raises the comfort flag; the sizing view shows
//! the arch's alpha_cr with the rib's section and the first-order option sizes a stiffer
//! rib, one undo step.
//!
//! Expected values come from the engine (`arch_stability`, `size_of`), never from the
//! page itself.

use serde_json::json;
use springline_statics::arch::sizing::size_of;
use springline_statics::arch::stability::arch_stability;
use springline_statics::link::permalink;
use springline_statics::traffic::models::ModelFamily;
use springline_statics::traffic::TrafficDesign;
use springline_statics::{Design, ValidDesign};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

fn engine_stability(d: &Design) -> springline_statics::arch::stability::ArchStability {
    let valid = ValidDesign::new(d).expect("valid");
    arch_stability(&valid, 3).expect("modes")
}

/// Waits until the elevation names a mode containing `words` (or none, for `None`).
fn wait_mode(s: &Session, words: Option<&str>) {
    let script = match words {
        Some(w) => format!(
            "const m = document.getElementById('elevation').dataset.mode; return !!m && m.includes({});",
            json!(w)
        ),
        None => "return document.getElementById('elevation').dataset.mode === undefined;".into(),
    };
    s.wait_for(&format!("the elevation's mode: {words:?}"), &script, WAIT);
}

#[test]
fn modes_are_shown_drawn_linked_and_flagged() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    let expected = engine_stability(&demo);
    wait_value(&s, "stability-alpha", expected.arch.alpha_cr);
    wait_value(&s, "stability-vertical-hz", expected.first_vertical_hz.expect("a vertical mode"));
    assert!(text_of(&s, "stability-verdict").contains("EN 1993-1-1"), "{}", text_of(&s, "stability-verdict"));
    assert!(text_of(&s, "stability-plane").contains("Out-of-plane"));
    // road traffic: no footbridge flag
    assert_eq!(s.exec("return document.getElementById('stability-footbridge');", vec![]), json!(null));

    // the buckled shape over the elevation, named with its alpha_cr; the link carries it
    click_id(&s, "case-buckling");
    wait_mode(&s, Some(&format!("alpha_cr {:.2}", expected.arch.alpha_cr)));
    s.wait_for(
        "the link to carry the buckling view",
        "return location.hash.endsWith('~view:c=buckling');",
        WAIT,
    );
    let hash = s.exec("return location.hash;", vec![]).as_str().unwrap_or("").to_string();
    std::fs::write(screenshots_dir().join("buckling.png"), s.screenshot()).expect("screenshot");
    let fresh = driver.session(1500, 1000, 1.0);
    open_url(&fresh, &format!("{}{}", server.url(), hash));
    wait_mode(&fresh, Some("alpha_cr"));
    assert_eq!(
        fresh.exec("return document.getElementById('case-buckling').getAttribute('aria-pressed');", vec![]),
        json!("true")
    );
    // the first vibration mode, named with its frequency; back to the dead load: none
    click_id(&s, "case-vibration");
    let first = expected.vibration.modes.first().expect("a mode").frequency;
    wait_mode(&s, Some(&format!("{first:.2} Hz")));
    click_id(&s, "case-dead");
    wait_mode(&s, None);
    // the results block's own buttons do the same
    click_id(&s, "mode-view-buckled");
    wait_mode(&s, Some("alpha_cr"));
    click_id(&s, "mode-view-off");
    wait_mode(&s, None);

    // a footbridge crowd: the comfort flag with the first vertical frequency
    let mut foot = Design::demo();
    foot.name = "Tarnvale footbridge (invented)".into();
    foot.traffic = TrafficDesign::preset(ModelFamily::Crowd, foot.deck.width);
    let foot_expected = engine_stability(&foot);
    let flag = foot_expected.footbridge.clone().expect("a crowd raises the flag");
    let crowd = driver.session(1500, 1000, 1.0);
    open_url(&crowd, &format!("{}#{}", server.url(), permalink::encode(&foot)));
    crowd.wait_for("the footbridge flag", "return !!document.getElementById('stability-footbridge');", WAIT);
    let shown = text_of(&crowd, "stability-footbridge");
    assert!(shown.contains(&flag), "{shown} vs {flag}");
    assert!(shown.contains("Hz"), "{shown}");
    for session in [&s, &fresh, &crowd] {
        assert!(severe(session).is_empty(), "{:?}", severe(session));
    }
}

#[test]
fn the_sizing_view_shows_alpha_cr_and_the_first_order_option_stiffens_the_rib() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let demo = Design::demo();
    let plain = size_of(&demo).expect("sizes");
    let mut first = demo.clone();
    first.sizing.rib_for_first_order = true;
    let stiff = size_of(&first).expect("sizes");
    click_id(&s, "case-sizes");
    wait_value(&s, "sizes-alpha-cr", plain.sizing.rib_alpha_cr.expect("estimated"));
    let analysed = plain.sizing.rib_stability.as_ref().expect("analysed");
    wait_value(&s, "sizes-alpha-analysed", analysed.alpha_cr);
    wait_value(&s, "sizes-case0-alpha", analysed.cases[0].arch.alpha_cr);
    assert!(text_of(&s, "sizes-alpha").contains("at least 3 accepted"), "{}", text_of(&s, "sizes-alpha"));
    // the option: one edit, a stiffer rib with alpha_cr >= 10
    s.exec("document.querySelectorAll('details.panel').forEach(d => d.open = true);", vec![]);
    click_id(&s, "sizing-rib-first-order");
    let at_section = stiff.sizing.rib_alpha_cr.expect("estimated");
    assert!(at_section >= 10.0, "{at_section}");
    wait_value(&s, "sizes-alpha-cr", at_section);
    s.wait_for(
        "the least alpha_cr of 10",
        "const e = document.getElementById('sizes-alpha'); return !!e && e.textContent.includes('at least 10 accepted');",
        WAIT,
    );
    let hash = s.exec("return location.hash;", vec![]).as_str().unwrap_or("").to_string();
    s.wait_for(
        "the link to carry the option",
        &format!("return location.hash.startsWith({});", json!(format!("#{}", permalink::encode(&first)))),
        WAIT,
    );
    let _ = hash;
    s.exec("document.getElementById('undo').click();", vec![]);
    wait_value(&s, "sizes-alpha-cr", plain.sizing.rib_alpha_cr.expect("estimated"));
    assert_eq!(
        s.exec("return document.getElementById('sizing-rib-first-order').checked;", vec![]),
        json!(false)
    );
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}
