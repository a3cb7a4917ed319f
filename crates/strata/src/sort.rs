//! One stable sort for the whole engine.
//!
//! Every `slice::sort_by` with its own element type or comparator is a
//! separate copy of the standard library's driftsort in the wasm module
//! (about 4-5 KB each). The engine's sorts therefore go through
//! [`by`]: it sorts positions (`usize`) with a comparator behind `dyn`, one
//! copy of driftsort for all of them, then moves the elements into that
//! order. A stable sort's result is fixed by the comparator, so the order is
//! the one `sort_by` gives.
//!
//! `sort_by(f64::total_cmp)` on plain `f64`s is one copy of its own, shared
//! by every such call, and stays. Sorts as large as the data (points by x)
//! go through [`by_x`] and [`by_f64_key`] instead: one more copy, sorting
//! `(f64, f64)` pairs in place, three to six times faster on a million
//! points than positions through `dyn`.

use core::cmp::Ordering;

/// The positions `0..n` in stable sorted order under `cmp`.
pub fn order(n: usize, cmp: &mut dyn FnMut(usize, usize) -> Ordering) -> Vec<usize> {
    let mut idx: Vec<usize> = (0..n).collect();
    idx.sort_by(|a, b| cmp(*a, *b));
    idx
}

/// Sorts `v` stably by `cmp`, like `v.sort_by(cmp)`.
pub fn by<T>(v: &mut [T], mut cmp: impl FnMut(&T, &T) -> Ordering) {
    if v.len() < 2 {
        return;
    }
    let idx = order(v.len(), &mut |a, b| cmp(&v[a], &v[b]));
    permute(idx, &mut |i, j| v.swap(i, j));
}

/// Sorts points stably by their first coordinate (`f64::total_cmp`).
pub fn by_x(v: &mut [(f64, f64)]) {
    v.sort_by(|a, b| a.0.total_cmp(&b.0));
}

/// Sorts `v` stably by an `f64` key (`f64::total_cmp`), like
/// `v.sort_by(|a, b| key(a).total_cmp(&key(b)))`, through [`by_x`] on
/// (key, position) pairs (positions below 2^53 are exact in an `f64`).
pub fn by_f64_key<T>(v: &mut [T], key: impl Fn(&T) -> f64) {
    let mut keyed: Vec<(f64, f64)> = v.iter().enumerate().map(|(i, x)| (key(x), i as f64)).collect();
    by_x(&mut keyed);
    permute(keyed.iter().map(|k| k.1 as usize).collect(), &mut |i, j| v.swap(i, j));
}

/// Moves the element at `idx[i]` to `i` for every `i` through `swap`,
/// following each cycle once.
pub fn permute(mut idx: Vec<usize>, swap: &mut dyn FnMut(usize, usize)) {
    for start in 0..idx.len() {
        if idx[start] == usize::MAX {
            continue;
        }
        let mut i = start;
        loop {
            let j = idx[i];
            idx[i] = usize::MAX;
            if j == start {
                break;
            }
            swap(i, j);
            i = j;
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Checked against the standard library's stable sort (`slice::sort_by`)
    // on the same input: equal keys keep their order.
    #[test]
    fn same_as_std_stable_sort() {
        let mut seed = 12345u64;
        for n in [0usize, 1, 2, 3, 7, 20, 21, 100, 1000] {
            let mut v: Vec<(u32, usize)> = (0..n)
                .map(|i| {
                    seed = seed.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
                    (((seed >> 33) % 13) as u32, i)
                })
                .collect();
            let mut want = v.clone();
            want.sort_by_key(|a| a.0);
            by(&mut v, |a, b| a.0.cmp(&b.0));
            assert_eq!(v, want, "n = {n}");
            let mut down = want.clone();
            down.sort_by_key(|b| std::cmp::Reverse(b.0));
            by(&mut v, |a, b| b.0.cmp(&a.0));
            assert_eq!(v, down, "n = {n}, descending");
            // An f64 key with ties, NaN and -0.0, against std's sort_by with total_cmp.
            let keys = [3.5, -0.0, 0.0, f64::NAN, -1.0, 3.5, f64::INFINITY];
            let mut w: Vec<(f64, usize)> = (0..n).map(|i| (keys[(i * 5 + n) % keys.len()], i)).collect();
            let mut want = w.clone();
            want.sort_by(|a, b| a.0.total_cmp(&b.0));
            by_f64_key(&mut w, |p| p.0);
            assert_eq!(w.iter().map(|p| p.1).collect::<Vec<_>>(), want.iter().map(|p| p.1).collect::<Vec<_>>(), "n = {n}, f64 key");
            let mut pts: Vec<(f64, f64)> = w.iter().rev().map(|p| (p.0, p.1 as f64)).collect();
            let mut want = pts.clone();
            want.sort_by(|a, b| a.0.total_cmp(&b.0));
            by_x(&mut pts);
            assert_eq!(pts.iter().map(|p| p.1).collect::<Vec<_>>(), want.iter().map(|p| p.1).collect::<Vec<_>>(), "n = {n}, points");
        }
    }
}
