//! The table of our own that every reader fills and every later stage
//! reads: named, typed columns of one length.
//!
//! - numbers: [`Nums`], `f64` with NaN for a missing value;
//! - integers: [`Ints`], `i64` with a validity list (SQL expressions keep
//!   integer arithmetic, `7 / 2` is 3);
//! - booleans: one `Option<bool>` a row;
//! - dates: days since 1970-01-01 as [`Nums`]; date-times: ms since
//!   1970-01-01 UTC as [`Nums`] (exact up to 2^53 ms, about 285,000 years);
//! - text: [`Text`], dictionary-coded (one `u32` code a row, each distinct
//!   value stored once).

use super::Nums;
use crate::error::Diagnostic;

/// The table every later stage reads.
#[derive(Debug, Clone, Default)]
pub struct Table {
    names: Vec<String>,
    columns: Vec<Column>,
    rows: usize,
    /// Non-fatal notes from reading (renamed headers and the like).
    pub warnings: Vec<Diagnostic>,
}

impl Table {
    /// A table from named columns, all of `rows` rows.
    pub fn new(names: Vec<String>, columns: Vec<Column>, rows: usize, warnings: Vec<Diagnostic>) -> Table {
        debug_assert!(names.len() == columns.len() && columns.iter().all(|c| c.len() == rows));
        Table { names, columns, rows, warnings }
    }
    /// A table from named columns; the row count is the first column's.
    pub fn from_columns(names: Vec<String>, columns: Vec<Column>, warnings: Vec<Diagnostic>) -> Table {
        let rows = columns.first().map(Column::len).unwrap_or(0);
        Table::new(names, columns, rows, warnings)
    }
    pub fn num_rows(&self) -> usize {
        self.rows
    }
    pub fn num_columns(&self) -> usize {
        self.columns.len()
    }
    pub fn column_names(&self) -> Vec<String> {
        self.names.clone()
    }
    pub fn names(&self) -> &[String] {
        &self.names
    }
    pub fn columns(&self) -> &[Column] {
        &self.columns
    }
    pub fn column(&self, i: usize) -> &Column {
        &self.columns[i]
    }
    /// The column called `name`.
    pub fn by_name(&self, name: &str) -> Option<&Column> {
        self.names.iter().position(|n| n == name).map(|i| &self.columns[i])
    }
    pub fn into_parts(self) -> (Vec<String>, Vec<Column>, usize, Vec<Diagnostic>) {
        (self.names, self.columns, self.rows, self.warnings)
    }
}

/// One typed column.
#[derive(Debug, Clone, PartialEq)]
pub enum Column {
    Int(Ints),
    Float(Nums),
    Bool(Vec<Option<bool>>),
    /// Days since 1970-01-01.
    Date(Nums),
    /// Milliseconds since 1970-01-01 00:00 UTC.
    DateTime(Nums),
    Text(Text),
}

/// The kinds of [`Column`], for messages and tests.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    Int,
    Float,
    Bool,
    Date,
    DateTime,
    Text,
}

impl Kind {
    /// The kind in words.
    pub fn word(self) -> &'static str {
        match self {
            Kind::Int => "integers",
            Kind::Float => "numbers",
            Kind::Bool => "true/false values",
            Kind::Date => "dates",
            Kind::DateTime => "date-times",
            Kind::Text => "text",
        }
    }
}

impl Column {
    pub fn len(&self) -> usize {
        match self {
            Column::Int(v) => v.len(),
            Column::Float(v) | Column::Date(v) | Column::DateTime(v) => v.len(),
            Column::Bool(v) => v.len(),
            Column::Text(v) => v.len(),
        }
    }
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }
    pub fn kind(&self) -> Kind {
        match self {
            Column::Int(_) => Kind::Int,
            Column::Float(_) => Kind::Float,
            Column::Bool(_) => Kind::Bool,
            Column::Date(_) => Kind::Date,
            Column::DateTime(_) => Kind::DateTime,
            Column::Text(_) => Kind::Text,
        }
    }
    /// Is row `i` missing?
    pub fn is_null(&self, i: usize) -> bool {
        match self {
            Column::Int(v) => v.get(i).is_none(),
            Column::Float(v) | Column::Date(v) | Column::DateTime(v) => v.get(i).is_none(),
            Column::Bool(v) => v[i].is_none(),
            Column::Text(v) => v.get(i).is_none(),
        }
    }
    /// How many rows are missing.
    pub fn null_count(&self) -> usize {
        (0..self.len()).filter(|i| self.is_null(*i)).count()
    }
    /// The rows where `keep` is true.
    pub fn filter(&self, keep: &[bool]) -> Column {
        fn pick<T: Copy>(v: &[T], keep: &[bool]) -> Vec<T> {
            let mut out = Vec::new();
            for (x, k) in v.iter().zip(keep) {
                if *k {
                    out.push(*x);
                }
            }
            out
        }
        match self {
            Column::Int(v) => Column::Int(Ints { values: pick(&v.values, keep), valid: v.valid.as_ref().map(|m| pick(m, keep)) }),
            Column::Float(v) => Column::Float(v.filter(keep)),
            Column::Date(v) => Column::Date(v.filter(keep)),
            Column::DateTime(v) => Column::DateTime(v.filter(keep)),
            Column::Bool(v) => Column::Bool(pick(v, keep)),
            Column::Text(v) => Column::Text(Text { codes: pick(&v.codes, keep), dict: v.dict.clone(), ends: v.ends.clone() }),
        }
    }
}

impl Column {
    /// The rows `idx` picks, in its order (`None` or an index out of range:
    /// a missing row).
    pub fn take(&self, idx: &[Option<usize>]) -> Column {
        let n = self.len();
        let at = |i: &Option<usize>| i.filter(|i| *i < n);
        let nums = |v: &Nums| {
            let mut out = Vec::with_capacity(idx.len());
            for i in idx {
                out.push(at(i).and_then(|i| v.get(i)).unwrap_or(f64::NAN));
            }
            Nums::from(out)
        };
        match self {
            Column::Int(v) => {
                let mut b = ValidBuilder::default();
                let mut values = Vec::with_capacity(idx.len());
                for i in idx {
                    Ints::push_into(&mut values, &mut b, at(i).and_then(|i| v.get(i)));
                }
                Column::Int(Ints { values, valid: b.finish() })
            }
            Column::Float(v) => Column::Float(nums(v)),
            Column::Date(v) => Column::Date(nums(v)),
            Column::DateTime(v) => Column::DateTime(nums(v)),
            Column::Bool(v) => {
                let mut out = Vec::with_capacity(idx.len());
                for i in idx {
                    out.push(at(i).and_then(|i| v[i]));
                }
                Column::Bool(out)
            }
            Column::Text(v) => {
                let mut b = TextBuilder::default();
                for i in idx {
                    b.push(at(i).and_then(|i| v.get(i)).map(str::as_bytes));
                }
                Column::Text(b.finish())
            }
        }
    }

    /// The parts one after another; `None` when their kinds differ (integers
    /// and numbers together become numbers).
    pub fn concat(parts: Vec<Column>) -> Option<Column> {
        let first = parts.first()?.kind();
        let (mut numbers, mut same, mut any_float) = (true, true, false);
        for p in &parts {
            let k = p.kind();
            numbers &= matches!(k, Kind::Int | Kind::Float);
            same &= k == first;
            any_float |= k == Kind::Float;
        }
        if parts.len() == 1 {
            return parts.into_iter().next();
        }
        if !same && !numbers {
            return None;
        }
        let nums = |parts: Vec<Column>| -> Nums {
            let mut out = Vec::new();
            for p in parts {
                match p {
                    Column::Float(v) | Column::Date(v) | Column::DateTime(v) => out.extend_from_slice(v.raw()),
                    Column::Int(v) => {
                        for i in 0..v.len() {
                            out.push(v.get(i).map_or(f64::NAN, |x| x as f64));
                        }
                    }
                    _ => {}
                }
            }
            out.into()
        };
        Some(match first {
            _ if numbers && any_float => Column::Float(nums(parts)),
            Kind::Float => Column::Float(nums(parts)),
            Kind::Date => Column::Date(nums(parts)),
            Kind::DateTime => Column::DateTime(nums(parts)),
            Kind::Int => {
                let mut out = Ints::default();
                let mut b = ValidBuilder::default();
                for p in &parts {
                    if let Column::Int(v) = p {
                        for i in 0..v.len() {
                            match v.get(i) {
                                Some(x) => {
                                    b.valid();
                                    out.values.push(x);
                                }
                                None => {
                                    b.missing(out.values.len());
                                    out.values.push(0);
                                }
                            }
                        }
                    }
                }
                out.valid = b.finish();
                Column::Int(out)
            }
            Kind::Bool => {
                let mut out = Vec::new();
                for p in parts {
                    if let Column::Bool(v) = p {
                        out.extend_from_slice(&v);
                    }
                }
                Column::Bool(out)
            }
            Kind::Text => {
                let mut b = TextBuilder::default();
                for p in &parts {
                    if let Column::Text(v) = p {
                        for x in v.iter() {
                            b.push(x.map(str::as_bytes));
                        }
                    }
                }
                Column::Text(b.finish())
            }
        })
    }
}

/// Integers with a validity list (`None`: every row is present).
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Ints {
    pub values: Vec<i64>,
    pub valid: Option<Vec<bool>>,
}

impl Ints {
    /// One more value (0 in the slot of a missing one), for the builders here.
    fn push_into(values: &mut Vec<i64>, valid: &mut ValidBuilder, v: Option<i64>) {
        match v {
            Some(_) => valid.valid(),
            None => valid.missing(values.len()),
        }
        values.push(v.unwrap_or(0));
    }

    pub fn len(&self) -> usize {
        self.values.len()
    }
    pub fn is_empty(&self) -> bool {
        self.values.is_empty()
    }
    #[inline]
    pub fn get(&self, i: usize) -> Option<i64> {
        match &self.valid {
            Some(m) if !m[i] => None,
            _ => Some(self.values[i]),
        }
    }
    pub fn iter(&self) -> impl Iterator<Item = Option<i64>> + '_ {
        (0..self.len()).map(|i| self.get(i))
    }
}

impl FromIterator<Option<i64>> for Ints {
    fn from_iter<I: IntoIterator<Item = Option<i64>>>(it: I) -> Ints {
        let mut b = ValidBuilder::default();
        let mut values = Vec::new();
        for v in it {
            Ints::push_into(&mut values, &mut b, v);
        }
        Ints { values, valid: b.finish() }
    }
}

/// A validity list built row by row, allocated only at the first missing row.
#[derive(Debug, Default)]
pub struct ValidBuilder(Option<Vec<bool>>);

impl ValidBuilder {
    /// Row `len` (0-based) is missing.
    #[inline]
    pub fn missing(&mut self, len: usize) {
        self.0
            .get_or_insert_with(|| {
                let mut v = Vec::with_capacity(len + 1024);
                v.resize(len, true);
                v
            })
            .push(false);
    }
    #[inline]
    pub fn valid(&mut self) {
        if let Some(v) = self.0.as_mut() {
            v.push(true);
        }
    }
    pub fn finish(self) -> Option<Vec<bool>> {
        self.0
    }
}

/// Dictionary-coded text: row `i` is `dict[codes[i]]`, `u32::MAX` where
/// the row is missing. Each distinct value is stored once, in order of
/// first appearance, in one string (`ends[k]` is where value `k` ends).
#[derive(Clone, Default)]
pub struct Text {
    codes: Vec<u32>,
    dict: std::sync::Arc<String>,
    ends: std::sync::Arc<Vec<u32>>,
}

/// The code of a missing row.
pub const MISSING: u32 = u32::MAX;

impl Text {
    pub fn len(&self) -> usize {
        self.codes.len()
    }
    pub fn is_empty(&self) -> bool {
        self.codes.is_empty()
    }
    /// The value of row `i`.
    #[inline]
    pub fn get(&self, i: usize) -> Option<&str> {
        match self.codes[i] {
            MISSING => None,
            c => Some(self.value(c)),
        }
    }
    /// Dictionary value `code`.
    #[inline]
    pub fn value(&self, code: u32) -> &str {
        let k = code as usize;
        let start = if k == 0 { 0 } else { self.ends[k - 1] as usize };
        &self.dict[start..self.ends[k] as usize]
    }
    /// The distinct values, in order of first appearance.
    pub fn dict_len(&self) -> usize {
        self.ends.len()
    }
    pub fn codes(&self) -> &[u32] {
        &self.codes
    }
    pub fn iter(&self) -> impl Iterator<Item = Option<&str>> + '_ {
        (0..self.len()).map(|i| self.get(i))
    }
    /// From codes and a dictionary (the interchange reader); `None` when a
    /// code or an end is out of range or an end is not on a character boundary.
    pub fn from_parts(codes: Vec<u32>, dict: String, ends: Vec<u32>) -> Option<Text> {
        let mut last = 0usize;
        for &e in &ends {
            let e = e as usize;
            if e < last || e > dict.len() || !dict.is_char_boundary(e) {
                return None;
            }
            last = e;
        }
        if codes.iter().any(|c| *c != MISSING && *c as usize >= ends.len()) {
            return None;
        }
        Some(Text { codes, dict: std::sync::Arc::new(dict), ends: std::sync::Arc::new(ends) })
    }
}

impl std::fmt::Debug for Text {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_list().entries(self.iter()).finish()
    }
}

/// Equal when every row reads the same (the dictionaries may differ).
impl PartialEq for Text {
    fn eq(&self, other: &Text) -> bool {
        self.len() == other.len() && self.iter().eq(other.iter())
    }
}

impl<'a> FromIterator<Option<&'a str>> for Text {
    fn from_iter<I: IntoIterator<Item = Option<&'a str>>>(it: I) -> Text {
        let mut b = TextBuilder::default();
        for v in it {
            b.push(v.map(str::as_bytes));
        }
        b.finish()
    }
}

impl FromIterator<Option<String>> for Text {
    fn from_iter<I: IntoIterator<Item = Option<String>>>(it: I) -> Text {
        let mut b = TextBuilder::default();
        for v in it {
            b.push(v.as_deref().map(str::as_bytes));
        }
        b.finish()
    }
}

/// Builds a [`Text`] column: a hash index of codes finds a value already
/// seen (lookups by value go through [`crate::index::Index`], never a
/// search a row).
#[derive(Default)]
pub struct TextBuilder {
    codes: Vec<u32>,
    dict: Vec<u8>,
    ends: Vec<u32>,
    seen: crate::index::Index,
}

impl TextBuilder {
    pub fn with_capacity(rows: usize) -> TextBuilder {
        TextBuilder { codes: Vec::with_capacity(rows), ..Default::default() }
    }
    #[inline]
    fn entry<'a>(dict: &'a [u8], ends: &[u32], k: u32) -> &'a [u8] {
        let k = k as usize;
        let start = if k == 0 { 0 } else { ends[k - 1] as usize };
        &dict[start..ends[k] as usize]
    }
    /// Append a row; the bytes must be UTF-8 (or [`finish_checked`](Self::finish_checked)
    /// reports the value that is not). `false` when the dictionary would
    /// pass 4 GiB (the row is then missing).
    #[inline]
    pub fn push(&mut self, v: Option<&[u8]>) -> bool {
        let Some(v) = v else {
            self.codes.push(MISSING);
            return true;
        };
        let TextBuilder { codes, dict, ends, seen } = self;
        let eq = |k: u32| Self::entry(dict, ends, k) == v;
        let Ok(end) = u32::try_from(dict.len() + v.len()) else {
            // Past 4 GiB of distinct text: a new value reads as missing
            // (every row still gets a code), and the caller is told.
            let found = seen.find(seen.hasher().bytes(v).finish(), &eq);
            codes.push(found.unwrap_or(MISSING));
            return found.is_some();
        };
        let new = ends.len() as u32;
        match seen.find_or_insert_inline(&|h| h.bytes(v).finish(), &eq, new, &|k, h| h.bytes(Self::entry(dict, ends, k)).finish()) {
            Ok(k) => codes.push(k),
            Err(k) => {
                dict.extend_from_slice(v);
                ends.push(end);
                codes.push(k);
            }
        }
        true
    }
    /// The column; `Err(code)` names the first dictionary value that is not UTF-8.
    pub fn finish_checked(self) -> Result<Text, (u32, usize)> {
        let TextBuilder { codes, dict, ends, .. } = self;
        match String::from_utf8(dict) {
            Ok(dict) => Ok(Text { codes, dict: std::sync::Arc::new(dict), ends: std::sync::Arc::new(ends) }),
            Err(e) => {
                let pos = e.utf8_error().valid_up_to();
                let k = ends.partition_point(|x| (*x as usize) <= pos);
                let start = if k == 0 { 0 } else { ends[k - 1] as usize };
                Err((k as u32, pos - start))
            }
        }
    }
    /// The column of rows pushed from `&str`s.
    pub fn finish(self) -> Text {
        self.finish_checked().unwrap_or_default()
    }
    /// Distinct values so far.
    pub fn dict_len(&self) -> usize {
        self.ends.len()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn text_is_coded_in_order_of_first_appearance() {
        let t: Text = [Some("b"), None, Some("a"), Some("b"), Some("")].into_iter().collect();
        assert_eq!(t.codes(), &[0, MISSING, 1, 0, 2]);
        assert_eq!(t.dict_len(), 3);
        assert_eq!(t.iter().collect::<Vec<_>>(), vec![Some("b"), None, Some("a"), Some("b"), Some("")]);
        let kept = Column::Text(t).filter(&[true, true, false, true, false]);
        let Column::Text(k) = kept else { unreachable!() };
        assert_eq!(k.iter().collect::<Vec<_>>(), vec![Some("b"), None, Some("b")]);
    }

    #[test]
    fn many_distinct_values_round_trip() {
        let vals: Vec<String> = (0..5000).map(|i| format!("value {}", i % 1700)).collect();
        let t: Text = vals.iter().map(|s| Some(s.as_str())).collect();
        assert_eq!(t.dict_len(), 1700);
        assert!(t.iter().zip(&vals).all(|(a, b)| a == Some(b.as_str())));
    }

    #[test]
    fn invalid_utf8_names_its_value() {
        let mut b = TextBuilder::default();
        b.push(Some(b"ok"));
        b.push(Some(b"bad\xff"));
        assert_eq!(b.finish_checked().unwrap_err(), (1, 3));
    }

    #[test]
    fn parts_are_checked() {
        assert!(Text::from_parts(vec![0, 1, MISSING], "ab".into(), vec![1, 2]).is_some());
        assert!(Text::from_parts(vec![2], "ab".into(), vec![1, 2]).is_none());
        assert!(Text::from_parts(vec![0], "é".into(), vec![1]).is_none());
        assert!(Text::from_parts(vec![0], "ab".into(), vec![3]).is_none());
    }

    #[test]
    fn take_and_concat() {
        let t: Text = [Some("a"), None, Some("b")].into_iter().collect();
        let c = Column::Text(t).take(&[Some(2), Some(0), None, Some(1), Some(9)]);
        let Column::Text(t) = &c else { unreachable!() };
        assert_eq!(t.iter().collect::<Vec<_>>(), vec![Some("b"), Some("a"), None, None, None]);
        let both = Column::concat(vec![c.clone(), c]).unwrap();
        assert_eq!(both.len(), 10);
        let i = Column::Int([Some(1), None].into_iter().collect());
        let f = Column::Float(vec![2.5].into());
        let Some(Column::Float(n)) = Column::concat(vec![i.clone(), f]) else { panic!() };
        assert_eq!(n.iter().collect::<Vec<_>>(), vec![Some(1.0), None, Some(2.5)]);
        assert_eq!(Column::concat(vec![i.clone(), i]).unwrap().null_count(), 2);
        assert!(Column::concat(vec![Column::Bool(vec![None]), Column::Float(vec![1.0].into())]).is_none());
    }

    #[test]
    fn ints_keep_missing_rows() {
        let v: Ints = [Some(1), None, Some(i64::MIN)].into_iter().collect();
        assert_eq!(v.iter().collect::<Vec<_>>(), vec![Some(1), None, Some(i64::MIN)]);
        let all: Ints = [Some(1), Some(2)].into_iter().collect();
        assert!(all.valid.is_none());
    }
}
