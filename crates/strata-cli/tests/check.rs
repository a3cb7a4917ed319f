//! `strata check` over a site: exit 0 when clean, 1 on warnings with
//! `--strict`, 2 on errors; `--format json` places every diagnostic in its
//! file and line (lines counted by hand in the fixtures below).

use std::path::{Path, PathBuf};
use std::process::Command;

const CLEAN: &str = r#"{
  "data": {"rows": [{"k": "a", "v": 1}, {"k": "b", "v": 2}]},
  "layers": [{"draw": "bar", "x": "k", "y": "v"}]
}"#;

// Bars on a log scale: the lint rule `lint.log_bars` warns.
const WARNING: &str = r#"{
  "data": {"rows": [{"k": "a", "v": 1}, {"k": "b", "v": 20}]},
  "scales": {"y": {"kind": "log"}},
  "layers": [{"draw": "bar", "x": "k", "y": "v"}]
}"#;

// `layers[0].y` names a column the data does not have (line 5).
const ERROR: &str = r#"{
  "data": {"rows": [{"k": "a", "v": 1}]},
  "layers": [{
    "draw": "bar", "x": "k",
    "y": "value"
  }]
}"#;

fn site(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("strata-check-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    for (f, t) in [("clean.json", CLEAN), ("warning.json", WARNING), ("error.json", ERROR)] {
        std::fs::write(dir.join(f), t).unwrap();
    }
    dir
}

fn check(args: &[&str], files: &[&Path]) -> (i32, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_strata")).arg("check").args(args).args(files).output().unwrap();
    (out.status.code().unwrap(), String::from_utf8(out.stdout).unwrap())
}

/// Text mode: diagnostics on standard error, the summary on standard output.
fn check_text(args: &[&str], files: &[&Path]) -> (String, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_strata")).arg("check").args(args).args(files).output().unwrap();
    (String::from_utf8(out.stderr).unwrap(), String::from_utf8(out.stdout).unwrap())
}

fn json(files: &[&Path]) -> serde_json::Value {
    let (_, out) = check(&["--format", "json"], files);
    serde_json::from_str(&out).unwrap()
}

#[test]
fn exit_codes_clean_warning_error() {
    let d = site("codes");
    let (clean, warning, error) = (d.join("clean.json"), d.join("warning.json"), d.join("error.json"));
    assert_eq!(check(&[], &[&clean]).0, 0);
    assert_eq!(check(&["--strict"], &[&clean]).0, 0);
    // A warning is no failure unless asked.
    assert_eq!(check(&[], &[&warning]).0, 0);
    assert_eq!(check(&["--strict"], &[&warning]).0, 1);
    assert_eq!(check(&[], &[&error]).0, 2);
    assert_eq!(check(&["--strict"], &[&error]).0, 2);
    // Errors outrank warnings across files.
    assert_eq!(check(&["--strict"], &[&clean, &warning, &error]).0, 2);
    // A missing file is an error too.
    assert_eq!(check(&[], &[&d.join("nope.json")]).0, 2);
    let (diagnostics, summary) = check_text(&[], &[&clean, &warning, &error]);
    assert!(diagnostics.contains("warning at scales.y.kind"), "{diagnostics}");
    assert!(summary.ends_with("checked 3 charts in 3 files: 1 error, 1 warning\n"), "{summary}");
}

#[test]
fn json_diagnostics_name_file_line_path_code() {
    let d = site("json");
    let v = json(&[&d.join("error.json"), &d.join("warning.json")]);
    assert_eq!(v["errors"], 1);
    assert_eq!(v["warnings"], 1);
    let e = &v["diagnostics"][0];
    assert_eq!(e["file"], d.join("error.json").display().to_string());
    assert_eq!(e["path"], "layers[0].y");
    assert_eq!(e["line"], 5);
    assert_eq!(e["code"], "spec.unknown_column");
    assert_eq!(e["severity"], "error");
    assert!(e["message"].as_str().unwrap().contains("value"));
    let w = &v["diagnostics"][1];
    assert_eq!((w["path"].as_str(), w["line"].as_u64(), w["severity"].as_str()), (Some("scales.y.kind"), Some(3), Some("warning")));
    assert!(w["hint"].as_str().unwrap().contains("quiet"));
}

#[test]
fn json_syntax_errors_name_their_line() {
    let d = site("syntax");
    let f = d.join("broken.json");
    std::fs::write(&f, "{\n  \"layers\": [\n    {\"draw\": \"bar\" \"x\": \"k\"}\n  ]\n}").unwrap();
    let v = json(&[&f]);
    assert_eq!(v["diagnostics"][0]["code"], "spec.json_syntax");
    assert_eq!(v["diagnostics"][0]["line"], 3);
}

#[test]
fn pages_and_folders() {
    let d = site("pages");
    std::fs::write(d.join("d.csv"), "k,v\na,1\nb,2\n").unwrap();
    // A data file beside the specs is not taken for a spec.
    std::fs::write(d.join("rows.json"), r#"[{"k": "a", "v": 1}]"#).unwrap();
    std::fs::create_dir_all(d.join("posts")).unwrap();
    // A Markdown block as converters write it: the error is on page line 6.
    let page = "<!doctype html>\n<h1>Post</h1>\n<pre><code class=\"language-strata\">{\n  &quot;data&quot;: &quot;../d.csv&quot;,\n  &quot;layers&quot;: [{&quot;draw&quot;: &quot;bar&quot;, &quot;x&quot;: &quot;k&quot;,\n    &quot;y&quot;: &quot;nope&quot;}]\n}\n</code></pre>\n<strata-chart id=\"good\" src=\"../d.csv\"><script type=\"application/json\">{\"layers\": [{\"draw\": \"bar\", \"x\": \"k\", \"y\": \"v\"}]}</script></strata-chart>\n";
    std::fs::write(d.join("posts/a.html"), page).unwrap();
    let v = json(&[&d]);
    // posts/a.html (2 charts), then clean, error and warning specs.
    assert_eq!(v["files"], 4, "{v}");
    assert_eq!(v["charts"], 5, "{v}");
    let page_diags: Vec<&serde_json::Value> = v["diagnostics"].as_array().unwrap().iter().filter(|x| x["file"].as_str().unwrap().ends_with("a.html")).collect();
    assert_eq!(page_diags.len(), 1, "{v}");
    assert_eq!(page_diags[0]["path"], "layers[0].y");
    assert_eq!(page_diags[0]["line"], 6);
    assert_eq!(page_diags[0]["chart"], "chart 1 (line 3)");
    assert_eq!(check(&[], &[&d.join("posts")]).0, 2);
}

#[test]
fn spec_src_is_checked_in_its_own_file() {
    let d = site("specsrc");
    std::fs::write(d.join("d.csv"), "k,v\na,1\nb,2\n").unwrap();
    // The element's `src` gives the data (relative to the page); the spec file is placed by its own lines.
    std::fs::write(d.join("page.html"), "<p>x</p>\n<strata-chart id=\"c\" src=\"d.csv\" spec-src=\"s.json\"></strata-chart>\n").unwrap();
    std::fs::write(d.join("s.json"), "{\n  \"layers\": [\n    {\"draw\": \"bar\", \"x\": \"k\", \"y\": \"w\"}\n  ]\n}").unwrap();
    let v = json(&[&d.join("page.html")]);
    let e = &v["diagnostics"][0];
    assert_eq!(e["file"], d.join("s.json").display().to_string());
    assert_eq!((e["line"].as_u64(), e["path"].as_str(), e["chart"].as_str()), (Some(3), Some("layers[0].y"), Some("#c")));
    // A missing spec-src is an error placed on the element's line.
    std::fs::write(d.join("page.html"), "<p>x</p>\n\n<strata-chart id=\"c\" spec-src=\"gone.json\"></strata-chart>\n").unwrap();
    let v = json(&[&d.join("page.html")]);
    assert_eq!((v["diagnostics"][0]["code"].as_str(), v["diagnostics"][0]["line"].as_u64()), (Some("spec.unreadable"), Some(3)));
}

#[test]
fn data_errors_name_the_data_file_line_and_column() {
    let d = site("data");
    // Row 3 has three fields where the header has two (RFC 4180: each record the same count).
    std::fs::write(d.join("d.csv"), "k,v\na,1\nb,2,9\n").unwrap();
    std::fs::write(d.join("s.json"), r#"{"data": "d.csv", "layers": [{"draw": "bar", "x": "k", "y": "v"}]}"#).unwrap();
    let v = json(&[&d.join("s.json")]);
    let e = &v["diagnostics"][0];
    assert_eq!(e["severity"], "error", "{v}");
    assert_eq!(e["data_file"], d.join("d.csv").display().to_string());
    assert_eq!(e["data_line"], 3);
}
