//! The shape of a spec, described once and used twice: to check a JSON value
//! and report every problem at once (with its path and a did-you-mean), and
//! to write the JSON Schema (draft 2020-12) that `strata schema` prints.
//!
//! The serde types in `mod.rs` read a value after this check passed; a test
//! (and the fuzz target) holds that every value this check accepts also
//! reads with serde.

use super::suggest::closest;
use super::vocab::*;
use crate::error::Diagnostic;
use serde_json::{json, Map, Value};

/// What a JSON value must look like.
#[derive(Debug, Clone, Copy)]
pub enum Shape {
    /// Any JSON value.
    Any,
    /// Any string; `what` names it in messages ("a CSS colour").
    Text(&'static str),
    /// One of a fixed set of words.
    Word(&'static [&'static str]),
    Number {
        min: Option<f64>,
        max: Option<f64>,
    },
    Integer {
        min: i64,
        max: i64,
    },
    Bool,
    List(&'static Shape),
    /// A list of exactly two items of one shape (`[longitude, latitude]`).
    Pair(&'static Shape),
    /// An object with free keys (or keys from `keys`), each value of one shape.
    Map {
        keys: Option<&'static [&'static str]>,
        value: &'static Shape,
    },
    Object(Obj),
    /// Alternatives told apart by the JSON type of the value.
    Either(&'static [Shape]),
    /// A named shape from [`defs`], written once in the schema's `$defs`.
    Def(&'static str),
}

#[derive(Debug, Clone, Copy)]
pub struct Obj {
    pub fields: &'static [Field],
    /// Exactly one of these keys must be present.
    pub exactly_one_of: &'static [&'static str],
}

#[derive(Debug, Clone, Copy)]
pub struct Field {
    pub name: &'static str,
    pub shape: Shape,
    pub required: bool,
    pub doc: &'static str,
}

/// A field's description is for the JSON Schema only (`strata schema`):
/// builds with the `schema` feature keep it; the page's engine, which writes
/// no schema, leaves the optional fields' out (about 2.5 KB gzip). Required
/// fields ([`req`]) keep theirs everywhere: `spec.missing_key` quotes it.
#[cfg(feature = "schema")]
macro_rules! doc {
    ($d:expr) => {
        $d
    };
}
#[cfg(not(feature = "schema"))]
macro_rules! doc {
    ($d:expr) => {
        ""
    };
}
/// An optional field.
macro_rules! f {
    ($name:expr, $shape:expr, $doc:expr $(,)?) => {
        Field { name: $name, shape: $shape, required: false, doc: doc!($doc) }
    };
}
const fn req(name: &'static str, shape: Shape, doc: &'static str) -> Field {
    Field { name, shape, required: true, doc }
}
const fn obj(fields: &'static [Field]) -> Shape {
    Shape::Object(Obj { fields, exactly_one_of: &[] })
}
const fn text() -> Shape {
    Shape::Text("text")
}
const fn num(min: Option<f64>, max: Option<f64>) -> Shape {
    Shape::Number { min, max }
}
const fn count(min: i64) -> Shape {
    Shape::Integer { min, max: u32::MAX as i64 }
}
const fn list(s: &'static Shape) -> Shape {
    Shape::List(s)
}

// ---------------------------------------------------------------- vocabulary

// Each word list is its enum's (see `vocab.rs`): serde, this check, the
// schema and the plan share one definition.
pub const GEOMETRIES: &[&str] = Geometry::WORDS;
/// The channels a layer maps (the keys of `scales`): the first eleven of
/// [`crate::channel::Channel`] (a test holds the two equal).
pub const CHANNELS: &[&str] = &["x", "y", "x_end", "y_end", "color", "size", "shape", "opacity", "text", "group", "key"];
pub const COLUMN_TYPES: &[&str] = ColumnType::WORDS;
pub const DATA_FORMATS: &[&str] = DataFormat::WORDS;
pub const STAT_WORDS: &[&str] = StatWord::WORDS;
pub const SUMMARIES: &[&str] = SummaryWord::WORDS;
pub const INTERVALS: &[&str] = IntervalWord::WORDS;
pub const FITS: &[&str] = FitWord::WORDS;
pub const BIN_RULES: &[&str] = BinRule::WORDS;
pub const BIN_UNITS: &[&str] = BinUnit::WORDS;
pub const WINDOW_SUMMARIES: &[&str] = WindowSummary::WORDS;
pub const LOCALES: &[&str] = LocaleWord::WORDS;
pub const BANDWIDTHS: &[&str] = BandwidthRule::WORDS;
pub const WINDOW_ALIGN: &[&str] = WindowAlign::WORDS;
pub const ARRANGES: &[&str] = Arrange::WORDS;
pub const SCALE_KINDS: &[&str] = ScaleKind::WORDS;
pub const PLACEMENTS: &[&str] = Placement::WORDS;
pub const COORD_WORDS: &[&str] = CoordWord::WORDS;
pub const INDEPENDENT: &[&str] = IndependentAxes::WORDS;
pub const THEME_WORDS: &[&str] = ThemeWord::WORDS;
pub const DATA_TABLE: &[&str] = DataTable::WORDS;
pub const POINT_SHAPES: &[&str] = PointShape::WORDS;
/// Lint codes that `quiet` may silence: the spec names them, the lint
/// stage (which reads the spec) raises them.
pub const LINT_CODES: &[&str] =
    &["lint.axis_without_zero", "lint.log_bars", "lint.too_many_colors", "lint.polar_angle_not_cyclic", "lint.low_contrast", "lint.layers_look_alike"];

/// Words and keys the spec once used, with the word that replaced each:
/// an old word gets a hint naming the new one even when edit distance
/// would not find it. A hint is given only where the new word is one of
/// the words accepted at that place (`band` is still a statistic's key).
pub const RETIRED: &[(&str, &str)] =
    &[("identity", "none"), ("ribbon", "band"), ("band", "share"), ("tile", "cell"), ("rule", "segment"), ("free", "independent"), ("tip", "tooltip")];

/// The hint for an unknown `word` where `accepted` are the words allowed.
fn retired_hint(word: &str, accepted: &[&str]) -> Option<String> {
    if word == "flip" && accepted.contains(&"cartesian") {
        return Some(
            "`flip` is retired: orientation is to follow the data, and it does: categories on y give horizontal bars; write `cartesian` or leave `coords` out"
                .into(),
        );
    }
    RETIRED.iter().find(|(old, new)| *old == word && accepted.contains(new)).map(|(old, new)| format!("`{old}` is now called `{new}`: did you mean `{new}`?"))
}

/// Named shapes, written once under `$defs` in the schema.
pub fn defs() -> &'static [(&'static str, Shape, &'static str)] {
    static DEFS: &[(&str, Shape, &str)] = &[
        (
            "channel",
            Shape::Either(&[
                Shape::Text("a column name"),
                obj(&[
                    req("column", Shape::Text("a column name"), "The column that feeds this channel."),
                    f!("as", Shape::Word(COLUMN_TYPES), "Read the column as this type for this channel only."),
                ]),
            ]),
            "A column name, or {\"column\": ..., \"as\": ...} to read it as another type.",
        ),
        ("position", Shape::Either(&[num(None, None), Shape::Text("a category or date")]), "A data value: a number, a category, or a date as text."),
        ("color", Shape::Text("a CSS colour"), "A CSS Color Level 4 colour, such as \"#3c7ebe\" or \"rgb(60 126 190)\"."),
    ];
    DEFS
}

fn def_shape(name: &str) -> &'static Shape {
    defs().iter().find(|(n, _, _)| *n == name).map(|(_, s, _)| s).expect("known def")
}

const fn channel() -> Shape {
    Shape::Def("channel")
}
const fn position() -> Shape {
    Shape::Def("position")
}
const fn color() -> Shape {
    Shape::Def("color")
}

/// The shape of a whole spec: static data (code that built it at each
/// check was 11 KB of the page's engine); a copy of the root, whose parts
/// are references into the table.
pub fn spec_shape() -> Shape {
    const DATA: Shape = Shape::Either(&[
        Shape::Text("a data URL"),
        obj(&[
            f!("url", Shape::Text("a URL"), "Where to fetch the data, relative to the page (or the spec file for the command line)."),
            f!(
                "format",
                Shape::Word(DATA_FORMATS),
                "csv, tsv, arrow (IPC file or stream) or json (an array of records). Default: from the URL's extension, then from the bytes.",
            ),
            f!("types", Shape::Map { keys: None, value: &Shape::Word(COLUMN_TYPES) }, "Per-column type overrides: number, text, date, bool."),
            f!("sha256", Shape::Text("a hex SHA-256 digest"), "Hex SHA-256 of the data bytes; data whose digest differs is refused."),
            f!("rows", list(&Shape::Map { keys: None, value: &Shape::Any }), "Inline records, for small tables."),
            f!(
                "delimiter",
                Shape::Word(&[",", ";", "\t", "|"]),
                "Field delimiter of delimited text: comma, semicolon, tab or pipe. Default: sniffed from the first lines.",
            ),
            f!("decimal_comma", Shape::Bool, "Numbers use a decimal comma (1,5), as in many semicolon files."),
            f!("missing", list(&Shape::Text("a cell text")), "Cells read as missing values. Default: empty, NA, N/A, null, NULL and -."),
        ]),
    ]);
    const BIN: Shape = obj(&[
        f!("rule", Shape::Word(BIN_RULES), "How to choose the bin width: sturges, fd (Freedman-Diaconis), scott, sqrt, rice, doane (default sturges)."),
        f!("width", num(Some(0.0), None), "Bin width in data units; overrides the rule."),
        f!("count", count(1), "Wanted number of bins; overrides the rule."),
        f!("boundary", num(None, None), "A value that falls on a bin edge."),
        f!("unit", Shape::Word(BIN_UNITS), "For dates: bin by calendar day, week, month, quarter or year."),
        f!("density", Shape::Bool, "Bar heights as a density (count / (n x width)) instead of counts."),
    ]);
    const DENSITY: Shape = obj(&[
        f!(
            "bandwidth",
            Shape::Either(&[Shape::Word(BANDWIDTHS), num(Some(0.0), None)]),
            "A rule, scott or silverman, or a number in data units (default scott).",
        ),
        f!("grid", count(2), "Points at which the density is evaluated (default 256)."),
    ]);
    const WINDOW: Shape = obj(&[
        f!("summary", Shape::Word(WINDOW_SUMMARIES), "mean or sum over the window, or running_total (default mean)."),
        f!("rows", count(1), "Rows in the window, for mean and sum (default 7)."),
        f!("align", Shape::Word(WINDOW_ALIGN), "Window centred on the row (center) or ending at it (trailing); default center."),
    ]);
    const STAT: Shape = Shape::Either(&[
        Shape::Word(STAT_WORDS),
        Shape::Object(Obj {
            fields: &[
                f!("bin", BIN, "Count rows in bins along x."),
                f!("summary", Shape::Word(SUMMARIES), "Summarise y for each x (and colour/group)."),
                f!("interval", Shape::Word(INTERVALS), "With summary: an interval around it (ci95, ci90, ci99, ci80, standard_error, min_max, wilson)."),
                f!("fit", Shape::Word(FITS), "Fit a curve of y on x: linear or loess."),
                f!("band", num(Some(0.0), Some(1.0)), "With fit: confidence level of the band (default 0.95; 0 for no band)."),
                f!("p", num(Some(0.0), Some(1.0)), "With summary quantile: the probability, such as 0.9 (default 0.5)."),
                f!("span", num(Some(0.0), Some(1.0)), "With fit loess: the share of points in each local fit (default 0.75)."),
                f!("degree", Shape::Integer { min: 1, max: 2 }, "With fit loess: local polynomial degree, 1 or 2 (default 1)."),
                f!("robust", Shape::Either(&[Shape::Bool, count(0)]), "With fit loess: true (3 robustness iterations) or a number of iterations."),
                f!("density", DENSITY, "Kernel density estimate of x."),
                f!("window", WINDOW, "Running summary over neighbouring rows, in x order."),
            ],
            exactly_one_of: &["bin", "summary", "fit", "density", "window"],
        }),
    ]);
    const STYLE: Shape = obj(&[
        f!("color", color(), "Colour of the marks."),
        f!("opacity", num(Some(0.0), Some(1.0)), "Opacity of the marks, 0 to 1."),
        f!("width", num(Some(0.0), None), "Stroke width in pixels for lines and outlines."),
        f!("radius", num(Some(0.0), None), "Point radius in pixels."),
        f!("dash", list(&num(Some(0.0), None)), "Dash pattern in pixels, such as [4, 2]."),
        f!("share", num(Some(0.0), Some(1.0)), "Share of its slot a bar or box fills, 0 to 1."),
        f!("shape", Shape::Word(POINT_SHAPES), "Shape of points: circle, square, triangle, diamond, plus, cross."),
        f!("font_size", num(Some(0.0), None), "Text size of labels in pixels."),
        f!("every_point", Shape::Bool, "Draw every point even when a scatter is crowded enough to be binned into cells."),
    ]);
    const LAYER: Shape = obj(&[
        req("draw", Shape::Word(GEOMETRIES), "The geometry."),
        f!("x", channel(), "A channel: the column mapped to it."),
        f!("y", channel(), "A channel: the column mapped to it."),
        f!("x_end", channel(), "A channel: the column mapped to it."),
        f!("y_end", channel(), "A channel: the column mapped to it."),
        f!("color", channel(), "A channel: the column mapped to it."),
        f!("size", channel(), "A channel: the column mapped to it."),
        f!("shape", channel(), "A channel: the column mapped to it."),
        f!("opacity", channel(), "A channel: the column mapped to it."),
        f!("text", channel(), "A channel: the column mapped to it."),
        f!("group", channel(), "A channel: the column mapped to it."),
        f!("key", channel(), "A channel: the column mapped to it."),
        f!("tooltip", list(&Shape::Text("a column name")), "Columns shown on hover and keyboard focus."),
        f!("style", STYLE, "Constant styling of the marks; never data-driven."),
        f!("stat", STAT, "The statistic: none (default), count, box, or an object."),
        f!("arrange", Shape::Word(ARRANGES), "Position adjustment: none (default), stack, beside, proportion, jitter."),
        f!("label_ends", Shape::Bool, "Line and area layers: name each series at its last point instead of in a legend."),
    ]);
    const SCALE: Shape = obj(&[
        f!("kind", Shape::Word(SCALE_KINDS), "linear, log, sqrt, symlog, time, category, or steps (colour in classes). Default: from the data."),
        f!("domain", list(&Shape::Either(&[num(None, None), text(), Shape::Bool])), "The values the scale covers: [low, high], or the categories in order."),
        f!("zero", Shape::Bool, "Include zero in the domain. Default: true for bars and areas, false otherwise."),
        f!("nice", Shape::Bool, "Round the domain out to tick values. Default: true, except for time."),
        f!("reverse", Shape::Bool, "Run the scale the other way."),
        f!("title", text(), "Axis or legend title. Default: the column name; \"\" hides it."),
        f!("format", Shape::Text("an LDML number or date pattern"), "Label pattern: LDML number (#,##0.0) or date (yyyy-MM-dd) pattern."),
        f!(
            "ticks",
            Shape::Either(&[count(0), list(&Shape::Either(&[num(None, None), Shape::Text("a category or date")]))]),
            "Wanted number of ticks, or the tick values: numbers, dates as text, or categories.",
        ),
        f!("palette", Shape::Text("a palette name"), "Named palette for colour scales."),
        f!("axis", Shape::Word(PLACEMENTS), "Where the axis goes: top, bottom, left, right, none."),
        f!("legend", Shape::Word(PLACEMENTS), "Where the legend goes: top, bottom, left, right, none."),
        f!("hide", Shape::Bool, "Hide the axis or legend."),
        f!("base", num(Some(0.0), None), "Base of a log scale (default 10)."),
        f!(
            "breaks",
            Shape::Either(&[Shape::Word(BreakMethod::WORDS), list(&num(None, None))]),
            "Class breaks of a steps colour scale: natural (default), quantile, equal, or a list of numbers.",
        ),
        f!("count", Shape::Integer { min: 2, max: 12 }, "Number of classes of a steps colour scale (default 5)."),
        f!("middle", num(None, None), "Where a diverging colour palette turns, in data units."),
        f!(
            "values",
            Shape::Map { keys: None, value: &color() },
            "Chosen colours of a category colour scale, by category; the key other colours every category not named.",
        ),
        f!("order", Shape::Word(CategoryOrder::WORDS), "Sort a category axis by the value drawn: ascending or descending."),
        f!("top", count(1), "Keep this many categories (after order); gather the rest into Other."),
        f!("unit", text(), "The unit of a value axis, written once, across, above the axis."),
    ]);
    const COORDS: Shape = Shape::Either(&[
        Shape::Word(COORD_WORDS),
        obj(&[
            req("kind", Shape::Word(PolarKind::WORDS), "polar."),
            f!("angle", Shape::Word(AngleChannel::WORDS), "Which position channel becomes the angle (default x)."),
            f!("start", num(None, None), "Start angle in degrees clockwise from 12 o'clock (default 0)."),
            f!("inner", num(Some(0.0), Some(1.0)), "Inner radius as a fraction of the outer one (default 0)."),
        ]),
        obj(&[
            req("kind", Shape::Word(MapKind::WORDS), "map: x is longitude and y latitude (WGS 84 degrees)."),
            f!("projection", Shape::Word(ProjectionWord::WORDS), "The projection (default equal_earth)."),
            f!(
                "center",
                Shape::Pair(&num(Some(-180.0), Some(180.0))),
                "[longitude, latitude] of the map's centre (default: the middle of the shapes).",
            ),
            f!(
                "rotate",
                Shape::Either(&[num(Some(-360.0), Some(360.0)), list(&num(Some(-360.0), Some(360.0)))]),
                "The sphere's turn before projecting, in degrees: λ, or [λ, φ, γ]: by λ about the polar axis, then by φ about the axis through 0°N 90°E, then by γ about the axis through 0°N 0°E; the map's centre is then 0°, 0° of the turned sphere unless `center` says (default none).",
            ),
            f!(
                "parallels",
                Shape::Pair(&num(Some(-90.0), Some(90.0))),
                "The two standard parallels of albers and lambert_conformal (default: a sixth in from each end of the shapes' latitudes).",
            ),
            f!("fit", Shape::Word(MapFit::WORDS), "Fit the map to the shapes (default) or to the rows drawn (data)."),
            f!(
                "graticule",
                Shape::Either(&[num(Some(1.0), Some(90.0)), Shape::Bool]),
                "Lines of longitude and latitude every so many degrees, or false (default).",
            ),
            f!("outline", Shape::Bool, "Draw the outline of the sphere (default true)."),
        ]),
    ]);
    const SHAPES: Shape = obj(&[
        f!("url", Shape::Text("a URL"), "Where the GeoJSON (RFC 7946) file is; the host reads it like data.url."),
        f!("features", list(&Shape::Any), "Inline GeoJSON features."),
        f!("key", Shape::Text("a property name"), "The feature property that names each shape; a region layer's key column matches it."),
        f!("sha256", Shape::Text("64 hexadecimal digits"), "SHA-256 of the shapes' bytes; a mismatch refuses them."),
    ]);
    const PANELS: Shape = obj(&[
        f!("by", Shape::Text("a column name"), "One panel per value of this column, wrapped into rows."),
        f!("columns", count(1), "With by: panels per row."),
        f!("rows", Shape::Text("a column name"), "One row of panels per value of this column."),
        f!("cols", Shape::Text("a column name"), "One column of panels per value of this column."),
        f!("independent", Shape::Word(INDEPENDENT), "Which position scales each panel fits to its own data: x, y or both."),
    ]);
    const NOTE: Shape = obj(&[
        f!("x", position(), "Data position along x: alone, a vertical reference line."),
        f!("y", position(), "Data position along y: alone, a horizontal reference line."),
        f!("x_end", position(), "With x: shade the span from x to x_end."),
        f!("y_end", position(), "With y: shade the span from y to y_end."),
        f!("text", text(), "The note's text."),
        f!("pointer", Shape::Bool, "With x and y: a leader line from the text to its point when the text had to move."),
    ]);
    const SIZE: Shape = obj(&[
        f!("width", num(Some(0.0), None), "Width in pixels. Absent: fill the container and redraw on resize."),
        f!("height", num(Some(0.0), None), "Height in pixels."),
        f!("aspect", num(Some(0.0), None), "Width divided by height, used when height is absent."),
    ]);
    const THEME: Shape = Shape::Either(&[
        Shape::Word(THEME_WORDS),
        obj(&[
            f!("base", Shape::Word(ThemeBase::WORDS), "The theme these overrides start from (default light)."),
            f!("background", color(), "Background colour."),
            f!("text", color(), "Colour of titles and labels."),
            f!("muted", color(), "Colour of subtitles, source lines and tick labels."),
            f!("grid", color(), "Colour of grid lines."),
            f!("axis", color(), "Colour of axis lines and ticks."),
            f!("mark", color(), "Colour of marks when no colour channel is mapped."),
            f!(
                "font_size",
                num(Some(4.0), Some(72.0)),
                "Size of tick labels, axis titles, legends and notes in pixels (default 12); titles and labels keep their proportion to it.",
            ),
        ]),
    ]);
    static SPEC: Shape = obj(&[
        f!("$schema", Shape::Text("a URL"), "The schema this spec follows, for editors; ignored when drawing."),
        f!("title", text(), "The chart's title."),
        f!("subtitle", text(), "A line under the title."),
        f!("source", text(), "Source line under the chart."),
        f!("description", text(), "Author-written text alternative; replaces the automatic summary for screen readers."),
        f!("data", DATA, "The table: a URL, or an object."),
        f!("shapes", SHAPES, "GeoJSON shapes for region layers: a url or inline features, with the key property."),
        f!("derive", Shape::Map { keys: None, value: &Shape::Text("an expression") }, "New columns from SQL-subset expressions, evaluated in order."),
        f!("where", Shape::Text("an expression"), "A SQL-subset condition; rows where it is TRUE are kept."),
        req("layers", list(&LAYER), "The layers, drawn in order, later on top."),
        f!("scales", Shape::Map { keys: Some(CHANNELS), value: &SCALE }, "Scales keyed by channel."),
        f!("coords", COORDS, "Coordinate system: cartesian (default), polar, or map."),
        f!("panels", PANELS, "Small multiples."),
        f!("notes", list(&NOTE), "Annotations: text, shaded spans, reference lines."),
        f!("size", SIZE, "The chart's size."),
        f!("theme", THEME, "light, dark, auto (default: follows the reader's preference), or overrides."),
        f!("quiet", list(&Shape::Word(LINT_CODES)), "Lint warnings silenced on purpose, by code."),
        f!("locale", Shape::Word(LOCALES), "Language of number and date labels: en (default), de, fr, es."),
        f!(
            "unpivot",
            obj(&[
                req("columns", list(&Shape::Text("a column name")), "The wide columns to turn into rows, in the order their names take."),
                req("into", Shape::Pair(&Shape::Text("a column name")), "The two new columns: the names, then the values."),
            ]),
            "Wide columns into long rows, after derive and where.",
        ),
        f!(
            "data_table",
            Shape::Word(DATA_TABLE),
            "The numbers behind the marks as a table under the chart: closed (default: a disclosure the reader opens), open, or none.",
        ),
    ]);
    SPEC
}

// ---------------------------------------------------------------- checking

/// The JSON type of a value, in words, with a short excerpt.
fn found(v: &Value) -> String {
    let excerpt = |s: String| if s.chars().count() > 40 { format!("{}...", s.chars().take(37).collect::<String>()) } else { s };
    match v {
        Value::Null => "null".into(),
        Value::Bool(b) => format!("{b}"),
        Value::Number(_) => format!("the number {}", crate::json::to_string(v)),
        Value::String(s) => format!("the text {}", excerpt(quoted(s))),
        Value::Array(_) => "a list".into(),
        Value::Object(_) => "an object".into(),
    }
}

/// `a`, `b` or `c` (a loop: no vector of pieces).
fn join_words(words: &[&str]) -> String {
    let mut out = String::new();
    let n = words.len();
    for (i, w) in words.iter().enumerate() {
        if i > 0 {
            out.push_str(if i + 1 == n { " or " } else { ", " });
        }
        out.push('`');
        out.push_str(w);
        out.push('`');
    }
    out
}

impl Shape {
    /// What this shape accepts, in words.
    pub fn expected(&self) -> String {
        match self {
            Shape::Any => "any value".into(),
            Shape::Text(what) => what.to_string(),
            Shape::Word(ws) => format!("one of {}", join_words(ws)),
            Shape::Number { min: Some(a), max: Some(b) } => format!("a number from {} to {}", crate::format::float::Plain(*a), crate::format::float::Plain(*b)),
            Shape::Number { min: Some(a), .. } => format!("a number of at least {}", crate::format::float::Plain(*a)),
            Shape::Number { .. } => "a number".into(),
            Shape::Integer { min, .. } if *min > 0 => format!("a whole number of at least {min}"),
            Shape::Integer { .. } => "a whole number".into(),
            Shape::Bool => "true or false".into(),
            Shape::List(_) => "a list".into(),
            Shape::Pair(item) => format!("a list of two items, each {}", item.expected()),
            Shape::Map { .. } | Shape::Object(_) => "an object".into(),
            Shape::Either(alts) => {
                let mut out = String::new();
                for (i, a) in alts.iter().enumerate() {
                    if i > 0 {
                        out.push_str(", or ");
                    }
                    out.push_str(&a.expected());
                }
                out
            }
            Shape::Def(name) => def_shape(name).expected(),
        }
    }

    fn accepts_type(&self, v: &Value) -> bool {
        match self {
            Shape::Any => true,
            Shape::Text(_) | Shape::Word(_) => v.is_string(),
            Shape::Number { .. } | Shape::Integer { .. } => v.is_number(),
            Shape::Bool => v.is_boolean(),
            Shape::List(_) | Shape::Pair(_) => v.is_array(),
            Shape::Map { .. } | Shape::Object(_) => v.is_object(),
            Shape::Either(alts) => alts.iter().any(|a| a.accepts_type(v)),
            Shape::Def(name) => def_shape(name).accepts_type(v),
        }
    }
}

/// `s` in double quotes with JSON's escapes (the spec is JSON; and Rust's
/// `{:?}` would bring core's Unicode printable tables into the page).
fn quoted(s: &str) -> String {
    let mut q = String::new();
    crate::json::write_str(&mut q, s);
    q
}

fn key_path(path: &str, key: &str) -> String {
    let plain = !key.is_empty() && key.chars().all(|c| c.is_alphanumeric() || c == '_' || c == '$');
    let seg = if plain { key.to_string() } else { quoted(key) };
    if path.is_empty() {
        seg
    } else {
        format!("{path}.{seg}")
    }
}

/// Does an object alternative's `kind` word list hold the value's `kind`?
fn kind_matches(a: &Shape, v: &Value) -> bool {
    let Shape::Object(o) = a else { return true };
    match (o.fields.iter().find(|f| f.name == "kind"), v.get("kind").and_then(Value::as_str)) {
        (Some(Field { shape: Shape::Word(ws), .. }), Some(k)) => ws.contains(&k),
        _ => true,
    }
}

/// Check `v` against `shape`, pushing every problem found.
pub fn check(v: &Value, shape: &Shape, path: &str, out: &mut Vec<Diagnostic>) {
    match shape {
        Shape::Any => {}
        Shape::Def(name) => check(v, def_shape(name), path, out),
        // Objects of one type are told apart by their `kind` word (coords:
        // polar or map); the first fitting alternative otherwise.
        Shape::Either(alts) => match alts.iter().find(|a| a.accepts_type(v) && kind_matches(a, v)).or_else(|| alts.iter().find(|a| a.accepts_type(v))) {
            Some(a) => check(v, a, path, out),
            None => out.push(wrong_type(shape, v, path)),
        },
        _ if !shape.accepts_type(v) => out.push(wrong_type(shape, v, path)),
        Shape::Text(_) | Shape::Bool => {}
        Shape::Word(words) => {
            let s = v.as_str().unwrap_or_default();
            if !words.contains(&s) {
                let mut d = Diagnostic::error("spec.unknown_word", format!("`{s}` is not one of {}", join_words(words))).at_path(path);
                if let Some(hint) = retired_hint(s, words) {
                    d = d.with_hint(hint);
                } else if let Some(near) = closest(s, words.iter().copied()) {
                    d = d.with_hint(format!("did you mean `{near}`?"));
                } else if let Some(near) = words.iter().find(|w| w.eq_ignore_ascii_case(s)) {
                    d = d.with_hint(format!("words are lower case: `{near}`"));
                }
                out.push(d);
            }
        }
        Shape::Number { min, max } => {
            let x = v.as_f64().unwrap_or(f64::NAN);
            if min.is_some_and(|m| x < m) || max.is_some_and(|m| x > m) {
                out.push(
                    Diagnostic::error("spec.out_of_range", format!("expected {}, found {}", shape.expected(), crate::format::float::Plain(x))).at_path(path),
                );
            }
        }
        Shape::Integer { min, max } => match v.as_i64() {
            Some(x) if x >= *min && x <= *max => {}
            Some(x) => out.push(Diagnostic::error("spec.out_of_range", format!("expected {}, found {x}", shape.expected())).at_path(path)),
            None => out.push(
                Diagnostic::error("spec.wrong_type", format!("expected {}, found {}", shape.expected(), found(v)))
                    .at_path(path)
                    .with_hint("write a whole number without a decimal point"),
            ),
        },
        Shape::List(item) => {
            for (i, x) in v.as_array().into_iter().flatten().enumerate() {
                check(x, item, &format!("{path}[{i}]"), out);
            }
        }
        Shape::Pair(item) => {
            let items = v.as_array().map_or(&[][..], Vec::as_slice);
            if items.len() != 2 {
                out.push(Diagnostic::error("spec.wrong_type", format!("expected {}, found a list of {}", shape.expected(), items.len())).at_path(path));
            }
            for (i, x) in items.iter().enumerate() {
                check(x, item, &format!("{path}[{i}]"), out);
            }
        }
        Shape::Map { keys, value } => {
            for (k, x) in v.as_object().into_iter().flatten() {
                let p = key_path(path, k);
                if let Some(keys) = keys {
                    if !keys.contains(&k.as_str()) {
                        out.push(unknown_key(k, keys, &p));
                        continue;
                    }
                }
                check(x, value, &p, out);
            }
        }
        Shape::Object(o) => {
            let m: &Map<String, Value> = v.as_object().expect("checked");
            for (k, x) in m {
                let p = key_path(path, k);
                match o.fields.iter().find(|f| f.name == k) {
                    Some(field) => check(x, &field.shape, &p, out),
                    None => {
                        let mut names = Vec::new();
                        for f in o.fields {
                            names.push(f.name);
                        }
                        out.push(unknown_key(k, &names, &p));
                    }
                }
            }
            for field in o.fields.iter().filter(|f| f.required) {
                if !m.contains_key(field.name) {
                    out.push(
                        Diagnostic::error(
                            "spec.missing_key",
                            format!("`{}` is required here: {}", field.name, crate::text::case::lower(field.doc.trim_end_matches('.'))),
                        )
                        .at_path(path),
                    );
                }
            }
            if !o.exactly_one_of.is_empty() {
                let present: Vec<&str> = o.exactly_one_of.iter().copied().filter(|k| m.contains_key(*k)).collect();
                if present.len() != 1 {
                    let msg = if present.is_empty() {
                        format!("this object needs one of {}", join_words(o.exactly_one_of))
                    } else {
                        format!("this object takes only one of {}, but has {}", join_words(o.exactly_one_of), join_words(&present))
                    };
                    out.push(Diagnostic::error("spec.one_of", msg).at_path(path).with_hint("use one layer for each"));
                }
            }
        }
    }
}

fn wrong_type(shape: &Shape, v: &Value, path: &str) -> Diagnostic {
    Diagnostic::error("spec.wrong_type", format!("expected {}, found {}", shape.expected(), found(v))).at_path(path)
}

fn unknown_key(k: &str, names: &[&str], path: &str) -> Diagnostic {
    let mut d = Diagnostic::error("spec.unknown_key", format!("unknown key `{k}`")).at_path(path);
    d = match (retired_hint(k, names), closest(k, names.iter().copied())) {
        (Some(hint), _) => d.with_hint(hint),
        (None, Some(near)) => d.with_hint(format!("did you mean `{near}`?")),
        (None, None) => {
            let mut visible = Vec::new();
            for n in names {
                if !n.starts_with('$') {
                    visible.push(*n);
                }
            }
            d.with_hint(format!("the keys here are {}", join_words(&visible)))
        }
    };
    d
}

// ---------------------------------------------------------------- JSON Schema

fn schema_of(shape: &Shape, doc: Option<&str>) -> Value {
    let mut s = match shape {
        Shape::Any => json!({}),
        Shape::Text(_) => json!({"type": "string"}),
        Shape::Word(ws) => json!({"type": "string", "enum": ws}),
        Shape::Number { min, max } => {
            let mut s = json!({"type": "number"});
            if let Some(m) = min {
                s["minimum"] = json!(m);
            }
            if let Some(m) = max {
                s["maximum"] = json!(m);
            }
            s
        }
        Shape::Integer { min, max } => json!({"type": "integer", "minimum": min, "maximum": max}),
        Shape::Bool => json!({"type": "boolean"}),
        Shape::List(item) => json!({"type": "array", "items": schema_of(item, None)}),
        Shape::Pair(item) => json!({"type": "array", "items": schema_of(item, None), "minItems": 2, "maxItems": 2}),
        Shape::Map { keys, value } => {
            let mut s = json!({"type": "object", "additionalProperties": schema_of(value, None)});
            if let Some(keys) = keys {
                s["propertyNames"] = json!({"enum": keys});
            }
            s
        }
        Shape::Object(o) => {
            let mut props = Map::new();
            for f in o.fields {
                props.insert(f.name.to_string(), schema_of(&f.shape, Some(f.doc)));
            }
            let required: Vec<&str> = o.fields.iter().filter(|f| f.required).map(|f| f.name).collect();
            let mut s = json!({"type": "object", "properties": props, "additionalProperties": false});
            if !required.is_empty() {
                s["required"] = json!(required);
            }
            if !o.exactly_one_of.is_empty() {
                s["oneOf"] = Value::Array(o.exactly_one_of.iter().map(|k| json!({"required": [k]})).collect());
            }
            s
        }
        Shape::Either(alts) => json!({"anyOf": alts.iter().map(|a| schema_of(a, None)).collect::<Vec<_>>()}),
        Shape::Def(name) => json!({"$ref": format!("#/$defs/{name}")}),
    };
    if let (Some(d), Some(m)) = (doc.filter(|d| !d.is_empty()), s.as_object_mut()) {
        m.insert("description".into(), json!(d));
    }
    s
}

/// The JSON Schema (draft 2020-12) of a spec.
pub fn json_schema() -> Value {
    let mut root = schema_of(&spec_shape(), None);
    let m = root.as_object_mut().expect("object");
    let mut out = Map::new();
    out.insert("$schema".into(), json!("https://json-schema.org/draft/2020-12/schema"));
    out.insert("title".into(), json!("Strata chart spec"));
    out.insert("description".into(), json!("A chart: data, layers, scales and the rest. See docs/spec.md."));
    for (k, v) in std::mem::take(m) {
        out.insert(k, v);
    }
    // A spec needs at least one layer.
    out["properties"]["layers"]["minItems"] = json!(1);
    let mut defs_map = Map::new();
    for &(name, ref shape, doc) in defs() {
        defs_map.insert(name.into(), schema_of(shape, Some(doc)));
    }
    out.insert("$defs".into(), Value::Object(defs_map));
    Value::Object(out)
}

/// Every key path the vocabulary knows, such as `layers[].stat.bin.rule`
/// (for documentation checks).
pub fn key_paths() -> Vec<String> {
    fn walk(shape: &Shape, path: &str, out: &mut Vec<String>) {
        match shape {
            Shape::Object(o) => {
                for f in o.fields {
                    let p = if path.is_empty() { f.name.to_string() } else { format!("{path}.{}", f.name) };
                    out.push(p.clone());
                    walk(&f.shape, &p, out);
                }
            }
            Shape::List(item) | Shape::Pair(item) => walk(item, &format!("{path}[]"), out),
            Shape::Map { value, keys, .. } => walk(value, &format!("{path}.{}", if keys.is_some() { "CHANNEL" } else { "NAME" }), out),
            Shape::Either(alts) => alts.iter().for_each(|a| walk(a, path, out)),
            Shape::Def(name) => walk(def_shape(name), path, out),
            _ => {}
        }
    }
    let mut out = Vec::new();
    walk(&spec_shape(), "", &mut out);
    out
}
