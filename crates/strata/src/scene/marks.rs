//! Data marks of one layer in pixels.
//!
//! Lines and areas with more than four points per pixel column are reduced
//! by M4 (first, last, lowest and highest point per column; Jugel et al.
//! 2014) at the width being drawn, which draws the same pixels.

use super::coord::{Area, Coord};
use super::{polyline, shape_path, Anchor, Datum, Node, Paint, Seg};
use crate::channel::Channel;
use crate::plan::{Arrange, Geometry, PointShape};
use crate::plan::{ColorScale, PlannedLayer, Scales, Values};
use crate::scale::{MarkShape, SHAPES};
use crate::scale::{PositionScale, Transform};

/// What a layer needs from outside: the scales, coordinates and theme mark colour.
pub struct Ctx<'a> {
    pub scales: &'a Scales,
    pub coord: Coord,
    pub default_color: &'a str,
    /// The chart's tick-label size; label marks default to 11/12 of it.
    pub text_size: f64,
    /// The theme's colours: label text is chosen for contrast against them.
    pub palette: &'a crate::color::Palette,
    /// Every layer of the plot, so a label layer can see the marks it names.
    pub layers: &'a [PlannedLayer],
}

/// The name output gives a channel: a turned layer's x holds the spec's y
/// (see `PlannedLayer::turned`), so it is named as the spec named it.
fn channel_name(layer: &PlannedLayer, k: Channel) -> &'static str {
    match (layer.turned, k) {
        (true, Channel::X) => "y",
        (true, Channel::Y) => "x",
        (true, Channel::XEnd) => "y_end",
        (true, Channel::YEnd) => "x_end",
        (true, Channel::YLow) => "x_low",
        (true, Channel::YHigh) => "x_high",
        _ => k.name(),
    }
}

pub(super) fn datum(layer: &PlannedLayer, i: usize) -> Datum {
    let mut chans: Vec<(&Channel, &Values)> = Vec::with_capacity(layer.data.channels.len());
    for (k, v) in &layer.data.channels {
        if !k.is_drawing_aid() {
            chans.push((k, v));
        }
    }
    if layer.turned {
        // In the spec's order: its x (the plan's y) first.
        let spec_channel = |k: &Channel| match *k {
            Channel::X => Channel::Y,
            Channel::Y => Channel::X,
            Channel::XEnd => Channel::YEnd,
            Channel::YEnd => Channel::XEnd,
            other => other,
        };
        crate::sort::by(&mut chans, |a, b| spec_channel(a.0).cmp(&spec_channel(b.0)));
    }
    let mut d = Datum::with_capacity(chans.len() + 1);
    for (k, v) in chans {
        d.insert(channel_name(layer, *k).to_string(), v.json(i));
    }
    // `tooltip` columns ride along under one key; the SVG writer turns them into
    // a hover title and makes the mark keyboard-focusable.
    if !layer.data.tooltips.is_empty() && layer.data.tooltips.iter().all(|(_, v)| v.len() == layer.data.len) {
        let mut tips = serde_json::Map::with_capacity(layer.data.tooltips.len());
        for (c, v) in &layer.data.tooltips {
            tips.insert(c.clone(), v.json(i));
        }
        d.insert("tooltip".into(), serde_json::Value::Object(tips));
    }
    d
}

#[inline(never)]
fn color_of(ctx: &Ctx, layer: &PlannedLayer, i: usize) -> String {
    if let Some(c) = layer.data.get(Channel::Color).and_then(|vals| ctx.scales.color_of(vals, i)) {
        return c;
    }
    layer.style.color.clone().unwrap_or_else(|| ctx.default_color.to_string())
}

/// Unit position on x of row i (band centre for categories), moved by any
/// jitter offset (a fraction of the band).
#[inline(never)]
fn ux(ctx: &Ctx, layer: &PlannedLayer, v: &Values, i: usize) -> Option<f64> {
    let u = ctx.scales.x.unit(v, i)?;
    let off = layer.data.get(Channel::XOffset).and_then(|o| o.num(i)).unwrap_or(0.0);
    Some(u + off * ctx.scales.x.band())
}

fn uy_num(s: &PositionScale, v: Option<f64>) -> Option<f64> {
    v.and_then(|v| s.unit_num(v))
}

pub fn layer_marks(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let mut marks = geometry_marks(ctx, layer);
    if names_ends(layer) {
        marks.extend(end_labels(ctx, layer));
    }
    marks
}

fn geometry_marks(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    match layer.geometry {
        Geometry::Point => points(ctx, layer),
        Geometry::Line | Geometry::Step => lines(ctx, layer),
        Geometry::Bar => bars(ctx, layer),
        Geometry::Area => bands(ctx, layer, Channel::Y, Band::Base),
        Geometry::Band => bands(ctx, layer, Channel::Y, Band::End),
        Geometry::Segment => segments(ctx, layer),
        Geometry::Range => ranges(ctx, layer),
        // Box plots are the full engine's (the core refuses them: spec::needs_full).
        Geometry::Box if cfg!(feature = "fitted_stats") => boxes(ctx, layer),
        Geometry::Cell => cells(ctx, layer),
        Geometry::Label => labels(ctx, layer),
        // Regions are shapes: `scene::map` draws them.
        Geometry::Region | Geometry::Box => Vec::new(),
    }
}

/// Channels that split a layer's rows into series: a line never joins two
/// colours, groups or panels.
const SERIES_CHANNELS: [Channel; 5] = [Channel::Color, Channel::Group, Channel::Panel, Channel::PanelRow, Channel::PanelCol];

/// Rows split into series by colour, group and panel, in order of first appearance.
fn series(layer: &PlannedLayer) -> Vec<Vec<usize>> {
    let mut cols: Vec<&Values> = Vec::with_capacity(SERIES_CHANNELS.len());
    for c in SERIES_CHANNELS {
        if let Some(v) = layer.data.get(c) {
            cols.push(v);
        }
    }
    if cols.is_empty() {
        let mut all = Vec::with_capacity(layer.data.len);
        for i in 0..layer.data.len {
            all.push(i);
        }
        return vec![all];
    }
    // Series in order of first appearance, found by hash (many series stay linear).
    let series = crate::index::group_rows(layer.data.len, &|i| {
        let mut key = Vec::with_capacity(cols.len());
        for v in &cols {
            key.push(v.key(i));
        }
        key
    });
    let mut out = Vec::with_capacity(series.len());
    for (_, rows) in series {
        out.push(rows);
    }
    out
}

#[inline(never)]
fn series_datum(layer: &PlannedLayer, first: usize) -> Datum {
    let mut d = Datum::new();
    for (k, v) in &layer.data.channels {
        if SERIES_CHANNELS.contains(k) {
            d.insert(k.to_string(), v.json(first));
        }
    }
    d
}

// ------------------------------------------------------------ points

fn points(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let (Some(xv), Some(yv)) = (layer.data.get(Channel::X), layer.data.get(Channel::Y)) else { return vec![] };
    let r = layer.style.radius.unwrap_or(3.5);
    let (lo, hi) = (layer.data.get(Channel::YLow), layer.data.get(Channel::YHigh));
    let beside = beside_keys(ctx, layer);
    // `style.shape`: one shape for every point (a circle stays a <circle>).
    let fixed_shape = layer.style.shape.map(mark_shape).and_then(|m| SHAPES.iter().position(|k| *k == m)).filter(|k| *k != 0);
    let mut out = Vec::with_capacity(layer.data.len);
    for i in 0..layer.data.len {
        let (Some(mut ux), Some(uy)) = (ux(ctx, layer, xv, i), ctx.scales.y.unit(yv, i)) else { continue };
        if !beside.is_empty() {
            // Side by side: the centre of this colour's slot in the band.
            if let Some((x0, x1)) = x_extent(ctx, layer, i, 0.8, &beside) {
                ux = 0.5 * (x0 + x1);
            }
        }
        let c = color_of(ctx, layer, i);
        // An interval around the point: an error bar behind it.
        if let (Some(a), Some(b)) = (uy_num(&ctx.scales.y, lo.and_then(|v| v.num(i))), uy_num(&ctx.scales.y, hi.and_then(|v| v.num(i)))) {
            out.push(error_bar(ctx, ux, a, b, 4.0, &c, None));
        }
        let (cx, cy) = ctx.coord.point(ux, uy);
        let mut paint = Paint::fill(&c);
        paint.opacity = layer.style.opacity;
        // Size and shape scales (plan/scales.rs): area-true radius, shape by category.
        let r = layer.data.get(Channel::Size).and_then(|v| ctx.scales.radius_of(v, i)).unwrap_or(r);
        if let Some(k) = layer.data.get(Channel::Shape).and_then(|v| ctx.scales.shape_of(v, i)).or(fixed_shape) {
            out.push(Node::path(shape_path(k, cx, cy, r), paint, Some(datum(layer, i))));
            continue;
        }
        out.push(Node::Circle { cx, cy, r, paint, datum: Some(datum(layer, i)) });
    }
    out
}

/// The drawn shape of a `style.shape` word.
fn mark_shape(s: PointShape) -> MarkShape {
    match s {
        PointShape::Circle => MarkShape::Circle,
        PointShape::Square => MarkShape::Square,
        PointShape::Triangle => MarkShape::Triangle,
        PointShape::Diamond => MarkShape::Diamond,
        PointShape::Plus => MarkShape::Plus,
        PointShape::Cross => MarkShape::Cross,
    }
}

/// A vertical (in data terms) segment from a to b at x with caps `cap` px wide.
#[inline(never)]
fn error_bar(ctx: &Ctx, ux: f64, a: f64, b: f64, cap: f64, c: &str, datum: Option<Datum>) -> Node {
    let p0 = ctx.coord.point(ux, a);
    let p1 = ctx.coord.point(ux, b);
    let transposed = matches!(ctx.coord, Coord::Transposed(_));
    let capped = |p: (f64, f64)| if transposed { ((p.0, p.1 - cap), (p.0, p.1 + cap)) } else { ((p.0 - cap, p.1), (p.0 + cap, p.1)) };
    let (c0, c1) = capped(p0);
    let (d0, d1) = capped(p1);
    let d = vec![Seg::Move(p0.0, p0.1), Seg::Line(p1.0, p1.1), Seg::Move(c0.0, c0.1), Seg::Line(c1.0, c1.1), Seg::Move(d0.0, d0.1), Seg::Line(d1.0, d1.1)];
    Node::path(d, Paint::stroke(c, 1.5), datum)
}

// ------------------------------------------------------------ lines

/// The pixel column coordinate of a unit x (horizontal pixels; vertical when transposed).
fn columns(ctx: &Ctx, units: &[(f64, f64)]) -> Option<(Vec<f64>, Vec<f64>, f64)> {
    match ctx.coord {
        // (`bottom - u * height` is `bottom + u * -height` to the bit.)
        Coord::Cartesian(f) => Some((affine(units, false, f.left, f.width), affine(units, true, f.bottom(), -f.height), f.width)),
        Coord::Transposed(f) => Some((affine(units, false, f.top, f.height), affine(units, true, f.left, f.width), f.height)),
        #[cfg(feature = "polar")]
        Coord::Polar { .. } => None,
    }
}

/// `a + v * b` for each point's x (or y, `of_y`): one monomorphic loop for
/// the four pixel columns above.
fn affine(units: &[(f64, f64)], of_y: bool, a: f64, b: f64) -> Vec<f64> {
    let mut out = Vec::with_capacity(units.len());
    if of_y {
        for u in units {
            out.push(a + u.1 * b);
        }
    } else {
        for u in units {
            out.push(a + u.0 * b);
        }
    }
    out
}

/// The points at `idx` (the M4 selection), in one loop shared by lines and bands.
fn pick_points(v: &[(f64, f64)], idx: &[usize]) -> Vec<(f64, f64)> {
    let mut out = Vec::with_capacity(idx.len());
    for &i in idx {
        out.push(v[i]);
    }
    out
}

/// Indices into `units` to draw: all, or the M4 selection when there are
/// more than four points per pixel column.
fn m4_keep(ctx: &Ctx, units: &[(f64, f64)]) -> Option<Vec<usize>> {
    let (col, val, width) = columns(ctx, units)?;
    if (units.len() as f64) <= 4.0 * width.max(1.0) {
        return None;
    }
    Some(crate::stat::m4::m4_indices(&col, &val))
}

/// Rows of a series: all rows of the layer, or a list.
enum RowSet {
    All(usize),
    List(Vec<usize>),
}

impl RowSet {
    fn len(&self) -> usize {
        match self {
            RowSet::All(n) => *n,
            RowSet::List(v) => v.len(),
        }
    }
    fn first(&self) -> Option<usize> {
        match self {
            RowSet::All(n) => (*n > 0).then_some(0),
            RowSet::List(v) => v.first().copied(),
        }
    }
    fn for_each(&self, mut f: impl FnMut(usize) -> bool) {
        match self {
            RowSet::All(n) => {
                for i in 0..*n {
                    if !f(i) {
                        return;
                    }
                }
            }
            RowSet::List(v) => {
                for &i in v {
                    if !f(i) {
                        return;
                    }
                }
            }
        }
    }
}

fn line_series(layer: &PlannedLayer) -> Vec<RowSet> {
    if SERIES_CHANNELS.iter().all(|c| layer.data.get(*c).is_none()) {
        return vec![RowSet::All(layer.data.len)];
    }
    let all = series(layer);
    let mut out = Vec::with_capacity(all.len());
    for rows in all {
        out.push(RowSet::List(rows));
    }
    out
}

/// The pixel column of a unit x, for M4 (None in polar coordinates).
fn column_of(ctx: &Ctx) -> Option<(f64, f64)> {
    match ctx.coord {
        Coord::Cartesian(f) => Some((f.left, f.width)),
        Coord::Transposed(f) => Some((f.top, f.height)),
        #[cfg(feature = "polar")]
        Coord::Polar { .. } => None,
    }
}

/// A series' unit points in x order, reduced by M4 when crowded. Returns
/// the points kept, the number of points in the series and whether M4 ran.
///
/// Sorted, crowded series (the common case for big data) are reduced in one
/// streaming pass without materialising every point; others are collected,
/// sorted and then reduced, with the same result.
fn series_units(ctx: &Ctx, layer: &PlannedLayer, rows: &RowSet, ych: Channel) -> (Vec<(f64, f64)>, usize, bool) {
    let (Some(xv), Some(yv)) = (layer.data.get(Channel::X), layer.data.get(ych)) else { return (vec![], 0, false) };
    let off = layer.data.get(Channel::XOffset);
    let band = ctx.scales.x.band();
    let unit = |i: usize| -> Option<(f64, f64)> {
        let mut u = ctx.scales.x.unit(xv, i)?;
        if let Some(o) = off.and_then(|o| o.num(i)) {
            u += o * band;
        }
        Some((u, ctx.scales.y.unit(yv, i)?))
    };
    if let Some((origin, extent)) = column_of(ctx) {
        if rows.len() as f64 > 4.0 * extent.max(1.0) {
            // Numbers on linear scales without offsets: map straight from the
            // slices; others through the scales. One streaming pass (one copy
            // of the M4 loop) for both, over either kind of row set.
            let direct = match (xv, yv, &ctx.scales.x, &ctx.scales.y, off) {
                (
                    Values::Num(a) | Values::Time(a),
                    Values::Num(b) | Values::Time(b),
                    PositionScale::Continuous { lo: xl, hi: xh, transform: Transform::Linear, .. },
                    PositionScale::Continuous { lo: yl, hi: yh, transform: Transform::Linear, .. },
                    None,
                ) if xh != xl && yh != yl => Some((a.raw(), b.raw(), *xl, xh - xl, *yl, yh - yl)),
                _ => None,
            };
            let (n, list) = match rows {
                RowSet::All(n) => (*n, None),
                RowSet::List(v) => (v.len(), Some(v.as_slice())),
            };
            let direct = m4_stream(
                (0..n).filter_map(|k| {
                    let i = list.map_or(k, |v| v[k]);
                    match direct {
                        Some((a, b, xl, xs, yl, ys)) => {
                            let (x, y) = (a[i], b[i]);
                            (x.is_finite() && y.is_finite()).then(|| ((x - xl) / xs, (y - yl) / ys))
                        }
                        None => unit(i),
                    }
                }),
                origin,
                extent,
            );
            if let Some((kept, n)) = direct {
                return (kept, n, true);
            }
        }
    }
    let mut pts: Vec<(f64, f64)> = Vec::with_capacity(rows.len());
    rows.for_each(|i| {
        if let Some(p) = unit(i) {
            pts.push(p);
        }
        true
    });
    if !pts.windows(2).all(|w| w[0].0 <= w[1].0) {
        crate::sort::by_x(&mut pts);
    }
    let n = pts.len();
    match m4_keep(ctx, &pts) {
        Some(k) => (pick_points(&pts, &k), n, true),
        None => (pts, n, false),
    }
}

/// One pass of M4 over points (unit x, unit y) already in x order; `None`
/// as soon as x goes backwards (the caller then sorts).
fn m4_stream(points: impl Iterator<Item = (f64, f64)>, origin: f64, extent: f64) -> Option<(Vec<(f64, f64)>, usize)> {
    let mut out = Vec::new();
    let mut n = 0usize;
    let mut prev = f64::NEG_INFINITY;
    // Current column: (sequence number, point) of first, lowest, highest, last.
    let mut col = f64::NAN;
    let mut cur: [(usize, (f64, f64)); 4] = [(0, (0.0, 0.0)); 4];
    let flush = |cur: &[(usize, (f64, f64)); 4], out: &mut Vec<(f64, f64)>| {
        let mut four = *cur;
        crate::sort::by(&mut four, |a, b| a.0.cmp(&b.0));
        let mut last_seq = usize::MAX;
        for (seq, p) in four {
            if seq != last_seq {
                out.push(p);
                last_seq = seq;
            }
        }
    };
    for p in points {
        if p.0 < prev {
            return None;
        }
        prev = p.0;
        let c = crate::stat::m4::column(origin + p.0 * extent);
        if c != col {
            if n > 0 {
                flush(&cur, &mut out);
            }
            col = c;
            cur = [(n, p); 4];
        } else {
            if p.1 < cur[1].1 .1 {
                cur[1] = (n, p);
            }
            if p.1 > cur[2].1 .1 {
                cur[2] = (n, p);
            }
            cur[3] = (n, p);
        }
        n += 1;
    }
    if n > 0 {
        flush(&cur, &mut out);
    }
    Some((out, n))
}

fn lines(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let width = layer.style.width.unwrap_or(2.0);
    let mut out = Vec::new();
    let banded = layer.data.get(Channel::YLow).is_some() && layer.data.get(Channel::YHigh).is_some();
    for rows in line_series(layer) {
        let Some(first) = rows.first() else { continue };
        let (drawn, total, reduced) = series_units(ctx, layer, &rows, Channel::Y);
        if drawn.is_empty() {
            continue;
        }
        let c = color_of(ctx, layer, first);
        if banded {
            // A fit's confidence band, under its line.
            let list: Vec<usize> = match &rows {
                RowSet::All(n) => (0..*n).collect(),
                RowSet::List(v) => v.clone(),
            };
            out.extend(band_path(ctx, layer, &list, Channel::YLow, Channel::YHigh, &c, layer.style.opacity.unwrap_or(1.0) * 0.25));
        }
        let mut stepped: Vec<(f64, f64)> = Vec::with_capacity(drawn.len() * 2);
        for (k, p) in drawn.iter().enumerate() {
            if layer.geometry == Geometry::Step && k > 0 {
                stepped.push((p.0, drawn[k - 1].1));
            }
            stepped.push(*p);
        }
        let px = ctx.coord.line(&stepped);
        let mut paint = Paint::stroke(&c, width);
        paint.opacity = layer.style.opacity;
        paint.dash = layer.style.dash.clone();
        let mut d = series_datum(layer, first);
        d.insert("points".into(), serde_json::Value::from(total));
        if reduced {
            d.insert("drawn_points".into(), serde_json::Value::from(drawn.len()));
        }
        out.push(Node::path(polyline(&px, false), paint, Some(d)));
    }
    out
}

// ------------------------------------------------------------ areas and bands

enum Band {
    /// From `y_base` (or zero) up to `y`.
    Base,
    /// From `y` up to `y_end`.
    End,
}

fn bands(ctx: &Ctx, layer: &PlannedLayer, _y: Channel, kind: Band) -> Vec<Node> {
    let mut out = Vec::new();
    for rows in series(layer) {
        let Some(&first) = rows.first() else { continue };
        let c = color_of(ctx, layer, first);
        let opacity = layer.style.opacity.unwrap_or(match kind {
            Band::Base => 0.85,
            Band::End => 0.3,
        });
        let (lo, hi) = match kind {
            // A stacked area's extent ends at its running total.
            Band::Base => (Channel::YBase, if layer.data.get(Channel::YTop).is_some() { Channel::YTop } else { Channel::Y }),
            Band::End => (Channel::Y, Channel::YEnd),
        };
        out.extend(band_path(ctx, layer, &rows, lo, hi, &c, opacity));
    }
    out
}

/// A filled band between channels `lo` and `hi` over x, for one series.
fn band_path(ctx: &Ctx, layer: &PlannedLayer, rows: &[usize], lo: Channel, hi: Channel, c: &str, opacity: f64) -> Option<Node> {
    let xv = layer.data.get(Channel::X)?;
    let hv = layer.data.get(hi)?;
    let lv = layer.data.get(lo);
    let zero = ctx.scales.y.unit_num(0.0).unwrap_or(0.0);
    let mut pts: Vec<(f64, f64, f64)> = Vec::with_capacity(rows.len());
    for &i in rows {
        let Some(a) = ux(ctx, layer, xv, i) else { continue };
        let Some(top) = ctx.scales.y.unit(hv, i) else { continue };
        let bottom = match lv {
            Some(v) => match ctx.scales.y.unit(v, i) {
                Some(b) => b,
                None => continue,
            },
            None => zero,
        };
        pts.push((a, top, bottom));
    }
    if pts.is_empty() {
        return None;
    }
    if !pts.windows(2).all(|w| w[0].0 <= w[1].0) {
        crate::sort::by_f64_key(&mut pts, |p| p.0);
    }
    let mut tops: Vec<(f64, f64)> = Vec::with_capacity(pts.len());
    let mut bottoms: Vec<(f64, f64)> = Vec::with_capacity(pts.len());
    for p in &pts {
        tops.push((p.0, p.1));
        bottoms.push((p.0, p.2));
    }
    // M4 on both edges; keep the union so top and bottom stay paired.
    let keep = match (m4_keep(ctx, &tops), m4_keep(ctx, &bottoms)) {
        (Some(a), Some(b)) => {
            let mut k = a;
            k.extend(b);
            crate::sort::usizes(&mut k);
            k.dedup();
            Some(k)
        }
        _ => None,
    };
    let pick = |v: &[(f64, f64)]| -> Vec<(f64, f64)> {
        match &keep {
            Some(k) => pick_points(v, k),
            None => v.to_vec(),
        }
    };
    let mut outline = ctx.coord.line(&pick(&tops));
    let mut back = ctx.coord.line(&pick(&bottoms));
    back.reverse();
    outline.extend(back);
    let mut paint = Paint::fill(c);
    paint.opacity = Some(opacity);
    let mut d = series_datum(layer, rows[0]);
    d.insert("points".into(), serde_json::Value::from(pts.len()));
    Some(Node::path(polyline(&outline, true), paint, Some(d)))
}

// ------------------------------------------------------------ bars

/// The unit extent across x of row i: a share of the band for categories,
/// x..x_end when an end is given, or 1 % of the axis; split among colour
/// categories when the layer is arranged `beside`.
#[inline(never)]
fn x_extent(ctx: &Ctx, layer: &PlannedLayer, i: usize, fraction: f64, beside: &[String]) -> Option<(f64, f64)> {
    let xv = layer.data.get(Channel::X)?;
    let cx = ux(ctx, layer, xv, i)?;
    let band = ctx.scales.x.band();
    // Bars on a continuous x: the data's resolution times the share, in data units.
    let step = layer.x_step.and_then(|st| {
        let x = xv.num(i)?;
        let (a, b) = (ctx.scales.x.unit_num(x - st * fraction / 2.0)?, ctx.scales.x.unit_num(x + st * fraction / 2.0)?);
        Some((a.min(b), a.max(b)))
    });
    let (mut x0, mut x1) = match step {
        _ if band > 0.0 => (cx - band * fraction / 2.0, cx + band * fraction / 2.0),
        Some(e) => e,
        None => (cx - 0.005, cx + 0.005),
    };
    if let Some(xe) = layer.data.get(Channel::XEnd).and_then(|v| ctx.scales.x.unit(v, i)) {
        x0 = cx.min(xe);
        x1 = cx.max(xe);
    }
    if !beside.is_empty() {
        if let Some(k) = layer.data.get(Channel::Color).and_then(|c| c.key(i)).and_then(|k| beside.iter().position(|b| *b == k)) {
            let w = (x1 - x0) / beside.len() as f64;
            x0 += w * k as f64;
            x1 = x0 + w;
        }
    }
    Some((x0, x1))
}

fn beside_keys(ctx: &Ctx, layer: &PlannedLayer) -> Vec<String> {
    if layer.arrange != Arrange::Beside || layer.data.get(Channel::Color).is_none() {
        return vec![];
    }
    match &ctx.scales.color {
        Some(ColorScale::Categories(c)) => c.clone(),
        _ => vec![],
    }
}

#[inline(never)]
fn rect_node(ctx: &Ctx, x0: f64, x1: f64, y0: f64, y1: f64, paint: Paint, datum: Option<Datum>) -> Node {
    match ctx.coord.area(x0, x1, y0, y1) {
        Area::Rect { x, y, width, height } => Node::Rect { x, y, width, height, paint, datum },
        Area::Path(p) => Node::path(p, paint, datum),
    }
}

fn bars(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    // A stacked bar ends at its running total (`y` is its own value).
    let Some(yv) = layer.data.get(Channel::YTop).or(layer.data.get(Channel::Y)) else { return vec![] };
    let base = layer.data.get(Channel::YBase);
    let fraction = layer.style.share.unwrap_or(0.8).clamp(0.05, 1.0);
    let beside = beside_keys(ctx, layer);
    let (lo, hi) = (layer.data.get(Channel::YLow), layer.data.get(Channel::YHigh));
    let mut out = Vec::with_capacity(layer.data.len);
    let mut bars_after = Vec::new();
    for i in 0..layer.data.len {
        let Some(uy) = ctx.scales.y.unit(yv, i) else { continue };
        // In polar coordinates a bar without an x spans the whole radius:
        // a donut with no x is one ring split by y.
        let whole = ctx.coord.is_polar() && layer.data.get(Channel::X).is_none();
        let Some((x0, x1)) = x_extent(ctx, layer, i, fraction, &beside).or(whole.then_some((0.0, 1.0))) else { continue };
        let ub = base.and_then(|b| b.num(i)).and_then(|b| ctx.scales.y.unit_num(b)).unwrap_or(0.0);
        let c = color_of(ctx, layer, i);
        let mut paint = Paint::fill(&c);
        paint.opacity = layer.style.opacity;
        out.push(rect_node(ctx, x0, x1, ub, uy, paint, Some(datum(layer, i))));
        if let (Some(a), Some(b)) = (uy_num(&ctx.scales.y, lo.and_then(|v| v.num(i))), uy_num(&ctx.scales.y, hi.and_then(|v| v.num(i)))) {
            bars_after.push(error_bar(ctx, 0.5 * (x0 + x1), a, b, 4.0, ctx.default_color, None));
        }
    }
    out.extend(bars_after);
    out
}

// ------------------------------------------------------------ rules and ranges

fn segments(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let width = layer.style.width.unwrap_or(1.5);
    let (xv, yv) = (layer.data.get(Channel::X), layer.data.get(Channel::Y));
    let (xe, ye) = (layer.data.get(Channel::XEnd), layer.data.get(Channel::YEnd));
    let mut out = Vec::new();
    for i in 0..layer.data.len {
        let ux0 = xv.and_then(|v| ux(ctx, layer, v, i));
        let uy0 = yv.and_then(|v| ctx.scales.y.unit(v, i));
        let ux1 = xe.and_then(|v| ctx.scales.x.unit(v, i));
        let uy1 = ye.and_then(|v| ctx.scales.y.unit(v, i));
        let (a, b) = match (ux0, uy0, ux1, uy1) {
            (Some(x), Some(y0), _, Some(y1)) => ((x, y0), (x, y1)),
            (Some(x0), Some(y), Some(x1), None) => ((x0, y), (x1, y)),
            (Some(x), None, _, _) => ((x, 0.0), (x, 1.0)),
            (None, Some(y), _, _) => ((0.0, y), (1.0, y)),
            (Some(x), Some(y), None, None) => ((x, 0.0), (x, y)),
            _ => continue,
        };
        let px = ctx.coord.line(&[a, b]);
        let mut paint = Paint::stroke(&color_of(ctx, layer, i), width);
        paint.opacity = layer.style.opacity;
        paint.dash = layer.style.dash.clone();
        out.push(Node::path(polyline(&px, false), paint, Some(datum(layer, i))));
    }
    out
}

fn ranges(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let (Some(xv), Some(yv), Some(ye)) = (layer.data.get(Channel::X), layer.data.get(Channel::Y), layer.data.get(Channel::YEnd)) else {
        return segments(ctx, layer);
    };
    let beside = beside_keys(ctx, layer);
    let mut out = Vec::new();
    for i in 0..layer.data.len {
        let (Some(_), Some(a), Some(b)) = (ux(ctx, layer, xv, i), ctx.scales.y.unit(yv, i), ctx.scales.y.unit(ye, i)) else { continue };
        let Some((x0, x1)) = x_extent(ctx, layer, i, 0.8, &beside) else { continue };
        let c = color_of(ctx, layer, i);
        let mut node = error_bar(ctx, 0.5 * (x0 + x1), a, b, layer.style.width.unwrap_or(1.5) * 3.0, &c, Some(datum(layer, i)));
        if let Node::Path { paint, .. } = &mut node {
            paint.stroke_width = Some(layer.style.width.unwrap_or(1.5));
            paint.opacity = layer.style.opacity;
        }
        out.push(node);
        // The estimate, when the interval came from a summary.
        if let Some(e) = layer.data.get(Channel::Estimate).and_then(|v| v.num(i)).and_then(|v| ctx.scales.y.unit_num(v)) {
            let (cx, cy) = ctx.coord.point(0.5 * (x0 + x1), e);
            out.push(Node::Circle { cx, cy, r: 3.0, paint: Paint::fill(&c), datum: None });
        }
    }
    out
}

// ------------------------------------------------------------ box plots

fn boxes(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let d = &layer.data;
    let (Some(yv), Some(ye)) = (d.get(Channel::Y), d.get(Channel::YEnd)) else { return vec![] };
    let part = d.get(Channel::Part);
    let fraction = layer.style.share.unwrap_or(0.6).clamp(0.05, 1.0);
    let beside = beside_keys(ctx, layer);
    let unit = |ch: Channel, i: usize| d.get(ch).and_then(|v| v.num(i)).and_then(|v| ctx.scales.y.unit_num(v));
    let mut out = Vec::new();
    for i in 0..d.len {
        let Some((x0, x1)) = x_extent(ctx, layer, i, fraction, &beside) else { continue };
        let c = color_of(ctx, layer, i);
        let xm = 0.5 * (x0 + x1);
        if part.and_then(|p| p.key(i)).as_deref() == Some("outlier") {
            let Some(u) = ctx.scales.y.unit(yv, i) else { continue };
            let (cx, cy) = ctx.coord.point(xm, u);
            out.push(Node::Circle { cx, cy, r: 2.5, paint: Paint::stroke(&c, 1.2), datum: Some(datum(layer, i)) });
            continue;
        }
        let (Some(lw), Some(uw), Some(q1), Some(med), Some(q3)) =
            (ctx.scales.y.unit(yv, i), ctx.scales.y.unit(ye, i), unit(Channel::Q1, i), unit(Channel::Median, i), unit(Channel::Q3, i))
        else {
            continue;
        };
        let mut fill = Paint::fill(&c);
        fill.opacity = Some(layer.style.opacity.unwrap_or(0.35));
        out.push(rect_node(ctx, x0, x1, q1, q3, fill, Some(datum(layer, i))));
        let seg = |a: (f64, f64), b: (f64, f64)| ctx.coord.line(&[a, b]);
        let mut lines = Vec::new();
        lines.push(seg((x0, med), (x1, med)));
        if lw < q1 {
            lines.push(seg((xm, lw), (xm, q1)));
        }
        if uw > q3 {
            lines.push(seg((xm, q3), (xm, uw)));
        }
        let mut dd: Vec<Seg> = Vec::new();
        for l in &lines {
            dd.extend(polyline(l, false));
        }
        out.push(Node::path(dd, Paint::stroke(&c, 1.5), None));
        // The box outline.
        let outline = ctx.coord.line(&[(x0, q1), (x1, q1), (x1, q3), (x0, q3)]);
        out.push(Node::path(polyline(&outline, true), Paint::stroke(&c, 1.5), None));
    }
    out
}

// ------------------------------------------------------------ tiles and labels

fn cells(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let d = &layer.data;
    let (Some(xv), Some(yv)) = (d.get(Channel::X), d.get(Channel::Y)) else { return vec![] };
    let counts = d.get(Channel::Count);
    let mut max_count = 0.0f64;
    if let Some(c) = counts {
        for i in 0..d.len {
            if let Some(x) = c.num(i) {
                max_count = max_count.max(x);
            }
        }
    }
    let (xb, yb) = (ctx.scales.x.band(), ctx.scales.y.band());
    let mut out = Vec::with_capacity(d.len);
    for i in 0..d.len {
        let (Some(ux0), Some(uy0)) = (ctx.scales.x.unit(xv, i), ctx.scales.y.unit(yv, i)) else { continue };
        // On a continuous axis a cell spans the data's resolution there
        // (years down a heat map), in data units.
        let span = |scale: &crate::scale::PositionScale, v: &Values, step: Option<f64>| {
            let (c, s) = (v.num(i)?, step?);
            let (a, b) = (scale.unit_num(c - s / 2.0)?, scale.unit_num(c + s / 2.0)?);
            Some((a.min(b), a.max(b)))
        };
        let (x0, x1) = match d.get(Channel::XEnd).and_then(|v| ctx.scales.x.unit(v, i)) {
            Some(e) => (ux0, e),
            None if xb > 0.0 => (ux0 - xb / 2.0, ux0 + xb / 2.0),
            None => span(&ctx.scales.x, xv, layer.x_step).unwrap_or((ux0, ux0)),
        };
        let (y0, y1) = match d.get(Channel::YEnd).and_then(|v| ctx.scales.y.unit(v, i)) {
            Some(e) => (uy0, e),
            None if yb > 0.0 => (uy0 - yb / 2.0, uy0 + yb / 2.0),
            None => span(&ctx.scales.y, yv, layer.y_step).unwrap_or((uy0, uy0)),
        };
        let mut paint = Paint::fill(&color_of(ctx, layer, i));
        // Without a colour channel, shade by count: darker is more.
        paint.opacity = match (d.get(Channel::Color), counts.and_then(|c| c.num(i))) {
            (None, Some(k)) if max_count > 0.0 => Some(0.15 + 0.85 * (k / max_count).sqrt()),
            _ => layer.style.opacity,
        };
        out.push(rect_node(ctx, x0, x1, y0, y1, paint, Some(datum(layer, i))));
    }
    // A note in the plot's corner saying what the shading means (a crowded
    // scatter drawn as tiles, or any tiles shaded by count).
    if d.get(Channel::Color).is_none() && max_count > 0.0 && !out.is_empty() {
        let f = ctx.coord.frame();
        out.push(Node::text(
            f.right() - 4.0,
            f.top + 12.0,
            format!("Tiles shaded by number of points (darkest: {})", crate::format::value_label(max_count)),
            11.0,
            Anchor::End,
            ctx.default_color.to_string(),
            "strata-note",
        ));
    }
    out
}

// ------------------------------------------------------------ label placement

/// A text's line box: left, top, right, bottom (px).
pub(super) type Box4 = (f64, f64, f64, f64);

/// The glyph box of a text at baseline `y`: from the cap height above the
/// baseline to a descender's depth below it, 1 px around.
/// A thin leader from a moved text's box (its nearest edge) to 3 px short
/// of the point it names; none when the text is already by the point.
pub(super) fn leader(point: (f64, f64), b: Box4, pal: &crate::color::Palette) -> Option<Node> {
    let (px, py) = point;
    let (qx, qy) = (crate::math::clamp(px, b.0, b.2), crate::math::clamp(py, b.1, b.3));
    let len = crate::math::hypot(qx - px, qy - py);
    if len <= 4.0 {
        return None;
    }
    let t = 3.0 / len;
    let mut paint = Paint::stroke(&pal.muted, 1.0);
    paint.opacity = Some(0.9);
    Some(Node::line(qx, qy, px + (qx - px) * t, py + (qy - py) * t, paint))
}

pub(super) fn text_box(x: f64, y: f64, w: f64, size: f64, anchor: Anchor) -> Box4 {
    let left = match anchor {
        Anchor::Start => x,
        Anchor::Middle => x - w / 2.0,
        Anchor::End => x - w,
    };
    (left - 1.0, y - size * crate::text::CAP - 1.0, left + w + 1.0, y + size * 0.25 + 1.0)
}

fn boxes_overlap(a: Box4, b: Box4) -> bool {
    a.0 < b.2 && b.0 < a.2 && a.1 < b.3 && b.1 < a.3
}

pub(super) fn box_within(a: Box4, f: super::coord::Frame) -> bool {
    a.0 >= f.left - 0.5 && a.2 <= f.right() + 0.5 && a.1 >= f.top - 0.5 && a.3 <= f.bottom() + 0.5
}

/// Does the segment p-q cross the box? Liang-Barsky line clipping
/// (Liang and Barsky, "A new concept and method for line clipping", ACM
/// TOG 3(1), 1984): the segment meets the box when the clipped parameter
/// range is not empty.
pub(super) fn segment_hits_box(p: (f64, f64), q: (f64, f64), b: Box4) -> bool {
    let (dx, dy) = (q.0 - p.0, q.1 - p.1);
    let (mut t0, mut t1) = (0.0f64, 1.0f64);
    for (pk, qk) in [(-dx, p.0 - b.0), (dx, b.2 - p.0), (-dy, p.1 - b.1), (dy, b.3 - p.1)] {
        if pk == 0.0 {
            if qk < 0.0 {
                return false;
            }
            continue;
        }
        let r = qk / pk;
        if pk < 0.0 {
            t0 = t0.max(r);
        } else {
            t1 = t1.min(r);
        }
        if t0 > t1 {
            return false;
        }
    }
    true
}

/// Boxes and segments indexed by the 32 px cells they touch, so that each
/// new label is checked against its neighbours only (lookups by hash, as
/// the house asks: thousands of labels stay near linear): `cells[k]` is
/// cell `keys[k]`'s items, `k` found by `index`.
#[derive(Default)]
pub(super) struct Grid {
    index: crate::index::Index,
    keys: Vec<(i64, i64)>,
    cells: Vec<Vec<usize>>,
    boxes: Vec<Box4>,
    segs: Vec<((f64, f64), (f64, f64))>,
}

const CELL: f64 = 32.0;

impl Grid {
    /// The cells a box touches, row by row (x outer, y inner): the first
    /// and last cell along x and y. A box or segment spanning many cells is
    /// indexed in at most 64 along each side.
    fn cells_of(b: Box4) -> (i64, i64, i64, i64) {
        let c = |v: f64| (v / CELL).floor().clamp(-1e6, 1e6) as i64;
        let (x0, x1, y0, y1) = (c(b.0), c(b.2), c(b.1), c(b.3));
        (x0, x1.min(x0 + 64), y0, y1.min(y0 + 64))
    }
    fn hash(h: crate::index::Hasher, (x, y): (i64, i64)) -> u64 {
        h.u64(x as u64).u64(y as u64).finish()
    }
    /// Items are numbered: boxes as 2k, segments as 2k + 1.
    pub(super) fn add_box(&mut self, b: Box4) {
        let id = 2 * self.boxes.len();
        self.boxes.push(b);
        self.index(b, id);
    }
    pub(super) fn add_segment(&mut self, p: (f64, f64), q: (f64, f64)) {
        let id = 2 * self.segs.len() + 1;
        self.segs.push((p, q));
        self.index((p.0.min(q.0), p.1.min(q.1), p.0.max(q.0), p.1.max(q.1)), id);
    }
    fn index(&mut self, b: Box4, id: usize) {
        let (x0, x1, y0, y1) = Self::cells_of(b);
        for x in x0..=x1 {
            for y in y0..=y1 {
                let (keys, c) = (&self.keys, (x, y));
                match self.index.find_or_insert(&|h| Self::hash(h, c), &|k| keys[k as usize] == c, keys.len() as u32, &|k, h| Self::hash(h, keys[k as usize])) {
                    Ok(k) => self.cells[k as usize].push(id),
                    Err(_) => {
                        self.keys.push(c);
                        self.cells.push(vec![id]);
                    }
                }
            }
        }
    }
    /// Is the box clear of every box and segment stored?
    pub(super) fn free(&self, b: Box4) -> bool {
        let (x0, x1, y0, y1) = Self::cells_of(b);
        for x in x0..=x1 {
            for y in y0..=y1 {
                let Some(k) = self.index.find(Self::hash(self.index.hasher(), (x, y)), &|k| self.keys[k as usize] == (x, y)) else { continue };
                let ids = &self.cells[k as usize];
                for &id in ids {
                    let hit = if id % 2 == 0 { boxes_overlap(self.boxes[id / 2], b) } else { segment_hits_box(self.segs[id / 2].0, self.segs[id / 2].1, b) };
                    if hit {
                        return false;
                    }
                }
            }
        }
        true
    }

    /// Every data mark and label mark under `nodes` as obstacles: boxes of
    /// bars, points and label texts, segments of lines and outlines.
    pub(super) fn of_marks(nodes: &[Node]) -> Grid {
        fn walk(n: &Node, g: &mut Grid) {
            match n {
                Node::Group { children, .. } | Node::Titled { children, .. } => children.iter().for_each(|c| walk(c, g)),
                Node::Rect { x, y, width, height, datum: Some(_), .. } => g.add_box((*x, *y, x + width, y + height)),
                Node::Circle { cx, cy, r, datum: Some(_), .. } => g.add_box((cx - r, cy - r, cx + r, cy + r)),
                Node::Path { d, .. } => {
                    let mut last: Option<(f64, f64)> = None;
                    let mut first: Option<(f64, f64)> = None;
                    for s in d {
                        match *s {
                            Seg::Move(x, y) => {
                                last = Some((x, y));
                                first = last;
                            }
                            Seg::Line(x, y) | Seg::Arc { x, y, .. } => {
                                if let Some(p) = last {
                                    g.add_segment(p, (x, y));
                                }
                                last = Some((x, y));
                            }
                            Seg::Close => {
                                if let (Some(p), Some(q)) = (last, first) {
                                    g.add_segment(p, q);
                                }
                            }
                        }
                    }
                }
                Node::Text { x, y, text, size, anchor, class, .. } if class.starts_with("strata-label") => {
                    g.add_box(text_box(*x, *y, crate::text::width(text, *size, false), *size, *anchor))
                }
                _ => {}
            }
        }
        let mut g = Grid::default();
        nodes.iter().for_each(|n| walk(n, &mut g));
        g
    }
}

/// Text colour for a label drawn over `behind`: the theme's text or
/// background colour, whichever contrasts more with it by the WCAG 2.x
/// contrast ratio (W3C WCAG 2.1, "contrast ratio", success criterion
/// 1.4.3); black or white when neither reaches 4.5:1, the level for normal
/// text (one of those two always does: the lowest best case is about 4.58).
pub fn contrasting_text(behind: &str, pal: &crate::color::Palette) -> String {
    use crate::color::contrast;
    let best = |a: &str, b: &str| {
        let (ca, cb) = (contrast(a, behind).unwrap_or(0.0), contrast(b, behind).unwrap_or(0.0));
        if ca >= cb {
            (a.to_string(), ca)
        } else {
            (b.to_string(), cb)
        }
    };
    let (c, ratio) = best(&pal.text, &pal.background);
    if ratio >= 4.5 {
        return c;
    }
    best("#000000", "#ffffff").0
}

/// Text colour for a label on the chart's background: its mark's colour
/// when that reads at 4.5:1, else the theme's text colour.
fn on_background(mark: &str, pal: &crate::color::Palette) -> String {
    match crate::color::contrast(mark, &pal.background) {
        Some(c) if c >= 4.5 => mark.to_string(),
        _ => pal.text.clone(),
    }
}

/// The layer a label layer names: the first other bar, line, step or area
/// layer drawing the same x and y columns.
fn companion<'a>(ctx: &Ctx<'a>, layer: &PlannedLayer) -> Option<&'a PlannedLayer> {
    let names = |l: &PlannedLayer| (l.data.names.get(&Channel::X).cloned(), l.data.names.get(&Channel::Y).cloned());
    let mine = names(layer);
    mine.1.as_ref()?;
    ctx.layers
        .iter()
        .find(|l| l.index != layer.index && matches!(l.geometry, Geometry::Bar | Geometry::Line | Geometry::Step | Geometry::Area) && names(l) == mine)
}

/// The pixel segments of a line layer's series (to keep labels off them).
fn line_segments(ctx: &Ctx, line: &PlannedLayer) -> Vec<((f64, f64), (f64, f64))> {
    let mut out = Vec::new();
    for rows in line_series(line) {
        let (pts, _, _) = series_units(ctx, line, &rows, Channel::Y);
        let px = ctx.coord.line(&pts);
        out.extend(px.windows(2).map(|w| (w[0], w[1])));
    }
    out
}

fn label_text(tv: Option<&Values>, i: usize) -> Option<String> {
    match tv.map(|t| t.json(i)) {
        Some(serde_json::Value::String(s)) => Some(s),
        Some(serde_json::Value::Number(n)) => n.as_f64().map(crate::format::value_label),
        _ => None,
    }
}

// ------------------------------------------------------------ direct labels

/// Does the layer name its series at their ends (`label_ends` on a line,
/// step or area layer)?
pub fn names_ends(layer: &PlannedLayer) -> bool {
    layer.label_ends && matches!(layer.geometry, Geometry::Line | Geometry::Step | Geometry::Area)
}

/// The name of the series a row belongs to: its colour category, else its
/// group, else the y column's readable name.
fn series_name(layer: &PlannedLayer, i: usize) -> String {
    for ch in [Channel::Color, Channel::Group] {
        if let Some(k) = layer.data.get(ch).and_then(|v| v.key(i)) {
            return k;
        }
    }
    layer.data.names.get(&Channel::Y).map(|n| crate::text::readable_name(n)).unwrap_or_default()
}

/// Names a `label_ends` layer writes (for the room the layout keeps).
pub fn end_names(layer: &PlannedLayer) -> Vec<String> {
    if !names_ends(layer) {
        return vec![];
    }
    let mut out: Vec<String> = Vec::new();
    for rows in series(layer) {
        if let Some(&i) = rows.first() {
            out.push(series_name(layer, i));
        }
    }
    out.dedup();
    out
}

/// Gap between a line's end and its name (px).
pub const END_GAP: f64 = 6.0;

/// `colour` with its OKLab lightness moved (darker on a light background,
/// lighter on a dark one) by the least amount that makes it read at 4.5:1
/// against `background` (WCAG 2.1 contrast ratio); hue and chroma kept, up
/// to the sRGB gamut.
pub fn readable_on(colour: &str, background: &str) -> String {
    use crate::color::{contrast, hex_to_oklab, luminance, oklab_to_hex};
    let ok = |c: &str| contrast(c, background).is_some_and(|r| r >= 4.5);
    let (Some(lab), Some(bg)) = (hex_to_oklab(colour), luminance(background)) else { return colour.to_string() };
    if ok(colour) {
        return colour.to_string();
    }
    let target = if bg > 0.18 { 0.0 } else { 1.0 };
    let at = |l: f64| oklab_to_hex([l, lab[1], lab[2]]);
    // Bisection on lightness between the colour (fails) and black or white (passes).
    let (mut fail, mut pass) = (lab[0], target);
    if !ok(&at(pass)) {
        return if target == 0.0 { "#000000".into() } else { "#ffffff".into() };
    }
    for _ in 0..40 {
        let mid = 0.5 * (fail + pass);
        if ok(&at(mid)) {
            pass = mid;
        } else {
            fail = mid;
        }
    }
    at(pass)
}

/// The names of a `label_ends` layer's series, just right of each series'
/// last point, pushed apart vertically by the least squares placement of
/// [`crate::text::place::spread`] so that none overlaps another and each
/// stays as near its line's end as it can.
fn end_labels(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let Some(xv) = layer.data.get(Channel::X) else { return vec![] };
    let Some(yv) = layer.data.get(Channel::Y) else { return vec![] };
    if ctx.coord.is_polar() {
        return vec![];
    }
    let base = if layer.geometry == Geometry::Area { layer.data.get(Channel::YBase) } else { None };
    let size = layer.style.font_size.filter(|s| s.is_finite() && *s > 0.0).unwrap_or(ctx.text_size * 11.0 / 12.0);
    let mut ends: Vec<(String, f64, f64, String)> = Vec::new();
    for rows in series(layer) {
        // The last point: the row furthest along x with a y.
        let mut best: Option<(f64, f64, usize)> = None;
        for &i in &rows {
            let (Some(a), Some(mut b)) = (ux(ctx, layer, xv, i), ctx.scales.y.unit(yv, i)) else { continue };
            if let Some(u0) = base.and_then(|v| v.num(i)).and_then(|v| ctx.scales.y.unit_num(v)) {
                b = 0.5 * (b + u0);
            }
            if best.is_none_or(|(ba, _, _)| a > ba) {
                best = Some((a, b, i));
            }
        }
        let Some((a, b, i)) = best else { continue };
        let (px, py) = ctx.coord.point(a, b);
        ends.push((series_name(layer, i), px, py, color_of(ctx, layer, i)));
    }
    let frame = ctx.coord.frame();
    let line = size * crate::text::LINE_HEIGHT;
    let mut want: Vec<f64> = Vec::with_capacity(ends.len());
    for e in &ends {
        want.push(e.2);
    }
    let at = crate::text::place::spread(&want, line, frame.top + line / 2.0, frame.bottom() - line / 2.0);
    let cap = size * crate::text::CAP;
    let mut out = Vec::with_capacity(ends.len());
    for ((name, px, _, colour), y) in ends.into_iter().zip(at) {
        out.push(Node::text(
            px + END_GAP,
            y + cap / 2.0,
            name,
            size,
            Anchor::Start,
            readable_on(&colour, &ctx.palette.background),
            "strata-label strata-end-label",
        ));
    }
    out
}

/// Label marks. Where each goes, in order of preference, keeping off the
/// labels already placed and inside the frame:
/// - stacked (`arrange: stack | proportion`): in the middle of its own
///   segment, in the colour that contrasts with the segment;
/// - over bars of the same x and y: just outside the bar's end, or inside
///   it when the outside leaves the frame;
/// - at line points: above, below, right or left of the point, whichever
///   first keeps off the line;
/// - elsewhere: above, right, below or left of the point.
///
/// A label that finds no free place is left out: labels never overlap.
fn labels(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let d = &layer.data;
    let (Some(xv), Some(yv)) = (d.get(Channel::X), d.get(Channel::Y)) else { return vec![] };
    let tv = d.get(Channel::Text).or(d.get(Channel::Y));
    let size = layer.style.font_size.filter(|s| s.is_finite() && *s > 0.0).unwrap_or(ctx.text_size * 11.0 / 12.0);
    if ctx.coord.is_polar() {
        return centred_labels(ctx, layer, size);
    }
    let pal = ctx.palette;
    let frame = ctx.coord.frame();
    let transposed = matches!(ctx.coord, Coord::Transposed(_));
    let base = d.get(Channel::YBase);
    // A stacked label's segment ends at its running top (`y` is its own value).
    let yv = d.get(Channel::YTop).unwrap_or(yv);
    let partner = companion(ctx, layer);
    let over_bars = partner.is_some_and(|p| p.geometry == Geometry::Bar);
    // The line a label layer names: its labels keep off it.
    let line = match partner {
        Some(p) if matches!(p.geometry, Geometry::Line | Geometry::Step) => line_segments(ctx, p),
        _ => vec![],
    };
    let zero = ctx.scales.y.unit_num(0.0).unwrap_or(0.0);
    let cap = size * crate::text::CAP;
    let gap = 4.0;
    let mut grid = Grid::default();
    for (p, q) in line {
        grid.add_segment(p, q);
    }
    let mut out = Vec::new();
    for i in 0..d.len {
        let (Some(a), Some(b)) = (ux(ctx, layer, xv, i), ctx.scales.y.unit(yv, i)) else { continue };
        let Some(text) = label_text(tv, i) else { continue };
        let w = crate::text::width(&text, size, false);
        let mark = color_of(ctx, layer, i);
        // Candidates: (x, baseline, anchor, fill).
        let mut cands: Vec<(f64, f64, Anchor, String, bool)> = Vec::new();
        // A label around a free point: the point, for a leader line when
        // the label had to go to the far ring.
        let mut around = None;
        if let Some(u0) = base.and_then(|v| v.num(i)).and_then(|v| ctx.scales.y.unit_num(v)) {
            // Its own segment of the stack.
            let (p0, p1) = (ctx.coord.point(a, u0), ctx.coord.point(a, b));
            let (mx, my) = ((p0.0 + p1.0) / 2.0, (p0.1 + p1.1) / 2.0);
            let room = if transposed { (p1.0 - p0.0).abs() >= w + 4.0 } else { (p1.1 - p0.1).abs() >= cap + 4.0 };
            if room {
                cands.push((mx, my + cap / 2.0, Anchor::Middle, contrasting_text(&mark, pal), false));
            }
        } else if over_bars {
            let behind = if d.get(Channel::Color).is_some() {
                mark.clone()
            } else {
                partner.and_then(|p| p.style.color.clone()).unwrap_or_else(|| ctx.default_color.to_string())
            };
            let (px, py) = ctx.coord.point(a, b);
            let up = b >= zero;
            let outside_fill = on_background(&behind, pal);
            let inside_fill = contrasting_text(&behind, pal);
            if transposed {
                // Values run across: the bar's end is its right (or left) side.
                let y = py + cap / 2.0;
                let (out_x, out_a, in_x, in_a) =
                    if up { (px + gap, Anchor::Start, px - gap, Anchor::End) } else { (px - gap, Anchor::End, px + gap, Anchor::Start) };
                cands.push((out_x, y, out_a, outside_fill, true));
                cands.push((in_x, y, in_a, inside_fill, false));
            } else {
                let (out_y, in_y) = if up { (py - gap, py + gap + cap) } else { (py + gap + cap, py - gap) };
                cands.push((px, out_y, Anchor::Middle, outside_fill, true));
                cands.push((px, in_y, Anchor::Middle, inside_fill, false));
            }
        } else {
            // Around the point: the four sides, then the four corners,
            // then the same again twice and four times as far.
            let (px, py) = ctx.coord.point(a, b);
            around = Some((px, py));
            let fill = on_background(&mark, pal);
            for k in [1.0, 2.0, 4.0] {
                let g = (gap + 2.0) * k;
                let sides = [
                    (px, py - g, Anchor::Middle),
                    (px, py + g + cap, Anchor::Middle),
                    (px + g, py + cap / 2.0, Anchor::Start),
                    (px - g, py + cap / 2.0, Anchor::End),
                    (px + g, py - g, Anchor::Start),
                    (px - g, py - g, Anchor::End),
                    (px + g, py + g + cap, Anchor::Start),
                    (px - g, py + g + cap, Anchor::End),
                ];
                cands.extend(sides.into_iter().map(|(x, y, an)| (x, y, an, fill.clone(), true)));
            }
        }
        let chosen = cands.into_iter().enumerate().find(|(_, (x, y, anchor, _, _))| {
            let bx = text_box(*x, *y, w, size, *anchor);
            box_within(bx, frame) && grid.free(bx)
        });
        let Some((k, (x, y, anchor, fill, on_background))) = chosen else { continue };
        let bx = text_box(x, y, w, size, anchor);
        grid.add_box(bx);
        // On the far ring (the third eight places, 24 px out) a label could
        // be read as its neighbour's: a leader joins it to its point, as
        // moved notes have (seen on 51 labelled states in a user trial).
        if let Some(p) = around.filter(|_| k >= FAR_RING) {
            out.extend(leader(p, bx, pal));
        }
        // A label on the background in the theme's text colour follows the
        // theme (dark mode restyles it); inside a mark it keeps its contrast.
        let class = if on_background && fill == pal.text { "strata-label strata-label-text" } else { "strata-label" };
        out.push(Node::text(x, y, text, size, anchor, fill, class));
    }
    out
}

/// The first candidate place around a point that is on the far ring.
const FAR_RING: usize = 16;

/// Labels centred just above their points (polar coordinates).
fn centred_labels(ctx: &Ctx, layer: &PlannedLayer, size: f64) -> Vec<Node> {
    let d = &layer.data;
    let (Some(xv), Some(yv)) = (d.get(Channel::X), d.get(Channel::Y)) else { return vec![] };
    let tv = d.get(Channel::Text).or(d.get(Channel::Y));
    let mut out = Vec::new();
    for i in 0..d.len {
        let (Some(a), Some(b)) = (ux(ctx, layer, xv, i), ctx.scales.y.unit(yv, i)) else { continue };
        let Some(text) = label_text(tv, i) else { continue };
        let (x, y) = ctx.coord.point(a, b);
        out.push(Node::text(x, y - 4.0, text, size, Anchor::Middle, color_of(ctx, layer, i), "strata-label"));
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn segments_and_boxes() {
        let b = (10.0, 10.0, 20.0, 20.0);
        // Through, ending inside, passing by, and along an edge's line outside.
        assert!(segment_hits_box((0.0, 15.0), (30.0, 15.0), b));
        assert!(segment_hits_box((0.0, 0.0), (12.0, 12.0), b));
        assert!(!segment_hits_box((0.0, 0.0), (30.0, 5.0), b));
        assert!(!segment_hits_box((25.0, 0.0), (25.0, 30.0), b));
        // A diagonal that clips only the corner region outside the box.
        assert!(!segment_hits_box((0.0, 18.0), (8.0, 30.0), b));
    }

    #[test]
    fn label_text_contrasts_with_what_is_behind() {
        let light = crate::color::Palette::light();
        // On the theme's mark colours and on a mid orange, 4.5:1 or more
        // (WCAG 2.1 contrast ratio, criterion 1.4.3).
        for behind in ["#007e89", "#e38b3a", "#ffffff", "#1d232b", "#777777", "#7f7f7f"] {
            let c = contrasting_text(behind, &light);
            assert!(crate::color::contrast(&c, behind).unwrap() >= 4.5, "{c} on {behind}");
        }
    }
}
