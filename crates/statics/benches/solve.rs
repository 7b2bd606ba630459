//! Build + solve of deck-arch models (frame and truss) at 8, 16, 32 and 64 panels, and
//! the whole banded solve of the 64-panel frame against a dense Cholesky factorisation
//! alone of the same free stiffness matrix. Public API only: the dense matrix is
//! assembled here from the public element stiffness, so when the whole solve (assembly,
//! banded LDL^T, refinement, recovery, checks) beats the dense factorisation by itself,
//! the banded factorisation does a fortiori.
//!
//! Run: `cargo bench -p springline-statics --bench solve`.

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use nalgebra::DMatrix;
use springline_statics::frame::element::{local_stiffness, Geometry};
use springline_statics::{frame, solve, truss, LoadCase, Member, Model, NodalLoad, Support};
use std::hint::black_box;

const E: f64 = 2.1e8;

/// A braced deck arch on a parabolic rib: deck chord, posts, single diagonals, pinned
/// springings; frame members (rib, deck) or all truss members. Built here rather than
/// by the design layer so the solver is measured alone.
fn deck_arch(panels: usize, as_truss: bool) -> Model {
    let (span, rise, deck) = (120.0, 24.0, 30.0);
    let mut m = Model { title: format!("bench deck arch, {panels} panels"), ..Default::default() };
    let bar = |name: &str, a: usize, b: usize, area: f64, i: f64| -> Member {
        if as_truss {
            truss(name, "", a, b, E, area)
        } else {
            frame(name, "", a, b, E, area, i)
        }
    };
    for i in 0..=panels {
        let x = span * i as f64 / panels as f64;
        m.add_node("", x, 4.0 * rise * x * (span - x) / span.powi(2));
        m.add_node("", x, deck);
    }
    let rib = |i: usize| 2 * i;
    let top = |i: usize| 2 * i + 1;
    for i in 0..panels {
        let r = bar("rib", rib(i), rib(i + 1), 0.2, 0.1);
        m.add_member(r);
        let d = bar("deck", top(i), top(i + 1), 0.1, 0.05);
        m.add_member(d);
        let (a, b) = if i < panels / 2 { (top(i), rib(i + 1)) } else { (top(i + 1), rib(i)) };
        m.add_member(truss("diagonal", "", a, b, E, 0.01));
    }
    for i in 0..=panels {
        m.add_member(truss("post", "", rib(i), top(i), E, 0.02));
    }
    m.supports = vec![Support::pinned(rib(0)), Support::pinned(rib(panels))];
    m.load_cases = vec![LoadCase {
        name: "dead".into(),
        nodal: (0..=panels).map(|i| NodalLoad { node: top(i), fx: 0.0, fy: -500.0, mz: 0.0 }).collect(),
        ..Default::default()
    }];
    m
}

fn build_and_solve(c: &mut Criterion) {
    let mut group = c.benchmark_group("deck_arch_build_and_solve");
    for panels in [8, 16, 32, 64] {
        for (label, as_truss) in [("frame", false), ("truss", true)] {
            group.bench_with_input(BenchmarkId::new(label, panels), &panels, |b, &n| {
                b.iter(|| solve(&deck_arch(black_box(n), as_truss)).expect("stable"))
            });
        }
    }
    group.finish();
}

/// The stiffness matrix of the free freedoms of `model`, dense: every node has x, y and a
/// rotation (true of `deck_arch` frames, whose every node meets a rigid rib or deck
/// member), numbered node by node, restrained ones left out.
fn dense_free_stiffness(model: &Model) -> DMatrix<f64> {
    let nn = model.nodes.len();
    let mut held = vec![false; 3 * nn];
    for s in &model.supports {
        held[3 * s.node] = s.x;
        held[3 * s.node + 1] = s.y;
        held[3 * s.node + 2] = s.rz;
    }
    let mut equation = vec![None; 3 * nn];
    let mut n = 0;
    for (dof, eq) in equation.iter_mut().enumerate() {
        if !held[dof] {
            *eq = Some(n);
            n += 1;
        }
    }
    let mut k = DMatrix::zeros(n, n);
    for m in &model.members {
        let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
        let g = Geometry::new(a.x, a.y, b.x, b.y);
        let t = g.transform();
        let kg = t.transpose() * local_stiffness(m, &g) * t;
        let dofs = [3 * m.start, 3 * m.start + 1, 3 * m.start + 2, 3 * m.end, 3 * m.end + 1, 3 * m.end + 2];
        for r in 0..6 {
            for c in 0..6 {
                if let (Some(i), Some(j)) = (equation[dofs[r]], equation[dofs[c]]) {
                    k[(i, j)] += kg[(r, c)];
                }
            }
        }
    }
    k
}

fn banded_solve_against_dense_factorisation(c: &mut Criterion) {
    let mut group = c.benchmark_group("solve_64_panel_frame");
    let model = deck_arch(64, false);
    let dense = dense_free_stiffness(&model);
    group.bench_function("banded_whole_solve", |b| b.iter(|| solve(black_box(&model)).expect("stable")));
    group
        .bench_function("dense_cholesky_alone", |b| b.iter(|| black_box(dense.clone()).cholesky().is_some()));
    group.finish();
}

criterion_group!(benches, build_and_solve, banded_solve_against_dense_factorisation);
criterion_main!(benches);
