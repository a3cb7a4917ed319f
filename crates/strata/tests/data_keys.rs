//! The spec's reader keys reach the reader: delimiter, decimal comma and
//! missing-value tokens, for files named `.csv` whatever their delimiter.

use strata::scene::Node;
use strata::{render, DataBytes, RenderOptions};

fn ys(spec: &str, bytes: &[u8]) -> Vec<serde_json::Value> {
    let r = render(spec, Some(DataBytes { bytes, name: "regen.csv" }), &RenderOptions::default()).unwrap_or_else(|e| panic!("{e}"));
    r.scene
        .marks()
        .into_iter()
        .filter_map(|m| match m {
            Node::Rect { datum: Some(d), .. } => d.get("y").cloned(),
            _ => None,
        })
        .collect()
}

const BARS: &str = r#"{"layers":[{"draw":"bar","x":"station","y":"rain"}]"#;

#[test]
fn semicolon_file_named_csv_is_sniffed() {
    // A semicolon-separated file with a decimal point: the .csv name does not force commas.
    let v = ys(&format!("{BARS}}}"), b"station;rain\nA;1.5\nB;2.25\n");
    assert_eq!(v, vec![serde_json::json!(1.5), serde_json::json!(2.25)]);
}

#[test]
fn decimal_comma_and_missing_tokens_from_the_spec() {
    let spec = format!(r#"{BARS},"data":{{"delimiter":";","decimal_comma":true,"missing":["k. A."]}}}}"#);
    let v = ys(&spec, b"station;rain\nA;1,5\nB;k. A.\nC;2,25\n");
    // B is missing, so it draws no bar.
    assert_eq!(v, vec![serde_json::json!(1.5), serde_json::json!(2.25)]);
}

#[test]
fn an_unknown_delimiter_is_a_located_error() {
    let e = strata::spec::parse_spec(&format!(r#"{BARS},"data":{{"delimiter":":"}}}}"#)).unwrap_err();
    assert_eq!(e.0[0].at.path, "data.delimiter");
}

#[test]
fn keys_not_drawn_yet_say_so_at_their_path() {
    let spec = r#"{"layers":[{"draw":"bar","x":"station","y":"rain","tip":["rain"]}],"panels":{"by":"station"},"notes":[{"x":"A","text":"wet"}]}"#;
    let r = render(spec, Some(DataBytes { bytes: b"station,rain\nA,1\nB,2\n", name: "d.csv" }), &RenderOptions::default()).unwrap();
    let paths: Vec<&str> = r.warnings.iter().filter(|w| w.code == "spec.not_drawn_yet").map(|w| w.at.path.as_str()).collect();
    assert_eq!(paths, vec!["panels", "notes", "layers[0].tip"]);
}
