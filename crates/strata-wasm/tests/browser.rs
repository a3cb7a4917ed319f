//! The bindings inside headless Chromium (wasm-bindgen-test).
#![cfg(target_arch = "wasm32")]

use wasm_bindgen_test::*;

wasm_bindgen_test_configure!(run_in_browser);

const SPEC: &str = r#"{"size":{"width":320,"height":200},"layers":[{"draw":"point","x":"a","y":"b"}]}"#;

#[wasm_bindgen_test]
fn renders_csv_bytes_to_svg() {
    let out = strata_wasm::render(SPEC, Some(b"a,b\n1,2\n2,4\n3,1\n".to_vec()), "t.csv", 640.0, None);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["ok"], true, "{out}");
    let svg = v["svg"].as_str().unwrap();
    assert!(svg.starts_with("<svg"));
    assert_eq!(svg.matches("<circle").count(), 3);
    assert_eq!(v["width"], 320.0);
}

#[wasm_bindgen_test]
fn wasm_draws_the_committed_golden_bytes() {
    // The engine compiled to wasm32 and run in Chromium writes the very
    // bytes the native engine recorded under tests/golden/out: float
    // printing, libm maths and hashing give one answer on both targets.
    // (Box plots and polar coordinates are the full engine's: the core
    // refuses them.)
    let full = [
        (include_str!("../../../tests/golden/specs/box-summary.json"), include_str!("../../../tests/golden/out/edge-box-summary.svg")),
        (include_str!("../../../tests/golden/specs/donut.json"), include_str!("../../../tests/golden/out/edge-donut.svg")),
    ];
    for (spec, golden) in [
        (include_str!("../../../tests/golden/specs/diverging.json"), include_str!("../../../tests/golden/out/edge-diverging.svg")),
        (include_str!("../../../tests/golden/specs/missing-values.json"), include_str!("../../../tests/golden/out/edge-missing-values.svg")),
    ]
    .into_iter()
    .chain(full.into_iter().filter(|_| strata::HAS_FULL))
    {
        let out = strata_wasm::render(spec, None, "", 640.0, None);
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(v["svg"].as_str(), Some(golden), "{out}");
    }
}

#[wasm_bindgen_test]
fn the_core_refuses_full_engine_specs_at_their_word() {
    // The core engine (no `full` feature) names the path of what it leaves
    // out; the element then draws the chart with the full engine, which
    // writes the golden bytes.
    let boxes = include_str!("../../../tests/golden/specs/box-summary.json");
    let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(boxes, None, "", 640.0, None)).unwrap();
    if strata::HAS_FULL {
        assert_eq!(v["svg"].as_str(), Some(include_str!("../../../tests/golden/out/edge-box-summary.svg")), "{v}");
        return;
    }
    assert_eq!(v["ok"], false, "{v}");
    assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("spec.needs_full_engine"), Some("layers[0].draw")), "{v}");
    for (spec, path) in [
        (r#"{"data":{"rows":[{"a":1}]},"where":"a > 0","layers":[{"draw":"point","x":"a","y":"a"}]}"#, "where"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"unpivot":{"columns":["a","b"],"into":["k","v"]},"layers":[{"draw":"bar","x":"k","y":"v"}]}"#, "unpivot"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"layers":[{"draw":"line","x":"a","y":"b","stat":{"fit":"linear"}}]}"#, "layers[0].stat.fit"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"layers":[{"draw":"line","x":"a","stat":{"density":{}}}]}"#, "layers[0].stat.density"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"coords":"polar","layers":[{"draw":"bar","x":"a","y":"b"}]}"#, "coords"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"panels":{"by":"a"},"layers":[{"draw":"point","x":"a","y":"b"}]}"#, "panels"),
        (
            r#"{"data":{"rows":[{"a":1,"b":2}]},"scales":{"color":{"kind":"steps"}},"layers":[{"draw":"point","x":"a","y":"b","color":"b"}]}"#,
            "scales.color.kind",
        ),
    ] {
        let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(spec, None, "", 640.0, None)).unwrap();
        assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("spec.needs_full_engine"), Some(path)), "{v}");
    }
}

#[wasm_bindgen_test]
fn errors_come_back_as_data_not_exceptions() {
    let out = strata_wasm::render(r#"{"layers":[{"draw":"dot"}]}"#, None, "", 640.0, None);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["ok"], false);
    assert_eq!(v["errors"][0]["path"], "layers[0].draw");
    let out = strata_wasm::render(SPEC, Some(vec![0xff, 0xfe, 0x00]), "t.csv", 640.0, None);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["ok"], false);
}

#[wasm_bindgen_test]
fn maps_come_only_with_the_full_engine() {
    // The core engine (no `full` feature) refuses a map clearly, at the
    // word that asks for it; the full engine draws the committed golden bytes.
    let spec = include_str!("../../../tests/golden/specs/map-mercator-points.json");
    let out = strata_wasm::render(spec, None, "", 640.0, None);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    if strata::HAS_FULL {
        assert_eq!(v["svg"].as_str(), Some(include_str!("../../../tests/golden/out/edge-map-mercator-points.svg")), "{out}");
    } else {
        assert_eq!(v["ok"], false, "{out}");
        assert_eq!(v["errors"][0]["code"], "spec.needs_full_engine");
        assert_eq!(v["errors"][0]["path"], "coords");
        let shapes = r#"{"shapes":{"features":[]},"layers":[{"draw":"region"}]}"#;
        let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(shapes, None, "", 640.0, None)).unwrap();
        assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("spec.needs_full_engine"), Some("shapes")), "{v}");
    }
}

#[wasm_bindgen_test]
fn the_core_checks_data_sha256_against_the_pages_digest() {
    // The core engine has no SHA-256 of its own: the element hands in the
    // digest SubtleCrypto computed. The digest of these bytes is from GNU
    // coreutils' sha256sum.
    let csv = b"a,b\n1,2\n2,3\n";
    let digest: Vec<u8> =
        (0..32).map(|i| u8::from_str_radix(&"fa73cad33d325fdb9aaa6e1f55002c44b198a003931893b07fd25ae36315963f"[2 * i..2 * i + 2], 16).unwrap()).collect();
    let spec = |want: &str| format!(r#"{{"data":{{"sha256":"{want}"}},"layers":[{{"draw":"point","x":"a","y":"b"}}]}}"#);
    let good = spec("fa73cad33d325fdb9aaa6e1f55002c44b198a003931893b07fd25ae36315963f");
    let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(&good, Some(csv.to_vec()), "t.csv", 640.0, Some(digest.clone()))).unwrap();
    assert_eq!(v["ok"], true, "{v}");
    let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(&spec(&"0".repeat(64)), Some(csv.to_vec()), "t.csv", 640.0, Some(digest))).unwrap();
    assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("data.sha256_mismatch"), Some("data.sha256")), "{v}");
    // No digest (a page without SubtleCrypto): the core refuses, never
    // unchecked; the full engine has SHA-256 of its own (its `maps` brings
    // `sha`, for `shapes.sha256`) and checks the data itself.
    let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(&good, Some(csv.to_vec()), "t.csv", 640.0, None)).unwrap();
    if strata::HAS_FULL {
        assert_eq!(v["ok"], true, "{v}");
    } else {
        assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("data.sha256_unchecked"), Some("data.sha256")), "{v}");
    }
}

#[wasm_bindgen_test]
fn a_mistake_in_a_full_engine_part_comes_back_located_from_either_engine() {
    // The core checks every key's shape before it refuses a full-engine
    // part (from the JSON value, unread), so a mistake there is answered,
    // located, by both engines alike; never `spec.needs_full_engine`, on
    // which the element would switch engines.
    for (spec, code, path) in [
        (r#"{"layers":[{"draw":"line","x":"a","y":"b","stat":{"window":{"rows":2.5}}}]}"#, "spec.wrong_type", "layers[0].stat.window.rows"),
        (r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"panels":{"by":"a","colums":2}}"#, "spec.unknown_key", "panels.colums"),
    ] {
        let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(spec, None, "", 640.0, None)).unwrap();
        assert_eq!(v["errors"].as_array().map(Vec::len), Some(1), "{v}");
        assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some(code), Some(path)), "{v}");
    }
}
