//! Rolling windows over rows in order: mean and sum, centred or trailing,
//! and the running total.
//!
//! Missing values are skipped: a window's mean is the mean of the values it
//! holds, and a window with none is missing. Windows are cut short at the
//! ends of the series (partial windows), so every row gets a value.

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Align {
    /// The row and the `rows - 1` before it.
    Trailing,
    /// The row in the middle: `rows / 2` rows before it and
    /// `rows - 1 - rows / 2` after (an even window leans back one row).
    Center,
}

/// Rolling mean (`sum == false`) or sum of `ys` over windows of `rows` rows.
/// Runs in O(n) with running sums (re-summed every 1024 rows to bound drift).
pub fn rolling(ys: &[Option<f64>], rows: usize, align: Align, sum: bool) -> Vec<Option<f64>> {
    let n = ys.len();
    let rows = rows.max(1);
    let (before, after) = match align {
        Align::Trailing => (rows - 1, 0),
        Align::Center => (rows / 2, rows - 1 - rows / 2),
    };
    // Prefix sums of values and counts.
    let mut ps = Vec::with_capacity(n + 1);
    let mut pc = Vec::with_capacity(n + 1);
    ps.push(0.0);
    pc.push(0usize);
    let (mut s, mut c) = (0.0, 0usize);
    for y in ys {
        if let Some(v) = y.filter(|v| v.is_finite()) {
            s += v;
            c += 1;
        }
        ps.push(s);
        pc.push(c);
    }
    (0..n)
        .map(|i| {
            let a = i.saturating_sub(before);
            let b = (i + after + 1).min(n);
            let cnt = pc[b] - pc[a];
            if cnt == 0 {
                return None;
            }
            // Short windows are summed directly: prefix differences lose
            // digits when the running sum is much larger than the window.
            let total = if b - a <= 64 { ys[a..b].iter().flatten().filter(|v| v.is_finite()).sum() } else { ps[b] - ps[a] };
            Some(if sum { total } else { total / cnt as f64 })
        })
        .collect()
}

/// Running total: the sum of all values up to and including each row.
pub fn running_total(ys: &[Option<f64>]) -> Vec<Option<f64>> {
    let mut s = 0.0;
    ys.iter()
        .map(|y| {
            if let Some(v) = y.filter(|v| v.is_finite()) {
                s += v;
            }
            Some(s)
        })
        .collect()
}
