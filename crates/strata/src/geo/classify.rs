//! Class breaks for colour in steps. Each method returns the upper bounds
//! of the classes, ascending, the last being the largest value (so `count`
//! classes give `count` bounds; a value v falls in the first class whose
//! bound is >= v).
//!
//! - `natural`: Fisher's exact optimal partition (Fisher 1958, "On grouping
//!   for maximum homogeneity", JASA 53(284)), the least within-class sum of
//!   squared deviations, the "Jenks natural breaks" of cartography; by dynamic
//!   programming, O(k n²), on at most [`NATURAL_MAX`] values (larger inputs
//!   are thinned to evenly spaced order statistics first).
//! - `quantile`: bounds at the quantiles i/k, i = 1..k, by Hyndman and Fan's
//!   type 7 (linear between order statistics), repeats removed.
//! - `equal`: k equal intervals between the smallest and largest value.
//!
//! Checked against mapclassify (FisherJenks, Quantiles) in `tests/map_classes.rs`.

use crate::stat::quantile::{quantile_sorted, Method};

/// Most values the exact natural-breaks search runs on.
pub const NATURAL_MAX: usize = 4000;

fn sorted_finite(xs: &[f64]) -> Vec<f64> {
    let mut v: Vec<f64> = xs.iter().copied().filter(|x| x.is_finite()).collect();
    crate::sort::f64s(&mut v);
    v
}

/// Equal-interval bounds.
pub fn equal(xs: &[f64], k: usize) -> Vec<f64> {
    let v = sorted_finite(xs);
    if v.is_empty() || k == 0 {
        return Vec::new();
    }
    let (lo, hi) = (v[0], v[v.len() - 1]);
    let mut out: Vec<f64> = (1..k).map(|i| lo + (hi - lo) * i as f64 / k as f64).collect();
    out.push(hi);
    out.dedup();
    out
}

/// Quantile bounds (type 7), repeats removed.
pub fn quantile(xs: &[f64], k: usize) -> Vec<f64> {
    let v = sorted_finite(xs);
    if v.is_empty() || k == 0 {
        return Vec::new();
    }
    let mut out: Vec<f64> = (1..=k).filter_map(|i| quantile_sorted(&v, i as f64 / k as f64, Method::Type7)).collect();
    out.dedup();
    out
}

/// Fisher-Jenks natural-breaks bounds.
pub fn natural(xs: &[f64], k: usize) -> Vec<f64> {
    let mut v = sorted_finite(xs);
    if v.is_empty() || k == 0 {
        return Vec::new();
    }
    if v.len() > NATURAL_MAX {
        let n = v.len();
        v = (0..NATURAL_MAX).map(|i| v[i * (n - 1) / (NATURAL_MAX - 1)]).collect();
    }
    let n = v.len();
    let k = k.min(n);
    // Prefix sums, shifted by the first value for accuracy.
    let o = v[0];
    let mut s1 = vec![0.0; n + 1];
    let mut s2 = vec![0.0; n + 1];
    for i in 0..n {
        let d = v[i] - o;
        s1[i + 1] = s1[i] + d;
        s2[i + 1] = s2[i] + d * d;
    }
    // Sum of squared deviations of v[i..j] (j exclusive).
    let ssd = |i: usize, j: usize| {
        let m = (j - i) as f64;
        let a = s1[j] - s1[i];
        ((s2[j] - s2[i]) - a * a / m).max(0.0)
    };
    // cost[c][j]: best cost of v[..j] in c+1 classes; from[c][j]: start of the last class.
    let mut cost = vec![vec![f64::INFINITY; n + 1]; k];
    let mut from = vec![vec![0usize; n + 1]; k];
    for j in 1..=n {
        cost[0][j] = ssd(0, j);
    }
    for c in 1..k {
        for j in (c + 1)..=n {
            let mut best = f64::INFINITY;
            let mut at = c;
            for i in c..j {
                let t = cost[c - 1][i] + ssd(i, j);
                if t < best {
                    best = t;
                    at = i;
                }
            }
            cost[c][j] = best;
            from[c][j] = at;
        }
    }
    let mut bounds = Vec::with_capacity(k);
    let mut j = n;
    for c in (0..k).rev() {
        bounds.push(v[j - 1]);
        if c > 0 {
            j = from[c][j];
        }
    }
    bounds.reverse();
    bounds.dedup();
    bounds
}

/// The class (0-based) of a value given ascending upper bounds; values above
/// the last bound fall in the last class, NaN in none.
pub fn class_of(bounds: &[f64], v: f64) -> Option<usize> {
    if !v.is_finite() || bounds.is_empty() {
        return None;
    }
    Some(bounds.partition_point(|&b| b < v).min(bounds.len() - 1))
}

#[cfg(test)]
mod tests {
    use super::*;

    // Three clear groups give the gaps as breaks (Fisher 1958: the optimal
    // partition of well separated clusters is the clusters).
    #[test]
    fn natural_breaks_find_clusters() {
        let xs = [1.0, 2.0, 1.5, 10.0, 11.0, 10.5, 30.0, 31.0];
        assert_eq!(natural(&xs, 3), vec![2.0, 11.0, 31.0]);
        assert_eq!(class_of(&[2.0, 11.0, 31.0], 10.0), Some(1));
        assert_eq!(class_of(&[2.0, 11.0, 31.0], 2.0), Some(0));
        assert_eq!(class_of(&[2.0, 11.0, 31.0], f64::NAN), None);
    }

    #[test]
    fn equal_intervals() {
        assert_eq!(equal(&[0.0, 3.0, 10.0], 5), vec![2.0, 4.0, 6.0, 8.0, 10.0]);
    }
}
