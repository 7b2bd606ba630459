//! Flexural buckling: the Euler load, the buckling curves of steel members, the
//! instability factor of timber columns, and the second-order rule for concrete members.

use super::materials::{Concrete, Material};
use super::sections::Family;
use serde::{Deserialize, Serialize};

/// A flexural buckling curve of EN 1993-1-1 6.3.1.2 (Table 6.1).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Curve {
    /// Curve a0, imperfection factor 0.13.
    A0,
    /// Curve a, 0.21.
    A,
    /// Curve b, 0.34.
    B,
    /// Curve c, 0.49.
    C,
    /// Curve d, 0.76.
    D,
}

impl Curve {
    /// The imperfection factor alpha of the curve (EN 1993-1-1 Table 6.1): a0 0.13, a 0.21,
    /// b 0.34, c 0.49, d 0.76.
    pub fn imperfection(self) -> f64 {
        match self {
            Curve::A0 => 0.13,
            Curve::A => 0.21,
            Curve::B => 0.34,
            Curve::C => 0.49,
            Curve::D => 0.76,
        }
    }

    /// The curve's name as the standard writes it (`a0`, `a`, `b`, `c`, `d`).
    pub fn name(self) -> &'static str {
        match self {
            Curve::A0 => "a0",
            Curve::A => "a",
            Curve::B => "b",
            Curve::C => "c",
            Curve::D => "d",
        }
    }
}

/// Euler's critical load of a pin-ended strut, pi^2 E I / L^2, kN, for E in kN/m2, I in
/// m4 and the buckling length L in m. Degenerate: a length at or below zero (or not a
/// number) gives infinity: a member with no length does not buckle.
pub fn euler_load(e: f64, i: f64, length: f64) -> f64 {
    if length.is_nan() || length <= 0.0 {
        return f64::INFINITY;
    }
    std::f64::consts::PI.powi(2) * e * i / (length * length)
}

/// The reduction factor chi for flexural buckling on `curve` at the non-dimensional
/// slenderness lambda_bar = sqrt(A f_y / N_cr) (EN 1993-1-1 6.3.1.2 eq. 6.49):
/// Phi = 0.5 (1 + alpha (lambda_bar - 0.2) + lambda_bar^2),
/// chi = 1 / (Phi + sqrt(Phi^2 - lambda_bar^2)) <= 1. For lambda_bar <= 0.2 (and for a
/// slenderness that is not a number) chi = 1: buckling may be ignored (6.3.1.2(4));
/// infinite slenderness gives 0.
pub fn chi(curve: Curve, lambda_bar: f64) -> f64 {
    if lambda_bar.is_nan() || lambda_bar <= 0.2 {
        return 1.0;
    }
    if lambda_bar.is_infinite() {
        return 0.0;
    }
    let phi = 0.5 * (1.0 + curve.imperfection() * (lambda_bar - 0.2) + lambda_bar * lambda_bar);
    (1.0 / (phi + (phi * phi - lambda_bar * lambda_bar).sqrt())).min(1.0)
}

/// Yield strengths above this, kN/m2, are grade S460 for EN 1993-1-1 Table 6.2: the
/// table's hot-finished rows give S235 to S420 curve a and S460 curve a0; S420's nominal
/// f_y is 420 MPa and S460's stays at 430 MPa or more up to 80 mm (EN 1993-1-1 Table 3.1,
/// from memory).
const S460_FROM_FY: f64 = 420_000.0;

/// The buckling curve of a steel family (EN 1993-1-1 Table 6.2, both axes alike):
/// hot-finished hollow sections (CHS, SHS) curve a, or a0 for S460 (f_y above 420 MPa);
/// the welded box curve b, assuming fillet welds of throat a <= 0.5 t_f (the table's
/// thick-weld row, curve c, applies only to welds thicker than that with b/t_f < 30 and
/// h/t_w < 30). Concrete and glulam families have no EN 1993 curve: they get curve d, the
/// most severe, though `resistance` never uses it (it follows their own codes).
pub fn curve_for(family: &Family, material: &Material) -> Curve {
    match (family, material) {
        (Family::Chs { .. } | Family::Shs { .. }, Material::Steel(steel)) => {
            if steel.fy > S460_FROM_FY {
                Curve::A0
            } else {
                Curve::A
            }
        }
        (Family::WeldedBox { .. }, Material::Steel(_)) => Curve::B,
        _ => Curve::D,
    }
}

/// Imperfection factor beta_c of glued laminated timber columns (EN 1995-1-1 eq. 6.29).
pub const GLULAM_BETA_C: f64 = 0.1;

/// The instability factor k_c of a glulam column at the relative slenderness lambda_rel
/// = (lambda / pi) sqrt(f_c,0,k / E_0,05) (EN 1995-1-1 6.3.2 eqs. 6.25-6.29):
/// k = 0.5 (1 + beta_c (lambda_rel - 0.3) + lambda_rel^2), k_c = 1 / (k + sqrt(k^2 -
/// lambda_rel^2)), beta_c = 0.1 for glulam. k_c = 1 for lambda_rel <= 0.3 (6.3.2(2)) and
/// for a slenderness that is not a number; infinite slenderness gives 0.
pub fn glulam_kc(lambda_rel: f64) -> f64 {
    if lambda_rel.is_nan() || lambda_rel <= 0.3 {
        return 1.0;
    }
    if lambda_rel.is_infinite() {
        return 0.0;
    }
    let k = 0.5 * (1.0 + GLULAM_BETA_C * (lambda_rel - 0.3) + lambda_rel * lambda_rel);
    (1.0 / (k + (k * k - lambda_rel * lambda_rel).sqrt())).min(1.0)
}

/// Modulus of elasticity of reinforcing steel E_s, kN/m2 (EN 1992-1-1 3.2.7(4)).
pub const REBAR_E: f64 = 200e6;

/// Factors of the slenderness limit of EN 1992-1-1 5.8.3.1(1), the code's defaults when
/// creep, reinforcement and the moment ratio are not known: A = 0.7 (phi_ef unknown),
/// B = 1.1 (omega unknown), C = 0.7 (r_m unknown).
pub const SLENDERNESS_A: f64 = 0.7;
/// See `SLENDERNESS_A`.
pub const SLENDERNESS_B: f64 = 1.1;
/// See `SLENDERNESS_A`.
pub const SLENDERNESS_C: f64 = 0.7;

/// The curvature distribution factor c of EN 1992-1-1 5.8.8.2(4): 10 (about pi^2) for a
/// constant cross-section.
pub const CURVATURE_FACTOR: f64 = 10.0;

/// What the concrete rule adds to a compressed member's first-order moment.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct SecondOrder {
    /// Slenderness lambda = l0 / i.
    pub slenderness: f64,
    /// The limit lambda_lim = 20 A B C / sqrt(n), n = N_Ed / (A_c f_cd) (EN 1992-1-1
    /// 5.8.3.1); infinity without compression.
    pub limit: f64,
    /// The imperfection eccentricity e_i = l0 / 400, m (EN 1992-1-1 5.2(7), theta_i =
    /// 1/200 over l0 / 2).
    pub imperfection: f64,
    /// The first-order moment with the imperfection, M_0Ed = max(M + N e_i, N e_0) with
    /// e_0 = max(h / 30, 20 mm) (EN 1992-1-1 6.1(4)), kNm.
    pub first_order: f64,
    /// The second-order eccentricity e2 = (1/r) l0^2 / c, m; 0 when lambda <= lambda_lim.
    pub e2: f64,
    /// The design moment M_Ed = M_0Ed + N e2, kNm.
    pub moment: f64,
}

/// The design moment of a compressed reinforced-concrete member, kNm, after EN 1992-1-1:
///
/// - always the geometric imperfection e_i = l0 / 400 (5.2(7)): M_0Ed = M + N e_i, and at
///   least N e_0 with e_0 = max(h / 30, 20 mm) (6.1(4));
/// - second-order effects when lambda = l0 / i exceeds lambda_lim = 20 A B C / sqrt(n)
///   (5.8.3.1 with the default A = 0.7, B = 1.1, C = 0.7; n = N_Ed / (A_c f_cd)), by the
///   nominal curvature method (5.8.8): M2 = N e2, e2 = (1/r) l0^2 / c with c = 10,
///   1/r = K_r K_phi eps_yd / (0.45 d), d = h - cover, eps_yd = f_yd / E_s. K_r = 1
///   (conservative: 5.8.8.3(3) allows K_r <= 1). K_phi = 1 takes no creep (phi_ef = 0):
///   it is not conservative where creep matters (5.8.8.3(4) gives K_phi = 1 + beta
///   phi_ef >= 1); 5.8.4(4) allows phi_ef = 0 only for phi(inf, t0) <= 2, lambda <= 75
///   and M_0Ed / N_Ed >= h.
///
/// Arguments: `depth` h (m) and `radius` i (m) in the direction of bending, gross area
/// A_c (m2), `cover` to the bar centres (m), compression `n_ed` >= 0 (kN), first-order
/// moment magnitude `moment` (kNm), buckling length `l0` (m). Without compression the
/// moment is returned unchanged.
#[allow(clippy::too_many_arguments)]
pub fn concrete_second_order(
    concrete: &Concrete,
    depth: f64,
    area: f64,
    radius: f64,
    cover: f64,
    n_ed: f64,
    moment: f64,
    l0: f64,
) -> SecondOrder {
    let slenderness = l0 / radius;
    let imperfection = l0 / 400.0;
    if n_ed <= 0.0 {
        return SecondOrder {
            slenderness,
            limit: f64::INFINITY,
            imperfection,
            first_order: moment,
            e2: 0.0,
            moment,
        };
    }
    let f_cd = concrete.alpha_cc * concrete.fck / concrete.gamma_c;
    let n = n_ed / (area * f_cd);
    let limit = 20.0 * SLENDERNESS_A * SLENDERNESS_B * SLENDERNESS_C / n.sqrt();
    let least_eccentricity = (depth / 30.0).max(0.020);
    let first_order = (moment + n_ed * imperfection).max(n_ed * least_eccentricity);
    let e2 = if slenderness > limit {
        let eps_yd = concrete.rebar_fyk / concrete.gamma_s / REBAR_E;
        let curvature = eps_yd / (0.45 * (depth - cover));
        curvature * l0 * l0 / CURVATURE_FACTOR
    } else {
        0.0
    };
    SecondOrder { slenderness, limit, imperfection, first_order, e2, moment: first_order + n_ed * e2 }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sizing::materials::material_preset;

    #[test]
    fn chi_falls_with_slenderness_and_with_the_curve() {
        for curve in [Curve::A0, Curve::A, Curve::B, Curve::C, Curve::D] {
            let mut last = 1.0;
            for k in 3..40 {
                let value = chi(curve, 0.1 * k as f64);
                assert!(value < last && value > 0.0, "{curve:?} at {}", 0.1 * k as f64);
                last = value;
            }
        }
        assert!(chi(Curve::A0, 1.0) > chi(Curve::A, 1.0) && chi(Curve::C, 1.0) > chi(Curve::D, 1.0));
        assert_eq!(chi(Curve::B, f64::INFINITY), 0.0);
    }

    #[test]
    fn curves_follow_table_6_2() {
        let chs = Family::Chs { d_over_t: 30.0 };
        let bx = Family::WeldedBox { width_over_depth: 0.6, flange_ratio: 30.0, web_ratio: 30.0 };
        let s355 = material_preset("s355").expect("preset");
        let s460 = material_preset("s460").expect("preset");
        assert_eq!(curve_for(&chs, &s355), Curve::A);
        assert_eq!(curve_for(&chs, &s460), Curve::A0);
        assert_eq!(curve_for(&bx, &s460), Curve::B);
    }

    #[test]
    fn concrete_second_order_only_beyond_the_limit() {
        let Some(Material::Concrete(mut c)) = material_preset("c40-50") else { panic!("concrete") };
        // the values below take EN 1992-1-1's alpha_cc = 1.0 (the preset has the bridges' 0.85)
        c.alpha_cc = 1.0;
        // 1 m square, l0 = 5 m: lambda = 5 / 0.2887 = 17.3; N = 4000 kN, n = 4000 / 26 667 =
        // 0.15, lambda_lim = 10.78 / 0.3873 = 27.8: no second order; e_i = 12.5 mm,
        // M_0Ed = 500 + 50 = 550 kNm
        let r = 1.0 / 12f64.sqrt();
        let stocky = concrete_second_order(&c, 1.0, 1.0, r, 0.06, 4000.0, 500.0, 5.0);
        assert_eq!(stocky.e2, 0.0);
        assert!((stocky.limit - 27.83).abs() < 0.01, "{}", stocky.limit);
        assert!((stocky.moment - 550.0).abs() < 1e-9);
        // no moment: at least N e_0 = 4000 x 1/30 m = 133.3 kNm (6.1(4))
        let least = concrete_second_order(&c, 1.0, 1.0, r, 0.06, 4000.0, 0.0, 5.0);
        assert!((least.moment - 4000.0 / 30.0).abs() < 1e-9);
        // l0 = 20 m: lambda = 69.3 > 27.8; e2 = 0.0021739 / (0.45 x 0.94) x 400 / 10 = 0.2056 m
        let slender = concrete_second_order(&c, 1.0, 1.0, r, 0.06, 4000.0, 500.0, 20.0);
        assert!((slender.e2 - 0.2056).abs() < 1e-4, "{}", slender.e2);
        assert!((slender.moment - (500.0 + 4000.0 * (0.05 + slender.e2))).abs() < 1e-9);
        // without compression nothing is added
        assert_eq!(concrete_second_order(&c, 1.0, 1.0, r, 0.06, 0.0, 500.0, 20.0).moment, 500.0);
    }
}
