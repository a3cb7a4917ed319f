//! What the scene needs from the spec besides layers and scales: the
//! chart's words, size, theme, coordinates, notes and panel layout, read
//! once here so that the scene reads only the plan.

use crate::color::Palette;
use crate::spec::{Coords, IndependentAxes, Note, Size, Spec, Theme, ThemeBase};

/// The chart-wide options of a plan.
#[derive(Debug, Clone, PartialEq)]
pub struct Chart {
    pub title: Option<String>,
    pub subtitle: Option<String>,
    /// The source line under the chart.
    pub source: Option<String>,
    /// The text alternative: the spec's `description`, else the summary the
    /// plan writes (`plan::summary`); `None` only in a panel's own plan.
    pub description: Option<String>,
    pub size: Size,
    /// The theme's colours, and the classes the SVG root carries for them.
    pub palette: Palette,
    pub theme_classes: String,
    /// The theme's `font_size` for tick labels when it sets a sensible one
    /// (4 to 72 px); the scene sizes every other text in proportion.
    pub font_size: Option<f64>,
    pub coords: Coords,
    /// The x scale runs down the page and y across (horizontal bars): set by
    /// `plan::build` when bars have categories on y and numbers on x
    /// (`coords: "flip"` is retired: the orientation follows the data).
    pub transposed: bool,
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
    pub independent: (bool, bool),
}

impl Chart {
    pub fn of(spec: &Spec) -> Chart {
        let (palette, theme_classes) = palette(&spec.theme);
        Chart {
            title: spec.title.clone(),
            subtitle: spec.subtitle.clone(),
            source: spec.source.clone(),
            description: spec.description.clone(),
            size: spec.size.clone(),
            palette,
            theme_classes,
            font_size: match &spec.theme {
                Theme::Custom(o) => o.font_size.filter(|s| s.is_finite() && (4.0..=72.0).contains(s)),
                _ => None,
            },
            coords: spec.coords.clone(),
            transposed: false,
            notes: spec.notes.clone(),
            panels: PanelLayout {
                columns: spec.panels.as_ref().and_then(|p| p.columns),
                rows_name: spec.panels.as_ref().and_then(|p| p.rows.clone()).unwrap_or_default(),
                cols_name: spec.panels.as_ref().and_then(|p| p.cols.clone()).unwrap_or_default(),
                independent: independent_axes(spec),
            },
        }
    }
}

impl Default for Chart {
    /// The options of a panel's own plan: nothing chart-wide.
    fn default() -> Chart {
        Chart {
            title: None,
            subtitle: None,
            source: None,
            description: None,
            size: Size::default(),
            palette: Palette::light(),
            theme_classes: String::new(),
            font_size: None,
            coords: Coords::default(),
            transposed: false,
            notes: Vec::new(),
            panels: PanelLayout::default(),
        }
    }
}

/// The theme's colours and the classes the SVG root carries for the
/// stylesheet (`www/strata-theme.css`): `strata-light`, `strata-dark` or
/// `strata-auto`, plus `strata-own-<slot>` for each colour the chart sets,
/// which the stylesheet then leaves alone.
pub fn palette(theme: &Theme) -> (Palette, String) {
    match theme {
        Theme::Dark => (Palette::dark(), "strata-dark".into()),
        Theme::Light => (Palette::light(), "strata-light".into()),
        Theme::Auto => (Palette::light(), "strata-auto".into()),
        Theme::Custom(o) => {
            let dark = o.base == Some(ThemeBase::Dark);
            let mut p = if dark { Palette::dark() } else { Palette::light() };
            let mut classes = vec![match o.base {
                Some(ThemeBase::Dark) => "strata-dark",
                Some(ThemeBase::Light) => "strata-light",
                None => "strata-auto",
            }
            .to_string()];
            let mut set = |slot: &mut String, v: &Option<String>, name: &str| {
                if let Some(v) = v {
                    *slot = v.clone();
                    classes.push(format!("strata-own-{name}"));
                }
            };
            set(&mut p.background, &o.background, "background");
            set(&mut p.text, &o.text, "text");
            set(&mut p.muted, &o.muted, "muted");
            set(&mut p.grid, &o.grid, "grid");
            set(&mut p.axis, &o.axis, "axis");
            set(&mut p.mark, &o.mark, "mark");
            (p, crate::join(&classes, " "))
        }
    }
}

/// Which position scales each panel trains on its own rows: (x, y).
pub fn independent_axes(spec: &Spec) -> (bool, bool) {
    match spec.panels.as_ref().and_then(|p| p.independent) {
        Some(IndependentAxes::X) => (true, false),
        Some(IndependentAxes::Y) => (false, true),
        Some(IndependentAxes::Both) => (true, true),
        None => (false, false),
    }
}
