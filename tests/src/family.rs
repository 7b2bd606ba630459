//! Designs of the demo's family over the whole numeric range: shared by the numeric-range
//! tests and the pipeline fuzz target.

use springline_statics::arch::design::{Bracing, Crown, RibSystem};
use springline_statics::Design;

/// A design of the demo's family with springings `span` apart, rise `ratio * span`, and
/// the valley deepened to take the rib under the deck with room for the spandrel.
pub fn family(
    span: f64,
    ratio: f64,
    panels: usize,
    ribs: usize,
    system: RibSystem,
    bracing: Bracing,
) -> Design {
    let mut d = Design::demo();
    let deck = d.deck.level;
    // the demo's springings: x = 30 m (level 76) and about 136.4 m (level 80)
    let demo_span = d.springing_x(d.springing_right_level, false).unwrap_or(136.4)
        - d.springing_x(d.springing_left_level, true).unwrap_or(30.0);
    let rise = ratio * span;
    // the chord's depth below the deck at the crown: the rise, the deck girder and posts
    let chord_depth = rise + 0.03 * span + 2.5;
    let demo_chord_depth = deck - 0.5 * (d.springing_left_level + d.springing_right_level);
    let sx = span / demo_span;
    let sy = chord_depth / demo_chord_depth;
    for p in &mut d.valley {
        p.x *= sx;
        p.y = deck - (deck - p.y) * sy;
    }
    d.deck.left_seat_x *= sx;
    d.deck.right_seat_x *= sx;
    d.deck.abutment_height *= sy.max(1.0);
    d.springing_left_level = deck - (deck - d.springing_left_level) * sy;
    d.springing_right_level = deck - (deck - d.springing_right_level) * sy;
    d.crown = Crown::Rise { rise };
    d.panels = panels;
    d.deck.ribs = ribs;
    // a deck wide enough for the ribs' spacing (common practice: 2.5 m or more)
    d.deck.width = d.deck.width.max(2.5 * ribs as f64);
    d.traffic.carriageway_width = d.traffic.carriageway_width.min(d.deck.width - 1.0);
    d.rib_system = system;
    d.bracing = bracing;
    d.approach_piers_left = if span < 40.0 { 0 } else { 1 };
    d.approach_piers_right = d.approach_piers_left;
    d
}
