//! Stability and dynamics of a deck arch in its plane, first numbers: the critical load
//! factor alpha_cr of the frame model under the dead load with its buckled shapes, and
//! the natural frequencies of the frame model with the dead load's masses.
//!
//! Both come from `frame::stability` on the frame model with every member split into
//! four elements (so a post or a diagonal can buckle on its own between its ends): the
//! elastic plus geometric stiffness from the dead load's axial forces, and lumped masses
//! from the dead load over g (no rotational inertia). Out-of-plane buckling and lateral
//! sway are beyond a plane model and are not covered: every report says so. The
//! governing traffic placements and the second-order amplification in sizing are later
//! work. Concept-design values: local codes and a licensed engineer govern.

use crate::arch::analysis::CAUTION;
use crate::arch::generate::{frame_model, DEAD};
use crate::arch::validate::ValidDesign;
use crate::error::StaticsError;
use crate::frame::stability::{CaseBuckling, Stability, StabilitySettings, Vibration};
use crate::traffic::models::ModelFamily;
use serde::Serialize;

/// alpha_cr at or above which a first-order analysis is acceptable (EN 1993-1-1
/// 5.2.1(3), elastic analysis: alpha_cr >= 10).
pub const FIRST_ORDER_ALPHA: f64 = 10.0;
/// alpha_cr below which amplifying first-order moments is no longer acceptable (EN
/// 1993-1-1 5.2.2(5), from memory: the amplification 1 / (1 - 1/alpha_cr) only for
/// alpha_cr >= 3).
pub const AMPLIFICATION_LEAST_ALPHA: f64 = 3.0;
/// Vertical frequency below which a footbridge needs a comfort check, Hz (EN 1990 Annex
/// A2, A2.4.3.2, from memory: 5 Hz for vertical vibrations).
pub const FOOTBRIDGE_COMFORT_HZ: f64 = 5.0;
/// The range of vertical frequencies that walkers excite most, Hz (common practice:
/// about 1.6 to 2.4 Hz, the pace frequencies of walking).
pub const WALKING_RANGE_HZ: [f64; 2] = [1.6, 2.4];

/// What the stability analysis says, in words for the screen and the CLI.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ArchStability {
    /// The dead load's buckling: alpha_cr of each mode and its shape (original and
    /// refined nodes).
    pub dead: CaseBuckling,
    /// alpha_cr of the dead load (the lowest mode).
    pub alpha_cr: f64,
    /// Per buckling mode, the member that buckles on its own between its ends (the mode's
    /// largest movement inside it), or `None` for a mode of the whole arch.
    pub buckling_members: Vec<Option<String>>,
    /// What alpha_cr means for the analysis, in words.
    pub verdict: String,
    /// The natural frequencies with the dead load's masses.
    pub vibration: Vibration,
    /// The lowest mostly vertical frequency, Hz (`None` when no mode found is vertical).
    pub first_vertical_hz: Option<f64>,
    /// The footbridge comfort flag, when the traffic is a footbridge crowd (`None` for
    /// road traffic).
    pub footbridge: Option<String>,
    /// How the numbers were found and what they leave out.
    pub notes: Vec<String>,
    /// Caution.
    pub caution: String,
}

/// The verdict on alpha_cr (see the constants for the limits and their sources).
pub fn verdict(alpha_cr: f64) -> String {
    if alpha_cr >= FIRST_ORDER_ALPHA {
        format!("alpha_cr {alpha_cr:.2} >= 10: a first-order analysis is acceptable (EN 1993-1-1 5.2.1(3))")
    } else if alpha_cr >= AMPLIFICATION_LEAST_ALPHA {
        format!(
            "alpha_cr {alpha_cr:.2} below 10: second-order effects count; the first-order moments amplified by \
             1 / (1 - 1/alpha_cr) = {:.2} (EN 1993-1-1 5.2.2, from memory)",
            1.0 / (1.0 - 1.0 / alpha_cr)
        )
    } else {
        format!(
            "alpha_cr {alpha_cr:.2} below 3: too slender for amplified first-order moments; stiffen the rib or \
             raise the rise"
        )
    }
}

/// The footbridge flag for the lowest vertical frequency `f` (Hz), or `None` when none.
pub fn footbridge_flag(f: f64) -> String {
    let [low, high] = WALKING_RANGE_HZ;
    if (low..=high).contains(&f) {
        format!(
            "first vertical frequency {f:.2} Hz lies in the walking range {low}-{high} Hz (common practice: avoid); \
             below {FOOTBRIDGE_COMFORT_HZ} Hz a comfort check is required (EN 1990 A2.4.3.2, from memory)"
        )
    } else if f < FOOTBRIDGE_COMFORT_HZ {
        format!(
            "first vertical frequency {f:.2} Hz below {FOOTBRIDGE_COMFORT_HZ} Hz: a comfort check is required (EN \
             1990 A2.4.3.2, from memory)"
        )
    } else {
        format!("first vertical frequency {f:.2} Hz at or above {FOOTBRIDGE_COMFORT_HZ} Hz: no comfort check needed")
    }
}

/// Buckling under the dead load (`modes` lowest modes) and the lowest `modes` natural
/// frequencies of the frame model of `valid` (see the module doc).
///
/// Errors: those of `frame::stability` (a dead load that compresses nothing, a model
/// without mass, a mechanism).
pub fn arch_stability(valid: &ValidDesign, modes: usize) -> Result<ArchStability, StaticsError> {
    let generated = frame_model(valid);
    let settings = StabilitySettings::default();
    let prepared = Stability::new(&generated.model, settings)?;
    let dead_case = generated
        .model
        .load_cases
        .iter()
        .find(|c| c.name == DEAD)
        .ok_or_else(|| StaticsError::invalid("frame model", "has no dead load case"))?;
    let dead = prepared.buckling(dead_case, modes)?;
    let alpha_cr = dead.critical().unwrap_or(f64::INFINITY);
    let buckling_members = dead
        .modes
        .iter()
        .map(|m| m.shape.peak_member.and_then(|k| generated.model.members.get(k)).map(|m| m.name.clone()))
        .collect();
    let vibration = prepared.frequencies(dead_case, modes)?;
    let first_vertical_hz = vibration.modes.iter().find(|m| m.vertical_share > 0.5).map(|m| m.frequency);
    let footbridge = (valid.design().traffic.load_model.family() == ModelFamily::Crowd)
        .then(|| first_vertical_hz.map_or("no vertical mode among those found".to_string(), footbridge_flag));
    let notes = vec![
        format!(
            "frame model, every member split into {} elements (a post or diagonal can buckle on its own); elastic \
             plus geometric stiffness from the dead load's axial forces; linear buckling",
            settings.parts
        ),
        "masses lumped from the dead load over g = 9.81 m/s2, no rotational inertia; a mode is vertical when more \
         than half its kinetic energy is in vertical motion"
            .into(),
        "out-of-plane buckling and lateral sway are beyond this plane model and are not covered".into(),
    ];
    Ok(ArchStability {
        verdict: verdict(alpha_cr),
        dead,
        alpha_cr,
        buckling_members,
        vibration,
        first_vertical_hz,
        footbridge,
        notes,
        caution: CAUTION.into(),
    })
}
