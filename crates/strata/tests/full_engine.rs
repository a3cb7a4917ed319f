//! The page's two engines: `spec::needs_full` (which specs the light core
//! engine refuses) and the element's guess from the spec's text
//! (`FULL_WORDS` in www/src/strata-chart.js) agree on every gallery and golden
//! spec, so no chart of ours pays a second drawing; and the paths and words
//! the core names.

use std::path::{Path, PathBuf};

fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

/// The element's word list, read from the element itself.
fn full_words() -> regex::Regex {
    let js = std::fs::read_to_string(root().join("www/src/strata-chart.js")).unwrap();
    let start = js.find("const FULL_WORDS = /").expect("FULL_WORDS in www/src/strata-chart.js") + "const FULL_WORDS = /".len();
    let end = start + js[start..].find("/;\n").unwrap();
    regex::Regex::new(&js[start..end]).unwrap()
}

#[test]
fn full_engine_words() {
    let words = full_words();
    let mut checked = 0;
    for dir in ["examples", "tests/golden/specs"] {
        let mut files: Vec<PathBuf> =
            std::fs::read_dir(root().join(dir)).unwrap().map(|e| e.unwrap().path()).filter(|p| p.extension().is_some_and(|e| e == "json")).collect();
        files.sort();
        for f in files {
            let text = std::fs::read_to_string(&f).unwrap();
            // Specs with errors (bad words, retired words) draw in neither engine.
            let Ok(spec) = strata::parse_spec(&text) else { continue };
            let rust = strata::spec::needs_full(&spec);
            assert_eq!(words.is_match(&text), rust.is_some(), "{}: needs_full says {rust:?}", f.display());
            // The core engine refuses from the JSON value, before reading.
            let value: serde_json::Value = serde_json::from_str(&text).unwrap();
            assert_eq!(strata::spec::needs_full_value(&value), rust, "{}", f.display());
            checked += 1;
        }
    }
    assert!(checked > 40, "{checked} specs checked");
}

/// The gallery charts that take the full engine (docs/element.md lists them).
#[test]
fn gallery_charts_on_the_full_engine() {
    let html = std::fs::read_to_string(root().join("www/index.html")).unwrap();
    let words = full_words();
    let mut full = Vec::new();
    for part in html.split("<strata-chart id=\"").skip(1) {
        let id = &part[..part.find('"').unwrap()];
        let tag_end = part.find('>').unwrap();
        let body = &part[..part.find("</strata-chart>").unwrap()];
        if part[..tag_end].contains("shapes-src") || words.is_match(body) {
            full.push(id);
        }
    }
    assert_eq!(full, ["boxes", "trend", "weather", "windrose", "panels", "seasons", "plots", "rain", "isles-steps", "isles-towns", "isles-globe"]);
}

#[test]
fn needs_full_names_the_path_and_word() {
    let cases = [
        (r#"{"layers":[{"draw":"line","x":"a","y":"b"}]}"#, None),
        (r#"{"layers":[{"draw":"bar","x":"a","y":"b","stat":{"summary":"median"}}],"theme":"dark"}"#, None),
        (r#"{"layers":[{"draw":"bar","x":"a","y":"b","stat":{"summary":"median"}}],"panels":{"by":"c"},"theme":"dark"}"#, Some(("panels", "panels"))),
        (r#"{"layers":[{"draw":"line","x":"a","y":"b"}],"panels":{"rows":"c","cols":"d","independent":"y"}}"#, Some(("panels", "panels"))),
        // A column named `panels` is not the word.
        (r#"{"layers":[{"draw":"line","x":"panels","y":"b","color":"panels"}]}"#, None),
        (r#"{"layers":[{"draw":"bar","x":"a","stat":{"bin":{"density":true}}}]}"#, None),
        // Columns named like the words are not the words.
        (r#"{"layers":[{"draw":"bar","x":"region","y":"box","color":"map","text":"fit"}]}"#, None),
        (r#"{"derive":{"c":"a + b"},"layers":[{"draw":"point","x":"a","y":"c"}]}"#, Some(("derive", "derive"))),
        (r#"{"where":"a > 1","layers":[{"draw":"point","x":"a","y":"b"}]}"#, Some(("where", "where"))),
        (r#"{"unpivot":{"columns":["a","b"],"into":["k","v"]},"layers":[{"draw":"line","x":"k","y":"v"}]}"#, Some(("unpivot", "unpivot"))),
        (r#"{"coords":{"kind":"polar"},"layers":[{"draw":"bar","x":"a","y":"b"}]}"#, Some(("coords", "polar"))),
        (r#"{"coords":"polar","layers":[{"draw":"bar","x":"a","y":"b"}]}"#, Some(("coords", "polar"))),
        (r#"{"coords":"map","layers":[{"draw":"point","x":"a","y":"b"}]}"#, Some(("coords", "map"))),
        (r#"{"coords":"cartesian","layers":[{"draw":"bar","x":"a","y":"b"}]}"#, None),
        (
            r#"{"layers":[{"draw":"point","x":"a","y":"b","color":"c"}],"scales":{"color":{"kind":"steps","breaks":"quantile"}}}"#,
            Some(("scales.color.kind", "steps")),
        ),
        (r#"{"layers":[{"draw":"point","x":"a","y":"b","color":"c"}],"scales":{"color":{"kind":"linear"}}}"#, None),
        // A colour column named `steps` or `polar` is not the word.
        (r#"{"layers":[{"draw":"point","x":"polar","y":"b","color":"steps"}]}"#, None),
        (r#"{"coords":{"kind":"map"},"layers":[{"draw":"point","x":"a","y":"b"}]}"#, Some(("coords", "map"))),
        (r#"{"shapes":{"features":[]},"layers":[{"draw":"region"}]}"#, Some(("shapes", "shapes"))),
        (r#"{"layers":[{"draw":"point","x":"a","y":"b"},{"draw":"line","x":"a","y":"b","stat":{"fit":"loess"}}]}"#, Some(("layers[1].stat.fit", "fit"))),
        (r#"{"layers":[{"draw":"area","x":"a","stat":{"density":{}}}]}"#, Some(("layers[0].stat.density", "density"))),
        (r#"{"layers":[{"draw":"line","x":"a","y":"b","stat":{"window":{"rows":3}}}]}"#, Some(("layers[0].stat.window", "window"))),
        (r#"{"layers":[{"draw":"point","x":"a","y":"b","stat":{"summary":"mean","interval":"ci95"}}]}"#, Some(("layers[0].stat.interval", "interval"))),
        (r#"{"layers":[{"draw":"box","x":"a","y":"b","stat":"box"}]}"#, Some(("layers[0].draw", "box"))),
    ];
    let words = full_words();
    for (text, want) in cases {
        let spec = strata::parse_spec(text).unwrap_or_else(|e| panic!("{text}: {e}"));
        let got = strata::spec::needs_full(&spec);
        assert_eq!(got.as_ref().map(|(p, w)| (p.as_str(), *w)), want, "{text}");
        let value: serde_json::Value = serde_json::from_str(text).unwrap();
        assert_eq!(strata::spec::needs_full_value(&value), got, "the core's refusal from the value, on {text}");
        assert_eq!(words.is_match(text), want.is_some(), "the element's words on {text}");
    }
}

/// The core engine refuses from the checked JSON value (`needs_full_value`,
/// before reading), the full engine reads: both name the first full-engine
/// part alike, in `needs_full`'s order, when a spec has several.
#[test]
fn the_value_and_the_read_spec_name_the_same_first_part() {
    let layer = |draw: &str, stat: &str| format!(r#"{{"draw":"{draw}","x":"a","y":"b"{stat}}}"#);
    let parts: [(&str, String); 9] = [
        ("shapes", r#""shapes":{"features":[]}"#.into()),
        ("coords", r#""coords":{"kind":"map","projection":"mercator"}"#.into()),
        ("derive", r#""derive":{"c":"a + b"}"#.into()),
        ("where", r#""where":"a > 1""#.into()),
        ("unpivot", r#""unpivot":{"columns":["a"],"into":["k","v"]}"#.into()),
        ("panels", r#""panels":{"by":"a"}"#.into()),
        ("steps", r#""scales":{"color":{"kind":"steps","count":4}}"#.into()),
        ("region", r#""coords":"cartesian""#.into()),
        ("none", r#""derive":{}"#.into()),
    ];
    let layers = [
        layer("point", ""),
        layer("line", r#","stat":{"summary":"mean","interval":"ci95"}"#),
        layer("box", r#","stat":"box""#),
        layer("bar", r#","stat":"box""#),
        layer("region", ""),
        layer("line", r#","stat":{"window":{"rows":3,"align":"trailing"}}"#),
        layer("area", r#","stat":{"density":{"bandwidth":"silverman"}}"#),
        layer("line", r#","stat":{"fit":"loess","span":0.5,"band":0.9}"#),
    ];
    let mut checked = 0;
    // Every pair of top-level parts with every pair of layers.
    for (_, a) in &parts {
        for (_, b) in &parts {
            for l1 in &layers {
                for l2 in &layers {
                    let text = if a == b { format!(r#"{{{a},"layers":[{l1},{l2}]}}"#) } else { format!(r#"{{{a},{b},"layers":[{l1},{l2}]}}"#) };
                    let value: serde_json::Value = serde_json::from_str(&text).unwrap();
                    let Ok(spec) = strata::spec_from_value(&value) else { continue };
                    assert_eq!(strata::spec::needs_full_value(&value), strata::spec::needs_full(&spec), "{text}");
                    checked += 1;
                }
            }
        }
    }
    assert!(checked > 2000, "{checked}");
}

/// A spec whose full-engine part has a mistake gets the mistake, located,
/// from either engine (the core checks every key's shape before it
/// refuses), never `spec.needs_full_engine`; the page shows it as is.
#[test]
fn a_mistake_in_a_full_engine_part_is_located_first() {
    let cases = [
        (r#"{"layers":[{"draw":"line","x":"a","y":"b","stat":{"window":{"rows":2.5}}}]}"#, "layers[0].stat.window.rows", "spec.wrong_type"),
        (r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"coords":{"kind":"polar","angle":"z"}}"#, "coords.angle", "spec.unknown_word"),
        (r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"panels":{"by":"a","colums":2}}"#, "panels.colums", "spec.unknown_key"),
        (r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"unpivot":{"columns":"a","into":["k","v"]}}"#, "unpivot.columns", "spec.wrong_type"),
        (r#"{"layers":[{"draw":"region","key":"k"}],"shapes":{"features":[],"kye":"id"}}"#, "shapes.kye", "spec.unknown_key"),
    ];
    for (text, path, code) in cases {
        let e = strata::parse_spec(text).unwrap_err().0;
        assert_eq!((e[0].at.path.as_str(), e[0].code.as_str()), (path, code), "{text}: {e:?}");
        assert!(e.iter().all(|d| d.code != "spec.needs_full_engine"), "{text}: {e:?}");
    }
}
