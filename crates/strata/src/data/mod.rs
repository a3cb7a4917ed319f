//! Stage 2 — data: bytes (CSV, TSV, JSON, Arrow IPC with the `ipc`
//! feature, or the Arrow add-on's column interchange) or inline rows into a
//! [`Table`] of our own typed columns.
//!
//! Hand-off: [`Table`], named [`Column`]s of one length: numbers ([`Nums`],
//! NaN for missing), integers, booleans, dates (days), date-times (ms, UTC)
//! and dictionary-coded text. Every reader normalises to these; later
//! stages read nothing else.

#[cfg(feature = "arrow")]
pub mod arrow;
pub mod columns;
pub mod csv;
pub mod interchange;
#[cfg(feature = "ipc")]
pub mod ipc;
pub mod json;
mod nums;
pub mod table;
pub mod unpivot;

pub use nums::Nums;
pub use table::{Column, Table};

use crate::error::{Diagnostic, Errors};
use crate::spec::{ColumnType, DataFormat};

/// Default row cap.
pub const DEFAULT_MAX_ROWS: usize = 5_000_000;
/// Default byte cap: 256 MiB.
pub const DEFAULT_MAX_BYTES: usize = 256 * 1024 * 1024;

/// How to read the bytes.
#[derive(Debug, Clone)]
pub struct ReadOptions {
    /// `None`: guess from the bytes (Arrow magic, a JSON array, else
    /// delimited text with a sniffed delimiter).
    pub format: Option<DataFormat>,
    /// Per-column type overrides from `data.types`.
    pub types: crate::spec::Pairs<ColumnType>,
    /// Expected hex SHA-256 of the bytes (`data.sha256`); checked before
    /// parsing.
    pub sha256: Option<String>,
    /// The bytes' SHA-256 as the host computed it (the page, with the
    /// browser's SubtleCrypto), which `sha256` is checked against; `None`:
    /// computed here (the `sha` feature; without it the check fails with
    /// `data.sha256_unchecked`, never skipped).
    pub digest: Option<[u8; 32]>,
    /// Field delimiter for delimited text; `None`: comma for CSV, tab for
    /// TSV, sniffed when the format is not given.
    pub delimiter: Option<u8>,
    /// Cells read as missing values in delimited text.
    pub null_tokens: Vec<String>,
    /// Numbers in delimited text use a decimal comma (`1,5`); needs a
    /// delimiter other than the comma.
    pub decimal_comma: bool,
    /// Most data rows accepted.
    pub max_rows: usize,
    /// Most input bytes accepted.
    pub max_bytes: usize,
}

impl Default for ReadOptions {
    fn default() -> Self {
        ReadOptions {
            format: None,
            types: Default::default(),
            sha256: None,
            digest: None,
            delimiter: None,
            null_tokens: columns::NULL_TOKENS.iter().map(|s| s.to_string()).collect(),
            decimal_comma: false,
            max_rows: DEFAULT_MAX_ROWS,
            max_bytes: DEFAULT_MAX_BYTES,
        }
    }
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
    if bytes.len() > opts.max_bytes {
        return Err(Diagnostic::error("data.too_large", format!("the data is {} bytes, over the byte cap of {} bytes", bytes.len(), opts.max_bytes))
            .with_hint("raise the byte cap (`ReadOptions::max_bytes`) where the data is loaded, or chart a smaller extract")
            .into());
    }
    if let Some(expected) = &opts.sha256 {
        check_sha256(bytes, expected, opts.digest)?;
    }
    let format = opts.format.unwrap_or_else(|| sniff(bytes));
    match format {
        DataFormat::Csv | DataFormat::Tsv => {
            let delimiter = opts.delimiter.unwrap_or(match (opts.format, format) {
                (Some(DataFormat::Tsv), _) => b'\t',
                (Some(_), _) => b',',
                (None, _) => csv::sniff_delimiter(bytes),
            });
            csv::read(bytes, delimiter, opts)
        }
        DataFormat::Json => json::read(bytes, opts),
        #[cfg(feature = "ipc")]
        DataFormat::Arrow => ipc::read(bytes, opts),
        #[cfg(not(feature = "ipc"))]
        DataFormat::Arrow => {
            Err(Diagnostic::error("data.format_unsupported", "Arrow IPC data is not supported by this build (built without the `ipc` feature)")
                .at_path("data.format")
                .into())
        }
    }
}

/// Whether this build computes SHA-256 digests itself (the `sha` feature).
pub const HAS_SHA256: bool = cfg!(feature = "sha");

/// SHA-256 of the bytes (the `sha` feature; the page's core engine is
/// handed the digest instead, [`ReadOptions::digest`]).
#[cfg(feature = "sha")]
pub fn sha256_bytes(bytes: &[u8]) -> [u8; 32] {
    use sha2::{Digest, Sha256};
    Sha256::digest(bytes).into()
}

/// Lower-case hex SHA-256 of the bytes.
#[cfg(feature = "sha")]
pub fn sha256_hex(bytes: &[u8]) -> String {
    hex(&sha256_bytes(bytes))
}

/// A digest in lower-case hex.
pub(crate) fn hex(digest: &[u8; 32]) -> String {
    let mut s = String::with_capacity(64);
    for b in digest.iter() {
        s.push(char::from(b"0123456789abcdef"[(b >> 4) as usize]));
        s.push(char::from(b"0123456789abcdef"[(b & 15) as usize]));
    }
    s
}

/// Check `data.sha256` against the host's digest of the bytes, else ours.
fn check_sha256(bytes: &[u8], expected: &str, host: Option<[u8; 32]>) -> Result<(), Errors> {
    #[cfg(feature = "sha")]
    let host = host.or_else(|| Some(sha256_bytes(bytes)));
    #[cfg(not(feature = "sha"))]
    let _ = bytes;
    check_digest(host.map(|d| hex(&d)).as_deref(), expected)
}

/// Compare a lower-case hex digest with `data.sha256`; `None`: the digest
/// could not be computed (an engine without the `sha` feature whose page
/// has no SubtleCrypto).
pub(crate) fn check_digest(got: Option<&str>, expected: &str) -> Result<(), Errors> {
    let want = expected.trim().to_ascii_lowercase();
    if want.len() != 64 || !want.bytes().all(|b| b.is_ascii_hexdigit()) {
        return Err(Diagnostic::error("data.sha256_invalid", format!("`{expected}` is not a SHA-256 digest: expected 64 hexadecimal digits"))
            .at_path("data.sha256")
            .into());
    }
    let Some(got) = got else {
        return Err(Diagnostic::error(
            "data.sha256_unchecked",
            "this page cannot check the data's SHA-256 digest (`data.sha256`): the browser gives SubtleCrypto only to pages served over https or from localhost",
        )
        .at_path("data.sha256")
        .with_hint("serve the page over https, or remove `data.sha256`")
        .into());
    };
    if got != want {
        return Err(Diagnostic::error(
            "data.sha256_mismatch",
            format!("the data's SHA-256 digest is {got}, but `data.sha256` expects {want}; the data was refused"),
        )
        .at_path("data.sha256")
        .with_hint("if the data changed on purpose, put its new digest in `data.sha256`")
        .into());
    }
    Ok(())
}

fn sniff(bytes: &[u8]) -> DataFormat {
    let body = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    let start = body.iter().position(|b| !b.is_ascii_whitespace()).map(|i| body[i]);
    if bytes.starts_with(b"ARROW1") || bytes.starts_with(&[0xff, 0xff, 0xff, 0xff]) {
        DataFormat::Arrow
    } else if start == Some(b'[') {
        DataFormat::Json
    } else {
        DataFormat::Csv
    }
}

/// Warnings for `data.types` keys that name no column.
pub(crate) fn unknown_type_keys(types: &crate::spec::Pairs<ColumnType>, names: &[String]) -> Vec<Diagnostic> {
    let mut out = Vec::new();
    for k in types.keys() {
        if !names.contains(k) {
            out.push(
                Diagnostic::warning("data.unknown_type_column", format!("`data.types` names column `{k}`, which the data does not have"))
                    .at_path(format!("data.types.{k}")),
            );
        }
    }
    out
}

/// Apply the `data.types` overrides to a table read from typed data
/// (the Arrow add-on's interchange), with a warning for each key that names
/// no column.
pub(crate) fn retype_table(table: Table, opts: &ReadOptions) -> Result<Table, Errors> {
    if opts.types.is_empty() {
        return Ok(table);
    }
    let (names, columns, rows, mut warnings) = table.into_parts();
    warnings.extend(unknown_type_keys(&opts.types, &names));
    let mut out = Vec::with_capacity(columns.len());
    for (name, col) in names.iter().zip(columns) {
        out.push(match opts.types.get(name) {
            Some(t) => columns::retype(col, *t, name)?,
            None => col,
        });
    }
    Ok(Table::new(names, out, rows, warnings))
}

/// Build a table from inline JSON records (`data.rows`).
pub fn from_rows(rows: &[serde_json::Map<String, serde_json::Value>], types: &crate::spec::Pairs<ColumnType>) -> Result<Table, Errors> {
    let opts = ReadOptions { types: types.clone(), ..Default::default() };
    json::from_records(rows, &opts)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    #[cfg(feature = "sha")]
    fn sha256_of_abc() {
        // FIPS 180-2 (2002), appendix B.1: SHA-256("abc").
        assert_eq!(sha256_hex(b"abc"), "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    }

    #[test]
    fn the_hosts_digest_is_what_is_compared() {
        // The page hands in SubtleCrypto's digest; the engine compares that,
        // with the same messages as for its own.
        let o = ReadOptions { sha256: Some("ab".repeat(32)), digest: Some([0xab; 32]), ..Default::default() };
        assert!(read(b"a\n1\n", &o).is_ok());
        let o = ReadOptions { digest: Some([0xcd; 32]), ..o };
        let d = &read(b"a\n1\n", &o).unwrap_err().0[0];
        assert_eq!((d.code.as_str(), d.at.path.as_str()), ("data.sha256_mismatch", "data.sha256"));
        assert_eq!(d.message, format!("the data's SHA-256 digest is {}, but `data.sha256` expects {}; the data was refused", "cd".repeat(32), "ab".repeat(32)));
        // No digest and none of our own: refused with its reason, never skipped.
        let d = &check_digest(None, &"ab".repeat(32)).unwrap_err().0[0];
        assert_eq!((d.code.as_str(), d.at.path.as_str()), ("data.sha256_unchecked", "data.sha256"));
        assert!(d.message.contains("SubtleCrypto") && d.message.contains("https"), "{}", d.message);
        assert_eq!(check_digest(None, "xyz").unwrap_err().0[0].code, "data.sha256_invalid");
    }

    #[test]
    #[cfg(feature = "sha")]
    fn sha256_mismatch_shows_both_digests() {
        let o = ReadOptions { sha256: Some("0".repeat(64)), ..Default::default() };
        let e = read(b"a\n1\n", &o).unwrap_err();
        let d = &e.0[0];
        assert_eq!((d.code.as_str(), d.at.path.as_str()), ("data.sha256_mismatch", "data.sha256"));
        assert!(d.message.contains(&sha256_hex(b"a\n1\n")) && d.message.contains(&"0".repeat(64)));
        let o = ReadOptions { sha256: Some(sha256_hex(b"a\n1\n").to_uppercase()), ..Default::default() };
        assert!(read(b"a\n1\n", &o).is_ok());
        let o = ReadOptions { sha256: Some("xyz".into()), ..Default::default() };
        assert_eq!(read(b"a\n1\n", &o).unwrap_err().0[0].code, "data.sha256_invalid");
    }

    #[test]
    fn byte_cap_names_itself() {
        let o = ReadOptions { max_bytes: 3, ..Default::default() };
        let e = read(b"a\n1\n", &o).unwrap_err();
        assert_eq!(e.0[0].code, "data.too_large");
        assert!(e.0[0].message.contains("cap of 3 bytes"));
        assert!(e.0[0].hint.as_deref().unwrap().contains("max_bytes"));
    }

    #[test]
    fn format_and_delimiter_guessing() {
        let t = read(b"a;b\n1;2\n", &ReadOptions::default()).unwrap();
        assert_eq!(t.column_names(), vec!["a", "b"]);
        let t = read(b"a|b\n1|2\n", &ReadOptions { format: Some(DataFormat::Csv), ..Default::default() }).unwrap();
        assert_eq!(t.column_names(), vec!["a|b"]);
        let t = read(b"a\tb\n1\t2\n", &ReadOptions { format: Some(DataFormat::Tsv), ..Default::default() }).unwrap();
        assert_eq!(t.column_names(), vec!["a", "b"]);
        let t = read(b" [{\"a\": 1}]", &ReadOptions::default()).unwrap();
        assert_eq!(t.column_names(), vec!["a"]);
        assert_eq!(format_from_name("x/y.TSV?v=1"), Some(DataFormat::Tsv));
        assert_eq!(format_from_name("y.arrows"), Some(DataFormat::Arrow));
    }

    #[test]
    fn unknown_override_column_warns() {
        let mut o = ReadOptions::default();
        o.types.insert("nope".into(), ColumnType::Number);
        let t = read(b"a\n1\n", &o).unwrap();
        assert_eq!(t.warnings[0].at.path, "data.types.nope");
    }
}
