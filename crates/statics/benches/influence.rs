//! Influence lines of every quantity of the demo's frame model (the unit load every
//! 1 m along the deck and at its nodes: one factorisation, one solve per position), then
//! the envelope of each line under a uniform load of 9.3 kN/m and a three-axle truck
//! of 35, 145, 145 kN with its rear spacing searched from 4.3 to 9.0 m (HL-93 values,
//! AASHTO LRFD 3.6.1.2; from memory), at 16 and 32 panels.
//!
//! Then the whole traffic report a design gets (`arch::traffic::traffic_envelopes`):
//! the dead case, every influence line, the lane sharing and every line's envelope for
//! each vehicle arrangement and combination, for EN LM1 and AASHTO HL-93 (three vehicle
//! arrangements), at 16 and 32 panels.
//!
//! Run: `cargo bench -p springline-statics --bench influence`.

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use springline_statics::arch::design::Design;
use springline_statics::arch::influence::{arch_influence, ArchLine};
use springline_statics::arch::traffic::traffic_envelopes;
use springline_statics::frame::envelope::{envelope, AxleGroup, Traffic, VariableSpacing};
use springline_statics::traffic::models::ModelFamily;
use springline_statics::traffic::TrafficDesign;
use springline_statics::{ModelKind, ValidDesign};
use std::hint::black_box;

fn influence_and_envelopes(c: &mut Criterion) {
    let traffic = Traffic {
        uniform: 9.3,
        axles: Some(AxleGroup {
            loads: vec![35.0, 145.0, 145.0],
            spacings: vec![4.3, 4.3],
            variable: Some(VariableSpacing { index: 1, min: 4.3, max: 9.0 }),
            neglect_relieving: true,
        }),
    };
    let mut group = c.benchmark_group("influence_lines_and_envelopes");
    group.sample_size(10);
    for panels in [16usize, 32] {
        let mut d = Design::demo();
        d.panels = panels;
        let valid = ValidDesign::new(&d).expect("demo is valid");
        group.bench_with_input(BenchmarkId::from_parameter(panels), &valid, |b, valid| {
            b.iter(|| {
                let inf = arch_influence(valid, ModelKind::Frame, Some(1.0)).expect("solves").expect("frame");
                let mut extremes = 0.0;
                for line in ArchLine::every(&inf.generated) {
                    let eta = inf.ordinates(&line).expect("line");
                    let e = envelope(&inf.lines.positions, &eta, &traffic).expect("valid line");
                    extremes += e.max.value - e.min.value;
                }
                black_box(extremes)
            })
        });
    }
    group.finish();

    // the envelopes alone, the lines solved beforehand
    let mut group = c.benchmark_group("envelopes_only");
    group.sample_size(10);
    for panels in [16usize, 32] {
        let mut d = Design::demo();
        d.panels = panels;
        let valid = ValidDesign::new(&d).expect("demo is valid");
        let inf = arch_influence(&valid, ModelKind::Frame, Some(1.0)).expect("solves").expect("frame");
        let lines: Vec<Vec<f64>> =
            ArchLine::every(&inf.generated).iter().map(|l| inf.ordinates(l).expect("line")).collect();
        group.bench_with_input(BenchmarkId::from_parameter(panels), &lines, |b, lines| {
            b.iter(|| {
                let mut extremes = 0.0;
                for eta in lines {
                    let e = envelope(&inf.lines.positions, eta, &traffic).expect("valid line");
                    extremes += e.max.value - e.min.value;
                }
                black_box(extremes)
            })
        });
        println!("{panels} panels: {} lines of {} positions", lines.len(), inf.lines.positions.len());
    }
    group.finish();
}

fn traffic_reports(c: &mut Criterion) {
    let mut group = c.benchmark_group("traffic_report");
    group.sample_size(10);
    for family in [ModelFamily::EnLm1, ModelFamily::Hl93] {
        for panels in [16usize, 32] {
            let mut d = Design::demo();
            d.panels = panels;
            d.traffic = TrafficDesign::preset(family, 7.5);
            let valid = ValidDesign::new(&d).expect("demo is valid");
            let id = BenchmarkId::new(family.key(), panels);
            group.bench_with_input(id, &valid, |b, valid| {
                b.iter(|| {
                    black_box(traffic_envelopes(valid, ModelKind::Frame).expect("solves").expect("frame"))
                })
            });
        }
    }
    group.finish();
}

criterion_group!(benches, influence_and_envelopes, traffic_reports);
criterion_main!(benches);
