//! Labels for numbers and dates.

use crate::data::time::civil_from_days;
use crate::math;

/// A tick label for `v` when ticks are `step` apart: as many decimals as the
/// step needs, grouping with commas (English), a true minus sign.
pub fn number_label(v: f64, step: f64, _pattern: Option<&str>) -> String {
    let decimals = if step > 0.0 && step.is_finite() { (-math::log10(step).floor()).max(0.0) as usize } else { 0 };
    group(v, decimals.min(12))
}

/// A value label with up to `max_decimals`, trailing zeros dropped.
pub fn value_label(v: f64) -> String {
    if v.fract() == 0.0 && v.abs() < 1e15 {
        return group(v, 0);
    }
    let s = group(v, 6);
    let s = s.trim_end_matches('0');
    s.trim_end_matches('.').to_string()
}

fn group(v: f64, decimals: usize) -> String {
    let s = format!("{:.*}", decimals, v.abs());
    let (int, frac) = match s.find('.') {
        Some(i) => (&s[..i], &s[i..]),
        None => (&s[..], ""),
    };
    let mut out = String::new();
    for (i, c) in int.chars().enumerate() {
        if i > 0 && (int.len() - i) % 3 == 0 {
            out.push(',');
        }
        out.push(c);
    }
    out.push_str(frac);
    let negative = v < 0.0 && out.chars().any(|c| c.is_ascii_digit() && c != '0');
    if negative { format!("\u{2212}{out}") } else { out }
}

/// A date label (`yyyy-MM-dd`) for milliseconds since the epoch.
pub fn date_label(ms: f64) -> String {
    let days = (ms / 86_400_000.0).floor() as i64;
    let (y, m, d) = civil_from_days(days);
    format!("{y:04}-{m:02}-{d:02}")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn labels_follow_the_step() {
        assert_eq!(number_label(1500.0, 500.0, None), "1,500");
        assert_eq!(number_label(0.30000000000000004, 0.1, None), "0.3");
        assert_eq!(number_label(-2.5, 0.5, None), "\u{2212}2.5");
        assert_eq!(number_label(-0.0, 1.0, None), "0");
        assert_eq!(value_label(2.50), "2.5");
    }
}
