//! Curve fits: least-squares line with a confidence band for the mean
//! response, and LOESS (Cleveland 1979).

use super::dist::t_quantile;

/// A fitted straight line y = intercept + slope x.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Linear {
    pub intercept: f64,
    pub slope: f64,
    /// Pearson's r.
    pub r: f64,
    pub n: usize,
    /// Residual standard error, √(RSS / (n - 2)).
    pub sigma: f64,
    pub x_mean: f64,
    /// Σ (x - x̄)².
    pub sxx: f64,
}

/// Ordinary least squares of `ys` on `xs` (pairs with a non-finite value are
/// dropped by the caller). `None` with fewer than 2 points or no x spread.
pub fn linear(xs: &[f64], ys: &[f64]) -> Option<Linear> {
    let n = xs.len().min(ys.len());
    if n < 2 {
        return None;
    }
    let mx = xs[..n].iter().sum::<f64>() / n as f64;
    let my = ys[..n].iter().sum::<f64>() / n as f64;
    let (mut sxx, mut sxy, mut syy) = (0.0, 0.0, 0.0);
    for i in 0..n {
        let (dx, dy) = (xs[i] - mx, ys[i] - my);
        sxx += dx * dx;
        sxy += dx * dy;
        syy += dy * dy;
    }
    if sxx <= 0.0 {
        return None;
    }
    let slope = sxy / sxx;
    let intercept = my - slope * mx;
    let rss = (syy - slope * sxy).max(0.0);
    let sigma = if n > 2 { (rss / (n - 2) as f64).sqrt() } else { f64::NAN };
    let r = if syy > 0.0 { sxy / (sxx * syy).sqrt() } else { f64::NAN };
    Some(Linear { intercept, slope, r, n, sigma, x_mean: mx, sxx })
}

impl Linear {
    pub fn predict(&self, x: f64) -> f64 {
        self.intercept + self.slope * x
    }

    /// Confidence band for the mean response at `x` with confidence `level`:
    /// ŷ ± t_{(1+level)/2, n-2} σ √(1/n + (x - x̄)² / Sxx).
    /// `None` with fewer than 3 points.
    pub fn band(&self, x: f64, level: f64) -> Option<(f64, f64)> {
        if self.n < 3 {
            return None;
        }
        let t = t_quantile(0.5 + level / 2.0, (self.n - 2) as f64);
        let d = x - self.x_mean;
        let se = self.sigma * (1.0 / self.n as f64 + d * d / self.sxx).sqrt();
        let y = self.predict(x);
        Some((y - t * se, y + t * se))
    }
}

/// LOESS settings.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LoessOptions {
    /// Fraction of the points in each local fit (0..1].
    pub span: f64,
    /// Local polynomial degree: 1 or 2.
    pub degree: u32,
    /// Robustness iterations with bisquare weights (0: none).
    pub iterations: u32,
    /// Points within `delta` (x units) of the last fitted one are
    /// interpolated linearly instead of fitted (0: fit every point).
    pub delta: f64,
}

impl Default for LoessOptions {
    fn default() -> Self {
        LoessOptions { span: 0.75, degree: 1, iterations: 0, delta: 0.0 }
    }
}

/// Locally weighted regression (Cleveland 1979, "Robust locally weighted
/// regression and smoothing scatterplots", JASA 74(368), 829-836).
///
/// `xs` must be sorted ascending; `ys` pairs with it. Each local fit uses the
/// k = ⌊span · n⌋ nearest points (at least 2), tricube weights
/// (1 - (d/r)³)³ with r the distance to the furthest of them, and a weighted
/// polynomial of `degree`. Robustness iterations reweight points by the
/// bisquare (1 - u²)² of u = residual / (6 · median |residual|).
///
/// Returns the fitted values at each `xs` (after the last iteration) and the
/// final robustness weights.
pub fn loess_fit(xs: &[f64], ys: &[f64], opts: &LoessOptions) -> (Vec<f64>, Vec<f64>) {
    let n = xs.len();
    let mut robust = vec![1.0; n];
    let mut fitted = vec![0.0; n];
    if n == 0 {
        return (fitted, robust);
    }
    let k = neighbours(n, opts.span);
    for iter in 0..=opts.iterations {
        fit_all(xs, ys, &robust, k, opts, &mut fitted);
        if iter == opts.iterations {
            break;
        }
        robust = bisquare_weights(ys, &fitted);
    }
    (fitted, robust)
}

/// LOESS evaluated at sorted points `at`, with robustness weights from
/// [`loess_fit`] (pass all ones for none).
pub fn loess_at(xs: &[f64], ys: &[f64], robust: &[f64], opts: &LoessOptions, at: &[f64]) -> Vec<f64> {
    let n = xs.len();
    if n == 0 {
        return vec![f64::NAN; at.len()];
    }
    let k = neighbours(n, opts.span);
    let mut left = 0;
    at.iter()
        .map(|&x0| {
            left = slide(xs, x0, left, k);
            local_fit(xs, ys, robust, x0, left, left + k, opts.degree).unwrap_or(f64::NAN)
        })
        .collect()
}

fn neighbours(n: usize, span: f64) -> usize {
    ((span * n as f64 + 1e-10) as usize).clamp(2.min(n), n)
}

/// Move the window [left, left + k) right while the point entering is
/// nearer to x0 than the point leaving; the window then holds the k
/// nearest neighbours of x0 (x0 non-decreasing between calls).
fn slide(xs: &[f64], x0: f64, mut left: usize, k: usize) -> usize {
    let n = xs.len();
    while left + k < n && x0 > (xs[left] + xs[left + k]) / 2.0 {
        left += 1;
    }
    left
}

fn fit_all(xs: &[f64], ys: &[f64], robust: &[f64], k: usize, opts: &LoessOptions, out: &mut [f64]) {
    let n = xs.len();
    let mut left = 0;
    let mut last: Option<usize> = None;
    let mut i = 0;
    loop {
        left = slide(xs, xs[i], left, k);
        out[i] = local_fit(xs, ys, robust, xs[i], left, left + k, opts.degree).unwrap_or(ys[i]);
        // Fill points skipped since the last fit by linear interpolation.
        if let Some(l) = last {
            for j in l + 1..i {
                let t = if xs[i] > xs[l] { (xs[j] - xs[l]) / (xs[i] - xs[l]) } else { 0.0 };
                out[j] = out[l] + t * (out[i] - out[l]);
            }
        }
        // Points tied in x share the fit.
        let mut end = i;
        while end + 1 < n && xs[end + 1] == xs[i] {
            end += 1;
            out[end] = out[i];
        }
        last = Some(end);
        if end == n - 1 {
            break;
        }
        i = next_fit(xs, i, end, opts.delta);
    }
}

/// The next point LOWESS fits after point `i` (its ties end at `end`): the
/// furthest within `delta` of it, at least one on; the points between are
/// interpolated.
fn next_fit(xs: &[f64], i: usize, end: usize, delta: f64) -> usize {
    let mut j = end + 1;
    if delta > 0.0 {
        while j + 1 < xs.len() && xs[j + 1] <= xs[i] + delta {
            j += 1;
        }
    }
    j
}

/// Weighted local polynomial at x0 over xs[a..b]; `None` when fewer than two
/// points carry weight.
fn local_fit(xs: &[f64], ys: &[f64], robust: &[f64], x0: f64, a: usize, b: usize, degree: u32) -> Option<f64> {
    let mut row = Vec::with_capacity(b - a);
    local_row(xs, robust, x0, a, b, degree, &mut row)?;
    Some(row.iter().zip(&ys[a..b]).map(|(l, y)| l * y).sum())
}

/// The operator row of the local fit at x0: weights `row[j - a]` with
/// fit = Σ row[j - a] · ys[j] over the window [a, b). A local polynomial is
/// linear in the ys, so the same row gives the fit and its variance.
/// `None` when fewer than two points carry weight.
fn local_row(xs: &[f64], robust: &[f64], x0: f64, a: usize, b: usize, degree: u32, row: &mut Vec<f64>) -> Option<()> {
    row.clear();
    let radius = (x0 - xs[a]).max(xs[b - 1] - x0);
    let mut nonzero = 0;
    let mut total = 0.0;
    for j in a..b {
        let d = if radius > 0.0 { ((xs[j] - x0).abs() / radius).min(1.0) } else { 0.0 };
        let c = 1.0 - d * d * d;
        let wj = c * c * c * robust[j];
        if wj > 1e-12 {
            nonzero += 1;
        }
        total += wj;
        row.push(wj);
    }
    if nonzero < 2 || total <= 0.0 {
        return None;
    }
    // Moments of u = (x - x0) / scale, for conditioning.
    let scale = if radius > 0.0 { radius } else { 1.0 };
    let mut s = [0.0f64; 5];
    for (j, w) in (a..b).zip(row.iter_mut()) {
        *w /= total;
        let u = (xs[j] - x0) / scale;
        let mut p = *w;
        for sm in s.iter_mut() {
            *sm += p;
            p *= u;
        }
    }
    // The intercept β0 as a weighted sum of the ys: row_j = w_j q(u_j)
    // with q the first row of the inverse of the normal equations' matrix.
    let q: [f64; 3] = 'q: {
        if degree >= 2 {
            // [[s0 s1 s2] [s1 s2 s3] [s2 s3 s4]] β = t; β0 by Cramer's rule,
            // expanding along the first column: cofactors C00, C10, C20.
            let m = [[s[0], s[1], s[2]], [s[1], s[2], s[3]], [s[2], s[3], s[4]]];
            let c00 = m[1][1] * m[2][2] - m[1][2] * m[2][1];
            let c10 = -(m[0][1] * m[2][2] - m[0][2] * m[2][1]);
            let c20 = m[0][1] * m[1][2] - m[0][2] * m[1][1];
            let d = m[0][0] * c00 + m[1][0] * c10 + m[2][0] * c20;
            if d.abs() > 1e-10 * s[0] * s[2] * s[4] {
                break 'q [c00 / d, c10 / d, c20 / d];
            }
        }
        // The weighted line in u: β0 = (S2 T0 - S1 T1) / (S0 S2 - S1²).
        let det = s[0] * s[2] - s[1] * s[1];
        if det <= 1e-12 * s[0] * s[2].max(1e-300) {
            [1.0 / s[0], 0.0, 0.0]
        } else {
            [s[2] / det, -s[1] / det, 0.0]
        }
    };
    for (j, w) in (a..b).zip(row.iter_mut()) {
        let u = (xs[j] - x0) / scale;
        *w *= q[0] + u * (q[1] + u * q[2]);
    }
    Some(())
}

/// The most points for which [`loess_band`] computes δ₂ exactly (its cost
/// grows as n² k); above it the t's degrees of freedom are δ₁.
pub const BAND_EXACT_DELTA2: usize = 400;

/// A LOESS fit with a pointwise confidence band.
#[derive(Debug, Clone, PartialEq)]
pub struct LoessBand {
    /// The fit at each `at`.
    pub fit: Vec<f64>,
    /// Its standard error, s ‖l(x)‖.
    pub stderr: Vec<f64>,
    /// Lower and upper bounds, fit ∓ t s ‖l(x)‖.
    pub low: Vec<f64>,
    pub high: Vec<f64>,
    /// Residual scale s = √(RSS / δ₁).
    pub residual_scale: f64,
    /// δ₁ = tr((I - L)ᵀ(I - L)), L the operator matrix at the data.
    pub one_delta: f64,
    /// δ₂ = tr(((I - L)ᵀ(I - L))²), when computed exactly.
    pub two_delta: Option<f64>,
    /// The t quantile's degrees of freedom, δ₁² / δ₂ (δ₁ without δ₂).
    pub df: f64,
}

/// LOESS at sorted points `at` with the pointwise confidence band of the
/// mean at confidence `level` (Cleveland & Grosse 1991, "Computational
/// methods for local regression", Statistics and Computing 1, section 4;
/// the "exact" statistics of netlib's loess): the fit is l(x)ᵀy, its
/// standard error s ‖l(x)‖ with s² = Σ residual² / δ₁, and the band
/// fit ± t_{(1+level)/2, δ₁²/δ₂} s ‖l(x)‖.
///
/// Points are fitted exactly as by [`loess_at`]. With `opts.delta` > 0 the
/// residuals, the leverages L_ii and ‖l(x_i)‖² are interpolated linearly
/// between points fitted `delta` apart (as [`loess_fit`] does for the fit);
/// above [`BAND_EXACT_DELTA2`] points the t's degrees of freedom are δ₁
/// (δ₁²/δ₂ differs from it by well under 1 % there, and so does the t).
/// Robustness weights (`robust`, all ones for none) enter as fixed prior
/// weights: an approximation for robust fits, where netlib's `symmetric`
/// family uses pseudovalues instead. `None` when no residual scale exists
/// (δ₁ ≤ 0, or fewer than three points).
pub fn loess_band(xs: &[f64], ys: &[f64], robust: &[f64], opts: &LoessOptions, at: &[f64], level: f64) -> Option<LoessBand> {
    let n = xs.len();
    if n < 3 {
        return None;
    }
    let k = neighbours(n, opts.span);
    // Per data point: fitted value, leverage L_ii, ‖l_i‖².
    let mut fitted = vec![0.0; n];
    let mut lev = vec![0.0; n];
    let mut norm2 = vec![0.0; n];
    let exact2 = n <= BAND_EXACT_DELTA2 && opts.delta <= 0.0;
    // Rows of I - L as (window start, entries), for δ₂.
    let mut rows: Vec<(usize, Vec<f64>)> = Vec::new();
    let mut row = Vec::with_capacity(k);
    let mut left = 0;
    let mut last: Option<usize> = None;
    let mut i = 0;
    loop {
        left = slide(xs, xs[i], left, k);
        let ok = local_row(xs, robust, xs[i], left, left + k, opts.degree, &mut row).is_some();
        let mut end = i;
        while end + 1 < n && xs[end + 1] == xs[i] {
            end += 1;
        }
        let f: f64 = row.iter().zip(&ys[left..left + k]).map(|(l, y)| l * y).sum();
        let nn: f64 = row.iter().map(|l| l * l).sum();
        for j in i..=end {
            if !ok {
                // No local fit (too few weighted points): the point is its own fit.
                fitted[j] = ys[j];
                norm2[j] = 1.0;
                lev[j] = 1.0;
                if exact2 {
                    rows.push((left.min(j), vec![0.0]));
                }
                continue;
            }
            fitted[j] = f;
            norm2[j] = nn;
            // A tie group larger than the window can leave j outside it.
            let inside = (left..left + k).contains(&j);
            lev[j] = if inside { row[j - left] } else { 0.0 };
            if exact2 {
                let (lo, hi) = (left.min(j), (left + k).max(j + 1));
                let mut r = vec![0.0; hi - lo];
                for (c, l) in (left..left + k).zip(&row) {
                    r[c - lo] = -l;
                }
                r[j - lo] += 1.0;
                rows.push((lo, r));
            }
        }
        if let Some(l) = last {
            for j in l + 1..i {
                let t = if xs[i] > xs[l] { (xs[j] - xs[l]) / (xs[i] - xs[l]) } else { 0.0 };
                fitted[j] = fitted[l] + t * (fitted[i] - fitted[l]);
                norm2[j] = norm2[l] + t * (norm2[i] - norm2[l]);
                lev[j] = lev[l] + t * (lev[i] - lev[l]);
            }
        }
        last = Some(end);
        if end == n - 1 {
            break;
        }
        i = next_fit(xs, i, end, opts.delta);
    }
    let rss: f64 = (0..n).map(|j| (ys[j] - fitted[j]) * (ys[j] - fitted[j]) * robust[j]).sum();
    // δ₁ = Σ_i ‖e_i - l_i‖² = Σ_i (1 - 2 L_ii + ‖l_i‖²).
    let one_delta: f64 = (0..n).map(|j| 1.0 - 2.0 * lev[j] + norm2[j]).sum();
    if one_delta <= 1e-9 * n as f64 || !rss.is_finite() {
        return None;
    }
    let two_delta = exact2.then(|| {
        // δ₂ = ‖(I - L)(I - L)ᵀ‖²_F = Σ_ij (a_i · a_j)² over rows a_i of
        // I - L (the trace of the square of a symmetric matrix); rows are
        // zero outside their windows, and windows move right with i.
        let mut sum = 0.0;
        for (p, (ai, ri)) in rows.iter().enumerate() {
            let ei = ai + ri.len();
            let mut acc = 0.0;
            for (aj, rj) in &rows[p..] {
                if *aj >= ei {
                    break;
                }
                let lo = (*ai).max(*aj);
                let hi = ei.min(aj + rj.len());
                let mut dot = 0.0;
                for c in lo..hi {
                    dot += ri[c - ai] * rj[c - aj];
                }
                acc += dot * dot;
            }
            // The diagonal term once, the others twice (symmetry).
            let own: f64 = ri.iter().map(|v| v * v).sum();
            sum += 2.0 * acc - own * own;
        }
        sum
    });
    let df = match two_delta {
        Some(d2) if d2 > 0.0 => one_delta * one_delta / d2,
        _ => one_delta,
    };
    let s = (rss / one_delta).sqrt();
    let t = t_quantile(0.5 + level / 2.0, df);
    let mut out = LoessBand {
        fit: Vec::with_capacity(at.len()),
        stderr: Vec::with_capacity(at.len()),
        low: Vec::with_capacity(at.len()),
        high: Vec::with_capacity(at.len()),
        residual_scale: s,
        one_delta,
        two_delta,
        df,
    };
    let mut left = 0;
    for &x0 in at {
        left = slide(xs, x0, left, k);
        let (f, se) = match local_row(xs, robust, x0, left, left + k, opts.degree, &mut row) {
            Some(()) => {
                let f: f64 = row.iter().zip(&ys[left..left + k]).map(|(l, y)| l * y).sum();
                (f, s * row.iter().map(|l| l * l).sum::<f64>().sqrt())
            }
            None => (f64::NAN, f64::NAN),
        };
        out.fit.push(f);
        out.stderr.push(se);
        out.low.push(f - t * se);
        out.high.push(f + t * se);
    }
    Some(out)
}

/// Bisquare robustness weights from residuals (Cleveland 1979, step 3):
/// u = |r| / (6 median |r|), w = (1 - u²)² for u < 1, else 0.
pub fn bisquare_weights(ys: &[f64], fitted: &[f64]) -> Vec<f64> {
    let abs: Vec<f64> = ys.iter().zip(fitted).map(|(y, f)| (y - f).abs()).collect();
    let mut sorted = abs.clone();
    crate::sort::f64s(&mut sorted);
    let med = super::quantile::median_sorted(&sorted).unwrap_or(0.0);
    abs.iter()
        .map(|r| {
            let u = if med == 0.0 {
                if *r > 0.0 {
                    1.0
                } else {
                    0.0
                }
            } else {
                (r / (6.0 * med)).min(1.0)
            };
            let c = 1.0 - u * u;
            c * c
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn band_survives_ties_wider_than_the_window_and_tiny_inputs() {
        // 25 of 30 points share one x, more than the 15 a span of 0.5 takes:
        // the window holds only tied points there. No panic; where a local
        // fit exists (at x = 3 every weighted neighbour but one sits on the
        // window's edge, so none does: NaN, a gap in the line) the band
        // holds the fit.
        let mut xs: Vec<f64> = vec![5.0; 25];
        xs.extend([1.0, 2.0, 8.0, 9.0, 10.0]);
        xs.sort_by(f64::total_cmp);
        let ys: Vec<f64> = (0..30).map(|i| (i % 7) as f64).collect();
        let opts = LoessOptions { span: 0.5, degree: 2, iterations: 0, delta: 0.0 };
        let at = [1.0, 3.0, 5.0, 7.5, 10.0];
        let b = loess_band(&xs, &ys, &vec![1.0; 30], &opts, &at, 0.95).expect("a band");
        assert!(b.one_delta > 0.0 && b.df > 0.0 && b.two_delta.is_some());
        assert_eq!(b.fit.iter().filter(|f| f.is_finite()).count(), 4, "{b:?}");
        for j in (0..at.len()).filter(|j| b.fit[*j].is_finite()) {
            assert!(b.low[j] <= b.fit[j] && b.fit[j] <= b.high[j], "{b:?}");
        }
        // Three points: the furthest of each window weighs nothing, so each
        // local line passes through two points, residuals are zero and so is
        // δ₁: no band (as in netlib). Five points leave some; two none.
        let o = LoessOptions { span: 1.0, ..Default::default() };
        assert!(loess_band(&[0.0, 1.0, 2.0], &[0.0, 1.0, 0.0], &[1.0; 3], &o, &[1.0], 0.9).is_none());
        assert!(loess_band(&[0.0, 1.0, 2.0, 3.0, 4.0], &[0.0, 1.0, 0.0, 2.0, 1.0], &[1.0; 5], &o, &[1.0], 0.9).is_some());
        assert!(loess_band(&[0.0, 1.0], &[0.0, 1.0], &[1.0; 2], &o, &[0.5], 0.9).is_none());
        // An exact fit (a straight line): zero residual scale, the band closes on the line.
        let xs: Vec<f64> = (0..20).map(f64::from).collect();
        let ys: Vec<f64> = xs.iter().map(|x| 3.0 - 0.5 * x).collect();
        let b = loess_band(&xs, &ys, &[1.0; 20], &LoessOptions::default(), &[4.5], 0.95).unwrap();
        assert!((b.fit[0] - 0.75).abs() < 1e-9 && (b.high[0] - b.low[0]).abs() < 1e-9, "{b:?}");
    }
}
