//! Numbers for people: the engine's display units and rounding (`springline_statics::units`),
//! re-exported so the components read them from one place.

pub use springline_statics::units::*;
