//! The rib's in-plane stability in sizing: critical load factors of the governing
//! placements, the second-order amplification of the rib's moments and the rib's
//! buckling length from alpha_cr.
//!
//! Each rib member's compression and moment come from an envelope extreme under one
//! ultimate combination (`arch::sizing`). Each such placement (once: two equal to
//! rounding are one, [`same_placement`]), and the
//! factored dead load alone, is a load case of the frame model
//! (`arch::stability::factored_placement`); its linear buckling gives the arch's alpha_cr
//! for it (local buckling of posts and diagonals set aside: their member checks cover it,
//! `arch::stability`). Then, per rib member (EN 1993-1-1 5.2.2 and 6.3.1; EN 1992-1-1
//! 5.8.3.2(6); from memory):
//!
//! - the buckling length in the arch plane is l = pi sqrt(E I / (alpha_cr N_Ed)), N_Ed its
//!   compression in the case of its largest compression: so lambda_bar = sqrt(N_Rk /
//!   (alpha_cr N_Ed)) for steel, and the concrete rib's nominal-curvature second order
//!   (which carries its own imperfection, EN 1992-1-1 5.2(7)) takes this l_0. The buckling
//!   curve carries the rib's equivalent imperfection in the mode's shape, antisymmetric
//!   for the usual arch (EN 1993-1-1 5.3.2(11));
//! - steel and glulam ribs: the moment of the case of its largest moment is amplified by
//!   1 / (1 - 1 / alpha_cr) of that case (the concrete rib's second order is in its
//!   nominal curvature);
//! - steel ribs also take the second-order analysis with the arch's antisymmetric
//!   in-plane imperfection as a check of its own (EN 1993-2 Annex D.3, Table D.8, from
//!   memory: a sine over each half of the rib of amplitude e0 = s/300, s/250, s/200,
//!   s/150 for buckling curves a, b, c, d, s half the rib's length): M_II = M / (1 -
//!   1/alpha_cr,M) + N e0 / (1 - 1/alpha_cr,N) against the cross-section (EN 1993-1-1
//!   6.2.1(7)), mode `SecondOrder`. The member check above is the other route EN 1993-1-1
//!   5.2.2(3) allows (the imperfection in the buckling curve); the worse of the two
//!   governs (conservative: each alone would do);
//! - the arch's least alpha_cr over the cases must reach 3 (below it amplified
//!   first-order moments are not acceptable: too slender for this method) or, when the
//!   design asks, 10 (a first-order analysis acceptable, 5.2.1(3)): the rib's mode
//!   `ArchStability`, utilisation the least over alpha_cr.
//!
//! The analysis is of the sections it was given. A trial size of the rib scales the
//! arch's alpha_cr by its E I over the analysed one (the arch's modes are the rib's
//! bending: common practice, close where the deck is much less stiff than the rib), and
//! leaves the buckling length as it is (N_cr scales with E I too). After adopting the
//! sizes, analyse again: the report then gives the analysed values.

use crate::arch::generate::{Generated, MemberRole};
use crate::arch::sizing::placement_words;
use crate::arch::stability::{
    factored_dead, factored_placement, placement_stability, CaseStability, FactoredCase,
};
use crate::arch::traffic::TrafficReport;
use crate::arch::validate::ValidDesign;
use crate::error::StaticsError;
use crate::frame::model::LoadCase;
use crate::sizing::buckling::{curve_for, Curve};
use crate::sizing::materials::Material;
use crate::sizing::resistance::{check, steel_section_utilisation, Check, Demand, Lengths, Mode};
use crate::sizing::sections::{Family, SectionProps};
use crate::traffic::combination::Combination;
use serde::{Deserialize, Serialize};

/// The least alpha_cr for amplified first-order moments (EN 1993-1-1 5.2.2, from memory).
pub const LEAST_AMPLIFIED: f64 = crate::arch::stability::AMPLIFICATION_LEAST_ALPHA;
/// The least alpha_cr for a first-order analysis (EN 1993-1-1 5.2.1(3)).
pub const LEAST_FIRST_ORDER: f64 = crate::arch::stability::FIRST_ORDER_ALPHA;

/// Where one rib member's compression and moment come from: (combination, envelope line,
/// largest extreme) each, `None` when the member has none.
#[derive(Debug, Clone, Default)]
pub struct RibSources {
    /// Model index of the member.
    pub member: usize,
    /// The source of its largest compression.
    pub compression: Option<(String, String, bool)>,
    /// The source of its largest moment.
    pub moment: Option<(String, String, bool)>,
}

/// The second-order numbers of one rib member at the analysed section.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RibMemberStability {
    /// The member's name.
    pub member: String,
    /// Index in `RibStability::cases` of the case of its largest compression.
    pub compression_case: Option<usize>,
    /// Index of the case of its largest moment.
    pub moment_case: Option<usize>,
    /// Its compression per rib line in the compression case, kN (>= 0).
    pub n_ed: f64,
    /// The arch's critical axial force of it, alpha_cr N_Ed, kN (per rib line); infinite
    /// when it has no compression case (nothing buckles it).
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub n_cr: f64,
    /// The buckling length in the arch plane from it, m (`None`: not compressed in its
    /// case; the arch table's length is kept).
    pub length: Option<f64>,
    /// The arch's alpha_cr in the moment case (infinite without one).
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub alpha_moment: f64,
    /// The arch's alpha_cr in the compression case (infinite without one).
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub alpha_compression: f64,
}

/// The rib's in-plane stability for sizing (module doc).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RibStability {
    /// The cases analysed: the factored dead load alone first, then each governing
    /// placement once.
    pub cases: Vec<CaseStability>,
    /// The arch's least alpha_cr over the cases, at the analysed sections.
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub alpha_cr: f64,
    /// The least alpha_cr the sizing accepts: 3, or 10 when the design asks for a
    /// first-order rib.
    pub least: f64,
    /// E I of the rib per rib line in the analysis, kNm2.
    pub analysed_ei: f64,
    /// Half the rib's length along its axis, s, m (the imperfection's half wave).
    pub half_length: f64,
    /// Per rib member (per rib line), in model order.
    pub members: Vec<RibMemberStability>,
}

/// 1 / (1 - 1 / alpha) for alpha >= 3; at 3 (1.5) below it, where the method no longer
/// applies and the rib fails its `ArchStability` mode anyway.
pub fn amplification(alpha: f64) -> f64 {
    let a = alpha.max(LEAST_AMPLIFIED);
    1.0 / (1.0 - 1.0 / a)
}

/// The rib's stability of `valid` for the sources of its members' demands (module doc):
/// the frame model `generated`, the traffic `report` and the `ultimate` combinations.
///
/// Errors: those of building the cases and of `arch::stability::placement_stability`,
/// and a case whose buckling fails (nothing compressed, no convergence).
pub fn rib_stability(
    valid: &ValidDesign,
    generated: &Generated,
    report: &TrafficReport,
    ultimate: &[&Combination],
    sources: &[RibSources],
) -> Result<RibStability, StaticsError> {
    let design = valid.design();
    let combination = |name: &str| ultimate.iter().find(|c| c.name == name).copied();
    let first = ultimate.first().ok_or_else(|| StaticsError::invalid("sizing", "no ultimate combination"))?;
    let mut cases = vec![FactoredCase {
        combination: first.name.clone(),
        placement: "dead load alone".into(),
        case: factored_dead(generated, first)?,
    }];
    let mut find_or_add = |source: &Option<(String, String, bool)>| -> Result<Option<usize>, StaticsError> {
        let Some((name, line_name, max)) = source else { return Ok(None) };
        let (Some(c), Some(line)) = (combination(name), report.line(line_name)) else { return Ok(None) };
        let case = factored_placement(valid, generated, line, *max, c)?;
        if let Some(i) = cases.iter().position(|f| same_placement(&f.case, &case)) {
            return Ok(Some(i));
        }
        let extreme = if *max { &line.traffic_max } else { &line.traffic_min };
        cases.push(FactoredCase { combination: c.name.clone(), placement: placement_words(extreme), case });
        Ok(Some(cases.len() - 1))
    };
    let mut picked = Vec::new();
    for s in sources {
        picked.push((s.member, find_or_add(&s.compression)?, find_or_add(&s.moment)?));
    }
    let analysed = placement_stability(generated, &cases)?.into_iter().collect::<Result<Vec<_>, _>>()?;
    let ribs = design.deck.ribs.max(1) as f64;
    let rib = design.groups.rib;
    let analysed_ei = rib.e * rib.i;
    let alpha_of =
        |i: Option<usize>| i.and_then(|i| analysed.get(i)).map_or(f64::INFINITY, |c| c.arch.alpha_cr);
    let members = picked
        .into_iter()
        .map(|(k, compression_case, moment_case)| {
            let (n_ed, alpha) = match compression_case.and_then(|i| analysed.get(i)) {
                Some(c) => {
                    ((-c.member_axial.get(k).copied().unwrap_or(0.0) / ribs).max(0.0), c.arch.alpha_cr)
                }
                None => (0.0, f64::INFINITY),
            };
            // not compressed and no buckling case: nothing to buckle (0 times infinity
            // would be NaN)
            let n_cr = if n_ed > 0.0 || alpha.is_finite() { alpha * n_ed } else { f64::INFINITY };
            let length = (n_cr.is_finite() && n_cr > 0.0 && analysed_ei > 0.0)
                .then(|| std::f64::consts::PI * (analysed_ei / n_cr).sqrt());
            RibMemberStability {
                member: generated.model.member_label(k),
                compression_case,
                moment_case,
                n_ed,
                n_cr,
                length,
                alpha_moment: alpha_of(moment_case),
                alpha_compression: alpha,
            }
        })
        .collect();
    let alpha_cr = analysed.iter().map(|c| c.arch.alpha_cr).fold(f64::INFINITY, f64::min);
    let least = if design.sizing.rib_for_first_order { LEAST_FIRST_ORDER } else { LEAST_AMPLIFIED };
    let rib_nodes = &valid.form().rib;
    let half_length = 0.5
        * rib_nodes
            .iter()
            .zip(rib_nodes.iter().skip(1))
            .map(|(a, b)| (b.x - a.x).hypot(b.y - a.y))
            .sum::<f64>();
    Ok(RibStability { cases: analysed, alpha_cr, least, analysed_ei, half_length, members })
}

/// Whether two factored load cases are the same loads to rounding: the same nodes and
/// members loaded in the same order and directions, every force within
/// `tolerance::SAME_PLACEMENT` of the larger case's largest load, every position along a
/// member within it of the larger position (at least 1 m); temperature changes and
/// imposed displacements equal.
pub fn same_placement(a: &LoadCase, b: &LoadCase) -> bool {
    use crate::frame::model::MemberLoad;
    use crate::tolerance::SAME_PLACEMENT;
    if a.nodal.len() != b.nodal.len()
        || a.member.len() != b.member.len()
        || a.temperature != b.temperature
        || a.prescribed != b.prescribed
    {
        return false;
    }
    let largest = |c: &LoadCase| {
        let nodal = c.nodal.iter().map(|l| l.fx.abs().max(l.fy.abs()).max(l.mz.abs()));
        let member = c.member.iter().map(|l| match *l {
            MemberLoad::Uniform { w, .. } => w.abs(),
            MemberLoad::Point { p, .. } => p.abs(),
        });
        nodal.chain(member).fold(0.0f64, f64::max)
    };
    let force_tolerance = SAME_PLACEMENT * largest(a).max(largest(b));
    let force = |x: f64, y: f64| (x - y).abs() <= force_tolerance;
    let position = |x: f64, y: f64| (x - y).abs() <= SAME_PLACEMENT * x.abs().max(y.abs()).max(1.0);
    let nodal = a
        .nodal
        .iter()
        .zip(&b.nodal)
        .all(|(p, q)| p.node == q.node && force(p.fx, q.fx) && force(p.fy, q.fy) && force(p.mz, q.mz));
    let member = a.member.iter().zip(&b.member).all(|(p, q)| match (*p, *q) {
        (
            MemberLoad::Uniform { member: m, w, direction: d, projected: j },
            MemberLoad::Uniform { member: n, w: v, direction: e, projected: k },
        ) => m == n && d == e && j == k && force(w, v),
        (
            MemberLoad::Point { member: m, p, a: s, direction: d },
            MemberLoad::Point { member: n, p: q, a: t, direction: e },
        ) => m == n && d == e && force(p, q) && position(s, t),
        _ => false,
    });
    nodal && member
}

/// The rib members of `generated`, in model order.
pub fn rib_members(generated: &Generated) -> Vec<usize> {
    generated.map.roles.iter().enumerate().filter(|(_, r)| **r == MemberRole::Rib).map(|(k, _)| k).collect()
}

/// A rib section to check: its material, family, properties and E I per rib line
/// (kNm2: the typed E for a typed section, the material's for a sized one).
#[derive(Debug, Clone, Copy)]
pub struct RibSection<'a> {
    /// The material.
    pub material: &'a Material,
    /// The family (the rules of the check).
    pub family: &'a Family,
    /// The section's properties.
    pub props: &'a SectionProps,
    /// E I per rib line, kNm2.
    pub ei: f64,
}

/// The amplitude e0 of the arch's in-plane imperfection for buckling curve `curve`, m,
/// with `s` half the rib's length (EN 1993-2 Annex D.3, Table D.8, from memory: s/300 for
/// curve a, s/250 for b, s/200 for c, s/150 for d; a0 taken as a).
pub fn imperfection(curve: Curve, s: f64) -> f64 {
    let divisor = match curve {
        Curve::A0 | Curve::A => 300.0,
        Curve::B => 250.0,
        Curve::C => 200.0,
        Curve::D => 150.0,
    };
    s / divisor
}

/// What a trial rib section changes (module doc).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct RibTrial {
    /// The arch's least alpha_cr with this section.
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub alpha_cr: f64,
    /// The moment case's alpha_cr with this section.
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub alpha_moment: f64,
    /// The compression case's alpha_cr with this section.
    #[serde(deserialize_with = "crate::json::infinity_if_null")]
    pub alpha_compression: f64,
    /// The factor on the first-order moment (1 for concrete).
    pub amplification: f64,
    /// A steel rib's imperfection amplitude e0, m (`None` for other materials).
    pub imperfection: Option<f64>,
}

impl RibStability {
    /// The numbers of member `member` (its index among the rib members) with a section
    /// of stiffness `ei` (kNm2 per rib line).
    pub fn trial(&self, member: &RibMemberStability, ei: f64, material: &Material) -> RibTrial {
        let scale = if self.analysed_ei > 0.0 { ei / self.analysed_ei } else { 1.0 };
        let alpha_moment = member.alpha_moment * scale;
        let amplification = match material {
            Material::Concrete(_) => 1.0,
            _ if alpha_moment.is_finite() => amplification(alpha_moment),
            _ => 1.0,
        };
        RibTrial {
            alpha_cr: self.alpha_cr * scale,
            alpha_moment,
            alpha_compression: member.alpha_compression * scale,
            amplification,
            imperfection: None,
        }
    }

    /// The check of a rib member at `section`: `check` with the moment amplified and the
    /// in-plane buckling length from alpha_cr, plus the `ArchStability` mode (module doc).
    pub fn check(
        &self,
        member: &RibMemberStability,
        section: &RibSection,
        demand: &Demand,
        lengths: &Lengths,
    ) -> Result<Check, String> {
        let RibSection { material, family, props, ei } = *section;
        let t = self.trial(member, ei, material);
        let amplified = Demand { moment: demand.moment * t.amplification, ..*demand };
        let lengths = Lengths { in_plane: member.length.unwrap_or(lengths.in_plane), ..*lengths };
        let mut c = check(material, family, props, &amplified, &lengths)?;
        if let Material::Steel(steel) = material {
            let e0 = imperfection(curve_for(family, material), self.half_length);
            let along =
                if t.alpha_compression.is_finite() { amplification(t.alpha_compression) } else { 1.0 };
            let m_ii = amplified.moment + demand.compression * e0 * along;
            c = c.with_mode(
                Mode::SecondOrder,
                steel_section_utilisation(steel, family, props, demand.compression, m_ii),
            );
        }
        Ok(c.with_mode(Mode::ArchStability, self.least / t.alpha_cr))
    }

    /// [`RibStability::trial`] with the imperfection a steel rib of the section's family
    /// takes.
    pub fn trial_of(&self, member: &RibMemberStability, section: &RibSection) -> RibTrial {
        let mut t = self.trial(member, section.ei, section.material);
        if matches!(section.material, Material::Steel(_)) {
            t.imperfection =
                Some(imperfection(curve_for(section.family, section.material), self.half_length));
        }
        t
    }

    /// The basis in words.
    pub fn basis(&self) -> String {
        format!(
            "the rib's in-plane stability from linear buckling of the frame model under the factored dead load and \
             each governing placement ({} cases; local buckling of posts and diagonals set aside, their member \
             checks cover it): buckling length l = pi sqrt(E I / (alpha_cr N_Ed)) of the case of the member's \
             largest compression, so lambda_bar = sqrt(N_Rk / (alpha_cr N_Ed)) (EN 1993-1-1 6.3.1; EN 1992-1-1 \
             5.8.3.2(6) for concrete, whose nominal curvature carries the second order); steel and glulam moments \
             times 1 / (1 - 1 / alpha_cr) of the case of the largest moment (EN 1993-1-1 5.2.2, from memory); \
             steel ribs also checked in section for M / (1 - 1/alpha_cr) + N e0 / (1 - 1/alpha_cr) with the \
             arch's antisymmetric imperfection e0 = s/300 to s/150 by buckling curve, s = {:.1} m half the rib \
             (EN 1993-2 Annex D.3 Table D.8, from memory), the worse of the two routes governing; the \
             arch's alpha_cr at least {} ({}); a trial size scales alpha_cr by its E I over the analysed {:.4e} \
             kNm2 (common practice), so after adopting sizes analyse again",
            self.cases.len(),
            self.half_length,
            self.least,
            if self.least >= LEAST_FIRST_ORDER {
                "first-order analysis acceptable, EN 1993-1-1 5.2.1(3), as the design asks"
            } else {
                "below 3 too slender for amplified first-order moments"
            },
            self.analysed_ei
        )
    }
}
