//! Stage 5 — SVG text from a [`Scene`].
//!
//! Presentation attributes only (no `style` attribute, no `<style>`), so a
//! page with a strict Content-Security-Policy can host it; every text and
//! attribute escaped; numbers to two decimals; ids derived from the content
//! so that two charts on a page never clash and output is reproducible.
//!
//! Roles follow the WAI-ARIA Graphics Module (W3C 2018): the root is a
//! `graphics-document`, panels and layers `graphics-object`, data marks
//! `graphics-symbol` with a label naming their values (for charts of up to
//! [`LABELLED_MARKS`] marks, to keep large charts small). Classes on the root
//! (`strata-light`, `strata-dark`, `strata-auto`) and on groups and texts let
//! `www/strata-theme.css` restyle a chart through `--strata-*` properties.

/// Charts with at most this many data marks label each mark for screen readers.
pub const LABELLED_MARKS: usize = 500;

use crate::scene::{Anchor, Node, Paint, Scene, Seg};
use std::fmt::Write;

/// A number with at most two decimals, no trailing zeros, never `-0`.
///
/// Geometry is never non-finite in a correct scene
/// ([`Scene::non_finite`](crate::scene::Scene::non_finite) lists any that
/// is, and the tests assert it lists none); a debug build stops here, a
/// release build writes `0` rather than break the SVG.
pub fn num(v: f64) -> String {
    if !v.is_finite() {
        debug_assert!(false, "non-finite number {v} reached the SVG writer");
        return "0".into();
    }
    let k = (v * 100.0).round();
    // Hundredths as an integer: k / 100 to two decimals is exactly the
    // digits of k (|k| < 2^53 makes the nearest double to k / 100 closer to
    // it than 0.005, so `{:.2}` of it, as this wrote before, gives them
    // too; the tests check against Rust std's formatting). Larger numbers,
    // never met in a chart, take the exact printer.
    let mut s = if k.abs() < 9_007_199_254_740_992.0 {
        let k = k as i64;
        let (int, hundredths) = (k.unsigned_abs() / 100, k.unsigned_abs() % 100);
        format!("{}{int}.{hundredths:02}", if k < 0 { "-" } else { "" })
    } else {
        crate::format::float::fixed(k / 100.0, 2)
    };
    while s.ends_with('0') {
        s.pop();
    }
    if s.ends_with('.') {
        s.pop();
    }
    if s == "-0" {
        s = "0".into();
    }
    s
}

/// SVG path data: command letters without spaces, `x,y` pairs, numbers as
/// [`num`] writes them (so the text needs no escaping).
pub fn path_data(d: &[Seg]) -> String {
    let mut out = String::with_capacity(d.len() * 14);
    for s in d {
        let _ = match *s {
            Seg::Move(x, y) => write!(out, "M{},{}", num(x), num(y)),
            Seg::Line(x, y) => write!(out, "L{},{}", num(x), num(y)),
            Seg::Arc { rx, ry, large, sweep, x, y } => {
                write!(out, "A{},{} 0 {},{} {},{}", num(rx), num(ry), u8::from(large), u8::from(sweep), num(x), num(y))
            }
            Seg::Close => write!(out, "Z"),
        };
    }
    out
}

/// Escape text for element content and attribute values.
pub fn escape(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            // Control characters other than tab and newline are not allowed in XML 1.0.
            c if (c as u32) < 0x20 && c != '\t' && c != '\n' => out.push(' '),
            // Nor are U+FFFE and U+FFFF (XML 1.0 §2.2, Char): the replacement character stands in.
            '\u{fffe}' | '\u{ffff}' => out.push('\u{fffd}'),
            c => out.push(c),
        }
    }
    out
}

/// 64-bit FNV-1a, for content-derived ids (Fowler, Noll, Vo; public domain).
fn fnv1a(bytes: &[u8]) -> u64 {
    let mut h: u64 = 0xcbf29ce484222325;
    for b in bytes {
        h ^= *b as u64;
        h = h.wrapping_mul(0x100000001b3);
    }
    h
}

fn paint(out: &mut String, p: &Paint) {
    if let Some(f) = &p.fill {
        let _ = write!(out, " fill=\"{}\"", escape(f));
    }
    if let Some(s) = &p.stroke {
        let _ = write!(out, " stroke=\"{}\"", escape(s));
    }
    if let Some(w) = p.stroke_width {
        let _ = write!(out, " stroke-width=\"{}\"", num(w));
    }
    if let Some(o) = p.opacity {
        let _ = write!(out, " opacity=\"{}\"", num(o.clamp(0.0, 1.0)));
    }
    if let Some(d) = &p.dash {
        out.push_str(" stroke-dasharray=\"");
        for (i, v) in d.iter().enumerate() {
            if i > 0 {
                out.push(' ');
            }
            out.push_str(&num(*v));
        }
        out.push('"');
    }
    if p.even_odd {
        out.push_str(" fill-rule=\"evenodd\"");
    }
}

/// A datum value as words.
fn value_words(v: &serde_json::Value) -> String {
    match v {
        serde_json::Value::String(s) => s.clone(),
        serde_json::Value::Number(n) => n.as_f64().map(crate::format::value_label).unwrap_or_default(),
        serde_json::Value::Null => "missing".into(),
        other => crate::json::to_string(other),
    }
}

/// "x: Jan, y: 82, age: 12": a mark's values, then its `tooltip` columns.
fn datum_words(d: &crate::scene::Datum) -> String {
    let mut out = String::new();
    let mut add = |k: &str, v: &serde_json::Value| {
        if !out.is_empty() {
            out.push_str(", ");
        }
        out.push_str(k);
        out.push_str(": ");
        out.push_str(&value_words(v));
    };
    for (k, v) in d {
        if k != "tooltip" {
            add(k, v);
        }
    }
    if let Some(serde_json::Value::Object(tips)) = d.get("tooltip") {
        for (k, v) in tips {
            add(k, v);
        }
    }
    out
}

const FOCUSABLE: &str = " tabindex=\"0\"";

/// `role` and `aria-label` of a data mark (its values, "x: Jan, y: 82");
/// marks with `tooltip` columns are also focusable with the keyboard.
fn mark_label(out: &mut String, datum: &Option<crate::scene::Datum>, labelled: bool) {
    let Some(d) = datum else { return };
    if !labelled {
        return;
    }
    let _ = write!(out, " role=\"graphics-symbol\" aria-label=\"{}\"", escape(&datum_words(d)));
    if d.contains_key("tooltip") {
        out.push_str(FOCUSABLE);
    }
}

/// Close a mark: with `tooltip` columns, a `<title>` child that browsers show on
/// hover (no script needed, so baked pages have it too).
fn close_mark(out: &mut String, name: &str, datum: &Option<crate::scene::Datum>) {
    match datum {
        Some(d) if d.contains_key("tooltip") => {
            let _ = writeln!(out, "><title>{}</title></{name}>", escape(&datum_words(d)));
        }
        _ => out.push_str("/>\n"),
    }
}

fn node(out: &mut String, n: &Node, depth: usize, labelled: bool) {
    let indent = "  ".repeat(depth);
    out.push_str(&indent);
    match n {
        Node::Group { class, role, label, children } => {
            let _ = write!(out, "<g class=\"{}\"", escape(class));
            if let Some(r) = role {
                let _ = write!(out, " role=\"{}\"", escape(r));
            }
            if let Some(l) = label {
                let _ = write!(out, " aria-label=\"{}\"", escape(l));
            }
            if children.is_empty() {
                out.push_str("/>\n");
                return;
            }
            out.push_str(">\n");
            for c in children {
                node(out, c, depth + 1, labelled);
            }
            out.push_str(&indent);
            out.push_str("</g>\n");
        }
        Node::Rect { x, y, width, height, paint: p, datum } => {
            let _ = write!(out, "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"", num(*x), num(*y), num(*width), num(*height));
            paint(out, p);
            mark_label(out, datum, labelled);
            close_mark(out, "rect", datum);
        }
        Node::Circle { cx, cy, r, paint: p, datum } => {
            let _ = write!(out, "<circle cx=\"{}\" cy=\"{}\" r=\"{}\"", num(*cx), num(*cy), num(*r));
            paint(out, p);
            mark_label(out, datum, labelled);
            close_mark(out, "circle", datum);
        }
        Node::Line { x1, y1, x2, y2, paint: p } => {
            let _ = write!(out, "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\"", num(*x1), num(*y1), num(*x2), num(*y2));
            paint(out, p);
            out.push_str("/>\n");
        }
        Node::Path { d, paint: p, datum } => {
            let _ = write!(out, "<path d=\"{}\"", path_data(d));
            paint(out, p);
            mark_label(out, datum, labelled);
            close_mark(out, "path", datum);
        }
        Node::Titled { title, children } => {
            let _ = writeln!(out, "<g><title>{}</title>", escape(title));
            for c in children {
                node(out, c, depth + 1, labelled);
            }
            out.push_str(&indent);
            out.push_str("</g>\n");
        }
        Node::Text { x, y, text, size, anchor, bold, angle, fill, class } => {
            let _ = write!(out, "<text class=\"{}\" x=\"{}\" y=\"{}\" font-size=\"{}\"", escape(class), num(*x), num(*y), num(*size));
            match anchor {
                Anchor::Start => {}
                Anchor::Middle => out.push_str(" text-anchor=\"middle\""),
                Anchor::End => out.push_str(" text-anchor=\"end\""),
            }
            if *bold {
                out.push_str(" font-weight=\"bold\"");
            }
            if *angle != 0.0 {
                let _ = write!(out, " transform=\"rotate({} {} {})\"", num(*angle), num(*x), num(*y));
            }
            let _ = writeln!(out, " fill=\"{}\">{}</text>", escape(fill), escape(text));
        }
    }
}

/// Write the scene as a standalone SVG document fragment (no XML prolog, so
/// it can be inlined into HTML as is).
pub fn write(scene: &Scene) -> String {
    let mut body = String::with_capacity(4096);
    let _ = writeln!(
        body,
        "  <rect class=\"strata-background\" width=\"{}\" height=\"{}\" fill=\"{}\"/>",
        num(scene.width),
        num(scene.height),
        escape(&scene.background)
    );
    let labelled = scene.marks().len() <= LABELLED_MARKS;
    for c in &scene.children {
        node(&mut body, c, 1, labelled);
    }
    // One tab stop for the whole chart (WAI-ARIA's roving tabindex): the
    // first focusable mark takes Tab, the others -1; the element moves the
    // stop with the arrow keys. (Every quote in written text is escaped, so
    // this attribute only ever comes from `mark_label`.)
    if let Some(first) = body.find(FOCUSABLE) {
        let at = first + FOCUSABLE.len();
        let rest = body[at..].replace(FOCUSABLE, " tabindex=\"-1\"");
        body.truncate(at);
        body.push_str(&rest);
    }
    let id = format!("strata-{:08x}", fnv1a(format!("{}\u{0}{}\u{0}{}", scene.label, scene.description, body).as_bytes()) as u32);
    let mut out = String::with_capacity(body.len() + 512);
    let _ = writeln!(
        out,
        "<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"{c}\" width=\"{w}\" height=\"{h}\" viewBox=\"0 0 {w} {h}\" role=\"graphics-document document\" aria-roledescription=\"chart\" aria-labelledby=\"{id}-title\" aria-describedby=\"{id}-desc\" font-family=\"{f}\" font-kerning=\"none\">",
        w = num(scene.width),
        h = num(scene.height),
        f = escape(&scene.font_family),
        c = escape(format!("strata {}", scene.classes).trim()),
    );
    let _ = writeln!(out, "  <title id=\"{id}-title\">{}</title>", escape(&scene.label));
    let _ = writeln!(out, "  <desc id=\"{id}-desc\">{}</desc>", escape(&scene.description));
    out.push_str(&body);
    out.push_str("</svg>\n");
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_are_short_and_stable() {
        assert_eq!(num(1.0), "1");
        assert_eq!(num(1.005), "1");
        assert_eq!(num(2.345), "2.35");
        assert_eq!(num(-0.001), "0");
    }

    #[test]
    #[cfg(debug_assertions)]
    #[should_panic(expected = "non-finite")]
    fn non_finite_geometry_stops_a_debug_build() {
        num(f64::NAN);
    }

    #[test]
    fn text_is_escaped() {
        assert_eq!(escape("<script>&\"'"), "&lt;script&gt;&amp;&quot;&#39;");
    }

    /// What `num` wrote before it used integer hundredths: Rust std's
    /// formatting (`{:.2}`) as the reference.
    fn num_by_std(v: f64) -> String {
        let r = (v * 100.0).round() / 100.0;
        let s = format!("{r:.2}");
        let s = s.trim_end_matches('0').trim_end_matches('.');
        if s == "-0" {
            "0".into()
        } else {
            s.into()
        }
    }

    #[test]
    fn num_matches_std_formatting() {
        let mut x: u64 = 0x2545_f491_4f6c_dd1d;
        let mut next = || {
            // xorshift64* (Vigna 2016)
            x ^= x >> 12;
            x ^= x << 25;
            x ^= x >> 27;
            x.wrapping_mul(0x2545_f491_4f6c_dd1d)
        };
        let mut values = vec![0.0, -0.0, 0.005, -0.005, 0.015, 1.005, -1.005, 0.125, -0.004, 1e15, 9.007e13, 9.1e13, 1e300, -1e300, f64::MAX];
        for k in -2000..2000 {
            values.push(k as f64 / 1000.0);
            values.push(k as f64 / 200.0 + 0.0049999);
        }
        for _ in 0..1_000_000 {
            let r = next();
            values.push(match r % 3 {
                0 => f64::from_bits(next()),
                1 => (next() % 200_000_001) as f64 / 1000.0 - 100_000.0,
                _ => (next() as i64 as f64) / (1u64 << (next() % 64)) as f64,
            });
        }
        for v in values.into_iter().filter(|v| v.is_finite()) {
            assert_eq!(num(v), num_by_std(v), "{v:e}");
        }
    }
}

#[cfg(test)]
mod document_tests {
    use crate::{render, RenderOptions};

    fn chart(extra: &str) -> String {
        let spec = format!(
            r#"{{ "title": "Rain <b>&amp</b> \"sun\"", "data": {{ "rows": [
                {{"m": "Jan", "v": 3.25, "g": "North <pier>"}}, {{"m": "Feb", "v": 7.5, "g": "South"}}, {{"m": "Mar", "v": 1.125, "g": "North <pier>"}} ] }},
                "layers": [ {{ "draw": "bar", "x": "m", "y": "v", "color": "g" }} ] {extra} }}"#
        );
        render(&spec, None, &RenderOptions::default()).unwrap().svg
    }

    #[test]
    fn strict_csp_and_escaping() {
        let svg = chart("");
        // Presentation attributes only: nothing a strict style-src would block.
        assert!(!svg.contains("style=") && !svg.contains("<style"), "{svg}");
        assert!(!svg.contains("<b>") && !svg.contains("<pier>"));
        assert!(svg.contains("Rain &lt;b&gt;&amp;amp&lt;/b&gt; &quot;sun&quot;"));
        assert!(svg.contains("North &lt;pier&gt;"));
    }

    #[test]
    fn coordinates_have_at_most_two_decimals() {
        let svg = chart("");
        for attr in [" x=\"", " y=\"", " width=\"", " height=\"", " x1=\"", " y1=\"", " cx=\"", " cy=\""] {
            for part in svg.split(attr).skip(1) {
                let v = &part[..part.find('"').unwrap()];
                if let Some((_, frac)) = v.split_once('.') {
                    assert!(frac.len() <= 2, "{attr}{v}");
                }
            }
        }
    }

    #[test]
    fn deterministic_ids_and_roles() {
        let a = chart("");
        assert_eq!(a, chart(""), "same input, same bytes");
        let b = chart(r#", "subtitle": "another chart""#);
        let id = |s: &str| s.split("aria-labelledby=\"").nth(1).unwrap().split('"').next().unwrap().to_string();
        assert_ne!(id(&a), id(&b), "different charts, different ids");
        // WAI-ARIA Graphics Module roles: document, objects per panel and layer, symbols per mark.
        assert!(a.contains("role=\"graphics-document document\""));
        assert!(a.contains("class=\"strata-panel\" role=\"graphics-object\""));
        assert!(a.contains("class=\"strata-layer strata-bar\" role=\"graphics-object\" aria-label=\"layer 1: 3 bars\""));
        assert_eq!(a.matches("role=\"graphics-symbol\"").count(), 3);
        assert!(a.contains("aria-label=\"x: Jan, y: 3.25, color: North &lt;pier&gt;\""));
        // Title and the automatic description.
        assert!(a.contains("<title id=\"") && a.contains("<desc id=\""));
        assert!(a.contains("Bar chart of v against m, in 2 groups by G"));
    }

    #[test]
    fn description_from_the_spec_wins() {
        let svg = chart(r#", "description": "Written by hand.""#);
        assert!(svg.contains(">Written by hand.</desc>"));
    }

    #[test]
    fn theme_classes() {
        assert!(chart("").contains("class=\"strata strata-auto\""));
        assert!(chart(r#", "theme": "dark""#).contains("class=\"strata strata-dark\""));
        let own = chart(r##", "theme": { "base": "dark", "grid": "#333333" }"##);
        assert!(own.contains("class=\"strata strata-dark strata-own-grid\"") && own.contains("stroke=\"#333333\""));
    }
}
