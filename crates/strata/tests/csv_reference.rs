//! Delimited text read by Strata, cell for cell, against Python's `csv`
//! module (Python 3.11.7; fixtures from tests/reference/gen/csv_corpus.py)
//! and against the examples of RFC 4180 (Shafranovich 2005).

use serde_json::Value;
use std::path::PathBuf;
use strata::data::table::Kind;
use strata::data::Column;
use strata::data::{self, csv::records, ReadOptions};
use strata::spec::DataFormat;

fn fixtures() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../tests/reference/fixtures/csv")
}

fn cases() -> Vec<(String, Vec<u8>, Value)> {
    let mut out = Vec::new();
    for entry in std::fs::read_dir(fixtures()).expect("fixtures/csv exists") {
        let path = entry.unwrap().path();
        if path.extension().and_then(|e| e.to_str()) != Some("json") {
            continue;
        }
        let name = path.file_stem().unwrap().to_string_lossy().into_owned();
        let expected: Value = serde_json::from_slice(&std::fs::read(&path).unwrap()).unwrap();
        let bytes = std::fs::read(path.with_extension("csv")).unwrap();
        out.push((name, bytes, expected));
    }
    out.sort_by(|a, b| a.0.cmp(&b.0));
    out
}

fn delimiter(expected: &Value) -> u8 {
    expected["delimiter"].as_str().unwrap().as_bytes()[0]
}

/// Tokenizer level: every record's cells as text, equal to what Python's
/// csv module reads (Python 3.11.7, csv.reader, default dialect).
#[test]
fn cells_match_python_csv() {
    let cases = cases();
    assert!(cases.len() >= 30, "only {} corpus files", cases.len());
    for (name, bytes, expected) in &cases {
        let got = records(bytes, delimiter(expected));
        if expected.get("error").is_some() {
            let e = got.expect_err(name);
            assert_eq!(e.0[0].code, "data.unterminated_quote", "{name}");
            continue;
        }
        let want: Vec<Vec<String>> = expected["rows"]
            .as_array()
            .unwrap()
            .iter()
            .map(|r| r.as_array().unwrap().iter().map(|c| c.as_str().unwrap().to_string()).collect::<Vec<_>>())
            // Python yields [] for a blank line; Strata skips blank lines.
            .filter(|r| !r.is_empty())
            .collect();
        let got = got.unwrap_or_else(|e| panic!("{name}: {e}"));
        assert_eq!(got, want, "{name}");
    }
}

/// Whole reads: the corpus files that have one record length read as
/// tables with the same number of rows; the unterminated ones fail with a
/// located error.
#[test]
fn tables_from_the_corpus() {
    for (name, bytes, expected) in cases() {
        let opts = ReadOptions { format: Some(DataFormat::Csv), delimiter: Some(delimiter(&expected)), ..Default::default() };
        let got = data::read(&bytes, &opts);
        if expected.get("error").is_some() {
            let e = got.expect_err(&name);
            assert!(e.0[0].at.line.is_some() && e.0[0].at.column.is_some(), "{name}");
            continue;
        }
        let rows: Vec<&Value> = expected["rows"].as_array().unwrap().iter().filter(|r| !r.as_array().unwrap().is_empty()).collect();
        let width = rows[0].as_array().unwrap().len();
        if rows.iter().all(|r| r.as_array().unwrap().len() == width) {
            let t = got.unwrap_or_else(|e| panic!("{name}: {e}"));
            assert_eq!(t.num_rows(), rows.len() - 1, "{name}");
            assert_eq!(t.num_columns(), width, "{name}");
        } else {
            let e = got.expect_err(&name);
            assert_eq!(e.0[0].code, "data.ragged_row", "{name}");
        }
    }
}

/// Typed values: the inferred column type and each value equal what
/// Python computes from the same cells (int(), float(),
/// date.fromisoformat, datetime.fromisoformat; Python 3.11.7).
#[test]
fn typed_values_match_python() {
    let mut checked = 0;
    for (name, bytes, expected) in cases() {
        let Some(typed) = expected.get("typed").and_then(|t| t.as_object()) else { continue };
        let opts = ReadOptions { format: Some(DataFormat::Csv), delimiter: Some(delimiter(&expected)), ..Default::default() };
        let t = data::read(&bytes, &opts).unwrap_or_else(|e| panic!("{name}: {e}"));
        for (col, spec) in typed {
            let arr = t.by_name(col).unwrap();
            let values = spec["values"].as_array().unwrap();
            let kind = spec["type"].as_str().unwrap();
            let want_type = match kind {
                "int64" => Kind::Int,
                "float64" => Kind::Float,
                "bool" => Kind::Bool,
                "date32" => Kind::Date,
                "timestamp_ms_utc" => Kind::DateTime,
                "utf8" => Kind::Text,
                other => panic!("{other}"),
            };
            assert_eq!(arr.kind(), want_type, "{name}.{col}");
            assert_eq!(arr.len(), values.len(), "{name}.{col}");
            for (i, v) in values.iter().enumerate() {
                if v.is_null() {
                    assert!(arr.is_null(i), "{name}.{col}[{i}] should be null");
                    continue;
                }
                assert!(!arr.is_null(i), "{name}.{col}[{i}]");
                match arr {
                    Column::Int(a) => assert_eq!(a.get(i), v.as_i64(), "{name}.{col}[{i}]"),
                    Column::Float(a) => assert_eq!(a.get(i), v.as_f64(), "{name}.{col}[{i}]"),
                    Column::Bool(a) => assert_eq!(a[i], v.as_bool(), "{name}.{col}[{i}]"),
                    Column::Date(a) => assert_eq!(a.get(i).map(|d| d as i64), v.as_i64(), "{name}.{col}[{i}]"),
                    Column::DateTime(a) => assert_eq!(a.get(i).map(|x| x as i64), v.as_i64(), "{name}.{col}[{i}]"),
                    Column::Text(a) => assert_eq!(a.get(i), v.as_str(), "{name}.{col}[{i}]"),
                }
                checked += 1;
            }
        }
    }
    assert!(checked > 30, "only {checked} typed values checked");
}

/// RFC 4180 (Shafranovich 2005), section 2: the records each example
/// stands for, written out from the RFC's text.
#[test]
fn rfc4180_examples() {
    let abc = vec!["aaa", "bbb", "ccc"];
    let zyx = vec!["zzz", "yyy", "xxx"];
    // Rule 1: records end with CRLF.
    assert_eq!(records(b"aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n", b',').unwrap(), vec![abc.clone(), zyx.clone()]);
    // Rule 2: the last record may lack an ending line break.
    assert_eq!(records(b"aaa,bbb,ccc\r\nzzz,yyy,xxx", b',').unwrap(), vec![abc.clone(), zyx.clone()]);
    // Rule 4: spaces are part of a field.
    assert_eq!(records(b"aaa, bbb ,ccc", b',').unwrap(), vec![vec!["aaa", " bbb ", "ccc"]]);
    // Rule 5: fields may be enclosed in double quotes.
    assert_eq!(records(b"\"aaa\",\"bbb\",\"ccc\"\r\nzzz,yyy,xxx", b',').unwrap(), vec![abc.clone(), zyx.clone()]);
    // Rule 6: line breaks, double quotes and commas inside quoted fields.
    assert_eq!(records(b"\"aaa\",\"b\r\nbb\",\"ccc\"\r\nzzz,yyy,xxx", b',').unwrap(), vec![vec!["aaa", "b\r\nbb", "ccc"], zyx.clone()]);
    // Rule 7: a double quote inside a quoted field is doubled.
    assert_eq!(records(b"\"aaa\",\"b\"\"bb\",\"ccc\"", b',').unwrap(), vec![vec!["aaa", "b\"bb", "ccc"]]);
    // Rule 3: the optional header line has the same format; Strata always
    // reads the first record as the header.
    let t = data::read(b"field_name,field_name,field_name\r\naaa,bbb,ccc\r\nzzz,yyy,xxx\r\n", &ReadOptions::default()).unwrap();
    assert_eq!(t.column_names(), vec!["field_name", "field_name_2", "field_name_3"]);
    assert_eq!(t.num_rows(), 2);
}
