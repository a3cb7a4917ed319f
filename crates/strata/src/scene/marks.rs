//! Data marks of one layer in pixels.

use super::coord::{path_d, Area, Coord};
use super::{Datum, Node, Paint};
use crate::plan::{ColorScale, PlannedLayer, Scales, Values};
use crate::scale::PositionScale;
use crate::spec::{Arrange, Geometry};

/// What a layer needs from outside: the scales, coordinates and theme mark colour.
pub struct Ctx<'a> {
    pub scales: &'a Scales,
    pub coord: Coord,
    pub default_color: &'a str,
}

fn datum(layer: &PlannedLayer, i: usize) -> Datum {
    layer.data.channels.iter().filter(|(k, _)| !k.starts_with("y_base")).map(|(k, v)| (k.to_string(), v.json(i))).collect()
}

fn color_of(ctx: &Ctx, layer: &PlannedLayer, i: usize) -> String {
    if let Some(c) = layer.data.get("color").and_then(|vals| ctx.scales.color_of(vals, i)) {
        return c;
    }
    layer.style.color.clone().unwrap_or_else(|| ctx.default_color.to_string())
}

/// Unit position on x of row i (band centre for categories).
fn ux(s: &PositionScale, v: &Values, i: usize) -> Option<f64> {
    s.unit(v, i)
}

pub fn layer_marks(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    match layer.geometry {
        Geometry::Point => points(ctx, layer),
        Geometry::Line | Geometry::Step => lines(ctx, layer),
        Geometry::Bar => bars(ctx, layer),
        _ => vec![],
    }
}

fn points(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let (Some(xv), Some(yv)) = (layer.data.get("x"), layer.data.get("y")) else { return vec![] };
    let r = layer.style.radius.unwrap_or(3.5);
    let mut out = Vec::with_capacity(layer.data.len);
    for i in 0..layer.data.len {
        let (Some(ux), Some(uy)) = (ux(&ctx.scales.x, xv, i), ctx.scales.y.unit(yv, i)) else { continue };
        let (cx, cy) = ctx.coord.point(ux, uy);
        let mut paint = Paint::fill(&color_of(ctx, layer, i));
        paint.opacity = layer.style.opacity;
        // Size and shape scales (plan/scales.rs): area-true radius, shape by category.
        let r = layer.data.get("size").and_then(|v| ctx.scales.radius_of(v, i)).unwrap_or(r);
        if let Some(k) = layer.data.get("shape").and_then(|v| ctx.scales.shape_of(v, i)) {
            out.push(Node::Path { d: crate::scale::shape_path(k, cx, cy, r), paint, datum: Some(datum(layer, i)) });
            continue;
        }
        out.push(Node::Circle { cx, cy, r, paint, datum: Some(datum(layer, i)) });
    }
    out
}

fn lines(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let (Some(xv), Some(yv)) = (layer.data.get("x"), layer.data.get("y")) else { return vec![] };
    // One line per colour/group key, in order of first appearance.
    let mut keys: Vec<Option<String>> = Vec::new();
    let mut rows: Vec<Vec<usize>> = Vec::new();
    for i in 0..layer.data.len {
        let k = ["color", "group"].iter().filter_map(|c| layer.data.get(c)).map(|v| v.key(i).unwrap_or_default()).reduce(|a, b| a + "\u{1f}" + &b);
        match keys.iter().position(|x| *x == k) {
            Some(p) => rows[p].push(i),
            None => {
                keys.push(k);
                rows.push(vec![i]);
            }
        }
    }
    let width = layer.style.width.unwrap_or(2.0);
    let mut out = Vec::new();
    for idx in rows {
        let mut pts: Vec<(f64, f64, usize)> = idx
            .iter()
            .filter_map(|i| Some((ux(&ctx.scales.x, xv, *i)?, ctx.scales.y.unit(yv, *i)?, *i)))
            .collect();
        pts.sort_by(|a, b| a.0.total_cmp(&b.0));
        if pts.is_empty() {
            continue;
        }
        let mut units: Vec<(f64, f64)> = Vec::with_capacity(pts.len() * 2);
        for (k, p) in pts.iter().enumerate() {
            if layer.geometry == Geometry::Step && k > 0 {
                units.push((p.0, pts[k - 1].1));
            }
            units.push((p.0, p.1));
        }
        let px = ctx.coord.line(&units);
        let first = pts[0].2;
        let mut paint = Paint::stroke(&color_of(ctx, layer, first), width);
        paint.opacity = layer.style.opacity;
        paint.dash = layer.style.dash.clone();
        let mut d = Datum::new();
        for (k, v) in &layer.data.channels {
            if *k == "color" || *k == "group" {
                d.insert(k.to_string(), v.json(first));
            }
        }
        d.insert("points".into(), serde_json::Value::from(pts.len()));
        out.push(Node::Path { d: path_d(&px, false), paint, datum: Some(d) });
    }
    out
}

fn bars(ctx: &Ctx, layer: &PlannedLayer) -> Vec<Node> {
    let (Some(xv), Some(yv)) = (layer.data.get("x"), layer.data.get("y")) else { return vec![] };
    let base = layer.data.get("y_base");
    let band = ctx.scales.x.band();
    let fill_fraction = layer.style.band.unwrap_or(0.8).clamp(0.05, 1.0);
    // Side by side: each colour key gets a slot within the band.
    let beside_keys: Vec<String> = if layer_arrange_beside(layer) {
        match &ctx.scales.color {
            Some(ColorScale::Categories(c)) => c.clone(),
            _ => vec![],
        }
    } else {
        vec![]
    };
    let mut out = Vec::with_capacity(layer.data.len);
    for i in 0..layer.data.len {
        let (Some(cx), Some(uy)) = (ux(&ctx.scales.x, xv, i), ctx.scales.y.unit(yv, i)) else { continue };
        let ub = base.and_then(|b| b.num(i)).and_then(|b| ctx.scales.y.unit_num(b)).unwrap_or(0.0);
        let (mut x0, mut x1) = if band > 0.0 {
            (cx - band * fill_fraction / 2.0, cx + band * fill_fraction / 2.0)
        } else {
            // Continuous x without an end: a thin bar 1 % of the axis wide.
            (cx - 0.005, cx + 0.005)
        };
        if let Some(xe) = layer.data.get("x_end").and_then(|v| ctx.scales.x.unit(v, i)) {
            x0 = cx.min(xe);
            x1 = cx.max(xe);
        }
        if !beside_keys.is_empty() {
            if let Some(k) = layer.data.get("color").and_then(|c| c.key(i)).and_then(|k| beside_keys.iter().position(|b| *b == k)) {
                let w = (x1 - x0) / beside_keys.len() as f64;
                x0 += w * k as f64;
                x1 = x0 + w;
            }
        }
        let mut paint = Paint::fill(&color_of(ctx, layer, i));
        paint.opacity = layer.style.opacity;
        let d = Some(datum(layer, i));
        out.push(match ctx.coord.area(x0, x1, ub, uy) {
            Area::Rect { x, y, width, height } => Node::Rect { x, y, width, height, paint, datum: d },
            Area::Path(p) => Node::Path { d: p, paint, datum: d },
        });
    }
    out
}

fn layer_arrange_beside(layer: &PlannedLayer) -> bool {
    layer.arrange == Arrange::Beside
}
