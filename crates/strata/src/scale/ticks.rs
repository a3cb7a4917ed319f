//! Tick positions.
//!
//! `nice_ticks` is the "loose labeling" of Heckbert, "Nice numbers for graph
//! labels", Graphics Gems (1990): the step is a nice number (1, 2, 5 times a
//! power of ten) near range / (wanted - 1), and the ticks run from the floor
//! to the ceiling of the data range in that step.

use crate::math;

/// Heckbert's NiceNum: a number of the form {1, 2, 5, 10} x 10^k close to x,
/// rounded (`round`) or not less than x.
pub fn nice_num(x: f64, round: bool) -> f64 {
    let exp = math::log10(x).floor();
    let f = x / math::pow(10.0, exp);
    let nf = if round {
        if f < 1.5 { 1.0 } else if f < 3.0 { 2.0 } else if f < 7.0 { 5.0 } else { 10.0 }
    } else if f <= 1.0 {
        1.0
    } else if f <= 2.0 {
        2.0
    } else if f <= 5.0 {
        5.0
    } else {
        10.0
    };
    nf * math::pow(10.0, exp)
}

/// Loose ticks covering `lo..hi`, about `wanted` of them.
pub fn nice_ticks(lo: f64, hi: f64, wanted: usize) -> Vec<f64> {
    if !lo.is_finite() || !hi.is_finite() {
        return vec![];
    }
    if hi <= lo {
        return vec![lo];
    }
    let wanted = wanted.max(2);
    let range = nice_num(hi - lo, false);
    let step = nice_num(range / (wanted - 1) as f64, true);
    let start = (lo / step).floor();
    let end = (hi / step).ceil();
    let n = (end - start) as i64;
    (0..=n).map(|k| clean((start + k as f64) * step, step)).collect()
}

/// Round away binary noise such as 0.30000000000000004.
fn clean(v: f64, step: f64) -> f64 {
    let digits = (-math::log10(step).floor()).max(0.0) as i32 + 1;
    let p = math::powi(10.0, digits);
    (v * p).round() / p
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn heckbert_loose_labels() {
        // Worked by hand from Heckbert (1990), LooseLabel with nticks = 5:
        // range 0..97 -> NiceNum(97, false) = 100, step NiceNum(25, true) = 20.
        assert_eq!(nice_ticks(0.0, 97.0, 5), vec![0.0, 20.0, 40.0, 60.0, 80.0, 100.0]);
        // 0.12..0.58 -> range NiceNum(0.46,false)=0.5, step NiceNum(0.125,true)=0.1.
        assert_eq!(nice_ticks(0.12, 0.58, 5), vec![0.1, 0.2, 0.3, 0.4, 0.5, 0.6]);
    }

    #[test]
    fn nice_num_rounding() {
        assert_eq!(nice_num(2.9, true), 2.0);
        assert_eq!(nice_num(3.1, true), 5.0);
        assert_eq!(nice_num(3.1, false), 5.0);
        assert_eq!(nice_num(0.07, false), 0.1);
    }
}
