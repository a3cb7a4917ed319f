//! A bounded, seeded stand-in for coverage-guided fuzzing, run on stable
//! Rust with the normal test suite: thousands of mutated corpus files and
//! random byte strings go through every reader, which must return Ok or a
//! located error and never panic. The cargo-fuzz targets in `fuzz/` feed
//! the same entry points when a nightly toolchain is available
//! (`scripts/fuzz.sh`).

use std::path::PathBuf;
use strata::data::{self, csv::records, ReadOptions};
use strata::spec::{ColumnType, DataFormat};

/// xorshift64* (Vigna 2016, "An experimental exploration of Marsaglia's
/// xorshift generators, scrambled"): a fixed-seed source of test input.
struct Rng(u64);
impl Rng {
    fn next(&mut self) -> u64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        self.0.wrapping_mul(0x2545_F491_4F6C_DD1D)
    }
    fn below(&mut self, n: usize) -> usize {
        if n == 0 {
            0
        } else {
            (self.next() % n as u64) as usize
        }
    }
}

const INTERESTING: &[u8] = b"\",;\t|\n\r \x00\xff\xc3\xa9\xef\xbb\xbf-.eE0123456789TZ:+NA";

fn mutate(rng: &mut Rng, seed: &[u8], pool: &[Vec<u8>]) -> Vec<u8> {
    let mut v = seed.to_vec();
    for _ in 0..1 + rng.below(8) {
        match rng.below(7) {
            0 if !v.is_empty() => {
                let i = rng.below(v.len());
                v[i] ^= 1 << rng.below(8);
            }
            1 => {
                let i = rng.below(v.len() + 1);
                v.insert(i, INTERESTING[rng.below(INTERESTING.len())]);
            }
            2 if !v.is_empty() => {
                let i = rng.below(v.len());
                v.remove(i);
            }
            3 => {
                let n = rng.below(v.len() + 1);
                v.truncate(n);
            }
            4 if !v.is_empty() => {
                let i = rng.below(v.len());
                v[i] = rng.next() as u8;
            }
            5 => {
                // Splice a slice of another input.
                let other = &pool[rng.below(pool.len())];
                if !other.is_empty() {
                    let a = rng.below(other.len());
                    let b = a + rng.below(other.len() - a + 1).min(64);
                    let i = rng.below(v.len() + 1);
                    v.splice(i..i, other[a..b].iter().copied());
                }
            }
            _ if !v.is_empty() => {
                // Repeat a chunk.
                let a = rng.below(v.len());
                let b = (a + 1 + rng.below(16)).min(v.len());
                let chunk = v[a..b].to_vec();
                v.splice(a..a, chunk);
            }
            _ => {}
        }
    }
    v
}

fn corpus(dir: &str) -> Vec<Vec<u8>> {
    let d = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../tests/reference/fixtures").join(dir);
    let mut files: Vec<_> = std::fs::read_dir(d).unwrap().map(|e| e.unwrap().path()).collect();
    files.sort();
    files.into_iter().filter(|p| p.extension().is_some_and(|e| e != "json")).map(|p| std::fs::read(p).unwrap()).filter(|b| b.len() < 8192).collect()
}

fn options(rng: &mut Rng) -> ReadOptions {
    let mut o = ReadOptions {
        format: [None, Some(DataFormat::Csv), Some(DataFormat::Tsv), Some(DataFormat::Json), Some(DataFormat::Arrow)][rng.below(5)],
        max_rows: [5_000_000, 3, 0][rng.below(3)],
        decimal_comma: rng.below(4) == 0,
        ..Default::default()
    };
    if rng.below(3) == 0 {
        for name in ["a", "b", "c", "d", "t", "i"] {
            o.types.insert(name.into(), [ColumnType::Number, ColumnType::Text, ColumnType::Date, ColumnType::Bool][rng.below(4)]);
        }
    }
    if rng.below(5) == 0 {
        o.delimiter = Some(INTERESTING[rng.below(INTERESTING.len())]);
    }
    o
}

/// `STRATA_FUZZ_ITERATIONS` and `STRATA_FUZZ_SEED` lengthen or vary a run
/// (scripts/fuzz.sh uses them when cargo-fuzz cannot run).
fn run(seed: u64, pool: &[Vec<u8>], iterations: usize, arrow_only: bool) {
    let iterations = std::env::var("STRATA_FUZZ_ITERATIONS").ok().and_then(|v| v.parse().ok()).unwrap_or(iterations);
    let seed = std::env::var("STRATA_FUZZ_SEED").ok().and_then(|v| v.parse::<u64>().ok()).map(|s| s ^ seed).unwrap_or(seed);
    let mut rng = Rng(seed | 1);
    for _ in 0..iterations {
        let input = if rng.below(10) == 0 {
            (0..rng.below(300)).map(|_| rng.next() as u8).collect()
        } else {
            let k = rng.below(pool.len());
            mutate(&mut rng, &pool[k], pool)
        };
        let mut o = options(&mut rng);
        if arrow_only {
            o.format = Some(DataFormat::Arrow);
        }
        match data::read(&input, &o) {
            Ok(t) => {
                assert!(t.num_rows() <= o.max_rows);
            }
            Err(e) => {
                assert!(!e.0.is_empty());
                assert!(e.0.iter().all(|d| !d.message.is_empty()));
            }
        }
        let _ = records(&input, b',');
    }
}

#[test]
fn mutated_csv_never_panics() {
    let pool = corpus("csv");
    assert!(pool.len() > 30);
    run(0x5EED_0001, &pool, 4000, false);
}

#[test]
fn mutated_arrow_never_panics() {
    let pool = corpus("arrow");
    assert!(pool.len() >= 3);
    run(0x5EED_0002, &pool, 3000, true);
}
