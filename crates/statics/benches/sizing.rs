//! Sizing a design from its traffic report (`arch::sizing::size_design`: every member's
//! demand from the envelopes, the smallest section of each group's family, quantities,
//! foundations), the demo at 16 and 32 panels, its traffic report computed once before.
//!
//! Run: `cargo bench -p springline-statics --bench sizing`.

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use springline_statics::arch::design::Design;
use springline_statics::arch::sizing::size_design;
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

criterion_group!(benches, sizing);
criterion_main!(benches);
