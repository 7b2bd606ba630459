//! The "as built" form-finding basis against statics: the form found for the forces the
//! frame model's rib receives leaves no dead-load moment at the rib nodes of a
//! three-hinged rib, its springing reactions are the frame's, and a rib under its own
//! weight alone converges to the catenary.

use springline_statics::arch::analysis::{analyze, Analysis};
use springline_statics::arch::design::{Bracing, Design};
use springline_statics::arch::form::Basis;
use springline_statics::arch::generate::MemberRole;

fn analysed(mut d: Design, basis: Basis) -> Analysis {
    d.form.basis = basis;
    analyze(&d).unwrap_or_else(|e| panic!("{basis}: {e}"))
}

/// The demo without its bracing, with 14 panels and a lower crown: a second three-hinged
/// design, unbraced, of another panel spacing and rise (invented).
fn unbraced_three_hinged() -> Design {
    let mut d = Design::demo();
    d.name = "Tarnvale Gorge, unbraced, 14 panels (invented)".into();
    d.bracing = Bracing::None;
    d.panels = 14;
    d.crown = springline_statics::arch::design::Crown::Level { level: 96.0 };
    d
}

/// Largest |M| of the rib members at the rib nodes (both ends of every member), kNm.
fn node_moment(a: &Analysis) -> f64 {
    let dead = a.frame.solution.case("dead").expect("dead case");
    a.frame
        .map
        .rib_members
        .iter()
        .map(|&k| dead.members[k].start.m.abs().max(dead.members[k].end.m.abs()))
        .fold(0.0, f64::max)
}

/// On a three-hinged rib the as-built form leaves no dead-load moment at any rib node:
/// the rib is statically determinate for the loads it receives, and the form is their
/// funicular through the three hinges (any statics text on the three-hinged arch).
/// Required: at most 1e-6 H f (the bound); the panel-load form leaves hundreds
/// of kNm there. Between nodes each segment still bends under its own weight as a
/// simple beam: its largest moment is w cos(theta) s^2 / 8 (w kN per m of rib, s the
/// segment length, theta its slope; simple beam under a uniform load, any statics text)
/// to within the node moments.
#[test]
fn as_built_rib_has_no_dead_load_moment_at_its_nodes() {
    for design in [Design::demo(), unbraced_three_hinged()] {
        let panel = analysed(design.clone(), Basis::PanelLoads);
        let built = analysed(design.clone(), Basis::AsBuilt);
        let hf = built.form.thrust * built.form.rise;
        let (before, after) = (node_moment(&panel), node_moment(&built));
        assert!(after <= 1e-6 * hf, "{}: {after} kNm at the nodes, H f = {hf}", design.name);
        assert!(before > 100.0, "{}: the panel-load form left {before} kNm", design.name);
        let w = design.groups.rib.unit_weight * design.groups.rib.a * design.deck.ribs as f64;
        let dead = built.frame.solution.case("dead").expect("dead case");
        for &k in &built.frame.map.rib_members {
            let m = &built.frame.model.members[k];
            let (p, q) = (&built.frame.model.nodes[m.start], &built.frame.model.nodes[m.end]);
            let s = (q.x - p.x).hypot(q.y - p.y);
            let cos = (q.x - p.x).abs() / s;
            let simple = w * cos * s * s / 8.0;
            let mid = dead.members[k].max_abs_moment();
            assert!((mid - simple).abs() <= 1e-6 * hf + 1e-9 * simple, "{}: {mid} vs {simple}", m.name);
        }
    }
}

/// The as-built form's springing reactions are the frame model's under the dead load:
/// the form is the funicular of exactly the forces the frame's rib receives, so statics
/// of the rib alone gives the frame's reactions (both components, both springings; the
/// thrusts differ where the rib nodes receive horizontal forces). Checked against the
/// stiffness solution, which knows nothing of the form.
#[test]
fn as_built_reactions_are_the_frame_models() {
    for design in [Design::demo(), unbraced_three_hinged()] {
        let built = analysed(design.clone(), Basis::AsBuilt);
        let dead = built.frame.solution.case("dead").expect("dead case");
        let [a, b] = built.frame.map.springings;
        let scale = built.form.thrust;
        for (form, node) in [(built.form.reaction_left, a), (built.form.reaction_right, b)] {
            let r = dead.reaction(node).expect("springing reaction");
            assert!((form.fx - r.fx).abs() < 1e-6 * scale, "{}: {} vs {}", design.name, form.fx, r.fx);
            assert!((form.fy - r.fy).abs() < 1e-6 * scale, "{}: {} vs {}", design.name, form.fy, r.fy);
        }
        assert!(built.form.final_change <= built.form.tolerance * built.form.rise);
    }
}

/// What the as-built form does to the bracing of the braced demo, measured: with all dead
/// load on the completed structure the braced spandrel shares the dead load between rib,
/// deck and diagonals, and the shape that frees the rib of bending makes the diagonals
/// carry more, not less (their largest dead-load force rises about threefold). Stated
/// here so that a change in it is seen; see the README's "Form basis".
#[test]
fn as_built_diagonals_of_the_braced_demo_are_measured() {
    let largest = |a: &Analysis| {
        let dead = a.frame.solution.case("dead").expect("dead case");
        a.frame
            .map
            .members_with(MemberRole::Bracing)
            .map(|k| dead.members[k].start.n.abs())
            .fold(0.0, f64::max)
    };
    let panel = largest(&analysed(Design::demo(), Basis::PanelLoads));
    let built = largest(&analysed(Design::demo(), Basis::AsBuilt));
    assert!(built > 2.0 * panel && built < 4.0 * panel, "panel loads {panel} kN, as built {built} kN");
}

/// A rib under its own weight alone (weightless deck, posts and no bracing; level
/// springings) converges to the catenary through the springings: with H the thrust and q
/// the weight per metre of arch, the rise is f = (H / q)(cosh(q L / (2 H)) - 1) (the
/// catenary; any statics text, e.g. Timoshenko & Young, Theory of Structures, on
/// cables, from memory). The form is a polygon of loads lumped at n equal panels, so it
/// differs from the catenary by a discretisation error of second order in the panel
/// length. Stated error (measured here, a rise of about 1/7 of the span): on the panel-load
/// basis the relative error of f is at most 0.15 / n^2 and falls fourfold (3.5 to 4.5) as
/// the panels double; on the as-built basis at most 0.25 / n^2 (the weightless posts and
/// deck also restrain the rib's bending between the nodes, which shifts the loads the
/// rib receives a little) and falling.
#[test]
fn a_rib_under_its_own_weight_converges_to_the_catenary() {
    let mut errors = Vec::new();
    let mut built_errors = Vec::new();
    for panels in [8, 16, 32, 64] {
        let mut d = Design::demo();
        d.springing_right_level = d.springing_left_level;
        d.panels = panels;
        d.bracing = Bracing::None;
        d.deck.dead_load = 0.0;
        d.deck.surfacing = 0.0;
        d.groups.deck.unit_weight = 0.0;
        d.groups.posts.unit_weight = 0.0;
        let q = d.groups.rib.unit_weight * d.groups.rib.a * d.deck.ribs as f64;
        let n2 = (panels * panels) as f64;
        for (basis, found, bound) in
            [(Basis::PanelLoads, &mut errors, 0.15 / n2), (Basis::AsBuilt, &mut built_errors, 0.25 / n2)]
        {
            let a = analysed(d.clone(), basis);
            let (h, l, f) = (a.form.thrust, a.form.span, a.form.rise);
            let catenary = h / q * ((q * l / (2.0 * h)).cosh() - 1.0);
            let error = (catenary - f).abs() / f;
            assert!(error <= bound, "{basis}, {panels} panels: error {error:e} above {bound:e}");
            found.push(error);
        }
    }
    for pair in errors.windows(2) {
        assert!((3.5..4.5).contains(&(pair[0] / pair[1])), "panel loads: {errors:?}");
    }
    for pair in built_errors.windows(2) {
        assert!(pair[1] < pair[0] / 3.0, "as built: {built_errors:?}");
    }
}

/// The rib's pole construction under the as-built loads (with their horizontal
/// components: the load line is then a polygon) draws the found form: its funicular
/// polygon passes through every rib node, and the load line's last point is the sum of
/// the loads, both components.
#[test]
fn as_built_pole_construction_draws_the_form() {
    let built = analysed(Design::demo(), Basis::AsBuilt);
    let dead = built.load_cases.iter().find(|c| c.case == "dead").expect("dead case");
    let rf = dead.rib_funicular.as_ref().expect("a rib funicular");
    assert_eq!(rf.horizontal.len(), rf.loads.len());
    assert!(rf.horizontal.iter().any(|&px| px.abs() > 1.0), "{:?}", rf.horizontal);
    let polygon = &rf.construction.polygon;
    let rib = &built.form.rib;
    // the polygon: start, one vertex per loaded node (springings included), end
    for node in rib {
        let vertex = polygon.iter().find(|p| (p.x - node.x).abs() < 1e-9).expect("a vertex at the node");
        assert!(
            (vertex.y - node.y).abs() < 1e-9 * built.form.rise,
            "x = {}: {} vs {}",
            node.x,
            vertex.y,
            node.y
        );
    }
    let last = rf.construction.load_line.last().expect("points");
    let (sum_px, sum_p): (f64, f64) = (rf.horizontal.iter().sum(), rf.loads.iter().map(|q| q.p).sum());
    assert!((last.x - sum_px).abs() < 1e-9 * sum_p && (last.y + sum_p).abs() < 1e-9 * sum_p);
}

/// Where rib and deck share a node (the demo with its crown raised to 99.3 m: rib node 7
/// shares the deck), the continuous deck puts a couple on the rib there, which no
/// funicular of forces can take. The as-built form splits it evenly: the rib's moments
/// either side of that node are -C/2 and +C/2 (equal and opposite), and every other rib
/// node stays free of moment (statics of the three-hinged rib: a couple changes the
/// moment only beyond its node).
#[test]
fn a_couple_at_a_shared_node_is_split_evenly() {
    let mut d = Design::demo();
    d.crown = springline_statics::arch::design::Crown::Level { level: 99.3 };
    let built = analysed(d, Basis::AsBuilt);
    let shared = built.form.shared();
    assert_eq!(shared, vec![7]);
    let hf = built.form.thrust * built.form.rise;
    for (r, n) in built.residual_rib_moments.nodes.iter().enumerate() {
        let (left, right) = (n.left.unwrap_or(0.0), n.right.unwrap_or(0.0));
        if shared.contains(&r) {
            assert!((left + right).abs() <= 1e-6 * hf, "node {r}: {left} and {right}");
            assert!(left.abs() > 10.0, "node {r}: the deck's couple is real ({left} kNm)");
        } else {
            assert!(left.abs().max(right.abs()) <= 1e-6 * hf, "node {r}: {left}, {right}");
        }
    }
}
