//! The form diagram as a plane map: vertices (the model's nodes and a pass-through vertex
//! at each crossing of two members), member pieces as pairs of half-edges, the faces
//! traced by walking around the vertices, the outside face, and the outside sectors of
//! the joints on it (where external forces are drawn).
//!
//! Faces are traced the usual way for a plane graph given by its edges and the
//! anticlockwise order of the edges around each vertex: the half-edge after u->v is
//! v->w with w the neighbour immediately clockwise of u around v, which keeps the face
//! on the left (de Berg et al., Computational Geometry, 3rd ed., sec. 2.2, doubly-connected
//! edge lists). Exactly one face winds clockwise: the outside. Euler's formula
//! V - E + F = 2 confirms that the traced faces are those of a plane drawing.

use super::{embed_error, figure_error, Crossing};
use crate::frame::equilibrium::characteristic_length;
use crate::frame::model::Model;
use crate::geom::Point;
use crate::tolerance::{CROSSING_END, PARALLEL};

/// The plane map of a pin-jointed model's form diagram.
pub(super) struct PlanarMap {
    /// Vertex positions, m: the model's nodes (same indices), then pass-through vertices.
    pub(super) pos: Vec<(f64, f64)>,
    /// Member pieces (start vertex, end vertex, member): half-edge 2 p runs from the
    /// start to the end of piece p, half-edge 2 p + 1 back.
    pub(super) pieces: Vec<(usize, usize, usize)>,
    /// The crossings cut by pass-through vertices.
    pub(super) crossings: Vec<Crossing>,
    /// Each face as its cycle of half-edges (the face lies on their left).
    pub(super) faces: Vec<Vec<usize>>,
    /// The face on the left of each half-edge.
    pub(super) face_of: Vec<usize>,
    /// The outside face (the one that winds clockwise).
    pub(super) outer: usize,
}

impl PlanarMap {
    /// Builds the plane map of `model`'s members (cut at crossings).
    ///
    /// Errors: two members leaving a joint in the same direction, members overlapping
    /// without a proper crossing, or a model in more than one piece.
    pub(super) fn build(model: &Model) -> Result<PlanarMap, crate::error::StaticsError> {
        let mut pos: Vec<(f64, f64)> = model.nodes.iter().map(|n| (n.x, n.y)).collect();
        let (pieces, crossings) = cut_crossings(model, &mut pos);
        let nv = pos.len();
        // half-edges leaving each vertex, anticlockwise by angle
        let mut around: Vec<Vec<(f64, usize)>> = vec![Vec::new(); nv];
        for (p, piece) in pieces.iter().enumerate() {
            let (a, b) = (piece.0, piece.1);
            around[a].push((angle(pos[a], pos[b]), 2 * p));
            around[b].push((angle(pos[b], pos[a]), 2 * p + 1));
        }
        for list in &mut around {
            crate::order::sort_by(list, |x, y| x.0.total_cmp(&y.0));
        }
        for list in &around {
            if list.windows(2).any(|w| w[1].0 - w[0].0 <= PARALLEL) {
                return Err(figure_error(
                    "two members leave a joint in the same direction (they overlap); the form diagram cannot be drawn",
                ));
            }
        }
        let mut map = PlanarMap { pos, pieces, crossings, faces: Vec::new(), face_of: Vec::new(), outer: 0 };
        // next(u->v) = v->w with w immediately clockwise of u around v (face on the left)
        let nh = map.half_edges();
        let mut next = vec![usize::MAX; nh];
        for h in 0..nh {
            let v = map.head(h);
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
        // exactly one face winds clockwise (negative area) per connected structure: the outside
        let outer: Vec<usize> = (0..faces.len()).filter(|&f| map.signed_area(&faces[f]) <= 0.0).collect();
        if outer.len() != 1 {
            return Err(figure_error(
                "the truss must be one connected piece drawn without overlapping members",
            ));
        }
        // Euler's formula for a connected plane graph: V - E + F = 2; fails when members
        // overlap without a proper crossing (the traced faces are then not a plane map)
        if nv as i64 - map.pieces.len() as i64 + faces.len() as i64 != 2 {
            return Err(embed_error());
        }
        map.outer = outer[0];
        map.faces = faces;
        map.face_of = face_of;
        Ok(map)
    }

    /// Number of half-edges (two per member piece).
    pub(super) fn half_edges(&self) -> usize {
        2 * self.pieces.len()
    }

    /// The vertex half-edge `h` runs to.
    pub(super) fn head(&self, h: usize) -> usize {
        if h % 2 == 0 {
            self.pieces[h / 2].1
        } else {
            self.pieces[h / 2].0
        }
    }

    /// The vertex half-edge `h` runs from.
    pub(super) fn tail(&self, h: usize) -> usize {
        if h % 2 == 0 {
            self.pieces[h / 2].0
        } else {
            self.pieces[h / 2].1
        }
    }

    /// Signed area of a cycle of half-edges, m2 (anticlockwise positive; shoelace
    /// formula).
    fn signed_area(&self, cycle: &[usize]) -> f64 {
        cycle
            .iter()
            .map(|&h| {
                let (a, b) = (self.pos[self.tail(h)], self.pos[self.head(h)]);
                a.0 * b.1 - b.0 * a.1
            })
            .sum::<f64>()
            / 2.0
    }

    /// The outside boundary: the outer face's half-edges, walked clockwise around the
    /// structure (outside on the left).
    pub(super) fn boundary(&self) -> &[usize] {
        &self.faces[self.outer]
    }

    /// The outside sector at the joint reached by boundary position `i`: anticlockwise
    /// from the direction to the next boundary joint (`from`) to the direction back to
    /// the previous one (`to`), rad.
    pub(super) fn sector(&self, i: usize) -> (f64, f64) {
        let boundary = self.boundary();
        let h = boundary[i];
        let h_next = boundary[(i + 1) % boundary.len()];
        let v = self.head(h);
        (angle(self.pos[v], self.pos[self.head(h_next)]), angle(self.pos[v], self.pos[self.tail(h)]))
    }

    /// Where an external force (fx, fy) at joint `node` is drawn: the boundary visit of
    /// that joint whose outside sector holds the force's line of action (on the side it
    /// comes from, else on the side it goes to), else the middle of the first visit's
    /// sector; and the direction (rad) of the half-line from the joint it is drawn along.
    /// `None` when the joint is not on the outside boundary.
    pub(super) fn place_external(&self, node: usize, fx: f64, fy: f64) -> Option<(usize, f64)> {
        let boundary = self.boundary();
        let from_side = (-fy).atan2(-fx);
        let to_side = fy.atan2(fx);
        let visits: Vec<usize> = (0..boundary.len()).filter(|&i| self.head(boundary[i]) == node).collect();
        let &first = visits.first()?;
        for dir in [from_side, to_side] {
            for &i in &visits {
                let (a, b) = self.sector(i);
                if strictly_inside(a, b, dir) {
                    return Some((i, dir));
                }
            }
        }
        let (a, b) = self.sector(first);
        Some((first, a + 0.5 * sector_width(a, b)))
    }

    /// Mean of the vertices of face `f`, m.
    pub(super) fn centroid(&self, f: usize) -> (f64, f64) {
        let c = &self.faces[f];
        let n = c.len().max(1) as f64;
        let sx: f64 = c.iter().map(|&h| self.pos[self.tail(h)].0).sum();
        let sy: f64 = c.iter().map(|&h| self.pos[self.tail(h)].1).sum();
        (sx / n, sy / n)
    }
}

/// Direction from `from` to `to`, rad in (-pi, pi].
fn angle(from: (f64, f64), to: (f64, f64)) -> f64 {
    (to.1 - from.1).atan2(to.0 - from.0)
}

/// Anticlockwise width of the sector from `from` to `to`, in (0, 2 pi] (a joint with one
/// member: the whole turn).
fn sector_width(from: f64, to: f64) -> f64 {
    let tau = std::f64::consts::TAU;
    let width = (to - from).rem_euclid(tau);
    if width == 0.0 {
        tau
    } else {
        width
    }
}

/// True when direction `a` lies strictly inside the anticlockwise sector from `from` to
/// `to` (by more than a millionth of its width).
fn strictly_inside(from: f64, to: f64, a: f64) -> bool {
    let width = sector_width(from, to);
    let t = (a - from).rem_euclid(std::f64::consts::TAU);
    let eps = 1e-6 * width;
    t > eps && t < width - eps
}

/// Position of direction `a` within the anticlockwise sector from `from` to `to`, as an
/// angle in (0, width); a direction outside the sector is clamped to its nearer edge.
pub(super) fn sector_param(from: f64, to: f64, a: f64) -> f64 {
    let tau = std::f64::consts::TAU;
    let width = sector_width(from, to);
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

/// Member pieces (start vertex, end vertex, member) with every proper crossing of two
/// members cut by a new pass-through vertex appended to `pos`. Three or more members
/// crossing at one point share one pass-through vertex.
fn cut_crossings(model: &Model, pos: &mut Vec<(f64, f64)>) -> (Vec<(usize, usize, usize)>, Vec<Crossing>) {
    let nm = model.members.len();
    let extent = characteristic_length(model);
    let mut cuts: Vec<Vec<(f64, usize)>> = vec![Vec::new(); nm];
    let mut crossings = Vec::new();
    let first_new = pos.len();
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
            if den.abs() < PARALLEL * (r.0.hypot(r.1) * s.0.hypot(s.1)) {
                continue;
            }
            let t = ((q.0 - p.0) * s.1 - (q.1 - p.1) * s.0) / den;
            let u = ((q.0 - p.0) * r.1 - (q.1 - p.1) * r.0) / den;
            if t > CROSSING_END && t < 1.0 - CROSSING_END && u > CROSSING_END && u < 1.0 - CROSSING_END {
                let at = (p.0 + t * r.0, p.1 + t * r.1);
                // reuse a pass-through vertex already at this point
                let near = (first_new..pos.len())
                    .find(|&v| (pos[v].0 - at.0).hypot(pos[v].1 - at.1) <= CROSSING_END * extent);
                let v = near.unwrap_or_else(|| {
                    pos.push(at);
                    pos.len() - 1
                });
                if !cuts[a].iter().any(|c| c.1 == v) {
                    cuts[a].push((t, v));
                }
                if !cuts[b].iter().any(|c| c.1 == v) {
                    cuts[b].push((u, v));
                }
                crossings.push(Crossing { members: (a, b), at: Point::from(at) });
            }
        }
    }
    let mut pieces = Vec::new();
    for (m, mem) in model.members.iter().enumerate() {
        let mut c = cuts[m].clone();
        crate::order::sort_by(&mut c, |x, y| x.0.total_cmp(&y.0));
        let mut prev = mem.start;
        for (_, v) in c {
            pieces.push((prev, v, m));
            prev = v;
        }
        pieces.push((prev, mem.end, m));
    }
    (pieces, crossings)
}
