//! Member resistance checks for a demand, and the search for the smallest size of a
//! family that carries it.

use super::sections::SectionProps;
use serde::{Deserialize, Serialize};

/// What a member must carry: the envelope's extremes, all as magnitudes.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Demand {
    /// The largest tension N >= 0, kN (0 when the member is never in tension).
    pub tension: f64,
    /// The largest compression as a magnitude |N| >= 0, kN.
    pub compression: f64,
    /// The largest bending moment |M| in the arch plane, kNm, taken with either axial force
    /// (conservative: not the concurrent value).
    pub moment: f64,
}

/// Buckling lengths of a member, m.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Lengths {
    /// Buckling length for buckling in the arch plane (about the axis across the deck), m.
    pub in_plane: f64,
    /// Buckling length for buckling out of the arch plane, m.
    pub out_of_plane: f64,
}

/// A way a member can fail a check.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Mode {
    /// Tension (with its moment when there is one).
    Tension,
    /// Flexural buckling in the arch plane under compression.
    InPlaneBuckling,
    /// Flexural buckling out of the arch plane under compression.
    OutOfPlaneBuckling,
    /// Bending alone.
    Bending,
    /// Compression with bending.
    Interaction,
    /// The section's slenderness class (steel walls too thin for class 3).
    Class,
}

/// The result of checking one section for a demand.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Check {
    /// The largest utilisation (demand over resistance; <= 1 passes).
    pub utilisation: f64,
    /// The mode with the largest utilisation.
    pub governs: Mode,
    /// Every mode checked with its utilisation.
    pub modes: Vec<(Mode, f64)>,
    /// The rules applied, in words with their clauses.
    pub rule: String,
    /// Slenderness in the arch plane: lambda_bar (steel), lambda_rel (glulam), l0 / i
    /// (concrete).
    pub slenderness_in: f64,
    /// Slenderness out of the arch plane, as `slenderness_in`.
    pub slenderness_out: f64,
    /// Buckling reduction in the arch plane: chi (steel), k_c (glulam), 1 (concrete,
    /// whose buckling enters as a second-order moment).
    pub chi_in: f64,
    /// Buckling reduction out of the arch plane, as `chi_in`.
    pub chi_out: f64,
    /// Euler load in the arch plane, kN (E: steel E, glulam E_0,05, concrete E_cm).
    pub n_cr_in: f64,
    /// Euler load out of the arch plane, kN.
    pub n_cr_out: f64,
    /// The in-plane moment the check used, kNm: the demand's, plus for concrete the
    /// imperfection and second-order moments.
    pub design_moment: f64,
}

/// The smallest size of a family that passes, with its section and check.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Sized {
    /// The size, m.
    pub size: f64,
    /// The section in words (`CHS 508 x 17.5`).
    pub label: String,
    /// The section's properties.
    pub props: SectionProps,
    /// The check of that section.
    pub check: Check,
}
