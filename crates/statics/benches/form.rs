//! Validation with form finding, plus dead-load analysis of the frame model, at 8, 16
//! and 32 panels (the demo design otherwise); and the engine's part of one step of the
//! vehicle drag at 16 panels (the analysis with the vehicle's case, the validation, the
//! lanes and the other actions already done: a validated design keeps them), beside an
//! edit's (all of it).

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use springline_statics::arch::analysis::analyze_with;
use springline_statics::arch::cases::{pattern_case, Pattern};
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

fn vehicle_step(c: &mut Criterion) {
    let mut group = c.benchmark_group("vehicle_step_16_panels");
    let mut d = Design::demo();
    d.panels = 16;
    let valid = ValidDesign::new(&d).expect("demo is valid");
    let x = valid.layout().a.x + 0.5 * valid.layout().span();
    group.bench_function("analysis_with_vehicle", |b| {
        b.iter(|| {
            let case = pattern_case(&valid, Pattern::Vehicle(x)).expect("vehicle case");
            analyze_with(&valid, &[case]).expect("analyses")
        })
    });
    // an edit: validation (form finding), then the lanes and the other actions worked
    // out once for the new design, and the analysis
    group.bench_function("validation_and_analysis_with_vehicle", |b| {
        b.iter(|| {
            let valid = ValidDesign::new(&d).expect("demo is valid");
            let case = pattern_case(&valid, Pattern::Vehicle(x)).expect("vehicle case");
            analyze_with(&valid, &[case]).expect("analyses")
        })
    });
    group.finish();
}

criterion_group!(benches, form_and_dead_load, vehicle_step);
criterion_main!(benches);
