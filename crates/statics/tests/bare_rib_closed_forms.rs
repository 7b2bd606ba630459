//! The stiffness solver against handbook closed forms for bare parabolic ribs.
//!
//! Every rib here has a prescribed parabolic shape y = 4 f x (L - x) / L^2 (nodes on the
//! curve, straight frame members between them), loads applied at the rib nodes, and is
//! not form-found, so H = M / f is not an identity. Sources:
//! - [TY] Timoshenko & Young, Theory of Structures, 2nd ed., ch. 9 (arches), from memory;
//! - [R]  Roark's Formulas for Stress and Strain, arch tables, from memory.

use springline_statics::{
    frame, solve, LoadCase, Model, NodalLoad, PrescribedDisplacement, Support, TemperatureLoad,
};
use springline_statics::{Dof, Solution};

const E: f64 = 2.1e8; // kN/m2, steel (EN 1993-1-1 3.2.6)
const ALPHA: f64 = 1.2e-5; // 1/K, steel (EN 1993-1-1 3.2.6)

#[derive(Clone, Copy, PartialEq, Debug)]
enum Ends {
    Pinned,
    Fixed,
    ThreeHinged,
}

struct Rib {
    span: f64,
    rise: f64,
    segments: usize,
    /// Area and inertia at the crown; with `sec_theta` each segment gets A_c sec(theta),
    /// I_c sec(theta) of its own chord (the handbook's assumption).
    area: f64,
    inertia: f64,
    sec_theta: bool,
    ends: Ends,
}

impl Rib {
    fn y(&self, x: f64) -> f64 {
        4.0 * self.rise * x * (self.span - x) / (self.span * self.span)
    }
    fn x(&self, i: usize) -> f64 {
        self.span * i as f64 / self.segments as f64
    }
    fn model(&self) -> Model {
        let mut m = Model { title: "bare parabolic rib".into(), ..Default::default() };
        for i in 0..=self.segments {
            let x = self.x(i);
            m.add_node(format!("R{i}"), x, self.y(x));
        }
        for i in 0..self.segments {
            let (x0, x1) = (self.x(i), self.x(i + 1));
            let sec = if self.sec_theta { (x1 - x0).hypot(self.y(x1) - self.y(x0)) / (x1 - x0) } else { 1.0 };
            let mut mem = frame(&format!("r{i}"), "rib", i, i + 1, E, self.area * sec, self.inertia * sec);
            mem.alpha = ALPHA;
            if self.ends == Ends::ThreeHinged && i + 1 == self.segments / 2 {
                mem.release_end = true;
            }
            m.add_member(mem);
        }
        let last = self.segments;
        match self.ends {
            Ends::Fixed => {
                m.supports.push(Support::fixed(0));
                m.supports.push(Support::fixed(last));
            }
            _ => {
                m.supports.push(Support::pinned(0));
                m.supports.push(Support::pinned(last));
            }
        }
        m
    }
    /// Nodal loads equivalent to a UDL w (kN per horizontal m, downward positive) over
    /// [x0, x1]: each node takes the simple-span reactions of its two adjacent panels.
    fn udl(&self, w: f64, x0: f64, x1: f64) -> Vec<NodalLoad> {
        let dx = self.span / self.segments as f64;
        (0..=self.segments)
            .map(|i| {
                let x = self.x(i);
                let left = (x.min(x1) - (x - dx).max(x0)).max(0.0) * if x > x0 + 1e-12 { 1.0 } else { 0.0 };
                let right = ((x + dx).min(x1) - x.max(x0)).max(0.0) * if x < x1 - 1e-12 { 1.0 } else { 0.0 };
                // panels here are fully loaded or empty, so tributary halves are exact
                NodalLoad { node: i, fx: 0.0, fy: -w * (left + right) / 2.0, mz: 0.0 }
            })
            .filter(|l| l.fy != 0.0)
            .collect()
    }
}

fn solve_case(model: &mut Model, case: LoadCase) -> Solution {
    model.load_cases = vec![case];
    let s = solve(model).expect("stable rib");
    assert!(s.cases[0].equilibrium.relative < 1e-9, "equilibrium {:?}", s.cases[0].equilibrium);
    s
}

/// Horizontal thrust at the left springing (reaction pushing right), kN.
fn thrust(s: &Solution) -> f64 {
    s.cases[0].reactions.iter().find(|r| r.node == 0).expect("left support").fx
}

/// Rib bending moment at node i (sagging positive), from the member ending there.
fn moment_at_node(s: &Solution, i: usize) -> f64 {
    if i == 0 {
        s.cases[0].members[0].start.m
    } else {
        s.cases[0].members[i - 1].end.m
    }
}

/// Factor on A that makes rib shortening negligible: the shortening term
/// 15 I / (8 A f^2) [TY] drops from about 2e-3 (A = 0.2, I = 0.1, f = 20) to 2e-8.
const RIGID_AXIAL: f64 = 1e5;

#[test]
fn parabolic_rib_under_full_udl_has_thrust_wl2_over_8f_and_no_moment() {
    // [TY], [R]: any parabolic arch (two-hinged or fixed) under w per horizontal metre:
    // H = w L^2 / (8 f), V = w L / 2, M = 0 everywhere (shortening neglected).
    for ends in [Ends::Pinned, Ends::Fixed] {
        let rib = Rib {
            span: 120.0,
            rise: 20.0,
            segments: 24,
            area: 0.2 * RIGID_AXIAL,
            inertia: 0.1,
            sec_theta: false,
            ends,
        };
        let w = 150.0;
        let mut m = rib.model();
        let case = LoadCase { name: "udl".into(), nodal: rib.udl(w, 0.0, rib.span), ..Default::default() };
        let s = solve_case(&mut m, case);
        let h = w * rib.span.powi(2) / (8.0 * rib.rise);
        assert!((thrust(&s) - h).abs() < 1e-6 * h, "H = {} vs {h}", thrust(&s));
        let vl = s.cases[0].reaction(0).expect("left").fy;
        // reactions include the half-panel loads applied at the springing nodes
        assert!((vl - w * rib.span / 2.0).abs() < 1e-6 * h, "V = {vl}");
        for i in 0..=rib.segments {
            let mm = moment_at_node(&s, i);
            assert!(mm.abs() < 1e-6 * w * rib.span.powi(2), "{ends:?} node {i}: M = {mm}");
        }
    }
}

/// Two-hinged thrust under full UDL w by the virtual-work (compatibility) equation of
/// [TY] ch. 9 with I = I_c sec, A = A_c sec, axial terms kept:
/// H = [int M0 y dx / I_c - int V0 tan(theta) cos^2(theta) dx / A_c]
///     / [int y^2 dx / I_c + int cos^2(theta) dx / A_c],
/// M0 = w x (L - x) / 2 and V0 = w (L/2 - x) of the simple beam; Simpson's rule.
fn two_hinged_thrust_with_shortening(span: f64, rise: f64, ic: f64, ac: f64, w: f64) -> f64 {
    let n = 2000;
    let h = span / n as f64;
    let (mut num, mut den) = (0.0, 0.0);
    for i in 0..=n {
        let x = i as f64 * h;
        let wgt = if i == 0 || i == n {
            1.0
        } else if i % 2 == 1 {
            4.0
        } else {
            2.0
        };
        let y = 4.0 * rise * x * (span - x) / span.powi(2);
        let tan = 4.0 * rise * (span - 2.0 * x) / span.powi(2);
        let cos2 = 1.0 / (1.0 + tan * tan);
        let m0 = w * x * (span - x) / 2.0;
        let v0 = w * (span / 2.0 - x);
        num += wgt * (m0 * y / ic - v0 * tan * cos2 / ac);
        den += wgt * (y * y / ic + cos2 / ac);
    }
    num / den
}

#[test]
fn rib_shortening_reduces_two_hinged_thrust_as_the_handbook_says() {
    // A realistic EA: A_c = 0.1 m2, I_c = 0.2 m4 (a deep box), L = 100 m, f = 10 m.
    // Flat-arch formula [TY]: H = H0 / (1 + 15 I_c / (8 A_c f^2)); it
    // takes cos(theta) = 1, which at rise/span 1/10 overstates the reduction by a few
    // per cent, so it is checked to 10 % of the reduction; the same integrals with the
    // cos^2 term kept are checked to 2 % (24 straight segments for the curve).
    let rib = Rib {
        span: 100.0,
        rise: 10.0,
        segments: 24,
        area: 0.1,
        inertia: 0.2,
        sec_theta: true,
        ends: Ends::Pinned,
    };
    let w = 100.0;
    let mut m = rib.model();
    let s = solve_case(
        &mut m,
        LoadCase { name: "udl".into(), nodal: rib.udl(w, 0.0, rib.span), ..Default::default() },
    );
    let h0 = w * rib.span.powi(2) / (8.0 * rib.rise);
    let h = thrust(&s);
    let flat = h0 / (1.0 + 15.0 * rib.inertia / (8.0 * rib.area * rib.rise.powi(2)));
    let kept = two_hinged_thrust_with_shortening(rib.span, rib.rise, rib.inertia, rib.area, w);
    let reduction = h0 - h;
    assert!(reduction > 0.0);
    assert!(((h0 - flat) - reduction).abs() < 0.10 * reduction, "flat: {} vs {}", h0 - flat, reduction);
    assert!(((h0 - kept) - reduction).abs() < 0.02 * reduction, "kept: {} vs {}", h0 - kept, reduction);
}

#[test]
fn three_hinged_rib_point_load_gives_statics_reactions_and_crown_force() {
    // [TY] three-hinged arch, P at a <= L/2: V_A = P (L - a) / L, V_B = P a / L,
    // H = V_B (L / 2) / f; the crown hinge passes (H, V_B) between the halves.
    let rib = Rib {
        span: 80.0,
        rise: 16.0,
        segments: 16,
        area: 0.15,
        inertia: 0.05,
        sec_theta: false,
        ends: Ends::ThreeHinged,
    };
    let p = 500.0;
    let node = 5; // a = 25 m
    let a = rib.x(node);
    let mut m = rib.model();
    let s = solve_case(
        &mut m,
        LoadCase {
            name: "point".into(),
            nodal: vec![NodalLoad { node, fx: 0.0, fy: -p, mz: 0.0 }],
            ..Default::default()
        },
    );
    let va = p * (rib.span - a) / rib.span;
    let vb = p * a / rib.span;
    let h = vb * (rib.span / 2.0) / rib.rise;
    let ra = s.cases[0].reaction(0).expect("A");
    let rb = s.cases[0].reaction(rib.segments).expect("B");
    let tol = 1e-9 * p;
    assert!((ra.fy - va).abs() < tol && (rb.fy - vb).abs() < tol);
    assert!((ra.fx - h).abs() < tol && (rb.fx + h).abs() < tol);
    // the first member of the right half, at the crown: the node pushes it with (H, -V_B)
    let crown_member = &s.cases[0].members[rib.segments / 2];
    let f = crown_member.end_actions_global;
    assert!((f[0] - h).abs() < tol && (f[1] + vb).abs() < tol, "crown force {f:?}");
    assert!(f[2].abs() < tol * rib.span, "hinge moment {}", f[2]);
}

#[test]
fn two_hinged_rib_half_span_load_matches_handbook_h_and_quarter_point_moments() {
    // [TY]: two-hinged parabolic rib, I = I_c sec(theta), shortening
    // neglected, UDL w on the left half: H = w L^2 / (16 f), M(L/4) = +w L^2 / 64,
    // M(3L/4) = -w L^2 / 64. With each straight segment given I_c sec(theta) of its own
    // chord the polygon reproduces the curve's integrals closely: measured error of the
    // quarter-point moments 7.04e-6 (n = 32) and 7.03e-6 (n = 64) of w L^2 / 64, which is
    // the shortening left by A = 1e3 x realistic (15 I / (8 A f^2) = 2.3e-6, [TY]); a
    // stiffer EA only adds rounding. Checked to 2e-5 at both n.
    let mut errors = Vec::new();
    for segments in [32, 64] {
        let rib = Rib {
            span: 100.0,
            rise: 20.0,
            segments,
            area: 0.2 * 1e3,
            inertia: 0.1,
            sec_theta: true,
            ends: Ends::Pinned,
        };
        let w = 80.0;
        let mut m = rib.model();
        let s = solve_case(
            &mut m,
            LoadCase { name: "half".into(), nodal: rib.udl(w, 0.0, rib.span / 2.0), ..Default::default() },
        );
        let h = w * rib.span.powi(2) / (16.0 * rib.rise);
        let mq = w * rib.span.powi(2) / 64.0;
        let m1 = moment_at_node(&s, segments / 4);
        let m3 = moment_at_node(&s, 3 * segments / 4);
        assert!((thrust(&s) - h).abs() < 1e-3 * h, "n={segments}: H = {} vs {h}", thrust(&s));
        errors.push(((m1 - mq).abs() / mq).max((m3 + mq).abs() / mq));
    }
    assert!(errors[1] < 1e-4, "quarter-point error at n = 64: {}", errors[1]);
    assert!(errors.iter().all(|e| *e < 2e-5), "quarter-point errors {errors:?}");
}

#[test]
fn temperature_and_spread_on_two_hinged_rib_match_closed_form_thrust() {
    // [TY] ch. 9, two-hinged parabolic arch, I = I_c sec(theta), shortening neglected:
    // temperature rise dT: H_t = 15 E I_c alpha dT / (8 f^2) (more thrust);
    // springings spread apart by d: H_d = 15 E I_c d / (8 f^2 L) (less thrust).
    // 64 straight segments: the integral of y^2 is within 1e-3 of 8 f^2 L / 15.
    let rib = Rib {
        span: 100.0,
        rise: 20.0,
        segments: 64,
        area: 0.2 * RIGID_AXIAL,
        inertia: 0.1,
        sec_theta: true,
        ends: Ends::Pinned,
    };
    let dt = 30.0;
    let spread = 0.02;
    let mut m = rib.model();
    let temp = LoadCase {
        name: "warm".into(),
        temperature: (0..rib.segments).map(|k| TemperatureLoad { member: k, delta_t: dt }).collect(),
        ..Default::default()
    };
    let s = solve_case(&mut m, temp);
    let ht = 15.0 * E * rib.inertia * ALPHA * dt / (8.0 * rib.rise.powi(2));
    assert!((thrust(&s) - ht).abs() < 1e-3 * ht, "H_t = {} vs {ht}", thrust(&s));
    let sp = LoadCase {
        name: "spread".into(),
        prescribed: vec![
            PrescribedDisplacement { node: 0, dof: Dof::X, value: -spread / 2.0 },
            PrescribedDisplacement { node: rib.segments, dof: Dof::X, value: spread / 2.0 },
        ],
        ..Default::default()
    };
    let s = solve_case(&mut m, sp);
    let hd = 15.0 * E * rib.inertia * spread / (8.0 * rib.rise.powi(2) * rib.span);
    assert!((thrust(&s) + hd).abs() < 1e-3 * hd, "H_d = {} vs {}", thrust(&s), -hd);
}

#[test]
fn three_hinged_rib_takes_no_force_from_temperature_or_spread() {
    // A three-hinged arch is statically determinate: imposed strains and support
    // movements cause no forces (statics; [TY] ch. 9).
    let rib = Rib {
        span: 100.0,
        rise: 20.0,
        segments: 16,
        area: 0.2,
        inertia: 0.1,
        sec_theta: false,
        ends: Ends::ThreeHinged,
    };
    let mut m = rib.model();
    let scale = E * 0.2 * ALPHA * 30.0; // E A times the imposed strain, kN
    for case in [
        LoadCase {
            name: "warm".into(),
            temperature: (0..rib.segments).map(|k| TemperatureLoad { member: k, delta_t: 30.0 }).collect(),
            ..Default::default()
        },
        LoadCase {
            name: "spread".into(),
            prescribed: vec![PrescribedDisplacement { node: rib.segments, dof: Dof::X, value: 0.05 }],
            ..Default::default()
        },
    ] {
        let s = solve_case(&mut m, case);
        for mf in &s.cases[0].members {
            for f in [mf.start, mf.end] {
                assert!(
                    f.n.abs() < 1e-9 * scale && f.v.abs() < 1e-9 * scale && f.m.abs() < 1e-9 * scale * 100.0
                );
            }
        }
        for r in &s.cases[0].reactions {
            assert!(r.fx.abs() < 1e-9 * scale && r.fy.abs() < 1e-9 * scale);
        }
    }
}
