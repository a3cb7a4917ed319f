//! Text cells to typed columns: inference over all rows, or an override.
//!
//! Cells live in a [`TextColumn`]: one byte buffer and one offset per cell;
//! a text column becomes a dictionary-coded [`Text`].

use super::table::{Column, Ints, Kind, Text, TextBuilder, ValidBuilder, MISSING};
use crate::calendar::{parse_date_bytes, parse_datetime_bytes};
use crate::spec::ColumnType;

/// Cells read as missing values unless the reader is told otherwise.
pub const NULL_TOKENS: [&str; 6] = ["", "NA", "N/A", "null", "NULL", "-"];

/// One column of cells as text: `values[offsets[i]..offsets[i+1]]` is cell `i`.
#[derive(Debug, Clone)]
pub struct TextColumn {
    pub values: Vec<u8>,
    pub offsets: Vec<i32>,
}

impl Default for TextColumn {
    fn default() -> Self {
        TextColumn { values: Vec::new(), offsets: vec![0] }
    }
}

impl TextColumn {
    pub fn len(&self) -> usize {
        self.offsets.len() - 1
    }
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }
    #[inline]
    pub fn cell(&self, i: usize) -> &[u8] {
        &self.values[self.offsets[i] as usize..self.offsets[i + 1] as usize]
    }
    /// Append a cell; `false` when the column would pass 2 GiB of text.
    #[inline]
    pub fn push(&mut self, cell: &[u8]) -> bool {
        self.values.extend_from_slice(cell);
        match i32::try_from(self.values.len()) {
            Ok(end) => {
                self.offsets.push(end);
                true
            }
            Err(_) => false,
        }
    }
    /// The cell holding byte `pos` of `values`.
    pub fn cell_at_byte(&self, pos: usize) -> usize {
        self.offsets.partition_point(|o| (*o as usize) <= pos).saturating_sub(1).min(self.len().saturating_sub(1))
    }
}

/// How cells become values.
#[derive(Debug, Clone)]
pub struct CellRules {
    nulls: Vec<Vec<u8>>,
    max_null_len: usize,
    /// `1,5` is one and a half.
    pub decimal_comma: bool,
}

impl CellRules {
    pub fn new<S: AsRef<str>>(null_tokens: &[S], decimal_comma: bool) -> Self {
        let mut nulls: Vec<Vec<u8>> = Vec::with_capacity(null_tokens.len());
        let mut max_null_len = 0;
        for s in null_tokens {
            let t = s.as_ref().as_bytes();
            max_null_len = max_null_len.max(t.len());
            nulls.push(t.to_vec());
        }
        CellRules { nulls, max_null_len, decimal_comma }
    }
    #[inline]
    pub fn is_null(&self, c: &[u8]) -> bool {
        c.len() <= self.max_null_len && self.nulls.iter().any(|t| t.as_slice() == c)
    }
}

impl Default for CellRules {
    fn default() -> Self {
        CellRules::new(&NULL_TOKENS, false)
    }
}

#[inline]
fn trim(b: &[u8]) -> &[u8] {
    let mut s = 0;
    let mut e = b.len();
    while s < e && (b[s] == b' ' || b[s] == b'\t') {
        s += 1;
    }
    while e > s && (b[e - 1] == b' ' || b[e - 1] == b'\t') {
        e -= 1;
    }
    &b[s..e]
}

/// A whole decimal integer that fits i64: optional sign, then digits only.
#[inline(always)]
pub fn parse_int(b: &[u8]) -> Option<i64> {
    let b = trim(b);
    let (neg, d) = match b.first()? {
        b'-' => (true, &b[1..]),
        b'+' => (false, &b[1..]),
        _ => (false, b),
    };
    if d.is_empty() || d.len() > 19 {
        return None;
    }
    let mut v: u64 = 0;
    for &c in d {
        let x = c.wrapping_sub(b'0');
        if x > 9 {
            return None;
        }
        v = v * 10 + x as u64;
    }
    if neg {
        if v > i64::MAX as u64 + 1 {
            None
        } else {
            Some((v as i64).wrapping_neg())
        }
    } else if v > i64::MAX as u64 {
        None
    } else {
        Some(v as i64)
    }
}

/// A finite decimal number (`1`, `-2.5`, `.5`, `1e-3`); with `decimal_comma`
/// the fraction mark is `,` and `.` is refused.
#[inline]
pub fn parse_float(b: &[u8], decimal_comma: bool) -> Option<f64> {
    let b = trim(b);
    if let Some(v) = fast_decimal(b, if decimal_comma { b',' } else { b'.' }) {
        return Some(v);
    }
    slow_float(b, decimal_comma)
}

/// Exact powers of ten up to 10^22, the largest that f64 holds exactly.
const POW10: [f64; 23] = [1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/// `[-+]digits[.digits]` with at most 15 significant digits: the digits
/// as an integer below 2^53 and the power of ten are both exact in f64, so
/// one IEEE division gives the correctly rounded value (Clinger 1990, "How
/// to read floating point numbers accurately", the fast path). `None`
/// sends the cell to the general parser.
#[inline]
fn fast_decimal(b: &[u8], point: u8) -> Option<f64> {
    let (neg, d) = match *b.first()? {
        b'-' => (true, &b[1..]),
        b'+' => (false, &b[1..]),
        _ => (false, b),
    };
    if d.is_empty() || d.len() > 17 {
        return None;
    }
    let mut m: u64 = 0;
    let mut digits = 0u32;
    let mut frac: Option<usize> = None;
    for (i, &c) in d.iter().enumerate() {
        let x = c.wrapping_sub(b'0');
        if x <= 9 {
            m = m * 10 + x as u64;
            digits += 1;
        } else if c == point && frac.is_none() {
            frac = Some(d.len() - i - 1);
        } else {
            return None;
        }
    }
    if digits == 0 || digits > 15 {
        return None;
    }
    // m < 10^15 < 2^53: the signed conversion is exact and one instruction.
    let v = (m as i64) as f64 / POW10[frac.unwrap_or(0)];
    Some(if neg { -v } else { v })
}

#[cold]
fn slow_float(b: &[u8], decimal_comma: bool) -> Option<f64> {
    any_float(b, decimal_comma).filter(|v| v.is_finite())
}

/// A number that is not finite: `NaN`, `inf`, `Infinity` (any case, with a
/// sign) or a decimal too large for a 64-bit float (`1e309`). In a number
/// column such a cell is read as missing, and the reader warns once.
#[cold]
pub fn is_not_finite(b: &[u8], decimal_comma: bool) -> bool {
    let t = trim(b);
    let w = t.strip_prefix(b"-").or_else(|| t.strip_prefix(b"+")).unwrap_or(t);
    w.eq_ignore_ascii_case(b"nan")
        || w.eq_ignore_ascii_case(b"inf")
        || w.eq_ignore_ascii_case(b"infinity")
        || any_float(t, decimal_comma).is_some_and(|v| !v.is_finite())
}

/// The general parser, infinities (from overflow) included.
fn any_float(b: &[u8], decimal_comma: bool) -> Option<f64> {
    if b.is_empty() || b.len() > 64 {
        return None;
    }
    let mut digit = false;
    let mut buf = [0u8; 64];
    for (i, &c) in b.iter().enumerate() {
        buf[i] = match c {
            b'0'..=b'9' => {
                digit = true;
                c
            }
            b'+' | b'-' | b'e' | b'E' => c,
            b'.' if !decimal_comma => c,
            b',' if decimal_comma => b'.',
            _ => return None,
        };
    }
    if !digit {
        return None;
    }
    let s = std::str::from_utf8(&buf[..b.len()]).ok()?;
    crate::format::float::parse(s)
}

#[inline]
pub fn parse_bool(b: &[u8]) -> Option<bool> {
    match trim(b) {
        b"true" | b"TRUE" | b"True" => Some(true),
        b"false" | b"FALSE" | b"False" => Some(false),
        _ => None,
    }
}

pub(crate) fn parse_date(b: &[u8]) -> Option<i32> {
    parse_date_bytes(trim(b)).and_then(|d| i32::try_from(d).ok())
}

/// ISO 8601's basic date (`19580329`), read only in a column declared `date`.
pub(crate) fn parse_basic_date(b: &[u8]) -> Option<i32> {
    crate::calendar::parse_basic_date_bytes(trim(b)).and_then(|d| i32::try_from(d).ok())
}

pub(crate) fn parse_datetime(b: &[u8]) -> Option<i64> {
    let b = trim(b);
    parse_datetime_bytes(b).or_else(|| parse_date_bytes(b).map(|d| d * 86_400_000))
}

/// The family the first non-null cell belongs to.
fn first_kind(col: &TextColumn, rules: &CellRules) -> Kind {
    for i in 0..col.len() {
        let c = col.cell(i);
        if rules.is_null(c) || is_not_finite(c, rules.decimal_comma) {
            continue;
        }
        return if parse_int(c).is_some() {
            Kind::Int
        } else if parse_float(c, rules.decimal_comma).is_some() {
            Kind::Float
        } else if parse_bool(c).is_some() {
            Kind::Bool
        } else if parse_date(c).is_some() {
            Kind::Date
        } else if parse_datetime(c).is_some() {
            Kind::DateTime
        } else {
            Kind::Text
        };
    }
    Kind::Text
}

/// Cells of a number column that were not finite numbers: the first row and how many.
pub type NotFinite = Option<(usize, usize)>;

/// Values, validity, and the non-finite cells of a scanned column.
type Scanned<T> = (Vec<T>, Option<Vec<bool>>, NotFinite);

/// Parse every non-null cell with `f`; `Err(row)` names the first that
/// fails. With `numbers`, a cell that is a non-finite number is missing
/// (and noted).
fn scan<T: Default + Copy>(col: &TextColumn, rules: &CellRules, numbers: bool, f: impl Fn(&[u8]) -> Option<T>) -> Result<Scanned<T>, usize> {
    let n = col.len();
    let mut vals = Vec::with_capacity(n);
    let mut nulls = ValidBuilder::default();
    let mut odd: NotFinite = None;
    for i in 0..n {
        let c = col.cell(i);
        // Null tokens first: a configured token such as `-999` is missing,
        // not a number.
        match if rules.is_null(c) { None } else { f(c) } {
            Some(v) => {
                vals.push(v);
                nulls.valid();
            }
            None if rules.is_null(c) => {
                nulls.missing(vals.len());
                vals.push(T::default());
            }
            None if numbers && is_not_finite(c, rules.decimal_comma) => {
                nulls.missing(vals.len());
                vals.push(T::default());
                note(&mut odd, i);
            }
            None => return Err(i),
        }
    }
    Ok((vals, nulls.finish(), odd))
}

/// Count a non-finite cell at `row`.
#[inline]
pub(crate) fn note(odd: &mut NotFinite, row: usize) {
    match odd {
        Some((_, k)) => *k += 1,
        None => *odd = Some((row, 1)),
    }
}

/// Numbers with NaN where the validity list says missing.
pub(crate) fn with_nan(mut v: Vec<f64>, valid: Option<Vec<bool>>) -> super::Nums {
    if let Some(m) = valid {
        for (x, ok) in v.iter_mut().zip(m) {
            if !ok {
                *x = f64::NAN;
            }
        }
    }
    v.into()
}

/// A cell that does not fit the column's type.
#[derive(Debug, Clone, PartialEq)]
pub struct CellError {
    /// 0-based data row.
    pub row: usize,
    pub value: String,
    pub expected: &'static str,
    /// The cell is not valid UTF-8 (byte offset inside the cell).
    pub invalid_utf8: Option<usize>,
}

const EXPECT_NUMBER: &str = "a number";
pub(crate) const EXPECT_BOOL: &str = "true or false";
pub(crate) const EXPECT_DATE: &str = "a date (yyyy-MM-dd, or yyyyMMdd when declared) or an ISO 8601 date-time";

fn cell_error(col: &TextColumn, row: usize, expected: &'static str) -> CellError {
    CellError { row, value: String::from_utf8_lossy(col.cell(row)).into_owned(), expected, invalid_utf8: None }
}

/// Build one column from text cells: the override type if given, else
/// the narrowest of integer, number, bool, date, date-time and text that
/// every non-null cell fits.
pub fn build(col: TextColumn, forced: Option<ColumnType>, rules: &CellRules) -> Result<Column, CellError> {
    build_noting(col, forced, rules).map(|(c, _)| c)
}

/// [`build`], and where a number column had cells that were not finite
/// numbers (read as missing).
pub fn build_noting(col: TextColumn, forced: Option<ColumnType>, rules: &CellRules) -> Result<(Column, NotFinite), CellError> {
    let dc = rules.decimal_comma;
    let kind = match forced {
        None => first_kind(&col, rules),
        Some(ColumnType::Number) => Kind::Float,
        Some(ColumnType::Text) => Kind::Text,
        Some(ColumnType::Bool) => Kind::Bool,
        Some(ColumnType::Date) => Kind::Date,
    };
    let strict = forced.is_some();
    let fallback = |col: TextColumn, row: usize, expected| {
        if strict {
            Err(cell_error(&col, row, expected))
        } else {
            text(col, rules)
        }
    };
    let plain = |r: Result<Column, CellError>| r.map(|c| (c, None));
    match kind {
        Kind::Int => match scan(&col, rules, true, parse_int) {
            Ok((values, valid, odd)) => Ok((Column::Int(Ints { values, valid }), odd)),
            Err(_) => float(col, rules, dc, strict),
        },
        Kind::Float => float(col, rules, dc, strict),
        Kind::Bool => plain(match scan(&col, rules, false, parse_bool) {
            Ok((v, n, _)) => Ok(Column::Bool(with_missing(&v, n.as_deref()))),
            Err(row) => fallback(col, row, EXPECT_BOOL),
        }),
        // Declared a date: ISO 8601's basic form (19580329) reads too.
        Kind::Date => plain(match scan(&col, rules, false, |c| parse_date(c).or_else(|| if strict { parse_basic_date(c) } else { None })) {
            Ok((v, n, _)) => Ok(Column::Date(with_nan(days_as_f64(&v), n))),
            Err(_) => datetime(col, rules, strict),
        }),
        Kind::DateTime => plain(datetime(col, rules, strict)),
        Kind::Text => plain(text(col, rules)),
    }
}

fn float(col: TextColumn, rules: &CellRules, dc: bool, strict: bool) -> Result<(Column, NotFinite), CellError> {
    match scan(&col, rules, true, |c| parse_float(c, dc)) {
        Ok((v, n, odd)) => Ok((Column::Float(with_nan(v, n)), odd)),
        Err(row) if strict => Err(cell_error(&col, row, if dc { "a number (decimal comma)" } else { EXPECT_NUMBER })),
        Err(_) => text(col, rules).map(|c| (c, None)),
    }
}

fn datetime(col: TextColumn, rules: &CellRules, strict: bool) -> Result<Column, CellError> {
    match scan(&col, rules, false, parse_datetime) {
        Ok((v, n, _)) => Ok(Column::DateTime(with_nan(ints_as_f64(&v), n))),
        Err(row) if strict => Err(cell_error(&col, row, EXPECT_DATE)),
        Err(_) => text(col, rules),
    }
}

/// Booleans with a validity list (`None`: all present) as optional booleans.
pub(crate) fn with_missing(v: &[bool], valid: Option<&[bool]>) -> Vec<Option<bool>> {
    let mut out = vec![None; v.len()];
    for (i, (o, b)) in out.iter_mut().zip(v).enumerate() {
        if valid.is_none_or(|m| m[i]) {
            *o = Some(*b);
        }
    }
    out
}

/// Days since 1970-01-01 as numbers (a zip of slices: as fast as a
/// `collect`, without its generic functions).
pub(crate) fn days_as_f64(v: &[i32]) -> Vec<f64> {
    let mut out = vec![0.0; v.len()];
    for (o, d) in out.iter_mut().zip(v) {
        *o = *d as f64;
    }
    out
}

/// Integers (or ms since 1970-01-01) as numbers.
pub(crate) fn ints_as_f64(v: &[i64]) -> Vec<f64> {
    let mut out = vec![0.0; v.len()];
    for (o, x) in out.iter_mut().zip(v) {
        *o = *x as f64;
    }
    out
}

/// A text column of `n` rows from each row's text.
fn text_of(n: usize, cell: &dyn Fn(usize) -> Option<String>) -> Column {
    let mut b = TextBuilder::default();
    for i in 0..n {
        b.push(cell(i).as_deref().map(str::as_bytes));
    }
    Column::Text(b.finish())
}

/// The cells as dictionary-coded text; null tokens become missing rows.
fn text(col: TextColumn, rules: &CellRules) -> Result<Column, CellError> {
    if let Err(e) = std::str::from_utf8(&col.values) {
        let pos = e.valid_up_to();
        let row = col.cell_at_byte(pos);
        let at = pos - col.offsets[row] as usize;
        return Err(CellError { row, value: String::from_utf8_lossy(col.cell(row)).into_owned(), expected: "UTF-8 text", invalid_utf8: Some(at) });
    }
    let n = col.len();
    let mut b = TextBuilder::with_capacity(n);
    for i in 0..n {
        let c = col.cell(i);
        b.push((!rules.is_null(c)).then_some(c));
        // Mostly distinct values (names, free text): a dictionary would cost
        // a hash a cell and a second copy of the text for nothing, so the
        // cells themselves become the dictionary, one entry a row.
        if (i + 1 == 4096 || i + 1 == 65_536) && b.dict_len() * 2 > i + 1 {
            return Ok(Column::Text(row_coded(col, rules)));
        }
    }
    Ok(Column::Text(b.finish()))
}

/// Text whose dictionary is the cells as they are (entry `i` is row `i`),
/// for columns of mostly distinct values: no hashing and no copy of the text.
fn row_coded(col: TextColumn, rules: &CellRules) -> Text {
    let mut codes = vec![MISSING; col.len()];
    for (i, c) in codes.iter_mut().enumerate() {
        if !rules.is_null(col.cell(i)) {
            *c = i as u32;
        }
    }
    let TextColumn { values, offsets } = col;
    let mut ends = vec![0u32; offsets.len() - 1];
    for (e, o) in ends.iter_mut().zip(&offsets[1..]) {
        *e = *o as u32;
    }
    // The bytes were checked as UTF-8 by the caller and cells end on
    // character boundaries, which `from_parts` checks again.
    let dict = String::from_utf8(values).unwrap_or_default();
    Text::from_parts(codes, dict, ends).unwrap_or_default()
}

/// Apply a `data.types` override to a column read from typed data (Arrow,
/// or the add-on's interchange): numbers from integers, text from numbers
/// and booleans, and text typed like delimited text cells.
pub(crate) fn retype(col: Column, t: ColumnType, name: &str) -> Result<Column, crate::error::Errors> {
    use crate::error::Diagnostic;
    let col = match (t, col) {
        (ColumnType::Number, c @ Column::Float(_))
        | (ColumnType::Text, c @ Column::Text(_))
        | (ColumnType::Bool, c @ Column::Bool(_))
        | (ColumnType::Date, c @ (Column::Date(_) | Column::DateTime(_))) => c,
        (ColumnType::Number, Column::Int(v)) => {
            let mut out = ints_as_f64(&v.values);
            for (i, x) in out.iter_mut().enumerate() {
                if v.get(i).is_none() {
                    *x = f64::NAN;
                }
            }
            Column::Float(out.into())
        }
        (ColumnType::Text, Column::Int(v)) => text_of(v.len(), &|i| v.get(i).map(|x| x.to_string())),
        (ColumnType::Text, Column::Float(v)) => text_of(v.len(), &|i| v.get(i).map(crate::format::float::plain)),
        (ColumnType::Text, Column::Bool(v)) => text_of(v.len(), &|i| v[i].map(|x| x.to_string())),
        (t, Column::Text(s)) => {
            // Text typed like delimited text cells; missing stays missing.
            let mut col = TextColumn::default();
            for v in s.iter() {
                if !col.push(v.unwrap_or("").as_bytes()) {
                    return Err(Diagnostic::error("data.too_large", format!("column `{name}` holds more than 2 GiB of text")).into());
                }
            }
            return build(col, Some(t), &CellRules::new(&[""], false)).map_err(|e| {
                Diagnostic::error(
                    "data.type_mismatch",
                    format!("column `{name}` is declared `{}` but row {} holds `{}`: expected {}", type_word(t), e.row + 1, e.value, e.expected),
                )
                .at_path(format!("data.types.{name}"))
                .into()
            });
        }
        (t, c) => {
            return Err(Diagnostic::error(
                "data.type_mismatch",
                format!("column `{name}` is declared `{}` but the data holds {}, which cannot be read as {}", type_word(t), c.kind().word(), type_word(t)),
            )
            .at_path(format!("data.types.{name}"))
            .into())
        }
    };
    Ok(col)
}

pub(crate) fn type_word(t: ColumnType) -> &'static str {
    match t {
        ColumnType::Number => "number",
        ColumnType::Text => "text",
        ColumnType::Date => "date",
        ColumnType::Bool => "bool",
    }
}

/// Make header names unique and non-empty; returns warnings for renamed ones.
pub fn unique_names(raw: Vec<String>) -> (Vec<String>, Vec<String>) {
    let mut out: Vec<String> = Vec::with_capacity(raw.len());
    // Names taken, found by the engine's one hash index.
    let mut seen = crate::index::Places::new();
    let mut notes = Vec::new();
    for (i, name) in raw.into_iter().enumerate() {
        let base = if name.trim().is_empty() { format!("column_{}", i + 1) } else { name.clone() };
        let mut candidate = base.clone();
        let mut k = 2;
        while seen.get(&out, &candidate).is_some() {
            candidate = format!("{base}_{k}");
            k += 1;
        }
        if candidate != name {
            notes.push(format!("header {} `{}` renamed to `{}`", i + 1, name, candidate));
        }
        out.push(candidate);
        seen.add(&out, i);
    }
    (out, notes)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn col(cells: &[&str]) -> TextColumn {
        let mut c = TextColumn::default();
        for s in cells {
            assert!(c.push(s.as_bytes()));
        }
        c
    }

    fn ty(cells: &[&str]) -> Kind {
        build(col(cells), None, &CellRules::default()).unwrap().kind()
    }

    #[test]
    fn inference_widens_within_a_family_only() {
        assert_eq!(ty(&["1", "NA", "-3"]), Kind::Int);
        assert_eq!(ty(&["1", "2.5"]), Kind::Float);
        assert_eq!(ty(&["", "1e3", "-.5"]), Kind::Float);
        assert_eq!(ty(&["true", "False"]), Kind::Bool);
        assert_eq!(ty(&["2024-01-02", "2024-01-03"]), Kind::Date);
        assert_eq!(ty(&["2024-01-02", "2024-01-03T04:05:06Z"]), Kind::DateTime);
        assert_eq!(ty(&["1", "true"]), Kind::Text);
        // A non-finite number among numbers is a missing number, not text;
        // with no finite number the column stays text.
        assert_eq!(ty(&["1", "inf"]), Kind::Int);
        assert_eq!(ty(&["NaN", "2.5", "1e309"]), Kind::Float);
        assert_eq!(ty(&["NaN"]), Kind::Text);
        assert_eq!(ty(&["x", "NaN", "1"]), Kind::Text);
        assert_eq!(ty(&["", "NA"]), Kind::Text);
        // 2^63 does not fit i64, so the column is a float one.
        assert_eq!(ty(&["9223372036854775808"]), Kind::Float);
        assert_eq!(ty(&["-9223372036854775808"]), Kind::Int);
    }

    #[test]
    fn integers_at_the_edges() {
        assert_eq!(parse_int(b"-9223372036854775808"), Some(i64::MIN));
        assert_eq!(parse_int(b"9223372036854775807"), Some(i64::MAX));
        assert_eq!(parse_int(b"9223372036854775808"), None);
        assert_eq!(parse_int(b"99999999999999999999"), None);
        assert_eq!(parse_int(b" 42 "), Some(42));
        assert_eq!(parse_int(b"+"), None);
        assert_eq!(parse_int(b"4 2"), None);
    }

    #[test]
    fn fast_path_agrees_with_the_general_parser() {
        // Reference: Rust std's `f64::from_str` (correctly rounded); the
        // fast path must give the same bits.
        let mut x: u64 = 0x9E37_79B9_7F4A_7C15;
        for _ in 0..20_000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            let digits = (x % 16) as usize + 1;
            let m = x % 10u64.pow(digits as u32);
            let mut s = format!("{m:0digits$}");
            let p = (x >> 40) as usize % (digits + 1);
            if p < digits {
                s.insert(p, '.');
            }
            if x & (1 << 63) != 0 {
                s.insert(0, '-');
            }
            let want: f64 = s.parse().unwrap();
            assert_eq!(parse_float(s.as_bytes(), false).unwrap().to_bits(), want.to_bits(), "{s}");
        }
        assert_eq!(parse_float(b"-0.0", false).unwrap().to_bits(), (-0.0f64).to_bits());
        assert_eq!(parse_float(b".", false), None);
        assert_eq!(parse_float(b"1.2.3", false), None);
        assert_eq!(parse_float(b"-", false), None);
    }

    #[test]
    fn decimal_comma() {
        assert_eq!(parse_float(b"1,5", true), Some(1.5));
        assert_eq!(parse_float(b"1.5", true), None);
        assert_eq!(parse_float(b"1,5", false), None);
    }

    #[test]
    fn text_keeps_bytes_and_nulls() {
        let a = build(col(&["a", "NA", "c"]), None, &CellRules::default()).unwrap();
        let Column::Text(s) = a else { panic!("not text") };
        assert_eq!(s.iter().collect::<Vec<_>>(), vec![Some("a"), None, Some("c")]);
    }

    #[test]
    fn mostly_distinct_text_is_coded_by_row() {
        let cells: Vec<String> = (0..5000).map(|i| if i % 7 == 3 { "NA".to_string() } else { format!("name {i} é") }).collect();
        let c = col(&cells.iter().map(String::as_str).collect::<Vec<_>>());
        let Column::Text(t) = build(c, None, &CellRules::default()).unwrap() else { panic!() };
        assert_eq!(t.dict_len(), 5000);
        for (i, v) in t.iter().enumerate() {
            assert_eq!(v, (i % 7 != 3).then_some(cells[i].as_str()));
        }
        // Few distinct values stay dictionary-coded.
        let cells: Vec<&str> = (0..5000).map(|i| ["a", "b", "c"][i % 3]).collect();
        let Column::Text(t) = build(col(&cells), None, &CellRules::default()).unwrap() else { panic!() };
        assert_eq!(t.dict_len(), 3);
    }

    #[test]
    fn invalid_utf8_is_located() {
        let mut c = col(&["ok"]);
        c.push(b"bad\xff");
        let e = build(c, None, &CellRules::default()).unwrap_err();
        assert_eq!(e.row, 1);
        assert_eq!(e.invalid_utf8, Some(3));
    }

    #[test]
    fn override_mismatch_is_an_error_not_text() {
        let e = build(col(&["1", "x"]), Some(ColumnType::Number), &CellRules::default()).unwrap_err();
        assert_eq!((e.row, e.value.as_str()), (1, "x"));
    }
}
