//! Notes (annotations) at data positions: reference lines, shaded spans and
//! text, placed so that their texts do not overlap one another.

use super::coord::{Area, Coord};
use super::marks::{box_within, leader, text_box, Grid};
use super::{polyline, Anchor, Node, Paint};
use crate::calendar::{parse_date, parse_datetime};
use crate::color::Palette;
use crate::plan::Note;
use crate::plan::Scales;
use crate::scale::PositionScale;
use crate::text;
use serde_json::Value;

/// Unit position of a note's value on a scale: a number, a category, or an
/// ISO 8601 date or date-time on a time scale.
fn unit(scale: &PositionScale, v: &Value) -> Option<f64> {
    match v {
        Value::Number(n) => scale.unit_num(n.as_f64()?),
        Value::String(s) => scale.unit_cat(s).or_else(|| {
            let ms = parse_datetime(s).or_else(|| parse_date(s).map(|d| d * 86_400_000))?;
            scale.unit_num(ms as f64)
        }),
        _ => None,
    }
}

/// The unit extent of a span from `a` to `b`: categories cover their whole bands.
fn span(scale: &PositionScale, a: f64, b: f64) -> (f64, f64) {
    let half = scale.band() / 2.0;
    (a.min(b) - half, a.max(b) + half)
}

fn inside(u: f64) -> bool {
    (-1e-9..=1.0 + 1e-9).contains(&u)
}

/// Where a note's text may go, best first: where it was asked, then the
/// other places near what it marks (`alts`), then each of those a line at a
/// time up and down (up to eight lines); a note at a point tries rings
/// around it, once to six times 6 px away.
fn candidates(x: f64, y: f64, anchor: Anchor, at_point: Option<(f64, f64)>, alts: &[(f64, f64, Anchor)], size: f64) -> Vec<(f64, f64, Anchor)> {
    let line = size * text::LINE_HEIGHT;
    let cap = size * text::CAP;
    let mut first = vec![(x, y, anchor)];
    if let Some((px, py)) = at_point {
        for k in [1.0, 2.0, 3.0, 4.0, 6.0] {
            let g = 6.0 * k;
            first.extend([
                (px + g, py - g, Anchor::Start),
                (px - g, py - g, Anchor::End),
                (px + g, py + g + cap, Anchor::Start),
                (px - g, py + g + cap, Anchor::End),
                (px, py - g, Anchor::Middle),
                (px, py + g + cap, Anchor::Middle),
            ]);
        }
        return first;
    }
    first.extend_from_slice(alts);
    let mut out = first.clone();
    for k in 1..=8 {
        for &(cx, cy, ca) in &first {
            out.push((cx, cy + k as f64 * line, ca));
            out.push((cx, cy - k as f64 * line, ca));
        }
    }
    out
}

/// Steps per side when a polar outline or line is traced, so rings look round.
const POLAR_STEPS: usize = 64;

/// Pixel points from unit (x0, y0) to (x1, y1), straight in unit space:
/// in polar coordinates a line along the angle becomes an arc.
fn traced(coord: &Coord, (x0, y0): (f64, f64), (x1, y1): (f64, f64)) -> Vec<(f64, f64)> {
    let mut out = Vec::with_capacity(POLAR_STEPS + 1);
    for k in 0..=POLAR_STEPS {
        let t = k as f64 / POLAR_STEPS as f64;
        out.push(coord.point(x0 + (x1 - x0) * t, y0 + (y1 - y0) * t));
    }
    out
}

/// A shaded span: a rectangle, or in polar coordinates a ring sector.
fn shade(coord: &Coord, x0: f64, x1: f64, y0: f64, y1: f64, paint: Paint) -> Option<(Node, (f64, f64, f64, f64))> {
    if coord.is_polar() {
        let mut pts = traced(coord, (x0, y0), (x1, y0));
        pts.extend(traced(coord, (x1, y0), (x1, y1)).into_iter().skip(1));
        pts.extend(traced(coord, (x1, y1), (x0, y1)).into_iter().skip(1));
        pts.extend(traced(coord, (x0, y1), (x0, y0)).into_iter().skip(1));
        let (mut l, mut t, mut r, mut b) = (f64::INFINITY, f64::INFINITY, f64::NEG_INFINITY, f64::NEG_INFINITY);
        for p in &pts {
            (l, t, r, b) = (l.min(p.0), t.min(p.1), r.max(p.0), b.max(p.1));
        }
        return Some((Node::path(polyline(&pts, true), paint, None), (l, t, r - l, b - t)));
    }
    match coord.area(x0, x1, y0, y1) {
        Area::Rect { x, y, width, height } => Some((Node::Rect { x, y, width, height, paint, datum: None }, (x, y, width, height))),
        Area::Path(_) => None,
    }
}

/// Where a polar reference line's text goes: a ring's text sits centred
/// above its top, where the ring runs level; a spoke's text sits along its
/// outer end, on the inside, so it stays clear of the angle labels.
/// `along_x`: the line runs along the x scale (a line at one y value).
#[cfg(feature = "polar")]
fn polar_text(coord: &Coord, along_x: bool, at: f64) -> Option<(f64, f64, Anchor)> {
    let Coord::Polar { frame, angle_is_x, start, .. } = *coord else { return None };
    let (cx, _, _) = super::coord::polar_centre(frame);
    let ring = along_x == angle_is_x;
    // The angle (as a unit position) that points straight up.
    let up = (-start / 360.0).rem_euclid(1.0);
    if ring {
        let (px, py) = if angle_is_x { coord.point(up, at) } else { coord.point(at, up) };
        return Some((px, py - 4.0, Anchor::Middle));
    }
    let (px, py) = if along_x { coord.point(1.0, at) } else { coord.point(at, 1.0) };
    Some(if px >= cx { (px - 4.0, py - 4.0, Anchor::End) } else { (px + 4.0, py - 4.0, Anchor::Start) })
}

/// The core engine draws no polar coordinates (feature `polar`).
#[cfg(not(feature = "polar"))]
fn polar_text(_: &Coord, _: bool, _: f64) -> Option<(f64, f64, Anchor)> {
    None
}

/// A dashed reference line between two unit points.
fn reference(coord: &Coord, a: (f64, f64), b: (f64, f64), pal: &Palette) -> (Node, (f64, f64), (f64, f64)) {
    let mut paint = Paint::stroke(&pal.text, 1.0);
    paint.dash = Some(vec![4.0, 3.0]);
    let (p, q) = (coord.point(a.0, a.1), coord.point(b.0, b.1));
    if coord.is_polar() {
        let d = polyline(&traced(coord, a, b), false);
        return (Node::path(d, paint, None), p, q);
    }
    (Node::line(p.0, p.1, q.0, q.1, paint), p, q)
}

/// The notes of a plot area, drawn over its marks (`marks`: the plot's
/// layers, which the notes' texts keep off).
pub fn draw(notes: &[Note], scales: &Scales, coord: &Coord, pal: &Palette, size: f64, marks: &[Node]) -> Option<Node> {
    if notes.is_empty() {
        return None;
    }
    let frame = coord.frame();
    let mut spans = Vec::new();
    let mut lines = Vec::new();
    let mut texts = Vec::new();
    // The data and the texts already placed: a note's text keeps off both.
    let mut taken = Grid::of_marks(marks);
    let label = |x: f64, y: f64, s: &str, anchor: Anchor| Node::text(x, y, s.to_string(), size, anchor, pal.text.clone(), "strata-note");
    for n in notes {
        let ux = n.x.as_ref().and_then(|v| unit(&scales.x, v));
        let uxe = n.x_end.as_ref().and_then(|v| unit(&scales.x, v));
        let uy = n.y.as_ref().and_then(|v| unit(&scales.y, v));
        let uye = n.y_end.as_ref().and_then(|v| unit(&scales.y, v));
        let words = n.text.as_deref().unwrap_or("");
        let w = text::width(words, size, false);
        // Where the text goes, in pixels, with its anchor; and the point a
        // note at a point stands for.
        let mut at: Option<(f64, f64, Anchor)> = None;
        let mut point: Option<(f64, f64)> = None;
        // Other places near what the note marks, should the first be taken.
        let mut alts: Vec<(f64, f64, Anchor)> = Vec::new();
        let (cap, desc) = (size * text::CAP, size * 0.25);
        match (ux, uxe, uy, uye) {
            // Shaded spans: along x (full height, or between y and y_end), or along y.
            (Some(a), Some(b), y0, y1) => {
                let (x0, x1) = span(&scales.x, a, b);
                let (y0, y1) = match (y0, y1) {
                    (Some(c), Some(d)) => span(&scales.y, c, d),
                    _ => (0.0, 1.0),
                };
                let (x0, x1, y0, y1) = (x0.max(0.0), x1.min(1.0), y0.max(0.0), y1.min(1.0));
                if x0 < x1 && y0 < y1 {
                    let mut paint = Paint::fill(&pal.muted);
                    paint.opacity = Some(0.14);
                    if let Some((node, (x, y, width, height))) = shade(coord, x0, x1, y0, y1, paint) {
                        spans.push(node);
                        at = Some(if coord.is_polar() {
                            // Beside the sector's outer edge, at its middle.
                            let (px, py) = coord.point(0.5 * (x0 + x1), y1);
                            (px + 4.0, py - 4.0, Anchor::Start)
                        } else {
                            // The span's other top corner, then its bottom corners.
                            let (top, low) = (y + size * text::ASCENT + 3.0, y + height - 4.0 - desc);
                            alts = vec![(x + width - 4.0, top, Anchor::End), (x + 4.0, low, Anchor::Start), (x + width - 4.0, low, Anchor::End)];
                            (x + 4.0, top, Anchor::Start)
                        });
                    }
                }
            }
            (None, None, Some(a), Some(b)) => {
                let (y0, y1) = span(&scales.y, a, b);
                let (y0, y1) = (y0.max(0.0), y1.min(1.0));
                if y0 < y1 {
                    let mut paint = Paint::fill(&pal.muted);
                    paint.opacity = Some(0.14);
                    if let Some((node, (x, y, width, height))) = shade(coord, 0.0, 1.0, y0, y1, paint) {
                        spans.push(node);
                        at = Some(if coord.is_polar() {
                            let (px, py) = coord.point(0.0, y1);
                            (px + 4.0, py - 4.0, Anchor::Start)
                        } else {
                            let (top, low) = (y + size * text::ASCENT + 3.0, y + height - 4.0 - desc);
                            alts = vec![(x + 4.0, top, Anchor::Start), (x + width - 4.0, low, Anchor::End), (x + 4.0, low, Anchor::Start)];
                            (x + width - 4.0, top, Anchor::End)
                        });
                    }
                }
            }
            // A point with text.
            (Some(x), None, Some(y), None) if inside(x) && inside(y) => {
                let (px, py) = coord.point(x, y);
                point = Some((px, py));
                lines.push(Node::Circle { cx: px, cy: py, r: 2.5, paint: Paint::fill(&pal.text), datum: None });
                let anchor = if px + w + 6.0 > frame.right() { Anchor::End } else { Anchor::Start };
                let dx = if anchor == Anchor::End { -6.0 } else { 6.0 };
                at = Some((px + dx, py - 6.0, anchor));
            }
            // Reference lines.
            (Some(x), None, None, None) if inside(x) => {
                let (node, (x1, y1), (x2, y2)) = reference(coord, (x, 0.0), (x, 1.0), pal);
                lines.push(node);
                at = polar_text(coord, false, x).or_else(|| {
                    let (tx, ty) = (x1.max(x2), y1.min(y2));
                    let anchor = if tx + w + 4.0 > frame.right() { Anchor::End } else { Anchor::Start };
                    // The line's other side at the top, then both sides at the bottom.
                    let low = frame.bottom() - 4.0 - desc;
                    alts = vec![(tx - 4.0, ty + size * text::ASCENT + 2.0, Anchor::End), (tx + 4.0, ty + size * text::ASCENT + 2.0, Anchor::Start)];
                    alts.retain(|a| a.2 != anchor);
                    alts.extend([(tx + 4.0, low, Anchor::Start), (tx - 4.0, low, Anchor::End)]);
                    Some((if anchor == Anchor::End { tx - 4.0 } else { tx + 4.0 }, ty + size * text::ASCENT + 2.0, anchor))
                });
            }
            (None, None, Some(y), None) if inside(y) => {
                let (node, (x1, y1), (x2, y2)) = reference(coord, (0.0, y), (1.0, y), pal);
                lines.push(node);
                at = polar_text(coord, true, y).or_else(|| {
                    // The left end above, then both ends below the line.
                    let (l, r, ly) = (x1.min(x2), x1.max(x2), y1.min(y2));
                    alts = vec![(l + 4.0, ly - 4.0, Anchor::Start), (r - 4.0, ly + 4.0 + cap, Anchor::End), (l + 4.0, ly + 4.0 + cap, Anchor::Start)];
                    Some((r - 4.0, ly - 4.0, Anchor::End))
                });
            }
            _ => {}
        }
        if let (Some((x, y, anchor)), false) = (at, words.is_empty()) {
            // The first free place; where it was asked counts as inside the frame.
            let cands = candidates(x, y, anchor, point, &alts, size);
            let chosen = cands
                .iter()
                .enumerate()
                .find(|(k, (cx, cy, ca))| {
                    let b = text_box(*cx, *cy, w, size, *ca);
                    (*k == 0 || box_within(b, frame)) && taken.free(b)
                })
                .map(|(k, c)| (k, *c));
            let (k, (x, y, anchor)) = chosen.unwrap_or((0, (x, y, anchor)));
            let b = text_box(x, y, w, size, anchor);
            taken.add_box(b);
            if let (true, true, Some(p)) = (n.pointer, k > 0, point) {
                lines.extend(leader(p, b, pal));
            }
            texts.push(label(x, y, words, anchor));
        }
    }
    let mut children = spans;
    children.extend(lines);
    children.extend(texts);
    Some(Node::named_group("strata-notes".into(), Some("graphics-object"), Some("notes".into()), children))
}

#[cfg(test)]
mod tests {
    use crate::scene::{Node, Scene};
    use crate::{render, RenderOptions};

    fn notes_of(scene: &Scene) -> Vec<Node> {
        fn walk(n: &Node, out: &mut Vec<Node>) {
            if let Node::Group { class, children, .. } = n {
                if class == "strata-notes" {
                    out.extend(children.iter().cloned());
                } else {
                    children.iter().for_each(|c| walk(c, out));
                }
            }
        }
        let mut out = Vec::new();
        scene.children.iter().for_each(|c| walk(c, &mut out));
        out
    }

    /// Pixel points of a path made of moves and lines.
    fn points(d: &[crate::scene::Seg]) -> Vec<(f64, f64)> {
        use crate::scene::Seg;
        d.iter()
            .filter_map(|s| match *s {
                Seg::Move(x, y) | Seg::Line(x, y) => Some((x, y)),
                _ => None,
            })
            .collect()
    }

    #[test]
    fn polar_notes_are_rings_spokes_and_sectors() {
        let spec = r#"{ "data": { "rows": [ {"d": "N", "h": 10}, {"d": "E", "h": 30}, {"d": "S", "h": 20}, {"d": "W", "h": 40} ] },
            "layers": [ { "draw": "bar", "x": "d", "y": "h" } ],
            "scales": { "y": { "domain": [0, 40] } },
            "coords": { "kind": "polar", "angle": "x" },
            "notes": [ { "y": 20, "text": "ring" }, { "x": "E", "text": "spoke" }, { "x": "S", "x_end": "W", "text": "sector" } ] }"#;
        let r = render(spec, None, &RenderOptions::default()).unwrap();
        assert!(r.warnings.is_empty(), "{:?}", r.warnings);
        let notes = notes_of(&r.scene);
        let paths: Vec<Vec<(f64, f64)>> = notes.iter().filter_map(|n| if let Node::Path { d, .. } = n { Some(points(d)) } else { None }).collect();
        let texts: Vec<&str> = notes.iter().filter_map(|n| if let Node::Text { text, .. } = n { Some(text.as_str()) } else { None }).collect();
        assert_eq!(texts.len(), 3, "{texts:?}");
        assert_eq!(paths.len(), 3, "sector, ring and spoke are paths");
        // The ring (y = 20 of 0..40, inner radius 0): every point at half
        // the outer radius from the centre (circle geometry, common practice).
        let centre = |pts: &[(f64, f64)]| {
            let n = pts.len() as f64;
            (pts.iter().map(|p| p.0).sum::<f64>() / n, pts.iter().map(|p| p.1).sum::<f64>() / n)
        };
        let ring = paths.iter().find(|p| {
            let c = centre(&p[..p.len() - 1]);
            let r0 = ((p[0].0 - c.0).powi(2) + (p[0].1 - c.1).powi(2)).sqrt();
            r0 > 1.0 && p.iter().all(|q| (((q.0 - c.0).powi(2) + (q.1 - c.1).powi(2)).sqrt() - r0).abs() < 0.05)
        });
        assert!(ring.is_some(), "one path is a circle: {paths:?}");
        // The spoke is straight: all its points on one line through its ends.
        let straight = paths.iter().any(|p| {
            let (a, b) = (p[0], p[p.len() - 1]);
            p.len() > 2 && p.iter().all(|q| ((b.0 - a.0) * (q.1 - a.1) - (b.1 - a.1) * (q.0 - a.0)).abs() < 0.5 * crate::math::hypot(b.0 - a.0, b.1 - a.1))
        });
        assert!(straight, "one path is a straight spoke");
    }
}
