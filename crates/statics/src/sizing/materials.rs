//! Materials for sizing: structural steel, reinforced concrete and glued laminated timber,
//! each with the strengths, stiffness, unit weight and partial factors its resistance
//! rules need, and presets after the Eurocodes.
//!
//! Units: stresses and moduli in kN/m2 (1 MPa = 1000 kN/m2), unit weights in kN/m3.
//! Every value is a field the user can edit: national annexes change several of them
//! (partial factors, alpha_cc), and the presets are for concept design only; local codes
//! and a licensed engineer govern.

use serde::{Deserialize, Serialize};

/// kN/m2 per MPa.
const MPA: f64 = 1000.0;

/// The strongest concrete the rules cover, f_ck 90 MPa in kN/m2 (EN 1992-1-1 Table 3.1,
/// C90/105).
pub const MAX_FCK: f64 = 90.0 * MPA;

/// A material of a member, with what its resistance rules need.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Material {
    /// Structural steel (EN 1993-1-1).
    Steel(Steel),
    /// Reinforced concrete (EN 1992-1-1).
    Concrete(Concrete),
    /// Glued laminated timber (EN 1995-1-1, strength classes of EN 14080).
    Glulam(Glulam),
}

/// Structural steel.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Steel {
    /// Name shown to the user (e.g. `S355`).
    pub name: String,
    /// Yield strength f_y, kN/m2 (EN 1993-1-1 Table 3.1 for the thickness range).
    pub fy: f64,
    /// Young's modulus E, kN/m2 (210 GPa, EN 1993-1-1 3.2.6).
    pub e: f64,
    /// Unit weight, kN/m3.
    pub unit_weight: f64,
    /// Partial factor gamma_M0 for the resistance of cross-sections (EN 1993-2 6.1).
    pub gamma_m0: f64,
    /// Partial factor gamma_M1 for member buckling (EN 1993-2 6.1).
    pub gamma_m1: f64,
}

/// Reinforced concrete: the concrete and its longitudinal reinforcement.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Concrete {
    /// Name shown to the user (e.g. `C40/50`).
    pub name: String,
    /// Characteristic cylinder strength f_ck, kN/m2 (EN 1992-1-1 Table 3.1).
    pub fck: f64,
    /// Secant modulus E_cm, kN/m2 (EN 1992-1-1 Table 3.1); used for analysis and buckling.
    pub e_cm: f64,
    /// Unit weight of the reinforced concrete, kN/m3.
    pub unit_weight: f64,
    /// Partial factor gamma_C of concrete (EN 1992-1-1 Table 2.1N).
    pub gamma_c: f64,
    /// Coefficient alpha_cc for long-term effects on the compressive strength (EN 1992-1-1
    /// 3.1.6(1)).
    pub alpha_cc: f64,
    /// Characteristic yield strength f_yk of the reinforcement, kN/m2.
    pub rebar_fyk: f64,
    /// Partial factor gamma_S of reinforcement (EN 1992-1-1 Table 2.1N).
    pub gamma_s: f64,
}

/// Glued laminated timber of a strength class.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Glulam {
    /// Name shown to the user (e.g. `GL28h`).
    pub name: String,
    /// Characteristic bending strength f_m,k, kN/m2.
    pub f_m_k: f64,
    /// Characteristic tensile strength along the grain f_t,0,k, kN/m2.
    pub f_t0_k: f64,
    /// Characteristic compressive strength along the grain f_c,0,k, kN/m2.
    pub f_c0_k: f64,
    /// Mean modulus of elasticity along the grain E_0,mean, kN/m2 (analysis).
    pub e_0_mean: f64,
    /// 5 % modulus of elasticity along the grain E_0,05, kN/m2 (buckling, EN 1995-1-1 6.3.2).
    pub e_0_05: f64,
    /// Unit weight, kN/m3.
    pub unit_weight: f64,
    /// Modification factor k_mod for load duration and moisture (EN 1995-1-1 Table 3.1).
    pub k_mod: f64,
    /// Partial factor gamma_M (EN 1995-1-1 Table 2.3).
    pub gamma_m: f64,
}

/// A value with its name in words, for messages.
type Named = (&'static str, f64);

impl Material {
    /// The material's name as the user sees it.
    pub fn name(&self) -> &str {
        match self {
            Material::Steel(s) => &s.name,
            Material::Concrete(c) => &c.name,
            Material::Glulam(g) => &g.name,
        }
    }

    /// The mean Young's modulus for analysis, kN/m2: E of steel, E_cm of concrete,
    /// E_0,mean of glulam.
    pub fn e(&self) -> f64 {
        match self {
            Material::Steel(s) => s.e,
            Material::Concrete(c) => c.e_cm,
            Material::Glulam(g) => g.e_0_mean,
        }
    }

    /// Unit weight, kN/m3.
    pub fn unit_weight(&self) -> f64 {
        match self {
            Material::Steel(s) => s.unit_weight,
            Material::Concrete(c) => c.unit_weight,
            Material::Glulam(g) => g.unit_weight,
        }
    }

    /// Whether the material is structural steel.
    pub fn is_steel(&self) -> bool {
        matches!(self, Material::Steel(_))
    }

    /// What is wrong with the material's values, in words a user can act on: every
    /// strength, modulus and unit weight must be a finite number above zero, every
    /// partial factor at least 1, alpha_cc in (0, 1], f_ck at most 90 MPa (EN 1992-1-1
    /// Table 3.1), k_mod in (0, 1.1] (the largest value of EN 1995-1-1 Table 3.1,
    /// instantaneous actions), E_0,05 at most E_0,mean. The first problem found is
    /// returned.
    pub fn check(&self) -> Result<(), String> {
        let name = self.name();
        if name.trim().is_empty() {
            return Err("the material needs a name".to_string());
        }
        let (positives, factors): (Vec<Named>, Vec<Named>) = match self {
            Material::Steel(s) => (
                vec![("yield strength fy", s.fy), ("Young's modulus E", s.e), ("unit weight", s.unit_weight)],
                vec![("gamma_M0", s.gamma_m0), ("gamma_M1", s.gamma_m1)],
            ),
            Material::Concrete(c) => (
                vec![
                    ("strength fck", c.fck),
                    ("modulus E_cm", c.e_cm),
                    ("unit weight", c.unit_weight),
                    ("alpha_cc", c.alpha_cc),
                    ("reinforcement yield strength fyk", c.rebar_fyk),
                ],
                vec![("gamma_C", c.gamma_c), ("gamma_S", c.gamma_s)],
            ),
            Material::Glulam(g) => (
                vec![
                    ("bending strength f_m,k", g.f_m_k),
                    ("tensile strength f_t,0,k", g.f_t0_k),
                    ("compressive strength f_c,0,k", g.f_c0_k),
                    ("modulus E_0,mean", g.e_0_mean),
                    ("modulus E_0,05", g.e_0_05),
                    ("unit weight", g.unit_weight),
                    ("k_mod", g.k_mod),
                ],
                vec![("gamma_M", g.gamma_m)],
            ),
        };
        for (what, value) in positives {
            if !value.is_finite() {
                return Err(format!("{name}: the {what} must be a number (it is {value})"));
            }
            if value <= 0.0 {
                return Err(format!("{name}: the {what} must be above zero (it is {value})"));
            }
        }
        for (what, value) in factors {
            if !value.is_finite() || value < 1.0 {
                return Err(format!("{name}: the partial factor {what} must be at least 1 (it is {value})"));
            }
        }
        match self {
            Material::Concrete(c) if c.fck > MAX_FCK => Err(format!(
                "{name}: f_ck must be at most 90 MPa (it is {} MPa; EN 1992-1-1 Table 3.1 ends at C90/105)",
                c.fck / MPA
            )),
            Material::Concrete(c) if c.alpha_cc > 1.0 => Err(format!(
                "{name}: alpha_cc must be at most 1 (it is {}; EN 1992-1-1 3.1.6(1))",
                c.alpha_cc
            )),
            Material::Glulam(g) if g.k_mod > 1.1 => Err(format!(
                "{name}: k_mod must be at most 1.1 (it is {}; EN 1995-1-1 Table 3.1, instantaneous actions)",
                g.k_mod
            )),
            Material::Glulam(g) if g.e_0_05 > g.e_0_mean => Err(format!(
                "{name}: the 5 % modulus E_0,05 ({}) cannot exceed the mean E_0,mean ({})",
                g.e_0_05, g.e_0_mean
            )),
            _ => Ok(()),
        }
    }
}

/// Sources of the steel presets.
const STEEL_SOURCE: &str =
    "f_y: EN 1993-1-1 Table 3.1 (EN 10025-2/-3, t <= 40 mm); E = 210 GPa: EN 1993-1-1 \
     3.2.6; 77 kN/m3: EN 1991-1-1 Table A.4; gamma_M0 = 1.00, gamma_M1 = 1.10: EN 1993-2 6.1 recommended \
     values (the National Annex may change them)";

/// Sources of the concrete presets.
const CONCRETE_SOURCE: &str = "f_ck, E_cm: EN 1992-1-1 Table 3.1; 25 kN/m3 (reinforced, normal weight): \
     EN 1991-1-1 Table A.1; gamma_C = 1.5, gamma_S = 1.15: EN 1992-1-1 Table 2.1N (persistent and \
     transient); alpha_cc = 0.85: recommended for bridges in EN 1992-2 3.1.6(101)P (EN 1992-1-1 \
     3.1.6(1) recommends 1.0 for buildings; the National Annex may differ); \
     reinforcement B500, f_yk = 500 MPa (EN 1992-1-1 Annex C)";

/// Sources of the glulam presets.
const GLULAM_SOURCE: &str = "strengths and moduli: EN 14080 Table 5, homogeneous glulam (from memory); \
     unit weight: the class's mean density rho_mean of the same table times 9.81 m/s2, rounded to \
     0.1 kN/m3 (EN 1991-1-1 Table A.3 lists slightly lower values for the older classes); k_mod = 0.55: \
     EN 1995-1-1 Table 3.1, service class 3 (a bridge exposed to the weather), long-term: one value for \
     every combination, below the 0.70 of short-term traffic and, while the traffic is at least a tenth \
     of the permanent effect, at least as safe as the permanent-only check at 0.50 (conservative, common \
     practice at concept stage; a covered bridge in service class 2 may take more); gamma_M = 1.25: EN 1995-1-1 Table 2.3, glued laminated timber";

fn steel(name: &str, fy_mpa: f64) -> Material {
    Material::Steel(Steel {
        name: name.to_string(),
        fy: fy_mpa * MPA,
        e: 210_000.0 * MPA,
        unit_weight: 77.0,
        gamma_m0: 1.0,
        gamma_m1: 1.1,
    })
}

fn concrete(name: &str, fck_mpa: f64, e_cm_gpa: f64) -> Material {
    Material::Concrete(Concrete {
        name: name.to_string(),
        fck: fck_mpa * MPA,
        e_cm: e_cm_gpa * 1000.0 * MPA,
        unit_weight: 25.0,
        gamma_c: 1.5,
        alpha_cc: 0.85,
        rebar_fyk: 500.0 * MPA,
        gamma_s: 1.15,
    })
}

/// A glulam class from its EN 14080 Table 5 values: strengths and moduli in MPa, mean
/// density in kg/m3.
fn glulam(name: &str, f_m: f64, f_t0: f64, f_c0: f64, e_mean: f64, e_05: f64, rho_mean: f64) -> Material {
    // kN/m3 = kg/m3 * 9.81 m/s2 / 1000, rounded to 0.1 kN/m3
    let unit_weight = (rho_mean * 9.81 / 1000.0 * 10.0).round() / 10.0;
    Material::Glulam(Glulam {
        name: name.to_string(),
        f_m_k: f_m * MPA,
        f_t0_k: f_t0 * MPA,
        f_c0_k: f_c0 * MPA,
        e_0_mean: e_mean * MPA,
        e_0_05: e_05 * MPA,
        unit_weight,
        k_mod: 0.55,
        gamma_m: 1.25,
    })
}

/// The `s355` preset (structural steel S355), as `material_presets` lists it.
pub(crate) fn s355() -> Material {
    steel("S355", 355.0)
}

/// The `c40-50` preset (concrete C40/50), as `material_presets` lists it.
pub(crate) fn c40_50() -> Material {
    concrete("C40/50", 40.0, 35.0)
}

/// The `gl24h` preset (glulam GL24h), as `material_presets` lists it.
pub(crate) fn gl24h() -> Material {
    glulam("GL24h", 24.0, 19.2, 24.0, 11_500.0, 9_600.0, 420.0)
}

/// The material presets: (key, material, the source of its values). Keys are ours, lower
/// case: steel `s235`, `s355`, `s460`; concrete `c30-37`, `c40-50`, `c50-60`; glulam
/// `gl24h`, `gl28h`, `gl32h`. Values quoted from memory are marked so in the source text.
pub fn material_presets() -> Vec<(&'static str, Material, &'static str)> {
    vec![
        ("s235", steel("S235", 235.0), STEEL_SOURCE),
        ("s355", s355(), STEEL_SOURCE),
        ("s460", steel("S460", 460.0), STEEL_SOURCE),
        ("c30-37", concrete("C30/37", 30.0, 33.0), CONCRETE_SOURCE),
        ("c40-50", c40_50(), CONCRETE_SOURCE),
        ("c50-60", concrete("C50/60", 50.0, 37.0), CONCRETE_SOURCE),
        ("gl24h", gl24h(), GLULAM_SOURCE),
        ("gl28h", glulam("GL28h", 28.0, 22.3, 28.0, 12_600.0, 10_500.0, 460.0), GLULAM_SOURCE),
        ("gl32h", glulam("GL32h", 32.0, 25.6, 32.0, 14_200.0, 11_800.0, 490.0), GLULAM_SOURCE),
    ]
}

/// The preset of a key (see `material_presets`), or `None` for an unknown key.
pub fn material_preset(key: &str) -> Option<Material> {
    material_presets().into_iter().find(|(k, _, _)| *k == key).map(|(_, m, _)| m)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn presets_are_valid_and_found_by_key() {
        let presets = material_presets();
        assert_eq!(presets.len(), 9);
        for (key, material, source) in &presets {
            assert_eq!(material.check(), Ok(()), "{key}");
            assert_eq!(material_preset(key).as_ref(), Some(material));
            assert!(!source.is_empty());
        }
        assert_eq!(material_preset("s999"), None);
    }

    #[test]
    fn preset_values_in_crate_units() {
        // EN 1993-1-1 Table 3.1 (t <= 40 mm): S355 f_y = 355 MPa; E = 210 GPa (3.2.6)
        let Some(Material::Steel(s)) = material_preset("s355") else { panic!("steel") };
        assert_eq!((s.fy, s.e, s.gamma_m1), (355e3, 210e6, 1.1));
        // EN 1992-1-1 Table 3.1: C40/50 f_ck 40 MPa, E_cm 35 GPa
        let Some(Material::Concrete(c)) = material_preset("c40-50") else { panic!("concrete") };
        assert_eq!((c.fck, c.e_cm, c.unit_weight), (40e3, 35e6, 25.0));
        // EN 14080 Table 5 (from memory): GL28h rho_mean 460 kg/m3 -> 4.5 kN/m3
        let Some(Material::Glulam(g)) = material_preset("gl28h") else { panic!("glulam") };
        assert_eq!((g.f_m_k, g.e_0_05, g.unit_weight), (28e3, 10_500e3, 4.5));
        assert_eq!(Material::Glulam(g.clone()).e(), 12_600e3, "analysis uses the mean modulus");
    }

    #[test]
    fn check_names_what_to_fix() {
        let Some(Material::Steel(mut s)) = material_preset("s235") else { panic!("steel") };
        s.gamma_m0 = 0.9;
        let err = Material::Steel(s.clone()).check().expect_err("gamma below 1");
        assert!(err.contains("gamma_M0") && err.contains("at least 1"), "{err}");
        s.gamma_m0 = 1.0;
        s.fy = f64::NAN;
        assert!(Material::Steel(s).check().expect_err("NaN").contains("yield strength"));
        let Some(Material::Glulam(mut g)) = material_preset("gl24h") else { panic!("glulam") };
        g.k_mod = 1.2;
        assert!(Material::Glulam(g.clone())
            .check()
            .expect_err("k_mod")
            .contains("k_mod must be at most 1.1"));
        g.k_mod = 0.0;
        assert!(Material::Glulam(g).check().expect_err("k_mod").contains("above zero"));
        let Some(Material::Concrete(mut c)) = material_preset("c30-37") else { panic!("concrete") };
        c.alpha_cc = 1.2;
        assert!(Material::Concrete(c.clone()).check().expect_err("alpha_cc").contains("alpha_cc"));
        c.alpha_cc = 0.85;
        c.fck = 100e3;
        assert!(Material::Concrete(c).check().expect_err("fck").contains("90 MPa"));
    }

    #[test]
    fn serde_tags_the_kind() {
        let m = material_preset("s355").expect("preset");
        let json = serde_json::to_string(&m).expect("serialises");
        assert!(json.starts_with(r#"{"kind":"steel","name":"S355""#), "{json}");
        assert_eq!(serde_json::from_str::<Material>(&json).expect("reads back"), m);
    }
}
