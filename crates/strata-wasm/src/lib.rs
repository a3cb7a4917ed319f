//! WebAssembly bindings: one call renders a spec and data bytes to SVG.
//!
//! The answer is always a JSON string, never a thrown exception, so the
//! element can show any failure in the chart's place:
//! `{"ok": true, "svg": "...", "table": "<details>...", "warnings": [...]}` or
//! `{"ok": false, "errors": [{"code", "message", "path", "line", "column", "hint"}]}`.

use serde::Serialize;
use strata::scene::SceneOptions;
use strata::{DataBytes, Diagnostic, RenderOptions};
use wasm_bindgen::prelude::*;

#[derive(Serialize)]
struct Answer<'a> {
    ok: bool,
    #[serde(skip_serializing_if = "Option::is_none")]
    svg: Option<&'a str>,
    /// The data table's HTML (empty when the spec asks for none).
    #[serde(skip_serializing_if = "Option::is_none")]
    table: Option<&'a str>,
    #[serde(skip_serializing_if = "Option::is_none")]
    width: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    height: Option<f64>,
    #[serde(skip_serializing_if = "<[Diagnostic]>::is_empty")]
    warnings: &'a [Diagnostic],
    #[serde(skip_serializing_if = "<[Diagnostic]>::is_empty")]
    errors: &'a [Diagnostic],
}

/// Render `spec` (JSON text) with optional data bytes named `data_name`
/// (a URL or file name; its extension hints the format). `width` is the
/// container's width in CSS pixels, used when the spec sets none.
pub fn render_json(spec: &str, data: Option<&[u8]>, data_name: &str, width: f64) -> String {
    render_json_with_shapes(spec, data, data_name, None, width)
}

/// [`render_json`] with the bytes of the spec's `shapes.url` (GeoJSON).
pub fn render_json_with_shapes(spec: &str, data: Option<&[u8]>, data_name: &str, shapes: Option<&[u8]>, width: f64) -> String {
    render_json_with_digest(spec, data, data_name, None, shapes, width)
}

/// [`render_json_with_shapes`] with the data's SHA-256 as the page computed
/// it (32 bytes), which `data.sha256` is checked against: the core engine
/// has no SHA-256 of its own.
pub fn render_json_with_digest(spec: &str, data: Option<&[u8]>, data_name: &str, digest: Option<&[u8]>, shapes: Option<&[u8]>, width: f64) -> String {
    let opts = render_options(width);
    let data = data.map(|bytes| DataBytes { bytes, name: data_name });
    let shapes = shapes.map(|bytes| DataBytes { bytes, name: "shapes" });
    let digest = digest.and_then(|d| <[u8; 32]>::try_from(d).ok());
    let spec = spec.strip_prefix('\u{feff}').unwrap_or(spec);
    answer_json(strata::parse_spec(spec).map_err(strata::budget::cap_messages).and_then(|s| strata::render_spec_with_digest(&s, data, digest, shapes, &opts)))
}

fn render_options(width: f64) -> RenderOptions {
    RenderOptions { scene: SceneOptions { width: if width.is_finite() && width > 0.0 { width } else { 640.0 } } }
}

/// Render `spec` with data the Arrow add-on (`strata-wasm-arrow`) decoded
/// into the column interchange.
pub fn render_columns_json(spec: &str, columns: &[u8], width: f64) -> String {
    answer_json(strata::render_columns(spec, columns, &render_options(width)))
}

fn answer_json(result: Result<strata::Rendered, strata::Errors>) -> String {
    let answer = match result {
        Ok(r) => serde_json::to_string(&Answer {
            ok: true,
            svg: Some(&r.svg),
            table: Some(&r.table),
            width: Some(r.scene.width),
            height: Some(r.scene.height),
            warnings: &r.warnings,
            errors: &[],
        }),
        Err(e) => serde_json::to_string(&Answer { ok: false, svg: None, table: None, width: None, height: None, warnings: &[], errors: &e.0 }),
    };
    answer.unwrap_or_else(|_| r#"{"ok":false,"errors":[{"severity":"error","code":"internal","message":"could not encode the answer"}]}"#.to_string())
}

/// JavaScript entry point for Arrow data: `columns` is what the add-on's
/// `decode` returned.
#[wasm_bindgen]
pub fn render_columns(spec: &str, columns: &[u8], width: f64) -> String {
    render_columns_json(spec, columns, width)
}

/// JavaScript entry point; `data` may be `undefined` for specs with inline
/// rows. `digest`: the data's SHA-256 (32 bytes, the element's SubtleCrypto
/// digest when the spec has `data.sha256`; without it that check fails).
#[wasm_bindgen]
pub fn render(spec: &str, data: Option<Vec<u8>>, data_name: &str, width: f64, digest: Option<Vec<u8>>) -> String {
    render_json_with_digest(spec, data.as_deref(), data_name, digest.as_deref(), None, width)
}

/// [`render`] with the bytes of `shapes.url` (the element fetches them).
#[wasm_bindgen]
pub fn render_with_shapes(spec: &str, data: Option<Vec<u8>>, data_name: &str, shapes: Option<Vec<u8>>, width: f64) -> String {
    render_json_with_shapes(spec, data.as_deref(), data_name, shapes.as_deref(), width)
}

/// Read data bytes into a table and report its shape as JSON
/// (`{"ok":true,"rows":N,"columns":M}` or located errors); used by the
/// browser benchmark of the readers.
#[wasm_bindgen]
pub fn table_shape(data: &[u8], data_name: &str) -> String {
    let opts = strata::data::ReadOptions { format: strata::data::format_from_name(data_name), ..Default::default() };
    match strata::data::read(data, &opts) {
        Ok(t) => format!("{{\"ok\":true,\"rows\":{},\"columns\":{}}}", t.num_rows(), t.num_columns()),
        Err(e) => serde_json::json!({ "ok": false, "errors": e.0 }).to_string(),
    }
}

/// The columns of data bytes with the type the reader inferred for each, as
/// JSON: `{"ok":true,"rows":N,"columns":[{"name":"day","type":"date"},...]}`
/// (types in the spec's words: `number`, `text`, `date`, `bool`) or located
/// errors. The playground (which loads the full engine) builds its starter
/// spec from this; the core engine, which only draws, leaves it out.
#[cfg(feature = "full")]
#[wasm_bindgen]
pub fn columns(data: &[u8], data_name: &str) -> String {
    columns_json(data, data_name)
}

pub fn columns_json(data: &[u8], data_name: &str) -> String {
    let opts = strata::data::ReadOptions { format: strata::data::format_from_name(data_name), ..Default::default() };
    columns_answer(strata::data::read(data, &opts))
}

/// [`columns`] for data the Arrow add-on decoded into the column interchange.
#[cfg(feature = "full")]
#[wasm_bindgen]
pub fn columns_of_interchange(columns: &[u8]) -> String {
    columns_answer(strata::data::interchange::read(columns, &strata::data::ReadOptions::default()))
}

fn columns_answer(table: Result<strata::data::Table, strata::Errors>) -> String {
    use strata::data::Column;
    match table {
        Ok(t) => {
            let cols: Vec<serde_json::Value> = t
                .names()
                .iter()
                .zip(t.columns())
                .map(|(name, c)| {
                    let kind = match c {
                        Column::Bool(_) => "bool",
                        Column::Text(_) => "text",
                        Column::Date(_) | Column::DateTime(_) => "date",
                        Column::Int(_) | Column::Float(_) => "number",
                    };
                    serde_json::json!({ "name": name, "type": kind })
                })
                .collect();
            serde_json::json!({ "ok": true, "rows": t.num_rows(), "columns": cols }).to_string()
        }
        Err(e) => serde_json::json!({ "ok": false, "errors": e.0 }).to_string(),
    }
}

/// The engine's version, for the element's diagnostics.
#[wasm_bindgen]
pub fn version() -> String {
    env!("CARGO_PKG_VERSION").to_string()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn answer_is_json_with_svg() {
        let out = render_json(r#"{"data":{"rows":[{"a":1,"b":2}]},"layers":[{"draw":"point","x":"a","y":"b"}]}"#, None, "", 300.0);
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(v["ok"], true);
        assert_eq!(v["width"], 300.0);
        assert!(v["svg"].as_str().unwrap().contains("<circle"));
        assert!(v["table"].as_str().unwrap().starts_with("<details class=\"strata-data\">"));
    }

    #[test]
    fn columns_name_the_inferred_types() {
        let out = columns_json(b"day,rain_mm,town,wet\n2024-01-02,1.5,Oslo,true\n2024-01-03,0,Bergen,false\n", "d.csv");
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(v["rows"], 2);
        let kinds: Vec<(&str, &str)> = v["columns"].as_array().unwrap().iter().map(|c| (c["name"].as_str().unwrap(), c["type"].as_str().unwrap())).collect();
        assert_eq!(kinds, [("day", "date"), ("rain_mm", "number"), ("town", "text"), ("wet", "bool")]);
        let bad: serde_json::Value = serde_json::from_str(&columns_json(b"[1,", "d.json")).unwrap();
        assert_eq!(bad["ok"], false);
    }

    #[test]
    fn a_map_needs_the_full_engine() {
        // Alone (`cargo test -p strata-wasm`) this is the core engine, with no
        // maps; in the workspace the CLI's `full` feature reaches it.
        let out =
            render_json(r#"{"data":{"rows":[{"lon":1,"lat":2}]},"coords":{"kind":"map"},"layers":[{"draw":"point","x":"lon","y":"lat"}]}"#, None, "", 300.0);
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        if strata::HAS_FULL {
            assert_eq!(v["ok"], true, "{out}");
        } else {
            assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("spec.needs_full_engine"), Some("coords")), "{out}");
        }
    }

    #[test]
    fn a_derive_needs_the_full_engine() {
        let out = render_json(r#"{"data":{"rows":[{"a":1,"b":2}]},"derive":{"c":"a + b"},"layers":[{"draw":"point","x":"a","y":"c"}]}"#, None, "", 300.0);
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        if strata::HAS_FULL {
            assert_eq!(v["ok"], true, "{out}");
        } else {
            assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("spec.needs_full_engine"), Some("derive")), "{out}");
            // The element looks for exactly these bytes in the answer.
            assert!(out.contains(r#""code":"spec.needs_full_engine""#), "{out}");
        }
    }

    #[test]
    fn data_sha256_is_checked_against_the_pages_digest() {
        // The digest of these bytes is from GNU coreutils' sha256sum.
        let (csv, hex) = (b"a,b\n1,2\n2,3\n", "fa73cad33d325fdb9aaa6e1f55002c44b198a003931893b07fd25ae36315963f");
        let digest: Vec<u8> = (0..32).map(|i| u8::from_str_radix(&hex[2 * i..2 * i + 2], 16).unwrap()).collect();
        let spec = |want: &str| format!(r#"{{"data":{{"sha256":"{want}"}},"layers":[{{"draw":"point","x":"a","y":"b"}}]}}"#);
        let run = |want: &str, digest: Option<&[u8]>| -> serde_json::Value {
            serde_json::from_str(&render_json_with_digest(&spec(want), Some(csv), "t.csv", digest, None, 300.0)).unwrap()
        };
        assert_eq!(run(hex, Some(&digest))["ok"], true);
        let v = run(&"0".repeat(64), Some(&digest));
        assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("data.sha256_mismatch"), Some("data.sha256")), "{v}");
        let message = format!("the data's SHA-256 digest is {hex}, but `data.sha256` expects {}; the data was refused", "0".repeat(64));
        assert_eq!(v["errors"][0]["message"].as_str(), Some(message.as_str()));
        // Without the page's digest: the engine's own (the CLI's build), or,
        // in the page's core engine, a refusal that says why.
        let v = run(hex, None);
        if strata::data::HAS_SHA256 {
            assert_eq!(v["ok"], true, "{v}");
        } else {
            assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("data.sha256_unchecked"), Some("data.sha256")), "{v}");
        }
    }

    #[test]
    fn a_missing_key_reads_the_same_without_the_schema_descriptions() {
        // The core engine is built without `schema` (no descriptions of
        // optional keys); a required key's description stays for this message.
        let out = render_json(r#"{"data":{"rows":[{"a":1}]},"layers":[{"x":"a"}]}"#, None, "", 300.0);
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(v["errors"][0]["message"], "`draw` is required here: the geometry", "{out}");
        assert_eq!(v["errors"][0]["path"], "layers[0]");
    }

    #[test]
    fn located_error_is_json() {
        let out = render_json(r#"{"layers":[{"draw":"point","x":"nope"}],"data":{"rows":[{"a":1}]}}"#, None, "", 300.0);
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(v["ok"], false);
        assert_eq!(v["errors"][0]["path"], "layers[0].x");
        assert_eq!(v["errors"][0]["code"], "spec.unknown_column");
    }
}
