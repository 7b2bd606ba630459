//! In-plane linear buckling and natural frequencies of a plane frame model.
//!
//! Both work on a refined copy of the model ([`subdivide`]): every member split into
//! `parts` elements, so a member can bow between its ends (a rib between panel points, a
//! post or brace on its own) and its mass spreads along it.
//!
//! **Linear buckling** (McGuire, Gallagher & Ziemian, Matrix Structural Analysis, 2nd
//! ed., ch. 9; Bathe, Finite Element Procedures, sec. 6.8 and ch. 11): solve the refined
//! model under a load case, build the geometric stiffness K_G of every element from its
//! axial force (`element::local_geometric_stiffness`), and find the lowest positive load
//! factors alpha_cr with (K + alpha K_G) phi = 0. Everything the case applies (loads,
//! temperature changes, imposed displacements) is multiplied by alpha together; the
//! axial forces are those of the linear solution (no change of geometry before
//! buckling), the loads keep their direction (vertical loads stay vertical) and act
//! where the model puts them (member loads through the fixed-end actions at the
//! element nodes). The eigenproblem is solved as (-K_G) phi = mu K phi with mu = 1 /
//! alpha, K positive definite, keeping the positive mu (`eigen`).
//!
//! **Natural frequencies** (Clough & Penzien, Dynamics of Structures, ch. 11; Chopra,
//! Dynamics of Structures, ch. 10): lumped masses from a load case's gravity loads
//! (weight in kN over g = 9.81 m/s2, tonnes): each nodal load's downward component at
//! its node, a uniform member load half to each end of its element, a point load to
//! the element's ends by the lever rule; the same mass in both translations of a node,
//! no rotational inertia. Then K phi = omega^2 M phi as M phi = mu K phi with
//! mu = 1 / omega^2.
//!
//! One factorisation of K serves every load case ([`Stability`]): each case costs a
//! static solve, the assembly of its K_G (or masses) and the iteration.
//!
//! Mode shapes are the displacements of the nodes, scaled so the largest translation of
//! any node of the refined model is 1 (a mode that only rotates nodes: the largest
//! rotation is 1 rad), with the sign that makes the largest component positive (the
//! first in node order among those equal to it up to rounding).
//!
//! Results are for concept design: the linear buckling load overestimates the strength
//! of a real, imperfect structure; local codes and a licensed engineer govern.

use crate::error::{Iteration, Location, StaticsError};
use crate::frame::assembly::{assemble, assemble_matrices, case_loads, elements, Element};
use crate::frame::banded::{BandMatrix, LdlFactor};
use crate::frame::eigen::{dense, subspace_iteration, Modes, Operand, Spectrum};
use crate::frame::element::{
    is_axial_only, load_resultant_global, local_geometric_stiffness, resolve_load, LocalLoad,
};
use crate::frame::model::{Dof, LoadCase, Member, MemberKind, MemberLoad, Model, TemperatureLoad};
use crate::frame::numbering::{number, Numbering};
use crate::frame::recovery::{displacement_results, node_displacements};
use crate::frame::results::NodeDisplacement;
use crate::frame::solver::{check_assembled_range, mechanism_error, refined_solve, validate};
use crate::tolerance::COMPRESSED_MEMBER;
use nalgebra::{DMatrix, Matrix6, Vector6};
use serde::{Deserialize, Serialize};

pub use crate::frame::eigen::{MAX_DENSE_FREEDOMS, MAX_SUBSPACE_ITERATIONS};

/// Standard gravity, m/s2: the weight of a load case over it is the mass, t (kN s2/m).
pub const GRAVITY: f64 = 9.81;

/// Most elements one member may be split into.
pub const MAX_PARTS: usize = 64;

/// Most modes one call may ask for.
pub const MAX_MODES: usize = 50;

/// Which eigensolver finds the modes.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(rename_all = "snake_case")]
pub enum EigenSolver {
    /// Subspace iteration on the banded factors of K (the normal choice).
    #[default]
    Subspace,
    /// Dense matrices and a full symmetric eigen-decomposition: the oracle for tests
    /// and small models (at most `MAX_DENSE_FREEDOMS` free freedoms).
    Dense,
}

/// How the refined model is made and solved.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub struct StabilitySettings {
    /// Elements each member is split into (1 to `MAX_PARTS`; 1 keeps the model as it is).
    pub parts: usize,
    /// The eigensolver.
    pub solver: EigenSolver,
}

impl Default for StabilitySettings {
    /// Four parts per member (a pin-ended member's Euler load to 0.05 %, a cantilever's
    /// to 0.003 %, a fixed-pinned one's to 0.2 %: measured in
    /// `tests/stability_closed_forms.rs`) and the subspace solver.
    fn default() -> Self {
        StabilitySettings { parts: 4, solver: EigenSolver::Subspace }
    }
}

/// A refined copy of a model and the map between the two.
///
/// Nodes of the original model keep their indices (`nodes[i] == i`); the new nodes
/// inside members follow, member by member, named `<member>.<j>` (j = 1 from the
/// member's start). Elements are named `<member>.<j>` (j = 1 from the start) and keep
/// the member's group, section and thermal coefficient.
#[derive(Debug, Clone, PartialEq)]
pub struct Refined {
    /// The refined model, its load cases mapped from the original ones.
    pub model: Model,
    /// Per original node, its index in the refined model (the same index).
    pub nodes: Vec<usize>,
    /// Per original member, its elements in the refined model, from its start to its end.
    pub members: Vec<Vec<usize>>,
    /// Per original member, the new nodes inside it, from its start to its end.
    pub interior_nodes: Vec<Vec<usize>>,
    /// Per element of the refined model, the original member it is part of.
    pub origin: Vec<usize>,
    /// Pin-ended bars with no second moment of area (I = 0): kept as one bar each, so
    /// they cannot buckle on their own (only their ends can sway). Original indices.
    pub bars_without_bending: Vec<usize>,
}

impl Refined {
    /// The original member whose interior holds refined node `node`, if it is such a new
    /// node (`None` for an original node or an index past the model).
    pub fn member_of_node(&self, node: usize) -> Option<usize> {
        if node < self.nodes.len() {
            return None;
        }
        self.interior_nodes.iter().position(|inside| inside.contains(&node))
    }

    /// A load case of the original model as the same loads on the refined one: nodal
    /// loads and imposed displacements unchanged; a uniform member load and a
    /// temperature change on every element of the member; a point load on the element
    /// that holds its position, at its distance from that element's start (at a node
    /// between two elements: the start of the later one). A load on a member that does
    /// not exist points past the refined model's members, so validation reports it.
    pub fn map_case(&self, case: &LoadCase) -> LoadCase {
        let missing = |k: usize| self.model.members.len().saturating_add(k);
        let mut member = Vec::with_capacity(case.member.len());
        for ml in &case.member {
            let k = ml.member();
            let Some(parts) = self.members.get(k) else {
                member.push(with_member(ml, missing(k)));
                continue;
            };
            match *ml {
                MemberLoad::Uniform { .. } => member.extend(parts.iter().map(|&e| with_member(ml, e))),
                MemberLoad::Point { p, a, direction, .. } => {
                    let h = self.element_length(parts[0]);
                    let count = parts.len();
                    // a NaN position lands on the first element and stays NaN for validation
                    let j = ((a / h).floor().max(0.0) as usize).min(count - 1);
                    let local = if a.is_finite() { (a - j as f64 * h).clamp(0.0, h) } else { a };
                    member.push(MemberLoad::Point { member: parts[j], p, a: local, direction });
                }
            }
        }
        let mut temperature = Vec::with_capacity(case.temperature.len());
        for t in &case.temperature {
            match self.members.get(t.member) {
                Some(parts) => temperature
                    .extend(parts.iter().map(|&e| TemperatureLoad { member: e, delta_t: t.delta_t })),
                None => temperature.push(TemperatureLoad { member: missing(t.member), delta_t: t.delta_t }),
            }
        }
        LoadCase {
            name: case.name.clone(),
            nodal: case.nodal.clone(),
            member,
            temperature,
            prescribed: case.prescribed.clone(),
        }
    }

    fn element_length(&self, element: usize) -> f64 {
        self.model.member_length(element)
    }
}

fn with_member(load: &MemberLoad, member: usize) -> MemberLoad {
    match *load {
        MemberLoad::Uniform { w, direction, projected, .. } => {
            MemberLoad::Uniform { member, w, direction, projected }
        }
        MemberLoad::Point { p, a, direction, .. } => MemberLoad::Point { member, p, a, direction },
    }
}

fn refuse(what: &str, message: String) -> StaticsError {
    StaticsError::invalid(Location::Part(what.into()), message)
}

/// A refined copy of `model` with every member split into `parts` equal elements
/// ([`Refined`] says how nodes and elements are named and mapped).
///
/// - A frame member becomes `parts` frame elements, rigidly joined inside; its end
///   releases stay at its own ends only (on the first and last element).
/// - A pin-ended bar (a truss member, or a frame member released at both ends) with a
///   second moment of area I > 0 becomes `parts` frame elements with that I, hinged only
///   at the bar's two ends, so it can bow and buckle on its own as a pin-ended column.
/// - A pin-ended bar with I = 0 stays one bar (split, its inner nodes would move
///   sideways freely), listed in `bars_without_bending`: it cannot buckle on its own.
///
/// Supports, nodal loads and imposed displacements stay on the original nodes; member
/// loads and temperature changes move onto the elements (`Refined::map_case`).
/// `parts == 1` gives the model unchanged.
///
/// Errors: `Invalid` when the model is invalid (every problem, as `validate`) or
/// `parts` is 0 or above `MAX_PARTS`.
pub fn subdivide(model: &Model, parts: usize) -> Result<Refined, StaticsError> {
    if parts == 0 || parts > MAX_PARTS {
        return Err(refuse(
            "subdivision",
            format!("{parts} parts per member: choose 1 to {MAX_PARTS} (4 is usually enough)"),
        ));
    }
    validate(model)?;
    let mut refined = Model {
        title: model.title.clone(),
        nodes: model.nodes.clone(),
        members: Vec::with_capacity(model.members.len() * parts),
        supports: model.supports.clone(),
        load_cases: Vec::new(),
    };
    let mut members = Vec::with_capacity(model.members.len());
    let mut interior_nodes = Vec::with_capacity(model.members.len());
    let mut origin = Vec::with_capacity(model.members.len() * parts);
    let mut bars_without_bending = Vec::new();
    for (k, m) in model.members.iter().enumerate() {
        let bends = m.i.is_finite() && m.i > 0.0;
        if parts == 1 || (is_axial_only(m) && !bends) {
            if parts > 1 {
                bars_without_bending.push(k);
            }
            members.push(vec![refined.add_member(m.clone())]);
            interior_nodes.push(Vec::new());
            origin.push(k);
            continue;
        }
        let label = model.member_label(k);
        let (a, b) = (&model.nodes[m.start], &model.nodes[m.end]);
        let (xa, ya, xb, yb) = (a.x, a.y, b.x, b.y);
        let inside: Vec<usize> = (1..parts)
            .map(|j| {
                let t = j as f64 / parts as f64;
                refined.add_node(format!("{label}.{j}"), xa + (xb - xa) * t, ya + (yb - ya) * t)
            })
            .collect();
        let mut chain = Vec::with_capacity(parts + 1);
        chain.push(m.start);
        chain.extend(&inside);
        chain.push(m.end);
        let (hinge_start, hinge_end) = (m.pinned_at_start(), m.pinned_at_end());
        let elements: Vec<usize> = (0..parts)
            .map(|j| {
                let element = Member {
                    name: format!("{label}.{}", j + 1),
                    group: m.group.clone(),
                    kind: MemberKind::Frame,
                    start: chain[j],
                    end: chain[j + 1],
                    e: m.e,
                    a: m.a,
                    i: m.i,
                    alpha: m.alpha,
                    release_start: j == 0 && hinge_start,
                    release_end: j + 1 == parts && hinge_end,
                };
                origin.push(k);
                refined.add_member(element)
            })
            .collect();
        members.push(elements);
        interior_nodes.push(inside);
    }
    let mut out = Refined {
        model: refined,
        nodes: (0..model.nodes.len()).collect(),
        members,
        interior_nodes,
        origin,
        bars_without_bending,
    };
    out.model.load_cases = model.load_cases.iter().map(|lc| out.map_case(lc)).collect();
    Ok(out)
}

/// The shape of a mode: node displacements scaled as the module doc says.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ModeShape {
    /// Displacements of the original model's nodes (m per unit of the largest
    /// translation, rad for rotations; rotation `None` where the node has none).
    pub nodes: Vec<NodeDisplacement>,
    /// Displacements of every node of the refined model (the original ones first), to
    /// draw the bowed members.
    pub refined: Vec<NodeDisplacement>,
    /// The refined node with the largest translation (1 there).
    pub peak_node: usize,
    /// The original member inside which `peak_node` lies (`None` at an original node):
    /// a member buckling or swinging on its own between its ends.
    pub peak_member: Option<usize>,
}

/// One buckling mode.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct BucklingMode {
    /// The critical load factor alpha_cr (dimensionless, > 0): the case's actions times
    /// this buckle the structure in this mode (linear theory).
    pub load_factor: f64,
    /// The buckled shape.
    pub shape: ModeShape,
}

/// The buckling modes of one load case.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CaseBuckling {
    /// The load case's name.
    pub case: String,
    /// The lowest modes found, by increasing load factor (at most as many as asked;
    /// fewer when the structure has fewer).
    pub modes: Vec<BucklingMode>,
    /// Axial force of every element of the refined model under the case (mean of its two
    /// ends), kN, tension positive: the forces the geometric stiffness was built from.
    pub axial_forces: Vec<f64>,
    /// Iterations the subspace iteration took (0 for the dense solver).
    pub iterations: usize,
}

impl CaseBuckling {
    /// The lowest critical load factor.
    pub fn critical(&self) -> Option<f64> {
        self.modes.first().map(|m| m.load_factor)
    }
}

/// One mode of free vibration.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct VibrationMode {
    /// Natural frequency, Hz.
    pub frequency: f64,
    /// Angular frequency omega, rad/s.
    pub angular_frequency: f64,
    /// Period, s.
    pub period: f64,
    /// Share of the mode's kinetic energy in vertical motion, sum of m uy^2 over sum of
    /// m (ux^2 + uy^2), 0 to 1 (a "vertical" mode is near 1).
    pub vertical_share: f64,
    /// Share in horizontal motion, 1 - `vertical_share`.
    pub horizontal_share: f64,
    /// The mode shape.
    pub shape: ModeShape,
}

/// The natural frequencies of the model with the masses of one load case.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Vibration {
    /// The load case the masses come from.
    pub case: String,
    /// Mass of every node of the refined model, t (the same in x and y; no rotational
    /// inertia).
    pub masses: Vec<f64>,
    /// Sum of `masses`, t.
    pub total_mass: f64,
    /// The lowest modes found, by increasing frequency.
    pub modes: Vec<VibrationMode>,
    /// Iterations the subspace iteration took (0 for the dense solver).
    pub iterations: usize,
}

/// A model prepared for buckling and vibration: refined, numbered, its stiffness
/// assembled and factorised once for every load case asked about.
pub struct Stability {
    settings: StabilitySettings,
    /// The original model without its load cases, to validate cases against.
    base: Model,
    refined: Refined,
    numbering: Numbering,
    elems: Vec<Element>,
    stiffness: BandMatrix,
    factor: LdlFactor,
}

impl Stability {
    /// Refines `model` (`settings.parts`), assembles and factorises its stiffness.
    ///
    /// Errors: `Invalid` (the model's problems, or bad parts); `OutOfRange` for
    /// stiffness beyond floating point; `Mechanism` when the refined model can move
    /// without resistance (naming a node; `<member>.<j>` is a node inside a member).
    pub fn new(model: &Model, settings: StabilitySettings) -> Result<Stability, StaticsError> {
        let refined = subdivide(model, settings.parts)?;
        let numbering = number(&refined.model);
        let elems = elements(&refined.model);
        let stiffness = assemble(&refined.model, &numbering, &elems)?;
        check_assembled_range(&refined.model, &numbering, &stiffness)?;
        let factor = LdlFactor::new(&stiffness)
            .map_err(|singular| mechanism_error(&refined.model, &numbering, &singular.null_vector))?;
        let base = Model { load_cases: Vec::new(), ..model.clone() };
        Ok(Stability { settings, base, refined, numbering, elems, stiffness, factor })
    }

    /// The refined model and its map to the original.
    pub fn refined(&self) -> &Refined {
        &self.refined
    }

    /// The settings it was prepared with.
    pub fn settings(&self) -> StabilitySettings {
        self.settings
    }

    /// Number of free freedoms of the refined model.
    pub fn free_dofs(&self) -> usize {
        self.numbering.free.len()
    }

    /// Half bandwidth of the refined model's stiffness matrix.
    pub fn bandwidth(&self) -> usize {
        self.stiffness.bandwidth()
    }

    fn check_case(&self, case: &LoadCase, modes: usize) -> Result<(), StaticsError> {
        if modes == 0 || modes > MAX_MODES {
            return Err(refuse("modes", format!("{modes} modes asked for: ask for 1 to {MAX_MODES}")));
        }
        let mut with_case = self.base.clone();
        with_case.load_cases = vec![case.clone()];
        validate(&with_case)
    }

    /// Axial force of every element of the refined model under `case` (a case of the
    /// original model), kN, tension positive: the mean of the element's two ends, from a
    /// linear solve with the prepared factors (and the solver's iterative refinement).
    ///
    /// Errors: `Invalid` when the case does not fit the model.
    pub fn axial_forces(&self, case: &LoadCase) -> Result<Vec<f64>, StaticsError> {
        self.check_case(case, 1)?;
        self.solve_axial(case)
    }

    fn solve_axial(&self, case: &LoadCase) -> Result<Vec<f64>, StaticsError> {
        let model = &self.refined.model;
        let mapped = self.refined.map_case(case);
        let loads = case_loads(model, &self.elems, &mapped);
        let (u_free, _) = refined_solve(model, &self.numbering, &self.elems, &self.factor, &loads)?;
        let u = node_displacements(&self.numbering, &u_free, &loads.prescribed);
        Ok(model
            .members
            .iter()
            .zip(&self.elems)
            .enumerate()
            .map(|(k, (m, el))| {
                let ue = Vector6::new(
                    u[m.start][0],
                    u[m.start][1],
                    u[m.start][2],
                    u[m.end][0],
                    u[m.end][1],
                    u[m.end][2],
                );
                // released rotations have zero stiffness terms, so their value is irrelevant
                let f = el.k_local * el.geometry.to_local_vector(&ue) + loads.fixed[k];
                (f[3] - f[0]) / 2.0
            })
            .collect())
    }

    /// The lowest `modes` buckling modes of `case` (a load case of the original model).
    ///
    /// Errors: `Invalid` when the case does not fit the model or `modes` is 0 or above
    /// `MAX_MODES`; `NoCompression` when the case compresses no member that can move
    /// sideways (no positive load factor exists); `NoConvergence`
    /// (`Iteration::Buckling`) when the iteration does not settle.
    pub fn buckling(&self, case: &LoadCase, modes: usize) -> Result<CaseBuckling, StaticsError> {
        self.buckling_from(case, modes, None).map(|(result, _)| result)
    }

    /// `buckling`, the iteration started from `warm` (the subspace of a similar case);
    /// also returns the subspace this case ended with.
    fn buckling_from(
        &self,
        case: &LoadCase,
        modes: usize,
        warm: Option<&DMatrix<f64>>,
    ) -> Result<(CaseBuckling, DMatrix<f64>), StaticsError> {
        self.check_case(case, modes)?;
        let axial_forces = self.solve_axial(case)?;
        let largest = axial_forces.iter().fold(0.0f64, |m, n| m.max(n.abs()));
        let compressed = largest > 0.0 && axial_forces.iter().any(|&n| n < -COMPRESSED_MEMBER * largest);
        if !compressed {
            return Err(StaticsError::NoCompression { case: case.name.clone() });
        }
        let model = &self.refined.model;
        // A = -K_G in global axes
        let minus_kg: Vec<Matrix6<f64>> = model
            .members
            .iter()
            .zip(&self.elems)
            .zip(&axial_forces)
            .map(|((m, el), &n)| {
                -el.geometry.to_global_matrix(&local_geometric_stiffness(m, &el.geometry, n))
            })
            .collect();
        let a = assemble_matrices(model, &self.numbering, &minus_kg)?;
        let found = self.eigenpairs(&Operand::Band(&a), modes, warm, Iteration::Buckling)?;
        if found.values.is_empty() {
            return Err(StaticsError::NoCompression { case: case.name.clone() });
        }
        let modes = found
            .values
            .iter()
            .zip(&found.vectors)
            .map(|(mu, x)| BucklingMode { load_factor: 1.0 / mu, shape: self.shape(x) })
            .collect();
        let result =
            CaseBuckling { case: case.name.clone(), modes, axial_forces, iterations: found.iterations };
        Ok((result, found.subspace))
    }

    /// [`Stability::buckling`] of each of `cases` with the one factorisation: one result
    /// per case, in order (a case that compresses nothing is its own `NoCompression`).
    /// Each case's iteration starts from the subspace the previous successful case ended
    /// with, so a run of similar cases (a load moved along the deck) converges in fewer
    /// iterations; the results equal those of separate calls to the convergence
    /// tolerance (`tolerance::EIGEN_RESIDUAL`).
    pub fn buckling_cases(
        &self,
        cases: &[LoadCase],
        modes: usize,
    ) -> Vec<Result<CaseBuckling, StaticsError>> {
        self.buckling_cases_widening(cases, modes, modes, |_| true)
    }

    /// [`Stability::buckling_cases`] finding `few` modes of each case while `enough` says
    /// they suffice (the mode sought is among them); a case whose modes do not is
    /// buckled again for `more` modes, started from the subspace of its first try, and
    /// every later case takes `more` at once (neighbouring cases tend to need the same).
    /// Why: the subspace iteration converges at the ratio of the last wanted mode to the
    /// first one it does not hold, so fewer modes cost fewer and smaller iterations. A
    /// case's result is the one `more` modes would give whenever `enough` refused `few`.
    pub fn buckling_cases_widening(
        &self,
        cases: &[LoadCase],
        few: usize,
        more: usize,
        enough: impl Fn(&CaseBuckling) -> bool,
    ) -> Vec<Result<CaseBuckling, StaticsError>> {
        let mut warm: Option<DMatrix<f64>> = None;
        let mut modes = few;
        cases
            .iter()
            .map(|c| {
                let (mut result, mut subspace) = self.buckling_from(c, modes, warm.as_ref())?;
                if modes < more && !enough(&result) {
                    modes = more;
                    let started = (subspace.ncols() > 0).then_some(&subspace).or(warm.as_ref());
                    (result, subspace) = self.buckling_from(c, modes, started)?;
                }
                if subspace.ncols() > 0 {
                    warm = Some(subspace);
                }
                Ok(result)
            })
            .collect()
    }

    /// Lumped mass of every node of the refined model from the gravity loads of `case`
    /// (a case of the original model), t: the weight each node receives (module doc)
    /// over `GRAVITY`. Only downward weight counts: where the loads at a node add up
    /// to a net upward force, its mass is zero. Horizontal components, moments,
    /// temperature changes and imposed displacements give no mass.
    ///
    /// Errors: `Invalid` when the case does not fit the model.
    pub fn lumped_masses(&self, case: &LoadCase) -> Result<Vec<f64>, StaticsError> {
        self.check_case(case, 1)?;
        Ok(self.masses(case))
    }

    fn masses(&self, case: &LoadCase) -> Vec<f64> {
        let model = &self.refined.model;
        let mapped = self.refined.map_case(case);
        let mut downward = vec![0.0f64; model.nodes.len()];
        for l in &mapped.nodal {
            downward[l.node] -= l.fy;
        }
        for ml in &mapped.member {
            let k = ml.member();
            let m = &model.members[k];
            let g = &self.elems[k].geometry;
            let local = resolve_load(ml, g);
            let (_, fy, _) = load_resultant_global(&local, g);
            let at_end = match local {
                LocalLoad::Uniform { .. } => 0.5,
                LocalLoad::Point { a, .. } => (a / g.length).clamp(0.0, 1.0),
            };
            downward[m.start] -= fy * (1.0 - at_end);
            downward[m.end] -= fy * at_end;
        }
        downward.iter().map(|w| w.max(0.0) / GRAVITY).collect()
    }

    /// The lowest `modes` natural frequencies with the masses of `case` (a load case of
    /// the original model; usually the structure's own weight and the permanent loads).
    ///
    /// Errors: `Invalid` when the case does not fit the model or `modes` is 0 or above
    /// `MAX_MODES`; `NoMass` when no node that can move receives weight;
    /// `NoConvergence` (`Iteration::Vibration`) when the iteration does not settle.
    pub fn frequencies(&self, case: &LoadCase, modes: usize) -> Result<Vibration, StaticsError> {
        self.check_case(case, modes)?;
        let masses = self.masses(case);
        let diagonal: Vec<f64> = self
            .numbering
            .free
            .iter()
            .map(|&(node, dof)| if dof == Dof::Rz { 0.0 } else { masses[node] })
            .collect();
        if diagonal.iter().all(|&m| m <= 0.0) {
            return Err(StaticsError::NoMass { case: case.name.clone() });
        }
        let found = self.eigenpairs(&Operand::Diagonal(&diagonal), modes, None, Iteration::Vibration)?;
        if found.values.is_empty() {
            return Err(StaticsError::NoMass { case: case.name.clone() });
        }
        let modes = found
            .values
            .iter()
            .zip(&found.vectors)
            .map(|(mu, x)| {
                let shape = self.shape(x);
                let (mut horizontal, mut vertical) = (0.0, 0.0);
                for d in &shape.refined {
                    horizontal += masses[d.node] * d.ux * d.ux;
                    vertical += masses[d.node] * d.uy * d.uy;
                }
                let vertical_share =
                    if horizontal + vertical > 0.0 { vertical / (horizontal + vertical) } else { 0.0 };
                let omega = 1.0 / mu.sqrt();
                VibrationMode {
                    frequency: omega / (2.0 * std::f64::consts::PI),
                    angular_frequency: omega,
                    period: 2.0 * std::f64::consts::PI / omega,
                    vertical_share,
                    horizontal_share: 1.0 - vertical_share,
                    shape,
                }
            })
            .collect();
        let total_mass = masses.iter().sum();
        Ok(Vibration { case: case.name.clone(), masses, total_mass, modes, iterations: found.iterations })
    }

    fn eigenpairs(
        &self,
        a: &Operand,
        modes: usize,
        warm: Option<&DMatrix<f64>>,
        what: Iteration,
    ) -> Result<Modes, StaticsError> {
        let spectrum = match a {
            Operand::Band(_) => Spectrum::Indefinite,
            Operand::Diagonal(_) => Spectrum::NonNegative,
        };
        match self.settings.solver {
            EigenSolver::Subspace => {
                subspace_iteration(&self.stiffness, &self.factor, a, spectrum, modes, warm, what)
            }
            EigenSolver::Dense => dense(&self.stiffness, a, modes, what),
        }
    }

    /// The mode shape of the free-freedom vector `x` (module doc's scaling and sign).
    fn shape(&self, x: &[f64]) -> ModeShape {
        let nn = self.refined.model.nodes.len();
        let mut u = node_displacements(&self.numbering, x, &vec![[0.0; 3]; nn]);
        let translation = |d: &[f64; 3]| d[0].hypot(d[1]);
        let (mut peak_node, mut peak) = (0, 0.0f64);
        for (node, d) in u.iter().enumerate() {
            if translation(d) > peak {
                (peak_node, peak) = (node, translation(d));
            }
        }
        // a mode without translation is scaled by its largest rotation
        let components: &[usize] = if peak > 0.0 { &[0, 1] } else { &[2] };
        let largest =
            u.iter().flat_map(|d| components.iter().map(move |&c| d[c].abs())).fold(0.0f64, f64::max);
        let size = if peak > 0.0 { peak } else { largest };
        let leading = u
            .iter()
            .flat_map(|d| components.iter().map(move |&c| d[c]))
            .find(|v| v.abs() >= largest * (1.0 - SIGN_TIE))
            .unwrap_or(1.0);
        let scale = if size > 0.0 { leading.signum() / size } else { 1.0 };
        for d in &mut u {
            for v in d.iter_mut() {
                *v *= scale;
            }
        }
        let refined = displacement_results(&self.numbering, &u);
        ModeShape {
            nodes: refined[..self.refined.nodes.len()].to_vec(),
            refined,
            peak_node,
            peak_member: self.refined.member_of_node(peak_node),
        }
    }
}

/// Components within this fraction of the largest tie for the sign of a mode shape (a
/// symmetric structure's antisymmetric mode has two equal extremes up to rounding).
const SIGN_TIE: f64 = 1e-6;

/// The lowest `modes` buckling modes of every load case of `model`, with one
/// factorisation ([`Stability`]): one result per load case, in the model's order.
///
/// Errors (outer): those of [`Stability::new`]; per case, those of
/// [`Stability::buckling`].
pub fn buckling(
    model: &Model,
    settings: StabilitySettings,
    modes: usize,
) -> Result<Vec<Result<CaseBuckling, StaticsError>>, StaticsError> {
    let prepared = Stability::new(model, settings)?;
    Ok(prepared.buckling_cases(&model.load_cases, modes))
}

/// The lowest `modes` natural frequencies of `model` with the masses of its load case
/// called `case` ([`Stability::frequencies`]).
///
/// Errors: `Invalid` when the model has no load case of that name; otherwise those of
/// [`Stability::new`] and [`Stability::frequencies`].
pub fn natural_frequencies(
    model: &Model,
    case: &str,
    settings: StabilitySettings,
    modes: usize,
) -> Result<Vibration, StaticsError> {
    let Some(lc) = model.load_cases.iter().find(|lc| lc.name == case) else {
        return Err(StaticsError::invalid(
            Location::LoadCase(case.to_string()),
            "no load case of this name in the model; choose one of its cases for the masses",
        ));
    };
    Stability::new(model, settings)?.frequencies(lc, modes)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::frame::model::{frame, truss, LoadDirection, NodalLoad, Support};

    const E: f64 = 2.1e8; // kN/m2, steel (EN 1993-1-1 3.2.6)

    /// A bar and a frame member in a line, the bar with and without I.
    fn two_members(bar_i: f64) -> Model {
        let mut m = Model::default();
        m.add_node("A", 0.0, 0.0);
        m.add_node("B", 4.0, 0.0);
        m.add_node("C", 4.0, 3.0);
        let mut f = frame("f", "deck", 0, 1, E, 0.01, 1e-4);
        f.release_start = true;
        m.add_member(f);
        let mut t = truss("t", "brace", 0, 2, E, 0.002);
        t.i = bar_i;
        m.add_member(t);
        m.supports = vec![Support::pinned(0), Support::pinned(1), Support::pinned(2)];
        m.load_cases = vec![LoadCase {
            name: "loads".into(),
            member: vec![
                MemberLoad::Point { member: 0, p: -10.0, a: 3.0, direction: LoadDirection::GlobalY },
                MemberLoad::Uniform {
                    member: 1,
                    w: -2.0,
                    direction: LoadDirection::GlobalY,
                    projected: false,
                },
            ],
            ..Default::default()
        }];
        m
    }

    #[test]
    fn subdivision_splits_members_keeps_end_hinges_and_maps_loads() {
        let r = subdivide(&two_members(2e-6), 4).expect("valid");
        assert_eq!(r.model.members.len(), 8);
        assert_eq!(r.model.nodes.len(), 3 + 6);
        assert_eq!(r.members[0], vec![0, 1, 2, 3]);
        assert_eq!(r.origin, vec![0, 0, 0, 0, 1, 1, 1, 1]);
        assert!(r.bars_without_bending.is_empty());
        // the frame member keeps its start hinge on its first element only
        let hinges: Vec<(bool, bool)> = r.members[0]
            .iter()
            .map(|&e| (r.model.members[e].release_start, r.model.members[e].release_end))
            .collect();
        assert_eq!(hinges, vec![(true, false), (false, false), (false, false), (false, false)]);
        // the bar becomes frame elements hinged at its two ends
        let bar: Vec<&Member> = r.members[1].iter().map(|&e| &r.model.members[e]).collect();
        assert!(bar.iter().all(|e| e.kind == MemberKind::Frame && e.i == 2e-6));
        assert!(bar[0].release_start && !bar[0].release_end && bar[3].release_end && !bar[3].release_start);
        assert_eq!(r.model.nodes[r.interior_nodes[1][1]].name, "t.2");
        assert!((r.model.nodes[r.interior_nodes[1][1]].y - 1.5).abs() < 1e-12);
        assert_eq!(r.member_of_node(r.interior_nodes[1][0]), Some(1));
        assert_eq!(r.member_of_node(2), None);
        // the point load at 3 m of 4 m lands at the start of the fourth element
        let lc = &r.model.load_cases[0];
        assert_eq!(
            lc.member[0],
            MemberLoad::Point { member: 3, p: -10.0, a: 0.0, direction: LoadDirection::GlobalY }
        );
        assert_eq!(lc.member.len(), 1 + 4);
        // without I the bar stays whole and is listed
        let r = subdivide(&two_members(0.0), 4).expect("valid");
        assert_eq!(r.bars_without_bending, vec![1]);
        assert_eq!(r.members[1].len(), 1);
        assert_eq!(r.model.members[r.members[1][0]], two_members(0.0).members[1]);
        // one part is the model itself
        let one = subdivide(&two_members(2e-6), 1).expect("valid");
        assert_eq!(one.model, two_members(2e-6));
        assert!(matches!(subdivide(&two_members(0.0), 0), Err(StaticsError::Invalid(_))));
    }

    /// The refined model carries the same loads: its reactions equal the original's
    /// (the solver's statics; the loads only moved onto elements).
    #[test]
    fn refined_model_has_the_original_reactions() {
        let original = two_members(2e-6);
        let r = subdivide(&original, 3).expect("valid");
        let a = crate::frame::solver::solve(&original).expect("stable");
        let b = crate::frame::solver::solve(&r.model).expect("stable");
        for (x, y) in a.cases[0].reactions.iter().zip(&b.cases[0].reactions) {
            assert_eq!(x.node, y.node);
            assert!((x.fx - y.fx).abs() < 1e-9 && (x.fy - y.fy).abs() < 1e-9, "{x:?} {y:?}");
        }
    }

    /// Masses: a uniform load half to each element end, a point load by the lever rule,
    /// a nodal load at its node; a net upward load gives none.
    #[test]
    fn lumped_masses_follow_the_loads() {
        let mut m = Model::default();
        m.add_node("A", 0.0, 0.0);
        m.add_node("B", 6.0, 0.0);
        m.add_member(frame("b", "", 0, 1, E, 0.01, 1e-4));
        m.supports = vec![Support::pinned(0), Support::roller_along_x(1)];
        let case = LoadCase {
            name: "weight".into(),
            nodal: vec![NodalLoad { node: 1, fx: 5.0, fy: -9.81, mz: 0.0 }],
            member: vec![
                MemberLoad::Uniform {
                    member: 0,
                    w: -3.0,
                    direction: LoadDirection::GlobalY,
                    projected: false,
                },
                MemberLoad::Point { member: 0, p: -6.0, a: 1.0, direction: LoadDirection::GlobalY },
            ],
            ..Default::default()
        };
        let s = Stability::new(&m, StabilitySettings { parts: 2, solver: EigenSolver::Subspace })
            .expect("stable");
        let masses = s.lumped_masses(&case).expect("valid");
        // elements of 3 m: 4.5 kN to each end of each; the point load at 1 m of the first
        // element: 4 kN to A, 2 kN to the middle node
        let g = GRAVITY;
        let expected = [(4.5 + 4.0) / g, (4.5 + 9.81) / g, (9.0 + 2.0) / g];
        for (m, e) in masses.iter().zip(expected) {
            assert!((m - e).abs() < 1e-12, "{masses:?}");
        }
        let up = LoadCase { nodal: vec![NodalLoad { node: 1, fx: 0.0, fy: 10.0, mz: 0.0 }], ..case.clone() };
        assert_eq!(s.lumped_masses(&up).expect("valid")[1], 0.0);
    }
}
