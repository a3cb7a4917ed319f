//! Labels for numbers and dates: Unicode LDML (UTS #35) number and date
//! patterns with CLDR locale data for en, de, fr, es and pl.
//!
//! * Number patterns: `#,##0.0`, `0%`, `¤#,##0.00`, `#,##0;(#,##0)`,
//!   quoted literals (`#,##0 'kg'`), and the word `compact` for short
//!   CLDR forms such as `1.2K` or `2,5 Mio.`.
//! * Date patterns: `yyyy-MM-dd`, `MMM yyyy`, `d. MMMM y`, `EEE`, `HH:mm`,
//!   `h:mm a`, `QQQ`, `LLL` (stand-alone month), quoted literals.
//!
//! Rounding follows LDML's default, half-even, applied to the shortest
//! decimal representation of the number (the digits a person would type),
//! as Python babel does; checked against babel in the tests below.

pub mod float;
mod locales;

use crate::calendar::civil_from_days;

/// The widest field of a pattern: a run of one letter (`yyyy`), or digits (`0`, `#`).
pub const MAX_FIELD_WIDTH: usize = 32;

/// CLDR data for one locale (see `locales.rs`, generated from babel).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Locale {
    pub code: &'static str,
    pub decimal: &'static str,
    pub group: &'static str,
    pub minus: &'static str,
    pub percent: &'static str,
    pub permille: &'static str,
    /// Symbol that `¤` stands for: the locale's usual currency.
    pub currency: &'static str,
    pub months_wide: [&'static str; 12],
    pub months_short: [&'static str; 12],
    pub months_wide_alone: [&'static str; 12],
    pub months_short_alone: [&'static str; 12],
    /// Monday first.
    pub days_wide: [&'static str; 7],
    pub days_short: [&'static str; 7],
    pub quarters_short: [&'static str; 4],
    pub am_pm: [&'static str; 2],
    /// Short compact patterns by power of ten (CLDR `decimalFormats-numberSystem-latn/short`, plural "other").
    pub compact: &'static [(u32, &'static str)],
    /// The locale's pattern for a day and an abbreviated month (CLDR skeleton `MMMd`).
    pub day_month: &'static str,
    /// CLDR `minimumGroupingDigits`: the integer part is grouped only when it
    /// has at least this many digits beyond the first group (es: 2, so `1234`
    /// but `12.345`).
    pub min_grouping: usize,
}

/// Locale data for a BCP 47 tag; the language subtag decides (`de-AT` is
/// `de`). Unknown languages fall back to `en`.
pub fn locale(tag: &str) -> &'static Locale {
    let lang = tag.split(['-', '_']).next().unwrap_or("").to_ascii_lowercase();
    locales::LOCALES.iter().find(|l| l.code == lang).unwrap_or(&locales::LOCALES[0])
}

/// Is this locale tag one Strata has data for?
pub fn is_known_locale(tag: &str) -> bool {
    let lang = tag.split(['-', '_']).next().unwrap_or("").to_ascii_lowercase();
    locales::LOCALES.iter().any(|l| l.code == lang)
}

pub fn english() -> &'static Locale {
    &locales::LOCALES[0]
}

// ---------------------------------------------------------------- decimals

/// A non-negative decimal: `digits` with the point after `point` of them
/// (`point` may be negative or beyond the digits).
#[derive(Debug, Clone, PartialEq)]
struct Dec {
    digits: Vec<u8>,
    point: i32,
}

impl Dec {
    /// The shortest decimal that reads back as |v| (what Python's `str` gives).
    fn from_f64(v: f64) -> Dec {
        let (digits, point) = float::shortest(v);
        Dec { digits, point }
    }

    fn is_zero(&self) -> bool {
        self.digits.iter().all(|d| *d == 0)
    }

    fn trim(&mut self) {
        while self.digits.last() == Some(&0) {
            self.digits.pop();
        }
        while self.digits.first() == Some(&0) {
            self.digits.remove(0);
            self.point -= 1;
        }
        if self.digits.is_empty() {
            self.point = 0;
        }
    }

    /// Multiply by 10^k (exact).
    fn shift(&mut self, k: i32) {
        if !self.digits.is_empty() {
            self.point += k;
        }
    }

    /// Round half-even to `frac` decimals.
    fn round(&mut self, frac: i32) {
        let keep = self.point + frac;
        if keep < 0 {
            self.digits.clear();
            self.point = 0;
            return;
        }
        let keep = keep as usize;
        if keep >= self.digits.len() {
            return;
        }
        let first = self.digits[keep];
        let rest_nonzero = self.digits[keep + 1..].iter().any(|d| *d != 0);
        let prev_odd = keep > 0 && self.digits[keep - 1] % 2 == 1;
        let up = first > 5 || (first == 5 && (rest_nonzero || prev_odd));
        self.digits.truncate(keep);
        if up {
            let mut i = keep;
            loop {
                if i == 0 {
                    self.digits.insert(0, 1);
                    self.point += 1;
                    break;
                }
                i -= 1;
                if self.digits[i] == 9 {
                    self.digits[i] = 0;
                } else {
                    self.digits[i] += 1;
                    break;
                }
            }
        }
        self.trim();
    }

    /// Integer digits (at least one, "0") and all fraction digits.
    fn split(&self) -> (String, String) {
        let mut int = String::new();
        let mut frac = String::new();
        if self.point > 0 {
            for i in 0..self.point as usize {
                int.push((b'0' + self.digits.get(i).copied().unwrap_or(0)) as char);
            }
        }
        if self.point < 0 {
            for _ in 0..(-self.point) {
                frac.push('0');
            }
        }
        let start = self.point.max(0) as usize;
        for d in self.digits.iter().skip(start) {
            frac.push((b'0' + d) as char);
        }
        (int, frac)
    }
}

// ---------------------------------------------------------------- number patterns

#[derive(Debug, Clone, PartialEq)]
enum Affix {
    Text(String),
    Percent,
    Permille,
    Currency,
    Minus,
}

/// A parsed LDML number pattern.
#[derive(Debug, Clone, PartialEq)]
pub struct NumberPattern {
    pos_prefix: Vec<Affix>,
    pos_suffix: Vec<Affix>,
    neg: Option<(Vec<Affix>, Vec<Affix>)>,
    min_int: usize,
    min_frac: usize,
    max_frac: usize,
    group: Option<(usize, usize)>,
    /// Power of ten the value is multiplied by (2 for `%`, 3 for `‰`).
    scale: i32,
}

fn parse_affix(s: &str) -> Vec<Affix> {
    let mut out = Vec::new();
    let mut text = String::new();
    let mut chars = s.chars().peekable();
    let flush = |text: &mut String, out: &mut Vec<Affix>| {
        if !text.is_empty() {
            out.push(Affix::Text(std::mem::take(text)));
        }
    };
    while let Some(c) = chars.next() {
        match c {
            '\'' => {
                if chars.peek() == Some(&'\'') {
                    chars.next();
                    text.push('\'');
                    continue;
                }
                while let Some(q) = chars.next() {
                    if q == '\'' {
                        if chars.peek() == Some(&'\'') {
                            chars.next();
                            text.push('\'');
                            continue;
                        }
                        break;
                    }
                    text.push(q);
                }
            }
            '%' => {
                flush(&mut text, &mut out);
                out.push(Affix::Percent);
            }
            '\u{2030}' => {
                flush(&mut text, &mut out);
                out.push(Affix::Permille);
            }
            '\u{a4}' => {
                flush(&mut text, &mut out);
                out.push(Affix::Currency);
            }
            '-' => {
                flush(&mut text, &mut out);
                out.push(Affix::Minus);
            }
            c => text.push(c),
        }
    }
    flush(&mut text, &mut out);
    out
}

/// Split one sub-pattern into prefix, number part, suffix (outside quotes).
fn split_sub(s: &str) -> (String, String, String) {
    let mut prefix = String::new();
    let mut number = String::new();
    let mut suffix = String::new();
    let mut stage = 0;
    let mut quoted = false;
    for c in s.chars() {
        if c == '\'' {
            quoted = !quoted;
        }
        let numeric = !quoted && matches!(c, '#' | '0'..='9' | ',' | '.');
        match stage {
            0 if numeric => {
                stage = 1;
                number.push(c);
            }
            0 => prefix.push(c),
            1 if numeric => number.push(c),
            1 => {
                stage = 2;
                suffix.push(c);
            }
            _ => suffix.push(c),
        }
    }
    (prefix, number, suffix)
}

fn split_unquoted(s: &str, sep: char) -> Vec<&str> {
    let mut parts = Vec::new();
    let mut quoted = false;
    let mut start = 0;
    for (i, c) in s.char_indices() {
        if c == '\'' {
            quoted = !quoted;
        } else if c == sep && !quoted {
            parts.push(&s[start..i]);
            start = i + c.len_utf8();
        }
    }
    parts.push(&s[start..]);
    parts
}

impl NumberPattern {
    /// Parse an LDML number pattern; `None` when it has no digits.
    pub fn parse(pattern: &str) -> Option<NumberPattern> {
        let subs = split_unquoted(pattern, ';');
        let (pre, num, suf) = split_sub(subs[0]);
        if !num.contains(['0', '#']) {
            return None;
        }
        let (int, frac) = match num.split_once('.') {
            Some((i, f)) => (i, f),
            None => (num.as_str(), ""),
        };
        // Field widths capped at the spec's bound (`MAX_FIELD_WIDTH`, which the spec's guard also checks): a
        // width past 65,535 makes `format!` panic.
        let cap = MAX_FIELD_WIDTH;
        let min_int = int.chars().filter(|c| c.is_ascii_digit()).count().min(cap);
        let min_frac = frac.chars().filter(|c| c.is_ascii_digit()).count().min(cap);
        let max_frac = frac.chars().filter(|c| c.is_ascii_digit() || *c == '#').count().min(cap);
        let group = {
            let commas: Vec<usize> = int.char_indices().filter(|(_, c)| *c == ',').map(|(i, _)| i).collect();
            match commas.last() {
                None => None,
                Some(&last) => {
                    let primary = int[last + 1..].chars().count();
                    let secondary = if commas.len() >= 2 { last - commas[commas.len() - 2] - 1 } else { primary };
                    (primary > 0).then_some((primary, secondary.max(1)))
                }
            }
        };
        let pos_prefix = parse_affix(&pre);
        let pos_suffix = parse_affix(&suf);
        let has = |a: &Affix| pos_prefix.contains(a) || pos_suffix.contains(a);
        let scale = if has(&Affix::Percent) {
            2
        } else if has(&Affix::Permille) {
            3
        } else {
            0
        };
        let neg = subs.get(1).map(|n| {
            let (p, _, s) = split_sub(n);
            (parse_affix(&p), parse_affix(&s))
        });
        Some(NumberPattern { pos_prefix, pos_suffix, neg, min_int, min_frac, max_frac, group, scale })
    }

    /// Format `v` in locale `loc`.
    pub fn format(&self, v: f64, loc: &Locale) -> String {
        if !v.is_finite() {
            return if v.is_nan() {
                "NaN".into()
            } else if v > 0.0 {
                "\u{221e}".into()
            } else {
                format!("{}\u{221e}", loc.minus)
            };
        }
        let mut d = Dec::from_f64(v);
        d.shift(self.scale);
        d.round(self.max_frac as i32);
        let negative = v < 0.0 && !d.is_zero();
        let body = self.digits(&d, loc);
        let affixes = |a: &[Affix]| -> String {
            a.iter()
                .map(|p| match p {
                    Affix::Text(t) => t.as_str(),
                    Affix::Percent => loc.percent,
                    Affix::Permille => loc.permille,
                    Affix::Currency => loc.currency,
                    Affix::Minus => loc.minus,
                })
                .collect()
        };
        match (&self.neg, negative) {
            (Some((p, s)), true) => format!("{}{}{}", affixes(p), body, affixes(s)),
            (None, true) => format!("{}{}{}{}", loc.minus, affixes(&self.pos_prefix), body, affixes(&self.pos_suffix)),
            _ => format!("{}{}{}", affixes(&self.pos_prefix), body, affixes(&self.pos_suffix)),
        }
    }

    fn digits(&self, d: &Dec, loc: &Locale) -> String {
        let (int, mut frac) = d.split();
        let mut int = int.trim_start_matches('0').to_string();
        while int.len() < self.min_int {
            int.insert(0, '0');
        }
        if int.is_empty() && frac.is_empty() {
            int.push('0');
        }
        while frac.len() > self.min_frac && frac.ends_with('0') {
            frac.pop();
        }
        while frac.len() < self.min_frac {
            frac.push('0');
        }
        let mut out = String::new();
        match self.group {
            Some((primary, secondary)) if int.len() >= primary + loc.min_grouping.max(1) => {
                let chars: Vec<char> = int.chars().collect();
                let mut cuts = Vec::new();
                let mut pos = chars.len() - primary;
                cuts.push(pos);
                while pos > secondary {
                    pos -= secondary;
                    cuts.push(pos);
                }
                for (i, c) in chars.iter().enumerate() {
                    if i > 0 && cuts.contains(&i) {
                        out.push_str(loc.group);
                    }
                    out.push(*c);
                }
            }
            _ => out.push_str(&int),
        }
        if !frac.is_empty() {
            out.push_str(loc.decimal);
            out.push_str(&frac);
        }
        out
    }
}

/// The locale's plain decimal pattern (CLDR `#,##0.###` for en, de, fr, es, pl).
const DECIMAL: &str = "#,##0.###";

/// Short compact form (CLDR "short" decimal formats), with up to
/// `fraction_digits` decimals, such as `1.2K`, `2,5 Mio.`, `15 k`.
pub fn compact(v: f64, fraction_digits: usize, loc: &Locale) -> String {
    if !v.is_finite() {
        return NumberPattern::parse(DECIMAL).map(|p| p.format(v, loc)).unwrap_or_default();
    }
    let mut mag: Option<(u32, &str)> = None;
    for (e, p) in loc.compact.iter().rev() {
        if v.abs() >= crate::math::powi(10.0, *e as i32) {
            mag = Some((*e, p));
            break;
        }
    }
    let Some((e, p)) = mag else {
        let pat = NumberPattern::parse(&format!("#,##0.{}", "#".repeat(fraction_digits))).expect("pattern");
        return pat.format(v, loc);
    };
    let zeros = p.chars().filter(|c| *c == '0').count() as i32;
    if p.trim() == "0" || zeros == 0 {
        // "0": the locale does not abbreviate at this magnitude.
        let pat = NumberPattern::parse(&format!("0.{}", "#".repeat(fraction_digits))).expect("pattern");
        return pat.format(v, loc);
    }
    let divisor_exp = e as i32 - (zeros - 1);
    let mut d = Dec::from_f64(v);
    d.shift(-divisor_exp);
    d.round(fraction_digits as i32);
    // Rounding can roll over into the next magnitude (999 999 -> 1M).
    let (int, _) = d.split();
    let int_len = int.trim_start_matches('0').len() as i32;
    if int_len > zeros && (e as usize) < loc.compact.last().map(|c| c.0 as usize).unwrap_or(0) {
        let scaled = if v < 0.0 { -1.0 } else { 1.0 } * crate::math::powi(10.0, e as i32 + 1);
        return compact(scaled, fraction_digits, loc);
    }
    let literal: String = {
        // Keep the pattern's affixes; replace its digits with the number.
        let (pre, _, suf) = split_sub(p);
        format!("{}\u{0}{}", pre, suf)
    };
    let num_pat = NumberPattern::parse(&format!("0.{}", "#".repeat(fraction_digits))).expect("pattern");
    let sign = if v < 0.0 && !d.is_zero() { loc.minus } else { "" };
    let body = num_pat.digits(&d, loc);
    let (pre, suf) = literal.split_once('\u{0}').unwrap_or(("", ""));
    let text = |s: &str| {
        parse_affix(s)
            .iter()
            .map(|a| match a {
                Affix::Text(t) => t.clone(),
                _ => String::new(),
            })
            .collect::<String>()
    };
    format!("{sign}{}{body}{}", text(pre), text(suf))
}

/// Format a number with an LDML pattern or the word `compact`; a pattern
/// that cannot be read falls back to the locale's decimal pattern.
pub fn number(v: f64, pattern: &str, loc: &Locale) -> String {
    if pattern == "compact" {
        return compact(v, 1, loc);
    }
    match NumberPattern::parse(pattern) {
        Some(p) => p.format(v, loc),
        None => NumberPattern::parse(DECIMAL).expect("pattern").format(v, loc),
    }
}

/// Decimals needed to write multiples of `step` exactly (at most 10).
pub fn step_decimals(step: f64) -> usize {
    if !(step.is_finite() && step > 0.0) {
        return 0;
    }
    for d in 0..=10 {
        let s = step * crate::math::powi(10.0, d);
        if (s - s.round()).abs() < 1e-6 * s.max(1.0) {
            return d as usize;
        }
    }
    10
}

/// The default label pattern for ticks `step` apart: grouping, and just as
/// many decimals as the step has, so labels never show false precision.
pub fn default_pattern(step: f64) -> String {
    let d = step_decimals(step);
    if d == 0 {
        "#,##0".to_string()
    } else {
        format!("#,##0.{}", "0".repeat(d))
    }
}

/// A tick label for `v` when ticks are `step` apart (English).
pub fn number_label(v: f64, step: f64, pattern: Option<&str>) -> String {
    let p = pattern.map(str::to_string).unwrap_or_else(|| default_pattern(step));
    number(v, &p, english())
}

/// A value label: up to six decimals, trailing zeros dropped (English).
pub fn value_label(v: f64) -> String {
    number(v, "#,##0.######", english())
}

/// A value label in a locale.
pub fn value_label_in(v: f64, loc: &Locale) -> String {
    number(v, "#,##0.######", loc)
}

// ---------------------------------------------------------------- dates

/// Calendar fields of a UTC instant.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Civil {
    pub year: i64,
    pub month: u32,
    pub day: u32,
    pub hour: u32,
    pub minute: u32,
    pub second: u32,
    pub millisecond: u32,
    /// 0 = Monday .. 6 = Sunday.
    pub weekday: u32,
}

pub fn civil(ms: f64) -> Civil {
    let ms = ms.round() as i64;
    let days = ms.div_euclid(86_400_000);
    let rem = ms.rem_euclid(86_400_000);
    let (year, month, day) = civil_from_days(days);
    // 1970-01-01 was a Thursday (weekday 3 when Monday is 0).
    let weekday = (days + 3).rem_euclid(7) as u32;
    Civil {
        year,
        month,
        day,
        hour: (rem / 3_600_000) as u32,
        minute: (rem / 60_000 % 60) as u32,
        second: (rem / 1000 % 60) as u32,
        millisecond: (rem % 1000) as u32,
        weekday,
    }
}

/// Zero-padded to `width` digits; the width is capped at the spec's field
/// bound (`MAX_FIELD_WIDTH`, which the spec's guard also checks), since `format!` panics past 65,535.
fn pad(n: i64, width: usize) -> String {
    let width = width.min(MAX_FIELD_WIDTH);
    if n < 0 {
        format!("-{:0width$}", -n, width = width)
    } else {
        format!("{:0width$}", n, width = width)
    }
}

/// Format milliseconds since 1970-01-01 UTC with an LDML date pattern.
pub fn date(ms: f64, pattern: &str, loc: &Locale) -> String {
    let c = civil(ms);
    let chars: Vec<char> = pattern.chars().collect();
    let mut out = String::new();
    let mut i = 0;
    while i < chars.len() {
        let ch = chars[i];
        if ch == '\'' {
            if chars.get(i + 1) == Some(&'\'') {
                out.push('\'');
                i += 2;
                continue;
            }
            i += 1;
            while i < chars.len() {
                if chars[i] == '\'' {
                    if chars.get(i + 1) == Some(&'\'') {
                        out.push('\'');
                        i += 2;
                        continue;
                    }
                    break;
                }
                out.push(chars[i]);
                i += 1;
            }
            i += 1;
            continue;
        }
        if !ch.is_ascii_alphabetic() {
            out.push(ch);
            i += 1;
            continue;
        }
        let mut n = 1;
        while i + n < chars.len() && chars[i + n] == ch {
            n += 1;
        }
        i += n;
        let m = (c.month - 1) as usize;
        let q = (c.month - 1) / 3;
        // Numbers: the value and its zero-padded width, written by one `pad`.
        let (v, width) = match ch {
            'y' | 'u' if n == 2 => (c.year.rem_euclid(100), 2),
            'y' | 'u' => (c.year, n),
            'M' | 'L' if n <= 2 => (c.month as i64, n),
            'd' => (c.day as i64, n.min(2)),
            'H' => (c.hour as i64, n.min(2)),
            'h' => ((if c.hour.is_multiple_of(12) { 12 } else { c.hour % 12 }) as i64, n.min(2)),
            'm' => (c.minute as i64, n.min(2)),
            's' => (c.second as i64, n.min(2)),
            'Q' | 'q' if n <= 2 => (q as i64 + 1, n),
            'S' => {
                let frac = pad(c.millisecond as i64, 3);
                out.push_str(&frac[..n.min(3)]);
                continue;
            }
            _ => {
                let word = match ch {
                    'M' if n == 3 => loc.months_short[m],
                    'L' if n == 3 => loc.months_short_alone[m],
                    'M' => loc.months_wide[m],
                    'L' => loc.months_wide_alone[m],
                    'E' if n >= 4 => loc.days_wide[c.weekday as usize],
                    'E' => loc.days_short[c.weekday as usize],
                    'a' => loc.am_pm[usize::from(c.hour >= 12)],
                    'Q' | 'q' => loc.quarters_short[q as usize],
                    other => {
                        for _ in 0..n {
                            out.push(other);
                        }
                        continue;
                    }
                };
                out.push_str(word);
                continue;
            }
        };
        out.push_str(&pad(v, width));
    }
    out
}

/// A date label (`yyyy-MM-dd`) for milliseconds since the epoch.
pub fn date_label(ms: f64) -> String {
    date(ms, "yyyy-MM-dd", english())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[derive(serde::Deserialize)]
    struct NumberCase {
        locale: String,
        pattern: String,
        value: f64,
        text: String,
    }
    #[derive(serde::Deserialize)]
    struct DateCase {
        locale: String,
        pattern: String,
        ms: f64,
        text: String,
    }
    #[derive(serde::Deserialize)]
    struct Fixture<T> {
        cases: Vec<T>,
    }

    /// Python babel 2.19.0 `format_decimal`, `format_currency(currency_digits=False)`
    /// and `format_compact_decimal(fraction_digits=1)`; generated by
    /// tests/reference/gen/babel_locales.py.
    #[test]
    fn numbers_match_babel() {
        let f: Fixture<NumberCase> = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/format/numbers.json")).unwrap();
        let mut bad = Vec::new();
        for c in &f.cases {
            let loc = locale(&c.locale);
            let got = number(c.value, &c.pattern, loc);
            // babel 2.19 ignores minimumGroupingDigits (checked against ICU
            // below): where the locale's minimum leaves a 4-digit integer part
            // ungrouped, babel's text without that one separator is expected.
            let int_part: String =
                c.text.chars().skip_while(|ch| !ch.is_ascii_digit()).take_while(|ch| ch.is_ascii_digit() || loc.group.contains(*ch)).collect();
            let digits = int_part.chars().filter(char::is_ascii_digit).count();
            let expected = if loc.min_grouping > 1 && digits == 4 && c.pattern != "compact" { c.text.replacen(loc.group, "", 1) } else { c.text.clone() };
            if got != expected {
                bad.push(format!("{} {:?} {}: got {:?}, babel {:?}", c.locale, c.pattern, c.value, got, c.text));
            }
        }
        assert!(f.cases.len() > 700);
        assert!(bad.is_empty(), "{} of {} differ:\n{}", bad.len(), f.cases.len(), bad.join("\n"));
    }

    /// CLDR `minimumGroupingDigits` as ICU applies it (node's `Intl.NumberFormat`,
    /// ICU 78 / CLDR 48); generated by tests/reference/gen/min_grouping.mjs.
    /// es leaves a 4-digit integer part ungrouped.
    #[test]
    fn grouping_matches_icu_minimum_grouping_digits() {
        #[derive(serde::Deserialize)]
        struct Case {
            locale: String,
            value: f64,
            text: String,
        }
        let f: Fixture<Case> = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/format/min_grouping.json")).unwrap();
        let mut bad = Vec::new();
        for c in &f.cases {
            let got = number(c.value, "#,##0", locale(&c.locale));
            if got != c.text {
                bad.push(format!("{} {}: got {:?}, ICU {:?}", c.locale, c.value, got, c.text));
            }
        }
        assert!(f.cases.iter().any(|c| c.locale == "es" && c.text == "1234"));
        assert!(bad.is_empty(), "{} of {} differ:\n{}", bad.len(), f.cases.len(), bad.join("\n"));
    }

    /// Python babel 2.19.0 `format_datetime` with LDML patterns; generated
    /// by tests/reference/gen/babel_locales.py.
    #[test]
    fn dates_match_babel() {
        let f: Fixture<DateCase> = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/format/dates.json")).unwrap();
        let mut bad = Vec::new();
        for c in &f.cases {
            let got = date(c.ms, &c.pattern, locale(&c.locale));
            if got != c.text {
                bad.push(format!("{} {:?} {}: got {:?}, babel {:?}", c.locale, c.pattern, c.ms, got, c.text));
            }
        }
        assert!(f.cases.len() > 300);
        assert!(bad.is_empty(), "{} of {} differ:\n{}", bad.len(), f.cases.len(), bad.join("\n"));
    }

    #[test]
    fn default_pattern_follows_the_step() {
        // No false precision: as many decimals as the step has (common practice).
        assert_eq!(default_pattern(500.0), "#,##0");
        assert_eq!(default_pattern(0.1), "#,##0.0");
        assert_eq!(default_pattern(2.5), "#,##0.0");
        assert_eq!(default_pattern(0.25), "#,##0.00");
        assert_eq!(number_label(0.30000000000000004, 0.1, None), "0.3");
        assert_eq!(number_label(1500.0, 500.0, None), "1,500");
        assert_eq!(number_label(-0.0, 1.0, None), "0");
        assert_eq!(value_label(2.50), "2.5");
    }

    #[test]
    fn locale_tags() {
        assert_eq!(locale("de-AT").code, "de");
        assert_eq!(locale("xx").code, "en");
        assert!(is_known_locale("fr_CA") && !is_known_locale("nl"));
    }

    #[test]
    fn huge_fields_do_not_panic() {
        // Issue 16: 65,536 `y` letters panicked in `format!`; widths are capped.
        let s = date(0.0, &"y".repeat(65_536), english());
        assert_eq!(s, format!("{:032}", 1970));
        let n = number(1.5, &format!("{}.{}", "0".repeat(70_000), "0".repeat(70_000)), english());
        assert!(n.len() < 100, "{}", n.len());
    }
}
