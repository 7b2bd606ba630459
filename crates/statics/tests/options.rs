//! Options side by side (`arch::options`): the key numbers are the size report's and the
//! traffic report's own numbers, and the comparison marks and measures them as the table
//! says (differences from the first option, the best feasible value in rows with a
//! direction, none in geometry rows, never an infeasible option).

use springline_statics::arch::design::Crown;
use springline_statics::arch::options::{compare, key_numbers, Better, KeyNumbers, METRICS};
use springline_statics::arch::sizing::size_of;
use springline_statics::Design;

fn numbers(cost: f64, alpha: f64, span: f64, feasible: bool) -> KeyNumbers {
    KeyNumbers {
        feasible,
        reason: (!feasible).then(|| "a group cannot be sized".to_string()),
        span: Some(span),
        cost_index: Some(cost),
        alpha_cr: Some(alpha),
        ..KeyNumbers::default()
    }
}

fn row<'a>(
    rows: &'a [springline_statics::arch::options::Row],
    id: &str,
) -> &'a springline_statics::arch::options::Row {
    rows.iter().find(|r| r.metric.id == id).expect(id)
}

#[test]
fn differences_and_best_marks_follow_each_rows_direction() {
    let options = [
        numbers(100.0, 8.0, 120.0, true),
        numbers(90.0, 12.0, 130.0, true),
        numbers(80.0, 20.0, 140.0, false), // cheapest and stiffest, but not feasible
        numbers(90.0, 5.0, 120.0, true),
    ];
    let rows = compare(&options);
    assert_eq!(rows.len(), METRICS.len());
    let cost = row(&rows, "cost-index");
    assert_eq!(cost.metric.better, Better::Lower);
    assert_eq!(cost.cells.iter().map(|c| c.best).collect::<Vec<_>>(), [false, true, false, true]);
    assert_eq!(
        cost.cells.iter().map(|c| c.difference).collect::<Vec<_>>(),
        [None, Some(-10.0), Some(-20.0), Some(-10.0)]
    );
    let alpha = row(&rows, "alpha-cr");
    assert_eq!(alpha.metric.better, Better::Higher);
    assert_eq!(alpha.cells.iter().map(|c| c.best).collect::<Vec<_>>(), [false, true, false, false]);
    // geometry is a choice, not a score
    let span = row(&rows, "span");
    assert!(span.cells.iter().all(|c| !c.best));
    assert_eq!(span.cells[2].difference, Some(20.0));
    // a row no option has: values and marks absent
    assert!(row(&rows, "concrete")
        .cells
        .iter()
        .all(|c| c.value.is_none() && !c.best && c.difference.is_none()));
    // one option alone is never "best"
    assert!(compare(&options[..1]).iter().all(|r| r.cells.iter().all(|c| !c.best)));
    assert!(compare(&[]).iter().all(|r| r.cells.is_empty()));
}

#[test]
fn key_numbers_are_the_size_reports_numbers() {
    let demo = Design::demo();
    let n = key_numbers(&demo, true);
    assert!(n.feasible, "{:?}", n.reason);
    let report = size_of(&demo).expect("sizes");
    assert_eq!(n.steel, Some(report.quantities.steel));
    assert_eq!(n.concrete, Some(report.quantities.concrete));
    assert_eq!(n.cost_index, Some(report.quantities.cost_index));
    assert_eq!(n.alpha_cr, report.sizing.rib_alpha_cr);
    assert_eq!(n.springings.len(), 2);
    for (got, want) in n.springings.iter().zip(&report.foundations.springings) {
        assert_eq!(
            (got.side.as_str(), got.thrust, got.vertical, got.angle),
            (want.side.as_str(), want.thrust, want.vertical, want.angle)
        );
    }
    // the demo: span 106.43 m between its springings, rise 19.5 m (its design)
    assert!((n.span.expect("span") - 106.428_571_428_571_4).abs() < 1e-9);
    assert_eq!(n.rise, Some(19.5));
    assert_eq!(n.panels, Some(12.0));
    // a rise the deck cannot hold: infeasible with the validation's words, no numbers
    let mut too_high = demo;
    too_high.crown = Crown::Rise { rise: 30.0 };
    let bad = key_numbers(&too_high, true);
    assert!(!bad.feasible && bad.span.is_none());
    assert!(bad.reason.as_deref().is_some_and(|r| r.contains("above the deck")), "{:?}", bad.reason);
}
