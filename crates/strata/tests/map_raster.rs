//! Seams, horizons and poles, checked on pixels: shapes are projected and
//! fitted by `strata::geo`, written as one even-odd SVG path and rasterised
//! with resvg (0.49.0), an SVG renderer outside the project. The checks read
//! the picture, not the engine's numbers.

use resvg::{tiny_skia, usvg};
use strata::geo::fit::{self, Pieces};
use strata::geo::geojson::{Feature, Geometry, Ring};
use strata::geo::{clip, Projection, View};

const W: f64 = 800.0;
const H: f64 = 420.0;

fn feature(rings: Vec<Ring>) -> Feature {
    Feature { index: 0, key: None, properties: Default::default(), geometry: Some(Geometry::Polygon(rings)) }
}

/// Rasterise `f` on a map fitted to the whole sphere; returns the filled mask.
fn raster(p: View, f: &Feature) -> Vec<Vec<bool>> {
    let sphere = Pieces { rings: vec![clip::outline(&p)], ..Default::default() };
    let fitted = fit::fit(p, fit::bounds([&sphere]), (0.0, 0.0, W, H));
    let px = fitted.to_pixels(&fit::project(&p, f));
    let mut d = String::new();
    for r in &px.rings {
        for (i, q) in r.iter().enumerate() {
            d.push_str(&format!("{}{:.3} {:.3} ", if i == 0 { "M" } else { "L" }, q.0, q.1));
        }
        d.push('Z');
    }
    let svg = format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{W}\" height=\"{H}\"><rect width=\"{W}\" height=\"{H}\" fill=\"#fff\"/><path d=\"{d}\" fill=\"#000\" fill-rule=\"evenodd\"/></svg>"
    );
    let tree = usvg::Tree::from_str(&svg, &usvg::Options::default()).unwrap();
    let mut pix = tiny_skia::Pixmap::new(W as u32, H as u32).unwrap();
    resvg::render(&tree, tiny_skia::Transform::identity(), &mut pix.as_mut());
    (0..H as u32).map(|y| (0..W as u32).map(|x| pix.pixel(x, y).unwrap().red() < 128).collect()).collect()
}

fn count(m: &[Vec<bool>], xs: std::ops::Range<usize>, ys: std::ops::Range<usize>) -> usize {
    ys.map(|y| xs.clone().filter(|&x| m[y][x]).count()).sum()
}

// A box from 170°E across 180° to 170°W: on an equal_earth map centred on
// 0° it shows at both edges and nothing in the middle (no streak).
#[test]
fn a_shape_across_180_leaves_the_middle_empty() {
    let p = View::from(Projection::EqualEarth { lon0: 0.0 });
    let m = raster(p, &feature(vec![vec![(170.0, -20.0), (-170.0, -20.0), (-170.0, 20.0), (170.0, 20.0), (170.0, -20.0)]]));
    let (w, h) = (W as usize, H as usize);
    assert_eq!(count(&m, 60..w - 60, 0..h), 0, "filled pixels in the middle");
    assert!(count(&m, 0..60, 0..h) > 200, "left edge piece");
    assert!(count(&m, w - 60..w, 0..h) > 200, "right edge piece");
}

// Orthographic centred on 0°, 0°: a shape on the far side (around 180°)
// fills no pixel; the same shape on the near side does.
#[test]
fn the_far_side_of_the_globe_stays_empty() {
    let p = View::from(Projection::Orthographic { lon0: 0.0, lat0: 0.0 });
    let far = raster(p, &feature(vec![vec![(160.0, -30.0), (-160.0, -30.0), (-160.0, 30.0), (160.0, 30.0), (160.0, -30.0)]]));
    assert_eq!(count(&far, 0..W as usize, 0..H as usize), 0);
    let near = raster(p, &feature(vec![vec![(-20.0, -30.0), (20.0, -30.0), (20.0, 30.0), (-20.0, 30.0), (-20.0, -30.0)]]));
    assert!(count(&near, 0..W as usize, 0..H as usize) > 5000);
    // Over the limb: filled up to the horizon circle, nothing outside it.
    let limb = raster(p, &feature(vec![vec![(60.0, -30.0), (120.0, -30.0), (120.0, 30.0), (60.0, 30.0), (60.0, -30.0)]]));
    let (cx, cy, r) = (W / 2.0, H / 2.0, H / 2.0);
    let mut outside = 0;
    for (y, row) in limb.iter().enumerate() {
        for (x, &on) in row.iter().enumerate() {
            if on && ((x as f64 + 0.5 - cx).hypot(y as f64 + 0.5 - cy)) > r + 1.0 {
                outside += 1;
            }
        }
    }
    assert_eq!(outside, 0);
    assert!(limb[H as usize / 2][(cx + r - 2.0) as usize], "filled at the horizon");
}

// A ring along 70°S, written in either winding, fills the bottom of the
// map (round the South Pole) and leaves the rest empty.
#[test]
fn a_polygon_round_the_south_pole_fills_the_bottom() {
    let p = View::from(Projection::EqualEarth { lon0: 0.0 });
    for rev in [false, true] {
        let mut ring: Ring = (0..=72).map(|i| (-180.0 + 5.0 * i as f64, -70.0)).collect();
        ring[72] = ring[0];
        if rev {
            ring.reverse();
        }
        let m = raster(p, &feature(vec![ring]));
        let (w, h) = (W as usize, H as usize);
        // The map (about 2.05:1) sits centred in the box, its bottom edge
        // near row 405; the cap of 70°S fills the rows above that edge.
        assert!(count(&m, w / 2..w / 2 + 1, h * 7 / 8..h) >= 10, "bottom centre filled");
        assert!(count(&m, 0..w, h * 7 / 8..h) > 5000, "bottom rows filled");
        assert_eq!(count(&m, 0..w, 0..(h * 3 / 4)), 0, "nothing above");
    }
}

// Neighbours simplified alone at pixel scale still meet. Two districts
// share a wiggled border (400 points about a pixel apart: a slow wave of
// 1.5 px amplitude and a jitter of a tenth of a pixel, so simplification
// drops many points). Both are filled in black; along the shared border no
// pixel may be lighter than the blend of two anti-aliased edges allows (a
// gap shows the white ground). Visvalingam-Whyatt sees the same triangles
// on a shared border from both sides, so the two keep the same points there
// and then snap them to the same grid; this checks the outcome on pixels.
//
// The check can fail: the same picture with the east district simplified
// differently (a coarser threshold, as if each shape were simplified at a
// scale of its own) leaves white pixels along the border, and the check
// catches them.

/// Outlines of the two districts in pixels, the map fitted to both.
fn two_districts() -> (fit::Fitted, Vec<Pieces>) {
    let p = View::from(Projection::Mercator { lon0: 0.0 });
    let border: Vec<(f64, f64)> = (0..=400).map(|i| (0.08 * libm::sin(i as f64 * 0.3) + 0.004 * libm::sin(i as f64 * 1.7), i as f64 * 0.05)).collect();
    let mut west: Ring = vec![(-10.0, 0.0)];
    west.extend(border.iter().copied());
    west.extend([(-10.0, 20.0), (-10.0, 0.0)]);
    let mut east: Ring = border.iter().rev().copied().collect();
    east.extend([(10.0, 0.0), (10.0, 20.0)]);
    east.insert(0, (10.0, 20.0));
    east.push(east[0]);
    let f = Feature { index: 0, key: None, properties: Default::default(), geometry: None };
    let shapes = [Feature { geometry: Some(Geometry::Polygon(vec![west])), ..f.clone() }, Feature { geometry: Some(Geometry::Polygon(vec![east])), ..f }];
    let pieces: Vec<Pieces> = shapes.iter().map(|s| fit::project(&p, s)).collect();
    let fitted = fit::fit(p, fit::bounds(pieces.iter()), (20.0, 20.0, W - 40.0, H - 40.0));
    (fitted, pieces)
}

/// The lightest pixel (red channel, 0 black to 255 white) along the shared
/// border of the two districts drawn in black from these pixel outlines.
fn lightest_on_border(fitted: &fit::Fitted, outlines: &[Pieces]) -> u8 {
    let mut paths = String::new();
    for px in outlines {
        let mut d = String::new();
        for r in &px.rings {
            for (i, q) in r.iter().enumerate() {
                d.push_str(&format!("{}{:.2} {:.2} ", if i == 0 { "M" } else { "L" }, q.0, q.1));
            }
            d.push('Z');
        }
        paths.push_str(&format!("<path d=\"{d}\" fill=\"#000\" fill-rule=\"evenodd\"/>"));
    }
    let svg = format!("<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{W}\" height=\"{H}\"><rect width=\"{W}\" height=\"{H}\" fill=\"#fff\"/>{paths}</svg>");
    let tree = usvg::Tree::from_str(&svg, &usvg::Options::default()).unwrap();
    let mut pix = tiny_skia::Pixmap::new(W as u32, H as u32).unwrap();
    resvg::render(&tree, tiny_skia::Transform::identity(), &mut pix.as_mut());
    let bx = fitted.px((0.0, 0.0)).0;
    let (y0, y1) = (fitted.px((0.0, 19.5 * std::f64::consts::PI / 180.0)).1 as u32 + 2, fitted.px((0.0, 0.5 * std::f64::consts::PI / 180.0)).1 as u32 - 2);
    let mut worst = 0u8;
    for y in y0..y1 {
        for x in (bx as u32 - 4)..=(bx as u32 + 4) {
            worst = worst.max(pix.pixel(x, y).unwrap().red());
        }
    }
    worst
}

#[test]
fn neighbours_show_no_gap_after_simplification() {
    let (fitted, pieces) = two_districts();
    let outlines: Vec<Pieces> = pieces.iter().map(|pc| fitted.to_pixels(pc)).collect();
    let kept: usize = outlines.iter().flat_map(|o| &o.rings).map(Vec::len).sum();
    // 2 x 405 points in; the sub-pixel jitter goes, the wave stays.
    assert!(kept < 500, "simplification dropped the sub-pixel jitter: {kept} points kept");
    let wave = outlines[0].rings[0].iter().map(|q| q.0).fold(f64::NEG_INFINITY, f64::max) - fitted.px((0.0, 0.0)).0;
    assert!(wave > 1.0, "the 1.5 px wave is kept: {wave}");
    // Two anti-aliased edges over one pixel leave at most about a quarter
    // of the white showing (conflation); a gap of a pixel would show all of it.
    let worst = lightest_on_border(&fitted, &outlines);
    assert!(worst <= 80, "lightest pixel along the shared border: {worst}");
}

#[test]
fn the_gap_check_catches_neighbours_simplified_apart() {
    let (fitted, pieces) = two_districts();
    let mut outlines: Vec<Pieces> = pieces.iter().map(|pc| fitted.to_pixels(pc)).collect();
    // Deliberately broken: the east district simplified on its own at 40
    // square pixels, so its side of the border no longer follows the wave.
    let east: Vec<(f64, f64)> = pieces[1].rings[0].iter().map(|&q| fitted.px(q)).collect();
    outlines[1].rings = vec![strata::geo::simplify::simplify(&east, 40.0, true)];
    let worst = lightest_on_border(&fitted, &outlines);
    assert!(worst > 200, "a gap between neighbours shows white pixels: lightest {worst}");
}
