//! Every committed comparison link (the meeting's link, format `o1`) still opens to its
//! stored options.
//!
//! `tests/fixtures/comparisons/` holds, for each fixture `NAME` (prefix `oN-`: link format
//! `oN`):
//!
//! * `NAME.link`: the fragment as the app wrote it. Never rewritten: comparison links of
//!   every format ever shipped must keep opening.
//! * `NAME.options.json`: the option the link opens, and per option its name, its design
//!   as a design file of the format current when the fixture was made (read through the
//!   design-file reader, so it is updated exactly as the link's design is) and key numbers
//!   of its analysis (span, rise, form thrust).
//!
//! Refresh (writes the files of a fixture that does not exist yet; never rewrites one):
//!
//! ```text
//! SPRINGLINE_REFRESH_LINK_FIXTURES=1 cargo test -p springline-tests --test comparison_fixtures -- --ignored refresh
//! ```

use serde::{Deserialize, Serialize};
use springline_statics::analyze;
use springline_statics::arch::design::{Bracing, Crown, Design, RibSystem};
use springline_statics::arch::design_file::{read_design_json, write_design_json};
use springline_statics::link::comparison::{decode_comparison, encode_comparison, Comparison, NamedDesign};
use springline_statics::traffic::models::ModelFamily;
use springline_statics::traffic::TrafficDesign;
use std::path::PathBuf;

const REL_TOL: f64 = 1e-9;

#[derive(Debug, Serialize, Deserialize)]
struct StoredOption {
    name: String,
    /// The design file, as text (so an older format is read by the design-file reader).
    design: String,
    span_m: f64,
    rise_m: f64,
    thrust_kn: f64,
}

#[derive(Debug, Serialize, Deserialize)]
struct Stored {
    open: usize,
    options: Vec<StoredOption>,
}

fn folder() -> PathBuf {
    springline_tests::workspace_root().join("tests/fixtures/comparisons")
}

fn stored_of(c: &Comparison) -> Stored {
    Stored {
        open: c.open,
        options: c
            .options
            .iter()
            .map(|o| {
                let s = analyze(&o.design).expect("analyses").summary;
                StoredOption {
                    name: o.name.clone(),
                    design: write_design_json(&o.design),
                    span_m: s.span,
                    rise_m: s.rise,
                    thrust_kn: s.form_thrust,
                }
            })
            .collect(),
    }
}

/// The fixtures made at this version: four rises of the demo (the meeting's usual case:
/// under 2,000 characters) and three designs that differ in much more.
fn current_fixtures() -> Vec<(&'static str, Comparison)> {
    let with_rise = |name: &str, rise: f64| {
        let mut design = Design::demo();
        design.crown = Crown::Rise { rise };
        NamedDesign { name: name.into(), design }
    };
    let mut two_hinged = Design::demo();
    two_hinged.rib_system = RibSystem::TwoHinged;
    two_hinged.bracing = Bracing::None;
    let mut hl93 = Design::demo();
    hl93.traffic = TrafficDesign::preset(ModelFamily::Hl93, 9.0);
    hl93.panels = 10;
    vec![
        (
            "o1-four-rises",
            Comparison {
                options: vec![
                    with_rise("Base, rise 19.5 m", 19.5),
                    with_rise("Higher", 21.0),
                    with_rise("Flatter", 16.0),
                    with_rise("Flattest", 14.0),
                ],
                open: 1,
            },
        ),
        (
            "o1-three-systems",
            Comparison {
                options: vec![
                    NamedDesign { name: "Three-hinged, braced".into(), design: Design::demo() },
                    NamedDesign { name: "Two-hinged, unbraced".into(), design: two_hinged },
                    NamedDesign { name: "HL-93, 10 panels".into(), design: hl93 },
                ],
                open: 0,
            },
        ),
    ]
}

#[test]
fn every_comparison_fixture_opens_to_its_stored_options() {
    let mut names: Vec<String> = std::fs::read_dir(folder())
        .expect("fixtures folder")
        .filter_map(|e| e.ok()?.file_name().to_str()?.strip_suffix(".link").map(str::to_string))
        .collect();
    names.sort();
    assert!(names.len() >= 2, "expected the committed fixtures, found {names:?}");
    for name in names {
        let link = std::fs::read_to_string(folder().join(format!("{name}.link"))).expect("link");
        let opened = decode_comparison(&link).unwrap_or_else(|e| panic!("{name}: {e}"));
        let stored: Stored = serde_json::from_str(
            &std::fs::read_to_string(folder().join(format!("{name}.options.json"))).expect("options"),
        )
        .expect("stored options");
        assert_eq!(opened.open, stored.open, "{name}: the open option");
        assert_eq!(opened.options.len(), stored.options.len(), "{name}");
        for (k, (got, want)) in opened.options.iter().zip(&stored.options).enumerate() {
            assert_eq!(got.name, want.name, "{name}: option {k}");
            let design = read_design_json(&want.design).unwrap_or_else(|e| panic!("{name}: option {k}: {e}"));
            assert!(got.design == design, "{name}: option {k} opens to another design");
            let s = analyze(&got.design).expect("analyses").summary;
            for (what, g, w) in [
                ("span", s.span, want.span_m),
                ("rise", s.rise, want.rise_m),
                ("thrust", s.form_thrust, want.thrust_kn),
            ] {
                assert!((g - w).abs() <= REL_TOL * w.abs().max(1.0), "{name}: option {k}: {what} {g} vs {w}");
            }
        }
        if name == "o1-four-rises" {
            assert!(
                link.trim().len() < 2_000,
                "four options of the demo's kind take {} characters",
                link.trim().len()
            );
        }
    }
}

#[test]
#[ignore = "writes fixtures; run with SPRINGLINE_REFRESH_LINK_FIXTURES=1"]
fn refresh() {
    if std::env::var("SPRINGLINE_REFRESH_LINK_FIXTURES").is_err() {
        return;
    }
    for (name, comparison) in current_fixtures() {
        let link_path = folder().join(format!("{name}.link"));
        if link_path.exists() {
            continue;
        }
        let link = encode_comparison(&comparison).expect("encodes");
        std::fs::write(&link_path, format!("{link}\n")).expect("write link");
        let stored = serde_json::to_string_pretty(&stored_of(&comparison)).expect("json") + "\n";
        std::fs::write(folder().join(format!("{name}.options.json")), stored).expect("write options");
    }
}
