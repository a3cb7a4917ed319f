//! Category labels are never dropped while a layout keeps them (issue 12,
//! item 2): crowded labels wrap on two lines, rotate, or shorten to a
//! prefix that tells them apart, with the full name in a `<title>` the
//! reader can hover. The cases are invented data written here; the last
//! test renders every gallery chart at a phone and a desktop width and
//! checks that every category an axis or legend stands for is named
//! (a series named at its line end counts, in place of its legend entry).

use std::path::{Path, PathBuf};
use strata::plan::{ColorScale, PanelPlans, Plan};
use strata::scale::PositionScale;
use strata::scene::{Node, Scene, SceneOptions};
use strata::{render, DataBytes, RenderOptions};

fn at_width(width: f64) -> RenderOptions {
    RenderOptions { scene: SceneOptions { width } }
}

/// How a label reads to a reader: its lines joined by a space, or the
/// full name of a shortened label (its `<title>`).
fn readings(n: &Node, out: &mut Vec<String>) {
    match n {
        Node::Text { text, class, .. } if class == "strata-tick" || class == "strata-legend-label" || class.contains("strata-end-label") => {
            out.push(text.clone())
        }
        Node::Titled { title, children } => {
            out.push(title.clone());
            children.iter().for_each(|c| readings(c, out));
        }
        Node::Group { class, children, .. } if class == "strata-tick-lines" => {
            let words: Vec<&str> = children.iter().filter_map(|c| if let Node::Text { text, .. } = c { Some(text.as_str()) } else { None }).collect();
            out.push(words.join(" "));
        }
        Node::Group { children, .. } => children.iter().for_each(|c| readings(c, out)),
        _ => {}
    }
}

fn named(scene: &Scene) -> Vec<String> {
    let mut out = Vec::new();
    scene.children.iter().for_each(|c| readings(c, &mut out));
    out
}

/// Category names on the horizontal axis, as drawn (one entry a label).
fn bottom_labels(scene: &Scene) -> Vec<String> {
    fn walk(n: &Node, out: &mut Vec<Vec<String>>) {
        if let Node::Group { class, children, .. } = n {
            if class.contains("strata-axis-bottom") {
                let mut v = Vec::new();
                children.iter().for_each(|c| readings(c, &mut v));
                out.push(v);
            } else {
                children.iter().for_each(|c| walk(c, out));
            }
        }
    }
    let mut axes = Vec::new();
    scene.children.iter().for_each(|c| walk(c, &mut axes));
    axes.into_iter().flatten().collect()
}

const CITIES: [&str; 8] =
    ["Port Aldermere", "North Quillsby", "Little Harrowgate", "Saint Ebbe's Landing", "Crossmarsh", "East Tamsin", "Wrenfield Junction", "Upper Colbeck"];

fn city_spec(extra: &str) -> String {
    let rows: Vec<String> = CITIES.iter().enumerate().map(|(i, c)| format!(r#"{{"city": "{c}", "v": {}}}"#, (i * 7) % 10 + 1)).collect();
    format!(r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "bar", "x": "city", "y": "v" }} ] {extra} }}"#, rows.join(", "))
}

#[test]
fn eight_city_names_at_480_px_are_all_named() {
    // Before: four of the eight names were drawn (every other one).
    let r = render(&city_spec(""), None, &at_width(480.0)).unwrap();
    let labels = bottom_labels(&r.scene);
    for c in CITIES {
        assert!(labels.iter().any(|l| l == c), "{c} is not named: {labels:?}");
    }
}

#[test]
fn a_long_list_down_the_side_is_all_named_on_a_phone() {
    // 45 districts as horizontal bars at 360 px. Before: the chart kept its
    // aspect and named every third district; it now grows taller.
    let rows: Vec<String> = (0..45).map(|i| format!(r#"{{"district": "District {i:02}", "v": {}}}"#, (i * 37) % 90 + 5)).collect();
    let spec = format!(r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "bar", "x": "v", "y": "district" }} ] }}"#, rows.join(","));
    let r = render(&spec, None, &at_width(360.0)).unwrap();
    let shown = named(&r.scene);
    let missing: Vec<String> = (0..45).map(|i| format!("District {i:02}")).filter(|d| !shown.contains(d)).collect();
    assert!(missing.is_empty(), "not named: {missing:?}");
    assert!(r.scene.height > 360.0 * 1.5, "the chart grew: {}", r.scene.height);
    // A height in the spec is kept (and then labels thin as before).
    let fixed = spec.replacen("\"layers\"", "\"size\": { \"height\": 300 }, \"layers\"", 1);
    assert_eq!(render(&fixed, None, &at_width(360.0)).unwrap().scene.height, 300.0);
}

#[test]
fn three_categories_in_wrapped_panels_keep_the_middle_label() {
    let mut rows = Vec::new();
    for p in ["Ashby", "Brill", "Corran", "Dunmore"] {
        for (k, c) in ["Morning shift", "Afternoon shift", "Night shift"].iter().enumerate() {
            rows.push(format!(r#"{{"depot": "{p}", "shift": "{c}", "n": {}}}"#, k + 2));
        }
    }
    let spec = format!(
        r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "bar", "x": "shift", "y": "n" }} ], "panels": {{ "by": "depot", "columns": 4 }} }}"#,
        rows.join(", ")
    );
    let r = render(&spec, None, &at_width(640.0)).unwrap();
    let labels = bottom_labels(&r.scene);
    for c in ["Morning shift", "Afternoon shift", "Night shift"] {
        assert!(labels.iter().any(|l| l == c), "{c} is not named: {labels:?}");
    }
}

#[test]
fn rotated_labels_are_not_thinned_when_every_one_fits() {
    // Sixteen product codes at 375 px: too many to stand level, and rotated
    // they still have room one by one. Before: every other one was dropped.
    let rows: Vec<String> = (0..16).map(|i| format!(r#"{{"code": "Batch {:02}", "v": {}}}"#, i + 1, i % 5 + 1)).collect();
    let spec = format!(r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "bar", "x": "code", "y": "v" }} ] }}"#, rows.join(", "));
    let r = render(&spec, None, &at_width(375.0)).unwrap();
    let labels = bottom_labels(&r.scene);
    for i in 0..16 {
        let c = format!("Batch {:02}", i + 1);
        assert!(labels.contains(&c), "{c} is not named: {labels:?}");
    }
}

#[test]
fn shortened_labels_stay_distinct_and_keep_the_full_name() {
    // Long names sharing their start: cut at the end with "…" they would
    // all read alike. Each is named in full (title) and the drawn texts differ.
    let names = ["Riverside community garden north", "Riverside community garden south", "Riverside community garden east", "Riverside community garden west"];
    let rows: Vec<String> = names.iter().enumerate().map(|(i, c)| format!(r#"{{"plot": "{c}", "v": {}}}"#, i + 3)).collect();
    let spec = format!(r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "bar", "x": "plot", "y": "v" }} ] }}"#, rows.join(", "));
    for w in [300.0, 375.0, 640.0] {
        let r = render(&spec, None, &at_width(w)).unwrap();
        let labels = bottom_labels(&r.scene);
        for c in names {
            assert!(labels.iter().any(|l| l == c), "{w} px: {c} is not named: {labels:?}");
        }
        // What is drawn (the texts themselves) differs from label to label.
        let mut drawn = Vec::new();
        fn texts(n: &Node, out: &mut Vec<String>) {
            match n {
                Node::Text { text, class, .. } if class == "strata-tick" => out.push(text.clone()),
                Node::Group { class, children, .. } if class == "strata-tick-lines" => out.push(
                    children.iter().filter_map(|c| if let Node::Text { text, .. } = c { Some(text.clone()) } else { None }).collect::<Vec<_>>().join("\n"),
                ),
                Node::Group { children, .. } | Node::Titled { children, .. } => children.iter().for_each(|c| texts(c, out)),
                _ => {}
            }
        }
        r.scene.children.iter().for_each(|c| texts(c, &mut drawn));
        let cats: Vec<&String> = drawn.iter().filter(|t| t.starts_with("Riv") || t.contains('\u{2026}')).collect();
        let mut sorted = cats.clone();
        sorted.sort();
        sorted.dedup();
        assert_eq!(sorted.len(), cats.len(), "{w} px: two labels read the same: {drawn:?}");
        if r.svg.contains("\u{2026}") {
            assert!(r.svg.contains("<title>Riverside community garden north</title>"), "{w} px: a shortened label without its full name");
        }
    }
}

// ------------------------------------------------------------ the gallery

fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..").canonicalize().unwrap()
}

/// The categories a plan draws on a category axis or in a colour legend.
fn categories(plan: &Plan, out: &mut Vec<String>) {
    let s = &plan.scales;
    for (scale, spec) in [(&s.x, &s.x_spec), (&s.y, &s.y_spec)] {
        if let PositionScale::Category { values, .. } = scale {
            if !spec.hide && spec.axis != Some(strata::plan::Placement::None) {
                out.extend(values.iter().cloned());
            }
        }
    }
    if let Some(ColorScale::Categories(c)) = &s.color {
        if !s.color_spec.hide && s.color_spec.legend != Some(strata::plan::Placement::None) {
            out.extend(c.iter().cloned());
        }
    }
    match &plan.panels {
        Some(PanelPlans::Wrap { cells, .. }) | Some(PanelPlans::Grid { cells, .. }) => cells.iter().for_each(|c| categories(c, out)),
        None => {}
    }
}

#[test]
fn every_gallery_chart_names_every_category_at_phone_and_desktop_width() {
    let mut files: Vec<PathBuf> =
        std::fs::read_dir(root().join("examples")).unwrap().map(|e| e.unwrap().path()).filter(|p| p.extension().is_some_and(|e| e == "json")).collect();
    files.sort();
    assert!(files.len() >= 10);
    let mut failures = Vec::new();
    for f in &files {
        let text = std::fs::read_to_string(f).unwrap();
        let mut spec = strata::parse_spec(&text).unwrap();
        // The page's width, as the element gives it when the spec sets none.
        spec.size.width = None;
        spec.size.height = None;
        let url = spec.data.as_ref().and_then(|d| d.object().url);
        let bytes = url.as_ref().map(|u| std::fs::read(f.parent().unwrap().join(u)).unwrap());
        if spec.shapes.is_some() {
            continue; // maps name regions by colour and shape, not by axis
        }
        let data = || bytes.as_deref().map(|b| DataBytes { bytes: b, name: url.as_deref().unwrap_or("d.csv") });
        let table = strata::load_table(&spec, data()).unwrap();
        let table = strata::prepare_table(table, &spec).unwrap();
        let plan = strata::plan::build(&spec, &table).unwrap();
        let mut cats = Vec::new();
        categories(&plan, &mut cats);
        cats.sort();
        cats.dedup();
        for w in [375.0, 1280.0] {
            let r = strata::render_spec(&spec, data(), &at_width(w)).unwrap();
            let shown = named(&r.scene);
            for c in &cats {
                if !shown.iter().any(|s| s == c) {
                    failures.push(format!("{} at {w} px: {c:?} is not named", f.file_name().unwrap().to_string_lossy()));
                }
            }
        }
    }
    assert!(failures.is_empty(), "{}", failures.join("\n"));
}
