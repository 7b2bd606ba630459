//! Linear buckling and natural frequencies of a braced deck-arch frame at 16 and 32
//! panels, every member split in four (`StabilitySettings::default`):
//!
//! - `buckling_one_case`: preparation (refinement, assembly, one banded factorisation)
//!   and the three lowest modes of the dead case;
//! - `buckling_twenty_cases`: one preparation, then the dead case and twenty placements
//!   of a heavy axle along the deck (as a traffic study's governing placements), three
//!   modes each;
//! - `frequencies`: preparation and the four lowest natural frequencies with the dead
//!   case's masses.
//!
//! The demo's own stability (the rib's governing placements, the dead load's modes) is
//! timed by the `stages` bench.
//!
//! The frame is built here from `frame::model` alone: a parabolic rib and a deck as frame
//! members, posts and single diagonals as pin-ended bars with an I of their own (so they
//! can buckle on their own once split), pinned springings, the deck held vertically at
//! its ends.
//!
//! Run: `cargo bench -p springline-statics --bench stability`.

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use springline_statics::frame::stability::{Stability, StabilitySettings};
use springline_statics::{frame, truss, LoadCase, Model, NodalLoad, Support};
use std::hint::black_box;

const E: f64 = 2.1e8; // kN/m2, steel

/// The braced deck arch of `panels` panels with the dead case and twenty axle cases.
fn deck_arch(panels: usize) -> Model {
    let (span, rise, deck) = (120.0, 24.0, 30.0);
    let mut m = Model { title: format!("bench braced deck arch, {panels} panels"), ..Default::default() };
    for i in 0..=panels {
        let x = span * i as f64 / panels as f64;
        m.add_node("", x, 4.0 * rise * x * (span - x) / span.powi(2));
        m.add_node("", x, deck);
    }
    let (rib, top) = (|i: usize| 2 * i, |i: usize| 2 * i + 1);
    for i in 0..panels {
        m.add_member(frame("rib", "rib", rib(i), rib(i + 1), E, 0.2, 0.1));
        m.add_member(frame("deck", "deck", top(i), top(i + 1), E, 0.1, 0.05));
        let (a, b) = if i < panels / 2 { (top(i), rib(i + 1)) } else { (top(i + 1), rib(i)) };
        let mut diagonal = truss("diagonal", "bracing", a, b, E, 0.01);
        diagonal.i = 2e-4;
        m.add_member(diagonal);
    }
    for i in 0..=panels {
        let mut post = truss("post", "posts", rib(i), top(i), E, 0.02);
        post.i = 4e-4;
        m.add_member(post);
    }
    m.supports = vec![
        Support::pinned(rib(0)),
        Support::pinned(rib(panels)),
        Support::roller_along_x(top(0)),
        Support::roller_along_x(top(panels)),
    ];
    let dead = LoadCase {
        name: "dead".into(),
        nodal: (0..=panels).map(|i| NodalLoad { node: top(i), fx: 0.0, fy: -500.0, mz: 0.0 }).collect(),
        ..Default::default()
    };
    m.load_cases = vec![dead.clone()];
    for j in 0..20 {
        let mut case = dead.clone();
        case.name = format!("axle {j}");
        let k = (j * panels / 19).min(panels);
        case.nodal.push(NodalLoad { node: top(k), fx: 0.0, fy: -3000.0, mz: 0.0 });
        m.load_cases.push(case);
    }
    m
}

fn stability(c: &mut Criterion) {
    let settings = StabilitySettings::default();
    let mut group = c.benchmark_group("stability");
    group.sample_size(10);
    for panels in [16usize, 32] {
        let model = deck_arch(panels);
        group.bench_with_input(BenchmarkId::new("buckling_one_case", panels), &model, |b, m| {
            b.iter(|| {
                let prepared = Stability::new(black_box(m), settings).expect("stable");
                prepared.buckling(&m.load_cases[0], 3).expect("buckles").critical()
            })
        });
        group.bench_with_input(BenchmarkId::new("buckling_twenty_cases", panels), &model, |b, m| {
            b.iter(|| {
                let prepared = Stability::new(black_box(m), settings).expect("stable");
                let results = prepared.buckling_cases(&m.load_cases, 3);
                results
                    .iter()
                    .filter_map(|r| r.as_ref().ok().and_then(|c| c.critical()))
                    .fold(f64::INFINITY, f64::min)
            })
        });
        group.bench_with_input(BenchmarkId::new("frequencies", panels), &model, |b, m| {
            b.iter(|| {
                let prepared = Stability::new(black_box(m), settings).expect("stable");
                prepared.frequencies(&m.load_cases[0], 4).expect("has mass").modes[0].frequency
            })
        });
    }
    group.finish();
}

criterion_group!(benches, stability);
criterion_main!(benches);
