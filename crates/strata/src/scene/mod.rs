//! Stage 4 — the scene: marks, axes, legends and text in pixel coordinates.
//!
//! Hand-off: [`Scene`], a tree of groups and primitive marks. Every data mark
//! carries the data values it stands for (`datum`), after any statistic, so
//! the scene (`strata render --scene`) is also the debugging and test hook.

mod build;
mod coord;
mod guides;
mod marks;
mod notes;

pub use build::{build, chart_size, SceneOptions, TITLE_SIZE};

use indexmap::IndexMap;
use serde::Serialize;

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
}

impl Paint {
    pub fn fill(c: &str) -> Self {
        Paint { fill: Some(c.to_string()), ..Default::default() }
    }
    pub fn stroke(c: &str, width: f64) -> Self {
        Paint { fill: Some("none".into()), stroke: Some(c.to_string()), stroke_width: Some(width), ..Default::default() }
    }
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
        d: String,
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
}

impl Node {
    pub fn group(class: &str, children: Vec<Node>) -> Node {
        Node::Group { class: class.to_string(), role: None, label: None, children }
    }

    /// Every data mark below this node, depth first.
    pub fn marks(&self) -> Vec<&Node> {
        let mut out = Vec::new();
        fn walk<'a>(n: &'a Node, out: &mut Vec<&'a Node>) {
            match n {
                Node::Group { children, .. } => children.iter().for_each(|c| walk(c, out)),
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
        self.children.iter().flat_map(|c| c.marks()).collect()
    }
}
