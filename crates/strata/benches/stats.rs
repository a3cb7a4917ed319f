//! Statistics benchmarks. `bench/stats_vs_numpy.py` runs these and the
//! numpy/scipy/statsmodels baselines in the same run and prints ratios.
//!
//! cargo bench -p strata --bench stats

use criterion::{criterion_group, criterion_main, Criterion};
use std::hint::black_box;
use std::time::Duration;
use strata::data::{Column, Table};
use strata::stat::{bin, density, fit, rng::SplitMix64};

/// Standard normal draws by Box-Muller from SplitMix64 (seeded).
fn normals(n: usize, seed: u64) -> Vec<f64> {
    let mut r = SplitMix64::new(seed);
    let mut out = Vec::with_capacity(n);
    while out.len() < n {
        let u1 = 1.0 - r.next_f64();
        let u2 = r.next_f64();
        let rad = (-2.0 * strata::math::ln(u1)).sqrt();
        let t = std::f64::consts::TAU * u2;
        out.push(rad * strata::math::cos(t));
        if out.len() < n {
            out.push(rad * strata::math::sin(t));
        }
    }
    out
}

fn histogram(c: &mut Criterion) {
    let xs = normals(10_000_000, 1);
    let mut g = c.benchmark_group("stats");
    g.sample_size(10).warm_up_time(Duration::from_millis(500)).measurement_time(Duration::from_secs(3));
    // Same work as numpy.histogram(x, bins=50): the range, 50 even bins, counts.
    g.bench_function("histogram_10m_50", |b| {
        b.iter(|| {
            let e = bin::edges_by_count(black_box(&xs), 50);
            bin::histogram(&xs, &e)
        })
    });
    g.finish();
}

fn kde(c: &mut Criterion) {
    let xs = normals(10_000, 2);
    let mut g = c.benchmark_group("stats");
    g.sample_size(20).warm_up_time(Duration::from_millis(300)).measurement_time(Duration::from_secs(2));
    // Scott bandwidth, 512 points over min - 3h .. max + 3h (binned path).
    g.bench_function("kde_10k_512", |b| {
        b.iter(|| {
            let h = density::bandwidth(black_box(&xs), density::Bandwidth::Scott).unwrap();
            density::kde(&xs, h, 512)
        })
    });
    // The exact O(n m) sum, for reference.
    g.bench_function("kde_10k_512_exact", |b| {
        b.iter(|| {
            let h = density::bandwidth(black_box(&xs), density::Bandwidth::Scott).unwrap();
            let (lo, hi) = bin::min_max(&xs).unwrap();
            density::kde_exact(&xs, h, &density::grid(lo - 3.0 * h, hi + 3.0 * h, 512))
        })
    });
    g.finish();
}

fn loess(c: &mut Criterion) {
    let n = 10_000;
    let mut r = SplitMix64::new(3);
    let mut xs: Vec<f64> = (0..n).map(|_| r.next_f64() * 10.0).collect();
    xs.sort_by(f64::total_cmp);
    let noise = normals(n, 4);
    let ys: Vec<f64> = xs.iter().zip(&noise).map(|(x, e)| strata::math::sin(*x) + 0.3 * e).collect();
    let at = density::grid(xs[0], xs[n - 1], 80);
    let mut g = c.benchmark_group("stats");
    g.sample_size(10).warm_up_time(Duration::from_millis(300)).measurement_time(Duration::from_secs(3));
    // What the engine does for a 10k-point loess line: 80 output points.
    g.bench_function("loess_10k_plain", |b| {
        let opts = fit::LoessOptions { span: 0.3, degree: 1, iterations: 0, delta: 0.0 };
        b.iter(|| fit::loess_at(black_box(&xs), &ys, &vec![1.0; n], &opts, &at))
    });
    // Robust: 3 iterations with delta = 1 % of the range, then 80 points.
    g.bench_function("loess_10k_robust3", |b| {
        let opts = fit::LoessOptions { span: 0.3, degree: 1, iterations: 3, delta: 0.1 };
        b.iter(|| {
            let (_, w) = fit::loess_fit(black_box(&xs), &ys, &opts);
            fit::loess_at(&xs, &ys, &w, &opts, &at)
        })
    });
    // Every point fitted, as statsmodels lowess(frac=0.3, it=3, delta=0.1) does it.
    g.bench_function("loess_10k_all_points_robust3", |b| {
        let opts = fit::LoessOptions { span: 0.3, degree: 1, iterations: 3, delta: 0.1 };
        b.iter(|| fit::loess_fit(black_box(&xs), &ys, &opts))
    });
    g.finish();
}

fn line_svg(c: &mut Criterion) {
    let n = 10_000_000;
    let noise = normals(n, 5);
    let mut y = 0.0;
    let ys: Vec<f64> = noise
        .iter()
        .map(|e| {
            y += e;
            y
        })
        .collect();
    let xs: Vec<f64> = (0..n).map(|i| i as f64).collect();
    let table = Table::new(vec!["t".into(), "v".into()], vec![Column::Float(xs.into()), Column::Float(ys.into())], n, vec![]);
    let spec = strata::parse_spec(r#"{"size":{"width":800},"layers":[{"draw":"line","x":"t","y":"v"}]}"#).unwrap();
    let opts = strata::scene::SceneOptions::default();
    let render = || {
        let plan = strata::plan::build(&spec, &table).unwrap();
        let scene = strata::scene::build(&plan, &opts);
        strata::svg::write(&scene)
    };
    let svg = render();
    eprintln!("line_10m_svg_800px: SVG {} bytes", svg.len());
    let mut g = c.benchmark_group("stats");
    g.sample_size(10).warm_up_time(Duration::from_millis(500)).measurement_time(Duration::from_secs(5));
    // From an in-memory table to SVG text: plan (column extraction),
    // scene (scales, M4 at the plot width) and SVG writing.
    g.bench_function("line_10m_svg_800px", |b| b.iter(|| black_box(render()).len()));
    // Baseline for the ratio: one read of both columns (their extents), the
    // least any drawing of every point has to do.
    let cols = [table.column(0).clone(), table.column(1).clone()];
    g.bench_function("line_10m_read_columns", |b| {
        b.iter(|| {
            cols.iter()
                .map(|c| {
                    let Column::Float(v) = c else { unreachable!() };
                    let v = v.raw();
                    v.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), x| (if *x < lo { *x } else { lo }, if *x > hi { *x } else { hi }))
                })
                .map(|(lo, hi)| black_box(lo + hi))
                .sum::<f64>()
        })
    });
    g.finish();
}

/// strata::sort (the engine's own radix and merge sorts) beside the standard
/// library's stable sort they replace, on the same input in the same run.
fn sorts(c: &mut Criterion) {
    let xs = normals(10_000_000, 6);
    let mut r = SplitMix64::new(7);
    let pts: Vec<(f64, f64)> = (0..1_000_000).map(|i| (r.next_f64(), i as f64)).collect();
    let ascending: Vec<(f64, f64)> = (0..10_000_000).map(|i| (i as f64, 0.0)).collect();
    let words: Vec<u32> = (0..100_000).map(|_| (r.next_f64() * 5000.0) as u32).collect();
    let mut g = c.benchmark_group("sort");
    g.sample_size(10).warm_up_time(Duration::from_millis(300)).measurement_time(Duration::from_secs(3));
    g.bench_function("f64_10m_normal_std", |b| b.iter(|| black_box(xs.clone()).sort_by(f64::total_cmp)));
    g.bench_function("f64_10m_normal_strata", |b| b.iter(|| strata::sort::f64s(&mut black_box(xs.clone()))));
    g.bench_function("quantile_10m_strata", |b| b.iter(|| strata::stat::quantile::quantile(black_box(&xs), 0.9, strata::stat::quantile::Method::Type7)));
    g.bench_function("points_1m_by_x_std", |b| b.iter(|| black_box(pts.clone()).sort_by(|a, b| a.0.total_cmp(&b.0))));
    g.bench_function("points_1m_by_x_strata", |b| b.iter(|| strata::sort::by_x(&mut black_box(pts.clone()))));
    g.bench_function("points_10m_ascending_std", |b| b.iter(|| black_box(ascending.clone()).sort_by(|a, b| a.0.total_cmp(&b.0))));
    g.bench_function("points_10m_ascending_strata", |b| b.iter(|| strata::sort::by_x(&mut black_box(ascending.clone()))));
    g.bench_function("by_100k_std", |b| b.iter(|| black_box(words.clone()).sort()));
    // What strata::sort::by did before: std's stable sort of positions
    // through a `dyn` comparator, then the permutation.
    g.bench_function("by_100k_std_positions", |b| {
        b.iter(|| {
            let mut v = black_box(words.clone());
            let cmp: &mut dyn FnMut(usize, usize) -> std::cmp::Ordering = &mut |a, b| v[a].cmp(&v[b]);
            let mut idx: Vec<usize> = (0..v.len()).collect();
            idx.sort_by(|a, b| cmp(*a, *b));
            strata::sort::permute(idx, &mut |i, j| v.swap(i, j));
            v
        })
    });
    g.bench_function("by_100k_strata", |b| b.iter(|| strata::sort::by(&mut black_box(words.clone()), |a, b| a.cmp(b))));
    g.finish();
}

criterion_group!(benches, histogram, kde, loess, line_svg, sorts);
criterion_main!(benches);
