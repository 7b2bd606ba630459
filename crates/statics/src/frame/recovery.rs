//! From solved displacements back to forces: node displacements, member end actions
//! element by element (f = k_local T u + fixed-end actions), internal forces at stations
//! along each member, and the support reactions (McGuire, Gallagher & Ziemian, Matrix
//! Structural Analysis, 2nd ed., ch. 2-5). Sign conventions as in `results`.

use crate::frame::assembly::{CaseLoads, Element};
use crate::frame::element::{internal_forces, LocalLoad};
use crate::frame::model::Model;
use crate::frame::numbering::{Equation, Numbering};
use crate::frame::results::{MemberForces, NodeDisplacement, Reaction, SectionForces, Station};
use nalgebra::Vector6;

/// Number of equal intervals at which internal forces are reported along each member.
pub const STATION_INTERVALS: usize = 10;

/// Displacements (ux m, uy m, rz rad) of every node: solved where free, prescribed where
/// restrained, zero for absent rotations.
pub(crate) fn node_displacements(
    numbering: &Numbering,
    u_free: &[f64],
    prescribed: &[[f64; 3]],
) -> Vec<[f64; 3]> {
    let nn = numbering.equations.len();
    let mut u = vec![[0.0f64; 3]; nn];
    for node in 0..nn {
        for k in 0..3 {
            u[node][k] = match numbering.equations[node][k] {
                Equation::Free(i) => u_free[i],
                Equation::Restrained => prescribed[node][k],
                Equation::Absent => 0.0,
            };
        }
    }
    u
}

/// The node displacements as reported (rotation `None` where the node has none).
pub(crate) fn displacement_results(numbering: &Numbering, u: &[[f64; 3]]) -> Vec<NodeDisplacement> {
    (0..u.len())
        .map(|node| NodeDisplacement {
            node,
            ux: u[node][0],
            uy: u[node][1],
            rz: if numbering.equations[node][2] == Equation::Absent { None } else { Some(u[node][2]) },
        })
        .collect()
}

/// Member forces recovered element by element.
pub(crate) struct RecoveredMembers {
    /// Forces of every member, in member order.
    pub(crate) members: Vec<MemberForces>,
    /// Per node, the sum of the end actions of every member there, global (Fx, Fy, M):
    /// what the nodes apply to the members.
    pub(crate) sum_actions: Vec<[f64; 3]>,
    /// Largest end force of any member, kN (moments over `characteristic_length`).
    pub(crate) largest_end_force: f64,
}

/// End actions, end forces and stations of every member for node displacements `u`;
/// `characteristic_length` (m) scales moments into the largest end force.
pub(crate) fn member_forces(
    model: &Model,
    elems: &[Element],
    u: &[[f64; 3]],
    loads: &CaseLoads,
    characteristic_length: f64,
) -> RecoveredMembers {
    let lchar = characteristic_length;
    let mut sum_actions = vec![[0.0f64; 3]; model.nodes.len()];
    let mut members = Vec::with_capacity(model.members.len());
    let mut largest: f64 = 0.0;
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
        let f_local = el.k_local * el.geometry.to_local_vector(&ue) + loads.fixed[k];
        let f_global = el.geometry.to_global_vector(&f_local);
        for r in 0..3 {
            sum_actions[m.start][r] += f_global[r];
            sum_actions[m.end][r] += f_global[r + 3];
        }
        let start = [f_local[0], f_local[1], f_local[2]];
        let l = el.geometry.length;
        let stations = stations(start, &loads.local_loads[k], l);
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
    RecoveredMembers { members, sum_actions, largest_end_force: largest }
}

/// Internal forces at `STATION_INTERVALS` equal intervals of a member of length `l` and
/// at each point load, from its start end actions (local axes) and its loads.
fn stations(start_actions: [f64; 3], loads: &[LocalLoad], l: f64) -> Vec<Station> {
    let at = |s: f64| {
        let (n, v, m) = internal_forces(start_actions, loads, s);
        Station { s, forces: SectionForces { n, v, m } }
    };
    let equal = (0..=STATION_INTERVALS).map(|i| l * i as f64 / STATION_INTERVALS as f64);
    let points = loads.iter().filter_map(|ll| match ll {
        LocalLoad::Point { a, .. } => Some(*a),
        LocalLoad::Uniform { .. } => None,
    });
    if points.clone().next().is_none() {
        // the usual member: the equal intervals alone, already in order
        return equal.map(at).collect();
    }
    let mut positions: Vec<f64> = equal.chain(points).collect();
    crate::order::sort_numbers(&mut positions);
    // a point load at a station is one station (closer than rounding of the length)
    positions.dedup_by(|a, b| (*a - *b).abs() < 1e-12 * l.max(1.0));
    positions.into_iter().map(at).collect()
}

/// The reaction of every support: it closes each restrained freedom (sum of member end
/// actions minus the applied load there), zero in released directions. In the order of
/// the model's supports.
pub(crate) fn reactions(
    model: &Model,
    numbering: &Numbering,
    sum_actions: &[[f64; 3]],
    applied: &[[f64; 3]],
) -> Vec<Reaction> {
    let mut reactions = Vec::with_capacity(model.supports.len());
    for s in &model.supports {
        let node = s.node;
        let mut r = [0.0; 3];
        for k in 0..3 {
            if numbering.equations[node][k] == Equation::Restrained {
                r[k] = sum_actions[node][k] - applied[node][k];
            }
        }
        reactions.push(Reaction { node, fx: r[0], fy: r[1], mz: r[2] });
    }
    reactions
}
