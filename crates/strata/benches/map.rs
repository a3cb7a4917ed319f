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

#[path = "../tests/common/world.rs"]
mod world;
use world::{world, SPEC};

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
