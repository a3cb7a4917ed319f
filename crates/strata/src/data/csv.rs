//! Delimited text (RFC 4180 CSV, TSV) tokenised with `csv-core` straight into
//! column cells, then typed into Arrow arrays.

use super::columns::{build, is_null, unique_names};
use super::Table;
use crate::error::{Diagnostic, Errors};
use crate::spec::ColumnType;
use arrow_array::RecordBatch;
use arrow_schema::{Field, Schema};
use csv_core::{ReadFieldResult, Reader, ReaderBuilder};
use indexmap::IndexMap;
use std::sync::Arc;

/// Read delimited text with a header row.
pub fn read(bytes: &[u8], delimiter: u8, types: &IndexMap<String, ColumnType>) -> Result<Table, Errors> {
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    let text = std::str::from_utf8(bytes).map_err(|e| {
        let line = 1 + bytes[..e.valid_up_to()].iter().filter(|b| **b == b'\n').count() as u64;
        Diagnostic::error("data.invalid_utf8", format!("the data is not valid UTF-8 (byte {})", e.valid_up_to())).at_data(line, None)
    })?;
    let mut rdr: Reader = ReaderBuilder::new().delimiter(delimiter).build();
    // Field text for every cell, row-major, with the row's starting line.
    let mut fields: Vec<String> = Vec::new();
    let mut row_lens: Vec<usize> = Vec::new();
    let mut row_lines: Vec<u64> = Vec::new();
    let mut input = text.as_bytes();
    let mut out = vec![0u8; 4096];
    let mut field = Vec::<u8>::new();
    let mut cur_len = 0usize;
    let mut line: u64 = 1;
    let mut row_line: u64 = 1;
    loop {
        let (res, nin, nout) = rdr.read_field(input, &mut out);
        line += input[..nin].iter().filter(|b| **b == b'\n').count() as u64;
        input = &input[nin..];
        field.extend_from_slice(&out[..nout]);
        match res {
            ReadFieldResult::InputEmpty => {
                if input.is_empty() {
                    // Signal end of input on the next call.
                    let (res2, _, nout2) = rdr.read_field(&[], &mut out);
                    field.extend_from_slice(&out[..nout2]);
                    match res2 {
                        ReadFieldResult::Field { record_end } => {
                            push_field(&mut fields, &mut field, &mut cur_len);
                            if record_end {
                                end_row(&mut row_lens, &mut row_lines, &mut cur_len, row_line);
                            }
                        }
                        _ => {}
                    }
                    break;
                }
            }
            ReadFieldResult::OutputFull => out.resize(out.len() * 2, 0),
            ReadFieldResult::Field { record_end } => {
                push_field(&mut fields, &mut field, &mut cur_len);
                if record_end {
                    end_row(&mut row_lens, &mut row_lines, &mut cur_len, row_line);
                    row_line = line;
                }
            }
            ReadFieldResult::End => break,
        }
    }
    if row_lens.is_empty() {
        return Err(Diagnostic::error("data.empty", "the data has no header row").at_data(1, None).into());
    }
    let ncols = row_lens[0];
    let header: Vec<String> = fields[..ncols].to_vec();
    let (names, notes) = unique_names(header);
    let mut errors = Vec::new();
    for (r, len) in row_lens.iter().enumerate().skip(1) {
        if *len != ncols && !(*len == 1 && ncols > 1 && fields_row_is_blank(&fields, &row_lens, r)) {
            errors.push(
                Diagnostic::error(
                    "data.ragged_row",
                    format!("row has {len} fields but the header has {ncols}"),
                )
                .at_data(row_lines[r], Some((*len).min(ncols) as u64 + 1)),
            );
            if errors.len() >= 5 {
                break;
            }
        }
    }
    if !errors.is_empty() {
        return Err(Errors(errors));
    }
    // Gather column cells, skipping blank lines.
    let mut starts = Vec::with_capacity(row_lens.len());
    let mut acc = 0;
    for len in &row_lens {
        starts.push(acc);
        acc += len;
    }
    let data_rows: Vec<usize> = (1..row_lens.len()).filter(|r| row_lens[*r] == ncols).collect();
    let mut arrays = Vec::with_capacity(ncols);
    let mut schema_fields = Vec::with_capacity(ncols);
    for (c, name) in names.iter().enumerate() {
        let cells: Vec<Option<&str>> = data_rows
            .iter()
            .map(|r| {
                let s = fields[starts[*r] + c].as_str();
                if is_null(s) { None } else { Some(s) }
            })
            .collect();
        let forced = types.get(name).copied();
        let arr = build(&cells, forced).map_err(|e| {
            let r = data_rows[e.row];
            Diagnostic::error(
                "data.type_mismatch",
                format!("column `{name}` is declared `{}` but holds `{}`, which is not {}", forced.map(type_word).unwrap_or("?"), e.value, e.expected),
            )
            .at_path(format!("data.types.{name}"))
            .at_data(row_lines[r], Some(c as u64 + 1))
        })?;
        schema_fields.push(Field::new(name, arr.data_type().clone(), true));
        arrays.push(arr);
    }
    let batch = RecordBatch::try_new(Arc::new(Schema::new(schema_fields)), arrays)
        .map_err(|e| Diagnostic::error("data.internal", e.to_string()))?;
    let warnings = notes.into_iter().map(|n| Diagnostic::warning("data.renamed_header", n).at_data(1, None)).collect();
    Ok(Table { batch, warnings })
}

pub(crate) fn type_word(t: ColumnType) -> &'static str {
    match t {
        ColumnType::Number => "number",
        ColumnType::Text => "text",
        ColumnType::Date => "date",
        ColumnType::Bool => "bool",
    }
}

fn fields_row_is_blank(fields: &[String], row_lens: &[usize], r: usize) -> bool {
    let start: usize = row_lens[..r].iter().sum();
    fields[start].is_empty()
}

fn push_field(fields: &mut Vec<String>, field: &mut Vec<u8>, cur_len: &mut usize) {
    // csv-core hands back bytes of valid UTF-8 input split only at ASCII
    // delimiters, so each field is valid UTF-8.
    fields.push(String::from_utf8_lossy(field).into_owned());
    field.clear();
    *cur_len += 1;
}

fn end_row(row_lens: &mut Vec<usize>, row_lines: &mut Vec<u64>, cur_len: &mut usize, line: u64) {
    row_lens.push(*cur_len);
    row_lines.push(line);
    *cur_len = 0;
}

#[cfg(test)]
mod tests {
    use super::*;
    use arrow_array::{Array, Float64Array, Int64Array, StringArray};

    fn t(s: &str) -> Table {
        read(s.as_bytes(), b',', &IndexMap::new()).unwrap()
    }

    #[test]
    fn rfc4180_quotes_crlf_and_bom() {
        // RFC 4180 (Shafranovich 2005) section 2, rules 6 and 7: quoted
        // fields may hold commas, line breaks and doubled quotes.
        let tb = t("\u{feff}a,b\r\n1,\"x, \"\"y\"\"\r\nz\"\r\n2,w\r\n");
        assert_eq!(tb.num_rows(), 2);
        let b = tb.batch.column(1).as_any().downcast_ref::<StringArray>().unwrap();
        assert_eq!(b.value(0), "x, \"y\"\r\nz");
        let a = tb.batch.column(0).as_any().downcast_ref::<Int64Array>().unwrap();
        assert_eq!(a.value(1), 2);
    }

    #[test]
    fn nulls_and_floats() {
        let tb = t("v\n1.5\nNA\n\n-2\n");
        let v = tb.batch.column(0).as_any().downcast_ref::<Float64Array>().unwrap();
        assert_eq!(v.len(), 3);
        assert!(v.is_null(1));
        assert_eq!(v.value(2), -2.0);
    }

    #[test]
    fn ragged_row_is_located() {
        let e = read(b"a,b\n1,2\n3\n4,5,6\n", b',', &IndexMap::new()).unwrap_err();
        assert_eq!(e.0[0].at.line, Some(3));
        assert_eq!(e.0[1].at.line, Some(4));
        assert_eq!(e.0[0].code, "data.ragged_row");
    }

    #[test]
    fn override_mismatch_names_spec_path() {
        let mut types = IndexMap::new();
        types.insert("a".to_string(), ColumnType::Number);
        let e = read(b"a\n1\nabc\n", b',', &types).unwrap_err();
        assert_eq!(e.0[0].at.path, "data.types.a");
        assert_eq!(e.0[0].at.line, Some(3));
    }
}
