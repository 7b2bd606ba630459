//! Comparison links and the saved options a browser keeps: any text, and any bytes behind
//! a correct outer layer, opens or is refused with a message; never a panic. What
//! opens reopens from its own link; saved content reads back as written.
#![no_main]

use libfuzzer_sys::fuzz_target;
use springline_fuzz::packed;
use springline_statics::link::comparison::{decode_comparison, encode_comparison, read_saved, write_saved};

fuzz_target!(|data: &[u8]| {
    let Some((&mode, rest)) = data.split_first() else { return };
    match mode % 3 {
        0 => comparison(&packed("o1", rest)),
        1 => comparison(&String::from_utf8_lossy(rest)),
        _ => saved(&String::from_utf8_lossy(rest)),
    }
});

fn comparison(link: &str) {
    if let Ok(opened) = decode_comparison(link) {
        let link = encode_comparison(&opened).expect("an opened comparison encodes");
        assert_eq!(decode_comparison(&link).as_ref(), Ok(&opened), "an opened comparison must reopen");
    }
}

fn saved(text: &str) {
    if let Ok(read) = read_saved(text) {
        let again = read_saved(&write_saved(&read.options)).expect("written options read back");
        assert_eq!(again.options, read.options, "saved options must read back as written");
        assert!(again.set_aside.is_empty());
    }
}
