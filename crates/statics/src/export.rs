//! The files a design is taken out of the meeting in, made by one function for the app
//! (through its background worker) and the command line (`springline export`), so both
//! write the same bytes: the member table (CSV), the design file with its summary (JSON),
//! and the elevation and force diagram drawings (SVG). See `arch::tables` and
//! `scene::svg` for what each holds.

use crate::arch::analysis::analyze;
use crate::arch::design::Design;
use crate::arch::options::key_numbers;
use crate::arch::sizing::size_of;
use crate::arch::tables::{design_json_with_summary, member_table_csv};
use crate::error::StaticsError;
use crate::scene::elevation::ElevationOptions;
use crate::scene::force::ForceOptions;
use crate::scene::svg::{elevation_svg, force_svg};
use crate::scene::Viewport;
use crate::units::Units;
use serde::{Deserialize, Serialize};

/// The drawing size the command line exports at, CSS pixels (the app exports at its
/// canvases' sizes).
pub const DRAWING_SIZE: (f64, f64) = (1200.0, 640.0);

/// One export.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case", tag = "kind")]
pub enum Export {
    /// The member table, CSV (`arch::tables::member_table_csv`).
    MemberTable,
    /// The design file with its summary, JSON (`arch::tables::design_json_with_summary`).
    DesignFile,
    /// The elevation under the dead load, SVG, `width` x `height` CSS pixels.
    ElevationSvg {
        /// Width, CSS pixels.
        width: f64,
        /// Height, CSS pixels.
        height: f64,
    },
    /// The force diagram under the dead load, SVG, `width` x `height` CSS pixels.
    ForceSvg {
        /// Width, CSS pixels.
        width: f64,
        /// Height, CSS pixels.
        height: f64,
    },
}

impl Export {
    /// The file name for a design named `design` (the first four of its words of letters
    /// and digits, lower case, `-` between them; `springline` when it has none) with this
    /// export's ending: `tarnvale-gorge-road-bridge-members.csv`. Designs whose names start
    /// alike get the same name (the browser numbers repeated downloads).
    pub fn file_name(&self, design: &str) -> String {
        let stem: String = design
            .split(|c: char| !c.is_alphanumeric())
            .filter(|w| !w.is_empty())
            .take(4)
            .collect::<Vec<_>>()
            .join("-")
            .to_lowercase();
        let stem = if stem.is_empty() { "springline".to_string() } else { stem };
        match self {
            Export::MemberTable => format!("{stem}-members.csv"),
            Export::DesignFile => format!("{stem}.json"),
            Export::ElevationSvg { .. } => format!("{stem}-elevation.svg"),
            Export::ForceSvg { .. } => format!("{stem}-forces.svg"),
        }
    }
}

/// The text of export `what` of `design` (validated, analysed and, for the table and the
/// design file, sized). Drawings are in SI units, the dead-load case, the frame model.
///
/// Errors: those of validation, analysis and sizing (`StaticsError`), with their words;
/// a drawing size that is not finite and positive is `Invalid`.
pub fn export(design: &Design, what: Export) -> Result<String, StaticsError> {
    let viewport = |width: f64, height: f64| {
        if width.is_finite() && height.is_finite() && width >= 1.0 && height >= 1.0 {
            Ok(Viewport::new(width, height))
        } else {
            Err(StaticsError::invalid(
                "drawing size",
                format!("{width} x {height} px: give two sizes of at least 1 px"),
            ))
        }
    };
    match what {
        // a design that cannot be sized still gives its table (without the sizing
        // columns) and its file (the summary says why)
        Export::MemberTable => {
            let analysis = analyze(design)?;
            Ok(member_table_csv(&analysis, size_of(design).ok().as_ref()))
        }
        Export::DesignFile => {
            crate::arch::validate::validate_design(design)?;
            let report = size_of(design).map_err(|e| e.to_string());
            let report = match &report {
                Ok(r) => Ok(r),
                Err(why) => Err(why.as_str()),
            };
            Ok(design_json_with_summary(design, &key_numbers(design, true), report))
        }
        Export::ElevationSvg { width, height } => {
            let analysis = analyze(design)?;
            let opts = ElevationOptions { units: Units::Si, ..ElevationOptions::default() };
            Ok(elevation_svg(&analysis, design, &opts, viewport(width, height)?))
        }
        Export::ForceSvg { width, height } => {
            let analysis = analyze(design)?;
            Ok(force_svg(&analysis, design, 0, &ForceOptions::default(), viewport(width, height)?))
        }
    }
}
