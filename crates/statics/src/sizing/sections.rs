//! Parametric section families: one number, `size` (m), sizes a family (the outer
//! diameter of a tube, the outer width of a square tube, the depth of a box or a
//! rectangle); the family's ratios give the rest. Properties in m, m2, m4, m3.

use serde::{Deserialize, Serialize};

/// A family of sections sized by one number, `size`, m.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Family {
    /// Hot-finished circular hollow section (EN 10210-2), outer diameter D = size, wall
    /// t = D / d_over_t (rounded up to whole mm).
    Chs {
        /// D / t.
        d_over_t: f64,
    },
    /// Hot-finished square hollow section (EN 10210-2 corner radii: outer 1.5 t, inner
    /// 1.0 t), outer width b = size, wall t = b / b_over_t (rounded up to whole mm).
    Shs {
        /// b / t.
        b_over_t: f64,
    },
    /// Welded steel box, size = depth h (in the arch plane); width = width_over_depth * h;
    /// flange t_f = width / flange_ratio, web t_w = h / web_ratio (both rounded up to whole
    /// mm); the webs sit between the flanges at the box's outer faces.
    WeldedBox {
        /// Outer width / outer depth.
        width_over_depth: f64,
        /// Outer width / flange thickness.
        flange_ratio: f64,
        /// Outer depth / web thickness.
        web_ratio: f64,
    },
    /// Solid rectangular reinforced-concrete rib, size = depth h; width =
    /// width_over_depth * h; total longitudinal reinforcement ratio rho (A_s / A_c, half at each face in the
    /// arch plane), cover to bar centres `cover` m.
    ConcreteRect {
        /// Width / depth.
        width_over_depth: f64,
        /// A_s / A_c, total.
        reinforcement_ratio: f64,
        /// Distance from a face to the centres of its bars, m.
        cover: f64,
    },
    /// Glulam rectangle, size = depth h; width = width_over_depth * h.
    GlulamRect {
        /// Width / depth.
        width_over_depth: f64,
    },
}

/// The properties of one section of a family. "In-plane" is bending in the arch plane
/// (about the axis across the deck), along `depth`; "out-of-plane" about the axis in the
/// arch plane, along `width`.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct SectionProps {
    /// The family's size, m.
    pub size: f64,
    /// Outer depth in the arch plane, m.
    pub depth: f64,
    /// Outer width across the arch plane, m.
    pub width: f64,
    /// Steel wall thickness (tubes) or flange thickness (welded box), m; `None` for solid
    /// sections.
    pub thickness: Option<f64>,
    /// Area, m2 (the gross concrete area A_c for concrete).
    pub a: f64,
    /// Second moment of area for bending in the arch plane, m4.
    pub i: f64,
    /// Second moment of area for bending out of the arch plane, m4.
    pub i_out: f64,
    /// Elastic section modulus for bending in the arch plane, m3.
    pub w_el: f64,
    /// Radius of gyration in the arch plane sqrt(I / A), m.
    pub radius_in: f64,
    /// Radius of gyration out of the arch plane sqrt(I_out / A), m.
    pub radius_out: f64,
    /// Concrete only: total longitudinal reinforcement A_s, m2.
    pub steel_area_rebar: Option<f64>,
}
