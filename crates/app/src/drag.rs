//! Direct manipulation on the elevation: which handle is under the pointer (in CSS
//! pixels) and the words for a drag that stopped. What moving a handle means, snapping and
//! the search for the last valid position are the engine's (`arch::edit`).

use crate::format::{Quantity, Units};
use springline_statics::arch::edit::{self, deck_line, point_handles};
pub use springline_statics::arch::edit::{Drag, DragStop, Handle, Snapping};
use springline_statics::error::{counted, Location, StaticsError};
use springline_statics::scene::force::distance_to_segment;
use springline_statics::scene::{Px, Transform};
use springline_statics::{Analysis, Design};

/// CSS pixels within which a point handle is caught.
pub const POINT_REACH: f64 = 10.0;
/// CSS pixels within which the deck line is caught.
pub const LINE_REACH: f64 = 5.0;

/// The words of the status line when nothing is wrong, in `units`: what can be dragged,
/// the grid values move on and how the modifier key frees it. The grid is metric
/// ([`edit::SNAP_STEP`], 0.1 m) whatever the units shown, so in US units the step is
/// told in metres with its length in feet beside (0.1 m = 0.33 ft, 1 ft = 0.3048 m
/// exactly).
pub fn drag_hint(units: Units) -> String {
    let metric = format!("{}\u{a0}m", edit::SNAP_STEP);
    let grid = match units {
        Units::Si => format!("values move in steps of {metric}"),
        Units::UsCustomary => format!(
            "values move on a metric grid, in steps of {metric} ({:.2}\u{a0}{})",
            units.to_shown(Quantity::Length, edit::SNAP_STEP),
            units.label(Quantity::Length)
        ),
    };
    format!(
        "Drag the crown, a springing, the deck or a ground point: {grid}; hold Shift while dragging to \
         move freely. Drag the pole of the force diagram to set the thrust: the rise follows."
    )
}

/// Where the vehicle's leading axle stands, `x` m, in words and `units`: "leading axle at
/// x = 56.61 m" (the status line and the readout beside a dragging pointer).
pub fn leading_axle(x: f64, units: Units) -> String {
    format!("leading axle at x = {}", units.show(Quantity::Length, x))
}

/// The handle under CSS pixel `at`, points first (nearest wins), then the deck line.
pub fn handle_at(design: &Design, a: &Analysis, transform: &Transform, at: Px) -> Option<Handle> {
    let best = point_handles(design, &a.form)
        .into_iter()
        .map(|(h, p)| {
            let q = transform.px(p.x, p.y);
            (h, (q.x - at.x).hypot(q.y - at.y))
        })
        .filter(|(_, d)| *d <= POINT_REACH)
        .min_by(|x, y| x.1.total_cmp(&y.1));
    if let Some((h, _)) = best {
        return Some(h);
    }
    let (l, r) = deck_line(design);
    let (l, r) = (transform.px(l.x, l.y), transform.px(r.x, r.y));
    (distance_to_segment(at, l, r) <= LINE_REACH).then_some(Handle::Deck)
}

/// Snapping for a pointer event: on the 0.1 m grid (metric in any units) unless Shift is
/// held.
pub fn snapping(shift_held: bool) -> Snapping {
    if shift_held {
        Snapping::Free
    } else {
        Snapping::ToGrid
    }
}

/// Why a drag of `handle` stopped where it did, for the status line, in the panels'
/// words: the field and the value it was held at, then the reason. For the crown held at
/// its largest rise the reason is the engine's largest rise in words (what governs it,
/// where the funicular's highest point is); otherwise the first problem of the refusal
/// just past the position held (and how many there are in all).
pub fn stop_message(handle: Handle, shown: &Design, stop: &DragStop, units: Units) -> String {
    let held = match handle.reading(shown) {
        Some(r) => capitalised(&format!("{} held at {}", r.field, held_value(&r, units))),
        None => "Held at the last valid position".to_string(),
    };
    let reason = match stop {
        DragStop::LargestRise(limit) => limit.describe(units),
        DragStop::Refused(StaticsError::Invalid(problems)) if !problems.is_empty() => {
            let first = &problems[0];
            let words = match &first.location {
                Location::Field(_) => first.message.clone(),
                other => format!("{other}: {}", first.message),
            };
            if problems.len() > 1 {
                format!("{words} ({} in all)", counted(problems.len(), "problem", "problems"))
            } else {
                words
            }
        }
        DragStop::Refused(other) => other.to_string(),
    };
    format!("{held}: {reason}.")
}

fn held_value(r: &edit::Reading, units: Units) -> String {
    let length = |v: f64| units.show(Quantity::Length, v);
    match r.x {
        None => length(r.y),
        Some(x) => format!("x {}, y {}", length(x), length(r.y)),
    }
}

fn capitalised(s: &str) -> String {
    let mut c = s.chars();
    match c.next() {
        Some(first) => first.to_uppercase().chain(c).collect(),
        None => String::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use springline_statics::analyze;

    // Check values: the demo scenario (`Design::demo`: deck at 100 m, springings 76 m and
    // 80 m, crown at 97.5 m) and the engine's messages (`arch::design`, `arch::validate`).

    #[test]
    fn the_crown_held_at_its_largest_rise_says_the_largest_rise_and_where_the_rib_meets_the_deck() {
        let d = Design::demo();
        let step = Drag::new(Handle::Crown).step(&d, 80.0, 110.0, Snapping::ToGrid, edit::analyses);
        let stop = step.stop.expect("stopped");
        let m = stop_message(Handle::Crown, &step.design, &stop, Units::Si);
        assert!(m.starts_with("Rise held at 21.70\u{a0}m: the largest rise the layout takes is 21.7"), "{m}");
        assert!(m.contains("the rib reaches the deck at x = "), "{m}");
        assert!(
            m.contains("with unequal springings the funicular's highest point is not at mid-span"),
            "{m}"
        );
        // no design field path anywhere
        assert!(!m.contains("crown.") && !m.contains("deck.level") && !m.contains('_'), "{m}");
    }

    #[test]
    fn the_deck_held_at_the_abutment_height_names_the_seat_in_words() {
        let d = Design::demo();
        let step = Drag::new(Handle::Deck).step(&d, 80.0, 125.0, Snapping::ToGrid, edit::analyses);
        let stop = step.stop.expect("stopped");
        let m = stop_message(Handle::Deck, &step.design, &stop, Units::Si);
        assert!(
            m.starts_with("Deck level held at 109.3\u{a0}m: the ground at the left abutment seat"),
            "{m}"
        );
        assert!(m.contains("more than the abutment height (10 m)"), "{m}");
        assert!(!m.contains('_'), "{m}");
    }

    #[test]
    fn several_problems_are_counted_in_words() {
        let mut d = Design::demo();
        d.deck.level = 60.0; // under both springings (76 m, 80 m) and the crown
        let error = analyze(&d).expect_err("refused");
        assert!(error.problems().len() >= 3, "{error}");
        let m = stop_message(Handle::Deck, &Design::demo(), &DragStop::Refused(error.clone()), Units::Si);
        assert!(
            m.starts_with("Deck level held at 100.0\u{a0}m: the left springing (76 m) is at or above"),
            "{m}"
        );
        assert!(m.contains(&format!("({} problems in all)", error.problems().len())), "{m}");
        assert!(!m.contains("problem(s)"));
    }

    #[test]
    fn a_handle_is_caught_within_its_reach_in_pixels() {
        // 4 px per metre: the demo's crown (97.5 m) is 10 px under the deck (100 m)
        let d = Design::demo();
        let a = analyze(&d).expect("the demo analyses");
        let t = Transform { scale: 4.0, origin_x: 10.0, origin_y: 500.0 };
        let crown = t.px(a.form.crown.x, a.form.crown.y);
        // 5 px off the crown (3-4-5) is within POINT_REACH (10 px); 11 px up is not, and
        // is 1 px over the deck line
        assert_eq!(handle_at(&d, &a, &t, Px::new(crown.x + 3.0, crown.y + 4.0)), Some(Handle::Crown));
        assert_eq!(handle_at(&d, &a, &t, Px::new(crown.x, crown.y - 11.0)), Some(Handle::Deck));
        // the deck line at x = 20 m, far from every point handle: caught within LINE_REACH
        let deck = t.px(20.0, 100.0);
        assert_eq!(handle_at(&d, &a, &t, Px::new(deck.x, deck.y + 4.0)), Some(Handle::Deck));
        assert_eq!(handle_at(&d, &a, &t, Px::new(deck.x, deck.y + 6.0)), None);
        // past the right seat (x = 166 m) the line ends: 6 px beyond its end is out of reach
        let end = t.px(166.0, 100.0);
        assert_eq!(handle_at(&d, &a, &t, Px::new(end.x + 6.0, end.y)), None);
    }

    #[test]
    fn shift_frees_the_grid() {
        assert_eq!(snapping(true), Snapping::Free);
        assert_eq!(snapping(false), Snapping::ToGrid);
        assert!(drag_hint(Units::Si).contains("Shift"));
    }

    #[test]
    fn the_hint_tells_the_metric_step_and_its_length_in_feet() {
        let si = drag_hint(Units::Si);
        assert!(si.contains("values move in steps of 0.1\u{a0}m;"), "{si}");
        assert!(!si.contains("\u{a0}ft"), "{si}");
        // 0.1 m / 0.3048 m per ft = 0.328 ft
        let us = drag_hint(Units::UsCustomary);
        assert!(us.contains("on a metric grid, in steps of 0.1\u{a0}m (0.33\u{a0}ft);"), "{us}");
    }
}
