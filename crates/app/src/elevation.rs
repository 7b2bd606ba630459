//! The elevation: valley, abutments, thrust blocks, deck, posts, piers, rib, bracing,
//! supports, loads, member forces (line weight and colour), dimensions and reactions.

use crate::canvas::{self, Surface, View};
use crate::format::{Quantity, Units};
use crate::palette::*;
use springline_statics::arch::summary::SpringingForce;
use springline_statics::tolerance::ZERO_FORCE;
use springline_statics::{Analysis, Design};

/// What the elevation needs besides the analysis.
pub struct ElevationInput<'a> {
    /// The design (valley, deck seats).
    pub design: &'a Design,
    /// Its analysis.
    pub analysis: &'a Analysis,
    /// Truss member under the pointer (highlighted by its end points).
    pub hovered: Option<usize>,
    /// Display units.
    pub units: Units,
    /// Load case shown (index into the models' load cases; 0 is dead load).
    pub case: usize,
}

/// World bounds of the elevation: the valley's extent and everything built on it.
pub fn bounds(design: &Design) -> (f64, f64, f64, f64) {
    let xs = design.valley.iter().map(|p| p.x);
    let ys = design.valley.iter().map(|p| p.y);
    let x0 = xs.clone().fold(f64::INFINITY, f64::min);
    let x1 = xs.fold(f64::NEG_INFINITY, f64::max);
    let y0 = ys.fold(f64::INFINITY, f64::min);
    let y1 = design.deck.level.max(design.valley.iter().map(|p| p.y).fold(f64::NEG_INFINITY, f64::max));
    let pad = 0.04 * (x1 - x0);
    (x0, x1, y0 - 2.0 * pad, y1 + pad)
}

/// Draws the elevation and returns the view used.
pub fn draw(s: &Surface, input: &ElevationInput) -> View {
    let ctx = &s.ctx;
    let d = input.design;
    let a = input.analysis;
    let world = bounds(d);
    let view = View::fit(world, s.width, s.height, 28.0, 34.0);
    let p = |x: f64, y: f64| view.px(x, y);
    ctx.set_fill_style_str(SKY);
    ctx.fill_rect(0.0, 0.0, s.width, s.height);

    // ground: the valley section filled down to the bottom edge
    let mut ground: Vec<(f64, f64)> = d.valley.iter().map(|g| p(g.x, g.y)).collect();
    if let (Some(first), Some(last)) = (ground.first().copied(), ground.last().copied()) {
        ground.push((last.0, s.height));
        ground.push((first.0, s.height));
        canvas::fill_polygon(ctx, &ground, GROUND_FILL);
        let line: Vec<(f64, f64)> = d.valley.iter().map(|g| p(g.x, g.y)).collect();
        canvas::polyline(ctx, &line, GROUND_LINE, 1.5);
    }
    for g in &d.valley {
        canvas::dot(ctx, p(g.x, g.y), 2.5, GROUND_LINE);
    }

    // thrust blocks at the springings and abutment seats at the rim
    let f = &a.form;
    let block = 0.035 * (world.1 - world.0);
    for (sp, dir) in [(f.springing_left, -1.0), (f.springing_right, 1.0)] {
        let pts = [
            p(sp.x - dir * block * 0.3, sp.y + block * 0.25),
            p(sp.x + dir * block * 0.9, sp.y + block * 0.25),
            p(sp.x + dir * block * 1.1, sp.y - block * 0.9),
            p(sp.x - dir * block * 0.5, sp.y - block * 0.9),
        ];
        canvas::fill_polygon(ctx, &pts, CONCRETE);
    }
    for x in [d.deck.left_seat_x, d.deck.right_seat_x] {
        let top = d.deck.level - 0.02 * block * 10.0;
        let pts = [
            p(x - block * 0.5, top),
            p(x + block * 0.5, top),
            p(x + block * 0.5, top - block),
            p(x - block * 0.5, top - block),
        ];
        canvas::fill_polygon(ctx, &pts, CONCRETE);
    }

    // members of the frame model, coloured by the sign of the dead-load axial force
    let model = &a.frame.model;
    let case_index = input.case.min(a.frame.solution.cases.len().saturating_sub(1));
    let case = &a.frame.solution.cases[case_index];
    let nmax = case.members.iter().map(|m| m.start.n.abs().max(m.end.n.abs())).fold(0.0, f64::max).max(1e-9);
    for (k, mem) in model.members.iter().enumerate() {
        let (na, nb) = (&model.nodes[mem.start], &model.nodes[mem.end]);
        let n = 0.5 * (case.members[k].start.n + case.members[k].end.n);
        let w = 1.2 + 6.0 * (n.abs() / nmax).sqrt();
        // the engine's zero: below it a force is rounding (as in the force diagram)
        let color = if n.abs() <= ZERO_FORCE * nmax {
            ZERO
        } else if n > 0.0 {
            TENSION
        } else {
            COMPRESSION
        };
        canvas::line(ctx, p(na.x, na.y), p(nb.x, nb.y), color, w);
    }
    // hovered truss member: a halo over its line
    if let (Some(h), Some(t)) = (input.hovered, a.truss.as_ref()) {
        if let Some(mem) = t.model.members.get(h) {
            let (na, nb) = (&t.model.nodes[mem.start], &t.model.nodes[mem.end]);
            canvas::line(ctx, p(na.x, na.y), p(nb.x, nb.y), HIGHLIGHT_HALO, 11.0);
            canvas::line(ctx, p(na.x, na.y), p(nb.x, nb.y), HIGHLIGHT, 3.0);
        }
    }
    // joints: deck panel points dark, hinges open (parts found by their roles)
    let map = &a.frame.map;
    let mut on_deck = vec![false; model.nodes.len()];
    for &node in map.deck_nodes.iter().flatten() {
        on_deck[node] = true;
        canvas::dot(ctx, p(model.nodes[node].x, model.nodes[node].y), 2.6, INK);
    }
    let hinge_nodes: Vec<usize> = map
        .rib_members
        .iter()
        .map(|&k| &model.members[k])
        .flat_map(|m| {
            let mut v = Vec::new();
            if m.release_start {
                v.push(m.start);
            }
            if m.release_end {
                v.push(m.end);
            }
            v
        })
        .collect();
    for n in hinge_nodes {
        canvas::ring(ctx, p(model.nodes[n].x, model.nodes[n].y), 4.0, INK, SKY);
    }
    // supports: triangles for pins, triangle on a bar for rollers
    for sup in &model.supports {
        let c = p(model.nodes[sup.node].x, model.nodes[sup.node].y);
        canvas::fill_polygon(ctx, &[c, (c.0 - 6.0, c.1 + 10.0), (c.0 + 6.0, c.1 + 10.0)], INK);
        if !sup.x {
            canvas::line(ctx, (c.0 - 8.0, c.1 + 13.0), (c.0 + 8.0, c.1 + 13.0), INK, 1.5);
        }
        if sup.rz {
            canvas::line(ctx, (c.0 - 9.0, c.1 + 10.0), (c.0 + 9.0, c.1 + 10.0), INK, 3.0);
        }
    }
    // dead load on the deck: small arrows at the panel points
    if let Some(lc) = model.load_cases.get(case_index) {
        let fmax = lc.nodal.iter().map(|l| l.fy.abs()).fold(0.0, f64::max).max(1e-9);
        for l in &lc.nodal {
            let node = &model.nodes[l.node];
            if !on_deck[l.node] || l.fy >= 0.0 {
                continue;
            }
            let head = p(node.x, node.y);
            let len = 8.0 + 14.0 * l.fy.abs() / fmax;
            canvas::arrow(ctx, (head.0, head.1 - len - 3.0), (head.0, head.1 - 3.0), LOAD, 1.2, 5.0);
        }
    }

    // reactions at the springings from the frame model: components and resultant angle
    let u = input.units;
    for (idx, right) in [(map.springings[0], false), (map.springings[1], true)] {
        let Some(r) = case.reaction(idx) else { continue };
        let node_pos = &model.nodes[idx];
        let c = p(node_pos.x, node_pos.y);
        let mag = r.fx.hypot(r.fy).max(1e-9);
        let len = 46.0;
        let tail = (c.0 - len * r.fx / mag, c.1 + len * r.fy / mag);
        canvas::arrow(ctx, tail, c, REACTION, 2.2, 9.0);
        let thrust = SpringingForce::from_reaction(r.fx, r.fy, r.mz, !right);
        let mut lines = vec![
            format!("H = {}", u.show(Quantity::Force, thrust.thrust)),
            format!("V = {}", u.show(Quantity::Force, thrust.vertical)),
            format!("{} below horizontal", u.show(Quantity::Angle, thrust.angle_deg)),
        ];
        // a fixed springing also takes a moment from the rib
        if thrust.moment != 0.0 {
            lines.push(format!("M = {}", u.show(Quantity::Moment, thrust.moment)));
        }
        let (ax, align) = if right { (c.0 + 12.0, "left") } else { (c.0 - 12.0, "right") };
        for (i, l) in lines.iter().enumerate() {
            canvas::label(
                ctx,
                l,
                (ax, c.1 + 26.0 + 16.0 * i as f64),
                "12px system-ui, sans-serif",
                REACTION,
                align,
            );
        }
    }

    // dimensions: span below the springings, rise at the crown, deck level
    let ya = f.springing_left.y.min(f.springing_right.y);
    let dim_y = p(0.0, ya).1 + 70.0;
    let (l0, l1) = (p(f.springing_left.x, 0.0).0, p(f.springing_right.x, 0.0).0);
    canvas::line(ctx, (l0, dim_y), (l1, dim_y), DIM, 1.0);
    for x in [l0, l1] {
        canvas::line(ctx, (x, dim_y - 5.0), (x, dim_y + 5.0), DIM, 1.0);
    }
    canvas::label(
        ctx,
        &format!("span {}", u.show(Quantity::Length, f.span)),
        ((l0 + l1) / 2.0, dim_y),
        "12px system-ui, sans-serif",
        DIM,
        "center",
    );
    let chord_y = f.springing_left.y
        + (f.springing_right.y - f.springing_left.y) * (f.crown.x - f.springing_left.x) / (f.span.max(1e-9));
    let (cx, cy_top) = p(f.crown.x, f.crown.y);
    let cy_chord = p(f.crown.x, chord_y).1;
    canvas::dashed(
        ctx,
        p(f.springing_left.x, f.springing_left.y),
        p(f.springing_right.x, f.springing_right.y),
        DIM,
        1.0,
        4.0,
    );
    canvas::line(ctx, (cx, cy_top), (cx, cy_chord), DIM, 1.0);
    canvas::label(
        ctx,
        &format!("rise {}", u.show(Quantity::Length, f.rise)),
        (cx + 6.0, (cy_top + cy_chord) / 2.0),
        "12px system-ui, sans-serif",
        DIM,
        "left",
    );
    let deck_left = p(d.deck.left_seat_x, d.deck.level);
    canvas::label(
        ctx,
        &format!("deck {}", u.show(Quantity::Length, d.deck.level)),
        (deck_left.0 + 4.0, deck_left.1 - 14.0),
        "12px system-ui, sans-serif",
        DIM,
        "left",
    );

    // draggable points: crown and springings
    for q in [f.crown, f.springing_left, f.springing_right] {
        let c = p(q.x, q.y);
        ctx.set_fill_style_str("#ffffff");
        ctx.fill_rect(c.0 - 4.0, c.1 - 4.0, 8.0, 8.0);
        ctx.set_stroke_style_str(INK);
        ctx.set_line_width(1.2);
        ctx.stroke_rect(c.0 - 4.0, c.1 - 4.0, 8.0, 8.0);
    }

    // title (naming the model and the load case shown) and legend
    let case_name = a.load_cases.get(case_index).map(|c| c.case.clone()).unwrap_or_else(|| "dead".into());
    canvas::text(
        ctx,
        &format!("Elevation · frame model · case '{case_name}'"),
        (12.0, 14.0),
        "600 13px system-ui, sans-serif",
        INK,
        "left",
    );
    legend(ctx, s.width - 12.0, 14.0);
    view
}

/// The colour key: which colour is tension and which compression, and line weight.
pub fn legend(ctx: &web_sys::CanvasRenderingContext2d, right: f64, y: f64) {
    let items = [(TENSION, "tension (N > 0)"), (COMPRESSION, "compression (N < 0)"), (ZERO, "no force")];
    let mut x = right;
    for (color, text) in items.iter().rev() {
        ctx.set_font("12px system-ui, sans-serif");
        let w = ctx.measure_text(text).map(|m| m.width()).unwrap_or(60.0);
        x -= w;
        canvas::text(ctx, text, (x, y), "12px system-ui, sans-serif", INK, "left");
        canvas::line(ctx, (x - 22.0, y), (x - 6.0, y), color, 4.0);
        x -= 34.0;
    }
    canvas::text(ctx, "line weight ∝ |N|", (right, y + 16.0), "11px system-ui, sans-serif", DIM, "right");
}
