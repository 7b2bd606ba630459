//! The sizing leaf against outside values: buckling reduction factors as tabulated,
//! hot-finished hollow sections as tabulated in EN 10210-2, and members worked by hand
//! (each worked in its comment, step by step, from the clauses named).
//!
//! Units: m, kN, kNm, kN/m2 (MPa written where a hand calculation is in N and mm).

use springline_statics::sizing::buckling::{chi, euler_load, glulam_kc, Curve};
use springline_statics::sizing::materials::{material_preset, Material};
use springline_statics::sizing::resistance::{check, size_member, Demand, Lengths, Mode, RcRectangle, Void};
use springline_statics::sizing::sections::Family;

/// `actual` within `relative` of `expected`.
fn close(actual: f64, expected: f64, relative: f64, what: &str) {
    assert!(
        (actual - expected).abs() <= relative * expected.abs(),
        "{what}: {actual} is not within {relative} of {expected}"
    );
}

/// Three significant figures: within half a unit of the third figure.
fn three_figures(actual: f64, expected: f64, what: &str) {
    let unit = 10f64.powf(expected.abs().log10().floor() - 2.0);
    assert!(
        (actual - expected).abs() <= 0.5 * unit,
        "{what}: {actual} does not round to {expected} (3 s.f.)"
    );
}

fn preset(key: &str) -> Material {
    material_preset(key).unwrap_or_else(|| panic!("preset {key} exists"))
}

/// GL28h with k_mod 0.8 (service class 1 or 2, medium-term), as the hand calculation
/// below takes it (the preset's is 0.55, service class 3).
fn gl28h_medium_term() -> Material {
    match preset("gl28h") {
        Material::Glulam(g) => {
            Material::Glulam(springline_statics::sizing::materials::Glulam { k_mod: 0.8, ..g })
        }
        other => other,
    }
}

/// C40/50 with alpha_cc 1.0 (EN 1992-1-1 3.1.6(1)), as the hand calculation below takes
/// it (the preset's is the bridges' 0.85 of EN 1992-2).
fn c40_50_alpha_1() -> Material {
    match preset("c40-50") {
        Material::Concrete(c) => {
            Material::Concrete(springline_statics::sizing::materials::Concrete { alpha_cc: 1.0, ..c })
        }
        other => other,
    }
}

fn mode(check: &springline_statics::sizing::resistance::Check, wanted: Mode) -> f64 {
    check
        .modes
        .iter()
        .find(|(m, _)| *m == wanted)
        .map(|(_, u)| *u)
        .unwrap_or_else(|| panic!("{wanted:?} checked"))
}

#[test]
fn chi_matches_the_tabulated_reduction_factors() {
    // The reduction factors chi of the flexural buckling curves as tabulated (ENV 1993-1-1
    // Table 5.5.2, the same curves as EN 1993-1-1 Figure 6.4; from memory), to 4 places.
    let table = [
        (Curve::A, 0.3, 0.9775),
        (Curve::A, 0.5, 0.9243),
        (Curve::A, 1.0, 0.6656),
        (Curve::B, 0.5, 0.8842),
        (Curve::B, 1.0, 0.5970),
        (Curve::B, 1.5, 0.3422),
        (Curve::C, 0.3, 0.9491),
        (Curve::C, 0.8, 0.6622),
        (Curve::C, 1.2, 0.4338),
        (Curve::D, 0.4, 0.8504),
        (Curve::D, 0.7, 0.6431),
        (Curve::D, 1.0, 0.4671),
        // curve a0 (EN 1993-1-1 only), from memory of the published a0 column
        (Curve::A0, 1.0, 0.7253),
    ];
    for (curve, lambda, tabulated) in table {
        close(chi(curve, lambda), tabulated, 0.0006, &format!("chi on curve {} at {lambda}", curve.name()));
    }
    // the plateau: 6.3.1.2(4), buckling ignored up to lambda_bar 0.2
    assert_eq!(chi(Curve::D, 0.2), 1.0);
    assert_eq!(chi(Curve::A0, 0.1), 1.0);
}

#[test]
fn euler_load_of_a_pinned_column() {
    // pi^2 E I / L^2 for E = 210 GPa, I = 1e-4 m4 (1e8 mm4), L = 5 m:
    // 9.8696 x 210 000 N/mm2 x 1e8 mm4 / 5000^2 mm2 = 8.2905e6 N = 8290.5 kN
    close(euler_load(210e6, 1e-4, 5.0), 8290.5, 1e-4, "N_cr");
    // twice as long, a quarter of the load
    close(euler_load(210e6, 1e-4, 10.0), 8290.5 / 4.0, 1e-4, "N_cr at 10 m");
}

#[test]
fn glulam_kc_worked() {
    // EN 1995-1-1 eqs. 6.27-6.29 worked by hand at lambda_rel = 1.0, beta_c = 0.1:
    // k = 0.5 (1 + 0.1 x 0.7 + 1.0) = 1.035; sqrt(1.035^2 - 1) = sqrt(0.071225) = 0.26688;
    // k_c = 1 / (1.035 + 0.26688) = 0.7681
    close(glulam_kc(1.0), 0.7681, 2e-4, "k_c at 1.0");
    // at 2.0: k = 0.5 (1 + 0.17 + 4) = 2.585; sqrt(2.585^2 - 4) = sqrt(2.682225) = 1.63775;
    // k_c = 1 / 4.22275 = 0.2368
    close(glulam_kc(2.0), 0.2368, 2e-4, "k_c at 2.0");
    assert_eq!(glulam_kc(0.3), 1.0, "6.3.2(2): no reduction up to 0.3");
}

#[test]
fn chs_323_9_x_10_as_tabulated() {
    // EN 10210-2 tabulated properties of CHS 323.9 x 10 (from memory): A = 98.6 cm2,
    // I = 12 160 cm4, W_el = 751 cm3, i = 11.1 cm.
    let p = Family::Chs { d_over_t: 32.39 }.props(0.3239);
    assert_eq!(p.thickness, Some(0.010), "t = 323.9 / 32.39 = 10 mm, not rounded up to 11");
    three_figures(p.a * 1e4, 98.6, "A cm2");
    close(p.i * 1e8, 12_160.0, 0.0005, "I cm4");
    three_figures(p.w_el * 1e6, 751.0, "W_el cm3");
    three_figures(p.radius_in * 100.0, 11.1, "i cm");
    assert_eq!(p.i, p.i_out);
    assert_eq!(Family::Chs { d_over_t: 32.39 }.label(0.3239), "CHS 323.9 x 10");
}

#[test]
fn shs_as_tabulated() {
    // EN 10210-2 tabulated properties of hot-finished SHS (corner radii 1.5 t outside,
    // 1.0 t inside), from memory:
    // 200 x 200 x 10: A = 74.9 cm2, I = 4470 cm4, W_el = 447 cm3, i = 7.72 cm;
    // 300 x 300 x 10: A = 115 cm2, I = 16 000 cm4, W_el = 1070 cm3, i = 11.8 cm.
    let shs = Family::Shs { b_over_t: 20.0 };
    let p = shs.props(0.2);
    three_figures(p.a * 1e4, 74.9, "A cm2");
    three_figures(p.i * 1e8, 4470.0, "I cm4");
    three_figures(p.w_el * 1e6, 447.0, "W_el cm3");
    three_figures(p.radius_in * 100.0, 7.72, "i cm");
    let p = Family::Shs { b_over_t: 30.0 }.props(0.3);
    three_figures(p.a * 1e4, 115.0, "A cm2");
    three_figures(p.i * 1e8, 16_000.0, "I cm4");
    three_figures(p.w_el * 1e6, 1070.0, "W_el cm3");
    three_figures(p.radius_in * 100.0, 11.8, "i cm");
    assert_eq!(shs.label(0.2), "SHS 200 x 200 x 10");
}

#[test]
fn welded_box_by_hand() {
    // Box 1600 deep x 960 wide, flanges 28 mm (960 / 34.2857), webs 18 mm (1600 / 88.889),
    // webs between the flanges. By hand, in mm:
    // A = 2 x 960 x 28 + 2 x 18 x (1600 - 56) = 53 760 + 55 584 = 109 344 mm2
    // I = (960 x 1600^3 - 924 x 1544^3) / 12 = (3.93216e12 - 3.401057e12) / 12 = 4.42586e10 mm4
    // I_out = (1600 x 960^3 - 1544 x 924^3) / 12 = (1.415578e12 - 1.218046e12) / 12 = 1.64610e10 mm4
    // W_el = 2 I / 1600 = 5.53232e7 mm3
    let family =
        Family::WeldedBox { width_over_depth: 0.6, flange_ratio: 960.0 / 28.0, web_ratio: 1600.0 / 18.0 };
    let p = family.props(1.6);
    close(p.a, 0.109_344, 1e-9, "A m2");
    close(p.i, 0.044_258_6, 1e-5, "I m4");
    close(p.i_out, 0.016_461_0, 1e-5, "I_out m4");
    close(p.w_el, 0.055_323_2, 1e-5, "W_el m3");
    assert_eq!(family.label(1.6), "box 1600 x 960 (t 28/18)");
}

#[test]
fn tension_member_s355_by_hand() {
    // SHS 200 x 200 x 10 in S355 carrying 2000 kN tension (EN 1993-1-1 6.2.3):
    // A = 7493 mm2 (EN 10210-2 formula, as above: 74.9 cm2)
    // N_t,Rd = A f_y / gamma_M0 = 7493 x 355 / 1.00 = 2.660e6 N = 2660 kN
    // utilisation = 2000 / 2660 = 0.752
    let c = check(
        &preset("s355"),
        &Family::Shs { b_over_t: 20.0 },
        &Family::Shs { b_over_t: 20.0 }.props(0.2),
        &Demand { tension: 2000.0, compression: 0.0, moment: 0.0, least_compression: 0.0 },
        &Lengths { in_plane: 5.0, out_of_plane: 5.0 },
    )
    .expect("checks");
    three_figures(c.utilisation, 0.752, "tension utilisation");
    assert_eq!(c.governs, Mode::Tension);
}

#[test]
fn chs_column_s355_by_hand() {
    // CHS 323.9 x 10 in S355, pinned, 6 m both ways, 2000 kN compression (EN 1993-1-1
    // 6.3.1):
    // A = pi/4 (323.9^2 - 303.9^2) = 9861 mm2; N_Rk = A f_y = 3501 kN
    // I = pi/64 (323.9^4 - 303.9^4) = 1.2158e8 mm4;
    // N_cr = pi^2 x 210 000 x 1.2158e8 / 6000^2 = 7.000e6 N = 7000 kN
    // lambda_bar = sqrt(3501 / 7000) = 0.7072; hot-finished S355: curve a, alpha = 0.21
    // Phi = 0.5 (1 + 0.21 (0.7072 - 0.2) + 0.7072^2) = 0.8033
    // chi = 1 / (0.8033 + sqrt(0.8033^2 - 0.7072^2)) = 0.8443
    // N_b,Rd = chi A f_y / gamma_M1 = 0.8443 x 3501 / 1.10 = 2687 kN; utilisation 2000 / 2687 = 0.744
    let family = Family::Chs { d_over_t: 32.39 };
    let c = check(
        &preset("s355"),
        &family,
        &family.props(0.3239),
        &Demand { tension: 0.0, compression: 2000.0, moment: 0.0, least_compression: 0.0 },
        &Lengths { in_plane: 6.0, out_of_plane: 6.0 },
    )
    .expect("checks");
    three_figures(c.n_cr_in, 7000.0, "N_cr");
    three_figures(c.slenderness_in, 0.707, "lambda_bar");
    three_figures(c.chi_in, 0.844, "chi");
    three_figures(c.utilisation, 0.744, "utilisation");
    assert!(matches!(c.governs, Mode::InPlaneBuckling | Mode::OutOfPlaneBuckling));
}

#[test]
fn welded_box_rib_under_n_and_m_by_hand() {
    // Box 1000 deep x 600 wide, flanges 20 mm, webs 30 mm, S355; N = 12 000 kN with
    // M = 2500 kNm; buckling lengths 20 m in the plane, 12 m out of it.
    // Class (EN 1993-1-1 Table 5.2, eps = sqrt(235/355) = 0.8136, 42 eps = 34.2):
    //   flanges (600 - 60) / 20 = 27.0, webs (1000 - 40) / 30 = 32.0: class 3 at worst.
    // A = 600 x 1000 - 540 x 960 = 81 600 mm2; N_Rk = 81 600 x 355 = 28 968 kN
    // I_y = (600 x 1000^3 - 540 x 960^3) / 12 = 1.01869e10 mm4; W_el = 2.03738e7 mm3;
    //   M_Rk = W_el f_y = 7232.7 kNm
    // I_z = (1000 x 600^3 - 960 x 540^3) / 12 = 5.40288e9 mm4
    // N_cr,y = pi^2 x 210 000 x 1.01869e10 / 20 000^2 = 52 784 kN; lambda_y = sqrt(28 968 / 52 784) = 0.7408
    // N_cr,z = pi^2 x 210 000 x 5.40288e9 / 12 000^2 = 77 765 kN; lambda_z = 0.6103
    // welded box, curve b (alpha 0.34): chi_y = 0.7602, chi_z = 0.8318
    // n_y = N / (chi_y N_Rk / gamma_M1) = 12 000 / (0.7602 x 28 968 / 1.1) = 0.5994
    // k_yy = 1 + 0.6 x 0.7408 x 0.5994 = 1.2664 (below 1 + 0.6 x 0.5994 = 1.3597); k_zy = 0.8 k_yy = 1.0132
    // eq. 6.61: 0.5994 + 1.2664 x 2500 / (7232.7 / 1.1) = 0.5994 + 0.4815 = 1.081
    // eq. 6.62: 12 000 / (0.8318 x 28 968 / 1.1) + 1.0132 x 2500 / 6575.2 = 0.5478 + 0.3852 = 0.933
    // utilisation 1.081 (compression and bending, eq. 6.61)
    let family = Family::WeldedBox { width_over_depth: 0.6, flange_ratio: 30.0, web_ratio: 1000.0 / 30.0 };
    let props = family.props(1.0);
    assert_eq!(family.label(1.0), "box 1000 x 600 (t 20/30)");
    let c = check(
        &preset("s355"),
        &family,
        &props,
        &Demand { tension: 0.0, compression: 12_000.0, moment: 2500.0, least_compression: 0.0 },
        &Lengths { in_plane: 20.0, out_of_plane: 12.0 },
    )
    .expect("checks");
    three_figures(c.chi_in, 0.760, "chi_y");
    three_figures(c.chi_out, 0.832, "chi_z");
    three_figures(mode(&c, Mode::InPlaneBuckling), 0.599, "in-plane buckling");
    three_figures(mode(&c, Mode::Interaction), 1.08, "interaction");
    three_figures(c.utilisation, 1.08, "utilisation");
    assert_eq!(c.governs, Mode::Interaction);
    // the webs' c/t 32.0 against 34.2
    three_figures(mode(&c, Mode::Class), 32.0 / 34.17, "class ratio");
}

#[test]
fn glulam_column_by_hand() {
    // GL28h (EN 14080: f_c,0,k = f_m,k = 28 MPa, E_0,05 = 10 500 MPa), 600 deep x 240 wide,
    // N = 800 kN, M = 50 kNm in the plane, lengths 12 m in the plane, 5 m out of it;
    // k_mod 0.8, gamma_M 1.25: f_c,0,d = f_m,d = 0.8 x 28 / 1.25 = 17.92 MPa.
    // A = 0.144 m2, W = 0.24 x 0.6^2 / 6 = 0.0144 m3; i_y = 0.6 / sqrt(12) = 0.17321 m, i_z = 0.069282 m
    // lambda_rel,y = 12 / 0.17321 / pi x sqrt(28 / 10 500) = 69.28 / pi x 0.051640 = 1.1388
    // lambda_rel,z = 5 / 0.069282 / pi x 0.051640 = 1.1863
    // k_y = 0.5 (1 + 0.1 (1.1388 - 0.3) + 1.1388^2) = 1.1904; k_c,y = 1 / (1.1904 + sqrt(1.1904^2 - 1.1388^2)) = 0.6506
    // k_z = 0.5 (1 + 0.1 x 0.8863 + 1.1863^2) = 1.2480; k_c,z = 0.6115
    // sigma_c = 800 / 0.144 = 5.556 MPa; sigma_m = 50 / 0.0144 = 3.472 MPa
    // eq. 6.23: 5.556 / (0.6506 x 17.92) + 3.472 / 17.92 = 0.4765 + 0.1938 = 0.670
    // eq. 6.24: 5.556 / (0.6115 x 17.92) + 0.7 x 3.472 / 17.92 = 0.5070 + 0.1356 = 0.643
    let family = Family::GlulamRect { width_over_depth: 0.4 };
    let c = check(
        &gl28h_medium_term(),
        &family,
        &family.props(0.6),
        &Demand { tension: 0.0, compression: 800.0, moment: 50.0, least_compression: 0.0 },
        &Lengths { in_plane: 12.0, out_of_plane: 5.0 },
    )
    .expect("checks");
    three_figures(c.slenderness_in, 1.14, "lambda_rel,y");
    three_figures(c.chi_in, 0.651, "k_c,y");
    three_figures(c.chi_out, 0.611, "k_c,z");
    three_figures(c.utilisation, 0.670, "utilisation");
    assert_eq!(c.governs, Mode::Interaction);
    assert_eq!(family.label(0.6), "glulam 600 x 240");
}

#[test]
fn concrete_rib_section_by_hand() {
    // C40/50 rib 800 x 800, 2 % reinforcement (A_s = 12 800 mm2, half at each face), bars
    // 60 mm from the faces, N = 4000 kN with M = 2200 kNm, l0 = 10 m both ways.
    // f_cd = 1.0 x 40 / 1.5 = 26.67 MPa; f_yd = 500 / 1.15 = 434.8 MPa; eps_yd = 2.174 per mille
    // Imperfection (EN 1992-1-1 5.2(7)): e_i = 10 / 400 = 25 mm; M_0Ed = 2200 + 4000 x 0.025 = 2300 kNm
    //   (above N e_0 = 4000 x max(800/30, 20) mm = 107 kNm, 6.1(4))
    // Slenderness (5.8.3.1): lambda = 10 / (0.8 / sqrt 12) = 43.3; n = 4000 / (0.64 x 26 667) = 0.2344;
    //   lambda_lim = 20 x 0.7 x 1.1 x 0.7 / sqrt(0.2344) = 22.3 < 43.3: second order
    // Nominal curvature (5.8.8): 1/r = 0.002174 / (0.45 x 0.74) = 0.006528 /m;
    //   e2 = 0.006528 x 10^2 / 10 = 65.3 mm; M2 = 261.1 kNm; M_Ed = 2561.1 kNm; e = M_Ed / N = 0.6403 m
    // The diagram's point on the ray (3.1.7(3): block 0.8 x, 26.67 MPa), with both layers
    // yielded (checked below), so their forces cancel in N:
    //   N_R = 0.8 x b f_cd = 17 067 x [kN]; M_R = N_R (0.4 - 0.4 x) + A_s f_yd x 0.34 = N_R (0.4 - 0.4 x) + 1892.2
    //   M_R = e N_R: 6826.7 x^2 + 17 067 (0.6403 - 0.4) x - 1892.2 = 0 -> x = 0.3058 m
    //   strains: top bars 3.5 (305.8 - 60) / 305.8 = 2.81, bottom 3.5 (740 - 305.8) / 305.8 = 4.97 per mille,
    //   both beyond 2.174: yielded as assumed
    //   N_R = 17 067 x 0.3058 = 5218 kN; utilisation 4000 / 5218 = 0.767
    // The moment is also taken without axial force (the demand has no tension, and the
    // envelope does not say which N goes with M): N = 0 needs
    //   0.8 x b f_cd x + 4480 (x - 0.06) / x - 2782.6 = 0 (top bars elastic, E_s eps A_s/2;
    //   bottom bars yielded, A_s/2 f_yd) -> 17 067 x^2 + 1697.4 x - 268.8 = 0 -> x = 85.3 mm
    //   (top bars at 1.04 per mille, elastic as assumed); C = 1455 kN, top bars 1328 kN,
    //   bottom bars -2783 kN; M_R = 1455 (0.4 - 0.0341) + 1328 x 0.34 + 2783 x 0.34 = 1930 kNm
    //   utilisation 2200 / 1930 = 1.14, which governs
    let family = Family::ConcreteRect { width_over_depth: 1.0, reinforcement_ratio: 0.02, cover: 0.06 };
    let c = check(
        &c40_50_alpha_1(),
        &family,
        &family.props(0.8),
        &Demand { tension: 0.0, compression: 4000.0, moment: 2200.0, least_compression: 0.0 },
        &Lengths { in_plane: 10.0, out_of_plane: 10.0 },
    )
    .expect("checks");
    three_figures(c.slenderness_in, 43.3, "lambda");
    three_figures(c.design_moment, 2560.0, "M_Ed");
    three_figures(mode(&c, Mode::Interaction), 0.767, "interaction");
    three_figures(mode(&c, Mode::Bending), 1.14, "bending without axial force");
    three_figures(c.utilisation, 1.14, "utilisation");
    assert_eq!(c.governs, Mode::Bending);
    assert_eq!(family.label(0.8), "concrete 800 x 800");
    // A rib never in tension keeps at least some compression: told that 4000 kN always
    // acts, the moment alone is checked with it (the diagram bulges out with compression:
    // 2200 kNm with 4000 kN lies inside it), and the interaction above governs.
    let c = check(
        &c40_50_alpha_1(),
        &family,
        &family.props(0.8),
        &Demand { tension: 0.0, compression: 4000.0, moment: 2200.0, least_compression: 4000.0 },
        &Lengths { in_plane: 10.0, out_of_plane: 10.0 },
    )
    .expect("checks");
    assert!(mode(&c, Mode::Bending) < 0.767, "{:?}", c.modes);
    assert_eq!(c.governs, Mode::Interaction);
    three_figures(c.utilisation, 0.767, "utilisation with the compression that always acts");
}

#[test]
fn size_member_returns_the_smallest_passing_size() {
    let steel = preset("s355");
    let family = Family::Chs { d_over_t: 40.0 };
    let demand = Demand { tension: 0.0, compression: 2000.0, moment: 0.0, least_compression: 0.0 };
    let lengths = Lengths { in_plane: 6.0, out_of_plane: 6.0 };
    let sized = size_member(&steel, &family, &demand, &lengths).expect("a CHS carries 2000 kN over 6 m");
    assert!(sized.check.utilisation <= 1.0);
    let (smallest, _, step) = family.sizes();
    assert!(sized.size > smallest, "the demand is not trivial");
    let below = family.props(sized.size - step);
    let failing = check(&steel, &family, &below, &demand, &lengths).expect("checks");
    assert!(failing.utilisation > 1.0, "the next size down fails: {}", failing.utilisation);
    assert_eq!(sized.label, family.label(sized.size));
}

#[test]
fn size_member_refuses_what_no_size_carries() {
    let demand = Demand { tension: 0.0, compression: 1e7, moment: 0.0, least_compression: 0.0 };
    let lengths = Lengths { in_plane: 30.0, out_of_plane: 30.0 };
    let err = size_member(&preset("s355"), &Family::Shs { b_over_t: 25.0 }, &demand, &lengths)
        .expect_err("10 million kN is beyond any SHS");
    assert!(err.contains("even the largest"), "{err}");
    assert!(err.contains("SHS 500 x 500"), "names the largest size: {err}");
    assert!(err.contains("buckling"), "names the mode: {err}");
}

#[test]
fn size_member_refuses_walls_beyond_class_3() {
    // CHS D/t = 70 in S355: EN 1993-1-1 Table 5.2 allows 90 eps^2 = 90 x 235/355 = 59.6
    let demand = Demand { tension: 0.0, compression: 100.0, moment: 0.0, least_compression: 0.0 };
    let lengths = Lengths { in_plane: 3.0, out_of_plane: 3.0 };
    let err = size_member(&preset("s355"), &Family::Chs { d_over_t: 70.0 }, &demand, &lengths)
        .expect_err("class 4 walls are refused");
    assert!(err.contains("D/t is 70.0"), "{err}");
    assert!(err.contains("90 eps^2 = 59.6"), "{err}");
    // the same tube in S235 (limit 90) is fine
    assert!(size_member(&preset("s235"), &Family::Chs { d_over_t: 70.0 }, &demand, &lengths).is_ok());
}

/// The box of the hand calculations below: C40/50 (alpha_cc 1.0), 2000 deep x 3000 wide,
/// walls 0.15 x 2000 = 300 mm, 1 % bars 80 mm from the faces.
fn hand_box() -> Family {
    Family::ConcreteBox {
        width_over_depth: 1.5,
        wall_over_depth: 0.15,
        reinforcement_ratio: 0.01,
        cover: 0.08,
    }
}

#[test]
fn concrete_box_properties_by_hand() {
    // 2000 x 3000, t = 300 mm: void 1400 x 2400
    // A_c = 2.0 x 3.0 - 1.4 x 2.4 = 6.0 - 3.36 = 2.64 m2; A_s = 0.01 x 2.64 = 0.0264 m2
    // I = (3.0 x 2.0^3 - 2.4 x 1.4^3) / 12 = (24 - 6.5856) / 12 = 1.4512 m4
    // I_out = (2.0 x 3.0^3 - 1.4 x 2.4^3) / 12 = (54 - 19.3536) / 12 = 2.8872 m4
    // W = 2 I / h = 1.4512 m3
    let p = hand_box().props(2.0);
    close(p.a, 2.64, 1e-12, "A_c");
    close(p.steel_area_rebar.unwrap_or(f64::NAN), 0.0264, 1e-12, "A_s");
    close(p.i, 1.4512, 1e-12, "I");
    close(p.i_out, 2.8872, 1e-12, "I_out");
    close(p.w_el, 1.4512, 1e-12, "W");
    assert_eq!(p.thickness, Some(0.3));
    assert_eq!(hand_box().label(2.0), "concrete box 2000 x 3000 (t 300)");
    // the preset (width 2 x depth, walls 0.12 x depth, 1.5 %) at 5000: 5000 x 10 000, t 600
    // A_c = 50 - 8.8 x 3.8 = 50 - 33.44 = 16.56 m2; A_s = 0.015 x 16.56 = 0.2484 m2
    // I = (10 x 125 - 8.8 x 3.8^3) / 12 = (1250 - 482.8736) / 12 = 63.9272 m4
    // I_out = (5 x 1000 - 3.8 x 8.8^3) / 12 = (5000 - 2589.5936) / 12 = 200.8672 m4
    let preset = Family::family_presets()
        .into_iter()
        .find(|(k, _)| *k == "concrete-box")
        .map(|(_, f)| f)
        .expect("concrete-box preset");
    let p = preset.props(5.0);
    close(p.a, 16.56, 1e-12, "preset A_c");
    close(p.steel_area_rebar.unwrap_or(f64::NAN), 0.2484, 1e-12, "preset A_s");
    close(p.i, 63.9272, 1e-12, "preset I");
    close(p.i_out, 200.8672, 1e-12, "preset I_out");
    assert_eq!(preset.label(5.0), "concrete box 5000 x 10000 (t 600)");
}

#[test]
fn concrete_box_interaction_points_by_hand() {
    // f_cd = 1.0 x 40 / 1.5 = 26.667 MPa; f_yd = 500 / 1.15 = 434.78 MPa, eps_yd = 2.174 per mille;
    // A_s / 2 = 0.0132 m2 at 80 mm from each face; lambda 0.8, eps_cu3 3.5, eps_c3 1.75 per mille
    let Material::Concrete(c) = c40_50_alpha_1() else { panic!("concrete") };
    let section = RcRectangle::new(&c, 2.0, 3.0, 0.0264, 0.08).with_void(Void { depth: 1.4, width: 2.4 });
    let solid = RcRectangle::new(&c, 2.0, 3.0, 0.0264, 0.08);
    // Neutral axis in the top slab, x = 150 mm: the block 0.8 x = 120 mm < 300 mm is a
    // rectangle of the full width 3.0 m: C = 26 667 x 3.0 x 0.12 = 9600 kN at 1.0 - 0.06 = 0.94 m
    // (9024 kNm); top bars 3.5 x 70 / 150 = 1.633 per mille, elastic: 326.7 MPa x 0.0132 =
    // 4312 kN at 0.92 m (3967.0 kNm); bottom bars 3.5 x (150 - 1920) / 150 = -41 per mille,
    // yielded: -5739.1 kN at -0.92 m (+5280.0 kNm). N = 9600 + 4312 - 5739.1 = 8172.9 kN,
    // M = 9024 + 3967.0 + 5280.0 = 18 271.0 kNm; the same as the solid rectangle's
    let (n, m) = section.resistance_at(0.15);
    close(n, 8172.87, 1e-5, "N, x in the slab");
    close(m, 18_271.04, 1e-5, "M, x in the slab");
    assert_eq!((n, m), solid.resistance_at(0.15));
    // Neutral axis below the slab, x = 1.0 m: block 0.8 m: the full width over 0.8 m less
    // the void's 2.4 m over 0.8 - 0.3 = 0.5 m: 26 667 x (2.4 - 1.2) = 32 000 kN;
    // M = 26 667 x (2.4 x 0.6 - 1.2 x 0.45) = 64 000 x 0.6 - 32 000 x 0.45 = 24 000 kNm
    // (the slab 0.9 m2 at 0.85 m and the webs 0.3 m2 at 0.45 m: 20 400 + 3600, the same);
    // bars 3.5 x 0.92 = 3.22 per mille each side, both yielded, cancelling in N and adding
    // 2 x 5739.1 x 0.92 = 10 560 kNm. N = 32 000 kN, M = 34 560 kNm
    let (n, m) = section.resistance_at(1.0);
    close(n, 32_000.0, 1e-9, "N, x below the slab");
    close(m, 34_560.0, 1e-9, "M, x below the slab");
    let (n_solid, _) = solid.resistance_at(1.0);
    close(n_solid, 64_000.0, 1e-9, "the solid rectangle's block is not cut");
    // Squash load (6.1(5)): f_cd A_c + A_s E_s eps_c3 = 26 667 x 2.64 + 0.0264 x 350 = 70 400 +
    // 9240 = 79 640 kN; tension: A_s f_yd = 0.0264 x 434 783 = 11 478 kN
    close(section.utilisation(79_640.0, 0.0), 1.0, 1e-9, "squash load");
    close(section.utilisation(-11_478.26, 0.0), 1.0, 1e-6, "tension");
    // Through the member check: N = 16 000 kN with M = 16 880 kNm over l0 = 10 m. e_i = 25 mm:
    // M_0Ed = 16 880 + 400 = 17 280 kNm (above N h/30 = 1067 kNm). lambda = 10 / sqrt(1.4512 /
    // 2.64) = 13.5; n = 16 000 / (2.64 x 26 667) = 0.227, lambda_lim = 10.78 / 0.477 = 22.6: no
    // second order. M_Ed / N = 1.08 = 34 560 / 32 000: the ray meets the diagram at x = 1.0 m,
    // N_R = 32 000 kN: utilisation 16 000 / 32 000 = 0.5
    let family = hand_box();
    let checked = check(
        &c40_50_alpha_1(),
        &family,
        &family.props(2.0),
        &Demand { tension: 0.0, compression: 16_000.0, moment: 16_880.0, least_compression: 16_000.0 },
        &Lengths { in_plane: 10.0, out_of_plane: 10.0 },
    )
    .expect("checks");
    close(checked.design_moment, 17_280.0, 1e-9, "M_Ed");
    close(mode(&checked, Mode::Interaction), 0.5, 1e-9, "utilisation on the ray");
    assert!(checked.rule.contains("box"), "{}", checked.rule);
}

#[test]
fn a_box_whose_void_shrinks_to_nothing_is_the_solid_rectangle() {
    let Material::Concrete(c) = c40_50_alpha_1() else { panic!("concrete") };
    let solid = RcRectangle::new(&c, 2.0, 3.0, 0.0264, 0.08);
    for void in [Void { depth: 0.0, width: 2.4 }, Void { depth: 1.4, width: 0.0 }] {
        let boxed = solid.with_void(void);
        for x in [0.05, 0.15, 0.5, 1.0, 1.9, 2.4, f64::INFINITY] {
            assert_eq!(boxed.resistance_at(x), solid.resistance_at(x), "{void:?} at x = {x}");
        }
    }
    // a void a micrometre across takes next to nothing: 26 667 kN/m2 x 1e-6 m x 1.4 m = 0.037 kN
    let (n_hair, _) = solid.with_void(Void { depth: 1.4, width: 1e-6 }).resistance_at(f64::INFINITY);
    let (n_solid, _) = solid.resistance_at(f64::INFINITY);
    close(n_solid - n_hair, 26_666.67 * 1e-6 * 1.4, 1e-5, "a hairline void");
}

#[test]
fn size_member_picks_the_smallest_box_that_passes() {
    let concrete = preset("c50-60");
    let family = Family::family_presets()
        .into_iter()
        .find(|(k, _)| *k == "concrete-box")
        .map(|(_, f)| f)
        .expect("concrete-box preset");
    let demand =
        Demand { tension: 0.0, compression: 150_000.0, moment: 60_000.0, least_compression: 80_000.0 };
    let lengths = Lengths { in_plane: 120.0, out_of_plane: 15.0 };
    let sized = size_member(&concrete, &family, &demand, &lengths).expect("a box carries it");
    assert!(sized.check.utilisation <= 1.0);
    let (smallest, _, step) = family.sizes();
    assert!(sized.size > smallest + step, "the demand is not trivial: {}", sized.label);
    let below = family.props(sized.size - step);
    let failing = check(&concrete, &family, &below, &demand, &lengths).expect("checks");
    assert!(failing.utilisation > 1.0, "the next size down fails: {}", failing.utilisation);
    assert_eq!(sized.label, family.label(sized.size));
    assert!(sized.label.starts_with("concrete box "), "{}", sized.label);
}
