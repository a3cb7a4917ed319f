//! Placing labels along one axis: direct labels at the ends of lines are
//! pushed apart vertically, each staying as near its line as it can.
//!
//! The placement is the least-squares problem
//!   minimise  sum_i (p_i - w_i)^2
//!   subject to p_(i+1) - p_i >= gap (in the order of the wanted positions w)
//!   and lo <= p_i <= hi,
//! solved exactly: with q_i = p_i - i * gap the spacing constraints become
//! q non-decreasing, so q is the isotonic regression of w_i - i * gap,
//! found by the pool-adjacent-violators algorithm (Ayer et al., Ann. Math.
//! Statist. 26(4), 1955; Barlow et al., "Statistical Inference under Order
//! Restrictions", 1972), then clamped to the bounds (clamping an isotonic
//! fit to a box gives the box-constrained fit). Checked against SciPy's
//! general constrained solver (tests/reference/gen/spread_fixtures.py).

/// Positions for labels wanted at `want` (any order; the result is in the
/// same order), at least `gap` apart, within `lo..=hi` where they fit (when
/// they cannot all fit, they run on past `hi`).
pub fn spread(want: &[f64], gap: f64, lo: f64, hi: f64) -> Vec<f64> {
    let n = want.len();
    if n == 0 {
        return vec![];
    }
    let mut order: Vec<usize> = Vec::with_capacity(n);
    for (i, w) in want.iter().enumerate() {
        if w.is_finite() {
            order.push(i);
        }
    }
    crate::sort::by(&mut order, |a, b| want[*a].total_cmp(&want[*b]).then(a.cmp(b)));
    // Blocks of pooled values: (sum, count).
    let mut blocks: Vec<(f64, usize)> = Vec::with_capacity(order.len());
    for (k, &i) in order.iter().enumerate() {
        blocks.push((want[i] - k as f64 * gap, 1));
        while blocks.len() > 1 {
            let (s1, c1) = blocks[blocks.len() - 1];
            let (s0, c0) = blocks[blocks.len() - 2];
            if s0 / c0 as f64 <= s1 / c1 as f64 {
                break;
            }
            blocks.pop();
            let last = blocks.len() - 1;
            blocks[last] = (s0 + s1, c0 + c1);
        }
    }
    let upper = (hi - (order.len().saturating_sub(1)) as f64 * gap).max(lo);
    let mut out = want.to_vec();
    let mut k = 0;
    for (s, c) in blocks {
        let q = crate::math::clamp(s / c as f64, lo, upper);
        for _ in 0..c {
            out[order[k]] = q + k as f64 * gap;
            k += 1;
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[derive(serde::Deserialize)]
    struct Case {
        want: Vec<f64>,
        gap: f64,
        lo: f64,
        hi: f64,
        placed: Vec<f64>,
    }

    /// SciPy 1.17.1 `optimize.minimize(method="SLSQP")` on the same
    /// least-squares problem with its spacing and bound constraints
    /// (tests/reference/gen/spread_fixtures.py; versions in the fixture).
    #[test]
    fn matches_a_general_constrained_solver() {
        #[derive(serde::Deserialize)]
        struct Fixture {
            cases: Vec<Case>,
        }
        let f: Fixture = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/layout/spread.json")).unwrap();
        assert!(f.cases.len() >= 10);
        for c in &f.cases {
            let got = spread(&c.want, c.gap, c.lo, c.hi);
            for (g, e) in got.iter().zip(&c.placed) {
                assert!((g - e).abs() < 1e-3, "want {:?} gap {} in {}..{}: got {got:?}, solver {:?}", c.want, c.gap, c.lo, c.hi, c.placed);
            }
        }
    }

    #[test]
    fn apart_in_order_and_untouched_when_free() {
        assert_eq!(spread(&[10.0, 50.0, 90.0], 12.0, 0.0, 100.0), vec![10.0, 50.0, 90.0]);
        // Two wanted at one place split evenly about it.
        assert_eq!(spread(&[50.0, 50.0], 12.0, 0.0, 100.0), vec![44.0, 56.0]);
        // Against the bottom bound.
        assert_eq!(spread(&[100.0, 99.0], 10.0, 0.0, 100.0), vec![100.0, 90.0]);
        assert!(spread(&[], 10.0, 0.0, 1.0).is_empty());
    }
}
