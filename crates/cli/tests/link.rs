//! `springline link` and `springline analyze --link`, run as the built binary: a link
//! opens to the same analysis as its design file, and every bad link gives a clear
//! message on standard error and exit code 1.

mod common;

use common::{demo_json, run, text};

fn demo_link() -> String {
    let out = run(&["link", "-"], &demo_json());
    assert!(out.status.success(), "{}", text(&out.stderr));
    text(&out.stdout).trim().to_string()
}

/// A bad link: exit 1 (refused input), nothing on stdout, the reason on stderr.
fn refused(link: &str) -> String {
    let out = run(&["analyze", "--link", link], "");
    let err = text(&out.stderr);
    assert_eq!(out.status.code(), Some(1), "'{link}': {err}");
    assert!(out.stdout.is_empty(), "'{link}' printed {}", text(&out.stdout));
    assert!(err.starts_with("springline: cannot read link: "), "{err}");
    err
}

#[test]
fn link_prints_a_short_fragment() {
    let link = demo_link();
    assert!(link.starts_with("#s2."), "{link}");
    assert!(link.len() < 2_000, "{} characters", link.len());
    assert!(link[1..].bytes().all(|b| b.is_ascii_alphanumeric() || b"._-".contains(&b)), "{link}");
}

#[test]
fn analyze_link_equals_analyze_file() {
    let link = demo_link();
    let from_file = run(&["analyze", "-"], &demo_json());
    assert!(from_file.status.success());
    for given in [link.clone(), format!("http://localhost:8080/index.html{link}"), link[1..].to_string()] {
        let from_link = run(&["analyze", "--link", &given], "");
        assert!(from_link.status.success(), "{}", text(&from_link.stderr));
        assert_eq!(text(&from_link.stdout), text(&from_file.stdout), "{given}");
    }
    let json: serde_json::Value = serde_json::from_slice(&from_file.stdout).expect("JSON");
    assert!(json["form"]["thrust"].as_f64().is_some_and(|h| h > 0.0));
}

#[test]
fn bad_links_fail_with_a_clear_message() {
    let link = demo_link();
    assert!(refused(&link[..link.len() / 2]).contains("cut"));
    assert!(refused(&link[..link.len() - 1]).contains("cut"));
    assert!(refused("#s7.AAAA").contains("newer version"));
    assert!(refused("hello").contains("not a Springline design link"));
    assert!(refused("").contains("holds no design"));
    assert!(refused(&format!("#s1.{}", "A".repeat(9_000))).contains("refused"));
    let mut damaged = link.clone();
    damaged.replace_range(40..41, if &link[40..41] == "Q" { "R" } else { "Q" });
    refused(&damaged);
}

#[test]
fn usage_errors_and_invalid_designs_fail() {
    // usage errors are clap's (exit 2), worded by clap
    let out = run(&["analyze", "--link"], "");
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("a value is required for '--link <LINK>'"), "{}", text(&out.stderr));
    let out = run(&["link"], "");
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("Usage: springline link"), "{}", text(&out.stderr));
    // a design with a defect is not linked (its link would not open)
    let bad = demo_json().replace("\"panels\": 12", "\"panels\": 1");
    assert_ne!(bad, demo_json());
    let out = run(&["link", "-"], &bad);
    let err = text(&out.stderr);
    assert!(out.status.code() == Some(1) && out.stdout.is_empty());
    // the field as the Arch panel names it, never its file path (issue 10, "Calm interaction")
    assert!(
        err.contains("cannot be linked") && err.contains("the design has a problem: arch panels: "),
        "{err}"
    );
}

#[test]
fn analyze_summary_prints_the_summary_of_the_full_analysis() {
    let full = run(&["analyze", "-"], &demo_json());
    let summary = run(&["analyze", "--summary", "-"], &demo_json());
    assert!(full.status.success() && summary.status.success(), "{}", text(&summary.stderr));
    let full: serde_json::Value = serde_json::from_slice(&full.stdout).expect("JSON");
    let mut summary: serde_json::Value = serde_json::from_slice(&summary.stdout).expect("JSON");
    // the summary adds the traffic's key numbers, which the full report holds in full
    let traffic = summary.as_object_mut().and_then(|o| o.remove("traffic")).expect("traffic in the summary");
    assert_eq!(traffic["thrust"], full["traffic"]["frame"]["thrust"]);
    // ... and the other actions' key numbers, which the full report holds in `actions`
    // and in the frame's traffic report (the deflection check)
    let actions = summary.as_object_mut().and_then(|o| o.remove("actions")).expect("actions in the summary");
    assert_eq!(actions["braking"], full["actions"]["braking"]);
    assert_eq!(actions["cases"], full["actions"]["cases"]);
    assert_eq!(actions["deflection"], full["traffic"]["frame"]["deflection"]);
    assert_eq!(full["summary"], summary);
    // the form thrust is the form's pole distance: one number, one name
    assert_eq!(summary["form_thrust"], full["form"]["thrust"]);
    assert_eq!(summary["springings"][0]["case"], "dead");
}
