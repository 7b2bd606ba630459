//! Summaries of timed samples for the browser benchmarks.

/// The `p`-th percentile (0 to 100) of `v`, nearest rank; NaN when `v` is empty.
pub fn percentile(mut v: Vec<f64>, p: f64) -> f64 {
    v.sort_by(f64::total_cmp);
    let rank = ((p / 100.0) * v.len() as f64).ceil().max(1.0) as usize;
    v.get(rank.min(v.len()).saturating_sub(1)).copied().unwrap_or(f64::NAN)
}
