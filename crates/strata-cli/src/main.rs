//! `strata`: validate specs, render charts to SVG, print scenes.

mod bake;
mod bake_progress;
mod check;
mod files;
mod locate;
mod markdown;
mod pages;
mod png;

use clap::{Parser, Subcommand};
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::ExitCode;
use strata::scene::SceneOptions;
use strata::{DataBytes, Errors, RenderOptions};

#[derive(Parser)]
#[command(name = "strata", version, about = "Charts from a JSON spec and a table, as SVG")]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Render a chart to SVG (or print its scene as JSON).
    Render {
        /// The spec file (JSON).
        spec: PathBuf,
        /// Data file; overrides the spec's `data.url`.
        #[arg(long)]
        data: Option<PathBuf>,
        /// GeoJSON file; overrides the spec's `shapes.url`.
        #[arg(long)]
        shapes: Option<PathBuf>,
        /// Output file: `.svg` or `.png` (`.json` with --scene, `.html` with --table);
        /// standard output when absent.
        #[arg(short = 'o', long)]
        output: Option<PathBuf>,
        /// Pixels per SVG unit in PNG output, from 0.5 to 8 (default 2).
        #[arg(long, value_parser = parse_scale)]
        scale: Option<f32>,
        /// Print the scene (marks in pixels with their data) as JSON instead of SVG.
        #[arg(long)]
        scene: bool,
        /// Print the data table (HTML, the numbers behind the marks) instead of SVG.
        #[arg(long, conflicts_with = "scene")]
        table: bool,
        /// Width in pixels when the spec sets none.
        #[arg(long, default_value_t = 640.0, value_parser = parse_width)]
        width: f64,
        /// The folder `data.url` must stay inside (default: the spec's folder).
        #[arg(long)]
        root: Option<PathBuf>,
    },
    /// Pre-render every <strata-chart> of HTML pages in place.
    Bake {
        /// The pages to rewrite.
        #[arg(required = true)]
        pages: Vec<PathBuf>,
        /// Width in pixels for charts whose spec sets none.
        #[arg(long, default_value_t = 640.0, value_parser = parse_width)]
        width: f64,
        /// Widths to draw each chart at, comma-separated (e.g. 360,640), none wider than its
        /// `size.width`; the theme sheet shows the one that fits its container
        /// (default: the chart's own width and 360).
        #[arg(long, value_delimiter = ',', value_parser = parse_width)]
        widths: Option<Vec<f64>>,
        /// Write the baked page here instead of in place (one page only).
        #[arg(short = 'o', long)]
        output: Option<PathBuf>,
        /// The site's root folder: charts read regular files under it only, and
        /// `/x.csv` means this folder's `x.csv` (default: each page's folder).
        #[arg(long)]
        root: Option<PathBuf>,
    },
    /// Validate and lint spec files and pages (every chart in them; folders: all pages and specs under them).
    /// Exit 0 when clean, 1 on warnings with --strict, 2 on errors.
    Check {
        /// Spec files, HTML pages and folders.
        #[arg(required = true)]
        files: Vec<PathBuf>,
        /// Data file for the spec files given; overrides their `data.url`.
        #[arg(long)]
        data: Option<PathBuf>,
        /// Exit 1 when there are warnings (and no errors).
        #[arg(long)]
        strict: bool,
        /// How diagnostics are printed.
        #[arg(long, value_enum, default_value_t = Format::Text)]
        format: Format,
        /// The folder `data.url` must stay inside (default: the spec's folder).
        #[arg(long)]
        root: Option<PathBuf>,
    },
    /// Print the JSON Schema (draft 2020-12) of the spec.
    Schema,
}

#[derive(Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
enum Format {
    /// One line a diagnostic, with its file, line and column.
    Text,
    /// One JSON document with every diagnostic, for CI annotations.
    Json,
}

/// The widest chart, in pixels, a width option may ask for.
const MAX_WIDTH: f64 = 100_000.0;

fn parse_width(s: &str) -> Result<f64, String> {
    let w: f64 = s.trim().parse().map_err(|_| format!("`{s}` is not a number"))?;
    if !w.is_finite() || w <= 0.0 || w > MAX_WIDTH {
        return Err(format!("the width must be a number of pixels above 0 and at most {MAX_WIDTH}, not `{s}`"));
    }
    Ok(w)
}

/// The smallest and largest PNG scale `--scale` accepts.
const SCALE_RANGE: (f32, f32) = (0.5, 8.0);

/// The PNG scale when `--scale` is absent.
const DEFAULT_SCALE: f32 = 2.0;

fn parse_scale(s: &str) -> Result<f32, String> {
    let k: f32 = s.trim().parse().map_err(|_| format!("`{s}` is not a number"))?;
    let (lo, hi) = SCALE_RANGE;
    if !k.is_finite() || !(lo..=hi).contains(&k) {
        return Err(format!("the scale must be a number from {lo} to {hi}, not `{s}`"));
    }
    Ok(k)
}

/// What `render -o` writes, chosen by the file's extension; anything else is
/// refused, so a `.pdf` or `.jpg` never silently holds SVG text.
#[derive(Clone, Copy, PartialEq, Eq, Debug)]
enum OutKind {
    Svg,
    Png,
    Text,
}

fn out_kind(path: &Path, scene: bool, table: bool) -> Result<OutKind, String> {
    let ext = path.extension().and_then(|e| e.to_str()).unwrap_or("").to_ascii_lowercase();
    let (kind, accepted) = if scene {
        (matches!(ext.as_str(), "json").then_some(OutKind::Text), "`.json`")
    } else if table {
        (matches!(ext.as_str(), "html" | "htm").then_some(OutKind::Text), "`.html` or `.htm`")
    } else {
        let k = match ext.as_str() {
            "svg" => Some(OutKind::Svg),
            "png" => Some(OutKind::Png),
            _ => None,
        };
        (k, "`.svg` or `.png`")
    };
    let what = if scene {
        "a scene"
    } else if table {
        "a data table"
    } else {
        "a chart"
    };
    kind.ok_or_else(|| {
        let got = if ext.is_empty() { "no extension".to_string() } else { format!("`.{ext}`") };
        format!("strata: cannot write {what} to {}: the file name ends in {got}; render writes {accepted} files, or standard output without -o", path.display())
    })
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    if let Command::Check { files, data, strict, format, root } = &cli.command {
        return check::run(files, data.as_deref(), root.as_deref(), *strict, *format == Format::Json);
    }
    match run(cli.command) {
        Ok(()) => ExitCode::SUCCESS,
        Err(msg) => {
            err_line(&msg);
            ExitCode::FAILURE
        }
    }
}

/// A line on standard error; a closed stderr is not worth a panic.
fn err_line(msg: &str) {
    let _ = writeln!(std::io::stderr().lock(), "{msg}");
}

/// Text on standard output. A reader that went away (`strata ... | head`)
/// ends the output quietly, as other command-line tools do.
fn out_text(text: &str) -> Result<(), String> {
    let mut o = std::io::stdout().lock();
    match o.write_all(text.as_bytes()).and_then(|_| o.flush()) {
        Ok(()) => Ok(()),
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        Err(e) => Err(format!("strata: cannot write to standard output: {e}")),
    }
}

/// Read the spec and the data it names (a regular file under the root,
/// which is the spec's folder unless given).
fn load(spec_path: &Path, data: Option<&Path>, root: Option<&Path>) -> Result<(String, strata::spec::Spec, Option<(Vec<u8>, String)>), String> {
    let text = files::read_text_capped(spec_path, files::MAX_TEXT_BYTES, "the spec").map_err(|e| format!("strata: {e}"))?;
    let spec = strata::parse_spec(&text).map_err(|e| report(spec_path, &e))?;
    let bytes = match data {
        // A file named on the command line is the caller's choice: read through the cap only.
        Some(p) => Some((files::read_capped(p, files::MAX_DATA_BYTES, "data").map_err(|e| format!("strata: {e}"))?, p.display().to_string())),
        None => match spec.data.as_ref().and_then(|d| d.object().url) {
            Some(u) => {
                let fail = |e: String| format!("strata: {}: error at data.url: {e}", spec_path.display());
                let spec_dir = spec_path.parent().filter(|p| !p.as_os_str().is_empty()).unwrap_or(Path::new("."));
                let site = files::Site::new(root.unwrap_or(spec_dir)).map_err(fail)?;
                let base = site.segments_of(spec_dir).map_err(fail)?;
                let p = site.resolve(&base, &u).map_err(fail)?;
                let b = files::read_capped(&p, files::MAX_DATA_BYTES, "data").map_err(fail)?;
                Some((b, u.to_string()))
            }
            None => None,
        },
    };
    Ok((text, spec, bytes))
}

/// The most diagnostics, and characters in one, that a report prints.
const MAX_REPORTED: usize = 50;
const MAX_MESSAGE_CHARS: usize = 2000;

/// Read the spec's `shapes.url` as its data is read: a regular file under
/// the site root (the spec's folder unless given), through the byte cap.
fn load_shapes(spec_path: &Path, spec: &strata::spec::Spec, root: Option<&Path>) -> Result<Option<(Vec<u8>, String)>, String> {
    let Some(u) = spec.shapes.as_ref().and_then(|s| s.url.clone()) else { return Ok(None) };
    let fail = |e: String| format!("strata: {}: error at shapes.url: {e}", spec_path.display());
    let spec_dir = spec_path.parent().filter(|p| !p.as_os_str().is_empty()).unwrap_or(Path::new("."));
    let p = files::local(spec_dir, &u, root).map_err(fail)?;
    let b = files::read_capped(&p, files::MAX_DATA_BYTES, "shapes").map_err(fail)?;
    Ok(Some((b, u)))
}

fn report(spec_path: &Path, e: &Errors) -> String {
    let mut lines: Vec<String> = e.0.iter().take(MAX_REPORTED).map(|d| cap_chars(&format!("strata: {}: {d}", spec_path.display()))).collect();
    if e.0.len() > MAX_REPORTED {
        lines.push(format!("strata: {}: ... and {} more errors", spec_path.display(), e.0.len() - MAX_REPORTED));
    }
    lines.join("\n")
}

/// A message cut to [`MAX_MESSAGE_CHARS`] characters.
fn cap_chars(s: &str) -> String {
    match s.char_indices().nth(MAX_MESSAGE_CHARS) {
        Some((i, _)) => format!("{}... ({} more characters)", &s[..i], s[i..].chars().count()),
        None => s.to_string(),
    }
}

fn run(cmd: Command) -> Result<(), String> {
    match cmd {
        Command::Render { spec, data, shapes, output, scale, scene, table, width, root } => {
            // The output's name is checked before any work, so a mistake costs nothing.
            let kind = output.as_deref().map(|p| out_kind(p, scene, table)).transpose()?;
            if scale.is_some() && kind != Some(OutKind::Png) {
                return Err("strata: --scale applies to PNG output only (-o FILE.png)".into());
            }
            let (_, parsed, bytes) = load(&spec, data.as_deref(), root.as_deref())?;
            let opts = RenderOptions { scene: SceneOptions { width } };
            let data = bytes.as_ref().map(|(b, n)| DataBytes { bytes: b, name: n });
            let shapes = match shapes {
                // A file named on the command line is the caller's choice: read through the cap only.
                Some(p) => Some((files::read_capped(&p, files::MAX_DATA_BYTES, "shapes").map_err(|e| format!("strata: {e}"))?, p.display().to_string())),
                None => load_shapes(&spec, &parsed, root.as_deref())?,
            };
            let shapes = shapes.as_ref().map(|(b, n)| DataBytes { bytes: b, name: n });
            let r = strata::render_spec_with_shapes(&parsed, data, shapes, &opts).map_err(|e| report(&spec, &e))?;
            for w in r.warnings.iter().take(MAX_REPORTED) {
                err_line(&cap_chars(&format!("strata: {}: {w}", spec.display())));
            }
            let out = if scene {
                serde_json::to_string_pretty(&r.scene).map_err(|e| e.to_string())? + "\n"
            } else if table {
                r.table + "\n"
            } else {
                r.svg
            };
            match output {
                Some(p) if kind == Some(OutKind::Png) => {
                    let bytes = png::encode(&out, scale.unwrap_or(DEFAULT_SCALE))?;
                    std::fs::write(&p, bytes).map_err(|e| format!("strata: cannot write {}: {e}", p.display()))?
                }
                Some(p) => std::fs::write(&p, out).map_err(|e| format!("strata: cannot write {}: {e}", p.display()))?,
                None => out_text(&out)?,
            }
            Ok(())
        }
        Command::Bake { pages, width, widths, output, root } => {
            let widths = bake::Widths { fallback: width, listed: widths };
            let (folders, pages) = (pages.clone(), pages::html_files(&pages)?);
            if output.is_some() && pages.len() != 1 {
                return Err("strata: bake -o takes exactly one page".into());
            }
            let mut progress = bake_progress::Progress::new(pages.len());
            let (mut failures, mut baked) = (Vec::new(), 0);
            for page in &pages {
                progress.step(page);
                let html = files::read_text_capped(page, files::MAX_TEXT_BYTES, "the page").map_err(|e| format!("strata: {e}"))?;
                let page_dir = page.parent().filter(|p| !p.as_os_str().is_empty()).unwrap_or(Path::new("."));
                // The root: --root, else the folder given that holds the page, else the page's folder.
                let root = root.clone().or_else(|| pages::folder_root(&folders, page));
                let site = files::Site::new(root.as_deref().unwrap_or(page_dir)).map_err(|e| format!("strata: {}: {e}", page.display()))?;
                // Markdown `strata` blocks become elements, then every element is drawn.
                let md = markdown::convert(page, &html, root.as_deref()).map_err(|e| format!("strata: {}: {e}", page.display()))?;
                let (out, report) = bake::bake_html(page, &md.html, &widths, &site).map_err(|e| format!("strata: {}: {e}", page.display()))?;
                let dest = output.clone().unwrap_or_else(|| page.clone());
                if out != html || output.is_some() {
                    std::fs::write(&dest, out).map_err(|e| format!("strata: cannot write {}: {e}", dest.display()))?;
                }
                baked += report.baked;
                failures.extend(md.failures);
                failures.extend(report.failures.iter().map(|f| format!("strata: {f}")));
            }
            progress.finish();
            let plural = |n: usize, w: &str| format!("{n} {w}{}", if n == 1 { "" } else { "s" });
            let failed = if failures.is_empty() { String::new() } else { format!(", {} failed", plural(failures.len(), "chart")) };
            eprintln!("strata: baked {} in {}{failed}", plural(baked, "chart"), plural(pages.len(), "page"));
            if failures.is_empty() {
                Ok(())
            } else {
                Err(failures.iter().map(|f| cap_chars(f)).collect::<Vec<_>>().join("\n"))
            }
        }
        Command::Check { .. } => unreachable!("handled in main"),
        Command::Schema => out_text(&format!("{}\n", strata::spec::schema_text())),
    }
}
