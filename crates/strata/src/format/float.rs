//! The engine's one float printer.
//!
//! Every f64 the engine writes as text goes through here instead of core's
//! `Display`/`LowerExp` for f64, so that core's float formatting (`flt2dec`:
//! Grisu, Dragon and their big-number code) stays out of the page module.
//! The shortest digits come from `zmij` (already in the module: serde_json
//! writes its floats with it); fixed decimals are exact integer arithmetic.
//! The text is byte for byte what Rust's `{}` and `{:.N}` write; the tests
//! below check that against Rust std's formatting as the reference on large
//! random samples and on edge cases.

use std::fmt;

/// The shortest decimal that reads back as |v| (finite v): its digits
/// (no leading or trailing zeros; empty for zero) and the position of the
/// decimal point, so that |v| = 0.d1d2d3... × 10^point.
pub fn shortest(v: f64) -> (Vec<u8>, i32) {
    if !v.is_finite() {
        return (Vec::new(), 0);
    }
    let mut buf = zmij::Buffer::new();
    let s = buf.format_finite(v.abs());
    let (mant, exp) = s.split_once(['e', 'E']).unwrap_or((s, "0"));
    let exp: i32 = exp.trim_start_matches('+').parse().unwrap_or(0);
    let mut digits = Vec::with_capacity(17);
    // Digits before the point (leading zeros not kept), then after it.
    let mut point = exp;
    let mut after = false;
    for b in mant.bytes() {
        match b {
            b'0' if digits.is_empty() => point -= i32::from(after),
            b'0'..=b'9' => {
                digits.push(b - b'0');
                point += i32::from(!after);
            }
            b'.' => after = true,
            _ => {}
        }
    }
    while digits.last() == Some(&0) {
        digits.pop();
    }
    if digits.is_empty() {
        return (digits, 0);
    }
    // When |v| lies exactly halfway between two shortest candidates, zmij
    // takes the even one and Rust's `{}` the upper one: take the upper one.
    if halfway_above(v.abs(), &digits, point) {
        // Add one unit in the last place; trailing nines carry.
        while digits.last() == Some(&9) {
            digits.pop();
        }
        match digits.last_mut() {
            Some(d) => *d += 1,
            None => {
                digits.push(1);
                point += 1;
            }
        }
    }
    (digits, point)
}

/// Whether finite v > 0 is exactly 0.d1...dn5 × 10^point.
fn halfway_above(v: f64, digits: &[u8], point: i32) -> bool {
    let bits = v.to_bits();
    let exp_bits = ((bits >> 52) & 0x7ff) as i32;
    let frac = bits & ((1u64 << 52) - 1);
    let (m, e) = if exp_bits == 0 { (frac, -1074) } else { (frac | (1u64 << 52), exp_bits - 1075) };
    // w = d1...dn5 (odd), and v = m × 2^e should equal w × 10^-t.
    let w = digits.iter().fold(0u128, |a, d| a * 10 + *d as u128) * 10 + 5;
    let t = digits.len() as i32 + 1 - point;
    let tz = m.trailing_zeros() as i32;
    if tz + e + t != 0 || t.abs() > 60 {
        return false;
    }
    let (mut small, big) = if t >= 0 { ((m >> tz) as u128, w) } else { (w, (m >> tz) as u128) };
    // small × 5^|t| == big? (5^|t| ≤ 5^60 < 2^140 may overflow: then no.)
    for _ in 0..t.unsigned_abs() {
        if small > big {
            return false;
        }
        small *= 5;
    }
    small == big
}

/// An f64 written as Rust's `{}` writes it (shortest round-trip digits,
/// never an exponent, `-0` for negative zero, `NaN`, `inf`). Format it with
/// a plain `{}`: width, fill and precision flags are not supported.
#[derive(Clone, Copy, Debug)]
pub struct Plain(pub f64);

impl fmt::Display for Plain {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&plain(self.0))
    }
}

/// What `{}` and `{:.N}` write for NaN (`NaN`, no sign) and infinities
/// (`inf`, `-inf`): true when `out` holds the whole text; otherwise `out`
/// holds the sign of a finite `v`.
fn sign_or_special(v: f64, out: &mut String) -> bool {
    if v.is_nan() {
        out.push_str("NaN");
        return true;
    }
    if v.is_sign_negative() {
        out.push('-');
    }
    if v.is_infinite() {
        out.push_str("inf");
        return true;
    }
    false
}

/// `format!("{v}")` for an f64, without core's float formatting.
pub fn plain(v: f64) -> String {
    let mut out = String::new();
    if sign_or_special(v, &mut out) {
        return out;
    }
    let (digits, point) = shortest(v);
    if digits.is_empty() {
        out.push('0');
        return out;
    }
    let digit = |d: &u8| (b'0' + d) as char;
    if point <= 0 {
        out.push_str("0.");
        for _ in 0..-point {
            out.push('0');
        }
        for d in &digits {
            out.push(digit(d));
        }
    } else {
        let p = point as usize;
        for i in 0..p.max(digits.len()) {
            if i == p {
                out.push('.');
            }
            out.push(digits.get(i).map_or('0', digit));
        }
    }
    out
}

/// `format!("{v:.decimals$}")` for an f64: the exact binary value rounded
/// to `decimals` places (ties to even), without core's float formatting.
/// `decimals` is at most 20 (larger asks are treated as 20).
pub fn fixed(v: f64, decimals: usize) -> String {
    let p = decimals.min(20);
    let mut out = String::new();
    if sign_or_special(v, &mut out) {
        return out;
    }
    // |v| = m × 2^e exactly, m < 2^53.
    let bits = v.to_bits();
    let exp_bits = ((bits >> 52) & 0x7ff) as i32;
    let frac = bits & ((1u64 << 52) - 1);
    let (m, e) = if exp_bits == 0 { (frac, -1074) } else { (frac | (1u64 << 52), exp_bits - 1075) };
    // |v| × 10^p rounded, as decimal digits (p ≤ 20: m × 10^p < 2^53 × 2^67 = 2^120).
    let n = m as u128 * 10u128.pow(p as u32);
    let mut digits = if e >= 0 {
        big_decimal(n, e as u32)
    } else {
        let s = (-e) as u32;
        let q = if s >= 128 {
            // n < 2^120 ≤ half of 2^s: rounds to 0.
            0
        } else {
            let q = n >> s;
            let r = n & ((1u128 << s) - 1);
            let half = 1u128 << (s - 1);
            if r > half || (r == half && q & 1 == 1) {
                q + 1
            } else {
                q
            }
        };
        big_decimal(q, 0)
    };
    if digits.len() <= p {
        digits = "0".repeat(p + 1 - digits.len()) + &digits;
    }
    let (int, fraction) = digits.split_at(digits.len() - p);
    out.push_str(int);
    if p > 0 {
        out.push('.');
        out.push_str(fraction);
    }
    out
}

/// n × 2^shift in decimal (n < 2^120), with a small big number when it
/// leaves u128.
fn big_decimal(n: u128, shift: u32) -> String {
    if n == 0 {
        return "0".into();
    }
    // Little-endian base-2^32 limbs.
    let mut limbs: Vec<u32> = (0..4).map(|i| (n >> (32 * i)) as u32).collect();
    for _ in 0..shift {
        let mut carry = 0;
        for l in limbs.iter_mut() {
            let next = *l >> 31;
            *l = (*l << 1) | carry;
            carry = next;
        }
        if carry != 0 {
            limbs.push(carry);
        }
    }
    // Base-10^9 chunks, least significant first.
    let mut chunks = Vec::new();
    while limbs.iter().any(|l| *l != 0) {
        let mut rem = 0u64;
        for l in limbs.iter_mut().rev() {
            let cur = (rem << 32) | *l as u64;
            *l = (cur / 1_000_000_000) as u32;
            rem = cur % 1_000_000_000;
        }
        while limbs.last() == Some(&0) {
            limbs.pop();
        }
        chunks.push(rem as u32);
    }
    let mut out = chunks.pop().unwrap_or(0).to_string();
    for c in chunks.iter().rev() {
        let s = c.to_string();
        out.push_str(&"000000000"[s.len()..]);
        out.push_str(&s);
    }
    out
}

// ---------------------------------------------------------------- parsing

/// Significant digits kept; a longer number keeps a sticky `1` after them.
/// The exact halfway points between two f64 have at most 767 significant
/// digits, so the rounding is unchanged.
const KEEP_DIGITS: usize = 800;

/// `s.parse::<f64>()` as Rust's core does it (the same strings accepted,
/// the same correctly rounded result), without core's `dec2flt` and its
/// power-of-five table: `[+-]` then `inf`, `infinity`, `nan` (any case) or
/// digits with an optional `.` and an optional exponent `e[+-]digits`.
/// Short numbers take the exact fast path (Clinger 1990: at most 15 digits
/// and a power of ten up to 22, both exact in f64); up to 19 digits with a
/// power of ten up to 21 are rounded from the exact ratio in u128 (the
/// full-precision numbers of exported data stay fast); the rest from the
/// exact ratio in big-number arithmetic.
pub fn parse(s: &str) -> Option<f64> {
    let b = s.as_bytes();
    let (neg, b) = match b.first()? {
        b'-' => (true, &b[1..]),
        b'+' => (false, &b[1..]),
        _ => (false, b),
    };
    if b.is_empty() {
        return None;
    }
    let v = match decimal(b) {
        Some(v) => v,
        None if b.eq_ignore_ascii_case(b"inf") || b.eq_ignore_ascii_case(b"infinity") => f64::INFINITY,
        None if b.eq_ignore_ascii_case(b"nan") => f64::NAN,
        None => return None,
    };
    Some(if neg { -v } else { v })
}

/// An unsigned decimal, the whole of `b`.
fn decimal(b: &[u8]) -> Option<f64> {
    let mut acc = Digits { w: 0, count: 0, more: Vec::new(), exp: 0, dropped: false };
    let mut any = false;
    let mut i = 0;
    while i < b.len() && b[i].is_ascii_digit() {
        acc.push(b[i] - b'0');
        any = true;
        i += 1;
    }
    if i < b.len() && b[i] == b'.' {
        i += 1;
        while i < b.len() && b[i].is_ascii_digit() {
            acc.exp -= 1;
            acc.push(b[i] - b'0');
            any = true;
            i += 1;
        }
    }
    if !any {
        return None;
    }
    if i < b.len() && (b[i] == b'e' || b[i] == b'E') {
        i += 1;
        let neg = i < b.len() && b[i] == b'-';
        if i < b.len() && (b[i] == b'-' || b[i] == b'+') {
            i += 1;
        }
        let start = i;
        let mut e: i64 = 0;
        while i < b.len() && b[i].is_ascii_digit() {
            // Saturates: any exponent this large over- or underflows.
            e = (e * 10 + (b[i] - b'0') as i64).min(1 << 20);
            i += 1;
        }
        if i == start {
            return None;
        }
        acc.exp += if neg { -e } else { e };
    }
    if i != b.len() {
        return None;
    }
    let Digits { mut w, count, more: mut digits, mut exp, dropped } = acc;
    if count > SHORT_DIGITS {
        if dropped {
            digits.push(1);
            exp -= 1;
        }
        while digits.last() == Some(&0) {
            digits.pop();
            exp += 1;
        }
        let n = digits.len() as i64;
        if n + exp < -330 {
            return Some(0.0);
        }
        if n + exp > 310 {
            return Some(f64::INFINITY);
        }
        return Some(slow(&digits, exp as i32));
    }
    if w == 0 {
        return Some(0.0);
    }
    while w % 10 == 0 {
        w /= 10;
        exp += 1;
    }
    let mut n = 1;
    while n < 20 && w >= 10u64.pow(n as u32) {
        n += 1;
    }
    if n + exp < -330 {
        return Some(0.0);
    }
    if n + exp > 310 {
        return Some(f64::INFINITY);
    }
    if n <= 15 && exp.abs() <= 22 {
        let m = w as f64;
        let p = POW10[exp.unsigned_abs() as usize];
        return Some(if exp < 0 { m / p } else { m * p });
    }
    if (-21..=19).contains(&exp) {
        // Up to 19 digits (below 2^64) and 10^±21 at most: the exact ratio
        // fits u128 with at least 55 bits of quotient.
        let (q, sticky, k) = if exp >= 0 {
            (w as u128 * 10u128.pow(exp as u32), false, 0)
        } else {
            let s = 64 + w.leading_zeros();
            let num = (w as u128) << s;
            let p = 10u128.pow(exp.unsigned_abs() as u32);
            (num / p, !num.is_multiple_of(p), s as i32)
        };
        // To exactly 64 bits (value = q × 2^-k).
        let len = 128 - q.leading_zeros() as i32;
        let (q, sticky, k) = if len > 64 {
            let sh = len - 64;
            (q >> sh, sticky || q & ((1u128 << sh) - 1) != 0, k - sh)
        } else {
            (q << (64 - len), sticky, k + 64 - len)
        };
        return Some(round_bits(q as u64, sticky, k));
    }
    let digits: Vec<u8> = w.to_string().bytes().map(|c| c - b'0').collect();
    Some(slow(&digits, exp as i32))
}

/// Significant digits read so far: up to [`SHORT_DIGITS`] in `w`; past
/// that all of them in `more` (up to [`KEEP_DIGITS`], then only whether a
/// dropped one was nonzero); `exp` the power of ten of the last kept one.
struct Digits {
    w: u64,
    count: usize,
    more: Vec<u8>,
    exp: i64,
    dropped: bool,
}

/// Digits that fit u64 (10^19 < 2^64).
const SHORT_DIGITS: usize = 19;

impl Digits {
    fn push(&mut self, d: u8) {
        if self.count == 0 && d == 0 {
            return;
        }
        self.count += 1;
        if self.count <= SHORT_DIGITS {
            self.w = self.w * 10 + d as u64;
            return;
        }
        if self.more.is_empty() {
            self.more = self.w.to_string().bytes().map(|c| c - b'0').collect();
        }
        if self.more.len() < KEEP_DIGITS {
            self.more.push(d);
        } else {
            self.exp += 1;
            self.dropped |= d != 0;
        }
    }
}

/// 10^0 ..= 10^22, each exact in f64.
const POW10: [f64; 23] = [1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/// digits × 10^exp correctly rounded (ties to even): the quotient of the
/// exact numerator and denominator scaled to 55 or 56 bits, plus a sticky bit.
fn slow(digits: &[u8], exp: i32) -> f64 {
    let mut num = Big(vec![]);
    for d in digits {
        num.mul_add(10, *d as u32);
    }
    let mut den = Big(vec![1]);
    for _ in 0..exp.unsigned_abs() {
        if exp > 0 {
            num.mul_add(10, 0)
        } else {
            den.mul_add(10, 0)
        }
    }
    // num / den × 2^k lies in (2^54, 2^56).
    let k = 55 - (num.bits() as i32 - den.bits() as i32);
    if k > 0 {
        num.shl(k as u32);
    } else {
        den.shl((-k) as u32);
    }
    den.shl(56);
    let mut q: u64 = 0;
    for bit in (0..=56).rev() {
        if !num.less_than(&den) {
            num.sub(&den);
            q |= 1 << bit;
        }
        den.shr1();
    }
    let sticky = !num.0.iter().all(|l| *l == 0);
    round_bits(q, sticky, k)
}

/// (q + a nonzero fraction if `sticky`) × 2^-k to the nearest f64, ties to
/// even, for q of 55 to 64 bits.
fn round_bits(q: u64, sticky: bool, k: i32) -> f64 {
    // Keep 53 bits, or fewer where the result is subnormal (lowest bit 2^-1074).
    let len = 64 - q.leading_zeros() as i32;
    let mut drop = (len - 53).max(k - 1074);
    if drop > 57 {
        return 0.0;
    }
    let mut mant = q >> drop;
    let rest = q & ((1u64 << drop) - 1);
    let half = 1u64 << (drop - 1);
    if rest > half || (rest == half && (sticky || mant & 1 == 1)) {
        mant += 1;
    }
    if mant < 1 << 52 {
        // Subnormal (drop - k = -1074): the bits are the mantissa.
        return f64::from_bits(mant);
    }
    if mant == 1 << 53 {
        mant >>= 1;
        drop += 1;
    }
    let biased = drop - k + 52 + 1023;
    if biased >= 2047 {
        return f64::INFINITY;
    }
    f64::from_bits(((biased as u64) << 52) | (mant & ((1u64 << 52) - 1)))
}

/// A natural number in little-endian base-2^32 limbs, no high zero limbs.
struct Big(Vec<u32>);

impl Big {
    fn mul_add(&mut self, m: u32, a: u32) {
        let mut carry = a as u64;
        for l in self.0.iter_mut() {
            let x = *l as u64 * m as u64 + carry;
            *l = x as u32;
            carry = x >> 32;
        }
        if carry != 0 {
            self.0.push(carry as u32);
        }
    }
    fn bits(&self) -> u32 {
        self.0.last().map_or(0, |l| 32 * self.0.len() as u32 - l.leading_zeros())
    }
    fn shl(&mut self, n: u32) {
        let (limbs, bits) = ((n / 32) as usize, n % 32);
        if bits > 0 {
            let mut carry = 0;
            for l in self.0.iter_mut() {
                let next = *l >> (32 - bits);
                *l = (*l << bits) | carry;
                carry = next;
            }
            if carry != 0 {
                self.0.push(carry);
            }
        }
        if limbs > 0 {
            let mut v = vec![0; limbs];
            v.extend_from_slice(&self.0);
            self.0 = v;
        }
    }
    fn shr1(&mut self) {
        let mut carry = 0;
        for l in self.0.iter_mut().rev() {
            let next = *l & 1;
            *l = (*l >> 1) | (carry << 31);
            carry = next;
        }
        self.trim();
    }
    fn trim(&mut self) {
        while self.0.last() == Some(&0) {
            self.0.pop();
        }
    }
    fn less_than(&self, o: &Big) -> bool {
        if self.0.len() != o.0.len() {
            return self.0.len() < o.0.len();
        }
        for i in (0..self.0.len()).rev() {
            if self.0[i] != o.0[i] {
                return self.0[i] < o.0[i];
            }
        }
        false
    }
    /// self -= o, for self >= o.
    fn sub(&mut self, o: &Big) {
        let mut borrow = 0i64;
        for (i, l) in self.0.iter_mut().enumerate() {
            let x = *l as i64 - o.0.get(i).copied().unwrap_or(0) as i64 - borrow;
            borrow = (x < 0) as i64;
            *l = x.rem_euclid(1 << 32) as u32;
        }
        self.trim();
    }
}

#[cfg(test)]
mod tests {
    //! Reference: Rust std's formatting (`{}`, `{:.N}`, `{:e}` of f64), which
    //! the tests may use (std is there natively); the page module must not.
    use super::*;

    /// A small deterministic generator: the engine's own SplitMix64
    /// (stat::rng; Steele, Lea and Flood 2014).
    struct Mix(crate::stat::rng::SplitMix64);
    impl Mix {
        fn new(seed: u64) -> Self {
            Mix(crate::stat::rng::SplitMix64::new(seed))
        }
        fn next(&mut self) -> u64 {
            self.0.next_u64()
        }
        /// Any f64 bit pattern, or a "chart-like" number: a few digits at some scale.
        fn value(&mut self) -> f64 {
            let r = self.next();
            match r % 4 {
                0 => f64::from_bits(self.next()),
                1 => (self.next() % 2_000_001) as f64 / 100.0 - 10_000.0,
                2 => (self.next() % 1_000_000) as f64 * 10f64.powi((self.next() % 40) as i32 - 20),
                _ => (self.next() as i64 as f64) / (1u64 << (self.next() % 64)) as f64,
            }
        }
    }

    fn edges() -> Vec<f64> {
        let mut v = vec![
            0.0,
            -0.0,
            f64::NAN,
            f64::INFINITY,
            f64::NEG_INFINITY,
            f64::MIN_POSITIVE,
            f64::MAX,
            f64::MIN,
            f64::EPSILON,
            5e-324,
            -5e-324,
            1e-7,
            1e15,
            1e16,
            1e17,
            1e21,
            1e22,
            1e23,
            9007199254740992.0,
            9007199254740993.0,
            0.1,
            0.2,
            0.3,
            0.125,
            0.375,
            2.5,
            0.5,
            1.5,
            -0.5,
            -0.004,
            -0.005,
            0.005,
            0.015,
            0.025,
            1.005,
            123456789.125,
            3.4e38,
            3.5e38,
            1e300,
        ];
        for k in -30..30 {
            v.push(10f64.powi(k));
            v.push(-(10f64.powi(k)) * 1.5);
            v.push((k as f64 + 0.5) / 100.0);
            v.push((k as f64) + 0.125);
        }
        v
    }

    fn same(v: f64) {
        assert_eq!(plain(v), format!("{v}"), "{{}} of {:e} ({:#x})", v, v.to_bits());
        assert_eq!(Plain(v).to_string(), format!("{v}"));
        for p in 0..=20 {
            assert_eq!(fixed(v, p), format!("{v:.p$}"), "{{:.{p}}} of {:e} ({:#x})", v, v.to_bits());
        }
        if v.is_finite() {
            let (digits, point) = shortest(v);
            let mut want = Vec::new();
            let s = format!("{:e}", v.abs());
            let (mant, exp) = s.split_once('e').unwrap();
            want.extend(mant.bytes().filter(u8::is_ascii_digit).map(|b| b - b'0'));
            let mut point_want = exp.parse::<i32>().unwrap() + 1;
            while want.last() == Some(&0) {
                want.pop();
            }
            if want.is_empty() {
                point_want = 0;
            }
            assert_eq!((digits, point), (want, point_want), "shortest of {v:e}");
        }
    }

    #[test]
    fn edge_cases_match_std() {
        for v in edges() {
            same(v);
        }
    }

    #[test]
    fn random_values_match_std() {
        let mut g = Mix::new(0x5eed_1234);
        for _ in 0..200_000 {
            same(g.value());
        }
    }

    /// Reference: CPython's float() (correctly rounded), by the committed
    /// script tests/reference/gen/float_parse.py.
    #[test]
    fn parse_matches_python_float_on_hard_cases() {
        let cases: Vec<(String, String)> = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/parse/floats.json")).unwrap();
        assert!(cases.len() > 500);
        for (text, bits) in cases {
            let want = u64::from_str_radix(&bits, 16).unwrap();
            let got = parse(&text).unwrap_or_else(|| panic!("{text} not read"));
            assert_eq!(got.to_bits(), want, "{text}");
        }
    }

    /// Reference: Rust std's `str::parse::<f64>`, for which strings it takes
    /// and for the value, on random strings over the grammar's letters.
    #[test]
    fn parse_matches_std_on_random_strings() {
        let mut g = Mix::new(0xfeed_beef);
        let letters = b"0123456789000011111999..eE+-+-infatyINFATYx ";
        for round in 0..300_000 {
            let len = (g.next() % if round % 2 == 0 { 8 } else { 30 }) as usize;
            let s: String = (0..len).map(|_| letters[(g.next() % letters.len() as u64) as usize] as char).collect();
            check_parse(&s);
        }
        // Well-formed numbers of every size, and the formats the engine writes.
        for _ in 0..300_000 {
            let v = g.value();
            let digits = (g.next() % 25) as usize;
            for s in [format!("{v:.digits$e}"), format!("{v}"), format!("{v:.digits$}"), format!("{}e{}", g.next() % 100_000, (g.next() % 700) as i64 - 350)] {
                check_parse(&s);
            }
        }
        for s in ["", "+", "-", ".", "e5", "1e", "1e+", "-.5", "+.5e-3", "inf", "-Infinity", "NaN", "-nan", "infinit", "1_0", " 1", "1 ", "0x10"] {
            check_parse(s);
        }
        let long = format!("0.{}1e1", "0".repeat(900));
        check_parse(&long);
        check_parse(&format!("{}e-1000", "9".repeat(1200)));
        check_parse("1e99999999999999999999");
        check_parse("0e99999999999999999999");
        check_parse("1e-99999999999999999999");
    }

    fn check_parse(s: &str) {
        let want = s.parse::<f64>().ok().map(f64::to_bits);
        assert_eq!(parse(s).map(f64::to_bits), want, "{s:?}");
    }

    #[test]
    fn ties_round_to_even_as_std_does() {
        // Exact binary ties at every decimal place up to 6: k/2^j.
        for j in 1..=20 {
            for k in -300i64..300 {
                same(k as f64 / (1u64 << j) as f64);
            }
        }
    }
}
