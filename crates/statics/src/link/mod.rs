//! The permalink codec: a whole design in the fragment of a URL, versioned, with caps.
//! Uses the arch layer (the design it carries).

pub mod comparison;
mod core_v1;
pub mod permalink;
mod sections;
