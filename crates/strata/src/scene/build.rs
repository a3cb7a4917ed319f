//! Layout: from the plan and the page's width to a [`Scene`].

use super::coord::{Coord, Frame};
use super::guides::{self, AxisGuide, Side};
use super::marks::{layer_marks, Ctx};
use super::{Anchor, Node, Scene};
use crate::color::Palette;
use crate::plan::{ColorScale, Plan};
use crate::spec::{Coords, Spec, Theme};
use crate::text;

/// What the host decides: the width when the spec gives none.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SceneOptions {
    pub width: f64,
}

impl Default for SceneOptions {
    fn default() -> Self {
        SceneOptions { width: 640.0 }
    }
}

const TITLE_SIZE: f64 = 18.0;
const SUBTITLE_SIZE: f64 = 14.0;
const SOURCE_SIZE: f64 = 11.0;
const DEFAULT_ASPECT: f64 = 1.6;

fn palette(theme: &Theme) -> Palette {
    match theme {
        Theme::Dark => Palette::dark(),
        Theme::Custom(o) => {
            let mut p = if o.base.as_deref() == Some("dark") { Palette::dark() } else { Palette::light() };
            let set = |slot: &mut String, v: &Option<String>| {
                if let Some(v) = v {
                    *slot = v.clone();
                }
            };
            set(&mut p.background, &o.background);
            set(&mut p.text, &o.text);
            set(&mut p.muted, &o.muted);
            set(&mut p.grid, &o.grid);
            set(&mut p.axis, &o.axis);
            set(&mut p.mark, &o.mark);
            p
        }
        _ => Palette::light(),
    }
}

fn text_block(lines: &[String], x: f64, top: f64, size: f64, bold: bool, fill: &str, class: &str) -> (Vec<Node>, f64) {
    let mut y = top;
    let mut out = Vec::new();
    for l in lines {
        out.push(Node::Text {
            x,
            y: y + size * text::ASCENT,
            text: l.clone(),
            size,
            anchor: Anchor::Start,
            bold,
            angle: 0.0,
            fill: fill.to_string(),
            class: class.to_string(),
        });
        y += size * text::LINE_HEIGHT;
    }
    (out, y)
}

pub fn build(spec: &Spec, plan: &Plan, opts: &SceneOptions) -> Scene {
    let width = spec.size.width.unwrap_or(opts.width).clamp(120.0, 4000.0);
    let height = spec.size.height.unwrap_or_else(|| width / spec.size.aspect.unwrap_or(DEFAULT_ASPECT)).clamp(80.0, 4000.0);
    let narrow = width <= 400.0;
    let pad = if narrow { 8.0 } else { 16.0 };
    let pal = palette(&spec.theme);
    let mut children = Vec::new();

    // Header: title and subtitle wrap at the chart width.
    let mut top = pad;
    let mut header = Vec::new();
    if let Some(t) = &spec.title {
        let (nodes, y) = text_block(&text::wrap(t, TITLE_SIZE, true, width - 2.0 * pad), pad, top, TITLE_SIZE, true, &pal.text, "strata-title");
        header.extend(nodes);
        top = y;
    }
    if let Some(t) = &spec.subtitle {
        let (nodes, y) = text_block(&text::wrap(t, SUBTITLE_SIZE, false, width - 2.0 * pad), pad, top, SUBTITLE_SIZE, false, &pal.muted, "strata-subtitle");
        header.extend(nodes);
        top = y;
    }
    if !header.is_empty() {
        top += 8.0;
        children.push(Node::group("strata-header", header));
    }

    // Footer: the source line.
    let mut bottom = height - pad;
    if let Some(s) = &spec.source {
        let lines = text::wrap(&format!("Source: {s}"), SOURCE_SIZE, false, width - 2.0 * pad);
        let h = lines.len() as f64 * SOURCE_SIZE * text::LINE_HEIGHT;
        let (nodes, _) = text_block(&lines, pad, bottom - h, SOURCE_SIZE, false, &pal.muted, "strata-source");
        children.push(Node::group("strata-footer", nodes));
        bottom -= h + 6.0;
    }

    // Legend: right of the plot when wide, above it when narrow.
    let scales = &plan.scales;
    let mut right = width - pad;
    let mut legend_node = None;
    if let Some(ColorScale::Categories(cats)) = &scales.color {
        let (lw, lh) = guides::legend_size(&scales.color_title, cats);
        if narrow {
            legend_node = Some(guides::legend(&scales.color_title, cats, pad, top, &pal));
            top += lh + 6.0;
        } else {
            legend_node = Some(guides::legend(&scales.color_title, cats, right - lw, top, &pal));
            right -= lw + 16.0;
        }
    }

    // Axes: the x scale is horizontal unless the coordinates flip it.
    let flip = matches!(spec.coords, Coords::Flip);
    let polar = matches!(spec.coords, Coords::Polar(_));
    let (h_scale, v_scale, h_title, v_title, h_spec, v_spec) = if flip {
        (&scales.y, &scales.x, &scales.y_title, &scales.x_title, &scales.y_spec, &scales.x_spec)
    } else {
        (&scales.x, &scales.y, &scales.x_title, &scales.y_title, &scales.x_spec, &scales.y_spec)
    };
    let wanted = |s: &crate::spec::ScaleSpec| s.ticks.map(|t| t as usize).unwrap_or(if narrow { 4 } else { 6 });
    let v_ticks = v_scale.ticks(wanted(v_spec), v_spec.format.as_deref());
    let v_label_w = guides::widest_label(&v_ticks);
    let left = pad + if polar { 0.0 } else { guides::left_axis_width(v_label_w, !v_title.is_empty()) };
    let plot_bottom = bottom - if polar { 0.0 } else { guides::bottom_axis_height(!h_title.is_empty()) };
    let frame = Frame { left, top: top + 4.0, width: (right - left).max(20.0), height: (plot_bottom - top - 4.0).max(20.0) };
    let coord = Coord::new(&spec.coords, frame);
    let h_ticks = guides::thin_bottom_ticks(h_scale.ticks(wanted(h_spec), h_spec.format.as_deref()), frame.width);
    // Vertical categories in flipped coordinates run top to bottom.
    let v_ticks = if flip { v_ticks.into_iter().map(|mut t| { t.unit = 1.0 - t.unit; t }).collect() } else { v_ticks };
    let h_axis = AxisGuide { side: Side::Bottom, scale: h_scale, ticks: h_ticks, title: h_title };
    let v_axis = AxisGuide { side: Side::Left, scale: v_scale, ticks: v_ticks, title: v_title };

    if !polar {
        let mut grid = guides::grid(&v_axis, &coord, &pal);
        grid.extend(guides::grid(&h_axis, &coord, &pal));
        children.push(Node::group("strata-grid", grid));
    }
    let ctx = Ctx { scales, coord, default_color: &pal.mark };
    let mut layers = Vec::new();
    for l in &plan.layers {
        let marks = layer_marks(&ctx, l);
        let n = marks.len();
        layers.push(Node::Group {
            class: format!("strata-layer strata-{}", l.geometry.word()),
            role: Some("graphics-object".into()),
            label: Some(format!("layer {}: {} {}{}", l.index + 1, n, l.geometry.word(), if n == 1 { "" } else { "s" })),
            children: marks,
        });
    }
    if !polar {
        children.push(guides::axis(&h_axis, frame, &pal, 0.0));
        children.push(guides::axis(&v_axis, frame, &pal, v_label_w));
    }
    children.push(Node::Group { class: "strata-plot".into(), role: Some("graphics-document".into()), label: Some("plot".into()), children: layers });
    if let Some(l) = legend_node {
        children.push(l);
    }

    let label = spec.title.clone().unwrap_or_else(|| default_label(plan));
    let description = spec.description.clone().unwrap_or_else(|| crate::summary::describe(spec, plan));
    Scene {
        width,
        height,
        label,
        description,
        font_family: text::FONT_FAMILY.to_string(),
        background: pal.background.clone(),
        children,
    }
}

fn default_label(plan: &Plan) -> String {
    let s = &plan.scales;
    match (s.y_title.is_empty(), s.x_title.is_empty()) {
        (false, false) => format!("Chart of {} by {}", s.y_title, s.x_title),
        _ => "Chart".to_string(),
    }
}
