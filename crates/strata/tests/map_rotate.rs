//! `coords.rotate`: the sphere turned before projecting, against PROJ.
//!
//! Fixture: `tests/reference/fixtures/map/rotate.json`, written by
//! `tests/reference/gen/map_rotate_fixtures.py` (pyproj 3.7.2, PROJ 9.5.1;
//! the file names its versions). Sphere, R = 1. Turns by [λ, φ] of an
//! orthographic or Lambert azimuthal map are compared with PROJ's own
//! centre (lon_0 = -λ, lat_0 = -φ); turns with a third angle with PROJ's
//! General Oblique Transformation (`+proj=ob_tran`), its pole found by the
//! script from the turn's matrix.

use serde_json::Value;
use std::f64::consts::PI;
use strata::geo::{clip, Projection, Rotation, View};

const D: f64 = PI / 180.0;

fn fixture() -> Value {
    let p = format!("{}/../../tests/reference/fixtures/map/rotate.json", env!("CARGO_MANIFEST_DIR"));
    serde_json::from_str(&std::fs::read_to_string(p).unwrap()).unwrap()
}

fn projection(name: &str) -> Projection {
    match name {
        "equal_earth" => Projection::EqualEarth { lon0: 0.0 },
        "mercator" => Projection::Mercator { lon0: 0.0 },
        "equirectangular" => Projection::Equirectangular { lon0: 0.0 },
        "lambert_equal_area" => Projection::LambertEqualArea { lon0: 0.0, lat0: 0.0 },
        "orthographic" => Projection::Orthographic { lon0: 0.0, lat0: 0.0 },
        other => panic!("unknown projection {other}"),
    }
}

// PROJ 9.5.1 (pyproj 3.7.2), 150 points a case: every point of the turned
// projection within 1e-9 of PROJ's, relative to the larger of the point's
// distance from the origin and 1; both the plain formula after the turn
// (`View::forward`) and the drawing path (`clip::point`, through the seam
// or horizon frame) are checked.
#[test]
fn turned_projections_match_proj() {
    let f = fixture();
    let mut with_gamma = 0;
    for case in f["cases"].as_array().unwrap() {
        let name = case["projection"].as_str().unwrap();
        let turn: Vec<f64> = case["rotate"].as_array().unwrap().iter().map(|v| v.as_f64().unwrap()).collect();
        let mut r = [0.0; 3];
        r[..turn.len()].copy_from_slice(&turn);
        with_gamma += usize::from(r[2] != 0.0);
        let view = View { projection: projection(name), rotation: Rotation::from_degrees(r) };
        let pts = case["points"].as_array().unwrap();
        assert_eq!(pts.len(), 150);
        let mut worst = 0.0f64;
        for p in pts {
            let v: Vec<f64> = p.as_array().unwrap().iter().map(|x| x.as_f64().unwrap()).collect();
            let want = (v[2], v[3]);
            let scale = want.0.hypot(want.1).max(1.0);
            let a = view.forward(v[0] * D, v[1] * D);
            let b = clip::point(&view, (v[0], v[1])).unwrap_or_else(|| panic!("{name} {r:?}: {v:?} hidden"));
            for q in [a, b] {
                worst = worst.max((q.0 - want.0).hypot(q.1 - want.1) / scale);
            }
        }
        assert!(worst <= 1e-9, "{name} rotate {r:?} ({}): worst relative error {worst:e}", case["proj"]);
    }
    assert!(with_gamma >= 3, "the third angle is checked");
}

// Through the whole pipeline: an orthographic globe turned by [-30, -40]
// draws a small square at 30°E 40°N in the middle of the map (its centre
// is 0°, 0° of the turned sphere), and one at 30°W 40°S not at all (the
// far side). Before `rotate` turned the sphere it turned the finished
// picture, and this square sat away from the middle.
#[test]
fn a_turned_globe_shows_the_turned_place_in_the_middle() {
    let sq = |lon: f64, lat: f64, name: &str| {
        format!(
            r#"{{"type": "Feature", "properties": {{"name": "{name}"}}, "geometry": {{"type": "Polygon", "coordinates": [[[{a},{b}],[{c},{b}],[{c},{d}],[{a},{d}],[{a},{b}]]]}}}}"#,
            a = lon - 2.0,
            b = lat - 2.0,
            c = lon + 2.0,
            d = lat + 2.0
        )
    };
    let spec = format!(
        r#"{{ "shapes": {{ "key": "name", "features": [{}, {}] }},
          "coords": {{ "kind": "map", "projection": "orthographic", "rotate": [-30, -40], "fit": "data" }},
          "layers": [ {{ "draw": "region" }} ], "size": {{ "width": 400, "height": 400 }} }}"#,
        sq(30.0, 40.0, "near"),
        sq(-150.0, -40.0, "far")
    );
    let r = strata::render(&spec, None, &strata::RenderOptions::default()).unwrap();
    assert!(r.scene.non_finite().is_empty());
    let path_of = |needle: &str| {
        let line = r.svg.lines().find(|l| l.contains(needle)).unwrap_or_else(|| panic!("{needle} drawn"));
        let d = line.split("d=\"").nth(1).unwrap().split('"').next().unwrap();
        let nums: Vec<f64> = d.split(|c: char| c.is_ascii_alphabetic() || c == ',').filter(|t| !t.is_empty()).map(|t| t.parse().unwrap()).collect();
        let (xs, ys): (Vec<f64>, Vec<f64>) = (nums.iter().step_by(2).copied().collect(), nums.iter().skip(1).step_by(2).copied().collect());
        let mid = |v: &[f64]| (v.iter().cloned().fold(f64::INFINITY, f64::min) + v.iter().cloned().fold(f64::NEG_INFINITY, f64::max)) / 2.0;
        (mid(&xs), mid(&ys))
    };
    assert!(!r.svg.contains("aria-label=\"shape: far\""), "the far side is hidden");
    let near = path_of("aria-label=\"shape: near\"");
    // The globe's centre: the middle of the sphere's outline (the frame's path).
    let globe = r.svg.lines().skip_while(|l| !l.contains("strata-map-frame")).find(|l| l.contains("<path")).unwrap().to_string();
    let centre = {
        let d = globe.split("d=\"").nth(1).unwrap().split('"').next().unwrap();
        let nums: Vec<f64> = d.split(|c: char| c.is_ascii_alphabetic() || c == ',').filter(|t| !t.is_empty()).map(|t| t.parse().unwrap()).collect();
        let xs: Vec<f64> = nums.iter().step_by(2).copied().collect();
        let ys: Vec<f64> = nums.iter().skip(1).step_by(2).copied().collect();
        let mid = |v: &[f64]| (v.iter().cloned().fold(f64::INFINITY, f64::min) + v.iter().cloned().fold(f64::NEG_INFINITY, f64::max)) / 2.0;
        (mid(&xs), mid(&ys))
    };
    assert!((near.0 - centre.0).abs() < 1.5 && (near.1 - centre.1).abs() < 1.5, "near square at {near:?}, globe centre {centre:?}");
}

// `rotate` is a number (λ) or a list of one to three numbers.
#[test]
fn rotate_takes_one_to_three_angles() {
    let spec = |rot: &str| {
        format!(
            r#"{{ "shapes": {{ "features": [{{"type": "Feature", "properties": {{}}, "geometry": {{"type": "Point", "coordinates": [1, 2]}}}}] }},
              "coords": {{ "kind": "map", "rotate": {rot} }}, "layers": [ {{ "draw": "region" }} ] }}"#
        )
    };
    for ok in ["20", "[20]", "[20, -10]", "[20, -10, 5]"] {
        assert!(strata::render(&spec(ok), None, &strata::RenderOptions::default()).is_ok(), "{ok}");
    }
    for bad in ["[]", "[1, 2, 3, 4]"] {
        let e = strata::render(&spec(bad), None, &strata::RenderOptions::default()).unwrap_err();
        assert_eq!(e.0[0].code, "map.rotate", "{bad}");
        assert_eq!(e.0[0].at.path, "coords.rotate", "{bad}");
    }
}
