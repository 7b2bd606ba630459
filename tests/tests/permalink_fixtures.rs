//! Every committed permalink fixture still opens to its stored design and results.
//!
//! `tests/fixtures/links/` holds, for each fixture `NAME` (prefix `vN-`: link format `sN`):
//!
//! * `NAME.link`: the fragment as `springline link` printed it. Never rewritten: links of
//!   every format ever shipped are out in the world and must keep opening.
//! * `NAME.design.json`: the design the link must open to (pretty JSON, compared as text,
//!   so every number is compared bit for bit).
//! * `NAME.results.json`: key analysis numbers of that design (thrust, springing
//!   reactions, form-finding iterations, largest rib moment, frame support reactions).
//!
//! Refreshing is explicit and shows up in the diff for review:
//!
//! ```text
//! SPRINGLINE_REFRESH_LINK_FIXTURES=1 cargo test -p springline-tests --test permalink_fixtures -- --ignored refresh
//! ```
//!
//! It writes the `.link` of a current-format fixture only when that file does not exist
//! yet, and rewrites `.design.json` / `.results.json` from the committed links (after a
//! deliberate engine change). Without the variable it changes nothing.

use serde::{Deserialize, Serialize};
use springline_statics::analyze;
use springline_statics::arch::design::{Bracing, Crown, Design, RibSystem};
use springline_statics::link::permalink;
use std::path::{Path, PathBuf};

/// Relative tolerance on stored numbers (the analysis is deterministic; this allows only
/// for a different floating-point library or instruction choice on another machine).
const REL_TOL: f64 = 1e-9;
/// The variable that allows the refresh to write.
const REFRESH_VAR: &str = "SPRINGLINE_REFRESH_LINK_FIXTURES";

/// Key numbers of an analysed design, as stored beside each link.
#[derive(Debug, Serialize, Deserialize)]
struct KeyResults {
    /// Design name.
    design: String,
    /// Funicular constructions made in form finding.
    form_iterations: usize,
    /// Span and rise, m.
    span_m: f64,
    rise_m: f64,
    /// Horizontal thrust H, kN.
    thrust_kn: f64,
    /// Springing reactions (fx, fy), kN.
    reaction_left_kn: [f64; 2],
    reaction_right_kn: [f64; 2],
    /// Largest |M| along the rib of the frame model, dead load, kNm.
    max_abs_rib_moment_knm: f64,
    /// Frame model support reactions under dead load: (node, fx kN, fy kN, mz kNm).
    frame_reactions: Vec<(usize, f64, f64, f64)>,
}

fn key_results(design: &Design) -> KeyResults {
    let a = analyze(design).unwrap_or_else(|e| panic!("{}: {e}", design.name));
    let f = &a.form;
    KeyResults {
        design: design.name.clone(),
        form_iterations: f.iterations,
        span_m: f.span,
        rise_m: f.rise,
        thrust_kn: f.thrust,
        reaction_left_kn: [f.reaction_left.fx, f.reaction_left.fy],
        reaction_right_kn: [f.reaction_right.fx, f.reaction_right.fy],
        max_abs_rib_moment_knm: a.residual_rib_moments.max_abs,
        frame_reactions: a.frame.solution.cases[0]
            .reactions
            .iter()
            .map(|r| (r.node, r.fx, r.fy, r.mz))
            .collect(),
    }
}

fn folder() -> PathBuf {
    springline_tests::workspace_root().join("tests/fixtures/links")
}

/// Names of the committed fixtures (`NAME` of every `NAME.link`), sorted.
fn fixture_names() -> Vec<String> {
    let mut names: Vec<String> = std::fs::read_dir(folder())
        .expect("tests/fixtures/links exists")
        .filter_map(|e| e.ok())
        .filter_map(|e| e.file_name().to_str()?.strip_suffix(".link").map(str::to_string))
        .collect();
    names.sort();
    names
}

fn read(path: &Path) -> String {
    std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

fn pretty<T: Serialize>(value: &T) -> String {
    serde_json::to_string_pretty(value).expect("serialises") + "\n"
}

/// `got` within `REL_TOL` of `want`, relative to |want| or to `scale` (the size of the
/// quantity in this structure) when `want` is near zero.
fn close(what: &str, got: f64, want: f64, scale: f64) {
    let tol = REL_TOL * want.abs().max(scale.abs());
    assert!((got - want).abs() <= tol, "{what}: got {got:e}, stored {want:e} (tolerance {tol:e})");
}

#[test]
fn every_link_fixture_opens_to_its_stored_results() {
    let names = fixture_names();
    assert!(names.len() >= 3, "expected the committed fixtures, found {names:?}");
    for name in names {
        let base = folder().join(&name);
        let link = read(&base.with_extension("link"));
        let design = permalink::decode(&link).unwrap_or_else(|e| panic!("{name}: {e}"));
        // the design, exactly: as text (every f64 by its shortest round-trip form) and as data
        let stored_text = read(&base.with_extension("design.json"));
        assert_eq!(pretty(&design), stored_text, "{name}: the link opens to another design");
        let stored: Design = serde_json::from_str(&stored_text).expect("stored design reads");
        assert_eq!(design, stored, "{name}");
        // the results
        let want: KeyResults =
            serde_json::from_str(&read(&base.with_extension("results.json"))).expect("stored results read");
        let got = key_results(&design);
        let h = want.thrust_kn;
        assert_eq!(got.design, want.design, "{name}");
        assert_eq!(got.form_iterations, want.form_iterations, "{name}: form-finding iterations");
        close(&format!("{name}: span"), got.span_m, want.span_m, want.span_m);
        close(&format!("{name}: rise"), got.rise_m, want.rise_m, want.rise_m);
        close(&format!("{name}: thrust"), got.thrust_kn, h, h);
        for k in 0..2 {
            close(
                &format!("{name}: left reaction {k}"),
                got.reaction_left_kn[k],
                want.reaction_left_kn[k],
                h,
            );
            close(
                &format!("{name}: right reaction {k}"),
                got.reaction_right_kn[k],
                want.reaction_right_kn[k],
                h,
            );
        }
        let moment_scale = h * want.rise_m;
        close(
            &format!("{name}: max rib moment"),
            got.max_abs_rib_moment_knm,
            want.max_abs_rib_moment_knm,
            moment_scale,
        );
        assert_eq!(got.frame_reactions.len(), want.frame_reactions.len(), "{name}: frame supports");
        for (g, w) in got.frame_reactions.iter().zip(&want.frame_reactions) {
            assert_eq!(g.0, w.0, "{name}: frame support node");
            close(&format!("{name}: frame fx at {}", w.0), g.1, w.1, h);
            close(&format!("{name}: frame fy at {}", w.0), g.2, w.2, h);
            close(&format!("{name}: frame mz at {}", w.0), g.3, w.3, moment_scale);
        }
    }
}

#[test]
fn every_readable_format_has_a_fixture() {
    let names = fixture_names();
    for tag in permalink::READABLE_FORMATS {
        let number = tag.trim_start_matches('s');
        let prefix = format!("v{number}-");
        let ours: Vec<_> = names.iter().filter(|n| n.starts_with(&prefix)).collect();
        assert!(!ours.is_empty(), "link format {tag} has no fixture named {prefix}*.link");
        for name in ours {
            let link = read(&folder().join(name).with_extension("link"));
            assert!(link.trim().starts_with(&format!("#{tag}.")), "{name} is not in format {tag}");
        }
    }
    assert!(names.iter().any(|n| n == "v1-demo"), "the demo design's link is kept");
}

/// The designs of the current format's fixtures: the demo, a two-hinged unbraced arch
/// with unequal springings and its crown set by rise, and a fixed arch with crossed
/// bracing and piers on one side only (all invented).
fn current_fixture_designs() -> Vec<(&'static str, Design)> {
    let demo = Design::demo();
    let mut two_hinged = Design::demo();
    two_hinged.name = "two-hinged unbraced, unequal springings (invented fixture)".into();
    two_hinged.rib_system = RibSystem::TwoHinged;
    two_hinged.bracing = Bracing::None;
    two_hinged.springing_left_level = 74.0;
    two_hinged.springing_right_level = 82.0;
    two_hinged.crown = Crown::Rise { rise: 16.5 };
    two_hinged.panels = 10;
    two_hinged.approach_piers_left = 0;
    two_hinged.approach_piers_right = 2;
    let mut fixed = Design::demo();
    fixed.name = "fixed, crossed bracing, piers left only (invented fixture)".into();
    fixed.rib_system = RibSystem::Fixed;
    fixed.bracing = Bracing::Crossed;
    fixed.springing_left_level = 78.0;
    fixed.springing_right_level = 78.0;
    fixed.crown = Crown::Level { level: 96.0 };
    fixed.panels = 16;
    fixed.min_post_length = 0.5;
    fixed.approach_piers_left = 2;
    fixed.approach_piers_right = 0;
    fixed.deck.ribs = 3;
    fixed.groups.rib.a = 0.075;
    vec![("v1-demo", demo), ("v1-two-hinged-unbraced", two_hinged), ("v1-fixed-crossed", fixed)]
}

/// The refresh (see the top of this file). Ignored, and inert without `REFRESH_VAR`.
#[test]
#[ignore = "writes fixtures; run deliberately, see the top of this file"]
fn refresh_link_fixtures() {
    if std::env::var(REFRESH_VAR).as_deref() != Ok("1") {
        eprintln!("{REFRESH_VAR}=1 is not set: nothing written");
        return;
    }
    for (name, design) in current_fixture_designs() {
        let path = folder().join(name).with_extension("link");
        assert!(name.starts_with(&format!("v{}-", &permalink::CURRENT_FORMAT[1..])), "{name}");
        if !path.exists() {
            springline_statics::validate_design(&design).unwrap_or_else(|e| panic!("{name}: {e}"));
            std::fs::write(&path, format!("#{}\n", permalink::encode(&design))).expect("writes the link");
        }
    }
    for name in fixture_names() {
        let base = folder().join(&name);
        let design =
            permalink::decode(&read(&base.with_extension("link"))).unwrap_or_else(|e| panic!("{name}: {e}"));
        std::fs::write(base.with_extension("design.json"), pretty(&design)).expect("writes the design");
        std::fs::write(base.with_extension("results.json"), pretty(&key_results(&design)))
            .expect("writes results");
    }
}
