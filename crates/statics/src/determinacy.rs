//! Degree of static indeterminacy of pin-jointed models from the rank of the
//! equilibrium matrix (Pellegrino & Calladine, "Matrix analysis of statically and
//! kinematically indeterminate frameworks", Int. J. Solids Struct. 22 (1986) 409-428).
//!
//! The equilibrium matrix A (2 rows per node, one column per bar force and per reaction
//! component) has rank r. Then s = columns - r independent states of self-stress
//! (statically indeterminate by s) and m = rows - r mechanism modes. Maxwell's count
//! bars + reactions - 2 nodes equals s - m, so it only gives s when m = 0.

use crate::error::StaticsError;
use crate::model::{Dof, Model};
use crate::solver::validate;
use nalgebra::DMatrix;
use serde::{Deserialize, Serialize};

/// Singular values below this fraction of the largest count as zero. The matrix holds
/// direction cosines and unit entries, so rank gaps are sharp.
pub const RANK_TOLERANCE: f64 = 1e-9;

/// How a pin-jointed model stands.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Determinacy {
    /// Forces follow from equilibrium alone.
    Determinate,
    /// Stable, with `degree` redundant bars or reactions.
    Indeterminate {
        /// Number of independent self-stress states.
        degree: usize,
    },
    /// Can move without deforming any bar.
    Mechanism {
        /// Number of independent mechanism modes.
        modes: usize,
        /// Redundant bars or reactions it also has (self-stress states), often 0.
        redundant: usize,
        /// A node that moves in the first mode.
        node: usize,
        /// Its display name.
        node_label: String,
        /// Direction in which it moves most.
        direction: Dof,
    },
}

/// Counts of the equilibrium matrix, and the verdict.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct DeterminacyReport {
    /// Number of bars (every member, treated as pin-ended).
    pub bars: usize,
    /// Number of restrained translations.
    pub reactions: usize,
    /// Number of nodes.
    pub nodes: usize,
    /// Rank of the equilibrium matrix.
    pub rank: usize,
    /// Verdict.
    pub determinacy: Determinacy,
}

impl DeterminacyReport {
    /// Words for reports: "determinate", "indeterminate by 3", "mechanism with 1 mode ...".
    pub fn describe(&self) -> String {
        match &self.determinacy {
            Determinacy::Determinate => "statically determinate".into(),
            Determinacy::Indeterminate { degree } => format!("statically indeterminate by {degree}"),
            Determinacy::Mechanism { modes, node_label, direction, .. } => {
                format!("a mechanism with {modes} mode(s): node {node_label} moves {}", direction.describe())
            }
        }
    }
}

/// Determinacy of `model` treated as pin-jointed (every member a bar, rotation
/// restraints ignored). Errors only for an invalid model.
pub fn truss_determinacy(model: &Model) -> Result<DeterminacyReport, StaticsError> {
    validate(model)?;
    let nn = model.nodes.len();
    let rows = 2 * nn;
    let mut cols: Vec<[(usize, f64); 2]> = Vec::new();
    let mut ncols_bar = 0;
    for (k, m) in model.members.iter().enumerate() {
        let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
        let l = model.member_length(k);
        let (cx, cy) = ((b.x - a.x) / l, (b.y - a.y) / l);
        // tension pulls the start node towards the end: +e at start, -e at end
        cols.push([(2 * m.start, cx), (2 * m.end, -cx)]);
        cols.push([(2 * m.start + 1, cy), (2 * m.end + 1, -cy)]);
        ncols_bar += 1;
    }
    let mut reactions = 0;
    for s in &model.supports {
        if s.x {
            reactions += 1;
        }
        if s.y {
            reactions += 1;
        }
    }
    let ncols = ncols_bar + reactions;
    // square-padded so the SVD returns the whole left singular basis
    let width = ncols.max(rows);
    let mut a = DMatrix::<f64>::zeros(rows, width);
    for k in 0..ncols_bar {
        for &(r, v) in cols[2 * k].iter().chain(cols[2 * k + 1].iter()) {
            a[(r, k)] += v;
        }
    }
    let mut c = ncols_bar;
    for s in &model.supports {
        if s.x {
            a[(2 * s.node, c)] = 1.0;
            c += 1;
        }
        if s.y {
            a[(2 * s.node + 1, c)] = 1.0;
            c += 1;
        }
    }
    let svd = a.svd(true, false);
    let smax = svd.singular_values.iter().copied().fold(0.0, f64::max);
    let rank = svd.singular_values.iter().filter(|&&s| s > RANK_TOLERANCE * smax).count();
    let redundant = ncols - rank;
    let modes = rows - rank;
    let determinacy = if modes > 0 {
        // a left singular vector with zero singular value is a mechanism mode
        let Some(u) = svd.u.as_ref() else {
            return Err(StaticsError::invalid("determinacy", "the rank computation gave no mode shapes"));
        };
        let idx = svd
            .singular_values
            .iter()
            .enumerate()
            .filter(|(_, s)| **s <= RANK_TOLERANCE * smax)
            .map(|(i, _)| i)
            .next()
            .unwrap_or(rows - 1);
        let col = u.column(idx);
        let (mut best, mut best_v) = (0, 0.0);
        for r in 0..rows {
            if col[r].abs() > best_v {
                best_v = col[r].abs();
                best = r;
            }
        }
        let node = best / 2;
        Determinacy::Mechanism {
            modes,
            redundant,
            node,
            node_label: model.node_label(node),
            direction: if best % 2 == 0 { Dof::X } else { Dof::Y },
        }
    } else if redundant == 0 {
        Determinacy::Determinate
    } else {
        Determinacy::Indeterminate { degree: redundant }
    };
    Ok(DeterminacyReport { bars: ncols_bar, reactions, nodes: nn, rank, determinacy })
}
