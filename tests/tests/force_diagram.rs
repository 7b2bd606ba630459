//! The force diagram (reciprocal figure with Bow's notation) of the truss idealisation and
//! the pole construction of the rib, checked against independent computations:
//!
//! - every segment of the figure against the stiffness solver's axial force times the
//!   member's unit vector (the solver knows nothing of the figure; the figure only uses
//!   the forces to walk from space to space, one step per member or external force);
//! - the three-point construction (statics of the loads alone) against the stiffness
//!   solution of the same three-hinged rib or determinate truss;
//! - closed forms for three-hinged arches (Timoshenko & Young, Theory of Structures,
//!   ch. 9; from memory).

use proptest::prelude::*;
use springline_statics::arch::cases::{doubled_panel, half_span, standard_cases, CaseSpec, Half};
use springline_statics::arch::design::{Bracing, Crown, Design, RibSystem};
use springline_statics::graphic::funicular::FunicularMethod;
use springline_statics::tolerance::ZERO_FORCE;
use springline_statics::{
    add_cases, analyze, bare_rib_model, force_diagram, frame, rib_funicular, solve, truss_determinacy,
    truss_model, AxialSense, CaseResult, Determinacy, ForceDiagram, Generated, LoadCase, MemberRole, Model,
    NodalLoad, SegmentOf, SpaceKind, Support, ValidDesign,
};

/// Tolerance of the figure against the solver, as a fraction of the largest force: the
/// acceptance criterion of the force-diagram issue.
const FIGURE_TOL: f64 = 1e-9;

fn design(panels: usize, system: RibSystem, bracing: Bracing, springings: (f64, f64)) -> Design {
    let mut d = Design::demo();
    d.panels = panels;
    d.rib_system = system;
    d.bracing = bracing;
    d.springing_left_level = springings.0;
    d.springing_right_level = springings.1;
    d.form.tolerance = 1e-12;
    d
}

/// The design's truss idealisation with dead, half-span and doubled-panel cases.
fn truss_with_cases(d: &Design) -> Generated {
    let v = ValidDesign::new(d).expect("valid");
    let mut truss = truss_model(&v).expect("braced");
    let specs = vec![
        half_span(&v, Half::Left, 5.0).expect("half"),
        half_span(&v, Half::Right, 3.0).expect("half right"),
        doubled_panel(&v, (d.panels / 3).max(1)).expect("doubled"),
        CaseSpec { with_dead: false, ..half_span(&v, Half::Left, 5.0).expect("half") },
    ];
    let specs: Vec<CaseSpec> = specs
        .into_iter()
        .enumerate()
        .map(|(k, s)| CaseSpec { name: format!("{} #{k}", s.name), ..s })
        .collect();
    add_cases(&v, &mut truss, &specs).expect("cases");
    truss
}

/// Checks one figure against the solver's results for the same model and case: every
/// member piece, every external force, senses, zero-force members, closure of the load
/// line, one point per space. Returns the largest error over the largest force.
fn check_figure(model: &Model, case: &CaseResult, fd: &ForceDiagram) -> f64 {
    let largest = fd.largest_force;
    assert!(largest > 0.0);
    let mut worst: f64 = 0.0;
    for (k, mem) in model.members.iter().enumerate() {
        let (a, b) = (&model.nodes[mem.start], &model.nodes[mem.end]);
        let l = (b.x - a.x).hypot(b.y - a.y);
        let n = case.members[k].end.n;
        let expected = (n * (b.x - a.x) / l, n * (b.y - a.y) / l);
        let mut pieces = 0;
        for seg in fd.member_segments(k) {
            pieces += 1;
            // one check for length, direction and tension / compression
            let (vx, vy) = (seg.to.x - seg.from.x, seg.to.y - seg.from.y);
            let err = (vx - expected.0).hypot(vy - expected.1);
            worst = worst.max(err / largest);
            assert!(err <= FIGURE_TOL * largest, "member {k}: segment ({vx}, {vy}) vs N e {expected:?}");
            // the stored points are the spaces' points
            assert_eq!(seg.from, fd.spaces[seg.left].point);
            assert_eq!(seg.to, fd.spaces[seg.right].point);
            // sense read from the figure agrees with the solver's sign
            if n.abs() > FIGURE_TOL * largest * 10.0 {
                let want = if n > 0.0 { AxialSense::Tension } else { AxialSense::Compression };
                assert_eq!(seg.sense, Some(want), "member {k}, N = {n}");
            }
        }
        assert!(pieces >= 1, "member {k} has no segment");
        if n.abs() <= FIGURE_TOL * largest {
            assert!(fd.zero_force_members.contains(&k), "member {k} carries nothing but is not reported");
        }
    }
    // external forces: loads summed per node, reactions from the solver
    let lc = model.load_cases.iter().find(|c| c.name == case.name).expect("case");
    let mut n_loads = 0;
    for seg in fd.external_segments() {
        let (vx, vy) = (seg.to.x - seg.from.x, seg.to.y - seg.from.y);
        let (fx, fy) = match seg.of {
            SegmentOf::Load { node } => {
                n_loads += 1;
                lc.nodal.iter().filter(|l| l.node == node).fold((0.0, 0.0), |a, l| (a.0 + l.fx, a.1 + l.fy))
            }
            SegmentOf::Reaction { node } => {
                let r = case.reaction(node).expect("reaction");
                (r.fx, r.fy)
            }
            SegmentOf::Member { .. } => unreachable!("external segments only"),
        };
        let err = (vx - fx).hypot(vy - fy);
        worst = worst.max(err / largest);
        assert!(err <= FIGURE_TOL * largest, "{:?}: ({vx}, {vy}) vs ({fx}, {fy})", seg.of);
    }
    let loaded_nodes = {
        let mut v: Vec<usize> = lc.nodal.iter().map(|l| l.node).collect();
        v.sort_unstable();
        v.dedup();
        v.len()
    };
    assert_eq!(n_loads, loaded_nodes);
    // exactly one point per space: outside spaces = external forces; inside spaces =
    // faces of the plane figure (Euler: E - V + 1 with pass-through vertices)
    let externals = fd.external_segments().count();
    let outside = fd.spaces.iter().filter(|s| s.kind == SpaceKind::Outside).count();
    assert_eq!(outside, externals);
    assert_eq!(fd.load_line.len(), externals);
    let pieces = fd.segments.len() - externals;
    let vertices = model.nodes.len() + fd.crossings.len();
    assert_eq!(fd.spaces.len() - outside, pieces + 1 - vertices);
    // the load line: consecutive outside points joined by the external forces in order,
    // closing back on A
    let ext: Vec<_> = fd.external_segments().collect();
    for (i, seg) in ext.iter().enumerate() {
        assert_eq!(seg.left, fd.load_line[i]);
        assert_eq!(seg.right, fd.load_line[(i + 1) % ext.len()]);
    }
    assert!(fd.closure_error <= FIGURE_TOL * largest);
    assert_bow_order_about_every_joint(model, fd);
    worst
}

/// Bow's notation read about every joint, from the geometry alone: going clockwise about
/// a joint, each member and external force lies between the space met before it and the
/// space met after it, so the second space of one is the first space of the next (Allen &
/// Zalewski, Form and Forces, ch. 3-4). The clockwise order is found here from the
/// directions of the members and of the external forces' half-lines (`ray`), not from the
/// walk that labelled the spaces. Forces at a joint taken in the wrong order still give a
/// closed figure whose segments equal their forces; only this check sees it.
fn assert_bow_order_about_every_joint(model: &Model, fd: &ForceDiagram) {
    for node in 0..model.nodes.len() {
        let at = &model.nodes[node];
        let dir = |x: f64, y: f64| (y - at.y).atan2(x - at.x);
        // (direction from the joint, space before, space after, what) clockwise about it
        let mut around: Vec<(f64, usize, usize, String)> = Vec::new();
        for (k, mem) in model.members.iter().enumerate() {
            let pieces: Vec<_> = fd.member_segments(k).collect();
            let (Some(first), Some(last)) = (pieces.first(), pieces.last()) else { continue };
            if mem.start == node {
                // the piece leaving the start: its left space comes first clockwise
                let far = &model.nodes[mem.end];
                around.push((dir(far.x, far.y), first.left, first.right, format!("member {k}")));
            }
            if mem.end == node {
                // about the end joint the member runs the other way: its right space first
                let far = &model.nodes[mem.start];
                around.push((dir(far.x, far.y), last.right, last.left, format!("member {k}")));
            }
        }
        for seg in fd.external_segments() {
            let (SegmentOf::Load { node: n } | SegmentOf::Reaction { node: n }) = seg.of else { continue };
            if n == node {
                let ray = seg.ray.expect("external forces are drawn along a half-line");
                around.push((ray.y.atan2(ray.x), seg.left, seg.right, format!("{:?}", seg.of)));
            }
        }
        // clockwise: decreasing direction angle
        around.sort_by(|p, q| q.0.total_cmp(&p.0));
        for (i, this) in around.iter().enumerate() {
            let next = &around[(i + 1) % around.len()];
            assert_eq!(
                this.2, next.1,
                "joint {node}: clockwise, {} ends in space {} but the next, {}, starts in space {}",
                this.3, fd.spaces[this.2].label, next.3, fd.spaces[next.1].label
            );
        }
    }
}

#[test]
fn figure_equals_solver_forces_on_determinate_three_hinged_trusses() {
    // 5 to 40 panels, odd and even, both diagonal directions, equal and unequal springings
    // (the demo walls place the springings at these levels), dead, half-span left and
    // right, a doubled panel load and a half-span load alone
    let mut worst: f64 = 0.0;
    for (i, n) in [5, 6, 7, 8, 9, 12, 15, 20, 25, 31, 40].into_iter().enumerate() {
        let springings = [(76.0, 80.0), (78.0, 78.0), (72.0, 86.0)][i % 3];
        let d = design(n, RibSystem::ThreeHinged, Bracing::Single { flipped: i % 2 == 1 }, springings);
        let Generated { model, map, .. } = truss_with_cases(&d);
        assert_eq!(truss_determinacy(&model).expect("valid").determinacy, Determinacy::Determinate);
        let sol = solve(&model).expect("solves");
        for case in &sol.cases {
            let fd = force_diagram(&model, case).expect("figure");
            assert!(!fd.pass_through);
            worst = worst.max(check_figure(&model, case, &fd));
        }
        // dead load on the funicular of the determinate layout: bracing carries nothing
        // (a determinate truss carries the funicular load in its chords alone), so its
        // segments are points
        let dead = force_diagram(&model, &sol.cases[0]).expect("dead figure");
        for k in map.members_with(MemberRole::Bracing) {
            assert!(dead.zero_force_members.contains(&k), "{n} panels: brace {k}");
            assert!(dead.member_segments(k).all(|s| s.zero && s.sense == Some(AxialSense::Zero)));
        }
        // under the half-span load the bracing works
        let half = force_diagram(&model, &sol.cases[1]).expect("half figure");
        assert!(map.members_with(MemberRole::Bracing).any(|k| !half.zero_force_members.contains(&k)));
    }
    println!("largest figure error over largest force: {worst:.2e}");
}

/// Two external forces at one joint of a deck-arch truss: a load at the left springing
/// (an invented erection load of (20, -50) kN, outward and down) beside the springing's
/// reaction, in every case of the determinate and of a crossed layout. No generated model
/// has a load at a support, so without this a figure that met the forces at a joint in
/// the wrong clockwise order went unnoticed (its segments still equal their forces).
/// Checked against the solver (segments = forces) and Bow's reading about every joint.
#[test]
fn load_at_a_springing_beside_its_reaction_is_read_clockwise() {
    for (n, system, bracing) in [
        (8, RibSystem::ThreeHinged, Bracing::Single { flipped: false }),
        (9, RibSystem::ThreeHinged, Bracing::Single { flipped: true }),
        (8, RibSystem::TwoHinged, Bracing::Crossed),
    ] {
        let d = design(n, system, bracing, (76.0, 80.0));
        let Generated { mut model, map, .. } = truss_with_cases(&d);
        let [left, _] = map.springings;
        for lc in &mut model.load_cases {
            lc.nodal.push(NodalLoad { node: left, fx: -20.0, fy: -50.0, mz: 0.0 });
        }
        let sol = solve(&model).expect("solves");
        for case in &sol.cases {
            let fd = force_diagram(&model, case).expect("figure");
            // both forces at the springing are in the figure, one after the other
            let at_left: Vec<usize> = fd
                .external_segments()
                .enumerate()
                .filter(|(_, s)| {
                    matches!(s.of, SegmentOf::Load { node } | SegmentOf::Reaction { node } if node == left)
                })
                .map(|(i, _)| i)
                .collect();
            assert_eq!(at_left.len(), 2, "{n} panels, {}: load and reaction at the springing", case.name);
            check_figure(&model, case, &fd);
        }
    }
}

#[test]
fn crossed_bracing_is_drawn_with_pass_through_nodes_and_still_exact() {
    // crossed pairs make the truss indeterminate and non-planar: every crossing becomes a
    // pass-through node, each crossed member two equal parallel segments
    for (n, system) in [
        (6, RibSystem::ThreeHinged),
        (9, RibSystem::ThreeHinged),
        (8, RibSystem::TwoHinged),
        (11, RibSystem::Fixed),
    ] {
        let d = design(n, system, Bracing::Crossed, (76.0, 80.0));
        let Generated { model, .. } = truss_with_cases(&d);
        assert!(matches!(
            truss_determinacy(&model).expect("valid").determinacy,
            Determinacy::Indeterminate { .. }
        ));
        let sol = solve(&model).expect("solves");
        for case in &sol.cases {
            let fd = force_diagram(&model, case).expect("figure");
            assert!(fd.pass_through && !fd.crossings.is_empty(), "{n} panels");
            assert!(fd.notes.iter().any(|t| t.contains("pass-through")));
            for c in &fd.crossings {
                assert_eq!(fd.member_segments(c.members.0).count(), 2);
                assert_eq!(fd.member_segments(c.members.1).count(), 2);
            }
            check_figure(&model, case, &fd);
        }
    }
}

#[test]
fn labels_are_stable_and_run_left_to_right() {
    // the same design gives the same figure; on the deck, letters follow the loads left
    // to right and the inside faces are numbered left to right, whatever the panel count
    for n in [6, 7, 12, 13] {
        let d = design(n, RibSystem::ThreeHinged, Bracing::Single { flipped: false }, (76.0, 80.0));
        let a = analyze(&d).expect("analysis");
        let b = analyze(&d).expect("analysis");
        assert_eq!(a.load_cases, b.load_cases);
        let t = a.truss.as_ref().expect("braced");
        for figures in &a.load_cases {
            let fd = figures.force_diagram.as_ref().expect("figure");
            assert_eq!(fd.spaces[0].label, "A");
            // deck loads left to right: their letters increase from A (a load at the
            // three-hinged crown node, met between two deck joints, takes its own letters)
            let mut deck: Vec<(f64, usize)> = fd
                .external_segments()
                .filter_map(|s| match s.of {
                    SegmentOf::Load { node } if (t.model.nodes[node].y - d.deck.level).abs() < 1e-9 => {
                        Some((t.model.nodes[node].x, s.left))
                    }
                    _ => None,
                })
                .collect();
            deck.sort_by(|p, q| p.0.total_cmp(&q.0));
            assert_eq!(deck.first().map(|p| p.1), Some(0));
            assert!(deck.windows(2).all(|w| w[0].1 < w[1].1), "{n} panels: deck letters out of order");
            // inside faces: numbers increase with x
            let mut inside: Vec<(f64, u32)> = fd
                .spaces
                .iter()
                .filter(|s| s.kind == SpaceKind::Inside)
                .map(|s| (s.label_at.x, s.label.parse().expect("number")))
                .collect();
            inside.sort_by(|p, q| p.0.total_cmp(&q.0));
            assert!(inside.windows(2).all(|w| w[0].1 < w[1].1));
            assert_eq!(inside.first().map(|p| p.1), Some(1));
        }
    }
    // adding a panel adds one deck joint: two more letters along the top (one load per
    // deck joint and the space after it) and the deck labels keep their order
    let count = |n: usize| {
        let d = design(n, RibSystem::ThreeHinged, Bracing::Single { flipped: false }, (76.0, 80.0));
        let a = analyze(&d).expect("analysis");
        let fd = a.load_cases[0].force_diagram.clone().expect("figure");
        fd.spaces.iter().filter(|s| s.kind == SpaceKind::Outside).count()
    };
    assert!(count(13) > count(12));
}

#[test]
fn statically_determinate_triangle_matches_joint_equilibrium() {
    // A hand check of a figure no one computed by computer: symmetric triangle, span 8 m,
    // height 3 m, apex load 60 kN, pin and roller. Joint equilibrium (any statics text):
    // rafters -60 / (2 sin a) = -50 kN, tie 60 / (2 tan a) = +40 kN, reactions 30 kN up.
    let mut m = Model::default();
    m.add_node("L", 0.0, 0.0);
    m.add_node("T", 4.0, 3.0);
    m.add_node("R", 8.0, 0.0);
    m.add_member(springline_statics::truss("l", "", 0, 1, 2e8, 0.01));
    m.add_member(springline_statics::truss("r", "", 1, 2, 2e8, 0.01));
    m.add_member(springline_statics::truss("t", "", 0, 2, 2e8, 0.01));
    m.supports = vec![Support::pinned(0), Support::roller_along_x(2)];
    m.load_cases = vec![LoadCase {
        name: "p".into(),
        nodal: vec![NodalLoad { node: 1, fx: 0.0, fy: -60.0, mz: 0.0 }],
        ..Default::default()
    }];
    let s = solve(&m).expect("stable");
    let fd = force_diagram(&m, &s.cases[0]).expect("figure");
    let len = |k: usize| {
        let seg = fd.member_segment(k).expect("segment");
        (seg.to.x - seg.from.x).hypot(seg.to.y - seg.from.y)
    };
    assert!((len(0) - 50.0).abs() < 1e-9 && (len(1) - 50.0).abs() < 1e-9 && (len(2) - 40.0).abs() < 1e-9);
    assert_eq!(fd.member_segment(2).and_then(|s| s.sense), Some(AxialSense::Tension));
    assert_eq!(fd.member_segment(0).and_then(|s| s.sense), Some(AxialSense::Compression));
    // three outside spaces (three external forces), one inside face
    assert_eq!(fd.spaces.iter().filter(|s| s.kind == SpaceKind::Outside).count(), 3);
    assert_eq!(fd.spaces.iter().filter(|s| s.kind == SpaceKind::Inside).count(), 1);
}

/// Checks a three-point construction against the stiffness solution of the same model and
/// case, and the beam split against the simple-beam reactions computed here by moments.
fn check_pole(model: &Model, case: &CaseResult, left: usize, right: usize, crown: usize) {
    let f = rib_funicular(model, case, left, right, Some(crown)).expect("construction");
    assert_eq!(f.method, FunicularMethod::ThreePoint);
    let s = f.solver.expect("solver reactions");
    // pole distance = the solver's horizontal reaction, to 1e-9 relative
    assert!((f.thrust - s.h).abs() <= 1e-9 * s.h.abs(), "{}: H {} vs {}", case.name, f.thrust, s.h);
    let total: f64 = f.loads.iter().map(|q| q.p).sum();
    // horizontal through the pole = the solver's vertical reactions
    assert!((f.vertical_reactions.0 - s.v_a).abs() <= 1e-9 * total, "{}: V_A", case.name);
    assert!((f.vertical_reactions.1 - s.v_b).abs() <= 1e-9 * total, "{}: V_B", case.name);
    assert!((-f.construction.horizontal_split - s.v_a).abs() <= 1e-9 * total);
    // ray parallel to the chord = simple-beam reactions, by moments about A
    let (a, b) = (f.springing_left, f.springing_right);
    let l = b.x - a.x;
    let r_b: f64 = f.loads.iter().map(|q| q.p * (q.x - a.x) / l).sum();
    assert!((f.beam_reactions.1 - r_b).abs() <= 1e-9 * total, "{}: R_B", case.name);
    assert!((f.beam_reactions.0 - (total - r_b)).abs() <= 1e-9 * total, "{}: R_A", case.name);
    // the two splits differ by H (y_B - y_A) / L (the pole construction: the ray parallel to the chord splits the load line into the beam reactions)
    let shift = f.thrust * (b.y - a.y) / l;
    assert!((f.vertical_reactions.0 - f.beam_reactions.0 - shift).abs() <= 1e-9 * total);
    // the polygon runs through both springings and the crown point
    let end = f.construction.polygon.last().expect("end");
    assert!((end.y - b.y).abs() <= 1e-9 * l);
    let c = f.crown.expect("crown");
    let poly = &f.construction.polygon;
    let level_at_crown = poly
        .windows(2)
        .find(|w| w[0].x <= c.x && c.x <= w[1].x && w[1].x > w[0].x)
        .map(|w| w[0].y + (w[1].y - w[0].y) * (c.x - w[0].x) / (w[1].x - w[0].x))
        .expect("polygon spans the crown");
    assert!((level_at_crown - c.y).abs() <= 1e-9 * l, "{}: polygon misses the crown point", case.name);
    // rays: one per load-line point, from the pole
    assert_eq!(f.construction.rays.len(), f.loads.len() + 1);
}

#[test]
fn pole_construction_equals_stiffness_solution_of_three_hinged_ribs_and_trusses() {
    for (i, n) in [4, 5, 8, 11, 16, 23, 40].into_iter().enumerate() {
        let springings = [(76.0, 80.0), (72.0, 86.0), (78.0, 78.0)][i % 3];
        let d = design(n, RibSystem::ThreeHinged, Bracing::Single { flipped: false }, springings);
        let v = ValidDesign::new(&d).expect("valid");
        let specs = standard_cases(&v);
        // the bare three-hinged rib
        let mut rib = bare_rib_model(&v);
        add_cases(&v, &mut rib, &specs).expect("cases");
        let sol = solve(&rib.model).expect("rib solves");
        let [left, right] = rib.map.springings;
        for case in &sol.cases {
            check_pole(&rib.model, case, left, right, rib.map.crown);
        }
        // the determinate truss idealisation: two rigid halves hinged at the crown rib
        // node, so the same construction with all its joint loads holds
        let truss = truss_with_cases(&d);
        let sol = solve(&truss.model).expect("truss solves");
        let [left, right] = truss.map.springings;
        for case in &sol.cases {
            check_pole(&truss.model, case, left, right, truss.map.crown);
        }
    }
}

#[test]
fn three_hinged_rib_point_load_matches_the_handbook_closed_form() {
    // Three-hinged parabolic arch, level supports, point load P at a (Timoshenko & Young,
    // Theory of Structures, ch. 9, from memory): V_A = P (L - a) / L,
    // V_B = P a / L, H = V_B (L / 2) / f for a <= L / 2.
    let (span, rise, segs, p) = (60.0, 12.0, 12, 300.0);
    let mut m = Model::default();
    for i in 0..=segs {
        let x = span * i as f64 / segs as f64;
        m.add_node(format!("R{i}"), x, 4.0 * rise * x * (span - x) / (span * span));
    }
    for i in 0..segs {
        let mut mem = frame(&format!("r{i}"), "rib", i, i + 1, 2.1e8, 0.1, 0.01);
        mem.release_end = i + 1 == segs / 2;
        m.add_member(mem);
    }
    m.supports = vec![Support::pinned(0), Support::pinned(segs)];
    for k in [1, 3, 5] {
        let a = span * k as f64 / segs as f64;
        m.load_cases = vec![LoadCase {
            name: format!("P at {a} m"),
            nodal: vec![NodalLoad { node: k, fx: 0.0, fy: -p, mz: 0.0 }],
            ..Default::default()
        }];
        let s = solve(&m).expect("stable");
        let f = rib_funicular(&m, &s.cases[0], 0, segs, Some(segs / 2)).expect("construction");
        let (va, vb) = (p * (span - a) / span, p * a / span);
        let h = vb * (span / 2.0) / rise;
        assert!((f.thrust - h).abs() < 1e-9 * h, "a = {a}: H {} vs {h}", f.thrust);
        assert!(
            (f.vertical_reactions.0 - va).abs() < 1e-9 * p && (f.vertical_reactions.1 - vb).abs() < 1e-9 * p
        );
        // level supports: the two splits coincide
        assert!((f.beam_reactions.0 - va).abs() < 1e-9 * p);
    }
}

#[test]
fn analysis_reports_every_figure_per_load_case() {
    let a = analyze(&Design::demo()).expect("demo");
    assert_eq!(a.load_cases.len(), 3);
    assert_eq!(a.load_cases[0].case, "dead");
    for c in &a.load_cases {
        let fd = c.force_diagram.as_ref().expect("braced demo has a figure");
        assert!(fd.closure_error <= FIGURE_TOL * fd.largest_force);
        let rf = c.rib_funicular.as_ref().expect("rib funicular");
        assert_eq!(rf.method, FunicularMethod::ThreePoint);
        let s = rf.solver.expect("solver");
        assert!((rf.thrust - s.h).abs() <= 1e-9 * s.h);
        let t = c.thrust_line.as_ref().expect("thrust line");
        assert_eq!(t.sections.len(), a.form.rib.len());
        assert!((t.depth - Design::demo().groups.rib.depth).abs() < 1e-12);
    }
    // the JSON the CLI prints names every part
    let json = serde_json::to_string(&a).expect("serialises");
    for key in [
        "load_cases",
        "force_diagram",
        "spaces",
        "label_at",
        "segments",
        "load_line",
        "pole",
        "rays",
        "polygon",
        "thrust_line",
        "offset",
    ] {
        assert!(json.contains(&format!("\"{key}\"")), "missing {key}");
    }
    // unbraced: no figure, and the notes say why
    let mut d = Design::demo();
    d.bracing = Bracing::None;
    let a = analyze(&d).expect("unbraced");
    assert!(a
        .load_cases
        .iter()
        .all(|c| c.force_diagram.is_none() && c.notes.iter().any(|n| n.to_string().contains("not braced"))));
    // two-hinged: the rib funicular comes from the solved reactions
    let mut d = Design::demo();
    d.rib_system = RibSystem::TwoHinged;
    let a = analyze(&d).expect("two-hinged");
    assert!(a
        .load_cases
        .iter()
        .all(|c| c.rib_funicular.as_ref().is_some_and(|f| f.method == FunicularMethod::SolvedReactions)));
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 24, .. ProptestConfig::default() })]
    /// Random valid braced designs whose truss idealisation solves: every case has a
    /// figure, every member segment is parallel to its member (cross product) and every
    /// external segment equals its load (from the model) or reaction (from the solver),
    /// to `FIGURE_TOL` of the largest force.
    #[test]
    fn random_braced_designs_close_and_stay_parallel(
        panels in 4usize..26,
        left in 66.0f64..90.0,
        right in 66.0f64..90.0,
        crown in 93.0f64..99.0,
        system in 0usize..3,
        bracing in 0usize..3,
    ) {
        let mut d = Design::demo();
        d.panels = panels;
        d.springing_left_level = left;
        d.springing_right_level = right;
        d.crown = Crown::Level { level: crown };
        d.rib_system = [RibSystem::ThreeHinged, RibSystem::TwoHinged, RibSystem::Fixed][system];
        d.bracing = [Bracing::Single { flipped: false }, Bracing::Single { flipped: true }, Bracing::Crossed][bracing];
        let Ok(a) = analyze(&d) else { return Ok(()) };
        // Known limit (hardening issue): where rib and deck share two neighbouring nodes,
        // the deck member between them lies on the rib member and the figure cannot be
        // drawn (two members leave a joint in the same direction); e.g. panels 9, springings
        // 70.48 and 88.61, crown 98.75, two-hinged. Such designs are left out here.
        let shared = a.form.shared();
        if shared.windows(2).any(|w| w[1] == w[0] + 1) {
            return Ok(());
        }
        let t = a.truss.as_ref().expect("braced");
        let Some(sol) = t.solution.as_ref() else { return Ok(()) }; // a mechanism: no figure
        for c in &a.load_cases {
            let fd = c.force_diagram.as_ref();
            prop_assert!(fd.is_some(), "{}: no figure of a solved truss: {:?}", c.case, c.notes);
            let Some(fd) = fd else { continue };
            let case = sol.case(&c.case).expect("solved case");
            let lc = t.model.load_cases.iter().find(|l| l.name == c.case).expect("load case");
            let tol = FIGURE_TOL * fd.largest_force;
            prop_assert!(fd.closure_error <= tol);
            for seg in &fd.segments {
                if let SegmentOf::Member { member } = seg.of {
                    let m = &t.model.members[member];
                    let (p, q) = (&t.model.nodes[m.start], &t.model.nodes[m.end]);
                    let l = (q.x - p.x).hypot(q.y - p.y);
                    let (ux, uy) = ((q.x - p.x) / l, (q.y - p.y) / l);
                    let (vx, vy) = (seg.to.x - seg.from.x, seg.to.y - seg.from.y);
                    prop_assert!((vx * uy - vy * ux).abs() <= tol, "member {member} not parallel");
                }
            }
            // every external segment is its force: the loads of the case summed per node
            // (from the model) or the solver's reaction; the sum of the segments around the
            // closed load line would be zero whatever they were, so each is compared
            let mut externals = 0;
            for seg in fd.external_segments() {
                externals += 1;
                let (fx, fy) = match seg.of {
                    SegmentOf::Load { node } => lc
                        .nodal
                        .iter()
                        .filter(|l| l.node == node)
                        .fold((0.0, 0.0), |a, l| (a.0 + l.fx, a.1 + l.fy)),
                    SegmentOf::Reaction { node } => {
                        let r = case.reaction(node).expect("reaction");
                        (r.fx, r.fy)
                    }
                    SegmentOf::Member { .. } => unreachable!("external segments only"),
                };
                let (vx, vy) = (seg.to.x - seg.from.x, seg.to.y - seg.from.y);
                prop_assert!((vx - fx).hypot(vy - fy) <= tol, "{:?}: ({vx}, {vy}) vs ({fx}, {fy})", seg.of);
            }
            // and none is left out: every loaded node and every reaction that is not
            // vanishing has its segment
            let mut loaded: Vec<usize> = lc.nodal.iter().filter(|l| l.fx != 0.0 || l.fy != 0.0).map(|l| l.node).collect();
            loaded.sort_unstable();
            loaded.dedup();
            let reacting = case.reactions.iter().filter(|r| r.fx.hypot(r.fy) > ZERO_FORCE * fd.largest_force).count();
            prop_assert_eq!(externals, loaded.len() + reacting);
        }
    }
}
