//! The permalink codec: a whole `Design` in the fragment of a URL, and back.
//!
//! # Format (our own)
//!
//! A link payload is a format tag, a dot and the data:
//!
//! ```text
//! s1.<base64url, no padding, of zlib(deflate) of the postcard bytes of the v1 wire design>
//! ```
//!
//! * `s1` is the link format version. A later format gets a new tag (`s2`, ...) and
//!   [`decode`] keeps reading every tag ever shipped: it dispatches on the tag, and each
//!   format has a frozen wire layout of its own (the v1 layout lives in `mod v1` below and
//!   must never change; committed fixtures under `tests/fixtures/links/` hold it to that).
//! * The wire design is written with `postcard` (a compact binary serde format: varint
//!   integers, f64 as their 8 little-endian bytes, so every number comes back bit for bit).
//! * The zlib wrapper carries an Adler-32 checksum of the inflated bytes: a cut or damaged
//!   link fails that check (or the deflate structure) instead of opening another design.
//! * In a URL the payload is the fragment: `...#s1.xxxx`. [`decode`] also accepts the
//!   fragment with its `#`, the payload alone, or the fragment keyed as `#d=s1.xxxx`.
//!
//! # Caps (a hostile link costs little)
//!
//! * at most [`MAX_LINK_LEN`] bytes of input, refused before any work;
//! * at most [`MAX_INFLATED_BYTES`] inflated bytes: the inflater writes into a buffer of
//!   that fixed size and stops there, so a deflate bomb never allocates beyond it;
//! * trailing data after the compressed stream or after the design is refused;
//! * the decoded design must pass `validate_design`.

use crate::arch::design::{
    Bracing, Crown, Deck, Design, FormSettings, GroundPoint, MemberGroups, RibSystem, Section,
};
use crate::arch::validate::validate_design;
use crate::error::StaticsError;
use base64::Engine as _;

/// The tag of the link format written by [`encode`].
pub const CURRENT_FORMAT: &str = "s1";
/// Every link format [`decode`] reads, oldest first (each keeps a committed fixture).
pub const READABLE_FORMATS: &[&str] = &["s1"];
/// The optional key before the payload in a URL fragment (`#d=s1.xxxx`).
pub const LINK_KEY: &str = "d=";
/// Longest input [`decode`] looks at, bytes (a link of the demo design is well under
/// 2,000; URLs much longer than this are cut by some browsers and chat tools anyway).
pub const MAX_LINK_LEN: usize = 8_000;
/// Largest inflated payload accepted, bytes (the demo design takes a few hundred; this leaves
/// room for a valley of a few thousand points).
pub const MAX_INFLATED_BYTES: usize = 64 * 1024;
/// Deflate level used by [`encode`] (miniz scale 0 to 10; links are small, so the best).
const DEFLATE_LEVEL: u8 = 10;

/// The base64url alphabet without padding; strict: padding and non-zero trailing bits are
/// refused on decoding.
const B64: base64::engine::GeneralPurpose = base64::engine::general_purpose::URL_SAFE_NO_PAD;

/// Encodes a design as a link payload `s1.xxxx` (put it after `#` in a URL).
///
/// Every field of the design is kept exactly (numbers bit for bit), so
/// `decode(&encode(d)) == Ok(d)` for every valid design `d`. The design is not validated
/// here: a link of an invalid design is written, but [`decode`] refuses it, so callers
/// that share links should validate first. The result is ASCII (`[A-Za-z0-9._-]`);
/// a typical design gives a few hundred characters. Never panics.
pub fn encode(design: &Design) -> String {
    let bytes = v1::to_bytes(design);
    let packed = miniz_oxide::deflate::compress_to_vec_zlib(&bytes, DEFLATE_LEVEL);
    format!("{CURRENT_FORMAT}.{}", B64.encode(packed))
}

/// Decodes a link into a valid design.
///
/// `link` may be a whole URL (the part after the first `#` is read), a fragment with or
/// without its `#`, optionally keyed as `d=`, or the payload alone; surrounding white
/// space is ignored. Every format in [`READABLE_FORMATS`] is read.
///
/// Errors (never a panic, whatever the input): `StaticsError::Unreadable { what: "link" }`
/// with a reason a user can act on, when the link is empty, longer than
/// [`MAX_LINK_LEN`], not a Springline link, of an unknown (newer) format, not strict
/// base64url, cut short or damaged (checksum), would inflate beyond
/// [`MAX_INFLATED_BYTES`], carries trailing data, or holds a design that fails
/// `validate_design` (the reason then lists every problem).
pub fn decode(link: &str) -> Result<Design, StaticsError> {
    let design = decode_unchecked(link)?;
    match validate_design(&design) {
        Ok(_) => Ok(design),
        Err(StaticsError::Invalid(problems)) => Err(unreadable(format!(
            "the design it holds is not valid ({})",
            problems.iter().map(|p| p.to_string()).collect::<Vec<_>>().join("; ")
        ))),
        Err(other) => Err(unreadable(format!("the design it holds cannot be used: {other}"))),
    }
}

/// Decodes a link without validating the design it holds (the wire checks all apply).
fn decode_unchecked(link: &str) -> Result<Design, StaticsError> {
    if link.len() > MAX_LINK_LEN {
        return Err(unreadable(format!(
            "it is {} characters long; links longer than {MAX_LINK_LEN} are refused \
             (a design link is usually under 2,000)",
            link.len()
        )));
    }
    let trimmed = link.trim();
    let fragment = match trimmed.split_once('#') {
        Some((_, fragment)) => fragment,
        None => trimmed,
    };
    let payload = fragment.strip_prefix(LINK_KEY).unwrap_or(fragment);
    if payload.is_empty() {
        return Err(unreadable(format!(
            "it holds no design: a design link ends in '#{CURRENT_FORMAT}.' followed by letters, digits, '-' and '_'"
        )));
    }
    let Some((tag, data)) = payload.split_once('.') else { return Err(not_a_link()) };
    match tag {
        "s1" => v1::from_bytes(&inflate(&unbase64(data)?)?),
        _ => match tag.strip_prefix('s').and_then(|n| n.parse::<u32>().ok()) {
            Some(_) => Err(unreadable(format!(
                "it uses link format '{tag}', which this version of Springline does not know \
                 (it reads {}); open it with a newer version",
                READABLE_FORMATS.join(", ")
            ))),
            None => Err(not_a_link()),
        },
    }
}

fn unreadable(reason: String) -> StaticsError {
    StaticsError::Unreadable { what: "link".into(), reason }
}

fn not_a_link() -> StaticsError {
    unreadable(format!(
        "it is not a Springline design link: after the '#' it should start with a format tag \
         such as '{CURRENT_FORMAT}.'"
    ))
}

/// Strict base64url (no padding) to bytes.
fn unbase64(data: &str) -> Result<Vec<u8>, StaticsError> {
    use base64::DecodeError as E;
    B64.decode(data).map_err(|e| {
        unreadable(match e {
            E::InvalidByte(at, _) | E::InvalidLastSymbol(at, _) => format!(
                "character {} of its data is not allowed there (only letters, digits, '-' and '_'); \
                 was the link cut or changed when copied?",
                at + 1
            ),
            E::InvalidLength(_) | E::InvalidPadding => {
                "its data has a length no link can have: it was cut short or extended; copy the whole link"
                    .into()
            }
        })
    })
}

/// Inflates a zlib stream into at most `MAX_INFLATED_BYTES`, checking its Adler-32
/// checksum, and refuses trailing input. The output buffer has that fixed size, so a
/// deflate bomb costs no more memory than the cap.
fn inflate(packed: &[u8]) -> Result<Vec<u8>, StaticsError> {
    use miniz_oxide::inflate::core::{decompress, inflate_flags, DecompressorOxide};
    use miniz_oxide::inflate::TINFLStatus as S;
    let flags =
        inflate_flags::TINFL_FLAG_PARSE_ZLIB_HEADER | inflate_flags::TINFL_FLAG_USING_NON_WRAPPING_OUTPUT_BUF;
    let mut out = vec![0u8; MAX_INFLATED_BYTES];
    let mut state = Box::<DecompressorOxide>::default();
    let (status, consumed, written) = decompress(&mut state, packed, &mut out, 0, flags);
    match status {
        S::Done if consumed == packed.len() => {
            out.truncate(written);
            Ok(out)
        }
        S::Done => Err(unreadable(
            "it has extra data after the design; copy the link again without additions".into(),
        )),
        S::HasMoreOutput => Err(unreadable(format!(
            "it would expand beyond {MAX_INFLATED_BYTES} bytes, far more than any design needs; refused"
        ))),
        S::Adler32Mismatch => {
            Err(unreadable("its data is damaged (checksum mismatch); copy the link again".into()))
        }
        S::FailedCannotMakeProgress | S::NeedsMoreInput => {
            Err(unreadable("its data is cut short; copy the whole link".into()))
        }
        _ => {
            Err(unreadable("its data is damaged (not a valid compressed stream); copy the link again".into()))
        }
    }
}

/// Link format 1: the wire layout of a design. FROZEN: links of this format are out in
/// the world. Never reorder, add or remove a field here; a new layout is a new module,
/// a new tag and a new fixture.
mod v1 {
    use super::*;
    use serde::{Deserialize, Serialize};

    #[derive(Serialize, Deserialize)]
    struct Wire {
        design_version: u32,
        name: String,
        valley: Vec<(f64, f64)>,
        deck: WireDeck,
        springing_left_level: f64,
        springing_right_level: f64,
        panels: u64,
        crown: WireCrown,
        min_post_length: f64,
        rib_system: WireRibSystem,
        bracing: WireBracing,
        approach_piers_left: u64,
        approach_piers_right: u64,
        /// rib, deck, posts, piers, bracing
        groups: [WireSection; 5],
        form_tolerance: f64,
        form_max_iterations: u64,
    }

    #[derive(Serialize, Deserialize)]
    struct WireDeck {
        level: f64,
        left_seat_x: f64,
        right_seat_x: f64,
        width: f64,
        ribs: u64,
        dead_load: f64,
        surfacing: f64,
    }

    #[derive(Serialize, Deserialize)]
    enum WireCrown {
        Rise(f64),
        Level(f64),
    }

    #[derive(Serialize, Deserialize)]
    enum WireRibSystem {
        ThreeHinged,
        TwoHinged,
        Fixed,
    }

    #[derive(Serialize, Deserialize)]
    enum WireBracing {
        None,
        Single { flipped: bool },
        Crossed,
    }

    #[derive(Serialize, Deserialize)]
    struct WireSection {
        e: f64,
        a: f64,
        i: f64,
        depth: f64,
        unit_weight: f64,
    }

    fn section(s: &Section) -> WireSection {
        let Section { e, a, i, depth, unit_weight } = *s;
        WireSection { e, a, i, depth, unit_weight }
    }

    fn back(s: &WireSection) -> Section {
        Section { e: s.e, a: s.a, i: s.i, depth: s.depth, unit_weight: s.unit_weight }
    }

    /// usize always fits u64 on the targets we build for (64 and 32 bit).
    fn wide(n: usize) -> u64 {
        n as u64
    }

    fn narrow(n: u64, field: &str) -> Result<usize, StaticsError> {
        usize::try_from(n).map_err(|_| unreadable(format!("its {field} ({n}) is too large for this machine")))
    }

    /// The postcard bytes of a design. The destructuring is exhaustive on purpose: a new
    /// field of `Design` stops the build here, to be given a place in a new format.
    pub(super) fn to_bytes(d: &Design) -> Vec<u8> {
        let Design {
            version,
            name,
            valley,
            deck,
            springing_left_level,
            springing_right_level,
            panels,
            crown,
            min_post_length,
            rib_system,
            bracing,
            approach_piers_left,
            approach_piers_right,
            groups,
            form,
        } = d;
        // TODO(link format 2): the abutment height is not on the v1 wire yet
        let Deck { level, left_seat_x, right_seat_x, width, ribs, dead_load, surfacing, abutment_height: _ } =
            *deck;
        let MemberGroups { rib, deck: deck_group, posts, piers, bracing: bracing_group } = groups;
        let FormSettings { tolerance, max_iterations } = *form;
        let wire = Wire {
            design_version: *version,
            name: name.clone(),
            valley: valley.iter().map(|p| (p.x, p.y)).collect(),
            deck: WireDeck {
                level,
                left_seat_x,
                right_seat_x,
                width,
                ribs: wide(ribs),
                dead_load,
                surfacing,
            },
            springing_left_level: *springing_left_level,
            springing_right_level: *springing_right_level,
            panels: wide(*panels),
            crown: match *crown {
                Crown::Rise { rise } => WireCrown::Rise(rise),
                Crown::Level { level } => WireCrown::Level(level),
            },
            min_post_length: *min_post_length,
            rib_system: match rib_system {
                RibSystem::ThreeHinged => WireRibSystem::ThreeHinged,
                RibSystem::TwoHinged => WireRibSystem::TwoHinged,
                RibSystem::Fixed => WireRibSystem::Fixed,
            },
            bracing: match *bracing {
                Bracing::None => WireBracing::None,
                Bracing::Single { flipped } => WireBracing::Single { flipped },
                Bracing::Crossed => WireBracing::Crossed,
            },
            approach_piers_left: wide(*approach_piers_left),
            approach_piers_right: wide(*approach_piers_right),
            groups: [
                section(rib),
                section(deck_group),
                section(posts),
                section(piers),
                section(bracing_group),
            ],
            form_tolerance: tolerance,
            form_max_iterations: wide(max_iterations),
        };
        // Serialising into a growable vector fails only for sequences of unknown length,
        // which these types do not have.
        postcard::to_allocvec(&wire).unwrap_or_default()
    }

    /// A design from postcard bytes; the bytes must be used up exactly.
    pub(super) fn from_bytes(bytes: &[u8]) -> Result<Design, StaticsError> {
        let (w, rest) = postcard::take_from_bytes::<Wire>(bytes)
            .map_err(|e| unreadable(format!("its design data is damaged ({e})")))?;
        if !rest.is_empty() {
            return Err(unreadable(format!(
                "its design data has {} unexpected bytes at the end",
                rest.len()
            )));
        }
        let [rib, deck_group, posts, piers, bracing_group] = &w.groups;
        Ok(Design {
            version: w.design_version,
            name: w.name,
            valley: w.valley.iter().map(|&(x, y)| GroundPoint { x, y }).collect(),
            deck: Deck {
                level: w.deck.level,
                left_seat_x: w.deck.left_seat_x,
                right_seat_x: w.deck.right_seat_x,
                width: w.deck.width,
                ribs: narrow(w.deck.ribs, "number of ribs")?,
                dead_load: w.deck.dead_load,
                surfacing: w.deck.surfacing,
                abutment_height: crate::arch::design::DEFAULT_ABUTMENT_HEIGHT,
            },
            springing_left_level: w.springing_left_level,
            springing_right_level: w.springing_right_level,
            panels: narrow(w.panels, "number of panels")?,
            crown: match w.crown {
                WireCrown::Rise(rise) => Crown::Rise { rise },
                WireCrown::Level(level) => Crown::Level { level },
            },
            min_post_length: w.min_post_length,
            rib_system: match w.rib_system {
                WireRibSystem::ThreeHinged => RibSystem::ThreeHinged,
                WireRibSystem::TwoHinged => RibSystem::TwoHinged,
                WireRibSystem::Fixed => RibSystem::Fixed,
            },
            bracing: match w.bracing {
                WireBracing::None => Bracing::None,
                WireBracing::Single { flipped } => Bracing::Single { flipped },
                WireBracing::Crossed => Bracing::Crossed,
            },
            approach_piers_left: narrow(w.approach_piers_left, "number of left approach piers")?,
            approach_piers_right: narrow(w.approach_piers_right, "number of right approach piers")?,
            groups: MemberGroups {
                rib: back(rib),
                deck: back(deck_group),
                posts: back(posts),
                piers: back(piers),
                bracing: back(bracing_group),
            },
            form: FormSettings {
                tolerance: w.form_tolerance,
                max_iterations: narrow(w.form_max_iterations, "form-finding iteration limit")?,
            },
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    fn reason(r: Result<Design, StaticsError>) -> String {
        match r {
            Err(StaticsError::Unreadable { what, reason }) => {
                assert_eq!(what, "link");
                reason
            }
            other => panic!("expected an unreadable link, got {other:?}"),
        }
    }

    /// A link payload of arbitrary bytes, zlib-packed as the encoder does.
    fn packed_link(bytes: &[u8]) -> String {
        format!("s1.{}", B64.encode(miniz_oxide::deflate::compress_to_vec_zlib(bytes, 6)))
    }

    #[test]
    fn demo_link_round_trips_and_is_short() {
        let d = Design::demo();
        let link = encode(&d);
        assert!(link.starts_with("s1."), "{link}");
        assert!(link.len() < 2_000, "demo link is {} characters", link.len());
        assert!(link.bytes().all(|b| b.is_ascii_alphanumeric() || b"._-".contains(&b)), "{link}");
        assert_eq!(decode(&link), Ok(d.clone()));
        // the same payload inside a URL, as a fragment, keyed, with white space
        for wrapped in [
            format!("http://localhost:8080/index.html#{link}"),
            format!("#{link}"),
            format!("#d={link}"),
            format!("  {link}\n"),
        ] {
            assert_eq!(decode(&wrapped), Ok(d.clone()), "{wrapped}");
        }
    }

    #[test]
    fn truncated_link_fails_at_every_byte() {
        let link = format!("#{}", encode(&Design::demo()));
        for cut in 0..link.len() {
            let r = reason(decode(&link[..cut]));
            assert!(!r.is_empty(), "cut at {cut}");
        }
        // the cut data itself (not the tag) is named as cut or damaged
        let cut = &link[..link.len() - 5];
        let r = reason(decode(cut));
        assert!(r.contains("cut") || r.contains("damaged"), "{r}");
    }

    #[test]
    fn corrupted_link_fails_at_every_character() {
        let demo = Design::demo();
        let link = encode(&demo);
        let mut harmless = 0;
        let alphabet = b"ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";
        let bytes = link.as_bytes();
        for at in 3..bytes.len() {
            for shift in [1, 17, 40] {
                let k = alphabet.iter().position(|&c| c == bytes[at]).expect("base64url character");
                let mut changed = bytes.to_vec();
                changed[at] = alphabet[(k + shift) % alphabet.len()];
                let text = String::from_utf8(changed).expect("ascii");
                match decode(&text) {
                    Err(StaticsError::Unreadable { .. }) => {}
                    // a changed bit deflate never reads (spare bits of the last byte, an
                    // unused code length) may leave the design as it was: never another
                    Ok(same) if same == demo => harmless += 1,
                    other => panic!("character {at} changed: {other:?}"),
                }
            }
        }
        assert!(harmless * 100 < link.len(), "{harmless} changes left the link readable");
        // a character outside the alphabet is named with its position
        let mut bad = link.clone();
        bad.replace_range(10..11, "+");
        assert!(reason(decode(&bad)).contains("character 8"), "{bad}");
        // appended junk: either a length no link can have or data after the stream
        for extra in ["A", "AA", "AAAA"] {
            reason(decode(&format!("{link}{extra}")));
        }
    }

    #[test]
    fn deflate_bomb_is_refused_at_the_cap() {
        // 10 MB of zeros deflate to about 10 kB: the inflater stops at the cap.
        let bomb = miniz_oxide::deflate::compress_to_vec_zlib(&vec![0u8; 10_000_000], 10);
        let r = match inflate(&bomb) {
            Err(StaticsError::Unreadable { reason, .. }) => reason,
            other => panic!("bomb inflated: {:?}", other.map(|v| v.len())),
        };
        assert!(r.contains("expand beyond 65536 bytes"), "{r}");
        // a bomb small enough to pass the length cap as a whole link
        let link = packed_link(&vec![0u8; 2_000_000]);
        assert!(link.len() < MAX_LINK_LEN, "{}", link.len());
        assert!(reason(decode(&link)).contains("expand beyond"));
        // just under the cap inflates (and then fails as a design, cleanly)
        let link = packed_link(&vec![0u8; MAX_INFLATED_BYTES]);
        assert!(reason(decode(&link)).contains("design data"));
    }

    #[test]
    fn oversized_and_foreign_links_are_refused_with_reasons() {
        let long = format!("s1.{}", "A".repeat(MAX_LINK_LEN));
        assert!(reason(decode(&long)).contains("links longer than 8000 are refused"));
        assert!(reason(decode("")).contains("holds no design"));
        assert!(reason(decode("http://localhost/#")).contains("holds no design"));
        assert!(reason(decode("hello")).contains("not a Springline design link"));
        assert!(reason(decode("http://localhost/index.html")).contains("not a Springline design link"));
        let r = reason(decode("#s2.AAAA"));
        assert!(r.contains("'s2'") && r.contains("newer version") && r.contains("s1"), "{r}");
        assert!(reason(decode("#s1.")).contains("cut short"));
        assert!(reason(decode("#s1.A=")).contains("not allowed"));
    }

    #[test]
    fn hostile_payloads_are_refused_cleanly() {
        // random-looking bytes, a huge sequence length, trailing bytes after a design
        reason(decode(&packed_link(&[0xff; 100])));
        reason(decode(&packed_link(&[1, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0x7f])));
        let mut bytes = v1::to_bytes(&Design::demo());
        bytes.push(0);
        assert!(reason(decode(&packed_link(&bytes))).contains("unexpected bytes"));
        // trailing data after the zlib stream
        let mut packed = miniz_oxide::deflate::compress_to_vec_zlib(&v1::to_bytes(&Design::demo()), 6);
        packed.extend_from_slice(&[0, 0, 0]);
        assert!(reason(decode(&format!("s1.{}", B64.encode(packed)))).contains("extra data"));
        // a raw deflate stream without the zlib checksum
        let raw = miniz_oxide::deflate::compress_to_vec(&v1::to_bytes(&Design::demo()), 6);
        reason(decode(&format!("s1.{}", B64.encode(raw))));
    }

    #[test]
    fn invalid_design_in_a_link_is_refused_with_its_problems() {
        let mut d = Design::demo();
        d.panels = 1;
        d.deck.width = -1.0;
        let link = encode(&d);
        // the wire round trip itself is exact
        assert_eq!(decode_unchecked(&link), Ok(d));
        let r = reason(decode(&link));
        assert!(r.contains("not valid") && r.contains("panels") && r.contains("deck.width"), "{r}");
    }

    /// A valid design near the demo: numbers within ranges the validation accepts.
    fn near_demo() -> impl Strategy<Value = Design> {
        (
            (70.0f64..90.0, 72.0f64..90.0, 3.0f64..9.0, any::<bool>(), 2usize..40),
            (0usize..3, 0usize..3, 0usize..3, 0usize..4, any::<bool>()),
            proptest::collection::vec(0.5f64..2.0, 25),
            (-2.0f64..2.0, 0.0f64..2.5, 1usize..4, "[ -~]{0,40}", 1e-12f64..1e-3, 1usize..500),
        )
            .prop_map(|(geo, sys, scales, misc)| {
                let (dl, dr, rise_or_gap, by_rise, panels) = geo;
                let (rib, brace, pl, pr, flipped) = sys;
                let (floor, min_post, ribs, name, tol, iters) = misc;
                let mut d = Design::demo();
                d.springing_left_level = dl;
                d.springing_right_level = dr;
                let top = dl.max(dr);
                d.crown = if by_rise {
                    Crown::Rise { rise: rise_or_gap + (top - dl.min(dr)) / 2.0 }
                } else {
                    Crown::Level { level: (top + rise_or_gap).min(99.0) }
                };
                d.panels = panels;
                d.rib_system = [RibSystem::ThreeHinged, RibSystem::TwoHinged, RibSystem::Fixed][rib];
                d.bracing = [Bracing::None, Bracing::Single { flipped }, Bracing::Crossed][brace];
                d.approach_piers_left = pl;
                d.approach_piers_right = pr;
                for p in d.valley.iter_mut().filter(|p| p.x > 40.0 && p.x < 120.0) {
                    p.y += floor;
                }
                d.min_post_length = min_post;
                d.deck.ribs = ribs;
                d.deck.width *= scales[0];
                d.deck.dead_load *= scales[1];
                d.deck.surfacing *= scales[2];
                let groups = &mut d.groups;
                for (k, s) in [
                    &mut groups.rib,
                    &mut groups.deck,
                    &mut groups.posts,
                    &mut groups.piers,
                    &mut groups.bracing,
                ]
                .into_iter()
                .enumerate()
                {
                    s.e *= scales[3 + 4 * k];
                    s.a *= scales[4 + 4 * k];
                    s.i *= scales[5 + 4 * k];
                    s.depth *= scales[6 + 4 * k];
                }
                d.name = name;
                d.form.tolerance = tol;
                d.form.max_iterations = iters;
                d
            })
    }

    proptest! {
        #![proptest_config(ProptestConfig { cases: 64, .. ProptestConfig::default() })]
        /// Valid designs come back from their link exactly (== on every field).
        #[test]
        fn random_valid_designs_round_trip_exactly(d in near_demo()) {
            prop_assume!(validate_design(&d).is_ok());
            let link = encode(&d);
            prop_assert!(link.len() < 2_000, "{}", link.len());
            prop_assert_eq!(decode(&link), Ok(d));
        }

        /// The wire layer keeps any numbers bit for bit (NaN, infinities, -0, subnormals)
        /// and any counts and text.
        #[test]
        fn wire_round_trip_is_bit_exact(
            xs in proptest::collection::vec(any::<f64>(), 12),
            counts in proptest::collection::vec(any::<usize>(), 5),
            name in ".{0,30}",
        ) {
            let mut d = Design::demo();
            d.valley = xs.chunks(2).map(|c| GroundPoint { x: c[0], y: c[1] }).collect();
            d.springing_left_level = xs[0];
            d.crown = Crown::Rise { rise: xs[1] };
            d.groups.rib.e = xs[2];
            d.form.tolerance = xs[3];
            d.deck.ribs = counts[0];
            d.panels = counts[1];
            d.approach_piers_left = counts[2];
            d.approach_piers_right = counts[3];
            d.form.max_iterations = counts[4];
            d.name = name;
            let back = decode_unchecked(&encode(&d)).map_err(|e| TestCaseError::fail(e.to_string()))?;
            prop_assert_eq!(format!("{back:?}"), format!("{d:?}"));
            let bits = |d: &Design| d.valley.iter().flat_map(|p| [p.x.to_bits(), p.y.to_bits()]).collect::<Vec<_>>();
            prop_assert_eq!(bits(&back), bits(&d));
        }

        /// Arbitrary text never panics the decoder.
        #[test]
        fn arbitrary_text_never_panics(s in ".{0,200}", t in "[A-Za-z0-9_-]{0,300}") {
            let _ = decode(&s);
            let link = format!("s1.{t}");
            prop_assert!(decode(&link).is_err());
        }
    }
}
