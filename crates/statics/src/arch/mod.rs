//! The deck arch: the design a user edits and its validation, the default layout, form
//! finding, generation of the analysis models, load cases and the whole analysis. Uses
//! the traffic, graphic and frame layers.

pub mod actions;
pub mod analysis;
pub mod as_built;
pub mod cases;
pub mod design;
pub mod design_file;
pub mod edit;
pub mod form;
pub mod foundation;
pub mod generate;
pub mod influence;
pub mod layout;
pub mod massing;
pub mod options;
pub mod quantities;
pub mod readout;
pub mod second_order;
pub mod seek;
pub mod sizing;
pub mod stability;
pub mod summary;
pub mod sweep;
pub mod tables;
pub mod traffic;
pub mod validate;
