//! WebAssembly bindings: one call renders a spec and data bytes to SVG.
//!
//! The answer is always a JSON string, never a thrown exception, so the
//! element can show any failure in the chart's place:
//! `{"ok": true, "svg": "...", "table": "<details>...", "warnings": [...]}` or
//! `{"ok": false, "errors": [{"code", "message", "path", "line", "column", "hint"}]}`.

use strata::scene::SceneOptions;
use strata::{DataBytes, Diagnostic, RenderOptions};
use wasm_bindgen::prelude::*;

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

/// The answer as JSON text, written by hand (strata::json) rather than
/// through serde's serializer, which weighed on the page's engine; the bytes
/// are what `serde_json::to_string` gave for the derived `Serialize` (the
/// tests below check that against serde_json): `ok`, then `svg`, `table`,
/// `width`, `height` when drawn, then `warnings` and `errors` when not empty.
fn answer_json(result: Result<strata::Rendered, strata::Errors>) -> String {
    match result {
        Ok(r) => answer_text(Some((&r.svg, &r.table, r.scene.width, r.scene.height)), &r.warnings, &[]),
        Err(e) => answer_text(None, &[], &e.0),
    }
}

/// The answer's text: `drawn` is the SVG, the table and the size.
fn answer_text(drawn: Option<(&str, &str, f64, f64)>, warnings: &[Diagnostic], errors: &[Diagnostic]) -> String {
    use strata::json::{write_f64, write_str};
    let mut out = String::with_capacity(drawn.map_or(0, |(svg, table, ..)| svg.len() + table.len()) + 200);
    out.push_str(if drawn.is_some() { "{\"ok\":true" } else { "{\"ok\":false" });
    if let Some((svg, table, width, height)) = drawn {
        out.push_str(",\"svg\":");
        write_str(&mut out, svg);
        out.push_str(",\"table\":");
        write_str(&mut out, table);
        out.push_str(",\"width\":");
        write_f64(&mut out, width);
        out.push_str(",\"height\":");
        write_f64(&mut out, height);
    }
    diagnostics_json(&mut out, "warnings", warnings);
    diagnostics_json(&mut out, "errors", errors);
    out.push('}');
    out
}

/// `{"ok":false,"errors":[...]}`, leaving out an empty list.
fn errors_json(errors: &[Diagnostic]) -> String {
    answer_text(None, &[], errors)
}

/// `,"key":[...]` when `list` is not empty.
fn diagnostics_json(out: &mut String, key: &str, list: &[Diagnostic]) {
    if list.is_empty() {
        return;
    }
    out.push_str(&format!(",\"{key}\":["));
    for (i, d) in list.iter().enumerate() {
        if i > 0 {
            out.push(',');
        }
        d.write_json(out);
    }
    out.push(']');
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
/// Only the full engine draws maps, so the core leaves this entry out.
#[cfg(feature = "full")]
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
        Err(e) => errors_json(&e.0),
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
    use strata::json::write_str;
    match table {
        Ok(t) => {
            let mut out = format!("{{\"ok\":true,\"rows\":{},\"columns\":[", t.num_rows());
            for (i, (name, c)) in t.names().iter().zip(t.columns()).enumerate() {
                let kind = match c {
                    Column::Bool(_) => "bool",
                    Column::Text(_) => "text",
                    Column::Date(_) | Column::DateTime(_) => "date",
                    Column::Int(_) | Column::Float(_) => "number",
                };
                out.push_str(if i > 0 { ",{\"name\":" } else { "{\"name\":" });
                write_str(&mut out, name);
                out.push_str(&format!(",\"type\":\"{kind}\"}}"));
            }
            out.push_str("]}");
            out
        }
        Err(e) => errors_json(&e.0),
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

    /// The answer as it was written before `answer_text`: serde's derive
    /// through `serde_json::to_string` (serde 1.0.229, serde_json 1.0.154 in
    /// Cargo.lock), the reference the hand-written answer must equal byte for
    /// byte.
    #[derive(serde::Serialize)]
    struct Answer<'a> {
        ok: bool,
        #[serde(skip_serializing_if = "Option::is_none")]
        svg: Option<&'a str>,
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

    /// A small xorshift generator, so the random cases are the same each run.
    struct Rng(u64);
    impl Rng {
        fn next(&mut self) -> u64 {
            self.0 ^= self.0 << 13;
            self.0 ^= self.0 >> 7;
            self.0 ^= self.0 << 17;
            self.0
        }
        fn below(&mut self, n: u64) -> u64 {
            self.next() % n
        }
        fn text(&mut self) -> String {
            let pool: Vec<char> = "aZ09 <>&\"\\/'\u{0}\u{1}\u{8}\u{9}\u{a}\u{b}\u{c}\u{d}\u{1f}\u{7f}\u{80}é€\u{2028}\u{2029}😀\u{feff}".chars().collect();
            (0..self.below(12)).map(|_| pool[self.below(pool.len() as u64) as usize]).collect()
        }
        fn float(&mut self) -> f64 {
            match self.below(8) {
                // Exact ties between two shortest candidates, powers of two.
                6 => self.below(1 << 20) as f64 * 2f64.powi(-(self.below(90) as i32)),
                7 => 2f64.powi(self.below(2000) as i32 - 1000),
                0 => f64::from_bits(self.next()),
                1 => self.below(5000) as f64,
                2 => (self.below(2_000_000) as f64 - 1e6) / 1000.0,
                3 => [0.0, -0.0, 1e16, 1e15, 9.999e15, 1e17, 1e-5, 1e-4, 1.5e-7, 0.1 + 0.2, f64::MAX, f64::MIN_POSITIVE, 5e-324, f64::NAN, f64::INFINITY]
                    [self.below(15) as usize],
                4 => 10f64.powi(self.below(60) as i32 - 30) * (self.below(1000) as f64 + 1.0),
                _ => f64::from_bits(self.next() >> 12 | 0x4000_0000_0000_0000),
            }
        }
        fn diagnostics(&mut self) -> Vec<Diagnostic> {
            (0..self.below(4))
                .map(|_| {
                    let mut d = if self.below(2) == 0 { Diagnostic::error(&self.text(), self.text()) } else { Diagnostic::warning(&self.text(), self.text()) };
                    if self.below(2) == 0 {
                        d = d.at_path(self.text());
                    }
                    if self.below(2) == 0 {
                        d.at.line = Some(self.next() >> self.below(64));
                        d.at.column = [None, Some(self.next() >> 40)][self.below(2) as usize];
                    }
                    if self.below(2) == 0 {
                        d = d.with_hint(self.text());
                    }
                    d
                })
                .collect()
        }
    }

    #[test]
    fn the_answer_is_what_serde_json_writes() {
        let mut rng = Rng(0x5eed_1234_abcd_0001);
        for _ in 0..3000 {
            let (svg, table, width, height) = (rng.text(), rng.text(), rng.float(), rng.float());
            let (warnings, errors) = (rng.diagnostics(), rng.diagnostics());
            let drawn = rng.below(2) == 0;
            let ours = answer_text(drawn.then_some((&svg, &table, width, height)), &warnings, &errors);
            let reference = if drawn {
                Answer { ok: true, svg: Some(&svg), table: Some(&table), width: Some(width), height: Some(height), warnings: &warnings, errors: &errors }
            } else {
                Answer { ok: false, svg: None, table: None, width: None, height: None, warnings: &warnings, errors: &errors }
            };
            assert_eq!(ours, serde_json::to_string(&reference).unwrap());
        }
        // A float alone, over many bit patterns (ryu's layout in serde_json).
        for _ in 0..100_000 {
            let f = rng.float();
            let mut ours = String::new();
            strata::json::write_f64(&mut ours, f);
            assert_eq!(ours, serde_json::to_string(&f).unwrap(), "{f:e}");
        }
    }

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
    fn polar_coordinates_steps_and_panels_need_the_full_engine() {
        // Alone (`cargo test -p strata-wasm`) this is the core engine.
        let rows = r#""data":{"rows":[{"a":"N","b":2,"c":1},{"a":"S","b":3,"c":4}]}"#;
        for (spec, path) in [
            (format!(r#"{{{rows},"coords":"polar","layers":[{{"draw":"bar","x":"a","y":"b"}}]}}"#), "coords"),
            (format!(r#"{{{rows},"coords":{{"kind":"polar","angle":"y"}},"layers":[{{"draw":"bar","y":"b","color":"a","arrange":"stack"}}]}}"#), "coords"),
            (format!(r#"{{{rows},"scales":{{"color":{{"kind":"steps"}}}},"layers":[{{"draw":"point","x":"b","y":"c","color":"c"}}]}}"#), "scales.color.kind"),
            (format!(r#"{{{rows},"panels":{{"by":"a"}},"layers":[{{"draw":"point","x":"b","y":"c"}}]}}"#), "panels"),
        ] {
            let out = render_json(&spec, None, "", 300.0);
            let v: serde_json::Value = serde_json::from_str(&out).unwrap();
            if strata::HAS_FULL {
                assert_eq!(v["ok"], true, "{out}");
            } else {
                assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("spec.needs_full_engine"), Some(path)), "{out}");
            }
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
