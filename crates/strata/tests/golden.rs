//! Golden outputs: every gallery chart (`examples/*.json`) and every edge
//! case under `tests/golden/specs/` renders to exactly the bytes committed
//! under `tests/golden/`: the SVG, the data table, and for a spec the engine
//! refuses, the located errors. One byte of difference fails.
//!
//! A change of output on purpose is re-recorded with
//! `scripts/bless-golden.sh` (it sets `STRATA_BLESS=1`), and the new files
//! are looked at and committed with the change that made them.

use std::path::{Path, PathBuf};
use strata::{DataBytes, RenderOptions};

fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..").canonicalize().unwrap()
}

/// What a spec renders to, as the files the golden folder keeps:
/// (suffix, text).
fn outputs(spec_path: &Path) -> Vec<(&'static str, String)> {
    let text = std::fs::read_to_string(spec_path).unwrap();
    let spec = match strata::parse_spec(&text) {
        Ok(s) => s,
        Err(e) => return vec![("err.txt", format!("{e}\n"))],
    };
    // Data named by the spec, relative to the spec's folder, as the CLI reads it.
    let url = spec.data.as_ref().and_then(|d| d.object().url);
    let bytes = url.map(|u| {
        let p = spec_path.parent().unwrap().join(&u);
        (std::fs::read(&p).unwrap_or_else(|e| panic!("{}: {e}", p.display())), u)
    });
    let data = bytes.as_ref().map(|(b, n)| DataBytes { bytes: b, name: n });
    let shapes_url = spec.shapes.as_ref().and_then(|s| s.url.clone());
    let shapes_bytes = shapes_url.as_ref().map(|u| std::fs::read(spec_path.parent().unwrap().join(u)).unwrap());
    let shapes = shapes_bytes.as_deref().map(|b| DataBytes { bytes: b, name: "shapes" });
    match strata::render_spec_with_shapes(&spec, data, shapes, &RenderOptions::default()) {
        Ok(r) => {
            // No NaN or infinity anywhere in the scene (the SVG writer would
            // otherwise have to write something for it).
            let bad = r.scene.non_finite();
            assert!(bad.is_empty(), "{}: non-finite geometry at {bad:?}", spec_path.display());
            let mut warnings: String = r.warnings.iter().map(|w| format!("{w}\n")).collect();
            if warnings.is_empty() {
                warnings = "no warnings\n".into();
            }
            vec![("svg", r.svg), ("table.html", r.table), ("warnings.txt", warnings)]
        }
        Err(e) => vec![("err.txt", format!("{e}\n"))],
    }
}

fn specs() -> Vec<(String, PathBuf)> {
    let mut out = Vec::new();
    for (prefix, dir) in [("gallery-", root().join("examples")), ("edge-", root().join("tests/golden/specs"))] {
        let mut files: Vec<PathBuf> =
            std::fs::read_dir(&dir).unwrap().map(|e| e.unwrap().path()).filter(|p| p.extension().is_some_and(|e| e == "json")).collect();
        files.sort();
        for f in files {
            let stem = f.file_stem().unwrap().to_string_lossy().to_string();
            out.push((format!("{prefix}{stem}"), f));
        }
    }
    out
}

#[test]
fn every_chart_renders_to_its_golden_bytes() {
    let bless = std::env::var_os("STRATA_BLESS").is_some();
    let golden = root().join("tests/golden/out");
    if bless {
        let _ = std::fs::remove_dir_all(&golden);
        std::fs::create_dir_all(&golden).unwrap();
    }
    let cases = specs();
    assert!(cases.len() >= 20, "the golden set lost its specs: {}", cases.len());
    let mut failures = Vec::new();
    let mut checked = 0;
    for (name, path) in &cases {
        for (suffix, text) in outputs(path) {
            let file = golden.join(format!("{name}.{suffix}"));
            if bless {
                std::fs::write(&file, &text).unwrap();
                continue;
            }
            checked += 1;
            match std::fs::read_to_string(&file) {
                Ok(want) if want == text => {}
                Ok(want) => {
                    let at = want.bytes().zip(text.bytes()).position(|(a, b)| a != b).unwrap_or(want.len().min(text.len()));
                    let lo = at.saturating_sub(60);
                    failures.push(format!(
                        "{}: differs at byte {at} (golden {} bytes, now {} bytes)\n  golden: …{}…\n  now:    …{}…",
                        file.display(),
                        want.len(),
                        text.len(),
                        want.get(lo..(at + 60).min(want.len())).unwrap_or("?"),
                        text.get(lo..(at + 60).min(text.len())).unwrap_or("?"),
                    ))
                }
                Err(_) => failures.push(format!("{}: no golden file (run scripts/bless-golden.sh)", file.display())),
            }
        }
    }
    // A golden file that no spec writes any more is stale.
    if !bless {
        let written: std::collections::HashSet<String> = cases.iter().flat_map(|(n, p)| outputs(p).into_iter().map(move |(s, _)| format!("{n}.{s}"))).collect();
        for e in std::fs::read_dir(&golden).unwrap() {
            let f = e.unwrap().file_name().to_string_lossy().to_string();
            if !written.contains(&f) {
                failures.push(format!("tests/golden/out/{f}: no spec writes it any more"));
            }
        }
    }
    assert!(failures.is_empty(), "{} of {checked} golden outputs differ:\n{}", failures.len(), failures.join("\n"));
}

/// The automatic description is read aloud as sentences: the engine's own
/// words open each sentence with a capital ("Over year from ...", found in a
/// user trial as "... at 2020. over year ..."). Column names keep their case.
#[test]
fn description_sentences_open_with_a_capital() {
    for (name, path) in specs() {
        for (suffix, text) in outputs(&path) {
            if suffix != "svg" {
                continue;
            }
            let Some(desc) = text.split("<desc").nth(1).and_then(|d| d.split_once('>')).map(|(_, d)| d.split("</desc>").next().unwrap_or("")) else {
                continue;
            };
            for word in ["over", "in", "the", "it"] {
                assert!(!desc.contains(&format!(". {word} ")), "{name}: a sentence opens with lowercase '{word}': {desc}");
            }
            // Two layers over the same columns (a line and its labels) say
            // their range once, not twice.
            let sentences: Vec<&str> = desc.split(". ").collect();
            for (i, s) in sentences.iter().enumerate() {
                assert!(!sentences[..i].contains(s), "{name}: the description repeats '{s}': {desc}");
            }
        }
    }
}
