//! The thrust line (line of pressure) of ribs in bending, built from the forces the rib
//! receives, against independent computations:
//!
//! - the stiffness solver's rib moments (M = -N e at every rib node, N from the solver,
//!   e from the line), for the frame model of every rib system under dead load, a
//!   half-span load and a doubled panel load;
//! - handbook closed forms for bare parabolic ribs under load on half the span
//!   (Timoshenko & Young, Theory of Structures, 2nd ed., ch. 9, from memory).

use springline_statics::arch::cases::{doubled_panel, half_span, Half};
use springline_statics::arch::design::{Bracing, Design, RibSystem};
use springline_statics::error::Location;
use springline_statics::{
    add_cases, frame, frame_model, rib_chain, solve, thrust_line, CaseResult, LoadCase, Model, NodalLoad,
    Problem, StaticsError, Support, ThrustLine, ValidDesign,
};

/// The members of group "rib": the rib of the generated models and of the ribs built
/// here (`rib_chain` takes them from the caller).
fn rib_members(model: &Model) -> Vec<usize> {
    (0..model.members.len()).filter(|&k| model.members[k].group == "rib").collect()
}

/// Rib moments of the solver at the sections of a thrust line (just right of every rib
/// node, and just left of the right springing), with the solver's axial force there:
/// (N, M) in kN and kNm, sagging positive.
fn solver_sections(case: &CaseResult, chain: &[(usize, bool)]) -> Vec<(f64, f64)> {
    let mut out = Vec::new();
    for &(k, fwd) in chain {
        let mf = &case.members[k];
        out.push(if fwd { (mf.start.n, mf.start.m) } else { (mf.end.n, -mf.end.m) });
    }
    if let Some(&(k, fwd)) = chain.last() {
        let mf = &case.members[k];
        out.push(if fwd { (mf.end.n, mf.end.m) } else { (mf.start.n, -mf.start.m) });
    }
    out
}

/// Checks N e = M (as M = -N e with N tension positive) at every section to 1e-6 of the
/// largest |M| in the rib, and the reported checks against their definitions.
fn check_line(t: &ThrustLine, case: &CaseResult, chain: &[(usize, bool)]) {
    let solver = solver_sections(case, chain);
    assert_eq!(solver.len(), t.sections.len());
    let m_max = solver.iter().map(|s| s.1.abs()).fold(0.0, f64::max);
    let n_max = solver.iter().map(|s| s.0.abs()).fold(0.0, f64::max);
    for (sec, &(n, m)) in t.sections.iter().zip(&solver) {
        assert!(
            (-n * sec.offset - m).abs() <= 1e-6 * m_max.max(1e-9 * n_max),
            "{}: -N e = {} vs M = {m}",
            t.case,
            -n * sec.offset
        );
        assert!((sec.thrust + n).abs() <= 1e-9 * n_max, "{}: thrust {} vs -N {}", t.case, sec.thrust, -n);
        assert!((sec.moment - m).abs() <= 1e-6 * m_max.max(1e-9 * n_max));
    }
    // just left of every interior node: the solver's moment at the end of the member
    // arriving from the left (where a deck joins with a moment it differs from the right)
    assert_eq!(t.left_of.len(), t.sections.len());
    assert!(t.left_of[0].is_none() && t.left_of[t.left_of.len() - 1].is_none());
    for (i, left) in t.left_of.iter().enumerate().skip(1).take(chain.len() - 1) {
        let left = left.as_ref().expect("interior nodes have a left side");
        let (k, fwd) = chain[i - 1];
        let mf = &case.members[k];
        let (n, m) = if fwd { (mf.end.n, mf.end.m) } else { (mf.start.n, -mf.start.m) };
        assert!((left.moment - m).abs() <= 1e-6 * m_max.max(1e-9 * n_max), "{}: left of node {i}", t.case);
        assert!((-n * left.offset - m).abs() <= 1e-6 * m_max.max(1e-9 * n_max));
    }
    // the reported checks follow from the offsets on both sides
    let max_e =
        t.sections.iter().chain(t.left_of.iter().flatten()).map(|s| s.offset.abs()).fold(0.0, f64::max);
    assert!((t.max_offset - max_e).abs() <= 1e-15 * max_e.max(1.0));
    let at_worst = t.sections[t.worst].offset.abs().max(t.left_of[t.worst].map_or(0.0, |l| l.offset.abs()));
    assert!((at_worst - max_e).abs() <= 1e-15 * max_e.max(1.0));
    assert_eq!(t.inside_middle_third, max_e <= t.depth / 6.0);
    assert_eq!(t.inside_depth, max_e <= t.depth / 2.0);
    assert!((t.least_depth - 2.0 * max_e).abs() <= 1e-12 * max_e.max(1.0));
    if let Some(g) = t.geometric_safety_factor {
        assert!((g * t.least_depth - t.depth).abs() <= 1e-12 * t.depth);
    }
    // the line of pressure starts and ends where it crosses the springing sections
    let (first, last) = (t.polygon.first().expect("start"), t.polygon.last().expect("end"));
    assert_eq!(*first, t.sections[0].point);
    assert_eq!(*last, t.sections[t.sections.len() - 1].point);
}

#[test]
fn n_e_equals_the_solver_moment_on_the_frame_model_of_every_rib_system() {
    for system in [RibSystem::ThreeHinged, RibSystem::TwoHinged, RibSystem::Fixed] {
        for (n, bracing) in
            [(12, Bracing::Single { flipped: false }), (9, Bracing::Crossed), (10, Bracing::None)]
        {
            let mut d = Design::demo();
            d.rib_system = system;
            d.panels = n;
            d.bracing = bracing;
            let valid = ValidDesign::new(&d).expect("valid");
            let form = valid.form();
            let mut frame = frame_model(&valid);
            let specs = vec![
                half_span(&valid, Half::Left, 5.0).expect("half"),
                doubled_panel(&valid, 2).expect("panel"),
            ];
            add_cases(&valid, &mut frame, &specs).expect("cases");
            let model = frame.model;
            let sol = solve(&model).expect("solves");
            let chain = frame.map.rib_chain();
            for case in &sol.cases {
                let t = thrust_line(&model, case, &chain, d.groups.rib.depth).expect("line");
                check_line(&t, case, &chain);
                assert!(t.model.contains("frame model"));
                if system == RibSystem::ThreeHinged {
                    // through the three hinges: no offset at the springings and the crown
                    let scale = t.max_offset.max(1e-12);
                    for sec in
                        [&t.sections[0], &t.sections[form.crown_node], &t.sections[t.sections.len() - 1]]
                    {
                        assert!(sec.offset.abs() <= 1e-6 * scale.max(d.groups.rib.depth), "{system:?}");
                    }
                }
            }
        }
    }
}

/// A bare parabolic rib y = 4 f x (L - x) / L^2 with nodes on the curve, I = I_c sec(theta)
/// and A = A_c sec(theta) per segment (the handbook's assumption), loaded on the left half
/// by nodal loads equivalent to w per horizontal metre (panel reactions).
fn parabolic_rib(span: f64, rise: f64, segs: usize, hinges: usize, w: f64) -> Model {
    let y = |x: f64| 4.0 * rise * x * (span - x) / (span * span);
    let x = |i: usize| span * i as f64 / segs as f64;
    let mut m = Model { title: "bare parabolic rib".into(), ..Default::default() };
    for i in 0..=segs {
        m.add_node(format!("R{i}"), x(i), y(x(i)));
    }
    for i in 0..segs {
        let sec = (x(i + 1) - x(i)).hypot(y(x(i + 1)) - y(x(i))) / (x(i + 1) - x(i));
        // A 1000 times a realistic 0.2 m2: rib shortening negligible, as the handbook assumes
        let mut mem = frame(&format!("r{i}"), "rib", i, i + 1, 2.1e8, 200.0 * sec, 0.1 * sec);
        mem.release_end = hinges == 3 && i + 1 == segs / 2;
        m.add_member(mem);
    }
    m.supports = vec![Support::pinned(0), Support::pinned(segs)];
    let dx = span / segs as f64;
    let nodal = (0..=segs / 2)
        .map(|i| {
            let share = if i == 0 || i == segs / 2 { 0.5 } else { 1.0 };
            NodalLoad { node: i, fx: 0.0, fy: -w * dx * share, mz: 0.0 }
        })
        .collect();
    m.load_cases = vec![LoadCase { name: "half-span".into(), nodal, ..Default::default() }];
    m
}

#[test]
fn two_hinged_parabolic_rib_half_span_gives_the_handbook_quarter_point_moment() {
    // Timoshenko & Young, Theory of Structures, ch. 9 (from memory):
    // two-hinged parabolic arch, I = I_c sec(theta), rib shortening neglected, UDL w on
    // the left half: H = w L^2 / (16 f), M(L/4) = +w L^2 / 64, M(3L/4) = -w L^2 / 64.
    // The thrust line gives M = thrust x e at the quarter points. The polygonal rib and the
    // remaining rib shortening leave about 7e-6 of w L^2 / 64 (measured by the solver's
    // own closed-form test); checked to 2e-5.
    let (span, rise, segs, w) = (100.0, 20.0, 64, 80.0);
    let m = parabolic_rib(span, rise, segs, 2, w);
    let sol = solve(&m).expect("stable");
    let chain = rib_chain(&m, &rib_members(&m)).expect("rib");
    let t = thrust_line(&m, &sol.cases[0], &chain, 1.0).expect("line");
    check_line(&t, &sol.cases[0], &chain);
    let mq = w * span * span / 64.0;
    let (m1, m3) = (t.sections[segs / 4].moment, t.sections[3 * segs / 4].moment);
    assert!((m1 - mq).abs() < 2e-5 * mq, "M(L/4) = {m1} vs {mq}");
    assert!((m3 + mq).abs() < 2e-5 * mq, "M(3L/4) = {m3} vs {}", -mq);
    // the offset at the quarter point is M / thrust: above the axis under the load
    assert!(t.sections[segs / 4].offset > 0.0 && t.sections[3 * segs / 4].offset < 0.0);
    let h = w * span * span / (16.0 * rise);
    assert!((sol.cases[0].reactions[0].fx - h).abs() < 1e-3 * h);
}

#[test]
fn three_hinged_parabolic_rib_half_span_quarter_point_moment_is_exact() {
    // Three-hinged parabolic arch, UDL w on the left half (Timoshenko & Young, Theory of
    // Structures, ch. 9, from memory): M(L/4) = +w L^2 / 64, M(3L/4) = -w L^2 / 64; statics
    // alone, and panel-point loads give the UDL's moments exactly at the nodes.
    let (span, rise, segs, w) = (48.0, 9.0, 16, 30.0);
    let m = parabolic_rib(span, rise, segs, 3, w);
    let sol = solve(&m).expect("stable");
    let chain = rib_chain(&m, &rib_members(&m)).expect("rib");
    let t = thrust_line(&m, &sol.cases[0], &chain, 0.8).expect("line");
    check_line(&t, &sol.cases[0], &chain);
    let mq = w * span * span / 64.0;
    assert!((t.sections[segs / 4].moment - mq).abs() < 1e-9 * mq);
    assert!((t.sections[3 * segs / 4].moment + mq).abs() < 1e-9 * mq);
    // geometric safety factor by hand: e = M / thrust at the worst section
    let worst = &t.sections[t.worst];
    assert!((t.geometric_safety_factor.expect("bending") - 0.8 / (2.0 * worst.offset.abs())).abs() < 1e-12);
}

/// Each input the thrust line cannot draw is refused with its own error, matched exactly
/// (variant, location and message), so a check that went missing or answered for another
/// would fail here.
#[test]
fn thrust_line_rejects_what_it_cannot_draw() {
    let m = parabolic_rib(40.0, 8.0, 8, 2, 10.0);
    let sol = solve(&m).expect("stable");
    let chain = rib_chain(&m, &rib_members(&m)).expect("rib");
    let invalid = |message: &str| {
        StaticsError::Invalid(vec![Problem::new(Location::Part("thrust line".into()), message)])
    };
    let case = &sol.cases[0];
    assert_eq!(thrust_line(&m, case, &chain, 0.0), Err(invalid("rib depth 0 m must be positive")));
    assert_eq!(thrust_line(&m, case, &chain, f64::NAN), Err(invalid("rib depth NaN m must be positive")));
    let bad_chain = invalid("the rib chain is empty or names a member that does not exist");
    assert_eq!(thrust_line(&m, case, &[], 1.0), Err(bad_chain.clone()));
    assert_eq!(thrust_line(&m, case, &[(99, true)], 1.0), Err(bad_chain));
    // results of another model (one member and one node fewer, itself valid): the
    // mismatch check answers, not a panic and not a line drawn from foreign forces
    let mut other = m.clone();
    other.members.pop();
    other.nodes.pop();
    other.supports[1].node = other.nodes.len() - 1;
    springline_statics::validate(&other).expect("the other model is valid");
    assert_eq!(
        thrust_line(&other, case, &chain[..chain.len() - 1], 1.0),
        Err(invalid("the results of load case 'half-span' do not belong to this model"))
    );
}

#[test]
fn pole_from_solved_reactions_ends_on_the_right_reaction_line() {
    // Two-hinged and fixed bare ribs: the funicular polygon drawn from the pole at the
    // solved (H, V_A), starting where the left reaction crosses the springing vertical,
    // must end where the right reaction crosses its vertical (y_B + M_B / H, statics of
    // the whole rib), and pass through both springings when they are hinged.
    use springline_statics::arch::cases::standard_cases;
    use springline_statics::graphic::funicular::FunicularMethod;
    use springline_statics::{bare_rib_model, rib_funicular};
    for system in [RibSystem::TwoHinged, RibSystem::Fixed] {
        let mut d = Design::demo();
        d.rib_system = system;
        let valid = ValidDesign::new(&d).expect("valid");
        let form = valid.form();
        let mut generated = bare_rib_model(&valid);
        add_cases(&valid, &mut generated, &standard_cases(&valid)).expect("cases");
        let [left, right] = generated.map.springings;
        let rib = generated.model;
        let sol = solve(&rib).expect("solves");
        for case in &sol.cases {
            let f = rib_funicular(&rib, case, left, right, None).expect("construction");
            assert_eq!(f.method, FunicularMethod::SolvedReactions);
            let rb = case.reaction(right).expect("right reaction");
            let expected = rib.nodes[right].y + rb.mz / f.thrust;
            let end = f.construction.polygon.last().expect("end");
            assert!(
                (end.y - expected).abs() < 1e-9 * form.span,
                "{system:?} {}: {} vs {expected}",
                case.name,
                end.y
            );
            assert!((f.thrust + rb.fx).abs() < 1e-9 * f.thrust);
        }
    }
}
