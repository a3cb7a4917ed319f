//! Guides: axes with ticks, grid lines and titles; the colour legend.

use super::coord::{Coord, Frame};
use super::{Anchor, Node, Paint};
use crate::color::{self, Palette};
use crate::scale::{PositionScale, Tick};
use crate::text;

pub const TICK_SIZE: f64 = 12.0;
pub const TITLE_SIZE: f64 = 12.0;
const GAP: f64 = 6.0;

/// Which side of the frame an axis sits on.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Side {
    Bottom,
    Left,
}

pub struct AxisGuide<'a> {
    pub side: Side,
    pub scale: &'a PositionScale,
    pub ticks: Vec<Tick>,
    pub title: &'a str,
}

/// Keep every k-th label so that neighbours do not overlap on a bottom axis.
pub fn thin_bottom_ticks(ticks: Vec<Tick>, length: f64) -> Vec<Tick> {
    if ticks.len() < 2 {
        return ticks;
    }
    let widest = ticks.iter().map(|t| text::width(&t.label, TICK_SIZE, false)).fold(0.0, f64::max);
    let spacing = length * (ticks[1].unit - ticks[0].unit).abs();
    let k = ((widest + 8.0) / spacing.max(1e-9)).ceil().max(1.0) as usize;
    ticks.into_iter().enumerate().filter(|(i, _)| i % k == 0).map(|(_, t)| t).collect()
}

/// Widest tick label, for the left margin.
pub fn widest_label(ticks: &[Tick]) -> f64 {
    ticks.iter().map(|t| text::width(&t.label, TICK_SIZE, false)).fold(0.0, f64::max)
}

fn label(x: f64, y: f64, s: &str, anchor: Anchor, fill: &str, class: &str) -> Node {
    Node::Text { x, y, text: s.to_string(), size: TICK_SIZE, anchor, bold: false, angle: 0.0, fill: fill.to_string(), class: class.to_string() }
}

/// Grid lines for continuous scales (drawn under the marks).
pub fn grid(axis: &AxisGuide, coord: &Coord, pal: &Palette) -> Vec<Node> {
    if axis.scale.is_discrete() {
        return vec![];
    }
    let f = coord.frame();
    axis.ticks
        .iter()
        .map(|t| match axis.side {
            Side::Left => {
                let y = f.bottom() - t.unit * f.height;
                Node::Line { x1: f.left, y1: y, x2: f.right(), y2: y, paint: Paint::stroke(&pal.grid, 1.0) }
            }
            Side::Bottom => {
                let x = f.left + t.unit * f.width;
                Node::Line { x1: x, y1: f.top, x2: x, y2: f.bottom(), paint: Paint::stroke(&pal.grid, 1.0) }
            }
        })
        .collect()
}

/// Axis line, tick labels and title.
pub fn axis(axis: &AxisGuide, f: Frame, pal: &Palette, label_width: f64) -> Node {
    let mut kids = Vec::new();
    let baseline = TICK_SIZE * text::ASCENT;
    match axis.side {
        Side::Bottom => {
            kids.push(Node::Line { x1: f.left, y1: f.bottom(), x2: f.right(), y2: f.bottom(), paint: Paint::stroke(&pal.axis, 1.0) });
            for t in &axis.ticks {
                let x = f.left + t.unit * f.width;
                kids.push(label(x, f.bottom() + GAP + baseline, &t.label, Anchor::Middle, &pal.muted, "strata-tick"));
            }
            if !axis.title.is_empty() {
                let y = f.bottom() + GAP + TICK_SIZE * text::LINE_HEIGHT + GAP + TITLE_SIZE * text::ASCENT;
                kids.push(Node::Text {
                    x: f.left + f.width / 2.0,
                    y,
                    text: axis.title.to_string(),
                    size: TITLE_SIZE,
                    anchor: Anchor::Middle,
                    bold: false,
                    angle: 0.0,
                    fill: pal.text.clone(),
                    class: "strata-axis-title".into(),
                });
            }
        }
        Side::Left => {
            if axis.scale.is_discrete() {
                kids.push(Node::Line { x1: f.left, y1: f.top, x2: f.left, y2: f.bottom(), paint: Paint::stroke(&pal.axis, 1.0) });
            }
            for t in &axis.ticks {
                let y = f.bottom() - t.unit * f.height;
                kids.push(label(f.left - GAP, y + TICK_SIZE * 0.35, &t.label, Anchor::End, &pal.muted, "strata-tick"));
            }
            if !axis.title.is_empty() {
                let x = f.left - GAP - label_width - GAP - TITLE_SIZE * (text::LINE_HEIGHT - text::ASCENT);
                kids.push(Node::Text {
                    x,
                    y: f.top + f.height / 2.0,
                    text: axis.title.to_string(),
                    size: TITLE_SIZE,
                    anchor: Anchor::Middle,
                    bold: false,
                    angle: -90.0,
                    fill: pal.text.clone(),
                    class: "strata-axis-title".into(),
                });
            }
        }
    }
    let (class, label) = match axis.side {
        Side::Bottom => ("strata-axis strata-axis-bottom", "horizontal axis"),
        Side::Left => ("strata-axis strata-axis-left", "vertical axis"),
    };
    let title = if axis.title.is_empty() { label.to_string() } else { format!("{label}: {}", axis.title) };
    Node::Group { class: class.into(), role: None, label: Some(title), children: kids }
}

/// Height the bottom axis needs below the frame.
pub fn bottom_axis_height(has_title: bool) -> f64 {
    GAP + TICK_SIZE * text::LINE_HEIGHT + if has_title { GAP + TITLE_SIZE * text::LINE_HEIGHT } else { 0.0 }
}

/// Width the left axis needs beside the frame.
pub fn left_axis_width(label_width: f64, has_title: bool) -> f64 {
    GAP + label_width + if has_title { GAP + TITLE_SIZE * text::LINE_HEIGHT } else { 0.0 }
}

// ---------------------------------------------------------------- legend

const SWATCH: f64 = 10.0;

/// Size of a vertical category legend.
pub fn legend_size(title: &str, cats: &[String]) -> (f64, f64) {
    let w = cats.iter().map(|c| SWATCH + 6.0 + text::width(c, TICK_SIZE, false)).fold(text::width(title, TICK_SIZE, true), f64::max);
    let h = TICK_SIZE * text::LINE_HEIGHT * (cats.len() as f64 + if title.is_empty() { 0.0 } else { 1.0 });
    (w, h)
}

/// A vertical category legend with its top-left corner at (x, y).
pub fn legend(title: &str, cats: &[String], x: f64, y: f64, pal: &Palette) -> Node {
    let lh = TICK_SIZE * text::LINE_HEIGHT;
    let mut kids = Vec::new();
    let mut row = y;
    if !title.is_empty() {
        kids.push(Node::Text {
            x,
            y: row + TICK_SIZE * text::ASCENT,
            text: title.to_string(),
            size: TICK_SIZE,
            anchor: Anchor::Start,
            bold: true,
            angle: 0.0,
            fill: pal.text.clone(),
            class: "strata-legend-title".into(),
        });
        row += lh;
    }
    for (i, c) in cats.iter().enumerate() {
        let mid = row + lh / 2.0;
        kids.push(Node::Rect { x, y: mid - SWATCH / 2.0, width: SWATCH, height: SWATCH, paint: Paint::fill(color::category(i)), datum: None });
        kids.push(label(x + SWATCH + 6.0, mid + TICK_SIZE * 0.35, c, Anchor::Start, &pal.text, "strata-legend-label"));
        row += lh;
    }
    Node::Group { class: "strata-legend".into(), role: Some("list".into()), label: Some(format!("legend: {title}")), children: kids }
}
