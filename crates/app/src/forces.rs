//! The force canvas: for braced layouts the reciprocal figure of the truss idealisation
//! (Bow's labels, load line, pole and rays of the rib's form loads); for unbraced layouts
//! the thrust line of the frame model's rib against its depth and middle third.

use crate::canvas::{self, Surface, View};
use crate::format::{Quantity, Units};
use crate::palette::*;
use springline_statics::funicular::{pole_construction, PoleConstruction, VerticalLoad};
use springline_statics::reciprocal::{force_diagram, ForceDiagram, SegmentOf, SpaceKind};
use springline_statics::thrust_line::{rib_chain, thrust_line, ThrustLine};
use springline_statics::{Analysis, Design};

/// What the force canvas shows, computed once per analysis.
#[derive(Debug, Clone, PartialEq)]
pub enum ForcePicture {
    /// Braced: the truss's reciprocal figure and the rib's pole construction.
    Reciprocal {
        /// The figure of the dead load.
        figure: ForceDiagram,
        /// Load line, pole and rays of the form-finding loads on the rib.
        pole: Option<PoleConstruction>,
    },
    /// Unbraced: the thrust line of the frame model's rib.
    Thrust(ThrustLine),
    /// Nothing could be built (the message says why).
    Unavailable(String),
}

/// Builds the picture for a design's analysis.
pub fn picture(design: &Design, a: &Analysis) -> ForcePicture {
    if let Some(t) = &a.truss {
        let Some(sol) = &t.solution else {
            return ForcePicture::Unavailable(format!("truss idealisation is {}", t.determinacy_text));
        };
        let figure = match force_diagram(&t.model, &sol.cases[0]) {
            Ok(f) => f,
            Err(e) => return ForcePicture::Unavailable(e.to_string()),
        };
        let f = &a.form;
        let last = f.rib.len().saturating_sub(1);
        let loads: Vec<VerticalLoad> =
            f.rib.iter().enumerate().filter(|(i, _)| *i != 0 && *i != last).map(|(_, n)| VerticalLoad { x: n.x, p: n.load }).collect();
        let pole = pole_construction(&loads, f.thrust, f.reaction_left.fy, f.springing_left, f.springing_right.x).ok();
        ForcePicture::Reciprocal { figure, pole }
    } else {
        let case = &a.frame.solution.cases[0];
        match rib_chain(&a.frame.model).and_then(|c| thrust_line(&a.frame.model, case, &c, design.groups.rib.depth)) {
            Ok(tl) => ForcePicture::Thrust(tl),
            Err(e) => ForcePicture::Unavailable(e.to_string()),
        }
    }
}

/// Draws the picture; returns the view (world unit: kN for the figure, m for the thrust
/// line) so pointer positions can be mapped back.
pub fn draw(s: &Surface, pic: &ForcePicture, a: &Analysis, hovered: Option<usize>, units: Units) -> Option<View> {
    let ctx = &s.ctx;
    ctx.set_fill_style_str(SKY);
    ctx.fill_rect(0.0, 0.0, s.width, s.height);
    match pic {
        ForcePicture::Reciprocal { figure, pole } => Some(draw_reciprocal(s, figure, pole.as_ref(), a, hovered, units)),
        ForcePicture::Thrust(tl) => Some(draw_thrust(s, tl, units)),
        ForcePicture::Unavailable(why) => {
            canvas::text(ctx, "Force diagram not available", (12.0, 14.0), "600 13px system-ui, sans-serif", INK, "left");
            canvas::text(ctx, why, (12.0, 36.0), "12px system-ui, sans-serif", DIM, "left");
            None
        }
    }
}

/// Offset (kN) of the pole construction to the right of the reciprocal figure.
fn pole_offset(figure: &ForceDiagram) -> f64 {
    let xs = figure.spaces.iter().map(|s| s.point.x);
    let x1 = xs.clone().fold(f64::NEG_INFINITY, f64::max);
    let x0 = xs.fold(f64::INFINITY, f64::min);
    x1 + 0.25 * (x1 - x0).max(figure.largest_force * 0.2)
}

fn draw_reciprocal(
    s: &Surface,
    figure: &ForceDiagram,
    pole: Option<&PoleConstruction>,
    a: &Analysis,
    hovered: Option<usize>,
    units: Units,
) -> View {
    let ctx = &s.ctx;
    let mut pts: Vec<(f64, f64)> = figure.spaces.iter().map(|sp| (sp.point.x, sp.point.y)).collect();
    let shift = pole_offset(figure);
    if let Some(pc) = pole {
        pts.push((shift + pc.pole.x, pc.pole.y));
        pts.extend(pc.load_line.iter().map(|q| (shift + q.x, q.y)));
    }
    let bounds = pts.iter().fold((f64::INFINITY, f64::NEG_INFINITY, f64::INFINITY, f64::NEG_INFINITY), |b, p| {
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
        canvas::label(ctx, "pole O", (pp.0 - 6.0, pp.1 + 14.0), "11px system-ui, sans-serif", INK, "center");
        if let Some(top) = ll.first() {
            canvas::label(
                ctx,
                &format!("rib loads · H = {}", units.show(Quantity::Force, a.form.thrust)),
                (top.0, top.1 - 14.0),
                "11px system-ui, sans-serif",
                DIM,
                "center",
            );
        }
    }
    // external forces: the load line
    for seg in &figure.segments {
        let (l, r) = (figure.spaces[seg.left].point, figure.spaces[seg.right].point);
        match seg.of {
            SegmentOf::Load { .. } => canvas::line(ctx, p((r.x, r.y)), p((l.x, l.y)), LOAD, 3.0),
            SegmentOf::Reaction { .. } => canvas::line(ctx, p((r.x, r.y)), p((l.x, l.y)), REACTION, 3.0),
            SegmentOf::Member { .. } => {}
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
            canvas::ring(ctx, p((l.x, l.y)), 3.0, ZERO, SKY);
        }
    }
    // space labels (Bow's notation) at their points
    for sp in &figure.spaces {
        let at = p((sp.point.x, sp.point.y));
        let color = if sp.kind == SpaceKind::Outside { INK } else { DIM };
        canvas::text(ctx, &sp.label, (at.0 + 7.0, at.1 - 7.0), "11px system-ui, sans-serif", color, "left");
    }
    let mut title = "Force diagram · truss idealisation · dead load".to_string();
    if figure.pass_through {
        title.push_str(" · crossed bracing drawn through pass-through joints");
    }
    canvas::text(ctx, &title, (12.0, 14.0), "600 13px system-ui, sans-serif", INK, "left");
    let scale_kn = units.show(Quantity::Force, 50.0 / view.scale);
    canvas::text(ctx, &format!("50 px = {scale_kn} · letters: spaces between external forces, numbers: panels"), (12.0, 30.0), "11px system-ui, sans-serif", DIM, "left");
    view
}

fn draw_thrust(s: &Surface, tl: &ThrustLine, units: Units) -> View {
    let ctx = &s.ctx;
    let axis: Vec<(f64, f64)> = tl.sections.iter().map(|sec| sec.axis).collect();
    let bounds = axis.iter().fold((f64::INFINITY, f64::NEG_INFINITY, f64::INFINITY, f64::NEG_INFINITY), |b, p| {
        (b.0.min(p.0), b.1.max(p.0), b.2.min(p.1), b.3.max(p.1))
    });
    let view = View::fit(bounds, s.width, s.height, 40.0, 46.0);
    // exaggerate offsets so that the rib depth shows as about 24 px
    let exaggeration = (24.0 / (tl.depth * view.scale)).max(1.0);
    let normals: Vec<(f64, f64)> = tl
        .sections
        .iter()
        .map(|sec| {
            let (dx, dy) = (sec.point.0 - sec.axis.0, sec.point.1 - sec.axis.1);
            let e = sec.offset;
            if e.abs() > 1e-12 {
                (dx / e, dy / e)
            } else {
                (0.0, 1.0)
            }
        })
        .collect();
    let band = |k: f64| -> Vec<(f64, f64)> {
        let mut v: Vec<(f64, f64)> =
            axis.iter().zip(&normals).map(|(a, n)| view.px(a.0 + n.0 * k * exaggeration, a.1 + n.1 * k * exaggeration)).collect();
        let back: Vec<(f64, f64)> =
            axis.iter().zip(&normals).rev().map(|(a, n)| view.px(a.0 - n.0 * k * exaggeration, a.1 - n.1 * k * exaggeration)).collect();
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
        .map(|(sec, n)| view.px(sec.axis.0 + n.0 * sec.offset * exaggeration, sec.axis.1 + n.1 * sec.offset * exaggeration))
        .collect();
    canvas::polyline(ctx, &line, THRUST_LINE, 2.2);
    if let Some(w) = line.get(tl.worst) {
        canvas::ring(ctx, *w, 5.0, THRUST_LINE, SKY);
    }
    canvas::text(ctx, "Thrust line · frame model rib · dead load", (12.0, 14.0), "600 13px system-ui, sans-serif", INK, "left");
    let gsf = tl.geometric_safety_factor.map(|g| format!("{g:.1}")).unwrap_or_else(|| "∞".into());
    let note = format!(
        "offsets ×{:.0} · band: rib depth {} · dark: middle third · worst offset {} · geometric safety factor {gsf}",
        exaggeration,
        units.show(Quantity::Length, tl.depth),
        units.show(Quantity::Length, tl.max_offset)
    );
    canvas::text(ctx, &note, (12.0, 30.0), "11px system-ui, sans-serif", DIM, "left");
    view
}

/// The truss member whose force-diagram segment is within `tolerance` CSS pixels of the
/// pointer, nearest first.
pub fn member_at(pic: &ForcePicture, view: &View, pointer: (f64, f64), tolerance: f64) -> Option<usize> {
    let ForcePicture::Reciprocal { figure, .. } = pic else { return None };
    let mut best: Option<(usize, f64)> = None;
    for seg in &figure.segments {
        let SegmentOf::Member { member } = seg.of else { continue };
        let (l, r) = (figure.spaces[seg.left].point, figure.spaces[seg.right].point);
        let d = canvas::distance_to_segment(pointer, view.px(l.x, l.y), view.px(r.x, r.y));
        if d <= tolerance && best.is_none_or(|b| d < b.1) {
            best = Some((member, d));
        }
    }
    best.map(|b| b.0)
}

