//! Property tests of the stiffness solver over random stable frames and trusses.

use proptest::prelude::*;
use springline_statics::error::Location;
use springline_statics::frame::element::{local_stiffness, Geometry};
use springline_statics::{
    frame, solve, truss, truss_determinacy, Determinacy, LoadCase, LoadDirection, MemberLoad, Model,
    NodalLoad, StaticsError, Support,
};

const E: f64 = 2.1e8;

/// A rigid multi-bay, multi-storey frame with perturbed nodes, fixed bases, random
/// sections and random nodal and member loads. Stable by construction.
fn random_frame() -> impl Strategy<Value = Model> {
    (
        1usize..4,
        1usize..4,
        prop::collection::vec(-0.4f64..0.4, 64),
        prop::collection::vec(-100.0f64..100.0, 64),
        any::<bool>(),
    )
        .prop_map(|(bays, storeys, jitter, loads, pinned_bases)| {
            let mut m = Model { title: "random frame".into(), ..Default::default() };
            let mut j = jitter.iter().cycle();
            let mut l = loads.iter().cycle();
            let id = |b: usize, s: usize| s * (bays + 1) + b;
            for s in 0..=storeys {
                for b in 0..=bays {
                    let dy = if s == 0 { 0.0 } else { *j.next().unwrap_or(&0.0) };
                    m.add_node("", b as f64 * 6.0 + j.next().unwrap_or(&0.0), s as f64 * 3.5 + dy);
                }
            }
            for s in 1..=storeys {
                for b in 0..=bays {
                    let i = 1e-4 * (1.0 + j.next().unwrap_or(&0.0).abs() * 10.0);
                    m.add_member(frame("", "column", id(b, s - 1), id(b, s), E, 0.01, i));
                }
                for b in 0..bays {
                    let k = m.add_member(frame("", "beam", id(b, s), id(b + 1, s), E, 0.008, 2e-4));
                    let lc_loads = [
                        MemberLoad::Uniform {
                            member: k,
                            w: -(l.next().unwrap_or(&10.0).abs()),
                            direction: LoadDirection::GlobalY,
                            projected: false,
                        },
                        MemberLoad::Point {
                            member: k,
                            p: *l.next().unwrap_or(&5.0),
                            a: 2.0,
                            direction: LoadDirection::LocalY,
                        },
                    ];
                    if m.load_cases.is_empty() {
                        m.load_cases.push(LoadCase { name: "random".into(), ..Default::default() });
                    }
                    m.load_cases[0].member.extend(lc_loads);
                }
            }
            for b in 0..=bays {
                m.supports.push(if pinned_bases {
                    Support::pinned(id(b, 0))
                } else {
                    Support::fixed(id(b, 0))
                });
            }
            let top = id(0, storeys);
            m.load_cases[0].nodal.push(NodalLoad {
                node: top,
                fx: *l.next().unwrap_or(&20.0),
                fy: 0.0,
                mz: *l.next().unwrap_or(&1.0),
            });
            m
        })
}

/// A Warren-type truss with `panels` bays, pinned at the left and on a roller at the
/// right (determinate), plus `extra` crossing diagonals (each adds one redundant bar).
fn random_truss() -> impl Strategy<Value = (Model, usize)> {
    (
        2usize..10,
        prop::collection::vec(-0.3f64..0.3, 40),
        prop::collection::vec(-50.0f64..50.0, 40),
        prop::collection::vec(any::<bool>(), 10),
    )
        .prop_map(|(panels, jitter, loads, extra)| {
            let mut m = Model { title: "random truss".into(), ..Default::default() };
            let mut j = jitter.iter().cycle();
            for i in 0..=panels {
                m.add_node("", i as f64 * 4.0 + j.next().unwrap_or(&0.0), j.next().unwrap_or(&0.0) * 0.5);
            }
            for i in 0..=panels {
                m.add_node("", i as f64 * 4.0 + j.next().unwrap_or(&0.0), 3.0 + j.next().unwrap_or(&0.0));
            }
            let top = |i: usize| panels + 1 + i;
            let mut redundant = 0;
            for i in 0..panels {
                m.add_member(truss("", "bottom", i, i + 1, E, 0.005));
                m.add_member(truss("", "top", top(i), top(i + 1), E, 0.005));
                m.add_member(truss("", "diagonal", i, top(i + 1), E, 0.003));
                if extra[i % extra.len()] {
                    m.add_member(truss("", "counter", top(i), i + 1, E, 0.003));
                    redundant += 1;
                }
            }
            for i in 0..=panels {
                m.add_member(truss("", "post", i, top(i), E, 0.003));
            }
            m.supports.push(Support::pinned(0));
            m.supports.push(Support::roller_along_x(panels));
            let mut l = loads.iter().cycle();
            m.load_cases.push(LoadCase {
                name: "random".into(),
                nodal: (0..m.nodes.len())
                    .map(|node| NodalLoad {
                        node,
                        fx: *l.next().unwrap_or(&0.0) * 0.2,
                        fy: -l.next().unwrap_or(&1.0).abs(),
                        mz: 0.0,
                    })
                    .collect(),
                ..Default::default()
            });
            (m, redundant)
        })
}

/// The same frame with every member that carries a member load split at its mid-point
/// into two members of the same section: a uniform load goes on both halves, a point
/// load on the half that holds it (at the same place). Both models describe one
/// structure under one loading, so they must agree at the original nodes and ends
/// (common practice: the element is exact for these loads, so only rounding differs).
///
/// Returns the split model and, per original member, the index of its second half
/// (`None` when it was not split; the first half keeps the original index, the
/// original nodes keep theirs).
fn split_loaded_members(model: &Model) -> (Model, Vec<Option<usize>>) {
    let mut split = model.clone();
    let mut second_half = vec![None; model.members.len()];
    for (k, member) in model.members.iter().enumerate() {
        let loaded = model.load_cases.iter().any(|lc| lc.member.iter().any(|l| l.member() == k));
        if !loaded {
            continue;
        }
        let (a, b) = (&model.nodes[member.start], &model.nodes[member.end]);
        let mid = split.add_node("", (a.x + b.x) / 2.0, (a.y + b.y) / 2.0);
        let mut first = member.clone();
        first.end = mid;
        first.release_end = false;
        let mut second = member.clone();
        second.start = mid;
        second.release_start = false;
        split.members[k] = first;
        second_half[k] = Some(split.add_member(second));
    }
    for lc in &mut split.load_cases {
        let mut moved = Vec::new();
        for load in &mut lc.member {
            let k = load.member();
            let Some(second) = second_half[k] else { continue };
            let half = model.member_length(k) / 2.0;
            match load {
                MemberLoad::Uniform { .. } => {
                    let mut copy = *load;
                    if let MemberLoad::Uniform { member, .. } = &mut copy {
                        *member = second;
                    }
                    moved.push(copy);
                }
                MemberLoad::Point { member, a, .. } => {
                    if *a > half {
                        *member = second;
                        *a -= half;
                    }
                }
            }
        }
        lc.member.extend(moved);
    }
    (split, second_half)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    #[test]
    fn frames_satisfy_the_independent_equilibrium_check(model in random_frame()) {
        let s = solve(&model).expect("stable frame");
        for c in &s.cases {
            prop_assert!(c.equilibrium.relative < 1e-9, "{:?}", c.equilibrium);
        }
    }

    #[test]
    fn trusses_satisfy_equilibrium_and_hand_counts((model, redundant) in random_truss()) {
        let s = solve(&model).expect("stable truss");
        prop_assert!(s.cases[0].equilibrium.relative < 1e-9, "{:?}", s.cases[0].equilibrium);
        let report = truss_determinacy(&model).expect("valid");
        // Maxwell's hand count for a stable truss: bars + reactions - 2 x nodes
        let hand = (report.bars + report.reactions) as i64 - 2 * report.nodes as i64;
        prop_assert_eq!(hand, redundant as i64);
        let expected = if redundant == 0 { Determinacy::Determinate } else { Determinacy::Indeterminate { degree: redundant } };
        prop_assert_eq!(report.determinacy, expected);
    }

    /// An independent solution: the frame with its loaded members split at mid-point
    /// (`split_loaded_members`), with a wind load along the first column and a point load
    /// on the last beam's second half added, solved again.
    /// Displacements at the original nodes, end actions at the original member ends and
    /// reactions must agree. Equilibrium alone cannot see a wrong fixed-end action that
    /// keeps the member in equilibrium (both end moments of a uniform load with their
    /// signs flipped): split, the wrong end moments are a quarter as large and cancel at
    /// the new node, so the two solutions part.
    #[test]
    fn frames_split_at_loaded_mid_points_give_the_same_solution(model in random_frame(), wind in 1.0f64..20.0) {
        let mut model = model;
        model.load_cases[0].member.push(MemberLoad::Uniform {
            member: 0,
            w: wind,
            direction: LoadDirection::GlobalX,
            projected: true,
        });
        // and a point load beyond the mid-point of the last member (the top right beam)
        let last = model.members.len() - 1;
        let beyond_mid = 0.75 * model.member_length(last);
        model.load_cases[0].member.push(MemberLoad::Point {
            member: last,
            p: -wind * 3.0,
            a: beyond_mid,
            direction: LoadDirection::LocalY,
        });
        let (split, second_half) = split_loaded_members(&model);
        let whole = solve(&model).expect("stable frame");
        let halves = solve(&split).expect("stable frame");
        let (a, b) = (&whole.cases[0], &halves.cases[0]);
        // scales: the equilibrium check's reference force, moments over the model's length
        let force = a.equilibrium.reference;
        let moment = force * a.equilibrium.characteristic_length;
        let translation = a.displacements.iter().map(|d| d.ux.abs().max(d.uy.abs())).fold(0.0, f64::max);
        let rotation = a.displacements.iter().filter_map(|d| d.rz).map(f64::abs).fold(0.0, f64::max);
        for (da, db) in a.displacements.iter().zip(&b.displacements) {
            prop_assert!((da.ux - db.ux).abs() <= 1e-9 * translation, "node {}: ux {:e} / {:e}", da.node, da.ux, db.ux);
            prop_assert!((da.uy - db.uy).abs() <= 1e-9 * translation, "node {}: uy {:e} / {:e}", da.node, da.uy, db.uy);
            let (ra, rb) = (da.rz.unwrap_or(0.0), db.rz.unwrap_or(0.0));
            prop_assert!((ra - rb).abs() <= 1e-9 * rotation, "node {}: rz {:e} / {:e}", da.node, ra, rb);
        }
        for (k, ma) in a.members.iter().enumerate() {
            let start = &b.members[k].end_actions_global;
            let end = &b.members[second_half[k].unwrap_or(k)].end_actions_global;
            let joined = [start[0], start[1], start[2], end[3], end[4], end[5]];
            for (i, (fa, fb)) in ma.end_actions_global.iter().zip(&joined).enumerate() {
                let scale = if i % 3 == 2 { moment } else { force };
                prop_assert!((fa - fb).abs() <= 1e-9 * scale, "member {k} end action {i}: {fa:e} / {fb:e}");
            }
        }
        for (ra, rb) in a.reactions.iter().zip(&b.reactions) {
            prop_assert!((ra.fx - rb.fx).abs() <= 1e-9 * force && (ra.fy - rb.fy).abs() <= 1e-9 * force);
            prop_assert!((ra.mz - rb.mz).abs() <= 1e-9 * moment, "{ra:?} / {rb:?}");
        }
    }

    #[test]
    fn mirrored_frames_give_mirrored_results(model in random_frame()) {
        let mirrored = model.mirrored(0.0);
        let a = solve(&model).expect("stable");
        let b = solve(&mirrored).expect("stable");
        let scale = a.cases[0].equilibrium.reference;
        for (ma, mb) in a.cases[0].members.iter().zip(&b.cases[0].members) {
            // axial force keeps its sign; shear and moment flip (left and right swap)
            prop_assert!((ma.start.n - mb.start.n).abs() < 1e-9 * scale);
            prop_assert!((ma.end.m + mb.end.m).abs() < 1e-9 * scale * 10.0);
            prop_assert!((ma.start.v + mb.start.v).abs() < 1e-9 * scale);
        }
        for (ra, rb) in a.cases[0].reactions.iter().zip(&b.cases[0].reactions) {
            prop_assert!((ra.fx + rb.fx).abs() < 1e-9 * scale);
            prop_assert!((ra.fy - rb.fy).abs() < 1e-9 * scale);
            prop_assert!((ra.mz + rb.mz).abs() < 1e-9 * scale * 10.0);
        }
    }

    #[test]
    fn release_that_unstabilises_is_reported_as_a_mechanism_naming_a_moving_node(
        model in random_frame().prop_filter("one storey", |m| m.members.iter().all(|b| b.group != "column" || m.supports.iter().any(|s| s.node == b.start)))
    ) {
        // Pin the bases and put hinges at both ends of every member: the floor nodes are
        // then held by b + 1 column links and b beam links for 2 b + 2 freedoms, which
        // leaves one sway mode, whatever the geometry (Maxwell's count).
        let mut m = model.clone();
        for s in &mut m.supports {
            s.rz = false;
        }
        for lc in &mut m.load_cases {
            lc.nodal.iter_mut().for_each(|l| l.mz = 0.0);
        }
        for mem in &mut m.members {
            mem.release_start = true;
            mem.release_end = true;
        }
        match solve(&m) {
            Err(StaticsError::Mechanism { node, mode, .. }) => {
                // the named node moves in the reported mode, and the mode strains nothing
                prop_assert!(mode.iter().any(|(n, _, v)| *n == node && v.abs() > 1e-6));
                let mut u = vec![[0.0f64; 3]; m.nodes.len()];
                for (n, dof, v) in &mode {
                    u[*n][dof.index()] = *v;
                }
                for mem in &m.members {
                    let (p, q) = (&m.nodes[mem.start], &m.nodes[mem.end]);
                    let g = Geometry::new(p.x, p.y, q.x, q.y);
                    let k = local_stiffness(mem, &g);
                    let ue = nalgebra::Vector6::new(u[mem.start][0], u[mem.start][1], u[mem.start][2], u[mem.end][0], u[mem.end][1], u[mem.end][2]);
                    let ul = g.transform() * ue;
                    let energy = (ul.transpose() * k * ul)[(0, 0)];
                    let scale = k.diagonal().iter().copied().fold(0.0, f64::max);
                    prop_assert!(energy.abs() < 1e-8 * scale, "strain energy {energy} in mode");
                }
            }
            other => prop_assert!(false, "expected a mechanism, got {:?}", other.map(|_| ())),
        }
    }
}

#[test]
fn truss_mechanism_is_counted_and_named() {
    // a square of four bars on a pin and a roller: one sway mode (4 + 3 - 8 = -1)
    let mut m = Model::default();
    for (x, y) in [(0.0, 0.0), (4.0, 0.0), (4.0, 3.0), (0.0, 3.0)] {
        m.add_node("", x, y);
    }
    for (a, b) in [(0, 1), (1, 2), (2, 3), (3, 0)] {
        m.add_member(truss("", "", a, b, E, 0.01));
    }
    m.supports = vec![Support::pinned(0), Support::roller_along_x(1)];
    let r = truss_determinacy(&m).expect("valid");
    match r.determinacy {
        Determinacy::Mechanism { modes, redundant, node, .. } => {
            assert_eq!((modes, redundant), (1, 0));
            assert!(node == 2 || node == 3, "a top node sways, got {node}");
        }
        d => panic!("expected a mechanism, got {d:?}"),
    }
    assert!(matches!(solve(&m), Err(StaticsError::Mechanism { .. })));
}

#[test]
fn invalid_model_lists_every_problem() {
    let mut m = Model::default();
    m.add_node("A", 0.0, 0.0);
    m.add_node("B", 0.0, 0.0);
    m.add_node("C", f64::NAN, 1.0);
    m.add_member(frame("z", "", 0, 1, E, 0.01, 1e-4));
    m.add_member(frame("bad", "", 0, 7, -1.0, 0.0, f64::INFINITY));
    let Err(StaticsError::Invalid(problems)) = solve(&m) else { panic!("expected invalid") };
    let text: Vec<String> = problems.iter().map(|p| p.to_string()).collect();
    let joined = text.join("\n");
    for needle in ["zero length", "does not exist", "Young's modulus", "area", "finite", "not connected"] {
        assert!(joined.contains(needle), "missing '{needle}' in:\n{joined}");
    }
    // typed locations: the node and member by index and name, read the same as text
    let at_node_c = Location::Node { index: 2, name: "C".into() };
    let at_bad = Location::Member { index: 1, name: "bad".into() };
    assert!(problems.iter().any(|p| p.location == at_node_c && p.message.contains("finite")), "{joined}");
    assert!(problems.iter().any(|p| p.location == at_bad && p.message.contains("end node 7")), "{joined}");
    assert!(joined.contains("member bad: end node 7 does not exist"), "{joined}");
    // a load case by its name
    m.load_cases = vec![LoadCase {
        name: "wind".into(),
        nodal: vec![NodalLoad { node: 9, fx: 1.0, fy: 0.0, mz: 0.0 }],
        ..Default::default()
    }];
    let Err(StaticsError::Invalid(problems)) = solve(&m) else { panic!("expected invalid") };
    assert!(problems.iter().any(|p| p.location == Location::LoadCase("wind".into())
        && p.to_string() == "load case 'wind': nodal load on node 9 which does not exist"));
}
