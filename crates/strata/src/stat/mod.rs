//! Numerical statistics on plain slices; the plan stage applies them to
//! layers.

/// Arithmetic mean of the finite values, or `None` when there are none.
pub fn mean(xs: &[f64]) -> Option<f64> {
    let (s, n) = xs.iter().filter(|x| x.is_finite()).fold((0.0, 0usize), |(s, n), x| (s + x, n + 1));
    if n == 0 { None } else { Some(s / n as f64) }
}
