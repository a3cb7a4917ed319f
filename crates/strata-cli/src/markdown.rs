//! Markdown charts: a fenced block with the info string `strata`, which
//! Markdown converters write as `<pre><code class="language-strata">…</code></pre>`,
//! becomes a `<strata-chart>` holding the spec inline; `bake` then draws it
//! like any other chart. Data URLs in the spec are relative to the page.
//!
//! A block whose chart fails stays as it was (the page still shows its
//! code) and is reported with its page, its line and the JSON path.

use crate::check::{check_text, DataFrom, Source};
use crate::pages::{self, Kind};
use std::path::Path;
use strata::Severity;

/// What converting one page's blocks did.
pub struct Converted {
    pub html: String,
    /// One message a failing block: page, line, JSON path, what is wrong.
    pub failures: Vec<String>,
}

/// The element for a block: the spec inline, with `<` written as `\u003c`
/// so that no text inside it can close the script (valid JSON has `<` only
/// inside strings, where the escape means the same character).
pub fn element(spec: &str) -> String {
    format!("<strata-chart><script type=\"application/json\">{}</script></strata-chart>", spec.trim().replace('<', "\\u003c"))
}

/// Turn every `strata` block of a page into a `<strata-chart>`.
pub fn convert(page: &Path, html: &str, root: Option<&Path>) -> Result<Converted, String> {
    let found = pages::charts(html)?;
    let dir = page.parent().unwrap_or(Path::new(".")).to_path_buf();
    let mut out = String::with_capacity(html.len());
    let mut at = 0;
    let mut failures = Vec::new();
    for (i, c) in found.iter().enumerate() {
        let (Kind::Block, Some(range)) = (c.kind, &c.range) else { continue };
        let src = Source { file: page, text: &c.spec, first_line: c.spec_line, chart: Some(c.name(i)) };
        let errors: Vec<String> =
            check_text(&src, None, DataFrom::SpecUrl(dir.clone()), root).iter().filter(|f| f.severity == Severity::Error).map(|f| f.text()).collect();
        if !errors.is_empty() {
            failures.extend(errors);
            continue;
        }
        out.push_str(&html[at..range.start]);
        out.push_str(&element(&c.spec));
        at = range.end;
    }
    out.push_str(&html[at..]);
    Ok(Converted { html: out, failures })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn blocks_become_elements_and_failures_are_located() {
        let dir = std::env::temp_dir().join(format!("strata-md-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        std::fs::write(dir.join("d.csv"), "k,v\na,1\nb,2\n").unwrap();
        let page = dir.join("p.html");
        let html = "<p>a</p>\n<pre><code class=\"language-strata\">{&quot;data&quot;: &quot;d.csv&quot;, &quot;title&quot;: &quot;a &lt;b&gt;&quot;,\n &quot;layers&quot;: [{&quot;draw&quot;: &quot;bar&quot;, &quot;x&quot;: &quot;k&quot;, &quot;y&quot;: &quot;v&quot;}]}\n</code></pre>\n<pre><code class=\"language-strata\">{&quot;data&quot;: &quot;d.csv&quot;,\n &quot;layers&quot;: [{&quot;draw&quot;: &quot;bar&quot;,\n  &quot;x&quot;: &quot;nope&quot;}]}</code></pre>\n<pre><code>{}</code></pre>\n";
        let c = convert(&page, html, None).unwrap();
        assert!(c.html.starts_with(
            "<p>a</p>\n<strata-chart><script type=\"application/json\">{\"data\": \"d.csv\", \"title\": \"a \\u003cb>\",\n \"layers\": [{\"draw\": \"bar\", \"x\": \"k\", \"y\": \"v\"}]}</script></strata-chart>\n<pre><code class=\"language-strata\">"
        ), "{}", c.html);
        assert!(c.html.ends_with("<pre><code>{}</code></pre>\n"));
        assert_eq!(c.failures.len(), 1);
        let f = &c.failures[0];
        assert!(f.contains(&format!("{}:7: chart 2 (line 5): error at layers[0].x", page.display())), "{f}");
        // Converting the result again changes nothing more than the failing block would.
        let again = convert(&page, &c.html, None).unwrap();
        assert_eq!(again.html, c.html);
    }
}
