//! The whole engine on designs of the demo's family made from fuzz bytes (span 12 to
//! 400 m, 2 to 12 panels, 1 to 8 ribs, every system, bracing, basis and traffic model;
//! more panels make a run of minutes per design with fuzzing instrumentation): a design
//! is refused with a message or, when valid, analysed, checked for stability, sized with
//! its traffic envelopes and summed up as one step of a sweep, with finite numbers only
//! and never a panic.
#![no_main]

use libfuzzer_sys::fuzz_target;
use springline_fuzz::{design_from, Bytes};
use springline_tests::outputs::{assert_finite, everything};

fuzz_target!(|data: &[u8]| {
    let design = design_from(&mut Bytes::new(data), 12);
    if let Ok(outputs) = everything(&design) {
        assert_finite(&design, &outputs);
    }
});
