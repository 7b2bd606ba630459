//! `springline model DESIGN.json [--truss|--rib]`: export a generated analysis model in
//! the neutral JSON that `springline solve` reads (default: the frame model).

use super::{print_json, read_design};
use crate::failure::Failure;
use springline_statics::arch::generate::{model_of, ModelKind};
use springline_statics::{Design, Model, StaticsError, ValidDesign};
use std::path::PathBuf;

/// Export a generated model in the neutral model format (JSON).
///
/// The frame model by default; `--truss` for the truss idealisation or `--rib` for the
/// bare rib (at most one of the two). `solve` reads the output.
#[derive(clap::Args)]
#[command(after_help = "\
Examples:
  springline model design.json > frame.json
  springline model --truss design.json | springline solve -")]
pub struct Args {
    /// The design file (JSON); `-` reads standard input.
    #[arg(value_name = "DESIGN.json")]
    design: PathBuf,

    /// The truss idealisation (every joint pinned; braced designs only).
    #[arg(long, conflicts_with = "rib")]
    truss: bool,

    /// The bare rib on its springings under the form-finding loads.
    #[arg(long)]
    rib: bool,
}

/// Reads a design, validates it (finding its form) and prints the chosen generated model
/// in the neutral format. `--truss` on an unbraced design is refused (exit 1).
pub fn run(args: Args) -> Result<(), Failure> {
    let which = match (args.truss, args.rib) {
        (true, _) => ModelKind::Truss,
        (false, true) => ModelKind::BareRib,
        (false, false) => ModelKind::Frame,
    };
    let design = read_design(&args.design)?;
    match generated_model(&design, which)? {
        Some(model) => print_json(&model),
        None => Err(Failure::refused("the design has no bracing, so it has no truss idealisation")),
    }
}

/// The engine's generation of one model from a design: validation (with form finding),
/// then the model; `None` for the truss idealisation of an unbraced design.
fn generated_model(design: &Design, which: ModelKind) -> Result<Option<Model>, StaticsError> {
    let valid = ValidDesign::new(design)?;
    Ok(model_of(&valid, which).map(|g| g.model))
}
