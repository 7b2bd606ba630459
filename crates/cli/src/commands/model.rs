//! `springline model DESIGN.json [--truss|--rib]`: export a generated analysis model in
//! the neutral JSON that `springline solve` reads (default: the frame model).

use super::{print_json, read_design};
use springline_statics::{bare_rib_model, find_form, frame_model, truss_model};

pub fn run(args: &[String]) -> anyhow::Result<()> {
    let usage = "usage: springline model DESIGN.json [--truss|--rib]";
    let (path, which) = match args {
        [p] => (p, "frame"),
        [p, flag] | [flag, p] if flag == "--truss" => (p, "truss"),
        [p, flag] | [flag, p] if flag == "--rib" => (p, "rib"),
        _ => anyhow::bail!(usage),
    };
    let design = read_design(path)?;
    springline_statics::validate_design(&design)?;
    let form = find_form(&design)?;
    let model = match which {
        "truss" => {
            anyhow::ensure!(
                design.bracing.is_braced(),
                "the design has no bracing, so it has no truss idealisation"
            );
            truss_model(&design, &form)?
        }
        "rib" => bare_rib_model(&design, &form)?,
        _ => frame_model(&design, &form)?,
    };
    print_json(&model)
}
