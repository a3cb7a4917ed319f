//! Scales, formats and text: cost of the Talbot-Lin-Hanrahan search against
//! Heckbert's closed form (the baseline, measured in the same run), of LDML
//! formatting, of text measurement, and of a whole render.
//! Run: cargo bench -p strata --bench scales -- --warm-up-time 1 --measurement-time 2

use criterion::{criterion_group, criterion_main, Criterion};
use std::hint::black_box;
use std::time::Instant;
use strata::format;
use strata::scale::ticks;

fn ranges() -> Vec<(f64, f64)> {
    (0..100).map(|i| (-(i as f64) * 1.7, 3.0 + (i * i) as f64 * 0.37)).collect()
}

fn bench(c: &mut Criterion) {
    let r = ranges();
    c.bench_function("ticks/heckbert x100 (baseline)", |b| b.iter(|| r.iter().map(|(a, z)| ticks::nice_ticks(black_box(*a), *z, 6).len()).sum::<usize>()));
    c.bench_function("ticks/extended x100", |b| b.iter(|| r.iter().map(|(a, z)| ticks::extended(black_box(*a), *z, 6, false).len()).sum::<usize>()));
    let de = format::locale("de");
    c.bench_function("format/number #,##0.0 x100", |b| {
        b.iter(|| (0..100).map(|i| format::number(black_box(i as f64 * 1234.567), "#,##0.0", de).len()).sum::<usize>())
    });
    c.bench_function("text/width 40 chars x100", |b| {
        b.iter(|| (0..100).map(|_| strata::text::width(black_box("Visitors a month through each gate, 2024"), 12.0, false)).sum::<f64>())
    });
    let spec = include_str!("../../../examples/lines.json");
    let data = include_bytes!("../../../examples/data/orchard_visitors.csv");
    c.bench_function("render/lines example", |b| {
        b.iter(|| {
            let d = strata::DataBytes { bytes: data, name: "orchard_visitors.csv" };
            strata::render(black_box(spec), Some(d), &strata::RenderOptions::default()).unwrap().svg.len()
        })
    });

    // Ratio against the baseline in this run.
    let time = |f: &dyn Fn() -> usize| {
        let t = Instant::now();
        let mut n = 0;
        for _ in 0..200 {
            n += f();
        }
        black_box(n);
        t.elapsed().as_secs_f64()
    };
    let h = time(&|| r.iter().map(|(a, z)| ticks::nice_ticks(*a, *z, 6).len()).sum());
    let e = time(&|| r.iter().map(|(a, z)| ticks::extended(*a, *z, 6, false).len()).sum());
    println!("extended / heckbert time ratio: {:.1}", e / h);
}

criterion_group!(benches, bench);
criterion_main!(benches);
