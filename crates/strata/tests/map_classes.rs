//! Class breaks against mapclassify 2.10.0 (FisherJenks and Quantiles),
//! fixture `tests/reference/fixtures/map/classes.json` written by
//! `tests/reference/gen/map_fixtures.py` (the file names its versions).

use serde_json::Value;
use strata::geo::classify;

#[test]
fn natural_and_quantile_breaks_match_mapclassify() {
    let p = format!("{}/../../tests/reference/fixtures/map/classes.json", env!("CARGO_MANIFEST_DIR"));
    let f: Value = serde_json::from_str(&std::fs::read_to_string(p).unwrap()).unwrap();
    let nums = |v: &Value| v.as_array().unwrap().iter().map(|x| x.as_f64().unwrap()).collect::<Vec<f64>>();
    let cases = f["cases"].as_array().unwrap();
    assert!(cases.len() >= 12);
    for case in cases {
        let xs = nums(&case["values"]);
        let k = case["k"].as_u64().unwrap() as usize;
        for (name, got) in [("natural", classify::natural(&xs, k)), ("quantile", classify::quantile(&xs, k))] {
            let want = nums(&case[name]);
            assert_eq!(got.len(), want.len(), "{name} k={k}: {got:?} vs {want:?}");
            for (g, w) in got.iter().zip(&want) {
                assert!((g - w).abs() <= 1e-9 * w.abs().max(1.0), "{name} k={k}: {got:?} vs {want:?}");
            }
        }
    }
}
