//! Layout: from the plan and the page's width to a [`Scene`].
//!
//! Width-driven: the width comes from the chart or the host; the height
//! from `size.height`, else `width / size.aspect`, else a default aspect
//! (wider charts are flatter). At 400 px and below the chart is "narrow":
//! fewer ticks, legends on top, tighter margins.

use super::coord::{Coord, Frame};
use super::guides::{self, AxisGuide, Legend, Side};
use super::marks::{end_names, layer_marks, names_ends, Ctx, END_GAP};
use super::{Anchor, Node, Scene};
use crate::channel::Channel;
use crate::color::Palette;
use crate::plan::{Chart, Coords, PanelPlans, Placement, Plan, Size};
use crate::text;

/// What the host decides: the width when the chart gives none.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SceneOptions {
    pub width: f64,
}

impl Default for SceneOptions {
    fn default() -> Self {
        SceneOptions { width: 640.0 }
    }
}

pub const TITLE_SIZE: f64 = 18.0;
pub const SUBTITLE_SIZE: f64 = 14.0;
pub const SOURCE_SIZE: f64 = 11.0;
const DEFAULT_ASPECT: f64 = 1.6;
const NARROW_ASPECT: f64 = 1.1;
/// Widths at or below this are laid out as narrow (phones).
pub const NARROW: f64 = 400.0;

fn text_block(lines: &[String], x: f64, top: f64, size: f64, bold: bool, fill: &str, class: &str) -> (Vec<Node>, f64) {
    let mut y = top;
    let mut out = Vec::new();
    for l in lines {
        out.push(Node::styled_text(x, y + size * text::ASCENT, l.clone(), size, Anchor::Start, bold, 0.0, fill.to_string(), class));
        y += size * text::LINE_HEIGHT;
    }
    (out, y)
}

/// Room a chart takes besides its plot: title, axis, source (a typical
/// chart's, measured on the gallery at 360 px; a little more is harmless).
const CHROME: f64 = 140.0;

/// A category axis down the side names every category: when the spec sets
/// no height (nor aspect), the chart grows until its categories stand a line
/// and a fifth apart, so 51 states on a phone are all named instead of every
/// third (found in a user trial). Panels and maps keep their size.
fn tall_enough(plan: &Plan, height: f64, ts: f64) -> f64 {
    let c = &plan.chart;
    if c.size.height.is_some() || c.size.aspect.is_some() || plan.panels.is_some() || plan.map.is_some() || matches!(c.coords, Coords::Polar(_)) {
        return height;
    }
    let v = if c.transposed { &plan.scales.x } else { &plan.scales.y };
    let crate::scale::PositionScale::Category { values, .. } = v else { return height };
    let need = values.len() as f64 * ts * text::LINE_HEIGHT * 1.2 + CHROME;
    height.max(need.min(4000.0))
}

/// The chart's size in pixels.
pub fn chart_size(size: &Size, opts: &SceneOptions) -> (f64, f64) {
    let width = size.width.unwrap_or(opts.width).clamp(120.0, 4000.0);
    let aspect = size.aspect.filter(|a| *a > 0.0).unwrap_or(if width <= NARROW { NARROW_ASPECT } else { DEFAULT_ASPECT });
    let height = size.height.unwrap_or(width / aspect).clamp(80.0, 4000.0);
    (width, height)
}

pub fn build(plan: &Plan, opts: &SceneOptions) -> Scene {
    let chart = &plan.chart;
    let (width, height) = chart_size(&chart.size, opts);
    let narrow = width <= NARROW;
    let pad = if narrow { 8.0 } else { 16.0 };
    let (pal, theme_class) = (chart.palette.clone(), chart.theme_classes.clone());
    // Text sizes: the theme's `font_size` sets the tick-label size and every
    // other text keeps its proportion to it.
    let ts = chart.font_size.unwrap_or(guides::TICK_SIZE);
    let height = tall_enough(plan, height, ts);
    let k = ts / guides::TICK_SIZE;
    let scales = &plan.scales;
    let loc = scales.locale;
    let mut children = Vec::new();

    // Header: title and subtitle wrap at the chart width.
    let mut top = pad;
    let mut header = Vec::new();
    let title_size = k * if narrow { TITLE_SIZE - 2.0 } else { TITLE_SIZE };
    if let Some(t) = &chart.title {
        let (nodes, y) = text_block(&text::wrap(t, title_size, true, width - 2.0 * pad), pad, top, title_size, true, &pal.text, "strata-title");
        header.extend(nodes);
        top = y;
    }
    if let Some(t) = &chart.subtitle {
        let size = k * SUBTITLE_SIZE;
        let (nodes, y) = text_block(&text::wrap(t, size, false, width - 2.0 * pad), pad, top, size, false, &pal.muted, "strata-subtitle");
        header.extend(nodes);
        top = y;
    }
    if !header.is_empty() {
        top += if narrow { 4.0 } else { 8.0 };
        children.push(Node::group("strata-header", header));
    }

    // Footer: the source line.
    let mut bottom = height - pad;
    if let Some(s) = &chart.source {
        let size = k * SOURCE_SIZE;
        let lines = text::wrap(&format!("Source: {s}"), size, false, width - 2.0 * pad);
        let h = lines.len() as f64 * size * text::LINE_HEIGHT;
        let (nodes, _) = text_block(&lines, pad, bottom - h, size, false, &pal.muted, "strata-source");
        children.push(Node::group("strata-footer", nodes));
        bottom -= h + 6.0;
    }

    // Legends: a column on the right when wide and the column takes at most
    // a quarter of the width; otherwise rows on top.
    let mut legends: Vec<Legend> = guides::legends(scales, guides::SwatchMark::of(&plan.layers), ts);
    // Series named at their line ends need no colour legend.
    let (mut colour_layers, mut all_named) = (0, true);
    for l in &plan.layers {
        if l.data.names.contains_key(&Channel::Color) {
            colour_layers += 1;
            all_named &= names_ends(l);
        }
    }
    if colour_layers > 0 && all_named {
        legends.retain(|l| l.channel != Channel::Color);
    }
    let mut right = width - pad;
    let mut left = pad;
    let mut legend_nodes = Vec::new();
    let mut legend_on_right = false;
    if !legends.is_empty() {
        // (The sum from -0.0, as `Iterator::sum` of f64 starts.)
        let (mut col_w, mut col_h) = (0.0f64, -0.0f64);
        for l in &legends {
            let (w, h) = guides::column_size(l);
            col_w = col_w.max(w);
            col_h += h + 12.0;
        }
        let placement_of = |l: &Legend| match l.channel {
            Channel::Size => scales.size_spec.legend,
            Channel::Shape => scales.shape_spec.legend,
            _ => scales.color_spec.legend,
        };
        let wants_top = legends.iter().any(|l| matches!(placement_of(l), Some(Placement::Top) | Some(Placement::Bottom)));
        let wants_bottom = legends.iter().any(|l| placement_of(l) == Some(Placement::Bottom));
        let wants_left = legends.iter().any(|l| placement_of(l) == Some(Placement::Left));
        let on_side = !narrow && !wants_top && col_w <= width * 0.25 && col_h <= bottom - top;
        legend_on_right = on_side && !wants_left;
        if on_side {
            // A column on the right, or on the left when asked (the plot then
            // starts after it).
            let x = if wants_left { left } else { right - col_w };
            let mut y = top + 4.0;
            for l in &legends {
                legend_nodes.push(guides::column(l, x, y, &pal, &pal.mark));
                y += guides::column_size(l).1 + 12.0;
            }
            if wants_left {
                left += col_w + 16.0;
            } else {
                right -= col_w + if narrow { 8.0 } else { 16.0 };
            }
        } else {
            // Rows on top (or, when asked, at the bottom), side by side when they fit.
            let avail = width - 2.0 * pad;
            let mut placed: Vec<(usize, f64, f64)> = Vec::new(); // legend, x, y offset
            let (mut x, mut y, mut line_h) = (pad, 0.0, 0.0f64);
            for (i, l) in legends.iter().enumerate() {
                let (w, h) = guides::row_size(l, avail);
                if x > pad && x + w > width - pad {
                    y += line_h + 6.0;
                    x = pad;
                    line_h = 0.0;
                }
                placed.push((i, x, y));
                x += w + 24.0;
                line_h = line_h.max(h);
            }
            let total = y + line_h;
            let origin = if wants_bottom { bottom - total } else { top };
            for (i, x, dy) in placed {
                legend_nodes.push(guides::rows(&legends[i], x, origin + dy, avail - (x - pad), &pal, &pal.mark));
            }
            if wants_bottom {
                bottom -= total + 10.0;
            } else {
                top += total + 8.0;
            }
        }
    }

    let inputs = PlotInputs { chart, pal: &pal, loc, narrow, pad, left, width, legend_on_right, ts };
    match &plan.panels {
        None if plan.map.is_some() => children.extend(super::map::draw(plan, &pal, left, top, right, bottom, false)),
        None => children.extend(plot_area(&inputs, plan, left, right, top, bottom)),
        // Small multiples are the full engine's (feature `panels`): the core
        // makes no panels (plan::panels::split) and keeps none of their layout.
        Some(_) if !PANELS => children.extend(plot_area(&inputs, plan, left, right, top, bottom)),
        Some(PanelPlans::Wrap { names, cells }) => children.extend(panel_grid(&inputs, plan, names, cells, right, top, bottom)),
        Some(PanelPlans::Grid { rows, cols, cells }) => {
            children.extend(cell_grid(&inputs, plan, GridNames::Cross { rows: rows.as_deref(), cols: cols.as_deref() }, cells, right, top, bottom))
        }
    }
    if !legend_nodes.is_empty() {
        children.push(Node::group("strata-legends", legend_nodes));
    }

    let label = chart.title.clone().unwrap_or_else(|| default_label(plan));
    let description = chart.description.clone().unwrap_or_default();
    Scene { width, height, label, description, font_family: text::FONT_FAMILY.to_string(), background: pal.background.clone(), classes: theme_class, children }
}

/// Whether this engine draws small multiples (the full engine's feature).
const PANELS: bool = cfg!(feature = "panels");

/// Gaps between neighbouring panels, across and down.
fn panel_gaps(narrow: bool) -> (f64, f64) {
    if narrow {
        (8.0, 8.0)
    } else {
        (16.0, 12.0)
    }
}

/// Depth of the strip that names a panel: one line of bold tick-size text.
fn strip(ts: f64) -> f64 {
    ts * text::LINE_HEIGHT + 2.0
}

/// The words naming a panel, row or column: bold, across, no background.
fn strip_text(x: f64, y: f64, words: String, anchor: Anchor, pal: &Palette, size: f64) -> Node {
    Node::styled_text(x, y, words, size, anchor, true, 0.0, pal.text.clone(), "strata-panel-title")
}

/// Small multiples by `panels.by`: one panel per value, `panels.columns`
/// across (default: about square), wrapped into rows, each under a strip
/// naming it. Laid out by [`cell_grid`], so shared axes are drawn along
/// the grid's edges only (an x axis under the lowest panel of each column)
/// and axis titles once.
fn panel_grid(inp: &PlotInputs, plan: &Plan, names: &[String], cells: &[Plan], right: f64, top: f64, bottom: f64) -> Vec<Node> {
    let n = cells.len();
    let default_cols = (n as f64).sqrt().ceil() as usize;
    let cols = inp.chart.panels.columns.map(|c| c as usize).unwrap_or(default_cols).clamp(1, n.max(1));
    cell_grid(inp, plan, GridNames::Wrap { names, columns: cols }, cells, right, top, bottom)
}

/// How a panel grid names its panels.
#[derive(Clone, Copy)]
enum GridNames<'a> {
    /// `rows` x `cols`: every combination is a cell.
    Cross { rows: Option<&'a [String]>, cols: Option<&'a [String]> },
    /// `by`: the panels in order, `columns` to a row, each with its own strip.
    Wrap { names: &'a [String], columns: usize },
}

/// Small multiples by `panels.rows` and `panels.cols`: one row of panels
/// per row value and one column per column value, every combination a
/// panel (empty or not) so rows and columns line up. Column values name
/// the columns in strips along the top, row values the rows in strips down
/// the right side (read top to bottom), clear of the vertical axes on the
/// left. All frames are the same size. A shared axis is drawn once per row
/// or column, along the grid's edge (x under the bottom row, y left of the
/// left column, or the sides `scales.*.axis` asks for); an independent axis
/// (`panels.independent`) in every panel. Axis titles are drawn once, centred on
/// the whole grid.
///
/// Wrapped panels (`by`) use the same layout with a strip over every
/// panel; the last row may be short, and then the x axis of a column
/// without a panel there is drawn under the panel above.
fn cell_grid(inp: &PlotInputs, plan: &Plan, names: GridNames, cells: &[Plan], right: f64, top: f64, bottom: f64) -> Vec<Node> {
    let chart = inp.chart;
    let (rows, cols, wrap) = match names {
        GridNames::Cross { rows, cols } => (rows, cols, None),
        GridNames::Wrap { names, columns } => (None, None, Some((names, columns))),
    };
    let (nr, nc) = match wrap {
        Some((names, columns)) => (names.len().div_ceil(columns).max(1), columns),
        None => (rows.map_or(1, <[String]>::len), cols.map_or(1, <[String]>::len)),
    };
    // Whether row r, column c holds a panel (a cross grid is full).
    let exists = |r: usize, c: usize| r * nc + c < cells.len();
    let transposed = chart.transposed;
    let (independent_x, independent_y) = chart.panels.independent;
    let (independent_h, independent_v) = if transposed { (independent_y, independent_x) } else { (independent_x, independent_y) };
    let (h_spec, v_spec) = if transposed { (&plan.scales.y_spec, &plan.scales.x_spec) } else { (&plan.scales.x_spec, &plan.scales.y_spec) };
    let (h_top, v_right) = (h_spec.axis == Some(Placement::Top), v_spec.axis == Some(Placement::Right));
    // Maps in panels draw no axes.
    let is_map = plan.map.is_some();
    let (h_title, v_title) = if is_map {
        ("", "")
    } else {
        let t = axis_titles(chart, &plan.scales);
        (t.0, t.1)
    };
    let (gap_x, gap_y) = panel_gaps(inp.narrow);
    let band = guides::title_band(inp.ts);
    // Row names read across at the left of each row (bold, up to a fifth of the width).
    let row_names_w = match rows {
        Some(rows) => {
            let mut w = 0.0f64;
            for r in rows {
                w = w.max(text::width(r, inp.ts, true));
            }
            (w + 10.0).min(inp.width * 0.2)
        }
        None => 0.0,
    };
    let col_strip = if cols.is_some() { strip(inp.ts) } else { 0.0 };
    // Wrapped panels: a strip over every panel, so over every row.
    let each_strip = if wrap.is_some() { strip(inp.ts) } else { 0.0 };

    // The vertical title once, across, above the grid where it fits (else turned).
    let v_above = !v_title.is_empty() && text::width(v_title, inp.ts, false) <= right - inp.left;
    let v_band = if v_title.is_empty() || v_above { 0.0 } else { band };
    // The room for panels, inside the axis titles and the strips.
    let names_left = inp.left + if !v_right { v_band } else { 0.0 };
    let x_start = names_left + row_names_w;
    let x_end = right - if v_right { v_band } else { 0.0 };
    let strip_top = top + if !h_title.is_empty() && h_top { band } else { 0.0 } + if v_above { guides::title_above_height(inp.ts) } else { 0.0 };
    let y_start = strip_top + col_strip;
    let y_end = bottom - if !h_title.is_empty() && !h_top { band } else { 0.0 };

    // Lay each panel out in an even share of the room, to learn what its
    // axes take; then give every column and row the room its drawn axes need.
    let cell_w = ((x_end - x_start) - gap_x * (nc - 1) as f64) / nc as f64;
    let cell_h = ((y_end - y_start) - gap_y * (nr - 1) as f64) / nr as f64;
    // Shared axes along the grid's edges: x under the lowest panel of each
    // column (or over the top row), y beside the first (or last) panel of each row.
    let last_row = |c: usize| (0..nr).rev().find(|r| exists(*r, c)).unwrap_or(0);
    let last_col = |r: usize| (0..nc).rev().find(|c| exists(r, *c)).unwrap_or(0);
    let draw_h = |r: usize, c: usize| !is_map && (independent_h || r == if h_top { 0 } else { last_row(c) });
    let draw_v = |r: usize, c: usize| !is_map && (independent_v || c == if v_right { last_col(r) } else { 0 });
    // A second pass when the panels came out wider than the first guess
    // gave them (axes drawn only along the grid's edges free room), so the
    // category labels are fitted to the width they are drawn in.
    let mut widths = vec![cell_w; cells.len()];
    let mut pass = 0;
    let (lays, col_left, col_right, row_top, row_bottom, pw, ph) = loop {
        let mut lays: Vec<PlotLayout> = Vec::with_capacity(cells.len());
        for (p, w) in cells.iter().zip(&widths) {
            lays.push(plot_layout(inp, p, 0.0, *w, 0.0, cell_h - each_strip, false));
        }
        // Room beside the frame of the panel in row r, column c: left, right,
        // top, bottom. At the grid's outer ends the horizontal labels reach as
        // in a single plot; between columns they share the gap, and take more
        // room when their halves do not fit in it.
        let margins = |r: usize, c: usize| {
            if !exists(r, c) {
                return (0.0, 0.0, 0.0, 0.0);
            }
            let l = &lays[r * nc + c];
            let (h, v) = (draw_h(r, c), draw_v(r, c));
            let on = |b: bool, x: f64| if b { x } else { 0.0 };
            let (v_left, v_right_w) = (on(v && !v_right, l.v_axis_w), on(v && v_right, l.v_axis_w));
            let (over_left, over_right) = h_label_overhang(l, inp.ts);
            let between = |over: f64| (over + guides::LABEL_GAP / 2.0 - gap_x / 2.0).max(0.0);
            let h_left = if c == 0 { v_left + l.h_reach_left } else { between(over_left) };
            let h_right = if c == nc - 1 { v_right_w + l.h_reach_right } else { between(over_right) };
            (v_left.max(on(h, h_left)), v_right_w.max(on(h, h_right)), 4.0 + each_strip + on(h && h_top, l.h_axis_h), on(h && !h_top, l.h_axis_h))
        };
        // Each column's widest left and right margins, each row's top and bottom.
        let (mut col_left, mut col_right) = (vec![0.0f64; nc], vec![0.0f64; nc]);
        let (mut row_top, mut row_bottom) = (vec![0.0f64; nr], vec![0.0f64; nr]);
        for r in 0..nr {
            for c in 0..nc {
                let m = margins(r, c);
                col_left[c] = col_left[c].max(m.0);
                col_right[c] = col_right[c].max(m.1);
                row_top[r] = row_top[r].max(m.2);
                row_bottom[r] = row_bottom[r].max(m.3);
            }
        }
        let sum = |v: &[f64]| v.iter().sum::<f64>();
        let pw = (((x_end - x_start) - sum(&col_left) - sum(&col_right) - gap_x * (nc - 1) as f64) / nc as f64).max(20.0);
        let ph = (((y_end - y_start) - sum(&row_top) - sum(&row_bottom) - gap_y * (nr - 1) as f64) / nr as f64).max(20.0);
        if pass == 1 || lays.iter().all(|l| l.frame.width + 1.0 >= pw) {
            break (lays, col_left, col_right, row_top, row_bottom, pw, ph);
        }
        for (w, l) in widths.iter_mut().zip(&lays) {
            *w += (pw - l.frame.width).max(0.0);
        }
        pass += 1;
    };
    let mut lefts = Vec::with_capacity(nc);
    let mut x = x_start;
    for c in 0..nc {
        lefts.push(x + col_left[c]);
        x += col_left[c] + pw + col_right[c] + gap_x;
    }
    let mut tops = Vec::with_capacity(nr);
    let mut y = y_start;
    for r in 0..nr {
        tops.push(y + row_top[r]);
        y += row_top[r] + ph + row_bottom[r] + gap_y;
    }

    let (row_name, col_name) = (chart.panels.rows_name.clone(), chart.panels.cols_name.clone());
    let reserve = is_map && cells.iter().any(super::map::has_no_data);
    let mut out = Vec::with_capacity(cells.len() + 1);
    for r in 0..nr {
        for c in 0..nc {
            let i = r * nc + c;
            if !exists(r, c) {
                continue;
            }
            let frame = Frame { left: lefts[c], top: tops[r], width: pw, height: ph };
            let mut kids = Vec::new();
            let mut says = Vec::new();
            if let Some((names, _)) = wrap {
                // The panel's own strip, at the top of its row's band (over
                // any top axis).
                let words = text::fit(&names[i], inp.ts, true, pw);
                kids.push(strip_text(frame.left, tops[r] - row_top[r] + inp.ts * text::ASCENT, words, Anchor::Start, inp.pal, inp.ts));
                says.push(names[i].clone());
            }
            if let Some(rows) = rows {
                says.push(format!("{row_name}: {}", rows[r]));
                if c == 0 {
                    // Across, at the left of the row, level with its top.
                    let words = text::fit(&rows[r], inp.ts, true, row_names_w - 10.0);
                    kids.push(strip_text(names_left, frame.top + inp.ts * text::ASCENT, words, Anchor::Start, inp.pal, inp.ts));
                }
            }
            if let Some(cols) = cols {
                says.push(format!("{col_name}: {}", cols[c]));
                if r == 0 {
                    let words = text::fit(&cols[c], inp.ts, true, pw);
                    kids.push(strip_text(frame.left, strip_top + inp.ts * text::ASCENT, words, Anchor::Start, inp.pal, inp.ts));
                }
            }
            if cells[i].map.is_some() {
                kids.extend(super::map::draw(&cells[i], inp.pal, frame.left, frame.top, frame.left + pw, frame.top + ph, reserve));
            } else {
                kids.extend(plot_draw(inp, &cells[i], &lays[i], frame, draw_h(r, c), draw_v(r, c)));
            }
            out.push(Node::named_group("strata-facet".into(), Some("graphics-object"), Some(format!("panel {}", crate::join(&says, ", "))), kids));
        }
    }

    // One title per axis, centred on the grid.
    let mut titles = Vec::new();
    let (span_left, span_right) = (lefts[0], lefts[nc - 1] + pw);
    let (span_top, span_bottom) = (tops[0], tops[nr - 1] + ph);
    if !h_title.is_empty() {
        let y = if h_top { top + inp.ts * text::ASCENT } else { y_end + band - inp.ts * text::LINE_HEIGHT + inp.ts * text::ASCENT };
        titles.push(guides::axis_title((span_left + span_right) / 2.0, y, h_title, span_right - span_left, 0.0, inp.pal, inp.ts));
    }
    if v_above {
        let y = strip_top - guides::title_above_height(inp.ts) + inp.ts * text::ASCENT;
        let (x, anchor) = if v_right { (right, Anchor::End) } else { (inp.left, Anchor::Start) };
        titles.push(Node::text(x, y, v_title.to_string(), inp.ts, anchor, inp.pal.text.clone(), "strata-axis-title"));
    } else if !v_title.is_empty() {
        let (x, angle) = if v_right { (right - inp.ts * text::ASCENT, 90.0) } else { (inp.left + inp.ts * text::ASCENT, -90.0) };
        titles.push(guides::axis_title(x, (span_top + span_bottom) / 2.0, v_title, span_bottom - span_top, angle, inp.pal, inp.ts));
    }
    if !titles.is_empty() {
        out.push(Node::group("strata-axis-titles", titles));
    }
    out
}

/// How far a plot's horizontal tick labels reach past the left and right
/// ends of its frame (rotated labels hang left of their ticks only).
fn h_label_overhang(lay: &PlotLayout, ts: f64) -> (f64, f64) {
    let fw = lay.frame.width;
    let w = |t: &crate::scale::Tick| guides::label_width(t, ts);
    if lay.h_angle != 0.0 {
        let c = crate::math::sin_cos_deg(-lay.h_angle).1;
        return (max_over(&lay.h_ticks, &|t| w(t) * c - t.unit * fw), 0.0);
    }
    (max_over(&lay.h_ticks, &|t| w(t) / 2.0 - t.unit * fw), max_over(&lay.h_ticks, &|t| w(t) / 2.0 - (1.0 - t.unit) * fw))
}

/// The largest `f` over the ticks, at least 0 (one loop for every such
/// measure, rather than an iterator chain for each).
fn max_over(ticks: &[crate::scale::Tick], f: &dyn Fn(&crate::scale::Tick) -> f64) -> f64 {
    let mut m = 0.0f64;
    for t in ticks {
        m = m.max(f(t));
    }
    m
}

/// What every plot area of a chart shares.
struct PlotInputs<'a> {
    chart: &'a Chart,
    pal: &'a Palette,
    loc: &'a crate::format::Locale,
    narrow: bool,
    pad: f64,
    /// Where plots start on the left (after a legend placed there).
    left: f64,
    width: f64,
    legend_on_right: bool,
    /// Size of tick labels, axis titles, legend and strip text.
    ts: f64,
}

/// One plot area: grid, marks and axes of `plan` inside `x0..right` and
/// `top..bottom` (the whole chart's, or one panel's).
fn plot_area(inp: &PlotInputs, plan: &Plan, x0: f64, right: f64, top: f64, bottom: f64) -> Vec<Node> {
    let lay = plot_layout(inp, plan, x0, right, top, bottom, true);
    plot_draw(inp, plan, &lay, lay.frame, true, true)
}

/// Axis titles and whether each axis shows, horizontal then vertical.
fn axis_titles<'a>(chart: &Chart, scales: &'a crate::plan::Scales) -> (&'a str, &'a str, bool, bool) {
    // Axes: the x scale is horizontal unless the coordinates are transposed.
    let transposed = chart.transposed;
    let polar = cfg!(feature = "polar") && matches!(chart.coords, Coords::Polar(_));
    let (h_title, v_title, h_spec, v_spec) = if transposed {
        (&scales.y_title, &scales.x_title, &scales.y_spec, &scales.x_spec)
    } else {
        (&scales.x_title, &scales.y_title, &scales.x_spec, &scales.y_spec)
    };
    let shown = |s: &crate::plan::ScaleSpec| !polar && !s.hide && s.axis != Some(Placement::None);
    let (h_shown, v_shown) = (shown(h_spec), shown(v_spec));
    let h_title: &str = if h_shown { h_title } else { "" };
    let v_title: &str = if v_shown { v_title } else { "" };
    (h_title, v_title, h_shown, v_shown)
}

/// Where a plot area's frame goes and what its axes hold: the scales made
/// nice for the room there, the ticks, and the room each axis takes.
struct PlotLayout {
    scales: crate::plan::Scales,
    frame: Frame,
    h_ticks: Vec<crate::scale::Tick>,
    h_angle: f64,
    v_ticks: Vec<crate::scale::Tick>,
    v_label_w: f64,
    h_title: String,
    v_title: String,
    h_shown: bool,
    v_shown: bool,
    /// The vertical axis's title goes above it, across (it fits there).
    v_title_above: bool,
    h_top: bool,
    v_right: bool,
    /// Width of the vertical axis (labels and title) beside the frame.
    v_axis_w: f64,
    /// Height of the horizontal axis (labels and title) under or over the frame.
    h_axis_h: f64,
    /// Room the horizontal axis's labels take left of the frame (rotated
    /// labels) and right of it (the last label's overhang).
    h_reach_left: f64,
    h_reach_right: f64,
}

/// Lay out a plot area inside `x0..right` and `top..bottom`; `titles`
/// false leaves the axis titles (and their room) out.
fn plot_layout(inp: &PlotInputs, plan: &Plan, x0: f64, right: f64, top: f64, bottom: f64, titles: bool) -> PlotLayout {
    let PlotInputs { chart, loc, narrow, pad, width, legend_on_right, .. } = *inp;
    let scales = &plan.scales;
    let mut nice_scales = plan.scales.clone();
    let transposed = chart.transposed;
    let (h_spec, v_spec) = if transposed { (&scales.y_spec, &scales.x_spec) } else { (&scales.x_spec, &scales.y_spec) };
    let (h_title, v_title, h_shown, v_shown) = axis_titles(chart, scales);
    let (h_title, v_title) = if titles { (h_title, v_title) } else { ("", "") };
    let wanted = |s: &crate::plan::ScaleSpec, length: f64, per: f64| {
        s.ticks.as_ref().and_then(|t| t.count()).map(|t| t as usize).unwrap_or_else(|| ((length / per).floor() as usize).clamp(3, if narrow { 5 } else { 10 }))
    };
    let top = top + 4.0;
    // Room right of the frame for series named at their line ends.
    let mut ends_w = 0.0f64;
    for l in &plan.layers {
        let size = l.style.font_size.filter(|s| s.is_finite() && *s > 0.0).unwrap_or(inp.ts * 11.0 / 12.0);
        for n in end_names(l) {
            ends_w = ends_w.max(text::width(&n, size, false));
        }
    }
    let right = if ends_w > 0.0 { (right - ends_w - END_GAP).max(x0 + 40.0) } else { right };
    // First guess of the plot height, for the vertical ticks (and so the left margin).
    let guess_h = (bottom - top - 2.0 * TITLE_SIZE * inp.ts / guides::TICK_SIZE * text::LINE_HEIGHT).max(20.0);
    let max_left = width * if narrow { 0.3 } else { 0.25 };
    // Nice ends for the counts that fit (x along the width, y along the height).
    let (h_len_guess, v_len) = ((right - x0 - 60.0).max(20.0), guess_h);
    let (x_len, y_len) = if transposed { (v_len, h_len_guess) } else { (h_len_guess, v_len) };
    if scales.x_nice {
        nice_scales.x = scales.x.nice(wanted(
            &scales.x_spec,
            x_len,
            if transposed {
                50.0
            } else if narrow {
                70.0
            } else {
                90.0
            },
        ));
    }
    if scales.y_nice {
        nice_scales.y = scales.y.nice(wanted(
            &scales.y_spec,
            y_len,
            if transposed {
                if narrow {
                    70.0
                } else {
                    90.0
                }
            } else {
                50.0
            },
        ));
    }
    let scales = &nice_scales;
    let (h_scale, v_scale) = if transposed { (&scales.y, &scales.x) } else { (&scales.x, &scales.y) };
    let v_ticks0 =
        if v_shown { guides::left_ticks(v_scale, guess_h, wanted(v_spec, guess_h, 45.0), v_spec.format.as_deref(), loc, max_left, inp.ts) } else { vec![] };
    let v_label_w = guides::widest_label(&v_ticks0, inp.ts);
    // Placement: the vertical axis left (or right), the horizontal one at the bottom (or top).
    let v_right = v_spec.axis == Some(Placement::Right);
    let h_top = h_spec.axis == Some(Placement::Top);
    // House style: the vertical axis's title once, across, above the axis,
    // where it fits in the width; else turned along the axis.
    let v_title_above = v_shown && !v_title.is_empty() && text::width(v_title, inp.ts, false) <= right - x0;
    let top = if v_title_above { top + guides::title_above_height(inp.ts) } else { top };
    let v_axis_w = if v_shown { guides::left_axis_width(v_label_w, !v_title.is_empty() && !v_title_above, inp.ts) } else { 0.0 };
    let left = x0 + if v_right { 0.0 } else { v_axis_w };
    let right = if v_right { right - v_axis_w } else { right };
    let frame_w = (right - left).max(20.0);
    let max_label_h = (bottom - top) * 0.3;
    let (h_ticks, h_angle) = if h_shown {
        guides::bottom_ticks(h_scale, frame_w, wanted(h_spec, frame_w, if narrow { 70.0 } else { 90.0 }), h_spec.format.as_deref(), loc, max_label_h, inp.ts)
    } else {
        (vec![], 0.0)
    };
    // Rotated labels reach left of their ticks: widen the left margin for them.
    let (left, frame_w, h_ticks, h_angle) = if h_angle != 0.0 && h_shown {
        let c = crate::math::sin_cos_deg(-h_angle).1;
        let reach = max_over(&h_ticks, &|t| guides::label_width(t, inp.ts) * c - t.unit * frame_w - (left - x0));
        if reach > 0.0 {
            let (l, w) = (left + reach, (frame_w - reach).max(20.0));
            let (t, a) =
                guides::bottom_ticks(h_scale, w, wanted(h_spec, w, if narrow { 70.0 } else { 90.0 }), h_spec.format.as_deref(), loc, max_label_h, inp.ts);
            (l, w, t, a)
        } else {
            (left, frame_w, h_ticks, h_angle)
        }
    } else {
        (left, frame_w, h_ticks, h_angle)
    };
    // Keep the outermost labels inside the chart: shrink the frame by any overhang.
    let (frame_w, h_ticks, h_angle) = {
        let room_right = if legend_on_right {
            if narrow {
                8.0
            } else {
                16.0
            }
        } else {
            pad
        };
        let over = |t: &[crate::scale::Tick], w: f64| {
            t.last().map(|l| (guides::label_width(l, inp.ts) / 2.0 - (1.0 - l.unit) * w - room_right + 2.0).max(0.0)).unwrap_or(0.0)
        };
        let o = if h_angle == 0.0 { over(&h_ticks, frame_w) } else { 0.0 };
        if o > 0.0 && h_shown {
            let w = (frame_w - o).max(20.0);
            let (t, a) =
                guides::bottom_ticks(h_scale, w, wanted(h_spec, w, if narrow { 70.0 } else { 90.0 }), h_spec.format.as_deref(), loc, max_label_h, inp.ts);
            (w, t, a)
        } else {
            (frame_w, h_ticks, h_angle)
        }
    };
    let h_axis_h = if h_shown { guides::bottom_axis_height(&h_ticks, h_angle, !h_title.is_empty(), inp.ts) } else { 0.0 };
    let (top, plot_bottom) = if h_top { (top + h_axis_h, bottom) } else { (top, bottom - h_axis_h) };
    let frame = Frame { left, top, width: frame_w, height: (plot_bottom - top).max(20.0) };
    // Vertical ticks again for the real height, kept within the margin.
    let v_ticks = if v_shown {
        let t = guides::left_ticks(v_scale, frame.height, wanted(v_spec, frame.height, 45.0), v_spec.format.as_deref(), loc, max_left, inp.ts);
        if guides::widest_label(&t, inp.ts) <= v_label_w + 0.5 {
            t
        } else {
            v_ticks0
        }
    } else {
        vec![]
    };
    // Vertical categories in transposed coordinates run top to bottom.
    let mut v_ticks = v_ticks;
    if transposed {
        for t in &mut v_ticks {
            t.unit = 1.0 - t.unit;
        }
    }
    let h_reach_left = frame.left - x0 - if v_right { 0.0 } else { v_axis_w };
    let h_reach_right = (right - frame.right()).max(0.0);
    PlotLayout {
        frame,
        h_ticks,
        h_angle,
        v_ticks,
        v_label_w,
        h_title: h_title.to_string(),
        v_title: v_title.to_string(),
        h_shown,
        v_shown,
        v_title_above,
        h_top,
        v_right,
        v_axis_w,
        h_axis_h,
        h_reach_left,
        h_reach_right,
        scales: nice_scales,
    }
}

/// Draw a laid-out plot area in `frame`: grid, marks, notes, and the
/// horizontal and vertical axes where `draw_h` and `draw_v` say (a grid of
/// panels draws shared axes only along its edges).
fn plot_draw(inp: &PlotInputs, plan: &Plan, lay: &PlotLayout, frame: Frame, draw_h: bool, draw_v: bool) -> Vec<Node> {
    let PlotInputs { chart, pal, .. } = *inp;
    let pal = pal.clone();
    let mut children = Vec::new();
    let scales = &lay.scales;
    let transposed = chart.transposed;
    let polar = cfg!(feature = "polar") && matches!(chart.coords, Coords::Polar(_));
    let (h_scale, v_scale) = if transposed { (&scales.y, &scales.x) } else { (&scales.x, &scales.y) };
    #[cfg(feature = "polar")]
    let (loc, narrow) = (inp.loc, inp.narrow);
    // Polar charts: the angle's labels go around the circle, so inset the frame for them.
    let (frame, polar_ticks): (Frame, Option<(bool, Vec<crate::scale::Tick>, Vec<_>)>) = match &chart.coords {
        #[cfg(feature = "polar")]
        Coords::Polar(p) => {
            let angle_is_x = p.angle == crate::plan::AngleChannel::X;
            let (a_scale, r_scale, a_spec, r_spec) =
                if angle_is_x { (&scales.x, &scales.y, &scales.x_spec, &scales.y_spec) } else { (&scales.y, &scales.x, &scales.y_spec, &scales.x_spec) };
            let a_opts = crate::scale::TickOptions { wanted: if narrow { 6 } else { 8 }, pattern: a_spec.format.as_deref(), locale: loc, short: false };
            let mut a_ticks = if a_spec.hide { vec![] } else { a_scale.ticks_with(&a_opts) };
            // A full turn: the last continuous tick would sit on the first.
            if !a_scale.is_discrete() {
                a_ticks.retain(|t| t.unit < 1.0 - 1e-9);
            }
            let r_opts = crate::scale::TickOptions { wanted: 4, pattern: r_spec.format.as_deref(), locale: loc, short: false };
            // No layer maps the radius (a donut with no x): no radius ticks.
            let r_channel = if angle_is_x { crate::channel::Channel::Y } else { crate::channel::Channel::X };
            let r_unmapped = plan.layers.iter().all(|l| l.data.get(r_channel).is_none());
            let r_ticks = if r_spec.hide || r_unmapped { vec![] } else { r_scale.ticks_with(&r_opts) };
            let (mx, my) = guides::polar_margin(&a_ticks, inp.ts);
            let inset =
                Frame { left: frame.left + mx, top: frame.top + my, width: (frame.width - 2.0 * mx).max(20.0), height: (frame.height - 2.0 * my).max(20.0) };
            (inset, Some((angle_is_x, a_ticks, r_ticks)))
        }
        _ => (frame, None),
    };
    let coord = Coord::new(&chart.coords, chart.transposed, frame);
    let h_side = if lay.h_top { Side::Top } else { Side::Bottom };
    let v_side = if lay.v_right { Side::Right } else { Side::Left };
    let h_axis =
        AxisGuide { side: h_side, scale: h_scale, ticks: lay.h_ticks.clone(), title: &lay.h_title, angle: lay.h_angle, size: inp.ts, title_above: false };
    let v_axis =
        AxisGuide { side: v_side, scale: v_scale, ticks: lay.v_ticks.clone(), title: &lay.v_title, angle: 0.0, size: inp.ts, title_above: lay.v_title_above };
    // The value axis: y, across the page unless transposed. Only it gets grid lines.
    let value_axis = if chart.transposed { &h_axis } else { &v_axis };

    if let Some((angle_is_x, a_ticks, r_ticks)) = &polar_ticks {
        children.extend(guides::polar(&coord, *angle_is_x, a_ticks, r_ticks, &pal, inp.ts));
    }
    if !polar {
        let grid = guides::grid(value_axis, &coord, &pal);
        children.push(Node::group("strata-grid", grid));
    }
    let ctx = Ctx { scales, coord, default_color: &pal.mark, text_size: inp.ts, palette: &pal, layers: &plan.layers };
    let mut layers = Vec::new();
    for l in &plan.layers {
        let marks = layer_marks(&ctx, l);
        // A label layer's leader lines are not labels.
        let n = if l.geometry == crate::plan::Geometry::Label { marks.iter().filter(|m| !matches!(m, Node::Line { .. })).count() } else { marks.len() };
        layers.push(Node::named_group(
            format!("strata-layer strata-{}", l.geometry.word()),
            Some("graphics-object"),
            Some(format!("layer {}: {} {}{}", l.index + 1, n, l.geometry.word(), if n == 1 { "" } else { "s" })),
            marks,
        ));
    }
    if lay.h_shown && draw_h {
        children.push(guides::axis(&h_axis, frame, &pal, 0.0));
    }
    if lay.v_shown && draw_v {
        children.push(guides::axis(&v_axis, frame, &pal, lay.v_label_w));
    }
    // Notes go over the marks, inside the plot.
    let notes = super::notes::draw(&chart.notes, scales, &coord, &pal, inp.ts, &layers);
    layers.extend(notes);
    children.push(Node::named_group("strata-panel".into(), Some("graphics-object"), Some(panel_label(plan)), layers));
    // Polar: the radius's labels over the wedges, on a halo.
    if let Some((angle_is_x, _, r_ticks)) = &polar_ticks {
        children.extend(guides::polar_radius_labels(&coord, *angle_is_x, r_ticks, &pal, inp.ts));
    }
    // The baseline at zero, over the marks and the axis line it may lie on.
    if !polar {
        children.extend(guides::zero_line(value_axis, &coord, &pal));
    }
    children
}

fn panel_label(plan: &Plan) -> String {
    let s = &plan.scales;
    match (s.y_title.is_empty(), s.x_title.is_empty()) {
        (false, false) => format!("plot of {} against {}", s.y_title, s.x_title),
        _ => "plot".to_string(),
    }
}

fn default_label(plan: &Plan) -> String {
    let s = &plan.scales;
    match (s.y_title.is_empty(), s.x_title.is_empty()) {
        (false, false) => format!("Chart of {} by {}", s.y_title, s.x_title),
        _ => "Chart".to_string(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::{render, RenderOptions};

    fn texts<'a>(n: &'a Node, class: &str, out: &mut Vec<(f64, f64, &'a str)>) {
        match n {
            Node::Group { children, .. } => children.iter().for_each(|c| texts(c, class, out)),
            Node::Text { x, y, text, class: c, .. } if c == class => out.push((*x, *y, text.as_str())),
            _ => {}
        }
    }

    fn scene(width: f64) -> Scene {
        let spec = r#"{ "title": "Visitors through each gate of the orchard, month by month, in a long title",
            "data": { "rows": [
              {"m": 1, "v": 120, "g": "Lane gate"}, {"m": 2, "v": 340, "g": "Lane gate"}, {"m": 3, "v": 610, "g": "Lane gate"},
              {"m": 1, "v": 80, "g": "River gate"}, {"m": 2, "v": 150, "g": "River gate"}, {"m": 3, "v": 420, "g": "River gate"} ] },
            "layers": [ { "draw": "line", "x": "m", "y": "v", "color": "g" } ] }"#;
        render(spec, None, &RenderOptions { scene: SceneOptions { width } }).unwrap().scene
    }

    fn all(s: &Scene, class: &str) -> Vec<(f64, f64, String)> {
        let mut out = Vec::new();
        for c in &s.children {
            texts(c, class, &mut out);
        }
        out.into_iter().map(|(x, y, t)| (x, y, t.to_string())).collect()
    }

    #[test]
    fn axes_move_top_and_right() {
        let spec = r#"{ "data": { "rows": [ {"m": 1, "v": 120}, {"m": 2, "v": 340}, {"m": 3, "v": 610} ] },
            "layers": [ { "draw": "line", "x": "m", "y": "v" } ],
            "scales": { "x": { "axis": "top" }, "y": { "axis": "right" } } }"#;
        let s = render(spec, None, &RenderOptions::default()).unwrap().scene;
        let marks = s.marks();
        let Node::Path { d, .. } = marks[0] else { panic!("a line") };
        let nums: Vec<f64> = d.iter().flat_map(|s| s.numbers()).collect();
        let (xs, ys): (Vec<f64>, Vec<f64>) = (nums.iter().step_by(2).copied().collect(), nums.iter().skip(1).step_by(2).copied().collect());
        let ticks = all(&s, "strata-tick");
        // Vertical labels right of the data, horizontal labels above it.
        let vertical: Vec<_> = ticks.iter().filter(|t| t.0 > xs.iter().cloned().fold(0.0, f64::max)).collect();
        let horizontal: Vec<_> = ticks.iter().filter(|t| t.1 < ys.iter().cloned().fold(f64::INFINITY, f64::min)).collect();
        assert!(vertical.len() >= 3 && horizontal.len() >= 3, "{ticks:?}");
    }

    #[test]
    fn height_from_aspect_or_height() {
        let mut size = Size::default();
        assert_eq!(chart_size(&size, &SceneOptions { width: 640.0 }), (640.0, 400.0));
        assert_eq!(chart_size(&size, &SceneOptions { width: 330.0 }), (330.0, 300.0));
        size.aspect = Some(2.0);
        assert_eq!(chart_size(&size, &SceneOptions { width: 640.0 }), (640.0, 320.0));
        size.height = Some(250.0);
        assert_eq!(chart_size(&size, &SceneOptions { width: 640.0 }), (640.0, 250.0));
    }

    #[test]
    fn wide_puts_the_legend_right_narrow_on_top() {
        let wide = scene(720.0);
        let narrow = scene(360.0);
        let ticks_x = |s: &Scene| all(s, "strata-tick").iter().map(|t| t.0).fold(0.0, f64::max);
        let legend = |s: &Scene| all(s, "strata-legend-label");
        let plot_top = |s: &Scene| all(s, "strata-tick").iter().map(|t| t.1).fold(f64::INFINITY, f64::min);
        // Wide: legend labels right of every tick label.
        assert!(legend(&wide).iter().all(|l| l.0 > ticks_x(&wide)), "{:?}", legend(&wide));
        // Narrow: legend labels above the plot.
        assert!(legend(&narrow).iter().all(|l| l.1 < plot_top(&narrow)), "{:?}", legend(&narrow));
        // Narrow: the long title wraps onto more lines, and there are fewer ticks.
        assert!(all(&narrow, "strata-title").len() > all(&wide, "strata-title").len());
        assert!(all(&narrow, "strata-tick").len() < all(&wide, "strata-tick").len());
        // Every title line fits the width.
        for (_, _, t) in all(&narrow, "strata-title") {
            assert!(text::width(&t, TITLE_SIZE - 2.0, true) <= 360.0 - 16.0);
        }
    }

    #[test]
    fn label_layers_take_their_font_size() {
        fn sizes(n: &Node, out: &mut Vec<f64>) {
            match n {
                Node::Group { children, .. } => children.iter().for_each(|c| sizes(c, out)),
                Node::Text { size, class, .. } if class == "strata-label" => out.push(*size),
                _ => {}
            }
        }
        let spec = |style: &str| {
            format!(
                r#"{{ "data": {{ "rows": [ {{"m": "a", "v": 1}}, {{"m": "b", "v": 3}} ] }},
                "layers": [ {{ "draw": "label", "x": "m", "y": "v", "text": "v" {style} }} ] }}"#
            )
        };
        let got = |style: &str| {
            let scene = render(&spec(style), None, &RenderOptions::default()).unwrap().scene;
            let mut out = vec![];
            scene.children.iter().for_each(|n| sizes(n, &mut out));
            out
        };
        assert_eq!(got(""), vec![11.0, 11.0]);
        assert_eq!(got(r#", "style": { "font_size": 15 }"#), vec![15.0, 15.0]);
    }

    #[test]
    fn style_shape_draws_every_point_in_that_shape() {
        let spec = |shape: &str| {
            format!(
                r#"{{ "data": {{ "rows": [ {{"a": 1, "b": 2}}, {{"a": 2, "b": 3}} ] }},
                "layers": [ {{ "draw": "point", "x": "a", "y": "b", "style": {{ "shape": "{shape}" }} }} ] }}"#
            )
        };
        let marks = |shape: &str| {
            let scene = render(&spec(shape), None, &RenderOptions::default()).unwrap().scene;
            scene.marks().iter().map(|m| matches!(m, Node::Path { .. })).collect::<Vec<bool>>()
        };
        assert_eq!(marks("circle"), vec![false, false]);
        assert_eq!(marks("square"), vec![true, true]);
        let scene = render(&spec("triangle"), None, &RenderOptions::default()).unwrap().scene;
        let Node::Path { d, .. } = scene.marks()[0] else { panic!("not a path") };
        // A triangle's path has three corners.
        assert_eq!(d.iter().filter(|s| matches!(s, crate::scene::Seg::Line(..))).count(), 2, "{d:?}");
    }

    #[test]
    fn theme_font_size_scales_every_text() {
        fn sizes(n: &Node, out: &mut Vec<(String, f64, f64)>) {
            match n {
                Node::Group { children, .. } => children.iter().for_each(|c| sizes(c, out)),
                Node::Text { class, size, x, text, .. } => out.push((class.clone(), *size, *x + text::width(text, *size, false) / 2.0)),
                _ => {}
            }
        }
        let spec = |theme: &str| {
            format!(
                r#"{{ "title": "Visitors", "subtitle": "By gate", "source": "Invented", {theme}
                "data": {{ "rows": [ {{"m": 1, "v": 120, "g": "Lane"}}, {{"m": 2, "v": 340, "g": "River"}} ] }},
                "layers": [ {{ "draw": "point", "x": "m", "y": "v", "color": "g" }} ],
                "notes": [ {{ "y": 200, "text": "target" }} ] }}"#
            )
        };
        let texts = |theme: &str| {
            let scene = render(&spec(theme), None, &RenderOptions::default()).unwrap().scene;
            let mut out = vec![];
            scene.children.iter().for_each(|n| sizes(n, &mut out));
            out
        };
        let size_of = |t: &[(String, f64, f64)], class: &str| t.iter().find(|x| x.0 == class).map(|x| x.1);
        let plain = texts("");
        let big = texts(r#""theme": { "font_size": 16 },"#);
        // Default sizes, then each scaled by 16/12.
        for (class, default) in [
            ("strata-title", 18.0),
            ("strata-subtitle", 14.0),
            ("strata-source", 11.0),
            ("strata-tick", 12.0),
            ("strata-axis-title", 12.0),
            ("strata-legend-label", 12.0),
            ("strata-note", 12.0),
        ] {
            assert_eq!(size_of(&plain, class), Some(default), "{class}");
            let got = size_of(&big, class).unwrap_or(0.0);
            assert!((got - default * 16.0 / 12.0).abs() < 1e-9, "{class}: {got}");
        }
        // Nothing runs off the chart's 640 px (centres of labels plus half a width).
        assert!(big.iter().all(|t| t.2 <= 640.0), "{big:?}");
        // An out-of-range size is a located error.
        let e = render(&spec(r#""theme": { "font_size": 500 },"#), None, &RenderOptions::default()).unwrap_err();
        assert_eq!(e.0[0].at.path, "theme.font_size");
    }

    #[test]
    fn a_legend_asked_on_the_left_sits_left_of_the_plot() {
        let spec = |legend: &str| {
            format!(
                r#"{{ "data": {{ "rows": [ {{"m": 1, "v": 120, "g": "Lane gate"}}, {{"m": 2, "v": 340, "g": "River gate"}} ] }},
                "layers": [ {{ "draw": "point", "x": "m", "y": "v", "color": "g" }} ],
                "scales": {{ "color": {{ "legend": "{legend}" }} }} }}"#
            )
        };
        let scene = |legend: &str| render(&spec(legend), None, &RenderOptions { scene: SceneOptions { width: 640.0 } }).unwrap().scene;
        let (left, right) = (scene("left"), scene("right"));
        let label_right = |s: &Scene| all(s, "strata-legend-label").iter().map(|l| l.0).fold(0.0, f64::max);
        let ticks_left = |s: &Scene| all(s, "strata-tick").iter().map(|t| t.0).fold(f64::INFINITY, f64::min);
        // Left: every legend label starts left of every tick label; right: the other way round.
        assert!(label_right(&left) < ticks_left(&left), "{:?}", all(&left, "strata-legend-label"));
        assert!(all(&right, "strata-legend-label").iter().all(|l| l.0 > ticks_left(&right)));
        assert!(ticks_left(&left) > ticks_left(&right) + 50.0);
    }

    fn lines_in(n: &Node, class: &str, inside: bool, out: &mut Vec<(f64, f64, f64, f64)>) {
        match n {
            Node::Group { children, class: c, .. } => children.iter().for_each(|k| lines_in(k, class, inside || c.split(' ').any(|w| w == class), out)),
            Node::Line { x1, y1, x2, y2, .. } if inside => out.push((*x1, *y1, *x2, *y2)),
            _ => {}
        }
    }

    fn lines_in_scene(s: &Scene, class: &str, inside: bool, out: &mut Vec<(f64, f64, f64, f64)>) {
        s.children.iter().for_each(|c| lines_in(c, class, inside, out));
    }

    #[test]
    fn house_style_grid_baseline_and_category_ticks() {
        let bars = r#"{ "data": { "rows": [ {"k": "a", "v": 3}, {"k": "b", "v": 7}, {"k": "c", "v": 5} ] },
            "layers": [ { "draw": "bar", "x": "k", "y": "v" } ], "scales": { "y": { "title": "Catch (kg)" } } }"#;
        let s = render(bars, None, &RenderOptions { scene: SceneOptions { width: 640.0 } }).unwrap().scene;
        let mut grid = Vec::new();
        lines_in_scene(&s, "strata-grid", false, &mut grid);
        // Grid along the value axis only: horizontal lines, none for the categories.
        assert!(grid.len() >= 3 && grid.iter().all(|l| l.1 == l.3), "{grid:?}");
        // A baseline at zero (bars start there): one line across the frame, at the bottom.
        let mut zero = Vec::new();
        lines_in_scene(&s, "strata-zero", false, &mut zero);
        assert_eq!(zero.len(), 1);
        let bottom = grid.iter().map(|l| l.1).fold(f64::NEG_INFINITY, f64::max);
        assert!((zero[0].1 - bottom).abs() < 1e-9 && zero[0].1 == zero[0].3, "{zero:?} {bottom}");
        // Short tick marks on the category axis: one per category, vertical, 4 px.
        let mut axis = Vec::new();
        lines_in_scene(&s, "strata-axis-bottom", false, &mut axis);
        let marks: Vec<_> = axis.iter().filter(|l| l.0 == l.2).collect();
        assert_eq!(marks.len(), 3, "{axis:?}");
        assert!(marks.iter().all(|l| (l.3 - l.1 - guides::TICK_MARK).abs() < 1e-9));
        // The value axis has no tick marks and its title reads across, above it.
        let mut left = Vec::new();
        lines_in_scene(&s, "strata-axis-left", false, &mut left);
        assert!(left.is_empty(), "{left:?}");
        let title = all(&s, "strata-axis-title").into_iter().find(|t| t.2 == "Catch (kg)").unwrap();
        let top_tick = all(&s, "strata-tick").iter().map(|t| t.1).fold(f64::INFINITY, f64::min);
        assert!(title.1 < top_tick, "{title:?}");
        assert!(!svg_has_turned_text(&s));
        // A value domain clear of zero gets no baseline.
        let pts = r#"{ "data": { "rows": [ {"x": 1, "y": 30}, {"x": 2, "y": 40} ] }, "layers": [ { "draw": "point", "x": "x", "y": "y" } ] }"#;
        let s = render(pts, None, &RenderOptions { scene: SceneOptions { width: 640.0 } }).unwrap().scene;
        let mut zero = Vec::new();
        lines_in_scene(&s, "strata-zero", false, &mut zero);
        assert!(zero.is_empty(), "{zero:?}");
    }

    #[test]
    fn polar_radius_labels_sit_on_a_halo_over_the_wedges() {
        let spec = r#"{ "data": { "rows": [ {"d": "N", "h": 120}, {"d": "E", "h": 300}, {"d": "S", "h": 90}, {"d": "W", "h": 200} ] },
            "layers": [ { "draw": "bar", "x": "d", "y": "h" } ], "coords": "polar" }"#;
        let s = render(spec, None, &RenderOptions { scene: SceneOptions { width: 500.0 } }).unwrap().scene;
        fn classes(n: &Node, out: &mut Vec<String>) {
            if let Node::Group { class, children, .. } = n {
                out.push(class.clone());
                children.iter().for_each(|c| classes(c, out));
            }
        }
        let mut order = Vec::new();
        s.children.iter().for_each(|c| classes(c, &mut order));
        let marks = order.iter().position(|c| c.contains("strata-bar")).expect("a bar layer");
        let radius = order.iter().position(|c| c == "strata-axis strata-axis-radius").expect("radius labels");
        assert!(radius > marks, "radius labels are drawn after the wedges: {order:?}");
        // One halo under each radius label.
        let labels = s.children.iter().find_map(|c| match c {
            Node::Group { class, children, .. } if class == "strata-axis strata-axis-radius" => Some(children),
            _ => None,
        });
        let kids = labels.unwrap();
        let halos = kids.iter().filter(|k| matches!(k, Node::Group { class, .. } if class == "strata-halo")).count();
        let texts = kids.iter().filter(|k| matches!(k, Node::Text { .. })).count();
        assert!(texts >= 2 && halos == texts, "{halos} halos for {texts} labels");
    }

    #[test]
    fn polar_wedges_and_rings_are_arcs_and_no_ring_is_a_point() {
        // Issue 12 item 12: wedges and rings were 24- and 72-point
        // polylines, and the ring at radius 0 was drawn as a point.
        use crate::scene::Seg;
        let spec = r#"{ "data": { "rows": [ {"d": "N", "h": 120}, {"d": "E", "h": 300}, {"d": "S", "h": 90}, {"d": "W", "h": 200} ] },
            "layers": [ { "draw": "bar", "x": "d", "y": "h" } ], "coords": "polar" }"#;
        let s = render(spec, None, &RenderOptions { scene: SceneOptions { width: 500.0 } }).unwrap().scene;
        let arcs = |d: &[Seg]| d.iter().filter(|g| matches!(g, Seg::Arc { .. })).count();
        let lines = |d: &[Seg]| d.iter().filter(|g| matches!(g, Seg::Line(..))).count();
        let wedges: Vec<&Vec<Seg>> = s
            .marks()
            .into_iter()
            .filter_map(|m| match m {
                Node::Path { d, .. } => Some(d),
                _ => None,
            })
            .collect();
        assert_eq!(wedges.len(), 4);
        for d in &wedges {
            // From the centre: one line out, one arc, one line back (the close).
            assert_eq!((arcs(d), lines(d)), (1, 1), "{d:?}");
        }
        let grid = s.children.iter().find_map(|c| match c {
            Node::Group { class, children, .. } if class == "strata-grid" => Some(children),
            _ => None,
        });
        let rings: Vec<&Vec<Seg>> = grid
            .unwrap()
            .iter()
            .filter_map(|n| match n {
                Node::Path { d, .. } => Some(d),
                _ => None,
            })
            .collect();
        assert!(rings.len() >= 2);
        for d in &rings {
            assert_eq!((arcs(d), lines(d)), (2, 0), "a ring is two half-circle arcs: {d:?}");
            assert!(d.iter().all(|g| !matches!(g, Seg::Arc { rx, .. } if *rx < 1.0)), "a ring of zero radius: {d:?}");
        }
    }

    #[test]
    fn a_donut_without_x_is_one_ring_split_by_y() {
        use crate::scene::Seg;
        let spec = r#"{ "data": { "rows": [ {"a": "Yes", "n": 48}, {"a": "No", "n": 31}, {"a": "Unsure", "n": 21} ] },
            "layers": [ { "draw": "bar", "y": "n", "color": "a", "arrange": "stack" } ], "coords": { "kind": "polar", "angle": "y", "inner": 0.5 } }"#;
        let s = render(spec, None, &RenderOptions { scene: SceneOptions { width: 500.0 } }).unwrap().scene;
        let wedges: Vec<&Vec<Seg>> = s
            .marks()
            .into_iter()
            .filter_map(|m| match m {
                Node::Path { d, .. } => Some(d),
                _ => None,
            })
            .collect();
        assert_eq!(wedges.len(), 3);
        // Each: outer arc, a line in, inner arc back; the radii agree across wedges.
        let radii: Vec<(f64, f64)> = wedges
            .iter()
            .map(|d| match (&d[1], &d[3]) {
                (Seg::Arc { rx: a, sweep: true, .. }, Seg::Arc { rx: b, sweep: false, .. }) => (*a, *b),
                _ => panic!("{d:?}"),
            })
            .collect();
        assert!(radii.iter().all(|r| (r.0 - radii[0].0).abs() < 1e-9 && (r.1 - radii[0].1).abs() < 1e-9 && (r.1 / r.0 - 0.5).abs() < 1e-9), "{radii:?}");
        // Each wedge starts where the last one ended, and the last ends where the first starts.
        for k in 0..3 {
            let end = match wedges[k][1] {
                Seg::Arc { x, y, .. } => (x, y),
                _ => unreachable!(),
            };
            let next = match wedges[(k + 1) % 3][0] {
                Seg::Move(x, y) => (x, y),
                _ => unreachable!(),
            };
            assert!((end.0 - next.0).abs() < 1e-9 && (end.1 - next.1).abs() < 1e-9, "wedge {k} ends at {end:?}, the next starts at {next:?}");
        }
        // The radius maps nothing: no radius labels, no rings.
        let radius_axis = s.children.iter().any(|c| matches!(c, Node::Group { class, .. } if class.contains("strata-axis-radius")));
        assert!(!radius_axis);
    }

    #[test]
    fn legend_swatches_take_the_layer_shape_and_a_readable_title() {
        let rows = r#"{ "rows": [ {"m": 1, "v": 3, "harbour_kg": "a"}, {"m": 2, "v": 5, "harbour_kg": "b"} ] }"#;
        let legend = |draw: &str, scales: &str| {
            let spec = format!(r#"{{ "data": {rows}, "layers": [ {{ "draw": "{draw}", "x": "m", "y": "v", "color": "harbour_kg" }} ] {scales} }}"#);
            let s = render(&spec, None, &RenderOptions { scene: SceneOptions { width: 640.0 } }).unwrap().scene;
            fn find<'a>(n: &'a Node, out: &mut Vec<&'a Node>, inside: bool) {
                match n {
                    Node::Group { class, children, .. } => children.iter().for_each(|c| find(c, out, inside || class.starts_with("strata-legend"))),
                    n if inside => out.push(n),
                    _ => {}
                }
            }
            let mut nodes = Vec::new();
            s.children.iter().for_each(|c| find(c, &mut nodes, false));
            let title = nodes.iter().find_map(|n| match n {
                Node::Text { class, text, bold, .. } if class == "strata-legend-title" => Some((text.clone(), *bold)),
                _ => None,
            });
            let kinds: Vec<&str> = nodes
                .iter()
                .filter_map(|n| match n {
                    Node::Rect { .. } => Some("square"),
                    Node::Line { .. } => Some("line"),
                    Node::Circle { .. } => Some("dot"),
                    _ => None,
                })
                .collect();
            (title, kinds)
        };
        let (title, kinds) = legend("line", "");
        assert_eq!(title, Some(("Harbour kg".to_string(), false)));
        assert_eq!(kinds, ["line", "line"]);
        assert_eq!(legend("point", "").1, ["dot", "dot"]);
        assert_eq!(legend("bar", "").1, ["square", "square"]);
        assert_eq!(legend("area", "").1, ["square", "square"]);
        // A scale's own title is kept as written.
        assert_eq!(legend("point", r#", "scales": { "color": { "title": "harbour_kg (raw)" } }"#).0.unwrap().0, "harbour_kg (raw)");
    }

    fn svg_has_turned_text(s: &Scene) -> bool {
        fn walk(n: &Node) -> bool {
            match n {
                Node::Group { children, .. } => children.iter().any(walk),
                Node::Text { angle, .. } => *angle != 0.0,
                _ => false,
            }
        }
        s.children.iter().any(walk)
    }

    #[test]
    fn a_right_axis_title_stays_in_its_band() {
        let spec = r#"{ "data": { "rows": [ {"m": 1, "v": 120000}, {"m": 2, "v": 340000} ] },
            "layers": [ { "draw": "point", "x": "m", "y": "v" } ],
            "scales": { "y": { "axis": "right", "title": "Visitors" } } }"#;
        let s = render(spec, None, &RenderOptions { scene: SceneOptions { width: 640.0 } }).unwrap().scene;
        let title = all(&s, "strata-axis-title").into_iter().find(|t| t.2 == "Visitors").unwrap();
        // Tick labels start at their x (anchor start) on the right axis.
        let ticks: Vec<_> = all(&s, "strata-tick").into_iter().filter(|t| t.0 > 320.0).collect();
        let ticks_end = ticks.iter().map(|t| t.0 + text::width(&t.2, guides::TICK_SIZE, false)).fold(0.0, f64::max);
        let size = guides::TICK_SIZE;
        // House style: written across, above the axis, ending where the
        // widest tick label ends, its line box clear of the top label's.
        let top_label = ticks.iter().map(|t| t.1).fold(f64::INFINITY, f64::min);
        assert!((title.0 - ticks_end).abs() <= 1.0, "title ends at {}, labels at {ticks_end}", title.0);
        assert!(title.1 + size * (text::LINE_HEIGHT - text::ASCENT) <= top_label - size * text::CAP, "title {:?} over labels at {top_label}", title);
        assert!(title.0 <= 640.0 - 16.0 + 1e-9, "title reaches {}, past the padding", title.0);
    }
}
