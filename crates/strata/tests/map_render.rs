//! Maps through the whole pipeline: every projection over awkward shapes
//! (poles, the seam, degenerate rings, every geometry type) draws finite
//! geometry, an aria-label per region and the warnings it should.

use strata::{render, RenderOptions};

const SHAPES: &str = r#"[
  {"type": "Feature", "properties": {"name": "across"}, "geometry": {"type": "Polygon", "coordinates": [[[170,-20],[-170,-20],[-170,20],[170,20],[170,-20]]]}},
  {"type": "Feature", "properties": {"name": "cap"}, "geometry": {"type": "Polygon", "coordinates": [[[-180,-70],[-90,-70],[0,-70],[90,-70],[-180,-70]]]}},
  {"type": "Feature", "properties": {"name": "pole"}, "geometry": {"type": "Polygon", "coordinates": [[[0,90],[10,80],[20,80],[0,90]]]}},
  {"type": "Feature", "properties": {"name": "flat"}, "geometry": {"type": "Polygon", "coordinates": [[[5,5],[5,5],[5,5],[5,5]]]}},
  {"type": "Feature", "properties": {"name": "holed"}, "geometry": {"type": "Polygon", "coordinates": [[[-40,-10],[-10,-10],[-10,20],[-40,20],[-40,-10]],[[-30,0],[-20,0],[-20,10],[-30,10],[-30,0]]]}},
  {"type": "Feature", "properties": {"name": "lines"}, "geometry": {"type": "MultiLineString", "coordinates": [[[-179,0],[179,1]],[[0,-90],[0,90]]]}},
  {"type": "Feature", "properties": {"name": "points"}, "geometry": {"type": "MultiPoint", "coordinates": [[180,0],[-180,90]]}},
  {"type": "Feature", "properties": {"name": "mixed"}, "geometry": {"type": "GeometryCollection", "geometries": [{"type": "Point", "coordinates": [1,1]}, {"type": "MultiPolygon", "coordinates": [[[[100,40],[120,40],[120,60],[100,60],[100,40]]]]}]}}
]"#;

#[test]
fn every_projection_draws_awkward_shapes_finitely() {
    for proj in ["equal_earth", "mercator", "equirectangular", "albers", "lambert_conformal", "lambert_equal_area", "orthographic", "transverse_mercator"] {
        for (center, fit) in [("[0, 0]", "shapes"), ("[150, -60]", "data"), ("[-180, 90]", "shapes")] {
            let spec = format!(
                r#"{{ "data": {{ "rows": [ {{"k": "across", "v": 1, "lon": 180, "lat": -90}}, {{"k": "holed", "v": 5, "lon": 10, "lat": 10}}, {{"k": "nowhere", "v": 2, "lon": 0, "lat": 0}} ] }},
                  "shapes": {{ "key": "name", "features": {SHAPES} }},
                  "coords": {{ "kind": "map", "projection": "{proj}", "center": {center}, "fit": "{fit}", "graticule": 20, "rotate": 15 }},
                  "layers": [ {{ "draw": "region", "key": "k", "color": "v" }}, {{ "draw": "point", "x": "lon", "y": "lat", "size": "v" }} ],
                  "scales": {{ "color": {{ "kind": "steps", "breaks": "quantile", "count": 3 }} }},
                  "size": {{ "width": 500, "height": 300 }} }}"#
            );
            let r = render(&spec, None, &RenderOptions::default()).unwrap_or_else(|e| panic!("{proj} {center}: {e}"));
            assert!(r.scene.non_finite().is_empty(), "{proj} {center}: {:?}", r.scene.non_finite());
            assert!(r.svg.contains("fill-rule=\"evenodd\""), "{proj} {center}: regions drawn");
            assert_eq!(r.warnings.iter().filter(|w| w.code == "map.unmatched").count(), 1, "{proj} {center}");
            // Each drawn region names itself (the far side of a globe is not drawn).
            assert!(r.svg.contains("aria-label=\"shape: across") || r.svg.contains("aria-label=\"shape: holed"), "{proj} {center}: a region names itself");
            // ... and has a tooltip (a hover title) though the layer lists no `tooltip` columns.
            assert_eq!(r.svg.matches("role=\"graphics-symbol\" aria-label=\"shape: ").count(), r.svg.matches("><title>shape: ").count(), "{proj} {center}");
            if r.svg.contains("aria-label=\"shape: holed") {
                assert!(r.svg.contains("><title>shape: holed, color: 5, key: holed"), "{proj} {center}: a region's tooltip");
            }
        }
    }
}

#[test]
fn points_draw_big_under_small() {
    let spec = r#"{ "data": { "rows": [ {"lon": 0, "lat": 0, "n": 1}, {"lon": 1, "lat": 1, "n": 100}, {"lon": 2, "lat": 0, "n": 10} ] },
      "coords": { "kind": "map", "fit": "data" },
      "layers": [ { "draw": "point", "x": "lon", "y": "lat", "size": "n" } ] }"#;
    let r = render(spec, None, &RenderOptions::default()).unwrap();
    let radii: Vec<f64> = r
        .scene
        .children
        .iter()
        .flat_map(|n| n.marks())
        .filter_map(|m| match m {
            strata::scene::Node::Circle { r, .. } => Some(*r),
            _ => None,
        })
        .collect();
    assert_eq!(radii.len(), 3);
    assert!(radii.windows(2).all(|w| w[0] >= w[1]), "drawn biggest first: {radii:?}");
    // Area, not radius, follows the value: r grows as the square root.
    assert!((radii[0] / radii[1] - 10f64.sqrt()).abs() < 1e-9, "{radii:?}");
    assert!((radii[1] / radii[2] - 10f64.sqrt()).abs() < 1e-9, "{radii:?}");
}

// `shapes.sha256` (FIPS 180-4, as for data): the right digest passes, a
// wrong one refuses the shapes; a url with no bytes says so.
#[test]
fn shapes_sha256_and_missing_bytes() {
    let geo = br#"{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"n":"a"},"geometry":{"type":"Point","coordinates":[1,2]}}]}"#;
    let digest = strata::data::sha256_hex(geo);
    let spec = |sha: &str| {
        strata::parse_spec(&format!(r#"{{ "shapes": {{ "url": "s.geojson", "key": "n", "sha256": "{sha}" }}, "layers": [ {{ "draw": "region" }} ] }}"#))
            .unwrap()
    };
    let bytes = Some(strata::DataBytes { bytes: geo, name: "s.geojson" });
    assert!(strata::load_shapes(&spec(&digest), bytes).unwrap().is_some());
    let e = strata::load_shapes(&spec(&"0".repeat(64)), bytes).unwrap_err();
    assert_eq!(e.0[0].code, "shapes.sha256_mismatch");
    let e = strata::load_shapes(&spec(&digest), None).unwrap_err();
    assert_eq!(e.0[0].code, "shapes.missing");
}
