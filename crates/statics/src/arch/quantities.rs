//! Material quantities and a cost index of a sized deck arch.
//!
//! Per member group: the members' length over every rib line (the frame model's member
//! lengths times the rib count), the section's area (the sized section, or the typed one),
//! volume and mass (unit weight / g). The deck's slab (thickness over the deck width,
//! seat to seat) and cross-girders (one every spacing, each the deck width long), and the
//! thrust blocks (`arch::foundation`). Totals: steel tonnage, concrete and glulam volume,
//! and a cost index from the design's unit rates (cost units of the user's choosing).
//!
//! Units: m, m2, m3, t (tonnes: kN / 9.81 m/s2). Concept-design values: local codes and a
//! licensed engineer govern.

use crate::arch::design::Section;
use crate::arch::foundation::Foundations;
use crate::arch::generate::frame_model;
use crate::arch::sizing::{group_of, typed_section, MemberSizingReport};
use crate::arch::validate::ValidDesign;
use crate::error::GroupName;
use crate::sizing::materials::Material;
use serde::{Deserialize, Serialize};

/// Standard gravity, m/s2 (kN to tonnes), ISO 80000-3.
pub const GRAVITY: f64 = 9.80665;

/// What a quantity is made of.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Stuff {
    /// Structural steel.
    Steel,
    /// Reinforced concrete.
    Concrete,
    /// Glued laminated timber.
    Glulam,
    /// Thrust-block concrete.
    Foundation,
}

impl Stuff {
    fn of(material: &Material) -> Stuff {
        match material {
            Material::Steel(_) => Stuff::Steel,
            Material::Concrete(_) => Stuff::Concrete,
            Material::Glulam(_) => Stuff::Glulam,
        }
    }
}

/// One line of the quantities.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct QuantityLine {
    /// What it is (`rib`, `deck`, `posts`, `piers`, `bracing`, `deck slab`, `cross-girders`,
    /// `thrust blocks`).
    pub item: String,
    /// Made of.
    pub stuff: Stuff,
    /// Total length over every rib line, m (0 where no length applies).
    pub length: f64,
    /// Area of one section, m2 (0 where no section applies).
    pub area: f64,
    /// Volume, m3.
    pub volume: f64,
    /// Mass, t.
    pub mass: f64,
    /// Its part of the cost index.
    pub cost: f64,
}

/// The quantities of a design.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Quantities {
    /// Per item.
    pub lines: Vec<QuantityLine>,
    /// Structural steel, t.
    pub steel: f64,
    /// Concrete of the structure (ribs, deck, slab), m3.
    pub concrete: f64,
    /// Glulam, m3.
    pub glulam: f64,
    /// Thrust-block concrete, m3.
    pub foundation: f64,
    /// The cost index: the sum of quantity times unit rate.
    pub cost_index: f64,
    /// Which deck weight the analysis counts, and how the cross-section compares.
    pub deck_weight: String,
    /// The rules, in words.
    pub basis: String,
}

/// The quantities of `valid` with the sections of `sizing` (sized groups take their
/// sized section; groups as typed or not sized their typed one) and the thrust blocks of
/// `foundations`.
pub fn quantities(valid: &ValidDesign, sizing: &MemberSizingReport, foundations: &Foundations) -> Quantities {
    let design = valid.design();
    let inputs = &design.sizing;
    let rates = &inputs.rates;
    let ribs = design.deck.ribs as f64;
    let generated = frame_model(valid);
    let model = &generated.model;
    let rate = |stuff: Stuff, volume: f64, mass: f64| match stuff {
        Stuff::Steel => rates.steel_per_t * mass,
        Stuff::Concrete => rates.concrete_per_m3 * volume,
        Stuff::Glulam => rates.glulam_per_m3 * volume,
        Stuff::Foundation => rates.foundation_per_m3 * volume,
    };
    let mut lines = Vec::new();
    for g in GroupName::ALL {
        let length: f64 = generated
            .map
            .roles
            .iter()
            .enumerate()
            .filter(|(_, r)| group_of(**r) == g)
            .map(|(k, _)| model.member_length(k))
            .sum::<f64>()
            * ribs;
        let report = sizing.groups.iter().find(|r| r.group == g.key());
        let section: Section =
            report.and_then(|r| r.section).unwrap_or_else(|| typed_section(&design.groups, g));
        let material = &inputs.group(g).material;
        let stuff = Stuff::of(material);
        let volume = section.a * length;
        let mass = section.unit_weight * volume / GRAVITY;
        lines.push(QuantityLine {
            item: g.key().into(),
            stuff,
            length,
            area: section.a,
            volume,
            mass,
            cost: rate(stuff, volume, mass),
        });
    }
    let deck = &inputs.deck_section;
    let deck_length = design.deck.right_seat_x - design.deck.left_seat_x;
    let width = design.deck.width;
    let slab_volume = deck.slab_thickness * width * deck_length;
    let slab_mass = slab_volume * deck.slab_unit_weight / GRAVITY;
    lines.push(QuantityLine {
        item: "deck slab".into(),
        stuff: Stuff::Concrete,
        length: deck_length,
        area: deck.slab_thickness * width,
        volume: slab_volume,
        mass: slab_mass,
        cost: rate(Stuff::Concrete, slab_volume, slab_mass),
    });
    let count = (deck_length / deck.cross_girder_spacing).floor() + 1.0;
    let girder_volume = count * width * deck.cross_girder_area;
    let girder_mass = girder_volume * deck.cross_girder_unit_weight / GRAVITY;
    lines.push(QuantityLine {
        item: format!("cross-girders ({count:.0})"),
        stuff: Stuff::Steel,
        length: count * width,
        area: deck.cross_girder_area,
        volume: girder_volume,
        mass: girder_mass,
        cost: rate(Stuff::Steel, girder_volume, girder_mass),
    });
    let blocks: f64 = foundations.springings.iter().map(|s| s.block.volume).sum();
    // plain concrete of a thrust block, 24 kN/m3 (EN 1991-1-1 Table A.1, normal weight)
    let block_mass = blocks * 24.0 / GRAVITY;
    lines.push(QuantityLine {
        item: "thrust blocks".into(),
        stuff: Stuff::Foundation,
        length: 0.0,
        area: 0.0,
        volume: blocks,
        mass: block_mass,
        cost: rate(Stuff::Foundation, blocks, block_mass),
    });
    let total = |stuff: Stuff, mass: bool| {
        // + 0.0: an empty sum prints as 0, not -0
        lines.iter().filter(|l| l.stuff == stuff).map(|l| if mass { l.mass } else { l.volume }).sum::<f64>()
            + 0.0
    };
    let typed = design.deck.dead_load;
    let structure = deck.structure_weight();
    let deck_weight = match deck.weight {
        crate::arch::sizing::DeckWeight::TypedLoad => format!(
            "The analysis counts the typed deck dead load, {typed:.2} kN/m2; the slab and cross-girders weigh \
             {structure:.2} kN/m2 and count in these quantities only."
        ),
        crate::arch::sizing::DeckWeight::CrossSection => format!(
            "The analysis counts the cross-section: slab and cross-girders {structure:.2} kN/m2 plus {:.2} kN/m2 \
             other dead load, instead of the typed {typed:.2} kN/m2.",
            deck.other_dead_load
        ),
    };
    Quantities {
        steel: total(Stuff::Steel, true),
        concrete: total(Stuff::Concrete, false),
        glulam: total(Stuff::Glulam, false),
        foundation: total(Stuff::Foundation, false),
        cost_index: lines.iter().map(|l| l.cost).sum(),
        lines,
        deck_weight,
        basis: "Group lengths from the frame model over every rib line; sized groups with their sized section, \
                others with the typed one; masses from the unit weights over g; deck slab and cross-girders seat \
                to seat; thrust blocks of plain concrete (24 kN/m3). The cost index is the sum of quantity times \
                the design's unit rates."
            .into(),
    }
}
