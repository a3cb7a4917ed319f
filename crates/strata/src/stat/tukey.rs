//! Tukey box-plot statistics (J. W. Tukey 1977, Exploratory Data Analysis).
//!
//! Quartiles are Hyndman & Fan type 7 (linear interpolation between order
//! statistics; the same as `numpy.quantile`'s default), not Tukey's original
//! hinges (medians of the halves); the two differ slightly for small n.
//! Whiskers reach the furthest data value within 1.5 IQR of the box; values
//! beyond are outliers.

use super::quantile::{quantile_sorted, Method};

#[derive(Debug, Clone, PartialEq)]
pub struct BoxStats {
    pub n: usize,
    pub lower_whisker: f64,
    pub q1: f64,
    pub median: f64,
    pub q3: f64,
    pub upper_whisker: f64,
    /// Values outside the whiskers, ascending.
    pub outliers: Vec<f64>,
}

pub fn box_stats(xs: &[f64]) -> Option<BoxStats> {
    let s = super::sorted_finite(xs);
    if s.is_empty() {
        return None;
    }
    let q1 = quantile_sorted(&s, 0.25, Method::Type7)?;
    let median = quantile_sorted(&s, 0.5, Method::Type7)?;
    let q3 = quantile_sorted(&s, 0.75, Method::Type7)?;
    let iqr = q3 - q1;
    let (lo_fence, hi_fence) = (q1 - 1.5 * iqr, q3 + 1.5 * iqr);
    let lower_whisker = s.iter().copied().find(|x| *x >= lo_fence).unwrap_or(q1);
    let upper_whisker = s.iter().rev().copied().find(|x| *x <= hi_fence).unwrap_or(q3);
    let outliers = s.iter().copied().filter(|x| *x < lo_fence || *x > hi_fence).collect();
    Some(BoxStats { n: s.len(), lower_whisker, q1, median, q3, upper_whisker, outliers })
}
