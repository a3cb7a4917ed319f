//! Summaries of a group of values and intervals around them.

use super::dist::{normal_quantile, t_quantile};
use super::quantile::{quantile_sorted, Method};

/// A one-number summary.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Summary {
    Count,
    Sum,
    Mean,
    Median,
    Min,
    Max,
    /// Quantile p (0..1), type 7.
    Quantile(f64),
    /// Sample standard deviation (n - 1 in the denominator).
    StandardDeviation,
}

impl Summary {
    /// The fixtures name cases by the spec's words (the engine maps the
    /// spec's word enums in `plan/stat.rs`).
    #[cfg(test)]
    pub fn from_word(w: &str, p: Option<f64>) -> Option<Summary> {
        Some(match w {
            "count" => Summary::Count,
            "sum" => Summary::Sum,
            "mean" => Summary::Mean,
            "median" => Summary::Median,
            "min" => Summary::Min,
            "max" => Summary::Max,
            "quantile" => Summary::Quantile(p.unwrap_or(0.5)),
            "standard_deviation" => Summary::StandardDeviation,
            _ => return None,
        })
    }

    /// The summary of finite values `xs`.
    pub fn of(self, xs: &[f64]) -> Option<f64> {
        let n = xs.len();
        match self {
            Summary::Count => Some(n as f64),
            Summary::Sum => Some(xs.iter().sum()),
            Summary::Mean => super::mean(xs),
            Summary::Min => xs.iter().copied().reduce(f64::min),
            Summary::Max => xs.iter().copied().reduce(f64::max),
            Summary::Median => quantile_sorted(&super::sorted_finite(xs), 0.5, Method::Type7),
            Summary::Quantile(p) => quantile_sorted(&super::sorted_finite(xs), p, Method::Type7),
            Summary::StandardDeviation => super::std_dev(xs, 1),
        }
    }
}

/// An interval drawn around a summary.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Interval {
    /// Confidence interval for the mean at `level` (0..1) by Student's t
    /// with n - 1 degrees of freedom: mean ± t s / √n.
    Confidence(f64),
    /// Mean ± one standard error, s / √n.
    StandardError,
    /// From the smallest to the largest value.
    MinMax,
    /// Wilson (1927) score interval for a proportion at `level`; values are
    /// 0/1 (false/true) outcomes.
    Wilson(f64),
}

impl Interval {
    /// `ci95`, `ci90`, `ci99` (any `ciNN`), `standard_error`, `min_max`,
    /// `wilson` (95 %) or `wilson90` etc.
    /// The fixtures name cases by the spec's words (the engine maps the
    /// spec's word enums in `plan/stat.rs`).
    #[cfg(test)]
    pub fn from_word(w: &str) -> Option<Interval> {
        let level = |s: &str| -> Option<f64> {
            if s.is_empty() {
                return Some(0.95);
            }
            let v: f64 = s.parse().ok()?;
            (v > 0.0 && v < 100.0).then_some(v / 100.0)
        };
        if let Some(rest) = w.strip_prefix("ci") {
            if rest.is_empty() {
                return None;
            }
            return level(rest).map(Interval::Confidence);
        }
        if let Some(rest) = w.strip_prefix("wilson") {
            return level(rest).map(Interval::Wilson);
        }
        match w {
            "standard_error" => Some(Interval::StandardError),
            "min_max" => Some(Interval::MinMax),
            _ => None,
        }
    }

    /// (low, high) for finite values `xs`; `None` when undefined (such as
    /// a t interval of one value).
    pub fn of(self, xs: &[f64]) -> Option<(f64, f64)> {
        let n = xs.len();
        match self {
            Interval::Confidence(level) => t_interval(xs, level),
            Interval::StandardError => {
                let m = super::mean(xs)?;
                let se = super::std_dev(xs, 1)? / (n as f64).sqrt();
                Some((m - se, m + se))
            }
            Interval::MinMax => Some((xs.iter().copied().reduce(f64::min)?, xs.iter().copied().reduce(f64::max)?)),
            Interval::Wilson(level) => {
                let k = xs.iter().filter(|x| **x != 0.0).count();
                wilson(k as f64, n as f64, level)
            }
        }
    }
}

/// Student t confidence interval for the mean.
pub fn t_interval(xs: &[f64], level: f64) -> Option<(f64, f64)> {
    let n = xs.len();
    if n < 2 {
        return None;
    }
    let m = super::mean(xs)?;
    let se = super::std_dev(xs, 1)? / (n as f64).sqrt();
    let t = t_quantile(0.5 + level / 2.0, (n - 1) as f64);
    Some((m - t * se, m + t * se))
}

/// Wilson (1927) score interval for `k` successes in `n` trials:
/// (p̂ + z²/2n ± z √(p̂(1-p̂)/n + z²/4n²)) / (1 + z²/n).
/// E. B. Wilson (1927), "Probable inference, the law of succession, and
/// statistical inference", JASA 22(158), 209-212.
pub fn wilson(k: f64, n: f64, level: f64) -> Option<(f64, f64)> {
    if n <= 0.0 {
        return None;
    }
    let z = normal_quantile(0.5 + level / 2.0);
    let p = k / n;
    let z2 = z * z;
    let centre = p + z2 / (2.0 * n);
    let half = z * (p * (1.0 - p) / n + z2 / (4.0 * n * n)).sqrt();
    let d = 1.0 + z2 / n;
    Some(((centre - half) / d, (centre + half) / d))
}
