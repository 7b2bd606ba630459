//! Springline's colours as CSS strings for the parts still painted directly (the force
//! diagram until it becomes a scene): every one is the engine's `Ink::css`, so the
//! palette has one source.

use springline_statics::scene::Ink;

/// Members in tension.
pub const TENSION: &str = Ink::Tension.css();
/// Members in compression.
pub const COMPRESSION: &str = Ink::Compression.css();
/// Members with no force.
pub const ZERO: &str = Ink::Zero.css();
/// Text and joints.
pub const INK: &str = Ink::Text.css();
/// Dimensions and secondary text.
pub const DIM: &str = Ink::Secondary.css();
/// Canvas background.
pub const SKY: &str = Ink::Background.css();
/// Applied loads.
pub const LOAD: &str = Ink::Load.css();
/// Hover highlight.
pub const HIGHLIGHT: &str = Ink::Highlight.css();
/// Halo under a highlighted member.
pub const HIGHLIGHT_HALO: &str = Ink::HighlightHalo.css();
/// The thrust line.
pub const THRUST_LINE: &str = Ink::ThrustLine.css();
/// Reactions.
pub const REACTION: &str = Ink::Reaction.css();
