//! A mode shape over the elevation: the arch's buckled shape or its first vibration
//! mode (`arch::stability::ModeDrawing`), drawn over the frame model's members.
//!
//! Our own drawing. The members stand undeformed as thin dashed grey lines; the mode
//! moves every point of them by its (ux, uy) times one factor, chosen so that the mode's
//! largest movement is [`SHAPE_SHARE`] of the span on the drawing, and draws the moved
//! members as solid lines in [`Ink::ModeShape`]. A mode has no size of its own (only its
//! shape): the key says so and gives the drawing's scale of the movement. The title
//! carries the mode's critical load factor or frequency. In the arch plane only: the
//! key says that out-of-plane modes are not covered.

use super::elevation::{elevation_with_overlay, ElevationOptions, KeyEntry, Overlay};
use super::place::{Placer, Request};
use super::{Ink, Item, Pattern, Scene, Shape, Stroke, Tag, TextSize, Transform, Viewport};
use crate::arch::analysis::Analysis;
use crate::arch::design::Design;
use crate::arch::generate::ModelKind;
use crate::arch::stability::ModeDrawing;
use crate::units::Units;

/// The largest movement of a mode as drawn, as a share of the span.
pub const SHAPE_SHARE: f64 = 0.06;

/// Line width of the moved members, CSS pixels.
const SHAPE_WIDTH: f64 = 3.0;
/// Line width of the members at rest, CSS pixels.
const REST_WIDTH: f64 = 1.2;

/// What the mode view shows besides the mode.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct ModeOptions {
    /// Display units.
    pub units: Units,
    /// The case whose springing forces the elevation shows.
    pub case: usize,
    /// A transform to keep (`None` fits the drawing).
    pub transform: Option<Transform>,
}

/// The factor on the mode's (ux, uy) that draws its largest movement as
/// [`SHAPE_SHARE`] of `span` (m): the mode's largest translation is 1.
pub fn shape_factor(drawing: &ModeDrawing, span: f64) -> f64 {
    let largest = drawing.members.iter().flatten().map(|p| p[2].hypot(p[3])).fold(0.0f64, f64::max);
    if largest > 0.0 {
        SHAPE_SHARE * span / largest
    } else {
        0.0
    }
}

/// The elevation with `drawing` over it (module doc). Members of the drawing beyond the
/// analysis's frame model are ignored.
pub fn mode_elevation(
    analysis: &Analysis,
    design: &Design,
    drawing: &ModeDrawing,
    opts: &ModeOptions,
    viewport: Viewport,
) -> Scene {
    let span = analysis.form.span;
    let factor = shape_factor(drawing, span);
    let keys = vec![
        KeyEntry {
            swatch: Some(Stroke::solid(Ink::ModeShape, SHAPE_WIDTH)),
            text: format!("mode shape, largest movement drawn as {:.0} % of the span", 100.0 * SHAPE_SHARE),
            ink: Ink::Text,
        },
        KeyEntry {
            swatch: Some(Stroke::patterned(Ink::Zero, REST_WIDTH, Pattern::Dashed)),
            text: "at rest".into(),
            ink: Ink::Text,
        },
        KeyEntry {
            swatch: None,
            text: "a mode has a shape, not a size; in the arch plane only".into(),
            ink: Ink::Secondary,
        },
    ];
    let model = &analysis.frame.model;
    let draw = |t: &Transform, items: &mut Vec<Item>, placer: &mut Placer| {
        for (k, m) in model.members.iter().enumerate() {
            let Some((a, b)) = model.ends(m) else { continue };
            items.push(
                Item::stroked(
                    Shape::Line { from: t.px(a.x, a.y), to: t.px(b.x, b.y) },
                    Stroke::patterned(Ink::Zero, REST_WIDTH, Pattern::Dashed),
                )
                .tagged(Tag::Member { member: k }),
            );
        }
        let mut peak: Option<(f64, [f64; 4])> = None;
        for points in drawing.members.iter().take(model.members.len()) {
            let moved: Vec<_> =
                points.iter().map(|p| t.px(p[0] + factor * p[2], p[1] + factor * p[3])).collect();
            if moved.len() >= 2 {
                items.push(Item::stroked(
                    Shape::Path { points: moved, closed: false },
                    Stroke::solid(Ink::ModeShape, SHAPE_WIDTH),
                ));
            }
            for p in points {
                let size = p[2].hypot(p[3]);
                if peak.is_none_or(|(s, _)| size > s) {
                    peak = Some((size, *p));
                }
            }
        }
        // the title again at the largest movement, where the eye goes
        if let Some((_, p)) = peak {
            let at = t.px(p[0] + factor * p[2], p[1] + factor * p[3]);
            placer.place(Request::new(drawing.title.clone(), TextSize::Small, Ink::Text, at));
        }
    };
    let overlay = Overlay { title: drawing.title.clone(), keys, draw: &draw };
    let elevation = ElevationOptions {
        units: opts.units,
        case: opts.case,
        model: ModelKind::Frame,
        highlight: None,
        transform: opts.transform,
    };
    elevation_with_overlay(analysis, design, &elevation, viewport, Some(&overlay)).0
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::stability::arch_stability;
    use crate::{analyze, ValidDesign};

    /// The demo's buckled shape and first vibration mode: one moved path per frame
    /// member, the largest movement drawn as 6 % of the span in pixels, every label
    /// placed inside the canvas without overlap, the title carrying alpha_cr or Hz.
    #[test]
    fn the_demo_modes_draw_over_the_elevation() {
        let d = Design::demo();
        let a = analyze(&d).expect("analyses");
        let valid = ValidDesign::new(&d).expect("valid");
        let s = arch_stability(&valid, 3).expect("modes");
        let viewport = Viewport::new(900.0, 520.0);
        for (drawing, words) in [
            (s.buckled_shape.as_ref().expect("buckled"), "alpha_cr"),
            (s.vibration_shape.as_ref().expect("vibration"), "Hz"),
        ] {
            assert!(drawing.title.contains(words), "{}", drawing.title);
            assert_eq!(drawing.members.len(), a.frame.model.members.len());
            let scene = mode_elevation(&a, &d, drawing, &ModeOptions::default(), viewport);
            let paths: Vec<&Item> = scene
                .items
                .iter()
                .filter(|i| {
                    matches!(i.shape, Shape::Path { .. }) && i.stroke.is_some_and(|s| s.ink == Ink::ModeShape)
                })
                .collect();
            assert_eq!(paths.len(), a.frame.model.members.len());
            let t = scene.transform.expect("a transform");
            let factor = shape_factor(drawing, a.form.span);
            let largest = drawing.members.iter().flatten().map(|p| p[2].hypot(p[3])).fold(0.0, f64::max);
            assert!((factor * largest - SHAPE_SHARE * a.form.span).abs() < 1e-9 * a.form.span);
            // the moved point furthest from its rest point on the drawing is 6 % of the span
            let mut moved_most = 0.0f64;
            for points in &drawing.members {
                for p in points {
                    let (rest, moved) = (t.px(p[0], p[1]), t.px(p[0] + factor * p[2], p[1] + factor * p[3]));
                    moved_most = moved_most.max((moved.x - rest.x).hypot(moved.y - rest.y));
                }
            }
            let expected = SHAPE_SHARE * a.form.span * t.scale;
            assert!((moved_most - expected).abs() < 1e-6 * expected, "{moved_most} vs {expected}");
            assert!(scene.overlapping_labels().is_empty(), "{:?}", scene.overlapping_labels());
            assert!(scene.labels_outside().is_empty());
            assert!(scene.labels.iter().any(|l| l.text.contains(words)), "the title is placed");
        }
    }
}
