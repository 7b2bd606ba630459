//! Option sweeps: every row is the separate analysis (and sizing) of its option, the
//! demo's form thrust falls as its rise grows, options that fail are rows with their
//! reason, grids hold every pair.

use springline_statics::arch::design::{Design, RibSystem};
use springline_statics::arch::generate::ModelKind;
use springline_statics::arch::sizing::size_design;
use springline_statics::arch::sweep::{apply, parse_axis, sweep, to_csv, Parameter};
use springline_statics::arch::traffic::traffic_envelopes;
use springline_statics::{analyze, ValidDesign};

/// H = M0 / f for a three-hinged arch: the thrust falls as the rise grows (any statics
/// text; with the springings fixed the span stays, so the form thrust falls about as
/// 1 / f). Every row equals the separate analysis of its option.
#[test]
fn the_demo_thrust_falls_as_the_rise_grows_and_rows_equal_separate_analyses() {
    let demo = Design::demo();
    let axis = parse_axis("rise-ratio=0.10:0.20:6").expect("parses");
    assert_eq!(axis.values.len(), 6);
    let s = sweep(&demo, std::slice::from_ref(&axis), false).expect("sweeps");
    assert_eq!(s.rows.len(), 6);
    assert!(s.held.contains("crown level follows"), "{}", s.held);
    let thrusts: Vec<f64> = s.rows.iter().map(|r| r.form_thrust.expect("feasible")).collect();
    assert!(thrusts.windows(2).all(|w| w[1] < w[0]), "{thrusts:?}");
    // about as 1 / f: from 0.10 to 0.20 the thrust falls by about half (the dead load
    // changes a little with the posts' lengths)
    let ratio = thrusts[5] / thrusts[0];
    assert!((0.45..0.55).contains(&ratio), "{ratio}");
    for (row, v) in s.rows.iter().zip(&axis.values) {
        let option = apply(&demo, Parameter::RiseRatio, *v);
        let a = analyze(&option).expect("analyses");
        assert_eq!(row.form_thrust, Some(a.summary.form_thrust));
        assert!((row.rise_ratio.expect("ratio") - v).abs() < 1e-9);
        let valid = ValidDesign::new(&option).expect("valid");
        let t = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("report");
        let hi = t
            .thrust
            .design
            .iter()
            .filter(|r| r.combination.starts_with("ULS"))
            .map(|r| r.max)
            .fold(f64::MIN, f64::max);
        assert_eq!(row.thrust_range.map(|t| t[1]), Some(hi));
    }
}

/// With sizing, each row's steel, cost and alpha_cr are the option's own size report's.
#[test]
fn sized_rows_equal_separate_sizings() {
    let demo = Design::demo();
    let axis = parse_axis("panels=10,14").expect("parses");
    let s = sweep(&demo, &[axis], true).expect("sweeps");
    for (row, panels) in s.rows.iter().zip([10.0, 14.0]) {
        let option = apply(&demo, Parameter::Panels, panels);
        let valid = ValidDesign::new(&option).expect("valid");
        let t = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("report");
        let r = size_design(&valid, &t).expect("sizes");
        assert!(row.feasible, "{:?}", row.reason);
        assert_eq!(row.steel, Some(r.quantities.steel));
        assert_eq!(row.cost_index, Some(r.quantities.cost_index));
        assert_eq!(row.alpha_cr, r.sizing.rib_alpha_cr);
        assert!(row.alpha_cr.is_some_and(|a| a >= 3.0), "{:?}", row.alpha_cr);
    }
    let csv = to_csv(&s);
    let head = csv.lines().next().unwrap_or_default();
    assert!(head.contains("steel (t)") && head.contains("cost index") && head.contains("alpha_cr"), "{csv}");
}

/// An option that cannot be built is a row with the engine's reason (a crown above the
/// deck), and the other options still come; a grid holds every pair, the last axis
/// fastest.
#[test]
fn failing_options_are_rows_and_grids_hold_every_pair() {
    let demo = Design::demo();
    let s = sweep(&demo, &[parse_axis("rise-ratio=0.15,0.6").expect("parses")], false).expect("sweeps");
    assert!(s.rows[0].feasible);
    assert!(!s.rows[1].feasible);
    assert!(s.rows[1].reason.as_deref().is_some_and(|r| !r.is_empty()));
    assert!(to_csv(&s).lines().nth(2).is_some_and(|l| l.contains("false") && l.ends_with('"')));
    let grid = sweep(
        &demo,
        &[
            parse_axis("panels=10:14:3").expect("parses"),
            parse_axis("rib-system=three-hinged,fixed").expect("parses"),
        ],
        false,
    )
    .expect("sweeps");
    assert_eq!(grid.rows.len(), 6);
    assert_eq!(grid.rows[1].values, vec![10.0, 1.0 * 2.0]);
    let fixed = apply(&apply(&demo, Parameter::Panels, 12.0), Parameter::RibSystem, 2.0);
    assert_eq!(fixed.rib_system, RibSystem::Fixed);
    assert_eq!(grid.rows[3].form_thrust, Some(analyze(&fixed).expect("analyses").summary.form_thrust));
}

/// The form basis as a sweep parameter: each row is a separate analysis of the design on
/// that basis (the as-built form thrust differs from the panel-load one), and a basis
/// that does not exist is refused naming both.
#[test]
fn the_form_basis_sweeps_as_a_category() {
    use springline_statics::arch::form::Basis;
    let demo = Design::demo();
    let s = sweep(&demo, &[parse_axis("form-basis=panel-loads,as-built").expect("parses")], false)
        .expect("sweeps");
    assert_eq!(s.rows.len(), 2);
    for (row, basis) in s.rows.iter().zip([Basis::PanelLoads, Basis::AsBuilt]) {
        let d = apply(&demo, Parameter::FormBasis, row.values[0]);
        assert_eq!(d.form.basis, basis);
        assert_eq!(row.form_thrust, Some(analyze(&d).expect("analyses").summary.form_thrust));
    }
    assert_ne!(s.rows[0].form_thrust, s.rows[1].form_thrust);
    assert!(to_csv(&s).lines().nth(2).is_some_and(|l| l.starts_with("as-built,")), "{}", to_csv(&s));
    assert!(!Parameter::FormBasis.is_numeric() && Parameter::RiseRatio.is_numeric());
    let e = parse_axis("form-basis=by-eye").expect_err("refused").to_string();
    assert!(e.contains("panel-loads, as-built"), "{e}");
}

/// Ranges that cannot be read are refused with the accepted forms.
#[test]
fn bad_ranges_are_refused() {
    for bad in [
        "rise",
        "height=1:2:3",
        "panels=8.5,9",
        "rise-ratio=0.1:0.2:0",
        "rib-system=arched",
        "rise-ratio=a:b:3",
    ] {
        let e = parse_axis(bad).expect_err(bad).to_string();
        assert!(!e.is_empty(), "{bad}");
    }
    let e = parse_axis("height=1:2:3").expect_err("unknown").to_string();
    assert!(e.contains("rise-ratio") && e.contains("rib-system"), "{e}");
    let two = [parse_axis("panels=8,10").expect("ok"), parse_axis("panels=12").expect("ok")];
    assert!(sweep(&Design::demo(), &two, false).is_err());
}

/// Shares of a sweep (threads or web workers sweeping at once) hold every option once:
/// put back together they are the whole sweep's rows bit for bit, on a grid of 3 x 2
/// split two, four and seven ways (the seventh share holds no option) and
/// on a sized one-parameter sweep split two ways; `on_row` gets each option's place in
/// the whole sweep. A share that does not exist, and shares of different sweeps or with
/// rows missing, are refused.
#[test]
fn shares_of_a_sweep_put_together_are_the_whole_sweep() {
    use springline_statics::arch::sweep::{interleave, sweep_share, Share};
    let demo = Design::demo();
    let grid = [
        parse_axis("panels=10:14:3").expect("parses"),
        parse_axis("rib-system=three-hinged,fixed").expect("parses"),
    ];
    let whole = sweep(&demo, &grid, false).expect("sweeps");
    for parts in [2, 4, 7] {
        let mut seen = Vec::new();
        let shares: Vec<_> = (0..parts)
            .map(|part| {
                sweep_share(&demo, &grid, false, Share { part, parts }, |index, total, _| {
                    assert_eq!(total, 6);
                    seen.push(index);
                    true
                })
                .expect("sweeps its share")
            })
            .collect();
        seen.sort_unstable();
        assert_eq!(seen, (0..6).collect::<Vec<_>>(), "{parts} parts");
        assert_eq!(
            shares[1].rows.len(),
            match parts {
                2 => 3,
                4 => 2,
                _ => 1,
            }
        );
        assert!(shares.iter().all(|s| s.axes == whole.axes && s.held == whole.held));
        assert_eq!(interleave(shares).expect("puts together"), whole, "{parts} parts");
    }
    let rise = [parse_axis("rise-ratio=0.12,0.15,0.18").expect("parses")];
    let sized = sweep(&demo, &rise, true).expect("sweeps");
    let halves: Vec<_> = (0..2)
        .map(|part| {
            sweep_share(&demo, &rise, true, Share { part, parts: 2 }, |_, _, _| true).expect("sweeps")
        })
        .collect();
    assert_eq!(halves[0].rows.len(), 2);
    assert_eq!(interleave(halves.clone()).expect("puts together"), sized);

    let e =
        sweep_share(&demo, &rise, false, Share { part: 2, parts: 2 }, |_, _, _| true).expect_err("refused");
    assert!(e.to_string().contains("share 2 of 2"), "{e}");
    assert!(sweep_share(&demo, &rise, false, Share { part: 0, parts: 0 }, |_, _, _| true).is_err());
    let mut short = halves.clone();
    short[1].rows.clear();
    let e = interleave(short).expect_err("refused").to_string();
    assert!(e.contains("share 1 of 2 holds 0 options where its sweep gives it 1"), "{e}");
    let other =
        sweep_share(&demo, &rise, false, Share { part: 1, parts: 2 }, |_, _, _| true).expect("sweeps");
    assert!(interleave(vec![halves[0].clone(), other]).is_err(), "a sized share and an unsized one");
    assert!(interleave(Vec::new()).is_err());
}
