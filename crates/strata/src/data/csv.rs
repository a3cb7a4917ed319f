//! Delimited text (RFC 4180 CSV, TSV, other single-byte delimiters)
//! tokenised with `csv-core` straight into per-column byte buffers, then
//! typed column by column (numbers as they stream past).
//!
//! No per-row or per-field objects are made: a text column is one `Vec<u8>`
//! plus one `i32` end offset per cell until it is dictionary-coded. Line numbers are not tracked while reading; an error
//! finds its line afterwards from the record's byte offset.

use super::columns::{
    build_noting, days_as_f64, ints_as_f64, is_not_finite, note, parse_bool, parse_date, parse_datetime, parse_float, parse_int, type_word, unique_names,
    with_missing, with_nan, CellError, CellRules, NotFinite, TextColumn, EXPECT_BOOL, EXPECT_DATE,
};
use super::table::{Column, Ints};
use super::{ReadOptions, Table};
use crate::error::{Diagnostic, Errors};
use crate::spec::ColumnType;
use csv_core::{ReadRecordResult, ReaderBuilder};

/// Most errors of one kind listed before reading stops.
const MAX_LISTED: usize = 5;

/// Call `f(start, fields, ends)` for each record: `start` is the byte offset
/// where the record's text begins (blank lines before it included), `fields`
/// the unescaped field bytes back to back and `ends` each field's end in
/// `fields`. `f` returns `false` to stop. Returns the start of the last
/// record seen when the input ran out, `None` when `f` stopped early.
pub(crate) fn for_each_record<F>(bytes: &[u8], delimiter: u8, mut f: F) -> Option<Option<usize>>
where
    F: FnMut(usize, &[u8], &[usize]) -> bool,
{
    each_record(bytes, delimiter, &mut f)
}

/// [`for_each_record`]'s one copy: the callback is called once per record
/// (not per cell), so a dynamic call costs nothing measurable and the
/// record loop is not repeated for every caller.
#[inline(never)]
fn each_record(bytes: &[u8], delimiter: u8, f: &mut dyn FnMut(usize, &[u8], &[usize]) -> bool) -> Option<Option<usize>> {
    let mut rdr = ReaderBuilder::new().delimiter(delimiter).build();
    let mut out = vec![0u8; 1 << 16];
    let mut ends = vec![0usize; 64];
    let (mut pos, mut nout, mut nend, mut start) = (0usize, 0usize, 0usize, 0usize);
    let mut last = None;
    loop {
        let (res, i, o, e) = rdr.read_record(&bytes[pos..], &mut out[nout..], &mut ends[nend..]);
        pos += i;
        nout += o;
        nend += e;
        match res {
            ReadRecordResult::InputEmpty => {}
            ReadRecordResult::OutputFull => {
                let n = out.len() * 2;
                out.resize(n, 0);
            }
            ReadRecordResult::OutputEndsFull => {
                let n = ends.len() * 2;
                ends.resize(n, 0);
            }
            ReadRecordResult::Record => {
                if !f(start, &out[..nout], &ends[..nend]) {
                    return None;
                }
                last = Some(start);
                start = pos;
                nout = 0;
                nend = 0;
            }
            ReadRecordResult::End => return Some(last),
        }
    }
}

/// 1-based line of the first record text at or after byte `off` (blank
/// lines skipped). LF, CRLF and a lone CR each end a line.
pub(crate) fn line_at(bytes: &[u8], off: usize) -> u64 {
    let mut p = off.min(bytes.len());
    while p < bytes.len() && (bytes[p] == b'\n' || bytes[p] == b'\r') {
        p += 1;
    }
    line_of_byte(bytes, p)
}

/// 1-based line holding byte `p`.
pub(crate) fn line_of_byte(bytes: &[u8], p: usize) -> u64 {
    let head = &bytes[..p.min(bytes.len())];
    let mut line = 1u64;
    for (i, &b) in head.iter().enumerate() {
        if b == b'\n' || (b == b'\r' && bytes.get(i + 1) != Some(&b'\n')) {
            line += 1;
        }
    }
    line
}

/// Byte offset where record `k` (0 = header) starts.
fn record_start(bytes: &[u8], delimiter: u8, k: usize) -> usize {
    let mut n = 0;
    let mut found = bytes.len();
    for_each_record(bytes, delimiter, |start, _, _| {
        if n == k {
            found = start;
            return false;
        }
        n += 1;
        true
    });
    found
}

/// If the text of the last record leaves a quoted field open at the end of
/// the input, the byte offset of its opening quote and its field number.
fn open_quote(raw: &[u8], delimiter: u8) -> Option<(usize, usize)> {
    let mut i = 0;
    let mut field = 0;
    let mut at_start = true;
    while i < raw.len() {
        let c = raw[i];
        if at_start && c == b'"' {
            let open = i;
            i += 1;
            loop {
                match raw[i.min(raw.len())..].iter().position(|b| *b == b'"') {
                    None => return Some((open, field)),
                    Some(j) => {
                        let q = i + j;
                        if raw.get(q + 1) == Some(&b'"') {
                            i = q + 2;
                        } else {
                            i = q + 1;
                            break;
                        }
                    }
                }
            }
            at_start = false;
            continue;
        }
        if c == delimiter {
            field += 1;
            at_start = true;
        } else if c == b'\n' || c == b'\r' {
            field = 0;
            at_start = true;
        } else {
            at_start = false;
        }
        i += 1;
    }
    None
}

/// Where one column's cells go while reading. Columns whose first data
/// cell is a number are parsed as they stream past (no text kept); a later
/// cell that does not fit widens integers to floats in place, or sends the
/// column to `Redo`, whose text a second pass gathers. The result is the
/// same as typing the text afterwards (see [`build`]).
enum Sink {
    Text(TextColumn),
    Int { vals: Vec<i64>, nulls: Option<Vec<bool>>, neg_zero: Vec<usize> },
    Float { vals: Vec<f64>, nulls: Option<Vec<bool>> },
    Bool { vals: Vec<bool>, nulls: Option<Vec<bool>> },
    Date { vals: Vec<i32>, nulls: Option<Vec<bool>> },
    DateTime { vals: Vec<i64>, nulls: Option<Vec<bool>> },
    Redo,
}

#[inline]
fn push_null(nulls: &mut Option<Vec<bool>>, len: usize) {
    nulls
        .get_or_insert_with(|| {
            let mut b = Vec::with_capacity(len + 1024);
            b.resize(len, true);
            b
        })
        .push(false);
}

#[inline]
fn push_valid(nulls: &mut Option<Vec<bool>>) {
    if let Some(b) = nulls.as_mut() {
        b.push(true);
    }
}

fn first_sink(cell: &[u8], forced: Option<ColumnType>, rules: &CellRules, share: usize) -> Sink {
    let text = || {
        let mut c = TextColumn::default();
        c.values.reserve(share);
        Sink::Text(c)
    };
    let (float, boolean) = (Sink::Float { vals: Vec::new(), nulls: None }, Sink::Bool { vals: Vec::with_capacity(1024), nulls: None });
    let (date, datetime) = (Sink::Date { vals: Vec::new(), nulls: None }, Sink::DateTime { vals: Vec::new(), nulls: None });
    // The same order as columns::build's inference from the first cell.
    match forced {
        Some(ColumnType::Number) => float,
        Some(ColumnType::Bool) => boolean,
        Some(ColumnType::Date) => date,
        Some(ColumnType::Text) => text(),
        None if rules.is_null(cell) => text(),
        None if parse_int(cell).is_some() => Sink::Int { vals: Vec::new(), nulls: None, neg_zero: Vec::new() },
        None if parse_float(cell, rules.decimal_comma).is_some() => float,
        None if parse_bool(cell).is_some() => boolean,
        None if parse_date(cell).is_some() => date,
        None if parse_datetime(cell).is_some() => datetime,
        None => text(),
    }
}

fn mismatch(bytes: &[u8], start: usize, k: usize, name: &str, t: Option<ColumnType>, cell: &[u8], expected: &str) -> Diagnostic {
    let word = t.map(type_word).unwrap_or("?");
    Diagnostic::error("data.type_mismatch", format!("column `{name}` is declared `{word}` but holds `{}`: expected {expected}", String::from_utf8_lossy(cell)))
        .at_path(format!("data.types.{name}"))
        .at_data(line_at(bytes, start), Some(k as u64 + 1))
        .with_hint(format!("fix the cell, make it empty for a missing value, or drop `{name}` from `data.types`"))
}

/// An Int sink meets its first float cell `f`: the integers so far as
/// floats. Integers convert to f64 exactly rounded, as their text would
/// parse; only `-0` needs its sign back. Out of line: once per column.
#[cold]
#[inline(never)]
fn ints_to_floats(vals: &[i64], neg_zero: &[usize], mut nulls: Option<Vec<bool>>, f: f64) -> Sink {
    let mut fv = ints_as_f64(vals);
    for &i in neg_zero {
        fv[i] = -0.0;
    }
    fv.push(f);
    push_valid(&mut nulls);
    Sink::Float { vals: fv, nulls }
}

/// A Date sink meets its first date-time `t`: dates widen to date-times at
/// midnight UTC, as columns::build does. Out of line: once per column.
#[cold]
#[inline(never)]
fn dates_to_datetimes(vals: &[i32], mut nulls: Option<Vec<bool>>, t: i64) -> Sink {
    let mut tv = Vec::with_capacity(vals.len() + 1);
    for d in vals {
        tv.push(*d as i64 * 86_400_000);
    }
    tv.push(t);
    push_valid(&mut nulls);
    Sink::DateTime { vals: tv, nulls }
}

#[cold]
#[inline(never)]
fn ragged_row(bytes: &[u8], start: usize, n: usize, ncols: usize) -> Diagnostic {
    Diagnostic::error("data.ragged_row", format!("this row has {n} fields but the header has {ncols}"))
        .at_data(line_at(bytes, start), Some(n.min(ncols) as u64 + 1))
        .with_hint(if n > ncols {
            "quote fields that hold the delimiter, or add the missing header names"
        } else {
            "every row needs as many fields as the header; leave a field empty for a missing value"
        })
}

#[cold]
#[inline(never)]
fn too_many_rows(bytes: &[u8], start: usize, max_rows: usize) -> Diagnostic {
    Diagnostic::error("data.too_many_rows", format!("the data has more than {max_rows} rows, the row cap"))
        .at_data(line_at(bytes, start), None)
        .with_hint("raise the row cap (`ReadOptions::max_rows`) where the data is loaded, or filter the file before charting it")
}

#[cold]
#[inline(never)]
fn text_too_large() -> Diagnostic {
    Diagnostic::error("data.too_large", "a column holds more than 2 GiB of text, more than one column can hold")
}

/// What reading the records gives: one sink per header cell.
struct Parsed {
    sinks: Vec<Sink>,
    /// Per column: cells of a number column that were not finite numbers.
    odd: Vec<NotFinite>,
}

/// The header record's cells, and the offset where the data starts.
fn header_record(bytes: &[u8], delimiter: u8) -> Option<Vec<Vec<u8>>> {
    let mut header = None;
    for_each_record(bytes, delimiter, |_, buf, ends| {
        let mut s = 0;
        let mut cells = Vec::with_capacity(ends.len());
        for &e in ends {
            cells.push(buf[s..e].to_vec());
            s = e;
        }
        header = Some(cells);
        false
    });
    header
}

fn tokenize(bytes: &[u8], delimiter: u8, max_rows: usize, names: &[String], forced: &[Option<ColumnType>], rules: &CellRules) -> Result<Parsed, Errors> {
    let ncols = names.len();
    let mut sinks: Vec<Sink> = Vec::new();
    let mut errors: Vec<Diagnostic> = Vec::new();
    let mut fatal: Option<Diagnostic> = None;
    let mut rows = 0usize;
    let mut seen_header = false;
    let dc = rules.decimal_comma;
    let share = bytes.len() / ncols.max(1) + 16;
    let mut odd: Vec<NotFinite> = vec![None; ncols];
    let done = for_each_record(bytes, delimiter, |start, buf, ends| {
        if !seen_header {
            seen_header = true;
            return true;
        }
        if ends.len() != ncols {
            errors.push(ragged_row(bytes, start, ends.len(), ncols));
            return errors.len() < MAX_LISTED;
        }
        if !errors.is_empty() {
            return true;
        }
        let row = rows;
        rows += 1;
        if rows > max_rows {
            fatal = Some(too_many_rows(bytes, start, max_rows));
            return false;
        }
        if sinks.is_empty() {
            let mut s = 0;
            sinks = Vec::with_capacity(ends.len());
            for (k, &e) in ends.iter().enumerate() {
                sinks.push(first_sink(&buf[s..e], forced[k], rules, share));
                s = e;
            }
        }
        let mut s = 0;
        for (k, (sink, &e)) in sinks.iter_mut().zip(ends).enumerate() {
            let cell = &buf[s..e];
            s = e;
            match sink {
                Sink::Text(col) => {
                    if !col.push(cell) {
                        fatal = Some(text_too_large().at_data(line_at(bytes, start), None));
                        return false;
                    }
                }
                Sink::Int { vals, nulls, neg_zero } => {
                    if rules.is_null(cell) {
                        vals.push(0);
                        push_null(nulls, row);
                    } else if let Some(v) = parse_int(cell) {
                        if v == 0 && cell.contains(&b'-') {
                            neg_zero.push(row);
                        }
                        vals.push(v);
                        push_valid(nulls);
                    } else if let Some(f) = parse_float(cell, dc) {
                        *sink = ints_to_floats(vals, neg_zero, nulls.take(), f);
                    } else if is_not_finite(cell, dc) {
                        vals.push(0);
                        push_null(nulls, row);
                        note(&mut odd[k], row);
                    } else {
                        *sink = Sink::Redo;
                    }
                }
                Sink::Float { vals, nulls } => {
                    if rules.is_null(cell) {
                        vals.push(0.0);
                        push_null(nulls, row);
                    } else if let Some(v) = parse_float(cell, dc) {
                        vals.push(v);
                        push_valid(nulls);
                    } else if is_not_finite(cell, dc) {
                        vals.push(0.0);
                        push_null(nulls, row);
                        note(&mut odd[k], row);
                    } else if forced[k].is_some() {
                        fatal = Some(mismatch(bytes, start, k, &names[k], forced[k], cell, if dc { "a number (decimal comma)" } else { "a number" }));
                        return false;
                    } else {
                        *sink = Sink::Redo;
                    }
                }
                Sink::Bool { vals, nulls } => {
                    if rules.is_null(cell) {
                        vals.push(false);
                        push_null(nulls, row);
                    } else if let Some(v) = parse_bool(cell) {
                        vals.push(v);
                        push_valid(nulls);
                    } else if forced[k].is_some() {
                        fatal = Some(mismatch(bytes, start, k, &names[k], forced[k], cell, EXPECT_BOOL));
                        return false;
                    } else {
                        *sink = Sink::Redo;
                    }
                }
                Sink::Date { vals, nulls } => {
                    if rules.is_null(cell) {
                        vals.push(0);
                        push_null(nulls, row);
                    } else if let Some(v) = parse_date(cell) {
                        vals.push(v);
                        push_valid(nulls);
                    } else if let Some(v) = forced[k].and(super::columns::parse_basic_date(cell)) {
                        // Declared a date: ISO 8601's basic form too (19580329).
                        vals.push(v);
                        push_valid(nulls);
                    } else if let Some(t) = parse_datetime(cell) {
                        *sink = dates_to_datetimes(vals, nulls.take(), t);
                    } else if forced[k].is_some() {
                        fatal = Some(mismatch(bytes, start, k, &names[k], forced[k], cell, EXPECT_DATE));
                        return false;
                    } else {
                        *sink = Sink::Redo;
                    }
                }
                Sink::DateTime { vals, nulls } => {
                    if rules.is_null(cell) {
                        vals.push(0);
                        push_null(nulls, row);
                    } else if let Some(v) = parse_datetime(cell) {
                        vals.push(v);
                        push_valid(nulls);
                    } else if forced[k].is_some() {
                        fatal = Some(mismatch(bytes, start, k, &names[k], forced[k], cell, EXPECT_DATE));
                        return false;
                    } else {
                        *sink = Sink::Redo;
                    }
                }
                Sink::Redo => {}
            }
        }
        true
    });
    if let Some(d) = fatal {
        return Err(d.into());
    }
    if let Some(Some(last)) = done {
        if let Some((open, field)) = open_quote(&bytes[last..], delimiter) {
            let at = last + open;
            let line = line_of_byte(bytes, at);
            // The row errors come in line order: keep those before the quote.
            let keep = errors.iter().take_while(|e| e.at.line.is_some_and(|l| l < line)).count();
            errors.truncate(keep);
            errors.push(
                Diagnostic::error("data.unterminated_quote", "a quoted field is never closed: expected a closing `\"` before the end of the data")
                    .at_data(line, Some(field as u64 + 1))
                    .with_hint("close the quote, or double a quote that is part of the text (`\"\"`)"),
            );
        }
    }
    if !errors.is_empty() {
        return Err(Errors(errors));
    }
    if sinks.is_empty() {
        sinks = Vec::with_capacity(ncols);
        for _ in 0..ncols {
            sinks.push(Sink::Text(TextColumn::default()));
        }
    }
    // Second pass for columns whose guess failed: gather their text.
    let mut redo: Vec<usize> = Vec::new();
    let mut cols: Vec<TextColumn> = Vec::new();
    for (k, sink) in sinks.iter().enumerate() {
        if matches!(sink, Sink::Redo) {
            redo.push(k);
            cols.push(TextColumn::default());
        }
    }
    if !redo.is_empty() {
        let mut first = true;
        let mut too_large = false;
        for_each_record(bytes, delimiter, |_, buf, ends| {
            if first {
                first = false;
                return true;
            }
            for (col, &k) in cols.iter_mut().zip(&redo) {
                let s = if k == 0 { 0 } else { ends[k - 1] };
                if !col.push(&buf[s..ends[k]]) {
                    too_large = true;
                    return false;
                }
            }
            true
        });
        if too_large {
            return Err(text_too_large().into());
        }
        for (col, k) in cols.into_iter().zip(redo) {
            sinks[k] = Sink::Text(col);
            odd[k] = None;
        }
    }
    Ok(Parsed { sinks, odd })
}

/// Every record's cells as text, header first, for tests against other
/// readers. Errors as [`read`] reports them (unterminated quote).
pub fn records(bytes: &[u8], delimiter: u8) -> Result<Vec<Vec<String>>, Errors> {
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    let mut rows = Vec::new();
    let done = for_each_record(bytes, delimiter, |_, buf, ends| {
        let mut s = 0;
        rows.push(
            ends.iter()
                .map(|&e| {
                    let c = String::from_utf8_lossy(&buf[s..e]).into_owned();
                    s = e;
                    c
                })
                .collect(),
        );
        true
    });
    if let Some(Some(last)) = done {
        if let Some((open, field)) = open_quote(&bytes[last..], delimiter) {
            return Err(Diagnostic::error("data.unterminated_quote", "a quoted field is never closed")
                .at_data(line_of_byte(bytes, last + open), Some(field as u64 + 1))
                .into());
        }
    }
    Ok(rows)
}

/// Pick the delimiter among comma, semicolon, tab and pipe: the one that
/// splits the first records into the same number (above one) of fields,
/// the most fields winning; comma when none does.
pub fn sniff_delimiter(bytes: &[u8]) -> u8 {
    const CANDIDATES: [u8; 4] = [b',', b';', b'\t', b'|'];
    const SAMPLE: usize = 64 * 1024;
    const RECORDS: usize = 50;
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    let truncated = bytes.len() > SAMPLE;
    let sample = &bytes[..bytes.len().min(SAMPLE)];
    let mut best: Option<(usize, bool, u8)> = None; // (fields, consistent, delimiter)
    for d in CANDIDATES {
        let mut counts = Vec::new();
        for_each_record(sample, d, |_, _, ends| {
            counts.push(ends.len());
            counts.len() <= RECORDS
        });
        if truncated && counts.len() > 1 && counts.len() <= RECORDS {
            counts.pop();
        }
        let Some(&first) = counts.first() else { continue };
        let consistent = counts.iter().all(|c| *c == first);
        if first < 2 {
            continue;
        }
        let better = match best {
            None => true,
            Some((f, c, _)) => (consistent && !c) || (consistent == c && first > f),
        };
        if better {
            best = Some((first, consistent, d));
        }
    }
    best.map(|b| b.2).unwrap_or(b',')
}

/// Read delimited text with a header row.
pub fn read(bytes: &[u8], delimiter: u8, opts: &ReadOptions) -> Result<Table, Errors> {
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    if opts.decimal_comma && delimiter == b',' {
        return Err(Diagnostic::error("data.decimal_comma", "a decimal comma needs a delimiter other than the comma")
            .with_hint("use semicolon- or tab-separated data with a decimal comma")
            .into());
    }
    let Some(header) = header_record(bytes, delimiter) else {
        return Err(Diagnostic::error("data.empty", "the data is empty: expected a header row").at_data(1, None).into());
    };
    let mut raw_names = Vec::with_capacity(header.len());
    for (c, h) in header.into_iter().enumerate() {
        match String::from_utf8(h) {
            Ok(s) => raw_names.push(s),
            Err(e) => {
                return Err(Diagnostic::error(
                    "data.invalid_utf8",
                    format!("the header is not valid UTF-8 (byte {} of header cell {})", e.utf8_error().valid_up_to() + 1, c + 1),
                )
                .at_data(line_at(bytes, 0), Some(c as u64 + 1))
                .with_hint("save the file as UTF-8")
                .into());
            }
        }
    }
    let (names, notes) = unique_names(raw_names.clone());
    let mut warnings: Vec<Diagnostic> = Vec::with_capacity(notes.len());
    let mut notes = notes.into_iter();
    for (i, (r, n)) in raw_names.iter().zip(&names).enumerate() {
        if r != n {
            let Some(note) = notes.next() else { break };
            warnings.push(Diagnostic::warning("data.renamed_header", note).at_data(line_at(bytes, 0), Some(i as u64 + 1)));
        }
    }
    warnings.extend(super::unknown_type_keys(&opts.types, &names));
    let rules = CellRules::new(&opts.null_tokens, opts.decimal_comma);
    let mut forced: Vec<Option<ColumnType>> = Vec::with_capacity(names.len());
    for n in &names {
        forced.push(opts.types.get(n).copied());
    }
    let Parsed { sinks, odd } = tokenize(bytes, delimiter, opts.max_rows, &names, &forced, &rules)?;
    let mut columns = Vec::with_capacity(names.len());
    for (c, ((sink, name), mut odd)) in sinks.into_iter().zip(&names).zip(odd).enumerate() {
        let col = match sink {
            Sink::Int { vals, nulls, .. } => Column::Int(Ints { values: vals, valid: nulls }),
            Sink::Float { vals, nulls } => Column::Float(with_nan(vals, nulls)),
            Sink::Bool { vals, nulls } => Column::Bool(with_missing(&vals, nulls.as_deref())),
            Sink::Date { vals, nulls } => Column::Date(with_nan(days_as_f64(&vals), nulls)),
            Sink::DateTime { vals, nulls } => Column::DateTime(with_nan(ints_as_f64(&vals), nulls)),
            Sink::Text(col) => {
                let (col, o) = build_noting(col, forced[c], &rules).map_err(|e| cell_error(bytes, delimiter, name, c, forced[c], e))?;
                odd = o;
                col
            }
            Sink::Redo => return Err(Diagnostic::error("data.internal", format!("column `{name}` was not read")).into()),
        };
        if let Some((row, count)) = odd {
            let line = line_at(bytes, record_start(bytes, delimiter, row + 1));
            warnings.push(not_finite_warning(name, count, &format!("line {line}")).at_data(line, Some(c as u64 + 1)));
        }
        columns.push(col);
    }
    Ok(Table::from_columns(names, columns, warnings))
}

/// One warning for a number column's cells that were not finite numbers.
pub(crate) fn not_finite_warning(name: &str, count: usize, first: &str) -> Diagnostic {
    let cells = if count == 1 { "1 cell".to_string() } else { format!("{count} cells") };
    Diagnostic::warning(
        "data.not_finite",
        format!("column `{name}` holds numbers, but {cells} (the first on {first}) hold NaN, an infinity or a number too large for a 64-bit float; they are read as missing"),
    )
    .with_hint("write an empty cell for a missing value")
}

fn cell_error(bytes: &[u8], delimiter: u8, name: &str, c: usize, forced: Option<ColumnType>, e: CellError) -> Errors {
    let line = line_at(bytes, record_start(bytes, delimiter, e.row + 1));
    let d = match (e.invalid_utf8, forced) {
        (Some(at), _) => Diagnostic::error(
            "data.invalid_utf8",
            format!("the data is not valid UTF-8: byte {} of the cell in column `{name}` is not part of a UTF-8 character", at + 1),
        )
        .with_hint("save the file as UTF-8"),
        (None, Some(t)) => {
            Diagnostic::error("data.type_mismatch", format!("column `{name}` is declared `{}` but holds `{}`: expected {}", type_word(t), e.value, e.expected))
                .at_path(format!("data.types.{name}"))
                .with_hint(format!("fix the cell, make it empty for a missing value, or drop `{name}` from `data.types`"))
        }
        (None, None) => Diagnostic::error("data.internal", format!("column `{name}`: {}", e.value)),
    };
    d.at_data(line, Some(c as u64 + 1)).into()
}

#[cfg(test)]
mod tests {

    /// Eight digits in a column declared `date` are ISO 8601's basic form
    /// (statsmodels' co2 table writes 19580329); undeclared, they stay numbers.
    #[test]
    fn declared_dates_read_the_basic_form() {
        let mut o = opts();
        o.types.insert("day".into(), ColumnType::Date);
        let t = read(b"day,v\n19580329,1\n1958-04-05,2\n\n", b',', &o).unwrap();
        // Days since 1970-01-01 by Python 3.11.7's date.fromisoformat.
        let Some(Column::Date(days)) = t.by_name("day") else { panic!("{:?}", t.by_name("day")) };
        assert_eq!((days.get(0), days.get(1)), (Some(-4296.0), Some(-4289.0)));
        let t = read(b"day,v\n19580329,1\n", b',', &opts()).unwrap();
        assert!(matches!(t.by_name("day"), Some(Column::Int(_))), "{:?}", t.by_name("day"));
        o.types.insert("day".into(), ColumnType::Date);
        assert!(read(b"day,v\n19581329,1\n", b',', &o).is_err());
    }

    use super::*;
    use crate::data::columns::build;
    use crate::spec::ColumnType;
    use indexmap::IndexMap;

    fn text(c: &Column) -> Vec<Option<&str>> {
        let Column::Text(t) = c else { panic!("not text: {c:?}") };
        t.iter().collect()
    }

    fn opts() -> ReadOptions {
        ReadOptions::default()
    }

    /// A hostile text column: cells crafted so that their hashes collide
    /// under the dictionary index's first seed (crate::index::colliding_keys),
    /// each twice in a row so the reader keeps a dictionary. Reading stays linear in
    /// probes (n cells colliding would cost n * n / 2 without the index's
    /// reseed): counted, not timed.
    #[test]
    fn colliding_text_cells_stay_linear() {
        let keys = crate::index::colliding_keys(5000, true);
        let mut csv = b"v\n".to_vec();
        for k in keys.iter().flat_map(|k| [k, k]) {
            csv.push(b'"');
            for &c in k {
                if c == b'"' {
                    csv.push(b'"');
                }
                csv.push(c);
            }
            csv.extend_from_slice(b"\"\n");
        }
        let before = crate::index::probes();
        let t = read(&csv, b',', &opts()).unwrap();
        let probes = crate::index::probes() - before;
        let Some(Column::Text(col)) = t.by_name("v") else { panic!("{:?}", t.by_name("v")) };
        assert_eq!((col.len(), col.dict_len()), (10_000, 5000));
        assert_eq!(col.get(14).map(str::as_bytes), Some(&keys[7][..]));
        assert_eq!(col.get(15).map(str::as_bytes), Some(&keys[7][..]));
        // Linear: a few probes a cell, plus the colliding run before the
        // reseed (up to LONG_PROBE keys, looked up and inserted), where
        // quadratic would be about 5000 * 5000 = 2.5e7.
        let long = crate::index::LONG_PROBE as u64;
        assert!(probes < 20 * 10_000 + long * long, "{probes} probes for 10,000 cells");
    }

    fn t(s: &str) -> Table {
        read(s.as_bytes(), b',', &opts()).unwrap()
    }

    #[test]
    fn quotes_crlf_and_bom() {
        // RFC 4180 (Shafranovich 2005) section 2, rules 6 and 7: quoted
        // fields may hold commas, line breaks and doubled quotes.
        let tb = t("\u{feff}a,b\r\n1,\"x, \"\"y\"\"\r\nz\"\r\n2,w\r\n");
        assert_eq!(tb.num_rows(), 2);
        assert_eq!(text(tb.column(1))[0], Some("x, \"y\"\r\nz"));
        let Column::Int(a) = tb.column(0) else { panic!() };
        assert_eq!(a.get(1), Some(2));
        assert_eq!(tb.column_names(), vec!["a", "b"]);
    }

    #[test]
    fn nulls_floats_and_blank_lines() {
        let tb = t("v\n1.5\nNA\n\n-2\n");
        let Column::Float(v) = tb.column(0) else { panic!() };
        assert_eq!(v.iter().collect::<Vec<_>>(), vec![Some(1.5), None, Some(-2.0)]);
    }

    #[test]
    fn lone_cr_ends_lines() {
        let tb = t("a,b\r1,2\r3,4");
        assert_eq!(tb.num_rows(), 2);
        let e = read(b"a,b\r1,2\r3\r", b',', &opts()).unwrap_err();
        assert_eq!(e.0[0].at.line, Some(3));
    }

    #[test]
    fn ragged_rows_are_located() {
        let e = read(b"a,b\n1,2\n3\n\n4,5,6\n", b',', &opts()).unwrap_err();
        assert_eq!(e.0.len(), 2);
        assert_eq!((e.0[0].at.line, e.0[0].at.column), (Some(3), Some(2)));
        assert_eq!((e.0[1].at.line, e.0[1].at.column), (Some(5), Some(3)));
        assert_eq!(e.0[0].code, "data.ragged_row");
    }

    #[test]
    fn unterminated_quote_is_located() {
        let e = read(b"a,b\n1,2\n3,\"oops\n4,5\n", b',', &opts()).unwrap_err();
        assert_eq!(e.0[0].code, "data.unterminated_quote");
        assert_eq!((e.0[0].at.line, e.0[0].at.column), (Some(3), Some(2)));
        // A closed quote followed by more text is not an open quote.
        assert!(read(b"a\n\"x\"\"y\"z\n", b',', &opts()).is_ok());
    }

    #[test]
    fn invalid_utf8_is_located() {
        let e = read(b"a,b\n1,ok\n2,b\xffd\n", b',', &opts()).unwrap_err();
        assert_eq!(e.0[0].code, "data.invalid_utf8");
        assert_eq!((e.0[0].at.line, e.0[0].at.column), (Some(3), Some(2)));
        let e = read(b"a,\xc3\n1,2\n", b',', &opts()).unwrap_err();
        assert_eq!((e.0[0].at.line, e.0[0].at.column), (Some(1), Some(2)));
    }

    #[test]
    fn override_mismatch_names_spec_path() {
        let mut o = opts();
        o.types.insert("a".to_string(), ColumnType::Number);
        let e = read(b"a\n1\n\"multi\nline\"\nabc\n", b',', &o).unwrap_err();
        assert_eq!(e.0[0].at.path, "data.types.a");
        assert_eq!(e.0[0].at.line, Some(3));
        assert!(e.0[0].message.contains("multi"), "{}", e.0[0].message);
    }

    #[test]
    fn headers_made_unique_with_warnings() {
        let tb = t("x,,x\n1,2,3\n");
        assert_eq!(tb.column_names(), vec!["x", "column_2", "x_2"]);
        assert_eq!(tb.warnings.len(), 2);
        assert_eq!(tb.warnings[1].at.column, Some(3));
    }

    #[test]
    fn row_cap_names_itself() {
        let mut o = opts();
        o.max_rows = 2;
        assert!(read(b"a\n1\n2\n", b',', &o).is_ok());
        let e = read(b"a\n1\n2\n3\n", b',', &o).unwrap_err();
        assert_eq!(e.0[0].code, "data.too_many_rows");
        assert!(e.0[0].message.contains('2'));
        assert!(e.0[0].hint.as_deref().unwrap().contains("max_rows"));
    }

    #[test]
    fn sniffs_delimiters() {
        assert_eq!(sniff_delimiter(b"a;b;c\n1;2,5;3\n"), b';');
        assert_eq!(sniff_delimiter(b"a\tb\n1\t2\n"), b'\t');
        assert_eq!(sniff_delimiter(b"a|b\n\"1|x\"|2\n"), b'|');
        assert_eq!(sniff_delimiter(b"a,b;c\n1,2;3\n"), b',');
        assert_eq!(sniff_delimiter(b"\"a,b\";c\n\"1,2\";3\n"), b';');
        assert_eq!(sniff_delimiter(b"single\n1\n"), b',');
    }

    #[test]
    fn decimal_comma_with_semicolons() {
        let mut o = opts();
        o.decimal_comma = true;
        let tb = read(b"a;b\n1,5;x\n-2,25;y\n", b';', &o).unwrap();
        let Column::Float(a) = tb.column(0) else { panic!() };
        assert_eq!((a.get(0), a.get(1)), (Some(1.5), Some(-2.25)));
        assert!(read(b"a\n1\n", b',', &o).is_err());
    }

    #[test]
    fn custom_null_tokens() {
        let mut o = opts();
        o.null_tokens = vec!["".into(), "missing".into()];
        let tb = read(b"a,b\n1,NA\nmissing,x\n", b',', &o).unwrap();
        assert_eq!(tb.column(0).null_count(), 1);
        // `NA` is text now that it is not a null token.
        assert_eq!(text(tb.column(1))[0], Some("NA"));
    }

    /// Typing while streaming must give exactly what typing the text
    /// afterwards gives (columns::build, the reference path).
    #[test]
    fn streaming_types_match_typing_the_text() {
        let pool = [
            "1",
            "-0",
            "0",
            "007",
            "+5",
            "9007199254740993",
            "-9223372036854775808",
            "2.5",
            "-0.0",
            "1e3",
            ".5",
            "",
            "NA",
            "-",
            "x",
            "true",
            "2024-01-02",
            "-999",
            " 7 ",
            "False",
            "TRUE",
            "1969-12-31",
            "2024-05-06T07:08:09+02:00",
            "2024-05-06 07:08",
            "2023-02-29",
        ];
        let mut x: u64 = 0x2545_F491_4F6C_DD1D;
        for round in 0..6000 {
            let mut next = || {
                x ^= x << 13;
                x ^= x >> 7;
                x ^= x << 17;
                x
            };
            let n = 1 + (next() % 6) as usize;
            let lead = (next() % 3) as usize; // bias the first cells to numbers
            let cells: Vec<&str> = (0..n)
                .map(|i| if i == 0 && lead > 0 { pool[[0, 3, 7, 19, 16, 22, 23][(next() % 7) as usize]] } else { pool[(next() % pool.len() as u64) as usize] })
                .collect();
            let mut o = opts();
            if round % 3 == 0 {
                o.null_tokens = vec!["".into(), "-999".into()];
            }
            if round % 5 == 0 {
                let t = [ColumnType::Number, ColumnType::Bool, ColumnType::Date, ColumnType::Text][(round / 5) % 4];
                o.types.insert("v".into(), t);
            }
            let mut text = String::from("v\n");
            for c in &cells {
                text.push('"');
                text.push_str(c);
                text.push_str("\"\n");
            }
            let rules = CellRules::new(&o.null_tokens, false);
            let mut col = TextColumn::default();
            for c in &cells {
                col.push(c.as_bytes());
            }
            let want = build(col, o.types.get("v").copied(), &rules);
            let got = read(text.as_bytes(), b',', &o);
            match (want, got) {
                (Ok(w), Ok(g)) => assert_eq!(&w, g.column(0), "{cells:?}"),
                (Err(_), Err(e)) => assert_eq!(e.0[0].code, "data.type_mismatch", "{cells:?}"),
                (w, g) => panic!("{cells:?}: {w:?} vs {g:?}"),
            }
        }
    }

    #[test]
    fn a_non_finite_cell_among_numbers_is_missing_with_one_warning() {
        // Streamed (the first cell is a number) and typed afterwards (it is not).
        for text in ["v,w\n1,x\nNaN,y\n2.5,z\ninf,w\n", "v,w\nNaN,x\n1,y\n2.5,z\n-Infinity,w\n"] {
            let tb = t(text);
            let Column::Float(v) = tb.column(0) else { panic!("{text}: {:?}", tb.column(0)) };
            assert_eq!(v.iter().filter(Option::is_none).count(), 2, "{text}");
            assert_eq!(tb.warnings.len(), 1, "{text}");
            let w = &tb.warnings[0];
            assert_eq!((w.code.as_str(), w.at.column), ("data.not_finite", Some(1)));
            assert!(w.message.contains("`v`") && w.message.contains("2 cells"), "{}", w.message);
        }
        assert_eq!(t("v,w\n1,x\nNaN,y\n").warnings[0].at.line, Some(3));
        assert_eq!(t("v,w\nNaN,x\n1,y\n").warnings[0].at.line, Some(2));
        // Integers stay integers; a too-large number is not finite either.
        let tb = t("v\n1\n1e309\n3\n");
        assert!(matches!(tb.column(0), Column::Int(_)));
        assert_eq!(tb.column(0).null_count(), 1);
        // A declared number column reads them as missing too, not as an error.
        let mut o = opts();
        o.types.insert("v".into(), ColumnType::Number);
        assert_eq!(read(b"v\nnan\n2\n", b',', &o).unwrap().column(0).null_count(), 1);
        // Text stays text.
        assert!(matches!(t("v\nx\nNaN\n").column(0), Column::Text(_)));
    }

    #[test]
    fn header_only_and_empty() {
        let tb = t("a,b\n");
        assert_eq!(tb.num_rows(), 0);
        assert_eq!(tb.num_columns(), 2);
        assert_eq!(read(b"", b',', &opts()).unwrap_err().0[0].code, "data.empty");
        assert_eq!(read(b"\n\r\n", b',', &opts()).unwrap_err().0[0].code, "data.empty");
        let _ = IndexMap::<String, ColumnType>::new();
    }
}
