//! Lint: warnings about charts that draw but may mislead a reader. Never
//! errors. Each warning says why, and how to silence it on purpose with the
//! spec's top-level `"quiet": ["lint.code", ...]` list.
//!
//! [`check`] runs on the spec alone (as `strata check` does without data)
//! or with the plan (every render), which knows the trained scales.

use crate::channel::Channel;
use crate::color::{Palette, HARBOUR};
use crate::error::Diagnostic;
use crate::plan::{ColorScale, Plan};
use crate::scale::PositionScale;
use crate::spec::{AngleChannel, Coords, Geometry, ScaleKind, ScaleSpec, Spec, Theme};

/// Every lint code, for `quiet` and the schema.
pub const CODES: &[&str] = crate::spec::shape::LINT_CODES;

/// WCAG 2.1 success criterion 1.4.3 (level AA): 4.5:1 for normal text.
pub const MIN_TEXT_CONTRAST: f64 = 4.5;

fn warn(code: &str, path: impl Into<String>, why: String) -> Diagnostic {
    Diagnostic::warning(code, why).at_path(path).with_hint(format!("if this is on purpose, add \"quiet\": [\"{code}\"] to the spec"))
}

/// The lint warnings for a spec (and its plan, when there is one), less
/// those the spec silences in `quiet`.
pub fn check(spec: &Spec, plan: Option<&Plan>) -> Vec<Diagnostic> {
    let mut out = Vec::new();
    // Borrowed, not cloned (a clone of a scale spec is code the page carries).
    let no_scale = ScaleSpec::default();
    let y_spec = spec.scales.get(&Channel::Y).unwrap_or(&no_scale);
    let x_spec = spec.scales.get(&Channel::X).unwrap_or(&no_scale);
    // The value axis of bars is y, unless the plan shows categories on y and numbers on x.
    // A turned plan (horizontal bars) holds the spec's x in its y scale.
    let turned = plan.is_some_and(|p| p.chart.transposed);
    let value_axis = match plan {
        _ if turned => "x",
        Some(p) if matches!(p.scales.y, PositionScale::Category { .. }) && matches!(p.scales.x, PositionScale::Continuous { .. }) => "x",
        _ => "y",
    };
    let value_spec = if value_axis == "x" { &x_spec } else { &y_spec };
    let log = value_spec.kind == Some(ScaleKind::Log);

    // Bars on a log scale.
    if log {
        if let Some(i) = spec.layers.iter().position(|l| l.draw == Geometry::Bar) {
            out.push(warn(
                "lint.log_bars",
                format!("scales.{value_axis}.kind"),
                format!(
                    "layers[{i}] draws bars on a log scale: a bar's length then shows no quantity (a log scale has no zero to start \
                     from), so readers compare lengths that mean nothing; use points or a line, or a linear scale"
                ),
            ));
        }
    }
    // Bars or areas whose value axis leaves out zero.
    if !log {
        if let Some(i) = spec.layers.iter().position(|l| matches!(l.draw, Geometry::Bar | Geometry::Area)) {
            let geom = spec.layers[i].draw.word();
            let trained = plan.and_then(|p| match if value_axis == "x" && !turned { &p.scales.x } else { &p.scales.y } {
                PositionScale::Continuous { lo, hi, .. } => Some((lo.min(*hi), lo.max(*hi))),
                _ => None,
            });
            let from_spec = value_spec.domain.as_ref().and_then(|d| {
                let v: Vec<f64> = d.iter().filter_map(|x| x.as_f64()).collect();
                (v.len() == 2).then(|| (v[0].min(v[1]), v[0].max(v[1])))
            });
            // Without a plan only an explicit domain tells; `zero: false`
            // alone does not, as bars still reach down to their base at 0.
            let leaves_out = match trained.or(from_spec) {
                Some((lo, hi)) => lo > 0.0 || hi < 0.0,
                None => false,
            };
            if leaves_out {
                let path = if value_spec.domain.is_some() { format!("scales.{value_axis}.domain") } else { format!("scales.{value_axis}") };
                out.push(warn(
                    "lint.axis_without_zero",
                    path,
                    format!(
                        "layers[{i}] draws {geom}s on a {value_axis} axis that leaves out zero: a {geom}'s length or area is read as \
                         its value, so cutting the axis makes small differences look large; let the axis include zero"
                    ),
                ));
            }
        }
    }
    // More categorical colours than the palette keeps apart.
    if let Some(Some(ColorScale::Categories(cats))) = plan.map(|p| p.scales.color.as_ref()) {
        if cats.len() > HARBOUR.len() {
            let path = spec.layers.iter().position(|l| l.color.is_some()).map(|i| format!("layers[{i}].color")).unwrap_or_default();
            out.push(warn(
                "lint.too_many_colors",
                path,
                format!(
                    "the colour channel has {} categories but the palette has {} hues that can be told apart: colours repeat, so \
                     readers match marks to the wrong legend entry; show fewer categories, group the rest, or use panels",
                    cats.len(),
                    HARBOUR.len()
                ),
            ));
        }
    }
    // A polar chart whose angle is a continuous value that does not wrap around.
    if let (Coords::Polar(p), Some(plan)) = (&spec.coords, plan) {
        let (axis, scale) = match p.angle {
            AngleChannel::X => ("x", &plan.scales.x),
            AngleChannel::Y => ("y", &plan.scales.y),
        };
        if let PositionScale::Continuous { time, .. } = scale {
            let what = if *time { "dates or times" } else { "a continuous number" };
            out.push(warn(
                "lint.polar_angle_not_cyclic",
                "coords.angle",
                format!(
                    "the angle shows {what} ({axis}): the circle joins its end to its start, so the last value sits beside the \
                     first as if they were close; use cartesian coordinates, unless the value wraps around (hour of day, \
                     compass bearing)"
                ),
            ));
        }
    }
    // Two layers of one geometry showing different columns in one colour.
    out.extend(look_alike(spec));
    // Text below WCAG 2.1 AA contrast against the background.
    out.extend(contrast(spec));
    out.retain(|d| !spec.quiet.contains(&d.code));
    out
}

/// Layers of one geometry (lines, points, areas, steps) that show different
/// `y` columns with neither a `color` channel nor a `style.color` are drawn
/// alike and get no legend (seen in a user trial: unemployment and
/// inflation as two lines of one colour).
fn look_alike(spec: &Spec) -> Vec<Diagnostic> {
    let plain = |l: &crate::spec::Layer| {
        matches!(l.draw, Geometry::Line | Geometry::Point | Geometry::Area | Geometry::Step) && l.color.is_none() && l.style.color.is_none()
    };
    for (j, b) in spec.layers.iter().enumerate() {
        let Some(yb) = b.y.as_ref().filter(|_| plain(b)) else { continue };
        let twin = spec.layers[..j].iter().position(|a| plain(a) && a.draw == b.draw && a.y.as_ref().is_some_and(|ya| ya.column != yb.column));
        if let Some(i) = twin {
            let ya = &spec.layers[i].y.as_ref().map(|m| m.column.as_str()).unwrap_or_default();
            return vec![warn(
                "lint.layers_look_alike",
                format!("layers[{j}]"),
                format!(
                    "layers[{i}] and layers[{j}] draw {}s of different columns (`{ya}`, `{}`) in one colour, with no legend: readers \
                     cannot tell which is which; turn the columns into rows with `unpivot` and map `color` to the names column, or \
                     give each layer its own `style.color` and name it (`label_ends`)",
                    b.draw.word(),
                    yb.column
                ),
            )];
        }
    }
    Vec::new()
}

fn contrast(spec: &Spec) -> Vec<Diagnostic> {
    let mut out = Vec::new();
    let custom = match &spec.theme {
        Theme::Custom(o) => Some(o),
        _ => None,
    };
    // The themes a reader may see, light first: no list of palettes built.
    for dark in [false, true] {
        let shown = match &spec.theme {
            Theme::Light => !dark,
            Theme::Dark => dark,
            Theme::Auto => true,
            Theme::Custom(o) => dark == (o.base == Some(crate::spec::ThemeBase::Dark)),
        };
        if !shown {
            continue;
        }
        let name = if dark { "dark" } else { "light" };
        let pal = if dark { Palette::dark() } else { Palette::light() };
        let pick = |over: Option<&Option<String>>, base: &str| -> String { over.and_then(Option::as_ref).map_or_else(|| base.to_string(), String::clone) };
        let background = pick(custom.map(|o| &o.background), &pal.background);
        let Some(bg) = parse_css_color(&background) else { continue };
        let bg = [bg[0], bg[1], bg[2]];
        let mut one = |path: String, role: &str, color: &str| {
            let Some(fg) = parse_css_color(color) else { return };
            let ratio = contrast_ratio(over(fg, bg), bg);
            if ratio < MIN_TEXT_CONTRAST {
                out.push(warn(
                    "lint.low_contrast",
                    path,
                    format!(
                        "{role} ({color}) on the {name} background ({background}) have a contrast of {}:1, below the 4.5:1 WCAG 2.1 AA \
                         asks for text; readers with low vision, or on a bright screen, may not make it out; pick a darker or \
                         lighter colour",
                        crate::format::float::fixed((ratio * 100.0).floor() / 100.0, 2)
                    ),
                ));
            }
        };
        // The theme's own colours are at `theme` unless the spec set them.
        let at = |k: &str| if custom.is_some() { format!("theme.{k}") } else { "theme".to_string() };
        one(at("text"), "titles and labels", &pick(custom.map(|o| &o.text), &pal.text));
        one(at("muted"), "subtitles, sources and tick labels", &pick(custom.map(|o| &o.muted), &pal.muted));
        for (i, l) in spec.layers.iter().enumerate() {
            if let (Geometry::Label, Some(c)) = (l.draw, &l.style.color) {
                one(format!("layers[{i}].style.color"), "label text", c);
            }
        }
    }
    out
}

/// Relative luminance of an sRGB colour (channels 0..1), per the WCAG 2.1
/// definition (Understanding SC 1.4.3 / "relative luminance" glossary entry).
pub fn relative_luminance(rgb: [f64; 3]) -> f64 {
    let lin = |c: f64| if c <= 0.03928 { c / 12.92 } else { crate::math::pow((c + 0.055) / 1.055, 2.4) };
    0.2126 * lin(rgb[0]) + 0.7152 * lin(rgb[1]) + 0.0722 * lin(rgb[2])
}

/// WCAG 2.1 contrast ratio (L1 + 0.05) / (L2 + 0.05), lighter over darker.
pub fn contrast_ratio(a: [f64; 3], b: [f64; 3]) -> f64 {
    let (la, lb) = (relative_luminance(a), relative_luminance(b));
    (la.max(lb) + 0.05) / (la.min(lb) + 0.05)
}

/// A translucent colour composited over an opaque background.
fn over(fg: [f64; 4], bg: [f64; 3]) -> [f64; 3] {
    let a = fg[3];
    [fg[0] * a + bg[0] * (1.0 - a), fg[1] * a + bg[1] * (1.0 - a), fg[2] * a + bg[2] * (1.0 - a)]
}

/// The sRGB channels and alpha (0..1) of a colour lint can compare: hex,
/// `rgb()`/`rgba()`, `black`, `white`, `transparent` (CSS Color Level 4);
/// `None` for anything else (not linted). One reader with the spec's colour
/// check: [`crate::color::css::srgb`].
pub fn parse_css_color(s: &str) -> Option<[f64; 4]> {
    crate::color::css::srgb(s)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::parse_spec;

    fn codes(spec: &str) -> Vec<String> {
        check(&parse_spec(spec).unwrap(), None).into_iter().map(|d| d.code).collect()
    }

    #[test]
    fn wcag_definition_values() {
        // WCAG 2.1, "contrast ratio" and "relative luminance": black on white is
        // (1 + 0.05) / (0 + 0.05) = 21; the primaries' luminances are the
        // coefficients 0.2126, 0.7152, 0.0722.
        assert_eq!(contrast_ratio([0.0; 3], [1.0; 3]), 21.0);
        assert!((relative_luminance([1.0, 0.0, 0.0]) - 0.2126).abs() < 1e-12);
        assert!((relative_luminance([0.0, 1.0, 0.0]) - 0.7152).abs() < 1e-12);
        assert_eq!(contrast_ratio([0.5; 3], [0.5; 3]), 1.0);
    }

    #[test]
    fn house_themes_pass_and_bad_overrides_warn() {
        assert!(codes(r#"{"layers":[{"draw":"point"}]}"#).is_empty());
        assert!(codes(r#"{"layers":[{"draw":"point"}],"theme":"dark"}"#).is_empty());
        let d = check(&parse_spec(r##"{"layers":[{"draw":"point"}],"theme":{"muted":"#aaaaaa"}}"##).unwrap(), None);
        assert_eq!(d.len(), 1);
        assert_eq!(d[0].at.path, "theme.muted");
        assert!(d[0].message.contains("2.32:1"), "{}", d[0].message);
        assert!(d[0].hint.as_deref().unwrap().contains("\"quiet\": [\"lint.low_contrast\"]"));
        let spec = r##"{"layers":[{"draw":"label","style":{"color":"rgb(255 255 0 / 90%)"}}],"theme":"light"}"##;
        assert_eq!(codes(spec), vec!["lint.low_contrast"]);
    }

    #[test]
    fn spec_only_rules_and_quiet() {
        assert_eq!(codes(r#"{"layers":[{"draw":"bar"}],"scales":{"y":{"kind":"log"}}}"#), vec!["lint.log_bars"]);
        assert!(codes(r#"{"layers":[{"draw":"area"}],"scales":{"y":{"zero":false}}}"#).is_empty());
        assert_eq!(codes(r#"{"layers":[{"draw":"area"}],"scales":{"y":{"domain":[-9, -1]}}}"#), vec!["lint.axis_without_zero"]);
        assert_eq!(codes(r#"{"layers":[{"draw":"bar"}],"scales":{"y":{"domain":[50, 100]}}}"#), vec!["lint.axis_without_zero"]);
        assert!(codes(r#"{"layers":[{"draw":"bar"}],"scales":{"y":{"domain":[0, 100]}}}"#).is_empty());
        assert!(codes(r#"{"layers":[{"draw":"point"}],"scales":{"y":{"zero":false}}}"#).is_empty());
        assert!(codes(r#"{"layers":[{"draw":"bar"}],"scales":{"y":{"kind":"log"}},"quiet":["lint.log_bars"]}"#).is_empty());
        // Two lines of different columns in one colour; a colour on either tells them apart.
        assert_eq!(codes(r#"{"layers":[{"draw":"line","x":"t","y":"a"},{"draw":"line","x":"t","y":"b"}]}"#), vec!["lint.layers_look_alike"]);
        assert!(codes(r#"{"layers":[{"draw":"line","x":"t","y":"a"},{"draw":"line","x":"t","y":"b","style":{"color":"red"}}]}"#).is_empty());
        assert!(codes(r#"{"layers":[{"draw":"line","x":"t","y":"a"},{"draw":"point","x":"t","y":"a"}]}"#).is_empty());
        assert!(codes(r#"{"layers":[{"draw":"line","x":"t","y":"a","color":"k"},{"draw":"line","x":"t","y":"b","color":"k"}]}"#).is_empty());
    }

    #[test]
    fn contrast_matches_coloraide() {
        // coloraide 8.13.1, Color.contrast(method="wcag21"), 284 CSS colour
        // pairs (tests/reference/gen/wcag_contrast.py).
        let doc: serde_json::Value = serde_json::from_str(include_str!("../../../tests/reference/fixtures/lint/contrast.json")).unwrap();
        let pairs = doc["pairs"].as_array().unwrap();
        assert!(pairs.len() > 200);
        for p in pairs {
            let fg = parse_css_color(p["fg"].as_str().unwrap()).unwrap();
            let bg = parse_css_color(p["bg"].as_str().unwrap()).unwrap();
            let bg = [bg[0], bg[1], bg[2]];
            let got = contrast_ratio(over(fg, bg), bg);
            let want = p["ratio"].as_f64().unwrap();
            // coloraide takes luminance from the full-precision sRGB-to-XYZ
            // matrix (Y row 0.212639..., 0.715168..., 0.072192...); WCAG 2.1
            // writes the coefficients to 4 places, so ratios differ by up to ~1.5e-4
            // relative (red on white: 3.9985 by WCAG, 3.9979 by coloraide), below the 2 decimals reported.
            assert!((got - want).abs() < 3e-4 * want, "{} on {}: {got} vs coloraide {want}", p["fg"], p["bg"]);
        }
    }

    fn rendered(spec: &str) -> Vec<String> {
        let r = crate::render(spec, None, &crate::RenderOptions::default()).unwrap();
        r.warnings.into_iter().filter(|d| d.code.starts_with("lint.")).map(|d| d.code).collect()
    }

    #[test]
    fn rules_that_need_the_plan() {
        let rows: Vec<String> = (0..9).map(|i| format!(r#"{{"k":"c{i}","v":{},"n":{i}}}"#, 50 + i)).collect();
        let data = format!(r#""data":{{"rows":[{}]}}"#, rows.join(","));
        assert_eq!(rendered(&format!(r#"{{{data},"layers":[{{"draw":"point","x":"n","y":"v","color":"k"}}]}}"#)), vec!["lint.too_many_colors"]);
        assert!(rendered(&format!(r#"{{{data},"layers":[{{"draw":"point","x":"n","y":"v"}}]}}"#)).is_empty());
        // Bars include zero by default; a domain of 40..60 leaves it out.
        assert!(rendered(&format!(r#"{{{data},"layers":[{{"draw":"bar","x":"k","y":"v"}}]}}"#)).is_empty());
        assert_eq!(
            rendered(&format!(r#"{{{data},"layers":[{{"draw":"bar","x":"k","y":"v"}}],"scales":{{"y":{{"domain":[40,60]}}}}}}"#)),
            vec!["lint.axis_without_zero"]
        );
        // Horizontal bars (categories on y): the value axis is the spec's x, and the warning says so.
        let r = crate::render(
            &format!(r#"{{{data},"layers":[{{"draw":"bar","x":"v","y":"k"}}],"scales":{{"x":{{"domain":[40,60]}}}}}}"#),
            None,
            &crate::RenderOptions::default(),
        )
        .unwrap();
        let w: Vec<(&str, &str)> = r.warnings.iter().filter(|d| d.code.starts_with("lint.")).map(|d| (d.code.as_str(), d.at.path.as_str())).collect();
        assert_eq!(w, [("lint.axis_without_zero", "scales.x.domain")]);
        assert!(rendered(&format!(r#"{{{data},"layers":[{{"draw":"bar","x":"v","y":"k"}}]}}"#)).is_empty());
        assert_eq!(rendered(&format!(r#"{{{data},"layers":[{{"draw":"point","x":"n","y":"v"}}],"coords":"polar"}}"#)), vec!["lint.polar_angle_not_cyclic"]);
        assert!(rendered(&format!(r#"{{{data},"layers":[{{"draw":"bar","x":"k","y":"v"}}],"coords":"polar"}}"#)).is_empty());
        assert!(rendered(&format!(r#"{{{data},"layers":[{{"draw":"point","x":"n","y":"v"}}],"coords":"polar","quiet":["lint.polar_angle_not_cyclic"]}}"#))
            .is_empty());
    }

    #[test]
    fn css_colors() {
        assert_eq!(parse_css_color("#fff"), Some([1.0, 1.0, 1.0, 1.0]));
        assert_eq!(parse_css_color("#33669980").map(|c| c[3]), Some(128.0 / 255.0));
        assert_eq!(parse_css_color("rgb(255, 0, 0)"), Some([1.0, 0.0, 0.0, 1.0]));
        assert_eq!(parse_css_color("rgba(0 0 0 / 50%)"), Some([0.0, 0.0, 0.0, 0.5]));
        assert_eq!(parse_css_color("rgb(100% 50% 0%)"), Some([1.0, 0.5, 0.0, 1.0]));
        assert_eq!(parse_css_color("oklch(0.5 0.1 20)"), None);
        assert_eq!(parse_css_color("#12"), None);
        // CSS Color Level 4, 5.2 "The RGB hexadecimal notations": in #rgba
        // each digit stands doubled (#0f08 is #00ff0088); 5, 7 or 9 digits
        // are no colour.
        assert_eq!(parse_css_color("#0f08"), Some([0.0, 1.0, 0.0, 136.0 / 255.0]));
        assert_eq!(parse_css_color("#ff0000"), Some([1.0, 0.0, 0.0, 1.0]));
        for bad in ["#", "#12345", "#1234567", "#123456789"] {
            assert_eq!(parse_css_color(bad), None, "{bad}");
        }
        // 5.1 "The RGB functions": the legacy rgba() takes its alpha as a
        // fourth comma-separated value; five values, or four and a slash,
        // are no colour.
        assert_eq!(parse_css_color("rgba(255, 0, 0, 0.5)"), Some([1.0, 0.0, 0.0, 0.5]));
        assert_eq!(parse_css_color("rgb(1 2 3 4 5)"), None);
        assert_eq!(parse_css_color("rgb(1 2 3 4 / 0.5)"), None);
        // Only colours the spec's check accepts are read; `none` channels and
        // named colours other than black and white are not compared.
        assert_eq!(parse_css_color(" RGB(0 0 255 / 25%) "), Some([0.0, 0.0, 1.0, 0.25]));
        assert_eq!(parse_css_color("#FFF"), Some([1.0; 4]));
        assert_eq!(parse_css_color("rgb(0 none 0)"), None);
        assert_eq!(parse_css_color("red"), None);
        assert_eq!(parse_css_color("rgb(255, 50%, 0)"), None);
    }
}
