//! Goal seek on the rise (`arch::seek`), each goal checked by analysing the returned
//! design again, and the least-cost goal against the sweep function over the same range.

use springline_statics::arch::design::Design;
use springline_statics::arch::seek::{clearance, seek, Goal, Measure, Side, RISE_RESOLUTION, SCAN_STEPS};
use springline_statics::arch::sweep::{sweep, Axis, Parameter};
use springline_statics::ValidDesign;

fn valid(d: &Design) -> ValidDesign {
    ValidDesign::new(d).unwrap_or_else(|e| panic!("{}: {e}", d.name))
}

fn with_rise(d: &Design, rise: f64) -> Design {
    let mut o = d.clone();
    o.set_rise(rise);
    o
}

/// The lowest rise whose form thrust is at most 90 % of the demo's: the returned design,
/// analysed again, has a thrust at or under the target and within the bisection's
/// resolution of it (a three-hinged arch's H = M0 / f, any statics text: dH/df = -H / f,
/// so 0.1 mm of rise is about 1e-5 of H); a rise 1 mm lower is over the target.
#[test]
fn the_thrust_goal_finds_the_lowest_rise_under_the_target() {
    let demo = Design::demo();
    let h0 = valid(&demo).form().thrust;
    let target = 0.9 * h0;
    let r = seek(&demo, Goal::MaxThrust { thrust: target }).expect("seeks");
    assert!(r.met, "{}", r.message);
    let h = valid(&r.design).form().thrust;
    assert!(h <= target && h >= target * (1.0 - 1e-4), "{h} vs {target}");
    assert!((h - r.value).abs() < 1e-9 * h);
    assert!(r.rise > demo.rise(), "a lower thrust takes a higher rise");
    let lower = valid(&with_rise(&demo, r.rise - 1e-3)).form().thrust;
    assert!(lower > target, "{lower}");
    // the returned design differs from the demo in its rise only
    assert_eq!(with_rise(&demo, r.rise), r.design);
}

/// The dead-load resultant at each springing at 40 degrees below the horizontal (the
/// demo's are 41.7 and 39.3): analysed again, atan(V / H) of the returned design's form
/// reaction is 40 degrees to 0.01 (the bisection's 0.1 mm of rise is far finer).
#[test]
fn the_springing_angle_goal_is_met_to_a_hundredth_of_a_degree() {
    let demo = Design::demo();
    for side in [Side::Left, Side::Right] {
        let r = seek(&demo, Goal::SpringingAngle { degrees: 40.0, side }).expect("seeks");
        assert!(r.met, "{}", r.message);
        let v = valid(&r.design);
        let reaction = if side == Side::Left { v.form().reaction_left } else { v.form().reaction_right };
        let angle = reaction.fy.atan2(reaction.fx.abs()).to_degrees();
        assert!((angle - 40.0).abs() < 0.01, "{side:?}: {angle}");
    }
}

/// The largest rise keeping 2 m between the rib's top and the deck's underside: analysed
/// again, the least gap is at least 2 m and within 1 cm of it; 1 mm more rise closes it
/// below 2 m. The gap itself, by hand at the crown of the demo with level springings
/// (symmetric: the crown node is the rib's highest): deck underside = deck level - deck
/// depth; the crown node's extrados is its level plus half the rib depth over the cosine
/// of the steeper adjacent segment.
#[test]
fn the_clearance_goal_keeps_the_gap() {
    let demo = Design::demo();
    let r = seek(&demo, Goal::MinClearance { gap: 2.0 }).expect("seeks");
    assert!(r.met, "{}", r.message);
    let gap = clearance(&valid(&r.design));
    assert!((2.0..2.01).contains(&gap), "{gap}");
    let higher = clearance(&valid(&with_rise(&demo, r.rise + 1e-3)));
    assert!(higher < 2.0, "{higher}");
    // by hand at the crown node
    let mut level = demo.clone();
    level.springing_right_level = level.springing_left_level;
    let v = valid(&level);
    let rib = &v.form().rib;
    let c = v.form().crown_node;
    let slope = |a: usize, b: usize| ((rib[b].y - rib[a].y) / (rib[b].x - rib[a].x)).abs();
    let steeper = slope(c - 1, c).max(slope(c, c + 1));
    let crown_gap = demo.deck.level
        - demo.groups.deck.depth
        - (rib[c].y + 0.5 * demo.groups.rib.depth * (1.0 + steeper * steeper).sqrt());
    assert!((clearance(&v) - crown_gap).abs() < 1e-9, "{} vs {crown_gap}", clearance(&v));
}

/// The least cost index: no higher than the cost of every option of a 31-step sweep
/// (`arch::sweep`) over the same range of rises, the returned design sized again to the
/// same cost.
#[test]
fn the_least_cost_goal_beats_every_point_of_the_sweep() {
    let mut demo = Design::demo();
    demo.panels = 8;
    let r = seek(&demo, Goal::Least { measure: Measure::Cost }).expect("seeks");
    assert!(r.met, "{}", r.message);
    let again = springline_statics::arch::sizing::size_of(&r.design).expect("sizes");
    assert!((again.quantities.cost_index - r.value).abs() < 1e-9 * r.value);
    let span = valid(&demo).form().span;
    let values: Vec<f64> = (0..SCAN_STEPS)
        .map(|i| (r.range[0] + (r.range[1] - r.range[0]) * i as f64 / (SCAN_STEPS - 1) as f64) / span)
        .collect();
    let s = sweep(&demo, &[Axis { parameter: Parameter::RiseRatio, values }], true).expect("sweeps");
    let feasible: Vec<f64> =
        s.rows.iter().filter(|row| row.feasible).filter_map(|row| row.cost_index).collect();
    assert!(feasible.len() > SCAN_STEPS / 2, "{} feasible", feasible.len());
    for c in feasible {
        assert!(r.value <= c + 1e-9 * c, "{} above a swept {c}", r.value);
    }
}

/// A thrust no rise can reach: not met, the nearest value (the least thrust, at the
/// largest rise) and the range in the message. Bad targets are refused with a reason.
#[test]
fn an_unreachable_goal_says_so_with_the_nearest_value() {
    let demo = Design::demo();
    let r = seek(&demo, Goal::MaxThrust { thrust: 1.0 }).expect("seeks");
    assert!(!r.met);
    assert!((r.rise - r.range[1]).abs() < RISE_RESOLUTION + 1e-9, "the nearest is at the largest rise");
    assert!(r.message.contains("no rise") && r.message.contains("nearest"), "{}", r.message);
    assert!((valid(&r.design).form().thrust - r.value).abs() < 1e-9 * r.value);
    for bad in [
        Goal::MaxThrust { thrust: -1.0 },
        Goal::SpringingAngle { degrees: 95.0, side: Side::Left },
        Goal::MinClearance { gap: f64::NAN },
    ] {
        let e = seek(&demo, bad).expect_err("refused");
        assert!(e.to_string().contains("give"), "{e}");
    }
}

/// Shaping by the thrust (what the pole drag asks), a three-hinged rib: the found design's
/// bare rib, solved by the stiffness solver under its form-finding loads (the dead case
/// of the bare-rib model), pushes on its left springing with H = the thrust asked, to
/// 1e-6 relative (a three-hinged funicular carries its loads by thrust alone: the
/// solver's H equals the form's).
#[test]
fn a_rib_shaped_to_a_thrust_carries_that_thrust_in_the_solver() {
    use springline_statics::analyze;
    let demo = Design::demo();
    for asked in [7_500.0, 9_000.0] {
        let shaped = springline_statics::arch::seek::shape_for_thrust(&demo, asked).expect("shapes");
        assert!(shaped.stopped.is_none(), "{:?}", shaped.stopped);
        assert!((shaped.thrust / asked - 1.0).abs() < 1e-9);
        let a = analyze(&shaped.design).expect("analyses");
        let dead = a.bare_rib.solution.case("dead").expect("dead case");
        let left = a.bare_rib.map.springings[0];
        let h = dead.reaction(left).expect("a reaction").fx.abs();
        assert!((h / asked - 1.0).abs() < 1e-6, "{h} vs {asked}");
        assert!((shaped.design.rise() - shaped.rise).abs() < 1e-12);
    }
    // beyond the largest rise: the pole stops there and says why
    let far = springline_statics::arch::seek::shape_for_thrust(&demo, 1_000.0).expect("shapes");
    let why = far.stopped.expect("stopped");
    assert!(why.contains("largest rise"), "{why}");
    assert!(far.thrust > 1_000.0);
}

/// A rib carrying only its own weight (level springings, no deck load, weightless deck
/// and posts), shaped to H by the pole: its rise is the catenary's f = (H / q)(cosh(q L /
/// (2H)) - 1) (any statics text on cables, e.g. Timoshenko & Young, Theory of
/// Structures, from memory) within the panel discretisation's error, 0.15 / n^2 relative
/// (stated and measured for the form's polygon in `as_built.rs`).
#[test]
fn a_self_weight_rib_shaped_by_the_pole_is_the_catenary() {
    for panels in [16, 32] {
        let mut d = Design::demo();
        d.springing_right_level = d.springing_left_level;
        d.panels = panels;
        d.bracing = springline_statics::arch::design::Bracing::None;
        d.deck.dead_load = 0.0;
        d.deck.surfacing = 0.0;
        d.groups.deck.unit_weight = 0.0;
        d.groups.posts.unit_weight = 0.0;
        let q = d.groups.rib.unit_weight * d.groups.rib.a * d.deck.ribs as f64;
        let h0 = valid(&d).form().thrust;
        let asked = 1.2 * h0;
        let shaped = springline_statics::arch::seek::shape_for_thrust(&d, asked).expect("shapes");
        assert!(shaped.stopped.is_none(), "{:?}", shaped.stopped);
        let v = valid(&shaped.design);
        let (l, f) = (v.form().span, v.form().rise);
        let catenary = asked / q * ((q * l / (2.0 * asked)).cosh() - 1.0);
        let error = (catenary - f).abs() / f;
        assert!(error <= 0.15 / (panels * panels) as f64, "{panels} panels: {error:e}");
    }
}

/// Every rib system with every bracing option (the demo's unequal springings kept): the
/// thrust goal at 95 % of the design's own form thrust is met, checked by analysing the
/// returned design again, and shaping by the same thrust (the pole drag) reaches it to
/// 1e-9.
#[test]
fn every_rib_system_and_bracing_takes_the_thrust_goal_and_the_pole() {
    use springline_statics::arch::design::{Bracing, RibSystem};
    use springline_statics::arch::seek::shape_for_thrust;
    for system in [RibSystem::ThreeHinged, RibSystem::TwoHinged, RibSystem::Fixed] {
        for bracing in [Bracing::None, Bracing::Single { flipped: false }, Bracing::Crossed] {
            let mut d = Design::demo();
            d.rib_system = system;
            d.bracing = bracing;
            let own = valid(&d).form().thrust;
            let target = 0.95 * own;
            let r = seek(&d, Goal::MaxThrust { thrust: target }).expect("seeks");
            assert!(r.met, "{system:?}, {bracing:?}: {}", r.message);
            let h = valid(&r.design).form().thrust;
            assert!(h <= target && h >= target * (1.0 - 1e-4), "{system:?}, {bracing:?}: {h} vs {target}");
            let shaped = shape_for_thrust(&d, target).expect("shapes");
            assert!(shaped.stopped.is_none(), "{system:?}, {bracing:?}: {:?}", shaped.stopped);
            assert!(
                (valid(&shaped.design).form().thrust / target - 1.0).abs() < 1e-9,
                "{system:?}, {bracing:?}"
            );
        }
    }
}

/// A two-hinged or fixed rib's force diagram shows the form's pole beside the solver's:
/// its distance from the load line is the form thrust (the three-point construction
/// through the crown under the bare rib's loads, any graphic statics text), to 1e-9; a
/// three-hinged rib has one pole only.
#[test]
fn a_hingeless_rib_shows_the_forms_pole_at_the_form_thrust() {
    use springline_statics::analyze;
    use springline_statics::arch::design::RibSystem;
    use springline_statics::scene::force::{force_drawing, ForceOptions};
    use springline_statics::scene::Viewport;
    for system in [RibSystem::TwoHinged, RibSystem::Fixed, RibSystem::ThreeHinged] {
        let mut d = Design::demo();
        d.rib_system = system;
        let a = analyze(&d).expect("analyses");
        let dead = &a.load_cases[0];
        match (system, dead.form_pole) {
            (RibSystem::ThreeHinged, pole) => assert!(pole.is_none()),
            (_, Some(p)) => {
                assert!(
                    (-p.x / a.form.thrust - 1.0).abs() < 1e-9,
                    "{system:?}: {} vs {}",
                    -p.x,
                    a.form.thrust
                );
                let drawing = force_drawing(&a, 0, &ForceOptions::default(), Viewport::new(900.0, 500.0));
                assert!(drawing.scene.labels.iter().any(|l| l.text.starts_with("form's pole")), "{system:?}");
            }
            (_, None) => panic!("{system:?}: no form's pole"),
        }
    }
}
