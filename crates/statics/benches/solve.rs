//! Build + solve of deck-arch models (frame and truss) at 8, 16, 32 and 64 panels, and
//! the banded LDL^T against a dense Cholesky of the same stiffness matrix.
//!
//! Run: `cargo bench -p springline-statics --bench solve`.

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use nalgebra::DMatrix;
use springline_statics::frame::banded::LdlFactor;
use springline_statics::frame::solver::free_stiffness;
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

fn banded_against_dense(c: &mut Criterion) {
    let mut group = c.benchmark_group("factorise_64_panel_frame");
    let (k, _) = free_stiffness(&deck_arch(64, false)).expect("valid");
    let n = k.order();
    let dense = DMatrix::from_fn(n, n, |i, j| k.get(i, j));
    group.bench_function("banded_ldl", |b| b.iter(|| LdlFactor::new(black_box(&k)).is_ok()));
    group.bench_function("dense_cholesky", |b| b.iter(|| black_box(dense.clone()).cholesky().is_some()));
    group.finish();
}

criterion_group!(benches, build_and_solve, banded_against_dense);
criterion_main!(benches);
