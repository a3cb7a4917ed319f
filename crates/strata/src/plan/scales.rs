//! Train scales over every layer (and so over every panel, which only
//! splits the same rows): domains, kinds, titles, palettes, sizes, shapes.

use super::{PlannedLayer, Values};
use crate::channel::Channel;
use crate::color::{self, Scheme};
use crate::error::{Diagnostic, Errors};
use crate::format::{self, Locale};
use crate::index::Places;
use crate::scale::{PositionScale, SizeScale, Transform};
use crate::spec::{Geometry, ScaleKind, ScaleSpec, Spec};
use crate::text;

#[derive(Debug, Clone, PartialEq)]
pub enum ColorScale {
    /// Each category gets a palette colour, in order of first appearance.
    Categories(Vec<String>),
    /// Numbers between lo and hi on a ramp.
    Ramp { lo: f64, hi: f64 },
    /// Numbers in classes (`kind: steps`): ascending upper bounds, the
    /// last the largest value, and the smallest value; class i takes the
    /// ramp's colour at (i + 1/2) / classes. The full engine's (feature
    /// `steps`); the core refuses `kind: steps`.
    #[cfg(feature = "steps")]
    Steps { lo: f64, bounds: Vec<f64> },
}

#[derive(Debug, Clone)]
pub struct Scales {
    pub x: PositionScale,
    pub y: PositionScale,
    pub x_title: String,
    pub y_title: String,
    pub x_spec: ScaleSpec,
    pub y_spec: ScaleSpec,
    /// Whether the layout should widen x and y to nice ends once it knows
    /// how many ticks fit ([`PositionScale::nice`]).
    pub x_nice: bool,
    pub y_nice: bool,
    pub color: Option<ColorScale>,
    pub color_title: String,
    pub color_spec: ScaleSpec,
    /// The palette the colour channel uses (named by `scales.color.palette`).
    pub color_scheme: Scheme,
    /// Where a diverging ramp turns (data units).
    pub color_mid: Option<f64>,
    /// The part of a sequential ramp in use (0..1 of the ramp). All of it
    /// for filled marks; for thin marks (points, lines, labels) only the
    /// part that stands out from the background ([`thin_mark_span`]).
    pub color_span: (f64, f64),
    pub size: Option<SizeScale>,
    pub size_title: String,
    pub size_spec: ScaleSpec,
    /// Shape categories, in order of first appearance.
    pub shape: Option<Vec<String>>,
    pub shape_title: String,
    pub shape_spec: ScaleSpec,
    /// Locale of every label (`locale` in the spec).
    pub locale: &'static Locale,
    /// Each colour category's (first) place in the `color` list, for lookups by hash.
    pub color_index: Places,
    /// Chosen colours by category (`scales.color.values`), by the
    /// category's place in the `color` list (as `color_index` gives it),
    /// and the colour of every other category (its key `other`).
    pub color_chosen: Vec<Option<String>>,
    pub color_other: Option<String>,
}

/// The key of `scales.color.values` that colours every category not named.
pub const OTHER_KEY: &str = "other";

impl Scales {
    /// The colour of row `i` of a colour column, if the scale maps it.
    pub fn color_of(&self, vals: &Values, i: usize) -> Option<String> {
        match (self.color.as_ref()?, self.color_scheme) {
            (ColorScale::Categories(cats), scheme) => {
                let k = vals.key(i)?;
                let idx = self.color_index.get(cats, &k)?;
                // Chosen colours first, then `other`, then the palette.
                if let Some(c) = self.color_chosen.get(idx).and_then(Option::as_ref).or(self.color_other.as_ref()) {
                    return Some(c.clone());
                }
                Some(match scheme {
                    Scheme::Categorical(_, list) => list[idx % list.len()].to_string(),
                    // A ramp for categories: evenly spaced samples.
                    Scheme::Ramp(r) => r.at(if cats.len() > 1 { idx as f64 / (cats.len() - 1) as f64 } else { 0.5 }),
                })
            }
            (ColorScale::Ramp { lo, hi }, scheme) => {
                let v = vals.num(i)?;
                Some(self.ramp_color(v, *lo, *hi, scheme))
            }
            #[cfg(feature = "steps")]
            (ColorScale::Steps { bounds, .. }, scheme) => {
                let c = crate::geo::classify::class_of(bounds, vals.num(i)?)?;
                Some(self.step_color(c, bounds.len(), scheme))
            }
        }
    }

    /// The colour legend's items for categories: each category with its
    /// colour, except that two or more categories that `other` colours are
    /// gathered into one item, "Other", after the rest.
    pub fn category_legend(&self) -> Vec<(String, String)> {
        let Some(ColorScale::Categories(cats)) = &self.color else { return Vec::new() };
        let vals = Values::texts(cats);
        let mut items: Vec<(String, String)> = Vec::new();
        let mut others: Vec<&String> = Vec::new();
        for (i, c) in cats.iter().enumerate() {
            if self.color_other.is_some() && self.color_index.get(cats, c).is_none_or(|j| self.color_chosen[j].is_none()) {
                others.push(c);
                continue;
            }
            items.push((c.clone(), self.color_of(&vals, i).unwrap_or_default()));
        }
        // One category in the `other` colour keeps its own name.
        if let Some(o) = &self.color_other {
            match others.as_slice() {
                [] => {}
                [one] => items.push(((*one).clone(), o.clone())),
                _ => items.push(("Other".to_string(), o.clone())),
            }
        }
        items
    }

    /// Colour of class `c` of `n` on a `steps` scale.
    #[cfg(feature = "steps")]
    pub fn step_color(&self, c: usize, n: usize, scheme: Scheme) -> String {
        let ramp = match scheme {
            Scheme::Ramp(r) => r,
            Scheme::Categorical(..) => color::LAGOON,
        };
        ramp.at((c as f64 + 0.5) / n.max(1) as f64)
    }

    /// Colour of a number on the continuous colour scale.
    pub fn ramp_color(&self, v: f64, lo: f64, hi: f64, scheme: Scheme) -> String {
        let ramp = match scheme {
            Scheme::Ramp(r) => r,
            Scheme::Categorical(..) => color::LAGOON,
        };
        let t = match (ramp.diverging, self.color_mid) {
            (true, Some(m)) if hi > m && m > lo => {
                if v <= m {
                    0.5 * (v - lo) / (m - lo)
                } else {
                    0.5 + 0.5 * (v - m) / (hi - m)
                }
            }
            _ => {
                let t = if hi > lo { (v - lo) / (hi - lo) } else { 0.5 };
                self.color_span.0 + (self.color_span.1 - self.color_span.0) * t
            }
        };
        ramp.at(t)
    }

    /// Circle radius of row `i` of a size column.
    pub fn radius_of(&self, vals: &Values, i: usize) -> Option<f64> {
        self.size.as_ref()?.radius(vals.num(i)?)
    }

    /// Shape index (into [`crate::scale::SHAPES`]) of row `i` of a shape column.
    pub fn shape_of(&self, vals: &Values, i: usize) -> Option<usize> {
        let k = vals.key(i)?;
        self.shape.as_ref()?.iter().position(|c| *c == k)
    }
}

/// A `steps` colour scale: class breaks by `breaks` over every layer's
/// colour values (`geo::classify`), `count` classes (default 5).
#[cfg(feature = "steps")]
fn steps(spec: &ScaleSpec, layers: &[PlannedLayer], lo: f64, hi: f64) -> Result<ColorScale, Errors> {
    use crate::geo::classify;
    use crate::spec::{BreakMethod, Breaks};
    let k = spec.count.unwrap_or(5).clamp(2, 12) as usize;
    let mut xs = Vec::new();
    for l in layers {
        if let Some(v) = l.data.get(Channel::Color) {
            for i in 0..v.len() {
                if let Some(x) = v.num(i) {
                    xs.push(x);
                }
            }
        }
    }
    let bounds = match &spec.breaks {
        Some(Breaks::List(b)) => {
            let mut b: Vec<f64> = b.clone();
            b.retain(|x| x.is_finite());
            if b.windows(2).any(|w| w[0] >= w[1]) {
                return Err(Diagnostic::error("spec.bad_breaks", "the breaks must be numbers in increasing order").at_path("scales.color.breaks").into());
            }
            // Listed breaks are the upper bounds of all but the last class.
            b.push(hi.max(b.last().copied().unwrap_or(hi)));
            b
        }
        Some(Breaks::Method(BreakMethod::Quantile)) => classify::quantile(&xs, k),
        Some(Breaks::Method(BreakMethod::Equal)) => classify::equal(&xs, k),
        Some(Breaks::Method(BreakMethod::Natural)) | None => classify::natural(&xs, k),
    };
    Ok(ColorScale::Steps { lo, bounds })
}

fn domain_error(axis: &str) -> Errors {
    Diagnostic::error("spec.bad_domain", "a continuous domain needs two numbers (or two dates), such as [0, 100]")
        .at_path(format!("scales.{axis}.domain"))
        .into()
}

/// The channels each position scale is trained on.
const X_CHANNELS: &[Channel] = &[Channel::X, Channel::XEnd];
const Y_CHANNELS: &[Channel] = &[Channel::Y, Channel::YEnd, Channel::YBase, Channel::YTop, Channel::YLow, Channel::YHigh];

/// Train the x and/or y scale of `scales` again on `layers` alone (one
/// panel's rows, for `panels.independent`), as [`train`] trains them on every row.
pub fn retrain_positions(layers: &[PlannedLayer], scales: &mut Scales, x: bool, y: bool) -> Result<(), Errors> {
    if x {
        (scales.x, scales.x_nice) = train_position(X_CHANNELS, "x", &scales.x_spec, layers)?;
    }
    if y {
        (scales.y, scales.y_nice) = train_position(Y_CHANNELS, "y", &scales.y_spec, layers)?;
    }
    Ok(())
}

pub fn train(spec: &Spec, layers: &[PlannedLayer]) -> Result<Scales, Errors> {
    let get = |k: Channel| spec.scales.get(&k).cloned().unwrap_or_default();
    let (mut x_spec, mut y_spec, color_spec, size_spec, shape_spec) =
        (get(Channel::X), get(Channel::Y), get(Channel::Color), get(Channel::Size), get(Channel::Shape));
    // Whole-number years read as years: no grouping unless the spec sets a format.
    for (ch, s) in [(Channel::X, &mut x_spec), (Channel::Y, &mut y_spec)] {
        let mut cols = layers.iter().filter_map(|l| Some((l.data.names.get(&ch)?, l.data.get(ch)?))).peekable();
        if s.format.is_none() && cols.peek().is_some() && cols.all(|(n, v)| super::is_year_column(n, v)) {
            s.format = Some(super::YEAR_PATTERN.to_string());
        }
    }
    let (x, x_nice) = train_position(X_CHANNELS, "x", &x_spec, layers)?;
    let (y, y_nice) = train_position(Y_CHANNELS, "y", &y_spec, layers)?;
    // A value axis's `unit` joins its title, written once above the axis: "Rain (mm)", or the unit alone.
    let title = |ch: Channel, s: &ScaleSpec| {
        let t = s.title.clone().unwrap_or_else(|| layers.iter().find_map(|l| l.data.names.get(&ch).cloned()).unwrap_or_default());
        match s.unit.as_deref().filter(|u| !u.is_empty()) {
            Some(u) if t.is_empty() => u.to_string(),
            Some(u) => format!("{t} ({u})"),
            None => t,
        }
    };
    // Legends: the scale's title, else the column's name made readable.
    let legend_title = |ch: Channel, s: &ScaleSpec| {
        s.title.clone().unwrap_or_else(|| layers.iter().find_map(|l| l.data.names.get(&ch).map(|n| text::readable_name(n))).unwrap_or_default())
    };
    let locale = format::locale(spec.locale.map_or("en", |l| l.word()));

    // Colour.
    let (cats, num) = collect(layers, Channel::Color);
    let color = if color_spec.kind == Some(ScaleKind::Category) || !cats.is_empty() {
        let cats = match &color_spec.domain {
            Some(d) => json_words(d),
            None if !cats.is_empty() => cats,
            None => num_as_text(layers, Channel::Color),
        };
        (!cats.is_empty()).then_some(ColorScale::Categories(cats))
    } else if let (Some((lo, hi)), Some(ScaleKind::Steps)) = (num, color_spec.kind) {
        // The core engine: no classes (refused earlier by spec::needs_full).
        #[cfg(not(feature = "steps"))]
        {
            let _ = (lo, hi);
            return Err(crate::needs_full_engine("scales.color.kind", "steps").into());
        }
        #[cfg(feature = "steps")]
        Some(steps(&color_spec, layers, lo, hi)?)
    } else if let Some((lo, hi)) = num {
        let (lo, hi) = explicit_domain(&color_spec, "color")?.unwrap_or((lo, hi));
        Some(ColorScale::Ramp { lo, hi })
    } else {
        None
    };
    let color_scheme = match &color_spec.palette {
        Some(name) => Scheme::by_name(name).ok_or_else(|| {
            Errors::from(
                Diagnostic::error("spec.unknown_palette", format!("there is no palette called `{name}`"))
                    .at_path("scales.color.palette")
                    .with_hint(format!("the palettes are: {}", crate::join(&Scheme::names(), ", "))),
            )
        })?,
        None => match color {
            Some(ColorScale::Ramp { lo, hi }) if lo < 0.0 && hi > 0.0 => Scheme::Ramp(color::ESTUARY),
            // A `middle` inside the domain asks for a diverging ramp.
            Some(ColorScale::Ramp { lo, hi }) if color_spec.middle.is_some_and(|m| m > lo && m < hi) => Scheme::Ramp(color::ESTUARY),
            Some(ColorScale::Ramp { .. }) => Scheme::Ramp(color::LAGOON),
            #[cfg(feature = "steps")]
            Some(ColorScale::Steps { .. }) => Scheme::Ramp(color::LAGOON),
            _ => Scheme::Categorical("harbour", &color::HARBOUR),
        },
    };
    let thin = layers
        .iter()
        .filter(|l| l.data.get(Channel::Color).is_some())
        .all(|l| matches!(l.geometry, Geometry::Point | Geometry::Line | Geometry::Step | Geometry::Label | Geometry::Segment | Geometry::Range));
    let color_span = match (color_scheme, &color) {
        (Scheme::Ramp(r), Some(ColorScale::Ramp { .. })) if !r.diverging && thin => thin_mark_span(r, &super::chart::palette(&spec.theme).0.background),
        _ => (0.0, 1.0),
    };
    let color_mid = match color {
        _ if color_spec.middle.is_some() => color_spec.middle,
        Some(ColorScale::Ramp { lo, hi }) if lo < 0.0 && hi > 0.0 => Some(0.0),
        Some(ColorScale::Ramp { lo, hi }) => Some((lo + hi) / 2.0),
        _ => None,
    };

    // Size: area proportional to value, from zero unless told otherwise.
    let (_, size_num) = collect(layers, Channel::Size);
    let size = match size_num {
        Some((lo, hi)) => {
            let (mut lo, hi) = explicit_domain(&size_spec, "size")?.unwrap_or((lo, hi));
            if size_spec.zero.unwrap_or(true) && lo > 0.0 {
                lo = 0.0;
            }
            Some(SizeScale { lo, hi, max_radius: 12.0 })
        }
        None => None,
    };

    // Shape: categories (numbers read as text).
    let (shape_cats, shape_num) = collect(layers, Channel::Shape);
    let shape = if !shape_cats.is_empty() {
        Some(shape_cats)
    } else if shape_num.is_some() {
        Some(num_as_text(layers, Channel::Shape))
    } else {
        None
    };

    let mut color_index = Places::new();
    let mut color_chosen: Vec<Option<String>> = Vec::new();
    if let Some(ColorScale::Categories(cats)) = &color {
        color_chosen = vec![None; cats.len()];
        color_index = Places::of(cats);
        // A category literally called `other` takes the `other` colour too
        // (the categories of `color_index`, so a doubled category finds the
        // first place's colour as the lookup of a row does).
        for (k, v) in color_spec.values.iter().flatten() {
            if let Some(i) = color_index.get(cats, k) {
                color_chosen[i] = Some(v.clone());
            }
        }
    }
    Ok(Scales {
        x_title: title(Channel::X, &x_spec),
        y_title: title(Channel::Y, &y_spec),
        color_title: legend_title(Channel::Color, &color_spec),
        size_title: legend_title(Channel::Size, &size_spec),
        shape_title: legend_title(Channel::Shape, &shape_spec),
        x,
        y,
        x_nice,
        y_nice,
        x_spec,
        y_spec,
        color,
        color_scheme,
        color_mid,
        color_span,
        size,
        size_spec,
        shape,
        shape_spec,
        locale,
        color_index,
        color_chosen,
        color_other: color_spec.values.as_ref().and_then(|v| v.get(OTHER_KEY).cloned()),
        color_spec,
    })
}

/// WCAG 2.1 success criterion 1.4.11 (non-text contrast) asks 3:1 of the
/// graphics needed to read a chart against what is next to them.
const THIN_MARK_CONTRAST: f64 = 3.0;

/// The part of a sequential ramp that thin marks use: the samples with at
/// least [`THIN_MARK_CONTRAST`] against the background, kept at least half
/// the ramp long (from the end far from the background) so the colours still
/// spread. A ramp's palest end is made for filled areas; on points it all
/// but vanished on white (found in a user trial).
pub fn thin_mark_span(ramp: color::Ramp, background: &str) -> (f64, f64) {
    let mut ok: Vec<f64> = Vec::new();
    for k in 0..=100 {
        let t = k as f64 / 100.0;
        if color::contrast(&ramp.at(t), background).is_some_and(|c| c >= THIN_MARK_CONTRAST) {
            ok.push(t);
        }
    }
    let (Some(&lo), Some(&hi)) = (ok.first(), ok.last()) else { return (0.0, 1.0) };
    if hi - lo >= 0.5 {
        return (lo, hi);
    }
    // Too little of the ramp passes: keep half of it, at the passing end.
    if hi >= 1.0 {
        (0.5, 1.0)
    } else {
        (0.0, 0.5)
    }
}

/// Warnings about chosen colours: a `values` key that names no category
/// (a typo leaves that category in the palette's colour), with a
/// did-you-mean; chosen colours on a scale that has no categories.
pub fn chosen_color_warnings(scales: &Scales) -> Vec<Diagnostic> {
    let Some(values) = &scales.color_spec.values else { return Vec::new() };
    let cats = match &scales.color {
        Some(ColorScale::Categories(c)) => c,
        _ => {
            return vec![Diagnostic::warning("spec.no_effect", "`values` chooses colours for categories, but the colour scale has none")
                .at_path("scales.color.values")
                .with_hint("map `color` to a column of categories (text), or use `palette` for numbers")]
        }
    };
    // `color_index` holds exactly these categories (one hash map type fewer in the page).
    let mut out = Vec::new();
    for k in values.keys() {
        if k == OTHER_KEY || scales.color_index.get(cats, k).is_some() {
            continue;
        }
        let d = Diagnostic::warning("spec.unknown_category", format!("`{k}` is not a category of the colour column, so its colour is not used"))
            .at_path(format!("scales.color.values.{}", crate::expr::path_key(k)));
        out.push(match crate::spec::closest(k, cats.iter().map(String::as_str)) {
            Some(s) => d.with_hint(format!("did you mean `{s}`?")),
            None => d.with_hint(format!("the categories are: {}", crate::join(&cats[..cats.len().min(12)], ", "))),
        });
    }
    out
}

/// Append the values of `v` not seen yet, in order of first appearance
/// (found by hash in [`Places`], the engine's one hash index: many
/// distinct values stay linear).
fn add_distinct(cats: &mut Vec<String>, seen: &mut Places, v: &[Option<String>]) {
    for s in v.iter().flatten() {
        seen.push(cats, s);
    }
}

fn json_word(v: &serde_json::Value) -> String {
    v.as_str().map(str::to_string).unwrap_or_else(|| crate::json::to_string(v))
}

/// [`json_word`] of each value, in one loop for every list the spec gives.
fn json_words(list: &[serde_json::Value]) -> Vec<String> {
    let mut out = Vec::with_capacity(list.len());
    for v in list {
        out.push(json_word(v));
    }
    out
}

/// A date (`2024-01-31`) or date-time in ms since 1970 UTC.
fn date_ms(t: &str) -> Option<f64> {
    crate::calendar::parse_date(t).map(|d| d as f64 * 86_400_000.0).or_else(|| crate::calendar::parse_datetime(t).map(|ms| ms as f64))
}

/// Categories (text) and the numeric range of a channel across layers.
fn collect(layers: &[PlannedLayer], ch: Channel) -> (Vec<String>, Option<(f64, f64)>) {
    let mut cats: Vec<String> = Vec::new();
    let mut seen = Places::new();
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    for l in layers {
        match l.data.get(ch) {
            Some(Values::Text(v)) => {
                add_distinct(&mut cats, &mut seen, v);
            }
            Some(Values::Num(v)) | Some(Values::Time(v)) => {
                if let Some((a, b)) = v.extent() {
                    lo = lo.min(a);
                    hi = hi.max(b);
                }
            }
            None => {}
        }
    }
    (cats, lo.is_finite().then_some((lo, hi)))
}

/// Distinct numbers of a channel, sorted, as category words.
fn num_as_text(layers: &[PlannedLayer], ch: Channel) -> Vec<String> {
    num_as_text_position(layers, &[ch])
}

fn l_key(x: f64) -> String {
    // Same text as Values::key, so lookups match.
    crate::format::float::plain(x)
}

/// A two-value domain from the spec: numbers, or ISO dates for time scales.
fn explicit_domain(s: &ScaleSpec, axis: &str) -> Result<Option<(f64, f64)>, Errors> {
    let Some(dom) = &s.domain else { return Ok(None) };
    let mut nums: Vec<f64> = Vec::with_capacity(dom.len());
    for v in dom {
        if let Some(x) = v.as_f64().or_else(|| date_ms(v.as_str()?)) {
            nums.push(x);
        }
    }
    if nums.len() != 2 || dom.len() != 2 {
        return Err(domain_error(axis));
    }
    Ok(Some((nums[0], nums[1])))
}

/// A trained position scale and whether its domain is still to be made
/// nice, with the tick values the spec chose (`ticks: [...]`).
fn train_position(channels: &[Channel], axis: &str, s: &ScaleSpec, layers: &[PlannedLayer]) -> Result<(PositionScale, bool), Errors> {
    let (scale, nice) = train_position_bare(channels, axis, s, layers)?;
    let Some(crate::spec::Ticks::Values(list)) = &s.ticks else { return Ok((scale, nice)) };
    let names = json_words(list);
    let mut numbers = Vec::with_capacity(list.len());
    for (i, v) in list.iter().enumerate() {
        let n = if scale.is_time() { v.as_str().and_then(date_ms) } else { v.as_f64() };
        match n {
            Some(n) => numbers.push(n),
            None if !scale.is_discrete() => {
                let want = if scale.is_time() { "a date, such as \"2024-01-01\"" } else { "a number" };
                return Err(Diagnostic::error("spec.bad_ticks", format!("each chosen tick on the {axis} axis must be {want}"))
                    .at_path(format!("scales.{axis}.ticks[{i}]"))
                    .into());
            }
            None => {}
        }
    }
    Ok((scale.with_marks(numbers, names), nice))
}

fn train_position_bare(channels: &[Channel], axis: &str, s: &ScaleSpec, layers: &[PlannedLayer]) -> Result<(PositionScale, bool), Errors> {
    let mut cats: Vec<String> = Vec::new();
    let mut seen = Places::new();
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    let (mut any_num, mut any_text, mut time) = (false, false, false);
    let mut extent = false;
    for l in layers {
        for &ch in channels {
            match l.data.get(ch) {
                Some(Values::Text(v)) => {
                    any_text = true;
                    add_distinct(&mut cats, &mut seen, v);
                }
                Some(vals @ (Values::Num(_) | Values::Time(_))) => {
                    any_num = true;
                    time |= matches!(vals, Values::Time(_));
                    if ch == Channel::YBase || ch == Channel::YTop || (ch == Channel::Y && matches!(l.geometry, Geometry::Bar | Geometry::Area)) {
                        extent = true;
                    }
                    if let Values::Num(v) | Values::Time(v) = vals {
                        if let Some((a, b)) = v.extent() {
                            // Bars on a continuous x: room for the whole first and last bar.
                            let pad = match ch {
                                Channel::X => l.x_step.map_or(0.0, |s| s / 2.0),
                                Channel::Y => l.y_step.map_or(0.0, |s| s / 2.0),
                                _ => 0.0,
                            };
                            lo = lo.min(a - pad);
                            hi = hi.max(b + pad);
                        }
                    }
                }
                None => {}
            }
        }
    }
    let want_category = s.kind == Some(ScaleKind::Category) || (s.kind.is_none() && any_text);
    if want_category {
        if let Some(dom) = &s.domain {
            cats = json_words(dom);
        } else if !any_text && any_num {
            // Numbers asked to be categories: sorted distinct values.
            cats = num_as_text_position(layers, channels);
        }
        if s.order.is_some() || s.top.is_some() {
            order_categories(&mut cats, s, channels, layers);
        }
        // Units run bottom-up; categories on a vertical axis read top-down,
        // in data (or domain) order, so the list is turned.
        if axis == "y" {
            cats.reverse();
        }
        if s.reverse {
            cats.reverse();
        }
        return Ok((PositionScale::category(cats, 0.1), false));
    }
    if any_text && any_num {
        return Err(Diagnostic::error("spec.mixed_axis", format!("the {axis} axis mixes text and numbers across layers"))
            .at_path(format!("scales.{axis}"))
            .into());
    }
    if any_text {
        return Err(Diagnostic::error("spec.text_on_continuous", format!("the {axis} axis has text values but its kind is continuous"))
            .at_path(format!("scales.{axis}.kind"))
            .with_hint("use `\"kind\": \"category\"` or a numeric column")
            .into());
    }
    time |= s.kind == Some(ScaleKind::Time);
    let transform = match s.kind {
        Some(ScaleKind::Log) => {
            let base = s.base.unwrap_or(10.0);
            if !crate::scale::log_base_ok(base) {
                return Err(Diagnostic::error("spec.bad_base", "a log scale's base must be a number from 1.01 to 1,000,000 (such as 10, 2 or 2.718)")
                    .at_path(format!("scales.{axis}.base"))
                    .into());
            }
            Transform::Log { base }
        }
        Some(ScaleKind::Sqrt) => Transform::Sqrt,
        Some(ScaleKind::Symlog) => Transform::Symlog { constant: 1.0 },
        _ => Transform::Linear,
    };
    if let Some((a, b)) = explicit_domain(s, axis)? {
        let (a, b) = if s.reverse { (b, a) } else { (a, b) };
        return Ok((PositionScale::Continuous { lo: a, hi: b, transform, time, step: None, marks: None }, false));
    }
    if !lo.is_finite() {
        lo = if matches!(transform, Transform::Log { .. }) { 1.0 } else { 0.0 };
        hi = if matches!(transform, Transform::Log { .. }) { 10.0 } else { 1.0 };
    }
    let is_log = matches!(transform, Transform::Log { .. });
    if is_log {
        if hi <= 0.0 {
            return Err(Diagnostic::error("spec.log_nonpositive", format!("the {axis} axis is logarithmic but no value is above zero"))
                .at_path(format!("scales.{axis}.kind"))
                .into());
        }
        if lo <= 0.0 {
            // Values at or below zero have no place on a log axis; train on the rest.
            lo = positive_min(layers, channels).unwrap_or(hi / 10.0);
        }
    }
    // Bars and areas start at zero unless told otherwise; log scales never do.
    if s.zero.unwrap_or(extent && !time) && !is_log {
        lo = lo.min(0.0);
        hi = hi.max(0.0);
    }
    if hi == lo {
        // One value: a unit-wide window around it.
        let pad = if lo == 0.0 { 1.0 } else { lo.abs() * 0.1 };
        lo -= pad;
        hi += pad;
    }
    // Nice ends wait for the layout, which knows how many ticks fit.
    // Time scales keep the data's own ends unless asked (`nice: true`):
    // 1958-2001 is not drawn on 1950-2010.
    // Bars on a continuous x already end half a step past the data: their
    // axis is not rounded out further unless asked.
    let bars = (channels.contains(&Channel::X) && layers.iter().any(|l| l.x_step.is_some()))
        || (channels.contains(&Channel::Y) && layers.iter().any(|l| l.y_step.is_some()));
    let nice = s.nice.unwrap_or(!time && !bars);
    if s.reverse {
        std::mem::swap(&mut lo, &mut hi);
    }
    Ok((PositionScale::Continuous { lo, hi, transform, time, step: None, marks: None }, nice))
}

/// `order` and `top` on a category axis: categories sorted by the value
/// drawn for them (a stack's total, else the sum of the layer's values at
/// the category, the largest over layers; ties keep the data's order), and
/// "Other" (see `top`) last.
fn order_categories(cats: &mut Vec<String>, s: &ScaleSpec, channels: &[Channel], layers: &[PlannedLayer]) {
    use crate::spec::CategoryOrder;
    if let Some(order) = s.order {
        let value_ch = if channels.contains(&Channel::X) { Channel::Y } else { Channel::X };
        // Each category's place by hash (in `names`, found by `place`), its value
        // drawn (the largest over layers), and this layer's sum in `mine`.
        let (mut place, mut names) = (Places::new(), Vec::new());
        let mut drawn: Vec<f64> = Vec::new();
        let mut mine: Vec<Option<f64>> = Vec::new();
        for l in layers {
            let (Some(Values::Text(keys)), Some(v)) = (l.data.get(channels[0]), l.data.get(Channel::Total).or(l.data.get(value_ch))) else { continue };
            let stacked = l.data.get(Channel::Total).is_some();
            mine.clear();
            mine.resize(drawn.len(), None);
            for (i, k) in keys.iter().enumerate() {
                let (Some(k), Some(x)) = (k, v.num(i)) else { continue };
                let j = place.push(&mut names, k);
                if j == drawn.len() {
                    drawn.push(f64::NEG_INFINITY);
                    mine.push(None);
                }
                // 0.0 + x as before: a -0.0 sums to +0.0.
                mine[j] = Some(match mine[j] {
                    Some(e) if !stacked => e + x,
                    _ if stacked => x,
                    _ => 0.0 + x,
                });
            }
            for (d, m) in drawn.iter_mut().zip(&mine) {
                if let Some(x) = m {
                    *d = d.max(*x);
                }
            }
        }
        let at = |c: &String| place.get(&names, c).map_or(f64::NEG_INFINITY, |j| drawn[j]);
        match order {
            CategoryOrder::Ascending => crate::sort::by(cats, |a, b| at(a).total_cmp(&at(b))),
            CategoryOrder::Descending => crate::sort::by(cats, |a, b| at(b).total_cmp(&at(a))),
        }
    }
    if s.top.is_some() {
        if let Some(p) = cats.iter().position(|c| c == super::layer::OTHER) {
            let other = cats.remove(p);
            cats.push(other);
        }
    }
}

fn positive_min(layers: &[PlannedLayer], channels: &[Channel]) -> Option<f64> {
    let mut m = f64::INFINITY;
    for l in layers {
        for &ch in channels {
            if let Some(Values::Num(v)) = l.data.get(ch) {
                for x in v.present() {
                    if x > 0.0 {
                        m = m.min(x);
                    }
                }
            }
        }
    }
    m.is_finite().then_some(m)
}

fn num_as_text_position(layers: &[PlannedLayer], channels: &[Channel]) -> Vec<String> {
    let mut v: Vec<f64> = Vec::new();
    for l in layers {
        for &ch in channels {
            if let Some(Values::Num(xs) | Values::Time(xs)) = l.data.get(ch) {
                v.extend(xs.present());
            }
        }
    }
    crate::sort::f64s(&mut v);
    v.dedup();
    let mut out = Vec::with_capacity(v.len());
    for x in v {
        out.push(l_key(x));
    }
    out
}

impl PositionScale {
    /// Unit position of row `i` of a plan column. (Here rather than in
    /// `scale`, so the scale library knows nothing of the plan's columns.)
    pub fn unit(&self, values: &Values, i: usize) -> Option<f64> {
        match (self, values) {
            // Numbers on a category scale are found by their text (as `Values::key` writes it).
            (PositionScale::Category { .. }, Values::Num(v) | Values::Time(v)) => v.get(i).and_then(|x| self.unit_cat(&crate::format::float::plain(x))),
            (_, Values::Num(v) | Values::Time(v)) => v.get(i).and_then(|x| self.unit_num(x)),
            (_, Values::Text(v)) => v[i].as_deref().and_then(|s| self.unit_cat(s)),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plan::LayerData;
    use crate::spec::{Arrange, Style};

    fn layer(geometry: Geometry, xs: Vec<f64>, ys: Vec<f64>) -> PlannedLayer {
        let mut data = LayerData { len: xs.len(), ..Default::default() };
        data.channels.insert(Channel::X, Values::Num(xs.into()));
        data.channels.insert(Channel::Y, Values::Num(ys.into()));
        PlannedLayer { index: 0, geometry, arrange: Arrange::None, style: Style::default(), data, x_step: None, y_step: None, turned: false, label_ends: false }
    }

    fn spec(scales: &str) -> Spec {
        crate::parse_spec(&format!(r#"{{ "layers": [ {{ "draw": "point" }} ], "scales": {scales} }}"#)).unwrap()
    }

    #[test]
    fn palettes_by_name() {
        let mut l = layer(Geometry::Cell, vec![1.0, 2.0, 3.0], vec![1.0, 2.0, 3.0]);
        l.data.channels.insert(Channel::Color, Values::Num(vec![10.0, 20.0, 30.0].into()));
        let s = train(&spec(r#"{ "color": { "palette": "loam" } }"#), std::slice::from_ref(&l)).unwrap();
        let c = l.data.get(Channel::Color).unwrap();
        assert_eq!(s.color_of(c, 0), Some(color::LOAM.at(0.0)));
        assert_eq!(s.color_of(c, 2), Some(color::LOAM.at(1.0)));
        // Numbers spanning zero default to the diverging ramp, centred on zero.
        l.data.channels.insert(Channel::Color, Values::Num(vec![-10.0, 0.0, 30.0].into()));
        let s = train(&spec("{}"), std::slice::from_ref(&l)).unwrap();
        assert_eq!(s.color_of(l.data.get(Channel::Color).unwrap(), 1), Some(color::ESTUARY.at(0.5)));
        // Categories take the default palette in order of first appearance.
        l.data.channels.insert(Channel::Color, Values::Text(vec![Some("b".into()), Some("a".into()), Some("b".into())]));
        let s = train(&spec("{}"), std::slice::from_ref(&l)).unwrap();
        let c = l.data.get(Channel::Color).unwrap();
        assert_eq!(s.color_of(c, 0).as_deref(), Some(color::HARBOUR[0]));
        assert_eq!(s.color_of(c, 1).as_deref(), Some(color::HARBOUR[1]));
    }

    /// Thin marks on a sequential ramp keep 3:1 against the background
    /// (WCAG 2.1 SC 1.4.11, non-text contrast) in both themes; filled
    /// marks use the whole ramp.
    #[test]
    fn thin_marks_stand_out_from_the_background() {
        for (theme, bg) in [("light", "#ffffff"), ("dark", "#16191d")] {
            let sp = crate::parse_spec(&format!(r#"{{ "layers": [ {{ "draw": "point" }} ], "theme": "{theme}" }}"#)).unwrap();
            let mut l = layer(Geometry::Point, vec![1.0, 2.0, 3.0], vec![1.0, 2.0, 3.0]);
            l.data.channels.insert(Channel::Color, Values::Num(vec![0.0, 20.0, 39.0].into()));
            let s = train(&sp, std::slice::from_ref(&l)).unwrap();
            let c = l.data.get(Channel::Color).unwrap();
            for i in 0..3 {
                let k = color::contrast(&s.color_of(c, i).unwrap(), bg).unwrap();
                assert!(k >= 3.0, "{theme}: row {i} has contrast {k}");
            }
            assert_ne!(s.color_of(c, 0), s.color_of(c, 2));
            // The same colours filling cells run the whole ramp.
            l.geometry = Geometry::Cell;
            let s = train(&sp, std::slice::from_ref(&l)).unwrap();
            assert_eq!((s.color_of(c, 0), s.color_of(c, 2)), (Some(color::LAGOON.at(0.0)), Some(color::LAGOON.at(1.0))));
        }
    }

    #[test]
    fn domains_span_every_layer() {
        let layers = [layer(Geometry::Point, vec![0.0, 5.0], vec![10.0, 20.0]), layer(Geometry::Line, vec![3.0, 12.0], vec![15.0, 42.0])];
        let s = train(&spec("{}"), &layers).unwrap();
        assert_eq!(s.x.domain(), Some((0.0, 12.0)));
        assert_eq!(s.y.domain(), Some((10.0, 42.0)));
        assert!(s.x_nice && s.y_nice);
    }

    #[test]
    fn bars_start_at_zero_unless_told() {
        let layers = [layer(Geometry::Bar, vec![1.0, 2.0], vec![30.0, 45.0])];
        assert_eq!(train(&spec("{}"), &layers).unwrap().y.domain(), Some((0.0, 45.0)));
        let s = train(&spec(r#"{ "y": { "zero": false } }"#), &layers).unwrap();
        assert_eq!(s.y.domain(), Some((30.0, 45.0)));
    }

    #[test]
    fn explicit_reverse_and_log() {
        let layers = [layer(Geometry::Point, vec![-1.0, 0.0, 5.0, 500.0], vec![1.0, 2.0, 3.0, 4.0])];
        let s = train(&spec(r#"{ "x": { "kind": "log" }, "y": { "domain": [0, 10], "reverse": true } }"#), &layers).unwrap();
        // Values at or below zero have no place on a log axis.
        assert_eq!(s.x.domain(), Some((5.0, 500.0)));
        assert_eq!(s.y.domain(), Some((10.0, 0.0)));
        assert!(!s.y_nice);
        let dates = train(&spec(r#"{ "x": { "kind": "time", "domain": ["2024-01-01", "2024-12-31"] } }"#), &layers).unwrap();
        assert!(dates.x.is_time());
        assert_eq!(dates.x.domain(), Some((19723.0 * 86_400_000.0, 20088.0 * 86_400_000.0)));
        assert!(train(&spec(r#"{ "x": { "kind": "log", "base": 1 } }"#), &layers).is_err());
        assert!(train(&spec(r#"{ "color": { "palette": "no-such-name" } }"#), &layers).is_err());
    }
}
