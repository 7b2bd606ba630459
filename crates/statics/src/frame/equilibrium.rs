//! The independent equilibrium check of a solved load case.
//!
//! It never reuses the assembled stiffness matrix: node residuals come from member end
//! actions recovered element by element, and the overall balance sums the reactions, the
//! nodal loads and the resultants of the member loads as defined (not their fixed-end
//! actions), with moments about the model's centroid. Common practice in matrix
//! structural analysis (McGuire, Gallagher & Ziemian, Matrix Structural Analysis, 2nd
//! ed., ch. 2: statics checks of computed results).

use crate::frame::assembly::{CaseLoads, Element};
use crate::frame::element::load_resultant_global;
use crate::frame::model::Model;
use crate::frame::numbering::{Equation, Numbering};
use crate::frame::results::{EquilibriumCheck, Reaction};
use crate::tolerance::VANISHING_REACTION;

/// The larger side of the bounding box of the nodes, m; 1 when the nodes span no
/// length (a single point, no nodes, or no finite coordinates). Non-finite coordinates
/// are skipped. Moments divided by it compare with forces.
pub fn characteristic_length(model: &Model) -> f64 {
    let (mut x0, mut x1, mut y0, mut y1) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for n in &model.nodes {
        if n.x.is_finite() && n.y.is_finite() {
            x0 = x0.min(n.x);
            x1 = x1.max(n.x);
            y0 = y0.min(n.y);
            y1 = y1.max(n.y);
        }
    }
    let l = (x1 - x0).max(y1 - y0);
    if l.is_finite() && l > 0.0 {
        l
    } else {
        1.0
    }
}

/// Mean of the node positions, m (the origin for a model without nodes).
fn centroid(model: &Model) -> (f64, f64) {
    let n = model.nodes.len().max(1) as f64;
    let sx: f64 = model.nodes.iter().map(|p| p.x).sum();
    let sy: f64 = model.nodes.iter().map(|p| p.y).sum();
    (sx / n, sy / n)
}

/// What the member forces of a case sum to at the nodes.
pub(crate) struct RecoveredTotals<'a> {
    /// Per node, the sum of member end actions (global Fx, Fy, M).
    pub(crate) sum_actions: &'a [[f64; 3]],
    /// Largest member end force, kN (moments over the characteristic length).
    pub(crate) largest_end_force: f64,
    /// The support reactions.
    pub(crate) reactions: &'a [Reaction],
}

/// The equilibrium check of one solved case (see [`EquilibriumCheck`] for what each
/// number is). `lchar` is the model's [`characteristic_length`], m.
pub(crate) fn equilibrium_check(
    model: &Model,
    numbering: &Numbering,
    elems: &[Element],
    loads: &CaseLoads,
    recovered: &RecoveredTotals<'_>,
    lchar: f64,
) -> EquilibriumCheck {
    let applied = &loads.applied;
    let reactions = recovered.reactions;
    // residuals at the free (and absent) freedoms: applied load minus member end actions
    let mut max_node_residual: f64 = 0.0;
    for node in 0..model.nodes.len() {
        for k in 0..3 {
            if numbering.equations[node][k] != Equation::Restrained {
                let res = (applied[node][k] - recovered.sum_actions[node][k]).abs();
                max_node_residual = max_node_residual.max(if k == 2 { res / lchar } else { res });
            }
        }
    }
    // overall equilibrium from the loads as defined (independent of fixed-end tables)
    let (cx, cy) = centroid(model);
    let mut g = [0.0f64; 3];
    let mut largest_load: f64 = 0.0;
    for (node, a) in applied.iter().enumerate() {
        let p = &model.nodes[node];
        g[0] += a[0];
        g[1] += a[1];
        g[2] += a[2] + (p.x - cx) * a[1] - (p.y - cy) * a[0];
        largest_load = largest_load.max(a[0].abs()).max(a[1].abs()).max(a[2].abs() / lchar);
    }
    for r in reactions {
        let p = &model.nodes[r.node];
        g[0] += r.fx;
        g[1] += r.fy;
        g[2] += r.mz + (p.x - cx) * r.fy - (p.y - cy) * r.fx;
    }
    let mut largest_reaction: f64 = 0.0;
    for r in reactions {
        largest_reaction = largest_reaction.max(r.fx.abs()).max(r.fy.abs()).max(r.mz.abs() / lchar);
    }
    for (k, member_loads) in loads.local_loads.iter().enumerate() {
        let el = &elems[k];
        let p = &model.nodes[model.members[k].start];
        for ll in member_loads {
            let (fx, fy, m0) = load_resultant_global(ll, &el.geometry);
            g[0] += fx;
            g[1] += fy;
            g[2] += m0 + (p.x - cx) * fy - (p.y - cy) * fx;
            largest_load = largest_load.max(fx.hypot(fy));
        }
    }
    let imposed = loads.imposed_strain_force;
    let (reference, basis) = if largest_load > 0.0 {
        (
            recovered.largest_end_force.max(largest_load).max(largest_reaction),
            "largest force present (loads, reactions, member end forces)",
        )
    } else if largest_reaction > VANISHING_REACTION * imposed && largest_reaction > 0.0 {
        (largest_reaction, "largest reaction (no net applied load)")
    } else if imposed > 0.0 {
        (imposed, "E A times the largest imposed strain")
    } else {
        (1.0, "1 kN (the case has no load)")
    };
    let global_max = g[0].abs().max(g[1].abs()).max(g[2].abs() / lchar);
    let relative = max_node_residual.max(global_max) / reference;
    EquilibriumCheck {
        max_node_residual,
        global_residual: g,
        reference,
        reference_basis: basis.to_string(),
        characteristic_length: lchar,
        relative,
    }
}
