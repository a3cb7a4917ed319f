//! Arrow IPC (file and stream formats) into a [`Table`], with every column
//! normalised to the six hand-off types: Float64, Int64, Boolean, Utf8,
//! Date32 and Timestamp(ms, "UTC").
//!
//! Normalisation: signed and unsigned integers widen to Int64 (UInt64 with
//! values past i64::MAX becomes Float64); Float16/32 and Decimal128 become
//! Float64; LargeUtf8, Utf8View and dictionary-encoded columns become Utf8
//! (or whatever their dictionary values normalise to); Date64 becomes Date32;
//! timestamps of any unit become milliseconds (seconds scale up, micro- and
//! nanoseconds round toward negative infinity). A timestamp with a time zone
//! is an instant in UTC in Arrow's format, so its values need no shift; one
//! without a zone is read as UTC wall time. Other types (binary, lists,
//! structs, durations, times of day) are dropped with a warning.

use super::columns::{retype, unique_names};
use super::table::Column;
use super::{ReadOptions, Table};
use crate::error::{Diagnostic, Errors};
use arrow_array::cast::AsArray;
use arrow_array::types::*;
use arrow_array::{
    new_empty_array, Array, ArrayRef, ArrowPrimitiveType, Date32Array, Float64Array, Int64Array, RecordBatch, StringArray, TimestampMillisecondArray,
};
use arrow_ipc::reader::{FileReader, StreamReader};
use arrow_schema::{ArrowError, DataType, Schema, SchemaRef, TimeUnit};
use std::collections::VecDeque;
use std::io::Cursor;
use std::sync::Arc;

fn ipc_error(e: ArrowError) -> Errors {
    Diagnostic::error("data.arrow_invalid", format!("the Arrow IPC data could not be read: {e}"))
        .with_hint("check that the file is a complete Arrow IPC file or stream (compressed IPC bodies are not supported: write it without compression)")
        .into()
}

fn invalid(msg: impl Into<String>) -> Errors {
    Diagnostic::error("data.arrow_invalid", format!("the Arrow IPC data is damaged: {}", msg.into()))
        .with_hint("check that the file is a complete Arrow IPC file or stream")
        .into()
}

fn read_u32(b: &[u8], pos: usize) -> Option<u32> {
    b.get(pos..pos + 4).map(|s| u32::from_le_bytes([s[0], s[1], s[2], s[3]]))
}

/// Widths the decoder will read each buffer of a `dt` column as, in the
/// order it takes them (1: bytes or bits, any length). Mirrors the buffer
/// order of the Arrow columnar format's IPC layout.
fn buffer_widths(dt: &DataType, v5: bool, variadic: &mut VecDeque<i64>, out: &mut Vec<usize>) -> Result<(), Errors> {
    use DataType as D;
    match dt {
        D::Null => {}
        D::Boolean | D::FixedSizeBinary(_) => out.extend([1, 1]),
        D::Utf8 | D::Binary => out.extend([1, 4, 1]),
        D::LargeUtf8 | D::LargeBinary => out.extend([1, 8, 1]),
        D::Utf8View | D::BinaryView => {
            let n = variadic.pop_front().ok_or_else(|| invalid("a view column has no buffer count"))?;
            if !(0..=1 << 20).contains(&n) {
                return Err(invalid("a view column has a wrong buffer count"));
            }
            out.extend([1, 16]);
            out.extend(std::iter::repeat_n(1, n as usize));
        }
        D::List(f) | D::Map(f, _) => {
            out.extend([1, 4]);
            buffer_widths(f.data_type(), v5, variadic, out)?;
        }
        D::LargeList(f) => {
            out.extend([1, 8]);
            buffer_widths(f.data_type(), v5, variadic, out)?;
        }
        D::ListView(f) => {
            out.extend([1, 4, 4]);
            buffer_widths(f.data_type(), v5, variadic, out)?;
        }
        D::LargeListView(f) => {
            out.extend([1, 8, 8]);
            buffer_widths(f.data_type(), v5, variadic, out)?;
        }
        D::FixedSizeList(f, _) => {
            out.push(1);
            buffer_widths(f.data_type(), v5, variadic, out)?;
        }
        D::Struct(fields) => {
            out.push(1);
            for f in fields {
                buffer_widths(f.data_type(), v5, variadic, out)?;
            }
        }
        D::RunEndEncoded(a, b) => {
            buffer_widths(a.data_type(), v5, variadic, out)?;
            buffer_widths(b.data_type(), v5, variadic, out)?;
        }
        D::Union(fields, mode) => {
            if !v5 {
                out.push(1);
            }
            out.push(1);
            if *mode == arrow_schema::UnionMode::Dense {
                out.push(4);
            }
            for (_, f) in fields.iter() {
                buffer_widths(f.data_type(), v5, variadic, out)?;
            }
        }
        D::Dictionary(k, _) => out.extend([1, k.primitive_width().unwrap_or(1)]),
        other => out.extend([1, other.primitive_width().unwrap_or(1)]),
    }
    Ok(())
}

/// Dictionary value types anywhere in the schema.
fn dictionary_values(dt: &DataType, out: &mut Vec<DataType>) {
    use DataType as D;
    match dt {
        D::Dictionary(_, v) => {
            out.push(v.as_ref().clone());
            dictionary_values(v, out);
        }
        D::List(f) | D::LargeList(f) | D::Map(f, _) | D::ListView(f) | D::LargeListView(f) | D::FixedSizeList(f, _) => dictionary_values(f.data_type(), out),
        D::Struct(fs) => fs.iter().for_each(|f| dictionary_values(f.data_type(), out)),
        D::Union(fs, _) => fs.iter().for_each(|(_, f)| dictionary_values(f.data_type(), out)),
        D::RunEndEncoded(a, b) => {
            dictionary_values(a.data_type(), out);
            dictionary_values(b.data_type(), out);
        }
        _ => {}
    }
}

/// Types Strata reads (see [`normalise`]); dictionaries only of these.
fn chartable(dt: &DataType) -> bool {
    use DataType as D;
    match dt {
        D::Dictionary(k, v) => k.is_dictionary_key_type() && chartable(v) && !matches!(v.as_ref(), D::Dictionary(..)),
        D::Null
        | D::Boolean
        | D::Int8
        | D::Int16
        | D::Int32
        | D::Int64
        | D::UInt8
        | D::UInt16
        | D::UInt32
        | D::UInt64
        | D::Float16
        | D::Float32
        | D::Float64
        | D::Decimal128(..)
        | D::Utf8
        | D::LargeUtf8
        | D::Utf8View
        | D::Date32
        | D::Date64
        | D::Timestamp(..) => true,
        _ => false,
    }
}

/// Check a record-batch or dictionary message against the schema before
/// the decoder sees it: every buffer inside the body, aligned to 8 bytes
/// (the Arrow columnar format asks for that), and a whole number of values
/// of the width its column is read as.
fn check_message(meta: &[u8], body_len: usize, schema: &Schema) -> Result<(), Errors> {
    let msg = arrow_ipc::root_as_message(meta).map_err(|e| invalid(format!("a message header is not valid ({e})")))?;
    let declared = msg.bodyLength();
    if declared < 0 {
        return Err(invalid("a message has a negative body length"));
    }
    let body_len = body_len.min(declared as usize);
    let v5 = msg.version() >= arrow_ipc::MetadataVersion::V5;
    let (rb, candidates): (_, Vec<Vec<DataType>>) = if let Some(rb) = msg.header_as_record_batch() {
        (rb, vec![schema.fields().iter().map(|f| f.data_type().clone()).collect()])
    } else if let Some(rb) = msg.header_as_dictionary_batch().and_then(|d| d.data()) {
        let mut values = Vec::new();
        for f in schema.fields() {
            dictionary_values(f.data_type(), &mut values);
        }
        (rb, values.into_iter().map(|v| vec![v]).collect())
    } else {
        return Ok(());
    };
    if let Some(c) = rb.compression() {
        // Compressed bodies are well-formed Arrow, just not readable here:
        // say so rather than call the file damaged.
        let codec = if c.codec() == arrow_ipc::CompressionType::ZSTD { "zstd" } else { "LZ4" };
        return Err(Diagnostic::error("data.arrow_compressed", format!("the Arrow IPC data is compressed ({codec}); compression is not supported"))
            .with_hint("write the file without compression (pyarrow: IpcWriteOptions(compression=None); arrow-rs: IpcWriteOptions::try_with_compression(None))")
            .into());
    }
    if rb.length() < 0 {
        return Err(invalid("a record batch has a negative length"));
    }
    let buffers: Vec<(i64, i64)> = rb.buffers().iter().flatten().map(|b| (b.offset(), b.length())).collect();
    for &(off, len) in &buffers {
        if off < 0 || len < 0 || (off as u64).saturating_add(len as u64) > body_len as u64 {
            return Err(invalid("a buffer lies outside its message body"));
        }
        if off % 8 != 0 {
            return Err(invalid("a buffer is not aligned to 8 bytes"));
        }
    }
    for node in rb.nodes().iter().flatten() {
        if node.length() < 0 || node.null_count() < 0 {
            return Err(invalid("a field node has a negative length"));
        }
    }
    let counts: VecDeque<i64> = rb.variadicBufferCounts().map(|v| v.iter().collect()).unwrap_or_default();
    let fits = candidates.iter().any(|types| {
        let mut variadic = counts.clone();
        let mut widths = Vec::new();
        for t in types {
            if buffer_widths(t, v5, &mut variadic, &mut widths).is_err() {
                return false;
            }
        }
        widths.len() <= buffers.len() && widths.iter().zip(&buffers).all(|(w, (_, len))| (*len as usize).is_multiple_of(*w))
    });
    if !fits {
        return Err(invalid("a message's buffers do not match the schema"));
    }
    Ok(())
}

fn schema_of(meta: &[u8]) -> Result<Schema, Errors> {
    let msg = arrow_ipc::root_as_message(meta).map_err(|e| invalid(format!("a message header is not valid ({e})")))?;
    let fb = msg.header_as_schema().ok_or_else(|| invalid("the stream does not start with a schema"))?;
    arrow_ipc::convert::try_fb_to_schema(fb).map_err(|e| invalid(format!("the schema is not valid ({e})")))
}

/// Walk the encapsulated messages of a stream; returns its schema.
fn check_stream(b: &[u8]) -> Result<Schema, Errors> {
    let mut pos = 0;
    let mut schema: Option<Schema> = None;
    while let Some(mut len) = read_u32(b, pos) {
        pos += 4;
        if len == 0xFFFF_FFFF {
            let Some(l) = read_u32(b, pos) else { break };
            len = l;
            pos += 4;
        }
        let len = len as i32;
        if len == 0 {
            break;
        }
        if len < 0 || pos + len as usize > b.len() {
            return Err(invalid("a message header runs past the end of the data"));
        }
        let meta = &b[pos..pos + len as usize];
        pos += len as usize;
        let msg = arrow_ipc::root_as_message(meta).map_err(|e| invalid(format!("a message header is not valid ({e})")))?;
        let body = msg.bodyLength();
        if body < 0 || (pos as u64).saturating_add(body as u64) > b.len() as u64 {
            return Err(invalid("a message body runs past the end of the data"));
        }
        match &schema {
            None => schema = Some(schema_of(meta)?),
            Some(s) => check_message(meta, body as usize, s)?,
        }
        pos += body as usize;
    }
    schema.ok_or_else(|| invalid("the stream has no schema"))
}

/// Check the footer blocks of the file format; returns its schema.
fn check_file(b: &[u8]) -> Result<Schema, Errors> {
    let n = b.len();
    if n < 8 + 10 || &b[n - 6..] != b"ARROW1" {
        return Err(invalid("the file is cut short (no closing `ARROW1` footer)"));
    }
    let footer_len = read_u32(b, n - 10).unwrap_or(0) as i32;
    if footer_len < 0 || (footer_len as usize) > n - 10 - 8 {
        return Err(invalid("the footer length is wrong"));
    }
    let footer = arrow_ipc::root_as_footer(&b[n - 10 - footer_len as usize..n - 10]).map_err(|e| invalid(format!("the footer is not valid ({e})")))?;
    let schema = arrow_ipc::convert::try_fb_to_schema(footer.schema().ok_or_else(|| invalid("the footer has no schema"))?)
        .map_err(|e| invalid(format!("the schema is not valid ({e})")))?;
    let blocks = footer.dictionaries().into_iter().flatten().chain(footer.recordBatches().into_iter().flatten());
    for block in blocks {
        let (off, meta, body) = (block.offset(), block.metaDataLength(), block.bodyLength());
        if off < 0 || meta < 8 || meta % 8 != 0 || body < 0 || (off as u64).saturating_add(meta as u64).saturating_add(body as u64) > n as u64 {
            return Err(invalid("a record batch block lies outside the file"));
        }
        let (off, meta) = (off as usize, meta as usize);
        let m = &b[off..off + meta];
        let m = if m[..4] == [0xff; 4] { &m[8..] } else { &m[4..] };
        check_message(m, body as usize, &schema)?;
    }
    Ok(schema)
}

/// Check the data, then decode only the columns Strata reads (the others
/// are skipped by the decoder, not built). Returns the projected schema,
/// the batches and the names of the columns left out.
fn batches(bytes: &[u8]) -> Result<(SchemaRef, Vec<RecordBatch>, Vec<(String, DataType)>), Errors> {
    let file = bytes.starts_with(b"ARROW1");
    let schema = if file { check_file(bytes)? } else { check_stream(bytes)? };
    let mut dict_values = Vec::new();
    for f in schema.fields() {
        dictionary_values(f.data_type(), &mut dict_values);
    }
    if let Some(v) = dict_values.iter().find(|v| !chartable(v) || matches!(v, DataType::Dictionary(..))) {
        return Err(Diagnostic::error("data.arrow_unsupported", format!("the Arrow data has dictionary-encoded {v} values, which Strata cannot read"))
            .with_hint("write dictionary-encoded columns only of strings, numbers, dates or times")
            .into());
    }
    let keep: Vec<usize> = (0..schema.fields().len()).filter(|i| chartable(schema.field(*i).data_type())).collect();
    let left_out = schema.fields().iter().filter(|f| !chartable(f.data_type())).map(|f| (f.name().clone(), f.data_type().clone())).collect();
    let projected = Arc::new(schema.project(&keep).map_err(ipc_error)?);
    let b = if file {
        FileReader::try_new(Cursor::new(bytes), Some(keep)).map_err(ipc_error)?.collect::<Result<Vec<_>, _>>()
    } else {
        StreamReader::try_new(Cursor::new(bytes), Some(keep)).map_err(ipc_error)?.collect::<Result<Vec<_>, _>>()
    }
    .map_err(ipc_error)?;
    if b.iter().any(|batch| batch.num_columns() != projected.fields().len()) {
        return Err(invalid("a record batch does not match the schema"));
    }
    Ok((projected, b, left_out))
}

/// Read Arrow IPC bytes (file format when they start with `ARROW1`, else
/// stream format).
pub fn read(bytes: &[u8], opts: &ReadOptions) -> Result<Table, Errors> {
    let (schema, batches, left_out) = batches(bytes)?;
    let rows: usize = batches.iter().map(|b| b.num_rows()).sum();
    if rows > opts.max_rows {
        return Err(Diagnostic::error("data.too_many_rows", format!("the data has {rows} rows, more than the row cap of {}", opts.max_rows))
            .with_hint("raise the row cap (`ReadOptions::max_rows`) where the data is loaded, or filter the data before charting it")
            .into());
    }
    let raw: Vec<String> = schema.fields().iter().map(|f| f.name().clone()).collect();
    let (names, notes) = unique_names(raw.clone());
    let mut warnings: Vec<Diagnostic> = notes.into_iter().map(|n| Diagnostic::warning("data.renamed_header", n)).collect();
    warnings.extend(super::unknown_type_keys(&opts.types, &names));
    for (name, dt) in left_out {
        warnings
            .push(Diagnostic::warning("data.unsupported_column", format!("column `{name}` has Arrow type {dt}, which Strata cannot chart; it was left out")));
    }
    let mut out_names = Vec::new();
    let mut columns = Vec::new();
    for (i, (field, name)) in schema.fields().iter().zip(&names).enumerate() {
        // Each batch's column to the table's own, then one after another
        // (no Arrow concatenation: the add-on stays small).
        let mut arrays: Vec<ArrayRef> = batches.iter().map(|b| b.column(i).clone()).collect();
        if arrays.is_empty() {
            arrays.push(new_empty_array(field.data_type()));
        }
        let parts: Option<Vec<Column>> = arrays.iter().map(to_column).collect();
        let Some(col) = parts.and_then(Column::concat) else {
            warnings.push(Diagnostic::warning(
                "data.unsupported_column",
                format!("column `{name}` has Arrow type {}, which Strata cannot chart; it was left out", field.data_type()),
            ));
            continue;
        };
        let col = match opts.types.get(name) {
            Some(t) => retype(col, *t, name)?,
            None => col,
        };
        out_names.push(name.clone());
        columns.push(col);
    }
    Ok(Table::new(out_names, columns, rows, warnings))
}

fn widen_int<T: ArrowPrimitiveType>(a: &dyn Array) -> ArrayRef
where
    T::Native: Into<i64>,
{
    let p = a.as_primitive::<T>();
    Arc::new(Int64Array::new(p.values().iter().map(|v| (*v).into()).collect(), p.nulls().cloned()))
}

fn widen_float<T: ArrowPrimitiveType>(a: &dyn Array) -> ArrayRef
where
    T::Native: Into<f64>,
{
    let p = a.as_primitive::<T>();
    Arc::new(Float64Array::new(p.values().iter().map(|v| (*v).into()).collect(), p.nulls().cloned()))
}

fn to_millis<T: ArrowPrimitiveType<Native = i64>>(a: &dyn Array, f: impl Fn(i64) -> i64) -> ArrayRef {
    let p = a.as_primitive::<T>();
    Arc::new(TimestampMillisecondArray::new(p.values().iter().map(|v| f(*v)).collect(), p.nulls().cloned()).with_timezone("UTC"))
}

/// 10^k as f64 by repeated multiplication (exact up to 10^22).
fn pow10(k: i32) -> f64 {
    let mut v = 1.0;
    for _ in 0..k.unsigned_abs().min(400) {
        v *= 10.0;
    }
    if k < 0 {
        1.0 / v
    } else {
        v
    }
}

/// Any Arrow array as one of the six hand-off types; `None` for types
/// Strata does not chart.
pub fn normalise(a: &ArrayRef) -> Option<ArrayRef> {
    use DataType as D;
    Some(match a.data_type() {
        D::Float64 | D::Int64 | D::Boolean | D::Utf8 | D::Date32 => a.clone(),
        D::Timestamp(TimeUnit::Millisecond, Some(tz)) if tz.as_ref() == "UTC" => a.clone(),
        D::Timestamp(TimeUnit::Second, _) => to_millis::<TimestampSecondType>(a, |v| v.saturating_mul(1000)),
        D::Timestamp(TimeUnit::Millisecond, _) => to_millis::<TimestampMillisecondType>(a, |v| v),
        D::Timestamp(TimeUnit::Microsecond, _) => to_millis::<TimestampMicrosecondType>(a, |v| v.div_euclid(1000)),
        D::Timestamp(TimeUnit::Nanosecond, _) => to_millis::<TimestampNanosecondType>(a, |v| v.div_euclid(1_000_000)),
        D::Int8 => widen_int::<Int8Type>(a),
        D::Int16 => widen_int::<Int16Type>(a),
        D::Int32 => widen_int::<Int32Type>(a),
        D::UInt8 => widen_int::<UInt8Type>(a),
        D::UInt16 => widen_int::<UInt16Type>(a),
        D::UInt32 => widen_int::<UInt32Type>(a),
        D::UInt64 => {
            let p = a.as_primitive::<UInt64Type>();
            if p.values().iter().all(|v| *v <= i64::MAX as u64) {
                Arc::new(Int64Array::new(p.values().iter().map(|v| *v as i64).collect(), p.nulls().cloned()))
            } else {
                Arc::new(Float64Array::new(p.values().iter().map(|v| *v as f64).collect(), p.nulls().cloned()))
            }
        }
        D::Float16 => widen_float::<Float16Type>(a),
        D::Float32 => widen_float::<Float32Type>(a),
        D::Decimal128(_, scale) => {
            let p = a.as_primitive::<Decimal128Type>();
            let div = pow10(*scale as i32);
            Arc::new(Float64Array::new(p.values().iter().map(|v| *v as f64 / div).collect(), p.nulls().cloned()))
        }
        D::Date64 => {
            let p = a.as_primitive::<Date64Type>();
            let days = p.values().iter().map(|v| v.div_euclid(86_400_000).clamp(i32::MIN as i64, i32::MAX as i64) as i32);
            Arc::new(Date32Array::new(days.collect(), p.nulls().cloned()))
        }
        D::LargeUtf8 => Arc::new(a.as_string::<i64>().iter().collect::<StringArray>()),
        D::Utf8View => Arc::new(a.as_string_view().iter().collect::<StringArray>()),
        D::Null => Arc::new(StringArray::new_null(a.len())),
        _ => return None,
    })
}

/// Any Arrow array as a table column; dictionary-encoded arrays are
/// decoded through their (normalised) values. `None` for types Strata does
/// not chart.
pub fn to_column(a: &ArrayRef) -> Option<Column> {
    if let DataType::Dictionary(_, _) = a.data_type() {
        let d = a.as_any_dictionary();
        let values = to_column(d.values())?;
        let n = d.keys().len();
        // (`normalized_keys` asserts a non-empty dictionary; with none, every row is missing.)
        let idx: Vec<Option<usize>> = if d.values().is_empty() {
            vec![None; n]
        } else {
            d.normalized_keys().into_iter().enumerate().map(|(i, k)| d.keys().is_valid(i).then_some(k)).collect()
        };
        return Some(values.take(&idx));
    }
    normalise(a).as_ref().and_then(super::arrow::column)
}
