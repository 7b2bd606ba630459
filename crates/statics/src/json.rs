//! Reading back numbers JSON cannot hold. JSON has no infinity: `serde_json` writes an
//! infinite `f64` as `null`, which the command line's output keeps. The engine's "nothing
//! buckles it" values (an alpha_cr or a critical force with no case to bound it) are
//! `f64::INFINITY`; fields that may hold one read `null` back as it, so a report that
//! travels as JSON comes back whole.
//!
//! Also `tagged_in_json!`: an enum internally tagged in JSON (`{"kind": "en", ...}`)
//! and externally tagged in binary formats, which cannot read an internal tag (the
//! background worker's replies to the page travel as postcard bytes).

use serde::{Deserialize, Deserializer};

/// Declares an enum of unit and struct variants that JSON and other human-readable formats
/// write internally tagged (`#[serde(tag = TAG, rename_all = "snake_case")]`) and binary
/// formats externally tagged: a binary format (postcard) cannot read an internal tag,
/// which needs a self-describing format. Give `tag` and `remote` (the enum's name as a
/// string), then the enum without serde derives. Limits: unit and struct variants only
/// (no tuple variants), names in `snake_case`, and no serde attributes on the enum, its
/// variants or fields (they would land on the declared enum, which derives neither; and
/// a field skipped when empty would break a binary format's positional layout):
///
/// ```ignore
/// tagged_in_json! {
///     tag = "kind", remote = "Shape";
///     #[derive(Debug, Clone, PartialEq)]
///     pub enum Shape { Circle { r: f64 }, Dot }
/// }
/// ```
macro_rules! tagged_in_json {
    (
        tag = $tag:literal, remote = $remote:literal;
        $(#[$meta:meta])*
        $vis:vis enum $name:ident {
            $(
                $(#[$vmeta:meta])*
                $variant:ident $({ $( $(#[$fmeta:meta])* $field:ident : $fty:ty ),* $(,)? })?
            ),* $(,)?
        }
    ) => {
        $(#[$meta])*
        $vis enum $name {
            $( $(#[$vmeta])* $variant $({ $( $(#[$fmeta])* $field : $fty ),* })? ),*
        }

        const _: () = {
            use serde::{Deserialize, Deserializer, Serialize, Serializer};

            #[derive(Serialize, Deserialize)]
            #[serde(remote = $remote, rename = $remote, tag = $tag, rename_all = "snake_case")]
            enum InJson {
                $( $variant $({ $( $(#[$fmeta])* $field : $fty ),* })? ),*
            }

            #[derive(Serialize, Deserialize)]
            #[serde(remote = $remote, rename = $remote, rename_all = "snake_case")]
            enum InBinary {
                $( $variant $({ $( $(#[$fmeta])* $field : $fty ),* })? ),*
            }

            impl Serialize for $name {
                fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                    if s.is_human_readable() {
                        InJson::serialize(self, s)
                    } else {
                        InBinary::serialize(self, s)
                    }
                }
            }

            impl<'de> Deserialize<'de> for $name {
                fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
                    if d.is_human_readable() {
                        InJson::deserialize(d)
                    } else {
                        InBinary::deserialize(d)
                    }
                }
            }
        };
    };
}
pub(crate) use tagged_in_json;

/// An `f64` field that may be infinite: `null` reads as `f64::INFINITY`, a number as
/// itself (`#[serde(deserialize_with = "crate::json::infinity_if_null")]`).
pub fn infinity_if_null<'de, D: Deserializer<'de>>(d: D) -> Result<f64, D::Error> {
    // a binary format (the worker's replies to the page) carries the infinity itself
    if !d.is_human_readable() {
        return f64::deserialize(d);
    }
    Ok(Option::<f64>::deserialize(d)?.unwrap_or(f64::INFINITY))
}

#[cfg(test)]
mod tests {
    use crate::arch::stability::ArchMode;
    use crate::traffic::models::LaneWords;

    /// An enum declared with `tagged_in_json!` keeps its JSON form (the command line's
    /// output and the design file do not change) and travels through postcard, which
    /// cannot read an internal tag, whole. Check values: the JSON the derive with
    /// `#[serde(tag = "kind")]` wrote before (serde's internally tagged representation),
    /// and postcard's wire format (specification: an enum is its variant index as a
    /// varint, then its fields).
    #[test]
    fn tagged_in_json_is_internally_tagged_in_json_only() {
        let crowd = LaneWords::Crowd { intensity: 5.0, loaded_length: Some(152.5) };
        let text = serde_json::to_string(&crowd).expect("writes");
        assert_eq!(text, r#"{"kind":"crowd","intensity":5.0,"loaded_length":152.5}"#);
        assert_eq!(serde_json::from_str::<LaneWords>(&text).expect("reads"), crowd);
        let bytes = postcard::to_allocvec(&crowd).expect("writes");
        // variant index 2 (externally tagged), then the fields: no tag text
        assert_eq!(bytes[0], 2);
        assert!(!bytes.windows(5).any(|w| w == b"crowd"));
        assert_eq!(postcard::from_bytes::<LaneWords>(&bytes).expect("reads"), crowd);
    }

    /// The other enums declared so keep their JSON too: a case kind with and without
    /// numbers, a group's outcome with and without fields (check values: the command
    /// line's output before the change, serde's internally tagged representation).
    #[test]
    fn case_kinds_and_group_outcomes_keep_their_json() {
        use crate::arch::cases::CaseKind;
        use crate::arch::sizing::GroupOutcome;
        let dead = serde_json::to_string(&CaseKind::Dead).expect("writes");
        assert_eq!(dead, r#"{"kind":"dead"}"#);
        let braking = CaseKind::Braking { force: 802.8 };
        let text = serde_json::to_string(&braking).expect("writes");
        assert_eq!(text, r#"{"kind":"braking","force":802.8}"#);
        assert_eq!(serde_json::from_str::<CaseKind>(&text).expect("reads"), braking);
        let typed = serde_json::to_string(&GroupOutcome::AsTyped).expect("writes");
        assert_eq!(typed, r#"{"outcome":"as_typed"}"#);
        let not = GroupOutcome::NotSized { reason: "too slender".into() };
        let text = serde_json::to_string(&not).expect("writes");
        assert_eq!(text, r#"{"outcome":"not_sized","reason":"too slender"}"#);
        assert_eq!(serde_json::from_str::<GroupOutcome>(&text).expect("reads"), not);
        // a wrong tag names the type, not the macro's helper
        let wrong = serde_json::from_str::<CaseKind>(r#"{"force":1.0}"#).expect_err("no tag");
        assert!(wrong.to_string().contains("kind"), "{wrong}");
        for kind in [CaseKind::Dead, braking] {
            let bytes = postcard::to_allocvec(&kind).expect("writes");
            assert_eq!(postcard::from_bytes::<CaseKind>(&bytes).expect("reads"), kind);
        }
    }

    /// In a binary format an infinity is itself (postcard writes every f64 bit for bit).
    #[test]
    fn an_infinite_alpha_cr_survives_postcard() {
        let unbounded = ArchMode { alpha_cr: f64::INFINITY, mode: None };
        let bytes = postcard::to_allocvec(&unbounded).expect("writes");
        assert_eq!(postcard::from_bytes::<ArchMode>(&bytes).expect("reads"), unbounded);
    }

    /// An alpha_cr with nothing to bound it goes out as `null` (JSON has no infinity) and
    /// comes back infinite; a finite one comes back bit for bit.
    #[test]
    fn an_infinite_alpha_cr_survives_json() {
        let unbounded = ArchMode { alpha_cr: f64::INFINITY, mode: None };
        let text = serde_json::to_string(&unbounded).expect("writes");
        assert_eq!(text, r#"{"alpha_cr":null,"mode":null}"#);
        assert_eq!(serde_json::from_str::<ArchMode>(&text).expect("reads"), unbounded);
        let found = ArchMode { alpha_cr: 17.400126359173612, mode: Some(0) };
        let back: ArchMode =
            serde_json::from_str(&serde_json::to_string(&found).expect("writes")).expect("reads");
        assert_eq!(back, found);
    }
}
