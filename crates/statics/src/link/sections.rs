//! The tagged sections of link format `s2`: every design field added after design format
//! 1 travels in a section of its own, after the frozen core (`core_v1`).
//!
//! A section on the wire is its tag (a varint) and its body: the postcard bytes of the
//! section's struct, length-prefixed. Each section struct is FROZEN once shipped, like the
//! core: a later field never goes into an existing section; it gets a new section with a
//! new tag (a later version of the same data is a new tag too). Tags are numbered from 1
//! in the order sections are added; tag 9999 is reserved for tests and never shipped.
//!
//! A writer writes every section it knows, tags ascending. A reader starts from the core
//! with every later field at its default (the value a design without it had), reads each
//! section it knows over those defaults, and refuses a tag it does not know ("made by a
//! newer version"): silently dropping a field the user set would open another design.
//!
//! # Adding a field (what a later change does)
//!
//! 1. Design file: bump `DESIGN_VERSION` and add one migration step that gives the field
//!    its default (`arch::design_file`).
//! 2. Link: a new frozen struct here, a new tag (the next free number), one entry in
//!    [`SECTIONS`] with its writer and reader. Links without the section open with the
//!    default the core gave (set it in `core_v1::into_design`, as for the abutment
//!    height); the destructuring in `core_v1::from_design` names the field as carried by
//!    the section.
//! 3. Fixtures: a `vN-` link fixture with a non-default value; old fixtures stay as
//!    they are.

use crate::arch::design::Design;
use crate::error::LinkError;
use serde::de::DeserializeOwned;
use serde::{Deserialize, Serialize};

/// One section as it travels: its tag and the postcard bytes of its frozen struct.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub(super) struct RawSection {
    /// Which section.
    pub(super) tag: u32,
    /// Postcard bytes of the section's struct.
    pub(super) body: Vec<u8>,
}

/// How one kind of section is written and read for a target `T`: the `Design`, or in the
/// tests a design with a field of a later version.
pub(super) struct SectionKind<T> {
    /// The section's tag.
    pub(super) tag: u32,
    /// The body of the section for a target.
    pub(super) write: fn(&T) -> Vec<u8>,
    /// Reads a body over the target's defaults.
    pub(super) read: fn(&[u8], &mut T) -> Result<(), LinkError>,
}

/// The abutment height (design format 2).
pub(super) const TAG_ABUTMENT: u32 = 1;
/// A tag no shipped section has: the tests use it for a section of a "later version".
#[cfg(test)]
pub(super) const TAG_RESERVED_FOR_TESTS: u32 = 9_999;

/// Every section this version writes and reads, tags ascending.
pub(super) const SECTIONS: &[SectionKind<Design>] =
    &[SectionKind { tag: TAG_ABUTMENT, write: abutment::write, read: abutment::read }];

/// The sections of a target, one per kind, in the order of `kinds` (tags ascending).
pub(super) fn write_all<T>(kinds: &[SectionKind<T>], target: &T) -> Vec<RawSection> {
    kinds.iter().map(|k| RawSection { tag: k.tag, body: (k.write)(target) }).collect()
}

/// Reads every section over the defaults already in `target`.
///
/// Errors: `DamagedSection` when a tag repeats or comes out of order (a writer writes
/// them ascending) or a body does not read; `NewerSection` for a tag `kinds` lacks.
pub(super) fn read_all<T>(
    sections: &[RawSection],
    kinds: &[SectionKind<T>],
    target: &mut T,
) -> Result<(), LinkError> {
    let mut previous: Option<u32> = None;
    for s in sections {
        if previous.is_some_and(|p| s.tag <= p) {
            return Err(LinkError::DamagedSection { tag: s.tag, detail: "repeated or out of order".into() });
        }
        previous = Some(s.tag);
        let Some(kind) = kinds.iter().find(|k| k.tag == s.tag) else {
            return Err(LinkError::NewerSection { tag: s.tag });
        };
        (kind.read)(&s.body, target)?;
    }
    Ok(())
}

/// The postcard bytes of a section struct.
pub(super) fn body<S: Serialize>(section: &S) -> Vec<u8> {
    // Serialising into a growable vector fails only for sequences of unknown length,
    // which section structs do not have.
    postcard::to_allocvec(section).unwrap_or_default()
}

/// A section struct from its body; the body must be used up exactly.
pub(super) fn frozen<S: DeserializeOwned>(tag: u32, bytes: &[u8]) -> Result<S, LinkError> {
    let (section, rest) = postcard::take_from_bytes::<S>(bytes)
        .map_err(|e| LinkError::DamagedSection { tag, detail: e.to_string() })?;
    if !rest.is_empty() {
        return Err(LinkError::DamagedSection { tag, detail: format!("{} bytes left over", rest.len()) });
    }
    Ok(section)
}

/// Section 1 (design format 2): the abutment height.
mod abutment {
    use super::*;

    /// FROZEN: links hold this layout.
    #[derive(Serialize, Deserialize)]
    struct Abutment {
        /// `deck.abutment_height`, m.
        height: f64,
    }

    pub(super) fn write(d: &Design) -> Vec<u8> {
        body(&Abutment { height: d.deck.abutment_height })
    }

    pub(super) fn read(bytes: &[u8], d: &mut Design) -> Result<(), LinkError> {
        let Abutment { height } = frozen(TAG_ABUTMENT, bytes)?;
        d.deck.abutment_height = height;
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn shipped_tags_ascend_and_avoid_the_test_tag() {
        let tags: Vec<u32> = SECTIONS.iter().map(|k| k.tag).collect();
        assert!(tags.windows(2).all(|w| w[0] < w[1]), "{tags:?}");
        assert!(tags.iter().all(|&t| t != TAG_RESERVED_FOR_TESTS && t != 0), "{tags:?}");
    }

    #[test]
    fn repeated_out_of_order_and_damaged_sections_are_refused() {
        let mut d = Design::demo();
        let one = write_all(SECTIONS, &d);
        let twice: Vec<RawSection> = one.iter().chain(&one).cloned().collect();
        assert!(matches!(
            read_all(&twice, SECTIONS, &mut d),
            Err(LinkError::DamagedSection { tag: TAG_ABUTMENT, .. })
        ));
        let mut long = one.clone();
        long[0].body.push(0);
        let e = read_all(&long, SECTIONS, &mut d);
        assert!(matches!(&e, Err(LinkError::DamagedSection { detail, .. }) if detail.contains("left over")));
        let mut short = one;
        short[0].body.pop();
        assert!(matches!(read_all(&short, SECTIONS, &mut d), Err(LinkError::DamagedSection { .. })));
        let unknown = [RawSection { tag: 7, body: vec![] }];
        assert_eq!(read_all(&unknown, SECTIONS, &mut d), Err(LinkError::NewerSection { tag: 7 }));
    }
}
