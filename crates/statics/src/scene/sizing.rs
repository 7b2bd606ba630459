//! The sizing view on the elevation: every member of the frame model stroked by its
//! utilisation at its group's section (the engine's size report, `arch::sizing`), one
//! label per group naming its section and largest utilisation, and each springing's
//! thrust block drawn to scale (`arch::foundation`).
//!
//! Our own drawing. The utilisation scale has five bands (under 0.5, 0.5 to 0.7, 0.7 to
//! 0.9, 0.9 to 1.0, over 1.0), each with an ink of its own ([`Ink::UseLight`] to
//! [`Ink::UseOver`]) and a line width growing band by band, so the order reads without
//! colour. A group kept as typed is drawn dashed in its band's ink (it is checked, not
//! sized); a group that could not be sized is dotted grey ([`Ink::Unsized`]).
//!
//! A thrust block is a rectangle at its springing: its face of length `block.length`
//! (in the arch plane) is normal to the characteristic resultant, at the angle
//! `block.face_angle` below the horizontal, and the block runs `block.thickness` along
//! the resultant from the springing into the ground, both at the drawing's scale. Its
//! label gives the resultant, its angle and the block's length and thickness. Concept-design values: local codes and a
//! licensed engineer govern.

use super::elevation::{elevation_with_overlay, ElevationOptions, KeyEntry, Overlay};
use super::place::{Placer, Request, Side};
use super::{Ink, Item, Pattern, Px, Scene, Shape, Stroke, Tag, TextSize, Transform, Viewport};
use crate::arch::analysis::Analysis;
use crate::arch::design::Design;
use crate::arch::foundation::SpringingDemand;
use crate::arch::generate::ModelKind;
use crate::arch::sizing::{GroupOutcome, GroupReport, SizeReport};
use crate::units::{Quantity, Units};
use std::collections::HashMap;

/// A band of the utilisation scale.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum UseBand {
    /// Under 0.5.
    Light,
    /// 0.5 to under 0.7.
    Moderate,
    /// 0.7 to under 0.9.
    High,
    /// 0.9 to 1.0 (1.0 passes).
    Full,
    /// Over 1.0: fails.
    Over,
}

impl UseBand {
    /// Every band, lightest use first.
    pub const ALL: [UseBand; 5] =
        [UseBand::Light, UseBand::Moderate, UseBand::High, UseBand::Full, UseBand::Over];

    /// The band of utilisation `u` (demand over resistance): lower bounds inclusive, 1.0
    /// itself still passes; a value that is not finite counts as failing.
    pub fn of(u: f64) -> UseBand {
        if !u.is_finite() || u > 1.0 {
            UseBand::Over
        } else if u >= 0.9 {
            UseBand::Full
        } else if u >= 0.7 {
            UseBand::High
        } else if u >= 0.5 {
            UseBand::Moderate
        } else {
            UseBand::Light
        }
    }

    /// The band's ink.
    pub const fn ink(self) -> Ink {
        match self {
            UseBand::Light => Ink::UseLight,
            UseBand::Moderate => Ink::UseModerate,
            UseBand::High => Ink::UseHigh,
            UseBand::Full => Ink::UseFull,
            UseBand::Over => Ink::UseOver,
        }
    }

    /// The band's line width, CSS pixels (wider for a higher band).
    pub const fn width(self) -> f64 {
        match self {
            UseBand::Light => 2.0,
            UseBand::Moderate => 2.75,
            UseBand::High => 3.5,
            UseBand::Full => 4.25,
            UseBand::Over => 5.5,
        }
    }

    /// The band in words, for the key.
    pub const fn words(self) -> &'static str {
        match self {
            UseBand::Light => "used < 0.5",
            UseBand::Moderate => "0.5–0.7",
            UseBand::High => "0.7–0.9",
            UseBand::Full => "0.9–1.0",
            UseBand::Over => "> 1.0 fails",
        }
    }
}

/// Width of a member of a group that could not be sized, CSS pixels.
const UNSIZED_WIDTH: f64 = 2.0;

/// How member `utilisation` of a group kept `as_typed` (or not) is stroked: its band's
/// ink and width, dashed when as typed; dotted grey without a utilisation.
pub fn member_stroke(utilisation: Option<f64>, as_typed: bool) -> Stroke {
    match utilisation {
        Some(u) => {
            let band = UseBand::of(u);
            let pattern = if as_typed { Pattern::Dashed } else { Pattern::Solid };
            Stroke::patterned(band.ink(), band.width(), pattern)
        }
        None => Stroke::patterned(Ink::Unsized, UNSIZED_WIDTH, Pattern::Dotted),
    }
}

/// What the sizing view shows besides the report.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct SizingOptions {
    /// Display units.
    pub units: Units,
    /// The case whose springing forces the elevation shows (index into
    /// `Analysis::load_cases`).
    pub case: usize,
    /// The frame member under the pointer (highlighted).
    pub highlight: Option<usize>,
    /// A transform to keep (`None` fits the drawing).
    pub transform: Option<Transform>,
}

/// The four corners of a thrust block in world coordinates (m, y up), in order around
/// it: the face at the springing `(x, y)` first (its two ends), then the bearing face
/// `thickness` further along the resultant. The resultant points into the ground at
/// `face_angle` degrees below the horizontal, outward (to the left for the `left`
/// springing, else to the right); each face is `length` long, centred on the resultant's
/// line through the springing.
pub fn block_corners(
    springing: (f64, f64),
    left: bool,
    face_angle: f64,
    length: f64,
    thickness: f64,
) -> [(f64, f64); 4] {
    let a = face_angle.to_radians();
    let outward = if left { -1.0 } else { 1.0 };
    let d = (outward * a.cos(), -a.sin());
    // along the face: the resultant turned a quarter turn
    let n = (-d.1, d.0);
    let (x, y) = springing;
    let h = 0.5 * length;
    let at = |s: f64, t: f64| (x + s * n.0 + t * d.0, y + s * n.1 + t * d.1);
    [at(h, 0.0), at(-h, 0.0), at(-h, thickness), at(h, thickness)]
}

/// The elevation with the member utilisations, group labels and thrust blocks of
/// `report` (the engine's size report of the design on screen): see the module doc.
/// Members of the frame model are matched to the report's by name. Labels that found
/// no room are left out.
pub fn sizing_elevation(
    analysis: &Analysis,
    design: &Design,
    report: &SizeReport,
    opts: &SizingOptions,
    viewport: Viewport,
) -> Scene {
    let mut keys: Vec<KeyEntry> = UseBand::ALL
        .iter()
        .map(|b| KeyEntry {
            swatch: Some(Stroke::solid(b.ink(), b.width().min(4.0))),
            text: b.words().into(),
            ink: Ink::Text,
        })
        .collect();
    keys.push(KeyEntry {
        swatch: Some(Stroke::patterned(Ink::UseLight, 2.0, Pattern::Dashed)),
        text: "dashed: as typed, checked".into(),
        ink: Ink::Text,
    });
    keys.push(KeyEntry {
        swatch: Some(Stroke::patterned(Ink::Unsized, UNSIZED_WIDTH, Pattern::Dotted)),
        text: "not sized".into(),
        ink: Ink::Text,
    });
    keys.push(KeyEntry {
        swatch: Some(Stroke::solid(Ink::Ground, 4.0)),
        text: "thrust block to scale".into(),
        ink: Ink::Text,
    });
    let title = "Sizes and utilisation per rib line, ultimate combinations".to_string();
    let draw = |t: &Transform, items: &mut Vec<Item>, placer: &mut Placer| {
        blocks(analysis, report, t, opts.units, items, placer);
        members(analysis, report, t, opts.highlight, items);
        group_labels(analysis, report, t, placer);
    };
    let overlay = Overlay { title, keys, draw: &draw };
    let elevation = ElevationOptions {
        units: opts.units,
        case: opts.case,
        model: ModelKind::Frame,
        highlight: None,
        transform: opts.transform,
    };
    elevation_with_overlay(analysis, design, &elevation, viewport, Some(&overlay)).0
}

/// The report's group of each frame member (by name), with the member's utilisation.
fn member_rows<'a>(
    analysis: &Analysis,
    report: &'a SizeReport,
) -> Vec<Option<(&'a GroupReport, Option<f64>)>> {
    let groups: HashMap<&str, &GroupReport> =
        report.sizing.groups.iter().map(|g| (g.group.as_str(), g)).collect();
    let by_name: HashMap<&str, _> = report.sizing.members.iter().map(|m| (m.member.as_str(), m)).collect();
    let model = &analysis.frame.model;
    (0..model.members.len())
        .map(|k| {
            let m = by_name.get(model.member_label(k).as_str())?;
            Some((*groups.get(m.group.as_str())?, m.utilisation))
        })
        .collect()
}

fn members(
    analysis: &Analysis,
    report: &SizeReport,
    t: &Transform,
    highlight: Option<usize>,
    items: &mut Vec<Item>,
) {
    let model = &analysis.frame.model;
    let ends = |k: usize| {
        let (a, b) = model.members.get(k).and_then(|m| model.ends(m))?;
        Some((t.px(a.x, a.y), t.px(b.x, b.y)))
    };
    if let Some((k, (a, b))) = highlight.and_then(|k| Some((k, ends(k)?))) {
        items.push(
            Item::stroked(Shape::Line { from: a, to: b }, Stroke::solid(Ink::HighlightHalo, 13.0))
                .tagged(Tag::Member { member: k }),
        );
    }
    for (k, row) in member_rows(analysis, report).into_iter().enumerate() {
        let Some((a, b)) = ends(k) else { continue };
        let stroke = match row {
            Some((g, u)) => member_stroke(u, g.outcome == GroupOutcome::AsTyped),
            // a member the report does not know: a thin line, nothing claimed
            None => Stroke::solid(Ink::Secondary, 1.0),
        };
        items.push(Item::stroked(Shape::Line { from: a, to: b }, stroke).tagged(Tag::Member { member: k }));
    }
}

/// A group's label: its name, section (or "as typed", "not sized") and largest
/// utilisation to two decimals; and a short form.
pub fn group_words(g: &GroupReport) -> (String, String) {
    let used = g.utilisation.map(|u| format!(", {u:.2}")).unwrap_or_default();
    let section = match &g.outcome {
        GroupOutcome::Sized { label, .. } => label.clone(),
        GroupOutcome::AsTyped => "as typed".into(),
        GroupOutcome::NotSized { .. } => "not sized".into(),
        GroupOutcome::NoMembers => "no members".into(),
    };
    let short = match g.utilisation {
        Some(u) => format!("{} {u:.2}", g.group),
        None => format!("{} not sized", g.group),
    };
    (format!("{}: {section}{used}", g.group), short)
}

fn group_labels(analysis: &Analysis, report: &SizeReport, t: &Transform, placer: &mut Placer) {
    let model = &analysis.frame.model;
    let rows = member_rows(analysis, report);
    let mid = |k: usize| {
        let (a, b) = model.members.get(k).and_then(|m| model.ends(m))?;
        Some(t.px(0.5 * (a.x + b.x), 0.5 * (a.y + b.y)))
    };
    for g in &report.sizing.groups {
        // at the governing member, else at the group's first member
        let at = (0..model.members.len())
            .find(|&k| g.governing_member.as_deref() == Some(model.member_label(k).as_str()))
            .or_else(|| rows.iter().position(|r| r.is_some_and(|(rg, _)| rg.group == g.group)));
        let Some(label_at) = at.and_then(mid) else { continue };
        let (text, short) = group_words(g);
        let ink = match g.utilisation {
            Some(u) if UseBand::of(u) == UseBand::Over => Ink::UseOver,
            _ => Ink::Text,
        };
        let mut req = Request::new(text, TextSize::Small, ink, label_at).short(short);
        if let GroupOutcome::NotSized { reason } = &g.outcome {
            req = req.detail(reason.clone());
        }
        placer.place(req);
    }
}

/// The resultant's words on a springing's block: "R 17 023 kN at 41.65°" in `units`
/// (the label adds the block's length and thickness).
pub fn resultant_words(s: &SpringingDemand, units: Units) -> String {
    format!("R {} at {}", units.show(Quantity::Force, s.resultant), units.show(Quantity::Angle, s.angle))
}

fn blocks(
    analysis: &Analysis,
    report: &SizeReport,
    t: &Transform,
    units: Units,
    items: &mut Vec<Item>,
    placer: &mut Placer,
) {
    let f = &analysis.form;
    for s in &report.foundations.springings {
        let left = s.side == "left";
        let sp = if left { f.springing_left } else { f.springing_right };
        let b = &s.block;
        if !(b.length.is_finite() && b.thickness.is_finite() && b.face_angle.is_finite()) {
            continue;
        }
        let corners = block_corners((sp.x, sp.y), left, b.face_angle, b.length, b.thickness);
        let points: Vec<Px> = corners.iter().map(|&(x, y)| t.px(x, y)).collect();
        // dark on the elevation's light abutment, so a small block still shows
        items.push(Item {
            shape: Shape::Path { points: points.clone(), closed: true },
            stroke: Some(Stroke::solid(Ink::Text, 1.0)),
            fill: Some(Ink::Ground),
            tag: Tag::None,
        });
        let centre = Px::new(
            points.iter().map(|p| p.x).sum::<f64>() / 4.0,
            points.iter().map(|p| p.y).sum::<f64>() / 4.0,
        );
        let sides: &[Side] = if left {
            &[Side::BelowRight, Side::Right, Side::Below, Side::BelowLeft]
        } else {
            &[Side::BelowLeft, Side::Left, Side::Below, Side::BelowRight]
        };
        let words = resultant_words(s, units);
        // the block's size in words too: at the scale of a whole valley it is small
        let sized = format!(
            "{words}, block {} × {}",
            units.show(Quantity::Length, b.length),
            units.show(Quantity::Length, b.thickness)
        );
        let detail = format!(
            "{words}; block {} x {} x {} (across, in the arch plane, along R)",
            units.show(Quantity::Length, b.width),
            units.show(Quantity::Length, b.length),
            units.show(Quantity::Length, b.thickness)
        );
        placer.place(
            Request::new(sized, TextSize::Small, Ink::Text, centre).sides(sides).short(words).detail(detail),
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::analysis::analyze;
    use crate::arch::sizing::{size_design, GroupSizing};
    use crate::arch::traffic::traffic_envelopes;
    use crate::arch::validate::ValidDesign;

    fn demo() -> (Design, Analysis, SizeReport) {
        sized(Design::demo())
    }

    fn sized(d: Design) -> (Design, Analysis, SizeReport) {
        let valid = ValidDesign::new(&d).expect("valid");
        let a = analyze(&d).expect("demo");
        let traffic = traffic_envelopes(&valid, ModelKind::Frame).expect("solves").expect("frame");
        let r = size_design(&valid, &traffic).expect("sizes");
        (d, a, r)
    }

    fn scene(d: &Design, a: &Analysis, r: &SizeReport) -> Scene {
        sizing_elevation(a, d, r, &SizingOptions::default(), Viewport::new(1100.0, 560.0))
    }

    /// The bands' bounds: lower bounds inclusive, 1.0 passes, anything above fails.
    #[test]
    fn bands_follow_the_scale() {
        assert_eq!(UseBand::of(0.0), UseBand::Light);
        assert_eq!(UseBand::of(0.4999), UseBand::Light);
        assert_eq!(UseBand::of(0.5), UseBand::Moderate);
        assert_eq!(UseBand::of(0.7), UseBand::High);
        assert_eq!(UseBand::of(0.9), UseBand::Full);
        assert_eq!(UseBand::of(1.0), UseBand::Full);
        assert_eq!(UseBand::of(1.0001), UseBand::Over);
        assert_eq!(UseBand::of(f64::NAN), UseBand::Over);
        // widths grow band by band; inks differ
        for w in UseBand::ALL.windows(2) {
            assert!(w[1].width() > w[0].width(), "{w:?}");
            assert_ne!(w[1].ink(), w[0].ink());
        }
        assert_eq!(member_stroke(None, false).ink, Ink::Unsized);
        assert_eq!(member_stroke(Some(0.8), true).pattern, Pattern::Dashed);
    }

    /// Every frame member is stroked in the ink and width of its own utilisation in the
    /// report (found by name), solid for a sized group.
    #[test]
    fn member_inks_follow_the_reports_utilisations() {
        let (d, a, r) = demo();
        member_inks_follow(&d, &a, &r);
        // the rib kept as typed: checked, drawn dashed
        let mut typed = Design::demo();
        typed.sizing.rib = GroupSizing::as_typed(typed.sizing.rib.material.clone());
        let (d, a, r) = sized(typed);
        let rib = r.sizing.groups.iter().find(|g| g.group == "rib").expect("rib");
        assert_eq!(rib.outcome, GroupOutcome::AsTyped);
        member_inks_follow(&d, &a, &r);
    }

    fn member_inks_follow(d: &Design, a: &Analysis, r: &SizeReport) {
        let s = scene(d, a, r);
        let model = &a.frame.model;
        let mut bands = std::collections::HashSet::new();
        for k in 0..model.members.len() {
            let name = model.member_label(k);
            let m = r.sizing.members.iter().find(|m| m.member == name).expect("a sized member");
            let g = r.sizing.groups.iter().find(|g| g.group == m.group).expect("its group");
            let u = m.utilisation.expect("the demo's groups are all sized");
            let band = UseBand::of(u);
            bands.insert(band.ink());
            let strokes: Vec<Stroke> = s
                .items
                .iter()
                .filter(|i| i.tag == Tag::Member { member: k })
                .filter_map(|i| i.stroke)
                .collect();
            assert_eq!(strokes.len(), 1, "member {name}: {strokes:?}");
            assert_eq!(strokes[0].ink, band.ink(), "member {name} at {u}");
            assert_eq!(strokes[0].width, band.width());
            let typed = g.outcome == GroupOutcome::AsTyped;
            assert_eq!(strokes[0].pattern == Pattern::Dashed, typed, "{name}");
        }
        // the demo's utilisations span more than one band
        assert!(bands.len() >= 2, "{bands:?}");
    }

    /// Each block is drawn as a rectangle whose sides are the report's block length and
    /// thickness times the drawing's scale, its first side (the face at the springing)
    /// normal to the resultant at the report's angle; its label gives R and the angle.
    #[test]
    fn thrust_blocks_are_drawn_to_scale() {
        let (d, a, r) = demo();
        let s = scene(&d, &a, &r);
        let t = s.transform.expect("a world");
        let blocks: Vec<&Vec<Px>> = s
            .items
            .iter()
            .filter(|i| i.fill == Some(Ink::Ground) && i.stroke.is_some_and(|s| s.ink == Ink::Text))
            .filter_map(|i| match &i.shape {
                Shape::Path { points, closed: true } => Some(points),
                _ => None,
            })
            .collect();
        assert_eq!(blocks.len(), 2);
        for (points, sp) in blocks.iter().zip(&r.foundations.springings) {
            let side = |i: usize, j: usize| (points[j].x - points[i].x).hypot(points[j].y - points[i].y);
            let (length, thickness) = (sp.block.length * t.scale, sp.block.thickness * t.scale);
            assert!((side(0, 1) - length).abs() < 1e-6 * length, "{} vs {length}", side(0, 1));
            assert!((side(2, 3) - length).abs() < 1e-6 * length);
            assert!((side(1, 2) - thickness).abs() < 1e-6 * thickness, "{} vs {thickness}", side(1, 2));
            assert!((side(3, 0) - thickness).abs() < 1e-6 * thickness);
            // the thickness runs along the resultant: down into the ground (screen y
            // grows) at the face angle below the horizontal, outward
            let (dx, dy) = (points[2].x - points[1].x, points[2].y - points[1].y);
            let angle = dy.atan2(dx.abs()).to_degrees();
            assert!((angle - sp.block.face_angle).abs() < 1e-6, "{angle} vs {}", sp.block.face_angle);
            assert_eq!(dx < 0.0, sp.side == "left", "outward at the {} springing", sp.side);
            let words = resultant_words(sp, Units::Si);
            assert!(s.labels.iter().any(|l| l.text.starts_with(&words)), "{words}");
        }
        assert!(r.foundations.springings[0].resultant > 0.0);
    }

    /// The key names every band, as typed and not sized; the title says the values are
    /// the ultimate combinations'; the rib's label gives its sized section and
    /// utilisation.
    #[test]
    fn the_legend_and_group_labels_are_there() {
        let (d, a, r) = demo();
        let s = scene(&d, &a, &r);
        let texts: Vec<&str> = s.labels.iter().map(|l| l.text.as_str()).collect();
        for b in UseBand::ALL {
            assert!(texts.contains(&b.words()), "{} in {texts:?}", b.words());
        }
        for words in ["dashed: as typed, checked", "not sized", "thrust block to scale"] {
            assert!(texts.contains(&words), "{words} in {texts:?}");
        }
        let title = s.labels.iter().find(|l| l.text.starts_with("Elevation")).expect("title");
        assert!(title.text.contains("ultimate combinations"), "{}", title.text);
        let rib = r.sizing.groups.iter().find(|g| g.group == "rib").expect("rib");
        let GroupOutcome::Sized { label, .. } = &rib.outcome else { panic!("the demo's rib is sized") };
        let (text, short) = group_words(rib);
        assert_eq!(text, format!("rib: {label}, {:.2}", rib.utilisation.expect("used")));
        assert!(texts.contains(&text.as_str()) || texts.contains(&short.as_str()), "{text} in {texts:?}");
        assert!(s.overlapping_labels().is_empty(), "{:?}", s.overlapping_labels());
        assert!(s.labels_outside().is_empty());
    }

    /// A block's corners by hand: a 45° resultant at the left springing (0, 0), face 2 m,
    /// thickness 1 m. The resultant points along d = (-r, -r), r = sqrt(1/2); the face at
    /// the springing ends at +-(r, -r) (1 m each side), the bearing face 1 m along d.
    #[test]
    fn block_corners_by_hand() {
        let c = block_corners((0.0, 0.0), true, 45.0, 2.0, 1.0);
        let r = 0.5_f64.sqrt();
        // resultant d = (-r, -r); along the face n = (r, -r)
        let expected = [(r, -r), (-r, r), (-r - r, r - r), (r - r, -r - r)];
        for (got, want) in c.iter().zip(expected) {
            assert!((got.0 - want.0).abs() < 1e-12 && (got.1 - want.1).abs() < 1e-12, "{got:?} vs {want:?}");
        }
    }
}
