//! The reciprocal figure (force diagram) of a pin-jointed plane truss, with spaces
//! labelled in Bow's notation.
//!
//! Method (Maxwell 1864; Cremona; Bow's notation as in Allen & Zalewski, Form and Forces,
//! ch. 3-4): every member and every external force separates two spaces of the form
//! diagram; each space becomes one point of the force diagram. Walking the planar form
//! diagram node by node, crossing a member adds its force vector, so every node's polygon
//! closes. Here the faces of the planar form diagram are traced from its half-edges, the
//! external forces are drawn as half-lines in the outside sectors of their joints, and the
//! points are placed by a breadth-first walk over the spaces, each step adding one force
//! vector (never by drawing a member's force on its own). Every member and external force
//! is then checked against the points (`closure_error`).
//!
//! Labels (Bow's notation): the outside spaces between consecutive external forces are
//! lettered A, B, C ... clockwise around the structure, starting with the space to the
//! left of the top-left loaded joint's first force (for a deck arch: along the deck left
//! to right, down the right end, along the rib right to left, up the left end); the closed
//! faces inside are numbered 1, 2, 3 ... from left to right (by centroid; ties: higher
//! first). The same model always gives the same labels.
//!
//! Orientation (Bow's convention): reading clockwise about a joint, a member or external
//! force lies between a first space and a second; its segment drawn from the first
//! space's point to the second's is the force it applies to that joint. For a member from
//! node u to node v, clockwise about u one meets first the space on its left (the
//! anticlockwise side of u->v), then the space on its right, so
//! `point(right) - point(left) = N * unit(u->v)` with N tension positive: a segment that
//! points away from the joint pulls it (tension), one that points towards it pushes it
//! (compression). For an external force F at a joint, `point(right) - point(left) = F`;
//! consecutive outside points are therefore the loads head to tail (the load line) and
//! the reactions close it.
//!
//! Crossing members (X-bracing) make the form diagram non-planar. They are handled with a
//! pass-through node at each crossing: both members are cut there and each piece carries
//! the member's whole force, so a crossed member has two parallel, equal segments in the
//! figure; the figure is flagged `pass_through` and says so in its notes.
//!
//! The figure exists only for pin-jointed members with loads at the joints: a member load,
//! a couple, or a member carrying shear or bending is an error, never a wrong picture.
//!
//! Parts: `planar` (the plane map: pass-through nodes, half-edges, faces, the outside
//! sectors of the joints), `labels` (Bow's letters and numbers and where they are
//! written); this module checks the case, places the points and builds the segments.

use crate::error::{counted, Location, StaticsError};
use crate::frame::equilibrium::characteristic_length;
use crate::frame::model::Model;
use crate::frame::solver::{validate, CaseResult};
use crate::geom::{Point, Vector};
use crate::tolerance::ZERO_FORCE;
use labels::{inside_faces, outside_spaces, space_labels};
use planar::PlanarMap;
use serde::{Deserialize, Serialize};
use std::cell::OnceCell;
use std::collections::VecDeque;

mod labels;
mod planar;

/// A point of the force diagram: a position in force space, kN along x and y. The
/// difference of two points is a force (`Vector`, kN).
pub type ForcePoint = Point;

/// Whether a space lies outside the structure (between external forces) or inside it.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum SpaceKind {
    /// Between two consecutive external forces, lettered A, B, C ... around the structure.
    Outside,
    /// A closed face of the truss, numbered 1, 2, 3 ... from left to right.
    Inside,
}

/// One labelled space and its point in the force diagram.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Space {
    /// Bow's label: letters outside, numbers inside.
    pub label: String,
    /// Outside or inside.
    pub kind: SpaceKind,
    /// Its point in the force diagram, kN (space A sits at the origin).
    pub point: ForcePoint,
    /// Where to write the label on the form diagram, m.
    pub label_at: Point,
}

/// What a segment of the force diagram stands for.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum SegmentOf {
    /// A member (index into the model's members).
    Member {
        /// Member index.
        member: usize,
    },
    /// An applied load at a node (all loads of the case at that node, summed).
    Load {
        /// Node index.
        node: usize,
    },
    /// A support reaction at a node.
    Reaction {
        /// Node index.
        node: usize,
    },
}

/// Tension or compression of a member, read from the figure (sense of travel about a
/// joint), not copied from the solver.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum AxialSense {
    /// The segment read clockwise about the start joint points away from it: the member
    /// pulls the joint.
    Tension,
    /// The segment points towards the joint: the member pushes it.
    Compression,
    /// The segment is a point (force below `ZERO_FORCE` of the largest): its direction is
    /// undefined.
    Zero,
}

/// A segment of the force diagram: from the point of its `left` space (`from`) to the
/// point of its `right` space (`to`); `to - from` is the force it applies to its start
/// joint (for a member: N times the unit vector from start to end; for an external force:
/// the force itself).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Segment {
    /// The member or external force.
    pub of: SegmentOf,
    /// For a member cut by pass-through nodes: which piece, 0 from its start node (0 for
    /// every uncut member and external force).
    pub piece: usize,
    /// Bow's name read clockwise about the start joint, e.g. `B-3`.
    pub name: String,
    /// Index into `spaces` of the space on its left (met first clockwise about its start).
    pub left: usize,
    /// Index into `spaces` of the space on its right.
    pub right: usize,
    /// Point of the left space, kN.
    pub from: ForcePoint,
    /// Point of the right space, kN.
    pub to: ForcePoint,
    /// Signed axial force for members (kN, tension positive, from the solver); magnitude
    /// for external forces (kN).
    pub force: f64,
    /// Members: tension or compression read from the figure; `None` for external forces.
    pub sense: Option<AxialSense>,
    /// True when the force is at most `ZERO_FORCE` of the largest: the segment is a point.
    pub zero: bool,
    /// External forces: the unit direction (from the joint) of the half-line along which
    /// the force is drawn on the form diagram, outside the structure. `None` for members.
    pub ray: Option<Vector>,
}

/// A crossing of two members where a pass-through node was inserted.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Crossing {
    /// The two crossing members.
    pub members: (usize, usize),
    /// Where they cross, m.
    pub at: Point,
}

/// The reciprocal figure of one load case on a pin-jointed truss.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ForceDiagram {
    /// Load case name.
    pub case: String,
    /// Title of the model the figure belongs to (it is exact for that model only).
    pub model: String,
    /// Every space with its label and point: outside spaces first (A, B, ... in order
    /// around the structure), then the inside faces 1, 2, 3 ... (left to right).
    pub spaces: Vec<Space>,
    /// One segment per member piece (in member order) and then one per external force
    /// (in load-line order).
    pub segments: Vec<Segment>,
    /// Outside spaces in order around the structure (indices into `spaces`): consecutive
    /// points are the external forces head to tail (the load line, closed by the
    /// reactions back to the first).
    pub load_line: Vec<usize>,
    /// Members whose force is zero (their segments are points).
    pub zero_force_members: Vec<usize>,
    /// Crossings cut by pass-through nodes (empty for a planar truss).
    pub crossings: Vec<Crossing>,
    /// True when the figure was built with pass-through nodes (the truss is not planar).
    pub pass_through: bool,
    /// Largest |segment - force vector| over all members and external forces, kN.
    pub closure_error: f64,
    /// Largest force in the figure, kN.
    pub largest_force: f64,
    /// Notes for the screen (what the figure belongs to, pass-through nodes).
    pub notes: Vec<String>,
}

impl ForceDiagram {
    /// The segment's vector `point(right) - point(left)`, kN: the force it applies to its
    /// start joint (zero when the segment names a space the figure does not have).
    pub fn vector(&self, segment: &Segment) -> Vector {
        match (self.spaces.get(segment.left), self.spaces.get(segment.right)) {
            (Some(l), Some(r)) => r.point - l.point,
            _ => Vector::default(),
        }
    }
    /// The (first) segment of member `member`.
    pub fn member_segment(&self, member: usize) -> Option<&Segment> {
        self.segments.iter().find(|s| s.of == SegmentOf::Member { member })
    }
    /// Every segment of member `member` (two or more when pass-through nodes cut it).
    pub fn member_segments(&self, member: usize) -> impl Iterator<Item = &Segment> {
        self.segments.iter().filter(move |s| s.of == SegmentOf::Member { member })
    }
    /// The external-force segments in load-line order (loads and reactions).
    pub fn external_segments(&self) -> impl Iterator<Item = &Segment> {
        self.segments.iter().filter(|s| !matches!(s.of, SegmentOf::Member { .. }))
    }
}

/// An external force on a node (a load or a reaction), kN.
#[derive(Debug, Clone, Copy)]
struct External {
    node: usize,
    fx: f64,
    fy: f64,
    of: SegmentOf,
}

fn figure_error(message: impl Into<String>) -> StaticsError {
    StaticsError::invalid("force diagram", message)
}

/// Builds the force diagram of `case` (solved on `model`) for a pin-jointed truss.
///
/// Every member is taken as a bar carrying its axial force N (kN, tension positive; the
/// solver's end value). External forces are the nodal loads of the case (summed per node)
/// and the support reactions, drawn outside the structure. Units kN; see the module doc
/// for the labels and the orientation of segments.
///
/// Errors (never a panic or a wrong picture): an invalid model; a case that does not
/// belong to the model; loads along members, couples at joints or members carrying shear
/// or bending (no reciprocal figure exists for them); an external force at a joint inside
/// the structure; a form diagram that is not one connected piece or has overlapping
/// members. Zero-force members become points and are listed in `zero_force_members`.
pub fn force_diagram(model: &Model, case: &CaseResult) -> Result<ForceDiagram, StaticsError> {
    FormMap::new(model).force_diagram(case)
}

/// A pin-jointed truss's form diagram as a plane map (its joints, member pieces and
/// faces), shared by the force diagrams of all its load cases: the map follows from the
/// geometry alone, and building it (every pair of members tried for a crossing) was about
/// a tenth of an edit's analysis when built again for each case.
///
/// The model's checks and the map are made on first use and kept, errors included, so
/// each case reports the same error in the same order as [`force_diagram`] alone.
pub struct FormMap<'m> {
    model: &'m Model,
    checked: OnceCell<Result<(), StaticsError>>,
    map: OnceCell<Result<PlanarMap, StaticsError>>,
}

impl<'m> FormMap<'m> {
    /// The form diagram of `model` (nothing is worked out yet).
    pub fn new(model: &'m Model) -> FormMap<'m> {
        FormMap { model, checked: OnceCell::new(), map: OnceCell::new() }
    }

    /// The force diagram of `case` on this model: [`force_diagram`], with the model's
    /// checks and plane map made once for every case.
    pub fn force_diagram(&self, case: &CaseResult) -> Result<ForceDiagram, StaticsError> {
        self.checked.get_or_init(|| validate(self.model)).clone()?;
        let map = || match self.map.get_or_init(|| PlanarMap::build(self.model)) {
            Ok(map) => Ok(map),
            Err(e) => Err(e.clone()),
        };
        figure_of(self.model, case, map)
    }
}

/// The force diagram of `case` on the checked `model`, its plane map from `map`.
fn figure_of<'a>(
    model: &Model,
    case: &CaseResult,
    map: impl FnOnce() -> Result<&'a PlanarMap, StaticsError>,
) -> Result<ForceDiagram, StaticsError> {
    let nn = model.nodes.len();
    if case.members.len() != model.members.len() || case.reactions.iter().any(|r| r.node >= nn) {
        return Err(figure_error(format!(
            "the results of load case '{}' do not belong to this model (different members or nodes)",
            case.name
        )));
    }
    let lc = model.load_cases.iter().find(|l| l.name == case.name);
    if let Some(lc) = lc {
        if !lc.member.is_empty() {
            return Err(StaticsError::invalid(
                Location::LoadCase(lc.name.clone()),
                "has loads along members; a force diagram needs all loads at the joints",
            ));
        }
    }
    let extent = characteristic_length(model);
    // forces per member and externals
    let forces: Vec<f64> = case.members.iter().map(|m| m.end.n).collect();
    let mut externals = Vec::new();
    let mut couples: f64 = 0.0;
    if let Some(lc) = lc {
        let mut per_node = vec![(0.0, 0.0); nn];
        for l in &lc.nodal {
            per_node[l.node].0 += l.fx;
            per_node[l.node].1 += l.fy;
            couples = couples.max(l.mz.abs() / extent);
        }
        for (node, (fx, fy)) in per_node.into_iter().enumerate() {
            if fx != 0.0 || fy != 0.0 {
                externals.push(External { node, fx, fy, of: SegmentOf::Load { node } });
            }
        }
    }
    for r in &case.reactions {
        couples = couples.max(r.mz.abs() / extent);
        if r.fx != 0.0 || r.fy != 0.0 {
            externals.push(External {
                node: r.node,
                fx: r.fx,
                fy: r.fy,
                of: SegmentOf::Reaction { node: r.node },
            });
        }
    }
    let largest =
        forces.iter().map(|f| f.abs()).chain(externals.iter().map(|e| e.fx.hypot(e.fy))).fold(0.0, f64::max);
    if !largest.is_finite() {
        return Err(figure_error("the forces of the case are not finite numbers"));
    }
    let tiny = ZERO_FORCE * largest.max(f64::MIN_POSITIVE);
    if couples > tiny {
        return Err(figure_error(
            "a couple acts at a joint (applied or a fixed support's reaction); a force diagram exists only for \
             forces through pinned joints",
        ));
    }
    let bending = case
        .members
        .iter()
        .map(|m| m.start.v.abs().max(m.end.v.abs()).max(m.start.m.abs() / extent).max(m.end.m.abs() / extent))
        .fold(0.0, f64::max);
    if bending > tiny {
        return Err(figure_error(
            "a member carries shear or bending; the reciprocal figure exists for pin-jointed members only (use \
             the truss idealisation, or the thrust line for a rib)",
        ));
    }
    // drop vanishing external forces (rounding of a zero reaction)
    externals.retain(|e| e.fx.hypot(e.fy) > tiny);

    // the form diagram as a plane map: nodes (+ pass-through nodes), member pieces, faces
    let map = map()?;
    let pos = &map.pos;
    let pieces = &map.pieces;
    // where each external force is drawn: a visit of its joint on the outside boundary
    let mut visit = vec![usize::MAX; externals.len()];
    let mut ray = vec![(0.0, 0.0); externals.len()];
    for (k, e) in externals.iter().enumerate() {
        let Some((i, dir)) = map.place_external(e.node, e.fx, e.fy) else {
            return Err(figure_error(format!(
                "an external force acts at joint {}, inside the structure; Bow's notation needs every load and \
                 reaction on the outside",
                model.node_label(e.node)
            )));
        };
        visit[k] = i;
        ray[k] = (dir.cos(), dir.sin());
    }
    // spaces: outside 0..n_outside (Bow's letters in walk order), then the inside faces
    let outside = outside_spaces(map, &externals, &visit, &ray);
    let n_outside = outside.count;
    let inside = inside_faces(map);
    let mut space_of_face = vec![usize::MAX; map.faces.len()];
    for (i, &f) in inside.iter().enumerate() {
        space_of_face[f] = n_outside + i;
    }
    let space_of_half = |h: usize| -> usize {
        if map.face_of[h] == map.outer {
            outside.of_half[h]
        } else {
            space_of_face[map.face_of[h]]
        }
    };
    let total = n_outside + inside.len();
    // constraints: point(right) - point(left) = force on the start joint
    let mut links: Vec<Vec<(usize, f64, f64)>> = vec![Vec::new(); total];
    let mut add_link = |left: usize, right: usize, fx: f64, fy: f64| {
        links[left].push((right, fx, fy));
        links[right].push((left, -fx, -fy));
    };
    let mut checks: Vec<(usize, usize, f64, f64)> = Vec::new();
    let piece_vector = |p: usize| -> (f64, f64) {
        let piece = pieces[p];
        let (a, b) = (pos[piece.0], pos[piece.1]);
        let l = (b.0 - a.0).hypot(b.1 - a.1);
        (forces[piece.2] * (b.0 - a.0) / l, forces[piece.2] * (b.1 - a.1) / l)
    };
    for p in 0..pieces.len() {
        let (fx, fy) = piece_vector(p);
        let (left, right) = (space_of_half(2 * p), space_of_half(2 * p + 1));
        add_link(left, right, fx, fy);
        checks.push((left, right, fx, fy));
    }
    for (k, e) in externals.iter().enumerate() {
        add_link(outside.left[k], outside.right[k], e.fx, e.fy);
        checks.push((outside.left[k], outside.right[k], e.fx, e.fy));
    }
    // the walk over the spaces: each new point is a known point plus one force vector
    let mut points = vec![None::<ForcePoint>; total];
    points[0] = Some(ForcePoint::default());
    let mut queue = VecDeque::from([0usize]);
    while let Some(s) = queue.pop_front() {
        let Some(p) = points[s] else { continue };
        for &(t, fx, fy) in &links[s] {
            if points[t].is_none() {
                points[t] = Some(ForcePoint { x: p.x + fx, y: p.y + fy });
                queue.push_back(t);
            }
        }
    }
    if points.iter().any(|p| p.is_none()) {
        return Err(embed_error());
    }
    let points: Vec<ForcePoint> = points.into_iter().map(|p| p.unwrap_or_default()).collect();
    let closure_error = checks
        .iter()
        .map(|&(l, r, fx, fy)| (points[r].x - points[l].x - fx).hypot(points[r].y - points[l].y - fy))
        .fold(0.0, f64::max);

    // labels: outside A, B, ... in walk order; inside 1, 2, ... left to right
    let spaces: Vec<Space> = space_labels(model, map, &externals, &ray, &outside, &inside, extent)
        .into_iter()
        .zip(&points)
        .map(|(l, &point)| Space { label: l.label, kind: l.kind, point, label_at: Point::from(l.at) })
        .collect();
    let name = |l: usize, r: usize| format!("{}-{}", spaces[l].label, spaces[r].label);
    // one segment per member piece, then per external force in load-line order
    let mut segments = Vec::with_capacity(pieces.len() + externals.len());
    let mut piece_no = vec![0usize; model.members.len()];
    for (p, piece) in pieces.iter().enumerate() {
        let m = piece.2;
        let (left, right) = (space_of_half(2 * p), space_of_half(2 * p + 1));
        let (from, to) = (points[left], points[right]);
        let (a, b) = (pos[piece.0], pos[piece.1]);
        // sense from the figure: does the segment point away from the start joint?
        let along = (to.x - from.x) * (b.0 - a.0) + (to.y - from.y) * (b.1 - a.1);
        let length = (to.x - from.x).hypot(to.y - from.y);
        let sense = if length <= tiny {
            AxialSense::Zero
        } else if along > 0.0 {
            AxialSense::Tension
        } else {
            AxialSense::Compression
        };
        segments.push(Segment {
            of: SegmentOf::Member { member: m },
            piece: piece_no[m],
            name: name(left, right),
            left,
            right,
            from,
            to,
            force: forces[m],
            sense: Some(sense),
            zero: forces[m].abs() <= tiny,
            ray: None,
        });
        piece_no[m] += 1;
    }
    for &k in &outside.order {
        let e = &externals[k];
        let (left, right) = (outside.left[k], outside.right[k]);
        segments.push(Segment {
            of: e.of,
            piece: 0,
            name: name(left, right),
            left,
            right,
            from: points[left],
            to: points[right],
            force: e.fx.hypot(e.fy),
            sense: None,
            zero: false,
            ray: Some(Vector::new(ray[k].0, ray[k].1)),
        });
    }
    let zero_force_members: Vec<usize> = (0..forces.len()).filter(|&m| forces[m].abs() <= tiny).collect();
    let mut notes = vec![format!(
        "reciprocal figure of '{}': exact for this pin-jointed model and load case only",
        if model.title.is_empty() { "the model" } else { model.title.as_str() }
    )];
    if !map.crossings.is_empty() {
        notes.push(format!(
            "not planar: {} of members drawn with a pass-through node that carries both forces; each \
             crossed member appears as two equal, parallel segments",
            counted(map.crossings.len(), "crossing", "crossings")
        ));
    }
    if !zero_force_members.is_empty() {
        notes.push(format!(
            "{}: drawn as points (no direction)",
            counted(zero_force_members.len(), "zero-force member", "zero-force members")
        ));
    }
    Ok(ForceDiagram {
        case: case.name.clone(),
        model: model.title.clone(),
        spaces,
        segments,
        load_line: (0..n_outside).collect(),
        zero_force_members,
        pass_through: !map.crossings.is_empty(),
        crossings: map.crossings.clone(),
        closure_error,
        largest_force: largest,
        notes,
    })
}

fn embed_error() -> StaticsError {
    figure_error("the form diagram could not be traced as a plane figure; members may overlap")
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::frame::model::{truss, LoadCase, NodalLoad, Support};
    use crate::frame::solver::solve;

    fn check(model: &Model) -> ForceDiagram {
        let s = solve(model).expect("stable");
        let fd = force_diagram(model, &s.cases[0]).expect("figure");
        // every member: segment == N e (length, direction, sense in one check)
        let largest = fd.largest_force;
        for (k, mem) in model.members.iter().enumerate() {
            let seg = fd.member_segment(k).expect("segment");
            let (a, b) = (&model.nodes[mem.start], &model.nodes[mem.end]);
            let l = (b.x - a.x).hypot(b.y - a.y);
            let n = s.cases[0].members[k].end.n;
            let Vector { x: vx, y: vy } = fd.vector(seg);
            assert!(
                (vx - n * (b.x - a.x) / l).hypot(vy - n * (b.y - a.y) / l) <= 1e-9 * largest,
                "member {k}"
            );
        }
        // every external force: segment == the load (summed per node) or the reaction
        let lc = &model.load_cases[0];
        for seg in fd.external_segments() {
            let expected = match seg.of {
                SegmentOf::Load { node } => lc
                    .nodal
                    .iter()
                    .filter(|l| l.node == node)
                    .fold(Vector::default(), |f, l| f + Vector::new(l.fx, l.fy)),
                SegmentOf::Reaction { node } => {
                    let r = s.cases[0].reaction(node).expect("reaction");
                    Vector::new(r.fx, r.fy)
                }
                SegmentOf::Member { .. } => unreachable!("external segments only"),
            };
            let v = fd.vector(seg);
            assert!((v - expected).length() <= 1e-9 * largest, "{:?}: {v:?} vs {expected:?}", seg.of);
        }
        assert_bow_order_about_every_joint(model, &fd);
        assert!(fd.closure_error <= 1e-9 * largest);
        fd
    }

    /// Bow's notation read about every joint, from the geometry alone: going clockwise
    /// about a joint, each member and external force lies between the space met before it
    /// and the space met after it, so the second space of one is the first space of the
    /// next (Allen & Zalewski, Form and Forces, ch. 3-4). The order is found here from the
    /// directions of the members and of the external forces' half-lines (`ray`), not
    /// from the walk that labelled the spaces; a figure whose forces at a joint were taken
    /// in the wrong order still closes (every segment still equals its force), but fails
    /// this check.
    fn assert_bow_order_about_every_joint(model: &Model, fd: &ForceDiagram) {
        for node in 0..model.nodes.len() {
            let at = &model.nodes[node];
            let dir = |x: f64, y: f64| (y - at.y).atan2(x - at.x);
            // (direction from the joint, space before, space after) clockwise about it
            let mut around: Vec<(f64, usize, usize, String)> = Vec::new();
            for (k, mem) in model.members.iter().enumerate() {
                let pieces: Vec<&Segment> = fd.member_segments(k).collect();
                let (Some(first), Some(last)) = (pieces.first(), pieces.last()) else { continue };
                if mem.start == node {
                    // the piece leaving the start: its left space comes first clockwise
                    let far = &model.nodes[mem.end];
                    around.push((dir(far.x, far.y), first.left, first.right, format!("member {k}")));
                }
                if mem.end == node {
                    // read about the end joint the member runs the other way: right first
                    let far = &model.nodes[mem.start];
                    around.push((dir(far.x, far.y), last.right, last.left, format!("member {k}")));
                }
            }
            for seg in fd.external_segments() {
                let (SegmentOf::Load { node: n } | SegmentOf::Reaction { node: n }) = seg.of else {
                    continue;
                };
                if n == node {
                    let ray = seg.ray.expect("external forces are drawn along a half-line");
                    around.push((ray.y.atan2(ray.x), seg.left, seg.right, format!("{:?}", seg.of)));
                }
            }
            // clockwise: decreasing direction angle
            crate::order::sort_by(&mut around, |p, q| q.0.total_cmp(&p.0));
            for (i, this) in around.iter().enumerate() {
                let next = &around[(i + 1) % around.len()];
                assert_eq!(
                    this.2, next.1,
                    "joint {node}: clockwise, {} ends in space {} but the next, {}, starts in space {}",
                    this.3, fd.spaces[this.2].label, next.3, fd.spaces[next.1].label
                );
            }
        }
    }

    /// A 3-4-5 triangle (L, T, R) on a pin and a roller with 60 kN down at the apex T.
    fn apex_triangle() -> Model {
        let mut m = Model::default();
        m.add_node("L", 0.0, 0.0);
        m.add_node("T", 4.0, 3.0);
        m.add_node("R", 8.0, 0.0);
        m.add_member(truss("", "", 0, 1, 2e8, 0.01));
        m.add_member(truss("", "", 1, 2, 2e8, 0.01));
        m.add_member(truss("", "", 0, 2, 2e8, 0.01));
        m.supports = vec![Support::pinned(0), Support::roller_along_x(2)];
        m.load_cases = vec![LoadCase {
            name: "p".into(),
            nodal: vec![NodalLoad { node: 1, fx: 0.0, fy: -60.0, mz: 0.0 }],
            ..Default::default()
        }];
        m
    }

    #[test]
    fn triangle_under_apex_load_has_textbook_forces_and_labels() {
        // Symmetric triangle, apex load P, pin and roller: rafters carry P / (2 sin a)
        // compression, the tie P / (2 tan a) tension (statics of a joint).
        let m = apex_triangle();
        let fd = check(&m);
        // three external forces: three outside spaces; one inside face
        let outside = fd.spaces.iter().filter(|s| s.kind == SpaceKind::Outside).count();
        assert_eq!(outside, 3);
        assert_eq!(fd.spaces.iter().filter(|s| s.kind == SpaceKind::Inside).count(), 1);
        let seg = fd.member_segment(0).expect("rafter");
        assert!((seg.force + 60.0 / (2.0 * 0.6)).abs() < 1e-9);
        let tie = fd.member_segment(2).expect("tie");
        assert!((tie.force - 60.0 / (2.0 * 0.75)).abs() < 1e-9);
    }

    #[test]
    fn crossed_panel_uses_a_pass_through_node() {
        let mut m = Model::default();
        for (x, y) in [(0.0, 0.0), (4.0, 0.0), (4.0, 3.0), (0.0, 3.0)] {
            m.add_node("", x, y);
        }
        for (a, b) in [(0, 1), (1, 2), (2, 3), (3, 0), (0, 2), (1, 3)] {
            m.add_member(truss("", "", a, b, 2e8, 0.01));
        }
        m.supports = vec![Support::pinned(0), Support::roller_along_x(1)];
        m.load_cases = vec![LoadCase {
            name: "p".into(),
            nodal: vec![NodalLoad { node: 2, fx: 10.0, fy: -30.0, mz: 0.0 }],
            ..Default::default()
        }];
        let fd = check(&m);
        assert!(fd.pass_through);
        assert_eq!(fd.crossings.len(), 1);
    }

    #[test]
    fn braced_arch_truss_of_the_reference_set_closes() {
        let text = include_str!("../../../../../tests/reference/models/braced_truss.json");
        let m: Model = serde_json::from_str(text).expect("model");
        for case in 0..m.load_cases.len() {
            let mut one = m.clone();
            one.load_cases = vec![m.load_cases[case].clone()];
            let fd = check(&one);
            assert!(!fd.pass_through);
            // loads on the deck then the two reactions: one outside space per external force
            let externals = fd.segments.iter().filter(|s| !matches!(s.of, SegmentOf::Member { .. })).count();
            assert_eq!(fd.load_line.len(), externals);
            assert_eq!(fd.spaces[0].label, "A");
        }
    }

    /// Two external forces at one joint (a load at the pinned support L beside its
    /// reaction, and a load at the apex T). Before this test no model had two external
    /// forces at a joint, so taking them in the wrong clockwise order went unnoticed:
    /// every segment still equals its force and the figure still closes, only Bow's
    /// reading about the joint is wrong.
    ///
    /// Check values by hand (statics of the whole truss and of each joint; any statics
    /// text): the 3-4-5 triangle L (0, 0), T (4, 3), R (8, 0), pin at L, roller at R,
    /// 60 kN down at T and (15, -30) kN at L. Moments about L: R_R = 60 x 4 / 8 = 30 kN
    /// up (the load at L has no arm); the pin takes the rest: (-15, 60) kN. The load at L
    /// goes straight into the pin, so the members carry what they carry under the apex
    /// load alone: rafters -50 kN, tie +40 kN. Read clockwise about L from the tie (the
    /// outside sector runs from the rafter at 36.9 degrees anticlockwise round to the tie
    /// at 0): first the reaction, drawn on the side it comes from (below, at -76.0
    /// degrees), then the load (above, at 116.6 degrees). Lettering starts left of the
    /// top-left loaded joint L, so the reaction at L is A-B, the load at L B-C, the apex
    /// load C-D and the roller's reaction D-A, and the points are A (0, 0),
    /// B = A + (-15, 60), C = B + (15, -30) = (0, 30), D = C + (0, -60) = (0, -30).
    #[test]
    fn load_and_reaction_at_one_joint_are_read_clockwise() {
        let mut m = apex_triangle();
        m.load_cases[0].nodal.push(NodalLoad { node: 0, fx: 15.0, fy: -30.0, mz: 0.0 });
        let fd = check(&m);
        let seg = |of: SegmentOf| fd.segments.iter().find(|s| s.of == of).expect("segment");
        let names: Vec<&str> = [
            SegmentOf::Reaction { node: 0 },
            SegmentOf::Load { node: 0 },
            SegmentOf::Load { node: 1 },
            SegmentOf::Reaction { node: 2 },
        ]
        .into_iter()
        .map(|of| seg(of).name.as_str())
        .collect();
        assert_eq!(names, ["A-B", "B-C", "C-D", "D-A"]);
        // the load line in walk order: reaction at L, load at L, apex load, roller
        let order: Vec<SegmentOf> = fd.external_segments().map(|s| s.of).collect();
        assert_eq!(
            order,
            [
                SegmentOf::Reaction { node: 0 },
                SegmentOf::Load { node: 0 },
                SegmentOf::Load { node: 1 },
                SegmentOf::Reaction { node: 2 }
            ]
        );
        let expected = [(0.0, 0.0), (-15.0, 60.0), (0.0, 30.0), (0.0, -30.0)];
        for (k, (x, y)) in expected.into_iter().enumerate() {
            let p = fd.spaces[k].point;
            assert!((p.x - x).abs() < 1e-9 && (p.y - y).abs() < 1e-9, "space {}: {p:?}", fd.spaces[k].label);
        }
        // members as by hand: rafters -50 kN, tie +40 kN
        for (k, n) in [(0, -50.0), (1, -50.0), (2, 40.0)] {
            assert!((fd.member_segment(k).expect("member").force - n).abs() < 1e-9, "member {k}");
        }
    }

    /// Regression: the figure used to be drawn with the anticlockwise reading, the
    /// half-turn of Bow's figure, so the load line read A, B, C ... ran against the loads
    /// (up for gravity loads). Read clockwise, a downward deck load goes down.
    #[test]
    fn load_line_runs_with_the_loads_read_clockwise() {
        let m = apex_triangle();
        let fd = check(&m);
        let load = fd.segments.iter().find(|s| s.of == SegmentOf::Load { node: 1 }).expect("load");
        // the top-left loaded joint is L (its reaction): A lies left of it, so reading
        // clockwise the apex load lies between B (left) and C (right)
        assert_eq!(load.name, "B-C");
        assert!((load.to.y - load.from.y + 60.0).abs() < 1e-12 && (load.to.x - load.from.x).abs() < 1e-12);
        // rafters in compression, tie in tension, read from the figure
        assert_eq!(fd.member_segment(0).and_then(|s| s.sense), Some(AxialSense::Compression));
        assert_eq!(fd.member_segment(2).and_then(|s| s.sense), Some(AxialSense::Tension));
    }

    /// Regression: a joint met twice on the outside boundary (two triangles meeting at one
    /// joint, like a three-hinged crown) had all its forces put at its first visit, even
    /// when their line of action pointed into the other outside sector.
    #[test]
    fn force_at_a_joint_met_twice_is_drawn_in_its_own_sector() {
        let mut m = Model::default();
        for (x, y) in [(0.0, 0.0), (2.0, 3.0), (4.0, 1.0), (6.0, 3.0), (8.0, 0.0)] {
            m.add_node("", x, y);
        }
        for (a, b) in [(0, 1), (1, 2), (0, 2), (2, 3), (3, 4), (2, 4)] {
            m.add_member(truss("", "", a, b, 2e8, 0.01));
        }
        m.supports = vec![Support::pinned(0), Support::pinned(4)];
        for fy in [-20.0, 20.0] {
            m.load_cases = vec![LoadCase {
                name: "p".into(),
                nodal: vec![NodalLoad { node: 2, fx: 0.0, fy, mz: 0.0 }],
                ..Default::default()
            }];
            let fd = check(&m);
            let load = fd.segments.iter().find(|s| s.of == SegmentOf::Load { node: 2 }).expect("load");
            let ray = load.ray.expect("drawn");
            // drawn on the side the force comes from: above for a downward load (in the
            // notch between the triangles), below for an upward one
            assert!(ray.y * fy < 0.0 && ray.x.abs() < 1e-9, "fy {fy}: ray {ray:?}");
        }
    }

    /// One form map serves every load case of a model: each case's figure is the one
    /// `force_diagram` builds for it alone, field for field; a case of another model is
    /// refused the same way by both; and a map that cannot be traced (two members along
    /// one line) gives each case the same error as `force_diagram`. Check values: the
    /// unshared `force_diagram` of each case (itself checked against statics by hand in
    /// the tests above); no outside value.
    #[test]
    fn a_shared_form_map_gives_each_case_the_figure_it_has_alone() {
        let text = include_str!("../../../../../tests/reference/models/braced_truss.json");
        let m: Model = serde_json::from_str(text).expect("model");
        let s = solve(&m).expect("stable");
        assert!(s.cases.len() >= 2, "the reference truss has several cases");
        let form = FormMap::new(&m);
        for case in &s.cases {
            let shared = form.force_diagram(case);
            assert!(shared.is_ok(), "case {}: {shared:?}", case.name);
            assert_eq!(shared, force_diagram(&m, case), "case {}", case.name);
        }
        let mut fewer = m.clone();
        fewer.members.pop();
        let other = FormMap::new(&fewer);
        assert!(other.force_diagram(&s.cases[0]).is_err());
        assert_eq!(other.force_diagram(&s.cases[0]), force_diagram(&fewer, &s.cases[0]));

        // a square with one diagonal drawn twice: solvable, but no plane figure
        let mut twice = Model::default();
        for (x, y) in [(0.0, 0.0), (4.0, 0.0), (4.0, 3.0), (0.0, 3.0)] {
            twice.add_node("", x, y);
        }
        for (a, b) in [(0, 1), (1, 2), (2, 3), (3, 0), (0, 2), (0, 2)] {
            twice.add_member(truss("", "", a, b, 2e8, 0.01));
        }
        twice.supports = vec![Support::pinned(0), Support::pinned(1)];
        twice.load_cases = ["one", "two"]
            .iter()
            .map(|name| LoadCase {
                name: (*name).into(),
                nodal: vec![NodalLoad { node: 2, fx: 10.0, fy: -20.0, mz: 0.0 }],
                ..Default::default()
            })
            .collect();
        let solved = solve(&twice).expect("stable");
        let form = FormMap::new(&twice);
        for case in &solved.cases {
            let alone = force_diagram(&twice, case);
            assert!(alone.is_err(), "overlapping members have no figure");
            assert_eq!(form.force_diagram(case), alone, "case {}", case.name);
        }
    }

    #[test]
    fn mismatched_results_and_member_loads_are_errors_not_panics() {
        let text = include_str!("../../../../../tests/reference/models/braced_truss.json");
        let m: Model = serde_json::from_str(text).expect("model");
        let s = solve(&m).expect("stable");
        let mut fewer = m.clone();
        fewer.members.pop();
        assert!(force_diagram(&fewer, &s.cases[0]).is_err());
        let frame_text = include_str!("../../../../../tests/reference/models/frame_deck_arch.json");
        let f: Model = serde_json::from_str(frame_text).expect("model");
        let fs = solve(&f).expect("stable");
        assert!(force_diagram(&f, &fs.cases[0]).is_err());
    }
}
