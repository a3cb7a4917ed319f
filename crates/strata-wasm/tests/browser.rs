//! The bindings inside headless Chromium (wasm-bindgen-test).
#![cfg(target_arch = "wasm32")]

use wasm_bindgen_test::*;

wasm_bindgen_test_configure!(run_in_browser);

const SPEC: &str = r#"{"size":{"width":320,"height":200},"layers":[{"draw":"point","x":"a","y":"b"}]}"#;

#[wasm_bindgen_test]
fn renders_csv_bytes_to_svg() {
    let out = strata_wasm::render(SPEC, Some(b"a,b\n1,2\n2,4\n3,1\n".to_vec()), "t.csv", 640.0);
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
    // (Box plots are the full engine's: the core refuses them.)
    let full = [(include_str!("../../../tests/golden/specs/box-summary.json"), include_str!("../../../tests/golden/out/edge-box-summary.svg"))];
    for (spec, golden) in [
        (include_str!("../../../tests/golden/specs/diverging.json"), include_str!("../../../tests/golden/out/edge-diverging.svg")),
        (include_str!("../../../tests/golden/specs/donut.json"), include_str!("../../../tests/golden/out/edge-donut.svg")),
        (include_str!("../../../tests/golden/specs/missing-values.json"), include_str!("../../../tests/golden/out/edge-missing-values.svg")),
    ]
    .into_iter()
    .chain(full.into_iter().filter(|_| strata::HAS_FULL))
    {
        let out = strata_wasm::render(spec, None, "", 640.0);
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
    let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(boxes, None, "", 640.0)).unwrap();
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
    ] {
        let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(spec, None, "", 640.0)).unwrap();
        assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("spec.needs_full_engine"), Some(path)), "{v}");
    }
}

#[wasm_bindgen_test]
fn errors_come_back_as_data_not_exceptions() {
    let out = strata_wasm::render(r#"{"layers":[{"draw":"dot"}]}"#, None, "", 640.0);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["ok"], false);
    assert_eq!(v["errors"][0]["path"], "layers[0].draw");
    let out = strata_wasm::render(SPEC, Some(vec![0xff, 0xfe, 0x00]), "t.csv", 640.0);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["ok"], false);
}

#[wasm_bindgen_test]
fn maps_come_only_with_the_full_engine() {
    // The core engine (no `full` feature) refuses a map clearly, at the
    // word that asks for it; the full engine draws the committed golden bytes.
    let spec = include_str!("../../../tests/golden/specs/map-mercator-points.json");
    let out = strata_wasm::render(spec, None, "", 640.0);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    if strata::HAS_FULL {
        assert_eq!(v["svg"].as_str(), Some(include_str!("../../../tests/golden/out/edge-map-mercator-points.svg")), "{out}");
    } else {
        assert_eq!(v["ok"], false, "{out}");
        assert_eq!(v["errors"][0]["code"], "spec.needs_full_engine");
        assert_eq!(v["errors"][0]["path"], "coords");
        let shapes = r#"{"shapes":{"features":[]},"layers":[{"draw":"region"}]}"#;
        let v: serde_json::Value = serde_json::from_str(&strata_wasm::render(shapes, None, "", 640.0)).unwrap();
        assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("spec.needs_full_engine"), Some("shapes")), "{v}");
    }
}
