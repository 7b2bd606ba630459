//! Plane beam-column and bar elements: stiffness, fixed-end actions, internal forces.
//!
//! Local freedoms of a member, in this order: start (u, v, theta), end (u, v, theta),
//! local x from start to end, local y 90 degrees anticlockwise from it. End actions are
//! the forces and moments the nodes apply *to the member*, in local axes, so that
//! `end_actions = k * u_local + fixed_end_actions` (Przemieniecki, Theory of Matrix
//! Structural Analysis, ch. 5; McGuire, Gallagher & Ziemian, Matrix Structural Analysis,
//! 2nd ed., ch. 4-5). Moment releases are applied by static condensation of the released
//! end rotation (McGuire et al. 2nd ed., sec. 13.2).

use crate::frame::model::{LoadDirection, Member, MemberKind, MemberLoad};
use nalgebra::{Matrix3, Matrix6, Vector2, Vector6};

/// Direction cosines and length of a member from its end coordinates.
#[derive(Debug, Clone, Copy)]
pub struct Geometry {
    /// Length, m.
    pub length: f64,
    /// cos of the angle from global x to local x.
    pub c: f64,
    /// sin of the angle from global x to local x.
    pub s: f64,
}

impl Geometry {
    /// Geometry of the segment from (x1, y1) to (x2, y2).
    pub fn new(x1: f64, y1: f64, x2: f64, y2: f64) -> Self {
        let dx = x2 - x1;
        let dy = y2 - y1;
        let length = dx.hypot(dy);
        Geometry { length, c: dx / length, s: dy / length }
    }
    /// Rotation from global to local freedoms: `u_local = T u_global`.
    pub fn transform(&self) -> Matrix6<f64> {
        let r = Matrix3::new(self.c, self.s, 0.0, -self.s, self.c, 0.0, 0.0, 0.0, 1.0);
        let mut t = Matrix6::zeros();
        t.fixed_view_mut::<3, 3>(0, 0).copy_from(&r);
        t.fixed_view_mut::<3, 3>(3, 3).copy_from(&r);
        t
    }
    /// Local components (along, across) of a global vector (gx, gy).
    pub fn to_local(&self, gx: f64, gy: f64) -> Vector2<f64> {
        Vector2::new(gx * self.c + gy * self.s, -gx * self.s + gy * self.c)
    }
}

/// Local stiffness matrix of a member, kN/m, kN/rad, kNm/rad, with releases condensed.
///
/// Truss members and frame members released at both ends carry axial stiffness only.
pub fn local_stiffness(member: &Member, geometry: &Geometry) -> Matrix6<f64> {
    let l = geometry.length;
    let ea = member.e * member.a / l;
    let mut k = Matrix6::zeros();
    k[(0, 0)] = ea;
    k[(3, 3)] = ea;
    k[(0, 3)] = -ea;
    k[(3, 0)] = -ea;
    let (rs, re) = (member.pinned_at_start(), member.pinned_at_end());
    if rs && re {
        return k;
    }
    let ei = member.e * member.i;
    let b = bending_block(ei, l);
    for r in 0..4 {
        for c in 0..4 {
            k[(BENDING[r], BENDING[c])] = b[(r, c)];
        }
    }
    condense(&mut k, None, rs, re);
    k
}

/// Positions of (v1, theta1, v2, theta2) in the 6-vector of local freedoms.
const BENDING: [usize; 4] = [1, 2, 4, 5];

fn bending_block(ei: f64, l: f64) -> nalgebra::Matrix4<f64> {
    let l2 = l * l;
    let l3 = l2 * l;
    nalgebra::Matrix4::new(
        12.0 * ei / l3,
        6.0 * ei / l2,
        -12.0 * ei / l3,
        6.0 * ei / l2,
        6.0 * ei / l2,
        4.0 * ei / l,
        -6.0 * ei / l2,
        2.0 * ei / l,
        -12.0 * ei / l3,
        -6.0 * ei / l2,
        12.0 * ei / l3,
        -6.0 * ei / l2,
        6.0 * ei / l2,
        2.0 * ei / l,
        -6.0 * ei / l2,
        4.0 * ei / l,
    )
}

/// Statically condenses out the released rotations (local freedoms 2 and/or 5) from
/// `k` and, when given, from the fixed-end action vector `f`: the released end moment
/// becomes zero and its rotation is no longer a member freedom.
fn condense(k: &mut Matrix6<f64>, mut f: Option<&mut Vector6<f64>>, release_start: bool, release_end: bool) {
    for (released, dof) in [(release_start, 2usize), (release_end, 5usize)] {
        if !released {
            continue;
        }
        let kcc = k[(dof, dof)];
        if kcc == 0.0 {
            continue;
        }
        let col = k.column(dof).into_owned();
        let row = k.row(dof).into_owned();
        let fc = f.as_ref().map(|f| f[dof]).unwrap_or(0.0);
        for r in 0..6 {
            if let Some(f) = f.as_deref_mut() {
                f[r] -= col[r] * fc / kcc;
            }
            for c in 0..6 {
                k[(r, c)] -= col[r] * row[c] / kcc;
            }
        }
        for i in 0..6 {
            k[(dof, i)] = 0.0;
            k[(i, dof)] = 0.0;
        }
        if let Some(f) = f.as_deref_mut() {
            f[dof] = 0.0;
        }
    }
}

/// A member load resolved into local components: uniform (qx, qy) kN/m over the whole
/// length, or a point force (px, py) kN at distance `a` m from the start.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum LocalLoad {
    /// Uniform load per metre of member length, local components, kN/m.
    Uniform {
        /// Along the member.
        qx: f64,
        /// Across the member.
        qy: f64,
    },
    /// Concentrated force, local components, kN, at `a` m from the start.
    Point {
        /// Along the member.
        px: f64,
        /// Across the member.
        py: f64,
        /// Distance from the start, m.
        a: f64,
    },
}

/// Resolves a member load into local components per metre of member length.
pub fn resolve_load(load: &MemberLoad, g: &Geometry) -> LocalLoad {
    match *load {
        MemberLoad::Uniform { w, direction, projected, .. } => {
            let (gx, gy) = match direction {
                LoadDirection::LocalX => return LocalLoad::Uniform { qx: w, qy: 0.0 },
                LoadDirection::LocalY => return LocalLoad::Uniform { qx: 0.0, qy: w },
                // per projected length: w * |projection| / length per member metre
                LoadDirection::GlobalX => (w * if projected { g.s.abs() } else { 1.0 }, 0.0),
                LoadDirection::GlobalY => (0.0, w * if projected { g.c.abs() } else { 1.0 }),
            };
            let q = g.to_local(gx, gy);
            LocalLoad::Uniform { qx: q.x, qy: q.y }
        }
        MemberLoad::Point { p, a, direction, .. } => {
            let (px, py) = match direction {
                LoadDirection::LocalX => (p, 0.0),
                LoadDirection::LocalY => (0.0, p),
                LoadDirection::GlobalX => {
                    let q = g.to_local(p, 0.0);
                    (q.x, q.y)
                }
                LoadDirection::GlobalY => {
                    let q = g.to_local(0.0, p);
                    (q.x, q.y)
                }
            };
            LocalLoad::Point { px, py, a }
        }
    }
}

/// Resultant of a local load in global axes: (Fx, Fy, moment about the start node,
/// anticlockwise), kN and kNm.
pub fn load_resultant_global(load: &LocalLoad, g: &Geometry) -> (f64, f64, f64) {
    let (fx_l, fy_l, arm) = match *load {
        LocalLoad::Uniform { qx, qy } => (qx * g.length, qy * g.length, g.length / 2.0),
        LocalLoad::Point { px, py, a } => (px, py, a),
    };
    let fx = fx_l * g.c - fy_l * g.s;
    let fy = fx_l * g.s + fy_l * g.c;
    // moment of the local-y component about the start: arm along local x
    (fx, fy, fy_l * arm)
}

/// Fixed-end actions (local, kN and kNm) of a load on a member fixed at both ends,
/// condensed for the member's releases: standard tables (e.g. McGuire et al., 2nd ed.,
/// inside back cover; Roark, 9th ed., table 8.1 cases 1c, 2c).
pub fn fixed_end_actions(member: &Member, g: &Geometry, load: &LocalLoad) -> Vector6<f64> {
    let l = g.length;
    let mut f = match *load {
        LocalLoad::Uniform { qx, qy } => Vector6::new(
            -qx * l / 2.0,
            -qy * l / 2.0,
            -qy * l * l / 12.0,
            -qx * l / 2.0,
            -qy * l / 2.0,
            qy * l * l / 12.0,
        ),
        LocalLoad::Point { px, py, a } => {
            let b = l - a;
            let l2 = l * l;
            let l3 = l2 * l;
            Vector6::new(
                -px * b / l,
                -py * b * b * (3.0 * a + b) / l3,
                -py * a * b * b / l2,
                -px * a / l,
                -py * a * a * (a + 3.0 * b) / l3,
                py * a * a * b / l2,
            )
        }
    };
    let (rs, re) = (member.pinned_at_start(), member.pinned_at_end());
    if rs || re {
        // condense with a unit-EI bending block: the condensed actions do not depend on EI
        let mut k = Matrix6::zeros();
        let b = bending_block(1.0, l);
        for r in 0..4 {
            for c in 0..4 {
                k[(BENDING[r], BENDING[c])] = b[(r, c)];
            }
        }
        condense(&mut k, Some(&mut f), rs, re);
    }
    f
}

/// Fixed-end actions of a uniform temperature change `delta_t` (K): the restrained bar
/// is pushed in at both ends by E A alpha delta_t.
pub fn temperature_end_actions(member: &Member, delta_t: f64) -> Vector6<f64> {
    let n = member.e * member.a * member.alpha * delta_t;
    Vector6::new(n, 0.0, 0.0, -n, 0.0, 0.0)
}

/// Internal forces at distance `s` (m) from the start: (N, V, M).
///
/// N: axial force, kN, tension positive. M: bending moment, kNm, positive when it puts
/// the fibre on the right of the member (looking from start to end, local -y side) in
/// tension, that is sagging for a member drawn left to right. V: shear, kN, with
/// dM/ds = V. `start_actions` are the local end actions at the start (u, v, theta);
/// loads act between 0 and `s` (a point load exactly at `s` is not yet included).
pub fn internal_forces(start_actions: [f64; 3], loads: &[LocalLoad], s: f64) -> (f64, f64, f64) {
    let [f1x, f1y, m1] = start_actions;
    let mut n = -f1x;
    let mut v = f1y;
    let mut m = -m1 + f1y * s;
    for load in loads {
        match *load {
            LocalLoad::Uniform { qx, qy } => {
                n -= qx * s;
                v += qy * s;
                m += qy * s * s / 2.0;
            }
            LocalLoad::Point { px, py, a } => {
                if a < s {
                    n -= px;
                    v += py;
                    m += py * (s - a);
                }
            }
        }
    }
    (n, v, m)
}

/// True when the member carries axial force only: a truss member, or a frame member
/// released at both ends (no bending stiffness to assemble).
pub fn is_axial_only(member: &Member) -> bool {
    member.kind == MemberKind::Truss || (member.release_start && member.release_end)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::frame::model::frame;

    #[test]
    fn propped_cantilever_fixed_end_moment_matches_table() {
        // Fixed at start, pinned at end, uniform load q: M_fixed = q L^2 / 8
        // (Roark, 9th ed., table 8.1 case 2c, from memory; also any beam table).
        let mut m = frame("b", "", 0, 1, 1.0, 1.0, 1.0);
        m.release_end = true;
        let g = Geometry::new(0.0, 0.0, 4.0, 0.0);
        let f = fixed_end_actions(&m, &g, &LocalLoad::Uniform { qx: 0.0, qy: -10.0 });
        assert!((f[2] - 10.0 * 16.0 / 8.0).abs() < 1e-12);
        assert!(f[5].abs() < 1e-12);
        // reactions 5qL/8 and 3qL/8
        assert!((f[1] - 5.0 * 10.0 * 4.0 / 8.0).abs() < 1e-12);
        assert!((f[4] - 3.0 * 10.0 * 4.0 / 8.0).abs() < 1e-12);
    }

    #[test]
    fn simple_span_point_load_gives_lever_rule_reactions() {
        let mut m = frame("b", "", 0, 1, 1.0, 1.0, 1.0);
        m.release_start = true;
        m.release_end = true;
        let g = Geometry::new(0.0, 0.0, 5.0, 0.0);
        let f = fixed_end_actions(&m, &g, &LocalLoad::Point { px: 0.0, py: -10.0, a: 1.0 });
        assert!((f[1] - 8.0).abs() < 1e-12 && (f[4] - 2.0).abs() < 1e-12);
        assert!(f[2].abs() < 1e-12 && f[5].abs() < 1e-12);
    }
}
