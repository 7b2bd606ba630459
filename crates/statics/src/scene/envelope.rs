//! The traffic envelope on the elevation: every member of the frame model drawn as two
//! bands beside its axis, its largest tension on one side and its largest compression on
//! the other, from the engine's traffic report (`arch::traffic`), with the picked
//! member's governing placement as loads on the deck.
//!
//! Our own drawing: a member is a thin axis line with a dashed band (largest tension,
//! tension ink) offset above it (to its left when nearly vertical) and a solid band
//! (largest compression, compression ink) offset below (to its right); each band is
//! 1 px + 7 px x sqrt(|N| / largest |N| drawn) wide, none where that extreme is not of
//! its sign. Values are per rib line (the report's member lines), kN, tension positive,
//! either one combination's design values (permanent, traffic and the other actions, factored) or the
//! characteristic traffic alone: the title says which. The largest tension and the
//! largest compression anywhere are labelled, and the picked member with both its
//! extremes.
//!
//! The governing placement (`arch::traffic::placement_case` of the picked line) is drawn
//! from its deck loads: a strip for each loaded stretch (a line above the deck with small
//! arrows) and a heavier arrow per axle. Concept-design values: local codes and a
//! licensed engineer govern.

use super::elevation::{elevation_with_overlay, ElevationOptions, KeyEntry, Overlay};
use super::place::{Placer, Request, Side};
use super::{Ink, Item, Pattern, Px, Scene, Shape, Stroke, Tag, TextSize, Transform, Viewport};
use crate::arch::analysis::Analysis;
use crate::arch::cases::{CaseSpec, DeckLoad};
use crate::arch::design::Design;
use crate::arch::generate::ModelKind;
use crate::arch::traffic::{LineEnvelope, TrafficReport};
use crate::units::{Quantity, Units};

/// Which values the envelope shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Basis {
    /// The characteristic traffic alone (no permanent part, no factors).
    #[default]
    Characteristic,
    /// The design values of the report's combination with this index (permanent +
    /// traffic, each factored: `arch::traffic::DesignRange`).
    Design(usize),
}

impl Basis {
    /// The basis in words for a title or a menu: "characteristic traffic alone", or the
    /// combination's name followed by "design (permanent, traffic, other actions)". A combination the
    /// report does not have reads as the characteristic traffic.
    pub fn words(self, report: &TrafficReport) -> String {
        match self {
            Basis::Design(k) => match report.combinations.get(k) {
                Some(c) => format!("{} design (permanent, traffic, other actions)", c.name),
                None => Basis::Characteristic.words(report),
            },
            Basis::Characteristic => "characteristic traffic alone".into(),
        }
    }
}

/// The largest and smallest value of `line` on `basis` (kN or kNm, the line's sign):
/// the characteristic traffic extremes, or the combination's design range; `None` for a
/// combination the line does not have.
pub fn range_of(line: &LineEnvelope, basis: Basis) -> Option<(f64, f64)> {
    match basis {
        Basis::Characteristic => Some((line.traffic_max.value, line.traffic_min.value)),
        Basis::Design(k) => line.design.get(k).map(|d| (d.max, d.min)),
    }
}

/// The member extremes of a report on `basis` for the frame model's members: for each
/// member, `Some((max, min))` of its axial force (kN per rib line, tension positive)
/// when the report has its line.
pub fn member_ranges(analysis: &Analysis, report: &TrafficReport, basis: Basis) -> Vec<Option<(f64, f64)>> {
    analysis
        .frame
        .model
        .members
        .iter()
        .map(|m| report.line(&m.name).and_then(|l| range_of(l, basis)))
        .collect()
}

/// What the envelope view shows besides the report.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct EnvelopeOptions {
    /// Display units.
    pub units: Units,
    /// The values shown.
    pub basis: Basis,
    /// The case whose springing forces the elevation shows (the governing placement's
    /// case where one is picked; index into `Analysis::load_cases`).
    pub case: usize,
    /// The frame member under the pointer (highlighted).
    pub highlight: Option<usize>,
    /// The frame member picked (highlighted, labelled with both extremes).
    pub picked: Option<usize>,
    /// A transform to keep (`None` fits the drawing).
    pub transform: Option<crate::scene::Transform>,
}

/// The elevation with the traffic envelope of `report` (the frame model's) and, when
/// given, the governing placement `placement` drawn on the deck: see the module doc.
/// Labels that found no room are left out.
pub fn envelope_elevation(
    analysis: &Analysis,
    design: &Design,
    report: &TrafficReport,
    placement: Option<&CaseSpec>,
    opts: &EnvelopeOptions,
    viewport: Viewport,
) -> Scene {
    let ranges = member_ranges(analysis, report, opts.basis);
    let units = opts.units;
    let ribs = design.deck.ribs;
    let per = if ribs == 1 { "the one rib".to_string() } else { format!("one rib line of {ribs}") };
    let mut keys = vec![
        KeyEntry {
            swatch: Some(Stroke::patterned(Ink::Tension, 3.0, Pattern::Dashed)),
            text: "largest tension (band above)".into(),
            ink: Ink::Text,
        },
        KeyEntry {
            swatch: Some(Stroke::solid(Ink::Compression, 3.0)),
            text: "largest compression (band below)".into(),
            ink: Ink::Text,
        },
        KeyEntry { swatch: None, text: format!("band width ∝ |N|, {per}"), ink: Ink::Secondary },
    ];
    if placement.is_some() {
        keys.push(KeyEntry {
            swatch: Some(Stroke::solid(Ink::Load, 2.0)),
            text: "traffic where it governs the picked member".into(),
            ink: Ink::Text,
        });
    }
    let title = format!("Traffic envelope of N, {}", opts.basis.words(report));
    let draw = |t: &Transform, items: &mut Vec<Item>, placer: &mut Placer| {
        bands(analysis, &ranges, t, opts, items);
        if let Some(spec) = placement {
            placement_loads(design, spec, t, units, items, placer);
        }
        extremes_labels(analysis, &ranges, t, opts, placer);
    };
    let overlay = Overlay { title, keys, draw: &draw };
    let elevation = ElevationOptions {
        units,
        case: opts.case,
        model: ModelKind::Frame,
        highlight: None,
        transform: opts.transform,
    };
    elevation_with_overlay(analysis, design, &elevation, viewport, Some(&overlay)).0
}

/// The unit normal of a member drawn from `a` to `b` (pixels) pointing up the screen, or
/// to the left for a nearly vertical member.
fn upward_normal(a: Px, b: Px) -> (f64, f64) {
    let (dx, dy) = (b.x - a.x, b.y - a.y);
    let len = dx.hypot(dy).max(1e-9);
    let (nx, ny) = (-dy / len, dx / len);
    let flip = if ny.abs() > 0.2 { ny > 0.0 } else { nx > 0.0 };
    if flip {
        (-nx, -ny)
    } else {
        (nx, ny)
    }
}

/// Width of a band for `value` when the largest magnitude drawn is `largest`, pixels.
pub fn band_width(value: f64, largest: f64) -> f64 {
    if largest <= 0.0 {
        return 0.0;
    }
    1.0 + 7.0 * (value.abs() / largest).min(1.0).sqrt()
}

fn bands(
    analysis: &Analysis,
    ranges: &[Option<(f64, f64)>],
    t: &Transform,
    opts: &EnvelopeOptions,
    items: &mut Vec<Item>,
) {
    let model = &analysis.frame.model;
    let largest = ranges.iter().flatten().flat_map(|(max, min)| [max.abs(), min.abs()]).fold(0.0, f64::max);
    let ends = |k: usize| {
        let (na, nb) = model.members.get(k).and_then(|m| model.ends(m))?;
        Some((t.px(na.x, na.y), t.px(nb.x, nb.y)))
    };
    for (k, range) in ranges.iter().enumerate() {
        let Some((a, b)) = ends(k) else { continue };
        let tag = Tag::Member { member: k };
        items.push(
            Item::stroked(Shape::Line { from: a, to: b }, Stroke::solid(Ink::Secondary, 1.0)).tagged(tag),
        );
        let Some((max, min)) = *range else { continue };
        let (nx, ny) = upward_normal(a, b);
        for (value, side, stroke) in [
            (max.max(0.0), 1.0, Stroke::patterned(Ink::Tension, 0.0, Pattern::Dashed)),
            (min.min(0.0), -1.0, Stroke::solid(Ink::Compression, 0.0)),
        ] {
            let w = if value == 0.0 { 0.0 } else { band_width(value, largest) };
            if w <= 0.0 {
                continue;
            }
            let off = side * (1.5 + w / 2.0);
            let shift = |p: Px| Px::new(p.x + off * nx, p.y + off * ny);
            items.push(
                Item::stroked(Shape::Line { from: shift(a), to: shift(b) }, Stroke { width: w, ..stroke })
                    .tagged(tag),
            );
        }
    }
    for (k, ink, width) in [(opts.highlight, Ink::HighlightHalo, 13.0), (opts.picked, Ink::Highlight, 2.5)]
        .into_iter()
        .filter_map(|(k, ink, w)| Some((k.filter(|k| *k < ranges.len())?, ink, w)))
    {
        let Some((a, b)) = ends(k) else { continue };
        items.push(
            Item::stroked(Shape::Line { from: a, to: b }, Stroke::solid(ink, width))
                .tagged(Tag::Member { member: k }),
        );
    }
}

/// The member with the largest (`tension`) or most negative N among `ranges`, and that
/// value; `None` when no member reaches that sign.
pub fn extreme_member(ranges: &[Option<(f64, f64)>], tension: bool) -> Option<(usize, f64)> {
    let value = |r: &(f64, f64)| if tension { r.0 } else { -r.1 };
    ranges
        .iter()
        .enumerate()
        .filter_map(|(k, r)| r.as_ref().map(|r| (k, value(r))))
        .filter(|(_, v)| *v > 0.0)
        .max_by(|a, b| a.1.total_cmp(&b.1))
        .map(|(k, v)| (k, if tension { v } else { -v }))
}

fn extremes_labels(
    analysis: &Analysis,
    ranges: &[Option<(f64, f64)>],
    t: &Transform,
    opts: &EnvelopeOptions,
    placer: &mut Placer,
) {
    let model = &analysis.frame.model;
    let mid = |k: usize| {
        let (na, nb) = model.members.get(k).and_then(|m| model.ends(m))?;
        Some(t.px(0.5 * (na.x + nb.x), 0.5 * (na.y + nb.y)))
    };
    let show = |v: f64| opts.units.show(Quantity::Force, v);
    if let Some(k) = opts.picked {
        if let (Some((max, min)), Some(at)) = (ranges.get(k).copied().flatten(), mid(k)) {
            let name = model.member_label(k);
            placer.place(
                Request::new(
                    format!("{name}: N from {} to {}", show(min), show(max)),
                    TextSize::Body,
                    Ink::Highlight,
                    at,
                )
                .sides(&[Side::Below, Side::BelowRight, Side::BelowLeft, Side::Above])
                .short(format!("{} to {}", show(min), show(max))),
            );
        }
    }
    for (tension, words) in [(false, "largest compression"), (true, "largest tension")] {
        if let Some(((k, v), at)) = extreme_member(ranges, tension).and_then(|(k, v)| Some(((k, v), mid(k)?)))
        {
            let ink = if tension { Ink::Tension } else { Ink::Compression };
            placer.place(
                Request::new(
                    format!("{words} {} ({})", show(v), model.member_label(k)),
                    TextSize::Small,
                    ink,
                    at,
                )
                .short(show(v)),
            );
        }
    }
}

/// The deck loads of a placement case drawn on the deck: strips and axles.
fn placement_loads(
    design: &Design,
    spec: &CaseSpec,
    t: &Transform,
    units: Units,
    items: &mut Vec<Item>,
    placer: &mut Placer,
) {
    let deck = design.deck.level;
    let load = |w: f64| Stroke::solid(Ink::Load, w);
    let lift = 16.0;
    let mut axle_total = 0.0;
    let mut axle_at = None;
    let mut strip = None;
    for l in &spec.loads {
        match *l {
            DeckLoad::Strip { w, x0, x1 } => {
                let (a, b) = (t.px(x0, deck), t.px(x1, deck));
                items.push(Item::stroked(
                    Shape::Line { from: Px::new(a.x, a.y - lift), to: Px::new(b.x, b.y - lift) },
                    load(1.5),
                ));
                // small arrows about every 14 px, one at each end at least
                let n = ((b.x - a.x) / 14.0).floor().max(1.0) as usize;
                for i in 0..=n {
                    let x = a.x + (b.x - a.x) * i as f64 / n as f64;
                    items.push(Item::stroked(
                        Shape::Arrow {
                            tail: Px::new(x, a.y - lift),
                            head: Px::new(x, a.y - 3.0),
                            head_size: 4.0,
                        },
                        load(1.0),
                    ));
                }
                placer.reserve(super::Rect::new(a.x, a.y - lift - 2.0, b.x - a.x, lift));
                strip.get_or_insert((w, Px::new(0.5 * (a.x + b.x), a.y - lift)));
            }
            DeckLoad::Point { x, p } => {
                let at = t.px(x, deck);
                items.push(Item::stroked(
                    Shape::Arrow {
                        tail: Px::new(at.x, at.y - 34.0),
                        head: Px::new(at.x, at.y - 2.0),
                        head_size: 7.0,
                    },
                    load(2.4),
                ));
                axle_total += p;
                axle_at.get_or_insert(Px::new(at.x, at.y - 34.0));
            }
            DeckLoad::PanelPoint { .. } => {}
        }
    }
    if let Some((w, at)) = strip {
        placer.place(
            Request::new(
                format!("q = {}", units.show(Quantity::LineLoad, w)),
                TextSize::Small,
                Ink::Load,
                at,
            )
            .sides(&[Side::Above, Side::AboveRight, Side::AboveLeft]),
        );
    }
    if let Some(at) = axle_at {
        placer.place(
            Request::new(
                format!("axles {} in all", units.show(Quantity::Force, axle_total)),
                TextSize::Small,
                Ink::Load,
                at,
            )
            .sides(&[Side::AboveRight, Side::AboveLeft, Side::Above]),
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::analysis::{analyze, analyze_with};
    use crate::arch::traffic::{placement_case, traffic_envelopes};
    use crate::arch::validate::ValidDesign;

    fn demo() -> (Design, ValidDesign, Analysis, TrafficReport) {
        let d = Design::demo();
        let valid = ValidDesign::new(&d).expect("valid");
        let a = analyze(&d).expect("demo");
        let r = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("frame");
        (d, valid, a, r)
    }

    /// The ranges are the report's own numbers: the characteristic traffic extremes, or a
    /// combination's design range, by member name.
    #[test]
    fn member_ranges_are_the_reports_lines() {
        let (_, _, a, r) = demo();
        let k = a.frame.map.rib_members[3];
        let line = r.line(&a.frame.model.members[k].name).expect("a rib line");
        let ch = member_ranges(&a, &r, Basis::Characteristic);
        assert_eq!(ch[k], Some((line.traffic_max.value, line.traffic_min.value)));
        let uls = member_ranges(&a, &r, Basis::Design(0));
        assert_eq!(uls[k], Some((line.design[0].max, line.design[0].min)));
        // a rib segment is in compression under its design extremes (dead load governs)
        assert!(line.design[0].max < 0.0, "{:?}", line.design[0]);
        assert_eq!(member_ranges(&a, &r, Basis::Design(99))[k], None);
        assert!(Basis::Design(0).words(&r).starts_with("ULS gr1a design"), "{}", Basis::Design(0).words(&r));
    }

    /// The largest compression labelled is the most negative design minimum of any member,
    /// shown in the chosen units; every member is drawn and tagged for picking.
    #[test]
    fn the_largest_compression_is_labelled_with_the_reports_value() {
        let (d, _, a, r) = demo();
        let opts = EnvelopeOptions { basis: Basis::Design(0), ..Default::default() };
        let s = envelope_elevation(&a, &d, &r, None, &opts, Viewport::new(1000.0, 520.0));
        let ranges = member_ranges(&a, &r, Basis::Design(0));
        let lowest = a
            .frame
            .model
            .members
            .iter()
            .filter_map(|m| r.line(&m.name))
            .map(|l| l.design[0].min)
            .fold(f64::INFINITY, f64::min);
        let (k, v) = extreme_member(&ranges, false).expect("compression somewhere");
        assert_eq!(v, lowest);
        let text = format!(
            "largest compression {} ({})",
            Units::Si.show(Quantity::Force, lowest),
            a.frame.model.members[k].name
        );
        assert!(
            s.labels.iter().any(|l| l.text == text),
            "{text} in {:?}",
            s.labels.iter().map(|l| &l.text).collect::<Vec<_>>()
        );
        let title = s.labels.iter().find(|l| l.text.starts_with("Elevation")).expect("title");
        assert!(title.text.contains("ULS gr1a design"), "{}", title.text);
        for k in 0..a.frame.model.members.len() {
            assert!(s.items.iter().any(|i| i.tag == Tag::Member { member: k }), "member {k} drawn");
        }
    }

    /// A wider band for a larger force; none for an extreme of the other sign.
    #[test]
    fn bands_grow_with_the_force() {
        assert_eq!(band_width(0.0, 100.0), 1.0);
        assert_eq!(band_width(100.0, 100.0), 8.0);
        assert!((band_width(25.0, 100.0) - 4.5).abs() < 1e-12);
        assert_eq!(band_width(5.0, 0.0), 0.0);
        assert_eq!(extreme_member(&[Some((-1.0, -5.0)), None], true), None);
        assert_eq!(extreme_member(&[Some((-1.0, -5.0)), Some((2.0, -3.0))], false), Some((0, -5.0)));
    }

    /// With a picked member, its placement is drawn: one heavy arrow per axle the case
    /// carries, and a strip per loaded stretch; the picked member is labelled with its
    /// range.
    #[test]
    fn the_picked_members_placement_is_drawn_on_the_deck() {
        let (d, valid, _, r) = demo();
        let g = crate::arch::generate::frame_model(&valid);
        let k = g.map.rib_members[2];
        let line = r.line(&g.model.members[k].name).expect("line").clone();
        let spec = placement_case(&valid, &line, false);
        let a = analyze_with(&valid, std::slice::from_ref(&spec)).expect("analyses");
        let axles = spec.loads.iter().filter(|l| matches!(l, DeckLoad::Point { .. })).count();
        let strips = spec.loads.iter().filter(|l| matches!(l, DeckLoad::Strip { .. })).count();
        assert!(axles > 0 && strips > 0, "{:?}", spec.loads);
        let opts = EnvelopeOptions { picked: Some(k), case: a.load_cases.len() - 1, ..Default::default() };
        let s = envelope_elevation(&a, &d, &r, Some(&spec), &opts, Viewport::new(1000.0, 520.0));
        let heavy = s
            .items
            .iter()
            .filter(|i| {
                matches!(i.shape, Shape::Arrow { .. })
                    && i.stroke.is_some_and(|s| s.ink == Ink::Load && s.width > 2.0)
            })
            .count();
        assert_eq!(heavy, axles);
        let label = format!(
            "{}: N from {} to {}",
            line.line,
            Units::Si.show(Quantity::Force, line.traffic_min.value),
            Units::Si.show(Quantity::Force, line.traffic_max.value)
        );
        assert!(s.labels.iter().any(|l| l.text == label || l.detail.as_deref() == Some(&label)), "{label}");
        assert!(s.labels.iter().any(|l| l.text.starts_with("traffic where it governs")));
    }
}
