//! `springline sweep DESIGN.json --vary NAME=RANGE [--vary NAME=RANGE] [--size] [--json]`:
//! the key numbers of every option of a one-parameter sweep or a two-parameter grid.

use super::{print_json, print_line, read_design};
use crate::failure::Failure;
use springline_statics::arch::sweep::{
    interleave, option_count, parse_axis, sweep_share, to_csv, Axis, Share, Sweep, SweepRow,
};
use std::path::PathBuf;

/// Sweep one parameter of a design (or two as a grid) and print each option's key numbers.
///
/// NAME is rise-ratio, panels, springing-level, ribs, rib-system or form-basis; RANGE is
/// FROM:TO:COUNT (COUNT values, both ends included) or a list V1,V2,... (rib systems by
/// name: three-hinged, two-hinged, fixed; form bases: panel-loads, as-built). Each option is validated, analysed and its traffic
/// envelopes found: form thrust, the design thrust range and the largest design force of
/// a rib, post and bracing member over the ultimate combinations; with --size also steel,
/// concrete and the cost index. An option that fails is a row with its reason. What stays
/// fixed and what follows is in the JSON's `held` and the README. CSV by default (columns
/// named with their units), JSON with --json. For concept design only: local codes and a
/// licensed engineer govern.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline sweep design.json --vary rise-ratio=0.10:0.20:21
  springline sweep design.json --vary panels=8:16:5 --vary rib-system=two-hinged,fixed --size
  springline demo | springline sweep - --vary ribs=1,2,3 --json
  springline sweep design.json --vary form-basis=panel-loads,as-built --size")]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: PathBuf,

    /// A parameter and its values: NAME=FROM:TO:COUNT or NAME=V1,V2,... (once, or twice
    /// for a grid).
    #[arg(long = "vary", value_name = "NAME=RANGE", required = true, num_args = 1)]
    vary: Vec<String>,

    /// Size each option too (steel, concrete, cost index).
    #[arg(long)]
    size: bool,

    /// JSON instead of CSV.
    #[arg(long)]
    json: bool,

    /// Also draw the sweep of one numeric parameter as an SVG chart at this path (thrust,
    /// and steel with --size).
    #[arg(long, value_name = "FILE.svg")]
    chart: Option<PathBuf>,

    /// Work out the options on this many threads at once (default: one per processor
    /// core). The rows are the same whatever the count.
    #[arg(long, value_name = "N", value_parser = clap::value_parser!(u16).range(1..=256))]
    jobs: Option<u16>,
}

/// Reads the design and the ranges, sweeps and prints.
pub fn run(args: Args) -> Result<(), Failure> {
    let design = read_design(&args.design)?;
    let axes: Vec<Axis> = args.vary.iter().map(|v| parse_axis(v)).collect::<Result<_, _>>()?;
    if args.chart.is_some() && (axes.len() != 1 || !axes[0].parameter.is_numeric()) {
        return Err(Failure::Refused(anyhow::anyhow!(
            "a chart takes one numeric parameter (not a grid, not the rib system or form basis)"
        )));
    }
    let cores = std::thread::available_parallelism().map_or(1, usize::from);
    let jobs = args.jobs.map_or(cores, usize::from);
    let result = sweep_on_threads(&design, &axes, args.size, jobs)?;
    if let Some(path) = &args.chart {
        chart(&result, path).map_err(|e| {
            Failure::Io(anyhow::anyhow!("cannot draw the chart at '{}': {e}", path.display()))
        })?;
    }
    if args.json {
        print_json(&result)
    } else {
        print_line(&to_csv(&result))
    }
}

/// The sweep on `jobs` threads (at most one per option; the first is this one): each takes
/// one share of the options (`arch::sweep::Share`), and the shares are put back in row
/// order.
fn sweep_on_threads(
    design: &springline_statics::Design,
    axes: &[Axis],
    size: bool,
    jobs: usize,
) -> Result<Sweep, springline_statics::StaticsError> {
    let options = option_count(axes);
    let parts = jobs.clamp(1, options.max(1));
    let share = |part| sweep_share(design, axes, size, Share { part, parts }, |_, _, _| true);
    // the first share on this thread (its stack as before), the others on threads of their own
    let shares: Vec<_> = std::thread::scope(|scope| {
        let others: Vec<_> = (1..parts).map(|part| scope.spawn(move || share(part))).collect();
        let first = share(0);
        // a thread that panicked is a defect of the engine: let it surface as one
        std::iter::once(first)
            .chain(others.into_iter().map(|t| t.join().unwrap_or_else(|e| std::panic::resume_unwind(e))))
            .collect()
    });
    interleave(shares.into_iter().collect::<Result<Vec<_>, _>>()?)
}

/// Draws the sweep of one numeric parameter as an SVG chart at `path`: the form thrust and
/// the greatest design thrust (kN) against the parameter, and below, when sized, the
/// steel (t); infeasible options left out. Plotters' SVG backend.
fn chart(s: &Sweep, path: &std::path::Path) -> Result<(), String> {
    use plotters::prelude::*;
    let axis = s.axes.first().ok_or("no axis")?;
    if s.axes.len() != 1 || !axis.parameter.is_numeric() {
        return Err(
            "a chart takes one numeric parameter (not a grid, not the rib system or form basis)".into()
        );
    }
    let rows: Vec<(f64, &SweepRow)> =
        axis.values.iter().copied().zip(&s.rows).filter(|(_, r)| r.feasible).collect();
    if rows.is_empty() {
        return Err("no feasible option to draw".into());
    }
    let (x0, x1) =
        rows.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), (x, _)| (a.min(*x), b.max(*x)));
    let (x0, x1) = if x1 > x0 { (x0, x1) } else { (x0 - 0.5, x1 + 0.5) };
    let height = if s.sized { 720 } else { 420 };
    let root = SVGBackend::new(path, (900, height)).into_drawing_area();
    root.fill(&WHITE).map_err(|e| e.to_string())?;
    let panels = if s.sized { root.split_evenly((2, 1)) } else { vec![root.clone()] };
    let series = |r: &SweepRow| [r.form_thrust, r.thrust_range.map(|t| t[1])];
    let top = rows.iter().flat_map(|(_, r)| series(r)).flatten().fold(0.0, f64::max) * 1.08;
    let ink = [RGBColor(0x1f, 0x4e, 0x79), RGBColor(0xb3, 0x5c, 0x1e)];
    let mut c = ChartBuilder::on(&panels[0])
        .caption("Thrust against the swept parameter (whole cross-section)", ("sans-serif", 18))
        .margin(12)
        .x_label_area_size(40)
        .y_label_area_size(70)
        .build_cartesian_2d(x0..x1, 0.0..top)
        .map_err(|e| e.to_string())?;
    c.configure_mesh().x_desc(axis.parameter.column()).y_desc("kN").draw().map_err(|e| e.to_string())?;
    for (k, name) in ["form thrust (dead load)", "greatest design thrust (ultimate)"].into_iter().enumerate()
    {
        let points: Vec<(f64, f64)> =
            rows.iter().filter_map(|(x, r)| series(r)[k].map(|y| (*x, y))).collect();
        let color = ink[k];
        c.draw_series(LineSeries::new(points.clone(), color.stroke_width(2)))
            .map_err(|e| e.to_string())?
            .label(name)
            .legend(move |(x, y)| PathElement::new(vec![(x, y), (x + 18, y)], color.stroke_width(2)));
        c.draw_series(points.iter().map(|p| Circle::new(*p, 3, color.filled())))
            .map_err(|e| e.to_string())?;
    }
    c.configure_series_labels()
        .position(SeriesLabelPosition::UpperRight)
        .border_style(BLACK)
        .background_style(WHITE)
        .draw()
        .map_err(|e| e.to_string())?;
    if s.sized {
        let steel: Vec<(f64, f64)> = rows.iter().filter_map(|(x, r)| r.steel.map(|t| (*x, t))).collect();
        let (lo, hi) = steel.iter().fold((f64::INFINITY, 0.0_f64), |(a, b), (_, t)| (a.min(*t), b.max(*t)));
        let pad = ((hi - lo) * 0.15).max(1.0);
        let mut c = ChartBuilder::on(&panels[1])
            .caption("Steel of the sized option (t)", ("sans-serif", 18))
            .margin(12)
            .x_label_area_size(40)
            .y_label_area_size(70)
            .build_cartesian_2d(x0..x1, (lo - pad).max(0.0)..hi + pad)
            .map_err(|e| e.to_string())?;
        c.configure_mesh().x_desc(axis.parameter.column()).y_desc("t").draw().map_err(|e| e.to_string())?;
        let color = RGBColor(0x3b, 0x6e, 0x3b);
        c.draw_series(LineSeries::new(steel.clone(), color.stroke_width(2))).map_err(|e| e.to_string())?;
        c.draw_series(steel.iter().map(|p| Circle::new(*p, 3, color.filled()))).map_err(|e| e.to_string())?;
    }
    root.present().map_err(|e| e.to_string())
}
