//! The column interchange: a small binary form of a [`Table`] (with the
//! reader's diagnostics), written by the page's Arrow add-on
//! (`strata-wasm-arrow`, which decodes Arrow IPC) and read by the core
//! engine, which carries no Arrow code. The format is ours; DEVELOPERS.md
//! describes it. All integers little-endian:
//!
//! ```text
//! magic     8 bytes  "STRCOLS1"
//! flags     u32      bit 0: the reading failed (the diagnostics are errors)
//! sha256    32 bytes of the source bytes (data.sha256 is checked against it)
//! rows      u32
//! ndiag     u32, then per diagnostic: code, message, hint (strings; an
//!           empty hint is none)
//! ncols     u32, then per column: name (string), kind (u8), payload:
//!   1 number     rows x f64 (NaN: missing)
//!   2 integer    u8 has_validity, [rows x u8 (1 present, 0 missing)], rows x i64
//!   3 boolean    rows x u8 (0 false, 1 true, 2 missing)
//!   4 date       rows x f64, days since 1970-01-01 (NaN: missing)
//!   5 date-time  rows x f64, ms since 1970-01-01 UTC (NaN: missing)
//!   6 text       u32 dictionary length, then that many strings,
//!                rows x u32 codes (0xFFFFFFFF: missing)
//! string    u32 byte length, then UTF-8 bytes
//! ```
//!
//! The reader checks every length against the bytes left, so damaged input
//! is an error, never a panic or a huge allocation.

use super::table::{Column, Ints, Table, Text, MISSING};
use super::{ReadOptions, DEFAULT_MAX_ROWS};
use crate::error::{Diagnostic, Errors};

/// The first bytes of the interchange.
pub const MAGIC: &[u8; 8] = b"STRCOLS1";

fn put_u32(out: &mut Vec<u8>, v: u32) {
    out.extend_from_slice(&v.to_le_bytes());
}

fn put_str(out: &mut Vec<u8>, s: &str) {
    put_u32(out, s.len() as u32);
    out.extend_from_slice(s.as_bytes());
}

/// Write a table (or, with `Err`, the errors of reading it) for the core
/// engine; `sha256` is the digest of the bytes it was read from.
pub fn write(result: &Result<Table, Errors>, sha256: &[u8; 32]) -> Vec<u8> {
    let mut out = Vec::new();
    out.extend_from_slice(MAGIC);
    put_u32(&mut out, result.is_err() as u32);
    out.extend_from_slice(sha256);
    let (rows, diags, cols): (usize, &[Diagnostic], Option<&Table>) = match result {
        Ok(t) => (t.num_rows(), &t.warnings, Some(t)),
        Err(e) => (0, &e.0, None),
    };
    put_u32(&mut out, rows as u32);
    put_u32(&mut out, diags.len() as u32);
    for d in diags {
        put_str(&mut out, &d.code);
        put_str(&mut out, &d.message);
        put_str(&mut out, d.hint.as_deref().unwrap_or(""));
    }
    let Some(t) = cols else {
        put_u32(&mut out, 0);
        return out;
    };
    put_u32(&mut out, t.num_columns() as u32);
    for (name, col) in t.names().iter().zip(t.columns()) {
        put_str(&mut out, name);
        match col {
            Column::Float(v) | Column::Date(v) | Column::DateTime(v) => {
                out.push(match col {
                    Column::Float(_) => 1,
                    Column::Date(_) => 4,
                    _ => 5,
                });
                for x in v.raw() {
                    // Every non-finite number is missing; NaN is the one spelling.
                    out.extend_from_slice(&(if x.is_finite() { *x } else { f64::NAN }).to_le_bytes());
                }
            }
            Column::Int(v) => {
                out.push(2);
                out.push(v.valid.is_some() as u8);
                if let Some(m) = &v.valid {
                    for b in m {
                        out.push(*b as u8);
                    }
                }
                for x in &v.values {
                    out.extend_from_slice(&x.to_le_bytes());
                }
            }
            Column::Bool(v) => {
                out.push(3);
                for b in v {
                    out.push(match b {
                        Some(false) => 0u8,
                        Some(true) => 1,
                        None => 2,
                    });
                }
            }
            Column::Text(v) => {
                out.push(6);
                put_u32(&mut out, v.dict_len() as u32);
                for k in 0..v.dict_len() {
                    put_str(&mut out, v.value(k as u32));
                }
                for c in v.codes() {
                    put_u32(&mut out, *c);
                }
            }
        }
    }
    out
}

struct Reader<'a> {
    b: &'a [u8],
    pos: usize,
}

impl<'a> Reader<'a> {
    fn take(&mut self, n: usize) -> Option<&'a [u8]> {
        let end = self.pos.checked_add(n)?;
        let s = self.b.get(self.pos..end)?;
        self.pos = end;
        Some(s)
    }
    fn u8(&mut self) -> Option<u8> {
        self.take(1).map(|s| s[0])
    }
    fn u32(&mut self) -> Option<u32> {
        self.take(4).map(|s| u32::from_le_bytes([s[0], s[1], s[2], s[3]]))
    }
    fn str(&mut self) -> Option<&'a str> {
        let n = self.u32()? as usize;
        std::str::from_utf8(self.take(n)?).ok()
    }
    /// `n` values of `w` bytes each, checked against the bytes left first.
    fn array(&mut self, n: usize, w: usize) -> Option<&'a [u8]> {
        self.take(n.checked_mul(w)?)
    }
    // The arrays below fill a zeroed vector through a zip of two slices:
    // as fast as a `collect`, without its generic functions per array.
    fn f64s(&mut self, n: usize) -> Option<Vec<f64>> {
        let b = self.array(n, 8)?;
        let mut v = vec![0.0; n];
        for (x, c) in v.iter_mut().zip(b.chunks_exact(8)) {
            *x = f64::from_le_bytes([c[0], c[1], c[2], c[3], c[4], c[5], c[6], c[7]]);
        }
        Some(v)
    }
    fn i64s(&mut self, n: usize) -> Option<Vec<i64>> {
        let b = self.array(n, 8)?;
        let mut v = vec![0; n];
        for (x, c) in v.iter_mut().zip(b.chunks_exact(8)) {
            *x = i64::from_le_bytes([c[0], c[1], c[2], c[3], c[4], c[5], c[6], c[7]]);
        }
        Some(v)
    }
    fn u32s(&mut self, n: usize) -> Option<Vec<u32>> {
        let b = self.array(n, 4)?;
        let mut v = vec![0; n];
        for (x, c) in v.iter_mut().zip(b.chunks_exact(4)) {
            *x = u32::from_le_bytes([c[0], c[1], c[2], c[3]]);
        }
        Some(v)
    }
}

fn damaged() -> Errors {
    Diagnostic::error("data.interchange_invalid", "the decoded Arrow columns are damaged (the Arrow add-on and the engine may be of different versions)")
        .with_hint("load the engine and its Arrow add-on from the same build")
        .into()
}

/// The source digest, the table (or the reader's errors), as written by [`write`].
fn decode(b: &[u8]) -> Option<([u8; 32], Result<Table, Errors>)> {
    let mut r = Reader { b, pos: 0 };
    if r.take(8)? != MAGIC {
        return None;
    }
    let failed = r.u32()? & 1 == 1;
    let mut sha = [0u8; 32];
    sha.copy_from_slice(r.take(32)?);
    let rows = r.u32()? as usize;
    let ndiag = r.u32()? as usize;
    let mut diags = Vec::new();
    for _ in 0..ndiag {
        let (code, message, hint) = (r.str()?, r.str()?, r.str()?);
        let mut d = if failed { Diagnostic::error(code, message) } else { Diagnostic::warning(code, message) };
        if !hint.is_empty() {
            d = d.with_hint(hint);
        }
        diags.push(d);
    }
    if failed {
        return Some((sha, Err(Errors(diags))));
    }
    let ncols = r.u32()? as usize;
    let mut names = Vec::new();
    let mut columns = Vec::new();
    for _ in 0..ncols {
        names.push(r.str()?.to_string());
        let col = match r.u8()? {
            // The three number kinds share one read.
            k @ (1 | 4 | 5) => {
                let v = r.f64s(rows)?.into();
                match k {
                    1 => Column::Float(v),
                    4 => Column::Date(v),
                    _ => Column::DateTime(v),
                }
            }
            2 => {
                let valid = match r.u8()? {
                    0 => None,
                    1 => {
                        let b = r.array(rows, 1)?;
                        let mut v = Vec::with_capacity(rows);
                        for c in b {
                            v.push(*c != 0);
                        }
                        Some(v)
                    }
                    _ => return None,
                };
                let values = r.i64s(rows)?;
                Column::Int(Ints { values, valid })
            }
            3 => {
                let b = r.array(rows, 1)?;
                let mut v = Vec::with_capacity(rows);
                for c in b {
                    v.push(match c {
                        0 => Some(false),
                        1 => Some(true),
                        2 => None,
                        _ => return None,
                    });
                }
                Column::Bool(v)
            }
            6 => {
                let n = r.u32()? as usize;
                // Each entry takes at least its 4-byte length.
                if n > (b.len() - r.pos) / 4 {
                    return None;
                }
                let (mut dict, mut ends) = (String::new(), Vec::with_capacity(n));
                for _ in 0..n {
                    dict.push_str(r.str()?);
                    ends.push(u32::try_from(dict.len()).ok()?);
                }
                let codes = r.u32s(rows)?;
                Column::Text(Text::from_parts(codes, dict, ends)?)
            }
            _ => return None,
        };
        columns.push(col);
    }
    if r.pos != b.len() {
        return None;
    }
    let _ = MISSING;
    Some((sha, Ok(Table::new(names, columns, rows, diags))))
}

/// Read the interchange: check `data.sha256` against the source digest,
/// the row cap, and apply the `data.types` overrides.
pub fn read(bytes: &[u8], opts: &ReadOptions) -> Result<Table, Errors> {
    let (sha, table) = decode(bytes).ok_or_else(damaged)?;
    if let Some(expected) = &opts.sha256 {
        super::check_digest(Some(&super::hex(&sha)), expected)?;
    }
    let table = table?;
    let max_rows = if opts.max_rows == 0 { DEFAULT_MAX_ROWS } else { opts.max_rows };
    if table.num_rows() > max_rows {
        return Err(Diagnostic::error("data.too_many_rows", format!("the data has {} rows, more than the row cap of {max_rows}", table.num_rows()))
            .with_hint("raise the row cap (`ReadOptions::max_rows`) where the data is loaded, or filter the data before charting it")
            .into());
    }
    super::retype_table(table, opts)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::data::read as read_data;
    use crate::error::Severity;

    fn sample() -> Table {
        read_data(b"n,i,b,d,t,s\n1.5,1,true,2024-01-02,2024-01-02T03:04:05Z,a\n,,,,,\n-2,3,false,1969-12-31,1969-12-31T23:59:59Z,b\n", &ReadOptions::default())
            .unwrap()
    }

    #[test]
    fn round_trips_every_kind() {
        let t = sample();
        let bytes = write(&Ok(t.clone()), &[7; 32]);
        let back = read(&bytes, &ReadOptions::default()).unwrap();
        assert_eq!(back.column_names(), t.column_names());
        assert_eq!(back.columns(), t.columns());
        assert_eq!(back.num_rows(), 3);
    }

    #[test]
    fn errors_and_warnings_travel() {
        let e: Result<Table, Errors> = Err(Diagnostic::error("data.arrow_invalid", "bad").with_hint("h").into());
        let back = read(&write(&e, &[0; 32]), &ReadOptions::default()).unwrap_err();
        assert_eq!((back.0[0].code.as_str(), back.0[0].hint.as_deref()), ("data.arrow_invalid", Some("h")));
        let mut t = sample();
        t.warnings.push(Diagnostic::warning("data.unsupported_column", "left out"));
        let back = read(&write(&Ok(t), &[0; 32]), &ReadOptions::default()).unwrap();
        assert_eq!(back.warnings[0].code, "data.unsupported_column");
        assert_eq!(back.warnings[0].severity, Severity::Warning);
    }

    #[test]
    fn digest_cap_and_overrides_apply() {
        let bytes = write(&Ok(sample()), &[0xab; 32]);
        let o = ReadOptions { sha256: Some("ab".repeat(32)), ..Default::default() };
        assert!(read(&bytes, &o).is_ok());
        let o = ReadOptions { sha256: Some("cd".repeat(32)), ..Default::default() };
        assert_eq!(read(&bytes, &o).unwrap_err().0[0].code, "data.sha256_mismatch");
        let o = ReadOptions { max_rows: 2, ..Default::default() };
        assert_eq!(read(&bytes, &o).unwrap_err().0[0].code, "data.too_many_rows");
        let mut o = ReadOptions::default();
        o.types.insert("i".into(), crate::spec::ColumnType::Number);
        assert_eq!(read(&bytes, &o).unwrap().column(1).kind(), crate::data::table::Kind::Float);
    }

    #[test]
    fn damage_is_an_error_not_a_panic() {
        let bytes = write(&Ok(sample()), &[0; 32]);
        for cut in 0..bytes.len() {
            assert!(read(&bytes[..cut], &ReadOptions::default()).is_err(), "{cut}");
        }
        let mut x: u64 = 0x1234_5678_9abc_def1;
        for _ in 0..3000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            let mut b = bytes.clone();
            let i = (x as usize) % b.len();
            b[i] ^= (x >> 32) as u8 | 1;
            let _ = read(&b, &ReadOptions::default());
        }
    }
}
