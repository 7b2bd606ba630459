//! Graphic statics over solved plane models: the reciprocal figure (Bow's notation),
//! funicular polygons and the pole construction, and the thrust line of a rib. Uses the
//! frame layer only; members are named by the caller (which ones form the rib), never
//! found by a group name.

pub mod funicular;
pub mod reciprocal;
pub mod thrust_line;
