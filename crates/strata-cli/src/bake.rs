//! `strata bake`: pre-render every `<strata-chart>` of an HTML page in place,
//! so the page shows its charts with no script (feeds, print, reader modes),
//! byte for byte what the element draws when its module loads.
//!
//! Two passes with a streaming HTML rewriter: the first collects each chart's
//! attributes and inline spec; the second puts the rendered `<svg>`s and the
//! data table inside each element that rendered, replacing earlier ones. A chart that fails
//! keeps whatever it had and is reported with the page and the chart.
//!
//! Several widths: a chart is drawn once per width (default: its spec's
//! `size.width`, or `--width` when it sets none, and 360 for phones), never
//! wider than its `size.width`. Each `<svg>` gets the class `strata-baked`
//! and classes naming the container widths it is shown at, on a 20 px grid
//! (`strata-from-640`: from 640 px up; `strata-until-640`: below 640 px);
//! the theme sheet's container queries (www/strata-theme.css) show the one
//! that fits, with no script. The data table follows, drawn at the widest.

use lol_html::html_content::ContentType;
use lol_html::{element, rewrite_str, text, RewriteStrSettings};
use std::cell::RefCell;
use std::path::Path;
use std::rc::Rc;
use strata::scene::SceneOptions;
use strata::{DataBytes, RenderOptions};

use crate::files::{decode_entities, read_capped, read_text_capped, url_path, Site, MAX_DATA_BYTES, MAX_TEXT_BYTES};

/// The widths to bake at: `--widths` when given, else each chart's own
/// width and [`PHONE_WIDTH`]. `fallback` is the width of a chart whose spec
/// sets none (`--width`).
#[derive(Debug, Clone, PartialEq)]
pub struct Widths {
    pub fallback: f64,
    pub listed: Option<Vec<f64>>,
}

impl Widths {
    /// One width, as `strata bake` drew before there were several.
    #[cfg(test)]
    pub fn one(w: f64) -> Widths {
        Widths { fallback: w, listed: Some(vec![w]) }
    }
}

/// The phone width baked beside the chart's own when `--widths` is absent.
pub const PHONE_WIDTH: f64 = 360.0;
/// The grid of container widths the theme sheet has queries for: every
/// `GRID_STEP` px from `GRID_MIN` to `GRID_MAX` (www/strata-theme.css; a test
/// checks the two agree).
pub const GRID_STEP: f64 = 20.0;
pub const GRID_MIN: f64 = 200.0;
pub const GRID_MAX: f64 = 1600.0;

/// The container width from which an SVG `w` px wide shows: `w` rounded up to the grid.
fn breakpoint(w: f64) -> u32 {
    ((w / GRID_STEP).ceil() * GRID_STEP).max(GRID_MIN) as u32
}

/// The widths one chart is baked at, narrowest first: the listed ones,
/// none wider than the spec's `size.width`, one per grid step (the wider
/// kept). A chart wider than the grid reaches is baked at its width alone.
pub fn chart_widths(spec_width: Option<f64>, widths: &Widths) -> Vec<f64> {
    let own = spec_width.unwrap_or(widths.fallback);
    let listed = widths.listed.clone().unwrap_or_else(|| vec![own, PHONE_WIDTH]);
    let cap = spec_width.unwrap_or(f64::INFINITY);
    let mut ws: Vec<f64> = listed.iter().filter(|w| w.is_finite() && **w > 0.0).map(|w| w.min(cap).clamp(120.0, 4000.0)).collect();
    ws.sort_by(f64::total_cmp);
    ws.dedup();
    let mut out: Vec<f64> = Vec::new();
    for w in ws {
        match out.last_mut() {
            Some(last) if breakpoint(*last) == breakpoint(w) => *last = w,
            _ => out.push(w),
        }
    }
    match out.last() {
        Some(&widest) if out.len() > 1 && breakpoint(widest) as f64 > GRID_MAX => vec![widest],
        Some(_) => out,
        None => vec![own.clamp(120.0, 4000.0)],
    }
}

/// The classes of the `i`-th of `ws` (narrowest first): baked, and the container widths it shows at.
fn width_classes(ws: &[f64], i: usize) -> String {
    let mut c = String::from("strata-baked");
    if ws.len() > 1 {
        if i > 0 {
            c.push_str(&format!(" strata-from-{}", breakpoint(ws[i])));
        }
        if i + 1 < ws.len() {
            c.push_str(&format!(" strata-until-{}", breakpoint(ws[i + 1])));
        }
    }
    c
}

/// Add classes to the root `<svg>`'s class attribute (the engine writes one).
fn add_root_classes(svg: &str, classes: &str) -> String {
    match svg.find(" class=\"").and_then(|at| svg[at + 8..].find('"').map(|end| at + 8 + end)) {
        Some(end) if svg[..end].find('>').is_none() => format!("{} {classes}{}", &svg[..end], &svg[end..]),
        _ => svg.replacen("<svg ", &format!("<svg class=\"{classes}\" "), 1),
    }
}

#[derive(Debug, Default, Clone)]
struct Found {
    id: Option<String>,
    src: Option<String>,
    spec_src: Option<String>,
    shapes_src: Option<String>,
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
                    shapes_src: el.get_attribute("shapes-src"),
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

/// Read one chart's spec and data from the site and render it. Every file
/// reference goes through [`Site::resolve`]: attribute values are decoded of
/// character references first, as the browser does before fetching.
fn render_one(page: &Path, chart: &Found, widths: &Widths, site: &Site) -> Result<String, String> {
    let page_dir = page.parent().filter(|p| !p.as_os_str().is_empty()).unwrap_or(Path::new("."));
    let page_base = site.segments_of(page_dir)?;
    let (mut text, spec_base) = match &chart.spec_src {
        Some(s) => {
            let s = decode_entities(s);
            let p = site.resolve(&page_base, &s).map_err(|e| format!("spec-src: {e}"))?;
            let t = read_text_capped(&p, MAX_TEXT_BYTES, "spec-src")
                .map_err(|_| format!("spec-src: cannot read `{s}` as UTF-8 text of at most {} MB", MAX_TEXT_BYTES >> 20))?;
            let mut dir = url_path(&page_base, &s)?;
            dir.pop();
            (t, dir)
        }
        None => (html_unescape_script(&chart.spec), page_base.clone()),
    };
    if let Some(theme) = &chart.theme {
        // The element applies its theme attribute the same way.
        let mut v: serde_json::Value = serde_json::from_str(&text).map_err(|e| format!("spec is not valid JSON: {e}"))?;
        if let Some(o) = v.as_object_mut() {
            o.insert("theme".into(), serde_json::Value::String(decode_entities(theme)));
        }
        text = serde_json::to_string(&v).map_err(|e| e.to_string())?;
    }
    let spec = strata::parse_spec(&text).map_err(|e| e.to_string())?;
    let reference = match (&chart.src, spec.data.as_ref().and_then(|d| d.object().url)) {
        (Some(src), _) => {
            let src = decode_entities(src);
            Some((site.resolve(&page_base, &src).map_err(|e| format!("src: {e}"))?, src))
        }
        (None, Some(url)) => Some((site.resolve(&spec_base, &url).map_err(|e| format!("data.url: {e}"))?, url.to_string())),
        _ => None,
    };
    let bytes = match &reference {
        Some((p, r)) => {
            Some(read_capped(p, MAX_DATA_BYTES, "data").map_err(|_| format!("cannot read `{r}`, or it is larger than {} MB", MAX_DATA_BYTES >> 20))?)
        }
        None => None,
    };
    let name = reference.as_ref().map(|(_, r)| r.clone()).unwrap_or_default();
    let data = bytes.as_deref().map(|b| DataBytes { bytes: b, name: &name });
    // The `shapes-src` attribute, as the element reads it, else `shapes.url` by the same rules as `data.url`.
    let shapes_ref = match (&chart.shapes_src, spec.shapes.as_ref().and_then(|s| s.url.clone())) {
        (Some(src), _) => {
            let src = decode_entities(src);
            Some((site.resolve(&page_base, &src).map_err(|e| format!("shapes-src: {e}"))?, src))
        }
        (None, Some(url)) => Some((site.resolve(&spec_base, &url).map_err(|e| format!("shapes.url: {e}"))?, url)),
        (None, None) => None,
    };
    let shapes_bytes = match &shapes_ref {
        Some((p, r)) => {
            Some(read_capped(p, MAX_DATA_BYTES, "shapes").map_err(|_| format!("cannot read `{r}`, or it is larger than {} MB", MAX_DATA_BYTES >> 20))?)
        }
        None => None,
    };
    let shapes_name = shapes_ref.as_ref().map(|(_, r)| r.clone()).unwrap_or_default();
    let shapes = shapes_bytes.as_deref().map(|b| DataBytes { bytes: b, name: &shapes_name });
    // One drawing per width, widest first (what a reader with no style
    // sheet sees first); the spec's `size.width` narrowed as the element
    // narrows it, so the element draws these very bytes at that width.
    let spec_width = spec.size.width;
    let ws = chart_widths(spec_width, widths);
    let mut out = String::new();
    let mut table = String::new();
    for (i, &w) in ws.iter().enumerate().rev() {
        let mut narrowed;
        let spec_at = match spec_width {
            Some(sw) if w < sw => {
                narrowed = spec.clone();
                narrowed.size.width = Some(w);
                &narrowed
            }
            _ => &spec,
        };
        let r = strata::render_spec_with_shapes(spec_at, data, shapes, &RenderOptions { scene: SceneOptions { width: w } }).map_err(|e| e.to_string())?;
        out.push_str(&add_root_classes(r.svg.trim_end(), &width_classes(&ws, i)));
        if i + 1 == ws.len() {
            table = r.table;
        }
    }
    // The charts, then the data table, as the element places them.
    Ok(format!("{out}{table}"))
}

/// Script text is raw in HTML: nothing to unescape, but a stray BOM or
/// surrounding whitespace is harmless to JSON. Kept as a seam for clarity.
fn html_unescape_script(s: &str) -> String {
    s.to_string()
}

/// Bake one page's HTML text; returns the new text and a report.
pub fn bake_html(page: &Path, html: &str, widths: &Widths, site: &Site) -> Result<(String, PageReport), String> {
    let charts = collect(html)?;
    let results: Vec<Result<String, String>> = charts.iter().map(|c| render_one(page, c, widths, site)).collect();
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
            .append_element_content_handler(text!("strata-chart > script[type='application/json']", |t| {
                // Inline JSON with `<` written as `\u003c` (JSON's own escape,
                // valid only inside strings, where JSON allows `<` at all): a
                // `</script>` or `<!--<script>` in a string can no longer end
                // the script early or swallow the rest of the page.
                if t.as_str().contains('<') {
                    let safe = t.as_str().replace('<', "\\u003c");
                    t.replace(&safe, ContentType::Html);
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
    use std::path::PathBuf;

    fn site(p: &Path) -> Site {
        Site::new(p.parent().unwrap()).unwrap()
    }

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
        let (once, rep) = bake_html(&p, html, &Widths::one(640.0), &site(&p)).unwrap();
        assert_eq!(rep.baked, 1);
        assert!(rep.failures.is_empty());
        assert_eq!(once.matches("<svg").count(), 1);
        assert_eq!(once.matches("<rect").count() - 1, 2, "background + two bars (and no legend)");
        // The data table follows the chart inside the element.
        assert_eq!(once.matches("<details class=\"strata-data\">").count(), 1);
        assert!(once.contains("</svg><details class=\"strata-data\">"));
        assert!(once.ends_with("</details></strata-chart>"));
        // Baking again replaces the SVG and table instead of adding second ones.
        let (twice, _) = bake_html(&p, &once, &Widths::one(640.0), &site(&p)).unwrap();
        assert_eq!(once, twice);
    }

    #[test]
    fn a_failing_chart_keeps_its_content_and_is_reported() {
        let dir = std::env::temp_dir().join(format!("strata-bake-fail-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let html = r#"<strata-chart id="c" src="d.csv"><script type="application/json">{"layers":[{"draw":"bar","x":"nope","y":"v"}]}</script><svg id="old"></svg></strata-chart>"#;
        let p = page_in(&dir, html);
        let (out, rep) = bake_html(&p, html, &Widths::one(640.0), &site(&p)).unwrap();
        assert_eq!(out, html);
        assert_eq!(rep.baked, 0);
        assert!(rep.failures[0].contains("#c"), "{:?}", rep.failures);
        assert!(rep.failures[0].contains("layers[0].x"), "{:?}", rep.failures);
    }

    #[test]
    fn inline_json_is_written_with_escaped_less_than_signs() {
        let dir = std::env::temp_dir().join(format!("strata-bake-lt-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let html = r#"<strata-chart src="d.csv"><script type="application/json">{"title":"a <b> c <!-- d","layers":[{"draw":"bar","x":"k","y":"v"}]}</script></strata-chart><p id="after">after</p>"#;
        let p = page_in(&dir, html);
        let (out, rep) = bake_html(&p, html, &Widths::one(640.0), &site(&p)).unwrap();
        assert_eq!(rep.baked, 1, "{:?}", rep.failures);
        assert!(out.contains(r#"{"title":"a \u003cb> c \u003c!-- d","#), "{out}");
        assert!(out.contains("a &lt;b&gt; c &lt;!-- d"), "the title drawn as text");
        assert!(out.ends_with(r#"<p id="after">after</p>"#));
        // The rewritten JSON means the same spec: baking again changes nothing.
        let (again, _) = bake_html(&p, &out, &Widths::one(640.0), &site(&p)).unwrap();
        assert_eq!(again, out);
    }

    #[test]
    fn widths_are_capped_by_the_spec_and_one_per_grid_step() {
        let default = Widths { fallback: 640.0, listed: None };
        assert_eq!(chart_widths(Some(640.0), &default), vec![360.0, 640.0]);
        // No spec width: --width and the phone width.
        assert_eq!(chart_widths(None, &default), vec![360.0, 640.0]);
        // Never wider than size.width: 800 becomes 500, and a chart narrower than a phone is baked once.
        let listed = Widths { fallback: 640.0, listed: Some(vec![360.0, 800.0]) };
        assert_eq!(chart_widths(Some(500.0), &listed), vec![360.0, 500.0]);
        assert_eq!(chart_widths(Some(300.0), &listed), vec![300.0]);
        // 630 and 640 share the 640 px step: the wider stays.
        let close = Widths { fallback: 640.0, listed: Some(vec![630.0, 640.0, 360.0]) };
        assert_eq!(chart_widths(None, &close), vec![360.0, 640.0]);
        // Wider than the sheet's grid: one drawing, shown (scaled) everywhere as before.
        assert_eq!(chart_widths(Some(2400.0), &default), vec![2400.0]);
        assert_eq!(width_classes(&[360.0, 640.0], 0), "strata-baked strata-until-640");
        assert_eq!(width_classes(&[360.0, 500.0, 641.0], 1), "strata-baked strata-from-500 strata-until-660");
        assert_eq!(width_classes(&[300.0], 0), "strata-baked");
    }

    /// Every class the bake can write has its container query in the theme
    /// sheet, and the sheet has no query the bake cannot use.
    #[test]
    fn the_theme_sheet_has_a_query_for_every_grid_step() {
        let css = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/../../www/strata-theme.css")).unwrap();
        let mut w = GRID_MIN;
        let mut steps = 0;
        while w <= GRID_MAX {
            let from = format!("@container strata-chart (width < {w}px) {{ strata-chart > svg.strata.strata-from-{w} {{ display: none; }} }}");
            let until = format!("@container strata-chart (width >= {w}px) {{ strata-chart > svg.strata.strata-until-{w} {{ display: none; }} }}");
            assert!(css.contains(&from) && css.contains(&until), "{w}");
            w += GRID_STEP;
            steps += 1;
        }
        assert_eq!(css.matches("@container").count(), 2 * steps);
    }

    #[test]
    fn several_widths_are_baked_widest_first_then_the_table() {
        let dir = std::env::temp_dir().join(format!("strata-bake-widths-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let html = r#"<strata-chart src="d.csv"><script type="application/json">{"title":"A title long enough to wrap on a phone screen, surely","size":{"width":640,"height":300},"layers":[{"draw":"bar","x":"k","y":"v"}]}</script></strata-chart>"#;
        let p = page_in(&dir, html);
        let (out, rep) = bake_html(&p, html, &Widths { fallback: 640.0, listed: None }, &site(&p)).unwrap();
        assert_eq!(rep.baked, 1, "{:?}", rep.failures);
        let wide = out.find(r#"class="strata strata-auto strata-baked strata-from-640" width="640" height="300""#).expect(&out);
        let narrow = out.find(r#"class="strata strata-auto strata-baked strata-until-640" width="360" height="300""#).expect(&out);
        assert!(wide < narrow && out[narrow..].contains("</svg><details class=\"strata-data\">"));
        assert_eq!(out.matches("<details").count(), 1);
        // The narrow one is the spec drawn at 360: the engine's narrow layout (the title wraps).
        let spec360 =
            r#"{"title":"A title long enough to wrap on a phone screen, surely","size":{"width":360,"height":300},"layers":[{"draw":"bar","x":"k","y":"v"}]}"#;
        let spec = strata::parse_spec(spec360).unwrap();
        let bytes = std::fs::read(dir.join("d.csv")).unwrap();
        let r = strata::render_spec_with_shapes(&spec, Some(DataBytes { bytes: &bytes, name: "d.csv" }), None, &RenderOptions::default()).unwrap();
        let expected = add_root_classes(r.svg.trim_end(), "strata-baked strata-until-640");
        assert!(out.contains(&expected));
        assert!(expected.matches("class=\"strata-title\"").count() >= 2, "the title wraps at 360");
        // Baking again replaces every width.
        let (again, _) = bake_html(&p, &out, &Widths { fallback: 640.0, listed: None }, &site(&p)).unwrap();
        assert_eq!(again, out);
    }

    #[test]
    fn remote_data_is_refused_clearly() {
        let e = url_path(&[], "https://example.org/d.csv").unwrap_err();
        assert!(e.contains("not a file of this site"));
    }

    /// A site folder with a secret beside it (outside the root), the way a
    /// CI checkout sits next to other files.
    fn hostile_site(tag: &str) -> (PathBuf, PathBuf) {
        let top = std::env::temp_dir().join(format!("strata-bake-hostile-{tag}-{}", std::process::id()));
        let site = top.join("site");
        std::fs::create_dir_all(site.join("data")).unwrap();
        std::fs::create_dir_all(site.join("docs")).unwrap();
        std::fs::write(top.join("secret.csv"), "TOKEN,v\nhunter2,1\n").unwrap();
        std::fs::write(site.join("data/ok.csv"), "k,v\na,1\nb,2\n").unwrap();
        (top, site)
    }

    fn bake_chart(site_dir: &Path, page: &Path, attrs: &str, spec: &str) -> (String, PageReport) {
        let html = format!(r#"<strata-chart id="c" {attrs}><script type="application/json">{spec}</script></strata-chart>"#);
        std::fs::write(page, &html).unwrap();
        bake_html(page, &html, &Widths::one(300.0), &Site::new(site_dir).unwrap()).unwrap()
    }

    const SPEC: &str = r#"{"layers":[{"draw":"bar","x":"k","y":"v"}]}"#;

    #[test]
    fn files_outside_the_site_are_never_read() {
        let (top, site) = hostile_site("outside");
        let page = site.join("docs/p.html");
        let secret = top.join("secret.csv");
        #[cfg(unix)]
        {
            let _ = std::fs::remove_file(site.join("data/link.csv"));
            std::os::unix::fs::symlink(&secret, site.join("data/link.csv")).unwrap();
            let _ = std::fs::remove_file(site.join("data/zero.csv"));
            std::os::unix::fs::symlink("/dev/zero", site.join("data/zero.csv")).unwrap();
        }
        let attacks = [
            "../../secret.csv".to_string(),
            "../../../../../../../../etc/passwd".to_string(),
            secret.display().to_string(),
            format!("file://{}", secret.display()),
            "&period;&period;/&period;&period;/secret.csv".into(),
            "%2e%2e/%2e%2e/secret.csv".into(),
            "..\\..\\secret.csv".into(),
            "/data/link.csv".into(),
            "../data/zero.csv".into(),
            "/dev/zero".into(),
            "/proc/self/environ".into(),
            "/data".into(),
        ];
        for a in &attacks {
            for (attrs, spec) in [
                (format!(r#"src="{a}""#), SPEC.to_string()),
                (String::new(), format!(r#"{{"data":{{"url":"{}"}},"layers":[{{"draw":"bar","x":"k","y":"v"}}]}}"#, a.replace('\\', "\\\\"))),
            ] {
                let (out, rep) = bake_chart(&site, &page, &attrs, &spec);
                assert_eq!(rep.baked, 0, "{a}: {out}");
                let msg = &rep.failures[0];
                assert!(msg.contains("#c"), "the chart is named: {msg}");
                assert!(!msg.contains("hunter2") && !msg.contains("TOKEN") && !msg.contains("root:"), "no contents: {msg}");
                assert!(!out.contains("hunter2") && !out.contains("TOKEN") && !out.contains("<svg"), "{a}");
            }
        }
    }

    #[test]
    fn root_relative_and_encoded_references_stay_in_the_site() {
        let (_top, site) = hostile_site("inside");
        let page = site.join("docs/p.html");
        // `/data/ok.csv` is the root's data folder, as a browser serving the site reads it.
        for a in ["/data/ok.csv", "../data/ok.csv", "&#x2e;&#x2e;/data/ok.csv", "%2E%2E/data/%6Fk.csv", "../../../data/ok.csv?v=2"] {
            let (out, rep) = bake_chart(&site, &page, &format!(r#"src="{a}""#), SPEC);
            assert_eq!(rep.baked, 1, "{a}: {:?}", rep.failures);
            assert!(out.contains("<svg"));
        }
    }

    #[cfg(unix)]
    #[test]
    fn special_files_are_refused_without_reading() {
        let (_top, site) = hostile_site("fifo");
        let page = site.join("docs/p.html");
        let fifo = site.join("data/pipe.csv");
        let _ = std::fs::remove_file(&fifo);
        let made = std::process::Command::new("mkfifo").arg(&fifo).status().map(|s| s.success()).unwrap_or(false);
        if made {
            // Opening a FIFO with no writer would hang forever.
            let (_, rep) = bake_chart(&site, &page, r#"src="/data/pipe.csv""#, SPEC);
            assert!(rep.failures[0].contains("not a regular file"), "{:?}", rep.failures);
        }
    }

    #[test]
    fn reads_stop_at_the_cap() {
        let dir = std::env::temp_dir().join(format!("strata-cap-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let f = dir.join("big.csv");
        std::fs::write(&f, vec![b'a'; 2000]).unwrap();
        assert_eq!(read_capped(&f, 2000, "data").unwrap().len(), 2000);
        assert!(read_capped(&f, 1999, "data").unwrap_err().contains("larger than"));
        #[cfg(unix)]
        assert!(read_capped(Path::new("/dev/zero"), 1 << 20, "data").is_err());
    }
}
