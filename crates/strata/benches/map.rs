//! A world-sized base map to SVG at 800 px: 180 generated shapes (a 20 x 9
//! grid of cells between 81°S and 81°N with wavy edges, shared between
//! neighbours), about 10,000 vertices, GeoJSON bytes in, SVG out, through
//! the whole pipeline (`render_spec_with_shapes`: GeoJSON read, great-circle
//! densification, seam cutting, projection, pixel-scale simplification, SVG).
//! The baseline, measured in the same run, is one pass over the vertices:
//! projecting each once with the same projection.
//! Prints the SVG size and the ratio of medians.

use criterion::{criterion_group, Criterion};
use std::time::Instant;
use strata::geo::geojson;
use strata::geo::Projection;
use strata::{DataBytes, RenderOptions};

const COLS: usize = 20;
const ROWS: usize = 9;
/// Points per cell edge (so about 4 x EDGE vertices a cell).
const EDGE: usize = 14;

fn wave(a: f64, b: f64, t: f64) -> f64 {
    // A fixed wiggle for an edge, the same from both sides.
    0.9 * libm::sin(7.0 * t * std::f64::consts::PI + a * 0.37 + b * 0.11)
}

fn world() -> String {
    let mut feats = Vec::new();
    let (w, h) = (360.0 / COLS as f64, 162.0 / ROWS as f64);
    for r in 0..ROWS {
        for c in 0..COLS {
            let (x0, y0) = (-180.0 + c as f64 * w, -81.0 + r as f64 * h);
            let mut ring: Vec<(f64, f64)> = Vec::new();
            // Bottom edge west to east, right edge up, top east to west, left down.
            for i in 0..EDGE {
                let t = i as f64 / EDGE as f64;
                let d = if r == 0 { 0.0 } else { wave(x0, y0, t) };
                ring.push((x0 + t * w, y0 + d));
            }
            for i in 0..EDGE {
                let t = i as f64 / EDGE as f64;
                let d = if c + 1 == COLS { 0.0 } else { wave(x0 + w, y0, t) };
                ring.push((x0 + w + d, y0 + t * h));
            }
            for i in 0..EDGE {
                let t = i as f64 / EDGE as f64;
                let d = if r + 1 == ROWS { 0.0 } else { wave(x0, y0 + h, 1.0 - t) };
                ring.push((x0 + w - t * w, y0 + h + d));
            }
            for i in 0..EDGE {
                let t = i as f64 / EDGE as f64;
                let d = if c == 0 { 0.0 } else { wave(x0, y0, 1.0 - t) };
                ring.push((x0 + d, y0 + h - t * h));
            }
            ring.push(ring[0]);
            let coords: Vec<String> = ring.iter().map(|(x, y)| format!("[{x:.4},{y:.4}]")).collect();
            feats.push(format!(
                "{{\"type\":\"Feature\",\"properties\":{{\"id\":\"c{r}_{c}\"}},\"geometry\":{{\"type\":\"Polygon\",\"coordinates\":[[{}]]}}}}",
                coords.join(",")
            ));
        }
    }
    format!("{{\"type\":\"FeatureCollection\",\"features\":[{}]}}", feats.join(","))
}

const SPEC: &str = r#"{ "shapes": { "url": "world.geojson", "key": "id" },
  "coords": { "kind": "map", "projection": "equal_earth" },
  "layers": [ { "draw": "region" } ],
  "size": { "width": 800, "height": 420 } }"#;

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    v[v.len() / 2]
}

fn bench(c: &mut Criterion) {
    let bytes = world().into_bytes();
    let spec = strata::parse_spec(SPEC).unwrap();
    let feats = geojson::read_bytes(&bytes, Some("id"), "shapes").unwrap();
    let mut verts: Vec<(f64, f64)> = Vec::new();
    for f in &feats {
        f.geometry.as_ref().unwrap().for_each_pos(&mut |p| verts.push(p));
    }
    let proj = Projection::EqualEarth { lon0: 0.0 };
    let d = std::f64::consts::PI / 180.0;
    let render = || strata::render_spec_with_shapes(&spec, None, Some(DataBytes { bytes: &bytes, name: "world.geojson" }), &RenderOptions::default()).unwrap();
    let pass = || verts.iter().map(|&(l, p)| proj.forward(l * d, p * d)).fold(0.0, |a, (x, y)| a + x + y);
    let r = render();
    println!("map bench: {} shapes, {} vertices, GeoJSON {} bytes, SVG {} bytes", feats.len(), verts.len(), bytes.len(), r.svg.len());

    // Ratio of medians from 15 runs each, measured here side by side.
    let (mut a, mut b) = (Vec::new(), Vec::new());
    for _ in 0..15 {
        let t = Instant::now();
        std::hint::black_box(render());
        a.push(t.elapsed().as_secs_f64());
        let t = Instant::now();
        std::hint::black_box(pass());
        b.push(t.elapsed().as_secs_f64());
    }
    let (ma, mb) = (median(a), median(b));
    println!("map bench: render {:.2} ms, one projection pass {:.3} ms, ratio {:.0}x", ma * 1e3, mb * 1e3, ma / mb);

    let mut g = c.benchmark_group("map");
    g.sample_size(20);
    g.bench_function("world_base_map_800px", |bn| bn.iter(|| std::hint::black_box(render())));
    g.bench_function("one_pass_over_vertices", |bn| bn.iter(|| std::hint::black_box(pass())));
    g.finish();
}

criterion_group!(benches, bench);

fn main() {
    benches();
    Criterion::default().configure_from_args().final_summary();
}
