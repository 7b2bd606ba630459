//! Design files of every format version: any text is read or refused with a message;
//! never a panic. A file that reads and validates writes back to the same design.
#![no_main]

use libfuzzer_sys::fuzz_target;
use springline_statics::arch::design_file::{read_design_json, write_design_json};
use springline_statics::arch::design::DESIGN_VERSION;
use springline_statics::{validate_design, Design};

fuzz_target!(|data: &[u8]| {
    let text = String::from_utf8_lossy(data);
    if let Ok(design) = read_design_json(&text) {
        // an invalid design can be opened to be mended; only a valid one must round-trip
        if validate_design(&design).is_ok() {
            // written in the current format, whatever version it was read from
            let design = Design { version: DESIGN_VERSION, ..design };
            let again = read_design_json(&write_design_json(&design));
            assert_eq!(again.as_ref(), Ok(&design), "a valid design must read back as written");
        }
    }
});
