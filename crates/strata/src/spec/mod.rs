//! Stage 1 — the spec: typed values of the chart vocabulary
//! (`shared/design/spec-language.md`) and parsing with located errors.
//!
//! Hand-off: [`Spec`], a typed, validated description of the chart. Nothing in
//! here looks at data.

#[macro_use]
mod vocab;
pub mod defaults;
mod full;
mod parse;
mod read;
pub mod shape;
mod suggest;

pub use full::{needs_full, needs_full_value};
pub use parse::{parse_spec_with, spec_from_value_with, ExtraCheck};

/// A part of a spec (a layer, a scale...) from JSON text, unchecked: for tests.
#[cfg(test)]
pub(crate) fn from_json<T: read::Read>(text: &str) -> Result<T, String> {
    T::read(&crate::json::from_str(text).map_err(|e| e.to_string())?)
}
pub use suggest::{closest, edit_distance, levenshtein};

/// The JSON Schema of a spec as pretty-printed text (what `strata schema`
/// prints and `schema/strata-spec.schema.json` holds).
pub fn schema_text() -> String {
    serde_json::to_string_pretty(&shape::json_schema()).expect("schema serialises")
}
pub use vocab::*;

use crate::channel::Channel;
use indexmap::IndexMap;
use serde::Serialize;

/// A whole chart spec.
#[derive(Debug, Clone, Default, Serialize)]
#[serde(deny_unknown_fields)]
pub struct Spec {
    /// The JSON Schema this spec follows, for editors; not used in drawing.
    #[serde(default, rename = "$schema", skip_serializing_if = "Option::is_none")]
    pub schema: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub title: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub subtitle: Option<String>,
    /// Source line under the chart ("Source: ...").
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub source: Option<String>,
    /// Author-written text alternative; replaces the automatic summary.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub description: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub data: Option<DataRef>,
    /// GeoJSON shapes for `region` layers and maps.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub shapes: Option<Shapes>,
    /// New columns from SQL-subset expressions, evaluated in order.
    #[serde(default, skip_serializing_if = "Pairs::is_empty")]
    pub derive: Pairs<String>,
    /// SQL-subset boolean expression that keeps rows.
    #[serde(default, rename = "where", skip_serializing_if = "Option::is_none")]
    pub where_: Option<String>,
    pub layers: Vec<Layer>,
    /// Scales keyed by channel name (`x`, `y`, `color`, ...).
    #[serde(default, skip_serializing_if = "IndexMap::is_empty")]
    pub scales: IndexMap<Channel, ScaleSpec>,
    #[serde(default)]
    pub coords: Coords,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub panels: Option<Panels>,
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub notes: Vec<Note>,
    #[serde(default)]
    pub size: Size,
    #[serde(default)]
    pub theme: Theme,
    /// Lint warnings silenced on purpose, by code (`lint.log_bars`, ...).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub quiet: Vec<String>,
    /// BCP 47 language tag for number and date labels (`en`, `de`, `fr`, `es`, `pl`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub locale: Option<LocaleWord>,
    /// The data table under the chart (see `crate::datatable`).
    #[serde(default, skip_serializing_if = "is_closed")]
    pub data_table: DataTable,
    /// Wide columns into long rows, after `derive` and `where`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub unpivot: Option<Unpivot>,
}

/// `unpivot`: each listed column becomes a row per input row, its name in
/// the first `into` column and its value in the second; other columns are
/// repeated. The names column keeps the listed order as its category order.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct Unpivot {
    pub columns: Vec<String>,
    /// The names column and the values column.
    pub into: Vec<String>,
}

/// Keyed values in the spec's order (`derive`, a scale's `values`): the
/// keys of one JSON object, so each key once. A list, not a hash map: these
/// are short and looked up rarely (a map type's insert code was most of
/// what reading them took in the page's engine).
#[derive(Debug, Clone, PartialEq)]
pub struct Pairs<T>(Vec<(String, T)>);

impl<T> Default for Pairs<T> {
    fn default() -> Self {
        Pairs(Vec::new())
    }
}

impl<T> Pairs<T> {
    pub fn len(&self) -> usize {
        self.0.len()
    }
    pub fn is_empty(&self) -> bool {
        self.0.is_empty()
    }
    /// The keys and values, in the spec's order.
    pub fn iter(&self) -> PairsIter<'_, T> {
        self.into_iter()
    }
    pub fn keys(&self) -> impl Iterator<Item = &String> {
        self.0.iter().map(|(k, _)| k)
    }
    /// The value of `key`, if the spec gives one.
    pub fn get(&self, key: &str) -> Option<&T> {
        self.0.iter().find(|(k, _)| k == key).map(|(_, v)| v)
    }
    /// Take `key` out, keeping the others' order.
    pub fn shift_remove(&mut self, key: &str) -> Option<T> {
        let i = self.0.iter().position(|(k, _)| k == key)?;
        Some(self.0.remove(i).1)
    }
    /// Set `key` to `value`: in its place when it is there, else last.
    pub fn insert(&mut self, key: String, value: T) {
        match self.0.iter_mut().find(|(k, _)| *k == key) {
            Some(slot) => slot.1 = value,
            None => self.0.push((key, value)),
        }
    }
}

impl<T> FromIterator<(String, T)> for Pairs<T> {
    /// Later values of a key replace earlier ones in its first place, as
    /// in a JSON object.
    fn from_iter<I: IntoIterator<Item = (String, T)>>(items: I) -> Self {
        let mut out = Pairs(Vec::new());
        for (k, v) in items {
            out.insert(k, v);
        }
        out
    }
}

pub type PairsIter<'a, T> = std::iter::Map<std::slice::Iter<'a, (String, T)>, fn(&'a (String, T)) -> (&'a String, &'a T)>;

impl<'a, T> IntoIterator for &'a Pairs<T> {
    type Item = (&'a String, &'a T);
    type IntoIter = PairsIter<'a, T>;
    fn into_iter(self) -> Self::IntoIter {
        self.0.iter().map(|(k, v)| (k, v))
    }
}

impl<T: Serialize> Serialize for Pairs<T> {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.collect_map(self.iter())
    }
}

fn is_closed(t: &DataTable) -> bool {
    *t == DataTable::Closed
}

// ---------------------------------------------------------------- data

/// `data`: a URL string or an object.
#[derive(Debug, Clone, Serialize)]
#[serde(untagged)]
pub enum DataRef {
    Url(String),
    Object(DataObject),
}

#[derive(Debug, Clone, Default, Serialize)]
#[serde(deny_unknown_fields)]
pub struct DataObject {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub url: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub format: Option<DataFormat>,
    /// Per-column type overrides.
    #[serde(default, skip_serializing_if = "Pairs::is_empty")]
    pub types: Pairs<ColumnType>,
    /// Hex SHA-256 of the data bytes; a mismatch refuses the data.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub sha256: Option<String>,
    /// Inline records for small tables.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub rows: Option<Vec<serde_json::Map<String, serde_json::Value>>>,
    /// Field delimiter of delimited text: `,`, `;`, a tab or `|`; absent:
    /// sniffed from the first lines unless the format says TSV.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub delimiter: Option<String>,
    /// Numbers with a decimal comma (`1,5`), as in many semicolon files.
    #[serde(default, skip_serializing_if = "std::ops::Not::not")]
    pub decimal_comma: bool,
    /// Cells read as missing values; absent: empty, `NA`, `N/A`, `null`, `NULL`, `-`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub missing: Option<Vec<String>>,
}

impl DataRef {
    pub fn object(&self) -> DataObject {
        match self {
            DataRef::Url(u) => DataObject { url: Some(u.clone()), ..Default::default() },
            DataRef::Object(o) => o.clone(),
        }
    }
}

/// `shapes`: a GeoJSON (RFC 7946) source, by `url` or inline `features`.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct Shapes {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub url: Option<String>,
    /// Inline GeoJSON features.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub features: Option<Vec<serde_json::Value>>,
    /// The feature property that names each shape.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub key: Option<String>,
    /// Hex SHA-256 of the shapes' bytes; a mismatch refuses them.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub sha256: Option<String>,
}

// ---------------------------------------------------------------- layers

#[derive(Debug, Clone, Serialize)]
#[serde(deny_unknown_fields)]
pub struct Layer {
    pub draw: Geometry,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub x: Option<Mapping>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub y: Option<Mapping>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub x_end: Option<Mapping>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub y_end: Option<Mapping>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub color: Option<Mapping>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub size: Option<Mapping>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub shape: Option<Mapping>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub opacity: Option<Mapping>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub text: Option<Mapping>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub group: Option<Mapping>,
    /// A `region` layer's column matching `shapes.key`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub key: Option<Mapping>,
    /// Columns shown on hover or focus.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub tooltip: Vec<String>,
    #[serde(default)]
    pub style: Style,
    #[serde(default)]
    pub stat: Stat,
    #[serde(default)]
    pub arrange: Arrange,
    /// Line and area layers: name each series at its last point instead of in a legend.
    #[serde(default, skip_serializing_if = "std::ops::Not::not")]
    pub label_ends: bool,
}

/// What a channel maps to: a column name, or `{ "column": "c", "as": "date" }`.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Mapping {
    pub column: String,
    #[serde(default, rename = "as", skip_serializing_if = "Option::is_none")]
    pub as_type: Option<ColumnType>,
}

/// Constant styling of a layer; never data-driven.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct Style {
    /// CSS colour for marks.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub color: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub opacity: Option<f64>,
    /// Stroke width in pixels for lines and outlines.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub width: Option<f64>,
    /// Point radius in pixels.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub radius: Option<f64>,
    /// Dash pattern in pixels, such as `[4, 2]`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub dash: Option<Vec<f64>>,
    /// Share of its slot a bar or box fills (0..1).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub share: Option<f64>,
    /// Shape of points: `circle`, `square`, `triangle`, `diamond`, `plus`, `cross`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub shape: Option<PointShape>,
    /// Text size of labels in pixels.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub font_size: Option<f64>,
    /// Draw every point even when a scatter is crowded enough to be binned
    /// into cells.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub every_point: Option<bool>,
}

/// The statistic of a layer.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(untagged)]
pub enum Stat {
    /// Rows as they are.
    #[default]
    None,
    Count,
    Box,
    Object(StatObject),
}

/// Object form of a statistic: exactly one of `bin`, `summary`, `fit`,
/// `density`, `window`, with its options beside it.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct StatObject {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub bin: Option<BinSpec>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub summary: Option<SummaryWord>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub interval: Option<IntervalWord>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub fit: Option<FitWord>,
    /// Confidence level of a fit's band, such as 0.95.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub band: Option<f64>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub density: Option<DensitySpec>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub window: Option<WindowSpec>,
    /// The probability of a `quantile` summary (0..1).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub p: Option<f64>,
    /// LOESS: the fraction of the points in each local fit (0..1].
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub span: Option<f64>,
    /// LOESS: local polynomial degree, 1 or 2.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub degree: Option<u32>,
    /// LOESS: `true` (3 robustness iterations) or a number of iterations.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub robust: Option<Robust>,
}

/// `density` options: `bandwidth` is `"scott"` (default), `"silverman"` or a
/// number in data units; `grid` is the number of points evaluated.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct DensitySpec {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub bandwidth: Option<Bandwidth>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub grid: Option<u32>,
}

/// LOESS robustness: `true` (the default number of iterations), `false`, or
/// a number of iterations.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(untagged)]
pub enum Robust {
    Flag(bool),
    Iterations(u64),
}

/// A density's bandwidth: a rule, or a width in data units.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(untagged)]
pub enum Bandwidth {
    Rule(BandwidthRule),
    Width(f64),
}

/// `window` options: `summary` is `"mean"` (default), `"sum"` or
/// `"running_total"`; `rows` the window length; `align` `"center"` (default)
/// or `"trailing"`.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct WindowSpec {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub summary: Option<WindowSummary>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub rows: Option<u32>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub align: Option<WindowAlign>,
}

#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct BinSpec {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub rule: Option<BinRule>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub width: Option<f64>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub count: Option<u32>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub boundary: Option<f64>,
    /// Calendar unit for dates: `day`, `week`, `month`, `quarter`, `year`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub unit: Option<BinUnit>,
    /// Bar heights as a density (count / (n · width)) instead of counts.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub density: Option<bool>,
}

// ---------------------------------------------------------------- scales

#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct ScaleSpec {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub kind: Option<ScaleKind>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub domain: Option<Vec<serde_json::Value>>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub zero: Option<bool>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub nice: Option<bool>,
    #[serde(default, skip_serializing_if = "std::ops::Not::not")]
    pub reverse: bool,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub title: Option<String>,
    /// LDML number or date pattern for labels.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub format: Option<String>,
    /// Wanted number of ticks, or the tick values themselves.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub ticks: Option<Ticks>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub palette: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub axis: Option<Placement>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub legend: Option<Placement>,
    #[serde(default, skip_serializing_if = "std::ops::Not::not")]
    pub hide: bool,
    /// Base of a log scale (default 10).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub base: Option<f64>,
    /// Class breaks of a `steps` colour scale: a method or the numbers.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub breaks: Option<Breaks>,
    /// Number of classes of a `steps` colour scale (default 5).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub count: Option<u32>,
    /// Where a diverging colour palette turns (data units).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub middle: Option<f64>,
    /// Chosen colours of a category colour scale, by category; `other`
    /// colours every category not named.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub values: Option<Pairs<String>>,
    /// Categories sorted by the value drawn for them.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub order: Option<CategoryOrder>,
    /// Keep the first `top` categories (after `order`); the rest are
    /// gathered into one category, "Other".
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub top: Option<u32>,
    /// The unit of a value axis, written once above it.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub unit: Option<String>,
}

/// `ticks`: a wanted count, or the values to mark (numbers, dates as text,
/// or categories).
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(untagged)]
pub enum Ticks {
    Count(u32),
    Values(Vec<serde_json::Value>),
}

impl Ticks {
    /// The wanted count, `None` for chosen values.
    pub fn count(&self) -> Option<u32> {
        match self {
            Ticks::Count(n) => Some(*n),
            Ticks::Values(_) => None,
        }
    }
}

/// `breaks`: `natural`, `quantile`, `equal`, or a list of numbers.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(untagged)]
pub enum Breaks {
    Method(BreakMethod),
    List(Vec<f64>),
}

// ---------------------------------------------------------------- coords, panels, notes, size, theme

#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(untagged)]
pub enum Coords {
    #[default]
    Cartesian,
    Polar(Polar),
    Map(MapCoords),
}

/// `coords: {"kind": "map", ...}`: x is longitude and y latitude (WGS 84 degrees).
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct MapCoords {
    pub kind: MapKind,
    #[serde(default = "default_projection")]
    pub projection: ProjectionWord,
    /// [longitude, latitude] of the map's centre.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub center: Option<[f64; 2]>,
    /// The sphere's turn before projecting, degrees: a number (λ) or a
    /// list [λ, φ, γ] of one to three angles (`geo::Rotation`).
    #[serde(default, skip_serializing_if = "serde_json::Value::is_null")]
    pub rotate: serde_json::Value,
    /// Standard parallels of the conic projections.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub parallels: Option<[f64; 2]>,
    #[serde(default = "default_fit")]
    pub fit: MapFit,
    /// Graticule step in degrees, or `false`.
    #[serde(default = "default_graticule")]
    pub graticule: serde_json::Value,
    /// Draw the outline of the sphere.
    #[serde(default = "default_true")]
    pub outline: bool,
}

impl Default for MapCoords {
    fn default() -> Self {
        MapCoords {
            kind: MapKind::Map,
            projection: default_projection(),
            center: None,
            rotate: serde_json::Value::Null,
            parallels: None,
            fit: default_fit(),
            graticule: default_graticule(),
            outline: default_true(),
        }
    }
}

impl MapCoords {
    /// The graticule step in degrees, `None` for `false`.
    pub fn graticule_step(&self) -> Option<f64> {
        self.graticule.as_f64()
    }

    /// `rotate` as [λ, φ, γ] degrees (a number is λ; missing angles are 0);
    /// `None` for a list of no angle or more than three.
    pub fn rotation(&self) -> Option<[f64; 3]> {
        let mut r = [0.0; 3];
        match &self.rotate {
            serde_json::Value::Null => {}
            serde_json::Value::Array(a) if (1..=3).contains(&a.len()) => {
                for (o, v) in r.iter_mut().zip(a) {
                    *o = v.as_f64().filter(|x| x.is_finite())?;
                }
            }
            v => r[0] = v.as_f64().filter(|x| x.is_finite())?,
        }
        Some(r)
    }
}

fn default_projection() -> ProjectionWord {
    ProjectionWord::EqualEarth
}
fn default_fit() -> MapFit {
    MapFit::Shapes
}
fn default_graticule() -> serde_json::Value {
    serde_json::Value::Bool(false)
}
fn default_true() -> bool {
    true
}

#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct Polar {
    pub kind: PolarKind,
    /// Which position channel becomes the angle.
    #[serde(default = "default_angle")]
    pub angle: AngleChannel,
    /// Start angle in degrees clockwise from 12 o'clock.
    #[serde(default)]
    pub start: f64,
    /// Inner radius as a fraction of the outer one.
    #[serde(default)]
    pub inner: f64,
}

#[cfg(feature = "full")]
fn default_angle() -> AngleChannel {
    AngleChannel::X
}

#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct Panels {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub by: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub columns: Option<u32>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub rows: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub cols: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub independent: Option<IndependentAxes>,
}

/// An annotation at data positions: text, a shaded span, or a reference line.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct Note {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub x: Option<serde_json::Value>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub y: Option<serde_json::Value>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub x_end: Option<serde_json::Value>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub y_end: Option<serde_json::Value>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub text: Option<String>,
    /// A leader line from the text to its point when the text had to move.
    #[serde(default, skip_serializing_if = "std::ops::Not::not")]
    pub pointer: bool,
}

#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct Size {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub width: Option<f64>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub height: Option<f64>,
    /// Width divided by height.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub aspect: Option<f64>,
}

#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(untagged)]
pub enum Theme {
    #[default]
    Auto,
    Light,
    Dark,
    Custom(ThemeOverrides),
}

/// Theme overrides: any CSS colour; absent keys keep the base theme's value.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
#[serde(deny_unknown_fields)]
pub struct ThemeOverrides {
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub base: Option<ThemeBase>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub background: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub text: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub muted: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub grid: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub axis: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mark: Option<String>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub font_size: Option<f64>,
}

impl Layer {
    /// The layer's channels that are set, by name, in a fixed order.
    pub fn channels(&self) -> Vec<(Channel, &Mapping)> {
        let all: [(Channel, &Option<Mapping>); 11] = [
            (Channel::X, &self.x),
            (Channel::Y, &self.y),
            (Channel::XEnd, &self.x_end),
            (Channel::YEnd, &self.y_end),
            (Channel::Color, &self.color),
            (Channel::Size, &self.size),
            (Channel::Shape, &self.shape),
            (Channel::Opacity, &self.opacity),
            (Channel::Text, &self.text),
            (Channel::Group, &self.group),
            (Channel::Key, &self.key),
        ];
        all.into_iter().filter_map(|(n, c)| c.as_ref().map(|c| (n, c))).collect()
    }
}
