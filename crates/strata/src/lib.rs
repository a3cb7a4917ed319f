//! Strata: a layered grammar-of-graphics engine.
//!
//! The pipeline, one stage a module, each handing a small typed value to the
//! next:
//!
//! 1. [`spec`]  — JSON text to [`spec::Spec`]
//! 2. [`data`]  — bytes to [`data::Table`] (Arrow columns); [`expr`] derives and filters
//! 3. [`plan`]  — spec + table to [`plan::Plan`]: statistics, positions, trained scales
//! 4. [`scene`] — plan to [`scene::Scene`]: marks, axes and legends in pixels
//! 5. [`svg`]   — scene to SVG text; [`datatable`] — plan to an HTML data table
//!
//! Libraries the stages share: [`calendar`] (dates), [`stat`] (numerics), [`scale`] (mapping and
//! ticks), [`format`] (labels), [`color`], [`text`] (measurement), [`math`].

pub mod budget;
pub mod calendar;
pub mod color;
pub mod data;
pub mod datatable;
pub mod error;
pub mod expr;
pub mod format;
pub mod guard;
pub mod lint;
pub mod math;
pub mod plan;
pub mod scale;
pub mod scene;
pub mod spec;
pub mod stat;
pub mod summary;
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

/// Read the table a spec asks for: inline `rows`, or the given bytes.
pub fn load_table(spec: &Spec, data: Option<DataBytes>) -> Result<data::Table, Errors> {
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
        let mut opts = data::ReadOptions {
            format,
            types: obj.types.clone(),
            sha256: obj.sha256.clone(),
            delimiter,
            decimal_comma: obj.decimal_comma,
            ..Default::default()
        };
        if let Some(missing) = &obj.missing {
            opts.null_tokens = missing.clone();
        }
        return data::read(d.bytes, &opts);
    }
    if let Some(rows) = &obj.rows {
        return data::from_rows(rows, &obj.types);
    }
    Err(Diagnostic::error("data.missing", "the chart has no data")
        .at_path("data")
        .with_hint("give `data.url` (or the element's `src` attribute, or `--data FILE`) or inline `data.rows`")
        .into())
}

/// The whole pipeline for a parsed spec; error messages are capped in length.
pub fn render_spec(spec: &Spec, data: Option<DataBytes>, opts: &RenderOptions) -> Result<Rendered, Errors> {
    render_stages(spec, data, opts).map_err(budget::cap_messages)
}

fn render_stages(spec: &Spec, data: Option<DataBytes>, opts: &RenderOptions) -> Result<Rendered, Errors> {
    let w = opts.scene.width;
    if !(w.is_finite() && w > 0.0 && w <= guard::MAX_CHART_PIXELS) {
        return Err(Diagnostic::error(
            "spec.too_large",
            format!("the width the page asks for, {w} pixels, is not a size above 0 and at most {}", guard::MAX_CHART_PIXELS),
        )
        .at_path("size.width")
        .into());
    }
    let table = load_table(spec, data)?;
    // Budgets at each stage boundary (budget.rs): the table after reading
    // and after each derive, marks and categories after planning, the SVG.
    let table = budget::apply_derives(table, spec)?;
    let plan = plan::build(spec, &table)?;
    budget::check_plan(&plan)?;
    let scene = scene::build(spec, &plan, &opts.scene);
    let svg = svg::write(&scene);
    budget::check_output(&svg)?;
    let html_table = datatable::write(spec, &plan);
    let mut warnings = table.warnings;
    warnings.extend(lint::check(spec, Some(&plan)));
    warnings.extend(plan.warnings);
    warnings.extend(no_effect(spec));
    warnings.extend(unused_checksum(spec, data.is_some()));
    Ok(Rendered { svg, table: html_table, scene, warnings })
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
    let spec = spec::parse_spec(spec_text).map_err(budget::cap_messages)?;
    render_spec(&spec, data, opts)
}
