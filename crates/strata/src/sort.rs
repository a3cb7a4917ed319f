//! The engine's sorts, written here instead of taken from the standard
//! library.
//!
//! Every `slice::sort_by` or `sort_unstable` with its own element type or
//! comparator is a separate copy of the standard library's driftsort or
//! ipnsort in the wasm module (3-5 KB each; with the copies for `usize`,
//! `f64` and point pairs about 18 KB of code in the core). Here there are two
//! small sorts instead:
//!
//! - [`order`]: a stable bottom-up merge sort of the positions `0..n`, with
//!   the comparator behind `dyn`, so one copy serves every element type.
//!   [`by`] sorts any slice through it and [`permute`]; each call site adds
//!   only its comparator and a few bytes.
//! - [`f64s`], [`by_x`], [`by_f64_key`] and [`usizes`]: a least significant
//!   digit radix sort over 64-bit keys (for `f64` the bits mapped so that
//!   unsigned order is `f64::total_cmp`'s order: -NaN, -inf, ..., -0.0, 0.0,
//!   ..., inf, NaN). It is stable, needs no comparisons, and on millions of
//!   numbers (quantiles, points by x) is faster than a comparison sort;
//!   input already in order costs one pass.
//!
//! Both give exactly the order of the standard library's stable
//! `sort_by` with the same comparator (the tests below check it).

use core::cmp::Ordering;

/// Runs this long are sorted by insertion before the merges.
const RUN: usize = 12;

/// The positions `0..n` in stable sorted order under `cmp`.
pub fn order(n: usize, cmp: &mut dyn FnMut(usize, usize) -> Ordering) -> Vec<usize> {
    let mut a: Vec<usize> = (0..n).collect();
    for run in a.chunks_mut(RUN) {
        for i in 1..run.len() {
            let x = run[i];
            let mut j = i;
            while j > 0 && cmp(x, run[j - 1]) == Ordering::Less {
                run[j] = run[j - 1];
                j -= 1;
            }
            run[j] = x;
        }
    }
    let mut b = vec![0; if n > RUN { n } else { 0 }];
    let mut width = RUN;
    while width < n {
        for (src, dst) in a.chunks(2 * width).zip(b.chunks_mut(2 * width)) {
            let (l, r) = src.split_at(width.min(src.len()));
            merge(l, r, dst, cmp);
        }
        core::mem::swap(&mut a, &mut b);
        width *= 2;
    }
    a
}

/// Merges the sorted runs `l` and `r` into `out`; on a tie `l` goes first.
fn merge(l: &[usize], r: &[usize], out: &mut [usize], cmp: &mut dyn FnMut(usize, usize) -> Ordering) {
    // Already in order (sorted input, or a short last run): a copy.
    if l.is_empty() || r.is_empty() || cmp(r[0], l[l.len() - 1]) != Ordering::Less {
        out[..l.len()].copy_from_slice(l);
        out[l.len()..].copy_from_slice(r);
        return;
    }
    let (mut i, mut j) = (0, 0);
    for o in out.iter_mut() {
        if j == r.len() || (i < l.len() && cmp(r[j], l[i]) != Ordering::Less) {
            *o = l[i];
            i += 1;
        } else {
            *o = r[j];
            j += 1;
        }
    }
}

/// Sorts `v` stably by `cmp`, like `v.sort_by(cmp)`.
pub fn by<T>(v: &mut [T], mut cmp: impl FnMut(&T, &T) -> Ordering) {
    if v.len() < 2 {
        return;
    }
    let idx = order(v.len(), &mut |a, b| cmp(&v[a], &v[b]));
    permute(idx, &mut |i, j| v.swap(i, j));
}

/// Moves the element at `idx[i]` to `i` for every `i` through `swap`,
/// following each cycle once.
pub fn permute(mut idx: Vec<usize>, swap: &mut dyn FnMut(usize, usize)) {
    for start in 0..idx.len() {
        if idx[start] == usize::MAX {
            continue;
        }
        let mut i = start;
        loop {
            let j = idx[i];
            idx[i] = usize::MAX;
            if j == start {
                break;
            }
            swap(i, j);
            i = j;
        }
    }
}

/// An `f64`'s bits mapped so that unsigned order is `f64::total_cmp`'s:
/// a negative number (sign bit set) has every bit flipped, a positive one
/// only its sign bit.
#[inline]
fn total_key(x: f64) -> u64 {
    let b = x.to_bits();
    b ^ ((((b as i64) >> 63) as u64) | (1 << 63))
}

/// Sorts `f64`s like `v.sort_by(f64::total_cmp)`.
pub fn f64s(v: &mut [f64]) {
    radix(v, |x| total_key(*x));
}

/// Sorts points stably by their first coordinate, like
/// `v.sort_by(|a, b| a.0.total_cmp(&b.0))`.
pub fn by_x(v: &mut [(f64, f64)]) {
    radix(v, |p| total_key(p.0));
}

/// Sorts positions ascending, like `v.sort()`, through [`f64s`] (a
/// position below 2^53 is exact in an `f64`; one copy of the radix sort
/// fewer in the module).
pub fn usizes(v: &mut [usize]) {
    let mut f: Vec<f64> = v.iter().map(|x| *x as f64).collect();
    f64s(&mut f);
    for (x, f) in v.iter_mut().zip(f) {
        *x = f as usize;
    }
}

/// Sorts `v` stably by an `f64` key (`f64::total_cmp`), like
/// `v.sort_by(|a, b| key(a).total_cmp(&key(b)))`, through [`by_x`] on
/// (key, position) pairs (positions below 2^53 are exact in an `f64`).
pub fn by_f64_key<T>(v: &mut [T], key: impl Fn(&T) -> f64) {
    let mut keyed: Vec<(f64, f64)> = v.iter().enumerate().map(|(i, x)| (key(x), i as f64)).collect();
    by_x(&mut keyed);
    permute(keyed.iter().map(|k| k.1 as usize).collect(), &mut |i, j| v.swap(i, j));
}

/// Bits of the key sorted in one pass of [`radix`].
const DIGIT: usize = 11;

/// Stable least significant digit radix sort by a 64-bit key, 11 bits a
/// pass (six passes); a digit that every key shares is skipped, short input
/// is sorted by insertion and input already in order is left after one look.
fn radix<T: Copy>(v: &mut [T], key: impl Fn(&T) -> u64) {
    const PASSES: usize = 64usize.div_ceil(DIGIT);
    const MASK: u64 = (1 << DIGIT) - 1;
    let n = v.len();
    if v.windows(2).all(|w| key(&w[0]) <= key(&w[1])) {
        return;
    }
    if n <= 32 {
        for i in 1..n {
            let (x, k) = (v[i], key(&v[i]));
            let mut j = i;
            while j > 0 && k < key(&v[j - 1]) {
                v[j] = v[j - 1];
                j -= 1;
            }
            v[j] = x;
        }
        return;
    }
    let mut counts = vec![[0usize; 1 << DIGIT]; PASSES];
    for x in v.iter() {
        let k = key(x);
        for (d, c) in counts.iter_mut().enumerate() {
            c[((k >> (DIGIT * d)) & MASK) as usize] += 1;
        }
    }
    let mut buf = v.to_vec();
    let mut in_buf = false;
    for (d, c) in counts.iter_mut().enumerate() {
        if c.contains(&n) {
            continue;
        }
        let mut at = 0;
        for c in c.iter_mut() {
            let k = *c;
            *c = at;
            at += k;
        }
        let (src, dst) = if in_buf { (&buf[..], &mut v[..]) } else { (&v[..], &mut buf[..]) };
        for x in src {
            let b = ((key(x) >> (DIGIT * d)) & MASK) as usize;
            dst[c[b]] = *x;
            c[b] += 1;
        }
        in_buf = !in_buf;
    }
    if in_buf {
        v.copy_from_slice(&buf);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The random inputs: the engine's own SplitMix64 (stat::rng).
    struct Rng(crate::stat::rng::SplitMix64);
    impl Rng {
        fn new(seed: u64) -> Self {
            Rng(crate::stat::rng::SplitMix64::new(seed))
        }
        fn next(&mut self) -> u64 {
            self.0.next_u64()
        }
        fn below(&mut self, n: u64) -> u64 {
            self.next() % n
        }
        /// A number with many ties, both zeros, both NaNs, infinities and
        /// subnormals among ordinary values.
        fn float(&mut self) -> f64 {
            const SPECIAL: [f64; 10] = [0.0, -0.0, f64::NAN, -f64::NAN, f64::INFINITY, f64::NEG_INFINITY, 5e-324, -5e-324, 1.0, -1.0];
            match self.below(4) {
                0 => SPECIAL[self.below(SPECIAL.len() as u64) as usize],
                1 => (self.below(7) as f64 - 3.0) * 0.5,
                2 => f64::from_bits(self.next()),
                _ => (self.next() >> 11) as f64 / (1u64 << 53) as f64 * 2e6 - 1e6,
            }
        }
    }

    /// Lengths around the run length, the insertion cut-off and powers of
    /// two, and a few large ones.
    fn lengths() -> Vec<usize> {
        let mut n: Vec<usize> = (0..=70).collect();
        n.extend([95, 96, 97, 100, 127, 128, 129, 191, 255, 256, 257, 500, 1000, 1023, 1024, 1025, 4099, 20_000]);
        n
    }

    /// The input in several shapes: random, sorted, reversed, sorted with
    /// the last few shuffled, all equal.
    fn shapes<T: Clone>(v: &[T], sorted: impl Fn(&mut Vec<T>)) -> Vec<Vec<T>> {
        let mut s = v.to_vec();
        sorted(&mut s);
        let rev: Vec<T> = s.iter().rev().cloned().collect();
        let mut tail = s.clone();
        let n = tail.len();
        if n > 3 {
            tail.swap(n - 1, n / 2);
            tail.swap(n - 2, 0);
        }
        let same = v.first().map(|x| vec![x.clone(); v.len()]).unwrap_or_default();
        vec![v.to_vec(), s, rev, tail, same]
    }

    // The reference is the Rust standard library's stable sort,
    // `slice::sort_by` (Rust 1.95), on the same input with the same
    // comparator: the same order, ties included (every element carries its
    // position, so a tie out of order shows).
    #[test]
    #[allow(clippy::unnecessary_sort_by)] // the reference is `sort_by` itself, with the same comparator
    fn order_and_by_match_std_sort_by() {
        let mut r = Rng::new(1);
        for n in lengths() {
            let keys: Vec<u32> = (0..n).map(|_| r.below(1 + n as u64 / 3) as u32).collect();
            for keys in shapes(&keys, |v| v.sort()) {
                let tagged: Vec<(u32, usize)> = keys.iter().copied().zip(0..).collect();
                let mut want = tagged.clone();
                want.sort_by(|a, b| a.0.cmp(&b.0));
                let mut got = tagged.clone();
                by(&mut got, |a, b| a.0.cmp(&b.0));
                assert_eq!(got, want, "n = {n}");
                want.sort_by(|a, b| b.0.cmp(&a.0));
                by(&mut got, |a, b| b.0.cmp(&a.0));
                assert_eq!(got, want, "n = {n}, descending");
                let mut want: Vec<usize> = (0..n).collect();
                want.sort_by(|a, b| keys[*a].cmp(&keys[*b]));
                assert_eq!(order(n, &mut |a, b| keys[a].cmp(&keys[b])), want, "n = {n}, order");
            }
        }
    }

    // Against `slice::sort_by(f64::total_cmp)` (Rust std 1.95): NaN of
    // both signs, -0.0 and 0.0, infinities, subnormals, random bit patterns
    // and many ties; compared bit for bit.
    #[test]
    fn f64s_match_std_total_cmp() {
        let mut r = Rng::new(2);
        let bits = |v: &[f64]| v.iter().map(|x| x.to_bits()).collect::<Vec<_>>();
        for n in lengths() {
            let xs: Vec<f64> = (0..n).map(|_| r.float()).collect();
            for xs in shapes(&xs, |v| v.sort_by(f64::total_cmp)) {
                let mut want = xs.clone();
                want.sort_by(f64::total_cmp);
                let mut got = xs.clone();
                f64s(&mut got);
                assert_eq!(bits(&got), bits(&want), "n = {n}");
            }
        }
    }

    // by_x and by_f64_key are stable: against `slice::sort_by` (Rust std
    // 1.95) with `total_cmp` on the key, each element tagged with its
    // position.
    #[test]
    fn points_and_f64_keys_match_std_sort_by() {
        let mut r = Rng::new(3);
        for n in lengths() {
            let xs: Vec<f64> = (0..n).map(|_| r.float()).collect();
            for xs in shapes(&xs, |v| v.sort_by(f64::total_cmp)) {
                let pts: Vec<(f64, f64)> = xs.iter().enumerate().map(|(i, x)| (*x, i as f64)).collect();
                let mut want = pts.clone();
                want.sort_by(|a, b| a.0.total_cmp(&b.0));
                let tags = |v: &[(f64, f64)]| v.iter().map(|p| (p.0.to_bits(), p.1 as usize)).collect::<Vec<_>>();
                let mut got = pts.clone();
                by_x(&mut got);
                assert_eq!(tags(&got), tags(&want), "n = {n}, by_x");
                let mut got: Vec<(usize, f64)> = pts.iter().map(|p| (p.1 as usize, p.0)).collect();
                by_f64_key(&mut got, |p| p.1);
                assert_eq!(got.iter().map(|p| p.0).collect::<Vec<_>>(), want.iter().map(|p| p.1 as usize).collect::<Vec<_>>(), "n = {n}, by_f64_key");
            }
        }
    }

    // Against `slice::sort` (Rust std 1.95), with values over the whole
    // range of positions (below 2^53) so that every digit takes part.
    #[test]
    fn usizes_match_std_sort() {
        let mut r = Rng::new(4);
        for n in lengths() {
            let v: Vec<usize> = (0..n).map(|i| if i % 3 == 0 { r.below(5) as usize } else { (r.next() >> 11) as usize }).collect();
            for v in shapes(&v, |v| v.sort()) {
                let mut want = v.clone();
                want.sort();
                let mut got = v.clone();
                usizes(&mut got);
                assert_eq!(got, want, "n = {n}");
            }
        }
    }

    #[test]
    fn total_key_orders_like_total_cmp() {
        let xs = [-f64::NAN, f64::NEG_INFINITY, -1.0, -5e-324, -0.0, 0.0, 5e-324, 1.0, f64::INFINITY, f64::NAN];
        for a in xs {
            for b in xs {
                assert_eq!(total_key(a).cmp(&total_key(b)), a.total_cmp(&b), "{a:?} {b:?}");
            }
        }
    }
}
