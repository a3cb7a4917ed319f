//! The charts of a site: HTML files under folders, and every chart a page
//! holds, with the page line where it starts. Two kinds of chart:
//! a `<strata-chart>` element (inline `<script type="application/json">` spec
//! or `spec-src`), and a Markdown fenced block with the info string `strata`,
//! which Markdown converters write as `<pre><code class="language-strata">`.

use lol_html::{element, rewrite_str, text, RewriteStrSettings};
use std::cell::RefCell;
use std::path::{Path, PathBuf};
use std::rc::Rc;

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    /// `<strata-chart>`.
    Element,
    /// `<pre><code class="language-strata">` from Markdown.
    Block,
}

/// One chart found in a page.
#[derive(Debug, Clone)]
pub struct PageChart {
    pub kind: Kind,
    pub id: Option<String>,
    pub src: Option<String>,
    pub spec_src: Option<String>,
    pub theme: Option<String>,
    /// The spec text (character references decoded for a Markdown block).
    pub spec: String,
    /// 1-based page line of the element's (or the `<pre>`'s) start tag.
    pub line: usize,
    /// 1-based page line where the spec text starts (the start tag's line
    /// when there is no inline text).
    pub spec_line: usize,
    /// Byte range in the page of the whole `<pre>…</pre>` (blocks only).
    pub range: Option<std::ops::Range<usize>>,
}

impl PageChart {
    /// How a message names this chart: `#id`, or its line.
    pub fn name(&self, index: usize) -> String {
        match &self.id {
            Some(id) => format!("#{id}"),
            None => format!("chart {} (line {})", index + 1, self.line),
        }
    }
}

/// Every `.html`/`.htm` under the given paths (files are taken as given,
/// folders walked in name order), each once.
pub fn html_files(paths: &[PathBuf]) -> Result<Vec<PathBuf>, String> {
    fn walk(dir: &Path, out: &mut Vec<PathBuf>) -> Result<(), String> {
        let mut entries: Vec<PathBuf> = std::fs::read_dir(dir)
            .map_err(|e| format!("strata: cannot read the folder {}: {e}", dir.display()))?
            .filter_map(|e| e.ok().map(|e| e.path()))
            .collect();
        entries.sort();
        for p in entries {
            // Symbolic links are not followed, so a link loop cannot hang the walk.
            let Ok(meta) = std::fs::symlink_metadata(&p) else { continue };
            if meta.is_dir() {
                walk(&p, out)?;
            } else if meta.is_file() && p.extension().is_some_and(|e| e.eq_ignore_ascii_case("html") || e.eq_ignore_ascii_case("htm")) {
                out.push(p);
            }
        }
        Ok(())
    }
    let mut out = Vec::new();
    for p in paths {
        if p.is_dir() {
            walk(p, &mut out)?;
        } else {
            out.push(p.clone());
        }
    }
    let mut seen = std::collections::HashSet::new();
    out.retain(|p| seen.insert(p.clone()));
    Ok(out)
}

/// Decode the character references a Markdown converter writes in a code
/// block (`&lt;`, `&gt;`, `&amp;`, `&quot;`, `&apos;`, numeric ones); any
/// other `&` is kept as it is.
pub fn decode_text(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    let mut rest = s;
    while let Some(at) = rest.find('&') {
        out.push_str(&rest[..at]);
        rest = &rest[at..];
        let end = rest[..rest.len().min(12)].find(';');
        let decoded = end.and_then(|end| {
            let name = &rest[1..end];
            let c = match name {
                "lt" => Some('<'),
                "gt" => Some('>'),
                "amp" => Some('&'),
                "quot" => Some('"'),
                "apos" => Some('\''),
                _ => {
                    let n = if let Some(h) = name.strip_prefix("#x").or_else(|| name.strip_prefix("#X")) {
                        u32::from_str_radix(h, 16).ok()
                    } else {
                        name.strip_prefix('#').and_then(|d| d.parse().ok())
                    };
                    n.and_then(char::from_u32)
                }
            };
            c.map(|c| (c, end + 1))
        });
        match decoded {
            Some((c, len)) => {
                out.push(c);
                rest = &rest[len..];
            }
            None => {
                out.push('&');
                rest = &rest[1..];
            }
        }
    }
    out.push_str(rest);
    out
}

/// Every chart of a page, in page order.
pub fn charts(html: &str) -> Result<Vec<PageChart>, String> {
    let line = |offset: usize| crate::locate::line_of(html, offset);
    let found: Rc<RefCell<Vec<PageChart>>> = Rc::default();
    // Index of the `<pre>` being read, if any, and whether its text started.
    let open_pre: Rc<RefCell<Option<usize>>> = Rc::default();
    let text_started: Rc<RefCell<bool>> = Rc::default();
    let (f1, f2, f3, f4) = (found.clone(), found.clone(), found.clone(), found.clone());
    let (p1, p2, p3) = (open_pre.clone(), open_pre.clone(), open_pre.clone());
    let (t1, t2, t3, t4) = (text_started.clone(), text_started.clone(), text_started.clone(), text_started.clone());
    // Byte start and end of every <pre>.
    type Spans = Rc<RefCell<Vec<(usize, Option<usize>)>>>;
    let pres: Spans = Rc::default();
    let (r1, r2) = (pres.clone(), pres.clone());
    rewrite_str(
        html,
        RewriteStrSettings::new()
            .append_element_content_handler(element!("strata-chart", move |el| {
                let at = el.source_location().bytes().start;
                *t1.borrow_mut() = false;
                f1.borrow_mut().push(PageChart {
                    kind: Kind::Element,
                    id: el.get_attribute("id"),
                    src: el.get_attribute("src"),
                    spec_src: el.get_attribute("spec-src"),
                    theme: el.get_attribute("theme"),
                    spec: String::new(),
                    line: line(at),
                    spec_line: line(at),
                    range: None,
                });
                Ok(())
            }))
            .append_element_content_handler(text!("strata-chart > script[type='application/json']", move |t| {
                if let Some(last) = f2.borrow_mut().last_mut() {
                    if !*t2.borrow() && !t.as_str().is_empty() {
                        last.spec_line = line(t.source_location().bytes().start);
                        *t2.borrow_mut() = true;
                    }
                    last.spec.push_str(t.as_str());
                }
                Ok(())
            }))
            .append_element_content_handler(element!("pre", move |el| {
                let start = el.source_location().bytes().start;
                let index = r1.borrow().len();
                r1.borrow_mut().push((start, None));
                *p1.borrow_mut() = Some(index);
                let (r, p) = (r2.clone(), p2.clone());
                if let Some(handlers) = el.end_tag_handlers() {
                    let h: lol_html::EndTagHandler<'static> = Box::new(move |end| {
                        r.borrow_mut()[index].1 = Some(end.source_location().bytes().end);
                        *p.borrow_mut() = None;
                        Ok(())
                    });
                    handlers.push(h);
                }
                Ok(())
            }))
            .append_element_content_handler(element!("pre > code.language-strata", move |el| {
                let Some(pre) = *p3.borrow() else { return Ok(()) };
                *t3.borrow_mut() = false;
                let at = el.source_location().bytes().start;
                f3.borrow_mut().push(PageChart {
                    kind: Kind::Block,
                    id: None,
                    src: None,
                    spec_src: None,
                    theme: None,
                    spec: String::new(),
                    line: line(at),
                    spec_line: line(at),
                    // The end is filled in below, once the page is read.
                    range: Some(pre..pre),
                });
                Ok(())
            }))
            .append_element_content_handler(text!("pre > code.language-strata", move |t| {
                if let Some(last) = f4.borrow_mut().last_mut().filter(|c| c.kind == Kind::Block) {
                    if !*t4.borrow() && !t.as_str().is_empty() {
                        last.spec_line = line(t.source_location().bytes().start);
                        *t4.borrow_mut() = true;
                    }
                    last.spec.push_str(t.as_str());
                }
                Ok(())
            })),
    )
    .map_err(|e| format!("cannot parse the page: {e}"))?;
    let pres = pres.borrow();
    let mut v = found.borrow().clone();
    v.retain_mut(|c| {
        if c.kind != Kind::Block {
            return true;
        }
        c.spec = decode_text(&c.spec);
        // `range` holds the index of its <pre>: turn it into the byte range.
        let index = c.range.as_ref().map(|r| r.start).unwrap_or(0);
        match pres.get(index) {
            Some(&(start, Some(end))) => {
                c.range = Some(start..end);
                true
            }
            // A <pre> with no end tag (cut short): leave it alone.
            _ => false,
        }
    });
    Ok(v)
}

/// The site root a file found under a folder argument defaults to: that
/// folder (the first one given that holds the file). A file named outright
/// has none, so its own folder is its root.
pub fn folder_root(paths: &[PathBuf], file: &Path) -> Option<PathBuf> {
    paths.iter().find(|p| p.is_dir() && file.starts_with(p)).cloned()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_elements_and_markdown_blocks_with_their_lines() {
        let html = "<h1>t</h1>\n<pre><code class=\"language-strata\">{&quot;layers&quot;: [\n  {&quot;draw&quot;: &quot;bar&quot;, &quot;x&quot;: &quot;a &lt; b&quot;}]}\n</code></pre>\n<p>x</p>\n<strata-chart id=\"c\" src=\"d.csv\">\n<script type=\"application/json\">\n{\"layers\": []}</script></strata-chart>\n<pre><code class=\"language-js\">x</code></pre>";
        let c = charts(html).unwrap();
        assert_eq!(c.len(), 2);
        assert_eq!(c[0].kind, Kind::Block);
        assert_eq!(c[0].line, 2);
        assert_eq!(c[0].spec, "{\"layers\": [\n  {\"draw\": \"bar\", \"x\": \"a < b\"}]}\n");
        let r = c[0].range.clone().unwrap();
        assert!(html[r.clone()].starts_with("<pre><code") && html[r].ends_with("</code></pre>"));
        assert_eq!(c[1].kind, Kind::Element);
        assert_eq!((c[1].line, c[1].spec_line), (6, 7));
        assert_eq!(c[1].id.as_deref(), Some("c"));
        assert_eq!(c[1].src.as_deref(), Some("d.csv"));
        assert_eq!(c[1].spec, "\n{\"layers\": []}");
    }

    #[test]
    fn character_references() {
        assert_eq!(decode_text("&lt;&gt;&amp;&quot;&#39;&#x41;&unknown; & x"), "<>&\"'A&unknown; & x");
    }
}
