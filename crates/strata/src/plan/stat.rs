//! Apply a layer's statistic: rows in, rows out.
//!
//! Every statistic works within groups: the rows sharing the values of the
//! layer's discrete channels (`color`, `group`, `shape` when they hold text)
//! and its panel (`panel`, or the grid cell `panel_row` x `panel_col`). Summaries and counts also group by `x`. Each
//! output row carries its group's values, so colours and panels follow.
//!
//! Output channels (see [`super`] for the list): histograms give `x`/`x_end`
//! bin edges, `y` and `count`; intervals give `y_low`/`y_high` (and, on
//! `range`/`segment`/`band` layers, `y`/`y_end` as the bounds with the value
//! in `estimate`); box plots give one row per box (`part` = `box`) with
//! `y`/`y_end` the whiskers and `q1`, `median`, `q3`, plus one row per
//! outlier (`part` = `outlier`).

use super::{LayerData, Values};
use crate::channel::{Channel, ChannelMap};
use crate::error::{Diagnostic, Errors};
use crate::spec::defaults;
use crate::spec::{
    Bandwidth, BandwidthRule, BinRule, BinSpec, BinUnit, FitWord, Geometry, IntervalWord, Layer, Robust, Stat, StatObject, SummaryWord, WindowAlign,
    WindowSummary,
};
use crate::stat::{self, bin, density, fit, summary, tukey, window};

/// Discrete channels a statistic groups by (when they hold text), in order.
const GROUP_CHANNELS: [Channel; 6] = [Channel::Color, Channel::Group, Channel::Shape, Channel::Panel, Channel::PanelRow, Channel::PanelCol];

/// A scatter with more points than this becomes 2-D binned tiles unless the
/// layer's style sets `every_point`.
pub const SCATTER_BIN_THRESHOLD: usize = 50_000;
/// Grid of the 2-D binned scatter.
const SCATTER_COLUMNS: usize = 120;
const SCATTER_ROWS: usize = 80;

/// A layer after its statistic: the rows, the geometry to draw them with
/// (a crowded scatter becomes tiles) and any warnings.
pub struct Stated {
    pub data: LayerData,
    pub geometry: Geometry,
    pub warnings: Vec<Diagnostic>,
}

fn err(index: usize, key: &str, code: &str, msg: impl Into<String>) -> Errors {
    Diagnostic::error(code, msg).at_path(format!("layers[{index}].{key}")).into()
}

/// How a `density` layer meets a count histogram of the same `x` in its
/// chart (issue 12 item 11: the density drew flat along the count axis).
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum OnCounts {
    /// Scale the density to counts: density x n x `width`, n the rows of
    /// the density's group, `width` the histogram's bin width.
    Scale(f64),
    /// The histogram's bins differ in width, or it sums a `y` rather than
    /// counting: no single factor fits, so warn (layer index of the histogram).
    Warn(usize),
}

/// The other layer, if any, that a `density` layer `index` draws over: a
/// `bin` histogram of counts (not `"density": true`) on the same `x`.
pub fn count_histogram_of(layers: &[Layer], index: usize) -> Option<usize> {
    let l = &layers[index];
    let Stat::Object(o) = &l.stat else { return None };
    o.density.as_ref()?;
    let x = l.x.as_ref()?;
    layers.iter().enumerate().position(|(j, h)| {
        j != index && h.x.as_ref() == Some(x) && matches!(&h.stat, Stat::Object(ho) if ho.bin.as_ref().is_some_and(|b| b.density != Some(true)))
    })
}

/// What a density over histogram `hist` (its spec and its rows after the
/// statistic) should do.
pub fn on_counts(hist_index: usize, hist: &Layer, stated: &LayerData) -> OnCounts {
    if hist.y.is_some() {
        return OnCounts::Warn(hist_index);
    }
    let (a, b) = if stated.get(Channel::XEnd).is_some() { (Channel::X, Channel::XEnd) } else { (Channel::BinStart, Channel::BinEnd) };
    let (Some(a), Some(b)) = (stated.get(a), stated.get(b)) else { return OnCounts::Warn(hist_index) };
    let mut widths: Vec<f64> = Vec::new();
    for i in 0..stated.len {
        if let (Some(hi), Some(lo)) = (b.num(i), a.num(i)) {
            let w = hi - lo;
            if w.is_finite() && w > 0.0 {
                widths.push(w);
            }
        }
    }
    let (lo, hi) = widths.iter().fold((f64::INFINITY, 0.0f64), |(lo, hi), w| (lo.min(*w), hi.max(*w)));
    if widths.is_empty() || hi - lo > 1e-9 * hi {
        return OnCounts::Warn(hist_index);
    }
    OnCounts::Scale(widths[0])
}

/// Run a layer's statistic; `on_counts` says how a density meets a count
/// histogram in its chart ([`count_histogram_of`]).
pub fn apply(index: usize, layer: &Layer, data: LayerData, on_counts: Option<OnCounts>) -> Result<Stated, Errors> {
    if let (Some(OnCounts::Warn(h)), Stat::Object(o)) = (on_counts, &layer.stat) {
        if o.density.is_some() {
            let mut s = apply(index, layer, data, None)?;
            s.warnings.push(
                Diagnostic::warning(
                    "stat.density_on_counts",
                    format!(
                        "layer {}'s density is drawn on layer {}'s count axis, whose bins are uneven or weighted, so the curve cannot be scaled to them and lies flat",
                        index + 1,
                        h + 1
                    ),
                )
                .at_path(format!("layers[{index}].stat.density"))
                .with_hint(format!("give layer {}'s bin `\"density\": true`, so bars and curve share the density axis", h + 1)),
            );
            return Ok(s);
        }
    }
    let scale = match on_counts {
        Some(OnCounts::Scale(w)) => Some(w),
        _ => None,
    };
    let mut geometry = layer.draw;
    let mut warnings = Vec::new();
    let data = match &layer.stat {
        Stat::None => {
            if layer.draw == Geometry::Point && layer.style.every_point != Some(true) {
                let n = count_xy(&data);
                if n > SCATTER_BIN_THRESHOLD {
                    if let Some(binned) = scatter_tiles(&data) {
                        geometry = Geometry::Cell;
                        warnings.push(
                            Diagnostic::warning(
                                "stat.scatter_binned",
                                format!(
                                    "layer {} has {n} points, too many to draw one by one; they are shown as {}x{} tiles shaded by count",
                                    index + 1,
                                    SCATTER_COLUMNS,
                                    SCATTER_ROWS
                                ),
                            )
                            .at_path(format!("layers[{index}]"))
                            .with_hint("set `\"style\": {\"every_point\": true}` to draw every point"),
                        );
                        return Ok(Stated { data: binned, geometry, warnings });
                    }
                }
            }
            data
        }
        Stat::Count => count(data),
        Stat::Box if !FITTED => return Err(full_only(index, "stat", "box")),
        Stat::Box => boxes(index, data)?,
        Stat::Object(o) => object(index, layer, o, data, scale)?,
    };
    Ok(Stated { data, geometry, warnings })
}

/// Whether this build has the full engine's statistics (the
/// `fitted_stats` feature, part of `full`): `fit`, `density`, `window`,
/// `interval` and box plots. The page's core engine has counts, bins and
/// summaries only; it refuses the rest (spec::needs_full) and, without
/// these, leaves their code out of its WebAssembly.
const FITTED: bool = cfg!(feature = "fitted_stats");

/// The core engine's error for a statistic only the full engine has.
fn full_only(index: usize, key: &str, word: &str) -> Errors {
    crate::needs_full_engine(&format!("layers[{index}].{key}"), word).into()
}

fn object(index: usize, layer: &Layer, o: &StatObject, data: LayerData, count_width: Option<f64>) -> Result<LayerData, Errors> {
    if let Some(b) = &o.bin {
        return binned(index, layer, b, data);
    }
    if o.interval.is_some() && !FITTED {
        return Err(full_only(index, "stat.interval", "interval"));
    }
    if let Some(word) = o.summary {
        return summarise(index, layer, o, word, data);
    }
    if let Some(kind) = o.fit {
        return if FITTED { fitted(index, layer, o, kind, data) } else { Err(full_only(index, "stat.fit", "fit")) };
    }
    if let Some(d) = &o.density {
        return if FITTED { densities(index, d, data, count_width) } else { Err(full_only(index, "stat.density", "density")) };
    }
    if let Some(w) = &o.window {
        return if FITTED { windowed(index, w, data) } else { Err(full_only(index, "stat.window", "window")) };
    }
    Err(err(index, "stat", "spec.unsupported", "this statistic is not supported"))
}

// ------------------------------------------------------------ grouping

/// The group channels present with text values.
fn group_keys(data: &LayerData) -> Vec<Channel> {
    let mut keys = Vec::new();
    for c in GROUP_CHANNELS {
        if data.get(c).is_some_and(Values::is_discrete) {
            keys.push(c);
        }
    }
    keys
}

/// `x` (when mapped) and the discrete group channels: what count, summary
/// and box statistics group by.
fn x_and_group_keys(data: &LayerData) -> Vec<Channel> {
    let mut keys = if data.get(Channel::X).is_some() { vec![Channel::X] } else { vec![] };
    keys.extend(group_keys(data));
    keys
}

/// Rows grouped by the given channels, in order of first appearance.
fn group_rows(data: &LayerData, keys: &[Channel]) -> Groups {
    let cols: Vec<&Values> = keys.iter().map(|k| &data.channels[k]).collect();
    Groups(crate::index::group_rows(data.len, &|i| cols.iter().map(|c| c.key(i)).collect()))
}

/// Groups, each its key and rows, in order of first appearance.
struct Groups(Vec<(Vec<Option<String>>, Vec<usize>)>);

impl Groups {
    fn values(&self) -> impl Iterator<Item = &Vec<usize>> {
        self.0.iter().map(|g| &g.1)
    }
}

impl<'a> IntoIterator for &'a Groups {
    type Item = &'a (Vec<Option<String>>, Vec<usize>);
    type IntoIter = std::slice::Iter<'a, (Vec<Option<String>>, Vec<usize>)>;
    fn into_iter(self) -> Self::IntoIter {
        self.0.iter()
    }
}

/// Output rows under construction: for each, the input row whose group
/// channels it copies.
struct Out {
    from: Vec<usize>,
    num: ChannelMap<Vec<Option<f64>>>,
    text: ChannelMap<Vec<Option<String>>>,
}

impl Out {
    fn new() -> Self {
        Out { from: vec![], num: ChannelMap::new(), text: ChannelMap::new() }
    }
    fn row(&mut self, from: usize, nums: &[(Channel, Option<f64>)]) {
        let n = self.from.len();
        self.from.push(from);
        for (k, v) in nums {
            let col = self.num.get_or_default(*k);
            col.resize(n, None);
            col.push(*v);
        }
    }
    fn text(&mut self, key: Channel, v: &str) {
        let n = self.from.len();
        let col = self.text.get_or_default(key);
        col.resize(n - 1, None);
        col.push(Some(v.to_string()));
    }
    /// Assemble: group channels copied from the source rows, then the new
    /// columns; `time` names the new columns in time units.
    fn finish(self, src: &LayerData, keys: &[Channel], time: &[Channel], names: &[(Channel, String)]) -> LayerData {
        let n = self.from.len();
        let mut out = LayerData { len: n, ..Default::default() };
        for k in keys {
            out.channels.insert(*k, src.channels[k].take(&self.from));
            if let Some(nm) = src.names.get(k) {
                out.names.insert(*k, nm.clone());
            }
        }
        for (k, mut v) in self.num {
            v.resize(n, None);
            out.channels.insert(k, if time.contains(&k) { Values::Time(v.into()) } else { Values::Num(v.into()) });
        }
        for (k, mut v) in self.text {
            v.resize(n, None);
            out.channels.insert(k, Values::Text(v));
        }
        for (k, nm) in names {
            out.names.insert(*k, nm.clone());
        }
        out
    }
}

fn name_of(data: &LayerData, ch: Channel) -> String {
    data.names.get(&ch).cloned().unwrap_or_else(|| ch.to_string())
}

fn nums_of(v: &Values, rows: &[usize]) -> Vec<f64> {
    // (A plain loop: no iterator code per caller.)
    let mut out = Vec::with_capacity(rows.len());
    for &i in rows {
        if let Some(x) = v.num(i) {
            out.push(x);
        }
    }
    out
}

fn need<'a>(index: usize, data: &'a LayerData, ch: Channel, what: &str) -> Result<&'a Values, Errors> {
    data.get(ch).ok_or_else(|| err(index, ch.name(), "spec.missing_channel", format!("{what} needs a `{ch}` channel")))
}

fn need_numeric<'a>(index: usize, data: &'a LayerData, ch: Channel, what: &str) -> Result<&'a Values, Errors> {
    let v = need(index, data, ch, what)?;
    if v.is_discrete() {
        return Err(Diagnostic::error("stat.not_numeric", format!("{what} needs numbers or dates in `{ch}`, but `{}` holds text", name_of(data, ch)))
            .at_path(format!("layers[{index}].{ch}"))
            .with_hint(format!("choose a numeric column for `{ch}`, or give it `\"as\": \"number\"`"))
            .into());
    }
    Ok(v)
}

// ------------------------------------------------------------ count and summary

fn count(data: LayerData) -> LayerData {
    let keys = x_and_group_keys(&data);
    let groups = group_rows(&data, &keys);
    let mut out = Out::new();
    for (key, rows) in &groups {
        if data.get(Channel::X).is_some() && key[0].is_none() {
            continue; // rows with a missing x are not counted
        }
        out.row(rows[0], &[(Channel::Y, Some(rows.len() as f64))]);
    }
    out.finish(&data, &keys, &[], &[(Channel::Y, "count".to_string())])
}

/// The statistic a summary word names.
fn summary_of(word: SummaryWord, p: Option<f64>) -> summary::Summary {
    match word {
        SummaryWord::Mean => summary::Summary::Mean,
        SummaryWord::Median => summary::Summary::Median,
        SummaryWord::Sum => summary::Summary::Sum,
        SummaryWord::Min => summary::Summary::Min,
        SummaryWord::Max => summary::Summary::Max,
        SummaryWord::Count => summary::Summary::Count,
        SummaryWord::Quantile => summary::Summary::Quantile(p.unwrap_or(defaults::QUANTILE_P)),
        SummaryWord::StandardDeviation => summary::Summary::StandardDeviation,
    }
}

/// The interval an interval word names.
fn interval_of(word: IntervalWord) -> summary::Interval {
    match word {
        IntervalWord::Ci95 => summary::Interval::Confidence(0.95),
        IntervalWord::Ci90 => summary::Interval::Confidence(0.90),
        IntervalWord::Ci99 => summary::Interval::Confidence(0.99),
        IntervalWord::Ci80 => summary::Interval::Confidence(0.80),
        IntervalWord::StandardError => summary::Interval::StandardError,
        IntervalWord::MinMax => summary::Interval::MinMax,
        IntervalWord::Wilson => summary::Interval::Wilson(0.95),
    }
}

fn summarise(index: usize, layer: &Layer, o: &StatObject, word: SummaryWord, data: LayerData) -> Result<LayerData, Errors> {
    let name = word.word();
    let s = summary_of(word, o.p);
    if let Some(p) = o.p {
        if !(0.0..=1.0).contains(&p) {
            return Err(err(index, "stat.p", "stat.bad_option", "`p` must be between 0 and 1"));
        }
    }
    let interval = o.interval.filter(|_| FITTED).map(interval_of);
    let mut data = data;
    booleans_as_numbers(&mut data, Channel::Y);
    let y = need_numeric(index, &data, Channel::Y, &format!("a `{name}` summary"))?;
    let keys = x_and_group_keys(&data);
    let groups = group_rows(&data, &keys);
    let bounds_in_y = matches!(layer.draw, Geometry::Range | Geometry::Segment | Geometry::Band) && interval.is_some();
    let mut out = Out::new();
    for (key, rows) in &groups {
        if data.get(Channel::X).is_some() && key[0].is_none() {
            continue;
        }
        let ys = nums_of(y, rows);
        let v = s.of(&ys);
        let iv = interval.and_then(|iv| iv.of(&ys));
        let (lo, hi) = (iv.map(|b| b.0), iv.map(|b| b.1));
        if bounds_in_y {
            out.row(rows[0], &[(Channel::Y, lo), (Channel::YEnd, hi), (Channel::Estimate, v), (Channel::Count, Some(ys.len() as f64))]);
        } else if interval.is_some() {
            out.row(rows[0], &[(Channel::Y, v), (Channel::YLow, lo), (Channel::YHigh, hi), (Channel::Count, Some(ys.len() as f64))]);
        } else {
            out.row(rows[0], &[(Channel::Y, v)]);
        }
    }
    let time = if y_is_time(y) && !matches!(s, summary::Summary::Count | summary::Summary::StandardDeviation) {
        vec![Channel::Y, Channel::YEnd, Channel::YLow, Channel::YHigh, Channel::Estimate]
    } else {
        vec![]
    };
    let title = format!("{name} of {}", name_of(&data, Channel::Y));
    Ok(out.finish(&data, &keys, &time, &[(Channel::Y, title)]))
}

/// A column of `true`/`false` becomes 1/0, so that a mean is a proportion
/// (and a Wilson interval applies).
fn booleans_as_numbers(data: &mut LayerData, ch: Channel) {
    if let Some(Values::Text(v)) = data.get(ch) {
        if v.iter().flatten().all(|s| s == "true" || s == "false") && v.iter().any(Option::is_some) {
            let mut nums = Vec::with_capacity(v.len());
            for s in v {
                nums.push(match s.as_deref() {
                    Some("true") => 1.0,
                    Some(_) => 0.0,
                    None => f64::NAN,
                });
            }
            data.channels.insert(ch, Values::Num(nums.into()));
        }
    }
}

fn y_is_time(v: &Values) -> bool {
    matches!(v, Values::Time(_))
}

// ------------------------------------------------------------ bin

fn binned(index: usize, layer: &Layer, b: &BinSpec, data: LayerData) -> Result<LayerData, Errors> {
    let x = need_numeric(index, &data, Channel::X, "a `bin` statistic")?;
    let is_time = matches!(x, Values::Time(_));
    let mut xs = Vec::with_capacity(data.len);
    for i in 0..data.len {
        if let Some(v) = x.num(i) {
            xs.push(v);
        }
    }
    let edges = bin_edges(index, b, &xs, is_time)?;
    let keys = group_keys(&data);
    let groups = group_rows(&data, &keys);
    let weights = data.get(Channel::Y).filter(|v| !v.is_discrete());
    let as_density = b.density == Some(true);
    let edge_channels = matches!(layer.draw, Geometry::Bar | Geometry::Cell);
    let mut out = Out::new();
    for rows in groups.values() {
        let gx = nums_of(x, rows);
        let counts = bin::histogram(&gx, &edges);
        let sums = weights.map(|w| {
            let (mut px, mut pw) = (vec![], vec![]);
            for i in rows {
                if let (Some(a), Some(b)) = (x.num(*i), w.num(*i)) {
                    px.push(a);
                    pw.push(b);
                }
            }
            bin::histogram_weighted(&px, &pw, &edges)
        });
        let n: f64 = counts.iter().sum();
        for k in 0..counts.len() {
            let (a, e) = (edges[k], edges[k + 1]);
            let mut height = match &sums {
                Some(s) => s[k],
                None => counts[k],
            };
            if as_density {
                let total = sums.as_ref().map(|s| s.iter().sum()).unwrap_or(n);
                height = if total != 0.0 { height / (total * (e - a)) } else { 0.0 };
            }
            if edge_channels {
                out.row(rows[0], &[(Channel::X, Some(a)), (Channel::XEnd, Some(e)), (Channel::Y, Some(height)), (Channel::Count, Some(counts[k]))]);
            } else {
                out.row(
                    rows[0],
                    &[
                        (Channel::X, Some(0.5 * (a + e))),
                        (Channel::BinStart, Some(a)),
                        (Channel::BinEnd, Some(e)),
                        (Channel::Y, Some(height)),
                        (Channel::Count, Some(counts[k])),
                    ],
                );
            }
        }
    }
    let time: &[Channel] = if is_time { &[Channel::X, Channel::XEnd, Channel::BinStart, Channel::BinEnd] } else { &[] };
    let yname = match (weights.is_some(), as_density) {
        (_, true) => "density".to_string(),
        (true, false) => format!("sum of {}", name_of(&data, Channel::Y)),
        (false, false) => "count".to_string(),
    };
    Ok(out.finish(&data, &keys, time, &[(Channel::X, name_of(&data, Channel::X)), (Channel::Y, yname)]))
}

fn bin_edges(index: usize, b: &BinSpec, xs: &[f64], is_time: bool) -> Result<Vec<f64>, Errors> {
    if xs.is_empty() {
        return Ok(vec![]);
    }
    if let Some(w) = b.width {
        if !(w > 0.0 && w.is_finite()) {
            return Err(err(index, "stat.bin.width", "stat.bad_option", "a bin `width` must be a positive number"));
        }
    }
    if b.count == Some(0) {
        return Err(err(index, "stat.bin.count", "stat.bad_option", "a bin `count` must be at least 1"));
    }
    let rule = match b.rule.unwrap_or(defaults::BIN_RULE) {
        BinRule::Fd => bin::Rule::Fd,
        BinRule::Scott => bin::Rule::Scott,
        BinRule::Sturges => bin::Rule::Sturges,
        BinRule::Sqrt => bin::Rule::Sqrt,
        BinRule::Rice => bin::Rule::Rice,
        BinRule::Doane => bin::Rule::Doane,
    };
    let unit = b.unit.map(|u| match u {
        BinUnit::Day => bin::CalendarUnit::Day,
        BinUnit::Week => bin::CalendarUnit::Week,
        BinUnit::Month => bin::CalendarUnit::Month,
        BinUnit::Quarter => bin::CalendarUnit::Quarter,
        BinUnit::Year => bin::CalendarUnit::Year,
    });
    if unit.is_some() && !is_time {
        return Err(err(index, "stat.bin.unit", "stat.bad_option", "a calendar `unit` bins dates; this `x` holds numbers"));
    }
    if is_time && b.width.is_none() && b.count.is_none() {
        // Dates: calendar bins, the unit given or the one nearest the rule's width.
        let (lo, hi) = bin::min_max(xs).unwrap();
        let unit = unit.unwrap_or_else(|| {
            let w = bin::rule_width(rule, xs);
            bin::CalendarUnit::nearest(if w > 0.0 { w / 86_400_000.0 } else { 1.0 })
        });
        return Ok(bin::calendar_edges(lo, hi, unit));
    }
    let boundary = b.boundary;
    // Too many bins is refused where it was asked for, not truncated.
    let too_many = |n: f64, key: &str| {
        (n > bin::MAX_BINS as f64).then(|| {
            Errors::from(
                Diagnostic::error(
                    "stat.too_many_bins",
                    format!("this would make {} bins, more than the {} a histogram may have", crate::format::float::fixed(n, 0), bin::MAX_BINS),
                )
                .at_path(format!("layers[{index}].stat.bin.{key}"))
                .with_hint("give a larger `width`, a smaller `count`, or a `rule`"),
            )
        })
    };
    if let Some(c) = b.count {
        if let Some(e) = too_many(c as f64, "count") {
            return Err(e);
        }
    }
    let width_for_count = |c: u32| {
        let (lo, hi) = bin::min_max(xs).unwrap_or((0.0, 0.0));
        if hi > lo {
            (hi - lo) / c as f64
        } else {
            1.0
        }
    };
    let asked_width = b.width.map(|w| (w, "width")).or_else(|| b.count.filter(|_| boundary.is_some()).map(|c| (width_for_count(c), "count")));
    if let Some((w, key)) = asked_width {
        if let Some(e) = too_many(bin::width_bin_count(xs, w, boundary.unwrap_or(0.0)), key) {
            return Err(e);
        }
    }
    Ok(match (b.width, b.count) {
        (Some(w), _) => bin::edges_by_width(xs, w, boundary.unwrap_or(0.0)),
        (None, Some(c)) => match boundary {
            None => bin::edges_by_count(xs, c as usize),
            Some(bd) => bin::edges_by_width(xs, width_for_count(c), bd),
        },
        (None, None) => {
            let e = bin::edges_by_rule(xs, rule);
            match boundary {
                None => e,
                Some(bd) => bin::edges_by_width(xs, e[1] - e[0], bd),
            }
        }
    })
}

// ------------------------------------------------------------ fit

const FIT_POINTS: usize = 80;

fn fitted(index: usize, layer: &Layer, o: &StatObject, kind: FitWord, data: LayerData) -> Result<LayerData, Errors> {
    let x = need_numeric(index, &data, Channel::X, "a fit")?;
    let y = need_numeric(index, &data, Channel::Y, "a fit")?;
    let is_time = matches!(x, Values::Time(_));
    let level = o.band.unwrap_or(defaults::FIT_BAND);
    if !(0.0..1.0).contains(&level) {
        return Err(err(index, "stat.band", "stat.bad_option", "`band` is a confidence level between 0 and 1, such as 0.95 (0 for no band)"));
    }
    let loess_opts = match kind {
        FitWord::Linear => None,
        FitWord::Loess => {
            let span = o.span.unwrap_or(defaults::LOESS_SPAN);
            if !(span > 0.0 && span <= 1.0) {
                return Err(err(index, "stat.span", "stat.bad_option", "`span` is the fraction of points in each local fit, between 0 and 1"));
            }
            let degree = o.degree.unwrap_or(defaults::LOESS_DEGREE);
            if !(1..=2).contains(&degree) {
                return Err(err(index, "stat.degree", "stat.bad_option", "`degree` is 1 (local lines) or 2 (local parabolas)"));
            }
            let iterations = match o.robust {
                None | Some(Robust::Flag(false)) => 0,
                Some(Robust::Flag(true)) => defaults::LOESS_ROBUST_ITERATIONS,
                Some(Robust::Iterations(n)) if n <= 20 => n as u32,
                Some(Robust::Iterations(_)) => {
                    return Err(err(index, "stat.robust", "stat.bad_option", "`robust` is true, false or a number of iterations (0 to 20)"))
                }
            };
            Some(fit::LoessOptions { span, degree, iterations, delta: 0.0 })
        }
    };
    let keys = group_keys(&data);
    let groups = group_rows(&data, &keys);
    let bounds_in_y = layer.draw == Geometry::Band;
    let with_band = level > 0.0 && loess_opts.is_none();
    let mut out = Out::new();
    for rows in groups.values() {
        let mut pts: Vec<(f64, f64)> = Vec::with_capacity(rows.len());
        for &i in rows {
            if let (Some(a), Some(b)) = (x.num(i), y.num(i)) {
                pts.push((a, b));
            }
        }
        crate::sort::by_x(&mut pts);
        let (xs, ys): (Vec<f64>, Vec<f64>) = pts.into_iter().unzip();
        if xs.len() < 2 || xs[0] == xs[xs.len() - 1] {
            continue;
        }
        let at = density::grid(xs[0], xs[xs.len() - 1], FIT_POINTS);
        match &loess_opts {
            None => {
                let Some(l) = stat::fit::linear(&xs, &ys) else { continue };
                for &a in &at {
                    let band = if with_band { l.band(a, level) } else { None };
                    let (lo, hi) = (band.map(|b| b.0), band.map(|b| b.1));
                    if bounds_in_y {
                        out.row(rows[0], &[(Channel::X, Some(a)), (Channel::Y, lo), (Channel::YEnd, hi), (Channel::Fitted, Some(l.predict(a)))]);
                    } else {
                        out.row(rows[0], &[(Channel::X, Some(a)), (Channel::Y, Some(l.predict(a))), (Channel::YLow, lo), (Channel::YHigh, hi)]);
                    }
                }
            }
            Some(opts) => {
                // Large inputs interpolate within 1 % of the x range between
                // fitted points while computing robustness weights (Cleveland
                // 1979, section 4: common practice for large n).
                let mut opts = *opts;
                if xs.len() > 1000 {
                    opts.delta = 0.01 * (xs[xs.len() - 1] - xs[0]);
                }
                let robust = if opts.iterations > 0 { fit::loess_fit(&xs, &ys, &opts).1 } else { vec![1.0; xs.len()] };
                // The band of the local regression (stat/fit.rs, checked
                // against netlib's loess); none below three points.
                let band = if level > 0.0 { fit::loess_band(&xs, &ys, &robust, &opts, &at, level) } else { None };
                let fitted = match &band {
                    Some(b) => b.fit.clone(),
                    None => fit::loess_at(&xs, &ys, &robust, &opts, &at),
                };
                let ok = |v: f64| v.is_finite().then_some(v);
                for (j, (a, f)) in at.iter().zip(fitted).enumerate() {
                    let f = ok(f);
                    let (lo, hi) = match &band {
                        Some(b) => (ok(b.low[j]), ok(b.high[j])),
                        None => (None, None),
                    };
                    if bounds_in_y {
                        let (lo, hi) = if band.is_some() { (lo, hi) } else { (f, f) };
                        out.row(rows[0], &[(Channel::X, Some(*a)), (Channel::Y, lo), (Channel::YEnd, hi), (Channel::Fitted, f)]);
                    } else if band.is_some() {
                        out.row(rows[0], &[(Channel::X, Some(*a)), (Channel::Y, f), (Channel::YLow, lo), (Channel::YHigh, hi)]);
                    } else {
                        out.row(rows[0], &[(Channel::X, Some(*a)), (Channel::Y, f)]);
                    }
                }
            }
        }
    }
    let time: &[Channel] = if is_time { &[Channel::X] } else { &[] };
    Ok(out.finish(&data, &keys, time, &[(Channel::X, name_of(&data, Channel::X)), (Channel::Y, name_of(&data, Channel::Y))]))
}

// ------------------------------------------------------------ density

/// A kernel density per group; with `count_width`, scaled to a count
/// histogram's axis: density x n x width (n the group's finite x values),
/// the expected count in a bin of that width.
fn densities(index: usize, d: &crate::spec::DensitySpec, data: LayerData, count_width: Option<f64>) -> Result<LayerData, Errors> {
    let x = need_numeric(index, &data, Channel::X, "a density")?;
    let rule = match &d.bandwidth.unwrap_or(Bandwidth::Rule(defaults::BANDWIDTH)) {
        Bandwidth::Rule(BandwidthRule::Scott) => density::Bandwidth::Scott,
        Bandwidth::Rule(BandwidthRule::Silverman) => density::Bandwidth::Silverman,
        Bandwidth::Width(h) => match Some(*h) {
            Some(h) if h > 0.0 && h.is_finite() => density::Bandwidth::Fixed(h),
            _ => {
                return Err(Diagnostic::error("stat.bad_option", format!("unknown bandwidth {}", crate::format::float::Plain(*h)))
                    .at_path(format!("layers[{index}].stat.density.bandwidth"))
                    .with_hint("use \"scott\", \"silverman\" or a positive number in the units of x")
                    .into())
            }
        },
    };
    let m = d.grid.unwrap_or(defaults::DENSITY_GRID).clamp(2, 10_000) as usize;
    let keys = group_keys(&data);
    let groups = group_rows(&data, &keys);
    // One grid for every group, so that densities stack and compare.
    let mut per_group = Vec::new();
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    for rows in groups.values() {
        let xs = nums_of(x, rows);
        let h = density::bandwidth(&xs, rule);
        if let (Some(h), Some((a, b))) = (h, bin::min_max(&xs)) {
            lo = lo.min(a - 3.0 * h);
            hi = hi.max(b + 3.0 * h);
        }
        per_group.push((rows, xs, h));
    }
    let mut out = Out::new();
    if lo.is_finite() {
        let grid = density::grid(lo, hi, m);
        for (rows, xs, h) in &per_group {
            let Some(h) = *h else { continue };
            let dens = if xs.len().saturating_mul(m) > 200_000 { density::kde_binned(xs, h, lo, hi, m) } else { density::kde_exact(xs, h, &grid) };
            let factor = count_width.map_or(1.0, |w| xs.len() as f64 * w);
            for (g, v) in grid.iter().zip(dens) {
                out.row(rows[0], &[(Channel::X, Some(*g)), (Channel::Y, Some(v * factor)), (Channel::Bandwidth, Some(h))]);
            }
        }
    }
    let time: &[Channel] = if matches!(x, Values::Time(_)) { &[Channel::X] } else { &[] };
    let y_name = if count_width.is_some() { "count" } else { "density" };
    Ok(out.finish(&data, &keys, time, &[(Channel::X, name_of(&data, Channel::X)), (Channel::Y, y_name.to_string())]))
}

// ------------------------------------------------------------ box

fn boxes(index: usize, data: LayerData) -> Result<LayerData, Errors> {
    let y = need_numeric(index, &data, Channel::Y, "a `box` statistic")?;
    let keys = x_and_group_keys(&data);
    let groups = group_rows(&data, &keys);
    let mut out = Out::new();
    for rows in groups.values() {
        let ys = nums_of(y, rows);
        let Some(b) = tukey::box_stats(&ys) else { continue };
        out.row(
            rows[0],
            &[
                (Channel::Y, Some(b.lower_whisker.min(b.q1))),
                (Channel::YEnd, Some(b.upper_whisker.max(b.q3))),
                (Channel::Q1, Some(b.q1)),
                (Channel::Median, Some(b.median)),
                (Channel::Q3, Some(b.q3)),
                (Channel::Count, Some(b.n as f64)),
            ],
        );
        out.text(Channel::Part, "box");
        for v in &b.outliers {
            out.row(rows[0], &[(Channel::Y, Some(*v)), (Channel::YEnd, Some(*v))]);
            out.text(Channel::Part, "outlier");
        }
    }
    let time: &[Channel] = if y_is_time(y) { &[Channel::Y, Channel::YEnd, Channel::Q1, Channel::Median, Channel::Q3] } else { &[] };
    Ok(out.finish(&data, &keys, time, &[(Channel::Y, name_of(&data, Channel::Y))]))
}

// ------------------------------------------------------------ window

fn windowed(index: usize, w: &crate::spec::WindowSpec, data: LayerData) -> Result<LayerData, Errors> {
    let y = need_numeric(index, &data, Channel::Y, "a `window` statistic")?.clone();
    let kind = w.summary.unwrap_or(defaults::WINDOW_SUMMARY);
    let align = match w.align.unwrap_or(defaults::WINDOW_ALIGN) {
        WindowAlign::Center => window::Align::Center,
        WindowAlign::Trailing => window::Align::Trailing,
    };
    let rows_n = w.rows.unwrap_or(defaults::WINDOW_ROWS).max(1) as usize;
    let keys = group_keys(&data);
    let groups = group_rows(&data, &keys);
    // Rows in x order within each group (stable, so ties keep data order).
    let mut order = Vec::with_capacity(data.len);
    let mut result = Vec::with_capacity(data.len);
    for rows in groups.values() {
        let mut rows = rows.clone();
        if let Some(x) = data.get(Channel::X) {
            if !x.is_discrete() {
                crate::sort::by_f64_key(&mut rows, |&r| x.num(r).unwrap_or(f64::INFINITY));
            }
        }
        let ys: Vec<Option<f64>> = rows.iter().map(|i| y.num(*i)).collect();
        let r = match kind {
            WindowSummary::RunningTotal => window::running_total(&ys),
            WindowSummary::Sum => window::rolling(&ys, rows_n, align, true),
            WindowSummary::Mean => window::rolling(&ys, rows_n, align, false),
        };
        order.extend(rows);
        result.extend(r);
    }
    let mut out = LayerData { len: order.len(), ..Default::default() };
    for (k, v) in &data.channels {
        out.channels.insert(*k, v.take(&order));
    }
    out.names = data.names.clone();
    out.channels.insert(Channel::Y, if y_is_time(&y) { Values::Time(result.into()) } else { Values::Num(result.into()) });
    let label = match kind {
        WindowSummary::RunningTotal => format!("running total of {}", name_of(&data, Channel::Y)),
        k => format!("{rows_n}-row {} of {}", k.word(), name_of(&data, Channel::Y)),
    };
    out.names.insert(Channel::Y, label);
    Ok(out)
}

// ------------------------------------------------------------ crowded scatters

fn count_xy(data: &LayerData) -> usize {
    match (data.get(Channel::X), data.get(Channel::Y)) {
        (Some(x), Some(y)) => (0..data.len).filter(|i| x.num(*i).is_some() && y.num(*i).is_some()).count(),
        _ => 0,
    }
}

/// A crowded scatter as 2-D bins: tiles with `x`/`x_end`, `y`/`y_end` and
/// `count`, per group. `None` when either axis is not numeric.
fn scatter_tiles(data: &LayerData) -> Option<LayerData> {
    let (x, y) = (data.get(Channel::X)?, data.get(Channel::Y)?);
    if x.is_discrete() || y.is_discrete() {
        return None;
    }
    let all: Vec<usize> = (0..data.len).collect();
    let xe = bin::edges_by_count(&nums_of(x, &all), SCATTER_COLUMNS);
    let ye = bin::edges_by_count(&nums_of(y, &all), SCATTER_ROWS);
    if xe.len() < 2 || ye.len() < 2 {
        return None;
    }
    let (nx, ny) = (xe.len() - 1, ye.len() - 1);
    let cell = |e: &[f64], v: f64| -> usize {
        let n = e.len() - 1;
        let k = ((v - e[0]) / (e[n] - e[0]) * n as f64) as usize;
        k.min(n - 1)
    };
    let keys = group_keys(data);
    let groups = group_rows(data, &keys);
    let mut out = Out::new();
    // One grid for all groups, and only the cells a group touched are read
    // back (in grid order) and cleared: scanning the whole grid per group
    // made 200k one-row colour groups take 17 s (issue 16).
    let mut counts = vec![0u32; nx * ny];
    let mut touched: Vec<usize> = Vec::new();
    for rows in groups.values() {
        for i in rows {
            if let (Some(a), Some(b)) = (x.num(*i), y.num(*i)) {
                let k = cell(&ye, b) * nx + cell(&xe, a);
                if counts[k] == 0 {
                    touched.push(k);
                }
                counts[k] += 1;
            }
        }
        crate::sort::usizes(&mut touched);
        for &idx in &touched {
            let (r, c, k) = (idx / nx, idx % nx, counts[idx]);
            out.row(
                rows[0],
                &[
                    (Channel::X, Some(xe[c])),
                    (Channel::XEnd, Some(xe[c + 1])),
                    (Channel::Y, Some(ye[r])),
                    (Channel::YEnd, Some(ye[r + 1])),
                    (Channel::Count, Some(k as f64)),
                ],
            );
            counts[idx] = 0;
        }
        touched.clear();
    }
    let mut time = vec![];
    if matches!(x, Values::Time(_)) {
        time.extend([Channel::X, Channel::XEnd]);
    }
    if matches!(y, Values::Time(_)) {
        time.extend([Channel::Y, Channel::YEnd]);
    }
    Some(out.finish(data, &keys, &time, &[(Channel::X, name_of(data, Channel::X)), (Channel::Y, name_of(data, Channel::Y))]))
}

// ------------------------------------------------------------ element cap

/// The most SVG elements a chart may have; past it the render fails with a
/// hint to summarise.
pub const MAX_ELEMENTS: usize = 200_000;

/// SVG elements a layer will draw, roughly: one per row for marks drawn one
/// by one, one per series for lines and areas.
pub fn element_count(geometry: Geometry, data: &LayerData) -> usize {
    match geometry {
        Geometry::Line | Geometry::Step | Geometry::Area | Geometry::Band => 1,
        Geometry::Box => 6 * data.len,
        Geometry::Range => 3 * data.len,
        _ => data.len,
    }
}

pub fn too_many_elements(index: usize, geometry: Geometry, n: usize) -> Diagnostic {
    Diagnostic::error(
        "plan.too_many_marks",
        format!("layer {} would draw about {n} {} marks, more than the {MAX_ELEMENTS} an SVG chart can hold", index + 1, geometry.word()),
    )
    .at_path(format!("layers[{index}].stat"))
    .with_hint("summarise first: a `{\"bin\": {}}` histogram, `\"count\"`, a `{\"summary\": \"mean\"}`, `{\"density\": {}}`, or leave `every_point` off so a crowded scatter is binned into cells")
}

#[cfg(test)]
#[path = "stat_tests.rs"]
mod tests;
