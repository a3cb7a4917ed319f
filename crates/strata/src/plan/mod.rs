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

use crate::data::Table;
use crate::error::{Diagnostic, Errors};
use crate::spec::Spec;
use indexmap::IndexMap;

/// A layer's rows after its statistic and position adjustment, keyed by
/// channel (`x`, `y`, `color`, ...; the internal channels that statistics,
/// position adjustments and panels add are listed with [`Channel`]).
/// Statistics group by the panel channels like `color` and `group`; stacks
/// and series never cross a panel.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct LayerData {
    pub len: usize,
    pub channels: IndexMap<Channel, Values>,
    /// The column name behind each channel, for axis titles and legends.
    pub names: IndexMap<Channel, String>,
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

/// [`build`] with the chart's shapes (read from `shapes` by the caller).
pub fn build_with_shapes(spec: &Spec, table: &Table, shapes: Option<Vec<crate::geo::geojson::Feature>>) -> Result<Plan, Errors> {
    let mut errors = Vec::new();
    let mut warnings = Vec::new();
    let mut layers = Vec::new();
    if let Err(e) = layer::check_panels(spec.panels.as_ref(), table) {
        errors.extend(e.0);
    }
    for (i, l) in spec.layers.iter().enumerate() {
        match layer::extract(i, l, table).map(|d| layer::with_panel(d, spec.panels.as_ref(), table)).and_then(|d| stat::apply(i, l, d)) {
            Ok(s) => {
                let n = stat::element_count(s.geometry, &s.data);
                if n > stat::MAX_ELEMENTS {
                    errors.push(stat::too_many_elements(i, s.geometry, n));
                    continue;
                }
                warnings.extend(s.warnings);
                let data = arrange::apply(i, l, s.geometry, s.data);
                layers.push(PlannedLayer { index: i, geometry: s.geometry, arrange: l.arrange, style: l.style.clone(), data })
            }
            Err(e) => errors.extend(e.0),
        }
    }
    if !errors.is_empty() {
        return Err(Errors(errors));
    }
    panels::check_count(spec, &layers)?;
    let scales = scales::train(spec, &layers)?;
    let map = match map::coords(spec) {
        // (Without the `maps` feature nothing of maps is reachable.)
        Some(_) if !cfg!(feature = "maps") => {
            let region = spec.layers.iter().position(|l| l.draw == Geometry::Region);
            let path = match (&spec.coords, region) {
                (Coords::Map(_), _) | (_, None) => "coords".to_string(),
                (_, Some(i)) => format!("layers[{i}].draw"),
            };
            return Err(crate::no_maps(&path).into());
        }
        Some(m) => Some(map::resolve(spec, &m, shapes, &layers, &mut warnings)?),
        None => None,
    };
    let mut plan = Plan { layers, scales, warnings, chart: Chart::of(spec), panels: None, map };
    plan.panels = panels::split(spec, &plan);
    if plan.chart.description.is_none() {
        plan.chart.description = Some(summary::describe(&plan));
    }
    Ok(plan)
}
