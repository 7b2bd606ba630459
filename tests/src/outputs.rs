//! Every output the engine makes for one design, and the check that none of them holds a
//! non-finite number: shared by the bad-input catalogue, the numeric-range property test
//! and the pipeline fuzz target.

use springline_statics::arch::options::key_numbers;
use springline_statics::arch::sizing::size_of;
use springline_statics::arch::stability::arch_stability;
use springline_statics::{analyze_valid, Design, StaticsError, ValidDesign};

/// Fields whose documented value "nothing buckles" is infinity (a critical load factor
/// or force, a slenderness limit without compression); any other infinity, and every
/// NaN, is a defect.
pub const INFINITE_MEANS_NO_BUCKLING: [&str; 5] =
    ["alpha_cr", "alpha_moment", "alpha_compression", "n_cr", "limit"];

/// Where a `Debug` dump spells a non-finite float (`NaN`, `inf`, `-inf`) other than an
/// infinity of [`INFINITE_MEANS_NO_BUCKLING`]: each with the 80 characters before it,
/// which name the field. Text inside strings (names a user typed) is not read.
pub fn non_finite_words(dump: &str) -> Vec<String> {
    let dump = &without_strings(dump);
    let mut found = Vec::new();
    let mut start = 0;
    for (end, c) in dump.char_indices().chain(std::iter::once((dump.len(), ' '))) {
        if c.is_ascii_alphanumeric() || c == '_' {
            continue;
        }
        let word = dump.get(start..end).unwrap_or_default();
        let before = dump.get(..start).unwrap_or_default();
        let allowed = word == "inf"
            && !before.ends_with('-')
            && INFINITE_MEANS_NO_BUCKLING.iter().any(|field| {
                before.ends_with(&format!("{field}: ")) || before.ends_with(&format!("{field}: Some("))
            });
        if (word == "NaN" || word == "inf") && !allowed {
            let mut from = start.saturating_sub(80);
            while !dump.is_char_boundary(from) {
                from -= 1;
            }
            found.push(dump.get(from..end).unwrap_or_default().to_string());
        }
        start = end + c.len_utf8();
    }
    found
}

/// `dump` with the contents of its `Debug` strings (between unescaped double quotes)
/// blanked, so a name holding "NaN" does not read as a number.
fn without_strings(dump: &str) -> String {
    let (mut inside, mut escaped) = (false, false);
    dump.chars()
        .map(|c| {
            let closing = inside && c == '"' && !escaped;
            let blank = inside && !closing;
            if closing {
                inside = false;
            } else if !inside && c == '"' {
                inside = true;
            }
            escaped = inside && c == '\\' && !escaped;
            if blank {
                ' '
            } else {
                c
            }
        })
        .collect()
}

/// The engine's outputs for `design`, each as (what, its `Debug` dump or its error's
/// message): the analysis (every case and figure), the arch's stability (two modes), the
/// size report (traffic envelopes, sizing, quantities, foundations) and the key numbers
/// of one sweep step. `Err` when the design does not validate (the message is the one
/// the user sees).
pub fn everything(design: &Design) -> Result<Vec<(&'static str, String)>, StaticsError> {
    outputs(design, true)
}

/// [`everything`] without the size report and the key numbers (which size the design
/// under traffic: about a minute at 200 panels in a test build, the performance issue's
/// growth table).
pub fn analysis_and_stability(design: &Design) -> Result<Vec<(&'static str, String)>, StaticsError> {
    outputs(design, false)
}

fn outputs(design: &Design, sizing: bool) -> Result<Vec<(&'static str, String)>, StaticsError> {
    fn dump<T: std::fmt::Debug>(r: Result<T, StaticsError>) -> String {
        match r {
            Ok(value) => format!("{value:?}"),
            Err(e) => format!("refused: {e}"),
        }
    }
    let valid = ValidDesign::new(design)?;
    let mut out =
        vec![("analysis", dump(analyze_valid(&valid))), ("stability", dump(arch_stability(&valid, 2)))];
    if sizing {
        out.push(("sizes", dump(size_of(design))));
        out.push(("key numbers", format!("{:?}", key_numbers(design, true))));
    }
    Ok(out)
}

/// Every non-finite number in `outputs` (from [`everything`]), each as "what: the text
/// before it".
pub fn non_finite_in(outputs: &[(&'static str, String)]) -> Vec<String> {
    outputs
        .iter()
        .flat_map(|(what, dump)| non_finite_words(dump).into_iter().map(move |w| format!("{what}: {w}")))
        .collect()
}

/// Panics naming every non-finite number in `outputs` (from [`everything`]) and the
/// design they came from.
pub fn assert_finite(design: &Design, outputs: &[(&'static str, String)]) {
    let bad = non_finite_in(outputs);
    assert!(bad.is_empty(), "non-finite numbers in the outputs of {design:?}: {bad:#?}");
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn only_numbers_count_and_documented_infinities_pass() {
        let dump = r#"Case { name: "sway NaN \"inf\" roof", x: NaN, alpha_cr: inf, y: -inf, n_cr: Some(inf), z: 1.0 }"#;
        let found = non_finite_words(dump);
        assert_eq!(found.len(), 2, "{found:?}");
        assert!(found[0].ends_with("x: NaN") && found[1].ends_with("y: -inf"), "{found:?}");
    }
}
