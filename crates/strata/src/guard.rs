//! Bounds on what a spec may ask for, checked on the JSON value before
//! anything is computed: colours are CSS colours (nothing else reaches an SVG
//! attribute), sizes and widths are finite and within reason, label patterns
//! are short with narrow fields, and the spec has a bounded number of layers
//! and derived columns. Each refusal is a located error.
//!
//! The whole-chart budgets that need data (marks, derived bytes, categories,
//! output size) are in [`crate::budget`].

use crate::color::css;
use crate::error::Diagnostic;
use serde_json::Value;

/// The widest or tallest chart, in pixels.
pub const MAX_CHART_PIXELS: f64 = 100_000.0;
/// The widest stroke, largest point radius or font size, in pixels.
pub const MAX_STYLE_PIXELS: f64 = 1_000.0;
/// The longest dash pattern, and its longest entry in pixels.
pub const MAX_DASH_ENTRIES: usize = 64;
pub const MAX_DASH_PIXELS: f64 = 10_000.0;
/// The longest label pattern, in characters.
pub const MAX_PATTERN_CHARS: usize = 100;
/// The widest field of a pattern (defined by the format library, which caps it too).
pub use crate::format::MAX_FIELD_WIDTH;
/// The most layers and derived columns a spec may have.
pub const MAX_LAYERS: usize = 200;
pub const MAX_DERIVES: usize = 500;

/// Every bound this module knows, on a spec's JSON value; problems are pushed
/// onto `errors` with their paths.
pub fn check_spec_value(spec: &Value, errors: &mut Vec<Diagnostic>) {
    if let Some(layers) = spec.get("layers").and_then(Value::as_array) {
        if layers.len() > MAX_LAYERS {
            errors.push(
                Diagnostic::error("budget.layers", format!("the spec has {} layers, more than the {MAX_LAYERS} a chart may have", layers.len()))
                    .at_path("layers"),
            );
            return;
        }
        for (i, layer) in layers.iter().enumerate() {
            let Some(style) = layer.get("style") else { continue };
            let at = |k: &str| format!("layers[{i}].style.{k}");
            color(style.get("color"), &at("color"), errors);
            for k in ["width", "radius", "font_size"] {
                pixels(style.get(k), &at(k), MAX_STYLE_PIXELS, errors);
            }
            if let Some(dash) = style.get("dash").and_then(Value::as_array) {
                if dash.len() > MAX_DASH_ENTRIES {
                    errors.push(too_large(&at("dash"), format!("a dash pattern has at most {MAX_DASH_ENTRIES} entries")));
                } else {
                    for (j, d) in dash.iter().enumerate() {
                        pixels(Some(d), &format!("{}[{j}]", at("dash")), MAX_DASH_PIXELS, errors);
                    }
                }
            }
        }
    }
    if let Some(derive) = spec.get("derive").and_then(Value::as_object) {
        if derive.len() > MAX_DERIVES {
            errors.push(
                Diagnostic::error("budget.derive", format!("the spec derives {} columns, more than the {MAX_DERIVES} allowed", derive.len())).at_path("derive"),
            );
        }
    }
    if let Some(theme) = spec.get("theme").filter(|t| t.is_object()) {
        for k in ["background", "text", "muted", "grid", "axis", "mark"] {
            color(theme.get(k), &format!("theme.{k}"), errors);
        }
    }
    if let Some(size) = spec.get("size") {
        for k in ["width", "height"] {
            pixels(size.get(k), &format!("size.{k}"), MAX_CHART_PIXELS, errors);
        }
        if let Some(a) = size.get("aspect").and_then(Value::as_f64) {
            if a != 0.0 && !(1e-3..=1e3).contains(&a) {
                errors.push(too_large("size.aspect", "the aspect (width / height) must be from 0.001 to 1000".into()));
            }
        }
    }
    if let Some(scales) = spec.get("scales").and_then(Value::as_object) {
        for (name, s) in scales {
            // The layout thins labels by asking for one tick fewer at a time.
            if let Some(list) = s.get("ticks").and_then(Value::as_array).filter(|l| l.len() > crate::scale::MAX_TICKS) {
                errors.push(too_large(
                    &format!("scales.{}.ticks", crate::expr::path_key(name)),
                    format!("{} chosen ticks is more than the {} a scale can show", list.len(), crate::scale::MAX_TICKS),
                ));
            }
            if let Some(t) = s.get("ticks").and_then(Value::as_f64) {
                if t > crate::scale::MAX_TICKS as f64 {
                    errors.push(too_large(
                        &format!("scales.{}.ticks", crate::expr::path_key(name)),
                        format!("{} ticks is more than the {} a scale can show", crate::format::float::Plain(t), crate::scale::MAX_TICKS),
                    ));
                }
            }
            // Chosen colours (`values`) are CSS colours like any other.
            if let Some(values) = s.get("values").and_then(Value::as_object) {
                for (cat, c) in values {
                    color(Some(c), &format!("scales.{}.values.{}", crate::expr::path_key(name), crate::expr::path_key(cat)), errors);
                }
            }
            if let Some(p) = s.get("format").and_then(Value::as_str) {
                if let Err(why) = pattern(p) {
                    errors.push(
                        Diagnostic::error("spec.bad_pattern", format!("this label pattern {why}"))
                            .at_path(format!("scales.{}.format", crate::expr::path_key(name)))
                            .with_hint("write a short LDML pattern, such as #,##0.0 or yyyy-MM-dd"),
                    );
                }
            }
        }
    }
}

fn too_large(path: &str, message: String) -> Diagnostic {
    Diagnostic::error("spec.too_large", message).at_path(path)
}

/// A colour must be CSS Color 4 syntax.
fn color(v: Option<&Value>, path: &str, errors: &mut Vec<Diagnostic>) {
    let Some(s) = v.and_then(Value::as_str) else { return };
    if let Err(why) = css::check(s) {
        let shown: String = s.chars().take(40).collect();
        let more = if s.chars().count() > 40 { "..." } else { "" };
        errors.push(
            Diagnostic::error("spec.bad_color", format!("`{shown}{more}` is not a colour: {why}"))
                .at_path(path)
                .with_hint("write a CSS colour: a name (steelblue), hex (#3c7ebe), or rgb(), hsl(), hwb(), lab(), lch(), oklab(), oklch()"),
        );
    }
}

/// A size in pixels must be a finite number no larger than `max`.
fn pixels(v: Option<&Value>, path: &str, max: f64, errors: &mut Vec<Diagnostic>) {
    let Some(x) = v.and_then(Value::as_f64) else { return };
    if !x.is_finite() || x > max {
        errors.push(too_large(path, format!("{} pixels is more than the {} allowed here", crate::format::float::Plain(x), crate::format::float::Plain(max))));
    }
}

/// A label pattern: at most [`MAX_PATTERN_CHARS`] characters, no field wider
/// than [`MAX_FIELD_WIDTH`] (quoted text aside).
pub fn pattern(p: &str) -> Result<(), String> {
    let n = p.chars().count();
    if n > MAX_PATTERN_CHARS {
        return Err(format!("has {n} characters, more than the {MAX_PATTERN_CHARS} allowed"));
    }
    let mut quoted = false;
    let mut run = 0usize;
    let mut last = '\0';
    let mut digits = 0usize;
    for c in p.chars() {
        if c == '\'' {
            quoted = !quoted;
            run = 0;
            continue;
        }
        if quoted {
            continue;
        }
        if c.is_ascii_alphabetic() && c == last {
            run += 1;
        } else {
            run = 1;
        }
        last = c;
        if c.is_ascii_alphabetic() && run > MAX_FIELD_WIDTH {
            return Err(format!("repeats `{c}` more than {MAX_FIELD_WIDTH} times"));
        }
        if c == '0' || c == '#' {
            digits += 1;
            if digits > MAX_FIELD_WIDTH {
                return Err(format!("has more than {MAX_FIELD_WIDTH} digit places"));
            }
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn errors(spec: serde_json::Value) -> Vec<Diagnostic> {
        let mut e = Vec::new();
        check_spec_value(&spec, &mut e);
        e
    }

    #[test]
    fn colours_reach_output_only_as_css_colours() {
        let e = errors(
            serde_json::json!({"layers": [{"draw": "point", "style": {"color": "url(http://example.org/t)"}}], "theme": {"background": "#fff", "grid": "red\"/><script>"}}),
        );
        let paths: Vec<&str> = e.iter().map(|d| d.at.path.as_str()).collect();
        assert_eq!(paths, ["layers[0].style.color", "theme.grid"]);
        assert!(e.iter().all(|d| d.code == "spec.bad_color"));
        assert!(errors(serde_json::json!({"layers": [{"draw": "point", "style": {"color": "oklch(0.6 0.1 250 / 50%)"}}]})).is_empty());
    }

    #[test]
    fn sizes_and_patterns_are_bounded() {
        let e = errors(serde_json::json!({"size": {"width": 1e12, "aspect": 1e-9}, "layers": [{"draw": "line", "style": {"width": 1e300, "dash": [1e9]}}]}));
        let paths: Vec<&str> = e.iter().map(|d| d.at.path.as_str()).collect();
        assert_eq!(paths, ["layers[0].style.width", "layers[0].style.dash[0]", "size.width", "size.aspect"]);
        assert!(pattern("yyyy-MM-dd").is_ok() && pattern("#,##0.00").is_ok() && pattern("'yyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyy'").is_ok());
        assert!(pattern(&"y".repeat(65_536)).is_err());
        assert!(pattern(&"y".repeat(33)).is_err());
        assert!(pattern(&format!("0.{}", "0".repeat(40))).is_err());
    }
}
