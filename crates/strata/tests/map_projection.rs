//! Projections against PROJ and areas against pyproj's `Geod`.
//!
//! Fixtures: `tests/reference/fixtures/map/`, written by
//! `tests/reference/gen/map_fixtures.py` (pyproj 3.7.2, PROJ 9.5.1; the file
//! names its versions). Sphere, R = 1.

use serde_json::Value;
use std::f64::consts::PI;
use strata::geo::{sphere, Projection};

const D: f64 = PI / 180.0;

fn fixture(name: &str) -> Value {
    let p = format!("{}/../../tests/reference/fixtures/map/{name}", env!("CARGO_MANIFEST_DIR"));
    serde_json::from_str(&std::fs::read_to_string(p).unwrap()).unwrap()
}

fn param(p: &Value, k: &str) -> f64 {
    p.get(k).and_then(Value::as_f64).unwrap_or(0.0) * D
}

fn projection(name: &str, p: &Value) -> Projection {
    let (lon0, lat0, lat1, lat2) = (param(p, "lon0"), param(p, "lat0"), param(p, "lat1"), param(p, "lat2"));
    match name {
        "equal_earth" => Projection::EqualEarth { lon0 },
        "mercator" => Projection::Mercator { lon0 },
        "equirectangular" => Projection::Equirectangular { lon0 },
        "albers" => Projection::Albers { lon0, lat0, lat1, lat2 },
        "lambert_conformal" => Projection::LambertConformal { lon0, lat0, lat1, lat2 },
        "lambert_equal_area" => Projection::LambertEqualArea { lon0, lat0 },
        "orthographic" => Projection::Orthographic { lon0, lat0 },
        "transverse_mercator" => Projection::TransverseMercator { lon0, lat0 },
        other => panic!("unknown projection {other}"),
    }
}

// PROJ (pyproj 3.7.2 / PROJ 9.5.1), sphere R = 1, 1,000 points per case:
// after one shared scale factor (least squares over all points of a case),
// every point is within 1e-9 of PROJ's, relative to the larger of the
// point's distance from the origin and 1 (the sphere's radius).
#[test]
fn projections_match_proj() {
    let f = fixture("projections.json");
    let mut names = std::collections::BTreeSet::new();
    for case in f["cases"].as_array().unwrap() {
        let name = case["projection"].as_str().unwrap();
        names.insert(name.to_string());
        let proj = projection(name, &case["params"]);
        let pts = case["points"].as_array().unwrap();
        assert!(pts.len() >= 1000, "{name}: {} points", pts.len());
        let mut ours = Vec::new();
        let mut theirs = Vec::new();
        for p in pts {
            let v: Vec<f64> = p.as_array().unwrap().iter().map(|x| x.as_f64().unwrap()).collect();
            ours.push(proj.forward(v[0] * D, v[1] * D));
            theirs.push((v[2], v[3]));
        }
        let (mut num, mut den) = (0.0, 0.0);
        for (a, b) in ours.iter().zip(&theirs) {
            num += a.0 * b.0 + a.1 * b.1;
            den += a.0 * a.0 + a.1 * a.1;
        }
        let s = num / den;
        assert!((s - 1.0).abs() < 1e-9, "{name}: scale {s}");
        let mut worst = 0.0f64;
        for (a, b) in ours.iter().zip(&theirs) {
            let e = (s * a.0 - b.0).hypot(s * a.1 - b.1) / b.0.hypot(b.1).max(1.0);
            worst = worst.max(e);
        }
        assert!(worst <= 1e-9, "{name} ({}): worst relative error {worst:e}", case["proj"]);
    }
    assert_eq!(names.len(), 8, "every projection is checked: {names:?}");
}

fn shoelace(pts: &[(f64, f64)]) -> f64 {
    let mut a = 0.0;
    for w in pts.windows(2) {
        a += w[0].0 * w[1].1 - w[1].0 * w[0].1;
    }
    a / 2.0
}

// Equal-area projections: the planar area of each projected quadrilateral
// (edges densified along great circles every 0.002°) divided by its spherical
// area from pyproj.Geod(a=1, b=1) is the same constant (1 on the unit
// sphere) within 1e-6. The spherical ring area of `strata::geo::sphere` is
// checked against the same numbers.
#[test]
fn equal_area_projections_keep_areas() {
    let f = fixture("areas.json");
    let projs = [
        Projection::EqualEarth { lon0: 0.0 },
        Projection::EqualEarth { lon0: 12.0 * D },
        Projection::Albers { lon0: 10.0 * D, lat0: 10.0 * D, lat1: 20.0 * D, lat2: 50.0 * D },
        Projection::LambertEqualArea { lon0: 30.0 * D, lat0: -20.0 * D },
    ];
    for proj in projs {
        assert!(proj.equal_area());
        let mut ratios = Vec::new();
        for case in f["cases"].as_array().unwrap() {
            let mut ring: Vec<(f64, f64)> = case["ring"].as_array().unwrap().iter().map(|p| (p[0].as_f64().unwrap() * D, p[1].as_f64().unwrap() * D)).collect();
            ring.push(ring[0]);
            let area = case["area"].as_f64().unwrap();
            let sph = sphere::ring_area(&ring).abs();
            assert!((sph - area).abs() / area < 1e-9, "spherical area {sph} vs Geod {area}");
            let dense = sphere::densify(&ring, 0.002 * D);
            let planar: Vec<(f64, f64)> = dense.iter().map(|&(l, p)| proj.forward(l, p)).collect();
            ratios.push(shoelace(&planar).abs() / area);
        }
        let mean = ratios.iter().sum::<f64>() / ratios.len() as f64;
        for r in &ratios {
            assert!((r / mean - 1.0).abs() < 1e-6, "{proj:?}: ratio {r} vs mean {mean}");
        }
        assert!((mean - 1.0).abs() < 1e-6, "{proj:?}: mean ratio {mean}");
    }
}
