//! Checks of the statistics against outside references. Fixtures come from
//! `tests/reference/gen/stats_fixtures.py` (numpy 2.4.6, scipy 1.17.1,
//! statsmodels 0.15.0; each fixture records the versions it was made with).

use super::*;
use serde_json::Value;

macro_rules! fixture {
    ($name:literal) => {
        serde_json::from_str::<Value>(include_str!(concat!("../../../../tests/reference/fixtures/stats/", $name))).unwrap()
    };
}

fn nums(v: &Value) -> Vec<f64> {
    v.as_array().unwrap().iter().map(|x| x.as_f64().unwrap()).collect()
}

fn close(a: f64, b: f64, rel: f64, abs: f64) -> bool {
    (a - b).abs() <= abs + rel * b.abs()
}

fn assert_all_close(got: &[f64], want: &[f64], rel: f64, abs: f64, what: &str) {
    assert_eq!(got.len(), want.len(), "{what}: length");
    for (i, (g, w)) in got.iter().zip(want).enumerate() {
        assert!(close(*g, *w, rel, abs), "{what}[{i}]: got {g}, want {w}");
    }
}

// ------------------------------------------------------------ bins

#[test]
fn bin_edges_match_numpy_histogram_bin_edges() {
    // numpy.histogram_bin_edges / numpy.histogram, numpy 2.4.6.
    let f = fixture!("bins.json");
    let sets = &f["sets"];
    let mut checked = 0;
    for case in f["cases"].as_array().unwrap() {
        let xs = nums(&sets[case["set"].as_str().unwrap()]);
        let rule = case["rule"].as_str().unwrap();
        let want_edges = nums(&case["edges"]);
        let want_counts = nums(&case["counts"]);
        let what = format!("{} {}", case["set"], rule);
        let (edges, density) = if let Some(k) = rule.strip_prefix("count:") {
            (bin::edges_by_count(&xs, k.parse().unwrap()), false)
        } else if let Some(k) = rule.strip_prefix("density:") {
            (bin::edges_by_count(&xs, k.parse().unwrap()), true)
        } else {
            (bin::edges_by_rule(&xs, bin::Rule::from_word(rule).unwrap()), false)
        };
        assert_all_close(&edges, &want_edges, 1e-12, 1e-12, &format!("{what} edges"));
        let mut counts = bin::histogram(&xs, &edges);
        if density {
            let n: f64 = counts.iter().sum();
            for (k, c) in counts.iter_mut().enumerate() {
                *c /= n * (edges[k + 1] - edges[k]);
            }
            assert_all_close(&counts, &want_counts, 1e-12, 1e-12, &format!("{what} density"));
        } else {
            assert_eq!(counts, want_counts, "{what} counts");
        }
        checked += 1;
    }
    assert!(checked >= 40);
}

// ------------------------------------------------------------ quantiles

#[test]
fn quantiles_match_numpy_methods_types_5_to_8() {
    // numpy.quantile methods hazen (5), weibull (6), linear (7), median_unbiased (8),
    // which implement Hyndman & Fan (1996) types 5-8; numpy 2.4.6.
    let f = fixture!("quantiles.json");
    let sets = fixture!("bins.json")["sets"].clone();
    for case in f["cases"].as_array().unwrap() {
        let xs = nums(&sets[case["set"].as_str().unwrap()]);
        let m = quantile::Method::from_type(case["type"].as_u64().unwrap() as u32).unwrap();
        let got: Vec<f64> = nums(&case["p"]).iter().map(|p| quantile::quantile(&xs, *p, m).unwrap()).collect();
        assert_all_close(&got, &nums(&case["values"]), 1e-13, 1e-13, &format!("{} type {}", case["set"], case["type"]));
    }
}

// ------------------------------------------------------------ distributions

#[test]
fn t_quantiles_and_cdf_match_scipy() {
    // scipy.stats.t.ppf and .cdf, scipy 1.17.1.
    let f = fixture!("distributions.json");
    for case in f["t_quantiles"].as_array().unwrap() {
        let df = case["df"].as_f64().unwrap();
        let got: Vec<f64> = nums(&case["p"]).iter().map(|p| dist::t_quantile(*p, df)).collect();
        assert_all_close(&got, &nums(&case["ppf"]), 1e-10, 1e-12, &format!("t ppf df={df}"));
    }
    for case in f["t_cdf"].as_array().unwrap() {
        let df = case["df"].as_f64().unwrap();
        let got: Vec<f64> = nums(&case["t"]).iter().map(|t| dist::t_cdf(*t, df)).collect();
        assert_all_close(&got, &nums(&case["cdf"]), 1e-11, 1e-15, &format!("t cdf df={df}"));
    }
    let n = &f["normal_quantiles"];
    let got: Vec<f64> = nums(&n["p"]).iter().map(|p| dist::normal_quantile(*p)).collect();
    assert_all_close(&got, &nums(&n["ppf"]), 1e-12, 1e-14, "normal ppf");
}

#[test]
fn log_gamma_known_values() {
    // Γ(1/2) = √π, Γ(5) = 24, Γ(10) = 362880 (Abramowitz & Stegun 1964, 6.1.8 and 6.1.6).
    assert!(close(dist::ln_gamma(0.5), crate::math::ln(std::f64::consts::PI.sqrt()), 1e-14, 1e-14));
    assert!(close(dist::ln_gamma(5.0), crate::math::ln(24.0), 1e-14, 1e-14));
    assert!(close(dist::ln_gamma(10.0), crate::math::ln(362_880.0), 1e-14, 1e-14));
}

// ------------------------------------------------------------ summaries and intervals

#[test]
fn summaries_and_intervals_match_scipy_and_statsmodels() {
    // numpy 2.4.6 mean/median/std(ddof=1)/quantile; scipy.stats.t.interval with scipy.stats.sem.
    let f = fixture!("summaries.json");
    let sets = fixture!("bins.json")["sets"].clone();
    for case in f["cases"].as_array().unwrap() {
        let xs = nums(&sets[case["set"].as_str().unwrap()]);
        let what = case["set"].to_string();
        let s = |w: &str, p: Option<f64>| summary::Summary::from_word(w, p).unwrap().of(&xs).unwrap();
        assert!(close(s("mean", None), case["mean"].as_f64().unwrap(), 1e-13, 1e-13), "{what} mean");
        assert!(close(s("median", None), case["median"].as_f64().unwrap(), 1e-13, 1e-13), "{what} median");
        assert!(close(s("standard_deviation", None), case["std"].as_f64().unwrap(), 1e-12, 1e-13), "{what} sd");
        assert!(close(s("sum", None), case["sum"].as_f64().unwrap(), 1e-13, 1e-13), "{what} sum");
        assert!(close(s("quantile", Some(0.9)), case["q90"].as_f64().unwrap(), 1e-13, 1e-13), "{what} q90");
        for (word, key) in [("ci95", "ci95"), ("ci90", "ci90"), ("standard_error", "standard_error")] {
            let (lo, hi) = summary::Interval::from_word(word).unwrap().of(&xs).unwrap();
            let want = nums(&case[key]);
            assert_all_close(&[lo, hi], &want, 1e-11, 1e-12, &format!("{what} {word}"));
        }
    }
    // statsmodels.stats.proportion.proportion_confint(method="wilson"), statsmodels 0.15.0.
    for case in f["wilson"].as_array().unwrap() {
        let (k, n) = (case["k"].as_f64().unwrap(), case["n"].as_f64().unwrap());
        let (lo, hi) = summary::wilson(k, n, 0.95).unwrap();
        assert_all_close(&[lo, hi], &nums(&case["level95"]), 1e-12, 1e-14, &format!("wilson {k}/{n}"));
        let (lo, hi) = summary::wilson(k, n, 0.90).unwrap();
        assert_all_close(&[lo, hi], &nums(&case["level90"]), 1e-12, 1e-14, &format!("wilson90 {k}/{n}"));
        // The same through 0/1 outcomes.
        let outcomes: Vec<f64> = (0..n as usize).map(|i| if (i as f64) < k { 1.0 } else { 0.0 }).collect();
        let (lo2, _) = summary::Interval::from_word("wilson").unwrap().of(&outcomes).unwrap();
        assert!(close(lo2, nums(&case["level95"])[0], 1e-12, 1e-14));
    }
}

// ------------------------------------------------------------ fits

/// Anscombe (1973), "Graphs in Statistical Analysis", The American
/// Statistician 27(1), 17-21, Table 1 (typed in from the paper).
const ANSCOMBE_X: [f64; 11] = [10.0, 8.0, 13.0, 9.0, 11.0, 14.0, 6.0, 4.0, 12.0, 7.0, 5.0];
const ANSCOMBE_X4: [f64; 11] = [8.0, 8.0, 8.0, 8.0, 8.0, 8.0, 8.0, 19.0, 8.0, 8.0, 8.0];
const ANSCOMBE_Y: [[f64; 11]; 4] = [
    [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68],
    [9.14, 8.14, 8.74, 8.77, 9.26, 8.10, 6.13, 3.10, 9.13, 7.26, 4.74],
    [7.46, 6.77, 12.74, 7.11, 7.81, 8.84, 6.08, 5.39, 8.15, 6.42, 5.73],
    [6.58, 5.76, 7.71, 8.84, 8.47, 7.04, 5.25, 12.50, 5.56, 7.91, 6.89],
];

#[test]
fn anscombe_quartet_shares_one_line() {
    // Anscombe (1973): each set has the regression line y = 3.00 + 0.500 x and
    // correlation coefficient 0.816 (set 4 is 0.8165, so within 0.001 of the published figure).
    for (k, ys) in ANSCOMBE_Y.iter().enumerate() {
        let xs = if k == 3 { &ANSCOMBE_X4 } else { &ANSCOMBE_X };
        let l = fit::linear(xs, ys).unwrap();
        assert!((l.intercept - 3.00).abs() < 0.005, "set {} intercept {}", k + 1, l.intercept);
        assert!((l.slope - 0.500).abs() < 0.0005, "set {} slope {}", k + 1, l.slope);
        assert!((l.r - 0.816).abs() < 0.001, "set {} r {}", k + 1, l.r);
        assert!((correlation(xs, ys).unwrap() - 0.816).abs() < 0.001);
    }
}

#[test]
fn ols_band_matches_statsmodels() {
    // statsmodels OLS(...).fit().get_prediction(...).summary_frame(alpha):
    // mean, mean_ci_lower, mean_ci_upper; statsmodels 0.15.0.
    let f = fixture!("ols.json");
    for case in f["cases"].as_array().unwrap() {
        let (xs, ys) = (nums(&case["x"]), nums(&case["y"]));
        let l = fit::linear(&xs, &ys).unwrap();
        let what = case["set"].to_string();
        assert!(close(l.intercept, case["intercept"].as_f64().unwrap(), 1e-11, 1e-12), "{what} intercept");
        assert!(close(l.slope, case["slope"].as_f64().unwrap(), 1e-11, 1e-12), "{what} slope");
        assert!(close(l.r, case["r"].as_f64().unwrap(), 1e-12, 1e-12), "{what} r");
        for (key, level) in [("band95", 0.95), ("band90", 0.90)] {
            let at = nums(&case["at"]);
            let band = &case[key];
            let (mut lo, mut hi, mut mid) = (vec![], vec![], vec![]);
            for x in &at {
                let (a, b) = l.band(*x, level).unwrap();
                lo.push(a);
                hi.push(b);
                mid.push(l.predict(*x));
            }
            assert_all_close(&mid, &nums(&band["mean"]), 1e-11, 1e-11, &format!("{what} {key} mean"));
            assert_all_close(&lo, &nums(&band["lower"]), 1e-10, 1e-10, &format!("{what} {key} lower"));
            assert_all_close(&hi, &nums(&band["upper"]), 1e-10, 1e-10, &format!("{what} {key} upper"));
        }
    }
}

#[test]
fn loess_matches_statsmodels_lowess() {
    // statsmodels.nonparametric.lowess(y, x, frac, it, delta=0): local linear,
    // tricube weights, `it` bisquare robustness iterations; statsmodels 0.15.0.
    let f = fixture!("lowess.json");
    let (xs, ys) = (nums(&f["x"]), nums(&f["y"]));
    for case in f["cases"].as_array().unwrap() {
        let opts = fit::LoessOptions { span: case["frac"].as_f64().unwrap(), degree: 1, iterations: case["it"].as_u64().unwrap() as u32, delta: 0.0 };
        let (fitted, _) = fit::loess_fit(&xs, &ys, &opts);
        assert_all_close(&fitted, &nums(&case["fitted"]), 1e-9, 1e-9, &format!("lowess frac={} it={}", case["frac"], case["it"]));
    }
    // Old Faithful waiting time on eruption duration (ties in x), frac 2/3, it 3.
    let of = &f["old_faithful"];
    let (x, y) = sorted_pairs(&faithful().0, &faithful().1);
    assert_all_close(&x, &nums(&of["x"]), 0.0, 0.0, "faithful x order");
    let opts = fit::LoessOptions { span: 2.0 / 3.0, degree: 1, iterations: 3, delta: 0.0 };
    let (fitted, _) = fit::loess_fit(&x, &y, &opts);
    let want = nums(&of["fitted"]);
    // statsmodels sorts with an unstable argsort, so tied x values may carry
    // their y in another order; the fit at a tied x is shared, so compare it.
    assert_all_close(&fitted, &want, 1e-6, 1e-6, "faithful lowess");
}

#[test]
fn loess_quadratic_reproduces_a_parabola() {
    // A local polynomial of degree d reproduces polynomials of degree d
    // exactly (Cleveland & Devlin 1988, JASA 83(403), section 2).
    let xs: Vec<f64> = (0..50).map(|i| i as f64 * 0.2).collect();
    let ys: Vec<f64> = xs.iter().map(|x| 2.0 - 1.5 * x + 0.3 * x * x).collect();
    let opts = fit::LoessOptions { span: 0.3, degree: 2, iterations: 0, delta: 0.0 };
    let (fitted, _) = fit::loess_fit(&xs, &ys, &opts);
    assert_all_close(&fitted, &ys, 1e-9, 1e-9, "quadratic");
    // Degree 1 cannot: it bends toward the chord.
    let (lin, _) = fit::loess_fit(&xs, &ys, &fit::LoessOptions { degree: 1, ..opts });
    assert!((lin[25] - ys[25]).abs() > 1e-3);
}

#[test]
fn loess_delta_interpolation_stays_close() {
    let f = fixture!("lowess.json");
    let (xs, ys) = (nums(&f["x"]), nums(&f["y"]));
    let exact = fit::loess_fit(&xs, &ys, &fit::LoessOptions { span: 0.3, degree: 1, iterations: 0, delta: 0.0 }).0;
    let fast = fit::loess_fit(&xs, &ys, &fit::LoessOptions { span: 0.3, degree: 1, iterations: 0, delta: 0.1 }).0;
    let worst = exact.iter().zip(&fast).map(|(a, b)| (a - b).abs()).fold(0.0, f64::max);
    assert!(worst < 0.02 && worst > 0.0, "{worst}");
}

fn faithful() -> (Vec<f64>, Vec<f64>) {
    // Old Faithful (Azzalini & Bowman 1990), 272 rows; provenance in the fixture README.
    let text = include_str!("../../../../tests/reference/fixtures/stats/old_faithful.csv");
    let mut e = vec![];
    let mut w = vec![];
    for line in text.lines().skip(1) {
        let mut it = line.split(',');
        e.push(it.next().unwrap().parse().unwrap());
        w.push(it.next().unwrap().parse().unwrap());
    }
    (e, w)
}

fn sorted_pairs(x: &[f64], y: &[f64]) -> (Vec<f64>, Vec<f64>) {
    let mut idx: Vec<usize> = (0..x.len()).collect();
    idx.sort_by(|a, b| x[*a].total_cmp(&x[*b]));
    (idx.iter().map(|i| x[*i]).collect(), idx.iter().map(|i| y[*i]).collect())
}

#[test]
fn old_faithful_has_272_rows() {
    let (e, w) = faithful();
    assert_eq!(e.len(), 272);
    assert_eq!(w.len(), 272);
    // Its histogram by Sturges' rule: 10 bins (numpy.histogram_bin_edges, numpy 2.4.6, in bins.json).
    assert_eq!(bin::edges_by_rule(&e, bin::Rule::Sturges).len(), 11);
}

// ------------------------------------------------------------ density

#[test]
fn kde_matches_scipy_gaussian_kde() {
    // scipy.stats.gaussian_kde (scipy 1.17.1): factor, bandwidth (√covariance) and density.
    let f = fixture!("kde.json");
    let sets = fixture!("bins.json")["sets"].clone();
    for case in f["cases"].as_array().unwrap() {
        let xs = nums(&sets[case["set"].as_str().unwrap()]);
        let grid = nums(&case["grid"]);
        for (key, rule) in [("scott", density::Bandwidth::Scott), ("silverman", density::Bandwidth::Silverman), ("fixed_0.3", density::Bandwidth::Fixed(0.3))] {
            let r = &case[key];
            let what = format!("{} {key}", case["set"]);
            if key != "fixed_0.3" {
                assert!(close(density::factor(rule, xs.len()), r["factor"].as_f64().unwrap(), 1e-13, 0.0), "{what} factor");
            }
            let h = density::bandwidth(&xs, rule).unwrap();
            assert!(close(h, r["bandwidth"].as_f64().unwrap(), 1e-12, 0.0), "{what} bandwidth");
            let d = density::kde_exact(&xs, h, &grid);
            assert_all_close(&d, &nums(&r["density"]), 1e-11, 1e-14, &format!("{what} density"));
            // The binned estimate on the same grid stays within its stated bound.
            let (lo, hi) = (grid[0], grid[grid.len() - 1]);
            let b = density::kde_binned(&xs, h, lo, hi, grid.len());
            let bound = density::binned_error_bound(grid[1] - grid[0], h);
            for (k, (x, y)) in b.iter().zip(&d).enumerate() {
                assert!((x - y).abs() <= bound, "{what} binned[{k}] {x} vs {y}, bound {bound}");
            }
        }
    }
}

#[test]
fn binned_kde_bound_holds_and_is_small_on_large_input() {
    // 10 000 normal scores Φ⁻¹((i + 1/2)/n) (a deterministic sample), 512 points.
    let n = 10_000;
    let xs: Vec<f64> = (0..n).map(|i| dist::normal_quantile((i as f64 + 0.5) / n as f64)).collect();
    let h = density::bandwidth(&xs, density::Bandwidth::Scott).unwrap();
    let (g, d) = density::kde(&xs, h, 512);
    let exact = density::kde_exact(&xs, h, &g);
    let bound = density::binned_error_bound(g[1] - g[0], h);
    let peak = exact.iter().cloned().fold(0.0, f64::max);
    assert!(bound < 1e-3 * peak, "bound {bound} peak {peak}");
    let worst = d.iter().zip(&exact).map(|(a, b)| (a - b).abs()).fold(0.0, f64::max);
    assert!(worst <= bound, "worst {worst} bound {bound}");
    // The peak of a standard normal density is 1/√(2π) ≈ 0.3989; smoothing lowers it slightly.
    assert!(peak > 0.37 && peak < 0.399, "{peak}");
}

// ------------------------------------------------------------ box

#[test]
fn box_stats_match_numpy_quartiles_and_tukey_fences() {
    // numpy.quantile (linear, type 7), numpy 2.4.6; whiskers by the 1.5 IQR rule (Tukey 1977).
    let f = fixture!("box.json");
    let sets = fixture!("bins.json")["sets"].clone();
    for case in f["cases"].as_array().unwrap() {
        let xs = nums(&sets[case["set"].as_str().unwrap()]);
        let b = tukey::box_stats(&xs).unwrap();
        let what = case["set"].to_string();
        let got = [b.q1, b.median, b.q3, b.lower_whisker, b.upper_whisker];
        let want: Vec<f64> = ["q1", "median", "q3", "lower_whisker", "upper_whisker"].iter().map(|k| case[*k].as_f64().unwrap()).collect();
        assert_all_close(&got, &want, 1e-13, 1e-13, &what);
        assert_eq!(b.outliers, nums(&case["outliers"]), "{what} outliers");
    }
}

// ------------------------------------------------------------ window

#[test]
fn rolling_windows_match_numpy_convolution() {
    // numpy.convolve(series, ones(w), "valid") (/ w) and numpy.cumsum, numpy 2.4.6.
    let f = fixture!("window.json");
    let series: Vec<Option<f64>> = nums(&f["series"]).into_iter().map(Some).collect();
    for case in f["cases"].as_array().unwrap() {
        let w = case["rows"].as_u64().unwrap() as usize;
        let means = nums(&case["mean_valid"]);
        let sums = nums(&case["sum_valid"]);
        let trailing = window::rolling(&series, w, window::Align::Trailing, false);
        let trailing_sum = window::rolling(&series, w, window::Align::Trailing, true);
        let centred = window::rolling(&series, w, window::Align::Center, false);
        for k in 0..means.len() {
            // The first full trailing window ends at row w - 1.
            assert!(close(trailing[k + w - 1].unwrap(), means[k], 1e-12, 1e-12), "trailing w={w} k={k}");
            assert!(close(trailing_sum[k + w - 1].unwrap(), sums[k], 1e-12, 1e-12), "sum w={w} k={k}");
            // A centred window over row k + w/2 covers the same rows.
            assert!(close(centred[k + w / 2].unwrap(), means[k], 1e-12, 1e-12), "centred w={w} k={k}");
        }
        // Partial windows at the start: the first row alone.
        assert_eq!(trailing[0], series[0]);
    }
    let total = window::running_total(&series);
    let want = nums(&f["cumsum"]);
    let got: Vec<f64> = total.into_iter().map(Option::unwrap).collect();
    assert_all_close(&got, &want, 1e-12, 1e-12, "running total");
}

#[test]
fn loess_band_matches_netlib_loess() {
    // Cleveland's netlib loess through scikit-misc 0.5.3
    // (tests/reference/gen/loess_band_fixtures.py): family gaussian, surface
    // direct, statistics exact; predict(stderror=True).confidence(alpha).
    let f = fixture!("loess_band.json");
    for case in f["cases"].as_array().unwrap() {
        let name = case["name"].as_str().unwrap();
        let (xs, ys, at) = (nums(&case["x"]), nums(&case["y"]), nums(&case["at"]));
        let n = xs.len();
        // The chart applies the same shortcut above 1,000 points (plan/stat.rs).
        let delta = if n > 1000 { 0.01 * (xs[n - 1] - xs[0]) } else { 0.0 };
        let opts = fit::LoessOptions { span: case["span"].as_f64().unwrap(), degree: case["degree"].as_u64().unwrap() as u32, iterations: 0, delta };
        let robust = vec![1.0; n];
        // Exact below the shortcuts. Above 400 points (df δ₁ for δ₁²/δ₂) the
        // half-width is off by 9e-7 here; above 1,000 (interpolated
        // residuals and leverages) by 9e-5. The 1e-6 below covers netlib's
        // own t quantile (loess's C code), 3e-9 from ours.
        let (rel, band_rel) = if n > 1000 {
            (5e-4, 5e-4)
        } else if n > fit::BAND_EXACT_DELTA2 {
            (1e-9, 1e-5)
        } else {
            (1e-9, 1e-6)
        };
        for band in case["bands"].as_array().unwrap() {
            let level = band["level"].as_f64().unwrap();
            let b = fit::loess_band(&xs, &ys, &robust, &opts, &at, level).unwrap();
            assert_all_close(&b.fit, &nums(&case["fit"]), 1e-9, 1e-9, &format!("{name} fit"));
            assert_all_close(&[b.residual_scale], &[case["residual_scale"].as_f64().unwrap()], rel, 0.0, &format!("{name} residual scale"));
            assert_all_close(&[b.one_delta], &[case["one_delta"].as_f64().unwrap()], rel, 0.0, &format!("{name} one_delta"));
            if let Some(d2) = b.two_delta {
                assert_all_close(&[d2], &[case["two_delta"].as_f64().unwrap()], 1e-9, 0.0, &format!("{name} two_delta"));
                assert_all_close(&[b.df], &[case["df"].as_f64().unwrap()], 1e-9, 0.0, &format!("{name} df"));
            }
            assert_all_close(&b.stderr, &nums(&case["stderr"]), rel, 1e-12, &format!("{name} stderr"));
            let fit_ = nums(&case["fit"]);
            let (lo, hi) = (nums(&band["lower"]), nums(&band["upper"]));
            for j in 0..at.len() {
                let half = hi[j] - fit_[j];
                assert!(close(b.low[j], lo[j], 0.0, band_rel * half), "{name} level {level} lower[{j}]: got {}, want {}", b.low[j], lo[j]);
                assert!(close(b.high[j], hi[j], 0.0, band_rel * half), "{name} level {level} upper[{j}]: got {}, want {}", b.high[j], hi[j]);
            }
        }
    }
}
