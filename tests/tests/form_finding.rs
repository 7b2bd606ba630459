//! Form finding against closed forms: the parabola and catenary limits, unequal
//! springings, and a three-hinged bare rib of the found shape solved by the stiffness
//! solver. Check values are computed here from textbook formulas, never copied from the
//! engine's output.

use springline_statics::arch::design::{Bracing, Crown, Design, GroundPoint, RibSystem, Section};
use springline_statics::arch::form::Form;
use springline_statics::{bare_rib_model, solve, validate_design, StaticsError, ValidDesign};

/// The form a design validates to (validation finds it).
fn find_form(d: &Design) -> Result<Form, StaticsError> {
    ValidDesign::new(d).map(|v| v.form().clone())
}

/// A V-shaped valley whose walls pass through the springings (xa, ya) and (xb, yb), with a
/// deck at `deck` and weightless members except as set by the caller.
fn design(xa: f64, ya: f64, xb: f64, yb: f64, deck: f64, rise: f64, panels: usize) -> Design {
    let floor = ya.min(yb) - 10.0;
    let mut d = Design::demo();
    d.name = "test valley (invented)".into();
    d.valley = vec![
        GroundPoint { x: xa - 40.0, y: deck + 1.0 },
        GroundPoint { x: xa, y: ya },
        GroundPoint { x: 0.5 * (xa + xb), y: floor },
        GroundPoint { x: xb, y: yb },
        GroundPoint { x: xb + 40.0, y: deck + 1.0 },
    ];
    d.deck.level = deck;
    d.deck.left_seat_x = xa - 20.0;
    d.deck.right_seat_x = xb + 20.0;
    // the seats stand halfway up the straight walls: tall abutments (these valleys are
    // about the rib, not the seats)
    d.deck.abutment_height = 50.0;
    d.approach_piers_left = 0;
    d.approach_piers_right = 0;
    d.springing_left_level = ya;
    d.springing_right_level = yb;
    d.crown = Crown::Rise { rise };
    d.panels = panels;
    d.min_post_length = 0.5;
    d.rib_system = RibSystem::TwoHinged;
    d.bracing = Bracing::None;
    springline_tests::without_self_weight(&mut d);
    d
}

/// Parabola through (xa, ya), (xb, yb) with rise f above the chord at mid-span.
fn parabola(xa: f64, ya: f64, xb: f64, yb: f64, f: f64, x: f64) -> f64 {
    let l = xb - xa;
    ya + (yb - ya) * (x - xa) / l + 4.0 * f * (x - xa) * (xb - x) / (l * l)
}

#[test]
fn equal_panel_loads_give_the_parabola() {
    // Uniform load per horizontal metre: the funicular is the parabola through the three
    // points, and equal loads at equal spacing put the polygon's vertices on it exactly
    // (Timoshenko & Young, Theory of Structures, arches and cables; from memory).
    // H = w L^2 / (8 f) (any parabolic arch under full-span UDL: Timoshenko & Young, Theory of Structures, ch. 9, from memory).
    for (panels, ya, yb) in
        [(2, 50.0, 50.0), (8, 50.0, 50.0), (12, 50.0, 56.0), (40, 58.0, 51.0), (200, 50.0, 50.0)]
    {
        let (xa, xb, f) = (10.0, 110.0, 20.0);
        let mut d = design(xa, ya, xb, yb, 80.0, f, panels);
        d.deck.dead_load = 7.0;
        d.deck.surfacing = 2.0;
        d.deck.width = 10.0;
        let form = find_form(&d).expect("valid design");
        for n in &form.rib {
            let p = parabola(xa, ya, xb, yb, f, n.x);
            assert!(
                (n.y - p).abs() < 1e-9,
                "{panels} panels: node at x = {} is {} m off the parabola",
                n.x,
                n.y - p
            );
        }
        let w = 90.0; // (7 + 2) kN/m2 x 10 m
        let h = w * 100.0 * 100.0 / (8.0 * f);
        assert!((form.thrust - h).abs() < 1e-9 * h, "H = {} vs {h}", form.thrust);
        // zero self-weight: the loads do not depend on the shape, so the second pass
        // changes nothing
        assert!(form.iterations <= 2);
    }
}

/// The catenary (uniform load per arch length), a hanging chain turned upside down,
/// through (xa, y0), crown (xc, y0 + f), (xb, y0): y = y0 + f - a (cosh((x - xc)/a) - 1)
/// with f = a (cosh(L / 2a) - 1) (the hanging chain turned upside down; any statics text).
fn catenary_parameter(l: f64, f: f64) -> f64 {
    // f(a) = a (cosh(L/2a) - 1) falls monotonically with a: bisection
    let (mut lo, mut hi) = (1e-3 * l, 1e6 * l);
    for _ in 0..200 {
        let mid = (lo * hi).sqrt();
        if mid * ((l / (2.0 * mid)).cosh() - 1.0) > f {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    (lo * hi).sqrt()
}

fn catenary_error(panels: usize, rise: f64) -> (f64, usize) {
    let (xa, xb, y0) = (0.0, 100.0, 50.0);
    let mut d = design(xa, y0, xb, y0, y0 + rise + 5.0, rise, panels);
    d.deck.dead_load = 0.0;
    d.deck.surfacing = 0.0;
    d.groups.rib.unit_weight = 78.5;
    d.form.tolerance = 1e-13;
    let form = find_form(&d).expect("valid design");
    let a = catenary_parameter(100.0, rise);
    let err = form
        .rib
        .iter()
        .map(|n| (n.y - (y0 + rise - a * (((n.x - 50.0) / a).cosh() - 1.0))).abs())
        .fold(0.0, f64::max);
    (err / rise, form.iterations)
}

#[test]
fn uniform_load_per_arch_length_converges_to_the_catenary() {
    // Issue 3 acceptance: within 5e-6 of the rise at 64 panels, the error falling about
    // fourfold each time the panel count doubles (second-order lumping), for rise / span
    // 1/4 and less.
    for rise in [25.0, 12.5, 8.0] {
        let errs: Vec<f64> = [16, 32, 64].iter().map(|&n| catenary_error(n, rise).0).collect();
        assert!(errs[2] < 5e-6, "rise {rise}: error at 64 panels {:.3e} of the rise", errs[2]);
        for w in errs.windows(2) {
            let ratio = w[0] / w[1];
            assert!(
                (3.5..4.5).contains(&ratio),
                "rise {rise}: errors {errs:?} fall by {ratio:.2}, not about 4"
            );
        }
    }
    let (_, iterations) = catenary_error(64, 25.0);
    assert!(iterations > 2, "self-weight couples form and load: more than one pass is needed");
}

#[test]
fn unequal_springings_pass_through_the_three_points() {
    // unequal springing levels are normal in a valley and must work. Loads:
    // deck plus rib, post and bracing self-weight, so the form is iterated.
    for (panels, system, bracing) in [
        (10, RibSystem::ThreeHinged, Bracing::Single { flipped: false }),
        (11, RibSystem::ThreeHinged, Bracing::Crossed),
        (9, RibSystem::TwoHinged, Bracing::None),
        (16, RibSystem::Fixed, Bracing::Single { flipped: true }),
    ] {
        let (xa, ya, xb, yb, f) = (20.0, 40.0, 140.0, 55.0, 24.0);
        let mut d = design(xa, ya, xb, yb, 80.0, f, panels);
        d.rib_system = system;
        d.bracing = bracing;
        let demo = Design::demo();
        d.groups = demo.groups.clone();
        d.form.tolerance = 1e-12;
        validate_design(&d).expect("valid design");
        let form = find_form(&d).expect("form");
        let first = &form.rib[0];
        let last = form.rib.last().expect("nodes");
        assert_eq!((first.x, first.y), (xa, ya));
        assert_eq!((last.x, last.y), (xb, yb));
        let c = &form.rib[form.crown_node];
        assert!((c.x - 80.0).abs() < 1e-12);
        assert!((c.y - (0.5 * (ya + yb) + f)).abs() < 1e-9, "crown at {} m", c.y);
        // moments about B of the loads and the reaction (H, V_A) at A (statics):
        // L V_A = sum P_i (xB - x_i) + H (yB - yA)
        let total: f64 = form.rib.iter().map(|n| n.load).sum();
        assert!((form.reaction_left.fy + form.reaction_right.fy - total).abs() < 1e-9 * total);
        let m_b: f64 = form.rib.iter().map(|n| n.load * (xb - n.x)).sum();
        let va = (m_b + form.thrust * (yb - ya)) / (xb - xa);
        assert!((form.reaction_left.fy - va).abs() < 1e-9 * total);
    }
}

#[test]
fn three_hinged_bare_rib_of_the_found_shape_has_no_moment() {
    // Independent check by the stiffness solver: the funicular of the converged loads,
    // built as a three-hinged rib and loaded at its nodes, carries them in pure
    // compression, |M| < 1e-9 H f at every node (issue 3 acceptance). The solver's
    // thrust must match the form's H (statics of the three-hinged arch).
    for panels in [4, 7, 12, 25] {
        let (xa, ya, xb, yb, f) = (0.0, 30.0, 90.0, 42.0, 20.0);
        let mut d = design(xa, ya, xb, yb, 70.0, f, panels);
        d.rib_system = RibSystem::ThreeHinged;
        d.bracing = Bracing::Single { flipped: false };
        d.groups = Design::demo().groups.clone();
        d.form.tolerance = 1e-12;
        let valid = ValidDesign::new(&d).expect("valid");
        let form = valid.form();
        let model = bare_rib_model(&valid).model;
        assert!(model.title.contains("bare rib"));
        let sol = solve(&model).expect("solves");
        let case = &sol.cases[0];
        let hf = form.thrust * form.rise;
        for mf in &case.members {
            for m in [mf.start.m, mf.end.m] {
                assert!(m.abs() < 1e-9 * hf, "{panels} panels: |M| = {m:.3e} kNm vs H f = {hf:.3e} kNm");
            }
        }
        let ra = case.reaction(0).expect("left springing is node 0");
        assert!(
            (ra.fx - form.thrust).abs() < 1e-9 * form.thrust,
            "solver H {} vs form {}",
            ra.fx,
            form.thrust
        );
        assert!((ra.fy - form.reaction_left.fy).abs() < 1e-9 * form.thrust);
        assert!(case.equilibrium.relative < 1e-9);
    }
}

#[test]
fn tighter_tolerance_takes_more_iterations() {
    let mut d = Design::demo();
    d.form.tolerance = 1e-4;
    let coarse = find_form(&d).expect("form");
    d.form.tolerance = 1e-12;
    let fine = find_form(&d).expect("form");
    assert!(fine.iterations > coarse.iterations);
    assert!(fine.final_change <= 1e-12 * fine.rise);
    assert!(coarse.final_change <= 1e-4 * coarse.rise);
}

#[test]
fn self_weight_per_metre_counts_every_rib_line() {
    // worked by hand: a steel section of 0.06 m2 at 78.5 kN/m3 (EN 1991-1-1 Table A.4,
    // structural steel, from memory) on each of the demo's 2 rib lines:
    // 2 x 0.06 x 78.5 = 9.42 kN/m; a weightless section has none
    let steel = Section { e: 210e6, a: 0.06, i: 0.0135, depth: 1.2, unit_weight: 78.5 };
    assert!((Design::demo().weight_per_m(&steel) - 9.42).abs() < 1e-12);
    let weightless = Section { unit_weight: 0.0, ..steel };
    assert_eq!(Design::demo().weight_per_m(&weightless), 0.0);
}
