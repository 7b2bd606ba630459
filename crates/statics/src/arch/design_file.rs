//! Design files: a `Design` as JSON, read from every format version ever written.
//!
//! # Format (our own)
//!
//! A design file is one JSON object: the serde form of [`Design`] (field names and units
//! as documented there), whose `"version"` is the design format version it was written
//! in. The versions so far:
//!
//! | version | what changed |
//! | --- | --- |
//! | 1 | the first format |
//! | 2 | `deck.abutment_height` (m) added; a version-1 design has 10 m (`DEFAULT_ABUTMENT_HEIGHT`) |
//! | 3 | `traffic` added (carriageway, rib positions, load model, combinations); a version-2 design gets EN 1991-2 Load Model 1 over its whole deck width (`TrafficDesign::for_deck_width`) |
//! | 4 | `actions` added (temperature, springing movement, deflection limit) and the combinations' `temperature`, `settlement`, `braking` factors; a version-3 design gets its load model family's presets (`ActionsDesign::preset`, `Combination::add_action_factors`, EN's gr2 added) |
//! | 5 | `sizing` added (each group's family and material or as typed, the deck's cross-section, unit rates, foundation inputs); a version-4 design keeps every group as typed, checked as the material its E suggests (`SizingDesign::as_typed`), and counts its typed deck dead load |
//! | 6 | `form.basis` added (`panel_loads` or `as_built`: what the form is found for); a version-5 design keeps `panel_loads`; the concrete box family (`concrete_box`) added, which no earlier design has |
//! | 7 | `sizing.rib_for_first_order` added (size the rib for alpha_cr >= 10); a version-6 design has it off |
//!
//! # Reading ([`read_design_json`])
//!
//! 1. The text is parsed as JSON; a syntax error is refused with the line and column the
//!    JSON reader gives.
//! 2. The `version` is read first: a version newer than [`DESIGN_VERSION`] is refused
//!    ("made by a newer version of Springline"), so is one older than
//!    [`OLDEST_DESIGN_VERSION`] or a missing one.
//! 3. A file of an older version is updated step by step on its JSON, one migration
//!    step per version (1 to 2, then 2 to 3, ...), each step adding the fields of the
//!    next version with the value a design without them had. Only then is it read as a
//!    `Design`. A design in memory is therefore always of the current version, and only
//!    this reader (and the link reader) deals with older ones.
//!
//! # Adding a field (a later version N + 1)
//!
//! 1. Add the field to `Design`.
//! 2. Set `DESIGN_VERSION` to N + 1 and append one step to `STEPS` that inserts the
//!    field's default into a version-N object (the value designs of version N behaved as
//!    having). The build fails until the step is there (a compile-time check below).
//! 3. Keep the committed `tests/fixtures/designs/vN-*.json` files as they are; they
//!    must keep reading. The link side has its own rule (`link::sections`).

use crate::arch::actions::ActionsDesign;
use crate::arch::design::{Design, MemberGroups, DEFAULT_ABUTMENT_HEIGHT, DESIGN_VERSION};
use crate::arch::sizing::SizingDesign;
use crate::error::{DesignFileError, StaticsError, VersionRange};
use crate::traffic::combination::Combination;
use crate::traffic::TrafficDesign;
use serde_json::{Map, Value};

/// The oldest design format version ever written (and still read).
pub const OLDEST_DESIGN_VERSION: u32 = 1;

/// The design format versions this engine reads: oldest to current.
pub const READABLE_DESIGN_VERSIONS: VersionRange =
    VersionRange { oldest: OLDEST_DESIGN_VERSION, newest: DESIGN_VERSION };

/// One migration step: takes the JSON object of a design of version k to version k + 1
/// (the caller then sets `"version"`). It only adds what version k + 1 has and k lacks;
/// whatever else is wrong is left for the final read to report.
type Step = fn(&mut Map<String, Value>);

/// The migration steps, oldest first: `STEPS[i]` takes version `OLDEST_DESIGN_VERSION + i`
/// to the next.
const STEPS: &[Step] =
    &[version_1_to_2, version_2_to_3, version_3_to_4, version_4_to_5, version_5_to_6, version_6_to_7];

// One step per version: a new DESIGN_VERSION without its step stops the build here.
const _: () = assert!(OLDEST_DESIGN_VERSION + STEPS.len() as u32 == DESIGN_VERSION);

/// Version 1 to 2: the abutment height, `DEFAULT_ABUTMENT_HEIGHT` (10 m). A version-1
/// file that already names one (written while the field was being added) keeps it.
fn version_1_to_2(design: &mut Map<String, Value>) {
    if let Some(Value::Object(deck)) = design.get_mut("deck") {
        deck.entry("abutment_height").or_insert(Value::from(DEFAULT_ABUTMENT_HEIGHT));
    }
}

/// Version 3 to 4: the other actions, the presets of the traffic's load model family
/// (`ActionsDesign::preset`), and the action factors of the combinations that bear a
/// preset's name (`Combination::add_action_factors`, which also adds EN's gr2). A traffic
/// that does not read is left for the final read to report.
fn version_3_to_4(design: &mut Map<String, Value>) {
    let Some(traffic) = design.get("traffic").cloned() else { return };
    let Ok(mut traffic) = serde_json::from_value::<TrafficDesign>(traffic) else { return };
    let family = traffic.load_model.family();
    Combination::add_action_factors(family, &mut traffic.combinations);
    if let Ok(value) = serde_json::to_value(&traffic) {
        design.insert("traffic".into(), value);
    }
    if !design.contains_key("actions") {
        if let Ok(actions) = serde_json::to_value(ActionsDesign::preset(family)) {
            design.insert("actions".into(), actions);
        }
    }
}

/// Version 4 to 5: the sizing, every group kept as typed and checked as the material its
/// typed E suggests (`SizingDesign::as_typed`), the deck weight as typed. Groups that do
/// not read are left for the final read to report.
fn version_4_to_5(design: &mut Map<String, Value>) {
    if design.contains_key("sizing") {
        return;
    }
    let Some(groups) = design.get("groups").cloned() else { return };
    let Ok(groups) = serde_json::from_value::<MemberGroups>(groups) else { return };
    if let Ok(sizing) = serde_json::to_value(SizingDesign::as_typed(&groups)) {
        design.insert("sizing".into(), sizing);
    }
}

/// Version 5 to 6: the form-finding basis, "panel loads" (the only one before).
fn version_5_to_6(design: &mut Map<String, Value>) {
    if let Some(Value::Object(form)) = design.get_mut("form") {
        form.entry("basis").or_insert(Value::from("panel_loads"));
    }
}

/// Version 6 to 7: the rib sized for alpha_cr >= 10, off (every rib before was sized
/// for alpha_cr >= 3, or rather by the arch table's buckling length).
fn version_6_to_7(design: &mut Map<String, Value>) {
    if let Some(Value::Object(sizing)) = design.get_mut("sizing") {
        sizing.entry("rib_for_first_order").or_insert(Value::from(false));
    }
}

/// Version 2 to 3: the traffic, EN 1991-2 Load Model 1 with the whole deck width as
/// carriageway and ribs evenly spaced (`TrafficDesign::for_deck_width`). A deck width
/// that is not a number gets a traffic of zero width, for validation to report the deck.
fn version_2_to_3(design: &mut Map<String, Value>) {
    let width = design.get("deck").and_then(|d| d.get("width")).and_then(Value::as_f64).unwrap_or(0.0);
    if !design.contains_key("traffic") {
        if let Ok(traffic) = serde_json::to_value(TrafficDesign::for_deck_width(width)) {
            design.insert("traffic".into(), traffic);
        }
    }
}

/// Reads a design file (JSON text) of any version from [`OLDEST_DESIGN_VERSION`] to
/// [`DESIGN_VERSION`], updating an older one to the current version (see the module doc).
///
/// The design is not validated here (an invalid design can still be opened to be
/// mended); `validate_design` does that. Numbers come back exactly as written (serde's
/// shortest round-trip form of each f64).
///
/// Errors (never a panic): `StaticsError::DesignFile` with
/// * `Malformed` (line, column and what the JSON reader found) for text that is not JSON;
/// * `NoVersion` when it is not an object with a whole-number `"version"`;
/// * `NewerVersion` for a version after [`DESIGN_VERSION`] ("made by a newer version of
///   Springline (format 7; this one reads 1 to 2)");
/// * `UnknownVersion` for a version before [`OLDEST_DESIGN_VERSION`];
/// * `NotADesign` when a field is missing or of the wrong type for its version (with
///   line and column for a file of the current version; an older one is read after its
///   update, so its positions are lost).
pub fn read_design_json(text: &str) -> Result<Design, StaticsError> {
    let (declared, updated) = updated_json(text, STEPS)?;
    let read = if declared == u64::from(DESIGN_VERSION) {
        // read from the text itself, so that errors carry their line and column
        serde_json::from_str::<Design>(text)
    } else {
        serde_json::from_value::<Design>(updated)
    };
    read.map_err(|e| {
        let at = (e.line() > 0).then(|| (e.line(), e.column()));
        StaticsError::DesignFile(DesignFileError::NotADesign { version: declared, at, detail: reason(&e) })
    })
}

/// A design as a design file: pretty JSON of the current version ([`DESIGN_VERSION`],
/// whatever `design.version` says: a `Design` holds exactly the current fields), ending
/// in a newline. Every finite number reads back bit for bit; a non-finite one (which no
/// valid design has) is written as `null` and does not read back. Never panics.
pub fn write_design_json(design: &Design) -> String {
    let current = Design { version: DESIGN_VERSION, ..design.clone() };
    // Serialising plain data with string keys into a string cannot fail.
    serde_json::to_string_pretty(&current).map(|text| text + "\n").unwrap_or_default()
}

/// Parses `text`, reads its version and applies the migration steps from it to the last
/// version `steps` lead to. Returns the declared version and the updated JSON.
fn updated_json(text: &str, steps: &[Step]) -> Result<(u64, Value), DesignFileError> {
    let readable =
        VersionRange { oldest: OLDEST_DESIGN_VERSION, newest: OLDEST_DESIGN_VERSION + steps.len() as u32 };
    let mut value: Value = serde_json::from_str(text).map_err(|e| DesignFileError::Malformed {
        line: e.line(),
        column: e.column(),
        detail: reason(&e),
    })?;
    let Value::Object(object) = &mut value else { return Err(DesignFileError::NoVersion { readable }) };
    let Some(declared) = object.get("version").and_then(Value::as_u64) else {
        return Err(DesignFileError::NoVersion { readable });
    };
    if declared > u64::from(readable.newest) {
        return Err(DesignFileError::NewerVersion { version: declared, readable });
    }
    if declared < u64::from(readable.oldest) {
        return Err(DesignFileError::UnknownVersion { version: declared, readable });
    }
    for (version, step) in (OLDEST_DESIGN_VERSION..).zip(steps) {
        if u64::from(version) >= declared {
            step(object);
            object.insert("version".into(), Value::from(version + 1));
        }
    }
    Ok((declared, value))
}

/// What the JSON reader says, without the position it appends (given separately).
fn reason(e: &serde_json::Error) -> String {
    let text = e.to_string();
    let position = format!(" at line {} column {}", e.line(), e.column());
    text.strip_suffix(&position).map(str::to_string).unwrap_or(text)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::arch::design::Crown;
    use crate::traffic::models::{LoadModel, ModelFamily};

    /// The demo as a version-2 file: no traffic (as the version-2 engine wrote it).
    fn demo_v2_value() -> Value {
        let mut value = serde_json::to_value(Design::demo()).expect("serialises");
        value["version"] = Value::from(2);
        let object = value.as_object_mut().expect("design object");
        object.remove("traffic");
        object.remove("actions");
        value
    }

    /// The demo as a version-3 file: traffic without the other actions, combinations
    /// without their factors (as the version-3 engine wrote it).
    fn demo_v3_text() -> String {
        let mut value = serde_json::to_value(Design::demo()).expect("serialises");
        value["version"] = Value::from(3);
        let object = value.as_object_mut().expect("design object");
        object.remove("actions");
        let combinations = object["traffic"]["combinations"].as_array_mut().expect("combinations");
        combinations.retain(|c| c["name"] != "ULS gr2" && c["name"] != "ULS temperature leading");
        for c in combinations {
            let c = c.as_object_mut().expect("combination");
            for key in ["temperature", "settlement", "braking"] {
                c.remove(key);
            }
        }
        serde_json::to_string_pretty(&value).expect("serialises")
    }

    fn demo_v2_text() -> String {
        serde_json::to_string_pretty(&demo_v2_value()).expect("serialises")
    }

    /// The demo as a version-1 file: no abutment height and no traffic (as the version-1
    /// engine wrote it).
    fn demo_v1_text() -> String {
        let mut value = demo_v2_value();
        value["version"] = Value::from(1);
        value["deck"].as_object_mut().expect("deck object").remove("abutment_height");
        serde_json::to_string_pretty(&value).expect("serialises")
    }

    /// The demo as a file without the traffic opens: Load Model 1 over the whole deck.
    fn demo_without_traffic() -> Design {
        let demo = Design::demo();
        Design { traffic: TrafficDesign::for_deck_width(demo.deck.width), ..demo }
    }

    fn file_error(r: Result<Design, StaticsError>) -> DesignFileError {
        match r {
            Err(StaticsError::DesignFile(kind)) => kind,
            other => panic!("expected a design-file error, got {other:?}"),
        }
    }

    #[test]
    fn current_files_round_trip_exactly() {
        let mut d = Design::demo();
        d.deck.abutment_height = 6.5;
        d.crown = Crown::Rise { rise: 0.1 + 0.2 };
        d.traffic = TrafficDesign::preset(ModelFamily::Crowd, 4.0);
        d.traffic.rib_positions = vec![-2.5, 2.5];
        let text = write_design_json(&d);
        assert!(text.starts_with(&format!("{{\n  \"version\": {DESIGN_VERSION},\n")), "{text}");
        assert!(text.contains("\"kind\": \"crowd\""), "{text}");
        assert!(text.ends_with("}\n"));
        assert_eq!(read_design_json(&text), Ok(d));
        // a design of an older version number in memory is written as the current one
        let mut old = Design::demo();
        old.version = 1;
        assert_eq!(read_design_json(&write_design_json(&old)), Ok(Design::demo()));
    }

    #[test]
    fn version_1_files_are_updated_with_the_default_abutment_height() {
        let text = demo_v1_text();
        assert!(!text.contains("abutment_height") && text.contains("\"version\": 1"), "{text}");
        let d = read_design_json(&text).expect("reads");
        assert_eq!(d.version, DESIGN_VERSION);
        assert_eq!(d.deck.abutment_height, 10.0);
        assert_eq!(d, demo_without_traffic());
        // a version-1 file that already names the height keeps it
        let mut value: Value = serde_json::from_str(&text).expect("JSON");
        value["deck"]["abutment_height"] = Value::from(7.25);
        let d = read_design_json(&value.to_string()).expect("reads");
        assert_eq!(d.deck.abutment_height, 7.25);
    }

    /// Design format 2 had no traffic: a version-2 file (and a version-1 file, through
    /// both steps) reads with Load Model 1 over its whole deck width, ribs evenly spaced
    /// and the EN 1990 combinations; a file that names a traffic keeps it.
    #[test]
    fn version_2_files_get_the_traffic_for_their_deck_width() {
        let text = demo_v2_text();
        assert!(!text.contains("traffic") && text.contains("\"version\": 2"), "{text}");
        let d = read_design_json(&text).expect("reads");
        assert_eq!(d.version, DESIGN_VERSION);
        assert_eq!(d.traffic.carriageway_width, 11.0);
        assert!(d.traffic.rib_positions.is_empty());
        assert!(matches!(d.traffic.load_model, LoadModel::EnLm1(_)));
        // the EN 1990 combinations, gr2 (braking) and temperature leading, the last two
        // added by the step to format 4
        assert_eq!(d.traffic.combinations.len(), 5);
        assert_eq!(d, demo_without_traffic());
        // the width is the file's own deck width
        let mut value = demo_v2_value();
        value["deck"]["width"] = Value::from(8.5);
        let d = read_design_json(&value.to_string()).expect("reads");
        assert_eq!(d.traffic, TrafficDesign::for_deck_width(8.5));
        let mut value: Value = serde_json::from_str(&demo_v1_text()).expect("JSON");
        value["deck"]["width"] = Value::from(8.5);
        assert_eq!(
            read_design_json(&value.to_string()).expect("reads").traffic,
            TrafficDesign::for_deck_width(8.5)
        );
        // a deck width that is not a number: a traffic of zero width, and the deck is
        // what the final read reports
        let mut value = demo_v2_value();
        value["deck"]["width"] = Value::from("wide");
        let message = read_design_json(&value.to_string()).map_err(|e| e.to_string()).expect_err("refused");
        assert!(message.contains("not a design of format 2"), "{message}");
        let mut object = demo_v2_value().as_object().cloned().expect("object");
        object["deck"]["width"] = Value::from("wide");
        version_2_to_3(&mut object);
        assert_eq!(object["traffic"]["carriageway_width"], Value::from(0.0));
        // a version-2 file that already names a traffic (written while the field was
        // being added) keeps it
        let mut value = demo_v2_value();
        let hl93 = TrafficDesign::preset(ModelFamily::Hl93, 9.0);
        value["traffic"] = serde_json::to_value(&hl93).expect("serialises");
        assert_eq!(read_design_json(&value.to_string()).expect("reads").traffic, hl93);
    }

    #[test]
    fn newer_unknown_and_missing_versions_are_refused_with_reasons() {
        let with_version =
            |v: &str| demo_v1_text().replacen("\"version\": 1", &format!("\"version\": {v}"), 1);
        let e = file_error(read_design_json(&with_version("8")));
        assert_eq!(e, DesignFileError::NewerVersion { version: 8, readable: READABLE_DESIGN_VERSIONS });
        let message = StaticsError::DesignFile(e).to_string();
        let expected =
            format!("made by a newer version of Springline (format 8; this one reads 1 to {DESIGN_VERSION})");
        assert!(message.contains(&expected), "{message}");
        assert!(matches!(
            file_error(read_design_json(&with_version("0"))),
            DesignFileError::UnknownVersion { version: 0, .. }
        ));
        for not_a_version in ["\"2\"", "1.5", "-1", "null"] {
            let e = file_error(read_design_json(&with_version(not_a_version)));
            assert!(matches!(e, DesignFileError::NoVersion { .. }), "{not_a_version}: {e:?}");
        }
        for not_an_object in ["[1, 2]", "2", "\"design\"", "{}"] {
            let e = file_error(read_design_json(not_an_object));
            assert!(e.to_string().contains("no design format version"), "{not_an_object}: {e}");
        }
    }

    #[test]
    fn malformed_json_is_refused_with_its_line_and_column() {
        // line 3 lacks the comma after it; the JSON reader stops at the start of line 4
        let text = "{\n  \"version\": 2,\n  \"name\": \"x\"\n  \"panels\": 12\n}";
        let e = file_error(read_design_json(text));
        assert!(matches!(&e, DesignFileError::Malformed { line: 4, column: 3, .. }), "{e:?}");
        let message = e.to_string();
        assert!(message.starts_with("it is not valid JSON at line 4, column 3: expected"), "{message}");
        assert!(!message.contains("at line 4 column 3"), "position given twice: {message}");
        // cut short
        let full = write_design_json(&Design::demo());
        let e = file_error(read_design_json(&full[..full.len() / 2]));
        assert!(matches!(e, DesignFileError::Malformed { .. }), "{e:?}");
    }

    #[test]
    fn a_wrong_field_is_named_with_its_position_in_a_current_file() {
        let text = write_design_json(&Design::demo()).replace("\"panels\": 12", "\"panels\": \"twelve\"");
        let line = text.lines().position(|l| l.contains("twelve")).expect("the line") + 1;
        match file_error(read_design_json(&text)) {
            DesignFileError::NotADesign { version, at: Some((l, _)), detail }
                if version == u64::from(DESIGN_VERSION) =>
            {
                assert_eq!(l, line);
                assert!(detail.contains("invalid type"), "{detail}");
            }
            other => panic!("{other:?}"),
        }
        // an older file is read after its update: the field is named, its position not
        let text = demo_v1_text().replace("\"panels\": 12", "\"panels\": \"twelve\"");
        let e = file_error(read_design_json(&text));
        assert!(matches!(&e, DesignFileError::NotADesign { version: 1, at: None, .. }), "{e:?}");
        let text = demo_v1_text().replace("\"deck\"", "\"desk\"");
        let message = file_error(read_design_json(&text)).to_string();
        assert!(message.contains("not a design of format 1") && message.contains("deck"), "{message}");
    }

    /// The field a hypothetical version 8 adds, and its default (test only).
    const FIELD_OF_VERSION_8: &str = "field_of_version_8";
    const DEFAULT_OF_VERSION_8: f64 = 0.25;

    fn version_7_to_8(design: &mut Map<String, Value>) {
        design.entry(FIELD_OF_VERSION_8).or_insert(Value::from(DEFAULT_OF_VERSION_8));
    }

    /// The demo as a version-6 file: no first-order rib option.
    fn demo_v6_text() -> String {
        let mut value = serde_json::to_value(Design::demo()).expect("serialises");
        value["version"] = Value::from(6);
        value["sizing"].as_object_mut().expect("sizing object").remove("rib_for_first_order");
        serde_json::to_string_pretty(&value).expect("serialises")
    }

    /// A format-6 file opens with the rib sized for alpha_cr >= 3 (the option off).
    #[test]
    fn version_6_files_size_the_rib_for_amplified_moments() {
        let d = read_design_json(&demo_v6_text()).expect("reads");
        assert!(!d.sizing.rib_for_first_order);
        assert_eq!(d, Design::demo());
    }

    /// The demo as a version-5 file: no form basis.
    fn demo_v5_text() -> String {
        let mut value = serde_json::to_value(Design::demo()).expect("serialises");
        value["version"] = Value::from(5);
        value["form"].as_object_mut().expect("form object").remove("basis");
        serde_json::to_string_pretty(&value).expect("serialises")
    }

    /// A format-5 file opens with its form found for panel loads, the only basis then.
    #[test]
    fn version_5_files_find_their_form_for_panel_loads() {
        let mut demo = Design::demo();
        demo.form.basis = crate::arch::form::Basis::AsBuilt;
        let d = read_design_json(&demo_v5_text()).expect("reads");
        assert_eq!(d.form.basis, crate::arch::form::Basis::PanelLoads);
        assert_eq!(d, Design::demo());
        // and an as-built design keeps its basis through a file
        let back = read_design_json(&write_design_json(&demo)).expect("reads");
        assert_eq!(back, demo);
    }

    /// The demo as a version-4 file: no sizing.
    fn demo_v4_text() -> String {
        let mut value = serde_json::to_value(Design::demo()).expect("serialises");
        value["version"] = Value::from(4);
        value.as_object_mut().expect("design object").remove("sizing");
        serde_json::to_string_pretty(&value).expect("serialises")
    }

    /// A format-4 file opens with every group as typed, checked as the material its E
    /// suggests (the demo's steel E of 210 GPa: S355), and its typed deck dead load.
    #[test]
    fn version_4_files_keep_their_typed_sections() {
        let d = read_design_json(&demo_v4_text()).expect("reads");
        let demo = Design::demo();
        assert_eq!(d.sizing, SizingDesign::as_typed(&demo.groups));
        assert!(d.sizing.rib.family.is_none() && d.sizing.rib.material.name() == "S355");
        assert_eq!(d.deck_dead_load(), demo.deck.dead_load);
        assert_eq!(Design { sizing: demo.sizing.clone(), ..d }, demo);
    }

    /// How a later version adds a field without breaking older files: one more step.
    /// Files of versions 1 to 7 reach version 8 through the whole chain with the
    /// defaults of every step; a version-8 file keeps its value; and today's reader,
    /// which knows no version 8, refuses such a file as made by a newer version.
    #[test]
    fn a_later_version_adds_a_field_by_one_more_step() {
        assert_eq!(DESIGN_VERSION, 7, "model the version after today's here");
        let steps: &[Step] = &[
            version_1_to_2,
            version_2_to_3,
            version_3_to_4,
            version_4_to_5,
            version_5_to_6,
            super::version_6_to_7,
            version_7_to_8,
        ];
        let v1 = demo_v1_text();
        let v2 = demo_v2_text();
        let v3 = demo_v3_text();
        let v4 = demo_v4_text();
        let v5 = demo_v5_text();
        let v6 = demo_v6_text();
        let v7 = write_design_json(&Design::demo());
        let demo_traffic = serde_json::to_value(Design::demo().traffic).expect("serialises");
        let default_traffic = serde_json::to_value(TrafficDesign::for_deck_width(11.0)).expect("serialises");
        for (text, declared, traffic) in [
            (&v1, 1, &default_traffic),
            (&v2, 2, &default_traffic),
            (&v3, 3, &demo_traffic),
            (&v4, 4, &demo_traffic),
            (&v5, 5, &demo_traffic),
            (&v6, 6, &demo_traffic),
            (&v7, 7, &demo_traffic),
        ] {
            let (version, value) = updated_json(text, steps).expect("reads");
            assert_eq!(version, declared);
            assert_eq!(value["version"], Value::from(8));
            assert_eq!(value["deck"]["abutment_height"], Value::from(DEFAULT_ABUTMENT_HEIGHT));
            assert_eq!(&value["traffic"], traffic, "version {declared}");
            assert!(value["actions"]["temperature"]["alpha"].is_number(), "version {declared}");
            assert!(value["sizing"]["rib"]["material"]["fy"].is_number(), "version {declared}");
            assert_eq!(value["form"]["basis"], Value::from("panel_loads"), "version {declared}");
            assert_eq!(value["sizing"]["rib_for_first_order"], Value::from(false), "version {declared}");
            assert_eq!(value[FIELD_OF_VERSION_8], Value::from(DEFAULT_OF_VERSION_8));
        }
        let mut v8: Value = serde_json::from_str(&v7).expect("JSON");
        v8["version"] = Value::from(8);
        v8[FIELD_OF_VERSION_8] = Value::from(0.5);
        let v8 = serde_json::to_string_pretty(&v8).expect("serialises");
        let (_, value) = updated_json(&v8, steps).expect("reads");
        assert_eq!(value[FIELD_OF_VERSION_8], Value::from(0.5));
        // today's reader
        let message = read_design_json(&v8).map_err(|e| e.to_string()).expect_err("refused");
        assert!(
            message.contains("made by a newer version of Springline (format 8; this one reads 1 to 7)"),
            "{message}"
        );
    }
}
