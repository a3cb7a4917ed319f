//! `strata render -o`: the file's extension chooses what is written, and a
//! name the CLI cannot honour (`.pdf`, `.jpg`) is refused before any work
//! instead of holding SVG text; `--scale` sets the PNG's pixels per SVG unit
//! (PNG signature and IHDR per the PNG specification, ISO/IEC 15948); every
//! argument of every subcommand has a description in `--help`.

use std::path::PathBuf;
use std::process::{Command, Output};

fn strata(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_strata")).args(args).output().unwrap()
}

fn bars() -> String {
    format!("{}/../../examples/bars.json", env!("CARGO_MANIFEST_DIR"))
}

fn tmp(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("strata-exports-{}-{name}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir.join(name)
}

#[test]
fn an_unknown_extension_is_refused_and_nothing_is_written() {
    for name in ["chart.pdf", "chart.jpg", "chart.JPEG", "chart"] {
        let out = tmp(name);
        let r = strata(&["render", &bars(), "-o", out.to_str().unwrap()]);
        let err = String::from_utf8_lossy(&r.stderr);
        assert!(!r.status.success(), "{name}: accepted");
        assert!(err.contains("`.svg` or `.png`") && err.contains("standard output"), "{name}: {err}");
        assert!(!out.exists(), "{name}: a file was written");
    }
}

#[test]
fn svg_and_png_names_are_written_in_their_format() {
    let svg = tmp("chart.SVG");
    let r = strata(&["render", &bars(), "-o", svg.to_str().unwrap()]);
    assert!(r.status.success(), "{}", String::from_utf8_lossy(&r.stderr));
    assert!(std::fs::read_to_string(&svg).unwrap().starts_with("<svg"));
    let scene = tmp("scene.json");
    let r = strata(&["render", &bars(), "--scene", "-o", scene.to_str().unwrap()]);
    assert!(r.status.success(), "{}", String::from_utf8_lossy(&r.stderr));
    // The scene is JSON, so `.svg` does not suit it.
    let r = strata(&["render", &bars(), "--scene", "-o", svg.to_str().unwrap()]);
    assert!(!r.status.success());
    assert!(String::from_utf8_lossy(&r.stderr).contains("`.json`"));
}

fn png_size(bytes: &[u8]) -> (u32, u32) {
    assert_eq!(&bytes[..8], b"\x89PNG\r\n\x1a\n");
    assert_eq!(&bytes[12..16], b"IHDR");
    (u32::from_be_bytes(bytes[16..20].try_into().unwrap()), u32::from_be_bytes(bytes[20..24].try_into().unwrap()))
}

#[test]
fn scale_sets_the_png_size() {
    // examples/bars.json is 640 x 380.
    for (scale, size) in [("1", (640, 380)), ("0.5", (320, 190)), ("3", (1920, 1140))] {
        let out = tmp(&format!("s{scale}.png"));
        let r = strata(&["render", &bars(), "--scale", scale, "-o", out.to_str().unwrap()]);
        assert!(r.status.success(), "{}", String::from_utf8_lossy(&r.stderr));
        assert_eq!(png_size(&std::fs::read(&out).unwrap()), size, "scale {scale}");
    }
}

#[test]
fn a_bad_scale_is_refused() {
    let out = tmp("bad.png");
    for scale in ["0", "-1", "NaN", "inf", "9", "two"] {
        let r = strata(&["render", &bars(), "--scale", scale, "-o", out.to_str().unwrap()]);
        assert!(!r.status.success(), "scale {scale} accepted");
        assert!(!out.exists());
    }
    // A scale means nothing to SVG text.
    let r = strata(&["render", &bars(), "--scale", "2"]);
    assert!(!r.status.success());
    assert!(String::from_utf8_lossy(&r.stderr).contains("PNG output only"));
}

/// The argument lines of a `--help` text: under `Arguments:` and `Options:`,
/// a line starting with two spaces then `<`, `-`.
#[test]
fn every_argument_has_a_description() {
    for cmd in ["render", "check", "bake", "schema"] {
        for flag in ["-h", "--help"] {
            let r = strata(&[cmd, flag]);
            assert!(r.status.success());
            let text = String::from_utf8(r.stdout).unwrap();
            let lines: Vec<&str> = text.lines().collect();
            let mut seen = 0;
            for (i, line) in lines.iter().enumerate() {
                let t = line.trim_start();
                let indent = line.len() - t.len();
                if !(2..=6).contains(&indent) || !(t.starts_with('<') || t.starts_with('-')) {
                    continue;
                }
                seen += 1;
                // Short help: the description follows on the line; long help: on the next line, indented deeper.
                let words: Vec<&str> = t.split("  ").filter(|w| !w.trim().is_empty()).collect();
                let next_described = lines.get(i + 1).is_some_and(|n| {
                    let nt = n.trim_start();
                    !nt.is_empty() && n.len() - nt.len() > indent + 2
                });
                assert!(words.len() >= 2 || next_described, "`strata {cmd} {flag}`: `{}` has no description", t);
            }
            assert!(seen >= 1, "`strata {cmd} {flag}` lists no arguments:\n{text}");
        }
    }
    // The format's values are described too.
    let text = String::from_utf8(strata(&["check", "--help"]).stdout).unwrap();
    assert!(text.contains("- text: ") && text.contains("- json: "), "{text}");
}
