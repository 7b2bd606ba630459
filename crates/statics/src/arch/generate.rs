//! Structure generation: from a design and its form to the analysis models of the default
//! layout (DESIGN.md section 4).
//!
//! - `frame_model`: deck frame, pin-ended posts, rib, approach spans on pin-ended piers,
//!   bracing, with the longitudinal restraint of the deck as DESIGN.md says; the dead load
//!   as member loads (deck, rib) and lumped self-weight of the pin-ended members.
//! - `truss_model`: the truss idealisation of braced spandrels (every joint pinned, loads
//!   at the joints as simple-span reactions, drop-in and approach spans left out).
//! - `bare_rib_model`: the rib alone on its springings with the form-finding loads at its
//!   nodes.
//!
//! Every generated `Model` has a title naming the model; member groups are "rib", "deck",
//! "post", "pier", "bracing", "approach". Units m, kN, kN/m2; loads y up (gravity
//! negative); section properties are the design's per-rib-line values times the number of
//! ribs. One load case, "dead".

use crate::arch::design::{check_inputs, Design, RibSystem, Section};
use crate::arch::form::{Form, PanelLoads};
use crate::arch::layout::{position, Frame, Joint, Topology};
use crate::error::StaticsError;
use crate::frame::model::{frame, truss, LoadCase, LoadDirection, MemberLoad, Model, NodalLoad, Support};
use serde::{Deserialize, Serialize};

/// A downward uniform load of `w` kN/m on `member`, per metre of member length or, when
/// `per_horizontal_metre`, per horizontal metre.
fn gravity(member: usize, w: f64, per_horizontal_metre: bool) -> MemberLoad {
    MemberLoad::Uniform { member, w: -w, direction: LoadDirection::GlobalY, projected: per_horizontal_metre }
}

/// Name of the dead load case in every generated model.
pub const DEAD: &str = "dead";
/// Title of the frame model.
pub const FRAME_TITLE: &str = "frame model: deck frame, posts, rib, approach spans on piers";
/// Title of the truss idealisation.
pub const TRUSS_TITLE: &str = "truss idealisation: braced spandrels, every joint pinned";
/// Title of the bare rib model.
pub const RIB_TITLE: &str = "bare rib: rib alone on its springings, form-finding loads at its nodes";

/// How the deck is held longitudinally in the frame model.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Restraint {
    /// The left abutment seat holds the deck horizontally.
    pub left_seat_fixed: bool,
    /// The right abutment seat holds the deck horizontally.
    pub right_seat_fixed: bool,
    /// Words for the screen.
    pub description: String,
}

/// The longitudinal restraint of the deck (DESIGN.md, "Longitudinal restraint"):
/// three-hinged braced: both seats free (each half held by its bracing); three-hinged
/// unbraced: both seats fixed (each half by its own seat); two-hinged and fixed: both
/// seats free when rib and deck share the crown node (symmetric), otherwise the left
/// seat is fixed.
pub fn restraint(design: &Design, form: &Form) -> Restraint {
    let crown_shared = form.rib.get(form.crown_node).is_some_and(|n| n.shared_with_deck);
    let (l, r, description) = match (design.rib_system, design.bracing.is_braced(), crown_shared) {
        (RibSystem::ThreeHinged, true, _) => (
            false,
            false,
            "both abutment seats slide; each half of the deck is held longitudinally by its bracing",
        ),
        (RibSystem::ThreeHinged, false, _) => {
            (true, true, "each half of the deck is held longitudinally by its own fixed abutment seat")
        }
        (_, _, true) => (
            false,
            false,
            "rib and deck share the crown node, which holds the deck; both abutment seats slide (symmetric)",
        ),
        (_, _, false) => (
            true,
            false,
            "the left abutment seat holds the deck longitudinally (fixed); the right seat slides",
        ),
    };
    Restraint { left_seat_fixed: l, right_seat_fixed: r, description: description.into() }
}

struct Builder<'a> {
    f: &'a Frame,
    y: Vec<f64>,
    model: Model,
    deck: Vec<Option<usize>>,
    rib: Vec<Option<usize>>,
    ribs: f64,
}

impl<'a> Builder<'a> {
    fn new(f: &'a Frame, form: &Form, ribs: usize, title: &str) -> Self {
        Builder {
            f,
            y: form.rib_y(),
            model: Model { title: title.into(), ..Model::default() },
            deck: vec![None; f.panels + 1],
            rib: vec![None; f.rib_x.len()],
            ribs: ribs as f64,
        }
    }
    fn joint(&mut self, j: Joint) -> usize {
        let last = self.f.last_rib();
        match j {
            Joint::Rib(r) => {
                if let Some(k) = self.rib[r] {
                    return k;
                }
                let name = if r == 0 {
                    "A (left springing)".to_string()
                } else if r == last {
                    "B (right springing)".to_string()
                } else if r == self.f.crown {
                    "C (crown)".to_string()
                } else {
                    format!("r{r}")
                };
                let k = self.model.add_node(name, self.f.rib_x[r], self.y[r]);
                self.rib[r] = Some(k);
                k
            }
            Joint::Deck(i) => {
                if let Some(k) = self.deck[i] {
                    return k;
                }
                let (x, y) = position(self.f, &self.y, j);
                let k = self.model.add_node(format!("d{i}"), x, y);
                self.deck[i] = Some(k);
                k
            }
        }
    }
    fn label(&self, j: Joint) -> String {
        match j {
            Joint::Rib(r) => format!("r{r}"),
            Joint::Deck(i) => format!("d{i}"),
        }
    }
    fn frame_member(&mut self, name: String, group: &str, a: usize, b: usize, s: &Section) -> usize {
        self.model.add_member(frame(&name, group, a, b, s.e, s.a * self.ribs, s.i * self.ribs))
    }
    fn truss_member(&mut self, name: String, group: &str, a: usize, b: usize, s: &Section) -> usize {
        let mut m = truss(&name, group, a, b, s.e, s.a * self.ribs);
        m.i = s.i * self.ribs;
        self.model.add_member(m)
    }
}

fn prepare(design: &Design, form: &Form) -> Result<(Frame, Topology), StaticsError> {
    let mut problems = Vec::new();
    check_inputs(design, &mut problems, &mut Vec::new());
    if !problems.is_empty() {
        return Err(StaticsError::Invalid(problems));
    }
    let f = Frame::new(design).ok_or_else(|| {
        StaticsError::invalid("valley", "the springings cannot be placed on the valley walls")
    })?;
    if form.rib.len() != f.rib_x.len()
        || form.rib.iter().zip(&f.rib_x).any(|(n, x)| (n.x - x).abs() > 1e-9 * f.span() || !n.y.is_finite())
    {
        return Err(StaticsError::invalid(
            "form",
            "the form does not belong to this design (rib nodes differ); find the form again",
        ));
    }
    let topo = Topology::with_shared(&f, form.shared());
    Ok((f, topo))
}

fn add_load(lc: &mut LoadCase, node: usize, fy: f64) {
    if fy == 0.0 {
        return;
    }
    if let Some(l) = lc.nodal.iter_mut().find(|l| l.node == node) {
        l.fy += fy;
    } else {
        lc.nodal.push(NodalLoad { node, fx: 0.0, fy, mz: 0.0 });
    }
}

/// Adds the rib members (left to right, hinged at the crown when three-hinged) and the
/// springing supports; returns the rib member indices.
fn add_rib(b: &mut Builder, design: &Design) -> Vec<usize> {
    let f = b.f;
    let last = f.last_rib();
    let mut members = Vec::new();
    for r in 0..last {
        let (p, q) = (b.joint(Joint::Rib(r)), b.joint(Joint::Rib(r + 1)));
        let k = b.frame_member(format!("rib {}-{}", r, r + 1), "rib", p, q, &design.groups.rib);
        if design.rib_system == RibSystem::ThreeHinged {
            b.model.members[k].release_start = r == f.crown;
            b.model.members[k].release_end = r + 1 == f.crown;
        }
        members.push(k);
    }
    for r in [0, last] {
        let node = b.joint(Joint::Rib(r));
        b.model.supports.push(if design.rib_system == RibSystem::Fixed {
            Support::fixed(node)
        } else {
            Support::pinned(node)
        });
    }
    members
}

/// The frame model of the default layout (title `FRAME_TITLE`).
///
/// Rib and deck are frame members (the rib hinged at the crown node when three-hinged,
/// where the halves meet only at that node); posts, piers and bracing are pin-ended
/// bars; the three-hinged drop-in span is not a member (it ties nothing) and its
/// simple-span reactions are loads on its neighbouring deck nodes; approach spans are
/// simple spans (frame members released at both ends) on pin-ended piers founded on the
/// ground. Springings pinned (fixed for a fixed rib); seats per `restraint`.
///
/// Dead load case "dead": deck line load (kN per horizontal m) on deck and approach members, rib
/// self-weight per metre of rib, posts / piers / bracing self-weight lumped half at each
/// end. Errors: `Invalid` for a design that fails its input checks or a form that does
/// not belong to it.
pub fn frame_model(design: &Design, form: &Form) -> Result<Model, StaticsError> {
    let (f, topo) = prepare(design, form)?;
    let mut b = Builder::new(&f, form, design.deck.ribs, FRAME_TITLE);
    let g = &design.groups;
    let mut lc = LoadCase { name: DEAD.into(), ..LoadCase::default() };
    let w_deck = design.deck_line_load();
    let w_rib = design.weight_per_m(&g.rib);
    for k in add_rib(&mut b, design) {
        if w_rib > 0.0 {
            lc.member.push(gravity(k, w_rib, false));
        }
    }
    // deck over the arch
    for &(p, q) in &topo.deck {
        let name = format!("deck {}-{}", b.label(p), b.label(q));
        let (np, nq) = (b.joint(p), b.joint(q));
        let k = b.frame_member(name, "deck", np, nq, &g.deck);
        if w_deck > 0.0 {
            // per horizontal metre of road (a deck member kinked to a shared node)
            lc.member.push(gravity(k, w_deck, true));
        }
    }
    if let Some((p, q)) = topo.drop_in {
        let (pp, pq) = (position(&f, &b.y, p), position(&f, &b.y, q));
        let half = 0.5 * w_deck * (pq.0 - pp.0);
        let (np, nq) = (b.joint(p), b.joint(q));
        add_load(&mut lc, np, -half);
        add_load(&mut lc, nq, -half);
    }
    let lumped = |b: &mut Builder, lc: &mut LoadCase, s: &Section, np: usize, nq: usize| {
        let w = design.weight_per_m(s) * b.model.member_length(b.model.members.len() - 1);
        add_load(lc, np, -0.5 * w);
        add_load(lc, nq, -0.5 * w);
    };
    for &(i, r) in &topo.posts {
        let (np, nq) = (b.joint(Joint::Deck(i)), b.joint(Joint::Rib(r)));
        let name = if i == 0 {
            "end post L".to_string()
        } else if i == f.panels {
            "end post R".to_string()
        } else {
            format!("post {i}")
        };
        b.truss_member(name, "post", np, nq, &g.posts);
        lumped(&mut b, &mut lc, &g.posts, np, nq);
    }
    for (k, &(p, q)) in topo.diagonals.iter().enumerate() {
        let (np, nq) = (b.joint(p), b.joint(q));
        let name = format!("brace {} {}-{}", k + 1, b.label(p), b.label(q));
        b.truss_member(name, "bracing", np, nq, &g.bracing);
        lumped(&mut b, &mut lc, &g.bracing, np, nq);
    }
    // approach spans on piers: left from the seat to d0, right from dn to the seat
    let rs = restraint(design, form);
    for left in [true, false] {
        let (seat_x, piers, arch_end, side) = if left {
            (f.seats.0, &f.piers_left, Joint::Deck(0), "L")
        } else {
            (f.seats.1, &f.piers_right, Joint::Deck(f.panels), "R")
        };
        let seat = b.model.add_node(format!("seat {side}"), seat_x, f.deck_level);
        let mut chain = vec![seat];
        // piers from the seat towards the arch (`piers_right` runs from the arch outwards)
        let from_seat: Vec<(f64, f64)> =
            if left { piers.clone() } else { piers.iter().rev().copied().collect() };
        for (k, &(x, ground)) in from_seat.iter().enumerate() {
            let top = b.model.add_node(format!("pier {side}{} top", k + 1), x, f.deck_level);
            let foot = b.model.add_node(format!("pier {side}{} foot", k + 1), x, ground);
            b.truss_member(format!("pier {side}{}", k + 1), "pier", top, foot, &g.piers);
            lumped(&mut b, &mut lc, &g.piers, top, foot);
            b.model.supports.push(Support::pinned(foot));
            chain.push(top);
        }
        let end = b.joint(arch_end);
        chain.push(end);
        if !left {
            chain.reverse();
        }
        for (k, w) in chain.windows(2).enumerate() {
            let m = b.frame_member(format!("approach {side}{}", k + 1), "approach", w[0], w[1], &g.deck);
            b.model.members[m].release_start = true;
            b.model.members[m].release_end = true;
            if w_deck > 0.0 {
                lc.member.push(gravity(m, w_deck, false));
            }
        }
        let fixed = if left { rs.left_seat_fixed } else { rs.right_seat_fixed };
        b.model.supports.push(if fixed { Support::pinned(seat) } else { Support::roller_along_x(seat) });
    }
    b.model.load_cases.push(lc);
    Ok(b.model)
}

/// The truss idealisation of braced spandrels (title `TRUSS_TITLE`): every joint pinned,
/// rib and deck as chords, posts and diagonals as the web, end posts on the pinned
/// springings, approach and drop-in spans left out (their reactions are loads). Loads
/// (case "dead") at the joints as `PanelLoads::joint_loads`: deck panel reactions and
/// half of each member's self-weight at each of its ends.
///
/// Its degree of indeterminacy is not assumed: compute it with `truss_determinacy`.
/// Errors: `Invalid` when the spandrels are not braced (an unbraced pin-jointed arch is a
/// mechanism), or as `frame_model`.
pub fn truss_model(design: &Design, form: &Form) -> Result<Model, StaticsError> {
    if !design.bracing.is_braced() {
        return Err(StaticsError::invalid(
            "bracing",
            "the truss idealisation needs braced spandrels: an unbraced pin-jointed arch is a mechanism",
        ));
    }
    let (f, topo) = prepare(design, form)?;
    let mut b = Builder::new(&f, form, design.deck.ribs, TRUSS_TITLE);
    let g = &design.groups;
    let last = f.last_rib();
    for r in 0..last {
        let (p, q) = (b.joint(Joint::Rib(r)), b.joint(Joint::Rib(r + 1)));
        b.truss_member(format!("rib {}-{}", r, r + 1), "rib", p, q, &g.rib);
    }
    for &(p, q) in &topo.deck {
        let name = format!("deck {}-{}", b.label(p), b.label(q));
        let (np, nq) = (b.joint(p), b.joint(q));
        b.truss_member(name, "deck", np, nq, &g.deck);
    }
    for &(i, r) in &topo.posts {
        let (np, nq) = (b.joint(Joint::Deck(i)), b.joint(Joint::Rib(r)));
        b.truss_member(format!("post {i}"), "post", np, nq, &g.posts);
    }
    for (k, &(p, q)) in topo.diagonals.iter().enumerate() {
        let name = format!("brace {} {}-{}", k + 1, b.label(p), b.label(q));
        let (np, nq) = (b.joint(p), b.joint(q));
        b.truss_member(name, "bracing", np, nq, &g.bracing);
    }
    for r in [0, last] {
        let node = b.joint(Joint::Rib(r));
        b.model.supports.push(Support::pinned(node));
    }
    let mut lc = LoadCase { name: DEAD.into(), ..LoadCase::default() };
    let y = b.y.clone();
    for (j, p) in PanelLoads::of(design).joint_loads(&f, &topo, &y) {
        let node = b.joint(j);
        add_load(&mut lc, node, -p);
    }
    b.model.load_cases.push(lc);
    Ok(b.model)
}

/// The bare rib (title `RIB_TITLE`): rib frame members between the rib nodes (hinged at
/// the crown node when three-hinged), springings pinned (fixed for a fixed rib), and the
/// form-finding loads of `form` at every rib node (those at the springings go straight
/// into the supports). Errors as `frame_model`.
pub fn bare_rib_model(design: &Design, form: &Form) -> Result<Model, StaticsError> {
    let (f, _) = prepare(design, form)?;
    let mut b = Builder::new(&f, form, design.deck.ribs, RIB_TITLE);
    add_rib(&mut b, design);
    let mut lc = LoadCase { name: DEAD.into(), ..LoadCase::default() };
    for (r, n) in form.rib.iter().enumerate() {
        let node = b.joint(Joint::Rib(r));
        if !n.load.is_finite() {
            return Err(StaticsError::invalid("form", "a rib node load is not finite"));
        }
        add_load(&mut lc, node, -n.load);
    }
    b.model.load_cases.push(lc);
    Ok(b.model)
}
