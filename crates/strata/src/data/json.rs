//! JSON arrays of records (and the spec's inline `rows`) into table columns.

use super::columns::{build_noting, type_word, unique_names, CellRules, TextColumn};
use super::table::{Column, Ints, ValidBuilder};
use super::{ReadOptions, Table};
use crate::error::{Diagnostic, Errors};
use crate::spec::ColumnType;
use serde_json::{Map, Value};

pub fn read(bytes: &[u8], opts: &ReadOptions) -> Result<Table, Errors> {
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    let v: Value = crate::json::from_slice(bytes).map_err(|e| {
        Diagnostic::error("data.json_syntax", format!("the data is not valid JSON: {}", strip(&e.to_string())))
            .at_data(e.line().max(1) as u64, Some(e.column().max(1) as u64))
    })?;
    let Value::Array(items) = v else {
        return Err(Diagnostic::error("data.json_shape", "JSON data must be an array of records (objects)").at_data(1, Some(1)).into());
    };
    if items.len() > opts.max_rows {
        return Err(too_many_rows(opts.max_rows));
    }
    let mut rows = Vec::with_capacity(items.len());
    for (i, it) in items.into_iter().enumerate() {
        match it {
            Value::Object(m) => rows.push(m),
            other => {
                return Err(Diagnostic::error("data.json_shape", format!("record {} of the JSON array is {}, expected an object", i + 1, kind(&other))).into());
            }
        }
    }
    from_records(&rows, opts)
}

fn too_many_rows(cap: usize) -> Errors {
    Diagnostic::error("data.too_many_rows", format!("the data has more than {cap} rows, the row cap"))
        .with_hint("raise the row cap (`ReadOptions::max_rows`) where the data is loaded, or filter the data before charting it")
        .into()
}

/// A JSON value's kind in words, for messages (the GeoJSON reader shares it).
pub fn kind(v: &Value) -> &'static str {
    match v {
        Value::Null => "null",
        Value::Bool(_) => "a boolean",
        Value::Number(_) => "a number",
        Value::String(_) => "a string",
        Value::Array(_) => "an array",
        Value::Object(_) => "an object",
    }
}

fn strip(msg: &str) -> &str {
    msg.rfind(" at line ").map(|i| &msg[..i]).unwrap_or(msg)
}

/// Records to a table; columns in order of first appearance. JSON numbers
/// become integers (all integers) or numbers, JSON booleans true/false; strings
/// are typed like delimited text cells; nested values are kept as JSON text.
pub fn from_records(rows: &[Map<String, Value>], opts: &ReadOptions) -> Result<Table, Errors> {
    if rows.len() > opts.max_rows {
        return Err(too_many_rows(opts.max_rows));
    }
    // The names in order of first appearance (found by the engine's one
    // hash index).
    let mut names: Vec<String> = Vec::new();
    let mut seen = crate::index::Places::new();
    for r in rows {
        for k in r.keys() {
            seen.push(&mut names, k);
        }
    }
    let (unique, notes) = unique_names(names.clone());
    let mut warnings = Vec::with_capacity(notes.len());
    for n in notes {
        warnings.push(Diagnostic::warning("data.renamed_header", n));
    }
    warnings.extend(super::unknown_type_keys(&opts.types, &names));
    // JSON null (and the empty string) is missing; text keeps "NA" and the like.
    let rules = CellRules::new(&[""], false);
    let mut columns: Vec<Column> = Vec::new();
    for name in &names {
        let mut vals: Vec<&Value> = Vec::with_capacity(rows.len());
        for r in rows {
            vals.push(r.get(name).unwrap_or(&Value::Null));
        }
        let forced = opts.types.get(name).copied();
        let any = vals.iter().any(|v| !v.is_null());
        let numbers = any && vals.iter().all(|v| v.is_number() || v.is_null());
        let bools = any && vals.iter().all(|v| v.is_boolean() || v.is_null());
        let col = if numbers && forced.is_none() && vals.iter().all(|v| v.is_null() || v.as_i64().is_some()) {
            let mut b = ValidBuilder::default();
            let mut values = Vec::with_capacity(vals.len());
            for v in &vals {
                let x = v.as_i64();
                match x {
                    Some(_) => b.valid(),
                    None => b.missing(values.len()),
                }
                values.push(x.unwrap_or(0));
            }
            Column::Int(Ints { values, valid: b.finish() })
        } else if numbers && matches!(forced, None | Some(ColumnType::Number)) {
            let mut out = Vec::with_capacity(vals.len());
            for v in &vals {
                out.push(v.as_f64().unwrap_or(f64::NAN));
            }
            Column::Float(out.into())
        } else if bools && matches!(forced, None | Some(ColumnType::Bool)) {
            let mut out = Vec::with_capacity(vals.len());
            for v in &vals {
                out.push(v.as_bool());
            }
            Column::Bool(out)
        } else {
            let mut col = TextColumn::default();
            for v in &vals {
                let ok = match v {
                    Value::Null => col.push(b""),
                    Value::String(s) => col.push(s.as_bytes()),
                    other => col.push(crate::json::to_string(other).as_bytes()),
                };
                if !ok {
                    return Err(Diagnostic::error("data.too_large", format!("column `{name}` holds more than 2 GiB of text")).into());
                }
            }
            let (col, odd) = build_noting(col, forced, &rules).map_err(|e| {
                Diagnostic::error(
                    "data.type_mismatch",
                    format!(
                        "column `{name}` is declared `{}` but record {} holds `{}`: expected {}",
                        forced.map(type_word).unwrap_or("?"),
                        e.row + 1,
                        e.value,
                        e.expected
                    ),
                )
                .at_path(format!("data.types.{name}"))
            })?;
            if let Some((row, count)) = odd {
                warnings.push(super::csv::not_finite_warning(name, count, &format!("record {}", row + 1)));
            }
            col
        };
        columns.push(col);
    }
    Ok(Table::new(unique, columns, rows.len(), warnings))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::data::table::Kind;

    fn opts() -> ReadOptions {
        ReadOptions::default()
    }

    #[test]
    fn records_become_typed_columns() {
        let t =
            read(br#"[{"a": 1, "b": 1.5, "c": true, "d": "2024-01-02", "e": "x"}, {"a": null, "b": 2, "c": false, "d": null, "f": [1]}]"#, &opts()).unwrap();
        let types: Vec<_> = t.names().iter().zip(t.columns()).map(|(n, c)| (n.as_str(), c.kind())).collect();
        assert_eq!(types, vec![("a", Kind::Int), ("b", Kind::Float), ("c", Kind::Bool), ("d", Kind::Date), ("e", Kind::Text), ("f", Kind::Text)]);
        assert!(t.column(0).is_null(1));
        let Column::Text(f) = t.column(5) else { panic!() };
        assert_eq!(f.get(1), Some("[1]"));
    }

    #[test]
    fn non_finite_numbers_are_missing_as_in_csv() {
        // JSON has no NaN or infinity literal: they come as strings, as a
        // CSV cell would; the column stays a number column with one warning.
        let t = read(br#"[{"v": 1}, {"v": "NaN"}, {"v": 2.5}, {"v": "-inf"}, {"v": null}]"#, &opts()).unwrap();
        let Column::Float(v) = t.column(0) else { panic!("{:?}", t.column(0)) };
        assert_eq!(v.iter().collect::<Vec<_>>(), vec![Some(1.0), None, Some(2.5), None, None]);
        assert_eq!(t.warnings.len(), 1);
        assert_eq!(t.warnings[0].code, "data.not_finite");
        assert!(t.warnings[0].message.contains("2 cells (the first on record 2)"), "{}", t.warnings[0].message);
    }

    #[test]
    fn syntax_errors_are_located() {
        let e = read(b"[{\"a\": 1},\n {\"a\": }]", &opts()).unwrap_err();
        assert_eq!(e.0[0].code, "data.json_syntax");
        assert_eq!(e.0[0].at.line, Some(2));
        let e = read(b"{\"a\": 1}", &opts()).unwrap_err();
        assert_eq!(e.0[0].code, "data.json_shape");
        let e = read(b"[{\"a\": 1}, 3]", &opts()).unwrap_err();
        assert!(e.0[0].message.contains("record 2"));
    }

    #[test]
    fn overrides_and_caps() {
        let mut o = opts();
        o.types.insert("a".into(), ColumnType::Number);
        let e = read(br#"[{"a": "1"}, {"a": "x"}]"#, &o).unwrap_err();
        assert_eq!(e.0[0].at.path, "data.types.a");
        assert!(e.0[0].message.contains("record 2"));
        let t = read(br#"[{"a": 1}, {"a": 2}]"#, &o).unwrap();
        assert_eq!(t.column(0).kind(), Kind::Float);
        let o = ReadOptions { max_rows: 1, ..opts() };
        assert_eq!(read(br#"[{"a": 1}, {"a": 2}]"#, &o).unwrap_err().0[0].code, "data.too_many_rows");
    }
}
