//! Histogram bins: edges by a rule, a count or a width, and counting.
//!
//! Bins are closed on the left, `[e_k, e_{k+1})`, and the last bin is closed
//! on both sides, so the maximum is counted.
//!
//! The rules compute a bin width h from the data; the number of bins is then
//! ceil((max - min) / h) and the edges are spaced evenly from the minimum to
//! the maximum (so the realised width is at most h):
//!
//! | rule      | width h                                                      | source |
//! |-----------|--------------------------------------------------------------|--------|
//! | sturges   | range / (log2 n + 1)                                          | Sturges (1926) |
//! | scott     | (24 √π / n)^(1/3) σ  (≈ 3.49 σ n^(-1/3))                      | Scott (1979) |
//! | fd        | 2 IQR n^(-1/3)                                                | Freedman & Diaconis (1981) |
//! | sqrt      | range / √n                                                    | common practice |
//! | rice      | range / (2 n^(1/3))                                           | common practice (Rice University teaching notes) |
//! | doane     | range / (1 + log2 n + log2(1 + |g1| / σ_g1))                  | Doane (1976) |
//!
//! σ is the population standard deviation; the IQR uses type-7 quantiles.
//! These agree with `numpy.histogram_bin_edges` (checked against numpy
//! 2.4.6 fixtures in the tests).

use super::quantile::{quantile_sorted, Method};
use crate::math;

/// A rule for choosing the bin width from the data.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Rule {
    Sturges,
    Scott,
    Fd,
    Sqrt,
    Rice,
    Doane,
}

impl Rule {
    /// The fixtures name cases by the spec's words (the engine maps the
    /// spec's word enums in `plan/stat.rs`).
    #[cfg(test)]
    pub fn from_word(w: &str) -> Option<Rule> {
        Some(match w {
            "sturges" => Rule::Sturges,
            "scott" => Rule::Scott,
            "fd" | "freedman_diaconis" => Rule::Fd,
            "sqrt" | "square_root" => Rule::Sqrt,
            "rice" => Rule::Rice,
            "doane" => Rule::Doane,
            _ => return None,
        })
    }
}

/// Bin width by a rule for finite values `xs` (unsorted); 0 when the rule
/// cannot say (too few values or no spread).
pub fn rule_width(rule: Rule, xs: &[f64]) -> f64 {
    let n = xs.len();
    if n == 0 {
        return 0.0;
    }
    let nf = n as f64;
    let (lo, hi) = min_max(xs).unwrap_or((0.0, 0.0));
    let ptp = hi - lo;
    match rule {
        Rule::Sturges => ptp / (math::log2(nf) + 1.0),
        Rule::Sqrt => ptp / nf.sqrt(),
        Rule::Rice => ptp / (2.0 * math::pow(nf, 1.0 / 3.0)),
        Rule::Scott => math::pow(24.0 * std::f64::consts::PI.sqrt() / nf, 1.0 / 3.0) * population_sd(xs),
        Rule::Fd => {
            let s = super::sorted_finite(xs);
            let iqr = quantile_sorted(&s, 0.75, Method::Type7).unwrap_or(0.0) - quantile_sorted(&s, 0.25, Method::Type7).unwrap_or(0.0);
            2.0 * iqr * math::pow(nf, -1.0 / 3.0)
        }
        Rule::Doane => {
            if n <= 2 {
                return 0.0;
            }
            let sg1 = (6.0 * (nf - 2.0) / ((nf + 1.0) * (nf + 3.0))).sqrt();
            let sigma = population_sd(xs);
            if sigma <= 0.0 {
                return 0.0;
            }
            let m = xs.iter().sum::<f64>() / nf;
            let g1 = xs
                .iter()
                .map(|x| {
                    let z = (x - m) / sigma;
                    z * z * z
                })
                .sum::<f64>()
                / nf;
            ptp / (1.0 + math::log2(nf) + math::log2(1.0 + g1.abs() / sg1))
        }
    }
}

fn population_sd(xs: &[f64]) -> f64 {
    super::std_dev(xs, 0).unwrap_or(0.0)
}

pub fn min_max(xs: &[f64]) -> Option<(f64, f64)> {
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    for &x in xs {
        if x.is_finite() {
            lo = if x < lo { x } else { lo };
            hi = if x > hi { x } else { hi };
        }
    }
    (lo <= hi).then_some((lo, hi))
}

/// The data range, widened by a half unit each way when it is a single value.
fn range_of(xs: &[f64]) -> Option<(f64, f64)> {
    let (lo, hi) = min_max(xs)?;
    Some(if lo == hi { (lo - 0.5, hi + 0.5) } else { (lo, hi) })
}

/// `count + 1` evenly spaced edges from `lo` to `hi` (the last exactly `hi`).
pub fn even_edges(lo: f64, hi: f64, count: usize) -> Vec<f64> {
    let count = count.max(1);
    let step = (hi - lo) / count as f64;
    let mut e: Vec<f64> = (0..=count).map(|k| k as f64 * step + lo).collect();
    e[count] = hi;
    e
}

/// Edges by a rule (the same as `numpy.histogram_bin_edges(xs, rule)`).
pub fn edges_by_rule(xs: &[f64], rule: Rule) -> Vec<f64> {
    let Some((lo, hi)) = range_of(xs) else { return vec![] };
    let w = rule_width(rule, xs);
    let count = if w > 0.0 && w.is_finite() { ((hi - lo) / w).ceil() as usize } else { 1 };
    even_edges(lo, hi, count.clamp(1, MAX_BINS))
}

/// `count` even bins over the data range.
pub fn edges_by_count(xs: &[f64], count: usize) -> Vec<f64> {
    let Some((lo, hi)) = range_of(xs) else { return vec![] };
    even_edges(lo, hi, count.min(MAX_BINS))
}

/// Most bins a histogram may have: past this a width or count is refused
/// (a located error) rather than truncated, which would drop data.
pub const MAX_BINS: usize = 100_000;

/// How many bins of `width` from `boundary` cover the data (as a float, so
/// a tiny width over a huge range is seen before anything is allocated).
pub fn width_bin_count(xs: &[f64], width: f64, boundary: f64) -> f64 {
    let Some((lo, hi)) = min_max(xs) else { return 0.0 };
    if width.is_nan() || width <= 0.0 {
        return 0.0;
    }
    let k0 = ((lo - boundary) / width).floor();
    let mut k1 = ((hi - boundary) / width).floor();
    // A maximum exactly on an edge closes the last bin instead of opening one.
    if boundary + k1 * width == hi && k1 > k0 {
        k1 -= 1.0;
    }
    k1 - k0 + 1.0
}

/// Bins of exactly `width`, one edge falling on `boundary` (edges are
/// `boundary + k * width`), covering the data. At most [`MAX_BINS`]
/// (callers check [`width_bin_count`] first).
pub fn edges_by_width(xs: &[f64], width: f64, boundary: f64) -> Vec<f64> {
    let Some((lo, _)) = min_max(xs) else { return vec![] };
    let n = width_bin_count(xs, width, boundary);
    if !(n >= 1.0) {
        return vec![];
    }
    let k0 = ((lo - boundary) / width).floor();
    // (A rule's width moved onto a boundary may need one bin more.)
    let count = (n as usize).min(MAX_BINS + 1);
    (0..=count).map(|k| boundary + (k0 + k as f64) * width).collect()
}

/// Counts per bin for sorted, strictly increasing `edges` (bins closed on
/// the left, the last also on the right). Values outside are ignored.
/// Evenly spaced edges take a constant-time index per value.
pub fn histogram(xs: &[f64], edges: &[f64]) -> Vec<f64> {
    let nb = edges.len().saturating_sub(1);
    let mut counts = vec![0u64; nb];
    if nb == 0 {
        return vec![];
    }
    let (lo, hi) = (edges[0], edges[nb]);
    if is_even(edges) {
        let norm = nb as f64 / (hi - lo);
        let last = nb - 1;
        // Four interleaved count arrays, so that runs of values in the same
        // bin do not wait on each other's increments; summed at the end.
        let mut lanes = vec![0u64; 4 * nb];
        let index = |x: f64| -> Option<usize> {
            if !(x >= lo && x <= hi) {
                return None; // also skips NaN
            }
            let mut k = (((x - lo) * norm) as usize).min(last);
            // Rounding in the index may be one off next to an edge: correct it
            // against the edges themselves.
            if x < edges[k] {
                k -= 1;
            } else if k < last && x >= edges[k + 1] {
                k += 1;
            }
            Some(k)
        };
        let mut chunks = xs.chunks_exact(4);
        for c in &mut chunks {
            for (lane, &x) in c.iter().enumerate() {
                if let Some(k) = index(x) {
                    lanes[lane * nb + k] += 1;
                }
            }
        }
        for &x in chunks.remainder() {
            if let Some(k) = index(x) {
                lanes[k] += 1;
            }
        }
        for (k, c) in counts.iter_mut().enumerate() {
            *c = lanes[k] + lanes[nb + k] + lanes[2 * nb + k] + lanes[3 * nb + k];
        }
    } else {
        for &x in xs {
            if !(x >= lo && x <= hi) {
                continue;
            }
            let k = edges.partition_point(|e| *e <= x).saturating_sub(1).min(nb - 1);
            counts[k] += 1;
        }
    }
    counts.into_iter().map(|c| c as f64).collect()
}

/// Weighted sums per bin (the same bins as [`histogram`]).
pub fn histogram_weighted(xs: &[f64], weights: &[f64], edges: &[f64]) -> Vec<f64> {
    let nb = edges.len().saturating_sub(1);
    let mut sums = vec![0.0; nb];
    if nb == 0 {
        return sums;
    }
    let (lo, hi) = (edges[0], edges[nb]);
    for (&x, &w) in xs.iter().zip(weights) {
        if !(x >= lo && x <= hi && w.is_finite()) {
            continue;
        }
        let k = edges.partition_point(|e| *e <= x).saturating_sub(1).min(nb - 1);
        sums[k] += w;
    }
    sums
}

fn is_even(edges: &[f64]) -> bool {
    let nb = edges.len() - 1;
    let step = (edges[nb] - edges[0]) / nb as f64;
    step > 0.0 && edges.windows(2).all(|w| ((w[1] - w[0]) - step).abs() <= 1e-9 * step.abs())
}

/// A calendar unit for binning dates.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum CalendarUnit {
    Day,
    /// ISO 8601 weeks, starting on Monday.
    Week,
    Month,
    Quarter,
    Year,
}

impl CalendarUnit {
    /// The fixtures name cases by the spec's words (the engine maps the
    /// spec's word enums in `plan/stat.rs`).
    #[cfg(test)]
    pub fn from_word(w: &str) -> Option<CalendarUnit> {
        Some(match w {
            "day" => CalendarUnit::Day,
            "week" => CalendarUnit::Week,
            "month" => CalendarUnit::Month,
            "quarter" => CalendarUnit::Quarter,
            "year" => CalendarUnit::Year,
            _ => return None,
        })
    }
    /// Typical length in days, for choosing a unit from a width.
    pub fn days(self) -> f64 {
        match self {
            CalendarUnit::Day => 1.0,
            CalendarUnit::Week => 7.0,
            CalendarUnit::Month => 30.436_875,
            CalendarUnit::Quarter => 91.310_625,
            CalendarUnit::Year => 365.2425,
        }
    }
    /// The unit whose typical length is closest (on a log scale) to `days`.
    pub fn nearest(days: f64) -> CalendarUnit {
        let all = [CalendarUnit::Day, CalendarUnit::Week, CalendarUnit::Month, CalendarUnit::Quarter, CalendarUnit::Year];
        let mut best = CalendarUnit::Day;
        let mut err = f64::INFINITY;
        for u in all {
            let e = (math::ln(days.max(1e-9)) - math::ln(u.days())).abs();
            if e < err {
                err = e;
                best = u;
            }
        }
        best
    }
}

const DAY_MS: f64 = 86_400_000.0;

/// Start (ms since the epoch, UTC) of the calendar unit holding `ms`.
pub fn calendar_floor(ms: f64, unit: CalendarUnit) -> f64 {
    use crate::calendar::{civil_from_days, days_from_civil};
    let days = (ms / DAY_MS).floor() as i64;
    let (y, m, _) = civil_from_days(days);
    let start = match unit {
        CalendarUnit::Day => days,
        // 1970-01-01 was a Thursday: (days + 3) mod 7 is 0 on Mondays.
        CalendarUnit::Week => days - (days + 3).rem_euclid(7),
        CalendarUnit::Month => days_from_civil(y, m, 1),
        CalendarUnit::Quarter => days_from_civil(y, (m - 1) / 3 * 3 + 1, 1),
        CalendarUnit::Year => days_from_civil(y, 1, 1),
    };
    start as f64 * DAY_MS
}

/// The start of the unit after the one starting at `start`.
pub fn calendar_next(start: f64, unit: CalendarUnit) -> f64 {
    use crate::calendar::{civil_from_days, days_from_civil};
    let days = (start / DAY_MS).floor() as i64;
    let (y, m, _) = civil_from_days(days);
    let next = match unit {
        CalendarUnit::Day => days + 1,
        CalendarUnit::Week => days + 7,
        CalendarUnit::Month => {
            if m == 12 {
                days_from_civil(y + 1, 1, 1)
            } else {
                days_from_civil(y, m + 1, 1)
            }
        }
        CalendarUnit::Quarter => {
            let m2 = m + 3;
            if m2 > 12 {
                days_from_civil(y + 1, m2 - 12, 1)
            } else {
                days_from_civil(y, m2, 1)
            }
        }
        CalendarUnit::Year => days_from_civil(y + 1, 1, 1),
    };
    next as f64 * DAY_MS
}

/// Edges of calendar bins (ms since the epoch) covering `lo..=hi`: every
/// unit start from the one holding `lo` to the first after `hi`.
pub fn calendar_edges(lo: f64, hi: f64, unit: CalendarUnit) -> Vec<f64> {
    let mut e = vec![calendar_floor(lo, unit)];
    while *e.last().unwrap() <= hi && e.len() < 100_001 {
        let n = calendar_next(*e.last().unwrap(), unit);
        e.push(n);
    }
    e
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn closed_left_last_bin_closed() {
        let e = vec![0.0, 1.0, 2.0, 3.0];
        // 1.0 goes in [1, 2); 3.0 in the last, closed bin.
        assert_eq!(histogram(&[0.0, 0.5, 1.0, 2.999, 3.0, 3.5, f64::NAN], &e), vec![2.0, 1.0, 2.0]);
        // Uneven edges take the search path with the same closure.
        let u = vec![0.0, 1.0, 10.0];
        assert_eq!(histogram(&[0.0, 1.0, 10.0, 11.0], &u), vec![1.0, 2.0]);
    }

    #[test]
    fn width_and_boundary() {
        let e = edges_by_width(&[0.3, 4.0, 9.9], 2.5, 0.0);
        assert_eq!(e, vec![0.0, 2.5, 5.0, 7.5, 10.0]);
        // A maximum on an edge closes the last bin.
        let e = edges_by_width(&[1.0, 10.0], 3.0, 1.0);
        assert_eq!(e, vec![1.0, 4.0, 7.0, 10.0]);
        assert_eq!(histogram(&[1.0, 10.0], &e), vec![1.0, 0.0, 1.0]);
    }

    #[test]
    fn calendar_units() {
        use crate::calendar::{days_from_civil, parse_date};
        let ms = |s: &str| parse_date(s).unwrap() as f64 * DAY_MS;
        // 2024-02-29 is a Thursday (Python 3.11: date(2024,2,29).isoweekday() == 4), so its
        // ISO week starts on Monday 2024-02-26.
        assert_eq!(calendar_floor(ms("2024-02-29") + 3.6e6, CalendarUnit::Week), ms("2024-02-26"));
        assert_eq!(calendar_floor(ms("2024-02-29"), CalendarUnit::Month), ms("2024-02-01"));
        assert_eq!(calendar_floor(ms("2024-11-29"), CalendarUnit::Quarter), ms("2024-10-01"));
        let e = calendar_edges(ms("2023-11-15"), ms("2024-02-01"), CalendarUnit::Month);
        let days: Vec<i64> = e.iter().map(|x| (x / DAY_MS) as i64).collect();
        assert_eq!(
            days,
            vec![
                days_from_civil(2023, 11, 1),
                days_from_civil(2023, 12, 1),
                days_from_civil(2024, 1, 1),
                days_from_civil(2024, 2, 1),
                days_from_civil(2024, 3, 1)
            ]
        );
        assert_eq!(CalendarUnit::nearest(29.0), CalendarUnit::Month);
        assert_eq!(CalendarUnit::nearest(400.0), CalendarUnit::Year);
    }
}
