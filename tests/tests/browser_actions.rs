//! The Temperature and other actions panel and the Other actions block, in headless
//! Chromium over WebDriver (needs `dist/` built from this tree): the block shows the
//! engine's braking force and what each action does alone; an edited temperature
//! changes the numbers as the engine says; a value out of range is refused beside the
//! field and the design stays as it was.
//!
//! Expected values come from the engine (`arch::actions::action_results`), never from
//! the page itself.

use serde_json::json;
use springline_statics::arch::actions::{action_results, ActionsReport};
use springline_statics::arch::design::RibSystem;
use springline_statics::link::permalink;
use springline_statics::{Design, ValidDesign};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

fn actions_of(design: &Design) -> ActionsReport {
    action_results(&ValidDesign::new(design).expect("valid")).expect("actions solve")
}

/// The SI value a cell carries.
fn data_value(s: &Session, id: &str) -> f64 {
    s.exec(
        "const e = document.getElementById(arguments[0]); return e ? +e.dataset.value : null;",
        vec![json!(id)],
    )
    .as_f64()
    .unwrap_or_else(|| panic!("no value in #{id}"))
}

#[test]
fn the_actions_block_shows_the_engines_numbers_and_follows_an_edit() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    // a two-hinged variant of the demo: temperature stresses it
    let mut d = Design::demo();
    d.rib_system = RibSystem::TwoHinged;
    open_url(&s, &format!("{}#{}", server.url(), permalink::encode(&d)));
    let r = actions_of(&d);
    // braking: EN 1991-2 eq. 4.6 on the demo's 164 m deck, 802.8 kN (worked in arch::actions)
    wait_value(&s, "actions-braking", 802.8);
    let rise = r.cases.iter().find(|c| c.case == "temperature rise").expect("rise");
    assert!(rise.left.thrust.abs() > 1.0, "a two-hinged rib takes a temperature thrust");
    wait_value(&s, "action-temperature-rise-h-left", rise.left.thrust);
    let erection = r.cases.iter().find(|c| c.case == "erection (bare rib)").expect("erection");
    assert!(
        (data_value(&s, "action-erection-h-left") - erection.left.thrust).abs() < 1e-9 * erection.left.thrust
    );
    // the rise halved: the engine's number for the edited design (linear: half the thrust)
    s.exec("document.getElementById('actions-panel').open = true;", vec![]);
    set_field(&s, "temperature-rise", "20.5");
    let mut edited = d.clone();
    edited.actions.temperature.expansion = 20.5;
    let r2 = actions_of(&edited);
    let rise2 = r2.cases.iter().find(|c| c.case == "temperature rise").expect("rise");
    assert!((rise2.left.thrust - rise.left.thrust / 2.0).abs() < 1e-9 * rise.left.thrust.abs());
    wait_value(&s, "action-temperature-rise-h-left", rise2.left.thrust);
    assert!(text_of(&s, "temperature-clause").starts_with("own values, edited from"));
    // out of range: refused beside the field, the numbers stay
    set_field(&s, "temperature-rise", "-5");
    s.wait_for(
        "the refusal beside the rise",
        "const e = document.getElementById('temperature-rise-error'); return e && e.textContent.length > 0",
        WAIT,
    );
    assert!(
        (data_value(&s, "action-temperature-rise-h-left") - rise2.left.thrust).abs()
            < 1e-9 * rise2.left.thrust.abs()
    );
    // a preset brings its values back (EN 1991-1-5: 41 K)
    set_field(&s, "temperature-preset", "en-steel");
    wait_value(&s, "action-temperature-rise-h-left", rise.left.thrust);
    // the deflection check, once the traffic report is in
    s.wait_for("the deflection check", "return document.getElementById('deflection-check') !== null", WAIT);
    assert!(text_of(&s, "deflection-check").contains("span / 800"));
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}

/// Each action has its button in the load picker: choosing one shows that action alone
/// in the drawings and the results table (the springing forces are the engine's for the
/// action case), and erection draws the bare rib.
#[test]
fn the_load_picker_shows_each_action_alone() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 900, 1.0);
    let mut d = Design::demo();
    d.rib_system = RibSystem::Fixed;
    open_url(&s, &format!("{}#{}", server.url(), permalink::encode(&d)));
    let r = actions_of(&d);
    for (button, case) in
        [("case-temperature-fall", "temperature fall"), ("case-erection", "erection (bare rib)")]
    {
        s.exec("document.getElementById(arguments[0]).click();", vec![json!(button)]);
        let expected = r.cases.iter().find(|c| c.case == case).expect("case");
        s.wait_for(
            &format!("{button} pressed"),
            &format!(
                "return document.getElementById({}).getAttribute('aria-pressed') === 'true'",
                json!(button)
            ),
            WAIT,
        );
        wait_value(&s, "result-left-h", expected.left.thrust);
        // a fixed rib's springing moment is in the table too
        let shown_moment = s
            .exec(
                "const e = document.getElementById('result-left-m'); return e ? +e.dataset.value : null;",
                vec![],
            )
            .as_f64();
        if let Some(m) = shown_moment {
            assert!((m - expected.left.moment).abs() <= 1e-6 * expected.left.moment.abs().max(1.0), "{m}");
        }
        let title = text_of(&s, "case-description");
        assert!(!title.is_empty(), "the case is described");
        let name = button.trim_start_matches("case-");
        std::fs::write(screenshots_dir().join(format!("action-{name}.png")), s.screenshot())
            .expect("screenshot");
    }
    // the view part of the link names the action shown, and a link opens on it
    s.wait_for(
        "the address to name the erection case",
        "return location.hash.endsWith('~view:c=erection')",
        WAIT,
    );
    let fresh = driver.session(1500, 900, 1.0);
    open_url(&fresh, &format!("{}#{}~view:c=braking", server.url(), permalink::encode(&d)));
    fresh.wait_for(
        "the braking button pressed",
        "return document.getElementById('case-braking').getAttribute('aria-pressed') === 'true'",
        WAIT,
    );
    let braking = r.cases.iter().find(|c| c.case == "braking").expect("braking");
    wait_value(&fresh, "result-left-h", braking.left.thrust);
    // a link naming the vehicle at x = 80 m puts it there
    let third = driver.session(1500, 900, 1.0);
    open_url(&third, &format!("{}#{}~view:c=vehicle-80", server.url(), permalink::encode(&d)));
    third.wait_for(
        "the vehicle at x = 80 m",
        "const c = document.getElementById('elevation'); return c.dataset.vehicleX !== undefined && Math.abs(+c.dataset.vehicleX - 80) < 1e-9",
        WAIT,
    );
    let errors = severe(&s);
    assert!(errors.is_empty(), "{errors:?}");
}
