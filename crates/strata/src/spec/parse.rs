//! Spec text to [`Spec`], with errors that carry the JSON path.

use super::Spec;
use crate::error::{Diagnostic, Errors};

/// Parse a spec from JSON text. Errors carry the JSON path of the offending
/// key (`layers[0].draw`) and, for JSON syntax errors, the line and column.
pub fn parse_spec(text: &str) -> Result<Spec, Errors> {
    let de = &mut serde_json::Deserializer::from_str(text);
    match serde_path_to_error::deserialize::<_, Spec>(de) {
        Ok(spec) => {
            if spec.layers.is_empty() {
                return Err(Diagnostic::error("spec.no_layers", "the spec has no layers; add at least one, such as {\"draw\": \"point\", \"x\": \"a\", \"y\": \"b\"}")
                    .at_path("layers")
                    .into());
            }
            Ok(spec)
        }
        Err(e) => {
            let path = e.path().to_string();
            let inner = e.into_inner();
            let path = if path == "." { String::new() } else { path };
            let mut d = Diagnostic::error(
                if inner.is_syntax() || inner.is_eof() { "spec.json_syntax" } else { "spec.invalid" },
                strip_position(&inner.to_string()),
            )
            .at_path(path);
            if inner.is_syntax() || inner.is_eof() {
                d.message = format!("the spec is not valid JSON: {} (spec line {}, column {})", d.message, inner.line(), inner.column());
            }
            Err(d.into())
        }
    }
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

    #[test]
    fn minimal_spec_parses() {
        let s = parse_spec(r#"{"layers":[{"draw":"point","x":"a","y":{"column":"b","as":"number"}}]}"#).unwrap();
        assert_eq!(s.layers.len(), 1);
        assert_eq!(s.layers[0].x.as_ref().unwrap().column, "a");
    }

    #[test]
    fn unknown_key_names_its_path() {
        let e = parse_spec(r#"{"layers":[{"draw":"point"},{"draw":"bar","stat":{"bin":{"rul":"fd"}}}]}"#).unwrap_err();
        assert_eq!(e.0[0].at.path, "layers[1].stat.bin.rul");
        assert!(e.0[0].message.contains("unknown field `rul`"), "{}", e.0[0].message);
    }

    #[test]
    fn bad_word_names_its_path() {
        let e = parse_spec(r#"{"layers":[{"draw":"pie"}]}"#).unwrap_err();
        assert_eq!(e.0[0].at.path, "layers[0].draw");
    }

    #[test]
    fn syntax_error_gives_line() {
        let e = parse_spec("{\n \"layers\": [,]\n}").unwrap_err();
        assert_eq!(e.0[0].code, "spec.json_syntax");
        assert!(e.0[0].message.contains("line 2"), "{}", e.0[0].message);
    }
}
