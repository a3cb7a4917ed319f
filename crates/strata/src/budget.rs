//! Whole-chart budgets, checked at the boundaries between stages so that a
//! chart too big to draw is refused as soon as it is known, at little cost:
//! the table's bytes after reading and after each derived column (a derive
//! that doubles a text column 24 times once grew past 4 GB), the marks over
//! all layers and the categories of each scale once the plan is built (100k
//! layers once gave a 393 MB SVG, the mark cap being per layer), and the
//! size of the SVG written. Each refusal is a located `budget.*` error.
//!
//! Bounds on the spec itself (colours, sizes, patterns, layer counts) are in
//! [`crate::guard`].

use crate::data::{Column, Table};
use crate::error::{Diagnostic, Errors};
use crate::plan::{ColorScale, Plan};
use crate::scale::PositionScale;
use crate::spec::Spec;

/// The most memory a table may take, after reading or deriving.
pub const MAX_TABLE_BYTES: usize = 256 << 20;
/// The longest text in one cell: a 100 MB cell once took 1.6 GB to draw.
pub const MAX_CELL_BYTES: usize = 1 << 20;
/// The most marks (rows after the statistics) over all layers.
pub const MAX_MARKS: usize = 1_000_000;
/// The most categories on a position scale, and on a colour or shape scale.
pub const MAX_POSITION_CATEGORIES: usize = 20_000;
pub const MAX_LEGEND_CATEGORIES: usize = 1_000;
/// The largest SVG a chart may write.
pub const MAX_SVG_BYTES: usize = 64 << 20;

/// The table within [`MAX_TABLE_BYTES`]; `path` says which step made it.
pub fn check_table(table: &Table, path: &str) -> Result<(), Errors> {
    let bytes = table_bytes(table);
    if bytes > MAX_TABLE_BYTES {
        return Err(Diagnostic::error(
            "budget.table",
            format!("the table takes {} MB, more than the {} MB a chart may use", bytes >> 20, MAX_TABLE_BYTES >> 20),
        )
        .at_path(path)
        .with_hint("keep only the rows and columns the chart needs (`where`), or shorten long texts")
        .into());
    }
    if let Some((column, row, len)) = longest_cell(table) {
        if len > MAX_CELL_BYTES {
            return Err(Diagnostic::error(
                "budget.cell",
                format!("column `{column}` has a text of {} KB in row {}, more than the {} KB a cell may hold", len >> 10, row + 1, MAX_CELL_BYTES >> 10),
            )
            .at_path(path)
            .with_hint("shorten the text, or leave the column out of the data")
            .into());
        }
    }
    Ok(())
}

/// The longest text cell: its column, row (0-based) and length in bytes.
/// Text is dictionary-coded, so each distinct value is measured once.
fn longest_cell(table: &Table) -> Option<(String, usize, usize)> {
    let mut best: Option<(String, usize, usize)> = None;
    for (name, col) in table.names().iter().zip(table.columns()) {
        let Column::Text(t) = col else { continue };
        let Some((code, len)) = (0..t.dict_len() as u32).map(|c| (c, t.value(c).len())).max_by_key(|&(_, len)| len) else { continue };
        if best.as_ref().is_none_or(|b| len > b.2) {
            let row = t.codes().iter().position(|&c| c == code).unwrap_or(0);
            best = Some((name.clone(), row, len));
        }
    }
    best
}

/// Memory held by a table's columns.
pub fn table_bytes(table: &Table) -> usize {
    table
        .columns()
        .iter()
        .map(|c| match c {
            Column::Int(v) => v.values.len() * 8 + v.valid.as_ref().map_or(0, Vec::len),
            Column::Float(v) | Column::Date(v) | Column::DateTime(v) => v.len() * 8,
            Column::Bool(v) => v.len(),
            Column::Text(t) => t.len() * 4 + (0..t.dict_len() as u32).map(|c| t.value(c).len() + 4).sum::<usize>(),
        })
        .sum()
}

/// `derive` one column at a time, then `where`, checking the table after
/// each step: a derive that would blow the budget stops the next one from
/// running. Each derived column may use the ones before, as in one
/// [`crate::expr::apply`].
pub fn apply_derives(mut table: Table, spec: &Spec) -> Result<Table, Errors> {
    check_table(&table, "data")?;
    if !cfg!(feature = "expressions") {
        // The core engine: no expressions (refused earlier by spec::needs_full).
        return match crate::spec::needs_full(spec) {
            Some((path, word)) if path == "derive" || path == "where" => Err(crate::needs_full_engine(&path, word).into()),
            _ => Ok(table),
        };
    }
    for (name, text) in &spec.derive {
        let one: crate::spec::Pairs<String> = [(name.clone(), text.clone())].into_iter().collect();
        table = crate::expr::apply(table, &one, None)?;
        check_table(&table, &format!("derive.{}", crate::expr::path_key(name)))?;
    }
    if spec.where_.is_some() {
        table = crate::expr::apply(table, &Default::default(), spec.where_.as_deref())?;
    }
    Ok(table)
}

/// Marks over all layers, and categories per scale, within their budgets.
pub fn check_plan(plan: &Plan) -> Result<(), Errors> {
    let marks: usize = plan.layers.iter().map(|l| l.data.len).sum();
    if marks > MAX_MARKS {
        return Err(Diagnostic::error("budget.marks", format!("the layers draw {marks} marks in all, more than the {MAX_MARKS} a chart may draw"))
            .at_path("layers")
            .with_hint("summarise with a statistic (count, bin, summary), filter with `where`, or use fewer layers")
            .into());
    }
    let mut errors = Vec::new();
    for (axis, s) in [("x", &plan.scales.x), ("y", &plan.scales.y)] {
        if let PositionScale::Category { values, .. } = s {
            if values.len() > MAX_POSITION_CATEGORIES {
                errors.push(too_many(&format!("scales.{axis}"), values.len(), MAX_POSITION_CATEGORIES));
            }
        }
    }
    if let Some(ColorScale::Categories(c)) = &plan.scales.color {
        if c.len() > MAX_LEGEND_CATEGORIES {
            errors.push(too_many("scales.color", c.len(), MAX_LEGEND_CATEGORIES));
        }
    }
    if let Some(s) = &plan.scales.shape {
        if s.len() > MAX_LEGEND_CATEGORIES {
            errors.push(too_many("scales.shape", s.len(), MAX_LEGEND_CATEGORIES));
        }
    }
    if errors.is_empty() {
        Ok(())
    } else {
        Err(Errors(errors))
    }
}

fn too_many(path: &str, n: usize, max: usize) -> Diagnostic {
    Diagnostic::error("budget.categories", format!("this scale has {n} categories, more than the {max} a chart can show"))
        .at_path(path)
        .with_hint("map a column with fewer distinct values, group rare values in a `derive`, or filter with `where`")
}

/// The SVG within [`MAX_SVG_BYTES`].
pub fn check_output(svg: &str) -> Result<(), Errors> {
    if svg.len() > MAX_SVG_BYTES {
        return Err(Diagnostic::error(
            "budget.output",
            format!("the chart's SVG would be {} MB, more than the {} MB allowed", svg.len() >> 20, MAX_SVG_BYTES >> 20),
        )
        .at_path("layers")
        .with_hint("draw fewer marks: summarise or filter the data")
        .into());
    }
    Ok(())
}

/// The most characters of a message or hint, and the most errors, reported.
pub const MAX_MESSAGE_CHARS: usize = 2_000;
pub const MAX_ERRORS: usize = 100;

/// Errors cut to a readable size: a column list from a million-column
/// header once made a 30 MB message.
pub fn cap_messages(mut e: Errors) -> Errors {
    let n = e.0.len();
    e.0.truncate(MAX_ERRORS);
    for d in &mut e.0 {
        d.message = cap_chars(&d.message);
        d.hint = d.hint.as_deref().map(cap_chars);
    }
    if n > MAX_ERRORS {
        e.0.push(Diagnostic::error("budget.errors", format!("... and {} more errors", n - MAX_ERRORS)));
    }
    e
}

fn cap_chars(s: &str) -> String {
    match s.char_indices().nth(MAX_MESSAGE_CHARS) {
        Some((i, _)) => format!("{}... ({} characters more)", &s[..i], s[i..].chars().count()),
        None => s.to_string(),
    }
}
