//! The hostile corpus (tests/hostile/engine.jsonl, written by
//! tests/hostile/make_corpus.py): specs and data an attacker or a careless
//! author might hand the engine, each with its expected outcome, a located
//! error code or a chart (issue 16). Every case runs in a thread with a 2 MB
//! stack, as a page's engine would have little stack; a panic fails the case
//! by name. Every chart is also checked: no character XML 1.0 forbids, no
//! `url(`, no markup from the data, within the output budget; every error
//! message is short.

use serde_json::Value;
use std::path::PathBuf;
use strata::{DataBytes, RenderOptions};

fn corpus() -> Vec<Value> {
    let p = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../tests/hostile/engine.jsonl");
    std::fs::read_to_string(p).unwrap().lines().filter(|l| !l.trim().is_empty()).map(|l| serde_json::from_str(l).unwrap()).collect()
}

/// Expand the corpus templates: `@repeat(N,TEXT)@`, `"@layers(N)@"` (N
/// point layers), `@count(N)@` (the lines 0 to N-1) and `@pairs(N)@` (lines `k,ck`).
pub fn expand(s: &str) -> String {
    let mut out = String::new();
    let mut rest = s;
    loop {
        let next = ["@repeat(", "\"@layers(", "@count(", "@pairs("].iter().filter_map(|m| rest.find(m).map(|i| (i, *m))).min();
        let Some((i, marker)) = next else { break };
        out.push_str(&rest[..i]);
        let after = &rest[i + marker.len()..];
        match marker {
            "@repeat(" => {
                let comma = after.find(',').unwrap();
                let n: usize = after[..comma].parse().unwrap();
                let body = &after[comma + 1..];
                let end = body.find(")@").unwrap();
                out.push_str(&body[..end].repeat(n));
                rest = &body[end + 2..];
            }
            "\"@layers(" => {
                let end = after.find(")@\"").unwrap();
                let n: usize = after[..end].parse().unwrap();
                let one = r#"{"draw":"point","x":"a","y":"b"}"#;
                out.push('[');
                out.push_str(&vec![one; n].join(","));
                out.push(']');
                rest = &after[end + 3..];
            }
            _ => {
                let end = after.find(")@").unwrap();
                let n: usize = after[..end].parse().unwrap();
                for k in 0..n {
                    out.push_str(&if marker == "@count(" { format!("{k}\n") } else { format!("{k},c{k}\n") });
                }
                rest = &after[end + 2..];
            }
        }
    }
    out.push_str(rest);
    out
}

fn xml_forbidden(c: char) -> bool {
    ((c as u32) < 0x20 && !matches!(c, '\t' | '\n' | '\r')) || c == '\u{fffe}' || c == '\u{ffff}'
}

/// Run one case; `Err` says what went wrong.
fn run(case: &Value) -> Result<(), String> {
    let spec_text = match case.get("spec_text") {
        Some(t) => expand(t.as_str().unwrap()),
        None => expand(&case["spec"].to_string()),
    };
    let data = case.get("data").map(|d| expand(d.as_str().unwrap()));
    let name = case.get("data_name").and_then(Value::as_str).unwrap_or("d.csv").to_string();
    let expect = case["expect"].clone();
    let warning = case.get("warning").and_then(Value::as_str).map(str::to_string);
    let outcome = std::thread::Builder::new()
        .stack_size(2 << 20)
        .spawn(move || {
            let data = data.as_ref().map(|d| DataBytes { bytes: d.as_bytes(), name: &name });
            strata::render(&spec_text, data, &RenderOptions::default())
        })
        .unwrap()
        .join()
        .map_err(|_| "panicked".to_string())?;
    match (&expect, outcome) {
        (Value::String(s), Ok(r)) if s == "chart" => {
            if let Some(c) = r.svg.chars().chain(r.table.chars()).find(|c| xml_forbidden(*c)) {
                return Err(format!("output has U+{:04X}, which XML 1.0 forbids", c as u32));
            }
            for bad in ["url(", "<script", "<!--", "<svg onload", "<x>"] {
                if r.svg.contains(bad) || r.table.contains(bad) {
                    return Err(format!("output contains `{bad}`"));
                }
            }
            if r.svg.len() > strata::budget::MAX_SVG_BYTES {
                return Err(format!("{} bytes of SVG", r.svg.len()));
            }
            if let Some(w) = warning {
                if !r.warnings.iter().any(|d| d.code == w) {
                    return Err(format!("no warning {w}: {:?}", r.warnings.iter().map(|d| &d.code).collect::<Vec<_>>()));
                }
            }
            Ok(())
        }
        (Value::String(_), Err(e)) => Err(format!("expected a chart, got {}", short(&e.to_string()))),
        (Value::Object(o), Err(e)) => {
            let code = o["error"].as_str().unwrap();
            let path = o["path"].as_str().unwrap();
            for d in &e.0 {
                let text = d.to_string();
                if text.len() > 10_000 {
                    return Err(format!("a message of {} bytes ({})", text.len(), d.code));
                }
            }
            if e.0.iter().any(|d| (code.is_empty() || d.code == code) && d.at.path.starts_with(path)) {
                Ok(())
            } else {
                Err(format!("expected {code} at {path}, got {}", short(&format!("{:?}", e.0.iter().map(|d| (&d.code, &d.at.path)).collect::<Vec<_>>()))))
            }
        }
        (Value::Object(o), Ok(_)) => Err(format!("expected {} at {}, but it drew", o["error"], o["path"])),
        _ => Err("bad case".into()),
    }
}

fn short(s: &str) -> String {
    s.chars().take(300).collect()
}

#[test]
fn the_hostile_corpus_has_its_expected_outcomes() {
    let cases = corpus();
    assert!(cases.len() >= 150, "{} cases", cases.len());
    let mut failures = Vec::new();
    let only = std::env::var("STRATA_HOSTILE_ONLY").ok();
    for c in &cases {
        let name = c["name"].as_str().unwrap();
        if only.as_deref().is_some_and(|o| !name.contains(o)) {
            continue;
        }
        let t0 = std::time::Instant::now();
        let r = run(c);
        if std::env::var_os("STRATA_HOSTILE_TIMES").is_some() {
            eprintln!("{:>8.3} s  {name}", t0.elapsed().as_secs_f64());
        }
        if let Err(e) = r {
            failures.push(format!("[{}] {}: {e}", c["category"].as_str().unwrap(), c["name"].as_str().unwrap()));
        }
    }
    assert!(failures.is_empty(), "{} of {} cases failed:\n{}", failures.len(), cases.len(), failures.join("\n"));
}

#[test]
fn templates_expand() {
    assert_eq!(expand("a@repeat(3, + a)@!"), "a + a + a + a!");
    assert_eq!(expand("@repeat(2,()@x@repeat(2,))@"), "((x))");
    assert_eq!(expand(r#"{"layers":"@layers(2)@"}"#), r#"{"layers":[{"draw":"point","x":"a","y":"b"},{"draw":"point","x":"a","y":"b"}]}"#);
    assert_eq!(expand("n\n@count(3)@"), "n\n0\n1\n2\n");
    assert_eq!(expand("n,c\n@pairs(2)@"), "n,c\n0,c0\n1,c1\n");
}
