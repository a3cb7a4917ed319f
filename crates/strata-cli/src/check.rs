//! `strata check` for a whole site: spec files and HTML pages (every
//! `<strata-chart>` and every Markdown `strata` block in them), each chart
//! validated, drawn with its data when the data is a local file, and linted.
//!
//! Exit status: 0 when clean (warnings allowed), 1 when `--strict` and there
//! are warnings, 2 on any error. `--format json` prints one JSON document for
//! CI annotations: every diagnostic with its file, the line in that file
//! where known, the JSON path, code, severity, message and hint.

use crate::locate;
use crate::pages::{self, Kind};
use serde::Serialize;
use std::path::{Path, PathBuf};
use std::process::ExitCode;
use strata::{DataBytes, Diagnostic, RenderOptions, Severity};

/// One diagnostic, placed in a file.
#[derive(Debug, Clone, Serialize)]
pub struct Finding {
    /// The file holding the spec text (a spec file or a page).
    pub file: String,
    /// 1-based line in `file` of the JSON path (or of the chart) where known.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub line: Option<usize>,
    /// The chart in a page: `#id` or `chart N (line L)`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub chart: Option<String>,
    /// JSON path into the spec.
    #[serde(skip_serializing_if = "String::is_empty")]
    pub path: String,
    pub code: String,
    pub severity: Severity,
    pub message: String,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub hint: Option<String>,
    /// The data file, with the line and column, for problems in the data.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub data_file: Option<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub data_line: Option<u64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub data_column: Option<u64>,
}

impl Finding {
    pub fn text(&self) -> String {
        let mut s = format!("strata: {}", self.file);
        if let Some(l) = self.line {
            s += &format!(":{l}");
        }
        if let Some(c) = &self.chart {
            s += &format!(": {c}");
        }
        s += match self.severity {
            Severity::Error => ": error",
            Severity::Warning => ": warning",
        };
        if !self.path.is_empty() {
            s += &format!(" at {}", self.path);
        }
        if let Some(d) = &self.data_file {
            s += &format!(" ({d}");
            match (self.data_line, self.data_column) {
                (Some(l), Some(c)) => s += &format!(", data line {l}, column {c})"),
                (Some(l), None) => s += &format!(", data line {l})"),
                _ => s += ")",
            }
        }
        s += &format!(": {} [{}]", self.message, self.code);
        if let Some(h) = &self.hint {
            s += &format!("\n  hint: {h}");
        }
        s
    }
}

/// Where a chart's spec text lives, to turn a JSON path into a file line.
pub(crate) struct Source<'a> {
    pub file: &'a Path,
    pub text: &'a str,
    /// Line in `file` of the text's first line.
    pub first_line: usize,
    pub chart: Option<String>,
}

/// Where the data comes from.
pub(crate) enum DataFrom {
    /// A file given outright (`--data`, or a page's `src` attribute).
    File(PathBuf),
    /// The spec's `data.url`, relative to this folder.
    SpecUrl(PathBuf),
}

/// Check one spec text; returns the diagnostics, each placed.
pub(crate) fn check_text(src: &Source, theme: Option<&str>, data: DataFrom, root: Option<&Path>) -> Vec<Finding> {
    let place = |d: &Diagnostic, data_file: Option<&Path>| {
        let line = if d.code == "spec.json_syntax" {
            // serde_json names the line of the syntax error.
            serde_json::from_str::<serde_json::Value>(src.text).err().map(|e| src.first_line + e.line().max(1) - 1)
        } else {
            Some(src.first_line + locate::line_of(src.text, locate::offset(src.text, &d.at.path)) - 1)
        };
        let in_data = d.at.line.is_some();
        Finding {
            file: src.file.display().to_string(),
            line,
            chart: src.chart.clone(),
            path: d.at.path.clone(),
            code: d.code.clone(),
            severity: d.severity,
            message: d.message.clone(),
            hint: d.hint.clone(),
            data_file: data_file.filter(|_| in_data).map(|p| p.display().to_string()),
            data_line: d.at.line,
            data_column: d.at.column,
        }
    };
    let mut text = src.text.to_string();
    if let Some(theme) = theme {
        // The element applies its theme attribute to the spec the same way.
        if let Ok(serde_json::Value::Object(mut o)) = serde_json::from_str::<serde_json::Value>(&text) {
            o.insert("theme".into(), serde_json::Value::String(theme.to_string()));
            text = serde_json::Value::Object(o).to_string();
        }
    }
    let spec = match strata::parse_spec(&text) {
        Ok(s) => s,
        Err(e) => return e.0.iter().map(|d| place(d, None)).collect(),
    };
    let path = match data {
        DataFrom::File(p) => Some(p),
        DataFrom::SpecUrl(dir) => match spec.data.as_ref().and_then(|d| d.object().url) {
            // Remote data cannot be checked here; the spec is still linted.
            Some(url) if url.contains("://") || url.starts_with("//") => None,
            // A local file outside the site, or not a regular file, is refused
            // as bake and the page would refuse it.
            Some(url) => match crate::files::local(&dir, &url, root) {
                Ok(p) => Some(p),
                Err(e) => return vec![place(&Diagnostic::error("data.refused", format!("data.url: {e}")).at_path("data.url"), None)],
            },
            None => None,
        },
    };
    let bytes = match &path {
        Some(p) => match crate::files::read_capped(p, crate::files::MAX_DATA_BYTES, "data") {
            Ok(b) => Some(b),
            Err(e) => {
                let d = Diagnostic::error("data.unreadable", format!("cannot read the data: {e}")).at_path("data.url");
                return vec![place(&d, None)];
            }
        },
        None => None,
    };
    let name = path.as_ref().map(|p| p.display().to_string()).unwrap_or_default();
    let diagnostics = if bytes.is_some() || spec.data.as_ref().is_some_and(|d| d.object().rows.is_some()) {
        let data = bytes.as_deref().map(|b| DataBytes { bytes: b, name: &name });
        // `shapes.url`, relative to the spec's file.
        let shapes_bytes = match (src.file.parent(), spec.shapes.as_ref().and_then(|s| s.url.clone())) {
            (Some(dir), Some(url)) => {
                crate::files::local(dir, &url, root).ok().and_then(|p| crate::files::read_capped(&p, crate::files::MAX_DATA_BYTES, "shapes").ok())
            }
            _ => None,
        };
        let shapes = shapes_bytes.as_deref().map(|b| DataBytes { bytes: b, name: "shapes" });
        match strata::render_spec_with_shapes(&spec, data, shapes, &RenderOptions::default()) {
            Ok(r) => r.warnings,
            Err(e) => e.0,
        }
    } else {
        // No data to draw with: the lint rules that need only the spec.
        strata::lint::check(&spec, None)
    };
    diagnostics.iter().map(|d| place(d, path.as_deref())).collect()
}

/// A spec file inside a folder: a JSON object with `layers` (data files
/// beside it are not specs).
fn looks_like_spec(p: &Path) -> bool {
    crate::files::read_text_capped(p, crate::files::MAX_TEXT_BYTES, "the file")
        .ok()
        .and_then(|t| serde_json::from_str::<serde_json::Value>(&t).ok())
        .is_some_and(|v| v.get("layers").is_some())
}

/// The files to check: pages and specs named outright, and under folders
/// every page and every `.json` that is a spec.
fn files(paths: &[PathBuf]) -> Result<Vec<PathBuf>, String> {
    let mut out = Vec::new();
    for p in paths {
        if p.is_dir() {
            out.extend(pages::html_files(std::slice::from_ref(p))?);
            let mut specs = Vec::new();
            json_files(p, &mut specs);
            specs.sort();
            out.extend(specs.into_iter().filter(|s| looks_like_spec(s)));
        } else {
            out.push(p.clone());
        }
    }
    Ok(out)
}

fn json_files(dir: &Path, out: &mut Vec<PathBuf>) {
    let Ok(rd) = std::fs::read_dir(dir) else { return };
    for e in rd.flatten() {
        let p = e.path();
        let Ok(meta) = std::fs::symlink_metadata(&p) else { continue };
        if meta.is_dir() {
            json_files(&p, out);
        } else if meta.is_file() && p.extension().is_some_and(|e| e.eq_ignore_ascii_case("json")) {
            out.push(p);
        }
    }
}

fn is_page(p: &Path) -> bool {
    p.extension().is_some_and(|e| e.eq_ignore_ascii_case("html") || e.eq_ignore_ascii_case("htm"))
}

/// What checking the files found.
pub struct Outcome {
    pub files: usize,
    pub charts: usize,
    pub findings: Vec<Finding>,
}

/// Check every file (see the module notes); `data` overrides the data of
/// every spec file given.
pub fn check(paths: &[PathBuf], data: Option<&Path>, root: Option<&Path>) -> Result<Outcome, String> {
    let files = files(paths)?;
    let mut findings = Vec::new();
    let mut charts = 0;
    for file in &files {
        let folder_root = if root.is_none() { pages::folder_root(paths, file) } else { None };
        let root = root.or(folder_root.as_deref());
        let text = match crate::files::read_text_capped(file, crate::files::MAX_TEXT_BYTES, "the file") {
            Ok(t) => t,
            Err(e) => {
                findings.push(Finding {
                    file: file.display().to_string(),
                    line: None,
                    chart: None,
                    path: String::new(),
                    code: "file.unreadable".into(),
                    severity: Severity::Error,
                    message: format!("cannot read {}: {e}", file.display()),
                    hint: None,
                    data_file: None,
                    data_line: None,
                    data_column: None,
                });
                continue;
            }
        };
        let dir = file.parent().unwrap_or(Path::new(".")).to_path_buf();
        if !is_page(file) {
            charts += 1;
            let src = Source { file, text: &text, first_line: 1, chart: None };
            let from = match data {
                Some(d) => DataFrom::File(d.to_path_buf()),
                None => DataFrom::SpecUrl(dir),
            };
            findings.extend(check_text(&src, None, from, root));
            continue;
        }
        let found = pages::charts(&text).map_err(|e| format!("strata: {}: {e}", file.display()))?;
        for (i, c) in found.iter().enumerate() {
            charts += 1;
            let name = Some(c.name(i));
            let data_from = |spec_dir: PathBuf| match &c.src {
                Some(s) => match crate::files::local(&dir, s, root) {
                    Ok(p) => DataFrom::File(p),
                    Err(_) => DataFrom::SpecUrl(spec_dir),
                },
                None => DataFrom::SpecUrl(spec_dir),
            };
            match (&c.spec_src, c.kind) {
                (Some(s), Kind::Element) => {
                    let loaded = crate::files::local(&dir, s, root)
                        .and_then(|p| crate::files::read_text_capped(&p, crate::files::MAX_TEXT_BYTES, "spec-src").map(|t| (p, t)));
                    match loaded {
                        Ok((p, t)) => {
                            let spec_dir = p.parent().unwrap_or(Path::new(".")).to_path_buf();
                            let src = Source { file: &p, text: &t, first_line: 1, chart: name };
                            findings.extend(check_text(&src, c.theme.as_deref(), data_from(spec_dir), root));
                        }
                        Err(e) => findings.push(Finding {
                            file: file.display().to_string(),
                            line: Some(c.line),
                            chart: name,
                            path: String::new(),
                            code: "spec.unreadable".into(),
                            severity: Severity::Error,
                            message: format!("cannot read spec-src {s}: {e}"),
                            hint: None,
                            data_file: None,
                            data_line: None,
                            data_column: None,
                        }),
                    }
                }
                _ => {
                    let src = Source { file, text: &c.spec, first_line: c.spec_line, chart: name };
                    findings.extend(check_text(&src, c.theme.as_deref(), data_from(dir.clone()), root));
                }
            }
        }
    }
    Ok(Outcome { files: files.len(), charts, findings })
}

/// The `check` command: print, and choose the exit status.
pub fn run(paths: &[PathBuf], data: Option<&Path>, root: Option<&Path>, strict: bool, json: bool) -> ExitCode {
    let outcome = match check(paths, data, root) {
        Ok(o) => o,
        Err(e) => {
            eprintln!("{e}");
            return ExitCode::from(2);
        }
    };
    let errors = outcome.findings.iter().filter(|f| f.severity == Severity::Error).count();
    let warnings = outcome.findings.len() - errors;
    if json {
        let doc = serde_json::json!({
            "files": outcome.files,
            "charts": outcome.charts,
            "errors": errors,
            "warnings": warnings,
            "diagnostics": outcome.findings,
        });
        println!("{}", serde_json::to_string_pretty(&doc).unwrap_or_default());
    } else {
        // Diagnostics on standard error, the summary on standard output.
        for f in &outcome.findings {
            eprintln!("{}", f.text());
        }
        let plural = |n: usize, w: &str| format!("{n} {w}{}", if n == 1 { "" } else { "s" });
        println!(
            "strata: checked {} in {}: {}, {}",
            plural(outcome.charts, "chart"),
            plural(outcome.files, "file"),
            plural(errors, "error"),
            plural(warnings, "warning")
        );
    }
    if errors > 0 {
        ExitCode::from(2)
    } else if strict && warnings > 0 {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    }
}
