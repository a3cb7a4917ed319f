//! What the scene needs from the spec besides layers and scales: the
//! chart's words, size, theme, coordinates, notes and panel layout, read
//! once here so that the scene reads only the plan.

use crate::spec::{Coords, FreeAxes, Note, Size, Spec, Theme};

/// The chart-wide options of a plan.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Chart {
    pub title: Option<String>,
    pub subtitle: Option<String>,
    /// The source line under the chart.
    pub source: Option<String>,
    /// The text alternative: the spec's `description`, else the summary the
    /// plan writes (`plan::summary`); `None` only in a panel's own plan.
    pub description: Option<String>,
    pub size: Size,
    pub theme: Theme,
    pub coords: Coords,
    pub notes: Vec<Note>,
    pub panels: PanelLayout,
}

/// How small multiples are laid out.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct PanelLayout {
    /// `panels.columns`: panels across when wrapping `by`.
    pub columns: Option<u32>,
    /// The columns behind `panels.rows` and `panels.cols`, naming the grid's strips.
    pub rows_name: String,
    pub cols_name: String,
    /// Which position scales each panel trains on its own rows: (x, y).
    pub free: (bool, bool),
}

impl Chart {
    pub fn of(spec: &Spec) -> Chart {
        Chart {
            title: spec.title.clone(),
            subtitle: spec.subtitle.clone(),
            source: spec.source.clone(),
            description: spec.description.clone(),
            size: spec.size.clone(),
            theme: spec.theme.clone(),
            coords: spec.coords.clone(),
            notes: spec.notes.clone(),
            panels: PanelLayout {
                columns: spec.panels.as_ref().and_then(|p| p.columns),
                rows_name: spec.panels.as_ref().and_then(|p| p.rows.clone()).unwrap_or_default(),
                cols_name: spec.panels.as_ref().and_then(|p| p.cols.clone()).unwrap_or_default(),
                free: free_axes(spec),
            },
        }
    }
}

/// Which position scales each panel trains on its own rows: (x, y).
pub fn free_axes(spec: &Spec) -> (bool, bool) {
    match spec.panels.as_ref().and_then(|p| p.free) {
        Some(FreeAxes::X) => (true, false),
        Some(FreeAxes::Y) => (false, true),
        Some(FreeAxes::Both) => (true, true),
        None => (false, false),
    }
}
