//! Text cells to typed Arrow columns: inference over all rows, or an override.

use super::time::{parse_date, parse_datetime};
use crate::spec::ColumnType;
use arrow_array::{ArrayRef, BooleanArray, Date32Array, Float64Array, Int64Array, StringArray, TimestampMillisecondArray};
use std::sync::Arc;

/// Cells read as missing values.
pub const NULL_TOKENS: [&str; 6] = ["", "NA", "N/A", "null", "NULL", "-"];

pub fn is_null(s: &str) -> bool {
    NULL_TOKENS.contains(&s)
}

/// The type inferred for a column, narrowest first.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Inferred {
    Int,
    Float,
    Bool,
    Date,
    DateTime,
    Text,
}

pub fn parse_number(s: &str) -> Option<f64> {
    let b = s.as_bytes();
    let first = *b.first()?;
    if !(first.is_ascii_digit() || first == b'-' || first == b'+' || first == b'.') {
        return None;
    }
    if !b.iter().any(u8::is_ascii_digit) || b.iter().any(|c| c.is_ascii_alphabetic() && *c != b'e' && *c != b'E') {
        return None;
    }
    s.parse::<f64>().ok().filter(|v| v.is_finite())
}

fn parse_int(s: &str) -> Option<i64> {
    let b = s.as_bytes();
    let digits = if b.first() == Some(&b'-') || b.first() == Some(&b'+') { &b[1..] } else { b };
    if digits.is_empty() || !digits.iter().all(u8::is_ascii_digit) {
        return None;
    }
    s.parse::<i64>().ok()
}

fn parse_bool(s: &str) -> Option<bool> {
    match s {
        "true" | "TRUE" | "True" => Some(true),
        "false" | "FALSE" | "False" => Some(false),
        _ => None,
    }
}

/// Infer the narrowest type that every non-null cell fits.
pub fn infer(cells: &[Option<&str>]) -> Inferred {
    let mut cands = [true; 5]; // int, float, bool, date, datetime
    let mut any = false;
    for c in cells.iter().flatten() {
        any = true;
        if cands[0] && parse_int(c).is_none() {
            cands[0] = false;
        }
        if cands[1] && parse_number(c).is_none() {
            cands[1] = false;
        }
        if cands[2] && parse_bool(c).is_none() {
            cands[2] = false;
        }
        if cands[3] && parse_date(c).is_none() {
            cands[3] = false;
        }
        if cands[4] && parse_datetime(c).is_none() && parse_date(c).is_none() {
            cands[4] = false;
        }
        if !cands.iter().any(|b| *b) {
            return Inferred::Text;
        }
    }
    if !any {
        return Inferred::Text;
    }
    [Inferred::Int, Inferred::Float, Inferred::Bool, Inferred::Date, Inferred::DateTime]
        .into_iter()
        .zip(cands)
        .find(|(_, ok)| *ok)
        .map(|(t, _)| t)
        .unwrap_or(Inferred::Text)
}

/// A cell that does not fit the column's override type.
#[derive(Debug, Clone, PartialEq)]
pub struct CellError {
    pub row: usize,
    pub value: String,
    pub expected: &'static str,
}

/// Build one Arrow column from text cells (`None` is missing).
pub fn build(cells: &[Option<&str>], forced: Option<ColumnType>) -> Result<ArrayRef, CellError> {
    let kind = match forced {
        None => infer(cells),
        Some(ColumnType::Number) => Inferred::Float,
        Some(ColumnType::Text) => Inferred::Text,
        Some(ColumnType::Bool) => Inferred::Bool,
        Some(ColumnType::Date) => {
            if cells.iter().flatten().all(|c| parse_date(c).is_some()) { Inferred::Date } else { Inferred::DateTime }
        }
    };
    fn typed<T>(cells: &[Option<&str>], expected: &'static str, f: impl Fn(&str) -> Option<T>) -> Result<Vec<Option<T>>, CellError> {
        cells
            .iter()
            .enumerate()
            .map(|(row, c)| match c {
                None => Ok(None),
                Some(s) => f(s).map(Some).ok_or_else(|| CellError { row, value: s.to_string(), expected }),
            })
            .collect()
    }
    Ok(match kind {
        Inferred::Int => Arc::new(Int64Array::from(typed(cells, "an integer", parse_int)?)),
        Inferred::Float => Arc::new(Float64Array::from(typed(cells, "a number", parse_number)?)),
        Inferred::Bool => Arc::new(BooleanArray::from(typed(cells, "true or false", parse_bool)?)),
        Inferred::Date => Arc::new(Date32Array::from(typed(cells, "a date (yyyy-MM-dd)", |s| parse_date(s).map(|d| d as i32))?)),
        Inferred::DateTime => Arc::new(
            TimestampMillisecondArray::from(typed(cells, "an ISO 8601 date or date-time", |s| {
                parse_datetime(s).or_else(|| parse_date(s).map(|d| d * 86_400_000))
            })?)
            .with_timezone("UTC"),
        ),
        Inferred::Text => Arc::new(StringArray::from(cells.to_vec())),
    })
}

/// Make header names unique and non-empty; returns warnings for renamed ones.
pub fn unique_names(raw: Vec<String>) -> (Vec<String>, Vec<String>) {
    let mut out: Vec<String> = Vec::with_capacity(raw.len());
    let mut notes = Vec::new();
    for (i, name) in raw.into_iter().enumerate() {
        let base = if name.trim().is_empty() { format!("column_{}", i + 1) } else { name.clone() };
        let mut candidate = base.clone();
        let mut k = 2;
        while out.contains(&candidate) {
            candidate = format!("{base}_{k}");
            k += 1;
        }
        if candidate != name {
            notes.push(format!("header {} `{}` renamed to `{}`", i + 1, name, candidate));
        }
        out.push(candidate);
    }
    (out, notes)
}
