//! The world-sized base map of the map benchmark and the SVG size test:
//! 180 generated shapes (a 20 x 9 grid of cells between 81°S and 81°N with
//! wavy edges shared by neighbours), about 10,000 vertices, as GeoJSON.
//! Shared by `benches/map.rs` and `tests/map_size.rs` (through `#[path]`).

pub const COLS: usize = 20;
pub const ROWS: usize = 9;
/// Points per cell edge (so about 4 x EDGE vertices a cell).
const EDGE: usize = 14;

fn wave(a: f64, b: f64, t: f64) -> f64 {
    // A fixed wiggle for an edge, the same from both sides.
    0.9 * libm::sin(7.0 * t * std::f64::consts::PI + a * 0.37 + b * 0.11)
}

pub fn world() -> String {
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

/// The spec both draw: a base map of the shapes, Equal Earth, 800 x 420 px.
pub const SPEC: &str = r#"{ "shapes": { "url": "world.geojson", "key": "id" },
  "coords": { "kind": "map", "projection": "equal_earth" },
  "layers": [ { "draw": "region" } ],
  "size": { "width": 800, "height": 420 } }"#;
