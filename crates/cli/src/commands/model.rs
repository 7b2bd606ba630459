//! `springline model DESIGN.json [--truss|--rib]`: export a generated analysis model in
//! the neutral JSON that `springline solve` reads (default: the frame model).

use super::{print_json, read_design};
use crate::failure::Failure;
use springline_statics::{
    bare_rib_model, find_form, frame_model, truss_model, validate_design, Design, Model, StaticsError,
};
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

/// Which generated model to export.
#[derive(Clone, Copy)]
enum Which {
    Frame,
    Truss,
    BareRib,
}

/// Reads a design, finds its form and prints the chosen generated model in the neutral
/// format. `--truss` on an unbraced design is refused (exit 1).
pub fn run(args: Args) -> Result<(), Failure> {
    let which = match (args.truss, args.rib) {
        (true, _) => Which::Truss,
        (false, true) => Which::BareRib,
        (false, false) => Which::Frame,
    };
    let design = read_design(&args.design)?;
    if matches!(which, Which::Truss) && !design.bracing.is_braced() {
        return Err(Failure::refused("the design has no bracing, so it has no truss idealisation"));
    }
    print_json(&generated_model(&design, which)?)
}

/// The engine's generation of one model from a design: validation, form finding, then
/// the model.
fn generated_model(design: &Design, which: Which) -> Result<Model, StaticsError> {
    validate_design(design)?;
    let form = find_form(design)?;
    match which {
        Which::Frame => frame_model(design, &form),
        Which::Truss => truss_model(design, &form),
        Which::BareRib => bare_rib_model(design, &form),
    }
}
