//! Graphic statics over solved plane models: the reciprocal figure (Bow's notation),
//! funicular polygons and the pole construction, and the thrust line of a rib. Uses the
//! frame layer only; members are named by the caller (which ones form the rib), never
//! found by a group name.
//!
//! Exception to the crate's no-panic lints: indexing (`clippy::indexing_slicing`) is
//! allowed in this layer, whose constructions index the lists they build together.

// why: indices come from the structure's own topology and form, checked by
// `frame::solver::validate` first, and from lists built together from them in one pass
// (load line, rays, polygon, faces and spaces: the same lengths)
#![allow(clippy::indexing_slicing)]

pub mod funicular;
pub mod reciprocal;
pub mod thrust_line;
