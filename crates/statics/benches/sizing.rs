//! Sizing a design from its traffic report (`arch::sizing::size_design`: every member's
//! demand from the envelopes, the smallest section of each group's family, quantities,
//! foundations), the demo at 16 and 32 panels, its traffic report computed once before.
//!
//! Then a sweep of 100 rise ratios (0.10 to 0.20) of the demo at 16 panels, each option
//! validated, analysed, its traffic report found and sized (`arch::sweep::sweep`).
//!
//! Run: `cargo bench -p springline-statics --bench sizing`.

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use springline_statics::arch::design::Design;
use springline_statics::arch::sizing::size_design;
use springline_statics::arch::sweep::{parse_axis, sweep};
use springline_statics::arch::traffic::traffic_envelopes;
use springline_statics::{ModelKind, ValidDesign};
use std::hint::black_box;

fn sizing(c: &mut Criterion) {
    let mut group = c.benchmark_group("sizing");
    group.sample_size(20);
    for panels in [16usize, 32] {
        let mut d = Design::demo();
        d.panels = panels;
        let valid = ValidDesign::new(&d).expect("demo is valid");
        let report = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("frame");
        group.bench_with_input(
            BenchmarkId::from_parameter(panels),
            &(valid, report),
            |b, (valid, report)| b.iter(|| black_box(size_design(valid, report).expect("sizes"))),
        );
    }
    group.finish();
}

fn rise_sweep(c: &mut Criterion) {
    let mut group = c.benchmark_group("sweep");
    group.sample_size(10);
    let mut d = Design::demo();
    d.panels = 16;
    let axis = parse_axis("rise-ratio=0.10:0.20:100").expect("a range");
    group.bench_function("rise_100_options_sized_16_panels", |b| {
        b.iter(|| black_box(sweep(&d, std::slice::from_ref(&axis), true).expect("sweeps")))
    });
    group.finish();
}

criterion_group!(benches, sizing, rise_sweep);
criterion_main!(benches);
