//! Sizing of a deck arch's member groups from the traffic envelopes (design format 5).
//!
//! Each group (rib, deck, posts, piers, bracing) is either sized in a parametric family
//! of a material (`sizing::sections`, `sizing::materials`), one size for the whole group
//! (a concept design keeps one section per group), or kept "as typed" and only checked.
//! Demands come from the frame model's envelopes (`arch::traffic`), per rib line, over
//! the ultimate combinations (those that factor the permanent action above 1): the
//! largest tension, the largest compression and the largest in-plane moment at either
//! end of a member (and at mid-length for members carrying the deck), taken together although they need not occur together
//! (conservative, common practice at concept stage). Resistances and the search for the
//! smallest size are `sizing::resistance`'s.
//!
//! Buckling lengths:
//! - rib, in its plane: the arch buckles as a whole. The length comes from the arch's
//!   critical load factor in the case of the member's largest compression, l = pi sqrt(E
//!   I / (alpha_cr N_Ed)), the steel and glulam rib's moments are amplified by 1 / (1 -
//!   1/alpha_cr) and the arch's alpha_cr must reach 3 (or 10 when the design asks for a
//!   first-order rib): `arch::second_order`. Where that analysis fails, the length of a
//!   pin-ended strut whose Euler load is the rib's axial force at the quarter point when
//!   a parabolic rib of the same rise and span buckles under a uniform load, q_cr = gamma
//!   EI / L^3 (Timoshenko and Gere, Theory of Elastic Stability, ch. 7, arch tables;
//!   coefficients from memory), so N_cr = (pi / (beta s))^2 EI as in EN 1993-2 Annex D.3
//!   with s half the rib's length ([`arch_buckling`]), and the basis says so;
//! - rib, out of its plane: an editable length, by default each rib segment's length for
//!   two or more ribs (held sideways at every rib node by bracing between the ribs,
//!   common practice: assumed, neither modelled nor counted in the quantities) and the
//!   whole rib's length for a single rib;
//! - posts, piers, bracing: the member's length times the group's factor, both planes;
//! - deck: the member's length times the factor in the plane; none out of the plane (the
//!   slab holds it).
//!
//! The erection stage (the bare rib) is not part of the sizing: it is checked apart
//! (`arch::actions`). Concept-design values: local codes and a licensed engineer govern.

use crate::arch::analysis::CAUTION;
use crate::arch::design::{Design, MemberGroups, Section};
use crate::arch::generate::{frame_model, Generated, MemberRole};
use crate::arch::influence::{ArchLine, MemberEnd};
use crate::arch::second_order::{rib_stability, RibSection, RibSources, RibStability, RibTrial};
use crate::arch::stability::{arch_stability, StabilitySummary};
use crate::arch::traffic::{Governing, LineEnvelope, TrafficReport};
use crate::arch::validate::ValidDesign;
use crate::error::{Field, GroupName, Problem, StaticsError};
use crate::sizing::materials::{c40_50, gl24h, s355, Material};
use crate::sizing::resistance::{check, size_member_by, Check, Demand, Lengths, Mode};
use crate::sizing::sections::{Family, SectionProps};
use crate::traffic::combination::Combination;
use serde::{Deserialize, Serialize};

/// How the member groups are sized, and the inputs of the quantities and foundations.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SizingDesign {
    /// The rib.
    pub rib: GroupSizing,
    /// The deck girder (over the arch and the approach spans).
    pub deck: GroupSizing,
    /// Spandrel and end posts.
    pub posts: GroupSizing,
    /// Approach piers.
    pub piers: GroupSizing,
    /// Bracing diagonals.
    pub bracing: GroupSizing,
    /// The rib's buckling length out of its plane, m; `None`: each rib segment's length.
    pub rib_out_of_plane: Option<f64>,
    /// Size the rib so that the arch's alpha_cr is at least 10, where a first-order
    /// analysis is acceptable (EN 1993-1-1 5.2.1(3)); otherwise at least 3, with its
    /// moments amplified (5.2.2). Design format 7.
    #[serde(default)]
    pub rib_for_first_order: bool,
    /// The deck's cross-section: slab and cross-girders.
    pub deck_section: DeckCrossSection,
    /// Unit rates of the cost index.
    pub rates: UnitRates,
    /// Ground and thrust-block inputs.
    pub foundation: FoundationDesign,
}

/// How one member group is sized.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct GroupSizing {
    /// The family the group is sized in; `None`: the typed section is kept and checked.
    pub family: Option<Family>,
    /// The material: the sized section's, or what the typed section is checked as.
    pub material: Material,
    /// Buckling length factor K on each member's length (posts, piers, bracing: both
    /// planes; deck: in its plane; the rib takes the arch's length instead).
    pub length_factor: f64,
}

/// Which deck weight the analysis counts, so nothing is counted twice.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum DeckWeight {
    /// The typed deck dead load (kN/m2) and the deck girder's self-weight; the slab and
    /// cross-girders below count in the quantities only.
    TypedLoad,
    /// The slab, the cross-girders and `other_dead_load` replace the typed deck dead
    /// load; the deck girder's self-weight still adds.
    CrossSection,
}

/// The deck's cross-section for the quantities (and, with `DeckWeight::CrossSection`,
/// for the dead load).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct DeckCrossSection {
    /// Which deck weight counts.
    pub weight: DeckWeight,
    /// Slab thickness, m (over the deck width).
    pub slab_thickness: f64,
    /// Slab unit weight, kN/m3 (reinforced concrete 25, EN 1991-1-1 Table A.1).
    pub slab_unit_weight: f64,
    /// Spacing of the cross-girders along the deck, m.
    pub cross_girder_spacing: f64,
    /// Steel area of one cross-girder, m2 (it spans the deck width).
    pub cross_girder_area: f64,
    /// Cross-girder unit weight, kN/m3 (steel 77, EN 1991-1-1 Table A.4).
    pub cross_girder_unit_weight: f64,
    /// Other fixed load on the deck (parapets, services), kN/m2, with `CrossSection`.
    pub other_dead_load: f64,
}

impl DeckCrossSection {
    /// Weight of the slab and cross-girders per m2 of deck, kN/m2: t gamma_slab + A_cg
    /// gamma_cg / spacing (each cross-girder spans the width).
    pub fn structure_weight(&self) -> f64 {
        self.slab_thickness * self.slab_unit_weight
            + self.cross_girder_area * self.cross_girder_unit_weight / self.cross_girder_spacing
    }
}

/// Unit rates of the cost index, in cost units of the user's choosing.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct UnitRates {
    /// Structural steel, fabricated and erected, per tonne.
    pub steel_per_t: f64,
    /// Structural concrete (ribs, slab), per m3, reinforcement included.
    pub concrete_per_m3: f64,
    /// Glulam, per m3.
    pub glulam_per_m3: f64,
    /// Thrust-block concrete, per m3.
    pub foundation_per_m3: f64,
}

/// Ground and thrust-block inputs.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FoundationDesign {
    /// Allowable bearing pressure on the thrust block's face, kN/m2 (characteristic
    /// loads; from the site's ground investigation).
    pub allowable_bearing: f64,
    /// Least thickness of a thrust block along the resultant, m.
    pub min_thickness: f64,
}

/// Default buckling length factor K (pin-ended members, EN 1993-1-1 and any stability
/// text: K = 1 for a member held in position at both ends).
pub const DEFAULT_LENGTH_FACTOR: f64 = 1.0;

impl GroupSizing {
    /// The typed section kept, checked as `material`.
    pub fn as_typed(material: Material) -> GroupSizing {
        GroupSizing { family: None, material, length_factor: DEFAULT_LENGTH_FACTOR }
    }

    /// Sized in `family` of `material`.
    pub fn sized(family: Family, material: Material) -> GroupSizing {
        GroupSizing { family: Some(family), material, length_factor: DEFAULT_LENGTH_FACTOR }
    }
}

impl Default for DeckCrossSection {
    /// A 250 mm concrete slab on steel cross-girders every 4 m of 0.012 m2 (about a 600
    /// mm plate girder), the typed dead load counting (common practice, illustrative).
    fn default() -> Self {
        DeckCrossSection {
            weight: DeckWeight::TypedLoad,
            slab_thickness: 0.25,
            slab_unit_weight: 25.0,
            cross_girder_spacing: 4.0,
            cross_girder_area: 0.012,
            cross_girder_unit_weight: 77.0,
            other_dead_load: 1.0,
        }
    }
}

impl Default for UnitRates {
    /// Relative rates of our own (illustrative: steel erected per tonne some ten times
    /// structural concrete per m3, common practice for a feel only). Set the project's.
    fn default() -> Self {
        UnitRates { steel_per_t: 100.0, concrete_per_m3: 10.0, glulam_per_m3: 30.0, foundation_per_m3: 5.0 }
    }
}

impl Default for FoundationDesign {
    /// 1,000 kN/m2 allowable bearing (a weak rock or very dense gravel, common practice,
    /// illustrative: the site's investigation governs) and 1.0 m least block thickness.
    fn default() -> Self {
        FoundationDesign { allowable_bearing: 1000.0, min_thickness: 1.0 }
    }
}

impl SizingDesign {
    /// Every group kept as typed, each checked as the material its typed E suggests
    /// (steel S355 for E of 150 GPa or more, glulam GL24h below 20 GPa, else concrete
    /// C40/50): what a design of format 4 gets.
    pub fn as_typed(groups: &MemberGroups) -> SizingDesign {
        let guess = |s: &Section| {
            let material = if s.e >= 150e6 {
                s355()
            } else if s.e < 20e6 {
                gl24h()
            } else {
                c40_50()
            };
            GroupSizing::as_typed(material)
        };
        SizingDesign {
            rib: guess(&groups.rib),
            deck: guess(&groups.deck),
            posts: guess(&groups.posts),
            piers: guess(&groups.piers),
            bracing: guess(&groups.bracing),
            rib_out_of_plane: None,
            rib_for_first_order: false,
            deck_section: DeckCrossSection::default(),
            rates: UnitRates::default(),
            foundation: FoundationDesign::default(),
        }
    }

    /// Steel throughout, sized: welded boxes for the rib and deck girder, square hollow
    /// sections for the posts, circular ones for the piers and bracing, all S355 (the
    /// demo's choice).
    pub fn steel() -> SizingDesign {
        let s355 = s355();
        SizingDesign {
            rib: GroupSizing::sized(Family::BOX, s355.clone()),
            deck: GroupSizing::sized(Family::BOX, s355.clone()),
            posts: GroupSizing::sized(Family::SHS, s355.clone()),
            piers: GroupSizing::sized(Family::CHS, s355.clone()),
            bracing: GroupSizing::sized(Family::CHS, s355),
            rib_out_of_plane: None,
            rib_for_first_order: false,
            deck_section: DeckCrossSection::default(),
            rates: UnitRates::default(),
            foundation: FoundationDesign::default(),
        }
    }

    /// The group's sizing.
    pub fn group(&self, g: GroupName) -> &GroupSizing {
        match g {
            GroupName::Rib => &self.rib,
            GroupName::Deck => &self.deck,
            GroupName::Posts => &self.posts,
            GroupName::Piers => &self.piers,
            GroupName::Bracing => &self.bracing,
        }
    }

    /// The group's sizing, to edit.
    pub fn group_mut(&mut self, g: GroupName) -> &mut GroupSizing {
        match g {
            GroupName::Rib => &mut self.rib,
            GroupName::Deck => &mut self.deck,
            GroupName::Posts => &mut self.posts,
            GroupName::Piers => &mut self.piers,
            GroupName::Bracing => &mut self.bracing,
        }
    }

    /// Problems of the inputs (each names its field).
    pub(crate) fn problems(&self) -> Vec<Problem> {
        let mut out = Vec::new();
        for g in GroupName::ALL {
            let s = self.group(g);
            let field = Field::Sizing(g);
            if let Err(e) = s.material.check() {
                out.push(Problem::new(field, format!("the {} material: {e}", g.label())));
            }
            if let Some(f) = &s.family {
                if let Err(e) = f.check() {
                    out.push(Problem::new(field, format!("the {} section family: {e}", g.label())));
                } else if !f.suits(&s.material) {
                    out.push(Problem::new(
                        field,
                        format!(
                            "the {} group: a {} cannot be made of {}; choose a family of that material or another \
                             material",
                            g.label(),
                            f.name(),
                            s.material.name()
                        ),
                    ));
                }
            }
            if !(s.length_factor.is_finite() && (0.3..=5.0).contains(&s.length_factor)) {
                out.push(Problem::new(
                    field,
                    format!(
                        "the {} buckling length factor {} must be between 0.3 and 5 (1 for a member pinned at both \
                         ends)",
                        g.label(),
                        s.length_factor
                    ),
                ));
            }
        }
        if let Some(l) = self.rib_out_of_plane {
            if !(l.is_finite() && l > 0.0 && l <= 2000.0) {
                out.push(Problem::new(
                    Field::Sizing(GroupName::Rib),
                    format!(
                        "the rib's out-of-plane buckling length {l} m must be above 0 and at most 2000 m"
                    ),
                ));
            }
        }
        let d = &self.deck_section;
        let positive = [
            ("slab thickness", d.slab_thickness, 0.0, 2.0, "m"),
            ("slab unit weight", d.slab_unit_weight, 0.0, 100.0, "kN/m3"),
            ("cross-girder spacing", d.cross_girder_spacing, 0.1, 100.0, "m"),
            ("cross-girder area", d.cross_girder_area, 0.0, 1.0, "m2"),
            ("cross-girder unit weight", d.cross_girder_unit_weight, 0.0, 100.0, "kN/m3"),
            ("other deck dead load", d.other_dead_load, 0.0, 100.0, "kN/m2"),
        ];
        for (name, v, lo, hi, unit) in positive {
            if !(v.is_finite() && (lo..=hi).contains(&v)) {
                out.push(Problem::new(
                    Field::DeckCrossSection,
                    format!("the {name} {v} {unit} must be between {lo} and {hi} {unit}"),
                ));
            }
        }
        let r = &self.rates;
        for (name, v) in [
            ("steel rate", r.steel_per_t),
            ("concrete rate", r.concrete_per_m3),
            ("glulam rate", r.glulam_per_m3),
            ("foundation rate", r.foundation_per_m3),
        ] {
            if !(v.is_finite() && v >= 0.0) {
                out.push(Problem::new(Field::UnitRates, format!("the {name} {v} must be zero or positive")));
            }
        }
        let f = &self.foundation;
        if !(f.allowable_bearing.is_finite() && (10.0..=100_000.0).contains(&f.allowable_bearing)) {
            out.push(Problem::new(
                Field::Foundation,
                format!(
                    "the allowable bearing pressure {} kN/m2 must be between 10 and 100,000 kN/m2",
                    f.allowable_bearing
                ),
            ));
        }
        if !(f.min_thickness.is_finite() && (0.1..=50.0).contains(&f.min_thickness)) {
            out.push(Problem::new(
                Field::Foundation,
                format!(
                    "the least thrust-block thickness {} m must be between 0.1 and 50 m",
                    f.min_thickness
                ),
            ));
        }
        out
    }
}

/// q_cr L^3 / (E I) of a parabolic rib of constant section under a uniform load per
/// horizontal metre, at rise / span 0.1, 0.2, 0.3, 0.4, 0.5 (Timoshenko and Gere, Theory
/// of Elastic Stability, ch. 7 arch tables; from memory).
const TWO_HINGED: [f64; 5] = [28.5, 45.4, 46.5, 43.9, 38.4];
const FIXED: [f64; 5] = [60.7, 101.0, 115.0, 111.0, 97.4];
const THREE_HINGED: [f64; 5] = [22.5, 39.6, 46.5, 43.9, 38.4];

/// The rib's in-plane buckling length as a whole arch.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ArchBuckling {
    /// Span between the springings, m.
    pub span: f64,
    /// Rise above the springing chord, m.
    pub rise: f64,
    /// Half the rib's length along its axis, s, m.
    pub half_length: f64,
    /// q_cr L^3 / (E I) used (interpolated in rise / span, held at the table's ends).
    pub coefficient: f64,
    /// The equivalent pin-ended length l = beta s, m.
    pub length: f64,
    /// beta = l / s (EN 1993-2 Annex D.3 form).
    pub beta: f64,
    /// How it is found, with its sources.
    pub basis: String,
}

/// The rib's in-plane buckling length (see the module doc): l = pi sqrt(8 f L / (gamma
/// sqrt(1 + (2 f / L)^2))), from q_cr = gamma EI / L^3, H_cr = q_cr L^2 / (8 f) and the
/// quarter-point axial force N = H sqrt(1 + (2 f / L)^2) of a parabola; independent of EI.
/// Rise / span outside 0.1 to 0.5 holds beta = l / s at the table's end (a parabola's
/// beta there) and takes the rib's own half length s (the basis says so).
pub fn arch_buckling(valid: &ValidDesign) -> ArchBuckling {
    let design = valid.design();
    let form = valid.form();
    let (span, rise) = (form.span, form.rise);
    let nodes = &form.rib;
    let length: f64 = nodes.iter().zip(nodes.iter().skip(1)).map(|(a, b)| (b.x - a.x).hypot(b.y - a.y)).sum();
    let table = match design.rib_system {
        crate::arch::design::RibSystem::TwoHinged => TWO_HINGED,
        crate::arch::design::RibSystem::Fixed => FIXED,
        crate::arch::design::RibSystem::ThreeHinged => THREE_HINGED,
    };
    let ratio = rise / span;
    // beyond the table's 0.1 to 0.5 the coefficient falls away (flat arches buckle
    // sooner): beta = l / s is held at the table's end instead, as EN 1993-2 D.3's beta
    // stays nearly constant for flat arches
    let held = ratio.clamp(0.1, 0.5);
    let t = ((held - 0.1) / 0.1).clamp(0.0, 4.0);
    let k = (t.floor() as usize).min(3);
    // the table's values either side of the held ratio
    let [c1, c2, c3, c4, c5] = table;
    let (lo, hi) = match k {
        0 => (c1, c2),
        1 => (c2, c3),
        2 => (c3, c4),
        _ => (c4, c5),
    };
    let coefficient = lo + (hi - lo) * (t - k as f64);
    let slope = 2.0 * held;
    // the length at the held ratio, per unit span, scaled by the half-length ratio
    let l_at =
        |r: f64, sl: f64| std::f64::consts::PI * (8.0 * r / (coefficient * (1.0 + sl * sl).sqrt())).sqrt();
    let half_length = length / 2.0;
    let l = if held == ratio {
        span * l_at(ratio, slope)
    } else {
        // beta of a parabola at the held ratio: its half length is (span / 2) times
        // (sqrt(1 + 16 r^2) / 2 + asinh(4 r) / (8 r)) (any calculus text)
        let parabola_half =
            |r: f64| 0.5 * ((1.0 + 16.0 * r * r).sqrt() / 2.0 + (4.0 * r).asinh() / (8.0 * r));
        let beta = l_at(held, slope) / parabola_half(held);
        beta * half_length
    };
    let mut basis = format!(
        "in-plane buckling of the rib as a whole arch: N_cr = (pi / (beta s))^2 EI (EN 1993-2 Annex D.3 form), \
         beta from q_cr = {coefficient:.1} EI / L^3 of a {} parabolic rib at rise / span {ratio:.3} (Timoshenko and \
         Gere, Theory of Elastic Stability, arch tables, from memory), N_cr being the axial force at the quarter \
         point at buckling",
        match design.rib_system {
            crate::arch::design::RibSystem::TwoHinged => "two-hinged",
            crate::arch::design::RibSystem::Fixed => "fixed",
            crate::arch::design::RibSystem::ThreeHinged => "three-hinged",
        }
    );
    if !(0.1..=0.5).contains(&ratio) {
        basis.push_str("; rise / span outside the table's 0.1 to 0.5: beta is held at the table's end (the rib's length times that beta; a very flat arch may also snap through, which this does not check)");
    }
    ArchBuckling { span, rise, half_length, coefficient, length: l, beta: l / half_length, basis }
}

/// One member's sizing.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct MemberSizing {
    /// The member's name in the frame model.
    pub member: String,
    /// Its group (`rib`, `deck`, `posts`, `piers`, `bracing`).
    pub group: String,
    /// Its length, m.
    pub length: f64,
    /// Design demand per rib line over the ultimate combinations, kN and kNm.
    pub demand: Demand,
    /// Buckling lengths, m.
    pub lengths: Lengths,
    /// Utilisation at the group's section (<= 1 passes); `None` when the group could not
    /// be sized.
    pub utilisation: Option<f64>,
    /// The governing mode at the group's section.
    pub governs: Option<Mode>,
    /// The combination of the governing demand (of the compression, tension or moment
    /// as the mode asks).
    pub combination: String,
    /// Where the traffic stands for that demand, in words.
    pub placement: String,
    /// A rib member's second-order numbers at the group's section (`arch::second_order`);
    /// `None` for other members or when the rib's stability could not be analysed.
    pub second_order: Option<RibTrial>,
}

crate::json::tagged_in_json! {
    tag = "outcome", remote = "GroupOutcome";
    /// How a group came out.
    #[derive(Debug, Clone, PartialEq)]
    pub enum GroupOutcome {
        /// Sized in its family: the section every member of the group gets.
        Sized {
            /// The section in words.
            label: String,
            /// The family's size, m.
            size: f64,
            /// The section's properties.
            props: SectionProps,
        },
        /// The typed section, checked.
        AsTyped,
        /// The design has no member of this group (no bracing, no approach piers).
        NoMembers,
        /// No size of the family works, or the family cannot be used: why, in words.
        NotSized {
            /// The reason (naming the member that cannot be sized).
            reason: String,
        },
    }
}

/// One group's sizing.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct GroupReport {
    /// The group (`rib`, ...).
    pub group: String,
    /// The material's name.
    pub material: String,
    /// The family's name (`None`: as typed).
    pub family: Option<String>,
    /// What came out.
    pub outcome: GroupOutcome,
    /// The largest member utilisation (`None` when not sized or no member).
    pub utilisation: Option<f64>,
    /// The member with it.
    pub governing_member: Option<String>,
    /// Members of the group in the frame model (per rib line).
    pub members: usize,
    /// The section per rib line the analysis would take (sized: the family's with the
    /// material's E and unit weight; as typed: the typed one).
    pub section: Option<Section>,
}

/// The sizing of every group.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct MemberSizingReport {
    /// The ultimate combinations used.
    pub combinations: Vec<String>,
    /// The rib's in-plane buckling length by the arch table: what the rib is checked with
    /// when its stability could not be analysed (`rib_stability_failure`).
    pub arch_buckling: ArchBuckling,
    /// The rib's in-plane stability from the buckling of the governing placements
    /// (`arch::second_order`), at the analysed sections.
    pub rib_stability: Option<RibStability>,
    /// Why the rib's stability could not be analysed (the arch table's length is used).
    pub rib_stability_failure: Option<String>,
    /// The arch's least alpha_cr with the rib group's section (scaled from the analysed
    /// one by E I).
    pub rib_alpha_cr: Option<f64>,
    /// Per group.
    pub groups: Vec<GroupReport>,
    /// Per member of the frame model (per rib line), in model order.
    pub members: Vec<MemberSizing>,
    /// The rules applied, in words.
    pub basis: String,
    /// Caution.
    pub caution: String,
}

/// The group of a member role.
pub fn group_of(role: MemberRole) -> GroupName {
    match role {
        MemberRole::Rib => GroupName::Rib,
        MemberRole::Deck | MemberRole::Approach => GroupName::Deck,
        MemberRole::Post => GroupName::Posts,
        MemberRole::Pier => GroupName::Piers,
        MemberRole::Bracing => GroupName::Bracing,
    }
}

/// The typed section of `group`.
pub fn typed_section(groups: &MemberGroups, group: GroupName) -> Section {
    match group {
        GroupName::Rib => groups.rib,
        GroupName::Deck => groups.deck,
        GroupName::Posts => groups.posts,
        GroupName::Piers => groups.piers,
        GroupName::Bracing => groups.bracing,
    }
}

/// The properties a typed section is checked with: A, I and depth as typed, W = 2 I /
/// depth, the same I out of plane (a typed section says nothing of its width), width the
/// depth; a typed concrete section gets 1 % reinforcement at 0.1 of its depth from each
/// face (stated in the basis).
fn typed_props(s: &Section, material: &Material) -> (SectionProps, Family) {
    let i = s.i.max(0.0);
    let radius = if s.a > 0.0 { (i / s.a).sqrt() } else { 0.0 };
    let props = SectionProps {
        size: s.depth,
        depth: s.depth,
        width: s.depth,
        thickness: None,
        a: s.a,
        i,
        i_out: i,
        w_el: if s.depth > 0.0 { 2.0 * i / s.depth } else { 0.0 },
        radius_in: radius,
        radius_out: radius,
        steel_area_rebar: matches!(material, Material::Concrete(_)).then_some(0.01 * s.a),
    };
    // the family only picks the rules (column curve, concrete bars): a welded box takes
    // curve b, the usual curve of a welded section
    let family = match material {
        Material::Steel(_) => {
            Family::WeldedBox { width_over_depth: 1.0, flange_ratio: 30.0, web_ratio: 30.0 }
        }
        Material::Concrete(_) => {
            Family::ConcreteRect { width_over_depth: 1.0, reinforcement_ratio: 0.01, cover: 0.1 * s.depth }
        }
        Material::Glulam(_) => Family::GlulamRect { width_over_depth: 1.0 },
    };
    (props, family)
}

/// Whether a combination is an ultimate one: it factors the unfavourable permanent
/// action above 1 (every serviceability combination takes it at 1).
pub fn is_ultimate(c: &Combination) -> bool {
    c.permanent_unfavourable > 1.0 + 1e-9
}

/// A demand component and where it comes from.
#[derive(Debug, Clone, Default)]
struct Part {
    value: f64,
    combination: String,
    placement: String,
    /// The envelope line and extreme (true: its largest) it comes from.
    source: Option<(String, bool)>,
}

impl Part {
    fn take(&mut self, value: f64, combination: &str, line: &LineEnvelope, max: bool) {
        if value > self.value {
            self.value = value;
            self.combination = combination.to_string();
            self.placement = placement_words(if max { &line.traffic_max } else { &line.traffic_min });
            self.source = Some((line.line.clone(), max));
        }
    }
}

/// The traffic placement of an extreme in words: where the uniform load lies and where
/// the vehicle stands.
pub fn placement_words(g: &Governing) -> String {
    let mut parts = Vec::new();
    if !g.loaded.is_empty() {
        let spans: Vec<String> = g.loaded.iter().map(|(a, b)| format!("{a:.1}-{b:.1} m")).collect();
        parts.push(format!("uniform load on x = {}", spans.join(", ")));
    }
    if let Some(v) = &g.vehicle {
        parts.push(format!("{} leading axle at x = {:.1} m", g.arrangement, v.first_axle));
    }
    if parts.is_empty() {
        "no traffic (permanent and other actions)".into()
    } else {
        parts.join("; ")
    }
}

/// The demand on member `k` from the envelopes over the ultimate combinations, with the
/// combination and placement of its compression, tension and moment parts.
///
/// Also returns the least compression that always acts (minus the largest axial force
/// when that is a compression, else 0).
fn member_demand(
    report: &TrafficReport,
    generated: &Generated,
    k: usize,
    ultimate: &[&Combination],
) -> ([Part; 3], f64) {
    let mut largest_n = f64::NEG_INFINITY;
    let mut compression = Part::default();
    let mut tension = Part::default();
    let mut moment = Part::default();
    let find = |line: ArchLine| -> Option<&LineEnvelope> { report.line(&line.name(generated)) };
    let ranges = |l: &LineEnvelope| {
        l.design
            .iter()
            .filter(|r| ultimate.iter().any(|c| c.name == r.combination))
            .map(|r| (r.combination.clone(), r.max, r.min))
            .collect::<Vec<_>>()
    };
    if let Some(l) = find(ArchLine::Axial(k)) {
        for (name, max, min) in ranges(l) {
            largest_n = largest_n.max(max);
            tension.take(max, &name, l, true);
            compression.take(-min, &name, l, false);
        }
    }
    let moment_lines =
        [ArchLine::Moment(k, MemberEnd::Start), ArchLine::Moment(k, MemberEnd::End), ArchLine::MidMoment(k)];
    for line in moment_lines {
        if let Some(l) = find(line) {
            for (name, max, min) in ranges(l) {
                moment.take(max, &name, l, true);
                moment.take(-min, &name, l, false);
            }
        }
    }
    let least = if largest_n.is_finite() { (-largest_n).max(0.0) } else { 0.0 };
    ([compression, tension, moment], least)
}

/// Sizes every group of `valid` from the frame model's traffic report `report` (see the
/// module doc). Members are per rib line; each group gets one section.
///
/// Errors: `Invalid` when the design has no ultimate combination to size with.
pub fn size_members(valid: &ValidDesign, report: &TrafficReport) -> Result<MemberSizingReport, StaticsError> {
    let design = valid.design();
    let ultimate: Vec<&Combination> = design.traffic.combinations.iter().filter(|c| is_ultimate(c)).collect();
    if ultimate.is_empty() {
        return Err(StaticsError::Invalid(vec![Problem::new(
            Field::Combinations,
            "no ultimate combination (one that factors the permanent action above 1) to size with: add one, or \
             restore the load model's presets",
        )]));
    }
    let generated = frame_model(valid);
    let arch = arch_buckling(valid);
    let sizing = &design.sizing;
    // members: demand, lengths, group
    struct Row {
        k: usize,
        group: GroupName,
        length: f64,
        demand: Demand,
        lengths: Lengths,
        parts: [Part; 3],
    }
    let model = &generated.model;
    let mut rows: Vec<Row> = generated
        .map
        .roles
        .iter()
        .enumerate()
        .map(|(k, role)| {
            let length = model.member_length(k);
            let group = group_of(*role);
            let factor = sizing.group(group).length_factor;
            let lengths = match group {
                GroupName::Rib => {
                    // two or more ribs: held sideways at every rib node by bracing between
                    // them (assumed, not modelled or counted); one rib: nothing holds it
                    // between the springings
                    let default = if design.deck.ribs >= 2 { length } else { 2.0 * arch.half_length };
                    Lengths {
                        in_plane: arch.length,
                        out_of_plane: sizing.rib_out_of_plane.unwrap_or(default),
                    }
                }
                GroupName::Deck => Lengths { in_plane: factor * length, out_of_plane: 0.0 },
                _ => Lengths { in_plane: factor * length, out_of_plane: factor * length },
            };
            let (parts, least) = member_demand(report, &generated, k, &ultimate);
            let demand = Demand {
                compression: parts[0].value,
                tension: parts[1].value,
                moment: parts[2].value,
                least_compression: least,
            };
            Row { k, group, length, demand, lengths, parts }
        })
        .collect();
    // the rib's stability from the buckling of the placements that govern its members
    let source = |p: &Part| p.source.clone().map(|(line, max)| (p.combination.clone(), line, max));
    let sources: Vec<RibSources> = rows
        .iter()
        .filter(|r| r.group == GroupName::Rib)
        .map(|r| RibSources { member: r.k, compression: source(&r.parts[0]), moment: source(&r.parts[2]) })
        .collect();
    let (stability, stability_failure) = if sources.is_empty() {
        (None, None)
    } else {
        match rib_stability(valid, &generated, report, &ultimate, &sources) {
            Ok(s) => (Some(s), None),
            Err(e) => (None, Some(e.to_string())),
        }
    };
    let mut rib_index = vec![None; model.members.len()];
    for (i, s) in sources.iter().enumerate() {
        if let Some(slot) = rib_index.get_mut(s.member) {
            *slot = Some(i);
        }
    }
    // the stability of row `r`'s member, when it is a rib member and the rib's was found
    let stability_of = |r: &Row| {
        let st = stability.as_ref()?;
        Some((st, st.members.get(rib_index.get(r.k).copied().flatten()?)?))
    };
    // a rib member's in-plane buckling length is alpha_cr's (what the report shows)
    for r in &mut rows {
        if let Some(l) = stability_of(r).and_then(|(_, m)| m.length) {
            r.lengths.in_plane = l;
        }
    }
    // one member's check at a section of E I `ei`: a rib member's with its stability
    let check_member = |material: &Material, family: &Family, props: &SectionProps, ei: f64, r: &Row| {
        match stability_of(r) {
            Some((st, member)) => {
                st.check(member, &RibSection { material, family, props, ei }, &r.demand, &r.lengths)
            }
            None => check(material, family, props, &r.demand, &r.lengths),
        }
    };
    let mut groups = Vec::new();
    let mut rib_alpha_cr = None;
    let mut trials = vec![None; rows.len()];
    let mut at_group = vec![None; rows.len()];
    for g in GroupName::ALL {
        let s = sizing.group(g);
        let mine: Vec<&Row> = rows.iter().filter(|r| r.group == g).collect();
        let typed = typed_section(&design.groups, g);
        let (outcome, props, family) = match &s.family {
            _ if mine.is_empty() => (GroupOutcome::NoMembers, None, typed_props(&typed, &s.material).1),
            None => {
                let (props, family) = typed_props(&typed, &s.material);
                (GroupOutcome::AsTyped, Some(props), family)
            }
            Some(family) => {
                // the largest size any member needs
                let mut need: Option<(f64, String)> = None;
                let mut failure = None;
                for r in &mine {
                    let e = s.material.e();
                    let sized = size_member_by(
                        &s.material,
                        family,
                        &|props: &SectionProps| -> Result<Check, String> {
                            check_member(&s.material, family, props, e * props.i, r)
                        },
                    );
                    match sized {
                        Ok(sized) => {
                            if need.as_ref().is_none_or(|(size, _)| sized.size > *size) {
                                need = Some((sized.size, model.member_label(r.k)));
                            }
                        }
                        Err(reason) => {
                            failure = Some(format!("member {}: {reason}", model.member_label(r.k)));
                            break;
                        }
                    }
                }
                match (failure, need) {
                    (Some(reason), _) => (GroupOutcome::NotSized { reason }, None, *family),
                    (None, Some((size, _))) => {
                        let props = family.props(size);
                        (GroupOutcome::Sized { label: family.label(size), size, props }, Some(props), *family)
                    }
                    // no member in the group: nothing to size
                    (None, None) => (GroupOutcome::NoMembers, None, *family),
                }
            }
        };
        let mut worst: Option<(f64, String)> = None;
        if let Some(props) = props {
            // E I per rib line of the group's section: the typed E, or the material's
            let e = if matches!(outcome, GroupOutcome::AsTyped) { typed.e } else { s.material.e() };
            let ei = e * props.i;
            if let (GroupName::Rib, Some(st)) = (g, &stability) {
                rib_alpha_cr = Some(st.alpha_cr * ei / st.analysed_ei);
                for r in &mine {
                    if let (Some((_, member)), Some(slot)) = (stability_of(r), trials.get_mut(r.k)) {
                        let section =
                            RibSection { material: &s.material, family: &family, props: &props, ei };
                        *slot = Some(st.trial_of(member, &section));
                    }
                }
            }
            for r in &mine {
                if let Ok(c) = check_member(&s.material, &family, &props, ei, r) {
                    if worst.as_ref().is_none_or(|(u, _)| c.utilisation > *u) {
                        worst = Some((c.utilisation, model.member_label(r.k)));
                    }
                    if let Some(slot) = at_group.get_mut(r.k) {
                        *slot = Some(c);
                    }
                }
            }
        }
        let section = match (&outcome, props) {
            (GroupOutcome::AsTyped, _) => Some(typed),
            (GroupOutcome::Sized { .. }, Some(p)) => Some(Section {
                e: s.material.e(),
                a: p.a,
                i: p.i,
                depth: p.depth,
                unit_weight: s.material.unit_weight(),
            }),
            _ => None,
        };
        groups.push(GroupReport {
            group: g.key().into(),
            material: s.material.name().into(),
            family: s.family.as_ref().map(|f| f.name().to_string()),
            outcome,
            utilisation: worst.as_ref().map(|w| w.0),
            governing_member: worst.map(|w| w.1),
            members: mine.len(),
            section,
        });
    }
    // rows, checks and trials are all in member order
    let members = rows
        .into_iter()
        .zip(at_group.into_iter().zip(trials))
        .map(|(r, (c, trial))| {
            let governs = c.as_ref().map(|c| c.governs);
            // the part of the demand the governing mode is about
            // (the moment's for compression and bending: where the traffic stands for it
            // tells more than where it stands for the axial force)
            let part = match governs {
                Some(Mode::Tension) if r.parts[1].value > 0.0 => &r.parts[1],
                Some(Mode::Bending | Mode::Interaction) if r.parts[2].value > 0.0 => &r.parts[2],
                _ if r.parts[0].value > 0.0 => &r.parts[0],
                _ if r.parts[1].value > 0.0 => &r.parts[1],
                _ => &r.parts[2],
            };
            MemberSizing {
                member: model.member_label(r.k),
                group: r.group.key().into(),
                length: r.length,
                demand: r.demand,
                lengths: r.lengths,
                utilisation: c.as_ref().map(|c| c.utilisation),
                governs,
                combination: part.combination.clone(),
                placement: part.placement.clone(),
                second_order: trial,
            }
        })
        .collect();
    Ok(MemberSizingReport {
        combinations: ultimate.iter().map(|c| c.name.clone()).collect(),
        basis: format!(
            "Per rib line, over the ultimate combinations ({}): the largest tension, compression and in-plane \
             moment of each member from the frame model's envelopes, taken together (conservative); one section \
             per group, the smallest of its family that every member of the group passes. Typed sections are \
             checked with W = 2 I / depth and the same I out of plane, their wall class unchecked (a typed \
             concrete section with 1 % reinforcement). The sizes are found for the weights and stiffnesses of the sections the analysis \
             used: after adopting them, size again (the self-weight changes). The deck's moments are checked at \
             the members' ends and mid-length; the three-hinged crown's drop-in deck span is not a member of the \
             model and is not checked. The erection stage is checked apart. {}",
            ultimate.iter().map(|c| c.name.as_str()).collect::<Vec<_>>().join(", "),
            match (&stability, &stability_failure) {
                (Some(st), _) => format!("Rib: {}.", st.basis()),
                (None, Some(why)) => format!(
                    "Rib: its stability could not be analysed ({why}); {} instead.",
                    arch.basis
                ),
                (None, None) => arch.basis.clone(),
            }
        ),
        arch_buckling: arch,
        rib_stability: stability,
        rib_stability_failure: stability_failure,
        rib_alpha_cr,
        groups,
        members,
        caution: CAUTION.into(),
    })
}

/// The design with every sized group's section adopted (the typed section replaced by
/// the sized one: area, I, depth, E and unit weight) and kept sized: what "use these
/// sizes" does. Groups as typed or not sized stay as they are.
pub fn adopt_sizes(design: &Design, report: &MemberSizingReport) -> Design {
    let mut out = design.clone();
    for g in &report.groups {
        let (GroupOutcome::Sized { .. }, Some(section)) = (&g.outcome, g.section) else { continue };
        let Some(name) = GroupName::ALL.into_iter().find(|n| n.key() == g.group) else { continue };
        let target = match name {
            GroupName::Rib => &mut out.groups.rib,
            GroupName::Deck => &mut out.groups.deck,
            GroupName::Posts => &mut out.groups.posts,
            GroupName::Piers => &mut out.groups.piers,
            GroupName::Bracing => &mut out.groups.bracing,
        };
        *target = section;
    }
    out
}

/// Everything `springline size` reports: member sizes and utilisations, quantities and
/// cost index, foundation demand and thrust blocks.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SizeReport {
    /// The design's name.
    pub design: String,
    /// What the form of the sized design was found for.
    pub form_basis: crate::arch::form::Basis,
    /// Units of every number.
    pub units: String,
    /// Member sizing.
    pub sizing: MemberSizingReport,
    /// Quantities and cost index.
    pub quantities: crate::arch::quantities::Quantities,
    /// Foundation demand.
    pub foundations: crate::arch::foundation::Foundations,
    /// Buckling under the dead load and the natural frequencies of the analysed design
    /// (`arch::stability`; the governing placements' alpha_cr are in
    /// `sizing.rib_stability`); `None` when they could not be found.
    pub stability: Option<StabilitySummary>,
    /// Why they could not be found.
    pub stability_failure: Option<String>,
    /// Caution.
    pub caution: String,
}

impl SizeReport {
    /// The groups that could not be sized, each as `group: reason`.
    pub fn not_sized(&self) -> Vec<String> {
        self.sizing.not_sized()
    }
}

impl MemberSizingReport {
    /// The groups that could not be sized, each as `group: reason`.
    pub fn not_sized(&self) -> Vec<String> {
        self.groups
            .iter()
            .filter_map(|g| match &g.outcome {
                GroupOutcome::NotSized { reason } => Some(format!("{}: {reason}", g.group)),
                _ => None,
            })
            .collect()
    }
}

/// The frame model's traffic report of `valid` (`arch::traffic::traffic_envelopes`),
/// which sizing and sweeps need.
///
/// Errors: those of the envelopes, and `Invalid` when the frame model has none.
pub fn frame_traffic(valid: &ValidDesign) -> Result<TrafficReport, StaticsError> {
    crate::arch::traffic::traffic_envelopes(valid, crate::arch::generate::ModelKind::Frame)?.ok_or_else(
        || {
            StaticsError::Invalid(vec![Problem::new(
                crate::error::Location::Part("frame model".into()),
                "the frame model has no traffic envelopes to size with",
            )])
        },
    )
}

/// Validates `design`, finds its frame traffic report and sizes it ([`size_design`]).
///
/// Errors: those of validation, [`frame_traffic`] and [`size_design`].
pub fn size_of(design: &Design) -> Result<SizeReport, StaticsError> {
    let valid = ValidDesign::new(design)?;
    let traffic = frame_traffic(&valid)?;
    size_design(&valid, &traffic)
}

/// How many natural frequencies the size report lists.
pub const SUMMARY_MODES: usize = 4;

/// Units of the size report.
pub const SIZE_UNITS: &str = "m, m2, m3, m4, kN, kNm, kN/m2, t (tonnes), degrees; utilisation = demand / \
                              resistance (1 = fully used); cost index in the units of the design's rates";

/// The parts of [`size_design`] that sizing and weighing need, without the dead-load
/// modes and frequencies of its stability summary: every group sized
/// ([`size_members`], the rib's alpha_cr of the governing placements included), the
/// foundations with the sized rib's springing section, and the quantities. What option
/// sweeps and comparisons use (the same numbers as the whole report, sooner).
///
/// Errors: those of [`size_members`].
pub fn size_and_weigh(
    valid: &ValidDesign,
    report: &TrafficReport,
) -> Result<
    (MemberSizingReport, crate::arch::foundation::Foundations, crate::arch::quantities::Quantities),
    StaticsError,
> {
    let sizing = size_members(valid, report)?;
    // the rib's depth and width at the springing: the sized section's, or the typed depth
    // (a typed section gives no width: taken as its depth)
    let rib = sizing.groups.iter().find(|g| g.group == GroupName::Rib.key());
    let rib_size = match rib.map(|g| &g.outcome) {
        Some(GroupOutcome::Sized { props, .. }) => (props.depth, props.width),
        _ => {
            let d = valid.design().groups.rib.depth;
            (d, d)
        }
    };
    let foundations = crate::arch::foundation::foundations(valid, report, rib_size);
    let quantities = crate::arch::quantities::quantities(valid, &sizing, &foundations);
    Ok((sizing, foundations, quantities))
}

/// Sizes `valid` from its frame model's traffic report `report` (`arch::traffic`),
/// weighs it and sizes its thrust blocks (the module docs of `arch::sizing`,
/// `arch::quantities` and `arch::foundation`).
///
/// Errors: those of [`size_members`].
pub fn size_design(valid: &ValidDesign, report: &TrafficReport) -> Result<SizeReport, StaticsError> {
    let (sizing, foundations, quantities) = size_and_weigh(valid, report)?;
    let (stability, stability_failure) = match arch_stability(valid, SUMMARY_MODES) {
        Ok(s) => (Some(s.summary()), None),
        Err(e) => (None, Some(e.to_string())),
    };
    Ok(SizeReport {
        stability,
        stability_failure,
        design: valid.design().name.clone(),
        form_basis: valid.form().basis,
        units: SIZE_UNITS.into(),
        sizing,
        quantities,
        foundations,
        caution: CAUTION.into(),
    })
}
