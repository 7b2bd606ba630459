//! Direct manipulation on the elevation: what can be grabbed and what moving it means.
//! Pure functions of the design; the canvas component wires them to pointer events.

use crate::canvas::{distance_to_segment, View};
use springline_statics::arch::design::Crown;
use springline_statics::{Analysis, Design};

/// Something on the elevation that a drag moves.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Handle {
    /// The crown: moves the rise (or the crown level, as the design gives it).
    Crown,
    /// A springing: moves its level; its x follows the valley wall.
    Springing {
        /// Left springing when true.
        left: bool,
    },
    /// The deck: moves its level.
    Deck,
    /// A ground point of the valley section.
    Ground(usize),
}

/// CSS pixels within which a point handle is caught.
pub const POINT_REACH: f64 = 10.0;
/// CSS pixels within which the deck line is caught.
pub const LINE_REACH: f64 = 5.0;

/// The handle under CSS pixel `at`, points first (nearest wins), then the deck line.
pub fn handle_at(design: &Design, a: &Analysis, view: &View, at: (f64, f64)) -> Option<Handle> {
    let f = &a.form;
    let mut points: Vec<(Handle, (f64, f64))> = vec![
        (Handle::Crown, (f.crown.x, f.crown.y)),
        (Handle::Springing { left: true }, (f.springing_left.x, f.springing_left.y)),
        (Handle::Springing { left: false }, (f.springing_right.x, f.springing_right.y)),
    ];
    points.extend(design.valley.iter().enumerate().map(|(i, g)| (Handle::Ground(i), (g.x, g.y))));
    let best = points
        .into_iter()
        .map(|(h, p)| {
            let q = view.px(p.0, p.1);
            (h, (q.0 - at.0).hypot(q.1 - at.1))
        })
        .filter(|(_, d)| *d <= POINT_REACH)
        .min_by(|x, y| x.1.total_cmp(&y.1));
    if let Some((h, _)) = best {
        return Some(h);
    }
    let l = view.px(design.deck.left_seat_x, design.deck.level);
    let r = view.px(design.deck.right_seat_x, design.deck.level);
    (distance_to_segment(at, l, r) <= LINE_REACH).then_some(Handle::Deck)
}

/// The design after moving `handle` to world point (x, y), m.
pub fn moved(design: &Design, handle: Handle, x: f64, y: f64) -> Design {
    let mut d = design.clone();
    match handle {
        Handle::Crown => {
            let chord = 0.5 * (d.springing_left_level + d.springing_right_level);
            d.crown = match d.crown {
                Crown::Rise { .. } => Crown::Rise { rise: y - chord },
                Crown::Level { .. } => Crown::Level { level: y },
            };
        }
        Handle::Springing { left: true } => d.springing_left_level = y,
        Handle::Springing { left: false } => d.springing_right_level = y,
        Handle::Deck => d.deck.level = y,
        Handle::Ground(i) => {
            if let Some(p) = d.valley.get_mut(i) {
                p.x = x;
                p.y = y;
            }
        }
    }
    d
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn dragging_the_crown_changes_the_rise_by_the_distance_moved() {
        let d = Design::demo();
        let c = d.crown_level();
        let m = moved(&d, Handle::Crown, 80.0, c + 2.5);
        assert!((m.rise() - d.rise() - 2.5).abs() < 1e-12);
    }
}
