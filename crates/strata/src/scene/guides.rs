//! Guides: axes with ticks, grid lines and titles; legends for colour
//! (swatches or a gradient bar), size and shape.
//!
//! Tick labels that would collide are handled in a fixed order: first
//! thinned (fewer ticks for continuous scales, every other label for
//! categories), then rotated (categories and dates), then shortened
//! (compact numbers, shorter dates, truncated words).

use super::coord::{Coord, Frame};
use super::{shape_path, Anchor, Node, Paint};
use crate::channel::Channel;
use crate::color::Palette;
use crate::format::Locale;
use crate::plan::{ColorScale, Scales};
use crate::scale::{PositionScale, Tick, TickOptions};
use crate::text;

/// Default size of tick labels, legend text and axis titles; the theme's
/// `font_size` replaces it (and every other text size scales with it).
pub const TICK_SIZE: f64 = 12.0;
const GAP: f64 = 6.0;
/// Least free space between neighbouring horizontal labels (px).
pub const LABEL_GAP: f64 = 8.0;
/// Angle of rotated labels (degrees, counter-clockwise reads upward).
pub const ROTATION: f64 = -45.0;

/// Which side of the frame an axis sits on.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Side {
    Bottom,
    Left,
    /// `"axis": "top"` on the horizontal scale.
    Top,
    /// `"axis": "right"` on the vertical scale.
    Right,
}

pub struct AxisGuide<'a> {
    pub side: Side,
    pub scale: &'a PositionScale,
    pub ticks: Vec<Tick>,
    pub title: &'a str,
    /// Label rotation in degrees (0 or [`ROTATION`]).
    pub angle: f64,
    /// Text size of its labels and title.
    pub size: f64,
    /// A vertical axis's title written once, horizontally, above the axis
    /// (the house style where it fits) rather than turned along it.
    pub title_above: bool,
}

/// Length of the short tick marks on a category axis (px).
pub const TICK_MARK: f64 = 4.0;

/// Short tick marks on a category axis, outward from the frame.
fn tick_marks(axis: &AxisGuide, f: Frame, pal: &Palette) -> Vec<Node> {
    if !axis.scale.is_discrete() {
        return vec![];
    }
    let (a0, a1) = match axis.side {
        Side::Bottom => (f.bottom(), f.bottom() + TICK_MARK),
        Side::Top => (f.top, f.top - TICK_MARK),
        Side::Left => (f.left, f.left - TICK_MARK),
        Side::Right => (f.right(), f.right() + TICK_MARK),
    };
    tick_lines(&axis.ticks, matches!(axis.side, Side::Bottom | Side::Top), f, a0, a1, &Paint::stroke(&pal.axis, 1.0))
}

/// A line across each tick from `a0` to `a1` (y for a horizontal axis,
/// whose lines stand at the ticks' x; x for a vertical one): tick marks and
/// grid lines alike.
fn tick_lines(ticks: &[Tick], horizontal: bool, f: Frame, a0: f64, a1: f64, paint: &Paint) -> Vec<Node> {
    let mut out = Vec::with_capacity(ticks.len());
    for t in ticks {
        out.push(if horizontal {
            let x = f.left + t.unit * f.width;
            Node::line(x, a0, x, a1, paint.clone())
        } else {
            let y = f.bottom() - t.unit * f.height;
            Node::line(a0, y, a1, y, paint.clone())
        });
    }
    out
}

/// Room a title written above a vertical axis takes over the frame (px).
pub fn title_above_height(ts: f64) -> f64 {
    ts * text::LINE_HEIGHT + GAP
}

/// A vertical axis's title above it, reading across: its start over the
/// left axis's labels (or its end over the right axis's).
fn title_above(axis: &AxisGuide, f: Frame, pal: &Palette, label_width: f64) -> Node {
    let ts = axis.size;
    let y = f.top - GAP - ts * (text::LINE_HEIGHT - text::ASCENT);
    let (x, anchor) = match axis.side {
        Side::Right => (f.right() + GAP + label_width, Anchor::End),
        _ => (f.left - GAP - label_width, Anchor::Start),
    };
    Node::text(x, y, axis.title.to_string(), ts, anchor, pal.text.clone(), "strata-axis-title")
}

/// A stronger line at zero along the value axis, when its domain spans or
/// touches zero (drawn over the marks).
pub fn zero_line(axis: &AxisGuide, coord: &Coord, pal: &Palette) -> Option<Node> {
    let (lo, hi) = axis.scale.domain()?;
    if !(lo.min(hi) <= 0.0 && hi.max(lo) >= 0.0) {
        return None;
    }
    let u = axis.scale.unit_num(0.0).filter(|u| u.is_finite() && (-1e-9..=1.0 + 1e-9).contains(u))?;
    // Zero inside the domain (values on both sides): a stronger line, where gains turn to losses.
    let width = if lo.min(hi) < 0.0 && hi.max(lo) > 0.0 { 1.5 } else { 1.0 };
    let f = coord.frame();
    let line = match axis.side {
        Side::Left | Side::Right => {
            let y = f.bottom() - u * f.height;
            Node::line(f.left, y, f.right(), y, Paint::stroke(&pal.text, width))
        }
        Side::Bottom | Side::Top => {
            let x = f.left + u * f.width;
            Node::line(x, f.top, x, f.bottom(), Paint::stroke(&pal.text, width))
        }
    };
    Some(Node::group("strata-zero", vec![line]))
}

/// Width of a tick label: its widest line (a wrapped label holds `\n`).
pub fn label_width(t: &Tick, ts: f64) -> f64 {
    let mut m = 0.0f64;
    for l in t.label.split('\n') {
        m = m.max(text::width(l, ts, false));
    }
    m
}

/// Lines of a tick label (a wrapped category label has two).
fn label_lines(t: &Tick) -> usize {
    t.label.split('\n').count()
}

/// Do neighbouring horizontal labels keep [`LABEL_GAP`] apart on an axis `length` px long?
fn fits_across(ticks: &[Tick], length: f64, ts: f64) -> bool {
    ticks.windows(2).all(|w| {
        let space = (w[1].unit - w[0].unit).abs() * length;
        space >= (label_width(&w[0], ts) + label_width(&w[1], ts)) / 2.0 + LABEL_GAP
    })
}

/// Where to start looking for the thinning step k that spaces evenly
/// spaced ticks `need` px apart: one below the step their spacing implies,
/// so the search that follows tries a step or two, not all of them.
fn first_k(ticks: &[Tick], length: f64, need: f64) -> usize {
    let gap = spacing(ticks, length);
    if !(gap > 0.0 && gap.is_finite()) {
        return 1;
    }
    ((need / gap).floor() as usize).saturating_sub(1).clamp(1, ticks.len().max(1))
}

/// Keep every k-th tick.
fn every(ticks: &[Tick], k: usize) -> Vec<Tick> {
    let mut out = Vec::with_capacity(ticks.len() / k.max(1) + 1);
    for t in ticks.iter().step_by(k.max(1)) {
        out.push(t.clone());
    }
    out
}

/// Ticks of a horizontal axis `length` px long, after thinning, rotating and shortening.
/// Returns the ticks and the label angle.
pub fn bottom_ticks(
    scale: &PositionScale,
    length: f64,
    wanted: usize,
    pattern: Option<&str>,
    loc: &Locale,
    max_label_height: f64,
    ts: f64,
) -> (Vec<Tick>, f64) {
    let opts = |wanted: usize, short: bool| TickOptions { wanted, pattern, locale: loc, short };
    if let PositionScale::Category { .. } = scale {
        return category_bottom(scale.ticks_with(&opts(wanted, false)), length, max_label_height, ts);
    }
    // Continuous: thin by asking for fewer ticks, then shorten, then (dates) rotate.
    let mut w = wanted.max(2);
    loop {
        let t = scale.ticks_with(&opts(w, false));
        if fits_across(&t, length, ts) {
            return (t, 0.0);
        }
        if w <= 2 {
            break;
        }
        w -= 1;
    }
    let mut w = wanted.max(2);
    loop {
        let t = scale.ticks_with(&opts(w, true));
        if fits_across(&t, length, ts) || w <= 2 {
            if fits_across(&t, length, ts) {
                return (t, 0.0);
            }
            return (t, if scale.is_time() { ROTATION } else { 0.0 });
        }
        w -= 1;
    }
}

/// Least room between neighbouring category ticks on an axis `length` px long.
fn spacing(ticks: &[Tick], length: f64) -> f64 {
    let mut m = f64::INFINITY;
    for w in ticks.windows(2) {
        m = m.min((w[1].unit - w[0].unit).abs() * length);
    }
    m
}

fn relabel(ticks: &[Tick], labels: Vec<String>) -> Vec<Tick> {
    let n = labels.len();
    let mut out = ticks.to_vec();
    for (t, l) in out.iter_mut().zip(labels) {
        t.label = l;
    }
    out.truncate(n);
    out
}

/// The ticks' labels.
fn tick_labels(ticks: &[Tick]) -> Vec<String> {
    let mut out = Vec::with_capacity(ticks.len());
    for t in ticks {
        out.push(t.label.clone());
    }
    out
}

/// Every label on at most two lines ([`wrap_two`]), `None` when one does not fit.
fn wrap_all(labels: &[String], max_w: f64, ts: f64) -> Option<Vec<String>> {
    let mut out = Vec::with_capacity(labels.len());
    for l in labels {
        out.push(wrap_two(l, max_w, ts)?);
    }
    Some(out)
}

/// Category labels along a horizontal axis. A label is never dropped while
/// some layout keeps it; the layouts are tried in this order:
/// 1. level, as they are;
/// 2. level, wrapped on two lines at a space;
/// 3. turned 45°, then 90°, each label cut to a unique prefix when it is
///    longer than the height allows (the axis names it in full in a title);
/// 4. level, cut to unique prefixes;
/// 5. only when none of these fits: turned and thinned to every k-th label.
fn category_bottom(full: Vec<Tick>, length: f64, max_label_height: f64, ts: f64) -> (Vec<Tick>, f64) {
    if fits_across(&full, length, ts) || full.len() < 2 {
        return (full, 0.0);
    }
    let room = spacing(&full, length);
    let slot = room - LABEL_GAP;
    let labels = tick_labels(&full);
    // 2. Two lines each.
    if slot > 0.0 {
        if let Some(w) = wrap_all(&labels, slot, ts) {
            return (relabel(&full, w), 0.0);
        }
    }
    // 3. Turned: every label keeps its own tick.
    for angle in [ROTATION, -90.0] {
        let sin = crate::math::sin_cos_deg(-angle).0;
        if room >= ts * text::LINE_HEIGHT / sin {
            let max_w = max_label_height / sin;
            return (relabel(&full, shorten_unique(&labels, max_w, ts)), angle);
        }
    }
    // 4. Level prefixes.
    if slot > 0.0 {
        if let Some(p) = unique_prefixes(&labels, slot, ts) {
            return (relabel(&full, p), 0.0);
        }
    }
    // 5. Thinned: no layout keeps every label at this size.
    let need = ts * text::LINE_HEIGHT;
    let mut k = first_k(&full, length, need).max(2);
    while k < full.len() && !every(&full, k).windows(2).all(|w| (w[1].unit - w[0].unit).abs() * length >= need) {
        k += 1;
    }
    let kept = every(&full, k);
    let labels = tick_labels(&kept);
    (relabel(&kept, shorten_unique(&labels, max_label_height, ts)), -90.0)
}

/// `label` on one line, or on two lines split at the space that makes the
/// longer line shortest, when that fits `max_w` px; `None` otherwise.
pub fn wrap_two(label: &str, max_w: f64, ts: f64) -> Option<String> {
    if text::width(label, ts, false) <= max_w {
        return Some(label.to_string());
    }
    let words: Vec<&str> = label.split_whitespace().collect();
    // The first split with the least width, as `min_by` keeps the first.
    let mut best: Option<(f64, String)> = None;
    for k in 1..words.len() {
        let (a, b) = (crate::join(&words[..k], " "), crate::join(&words[k..], " "));
        let w = text::width(&a, ts, false).max(text::width(&b, ts, false));
        if w <= max_w && best.as_ref().is_none_or(|(bw, _)| w.total_cmp(bw).is_lt()) {
            best = Some((w, format!("{a}\n{b}")));
        }
    }
    best.map(|(_, s)| s)
}

/// Each label cut to the longest prefix that fits `max_w` px with an
/// ellipsis, provided that prefix is long enough to tell it from every
/// other label (no other label starts with it). Labels that fit stay whole.
/// `None` when some label's shortest telling prefix does not fit.
pub fn unique_prefixes(labels: &[String], max_w: f64, ts: f64) -> Option<Vec<String>> {
    // Sorted, a label's nearest rivals are its neighbours: the telling
    // prefix is one character longer than the longest prefix shared with either.
    let mut order: Vec<usize> = (0..labels.len()).collect();
    crate::sort::by(&mut order, |a, b| labels[*a].cmp(&labels[*b]));
    let common = |a: &str, b: &str| a.chars().zip(b.chars()).take_while(|(x, y)| x == y).count();
    let mut need = vec![0usize; labels.len()];
    for (k, &i) in order.iter().enumerate() {
        let mut n = 0;
        if k > 0 {
            n = n.max(common(&labels[i], &labels[order[k - 1]]));
        }
        if k + 1 < order.len() {
            n = n.max(common(&labels[i], &labels[order[k + 1]]));
        }
        need[i] = n + 1;
    }
    let ell = text::width("\u{2026}", ts, false);
    let mut out = Vec::with_capacity(labels.len());
    for (l, n) in labels.iter().zip(need) {
        if text::width(l, ts, false) <= max_w {
            out.push(l.clone());
            continue;
        }
        if n >= l.chars().count() {
            return None; // the whole label is another's prefix, and too long
        }
        let mut w = 0.0;
        let mut cut = 0;
        let mut end = 0; // byte length of the first `cut` characters
        for c in l.chars() {
            let a = text::advance(c, false) * ts;
            if w + a + ell > max_w {
                break;
            }
            w += a;
            cut += 1;
            end += c.len_utf8();
        }
        if cut < n {
            return None;
        }
        let head = &l[..end];
        let trimmed = head.trim_end();
        // Trimming a trailing space must not undo the telling part.
        let head = if trimmed.chars().count() >= n { trimmed } else { head };
        out.push(format!("{head}\u{2026}"));
    }
    Some(out)
}

/// Labels cut to `max_w` px, telling apart: unique prefixes where they fit,
/// else the shared words dropped ([`shorten_all`]).
pub fn shorten_unique(labels: &[String], max_w: f64, ts: f64) -> Vec<String> {
    unique_prefixes(labels, max_w, ts).unwrap_or_else(|| shorten_all(labels, max_w, ts))
}

/// Cut labels to `max_w` px and keep them telling apart: first cut at the
/// end; if that makes two alike, drop the words every label shares at the
/// start (and end), marking the cut with an ellipsis.
pub fn shorten_all(labels: &[String], max_w: f64, ts: f64) -> Vec<String> {
    let fit = |s: &str| text::fit(s, ts, false, max_w);
    let mut simple: Vec<String> = Vec::with_capacity(labels.len());
    for l in labels {
        simple.push(fit(l));
    }
    let distinct = |v: &[String]| {
        let mut s: Vec<&String> = v.iter().collect();
        crate::sort::by(&mut s, |a, b| a.cmp(b));
        s.windows(2).all(|w| w[0] != w[1])
    };
    if distinct(&simple) || labels.len() < 2 {
        return simple;
    }
    let mut words: Vec<Vec<&str>> = Vec::with_capacity(labels.len());
    for l in labels {
        words.push(l.split(' ').collect());
    }
    let shortest = words.iter().map(Vec::len).min().unwrap_or(0);
    let mut head = 0;
    while head + 1 < shortest && words.iter().all(|w| w[head] == words[0][head]) {
        head += 1;
    }
    let mut tail = 0;
    while head + tail + 1 < shortest && words.iter().all(|w| w[w.len() - 1 - tail] == words[0][words[0].len() - 1 - tail]) {
        tail += 1;
    }
    let (pre, post) = (if head > 0 { "\u{2026}" } else { "" }, if tail > 0 { "\u{2026}" } else { "" });
    let mut core: Vec<String> = Vec::with_capacity(words.len());
    for w in &words {
        let mid = crate::join(&w[head..w.len() - tail], " ");
        core.push(fit(&format!("{pre}{mid}{post}")));
    }
    if distinct(&core) {
        core
    } else {
        simple
    }
}

/// Ticks of a vertical axis `length` px long: thinned to a line and a half apart.
pub fn left_ticks(scale: &PositionScale, length: f64, wanted: usize, pattern: Option<&str>, loc: &Locale, max_width: f64, ts: f64) -> Vec<Tick> {
    let opts = |wanted: usize| TickOptions { wanted, pattern, locale: loc, short: false };
    let line = ts * text::LINE_HEIGHT;
    let spaced = |t: &[Tick], need: f64| t.windows(2).all(|w| (w[1].unit - w[0].unit).abs() * length >= need);
    let mut ticks = if scale.is_discrete() {
        let full = scale.ticks_with(&opts(wanted));
        let mut k = first_k(&full, length, line);
        while k < full.len() && !spaced(&every(&full, k), line) {
            k += 1;
        }
        every(&full, k)
    } else {
        let mut w = wanted.max(2);
        let mut t = scale.ticks_with(&opts(w));
        while w > 2 && !spaced(&t, line * 1.5) {
            w -= 1;
            t = scale.ticks_with(&opts(w));
        }
        t
    };
    // Shorten labels wider than the allowance.
    if ticks.iter().any(|t| label_width(t, ts) > max_width) {
        if !scale.is_discrete() {
            let short = scale.ticks_with(&TickOptions { wanted: ticks.len().max(2), pattern, locale: loc, short: true });
            if short.len() == ticks.len() {
                ticks = short;
            }
        }
        if scale.is_discrete() {
            // Two lines where the bands have room for them, else prefixes
            // that tell the categories apart (the axis names them in full).
            let two_lines = spacing(&ticks, length) >= 2.0 * line;
            let labels = tick_labels(&ticks);
            let wrapped = if two_lines { wrap_all(&labels, max_width, ts) } else { None };
            let short = wrapped.unwrap_or_else(|| shorten_unique(&labels, max_width, ts));
            for (t, l) in ticks.iter_mut().zip(short) {
                t.label = l;
            }
        } else {
            for t in ticks.iter_mut() {
                t.label = text::fit(&t.label, ts, false, max_width);
            }
        }
    }
    ticks
}

/// Widest tick label, for the left margin.
pub fn widest_label(ticks: &[Tick], ts: f64) -> f64 {
    let mut m = 0.0f64;
    for t in ticks {
        m = m.max(label_width(t, ts));
    }
    m
}

/// An axis title centred at (x, y), shortened to fit `length`, turned by `angle`.
pub fn axis_title(x: f64, y: f64, title: &str, length: f64, angle: f64, pal: &Palette, ts: f64) -> Node {
    Node::styled_text(x, y, text::fit(title, ts, false, length), ts, Anchor::Middle, false, angle, pal.text.clone(), "strata-axis-title")
}

fn label(x: f64, y: f64, s: &str, anchor: Anchor, fill: &str, class: &str, ts: f64) -> Node {
    Node::text(x, y, s.to_string(), ts, anchor, fill.to_string(), class)
}

/// Grid lines for continuous scales (drawn under the marks).
pub fn grid(axis: &AxisGuide, coord: &Coord, pal: &Palette) -> Vec<Node> {
    if axis.scale.is_discrete() {
        return vec![];
    }
    let f = coord.frame();
    let paint = Paint::stroke(&pal.grid, 1.0);
    match axis.side {
        Side::Left | Side::Right => tick_lines(&axis.ticks, false, f, f.left, f.right(), &paint),
        Side::Bottom | Side::Top => tick_lines(&axis.ticks, true, f, f.top, f.bottom(), &paint),
    }
}

/// Axis line, tick labels and title.
pub fn axis(axis: &AxisGuide, f: Frame, pal: &Palette, label_width: f64) -> Node {
    let ts = axis.size;
    let mut kids = Vec::new();
    let baseline = ts * text::ASCENT;
    match axis.side {
        Side::Bottom => {
            kids.push(Node::line(f.left, f.bottom(), f.right(), f.bottom(), Paint::stroke(&pal.axis, 1.0)));
            kids.extend(tick_marks(axis, f, pal));
            for t in &axis.ticks {
                let x = f.left + t.unit * f.width;
                if axis.angle != 0.0 {
                    // Rotated about the label's end, just below the tick.
                    let y = f.bottom() + GAP + ts * text::CAP / 2.0;
                    let text = Node::styled_text(x + ts * 0.3, y, t.label.clone(), ts, Anchor::End, false, axis.angle, pal.muted.clone(), "strata-tick");
                    kids.push(named(axis, t, text));
                } else {
                    let y = f.bottom() + GAP + baseline - ts * (text::LINE_HEIGHT - 1.0) / 2.0;
                    kids.push(named(axis, t, tick_text(x, y, t, Anchor::Middle, pal, ts)));
                }
            }
            if !axis.title.is_empty() {
                let labels_h = bottom_labels_height(&axis.ticks, axis.angle, ts);
                let y = f.bottom() + GAP + labels_h + GAP + ts * text::ASCENT;
                kids.push(axis_title(f.left + f.width / 2.0, y, axis.title, f.width, 0.0, pal, ts));
            }
        }
        Side::Top => {
            kids.push(Node::line(f.left, f.top, f.right(), f.top, Paint::stroke(&pal.axis, 1.0)));
            kids.extend(tick_marks(axis, f, pal));
            let labels_h = bottom_labels_height(&axis.ticks, axis.angle, ts);
            for t in &axis.ticks {
                let x = f.left + t.unit * f.width;
                if axis.angle != 0.0 {
                    // Rotated about the label's start, just above the tick, reading upward.
                    let y = f.top - GAP - ts * text::CAP / 2.0 + ts * text::CAP;
                    let text = Node::styled_text(x - ts * 0.3, y, t.label.clone(), ts, Anchor::Start, false, axis.angle, pal.muted.clone(), "strata-tick");
                    kids.push(named(axis, t, text));
                } else {
                    // The last line sits where a one-line label would.
                    let up = (label_lines(t) - 1) as f64 * ts * text::LINE_HEIGHT;
                    let y = f.top - GAP - ts * text::LINE_HEIGHT + baseline - ts * (text::LINE_HEIGHT - 1.0) / 2.0 - up;
                    kids.push(named(axis, t, tick_text(x, y, t, Anchor::Middle, pal, ts)));
                }
            }
            if !axis.title.is_empty() {
                let y = f.top - GAP - labels_h - GAP - ts * text::LINE_HEIGHT + ts * text::ASCENT;
                kids.push(axis_title(f.left + f.width / 2.0, y, axis.title, f.width, 0.0, pal, ts));
            }
        }
        // Left and right: mirror images about the frame's edge (`s` the
        // outward sign; `a - b` is `a + -1 * b` to the bit).
        Side::Left | Side::Right => {
            let (edge, s, anchor) = if axis.side == Side::Right { (f.right(), 1.0, Anchor::Start) } else { (f.left, -1.0, Anchor::End) };
            if axis.scale.is_discrete() {
                kids.push(Node::line(edge, f.top, edge, f.bottom(), Paint::stroke(&pal.axis, 1.0)));
            }
            kids.extend(tick_marks(axis, f, pal));
            for t in &axis.ticks {
                let y = f.bottom() - t.unit * f.height;
                let first = y + ts * text::CAP / 2.0 - (label_lines(t) - 1) as f64 * ts * text::LINE_HEIGHT / 2.0;
                kids.push(named(axis, t, tick_text(edge + s * GAP, first, t, anchor, pal, ts)));
            }
            if !axis.title.is_empty() && axis.title_above {
                kids.push(title_above(axis, f, pal, label_width));
            } else if !axis.title.is_empty() {
                // Turned to read along the axis (upward on the left, downward
                // on the right, the line's top facing out): its baseline sits
                // the line's depth below ascent from the inner side.
                let x = edge + s * GAP + s * label_width + s * GAP + s * (ts * (text::LINE_HEIGHT - text::ASCENT));
                kids.push(axis_title(x, f.top + f.height / 2.0, axis.title, f.height, 90.0 * s, pal, ts));
            }
        }
    }
    let (class, label) = match axis.side {
        Side::Bottom => ("strata-axis strata-axis-bottom", "horizontal axis"),
        Side::Top => ("strata-axis strata-axis-top", "horizontal axis"),
        Side::Left => ("strata-axis strata-axis-left", "vertical axis"),
        Side::Right => ("strata-axis strata-axis-right", "vertical axis"),
    };
    let title = if axis.title.is_empty() { label.to_string() } else { format!("{label}: {}", axis.title) };
    Node::named_group(class.into(), None, Some(title), kids)
}

/// A tick label at (x, first baseline): one text, or a wrapped label's
/// lines a line apart in a `strata-tick-lines` group.
fn tick_text(x: f64, y: f64, t: &Tick, anchor: Anchor, pal: &Palette, ts: f64) -> Node {
    if !t.label.contains('\n') {
        return label(x, y, &t.label, anchor, &pal.muted, "strata-tick", ts);
    }
    let mut lines = Vec::new();
    for (k, l) in t.label.split('\n').enumerate() {
        lines.push(label(x, y + k as f64 * ts * text::LINE_HEIGHT, l, anchor, &pal.muted, "strata-tick", ts));
    }
    Node::group("strata-tick-lines", lines)
}

/// A category label that was cut short keeps its full name in a title.
fn named(axis: &AxisGuide, t: &Tick, n: Node) -> Node {
    let PositionScale::Category { values, .. } = axis.scale else { return n };
    let Some(full) = values.get(t.value as usize).filter(|_| t.value >= 0.0) else { return n };
    if t.label.contains('\u{2026}') && *full != t.label {
        return Node::Titled { title: full.clone(), children: vec![n] };
    }
    n
}

/// Height of a bottom axis's labels (rotated labels stand taller).
pub fn bottom_labels_height(ticks: &[Tick], angle: f64, ts: f64) -> f64 {
    if angle == 0.0 {
        ticks.iter().map(label_lines).max().unwrap_or(1) as f64 * ts * text::LINE_HEIGHT
    } else {
        let s = crate::math::sin_cos_deg(-angle).0;
        widest_label(ticks, ts) * s + ts * text::LINE_HEIGHT * s
    }
}

/// Room an axis title takes beside its axis: a gap and one line.
pub fn title_band(ts: f64) -> f64 {
    GAP + ts * text::LINE_HEIGHT
}

/// Height the bottom axis needs below the frame.
pub fn bottom_axis_height(ticks: &[Tick], angle: f64, has_title: bool, ts: f64) -> f64 {
    GAP + bottom_labels_height(ticks, angle, ts) + if has_title { title_band(ts) } else { 0.0 }
}

/// Width the left axis needs beside the frame.
pub fn left_axis_width(label_width: f64, has_title: bool, ts: f64) -> f64 {
    GAP + label_width + if has_title { title_band(ts) } else { 0.0 }
}

// ---------------------------------------------------------------- legends

const SWATCH: f64 = 10.0;
const GRADIENT_LENGTH: f64 = 120.0;
const GRADIENT_THICKNESS: f64 = 10.0;
const GRADIENT_STEPS: usize = 48;

/// The shape of a colour swatch: the layer's own mark in small.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SwatchMark {
    /// Bars, areas, bands, cells, boxes and labels.
    Square,
    /// Lines, steps, segments and ranges: a short line.
    Line,
    /// Points: a dot.
    Dot,
}

impl SwatchMark {
    /// The swatch of the first layer that maps `color` (a square when none does).
    pub fn of(layers: &[crate::plan::PlannedLayer]) -> SwatchMark {
        use crate::plan::Geometry as G;
        match layers.iter().find(|l| l.data.names.contains_key(&Channel::Color)).map(|l| l.geometry) {
            Some(G::Line | G::Step | G::Segment | G::Range) => SwatchMark::Line,
            Some(G::Point) => SwatchMark::Dot,
            _ => SwatchMark::Square,
        }
    }
}

/// What one legend shows.
#[derive(Debug, Clone)]
pub enum LegendBody {
    /// Colour swatches for categories: (label, colour), drawn in the shape
    /// of the marks they stand for.
    Swatches(Vec<(String, String)>, SwatchMark),
    /// A bar of colour samples with tick labels along it.
    Gradient { colors: Vec<String>, ticks: Vec<Tick> },
    /// Circles of the size scale: (label, radius).
    Sizes(Vec<(String, f64)>),
    /// Shapes for categories: (label, shape index, colour when the colour
    /// channel maps the same categories).
    Shapes(Vec<(String, usize, Option<String>)>),
}

#[derive(Debug, Clone)]
pub struct Legend {
    pub title: String,
    pub body: LegendBody,
    /// `color`, `size` or `shape`.
    pub channel: Channel,
    /// Text size of its title and labels.
    pub size: f64,
}

/// The legends the scales call for, in the order colour, size, shape.
pub fn legends(scales: &Scales, mark: SwatchMark, size: f64) -> Vec<Legend> {
    let mut out = Vec::new();
    let loc = scales.locale;
    let hidden = |s: &crate::plan::ScaleSpec| s.hide || s.legend == Some(crate::plan::Placement::None);
    // Colour and shape of the same categories share one legend of coloured shapes.
    let merged = matches!((&scales.color, &scales.shape), (Some(ColorScale::Categories(c)), Some(s)) if c == s && scales.color_title == scales.shape_title);
    match &scales.color {
        Some(ColorScale::Categories(_)) if merged => {}
        Some(ColorScale::Categories(_)) if !hidden(&scales.color_spec) => {
            let items = scales.category_legend();
            out.push(Legend { title: scales.color_title.clone(), body: LegendBody::Swatches(items, mark), channel: Channel::Color, size });
        }
        Some(ColorScale::Ramp { lo, hi }) if !hidden(&scales.color_spec) => {
            let (lo, hi) = (*lo, *hi);
            let mut colors = Vec::with_capacity(GRADIENT_STEPS);
            for k in 0..GRADIENT_STEPS {
                colors.push(scales.ramp_color(lo + (hi - lo) * (k as f64 + 0.5) / GRADIENT_STEPS as f64, lo, hi, scales.color_scheme));
            }
            let scale = PositionScale::linear(lo, hi);
            let ticks = scale.ticks_with(&TickOptions { wanted: 3, pattern: scales.color_spec.format.as_deref(), locale: loc, short: false });
            out.push(Legend { title: scales.color_title.clone(), body: LegendBody::Gradient { colors, ticks }, channel: Channel::Color, size });
        }
        #[cfg(feature = "steps")]
        Some(ColorScale::Steps { lo, bounds }) if !hidden(&scales.color_spec) => {
            // A stepped legend: one swatch a class, labelled with its break values.
            let mut all: Vec<f64> = Vec::with_capacity(bounds.len() + 1);
            all.push(*lo);
            all.extend_from_slice(bounds);
            let mut step = f64::INFINITY;
            for w in all.windows(2) {
                let d = w[1] - w[0];
                if d > 0.0 {
                    step = step.min(d);
                }
            }
            let pattern = scales.color_spec.format.clone().unwrap_or_else(|| crate::format::default_pattern(if step.is_finite() { step } else { 1.0 }));
            let f = |v: f64| crate::format::number(v, &pattern, loc);
            let mut items = Vec::with_capacity(bounds.len());
            for (i, b) in bounds.iter().enumerate() {
                items.push((format!("{} – {}", f(all[i]), f(*b)), scales.step_color(i, bounds.len(), scales.color_scheme)));
            }
            out.push(Legend { title: scales.color_title.clone(), body: LegendBody::Swatches(items, SwatchMark::Square), channel: Channel::Color, size });
        }
        _ => {}
    }
    if let Some(s) = &scales.size {
        if !hidden(&scales.size_spec) {
            let vals = s.legend_values();
            let step = if vals.len() > 1 { vals[1] - vals[0] } else { vals.first().copied().unwrap_or(1.0) };
            let pattern = scales.size_spec.format.clone().unwrap_or_else(|| crate::format::default_pattern(step));
            let mut items = Vec::with_capacity(vals.len());
            for v in &vals {
                if let Some(r) = s.radius(*v) {
                    items.push((crate::format::number(*v, &pattern, loc), r));
                }
            }
            out.push(Legend { title: scales.size_title.clone(), body: LegendBody::Sizes(items), channel: Channel::Size, size });
        }
    }
    if let Some(cats) = &scales.shape {
        if !hidden(&scales.shape_spec) {
            let vals = crate::plan::Values::texts(cats);
            let mut items = Vec::with_capacity(cats.len());
            for (i, c) in cats.iter().enumerate() {
                items.push((c.clone(), i, merged.then(|| scales.color_of(&vals, i)).flatten()));
            }
            let l = Legend { title: scales.shape_title.clone(), body: LegendBody::Shapes(items), channel: Channel::Shape, size };
            if merged {
                out.insert(0, l)
            } else {
                out.push(l)
            }
        }
    }
    out
}

fn item_width(label: &str, lead: f64, ts: f64) -> f64 {
    lead + 6.0 + text::width(label, ts, false)
}

fn lead(body: &LegendBody) -> f64 {
    match body {
        LegendBody::Sizes(items) => widest_size(items, SWATCH, 0.0),
        _ => SWATCH,
    }
}

fn row_height(body: &LegendBody, ts: f64) -> f64 {
    match body {
        LegendBody::Sizes(items) => widest_size(items, ts * text::LINE_HEIGHT, 4.0),
        _ => ts * text::LINE_HEIGHT,
    }
}

/// The largest circle diameter plus `pad` of a size legend, at least `least`.
fn widest_size(items: &[(String, f64)], least: f64, pad: f64) -> f64 {
    let mut m = least;
    for (_, r) in items {
        m = m.max(2.0 * r + pad);
    }
    m
}

fn title_height(l: &Legend) -> f64 {
    let ts = l.size;
    if l.title.is_empty() {
        0.0
    } else {
        ts * text::LINE_HEIGHT
    }
}

/// Size of a legend laid out as a column.
pub fn column_size(l: &Legend) -> (f64, f64) {
    let ts = l.size;
    let tw = text::width(&l.title, ts, false);
    match &l.body {
        LegendBody::Gradient { ticks, .. } => {
            let w = GRADIENT_THICKNESS + 6.0 + widest_label(ticks, ts);
            (w.max(tw), title_height(l) + GRADIENT_LENGTH + ts)
        }
        body => {
            let labels = body_labels(body);
            let mut w = tw;
            for s in &labels {
                w = w.max(item_width(s, lead(body), ts));
            }
            (w, title_height(l) + row_height(body, ts) * labels.len() as f64)
        }
    }
}

/// Height of a legend laid out as rows within `max_width` (title on its own line).
pub fn row_size(l: &Legend, max_width: f64) -> (f64, f64) {
    let (_, h, w) = row_layout(l, max_width);
    (w, h)
}

/// Item positions (x, row) for a row layout, total height and widest row.
fn row_layout(l: &Legend, max_width: f64) -> (Vec<(f64, usize)>, f64, f64) {
    let ts = l.size;
    let body = &l.body;
    if let LegendBody::Gradient { .. } = body {
        return (vec![], title_height(l) + GRADIENT_THICKNESS + 4.0 + ts * text::LINE_HEIGHT, GRADIENT_LENGTH.max(text::width(&l.title, ts, false)));
    }
    let labels = body_labels(body);
    let mut pos = Vec::new();
    let (mut x, mut row, mut widest) = (0.0, 0usize, 0.0f64);
    for s in labels {
        let w = item_width(&text::fit(s, ts, false, max_width - lead(body) - 6.0), lead(body), ts);
        if x > 0.0 && x + w > max_width {
            row += 1;
            x = 0.0;
        }
        pos.push((x, row));
        x += w + 14.0;
        widest = widest.max(x - 14.0);
    }
    let rows = if pos.is_empty() { 0 } else { row + 1 };
    (pos, title_height(l) + row_height(body, ts) * rows as f64, widest.max(text::width(&l.title, ts, false)))
}

fn legend_title(l: &Legend, x: f64, y: f64, pal: &Palette) -> Option<Node> {
    let ts = l.size;
    (!l.title.is_empty()).then(|| Node::text(x, y + ts * text::ASCENT, l.title.clone(), ts, Anchor::Start, pal.text.clone(), "strata-legend-title"))
}

fn symbol(body: &LegendBody, i: usize, cx: f64, cy: f64, pal: &Palette, default_color: &str) -> Node {
    match body {
        LegendBody::Swatches(items, SwatchMark::Square) => {
            Node::Rect { x: cx - SWATCH / 2.0, y: cy - SWATCH / 2.0, width: SWATCH, height: SWATCH, paint: Paint::fill(&items[i].1), datum: None }
        }
        LegendBody::Swatches(items, SwatchMark::Line) => Node::line(cx - SWATCH / 2.0 - 2.0, cy, cx + SWATCH / 2.0 + 2.0, cy, Paint::stroke(&items[i].1, 2.5)),
        LegendBody::Swatches(items, SwatchMark::Dot) => Node::Circle { cx, cy, r: SWATCH / 2.0 - 0.5, paint: Paint::fill(&items[i].1), datum: None },
        LegendBody::Sizes(items) => {
            let mut p = Paint::fill(default_color);
            p.opacity = Some(0.6);
            let _ = pal;
            Node::Circle { cx, cy, r: items[i].1, paint: p, datum: None }
        }
        LegendBody::Shapes(items) => Node::path(shape_path(items[i].1, cx, cy, SWATCH / 2.0), Paint::fill(items[i].2.as_deref().unwrap_or(&pal.muted)), None),
        LegendBody::Gradient { .. } => Node::group("strata-empty", vec![]),
    }
}

fn labels_of(body: &LegendBody) -> Vec<String> {
    let labels = body_labels(body);
    let mut out = Vec::with_capacity(labels.len());
    for l in labels {
        out.push(l.clone());
    }
    out
}

/// The item labels of a legend (none for a gradient), in one loop per kind.
fn body_labels(body: &LegendBody) -> Vec<&String> {
    let mut out = Vec::new();
    match body {
        LegendBody::Swatches(i, _) => {
            for x in i {
                out.push(&x.0);
            }
        }
        LegendBody::Sizes(i) => {
            for x in i {
                out.push(&x.0);
            }
        }
        LegendBody::Shapes(i) => {
            for x in i {
                out.push(&x.0);
            }
        }
        LegendBody::Gradient { .. } => {}
    }
    out
}

fn gradient(l: &Legend, x: f64, y: f64, vertical: bool, pal: &Palette) -> Vec<Node> {
    let ts = l.size;
    let LegendBody::Gradient { colors, ticks } = &l.body else { return vec![] };
    let mut kids = Vec::new();
    let n = colors.len() as f64;
    let step = GRADIENT_LENGTH / n;
    for (k, c) in colors.iter().enumerate() {
        // Vertical bars run high values at the top, like a y axis.
        let (rx, ry, w, h) = if vertical {
            (x, y + GRADIENT_LENGTH - (k as f64 + 1.0) * step, GRADIENT_THICKNESS, step + 0.3)
        } else {
            (x + k as f64 * step, y, step + 0.3, GRADIENT_THICKNESS)
        };
        kids.push(Node::Rect { x: rx, y: ry, width: w, height: h, paint: Paint::fill(c), datum: None });
    }
    for t in ticks {
        if vertical {
            let ty = y + GRADIENT_LENGTH * (1.0 - t.unit);
            kids.push(label(x + GRADIENT_THICKNESS + 6.0, ty + ts * text::CAP / 2.0, &t.label, Anchor::Start, &pal.muted, "strata-tick", ts));
        } else {
            let tx = x + GRADIENT_LENGTH * t.unit;
            kids.push(label(tx, y + GRADIENT_THICKNESS + 4.0 + ts * text::ASCENT, &t.label, Anchor::Middle, &pal.muted, "strata-tick", ts));
        }
    }
    kids
}

/// A legend as a column with its top-left corner at (x, y).
pub fn column(l: &Legend, x: f64, y: f64, pal: &Palette, default_color: &str) -> Node {
    let ts = l.size;
    let mut kids = Vec::new();
    let mut row = y;
    if let Some(t) = legend_title(l, x, row, pal) {
        kids.push(t);
        row += ts * text::LINE_HEIGHT;
    }
    if let LegendBody::Gradient { .. } = &l.body {
        kids.extend(gradient(l, x, row + ts / 2.0, true, pal));
    } else {
        let lead = lead(&l.body);
        let rh = row_height(&l.body, ts);
        for (i, s) in labels_of(&l.body).iter().enumerate() {
            let mid = row + rh / 2.0;
            kids.push(symbol(&l.body, i, x + lead / 2.0, mid, pal, default_color));
            kids.push(label(x + lead + 6.0, mid + ts * text::CAP / 2.0, s, Anchor::Start, &pal.text, "strata-legend-label", ts));
            row += rh;
        }
    }
    wrap_legend(l, kids)
}

/// A legend as wrapped rows within `max_width`, top-left corner at (x, y).
pub fn rows(l: &Legend, x: f64, y: f64, max_width: f64, pal: &Palette, default_color: &str) -> Node {
    let ts = l.size;
    let mut kids = Vec::new();
    let mut top = y;
    if let Some(t) = legend_title(l, x, top, pal) {
        kids.push(t);
        top += ts * text::LINE_HEIGHT;
    }
    if let LegendBody::Gradient { .. } = &l.body {
        kids.extend(gradient(l, x, top, false, pal));
    } else {
        let (pos, _, _) = row_layout(l, max_width);
        let lead = lead(&l.body);
        let rh = row_height(&l.body, ts);
        for (i, s) in labels_of(&l.body).iter().enumerate() {
            let (ix, r) = pos[i];
            let mid = top + rh * r as f64 + rh / 2.0;
            kids.push(symbol(&l.body, i, x + ix + lead / 2.0, mid, pal, default_color));
            let shown = text::fit(s, ts, false, max_width - lead - 6.0);
            let text = label(x + ix + lead + 6.0, mid + ts * text::CAP / 2.0, &shown, Anchor::Start, &pal.text, "strata-legend-label", ts);
            // A label cut to the width keeps its full name in a title.
            kids.push(if shown != *s { Node::Titled { title: s.clone(), children: vec![text] } } else { text });
        }
    }
    wrap_legend(l, kids)
}

fn wrap_legend(l: &Legend, kids: Vec<Node>) -> Node {
    let what = match l.channel {
        Channel::Size => "size",
        Channel::Shape => "shape",
        _ => "colour",
    };
    let label = if l.title.is_empty() { format!("{what} legend") } else { format!("{what} legend: {}", l.title) };
    Node::named_group(format!("strata-legend strata-legend-{}", l.channel), Some("group"), Some(label), kids)
}

// ---------------------------------------------------------------- polar

/// Room polar labels need around the circle: (horizontal, vertical) in px.
#[cfg(feature = "polar")]
pub fn polar_margin(angle_ticks: &[Tick], ts: f64) -> (f64, f64) {
    let widest = widest_label(angle_ticks, ts);
    (widest + LABEL_GAP, ts * text::LINE_HEIGHT + LABEL_GAP)
}

/// Guides of polar coordinates: circles at the radius ticks (labelled along
/// the starting spoke), spokes at the angle ticks, and angle labels just
/// outside the circle.
pub fn polar(coord: &Coord, angle_is_x: bool, angle_ticks: &[Tick], radius_ticks: &[Tick], pal: &Palette, ts: f64) -> Vec<Node> {
    let f = coord.frame();
    let (cx, cy, _) = super::coord::polar_centre(f);
    // Unit coordinates in the coordinate system's (x, y) order.
    let at = |angle: f64, radius: f64| if angle_is_x { coord.point(angle, radius) } else { coord.point(radius, angle) };
    let mut grid = Vec::new();
    for t in radius_ticks {
        if !(0.0..=1.0 + 1e-9).contains(&t.unit) {
            continue;
        }
        // A circle of two SVG arcs; a ring of zero radius draws nothing.
        let (x, y) = at(0.0, t.unit);
        let r = ((x - cx) * (x - cx) + (y - cy) * (y - cy)).sqrt();
        if let Some(d) = super::coord::circle((cx, cy, r), 0.0, r) {
            grid.push(Node::path(d, Paint::stroke(&pal.grid, 1.0), None));
        }
    }
    for t in angle_ticks {
        let (x0, y0) = at(t.unit, 0.0);
        let (x1, y1) = at(t.unit, 1.0);
        grid.push(Node::line(x0, y0, x1, y1, Paint::stroke(&pal.grid, 1.0)));
    }
    let mut labels = Vec::new();
    for t in angle_ticks {
        let (x, y) = at(t.unit, 1.0);
        let (dx, dy) = (x - cx, y - cy);
        let len = (dx * dx + dy * dy).sqrt().max(1e-9);
        let (ux, uy) = (dx / len, dy / len);
        let (lx, ly) = (x + ux * LABEL_GAP, y + uy * LABEL_GAP);
        let anchor = if ux > 0.3 {
            Anchor::Start
        } else if ux < -0.3 {
            Anchor::End
        } else {
            Anchor::Middle
        };
        // Baseline so that the text sits outside the circle above and below.
        let baseline = ly + ts * (0.35 + 0.45 * uy);
        labels.push(label(lx, baseline, &t.label, anchor, &pal.muted, "strata-tick", ts));
    }
    vec![Node::group("strata-grid", grid), Node::named_group("strata-axis strata-axis-polar".into(), None, Some("polar axes".into()), labels)]
}

/// The radius's tick labels along the starting spoke, drawn over the marks
/// on a halo of the background colour so that wedges never hide them.
pub fn polar_radius_labels(coord: &Coord, angle_is_x: bool, radius_ticks: &[Tick], pal: &Palette, ts: f64) -> Option<Node> {
    let at = |angle: f64, radius: f64| if angle_is_x { coord.point(angle, radius) } else { coord.point(radius, angle) };
    let mut kids = Vec::new();
    for t in radius_ticks {
        if !(0.0..=1.0 + 1e-9).contains(&t.unit) || t.unit <= 1e-9 {
            continue;
        }
        let (x, y) = at(0.0, t.unit);
        let (lx, ly) = (x + 3.0, y - 3.0);
        let w = label_width(t, ts);
        // The halo: the label's line box and 2 px around it.
        let (top, h) = (ly - ts * text::ASCENT - 2.0, ts * text::LINE_HEIGHT + 4.0);
        let mut paint = Paint::fill(&pal.background);
        paint.opacity = Some(0.85);
        kids.push(Node::group("strata-halo", vec![Node::Rect { x: lx - 2.0, y: top, width: w + 4.0, height: h, paint, datum: None }]));
        kids.push(label(lx, ly, &t.label, Anchor::Start, &pal.muted, "strata-tick", ts));
    }
    (!kids.is_empty()).then(|| Node::named_group("strata-axis strata-axis-radius".into(), None, Some("radius axis".into()), kids))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::format;

    #[test]
    fn crowded_categories_wrap_then_rotate_then_shorten() {
        let cats: Vec<String> = (0..12).map(|i| format!("Orchard block number {i}")).collect();
        let s = PositionScale::category(cats, 0.1);
        let en = format::english();
        // Wide: every label fits as is.
        let (t, a) = bottom_ticks(&s, 4000.0, 6, None, en, 80.0, TICK_SIZE);
        assert_eq!((t.len(), a), (12, 0.0));
        // Narrower: every label, on two lines (before issue 12, every other label).
        let (t, a) = bottom_ticks(&s, 1500.0, 6, None, en, 80.0, TICK_SIZE);
        assert_eq!((t.len(), a), (12, 0.0));
        assert_eq!(t[10].label, "Orchard block\nnumber 10");
        // Narrow: rotated, and cut to fit the height allowance.
        let (t, a) = bottom_ticks(&s, 400.0, 6, None, en, 60.0, TICK_SIZE);
        assert_eq!(a, ROTATION);
        assert_eq!(t.len(), 12);
        let max_w = 60.0 / crate::math::sin_cos_deg(-ROTATION).0;
        assert!(t.iter().all(|t| text::width(&t.label, TICK_SIZE, false) <= max_w + 1e-9 && t.label.contains('\u{2026}')));
        // Cut at the end they would all read "Orchard bl…"; the shared words go instead.
        assert_eq!(t[3].label, "\u{2026}3");
    }

    #[test]
    fn shortened_labels_stay_apart() {
        let labels: Vec<String> = (1..=3).map(|i| format!("Category number {i} with a long name")).collect();
        let s = shorten_all(&labels, 70.0, TICK_SIZE);
        assert_eq!(s, ["\u{2026}1\u{2026}", "\u{2026}2\u{2026}", "\u{2026}3\u{2026}"]);
        let plain = shorten_all(&["Bramley".to_string(), "Discovery".to_string()], 40.0, TICK_SIZE);
        assert!(plain[0].starts_with("Bra") && plain[1].starts_with("Dis"));
    }

    #[test]
    fn labels_wrap_at_the_space_that_balances_two_lines() {
        // "Saint Ebbe's" / "Landing" is wider on its first line than
        // "Saint" / "Ebbe's Landing"? The split whose longer line is shortest wins.
        let w = |s: &str| text::width(s, TICK_SIZE, false);
        let two = wrap_two("Saint Ebbe's Landing", 80.0, TICK_SIZE).unwrap();
        let (a, b) = two.split_once('\n').unwrap();
        let best = [("Saint", "Ebbe's Landing"), ("Saint Ebbe's", "Landing")].iter().map(|(x, y)| w(x).max(w(y))).fold(f64::INFINITY, f64::min);
        assert_eq!(w(a).max(w(b)), best);
        assert_eq!(wrap_two("Crossmarsh", 80.0, TICK_SIZE).as_deref(), Some("Crossmarsh"));
        // A single word too wide is never cut between letters.
        assert_eq!(wrap_two("Supercalifragilistic", 40.0, TICK_SIZE), None);
    }

    #[test]
    fn unique_prefixes_tell_every_label_apart() {
        let l: Vec<String> = ["Northgate", "Northfield", "Norton", "Ely"].iter().map(|s| s.to_string()).collect();
        let p = unique_prefixes(&l, 45.0, TICK_SIZE).unwrap();
        // Shortest telling prefixes: "Northg", "Northf", "Nort" + "o", "E" (sorted neighbours).
        assert!(p[0].starts_with("Northg") && p[1].starts_with("Northf") && p[2].starts_with("Norto"), "{p:?}");
        assert_eq!(p[3], "Ely");
        let mut d = p.clone();
        d.sort();
        d.dedup();
        assert_eq!(d.len(), 4);
        // Too narrow for "Northg…": no prefix layout.
        assert_eq!(unique_prefixes(&l, 25.0, TICK_SIZE), None);
    }

    #[test]
    fn crowded_numbers_get_fewer_ticks() {
        let s = PositionScale::linear(0.0, 1_000_000.0);
        let en = format::english();
        let (wide, _) = bottom_ticks(&s, 800.0, 10, None, en, 80.0, TICK_SIZE);
        let (narrow, a) = bottom_ticks(&s, 150.0, 10, None, en, 80.0, TICK_SIZE);
        assert!(narrow.len() < wide.len() && a == 0.0);
        assert!(fits_across(&narrow, 150.0, TICK_SIZE));
    }
}
