//! JSON arrays of records (and the spec's inline `rows`) into Arrow columns.

use super::columns::{build, unique_names};
use super::Table;
use crate::error::{Diagnostic, Errors};
use crate::spec::ColumnType;
use arrow_array::{ArrayRef, Float64Array, RecordBatch};
use arrow_schema::{Field, Schema};
use indexmap::IndexMap;
use serde_json::{Map, Value};
use std::sync::Arc;

pub fn read(bytes: &[u8], types: &IndexMap<String, ColumnType>) -> Result<Table, Errors> {
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    let v: Value = serde_json::from_slice(bytes).map_err(|e| {
        Diagnostic::error("data.json_syntax", format!("the data is not valid JSON: {}", strip(&e.to_string())))
            .at_data(e.line() as u64, Some(e.column() as u64))
    })?;
    let Value::Array(items) = v else {
        return Err(Diagnostic::error("data.json_shape", "JSON data must be an array of records (objects)").at_data(1, Some(1)).into());
    };
    let mut rows = Vec::with_capacity(items.len());
    for (i, it) in items.into_iter().enumerate() {
        match it {
            Value::Object(m) => rows.push(m),
            _ => {
                return Err(Diagnostic::error("data.json_shape", format!("item {i} of the JSON array is not an object")).into());
            }
        }
    }
    from_records(&rows, types)
}

fn strip(msg: &str) -> &str {
    msg.rfind(" at line ").map(|i| &msg[..i]).unwrap_or(msg)
}

/// Records to a table; columns in order of first appearance.
pub fn from_records(rows: &[Map<String, Value>], types: &IndexMap<String, ColumnType>) -> Result<Table, Errors> {
    let mut names: Vec<String> = Vec::new();
    for r in rows {
        for k in r.keys() {
            if !names.contains(k) {
                names.push(k.clone());
            }
        }
    }
    let (unique, _) = unique_names(names.clone());
    let mut arrays: Vec<ArrayRef> = Vec::new();
    let mut fields = Vec::new();
    for (name, uname) in names.iter().zip(&unique) {
        let vals: Vec<&Value> = rows.iter().map(|r| r.get(name).unwrap_or(&Value::Null)).collect();
        let forced = types.get(name).copied();
        let all_numbers = vals.iter().all(|v| v.is_number() || v.is_null()) && vals.iter().any(|v| v.is_number());
        let arr: ArrayRef = if all_numbers && matches!(forced, None | Some(ColumnType::Number)) {
            Arc::new(Float64Array::from(vals.iter().map(|v| v.as_f64()).collect::<Vec<_>>()))
        } else {
            let texts: Vec<Option<String>> = vals
                .iter()
                .map(|v| match v {
                    Value::Null => None,
                    Value::String(s) => Some(s.clone()),
                    other => Some(other.to_string()),
                })
                .collect();
            let cells: Vec<Option<&str>> = texts.iter().map(|s| s.as_deref()).collect();
            build(&cells, forced).map_err(|e| {
                Diagnostic::error(
                    "data.type_mismatch",
                    format!("column `{name}`: record {} holds `{}`, which is not {}", e.row, e.value, e.expected),
                )
                .at_path(format!("data.types.{name}"))
            })?
        };
        fields.push(Field::new(uname, arr.data_type().clone(), true));
        arrays.push(arr);
    }
    let schema = Arc::new(Schema::new(fields));
    let batch = if arrays.is_empty() {
        RecordBatch::new_empty(schema)
    } else {
        RecordBatch::try_new(schema, arrays).map_err(|e| Diagnostic::error("data.internal", e.to_string()))?
    };
    Ok(Table { batch, warnings: vec![] })
}
