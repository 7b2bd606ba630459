//! `springline solve MODEL.json`: solve a neutral analysis model.

use super::{print_json, read_text, source_name, Conventions, CONVENTIONS};
use crate::failure::Failure;
use serde::Serialize;
use springline_statics::{
    solve, truss_determinacy, DeterminacyReport, MemberKind, Model, Solution, StaticsError,
};
use std::path::PathBuf;
use std::time::Instant;

/// Solve a model in the neutral model format (JSON).
///
/// Prints, per load case, displacements, member forces, reactions and the equilibrium
/// check made independently of the solve; for models whose members are all pin-ended,
/// also the degree of static indeterminacy. A mechanism is refused, naming a node that
/// moves.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline solve frame.json
  springline model design.json | springline solve -
  springline solve --time 2000 frame.json > /dev/null")]
pub struct Args {
    /// The model file (JSON, the neutral model format); `-` reads standard input.
    #[arg(value_name = "MODEL.json")]
    model: PathBuf,

    /// Also solve the model this many times more in this process and print the time
    /// per solve (median and fastest, microseconds) to standard error: each solve from a
    /// fresh copy of the model read, through validation, assembly, factorisation, every
    /// load case, recovery and the equilibrium check.
    #[arg(long, value_name = "N", value_parser = clap::value_parser!(u32).range(1..=1_000_000))]
    time: Option<u32>,
}

#[derive(Serialize)]
struct Output<'a> {
    conventions: Conventions,
    title: &'a str,
    /// Degree of static indeterminacy, for models whose members are all pin-ended.
    determinacy: Option<DeterminacyReport>,
    solution: Solution,
}

/// Reads a neutral model, solves it and prints conventions, title, determinacy (all-bar
/// models only) and the solution as pretty JSON. A mechanism is refused (exit 1).
pub fn run(args: Args) -> Result<(), Failure> {
    let text = read_text(&args.model)?;
    let model = model_from_json(&text).map_err(|e| {
        Failure::Refused(
            anyhow::Error::new(e).context(format!("{} is not a valid model file", source_name(&args.model))),
        )
    })?;
    let (determinacy, solution) = solution_of(&model)?;
    if let Some(repeats) = args.time {
        let (median, fastest) = time_solves(&model, repeats);
        eprintln!("solve time over {repeats} solves in this process: median {median:.2} us, fastest {fastest:.2} us");
    }
    print_json(&Output { conventions: CONVENTIONS, title: &model.title, determinacy, solution })
}

/// The median and the fastest time of `repeats` solves of a fresh copy of `model`, in
/// microseconds (the model is known to solve).
fn time_solves(model: &Model, repeats: u32) -> (f64, f64) {
    let mut times: Vec<f64> = (0..repeats)
        .map(|_| {
            let start = Instant::now();
            let copy = model.clone();
            let solved = solve(std::hint::black_box(&copy)).is_ok();
            std::hint::black_box(solved);
            start.elapsed().as_secs_f64() * 1e6
        })
        .collect();
    times.sort_by(f64::total_cmp);
    (times[times.len() / 2], times[0])
}

/// The engine's reading of a neutral model file.
fn model_from_json(text: &str) -> serde_json::Result<Model> {
    serde_json::from_str::<Model>(text)
}

/// The engine's solution of a model, with its degree of static indeterminacy when every
/// member is pin-ended.
fn solution_of(model: &Model) -> Result<(Option<DeterminacyReport>, Solution), StaticsError> {
    let all_pinned =
        model.members.iter().all(|m| m.kind == MemberKind::Truss || (m.release_start && m.release_end));
    let determinacy = if all_pinned { Some(truss_determinacy(model)?) } else { None };
    Ok((determinacy, solve(model)?))
}
