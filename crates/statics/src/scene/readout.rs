//! The value being dragged, drawn beside the pointer on the drawing being dragged: a
//! label of the drawing rather than an element of the page, so a pointer move changes
//! only the canvas (an element moved and rewritten on every move had the browser lay out
//! and repaint the whole page each time).

use super::place::{self, PAD_X};
use super::{Ink, Label, Px, Rect, Scene, TextSize};

/// CSS pixels from the pointer to the readout's near corner: right of and below it.
pub const OFFSET: (f64, f64) = (14.0, 12.0);

/// Adds `text` as a boxed label beside the pointer at `at` (CSS pixels of the scene's
/// canvas): right of and below it, left of it where the right edge is near, above it
/// where the bottom edge is near, and always whole on the canvas (moved in from an edge
/// when the pointer is beyond it, as a captured pointer may be). Returns its index in
/// `scene.labels`. Nothing is added for empty text or a pointer that is not a number.
pub fn add_pointer_readout(scene: &mut Scene, text: String, at: Px) -> Option<usize> {
    if text.is_empty() || !at.x.is_finite() || !at.y.is_finite() {
        return None;
    }
    let size = TextSize::Body;
    let (w, h) = (place::text_width(&text, size) + 2.0 * PAD_X, size.box_height());
    let frame = scene.viewport.frame().grown(-1.0);
    let mut x = at.x + OFFSET.0;
    if x + w > frame.right() {
        x = at.x - OFFSET.0 - w;
    }
    let mut y = at.y + OFFSET.1;
    if y + h > frame.bottom() {
        y = at.y - OFFSET.1 - h;
    }
    // whole on the canvas, the left and top edges winning on a canvas too small for it
    let x = x.min(frame.right() - w).max(frame.x);
    let y = y.min(frame.bottom() - h).max(frame.y);
    scene.labels.push(Label {
        text,
        size,
        ink: Ink::Text,
        rect: Rect::new(x, y, w, h),
        boxed: true,
        leader: None,
        detail: None,
    });
    Some(scene.labels.len() - 1)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::scene::Viewport;

    fn canvas(width: f64, height: f64) -> Scene {
        Scene::new(Viewport::new(width, height))
    }

    // Check values: the placement rules above on a 600 x 400 px canvas (the frame is the
    // canvas less 1 px all round), worked by hand.

    #[test]
    fn the_readout_sits_right_of_and_below_the_pointer() {
        let mut s = canvas(600.0, 400.0);
        let k = add_pointer_readout(&mut s, "rise 19.50 m".into(), Px::new(100.0, 100.0)).expect("added");
        let r = s.labels[k].rect;
        assert_eq!((r.x, r.y), (114.0, 112.0));
        assert!(s.labels[k].boxed);
        assert!(r.w > place::text_width("rise 19.50 m", TextSize::Body));
    }

    #[test]
    fn near_the_right_and_bottom_edges_it_goes_left_of_and_above_the_pointer() {
        let mut s = canvas(600.0, 400.0);
        let k = add_pointer_readout(&mut s, "rise 19.50 m".into(), Px::new(590.0, 395.0)).expect("added");
        let r = s.labels[k].rect;
        assert_eq!(r.right(), 590.0 - OFFSET.0);
        assert_eq!(r.bottom(), 395.0 - OFFSET.1);
    }

    #[test]
    fn a_pointer_beyond_the_canvas_keeps_the_readout_whole_on_it() {
        let mut s = canvas(600.0, 400.0);
        for at in [Px::new(-80.0, -50.0), Px::new(900.0, 700.0), Px::new(300.0, -500.0)] {
            let k = add_pointer_readout(&mut s, "crown level 97.50 m".into(), at).expect("added");
            let r = s.labels[k].rect;
            let frame = s.viewport.frame().grown(-1.0);
            assert!(frame.contains(&r), "{r:?} for a pointer at {at:?}");
        }
    }

    #[test]
    fn nothing_is_added_for_no_text_or_a_pointer_that_is_not_a_number() {
        let mut s = canvas(600.0, 400.0);
        assert_eq!(add_pointer_readout(&mut s, String::new(), Px::new(10.0, 10.0)), None);
        assert_eq!(add_pointer_readout(&mut s, "rise".into(), Px::new(f64::NAN, 10.0)), None);
        assert!(s.labels.is_empty());
    }
}
