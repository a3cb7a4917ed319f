//! `strata`: validate specs, render charts to SVG, print scenes.

mod bake;
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
    /// Validate a spec (and its data, when found), list lint warnings; exit non-zero on error.
    Check {
        spec: PathBuf,
        #[arg(long)]
        data: Option<PathBuf>,
    },
    /// Print the JSON Schema (draft 2020-12) of the spec.
    Schema,
}

fn main() -> ExitCode {
    let cli = Cli::parse();
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

fn report(spec_path: &Path, e: &Errors) -> String {
    e.0.iter().map(|d| format!("strata: {}: {d}", spec_path.display())).collect::<Vec<_>>().join("\n")
}

fn run(cmd: Command) -> Result<(), String> {
    match cmd {
        Command::Render { spec, data, output, scene, table, width } => {
            let (_, parsed, bytes) = load(&spec, data.as_deref())?;
            let opts = RenderOptions { scene: SceneOptions { width } };
            let data = bytes.as_ref().map(|(b, n)| DataBytes { bytes: b, name: n });
            let r = strata::render_spec(&parsed, data, &opts).map_err(|e| report(&spec, &e))?;
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
            if output.is_some() && pages.len() != 1 {
                return Err("strata: bake -o takes exactly one page".into());
            }
            let mut failures = Vec::new();
            for page in &pages {
                let html = std::fs::read_to_string(page).map_err(|e| format!("strata: cannot read {}: {e}", page.display()))?;
                let (out, report) = bake::bake_html(page, &html, width).map_err(|e| format!("strata: {}: {e}", page.display()))?;
                let dest = output.clone().unwrap_or_else(|| page.clone());
                if out != html || output.is_some() {
                    std::fs::write(&dest, out).map_err(|e| format!("strata: cannot write {}: {e}", dest.display()))?;
                }
                eprintln!("strata: {}: baked {} chart{}", page.display(), report.baked, if report.baked == 1 { "" } else { "s" });
                failures.extend(report.failures);
            }
            if failures.is_empty() {
                Ok(())
            } else {
                Err(failures.iter().map(|f| format!("strata: {f}")).collect::<Vec<_>>().join("\n"))
            }
        }
        Command::Check { spec, data } => {
            let (_, parsed, bytes) = load(&spec, data.as_deref())?;
            // With data, a full render (which lints with the trained scales);
            // without, the lint rules that need only the spec.
            let warnings = if bytes.is_some() || parsed.data.as_ref().is_some_and(|d| d.object().rows.is_some()) {
                let data = bytes.as_ref().map(|(b, n)| DataBytes { bytes: b, name: n });
                strata::render_spec(&parsed, data, &RenderOptions::default()).map_err(|e| report(&spec, &e))?.warnings
            } else {
                strata::lint::check(&parsed, None)
            };
            for w in &warnings {
                println!("strata: {}: {w}", spec.display());
            }
            match warnings.len() {
                0 => println!("{}: ok", spec.display()),
                n => println!("{}: ok, {n} warning{}", spec.display(), if n == 1 { "" } else { "s" }),
            }
            Ok(())
        }
        Command::Schema => {
            println!("{}", strata::spec::schema_text());
            Ok(())
        }
    }
}
