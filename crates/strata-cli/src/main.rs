//! `strata`: validate specs, render charts to SVG, print scenes.

mod bake;
mod bake_progress;
mod check;
mod locate;
mod markdown;
mod pages;
mod png;

use clap::{Parser, Subcommand};
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
        /// Output file; standard output when absent.
        #[arg(short = 'o', long)]
        output: Option<PathBuf>,
        /// Print the scene (marks in pixels with their data) as JSON instead of SVG.
        #[arg(long)]
        scene: bool,
        /// Print the data table (HTML, the numbers behind the marks) instead of SVG.
        #[arg(long, conflicts_with = "scene")]
        table: bool,
        /// Width in pixels when the spec sets none.
        #[arg(long, default_value_t = 640.0)]
        width: f64,
    },
    /// Pre-render every <strata-chart> of HTML pages in place.
    Bake {
        /// The pages to rewrite.
        #[arg(required = true)]
        pages: Vec<PathBuf>,
        /// Width in pixels for charts whose spec sets none.
        #[arg(long, default_value_t = 640.0)]
        width: f64,
        /// Write the baked page here instead of in place (one page only).
        #[arg(short = 'o', long)]
        output: Option<PathBuf>,
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
        /// `text` (one line a diagnostic) or `json` (one document, for CI annotations).
        #[arg(long, value_enum, default_value_t = Format::Text)]
        format: Format,
    },
    /// Print the JSON Schema (draft 2020-12) of the spec.
    Schema,
}

#[derive(Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
enum Format {
    Text,
    Json,
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    if let Command::Check { files, data, strict, format } = &cli.command {
        return check::run(files, data.as_deref(), *strict, *format == Format::Json);
    }
    match run(cli.command) {
        Ok(()) => ExitCode::SUCCESS,
        Err(msg) => {
            eprintln!("{msg}");
            ExitCode::FAILURE
        }
    }
}

/// Read the spec and the data it names (relative to the spec's folder).
fn load(spec_path: &Path, data: Option<&Path>) -> Result<(String, strata::spec::Spec, Option<(Vec<u8>, String)>), String> {
    let text = std::fs::read_to_string(spec_path).map_err(|e| format!("strata: cannot read {}: {e}", spec_path.display()))?;
    let spec = strata::parse_spec(&text).map_err(|e| report(spec_path, &e))?;
    let data_path = match data {
        Some(p) => Some(p.to_path_buf()),
        None => spec.data.as_ref().and_then(|d| d.object().url).map(|u| {
            let base = spec_path.parent().unwrap_or(Path::new("."));
            base.join(u)
        }),
    };
    let bytes = match data_path {
        Some(p) => Some((
            std::fs::read(&p).map_err(|e| format!("strata: {}: error at data.url: cannot read {}: {e}", spec_path.display(), p.display()))?,
            p.display().to_string(),
        )),
        None => None,
    };
    Ok((text, spec, bytes))
}

/// Read the spec's `shapes.url` (relative to the spec's folder), like its data.
fn load_shapes(spec_path: &Path, spec: &strata::spec::Spec) -> Result<Option<(Vec<u8>, String)>, String> {
    let Some(u) = spec.shapes.as_ref().and_then(|s| s.url.clone()) else { return Ok(None) };
    let p = spec_path.parent().unwrap_or(Path::new(".")).join(u);
    let b = std::fs::read(&p).map_err(|e| format!("strata: {}: error at shapes.url: cannot read {}: {e}", spec_path.display(), p.display()))?;
    Ok(Some((b, p.display().to_string())))
}

fn report(spec_path: &Path, e: &Errors) -> String {
    e.0.iter().map(|d| format!("strata: {}: {d}", spec_path.display())).collect::<Vec<_>>().join("\n")
}

fn run(cmd: Command) -> Result<(), String> {
    match cmd {
        Command::Render { spec, data, shapes, output, scene, table, width } => {
            let (_, parsed, bytes) = load(&spec, data.as_deref())?;
            let opts = RenderOptions { scene: SceneOptions { width } };
            let data = bytes.as_ref().map(|(b, n)| DataBytes { bytes: b, name: n });
            let shapes = match shapes {
                Some(p) => Some((std::fs::read(&p).map_err(|e| format!("strata: cannot read {}: {e}", p.display()))?, p.display().to_string())),
                None => load_shapes(&spec, &parsed)?,
            };
            let shapes = shapes.as_ref().map(|(b, n)| DataBytes { bytes: b, name: n });
            let r = strata::render_spec_with_shapes(&parsed, data, shapes, &opts).map_err(|e| report(&spec, &e))?;
            for w in &r.warnings {
                eprintln!("strata: {}: {w}", spec.display());
            }
            let out = if scene {
                serde_json::to_string_pretty(&r.scene).map_err(|e| e.to_string())? + "\n"
            } else if table {
                r.table + "\n"
            } else {
                r.svg
            };
            let is_png = output.as_ref().is_some_and(|p| p.extension().is_some_and(|e| e.eq_ignore_ascii_case("png")));
            match output {
                Some(p) if is_png && !scene && !table => {
                    let bytes = png::encode(&out, 2.0)?;
                    std::fs::write(&p, bytes).map_err(|e| format!("strata: cannot write {}: {e}", p.display()))?
                }
                Some(p) => std::fs::write(&p, out).map_err(|e| format!("strata: cannot write {}: {e}", p.display()))?,
                None => print!("{out}"),
            }
            Ok(())
        }
        Command::Bake { pages, width, output } => {
            let pages = pages::html_files(&pages)?;
            if output.is_some() && pages.len() != 1 {
                return Err("strata: bake -o takes exactly one page".into());
            }
            let mut progress = bake_progress::Progress::new(pages.len());
            let (mut failures, mut baked) = (Vec::new(), 0);
            for page in &pages {
                progress.step(page);
                let html = std::fs::read_to_string(page).map_err(|e| format!("strata: cannot read {}: {e}", page.display()))?;
                // Markdown `strata` blocks become elements, then every element is drawn.
                let md = markdown::convert(page, &html).map_err(|e| format!("strata: {}: {e}", page.display()))?;
                let (out, report) = bake::bake_html(page, &md.html, width).map_err(|e| format!("strata: {}: {e}", page.display()))?;
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
                Err(failures.join("\n"))
            }
        }
        Command::Check { .. } => unreachable!("handled in main"),
        Command::Schema => {
            println!("{}", strata::spec::schema_text());
            Ok(())
        }
    }
}
