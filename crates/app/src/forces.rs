//! The force canvas: for braced layouts the reciprocal figure of the truss idealisation
//! (Bow's labels, load line, pole and rays of the rib's form loads); for unbraced layouts
//! the thrust line of the frame model's rib against its depth and middle third.

use crate::canvas::{self, Surface, View};
use crate::format::{Quantity, Units};
use crate::palette::*;
use springline_statics::graphic::funicular::PoleConstruction;
use springline_statics::graphic::reciprocal::{ForceDiagram, SegmentOf, SpaceKind};
use springline_statics::graphic::thrust_line::ThrustLine;
use springline_statics::Analysis;

/// What the force canvas shows, computed once per analysis.
#[derive(Debug, Clone, PartialEq)]
pub enum ForcePicture {
    /// Braced: the truss's reciprocal figure and the rib's pole construction.
    Reciprocal {
        /// The figure of the case shown.
        figure: ForceDiagram,
        /// Load line, pole and rays of the same case's loads on the bare rib.
        pole: Option<PoleConstruction>,
    },
    /// Unbraced: the thrust line of the frame model's rib.
    Thrust(ThrustLine),
    /// Nothing could be built (the message says why).
    Unavailable(String),
}

/// The picture of load case `case` (index into `Analysis::load_cases`), as the engine
/// computed it.
pub fn picture(a: &Analysis, case: usize) -> ForcePicture {
    let Some(figs) = a.load_cases.get(case) else {
        return ForcePicture::Unavailable("no such load case".into());
    };
    let why = || figs.notes.iter().map(|n| n.to_string()).collect::<Vec<_>>().join("; ");
    if a.truss.is_some() {
        match &figs.force_diagram {
            Some(figure) => ForcePicture::Reciprocal {
                figure: figure.clone(),
                pole: figs.rib_funicular.as_ref().map(|r| r.construction.clone()),
            },
            None => ForcePicture::Unavailable(why()),
        }
    } else {
        match &figs.thrust_line {
            Some(tl) => ForcePicture::Thrust(tl.clone()),
            None => ForcePicture::Unavailable(why()),
        }
    }
}

/// Draws the picture; returns the view (world unit: kN for the figure, m for the thrust
/// line) so pointer positions can be mapped back.
pub fn draw(s: &Surface, pic: &ForcePicture, hovered: Option<usize>, units: Units) -> Option<View> {
    let ctx = &s.ctx;
    ctx.set_fill_style_str(SKY);
    ctx.fill_rect(0.0, 0.0, s.width, s.height);
    match pic {
        ForcePicture::Reciprocal { figure, pole } => {
            Some(draw_reciprocal(s, figure, pole.as_ref(), hovered, units))
        }
        ForcePicture::Thrust(tl) => Some(draw_thrust(s, tl, units)),
        ForcePicture::Unavailable(why) => {
            canvas::text(
                ctx,
                "Force diagram not available",
                (12.0, 14.0),
                "600 13px system-ui, sans-serif",
                INK,
                "left",
            );
            canvas::text(ctx, why, (12.0, 36.0), "12px system-ui, sans-serif", DIM, "left");
            None
        }
    }
}

/// Offset (kN) that puts the pole construction clear to the right of the figure.
fn pole_offset(figure: &ForceDiagram, pole: Option<&PoleConstruction>) -> f64 {
    let xs = figure.spaces.iter().map(|s| s.point.x);
    let x1 = xs.clone().fold(f64::NEG_INFINITY, f64::max);
    let x0 = xs.fold(f64::INFINITY, f64::min);
    let left = pole.map(|p| p.pole.x.min(0.0)).unwrap_or(0.0);
    x1 - left + 0.6 * (x1 - x0).max(figure.largest_force * 0.1)
}

/// Spaces found at one point: (order, label) of outside and of inside spaces, the point.
type PointGroup = (Vec<(usize, String)>, Vec<(usize, String)>, (f64, f64));

/// Runs of consecutive keys written as "first–last": A, B, C, D -> "A–D"; 3, 4 -> "3, 4".
fn runs(mut items: Vec<(usize, String)>) -> Vec<String> {
    items.sort_by_key(|i| i.0);
    let mut out = Vec::new();
    let mut i = 0;
    while i < items.len() {
        let mut j = i;
        while j + 1 < items.len() && items[j + 1].0 == items[j].0 + 1 {
            j += 1;
        }
        out.push(match j - i {
            0 => items[i].1.clone(),
            1 => format!("{}, {}", items[i].1, items[j].1),
            _ => format!("{}–{}", items[i].1, items[j].1),
        });
        i = j + 1;
    }
    out
}

/// Labels of spaces that share a point, joined ("B, 1, 2" or "O–AA"), with the point
/// and whether an outside space is among them.
fn grouped_labels(figure: &ForceDiagram) -> Vec<(String, (f64, f64), bool)> {
    let tol = 1e-6 * figure.largest_force.max(1e-9);
    let mut groups: Vec<PointGroup> = Vec::new();
    let (mut n_out, mut n_in) = (0usize, 0usize);
    for sp in &figure.spaces {
        let p = (sp.point.x, sp.point.y);
        let found = groups.iter_mut().find(|g| (g.2 .0 - p.0).abs() <= tol && (g.2 .1 - p.1).abs() <= tol);
        let g = match found {
            Some(g) => g,
            None => {
                groups.push((Vec::new(), Vec::new(), p));
                groups.last_mut().expect("just pushed")
            }
        };
        if sp.kind == SpaceKind::Outside {
            g.0.push((n_out, sp.label.clone()));
            n_out += 1;
        } else {
            // inside faces are numbered in order, so the number is the key
            let key = sp.label.parse::<usize>().unwrap_or(n_in);
            g.1.push((key, sp.label.clone()));
            n_in += 1;
        }
    }
    groups
        .into_iter()
        .map(|(outside, inside, p)| {
            let any_outside = !outside.is_empty();
            let mut parts = runs(outside);
            parts.extend(runs(inside));
            (parts.join(", "), p, any_outside)
        })
        .collect()
}

fn draw_reciprocal(
    s: &Surface,
    figure: &ForceDiagram,
    pole: Option<&PoleConstruction>,
    hovered: Option<usize>,
    units: Units,
) -> View {
    let ctx = &s.ctx;
    let mut pts: Vec<(f64, f64)> = figure.spaces.iter().map(|sp| (sp.point.x, sp.point.y)).collect();
    let shift = pole_offset(figure, pole);
    if let Some(pc) = pole {
        pts.push((shift + pc.pole.x, pc.pole.y));
        pts.extend(pc.load_line.iter().map(|q| (shift + q.x, q.y)));
    }
    let bounds =
        pts.iter().fold((f64::INFINITY, f64::NEG_INFINITY, f64::INFINITY, f64::NEG_INFINITY), |b, p| {
            (b.0.min(p.0), b.1.max(p.0), b.2.min(p.1), b.3.max(p.1))
        });
    let view = View::fit(bounds, s.width, s.height, 30.0, 40.0);
    let p = |q: (f64, f64)| view.px(q.0, q.1);
    // pole construction first, underneath
    if let Some(pc) = pole {
        let pp = p((shift + pc.pole.x, pc.pole.y));
        for (_, q) in &pc.rays {
            canvas::line(ctx, pp, p((shift + q.x, q.y)), "rgba(91,103,112,0.45)", 0.8);
        }
        let ll: Vec<(f64, f64)> = pc.load_line.iter().map(|q| p((shift + q.x, q.y))).collect();
        canvas::polyline(ctx, &ll, LOAD, 2.0);
        canvas::dot(ctx, pp, 3.5, INK);
        canvas::label(ctx, "pole O", (pp.0 - 6.0, pp.1 + 14.0), "11px system-ui, sans-serif", INK, "right");
        if let Some(top) = ll.first() {
            canvas::label(
                ctx,
                // the pole sits H to the left of the load line
                &format!("rib loads · pole distance H = {}", units.show(Quantity::Force, -pc.pole.x)),
                (top.0 + 4.0, top.1 - 14.0),
                "11px system-ui, sans-serif",
                DIM,
                "right",
            );
        }
    }
    // members by sign
    let largest = figure.largest_force.max(1e-9);
    for seg in &figure.segments {
        let SegmentOf::Member { member } = seg.of else { continue };
        let (l, r) = (figure.spaces[seg.left].point, figure.spaces[seg.right].point);
        let color = if seg.zero {
            ZERO
        } else if seg.force > 0.0 {
            TENSION
        } else {
            COMPRESSION
        };
        let w = 1.0 + 1.5 * (seg.force.abs() / largest).sqrt();
        if hovered == Some(member) {
            canvas::line(ctx, p((r.x, r.y)), p((l.x, l.y)), HIGHLIGHT_HALO, 11.0);
            canvas::line(ctx, p((r.x, r.y)), p((l.x, l.y)), HIGHLIGHT, 3.0);
        } else {
            canvas::line(ctx, p((r.x, r.y)), p((l.x, l.y)), color, w);
        }
        if seg.zero {
            // a zero-force member is a point of the figure: an open ring marks it
            canvas::ring(ctx, p((l.x, l.y)), 3.0, ZERO, "rgba(0,0,0,0)");
        }
    }
    // external forces on top: the load line must stay visible however short
    for seg in &figure.segments {
        let (l, r) = (figure.spaces[seg.left].point, figure.spaces[seg.right].point);
        match seg.of {
            SegmentOf::Load { .. } => canvas::line(ctx, p((r.x, r.y)), p((l.x, l.y)), LOAD, 3.0),
            SegmentOf::Reaction { .. } => canvas::line(ctx, p((r.x, r.y)), p((l.x, l.y)), REACTION, 3.0),
            SegmentOf::Member { .. } => {}
        }
    }
    // space labels (Bow's notation) at their points; spaces sharing a point share a label
    for (text, q, outside) in grouped_labels(figure) {
        let at = p(q);
        let color = if outside { INK } else { DIM };
        canvas::label(ctx, &text, (at.0 + 8.0, at.1 - 8.0), "11px system-ui, sans-serif", color, "left");
    }
    let title = format!("Force diagram · truss idealisation · case '{}'", figure.case);
    canvas::text(ctx, &title, (12.0, 14.0), "600 13px system-ui, sans-serif", INK, "left");
    let scale_kn = units.show(Quantity::Force, 50.0 / view.scale);
    canvas::text(
        ctx,
        &format!("50 px = {scale_kn} · letters: spaces between external forces, numbers: panels"),
        (12.0, 30.0),
        "11px system-ui, sans-serif",
        DIM,
        "left",
    );
    if figure.pass_through {
        let note = "crossed bracing: drawn through pass-through joints at the crossings";
        canvas::text(ctx, note, (12.0, 44.0), "11px system-ui, sans-serif", DIM, "left");
    }
    view
}

fn draw_thrust(s: &Surface, tl: &ThrustLine, units: Units) -> View {
    let ctx = &s.ctx;
    let axis: Vec<(f64, f64)> = tl.sections.iter().map(|sec| sec.axis.to_tuple()).collect();
    let bounds =
        axis.iter().fold((f64::INFINITY, f64::NEG_INFINITY, f64::INFINITY, f64::NEG_INFINITY), |b, p| {
            (b.0.min(p.0), b.1.max(p.0), b.2.min(p.1), b.3.max(p.1))
        });
    let view = View::fit(bounds, s.width, s.height, 40.0, 46.0);
    // exaggerate offsets so that the rib depth shows as about 24 px
    let exaggeration = (24.0 / (tl.depth * view.scale)).max(1.0);
    // section normals from the rib's own direction (left-hand normal, towards the
    // extrados): the offset is measured along them
    let normals: Vec<(f64, f64)> = (0..axis.len())
        .map(|i| {
            let (a, b) = if i + 1 < axis.len() {
                (axis[i], axis[i + 1])
            } else {
                (axis[i.saturating_sub(1)], axis[i])
            };
            let (dx, dy) = (b.0 - a.0, b.1 - a.1);
            let l = dx.hypot(dy);
            if l > 0.0 {
                (-dy / l, dx / l)
            } else {
                (0.0, 1.0)
            }
        })
        .collect();
    let band = |k: f64| -> Vec<(f64, f64)> {
        let mut v: Vec<(f64, f64)> = axis
            .iter()
            .zip(&normals)
            .map(|(a, n)| view.px(a.0 + n.0 * k * exaggeration, a.1 + n.1 * k * exaggeration))
            .collect();
        let back: Vec<(f64, f64)> = axis
            .iter()
            .zip(&normals)
            .rev()
            .map(|(a, n)| view.px(a.0 - n.0 * k * exaggeration, a.1 - n.1 * k * exaggeration))
            .collect();
        v.extend(back);
        v
    };
    canvas::fill_polygon(ctx, &band(tl.depth / 2.0), "rgba(200,97,30,0.14)");
    canvas::fill_polygon(ctx, &band(tl.depth / 6.0), "rgba(200,97,30,0.28)");
    let ax: Vec<(f64, f64)> = axis.iter().map(|a| view.px(a.0, a.1)).collect();
    canvas::polyline(ctx, &ax, COMPRESSION, 1.0);
    let line: Vec<(f64, f64)> = tl
        .sections
        .iter()
        .zip(&normals)
        .map(|(sec, n)| {
            view.px(
                sec.axis.x + n.0 * sec.offset * exaggeration,
                sec.axis.y + n.1 * sec.offset * exaggeration,
            )
        })
        .collect();
    canvas::polyline(ctx, &line, THRUST_LINE, 2.2);
    if let Some(w) = line.get(tl.worst) {
        canvas::ring(ctx, *w, 5.0, THRUST_LINE, SKY);
    }
    canvas::text(
        ctx,
        &format!("Thrust line · frame model rib · case '{}'", tl.case),
        (12.0, 14.0),
        "600 13px system-ui, sans-serif",
        INK,
        "left",
    );
    let gsf = tl.geometric_safety_factor.map(|g| format!("{g:.1}")).unwrap_or_else(|| "∞".into());
    let note = format!(
        "offsets drawn ×{:.0} · light band: rib depth {} · dark band: middle third",
        exaggeration,
        units.show(Quantity::Length, tl.depth)
    );
    canvas::text(ctx, &note, (12.0, 30.0), "11px system-ui, sans-serif", DIM, "left");
    let verdict = if tl.inside_middle_third {
        "inside the middle third"
    } else if tl.inside_depth {
        "outside the middle third, inside the depth"
    } else {
        "outside the rib depth"
    };
    let check = format!(
        "worst offset {} (circle) · {verdict} · geometric safety factor {gsf}",
        units.show(Quantity::Length, tl.max_offset)
    );
    canvas::text(ctx, &check, (12.0, 44.0), "11px system-ui, sans-serif", DIM, "left");
    view
}

/// The truss member whose force-diagram segment is within `tolerance` CSS pixels of the
/// pointer, nearest first.
pub fn member_at(pic: &ForcePicture, view: &View, pointer: (f64, f64), tolerance: f64) -> Option<usize> {
    let ForcePicture::Reciprocal { figure, .. } = pic else { return None };
    let segments = figure.segments.iter().filter_map(|seg| {
        let SegmentOf::Member { member } = seg.of else { return None };
        let (l, r) = (figure.spaces[seg.left].point, figure.spaces[seg.right].point);
        Some((member, view.px(l.x, l.y), view.px(r.x, r.y)))
    });
    canvas::nearest_segment(pointer, segments, tolerance)
}

#[cfg(test)]
mod tests {
    use super::runs;

    #[test]
    fn consecutive_labels_collapse_into_ranges() {
        let items = |v: &[(usize, &str)]| v.iter().map(|(k, s)| (*k, s.to_string())).collect::<Vec<_>>();
        assert_eq!(runs(items(&[(14, "O"), (15, "P"), (16, "Q"), (26, "AA")])), vec!["O–Q", "AA"]);
        assert_eq!(runs(items(&[(3, "3"), (4, "4")])), vec!["3, 4"]);
        assert_eq!(runs(items(&[(7, "7")])), vec!["7"]);
    }
}
