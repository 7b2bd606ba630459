//! Direct stiffness method for plane frames and trusses.
//!
//! Assemble the global stiffness of the free freedoms (banded, nodes renumbered by reverse
//! Cuthill-McKee), factorise once (LDL^T), solve every load case with that factorisation,
//! recover member end actions element by element, reactions, and an equilibrium check
//! that does not reuse the assembled matrix (McGuire, Gallagher & Ziemian, Matrix
//! Structural Analysis, 2nd ed., ch. 2-5).
//!
//! Sign conventions of results: axial force N tension positive; bending moment M positive
//! when it puts the right-hand fibre of the member (looking from its start node to its end
//! node) in tension, sagging for members drawn left to right; shear V = dM/ds. Reactions
//! and displacements in global axes (x right, y up, anticlockwise positive).

use crate::error::{Problem, StaticsError};
use crate::frame::banded::{BandMatrix, LdlFactor};
use crate::frame::element::{
    fixed_end_actions, internal_forces, load_resultant_global, local_stiffness, resolve_load,
    temperature_end_actions, Geometry, LocalLoad,
};
use crate::frame::model::{Dof, LoadCase, Model};
use crate::tolerance::VANISHING_REACTION;
use nalgebra::{Matrix6, Vector6};
use serde::{Deserialize, Serialize};

/// Number of equal intervals at which internal forces are reported along each member.
pub const STATION_INTERVALS: usize = 10;

/// Steps of iterative refinement after the first solve (each costs one back-substitution).
pub const REFINEMENT_STEPS: usize = 2;

/// Results of every load case of a model.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Solution {
    /// One result per load case, in the model's order.
    pub cases: Vec<CaseResult>,
    /// Number of free freedoms solved for.
    pub free_dofs: usize,
    /// Half bandwidth of the assembled stiffness matrix after renumbering.
    pub bandwidth: usize,
}

/// Results of one load case.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CaseResult {
    /// Load case name.
    pub name: String,
    /// Displacements of every node.
    pub displacements: Vec<NodeDisplacement>,
    /// Forces of every member.
    pub members: Vec<MemberForces>,
    /// Reactions of every supported node.
    pub reactions: Vec<Reaction>,
    /// Independent equilibrium check.
    pub equilibrium: EquilibriumCheck,
}

/// Displacement of a node: m, m, rad (rotation absent where no member holds it).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct NodeDisplacement {
    /// Node index.
    pub node: usize,
    /// Horizontal displacement, m.
    pub ux: f64,
    /// Vertical displacement, m.
    pub uy: f64,
    /// Rotation, rad, anticlockwise; `None` at pins where every member is released.
    pub rz: Option<f64>,
}

/// Internal forces at a section: kN, kN, kNm (sign convention in the module doc).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize, Default)]
pub struct SectionForces {
    /// Axial force, kN, tension positive.
    pub n: f64,
    /// Shear, kN, dM/ds.
    pub v: f64,
    /// Bending moment, kNm, sagging (right-hand fibre in tension) positive.
    pub m: f64,
}

/// Internal forces at distance `s` along a member.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Station {
    /// Distance from the start node, m.
    pub s: f64,
    /// Forces just before `s` (a point load at `s` acts after it).
    pub forces: SectionForces,
}

/// Forces of one member.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct MemberForces {
    /// Member index.
    pub member: usize,
    /// Length, m.
    pub length: f64,
    /// Internal forces at the start node.
    pub start: SectionForces,
    /// Internal forces at the end node.
    pub end: SectionForces,
    /// Internal forces at equal intervals and at point loads.
    pub stations: Vec<Station>,
    /// Forces and moments the nodes apply to the member, global axes:
    /// start (Fx, Fy, M), end (Fx, Fy, M), kN and kNm.
    pub end_actions_global: [f64; 6],
}

impl MemberForces {
    /// Largest absolute bending moment over the stations, kNm.
    pub fn max_abs_moment(&self) -> f64 {
        self.stations.iter().map(|s| s.forces.m.abs()).fold(0.0, f64::max)
    }
}

/// Reaction of a support, global axes: kN, kN, kNm (zero in released directions).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Reaction {
    /// Node index.
    pub node: usize,
    /// Horizontal reaction, kN, positive to the right.
    pub fx: f64,
    /// Vertical reaction, kN, positive up.
    pub fy: f64,
    /// Reaction moment, kNm, anticlockwise.
    pub mz: f64,
}

/// Equilibrium of the solved structure, checked from member end actions computed
/// element by element (not from the assembled matrix).
///
/// `max_node_residual`: at every free freedom, applied load minus the sum of member end
/// actions (kN; moments divided by the model's characteristic length). `global_residual`:
/// sum of reactions, nodal loads and member-load resultants (Fx kN, Fy kN, M kNm about
/// the model's centroid). `relative`: the largest of these (moments over the
/// characteristic length) divided by `reference`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct EquilibriumCheck {
    /// Largest residual at a node, kN (moments over `characteristic_length`).
    pub max_node_residual: f64,
    /// Overall residual (Fx kN, Fy kN, M kNm).
    pub global_residual: [f64; 3],
    /// Force the residuals are compared with, kN.
    pub reference: f64,
    /// What `reference` is.
    pub reference_basis: String,
    /// Length dividing moment residuals, m (the larger side of the model's extent).
    pub characteristic_length: f64,
    /// Largest residual over `reference`.
    pub relative: f64,
}

/// How a node freedom enters the equations.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Eq {
    Free(usize),
    Restrained,
    Absent,
}

/// Numbering of the freedoms of a model.
struct Numbering {
    eqs: Vec<[Eq; 3]>,
    free: Vec<(usize, Dof)>,
}

const DOFS: [Dof; 3] = [Dof::X, Dof::Y, Dof::Rz];

/// Checks a model and lists every problem found (indices, lengths, properties, loads).
pub fn validate(model: &Model) -> Result<(), StaticsError> {
    let mut p = Vec::new();
    let mut add = |loc: String, msg: String| p.push(Problem::new(loc, msg));
    if model.nodes.is_empty() {
        add("model".into(), "has no nodes; add at least two nodes and a member".into());
    }
    let nn = model.nodes.len();
    for (i, n) in model.nodes.iter().enumerate() {
        if !n.x.is_finite() || !n.y.is_finite() {
            add(format!("node {}", model.node_label(i)), "coordinates must be finite numbers (m)".into());
        }
    }
    let extent = characteristic_length(model);
    let mut connected = vec![false; nn];
    for (k, m) in model.members.iter().enumerate() {
        let loc = format!("member {}", model.member_label(k));
        let mut ends_ok = true;
        for (end, idx) in [("start", m.start), ("end", m.end)] {
            if idx >= nn {
                add(loc.clone(), format!("{end} node {idx} does not exist (the model has {nn} nodes)"));
                ends_ok = false;
            } else {
                connected[idx] = true;
            }
        }
        if ends_ok {
            let l = model.member_length(k);
            if m.start == m.end || l.is_nan() || l <= extent * 1e-9 {
                add(
                    loc.clone(),
                    format!(
                        "has zero length (nodes {} and {} coincide); remove it or move a node",
                        model.node_label(m.start),
                        model.node_label(m.end)
                    ),
                );
            }
        }
        if !(m.e.is_finite() && m.e > 0.0) {
            add(loc.clone(), format!("Young's modulus E = {} kN/m2 must be a positive finite number", m.e));
        }
        if !(m.a.is_finite() && m.a > 0.0) {
            add(loc.clone(), format!("area A = {} m2 must be a positive finite number", m.a));
        }
        let bad_i = !(m.i.is_finite() && m.i > 0.0);
        if !crate::frame::element::is_axial_only(m) && bad_i {
            add(
                loc.clone(),
                format!(
                    "second moment of area I = {} m4 must be positive for a frame member with a rigid end",
                    m.i
                ),
            );
        }
        if !m.alpha.is_finite() {
            add(loc.clone(), "thermal expansion coefficient must be finite".into());
        }
    }
    let mut supported = vec![false; nn];
    for s in &model.supports {
        if s.node >= nn {
            add("support".into(), format!("node {} does not exist (the model has {nn} nodes)", s.node));
            continue;
        }
        if supported[s.node] {
            add(
                format!("node {}", model.node_label(s.node)),
                "has more than one support; merge them into one".into(),
            );
        }
        supported[s.node] = true;
        if !(s.x || s.y || s.rz) {
            add(
                format!("node {}", model.node_label(s.node)),
                "support restrains nothing; set x, y or rz".into(),
            );
        }
    }
    for (i, c) in connected.iter().enumerate() {
        if !c {
            add(
                format!("node {}", model.node_label(i)),
                "is not connected to any member; remove it or connect it".into(),
            );
        }
    }
    let rot = rotation_active(model);
    for lc in &model.load_cases {
        let loc = format!("load case '{}'", lc.name);
        for l in &lc.nodal {
            if l.node >= nn {
                add(loc.clone(), format!("nodal load on node {} which does not exist", l.node));
            } else if !(l.fx.is_finite() && l.fy.is_finite() && l.mz.is_finite()) {
                add(loc.clone(), format!("nodal load on node {} is not finite", model.node_label(l.node)));
            } else if l.mz != 0.0 && !rot.get(l.node).copied().unwrap_or(false) {
                add(
                    loc.clone(),
                    format!(
                        "moment applied at node {} where every member is pinned; nothing can resist it",
                        model.node_label(l.node)
                    ),
                );
            }
        }
        for ml in &lc.member {
            let k = ml.member();
            if k >= model.members.len() {
                add(loc.clone(), format!("member load on member {k} which does not exist"));
                continue;
            }
            let (val, a) = match *ml {
                crate::frame::model::MemberLoad::Uniform { w, .. } => (w, None),
                crate::frame::model::MemberLoad::Point { p, a, .. } => (p, Some(a)),
            };
            if !val.is_finite() {
                add(loc.clone(), format!("load on member {} is not finite", model.member_label(k)));
            }
            if let Some(a) = a {
                let l = model.member_length(k);
                if !(a.is_finite() && a >= 0.0 && a <= l * (1.0 + 1e-12)) {
                    add(
                        loc.clone(),
                        format!(
                            "point load on member {} at a = {a} m lies outside the member (0 to {l:.3} m)",
                            model.member_label(k)
                        ),
                    );
                }
            }
        }
        for t in &lc.temperature {
            if t.member >= model.members.len() {
                add(loc.clone(), format!("temperature load on member {} which does not exist", t.member));
            } else if !t.delta_t.is_finite() {
                add(loc.clone(), "temperature change must be finite (K)".into());
            }
        }
        for pd in &lc.prescribed {
            let restrained = model.supports.iter().any(|s| {
                s.node == pd.node
                    && match pd.dof {
                        Dof::X => s.x,
                        Dof::Y => s.y,
                        Dof::Rz => s.rz,
                    }
            });
            if pd.node >= nn {
                add(loc.clone(), format!("prescribed displacement at node {} which does not exist", pd.node));
            } else if pd.dof == Dof::Rz && !rot[pd.node] {
                add(
                    loc.clone(),
                    format!(
                        "prescribed rotation at node {}: every member there is pinned, so the node has no rotation to impose",
                        model.node_label(pd.node)
                    ),
                );
            } else if !restrained {
                add(
                    loc.clone(),
                    format!(
                        "prescribed displacement at node {} {} needs a support restraining that direction",
                        model.node_label(pd.node),
                        pd.dof.describe()
                    ),
                );
            } else if !pd.value.is_finite() {
                add(loc.clone(), "prescribed displacement must be finite".into());
            }
        }
    }
    if p.is_empty() {
        Ok(())
    } else {
        Err(StaticsError::Invalid(p))
    }
}

/// The larger side of the bounding box of the nodes, m (1 for a single point).
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

/// Which nodes have a rotation freedom: those where at least one member is rigidly
/// connected (a frame member not released at that end).
fn rotation_active(model: &Model) -> Vec<bool> {
    let mut rot = vec![false; model.nodes.len()];
    for m in &model.members {
        if !m.pinned_at_start() && m.start < rot.len() {
            rot[m.start] = true;
        }
        if !m.pinned_at_end() && m.end < rot.len() {
            rot[m.end] = true;
        }
    }
    rot
}

/// Reverse Cuthill-McKee order of the nodes (keeps the band narrow whatever the input
/// numbering; George & Liu, Computer Solution of Large Sparse Positive Definite Systems).
pub(crate) fn node_order(model: &Model) -> Vec<usize> {
    let nn = model.nodes.len();
    let mut adj = vec![Vec::new(); nn];
    for m in &model.members {
        adj[m.start].push(m.end);
        adj[m.end].push(m.start);
    }
    for a in &mut adj {
        a.sort_unstable();
        a.dedup();
    }
    let mut visited = vec![false; nn];
    let mut order = Vec::with_capacity(nn);
    while order.len() < nn {
        // start each component at a node of least degree (ties: lowest x, then index)
        let start = (0..nn)
            .filter(|&i| !visited[i])
            .min_by(|&a, &b| {
                adj[a].len().cmp(&adj[b].len()).then(
                    model.nodes[a].x.partial_cmp(&model.nodes[b].x).unwrap_or(std::cmp::Ordering::Equal),
                )
            })
            .unwrap_or(0);
        visited[start] = true;
        let mut queue = std::collections::VecDeque::from([start]);
        while let Some(v) = queue.pop_front() {
            order.push(v);
            let mut next: Vec<usize> = adj[v].iter().copied().filter(|&w| !visited[w]).collect();
            next.sort_by_key(|&w| adj[w].len());
            for w in next {
                visited[w] = true;
                queue.push_back(w);
            }
        }
    }
    order.reverse();
    order
}

fn number(model: &Model) -> Numbering {
    let nn = model.nodes.len();
    let rot = rotation_active(model);
    let mut restrained = vec![[false; 3]; nn];
    for s in &model.supports {
        restrained[s.node] = [s.x, s.y, s.rz];
    }
    let mut eqs = vec![[Eq::Absent; 3]; nn];
    let mut free = Vec::new();
    for node in node_order(model) {
        for (k, dof) in DOFS.iter().enumerate() {
            if k == 2 && !rot[node] {
                continue;
            }
            eqs[node][k] = if restrained[node][k] {
                Eq::Restrained
            } else {
                free.push((node, *dof));
                Eq::Free(free.len() - 1)
            };
        }
    }
    Numbering { eqs, free }
}

/// Per-member data reused between assembly and recovery.
struct Element {
    geometry: Geometry,
    k_local: Matrix6<f64>,
    t: Matrix6<f64>,
    k_global: Matrix6<f64>,
}

fn elements(model: &Model) -> Vec<Element> {
    model
        .members
        .iter()
        .map(|m| {
            let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
            let geometry = Geometry::new(a.x, a.y, b.x, b.y);
            let k_local = local_stiffness(m, &geometry);
            let t = geometry.transform();
            let k_global = t.transpose() * k_local * t;
            Element { geometry, k_local, t, k_global }
        })
        .collect()
}

fn member_eqs(model: &Model, numbering: &Numbering, member: usize) -> [Eq; 6] {
    let m = &model.members[member];
    let a = numbering.eqs[m.start];
    let b = numbering.eqs[m.end];
    [a[0], a[1], a[2], b[0], b[1], b[2]]
}

/// Solves every load case of `model`.
///
/// Errors: `Invalid` listing every problem of the input; `Mechanism` naming a node and
/// direction that move without resistance (never NaN results).
pub fn solve(model: &Model) -> Result<Solution, StaticsError> {
    validate(model)?;
    let numbering = number(model);
    let elems = elements(model);
    let kff = assemble(model, &numbering, &elems);
    let n = numbering.free.len();
    let bandwidth = kff.bandwidth();
    let factor = match LdlFactor::new(&kff) {
        Ok(f) => f,
        Err(singular) => return Err(mechanism_error(model, &numbering, &singular.null_vector)),
    };
    let mut cases = Vec::with_capacity(model.load_cases.len());
    for lc in &model.load_cases {
        cases.push(solve_case(model, &numbering, &elems, &factor, lc)?);
    }
    Ok(Solution { cases, free_dofs: n, bandwidth })
}

/// The assembled stiffness matrix of the free freedoms (banded, reverse Cuthill-McKee
/// numbering) and, for each equation, the node and freedom it belongs to. Units kN/m,
/// kN/rad, kNm/rad. Errors for an invalid model.
pub fn free_stiffness(model: &Model) -> Result<(BandMatrix, Vec<(usize, Dof)>), StaticsError> {
    validate(model)?;
    let numbering = number(model);
    let elems = elements(model);
    let k = assemble(model, &numbering, &elems);
    Ok((k, numbering.free))
}

fn assemble(model: &Model, numbering: &Numbering, elems: &[Element]) -> BandMatrix {
    let n = numbering.free.len();
    let mut bandwidth = 0;
    for k in 0..model.members.len() {
        let free: Vec<usize> = member_eqs(model, numbering, k)
            .iter()
            .filter_map(|e| if let Eq::Free(i) = e { Some(*i) } else { None })
            .collect();
        if let (Some(lo), Some(hi)) = (free.iter().min(), free.iter().max()) {
            bandwidth = bandwidth.max(hi - lo);
        }
    }
    let mut kff = BandMatrix::zeros(n, bandwidth);
    for (k, el) in elems.iter().enumerate() {
        let eqs = member_eqs(model, numbering, k);
        for r in 0..6 {
            let Eq::Free(i) = eqs[r] else { continue };
            for c in 0..6 {
                let Eq::Free(j) = eqs[c] else { continue };
                if i >= j {
                    kff.add(i, j, el.k_global[(r, c)]);
                }
            }
        }
    }
    kff
}

fn mechanism_error(model: &Model, numbering: &Numbering, null_vector: &[f64]) -> StaticsError {
    // name the translation that moves most in the mode (rotations only if none moves)
    let lc = characteristic_length(model);
    let mut best = (0usize, 0.0f64);
    for (i, v) in null_vector.iter().enumerate() {
        let (_, dof) = numbering.free[i];
        let weight = if dof == Dof::Rz { v.abs() * lc * 1e-6 } else { v.abs() };
        if weight > best.1 {
            best = (i, weight);
        }
    }
    let (node, direction) = numbering.free[best.0];
    let peak = null_vector[best.0];
    let mode = null_vector
        .iter()
        .enumerate()
        .filter(|(_, v)| **v != 0.0)
        .map(|(i, v)| (numbering.free[i].0, numbering.free[i].1, v / peak))
        .collect();
    StaticsError::Mechanism { node, node_label: model.node_label(node), direction, mode }
}

fn solve_case(
    model: &Model,
    numbering: &Numbering,
    elems: &[Element],
    factor: &LdlFactor,
    lc: &LoadCase,
) -> Result<CaseResult, StaticsError> {
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
    let mut imposed_strain: f64 = 0.0;
    for t in &lc.temperature {
        let m = &model.members[t.member];
        fixed[t.member] += temperature_end_actions(m, t.delta_t);
        imposed_strain = imposed_strain.max(m.e * m.a * (m.alpha * t.delta_t).abs());
    }
    // prescribed displacements of restrained freedoms
    let mut prescribed = vec![[0.0f64; 3]; nn];
    for pd in &lc.prescribed {
        prescribed[pd.node][pd.dof.index()] = pd.value;
        let lmin = model
            .members
            .iter()
            .enumerate()
            .filter(|(_, m)| m.start == pd.node || m.end == pd.node)
            .map(|(k, m)| m.e * m.a * pd.value.abs() / model.member_length(k))
            .fold(0.0, f64::max);
        imposed_strain = imposed_strain.max(lmin);
    }
    // Solve K u = P - sum(T^T f_fixed) - K_fr u_r, then refine: the residual is
    // recomputed element by element and the correction solved with the same factors
    // (iterative refinement, Golub & Van Loan, Matrix Computations, sec. 3.5.3). It keeps
    // equilibrium near rounding even when EA is many orders above the bending stiffness.
    let mut u_free = vec![0.0; numbering.free.len()];
    for _ in 0..=REFINEMENT_STEPS {
        let mut r = free_residual(model, numbering, elems, &applied, &fixed, &prescribed, &u_free);
        factor.solve_in_place(&mut r);
        for (u, d) in u_free.iter_mut().zip(&r) {
            *u += d;
        }
    }
    let rhs = u_free;
    // nodal displacements
    let mut u = vec![[0.0f64; 3]; nn];
    for node in 0..nn {
        for k in 0..3 {
            u[node][k] = match numbering.eqs[node][k] {
                Eq::Free(i) => rhs[i],
                Eq::Restrained => prescribed[node][k],
                Eq::Absent => 0.0,
            };
        }
    }
    // member end actions, element by element
    let mut sum_actions = vec![[0.0f64; 3]; nn];
    let mut members = Vec::with_capacity(nm);
    let mut largest: f64 = 0.0;
    let lchar = characteristic_length(model);
    for (k, el) in elems.iter().enumerate() {
        let m = &model.members[k];
        let ue = Vector6::new(
            u[m.start][0],
            u[m.start][1],
            if m.pinned_at_start() { 0.0 } else { u[m.start][2] },
            u[m.end][0],
            u[m.end][1],
            if m.pinned_at_end() { 0.0 } else { u[m.end][2] },
        );
        let f_local = el.k_local * (el.t * ue) + fixed[k];
        let f_global = el.t.transpose() * f_local;
        for r in 0..3 {
            sum_actions[m.start][r] += f_global[r];
            sum_actions[m.end][r] += f_global[r + 3];
        }
        let start = [f_local[0], f_local[1], f_local[2]];
        let l = el.geometry.length;
        let mut positions: Vec<f64> =
            (0..=STATION_INTERVALS).map(|i| l * i as f64 / STATION_INTERVALS as f64).collect();
        for ll in &local_loads[k] {
            if let LocalLoad::Point { a, .. } = ll {
                positions.push(*a);
            }
        }
        positions.sort_by(|a, b| a.total_cmp(b));
        positions.dedup_by(|a, b| (*a - *b).abs() < 1e-12 * l.max(1.0));
        let stations: Vec<Station> = positions
            .iter()
            .map(|&s| {
                let (n, v, mm) = internal_forces(start, &local_loads[k], s);
                Station { s, forces: SectionForces { n, v, m: mm } }
            })
            .collect();
        let start_forces = SectionForces { n: -f_local[0], v: f_local[1], m: -f_local[2] };
        let end_forces = SectionForces { n: f_local[3], v: -f_local[4], m: f_local[5] };
        largest = largest
            .max(f_local[0].abs())
            .max(f_local[1].abs())
            .max(f_local[3].abs())
            .max(f_local[4].abs())
            .max(f_local[2].abs() / lchar)
            .max(f_local[5].abs() / lchar);
        members.push(MemberForces {
            member: k,
            length: l,
            start: start_forces,
            end: end_forces,
            stations,
            end_actions_global: [
                f_global[0],
                f_global[1],
                f_global[2],
                f_global[3],
                f_global[4],
                f_global[5],
            ],
        });
    }
    // reactions close each restrained freedom; residuals at the free ones
    let mut reactions = Vec::new();
    let mut max_node_residual: f64 = 0.0;
    for s in &model.supports {
        let node = s.node;
        let mut r = [0.0; 3];
        for k in 0..3 {
            if numbering.eqs[node][k] == Eq::Restrained {
                r[k] = sum_actions[node][k] - applied[node][k];
            }
        }
        reactions.push(Reaction { node, fx: r[0], fy: r[1], mz: r[2] });
    }
    for node in 0..nn {
        for k in 0..3 {
            if numbering.eqs[node][k] != Eq::Restrained {
                let res = (applied[node][k] - sum_actions[node][k]).abs();
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
    for r in &reactions {
        let p = &model.nodes[r.node];
        g[0] += r.fx;
        g[1] += r.fy;
        g[2] += r.mz + (p.x - cx) * r.fy - (p.y - cy) * r.fx;
    }
    let mut largest_reaction: f64 = 0.0;
    for r in &reactions {
        largest_reaction = largest_reaction.max(r.fx.abs()).max(r.fy.abs()).max(r.mz.abs() / lchar);
    }
    for (k, loads) in local_loads.iter().enumerate() {
        let el = &elems[k];
        let p = &model.nodes[model.members[k].start];
        for ll in loads {
            let (fx, fy, m0) = load_resultant_global(ll, &el.geometry);
            g[0] += fx;
            g[1] += fy;
            g[2] += m0 + (p.x - cx) * fy - (p.y - cy) * fx;
            largest_load = largest_load.max(fx.hypot(fy));
        }
    }
    let (reference, basis) = if largest_load > 0.0 {
        (
            largest.max(largest_load).max(largest_reaction),
            "largest force present (loads, reactions, member end forces)",
        )
    } else if largest_reaction > VANISHING_REACTION * imposed_strain && largest_reaction > 0.0 {
        (largest_reaction, "largest reaction (no net applied load)")
    } else if imposed_strain > 0.0 {
        (imposed_strain, "E A times the largest imposed strain")
    } else {
        (1.0, "1 kN (the case has no load)")
    };
    let global_max = g[0].abs().max(g[1].abs()).max(g[2].abs() / lchar);
    let relative = max_node_residual.max(global_max) / reference;
    let displacements = (0..nn)
        .map(|node| NodeDisplacement {
            node,
            ux: u[node][0],
            uy: u[node][1],
            rz: if numbering.eqs[node][2] == Eq::Absent { None } else { Some(u[node][2]) },
        })
        .collect();
    Ok(CaseResult {
        name: lc.name.clone(),
        displacements,
        members,
        reactions,
        equilibrium: EquilibriumCheck {
            max_node_residual,
            global_residual: g,
            reference,
            reference_basis: basis.to_string(),
            characteristic_length: lchar,
            relative,
        },
    })
}

/// Out-of-balance force at every free freedom for the free displacements `u_free`:
/// applied load minus the sum of member end actions (element by element).
fn free_residual(
    model: &Model,
    numbering: &Numbering,
    elems: &[Element],
    applied: &[[f64; 3]],
    fixed: &[Vector6<f64>],
    prescribed: &[[f64; 3]],
    u_free: &[f64],
) -> Vec<f64> {
    let mut r: Vec<f64> = numbering.free.iter().map(|(node, dof)| applied[*node][dof.index()]).collect();
    for (k, el) in elems.iter().enumerate() {
        let eqs = member_eqs(model, numbering, k);
        let m = &model.members[k];
        let mut ue = Vector6::zeros();
        for (c, eq) in eqs.iter().enumerate() {
            let node = if c < 3 { m.start } else { m.end };
            ue[c] = match eq {
                Eq::Free(i) => u_free[*i],
                Eq::Restrained => prescribed[node][c % 3],
                Eq::Absent => 0.0,
            };
        }
        let f = el.t.transpose() * (el.k_local * (el.t * ue) + fixed[k]);
        for (c, eq) in eqs.iter().enumerate() {
            if let Eq::Free(i) = eq {
                r[*i] -= f[c];
            }
        }
    }
    r
}

fn centroid(model: &Model) -> (f64, f64) {
    let n = model.nodes.len().max(1) as f64;
    let sx: f64 = model.nodes.iter().map(|p| p.x).sum();
    let sy: f64 = model.nodes.iter().map(|p| p.y).sum();
    (sx / n, sy / n)
}

impl Solution {
    /// The result of the load case called `name`.
    pub fn case(&self, name: &str) -> Option<&CaseResult> {
        self.cases.iter().find(|c| c.name == name)
    }
}

impl CaseResult {
    /// The reaction at `node`, if it is supported.
    pub fn reaction(&self, node: usize) -> Option<&Reaction> {
        self.reactions.iter().find(|r| r.node == node)
    }
}
