//! Spec text to [`Spec`], with errors that carry the JSON path.
//!
//! Passes, each reporting every problem it finds: JSON syntax; the shape
//! check ([`super::shape`]: unknown keys and words with did-you-mean, wrong
//! types saying what was expected and found, ranges); and checks that later
//! stages pass in (the crate's `parse_spec` passes the syntax check of
//! `derive` and `where` expressions, so the spec stage needs no expression
//! parser). Only then is the value read into the typed spec (`read.rs`).

use super::read::Read;
use super::shape::{check, spec_shape};
use super::Spec;
use crate::error::{Diagnostic, Errors};
use serde_json::Value;

/// A check of the raw spec value that a later stage owns, run beside the
/// shape check so every problem is reported at once.
pub type ExtraCheck<'a> = &'a dyn Fn(&Value) -> Vec<Diagnostic>;

/// Parse a spec from JSON text. Errors carry the JSON path of the offending
/// key (`layers[0].draw`) and, for JSON syntax errors, the line and column.
pub fn parse_spec_with(text: &str, extra: ExtraCheck) -> Result<Spec, Errors> {
    let value: Value = crate::json::from_str(text).map_err(|e| {
        Diagnostic::error(
            "spec.json_syntax",
            format!("the spec is not valid JSON: {} (spec line {}, column {})", strip_position(&e.to_string()), e.line(), e.column()),
        )
    })?;
    spec_from_value_with(&value, extra)
}

/// Check and read a spec already parsed as JSON.
pub fn spec_from_value_with(value: &Value, extra: ExtraCheck) -> Result<Spec, Errors> {
    let mut errors = Vec::new();
    if !value.is_object() {
        return Err(Diagnostic::error("spec.wrong_type", "a spec is a JSON object, such as {\"layers\": [...]}").into());
    }
    check(value, &spec_shape(), "", &mut errors);
    if let Some(layers) = value.get("layers").and_then(Value::as_array) {
        if layers.is_empty() {
            errors.push(
                Diagnostic::error("spec.no_layers", "the spec has no layers; add at least one, such as {\"draw\": \"point\", \"x\": \"a\", \"y\": \"b\"}")
                    .at_path("layers"),
            );
        }
    }
    errors.extend(extra(value));
    if !errors.is_empty() {
        return Err(Errors(errors));
    }
    // The core engine refuses a part only the full engine draws here,
    // before reading it, so its readers are not in the core (the page then
    // draws the chart with the full engine). A spec with errors got them
    // above, in either engine, with their paths.
    #[cfg(not(feature = "full"))]
    if let Some((path, word)) = super::needs_full_value(value) {
        return Err(crate::needs_full_engine(&path, word).into());
    }
    // The shape check has already reported every problem with its path; a
    // value it accepts reads (tests/spec_schema.rs holds this on thousands
    // of mutations), so a failure here has no better path to give.
    Spec::read(value).map_err(|e| Diagnostic::error("spec.invalid", e).into())
}

/// serde_json appends " at line L column C"; the path says more.
fn strip_position(msg: &str) -> String {
    match msg.rfind(" at line ") {
        Some(i) => msg[..i].to_string(),
        None => msg.to_string(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::parse_spec;

    fn errs(text: &str) -> Vec<Diagnostic> {
        parse_spec(text).unwrap_err().0
    }

    #[test]
    fn minimal_spec_parses() {
        let s = parse_spec(r#"{"layers":[{"draw":"point","x":"a","y":{"column":"b","as":"number"}}]}"#).unwrap();
        assert_eq!(s.layers.len(), 1);
        assert_eq!(s.layers[0].x.as_ref().unwrap().column, "a");
    }

    #[test]
    fn unknown_key_names_its_path_and_suggests() {
        let e = errs(r#"{"layers":[{"draw":"point"},{"draw":"bar","stat":{"bin":{"rul":"fd"}}}]}"#);
        assert_eq!(e[0].at.path, "layers[1].stat.bin.rul");
        assert_eq!(e[0].code, "spec.unknown_key");
        assert_eq!(e[0].hint.as_deref(), Some("did you mean `rule`?"));
    }

    #[test]
    fn bad_word_names_its_path_and_suggests() {
        let e = errs(r#"{"layers":[{"draw":"pie"}, {"draw":"bar","stat":{"bin":{"rule":"fdd"}}}]}"#);
        assert_eq!(e.len(), 2);
        assert_eq!(e[0].at.path, "layers[0].draw");
        assert!(e[0].message.contains("`pie` is not one of `point`"), "{}", e[0].message);
        assert_eq!(e[1].at.path, "layers[1].stat.bin.rule");
        assert_eq!(e[1].hint.as_deref(), Some("did you mean `fd`?"));
    }

    #[test]
    fn retired_words_are_refused_with_a_hint_naming_the_new_word() {
        // (spec, path, new word): each old word fails, and the hint names
        // its replacement even where edit distance would not find it.
        let cases = [
            (r#"{"layers":[{"draw":"point","stat":"identity"}]}"#, "layers[0].stat", "none"),
            (r#"{"layers":[{"draw":"ribbon"}]}"#, "layers[0].draw", "band"),
            (r#"{"layers":[{"draw":"bar","style":{"band":0.5}}]}"#, "layers[0].style.band", "share"),
            (r#"{"layers":[{"draw":"tile"}]}"#, "layers[0].draw", "cell"),
            (r#"{"layers":[{"draw":"rule"}]}"#, "layers[0].draw", "segment"),
            (r#"{"layers":[{"draw":"point"}],"panels":{"by":"g","free":"y"}}"#, "panels.free", "independent"),
            (r#"{"layers":[{"draw":"point","tip":["a"]}]}"#, "layers[0].tip", "tooltip"),
        ];
        for (spec, path, new) in cases {
            let e = errs(spec);
            assert_eq!(e.len(), 1, "{spec}: {e:?}");
            assert_eq!(e[0].at.path, path, "{spec}");
            let hint = e[0].hint.as_deref().unwrap_or_default();
            assert!(hint.contains(&format!("`{new}`")), "{spec}: {hint}");
        }
        // `coords: "flip"` is gone: orientation is to follow the data.
        let e = errs(r#"{"layers":[{"draw":"bar"}],"coords":"flip"}"#);
        assert_eq!(e[0].at.path, "coords");
        assert!(e[0].hint.as_deref().unwrap().contains("orientation is to follow the data"), "{:?}", e[0].hint);
        // `band` stays a fit's key, so it gets no hint there.
        assert!(parse_spec(r#"{"layers":[{"draw":"band","stat":{"fit":"linear","band":0.9}}]}"#).is_ok());
        // The new words read.
        assert!(parse_spec(
            r#"{"layers":[{"draw":"cell","stat":"none","tooltip":["a"],"style":{"share":0.5}},{"draw":"segment"}],"panels":{"by":"g","independent":"both"}}"#
        )
        .is_ok());
    }

    #[test]
    fn several_errors_at_once_with_expected_and_found() {
        let e = errs(
            r#"{"titel":"x","size":{"width":"wide"},"layers":[{"draw":"line","colour":"a","style":{"opacity":2}}],
                "scales":{"z":{}},"derive":{"a":"1 +"},"where":"x >","quiet":["lint.log_bar"]}"#,
        );
        let got: Vec<(&str, &str)> = e.iter().map(|d| (d.at.path.as_str(), d.code.as_str())).collect();
        assert_eq!(
            got,
            vec![
                ("titel", "spec.unknown_key"),
                ("size.width", "spec.wrong_type"),
                ("layers[0].colour", "spec.unknown_key"),
                ("layers[0].style.opacity", "spec.out_of_range"),
                ("scales.z", "spec.unknown_key"),
                ("quiet[0]", "spec.unknown_word"),
                ("derive.a", "expr.invalid"),
                ("where", "expr.invalid"),
            ]
        );
        assert_eq!(e[0].hint.as_deref(), Some("did you mean `title`?"));
        assert_eq!(e[1].message, "expected a number of at least 0, found the text \"wide\"");
        assert_eq!(e[2].hint.as_deref(), Some("did you mean `color`?"));
        assert_eq!(e[3].message, "expected a number from 0 to 1, found 2");
        assert_eq!(e[5].hint.as_deref(), Some("did you mean `lint.log_bars`?"));
        assert!(e[7].message.contains("character 4"), "{}", e[7].message);
    }

    #[test]
    fn word_or_object_keys() {
        let e = errs(r#"{"layers":[{"draw":"bar","stat":{"bin":{},"summary":"mean"}}],"coords":{"kind":"polar","angle":"z"}}"#);
        assert_eq!(e[0].code, "spec.one_of");
        assert_eq!(e[0].at.path, "layers[0].stat");
        assert_eq!(e[1].at.path, "coords.angle");
        let e = errs(r#"{"layers":[{"draw":"bar","x":3}]}"#);
        assert_eq!(e[0].message, "expected a column name, or an object, found the number 3");
        let e = errs(r#"{"layers":[{"draw":"bar","stat":{"window":{"rows":2.5}}}]}"#);
        assert_eq!(e[0].at.path, "layers[0].stat.window.rows");
        assert!(e[0].hint.as_deref().unwrap().contains("whole number"));
        assert!(parse_spec(r##"{"layers":[{"draw":"bar","stat":{"window":{"rows":7,"align":"trailing"}}}],"coords":"polar","theme":{"text":"#000"}}"##).is_ok());
    }

    #[test]
    fn missing_required_and_empty_layers() {
        let e = errs(r#"{"layers":[{"x":"a"}]}"#);
        assert_eq!(e[0].code, "spec.missing_key");
        assert_eq!(e[0].at.path, "layers[0]");
        let e = errs(r#"{"title":"t"}"#);
        assert_eq!(e[0].message, "`layers` is required here: the layers, drawn in order, later on top");
        let e = errs(r#"{"layers":[]}"#);
        assert_eq!(e[0].code, "spec.no_layers");
    }

    #[test]
    fn syntax_error_gives_line() {
        let e = errs("{\n \"layers\": [,]\n}");
        assert_eq!(e[0].code, "spec.json_syntax");
        assert!(e[0].message.contains("line 2"), "{}", e[0].message);
    }
}
