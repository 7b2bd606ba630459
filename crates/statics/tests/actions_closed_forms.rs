//! The other actions of a design (temperature, springing movement, braking, erection)
//! through the whole engine, against statics and closed forms worked in this file.
//!
//! Sources:
//! - [TY] Timoshenko & Young, Theory of Structures, 2nd ed., ch. 9 (arches): the unit-load
//!   (virtual work) equation of a two-hinged arch, H = alpha dT L / (int y^2 ds / EI +
//!   int cos^2(theta) ds / EA), and the three-hinged arch's moments M = M0 - H y; from
//!   memory, derivations written out below.
//! - Statical determinacy: a three-hinged system with sliding seats moves freely under a
//!   uniform temperature or a springing movement (any statics text).

use springline_statics::arch::actions::{action_results, ActionsReport, ERECTION, SPRINGING_MOVEMENT};
use springline_statics::arch::actions::{TEMPERATURE_FALL, TEMPERATURE_RISE};
use springline_statics::arch::cases::{add_cases, CaseKind, CaseSpec, Imposed};
use springline_statics::arch::design::{Bracing, Design, RibSystem};
use springline_statics::arch::generate::bare_rib_model;
use springline_statics::arch::validate::ValidDesign;
use springline_statics::solve;

fn report(d: &Design) -> ActionsReport {
    action_results(&ValidDesign::new(d).expect("valid design")).expect("actions solve")
}

fn case<'a>(r: &'a ActionsReport, name: &str) -> &'a springline_statics::arch::actions::ActionResult {
    r.cases.iter().find(|c| c.case == name).unwrap_or_else(|| panic!("no case {name}"))
}

/// The largest force of an action result: member axial forces, rib moment, springings.
fn largest(c: &springline_statics::arch::actions::ActionResult) -> f64 {
    [
        c.max_tension,
        c.max_compression,
        c.rib_moment,
        c.left.thrust,
        c.left.vertical,
        c.left.moment,
        c.right.thrust,
        c.right.vertical,
        c.right.moment,
    ]
    .iter()
    .fold(0.0_f64, |m, v| m.max(v.abs()))
}

/// A case of a uniform temperature change `delta_t` (K) of every member, alone.
fn uniform_temperature(name: &str, delta_t: f64) -> CaseSpec {
    CaseSpec {
        name: name.into(),
        kind: CaseKind::Temperature { delta_t },
        with_dead: false,
        loads: Vec::new(),
        imposed: vec![Imposed::Temperature { delta_t, deck_only: false }],
    }
}

/// A three-hinged system with sliding seats is statically determinate: a uniform
/// temperature change of every member and a springing spread (or settlement) move it
/// without stressing it. The demo (braced, three-hinged, both seats sliding) and its bare
/// rib take nothing (round-off: below 1e-6 kN), while the same actions on the two-hinged
/// variant take real forces (so the check can fail).
#[test]
fn three_hinged_rib_and_braced_frame_take_no_force_from_temperature_or_spread() {
    let demo = Design::demo();
    assert_eq!(demo.rib_system, RibSystem::ThreeHinged);
    assert!(demo.bracing.is_braced());
    let r = report(&demo);
    for name in [TEMPERATURE_RISE, TEMPERATURE_FALL, SPRINGING_MOVEMENT] {
        assert!(largest(case(&r, name)) < 1e-6, "frame, {name}: {:?}", case(&r, name));
    }
    // the bare three-hinged rib, by the same cases built for it
    let valid = ValidDesign::new(&demo).expect("valid");
    let mut rib = bare_rib_model(&valid);
    rib.model.load_cases.clear();
    let specs: Vec<CaseSpec> = springline_statics::arch::actions::action_cases(&demo)
        .into_iter()
        .filter(|s| matches!(s.kind, CaseKind::Temperature { .. } | CaseKind::SpringingMovement { .. }))
        .collect();
    assert_eq!(specs.len(), 3);
    add_cases(&valid, &mut rib, &specs).expect("cases");
    let solution = solve(&rib.model).expect("solves");
    for c in &solution.cases {
        let worst = c
            .members
            .iter()
            .flat_map(|m| [m.start.n, m.start.m, m.end.m])
            .fold(0.0_f64, |a, v| a.max(v.abs()));
        assert!(worst < 1e-6, "bare rib, {}: {worst}", c.name);
    }
    // two-hinged: the same actions stress it
    let mut two = demo.clone();
    two.rib_system = RibSystem::TwoHinged;
    let r2 = report(&two);
    for name in [TEMPERATURE_RISE, TEMPERATURE_FALL, SPRINGING_MOVEMENT] {
        assert!(largest(case(&r2, name)) > 10.0, "two-hinged, {name}: {:?}", case(&r2, name));
    }
}

/// A two-hinged rib's temperature thrust by the unit-load equation of [TY], worked on the
/// rib the engine generates (straight prismatic segments between the rib nodes, E, A, I
/// of the design's rib times the number of ribs), springings level:
///
///   H = alpha dT L / (sum over segments of [ s (y1^2 + y1 y2 + y2^2) / (3 E I) ]
///                     + sum over segments of [ s cos^2(theta) / (E A) ]),
///
/// with y the height of a segment's ends above the springing chord, s its length and
/// theta its slope: for a straight segment y varies linearly, so int y^2 ds is exactly
/// s (y1^2 + y1 y2 + y2^2) / 3, and the axial force of a unit H is cos(theta). Exact
/// for the straight-segment model (no shear deformation in either), so to 1e-9.
#[test]
fn two_hinged_temperature_thrust_matches_the_unit_load_equation() {
    let mut d = Design::demo();
    d.rib_system = RibSystem::TwoHinged;
    d.bracing = Bracing::None;
    d.springing_right_level = d.springing_left_level;
    let valid = ValidDesign::new(&d).expect("valid");
    let rib = bare_rib_model(&valid);
    let m = &rib.model;
    let chain: Vec<usize> = rib.map.rib_nodes.clone();
    let y0 = m.nodes[chain[0]].y;
    assert!((m.nodes[*chain.last().expect("nodes")].y - y0).abs() < 1e-9, "level springings");
    let span = m.nodes[*chain.last().expect("nodes")].x - m.nodes[chain[0]].x;
    let (mut flexural, mut axial) = (0.0, 0.0);
    for &k in &rib.map.rib_members {
        let mem = &m.members[k];
        let (a, b) = (&m.nodes[mem.start], &m.nodes[mem.end]);
        let s = (b.x - a.x).hypot(b.y - a.y);
        let (y1, y2) = (a.y - y0, b.y - y0);
        let cos = (b.x - a.x).abs() / s;
        flexural += s * (y1 * y1 + y1 * y2 + y2 * y2) / (3.0 * mem.e * mem.i);
        axial += s * cos * cos / (mem.e * mem.a);
    }
    let t = &d.actions.temperature;
    let expected = t.alpha * t.expansion * span / (flexural + axial);
    // the engine: the bare rib under the temperature rise alone
    let mut generated = bare_rib_model(&valid);
    generated.model.load_cases.clear();
    let rise = uniform_temperature("rise", t.expansion);
    add_cases(&valid, &mut generated, &[rise]).expect("case");
    let solution = solve(&generated.model).expect("solves");
    let left = solution.cases[0].reaction(chain[0]).expect("left springing");
    // a warmer rib pushes its springings apart: the reaction on the rib at the left
    // points right (positive fx, the outward push of SpringingForce)
    assert!((left.fx - expected).abs() < 1e-9 * expected, "{} vs {expected}", left.fx);
    assert!(expected > 10.0, "a real thrust: {expected} kN");
    // a spread of the springings by delta (each outward by delta / 2): the same equation
    // with alpha dT L replaced by -delta, so H = -delta / (the same flexibility): the
    // springings moving apart take thrust away. A settlement of one springing (level
    // springings) turns the chord, which to first order moves no hinge apart: no thrust.
    let mut moved = bare_rib_model(&valid);
    moved.model.load_cases.clear();
    let spread = 0.02;
    let movement = |name: &str, spread: f64, settle_right: f64| CaseSpec {
        name: name.into(),
        kind: CaseKind::SpringingMovement { spread, settlement_left: 0.0, settlement_right: settle_right },
        with_dead: false,
        loads: Vec::new(),
        imposed: vec![Imposed::SpringingMovement {
            spread,
            settlement_left: 0.0,
            settlement_right: settle_right,
        }],
    };
    add_cases(&valid, &mut moved, &[movement("spread", spread, 0.0), movement("settle", 0.0, 0.02)])
        .expect("cases");
    let solved = solve(&moved.model).expect("solves");
    let h_spread = solved.cases[0].reaction(chain[0]).expect("left").fx;
    let expected_spread = -spread / (flexural + axial);
    assert!(
        (h_spread - expected_spread).abs() < 1e-9 * expected_spread.abs(),
        "{h_spread} vs {expected_spread}"
    );
    assert!(expected_spread < 0.0, "a spread lowers the thrust: {expected_spread} kN");
    let h_settle = solved.cases[1].reaction(chain[0]).expect("left").fx;
    assert!(h_settle.abs() < 1e-6 * expected_spread.abs(), "a settlement of level springings: {h_settle}");
    // and through the action report (frame model: the deck takes part, so only the sign
    // and the order of magnitude are the rib's)
    let r = report(&d);
    let frame_rise = case(&r, TEMPERATURE_RISE);
    assert!(frame_rise.left.thrust > 0.0 && frame_rise.left.thrust < 10.0 * expected);
}

/// Erection of a three-hinged rib: the bare rib under its own weight alone. By statics
/// alone ([TY], three-hinged arches): with P_i the rib weight lumped at the rib nodes (half
/// of each segment's weight at each end: the same node moments as the distributed load),
/// M0(x) the simple-beam moment between the springings, y_c(x) the chord through the
/// springings, the three-point funicular through the springings and the crown hinge C is
/// y_f = y_c + M0 / H_e with H_e = M0(x_C) / (y_C - y_c(x_C)), and the rib's moment at a
/// node is M = M0 - H_e (y - y_c) = H_e (y_f - y): thrust times the vertical distance
/// between the funicular and the rib (sagging positive). The demo's rib is the funicular
/// of the whole dead load, not of its own weight, so these moments are not zero.
#[test]
fn erection_moments_are_thrust_times_the_distance_to_the_own_weight_funicular() {
    let d = Design::demo();
    let valid = ValidDesign::new(&d).expect("valid");
    let rib = bare_rib_model(&valid);
    let m = &rib.model;
    let nodes: Vec<(f64, f64)> = rib.map.rib_nodes.iter().map(|&k| (m.nodes[k].x, m.nodes[k].y)).collect();
    let weight_per_m = d.groups.rib.unit_weight * d.groups.rib.a * d.deck.ribs as f64;
    let mut p = vec![0.0; nodes.len()];
    for i in 0..nodes.len() - 1 {
        let s = (nodes[i + 1].0 - nodes[i].0).hypot(nodes[i + 1].1 - nodes[i].1);
        p[i] += 0.5 * weight_per_m * s;
        p[i + 1] += 0.5 * weight_per_m * s;
    }
    let (xa, ya) = nodes[0];
    let (xb, yb) = *nodes.last().expect("nodes");
    let span = xb - xa;
    // simple-beam moment from the loads between the springings (the end loads go
    // straight into the supports)
    let va: f64 = p.iter().zip(&nodes).map(|(pi, (x, _))| pi * (xb - x) / span).sum();
    let m0 = |x: f64| {
        va * (x - xa)
            - p.iter()
                .zip(&nodes)
                .filter(|(_, (xi, _))| *xi < x)
                .map(|(pi, (xi, _))| pi * (x - xi))
                .sum::<f64>()
    };
    let chord = |x: f64| ya + (yb - ya) * (x - xa) / span;
    let crown = rib.map.rib_nodes.iter().position(|&k| k == rib.map.crown).expect("crown");
    let (xc, yc) = nodes[crown];
    let h_e = m0(xc) / (yc - chord(xc));
    // the engine's erection case
    let r = report(&d);
    let erection = case(&r, ERECTION);
    assert!((erection.left.thrust - h_e).abs() < 1e-9 * h_e, "{} vs {h_e}", erection.left.thrust);
    let mut generated = bare_rib_model(&valid);
    generated.model.load_cases.clear();
    let spec = springline_statics::arch::actions::action_cases(&d)
        .into_iter()
        .find(|s| s.kind == CaseKind::Erection)
        .expect("erection case");
    add_cases(&valid, &mut generated, &[spec]).expect("case");
    let solution = solve(&generated.model).expect("solves");
    let mut largest = 0.0_f64;
    for (j, &k) in rib.map.rib_members.iter().enumerate() {
        // rib members run left to right from node j to j + 1: sagging positive
        let forces = &solution.cases[0].members[k];
        for (node, moment) in [(j, forces.start.m), (j + 1, forces.end.m)] {
            let (x, y) = nodes[node];
            let funicular = chord(x) + m0(x) / h_e;
            let expected = h_e * (funicular - y);
            assert!((moment - expected).abs() < 1e-7 * h_e, "node {node}: {moment} vs {expected}");
            largest = largest.max(expected.abs());
        }
    }
    // not zero on a rib shaped for the whole dead load: more than 1 kNm for a thrust of
    // several hundred kN, and what the report says
    assert!(largest > 1.0 && h_e > 100.0, "{largest} kNm, H_e {h_e} kN");
    assert!((erection.rib_moment.abs() - largest).abs() < 1e-7 * h_e);
}

/// A fixed rib reports its springing moments for every action (temperature, springing
/// movement, braking, erection): each non-zero and equal to the negative of the support's
/// reaction moment (the moment the rib puts on its abutment, anticlockwise positive).
#[test]
fn a_fixed_rib_reports_its_springing_moments_for_every_action() {
    let mut d = Design::demo();
    d.rib_system = RibSystem::Fixed;
    let r = report(&d);
    let kinds: Vec<CaseKind> = r.cases.iter().map(|c| c.kind).collect();
    assert!(kinds.iter().any(|k| matches!(k, CaseKind::Braking { .. })));
    assert!(kinds.contains(&CaseKind::Erection));
    assert_eq!(r.cases.len(), 7, "rise, fall, deck warmer, deck cooler, movement, braking, erection");
    for c in &r.cases {
        assert!(
            c.left.moment.abs() > 1.0 && c.right.moment.abs() > 1.0,
            "{}: springing moments {} / {} kNm",
            c.case,
            c.left.moment,
            c.right.moment
        );
    }
    // against a direct solve of the erection case
    let valid = ValidDesign::new(&d).expect("valid");
    let mut rib = bare_rib_model(&valid);
    rib.model.load_cases.clear();
    let spec = springline_statics::arch::actions::action_cases(&d)
        .into_iter()
        .find(|s| s.kind == CaseKind::Erection);
    add_cases(&valid, &mut rib, &[spec.expect("erection")]).expect("case");
    let solution = solve(&rib.model).expect("solves");
    let mz = solution.cases[0].reaction(rib.map.springings[0]).expect("left").mz;
    assert_eq!(case(&r, ERECTION).left.moment, -mz);
}

/// A two-hinged parabolic rib under a uniform temperature rise against the handbook
/// closed form H_t = 15 E I_c alpha dT / (8 f^2) ([TY] ch. 9, two-hinged arches, with the
/// section I = I_c sec(theta) and rib shortening neglected; from memory). The design is
/// made parabolic: springings level, no self-weight anywhere, so the form-finding load is
/// the deck's alone, equal panel loads at equal spacing, whose funicular has its vertices
/// on a parabola (checked here). The engine's rib keeps one section (I constant, not
/// I_c sec(theta)) and shortens, both of which make it a little more flexible than the
/// handbook's: its thrust is a little lower, never higher (0.7 % at rise / span 0.12 here).
#[test]
fn a_two_hinged_parabolic_rib_takes_the_handbook_temperature_thrust() {
    let mut d = Design::demo();
    d.rib_system = RibSystem::TwoHinged;
    d.bracing = Bracing::None;
    d.springing_right_level = d.springing_left_level;
    d.crown = springline_statics::arch::design::Crown::Level { level: 88.0 };
    for s in [
        &mut d.groups.rib,
        &mut d.groups.deck,
        &mut d.groups.posts,
        &mut d.groups.piers,
        &mut d.groups.bracing,
    ] {
        s.unit_weight = 0.0;
    }
    let valid = ValidDesign::new(&d).expect("valid");
    let rib = bare_rib_model(&valid);
    let m = &rib.model;
    let nodes: Vec<(f64, f64)> = rib.map.rib_nodes.iter().map(|&k| (m.nodes[k].x, m.nodes[k].y)).collect();
    let (xa, ya) = nodes[0];
    let (xb, _) = *nodes.last().expect("nodes");
    let span = xb - xa;
    let f = valid.form().rise;
    // the rib nodes on the parabola y = ya + 4 f x (L - x) / L^2
    for &(x, y) in &nodes {
        let t = x - xa;
        let parabola = ya + 4.0 * f * t * (span - t) / (span * span);
        assert!((y - parabola).abs() < 1e-6 * f, "({x}, {y}) vs {parabola}");
    }
    assert!((0.1..0.15).contains(&(f / span)), "rise / span {}", f / span);
    let t = &d.actions.temperature;
    let rib_section = &d.groups.rib;
    let ei = rib_section.e * rib_section.i * d.deck.ribs as f64;
    let handbook = 15.0 * ei * t.alpha * t.expansion / (8.0 * f * f);
    let mut generated = bare_rib_model(&valid);
    generated.model.load_cases.clear();
    let rise = uniform_temperature("rise", t.expansion);
    add_cases(&valid, &mut generated, &[rise]).expect("case");
    let solution = solve(&generated.model).expect("solves");
    let h = solution.cases[0].reaction(rib.map.springings[0]).expect("left").fx;
    let ratio = h / handbook;
    assert!((0.98..1.0).contains(&ratio), "engine {h} kN, handbook {handbook} kN, ratio {ratio}");
}
