//! Bow's notation for the spaces of the form diagram: which outside space lies between
//! which external forces (lettered A, B, C ... clockwise around the structure from the
//! top-left loaded joint), the inside faces numbered 1, 2, 3 ... from left to right, and
//! where each label is written (Allen & Zalewski, Form and Forces, ch. 3-4).

use super::planar::{sector_param, PlanarMap};
use super::{External, SpaceKind};
use crate::frame::model::Model;

/// Distance of label and arrow positions from their joint, as a fraction of the model's
/// larger extent.
pub(super) const LABEL_OFFSET: f64 = 0.06;

/// The outside spaces: one between each pair of consecutive external forces, walking
/// clockwise around the structure.
pub(super) struct OutsideSpaces {
    /// Per half-edge of the outside boundary, the outside space on its left
    /// (`usize::MAX` for half-edges not on the outside face).
    pub(super) of_half: Vec<usize>,
    /// Per external force, the space met before it clockwise about its joint.
    pub(super) left: Vec<usize>,
    /// Per external force, the space met after it.
    pub(super) right: Vec<usize>,
    /// The external forces in the order the walk meets them (the load line).
    pub(super) order: Vec<usize>,
    /// Number of outside spaces (at least 1).
    pub(super) count: usize,
}

/// Walks the outside boundary clockwise from the visit carrying the forces of the
/// top-left loaded joint (lowest x, then highest y) and opens a new outside space after
/// every external force met; the forces at one visit are met clockwise from the incoming
/// side. `visit` and `ray` say where each external force is drawn (boundary position and
/// unit direction from its joint).
pub(super) fn outside_spaces(
    map: &PlanarMap,
    externals: &[External],
    visit: &[usize],
    ray: &[(f64, f64)],
) -> OutsideSpaces {
    let boundary = map.boundary();
    let bl = boundary.len();
    // the walk starts at the visit carrying the forces of the top-left loaded joint
    let start_pos = (0..externals.len())
        .min_by(|&p, &q| {
            let (a, b) = (map.pos[externals[p].node], map.pos[externals[q].node]);
            a.0.total_cmp(&b.0).then(b.1.total_cmp(&a.1)).then(visit[p].cmp(&visit[q]))
        })
        .map(|k| visit[k])
        .unwrap_or(0);
    let mut of_half: Vec<usize> = vec![usize::MAX; map.half_edges()];
    let mut left = vec![usize::MAX; externals.len()];
    let mut right = vec![usize::MAX; externals.len()];
    let mut order = Vec::with_capacity(externals.len());
    let mut space_count = 0usize;
    for step in 0..bl {
        let i = (start_pos + step) % bl;
        of_half[boundary[i]] = space_count;
        let (a_out, a_in) = map.sector(i);
        let mut here: Vec<(f64, usize)> = (0..externals.len())
            .filter(|&k| visit[k] == i)
            .map(|k| (sector_param(a_out, a_in, ray[k].1.atan2(ray[k].0)), k))
            .collect();
        // clockwise from the incoming side: decreasing anticlockwise parameter
        crate::order::sort_by(&mut here, |x, y| y.0.total_cmp(&x.0).then(x.1.cmp(&y.1)));
        for (_, k) in here {
            left[k] = space_count;
            space_count += 1;
            right[k] = space_count;
            order.push(k);
        }
    }
    // the walk's last space is the first one (the boundary is a cycle)
    let wrap = |s: usize| if s == space_count { 0 } else { s };
    for s in of_half.iter_mut().filter(|s| **s != usize::MAX) {
        *s = wrap(*s);
    }
    for s in right.iter_mut() {
        *s = wrap(*s);
    }
    OutsideSpaces { of_half, left, right, order, count: space_count.max(1) }
}

/// The inside faces (every face but the outside) in the order they are numbered 1, 2,
/// 3 ...: left to right by centroid; ties: higher first, then by face.
pub(super) fn inside_faces(map: &PlanarMap) -> Vec<usize> {
    let mut inside: Vec<usize> = (0..map.faces.len()).filter(|&f| f != map.outer).collect();
    crate::order::sort_by(&mut inside, |&a, &b| {
        let (ca, cb) = (map.centroid(a), map.centroid(b));
        ca.0.total_cmp(&cb.0).then(cb.1.total_cmp(&ca.1)).then(a.cmp(&b))
    });
    inside
}

/// The label of a space and where to write it on the form diagram.
pub(super) struct SpaceLabel {
    /// Bow's label: letters outside, numbers inside.
    pub(super) label: String,
    /// Outside or inside.
    pub(super) kind: SpaceKind,
    /// Where to write it, m.
    pub(super) at: (f64, f64),
}

/// Labels of every space: the outside spaces A, B, C ... (each written between the tips
/// of the external forces bounding it, drawn `LABEL_OFFSET` of `extent` from their
/// joints; above the top-left corner when no force bounds it), then the inside faces 1,
/// 2, 3 ... in `inside` order (each at its centroid).
pub(super) fn space_labels(
    model: &Model,
    map: &PlanarMap,
    externals: &[External],
    ray: &[(f64, f64)],
    outside: &OutsideSpaces,
    inside: &[usize],
    extent: f64,
) -> Vec<SpaceLabel> {
    let tip = |k: usize| {
        let p = map.pos[externals[k].node];
        (p.0 + LABEL_OFFSET * extent * ray[k].0, p.1 + LABEL_OFFSET * extent * ray[k].1)
    };
    let mut labels = Vec::with_capacity(outside.count + inside.len());
    for s in 0..outside.count {
        // label between the tips of the two external forces bounding it
        let bounding: Vec<usize> =
            (0..externals.len()).filter(|&k| outside.left[k] == s || outside.right[k] == s).collect();
        let at = if bounding.is_empty() {
            let (x0, y1) = model
                .nodes
                .iter()
                .fold((f64::INFINITY, f64::NEG_INFINITY), |(x, y), n| (x.min(n.x), y.max(n.y)));
            (x0, y1 + LABEL_OFFSET * extent)
        } else {
            let n = bounding.len() as f64;
            let (x, y) = bounding.iter().map(|&k| tip(k)).fold((0.0, 0.0), |a, t| (a.0 + t.0, a.1 + t.1));
            (x / n, y / n)
        };
        labels.push(SpaceLabel { label: letters(s), kind: SpaceKind::Outside, at });
    }
    for (i, &f) in inside.iter().enumerate() {
        labels.push(SpaceLabel { label: (i + 1).to_string(), kind: SpaceKind::Inside, at: map.centroid(f) });
    }
    labels
}

/// Spreadsheet-style letters: A ... Z, AA, AB ...
pub(super) fn letters(mut i: usize) -> String {
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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn letters_run_past_z() {
        assert_eq!(letters(0), "A");
        assert_eq!(letters(25), "Z");
        assert_eq!(letters(26), "AA");
        assert_eq!(letters(27), "AB");
    }
}
