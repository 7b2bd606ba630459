//! Member resistance checks for a demand, and the search for the smallest size of a
//! family that carries it.
//!
//! The rules, per material (each also written in `Check::rule`):
//!
//! - Steel (EN 1993-1-1): tension N / (A f_y / gamma_M0) (6.2.3), with a moment N / N_Rd +
//!   M / M_el,Rd <= 1 (6.2.1(7)); flexural buckling N / (chi A f_y / gamma_M1) about each
//!   axis (6.3.1, curves of `buckling::curve_for`); compression and bending by 6.3.3 eqs.
//!   6.61 and 6.62 with Annex B (Method 2) for class 3 sections: k_yy = C_my (1 + 0.6
//!   lambda_bar_y n_y) <= C_my (1 + 0.6 n_y), n_y = N / (chi_y N_Rk / gamma_M1), C_my = 1.0
//!   (conservative: the largest value of Table B.3), k_zy = 0.8 k_yy (Table B.1, class 3,
//!   from memory), M_Rk = W_el f_y, chi_LT = 1 (closed sections do not buckle
//!   laterally-torsionally), and the cross-section N / N_Rd + M / M_el,Rd at gamma_M0;
//!   walls within class 3 in compression (Table 5.2: CHS D/t <= 90 eps^2; internal parts
//!   c/t <= 42 eps, eps = sqrt(235 / f_y) with f_y in MPa, c = b - 3t for hot-finished SHS
//!   (common practice), the clear width between webs or flanges for the welded box).
//! - Glulam (EN 1995-1-1, f_d = k_mod f_k / gamma_M): tension 6.1.2, tension and bending
//!   6.2.3 (eq. 6.17), compression 6.3.2 with k_c about each axis and compression and
//!   bending eqs. 6.23 (in the arch plane) and 6.24 (out of it, k_m = 0.7 for rectangles,
//!   6.1.6(2)); 6.23 and 6.24 also for stocky members (conservative against 6.19 and
//!   6.20, whose compression term is squared). The size factor k_h (3.3) is taken as 1
//!   (conservative); lateral-torsional buckling of deep glulam in bending (6.3.3) is not
//!   checked.
//! - Reinforced concrete (EN 1992-1-1): the N-M interaction diagram of the symmetric
//!   rectangle, or of the box as the rectangle less its centred void (the block's force
//!   over the compressed depth less the void's share of it, the bars as in the
//!   rectangle) (rectangular stress block 3.1.7(3), lambda = 0.8, eta = 1, eps_cu3 = 3.5
//!   per mille up to C50/60 and the Table 3.1 values above it, the whole-section
//!   compression pivot at eps_c3 (6.1(5)); steel elastic-perfectly plastic at f_yd with
//!   E_s = 200 GPa (3.2.7); the concrete the bars displace not deducted (common
//!   practice)); the utilisation is how far the design point (N, M + imperfection +
//!   second order, `buckling::concrete_second_order`) lies along the ray from the origin
//!   relative to the diagram's boundary. In tension the same diagram leaves the steel
//!   alone. Out of the arch plane the same rule with the out-of-plane length and the
//!   section turned (the width as depth, the box's void turned too, the bars still half
//!   at each face: a rib's bars run round its perimeter), with no first-order moment.
//!
//! The demand's moment is taken with the largest tension (or, without tension, with no
//! axial force: the Bending mode) and with the largest compression, conservatively, since
//! the envelope does not say which axial force goes with it. Concrete, whose compression
//! raises the moment resistance, takes the moment without tension with the least
//! compression that always acts (`Demand::least_compression`) instead of none.

use super::buckling::{chi, concrete_second_order, curve_for, euler_load, glulam_kc};
use super::materials::{Concrete, Glulam, Material, Steel};
use super::sections::{Family, SectionProps};
use serde::{Deserialize, Serialize};

/// What a member must carry: the envelope's extremes, all as magnitudes.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Demand {
    /// The largest tension N >= 0, kN (0 when the member is never in tension).
    pub tension: f64,
    /// The largest compression as a magnitude |N| >= 0, kN.
    pub compression: f64,
    /// The largest bending moment |M| in the arch plane, kNm, taken with either axial force
    /// (conservative: not the concurrent value).
    pub moment: f64,
    /// The least compression that always acts, as a magnitude >= 0, kN (a member never in
    /// tension: minus its largest axial force; 0 otherwise). A concrete section's moment
    /// resistance grows with compression, so its bending is checked with this compression
    /// rather than with none; steel and glulam ignore it (compression only adds to their
    /// utilisation).
    #[serde(default)]
    pub least_compression: f64,
}

/// Buckling lengths of a member, m.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Lengths {
    /// Buckling length for buckling in the arch plane (about the axis across the deck), m.
    pub in_plane: f64,
    /// Buckling length for buckling out of the arch plane, m; 0: held sideways along its
    /// whole length (no buckling out of the plane).
    pub out_of_plane: f64,
}

/// A way a member can fail a check.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Mode {
    /// Tension (with its moment when there is one).
    Tension,
    /// Flexural buckling in the arch plane under compression.
    InPlaneBuckling,
    /// Flexural buckling out of the arch plane under compression.
    OutOfPlaneBuckling,
    /// Bending alone.
    Bending,
    /// Compression with bending.
    Interaction,
    /// The section's slenderness class (steel walls too thin for class 3).
    Class,
    /// A steel plate thicker than the 80 mm EN 1993-1-1 Table 3.1 covers (the ratio of
    /// the thickest plate to 80 mm).
    Thickness,
    /// A steel rib's cross-section under its second-order moment with the arch's
    /// antisymmetric in-plane imperfection (EN 1993-2 Annex D.3, EN 1993-1-1 5.3.2(11));
    /// a rib's mode only (`arch::second_order`).
    SecondOrder,
    /// The arch's critical load factor against the least the sizing accepts: the least
    /// over alpha_cr (3 for amplified first-order moments, EN 1993-1-1 5.2.2; 10 for a
    /// first-order analysis, 5.2.1(3)); a rib's mode only (`arch::sizing`).
    ArchStability,
}

/// The result of checking one section for a demand.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Check {
    /// The largest utilisation (demand over resistance; <= 1 passes).
    pub utilisation: f64,
    /// The mode with the largest utilisation.
    pub governs: Mode,
    /// Every mode checked with its utilisation.
    pub modes: Vec<(Mode, f64)>,
    /// The rules applied, in words with their clauses.
    pub rule: String,
    /// Slenderness in the arch plane: lambda_bar (steel), lambda_rel (glulam), l0 / i
    /// (concrete).
    pub slenderness_in: f64,
    /// Slenderness out of the arch plane, as `slenderness_in`.
    pub slenderness_out: f64,
    /// Buckling reduction in the arch plane: chi (steel), k_c (glulam), 1 (concrete,
    /// whose buckling enters as a second-order moment).
    pub chi_in: f64,
    /// Buckling reduction out of the arch plane, as `chi_in`.
    pub chi_out: f64,
    /// Euler load in the arch plane, kN (E: steel E, glulam E_0,05, concrete E_cm).
    pub n_cr_in: f64,
    /// Euler load out of the arch plane, kN.
    pub n_cr_out: f64,
    /// The in-plane moment the check used, kNm: the demand's, plus for concrete the
    /// imperfection and second-order moments.
    pub design_moment: f64,
}

/// The smallest size of a family that passes, with its section and check.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Sized {
    /// The size, m.
    pub size: f64,
    /// The section in words (`CHS 508 x 17.5`).
    pub label: String,
    /// The section's properties.
    pub props: SectionProps,
    /// The check of that section.
    pub check: Check,
}

impl Mode {
    /// The mode in words, lower case (`tension`, `in-plane buckling`, `out-of-plane
    /// buckling`, `bending`, `compression and bending`, `slenderness class`).
    pub fn label(self) -> &'static str {
        match self {
            Mode::Tension => "tension",
            Mode::InPlaneBuckling => "in-plane buckling",
            Mode::OutOfPlaneBuckling => "out-of-plane buckling",
            Mode::Bending => "bending",
            Mode::Interaction => "compression and bending",
            Mode::Class => "slenderness class",
            Mode::Thickness => "plate thickness",
            Mode::ArchStability => "arch stability (alpha_cr)",
            Mode::SecondOrder => "second order with imperfection",
        }
    }
}

/// Plates thicker than this, m, take the lower yield strength of EN 1993-1-1 Table 3.1.
pub const THICK_PLATE: f64 = 0.040;
/// How much lower, kN/m2: 20 MPa for S235 (215), S355 (335) and S460 (440) at 40 < t <= 80
/// mm (EN 1993-1-1 Table 3.1, from memory).
pub const THICK_PLATE_REDUCTION: f64 = 20_000.0;
/// The thickest plate Table 3.1 covers, m: a thicker one fails the check (mode
/// `Thickness`).
pub const THICKEST_PLATE: f64 = 0.080;

/// Reference yield strength of eps = sqrt(235 / f_y), kN/m2 (EN 1993-1-1 Table 5.2).
const EPS_REFERENCE_FY: f64 = 235_000.0;

/// One steel wall's width-to-thickness ratio against its class 3 limit in compression.
#[derive(Debug, Clone, PartialEq)]
pub struct Wall {
    /// The ratio's name (`D/t`, `c/t of the flanges` ...).
    pub what: &'static str,
    /// The ratio.
    pub ratio: f64,
    /// Its class 3 limit for the grade.
    pub limit: f64,
    /// The limit's rule in words (`90 eps^2`, `42 eps`).
    pub rule: &'static str,
}

/// eps = sqrt(235 / f_y), f_y in kN/m2 (EN 1993-1-1 Table 5.2).
fn epsilon(steel: &Steel) -> f64 {
    (EPS_REFERENCE_FY / steel.fy).sqrt()
}

/// The class 3 walls of a steel family in compression (EN 1993-1-1 Table 5.2) from its
/// nominal ratios (thicknesses not rounded: the worst any size of the family reaches,
/// since rounding a thickness up only lowers a ratio). Empty for other families.
pub fn nominal_walls(family: &Family, steel: &Steel) -> Vec<Wall> {
    let eps = epsilon(steel);
    match *family {
        Family::Chs { d_over_t } => {
            vec![Wall { what: "D/t", ratio: d_over_t, limit: 90.0 * eps * eps, rule: "90 eps^2" }]
        }
        Family::Shs { b_over_t } => {
            vec![Wall { what: "c/t = b/t - 3", ratio: b_over_t - 3.0, limit: 42.0 * eps, rule: "42 eps" }]
        }
        Family::WeldedBox { width_over_depth, flange_ratio, web_ratio } => vec![
            Wall {
                what: "c/t of the flanges (clear width between the webs)",
                ratio: flange_ratio * (1.0 - 2.0 / (web_ratio * width_over_depth)),
                limit: 42.0 * eps,
                rule: "42 eps",
            },
            Wall {
                what: "c/t of the webs (clear depth between the flanges)",
                ratio: web_ratio * (1.0 - 2.0 * width_over_depth / flange_ratio),
                limit: 42.0 * eps,
                rule: "42 eps",
            },
        ],
        _ => Vec::new(),
    }
}

/// The class 3 walls of one steel section in compression, with its rounded thicknesses
/// (EN 1993-1-1 Table 5.2). Empty for other families.
pub fn section_walls(family: &Family, props: &SectionProps, steel: &Steel) -> Vec<Wall> {
    let eps = epsilon(steel);
    let t = props.thickness.unwrap_or(f64::NAN);
    match family {
        Family::Chs { .. } => {
            vec![Wall { what: "D/t", ratio: props.depth / t, limit: 90.0 * eps * eps, rule: "90 eps^2" }]
        }
        Family::Shs { .. } => vec![Wall {
            what: "c/t = b/t - 3",
            ratio: (props.width - 3.0 * t) / t,
            limit: 42.0 * eps,
            rule: "42 eps",
        }],
        Family::WeldedBox { .. } => {
            let t_w = family.web_thickness(props.size).unwrap_or(f64::NAN);
            vec![
                Wall {
                    what: "c/t of the flanges (clear width between the webs)",
                    ratio: (props.width - 2.0 * t_w) / t,
                    limit: 42.0 * eps,
                    rule: "42 eps",
                },
                Wall {
                    what: "c/t of the webs (clear depth between the flanges)",
                    ratio: (props.depth - 2.0 * t) / t_w,
                    limit: 42.0 * eps,
                    rule: "42 eps",
                },
            ]
        }
        _ => Vec::new(),
    }
}

/// Refuses a steel family whose ratios break class 3 in compression for the grade, naming
/// the ratio and its limit (EN 1993-1-1 Table 5.2); Ok for others.
pub fn class_3(family: &Family, material: &Material) -> Result<(), String> {
    let Material::Steel(steel) = material else {
        return Ok(());
    };
    for wall in nominal_walls(family, steel) {
        if wall.ratio > wall.limit {
            return Err(format!(
                "the {} cannot be used in {}: its {} is {:.1}, above the class 3 limit {} = {:.1} for f_y {} MPa \
                 (EN 1993-1-1 Table 5.2; thinner walls would need the effective section of class 4, not \
                 covered): use thicker walls or a lower grade",
                family.name(),
                steel.name,
                wall.what,
                wall.ratio,
                wall.rule,
                wall.limit,
                steel.fy / 1000.0
            ));
        }
    }
    Ok(())
}

fn check_inputs(
    material: &Material,
    family: &Family,
    props: &SectionProps,
    demand: &Demand,
    lengths: &Lengths,
) -> Result<(), String> {
    material.check()?;
    family.check()?;
    if !family.suits(material) {
        return Err(format!("a {} cannot be made of {}", family.name(), material.name()));
    }
    for (what, value) in
        [("tension", demand.tension), ("compression", demand.compression), ("moment", demand.moment)]
    {
        if !value.is_finite() || value < 0.0 {
            return Err(format!("the demand's {what} must be a number at or above zero (it is {value})"));
        }
    }
    if !lengths.in_plane.is_finite() || lengths.in_plane <= 0.0 {
        return Err(format!(
            "the in-plane buckling length must be above zero (it is {} m)",
            lengths.in_plane
        ));
    }
    // zero out of plane: held sideways along its whole length (a deck girder under its slab)
    if !lengths.out_of_plane.is_finite() || lengths.out_of_plane < 0.0 {
        return Err(format!(
            "the out-of-plane buckling length must be zero (held along its length) or above (it is {} m)",
            lengths.out_of_plane
        ));
    }
    for (what, value) in [
        ("depth", props.depth),
        ("width", props.width),
        ("area", props.a),
        ("second moment of area", props.i),
        ("out-of-plane second moment of area", props.i_out),
        ("elastic modulus", props.w_el),
    ] {
        if !value.is_finite() || value <= 0.0 {
            return Err(format!("the section's {what} must be above zero (it is {value})"));
        }
    }
    Ok(())
}

impl Check {
    /// This check with one more mode: listed last, governing when its utilisation is the
    /// largest (an earlier mode keeps governing on a tie).
    pub fn with_mode(mut self, mode: Mode, utilisation: f64) -> Check {
        self.modes.push((mode, utilisation));
        if utilisation > self.utilisation {
            self.utilisation = utilisation;
            self.governs = mode;
        }
        self
    }
}

/// A check from its modes: the largest utilisation governs (the first listed on a tie).
fn assemble(modes: Vec<(Mode, f64)>, rule: String, fields: Fields) -> Check {
    let (governs, utilisation) =
        modes
            .iter()
            .copied()
            .fold((Mode::Bending, f64::NEG_INFINITY), |best, m| if m.1 > best.1 { m } else { best });
    Check {
        utilisation,
        governs,
        modes,
        rule,
        slenderness_in: fields.slenderness.0,
        slenderness_out: fields.slenderness.1,
        chi_in: fields.chi.0,
        chi_out: fields.chi.1,
        n_cr_in: fields.n_cr.0,
        n_cr_out: fields.n_cr.1,
        design_moment: fields.design_moment,
    }
}

/// The numbers a check reports beside its modes, (in plane, out of plane).
struct Fields {
    slenderness: (f64, f64),
    chi: (f64, f64),
    n_cr: (f64, f64),
    design_moment: f64,
}

/// Checks one section of `family` in `material` for `demand` with buckling `lengths`
/// (m), by the rules of this module's doc. Utilisations are demand over design
/// resistance (<= 1 passes); every mode that applies is listed: tension (or bending when
/// there is no tension) always, buckling in and out of the plane with compression,
/// compression and bending with both, and for steel the slenderness class (ratio over
/// its class 3 limit, with the section's rounded thicknesses).
///
/// Err with a reason when the material or family has invalid values, the family does not
/// suit the material, the demand is negative or not a number, a buckling length is not
/// above zero, the section's properties are not above zero, a concrete section's cover
/// reaches a quarter of its depth or width, or a concrete box's walls are missing, fill
/// it, or hold its cover outside their outer half.
pub fn check(
    material: &Material,
    family: &Family,
    props: &SectionProps,
    demand: &Demand,
    lengths: &Lengths,
) -> Result<Check, String> {
    check_inputs(material, family, props, demand, lengths)?;
    match (material, family) {
        (Material::Steel(steel), _) => Ok(check_steel(steel, family, material, props, demand, lengths)),
        (Material::Glulam(glulam), _) => Ok(check_glulam(glulam, props, demand, lengths)),
        (Material::Concrete(concrete), Family::ConcreteRect { cover, .. }) => {
            check_concrete(concrete, *cover, None, props, demand, lengths)
        }
        (Material::Concrete(concrete), Family::ConcreteBox { cover, .. }) => {
            let void = box_void(*cover, props)?;
            check_concrete(concrete, *cover, Some(void), props, demand, lengths)
        }
        (Material::Concrete(_), _) => Err(format!("a {} cannot be made of concrete", family.name())),
    }
}

/// The yield strength a steel section is checked with, kN/m2, and its thickest plate
/// (m; `None` for a typed section): EN 1993-1-1 Table 3.1 gives f_y for t <= 40 mm and a
/// lower value for 40 < t <= 80 mm, 20 MPa less for S235, S355 and S460 (from memory);
/// the thickest plate decides.
fn steel_fy(steel: &Steel, family: &Family, props: &SectionProps) -> (f64, Option<f64>) {
    let thickest = props.thickness.map(|t| t.max(family.web_thickness(props.size).unwrap_or(0.0)));
    let fy = match thickest {
        Some(t) if t > THICK_PLATE => steel.fy - THICK_PLATE_REDUCTION,
        _ => steel.fy,
    };
    (fy, thickest)
}

/// The utilisation of a steel section's cross-section under compression `n` (kN, >= 0)
/// and in-plane moment `m` (kNm, >= 0): N / (A f_y / gamma_M0) + M / (W_el f_y /
/// gamma_M0) (EN 1993-1-1 6.2.1(7), class 3), f_y as the member checks take it.
pub fn steel_section_utilisation(
    steel: &Steel,
    family: &Family,
    props: &SectionProps,
    n: f64,
    m: f64,
) -> f64 {
    let (fy, _) = steel_fy(steel, family, props);
    n / (props.a * fy / steel.gamma_m0) + m / (props.w_el * fy / steel.gamma_m0)
}

fn check_steel(
    steel: &Steel,
    family: &Family,
    material: &Material,
    props: &SectionProps,
    demand: &Demand,
    lengths: &Lengths,
) -> Check {
    let (fy, thickest) = steel_fy(steel, family, props);
    let n_rk = props.a * fy;
    let m_rk = props.w_el * fy;
    let n_cr_in = euler_load(steel.e, props.i, lengths.in_plane);
    let n_cr_out = euler_load(steel.e, props.i_out, lengths.out_of_plane);
    let lambda_in = (n_rk / n_cr_in).sqrt();
    let lambda_out = (n_rk / n_cr_out).sqrt();
    let curve = curve_for(family, material);
    let (chi_in, chi_out) = (chi(curve, lambda_in), chi(curve, lambda_out));
    let (n, m) = (demand.compression, demand.moment);

    let mut modes = Vec::new();
    let tension_mode = if demand.tension > 0.0 { Mode::Tension } else { Mode::Bending };
    modes.push((tension_mode, demand.tension / (n_rk / steel.gamma_m0) + m / (m_rk / steel.gamma_m0)));
    if n > 0.0 {
        let n_b_in = chi_in * n_rk / steel.gamma_m1;
        let n_b_out = chi_out * n_rk / steel.gamma_m1;
        modes.push((Mode::InPlaneBuckling, n / n_b_in));
        modes.push((Mode::OutOfPlaneBuckling, n / n_b_out));
        if m > 0.0 {
            let n_y = n / n_b_in;
            // Annex B Table B.1, class 3, C_my = 1
            let k_yy = (1.0 + 0.6 * lambda_in * n_y).min(1.0 + 0.6 * n_y);
            let k_zy = 0.8 * k_yy;
            let m_rd1 = m_rk / steel.gamma_m1;
            let eq_6_61 = n_y + k_yy * m / m_rd1;
            let eq_6_62 = n / n_b_out + k_zy * m / m_rd1;
            let section = n / (n_rk / steel.gamma_m0) + m / (m_rk / steel.gamma_m0);
            modes.push((Mode::Interaction, eq_6_61.max(eq_6_62).max(section)));
        }
    }
    if let Some(t) = thickest {
        modes.push((Mode::Thickness, t / THICKEST_PLATE));
    }
    // a typed section gives no wall thickness: its class is not checked (the report's
    // basis says so)
    if props.thickness.is_some() {
        let walls = section_walls(family, props, steel);
        let class = walls.iter().map(|w| w.ratio / w.limit).fold(0.0, f64::max);
        modes.push((Mode::Class, class));
    }

    let rule = format!(
        "EN 1993-1-1, {}: tension N/(A f_y/gamma_M0) + M/(W_el f_y/gamma_M0) (6.2.3, 6.2.1(7)); flexural buckling \
         N/(chi A f_y/gamma_M1) about each axis, curve {} (6.3.1, Table 6.2); compression and bending eqs. 6.61 \
         and 6.62, Annex B class 3: k_yy = C_my (1 + 0.6 lambda_y n_y) <= C_my (1 + 0.6 n_y), C_my = 1.0 \
         (conservative), k_zy = 0.8 k_yy (from memory), chi_LT = 1 (closed section), M_Rk = W_el f_y; the moment \
         taken with either axial force; walls within class 3 in compression (Table 5.2); f_y {:.0} MPa for the \
         thickest plate (Table 3.1: 20 MPa less above 40 mm, plates above 80 mm refused)",
        steel.name,
        curve.name(),
        fy / 1000.0
    );
    assemble(
        modes,
        rule,
        Fields {
            slenderness: (lambda_in, lambda_out),
            chi: (chi_in, chi_out),
            n_cr: (n_cr_in, n_cr_out),
            design_moment: m,
        },
    )
}

/// k_m of rectangular timber sections (EN 1995-1-1 6.1.6(2)).
const GLULAM_K_M: f64 = 0.7;

fn check_glulam(glulam: &Glulam, props: &SectionProps, demand: &Demand, lengths: &Lengths) -> Check {
    let factor = glulam.k_mod / glulam.gamma_m;
    let (f_t, f_c, f_m) = (factor * glulam.f_t0_k, factor * glulam.f_c0_k, factor * glulam.f_m_k);
    // relative slenderness, EN 1995-1-1 eqs. 6.21 and 6.22
    let relative = |length: f64, radius: f64| {
        length / radius / std::f64::consts::PI * (glulam.f_c0_k / glulam.e_0_05).sqrt()
    };
    let (lambda_in, lambda_out) =
        (relative(lengths.in_plane, props.radius_in), relative(lengths.out_of_plane, props.radius_out));
    let (kc_in, kc_out) = (glulam_kc(lambda_in), glulam_kc(lambda_out));
    let sigma_m = demand.moment / props.w_el;
    let sigma_c = demand.compression / props.a;

    let mut modes = Vec::new();
    let tension_mode = if demand.tension > 0.0 { Mode::Tension } else { Mode::Bending };
    modes.push((tension_mode, demand.tension / props.a / f_t + sigma_m / f_m));
    if demand.compression > 0.0 {
        modes.push((Mode::InPlaneBuckling, sigma_c / (kc_in * f_c)));
        modes.push((Mode::OutOfPlaneBuckling, sigma_c / (kc_out * f_c)));
        if demand.moment > 0.0 {
            let eq_6_23 = sigma_c / (kc_in * f_c) + sigma_m / f_m;
            let eq_6_24 = sigma_c / (kc_out * f_c) + GLULAM_K_M * sigma_m / f_m;
            modes.push((Mode::Interaction, eq_6_23.max(eq_6_24)));
        }
    }
    let rule = format!(
        "EN 1995-1-1, {}: f_d = k_mod f_k / gamma_M (k_mod {}, gamma_M {}); tension and bending sigma_t/f_t0d + \
         sigma_m/f_md (6.1.2, 6.2.3); compression sigma_c/(k_c f_c0d) about each axis (6.3.2, beta_c 0.1, \
         lambda_rel from E_0,05); compression and bending eqs. 6.23 and 6.24 (k_m 0.7), used for stocky members \
         too (conservative); k_h = 1 (conservative); lateral-torsional buckling (6.3.3) not checked; the moment \
         taken with either axial force",
        glulam.name, glulam.k_mod, glulam.gamma_m
    );
    assemble(
        modes,
        rule,
        Fields {
            slenderness: (lambda_in, lambda_out),
            chi: (kc_in, kc_out),
            n_cr: (
                euler_load(glulam.e_0_05, props.i, lengths.in_plane),
                euler_load(glulam.e_0_05, props.i_out, lengths.out_of_plane),
            ),
            design_moment: demand.moment,
        },
    )
}

/// A rectangular hole centred in a concrete section, m.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Void {
    /// Its depth in the direction of bending, m.
    pub depth: f64,
    /// Its width, m.
    pub width: f64,
}

/// The void of a concrete box section checked in the arch plane, from its wall thickness
/// (`SectionProps::thickness`): the outer depth and width less two walls each. Err when
/// the section gives no wall, the walls fill it, or the cover to the bar centres reaches
/// half the wall (the bars sit in the walls' outer halves).
fn box_void(cover: f64, props: &SectionProps) -> Result<Void, String> {
    let Some(t) = props.thickness.filter(|t| t.is_finite() && *t > 0.0) else {
        return Err("a concrete box section needs its wall thickness above zero".into());
    };
    let void = Void { depth: props.depth - 2.0 * t, width: props.width - 2.0 * t };
    if void.depth <= 0.0 || void.width <= 0.0 {
        return Err(format!(
            "the box's {:.0} mm walls fill its {:.0} x {:.0} mm section",
            t * 1000.0,
            props.depth * 1000.0,
            props.width * 1000.0
        ));
    }
    if cover >= t / 2.0 {
        return Err(format!(
            "the cover to the bar centres ({:.0} mm) must stay below half the box's wall ({:.0} mm)",
            cover * 1000.0,
            t * 1000.0
        ));
    }
    Ok(void)
}

/// A symmetrically reinforced concrete rectangle, solid or with a centred rectangular
/// void (a box), bent about one axis, with the design values of EN 1992-1-1 for its N-M
/// interaction diagram. Compression positive; a positive moment compresses the face at
/// y = 0.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RcRectangle {
    /// Depth in the direction of bending, m.
    pub depth: f64,
    /// Width, m.
    pub width: f64,
    /// The centred void of a box (`None`: solid).
    pub void: Option<Void>,
    /// Total reinforcement, m2, half at each face.
    pub steel_area: f64,
    /// Distance from each face to its bars' centres, m.
    pub cover: f64,
    /// eta f_cd = eta alpha_cc f_ck / gamma_C, kN/m2.
    pub block_stress: f64,
    /// lambda, the block's depth over the neutral axis depth.
    pub block_depth: f64,
    /// Ultimate strain eps_cu3.
    pub eps_cu3: f64,
    /// Strain eps_c3 of a wholly compressed section's pivot.
    pub eps_c3: f64,
    /// f_yd = f_yk / gamma_S, kN/m2.
    pub f_yd: f64,
}

impl RcRectangle {
    /// The rectangle `depth` x `width` (m) of `concrete` with `steel_area` (m2, half at
    /// each face) at `cover` (m, to the bar centres). Stress block after EN 1992-1-1
    /// 3.1.7(3): lambda = 0.8 and eta = 1 up to f_ck 50 MPa, lambda = 0.8 - (f_ck - 50) /
    /// 400 and eta = 1 - (f_ck - 50) / 200 above; eps_cu3 = 3.5 per mille and eps_c3 =
    /// 1.75 per mille up to 50 MPa, above it Table 3.1: eps_cu3 = 2.6 + 35 ((90 - f_ck) /
    /// 100)^4 and eps_c3 = 1.75 + 0.55 (f_ck - 50) / 40 per mille (f_ck in MPa).
    pub fn new(concrete: &Concrete, depth: f64, width: f64, steel_area: f64, cover: f64) -> RcRectangle {
        let fck_mpa = concrete.fck / 1000.0;
        let above = (fck_mpa - 50.0).max(0.0);
        let eta = 1.0 - above / 200.0;
        RcRectangle {
            depth,
            width,
            void: None,
            steel_area,
            cover,
            block_stress: eta * concrete.alpha_cc * concrete.fck / concrete.gamma_c,
            block_depth: 0.8 - above / 400.0,
            eps_cu3: if above > 0.0 {
                (2.6 + 35.0 * ((90.0 - fck_mpa) / 100.0).powi(4)) / 1000.0
            } else {
                0.0035
            },
            eps_c3: (1.75 + 0.55 * above / 40.0) / 1000.0,
            f_yd: concrete.rebar_fyk / concrete.gamma_s,
        }
    }

    /// The same section with a centred rectangular `void` (a box: the void's depth in the
    /// direction of bending, its width across), m. A void of zero depth or width leaves
    /// the solid rectangle's diagram exactly. Degenerate: a void reaching the outer faces
    /// gives a diagram without the walls it removes (callers check the walls first).
    pub fn with_void(self, void: Void) -> RcRectangle {
        RcRectangle { void: Some(void), ..self }
    }

    /// The resistance (N kN, M kNm) for the neutral axis at depth `x` (m) from the
    /// compressed face; `x` = infinity is the whole section at eps_c3. For x <= h the
    /// compressed face is at eps_cu3; for x > h the strain line turns about the pivot at
    /// depth h (1 - eps_c3 / eps_cu3) at eps_c3 (EN 1992-1-1 6.1(5), Figure 6.1). The
    /// block is the compressed depth lambda x (at most h) over the whole width, less, for a
    /// box, the part of the void it covers: the void's width over the depth from the
    /// void's top to the block's edge, acting at that strip's middle.
    pub fn resistance_at(&self, x: f64) -> (f64, f64) {
        let h = self.depth;
        let strain = |y: f64| -> f64 {
            if x.is_infinite() {
                self.eps_c3
            } else if x <= h {
                self.eps_cu3 * (x - y) / x
            } else {
                let pivot = h * (1.0 - self.eps_c3 / self.eps_cu3);
                self.eps_c3 * (x - y) / (x - pivot)
            }
        };
        let block = (self.block_depth * x).min(h);
        let concrete = self.block_stress * self.width * block;
        let mut n = concrete;
        let mut m = concrete * (h / 2.0 - block / 2.0);
        if let Some(void) = self.void {
            let top = (h - void.depth) / 2.0;
            let covered = block.min(top + void.depth) - top;
            if covered > 0.0 {
                let lost = self.block_stress * void.width * covered;
                n -= lost;
                m -= lost * (h / 2.0 - (top + covered / 2.0));
            }
        }
        for y in [self.cover, h - self.cover] {
            let stress = (super::buckling::REBAR_E * strain(y)).clamp(-self.f_yd, self.f_yd);
            let force = stress * self.steel_area / 2.0;
            n += force;
            m += force * (h / 2.0 - y);
        }
        (n, m)
    }

    /// The boundary point of the diagram's half with M >= 0 at a parameter p in [0, 2]:
    /// p = 0 pure tension (every bar at f_yd), (0, 1] the neutral axis at x = p h, (1, 2)
    /// at x = h / (2 - p), 2 the whole section at eps_c3.
    fn boundary(&self, p: f64) -> (f64, f64) {
        if p <= 0.0 {
            (-self.steel_area * self.f_yd, 0.0)
        } else if p <= 1.0 {
            self.resistance_at(p * self.depth)
        } else if p < 2.0 {
            self.resistance_at(self.depth / (2.0 - p))
        } else {
            self.resistance_at(f64::INFINITY)
        }
    }

    /// How far the design point (N kN, compression positive; M kNm, its magnitude used)
    /// lies along the ray from the origin, relative to the diagram's boundary: 1 on the
    /// boundary, 0 at the origin. The boundary point on the ray is found by bisection on
    /// the diagram's parameter (its angle seen from the origin falls from pi at pure
    /// tension to 0 at pure compression).
    pub fn utilisation(&self, n: f64, m: f64) -> f64 {
        let m = m.abs();
        if n == 0.0 && m == 0.0 {
            return 0.0;
        }
        if m == 0.0 {
            let end = if n > 0.0 { self.boundary(2.0).0 } else { self.boundary(0.0).0 };
            return n / end;
        }
        // cross product of the boundary point with the design point: negative before the ray
        let cross = |p: f64| {
            let (nb, mb) = self.boundary(p);
            nb * m - mb * n
        };
        let (mut low, mut high) = (0.0, 2.0);
        // 60 halvings of [0, 2] leave 2e-18: well below f64's resolution of p
        for _ in 0..60 {
            let mid = 0.5 * (low + high);
            if cross(mid) < 0.0 {
                low = mid;
            } else {
                high = mid;
            }
        }
        let (nb, mb) = self.boundary(0.5 * (low + high));
        (n * n + m * m).sqrt() / (nb * nb + mb * mb).sqrt()
    }
}

/// The concrete rules of this module's doc for the rectangle of `props`, less the centred
/// `void` (in the arch plane) for a box.
fn check_concrete(
    concrete: &Concrete,
    cover: f64,
    void: Option<Void>,
    props: &SectionProps,
    demand: &Demand,
    lengths: &Lengths,
) -> Result<Check, String> {
    let smaller = props.depth.min(props.width);
    if cover >= smaller / 4.0 {
        return Err(format!(
            "the cover to the bar centres ({:.0} mm) must stay below a quarter of the section's smaller side \
             ({:.0} mm)",
            cover * 1000.0,
            smaller * 1000.0
        ));
    }
    let steel_area = props.steel_area_rebar.unwrap_or(0.0);
    let mut in_plane = RcRectangle::new(concrete, props.depth, props.width, steel_area, cover);
    let mut turned = RcRectangle::new(concrete, props.width, props.depth, steel_area, cover);
    if let Some(void) = void {
        in_plane = in_plane.with_void(void);
        turned = turned.with_void(Void { depth: void.width, width: void.depth });
    }
    let (n, m) = (demand.compression, demand.moment);

    let mut modes = Vec::new();
    let tension_mode = if demand.tension > 0.0 { Mode::Tension } else { Mode::Bending };
    // the moment with the least axial force it can meet: the largest tension, or the
    // compression that always acts on a member never in tension
    let least = if demand.tension > 0.0 { -demand.tension } else { demand.least_compression.max(0.0) };
    modes.push((tension_mode, in_plane.utilisation(least, m)));
    let second_in =
        concrete_second_order(concrete, props.depth, props.a, props.radius_in, cover, n, m, lengths.in_plane);
    let second_out = concrete_second_order(
        concrete,
        props.width,
        props.a,
        props.radius_out,
        cover,
        n,
        0.0,
        lengths.out_of_plane,
    );
    if n > 0.0 {
        let in_mode = if m > 0.0 { Mode::Interaction } else { Mode::InPlaneBuckling };
        modes.push((in_mode, in_plane.utilisation(n, second_in.moment)));
        modes.push((Mode::OutOfPlaneBuckling, turned.utilisation(n, second_out.moment)));
    }
    let rule = format!(
        "EN 1992-1-1, {}: N-M interaction diagram of {} (3.1.7(3) stress block, lambda {:.2}, \
         eta {:.2}, eps_cu3 {:.2} per mille; steel elastic-perfectly plastic at f_yd; 6.1), utilisation along the \
         ray from the origin; with compression the moment M + N e_i, e_i = l0/400 (5.2(7)), at least N max(h/30, \
         20 mm) (6.1(4)), plus N e2 by nominal curvature (5.8.8, K_r = 1, K_phi = 1: creep not included, c = 10, \
         d = h - cover) where l0/i exceeds lambda_lim = 20 A B C / sqrt(n), A 0.7, B 1.1, C 0.7 (5.8.3.1); out of \
         the plane the same rule on the turned section with its own length; tension on the bars alone; the \
         moment taken with either axial force",
        concrete.name,
        if void.is_some() { "the symmetric box, the rectangle less its centred void" } else { "the symmetric rectangle" },
        in_plane.block_depth,
        in_plane.block_stress / (concrete.alpha_cc * concrete.fck / concrete.gamma_c),
        in_plane.eps_cu3 * 1000.0
    );
    Ok(assemble(
        modes,
        rule,
        Fields {
            slenderness: (second_in.slenderness, second_out.slenderness),
            chi: (1.0, 1.0),
            n_cr: (
                euler_load(concrete.e_cm, props.i, lengths.in_plane),
                euler_load(concrete.e_cm, props.i_out, lengths.out_of_plane),
            ),
            design_moment: if n > 0.0 { second_in.moment } else { m },
        },
    ))
}

/// The smallest size on the family's grid (`Family::size_grid`, smallest first) whose
/// `check` gives a utilisation <= 1, with its label, properties and check.
///
/// Err with a reason a user can act on when the family does not suit the material, the
/// material, family, demand or lengths have invalid values, a steel family's nominal
/// ratios break class 3 for the grade (naming the ratio and the limit), or even the
/// largest size fails (saying by how much and in which mode).
pub fn size_member(
    material: &Material,
    family: &Family,
    demand: &Demand,
    lengths: &Lengths,
) -> Result<Sized, String> {
    size_member_by(material, family, &|props| check(material, family, props, demand, lengths))
}

/// [`size_member`] with a check of its own for each size: the smallest size on the
/// family's grid whose `check_size` gives a utilisation <= 1 (for a demand that depends
/// on the section, as a rib's amplified moments do on its stiffness). The same errors.
pub fn size_member_by(
    material: &Material,
    family: &Family,
    check_size: &dyn Fn(&SectionProps) -> Result<Check, String>,
) -> Result<Sized, String> {
    material.check()?;
    family.check()?;
    if !family.suits(material) {
        return Err(format!("a {} cannot be made of {}", family.name(), material.name()));
    }
    class_3(family, material)?;
    let mut last = None;
    for size in family.size_grid() {
        let props = family.props(size);
        let check = check_size(&props)?;
        if check.utilisation <= 1.0 {
            return Ok(Sized { size, label: family.label(size), props, check });
        }
        last = Some((size, check));
    }
    match last {
        Some((size, check)) => Err(format!(
            "even the largest {} tried, {}, is {:.0} % used ({} governs: the demand is {:.2} times its \
             resistance): use a stronger material, another family or shorter buckling lengths",
            family.name(),
            family.label(size),
            check.utilisation * 100.0,
            check.governs.label(),
            check.utilisation
        )),
        None => Err(format!("the {} has no sizes to try", family.name())),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sizing::materials::material_preset;

    fn preset(key: &str) -> Material {
        material_preset(key).unwrap_or_else(|| panic!("preset {key}"))
    }

    #[test]
    fn rc_diagram_ends() {
        let Material::Concrete(mut c) = preset("c40-50") else { panic!("concrete") };
        // the values below take EN 1992-1-1's alpha_cc = 1.0 (the preset has the bridges' 0.85)
        c.alpha_cc = 1.0;
        // 800 x 800, A_s = 12 800 mm2: squash load f_cd A_c + A_s E_s eps_c3
        // = 26.67 x 640 000 + 12 800 x 350 = 21 547 kN; tension A_s f_yd = 5565 kN
        let section = RcRectangle::new(&c, 0.8, 0.8, 0.0128, 0.06);
        assert!((section.utilisation(21_546.67, 0.0) - 1.0).abs() < 1e-5);
        assert!((section.utilisation(-5565.217, 0.0) - 1.0).abs() < 1e-5);
        assert_eq!(section.utilisation(0.0, 0.0), 0.0);
        // a point on the boundary is at 1, half-way at 0.5
        let (n, m) = section.resistance_at(0.5);
        assert!((section.utilisation(n, m) - 1.0).abs() < 1e-9);
        assert!((section.utilisation(0.5 * n, 0.5 * m) - 0.5).abs() < 1e-9);
        assert!((section.utilisation(0.5 * n, -0.5 * m) - 0.5).abs() < 1e-9, "symmetric");
    }

    #[test]
    fn rc_diagram_angle_falls_monotonically() {
        // the bisection in `utilisation` needs the boundary's angle seen from the origin to
        // fall from pi (tension) to 0 (compression): sampled over the extremes of the inputs
        let Material::Concrete(mut c) = preset("c50-60") else { panic!("concrete") };
        for fck in [30e3, 50e3, 90e3] {
            c.fck = fck;
            for (rho, cover) in [(0.002, 0.02), (0.04, 0.02), (0.002, 0.24), (0.04, 0.24)] {
                let section = RcRectangle::new(&c, 1.0, 0.6, rho * 0.6, cover);
                let mut last = std::f64::consts::PI;
                for k in 1..=2000 {
                    let (n, m) = section.boundary(k as f64 / 1000.0);
                    let angle = m.atan2(n);
                    assert!(
                        angle <= last + 1e-12,
                        "fck {fck}, rho {rho}, cover {cover}, p {}",
                        k as f64 / 1000.0
                    );
                    last = angle;
                }
                assert!(last.abs() < 1e-12);
            }
        }
    }

    #[test]
    fn box_diagram_angle_falls_monotonically() {
        // as above, for boxes from thin walls to thick ones, each way round
        let Material::Concrete(mut c) = preset("c50-60") else { panic!("concrete") };
        for fck in [30e3, 50e3, 90e3] {
            c.fck = fck;
            for (depth, width, wall) in [(2.0, 4.0, 0.15), (4.0, 2.0, 0.15), (2.0, 2.0, 0.6), (1.2, 2.4, 0.2)]
            {
                for (rho, cover) in [(0.002, 0.05), (0.04, 0.05), (0.04, wall / 2.0 - 0.01)] {
                    let area = depth * width - (depth - 2.0 * wall) * (width - 2.0 * wall);
                    let section = RcRectangle::new(&c, depth, width, rho * area, cover)
                        .with_void(Void { depth: depth - 2.0 * wall, width: width - 2.0 * wall });
                    let mut last = std::f64::consts::PI;
                    for k in 1..=2000 {
                        let (n, m) = section.boundary(k as f64 / 1000.0);
                        let angle = m.atan2(n);
                        assert!(angle <= last + 1e-12, "fck {fck}, {depth} x {width} t {wall}, rho {rho}");
                        last = angle;
                    }
                    assert!(last.abs() < 1e-12);
                }
            }
        }
    }

    #[test]
    fn a_void_of_no_width_or_depth_leaves_the_rectangle() {
        let Material::Concrete(c) = preset("c40-50") else { panic!("concrete") };
        let solid = RcRectangle::new(&c, 2.0, 3.0, 0.03, 0.1);
        let no_width = solid.with_void(Void { depth: 1.4, width: 0.0 });
        let no_depth = solid.with_void(Void { depth: 0.0, width: 2.4 });
        let hairline = solid.with_void(Void { depth: 1.4, width: 1e-12 });
        for k in 0..=400 {
            let p = k as f64 / 200.0;
            let (n, m) = solid.boundary(p);
            assert_eq!(no_width.boundary(p), (n, m), "p {p}");
            assert_eq!(no_depth.boundary(p), (n, m), "p {p}");
            let (nh, mh) = hairline.boundary(p);
            assert!((nh - n).abs() < 1e-6 && (mh - m).abs() < 1e-6, "p {p}");
        }
        assert_eq!(no_width.utilisation(30_000.0, 8_000.0), solid.utilisation(30_000.0, 8_000.0));
    }

    #[test]
    fn a_concrete_box_is_checked_with_its_void_both_ways() {
        let Material::Concrete(c) = preset("c40-50") else { panic!("concrete") };
        let family = Family::ConcreteBox {
            width_over_depth: 1.5,
            wall_over_depth: 0.15,
            reinforcement_ratio: 0.01,
            cover: 0.07,
        };
        // 2000 x 3000, walls 300 mm: void 1400 x 2400
        let props = family.props(2.0);
        let demand = Demand { tension: 0.0, compression: 16_000.0, moment: 10_000.0, least_compression: 0.0 };
        let lengths = Lengths { in_plane: 10.0, out_of_plane: 10.0 };
        let checked =
            check(&Material::Concrete(c.clone()), &family, &props, &demand, &lengths).expect("checks");
        let steel = props.steel_area_rebar.unwrap_or(0.0);
        let in_plane = RcRectangle::new(&c, 2.0, 3.0, steel, 0.07).with_void(Void { depth: 1.4, width: 2.4 });
        let turned = RcRectangle::new(&c, 3.0, 2.0, steel, 0.07).with_void(Void { depth: 2.4, width: 1.4 });
        // no second order at l0 = 10 m (lambda 13.5 and 9.6 below the limit): M + N l0/400
        // in plane, N max(b/30, 20 mm) = 16 000 x 0.1 out of it
        assert!((checked.design_moment - 10_400.0).abs() < 1e-9, "{}", checked.design_moment);
        assert_eq!(mode_of(&checked, Mode::Interaction), in_plane.utilisation(16_000.0, 10_400.0));
        assert_eq!(mode_of(&checked, Mode::OutOfPlaneBuckling), turned.utilisation(16_000.0, 1_600.0));
        assert_eq!(mode_of(&checked, Mode::Bending), in_plane.utilisation(0.0, 10_000.0));
        assert!(checked.rule.contains("the symmetric box"), "{}", checked.rule);
        // the solid rectangle of the same outline carries more
        let rect = Family::ConcreteRect { width_over_depth: 1.5, reinforcement_ratio: 0.01, cover: 0.07 };
        let solid =
            check(&Material::Concrete(c), &rect, &rect.props(2.0), &demand, &lengths).expect("checks");
        assert!(solid.utilisation < checked.utilisation, "{} {}", solid.utilisation, checked.utilisation);
        assert!(solid.rule.contains("the symmetric rectangle"), "{}", solid.rule);
        // a hand-made box section whose cover reaches half its wall is refused
        let thin = SectionProps { thickness: Some(0.14), ..props };
        let err = check(&preset("c40-50"), &family, &thin, &demand, &lengths).expect_err("cover in the wall");
        assert!(err.contains("half the box's wall"), "{err}");
    }

    #[test]
    fn check_refuses_a_mismatch_and_bad_inputs() {
        let family = Family::Chs { d_over_t: 30.0 };
        let props = family.props(0.3);
        let demand = Demand { tension: 10.0, compression: 0.0, moment: 0.0, least_compression: 0.0 };
        let lengths = Lengths { in_plane: 3.0, out_of_plane: 3.0 };
        let err = check(&preset("gl24h"), &family, &props, &demand, &lengths).expect_err("not glulam");
        assert!(err.contains("CHS cannot be made of GL24h"), "{err}");
        let bad = Demand { tension: -1.0, ..demand };
        assert!(check(&preset("s355"), &family, &props, &bad, &lengths).is_err());
        let short = Lengths { in_plane: 0.0, out_of_plane: 3.0 };
        assert!(check(&preset("s355"), &family, &props, &demand, &short)
            .expect_err("no length")
            .contains("in-plane"));
    }

    /// A plate above 40 mm takes the lower yield strength of EN 1993-1-1 Table 3.1 (S355:
    /// 335 MPa for 40 < t <= 80 mm): a CHS at D/t 20 has a 50 mm wall at 1000 mm, so its
    /// tension resistance is A x 335 MPa; above 80 mm the plate fails its check.
    #[test]
    fn thick_plates_take_the_lower_yield_strength() {
        let family = Family::Chs { d_over_t: 20.0 };
        let props = family.props(1.0);
        assert_eq!(props.thickness, Some(0.05));
        let demand = Demand { tension: 1000.0, compression: 0.0, moment: 0.0, least_compression: 0.0 };
        let lengths = Lengths { in_plane: 5.0, out_of_plane: 5.0 };
        let c = check(&preset("s355"), &family, &props, &demand, &lengths).expect("checks");
        let want = 1000.0 / (props.a * 335_000.0);
        assert!((mode_of(&c, Mode::Tension) - want).abs() < 1e-12, "{:?}", c.modes);
        let thick = family.props(1.8);
        assert_eq!(thick.thickness, Some(0.09));
        let c = check(&preset("s355"), &family, &thick, &demand, &lengths).expect("checks");
        assert_eq!(c.governs, Mode::Thickness);
        assert!(c.utilisation > 1.0);
    }

    #[test]
    fn every_mode_is_listed_and_the_largest_governs() {
        let family = Family::Shs { b_over_t: 20.0 };
        let props = family.props(0.2);
        let demand = Demand { tension: 100.0, compression: 500.0, moment: 20.0, least_compression: 0.0 };
        let c =
            check(&preset("s355"), &family, &props, &demand, &Lengths { in_plane: 4.0, out_of_plane: 8.0 })
                .expect("checks");
        let listed: Vec<Mode> = c.modes.iter().map(|(m, _)| *m).collect();
        assert_eq!(
            listed,
            [
                Mode::Tension,
                Mode::InPlaneBuckling,
                Mode::OutOfPlaneBuckling,
                Mode::Interaction,
                Mode::Thickness,
                Mode::Class
            ]
        );
        // a 10 mm wall against the 80 mm Table 3.1 covers
        assert!((mode_of(&c, Mode::Thickness) - 0.010 / 0.080).abs() < 1e-12);
        let largest = c.modes.iter().map(|(_, u)| *u).fold(0.0, f64::max);
        assert_eq!(c.utilisation, largest);
        assert_eq!(c.governs, Mode::Interaction);
        assert!(
            mode_of(&c, Mode::OutOfPlaneBuckling) > mode_of(&c, Mode::InPlaneBuckling),
            "longer out of plane"
        );
        assert!(c.rule.contains("6.61") && c.rule.contains("curve a"), "{}", c.rule);
    }

    fn mode_of(c: &Check, wanted: Mode) -> f64 {
        c.modes.iter().find(|(m, _)| *m == wanted).map(|(_, u)| *u).unwrap_or(f64::NAN)
    }

    #[test]
    fn a_box_beyond_class_3_is_refused_with_its_ratio() {
        // webs h/t_w = 60: c/t = 60 (1 - 2 x 0.6 / 30) = 57.6 > 42 eps = 34.2 for S355
        let family = Family::WeldedBox { width_over_depth: 0.6, flange_ratio: 30.0, web_ratio: 60.0 };
        let err = class_3(&family, &preset("s355")).expect_err("class 4 webs");
        assert!(
            err.contains("c/t of the webs") && err.contains("57.6") && err.contains("42 eps = 34.2"),
            "{err}"
        );
        assert_eq!(class_3(&Family::family_presets()[2].1, &preset("s460")), Ok(()));
    }

    #[test]
    fn sizes_every_material() {
        let demand = Demand { tension: 0.0, compression: 3000.0, moment: 300.0, least_compression: 0.0 };
        let lengths = Lengths { in_plane: 8.0, out_of_plane: 8.0 };
        for (material, family) in
            [("s355", "chs"), ("s355", "shs"), ("s460", "box"), ("c40-50", "concrete"), ("gl28h", "glulam")]
        {
            let family = Family::family_presets().into_iter().find(|(k, _)| *k == family).map(|(_, f)| f);
            let family = family.unwrap_or_else(|| panic!("family"));
            let sized = size_member(&preset(material), &family, &demand, &lengths)
                .unwrap_or_else(|e| panic!("{material}: {e}"));
            assert!(sized.check.utilisation <= 1.0 && sized.check.utilisation > 0.5, "{material}: {sized:?}");
        }
    }
}
