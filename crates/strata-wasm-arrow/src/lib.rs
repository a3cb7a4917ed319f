//! The page's Arrow add-on: its only job is decoding Arrow IPC bytes (file
//! or stream format) into the table's own columns and writing them in the
//! column interchange (`strata::data::interchange`) that the core engine
//! (`strata-wasm`, which carries no Arrow code) reads with
//! `render_columns`. Errors and warnings travel inside the interchange, so
//! this module never builds JSON.

use strata::data::{interchange, ipc, sha256_bytes, ReadOptions};
use wasm_bindgen::prelude::*;

/// Arrow IPC bytes to the column interchange. Never fails: a reading error
/// is written into the interchange, where the core engine reports it.
pub fn decode_bytes(bytes: &[u8]) -> Vec<u8> {
    // `data.types` and `data.sha256` are applied by the core engine when it
    // reads the interchange (the digest written here is of the Arrow bytes
    // themselves), and so are the caps; the default row cap, which the core
    // applies to the interchange too, also bounds what the decoder
    // allocates for a damaged or hostile batch length.
    let opts = ReadOptions::default();
    let result = if bytes.len() > strata::data::DEFAULT_MAX_BYTES {
        Err(strata::Diagnostic::error(
            "data.too_large",
            format!("the data is {} bytes, over the byte cap of {} bytes", bytes.len(), strata::data::DEFAULT_MAX_BYTES),
        )
        .into())
    } else {
        ipc::read(bytes, &opts)
    };
    interchange::write(&result, &sha256_bytes(bytes))
}

/// JavaScript entry point.
#[wasm_bindgen]
pub fn decode(bytes: &[u8]) -> Vec<u8> {
    decode_bytes(bytes)
}

#[cfg(test)]
mod tests {
    use super::*;
    use strata::data::read;

    fn fixture(name: &str) -> Vec<u8> {
        std::fs::read(std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../tests/reference/fixtures/arrow").join(name)).unwrap()
    }

    #[test]
    fn the_core_reads_what_the_add_on_decodes_as_the_ipc_reader_does() {
        for f in ["types.arrow", "types.arrows", "empty.arrows"] {
            let bytes = fixture(f);
            let direct = read(&bytes, &ReadOptions::default()).unwrap();
            let via = interchange::read(&decode_bytes(&bytes), &ReadOptions::default()).unwrap();
            assert_eq!(via.column_names(), direct.column_names(), "{f}");
            assert_eq!(via.columns(), direct.columns(), "{f}");
            assert_eq!(via.num_rows(), direct.num_rows(), "{f}");
            let codes = |t: &strata::data::Table| t.warnings.iter().map(|w| w.code.clone()).collect::<Vec<_>>();
            assert_eq!(codes(&via), codes(&direct), "{f}");
        }
    }

    #[test]
    fn errors_and_the_digest_reach_the_core() {
        let e = interchange::read(&decode_bytes(&fixture("compressed_lz4.arrow")), &ReadOptions::default()).unwrap_err();
        // Compressed IPC is refused as such, not as damage (issue 16).
        assert_eq!(e.0[0].code, "data.arrow_compressed");
        let bytes = fixture("types.arrow");
        let o = ReadOptions { sha256: Some(strata::data::sha256_hex(&bytes)), ..Default::default() };
        assert!(interchange::read(&decode_bytes(&bytes), &o).is_ok());
        let o = ReadOptions { sha256: Some("0".repeat(64)), ..Default::default() };
        assert_eq!(interchange::read(&decode_bytes(&bytes), &o).unwrap_err().0[0].code, "data.sha256_mismatch");
    }
}
