//! Direct labels (`layers[].label_ends`): each series is named at its last
//! point instead of in a legend; the names are pushed apart vertically,
//! keep the order of the line ends, and are written in the series colour
//! with its OKLab lightness changed until it reads at 4.5:1 (WCAG 2.1
//! contrast ratio) on the background. Invented data written here.

use strata::color::{contrast, hex_to_oklab};
use strata::scene::{Node, Scene, Seg};
use strata::text;
use strata::{render, RenderOptions};

fn walk<'a>(n: &'a Node, f: &mut dyn FnMut(&'a Node)) {
    f(n);
    if let Node::Group { children, .. } | Node::Titled { children, .. } = n {
        children.iter().for_each(|c| walk(c, f));
    }
}

/// (name, x, baseline, fill) of each end label; (series, colour, last point) of each line.
fn parts(s: &Scene) -> (Vec<(String, f64, f64, String)>, Vec<(String, String, (f64, f64))>, bool) {
    let (mut labels, mut lines, mut legend) = (vec![], vec![], false);
    for c in &s.children {
        walk(c, &mut |n| match n {
            Node::Text { text, x, y, fill, class, .. } if class.contains("strata-end-label") => labels.push((text.clone(), *x, *y, fill.clone())),
            Node::Path { d, paint, datum: Some(dt), .. } => {
                let last = d.iter().rev().find_map(|s| match *s {
                    Seg::Move(x, y) | Seg::Line(x, y) => Some((x, y)),
                    _ => None,
                });
                let name = dt.get("color").and_then(|v| v.as_str()).unwrap_or_default().to_string();
                lines.push((name, paint.stroke.clone().or(paint.fill.clone()).unwrap_or_default(), last.unwrap()));
            }
            Node::Group { class, .. } if class.contains("strata-legend-color") => legend = true,
            _ => {}
        });
    }
    (labels, lines, legend)
}

fn spec(theme: &str) -> String {
    let mut rows = Vec::new();
    for (k, (name, end)) in [("Harbour gate", 41.0), ("Lane gate", 42.0), ("Mill gate", 43.5), ("Quay gate", 12.0)].iter().enumerate() {
        for m in 0..6 {
            let v = 20.0 + k as f64 * 3.0 + (end - 20.0 - k as f64 * 3.0) * m as f64 / 5.0;
            rows.push(format!(r#"{{"month": {m}, "gate": "{name}", "people": {v}}}"#));
        }
    }
    format!(
        r#"{{ "data": {{ "rows": [{}] }}, "theme": "{theme}",
            "layers": [ {{ "draw": "line", "x": "month", "y": "people", "color": "gate", "label_ends": true }} ] }}"#,
        rows.join(", ")
    )
}

#[test]
fn series_are_named_at_their_ends_instead_of_a_legend() {
    for theme in ["light", "dark"] {
        let r = render(&spec(theme), None, &RenderOptions::default()).unwrap();
        let (labels, lines, legend) = parts(&r.scene);
        assert!(!legend, "{theme}: the legend is left out");
        assert_eq!(labels.len(), 4, "{theme}: {labels:?}");
        let size = 12.0 * 11.0 / 12.0;
        for (name, colour, end) in &lines {
            let l = labels.iter().find(|l| l.0 == *name).unwrap_or_else(|| panic!("{name} unnamed"));
            // Right of the line's end, inside the chart.
            assert!(l.1 > end.0 && l.1 + text::width(name, size, false) <= r.scene.width, "{l:?} vs end {end:?}");
            // The series colour, lightness changed only: OKLab a and b kept
            // (up to gamut clipping), and 4.5:1 on the background.
            let (a, b) = (hex_to_oklab(colour).unwrap(), hex_to_oklab(&l.3).unwrap());
            assert!((a[1] - b[1]).abs() < 0.03 && (a[2] - b[2]).abs() < 0.03, "{theme}: {colour} -> {}", l.3);
            assert!(contrast(&l.3, &r.scene.background).unwrap() >= 4.5 - 1e-9, "{theme}: {} on {}", l.3, r.scene.background);
        }
        // Apart by at least a line, and in the order of the line ends.
        let mut by_end: Vec<&(String, String, (f64, f64))> = lines.iter().collect();
        by_end.sort_by(|a, b| a.2 .1.total_cmp(&b.2 .1));
        let ys: Vec<f64> = by_end.iter().map(|(n, _, _)| labels.iter().find(|l| l.0 == *n).unwrap().2).collect();
        for w in ys.windows(2) {
            assert!(w[1] - w[0] >= size * text::LINE_HEIGHT - 1e-6, "{theme}: {ys:?}");
        }
        // Each stays near its end: the three crowded ones within two lines, the free one on it.
        for ((_, _, end), y) in by_end.iter().zip(&ys) {
            assert!((y - size * text::CAP / 2.0 - end.1).abs() <= 2.0 * size * text::LINE_HEIGHT, "{ys:?} vs {:?}", by_end);
        }
        let quay = labels.iter().find(|l| l.0 == "Quay gate").unwrap();
        let quay_end = lines.iter().find(|l| l.0 == "Quay gate").unwrap().2;
        assert!((quay.2 - size * text::CAP / 2.0 - quay_end.1).abs() < 1e-6);
    }
}
