//! `strata bake`: pre-render every `<strata-chart>` of an HTML page in place,
//! so the page shows its charts with no script (feeds, print, reader modes),
//! byte for byte what the element draws when its module loads.
//!
//! Two passes with a streaming HTML rewriter: the first collects each chart's
//! attributes and inline spec; the second puts the rendered `<svg>` and its
//! data table inside each element that rendered, replacing earlier ones. A chart that fails
//! keeps whatever it had and is reported with the page and the chart.

use lol_html::html_content::ContentType;
use lol_html::{element, rewrite_str, text, RewriteStrSettings};
use std::cell::RefCell;
use std::path::{Path, PathBuf};
use std::rc::Rc;
use strata::scene::SceneOptions;
use strata::{DataBytes, RenderOptions};

#[derive(Debug, Default, Clone)]
struct Found {
    id: Option<String>,
    src: Option<String>,
    spec_src: Option<String>,
    theme: Option<String>,
    spec: String,
}

/// What baking one page did.
pub struct PageReport {
    pub baked: usize,
    pub failures: Vec<String>,
}

fn collect(html: &str) -> Result<Vec<Found>, String> {
    let found: Rc<RefCell<Vec<Found>>> = Rc::default();
    let (f1, f2) = (found.clone(), found.clone());
    rewrite_str(
        html,
        RewriteStrSettings::new()
            .append_element_content_handler(element!("strata-chart", move |el| {
                f1.borrow_mut().push(Found {
                    id: el.get_attribute("id"),
                    src: el.get_attribute("src"),
                    spec_src: el.get_attribute("spec-src"),
                    theme: el.get_attribute("theme"),
                    spec: String::new(),
                });
                Ok(())
            }))
            .append_element_content_handler(text!("strata-chart > script[type='application/json']", move |t| {
                if let Some(last) = f2.borrow_mut().last_mut() {
                    last.spec.push_str(t.as_str());
                }
                Ok(())
            })),
    )
    .map_err(|e| format!("cannot parse the page: {e}"))?;
    let v = found.borrow().clone();
    Ok(v)
}

/// Resolve a page-relative reference to a local file; URLs with a scheme
/// cannot be baked.
pub(crate) fn local(base: &Path, reference: &str) -> Result<PathBuf, String> {
    if reference.contains("://") || reference.starts_with("//") {
        return Err(format!("`{reference}` is not a local file; bake reads files next to the page only"));
    }
    let r = reference.split(['?', '#']).next().unwrap_or(reference);
    Ok(if let Some(abs) = r.strip_prefix('/') { base.join(abs) } else { base.join(r) })
}

fn render_one(page: &Path, chart: &Found, width: f64) -> Result<String, String> {
    let page_dir = page.parent().unwrap_or(Path::new("."));
    let (mut text, spec_dir) = match &chart.spec_src {
        Some(s) => {
            let p = local(page_dir, s)?;
            let t = std::fs::read_to_string(&p).map_err(|e| format!("cannot read spec-src {}: {e}", p.display()))?;
            (t, p.parent().unwrap_or(Path::new(".")).to_path_buf())
        }
        None => (html_unescape_script(&chart.spec), page_dir.to_path_buf()),
    };
    if let Some(theme) = &chart.theme {
        // The element applies its theme attribute the same way.
        let mut v: serde_json::Value = serde_json::from_str(&text).map_err(|e| format!("spec is not valid JSON: {e}"))?;
        if let Some(o) = v.as_object_mut() {
            o.insert("theme".into(), serde_json::Value::String(theme.clone()));
        }
        text = serde_json::to_string(&v).map_err(|e| e.to_string())?;
    }
    let spec = strata::parse_spec(&text).map_err(|e| e.to_string())?;
    let data_path = match (&chart.src, spec.data.as_ref().and_then(|d| d.object().url)) {
        (Some(src), _) => Some(local(page_dir, src)?),
        (None, Some(url)) => Some(local(&spec_dir, &url)?),
        _ => None,
    };
    let bytes = match &data_path {
        Some(p) => Some(std::fs::read(p).map_err(|e| format!("cannot read data {}: {e}", p.display()))?),
        None => None,
    };
    let name = data_path.as_ref().map(|p| p.display().to_string()).unwrap_or_default();
    let data = bytes.as_deref().map(|b| DataBytes { bytes: b, name: &name });
    // `shapes.url` is read by the same rules as `data.url`.
    let shapes_path = match spec.shapes.as_ref().and_then(|s| s.url.clone()) {
        Some(url) => Some(local(&spec_dir, &url)?),
        None => None,
    };
    let shapes_bytes = match &shapes_path {
        Some(p) => Some(std::fs::read(p).map_err(|e| format!("cannot read shapes {}: {e}", p.display()))?),
        None => None,
    };
    let shapes_name = shapes_path.as_ref().map(|p| p.display().to_string()).unwrap_or_default();
    let shapes = shapes_bytes.as_deref().map(|b| DataBytes { bytes: b, name: &shapes_name });
    let r = strata::render_spec_with_shapes(&spec, data, shapes, &RenderOptions { scene: SceneOptions { width } }).map_err(|e| e.to_string())?;
    // The chart, then its data table, as the element places them.
    Ok(format!("{}{}", r.svg.trim_end(), r.table))
}

/// Script text is raw in HTML: nothing to unescape, but a stray BOM or
/// surrounding whitespace is harmless to JSON. Kept as a seam for clarity.
fn html_unescape_script(s: &str) -> String {
    s.to_string()
}

/// Bake one page's HTML text; returns the new text and a report.
pub fn bake_html(page: &Path, html: &str, width: f64) -> Result<(String, PageReport), String> {
    let charts = collect(html)?;
    let results: Vec<Result<String, String>> = charts.iter().map(|c| render_one(page, c, width)).collect();
    let mut failures = Vec::new();
    for (i, (c, r)) in charts.iter().zip(&results).enumerate() {
        if let Err(e) = r {
            let name = c.id.as_ref().map(|id| format!("#{id}")).unwrap_or_else(|| format!("chart {}", i + 1));
            failures.push(format!("{}: {name}: {}", page.display(), e.replace('\n', "\n  ")));
        }
    }
    let results = Rc::new(results);
    let index = Rc::new(RefCell::new(0usize));
    let (r1, r2, i1, i2) = (results.clone(), results.clone(), index.clone(), index.clone());
    let out = rewrite_str(
        html,
        RewriteStrSettings::new()
            .append_element_content_handler(element!("strata-chart", move |el| {
                let i = *i1.borrow();
                *i1.borrow_mut() += 1;
                if let Some(Ok(svg)) = r1.get(i) {
                    let svg = svg.clone();
                    if let Some(handlers) = el.end_tag_handlers() {
                        let h: lol_html::EndTagHandler<'static> = Box::new(move |end| {
                            end.before(&svg, ContentType::Html);
                            Ok(())
                        });
                        handlers.push(h);
                    }
                }
                Ok(())
            }))
            .append_element_content_handler(
                // An earlier bake's chart and table make way for the new ones.
                element!("strata-chart > svg, strata-chart > details.strata-data", move |el| {
                    let i = *i2.borrow() - 1;
                    if matches!(r2.get(i), Some(Ok(_))) {
                        el.remove();
                    }
                    Ok(())
                }),
            ),
    )
    .map_err(|e| format!("cannot rewrite the page: {e}"))?;
    let baked = results.iter().filter(|r| r.is_ok()).count();
    Ok((out, PageReport { baked, failures }))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn page_in(dir: &Path, html: &str) -> PathBuf {
        std::fs::write(dir.join("d.csv"), "k,v\na,1\nb,2\n").unwrap();
        let p = dir.join("p.html");
        std::fs::write(&p, html).unwrap();
        p
    }

    #[test]
    fn bakes_and_rebakes_in_place() {
        let dir = std::env::temp_dir().join(format!("strata-bake-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let html = r#"<p>x</p><strata-chart src="d.csv"><script type="application/json">{"size":{"width":300},"layers":[{"draw":"bar","x":"k","y":"v"}]}</script></strata-chart>"#;
        let p = page_in(&dir, html);
        let (once, rep) = bake_html(&p, html, 640.0).unwrap();
        assert_eq!(rep.baked, 1);
        assert!(rep.failures.is_empty());
        assert_eq!(once.matches("<svg").count(), 1);
        assert_eq!(once.matches("<rect").count() - 1, 2 + 0, "background + two bars (and no legend)");
        // The data table follows the chart inside the element.
        assert_eq!(once.matches("<details class=\"strata-data\">").count(), 1);
        assert!(once.contains("</svg><details class=\"strata-data\">"));
        assert!(once.ends_with("</details></strata-chart>"));
        // Baking again replaces the SVG and table instead of adding second ones.
        let (twice, _) = bake_html(&p, &once, 640.0).unwrap();
        assert_eq!(once, twice);
    }

    #[test]
    fn a_failing_chart_keeps_its_content_and_is_reported() {
        let dir = std::env::temp_dir().join(format!("strata-bake-fail-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let html = r#"<strata-chart id="c" src="d.csv"><script type="application/json">{"layers":[{"draw":"bar","x":"nope","y":"v"}]}</script><svg id="old"></svg></strata-chart>"#;
        let p = page_in(&dir, html);
        let (out, rep) = bake_html(&p, html, 640.0).unwrap();
        assert_eq!(out, html);
        assert_eq!(rep.baked, 0);
        assert!(rep.failures[0].contains("#c"), "{:?}", rep.failures);
        assert!(rep.failures[0].contains("layers[0].x"), "{:?}", rep.failures);
    }

    #[test]
    fn remote_data_is_refused_clearly() {
        let e = local(Path::new("."), "https://example.org/d.csv").unwrap_err();
        assert!(e.contains("not a local file"));
    }
}
