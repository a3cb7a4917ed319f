//! Issue 12, items 3, 4, 5, 6 and 8: bars on numeric and time axes, stacked
//! values, bar orientation, the zero line and time domains. Invented data.

use serde_json::Value;
use strata::scene::SceneOptions;
use strata::{render, RenderOptions};

fn draw(spec: &str) -> strata::Rendered {
    render(spec, None, &RenderOptions { scene: SceneOptions { width: 640.0 } }).unwrap()
}

/// Every node of the scene as JSON, depth first, with the class of the group it is in.
fn nodes(r: &strata::Rendered) -> Vec<(String, Value)> {
    fn walk(n: &Value, class: &str, out: &mut Vec<(String, Value)>) {
        if n["type"] == "group" {
            let c = n["class"].as_str().unwrap_or("").to_string();
            for k in n["children"].as_array().unwrap() {
                walk(k, &c, out);
            }
        } else {
            out.push((class.to_string(), n.clone()));
        }
    }
    let s = serde_json::to_value(&r.scene).unwrap();
    let mut out = Vec::new();
    for c in s["children"].as_array().unwrap() {
        walk(c, "", &mut out);
    }
    out
}

fn rects(r: &strata::Rendered) -> Vec<(f64, f64, f64, f64, Value)> {
    nodes(r)
        .into_iter()
        .filter(|(_, n)| n["type"] == "rect" && n.get("datum").is_some())
        .map(|(_, n)| (n["x"].as_f64().unwrap(), n["y"].as_f64().unwrap(), n["width"].as_f64().unwrap(), n["height"].as_f64().unwrap(), n["datum"].clone()))
        .collect()
}

/// The frame's left and right ends: where the horizontal axis line runs.
fn frame_x(r: &strata::Rendered) -> (f64, f64) {
    let (_, l) = nodes(r).into_iter().find(|(c, n)| c.contains("strata-axis-bottom") && n["type"] == "line").unwrap();
    (l["x1"].as_f64().unwrap(), l["x2"].as_f64().unwrap())
}

#[test]
fn bars_on_numbers_are_as_wide_as_the_data_allows_and_whole() {
    // Item 3: ten yearly bars at 640 px were 6 px slivers, the first and last half outside the frame.
    let rows: Vec<String> = (0..10).map(|i| format!(r#"{{"season": {}, "catch": {}}}"#, 2011 + i, 20 + (i * 7) % 13)).collect();
    let spec = format!(r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "bar", "x": "season", "y": "catch" }} ] }}"#, rows.join(","));
    let r = draw(&spec);
    let bars = rects(&r);
    assert_eq!(bars.len(), 10);
    let (left, right) = frame_x(&r);
    // A bar is the data's resolution (1 year) times the share (0.8): neighbouring
    // centres are one year apart, so width / spacing is the share.
    let spacing = (bars[1].0 + bars[1].2 / 2.0) - (bars[0].0 + bars[0].2 / 2.0);
    for b in &bars {
        assert!((b.2 / spacing - 0.8).abs() < 1e-6, "width {} against spacing {spacing}", b.2);
        assert!(b.0 >= left - 1e-6 && b.0 + b.2 <= right + 1e-6, "bar {b:?} outside {left}..{right}");
    }
    assert!(bars[0].2 > 30.0, "{}", bars[0].2);
    // `style.share` sets the share.
    let r = draw(&spec.replace(r#""y": "catch""#, r#""y": "catch", "style": { "share": 0.5 }"#));
    let bars = rects(&r);
    let spacing = bars[1].0 - bars[0].0;
    assert!((bars[0].2 / spacing - 0.5).abs() < 1e-6);
}

#[test]
fn bars_on_dates_are_whole_too() {
    let rows: Vec<String> = (1..=12).map(|m| format!(r#"{{"month": "2023-{m:02}-01", "rain": {}}}"#, 30 + m * 3)).collect();
    let spec = format!(
        r#"{{ "data": {{ "rows": [{}], "types": {{"month": "date"}} }}, "layers": [ {{ "draw": "bar", "x": "month", "y": "rain" }} ] }}"#,
        rows.join(",")
    );
    let r = draw(&spec);
    let bars = rects(&r);
    let (left, right) = frame_x(&r);
    assert_eq!(bars.len(), 12);
    for b in &bars {
        assert!(b.2 > 20.0, "sliver {b:?}");
        assert!(b.0 >= left - 1e-6 && b.0 + b.2 <= right + 1e-6, "bar {b:?} outside {left}..{right}");
    }
    // Never overlapping: the shortest month (28 days) sets the width.
    for w in bars.windows(2) {
        assert!(w[0].0 + w[0].2 <= w[1].0 + 1e-6);
    }
}

#[test]
fn stacked_marks_report_their_own_values() {
    // Item 4: a stacked "Disagree" read as the running total.
    let spec = r#"{ "data": { "rows": [
        {"q": "Q1", "answer": "Agree", "n": 30}, {"q": "Q1", "answer": "Neutral", "n": 50}, {"q": "Q1", "answer": "Disagree", "n": 20},
        {"q": "Q2", "answer": "Agree", "n": 10}, {"q": "Q2", "answer": "Neutral", "n": 25}, {"q": "Q2", "answer": "Disagree", "n": 65} ] },
      "layers": [ { "draw": "bar", "x": "q", "y": "n", "color": "answer", "arrange": "stack" } ] }"#;
    let r = draw(spec);
    let bars = rects(&r);
    let own: Vec<f64> = bars.iter().map(|b| b.4["y"].as_f64().unwrap()).collect();
    assert_eq!(own, [30.0, 50.0, 20.0, 10.0, 25.0, 65.0]);
    // The total of the stack rides along.
    assert!(bars.iter().all(|b| b.4["total"].as_f64() == Some(100.0)), "{bars:?}");
    assert!(r.svg.contains("aria-label=\"x: Q1, y: 20, color: Disagree, total: 100\""), "{}", r.svg);
    assert!(!r.svg.contains("y: 100,"), "a cumulative top is reported");
    // The data table lists own values, not running totals (30, 80, 100).
    assert!(r.table.contains("<td class=\"strata-num\">20</td>") && !r.table.contains("<td class=\"strata-num\">80</td>"), "{}", r.table);
    // Heights still pile up: the Q1 stack spans the same pixels as a 100 bar.
    let q1: f64 = bars[..3].iter().map(|b| b.3).sum();
    let q2: f64 = bars[3..].iter().map(|b| b.3).sum();
    assert!((q1 - q2).abs() < 1e-6);

    // Proportion: each segment's own share.
    let r = draw(&spec.replace("\"stack\"", "\"proportion\""));
    let shares: Vec<f64> = rects(&r).iter().map(|b| b.4["y"].as_f64().unwrap()).collect();
    assert_eq!(shares, [0.3, 0.5, 0.2, 0.1, 0.25, 0.65]);
}

#[test]
fn categories_on_y_give_horizontal_bars_top_down() {
    // Item 5: a text y and a numeric x drew vertical hairlines.
    let spec = include_str!("../../../tests/golden/specs/diverging.json");
    let r = draw(spec);
    let bars = rects(&r);
    assert_eq!(bars.len(), 5);
    // Horizontal: all one height, thick; lengths follow the values.
    for b in &bars {
        assert!((b.3 - bars[0].3).abs() < 1e-6 && b.3 > 20.0, "{b:?}");
    }
    let len = |k: usize| bars[k].2;
    // Quayside -12.5 and Fennel Hill 15: lengths in proportion.
    assert!((len(0) / len(3) - 12.5 / 15.0).abs() < 1e-6, "{bars:?}");
    // Reading order: the first row on top, then down.
    let names: Vec<&str> = bars.iter().map(|b| b.4["y"].as_str().unwrap()).collect();
    assert_eq!(names, ["Quayside", "Millbrook", "Old Town", "Fennel Hill", "Riverside"]);
    assert!(bars.windows(2).all(|w| w[0].1 < w[1].1), "{bars:?}");
    // Its datum keeps the spec's channel names: x is the value.
    assert_eq!(bars[0].4["x"].as_f64(), Some(-12.5));

    // Summaries turn too (they were refused).
    let summary = r#"{ "data": { "rows": [ {"who": "Ana", "t": 3}, {"who": "Ana", "t": 5}, {"who": "Bo", "t": 10}, {"who": "Cy", "t": 7} ] },
        "layers": [ { "draw": "bar", "x": "t", "y": "who", "stat": { "summary": "mean" } } ] }"#;
    let r = draw(summary);
    let bars = rects(&r);
    assert_eq!(bars.len(), 3);
    assert!(bars.iter().all(|b| (b.3 - bars[0].3).abs() < 1e-6));
    assert_eq!(bars[0].4["x"].as_f64(), Some(4.0));
    assert_eq!(bars[0].4["y"].as_str(), Some("Ana"));
    assert!(bars[0].1 < bars[1].1 && bars[1].1 < bars[2].1);
}

#[test]
fn categories_on_any_y_axis_run_top_down() {
    let spec = r#"{ "data": { "rows": [ {"who": "First", "t": 3}, {"who": "Second", "t": 5}, {"who": "Third", "t": 1} ] },
        "layers": [ { "draw": "point", "x": "t", "y": "who" } ] }"#;
    let r = draw(spec);
    let ys: Vec<f64> =
        nodes(&r).into_iter().filter(|(_, n)| n["type"] == "circle" && n.get("datum").is_some()).map(|(_, n)| n["cy"].as_f64().unwrap()).collect();
    assert_eq!(ys.len(), 3);
    assert!(ys[0] < ys[1] && ys[1] < ys[2], "{ys:?}");
}

#[test]
fn a_value_axis_across_zero_draws_a_stronger_zero_line() {
    // Item 6: a diverging bar chart gets a zero line, stronger than the grid.
    let r = draw(include_str!("../../../tests/golden/specs/diverging.json"));
    let all = nodes(&r);
    let zero: Vec<&Value> = all.iter().filter(|(c, _)| c == "strata-zero").map(|(_, n)| n).collect();
    assert_eq!(zero.len(), 1, "no zero line");
    let z = zero[0];
    // Vertical, at the x of zero: between Quayside's bar (ends at 0) and Millbrook's (starts at 0).
    assert_eq!(z["x1"], z["x2"]);
    let bars = rects(&r);
    let at_zero = bars[0].0 + bars[0].2;
    assert!((z["x1"].as_f64().unwrap() - at_zero).abs() < 1e-6 && (bars[1].0 - at_zero).abs() < 1e-6);
    let grid_w = all.iter().filter(|(c, _)| c == "strata-grid").map(|(_, n)| n["stroke_width"].as_f64().unwrap()).fold(0.0, f64::max);
    assert!(z["stroke_width"].as_f64().unwrap() >= 1.5 && z["stroke_width"].as_f64().unwrap() > grid_w, "{z} vs grid {grid_w}");
}

#[test]
fn time_domains_are_not_rounded_out() {
    // Item 8: 1958-2001 was drawn on 1950-2010.
    let rows: Vec<String> = (1958..=2001).map(|y| format!(r#"{{"day": "{y}-06-15", "level": {}}}"#, 300 + (y - 1958) * 2)).collect();
    let spec = format!(
        r#"{{ "data": {{ "rows": [{}], "types": {{"day": "date"}} }}, "layers": [ {{ "draw": "line", "x": "day", "y": "level" }} ] }}"#,
        rows.join(",")
    );
    let r = draw(&spec);
    let (left, right) = frame_x(&r);
    let (_, line) = nodes(&r).into_iter().find(|(c, n)| c.contains("strata-line") && n["type"] == "path").unwrap();
    let d = line["d"].as_array().unwrap();
    let first = d[0][1].as_f64().unwrap();
    let last = d[d.len() - 1][1].as_f64().unwrap();
    assert!((first - left).abs() < 1e-6 && (last - right).abs() < 1e-6, "line {first}..{last} in frame {left}..{right}");
    // `nice: true` still rounds out on request.
    let r = draw(&spec.replace(r#""layers""#, r#""scales": { "x": { "nice": true } }, "layers""#));
    let (left, _) = frame_x(&r);
    let (_, line) = nodes(&r).into_iter().find(|(c, n)| c.contains("strata-line") && n["type"] == "path").unwrap();
    assert!(line["d"][0][1].as_f64().unwrap() > left + 1.0);
}

#[test]
fn cells_on_numbers_tile_the_plot() {
    // A heat map of months by year (a wide table unpivoted, years as numbers):
    // the cells had no height on the numeric year axis and nothing was drawn
    // (user trial on statsmodels' elnino table). Each cell now spans the
    // data's resolution: one year tall, one category wide, with no gaps.
    let mut rows = Vec::new();
    for year in 2001..2011 {
        for (k, m) in ["Jan", "Feb", "Mar", "Apr"].iter().enumerate() {
            rows.push(format!(r#"{{"year": {year}, "month": "{m}", "t": {}}}"#, 20 + (year * 3 + k as i32) % 7));
        }
    }
    let spec = format!(r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "cell", "x": "month", "y": "year", "color": "t" }} ] }}"#, rows.join(","));
    let cells = rects(&draw(&spec));
    assert_eq!(cells.len(), 40);
    let h = cells[0].3;
    assert!(h > 10.0, "cells have a height: {h}");
    for c in &cells {
        assert!((c.3 - h).abs() < 1e-6, "one year tall: {} against {h}", c.3);
    }
    // Rows of one month stack without gaps or overlaps: sorted by y, each
    // starts where the one before ended.
    let mut jan: Vec<(f64, f64)> = cells.iter().filter(|c| c.4["x"] == "Jan").map(|c| (c.1, c.3)).collect();
    jan.sort_by(|a, b| a.0.total_cmp(&b.0));
    assert_eq!(jan.len(), 10);
    for w in jan.windows(2) {
        assert!((w[0].0 + w[0].1 - w[1].0).abs() < 1e-6, "{w:?}");
    }
}
