//! Small components, one concern each.

pub mod actions;
pub mod canvases;
pub mod controls;
pub mod envelope;
pub mod exports;
pub mod influence_chart;
pub mod massing;
pub mod options;
pub mod print_sheet;
pub mod readout;
pub mod results;
pub mod scenarios;
pub mod seek;
pub mod shortcuts;
pub mod sizing;
pub mod stability;
pub mod status;
pub mod sweep;
pub mod toolbar;
pub mod traffic;
pub mod traffic_results;
