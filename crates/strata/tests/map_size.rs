//! The size target for a world-sized base map: about 180 shapes and
//! 10,000 vertices drawn at 800 px make an SVG of at most 150 KB (150,000
//! bytes). A size, not a timing, so it is a test (the timing is in
//! `benches/map.rs`, which draws the same map).

#[path = "common/world.rs"]
mod world;

use strata::{DataBytes, RenderOptions};

fn world_svg() -> String {
    let bytes = world::world().into_bytes();
    let spec = strata::parse_spec(world::SPEC).unwrap();
    let r = strata::render_spec_with_shapes(&spec, None, Some(DataBytes { bytes: &bytes, name: "world.geojson" }), &RenderOptions::default()).unwrap();
    assert!(r.scene.non_finite().is_empty());
    r.svg
}

#[test]
fn the_world_base_map_svg_is_at_most_150_kb() {
    let svg = world_svg();
    if let Ok(p) = std::env::var("STRATA_DUMP_WORLD") {
        std::fs::write(p, &svg).unwrap();
    }
    assert_eq!(svg.matches("aria-label=\"shape: ").count(), world::COLS * world::ROWS, "one labelled path a shape");
    // Before the outlines went on a tenth-of-a-pixel grid: 150,900 bytes.
    assert!(svg.len() <= 150_000, "world base map SVG: {} bytes", svg.len());
    // Still an SVG a renderer outside the project reads (resvg/usvg 0.49).
    let tree = resvg::usvg::Tree::from_str(&svg, &resvg::usvg::Options::default()).expect("valid SVG");
    assert_eq!(tree.size().width(), 800.0);
}
