//! `strata::json`, the engine's JSON reader, against serde_json itself
//! (serde_json 1.0.154 in Cargo.lock, the reader it replaces): for every input
//! both give the same `Value` (same number types, same key order, the sign of
//! -0.0) or the same error text with the same line and column.
//!
//! The corpus: every spec, example, data file, hostile case and JSON fixture
//! in the repository, then generated cases: every prefix of a few documents,
//! random byte flips, numbers at the u64/i64/f64 edges, escapes and
//! surrogates, nesting at and past the limit, duplicate keys, BOM and NUL
//! bytes. Floats: the native test build of serde_json has its
//! `float_roundtrip` feature (correctly rounded, as `str::parse` is), which
//! the engine's reader matches; `float_reference_is_exact` checks that this
//! is so, or the comparisons would not be fair.

use serde_json::Value;
use std::path::{Path, PathBuf};

fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

/// Compare the two readers on `bytes` (as bytes, and as text when UTF-8).
fn same(bytes: &[u8]) {
    let theirs = serde_json::from_slice::<Value>(bytes);
    let ours = strata::json::from_slice(bytes);
    let show = String::from_utf8_lossy(&bytes[..bytes.len().min(200)]).into_owned();
    match (&ours, &theirs) {
        (Ok(a), Ok(b)) => {
            assert_eq!(a, b, "{show:?}");
            // `==` ignores key order and the sign of zero; Debug shows both.
            assert_eq!(format!("{a:?}"), format!("{b:?}"), "{show:?}");
            // And the writer: serde_json's compact text of the value.
            assert_eq!(strata::json::to_string(a), b.to_string(), "{show:?}");
        }
        (Err(a), Err(b)) => {
            assert_eq!(a.to_string(), b.to_string(), "{show:?}");
            assert_eq!((a.line(), a.column()), (b.line(), b.column()), "{show:?}");
        }
        _ => panic!("{show:?}: ours {ours:?}, serde_json {theirs:?}"),
    }
    if let Ok(text) = std::str::from_utf8(bytes) {
        let theirs = serde_json::from_str::<Value>(text).map_err(|e| e.to_string());
        let ours = strata::json::from_str(text).map_err(|e| e.to_string());
        assert_eq!(format!("{ours:?}"), format!("{theirs:?}"), "{show:?}");
    }
}

fn files(dir: &Path, out: &mut Vec<PathBuf>) {
    let Ok(entries) = std::fs::read_dir(dir) else { return };
    for e in entries.flatten() {
        let p = e.path();
        if p.is_dir() {
            files(&p, out);
        } else {
            out.push(p);
        }
    }
}

#[test]
fn float_reference_is_exact() {
    // 2^-1074 * 3 written out: serde_json's fast path without
    // `float_roundtrip` is not correctly rounded on long inputs like these.
    for text in ["2.2250738585072011e-308", "7.038531e-26", "9007199254740993.0", "1.7976931348623157e308", "0.30000000000000004441"] {
        let theirs: f64 = serde_json::from_str(text).unwrap();
        assert_eq!(theirs.to_bits(), text.parse::<f64>().unwrap().to_bits(), "{text}");
    }
}

#[test]
fn the_repository_reads_alike() {
    let r = root();
    let mut all = Vec::new();
    for dir in ["tests/golden/specs", "tests/hostile", "tests/reference/fixtures"] {
        files(&r.join(dir), &mut all);
    }
    for dir in ["examples", "examples/data"] {
        for e in std::fs::read_dir(r.join(dir)).unwrap().flatten() {
            all.push(e.path());
        }
    }
    let all: Vec<PathBuf> = all.into_iter().filter(|p| p.is_file()).collect();
    let json = all.iter().filter(|p| p.extension().is_some_and(|e| e == "json")).count();
    assert!(json > 50, "found only {json} JSON files under {}", r.display());
    for p in &all {
        let bytes = std::fs::read(p).unwrap();
        same(&bytes);
        // Hostile cases hold JSON per line, too.
        if p.extension().is_some_and(|e| e == "jsonl") {
            for line in bytes.split(|&b| b == b'\n') {
                same(line);
            }
        }
    }
}

const DOCS: &[&str] = &[
    r#"{"layers": [{"draw": "point", "x": "a", "y": "b"}], "data": {"rows": [{"a": 1, "b": -2.5e3}]}}"#,
    "[\n  {\"town\": \"Gr\\u00fcnberg \\\"old\\\"\", \"n\": 12, \"ok\": true, \"x\": null},\n  {\"town\": \"\\ud83d\\ude00 \\n\\t\\/\", \"n\": -0, \"ok\": false}\n]\n",
    r#"{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"name":"A"},"geometry":{"type":"Polygon","coordinates":[[[0,0],[1,0.5],[1,1e-3],[0,0]]]}}]}"#,
    "  \r\n\t[1.5E+2, 0.0, 1e-7, 18446744073709551615, -9223372036854775808, \"\u{e9}\u{20ac}\"] \n",
];

#[test]
fn every_prefix_reads_alike() {
    for doc in DOCS {
        for end in 0..=doc.len() {
            same(&doc.as_bytes()[..end]);
        }
    }
}

#[test]
fn byte_flips_read_alike() {
    let mut state = 0x2545_f491_4f6c_dd1du64;
    let mut next = move || {
        state ^= state << 13;
        state ^= state >> 7;
        state ^= state << 17;
        state
    };
    let bytes = b"{}[]:,\"\\/ \t\n\r0-+.eE19aunlfrt\x00\x1f\x7f\xc3\xa9\xff\xed\xa0\x80";
    for doc in DOCS {
        for _ in 0..400 {
            let mut d = doc.as_bytes().to_vec();
            for _ in 0..1 + next() % 3 {
                let i = (next() % d.len() as u64) as usize;
                match next() % 3 {
                    0 => d[i] = bytes[(next() % bytes.len() as u64) as usize],
                    1 => {
                        d.remove(i);
                    }
                    _ => d.insert(i, bytes[(next() % bytes.len() as u64) as usize]),
                }
            }
            same(&d);
        }
    }
}

#[test]
fn numbers_read_alike() {
    let cases = [
        "0",
        "-0",
        "-0.0",
        "0.0",
        "1",
        "-1",
        "01",
        "-01",
        "00",
        "1.",
        "1.e3",
        ".5",
        "-",
        "+1",
        "1e",
        "1e+",
        "1e-",
        "1E5",
        "1e05",
        "--1",
        "18446744073709551615",
        "18446744073709551616",
        "-18446744073709551615",
        "-18446744073709551616",
        "9223372036854775807",
        "9223372036854775808",
        "-9223372036854775808",
        "-9223372036854775809",
        "123456789012345678901234567890",
        "-123456789012345678901234567890",
        "1234567890123456789012345678901234567890.5e-10",
        "1e308",
        "1.7976931348623157e308",
        "1.7976931348623159e308",
        "1e309",
        "1e400",
        "-1e400",
        "1e-400",
        "0.1e-400",
        "4.9e-324",
        "2e-324",
        "1e2147483647",
        "1e2147483648",
        "1e99999999999",
        "-1e99999999999",
        "0e99999999999",
        "0.000e99999999999",
        "1e-99999999999",
        "-0e-99999999999",
        "1e-2147483648",
        "123.456e-2147483647",
        "0.1",
        "0.2",
        "0.30000000000000004",
        "3.141592653589793238462643383279",
        "9007199254740993",
        "9007199254740993.0",
        "5e-1",
        "1x",
        "1.5.3",
        "[1e400]",
        "{\"a\":1e400}",
        "[-]",
        "[01]",
        "[1.]",
        "[1e]",
        "1 ",
        " 1",
        "1\n2",
        "1e5x",
        "-a",
        "-.",
        "2.5e+",
        "7e+0",
        "7e-0",
    ];
    for c in cases {
        same(c.as_bytes());
    }
    let long_digits = "1".repeat(500);
    same(long_digits.as_bytes());
    same(format!("0.{}", "0".repeat(400) + "1").as_bytes());
    same(format!("{long_digits}e-300").as_bytes());
}

#[test]
fn strings_read_alike() {
    let cases: &[&[u8]] = &[
        b"\"\"",
        b"\"a",
        b"\"\\",
        b"\"\\u",
        b"\"\\u12",
        b"\"\\u00e9\"",
        b"\"\\u00E9\"",
        b"\"\\u00g9\"",
        b"\"\\x\"",
        b"\"\\/\\b\\f\\n\\r\\t\\\"\\\\\"",
        b"\"\\ud83d\\ude00\"",
        b"\"\\ud83d\"",
        b"\"\\ud83d",
        b"\"\\ud83d\\",
        b"\"\\ud83dx\"",
        b"\"\\ud83d\\n\"",
        b"\"\\ud83d\\u0041\"",
        b"\"\\ude00\"",
        b"\"\\ud83d\\ud83d\"",
        b"\"\\udbff\\udfff\"",
        b"\"\\u0000\"",
        b"\"\x00\"",
        b"\"\x1f\"",
        b"\"\x7f\"",
        b"\"a\nb\"",
        b"\"\t\"",
        b"\"\xff\"",
        b"\"ab\xc3\"",
        b"\"\xc3\xa9\"",
        b"\"\xed\xa0\x80\"",
        b"\"\xf0\x9f\x98\x80\"",
        b"\"\\u00e9\xff\"",
        b"\xef\xbb\xbf{}",
        b"\xef\xbb\xbf\"x\"",
        b"\x00",
        b"{\"a\x00\":1}",
        b"[\"\x00\"]",
        b"\"\xe2\x80\xa8\"",
    ];
    for c in cases {
        same(c);
    }
}

#[test]
fn structure_reads_alike() {
    let cases = [
        "",
        " ",
        "\n\n  ",
        "{",
        "[",
        "}",
        "]",
        "{}",
        "[]",
        "{,}",
        "[,]",
        "[1,]",
        "[1,,2]",
        "{\"a\":1,}",
        "{\"a\":1,,}",
        "{\"a\"}",
        "{\"a\" 1}",
        "{\"a\":}",
        "{\"a\":1 \"b\":2}",
        "[1 2]",
        "{1:2}",
        "{\"a\":1,2:3}",
        "{'a':1}",
        "[true, false, null]",
        "tru",
        "nul",
        "nulll",
        "True",
        "[nan]",
        "[Infinity]",
        "{\"a\":1,\"b\":2,\"a\":3}",
        "{\"b\":1,\"a\":2,\"b\":{\"c\":3},\"a\":null}",
        "[] []",
        "{}x",
        "[1]\n\n  ]",
        "\u{feff}[]",
        "[\u{a0}]",
        "[1,\u{2028}2]",
        "[\x0b1]",
        "[\x0c1]",
        "{\"a\":[{\"b\":[{\"c\":{}}]}]}",
        "[1,\n2,\n3,\n}",
        "{\n\"a\": 1\n\"b\": 2}",
    ];
    for c in cases {
        same(c.as_bytes());
    }
}

#[test]
fn nesting_reads_alike() {
    for depth in [126, 127, 128, 129, 1000, 10_000, 100_000] {
        same(format!("{}{}", "[".repeat(depth), "]".repeat(depth)).as_bytes());
        same("[".repeat(depth).as_bytes());
        same(format!("{}1{}", "{\"a\":".repeat(depth), "}".repeat(depth)).as_bytes());
        same(format!("{}{}", "[{\"k\":".repeat(depth / 2), "[]".to_string() + &"}]".repeat(depth / 2)).as_bytes());
    }
}
