//! Rasterise rendered charts with resvg (0.49.0, the bundled font loaded
//! explicitly) and check that known data values land on the expected pixel
//! rows and columns, within one pixel. The expected positions come from the
//! picture itself (grid lines and the axis line found by colour), not from
//! the engine's own numbers.

use resvg::{tiny_skia, usvg};
use strata::{render, RenderOptions};

fn options() -> usvg::Options<'static> {
    let mut opt = usvg::Options::default();
    let db = opt.fontdb_mut();
    db.load_font_data(include_bytes!("../../../fonts/AtkinsonHyperlegibleNext-Regular.ttf").to_vec());
    db.load_font_data(include_bytes!("../../../fonts/AtkinsonHyperlegibleNext-Bold.ttf").to_vec());
    db.set_sans_serif_family("Atkinson Hyperlegible Next");
    opt.font_family = "Atkinson Hyperlegible Next".into();
    opt
}

struct Picture {
    pix: tiny_skia::Pixmap,
}

impl Picture {
    fn new(svg: &str) -> Picture {
        let tree = usvg::Tree::from_str(svg, &options()).expect("svg parses");
        let size = tree.size().to_int_size();
        let mut pix = tiny_skia::Pixmap::new(size.width(), size.height()).unwrap();
        resvg::render(&tree, tiny_skia::Transform::identity(), &mut pix.as_mut());
        Picture { pix }
    }
    fn rgb(&self, x: u32, y: u32) -> [f64; 3] {
        let p = self.pix.pixel(x, y).unwrap().demultiply();
        [p.red() as f64, p.green() as f64, p.blue() as f64]
    }
    /// How much of colour `c` (over white) pixel (x, y) holds, 0..1, read
    /// on the channel where `c` differs most from white.
    fn coverage(&self, x: u32, y: u32, c: [f64; 3]) -> f64 {
        let k = (0..3).max_by(|a, b| (255.0 - c[*a]).total_cmp(&(255.0 - c[*b]))).unwrap();
        let p = self.rgb(x, y);
        let f = ((255.0 - p[k]) / (255.0 - c[k])).clamp(0.0, 1.0);
        // Only blends of white and c count (grey lines and text do not).
        let blend = (0..3).all(|j| (p[j] - (255.0 - f * (255.0 - c[j]))).abs() <= 12.0);
        if blend {
            f
        } else {
            0.0
        }
    }
    /// Is the pixel close to colour c?
    fn near(&self, x: u32, y: u32, c: [f64; 3], tol: f64) -> bool {
        let p = self.rgb(x, y);
        (0..3).all(|k| (p[k] - c[k]).abs() <= tol)
    }
}

fn hex(s: &str) -> [f64; 3] {
    let v = u32::from_str_radix(&s[1..], 16).unwrap();
    [(v >> 16) as f64, ((v >> 8) & 255) as f64, (v & 255) as f64]
}

/// Centres of runs of non-white rows in column x (weighted by darkness).
fn line_rows(p: &Picture, x: u32, y0: u32, y1: u32) -> Vec<f64> {
    let mut out = Vec::new();
    let mut run: Vec<(u32, f64)> = Vec::new();
    for y in y0..y1 {
        let d = 255.0 - p.rgb(x, y).iter().cloned().fold(255.0, f64::min);
        if d > 4.0 {
            run.push((y, d));
        } else if !run.is_empty() {
            let w: f64 = run.iter().map(|r| r.1).sum();
            out.push(run.iter().map(|r| (r.0 as f64 + 0.5) * r.1).sum::<f64>() / w);
            run.clear();
        }
    }
    out
}

/// Centroids of connected blobs of colour `c` (more than 10 pixels).
fn blobs_of(p: &Picture, c: [f64; 3], w: u32, h: u32) -> Vec<(f64, f64)> {
    let mut seen = vec![false; (w * h) as usize];
    let mut blobs: Vec<(f64, f64)> = Vec::new();
    let hit = |x: u32, y: u32| p.coverage(x, y, c) >= 0.5 && p.near(x, y, c, 60.0);
    for y in 0..h {
        for x in 0..w {
            if seen[(y * w + x) as usize] || !hit(x, y) {
                continue;
            }
            let mut stack = vec![(x, y)];
            let (mut sx, mut sy, mut n) = (0.0, 0.0, 0.0);
            while let Some((a, b)) = stack.pop() {
                if a >= w || b >= h || seen[(b * w + a) as usize] || !hit(a, b) {
                    continue;
                }
                seen[(b * w + a) as usize] = true;
                sx += a as f64 + 0.5;
                sy += b as f64 + 0.5;
                n += 1.0;
                stack.extend([(a + 1, b), (a.wrapping_sub(1), b), (a, b + 1), (a, b.wrapping_sub(1))]);
            }
            if n > 10.0 {
                blobs.push((sx / n, sy / n));
            }
        }
    }
    blobs
}

#[test]
fn dates_land_on_calendar_grid_lines() {
    // Points on the first day of each quarter; the time axis (y, the value
    // axis, which carries the grid) ticks quarters, so each point must sit
    // on a horizontal grid line.
    let spec = r#"{
      "data": { "rows": [ {"d": "2024-01-01", "x": 1}, {"d": "2024-04-01", "x": 2}, {"d": "2024-07-01", "x": 3},
                          {"d": "2024-10-01", "x": 4}, {"d": "2025-01-01", "x": 5} ], "types": { "d": "date" } },
      "layers": [ { "draw": "point", "x": "x", "y": "d", "style": { "radius": 4 } } ],
      "scales": { "y": { "ticks": 5 }, "x": { "domain": [0, 6] } },
      "size": { "width": 600, "height": 500 },
      "theme": "light"
    }"#;
    let r = render(spec, None, &RenderOptions::default()).unwrap();
    let p = Picture::new(&r.svg);
    let mut blobs = blobs_of(&p, hex(strata::color::HARBOUR[0]), 600, 500);
    blobs.sort_by(|a, b| b.1.total_cmp(&a.1));
    assert_eq!(blobs.len(), 5, "{blobs:?}");
    // A column between the first two points, clear of any vertical line.
    let mut col = ((blobs[0].0 + blobs[1].0) / 2.0).round() as u32;
    while line_rows(&p, col, 0, 500).len() < 3 || line_rows(&p, col, 0, 500).len() > 20 {
        col += 1;
    }
    let lines = line_rows(&p, col, 0, 500);
    for b in &blobs {
        assert!(lines.iter().any(|l| (l - b.1).abs() <= 1.0), "point at y {} is off the grid {lines:?}", b.1);
    }
    // Quarters differ in length (91, 91, 92, 92 days): spacing follows the calendar.
    let gaps: Vec<f64> = blobs.windows(2).map(|w| w[0].1 - w[1].1).collect();
    let per_day = (blobs[0].1 - blobs[4].1) / 366.0;
    for (g, days) in gaps.iter().zip([91.0, 91.0, 92.0, 92.0]) {
        assert!((g - days * per_day).abs() <= 1.0, "{gaps:?}");
    }
}

#[test]
fn bars_land_on_their_values() {
    let spec = r#"{
      "data": { "rows": [ {"k": "a", "v": 25}, {"k": "b", "v": 50}, {"k": "c", "v": 100} ] },
      "layers": [ { "draw": "bar", "x": "k", "y": "v" } ],
      "scales": { "y": { "domain": [0, 100] } },
      "size": { "width": 600, "height": 400 },
      "theme": "light"
    }"#;
    let r = render(spec, None, &RenderOptions::default()).unwrap();
    let p = Picture::new(&r.svg);
    let bar = hex(strata::color::HARBOUR[0]);
    // A column right of the last bar holds only grid lines (thin runs).
    let gap_x = (300..600u32)
        .rev()
        .find(|x| {
            let runs = line_rows(&p, *x, 0, 400);
            runs.len() >= 3 && (0..400).all(|y| p.coverage(*x, y, bar) < 0.9)
        })
        .expect("a grid-only column");
    let rows = line_rows(&p, gap_x, 0, 400);
    assert!(rows.len() >= 3, "grid lines {rows:?}");
    let (y100, y0) = (rows[0], *rows.last().unwrap());
    // Plot edges from a middle grid line: right, its last ink; left, the
    // start of the ink run that reaches the gap column (labels stand apart).
    let gy = rows[rows.len() / 2].floor() as u32;
    let dark = |x: u32| 255.0 - p.rgb(x, gy).iter().cloned().fold(255.0, f64::min) > 4.0;
    let right = (0..600).rev().find(|x| dark(*x)).unwrap() as f64 + 1.0;
    let mut x = gap_x;
    while x > 0 && (dark(x - 1) || dark(x.saturating_sub(2))) {
        x -= 1;
    }
    let left = x as f64;
    let width = right - left;
    // Evenly spaced grid lines (a linear axis).
    let step = (y0 - y100) / (rows.len() - 1) as f64;
    for (i, y) in rows.iter().enumerate() {
        assert!((y - (y100 + step * i as f64)).abs() <= 1.0, "grid line {i} at {y}");
    }
    for (i, v) in [25.0, 50.0, 100.0].iter().enumerate() {
        // Column through the middle of band i.
        let cx = left + width * (i as f64 + 0.5) / 3.0;
        let col = cx.round() as u32;
        let height: f64 = (0..400).map(|y| p.coverage(col, y, bar)).filter(|c| *c > 0.02).sum();
        let want = (y0 - y100) * v / 100.0;
        assert!((height - want).abs() <= 1.0, "bar {i}: {height} px tall, want {want}");
        // The bar's top edge row.
        let top_row = (0..400).find(|y| p.coverage(col, *y, bar) > 0.5).unwrap() as f64;
        let want_top = y0 - want;
        assert!((top_row - want_top).abs() <= 1.0, "bar {i}: top {top_row}, want {want_top}");
        // Horizontal centre of the bar at mid-height.
        let y = (y0 - want / 2.0).round() as u32;
        let xs: Vec<u32> = (0..600).filter(|x| p.coverage(*x, y, bar) > 0.5).filter(|x| ((*x as f64) - cx).abs() < width / 6.0).collect();
        let centre = (xs[0] as f64 + *xs.last().unwrap() as f64 + 1.0) / 2.0;
        assert!((centre - cx).abs() <= 1.0, "bar {i}: centre {centre}, want {cx}");
    }
}

#[test]
fn points_on_a_log_axis_land_on_their_values() {
    // 1, 10, 100 on a log y axis (the value axis, with the grid): 10 sits
    // midway; x linear 0..10.
    let spec = r#"{
      "data": { "rows": [ {"y": 1, "x": 2}, {"y": 10, "x": 5}, {"y": 100, "x": 8} ] },
      "layers": [ { "draw": "point", "x": "x", "y": "y", "style": { "radius": 4 } } ],
      "scales": { "y": { "kind": "log", "domain": [1, 100] }, "x": { "domain": [0, 10] } },
      "size": { "width": 500, "height": 400 },
      "theme": "light"
    }"#;
    let r = render(spec, None, &RenderOptions::default()).unwrap();
    let p = Picture::new(&r.svg);
    let c = hex(strata::color::HARBOUR[0]);
    let mut blobs = blobs_of(&p, c, 500, 400);
    blobs.sort_by(|a, b| b.1.total_cmp(&a.1));
    assert_eq!(blobs.len(), 3, "{blobs:?}");
    // y: log spacing, so the middle point is halfway between the others.
    let mid = (blobs[0].1 + blobs[2].1) / 2.0;
    assert!((blobs[1].1 - mid).abs() <= 1.0, "{blobs:?}");
    // x: linear, 2, 5, 8 equally spaced; 5 halfway.
    let xmid = (blobs[0].0 + blobs[2].0) / 2.0;
    assert!((blobs[1].0 - xmid).abs() <= 1.0, "{blobs:?}");
    // Against the grid: horizontal grid lines at 1, 10, 100 pass through the
    // points' y. Read a column between two points.
    let col = ((blobs[0].0 + blobs[1].0) / 2.0).round() as u32;
    let lines = line_rows(&p, col, 0, 400);
    for b in &blobs {
        assert!(lines.iter().any(|l| (l - b.1).abs() <= 1.0), "point at y {} has no grid line; lines at {lines:?}", b.1);
    }
}

#[test]
fn text_is_drawn_in_the_bundled_font_at_its_measured_width() {
    let title = "Harvest by variety";
    let spec = format!(
        r#"{{ "title": "{title}", "data": {{ "rows": [ {{"k": "a", "v": 1}} ] }},
             "layers": [ {{ "draw": "bar", "x": "k", "y": "v" }} ], "size": {{ "width": 600, "height": 300 }}, "theme": "light" }}"#
    );
    let r = render(&spec, None, &RenderOptions::default()).unwrap();
    let p = Picture::new(&r.svg);
    // The title's ink: dark pixels in the title band (top 40 px).
    let text = hex(&strata::color::Palette::light().text);
    let cols: Vec<u32> = (0..600).filter(|x| (0..40).any(|y| p.coverage(*x, y, text) > 0.3)).collect();
    assert!(!cols.is_empty(), "no title ink: the font did not load");
    let ink = (*cols.last().unwrap() - cols[0] + 1) as f64;
    let measured = strata::text::width(title, strata::scene::TITLE_SIZE, true);
    // Ink is a little narrower than the advance sum (side bearings), and
    // kerning moves pairs slightly: within 4 % (common practice tolerance).
    assert!(ink <= measured + 1.0 && ink >= measured * 0.96 - 2.0, "ink {ink} px, measured {measured} px");
    // Starts at the left padding (16 px at this width).
    assert!((cols[0] as f64 - 16.0).abs() <= 2.0, "title starts at {}", cols[0]);
}

/// A donut (`angle: "y"`) drawn by resvg: the ring's centre and radii are
/// read off the picture; along the middle of the ring every pixel all the
/// way round is wedge colour (no gap between wedges), the ring's edges are
/// round to within 1.5 px at every degree (arcs, not straight chords), and
/// each answer's wedge spans its share of the turn, clockwise from the top.
/// (The legend is off: its swatches share the wedges' colours.)
fn check_donut(spec: &str, what: &str) {
    let r = render(spec, None, &RenderOptions::default()).unwrap();
    let mut fills: Vec<(String, [f64; 3])> = Vec::new();
    for m in r.scene.marks() {
        if let strata::scene::Node::Path { paint, datum: Some(d), .. } = m {
            let answer = d.get("color").and_then(|v| v.as_str()).unwrap_or_default().to_string();
            fills.push((answer, hex(paint.fill.as_deref().unwrap())));
        }
    }
    assert_eq!(fills.len(), 3, "{what}: one wedge per answer, got {fills:?}");
    let p = Picture::new(&r.svg);
    let (w, h) = (p.pix.width(), p.pix.height());
    let wedge = |x: u32, y: u32| fills.iter().any(|(_, c)| p.coverage(x, y, *c) >= 0.5 && p.near(x, y, *c, 60.0));
    let (mut x0, mut x1, mut y0, mut y1) = (u32::MAX, 0, u32::MAX, 0);
    for y in 0..h {
        for x in 0..w {
            if wedge(x, y) {
                (x0, x1, y0, y1) = (x0.min(x), x1.max(x), y0.min(y), y1.max(y));
            }
        }
    }
    let (cx, cy) = ((x0 + x1 + 1) as f64 / 2.0, (y0 + y1 + 1) as f64 / 2.0);
    let outer = (x1 + 1 - x0) as f64 / 2.0;
    assert!(((y1 + 1 - y0) as f64 / 2.0 - outer).abs() <= 1.0, "{what}: not round: {x0}..{x1} x {y0}..{y1}");
    let inner = (0..outer as u32).find(|d| wedge((cx + *d as f64) as u32, cy as u32)).unwrap() as f64;
    assert!(inner > 10.0 && inner < outer - 10.0, "{what}: a ring, inner {inner} outer {outer}");
    let at = |turn: f64, rad: f64| {
        let t = turn * std::f64::consts::TAU;
        ((cx + rad * t.sin()).floor() as u32, (cy - rad * t.cos()).floor() as u32)
    };
    let white = |x: u32, y: u32| p.rgb(x, y).iter().all(|c| *c > 235.0);
    let mid = (inner + outer) / 2.0;
    for k in 0..1440 {
        let turn = k as f64 / 1440.0;
        let (x, y) = at(turn, mid);
        assert!(!white(x, y), "{what}: a gap at {:.2} deg", turn * 360.0);
        // Inside the ring: ink (a seam between two wedges blends their colours).
        let (x, y) = at(turn, outer - 1.5);
        assert!(!white(x, y), "{what}: outer edge falls short at {:.2} deg", turn * 360.0);
        let (x, y) = at(turn, outer + 1.5);
        assert!(!wedge(x, y), "{what}: outer edge overshoots at {:.2} deg", turn * 360.0);
        let (x, y) = at(turn, inner + 1.5);
        assert!(!white(x, y), "{what}: inner edge falls short at {:.2} deg", turn * 360.0);
        let (x, y) = at(turn, inner - 1.5);
        assert!(!wedge(x, y), "{what}: inner edge overshoots at {:.2} deg", turn * 360.0);
    }
    // Shares 48, 31, 21 of 100: wedges [0, 0.48), [0.48, 0.79), [0.79, 1)
    // (clear of the radius labels' halo along the starting spoke).
    for (answer, turns) in [("Yes", [0.06, 0.24, 0.47]), ("No", [0.49, 0.635, 0.78]), ("Unsure", [0.80, 0.895, 0.99])] {
        let c = fills.iter().find(|f| f.0 == answer).unwrap().1;
        for t in turns {
            let (x, y) = at(t, mid);
            assert!(p.near(x, y, c, 30.0), "{what}: {answer} at {t} turn is {:?}", p.rgb(x, y));
        }
    }
}

#[test]
fn donut_wedges_are_round_and_close_the_ring() {
    let rows = r#"[ {"q": "all", "answer": "Yes", "n": 48}, {"q": "all", "answer": "No", "n": 31}, {"q": "all", "answer": "Unsure", "n": 21} ]"#;
    // Without an x: one ring split by y.
    let spec = format!(
        r#"{{ "data": {{ "rows": {rows} }}, "layers": [ {{ "draw": "bar", "y": "n", "color": "answer", "arrange": "stack" }} ],
            "coords": {{ "kind": "polar", "angle": "y", "inner": 0.5 }}, "scales": {{ "color": {{ "legend": "none" }} }}, "size": {{ "width": 560, "height": 460 }}, "theme": "light" }}"#
    );
    check_donut(&spec, "no x");
    // With one category on x: a ring in the band of that category.
    let spec = format!(
        r#"{{ "data": {{ "rows": {rows} }}, "layers": [ {{ "draw": "bar", "x": "q", "y": "n", "color": "answer", "arrange": "stack" }} ],
            "coords": {{ "kind": "polar", "angle": "y", "inner": 0.5 }}, "scales": {{ "color": {{ "legend": "none" }} }}, "size": {{ "width": 560, "height": 460 }}, "theme": "light" }}"#
    );
    check_donut(&spec, "one x");
}
