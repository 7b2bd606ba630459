//! The results of a solve: displacements, member forces with stations along each member,
//! reactions and the equilibrium check, per load case.
//!
//! Sign conventions: axial force N tension positive; bending moment M positive when it
//! puts the right-hand fibre of the member (looking from its start node to its end node)
//! in tension, sagging for members drawn left to right; shear V = dM/ds. Reactions and
//! displacements in global axes (x right, y up, anticlockwise positive).

use serde::{Deserialize, Serialize};

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
