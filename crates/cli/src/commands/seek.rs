//! `springline seek DESIGN.json --max-thrust KN | --springing-angle DEG | --least
//! cost|steel | --min-clearance M`: the rise that meets one goal, everything else held.

use super::{print_line, read_design};
use crate::failure::Failure;
use springline_statics::arch::design_file::write_design_json;
use springline_statics::arch::seek::{seek, Goal, Measure, SeekReport, Side};
use std::path::PathBuf;

/// Find the rise that meets one goal, holding everything else.
///
/// The rise ranges over what the layout accepts; a scan of 31 rises finds the bracket,
/// bisection refines it (0.1 mm of rise). Goals: the lowest rise whose form thrust is at
/// most KN; the rise whose dead-load springing resultant stands DEG below the horizontal
/// (at the left springing, or the right with --side right); the least cost index or
/// steel with every group sized and passing; the largest rise keeping the rib's top at
/// least M below the deck's underside. Prints the design found as JSON on standard
/// output (so it pipes into `springline analyze -`) and the report on standard error;
/// when no rise meets the goal it says so with the nearest value, prints no design and
/// exits 1. For concept design only: local codes and a licensed engineer govern.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline demo | springline seek - --max-thrust 7500 | springline analyze - --summary
  springline seek design.json --springing-angle 40 --side right
  springline seek design.json --least cost > cheapest.json
  springline seek design.json --min-clearance 2.5")]
#[command(group(
    clap::ArgGroup::new("goal")
        .required(true)
        .multiple(false)
        .args(["max_thrust", "springing_angle", "least", "min_clearance"])
))]
#[group(skip)]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: PathBuf,

    /// The form thrust at most this, kN: the lowest such rise.
    #[arg(long, value_name = "KN")]
    max_thrust: Option<f64>,

    /// The dead-load springing resultant at this angle below the horizontal, degrees.
    #[arg(long, value_name = "DEG", allow_negative_numbers = true)]
    springing_angle: Option<f64>,

    /// Which springing the angle is for.
    #[arg(long, value_enum, default_value_t = SideArg::Left, requires = "springing_angle")]
    side: SideArg,

    /// The least cost index or steel, every group sized and passing.
    #[arg(long, value_enum, value_name = "cost|steel")]
    least: Option<MeasureArg>,

    /// The least clear gap between the rib's top and the deck's underside at least this,
    /// m: the largest such rise.
    #[arg(long, value_name = "M", allow_negative_numbers = true)]
    min_clearance: Option<f64>,
}

/// The springing, on the command line.
#[derive(Clone, Copy, clap::ValueEnum)]
enum SideArg {
    Left,
    Right,
}

/// What --least minimises, on the command line.
#[derive(Clone, Copy, clap::ValueEnum)]
enum MeasureArg {
    Cost,
    Steel,
}

/// The goal the arguments name (clap lets exactly one through).
fn goal(args: &Args) -> Result<Goal, Failure> {
    let side = match args.side {
        SideArg::Left => Side::Left,
        SideArg::Right => Side::Right,
    };
    match (args.max_thrust, args.springing_angle, args.least, args.min_clearance) {
        (Some(thrust), ..) => Ok(Goal::MaxThrust { thrust }),
        (_, Some(degrees), ..) => Ok(Goal::SpringingAngle { degrees, side }),
        (_, _, Some(MeasureArg::Cost), _) => Ok(Goal::Least { measure: Measure::Cost }),
        (_, _, Some(MeasureArg::Steel), _) => Ok(Goal::Least { measure: Measure::Steel }),
        (.., Some(gap)) => Ok(Goal::MinClearance { gap }),
        _ => Err(Failure::refused(
            "give one goal: --max-thrust, --springing-angle, --least or --min-clearance",
        )),
    }
}

/// The report for people, on standard error.
pub fn report_lines(r: &SeekReport) -> String {
    [
        format!("goal: {}", r.goal_words),
        format!(
            "searched rises {:.3} to {:.3} m ({} designs evaluated); {}",
            r.range[0], r.range[1], r.evaluations, r.held
        ),
        r.message.clone(),
        format!("({})", r.caution),
    ]
    .join("\n")
}

/// Reads the design, seeks and prints.
pub fn run(args: Args) -> Result<(), Failure> {
    let design = read_design(&args.design)?;
    let report = seek(&design, goal(&args)?)?;
    eprintln!("{}", report_lines(&report));
    if !report.met {
        return Err(Failure::refused(report.message));
    }
    print_line(write_design_json(&report.design).trim_end())
}
