//! Parametric section families: one number, `size` (m), sizes a family (the outer
//! diameter of a tube, the outer width of a square tube, the depth of a box or a
//! rectangle); the family's ratios give the rest. Properties in m, m2, m4, m3.

use super::materials::Material;
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
    /// Hollow reinforced-concrete box rib, size = outer depth h (in the arch plane); outer
    /// width b = width_over_depth * h; every wall (top and bottom slabs, both webs) t =
    /// wall_over_depth * h rounded up to whole 10 mm (concrete dimensions step by 10 mm:
    /// common practice); total longitudinal reinforcement ratio rho (A_s / A_c of the
    /// concrete the walls hold, half at each face in the arch plane), cover to bar centres
    /// `cover` m.
    ConcreteBox {
        /// Outer width / outer depth.
        width_over_depth: f64,
        /// Wall thickness / outer depth (before rounding up to whole 10 mm).
        wall_over_depth: f64,
        /// A_s / A_c, total.
        reinforcement_ratio: f64,
        /// Distance from an outer face to the centres of its bars, m.
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
    /// Steel wall thickness (tubes), flange thickness (welded box) or the concrete box's
    /// wall thickness, m; `None` for solid sections.
    pub thickness: Option<f64>,
    /// Area, m2 (the gross concrete area A_c for concrete: the walls' for the box).
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

/// Slack, in mm, under which a computed thickness is taken as already whole before
/// rounding up: D / (D / t) is off by a few ulps (323.9 / 32.39 gives 10.000000000000002
/// mm), which must stay 10 mm, not become 11 mm. A millionth of a mm is far above that
/// rounding and far below any real thickness step.
const WHOLE_MM_SLACK: f64 = 1e-6;

/// `length` (m) rounded up to whole mm, m (steel plate and tube walls come in whole mm:
/// common practice).
fn up_to_whole_mm(length: f64) -> f64 {
    (length * 1000.0 - WHOLE_MM_SLACK).ceil() / 1000.0
}

/// Slack, in 10 mm steps, under which a computed concrete wall is taken as already whole
/// before rounding up (0.12 x 1.0 m is 120 mm give or take a few ulps): the same millionth
/// of a mm as `WHOLE_MM_SLACK`.
const WHOLE_10_MM_SLACK: f64 = WHOLE_MM_SLACK / 10.0;

/// `length` (m) rounded up to whole 10 mm, m (concrete dimensions step by 10 mm: common
/// practice).
fn up_to_whole_10_mm(length: f64) -> f64 {
    (length * 100.0 - WHOLE_10_MM_SLACK).ceil() / 100.0
}

/// `length` (m) in mm for a label: to 0.1 mm, without a trailing `.0` (`323.9`, `508`).
fn mm(length: f64) -> String {
    let tenths = (length * 10_000.0).round() / 10.0;
    format!("{tenths}")
}

/// Area and second moment of area (about the centroidal axis parallel to `b`) of a solid
/// `b` x `h` rectangle whose four corners are rounded to radius `r`, m2 and m4. The
/// piece a corner loses (the square r x r less the quarter disc) has area (1 - pi/4) r2,
/// first moment r3 / 6 and second moment r4 (1/3 - pi/16) about the line through the
/// disc's centre; that centre lies h/2 - r from the axis. After the formulas behind
/// EN 10210-2 Annex B.
fn rounded_rectangle(b: f64, h: f64, r: f64) -> (f64, f64) {
    use std::f64::consts::PI;
    let piece_area = (1.0 - PI / 4.0) * r * r;
    let piece_first = r.powi(3) / 6.0;
    let piece_second = r.powi(4) * (1.0 / 3.0 - PI / 16.0);
    let c = h / 2.0 - r;
    let area = b * h - 4.0 * piece_area;
    let i = b * h.powi(3) / 12.0 - 4.0 * (c * c * piece_area + 2.0 * c * piece_first + piece_second);
    (area, i)
}

/// Properties from area and the two second moments, with `depth` for the elastic modulus.
#[allow(clippy::too_many_arguments)]
fn from_parts(
    size: f64,
    depth: f64,
    width: f64,
    thickness: Option<f64>,
    a: f64,
    i: f64,
    i_out: f64,
    steel_area_rebar: Option<f64>,
) -> SectionProps {
    SectionProps {
        size,
        depth,
        width,
        thickness,
        a,
        i,
        i_out,
        w_el: 2.0 * i / depth,
        radius_in: (i / a).sqrt(),
        radius_out: (i_out / a).sqrt(),
        steel_area_rebar,
    }
}

/// A family's ratios: the check of one that must be finite and above `least`.
fn ratio_above(what: &str, value: f64, least: f64, why: &str) -> Result<(), String> {
    if !value.is_finite() {
        return Err(format!("the {what} must be a number (it is {value})"));
    }
    if value <= least {
        return Err(format!("the {what} must be above {least} ({why}; it is {value})"));
    }
    Ok(())
}

/// Refuses a total reinforcement ratio outside [0.002, 0.04] (EN 1992-1-1 9.5.2), or not
/// a number.
fn reinforcement_within_limits(ratio: f64) -> Result<(), String> {
    if !(MIN_REINFORCEMENT_RATIO..=MAX_REINFORCEMENT_RATIO).contains(&ratio) {
        return Err(format!(
            "the reinforcement ratio A_s/A_c must lie within {MIN_REINFORCEMENT_RATIO} and \
             {MAX_REINFORCEMENT_RATIO} (EN 1992-1-1 9.5.2; it is {ratio})"
        ));
    }
    Ok(())
}

/// Least total reinforcement ratio A_s / A_c of a concrete rib: 0.002 (EN 1992-1-1
/// 9.5.2(2), the 0.002 A_c floor of A_s,min).
pub const MIN_REINFORCEMENT_RATIO: f64 = 0.002;
/// Largest total reinforcement ratio A_s / A_c outside laps: 0.04 (EN 1992-1-1 9.5.2(3),
/// recommended value).
pub const MAX_REINFORCEMENT_RATIO: f64 = 0.04;

impl Family {
    /// The `chs` preset (see `family_presets`).
    pub(crate) const CHS: Family = Family::Chs { d_over_t: 40.0 };
    /// The `shs` preset (see `family_presets`).
    pub(crate) const SHS: Family = Family::Shs { b_over_t: 25.0 };
    /// The `box` preset (see `family_presets`).
    pub(crate) const BOX: Family =
        Family::WeldedBox { width_over_depth: 0.6, flange_ratio: 30.0, web_ratio: 30.0 };

    /// The section of this family at `size`, m (outer diameter, outer width or depth).
    ///
    /// - CHS: t = D / (D/t) rounded up to whole mm; A = pi/4 (D^2 - d^2), I = pi/64 (D^4 -
    ///   d^4) with d = D - 2t, the same both ways (EN 10210-2 Annex B).
    /// - SHS: t = b / (b/t) rounded up to whole mm; corners rounded outside 1.5 t, inside
    ///   1.0 t; A and I of the outer rounded square less the inner one (EN 10210-2 Annex
    ///   B, the corner radii of its Table A.1 note).
    /// - Welded box: flanges the full width, webs between them at the outer faces;
    ///   t_f, t_w rounded up to whole mm; I = (b h^3 - (b - 2 t_w)(h - 2 t_f)^3) / 12 and
    ///   likewise out of plane.
    /// - Concrete and glulam rectangles: the gross section b h, I = b h^3 / 12 (concrete:
    ///   uncracked, without the bars, as for analysis stiffness; A_s = rho b h in
    ///   `steel_area_rebar`).
    /// - Concrete box: walls t = wall_over_depth h rounded up to whole 10 mm (`thickness`);
    ///   the gross walls A_c = b h - (b - 2t)(h - 2t), I = (b h^3 - (b - 2t)(h - 2t)^3) /
    ///   12 and likewise out of plane (uncracked, without the bars); A_s = rho A_c.
    ///
    /// Area, I and W grow with size along the family's grid. Degenerate: a size at or
    /// below zero, or ratios `check` refuses, give meaningless (possibly NaN) numbers;
    /// callers check the family first.
    pub fn props(&self, size: f64) -> SectionProps {
        use std::f64::consts::PI;
        match *self {
            Family::Chs { d_over_t } => {
                let t = up_to_whole_mm(size / d_over_t);
                let d = size - 2.0 * t;
                let a = PI / 4.0 * (size * size - d * d);
                let i = PI / 64.0 * (size.powi(4) - d.powi(4));
                from_parts(size, size, size, Some(t), a, i, i, None)
            }
            Family::Shs { b_over_t } => {
                let t = up_to_whole_mm(size / b_over_t);
                let (outer_a, outer_i) = rounded_rectangle(size, size, 1.5 * t);
                let inner = size - 2.0 * t;
                let (inner_a, inner_i) = rounded_rectangle(inner, inner, t);
                let i = outer_i - inner_i;
                from_parts(size, size, size, Some(t), outer_a - inner_a, i, i, None)
            }
            Family::WeldedBox { width_over_depth, flange_ratio, web_ratio } => {
                let h = size;
                let b = width_over_depth * h;
                let t_f = up_to_whole_mm(b / flange_ratio);
                let t_w = up_to_whole_mm(h / web_ratio);
                let (clear_h, clear_b) = (h - 2.0 * t_f, b - 2.0 * t_w);
                let a = b * h - clear_b * clear_h;
                let i = (b * h.powi(3) - clear_b * clear_h.powi(3)) / 12.0;
                let i_out = (h * b.powi(3) - clear_h * clear_b.powi(3)) / 12.0;
                from_parts(size, h, b, Some(t_f), a, i, i_out, None)
            }
            Family::ConcreteRect { width_over_depth, reinforcement_ratio, .. } => {
                let (h, b) = (size, width_over_depth * size);
                let a = b * h;
                let (i, i_out) = (b * h.powi(3) / 12.0, h * b.powi(3) / 12.0);
                from_parts(size, h, b, None, a, i, i_out, Some(reinforcement_ratio * a))
            }
            Family::ConcreteBox { width_over_depth, wall_over_depth, reinforcement_ratio, .. } => {
                let (h, b) = (size, width_over_depth * size);
                let t = up_to_whole_10_mm(wall_over_depth * h);
                let (void_h, void_b) = (h - 2.0 * t, b - 2.0 * t);
                let a = b * h - void_b * void_h;
                let i = (b * h.powi(3) - void_b * void_h.powi(3)) / 12.0;
                let i_out = (h * b.powi(3) - void_h * void_b.powi(3)) / 12.0;
                from_parts(size, h, b, Some(t), a, i, i_out, Some(reinforcement_ratio * a))
            }
            Family::GlulamRect { width_over_depth } => {
                let (h, b) = (size, width_over_depth * size);
                let (i, i_out) = (b * h.powi(3) / 12.0, h * b.powi(3) / 12.0);
                from_parts(size, h, b, None, b * h, i, i_out, None)
            }
        }
    }

    /// The concrete box's void at `size` as (depth in the arch plane, width across it), m:
    /// the outer dimensions less two walls each way (`None` for other families). The void
    /// is centred in the box.
    pub fn void(&self, size: f64) -> Option<(f64, f64)> {
        match *self {
            Family::ConcreteBox { .. } => {
                let p = self.props(size);
                let t = p.thickness.unwrap_or(0.0);
                Some((p.depth - 2.0 * t, p.width - 2.0 * t))
            }
            _ => None,
        }
    }

    /// The welded box's web thickness at `size`, m (`None` for other families): the flange
    /// thickness is `SectionProps::thickness`.
    pub fn web_thickness(&self, size: f64) -> Option<f64> {
        match *self {
            Family::WeldedBox { web_ratio, .. } => Some(up_to_whole_mm(size / web_ratio)),
            _ => None,
        }
    }

    /// The section in words, dimensions in mm: `CHS 323.9 x 10`, `SHS 300 x 300 x 10`,
    /// `box 1600 x 960 (t 28/18)` (depth x width, flange/web thickness), `concrete 1500 x
    /// 900` and `glulam 1200 x 240` (depth x width), `concrete box 5000 x 10000 (t 600)`
    /// (depth x width, wall thickness).
    pub fn label(&self, size: f64) -> String {
        let p = self.props(size);
        let t = p.thickness.unwrap_or(0.0);
        match self {
            Family::Chs { .. } => format!("CHS {} x {}", mm(size), mm(t)),
            Family::Shs { .. } => format!("SHS {} x {} x {}", mm(size), mm(size), mm(t)),
            Family::WeldedBox { .. } => format!(
                "box {} x {} (t {}/{})",
                mm(p.depth),
                mm(p.width),
                mm(t),
                mm(self.web_thickness(size).unwrap_or(0.0))
            ),
            Family::ConcreteRect { .. } => format!("concrete {} x {}", mm(p.depth), mm(p.width)),
            Family::ConcreteBox { .. } => {
                format!("concrete box {} x {} (t {})", mm(p.depth), mm(p.width), mm(t))
            }
            Family::GlulamRect { .. } => format!("glulam {} x {}", mm(p.depth), mm(p.width)),
        }
    }

    /// The family's name in words (`CHS`, `SHS`, `welded box`, `concrete rectangle`,
    /// `concrete box`, `glulam rectangle`).
    pub fn name(&self) -> &'static str {
        match self {
            Family::Chs { .. } => "CHS",
            Family::Shs { .. } => "SHS",
            Family::WeldedBox { .. } => "welded box",
            Family::ConcreteRect { .. } => "concrete rectangle",
            Family::ConcreteBox { .. } => "concrete box",
            Family::GlulamRect { .. } => "glulam rectangle",
        }
    }

    /// Whether the family can be made of `material`: tubes and boxes of steel, the
    /// concrete rectangle and box of concrete, the glulam rectangle of glulam.
    pub fn suits(&self, material: &Material) -> bool {
        matches!(
            (self, material),
            (Family::Chs { .. } | Family::Shs { .. } | Family::WeldedBox { .. }, Material::Steel(_))
                | (Family::ConcreteRect { .. } | Family::ConcreteBox { .. }, Material::Concrete(_))
                | (Family::GlulamRect { .. }, Material::Glulam(_))
        )
    }

    /// What is wrong with the family's ratios, in words a user can act on: every ratio
    /// finite and above zero; walls that leave a hollow (CHS D/t above 2, SHS b/t above 4
    /// so the inner corners fit, a box whose flanges and webs leave a clear space at the
    /// smallest size tried); the concrete reinforcement ratio within [0.002, 0.04] (EN
    /// 1992-1-1 9.5.2) and the cover below a quarter of the smallest depth tried; the
    /// concrete box's walls leaving a void at the smallest size tried (2t below both h and
    /// b) and its cover below half the wall there (the bars sit within the walls). The
    /// slenderness class depends on the grade: `resistance` checks it.
    pub fn check(&self) -> Result<(), String> {
        let (smallest, _, _) = self.sizes();
        match *self {
            Family::Chs { d_over_t } => ratio_above("CHS D/t", d_over_t, 2.0, "the wall must leave a hole"),
            Family::Shs { b_over_t } => {
                ratio_above("SHS b/t", b_over_t, 4.0, "the inner corners of radius t must fit")
            }
            Family::WeldedBox { width_over_depth, flange_ratio, web_ratio } => {
                ratio_above("box width/depth", width_over_depth, 0.0, "a box has a width")?;
                ratio_above("box width/flange thickness", flange_ratio, 0.0, "flanges have a thickness")?;
                ratio_above("box depth/web thickness", web_ratio, 0.0, "webs have a thickness")?;
                let p = self.props(smallest);
                let t_w = self.web_thickness(smallest).unwrap_or(0.0);
                let t_f = p.thickness.unwrap_or(0.0);
                if p.width - 2.0 * t_w <= 0.0 || p.depth - 2.0 * t_f <= 0.0 {
                    return Err(format!(
                        "the box's plates fill it at the smallest depth tried, {} mm (flanges {} mm, webs {} mm): \
                         raise the width/flange and depth/web ratios",
                        mm(smallest),
                        mm(t_f),
                        mm(t_w)
                    ));
                }
                Ok(())
            }
            Family::ConcreteRect { width_over_depth, reinforcement_ratio, cover } => {
                ratio_above("concrete width/depth", width_over_depth, 0.0, "a rib has a width")?;
                reinforcement_within_limits(reinforcement_ratio)?;
                ratio_above("cover to the bar centres", cover, 0.0, "bars sit inside the concrete")?;
                if cover >= smallest / 4.0 {
                    return Err(format!(
                        "the cover to the bar centres, {} mm, must stay below a quarter of the smallest depth \
                         tried ({} mm): below {} mm",
                        mm(cover),
                        mm(smallest),
                        mm(smallest / 4.0)
                    ));
                }
                Ok(())
            }
            Family::ConcreteBox { width_over_depth, wall_over_depth, reinforcement_ratio, cover } => {
                ratio_above("concrete box width/depth", width_over_depth, 0.0, "a box has a width")?;
                ratio_above("concrete box wall/depth", wall_over_depth, 0.0, "walls have a thickness")?;
                reinforcement_within_limits(reinforcement_ratio)?;
                ratio_above("cover to the bar centres", cover, 0.0, "bars sit inside the concrete")?;
                let p = self.props(smallest);
                let t = p.thickness.unwrap_or(0.0);
                if 2.0 * t >= p.depth || 2.0 * t >= p.width {
                    return Err(format!(
                        "the box's walls fill it at the smallest depth tried, {} mm (walls {} mm, width {} mm): \
                         lower the wall/depth ratio or raise the width/depth ratio",
                        mm(smallest),
                        mm(t),
                        mm(p.width)
                    ));
                }
                if cover >= t / 2.0 {
                    return Err(format!(
                        "the cover to the bar centres, {} mm, must stay below half the box's wall at the smallest \
                         depth tried ({} mm walls at {} mm): below {} mm, or thicker walls",
                        mm(cover),
                        mm(t),
                        mm(smallest),
                        mm(t / 2.0)
                    ));
                }
                Ok(())
            }
            Family::GlulamRect { width_over_depth } => {
                ratio_above("glulam width/depth", width_over_depth, 0.0, "a rectangle has a width")
            }
        }
    }

    /// The sizes tried, m: (smallest, largest, step). Steps are common practice: tubes by
    /// 10 mm, boxes and concrete by 50 mm, glulam by 40 mm (a lamination). Ranges (common
    /// practice; hot-finished tubes from memory of EN 10210-2's range): CHS 100-2000 mm,
    /// SHS 50-500 mm, welded box 300-4000 mm, concrete 300-4000 mm, concrete box 1200-8000
    /// mm by 100 mm (the long-span ribs it is for; from 1200 mm so that the preset's 0.12
    /// walls, 150 mm there, hold its 70 mm cover within their outer half), glulam
    /// 200-2400 mm.
    pub fn sizes(&self) -> (f64, f64, f64) {
        match self {
            Family::Chs { .. } => (0.10, 2.00, 0.010),
            Family::Shs { .. } => (0.05, 0.50, 0.010),
            Family::WeldedBox { .. } => (0.30, 4.00, 0.050),
            Family::ConcreteRect { .. } => (0.30, 4.00, 0.050),
            Family::ConcreteBox { .. } => (1.20, 8.00, 0.100),
            Family::GlulamRect { .. } => (0.20, 2.40, 0.040),
        }
    }

    /// Every size of the grid of `sizes`, smallest first, m (each computed from its index,
    /// so no rounding drift accumulates).
    pub fn size_grid(&self) -> Vec<f64> {
        let (smallest, largest, step) = self.sizes();
        let count = ((largest - smallest) / step).round() as usize;
        (0..=count).map(|k| smallest + k as f64 * step).collect()
    }

    /// The family presets: (key, family). Keys are ours: `chs` (D/t 40), `shs` (b/t 25),
    /// `box` (width 0.6 of the depth, flange b/t_f 30, web h/t_w 30), `concrete` (square,
    /// 2 % reinforcement, 60 mm to the bar centres), `concrete-box` (width 2.0 x the depth,
    /// walls 0.12 x the depth, 1.5 % reinforcement, 70 mm to the bar centres: common
    /// practice for long concrete arch ribs) and `glulam` (width 0.4 of the depth).
    /// The steel ratios stay within class 3 in compression for S235 to S460 (EN 1993-1-1
    /// Table 5.2: CHS D/t <= 90 eps^2 = 46 for S460; SHS c/t = b/t - 3 = 22 and the box's
    /// c/t below 42 eps = 30.0 for S460).
    pub fn family_presets() -> Vec<(&'static str, Family)> {
        vec![
            ("chs", Family::CHS),
            ("shs", Family::SHS),
            ("box", Family::BOX),
            (
                "concrete",
                Family::ConcreteRect { width_over_depth: 1.0, reinforcement_ratio: 0.02, cover: 0.06 },
            ),
            (
                "concrete-box",
                Family::ConcreteBox {
                    width_over_depth: 2.0,
                    wall_over_depth: 0.12,
                    reinforcement_ratio: 0.015,
                    cover: 0.07,
                },
            ),
            ("glulam", Family::GlulamRect { width_over_depth: 0.4 }),
        ]
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sizing::materials::material_preset;

    #[test]
    fn presets_are_valid_and_their_props_grow_along_the_grid() {
        for (key, family) in Family::family_presets() {
            assert_eq!(family.check(), Ok(()), "{key}");
            let grid = family.size_grid();
            let (smallest, largest, _) = family.sizes();
            assert!(
                (grid[0] - smallest).abs() < 1e-12 && (grid[grid.len() - 1] - largest).abs() < 1e-9,
                "{key}"
            );
            for pair in grid.windows(2) {
                let (a, b) = (family.props(pair[0]), family.props(pair[1]));
                for (what, x, y) in
                    [("A", a.a, b.a), ("I", a.i, b.i), ("I_out", a.i_out, b.i_out), ("W", a.w_el, b.w_el)]
                {
                    assert!(y > x, "{key}: {what} grows from {} to {}", pair[0], pair[1]);
                }
            }
        }
    }

    #[test]
    fn steel_walls_round_up_to_whole_mm() {
        // 508 / 29 = 17.52 mm -> 18 mm
        let p = Family::Chs { d_over_t: 29.0 }.props(0.508);
        assert_eq!(p.thickness, Some(0.018));
        assert_eq!(Family::Chs { d_over_t: 29.0 }.label(0.508), "CHS 508 x 18");
    }

    #[test]
    fn concrete_props_carry_the_bars() {
        let family = Family::ConcreteRect { width_over_depth: 0.5, reinforcement_ratio: 0.01, cover: 0.05 };
        let p = family.props(1.2);
        // b = 0.6 m: A_c = 0.72 m2, A_s = 0.0072 m2, I = 0.6 x 1.2^3 / 12 = 0.0864 m4
        assert!((p.a - 0.72).abs() < 1e-12);
        assert!((p.steel_area_rebar.unwrap_or(0.0) - 0.0072).abs() < 1e-12);
        assert!((p.i - 0.0864).abs() < 1e-12);
        assert_eq!(family.label(1.2), "concrete 1200 x 600");
    }

    #[test]
    fn concrete_box_walls_round_up_to_whole_10_mm() {
        let family = Family::ConcreteBox {
            width_over_depth: 2.0,
            wall_over_depth: 0.12,
            reinforcement_ratio: 0.015,
            cover: 0.07,
        };
        // 0.12 x 1300 = 156 mm -> 160 mm; 0.12 x 5000 = 600 mm stays 600 mm (not 610)
        assert_eq!(family.props(1.3).thickness, Some(0.16));
        assert_eq!(family.label(1.3), "concrete box 1300 x 2600 (t 160)");
        assert_eq!(family.props(5.0).thickness, Some(0.6));
        assert_eq!(family.label(5.0), "concrete box 5000 x 10000 (t 600)");
        // the void: 5000 - 2 x 600 = 3800 deep, 10000 - 1200 = 8800 wide
        let (depth, width) = family.void(5.0).expect("a box has a void");
        assert!((depth - 3.8).abs() < 1e-12 && (width - 8.8).abs() < 1e-12, "{depth} x {width}");
        assert_eq!(
            Family::ConcreteRect { width_over_depth: 1.0, reinforcement_ratio: 0.01, cover: 0.05 }.void(1.0),
            None
        );
        assert_eq!(family.name(), "concrete box");
    }

    /// A concrete box of ratios (width/depth, wall/depth, A_s/A_c, cover m).
    fn concrete_box(width: f64, wall: f64, rho: f64, cover: f64) -> Family {
        Family::ConcreteBox {
            width_over_depth: width,
            wall_over_depth: wall,
            reinforcement_ratio: rho,
            cover,
        }
    }

    #[test]
    fn concrete_box_check_refuses_full_walls_and_deep_cover() {
        assert_eq!(concrete_box(2.0, 0.12, 0.015, 0.07).check(), Ok(()));
        // walls 0.5 x 1200 = 600 mm: 2t = h, no void left
        let err = concrete_box(2.0, 0.5, 0.015, 0.07).check().expect_err("walls fill it");
        assert!(err.contains("walls fill it") && err.contains("1200"), "{err}");
        // narrow: width 0.2 x 1200 = 240 mm against 2 x 150 mm walls
        let err = concrete_box(0.2, 0.12, 0.015, 0.07).check().expect_err("webs meet");
        assert!(err.contains("walls fill it"), "{err}");
        // walls 0.1 x 1200 = 120 mm hold bars 60 mm in at most: 70 mm is refused
        let err = concrete_box(2.0, 0.1, 0.015, 0.07).check().expect_err("cover too deep");
        assert!(err.contains("half the box's wall") && err.contains("below 60 mm"), "{err}");
        let err = concrete_box(2.0, 0.12, 0.001, 0.07).check().expect_err("too little steel");
        assert!(err.contains("0.002") && err.contains("9.5.2"), "{err}");
        for bad in [
            concrete_box(f64::NAN, 0.12, 0.015, 0.07),
            concrete_box(2.0, 0.0, 0.015, 0.07),
            concrete_box(2.0, 0.12, 0.015, -0.01),
        ] {
            assert!(bad.check().is_err(), "{bad:?}");
        }
    }

    #[test]
    fn check_refuses_unusable_ratios() {
        let err = Family::ConcreteRect { width_over_depth: 1.0, reinforcement_ratio: 0.05, cover: 0.05 }
            .check()
            .expect_err("too much steel");
        assert!(err.contains("0.04") && err.contains("9.5.2"), "{err}");
        let err = Family::ConcreteRect { width_over_depth: 1.0, reinforcement_ratio: 0.01, cover: 0.08 }
            .check()
            .expect_err("cover too large for 300 mm");
        assert!(err.contains("below 75 mm"), "{err}");
        assert!(Family::Chs { d_over_t: 2.0 }.check().is_err());
        assert!(Family::Shs { b_over_t: f64::NAN }.check().is_err());
        let err = Family::WeldedBox { width_over_depth: 0.2, flange_ratio: 30.0, web_ratio: 5.0 }
            .check()
            .expect_err("webs fill the box");
        assert!(err.contains("plates fill it"), "{err}");
    }

    #[test]
    fn families_suit_their_materials() {
        let steel = material_preset("s355").expect("preset");
        let concrete = material_preset("c40-50").expect("preset");
        let glulam = material_preset("gl24h").expect("preset");
        for (key, family) in Family::family_presets() {
            let suits: Vec<bool> = [&steel, &concrete, &glulam].iter().map(|m| family.suits(m)).collect();
            assert_eq!(suits.iter().filter(|s| **s).count(), 1, "{key} suits exactly one material");
        }
        assert!(Family::GlulamRect { width_over_depth: 0.3 }.suits(&glulam));
        assert!(!Family::Chs { d_over_t: 30.0 }.suits(&concrete));
    }

    #[test]
    fn serde_tags_the_kind() {
        let family = Family::WeldedBox { width_over_depth: 0.6, flange_ratio: 30.0, web_ratio: 30.0 };
        let json = serde_json::to_string(&family).expect("serialises");
        assert!(json.starts_with(r#"{"kind":"welded_box""#), "{json}");
        assert_eq!(serde_json::from_str::<Family>(&json).expect("reads back"), family);
        let family = Family::ConcreteBox {
            width_over_depth: 2.0,
            wall_over_depth: 0.12,
            reinforcement_ratio: 0.015,
            cover: 0.07,
        };
        let json = serde_json::to_string(&family).expect("serialises");
        assert_eq!(
            json,
            r#"{"kind":"concrete_box","width_over_depth":2.0,"wall_over_depth":0.12,"reinforcement_ratio":0.015,"cover":0.07}"#
        );
        assert_eq!(serde_json::from_str::<Family>(&json).expect("reads back"), family);
    }
}
