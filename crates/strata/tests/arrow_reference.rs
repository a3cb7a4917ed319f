//! Arrow IPC written by pyarrow 26.0.1 (tests/reference/gen/arrow_fixtures.py)
//! read back by Strata: every column normalised to a hand-off type with the
//! values pyarrow and Python's datetime/zoneinfo give (types.json).
#![cfg(feature = "ipc")]

use serde_json::Value;
use std::path::PathBuf;
use strata::data::table::Kind;
use strata::data::Column;
use strata::data::{self, ReadOptions};
use strata::spec::{ColumnType, DataFormat};

fn fixture(name: &str) -> Vec<u8> {
    let p = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../tests/reference/fixtures/arrow").join(name);
    std::fs::read(&p).unwrap_or_else(|e| panic!("{}: {e}", p.display()))
}

fn check(file: &str, opts: &ReadOptions) {
    let expected: Value = serde_json::from_slice(&fixture("types.json")).unwrap();
    let t = data::read(&fixture(file), opts).unwrap_or_else(|e| panic!("{file}: {e}"));
    assert_eq!(t.num_rows() as u64, expected["rows"].as_u64().unwrap());
    let mut checked = 0;
    for (name, spec) in expected["columns"].as_object().unwrap() {
        let kind = spec["type"].as_str().unwrap();
        if kind == "dropped" {
            assert!(t.by_name(name).is_none(), "{name} should be left out");
            assert!(t.warnings.iter().any(|w| w.code == "data.unsupported_column" && w.message.contains(name.as_str())));
            continue;
        }
        let arr = t.by_name(name).unwrap_or_else(|| panic!("{file}: no column {name}"));
        let want_type = match kind {
            "int64" => Kind::Int,
            "float64" => Kind::Float,
            "bool" => Kind::Bool,
            "date32" => Kind::Date,
            "timestamp_ms_utc" => Kind::DateTime,
            "utf8" => Kind::Text,
            other => panic!("{other}"),
        };
        assert_eq!(arr.kind(), want_type, "{file}: {name}");
        for (i, v) in spec["values"].as_array().unwrap().iter().enumerate() {
            let at = format!("{file}: {name}[{i}]");
            if v.is_null() {
                // A missing number is NaN in the table (and reads as missing).
                assert!(arr.is_null(i), "{at} should be null");
                continue;
            }
            match arr {
                Column::Int(a) => assert_eq!(a.get(i), v.as_i64(), "{at}"),
                Column::Float(a) => {
                    // An infinity is kept in the numbers (and reads as missing downstream).
                    let want = if v == "inf" { f64::INFINITY } else { v.as_f64().unwrap() };
                    let got = a.raw()[i];
                    assert_eq!(got.to_bits(), want.to_bits(), "{at}: {got} vs {want}");
                }
                Column::Bool(a) => assert_eq!(a[i], v.as_bool(), "{at}"),
                Column::Date(a) => assert_eq!(a.get(i).map(|d| d as i64), v.as_i64(), "{at}"),
                Column::DateTime(a) => assert_eq!(a.get(i).map(|x| x as i64), v.as_i64(), "{at}"),
                Column::Text(a) => assert_eq!(a.get(i), v.as_str(), "{at}"),
            }
            checked += 1;
        }
    }
    assert!(checked > 100, "{checked}");
}

#[test]
fn file_format_reads_back() {
    check("types.arrow", &ReadOptions::default());
    check("types.arrow", &ReadOptions { format: Some(DataFormat::Arrow), ..Default::default() });
}

#[test]
fn stream_format_reads_back() {
    check("types.arrows", &ReadOptions::default());
}

#[test]
fn empty_stream_keeps_columns() {
    let t = data::read(&fixture("empty.arrows"), &ReadOptions::default()).unwrap();
    assert_eq!(t.num_rows(), 0);
    assert_eq!(t.column_names(), vec!["x", "label"]);
}

#[test]
fn dictionary_deltas_extend_the_dictionary() {
    // pyarrow's emit_dictionary_deltas: the second batch sends two more values.
    let expected: Value = serde_json::from_slice(&fixture("types.json")).unwrap();
    let t = data::read(&fixture("delta.arrows"), &ReadOptions::default()).unwrap();
    let Some(Column::Text(place)) = t.by_name("place") else { panic!("place is not text") };
    let want: Vec<Option<&str>> = expected["delta"]["place"].as_array().unwrap().iter().map(Value::as_str).collect();
    assert_eq!(place.iter().collect::<Vec<_>>(), want);
}

#[test]
fn compressed_ipc_is_a_clean_error() {
    // Issue 16: reported as compression, not as damage.
    let e = data::read(&fixture("compressed_lz4.arrow"), &ReadOptions::default()).unwrap_err();
    assert_eq!(e.0[0].code, "data.arrow_compressed");
    assert!(e.0[0].message.contains("compression is not supported") && e.0[0].message.contains("LZ4"), "{}", e.0[0].message);
}

#[test]
fn overrides_and_caps_apply_to_ipc() {
    let bytes = fixture("types.arrow");
    let mut o = ReadOptions::default();
    o.types.insert("i32".into(), ColumnType::Number);
    o.types.insert("u8".into(), ColumnType::Text);
    o.types.insert("flag".into(), ColumnType::Date);
    let e = data::read(&bytes, &o).unwrap_err();
    assert_eq!(e.0[0].at.path, "data.types.flag");
    o.types.shift_remove("flag");
    let t = data::read(&bytes, &o).unwrap();
    assert_eq!(t.by_name("i32").unwrap().kind(), Kind::Float);
    let Some(Column::Text(u8col)) = t.by_name("u8") else { panic!("u8 is not text") };
    assert_eq!(u8col.get(1), Some("255"));
    let o = ReadOptions { max_rows: 6, ..Default::default() };
    assert_eq!(data::read(&bytes, &o).unwrap_err().0[0].code, "data.too_many_rows");
}

#[test]
fn truncated_ipc_is_an_error_not_a_panic() {
    for file in ["types.arrow", "types.arrows"] {
        let bytes = fixture(file);
        for cut in (0..bytes.len()).step_by(97) {
            let _ = data::read(&bytes[..cut], &ReadOptions { format: Some(DataFormat::Arrow), ..Default::default() });
        }
    }
}

#[test]
fn damaged_ipc_is_an_error_not_a_panic() {
    // Every third byte of each fixture flipped three ways (lengths, offsets,
    // counts and type ids in the headers and the bodies): an error or a
    // table, never a panic or a huge allocation. (Once, every byte flipped
    // eight ways, in release: no panic either.)
    let opts = ReadOptions { format: Some(DataFormat::Arrow), ..Default::default() };
    for file in ["types.arrow", "types.arrows", "delta.arrows"] {
        let bytes = fixture(file);
        for i in (0..bytes.len()).step_by(3) {
            for flip in [0xff, 0x80, 0x01] {
                let mut b = bytes.clone();
                b[i] ^= flip;
                let _ = data::read(&b, &opts);
            }
        }
    }
}
