//! The core wire layout: every field of design format 1, in a fixed order. FROZEN.
//!
//! It is the whole of link format `s1` and the first part of link format `s2` (followed
//! there by tagged sections, see `sections`). Links holding it are out in the world:
//! never reorder, add or remove a field here, never change a type. A field added to the
//! design later goes into a new section, never into this struct. Committed fixtures under
//! `tests/fixtures/links/` hold this layout to that.

use crate::arch::actions::ActionsDesign;
use crate::arch::design::{
    Bracing, Crown, Deck, Design, FormSettings, GroundPoint, MemberGroups, RibSystem, Section,
    DEFAULT_ABUTMENT_HEIGHT,
};
use crate::arch::form::Basis;
use crate::arch::sizing::SizingDesign;
use crate::error::LinkError;
use crate::traffic::models::ModelFamily;
use crate::traffic::TrafficDesign;
use serde::{Deserialize, Serialize};

/// The core of a design on the wire (postcard: varint integers, f64 as 8 little-endian
/// bytes, strings and sequences length-prefixed).
#[derive(Serialize, Deserialize)]
pub(super) struct Wire {
    /// The design format version of the writer.
    pub(super) design_version: u32,
    name: String,
    valley: Vec<(f64, f64)>,
    deck: WireDeck,
    springing_left_level: f64,
    springing_right_level: f64,
    panels: u64,
    crown: WireCrown,
    min_post_length: f64,
    rib_system: WireRibSystem,
    bracing: WireBracing,
    approach_piers_left: u64,
    approach_piers_right: u64,
    /// rib, deck, posts, piers, bracing
    groups: [WireSection; 5],
    form_tolerance: f64,
    form_max_iterations: u64,
}

#[derive(Serialize, Deserialize)]
struct WireDeck {
    level: f64,
    left_seat_x: f64,
    right_seat_x: f64,
    width: f64,
    ribs: u64,
    dead_load: f64,
    surfacing: f64,
}

#[derive(Serialize, Deserialize)]
enum WireCrown {
    Rise(f64),
    Level(f64),
}

#[derive(Serialize, Deserialize)]
enum WireRibSystem {
    ThreeHinged,
    TwoHinged,
    Fixed,
}

#[derive(Serialize, Deserialize)]
enum WireBracing {
    None,
    Single { flipped: bool },
    Crossed,
}

#[derive(Serialize, Deserialize)]
struct WireSection {
    e: f64,
    a: f64,
    i: f64,
    depth: f64,
    unit_weight: f64,
}

fn section(s: &Section) -> WireSection {
    let Section { e, a, i, depth, unit_weight } = *s;
    WireSection { e, a, i, depth, unit_weight }
}

fn back(s: &WireSection) -> Section {
    Section { e: s.e, a: s.a, i: s.i, depth: s.depth, unit_weight: s.unit_weight }
}

/// usize always fits u64 on the targets we build for (64 and 32 bit).
fn wide(n: usize) -> u64 {
    n as u64
}

fn narrow(value: u64, what: &'static str) -> Result<usize, LinkError> {
    usize::try_from(value).map_err(|_| LinkError::TooLargeCount { what, value })
}

/// The core of a design, its version as the design gives it. The destructuring is
/// exhaustive on purpose: a new field of `Design` stops the build here, to be given a
/// place in a new section (`sections`), never in this core.
pub(super) fn from_design(d: &Design) -> Wire {
    let Design {
        version,
        name,
        valley,
        deck,
        springing_left_level,
        springing_right_level,
        panels,
        crown,
        min_post_length,
        rib_system,
        bracing,
        approach_piers_left,
        approach_piers_right,
        groups,
        form,
        // the traffic travels in the traffic section (design format 3)
        traffic: _,
        // the other actions travel in the actions section (design format 4)
        actions: _,
        // the sizing travels in the sizing section (design format 5)
        sizing: _,
    } = d;
    // the abutment height travels in the abutment section (design format 2)
    let Deck { level, left_seat_x, right_seat_x, width, ribs, dead_load, surfacing, abutment_height: _ } =
        *deck;
    let MemberGroups { rib, deck: deck_group, posts, piers, bracing: bracing_group } = groups;
    // the form basis travels in the form basis section (design format 6)
    let FormSettings { tolerance, max_iterations, basis: _ } = *form;
    Wire {
        design_version: *version,
        name: name.clone(),
        valley: valley.iter().map(|p| (p.x, p.y)).collect(),
        deck: WireDeck { level, left_seat_x, right_seat_x, width, ribs: wide(ribs), dead_load, surfacing },
        springing_left_level: *springing_left_level,
        springing_right_level: *springing_right_level,
        panels: wide(*panels),
        crown: match *crown {
            Crown::Rise { rise } => WireCrown::Rise(rise),
            Crown::Level { level } => WireCrown::Level(level),
        },
        min_post_length: *min_post_length,
        rib_system: match rib_system {
            RibSystem::ThreeHinged => WireRibSystem::ThreeHinged,
            RibSystem::TwoHinged => WireRibSystem::TwoHinged,
            RibSystem::Fixed => WireRibSystem::Fixed,
        },
        bracing: match *bracing {
            Bracing::None => WireBracing::None,
            Bracing::Single { flipped } => WireBracing::Single { flipped },
            Bracing::Crossed => WireBracing::Crossed,
        },
        approach_piers_left: wide(*approach_piers_left),
        approach_piers_right: wide(*approach_piers_right),
        groups: [section(rib), section(deck_group), section(posts), section(piers), section(bracing_group)],
        form_tolerance: tolerance,
        form_max_iterations: wide(max_iterations),
    }
}

/// The design of a core. Fields outside the core take the value a design of format 1
/// had (the abutment height `DEFAULT_ABUTMENT_HEIGHT`, the traffic
/// `TrafficDesign::for_deck_width` of the deck width); sections read later overwrite
/// them. The version is the core's, unchanged: the caller checks and updates it.
pub(super) fn into_design(w: Wire) -> Result<Design, LinkError> {
    let [rib, deck_group, posts, piers, bracing_group] = &w.groups;
    let groups = MemberGroups {
        rib: back(rib),
        deck: back(deck_group),
        posts: back(posts),
        piers: back(piers),
        bracing: back(bracing_group),
    };
    Ok(Design {
        version: w.design_version,
        name: w.name,
        valley: w.valley.iter().map(|&(x, y)| GroundPoint { x, y }).collect(),
        deck: Deck {
            level: w.deck.level,
            left_seat_x: w.deck.left_seat_x,
            right_seat_x: w.deck.right_seat_x,
            width: w.deck.width,
            ribs: narrow(w.deck.ribs, "number of ribs")?,
            dead_load: w.deck.dead_load,
            surfacing: w.deck.surfacing,
            abutment_height: DEFAULT_ABUTMENT_HEIGHT,
        },
        springing_left_level: w.springing_left_level,
        springing_right_level: w.springing_right_level,
        panels: narrow(w.panels, "number of panels")?,
        crown: match w.crown {
            WireCrown::Rise(rise) => Crown::Rise { rise },
            WireCrown::Level(level) => Crown::Level { level },
        },
        min_post_length: w.min_post_length,
        rib_system: match w.rib_system {
            WireRibSystem::ThreeHinged => RibSystem::ThreeHinged,
            WireRibSystem::TwoHinged => RibSystem::TwoHinged,
            WireRibSystem::Fixed => RibSystem::Fixed,
        },
        bracing: match w.bracing {
            WireBracing::None => Bracing::None,
            WireBracing::Single { flipped } => Bracing::Single { flipped },
            WireBracing::Crossed => Bracing::Crossed,
        },
        approach_piers_left: narrow(w.approach_piers_left, "number of left approach piers")?,
        approach_piers_right: narrow(w.approach_piers_right, "number of right approach piers")?,
        sizing: SizingDesign::as_typed(&groups),
        groups,
        form: FormSettings {
            tolerance: w.form_tolerance,
            max_iterations: narrow(w.form_max_iterations, "form-finding iteration limit")?,
            basis: Basis::PanelLoads,
        },
        traffic: TrafficDesign::for_deck_width(w.deck.width),
        actions: ActionsDesign::preset(ModelFamily::EnLm1),
    })
}
