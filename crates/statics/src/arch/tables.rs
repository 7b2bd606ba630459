//! Tables and files to take the design out of the meeting, one code path for the app and
//! the command line (so both write the same bytes): the member table and the options
//! comparison as CSV (RFC 4180: comma separated, CRLF-free lines ending in `\n`, fields
//! with a comma, quote or line break quoted, quotes doubled; every column's unit in its
//! header), and the design file with a summary of its key results.
//!
//! Concept-design values: local codes and a licensed engineer govern.

use crate::arch::analysis::{Analysis, CAUTION};
use crate::arch::design::Design;
use crate::arch::design_file::write_design_json;
use crate::arch::options::{KeyNumbers, METRICS};
use crate::arch::sizing::{GroupOutcome, SizeReport};
use crate::units::Quantity;
use serde_json::json;

/// One CSV field: as is, or quoted with its quotes doubled when it holds a comma, a quote
/// or a line break (RFC 4180, 2.6-2.7).
pub fn csv_field(text: &str) -> String {
    if text.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", text.replace('"', "\"\""))
    } else {
        text.to_string()
    }
}

/// A text cell from people (an option's name): with a leading `'` when it starts with
/// `=`, `+`, `-` or `@`, so a spreadsheet shows it as text and never runs it as a formula
/// (OWASP, "CSV Injection"); quoting is [`csv_field`]'s.
pub fn csv_text(text: &str) -> String {
    if text.starts_with(['=', '+', '-', '@']) {
        format!("'{text}")
    } else {
        text.to_string()
    }
}

/// The SI unit of a quantity as CSV headers write it, in ASCII (spreadsheets of any
/// locale read it): `m`, `kN`, `kNm`, `deg`, `t`, `m3`, `-` for ratios, empty for counts.
fn ascii_unit(q: Quantity) -> &'static str {
    match q {
        Quantity::Length | Quantity::SectionDepth => "m",
        Quantity::Force => "kN",
        Quantity::Moment => "kNm",
        Quantity::Angle => "deg",
        Quantity::Mass => "t",
        Quantity::Volume => "m3",
        Quantity::Ratio => "-",
        Quantity::Area => "m2",
        Quantity::Inertia => "m4",
        Quantity::Pressure | Quantity::Modulus => "kN/m2",
        Quantity::LineLoad => "kN/m",
        Quantity::UnitWeight => "kN/m3",
        Quantity::Count => "",
    }
}

/// The axial force at mid-length of a solved member, kN (tension positive): interpolated
/// between the stations either side of L/2, or the mean of the end forces when the member
/// has no stations there.
fn mid_length_n(f: &crate::frame::results::MemberForces) -> f64 {
    let half = 0.5 * f.length;
    // the first station at or past L/2 and the one before it
    let at = f.stations.iter().position(|st| st.s >= half);
    let around = at.map(|k| (k.checked_sub(1).and_then(|j| f.stations.get(j)), f.stations.get(k)));
    match around {
        Some((Some(a), Some(b))) => {
            let t = if b.s > a.s { (half - a.s) / (b.s - a.s) } else { 0.0 };
            a.forces.n + t * (b.forces.n - a.forces.n)
        }
        Some((None, Some(first))) if first.s == half => first.forces.n,
        _ => 0.5 * (f.start.n + f.end.n),
    }
}

/// A number for a table: `decimals` places, empty for none or a value that is not finite.
fn number(v: Option<f64>, decimals: usize) -> String {
    v.filter(|v| v.is_finite()).map_or(String::new(), |v| {
        let t = format!("{v:.decimals$}");
        // "-0.000" reads as zero
        if t.trim_start_matches('-').chars().all(|c| c == '0' || c == '.') {
            t.trim_start_matches('-').to_string()
        } else {
            t
        }
    })
}

fn line(fields: &[String]) -> String {
    fields.iter().map(|f| csv_field(f)).collect::<Vec<_>>().join(",")
}

/// The member table of a design as CSV: one row per member of the frame model, in model
/// order, with
/// - `member`, `group`, `length (m)`;
/// - the axial force at mid-length under each load case of `analysis` (kN, all ribs
///   together, tension positive; the case's title in the header);
/// - from `report` (per rib line, over the ultimate combinations): the largest tension,
///   the largest compression (a magnitude) and the largest |M| (kNm); the group's section
///   (its words, dimensions in mm, or `as typed`), the utilisation, the governing mode,
///   the combination and the traffic placement of the governing demand.
///
/// `analysis` and `report` must be of the same design (the member names match; a member
/// the report does not list has empty sizing cells). Without a report (a design that
/// cannot be sized, for example one without an ultimate combination) every sizing cell is
/// empty. Never fails.
pub fn member_table_csv(analysis: &Analysis, report: Option<&SizeReport>) -> String {
    let model = &analysis.frame.model;
    let cases = &analysis.frame.solution.cases;
    let mut head: Vec<String> = vec!["member".into(), "group".into(), "length (m)".into()];
    for (k, _) in cases.iter().enumerate() {
        let title =
            analysis.load_cases.get(k).map_or_else(|| format!("case {}", k + 1), |c| c.description.title());
        head.push(format!("N {title} (kN; all ribs; tension +)"));
    }
    head.extend(
        [
            "ULS tension per rib (kN)",
            "ULS compression per rib (kN; magnitude)",
            "ULS |M| per rib (kNm)",
            "section (mm)",
            "utilisation (-)",
            "governing mode",
            "combination",
            "traffic placement",
        ]
        .map(String::from),
    );
    let mut out = vec![line(&head)];
    for (m, member) in model.members.iter().enumerate() {
        let sized =
            report.and_then(|r| r.sizing.members.iter().find(|s| s.member == member.name).map(|s| (r, s)));
        let length = cases.first().and_then(|c| c.members.get(m)).map(|f| f.length);
        let mut row = vec![member.name.clone(), member.group.clone(), number(length, 3)];
        for case in cases {
            let n = case.members.get(m).map(mid_length_n);
            row.push(number(n, 2));
        }
        match sized {
            Some((report, s)) => {
                let section =
                    report.sizing.groups.iter().find(|g| g.group == s.group).map_or(String::new(), |g| {
                        match &g.outcome {
                            GroupOutcome::Sized { label, .. } => label.clone(),
                            GroupOutcome::AsTyped => "as typed".into(),
                            GroupOutcome::NoMembers => String::new(),
                            GroupOutcome::NotSized { .. } => "not sized".into(),
                        }
                    });
                let mode = s
                    .governs
                    .and_then(|g| serde_json::to_value(g).ok())
                    .and_then(|v| v.as_str().map(str::to_string))
                    .unwrap_or_default();
                row.extend([
                    number(Some(s.demand.tension), 2),
                    number(Some(s.demand.compression), 2),
                    number(Some(s.demand.moment), 2),
                    section,
                    number(s.utilisation, 4),
                    mode,
                    s.combination.clone(),
                    s.placement.clone(),
                ]);
            }
            None => row.extend(std::iter::repeat_n(String::new(), 8)),
        }
        out.push(line(&row));
    }
    out.join("\n") + "\n"
}

/// The options comparison as CSV: a header `quantity,unit,NAME...`, then one row per
/// comparison metric (`arch::options::METRICS`, SI values in the `unit` column's units:
/// m, kN, deg, t, m3, `-` for ratios; names made safe by [`csv_text`]) and a
/// last row `feasible` (`yes`, or `no: reason`). `names` and `numbers` are the options in
/// order (a name missing for an option reads `option K`). Never fails.
pub fn comparison_csv(names: &[String], numbers: &[KeyNumbers]) -> String {
    let mut head = vec!["quantity".to_string(), "unit".to_string()];
    head.extend(
        (0..numbers.len()).map(|k| names.get(k).map_or_else(|| format!("option {}", k + 1), |n| csv_text(n))),
    );
    let mut out = vec![line(&head)];
    for metric in METRICS {
        let decimals = match metric.quantity {
            Quantity::Ratio | Quantity::Angle => 4,
            Quantity::Count => 0,
            _ => 2,
        };
        let mut row = vec![metric.label.to_string(), ascii_unit(metric.quantity).to_string()];
        row.extend(numbers.iter().map(|n| number(metric.value(n), decimals)));
        out.push(line(&row));
    }
    let mut feasible = vec!["feasible".to_string(), String::new()];
    feasible.extend(numbers.iter().map(|n| match (n.feasible, &n.reason) {
        (true, _) => "yes".to_string(),
        (false, Some(reason)) => format!("no: {reason}"),
        (false, None) => "no".to_string(),
    }));
    out.push(line(&feasible));
    out.join("\n") + "\n"
}

/// The design file of `design` (as `write_design_json` writes it: any version of
/// Springline reads it back) with a `summary` object after the design's fields: the key
/// numbers (`arch::options::key_numbers`, sized), the quantities and the foundation demand
/// of `report`, the arch's stability summary when there is one, and the caution. Readers
/// ignore the summary: it is what the design gave when written, for people and
/// spreadsheets. `report` is `design`'s size report, or why it could not be sized (the
/// summary then says so in `sizing_failure`, beside the key numbers found before sizing).
pub fn design_json_with_summary(
    design: &Design,
    numbers: &KeyNumbers,
    report: Result<&SizeReport, &str>,
) -> String {
    let text = write_design_json(design);
    let note = "results of this design when the file was written; Springline ignores them on reading";
    let summary = match report {
        Ok(report) => json!({
            "note": note,
            "key_numbers": numbers,
            "quantities": report.quantities,
            "foundations": report.foundations,
            "stability": report.stability,
            "caution": CAUTION,
        }),
        Err(why) => {
            json!({ "note": note, "key_numbers": numbers, "sizing_failure": why, "caution": CAUTION })
        }
    };
    // the design's fields stay in the order and layout of a design file; the summary
    // (serialised by serde, indented one level) goes last
    let (Some(body), Ok(summary)) =
        (text.trim_end().strip_suffix('}'), serde_json::to_string_pretty(&summary))
    else {
        return text;
    };
    format!("{},\n  \"summary\": {}\n}}\n", body.trim_end(), summary.replace('\n', "\n  "))
}
