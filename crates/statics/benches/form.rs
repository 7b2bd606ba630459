//! Validation with form finding, plus dead-load analysis of the frame model, at 8, 16
//! and 32 panels (the demo design otherwise).

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use springline_statics::arch::design::Design;
use springline_statics::{frame_model, solve, ValidDesign};

fn form_and_dead_load(c: &mut Criterion) {
    let mut group = c.benchmark_group("form_and_dead_load");
    for panels in [8usize, 16, 32] {
        let mut d = Design::demo();
        d.panels = panels;
        group.bench_with_input(BenchmarkId::from_parameter(panels), &d, |b, d| {
            b.iter(|| {
                let valid = ValidDesign::new(d).expect("demo is valid");
                solve(&frame_model(&valid).model).expect("solves")
            })
        });
    }
    group.finish();
}

criterion_group!(benches, form_and_dead_load);
criterion_main!(benches);
