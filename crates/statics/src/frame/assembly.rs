//! The global stiffness matrix of the free freedoms and the load vectors of a load case.
//!
//! Element stiffness matrices are rotated to global axes (k_global = T^T k_local T) and
//! added into the banded matrix of the free freedoms; member loads, temperature changes
//! and prescribed displacements enter as fixed-end actions and known displacements
//! (McGuire, Gallagher & Ziemian, Matrix Structural Analysis, 2nd ed., ch. 2-5). The
//! right-hand side is always formed element by element as the out-of-balance force
//! `free_residual`, which iterative refinement reuses.

use crate::error::StaticsError;
use crate::frame::banded::BandMatrix;
use crate::frame::element::{
    fixed_end_actions, local_stiffness, resolve_load, temperature_end_actions, Geometry, LocalLoad,
};
use crate::frame::model::{LoadCase, Model};
use crate::frame::numbering::{Equation, Numbering};
use nalgebra::{Matrix6, Vector6};

/// Per-member data reused between assembly and recovery.
pub(crate) struct Element {
    /// Length and direction cosines.
    pub(crate) geometry: Geometry,
    /// Stiffness in local axes, releases condensed.
    pub(crate) k_local: Matrix6<f64>,
    /// Stiffness in global axes, T^T k_local T.
    pub(crate) k_global: Matrix6<f64>,
}

/// The element data of every member of a valid model, in member order.
pub(crate) fn elements(model: &Model) -> Vec<Element> {
    model
        .members
        .iter()
        .map(|m| {
            let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
            let geometry = Geometry::new(a.x, a.y, b.x, b.y);
            let k_local = local_stiffness(m, &geometry);
            let k_global = geometry.to_global_matrix(&k_local);
            Element { geometry, k_local, k_global }
        })
        .collect()
}

/// Adds every element's global stiffness into the banded matrix of the free freedoms.
/// The half bandwidth is the largest spread of free equation numbers within a member, so
/// every entry lies in the band; `BandMatrix::add` checks it all the same (an error would
/// be a defect of the numbering).
pub(crate) fn assemble(
    model: &Model,
    numbering: &Numbering,
    elems: &[Element],
) -> Result<BandMatrix, StaticsError> {
    assemble_matrices(model, numbering, elems.iter().map(|el| &el.k_global))
}

/// Adds one global 6 x 6 matrix per member (in member order, freedoms as
/// `Numbering::member_equations`) into a banded matrix of the free freedoms with the
/// band of the stiffness matrix (so a geometric stiffness or any other matrix built on
/// the members shares its shape). Rows and columns of restrained or absent freedoms are
/// left out.
pub(crate) fn assemble_matrices<'a>(
    model: &Model,
    numbering: &Numbering,
    matrices: impl IntoIterator<Item = &'a Matrix6<f64>>,
) -> Result<BandMatrix, StaticsError> {
    let n = numbering.free.len();
    let mut bandwidth = 0;
    for k in 0..model.members.len() {
        let (mut lo, mut hi) = (usize::MAX, 0);
        for e in numbering.member_equations(model, k) {
            if let Equation::Free(i) = e {
                lo = lo.min(i);
                hi = hi.max(i);
            }
        }
        if lo <= hi {
            bandwidth = bandwidth.max(hi - lo);
        }
    }
    let mut kff = BandMatrix::zeros(n, bandwidth);
    for (k, matrix) in matrices.into_iter().enumerate() {
        let eqs = numbering.member_equations(model, k);
        for r in 0..6 {
            let Equation::Free(i) = eqs[r] else { continue };
            for c in 0..6 {
                let Equation::Free(j) = eqs[c] else { continue };
                if i >= j {
                    kff.add(i, j, matrix[(r, c)])?;
                }
            }
        }
    }
    Ok(kff)
}

/// The loads of one case, gathered per node and per member.
pub(crate) struct CaseLoads {
    /// Applied nodal loads per node, global (Fx kN, Fy kN, M kNm).
    pub(crate) applied: Vec<[f64; 3]>,
    /// Member loads per member, resolved to local components.
    pub(crate) local_loads: Vec<Vec<LocalLoad>>,
    /// Fixed-end actions per member (member loads and temperature), local axes.
    pub(crate) fixed: Vec<Vector6<f64>>,
    /// The same in global axes (T^T times them), for the residual.
    pub(crate) fixed_global: Vec<Vector6<f64>>,
    /// Prescribed displacements per node (m, m, rad); zero where none is given.
    pub(crate) prescribed: Vec<[f64; 3]>,
    /// Largest force an imposed strain causes in a fully held member, kN: E A times the
    /// strain of a temperature change, or of a prescribed displacement over the length
    /// of a member at that node. The equilibrium check's reference when nothing is
    /// loaded.
    pub(crate) imposed_strain_force: f64,
}

/// Gathers the loads of case `lc` on a valid model (`elems` from [`elements`]).
pub(crate) fn case_loads(model: &Model, elems: &[Element], lc: &LoadCase) -> CaseLoads {
    let nn = model.nodes.len();
    let nm = model.members.len();
    // applied nodal loads, global
    let mut applied = vec![[0.0f64; 3]; nn];
    for l in &lc.nodal {
        applied[l.node][0] += l.fx;
        applied[l.node][1] += l.fy;
        applied[l.node][2] += l.mz;
    }
    // member loads resolved to local components; fixed-end actions per member
    let mut local_loads: Vec<Vec<LocalLoad>> = vec![Vec::new(); nm];
    let mut fixed: Vec<Vector6<f64>> = vec![Vector6::zeros(); nm];
    for ml in &lc.member {
        let k = ml.member();
        let ll = resolve_load(ml, &elems[k].geometry);
        fixed[k] += fixed_end_actions(&model.members[k], &elems[k].geometry, &ll);
        local_loads[k].push(ll);
    }
    let mut imposed_strain_force: f64 = 0.0;
    for t in &lc.temperature {
        let m = &model.members[t.member];
        fixed[t.member] += temperature_end_actions(m, t.delta_t);
        imposed_strain_force = imposed_strain_force.max(m.e * m.a * (m.alpha * t.delta_t).abs());
    }
    // prescribed displacements of restrained freedoms
    let mut prescribed = vec![[0.0f64; 3]; nn];
    for pd in &lc.prescribed {
        prescribed[pd.node][pd.dof.index()] = pd.value;
        let largest_at_node = model
            .members
            .iter()
            .enumerate()
            .filter(|(_, m)| m.start == pd.node || m.end == pd.node)
            .map(|(k, m)| m.e * m.a * pd.value.abs() / model.member_length(k))
            .fold(0.0, f64::max);
        imposed_strain_force = imposed_strain_force.max(largest_at_node);
    }
    let fixed_global = fixed.iter().zip(elems).map(|(f, el)| el.geometry.to_global_vector(f)).collect();
    CaseLoads { applied, local_loads, fixed, fixed_global, prescribed, imposed_strain_force }
}

/// Out-of-balance force at every free freedom for the free displacements `u_free`:
/// applied load minus the sum of member end actions (element by element), kN and kNm.
pub(crate) fn free_residual(
    model: &Model,
    numbering: &Numbering,
    elems: &[Element],
    loads: &CaseLoads,
    u_free: &[f64],
) -> Vec<f64> {
    let mut r: Vec<f64> =
        numbering.free.iter().map(|(node, dof)| loads.applied[*node][dof.index()]).collect();
    for (k, el) in elems.iter().enumerate() {
        let eqs = numbering.member_equations(model, k);
        let m = &model.members[k];
        let mut ue = Vector6::zeros();
        for (c, eq) in eqs.iter().enumerate() {
            let node = if c < 3 { m.start } else { m.end };
            ue[c] = match eq {
                Equation::Free(i) => u_free[*i],
                Equation::Restrained => loads.prescribed[node][c % 3],
                Equation::Absent => 0.0,
            };
        }
        // T^T (k T u + f0) with T^T k T and T^T f0 formed once
        let f = el.k_global * ue + loads.fixed_global[k];
        for (c, eq) in eqs.iter().enumerate() {
            if let Equation::Free(i) = eq {
                r[*i] -= f[c];
            }
        }
    }
    r
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::frame::model::{truss, Dof, Support};
    use crate::frame::numbering::number;
    use crate::frame::solver::validate;

    /// The assembled stiffness matrix of the free freedoms (banded, reverse Cuthill-McKee
    /// numbering) and, for each equation, the node and freedom it belongs to. Units kN/m,
    /// kN/rad, kNm/rad. Errors for an invalid model.
    fn free_stiffness(model: &Model) -> Result<(BandMatrix, Vec<(usize, Dof)>), StaticsError> {
        validate(model)?;
        let numbering = number(model);
        let elems = elements(model);
        let k = assemble(model, &numbering, &elems)?;
        Ok((k, numbering.free))
    }

    /// Two bars meeting at a free apex (a 3-4-5 triangle's rafters on two pins): the
    /// apex stiffness is the sum of EA/L [c^2 cs; cs s^2] over the bars (direct stiffness
    /// method, McGuire, Gallagher & Ziemian, Matrix Structural Analysis, 2nd ed., ch. 3).
    #[test]
    fn apex_of_two_bars_has_the_hand_stiffness() {
        let ea = 2e8 * 0.01;
        let mut m = Model::default();
        for (x, y) in [(0.0, 0.0), (4.0, 3.0), (8.0, 0.0)] {
            m.add_node("", x, y);
        }
        m.add_member(truss("", "", 0, 1, 2e8, 0.01));
        m.add_member(truss("", "", 1, 2, 2e8, 0.01));
        m.supports = vec![Support::pinned(0), Support::pinned(2)];
        let (k, free) = free_stiffness(&m).expect("valid");
        assert_eq!(free, vec![(1, Dof::X), (1, Dof::Y)]);
        assert_eq!(k.bandwidth(), 1);
        let close = |a: f64, b: f64| (a - b).abs() <= 1e-9 * ea;
        assert!(close(k.get(0, 0), 2.0 * ea / 5.0 * 0.64), "{}", k.get(0, 0));
        assert!(close(k.get(1, 1), 2.0 * ea / 5.0 * 0.36), "{}", k.get(1, 1));
        assert!(close(k.get(1, 0), 0.0) && close(k.get(0, 1), 0.0));
    }
}
