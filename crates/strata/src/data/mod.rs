//! Stage 2 — data: bytes (CSV, TSV, Arrow IPC, JSON) or inline rows into a
//! [`Table`] of Arrow columns.
//!
//! Hand-off: [`Table`], an Arrow `RecordBatch` whose columns are one of
//! Float64, Int64, Boolean, Utf8, Date32 or Timestamp(ms, UTC).

pub mod columns;
pub mod csv;
pub mod json;
pub mod time;

use crate::error::{Diagnostic, Errors};
use crate::spec::{ColumnType, DataFormat};
use arrow_array::RecordBatch;
use indexmap::IndexMap;

/// The table every later stage reads.
#[derive(Debug, Clone)]
pub struct Table {
    pub batch: RecordBatch,
    /// Non-fatal notes from reading (renamed headers and the like).
    pub warnings: Vec<Diagnostic>,
}

impl Table {
    pub fn num_rows(&self) -> usize {
        self.batch.num_rows()
    }
    pub fn column_names(&self) -> Vec<String> {
        self.batch.schema().fields().iter().map(|f| f.name().clone()).collect()
    }
}

/// How to read the bytes.
#[derive(Debug, Clone, Default)]
pub struct ReadOptions {
    /// `None`: guess from the name's extension, then from the bytes.
    pub format: Option<DataFormat>,
    /// Per-column type overrides from `data.types`.
    pub types: IndexMap<String, ColumnType>,
}

/// Guess a format from a file name or URL.
pub fn format_from_name(name: &str) -> Option<DataFormat> {
    let base = name.split(['?', '#']).next().unwrap_or(name).to_ascii_lowercase();
    if base.ends_with(".csv") {
        Some(DataFormat::Csv)
    } else if base.ends_with(".tsv") || base.ends_with(".tab") {
        Some(DataFormat::Tsv)
    } else if base.ends_with(".arrow") || base.ends_with(".arrows") || base.ends_with(".ipc") || base.ends_with(".feather") {
        Some(DataFormat::Arrow)
    } else if base.ends_with(".json") {
        Some(DataFormat::Json)
    } else {
        None
    }
}

/// Read bytes into a table.
pub fn read(bytes: &[u8], opts: &ReadOptions) -> Result<Table, Errors> {
    let format = opts.format.unwrap_or_else(|| sniff(bytes));
    match format {
        DataFormat::Csv => csv::read(bytes, b',', &opts.types),
        DataFormat::Tsv => csv::read(bytes, b'\t', &opts.types),
        DataFormat::Json => json::read(bytes, &opts.types),
        DataFormat::Arrow => Err(Diagnostic::error(
            "data.format_unsupported",
            "Arrow IPC data is not supported by this build yet",
        )
        .at_path("data.format")
        .into()),
    }
}

fn sniff(bytes: &[u8]) -> DataFormat {
    let start = bytes.iter().position(|b| !b.is_ascii_whitespace()).map(|i| bytes[i]);
    if bytes.starts_with(b"ARROW1") || bytes.starts_with(&[0xff, 0xff, 0xff, 0xff]) {
        DataFormat::Arrow
    } else if start == Some(b'[') {
        DataFormat::Json
    } else {
        let first_line = bytes.split(|b| *b == b'\n').next().unwrap_or(&[]);
        let tabs = first_line.iter().filter(|b| **b == b'\t').count();
        let commas = first_line.iter().filter(|b| **b == b',').count();
        if tabs > commas { DataFormat::Tsv } else { DataFormat::Csv }
    }
}

/// Build a table from inline JSON records (`data.rows`).
pub fn from_rows(rows: &[serde_json::Map<String, serde_json::Value>], types: &IndexMap<String, ColumnType>) -> Result<Table, Errors> {
    json::from_records(rows, types)
}
