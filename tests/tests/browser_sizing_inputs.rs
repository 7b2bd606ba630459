//! The sizing inputs in headless Chromium over WebDriver (needs `dist/` built from this
//! tree): a group's family and material chosen in the Sections panel reach the link and
//! come back from it; a family ratio the engine refuses is shown beside the group's
//! inputs and the design stays; the deck weight taken from the cross-section changes the
//! form thrust to the engine's value for that design.
//!
//! Expected values come from the engine (`analyze`, `validate_design`, the presets of
//! `sizing::materials` and `sizing::sections`), never from the page itself.

use serde_json::json;
use springline_statics::arch::sizing::{DeckWeight, GroupSizing};
use springline_statics::arch::validate::validate_design;
use springline_statics::error::{Field, GroupName};
use springline_statics::link::permalink;
use springline_statics::sizing::materials::material_preset;
use springline_statics::sizing::sections::Family;
use springline_statics::{analyze, Design, StaticsError};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};
use std::time::{Duration, Instant};

/// The value of the form control `id`.
fn value_of(s: &Session, id: &str) -> String {
    s.exec("const e = document.getElementById(arguments[0]); return e ? e.value : null;", vec![json!(id)])
        .as_str()
        .unwrap_or("")
        .to_string()
}

/// Waits until the form control `id` holds `expected`.
fn wait_control(s: &Session, id: &str, expected: &str) {
    s.wait_for(
        &format!("#{id} to hold {expected}"),
        &format!(
            "const e = document.getElementById({}); return e !== null && e.value === {};",
            json!(id),
            json!(expected)
        ),
        WAIT,
    );
}

/// Waits until the address's link decodes to `expected` (the link follows edits after a
/// short pause) and returns the link.
fn wait_link(s: &Session, expected: &Design) -> String {
    let start = Instant::now();
    loop {
        let hash = s.exec("return location.hash;", vec![]).as_str().unwrap_or("").to_string();
        if permalink::decode(&hash).as_ref() == Ok(expected) {
            return hash;
        }
        assert!(start.elapsed() < WAIT, "the link never held the expected design; last: {hash}");
        std::thread::sleep(Duration::from_millis(100));
    }
}

fn family_preset(key: &str) -> Family {
    Family::family_presets().into_iter().find(|(k, _)| *k == key).map(|(_, f)| f).expect("family preset")
}

#[test]
fn sizing_inputs_reach_the_link_are_checked_and_the_deck_weight_moves_the_thrust() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    s.exec("document.querySelectorAll('details.panel').forEach(d => d.open = true);", vec![]);
    // the demo sizes its rib as a welded steel box of S355 (`SizingDesign::steel`)
    wait_control(&s, "sizing-rib-family", "box");
    wait_control(&s, "sizing-rib-material", "s355");
    assert!(text_of(&s, "sizing-rib-hint").contains("Use these sizes"));

    // a concrete rectangle: S355 does not suit it, so the material becomes the first
    // concrete preset (C30/37) in the same edit, and only concrete is offered
    set_field(&s, "sizing-rib-family", "concrete");
    wait_control(&s, "sizing-rib-material", "c30-37");
    let offered = s.exec(
        "return [...document.getElementById('sizing-rib-material').options].map(o => o.value);",
        vec![],
    );
    assert_eq!(offered, json!(["c30-37", "c40-50", "c50-60"]));
    // the concrete family's ratios are shown, the box's are gone
    wait_control(&s, "sizing-rib-reinforcement", "0.02");
    assert_eq!(value_of(&s, "sizing-rib-cover"), "0.06");
    assert!(
        s.exec("return document.getElementById('sizing-rib-flange-ratio') === null;", vec![]) == json!(true)
    );
    set_field(&s, "sizing-rib-material", "c40-50");

    let mut sized = Design::demo();
    sized.sizing.rib =
        GroupSizing::sized(family_preset("concrete"), material_preset("c40-50").expect("preset"));
    let link = wait_link(&s, &sized);

    // the link reopens with that sizing in the selects and the ratio fields
    let fresh = driver.session(1500, 1000, 1.0);
    open_url(&fresh, &format!("{}{}", server.url(), link));
    wait_control(&fresh, "sizing-rib-family", "concrete");
    wait_control(&fresh, "sizing-rib-material", "c40-50");
    assert_eq!(value_of(&fresh, "sizing-rib-reinforcement"), "0.02");

    // 0.1 of reinforcement is beyond EN 1992-1-1 9.5.2(3): the engine refuses it
    let mut too_much = sized.clone();
    too_much.sizing.rib.family =
        Some(Family::ConcreteRect { width_over_depth: 1.0, reinforcement_ratio: 0.1, cover: 0.06 });
    let Err(StaticsError::Invalid(problems)) = validate_design(&too_much) else {
        panic!("the engine accepts 0.1 of reinforcement")
    };
    let problem = problems
        .iter()
        .find(|p| p.involves(Field::Sizing(GroupName::Rib)))
        .expect("a problem of the rib sizing");
    set_field(&s, "sizing-rib-reinforcement", "0.1");
    s.wait_for(
        "the refusal beside the rib's sizing",
        "const e = document.getElementById('sizing-rib-error'); return e && e.textContent.length > 0",
        WAIT,
    );
    let shown = text_of(&s, "sizing-rib-error");
    assert!(shown.contains(&problem.message), "{shown} vs {}", problem.message);
    assert!(shown.contains("0.04"), "{shown}");
    // the design stays: the link still holds it and so does the analysis
    assert_eq!(
        permalink::decode(s.exec("return location.hash;", vec![]).as_str().unwrap_or("")),
        Ok(sized.clone())
    );
    let sized_thrust = analyze(&sized).expect("the sized design analyses").form.thrust;
    wait_value(&s, "result-thrust", sized_thrust);

    // the deck weight from the cross-section: the slab, cross-girders and other dead load
    // (7.48 kN/m2 with the defaults) replace the typed 6.25 kN/m2
    set_field(&s, "deck-weight", "cross-section");
    let mut heavier = sized.clone();
    heavier.sizing.deck_section.weight = DeckWeight::CrossSection;
    let expected = analyze(&heavier).expect("the cross-section design analyses").form.thrust;
    assert!(expected > 1.01 * sized_thrust, "{expected} vs {sized_thrust}: the heavier deck must show");
    wait_value(&s, "result-thrust", expected);
    wait_link(&s, &heavier);
    assert!(text_of(&s, "deck-weight-counted").contains("7.481"), "{}", text_of(&s, "deck-weight-counted"));

    // a least block thickness out of the engine's range: refused under the ground fields
    set_field(&s, "foundation-thickness", "0.05");
    s.wait_for(
        "the refusal under the ground fields",
        "const e = document.getElementById('foundation-error'); return e && e.textContent.includes('thrust-block thickness')",
        WAIT,
    );
    std::fs::write(screenshots_dir().join("sizing-inputs.png"), s.screenshot()).expect("screenshot");
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
    assert!(severe(&fresh).is_empty(), "{:?}", severe(&fresh));
}
