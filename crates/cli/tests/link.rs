//! `springline link` and `springline analyze --link`, run as the built binary: a link
//! opens to the same analysis as its design file, and every bad link gives a clear
//! message on standard error and a non-zero exit.

use std::io::Write;
use std::process::{Command, Output, Stdio};

/// Runs the binary with `args`, feeding `stdin`.
fn run(args: &[&str], stdin: &str) -> Output {
    let mut child = Command::new(env!("CARGO_BIN_EXE_springline"))
        .args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("the springline binary starts");
    if let Some(mut input) = child.stdin.take() {
        // a command that does not read stdin may close it early: not an error here
        let _ = input.write_all(stdin.as_bytes());
    }
    child.wait_with_output().expect("the springline binary finishes")
}

fn text(bytes: &[u8]) -> String {
    String::from_utf8_lossy(bytes).into_owned()
}

fn demo_json() -> String {
    let out = run(&["demo"], "");
    assert!(out.status.success());
    text(&out.stdout)
}

fn demo_link() -> String {
    let out = run(&["link", "-"], &demo_json());
    assert!(out.status.success(), "{}", text(&out.stderr));
    text(&out.stdout).trim().to_string()
}

/// A bad link: non-zero exit, nothing on stdout, the reason on stderr.
fn refused(link: &str) -> String {
    let out = run(&["analyze", "--link", link], "");
    let err = text(&out.stderr);
    assert!(!out.status.success(), "'{link}' was accepted");
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
    let out = run(&["analyze", "--link"], "");
    assert!(!out.status.success());
    assert!(text(&out.stderr).contains("usage: springline analyze"), "{}", text(&out.stderr));
    let out = run(&["link"], "");
    assert!(!out.status.success());
    assert!(text(&out.stderr).contains("usage: springline link"));
    // a design with a defect is not linked (its link would not open)
    let bad = demo_json().replace("\"panels\": 12", "\"panels\": 1");
    assert_ne!(bad, demo_json());
    let out = run(&["link", "-"], &bad);
    let err = text(&out.stderr);
    assert!(!out.status.success() && out.stdout.is_empty());
    assert!(err.contains("cannot be linked") && err.contains("panels"), "{err}");
}
