//! The reciprocal figure (force diagram) of a pin-jointed plane truss, with spaces
//! labelled in Bow's notation.
//!
//! Method (Maxwell 1864; Cremona; Bow's notation as in Allen & Zalewski, Form and Forces,
//! ch. 3-4): every member and every external force separates two spaces of the form
//! diagram; each space becomes one point of the force diagram. Walking the planar form
//! diagram node by node, crossing a member adds its force vector, so every node's polygon
//! closes. Here the points are found by a breadth-first walk over the spaces, and every
//! member and external force is then checked against the points (the closure error).
//!
//! Orientation: for a member from node u to node v, the space on the left of u->v (its
//! anticlockwise side) and the space on its right satisfy
//! `point(left) - point(right) = N * unit(u->v)`, N tension positive: the segment taken
//! in the member's own orientation is its force on the start node. The same holds for an
//! external force F at node u drawn as a ray from u: `point(left) - point(right) = F`.
//!
//! Crossing members (X-bracing) make the form diagram non-planar. They are handled with a
//! pass-through node at each crossing: both members are cut there and each half carries
//! the member's whole force; the figure is flagged `pass_through`.

use crate::error::StaticsError;
use crate::model::Model;
use crate::solver::CaseResult;
use serde::{Deserialize, Serialize};
use std::collections::VecDeque;

/// Relative size below which a member force counts as zero (its segment is a point).
pub const ZERO_FORCE: f64 = 1e-9;

/// A point of the force diagram, kN along x and y.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize, Default)]
pub struct ForcePoint {
    /// Horizontal force component, kN.
    pub x: f64,
    /// Vertical force component, kN.
    pub y: f64,
}

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
    /// Its point in the force diagram, kN.
    pub point: ForcePoint,
    /// Where to write the label on the form diagram, m.
    pub label_at: (f64, f64),
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
    /// An applied load at a node.
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

/// A segment of the force diagram: from the right space's point to the left space's
/// point, equal to the force in the orientation described in the module doc.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Segment {
    /// The member or external force.
    pub of: SegmentOf,
    /// Index of the space on its left (anticlockwise side, from its start node).
    pub left: usize,
    /// Index of the space on its right.
    pub right: usize,
    /// Signed axial force for members (kN, tension positive); magnitude for external forces.
    pub force: f64,
    /// True when the force is zero to `ZERO_FORCE` of the largest: the segment is a point.
    pub zero: bool,
}

/// A crossing of two members where a pass-through node was inserted.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Crossing {
    /// The two crossing members.
    pub members: (usize, usize),
    /// Where they cross, m.
    pub at: (f64, f64),
}

/// The reciprocal figure of one load case.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ForceDiagram {
    /// Load case name.
    pub case: String,
    /// Every space with its label and point.
    pub spaces: Vec<Space>,
    /// One segment per member (in member order) and then per external force.
    pub segments: Vec<Segment>,
    /// Outside spaces in order around the structure: consecutive points are the external
    /// forces head to tail (the load line, closed by the reactions).
    pub load_line: Vec<usize>,
    /// Crossings cut by pass-through nodes (empty for a planar truss).
    pub crossings: Vec<Crossing>,
    /// True when the figure was built with pass-through nodes (not a planar truss).
    pub pass_through: bool,
    /// Largest |segment - force vector| over all members and external forces, kN.
    pub closure_error: f64,
    /// Largest force in the figure, kN.
    pub largest_force: f64,
}

impl ForceDiagram {
    /// The segment's vector `point(left) - point(right)`, kN.
    pub fn vector(&self, segment: &Segment) -> (f64, f64) {
        let (l, r) = (self.spaces[segment.left].point, self.spaces[segment.right].point);
        (l.x - r.x, l.y - r.y)
    }
    /// The segment of member `member`.
    pub fn member_segment(&self, member: usize) -> Option<&Segment> {
        self.segments.iter().find(|s| s.of == SegmentOf::Member { member })
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

/// Builds the force diagram of `case` (solved on `model`) for a pin-jointed truss.
///
/// Every member is treated as a bar carrying its axial force (use it on truss models);
/// loads must be nodal. Errors: a member load (no figure exists for it), an external force
/// at a node not on the outside of the structure, or a form diagram that cannot be
/// embedded (overlapping members).
pub fn force_diagram(model: &Model, case: &CaseResult) -> Result<ForceDiagram, StaticsError> {
    let lc = model.load_cases.iter().find(|l| l.name == case.name);
    if let Some(lc) = lc {
        if !lc.member.is_empty() {
            return Err(StaticsError::invalid(
                format!("load case '{}'", lc.name),
                "has loads along members; a force diagram needs all loads at the joints",
            ));
        }
    }
    // forces per member and externals
    let forces: Vec<f64> = case.members.iter().map(|m| m.end.n).collect();
    let mut externals = Vec::new();
    if let Some(lc) = lc {
        let mut per_node = vec![(0.0, 0.0); model.nodes.len()];
        for l in &lc.nodal {
            per_node[l.node].0 += l.fx;
            per_node[l.node].1 += l.fy;
        }
        for (node, (fx, fy)) in per_node.into_iter().enumerate() {
            if fx != 0.0 || fy != 0.0 {
                externals.push(External { node, fx, fy, of: SegmentOf::Load { node } });
            }
        }
    }
    for r in &case.reactions {
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
    let tiny = ZERO_FORCE * largest.max(f64::MIN_POSITIVE);
    // drop vanishing external forces (rounding of a zero reaction)
    externals.retain(|e| e.fx.hypot(e.fy) > tiny);

    // planar form diagram: nodes (+ pass-through nodes), member pieces
    let mut pos: Vec<(f64, f64)> = model.nodes.iter().map(|n| (n.x, n.y)).collect();
    let (pieces, crossings) = cut_crossings(model, &mut pos);
    let nv = pos.len();
    // half-edges: 2 per piece; h = 2 p is start->end of piece p
    let mut around: Vec<Vec<(f64, usize)>> = vec![Vec::new(); nv];
    for (p, piece) in pieces.iter().enumerate() {
        let (a, b) = (piece.0, piece.1);
        around[a].push((angle(pos[a], pos[b]), 2 * p));
        around[b].push((angle(pos[b], pos[a]), 2 * p + 1));
    }
    for list in &mut around {
        list.sort_by(|x, y| x.0.total_cmp(&y.0));
    }
    let head = |h: usize| if h % 2 == 0 { pieces[h / 2].1 } else { pieces[h / 2].0 };
    let tail = |h: usize| if h % 2 == 0 { pieces[h / 2].0 } else { pieces[h / 2].1 };
    // next(u->v) = v->w with w immediately clockwise of u around v (face on the left)
    let nh = 2 * pieces.len();
    let mut next = vec![usize::MAX; nh];
    for h in 0..nh {
        let v = head(h);
        let twin = h ^ 1;
        let list = &around[v];
        let Some(i) = list.iter().position(|&(_, e)| e == twin) else { continue };
        let j = (i + list.len() - 1) % list.len();
        next[h] = list[j].1;
    }
    // faces
    let mut face_of = vec![usize::MAX; nh];
    let mut faces: Vec<Vec<usize>> = Vec::new();
    for h0 in 0..nh {
        if face_of[h0] != usize::MAX {
            continue;
        }
        let id = faces.len();
        let mut cycle = Vec::new();
        let mut h = h0;
        while face_of[h] == usize::MAX {
            face_of[h] = id;
            cycle.push(h);
            h = next[h];
            if h == usize::MAX {
                return Err(embed_error());
            }
        }
        faces.push(cycle);
    }
    let area = |cycle: &Vec<usize>| -> f64 {
        cycle
            .iter()
            .map(|&h| {
                let (a, b) = (pos[tail(h)], pos[head(h)]);
                a.0 * b.1 - b.0 * a.1
            })
            .sum::<f64>()
            / 2.0
    };
    // exactly one face winds clockwise (negative area) per connected structure: the outside
    let outer: Vec<usize> = (0..faces.len()).filter(|&f| area(&faces[f]) <= 0.0).collect();
    if outer.len() != 1 {
        return Err(StaticsError::invalid(
            "force diagram",
            "the truss must be one connected piece drawn without overlapping members",
        ));
    }
    let outer = outer[0];

    // place external forces in the outside sector of their node, in clockwise order
    let boundary = &faces[outer];
    let start_pos = start_of_boundary(boundary, &pos, &head, &externals);
    let mut per_vertex: Vec<Vec<usize>> = vec![Vec::new(); nv];
    for (k, e) in externals.iter().enumerate() {
        per_vertex[e.node].push(k);
    }
    // outside spaces along the boundary walk
    let mut outside_of_half: Vec<usize> = vec![usize::MAX; nh];
    let mut ext_left = vec![usize::MAX; externals.len()];
    let mut ext_right = vec![usize::MAX; externals.len()];
    let mut space_count = 0usize;
    let mut placed = vec![false; externals.len()];
    let bl = boundary.len();
    for step in 0..bl {
        let h = boundary[(start_pos + step) % bl];
        let h_next = boundary[(start_pos + step + 1) % bl];
        outside_of_half[h] = space_count;
        let v = head(h);
        // sector at v: from ray v->head(h_next) anticlockwise to ray v->tail(h)
        let a_out = angle(pos[v], pos[head(h_next)]);
        let a_in = angle(pos[v], pos[tail(h)]);
        let mut here: Vec<(f64, usize)> = per_vertex[v]
            .iter()
            .filter(|&&k| !placed[k])
            .map(|&k| {
                let e = &externals[k];
                // drawn on the side the force comes from: ray direction -F
                let pref = (-e.fy).atan2(-e.fx);
                (sector_param(a_out, a_in, pref), k)
            })
            .collect();
        // clockwise from the incoming side: decreasing anticlockwise parameter
        here.sort_by(|x, y| y.0.total_cmp(&x.0));
        for (_, k) in here {
            placed[k] = true;
            ext_left[k] = space_count;
            space_count += 1;
            ext_right[k] = space_count;
        }
    }
    if placed.iter().any(|p| !p) {
        return Err(StaticsError::invalid(
            "force diagram",
            "an external force acts at a joint inside the structure; Bow's notation needs every load and reaction on the outside",
        ));
    }
    // the walk's last space is the first one (the boundary is a cycle)
    let n_outside = space_count.max(1);
    let wrap = |s: usize| if s == space_count { 0 } else { s };
    for s in outside_of_half.iter_mut().filter(|s| **s != usize::MAX) {
        *s = wrap(*s);
    }
    for s in ext_right.iter_mut() {
        *s = wrap(*s);
    }
    // spaces: outside 0..n_outside, then inside faces
    let inside_faces: Vec<usize> = (0..faces.len()).filter(|&f| f != outer).collect();
    let mut space_of_face = vec![usize::MAX; faces.len()];
    for (i, &f) in inside_faces.iter().enumerate() {
        space_of_face[f] = n_outside + i;
    }
    let space_of_half = |h: usize| -> usize {
        if face_of[h] == outer {
            outside_of_half[h]
        } else {
            space_of_face[face_of[h]]
        }
    };
    let total = n_outside + inside_faces.len();
    // constraints: point(left) - point(right) = vector
    let mut links: Vec<Vec<(usize, f64, f64)>> = vec![Vec::new(); total];
    let mut add_link = |left: usize, right: usize, fx: f64, fy: f64| {
        links[right].push((left, fx, fy));
        links[left].push((right, -fx, -fy));
    };
    let mut checks: Vec<(usize, usize, f64, f64)> = Vec::new();
    for (p, piece) in pieces.iter().enumerate() {
        let m = piece.2;
        let (a, b) = (pos[piece.0], pos[piece.1]);
        let l = (b.0 - a.0).hypot(b.1 - a.1);
        let (fx, fy) = (forces[m] * (b.0 - a.0) / l, forces[m] * (b.1 - a.1) / l);
        let (left, right) = (space_of_half(2 * p), space_of_half(2 * p + 1));
        add_link(left, right, fx, fy);
        checks.push((left, right, fx, fy));
    }
    for (k, e) in externals.iter().enumerate() {
        add_link(ext_left[k], ext_right[k], e.fx, e.fy);
        checks.push((ext_left[k], ext_right[k], e.fx, e.fy));
    }
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
    let points: Vec<ForcePoint> = points.into_iter().map(|p| p.unwrap_or_default()).collect();
    let closure_error = checks
        .iter()
        .map(|&(l, r, fx, fy)| (points[l].x - points[r].x - fx).hypot(points[l].y - points[r].y - fy))
        .fold(0.0, f64::max);

    // labels: outside A, B, ... in walk order; inside 1, 2, ... left to right
    let centroid = |f: usize| -> (f64, f64) {
        let c = &faces[f];
        let n = c.len().max(1) as f64;
        let sx: f64 = c.iter().map(|&h| pos[tail(h)].0).sum();
        let sy: f64 = c.iter().map(|&h| pos[tail(h)].1).sum();
        (sx / n, sy / n)
    };
    let mut order: Vec<usize> = (0..inside_faces.len()).collect();
    order.sort_by(|&a, &b| {
        let (ca, cb) = (centroid(inside_faces[a]), centroid(inside_faces[b]));
        ca.0.total_cmp(&cb.0).then(cb.1.total_cmp(&ca.1))
    });
    let mut number_of = vec![0usize; inside_faces.len()];
    for (rank, &i) in order.iter().enumerate() {
        number_of[i] = rank + 1;
    }
    let mut spaces = Vec::with_capacity(total);
    let extent = crate::solver::characteristic_length(model);
    for s in 0..n_outside {
        // label between the two external forces bounding it, pushed outwards
        let bounding: Vec<usize> =
            (0..externals.len()).filter(|&k| ext_left[k] == s || ext_right[k] == s).collect();
        let label_at = if bounding.is_empty() {
            (pos[0].0, pos[0].1 + 0.1 * extent)
        } else {
            let n = bounding.len() as f64;
            let (mut x, mut y) = (0.0, 0.0);
            for &k in &bounding {
                let e = &externals[k];
                let f = e.fx.hypot(e.fy).max(f64::MIN_POSITIVE);
                x += pos[e.node].0 - 0.08 * extent * e.fx / f;
                y += pos[e.node].1 - 0.08 * extent * e.fy / f;
            }
            (x / n, y / n)
        };
        spaces.push(Space { label: letters(s), kind: SpaceKind::Outside, point: points[s], label_at });
    }
    for (i, &f) in inside_faces.iter().enumerate() {
        spaces.push(Space {
            label: number_of[i].to_string(),
            kind: SpaceKind::Inside,
            point: points[n_outside + i],
            label_at: centroid(f),
        });
    }
    // one segment per member (its first piece) and per external force
    let mut segments = Vec::new();
    for m in 0..model.members.len() {
        let p = pieces.iter().position(|piece| piece.2 == m).unwrap_or(0);
        segments.push(Segment {
            of: SegmentOf::Member { member: m },
            left: space_of_half(2 * p),
            right: space_of_half(2 * p + 1),
            force: forces[m],
            zero: forces[m].abs() <= tiny,
        });
    }
    for (k, e) in externals.iter().enumerate() {
        segments.push(Segment {
            of: e.of,
            left: ext_left[k],
            right: ext_right[k],
            force: e.fx.hypot(e.fy),
            zero: false,
        });
    }
    Ok(ForceDiagram {
        case: case.name.clone(),
        spaces,
        segments,
        load_line: (0..n_outside).collect(),
        pass_through: !crossings.is_empty(),
        crossings,
        closure_error,
        largest_force: largest,
    })
}

fn embed_error() -> StaticsError {
    StaticsError::invalid("force diagram", "the form diagram could not be traced; members may overlap")
}

fn angle(from: (f64, f64), to: (f64, f64)) -> f64 {
    (to.1 - from.1).atan2(to.0 - from.0)
}

/// Position of direction `a` within the anticlockwise sector from `from` to `to`, as an
/// angle in (0, width); a direction outside the sector is clamped to its nearer edge.
fn sector_param(from: f64, to: f64, a: f64) -> f64 {
    let tau = std::f64::consts::TAU;
    let mut width = (to - from).rem_euclid(tau);
    if width == 0.0 {
        width = tau; // a node with one member: the whole turn is outside
    }
    let t = (a - from).rem_euclid(tau);
    let eps = 1e-6 * width;
    if t > eps && t < width - eps {
        t
    } else if t <= eps || t > (width + tau) / 2.0 {
        eps
    } else {
        width - eps
    }
}

/// Where the boundary walk starts: just after the top-left external force's node, so the
/// letters run clockwise from the space to the left of the first load.
fn start_of_boundary(
    boundary: &[usize],
    pos: &[(f64, f64)],
    head: &dyn Fn(usize) -> usize,
    externals: &[External],
) -> usize {
    // the boundary position whose head is the leftmost (then highest) loaded node; the
    // walk starts at the half-edge arriving there, so that node's forces come first
    let mut best: Option<(usize, (f64, f64))> = None;
    for (i, &h) in boundary.iter().enumerate() {
        let v = head(h);
        if !externals.iter().any(|e| e.node == v) {
            continue;
        }
        let p = pos[v];
        let better = match best {
            None => true,
            Some((_, q)) => p.0 < q.0 - 1e-9 || ((p.0 - q.0).abs() <= 1e-9 && p.1 > q.1),
        };
        if better {
            best = Some((i, p));
        }
    }
    best.map(|(i, _)| i).unwrap_or(0)
}

/// Spreadsheet-style letters: A ... Z, AA, AB ...
fn letters(mut i: usize) -> String {
    let mut s = Vec::new();
    loop {
        s.push(b'A' + (i % 26) as u8);
        if i < 26 {
            break;
        }
        i = i / 26 - 1;
    }
    s.reverse();
    String::from_utf8(s).unwrap_or_default()
}

/// Member pieces (start vertex, end vertex, member) with every proper crossing of two
/// members cut by a new pass-through vertex appended to `pos`.
fn cut_crossings(model: &Model, pos: &mut Vec<(f64, f64)>) -> (Vec<(usize, usize, usize)>, Vec<Crossing>) {
    let nm = model.members.len();
    let mut cuts: Vec<Vec<(f64, usize)>> = vec![Vec::new(); nm];
    let mut crossings = Vec::new();
    for a in 0..nm {
        for b in (a + 1)..nm {
            let (ma, mb) = (&model.members[a], &model.members[b]);
            if ma.start == mb.start || ma.start == mb.end || ma.end == mb.start || ma.end == mb.end {
                continue;
            }
            let (p, p2) = (pos[ma.start], pos[ma.end]);
            let (q, q2) = (pos[mb.start], pos[mb.end]);
            let r = (p2.0 - p.0, p2.1 - p.1);
            let s = (q2.0 - q.0, q2.1 - q.1);
            let den = r.0 * s.1 - r.1 * s.0;
            if den.abs() < 1e-12 * (r.0.hypot(r.1) * s.0.hypot(s.1)) {
                continue;
            }
            let t = ((q.0 - p.0) * s.1 - (q.1 - p.1) * s.0) / den;
            let u = ((q.0 - p.0) * r.1 - (q.1 - p.1) * r.0) / den;
            let inside = 1e-9;
            if t > inside && t < 1.0 - inside && u > inside && u < 1.0 - inside {
                let at = (p.0 + t * r.0, p.1 + t * r.1);
                pos.push(at);
                let v = pos.len() - 1;
                cuts[a].push((t, v));
                cuts[b].push((u, v));
                crossings.push(Crossing { members: (a, b), at });
            }
        }
    }
    let mut pieces = Vec::new();
    for (m, mem) in model.members.iter().enumerate() {
        let mut c = cuts[m].clone();
        c.sort_by(|x, y| x.0.total_cmp(&y.0));
        let mut prev = mem.start;
        for (_, v) in c {
            pieces.push((prev, v, m));
            prev = v;
        }
        pieces.push((prev, mem.end, m));
    }
    (pieces, crossings)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{truss, LoadCase, NodalLoad, Support};
    use crate::solver::solve;

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
            let (vx, vy) = fd.vector(seg);
            assert!(
                (vx - n * (b.x - a.x) / l).hypot(vy - n * (b.y - a.y) / l) <= 1e-9 * largest,
                "member {k}"
            );
        }
        assert!(fd.closure_error <= 1e-9 * largest);
        fd
    }

    #[test]
    fn triangle_under_apex_load_has_textbook_forces_and_labels() {
        // Symmetric triangle, apex load P, pin and roller: rafters carry P / (2 sin a)
        // compression, the tie P / (2 tan a) tension (statics of a joint).
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
        let text = include_str!("../../../tests/reference/models/braced_truss.json");
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

    #[test]
    fn letters_run_past_z() {
        assert_eq!(letters(0), "A");
        assert_eq!(letters(25), "Z");
        assert_eq!(letters(26), "AA");
        assert_eq!(letters(27), "AB");
    }
}
