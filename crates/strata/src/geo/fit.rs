//! A projection fitted to a pixel box: what the scene will call to turn
//! shapes into pixel outlines.
//!
//! `fit` projects everything once (unit sphere plane), takes the bounds, and
//! scales them uniformly into the box, centred, y pointing down. Outlines are
//! then simplified at the output's pixel scale (Visvalingam-Whyatt,
//! [`simplify::PIXEL_AREA`]) and put on a grid of a tenth of a pixel
//! ([`PIXEL_GRID`]): finer digits change no pixel at 1x but cost a byte a
//! number in the SVG. Neighbours keep the same points on a shared border
//! through both steps, so they still meet exactly.

use super::clip;
use super::geojson::{Feature, Geometry, Pos};
use super::project::View;
use super::simplify;

/// Outline positions are rounded to this many pixels (a tenth: one decimal
/// in the SVG). Half of it, 0.05 px, is the most a point moves, well under
/// what anti-aliasing at 1x can show.
pub const PIXEL_GRID: f64 = 0.1;

/// A point put on the [`PIXEL_GRID`].
fn snap(q: (f64, f64)) -> (f64, f64) {
    let g = |v: f64| (v / PIXEL_GRID).round() * PIXEL_GRID;
    (g(q.0), g(q.1))
}

/// A simplified outline on the pixel grid, without the repeats snapping makes.
fn on_grid(pts: Vec<(f64, f64)>) -> Vec<(f64, f64)> {
    let mut out: Vec<(f64, f64)> = Vec::with_capacity(pts.len());
    for q in pts.into_iter().map(snap) {
        if out.last() != Some(&q) {
            out.push(q);
        }
    }
    out
}

/// A projection with its pixel transform.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Fitted {
    pub view: View,
    pub scale: f64,
    pub tx: f64,
    pub ty: f64,
}

/// Projected pieces of one feature, in unit-sphere plane coordinates.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Pieces {
    /// Closed rings to fill together (even-odd).
    pub rings: Vec<Vec<(f64, f64)>>,
    /// Open lines to stroke.
    pub lines: Vec<Vec<(f64, f64)>>,
    /// Visible points.
    pub points: Vec<(f64, f64)>,
}

fn collect(p: &View, g: &Geometry, out: &mut Pieces) {
    match g {
        Geometry::Point(q) => out.points.extend(clip::point(p, *q)),
        Geometry::MultiPoint(v) => out.points.extend(v.iter().filter_map(|q| clip::point(p, *q))),
        Geometry::LineString(v) => out.lines.extend(clip::line(p, v)),
        Geometry::MultiLineString(v) => v.iter().for_each(|l| out.lines.extend(clip::line(p, l))),
        Geometry::Polygon(rs) => out.rings.extend(clip::polygon(p, rs)),
        Geometry::MultiPolygon(ps) => ps.iter().for_each(|rs| out.rings.extend(clip::polygon(p, rs))),
        Geometry::Collection(gs) => gs.iter().for_each(|g| collect(p, g, out)),
    }
}

/// Project one feature (no pixel transform yet).
pub fn project(p: &View, f: &Feature) -> Pieces {
    let mut out = Pieces::default();
    if let Some(g) = &f.geometry {
        collect(p, g, &mut out);
    }
    out
}

/// Bounds (min x, min y, max x, max y) of projected pieces; `None` if empty.
pub fn bounds<'a>(pieces: impl IntoIterator<Item = &'a Pieces>) -> Option<(f64, f64, f64, f64)> {
    let mut b = (f64::INFINITY, f64::INFINITY, f64::NEG_INFINITY, f64::NEG_INFINITY);
    for pc in pieces {
        for &(x, y) in pc.rings.iter().flatten().chain(pc.lines.iter().flatten()).chain(pc.points.iter()) {
            b = (b.0.min(x), b.1.min(y), b.2.max(x), b.3.max(y));
        }
    }
    (b.0 <= b.2 && b.1 <= b.3).then_some(b)
}

/// Fit bounds into the pixel box (left, top, width, height), uniformly and
/// centred. Empty or point-like bounds fall back to the whole sphere.
pub fn fit(p: View, b: Option<(f64, f64, f64, f64)>, bx: (f64, f64, f64, f64)) -> Fitted {
    let whole = || {
        let o = clip::outline(&p);
        bounds([&Pieces { rings: vec![o], ..Default::default() }]).unwrap_or((-1.0, -1.0, 1.0, 1.0))
    };
    let b = match b {
        Some(b) if b.2 - b.0 > 1e-9 || b.3 - b.1 > 1e-9 => b,
        _ => whole(),
    };
    let (w, h) = ((b.2 - b.0).max(1e-9), (b.3 - b.1).max(1e-9));
    let scale = (bx.2 / w).min(bx.3 / h);
    let tx = bx.0 + bx.2 / 2.0 - scale * (b.0 + b.2) / 2.0;
    let ty = bx.1 + bx.3 / 2.0 + scale * (b.1 + b.3) / 2.0;
    Fitted { view: p, scale, tx, ty }
}

impl Fitted {
    /// Plane to pixels (y down).
    pub fn px(&self, q: (f64, f64)) -> (f64, f64) {
        (self.tx + self.scale * q.0, self.ty - self.scale * q.1)
    }

    /// A geographic position in pixels, `None` when hidden.
    pub fn position(&self, pos: Pos) -> Option<(f64, f64)> {
        clip::point(&self.view, pos).map(|q| self.px(q))
    }

    /// Pieces in pixels, outlines simplified at pixel scale and put on the
    /// [`PIXEL_GRID`]; rings that shrink below a pixel square are dropped.
    pub fn to_pixels(&self, pc: &Pieces) -> Pieces {
        let ring = |r: &Vec<(f64, f64)>| {
            let px: Vec<(f64, f64)> = r.iter().map(|&q| self.px(q)).collect();
            on_grid(simplify::simplify(&px, simplify::PIXEL_AREA, true))
        };
        let rings = pc.rings.iter().map(ring).filter(|r| r.len() >= 4 && area(r).abs() >= 0.05).collect();
        let lines = pc
            .lines
            .iter()
            .map(|l| on_grid(simplify::simplify(&l.iter().map(|&q| self.px(q)).collect::<Vec<_>>(), simplify::PIXEL_AREA, false)))
            .filter(|l| l.len() >= 2)
            .collect();
        let points = pc.points.iter().map(|&q| self.px(q)).collect();
        Pieces { rings, lines, points }
    }
}

/// Signed planar area of a closed ring.
pub fn area(r: &[(f64, f64)]) -> f64 {
    r.windows(2).map(|w| w[0].0 * w[1].1 - w[1].0 * w[0].1).sum::<f64>() / 2.0
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fitted_shapes_fill_the_box_and_stay_inside() {
        let f = Feature {
            index: 0,
            key: None,
            properties: Default::default(),
            geometry: Some(Geometry::Polygon(vec![vec![(10.0, 10.0), (30.0, 10.0), (30.0, 20.0), (10.0, 20.0), (10.0, 10.0)]])),
        };
        let p = View::from(crate::geo::Projection::Mercator { lon0: 0.0 });
        let pc = project(&p, &f);
        let fit = fit(p, bounds([&pc]), (0.0, 0.0, 400.0, 300.0));
        let px = fit.to_pixels(&pc);
        let b = bounds([&px]).unwrap();
        // Wider than tall: the width is filled, the height centred.
        assert!((b.0 - 0.0).abs() < 1e-6 && (b.2 - 400.0).abs() < 1e-6, "{b:?}");
        assert!(b.1 > 0.0 && b.3 < 300.0 && ((b.1 + b.3) / 2.0 - 150.0).abs() < 1e-6);
    }
}
