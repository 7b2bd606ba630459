//! What the fuzz targets share: the link's outer layer around raw bytes and designs made
//! from fuzz bytes (the check of finite outputs is the tests crate's `outputs`).

use base64::engine::general_purpose::URL_SAFE_NO_PAD;
use base64::Engine;
use springline_statics::arch::design::{Bracing, Crown, RibSystem};
use springline_statics::arch::form::Basis;
use springline_statics::traffic::models::ModelFamily;
use springline_statics::traffic::TrafficDesign;
use springline_statics::Design;
use springline_tests::family::family;

/// A link payload `tag.data` of arbitrary `bytes`, packed as the encoder packs a design
/// (zlib, then base64url), so the fuzzer reaches the design reader behind the checksum.
pub fn packed(tag: &str, bytes: &[u8]) -> String {
    format!("{tag}.{}", URL_SAFE_NO_PAD.encode(miniz_oxide::deflate::compress_to_vec_zlib(bytes, 6)))
}

/// Reads fuzz bytes as small numbers; past the end it reads zeros.
pub struct Bytes<'a> {
    data: &'a [u8],
}

impl<'a> Bytes<'a> {
    /// Reads `data` from its start.
    pub fn new(data: &'a [u8]) -> Self {
        Bytes { data }
    }

    /// The next byte (0 past the end).
    pub fn byte(&mut self) -> u8 {
        match self.data.split_first() {
            Some((first, rest)) => {
                self.data = rest;
                *first
            }
            None => 0,
        }
    }

    /// A value in `lo..=hi` from the next two bytes, evenly spread.
    pub fn within(&mut self, lo: f64, hi: f64) -> f64 {
        let raw = u16::from_le_bytes([self.byte(), self.byte()]);
        lo + (hi - lo) * f64::from(raw) / f64::from(u16::MAX)
    }

    /// A factor between `1/spread` and `spread`, spread evenly on a log scale.
    pub fn factor(&mut self, spread: f64) -> f64 {
        spread.powf(self.within(-1.0, 1.0))
    }

    /// A whole number in `lo..=hi`.
    pub fn count(&mut self, lo: usize, hi: usize) -> usize {
        lo + usize::from(self.byte()) % (hi - lo + 1)
    }
}

/// A design of the demo's family made from fuzz bytes (`springline_tests::family`: span
/// 12 to 400 m, rise/span 0.02 to 0.7, 2 to `max_panels` panels, 1 to 8 ribs, every rib
/// system and bracing), then moved off it: springings up or down, the crown by its level,
/// deck width and loads, shortest post, approach piers, form basis, every traffic model,
/// member sections scaled by up to 1000 either way. Most such designs are valid; the rest
/// test the refusals.
pub fn design_from(bytes: &mut Bytes, max_panels: usize) -> Design {
    let span = bytes.within(12.0, 400.0);
    let ratio = bytes.within(0.02, 0.7);
    let panels = bytes.count(2, max_panels);
    let ribs = bytes.count(1, 8);
    let system = [RibSystem::ThreeHinged, RibSystem::TwoHinged, RibSystem::Fixed][bytes.count(0, 2)];
    let bracing = [
        Bracing::None,
        Bracing::Single { flipped: false },
        Bracing::Single { flipped: true },
        Bracing::Crossed,
    ][bytes.count(0, 3)];
    let mut d = family(span, ratio, panels, ribs, system, bracing);
    d.springing_left_level += span * bytes.within(-0.1, 0.1);
    d.springing_right_level += span * bytes.within(-0.1, 0.1);
    if bytes.byte() % 2 == 1 {
        d.crown = Crown::Level { level: d.crown_level() + span * bytes.within(-0.05, 0.05) };
    }
    d.deck.width = bytes.within(2.5, 30.0);
    d.deck.dead_load *= bytes.factor(5.0);
    d.deck.surfacing = bytes.within(0.0, 5.0);
    d.min_post_length = bytes.within(0.0, 4.0);
    d.approach_piers_left = bytes.count(0, 4);
    d.approach_piers_right = bytes.count(0, 4);
    d.form.basis = if bytes.byte() % 3 == 0 { Basis::AsBuilt } else { Basis::PanelLoads };
    let family_key = ModelFamily::ALL[bytes.count(0, ModelFamily::ALL.len() - 1)];
    d.traffic = TrafficDesign::preset(family_key, (d.deck.width - 2.0).max(1.0));
    for section in [
        &mut d.groups.rib,
        &mut d.groups.deck,
        &mut d.groups.posts,
        &mut d.groups.piers,
        &mut d.groups.bracing,
    ] {
        section.a *= bytes.factor(1000.0);
        section.i *= bytes.factor(1000.0);
        section.e *= bytes.factor(10.0);
    }
    d
}
