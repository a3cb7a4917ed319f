//! From shapes in degrees to projected outlines on the unit sphere's plane:
//! great-circle densification, the seam opposite the centre meridian, poles
//! and the orthographic horizon.
//!
//! Every ring is read in a *frame*: the sphere turned by the map's `rotate`
//! ([`sphere::Rotation`]), then longitude relative to the centre meridian
//! (for the orthographic globe, the sphere is first turned so the centre
//! lies at 0°, 0°). In the frame the ring is unwrapped (each step takes the
//! short way round), so a ring that crosses the seam runs on past ±180°
//! instead of jumping back; a ring whose unwrapped longitude gains a whole
//! turn goes round a pole, and is closed over the pole on the side with the
//! smaller area (so either winding means the same shape). The planar ring is
//! then clipped (Sutherland-Hodgman) to the strip the projection shows,
//! |λ| ≤ 180° (or |λ| ≤ 90° in the turned frame: the visible hemisphere),
//! once for each whole-turn shift that meets the strip. Edges along the strip
//! boundary, the seam or the horizon, are filled in every degree, so they
//! follow the map's edge. Fill the pieces of one shape together with the
//! even-odd rule (holes are rings like the others).

use super::geojson::{Pos, Ring};
use super::project::{Projection, View};
use super::sphere;
use std::f64::consts::{FRAC_PI_2, PI};

const D: f64 = PI / 180.0;
/// Great-circle step of densification.
pub const STEP: f64 = 1.0 * D;

/// How a projection's frame is made.
#[derive(Debug, Clone, Copy)]
enum Frame {
    /// Longitude relative to the centre meridian; the strip is ±180°.
    Seam { rot: sphere::Rotation, lon0: f64 },
    /// The sphere turned so (lon0, lat0) is at the origin; the strip is ±90°.
    Horizon { rot: sphere::Rotation, lon0: f64, lat0: f64 },
}

fn frame(v: &View) -> Frame {
    let rot = v.rotation;
    match v.projection {
        Projection::Orthographic { lon0, lat0 } => Frame::Horizon { rot, lon0, lat0 },
        p => Frame::Seam { rot, lon0: p.lon0() },
    }
}

impl Frame {
    fn half_width(&self) -> f64 {
        match self {
            Frame::Seam { .. } => PI,
            Frame::Horizon { .. } => FRAC_PI_2,
        }
    }
    /// Frame longitude and latitude of a geographic point (radians): the
    /// map's turn first, then the projection's centre.
    fn to_frame(self, lon: f64, lat: f64) -> (f64, f64) {
        match self {
            Frame::Seam { rot, lon0 } => {
                let (lon, lat) = rot.apply(lon, lat);
                (super::project::wrap(lon - lon0), lat)
            }
            Frame::Horizon { rot, lon0, lat0 } => {
                let (lon, lat) = rot.apply(lon, lat);
                sphere::rotate_to_center(lon, lat, lon0, lat0)
            }
        }
    }
}

/// The plane position of a frame point.
fn put(p: &Projection, f: Frame, l: f64, lat: f64) -> (f64, f64) {
    match f {
        Frame::Seam { .. } => p.forward_rel(l, lat),
        // Equatorial orthographic in the turned frame.
        Frame::Horizon { .. } => (libm::cos(lat) * libm::sin(l), libm::sin(lat)),
    }
}

fn to_rad(path: &[Pos]) -> Vec<(f64, f64)> {
    path.iter().map(|&(l, p)| (l * D, p * D)).collect()
}

/// Unwrapped frame coordinates of a densified geographic path.
fn unwrap(f: Frame, path: &[(f64, f64)]) -> Vec<(f64, f64)> {
    let mut out: Vec<(f64, f64)> = Vec::with_capacity(path.len());
    for &(lon, lat) in path {
        let (l, p) = f.to_frame(lon, lat);
        match out.last() {
            None => out.push((l, p)),
            Some(&(pl, _)) => out.push((pl + super::project::wrap(l - pl), p)),
        }
    }
    out
}

/// Sutherland-Hodgman against one vertical line: keep x >= c (side = 1) or x <= c (side = -1).
fn clip_side(ring: &[(f64, f64)], c: f64, side: f64) -> Vec<(f64, f64)> {
    let mut out = Vec::with_capacity(ring.len() + 4);
    let n = ring.len();
    if n == 0 {
        return out;
    }
    let inside = |p: (f64, f64)| side * (p.0 - c) >= 0.0;
    for i in 0..n {
        let a = ring[(i + n - 1) % n];
        let b = ring[i];
        let cross = |a: (f64, f64), b: (f64, f64)| {
            let t = (c - a.0) / (b.0 - a.0);
            (c, a.1 + t * (b.1 - a.1))
        };
        match (inside(a), inside(b)) {
            (true, true) => out.push(b),
            (true, false) => out.push(cross(a, b)),
            (false, true) => {
                out.push(cross(a, b));
                out.push(b);
            }
            (false, false) => {}
        }
    }
    out
}

/// Fill in edges that run along the strip's sides or a pole line.
fn fill_edges(ring: &[(f64, f64)], w: f64, closed: bool) -> Vec<(f64, f64)> {
    let mut out = Vec::with_capacity(ring.len());
    let n = ring.len();
    let m = if closed { n } else { n.saturating_sub(1) };
    if let Some(&first) = ring.first() {
        out.push(first);
    }
    for i in 0..m {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        let on_side = (a.0.abs() - w).abs() < 1e-12 && (b.0 - a.0).abs() < 1e-12;
        let on_pole = (a.1.abs() - FRAC_PI_2).abs() < 1e-12 && (b.1 - a.1).abs() < 1e-12;
        if on_side || on_pole {
            let len = (b.0 - a.0).abs().max((b.1 - a.1).abs());
            let k = ((len / STEP).ceil() as usize).clamp(1, 1000);
            for j in 1..k {
                let t = j as f64 / k as f64;
                out.push((a.0 + t * (b.0 - a.0), a.1 + t * (b.1 - a.1)));
            }
        }
        if closed && i + 1 == n {
            break;
        }
        out.push(b);
    }
    out
}

/// The pieces of one closed ring in the strip, in frame coordinates
/// (unclosed: the last point does not repeat the first).
fn ring_pieces(f: Frame, ring: &[Pos]) -> Vec<Vec<(f64, f64)>> {
    let dense = sphere::densify(&to_rad(ring), STEP);
    let mut u = unwrap(f, &dense);
    if u.len() < 4 {
        return Vec::new();
    }
    let net = u[u.len() - 1].0 - u[0].0;
    u.pop();
    if net.abs() > PI {
        // Round a pole: the area north of the ring is the integral of
        // (1 - sin φ) dλ along it; close over the pole on the smaller side.
        let mut north = 0.0;
        let m = u.len();
        for i in 0..m {
            let (a, b) = (u[i], if i + 1 < m { u[i + 1] } else { (u[0].0 + net, u[0].1) });
            north += (1.0 - libm::sin((a.1 + b.1) / 2.0)) * (b.0 - a.0);
        }
        let pole = if north.abs() <= 2.0 * PI { FRAC_PI_2 } else { -FRAC_PI_2 };
        let (end, start) = (u[0].0 + net, u[0].0);
        let last_lat = u[0].1;
        u.push((end, last_lat));
        u.push((end, pole));
        u.push((start, pole));
    }
    let w = f.half_width();
    let (lo, hi) = u.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), p| (lo.min(p.0), hi.max(p.0)));
    let mut out = Vec::new();
    for k in -3i32..=3 {
        let s = k as f64 * 2.0 * PI;
        if hi + s < -w || lo + s > w {
            continue;
        }
        let shifted: Vec<(f64, f64)> = u.iter().map(|&(l, p)| (l + s, p)).collect();
        let c = clip_side(&clip_side(&shifted, -w, 1.0), w, -1.0);
        if c.len() >= 3 {
            out.push(fill_edges(&c, w, true));
        }
    }
    out
}

/// Projected rings of a polygon (outer ring and holes), each closed, ready
/// to fill together with the even-odd rule. Coordinates on the unit sphere's
/// plane, y north.
pub fn polygon(v: &View, rings: &[Ring]) -> Vec<Vec<(f64, f64)>> {
    let (f, p) = (frame(v), &v.projection);
    let mut out = Vec::new();
    for ring in rings {
        for piece in ring_pieces(f, ring) {
            let mut r: Vec<(f64, f64)> = piece.iter().map(|&(l, lat)| put(p, f, l, lat)).collect();
            r.push(r[0]);
            out.push(r);
        }
    }
    out
}

/// Projected pieces of a line: cut at the seam, clipped at the horizon.
pub fn line(v: &View, path: &[Pos]) -> Vec<Vec<(f64, f64)>> {
    let (f, p) = (frame(v), &v.projection);
    let w = f.half_width();
    let dense = sphere::densify(&to_rad(path), STEP);
    let u = unwrap(f, &dense);
    let (lo, hi) = u.iter().fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), p| (lo.min(p.0), hi.max(p.0)));
    let mut out = Vec::new();
    for k in -3i32..=3 {
        let s = k as f64 * 2.0 * PI;
        if hi + s < -w || lo + s > w {
            continue;
        }
        let mut cur: Vec<(f64, f64)> = Vec::new();
        for i in 0..u.len() {
            let b = (u[i].0 + s, u[i].1);
            let b_in = b.0.abs() <= w;
            if i > 0 {
                let a = (u[i - 1].0 + s, u[i - 1].1);
                let a_in = a.0.abs() <= w;
                let cross = |c: f64| (c, a.1 + (c - a.0) / (b.0 - a.0) * (b.1 - a.1));
                if a_in && !b_in {
                    cur.push(cross(if b.0 > w { w } else { -w }));
                    if cur.len() >= 2 {
                        out.push(std::mem::take(&mut cur));
                    }
                    cur.clear();
                } else if !a_in && b_in {
                    cur.push(cross(if a.0 > w { w } else { -w }));
                }
            }
            if b_in {
                cur.push(b);
            }
        }
        if cur.len() >= 2 {
            out.push(cur);
        }
    }
    out.into_iter().map(|piece| piece.iter().map(|&(l, lat)| put(p, f, l, lat)).collect()).collect()
}

/// A projected point, or `None` when the projection hides it (the far side
/// of the globe).
pub fn point(v: &View, pos: Pos) -> Option<(f64, f64)> {
    let (f, p) = (frame(v), &v.projection);
    let (l, lat) = f.to_frame(pos.0 * D, pos.1 * D);
    if l.abs() > f.half_width() {
        return None;
    }
    Some(put(p, f, l, lat))
}

/// The outline of the whole sphere: the map's edge (closed).
pub fn outline(v: &View) -> Vec<(f64, f64)> {
    let (f, p) = (frame(v), &v.projection);
    let w = f.half_width();
    let corners = [(-w, -FRAC_PI_2), (-w, FRAC_PI_2), (w, FRAC_PI_2), (w, -FRAC_PI_2)];
    let ring = fill_edges(&corners, w, true);
    let mut r: Vec<(f64, f64)> = ring.iter().map(|&(l, lat)| put(p, f, l, lat)).collect();
    r.push(r[0]);
    r
}

/// Graticule lines every `step` degrees (meridians from pole to pole but the
/// last `step` short of each pole, parallels all round), projected.
pub fn graticule(p: &View, step: f64) -> Vec<Vec<(f64, f64)>> {
    let mut out = Vec::new();
    if !(1.0..=90.0).contains(&step) {
        return out;
    }
    let n = (360.0 / step).round() as i32;
    for i in 0..n {
        let lon = -180.0 + i as f64 * step;
        let top = 90.0 - step.min(10.0);
        let m: Vec<Pos> = (0..=((2.0 * top) as i32)).map(|j| (lon, -top + j as f64)).collect();
        out.extend(line(p, &m));
    }
    let mut lat = -90.0 + step;
    while lat < 90.0 - 1e-9 {
        let par: Vec<Pos> = (0..=360).map(|j| (-180.0 + j as f64, lat)).collect();
        out.extend(line(p, &par));
        lat += step;
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn square(lon: f64, lat: f64, d: f64) -> Ring {
        vec![(lon, lat), (lon + d, lat), (lon + d, lat + d), (lon, lat + d), (lon, lat)]
    }

    #[test]
    fn a_shape_across_the_seam_is_cut_in_two() {
        let p = View::from(Projection::EqualEarth { lon0: 0.0 });
        let pieces = polygon(&p, &[square(170.0, -10.0, 20.0)]);
        assert_eq!(pieces.len(), 2);
        // One piece on each side, none reaching the middle.
        for r in &pieces {
            let xs: Vec<f64> = r.iter().map(|q| q.0).collect();
            assert!(xs.iter().all(|&x| x > 2.0) || xs.iter().all(|&x| x < -2.0), "{xs:?}");
        }
    }

    #[test]
    fn either_winding_gives_the_same_pieces() {
        let p = View::from(Projection::EqualEarth { lon0: 0.0 });
        let a = square(170.0, -10.0, 20.0);
        let mut b = a.clone();
        b.reverse();
        let area = |rs: Vec<Vec<(f64, f64)>>| rs.iter().map(|r| r.windows(2).map(|w| w[0].0 * w[1].1 - w[1].0 * w[0].1).sum::<f64>().abs() / 2.0).sum::<f64>();
        assert!((area(polygon(&p, &[a])) - area(polygon(&p, &[b]))).abs() < 1e-12);
    }

    // A ring through points on 60°S encloses the South Pole on its small
    // side: its projected area (Equal Earth keeps areas) is the spherical
    // polygon's (great-circle edges, Van Oosterom-Strackee in `sphere`),
    // whichever way it winds.
    #[test]
    fn a_ring_round_the_pole_fills_the_cap() {
        let p = View::from(Projection::EqualEarth { lon0: 0.0 });
        for rev in [false, true] {
            let mut ring: Ring = (0..=36).map(|i| (-180.0 + 10.0 * i as f64, -60.0)).collect();
            ring[36] = ring[0];
            if rev {
                ring.reverse();
            }
            let sph = sphere::ring_area(&to_rad(&ring)).abs();
            let cap = sph.min(4.0 * PI - sph);
            assert!(cap < 2.0 * PI * (1.0 - (60.0 * D).sin()));
            let rs = polygon(&p, &[ring]);
            let a: f64 = rs.iter().map(|r| r.windows(2).map(|w| w[0].0 * w[1].1 - w[1].0 * w[0].1).sum::<f64>().abs() / 2.0).sum();
            // 1e-3: planar chords between points 1° apart.
            assert!((a / cap - 1.0).abs() < 1e-3, "area {a} vs cap {cap}");
            assert!(rs.iter().flatten().all(|q| q.1 < -0.9));
        }
    }

    #[test]
    fn the_far_side_is_hidden() {
        let p = View::from(Projection::Orthographic { lon0: 0.0, lat0: 0.0 });
        assert!(polygon(&p, &[square(170.0, -10.0, 20.0)]).is_empty());
        assert!(point(&p, (180.0, 0.0)).is_none());
        // A shape over the limb is closed along the horizon (the unit circle).
        let rs = polygon(&p, &[square(80.0, -10.0, 20.0)]);
        assert_eq!(rs.len(), 1);
        assert!(rs[0].iter().all(|q| q.0.hypot(q.1) <= 1.0 + 1e-12));
        assert!(rs[0].iter().filter(|q| (q.0.hypot(q.1) - 1.0).abs() < 1e-9).count() >= 10);
    }

    #[test]
    fn oblique_frame_matches_the_oblique_formula() {
        let p = View::from(Projection::Orthographic { lon0: -40.0 * D, lat0: 30.0 * D });
        let q = point(&p, (-20.0, 45.0)).unwrap();
        let r = p.projection.forward(-20.0 * D, 45.0 * D);
        assert!((q.0 - r.0).abs() < 1e-12 && (q.1 - r.1).abs() < 1e-12);
    }

    #[test]
    fn lines_are_cut_at_the_seam() {
        let p = View::from(Projection::Equirectangular { lon0: 0.0 });
        let pieces = line(&p, &[(170.0, 0.0), (-170.0, 0.0)]);
        assert_eq!(pieces.len(), 2);
        assert!(pieces.iter().any(|r| (r.last().unwrap().0 - PI).abs() < 1e-12 && r[0].0 > 2.9));
        assert!(pieces.iter().any(|r| (r[0].0 + PI).abs() < 1e-12 && r.last().unwrap().0 < -2.9));
    }
}
