//! Any bytes through the Arrow IPC reader (file and stream): it must return
//! a table or an error, never panic.
#![no_main]
use libfuzzer_sys::fuzz_target;
use strata::data::{self, ReadOptions};
use strata::spec::DataFormat;

fuzz_target!(|bytes: &[u8]| {
    let opts = ReadOptions { format: Some(DataFormat::Arrow), ..Default::default() };
    let _ = data::read(bytes, &opts);
});
