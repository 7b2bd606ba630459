//! Design links: any text, and any bytes behind a correct outer layer of every design
//! link format, opens or is refused with a message; never a panic. A link that opens
//! holds a design that validates, whose own link opens to the same design.
#![no_main]

use libfuzzer_sys::fuzz_target;
use springline_fuzz::packed;
use springline_statics::link::permalink::{decode, encode, split_view};

fuzz_target!(|data: &[u8]| {
    let Some((&mode, rest)) = data.split_first() else { return };
    let link = match mode % 4 {
        0 => packed("s1", rest),
        1 => packed("s2", rest),
        _ => String::from_utf8_lossy(rest).into_owned(),
    };
    let _ = split_view(&link);
    match decode(&link) {
        Ok(design) => {
            assert!(springline_statics::validate_design(&design).is_ok(), "an opened link's design validates");
            let again = decode(&encode(&design));
            assert_eq!(again.as_ref(), Ok(&design), "an opened link's design must reopen from its own link");
        }
        Err(e) => assert!(!e.to_string().is_empty()),
    }
});
