//! Map projections on the unit sphere (R = 1), forward only.
//!
//! Formulas: Snyder, *Map Projections: A Working Manual* (USGS Professional
//! Paper 1395, 1987), spherical forms; Equal Earth from Šavrič, Patterson and
//! Jenny (2018), *International Journal of Geographical Information Science*
//! 33(3). Checked against PROJ (pyproj) in `tests/map_projection.rs`.
//! Every function takes longitude and latitude in radians and returns x, y in
//! units of the sphere's radius, x east and y north; transcendental calls go
//! through the portable `libm` so native and wasm agree to the bit.

use super::sphere::Rotation;
use libm::{asin, atan2, cos, log, pow, sin, sqrt, tan};
use std::f64::consts::{FRAC_PI_2, FRAC_PI_4, PI};

/// Latitude limit of Mercator, where y would run to infinity.
pub const MERCATOR_LIMIT: f64 = 85.0 * PI / 180.0;

/// A projection with its parameters, angles in radians.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Projection {
    EqualEarth {
        lon0: f64,
    },
    Mercator {
        lon0: f64,
    },
    Equirectangular {
        lon0: f64,
    },
    /// Albers equal-area conic with standard parallels `lat1`, `lat2`.
    Albers {
        lon0: f64,
        lat0: f64,
        lat1: f64,
        lat2: f64,
    },
    /// Lambert conformal conic with standard parallels `lat1`, `lat2`.
    LambertConformal {
        lon0: f64,
        lat0: f64,
        lat1: f64,
        lat2: f64,
    },
    /// Lambert azimuthal equal-area centred on (`lon0`, `lat0`).
    LambertEqualArea {
        lon0: f64,
        lat0: f64,
    },
    /// Orthographic centred on (`lon0`, `lat0`); the far side is not drawn.
    Orthographic {
        lon0: f64,
        lat0: f64,
    },
    /// Transverse Mercator with central meridian `lon0`, origin latitude `lat0`.
    TransverseMercator {
        lon0: f64,
        lat0: f64,
    },
}

/// A projection of the sphere after a turn ([`Rotation`], the map's
/// `rotate`): the turn first, then the projection with its own centre.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct View {
    pub projection: Projection,
    pub rotation: Rotation,
}

impl From<Projection> for View {
    fn from(projection: Projection) -> View {
        View { projection, rotation: Rotation::NONE }
    }
}

impl View {
    /// Project one point (radians): turned, then as [`Projection::forward`].
    pub fn forward(&self, lon: f64, lat: f64) -> (f64, f64) {
        let (l, p) = self.rotation.apply(lon, lat);
        self.projection.forward(l, p)
    }
}

/// Longitude wrapped to [-pi, pi).
pub fn wrap(lon: f64) -> f64 {
    let mut l = (lon + PI) % (2.0 * PI);
    if l < 0.0 {
        l += 2.0 * PI;
    }
    l - PI
}

// Equal Earth coefficients (Šavrič et al. 2018, eq. 2).
const A1: f64 = 1.340264;
const A2: f64 = -0.081106;
const A3: f64 = 0.000893;
const A4: f64 = 0.003796;

impl Projection {
    /// The central longitude.
    pub fn lon0(&self) -> f64 {
        match *self {
            Projection::EqualEarth { lon0 }
            | Projection::Mercator { lon0 }
            | Projection::Equirectangular { lon0 }
            | Projection::Albers { lon0, .. }
            | Projection::LambertConformal { lon0, .. }
            | Projection::LambertEqualArea { lon0, .. }
            | Projection::Orthographic { lon0, .. }
            | Projection::TransverseMercator { lon0, .. } => lon0,
        }
    }

    /// Equal-area projections keep areas proportional.
    pub fn equal_area(&self) -> bool {
        matches!(self, Projection::EqualEarth { .. } | Projection::Albers { .. } | Projection::LambertEqualArea { .. })
    }

    /// Project one point (radians) to the plane. Points a projection cannot
    /// show (the far side of an orthographic globe, the antipode of a Lambert
    /// azimuthal map, a pole under Mercator) come back clamped to the nearest
    /// drawable place, never NaN for finite input.
    pub fn forward(&self, lon: f64, lat: f64) -> (f64, f64) {
        self.forward_rel(wrap(lon - self.lon0()), lat)
    }

    /// Project a point given by its longitude relative to the central
    /// meridian, `l` (not wrapped: the seam cutter hands both edges, -pi and
    /// +pi), and its latitude.
    pub fn forward_rel(&self, l: f64, lat: f64) -> (f64, f64) {
        match *self {
            Projection::EqualEarth { .. } => {
                let m = sqrt(3.0) / 2.0;
                let t = asin(m * sin(lat));
                let t2 = t * t;
                let t6 = t2 * t2 * t2;
                let x = l * cos(t) / (m * (A1 + 3.0 * A2 * t2 + t6 * (7.0 * A3 + 9.0 * A4 * t2)));
                let y = t * (A1 + A2 * t2 + t6 * (A3 + A4 * t2));
                (x, y)
            }
            Projection::Mercator { .. } => {
                let p = lat.clamp(-MERCATOR_LIMIT, MERCATOR_LIMIT);
                (l, log(tan(FRAC_PI_4 + p / 2.0)))
            }
            Projection::Equirectangular { .. } => (l, lat),
            Projection::Albers { lat0, lat1, lat2, .. } => {
                let (n, c) = albers_constants(lat1, lat2);
                let rho = |p: f64| sqrt((c - 2.0 * n * sin(p)).max(0.0)) / n;
                let th = n * l;
                let r = rho(lat);
                (r * sin(th), rho(lat0) - r * cos(th))
            }
            Projection::LambertConformal { lat0, lat1, lat2, .. } => {
                let (n, f) = lcc_constants(lat1, lat2);
                // The pole opposite the cone's apex lies at infinity: keep a hair inside.
                let lim = FRAC_PI_2 - 1e-6;
                let rho = |p: f64| {
                    let p = if n > 0.0 { p.max(-lim) } else { p.min(lim) };
                    f / pow(tan(FRAC_PI_4 + p / 2.0), n)
                };
                let th = n * l;
                let r = rho(lat);
                (r * sin(th), rho(lat0) - r * cos(th))
            }
            Projection::LambertEqualArea { lat0, .. } => {
                let cc = 1.0 + sin(lat0) * sin(lat) + cos(lat0) * cos(lat) * cos(l);
                if cc <= 1e-12 {
                    // The antipode maps to the whole rim; take its top.
                    return (0.0, 2.0);
                }
                let k = sqrt(2.0 / cc);
                (k * cos(lat) * sin(l), k * (cos(lat0) * sin(lat) - sin(lat0) * cos(lat) * cos(l)))
            }
            Projection::Orthographic { lat0, .. } => (cos(lat) * sin(l), cos(lat0) * sin(lat) - sin(lat0) * cos(lat) * cos(l)),
            Projection::TransverseMercator { lat0, .. } => {
                let b = (cos(lat) * sin(l)).clamp(-1.0 + 1e-12, 1.0 - 1e-12);
                let x = 0.5 * log((1.0 + b) / (1.0 - b));
                let y = atan2(sin(lat), cos(lat) * cos(l)) - lat0;
                (x, y)
            }
        }
    }
}

/// Albers constants n and C (Snyder eqs. 14-14, 14-13, sphere).
fn albers_constants(lat1: f64, lat2: f64) -> (f64, f64) {
    let mut n = (sin(lat1) + sin(lat2)) / 2.0;
    if n.abs() < 1e-10 {
        n = 1e-10;
    }
    let c = cos(lat1) * cos(lat1) + 2.0 * n * sin(lat1);
    (n, c)
}

/// Lambert conformal constants n and F (Snyder eqs. 15-3, 15-2, sphere).
fn lcc_constants(lat1: f64, lat2: f64) -> (f64, f64) {
    let t = |p: f64| tan(FRAC_PI_4 + p / 2.0);
    let mut n = if (lat1 - lat2).abs() < 1e-10 { sin(lat1) } else { log(cos(lat1) / cos(lat2)) / log(t(lat2) / t(lat1)) };
    if n.abs() < 1e-10 {
        n = 1e-10;
    }
    let f = cos(lat1) * pow(t(lat1), n) / n;
    (n, f)
}

#[cfg(test)]
mod tests {
    use super::*;
    const D: f64 = PI / 180.0;

    // Snyder (1987), USGS Professional Paper 1395, p. 291: Albers, sphere,
    // R = 1, parallels 29.5°N and 45.5°N, origin 23°N 96°W; 35°N 75°W gives
    // x = 0.2952720, y = 0.2416774.
    #[test]
    fn snyder_albers_sphere_example() {
        let p = Projection::Albers { lon0: -96.0 * D, lat0: 23.0 * D, lat1: 29.5 * D, lat2: 45.5 * D };
        let (x, y) = p.forward(-75.0 * D, 35.0 * D);
        assert!((x - 0.2952720).abs() < 5e-8, "x {x}");
        assert!((y - 0.2416774).abs() < 5e-8, "y {y}");
    }

    // Snyder (1987), p. 296: Lambert conformal conic, sphere, R = 1, same
    // parallels and origin; 35°N 75°W gives x = 0.2966785, y = 0.2462112.
    #[test]
    fn snyder_lambert_conformal_sphere_example() {
        let p = Projection::LambertConformal { lon0: -96.0 * D, lat0: 23.0 * D, lat1: 33.0 * D, lat2: 45.0 * D };
        let (x, y) = p.forward(-75.0 * D, 35.0 * D);
        assert!((x - 0.2966785).abs() < 5e-7, "x {x}");
        assert!((y - 0.2462112).abs() < 5e-7, "y {y}");
    }

    #[test]
    fn wrap_keeps_range() {
        for k in -10..10 {
            let l = wrap(0.3 + k as f64 * 2.0 * PI);
            assert!((l - 0.3).abs() < 1e-9);
        }
        assert!(wrap(PI) < PI && wrap(PI) >= -PI);
    }
}
