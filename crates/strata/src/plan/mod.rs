//! Stage 3 — the plan: the spec resolved against the data. Each layer's
//! channels are pulled out of the table, its statistic and position
//! adjustment applied, and the scales trained over all layers.
//!
//! Hand-off: [`Plan`], with one [`LayerData`] per layer (rows after the
//! statistic, in data units) and trained [`Scales`]. No pixels yet.

mod arrange;
mod layer;
mod panels;
mod scales;
mod stat;
mod values;

pub use panels::{free_axes, split as split_panels, PanelPlans, MAX_PANELS};
pub use scales::{ColorScale, Scales};
pub use values::{Nums, Values};

use crate::data::Table;
use crate::error::{Diagnostic, Errors};
use crate::spec::{Arrange, Geometry, Spec, Style};
use indexmap::IndexMap;

/// A layer's rows after its statistic and position adjustment, keyed by
/// channel (`x`, `y`, `color`, ...).
///
/// Internal channels added by statistics and position adjustments:
/// - `y_base`: where a bar's or area's extent starts (0, or the top of the
///   mark below it when stacked).
/// - `x_end`: a histogram bin's right edge (`x` is its left edge); tiles'
///   right edges. `y_end`: the upper end of a range, ribbon, tile or box
///   whisker (`y` is then the lower end).
/// - `y_low`, `y_high`: an interval around `y` (a summary's `interval`, a
///   linear fit's confidence band), drawn as error bars on points and bars
///   and as a band under a fitted line. `estimate`: the summary value on a
///   `range`/`rule` layer whose `y`/`y_end` hold the interval.
/// - `count` (rows behind a bin, tile or box), `bin_start`/`bin_end` (bin
///   edges when `x` is the bin middle), `bandwidth` (density), `fitted`
///   (ribbon from a fit), `part` (`box` or `outlier`), `q1`, `median`, `q3`
///   (box plots).
/// - `x_offset`: jitter or dodge within a band, as a fraction of the band
///   (discrete x only; continuous x is moved in data units).
/// - `panel`: the panel key (`panels.by`); `panel_row`, `panel_col`: the
///   row's values of `panels.rows` and `panels.cols`, naming its grid cell.
///   Statistics group by them like `color` and `group`; stacks and series
///   never cross a panel.
/// Internal channels that only help drawing (where an extent starts, an
/// offset in a band): left out of a mark's datum and of the data table.
pub const DRAWING_AIDS: [&str; 2] = ["y_base", "x_offset"];

#[derive(Debug, Clone, PartialEq, Default)]
pub struct LayerData {
    pub len: usize,
    pub channels: IndexMap<&'static str, Values>,
    /// The column name behind each channel, for axis titles and legends.
    pub names: IndexMap<&'static str, String>,
    /// The layer's `tip` columns, row for row (kept by statistics that keep
    /// rows; aggregating ones show their own values instead).
    pub tips: Vec<(String, Values)>,
}

impl LayerData {
    pub fn get(&self, ch: &str) -> Option<&Values> {
        self.channels.get(ch)
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
}

/// The internal channels that place a row in a panel: stacks, series and
/// statistics never cross them.
pub const PANEL_CHANNELS: [&str; 3] = ["panel", "panel_row", "panel_col"];

/// Resolve the spec against the table.
pub fn build(spec: &Spec, table: &Table) -> Result<Plan, Errors> {
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
    Ok(Plan { layers, scales, warnings })
}
