//! Sample quantiles by the continuous definitions of Hyndman & Fan (1996),
//! "Sample quantiles in statistical packages", The American Statistician
//! 50(4), 361-365: types 5 to 8. Type 7 is the engine's default (box plots,
//! the `quantile` summary, the Freedman-Diaconis rule).

/// Which Hyndman & Fan definition to use.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Method {
    /// Type 5: piecewise linear, knots at (k - 1/2) / n.
    Type5,
    /// Type 6: p(k) = k / (n + 1).
    Type6,
    /// Type 7: p(k) = (k - 1) / (n - 1).
    #[default]
    Type7,
    /// Type 8: p(k) = (k - 1/3) / (n + 1/3); approximately median-unbiased.
    Type8,
}

impl Method {
    /// By Hyndman & Fan's type number.
    pub fn from_type(t: u32) -> Option<Method> {
        match t {
            5 => Some(Method::Type5),
            6 => Some(Method::Type6),
            7 => Some(Method::Type7),
            8 => Some(Method::Type8),
            _ => None,
        }
    }

    /// Hyndman & Fan's (alpha, beta): p(k) = (k - alpha) / (n + 1 - alpha - beta).
    fn alpha_beta(self) -> (f64, f64) {
        match self {
            Method::Type5 => (0.5, 0.5),
            Method::Type6 => (0.0, 0.0),
            Method::Type7 => (1.0, 1.0),
            Method::Type8 => (1.0 / 3.0, 1.0 / 3.0),
        }
    }
}

/// Quantile `p` (0..=1) of already sorted finite values; `None` when empty.
pub fn quantile_sorted(sorted: &[f64], p: f64, method: Method) -> Option<f64> {
    let n = sorted.len();
    if n == 0 || !(0.0..=1.0).contains(&p) {
        return None;
    }
    let (a, b) = method.alpha_beta();
    // Zero-based virtual index h - 1, with h = (n + 1 - a - b) p + a.
    let h = p * (n as f64 + 1.0 - a - b) + a - 1.0;
    if h <= 0.0 {
        return Some(sorted[0]);
    }
    if h >= (n - 1) as f64 {
        return Some(sorted[n - 1]);
    }
    let j = h.floor();
    let g = h - j;
    let j = j as usize;
    let (lo, hi) = (sorted[j], sorted[j + 1]);
    // Interpolate from the nearer end, so that g = 0 or 1 gives a data value exactly.
    Some(if g < 0.5 { lo + g * (hi - lo) } else { hi - (1.0 - g) * (hi - lo) })
}

/// Quantile of unsorted values (non-finite values are ignored).
pub fn quantile(xs: &[f64], p: f64, method: Method) -> Option<f64> {
    quantile_sorted(&super::sorted_finite(xs), p, method)
}

/// Median of sorted values.
pub fn median_sorted(sorted: &[f64]) -> Option<f64> {
    quantile_sorted(sorted, 0.5, Method::Type7)
}
