//! One stable sort for the whole engine, compiled once.
//!
//! The standard library's stable sort is generic over the item and the comparison, so
//! every call site gets its own copy of the whole algorithm (several kilobytes each in
//! WebAssembly; about a tenth of the page's code once twenty call sites and the view
//! layer's were counted). Here the algorithm runs once, on a list of positions compared
//! through a `dyn` closure; each caller only adds the small code that moves its items.
//! Sorts whose item and comparison are the same at every call site are one copy already
//! and need no list of positions (hot paths: each member's stations, each node's
//! neighbours): numbers by [`sort_numbers`], indices by `sort_unstable`.

use std::cmp::Ordering;

/// Sorts `items` in place by `compare`, keeping equal items in their order (a stable
/// sort, as `slice::sort_by`). O(n log n) comparisons and one list of positions.
pub fn sort_by<T>(items: &mut [T], mut compare: impl FnMut(&T, &T) -> Ordering) {
    let order = sorted_positions(items.len(), &mut |a, b| match (items.get(a), items.get(b)) {
        (Some(x), Some(y)) => compare(x, y),
        // positions are 0..len: never
        _ => Ordering::Equal,
    });
    place(items, order);
}

/// Sorts `items` in place by the key `key` gives each (stable).
pub fn sort_by_key<T, K: Ord>(items: &mut [T], mut key: impl FnMut(&T) -> K) {
    sort_by(items, |a, b| key(a).cmp(&key(b)));
}

/// Sorts numbers ascending by `f64::total_cmp` (-0 before +0; a NaN of positive sign
/// last, of negative sign first).
pub fn sort_numbers(values: &mut [f64]) {
    // the comparison is one function for every caller: one compiled copy, no allocation
    // for short lists
    values.sort_by(f64::total_cmp);
}

/// The positions `0..n` ordered by `compare` (stable): the one compiled sort.
fn sorted_positions(n: usize, compare: &mut dyn FnMut(usize, usize) -> Ordering) -> Vec<usize> {
    let mut order: Vec<usize> = (0..n).collect();
    order.sort_by(|&a, &b| compare(a, b));
    order
}

/// Moves the item at `order[p]` to position `p` for every `p`, one cycle of the
/// permutation at a time with swaps (no copies of the items; `order` is used up).
fn place<T>(items: &mut [T], mut order: Vec<usize>) {
    for start in 0..order.len() {
        let mut at = start;
        // `order[at] == at` marks a position done (or an item already in place)
        while let Some(&from) = order.get(at).filter(|&&from| from != at) {
            if from == start {
                // the cycle closes: the item that started it is here already
                if let Some(slot) = order.get_mut(at) {
                    *slot = at;
                }
                break;
            }
            items.swap(at, from);
            if let Some(slot) = order.get_mut(at) {
                *slot = at;
            }
            at = from;
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Check value: the standard library's stable sort (`slice::sort_by`) on the same
    /// items.
    #[test]
    fn sorts_like_the_standard_stable_sort() {
        // pairs with repeated keys: stability shows in the second field
        let mut seed = 12345u64;
        for n in [0usize, 1, 2, 3, 7, 20, 33, 100, 257] {
            let mut items: Vec<(u32, usize)> = (0..n)
                .map(|i| {
                    seed = seed.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
                    (((seed >> 33) % 9) as u32, i)
                })
                .collect();
            let mut expected = items.clone();
            expected.sort_by_key(|a| a.0);
            sort_by(&mut items, |a, b| a.0.cmp(&b.0));
            assert_eq!(items, expected, "n = {n}");
        }
    }

    #[test]
    fn sorts_items_that_are_not_copy() {
        let mut words: Vec<String> = ["pier", "arch", "deck", "post", "arch"].map(String::from).to_vec();
        sort_by_key(&mut words, |w| w.clone());
        assert_eq!(words, ["arch", "arch", "deck", "pier", "post"]);
    }

    #[test]
    fn numbers_in_total_order() {
        let mut v = [3.0, -0.0, f64::NAN, 0.0, -2.5, f64::INFINITY];
        sort_numbers(&mut v);
        assert_eq!(v[..3], [-2.5, -0.0, 0.0]);
        assert!(v[0].is_sign_negative() && v[1].is_sign_negative() && v[2].is_sign_positive());
        assert_eq!(v[3..5], [3.0, f64::INFINITY]);
        assert!(v[5].is_nan());
    }
}
