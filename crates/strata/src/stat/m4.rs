//! M4 line reduction: Jugel, Jerzak, Hackenbroich & Markl (2014), "M4: a
//! visualization-oriented time series data aggregation", PVLDB 7(10).
//!
//! For a line drawn `w` pixels wide, keeping in each pixel column the first,
//! last, smallest and largest point draws the same pixels as the full line
//! (the paper's error-free rasterisation), so at most 4 w points remain.

/// The pixel column of an x position: `floor(px)`, written out so it
/// inlines (without SSE4.1, `f64::floor` is a call into libm, and M4 calls
/// it once per point). Equal to `floor` for every |px| < 2^63.
#[inline]
pub fn column(px: f64) -> f64 {
    let t = px as i64 as f64;
    if t > px {
        t - 1.0
    } else {
        t
    }
}

/// Indices (ascending) of the points to keep. `px` are the points' pixel
/// x positions in drawing order (sorted ascending), `py` their pixel y.
pub fn m4_indices(px: &[f64], py: &[f64]) -> Vec<usize> {
    let n = px.len().min(py.len());
    let mut keep = Vec::new();
    let mut i = 0;
    while i < n {
        let col = column(px[i]);
        let first = i;
        let (mut lo, mut hi) = (i, i);
        let mut j = i + 1;
        while j < n && column(px[j]) == col {
            if py[j] < py[lo] {
                lo = j;
            }
            if py[j] > py[hi] {
                hi = j;
            }
            j += 1;
        }
        let last = j - 1;
        let mut four = [first, lo, hi, last];
        crate::sort::usizes(&mut four);
        for k in four {
            if keep.last() != Some(&k) {
                keep.push(k);
            }
        }
        i = j;
    }
    keep
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn keeps_extremes_per_column() {
        // Column 0: x 0.1..0.9 with y 5, 1, 9, 3, 4 -> first (0), min (1), max (2), last (4).
        let px = [0.1, 0.3, 0.5, 0.7, 0.9, 1.2, 2.5, 2.6];
        let py = [5.0, 1.0, 9.0, 3.0, 4.0, 2.0, 7.0, 7.0];
        assert_eq!(m4_indices(&px, &py), vec![0, 1, 2, 4, 5, 6, 7]);
    }

    #[test]
    fn never_more_than_four_per_column() {
        let n = 20_000;
        let px: Vec<f64> = (0..n).map(|i| i as f64 * 200.0 / n as f64).collect();
        let py: Vec<f64> = (0..n).map(|i| crate::math::sin(i as f64 * 0.01) * 100.0).collect();
        let keep = m4_indices(&px, &py);
        assert!(keep.len() <= 4 * 200, "{}", keep.len());
        // Every column's extremes survive.
        for c in 0..200 {
            let idx: Vec<usize> = (0..n).filter(|i| px[*i].floor() as usize == c).collect();
            let kept: Vec<usize> = keep.iter().copied().filter(|i| px[*i].floor() as usize == c).collect();
            let mn = idx.iter().map(|i| py[*i]).fold(f64::INFINITY, f64::min);
            let mx = idx.iter().map(|i| py[*i]).fold(f64::NEG_INFINITY, f64::max);
            assert!(kept.iter().any(|i| py[*i] == mn) && kept.iter().any(|i| py[*i] == mx));
            assert_eq!(kept.first(), idx.first());
            assert_eq!(kept.last(), idx.last());
        }
    }

    #[test]
    fn column_is_floor() {
        // Against std's f64::floor (IEEE 754 roundToIntegralTowardNegative).
        let cases = [0.0, -0.0, 0.5, -0.5, 1.0, -1.0, 799.999_999, -1e-300, 1e15 + 0.5, -(1e15 + 0.5), 4.5e15, -4.5e15, 1e18, -1e18];
        for v in cases.into_iter().chain((0..10_000).map(|i| (i as f64 - 5000.0) * 0.037)) {
            assert_eq!(column(v), v.floor(), "{v}");
        }
    }
}
