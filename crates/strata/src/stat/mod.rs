//! Numerical statistics on plain slices; the plan stage applies them to
//! layers. Every function here is pure and deterministic (transcendental
//! functions go through [`crate::math`]).
//!
//! - [`quantile`]: sample quantiles, Hyndman & Fan (1996) types 5 to 8.
//! - [`dist`]: log-gamma, regularised incomplete beta, Student t and normal
//!   distribution functions and quantiles.
//! - [`bin`]: histogram bin edges (Sturges, Scott, Freedman-Diaconis, square
//!   root, Rice, Doane; explicit width, count, boundary; calendar units) and
//!   fast counting.
//! - [`summary`]: summaries and intervals (Student t, standard error,
//!   min-max, Wilson 1927).
//! - [`fit`]: least-squares line with a confidence band; LOESS (Cleveland 1979).
//! - [`density`]: Gaussian kernel density, exact and linearly binned.
//! - [`tukey`]: Tukey box-plot statistics.
//! - [`window`]: rolling mean and sum, running total.
//! - [`m4`]: M4 reduction of a line to at most four points per pixel column.
//! - [`rng`]: a small seeded generator (SplitMix64) for jitter.

pub mod bin;
pub mod density;
pub mod dist;
pub mod fit;
pub mod m4;
pub mod quantile;
pub mod rng;
pub mod summary;
pub mod tukey;
pub mod window;

#[cfg(test)]
mod reference_tests;

/// Arithmetic mean of the finite values, or `None` when there are none.
pub fn mean(xs: &[f64]) -> Option<f64> {
    let (s, n) = xs.iter().filter(|x| x.is_finite()).fold((0.0, 0usize), |(s, n), x| (s + x, n + 1));
    if n == 0 {
        None
    } else {
        Some(s / n as f64)
    }
}

/// Variance with `ddof` degrees of freedom removed (0: population, 1:
/// sample), by the two-pass algorithm. `None` when `n <= ddof`.
pub fn variance(xs: &[f64], ddof: usize) -> Option<f64> {
    let n = xs.len();
    if n <= ddof {
        return None;
    }
    let m = xs.iter().sum::<f64>() / n as f64;
    let ss: f64 = xs.iter().map(|x| (x - m) * (x - m)).sum();
    Some(ss / (n - ddof) as f64)
}

/// Standard deviation with `ddof` degrees of freedom removed.
pub fn std_dev(xs: &[f64], ddof: usize) -> Option<f64> {
    variance(xs, ddof).map(f64::sqrt)
}

/// A sorted copy of the finite values.
pub fn sorted_finite(xs: &[f64]) -> Vec<f64> {
    let mut v: Vec<f64> = xs.iter().copied().filter(|x| x.is_finite()).collect();
    crate::sort::f64s(&mut v);
    v
}

/// Pearson's correlation coefficient r.
pub fn correlation(xs: &[f64], ys: &[f64]) -> Option<f64> {
    let n = xs.len().min(ys.len());
    if n < 2 {
        return None;
    }
    let mx = xs[..n].iter().sum::<f64>() / n as f64;
    let my = ys[..n].iter().sum::<f64>() / n as f64;
    let (mut sxy, mut sxx, mut syy) = (0.0, 0.0, 0.0);
    for i in 0..n {
        let (dx, dy) = (xs[i] - mx, ys[i] - my);
        sxy += dx * dy;
        sxx += dx * dx;
        syy += dy * dy;
    }
    if sxx == 0.0 || syy == 0.0 {
        return None;
    }
    Some(sxy / (sxx * syy).sqrt())
}
