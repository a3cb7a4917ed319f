//! Strata: a layered grammar-of-graphics engine.
//!
//! The pipeline, one stage a module, each handing a small typed value to the
//! next; a stage names only earlier stages and the shared libraries, never a
//! later one (`tests/module_graph.rs` fails on any cycle between modules and
//! on the scene naming the spec):
//!
//! 1. [`spec`]  — JSON text to [`spec::Spec`] ([`parse_spec`]: shape check, expression syntax, serde).
//!    Every word is an enum from one list ([`spec`]'s `vocab.rs`); defaults live in [`spec::defaults`].
//! 2. [`data`]  — bytes to [`data::Table`] (typed columns of our own); [`expr`] derives and filters
//! 3. [`plan`]  — spec + table to [`plan::Plan`]: per layer, [`channel::Channel`]-keyed columns
//!    after statistics and positions; trained scales; panels split (free scales trained per panel);
//!    the chart-wide options the scene needs ([`plan::Chart`]: titles, size, palette, coordinates, notes,
//!    and the text alternative, written by [`plan::summary`] when the spec gives none)
//! 4. [`scene`] — plan (only) to [`scene::Scene`]: marks, axes and legends in pixels; paths are
//!    typed segments ([`scene::Seg`]) and [`scene::Scene::non_finite`] lists any NaN geometry
//! 5. [`svg`]   — scene to SVG text (it writes the path data); [`datatable`] — plan to an HTML data table
//!
//! Libraries the stages share: [`channel`] (the channel names), [`calendar`] (dates), [`stat`]
//! (numerics), [`scale`] (mapping and ticks), [`format`](mod@format) (labels), [`color`], [`text`]
//! (measurement), [`math`], [`json`] (JSON text to `serde_json::Value` and JSON strings out, without
//! serde's machinery).

pub mod budget;
pub mod calendar;
pub mod channel;
pub mod color;
pub mod data;
pub mod datatable;
pub mod error;
pub mod expr;
pub mod format;
pub mod geo;
pub mod guard;
pub mod index;
pub mod json;
#[cfg(feature = "lint")]
pub mod lint;
pub mod math;
pub mod plan;
pub mod scale;
pub mod scene;
pub mod sort;
pub mod spec;
pub mod stat;
pub mod svg;
pub mod text;

pub use error::{Diagnostic, Errors, Severity};

use spec::Spec;

/// Data handed to [`render`]: bytes from a file or URL, with a name for
/// format guessing and messages.
#[derive(Debug, Clone, Copy)]
pub struct DataBytes<'a> {
    pub bytes: &'a [u8],
    pub name: &'a str,
}

/// Everything a render produces.
#[derive(Debug, Clone)]
pub struct Rendered {
    pub svg: String,
    /// The data table (HTML), empty when the spec says `"data_table": "none"`.
    pub table: String,
    pub scene: scene::Scene,
    pub warnings: Vec<Diagnostic>,
}

/// Options the host sets.
#[derive(Debug, Clone, Copy, Default)]
pub struct RenderOptions {
    pub scene: scene::SceneOptions,
}

/// The reading options a spec's `data` sets (types, digest, delimiter...).
fn read_options(spec: &Spec, format: Option<spec::DataFormat>, delimiter: Option<u8>) -> data::ReadOptions {
    let obj = spec.data.as_ref().map(|d| d.object()).unwrap_or_default();
    let mut opts =
        data::ReadOptions { format, types: obj.types.clone(), sha256: obj.sha256.clone(), delimiter, decimal_comma: obj.decimal_comma, ..Default::default() };
    if let Some(missing) = &obj.missing {
        opts.null_tokens = missing.clone();
    }
    opts
}

/// Read the table a spec asks for: inline `rows`, or the given bytes.
pub fn load_table(spec: &Spec, data: Option<DataBytes>) -> Result<data::Table, Errors> {
    load_table_with_digest(spec, data, None)
}

/// [`load_table`] with the host's SHA-256 of the bytes, which `data.sha256`
/// is checked against ([`data::ReadOptions::digest`]).
pub fn load_table_with_digest(spec: &Spec, data: Option<DataBytes>, digest: Option<[u8; 32]>) -> Result<data::Table, Errors> {
    let obj = spec.data.as_ref().map(|d| d.object()).unwrap_or_default();
    if let Some(d) = data {
        let format = obj.format.or_else(|| data::format_from_name(d.name));
        // A `.csv` name says "delimited text", not which delimiter: unless the
        // spec says, semicolon, tab and pipe files are sniffed too.
        let delimiter = match obj.delimiter.as_deref() {
            Some(s) => s.bytes().next(),
            None if obj.format.is_none() && format == Some(spec::DataFormat::Csv) => Some(data::csv::sniff_delimiter(d.bytes)),
            None => None,
        };
        return data::read(d.bytes, &data::ReadOptions { digest, ..read_options(spec, format, delimiter) });
    }
    if let Some(rows) = &obj.rows {
        return data::from_rows(rows, &obj.types);
    }
    Err(Diagnostic::error("data.missing", "the chart has no data")
        .at_path("data")
        .with_hint("give `data.url` (or the element's `src` attribute, or `--data FILE`) or inline `data.rows`")
        .into())
}

/// Read the shapes a spec asks for: inline `shapes.features`, or the given
/// bytes (`shapes.url`, fetched by the host), checked against `shapes.sha256`.
pub fn load_shapes(spec: &Spec, bytes: Option<DataBytes>) -> Result<Option<Vec<geo::geojson::Feature>>, Errors> {
    let Some(s) = &spec.shapes else { return Ok(None) };
    if !cfg!(feature = "maps") {
        return Err(needs_full_engine("shapes", "shapes").into());
    }
    let key = s.key.as_deref();
    if let Some(features) = &s.features {
        return geo::geojson::read(&serde_json::Value::Array(features.clone()), key, "shapes.features").map(Some).map_err(Errors);
    }
    let Some(b) = bytes else {
        return Err(Diagnostic::error("shapes.missing", "the shapes were not read")
            .at_path("shapes")
            .with_hint("give `shapes.url` (read by the host, like `data.url`) or inline `shapes.features`")
            .into());
    };
    #[cfg(feature = "maps")]
    if let Some(want) = &s.sha256 {
        let got = data::sha256_hex(b.bytes);
        if got != want.trim().to_ascii_lowercase() {
            return Err(Diagnostic::error(
                "shapes.sha256_mismatch",
                format!("the shapes' SHA-256 digest is {got}, but `shapes.sha256` expects {want}; the shapes were refused"),
            )
            .at_path("shapes.sha256")
            .into());
        }
    }
    geo::geojson::read_bytes(b.bytes, key, "shapes").map(Some).map_err(Errors)
}

/// Whether this build is the full engine (the `full` feature: maps,
/// expressions, `unpivot`, fitted statistics and box plots).
/// The page's core engine is not: it refuses what [`spec::needs_full`]
/// names. The native CLI and the tests build with everything.
pub const HAS_FULL: bool = cfg!(feature = "full");

/// The error of the page's core engine (built without `full`) given a spec
/// that needs the full engine: never a chart drawn without the part it
/// asks for. `<strata-chart>` draws the chart again with the full engine
/// on this code.
pub(crate) fn needs_full_engine(path: &str, word: &str) -> Diagnostic {
    Diagnostic::error("spec.needs_full_engine", format!("this engine leaves out `{word}`: it is the page's core engine, built without the `full` feature"))
        .at_path(path)
        .with_hint("load the full engine (pkg/strata_wasm_full.js); <strata-chart> switches to it by itself")
}

/// The core engine refuses a spec that needs the full engine, before
/// reading any data.
fn core_refuses(spec: &Spec) -> Result<(), Errors> {
    match spec::needs_full(spec) {
        Some((path, word)) if !HAS_FULL => Err(needs_full_engine(&path, word).into()),
        _ => Ok(()),
    }
}

/// The whole pipeline for a parsed spec; error messages are capped in length.
pub fn render_spec(spec: &Spec, data: Option<DataBytes>, opts: &RenderOptions) -> Result<Rendered, Errors> {
    render_spec_with_shapes(spec, data, None, opts)
}

/// [`render_spec`] with the bytes of `shapes.url`, when the spec names one.
pub fn render_spec_with_shapes(spec: &Spec, data: Option<DataBytes>, shapes: Option<DataBytes>, opts: &RenderOptions) -> Result<Rendered, Errors> {
    render_spec_with_digest(spec, data, None, shapes, opts)
}

/// [`render_spec_with_shapes`] with the host's SHA-256 of the data bytes
/// (the page's core engine, built without the `sha` feature, is handed it).
pub fn render_spec_with_digest(
    spec: &Spec,
    data: Option<DataBytes>,
    digest: Option<[u8; 32]>,
    shapes: Option<DataBytes>,
    opts: &RenderOptions,
) -> Result<Rendered, Errors> {
    let has_bytes = data.is_some();
    let run = || {
        check_width(opts)?;
        core_refuses(spec)?;
        let shapes = load_shapes(spec, shapes)?;
        // A base map needs no table.
        let table =
            if spec.data.is_none() && shapes.is_some() { data::from_rows(&[], &Default::default())? } else { load_table_with_digest(spec, data, digest)? };
        render_stages(spec, table, shapes, has_bytes, opts)
    };
    run().map_err(budget::cap_messages)
}

/// The pipeline from stage 2b on, for a table already read.
pub fn render_table(spec: &Spec, table: data::Table, opts: &RenderOptions) -> Result<Rendered, Errors> {
    let run = || {
        check_width(opts)?;
        core_refuses(spec)?;
        render_stages(spec, table, None, true, opts)
    };
    run().map_err(budget::cap_messages)
}

fn check_width(opts: &RenderOptions) -> Result<(), Errors> {
    let w = opts.scene.width;
    if !(w.is_finite() && w > 0.0 && w <= guard::MAX_CHART_PIXELS) {
        return Err(Diagnostic::error(
            "spec.too_large",
            format!(
                "the width the page asks for, {} pixels, is not a size above 0 and at most {}",
                format::float::Plain(w),
                format::float::Plain(guard::MAX_CHART_PIXELS)
            ),
        )
        .at_path("size.width")
        .into());
    }
    Ok(())
}

/// The table the plan reads: the spec's `derive` columns (and `where`), then
/// `unpivot`, each within its budget.
pub fn prepare_table(table: data::Table, spec: &Spec) -> Result<data::Table, Errors> {
    let table = budget::apply_derives(table, spec)?;
    match &spec.unpivot {
        Some(_) if !cfg!(feature = "unpivot") => Err(needs_full_engine("unpivot", "unpivot").into()),
        Some(u) => {
            let t = data::unpivot::apply(table, u)?;
            budget::check_table(&t, "unpivot")?;
            Ok(t)
        }
        None => Ok(table),
    }
}

fn render_stages(
    spec: &Spec,
    table: data::Table,
    shapes: Option<Vec<geo::geojson::Feature>>,
    has_bytes: bool,
    opts: &RenderOptions,
) -> Result<Rendered, Errors> {
    // Budgets at each stage boundary (budget.rs): the table after reading
    // and after each derive, marks and categories after planning, the SVG.
    let table = prepare_table(table, spec)?;
    let plan = plan::build_with_shapes(spec, &table, shapes)?;
    budget::check_plan(&plan)?;
    let scene = scene::build(&plan, &opts.scene);
    let svg = svg::write(&scene);
    budget::check_output(&svg)?;
    let html_table = datatable::write(spec, &plan);
    let mut warnings = table.warnings;
    #[cfg(feature = "lint")]
    warnings.extend(lint::check(spec, Some(&plan)));
    warnings.extend(plan.warnings);
    warnings.extend(no_effect(spec));
    warnings.extend(unused_checksum(spec, has_bytes));
    Ok(Rendered { svg, table: html_table, scene, warnings })
}

/// `parts.join(sep)` for a slice of `String`s or `&str`s: one short loop
/// instead of the standard library's `join_generic_copy`, which is about
/// 1.2 KB of wasm for each element type.
pub(crate) fn join<S: AsRef<str>>(parts: &[S], sep: &str) -> String {
    let mut out = String::new();
    for (i, p) in parts.iter().enumerate() {
        if i > 0 {
            out.push_str(sep);
        }
        out.push_str(p.as_ref());
    }
    out
}

/// Keys that are read but change nothing in this spec: a warning at their
/// path, so a typo or a misunderstanding does not pass in silence.
fn no_effect(spec: &Spec) -> Vec<Diagnostic> {
    let mut out = Vec::new();
    if let Some(p) = &spec.panels {
        if p.by.is_none() && p.rows.is_none() && p.cols.is_none() {
            out.push(
                Diagnostic::warning("spec.no_effect", "`panels` names no column, so the chart is one plot")
                    .at_path("panels")
                    .with_hint("give `by` (one panel per value, wrapped) or `rows`/`cols` (a grid)"),
            );
        } else if p.columns.is_some() && p.by.is_none() {
            out.push(
                Diagnostic::warning("spec.no_effect", "`columns` wraps the panels of `by`; a `rows`/`cols` grid has one column per value of `cols`")
                    .at_path("panels.columns"),
            );
        }
    }
    out
}

/// Stage 1 from spec text: JSON syntax, the shape of every key and word,
/// and the syntax of the `derive` and `where` expressions, every problem at
/// once with its JSON path.
pub fn parse_spec(text: &str) -> Result<Spec, Errors> {
    spec::parse_spec_with(text, &expression_errors)
}

/// [`parse_spec`] for a spec already parsed as JSON.
pub fn spec_from_value(value: &serde_json::Value) -> Result<Spec, Errors> {
    spec::spec_from_value_with(value, &expression_errors)
}

/// Checks on the spec's JSON that need later modules: the bounds of
/// [`guard`] (colours, sizes, patterns, counts) and the expression syntax,
/// so that `strata check` finds them without data. (Here, so the spec stage
/// depends on neither.)
fn expression_errors(value: &serde_json::Value) -> Vec<Diagnostic> {
    let mut errors = Vec::new();
    guard::check_spec_value(value, &mut errors);
    // The core engine has no expressions: it refuses `derive` and `where`
    // (spec::needs_full), and the full engine checks their syntax.
    if !cfg!(feature = "expressions") {
        return errors;
    }
    if let Some(derive) = value.get("derive").and_then(serde_json::Value::as_object) {
        for (name, text) in derive {
            if let Some(text) = text.as_str() {
                if let Err(e) = expr::parse(text) {
                    errors.push(expr::diagnostic(&format!("derive.{}", expr::path_key(name)), text, &e));
                }
            }
        }
    }
    if let Some(text) = value.get("where").and_then(serde_json::Value::as_str) {
        if let Err(e) = expr::parse(text) {
            errors.push(expr::diagnostic("where", text, &e));
        }
    }
    errors
}

/// The whole pipeline from spec text, for data the page's Arrow add-on has
/// decoded into the column interchange (`data::interchange`): the spec's
/// `data.types` and `data.sha256` apply as they do to the Arrow bytes.
pub fn render_columns(spec_text: &str, columns: &[u8], opts: &RenderOptions) -> Result<Rendered, Errors> {
    let spec = parse_spec(spec_text.strip_prefix('\u{feff}').unwrap_or(spec_text)).map_err(budget::cap_messages)?;
    let table = data::interchange::read(columns, &read_options(&spec, Some(spec::DataFormat::Arrow), None))?;
    render_table(&spec, table, opts)
}

/// `data.sha256` checks the bytes of a file; beside inline `rows` (and no
/// file) it checks nothing, which the author should hear.
fn unused_checksum(spec: &Spec, has_bytes: bool) -> Option<Diagnostic> {
    let obj = spec.data.as_ref()?.object();
    (obj.sha256.is_some() && obj.rows.is_some() && !has_bytes).then(|| {
        Diagnostic::warning("spec.no_effect", "`sha256` checks the bytes of a data file; with inline `rows` nothing is checked")
            .at_path("data.sha256")
            .with_hint("remove `sha256`, or move the rows to a file named by `data.url`")
    })
}

/// The whole pipeline from spec text (a leading byte order mark is skipped).
pub fn render(spec_text: &str, data: Option<DataBytes>, opts: &RenderOptions) -> Result<Rendered, Errors> {
    let spec_text = spec_text.strip_prefix('\u{feff}').unwrap_or(spec_text);
    let spec = parse_spec(spec_text).map_err(budget::cap_messages)?;
    render_spec(&spec, data, opts)
}
