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

use super::columns::{build, type_word, unique_names, CellRules, TextColumn};
use super::{ReadOptions, Table};
use crate::error::{Diagnostic, Errors};
use crate::spec::ColumnType;
use arrow_array::cast::AsArray;
use arrow_array::types::*;
use arrow_array::{
    new_empty_array, Array, ArrayRef, ArrowPrimitiveType, Date32Array, Float64Array, Int64Array, RecordBatch,
    StringArray, TimestampMillisecondArray,
};
use arrow_ipc::reader::{FileReader, StreamReader};
use arrow_schema::{ArrowError, DataType, Field, Schema, SchemaRef, TimeUnit};
use std::io::Cursor;
use std::sync::Arc;

fn ipc_error(e: ArrowError) -> Errors {
    Diagnostic::error("data.arrow_invalid", format!("the Arrow IPC data could not be read: {e}"))
        .with_hint("check that the file is a complete Arrow IPC file or stream (compressed IPC bodies are not supported: write it without compression)")
        .into()
}

fn batches(bytes: &[u8]) -> Result<(SchemaRef, Vec<RecordBatch>), Errors> {
    if bytes.starts_with(b"ARROW1") {
        let r = FileReader::try_new(Cursor::new(bytes), None).map_err(ipc_error)?;
        let schema = r.schema();
        let b = r.collect::<Result<Vec<_>, _>>().map_err(ipc_error)?;
        Ok((schema, b))
    } else {
        let r = StreamReader::try_new(Cursor::new(bytes), None).map_err(ipc_error)?;
        let schema = r.schema();
        let b = r.collect::<Result<Vec<_>, _>>().map_err(ipc_error)?;
        Ok((schema, b))
    }
}

/// Read Arrow IPC bytes (file format when they start with `ARROW1`, else
/// stream format).
pub fn read(bytes: &[u8], opts: &ReadOptions) -> Result<Table, Errors> {
    let (schema, batches) = batches(bytes)?;
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
    let mut fields = Vec::new();
    let mut arrays = Vec::new();
    for (i, (field, name)) in schema.fields().iter().zip(&names).enumerate() {
        let mut parts = Vec::with_capacity(batches.len().max(1));
        if batches.is_empty() {
            parts.push(new_empty_array(field.data_type()));
        }
        for b in &batches {
            parts.push(b.column(i).clone());
        }
        let whole = if parts.len() == 1 {
            parts.pop().unwrap_or_else(|| new_empty_array(field.data_type()))
        } else {
            let refs: Vec<&dyn Array> = parts.iter().map(|a| a.as_ref()).collect();
            arrow_select::concat::concat(&refs).map_err(ipc_error)?
        };
        let Some(arr) = normalise(&whole) else {
            warnings.push(Diagnostic::warning(
                "data.unsupported_column",
                format!("column `{name}` has Arrow type {}, which Strata cannot chart; it was left out", field.data_type()),
            ));
            continue;
        };
        let arr = match opts.types.get(name) {
            Some(t) => apply_override(arr, *t, name)?,
            None => arr,
        };
        fields.push(Field::new(name, arr.data_type().clone(), true));
        arrays.push(arr);
    }
    let schema = Arc::new(Schema::new(fields));
    let batch = if arrays.is_empty() {
        RecordBatch::try_new_with_options(schema, vec![], &arrow_array::RecordBatchOptions::new().with_row_count(Some(rows)))
    } else {
        RecordBatch::try_new(schema, arrays)
    }
    .map_err(|e| Errors::from(Diagnostic::error("data.internal", e.to_string())))?;
    Ok(Table { batch, warnings })
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
    if k < 0 { 1.0 / v } else { v }
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
        D::Dictionary(_, _) => {
            let d = a.as_any_dictionary();
            let values = normalise(d.values())?;
            arrow_select::take::take(values.as_ref(), d.keys(), None).ok()?
        }
        _ => return None,
    })
}

/// Apply a `data.types` override to a normalised column.
fn apply_override(arr: ArrayRef, t: ColumnType, name: &str) -> Result<ArrayRef, Errors> {
    let dt = arr.data_type().clone();
    let fits = matches!(
        (t, &dt),
        (ColumnType::Number, DataType::Float64)
            | (ColumnType::Text, DataType::Utf8)
            | (ColumnType::Bool, DataType::Boolean)
            | (ColumnType::Date, DataType::Date32 | DataType::Timestamp(..))
    );
    if fits {
        return Ok(arr);
    }
    if t == ColumnType::Number && dt == DataType::Int64 {
        let p = arr.as_primitive::<Int64Type>();
        return Ok(Arc::new(Float64Array::new(p.values().iter().map(|v| *v as f64).collect(), p.nulls().cloned())));
    }
    if t == ColumnType::Text && matches!(dt, DataType::Int64 | DataType::Float64 | DataType::Boolean) {
        let text: StringArray = (0..arr.len())
            .map(|i| {
                (!arr.is_null(i)).then(|| match &dt {
                    DataType::Int64 => arr.as_primitive::<Int64Type>().value(i).to_string(),
                    DataType::Float64 => arr.as_primitive::<Float64Type>().value(i).to_string(),
                    _ => arr.as_boolean().value(i).to_string(),
                })
            })
            .collect();
        return Ok(Arc::new(text));
    }
    if dt == DataType::Utf8 {
        // Text typed like delimited text cells; nulls stay nulls.
        let s = arr.as_string::<i32>();
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
    Err(Diagnostic::error(
        "data.type_mismatch",
        format!("column `{name}` is declared `{}` but the Arrow data holds {dt}, which cannot be read as {}", type_word(t), type_word(t)),
    )
    .at_path(format!("data.types.{name}"))
    .into())
}
