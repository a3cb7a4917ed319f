//! Label marks (`draw: "label"`, issue 12 item 9): value labels sit just
//! outside a bar's end, or inside when there is no room; text inside a mark
//! takes the colour of best contrast with it (WCAG 2.x contrast ratio, at
//! least 4.5:1, the level for normal text); labels follow `arrange` and
//! `proportion` keeps its axis at 0..1; labels never overlap one another;
//! labels at line points keep off the line. Invented data written here.

use strata::color::contrast;
use strata::scene::{Node, Scene, SceneOptions};
use strata::text;
use strata::{render, RenderOptions};

fn at(width: f64) -> RenderOptions {
    RenderOptions { scene: SceneOptions { width } }
}

#[derive(Debug, Clone)]
struct Label {
    text: String,
    fill: String,
    /// Left, top, right, bottom of the text's line box.
    bbox: (f64, f64, f64, f64),
}

fn walk<'a>(n: &'a Node, f: &mut dyn FnMut(&'a Node)) {
    f(n);
    if let Node::Group { children, .. } | Node::Titled { children, .. } = n {
        children.iter().for_each(|c| walk(c, f));
    }
}

fn labels(s: &Scene) -> Vec<Label> {
    let mut out = Vec::new();
    s.children.iter().for_each(|c| {
        walk(c, &mut |n| {
            if let Node::Text { x, y, text: t, size, anchor, class, fill, .. } = n {
                if class.starts_with("strata-label") {
                    let w = text::width(t, *size, false);
                    let left = match anchor {
                        strata::scene::Anchor::Start => *x,
                        strata::scene::Anchor::Middle => x - w / 2.0,
                        strata::scene::Anchor::End => x - w,
                    };
                    // The glyphs: from the cap height above the baseline to a little below it.
                    let top = y - size * text::CAP;
                    out.push(Label { text: t.clone(), fill: fill.clone(), bbox: (left, top, left + w, y + size * 0.2) });
                }
            }
        })
    });
    out
}

/// Bars: (x, y, width, height, fill, datum y).
fn rects(s: &Scene) -> Vec<(f64, f64, f64, f64, String)> {
    let mut out = Vec::new();
    s.children.iter().for_each(|c| {
        walk(c, &mut |n| {
            if let Node::Rect { x, y, width, height, paint, datum: Some(_) } = n {
                out.push((*x, *y, *width, *height, paint.fill.clone().unwrap_or_default()));
            }
        })
    });
    out
}

fn overlap(a: (f64, f64, f64, f64), b: (f64, f64, f64, f64)) -> bool {
    a.0 < b.2 && b.0 < a.2 && a.1 < b.3 && b.1 < a.3
}

const STACKED: &str = r#"{ "data": { "rows": [
    {"site": "Ashby", "answer": "Yes", "n": 42}, {"site": "Ashby", "answer": "No", "n": 18},
    {"site": "Brill", "answer": "Yes", "n": 25}, {"site": "Brill", "answer": "No", "n": 35},
    {"site": "Corran", "answer": "Yes", "n": 30}, {"site": "Corran", "answer": "No", "n": 50} ] },
  "layers": [ { "draw": "bar", "x": "site", "y": "n", "color": "answer", "arrange": "ARR" },
              { "draw": "label", "x": "site", "y": "n", "color": "answer", "arrange": "ARR" } ] }"#;

#[test]
fn stacked_labels_sit_in_their_own_segment_with_contrast() {
    let r = render(&STACKED.replace("ARR", "stack"), None, &at(640.0)).unwrap();
    let ls = labels(&r.scene);
    let bars = rects(&r.scene);
    assert_eq!(ls.len(), 6, "{ls:?}");
    // Each label reads its own value, never the running total (Ashby's "No" is 18, not 60).
    let mut texts: Vec<&str> = ls.iter().map(|l| l.text.as_str()).collect();
    texts.sort();
    assert_eq!(texts, ["18", "25", "30", "35", "42", "50"]);
    let mut px_per_unit = Vec::new();
    for l in &ls {
        // Inside exactly one segment, which it contrasts with at 4.5:1 or more
        // (WCAG 2.1 success criterion 1.4.3, contrast minimum).
        let home: Vec<_> = bars.iter().filter(|b| l.bbox.1 >= b.1 - 0.5 && l.bbox.3 <= b.1 + b.3 + 0.5 && l.bbox.0 >= b.0 && l.bbox.2 <= b.0 + b.2).collect();
        assert_eq!(home.len(), 1, "{l:?} in {bars:?}");
        // ... and it is the label's own segment: every segment's height is
        // its label's value at one scale (a label placed from the running
        // total sat in the segment below it and passed the check above).
        px_per_unit.push(home[0].3 / l.text.parse::<f64>().unwrap());
        let c = contrast(&l.fill, &home[0].4).unwrap();
        assert!(c >= 4.5, "{} on {}: {c}", l.fill, home[0].4);
    }
    let (lo, hi) = px_per_unit.iter().fold((f64::INFINITY, 0.0f64), |(a, b), v| (a.min(*v), b.max(*v)));
    assert!(hi / lo < 1.01, "segments are not their labels' values: {px_per_unit:?}");
}

#[test]
fn proportion_labels_keep_the_axis_at_one() {
    let spec = STACKED.replace("ARR", "proportion");
    let s = strata::parse_spec(&spec).unwrap();
    let table = strata::load_table(&s, None).unwrap();
    let plan = strata::plan::build(&s, &table).unwrap();
    let (lo, hi) = plan.scales.y.domain().unwrap();
    // Before: the labels' raw counts (up to 50) stretched the 0..1 axis.
    assert!(lo >= 0.0 && hi <= 1.0 + 1e-9, "y domain {lo}..{hi}");
    let r = render(&spec, None, &at(640.0)).unwrap();
    let mut texts: Vec<String> = labels(&r.scene).into_iter().map(|l| l.text).collect();
    texts.sort();
    assert_eq!(texts, ["18", "25", "30", "35", "42", "50"]);
}

#[test]
fn bar_labels_sit_outside_the_end_or_inside_when_there_is_no_room() {
    // The tallest bar reaches the top of the frame (domain fixed at its value).
    let spec = r##"{ "data": { "rows": [ {"k": "A", "v": 12}, {"k": "B", "v": 40}, {"k": "C", "v": -9} ] },
        "layers": [ { "draw": "bar", "x": "k", "y": "v", "style": { "color": "#e38b3a" } }, { "draw": "label", "x": "k", "y": "v" } ],
        "scales": { "y": { "domain": [-20, 40], "nice": false } } }"##;
    let r = render(spec, None, &at(640.0)).unwrap();
    let ls = labels(&r.scene);
    let bars = rects(&r.scene);
    let find = |t: &str| ls.iter().find(|l| l.text == t).unwrap_or_else(|| panic!("{t} missing: {ls:?}"));
    let bar_of = |i: usize| &bars[i];
    // A (12): just above its bar's top, on the background.
    let (a, ab) = (find("12"), bar_of(0));
    assert!(a.bbox.3 <= ab.1 && ab.1 - a.bbox.3 < 8.0, "{a:?} over {ab:?}");
    // Orange on white falls short of 4.5:1, so it is written in the theme's
    // text colour, with the class the theme sheet restyles in dark mode.
    assert_eq!(a.fill, "#1d232b");
    assert_eq!(r.svg.matches("strata-label strata-label-text").count(), 2, "the two outside labels follow the theme");
    // B (40): no room above the frame: inside, in a colour that reads on orange.
    let (b, bb) = (find("40"), bar_of(1));
    assert!(b.bbox.1 >= bb.1 && b.bbox.3 <= bb.1 + bb.3, "{b:?} in {bb:?}");
    assert!(contrast(&b.fill, "#e38b3a").unwrap() >= 4.5, "{} on orange", b.fill);
    // C (-9): the bar runs down, so its outside is below.
    let cb = bar_of(2);
    let c = ls.iter().find(|l| l.text != "12" && l.text != "40").unwrap();
    assert!(c.bbox.1 >= cb.1 + cb.3 && c.bbox.1 - (cb.1 + cb.3) < 8.0, "{c:?} below {cb:?}");
}

#[test]
fn labels_never_overlap() {
    // Forty points crowded on a narrow chart, each labelled.
    let rows: Vec<String> = (0..40).map(|i| format!(r#"{{"t": {i}, "v": {}}}"#, 50 + i % 2)).collect();
    let spec = format!(
        r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "point", "x": "t", "y": "v" }}, {{ "draw": "label", "x": "t", "y": "v" }} ],
            "scales": {{ "y": {{ "domain": [0, 100] }} }} }}"#,
        rows.join(", ")
    );
    let r = render(&spec, None, &at(375.0)).unwrap();
    let ls = labels(&r.scene);
    // Centred over their points, forty labels 8 px apart would pile up;
    // some stand aside and the rest are left out.
    assert!(ls.len() >= 10, "{}", ls.len());
    for (i, a) in ls.iter().enumerate() {
        for b in &ls[i + 1..] {
            assert!(!overlap(a.bbox, b.bbox), "{a:?} overlaps {b:?}");
        }
    }
}

#[test]
fn labels_at_line_points_keep_off_the_line() {
    let spec = r#"{ "data": { "rows": [ {"m": 1, "v": 10}, {"m": 2, "v": 30}, {"m": 3, "v": 12}, {"m": 4, "v": 28}, {"m": 5, "v": 35} ] },
        "layers": [ { "draw": "line", "x": "m", "y": "v" }, { "draw": "label", "x": "m", "y": "v" } ] }"#;
    let r = render(spec, None, &at(640.0)).unwrap();
    let ls = labels(&r.scene);
    assert_eq!(ls.len(), 5);
    let mut segs = Vec::new();
    r.scene.children.iter().for_each(|c| {
        walk(c, &mut |n| {
            if let Node::Path { d, datum: Some(_), .. } = n {
                let pts: Vec<(f64, f64)> = d
                    .iter()
                    .filter_map(|s| match *s {
                        strata::scene::Seg::Move(x, y) | strata::scene::Seg::Line(x, y) => Some((x, y)),
                        _ => None,
                    })
                    .collect();
                segs.extend(pts.windows(2).map(|w| (w[0], w[1])));
            }
        })
    });
    assert_eq!(segs.len(), 4);
    // A segment crosses a box when any of many points along it is inside.
    for l in &ls {
        for (p, q) in &segs {
            let hit = (0..=200).any(|k| {
                let t = k as f64 / 200.0;
                let (x, y) = (p.0 + (q.0 - p.0) * t, p.1 + (q.1 - p.1) * t);
                x > l.bbox.0 && x < l.bbox.2 && y > l.bbox.1 && y < l.bbox.3
            });
            assert!(!hit, "{l:?} covers the line {p:?}-{q:?}");
        }
    }
}

#[test]
fn labels_on_bars_running_across_sit_past_the_bar_end() {
    // Bars that run across the page (transposed coordinates, as when the
    // categories are on y): a label sits right of its bar's end, or inside
    // when the end reaches the frame.
    let spec = r##"{ "data": { "rows": [ {"k": "A", "v": 12}, {"k": "B", "v": 40} ] },
        "layers": [ { "draw": "bar", "x": "k", "y": "v", "style": { "color": "#e38b3a" } }, { "draw": "label", "x": "k", "y": "v" } ],
        "scales": { "y": { "domain": [0, 40], "nice": false } } }"##;
    let s = strata::parse_spec(spec).unwrap();
    let table = strata::load_table(&s, None).unwrap();
    let mut plan = strata::plan::build(&s, &table).unwrap();
    plan.chart.transposed = true;
    let scene = strata::scene::build(&plan, &SceneOptions::default());
    let ls = labels(&scene);
    let bars = rects(&scene);
    assert_eq!((ls.len(), bars.len()), (2, 2), "{ls:?} {bars:?}");
    let find = |t: &str| ls.iter().find(|l| l.text == t).unwrap();
    let (a, ab) = (find("12"), &bars[0]);
    assert!(a.bbox.0 >= ab.0 + ab.2 && a.bbox.0 - (ab.0 + ab.2) < 8.0, "{a:?} past {ab:?}");
    assert!(a.bbox.1 >= ab.1 && a.bbox.3 <= ab.1 + ab.3, "{a:?} level with {ab:?}");
    let (b, bb) = (find("40"), &bars[1]);
    assert!(b.bbox.2 <= bb.0 + bb.2 && b.bbox.0 >= bb.0, "{b:?} inside {bb:?}");
    assert!(contrast(&b.fill, "#e38b3a").unwrap() >= 4.5);
}

/// Point labels that had to move to the far ring (24 px out) are joined to
/// their point by a leader; near ones are not. Forty crowded points labelled
/// with names (before: far labels floated with nothing to say whose they were,
/// seen on 51 labelled states in a user trial).
#[test]
fn far_point_labels_get_a_leader_to_their_point() {
    // Thirty sites in a cluster a tenth of the plot wide, two far away to set the scales.
    let mut rows: Vec<String> =
        (0..30).map(|i| format!(r#"{{"x": {}, "y": {}, "name": "Site {i}"}}"#, 40.0 + ((i * 7) % 9) as f64, 40.0 + ((i * 11) % 7) as f64 * 1.5)).collect();
    rows.push(r#"{"x": 0, "y": 0, "name": "Low"}"#.into());
    rows.push(r#"{"x": 100, "y": 100, "name": "High"}"#.into());
    let spec = format!(
        r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "point", "x": "x", "y": "y" }}, {{ "draw": "label", "x": "x", "y": "y", "text": "name" }} ] }}"#,
        rows.join(",")
    );
    let r = render(&spec, None, &at(480.0)).unwrap();
    let mut dots = Vec::new();
    let mut leaders = Vec::new();
    r.scene.children.iter().for_each(|c| {
        walk(c, &mut |n| match n {
            Node::Circle { cx, cy, .. } => dots.push((*cx, *cy)),
            Node::Line { x1, y1, x2, y2, .. } => leaders.push(((*x1, *y1), (*x2, *y2))),
            _ => {}
        })
    });
    let ls = labels(&r.scene);
    assert!(ls.len() > 10, "{}", ls.len());
    // Distance from a point to a box (0 inside).
    let gap = |p: (f64, f64), b: (f64, f64, f64, f64)| ((b.0 - p.0).max(p.0 - b.2).max(0.0)).hypot((b.1 - p.1).max(p.1 - b.3).max(0.0));
    let mut far = 0;
    for l in &ls {
        let nearest = dots.iter().map(|d| gap(*d, l.bbox)).fold(f64::INFINITY, f64::min);
        // A label of the near rings has a dot within 12 px + gap; farther
        // ones must have a leader starting at their box and ending by a dot.
        if nearest > 20.0 {
            far += 1;
            let led = leaders.iter().any(|(a, b)| gap(*a, l.bbox) < 2.5 && dots.iter().any(|d| (d.0 - b.0).hypot(d.1 - b.1) < 4.0));
            assert!(led, "{} sits {nearest:.1} px from every dot with no leader", l.text);
        }
    }
    assert!(far > 0, "the case should push some labels to the far ring");
}
