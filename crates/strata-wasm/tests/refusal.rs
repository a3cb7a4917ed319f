//! The core engine's refusals, natively: `cargo test -p strata-wasm` builds
//! the core (no `full` feature), the workspace's tests the full engine.
//! (tests/browser.rs runs the same kind of checks in Chromium.)
#![cfg(not(target_arch = "wasm32"))]

fn answer(spec: &str) -> serde_json::Value {
    serde_json::from_str(&strata_wasm::render(spec, None, "", 640.0, None)).unwrap()
}

/// The core refuses from the spec's JSON value before reading it, at the
/// path and word `needs_full` names; the full engine draws.
#[test]
fn the_core_refuses_full_engine_parts_at_their_path() {
    for (spec, path, word) in [
        (r#"{"data":{"rows":[{"a":1}]},"where":"a > 0","layers":[{"draw":"point","x":"a","y":"a"}]}"#, "where", "where"),
        (r#"{"data":{"rows":[{"a":1}]},"derive":{"b":"a * 2"},"layers":[{"draw":"point","x":"a","y":"b"}]}"#, "derive", "derive"),
        (
            r#"{"data":{"rows":[{"a":1,"b":2}]},"unpivot":{"columns":["a","b"],"into":["k","v"]},"layers":[{"draw":"bar","x":"k","y":"v"}]}"#,
            "unpivot",
            "unpivot",
        ),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"layers":[{"draw":"line","x":"a","y":"b","stat":{"fit":"linear"}}]}"#, "layers[0].stat.fit", "fit"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"layers":[{"draw":"line","x":"a","stat":{"density":{}}}]}"#, "layers[0].stat.density", "density"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"layers":[{"draw":"line","x":"a","y":"b","stat":{"window":{"rows":2}}}]}"#, "layers[0].stat.window", "window"),
        (
            r#"{"data":{"rows":[{"a":1,"b":2}]},"layers":[{"draw":"point","x":"a","y":"b","stat":{"summary":"mean","interval":"ci95"}}]}"#,
            "layers[0].stat.interval",
            "interval",
        ),
        (r#"{"data":{"rows":[{"a":"x","b":2}]},"layers":[{"draw":"box","x":"a","y":"b","stat":"box"}]}"#, "layers[0].draw", "box"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"coords":"polar","layers":[{"draw":"bar","x":"a","y":"b"}]}"#, "coords", "polar"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"coords":{"kind":"map"},"layers":[{"draw":"point","x":"a","y":"b"}]}"#, "coords", "map"),
        (r#"{"data":{"rows":[{"a":1,"b":2}]},"panels":{"by":"a"},"layers":[{"draw":"point","x":"a","y":"b"}]}"#, "panels", "panels"),
        (
            r#"{"data":{"rows":[{"a":1,"b":2}]},"scales":{"color":{"kind":"steps"}},"layers":[{"draw":"point","x":"a","y":"b","color":"b"}]}"#,
            "scales.color.kind",
            "steps",
        ),
        (r#"{"shapes":{"features":[]},"layers":[{"draw":"region"}]}"#, "shapes", "shapes"),
    ] {
        let v = answer(spec);
        if strata::HAS_FULL {
            assert!(v["errors"].as_array().is_none_or(|e| e.iter().all(|d| d["code"] != "spec.needs_full_engine")), "{spec}: {v}");
            continue;
        }
        assert_eq!(v["ok"], false, "{spec}: {v}");
        assert_eq!(v["errors"].as_array().map(Vec::len), Some(1), "{spec}: {v}");
        assert_eq!((v["errors"][0]["code"].as_str(), v["errors"][0]["path"].as_str()), (Some("spec.needs_full_engine"), Some(path)), "{spec}: {v}");
        assert!(v["errors"][0]["message"].as_str().unwrap().contains(&format!("`{word}`")), "{spec}: {v}");
    }
}

/// A mistake in a part only the full engine draws is found by the core's
/// shape check first: the core answers the same located errors as the full
/// engine (not `spec.needs_full_engine`, on which the page would switch
/// engines), so the page shows the mistake either way.
#[test]
fn a_mistake_in_a_full_engine_part_comes_back_located_from_either_engine() {
    for (spec, want) in [
        (r#"{"layers":[{"draw":"line","x":"a","y":"b","stat":{"window":{"rows":2.5}}}]}"#, vec![("spec.wrong_type", "layers[0].stat.window.rows")]),
        (
            r#"{"layers":[{"draw":"pointt","x":"a","y":"b"}],"coords":{"kind":"polar","angle":"z"}}"#,
            vec![("spec.unknown_word", "layers[0].draw"), ("spec.unknown_word", "coords.angle")],
        ),
        (r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"panels":{"by":"a","colums":2}}"#, vec![("spec.unknown_key", "panels.colums")]),
        (r#"{"layers":[{"draw":"region","key":"k"}],"shapes":{"features":[],"kye":"id"}}"#, vec![("spec.unknown_key", "shapes.kye")]),
    ] {
        let v = answer(spec);
        let got: Vec<(&str, &str)> = v["errors"]
            .as_array()
            .unwrap_or_else(|| panic!("{spec}: {v}"))
            .iter()
            .map(|d| (d["code"].as_str().unwrap(), d["path"].as_str().unwrap()))
            .collect();
        assert_eq!(got, want, "{spec}: {v}");
    }
}
