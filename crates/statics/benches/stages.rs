//! Every stage of the engine's work on one design, at 8, 16, 32, 64 and 128 panels (the
//! demo deck arch, `Design::demo`, with only its panel count changed), so the growth with
//! panel count can be read off one run:
//!
//! - `validate_and_form`: validation, layout and form finding with the rib's self-weight
//!   (`ValidDesign::new`);
//! - `edit_validate_and_analyse`: what an edit on the page works out: the design
//!   validated anew after the one on screen (`ValidDesign::new_after`: the lanes taken
//!   over when the traffic's inputs are unchanged, as for a panel-count edit) and analysed
//!   whole, the other actions' cases included (solved with the standard cases in one
//!   factorisation of each model);
//! - `static_cases`: every standard load case of the three models, with their figures
//!   (`arch::analysis::analyze_valid`; the other actions' report is kept with the
//!   validated design, so after the first run this is the standard cases alone);
//! - `influence_and_envelopes`: every influence line of the frame model and its envelopes
//!   under the design's load model and combinations (`arch::sizing::frame_traffic`);
//! - `sizing`: every group sized from that report, with the rib's stability under its
//!   governing placements, the foundations and the quantities
//!   (`arch::sizing::size_and_weigh`);
//! - `rib_buckling_governing`: that rib stability alone: the factored dead load and the
//!   governing placements of the rib members, built and buckled
//!   (`arch::second_order::rib_stability`), so sizing less this is the sizing itself;
//! - `dead_buckling_and_frequencies`: the dead load's buckling (every member split, and
//!   the arch's own mode) and four natural frequencies (`arch::stability::arch_stability`).
//!
//! Run: `cargo bench -p springline-statics --bench stages` (add a stage name to run one).

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use springline_statics::arch::analysis::{analyze_to, analyze_valid, Extent};
use springline_statics::arch::design::Design;
use springline_statics::arch::generate::{frame_model, Generated};
use springline_statics::arch::influence::{ArchLine, MemberEnd};
use springline_statics::arch::second_order::{rib_members, rib_stability, RibSources};
use springline_statics::arch::sizing::{frame_traffic, is_ultimate, size_and_weigh};
use springline_statics::arch::stability::arch_stability;
use springline_statics::arch::traffic::TrafficReport;
use springline_statics::traffic::combination::Combination;
use springline_statics::ValidDesign;
use std::hint::black_box;
use std::time::Duration;

const PANELS: [usize; 5] = [8, 16, 32, 64, 128];

fn demo(panels: usize) -> Design {
    let mut d = Design::demo();
    d.panels = panels;
    d
}

/// The demo at `panels` panels, validated, with its frame model, traffic report and the
/// sources of its rib members' demands under its first ultimate combination (each rib
/// member's largest compression and its larger end moment, as sizing picks them).
fn demo_sources(panels: usize) -> (ValidDesign, Generated, TrafficReport, Vec<RibSources>) {
    let d = demo(panels);
    let valid = ValidDesign::new(&d).expect("demo is valid");
    let report = frame_traffic(&valid).expect("traffic");
    let generated = frame_model(&valid);
    let uls =
        d.traffic.combinations.iter().find(|c| is_ultimate(c)).expect("an ultimate combination").name.clone();
    // the member's end moment line with the larger extreme (a hinged end has none)
    let larger = |k: usize| {
        [MemberEnd::Start, MemberEnd::End]
            .into_iter()
            .filter_map(|end| report.line(&ArchLine::Moment(k, end).name(&generated)))
            .map(|l| (l.line.clone(), l.design[0].max, l.design[0].min))
            .max_by(|a, b| a.1.abs().max(a.2.abs()).total_cmp(&b.1.abs().max(b.2.abs())))
            .map(|(line, max, min)| (uls.clone(), line, max.abs() >= min.abs()))
    };
    let sources = rib_members(&generated)
        .into_iter()
        .map(|k| RibSources {
            member: k,
            compression: Some((uls.clone(), ArchLine::Axial(k).name(&generated), false)),
            moment: larger(k),
        })
        .collect();
    (valid, generated, report, sources)
}

fn stages(c: &mut Criterion) {
    let mut group = c.benchmark_group("stages");
    group.sample_size(10).warm_up_time(Duration::from_millis(500)).measurement_time(Duration::from_secs(2));
    for panels in PANELS {
        let d = demo(panels);
        group.bench_function(BenchmarkId::new("validate_and_form", panels), |b| {
            b.iter(|| ValidDesign::new(black_box(&d)).expect("valid"))
        });
        // what an edit on the page works out: a design validated anew after the one on
        // screen (two panels more, analysed: its lanes are taken over), then analysed for
        // the screen (every case and the action cases solved, the figures of the case
        // shown alone)
        let on_screen = ValidDesign::new(&demo(panels + 2)).expect("valid");
        analyze_valid(&on_screen).expect("analyses");
        group.bench_function(BenchmarkId::new("edit_validate_and_analyse", panels), |b| {
            b.iter(|| {
                let valid = ValidDesign::new_after(black_box(&d), Some(&on_screen)).expect("valid");
                analyze_to(&valid, &[], None, Extent::Screen { shown: 0 }).expect("analyses")
            })
        });
        let (valid, generated, report, sources) = demo_sources(panels);
        group.bench_function(BenchmarkId::new("static_cases", panels), |b| {
            b.iter(|| analyze_valid(black_box(&valid)).expect("analyses"))
        });
        group.bench_function(BenchmarkId::new("influence_and_envelopes", panels), |b| {
            b.iter(|| frame_traffic(black_box(&valid)).expect("traffic"))
        });
        group.bench_function(BenchmarkId::new("sizing", panels), |b| {
            b.iter(|| size_and_weigh(black_box(&valid), &report).expect("sizes"))
        });
        let ultimate: Vec<&Combination> = d.traffic.combinations.iter().filter(|c| is_ultimate(c)).collect();
        group.bench_function(BenchmarkId::new("rib_buckling_governing", panels), |b| {
            b.iter(|| {
                rib_stability(black_box(&valid), &generated, &report, &ultimate, &sources)
                    .expect("buckles")
                    .alpha_cr
            })
        });
        group.bench_function(BenchmarkId::new("dead_buckling_and_frequencies", panels), |b| {
            b.iter(|| arch_stability(black_box(&valid), 4).expect("buckles").arch.alpha_cr)
        });
    }
    group.finish();
}

criterion_group!(benches, stages);
criterion_main!(benches);
