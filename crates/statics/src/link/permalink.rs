//! The permalink codec: a whole `Design` in the fragment of a URL, and back.
//!
//! # Format (our own)
//!
//! A link payload is a format tag, a dot and the data:
//!
//! ```text
//! s2.<base64url, no padding, of zlib(deflate) of the postcard bytes of: core, sections>
//! s1.<base64url, no padding, of zlib(deflate) of the postcard bytes of: core>
//! ```
//!
//! * The tag (`s1`, `s2`) is the link format. [`encode`] writes [`CURRENT_FORMAT`];
//!   [`decode`] reads every tag ever shipped ([`READABLE_FORMATS`]) and refuses another
//!   as made by a newer version.
//! * The *core* is every field of design format 1 in a fixed order (`core_v1`, FROZEN);
//!   `s1` is the core alone.
//! * `s2` follows the core with a list of tagged *sections* (`sections`): a count, then
//!   per section its tag and its body, the length-prefixed postcard bytes of a frozen
//!   struct of its own. Design format 2 adds section 1, the abutment height; design format
//!   3 section 2, the traffic (carriageway, rib positions, load model, combinations). A later
//!   design field is a new section with a new tag, so the layout grows without a new
//!   link format and without breaking old links: a reader fills the default of every
//!   section a link lacks and refuses a tag it does not know ("made by a newer
//!   version"), never dropping a value the user set.
//! * The core starts with the design format version of the writer. A link of a newer
//!   design version than this reader is refused; an older one is updated to the
//!   current version as it is read (`s1`: design format 1, abutment height 10 m; `s1` and
//!   `s2` links without section 2: EN 1991-2 Load Model 1 over the whole deck width).
//! * postcard is a compact binary serde format: varint integers, f64 as their 8
//!   little-endian bytes, so every number comes back bit for bit.
//! * The zlib wrapper carries an Adler-32 checksum of the inflated bytes: a cut or damaged
//!   link fails that check (or the deflate structure) instead of opening another design.
//! * In a URL the payload is the fragment: `...#s2.xxxx`. [`decode`] also accepts the
//!   fragment with its `#`, the payload alone, or the fragment keyed as `#d=s2.xxxx`.
//!
//! # The view part (what the screen shows, not the design)
//!
//! A fragment may go on after the design payload with a *view part*:
//!
//! ```text
//! #s2.xxxx~view:c=half-left;u=us
//! ```
//!
//! * `~` ends the design payload (it is outside the base64url alphabet, so no payload
//!   holds it); what follows is the view part, read by [`split_view`] into a
//!   [`ViewState`]. The design payload is byte for byte what [`encode`] writes, with or
//!   without a view part, and [`decode`] reads the design alone.
//! * `view:` then `key=value` pairs separated by `;`: `c` the load case shown (the stable
//!   id of `CaseKind::id`: `dead`, `half-left`, `panel-3` ...), `u` the display units
//!   (`si` or `us`). Unknown keys, bad values and a view part of another kind are
//!   ignored: a view part can never stop a design from opening.
//!
//! # Caps (a hostile link costs little)
//!
//! * at most [`MAX_LINK_LEN`] bytes of input, refused before any work;
//! * the data is strict base64url: a character outside the alphabet is named with its
//!   position; a length or last character no encoder writes is refused as cut short;
//! * at most [`MAX_INFLATED_BYTES`] inflated bytes: the inflater writes into a buffer of
//!   that fixed size and stops there, so a deflate bomb never allocates beyond it;
//! * trailing data after the compressed stream, after the design or inside a section is
//!   refused;
//! * the decoded design must pass `validate_design`.

use super::core_v1;
use super::sections::{self, RawSection, SectionKind, SECTIONS};
use crate::arch::design::{Design, DESIGN_VERSION};
use crate::arch::design_file::OLDEST_DESIGN_VERSION;
use crate::arch::validate::validate_design;
use crate::error::{Field, LinkError, Problem, StaticsError, VersionRange};
use crate::units::Units;
use base64::Engine as _;
use serde::{Deserialize, Serialize};
use std::ops::RangeInclusive;

/// The tag of the link format written by [`encode`].
pub const CURRENT_FORMAT: &str = "s2";
/// Every link format [`decode`] reads, oldest first (each keeps a committed fixture).
pub const READABLE_FORMATS: &[&str] = &["s1", "s2"];
/// The optional key before the payload in a URL fragment (`#d=s2.xxxx`).
pub const LINK_KEY: &str = "d=";
/// Where the design payload of a fragment ends and its view part begins.
pub const VIEW_SEPARATOR: char = '~';
/// The kind prefix of the view part this reader knows (`~view:c=dead;u=si`).
pub const VIEW_PREFIX: &str = "view:";
/// Longest load case id a view part carries (longer ones are ignored).
const MAX_CASE_ID_LEN: usize = 40;
/// Longest input [`decode`] looks at, bytes (a link of the demo design is well under
/// 2,000; URLs much longer than this are cut by some browsers and chat tools anyway).
pub const MAX_LINK_LEN: usize = 8_000;
/// Largest inflated payload accepted, bytes (the demo design takes about a thousand; this leaves
/// room for a valley of a few thousand points).
pub const MAX_INFLATED_BYTES: usize = 64 * 1024;
/// Deflate level used by [`encode`] (miniz scale 0 to 10; links are small, so the best).
const DEFLATE_LEVEL: u8 = 10;
/// The design format versions each link format was written with: `s1` only by design
/// format 1, `s2` from design format 2 on.
const S1_DESIGN_VERSIONS: RangeInclusive<u32> = 1..=1;
const S2_FIRST_DESIGN_VERSION: u32 = 2;

/// The base64url alphabet without padding; strict: padding and non-zero trailing bits are
/// refused on decoding.
const B64: base64::engine::GeneralPurpose = base64::engine::general_purpose::URL_SAFE_NO_PAD;

/// Link format `s2` on the wire: the frozen core, then the tagged sections.
#[derive(Serialize, Deserialize)]
pub(super) struct WireS2 {
    core: core_v1::Wire,
    sections: Vec<RawSection>,
}

impl WireS2 {
    /// The wire form of `design` (what [`encode`] packs).
    pub(super) fn of(design: &Design) -> WireS2 {
        WireS2 { core: core_v1::from_design(design), sections: sections::write_all(SECTIONS, design) }
    }

    /// The design it holds, updated to the current design version (not validated).
    pub(super) fn into_design(self) -> Result<Design, LinkError> {
        let found = self.core.design_version;
        let version = updated_version(found, "s2", S2_FIRST_DESIGN_VERSION..=DESIGN_VERSION, DESIGN_VERSION)?;
        let mut design = core_v1::into_design(self.core)?;
        design.version = version;
        sections::read_all(&self.sections, SECTIONS, &mut design)?;
        Ok(design)
    }
}

/// Encodes a design as a link payload `s2.xxxx` (put it after `#` in a URL).
///
/// Every field of the design is kept exactly (numbers bit for bit), so
/// `decode(&encode(d)) == Ok(d)` for every valid design `d`. The design is not validated
/// here: a link of an invalid design is written, but [`decode`] refuses it, so callers
/// that share links should validate first. The result is ASCII (`[A-Za-z0-9._-]`);
/// a typical design gives a few hundred characters. Never panics.
pub fn encode(design: &Design) -> String {
    pack(CURRENT_FORMAT, &postcard_bytes(&WireS2::of(design)))
}

/// Decodes a link into a valid design of the current design format version.
///
/// `link` may be a whole URL (the part after the first `#` is read), a fragment with or
/// without its `#`, optionally keyed as `d=`, or the payload alone; surrounding white
/// space and a view part (`~view:...`, see [`split_view`]) are ignored. Every format in [`READABLE_FORMATS`] is read; a link of an older
/// design format is updated (fields it lacks take their defaults).
///
/// Errors (never a panic, whatever the input): `StaticsError::Link` with a kind whose
/// message a user can act on: the link is empty, longer than [`MAX_LINK_LEN`], not a
/// Springline link, of an unknown (newer) format, not strict base64url (the character
/// and its position), cut short, damaged (checksum, deflate structure, design data),
/// would inflate beyond [`MAX_INFLATED_BYTES`], carries trailing data, holds a section
/// or design version of a newer Springline, or holds a design that fails
/// `validate_design` (`Invalid` lists every problem).
pub fn decode(link: &str) -> Result<Design, StaticsError> {
    let design = decode_unchecked(link)?;
    match validate_design(&design) {
        Ok(_) => Ok(design),
        Err(StaticsError::Invalid(problems)) => Err(LinkError::Invalid(problems).into()),
        Err(other) => Err(LinkError::Unusable(Box::new(other)).into()),
    }
}

/// Decodes a link without validating the design it holds (the wire checks all apply).
fn decode_unchecked(link: &str) -> Result<Design, LinkError> {
    let (tag, data) = payload(link)?;
    match tag {
        "s1" => read_s1(&unpack(data)?),
        "s2" => read_s2(&unpack(data)?, DESIGN_VERSION, SECTIONS, |design| design),
        _ if tag.starts_with(super::comparison::TAG_LETTER) => Err(LinkError::ComparisonNotDesign),
        _ => Err(LinkError::UnknownFormat { tag: tag.to_string(), readable: READABLE_FORMATS }),
    }
}

/// A design as text for the app's own background worker to hand back to its page (the
/// design file the worker read): the link's wire data, base64url but not compressed, and
/// without the caps that guard a pasted link ([`MAX_LINK_LEN`], [`MAX_INFLATED_BYTES`]): a
/// design file may hold a longer ground profile than a link can. Every field is kept bit
/// for bit; read it with [`from_transfer`]. Not for sharing: a link is [`encode`]'s.
pub fn to_transfer(design: &Design) -> String {
    B64.encode(postcard_bytes(&WireS2::of(design)))
}

/// Reads [`to_transfer`]'s text back into its design, which is not validated: the reader
/// checks it as it checks any edit, with the words of the field each problem is in.
///
/// Errors (never a panic): `StaticsError::Link` when the text is not such a design (a
/// character outside base64url, cut short, damaged design data, a newer version).
pub fn from_transfer(text: &str) -> Result<Design, StaticsError> {
    Ok(read_s2(&unbase64(text.trim())?, DESIGN_VERSION, SECTIONS, |design| design)?)
}

/// What a link says about the screen, apart from the design: the load case shown and the
/// display units. Each is `None` when the link does not say (or says it in a way this
/// reader does not understand): the app keeps its own choice then.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct ViewState {
    /// The stable id of the load case shown (`CaseKind::id`: `dead`, `half-left`, ...).
    pub case: Option<String>,
    /// The display units.
    pub units: Option<Units>,
}

impl ViewState {
    /// The view part's text after `~`: `view:c=dead;u=us` (only the keys that are set);
    /// empty when nothing is set. Put it after a design payload with [`with_view`].
    pub fn encode(&self) -> String {
        let mut pairs = Vec::new();
        if let Some(case) = self.case.as_deref().filter(|c| is_case_id(c)) {
            pairs.push(format!("c={case}"));
        }
        if let Some(units) = self.units {
            pairs.push(format!("u={}", units.key()));
        }
        if pairs.is_empty() {
            String::new()
        } else {
            format!("{VIEW_PREFIX}{}", pairs.join(";"))
        }
    }

    /// Reads the text after `~`. Lenient by design: a text that does not start with
    /// `view:`, unknown keys, a case id with other characters than `a-z 0-9 -` (or longer
    /// than 40) and units other than `si` / `us` are ignored; of a key given twice the last
    /// one counts. Never fails.
    pub fn parse(text: &str) -> ViewState {
        let mut view = ViewState::default();
        let Some(body) = text.trim().strip_prefix(VIEW_PREFIX) else { return view };
        for pair in body.split(';') {
            match pair.split_once('=') {
                Some(("c", id)) if is_case_id(id) => view.case = Some(id.to_string()),
                Some(("u", key)) => {
                    if let Some(units) = Units::from_key(key) {
                        view.units = Some(units);
                    }
                }
                _ => {}
            }
        }
        view
    }
}

/// A case id as links carry it: 1 to 40 of `a-z`, `0-9`, `-`.
fn is_case_id(id: &str) -> bool {
    !id.is_empty()
        && id.len() <= MAX_CASE_ID_LEN
        && id.bytes().all(|b| b.is_ascii_lowercase() || b.is_ascii_digit() || b == b'-')
}

/// Splits a link (a whole URL, a fragment or a payload, as [`decode`] takes) into the
/// design part (everything before the view separator, unchanged) and the view part read
/// by [`ViewState::parse`]. The separator is the first `~` (or its percent-encoded form
/// `%7E` / `%7e`, which some mailers and chat programs write) **after the first `#`**
/// when the link has one, so a `~` in a URL's path (`https://host/~ana/app/#s2...`) is
/// not taken for it; a link without `#` is searched whole. A link without a separator
/// is all design part and says nothing about the view. Never fails: a bad view part is
/// an empty `ViewState`.
pub fn split_view(link: &str) -> (&str, ViewState) {
    let from = link.find('#').map_or(0, |hash| hash + 1);
    let tail = &link[from..];
    // the earliest of the plain and the percent-encoded separator
    let mut buf = [0u8; 4];
    let plain: &str = VIEW_SEPARATOR.encode_utf8(&mut buf);
    let found =
        [plain, "%7E", "%7e"].into_iter().filter_map(|sep| tail.find(sep).map(|at| (at, sep.len()))).min();
    match found {
        Some((at, len)) => (&link[..from + at], ViewState::parse(&tail[at + len..])),
        None => (link, ViewState::default()),
    }
}

/// A design payload (or fragment) followed by the view part of `view`: `s2.xxxx~view:...`;
/// the design part unchanged when `view` says nothing.
pub fn with_view(design_part: &str, view: &ViewState) -> String {
    let text = view.encode();
    if text.is_empty() {
        design_part.to_string()
    } else {
        format!("{design_part}{VIEW_SEPARATOR}{text}")
    }
}

/// The format tag and the data of a link, after the caps on its length and shape. A view
/// part (after `~`) is not the design's: it is left out here.
pub(super) fn payload(link: &str) -> Result<(&str, &str), LinkError> {
    if link.len() > MAX_LINK_LEN {
        return Err(LinkError::TooLong { length: link.len(), limit: MAX_LINK_LEN });
    }
    let trimmed = split_view(link).0.trim();
    let fragment = match trimmed.split_once('#') {
        Some((_, fragment)) => fragment,
        None => trimmed,
    };
    let payload = fragment.strip_prefix(LINK_KEY).unwrap_or(fragment);
    if payload.is_empty() {
        return Err(LinkError::Empty);
    }
    // a format tag is 's' (one design) or 'o' (a comparison of options) and a number;
    // "s" or "s2" without the dot is a link cut there
    let is_tag = |tag: &str, digits_needed: bool| {
        tag.strip_prefix('s')
            .or_else(|| tag.strip_prefix(super::comparison::TAG_LETTER))
            .is_some_and(|n| n.bytes().all(|b| b.is_ascii_digit()) && !(digits_needed && n.is_empty()))
    };
    match payload.split_once('.') {
        Some((tag, data)) if is_tag(tag, true) => Ok((tag, data)),
        None if is_tag(payload, false) => Err(LinkError::CutShort),
        _ => Err(LinkError::NotALink),
    }
}

/// The inflated bytes of a link's data.
pub(super) fn unpack(data: &str) -> Result<Vec<u8>, LinkError> {
    inflate(&unbase64(data)?)
}

/// A link of `bytes` in format `tag` (zlib, then base64url).
pub(super) fn pack(tag: &str, bytes: &[u8]) -> String {
    let packed = miniz_oxide::deflate::compress_to_vec_zlib(bytes, DEFLATE_LEVEL);
    format!("{tag}.{}", B64.encode(packed))
}

/// The postcard bytes of a wire value.
pub(super) fn postcard_bytes<T: Serialize>(wire: &T) -> Vec<u8> {
    // Serialising into a growable vector fails only for sequences of unknown length,
    // which the wire types do not have.
    postcard::to_allocvec(wire).unwrap_or_default()
}

/// A wire value from postcard bytes; the bytes must be used up exactly.
pub(super) fn from_postcard<T: serde::de::DeserializeOwned>(bytes: &[u8]) -> Result<T, LinkError> {
    let (wire, rest) = postcard::take_from_bytes::<T>(bytes)
        .map_err(|e| LinkError::DamagedDesign { detail: e.to_string() })?;
    if !rest.is_empty() {
        return Err(LinkError::ExtraDesignBytes { count: rest.len() });
    }
    Ok(wire)
}

/// The design version a link's design is read as: the current `newest` for a version
/// its format was written with, refused when newer than `newest` (a later Springline)
/// or outside what the format was ever written with (not written by Springline).
fn updated_version(
    found: u32,
    format: &str,
    written: RangeInclusive<u32>,
    newest: u32,
) -> Result<u32, LinkError> {
    if found > newest {
        return Err(LinkError::NewerVersion {
            version: u64::from(found),
            readable: VersionRange { oldest: OLDEST_DESIGN_VERSION, newest },
        });
    }
    if !written.contains(&found) {
        let written = VersionRange { oldest: *written.start(), newest: *written.end() };
        return Err(LinkError::Invalid(vec![Problem::new(
            Field::Version,
            format!(
                "a link of format {format} holds design format {written}, this one says {found}: \
                 it was not written by Springline"
            ),
        )]));
    }
    Ok(newest)
}

/// Link format 1: the core alone (design format 1, updated to the current version: the
/// abutment height takes its default, 10 m, and the traffic Load Model 1 over the whole
/// deck width).
fn read_s1(bytes: &[u8]) -> Result<Design, LinkError> {
    let mut design = core_v1::into_design(from_postcard::<core_v1::Wire>(bytes)?)?;
    design.version = updated_version(design.version, "s1", S1_DESIGN_VERSIONS, DESIGN_VERSION)?;
    Ok(design)
}

/// Link format 2: the core, then the sections read over the defaults, for a reader of
/// design version `newest` that knows the sections `kinds` (the tests model a later
/// reader this way). `wrap` makes the target from the core's design.
fn read_s2<T>(
    bytes: &[u8],
    newest: u32,
    kinds: &[SectionKind<T>],
    wrap: impl FnOnce(Design) -> T,
) -> Result<T, LinkError> {
    let wire: WireS2 = from_postcard(bytes)?;
    let found = wire.core.design_version;
    let version = updated_version(found, "s2", S2_FIRST_DESIGN_VERSION..=newest, newest)?;
    let mut design = core_v1::into_design(wire.core)?;
    design.version = version;
    let mut target = wrap(design);
    sections::read_all(&wire.sections, kinds, &mut target)?;
    Ok(target)
}

/// Strict base64url (no padding) to bytes. The alphabet is checked here first, so a
/// refused character is always one outside it; what the decoder then refuses is a
/// length or a last character no encoder writes: a cut (or an addition) at the end.
fn unbase64(data: &str) -> Result<Vec<u8>, LinkError> {
    let outside = |c: &char| !(c.is_ascii_alphanumeric() || *c == '-' || *c == '_');
    if let Some((at, character)) = data.chars().enumerate().find(|(_, c)| outside(c)) {
        return Err(LinkError::BadCharacter { position: at + 1, character });
    }
    if data.is_empty() {
        return Err(LinkError::CutShort);
    }
    B64.decode(data).map_err(|_| LinkError::BrokenEnd)
}

/// Inflates a zlib stream into at most `MAX_INFLATED_BYTES`, checking its Adler-32
/// checksum, and refuses trailing input. The output buffer has that fixed size, so a
/// deflate bomb costs no more memory than the cap.
fn inflate(packed: &[u8]) -> Result<Vec<u8>, LinkError> {
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
        S::Done => Err(LinkError::TrailingData),
        S::HasMoreOutput => Err(LinkError::TooLargeInflated { limit: MAX_INFLATED_BYTES }),
        S::Adler32Mismatch => Err(LinkError::ChecksumMismatch),
        S::FailedCannotMakeProgress | S::NeedsMoreInput => Err(LinkError::CutShort),
        _ => Err(LinkError::DamagedStream),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::design::{Bracing, Crown, GroundPoint, RibSystem, DEFAULT_ABUTMENT_HEIGHT};
    use crate::arch::sizing::SizingDesign;
    use crate::link::sections::{
        TAG_ABUTMENT, TAG_ACTIONS, TAG_ADDED_FAMILIES, TAG_FIRST_ORDER_RIB, TAG_FORM_BASIS,
        TAG_RESERVED_FOR_TESTS, TAG_SIZING, TAG_TRAFFIC,
    };
    use crate::traffic::models::{LoadModel, ModelFamily};
    use crate::traffic::TrafficDesign;
    use proptest::prelude::*;

    /// The kind of a refused link.
    fn kind(r: Result<Design, StaticsError>) -> LinkError {
        match r {
            Err(StaticsError::Link(kind)) => kind,
            other => panic!("expected a refused link, got {other:?}"),
        }
    }

    /// The message of a refused link, as a user reads it after "cannot read link: ".
    fn reason(r: Result<Design, StaticsError>) -> String {
        kind(r).to_string()
    }

    /// A link payload of arbitrary bytes, zlib-packed as the encoder does.
    fn packed_link(tag: &str, bytes: &[u8]) -> String {
        format!("{tag}.{}", B64.encode(miniz_oxide::deflate::compress_to_vec_zlib(bytes, 6)))
    }

    /// A design as the version-1 engine linked it: format `s1`, design format 1.
    fn s1_link(design: &Design) -> String {
        pack("s1", &postcard_bytes(&core_v1::from_design(&Design { version: 1, ..design.clone() })))
    }

    /// A design as a link without the traffic section opens it: the traffic of design
    /// format 2 and earlier, EN 1991-2 Load Model 1 over the whole deck width.
    /// `design` as a link with the core alone opens: the traffic's default for its deck
    /// width and every group as typed (the sections that carry them are missing).
    fn with_core_defaults(design: &Design) -> Design {
        Design {
            traffic: TrafficDesign::for_deck_width(design.deck.width),
            sizing: SizingDesign::as_typed(&design.groups),
            ..design.clone()
        }
    }

    /// The demo with an HL-93 traffic on a 9.0 m carriageway over ribs placed by hand.
    fn demo_with_hl93() -> Design {
        let mut d = Design::demo();
        d.traffic = TrafficDesign::preset(ModelFamily::Hl93, 9.0);
        d.traffic.rib_positions = vec![-3.5, 3.5];
        d
    }

    /// The `s2` bytes of a design with its core's design version set to `version`.
    fn s2_bytes_with_version(design: &Design, version: u32) -> Vec<u8> {
        let core = core_v1::from_design(&Design { version, ..design.clone() });
        postcard_bytes(&WireS2 { core, sections: sections::write_all(SECTIONS, design) })
    }

    #[test]
    fn demo_link_round_trips_and_is_short() {
        let d = Design::demo();
        let link = encode(&d);
        assert!(link.starts_with("s2."), "{link}");
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
        // a non-default abutment height travels in its section
        let mut tall = d;
        tall.deck.abutment_height = 6.5;
        assert_eq!(decode(&encode(&tall)), Ok(tall));
        // so does a traffic of another model, carriageway and rib positions
        let hl93 = demo_with_hl93();
        let opened = decode(&encode(&hl93)).expect("opens");
        assert_eq!(opened.traffic.carriageway_width, 9.0);
        assert_eq!(opened.traffic.rib_positions, [-3.5, 3.5]);
        assert!(matches!(opened.traffic.load_model, LoadModel::Hl93(_)));
        assert_eq!(opened, hl93);
    }

    /// A concrete box rib (a family section 4 cannot hold) comes back from its link whole:
    /// section 6 carries it.
    #[test]
    fn a_concrete_box_rib_round_trips_through_a_link() {
        use crate::arch::sizing::GroupSizing;
        use crate::sizing::materials::material_preset;
        use crate::sizing::sections::Family;
        let mut d = Design::demo();
        d.sizing.rib = GroupSizing::sized(
            Family::ConcreteBox {
                width_over_depth: 2.0,
                wall_over_depth: 0.12,
                reinforcement_ratio: 0.015,
                cover: 0.07,
            },
            material_preset("c50-60").expect("preset"),
        );
        let opened = decode(&encode(&d)).expect("opens");
        assert_eq!(opened.sizing.rib, d.sizing.rib);
        assert_eq!(opened, d);
    }

    #[test]
    fn s1_links_keep_opening_updated_to_the_current_design_version() {
        let demo = Design::demo();
        let link = s1_link(&demo);
        assert!(link.starts_with("s1."), "{link}");
        // design format 1 had no abutment height and no traffic: it opens with their
        // defaults, 10 m and Load Model 1 over the whole 11 m deck
        let opened = decode(&link).expect("opens");
        assert_eq!(opened.version, DESIGN_VERSION);
        assert_eq!(opened.deck.abutment_height, DEFAULT_ABUTMENT_HEIGHT);
        assert_eq!(opened.traffic, TrafficDesign::for_deck_width(11.0));
        assert_eq!(opened, with_core_defaults(&demo));
        let mut other = demo_with_hl93();
        other.deck.abutment_height = 4.0;
        assert_eq!(decode(&s1_link(&other)), Ok(with_core_defaults(&demo)));
    }

    /// An `s2` link written before the traffic section (design format 2) opens with the
    /// traffic's default for its deck width, whatever today's demo carries.
    #[test]
    fn s2_links_without_the_traffic_section_open_with_its_default() {
        let mut d = demo_with_hl93();
        d.deck.width = 12.0;
        d.deck.abutment_height = 6.5;
        let core = core_v1::from_design(&Design { version: 2, ..d.clone() });
        let abutment_only: Vec<RawSection> =
            sections::write_all(SECTIONS, &d).into_iter().filter(|s| s.tag == TAG_ABUTMENT).collect();
        let link = pack("s2", &postcard_bytes(&WireS2 { core, sections: abutment_only }));
        let opened = decode(&link).expect("opens");
        assert_eq!(opened.version, DESIGN_VERSION);
        assert_eq!(opened.deck.abutment_height, 6.5);
        assert_eq!(opened.traffic.carriageway_width, 12.0);
        assert_eq!(opened, with_core_defaults(&d));
    }

    #[test]
    fn design_versions_outside_a_format_are_refused() {
        let demo = Design::demo();
        // a later Springline's design format in an s2 link
        let later = DESIGN_VERSION + 1;
        let link = pack("s2", &s2_bytes_with_version(&demo, later));
        assert_eq!(
            kind(decode(&link)),
            LinkError::NewerVersion {
                version: u64::from(later),
                readable: VersionRange { oldest: 1, newest: DESIGN_VERSION }
            }
        );
        let r = reason(decode(&link));
        let expected = format!(
            "made by a newer version of Springline (design format {later}; this one reads 1 to {DESIGN_VERSION})"
        );
        assert!(r.contains(&expected), "{r}");
        // versions no Springline wrote in these formats
        let link = pack("s2", &s2_bytes_with_version(&demo, 1));
        assert!(matches!(kind(decode(&link)), LinkError::Invalid(p) if p[0].location.path() == "version"));
        let bytes = postcard_bytes(&core_v1::from_design(&Design { version: 2, ..demo }));
        let r = reason(decode(&pack("s1", &bytes)));
        assert!(r.contains("a link of format s1 holds design format 1, this one says 2"), "{r}");
    }

    /// Defect: a link cut short often got "character N of its data is not allowed",
    /// naming a plain base64url letter (169 of the 399 cuts of the demo link): the
    /// decoder's complaint about the spare bits of the last character was passed on as a
    /// bad character. Every cut must now say cut short (or damaged).
    #[test]
    fn every_truncation_says_cut_short_never_not_allowed() {
        for link in [format!("#{}", encode(&Design::demo())), format!("#{}", s1_link(&Design::demo()))] {
            for cut in 0..link.len() {
                let k = kind(decode(&link[..cut]));
                let r = k.to_string();
                assert!(!r.contains("not allowed"), "cut at {cut}: {r}");
                if cut < 2 {
                    assert_eq!(k, LinkError::Empty, "cut at {cut}");
                } else {
                    assert!(
                        matches!(
                            k,
                            LinkError::CutShort
                                | LinkError::BrokenEnd
                                | LinkError::ChecksumMismatch
                                | LinkError::DamagedStream
                        ),
                        "cut at {cut}: {k:?}"
                    );
                    assert!(r.contains("cut short") || r.contains("damaged"), "cut at {cut}: {r}");
                }
            }
        }
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
                    // a changed letter is never blamed as a character not allowed
                    Err(StaticsError::Link(k)) => assert!(!matches!(k, LinkError::BadCharacter { .. })),
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
        assert_eq!(kind(decode(&bad)), LinkError::BadCharacter { position: 8, character: '+' });
        assert!(reason(decode(&bad)).contains("character 8 of its data ('+') is not allowed"));
        // appended junk: either a length no link can have or data after the stream
        for extra in ["A", "AA", "AAAA"] {
            let k = kind(decode(&format!("{link}{extra}")));
            assert!(matches!(k, LinkError::BrokenEnd | LinkError::TrailingData), "{extra}: {k:?}");
        }
    }

    #[test]
    fn deflate_bomb_is_refused_at_the_cap() {
        // 10 MB of zeros deflate to about 10 kB: the inflater stops at the cap.
        let bomb = miniz_oxide::deflate::compress_to_vec_zlib(&vec![0u8; 10_000_000], 10);
        let k = match inflate(&bomb) {
            Err(k) => k,
            Ok(v) => panic!("bomb inflated to {} bytes", v.len()),
        };
        assert_eq!(k, LinkError::TooLargeInflated { limit: MAX_INFLATED_BYTES });
        assert!(k.to_string().contains("expand beyond 65536 bytes"), "{k}");
        for tag in ["s1", "s2"] {
            // a bomb small enough to pass the length cap as a whole link
            let link = packed_link(tag, &vec![0u8; 2_000_000]);
            assert!(link.len() < MAX_LINK_LEN, "{}", link.len());
            assert!(matches!(kind(decode(&link)), LinkError::TooLargeInflated { .. }));
            // just under the cap inflates (and then fails as a design, cleanly)
            let link = packed_link(tag, &vec![0u8; MAX_INFLATED_BYTES]);
            assert!(reason(decode(&link)).contains("design data"), "{tag}");
        }
    }

    #[test]
    fn oversized_and_foreign_links_are_refused_with_reasons() {
        let long = format!("s2.{}", "A".repeat(MAX_LINK_LEN));
        assert_eq!(kind(decode(&long)), LinkError::TooLong { length: MAX_LINK_LEN + 3, limit: MAX_LINK_LEN });
        assert!(reason(decode(&long)).contains("links longer than 8000 are refused"));
        assert!(reason(decode("")).contains("holds no design"));
        assert!(reason(decode("http://localhost/#")).contains("holds no design"));
        assert!(reason(decode("hello")).contains("not a Springline design link"));
        assert!(reason(decode("x.AAAA")).contains("not a Springline design link"));
        assert!(reason(decode("http://localhost/index.html")).contains("not a Springline design link"));
        let r = reason(decode("#s7.AAAA"));
        assert!(r.contains("'s7'") && r.contains("newer version") && r.contains("(it reads s1, s2)"), "{r}");
        for cut in ["#s", "#s2", "#s2.", "#s1."] {
            assert_eq!(kind(decode(cut)), LinkError::CutShort, "{cut}");
        }
        assert!(reason(decode("#s1.A=")).contains("not allowed"));
    }

    #[test]
    fn hostile_payloads_are_refused_cleanly() {
        for tag in ["s1", "s2"] {
            // random-looking bytes, a huge sequence length
            kind(decode(&packed_link(tag, &[0xff; 100])));
            kind(decode(&packed_link(tag, &[1, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0xff, 0x7f])));
        }
        // trailing bytes after a design, in both formats
        let mut bytes = postcard_bytes(&core_v1::from_design(&Design { version: 1, ..Design::demo() }));
        bytes.push(0);
        assert_eq!(kind(decode(&packed_link("s1", &bytes))), LinkError::ExtraDesignBytes { count: 1 });
        let mut bytes = s2_bytes_with_version(&Design::demo(), DESIGN_VERSION);
        bytes.push(0);
        assert_eq!(kind(decode(&packed_link("s2", &bytes))), LinkError::ExtraDesignBytes { count: 1 });
        // a section list cut off after the core
        let core = postcard_bytes(&core_v1::from_design(&Design::demo()));
        assert!(matches!(kind(decode(&packed_link("s2", &core))), LinkError::DamagedDesign { .. }));
        // a section whose body is too short for its struct
        let wire = WireS2 {
            core: core_v1::from_design(&Design::demo()),
            sections: vec![RawSection { tag: TAG_ABUTMENT, body: vec![0; 4] }],
        };
        let r = reason(decode(&packed_link("s2", &postcard_bytes(&wire))));
        assert!(r.contains("section 1 is damaged"), "{r}");
        // trailing data after the zlib stream
        let mut packed =
            miniz_oxide::deflate::compress_to_vec_zlib(&s2_bytes_with_version(&Design::demo(), 2), 6);
        packed.extend_from_slice(&[0, 0, 0]);
        assert_eq!(kind(decode(&format!("s2.{}", B64.encode(packed)))), LinkError::TrailingData);
        // a raw deflate stream without the zlib checksum
        let raw = miniz_oxide::deflate::compress_to_vec(&s2_bytes_with_version(&Design::demo(), 2), 6);
        kind(decode(&format!("s2.{}", B64.encode(raw))));
    }

    /// The worker's hand-back of a design file: exact for the demo, for a design beyond
    /// a link's caps (a ground profile of 3,000 points: its link is refused as too long)
    /// and for an invalid design (not validated here: the page checks it as an edit);
    /// damaged text is an error, not a panic. Check values: the design itself, which the
    /// transfer must give back bit for bit (no outside value applies); the caps are the
    /// link's own (`MAX_LINK_LEN`).
    #[test]
    fn a_transfer_keeps_every_field_without_a_links_caps_or_its_validation() {
        let demo = Design::demo();
        assert_eq!(from_transfer(&to_transfer(&demo)), Ok(demo.clone()));
        let mut surveyed = demo.clone();
        surveyed.valley = (0..3000)
            .map(|k| {
                let x = -10.0 + 190.0 * k as f64 / 2999.0;
                let y = 101.0 - 45.0 * (std::f64::consts::PI * (x + 10.0) / 190.0).sin();
                crate::arch::design::GroundPoint { x, y }
            })
            .collect();
        assert!(matches!(kind(decode(&encode(&surveyed))), LinkError::TooLong { .. }));
        assert_eq!(from_transfer(&to_transfer(&surveyed)), Ok(surveyed));
        let mut invalid = demo;
        invalid.panels = 1;
        assert_eq!(from_transfer(&to_transfer(&invalid)), Ok(invalid));
        for damaged in ["", "not base64!", "AAAA"] {
            assert!(from_transfer(damaged).is_err(), "{damaged:?}");
        }
    }

    #[test]
    fn invalid_design_in_a_link_is_refused_with_its_problems() {
        let mut d = Design::demo();
        d.panels = 1;
        d.deck.width = -1.0;
        let link = encode(&d);
        // the wire round trip itself is exact
        assert_eq!(decode_unchecked(&link), Ok(d));
        let LinkError::Invalid(problems) = kind(decode(&link)) else { panic!("not refused as invalid") };
        let places: Vec<String> = problems.iter().map(|p| p.location.path()).collect();
        assert!(places.contains(&"panels".into()) && places.contains(&"deck.width".into()), "{places:?}");
        let r = reason(decode(&link));
        assert!(r.starts_with("the design it holds is not valid (") && r.contains("deck width: "), "{r}");
    }

    /// A design of a hypothetical later version: today's fields and one more, carried by a
    /// section with the tag reserved for tests (test only).
    #[derive(Debug, Clone, PartialEq)]
    struct Later {
        design: Design,
        extra: f64,
    }

    /// The design version of the later reader, and the default of its new field.
    const LATER_VERSION: u32 = DESIGN_VERSION + 1;
    const LATER_DEFAULT: f64 = 0.25;

    /// The new section of the later version: FROZEN like every shipped one.
    #[derive(Serialize, Deserialize)]
    struct LaterSection {
        extra: f64,
    }

    fn later_write(t: &Later) -> Vec<u8> {
        sections::body(&LaterSection { extra: t.extra })
    }

    fn later_read(bytes: &[u8], t: &mut Later) -> Result<(), LinkError> {
        t.extra = sections::frozen::<LaterSection>(TAG_RESERVED_FOR_TESTS, bytes)?.extra;
        Ok(())
    }

    /// A shipped section, as the later version keeps it: on the design part of the target.
    fn shipped_write<const TAG: u32>(t: &Later) -> Vec<u8> {
        SECTIONS.iter().find(|k| k.tag == TAG).map(|k| (k.write)(&t.design)).unwrap_or_default()
    }

    fn shipped_read<const TAG: u32>(bytes: &[u8], t: &mut Later) -> Result<(), LinkError> {
        match SECTIONS.iter().find(|k| k.tag == TAG) {
            Some(k) => (k.read)(bytes, &mut t.design),
            None => Err(LinkError::NewerSection { tag: TAG }),
        }
    }

    /// The sections the later version knows: every shipped one, then its new one.
    fn later_kinds() -> Vec<SectionKind<Later>> {
        assert_eq!(SECTIONS.len(), 7, "list every shipped section here");
        vec![
            SectionKind {
                tag: TAG_ABUTMENT,
                write: shipped_write::<TAG_ABUTMENT>,
                read: shipped_read::<TAG_ABUTMENT>,
            },
            SectionKind {
                tag: TAG_TRAFFIC,
                write: shipped_write::<TAG_TRAFFIC>,
                read: shipped_read::<TAG_TRAFFIC>,
            },
            SectionKind {
                tag: TAG_ACTIONS,
                write: shipped_write::<TAG_ACTIONS>,
                read: shipped_read::<TAG_ACTIONS>,
            },
            SectionKind {
                tag: TAG_SIZING,
                write: shipped_write::<TAG_SIZING>,
                read: shipped_read::<TAG_SIZING>,
            },
            SectionKind {
                tag: TAG_FORM_BASIS,
                write: shipped_write::<TAG_FORM_BASIS>,
                read: shipped_read::<TAG_FORM_BASIS>,
            },
            SectionKind {
                tag: TAG_ADDED_FAMILIES,
                write: shipped_write::<TAG_ADDED_FAMILIES>,
                read: shipped_read::<TAG_ADDED_FAMILIES>,
            },
            SectionKind {
                tag: TAG_FIRST_ORDER_RIB,
                write: shipped_write::<TAG_FIRST_ORDER_RIB>,
                read: shipped_read::<TAG_FIRST_ORDER_RIB>,
            },
            SectionKind { tag: TAG_RESERVED_FOR_TESTS, write: later_write, read: later_read },
        ]
    }

    /// The later version's encoder (same format `s2`, one more section).
    fn later_encode(t: &Later, core_version: u32) -> String {
        let core = core_v1::from_design(&Design { version: core_version, ..t.design.clone() });
        pack("s2", &postcard_bytes(&WireS2 { core, sections: sections::write_all(&later_kinds(), t) }))
    }

    /// The later version's decoder.
    fn later_decode(link: &str) -> Result<Later, LinkError> {
        let (tag, data) = payload(link)?;
        let bytes = unpack(data)?;
        match tag {
            "s1" => read_s1(&bytes).map(|design| Later {
                design: Design { version: LATER_VERSION, ..design },
                extra: LATER_DEFAULT,
            }),
            _ => read_s2(&bytes, LATER_VERSION, &later_kinds(), |design| Later {
                design,
                extra: LATER_DEFAULT,
            }),
        }
    }

    /// How a later field is added without breaking old links: a new section. Today's
    /// links (and s1 links) open in the later version with the new field's default; the
    /// later version's links keep their value there; today's reader refuses them as made
    /// by a newer version, whether the later writer raised the design version or not.
    #[test]
    fn a_later_field_is_a_new_section_that_old_links_lack() {
        let demo = Design::demo();
        let later_demo = Design { version: LATER_VERSION, ..demo.clone() };
        // old links, later reader: defaults (an s1 link lacks the traffic too)
        for (old, design) in
            [(encode(&demo), later_demo.clone()), (s1_link(&demo), with_core_defaults(&later_demo))]
        {
            assert_eq!(later_decode(&old), Ok(Later { design, extra: LATER_DEFAULT }));
        }
        // later links, later reader: the value, beside every shipped section's
        let mut later = Later { design: demo_with_hl93(), extra: 0.75 };
        later.design.version = LATER_VERSION;
        later.design.deck.abutment_height = 6.5;
        assert_eq!(later_decode(&later_encode(&later, LATER_VERSION)), Ok(later.clone()));
        // later links, today's reader: refused as made by a newer version
        let bumped = kind(decode(&later_encode(&later, LATER_VERSION)));
        assert!(
            matches!(bumped, LinkError::NewerVersion { version, .. } if version == u64::from(LATER_VERSION)),
            "{bumped:?}"
        );
        let same_version = kind(decode(&later_encode(&later, DESIGN_VERSION)));
        assert_eq!(same_version, LinkError::NewerSection { tag: TAG_RESERVED_FOR_TESTS });
        for k in [bumped, same_version] {
            assert!(k.to_string().contains("made by a newer version of Springline"), "{k}");
        }
    }

    /// A valid design near the demo: numbers within ranges the validation accepts.
    fn near_demo() -> impl Strategy<Value = Design> {
        (
            (70.0f64..90.0, 72.0f64..90.0, 3.0f64..9.0, any::<bool>(), 2usize..40),
            (0usize..3, 0usize..3, 0usize..3, 0usize..4, any::<bool>()),
            proptest::collection::vec(0.5f64..2.0, 25),
            (-2.0f64..2.0, 0.0f64..2.5, 1usize..4, "[ -~]{0,40}", 1e-12f64..1e-3, 1usize..500),
            1.0f64..30.0,
            (0usize..4, 0.3f64..1.0, any::<bool>(), 0.0f64..1.0),
        )
            .prop_map(|(geo, sys, scales, misc, abutment_height, traffic)| {
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
                d.deck.abutment_height = abutment_height;
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
                let (family, carriageway, by_hand, shift) = traffic;
                d.traffic = TrafficDesign::preset(ModelFamily::ALL[family], d.deck.width * carriageway);
                if by_hand {
                    // evenly over 80 % of the deck, shifted off the centreline by up to 5 %
                    let (half, n) = (d.deck.width / 2.0, d.deck.ribs);
                    d.traffic.rib_positions = (0..n)
                        .map(|k| {
                            let at = if n == 1 { 0.0 } else { -0.8 + 1.6 * k as f64 / (n - 1) as f64 };
                            half * (at + 0.1 * (shift - 0.5))
                        })
                        .collect();
                }
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
            counts in proptest::collection::vec(any::<usize>(), 6),
            name in ".{0,30}",
        ) {
            let mut d = Design::demo();
            d.valley = xs.chunks(2).map(|c| GroundPoint { x: c[0], y: c[1] }).collect();
            d.springing_left_level = xs[0];
            d.crown = Crown::Rise { rise: xs[1] };
            d.groups.rib.e = xs[2];
            d.form.tolerance = xs[3];
            d.deck.abutment_height = xs[4];
            d.deck.ribs = counts[0];
            d.panels = counts[1];
            d.approach_piers_left = counts[2];
            d.approach_piers_right = counts[3];
            d.form.max_iterations = counts[4];
            d.traffic = TrafficDesign::preset(ModelFamily::UserDefined, xs[5]);
            d.traffic.rib_positions = xs[6..9].to_vec();
            if let LoadModel::UserDefined(m) = &mut d.traffic.load_model {
                m.variable_spacing = Some((counts[5], xs[9], xs[10]));
                m.axles = vec![xs[11]];
            }
            d.traffic.combinations[0].name = name.clone();
            d.name = name;
            let back = decode_unchecked(&encode(&d)).map_err(|e| TestCaseError::fail(e.to_string()))?;
            prop_assert_eq!(format!("{back:?}"), format!("{d:?}"));
            let bits = |d: &Design| {
                let mut bits: Vec<u64> = d.valley.iter().flat_map(|p| [p.x.to_bits(), p.y.to_bits()]).collect();
                bits.push(d.deck.abutment_height.to_bits());
                bits.push(d.traffic.carriageway_width.to_bits());
                bits.extend(d.traffic.rib_positions.iter().map(|y| y.to_bits()));
                if let LoadModel::UserDefined(m) = &d.traffic.load_model {
                    bits.extend(m.variable_spacing.iter().flat_map(|&(_, lo, hi)| [lo.to_bits(), hi.to_bits()]));
                    bits.extend(m.axles.iter().map(|q| q.to_bits()));
                }
                bits
            };
            prop_assert_eq!(bits(&back), bits(&d));
        }

        /// Arbitrary text never panics the decoder, and a cut is never blamed on a letter.
        #[test]
        fn arbitrary_text_never_panics(s in ".{0,200}", t in "[A-Za-z0-9_-]{0,300}") {
            let _ = decode(&s);
            for tag in ["s1", "s2"] {
                let link = format!("{tag}.{t}");
                match decode(&link) {
                    Err(StaticsError::Link(LinkError::BadCharacter { .. })) => {
                        prop_assert!(false, "a letter blamed in {link}")
                    }
                    r => prop_assert!(r.is_err()),
                }
            }
        }
    }

    /// The view part: the design payload stays byte for byte what `encode` writes, the
    /// view travels after `~`, and no view part (bad, unknown, empty) changes what opens.
    #[test]
    fn the_view_part_rides_after_the_design_and_never_changes_it() {
        let demo = Design::demo();
        let payload = encode(&demo);
        let view = ViewState { case: Some("half-left".into()), units: Some(Units::UsCustomary) };
        let link = with_view(&payload, &view);
        assert_eq!(link, format!("{payload}~view:c=half-left;u=us"));
        assert_eq!(split_view(&link), (payload.as_str(), view.clone()));
        assert_eq!(decode(&link), Ok(demo.clone()));
        assert_eq!(decode(&format!("https://example.invalid/app/#{link}")), Ok(demo.clone()));
        // nothing set: no view part at all, today's link exactly
        assert_eq!(with_view(&payload, &ViewState::default()), payload);
        // each key alone; the last of a repeated key; unknown keys skipped
        assert_eq!(ViewState::parse("view:u=si").units, Some(Units::Si));
        assert_eq!(ViewState::parse("view:c=dead;c=panel-3").case.as_deref(), Some("panel-3"));
        assert_eq!(
            ViewState::parse("view:zoom=2;c=dead;theme=dark"),
            ViewState { case: Some("dead".into()), units: None }
        );
        // bad view parts: ignored, the design opens all the same
        for bad in [
            "",
            "view:",
            "view:u=metric",
            "view:c=Dead Load",
            "view:c=",
            "other:c=dead",
            "~~",
            "view:c=a;b;;=",
        ] {
            let (_, v) = split_view(&format!("{payload}~{bad}"));
            assert!(v.units.is_none(), "{bad}: {v:?}");
            assert!(v.case.is_none() || bad == "view:c=a;b;;=", "{bad}: {v:?}");
            assert_eq!(decode(&format!("#{payload}~{bad}")), Ok(demo.clone()), "{bad}");
        }
        assert_eq!(ViewState::parse(&format!("view:c={}", "a".repeat(41))).case, None);
        // a case id that is not one is not written either
        let odd = ViewState { case: Some("Dead load".into()), units: None };
        assert_eq!(odd.encode(), "");
        // the view part does not rescue a bad design part
        assert!(decode("s2.AAAA~view:c=dead").is_err());
        assert_eq!(kind(decode("~view:c=dead")), LinkError::Empty);
    }

    /// A `~` in a URL's path is not the view separator: only the text after the first `#`
    /// is searched (a link without `#` is searched whole).
    #[test]
    fn a_tilde_in_the_path_is_not_the_view_separator() {
        let demo = Design::demo();
        let payload = encode(&demo);
        let view = ViewState { case: Some("panel-3".into()), units: Some(Units::UsCustomary) };
        let base = "https://host.invalid/~ana/app/";
        let url = format!("{base}#{payload}~view:c=panel-3;u=us");
        let (design_part, read) = split_view(&url);
        assert_eq!(design_part, format!("{base}#{payload}"));
        assert_eq!(read, view);
        assert_eq!(decode(&url), Ok(demo.clone()));
        // no view part: the whole URL is the design part, and it opens
        let plain = format!("{base}#{payload}");
        assert_eq!(split_view(&plain), (plain.as_str(), ViewState::default()));
        assert_eq!(decode(&plain), Ok(demo.clone()));
        // a fragment alone and a bare payload still split at their `~`
        assert_eq!(split_view(&format!("#{payload}~view:u=us")).1.units, Some(Units::UsCustomary));
        assert_eq!(split_view(&format!("{payload}~view:u=us")).0, payload);
    }

    /// The separator percent-encoded (`%7E`, `%7e`), as some programs rewrite `~`, splits
    /// the same; the earliest separator counts.
    #[test]
    fn a_percent_encoded_tilde_is_the_view_separator_too() {
        let demo = Design::demo();
        let payload = encode(&demo);
        for sep in ["%7E", "%7e"] {
            let url = format!("https://host.invalid/%7Eana/#{payload}{sep}view:c=half-right;u=us");
            let (design_part, read) = split_view(&url);
            assert_eq!(design_part, format!("https://host.invalid/%7Eana/#{payload}"), "{sep}");
            assert_eq!(read.case.as_deref(), Some("half-right"), "{sep}");
            assert_eq!(read.units, Some(Units::UsCustomary), "{sep}");
            assert_eq!(decode(&url), Ok(demo.clone()), "{sep}");
        }
        // the first separator of either form wins
        let fragment = format!("#{payload}");
        assert_eq!(split_view(&format!("{fragment}%7Eview:u=us~x")).0, fragment);
        assert_eq!(split_view(&format!("{fragment}~view:u=us%7Ex")).0, fragment);
    }

    /// Every committed link fixture (formats s1 and s2) opens to the same design with a
    /// view part after it, good or bad.
    #[test]
    fn committed_fixture_links_open_unchanged_with_a_view_part() {
        let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../tests/fixtures/links");
        let mut seen = 0;
        let mut formats = std::collections::BTreeSet::new();
        for entry in std::fs::read_dir(&dir).expect("fixture folder") {
            let path = entry.expect("entry").path();
            if path.extension().and_then(|e| e.to_str()) != Some("link") {
                continue;
            }
            let link = std::fs::read_to_string(&path).expect("fixture link");
            formats.insert(link.trim().trim_start_matches('#').get(..2).unwrap_or_default().to_string());
            let plain = decode(&link).expect("fixture opens");
            for view in ["~view:c=panel-3;u=us", "~view:u=nonsense", "~whatever"] {
                let with = format!("{}{view}", link.trim());
                assert_eq!(decode(&with), Ok(plain.clone()), "{}{view}", path.display());
            }
            seen += 1;
        }
        // 3 links of format s1 and 6 of s2 (2 with the traffic section) are committed
        assert!(seen >= 9, "only {seen} fixture links found");
        assert_eq!(formats.into_iter().collect::<Vec<_>>(), ["s1", "s2"]);
    }
}
