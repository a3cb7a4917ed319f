//! Stage 4 — the scene: marks, axes, legends and text in pixel coordinates.
//!
//! Hand-off: [`Scene`], a tree of groups and primitive marks. Every data mark
//! carries the data values it stands for (`datum`), after any statistic, so
//! the scene (`strata render --scene`) is also the debugging and test hook.

mod build;
mod coord;
mod guides;
mod map;
mod marks;
mod notes;
mod shapes;

pub use build::{build, chart_size, SceneOptions, TITLE_SIZE};
pub use shapes::shape_path;

use indexmap::IndexMap;
use serde::ser::SerializeSeq;
use serde::{Serialize, Serializer};

/// The data values a mark stands for, keyed by channel.
pub type Datum = IndexMap<String, serde_json::Value>;

#[derive(Debug, Clone, Serialize)]
pub struct Scene {
    pub width: f64,
    pub height: f64,
    /// Short accessible name (the title, or a generated one).
    pub label: String,
    /// Longer text alternative: the spec's `description` or a summary.
    pub description: String,
    pub font_family: String,
    pub background: String,
    /// Theme classes for the SVG root (`strata-light`, `strata-dark`,
    /// `strata-auto`, `strata-own-<slot>`), read by `www/strata-theme.css`.
    pub classes: String,
    pub children: Vec<Node>,
}

/// Paint of a primitive; `None` leaves the SVG default.
#[derive(Debug, Clone, Default, PartialEq, Serialize)]
pub struct Paint {
    #[serde(skip_serializing_if = "Option::is_none")]
    pub fill: Option<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub stroke: Option<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub stroke_width: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub opacity: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub dash: Option<Vec<f64>>,
    /// Fill by the even-odd rule (a map region's pieces and holes).
    #[serde(skip_serializing_if = "std::ops::Not::not")]
    pub even_odd: bool,
}

impl Paint {
    /// The paint's numbers, for checks.
    pub fn numbers(&self) -> Vec<f64> {
        self.stroke_width.into_iter().chain(self.opacity).chain(self.dash.iter().flatten().copied()).collect()
    }
    #[inline(never)]
    pub fn fill(c: &str) -> Self {
        Paint { fill: Some(c.to_string()), ..Default::default() }
    }
    #[inline(never)]
    pub fn stroke(c: &str, width: f64) -> Self {
        Paint { fill: Some("none".into()), stroke: Some(c.to_string()), stroke_width: Some(width), ..Default::default() }
    }
}

/// One segment of a path, in pixels. The SVG stage writes them as path
/// data; the scene itself writes no path text.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Seg {
    Move(f64, f64),
    Line(f64, f64),
    /// An elliptical arc to (x, y) with radii (rx, ry), the large-arc and
    /// sweep flags of SVG's `A` command, and no rotation.
    Arc {
        rx: f64,
        ry: f64,
        large: bool,
        sweep: bool,
        x: f64,
        y: f64,
    },
    Close,
}

impl Seg {
    /// The segment's numbers, for checks.
    pub fn numbers(&self) -> Vec<f64> {
        match *self {
            Seg::Move(x, y) | Seg::Line(x, y) => vec![x, y],
            Seg::Arc { rx, ry, x, y, .. } => vec![rx, ry, x, y],
            Seg::Close => vec![],
        }
    }
}

/// In `--scene` JSON a segment is an array led by its SVG letter:
/// `["M", x, y]`, `["L", x, y]`, `["A", rx, ry, large, sweep, x, y]`, `["Z"]`.
impl Serialize for Seg {
    fn serialize<S: Serializer>(&self, ser: S) -> Result<S::Ok, S::Error> {
        let mut seq = ser.serialize_seq(None)?;
        match *self {
            Seg::Move(x, y) => {
                seq.serialize_element("M")?;
                seq.serialize_element(&x)?;
                seq.serialize_element(&y)?;
            }
            Seg::Line(x, y) => {
                seq.serialize_element("L")?;
                seq.serialize_element(&x)?;
                seq.serialize_element(&y)?;
            }
            Seg::Arc { rx, ry, large, sweep, x, y } => {
                seq.serialize_element("A")?;
                for v in [rx, ry] {
                    seq.serialize_element(&v)?;
                }
                seq.serialize_element(&large)?;
                seq.serialize_element(&sweep)?;
                for v in [x, y] {
                    seq.serialize_element(&v)?;
                }
            }
            Seg::Close => seq.serialize_element("Z")?,
        }
        seq.end()
    }
}

/// A polyline through pixel points, closed or not.
pub fn polyline(pts: &[(f64, f64)], close: bool) -> Vec<Seg> {
    let mut d = Vec::with_capacity(pts.len() + 1);
    for (i, &(x, y)) in pts.iter().enumerate() {
        d.push(if i == 0 { Seg::Move(x, y) } else { Seg::Line(x, y) });
    }
    if close {
        d.push(Seg::Close);
    }
    d
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Anchor {
    Start,
    Middle,
    End,
}

#[derive(Debug, Clone, Serialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum Node {
    Group {
        class: String,
        #[serde(skip_serializing_if = "Option::is_none")]
        role: Option<String>,
        #[serde(skip_serializing_if = "Option::is_none")]
        label: Option<String>,
        children: Vec<Node>,
    },
    Rect {
        x: f64,
        y: f64,
        width: f64,
        height: f64,
        #[serde(flatten)]
        paint: Paint,
        #[serde(skip_serializing_if = "Option::is_none")]
        datum: Option<Datum>,
    },
    Circle {
        cx: f64,
        cy: f64,
        r: f64,
        #[serde(flatten)]
        paint: Paint,
        #[serde(skip_serializing_if = "Option::is_none")]
        datum: Option<Datum>,
    },
    Line {
        x1: f64,
        y1: f64,
        x2: f64,
        y2: f64,
        #[serde(flatten)]
        paint: Paint,
    },
    Path {
        d: Vec<Seg>,
        #[serde(flatten)]
        paint: Paint,
        #[serde(skip_serializing_if = "Option::is_none")]
        datum: Option<Datum>,
    },
    Text {
        x: f64,
        y: f64,
        text: String,
        size: f64,
        anchor: Anchor,
        bold: bool,
        /// Rotation in degrees about (x, y).
        angle: f64,
        fill: String,
        class: String,
    },
    /// Nodes that stand for a longer text, say a shortened category label:
    /// written as a `<g>` whose `<title>` (shown on hover, read by screen
    /// readers) holds the full wording.
    Titled { title: String, children: Vec<Node> },
}

impl Node {
    #[inline(never)]
    pub fn line(x1: f64, y1: f64, x2: f64, y2: f64, paint: Paint) -> Node {
        Node::Line { x1, y1, x2, y2, paint }
    }

    #[inline(never)]
    pub fn path(d: Vec<Seg>, paint: Paint, datum: Option<Datum>) -> Node {
        Node::Path { d, paint, datum }
    }

    /// A text, neither bold nor turned.
    #[inline(never)]
    pub fn text(x: f64, y: f64, text: String, size: f64, anchor: Anchor, fill: String, class: &str) -> Node {
        Node::styled_text(x, y, text, size, anchor, false, 0.0, fill, class)
    }

    /// A text, bold or not, turned by `angle` degrees.
    #[allow(clippy::too_many_arguments)]
    #[inline(never)]
    pub fn styled_text(x: f64, y: f64, text: String, size: f64, anchor: Anchor, bold: bool, angle: f64, fill: String, class: &str) -> Node {
        Node::Text { x, y, text, size, anchor, bold, angle, fill, class: class.to_string() }
    }

    #[inline(never)]
    pub fn group(class: &str, children: Vec<Node>) -> Node {
        Node::named_group(class.to_string(), None, None, children)
    }

    /// A group with an ARIA role and label.
    #[inline(never)]
    pub fn named_group(class: String, role: Option<&str>, label: Option<String>, children: Vec<Node>) -> Node {
        Node::Group { class, role: role.map(str::to_string), label, children }
    }

    /// Every data mark below this node, depth first.
    pub fn marks(&self) -> Vec<&Node> {
        let mut out = Vec::new();
        fn walk<'a>(n: &'a Node, out: &mut Vec<&'a Node>) {
            match n {
                Node::Group { children, .. } | Node::Titled { children, .. } => children.iter().for_each(|c| walk(c, out)),
                Node::Rect { datum: Some(_), .. } | Node::Circle { datum: Some(_), .. } | Node::Path { datum: Some(_), .. } => out.push(n),
                _ => {}
            }
        }
        walk(self, &mut out);
        out
    }
}

impl Scene {
    /// Every data mark in drawing order.
    pub fn marks(&self) -> Vec<&Node> {
        let mut out = Vec::new();
        for c in &self.children {
            out.extend(c.marks());
        }
        out
    }

    /// Every node holding a number that is not finite (NaN or an infinity),
    /// described by its place in the tree. Geometry is computed, never read
    /// from input, so anything listed here is an engine bug: the golden and
    /// fuzz tests assert the list is empty, and the SVG writer debug-asserts.
    pub fn non_finite(&self) -> Vec<String> {
        fn walk(n: &Node, at: String, out: &mut Vec<String>) {
            let (kind, nums): (&str, Vec<f64>) = match n {
                Node::Group { children, .. } | Node::Titled { children, .. } => {
                    for (i, c) in children.iter().enumerate() {
                        walk(c, format!("{at}/{i}"), out);
                    }
                    return;
                }
                Node::Rect { x, y, width, height, paint, .. } => ("rect", [vec![*x, *y, *width, *height], paint.numbers()].concat()),
                Node::Circle { cx, cy, r, paint, .. } => ("circle", [vec![*cx, *cy, *r], paint.numbers()].concat()),
                Node::Line { x1, y1, x2, y2, paint } => ("line", [vec![*x1, *y1, *x2, *y2], paint.numbers()].concat()),
                Node::Path { d, paint, .. } => ("path", paint.numbers().into_iter().chain(d.iter().flat_map(Seg::numbers)).collect()),
                Node::Text { x, y, size, angle, .. } => ("text", vec![*x, *y, *size, *angle]),
            };
            if let Some(v) = nums.iter().find(|v| !v.is_finite()) {
                out.push(format!("{at} ({kind}): {}", crate::format::float::Plain(*v)));
            }
        }
        let mut out = Vec::new();
        for v in [self.width, self.height] {
            if !v.is_finite() {
                out.push(format!("scene size: {}", crate::format::float::Plain(v)));
            }
        }
        for (i, c) in self.children.iter().enumerate() {
            walk(c, format!("/{i}"), &mut out);
        }
        out
    }
}
