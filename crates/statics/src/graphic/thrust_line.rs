//! The thrust line (line of pressure) of an arch rib, built from the forces the rib
//! actually receives, and the classic checks on it.
//!
//! Starting from the left springing reaction, the resultant of every force on the rib to
//! the left of a section is carried along (the funicular polygon of the actual loads, with
//! the actual reactions: Heyman, The Stone Skeleton, ch. 2; Timoshenko & Young, Theory of
//! Structures, ch. 9). Where its line of action crosses a section lies the centre of
//! pressure: its offset `e` from the rib axis gives the bending moment `M = C e`, with
//! C the compressive thrust normal to the section. The middle-third (kern) rule keeps a
//! rectangular section wholly in compression (|e| <= d/6), and a thrust line inside the
//! rib depth (|e| <= d/2) is the masonry arch's safe theorem; the geometric factor of
//! safety is the rib depth over the least depth that contains the line (Heyman).

use crate::error::StaticsError;
use crate::frame::model::Model;
use crate::frame::solver::CaseResult;
use crate::geom::{Point, Vector};
use serde::{Deserialize, Serialize};

/// The centre of pressure at one rib section.
///
/// Sign convention: `thrust` = -N (compression positive); `offset` e positive towards the
/// extrados (up for a rib drawn left to right); `moment` = thrust x e, which equals the
/// solver's bending moment M (sagging positive): a thrust line above the axis sags the
/// rib, M = -N e.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct PressurePoint {
    /// Rib node at the section.
    pub node: usize,
    /// Section centroid on the rib axis, m.
    pub axis: Point,
    /// Where the thrust line crosses the section, m.
    pub point: Point,
    /// Offset of the thrust line from the axis along the section, m, positive towards the
    /// extrados (the left-hand side of the rib walking from the left springing: up).
    pub offset: f64,
    /// Compressive thrust normal to the section, kN (= -N, positive in compression).
    pub thrust: f64,
    /// Bending moment from the thrust line, kNm: thrust x offset (sagging positive,
    /// the solver's sign convention for a rib drawn from left to right).
    pub moment: f64,
}

/// The thrust line of one load case on a rib.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ThrustLine {
    /// Load case name.
    pub case: String,
    /// Title of the model whose rib forces built the line (it belongs to that model).
    pub model: String,
    /// The section depth the checks use, m.
    pub depth: f64,
    /// One section per rib node, left springing to right springing (just right of each
    /// node, and just left of the right springing).
    pub sections: Vec<PressurePoint>,
    /// The section just left of each interior rib node (aligned with `sections`; `None`
    /// at both springings, where `sections` already holds the only side). Where a member
    /// joins the rib with a moment (a deck sharing the node) the two sides differ; the
    /// checks below take both.
    pub left_of: Vec<Option<PressurePoint>>,
    /// Vertices of the line of pressure (springing, kinks where forces join, springing), m.
    pub polygon: Vec<Point>,
    /// Index into `sections` (the rib node) of the largest |offset|, either side.
    pub worst: usize,
    /// Largest |offset| over both sides of every section, m.
    pub max_offset: f64,
    /// The least rib depth (symmetric about the axis) that contains the thrust line at
    /// every section: 2 max |offset|, m.
    pub least_depth: f64,
    /// True when |offset| <= depth / 6 everywhere (middle third).
    pub inside_middle_third: bool,
    /// True when |offset| <= depth / 2 everywhere.
    pub inside_depth: bool,
    /// Geometric factor of safety: depth / least depth = depth / (2 max |offset|);
    /// `None` when the line follows the axis exactly.
    pub geometric_safety_factor: Option<f64>,
}

impl ThrustLine {
    /// Unit normals of the sections, aligned with `sections`: the left-hand normal of the
    /// rib direction at each section (towards the extrados for a rib drawn from the left
    /// springing), the direction along which `offset` is measured. The rib direction is the
    /// chord to the next section (the last section takes the chord from the one before),
    /// as the sections themselves are built. Degenerate cases: a single section, or two
    /// sections at one point, give the upward normal (0, 1).
    pub fn section_normals(&self) -> Vec<Vector> {
        let n = self.sections.len();
        (0..n)
            .map(|i| {
                let (a, b) = if i + 1 < n {
                    (self.sections[i].axis, self.sections[i + 1].axis)
                } else if n >= 2 {
                    (self.sections[n - 2].axis, self.sections[n - 1].axis)
                } else {
                    return Vector { x: 0.0, y: 1.0 };
                };
                let t = b - a;
                let l = t.length();
                if l > 0.0 && l.is_finite() {
                    Vector { x: -t.y / l, y: t.x / l }
                } else {
                    Vector { x: 0.0, y: 1.0 }
                }
            })
            .collect()
    }
}

/// The rib's members in order from the left springing to the right one, with a flag
/// telling whether each runs along that direction (start node nearer the left springing).
///
/// `rib_members` are the indices of the members that form the rib, in any order and
/// direction: the caller knows which members are the rib (this layer never guesses from
/// names or groups). The chain starts at the leftmost end node (lowest x; ties: lowest
/// index).
///
/// Errors (`Invalid`, never a panic): no members given; an index that names no member
/// or is listed twice; a rib member whose start or end node does not exist; members that
/// do not form one open chain (a loop, a branch or two pieces).
pub fn rib_chain(model: &Model, rib_members: &[usize]) -> Result<Vec<(usize, bool)>, StaticsError> {
    if rib_members.is_empty() {
        return Err(StaticsError::invalid("thrust line", "no rib members were given"));
    }
    let (nn, nm) = (model.nodes.len(), model.members.len());
    let mut listed = vec![false; nm];
    for &k in rib_members {
        let Some(m) = model.members.get(k) else {
            return Err(StaticsError::invalid(
                "thrust line",
                format!("rib member {k} does not exist (the model has {nm} members)"),
            ));
        };
        if listed[k] {
            return Err(StaticsError::invalid(model.member_location(k), "is listed twice as a rib member"));
        }
        listed[k] = true;
        for (end, node) in [("start", m.start), ("end", m.end)] {
            if node >= nn {
                return Err(StaticsError::invalid(
                    model.member_location(k),
                    format!("rib member's {end} node {node} does not exist (the model has {nn} nodes)"),
                ));
            }
        }
    }
    let mut degree = std::collections::HashMap::new();
    for &k in rib_members {
        *degree.entry(model.members[k].start).or_insert(0) += 1;
        *degree.entry(model.members[k].end).or_insert(0) += 1;
    }
    let start = degree
        .iter()
        .filter(|(_, d)| **d == 1)
        .map(|(n, _)| *n)
        .min_by(|a, b| model.nodes[*a].x.total_cmp(&model.nodes[*b].x).then(a.cmp(b)))
        .ok_or_else(|| StaticsError::invalid("thrust line", "the rib must be an open chain of members"))?;
    let mut chain = Vec::new();
    let mut used = vec![false; nm];
    let mut at = start;
    while let Some(&k) = rib_members
        .iter()
        .find(|&&k| !used[k] && (model.members[k].start == at || model.members[k].end == at))
    {
        used[k] = true;
        let forward = model.members[k].start == at;
        chain.push((k, forward));
        at = if forward { model.members[k].end } else { model.members[k].start };
    }
    if chain.len() != rib_members.len() {
        return Err(StaticsError::invalid("thrust line", "the rib members do not form one chain"));
    }
    Ok(chain)
}

/// Builds the thrust line of `case` on the rib `chain` (from [`rib_chain`]) of `model`,
/// with section depth `depth` (m) for the checks.
///
/// Forces the rib receives at a rib node: the applied nodal load, the support reaction,
/// and minus the end actions of every non-rib member there (posts, bracing, deck);
/// loads along rib members enter as their resultants. Errors: an invalid model, results
/// of another model (other member or node counts), an empty chain or one naming a missing
/// member, a non-positive depth, or a section carrying no thrust (the offset is then
/// undefined).
pub fn thrust_line(
    model: &Model,
    case: &CaseResult,
    chain: &[(usize, bool)],
    depth: f64,
) -> Result<ThrustLine, StaticsError> {
    if !(depth.is_finite() && depth > 0.0) {
        return Err(StaticsError::invalid("thrust line", format!("rib depth {depth} m must be positive")));
    }
    crate::frame::solver::validate(model)?;
    let nm = model.members.len();
    if case.members.len() != nm
        || case.displacements.len() != model.nodes.len()
        || case.reactions.iter().any(|r| r.node >= model.nodes.len())
    {
        return Err(StaticsError::invalid(
            "thrust line",
            format!("the results of load case '{}' do not belong to this model", case.name),
        ));
    }
    if chain.is_empty() || chain.iter().any(|&(k, _)| k >= nm) {
        return Err(StaticsError::invalid(
            "thrust line",
            "the rib chain is empty or names a member that does not exist",
        ));
    }
    let mut in_chain = vec![false; nm];
    for &(k, _) in chain {
        in_chain[k] = true;
    }
    let lc = model.load_cases.iter().find(|l| l.name == case.name);
    let is_rib = |k: usize| in_chain[k];
    let rib_nodes: Vec<usize> = {
        let mut v = Vec::with_capacity(chain.len() + 1);
        for (i, &(k, fwd)) in chain.iter().enumerate() {
            let m = &model.members[k];
            let (a, b) = if fwd { (m.start, m.end) } else { (m.end, m.start) };
            if i == 0 {
                v.push(a);
            }
            v.push(b);
        }
        v
    };
    // moments are taken about the left springing (coordinates relative to it keep the
    // sums small, so the difference that gives M loses no digits)
    let origin = (model.nodes[rib_nodes[0]].x, model.nodes[rib_nodes[0]].y);
    let pos = |n: usize| (model.nodes[n].x - origin.0, model.nodes[n].y - origin.1);
    let abs = |p: (f64, f64)| (p.0 + origin.0, p.1 + origin.1);
    // force and couple the rib receives at each rib node
    let node_force = |n: usize| -> (f64, f64, f64) {
        let (mut fx, mut fy, mut mz) = (0.0, 0.0, 0.0);
        if let Some(lc) = lc {
            for l in lc.nodal.iter().filter(|l| l.node == n) {
                fx += l.fx;
                fy += l.fy;
                mz += l.mz;
            }
        }
        if let Some(r) = case.reaction(n) {
            fx += r.fx;
            fy += r.fy;
            mz += r.mz;
        }
        for (k, mf) in case.members.iter().enumerate() {
            if is_rib(k) {
                continue;
            }
            let m = &model.members[k];
            let a = &mf.end_actions_global;
            if m.start == n {
                fx -= a[0];
                fy -= a[1];
                mz -= a[2];
            }
            if m.end == n {
                fx -= a[3];
                fy -= a[4];
                mz -= a[5];
            }
        }
        (fx, fy, mz)
    };
    // resultant of loads along rib member k: (Fx, Fy, moment about the origin)
    let member_load = |k: usize| -> (f64, f64, f64) {
        let Some(lc) = lc else { return (0.0, 0.0, 0.0) };
        let m = &model.members[k];
        let (p, q) = (pos(m.start), pos(m.end));
        let g = crate::frame::element::Geometry::new(p.0, p.1, q.0, q.1);
        let (mut fx, mut fy, mut m0) = (0.0, 0.0, 0.0);
        for ml in lc.member.iter().filter(|ml| ml.member() == k) {
            let ll = crate::frame::element::resolve_load(ml, &g);
            let (gx, gy, about_start) = crate::frame::element::load_resultant_global(&ll, &g);
            fx += gx;
            fy += gy;
            m0 += about_start + p.0 * gy - p.1 * gx;
        }
        (fx, fy, m0)
    };
    // carry the resultant (Rx, Ry, moment about the origin) along the rib
    let (mut rx, mut ry, mut m0) = (0.0, 0.0, 0.0);
    let mut sections = Vec::with_capacity(rib_nodes.len());
    // kinks of the line of pressure: where consecutive lines of action meet
    let mut kinks = Vec::new();
    let mut last_line: Option<((f64, f64), (f64, f64))> = None;
    let mut push_line = |rx: f64, ry: f64, m0: f64, near: (f64, f64)| {
        // a point on the line of action: foot of the perpendicular from `near`
        let r2 = rx * rx + ry * ry;
        if r2 == 0.0 || !r2.is_finite() {
            return;
        }
        let cross = near.0 * ry - near.1 * rx; // moment about the origin if applied at `near`
        let d = (m0 - cross) / r2; // shift along the normal (-ry, rx)
        let on = (near.0 - d * ry, near.1 + d * rx);
        if let Some((p, r)) = last_line {
            if let Some(x) = intersect(p, r, on, (rx, ry)) {
                kinks.push(abs(x));
            }
        }
        last_line = Some((on, (rx, ry)));
    };
    // the centre of pressure on the section through `c` (relative to the origin) normal
    // to the rib direction `t`, for the resultant (Rx, Ry, moment about the origin) of
    // every force to its left
    let section = |n: usize, c: (f64, f64), t: (f64, f64), (rx, ry, m0): (f64, f64, f64)| {
        let thrust = rx * t.0 + ry * t.1;
        if thrust.abs() <= f64::EPSILON * rx.hypot(ry).max(1.0) {
            return Err(StaticsError::invalid(
                format!("thrust line at node {}", model.node_label(n)),
                "the rib carries no thrust there, so the centre of pressure is undefined",
            ));
        }
        let m_c = m0 - (c.0 * ry - c.1 * rx);
        let offset = -m_c / thrust;
        let normal = (-t.1, t.0);
        Ok(PressurePoint {
            node: n,
            axis: Point::from(abs(c)),
            point: Point::from(abs((c.0 + offset * normal.0, c.1 + offset * normal.1))),
            offset,
            thrust,
            moment: thrust * offset,
        })
    };
    let mut left_of = Vec::with_capacity(rib_nodes.len());
    for (i, &n) in rib_nodes.iter().enumerate() {
        let last = i + 1 == rib_nodes.len();
        if i > 0 {
            let (fx, fy, mm) = member_load(chain[i - 1].0);
            rx += fx;
            ry += fy;
            m0 += mm;
        }
        // the section just left of the right springing uses the resultant so far
        let (c, t) = if last {
            let prev = rib_nodes[i - 1];
            (pos(n), unit(pos(prev), pos(n)))
        } else {
            let p = pos(n);
            if i > 0 {
                // just left of the node: the resultant before the node's own forces, on
                // the section normal to the member arriving from the left
                let t = unit(pos(rib_nodes[i - 1]), p);
                left_of.push(Some(section(n, p, t, (rx, ry, m0))?));
            } else {
                left_of.push(None);
            }
            let (fx, fy, mz) = node_force(n);
            rx += fx;
            ry += fy;
            m0 += mz + p.0 * fy - p.1 * fx;
            push_line(rx, ry, m0, p);
            (p, unit(p, pos(rib_nodes[i + 1])))
        };
        sections.push(section(n, c, t, (rx, ry, m0))?);
    }
    if left_of.len() < sections.len() {
        left_of.push(None); // the right springing: `sections` holds its left side
    }
    // the line of pressure: from the left springing section through the kinks to the
    // right springing section
    let mut polygon = Vec::with_capacity(kinks.len() + 2);
    if let Some(s) = sections.first() {
        polygon.push(s.point);
    }
    polygon.extend(kinks.into_iter().map(Point::from));
    if let Some(s) = sections.last() {
        polygon.push(s.point);
    }
    let (worst, max_offset) = sections
        .iter()
        .zip(&left_of)
        .enumerate()
        .map(|(i, (s, l))| (i, s.offset.abs().max(l.map_or(0.0, |l| l.offset.abs()))))
        .fold((0, 0.0), |a, b| if b.1 > a.1 { b } else { a });
    Ok(ThrustLine {
        case: case.name.clone(),
        model: model.title.clone(),
        depth,
        least_depth: 2.0 * max_offset,
        worst,
        max_offset,
        inside_middle_third: max_offset <= depth / 6.0,
        inside_depth: max_offset <= depth / 2.0,
        geometric_safety_factor: if max_offset > 0.0 { Some(depth / (2.0 * max_offset)) } else { None },
        sections,
        left_of,
        polygon,
    })
}

fn unit(a: (f64, f64), b: (f64, f64)) -> (f64, f64) {
    let (dx, dy) = (b.0 - a.0, b.1 - a.1);
    let l = dx.hypot(dy);
    (dx / l, dy / l)
}

/// Intersection of the lines p + s r and q + t d; `None` when (nearly) parallel.
fn intersect(p: (f64, f64), r: (f64, f64), q: (f64, f64), d: (f64, f64)) -> Option<(f64, f64)> {
    let den = r.0 * d.1 - r.1 * d.0;
    if den.abs() < 1e-12 * r.0.hypot(r.1) * d.0.hypot(d.1) {
        return None;
    }
    let s = ((q.0 - p.0) * d.1 - (q.1 - p.1) * d.0) / den;
    Some((p.0 + s * r.0, p.1 + s * r.1))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::error::Location;
    use crate::frame::solver::solve;

    /// The members of group "rib" (the reference models name their rib so).
    fn rib_members(model: &Model) -> Vec<usize> {
        (0..model.members.len()).filter(|&k| model.members[k].group == "rib").collect()
    }

    fn check_moments(model: &Model, depth: f64) -> Vec<ThrustLine> {
        let s = solve(model).expect("stable");
        let chain = rib_chain(model, &rib_members(model)).expect("rib");
        let mut out = Vec::new();
        for case in &s.cases {
            let tl = thrust_line(model, case, &chain, depth).expect("thrust line");
            let mut mmax: f64 = 0.0;
            let mut solver_m = Vec::new();
            for (i, sec) in tl.sections.iter().enumerate() {
                let m = if i < chain.len() {
                    let (k, fwd) = chain[i];
                    let mf = &case.members[k];
                    if fwd {
                        mf.start.m
                    } else {
                        -mf.end.m
                    }
                } else {
                    let (k, fwd) = chain[i - 1];
                    let mf = &case.members[k];
                    if fwd {
                        mf.end.m
                    } else {
                        -mf.start.m
                    }
                };
                mmax = mmax.max(m.abs());
                solver_m.push((m, sec.moment));
            }
            for (m, from_line) in solver_m {
                assert!((m - from_line).abs() <= 1e-6 * mmax.max(1e-9), "{m} vs {from_line}");
            }
            out.push(tl);
        }
        out
    }

    #[test]
    fn frame_deck_arch_of_the_reference_set_has_n_e_equal_to_m() {
        let text = include_str!("../../../../tests/reference/models/frame_deck_arch.json");
        let m: Model = serde_json::from_str(text).expect("model");
        let lines = check_moments(&m, 1.5);
        assert!(!lines.is_empty());
    }

    /// Regression: the line of pressure used to start at the foot of the perpendicular
    /// from the left springing onto the first line of action, which for a fixed rib is
    /// not on the springing section; it now starts and ends where the line crosses the
    /// springing sections.
    #[test]
    fn polygon_starts_and_ends_on_the_springing_sections() {
        let text = include_str!("../../../../tests/reference/models/bare_rib.json");
        let m: Model = serde_json::from_str(text).expect("model");
        for tl in check_moments(&m, 1.0) {
            assert_eq!(tl.polygon.first(), tl.sections.first().map(|s| &s.point));
            assert_eq!(tl.polygon.last(), tl.sections.last().map(|s| &s.point));
            // a fixed rib carries end moments: the line leaves the springing off the axis
            assert!(tl.sections[0].offset.abs() > 0.0);
        }
    }

    /// The section normals are the directions the offsets were measured along: every
    /// section with an offset has `point = axis + offset * normal` (the definition of
    /// `offset`), and every normal is a unit vector.
    #[test]
    fn section_normals_carry_the_offsets_to_the_pressure_points() {
        let text = include_str!("../../../../tests/reference/models/bare_rib.json");
        let m: Model = serde_json::from_str(text).expect("model");
        let mut checked = 0;
        for tl in check_moments(&m, 1.0) {
            let normals = tl.section_normals();
            assert_eq!(normals.len(), tl.sections.len());
            for (s, n) in tl.sections.iter().zip(&normals) {
                assert!((n.length() - 1.0).abs() < 1e-12);
                let back = s.axis + *n * s.offset;
                assert!(back.distance(s.point) <= 1e-9 * (1.0 + s.offset.abs()), "{back:?} vs {:?}", s.point);
                checked += 1;
            }
        }
        assert!(checked > 4);
    }

    /// Regression: results of a different model (more members than the model) used to
    /// index past the model's members and panic; now they are an error. Its first test
    /// was weak: the assertion sat inside an `if`, and the error it met came from
    /// validation (a member load on the removed member), not from the mismatch check.
    /// Here the other model is valid (one more member, nothing loads it), so only the
    /// mismatch check can answer, and its error is matched exactly.
    #[test]
    fn results_of_another_model_are_an_error() {
        let text = include_str!("../../../../tests/reference/models/frame_deck_arch.json");
        let m: Model = serde_json::from_str(text).expect("model");
        let s = solve(&m).expect("stable");
        let chain = rib_chain(&m, &rib_members(&m)).expect("rib");
        let mut more = m.clone();
        let extra = more.members[0].clone();
        let (first, last) = (extra.start, more.members[more.members.len() - 1].end);
        more.add_member(crate::frame::model::Member { start: first, end: last, ..extra });
        crate::frame::solver::validate(&more).expect("the other model is valid");
        let case = &s.cases[0];
        let expected = StaticsError::Invalid(vec![crate::error::Problem::new(
            Location::Part("thrust line".into()),
            format!("the results of load case '{}' do not belong to this model", case.name),
        )]);
        assert_eq!(thrust_line(&more, case, &chain, 1.0), Err(expected.clone()));
        // as many members but one node more: a member off the rib, loaded by no member
        // load, now ends at a new node beside its old end
        let mut other_nodes = m.clone();
        let loaded = |k: usize| m.load_cases.iter().any(|lc| lc.member.iter().any(|l| l.member() == k));
        let k = (0..m.members.len())
            .find(|&k| !loaded(k) && chain.iter().all(|&(c, _)| c != k))
            .expect("a member");
        let old_end = &m.nodes[m.members[k].end];
        let new_end = other_nodes.add_node("", old_end.x + 0.5, old_end.y + 0.5);
        other_nodes.members[k].end = new_end;
        crate::frame::solver::validate(&other_nodes).expect("the other model is valid");
        assert_eq!(thrust_line(&other_nodes, case, &chain, 1.0), Err(expected));
    }

    #[test]
    fn fixed_bare_rib_of_the_reference_set_has_n_e_equal_to_m() {
        let text = include_str!("../../../../tests/reference/models/bare_rib.json");
        let m: Model = serde_json::from_str(text).expect("model");
        check_moments(&m, 1.0);
    }
}
