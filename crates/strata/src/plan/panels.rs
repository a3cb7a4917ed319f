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
//! `panels.free` the x and/or y scale of each panel is trained again on its
//! own rows. A panel with no rows, or whose rows alone cannot make a scale
//! (a log axis with nothing above zero), keeps the shared scale.

use super::scales::retrain_positions;
use super::{LayerData, Plan};
use crate::spec::{FreeAxes, Spec};

/// The plans of a chart's panels.
#[derive(Debug, Clone)]
pub enum PanelPlans {
    /// `panels.by`: (key, plan) per panel.
    Wrap(Vec<(String, Plan)>),
    /// `panels.rows`/`cols`: the row and column values (`None` when the
    /// spec gives no `rows` or no `cols`: one row or one column) and the
    /// plan of each cell, row by row: `cells[r * columns + c]`.
    Grid { rows: Option<Vec<String>>, cols: Option<Vec<String>>, cells: Vec<Plan> },
}

/// Which position scales each panel trains on its own rows.
pub fn free_axes(spec: &Spec) -> (bool, bool) {
    match spec.panels.as_ref().and_then(|p| p.free) {
        Some(FreeAxes::X) => (true, false),
        Some(FreeAxes::Y) => (false, true),
        Some(FreeAxes::Both) => (true, true),
        None => (false, false),
    }
}

/// Distinct values of a channel over every layer, in order of first appearance.
fn values_of(plan: &Plan, channel: &str) -> Vec<String> {
    let mut keys: Vec<String> = Vec::new();
    for l in &plan.layers {
        if let Some(v) = l.data.get(channel) {
            for i in 0..l.data.len {
                if let Some(k) = v.key(i) {
                    if !keys.contains(&k) {
                        keys.push(k);
                    }
                }
            }
        }
    }
    keys
}

/// The plan with, in each layer that has them, only the rows whose panel
/// channels hold the wanted values; free scales trained on those rows.
fn subset(plan: &Plan, wanted: &[(&str, &str)], free: (bool, bool)) -> Plan {
    let mut p = plan.clone();
    for l in &mut p.layers {
        let cols: Vec<_> = wanted.iter().filter_map(|(c, k)| l.data.get(c).map(|v| (v, *k))).collect();
        if cols.is_empty() {
            continue;
        }
        let rows: Vec<usize> = (0..l.data.len).filter(|i| cols.iter().all(|(v, k)| v.key(*i).as_deref() == Some(*k))).collect();
        l.data = take_rows(&l.data, &rows);
    }
    if (free.0 || free.1) && p.layers.iter().any(|l| l.data.len > 0) {
        let mut scales = p.scales.clone();
        if retrain_positions(&p.layers, &mut scales, free.0, free.1).is_ok() {
            p.scales = scales;
        }
    }
    p
}

fn take_rows(data: &LayerData, rows: &[usize]) -> LayerData {
    LayerData {
        len: rows.len(),
        channels: data.channels.iter().map(|(c, vals)| (*c, vals.take(rows))).collect(),
        names: data.names.clone(),
        tips: data.tips.iter().map(|(c, vals)| (c.clone(), vals.take(rows))).collect(),
    }
}

/// Split the plan by `spec.panels`; `None` without panels, or when no row
/// has a panel value (the chart is then one plot).
pub fn split(spec: &Spec, plan: &Plan) -> Option<PanelPlans> {
    let p = spec.panels.as_ref()?;
    let free = free_axes(spec);
    if p.by.is_some() {
        let keys = values_of(plan, "panel");
        if keys.is_empty() {
            return None;
        }
        return Some(PanelPlans::Wrap(keys.into_iter().map(|k| {
            let sub = subset(plan, &[("panel", &k)], free);
            (k, sub)
        }).collect()));
    }
    let rows = p.rows.as_ref().map(|_| values_of(plan, "panel_row"));
    let cols = p.cols.as_ref().map(|_| values_of(plan, "panel_col"));
    let (n_rows, n_cols) = (rows.as_ref().map_or(1, Vec::len), cols.as_ref().map_or(1, Vec::len));
    if rows.is_none() && cols.is_none() || n_rows == 0 || n_cols == 0 {
        return None;
    }
    let mut cells = Vec::with_capacity(n_rows * n_cols);
    for r in 0..n_rows {
        for c in 0..n_cols {
            let mut wanted = Vec::new();
            if let Some(rows) = &rows {
                wanted.push(("panel_row", rows[r].as_str()));
            }
            if let Some(cols) = &cols {
                wanted.push(("panel_col", cols[c].as_str()));
            }
            cells.push(subset(plan, &wanted, free));
        }
    }
    Some(PanelPlans::Grid { rows, cols, cells })
}
