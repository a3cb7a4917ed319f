//! CSV reading throughput (MB/s) over generated ~100 MB files: one numeric,
//! one mixed (integers, numbers, dates, date-times, booleans, text with
//! quotes). Files are written to `target/strata-bench/` on first use and not
//! committed.
//!
//! Modes (checked before criterion runs):
//! - `STRATA_CSV_GENERATE=DIR`: write `numeric.csv` and `mixed.csv` to DIR.
//! - `STRATA_CSV_READ=FILE`: read FILE `STRATA_CSV_REPEAT` times (default 3)
//!   and print one JSON line with the best time; bench/csv_vs_pyarrow.py
//!   uses this beside pyarrow in the same run, under /usr/bin/time for peak
//!   memory.
//! - otherwise: criterion, throughput in bytes.

use criterion::{criterion_group, Criterion, Throughput};
use std::io::Write;
use std::path::{Path, PathBuf};
use std::time::Instant;
use strata::data::{self, ReadOptions};
use strata::spec::DataFormat;

const TARGET_BYTES: usize = 100 * 1024 * 1024;

/// xorshift64* (Vigna 2016): fixed-seed data.
struct Rng(u64);
impl Rng {
    fn next(&mut self) -> u64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        self.0.wrapping_mul(0x2545_F491_4F6C_DD1D)
    }
    fn below(&mut self, n: u64) -> u64 {
        self.next() % n
    }
}

fn write_numeric(path: &Path) {
    let mut rng = Rng(0x1234_5678);
    let mut out = Vec::with_capacity(TARGET_BYTES + 4096);
    out.extend_from_slice(b"id,x,y,z,count,price,delta,ratio\n");
    let mut id = 0u64;
    while out.len() < TARGET_BYTES {
        id += 1;
        let x = rng.below(2_000_000) as f64 / 1000.0 - 1000.0;
        let y = rng.below(1 << 40) as f64 / (1u64 << 20) as f64;
        let z = (rng.below(200_000) as i64 - 100_000) as f64 / 7.0;
        let count = rng.below(100_000);
        let price = rng.below(1_000_000) as f64 / 100.0;
        let delta = rng.below(2001) as i64 - 1000;
        let ratio = rng.below(1_000_000) as f64 / 1e6;
        writeln!(out, "{id},{x},{y:.6},{z:.4},{count},{price:.2},{delta},{ratio}").unwrap();
    }
    std::fs::write(path, out).unwrap();
}

fn write_mixed(path: &Path) {
    let mut rng = Rng(0x9abc_def0);
    let words = ["north pier", "lighthouse", "harbour", "old mill", "ridge", "bay \"east\"", "station, west", "Zürich", "東京"];
    let mut out = Vec::with_capacity(TARGET_BYTES + 4096);
    out.extend_from_slice(b"id,day,when,station,reading,ok,note\n");
    let mut id = 0u64;
    while out.len() < TARGET_BYTES {
        id += 1;
        let day = rng.below(20_000) as i64;
        let (y, m, d) = strata::calendar::civil_from_days(day);
        let secs = rng.below(86_400);
        let w = words[rng.below(words.len() as u64) as usize];
        let station = if w.contains(['"', ',']) { format!("\"{}\"", w.replace('"', "\"\"")) } else { w.to_string() };
        let reading = if rng.below(20) == 0 { String::new() } else { format!("{:.3}", rng.below(100_000) as f64 / 37.0) };
        let ok = if rng.below(2) == 0 { "true" } else { "false" };
        let note_len = rng.below(24) as usize;
        let note: String = (0..note_len).map(|_| (b'a' + rng.below(26) as u8) as char).collect();
        writeln!(
            out,
            "{id},{y:04}-{m:02}-{d:02},{y:04}-{m:02}-{d:02}T{:02}:{:02}:{:02}Z,{station},{reading},{ok},{note}",
            secs / 3600,
            secs / 60 % 60,
            secs % 60
        )
        .unwrap();
    }
    std::fs::write(path, out).unwrap();
}

fn ensure(dir: &Path) -> (PathBuf, PathBuf) {
    std::fs::create_dir_all(dir).unwrap();
    let n = dir.join("numeric.csv");
    let m = dir.join("mixed.csv");
    if !n.exists() {
        write_numeric(&n);
    }
    if !m.exists() {
        write_mixed(&m);
    }
    (n, m)
}

fn opts() -> ReadOptions {
    ReadOptions { format: Some(DataFormat::Csv), max_bytes: usize::MAX, max_rows: usize::MAX, ..Default::default() }
}

fn bench_csv(c: &mut Criterion) {
    let dir = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../target/strata-bench");
    let (n, m) = ensure(&dir);
    let mut g = c.benchmark_group("csv_read");
    g.sample_size(10);
    g.measurement_time(std::time::Duration::from_secs(8));
    g.warm_up_time(std::time::Duration::from_secs(1));
    for (name, path) in [("numeric_100mb", n), ("mixed_100mb", m)] {
        let bytes = std::fs::read(&path).unwrap();
        g.throughput(Throughput::Bytes(bytes.len() as u64));
        g.bench_function(name, |b| b.iter(|| data::read(&bytes, &opts()).unwrap()));
    }
    g.finish();
}

criterion_group!(benches, bench_csv);

fn main() {
    if let Ok(dir) = std::env::var("STRATA_CSV_GENERATE") {
        let (n, m) = ensure(Path::new(&dir));
        println!("{}\n{}", n.display(), m.display());
        return;
    }
    if let Ok(file) = std::env::var("STRATA_CSV_READ") {
        // On-CPU time of this (single) thread in ns, Linux only: less
        // sensitive to other load on a shared machine than wall time.
        let cpu = || -> f64 {
            std::fs::read_to_string("/proc/self/schedstat")
                .ok()
                .and_then(|s| s.split_whitespace().next().and_then(|v| v.parse::<f64>().ok()))
                .map(|ns| ns / 1e9)
                .unwrap_or(f64::NAN)
        };
        let mut best_cpu = f64::INFINITY;
        let repeat: usize = std::env::var("STRATA_CSV_REPEAT").ok().and_then(|v| v.parse().ok()).unwrap_or(3);
        let bytes = std::fs::read(&file).unwrap();
        let mut best = f64::INFINITY;
        let mut rows = 0;
        for _ in 0..repeat.max(1) {
            let (t0, c0) = (Instant::now(), cpu());
            let t = data::read(&bytes, &opts()).unwrap();
            best = best.min(t0.elapsed().as_secs_f64());
            best_cpu = best_cpu.min(cpu() - c0);
            rows = t.num_rows();
            drop(t);
        }
        println!(
            "{{\"file\": \"{file}\", \"bytes\": {}, \"rows\": {rows}, \"seconds\": {best:.6}, \"cpu_seconds\": {best_cpu:.6}, \"mb_per_s\": {:.1}}}",
            bytes.len(),
            bytes.len() as f64 / 1e6 / best
        );
        return;
    }
    benches();
    Criterion::default().configure_from_args().final_summary();
}
