//! What one member carries in each model it belongs to: the frame model's axial force
//! (and, for rib and deck, bending moment) and the truss idealisation's axial force, for
//! all rib lines together and per rib line, in one load case.
//!
//! The plane models carry every rib line together (section properties are per rib line
//! times the number of ribs, see `generate`), so a member force of a model is the force of
//! the whole cross-section; per rib line it is that divided by the number of ribs (equal
//! sharing between identical ribs, the models' own assumption).
//!
//! A member is named independently of the model by a [`MemberKey`]: its role and the
//! layout joints at its ends, so the diagonal hovered in the elevation (frame model) is
//! the same diagonal in the force diagram (truss idealisation). Approach spans and piers
//! end at nodes that are no layout joint and exist in the frame model only.
//!
//! Units kN and kNm inside; N tension positive, M positive when the right-hand fibre
//! (start to end) is in tension. Values below the solver's zero (`ZERO_FORCE` of the
//! case's largest force) are reported as exactly 0.

use crate::arch::analysis::{drawn_case, Analysis};
use crate::arch::cases::CaseKind;
use crate::arch::generate::{MemberRole, ModelKind, ModelMap};
use crate::arch::layout::Joint;
use crate::frame::results::{CaseResult, EquilibriumCheck};
use crate::tolerance::ZERO_FORCE;
use crate::units::{Quantity, Units};
use serde::Serialize;
use std::fmt;

/// A member named independently of the model that holds it.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum MemberKey {
    /// A member between two layout joints (start, end as in the models).
    Between {
        /// Its role.
        role: MemberRole,
        /// The layout joints at its start and end.
        ends: [Joint; 2],
    },
    /// A member only the frame model has (approach span, pier): its index there.
    FrameOnly {
        /// Its role.
        role: MemberRole,
        /// Index into the frame model's members.
        member: usize,
    },
}

impl MemberKey {
    /// The key of member `member` of the model `kind` mapped by `map`; `None` when the
    /// index is out of range or the member has no layout joints outside the frame model.
    pub fn of(map: &ModelMap, kind: ModelKind, member: usize) -> Option<MemberKey> {
        let role = *map.roles.get(member)?;
        match map.member_joints.get(member).copied().flatten() {
            Some(ends) => Some(MemberKey::Between { role, ends }),
            None if kind == ModelKind::Frame => Some(MemberKey::FrameOnly { role, member }),
            None => None,
        }
    }

    /// The member's role.
    pub fn role(&self) -> MemberRole {
        match *self {
            MemberKey::Between { role, .. } | MemberKey::FrameOnly { role, .. } => role,
        }
    }

    /// The index of this member in the model `kind` mapped by `map`, `None` when that
    /// model does not have it.
    pub fn member_in(&self, map: &ModelMap, kind: ModelKind) -> Option<usize> {
        match *self {
            MemberKey::Between { role, ends } => map.member_between(role, ends[0], ends[1]),
            MemberKey::FrameOnly { role, member } => {
                (kind == ModelKind::Frame && map.roles.get(member) == Some(&role)).then_some(member)
            }
        }
    }
}

/// Joints as the model files name their nodes: deck point i is "d{i}", rib node r "r{r}".
fn joint_name(j: Joint) -> String {
    match j {
        Joint::Deck(i) => format!("d{i}"),
        Joint::Rib(r) => format!("r{r}"),
    }
}

impl fmt::Display for MemberKey {
    /// "bracing d2–r3" (role and the joints at its ends); "pier (frame member 31)" for a
    /// member of the frame model only.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match *self {
            MemberKey::Between { role, ends } => {
                write!(f, "{role} {}–{}", joint_name(ends[0]), joint_name(ends[1]))
            }
            MemberKey::FrameOnly { role, member } => write!(f, "{role} (frame member {member})"),
        }
    }
}

/// Bending moments of a frame member, kNm (whole cross-section).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Moments {
    /// At the start node.
    pub start: f64,
    /// At the end node.
    pub end: f64,
    /// The moment of largest magnitude along the member (its stations), signed.
    pub largest: f64,
}

/// What a member carries in one model, one load case, all rib lines together.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ModelForces {
    /// The model.
    pub model: ModelKind,
    /// The member's index in that model.
    pub member: usize,
    /// Axial force at the start, kN, tension positive.
    pub n_start: f64,
    /// Axial force at the end, kN, tension positive.
    pub n_end: f64,
    /// Bending moments (frame model, rib and deck members only).
    pub moments: Option<Moments>,
}

/// Whether a model carries the member.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(tag = "state", rename_all = "snake_case")]
pub enum InModel {
    /// The model has the member: its forces.
    Carries(ModelForces),
    /// The model has no such member (approach spans, piers and the drop-in span are not in
    /// the truss idealisation).
    Absent,
    /// The model has it but could not be solved (a truss that is a mechanism).
    Unsolved,
}

/// What one member carries in every model it belongs to.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Readout {
    /// The member.
    pub key: MemberKey,
    /// Load case index (into `Analysis::load_cases`).
    pub case: usize,
    /// The case in words ([`CaseKind::title`]).
    pub case_title: String,
    /// Number of rib lines sharing the forces.
    pub ribs: usize,
    /// In the frame model.
    pub frame: InModel,
    /// In the truss idealisation; `None` when the design has none (unbraced).
    pub truss: Option<InModel>,
}

/// `v` or exactly 0 when it is below the solver's zero for a case whose largest force is
/// `reference` (moments: `reference` times the model's characteristic length).
fn clean(v: f64, reference: f64) -> f64 {
    if v.abs() <= ZERO_FORCE * reference {
        0.0
    } else {
        v
    }
}

/// What `member` carries in `case`; `None` when the case has no such member.
fn forces_in(kind: ModelKind, member: usize, case: &CaseResult, role: MemberRole) -> Option<ModelForces> {
    let EquilibriumCheck { reference, characteristic_length, .. } = case.equilibrium;
    let f = case.members.get(member)?;
    let bends = kind == ModelKind::Frame && matches!(role, MemberRole::Rib | MemberRole::Deck);
    let m_ref = reference * characteristic_length;
    let moments = bends.then(|| {
        let largest = f
            .stations
            .iter()
            .map(|s| s.forces.m)
            .chain([f.start.m, f.end.m])
            .max_by(|a, b| a.abs().total_cmp(&b.abs()))
            .unwrap_or(0.0);
        Moments { start: clean(f.start.m, m_ref), end: clean(f.end.m, m_ref), largest: clean(largest, m_ref) }
    });
    Some(ModelForces {
        model: kind,
        member,
        n_start: clean(f.start.n, reference),
        n_end: clean(f.end.n, reference),
        moments,
    })
}

/// What member `key` carries in load case `case` (index into `Analysis::load_cases`; the
/// models hold their cases in that order) in the frame model and, for braced designs, in
/// the truss idealisation; forces for all `ribs` rib lines together. A case index out of
/// range reads the dead load (case 0).
pub fn readout(analysis: &Analysis, ribs: usize, key: &MemberKey, case: usize) -> Readout {
    let frame_cases = &analysis.frame.solution.cases;
    let case = drawn_case(case, frame_cases.len());
    let role = key.role();
    let frame = match (key.member_in(&analysis.frame.map, ModelKind::Frame), frame_cases.get(case)) {
        (Some(k), Some(c)) => {
            forces_in(ModelKind::Frame, k, c, role).map_or(InModel::Absent, InModel::Carries)
        }
        _ => InModel::Absent,
    };
    let truss = analysis.truss.as_ref().map(|t| match key.member_in(&t.map, ModelKind::Truss) {
        None => InModel::Absent,
        Some(k) => match t.solution.as_ref().and_then(|s| s.cases.get(case)) {
            Some(c) => forces_in(ModelKind::Truss, k, c, role).map_or(InModel::Absent, InModel::Carries),
            None => InModel::Unsolved,
        },
    });
    let case_title =
        analysis.load_cases.get(case).map_or_else(|| CaseKind::Dead.title(), |c| c.description.title());
    Readout { key: *key, case, case_title, ribs: ribs.max(1), frame, truss }
}

impl ModelForces {
    /// The axial force of larger magnitude of the two ends, kN (pin-ended members carry
    /// one force; rib and deck members vary along their length under their own load).
    pub fn n(&self) -> f64 {
        if self.n_start.abs() >= self.n_end.abs() {
            self.n_start
        } else {
            self.n_end
        }
    }
}

impl Readout {
    /// Whether the member exists in no model of this analysis (a key kept from an earlier
    /// design whose layout has since changed, e.g. fewer panels after a drag): there is
    /// nothing to read.
    pub fn in_no_model(&self) -> bool {
        matches!(self.frame, InModel::Absent)
            && !matches!(self.truss, Some(InModel::Carries(_) | InModel::Unsolved))
    }

    /// The readout as lines of text in `units`: the member and case, then one line per
    /// model: N (both ends when they differ), M for rib and deck in the frame model, for
    /// all rib lines and per rib line; "not in this model" where the model lacks it.
    pub fn lines(&self, units: Units) -> Vec<String> {
        let force = |v: f64| units.show(Quantity::Force, v);
        let moment = |v: f64| units.show(Quantity::Moment, v);
        let ribs = self.ribs as f64;
        let all = if self.ribs == 1 { "the one rib".to_string() } else { format!("all {} ribs", self.ribs) };
        let mut out = vec![format!("{} · {}", self.key, self.case_title)];
        let models = std::iter::once((ModelKind::Frame, Some(self.frame)))
            .chain(self.truss.map(|t| (ModelKind::Truss, Some(t))));
        for (kind, state) in models {
            let text = match state {
                Some(InModel::Carries(f)) => {
                    let n = if (f.n_start - f.n_end).abs() <= 5e-4 * f.n_start.abs().max(f.n_end.abs()) {
                        format!("N = {} ({all}), {} per rib line", force(f.n()), force(f.n() / ribs))
                    } else {
                        format!(
                            "N = {} to {} ({all}), {} to {} per rib line",
                            force(f.n_start),
                            force(f.n_end),
                            force(f.n_start / ribs),
                            force(f.n_end / ribs)
                        )
                    };
                    match f.moments {
                        Some(m) => format!(
                            "{kind}: {n}; M up to {} (ends {} and {}), {} per rib line",
                            moment(m.largest),
                            moment(m.start),
                            moment(m.end),
                            moment(m.largest / ribs)
                        ),
                        None => format!("{kind}: {n}"),
                    }
                }
                Some(InModel::Absent) | None => format!("{kind}: not in this model"),
                Some(InModel::Unsolved) => format!("{kind}: not solved (the idealisation is a mechanism)"),
            };
            out.push(text);
        }
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::analysis::analyze;
    use crate::arch::design::Design;

    fn carries(m: &InModel) -> ModelForces {
        match m {
            InModel::Carries(f) => *f,
            other => panic!("expected forces, got {other:?}"),
        }
    }

    /// The demo's form is the funicular of the truss idealisation's dead load, so its
    /// diagonals carry nothing there (the README's design basis; the summary's bracing
    /// ratio is 0 for a determinate layout), while in the frame model the deck's own
    /// member loads and bending stiffness leave them working (the issue quotes +191 to
    /// -351 kN on the demo).
    #[test]
    fn a_demo_diagonal_is_idle_in_the_truss_and_working_in_the_frame_under_dead_load() {
        let d = Design::demo();
        let a = analyze(&d).expect("demo");
        let truss = a.truss.as_ref().expect("braced");
        let diagonals: Vec<usize> = truss.map.members_with(MemberRole::Bracing).collect();
        assert!(!diagonals.is_empty());
        let mut largest_frame: f64 = 0.0;
        for k in diagonals {
            let key = MemberKey::of(&truss.map, ModelKind::Truss, k).expect("between joints");
            let r = readout(&a, d.deck.ribs, &key, 0);
            let t = carries(r.truss.as_ref().expect("braced design has a truss"));
            assert_eq!(t.member, k);
            let reference = truss.solution.as_ref().expect("solved").cases[0].equilibrium.reference;
            assert!(t.n().abs() < 1e-6 * reference, "{key}: truss N {}", t.n());
            let f = carries(&r.frame);
            assert_eq!(a.frame.map.roles[f.member], MemberRole::Bracing);
            assert!(f.moments.is_none(), "a pin-ended diagonal carries no moment");
            largest_frame = largest_frame.max(f.n().abs());
        }
        // the numbers from the app, +191 kN and -351 kN: the largest is hundreds of kN
        assert!(largest_frame > 100.0, "frame diagonals work: largest |N| {largest_frame}");
    }

    /// A number as `Units::show` writes it ("−3\u{2009}375.5"), back to f64.
    fn shown_number(text: &str) -> f64 {
        let plain: String =
            text.chars().filter(|c| *c != '\u{2009}').map(|c| if c == '−' { '-' } else { c }).collect();
        plain.trim().parse().unwrap_or_else(|_| panic!("not a shown number: {text:?}"))
    }

    /// The forces (kN) a readout line shows in its N part, in order: whole then per rib
    /// line (two numbers), or whole start, whole end, per-rib start, per-rib end (four).
    fn shown_forces(line: &str) -> Vec<f64> {
        let n_part = line.split(';').next().unwrap_or_default();
        let n_part = n_part.split_once("N = ").map(|(_, r)| r).unwrap_or_default();
        let chunks: Vec<&str> = n_part.split("\u{a0}kN").collect();
        // every chunk but the last ends with a number; a number is digits, '.', thin
        // spaces and a leading minus sign
        chunks[..chunks.len().saturating_sub(1)]
            .iter()
            .map(|chunk| {
                let start = chunk
                    .char_indices()
                    .rev()
                    .take_while(|(_, c)| c.is_ascii_digit() || matches!(c, '.' | '\u{2009}' | '−'))
                    .last()
                    .map_or(chunk.len(), |(i, _)| i);
                shown_number(&chunk[start..])
            })
            .collect()
    }

    /// The frame member joining the model nodes of layout joints `ends`, found by its end
    /// nodes in the model itself (not through `MemberKey::member_in`).
    fn frame_member_by_nodes(a: &Analysis, ends: [Joint; 2]) -> usize {
        let nodes = ends.map(|j| a.frame.map.node_of(j).expect("a frame node at the joint"));
        a.frame
            .model
            .members
            .iter()
            .position(|m| [m.start, m.end] == nodes || [m.end, m.start] == nodes)
            .expect("a frame member between the joints")
    }

    #[test]
    fn per_rib_values_times_the_ribs_give_the_whole_and_absent_members_say_so() {
        let mut d = Design::demo();
        d.deck.ribs = 3;
        let a = analyze(&d).expect("three ribs");
        // the rib member at the left springing: frame and truss both have it
        let key = MemberKey::of(&a.frame.map, ModelKind::Frame, a.frame.map.rib_members[0]).expect("rib");
        let MemberKey::Between { ends, .. } = key else { panic!("a rib member joins layout joints") };
        let r = readout(&a, d.deck.ribs, &key, 0);
        let f = carries(&r.frame);
        // the solution's own numbers for the member between the same two nodes
        let solved = &a.frame.solution.cases[0].members[frame_member_by_nodes(&a, ends)];
        assert_eq!((f.n_start, f.n_end), (solved.start.n, solved.end.n));
        assert!(f.n() < 0.0, "the rib is in compression");
        let m = f.moments.expect("rib carries moment in the frame model");
        // the demo's rib is three-hinged: no moment at the springing hinge (start, r0)
        assert_eq!(m.start, 0.0, "hinged springing: {}", solved.start.m);
        let largest_solved = solved
            .stations
            .iter()
            .map(|s| s.forces.m)
            .chain([solved.start.m, solved.end.m])
            .fold(0.0_f64, |acc, v| if v.abs() > acc.abs() { v } else { acc });
        assert_eq!(m.largest, largest_solved);
        assert!(m.largest != 0.0, "the rib member bends under dead load in the frame model");

        let lines = r.lines(Units::Si);
        assert!(lines[0].starts_with("rib r0–r1 · Dead load"), "{lines:?}");
        assert!(lines[1].starts_with("frame model: N = ") && lines[1].contains("(all 3 ribs)"), "{lines:?}");
        // the text's per-rib numbers are its whole numbers over 3 (each shown to four
        // figures, so within 1e-3 relative), and its whole is the solution's N
        let shown = shown_forces(&lines[1]);
        let (whole, per_rib) = shown.split_at(shown.len() / 2);
        assert!(matches!(shown.len(), 2 | 4), "{lines:?}: {shown:?}");
        for (w, p) in whole.iter().zip(per_rib) {
            assert!((3.0 * p - w).abs() <= 1e-3 * w.abs(), "{w} vs 3 x {p} in {lines:?}");
        }
        let expected = if whole.len() == 2 { vec![solved.start.n, solved.end.n] } else { vec![f.n()] };
        for (w, e) in whole.iter().zip(&expected) {
            assert!((w - e).abs() <= 5e-4 * e.abs(), "shown {w}, solved {e}: {lines:?}");
        }
        assert!(lines[2].starts_with("truss idealisation: N = "), "{lines:?}");

        // a demo diagonal: the frame N shown is the solution's N of the member between its
        // end nodes, per rib line a third of it
        let truss = a.truss.as_ref().expect("braced");
        let k = truss.map.members_with(MemberRole::Bracing).next().expect("a diagonal");
        let key = MemberKey::of(&truss.map, ModelKind::Truss, k).expect("between joints");
        let MemberKey::Between { ends, .. } = key else { panic!("a diagonal joins layout joints") };
        let solved = &a.frame.solution.cases[0].members[frame_member_by_nodes(&a, ends)];
        let lines = readout(&a, d.deck.ribs, &key, 0).lines(Units::Si);
        let shown = shown_forces(&lines[1]);
        assert_eq!(shown.len(), 2, "a pin-ended diagonal carries one N: {lines:?}");
        assert!(
            (shown[0] - solved.start.n).abs() <= 5e-4 * solved.start.n.abs(),
            "{lines:?} vs {}",
            solved.start.n
        );
        assert!((3.0 * shown[1] - shown[0]).abs() <= 1e-3 * shown[0].abs(), "{lines:?}");
        assert!(solved.start.n.abs() > 1.0, "the diagonal works in the frame model: {}", solved.start.n);

        // an approach span is only in the frame model
        let approach = a.frame.map.members_with(MemberRole::Approach).next().expect("approach");
        let key = MemberKey::of(&a.frame.map, ModelKind::Frame, approach).expect("frame member");
        assert!(matches!(key, MemberKey::FrameOnly { .. }));
        let r = readout(&a, d.deck.ribs, &key, 0);
        assert_eq!(r.truss, Some(InModel::Absent));
        assert!(r.lines(Units::Si)[2].ends_with("truss idealisation: not in this model"));
        // an unbraced design has no truss idealisation at all
        d.bracing = crate::arch::design::Bracing::None;
        let a = analyze(&d).expect("unbraced");
        let key = MemberKey::of(&a.frame.map, ModelKind::Frame, a.frame.map.rib_members[0]).expect("rib");
        assert_eq!(readout(&a, d.deck.ribs, &key, 0).truss, None);
    }

    /// A key kept from a design with more panels names joints the new layout lacks: it is
    /// in no model (the app then shows nothing pointed at); a member that exists is not.
    #[test]
    fn a_key_from_an_earlier_layout_is_in_no_model() {
        let demo = Design::demo();
        let a12 = analyze(&demo).expect("demo");
        let t = a12.truss.as_ref().expect("braced");
        let last_brace = t.map.members_with(MemberRole::Bracing).last().expect("bracing");
        let key = MemberKey::of(&t.map, ModelKind::Truss, last_brace).expect("truss member");
        assert!(!readout(&a12, demo.deck.ribs, &key, 0).in_no_model());
        let mut fewer = demo.clone();
        fewer.panels = 6;
        let a6 = analyze(&fewer).expect("six panels");
        let r = readout(&a6, fewer.deck.ribs, &key, 0);
        assert!(r.in_no_model(), "{r:?}");
        let rib = MemberKey::of(&a6.frame.map, ModelKind::Frame, a6.frame.map.rib_members[0]).expect("rib");
        assert!(!readout(&a6, fewer.deck.ribs, &rib, 0).in_no_model());
    }

    #[test]
    fn every_truss_member_is_found_in_the_frame_model_by_its_key() {
        let a = analyze(&Design::demo()).expect("demo");
        let t = a.truss.as_ref().expect("braced");
        for k in 0..t.model.members.len() {
            let key = MemberKey::of(&t.map, ModelKind::Truss, k).expect("truss members join layout joints");
            assert_eq!(key.member_in(&t.map, ModelKind::Truss), Some(k));
            let f = key.member_in(&a.frame.map, ModelKind::Frame).expect("in the frame model too");
            assert_eq!(a.frame.map.roles[f], t.map.roles[k]);
        }
    }
}
