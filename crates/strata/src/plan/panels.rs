//! Small multiples: the plan split into one plan per panel.
//!
//! - `panels.by`: one panel per value of the `panel` channel, in order of
//!   first appearance (the scene wraps them into rows).
//! - `panels.rows` / `panels.cols`: a grid with one row per value of
//!   `panel_row` and one column per value of `panel_col` (each in order of
//!   first appearance). Every combination gets its cell, so a combination
//!   with no rows is an empty panel and the grid stays aligned.
//!
//! Each panel keeps, in every layer, the rows of its panel (a layer
//! without panel channels is drawn whole in every panel). Scales stay the
//! ones trained over every panel, so panels compare at a glance; with
//! `panels.independent` the x and/or y scale of each panel is trained again on its
//! own rows. A panel with no rows, or whose rows alone cannot make a scale
//! (a log axis with nothing above zero), keeps the shared scale.

use super::chart::independent_axes;
use super::scales::retrain_positions;
use super::{LayerData, Plan, PlannedLayer};
use crate::channel::Channel;
use crate::error::{Diagnostic, Errors};
use crate::spec::Spec;

/// More panels than this is a mistake (a column of many distinct values
/// given as `by`, `rows` or `cols`): each would be a few pixels wide.
pub const MAX_PANELS: usize = 400;

/// The plans of a chart's panels.
#[derive(Debug, Clone)]
pub enum PanelPlans {
    /// `panels.by`: each panel's key and plan.
    Wrap { names: Vec<String>, cells: Vec<Plan> },
    /// `panels.rows`/`cols`: the row and column values (`None` when the
    /// spec gives no `rows` or no `cols`: one row or one column) and the
    /// plan of each cell, row by row: `cells[r * columns + c]`.
    Grid { rows: Option<Vec<String>>, cols: Option<Vec<String>>, cells: Vec<Plan> },
}

/// Distinct values in order of first appearance, each one's place found by
/// hash ([`crate::index::Places`], the engine's one hash index).
#[derive(Default)]
struct Distinct {
    list: Vec<String>,
    place: crate::index::Places,
}

impl Distinct {
    fn insert(&mut self, k: String) {
        self.place.push(&mut self.list, &k);
    }
    fn len(&self) -> usize {
        self.list.len()
    }
    fn is_empty(&self) -> bool {
        self.list.is_empty()
    }
    fn get_index_of(&self, k: &str) -> Option<usize> {
        self.place.get(&self.list, k)
    }
}

/// Distinct values of a channel over every layer, in order of first appearance.
fn values_of(layers: &[PlannedLayer], channel: Channel) -> Distinct {
    let mut keys = Distinct::default();
    for l in layers {
        if let Some(v) = l.data.get(channel) {
            for i in 0..l.data.len {
                if let Some(k) = v.key(i) {
                    keys.insert(k);
                }
            }
        }
    }
    keys
}

/// The panel values, or `None` without panels: (by, rows, cols).
type Values3 = (Option<Distinct>, Option<Distinct>, Option<Distinct>);

fn panel_values(spec: &Spec, layers: &[PlannedLayer]) -> Option<Values3> {
    let p = spec.panels.as_ref()?;
    if p.by.is_some() {
        return Some((Some(values_of(layers, Channel::Panel)), None, None));
    }
    Some((None, p.rows.as_ref().map(|_| values_of(layers, Channel::PanelRow)), p.cols.as_ref().map(|_| values_of(layers, Channel::PanelCol))))
}

/// An error when the panels would be too many to draw.
pub fn check_count(spec: &Spec, layers: &[PlannedLayer]) -> Result<(), Errors> {
    let Some((by, rows, cols)) = panel_values(spec, layers) else { return Ok(()) };
    let (n, path) = match by {
        Some(by) => (by.len(), "panels.by"),
        None => (rows.map_or(1, |r| r.len()).saturating_mul(cols.map_or(1, |c| c.len())), "panels"),
    };
    if n <= MAX_PANELS {
        return Ok(());
    }
    Err(Diagnostic::error("plan.too_many_panels", format!("the panels would be {n}, more than the {MAX_PANELS} a chart can show"))
        .at_path(path)
        .with_hint("make panels by a column with few distinct values, or filter the rows with `where`")
        .into())
}

/// Split the plan by `spec.panels`; `None` without panels, or when no row
/// has a panel value (the chart is then one plot).
pub fn split(spec: &Spec, plan: &Plan) -> Option<PanelPlans> {
    let (by, rows, cols) = panel_values(spec, &plan.layers)?;
    let independent = independent_axes(spec);
    if let Some(keys) = by {
        if keys.is_empty() {
            return None;
        }
        let cells = cut(plan, &[(Channel::Panel, &keys)], independent);
        return Some(PanelPlans::Wrap { names: keys.list, cells });
    }
    let (n_rows, n_cols) = (rows.as_ref().map_or(1, Distinct::len), cols.as_ref().map_or(1, Distinct::len));
    if rows.is_none() && cols.is_none() || n_rows == 0 || n_cols == 0 {
        return None;
    }
    let mut by_channel = Vec::new();
    if let Some(r) = &rows {
        by_channel.push((Channel::PanelRow, r));
    }
    if let Some(c) = &cols {
        by_channel.push((Channel::PanelCol, c));
    }
    let cells = cut(plan, &by_channel, independent);
    Some(PanelPlans::Grid { rows: rows.map(|s| s.list), cols: cols.map(|s| s.list), cells })
}

/// One plan per cell of the grid the channels span (the first channel's
/// values vary slowest). Each row goes to its cell in one pass.
fn cut(plan: &Plan, channels: &[(Channel, &Distinct)], independent: (bool, bool)) -> Vec<Plan> {
    let mut n = 1;
    for (_, v) in channels {
        n *= v.len();
    }
    let mut layers: Vec<Vec<PlannedLayer>> = Vec::with_capacity(n);
    for _ in 0..n {
        layers.push(Vec::with_capacity(plan.layers.len()));
    }
    for l in &plan.layers {
        let mut cols = Vec::with_capacity(channels.len());
        for (c, values) in channels {
            if let Some(v) = l.data.get(*c) {
                cols.push((v, *values));
            }
        }
        if cols.len() < channels.len() {
            // A layer without its panel channels is drawn in every panel.
            for cell in &mut layers {
                cell.push(l.clone());
            }
            continue;
        }
        let mut rows: Vec<Vec<usize>> = vec![Vec::new(); n];
        'row: for i in 0..l.data.len {
            let mut cell = 0;
            for (v, values) in &cols {
                let Some(k) = v.key(i) else { continue 'row };
                let Some(at) = values.get_index_of(&k) else { continue 'row };
                cell = cell * values.len() + at;
            }
            rows[cell].push(i);
        }
        for (cell, rows) in layers.iter_mut().zip(&rows) {
            cell.push(PlannedLayer {
                index: l.index,
                geometry: l.geometry,
                arrange: l.arrange,
                style: l.style.clone(),
                data: take_rows(&l.data, rows),
                x_step: l.x_step,
                y_step: l.y_step,
                turned: l.turned,
                label_ends: l.label_ends,
            });
        }
    }
    let mut plans = Vec::with_capacity(layers.len());
    for layers in layers {
        let mut scales = plan.scales.clone();
        if (independent.0 || independent.1) && layers.iter().any(|l| l.data.len > 0) {
            let mut own = scales.clone();
            if retrain_positions(&layers, &mut own, independent.0, independent.1).is_ok() {
                scales = own;
            }
        }
        // A panel's plan: its rows and scales; the chart-wide options stay on the whole plan.
        let map = plan.map.as_ref().map(|m| m.for_layers(&layers));
        plans.push(Plan { layers, scales, warnings: plan.warnings.clone(), chart: Default::default(), panels: None, map });
    }
    plans
}

fn take_rows(data: &LayerData, rows: &[usize]) -> LayerData {
    let mut channels = crate::channel::ChannelMap::new();
    for (c, vals) in &data.channels {
        channels.insert(*c, vals.take(rows));
    }
    let mut tooltips = Vec::with_capacity(data.tooltips.len());
    for (c, vals) in &data.tooltips {
        tooltips.push((c.clone(), vals.take(rows)));
    }
    LayerData { len: rows.len(), channels, names: data.names.clone(), tooltips }
}
