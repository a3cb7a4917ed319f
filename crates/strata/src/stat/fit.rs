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
        // Next: the furthest point within delta of this one, at least one on.
        let mut j = end + 1;
        if opts.delta > 0.0 {
            while j + 1 < n && xs[j + 1] <= xs[i] + opts.delta {
                j += 1;
            }
        }
        i = j;
    }
}

/// Weighted local polynomial at x0 over xs[a..b]; `None` when fewer than two
/// points carry weight.
fn local_fit(xs: &[f64], ys: &[f64], robust: &[f64], x0: f64, a: usize, b: usize, degree: u32) -> Option<f64> {
    let radius = (x0 - xs[a]).max(xs[b - 1] - x0);
    let mut w = Vec::with_capacity(b - a);
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
        w.push(wj);
    }
    if nonzero < 2 || total <= 0.0 {
        return None;
    }
    // Moments of u = (x - x0) / scale, for conditioning.
    let scale = if radius > 0.0 { radius } else { 1.0 };
    let mut s = [0.0f64; 5];
    let mut t = [0.0f64; 3];
    for (j, wj) in (a..b).zip(&w) {
        let wj = wj / total;
        let u = (xs[j] - x0) / scale;
        let mut p = wj;
        for (m, sm) in s.iter_mut().enumerate() {
            *sm += p;
            if m < 3 {
                t[m] += p * ys[j];
            }
            p *= u;
        }
    }
    let linear = || {
        // Intercept of the weighted line in u: (S2 T0 - S1 T1) / (S0 S2 - S1²).
        let det = s[0] * s[2] - s[1] * s[1];
        if det <= 1e-12 * s[0] * s[2].max(1e-300) {
            t[0] / s[0]
        } else {
            (s[2] * t[0] - s[1] * t[1]) / det
        }
    };
    if degree >= 2 {
        // Normal equations [[s0 s1 s2] [s1 s2 s3] [s2 s3 s4]] β = t; β0 by Cramer's rule.
        let m = [[s[0], s[1], s[2]], [s[1], s[2], s[3]], [s[2], s[3], s[4]]];
        let det3 = |m: &[[f64; 3]; 3]| {
            m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0])
                + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0])
        };
        let d = det3(&m);
        if d.abs() > 1e-10 * s[0] * s[2] * s[4] {
            let mut m0 = m;
            for r in 0..3 {
                m0[r][0] = t[r];
            }
            return Some(det3(&m0) / d);
        }
    }
    Some(linear())
}

/// Bisquare robustness weights from residuals (Cleveland 1979, step 3):
/// u = |r| / (6 median |r|), w = (1 - u²)² for u < 1, else 0.
pub fn bisquare_weights(ys: &[f64], fitted: &[f64]) -> Vec<f64> {
    let abs: Vec<f64> = ys.iter().zip(fitted).map(|(y, f)| (y - f).abs()).collect();
    let mut sorted = abs.clone();
    sorted.sort_by(f64::total_cmp);
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
