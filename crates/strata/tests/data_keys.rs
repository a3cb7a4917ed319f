//! The spec's reader keys reach the reader: delimiter, decimal comma and
//! missing-value tokens, for files named `.csv` whatever their delimiter.

use strata::scene::Node;
use strata::{render, DataBytes, RenderOptions};

fn ys(spec: &str, bytes: &[u8]) -> Vec<serde_json::Value> {
    let r = render(spec, Some(DataBytes { bytes, name: "regen.csv" }), &RenderOptions::default()).unwrap_or_else(|e| panic!("{e}"));
    r.scene
        .marks()
        .into_iter()
        .filter_map(|m| match m {
            Node::Rect { datum: Some(d), .. } => d.get("y").cloned(),
            _ => None,
        })
        .collect()
}

const BARS: &str = r#"{"layers":[{"draw":"bar","x":"station","y":"rain"}]"#;

#[test]
fn semicolon_file_named_csv_is_sniffed() {
    // A semicolon-separated file with a decimal point: the .csv name does not force commas.
    let v = ys(&format!("{BARS}}}"), b"station;rain\nA;1.5\nB;2.25\n");
    assert_eq!(v, vec![serde_json::json!(1.5), serde_json::json!(2.25)]);
}

#[test]
fn decimal_comma_and_missing_tokens_from_the_spec() {
    let spec = format!(r#"{BARS},"data":{{"delimiter":";","decimal_comma":true,"missing":["k. A."]}}}}"#);
    let v = ys(&spec, b"station;rain\nA;1,5\nB;k. A.\nC;2,25\n");
    // B is missing, so it draws no bar.
    assert_eq!(v, vec![serde_json::json!(1.5), serde_json::json!(2.25)]);
}

#[test]
fn an_unknown_delimiter_is_a_located_error() {
    let e = strata::parse_spec(&format!(r#"{BARS},"data":{{"delimiter":":"}}}}"#)).unwrap_err();
    assert_eq!(e.0[0].at.path, "data.delimiter");
}

#[test]
fn every_key_is_drawn_without_a_warning() {
    // Panel grids, independent scales, tooltips, and notes in either coordinate system are drawn: no warning.
    let data = Some(DataBytes { bytes: b"station,rain\nA,1\nB,2\n", name: "d.csv" });
    let spec = r#"{"layers":[{"draw":"bar","x":"station","y":"rain","tooltip":["rain"]}],"panels":{"rows":"station","independent":"y"},"notes":[{"x":"A","text":"wet"}]}"#;
    let r = render(spec, data, &RenderOptions::default()).unwrap();
    assert!(r.warnings.is_empty(), "{:?}", r.warnings);
    let spec = r#"{"layers":[{"draw":"bar","x":"station","y":"rain"}],"coords":{"kind":"polar"},"notes":[{"x":"A","text":"wet"}]}"#;
    let r = render(spec, data, &RenderOptions::default()).unwrap();
    assert!(r.warnings.is_empty(), "{:?}", r.warnings);
}

#[test]
fn panel_keys_that_change_nothing_say_so() {
    let data = Some(DataBytes { bytes: b"station,rain\nA,1\nB,2\n", name: "d.csv" });
    let paths = |spec: &str| -> Vec<String> {
        let r = render(spec, data, &RenderOptions::default()).unwrap();
        r.warnings.iter().filter(|w| w.code == "spec.no_effect").map(|w| w.at.path.clone()).collect()
    };
    assert_eq!(paths(r#"{"layers":[{"draw":"bar","x":"station","y":"rain"}],"panels":{"independent":"y"}}"#), vec!["panels"]);
    assert_eq!(paths(r#"{"layers":[{"draw":"bar","x":"station","y":"rain"}],"panels":{"rows":"station","columns":2}}"#), vec!["panels.columns"]);
    assert!(paths(r#"{"layers":[{"draw":"bar","x":"station","y":"rain"}],"panels":{"by":"station","columns":2}}"#).is_empty());
}

#[test]
fn panels_by_a_column_draw_one_plot_each_with_shared_scales() {
    let spec = r#"{"layers":[{"draw":"bar","x":"k","y":"v"}],"panels":{"by":"p","columns":2},"size":{"width":600,"height":400}}"#;
    let csv = b"p,k,v\nleft,a,1\nleft,b,2\nright,a,4\nright,b,8\nlow,a,3\n";
    let r = render(spec, Some(DataBytes { bytes: csv, name: "d.csv" }), &RenderOptions::default()).unwrap();
    let facets: Vec<&Node> = r.scene.children.iter().filter(|n| matches!(n, Node::Group { class, .. } if class == "strata-facet")).collect();
    assert_eq!(facets.len(), 3);
    // Each bar lands in its panel and carries its panel in the datum.
    let bars: Vec<(f64, f64, String, f64)> = r
        .scene
        .marks()
        .into_iter()
        .filter_map(|m| match m {
            Node::Rect { x, height, datum: Some(d), .. } => Some((*x, *height, d["panel"].as_str()?.to_string(), d["y"].as_f64()?)),
            _ => None,
        })
        .collect();
    assert_eq!(bars.len(), 5);
    // Shared y scale: bar height is proportional to the value across panels.
    let per_unit: Vec<f64> = bars.iter().map(|b| b.1 / b.3).collect();
    assert!(per_unit.iter().all(|u| (u - per_unit[0]).abs() < 0.02), "{per_unit:?}");
    // Two columns: "right" sits to the right of "left".
    let left_x = bars.iter().filter(|b| b.2 == "left").map(|b| b.0).fold(f64::MAX, f64::min);
    let right_x = bars.iter().filter(|b| b.2 == "right").map(|b| b.0).fold(f64::MAX, f64::min);
    assert!(right_x > left_x + 200.0, "{left_x} {right_x}");
    assert!(r.warnings.is_empty(), "{:?}", r.warnings);
}

#[test]
fn a_panel_column_that_is_not_there_is_located() {
    let spec = r#"{"layers":[{"draw":"bar","x":"k","y":"v"}],"panels":{"by":"q"}}"#;
    let e = render(spec, Some(DataBytes { bytes: b"p,k,v\na,b,1\n", name: "d.csv" }), &RenderOptions::default()).unwrap_err();
    assert_eq!(e.0[0].at.path, "panels.by");
}

#[test]
fn tooltips_become_hover_titles_and_focusable_marks() {
    let spec = r#"{"layers":[{"draw":"point","x":"a","y":"b","tooltip":["who"]}]}"#;
    let csv = b"a,b,who\n1,2,<Ann & Bo>\n2,3,Cy\n";
    let r = render(spec, Some(DataBytes { bytes: csv, name: "d.csv" }), &RenderOptions::default()).unwrap();
    // One tab stop for the chart (roving tabindex): the first mark, the rest -1.
    assert_eq!(r.svg.matches("tabindex=\"0\"").count(), 1);
    assert_eq!(r.svg.matches("tabindex=\"-1\"").count(), 1);
    assert!(r.svg.find("tabindex=\"0\"") < r.svg.find("tabindex=\"-1\""));
    assert!(r.svg.contains("<title>x: 1, y: 2, who: &lt;Ann &amp; Bo&gt;</title></circle>"), "{}", r.svg);
    assert!(r.svg.contains("aria-label=\"x: 2, y: 3, who: Cy\""));
    // The scene lists the tooltip values with each mark.
    let m = r.scene.marks();
    let Node::Circle { datum: Some(d), .. } = m[1] else { panic!() };
    assert_eq!(d["tooltip"]["who"], "Cy");
    // A tooltip column that is not there is located.
    let e = render(
        r#"{"layers":[{"draw":"point","x":"a","y":"b","tooltip":["a","whom"]}]}"#,
        Some(DataBytes { bytes: csv, name: "d.csv" }),
        &RenderOptions::default(),
    )
    .unwrap_err();
    assert_eq!(e.0[0].at.path, "layers[0].tooltip[1]");
}

#[test]
fn notes_mark_data_positions() {
    // A reference line at x = 2, a shaded span over categories-free y 3..5,
    // and a text at the point (3, 6): each lands where the scales put data.
    let spec = r#"{"layers":[{"draw":"point","x":"a","y":"b"}],
        "notes":[{"x":2,"text":"change"},{"y":3,"y_end":5,"text":"target band"},{"x":3,"y":6,"text":"peak"}],
        "size":{"width":600,"height":400}}"#;
    let csv = b"a,b\n1,2\n2,4\n3,6\n";
    let r = render(spec, Some(DataBytes { bytes: csv, name: "d.csv" }), &RenderOptions::default()).unwrap();
    let pts: Vec<(f64, f64)> = r
        .scene
        .marks()
        .into_iter()
        .filter_map(|m| match m {
            Node::Circle { cx, cy, datum: Some(_), .. } => Some((*cx, *cy)),
            _ => None,
        })
        .collect();
    fn walk<'a>(n: &'a Node, out: &mut Vec<&'a Node>) {
        match n {
            Node::Group { class, children, .. } if class == "strata-notes" => out.extend(children.iter()),
            Node::Group { children, .. } => children.iter().for_each(|c| walk(c, out)),
            _ => {}
        }
    }
    let mut notes = Vec::new();
    r.scene.children.iter().for_each(|c| walk(c, &mut notes));
    let line = notes
        .iter()
        .find_map(|n| match n {
            Node::Line { x1, x2, .. } => Some((*x1, *x2)),
            _ => None,
        })
        .unwrap();
    assert!((line.0 - pts[1].0).abs() < 1e-9 && (line.1 - pts[1].0).abs() < 1e-9, "line at x = 2: {line:?} vs {:?}", pts[1]);
    let band = notes
        .iter()
        .find_map(|n| match n {
            Node::Rect { y, height, .. } => Some((*y, *y + *height)),
            _ => None,
        })
        .unwrap();
    // y = 4 (the second point) lies inside the 3..5 band, y = 2 and 6 outside.
    assert!(band.0 < pts[1].1 && pts[1].1 < band.1);
    assert!(pts[0].1 > band.1 && pts[2].1 < band.0);
    let dot = notes
        .iter()
        .find_map(|n| match n {
            Node::Circle { cx, cy, .. } => Some((*cx, *cy)),
            _ => None,
        })
        .unwrap();
    assert!((dot.0 - pts[2].0).abs() < 1e-9 && (dot.1 - pts[2].1).abs() < 1e-9);
    let words: Vec<&str> = notes
        .iter()
        .filter_map(|n| match n {
            Node::Text { text, .. } => Some(text.as_str()),
            _ => None,
        })
        .collect();
    assert_eq!(words, vec!["change", "target band", "peak"]);
}
