//! Stage 5b — the plan as an HTML data table: the numbers behind the marks,
//! for screen-reader users (a table can be walked cell by cell, which a
//! picture cannot) and for anyone who wants the values.
//!
//! Hand-off: HTML text, a `<details>` disclosure holding one `<table>` per
//! layer (layers with the same rows as an earlier one are left out). Every
//! text is escaped; nothing in it runs. The element puts it after the chart
//! and `strata bake` writes the same bytes into pages.
//!
//! Rows are the layer's rows after its statistic: a histogram lists its bins,
//! a summary its groups. Past [`MAX_ROWS`] rows a layer lists its first rows
//! and says how many there are.

use crate::channel::Channel;
use crate::format::{self, Locale};
use crate::plan::{LayerData, Plan, PlannedLayer, Values};
use crate::spec::{DataTable, Spec};
use crate::svg::escape;

/// Rows listed per layer.
pub const MAX_ROWS: usize = 500;

/// Header words for the channels statistics add (common practice names).
fn added_name(ch: Channel, d: &LayerData) -> String {
    let of = |c: Channel| d.names.get(&c).cloned().unwrap_or_else(|| c.name().to_string());
    match ch {
        Channel::XEnd => format!("{} (end)", of(Channel::X)),
        Channel::YEnd => format!("{} (end)", of(Channel::Y)),
        Channel::YLow => "lower bound".into(),
        Channel::YHigh => "upper bound".into(),
        Channel::BinStart => "bin start".into(),
        Channel::BinEnd => "bin end".into(),
        Channel::Q1 => "lower quartile".into(),
        Channel::Q3 => "upper quartile".into(),
        other => other.name().replace('_', " "),
    }
}

fn cell(v: &Values, i: usize, pattern: Option<&str>, loc: &Locale) -> (String, bool) {
    match v {
        Values::Num(n) => match n.get(i) {
            Some(x) => (pattern.map(|p| format::number(x, p, loc)).unwrap_or_else(|| format::value_label_in(x, loc)), true),
            None => (String::new(), true),
        },
        Values::Time(n) => match n.get(i) {
            Some(ms) => {
                let whole_day = ms.rem_euclid(86_400_000.0) == 0.0;
                let p = pattern.unwrap_or(if whole_day { "yyyy-MM-dd" } else { "yyyy-MM-dd HH:mm" });
                (format::date(ms, p, loc), false)
            }
            None => (String::new(), false),
        },
        Values::Text(t) => (t[i].clone().unwrap_or_default(), false),
    }
}

/// One header cell.
fn th(out: &mut String, name: &str) {
    out.push_str("<th scope=\"col\">");
    out.push_str(&escape(name));
    out.push_str("</th>");
}

/// One body cell: row `i` of `v`, numbers marked for right alignment.
fn td(out: &mut String, v: &Values, i: usize, pattern: Option<&str>, loc: &Locale) {
    let (text, num) = cell(v, i, pattern, loc);
    out.push_str(if num { "<td class=\"strata-num\">" } else { "<td>" });
    out.push_str(&escape(&text));
    out.push_str("</td>");
}

/// A base map (a `region` layer without `key`) has no rows of its own: its
/// table lists the shapes, by the `shapes.key` property, and by their
/// `name` property when they have one.
fn shape_table(spec: &Spec, plan: &Plan, l: &PlannedLayer, out: &mut String) -> bool {
    // (Without the `maps` feature a plan has no map: this is left out.)
    let Some(m) = plan.map.as_ref().filter(|_| cfg!(feature = "maps")) else { return false };
    if l.geometry != crate::spec::Geometry::Region || l.data.get(Channel::Key).is_some() {
        return false;
    }
    let loc = plan.scales.locale;
    let key = spec.shapes.as_ref().and_then(|s| s.key.clone());
    let text = |v: &serde_json::Value| match v {
        serde_json::Value::String(s) => s.clone(),
        serde_json::Value::Number(n) => n.as_f64().map(|x| format::value_label_in(x, loc)).unwrap_or_default(),
        serde_json::Value::Null => String::new(),
        other => crate::json::to_string(other),
    };
    let named = key.as_deref() != Some("name") && m.features.iter().any(|f| f.properties.contains_key("name"));
    let n = m.features.len();
    let shown = n.min(MAX_ROWS);
    let rows = if n == 1 { "1 shape".to_string() } else { format!("{} shapes", format::value_label_in(n as f64, loc)) };
    let more = if n > shown { format!(", the first {} shown", format::value_label_in(shown as f64, loc)) } else { String::new() };
    out.push_str(&format!("<table><caption>Layer {}: region, base map ({rows}{more})</caption><thead><tr>", l.index + 1));
    th(out, key.as_deref().unwrap_or("shape"));
    if named {
        out.push_str("<th scope=\"col\">name</th>");
    }
    out.push_str("</tr></thead><tbody>");
    for f in &m.features[..shown] {
        let k = match &key {
            Some(_) => f.key.clone().unwrap_or_default(),
            None => format!("shape {}", f.index + 1),
        };
        out.push_str(&format!("<tr><td>{}</td>", escape(&k)));
        if named {
            out.push_str(&format!("<td>{}</td>", escape(&f.properties.get("name").map(text).unwrap_or_default())));
        }
        out.push_str("</tr>");
    }
    out.push_str("</tbody></table>");
    true
}

fn layer_table(spec: &Spec, plan: &Plan, l: &PlannedLayer, out: &mut String) {
    if shape_table(spec, plan, l, out) {
        return;
    }
    let d = &l.data;
    let loc = plan.scales.locale;
    let boxes = l.geometry == crate::spec::Geometry::Box;
    let header = |ch: Channel| {
        let (of, suffix) = match (ch, d.get(Channel::XEnd).is_some()) {
            // A box row spans its whiskers; an outlier row holds one value in y.
            (Channel::Y, _) if boxes => return "lower whisker or outlier".to_string(),
            (Channel::YEnd, _) if boxes => return "upper whisker".to_string(),
            // A range along x (bins, tiles): "from" and "to" read better than a bare start.
            (Channel::X, true) => (Channel::X, " from"),
            (Channel::XEnd, true) => (Channel::X, " to"),
            // A proportion's y is the row's share of its stack.
            (Channel::Y, _) if l.arrange == crate::spec::Arrange::Proportion && d.get(Channel::YTop).is_some() => (Channel::Y, " (share)"),
            (Channel::Total, _) => (Channel::Y, " (total)"),
            _ => return d.names.get(&ch).cloned().unwrap_or_else(|| added_name(ch, d)),
        };
        let mut name = d.names.get(&of).cloned().unwrap_or_else(|| of.name().to_string());
        name.push_str(suffix);
        name
    };
    let mut cols: Vec<(String, Channel, &Values)> = Vec::new();
    for (&k, v) in &d.channels {
        let name = header(k);
        // Statistics keep some numbers twice (a histogram's height is its count).
        if k.is_drawing_aid() || v.len() != d.len || cols.iter().any(|(n, _, w)| *n == name && *w == v) {
            continue;
        }
        cols.push((name, k, v));
    }
    let mut tips: Vec<&(String, Values)> = Vec::new();
    for t in &d.tooltips {
        if t.1.len() == d.len && !d.names.values().any(|n| *n == t.0) {
            tips.push(t);
        }
    }
    let shown = d.len.min(MAX_ROWS);
    let rows = if d.len == 1 { "1 row".to_string() } else { format!("{} rows", format::value_label_in(d.len as f64, loc)) };
    let more = if d.len > shown { format!(", the first {} shown", format::value_label_in(shown as f64, loc)) } else { String::new() };
    out.push_str(&format!("<table><caption>Layer {}: {} ({rows}{more})</caption><thead><tr>", l.index + 1, escape(l.geometry.word())));
    for (name, _, _) in &cols {
        th(out, name);
    }
    for (c, _) in &tips {
        th(out, c);
    }
    out.push_str("</tr></thead><tbody>");
    // A turned layer's x is the spec's y (`PlannedLayer::turned`).
    let (xs, ys) = if l.turned { (Channel::Y, Channel::X) } else { (Channel::X, Channel::Y) };
    let proportion = l.arrange == crate::spec::Arrange::Proportion;
    let pattern = |ch: Channel| match ch {
        Channel::X | Channel::XEnd => spec.scales.get(&xs).and_then(|s| s.format.as_deref()),
        // A proportion's total is in the data's units, not the axis's shares.
        Channel::Total if proportion => None,
        Channel::Y | Channel::YEnd | Channel::YLow | Channel::YHigh | Channel::Total => spec.scales.get(&ys).and_then(|s| s.format.as_deref()),
        _ => None,
    };
    // Whole-number years print without grouping (see `plan::is_year_column`).
    let mut patterns: Vec<Option<&str>> = Vec::with_capacity(cols.len());
    for (_, ch, v) in &cols {
        let year = d.names.get(ch).is_some_and(|n| crate::plan::is_year_column(n, v));
        patterns.push(pattern(*ch).or(year.then_some(crate::plan::YEAR_PATTERN)));
    }
    for i in 0..shown {
        out.push_str("<tr>");
        for ((_, _, v), p) in cols.iter().zip(&patterns) {
            td(out, v, i, *p, loc);
        }
        for (c, v) in &tips {
            td(out, v, i, crate::plan::is_year_column(c, v).then_some(crate::plan::YEAR_PATTERN), loc);
        }
        out.push_str("</tr>");
    }
    out.push_str("</tbody></table>");
}

/// The data table for a chart, or an empty string when the spec asks for none.
pub fn write(spec: &Spec, plan: &Plan) -> String {
    if spec.data_table == DataTable::None {
        return String::new();
    }
    let open = if spec.data_table == DataTable::Open { " open" } else { "" };
    let what = spec.title.as_deref().map(|t| format!(": {t}")).unwrap_or_default();
    let mut out = format!("<details class=\"strata-data\"{open}><summary>Data table{}</summary>", escape(&what));
    for (k, l) in plan.layers.iter().enumerate() {
        let base_map = |e: &PlannedLayer| {
            cfg!(feature = "maps") && plan.map.is_some() && e.geometry == crate::spec::Geometry::Region && e.data.get(Channel::Key).is_none()
        };
        if plan.layers[..k].iter().any(|e| e.data == l.data && base_map(e) == base_map(l)) {
            continue;
        }
        layer_table(spec, plan, l, &mut out);
    }
    out.push_str("</details>");
    out
}

#[cfg(test)]
mod tests {
    use crate::{render, RenderOptions};

    fn table(spec: &str) -> String {
        render(spec, None, &RenderOptions::default()).unwrap().table
    }

    #[test]
    fn a_histogram_lists_its_bins() {
        // Six values 1..6 in bins of width 2 from 0: [0,2) [2,4) [4,6] hold
        // 1, 2 and 3 values (left-closed, last bin closed: common practice).
        let t = table(
            r#"{ "title": "Sizes <b>", "data": { "rows": [ {"v": 1}, {"v": 2}, {"v": 3}, {"v": 4}, {"v": 5}, {"v": 6} ] },
            "layers": [ { "draw": "bar", "x": "v", "stat": { "bin": { "width": 2, "boundary": 0 } } } ] }"#,
        );
        assert!(t.starts_with("<details class=\"strata-data\"><summary>Data table: Sizes &lt;b&gt;</summary>"), "{t}");
        assert!(t.contains("<caption>Layer 1: bar (3 rows)</caption>"), "{t}");
        assert!(t.contains("<thead><tr><th scope=\"col\">v from</th><th scope=\"col\">v to</th><th scope=\"col\">count</th></tr></thead>"), "{t}");
        let num = |s: &str| format!("<td class=\"strata-num\">{s}</td>");
        for (from, to, count) in [("0", "2", "1"), ("2", "4", "2"), ("4", "6", "3")] {
            assert!(t.contains(&format!("<tr>{}{}{}</tr>", num(from), num(to), num(count))), "{from}-{to}: {t}");
        }
    }

    #[test]
    fn text_is_escaped_and_rows_capped() {
        let rows: Vec<String> = (0..600).map(|i| format!(r#"{{"x": {i}, "y": {i}, "who": "<img src=x onerror=alert(1)>"}}"#)).collect();
        let spec = format!(r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "point", "x": "x", "y": "y", "tooltip": ["who"] }} ] }}"#, rows.join(","));
        let t = table(&spec);
        assert!(!t.contains("<img"), "markup from data must be text");
        assert!(t.contains("&lt;img src=x onerror=alert(1)&gt;"));
        assert!(t.contains("(600 rows, the first 500 shown)"), "{}", &t[..300]);
        assert_eq!(t.matches("<tr>").count(), 501);
    }

    // A base map (a region layer without `key`) lists its shapes: the
    // `shapes.key` property and the `name` property beside it.
    #[test]
    fn a_base_map_lists_its_shapes() {
        let t = table(
            r#"{ "shapes": { "key": "code", "features": [
                {"type": "Feature", "properties": {"code": "A1", "name": "North <End>"}, "geometry": {"type": "Point", "coordinates": [1, 2]}},
                {"type": "Feature", "properties": {"code": 7}, "geometry": {"type": "Point", "coordinates": [3, 4]}} ] },
              "layers": [ { "draw": "region" } ] }"#,
        );
        assert!(t.contains("<caption>Layer 1: region, base map (2 shapes)</caption>"), "{t}");
        assert!(t.contains("<thead><tr><th scope=\"col\">code</th><th scope=\"col\">name</th></tr></thead>"), "{t}");
        assert!(t.contains("<tr><td>A1</td><td>North &lt;End&gt;</td></tr><tr><td>7</td><td></td></tr>"), "{t}");
    }

    #[test]
    fn none_writes_nothing_and_repeated_layers_are_listed_once() {
        let base = r#""data": { "rows": [ {"x": 1, "y": 2}, {"x": 2, "y": 5} ] },
            "layers": [ { "draw": "line", "x": "x", "y": "y" }, { "draw": "point", "x": "x", "y": "y" } ]"#;
        assert_eq!(table(&format!("{{ {base}, \"data_table\": \"none\" }}")), "");
        let t = table(&format!("{{ {base}, \"data_table\": \"open\" }}"));
        assert!(t.starts_with("<details class=\"strata-data\" open>"));
        assert_eq!(t.matches("<table>").count(), 1, "{t}");
    }
}
