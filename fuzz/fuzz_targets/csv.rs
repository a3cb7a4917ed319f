//! Any bytes through the delimited-text reader: it must return a table or a
//! located error, never panic.
#![no_main]
use libfuzzer_sys::fuzz_target;
use strata::data::{self, ReadOptions};
use strata::spec::{ColumnType, DataFormat};

fuzz_target!(|bytes: &[u8]| {
    // The first byte picks options so one corpus covers several readers.
    let (knob, body) = match bytes.split_first() {
        Some((k, rest)) => (*k, rest),
        None => (0, bytes),
    };
    let mut opts = ReadOptions {
        format: [None, Some(DataFormat::Csv), Some(DataFormat::Tsv), Some(DataFormat::Json)][(knob & 3) as usize],
        decimal_comma: knob & 4 != 0,
        max_rows: if knob & 8 != 0 { 2 } else { 1_000_000 },
        ..Default::default()
    };
    if knob & 16 != 0 {
        opts.delimiter = Some(b';');
    }
    if knob & 32 != 0 {
        for (name, t) in [("a", ColumnType::Number), ("b", ColumnType::Date), ("c", ColumnType::Bool), ("d", ColumnType::Text)] {
            opts.types.insert(name.to_string(), t);
        }
    }
    let _ = data::read(body, &opts);
    let _ = data::csv::records(body, b',');
    let _ = data::csv::sniff_delimiter(body);
});
