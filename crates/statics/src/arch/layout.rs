//! The default layout of a deck arch (README, "The deck arch as built"): where the
//! springings, panel points, rib nodes, posts, diagonals, drop-in span and approach piers
//! are, derived from a validated `Design` and (for which posts are too short) the rib
//! levels.
//!
//! Panel points i = 0..=n at x_i = x_A + i L / n; rib nodes under every panel point, plus a
//! crown rib node without a post at the crown x when n is odd. Rib node 0 and the last
//! are the springings; the end posts stand on them. Units m.

use crate::arch::design::{Bracing, Design, RibSystem};
use crate::geom::Point;
use crate::tolerance::SHARED_NODE_GAP;

use serde::{Deserialize, Serialize};

/// A node of the arch layout, before numbering in a model.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(tag = "kind", content = "index", rename_all = "snake_case")]
pub enum Joint {
    /// The deck node over panel point i.
    Deck(usize),
    /// Rib node r (0 = left springing).
    Rib(usize),
}

/// Fixed geometry of a design (does not depend on the rib shape).
#[derive(Debug, Clone, PartialEq)]
pub struct Layout {
    /// Left springing, m.
    pub a: Point,
    /// Right springing, m.
    pub b: Point,
    /// Crown x, m (midway).
    pub xc: f64,
    /// Rise above the chord at the crown, m.
    pub rise: f64,
    /// Deck level, m.
    pub deck_level: f64,
    /// Number of panels.
    pub panels: usize,
    /// x of the panel points, m (n + 1 values).
    pub panel_x: Vec<f64>,
    /// x of the rib nodes, m.
    pub rib_x: Vec<f64>,
    /// Panel point above each rib node (`None` for the crown node of an odd panel count).
    pub rib_panel: Vec<Option<usize>>,
    /// Index of the crown rib node.
    pub crown: usize,
    /// Left approach: the foot of each pier on the ground, from the seat towards the arch.
    pub piers_left: Vec<Point>,
    /// Right approach: the foot of each pier on the ground, from the arch towards the seat.
    pub piers_right: Vec<Point>,
    /// Left and right abutment seat x, m.
    pub seats: (f64, f64),
    /// Rib system.
    pub system: RibSystem,
    /// Bracing.
    pub bracing: Bracing,
}

impl Layout {
    /// The layout geometry of a design whose inputs passed `check_inputs`; `None` if the
    /// springings cannot be placed.
    pub(crate) fn new(d: &Design) -> Option<Layout> {
        let xa = d.springing_x(d.springing_left_level, true)?;
        let xb = d.springing_x(d.springing_right_level, false)?;
        let n = d.panels;
        if xb.is_nan() || xa.is_nan() || xb <= xa || n < 2 {
            return None;
        }
        let span = xb - xa;
        let panel_x: Vec<f64> =
            (0..=n).map(|i| if i == n { xb } else { xa + span * i as f64 / n as f64 }).collect();
        let xc = 0.5 * (xa + xb);
        let mut rib_x = Vec::with_capacity(n + 2);
        let mut rib_panel = Vec::with_capacity(n + 2);
        let mut crown = 0;
        for (i, &x) in panel_x.iter().enumerate() {
            if n % 2 == 1 && i == n.div_ceil(2) {
                crown = rib_x.len();
                rib_x.push(xc);
                rib_panel.push(None);
            }
            if n % 2 == 0 && i == n / 2 {
                crown = rib_x.len();
            }
            rib_x.push(x);
            rib_panel.push(Some(i));
        }
        let piers = |seat: f64, end: f64, count: usize| -> Option<Vec<Point>> {
            (1..=count)
                .map(|k| {
                    let x = seat + (end - seat) * k as f64 / (count + 1) as f64;
                    d.ground_at(x).map(|g| Point::new(x, g))
                })
                .collect()
        };
        let piers_left = piers(d.deck.left_seat_x, xa, d.approach_piers_left)?;
        let mut piers_right = piers(d.deck.right_seat_x, xb, d.approach_piers_right)?;
        piers_right.reverse();
        Some(Layout {
            a: Point::new(xa, d.springing_left_level),
            b: Point::new(xb, d.springing_right_level),
            xc,
            rise: d.rise(),
            deck_level: d.deck.level,
            panels: n,
            panel_x,
            rib_x,
            rib_panel,
            crown,
            piers_left,
            piers_right,
            seats: (d.deck.left_seat_x, d.deck.right_seat_x),
            system: d.rib_system,
            bracing: d.bracing,
        })
    }

    /// Span L = x_B - x_A, m.
    pub fn span(&self) -> f64 {
        self.b.x - self.a.x
    }

    /// Level of the springing chord at `x`, m.
    pub fn chord(&self, x: f64) -> f64 {
        self.a.y + (self.b.y - self.a.y) * (x - self.a.x) / self.span()
    }

    /// The parabola through both springings and the crown point, at `x` (start shape).
    pub fn parabola(&self, x: f64) -> f64 {
        let l = self.span();
        self.chord(x) + 4.0 * self.rise * (x - self.a.x) * (self.b.x - x) / (l * l)
    }

    /// Index of the rib node under panel point `i`.
    pub fn rib_under(&self, i: usize) -> usize {
        if self.panels % 2 == 1 && i > self.panels / 2 {
            i + 1
        } else {
            i
        }
    }

    /// Index of the last rib node (right springing).
    pub fn last_rib(&self) -> usize {
        self.rib_x.len() - 1
    }
}

/// Which parts exist for a given rib shape: shared nodes, posts, deck spans, diagonals.
#[derive(Debug, Clone, PartialEq)]
pub struct Topology {
    /// Rib node indices where rib and deck share the node (posts shorter than the minimum,
    /// or the crown of a two-hinged / fixed rib close under the deck).
    pub shared: Vec<usize>,
    /// Posts (panel point i, rib node r), end posts included (panel points 0 and n).
    pub posts: Vec<(usize, usize)>,
    /// Continuous deck members over the arch, left to right.
    pub deck: Vec<(Joint, Joint)>,
    /// The three-hinged drop-in span over the crown panel(s), if any: it ties nothing and
    /// delivers its simple-span reactions to these two joints.
    pub drop_in: Option<(Joint, Joint)>,
    /// Bracing diagonals (deck joint, rib joint). One exception, the crown brace over a
    /// shared node: where the deck joint beside the crown is a rib node (rib and deck share
    /// it), the crown panel has no depth there and its diagonal would lie along the rib, so
    /// the crown is braced from the next rib node out instead (rib joint, crown rib joint).
    pub diagonals: Vec<(Joint, Joint)>,
}

impl Topology {
    /// Topology for rib levels `rib_y` (one per rib node), deciding shared nodes where the
    /// post would be shorter than `min_post`.
    pub fn new(f: &Layout, rib_y: &[f64], min_post: f64) -> Topology {
        let shared: Vec<usize> = (1..f.last_rib())
            .filter(|&r| {
                let is_crown = r == f.crown;
                if f.system == RibSystem::ThreeHinged && is_crown {
                    return false; // nothing crosses the three-hinged crown
                }
                // a post of (nearly) zero length is no post: share the node even when the
                // user's minimum is zero (a rib node without a level shares nothing)
                let Some(&y) = rib_y.get(r) else { return false };
                let gap = f.deck_level - y;
                gap < min_post || gap <= SHARED_NODE_GAP * (f.b.x - f.a.x).abs()
            })
            .collect();
        Topology::with_shared(f, shared)
    }

    /// Topology with the given shared rib nodes.
    pub fn with_shared(f: &Layout, shared: Vec<usize>) -> Topology {
        let n = f.panels;
        let three = f.system == RibSystem::ThreeHinged;
        let is_shared = |r: usize| shared.contains(&r);
        // deck joint over panel point i (shared nodes resolve to the rib)
        let deck_joint = |i: usize| {
            let r = f.rib_under(i);
            if is_shared(r) {
                Joint::Rib(r)
            } else {
                Joint::Deck(i)
            }
        };
        let even_crown_panel = if n % 2 == 0 { Some(n / 2) } else { None };
        // deck line, left to right
        let mut line: Vec<Joint> = Vec::new();
        for i in 0..=n {
            if three && Some(i) == even_crown_panel {
                continue; // no deck node over a three-hinged crown
            }
            line.push(deck_joint(i));
            if n % 2 == 1 && i == n / 2 && is_shared(f.crown) {
                line.push(Joint::Rib(f.crown));
            }
        }
        let mut deck = Vec::new();
        let mut drop_in = None;
        let (dl, dr) = if n % 2 == 0 { (n / 2 - 1, n / 2 + 1) } else { (n / 2, n / 2 + 1) };
        for pair in line.iter().copied().zip(line.iter().copied().skip(1)) {
            if three && pair == (deck_joint(dl), deck_joint(dr)) {
                drop_in = Some(pair);
            } else {
                deck.push(pair);
            }
        }
        let mut posts = Vec::new();
        for i in 0..=n {
            let r = f.rib_under(i);
            if (1..n).contains(&i) && (is_shared(r) || (three && Some(i) == even_crown_panel)) {
                continue;
            }
            posts.push((i, r));
        }
        // diagonals
        let mut diagonals: Vec<(Joint, Joint)> = Vec::new();
        let push = |d: Joint, r: Joint, diagonals: &mut Vec<(Joint, Joint)>| {
            // skip a diagonal that would coincide with a rib or deck member or a post
            let d_rib = match d {
                Joint::Rib(k) => Some(k),
                _ => None,
            };
            let Joint::Rib(rr) = r else { return };
            if d_rib.is_some() {
                return; // its deck end is a rib node: it would lie along the rib
            }
            if is_shared(rr) {
                return; // its rib end is on the deck: it would lie along the deck
            }
            if !diagonals.contains(&(d, r)) {
                diagonals.push((d, r));
            }
        };
        // the diagonal of a crown panel (no post at the crown rib node), from the deck over
        // panel point `i` beside the crown down to the crown. Where rib and deck share the
        // node under `i`, that diagonal would lie along the rib and the crown would hang on
        // the rib segment alone: a pin-jointed crown panel without depth, a mechanism (the
        // crown's only tie to that side is one bar). The crown is then braced from the next
        // rib node out: the triangle (that node, the shared node, crown) is rigid because the
        // shared node carries load and so is a kink of the funicular rib, strictly above the
        // line through its neighbours.
        let crown_brace = |i: usize, diagonals: &mut Vec<(Joint, Joint)>| {
            if is_shared(f.crown) {
                return; // the crown is on the deck: the diagonal would lie along the deck
            }
            let crown = Joint::Rib(f.crown);
            let beside = f.rib_under(i);
            let d = if is_shared(beside) {
                // the next rib node away from the crown (springings included)
                Joint::Rib(if beside < f.crown { beside - 1 } else { beside + 1 })
            } else {
                deck_joint(i)
            };
            if !diagonals.contains(&(d, crown)) {
                diagonals.push((d, crown));
            }
        };
        if f.bracing.is_braced() {
            let flipped = matches!(f.bracing, Bracing::Single { flipped: true });
            let crossed = matches!(f.bracing, Bracing::Crossed);
            let half = n / 2; // panels 0..half-1 on the left are ordinary (odd: crown panel is `half`)
            for p in 0..half {
                // left half panel p between panel points p (outer) and p + 1 (inner)
                let (outer, inner) = (p, p + 1);
                let last_even = n % 2 == 0 && p == half - 1;
                let mirror = |i: usize| n - i;
                // (deck end, rib end) panel points of each diagonal in this panel
                let pairs: Vec<(usize, usize)> = if last_even && three {
                    vec![(outer, inner)]
                } else {
                    let mut v = Vec::new();
                    if crossed || !flipped {
                        v.push((outer, inner));
                    }
                    if crossed || flipped {
                        v.push((inner, outer));
                    }
                    v
                };
                for (from_deck, to_rib) in pairs {
                    if last_even && three {
                        crown_brace(from_deck, &mut diagonals);
                        crown_brace(mirror(from_deck), &mut diagonals);
                        continue;
                    }
                    push(deck_joint(from_deck), Joint::Rib(f.rib_under(to_rib)), &mut diagonals);
                    push(
                        deck_joint(mirror(from_deck)),
                        Joint::Rib(f.rib_under(mirror(to_rib))),
                        &mut diagonals,
                    );
                }
            }
            if n % 2 == 1 {
                crown_brace(half, &mut diagonals);
                crown_brace(half + 1, &mut diagonals);
            }
        }
        Topology { shared, posts, deck, drop_in, diagonals }
    }

    /// Rib node carrying joint `j` down to the rib (a deck node goes down its post).
    pub fn rib_of(&self, f: &Layout, j: Joint) -> usize {
        match j {
            Joint::Rib(r) => r,
            Joint::Deck(i) => f.rib_under(i),
        }
    }
}

/// Position of a joint, m, with the rib at levels `rib_y` (one per rib node). A joint the
/// layout does not have (or a rib node without a level) has NaN coordinates, which model
/// validation and form finding then refuse.
pub fn position(f: &Layout, rib_y: &[f64], j: Joint) -> Point {
    let or_nan = |v: Option<&f64>| v.copied().unwrap_or(f64::NAN);
    match j {
        Joint::Rib(r) => Point::new(or_nan(f.rib_x.get(r)), or_nan(rib_y.get(r))),
        Joint::Deck(i) => Point::new(or_nan(f.panel_x.get(i)), f.deck_level),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn topo(n: usize, system: RibSystem, bracing: Bracing) -> (Layout, Topology) {
        let mut d = Design::demo();
        d.panels = n;
        d.rib_system = system;
        d.bracing = bracing;
        let f = Layout::new(&d).expect("demo frame");
        let y: Vec<f64> = f.rib_x.iter().map(|&x| f.parabola(x)).collect();
        let t = Topology::new(&f, &y, d.min_post_length);
        (f, t)
    }

    #[test]
    fn three_hinged_even_layout_matches_the_description() {
        // the three-hinged rule: no crown post, no deck node over the crown, a drop-in over the two
        // crown panels, diagonals in the panels next to the crown to the crown rib node.
        let (f, t) = topo(6, RibSystem::ThreeHinged, Bracing::Single { flipped: false });
        assert_eq!(f.rib_x.len(), 7);
        assert_eq!(t.posts.len(), 6);
        assert!(!t.posts.iter().any(|&(i, _)| i == 3));
        assert_eq!(t.drop_in, Some((Joint::Deck(2), Joint::Deck(4))));
        assert_eq!(t.deck.len(), 4);
        assert!(t.diagonals.contains(&(Joint::Deck(2), Joint::Rib(3))));
        assert!(t.diagonals.contains(&(Joint::Deck(4), Joint::Rib(3))));
        assert!(t.diagonals.contains(&(Joint::Deck(0), Joint::Rib(1))));
        assert!(t.diagonals.contains(&(Joint::Deck(6), Joint::Rib(5))));
        assert_eq!(t.diagonals.len(), 6);
    }

    #[test]
    fn odd_layout_adds_a_crown_rib_node_without_post() {
        let (f, t) = topo(5, RibSystem::ThreeHinged, Bracing::Single { flipped: true });
        assert_eq!(f.rib_x.len(), 7);
        assert_eq!(f.crown, 3);
        assert!((f.rib_x[3] - f.xc).abs() < 1e-12);
        assert_eq!(f.rib_panel[3], None);
        assert_eq!(t.drop_in, Some((Joint::Deck(2), Joint::Deck(3))));
        assert!(t.diagonals.contains(&(Joint::Deck(2), Joint::Rib(3))));
        assert!(t.diagonals.contains(&(Joint::Deck(3), Joint::Rib(3))));
        // flipped: from the deck at the inner post down to the rib at the outer post
        assert!(t.diagonals.contains(&(Joint::Deck(1), Joint::Rib(0))));
        assert!(t.diagonals.contains(&(Joint::Deck(4), Joint::Rib(6))));
    }

    #[test]
    fn two_hinged_even_layout_has_a_crown_post_and_continuous_deck() {
        let (_, t) = topo(6, RibSystem::TwoHinged, Bracing::Crossed);
        assert_eq!(t.posts.len(), 7);
        assert_eq!(t.drop_in, None);
        assert_eq!(t.deck.len(), 6);
        assert_eq!(t.diagonals.len(), 12);
    }
}
