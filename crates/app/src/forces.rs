//! The force canvas: the engine builds the scene (`scene::force`, with the areas and
//! lookups the pointer needs); `paint.rs` paints it like any other scene.

use springline_statics::scene::force::{force_drawing, ForceDrawing, ForceOptions};
use springline_statics::scene::Viewport;
use springline_statics::Analysis;

/// The force drawing of load case `case` (index into `Analysis::load_cases`) for a canvas
/// of `viewport`'s size.
pub fn drawing(a: &Analysis, case: usize, opts: &ForceOptions, viewport: Viewport) -> ForceDrawing {
    force_drawing(a, case, opts, viewport)
}
