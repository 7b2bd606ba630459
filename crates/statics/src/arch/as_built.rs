//! The "as built" form-finding basis: the form found for the forces the rib actually
//! receives in the frame model under the dead load.
//!
//! The "panel loads" basis puts the deck on the rib as simple-span panel reactions. The
//! frame model's deck is continuous over the posts, its bracing ties deck and rib
//! together and every member shortens under load, so the rib found for panel loads still
//! bends under its own dead load and the diagonals carry it. Here each shape of the rib
//! is analysed as a frame under the dead load; the forces the nodes apply to the rib
//! members (posts, diagonals, the deck where it shares a rib node, and the nodal loads)
//! plus half of each rib segment's own weight at each of its ends are the loads, with
//! their horizontal components; the three-point funicular of those loads
//! (`funicular::three_point_inclined`) is the next shape. The loop starts from the
//! panel-load form and stops when no rib node moves more than the design's form tolerance
//! times the rise.
//!
//! Assumptions, shown wherever the basis is: all dead load acts on the completed
//! structure (no erection sequence, no staged casting or jacking); the rib nodes that
//! share the deck are those of the panel-load form. On a three-hinged rib the found form
//! has no dead-load moment at any rib node (the rib is statically determinate for the
//! loads it receives); between nodes each segment still bends under its own weight as a
//! simple beam. Where rib and deck share a node the continuous deck puts a couple on the
//! rib, which no funicular of forces takes: it is replaced by the vertical pair of the
//! same moment at the neighbouring rib nodes, so the form splits it evenly (-C/2 and
//! +C/2 either side of that node). On a two-hinged or fixed rib the rib's shortening
//! under its thrust leaves a small moment the form cannot remove (the rib is
//! indeterminate).
//!
//! Units m, kN; loads positive downward and to the right.

use crate::arch::design::Design;
use crate::arch::form::{iterate, Basis, Form, LoadBasis, Settings};
use crate::arch::generate::{frame_model, DEAD};
use crate::arch::layout::{Layout, Topology};
use crate::arch::validate::ValidDesign;
use crate::error::{Field, Problem, StaticsError};
use crate::frame::solver::solve;
use crate::graphic::funicular::NodeLoad;

/// The "as built" basis of a design: each shape is analysed as the frame model of the
/// design with the rib at that shape.
struct AsBuilt<'a> {
    design: &'a Design,
    /// The panel-load form: its nodes, their sharing of the deck and its settings; the
    /// levels are replaced by each shape.
    template: &'a Form,
}

impl LoadBasis for AsBuilt<'_> {
    fn basis(&self) -> Basis {
        Basis::AsBuilt
    }

    fn gather(&self, frame: &Layout, topo: &Topology, rib_y: &[f64]) -> Result<Vec<NodeLoad>, StaticsError> {
        let mut form = self.template.clone();
        for (node, &y) in form.rib.iter_mut().zip(rib_y) {
            node.y = y;
        }
        let valid = ValidDesign::from_parts(self.design, frame.clone(), form, topo.clone());
        rib_loads(&valid)
    }
}

/// The loads the rib of `valid` receives in its frame model under the dead load, one per
/// rib node (springings included): the forces the node applies to the rib members there
/// (at a springing, less the support's reaction) and half of each adjacent rib segment's
/// self-weight; a couple the node puts on the rib (where the rib shares the deck) as the
/// vertical pair of the same moment at the neighbouring rib nodes (see the module doc).
/// kN, `p` positive down, `px` to the right.
///
/// Errors: those of the frame solve.
pub fn rib_loads(valid: &ValidDesign) -> Result<Vec<NodeLoad>, StaticsError> {
    let generated = frame_model(valid);
    let solution = solve(&generated.model)?;
    let case =
        solution.case(DEAD).ok_or_else(|| StaticsError::invalid("frame model", "has no dead load case"))?;
    let map = &generated.map;
    let w_rib = valid.design().weight_per_m(&valid.design().groups.rib);
    let last = map.rib_nodes.len() - 1;
    let mut loads: Vec<NodeLoad> =
        valid.layout().rib_x.iter().map(|&x| NodeLoad { x, px: 0.0, p: 0.0 }).collect();
    let mut couples = vec![0.0; loads.len()];
    for ((r, load), couple) in loads.iter_mut().enumerate().zip(couples.iter_mut()) {
        let Some(&node) = map.rib_nodes.get(r) else { continue };
        // rib member r - 1 ends at node r (true: its end), member r starts there
        let before = r.checked_sub(1).and_then(|k| map.rib_members.get(k)).map(|&m| (m, true));
        let after = if r < last { map.rib_members.get(r).map(|&m| (m, false)) } else { None };
        for (member, at_end) in [before, after].into_iter().flatten() {
            let Some(forces) = case.members.get(member) else { continue };
            let a = &forces.end_actions_global;
            let (fx, fy, mz) = if at_end { (a[3], a[4], a[5]) } else { (a[0], a[1], a[2]) };
            load.px += fx;
            load.p -= fy;
            load.p += 0.5 * w_rib * forces.length;
            *couple += mz;
        }
        if let Some(reaction) = case.reaction(node) {
            load.px -= reaction.fx;
            load.p += reaction.fy;
        }
    }
    // A couple on the rib (the deck's continuity moment where rib and deck share a node)
    // has no place in a funicular of forces. Replaced by the vertical pair of the same
    // moment at the neighbouring rib nodes, it leaves every other node's moment as it is
    // and, at its own node, half of it: the found form then splits the couple evenly,
    // -C/2 and +C/2 either side of the node, the least a polygon through the node can do.
    let x = &valid.layout().rib_x;
    for (k, &c) in couples.iter().enumerate().take(last).skip(1) {
        if c == 0.0 {
            continue;
        }
        // anticlockwise C = F (x_b - x_a) for F up at x_b and down at x_a
        let (a, b) = if k - 1 > 0 { (k - 1, k + 1) } else { (k, k + 1) };
        let (Some(&xa), Some(&xb)) = (x.get(a), x.get(b)) else { continue };
        let f = c / (xb - xa);
        if let Some(load) = loads.get_mut(a) {
            load.p += f;
        }
        if let Some(load) = loads.get_mut(b) {
            load.p -= f;
        }
    }
    Ok(loads)
}

/// The "as built" form of a design whose panel-load form is `panel` (see the module doc).
///
/// Errors: `NoConvergence` (`Iteration::AsBuiltForm`) when the shape does not settle
/// within the design's tolerance and iteration limit; `Invalid` when the loads admit no
/// compression funicular through the three points; those of the frame solves.
pub fn as_built_form(design: &Design, layout: &Layout, panel: &Form) -> Result<Form, StaticsError> {
    let basis = AsBuilt { design, template: panel };
    let settings = Settings {
        min_post: design.min_post_length,
        tolerance: design.form.tolerance,
        max_iterations: design.form.max_iterations,
        shared: Some(panel.shared()),
        accelerate: true,
    };
    iterate(layout, &basis, panel.rib_y(), &settings).map_err(|e| match e {
        // a braced frame carries much of the deck on its bracing and deck, whatever the
        // rib's shape: with a slender rib the iteration can reach a shape on which the
        // rib's own loads no longer press its crown down
        StaticsError::Invalid(_) if design.bracing.is_braced() => StaticsError::Invalid(vec![Problem::new(
            Field::FormBasis,
            "the as-built form cannot be found: on a trial shape the braced frame carries the deck on its \
             bracing and deck, and the rib's own loads no longer press its crown down; find the form for panel \
             loads, stiffen the rib against the deck, or leave the bracing out",
        )]),
        other => other,
    })
}
