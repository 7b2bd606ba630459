//! Working the design live in the browser: dragging, permalinks, undo / redo and units,
//! in Debian's headless Chromium (see browser.rs for the set-up these tests share).

use base64::Engine;
use serde_json::json;
use springline_statics::link::permalink;
use springline_statics::{analyze, Design};
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

/// Drags the crown up by `dy` CSS pixels; returns the elevation scale (px per m).
fn drag_crown(s: &Session, dy: f64) -> f64 {
    let a = analyze(&Design::demo()).expect("demo");
    let t = transform(s, "elevation");
    let c = to_px(t, a.form.crown.x, a.form.crown.y);
    let o = canvas_origin(s, "elevation");
    let from = (o.0 + c.0, o.1 + c.1);
    // whole pixels, so the dragged distance is exactly dy
    let from = (from.0.round(), from.1.round());
    s.drag(from, (from.0, from.1 - dy), 8);
    t.0
}

fn rise_shown(s: &Session) -> f64 {
    shown_number(&text_of(s, "result-rise"))
}

fn wait_results_change(s: &Session, before: &str) {
    s.wait_for(
        "the results to change",
        &format!("return document.querySelector('.results-panel').innerText !== {}", json!(before)),
        WAIT,
    );
}

#[test]
fn dragging_the_crown_changes_the_rise_by_the_dragged_distance_and_undo_redo_restore_it() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let before_text = results_text(&s);
    let rise0 = rise_shown(&s);
    let dy = 40.0;
    // downwards: the demo's crown sits just under the deck, so upwards soon meets it
    let scale = drag_crown(&s, -dy);
    wait_results_change(&s, &before_text);
    let after_text = results_text(&s);
    let rise1 = rise_shown(&s);
    let expected = rise0 - dy / scale;
    // a pixel's worth, plus the display rounding of 0.005 m
    assert!(
        (rise1 - expected).abs() <= 1.0 / scale + 0.005,
        "rise {rise1} m, expected {expected} m (scale {scale} px/m)"
    );
    // one drag is one undo step: undo restores the results exactly, redo re-applies them
    s.exec("document.getElementById('undo').click();", vec![]);
    wait_results_change(&s, &after_text);
    assert_eq!(results_text(&s), before_text, "undo restores the previous results exactly");
    s.exec("document.getElementById('redo').click();", vec![]);
    wait_results_change(&s, &before_text);
    assert_eq!(results_text(&s), after_text, "redo re-applies the drag");
    // keyboard shortcuts do the same
    s.exec(
        "document.dispatchEvent(new KeyboardEvent('keydown', {key: 'z', ctrlKey: true, bubbles: true}));",
        vec![],
    );
    wait_results_change(&s, &after_text);
    assert_eq!(results_text(&s), before_text);
    s.exec("document.dispatchEvent(new KeyboardEvent('keydown', {key: 'z', ctrlKey: true, shiftKey: true, bubbles: true}));", vec![]);
    wait_results_change(&s, &before_text);
    assert_eq!(results_text(&s), after_text);
    assert!(severe(&s).is_empty());
}

#[test]
fn a_permalink_opened_in_a_fresh_profile_reproduces_the_results() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let mut url;
    let text;
    {
        let s = driver.session(1500, 1000, 1.0);
        open(&s, &server);
        let before = results_text(&s);
        set_field(&s, "panels", "14");
        wait_results_change(&s, &before);
        set_field(&s, "springing-left", "74.5");
        s.wait_for("the panels change", "return document.getElementById('result-thrust') !== null", WAIT);
        text = results_text(&s);
        // the fragment follows the design after a short pause, without new history entries
        let history_before = s.exec("return history.length", vec![]);
        // poll until the (debounced) address carries both edits
        let deadline = std::time::Instant::now() + WAIT;
        let decoded = loop {
            let href = s.exec("return location.href", vec![]);
            url = href.as_str().unwrap_or("").to_string();
            if let Ok(d) = permalink::decode(&url) {
                if d.panels == 14 && d.springing_left_level == 74.5 {
                    break d;
                }
            }
            assert!(
                std::time::Instant::now() < deadline,
                "the address never carried the edited design: {url}"
            );
            std::thread::sleep(std::time::Duration::from_millis(50));
        };
        assert_eq!(decoded.deck, Design::demo().deck, "the rest of the design travels unchanged");
        assert_eq!(s.exec("return history.length", vec![]), history_before, "no history entries added");
        assert!(url.len() < 2000, "link under 2,000 characters: {}", url.len());
    }
    let fresh = driver.session(1500, 1000, 1.0);
    open_url(&fresh, &url);
    assert_eq!(results_text(&fresh), text, "identical results text from the link");
    assert!(severe(&fresh).is_empty());
}

/// Links that must not open: corrupted, truncated, and one that would inflate far past
/// the cap (2 MB of zeros, deflated).
fn bad_links() -> Vec<(&'static str, String)> {
    let good = permalink::encode(&Design::demo());
    let mut corrupted = good.clone().into_bytes();
    let mid = corrupted.len() / 2;
    corrupted[mid] = if corrupted[mid] == b'A' { b'B' } else { b'A' };
    corrupted[mid + 1] = if corrupted[mid + 1] == b'x' { b'y' } else { b'x' };
    let truncated = good[..good.len() * 2 / 3].to_string();
    let bomb = miniz_oxide::deflate::compress_to_vec_zlib(&vec![0u8; 2_000_000], 10);
    let inflating = format!("s1.{}", base64::engine::general_purpose::URL_SAFE_NO_PAD.encode(bomb));
    vec![
        ("corrupted", String::from_utf8(corrupted).unwrap_or_default()),
        ("truncated", truncated),
        ("over-inflating", inflating),
    ]
}

#[test]
fn bad_links_show_a_message_open_the_demo_first_and_leave_an_open_design_alone() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let demo_text = {
        let s = driver.session(1500, 1000, 1.0);
        open(&s, &server);
        results_text(&s)
    };
    for (what, link) in bad_links() {
        assert!(permalink::decode(&link).is_err(), "{what} link must be refused by the codec");
        // on first load: the message, and the demo design
        let s = driver.session(1500, 1000, 1.0);
        open_url(&s, &format!("{}#{link}", server.url()));
        let notice = s.wait_for(
            &format!("the notice on first load of the {what} link"),
            "const n = document.getElementById('notice'); return n ? n.innerText : null;",
            WAIT,
        );
        assert!(notice.as_str().unwrap_or("").contains("could not be opened"), "{what}: {notice}");
        assert_eq!(results_text(&s), demo_text, "{what}: the demo opens");
        // pasted while a design is open: that design stays
        let before = results_text(&s);
        set_field(&s, "panels", "10");
        wait_results_change(&s, &before);
        s.exec(
            "document.getElementById('notice') && document.querySelector('#notice button').click();",
            vec![],
        );
        let open_text = results_text(&s);
        // the address bar follows the open design (debounced) before the link is pasted
        s.wait_for(
            "the address to follow the open design",
            &format!("return location.hash.startsWith('#s2.') && location.hash.slice(1) !== {}", json!(link)),
            WAIT,
        );
        s.exec("location.hash = arguments[0];", vec![json!(link)]);
        s.wait_for(
            &format!("the notice after pasting the {what} link"),
            "return document.getElementById('notice') !== null",
            WAIT,
        );
        assert_eq!(results_text(&s), open_text, "{what}: the open design is unchanged");
        assert!(severe(&s).is_empty(), "{what}: no console errors");
    }
}

#[test]
fn switching_units_changes_every_force_by_the_kip_factor() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    let read = |s: &Session| -> Vec<(String, String)> {
        let v = s.exec(
            "return [...document.querySelectorAll('td[data-quantity=force]')].map(e => [e.id, e.textContent]);",
            vec![],
        );
        v.as_array()
            .cloned()
            .unwrap_or_default()
            .iter()
            .map(|p| (p[0].as_str().unwrap_or("").to_string(), p[1].as_str().unwrap_or("").to_string()))
            .collect()
    };
    // (reading the results waits for the traffic block, computed once edits pause)
    let before = results_text(&s);
    let si = read(&s);
    assert!(si.len() >= 8, "forces shown: {si:?}");
    assert!(si.iter().all(|(_, t)| t.ends_with("kN")));
    s.exec("document.getElementById('units').click();", vec![]);
    wait_results_change(&s, &before);
    let us = read(&s);
    assert_eq!(si.len(), us.len());
    // 1 kip = 4.4482216152605 kN (NIST SP 811, appendix B); 4 significant figures shown
    for ((id, a), (_, b)) in si.iter().zip(&us) {
        assert!(b.ends_with("kip"), "{id}: {b}");
        let (kn, kip) = (shown_number(a), shown_number(b));
        let expected = kn / 4.448_221_615_260_5;
        assert!(
            (kip - expected).abs() <= 1e-3 * expected.abs() + 0.06,
            "{id}: {kn} kN -> {kip} kip, expected {expected}"
        );
    }
    // lengths switch too
    assert!(text_of(&s, "result-span").ends_with("ft"));
}

/// "Copy link" copied the address bar, which follows an edit only after a pause: an edit
/// followed at once by a copy shared the design before the edit. The clipboard is stubbed
/// in the page to capture what is copied.
#[test]
fn copy_link_right_after_an_edit_copies_the_edited_design() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1500, 1000, 1.0);
    open(&s, &server);
    s.exec(
        "window.copiedLinks = [];
         Object.defineProperty(navigator, 'clipboard', { configurable: true, value: {
           writeText: text => { window.copiedLinks.push(text); return Promise.resolve(); } } });",
        vec![],
    );
    // edit and copy in one script, so the address bar has no time to follow
    let at_copy = s.exec(
        "const e = document.getElementById('panels'); e.value = '14';
         e.dispatchEvent(new Event('change', { bubbles: true }));
         document.getElementById('copy-link').click();
         return [location.href, window.copiedLinks];",
        vec![],
    );
    let address = at_copy[0].as_str().unwrap_or("").to_string();
    let copied = at_copy[1].as_array().cloned().unwrap_or_default();
    assert_eq!(copied.len(), 1, "one link copied: {copied:?}");
    let link = copied[0].as_str().unwrap_or("");
    assert!(link.starts_with(&server.url()), "a whole link to this page: {link}");
    let mut edited = Design::demo();
    edited.panels = 14;
    assert_eq!(permalink::decode(link).as_ref(), Ok(&edited), "the copied link opens the edited design");
    // what the address bar held at that moment (the old copy's source) is not it yet
    assert_ne!(permalink::decode(&address).ok(), Some(edited), "the address had not followed: {address}");
    assert!(severe(&s).is_empty());
}
