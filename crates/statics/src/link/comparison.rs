//! Comparison links and saved options: several named designs in one link (the meeting's
//! link), and the list of options a browser keeps.
//!
//! # Comparison link format `o1` (our own)
//!
//! ```text
//! o1.<base64url, no padding, of zlib(deflate) of the postcard bytes of: open, options>
//! ```
//!
//! * `open` (varint) is the 0-based option the link opens; `options` a count, then per
//!   option its name (a postcard string) and its design exactly as a design link's `s2`
//!   payload holds it (the frozen core, then the tagged sections). So every design format
//!   a design link reads, a comparison reads too, with the same updates on reading; a new
//!   design field is a new section there and here alike.
//! * Compressing the options together is what keeps the link short: options of one
//!   design differ in a few numbers, and deflate codes the repeats as back references
//!   (four options of the demo's kind take about a fifth more than one design link).
//! * The caps of design links apply (length, strict base64url, inflated size, trailing
//!   data); a comparison holds 1 to [`MAX_COMPARED`] options, each name 1 to
//!   [`MAX_NAME_CHARS`] characters without control characters, and every option's
//!   design must validate. A refused option names its number and name.
//! * Design links (`s1`, `s2`) stay exactly as they were: a design link never holds a
//!   comparison and [`decode_comparison`] refuses one with words saying so.
//!
//! # Saved options (the browser's storage)
//!
//! [`write_saved`] writes JSON `{"kind": "springline-options", "version": 1, "options":
//! [{"name": ..., "link": "s2..."}]}`: each option as its design link, so the link codec's
//! migration opens options saved by any earlier version. [`read_saved`] refuses content
//! of another kind or version as a whole and sets aside single options whose link no
//! longer opens, keeping the others.

use super::permalink::{self, from_postcard, pack, payload, postcard_bytes, unpack, WireS2};
use crate::arch::design::Design;
use crate::arch::options::MAX_COMPARED;
use crate::arch::validate::validate_design;
use crate::error::{LinkError, Location, Problem, StaticsError};
use serde::{Deserialize, Serialize};

/// The letter of comparison link tags (design links use `s`).
pub const TAG_LETTER: char = 'o';
/// The comparison link format written by [`encode_comparison`].
pub const COMPARISON_FORMAT: &str = "o1";
/// Most characters in an option's name.
pub const MAX_NAME_CHARS: usize = 60;
/// The `kind` of saved options content.
pub const SAVED_KIND: &str = "springline-options";
/// The version of saved options content written by [`write_saved`].
pub const SAVED_VERSION: u32 = 1;

/// A design with the name the user gave it as an option.
#[derive(Debug, Clone, PartialEq)]
pub struct NamedDesign {
    /// The option's name (1 to [`MAX_NAME_CHARS`] characters).
    pub name: String,
    /// Its design.
    pub design: Design,
}

/// Options compared side by side, and the one open on screen.
#[derive(Debug, Clone, PartialEq)]
pub struct Comparison {
    /// The options, in the comparison's order (the first is the one the others are
    /// measured from).
    pub options: Vec<NamedDesign>,
    /// The option open on screen, 0-based.
    pub open: usize,
}

#[derive(Serialize, Deserialize)]
struct WireOption {
    name: String,
    design: WireS2,
}

#[derive(Serialize, Deserialize)]
struct WireComparison {
    open: u32,
    options: Vec<WireOption>,
}

/// A name as options carry it: white space at the ends trimmed, cut to
/// [`MAX_NAME_CHARS`] characters, control characters replaced by spaces; "option" when
/// nothing is left.
pub fn tidy_name(name: &str) -> String {
    let clean: String =
        name.trim().chars().map(|c| if c.is_control() { ' ' } else { c }).take(MAX_NAME_CHARS).collect();
    let clean = clean.trim().to_string();
    if clean.is_empty() {
        "option".to_string()
    } else {
        clean
    }
}

/// Why a name cannot be an option's name, or `None` when it can.
fn name_problem(name: &str) -> Option<String> {
    let count = name.chars().count();
    if name.trim().is_empty() {
        Some("is empty".into())
    } else if count > MAX_NAME_CHARS {
        Some(format!("has {count} characters; at most {MAX_NAME_CHARS}"))
    } else if name.chars().any(char::is_control) {
        Some("holds control characters".into())
    } else {
        None
    }
}

/// Encodes a comparison as a link payload `o1.xxxx` (put it after `#` in a URL). Names
/// are written as [`tidy_name`] makes them; the open option is clamped to the last.
///
/// Errors: `Invalid` (location `options`) for no option or more than [`MAX_COMPARED`].
/// The designs are not validated here (the reader refuses an invalid one): callers share
/// designs they have analysed.
pub fn encode_comparison(comparison: &Comparison) -> Result<String, StaticsError> {
    let count = comparison.options.len();
    if count == 0 || count > MAX_COMPARED {
        return Err(StaticsError::Invalid(vec![Problem::new(
            Location::Part("options".into()),
            format!("a comparison link holds 1 to {MAX_COMPARED} options, not {count}"),
        )]));
    }
    let wire = WireComparison {
        open: comparison.open.min(count - 1) as u32,
        options: comparison
            .options
            .iter()
            .map(|o| WireOption { name: tidy_name(&o.name), design: WireS2::of(&o.design) })
            .collect(),
    };
    Ok(pack(COMPARISON_FORMAT, &postcard_bytes(&wire)))
}

/// Whether `link` (a URL, fragment or payload, as [`decode_comparison`] takes) is a
/// comparison link by its tag, whatever its data. Never fails.
pub fn is_comparison_link(link: &str) -> bool {
    payload(link).is_ok_and(|(tag, _)| tag.starts_with(TAG_LETTER))
}

/// Decodes a comparison link: every option's design updated to the current design
/// version and validated, names checked, the open option in range.
///
/// `link` is taken as `permalink::decode` takes a design link (a URL, a fragment with or
/// without `#`, the payload; a view part after `~` is ignored). Errors (never a panic):
/// `StaticsError::Link` with the design links' kinds for the wire (length, characters,
/// cut, damaged, bomb, trailing data, newer format or version), and
/// `OptionCount`, `OpenOutOfRange`, `OptionName`, `OptionDesign` (the option's number
/// and name, and why its design cannot be opened); a design link is refused as
/// `UnknownFormat` naming the comparison format.
pub fn decode_comparison(link: &str) -> Result<Comparison, StaticsError> {
    let (tag, data) = payload(link)?;
    if tag != COMPARISON_FORMAT {
        return Err(LinkError::UnknownFormat { tag: tag.to_string(), readable: &[COMPARISON_FORMAT] }.into());
    }
    let wire: WireComparison = from_postcard(&unpack(data)?)?;
    let count = wire.options.len();
    if count == 0 || count > MAX_COMPARED {
        return Err(LinkError::OptionCount { count, limit: MAX_COMPARED }.into());
    }
    let open = usize::try_from(wire.open).unwrap_or(usize::MAX);
    if open >= count {
        return Err(LinkError::OpenOutOfRange { open: open.saturating_add(1), count }.into());
    }
    let mut options = Vec::with_capacity(count);
    for (k, option) in wire.options.into_iter().enumerate() {
        if let Some(problem) = name_problem(&option.name) {
            return Err(LinkError::OptionName { index: k + 1, problem }.into());
        }
        let refused = |source: LinkError| LinkError::OptionDesign {
            index: k + 1,
            name: option.name.clone(),
            source: Box::new(source),
        };
        let design = option.design.into_design().map_err(refused)?;
        match validate_design(&design) {
            Ok(_) => {}
            Err(StaticsError::Invalid(problems)) => return Err(refused(LinkError::Invalid(problems)).into()),
            Err(other) => return Err(refused(LinkError::Unusable(Box::new(other))).into()),
        }
        // as the encoder writes it (white space at the ends trimmed): what opens reopens
        // from its own link as it was
        options.push(NamedDesign { name: tidy_name(&option.name), design });
    }
    Ok(Comparison { options, open })
}

#[derive(Serialize, Deserialize)]
struct SavedEntry {
    name: String,
    link: String,
}

#[derive(Serialize, Deserialize)]
struct SavedContent {
    kind: String,
    version: u32,
    options: Vec<SavedEntry>,
}

/// Saved options as the browser's storage keeps them (see the module doc): JSON, each
/// option's name (tidied) and its design link. Never fails.
pub fn write_saved(options: &[NamedDesign]) -> String {
    let content = SavedContent {
        kind: SAVED_KIND.into(),
        version: SAVED_VERSION,
        options: options
            .iter()
            .map(|o| SavedEntry { name: tidy_name(&o.name), link: permalink::encode(&o.design) })
            .collect(),
    };
    serde_json::to_string(&content).unwrap_or_default()
}

/// One saved option that no longer opens: its number, name and link as stored, and why.
#[derive(Debug, Clone, PartialEq)]
pub struct SetAside {
    /// 1-based position in the stored list.
    pub index: usize,
    /// Its name as stored.
    pub name: String,
    /// Its link as stored.
    pub link: String,
    /// Why it does not open.
    pub reason: String,
}

/// What [`read_saved`] found: the options that open, and those set aside.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct SavedOptions {
    /// The options that open, in the stored order.
    pub options: Vec<NamedDesign>,
    /// Stored options whose link does not open (a design link of a newer version, a
    /// damaged one), with the reason.
    pub set_aside: Vec<SetAside>,
}

/// Reads saved options content (see the module doc). Each option's link is read by
/// `permalink::decode` (so options saved by an older version open, updated); an option
/// whose link or name does not open is set aside with its reason, the others kept.
///
/// Errors: `Invalid` (location `saved options`) for content that is not JSON, not of
/// kind [`SAVED_KIND`], or of a version other than [`SAVED_VERSION`] (a newer
/// Springline wrote it): the caller keeps such content elsewhere, untouched.
pub fn read_saved(text: &str) -> Result<SavedOptions, StaticsError> {
    let refuse = |message: String| {
        StaticsError::Invalid(vec![Problem::new(Location::Part("saved options".into()), message)])
    };
    let value: serde_json::Value = serde_json::from_str(text)
        .map_err(|e| refuse(format!("the stored options are not valid JSON ({e})")))?;
    let kind = value.get("kind").and_then(|k| k.as_str());
    if kind != Some(SAVED_KIND) {
        return Err(refuse("the stored content is not a list of Springline options".into()));
    }
    match value.get("version").and_then(|v| v.as_u64()) {
        Some(v) if v == u64::from(SAVED_VERSION) => {}
        Some(v) => {
            return Err(refuse(format!(
                "the stored options were written by another version of Springline (format {v}; this one \
                 reads {SAVED_VERSION})"
            )))
        }
        None => return Err(refuse("the stored options have no format version".into())),
    }
    let content: SavedContent =
        serde_json::from_value(value).map_err(|e| refuse(format!("the stored options are damaged ({e})")))?;
    let mut saved = SavedOptions::default();
    for (k, entry) in content.options.into_iter().enumerate() {
        let opened = match name_problem(&entry.name) {
            Some(problem) => Err(format!("its name {problem}")),
            None => permalink::decode(&entry.link).map_err(|e| e.to_string()),
        };
        match opened {
            Ok(design) => saved.options.push(NamedDesign { name: tidy_name(&entry.name), design }),
            Err(reason) => {
                saved.set_aside.push(SetAside { index: k + 1, name: entry.name, link: entry.link, reason })
            }
        }
    }
    Ok(saved)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::design::Crown;

    fn option(name: &str, rise: f64) -> NamedDesign {
        let mut design = Design::demo();
        design.crown = Crown::Rise { rise };
        NamedDesign { name: name.into(), design }
    }

    fn four() -> Comparison {
        Comparison {
            options: vec![
                option("base", 19.5),
                option("higher", 21.0),
                option("lower", 16.0),
                option("flat", 14.0),
            ],
            open: 2,
        }
    }

    fn refused(r: Result<Comparison, StaticsError>) -> LinkError {
        match r {
            Err(StaticsError::Link(kind)) => kind,
            other => panic!("expected a refused link, got {other:?}"),
        }
    }

    #[test]
    fn four_options_round_trip_under_two_thousand_characters() {
        let c = four();
        let link = encode_comparison(&c).expect("encodes");
        assert!(link.starts_with("o1."), "{link}");
        assert!(link.len() < 2_000, "four options take {} characters", link.len());
        assert!(is_comparison_link(&link));
        assert!(!is_comparison_link(&permalink::encode(&Design::demo())));
        let opened = decode_comparison(&format!("http://localhost/#{link}~view:u=us"));
        assert!(opened == Ok(c), "{:?}", opened.map(|o| o.open));
    }

    #[test]
    fn design_links_and_comparison_links_refuse_each_other_with_words() {
        let link = encode_comparison(&four()).expect("encodes");
        let e = permalink::decode(&link).expect_err("not a design");
        assert!(e.to_string().contains("comparison of design options"), "{e}");
        let kind = refused(decode_comparison(&permalink::encode(&Design::demo())));
        assert!(matches!(kind, LinkError::UnknownFormat { .. }), "{kind:?}");
        assert!(kind.to_string().contains("o1"), "{kind}");
    }

    #[test]
    fn counts_open_option_and_names_are_checked() {
        assert!(encode_comparison(&Comparison { options: vec![], open: 0 }).is_err());
        let mut five = four();
        five.options.push(option("fifth", 20.0));
        assert!(encode_comparison(&five).is_err());
        // written by hand past the encoder's checks
        let wire = |open: u32, options: Vec<NamedDesign>| {
            pack(
                COMPARISON_FORMAT,
                &postcard_bytes(&WireComparison {
                    open,
                    options: options
                        .iter()
                        .map(|o| WireOption { name: o.name.clone(), design: WireS2::of(&o.design) })
                        .collect(),
                }),
            )
        };
        assert_eq!(
            refused(decode_comparison(&wire(0, five.options.clone()))),
            LinkError::OptionCount { count: 5, limit: 4 }
        );
        assert_eq!(
            refused(decode_comparison(&wire(0, vec![]))),
            LinkError::OptionCount { count: 0, limit: 4 }
        );
        assert_eq!(
            refused(decode_comparison(&wire(4, four().options))),
            LinkError::OpenOutOfRange { open: 5, count: 4 }
        );
        let kind = refused(decode_comparison(&wire(0, vec![option(" ", 19.5)])));
        assert_eq!(kind.to_string(), "the name of option 1 is empty");
        // a name with spaces at its ends (written past the encoder, which trims) opens
        // trimmed, as the encoder writes it, so it reopens from its own link unchanged
        // (the comparison fuzz target found this)
        let opened = decode_comparison(&wire(0, vec![option(" Base, rise 19.5 m ", 19.5)])).expect("opens");
        assert_eq!(opened.options[0].name, "Base, rise 19.5 m");
        let again = decode_comparison(&encode_comparison(&opened).expect("encodes")).expect("reopens");
        assert_eq!(again, opened);
        let long = "x".repeat(61);
        let kind = refused(decode_comparison(&wire(0, vec![option(&long, 19.5)])));
        assert_eq!(kind.to_string(), "the name of option 1 has 61 characters; at most 60");
        // an option whose design does not validate is named
        let mut bad = option("too low", 19.5);
        bad.design.crown = Crown::Rise { rise: -3.0 };
        let kind = refused(decode_comparison(&wire(0, vec![option("base", 19.5), bad])));
        assert!(
            kind.to_string().starts_with("option 2 ('too low'): the design it holds is not valid"),
            "{kind}"
        );
    }

    #[test]
    fn names_are_tidied_on_writing() {
        assert_eq!(tidy_name("  a\tb  "), "a b");
        assert_eq!(tidy_name(""), "option");
        assert_eq!(tidy_name(&"é".repeat(70)).chars().count(), MAX_NAME_CHARS);
    }

    #[test]
    fn every_cut_of_a_comparison_link_is_refused_without_panic() {
        let link = encode_comparison(&four()).expect("encodes");
        for end in 0..link.len() {
            assert!(decode_comparison(&link[..end]).is_err(), "cut at {end}");
        }
    }

    #[test]
    fn saved_options_round_trip_and_bad_entries_are_set_aside() {
        let options = four().options;
        let text = write_saved(&options);
        let read = read_saved(&text).expect("reads");
        assert!(read.options == options, "{:?}", read.set_aside);
        // one entry damaged: it is set aside with its reason, the others kept
        let mut value: serde_json::Value = serde_json::from_str(&text).expect("json");
        value["options"][1]["link"] = serde_json::Value::String("s2.AAAA".into());
        let read = read_saved(&value.to_string()).expect("reads");
        assert_eq!(read.options.len(), 3);
        assert_eq!(read.set_aside.len(), 1);
        assert_eq!((read.set_aside[0].index, read.set_aside[0].name.as_str()), (2, "higher"));
        assert!(!read.set_aside[0].reason.is_empty());
        // a name stored with spaces at its ends reads trimmed, as it is written back
        let mut value: serde_json::Value = serde_json::from_str(&text).expect("json");
        value["options"][0]["name"] = serde_json::Value::String("  base ".into());
        let read = read_saved(&value.to_string()).expect("reads");
        assert_eq!(read.options[0].name, "base");
        assert!(read_saved(&write_saved(&read.options)).expect("reads back").options == read.options);
        // content of another kind, version or not JSON is refused whole
        for (content, words) in [
            ("{not json", "not valid JSON"),
            (r#"{"kind":"other","version":1,"options":[]}"#, "not a list of Springline options"),
            (
                r#"{"kind":"springline-options","version":2,"options":[]}"#,
                "another version of Springline (format 2",
            ),
            (r#"{"kind":"springline-options","options":[]}"#, "no format version"),
            (r#"{"kind":"springline-options","version":1,"options":7}"#, "damaged"),
        ] {
            let e = read_saved(content).expect_err(content);
            assert!(e.to_string().contains(words), "{content}: {e}");
        }
    }
}
