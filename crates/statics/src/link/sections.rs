//! The tagged sections of link format `s2`: every design field added after design format
//! 1 travels in a section of its own, after the frozen core (`core_v1`).
//!
//! | tag | design format | what |
//! | --- | --- | --- |
//! | 1 | 2 | the abutment height |
//! | 2 | 3 | the traffic: carriageway, rib positions, load model, combinations |
//! | 3 | 4 | the other actions (temperature, springing movement, deflection limit) and the combinations' factors of them |
//! | 4 | 5 | the sizing: each group's family, material and buckling length factor, the rib's out-of-plane length, the deck's cross-section, unit rates, foundation inputs |
//! | 5 | 6 | the form-finding basis (panel loads or as built) |
//! | 6 | 6 | the families added in design format 6 (the concrete box), per group; section 4's frozen family cannot hold them, so it carries no family for such a group |
//! | 7 | 7 | the rib sized for a first-order analysis (alpha_cr >= 10) |
//!
//! A section on the wire is its tag (a varint) and its body: the postcard bytes of the
//! section's struct, length-prefixed. Each section struct is FROZEN once shipped, like the
//! core: a later field never goes into an existing section; it gets a new section with a
//! new tag (a later version of the same data is a new tag too). Tags are numbered from 1
//! in the order sections are added; tag 9999 is reserved for tests and never shipped.
//!
//! A writer writes every section it knows, tags ascending. A reader starts from the core
//! with every later field at its default (the value a design without it had), reads each
//! section it knows over those defaults, and refuses a tag it does not know ("made by a
//! newer version"): silently dropping a field the user set would open another design.
//!
//! # Adding a field (what a later change does)
//!
//! 1. Design file: bump `DESIGN_VERSION` and add one migration step that gives the field
//!    its default (`arch::design_file`).
//! 2. Link: a new frozen struct here, a new tag (the next free number), one entry in
//!    [`SECTIONS`] with its writer and reader. Links without the section open with the
//!    default the core gave (set it in `core_v1::into_design`, as for the abutment
//!    height); the destructuring in `core_v1::from_design` names the field as carried by
//!    the section.
//! 3. Fixtures: a `vN-` link fixture with a non-default value; old fixtures stay as
//!    they are.

use crate::arch::design::Design;
use crate::error::LinkError;
use crate::traffic::combination::Combination;
use crate::traffic::models::{Crowd, EnLm1, Hl93, LoadModel, UserDefined};
use crate::traffic::TrafficDesign;
use serde::de::DeserializeOwned;
use serde::{Deserialize, Serialize};

/// One section as it travels: its tag and the postcard bytes of its frozen struct.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub(super) struct RawSection {
    /// Which section.
    pub(super) tag: u32,
    /// Postcard bytes of the section's struct.
    pub(super) body: Vec<u8>,
}

/// How one kind of section is written and read for a target `T`: the `Design`, or in the
/// tests a design with a field of a later version.
pub(super) struct SectionKind<T> {
    /// The section's tag.
    pub(super) tag: u32,
    /// The body of the section for a target.
    pub(super) write: fn(&T) -> Vec<u8>,
    /// Reads a body over the target's defaults.
    pub(super) read: fn(&[u8], &mut T) -> Result<(), LinkError>,
}

/// The abutment height (design format 2).
pub(super) const TAG_ABUTMENT: u32 = 1;
/// The traffic (design format 3).
pub(super) const TAG_TRAFFIC: u32 = 2;
/// The other actions (design format 4).
pub(super) const TAG_ACTIONS: u32 = 3;
/// The sizing (design format 5).
pub(super) const TAG_SIZING: u32 = 4;
/// The form-finding basis (design format 6).
pub(super) const TAG_FORM_BASIS: u32 = 5;
/// The section families added in design format 6 (design format 6).
pub(super) const TAG_ADDED_FAMILIES: u32 = 6;
/// The rib sized for a first-order analysis (design format 7).
pub(super) const TAG_FIRST_ORDER_RIB: u32 = 7;
/// A tag no shipped section has: the tests use it for a section of a "later version".
#[cfg(test)]
pub(super) const TAG_RESERVED_FOR_TESTS: u32 = 9_999;

/// Every section this version writes and reads, tags ascending.
pub(super) const SECTIONS: &[SectionKind<Design>] = &[
    SectionKind { tag: TAG_ABUTMENT, write: abutment::write, read: abutment::read },
    SectionKind { tag: TAG_TRAFFIC, write: traffic::write, read: traffic::read },
    SectionKind { tag: TAG_ACTIONS, write: actions::write, read: actions::read },
    SectionKind { tag: TAG_SIZING, write: sizing::write, read: sizing::read },
    SectionKind { tag: TAG_FORM_BASIS, write: form_basis::write, read: form_basis::read },
    SectionKind { tag: TAG_ADDED_FAMILIES, write: added_families::write, read: added_families::read },
    SectionKind { tag: TAG_FIRST_ORDER_RIB, write: first_order_rib::write, read: first_order_rib::read },
];

/// The sections of a target, one per kind, in the order of `kinds` (tags ascending).
pub(super) fn write_all<T>(kinds: &[SectionKind<T>], target: &T) -> Vec<RawSection> {
    kinds.iter().map(|k| RawSection { tag: k.tag, body: (k.write)(target) }).collect()
}

/// Reads every section over the defaults already in `target`.
///
/// Errors: `DamagedSection` when a tag repeats or comes out of order (a writer writes
/// them ascending) or a body does not read; `NewerSection` for a tag `kinds` lacks.
pub(super) fn read_all<T>(
    sections: &[RawSection],
    kinds: &[SectionKind<T>],
    target: &mut T,
) -> Result<(), LinkError> {
    let mut previous: Option<u32> = None;
    for s in sections {
        if previous.is_some_and(|p| s.tag <= p) {
            return Err(LinkError::DamagedSection { tag: s.tag, detail: "repeated or out of order".into() });
        }
        previous = Some(s.tag);
        let Some(kind) = kinds.iter().find(|k| k.tag == s.tag) else {
            return Err(LinkError::NewerSection { tag: s.tag });
        };
        (kind.read)(&s.body, target)?;
    }
    Ok(())
}

/// The postcard bytes of a section struct.
pub(super) fn body<S: Serialize>(section: &S) -> Vec<u8> {
    // Serialising into a growable vector fails only for sequences of unknown length,
    // which section structs do not have.
    postcard::to_allocvec(section).unwrap_or_default()
}

/// A section struct from its body; the body must be used up exactly.
pub(super) fn frozen<S: DeserializeOwned>(tag: u32, bytes: &[u8]) -> Result<S, LinkError> {
    let (section, rest) = postcard::take_from_bytes::<S>(bytes)
        .map_err(|e| LinkError::DamagedSection { tag, detail: e.to_string() })?;
    if !rest.is_empty() {
        return Err(LinkError::DamagedSection { tag, detail: format!("{} bytes left over", rest.len()) });
    }
    Ok(section)
}

/// Section 1 (design format 2): the abutment height.
mod abutment {
    use super::*;

    /// FROZEN: links hold this layout.
    #[derive(Serialize, Deserialize)]
    struct Abutment {
        /// `deck.abutment_height`, m.
        height: f64,
    }

    pub(super) fn write(d: &Design) -> Vec<u8> {
        body(&Abutment { height: d.deck.abutment_height })
    }

    pub(super) fn read(bytes: &[u8], d: &mut Design) -> Result<(), LinkError> {
        let Abutment { height } = frozen(TAG_ABUTMENT, bytes)?;
        d.deck.abutment_height = height;
        Ok(())
    }
}

/// Section 5 (design format 6): the form-finding basis.
mod form_basis {
    use super::*;
    use crate::arch::form::Basis;

    /// FROZEN: links hold this layout (a postcard enum travels as its variant index).
    #[derive(Serialize, Deserialize)]
    enum FormBasisV1 {
        PanelLoads,
        AsBuilt,
    }

    pub(super) fn write(d: &Design) -> Vec<u8> {
        body(&match d.form.basis {
            Basis::PanelLoads => FormBasisV1::PanelLoads,
            Basis::AsBuilt => FormBasisV1::AsBuilt,
        })
    }

    pub(super) fn read(bytes: &[u8], d: &mut Design) -> Result<(), LinkError> {
        d.form.basis = match frozen(TAG_FORM_BASIS, bytes)? {
            FormBasisV1::PanelLoads => Basis::PanelLoads,
            FormBasisV1::AsBuilt => Basis::AsBuilt,
        };
        Ok(())
    }
}

/// Section 7 (design format 7): whether the rib is sized for alpha_cr >= 10.
mod first_order_rib {
    use super::*;

    /// FROZEN: links hold this layout.
    #[derive(Serialize, Deserialize)]
    struct FirstOrderRibV1 {
        /// `sizing.rib_for_first_order`.
        on: bool,
    }

    pub(super) fn write(d: &Design) -> Vec<u8> {
        body(&FirstOrderRibV1 { on: d.sizing.rib_for_first_order })
    }

    pub(super) fn read(bytes: &[u8], d: &mut Design) -> Result<(), LinkError> {
        let FirstOrderRibV1 { on } = frozen(TAG_FIRST_ORDER_RIB, bytes)?;
        d.sizing.rib_for_first_order = on;
        Ok(())
    }
}

/// Section 6 (design format 6): the section families added in design format 6, the
/// concrete box, one optional family per group. Section 4's frozen `FamilyV1` has no
/// variant for them: its writer writes no family for such a group, and this section
/// carries it (read after section 4, over the `None` it gave). A group whose family
/// section 4 carries has `None` here; a link with a family for a group in both is refused
/// as damaged (no writer makes one). A family added later goes in a section of its own.
mod added_families {
    use super::*;
    use crate::arch::sizing::{GroupSizing, SizingDesign};
    use crate::sizing::sections::Family;

    /// FROZEN: a concrete box: width/depth, wall/depth, reinforcement ratio, cover (m).
    #[derive(Serialize, Deserialize)]
    struct ConcreteBoxV1(f64, f64, f64, f64);

    /// FROZEN: links hold this layout; each group's concrete box, if it has one.
    #[derive(Serialize, Deserialize)]
    struct AddedFamiliesV1 {
        rib: Option<ConcreteBoxV1>,
        deck: Option<ConcreteBoxV1>,
        posts: Option<ConcreteBoxV1>,
        piers: Option<ConcreteBoxV1>,
        bracing: Option<ConcreteBoxV1>,
    }

    fn box_out(g: &GroupSizing) -> Option<ConcreteBoxV1> {
        match g.family? {
            Family::ConcreteBox { width_over_depth, wall_over_depth, reinforcement_ratio, cover } => {
                Some(ConcreteBoxV1(width_over_depth, wall_over_depth, reinforcement_ratio, cover))
            }
            Family::Chs { .. }
            | Family::Shs { .. }
            | Family::WeldedBox { .. }
            | Family::ConcreteRect { .. }
            | Family::GlulamRect { .. } => None,
        }
    }

    /// Sets a group's box over the `None` section 4 gave it.
    fn box_in(b: Option<ConcreteBoxV1>, g: &mut GroupSizing, group: &str) -> Result<(), LinkError> {
        let Some(ConcreteBoxV1(width_over_depth, wall_over_depth, reinforcement_ratio, cover)) = b else {
            return Ok(());
        };
        if g.family.is_some() {
            return Err(LinkError::DamagedSection {
                tag: TAG_ADDED_FAMILIES,
                detail: format!("the {group} has a family in the sizing section too"),
            });
        }
        g.family =
            Some(Family::ConcreteBox { width_over_depth, wall_over_depth, reinforcement_ratio, cover });
        Ok(())
    }

    pub(super) fn write(d: &Design) -> Vec<u8> {
        let SizingDesign { rib, deck, posts, piers, bracing, .. } = &d.sizing;
        body(&AddedFamiliesV1 {
            rib: box_out(rib),
            deck: box_out(deck),
            posts: box_out(posts),
            piers: box_out(piers),
            bracing: box_out(bracing),
        })
    }

    pub(super) fn read(bytes: &[u8], d: &mut Design) -> Result<(), LinkError> {
        let AddedFamiliesV1 { rib, deck, posts, piers, bracing } = frozen(TAG_ADDED_FAMILIES, bytes)?;
        let s = &mut d.sizing;
        box_in(rib, &mut s.rib, "rib")?;
        box_in(deck, &mut s.deck, "deck")?;
        box_in(posts, &mut s.posts, "posts")?;
        box_in(piers, &mut s.piers, "piers")?;
        box_in(bracing, &mut s.bracing, "bracing")
    }
}

/// Section 2 (design format 3): the whole traffic design.
///
/// The live types cannot travel as they are: the load model is an internally tagged
/// enum in design files, which postcard (not self-describing) cannot read, and a live
/// type may gain a field. So the section has frozen mirrors of its own, converted field
/// by field; the destructuring of every live type is exhaustive, so a field added to
/// one stops the build here, to be carried in a new section (never in these structs).
mod traffic {
    use super::*;

    /// FROZEN: links hold this layout. `TrafficDesign`.
    #[derive(Serialize, Deserialize)]
    struct TrafficV1 {
        /// m.
        carriageway_width: f64,
        /// m from the deck centreline, left to right; empty for evenly spaced ribs.
        rib_positions: Vec<f64>,
        load_model: LoadModelV1,
        combinations: Vec<CombinationV1>,
    }

    /// FROZEN: the variants travel by their index, so their order never changes and a
    /// new model is a new section.
    #[derive(Serialize, Deserialize)]
    enum LoadModelV1 {
        EnLm1(EnLm1V1),
        Hl93(Hl93V1),
        Crowd(CrowdV1),
        UserDefined(UserDefinedV1),
    }

    /// FROZEN: `models::EnLm1`.
    #[derive(Serialize, Deserialize)]
    struct EnLm1V1 {
        lane_width: f64,
        tandem_axle: [f64; 3],
        udl_lane_1: f64,
        udl_other_lanes: f64,
        udl_remaining: f64,
        alpha_tandem: [f64; 3],
        alpha_udl_lane_1: f64,
        alpha_udl_other: f64,
        axle_spacing: f64,
        wheel_gauge: f64,
        footway_udl: f64,
    }

    /// FROZEN: `models::Hl93`.
    #[derive(Serialize, Deserialize)]
    struct Hl93V1 {
        lane_width: f64,
        truck_axles: [f64; 3],
        truck_front_spacing: f64,
        truck_rear_spacing_min: f64,
        truck_rear_spacing_max: f64,
        tandem_axle: f64,
        tandem_spacing: f64,
        wheel_gauge: f64,
        lane_load: f64,
        lane_load_width: f64,
        impact: f64,
        multiple_presence: [f64; 4],
        two_truck_factor: f64,
        two_truck_headway: f64,
        two_truck_rear_spacing: f64,
        pedestrian_load: f64,
    }

    /// FROZEN: `models::Crowd`.
    #[derive(Serialize, Deserialize)]
    struct CrowdV1 {
        constant: f64,
        numerator: f64,
        length_offset: f64,
        min: f64,
        max: f64,
        fixed: Option<f64>,
    }

    /// FROZEN: `models::UserDefined`; the index of the variable spacing as a `u64`, so a
    /// link reads the same on 32- and 64-bit targets.
    #[derive(Serialize, Deserialize)]
    struct UserDefinedV1 {
        uniform: f64,
        axles: Vec<f64>,
        spacings: Vec<f64>,
        variable_spacing: Option<(u64, f64, f64)>,
        lane_width: f64,
        wheel_gauge: f64,
    }

    /// FROZEN: `combination::Combination`.
    #[derive(Serialize, Deserialize)]
    struct CombinationV1 {
        name: String,
        clause: String,
        permanent_unfavourable: f64,
        permanent_favourable: f64,
        uniform: f64,
        vehicle: f64,
    }

    pub(super) fn write(d: &Design) -> Vec<u8> {
        let TrafficDesign { carriageway_width, rib_positions, load_model, combinations } = &d.traffic;
        body(&TrafficV1 {
            carriageway_width: *carriageway_width,
            rib_positions: rib_positions.clone(),
            load_model: model_out(load_model),
            combinations: combinations.iter().map(combination_out).collect(),
        })
    }

    pub(super) fn read(bytes: &[u8], d: &mut Design) -> Result<(), LinkError> {
        let TrafficV1 { carriageway_width, rib_positions, load_model, combinations } =
            frozen(TAG_TRAFFIC, bytes)?;
        d.traffic = TrafficDesign {
            carriageway_width,
            rib_positions,
            load_model: model_in(load_model)?,
            combinations: combinations.into_iter().map(combination_in).collect(),
        };
        // what a format-3 design opens with; the actions section replaces it
        let family = d.traffic.load_model.family();
        crate::traffic::combination::Combination::add_action_factors(family, &mut d.traffic.combinations);
        d.actions = crate::arch::actions::ActionsDesign::preset(family);
        Ok(())
    }

    fn model_out(model: &LoadModel) -> LoadModelV1 {
        match model {
            LoadModel::EnLm1(m) => {
                let EnLm1 {
                    lane_width,
                    tandem_axle,
                    udl_lane_1,
                    udl_other_lanes,
                    udl_remaining,
                    alpha_tandem,
                    alpha_udl_lane_1,
                    alpha_udl_other,
                    axle_spacing,
                    wheel_gauge,
                    footway_udl,
                } = *m;
                LoadModelV1::EnLm1(EnLm1V1 {
                    lane_width,
                    tandem_axle,
                    udl_lane_1,
                    udl_other_lanes,
                    udl_remaining,
                    alpha_tandem,
                    alpha_udl_lane_1,
                    alpha_udl_other,
                    axle_spacing,
                    wheel_gauge,
                    footway_udl,
                })
            }
            LoadModel::Hl93(m) => {
                let Hl93 {
                    lane_width,
                    truck_axles,
                    truck_front_spacing,
                    truck_rear_spacing_min,
                    truck_rear_spacing_max,
                    tandem_axle,
                    tandem_spacing,
                    wheel_gauge,
                    lane_load,
                    lane_load_width,
                    impact,
                    multiple_presence,
                    two_truck_factor,
                    two_truck_headway,
                    two_truck_rear_spacing,
                    pedestrian_load,
                } = *m;
                LoadModelV1::Hl93(Hl93V1 {
                    lane_width,
                    truck_axles,
                    truck_front_spacing,
                    truck_rear_spacing_min,
                    truck_rear_spacing_max,
                    tandem_axle,
                    tandem_spacing,
                    wheel_gauge,
                    lane_load,
                    lane_load_width,
                    impact,
                    multiple_presence,
                    two_truck_factor,
                    two_truck_headway,
                    two_truck_rear_spacing,
                    pedestrian_load,
                })
            }
            LoadModel::Crowd(m) => {
                let Crowd { constant, numerator, length_offset, min, max, fixed } = *m;
                LoadModelV1::Crowd(CrowdV1 { constant, numerator, length_offset, min, max, fixed })
            }
            LoadModel::UserDefined(m) => {
                let UserDefined { uniform, axles, spacings, variable_spacing, lane_width, wheel_gauge } = m;
                LoadModelV1::UserDefined(UserDefinedV1 {
                    uniform: *uniform,
                    axles: axles.clone(),
                    spacings: spacings.clone(),
                    // usize always fits u64 on the targets we build for (64 and 32 bit)
                    variable_spacing: variable_spacing.map(|(index, min, max)| (index as u64, min, max)),
                    lane_width: *lane_width,
                    wheel_gauge: *wheel_gauge,
                })
            }
        }
    }

    fn model_in(model: LoadModelV1) -> Result<LoadModel, LinkError> {
        Ok(match model {
            LoadModelV1::EnLm1(m) => {
                let EnLm1V1 {
                    lane_width,
                    tandem_axle,
                    udl_lane_1,
                    udl_other_lanes,
                    udl_remaining,
                    alpha_tandem,
                    alpha_udl_lane_1,
                    alpha_udl_other,
                    axle_spacing,
                    wheel_gauge,
                    footway_udl,
                } = m;
                LoadModel::EnLm1(EnLm1 {
                    lane_width,
                    tandem_axle,
                    udl_lane_1,
                    udl_other_lanes,
                    udl_remaining,
                    alpha_tandem,
                    alpha_udl_lane_1,
                    alpha_udl_other,
                    axle_spacing,
                    wheel_gauge,
                    footway_udl,
                })
            }
            LoadModelV1::Hl93(m) => {
                let Hl93V1 {
                    lane_width,
                    truck_axles,
                    truck_front_spacing,
                    truck_rear_spacing_min,
                    truck_rear_spacing_max,
                    tandem_axle,
                    tandem_spacing,
                    wheel_gauge,
                    lane_load,
                    lane_load_width,
                    impact,
                    multiple_presence,
                    two_truck_factor,
                    two_truck_headway,
                    two_truck_rear_spacing,
                    pedestrian_load,
                } = m;
                LoadModel::Hl93(Hl93 {
                    lane_width,
                    truck_axles,
                    truck_front_spacing,
                    truck_rear_spacing_min,
                    truck_rear_spacing_max,
                    tandem_axle,
                    tandem_spacing,
                    wheel_gauge,
                    lane_load,
                    lane_load_width,
                    impact,
                    multiple_presence,
                    two_truck_factor,
                    two_truck_headway,
                    two_truck_rear_spacing,
                    pedestrian_load,
                })
            }
            LoadModelV1::Crowd(m) => {
                let CrowdV1 { constant, numerator, length_offset, min, max, fixed } = m;
                LoadModel::Crowd(Crowd { constant, numerator, length_offset, min, max, fixed })
            }
            LoadModelV1::UserDefined(m) => {
                let UserDefinedV1 { uniform, axles, spacings, variable_spacing, lane_width, wheel_gauge } = m;
                let variable_spacing = match variable_spacing {
                    Some((index, min, max)) => {
                        let index = usize::try_from(index).map_err(|_| LinkError::TooLargeCount {
                            what: "index of the vehicle's variable spacing",
                            value: index,
                        })?;
                        Some((index, min, max))
                    }
                    None => None,
                };
                LoadModel::UserDefined(UserDefined {
                    uniform,
                    axles,
                    spacings,
                    variable_spacing,
                    lane_width,
                    wheel_gauge,
                })
            }
        })
    }

    fn combination_out(c: &Combination) -> CombinationV1 {
        // the factors of the other actions travel in the actions section (format 4)
        let Combination {
            name,
            clause,
            permanent_unfavourable,
            permanent_favourable,
            uniform,
            vehicle,
            temperature: _,
            settlement: _,
            braking: _,
        } = c;
        CombinationV1 {
            name: name.clone(),
            clause: clause.clone(),
            permanent_unfavourable: *permanent_unfavourable,
            permanent_favourable: *permanent_favourable,
            uniform: *uniform,
            vehicle: *vehicle,
        }
    }

    fn combination_in(c: CombinationV1) -> Combination {
        let CombinationV1 { name, clause, permanent_unfavourable, permanent_favourable, uniform, vehicle } =
            c;
        Combination {
            name,
            clause,
            permanent_unfavourable,
            permanent_favourable,
            uniform,
            vehicle,
            temperature: 0.0,
            settlement: 0.0,
            braking: 0.0,
        }
    }
}

/// Section 3 (design format 4): the other actions and the combinations' factors of them.
///
/// Read after the traffic section, over what a format-3 design opens with: the traffic
/// reader gives the load model family's action presets and factors
/// (`ActionsDesign::preset`, `Combination::add_action_factors`, which may add EN's gr2 at
/// the end, as the design file migration does). This section, when present, replaces
/// them: one factor triple per combination the design has, so combinations the traffic
/// reader added beyond those are dropped again. A preset's temperature clause travels as
/// the preset's index, not as text (free text is what a corrupted link can change
/// unseen: deflate's checksum is Adler-32).
mod actions {
    use super::*;
    use crate::arch::actions::{ActionsDesign, SpringingMovement, Temperature, TemperaturePreset};

    /// FROZEN: links hold this layout. `ActionsDesign` with the combinations' factors.
    #[derive(Serialize, Deserialize)]
    struct ActionsV1 {
        clause: ClauseV1,
        alpha: f64,
        expansion: f64,
        contraction: f64,
        deck_rib_difference: f64,
        spread: f64,
        settlement_left: f64,
        settlement_right: f64,
        deflection_limit: f64,
        /// (temperature, settlement, braking) per combination, in the traffic's order.
        factors: Vec<(f64, f64, f64)>,
    }

    /// FROZEN: the temperature clause: a preset's (index in `TemperaturePreset::ALL`, which
    /// only grows at its end) or the user's own words.
    #[derive(Serialize, Deserialize)]
    enum ClauseV1 {
        Preset(u8),
        Own(String),
    }

    pub(super) fn write(d: &Design) -> Vec<u8> {
        let ActionsDesign { temperature, springing, deflection_limit } = &d.actions;
        let Temperature { clause, alpha, expansion, contraction, deck_rib_difference } = temperature;
        let SpringingMovement { spread, settlement_left, settlement_right } = *springing;
        let preset = TemperaturePreset::ALL.iter().position(|p| Temperature::preset(*p).clause == *clause);
        body(&ActionsV1 {
            clause: match preset {
                Some(i) => ClauseV1::Preset(i as u8),
                None => ClauseV1::Own(clause.clone()),
            },
            alpha: *alpha,
            expansion: *expansion,
            contraction: *contraction,
            deck_rib_difference: *deck_rib_difference,
            spread,
            settlement_left,
            settlement_right,
            deflection_limit: *deflection_limit,
            factors: d.traffic.combinations.iter().map(Combination::action_factors).collect(),
        })
    }

    pub(super) fn read(bytes: &[u8], d: &mut Design) -> Result<(), LinkError> {
        let ActionsV1 {
            clause,
            alpha,
            expansion,
            contraction,
            deck_rib_difference,
            spread,
            settlement_left,
            settlement_right,
            deflection_limit,
            factors,
        } = frozen(TAG_ACTIONS, bytes)?;
        let damaged = |detail: String| LinkError::DamagedSection { tag: TAG_ACTIONS, detail };
        let clause = match clause {
            ClauseV1::Preset(i) => TemperaturePreset::ALL
                .get(usize::from(i))
                .map(|p| Temperature::preset(*p).clause)
                .ok_or_else(|| damaged(format!("no temperature preset {i}")))?,
            ClauseV1::Own(text) => text,
        };
        let combinations = &mut d.traffic.combinations;
        if factors.len() > combinations.len() {
            return Err(damaged(format!(
                "{} factor sets for {} combinations",
                factors.len(),
                combinations.len()
            )));
        }
        combinations.truncate(factors.len());
        for (c, f) in combinations.iter_mut().zip(factors) {
            (c.temperature, c.settlement, c.braking) = f;
        }
        d.actions = ActionsDesign {
            temperature: Temperature { clause, alpha, expansion, contraction, deck_rib_difference },
            springing: SpringingMovement { spread, settlement_left, settlement_right },
            deflection_limit,
        };
        Ok(())
    }
}

/// Section 4 (design format 5): the sizing. A link without it opens with every group as
/// typed (`SizingDesign::as_typed`, set by the core). Materials travel whole (a preset's
/// name is text like any other: a user may have edited its values). The frozen
/// `FamilyV1` holds the families of design format 5 only: for a group of a later family
/// (the concrete box) this section writes no family (`None`, as typed) and section 6
/// (`added_families`) carries it.
mod sizing {
    use super::*;
    use crate::arch::sizing::{
        DeckCrossSection, DeckWeight, FoundationDesign, GroupSizing, SizingDesign, UnitRates,
    };
    use crate::sizing::materials::{Concrete, Glulam, Material, Steel};
    use crate::sizing::sections::Family;

    /// FROZEN: a material.
    #[derive(Serialize, Deserialize)]
    enum MaterialV1 {
        /// name, fy, e, unit weight, gamma_M0, gamma_M1
        Steel(String, f64, f64, f64, f64, f64),
        /// name, fck, E_cm, unit weight, gamma_C, alpha_cc, rebar f_yk, gamma_S
        Concrete(String, f64, f64, f64, f64, f64, f64, f64),
        /// name, f_m,k, f_t,0,k, f_c,0,k, E_0,mean, E_0,05, unit weight, k_mod, gamma_M
        Glulam(String, f64, f64, f64, f64, f64, f64, f64, f64),
    }

    /// FROZEN: a section family of design format 5 (a later family travels in section
    /// 6; here its group has no family).
    #[derive(Serialize, Deserialize)]
    enum FamilyV1 {
        Chs(f64),
        Shs(f64),
        WeldedBox(f64, f64, f64),
        ConcreteRect(f64, f64, f64),
        GlulamRect(f64),
    }

    /// FROZEN: one group.
    #[derive(Serialize, Deserialize)]
    struct GroupV1 {
        family: Option<FamilyV1>,
        material: MaterialV1,
        length_factor: f64,
    }

    /// FROZEN: links hold this layout. `SizingDesign`.
    #[derive(Serialize, Deserialize)]
    struct SizingV1 {
        /// rib, deck, posts, piers, bracing
        groups: Vec<GroupV1>,
        rib_out_of_plane: Option<f64>,
        /// the deck weight from the cross-section (else the typed load)
        cross_section_weight: bool,
        /// slab thickness, slab unit weight, cross-girder spacing, area, unit weight,
        /// other dead load
        deck: (f64, f64, f64, f64, f64, f64),
        /// steel per t, concrete per m3, glulam per m3, foundation per m3
        rates: (f64, f64, f64, f64),
        /// allowable bearing, least thickness
        foundation: (f64, f64),
    }

    fn material_out(m: &Material) -> MaterialV1 {
        match m.clone() {
            Material::Steel(Steel { name, fy, e, unit_weight, gamma_m0, gamma_m1 }) => {
                MaterialV1::Steel(name, fy, e, unit_weight, gamma_m0, gamma_m1)
            }
            Material::Concrete(Concrete {
                name,
                fck,
                e_cm,
                unit_weight,
                gamma_c,
                alpha_cc,
                rebar_fyk,
                gamma_s,
            }) => MaterialV1::Concrete(name, fck, e_cm, unit_weight, gamma_c, alpha_cc, rebar_fyk, gamma_s),
            Material::Glulam(Glulam {
                name,
                f_m_k,
                f_t0_k,
                f_c0_k,
                e_0_mean,
                e_0_05,
                unit_weight,
                k_mod,
                gamma_m,
            }) => {
                MaterialV1::Glulam(name, f_m_k, f_t0_k, f_c0_k, e_0_mean, e_0_05, unit_weight, k_mod, gamma_m)
            }
        }
    }

    fn material_in(m: MaterialV1) -> Material {
        match m {
            MaterialV1::Steel(name, fy, e, unit_weight, gamma_m0, gamma_m1) => {
                Material::Steel(Steel { name, fy, e, unit_weight, gamma_m0, gamma_m1 })
            }
            MaterialV1::Concrete(name, fck, e_cm, unit_weight, gamma_c, alpha_cc, rebar_fyk, gamma_s) => {
                Material::Concrete(Concrete {
                    name,
                    fck,
                    e_cm,
                    unit_weight,
                    gamma_c,
                    alpha_cc,
                    rebar_fyk,
                    gamma_s,
                })
            }
            MaterialV1::Glulam(
                name,
                f_m_k,
                f_t0_k,
                f_c0_k,
                e_0_mean,
                e_0_05,
                unit_weight,
                k_mod,
                gamma_m,
            ) => Material::Glulam(Glulam {
                name,
                f_m_k,
                f_t0_k,
                f_c0_k,
                e_0_mean,
                e_0_05,
                unit_weight,
                k_mod,
                gamma_m,
            }),
        }
    }

    /// The frozen family, or `None` for a family this section cannot hold (section 6
    /// carries it).
    fn family_out(f: &Family) -> Option<FamilyV1> {
        Some(match *f {
            Family::Chs { d_over_t } => FamilyV1::Chs(d_over_t),
            Family::Shs { b_over_t } => FamilyV1::Shs(b_over_t),
            Family::WeldedBox { width_over_depth, flange_ratio, web_ratio } => {
                FamilyV1::WeldedBox(width_over_depth, flange_ratio, web_ratio)
            }
            Family::ConcreteRect { width_over_depth, reinforcement_ratio, cover } => {
                FamilyV1::ConcreteRect(width_over_depth, reinforcement_ratio, cover)
            }
            Family::GlulamRect { width_over_depth } => FamilyV1::GlulamRect(width_over_depth),
            Family::ConcreteBox { .. } => return None,
        })
    }

    fn family_in(f: FamilyV1) -> Family {
        match f {
            FamilyV1::Chs(d_over_t) => Family::Chs { d_over_t },
            FamilyV1::Shs(b_over_t) => Family::Shs { b_over_t },
            FamilyV1::WeldedBox(width_over_depth, flange_ratio, web_ratio) => {
                Family::WeldedBox { width_over_depth, flange_ratio, web_ratio }
            }
            FamilyV1::ConcreteRect(width_over_depth, reinforcement_ratio, cover) => {
                Family::ConcreteRect { width_over_depth, reinforcement_ratio, cover }
            }
            FamilyV1::GlulamRect(width_over_depth) => Family::GlulamRect { width_over_depth },
        }
    }

    pub(super) fn write(d: &Design) -> Vec<u8> {
        let SizingDesign {
            rib,
            deck,
            posts,
            piers,
            bracing,
            rib_out_of_plane,
            // carried by section 7
            rib_for_first_order: _,
            deck_section,
            rates,
            foundation,
        } = &d.sizing;
        let group = |g: &GroupSizing| GroupV1 {
            family: g.family.as_ref().and_then(family_out),
            material: material_out(&g.material),
            length_factor: g.length_factor,
        };
        let DeckCrossSection {
            weight,
            slab_thickness,
            slab_unit_weight,
            cross_girder_spacing,
            cross_girder_area,
            cross_girder_unit_weight,
            other_dead_load,
        } = *deck_section;
        let UnitRates { steel_per_t, concrete_per_m3, glulam_per_m3, foundation_per_m3 } = *rates;
        let FoundationDesign { allowable_bearing, min_thickness } = *foundation;
        body(&SizingV1 {
            groups: [rib, deck, posts, piers, bracing].into_iter().map(group).collect(),
            rib_out_of_plane: *rib_out_of_plane,
            cross_section_weight: weight == DeckWeight::CrossSection,
            deck: (
                slab_thickness,
                slab_unit_weight,
                cross_girder_spacing,
                cross_girder_area,
                cross_girder_unit_weight,
                other_dead_load,
            ),
            rates: (steel_per_t, concrete_per_m3, glulam_per_m3, foundation_per_m3),
            foundation: (allowable_bearing, min_thickness),
        })
    }

    pub(super) fn read(bytes: &[u8], d: &mut Design) -> Result<(), LinkError> {
        let SizingV1 { groups, rib_out_of_plane, cross_section_weight, deck, rates, foundation } =
            frozen(TAG_SIZING, bytes)?;
        let count = groups.len();
        let mut groups = groups.into_iter().map(|g| GroupSizing {
            family: g.family.map(family_in),
            material: material_in(g.material),
            length_factor: g.length_factor,
        });
        let mut next = || {
            groups.next().ok_or_else(|| LinkError::DamagedSection {
                tag: TAG_SIZING,
                detail: format!("{count} groups where 5 are sized"),
            })
        };
        let (rib, deck_group, posts, piers, bracing) = (next()?, next()?, next()?, next()?, next()?);
        if count != 5 {
            return Err(LinkError::DamagedSection {
                tag: TAG_SIZING,
                detail: format!("{count} groups where 5 are sized"),
            });
        }
        let (
            slab_thickness,
            slab_unit_weight,
            cross_girder_spacing,
            cross_girder_area,
            cross_girder_unit_weight,
            other_dead_load,
        ) = deck;
        d.sizing = SizingDesign {
            rib,
            deck: deck_group,
            posts,
            piers,
            bracing,
            rib_out_of_plane,
            // section 7's, read after this one
            rib_for_first_order: d.sizing.rib_for_first_order,
            deck_section: DeckCrossSection {
                weight: if cross_section_weight { DeckWeight::CrossSection } else { DeckWeight::TypedLoad },
                slab_thickness,
                slab_unit_weight,
                cross_girder_spacing,
                cross_girder_area,
                cross_girder_unit_weight,
                other_dead_load,
            },
            rates: UnitRates {
                steel_per_t: rates.0,
                concrete_per_m3: rates.1,
                glulam_per_m3: rates.2,
                foundation_per_m3: rates.3,
            },
            foundation: FoundationDesign { allowable_bearing: foundation.0, min_thickness: foundation.1 },
        };
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn shipped_tags_ascend_and_avoid_the_test_tag() {
        let tags: Vec<u32> = SECTIONS.iter().map(|k| k.tag).collect();
        assert!(tags.windows(2).all(|w| w[0] < w[1]), "{tags:?}");
        assert!(tags.iter().all(|&t| t != TAG_RESERVED_FOR_TESTS && t != 0), "{tags:?}");
    }

    #[test]
    fn repeated_out_of_order_and_damaged_sections_are_refused() {
        let mut d = Design::demo();
        let one = write_all(SECTIONS, &d);
        let twice: Vec<RawSection> = one.iter().chain(&one).cloned().collect();
        assert!(matches!(
            read_all(&twice, SECTIONS, &mut d),
            Err(LinkError::DamagedSection { tag: TAG_ABUTMENT, .. })
        ));
        let mut long = one.clone();
        long[0].body.push(0);
        let e = read_all(&long, SECTIONS, &mut d);
        assert!(matches!(&e, Err(LinkError::DamagedSection { detail, .. }) if detail.contains("left over")));
        let mut short = one;
        short[0].body.pop();
        assert!(matches!(read_all(&short, SECTIONS, &mut d), Err(LinkError::DamagedSection { .. })));
        let unknown = [RawSection { tag: 8, body: vec![] }];
        assert_eq!(read_all(&unknown, SECTIONS, &mut d), Err(LinkError::NewerSection { tag: 8 }));
    }

    /// A traffic of every load model family, each with values off its preset (and the
    /// options of the crowd and the vehicle set), for the section's round trips.
    fn traffics() -> Vec<TrafficDesign> {
        use crate::traffic::models::ModelFamily;
        ModelFamily::ALL
            .into_iter()
            .map(|family| {
                let mut t = TrafficDesign::preset(family, 9.0);
                t.rib_positions = vec![-3.25, 0.5, 3.25];
                match &mut t.load_model {
                    LoadModel::EnLm1(m) => m.alpha_tandem = [0.9, 0.8, 0.7],
                    LoadModel::Hl93(m) => m.multiple_presence[3] = 0.6,
                    LoadModel::Crowd(m) => m.fixed = Some(4.5),
                    LoadModel::UserDefined(m) => {
                        m.axles = vec![60.0, 120.0, 120.0];
                        m.spacings = vec![3.0, 4.0];
                        m.variable_spacing = Some((1, 4.0, 8.5));
                    }
                }
                t.combinations[0].name = "ULS, owner's factors".into();
                t.combinations[0].vehicle = 1.5;
                t.combinations.pop();
                t
            })
            .collect()
    }

    #[test]
    fn every_load_model_travels_in_the_traffic_section_exactly() {
        for traffic in traffics() {
            let mut d = Design::demo();
            d.traffic = traffic.clone();
            let sections = write_all(SECTIONS, &d);
            assert_eq!(
                sections.iter().map(|s| s.tag).collect::<Vec<_>>(),
                [
                    TAG_ABUTMENT,
                    TAG_TRAFFIC,
                    TAG_ACTIONS,
                    TAG_SIZING,
                    TAG_FORM_BASIS,
                    TAG_ADDED_FAMILIES,
                    TAG_FIRST_ORDER_RIB
                ]
            );
            let mut back = Design::demo();
            read_all(&sections, SECTIONS, &mut back).expect("reads");
            assert_eq!(back.traffic, traffic);
            assert_eq!(back, d);
        }
        // a link without the section keeps the traffic the core gave
        let mut d = Design::demo();
        let before = d.traffic.clone();
        read_all(&write_all(SECTIONS, &d)[..1], SECTIONS, &mut d).expect("reads");
        assert_eq!(d.traffic, before);
        // one without the actions section (format 3) opens with the presets of its family
        let mut d = Design::demo();
        d.traffic = TrafficDesign::preset(crate::traffic::models::ModelFamily::Hl93, 7.5);
        d.actions.temperature.expansion = 5.0;
        let mut back = Design::demo();
        read_all(&write_all(SECTIONS, &d)[..2], SECTIONS, &mut back).expect("reads");
        assert_eq!(back.traffic, d.traffic);
        assert_eq!(
            back.actions,
            crate::arch::actions::ActionsDesign::preset(crate::traffic::models::ModelFamily::Hl93)
        );
    }

    /// A concrete box rib and piers travel in section 6 (section 4 carries no family for
    /// them, and the other groups' families as before); a box in both is refused.
    /// The first-order rib option travels in section 7, one byte (postcard's bool); a
    /// link without the section opens with the option off.
    #[test]
    fn the_first_order_rib_travels_in_section_7() {
        let mut d = Design::demo();
        d.sizing.rib_for_first_order = true;
        let sections = write_all(SECTIONS, &d);
        let seven = sections.iter().find(|s| s.tag == TAG_FIRST_ORDER_RIB).expect("written");
        assert_eq!(seven.body, [1]);
        let mut back = Design::demo();
        read_all(&sections, SECTIONS, &mut back).expect("reads");
        assert_eq!(back, d);
        let without: Vec<RawSection> =
            sections.iter().filter(|s| s.tag != TAG_FIRST_ORDER_RIB).cloned().collect();
        let mut old = Design::demo();
        read_all(&without, SECTIONS, &mut old).expect("reads");
        assert!(!old.sizing.rib_for_first_order);
        let damaged = [RawSection { tag: TAG_FIRST_ORDER_RIB, body: vec![2] }];
        assert!(matches!(
            read_all(&damaged, SECTIONS, &mut Design::demo()),
            Err(LinkError::DamagedSection { tag: TAG_FIRST_ORDER_RIB, .. })
        ));
    }

    #[test]
    fn concrete_boxes_travel_in_the_added_families_section() {
        use crate::arch::sizing::GroupSizing;
        use crate::sizing::materials::material_preset;
        use crate::sizing::sections::Family;
        let concrete = material_preset("c50-60").expect("preset");
        let rib_box = Family::ConcreteBox {
            width_over_depth: 1.8,
            wall_over_depth: 0.11,
            reinforcement_ratio: 0.012,
            cover: 0.065,
        };
        let pier_box = Family::ConcreteBox {
            width_over_depth: 0.9,
            wall_over_depth: 0.15,
            reinforcement_ratio: 0.02,
            cover: 0.05,
        };
        let mut d = Design::demo();
        d.sizing.rib = GroupSizing::sized(rib_box, concrete.clone());
        d.sizing.piers = GroupSizing::sized(pier_box, concrete);
        d.sizing.posts.family = Some(Family::Chs { d_over_t: 33.0 });
        let sections = write_all(SECTIONS, &d);
        let mut back = Design::demo();
        read_all(&sections, SECTIONS, &mut back).expect("reads");
        assert_eq!(back.sizing, d.sizing);
        assert_eq!(back, d);
        // without section 6 (as a reader of section 4 alone sees it): the boxes' groups as
        // typed, their material kept; the CHS posts travel in section 4
        let mut without = Design::demo();
        let four: Vec<RawSection> =
            sections.iter().filter(|s| s.tag != TAG_ADDED_FAMILIES).cloned().collect();
        read_all(&four, SECTIONS, &mut without).expect("reads");
        assert_eq!(without.sizing.rib.family, None);
        assert_eq!(without.sizing.rib.material, d.sizing.rib.material);
        assert_eq!(without.sizing.piers.family, None);
        assert_eq!(without.sizing.posts.family, Some(Family::Chs { d_over_t: 33.0 }));
        // a demo (no box) writes five `None`s: one byte each
        assert_eq!(added_families::write(&Design::demo()), [0; 5]);
        // a box for a group whose family section 4 carries: damaged
        let mut both = Design::demo();
        both.sizing.posts = d.sizing.rib.clone();
        let mut sections = write_all(SECTIONS, &Design::demo());
        let at = sections.iter().position(|s| s.tag == TAG_ADDED_FAMILIES).expect("written");
        sections[at].body = added_families::write(&both);
        let e = read_all(&sections, SECTIONS, &mut Design::demo());
        assert!(
            matches!(&e, Err(LinkError::DamagedSection { tag: TAG_ADDED_FAMILIES, detail }) if detail.contains("posts")),
            "{e:?}"
        );
    }

    /// The layout of the section is frozen: the load model's variant travels as its index
    /// (0 EN LM1, 1 HL-93, 2 crowd, 3 user-defined) after the carriageway width (8 bytes)
    /// and the count of rib positions (one varint byte for 0 to 127).
    #[test]
    fn the_load_models_travel_by_their_frozen_index() {
        use crate::traffic::models::ModelFamily;
        for (index, family) in ModelFamily::ALL.into_iter().enumerate() {
            let mut d = Design::demo();
            d.traffic = TrafficDesign::preset(family, 7.5);
            let body = traffic::write(&d);
            assert_eq!(body[..8], 7.5f64.to_le_bytes(), "{family:?}");
            assert_eq!(body[8], 0, "{family:?}: no rib positions");
            assert_eq!(usize::from(body[9]), index, "{family:?}");
        }
        // a variant no shipped model has is refused as a damaged section
        let mut d = Design::demo();
        let mut body = traffic::write(&d);
        body[9] = 4;
        let e = read_all(&[RawSection { tag: TAG_TRAFFIC, body }], SECTIONS, &mut d);
        assert!(matches!(e, Err(LinkError::DamagedSection { tag: TAG_TRAFFIC, .. })), "{e:?}");
    }
}
