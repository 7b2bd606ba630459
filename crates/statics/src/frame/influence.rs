//! Influence lines of any plane model: a unit load marching along a load path.
//!
//! The load path is a chain of nodes whose horizontal positions increase strictly from
//! its first node to its last. A unit load (1 kN, downward, global y) stands at a
//! horizontal position x on the path and is carried to the structure as the model
//! carries it (Müller-Breslau's influence line computed directly, one load position per
//! right-hand side; Hibbeler, Structural Analysis, ch. 6):
//!
//! - at a path node: a nodal load on that node;
//! - between two path nodes joined by a member (frame or truss): a point load on that
//!   member at the same fraction of its horizontal projection, so a continuous frame
//!   member carries it continuously and a pin-ended bar passes it to its ends as a simple
//!   span (the solver's own rule for loads along truss members);
//! - between two path nodes that no member joins (a gap such as a drop-in span that is
//!   not modelled): the lever rule, as a simply supported stringer between the two nodes
//!   would carry it: 1 - t on the left node and t on the right one, t the fraction of
//!   the horizontal distance.
//!
//! Every position is a load case of one model, solved with one factorisation of the
//! stiffness matrix (`solve` factorises once for all its load cases and solves each
//! right-hand side with that factor).
//!
//! Units: an ordinate is the quantity per unit load, kN per kN for forces and
//! reactions, kNm per kN for moments. Sign conventions are the solver's: axial force N
//! tension positive; bending moment positive when the right-hand fibre (from start to
//! end) is in tension; reactions in global axes (x right, y up, moments anticlockwise),
//! acting on the structure.

use crate::error::{Location, Problem, StaticsError};
use crate::frame::model::{Dof, LoadCase, LoadDirection, MemberLoad, Model, NodalLoad};
use crate::frame::results::Solution;
use crate::frame::solver::solve;

/// The largest number of load positions one call computes (a step far too fine for the
/// path otherwise asks for memory the answer does not need).
pub const MAX_POSITIONS: usize = 20_000;

/// Where the unit load stands along the path.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Stepping {
    /// From the path's first node at this step, m (> 0), and at every path node too.
    Every(f64),
    /// At the path's nodes only (for a bare rib loaded at its nodes).
    NodesOnly,
}

/// One end of a member.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum MemberEnd {
    /// The start node's end.
    Start,
    /// The end node's end.
    End,
}

/// A quantity whose influence line is read.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Quantity {
    /// Axial force of a member at one end, kN per kN, tension positive.
    Axial {
        /// Member index.
        member: usize,
        /// Which end.
        end: MemberEnd,
    },
    /// Bending moment of a member at one end, kNm per kN (solver sign convention).
    Moment {
        /// Member index.
        member: usize,
        /// Which end.
        end: MemberEnd,
    },
    /// Bending moment of a member at mid-length, kNm per kN (solver sign convention):
    /// read at the station there, or between the nearest stations on either side (the
    /// diagram is straight between stations under point loads).
    MidMoment {
        /// Member index.
        member: usize,
    },
    /// A reaction component of a supported node: kN per kN for x and y (positive right,
    /// up), kNm per kN for rz (anticlockwise).
    Reaction {
        /// Node index (it must be supported).
        node: usize,
        /// Which component.
        dof: Dof,
    },
    /// A displacement of a node: m per kN for x and y (positive right, up), rad per kN
    /// for rz (anticlockwise; 0 where no member holds the rotation).
    Displacement {
        /// Node index.
        node: usize,
        /// Which component.
        dof: Dof,
    },
}

/// The solved influence lines of a model: one load case per position.
#[derive(Debug, Clone, PartialEq)]
pub struct InfluenceLines {
    /// Horizontal positions of the unit load, m, increasing.
    pub positions: Vec<f64>,
    /// The model's results, `cases[i]` with the unit load at `positions[i]`.
    pub solution: Solution,
}

impl InfluenceLines {
    /// The ordinates of `quantity`, one per position (units and signs in [`Quantity`]).
    ///
    /// Errors: `Invalid` when the member does not exist or the node is not supported.
    pub fn ordinates(&self, quantity: Quantity) -> Result<Vec<f64>, StaticsError> {
        let refuse = |message: String| {
            StaticsError::Invalid(vec![Problem::new(Location::Part("influence line".into()), message)])
        };
        let mut out = Vec::with_capacity(self.positions.len());
        for case in &self.solution.cases {
            let value = match quantity {
                Quantity::Axial { member, end } | Quantity::Moment { member, end } => {
                    let forces = case
                        .members
                        .get(member)
                        .ok_or_else(|| refuse(format!("member {member} does not exist")))?;
                    let at = match end {
                        MemberEnd::Start => forces.start,
                        MemberEnd::End => forces.end,
                    };
                    if matches!(quantity, Quantity::Axial { .. }) {
                        at.n
                    } else {
                        at.m
                    }
                }
                Quantity::MidMoment { member } => {
                    let forces = case
                        .members
                        .get(member)
                        .ok_or_else(|| refuse(format!("member {member} does not exist")))?;
                    mid_moment(forces)
                }
                Quantity::Reaction { node, dof } => {
                    let r = case.reaction(node).ok_or_else(|| {
                        refuse(format!("node {node} has no support, so it has no reaction"))
                    })?;
                    match dof {
                        Dof::X => r.fx,
                        Dof::Y => r.fy,
                        Dof::Rz => r.mz,
                    }
                }
                Quantity::Displacement { node, dof } => {
                    let d = case
                        .displacements
                        .get(node)
                        .filter(|d| d.node == node)
                        .or_else(|| case.displacements.iter().find(|d| d.node == node))
                        .ok_or_else(|| refuse(format!("node {node} does not exist")))?;
                    match dof {
                        Dof::X => d.ux,
                        Dof::Y => d.uy,
                        Dof::Rz => d.rz.unwrap_or(0.0),
                    }
                }
            };
            out.push(value);
        }
        Ok(out)
    }
}

/// Influence lines of `model` for a unit load (1 kN down) along `path` (node indices,
/// horizontal positions strictly increasing), placed by `stepping`.
///
/// The model's own load cases are ignored. How the load reaches the structure between
/// path nodes and the units and signs of the results: see the module doc. Positions run
/// from the first path node's x to the last one's; with `Every(step)` they are the grid
/// x0 + k step and every path node, the two merged where closer than 1e-9 of the path's
/// length.
///
/// Errors: `Invalid` for a path of fewer than two nodes, a node that does not exist,
/// positions that do not increase strictly, a step that is not a positive finite number
/// or one that gives more than [`MAX_POSITIONS`] positions; and every error of
/// [`solve`] (invalid model, mechanism, numbers out of range).
pub fn influence_lines(
    model: &Model,
    path: &[usize],
    stepping: Stepping,
) -> Result<InfluenceLines, StaticsError> {
    let refuse = |message: String| {
        StaticsError::Invalid(vec![Problem::new(Location::Part("load path".into()), message)])
    };
    if path.len() < 2 {
        return Err(refuse("needs at least two nodes".into()));
    }
    if let Some(&bad) = path.iter().find(|&&n| n >= model.nodes.len()) {
        return Err(refuse(format!("node {bad} does not exist (the model has {} nodes)", model.nodes.len())));
    }
    let xs: Vec<f64> = path.iter().map(|&n| model.nodes[n].x).collect();
    if let Some(w) = path
        .windows(2)
        .find(|w| model.nodes[w[1]].x.partial_cmp(&model.nodes[w[0]].x) != Some(std::cmp::Ordering::Greater))
    {
        return Err(refuse(format!(
            "must run left to right: node {} does not lie to the right of node {}",
            model.node_label(w[1]),
            model.node_label(w[0])
        )));
    }
    let (x0, x1) = (xs[0], xs[xs.len() - 1]);
    let tol = 1e-9 * (x1 - x0);
    let mut positions = xs.clone();
    if let Stepping::Every(step) = stepping {
        if !(step.is_finite() && step > 0.0) {
            return Err(refuse(format!("step {step} m must be a positive number")));
        }
        let count = ((x1 - x0) / step).floor();
        if count + xs.len() as f64 > MAX_POSITIONS as f64 {
            return Err(refuse(format!(
                "a step of {step} m gives more than {MAX_POSITIONS} load positions over {:.3} m; use a larger step",
                x1 - x0
            )));
        }
        positions.extend((0..=count as usize).map(|k| x0 + k as f64 * step).filter(|&x| x <= x1 + tol));
    }
    crate::order::sort_numbers(&mut positions);
    positions.dedup_by(|b, a| (*b - *a).abs() <= tol);

    let mut unit = model.clone();
    unit.load_cases =
        positions.iter().enumerate().map(|(k, &x)| unit_load_case(model, path, &xs, x, tol, k)).collect();
    let solution = solve(&unit)?;
    Ok(InfluenceLines { positions, solution })
}

/// The load case of the unit load at `x` on the path (see the module doc).
pub(crate) fn unit_load_case(
    model: &Model,
    path: &[usize],
    xs: &[f64],
    x: f64,
    tol: f64,
    k: usize,
) -> LoadCase {
    let mut lc = LoadCase { name: format!("unit load {} at x = {x:.3} m", k + 1), ..LoadCase::default() };
    let nodal = |node: usize, share: f64| NodalLoad { node, fx: 0.0, fy: -share, mz: 0.0 };
    if let Some(i) = xs.iter().position(|&xi| (xi - x).abs() <= tol) {
        lc.nodal.push(nodal(path[i], 1.0));
        return lc;
    }
    // the segment holding x: xs[i] < x < xs[i + 1] (x lies within the path and off its nodes)
    let i = xs.windows(2).position(|w| w[0] < x && x < w[1]).unwrap_or(0);
    let (a, b) = (path[i], path[i + 1]);
    let joining =
        model.members.iter().position(|m| (m.start == a && m.end == b) || (m.start == b && m.end == a));
    match joining {
        Some(member) => {
            let m = &model.members[member];
            let (xs_start, xs_end) = (model.nodes[m.start].x, model.nodes[m.end].x);
            let fraction = (x - xs_start) / (xs_end - xs_start);
            // not `clamp`, which panics on a length that is not a number (a node's y not
            // finite: the solve's validation reports it)
            let length = model.member_length(member);
            let a_along = (fraction * length).max(0.0).min(length);
            lc.member.push(MemberLoad::Point {
                member,
                p: -1.0,
                a: a_along,
                direction: LoadDirection::GlobalY,
            });
        }
        None => {
            let t = (x - xs[i]) / (xs[i + 1] - xs[i]);
            lc.nodal.push(nodal(a, 1.0 - t));
            lc.nodal.push(nodal(b, t));
        }
    }
    lc
}

/// The bending moment of a member at mid-length, kNm: the station there, or a straight
/// line between the stations either side (exact between stations under point loads; the
/// stations include mid-length, `recovery::STATION_INTERVALS` being even).
pub fn mid_moment(forces: &crate::frame::results::MemberForces) -> f64 {
    let mid = 0.5 * forces.length;
    let st = &forces.stations;
    match st.iter().position(|s| s.s >= mid) {
        Some(0) | None => st.first().map_or(0.0, |s| s.forces.m),
        Some(i) => {
            let (a, b) = (&st[i - 1], &st[i]);
            if (b.s - mid).abs() <= 1e-12 * forces.length.max(1.0) || b.s <= a.s {
                b.forces.m
            } else {
                a.forces.m + (b.forces.m - a.forces.m) * (mid - a.s) / (b.s - a.s)
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::frame::banded::FACTORISATIONS;
    use crate::frame::model::{frame, Support};

    /// A two-span continuous beam of EI constant, spans 4 m + 6 m, supports at 0, 4, 10 m,
    /// node at every support only; path the three nodes; step 0.5 m.
    fn two_span() -> Model {
        let mut m = Model::default();
        let a = m.add_node("A", 0.0, 0.0);
        let b = m.add_node("B", 4.0, 0.0);
        let c = m.add_node("C", 10.0, 0.0);
        m.add_member(frame("AB", "deck", a, b, 2.0e8, 0.01, 1.0e-3));
        m.add_member(frame("BC", "deck", b, c, 2.0e8, 0.01, 1.0e-3));
        m.supports = vec![Support::pinned(a), Support::roller_along_x(b), Support::roller_along_x(c)];
        m
    }

    /// One factorisation for every position, and the middle reaction of a two-span beam
    /// against the three-moment equation.
    #[test]
    fn one_factorisation_serves_every_position_and_matches_three_moments() {
        let m = two_span();
        FACTORISATIONS.with(|c| c.set(0));
        let lines = influence_lines(&m, &[0, 1, 2], Stepping::Every(0.5)).expect("solves");
        assert_eq!(FACTORISATIONS.with(|c| c.get()), 1);
        assert_eq!(lines.positions.len(), 21); // 0, 0.5, ..., 10 m
        let rb = lines.ordinates(Quantity::Reaction { node: 1, dof: Dof::Y }).expect("supported");
        // Unit load at x in span 1 (a = x, b = L1 - x): the three-moment equation with the
        // ends simply supported gives the moment over B,
        // M_B = -P a b (L1 + a) / (2 L1 (L1 + L2)) (hogging), and R_B = the simple-span
        // shares plus the effect of M_B: R_B = a/L1 - M_B (1/L1 + 1/L2) with M_B < 0
        // (any statics text, e.g. Hibbeler, Structural Analysis, ch. 11; from memory).
        let (l1, l2) = (4.0, 6.0);
        for (k, &x) in lines.positions.iter().enumerate() {
            if x > l1 {
                continue;
            }
            let (a, b) = (x, l1 - x);
            let mb = -a * b * (l1 + a) / (2.0 * l1 * (l1 + l2));
            let expected = a / l1 - mb * (1.0 / l1 + 1.0 / l2);
            assert!((rb[k] - expected).abs() < 1e-9, "x = {x}: {} vs {expected}", rb[k]);
        }
    }

    /// A gap in the path (no member between two path nodes) shares the load by the lever rule.
    #[test]
    fn a_gap_shares_the_load_by_the_lever_rule() {
        let mut m = Model::default();
        let a = m.add_node("A", 0.0, 0.0);
        let b = m.add_node("B", 2.0, 0.0);
        let c = m.add_node("C", 5.0, 0.0);
        let d = m.add_node("D", 7.0, 0.0);
        m.add_member(frame("AB", "deck", a, b, 2.0e8, 0.01, 1.0e-3));
        m.add_member(frame("CD", "deck", c, d, 2.0e8, 0.01, 1.0e-3));
        m.supports = vec![Support::fixed(a), Support::fixed(d)];
        let lines = influence_lines(&m, &[a, b, c, d], Stepping::Every(1.0)).expect("solves");
        let ra = lines.ordinates(Quantity::Reaction { node: a, dof: Dof::Y }).expect("supported");
        // at x = 3 m, one third of the gap B-C: 2/3 on B, carried by the cantilever AB to A
        let k = lines.positions.iter().position(|&x| (x - 3.0).abs() < 1e-12).expect("position 3 m");
        assert!((ra[k] - 2.0 / 3.0).abs() < 1e-9, "{}", ra[k]);
    }

    /// Bad paths and steps are refused with a reason.
    #[test]
    fn bad_paths_are_refused() {
        let m = two_span();
        assert!(influence_lines(&m, &[0], Stepping::NodesOnly).is_err());
        assert!(influence_lines(&m, &[0, 7], Stepping::NodesOnly).is_err());
        let err = influence_lines(&m, &[1, 0], Stepping::NodesOnly).expect_err("runs right to left");
        assert!(err.to_string().contains("left to right"), "{err}");
        assert!(influence_lines(&m, &[0, 1, 2], Stepping::Every(0.0)).is_err());
        assert!(influence_lines(&m, &[0, 1, 2], Stepping::Every(1e-6)).is_err());
        let lines = influence_lines(&m, &[0, 1, 2], Stepping::NodesOnly).expect("solves");
        assert!(lines.ordinates(Quantity::Reaction { node: 9, dof: Dof::Y }).is_err());
        assert!(lines.ordinates(Quantity::Axial { member: 9, end: MemberEnd::Start }).is_err());
    }
}
