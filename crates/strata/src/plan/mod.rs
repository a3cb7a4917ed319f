//! Stage 3 — the plan: the spec resolved against the data. Each layer's
//! channels are pulled out of the table, its statistic and position
//! adjustment applied, and the scales trained over all layers.
//!
//! Hand-off: [`Plan`], with one [`LayerData`] per layer (rows after the
//! statistic, in data units) and trained [`Scales`]. No pixels yet.

mod arrange;
mod chart;
mod layer;
pub mod map;
mod panels;
mod scales;
mod stat;
pub mod summary;
mod values;

pub use chart::{independent_axes, Chart, PanelLayout};
pub use panels::{split as split_panels, PanelPlans, MAX_PANELS};
pub use scales::{ColorScale, Scales};
pub use values::{is_year_column, Nums, Values, YEAR_PATTERN};

pub use crate::channel::Channel;
/// The spec's typed words and options the plan hands on as they are, so the
/// scene reads them from the plan and never from the spec.
pub use crate::spec::{AngleChannel, Arrange, Coords, Geometry, Note, Placement, PointShape, ScaleSpec, Size, Style};

use crate::channel::ChannelMap;
use crate::data::Table;
use crate::error::{Diagnostic, Errors};
use crate::spec::{Layer, Spec};

/// A layer's rows after its statistic and position adjustment, keyed by
/// channel (`x`, `y`, `color`, ...; the internal channels that statistics,
/// position adjustments and panels add are listed with [`Channel`]).
/// Statistics group by the panel channels like `color` and `group`; stacks
/// and series never cross a panel.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct LayerData {
    pub len: usize,
    pub channels: ChannelMap<Values>,
    /// The column name behind each channel, for axis titles and legends.
    pub names: ChannelMap<String>,
    /// The layer's `tooltip` columns, row for row (kept by statistics that keep
    /// rows; aggregating ones show their own values instead).
    pub tooltips: Vec<(String, Values)>,
}

impl LayerData {
    pub fn get(&self, ch: Channel) -> Option<&Values> {
        self.channels.get(&ch)
    }
}

#[derive(Debug, Clone)]
pub struct PlannedLayer {
    pub index: usize,
    pub geometry: Geometry,
    pub arrange: Arrange,
    pub style: Style,
    pub data: LayerData,
    /// Bars on a continuous x: the data's resolution along x (smallest gap
    /// between distinct values, data units), which sets their width.
    pub x_step: Option<f64>,
    /// Cells on a continuous y: the data's resolution along y, their height.
    pub y_step: Option<f64>,
    /// The layer was turned for horizontal bars: its `x` holds the spec's
    /// `y` and the other way round (output names them as the spec did).
    pub turned: bool,
    /// `label_ends`: name each series at its last point.
    pub label_ends: bool,
}

#[derive(Debug, Clone)]
pub struct Plan {
    pub layers: Vec<PlannedLayer>,
    pub scales: Scales,
    pub warnings: Vec<Diagnostic>,
    /// The chart-wide options (default in a panel's own plan).
    pub chart: Chart,
    /// Small multiples: one plan per panel, each with its own rows and, for
    /// free axes, its own position scales; `None` without panels.
    pub panels: Option<PanelPlans>,
    /// The map, under `coords.kind = "map"` or with a `region` layer.
    pub map: Option<map::MapPlan>,
}

/// Resolve the spec against the table.
pub fn build(spec: &Spec, table: &Table) -> Result<Plan, Errors> {
    build_with_shapes(spec, table, None)
}

/// Whether this engine draws small multiples (`panels`): the full engine's
/// feature `panels`; the core refuses them (spec::needs_full).
const PANELS: bool = cfg!(feature = "panels");

/// [`build`] with the chart's shapes (read from `shapes` by the caller).
pub fn build_with_shapes(spec: &Spec, table: &Table, shapes: Option<Vec<crate::geo::geojson::Feature>>) -> Result<Plan, Errors> {
    let mut errors = Vec::new();
    let mut warnings = Vec::new();
    let mut layers = Vec::new();
    if let Err(e) = layer::check_panels(spec.panels.as_ref().filter(|_| PANELS), table) {
        errors.extend(e.0);
    }
    // Every layer's channels first: the orientation follows the data of all of them.
    let mut extracted = Vec::with_capacity(spec.layers.len());
    for (i, l) in spec.layers.iter().enumerate() {
        match layer::extract(i, l, table).map(|d| layer::with_panel(d, spec.panels.as_ref().filter(|_| PANELS), table)) {
            Ok(d) => extracted.push(Some(d)),
            Err(e) => {
                errors.extend(e.0);
                extracted.push(None);
            }
        }
    }
    // Categories on y with numbers on x: horizontal bars. The plan works
    // in turned terms (categories on x, values on y) and the scene draws x
    // down the page; the spec's x and y scales and notes turn with it.
    let turned = spec.coords == crate::spec::Coords::Cartesian && layer::categories_on_y(&spec.layers, &extracted);
    let turned_spec;
    let spec = if turned {
        turned_spec = layer::turn_spec(spec);
        &turned_spec
    } else {
        spec
    };
    if turned {
        for d in extracted.iter_mut().flatten() {
            layer::turn(d);
        }
    }
    // `top` on a category axis: the rest gathered into "Other" before the
    // statistics; bars without one sum what was gathered.
    let mut summed = Vec::new();
    for ch in [Channel::X, Channel::Y] {
        if let Some(n) = spec.scales.get(&ch).and_then(|s| s.top) {
            layer::gather_top(&mut extracted, ch, n as usize);
            summed.push(ch);
        }
    }
    // The layer each statistic runs as: bars under `top` without a
    // statistic sum what was gathered.
    // (Plain loops into pre-sized vectors: no iterator code per vector.)
    let mut run: Vec<Layer> = Vec::with_capacity(spec.layers.len());
    for l in &spec.layers {
        let mut l = l.clone();
        if summed.contains(&Channel::X) && l.draw == Geometry::Bar && l.stat == crate::spec::Stat::None {
            l.stat = crate::spec::Stat::Object(crate::spec::StatObject { summary: Some(crate::spec::SummaryWord::Sum), ..Default::default() });
        }
        run.push(l);
    }
    // A density over a count histogram is scaled to its counts, so the
    // histogram's statistic runs first (issue 12 item 11).
    let mut over: Vec<Option<usize>> = Vec::with_capacity(run.len());
    let mut stated: Vec<Option<Result<stat::Stated, Errors>>> = Vec::with_capacity(run.len());
    for i in 0..run.len() {
        over.push(stat::count_histogram_of(&run, i));
        stated.push(None);
    }
    for pass in 0..2 {
        for i in 0..run.len() {
            if over[i].is_some() != (pass == 1) {
                continue;
            }
            let Some(d) = extracted[i].take() else { continue };
            let on = over[i].map(|h| match &stated[h] {
                Some(Ok(s)) => stat::on_counts(h, &run[h], &s.data),
                _ => stat::OnCounts::Warn(h),
            });
            stated[i] = Some(stat::apply(i, &run[i], d, on));
        }
    }
    for (i, l) in run.iter().enumerate() {
        let Some(result) = stated[i].take() else { continue };
        match result {
            Ok(s) => {
                let n = stat::element_count(s.geometry, &s.data);
                if n > stat::MAX_ELEMENTS {
                    errors.push(stat::too_many_elements(i, s.geometry, n));
                    continue;
                }
                warnings.extend(s.warnings);
                let data = arrange::apply(i, l, s.geometry, s.data);
                let x_step = arrange::bar_step(s.geometry, &data);
                let y_step = arrange::cell_y_step(s.geometry, &data);
                layers.push(PlannedLayer {
                    index: i,
                    geometry: s.geometry,
                    arrange: l.arrange,
                    style: l.style.clone(),
                    data,
                    x_step,
                    y_step,
                    turned,
                    label_ends: l.label_ends,
                })
            }
            Err(e) => errors.extend(e.0),
        }
    }
    if !errors.is_empty() {
        return Err(Errors(errors));
    }
    if PANELS {
        panels::check_count(spec, &layers)?;
    }
    let scales = scales::train(spec, &layers)?;
    warnings.extend(scales::chosen_color_warnings(&scales));
    let map = match map::coords(spec) {
        // (Without the `maps` feature nothing of maps is reachable.)
        Some(_) if !cfg!(feature = "maps") => {
            let region = spec.layers.iter().position(|l| l.draw == Geometry::Region);
            let (path, word) = match (&spec.coords, region) {
                (Coords::Map(_), _) | (_, None) => ("coords".to_string(), "map"),
                (_, Some(i)) => (format!("layers[{i}].draw"), "region"),
            };
            return Err(crate::needs_full_engine(&path, word).into());
        }
        Some(m) => Some(map::resolve(spec, &m, shapes, &layers, &mut warnings)?),
        None => None,
    };
    let mut chart = Chart::of(spec);
    chart.transposed = turned;
    let mut plan = Plan { layers, scales, warnings, chart, panels: None, map };
    plan.panels = if PANELS { panels::split(spec, &plan) } else { None };
    if plan.chart.description.is_none() {
        plan.chart.description = Some(summary::describe(&plan));
    }
    Ok(plan)
}
