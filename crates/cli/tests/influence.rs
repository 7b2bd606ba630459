//! `springline influence`, run as the built binary: the CSV it prints against the
//! engine's own influence line, and its refusals.

mod common;

use common::{demo_json, run, text};
use springline_statics::arch::generate::ModelKind;
use springline_statics::arch::influence::{arch_influence, ArchLine, Side};
use springline_statics::{Design, ValidDesign};

/// The CSV rows (x, value) after the header, parsed.
fn rows(csv: &str) -> Vec<(f64, f64)> {
    csv.lines()
        .skip(1)
        .map(|line| {
            let (x, v) = line.split_once(',').expect("two columns");
            (x.parse().expect("x is a number"), v.parse().expect("the value is a number"))
        })
        .collect()
}

/// The demo's left springing thrust: the header names the quantity, its sign and units;
/// every row equals the engine's influence line at the same step (printed to 6
/// decimals), and the crown row is the largest.
#[test]
fn thrust_csv_matches_the_engine() {
    let out = run(&["influence", "-", "--of", "thrust", "--step", "1"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let csv = text(&out.stdout);
    let header = csv.lines().next().expect("a header line");
    assert_eq!(
        header,
        "x of the unit load along the deck (m),left springing thrust H; outward push positive (kN per kN)"
    );
    let printed = rows(&csv);

    let valid = ValidDesign::new(&Design::demo()).expect("the demo is valid");
    let engine = arch_influence(&valid, ModelKind::Frame, Some(1.0)).expect("solves").expect("frame model");
    let values = engine.ordinates(&ArchLine::Thrust(Side::Left)).expect("the left springing is supported");
    assert_eq!(printed.len(), engine.lines.positions.len());
    for ((x, v), (ex, ev)) in printed.iter().zip(engine.lines.positions.iter().zip(&values)) {
        assert!((x - ex).abs() <= 5e-4, "x {x} vs {ex}");
        assert!((v - ev).abs() <= 5e-7, "at x = {x}: {v} vs {ev}");
    }
    // a three-hinged arch's thrust line peaks at the crown hinge (here level over the
    // drop-in span, whose ends share the load by the lever rule), with a positive thrust
    let crown_x = valid.form().crown.x;
    let peak = printed.iter().map(|r| r.1).fold(f64::MIN, f64::max);
    let at_crown = printed.iter().min_by(|a, b| (a.0 - crown_x).abs().total_cmp(&(b.0 - crown_x).abs()));
    assert!(peak > 0.5, "{peak}");
    assert!((at_crown.expect("rows").1 - peak).abs() < 1e-6, "peak {peak}, at the crown {at_crown:?}");
}

/// A member's name gives its axial force; an unknown name is refused (exit 1) with the
/// accepted names; a step of zero is refused.
#[test]
fn member_names_and_refusals() {
    let demo = demo_json();
    let out = run(&["influence", "-", "--of", "rib 0-1"], &demo);
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let csv = text(&out.stdout);
    assert!(
        csv.starts_with("x of the unit load along the deck (m),rib 0-1 axial force N; tension positive"),
        "{csv}"
    );
    // the rib is in compression wherever the load stands on the arch
    assert!(rows(&csv).iter().any(|&(_, v)| v < -0.1), "{csv}");

    let out = run(&["influence", "-", "--of", "nothing"], &demo);
    let err = text(&out.stderr);
    assert_eq!(out.status.code(), Some(1), "{err}");
    assert!(out.stdout.is_empty());
    for accepted in ["thrust-right", "v-left", "v-right", "'rib 0-1'", "/m-start"] {
        assert!(err.contains(accepted), "{accepted}: {err}");
    }

    let out = run(&["influence", "-", "--of", "thrust", "--step", "0"], &demo);
    let err = text(&out.stderr);
    assert_eq!(out.status.code(), Some(1), "{err}");
    assert!(err.contains("step"), "{err}");

    let out = run(&["influence", "-"], &demo);
    assert_eq!(out.status.code(), Some(2), "--of is required");
}

/// A simply supported approach span's moment at mid-length: a unit load at distance d
/// from mid-span gives (L / 2 - d) / 2 there, L / 4 at mid-span, and a load off the span
/// nothing (any statics text); the approach span R1 of the demo is 14.79 m long.
#[test]
fn mid_length_moment_of_an_approach_span() {
    let out = run(&["influence", "-", "--of", "approach R1/m-mid", "--step", "0.25"], &demo_json());
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let csv = text(&out.stdout);
    assert!(csv.lines().next().is_some_and(|h| h.contains("approach R1 moment at mid-length")), "{csv}");
    let values = rows(&csv);
    let peak = values.iter().map(|(_, v)| *v).fold(f64::NEG_INFINITY, f64::max);
    let valid = ValidDesign::new(&Design::demo()).expect("valid");
    let g = springline_statics::frame_model(&valid);
    let k = g.model.members.iter().position(|m| m.name == "approach R1").expect("member");
    let m = &g.model.members[k];
    let (x0, x1) = (g.model.nodes[m.start].x, g.model.nodes[m.end].x);
    let (span, mid) = ((x1 - x0).abs(), 0.5 * (x0 + x1));
    // a load at distance d from mid-span gives (L / 2 - d) / 2 there (magnitude; the sign
    // follows the member's direction): the nearest position to mid-span gives the peak
    let want = values.iter().map(|(x, _)| (0.5 * span - (x - mid).abs()).max(0.0) / 2.0).fold(0.0, f64::max);
    let largest = values.iter().map(|(_, v)| v.abs()).fold(0.0, f64::max);
    assert!((largest - want).abs() < 1e-5, "{largest} against {want}");
    assert!(want > 0.99 * span / 4.0, "a position near mid-span");
    assert!(peak.abs() > 0.0);
    // well left of the span: no moment in it
    assert!(values.iter().filter(|(x, _)| *x < 100.0).all(|(_, v)| v.abs() < 1e-6));
}
