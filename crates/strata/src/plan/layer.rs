//! Pull a layer's channels out of the table.

use super::{LayerData, Values};
use crate::channel::Channel;
use crate::data::Column;
use crate::data::Table;
use crate::error::{Diagnostic, Errors};
use crate::spec::{ColumnType, Geometry, IndependentAxes, Layer, Panels, Spec};

pub fn extract(index: usize, layer: &Layer, table: &Table) -> Result<LayerData, Errors> {
    let names = table.names();
    let mut out = LayerData { len: table.num_rows(), ..Default::default() };
    let mut errors = Vec::new();
    for (ch, channel) in layer.channels() {
        let Some(pos) = names.iter().position(|n| *n == channel.column) else {
            errors.push(unknown_column(&channel.column, names, format!("layers[{index}].{ch}")));
            continue;
        };
        let values = to_values(table.column(pos), channel.as_type);
        // `as: date` on numbers: whole years become 1 January of that year;
        // other numbers have no calendar reading, so they are refused, not ignored.
        if channel.as_type == Some(ColumnType::Date) && matches!(values, Values::Num(_)) {
            errors.push(
                Diagnostic::error("spec.not_a_date", format!("column `{}` holds numbers that are not years, so it cannot be read as a date", channel.column))
                    .at_path(format!("layers[{index}].{ch}.as"))
                    .with_hint("only whole numbers from 1000 to 2999 read as years; write dates as text (`2024-03-31`) or drop `as`"),
            );
            continue;
        }
        out.channels.insert(ch, values);
        out.names.insert(ch, channel.column.clone());
    }
    for (j, col) in layer.tooltip.iter().enumerate() {
        match names.iter().position(|n| n == col) {
            Some(pos) => out.tooltips.push((col.clone(), to_values(table.column(pos), None))),
            None => errors.push(unknown_column(col, names, format!("layers[{index}].tooltip[{j}]"))),
        }
    }
    if errors.is_empty() {
        Ok(out)
    } else {
        Err(Errors(errors))
    }
}

/// Check `panels` against the table once (not once per layer): its columns
/// are there, and it asks for one layout, a wrap (`by`) or a grid
/// (`rows`/`cols`), not both.
pub fn check_panels(panels: Option<&Panels>, table: &Table) -> Result<(), Errors> {
    let Some(p) = panels else { return Ok(()) };
    let mut errors = Vec::new();
    if p.by.is_some() && (p.rows.is_some() || p.cols.is_some()) {
        errors.push(
            Diagnostic::error("spec.panels_two_layouts", "`panels` has both `by` and `rows`/`cols`")
                .at_path("panels")
                .with_hint("give `by` (with `columns`) for one wrapped row of panels per value, or `rows`/`cols` for a grid, not both"),
        );
    }
    let names = table.names();
    for (column, path) in [(&p.by, "panels.by"), (&p.rows, "panels.rows"), (&p.cols, "panels.cols")] {
        if let Some(c) = column {
            if !names.iter().any(|n| n == c) {
                errors.push(unknown_column(c, names, path.into()));
            }
        }
    }
    if errors.is_empty() {
        Ok(())
    } else {
        Err(Errors(errors))
    }
}

/// Add the panel channels: `panel`, the key of each row's panel, from
/// `panels.by`; or `panel_row` and `panel_col`, the row's values of
/// `panels.rows` and `panels.cols`, which together name its cell of a grid.
/// Statistics group by all three, so a cell's rows are summarised alone.
/// A column that is not there is left out here: [`check_panels`] says so.
pub fn with_panel(mut data: LayerData, panels: Option<&Panels>, table: &Table) -> LayerData {
    let Some(p) = panels else { return data };
    let wanted: [(Channel, Option<&String>); 3] = match &p.by {
        Some(by) => [(Channel::Panel, Some(by)), (Channel::PanelRow, None), (Channel::PanelCol, None)],
        None => [(Channel::Panel, None), (Channel::PanelRow, p.rows.as_ref()), (Channel::PanelCol, p.cols.as_ref())],
    };
    let names = table.names();
    for (channel, column) in wanted {
        let Some(pos) = column.and_then(|c| names.iter().position(|n| n == c)) else { continue };
        data.channels.insert(channel, to_values(table.column(pos), Some(ColumnType::Text)));
        data.names.insert(channel, names[pos].clone());
    }
    data
}

/// Convert a table column to layer values, honouring an `as` override.
pub fn to_values(col: &Column, as_type: Option<ColumnType>) -> Values {
    // Plain loops into vectors of their final size: no iterator chain
    // instantiated per conversion.
    let base = match col {
        // Numbers are shared with the table, not copied.
        Column::Float(v) => Values::Num(v.clone()),
        Column::Int(v) => {
            let mut out = Vec::with_capacity(v.values.len());
            match &v.valid {
                None => {
                    for x in &v.values {
                        out.push(*x as f64);
                    }
                }
                Some(_) => {
                    for x in v.iter() {
                        out.push(x.map_or(f64::NAN, |x| x as f64));
                    }
                }
            }
            Values::Num(out.into())
        }
        Column::Date(v) => Values::Time(scaled(v, 86_400_000.0)),
        Column::DateTime(v) => Values::Time(v.clone()),
        Column::Bool(v) => {
            let mut out = Vec::with_capacity(v.len());
            for b in v.iter() {
                out.push(b.map(|b| b.to_string()));
            }
            Values::Text(out)
        }
        Column::Text(v) => {
            let mut out = Vec::with_capacity(v.len());
            for t in v.iter() {
                out.push(t.map(str::to_string));
            }
            Values::Text(out)
        }
    };
    match (as_type, base) {
        (Some(ColumnType::Text), v @ (Values::Num(_) | Values::Time(_))) => {
            let time = matches!(v, Values::Time(_));
            let mut out = Vec::with_capacity(v.len());
            for i in 0..v.len() {
                out.push(match (time, v.num(i)) {
                    (_, None) => None,
                    (true, Some(ms)) => Some(crate::format::date_label(ms)),
                    (false, Some(x)) if x.fract() == 0.0 && x.abs() < 1e15 => Some(format!("{}", x as i64)),
                    (false, Some(x)) => Some(crate::format::float::plain(x)),
                });
            }
            Values::Text(out)
        }
        // Whole years read as dates: 1 January of the year, UTC.
        (Some(ColumnType::Date), Values::Num(v)) if v.iter().flatten().all(|y| y.fract() == 0.0 && (1000.0..=2999.0).contains(&y)) => {
            let mut out = Vec::with_capacity(v.len());
            for y in v.iter() {
                out.push(y.map_or(f64::NAN, |y| crate::calendar::days_from_civil(y as i64, 1, 1) as f64 * 86_400_000.0));
            }
            Values::Time(out.into())
        }
        (_, v) => v,
    }
}

/// Every number times `k`, a missing one (any non-finite) as NaN.
fn scaled(v: &crate::data::Nums, k: f64) -> crate::data::Nums {
    let mut out = Vec::with_capacity(v.len());
    for &x in v.raw() {
        out.push(if x.is_finite() { x * k } else { f64::NAN });
    }
    out.into()
}

/// Whether the chart's bars (or boxes) have categories on y and numbers
/// (or nothing) on x: then the orientation follows the data and the bars
/// lie across, in reading order from top to bottom.
pub fn categories_on_y(layers: &[Layer], data: &[Option<LayerData>]) -> bool {
    layers.iter().zip(data).any(|(l, d)| {
        let Some(d) = d else { return false };
        matches!(l.draw, Geometry::Bar | Geometry::Box)
            && matches!(d.get(Channel::Y), Some(Values::Text(_)))
            && !matches!(d.get(Channel::X), Some(Values::Text(_)))
    })
}

/// The position channel pairs that trade places when a chart turns.
const TURNED: [(Channel, Channel); 2] = [(Channel::X, Channel::Y), (Channel::XEnd, Channel::YEnd)];

/// Swap a layer's x and y channels (and their ends) for a turned chart.
pub fn turn(d: &mut LayerData) {
    for (a, b) in TURNED {
        // `swap_remove` (smaller than `shift_remove`): the keys are sorted below.
        let (va, vb) = (d.channels.swap_remove(&a), d.channels.swap_remove(&b));
        let (na, nb) = (d.names.swap_remove(&a), d.names.swap_remove(&b));
        if let Some(v) = vb {
            d.channels.insert(a, v);
        }
        if let Some(v) = va {
            d.channels.insert(b, v);
        }
        if let Some(n) = nb {
            d.names.insert(a, n);
        }
        if let Some(n) = na {
            d.names.insert(b, n);
        }
    }
    d.channels.sort_keys();
    d.names.sort_keys();
}

/// The spec as a turned chart sees it: the x and y scales, the notes'
/// positions and free panel axes trade places.
pub fn turn_spec(spec: &Spec) -> Spec {
    let mut s = spec.clone();
    // The scales renamed in place (no removal code for the spec's map type:
    // nothing reads the turned spec's scales in order, only by channel).
    let scales = std::mem::take(&mut s.scales);
    for (k, v) in scales {
        let k = match k {
            Channel::X => Channel::Y,
            Channel::Y => Channel::X,
            other => other,
        };
        s.scales.insert(k, v);
    }
    for n in &mut s.notes {
        std::mem::swap(&mut n.x, &mut n.y);
        std::mem::swap(&mut n.x_end, &mut n.y_end);
    }
    if let Some(p) = &mut s.panels {
        p.independent = p.independent.map(|i| match i {
            IndependentAxes::X => IndependentAxes::Y,
            IndependentAxes::Y => IndependentAxes::X,
            other => other,
        });
    }
    s
}

/// The category that gathers the categories past a scale's `top`.
pub const OTHER: &str = "Other";

/// `top` on a category axis: keep the `n` categories with the largest
/// totals of `y` over every layer (row counts where `y` holds no numbers),
/// and relabel the rest "Other", before the statistics, so that a count or
/// a summary of "Other" covers all of their rows. Ties keep the data's order.
pub fn gather_top(data: &mut [Option<LayerData>], ch: Channel, n: usize) {
    // Totals in order of first appearance; `index` finds a category's
    // place in `names` (the engine's one hash index).
    let (mut index, mut names) = (crate::index::Places::new(), Vec::new());
    let mut totals: Vec<f64> = Vec::new();
    for d in data.iter().flatten() {
        let Some(Values::Text(cats)) = d.get(ch) else { continue };
        let value_ch = if ch == Channel::X { Channel::Y } else { Channel::X };
        let ys = d.get(value_ch).filter(|v| !v.is_discrete());
        for (i, c) in cats.iter().enumerate() {
            let Some(c) = c else { continue };
            let add = match ys {
                Some(v) => v.num(i).unwrap_or(0.0),
                None => 1.0,
            };
            let at = index.push(&mut names, c);
            if at == totals.len() {
                totals.push(0.0);
            }
            totals[at] += add;
        }
    }
    if totals.len() <= n {
        return;
    }
    let ranked = crate::sort::order(totals.len(), &mut |a, b| totals[b].total_cmp(&totals[a]).then(a.cmp(&b)));
    let mut keep = vec![false; totals.len()];
    for &i in ranked.iter().take(n) {
        keep[i] = true;
    }
    for d in data.iter_mut().flatten() {
        if let Some(Values::Text(cats)) = d.channels.get_mut(&ch) {
            for c in cats.iter_mut().flatten() {
                if !index.get(&names, c).is_some_and(|j| keep[j]) {
                    *c = OTHER.to_string();
                }
            }
        }
    }
}

/// "There is no column `c`", at `path`, with a did-you-mean and the columns.
fn unknown_column(col: &str, names: &[String], path: String) -> Diagnostic {
    let d = Diagnostic::error("spec.unknown_column", format!("there is no column `{col}` in the data")).at_path(path);
    match crate::spec::closest(col, names.iter().map(String::as_str)) {
        Some(s) => d.with_hint(format!("did you mean `{s}`? The columns are: {}", crate::join(names, ", "))),
        None => d.with_hint(format!("the columns are: {}", crate::join(names, ", "))),
    }
}

#[cfg(all(test, feature = "arrow"))]
mod tests {
    use super::*;
    use arrow_array::{ArrayRef, Float64Array};
    use std::sync::Arc;

    #[test]
    fn null_free_arrow_numbers_reach_the_plan_without_a_copy() {
        let a = Arc::new(Float64Array::from(vec![1.0, f64::NAN, f64::INFINITY, 4.0]));
        let col: ArrayRef = a.clone();
        let col = crate::data::arrow::column(&col).unwrap();
        let Values::Num(n) = to_values(&col, None) else { panic!("not numbers") };
        assert_eq!(n.raw().as_ptr(), a.values().as_ptr());
        assert_eq!(n.iter().collect::<Vec<_>>(), vec![Some(1.0), None, None, Some(4.0)]);
    }
}
