//! Arrow interchange (the `arrow` feature): native code hands in a
//! `RecordBatch`, and its columns become the table's own. A null-free
//! `Float64` column is shared, not copied (see [`Nums::shared`]).
//!
//! The batch's columns must already be of the six hand-off types (Float64,
//! Int64, Boolean, Utf8, Date32, Timestamp in ms).

use super::table::{Column, Ints, Table};
use super::Nums;
use crate::error::{Diagnostic, Errors};
use arrow_array::cast::AsArray;
use arrow_array::types::{Date32Type, Float64Type, Int64Type, TimestampMillisecondType};
use arrow_array::{Array, ArrayRef, RecordBatch};
use arrow_schema::{DataType, TimeUnit};

/// One Arrow array of a hand-off type as a column; `None` for other types.
pub fn column(a: &ArrayRef) -> Option<Column> {
    Some(match a.data_type() {
        DataType::Float64 => {
            let p = a.as_primitive::<Float64Type>();
            // A null-free column is shared, not copied (its NaNs and
            // infinities read as missing); one with nulls is copied with NaN
            // in their place.
            Column::Float(if p.null_count() == 0 { Nums::shared(p.values().clone()) } else { p.iter().collect() })
        }
        DataType::Int64 => {
            let p = a.as_primitive::<Int64Type>();
            Column::Int(Ints { values: p.values().to_vec(), valid: p.nulls().map(|n| n.iter().collect()) })
        }
        DataType::Boolean => Column::Bool(a.as_boolean().iter().collect()),
        DataType::Utf8 => Column::Text(a.as_string::<i32>().iter().collect()),
        DataType::Date32 => Column::Date(a.as_primitive::<Date32Type>().iter().map(|v| v.map(|d| d as f64)).collect()),
        DataType::Timestamp(TimeUnit::Millisecond, _) => {
            Column::DateTime(a.as_primitive::<TimestampMillisecondType>().iter().map(|v| v.map(|x| x as f64)).collect())
        }
        _ => return None,
    })
}

/// A record batch as a table (column names as they are).
pub fn from_record_batch(batch: &RecordBatch) -> Result<Table, Errors> {
    let schema = batch.schema();
    let mut names = Vec::with_capacity(batch.num_columns());
    let mut columns = Vec::with_capacity(batch.num_columns());
    for (f, a) in schema.fields().iter().zip(batch.columns()) {
        let c = column(a).ok_or_else(|| {
            Diagnostic::error(
                "data.unsupported_column",
                format!("column `{}` has Arrow type {}, which is not one of the table's types", f.name(), f.data_type()),
            )
        })?;
        names.push(f.name().clone());
        columns.push(c);
    }
    Ok(Table::new(names, columns, batch.num_rows(), Vec::new()))
}

#[cfg(test)]
mod tests {
    use super::*;
    use arrow_array::{Float64Array, Int64Array, StringArray};
    use std::sync::Arc;

    #[test]
    fn null_free_numbers_are_shared_not_copied() {
        let a = Arc::new(Float64Array::from(vec![1.0, f64::NAN, f64::INFINITY, 4.0]));
        let col: ArrayRef = a.clone();
        let Some(Column::Float(n)) = column(&col) else { panic!("not numbers") };
        assert_eq!(n.raw().as_ptr(), a.values().as_ptr());
        assert_eq!(n.iter().collect::<Vec<_>>(), vec![Some(1.0), None, None, Some(4.0)]);
        // With nulls the column is copied, NaN standing for each null.
        let col: ArrayRef = Arc::new(Float64Array::from(vec![Some(2.0), None, Some(f64::NEG_INFINITY)]));
        let Some(Column::Float(n)) = column(&col) else { panic!("not numbers") };
        assert_eq!(n.iter().collect::<Vec<_>>(), vec![Some(2.0), None, None]);
    }

    #[test]
    fn a_batch_becomes_a_table() {
        let x = Arc::new(Float64Array::from(vec![1.0, 2.0, 3.0]));
        let batch = RecordBatch::try_from_iter(vec![
            ("x", x.clone() as ArrayRef),
            ("n", Arc::new(Int64Array::from(vec![Some(1), None, Some(3)])) as ArrayRef),
            ("s", Arc::new(StringArray::from(vec![Some("a"), None, Some("a")])) as ArrayRef),
        ])
        .unwrap();
        let t = from_record_batch(&batch).unwrap();
        assert_eq!((t.num_rows(), t.column_names()), (3, vec!["x".to_string(), "n".into(), "s".into()]));
        assert_eq!(t.column(1).null_count(), 1);
        let Column::Text(s) = t.column(2) else { panic!() };
        assert_eq!(s.dict_len(), 1);
        let Column::Float(n) = t.column(0) else { panic!() };
        assert_eq!(n.raw().as_ptr(), x.values().as_ptr());
    }
}
