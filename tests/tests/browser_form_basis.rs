//! The form-finding basis in headless Chromium over WebDriver (needs `dist/` built from
//! this tree): choosing "as built" in the Arch panel finds the form for the frame's forces
//! (the results show the engine's as-built thrust and basis), the words under the select
//! say what the basis assumes, the link carries the basis and reopens with it, undo
//! brings the panel-load form back, and a form whose springings take different thrusts
//! shows each.
//!
//! Expected values come from the engine (`analyze`), never from the page itself.

use serde_json::json;
use springline_statics::arch::form::Basis;
use springline_statics::link::permalink;
use springline_statics::{analyze, Design};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::Driver;

#[test]
fn the_as_built_basis_is_chosen_shown_linked_and_undone() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    s.exec("document.querySelectorAll('details.panel').forEach(d => d.open = true);", vec![]);
    let demo = Design::demo();
    let panel_thrust = analyze(&demo).expect("the demo analyses").form.thrust;
    wait_value(&s, "result-thrust", panel_thrust);
    assert!(text_of(&s, "form-basis-words").contains("Panel loads"), "{}", text_of(&s, "form-basis-words"));

    set_field(&s, "form-basis", "as-built");
    let mut built = demo.clone();
    built.form.basis = Basis::AsBuilt;
    let built_thrust = analyze(&built).expect("the as-built demo analyses").form.thrust;
    assert!(
        (built_thrust - panel_thrust).abs() > 1.0,
        "{built_thrust} vs {panel_thrust}: the change must show"
    );
    wait_value(&s, "result-thrust", built_thrust);
    let words = text_of(&s, "form-basis-words");
    assert!(words.contains("completed structure") && words.contains("no erection sequence"), "{words}");
    // the demo is braced: the words say what that does to the diagonals
    assert!(words.contains("diagonals may carry more"), "{words}");
    s.wait_for(
        "the form-finding row to name the basis",
        "const e = document.getElementById('result-form'); return e && e.textContent.includes('as built');",
        WAIT,
    );
    // the link carries the basis, and a fresh page opens on it
    s.wait_for(
        "the link to carry the basis",
        &format!(
            "return location.hash.length > 2 && location.hash === {};",
            json!(format!("#{}", permalink::encode(&built)))
        ),
        WAIT,
    );
    let hash = s.exec("return location.hash;", vec![]).as_str().unwrap_or("").to_string();
    assert_eq!(permalink::decode(&hash), Ok(built.clone()));
    let fresh = driver.session(1500, 1000, 1.0);
    open_url(&fresh, &format!("{}{}", server.url(), hash));
    wait_value(&fresh, "result-thrust", built_thrust);
    assert_eq!(fresh.exec("return document.getElementById('form-basis').value;", vec![]), json!("as-built"));
    std::fs::write(screenshots_dir().join("form-basis.png"), s.screenshot()).expect("screenshot");

    // undo: the panel-load form again
    s.exec("document.getElementById('undo').click();", vec![]);
    wait_value(&s, "result-thrust", panel_thrust);
    assert_eq!(s.exec("return document.getElementById('form-basis').value;", vec![]), json!("panel-loads"));
    // the demo's three-hinged form has one thrust; a two-hinged rib found as built takes
    // horizontal forces from the deck held at its left seat: a thrust at each springing
    assert_eq!(s.exec("return document.getElementById('result-thrust-left');", vec![]), json!(null));
    set_field(&s, "rib-system", "two");
    set_field(&s, "form-basis", "as-built");
    let mut two = demo.clone();
    two.rib_system = springline_statics::arch::design::RibSystem::TwoHinged;
    two.form.basis = Basis::AsBuilt;
    let form = analyze(&two).expect("the two-hinged as-built demo analyses").form;
    assert!((form.reaction_left.fx + form.reaction_right.fx).abs() > 100.0, "{form:?}");
    wait_value(&s, "result-thrust-left", form.reaction_left.fx);
    wait_value(&s, "result-thrust-right", -form.reaction_right.fx);
    wait_value(&s, "result-thrust", form.thrust);
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
    assert!(severe(&fresh).is_empty(), "{:?}", severe(&fresh));
}
