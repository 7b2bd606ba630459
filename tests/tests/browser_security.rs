//! The page's Content Security Policy and user text, and saved options across a browser
//! restart, in Debian's headless Chromium (see browser.rs for the set-up these share).

use serde_json::{json, Value};
use springline_statics::arch::design::Crown;
use springline_statics::link::comparison::{encode_comparison, tidy_name, Comparison, NamedDesign};
use springline_statics::link::permalink;
use springline_statics::Design;
use springline_tests::page::*;
use springline_tests::serve::StaticServer;
use springline_tests::webdriver::{Driver, Session};

/// Markup that would run script if the page ever put it in as HTML.
const HOSTILE: &str = "<img src=x onerror=\"window.__ran='img'\"><script>window.__ran='script'</script>";

fn ran(s: &Session) -> Value {
    s.exec("return window.__ran === undefined ? null : window.__ran;", vec![])
}

#[test]
fn markup_in_a_name_is_shown_as_text_and_the_policy_refuses_inline_script() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let s = driver.session(1400, 900, 1.0);
    let mut design = Design::demo();
    design.name = format!("Gorge {HOSTILE}");
    open_url(&s, &format!("{}#{}", server.url(), permalink::encode(&design)));
    // the name is text: shown as typed, no element made of it, nothing ran
    assert_eq!(text_of(&s, "design-name"), design.name);
    let made = s.exec("return document.querySelectorAll('.design-name *, img[src=\"x\"]').length;", vec![]);
    assert_eq!(made, json!(0));
    assert_eq!(ran(&s), Value::Null);
    // the app itself raised no policy violation while loading and drawing
    let violations: Vec<String> =
        severe(&s).into_iter().filter(|m| m.contains("Content Security Policy")).collect();
    assert!(violations.is_empty(), "{violations:?}");

    // the policy is in force: an injected inline script is refused and reported
    let policy = s.exec(
        "const m = document.querySelector('meta[http-equiv=\"Content-Security-Policy\"]'); return m && m.content;",
        vec![],
    );
    let policy = policy.as_str().unwrap_or_default().to_string();
    assert!(
        policy.contains("script-src 'self' 'wasm-unsafe-eval';") && policy.contains("default-src 'self';"),
        "{policy}"
    );
    assert!(policy.contains("connect-src 'self';") && policy.contains("object-src 'none'"), "{policy}");
    s.exec(
        "window.__violations = [];
         document.addEventListener('securitypolicyviolation', e => window.__violations.push(e.effectiveDirective));
         const el = document.createElement('script');
         el.textContent = \"window.__ran = 'inline'\";
         document.body.appendChild(el);",
        vec![],
    );
    let reported = s.wait_for(
        "the violation report",
        "return window.__violations.length > 0 && window.__violations.join(' ');",
        WAIT,
    );
    assert!(reported.as_str().unwrap_or_default().contains("script-src"), "{reported}");
    assert_eq!(ran(&s), Value::Null, "the injected script must not run");

    // option names of a comparison link are text too
    let mut higher = Design::demo();
    higher.crown = Crown::Rise { rise: 21.0 };
    let comparison = Comparison {
        options: vec![
            NamedDesign {
                name: "<b onmouseover=\"window.__ran='b'\">Base</b>".into(),
                design: Design::demo(),
            },
            NamedDesign { name: HOSTILE.into(), design: higher },
        ],
        open: 0,
    };
    let link = encode_comparison(&comparison).expect("encodes");
    open_url(&s, &format!("{}#{link}", server.url()));
    s.wait_for("the comparison", "return document.getElementById('cmp-name-1') !== null;", WAIT);
    // names shown as the link keeps them (at most 60 characters)
    assert_eq!(text_of(&s, "cmp-name-0"), tidy_name(&comparison.options[0].name));
    assert_eq!(text_of(&s, "cmp-name-1"), tidy_name(&comparison.options[1].name));
    assert_eq!(s.exec("return document.querySelectorAll('b, img[src=\"x\"]').length;", vec![]), json!(0));
    assert_eq!(ran(&s), Value::Null);
}

#[test]
fn saved_options_survive_a_browser_restart() {
    let server = StaticServer::start(&dist());
    let driver = Driver::start();
    let profile = std::env::temp_dir().join(format!("springline-kept-profile-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&profile);
    {
        let s = driver.session_in(1400, 1000, 1.0, profile.clone(), true);
        open(&s, &server);
        set_field(&s, "option-name", "Kept across a restart");
        s.exec("document.getElementById('option-name').dispatchEvent(new Event('input'));", vec![]);
        click_id(&s, "save-option");
        // only a browser that keeps running keeps its session storage
        s.exec("sessionStorage.setItem('still-running', 'yes');", vec![]);
        s.wait_for(
            "the option stored",
            "const v = localStorage.getItem('springline.options'); return !!v && v.includes('Kept across a restart');",
            WAIT,
        );
        // the session ends here: the browser quits and writes its storage to the profile
    }
    let s = driver.session_in(1400, 1000, 1.0, profile, false);
    open(&s, &server);
    // a new browser: the session storage of the first is gone, its local storage kept
    assert_eq!(s.exec("return sessionStorage.getItem('still-running');", vec![]), Value::Null);
    let stored = s.exec("return localStorage.getItem('springline.options');", vec![]);
    assert!(stored.as_str().unwrap_or_default().contains("Kept across a restart"), "{stored}");
    s.wait_for(
        "the option listed after the restart",
        "const p = document.getElementById('options-panel'); return !!p && p.innerText.includes('Kept across a restart');",
        WAIT,
    );
}
