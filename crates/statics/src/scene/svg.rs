//! A scene as an SVG document: the same drawing the screen paints, as vectors for a
//! report. Every shape becomes an element in painting order, then the labels (text in a
//! box where the scene boxes it, leaders); every member's shapes are gathered in one group
//! `<g id="member-NAME" data-group="GROUP">` so a reader (or a test) finds each member by
//! its model name; a footer line gives the drawing's scale and the caution.
//!
//! Written with the `svg` crate's element builders (attributes escaped by it), never by
//! joining strings. Units: CSS pixels, as the scene (1 px = 1/96 in).

use super::{Ink, Item, Label, Pattern, Px, Rect, Scene, Shape, Stroke, Tag};
use crate::scene::place::PAD_X;
use svg::node::element::path::Data;
use svg::node::element::{Circle, Group, Line, Path, Rectangle, Text, Title};
use svg::node::Text as TextNode;
use svg::Document;

/// A member as the SVG names it: its model name and its group (`rib`, `deck`, ...).
#[derive(Debug, Clone, PartialEq)]
pub struct MemberName {
    /// The member's name in its model (`springline model`): the element id is
    /// `member-NAME`.
    pub name: String,
    /// Its group.
    pub group: String,
}

/// Height of the footer band under the drawing, CSS pixels.
const FOOTER: f64 = 22.0;

/// The scene as an SVG document (text, UTF-8). `members[k]` names the member that
/// `Tag::Member { member: k }` tags (members the list does not reach are drawn without a
/// group); `title` is the document's title; `caution` ends the footer, after the scale
/// when the scene draws a world (`1 px = X m` from its transform). Never fails; an empty
/// scene gives a document with its background and footer.
pub fn scene_svg(scene: &Scene, members: &[MemberName], title: &str, caution: &str) -> String {
    let (w, h) = (scene.viewport.width, scene.viewport.height);
    let mut doc = Document::new()
        .set("xmlns", "http://www.w3.org/2000/svg")
        .set("width", w)
        .set("height", h + FOOTER)
        .set("viewBox", (0.0, 0.0, w, h + FOOTER))
        .add(Title::new(title))
        .add(
            Rectangle::new()
                .set("x", 0)
                .set("y", 0)
                .set("width", w)
                .set("height", h + FOOTER)
                .set("fill", Ink::Background.css()),
        );
    // each member's shapes in one group, placed where its first shape is painted
    let mut groups: Vec<(usize, Group)> = Vec::new();
    let mut order: Vec<Slot> = Vec::new();
    for item in &scene.items {
        let Some(element) = item_element(item) else { continue };
        let named = match item.tag {
            Tag::Member { member } => members.get(member).map(|name| (member, name)),
            _ => None,
        };
        let Some((member, name)) = named else {
            order.push(Slot::Shape(element));
            continue;
        };
        match groups.iter_mut().find(|(m, _)| *m == member) {
            Some((_, g)) => *g = std::mem::take(g).add(element),
            None => {
                let g = Group::new()
                    .set("id", element_id(&name.name))
                    .set("class", "member")
                    .set("data-member", name.name.as_str())
                    .set("data-group", name.group.as_str())
                    .add(element);
                order.push(Slot::Member(groups.len()));
                groups.push((member, g));
            }
        }
    }
    let mut groups: Vec<Option<Group>> = groups.into_iter().map(|(_, g)| Some(g)).collect();
    for slot in order {
        match slot {
            Slot::Shape(e) => doc = doc.add(e),
            Slot::Member(k) => {
                if let Some(g) = groups.get_mut(k).and_then(Option::take) {
                    doc = doc.add(g);
                }
            }
        }
    }
    for label in &scene.labels {
        doc = doc.add(label_group(label));
    }
    let scale = scene.transform.map(|t| {
        let per_px = 1.0 / t.scale.max(1e-12);
        format!("scale: 1 px = {} {} · ", crate::units::round_for_display(per_px), scene.world_unit)
    });
    doc = doc.add(
        Text::new(format!("{}{caution}", scale.unwrap_or_default()))
            .set("x", 8)
            .set("y", h + FOOTER / 2.0)
            .set("dominant-baseline", "middle")
            .set("font-family", "system-ui, sans-serif")
            .set("font-size", 11)
            .set("fill", Ink::Secondary.css()),
    );
    doc.to_string()
}

/// The element id of a member: `member-` and its name with every character other than a
/// letter or digit (of any script), `-` or `.` made `_`, so an XML name (`rib 0-1` is
/// `member-rib_0-1`). Model names are unique and never differ only by such characters
/// (the generated models' names are letters, digits, spaces and `-`).
pub fn element_id(name: &str) -> String {
    let safe: String =
        name.chars().map(|c| if c.is_alphanumeric() || c == '-' || c == '.' { c } else { '_' }).collect();
    format!("member-{safe}")
}

/// A shape in painting order, or a member's group (by its index).
enum Slot {
    Shape(Box<dyn svg::Node>),
    Member(usize),
}

/// A point as SVG numbers.
fn xy(p: Px) -> (f64, f64) {
    (p.x, p.y)
}

/// Stroke attributes of `s` on any element.
fn stroked<T: svg::Node>(mut e: T, s: &Stroke) -> T {
    e.assign("stroke", s.ink.css());
    e.assign("stroke-width", s.width);
    let dashes = s.pattern.dashes(s.width);
    if !dashes.is_empty() {
        e.assign("stroke-dasharray", dashes.iter().map(|d| format!("{d}")).collect::<Vec<_>>().join(" "));
    }
    if matches!(s.pattern, Pattern::Dotted) {
        e.assign("stroke-linecap", "round");
    }
    e
}

/// The element of one scene item (`None` for a shape with nothing to draw).
fn item_element(item: &Item) -> Option<Box<dyn svg::Node>> {
    let fill = |closed: bool| match (item.fill, closed) {
        (Some(ink), true) => ink.css(),
        _ => "none",
    };
    let with_stroke = |e: Path| match &item.stroke {
        Some(s) => stroked(e, s),
        None => e,
    };
    Some(match &item.shape {
        Shape::Line { from, to } => {
            let s = item.stroke.as_ref()?;
            Box::new(stroked(
                Line::new().set("x1", from.x).set("y1", from.y).set("x2", to.x).set("y2", to.y),
                s,
            ))
        }
        Shape::Path { points, closed } => {
            let (first, rest) = points.split_first()?;
            if rest.is_empty() {
                return None;
            }
            let mut data = Data::new().move_to(xy(*first));
            for p in rest {
                data = data.line_to(xy(*p));
            }
            if *closed {
                data = data.close();
            }
            Box::new(with_stroke(Path::new().set("d", data).set("fill", fill(*closed))))
        }
        Shape::Circle { center, radius } => {
            let c = Circle::new()
                .set("cx", center.x)
                .set("cy", center.y)
                .set("r", *radius)
                .set("fill", fill(true));
            Box::new(match &item.stroke {
                Some(s) => stroked(c, s),
                None => c,
            })
        }
        Shape::Box { rect } => {
            let r = Rectangle::new()
                .set("x", rect.x)
                .set("y", rect.y)
                .set("width", rect.w)
                .set("height", rect.h)
                .set("fill", fill(true));
            Box::new(match &item.stroke {
                Some(s) => stroked(r, s),
                None => r,
            })
        }
        Shape::Arrow { tail, head, head_size } => {
            let s = item.stroke.as_ref()?;
            let (dx, dy) = (head.x - tail.x, head.y - tail.y);
            let l = dx.hypot(dy);
            if l <= 0.0 {
                return None;
            }
            let (ux, uy) = (dx / l, dy / l);
            let size = head_size.min(l);
            let base = Px::new(head.x - ux * size, head.y - uy * size);
            let w = 0.45 * size;
            // the shaft in the stroke's pattern, the head filled in its ink (as on screen)
            let shaft = stroked(
                Line::new().set("x1", tail.x).set("y1", tail.y).set("x2", base.x).set("y2", base.y),
                s,
            );
            let tip = Data::new()
                .move_to(xy(*head))
                .line_to((base.x - uy * w, base.y + ux * w))
                .line_to((base.x + uy * w, base.y - ux * w))
                .close();
            Box::new(Group::new().add(shaft).add(Path::new().set("d", tip).set("fill", s.ink.css())))
        }
    })
}

/// The point of `r`'s edge nearest to `p`.
fn nearest_on_rect(r: &Rect, p: Px) -> Px {
    Px::new(p.x.clamp(r.x, r.right()), p.y.clamp(r.y, r.bottom()))
}

/// A label: its leader, its box when boxed, its text (left, vertically centred), and its
/// hover detail as a title.
fn label_group(l: &Label) -> Group {
    let mut g = Group::new().set("class", "label");
    if let Some(to) = l.leader {
        let from = nearest_on_rect(&l.rect, to);
        g = g.add(stroked(
            Line::new().set("x1", from.x).set("y1", from.y).set("x2", to.x).set("y2", to.y),
            &Stroke::solid(Ink::Secondary, 0.8),
        ));
    }
    if l.boxed {
        g = g.add(
            Rectangle::new()
                .set("x", l.rect.x)
                .set("y", l.rect.y)
                .set("width", l.rect.w)
                .set("height", l.rect.h)
                .set("fill", Ink::LabelBox.css()),
        );
    }
    let mut text = Text::new(l.text.as_str())
        .set("x", l.rect.x + PAD_X)
        .set("y", l.rect.y + l.rect.h / 2.0)
        .set("dominant-baseline", "middle")
        .set("font-family", "system-ui, sans-serif")
        .set("font-size", l.size.px())
        .set("fill", l.ink.css());
    if matches!(l.size, super::TextSize::Title) {
        text = text.set("font-weight", 600);
    }
    if let Some(detail) = &l.detail {
        text = text.add(Title::new("").add(TextNode::new(detail.as_str())));
    }
    g.add(text)
}

/// The names of a model's members, in model order (the tags of its scenes index them).
pub fn member_names(model: &crate::frame::model::Model) -> Vec<MemberName> {
    model
        .members
        .iter()
        .enumerate()
        .map(|(k, m)| MemberName {
            name: if m.name.is_empty() { format!("m{k}") } else { m.name.clone() },
            group: m.group.clone(),
        })
        .collect()
}

/// The elevation of an analysed design as SVG (`scene::elevation` with `opts`, for a
/// drawing of `viewport`): every member of the drawn model a group named by its model
/// name; the title, key and dimensions as the scene places them; the scale and the
/// caution in the footer.
pub fn elevation_svg(
    analysis: &crate::arch::analysis::Analysis,
    design: &crate::arch::design::Design,
    opts: &crate::scene::elevation::ElevationOptions,
    viewport: super::Viewport,
) -> String {
    use crate::arch::generate::ModelKind;
    let scene = crate::scene::elevation::elevation(analysis, design, opts, viewport);
    let erection = analysis
        .load_cases
        .get(opts.case)
        .is_some_and(|c| c.description == crate::arch::cases::CaseKind::Erection);
    let model = match (opts.model, &analysis.truss) {
        _ if erection => &analysis.bare_rib.model,
        (ModelKind::Truss, Some(t)) if t.solution.is_some() => &t.model,
        _ => &analysis.frame.model,
    };
    scene_svg(
        &scene,
        &member_names(model),
        &format!("{}: elevation", design.name),
        crate::arch::analysis::CAUTION,
    )
}

/// The force diagram of load case `case` as SVG (`scene::force`): the truss
/// idealisation's members (braced designs) named as in that model; an unbraced design's
/// thrust line has no member groups; a case out of range draws the scene's message. The
/// footer gives no scale: each area states its own in its header.
pub fn force_svg(
    analysis: &crate::arch::analysis::Analysis,
    design: &crate::arch::design::Design,
    case: usize,
    opts: &crate::scene::force::ForceOptions,
    viewport: super::Viewport,
) -> String {
    let mut scene = crate::scene::force::force_scene(analysis, case, opts, viewport);
    // two areas at two scales: their headers say them, the footer must not say one
    scene.transform = None;
    let names = analysis.truss.as_ref().map(|t| member_names(&t.model)).unwrap_or_default();
    scene_svg(&scene, &names, &format!("{}: force diagram", design.name), crate::arch::analysis::CAUTION)
}
