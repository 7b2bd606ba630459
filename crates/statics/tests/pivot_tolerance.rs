//! The pivot test of the factorisation, pinned from both sides: a structure far stiffer
//! in one mode than in another must still solve, a nearly singular one must be refused
//! as a mechanism (`PIVOT_TOLERANCE`, 1e-9 of a pivot's own diagonal).
//!
//! The model is a chain along x that makes the pivot ratio a hand calculation: a long
//! flexible bar from a pin (node 0) to node 1 (axial stiffness k1 = E A1 / L1), then a
//! short stiff bar from node 1 to node 2 (k2 = E A2 / L2), nodes 1 and 2 on rollers that
//! hold them vertically. The free freedoms are x1 and x2 with stiffness
//! [k1 + k2, -k2; -k2, k2]. In either elimination order the second pivot is the series
//! stiffness k1 k2 / (k1 + k2), so its ratio to its own diagonal is k1 / (k1 + k2)
//! (eliminating x1 first: d = k2 - k2^2 / (k1 + k2); x2 first: d = k1 + k2 - k2 = k1,
//! over k1 + k2). Worked by hand; the series-spring displacements u1 = P / k1,
//! u2 = P / k1 + P / k2 are common practice.

use springline_statics::{solve, truss, Dof, LoadCase, Model, NodalLoad, StaticsError, Support};

const E: f64 = 2.1e8; // kN/m2, steel (EN 1993-1-1 3.2.6)
/// The flexible bar: 40 m long, area A1 (m2).
const LONG: f64 = 40.0;
const LONG_AREA: f64 = 8e-4;
/// The stiff bar: 0.2 m long; its area sets the contrast.
const SHORT: f64 = 0.2;
/// Pull at the tip, kN.
const PULL: f64 = 50.0;

/// The chain whose pivot ratio k1 / (k1 + k2) is `ratio`: the short bar's area follows.
fn chain(ratio: f64) -> (Model, f64, f64) {
    let k1 = E * LONG_AREA / LONG;
    // k1 / (k1 + k2) = ratio  =>  k2 = k1 (1 - ratio) / ratio
    let k2 = k1 * (1.0 - ratio) / ratio;
    let mut m = Model { title: format!("pivot ratio {ratio:e}"), ..Default::default() };
    m.add_node("pin", 0.0, 0.0);
    m.add_node("joint", LONG, 0.0);
    m.add_node("tip", LONG + SHORT, 0.0);
    m.add_member(truss("tie", "", 0, 1, E, LONG_AREA));
    m.add_member(truss("link", "", 1, 2, E, k2 * SHORT / E));
    m.supports = vec![Support::pinned(0), Support::roller_along_x(1), Support::roller_along_x(2)];
    m.load_cases = vec![LoadCase {
        name: "pull".into(),
        nodal: vec![NodalLoad { node: 2, fx: PULL, fy: 0.0, mz: 0.0 }],
        ..Default::default()
    }];
    (m, k1, k2)
}

/// Ratios 4e-6 (the stiffest models of the test suite: bare ribs with E A 1e5 times
/// realistic) and 1e-7 (a hundred times above the tolerance) are sound: they solve,
/// with the series-spring displacements and the pull in both bars.
#[test]
fn stiff_link_beside_a_flexible_tie_solves() {
    for ratio in [4e-6, 1e-7] {
        let (model, k1, k2) = chain(ratio);
        let solution = match solve(&model) {
            Ok(s) => s,
            Err(e) => panic!("pivot ratio {ratio:e} is sound but was refused: {e}"),
        };
        let case = &solution.cases[0];
        let (u1, u2) = (case.displacements[1].ux, case.displacements[2].ux);
        let (expected_u1, expected_u2) = (PULL / k1, PULL / k1 + PULL / k2);
        // the system's condition is about 1 / ratio: 1e7 * eps leaves 1e-9 to spare
        assert!(
            (u1 / expected_u1 - 1.0).abs() < 1e-9,
            "ratio {ratio:e}: u1 = {u1:e}, expected {expected_u1:e}"
        );
        assert!(
            (u2 / expected_u2 - 1.0).abs() < 1e-9,
            "ratio {ratio:e}: u2 = {u2:e}, expected {expected_u2:e}"
        );
        for member in &case.members {
            assert!((member.start.n / PULL - 1.0).abs() < 1e-9, "ratio {ratio:e}: N = {}", member.start.n);
        }
        assert!((case.reaction(0).map_or(0.0, |r| r.fx) + PULL).abs() < 1e-9 * PULL);
        assert!(case.equilibrium.relative < 1e-9, "{:?}", case.equilibrium);
    }
}

/// Ratio 1e-11: the tip and the joint slide together on the tie while the link barely
/// stretches. The pivot is 4e4 times its own rounding (eps of its diagonal) and 20 times
/// the factorisation's rounding test (`ROUNDING_MARGIN` 1e3 times eps times the carried
/// diagonal, twice the diagonal here: 4.4e-13 of it), so only the pivot tolerance can
/// refuse it, and it must, naming a node of the link moving along x with the other in
/// step.
#[test]
fn nearly_singular_chain_is_refused_as_a_mechanism() {
    let (model, _, _) = chain(1e-11);
    match solve(&model) {
        Err(StaticsError::Mechanism { node, direction, mode, .. }) => {
            assert!(node == 1 || node == 2, "named node {node}, expected the joint or the tip");
            assert_eq!(direction, Dof::X);
            // the mode: joint and tip move together (unit largest component)
            let moving: Vec<(usize, f64)> = mode
                .iter()
                .map(|(n, d, v)| {
                    assert_eq!(*d, Dof::X, "only x is free");
                    (*n, *v)
                })
                .collect();
            assert_eq!(moving.len(), 2, "{moving:?}");
            for (n, v) in moving {
                assert!((v - 1.0).abs() < 1e-9, "node {n} moves {v}, expected 1 (in step)");
            }
        }
        Err(e) => panic!("expected a mechanism, got {e}"),
        Ok(_) => panic!("pivot ratio 1e-11 was accepted: the pivot tolerance lets near mechanisms through"),
    }
}
