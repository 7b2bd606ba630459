//! Exports (`springline_statics::export`, `arch::tables`, `scene::svg`): the SVG parses
//! and holds one group per member of the drawn model; the member table has one row per
//! frame member with the analysis's own forces; the design file with its summary reads
//! back to the same design; CSV fields are quoted as RFC 4180 says.

use springline_statics::arch::design_file::read_design_json;
use springline_statics::arch::options::{key_numbers, KeyNumbers};
use springline_statics::arch::tables::{comparison_csv, csv_field};
use springline_statics::export::{export, Export};
use springline_statics::scene::svg::element_id;
use springline_statics::{analyze, Design};
use std::collections::BTreeSet;
use svg::parser::Event;

/// The ids of every element of an SVG document (parsed by the `svg` crate's reader).
fn ids(text: &str) -> Vec<String> {
    svg::read(text)
        .expect("the SVG parses")
        .filter_map(|e| match e {
            Event::Tag(_, _, attributes) => attributes.get("id").map(|v| v.to_string()),
            _ => None,
        })
        .collect()
}

/// The fields of one CSV line (RFC 4180: a quoted field may hold commas and doubled
/// quotes).
fn fields(line: &str) -> Vec<String> {
    let (mut out, mut field, mut quoted, mut chars) =
        (Vec::new(), String::new(), false, line.chars().peekable());
    while let Some(c) = chars.next() {
        match (c, quoted) {
            ('"', true) if chars.peek() == Some(&'"') => {
                field.push('"');
                chars.next();
            }
            ('"', _) => quoted = !quoted,
            (',', false) => out.push(std::mem::take(&mut field)),
            (c, _) => field.push(c),
        }
    }
    out.push(field);
    out
}

#[test]
fn the_elevation_svg_holds_every_member_once() {
    let demo = Design::demo();
    let analysis = analyze(&demo).expect("analyses");
    let text = export(&demo, Export::ElevationSvg { width: 1200.0, height: 640.0 }).expect("exports");
    let found = ids(&text);
    let unique: BTreeSet<&String> = found.iter().collect();
    assert_eq!(unique.len(), found.len(), "ids repeat");
    let members: BTreeSet<String> =
        analysis.frame.model.members.iter().map(|m| element_id(&m.name)).collect();
    let in_svg: BTreeSet<String> = found.into_iter().filter(|i| i.starts_with("member-")).collect();
    assert_eq!(in_svg, members);
    assert!(text.contains("data-group=\"rib\"") && text.contains("data-group=\"bracing\""));
    assert!(text.contains("span 106.4"), "the span dimension");
    assert!(text.contains("licensed engineer govern"), "the caution");
    assert!(text.contains("scale: 1 px = "), "the scale");
    // the force diagram of a braced design names the truss idealisation's members
    let forces = export(&demo, Export::ForceSvg { width: 1200.0, height: 640.0 }).expect("exports");
    let truss: BTreeSet<String> =
        analysis.truss.as_ref().expect("braced").model.members.iter().map(|m| element_id(&m.name)).collect();
    let drawn: BTreeSet<String> = ids(&forces).into_iter().filter(|i| i.starts_with("member-")).collect();
    assert!(!drawn.is_empty() && drawn.is_subset(&truss), "{drawn:?}");
    // a size no drawing has is refused with words
    let e = export(&demo, Export::ElevationSvg { width: f64::NAN, height: 10.0 }).expect_err("refused");
    assert!(e.to_string().contains("drawing size"), "{e}");
}

#[test]
fn the_member_table_has_a_row_per_member_with_the_analysis_forces() {
    let demo = Design::demo();
    let analysis = analyze(&demo).expect("analyses");
    let text = export(&demo, Export::MemberTable).expect("exports");
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(lines.len(), 1 + analysis.frame.model.members.len());
    let head = lines[0];
    assert!(head.starts_with("member,group,length (m),N Dead load (kN; all ribs; tension +)"), "{head}");
    assert!(
        head.ends_with("section (mm),utilisation (-),governing mode,combination,traffic placement"),
        "{head}"
    );
    // every row has as many fields as the header (quoted commas are one field)
    let width = fields(head).len();
    for l in &lines {
        assert_eq!(fields(l).len(), width, "{l}");
    }
    // the first rib member's dead-load force is the solver's, at mid-length, to 0.01 kN
    let f = &analysis.frame.solution.cases[0].members[0];
    let n = 0.5 * (f.start.n + f.end.n);
    let cells = fields(lines[1]);
    assert_eq!(cells[0], analysis.frame.model.members[0].name);
    let shown: f64 = cells[3].parse().expect("a number");
    assert!((shown - n).abs() <= 0.0051, "{shown} vs {n}");
    assert!(n < 0.0, "the rib is in compression");
}

#[test]
fn the_design_file_with_its_summary_reads_back_to_the_same_design() {
    let mut d = Design::demo();
    d.name = "Tarnvale \"east\" option, 12 panels".into();
    let text = export(&d, Export::DesignFile).expect("exports");
    let back = read_design_json(&text).expect("reads back");
    assert_eq!(back, d);
    let value: serde_json::Value = serde_json::from_str(&text).expect("JSON");
    let n = key_numbers(&d, true);
    // (JSON text to f64 may differ in the last bit: serde_json reads fast, not exactly)
    let cost = value["summary"]["key_numbers"]["cost_index"].as_f64().expect("cost");
    let want = n.cost_index.expect("sized");
    assert!((cost - want).abs() <= 1e-12 * want, "{cost} vs {want}");
    assert!(value["summary"]["foundations"]["springings"].is_array());
    assert!(value["summary"]["stability"]["dead_alpha_cr"].is_number());
}

#[test]
fn csv_fields_are_quoted_as_rfc_4180_says() {
    assert_eq!(csv_field("plain"), "plain");
    assert_eq!(csv_field("a, b"), "\"a, b\"");
    assert_eq!(csv_field("say \"hi\""), "\"say \"\"hi\"\"\"");
    assert_eq!(csv_field("two\nlines"), "\"two\nlines\"");
    let numbers = [
        KeyNumbers { feasible: true, span: Some(106.5), cost_index: Some(58_000.4), ..KeyNumbers::default() },
        KeyNumbers {
            feasible: false,
            reason: Some("the rib rises above the deck, by 0.3 m".into()),
            ..KeyNumbers::default()
        },
    ];
    let text = comparison_csv(&["Base".into(), "High, 21 m".into()], &numbers);
    // a name a spreadsheet would run as a formula is kept as text
    assert!(comparison_csv(&["=SUM(A1)".into()], &numbers[..1]).starts_with("quantity,unit,'=SUM(A1)\n"));
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(lines[0], "quantity,unit,Base,\"High, 21 m\"");
    assert_eq!(lines[1], "span,m,106.50,");
    assert!(lines.contains(&"cost index,,58000,"), "{text}");
    assert_eq!(lines.last().copied(), Some("feasible,,yes,\"no: the rib rises above the deck, by 0.3 m\""));
}
