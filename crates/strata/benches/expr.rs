//! Expression evaluation speed: `derive` and `where` over 200,000 rows,
//! against a baseline measured in the same run: the same computation
//! hand-written in Rust over the Arrow arrays (what the language costs
//! over code written for one expression).

use criterion::{criterion_group, Criterion};
use std::hint::black_box;
use std::time::Instant;
use strata::data::{read, ReadOptions, Table};
use strata::data::{Column, Nums};

const ROWS: usize = 200_000;

fn table() -> Table {
    let stations = ["North pier", "Lighthouse", "Quay", "Old mill"];
    let mut csv = String::from("station,rain_mm\n");
    let mut z: u64 = 1;
    for i in 0..ROWS {
        z = z.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
        let rain = (z >> 33) % 4000;
        if i % 17 == 0 {
            csv.push_str(&format!("{},\n", stations[i % 4]));
        } else {
            csv.push_str(&format!("{},{}.{}\n", stations[i % 4], rain / 10, rain % 10));
        }
    }
    read(csv.as_bytes(), &ReadOptions::default()).unwrap()
}

fn language(t: &Table) -> Table {
    let d: strata::spec::Pairs<String> = [("rain_cm".to_string(), "rain_mm / 10.0".to_string())].into_iter().collect();
    strata::expr::apply(t.clone(), &d, Some("station IN ('North pier', 'Lighthouse') AND rain_mm > 5")).unwrap()
}

/// The same by hand: a derived column and a filter mask.
fn by_hand(t: &Table) -> (Nums, usize) {
    let (Column::Text(station), Column::Float(rain)) = (t.column(0), t.column(1)) else { unreachable!() };
    let cm: Nums = rain.iter().map(|v| v.map(|x| x / 10.0)).collect();
    let keep: Vec<bool> =
        (0..t.num_rows()).map(|i| matches!(station.get(i), Some("North pier" | "Lighthouse")) && rain.get(i).is_some_and(|x| x > 5.0)).collect();
    let kept = keep.iter().filter(|k| **k).count();
    (cm, kept)
}

fn bench(c: &mut Criterion) {
    let t = table();
    assert_eq!(language(&t).num_rows(), by_hand(&t).1);
    let mut g = c.benchmark_group("expr_200k_rows");
    g.sample_size(20);
    g.bench_function("baseline_hand_written", |b| b.iter(|| by_hand(black_box(&t))));
    g.bench_function("derive_and_where", |b| b.iter(|| language(black_box(&t))));
    g.finish();
}

fn median_secs(f: &mut dyn FnMut()) -> f64 {
    let mut v: Vec<f64> = (0..15)
        .map(|_| {
            let s = Instant::now();
            f();
            s.elapsed().as_secs_f64()
        })
        .collect();
    v.sort_by(|a, b| a.partial_cmp(b).unwrap());
    v[v.len() / 2]
}

criterion_group!(benches, bench);

fn main() {
    benches();
    let t = table();
    let base = median_secs(&mut || {
        black_box(by_hand(&t));
    });
    let lang = median_secs(&mut || {
        black_box(language(&t));
    });
    println!("expr ratio: derive+where {:.2} ms, hand-written {:.2} ms, ratio {:.2}x over {ROWS} rows", lang * 1e3, base * 1e3, lang / base);
}
