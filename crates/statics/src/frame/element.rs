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
    /// T^T k T: a 6 x 6 matrix of local freedoms (start, end) carried to global ones,
    /// `transform()` applied by its two 2 x 2 rotations rather than as a full product
    /// (a quarter of the operations; the same result to rounding).
    pub fn to_global_matrix(&self, k: &Matrix6<f64>) -> Matrix6<f64> {
        let (c, s) = (self.c, self.s);
        let mut a = *k;
        // k T: columns (u, v) of each end mixed
        for base in [0, 3] {
            for r in 0..6 {
                let (x, y) = (a[(r, base)], a[(r, base + 1)]);
                a[(r, base)] = c * x - s * y;
                a[(r, base + 1)] = s * x + c * y;
            }
        }
        // T^T (k T): rows likewise
        for base in [0, 3] {
            for col in 0..6 {
                let (x, y) = (a[(base, col)], a[(base + 1, col)]);
                a[(base, col)] = c * x - s * y;
                a[(base + 1, col)] = s * x + c * y;
            }
        }
        a
    }
    /// T^T f: end actions (or any 6-vector of local freedoms) in global axes.
    pub fn to_global_vector(&self, f: &Vector6<f64>) -> Vector6<f64> {
        let (c, s) = (self.c, self.s);
        Vector6::new(
            c * f[0] - s * f[1],
            s * f[0] + c * f[1],
            f[2],
            c * f[3] - s * f[4],
            s * f[3] + c * f[4],
            f[5],
        )
    }
    /// T u: global displacements of the two ends in local axes.
    pub fn to_local_vector(&self, u: &Vector6<f64>) -> Vector6<f64> {
        let (c, s) = (self.c, self.s);
        Vector6::new(
            c * u[0] + s * u[1],
            -s * u[0] + c * u[1],
            u[2],
            c * u[3] + s * u[4],
            -s * u[3] + c * u[4],
            u[5],
        )
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

/// Local geometric stiffness of a member carrying the axial force `axial_force` (kN,
/// tension positive), in kN/m, kN/rad and kNm/rad, releases condensed: the matrix
/// K_G with (K + K_G) u = f the linearised equilibrium of the member in its displaced
/// position.
///
/// - Frame members: the consistent geometric stiffness of the cubic beam-column (the
///   Hermite shape functions of the elastic stiffness; K_G = N integral of v'^2), on the
///   transverse freedoms (v1, theta1, v2, theta2): N / L [6/5, L/10, -6/5, L/10; L/10,
///   2 L^2/15, -L/10, -L^2/30; ...] (McGuire, Gallagher & Ziemian, Matrix Structural
///   Analysis, 2nd ed., ch. 9; Przemieniecki, Theory of Matrix Structural Analysis,
///   ch. 15; from memory, and checked in this module against the integral). The axial
///   terms N / L that some texts add on (u1, u2) are left out: they change a critical
///   load by the order of N / (E A).
/// - A member released at one end: K_G condensed with the transformation that condenses
///   its elastic stiffness (the released rotation follows the others as the elastic
///   member requires, `release_transformation`), the usual first-order consistent
///   approach: K_G* = G^T K_G G, as k* = G^T k G.
/// - Pin-ended bars (truss members and frame members released at both ends): the string
///   stiffness N / L [1, -1; -1, 1] on the transverse translations (v1, v2); the bar stays
///   straight, so it cannot buckle on its own, only let its ends sway.
///
/// A zero axial force gives the zero matrix.
pub fn local_geometric_stiffness(member: &Member, geometry: &Geometry, axial_force: f64) -> Matrix6<f64> {
    let l = geometry.length;
    let n_over_l = axial_force / l;
    let mut kg = Matrix6::zeros();
    if is_axial_only(member) {
        kg[(1, 1)] = n_over_l;
        kg[(4, 4)] = n_over_l;
        kg[(1, 4)] = -n_over_l;
        kg[(4, 1)] = -n_over_l;
        return kg;
    }
    let b = geometric_bending_block(axial_force, l);
    for r in 0..4 {
        for c in 0..4 {
            kg[(BENDING[r], BENDING[c])] = b[(r, c)];
        }
    }
    let (rs, re) = (member.pinned_at_start(), member.pinned_at_end());
    if rs || re {
        let g = release_transformation(l, rs, re);
        kg = g.transpose() * kg * g;
    }
    kg
}

/// The consistent geometric stiffness of the cubic beam-column on (v1, theta1, v2,
/// theta2) for axial force `n` (tension positive) and length `l`.
fn geometric_bending_block(n: f64, l: f64) -> nalgebra::Matrix4<f64> {
    let c = n / l;
    let l2 = l * l;
    nalgebra::Matrix4::new(
        1.2 * c,
        0.1 * l * c,
        -1.2 * c,
        0.1 * l * c,
        0.1 * l * c,
        2.0 * l2 / 15.0 * c,
        -0.1 * l * c,
        -l2 / 30.0 * c,
        -1.2 * c,
        -0.1 * l * c,
        1.2 * c,
        -0.1 * l * c,
        0.1 * l * c,
        -l2 / 30.0 * c,
        -0.1 * l * c,
        2.0 * l2 / 15.0 * c,
    )
}

/// The transformation G (6 x 6, local freedoms) that static condensation of the released
/// end rotations applies: u_full = G u, where each released rotation (theta1 when
/// `release_start`, theta2 when `release_end`) takes the value that makes its end moment
/// zero in the elastic beam (theta_c = -k_cc^-1 k_cr u_r; the bending block with unit
/// E I, since the ratio does not depend on E I), and the released rotation's own column
/// is zero. Then G^T k G is the condensed elastic stiffness (McGuire, Gallagher &
/// Ziemian, 2nd ed., sec. 13.2). With no release, G is the identity.
pub fn release_transformation(length: f64, release_start: bool, release_end: bool) -> Matrix6<f64> {
    let mut g = Matrix6::identity();
    let mut k = Matrix6::zeros();
    let b = bending_block(1.0, length);
    for r in 0..4 {
        for c in 0..4 {
            k[(BENDING[r], BENDING[c])] = b[(r, c)];
        }
    }
    let released: Vec<usize> = [(release_start, 2usize), (release_end, 5usize)]
        .iter()
        .filter(|(r, _)| *r)
        .map(|(_, d)| *d)
        .collect();
    let kept: Vec<usize> = (0..6).filter(|d| !released.contains(d)).collect();
    match released.as_slice() {
        [] => {}
        [c] => {
            for &r in &kept {
                g[(*c, r)] = -k[(*c, r)] / k[(*c, *c)];
            }
            g[(*c, *c)] = 0.0;
        }
        [c, d] => {
            // solve the 2 x 2 block [k_cc k_cd; k_dc k_dd] for both rotations
            let (kcc, kcd, kdd) = (k[(*c, *c)], k[(*c, *d)], k[(*d, *d)]);
            let det = kcc * kdd - kcd * kcd;
            for &r in &kept {
                let (fc, fd) = (k[(*c, r)], k[(*d, r)]);
                g[(*c, r)] = -(kdd * fc - kcd * fd) / det;
                g[(*d, r)] = -(kcc * fd - kcd * fc) / det;
            }
            g[(*c, *c)] = 0.0;
            g[(*d, *d)] = 0.0;
        }
        _ => {}
    }
    g
}

/// True when the member carries axial force only: a truss member, or a frame member
/// released at both ends (no bending stiffness to assemble).
pub fn is_axial_only(member: &Member) -> bool {
    member.kind == MemberKind::Truss || (member.release_start && member.release_end)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::frame::model::{frame, truss};

    /// The rotations by 2 x 2 blocks equal the full products with T (its definition in
    /// McGuire, Gallagher & Ziemian, Matrix Structural Analysis, 2nd ed., ch. 4-5), for a
    /// member in every quadrant, with a released end and a general (unsymmetric) matrix.
    #[test]
    fn block_rotations_equal_the_products_with_t() {
        let mut m = frame("b", "", 0, 1, 2.1e8, 0.02, 3e-4);
        m.release_end = true;
        for (x, y) in [(4.0, 3.0), (-4.0, 3.0), (-4.0, -3.0), (4.0, -3.0), (0.0, 5.0), (5.0, 0.0)] {
            let g = Geometry::new(1.0, 2.0, 1.0 + x, 2.0 + y);
            let t = g.transform();
            let k = local_stiffness(&m, &g);
            let general = Matrix6::from_fn(|r, c| (r * 7 + c * 3) as f64 - 0.5 * (r * c) as f64);
            for matrix in [k, general] {
                let expected = t.transpose() * matrix * t;
                let got = g.to_global_matrix(&matrix);
                let scale = expected.amax();
                assert!((got - expected).amax() <= 1e-14 * scale, "{got} against {expected}");
            }
            let v = Vector6::new(1.0, -2.0, 0.5, 3.0, 4.0, -1.5);
            assert!((g.to_global_vector(&v) - t.transpose() * v).amax() <= 1e-14 * 4.0);
            assert!((g.to_local_vector(&v) - t * v).amax() <= 1e-14 * 4.0);
        }
    }

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

    /// Slopes of the four cubic Hermite shape functions (v1, theta1, v2, theta2) of a
    /// beam of length `l` at `x` (the shapes: Przemieniecki, ch. 5; differentiated here).
    fn hermite_slopes(l: f64, x: f64) -> [f64; 4] {
        let xi = x / l;
        [
            (-6.0 * xi + 6.0 * xi * xi) / l,
            1.0 - 4.0 * xi + 3.0 * xi * xi,
            (6.0 * xi - 6.0 * xi * xi) / l,
            -2.0 * xi + 3.0 * xi * xi,
        ]
    }

    /// N times the integral of phi_i' phi_j' over a member, by three-point Gauss
    /// quadrature (exact for the quartic integrand), with each end's released rotation
    /// carried by the transformation `g` of the member: an independent derivation of the
    /// consistent geometric stiffness (K_G = N integral of v'^2 over the displacement
    /// field of the elastic member).
    fn geometric_stiffness_by_quadrature(n: f64, l: f64, g: &Matrix6<f64>) -> Matrix6<f64> {
        let nodes = [(-(0.6f64).sqrt(), 5.0 / 9.0), (0.0, 8.0 / 9.0), ((0.6f64).sqrt(), 5.0 / 9.0)];
        let mut kg = Matrix6::zeros();
        for (t, w) in nodes {
            let x = l * (1.0 + t) / 2.0;
            let d = hermite_slopes(l, x);
            // slope per unit of each local freedom (u1, v1, theta1, u2, v2, theta2)
            let slope_full = nalgebra::RowVector6::new(0.0, d[0], d[1], 0.0, d[2], d[3]);
            let slope = slope_full * g;
            kg += slope.transpose() * slope * (n * w * l / 2.0);
        }
        kg
    }

    fn close(a: &Matrix6<f64>, b: &Matrix6<f64>) -> bool {
        let scale = a.abs().max().max(b.abs().max());
        (a - b).abs().max() <= 1e-12 * scale
    }

    #[test]
    fn geometric_stiffness_is_the_integral_of_the_cubic_slopes() {
        let g = Geometry::new(0.0, 0.0, 3.0, 4.0);
        let n = -250.0;
        for (rs, re) in [(false, false), (true, false), (false, true)] {
            let mut m = frame("b", "", 0, 1, 2e8, 0.01, 1e-4);
            m.release_start = rs;
            m.release_end = re;
            let kg = local_geometric_stiffness(&m, &g, n);
            let by_quadrature =
                geometric_stiffness_by_quadrature(n, 5.0, &release_transformation(5.0, rs, re));
            assert!(close(&kg, &by_quadrature), "releases ({rs}, {re}):\n{kg}\n{by_quadrature}");
        }
    }

    #[test]
    fn release_transformation_condenses_the_elastic_stiffness() {
        let g = Geometry::new(1.0, 2.0, 7.0, -1.0);
        for (rs, re) in [(true, false), (false, true)] {
            let mut m = frame("b", "", 0, 1, 2e8, 0.01, 3e-4);
            m.release_start = rs;
            m.release_end = re;
            let condensed = local_stiffness(&m, &g);
            let mut rigid = m.clone();
            rigid.release_start = false;
            rigid.release_end = false;
            let t = release_transformation(g.length, rs, re);
            let transformed = t.transpose() * local_stiffness(&rigid, &g) * t;
            assert!(close(&condensed, &transformed), "releases ({rs}, {re})");
        }
    }

    /// With both ends released the member stays straight between its ends: the condensed
    /// cubic gives exactly the string stiffness N / L on (v1, v2).
    #[test]
    fn both_ends_released_condense_to_the_string_stiffness() {
        let l = 6.0;
        let n = -90.0;
        let t = release_transformation(l, true, true);
        let mut rigid = frame("b", "", 0, 1, 2e8, 0.01, 3e-4);
        let g = Geometry::new(0.0, 0.0, l, 0.0);
        let condensed = t.transpose() * local_geometric_stiffness(&rigid, &g, n) * t;
        rigid.release_start = true;
        rigid.release_end = true;
        let string = local_geometric_stiffness(&rigid, &g, n);
        assert!(close(&condensed, &string), "{condensed}\n{string}");
        assert!((string[(1, 1)] - n / l).abs() < 1e-12 && (string[(1, 4)] + n / l).abs() < 1e-12);
        let bar = truss("t", "", 0, 1, 2e8, 0.01);
        assert!(close(&local_geometric_stiffness(&bar, &g, n), &string));
    }
}
