//! Springline's colours (our own scheme): tension in deep teal, compression in burnt
//! orange, everything else in quiet greys and earth tones so forces stand out.

/// Members in tension.
pub const TENSION: &str = "#0f7c86";
/// Members in compression.
pub const COMPRESSION: &str = "#c8611e";
/// Members with no force.
pub const ZERO: &str = "#9aa3a8";
/// Text and joints.
pub const INK: &str = "#1f2a33";
/// Dimensions and secondary text.
pub const DIM: &str = "#5b6770";
/// Canvas background.
pub const SKY: &str = "#fbfaf7";
/// Ground fill and outline.
pub const GROUND_FILL: &str = "#e4dccb";
/// Ground outline.
pub const GROUND_LINE: &str = "#8c7b5a";
/// Thrust blocks and abutments.
pub const CONCRETE: &str = "#b9b4aa";
/// Applied loads.
pub const LOAD: &str = "#6a4c93";
/// Reactions.
pub const REACTION: &str = "#2d4f8a";
/// Hover highlight and its halo.
pub const HIGHLIGHT: &str = "#e3b505";
/// Halo under a highlighted member.
pub const HIGHLIGHT_HALO: &str = "rgba(227,181,5,0.35)";
