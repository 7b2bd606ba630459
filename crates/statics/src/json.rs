//! Reading back numbers JSON cannot hold. JSON has no infinity: `serde_json` writes an
//! infinite `f64` as `null`, which the command line's output keeps. The engine's "nothing
//! buckles it" values (an alpha_cr or a critical force with no case to bound it) are
//! `f64::INFINITY`; fields that may hold one read `null` back as it, so a report that
//! travels as JSON (the browser's background worker) comes back whole.

use serde::{Deserialize, Deserializer};

/// An `f64` field that may be infinite: `null` reads as `f64::INFINITY`, a number as
/// itself (`#[serde(deserialize_with = "crate::json::infinity_if_null")]`).
pub fn infinity_if_null<'de, D: Deserializer<'de>>(d: D) -> Result<f64, D::Error> {
    Ok(Option::<f64>::deserialize(d)?.unwrap_or(f64::INFINITY))
}

#[cfg(test)]
mod tests {
    use crate::arch::stability::ArchMode;

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
