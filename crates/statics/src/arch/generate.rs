//! Structure generation: from a validated design to the analysis models of the default
//! layout (see the README, "The layout as built").
//!
//! - [`frame_model`]: deck frame, pin-ended posts, rib, approach spans on pin-ended piers,
//!   bracing, with the longitudinal restraint of the deck of [`restraint`]; the dead load as
//!   member loads (deck, rib) and lumped self-weight of the pin-ended members.
//! - [`truss_model`]: the truss idealisation of braced spandrels (every joint pinned, loads
//!   at the joints as simple-span reactions, drop-in and approach spans left out).
//! - [`bare_rib_model`]: the rib alone on its springings with the form-finding loads at its
//!   nodes.
//!
//! Each comes as a [`Generated`]: the `Model` and its [`ModelMap`], which keeps the
//! identities generation knows: the role of every member ([`MemberRole`]), the model node of
//! every layout joint, the rib members from left to right, the springing and crown nodes.
//! Later stages look parts up there, never by coordinates or group names. A member's
//! `group` in the model is its role's name ("rib", "deck", "post", "pier", "bracing",
//! "approach"), so model files read as before.
//!
//! Units m, kN, kN/m2; loads y up (gravity negative); section properties are the design's
//! per-rib-line values times the number of ribs. One load case, "dead".

use crate::arch::design::{RibSystem, Section};
use crate::arch::form::PanelLoads;
use crate::arch::layout::{position, Joint, Layout};
use crate::arch::validate::ValidDesign;
use crate::error::GroupName;
use crate::frame::model::{frame, truss, LoadCase, LoadDirection, MemberLoad, Model, NodalLoad, Support};
use crate::geom::Point;
use serde::{Deserialize, Serialize};
use std::fmt;

/// A downward uniform load of `w` kN/m on `member`, per metre of member length or, when
/// `per_horizontal_metre`, per horizontal metre.
fn gravity(member: usize, w: f64, per_horizontal_metre: bool) -> MemberLoad {
    MemberLoad::Uniform { member, w: -w, direction: LoadDirection::GlobalY, projected: per_horizontal_metre }
}

/// Name of the dead load case in every generated model.
pub const DEAD: &str = "dead";

/// The part a member plays in a deck arch.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum MemberRole {
    /// A rib segment between two rib nodes.
    Rib,
    /// A deck member over the arch.
    Deck,
    /// A spandrel post or an end post (deck to rib).
    Post,
    /// An approach pier (deck to ground).
    Pier,
    /// A bracing diagonal of a spandrel panel.
    Bracing,
    /// An approach span (simple span between seat, piers and end post).
    Approach,
}

impl MemberRole {
    /// Every role.
    pub const ALL: [MemberRole; 6] = [
        MemberRole::Rib,
        MemberRole::Deck,
        MemberRole::Post,
        MemberRole::Pier,
        MemberRole::Bracing,
        MemberRole::Approach,
    ];

    /// The role's name, also the member `group` in a generated model.
    pub fn key(self) -> &'static str {
        match self {
            MemberRole::Rib => "rib",
            MemberRole::Deck => "deck",
            MemberRole::Post => "post",
            MemberRole::Pier => "pier",
            MemberRole::Bracing => "bracing",
            MemberRole::Approach => "approach",
        }
    }

    /// The design's member group whose section the member has (approach spans are deck
    /// girders).
    pub fn section_group(self) -> GroupName {
        match self {
            MemberRole::Rib => GroupName::Rib,
            MemberRole::Deck | MemberRole::Approach => GroupName::Deck,
            MemberRole::Post => GroupName::Posts,
            MemberRole::Pier => GroupName::Piers,
            MemberRole::Bracing => GroupName::Bracing,
        }
    }
}

impl fmt::Display for MemberRole {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.key())
    }
}

/// Which of the generated models a model is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum ModelKind {
    /// Deck frame, posts, rib, approach spans on piers.
    Frame,
    /// Braced spandrels, every joint pinned.
    Truss,
    /// The rib alone on its springings.
    BareRib,
}

impl ModelKind {
    /// The model's short name ("frame model", "truss idealisation", "bare rib").
    pub fn name(self) -> &'static str {
        match self {
            ModelKind::Frame => "frame model",
            ModelKind::Truss => "truss idealisation",
            ModelKind::BareRib => "bare rib",
        }
    }

    /// The model's title, saying what it is.
    pub const fn title(self) -> &'static str {
        match self {
            ModelKind::Frame => "frame model: deck frame, posts, rib, approach spans on piers",
            ModelKind::Truss => "truss idealisation: braced spandrels, every joint pinned",
            ModelKind::BareRib => "bare rib: rib alone on its springings, form-finding loads at its nodes",
        }
    }
}

impl fmt::Display for ModelKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

/// Title of the frame model.
pub const FRAME_TITLE: &str = ModelKind::Frame.title();
/// Title of the truss idealisation.
pub const TRUSS_TITLE: &str = ModelKind::Truss.title();
/// Title of the bare rib model.
pub const RIB_TITLE: &str = ModelKind::BareRib.title();

/// What generation knows about the parts of a model (indices into the model).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModelMap {
    /// The role of every member, in member order.
    pub roles: Vec<MemberRole>,
    /// The model node of every rib node, from the left springing to the right one.
    pub rib_nodes: Vec<usize>,
    /// The model node of the deck joint over each panel point (`None` where the model has
    /// none: a node shared with the rib, the three-hinged crown, the bare rib).
    pub deck_nodes: Vec<Option<usize>>,
    /// The rib members from left to right; member k runs from rib node k to k + 1.
    pub rib_members: Vec<usize>,
    /// Left and right springing nodes.
    pub springings: [usize; 2],
    /// The rib's crown node.
    pub crown: usize,
    /// Left and right abutment seat nodes (frame model only).
    pub seats: Option<[usize; 2]>,
    /// The layout joints at the start and end of every member, in member order (`None`
    /// for members with an end that is no layout joint: approach spans and piers). The
    /// same pair names the same member in every model that has it.
    pub member_joints: Vec<Option<[Joint; 2]>>,
}

impl ModelMap {
    /// The model node of layout joint `j`, if the model has one there.
    pub fn node_of(&self, j: Joint) -> Option<usize> {
        match j {
            Joint::Rib(r) => self.rib_nodes.get(r).copied(),
            Joint::Deck(i) => self.deck_nodes.get(i).copied().flatten(),
        }
    }

    /// The members with role `role`, in member order.
    pub fn members_with(&self, role: MemberRole) -> impl Iterator<Item = usize> + '_ {
        self.roles.iter().enumerate().filter(move |(_, r)| **r == role).map(|(k, _)| k)
    }

    /// The member between layout joints `a` and `b` (either order) with role `role`.
    pub fn member_between(&self, role: MemberRole, a: Joint, b: Joint) -> Option<usize> {
        self.member_joints.iter().zip(&self.roles).position(|(ends, r)| {
            *r == role && ends.is_some_and(|[p, q]| (p == a && q == b) || (p == b && q == a))
        })
    }

    /// The rib chain as the graphic layer takes it: (member, runs left to right).
    pub fn rib_chain(&self) -> Vec<(usize, bool)> {
        self.rib_members.iter().map(|&k| (k, true)).collect()
    }
}

/// A generated model with what generation knows about its parts.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Generated {
    /// Which model this is.
    pub kind: ModelKind,
    /// The analysis model.
    pub model: Model,
    /// Roles and joint identities.
    pub map: ModelMap,
}

/// Who holds the deck longitudinally in the frame model.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum DeckHold {
    /// Three-hinged and braced: both seats slide, each half held by its bracing.
    EachHalfByItsBracing,
    /// Three-hinged, unbraced: each half held by its own fixed seat.
    EachHalfByItsSeat,
    /// Rib and deck share the crown node, which holds the deck; both seats slide.
    SharedCrownNode,
    /// The left seat holds the deck; the right seat slides.
    LeftSeat,
}

impl fmt::Display for DeckHold {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            DeckHold::EachHalfByItsBracing => {
                "both abutment seats slide; each half of the deck is held longitudinally by its bracing"
            }
            DeckHold::EachHalfByItsSeat => {
                "each half of the deck is held longitudinally by its own fixed abutment seat"
            }
            DeckHold::SharedCrownNode => {
                "rib and deck share the crown node, which holds the deck; both abutment seats slide (symmetric)"
            }
            DeckHold::LeftSeat => {
                "the left abutment seat holds the deck longitudinally (fixed); the right seat slides"
            }
        })
    }
}

/// How the deck is held longitudinally in the frame model.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Restraint {
    /// The left abutment seat holds the deck horizontally.
    pub left_seat_fixed: bool,
    /// The right abutment seat holds the deck horizontally.
    pub right_seat_fixed: bool,
    /// Who holds the deck.
    pub held_by: DeckHold,
}

/// The longitudinal restraint of the deck: three-hinged braced: both seats free (each half
/// held by its bracing); three-hinged unbraced: both seats fixed (each half by its own
/// seat); two-hinged and fixed: both seats free when rib and deck share the crown node
/// (symmetric), otherwise the left seat is fixed.
pub fn restraint(valid: &ValidDesign) -> Restraint {
    let design = valid.design();
    let form = valid.form();
    let crown_shared = form.rib.get(form.crown_node).is_some_and(|n| n.shared_with_deck);
    let (left_seat_fixed, right_seat_fixed, held_by) =
        match (design.rib_system, design.bracing.is_braced(), crown_shared) {
            (RibSystem::ThreeHinged, true, _) => (false, false, DeckHold::EachHalfByItsBracing),
            (RibSystem::ThreeHinged, false, _) => (true, true, DeckHold::EachHalfByItsSeat),
            (_, _, true) => (false, false, DeckHold::SharedCrownNode),
            (_, _, false) => (true, false, DeckHold::LeftSeat),
        };
    Restraint { left_seat_fixed, right_seat_fixed, held_by }
}

struct Builder<'a> {
    f: &'a Layout,
    y: Vec<f64>,
    model: Model,
    roles: Vec<MemberRole>,
    deck: Vec<Option<usize>>,
    rib: Vec<Option<usize>>,
    rib_members: Vec<usize>,
    ribs: f64,
    alpha: f64,
}

impl<'a> Builder<'a> {
    fn new(valid: &'a ValidDesign, kind: ModelKind) -> Self {
        let f = valid.layout();
        Builder {
            f,
            y: valid.form().rib_y(),
            model: Model { title: kind.title().into(), ..Model::default() },
            roles: Vec::new(),
            deck: vec![None; f.panels + 1],
            rib: vec![None; f.rib_x.len()],
            rib_members: Vec::new(),
            ribs: valid.design().deck.ribs as f64,
            alpha: valid.design().actions.temperature.alpha,
        }
    }
    fn joint(&mut self, j: Joint) -> usize {
        let last = self.f.last_rib();
        match j {
            Joint::Rib(r) => {
                if let Some(&Some(k)) = self.rib.get(r) {
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
                let at = position(self.f, &self.y, j);
                let k = self.model.add_node(name, at.x, at.y);
                if let Some(slot) = self.rib.get_mut(r) {
                    *slot = Some(k);
                }
                k
            }
            Joint::Deck(i) => {
                if let Some(&Some(k)) = self.deck.get(i) {
                    return k;
                }
                let at = position(self.f, &self.y, j);
                let k = self.model.add_node(format!("d{i}"), at.x, at.y);
                if let Some(slot) = self.deck.get_mut(i) {
                    *slot = Some(k);
                }
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
    fn frame_member(&mut self, name: String, role: MemberRole, a: usize, b: usize, s: &Section) -> usize {
        self.roles.push(role);
        let mut m = frame(&name, role.key(), a, b, s.e, s.a * self.ribs, s.i * self.ribs);
        m.alpha = self.alpha;
        self.model.add_member(m)
    }
    fn truss_member(&mut self, name: String, role: MemberRole, a: usize, b: usize, s: &Section) -> usize {
        let mut m = truss(&name, role.key(), a, b, s.e, s.a * self.ribs);
        m.i = s.i * self.ribs;
        m.alpha = self.alpha;
        self.roles.push(role);
        self.model.add_member(m)
    }
    fn finish(self, kind: ModelKind, seats: Option<[usize; 2]>) -> Generated {
        let last = self.f.last_rib();
        // every rib node is made by the rib members, which every model has
        let rib_nodes: Vec<usize> = self.rib.iter().map(|k| k.unwrap_or(usize::MAX)).collect();
        // model node -> layout joint, to name every member by the joints at its ends
        let mut joint_at: Vec<Option<Joint>> = vec![None; self.model.nodes.len()];
        let joints = self.rib.iter().enumerate().map(|(r, k)| (*k, Joint::Rib(r)));
        for (k, joint) in joints.chain(self.deck.iter().enumerate().map(|(i, k)| (*k, Joint::Deck(i)))) {
            if let Some(slot) = k.and_then(|k| joint_at.get_mut(k)) {
                *slot = Some(joint);
            }
        }
        let joint_of = |node: usize| joint_at.get(node).copied().flatten();
        let member_joints =
            self.model.members.iter().map(|m| Some([joint_of(m.start)?, joint_of(m.end)?])).collect();
        let rib_node = |r: usize| rib_nodes.get(r).copied().unwrap_or(usize::MAX);
        let map = ModelMap {
            roles: self.roles,
            springings: [rib_node(0), rib_node(last)],
            crown: rib_node(self.f.crown),
            rib_nodes,
            deck_nodes: self.deck,
            rib_members: self.rib_members,
            seats,
            member_joints,
        };
        Generated { kind, model: self.model, map }
    }
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
/// springing supports.
fn add_rib(b: &mut Builder, valid: &ValidDesign) {
    let design = valid.design();
    let f = b.f;
    let last = f.last_rib();
    for r in 0..last {
        let (p, q) = (b.joint(Joint::Rib(r)), b.joint(Joint::Rib(r + 1)));
        let k = b.frame_member(format!("rib {}-{}", r, r + 1), MemberRole::Rib, p, q, &design.groups.rib);
        if let (RibSystem::ThreeHinged, Some(m)) = (design.rib_system, b.model.members.get_mut(k)) {
            m.release_start = r == f.crown;
            m.release_end = r + 1 == f.crown;
        }
        b.rib_members.push(k);
    }
    for r in [0, last] {
        let node = b.joint(Joint::Rib(r));
        b.model.supports.push(if design.rib_system == RibSystem::Fixed {
            Support::fixed(node)
        } else {
            Support::pinned(node)
        });
    }
}

/// The model `kind` of a validated design: [`frame_model`], [`truss_model`] (`None` for
/// an unbraced design, which has no truss idealisation) or [`bare_rib_model`].
pub fn model_of(valid: &ValidDesign, kind: ModelKind) -> Option<Generated> {
    match kind {
        ModelKind::Frame => Some(frame_model(valid)),
        ModelKind::Truss => truss_model(valid),
        ModelKind::BareRib => Some(bare_rib_model(valid)),
    }
}

/// The frame model of the default layout (title [`FRAME_TITLE`]).
///
/// Rib and deck are frame members (the rib hinged at the crown node when three-hinged,
/// where the halves meet only at that node); posts, piers and bracing are pin-ended
/// bars; the three-hinged drop-in span is not a member (it ties nothing) and its
/// simple-span reactions are loads on its neighbouring deck nodes; approach spans are
/// simple spans (frame members released at both ends) on pin-ended piers founded on the
/// ground. Springings pinned (fixed for a fixed rib); seats per [`restraint`].
///
/// Dead load case "dead": deck line load (kN per horizontal m) on deck and approach
/// members, rib self-weight per metre of rib, posts / piers / bracing self-weight lumped
/// half at each end.
pub fn frame_model(valid: &ValidDesign) -> Generated {
    let design = valid.design();
    let topo = valid.topology();
    let mut b = Builder::new(valid, ModelKind::Frame);
    let f = b.f;
    let g = &design.groups;
    let mut lc = LoadCase { name: DEAD.into(), ..LoadCase::default() };
    let w_deck = design.deck_line_load();
    let w_rib = design.weight_per_m(&g.rib);
    add_rib(&mut b, valid);
    if w_rib > 0.0 {
        lc.member.extend(b.rib_members.iter().map(|&k| gravity(k, w_rib, false)));
    }
    // deck over the arch
    for &(p, q) in &topo.deck {
        let name = format!("deck {}-{}", b.label(p), b.label(q));
        let (np, nq) = (b.joint(p), b.joint(q));
        let k = b.frame_member(name, MemberRole::Deck, np, nq, &g.deck);
        if w_deck > 0.0 {
            // per horizontal metre of road (a deck member kinked to a shared node)
            lc.member.push(gravity(k, w_deck, true));
        }
    }
    if let Some((p, q)) = topo.drop_in {
        let (pp, pq) = (position(f, &b.y, p), position(f, &b.y, q));
        let half = 0.5 * w_deck * (pq.x - pp.x);
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
        b.truss_member(name, MemberRole::Post, np, nq, &g.posts);
        lumped(&mut b, &mut lc, &g.posts, np, nq);
    }
    for (k, &(p, q)) in topo.diagonals.iter().enumerate() {
        let (np, nq) = (b.joint(p), b.joint(q));
        let name = format!("brace {} {}-{}", k + 1, b.label(p), b.label(q));
        b.truss_member(name, MemberRole::Bracing, np, nq, &g.bracing);
        lumped(&mut b, &mut lc, &g.bracing, np, nq);
    }
    // approach spans on piers: left from the seat to d0, right from dn to the seat
    let rs = restraint(valid);
    let mut seats = [0; 2];
    for (side_index, left) in [true, false].into_iter().enumerate() {
        let (seat_x, piers, arch_end, side) = if left {
            (f.seats.0, &f.piers_left, Joint::Deck(0), "L")
        } else {
            (f.seats.1, &f.piers_right, Joint::Deck(f.panels), "R")
        };
        let seat = b.model.add_node(format!("seat {side}"), seat_x, f.deck_level);
        if let Some(slot) = seats.get_mut(side_index) {
            *slot = seat;
        }
        let mut chain = vec![seat];
        // piers from the seat towards the arch (`piers_right` runs from the arch outwards)
        let from_seat: Vec<Point> = if left { piers.clone() } else { piers.iter().rev().copied().collect() };
        for (k, foot) in from_seat.iter().enumerate() {
            let top = b.model.add_node(format!("pier {side}{} top", k + 1), foot.x, f.deck_level);
            let foot = b.model.add_node(format!("pier {side}{} foot", k + 1), foot.x, foot.y);
            b.truss_member(format!("pier {side}{}", k + 1), MemberRole::Pier, top, foot, &g.piers);
            lumped(&mut b, &mut lc, &g.piers, top, foot);
            b.model.supports.push(Support::pinned(foot));
            chain.push(top);
        }
        let end = b.joint(arch_end);
        chain.push(end);
        if !left {
            chain.reverse();
        }
        for (k, (&from, &to)) in chain.iter().zip(chain.iter().skip(1)).enumerate() {
            let m =
                b.frame_member(format!("approach {side}{}", k + 1), MemberRole::Approach, from, to, &g.deck);
            if let Some(member) = b.model.members.get_mut(m) {
                // a simple span: released at both ends
                member.release_start = true;
                member.release_end = true;
            }
            if w_deck > 0.0 {
                lc.member.push(gravity(m, w_deck, false));
            }
        }
        let fixed = if left { rs.left_seat_fixed } else { rs.right_seat_fixed };
        b.model.supports.push(if fixed { Support::pinned(seat) } else { Support::roller_along_x(seat) });
    }
    b.model.load_cases.push(lc);
    b.finish(ModelKind::Frame, Some(seats))
}

/// The truss idealisation of braced spandrels (title [`TRUSS_TITLE`]): every joint pinned,
/// rib and deck as chords, posts and diagonals as the web, end posts on the pinned
/// springings, approach and drop-in spans left out (their reactions are loads). Loads
/// (case "dead") at the joints as `PanelLoads::joint_loads`: deck panel reactions and
/// half of each member's self-weight at each of its ends.
///
/// Its degree of indeterminacy is not assumed: compute it with `truss_determinacy`.
/// `None` when the spandrels are not braced (an unbraced pin-jointed arch is a
/// mechanism).
pub fn truss_model(valid: &ValidDesign) -> Option<Generated> {
    let design = valid.design();
    if !design.bracing.is_braced() {
        return None;
    }
    let topo = valid.topology();
    let mut b = Builder::new(valid, ModelKind::Truss);
    let f = b.f;
    let g = &design.groups;
    let last = f.last_rib();
    for r in 0..last {
        let (p, q) = (b.joint(Joint::Rib(r)), b.joint(Joint::Rib(r + 1)));
        let k = b.truss_member(format!("rib {}-{}", r, r + 1), MemberRole::Rib, p, q, &g.rib);
        b.rib_members.push(k);
    }
    for &(p, q) in &topo.deck {
        let name = format!("deck {}-{}", b.label(p), b.label(q));
        let (np, nq) = (b.joint(p), b.joint(q));
        b.truss_member(name, MemberRole::Deck, np, nq, &g.deck);
    }
    for &(i, r) in &topo.posts {
        let (np, nq) = (b.joint(Joint::Deck(i)), b.joint(Joint::Rib(r)));
        b.truss_member(format!("post {i}"), MemberRole::Post, np, nq, &g.posts);
    }
    for (k, &(p, q)) in topo.diagonals.iter().enumerate() {
        let name = format!("brace {} {}-{}", k + 1, b.label(p), b.label(q));
        let (np, nq) = (b.joint(p), b.joint(q));
        b.truss_member(name, MemberRole::Bracing, np, nq, &g.bracing);
    }
    for r in [0, last] {
        let node = b.joint(Joint::Rib(r));
        b.model.supports.push(Support::pinned(node));
    }
    let mut lc = LoadCase { name: DEAD.into(), ..LoadCase::default() };
    let y = b.y.clone();
    for (j, p) in PanelLoads::of(design).joint_loads(f, topo, &y) {
        let node = b.joint(j);
        add_load(&mut lc, node, -p);
    }
    b.model.load_cases.push(lc);
    Some(b.finish(ModelKind::Truss, None))
}

/// The bare rib (title [`RIB_TITLE`]): rib frame members between the rib nodes (hinged at
/// the crown node when three-hinged), springings pinned (fixed for a fixed rib), and the
/// form-finding loads at every rib node, with their horizontal components on the "as
/// built" basis (those at the springings go straight into the supports).
pub fn bare_rib_model(valid: &ValidDesign) -> Generated {
    let mut b = Builder::new(valid, ModelKind::BareRib);
    add_rib(&mut b, valid);
    let mut lc = LoadCase { name: DEAD.into(), ..LoadCase::default() };
    for (r, n) in valid.form().rib.iter().enumerate() {
        let node = b.joint(Joint::Rib(r));
        add_load(&mut lc, node, -n.load);
        if n.load_x != 0.0 {
            if let Some(l) = lc.nodal.iter_mut().find(|l| l.node == node) {
                l.fx += n.load_x;
            } else {
                lc.nodal.push(NodalLoad { node, fx: n.load_x, fy: 0.0, mz: 0.0 });
            }
        }
    }
    b.model.load_cases.push(lc);
    b.finish(ModelKind::BareRib, None)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::analysis::bracing_ratio;
    use crate::arch::design::{Bracing, Crown, Design};
    use crate::arch::edit::largest_rise;
    use crate::frame::determinacy::{truss_determinacy, Determinacy};
    use crate::frame::solver::solve;

    /// The demo with its crown at `level`, m.
    fn demo_with_crown_at(level: f64) -> Design {
        let mut d = Design::demo();
        d.crown = Crown::Level { level };
        d
    }

    /// The demo mirrored about x = 85 m (the middle of its valley, -10 to 180 m): valley,
    /// springing levels, seats and approach piers change sides.
    fn mirrored_demo() -> Design {
        let mut d = Design::demo();
        let mirror = |x: f64| 170.0 - x;
        d.valley.reverse();
        for p in &mut d.valley {
            p.x = mirror(p.x);
        }
        (d.springing_left_level, d.springing_right_level) = (d.springing_right_level, d.springing_left_level);
        (d.deck.left_seat_x, d.deck.right_seat_x) = (mirror(d.deck.right_seat_x), mirror(d.deck.left_seat_x));
        (d.approach_piers_left, d.approach_piers_right) = (d.approach_piers_right, d.approach_piers_left);
        d
    }

    /// What the truss idealisation of a valid braced design must satisfy: not a mechanism,
    /// and where determinate and three-hinged its dead-load solution is the found form
    /// (the rib funicular of the same joint loads), so the bracing carries nothing: its
    /// largest |N| within `ZERO_FORCE` (1e-9) of the largest |N| of any bar.
    fn assert_truss_braced(d: &Design, what: &str) -> Determinacy {
        let v = ValidDesign::new(d).unwrap_or_else(|e| panic!("{what}: valid, got {e}"));
        let truss = truss_model(&v).expect("braced");
        let report = truss_determinacy(&truss.model).expect("a valid model");
        assert!(
            !matches!(report.determinacy, Determinacy::Mechanism { .. }),
            "{what}: {}",
            report.describe()
        );
        if report.determinacy == Determinacy::Determinate && d.rib_system == RibSystem::ThreeHinged {
            let solution = solve(&truss.model).unwrap_or_else(|e| panic!("{what}: solves, got {e}"));
            let ratio = bracing_ratio(&truss.map, &solution).expect("bracing and forces");
            assert!(
                ratio < crate::tolerance::ZERO_FORCE,
                "{what}: bracing carries {ratio:e} of the largest force"
            );
        }
        report.determinacy
    }

    /// Regression: from rise 21.0 m (crown level 99.0 m) the rib node right of the
    /// three-hinged crown merged with the deck (post 7 would be shorter than the shortest
    /// post); the crown panel's diagonal then lay along the rib and was left out, the crown
    /// hung on one rib bar from that side and the truss idealisation was a mechanism (43
    /// bars, 24 nodes: 1 mode at the crown), so no force diagram while dragging the crown
    /// up. The crown is now braced from the next rib node out.
    #[test]
    fn the_demo_truss_stays_braced_when_a_node_beside_the_crown_merges() {
        // chord level at the crown 78 m: rises 19.5, 20.5, 21.0, 21.3, 21.7 m
        for level in [97.5, 98.5, 99.0, 99.3, 99.7] {
            let d = demo_with_crown_at(level);
            let what = format!("crown level {level} m");
            assert_eq!(assert_truss_braced(&d, &what), Determinacy::Determinate, "{what}");
            let v = ValidDesign::new(&d).expect("valid");
            let (f, t) = (v.layout(), v.topology());
            let crown = Joint::Rib(f.crown);
            if level < 99.0 {
                // nothing merges: the layout as described, every diagonal from a deck node,
                // the crown panels braced from d5 and d7 (so the frame model is as before)
                assert!(t.shared.is_empty(), "{what}: {:?}", t.shared);
                assert_eq!(t.diagonals.len(), 12);
                assert!(t.diagonals.iter().all(|&(p, q)| matches!((p, q), (Joint::Deck(_), Joint::Rib(_)))));
                assert!(t.diagonals.contains(&(Joint::Deck(5), crown)));
                assert!(t.diagonals.contains(&(Joint::Deck(7), crown)));
            } else {
                // rib node 7 (right of the crown, the higher springing's side) shares the
                // deck: the right crown panel is braced from rib node 8
                assert!(t.shared.contains(&7), "{what}: {:?}", t.shared);
                assert!(!t.posts.iter().any(|&(i, _)| i == 7));
                assert!(t.diagonals.contains(&(Joint::Rib(8), crown)), "{what}: {:?}", t.diagonals);
                assert!(!t.diagonals.contains(&(Joint::Deck(7), crown)));
                // rib node 5 merges too at 99.7 m (post 5 would be 0.68 m, see the CLI's form)
                let left = if t.shared.contains(&5) { Joint::Rib(4) } else { Joint::Deck(5) };
                assert!(t.diagonals.contains(&(left, crown)), "{what}: {:?}", t.diagonals);
            }
        }
    }

    /// Over the top half metre of rises the layout takes (where the nodes beside the crown
    /// merge with the deck one after the other), on the demo and on the demo mirrored, the
    /// truss idealisation is never a mechanism and, determinate, carries the dead load in
    /// the rib alone.
    #[test]
    fn the_truss_is_braced_up_to_the_largest_rise() {
        for (name, d) in [("demo", Design::demo()), ("mirrored demo", mirrored_demo())] {
            let top = largest_rise(&d).expect("valid").rise;
            for k in 0..=20 {
                let mut d = d.clone();
                d.set_rise(top - 0.025 * (20 - k) as f64);
                assert_truss_braced(&d, &format!("{name}, rise {:.3} m", d.rise()));
            }
        }
    }

    /// Every identity the map keeps points at the part it names, for every rib system,
    /// bracing and an odd and even panel count.
    #[test]
    fn the_map_names_what_generation_built() {
        for system in [RibSystem::ThreeHinged, RibSystem::TwoHinged, RibSystem::Fixed] {
            for bracing in [Bracing::None, Bracing::Single { flipped: true }, Bracing::Crossed] {
                for panels in [7, 12] {
                    let mut d = Design::demo();
                    (d.rib_system, d.bracing, d.panels) = (system, bracing, panels);
                    let v = ValidDesign::new(&d).expect("valid");
                    let (form, layout) = (v.form(), v.layout());
                    let models = [Some(frame_model(&v)), truss_model(&v), Some(bare_rib_model(&v))];
                    for g in models.into_iter().flatten() {
                        let (m, map) = (&g.model, &g.map);
                        assert_eq!(map.roles.len(), m.members.len());
                        for (member, role) in m.members.iter().zip(&map.roles) {
                            assert_eq!(member.group, role.key());
                        }
                        for (r, &node) in map.rib_nodes.iter().enumerate() {
                            assert_eq!((m.nodes[node].x, m.nodes[node].y), (form.rib[r].x, form.rib[r].y));
                        }
                        for (i, node) in map.deck_nodes.iter().enumerate() {
                            if let Some(node) = *node {
                                let n = &m.nodes[node];
                                assert_eq!((n.x, n.y), (layout.panel_x[i], d.deck.level), "{}", g.kind);
                            }
                        }
                        // the rib chain runs left to right, member k from rib node k to k + 1
                        for (k, &member) in map.rib_members.iter().enumerate() {
                            assert_eq!(map.roles[member], MemberRole::Rib);
                            let mm = &m.members[member];
                            assert_eq!((mm.start, mm.end), (map.rib_nodes[k], map.rib_nodes[k + 1]));
                        }
                        assert_eq!(map.members_with(MemberRole::Rib).count(), map.rib_members.len());
                        assert_eq!(map.springings, [map.rib_nodes[0], map.rib_nodes[form.rib.len() - 1]]);
                        assert_eq!(map.crown, map.rib_nodes[form.crown_node]);
                        assert_eq!(map.seats.is_some(), g.kind == ModelKind::Frame);
                        // the joints of every member are the nodes at its ends
                        assert_eq!(map.member_joints.len(), m.members.len());
                        for (k, ends) in map.member_joints.iter().enumerate() {
                            let Some([p, q]) = *ends else {
                                assert!(matches!(map.roles[k], MemberRole::Pier | MemberRole::Approach));
                                continue;
                            };
                            assert_eq!(map.node_of(p), Some(m.members[k].start));
                            assert_eq!(map.node_of(q), Some(m.members[k].end));
                            assert_eq!(map.member_between(map.roles[k], q, p), Some(k));
                        }
                    }
                }
            }
        }
    }
}
