//! Sphere maths: unit vectors, great-circle densification, rotations and
//! areas. Angles in radians unless a name says degrees.

use libm::{acos, asin, atan2, cos, sin, sqrt};
use std::f64::consts::PI;

pub type V3 = [f64; 3];

/// Unit vector of a longitude and latitude (radians).
pub fn to_vec(lon: f64, lat: f64) -> V3 {
    let c = cos(lat);
    [c * cos(lon), c * sin(lon), sin(lat)]
}

/// Longitude and latitude (radians) of a vector.
pub fn from_vec(v: V3) -> (f64, f64) {
    let n = sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
    if n == 0.0 {
        return (0.0, 0.0);
    }
    (atan2(v[1], v[0]), asin((v[2] / n).clamp(-1.0, 1.0)))
}

fn dot(a: V3, b: V3) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

/// Angular distance between two points (radians).
pub fn distance(a: (f64, f64), b: (f64, f64)) -> f64 {
    acos(dot(to_vec(a.0, a.1), to_vec(b.0, b.1)).clamp(-1.0, 1.0))
}

/// The points of the great-circle arc from `a` to `b`, `a` excluded and `b`
/// included, no two more than `step` radians apart (spherical linear
/// interpolation). Antipodal ends have no unique arc: the straight step in
/// degrees is kept.
pub fn densify_to(a: (f64, f64), b: (f64, f64), step: f64, out: &mut Vec<(f64, f64)>) {
    let d = distance(a, b);
    let n = (d / step).ceil();
    if !(n > 1.0) || d > PI - 1e-9 {
        out.push(b);
        return;
    }
    let n = (n as usize).min(10_000);
    let (va, vb) = (to_vec(a.0, a.1), to_vec(b.0, b.1));
    let s = sin(d);
    for i in 1..n {
        let t = i as f64 / n as f64;
        let (wa, wb) = (sin((1.0 - t) * d) / s, sin(t * d) / s);
        let (mut lon, lat) = from_vec([wa * va[0] + wb * vb[0], wa * va[1] + wb * vb[1], wa * va[2] + wb * vb[2]]);
        // Along a meridian through a pole atan2 is arbitrary: keep the ends' longitude.
        if lat.abs() > PI / 2.0 - 1e-12 {
            lon = a.0;
        }
        out.push((lon, lat));
    }
    out.push(b);
}

/// A densified copy of a path (open or closed: the caller keeps the closing point).
pub fn densify(path: &[(f64, f64)], step: f64) -> Vec<(f64, f64)> {
    let mut out = Vec::with_capacity(path.len());
    if let Some(&first) = path.first() {
        out.push(first);
        for w in path.windows(2) {
            densify_to(w[0], w[1], step, &mut out);
        }
    }
    out
}

/// Rotation taking (`lon0`, `lat0`) to (0, 0): first about the polar axis by
/// -lon0, then about the new y axis by lat0. Returns the point's longitude
/// and latitude in the rotated frame.
pub fn rotate_to_center(lon: f64, lat: f64, lon0: f64, lat0: f64) -> (f64, f64) {
    let v = to_vec(lon - lon0, lat);
    let (s, c) = (sin(lat0), cos(lat0));
    from_vec([c * v[0] + s * v[2], v[1], -s * v[0] + c * v[2]])
}

/// A turn of the sphere, `rotate: [λ, φ, γ]` in degrees: first about the
/// polar axis by λ (longitudes grow by λ), then about the axis through
/// 0°N 90°E by φ (a point on the prime meridian moves north by φ), then
/// about the axis through 0°N 0°E by γ (the point at 90°E moves north by γ).
/// The three elementary rotations of Euler's theorem, in that order; a map
/// turned by [-λ0, -φ0] has λ0, φ0 in its centre. Checked against PROJ
/// (`+proj=ob_tran`) in `tests/map_rotate.rs`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rotation {
    /// λ, radians.
    pub lambda: f64,
    sp: f64,
    cp: f64,
    sg: f64,
    cg: f64,
    /// Only λ: a shift of longitude, no trigonometry.
    about_pole: bool,
}

impl Rotation {
    /// No turn at all.
    pub const NONE: Rotation = Rotation { lambda: 0.0, sp: 0.0, cp: 1.0, sg: 0.0, cg: 1.0, about_pole: true };

    /// The turn by λ, φ, γ (radians).
    pub fn new(lambda: f64, phi: f64, gamma: f64) -> Rotation {
        Rotation { lambda, sp: sin(phi), cp: cos(phi), sg: sin(gamma), cg: cos(gamma), about_pole: phi == 0.0 && gamma == 0.0 }
    }

    /// The turn given in degrees, as the spec writes it.
    pub fn from_degrees(r: [f64; 3]) -> Rotation {
        let d = PI / 180.0;
        Rotation::new(r[0] * d, r[1] * d, r[2] * d)
    }

    pub fn is_none(&self) -> bool {
        self.about_pole && self.lambda == 0.0
    }

    /// Longitude and latitude (radians) of a point after the turn.
    pub fn apply(&self, lon: f64, lat: f64) -> (f64, f64) {
        if self.about_pole {
            if self.lambda == 0.0 {
                return (lon, lat);
            }
            return (super::project::wrap(lon + self.lambda), lat);
        }
        let [x, y, z] = to_vec(lon + self.lambda, lat);
        // About the y axis by φ, then about the x axis by γ.
        let (x1, z1) = (x * self.cp - z * self.sp, x * self.sp + z * self.cp);
        let (y2, z2) = (y * self.cg - z1 * self.sg, y * self.sg + z1 * self.cg);
        (atan2(y2, x1), asin(z2.clamp(-1.0, 1.0)))
    }
}

/// Area of a spherical polygon on the unit sphere whose edges are great
/// circles (sum of signed triangle areas from the first vertex, by the
/// Van Oosterom-Strackee formula). The sign follows the winding.
pub fn ring_area(ring: &[(f64, f64)]) -> f64 {
    if ring.len() < 3 {
        return 0.0;
    }
    let vs: Vec<V3> = ring.iter().map(|&(l, p)| to_vec(l, p)).collect();
    let o = vs[0];
    let mut sum = 0.0;
    for w in vs[1..].windows(2) {
        let (a, b) = (w[0], w[1]);
        let cr = [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
        let num = dot(o, cr);
        let den = 1.0 + dot(o, a) + dot(a, b) + dot(b, o);
        sum += 2.0 * atan2(num, den);
    }
    sum
}

#[cfg(test)]
mod tests {
    use super::*;
    const D: f64 = PI / 180.0;

    // An octant of the sphere (a geodesic triangle with three right angles)
    // has area 4π/8 = π/2 by Girard's theorem.
    #[test]
    fn octant_area_is_pi_over_two() {
        let tri = [(0.0, 0.0), (90.0 * D, 0.0), (0.0, 90.0 * D), (0.0, 0.0)];
        assert!((ring_area(&tri).abs() - PI / 2.0).abs() < 1e-12);
    }

    #[test]
    fn densified_points_lie_on_the_great_circle() {
        let (a, b) = ((-30.0 * D, 10.0 * D), (60.0 * D, 50.0 * D));
        let pts = densify(&[a, b], 1.0 * D);
        let (va, vb) = (to_vec(a.0, a.1), to_vec(b.0, b.1));
        let n = [va[1] * vb[2] - va[2] * vb[1], va[2] * vb[0] - va[0] * vb[2], va[0] * vb[1] - va[1] * vb[0]];
        for w in pts.windows(2) {
            assert!(distance(w[0], w[1]) <= 1.0 * D + 1e-12);
            assert!(dot(n, to_vec(w[1].0, w[1].1)).abs() < 1e-12);
        }
        assert_eq!(*pts.last().unwrap(), b);
    }

    // Euler: a rotation keeps angular distances. And by the definition, a
    // turn by [-λ0, -φ0] takes λ0, φ0 to the origin.
    #[test]
    fn turns_keep_distances_and_bring_the_centre_in() {
        let r = Rotation::from_degrees([35.0, -20.0, 70.0]);
        let pts = [(-30.0 * D, 10.0 * D), (60.0 * D, 50.0 * D), (170.0 * D, -80.0 * D), (0.0, 90.0 * D)];
        for a in pts {
            for b in pts {
                // Compared as cosines: acos is ill-conditioned at 0.
                let (ra, rb) = (r.apply(a.0, a.1), r.apply(b.0, b.1));
                let cos = |p: (f64, f64), q: (f64, f64)| dot(to_vec(p.0, p.1), to_vec(q.0, q.1));
                assert!((cos(a, b) - cos(ra, rb)).abs() < 1e-12);
            }
        }
        let (l, p) = Rotation::from_degrees([-30.0, -40.0, 0.0]).apply(30.0 * D, 40.0 * D);
        assert!(l.abs() < 1e-12 && p.abs() < 1e-12, "{l} {p}");
        assert!(Rotation::NONE.is_none() && !Rotation::from_degrees([1.0, 0.0, 0.0]).is_none());
    }

    #[test]
    fn rotation_takes_the_centre_to_the_origin() {
        let (l, p) = rotate_to_center(-40.0 * D, 30.0 * D, -40.0 * D, 30.0 * D);
        assert!(l.abs() < 1e-12 && p.abs() < 1e-12);
    }
}
