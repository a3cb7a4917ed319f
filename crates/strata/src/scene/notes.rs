//! Notes (annotations) at data positions: reference lines, shaded spans and
//! text, placed so that their texts do not overlap one another.

use super::coord::{Area, Coord};
use super::{Anchor, Node, Paint};
use crate::color::Palette;
use crate::data::time::{parse_date, parse_datetime};
use crate::plan::Scales;
use crate::scale::PositionScale;
use crate::spec::Note;
use crate::text;
use serde_json::Value;

const SIZE: f64 = 12.0;

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

/// Text boxes already placed, to keep notes from covering each other.
struct Placed(Vec<(f64, f64, f64, f64)>);

impl Placed {
    /// Move (x, baseline) down a line at a time until the box is free.
    fn place(&mut self, x: f64, y: f64, w: f64, anchor: Anchor) -> f64 {
        let left = match anchor {
            Anchor::Start => x,
            Anchor::Middle => x - w / 2.0,
            Anchor::End => x - w,
        };
        let line = SIZE * text::LINE_HEIGHT;
        let mut y = y;
        for _ in 0..8 {
            let (top, bottom) = (y - SIZE * text::ASCENT, y - SIZE * text::ASCENT + line);
            if !self.0.iter().any(|(l, t, r, b)| left < *r && left + w > *l && top < *b && bottom > *t) {
                break;
            }
            y += line;
        }
        self.0.push((left, y - SIZE * text::ASCENT, left + w, y - SIZE * text::ASCENT + line));
        y
    }
}

/// The notes of a plot area, drawn over its marks.
pub fn draw(notes: &[Note], scales: &Scales, coord: &Coord, pal: &Palette) -> Option<Node> {
    if notes.is_empty() || coord.is_polar() {
        return None;
    }
    let frame = coord.frame();
    let mut spans = Vec::new();
    let mut lines = Vec::new();
    let mut texts = Vec::new();
    let mut placed = Placed(Vec::new());
    let label = |x: f64, y: f64, s: &str, anchor: Anchor| Node::Text {
        x,
        y,
        text: s.to_string(),
        size: SIZE,
        anchor,
        bold: false,
        angle: 0.0,
        fill: pal.text.clone(),
        class: "strata-note".into(),
    };
    for n in notes {
        let ux = n.x.as_ref().and_then(|v| unit(&scales.x, v));
        let uxe = n.x_end.as_ref().and_then(|v| unit(&scales.x, v));
        let uy = n.y.as_ref().and_then(|v| unit(&scales.y, v));
        let uye = n.y_end.as_ref().and_then(|v| unit(&scales.y, v));
        let words = n.text.as_deref().unwrap_or("");
        let w = text::width(words, SIZE, false);
        // Where the text goes, in pixels, with its anchor.
        let mut at: Option<(f64, f64, Anchor)> = None;
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
                    if let Area::Rect { x, y, width, height } = coord.area(x0, x1, y0, y1) {
                        spans.push(Node::Rect { x, y, width, height, paint, datum: None });
                        at = Some((x + 4.0, y + SIZE * text::ASCENT + 3.0, Anchor::Start));
                    }
                }
            }
            (None, None, Some(a), Some(b)) => {
                let (y0, y1) = span(&scales.y, a, b);
                let (y0, y1) = (y0.max(0.0), y1.min(1.0));
                if y0 < y1 {
                    let mut paint = Paint::fill(&pal.muted);
                    paint.opacity = Some(0.14);
                    if let Area::Rect { x, y, width, height } = coord.area(0.0, 1.0, y0, y1) {
                        spans.push(Node::Rect { x, y, width, height, paint, datum: None });
                        at = Some((x + width - 4.0, y + SIZE * text::ASCENT + 3.0, Anchor::End));
                    }
                }
            }
            // A point with text.
            (Some(x), None, Some(y), None) if inside(x) && inside(y) => {
                let (px, py) = coord.point(x, y);
                lines.push(Node::Circle { cx: px, cy: py, r: 2.5, paint: Paint::fill(&pal.text), datum: None });
                let anchor = if px + w + 6.0 > frame.right() { Anchor::End } else { Anchor::Start };
                let dx = if anchor == Anchor::End { -6.0 } else { 6.0 };
                at = Some((px + dx, py - 6.0, anchor));
            }
            // Reference lines.
            (Some(x), None, None, None) if inside(x) => {
                let (x1, y1) = coord.point(x, 0.0);
                let (x2, y2) = coord.point(x, 1.0);
                let mut paint = Paint::stroke(&pal.text, 1.0);
                paint.dash = Some(vec![4.0, 3.0]);
                lines.push(Node::Line { x1, y1, x2, y2, paint });
                let (tx, ty) = (x1.max(x2), y1.min(y2));
                let anchor = if tx + w + 4.0 > frame.right() { Anchor::End } else { Anchor::Start };
                at = Some((if anchor == Anchor::End { tx - 4.0 } else { tx + 4.0 }, ty + SIZE * text::ASCENT + 2.0, anchor));
            }
            (None, None, Some(y), None) if inside(y) => {
                let (x1, y1) = coord.point(0.0, y);
                let (x2, y2) = coord.point(1.0, y);
                let mut paint = Paint::stroke(&pal.text, 1.0);
                paint.dash = Some(vec![4.0, 3.0]);
                lines.push(Node::Line { x1, y1, x2, y2, paint });
                at = Some((x1.max(x2) - 4.0, y1.min(y2) - 4.0, Anchor::End));
            }
            _ => {}
        }
        if let (Some((x, y, anchor)), false) = (at, words.is_empty()) {
            let y = placed.place(x, y, w, anchor);
            texts.push(label(x, y, words, anchor));
        }
    }
    let mut children = spans;
    children.extend(lines);
    children.extend(texts);
    Some(Node::Group { class: "strata-notes".into(), role: Some("graphics-object".into()), label: Some("notes".into()), children })
}
