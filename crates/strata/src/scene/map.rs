//! Maps: the plan's projection fitted to the plot box (`geo::fit`), then
//! the sphere's outline, the graticule, every `region` layer's shapes and the
//! other layers' points at longitude (x) and latitude (y).

use super::marks::datum;
use super::{polyline, Node, Paint, Seg};
use crate::channel::Channel;
use crate::color::Palette;
use crate::geo::fit::{self, Pieces};
use crate::geo::{clip, View};
use crate::plan::{Geometry, Plan, PlannedLayer};

/// Fill of a shape with no data row.
pub const NO_DATA: &str = "#d9dcdf";

fn ring_segs(px: &Pieces) -> Vec<Seg> {
    let mut d = Vec::new();
    for r in &px.rings {
        let n = r.len().saturating_sub(1);
        d.extend(polyline(&r[..n], true));
    }
    for l in &px.lines {
        d.extend(polyline(l, false));
    }
    d
}

/// The points of a layer in plane coordinates, row by row.
fn layer_points(p: &View, layer: &PlannedLayer) -> Vec<Option<(f64, f64)>> {
    let (Some(x), Some(y)) = (layer.data.get(Channel::X), layer.data.get(Channel::Y)) else { return Vec::new() };
    (0..layer.data.len)
        .map(|i| match (x.num(i), y.num(i)) {
            (Some(lon), Some(lat)) if lat.abs() <= 90.0 => clip::point(p, (lon, lat)),
            _ => None,
        })
        .collect()
}

/// The parts of a polyline inside a box (x0, y0, x1, y1): each segment
/// clipped by Liang-Barsky, runs joined.
fn clip_to_box(l: &[(f64, f64)], b: (f64, f64, f64, f64)) -> Vec<Vec<(f64, f64)>> {
    let mut out: Vec<Vec<(f64, f64)>> = Vec::new();
    let mut cur: Vec<(f64, f64)> = Vec::new();
    for w in l.windows(2) {
        let (a, c) = (w[0], w[1]);
        let (dx, dy) = (c.0 - a.0, c.1 - a.1);
        let (mut t0, mut t1) = (0.0f64, 1.0f64);
        let mut keep = true;
        for (p, q) in [(-dx, a.0 - b.0), (dx, b.2 - a.0), (-dy, a.1 - b.1), (dy, b.3 - a.1)] {
            if p == 0.0 {
                if q < 0.0 {
                    keep = false;
                }
            } else {
                let r = q / p;
                if p < 0.0 {
                    t0 = t0.max(r);
                } else {
                    t1 = t1.min(r);
                }
            }
        }
        if !keep || t0 > t1 {
            if cur.len() >= 2 {
                out.push(std::mem::take(&mut cur));
            }
            cur.clear();
            continue;
        }
        let s = (a.0 + t0 * dx, a.1 + t0 * dy);
        let e = (a.0 + t1 * dx, a.1 + t1 * dy);
        if cur.last() != Some(&s) {
            if cur.len() >= 2 {
                out.push(std::mem::take(&mut cur));
            }
            cur = vec![s];
        }
        cur.push(e);
        if t1 < 1.0 {
            out.push(std::mem::take(&mut cur));
        }
    }
    if cur.len() >= 2 {
        out.push(cur);
    }
    out
}

/// Whether any region of the plan lacks a data row (it then gets the "no data" fill and legend entry).
pub fn has_no_data(plan: &Plan) -> bool {
    let Some(m) = &plan.map else { return false };
    plan.layers.iter().enumerate().any(|(li, l)| {
        l.geometry == Geometry::Region && l.style.color.is_none() && m.rows.get(li).and_then(|r| r.as_ref()).is_some_and(|r| r.iter().any(Option::is_none))
    })
}

/// Draw the plan's map in the box. `reserve`: keep room for the "no data"
/// entry under the map (panels keep it alike so every map has one scale).
pub fn draw(plan: &Plan, pal: &Palette, left: f64, top: f64, right: f64, bottom: f64, reserve: bool) -> Vec<Node> {
    // (Without the `maps` feature no plan has a map: plan::build refuses it.)
    let Some(m) = plan.map.as_ref().filter(|_| cfg!(feature = "maps")) else { return Vec::new() };
    let p = m.view;
    let shapes: Vec<Pieces> = m.features.iter().map(|f| fit::project(&p, f)).collect();
    let mut points: Vec<Pieces> = Vec::new();
    for l in &plan.layers {
        let pc = Pieces { points: layer_points(&p, l).into_iter().flatten().collect(), ..Default::default() };
        points.push(pc);
    }
    // Shapes with no row get the "no data" fill and a legend entry under the map.
    let no_data = has_no_data(plan);
    let bottom = if no_data || reserve { bottom - 22.0 } else { bottom };
    // Fitting the rows drawn when there are none shows the whole sphere.
    let bounds = if m.fit_data { fit::bounds(points.iter()) } else { fit::bounds(shapes.iter()).or_else(|| fit::bounds(points.iter())) };
    // Fitting rows: keep room round them for circles and labels.
    let inset = if m.fit_data && bounds.is_some() { (0.08 * (right - left).min(bottom - top)).min(32.0) } else { 0.0 };
    let fitted = fit::fit(p, bounds, (left + inset, top + inset, (right - left - 2.0 * inset).max(1.0), (bottom - top - 2.0 * inset).max(1.0)));
    let to_px = |pc: Pieces| fitted.to_pixels(&pc);
    let mut out = Vec::new();

    let mut back = Vec::new();
    let bx = (left - 0.5, top - 0.5, right + 0.5, bottom + 0.5);
    if let Some(step) = m.graticule {
        let g = Pieces { lines: clip::graticule(&p, step), ..Default::default() };
        let lines = to_px(g).lines.iter().flat_map(|l| clip_to_box(l, bx)).collect();
        let d = ring_segs(&Pieces { lines, ..Default::default() });
        back.push(Node::path(d, Paint::stroke(&pal.grid, 0.75), None));
    }
    if m.outline {
        // The sphere's edge, when the whole of it is in view.
        let o = Pieces { rings: vec![clip::outline(&p)], ..Default::default() };
        let px = to_px(o);
        if fit::bounds([&px]).is_some_and(|b| b.0 >= bx.0 && b.1 >= bx.1 && b.2 <= bx.2 && b.3 <= bx.3) {
            back.push(Node::path(ring_segs(&px), Paint::stroke(&pal.axis, 1.0), None));
        }
    }
    if no_data {
        let y = bottom + 10.0;
        let entry = vec![
            Node::Rect { x: left, y, width: 12.0, height: 12.0, paint: Paint::fill(NO_DATA), datum: None },
            Node::Text {
                x: left + 18.0,
                y: y + 10.0,
                text: "No data".into(),
                size: 12.0,
                anchor: super::Anchor::Start,
                bold: false,
                angle: 0.0,
                fill: pal.muted.clone(),
                class: "strata-legend-label".into(),
            },
        ];
        out.push(Node::group("strata-legend strata-no-data", entry));
    }
    if !back.is_empty() {
        out.push(Node::group("strata-map-frame", back));
    }

    for (li, layer) in plan.layers.iter().enumerate() {
        let mut marks = Vec::new();
        match layer.geometry {
            Geometry::Region => {
                let rows = m.rows.get(li).cloned().flatten();
                let base = layer.style.color.clone().unwrap_or_else(|| if rows.is_some() { NO_DATA.to_string() } else { pal.grid.clone() });
                for (fi, f) in m.features.iter().enumerate() {
                    let px = to_px(shapes[fi].clone());
                    if px.rings.is_empty() && px.lines.is_empty() {
                        continue;
                    }
                    let row = rows.as_ref().and_then(|r| r[fi]);
                    let fill = row.and_then(|i| layer.data.get(Channel::Color).and_then(|v| plan.scales.color_of(v, i))).unwrap_or_else(|| base.clone());
                    let mut d = match row {
                        Some(i) => datum(layer, i),
                        None => Default::default(),
                    };
                    let name = f.key.clone().unwrap_or_else(|| format!("shape {}", f.index + 1));
                    d.shift_insert(0, "shape".into(), serde_json::Value::String(name));
                    if row.is_none() && rows.is_some() {
                        d.insert("value".into(), serde_json::Value::String("no data".into()));
                    }
                    // Every region has a tooltip (its name and value), even
                    // without `tooltip` columns: a shape is not readable
                    // from its outline alone.
                    d.entry("tooltip".to_string()).or_insert_with(|| serde_json::Value::Object(Default::default()));
                    // Lines (a shape with no area) are stroked in the fill colour.
                    let line_only = px.rings.is_empty();
                    let paint = Paint {
                        fill: Some(if line_only { "none".into() } else { fill.clone() }),
                        stroke: Some(if line_only { fill } else { pal.background.clone() }),
                        stroke_width: Some(layer.style.width.unwrap_or(if line_only { 1.5 } else { 0.5 })),
                        opacity: layer.style.opacity,
                        even_odd: true,
                        ..Default::default()
                    };
                    marks.push(Node::path(ring_segs(&px), paint, Some(d)));
                }
            }
            Geometry::Line | Geometry::Step => {
                // A line a series (by colour, then group), joining its rows
                // in order along great circles, cut at the seam.
                let (Some(x), Some(y)) = (layer.data.get(Channel::X), layer.data.get(Channel::Y)) else { continue };
                let series_of = |i: usize| {
                    let keys =
                        [Channel::Color, Channel::Group].iter().filter_map(|c| layer.data.get(*c)).map(|v| v.key(i).unwrap_or_default()).collect::<Vec<_>>();
                    crate::join(&keys, "\u{1f}")
                };
                let mut order: Vec<String> = Vec::new();
                // `series[j]` is series `order[j]`'s first row and points.
                let mut places = crate::index::Places::new();
                let mut series: Vec<(usize, Vec<(f64, f64)>)> = Vec::new();
                for i in 0..layer.data.len {
                    let (Some(lon), Some(lat)) = (x.num(i), y.num(i)) else { continue };
                    if lat.abs() > 90.0 || !lon.is_finite() {
                        continue;
                    }
                    let k = series_of(i);
                    let j = places.push(&mut order, &k);
                    if j == series.len() {
                        series.push((i, Vec::new()));
                    }
                    series[j].1.push((lon, lat));
                }
                for (first, path) in &series {
                    if path.len() < 2 {
                        continue;
                    }
                    let pc = Pieces { lines: clip::line(&p, path), ..Default::default() };
                    let d = ring_segs(&to_px(pc));
                    let c = layer
                        .data
                        .get(Channel::Color)
                        .and_then(|v| plan.scales.color_of(v, *first))
                        .or_else(|| layer.style.color.clone())
                        .unwrap_or_else(|| pal.mark.clone());
                    let mut paint = Paint::stroke(&c, layer.style.width.unwrap_or(2.0));
                    paint.dash = layer.style.dash.clone();
                    marks.push(Node::path(d, paint, Some(datum(layer, *first))));
                }
            }
            Geometry::Label => {
                let Some(t) = layer.data.get(Channel::Text) else { continue };
                for (i, q) in layer_points(&p, layer).iter().enumerate() {
                    let (Some(q), Some(text)) = (q, t.key(i)) else { continue };
                    let (x, y) = fitted.px(*q);
                    let size = layer.style.font_size.unwrap_or(12.0);
                    marks.push(Node::Text {
                        x,
                        y: y - 6.0,
                        text,
                        size,
                        anchor: super::Anchor::Middle,
                        bold: false,
                        angle: 0.0,
                        fill: layer.style.color.clone().unwrap_or_else(|| pal.text.clone()),
                        class: "strata-label".into(),
                    });
                }
            }
            Geometry::Point => {
                // Points at longitude and latitude:
                // big circles under small ones.
                let pts = layer_points(&p, layer);
                let mut order: Vec<(usize, (f64, f64), f64)> = Vec::new();
                for (i, q) in pts.iter().enumerate() {
                    let Some(q) = q else { continue };
                    let xy = fitted.px(*q);
                    let r = layer.data.get(Channel::Size).and_then(|v| plan.scales.radius_of(v, i)).unwrap_or(layer.style.radius.unwrap_or(3.5));
                    order.push((i, xy, r));
                }
                crate::sort::by(&mut order, |a, b| b.2.total_cmp(&a.2).then(a.0.cmp(&b.0)));
                for (i, (cx, cy), r) in order {
                    let c = layer
                        .data
                        .get(Channel::Color)
                        .and_then(|v| plan.scales.color_of(v, i))
                        .or_else(|| layer.style.color.clone())
                        .unwrap_or_else(|| pal.mark.clone());
                    let paint = Paint {
                        fill: Some(c),
                        stroke: Some(pal.background.clone()),
                        stroke_width: Some(0.75),
                        opacity: Some(layer.style.opacity.unwrap_or(0.85)),
                        ..Default::default()
                    };
                    marks.push(Node::Circle { cx, cy, r, paint, datum: Some(datum(layer, i)) });
                }
            }
            // Other geometries have no place on a map (the plan warned).
            _ => {}
        }
        out.push(Node::named_group(format!("strata-layer strata-{}", layer.geometry.word()), Some("list"), None, marks));
    }
    let notes = map_notes(plan, &p, &fitted, pal, bx);
    if !notes.is_empty() {
        out.push(Node::group("strata-notes", notes));
    }
    out
}

/// Notes at longitude (`x`) and latitude (`y`): a point with its text, a
/// meridian (`x` alone), a parallel (`y` alone), or a shaded box of
/// longitudes and latitudes (with `x_end`/`y_end`).
fn map_notes(plan: &Plan, p: &View, fitted: &fit::Fitted, pal: &Palette, bx: (f64, f64, f64, f64)) -> Vec<Node> {
    let mut out = Vec::new();
    let num = |v: &Option<serde_json::Value>| v.as_ref().and_then(serde_json::Value::as_f64).filter(|x| x.is_finite());
    let text = |x: f64, y: f64, t: &str| Node::Text {
        x,
        y,
        text: t.to_string(),
        size: 12.0,
        anchor: super::Anchor::Start,
        bold: false,
        angle: 0.0,
        fill: pal.text.clone(),
        class: "strata-note".into(),
    };
    let draw_lines = |lines: Vec<Vec<(f64, f64)>>| {
        let pc = Pieces { lines, ..Default::default() };
        let lines = fitted.to_pixels(&pc).lines.iter().flat_map(|l| clip_to_box(l, bx)).collect();
        Pieces { lines, ..Default::default() }
    };
    for n in &plan.chart.notes {
        let (x, y, x2, y2) = (num(&n.x), num(&n.y).map(|v| v.clamp(-90.0, 90.0)), num(&n.x_end), num(&n.y_end).map(|v| v.clamp(-90.0, 90.0)));
        let label = n.text.clone().unwrap_or_default();
        match (x, y, x2, y2) {
            (Some(lon), Some(lat), None, None) => {
                let Some(q) = clip::point(p, (lon, lat)) else { continue };
                let (cx, cy) = fitted.px(q);
                out.push(Node::Circle { cx, cy, r: 2.5, paint: Paint::fill(&pal.text), datum: None });
                if !label.is_empty() {
                    out.push(text(cx + 6.0, cy - 6.0, &label));
                }
            }
            (Some(a), None, b, None) => {
                let lons = [Some(a), b];
                for lon in lons.into_iter().flatten() {
                    let m: Vec<(f64, f64)> = (0..=170).map(|j| (lon, -85.0 + j as f64)).collect();
                    let px = draw_lines(clip::line(p, &m));
                    let mut paint = Paint::stroke(&pal.axis, 1.0);
                    paint.dash = Some(vec![4.0, 3.0]);
                    if let Some(top) = px.lines.iter().flatten().copied().min_by(|u, v| u.1.total_cmp(&v.1)) {
                        if !label.is_empty() && lon == a {
                            out.push(text(top.0 + 4.0, top.1 + 12.0, &label));
                        }
                    }
                    out.push(Node::path(ring_segs(&px), paint, None));
                }
            }
            (None, Some(a), None, b) => {
                for lat in [Some(a), b].into_iter().flatten() {
                    let par: Vec<(f64, f64)> = (0..=360).map(|j| (-180.0 + j as f64, lat)).collect();
                    let px = draw_lines(clip::line(p, &par));
                    let mut paint = Paint::stroke(&pal.axis, 1.0);
                    paint.dash = Some(vec![4.0, 3.0]);
                    if let Some(left) = px.lines.iter().flatten().copied().min_by(|u, v| u.0.total_cmp(&v.0)) {
                        if !label.is_empty() && lat == a {
                            out.push(text(left.0 + 4.0, left.1 - 4.0, &label));
                        }
                    }
                    out.push(Node::path(ring_segs(&px), paint, None));
                }
            }
            (Some(x0), Some(y0), Some(x1), Some(y1)) => {
                // A box of longitudes and latitudes, its sides a degree at a time.
                let (w, e, s_, n_) = (x0.min(x1), x0.max(x1), y0.min(y1), y0.max(y1));
                let steps = |a: f64, b: f64| ((b - a).abs().ceil() as usize).clamp(1, 360);
                let mut ring: Vec<(f64, f64)> = Vec::new();
                let k = steps(w, e);
                ring.extend((0..=k).map(|j| (w + (e - w) * j as f64 / k as f64, s_)));
                ring.extend((0..=k).map(|j| (e - (e - w) * j as f64 / k as f64, n_)));
                ring.push(ring[0]);
                let pc = Pieces { rings: clip::polygon(p, &[ring]), ..Default::default() };
                let px = fitted.to_pixels(&pc);
                if px.rings.is_empty() {
                    continue;
                }
                let paint = Paint { fill: Some(pal.muted.clone()), opacity: Some(0.15), even_odd: true, ..Default::default() };
                if let (Some(b), false) = (fit::bounds([&px]), label.is_empty()) {
                    out.push(text(b.0 + 4.0, b.1 + 14.0, &label));
                }
                out.insert(0, Node::path(ring_segs(&px), paint, None));
            }
            _ => {}
        }
    }
    out
}
