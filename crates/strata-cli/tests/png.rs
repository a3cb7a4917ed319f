//! `strata render SPEC -o OUT.png`: a PNG (signature and IHDR per the PNG
//! specification, ISO/IEC 15948) at twice the chart's size, with text drawn.

use std::process::Command;

#[test]
fn renders_a_png_at_twice_the_size() {
    let root = concat!(env!("CARGO_MANIFEST_DIR"), "/../..");
    let out = std::env::temp_dir().join(format!("strata-cli-test-{}.png", std::process::id()));
    let status =
        Command::new(env!("CARGO_BIN_EXE_strata")).args(["render", &format!("{root}/examples/bars.json"), "-o", out.to_str().unwrap()]).status().unwrap();
    assert!(status.success());
    let bytes = std::fs::read(&out).unwrap();
    let _ = std::fs::remove_file(&out);
    assert_eq!(&bytes[..8], b"\x89PNG\r\n\x1a\n");
    assert_eq!(&bytes[12..16], b"IHDR");
    let w = u32::from_be_bytes(bytes[16..20].try_into().unwrap());
    let h = u32::from_be_bytes(bytes[20..24].try_into().unwrap());
    // examples/bars.json is 640 x 380.
    assert_eq!((w, h), (1280, 760));
    // With text drawn, the file is far larger than flat colour alone would make it.
    assert!(bytes.len() > 20_000, "{} bytes", bytes.len());
}
