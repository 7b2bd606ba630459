//! The neutral model format (what `springline solve` reads): any text is solved or
//! refused with a message; never a panic, and a solution holds finite numbers only.
#![no_main]

use libfuzzer_sys::fuzz_target;
use springline_tests::outputs::non_finite_words;
use springline_statics::{solve, truss_determinacy, Model};

fuzz_target!(|data: &[u8]| {
    let Ok(model) = serde_json::from_slice::<Model>(data) else { return };
    let _ = truss_determinacy(&model);
    if let Ok(solution) = solve(&model) {
        let dump = format!("{solution:?}");
        assert!(non_finite_words(&dump).is_empty(), "non-finite number in a solution: {dump}");
    }
});
