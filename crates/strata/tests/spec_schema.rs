//! The JSON Schema: committed file up to date; every spec in the repository
//! valid under a general-purpose validator (`jsonschema` crate 0.61,
//! draft 2020-12); and the engine's own shape check agreeing with that
//! validator on thousands of seeded mutations of those specs; every key and
//! every word in docs/spec.md; every default the same in code, schema and
//! docs.

use serde_json::{json, Value};
use strata::spec::schema_text;
use strata::spec::shape::{check, spec_shape, GEOMETRIES, LINT_CODES, SCALE_KINDS, STAT_WORDS, SUMMARIES};
use strata::{parse_spec, spec_from_value};

fn root() -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

fn validator() -> jsonschema::Validator {
    let schema: Value = serde_json::from_str(&std::fs::read_to_string(root().join("schema/strata-spec.schema.json")).unwrap()).unwrap();
    jsonschema::draft202012::new(&schema).expect("the schema is a valid draft 2020-12 schema")
}

/// Every spec in the repository: examples/*.json and the ```json blocks of docs/spec.md.
fn repository_specs() -> Vec<(String, String)> {
    let mut out = Vec::new();
    let mut files: Vec<_> = std::fs::read_dir(root().join("examples")).unwrap().map(|e| e.unwrap().path()).collect();
    files.sort();
    for p in files.into_iter().filter(|p| p.extension().is_some_and(|e| e == "json")) {
        out.push((p.display().to_string(), std::fs::read_to_string(&p).unwrap()));
    }
    let doc = std::fs::read_to_string(root().join("docs/spec.md")).unwrap();
    let mut lines = doc.lines().enumerate();
    while let Some((i, l)) = lines.next() {
        if l.trim() == "```json" {
            let mut block = String::new();
            for (_, l) in lines.by_ref() {
                if l.trim() == "```" {
                    break;
                }
                block.push_str(l);
                block.push('\n');
            }
            out.push((format!("docs/spec.md line {}", i + 1), block));
        }
    }
    out
}

#[test]
fn committed_schema_is_current() {
    let committed = std::fs::read_to_string(root().join("schema/strata-spec.schema.json")).unwrap();
    assert_eq!(committed.trim_end(), schema_text(), "regenerate with: cargo run -p strata-cli -- schema > schema/strata-spec.schema.json");
}

#[test]
fn every_repository_spec_validates() {
    let v = validator();
    let specs = repository_specs();
    assert!(specs.len() >= 20, "found only {} specs", specs.len());
    for (name, text) in &specs {
        let value: Value = serde_json::from_str(text).unwrap_or_else(|e| panic!("{name}: {e}"));
        let errors: Vec<String> = v.iter_errors(&value).map(|e| format!("{} at {}", e, e.instance_path())).collect();
        assert!(errors.is_empty(), "{name}: schema says {errors:?}");
        parse_spec(text).unwrap_or_else(|e| panic!("{name}: engine says {e}"));
    }
}

#[test]
fn general_validator_rejects_what_the_engine_rejects() {
    let v = validator();
    for bad in [
        json!({"layers": [{"draw": "pie"}]}),
        json!({"layers": [{"draw": "bar", "colour": "a"}]}),
        json!({"layers": []}),
        json!({"title": "no layers"}),
        json!({"layers": [{"draw": "bar", "stat": {"bin": {}, "fit": "linear"}}]}),
        json!({"layers": [{"draw": "bar"}], "scales": {"z": {}}}),
        json!({"layers": [{"draw": "bar"}], "size": {"width": "wide"}}),
        json!({"layers": [{"draw": "bar"}], "quiet": ["lint.nope"]}),
    ] {
        assert!(!v.is_valid(&bad), "{bad}");
        assert!(spec_from_value(&bad).is_err(), "{bad}");
    }
}

#[test]
fn every_key_is_documented() {
    let doc = std::fs::read_to_string(root().join("docs/spec.md")).unwrap();
    for path in strata::spec::shape::key_paths() {
        let leaf = path.rsplit(['.', ']']).next().unwrap();
        assert!(doc.contains(&format!("`{leaf}`")) || doc.contains(&format!("\"{leaf}\"")), "docs/spec.md does not mention `{leaf}` ({path})");
    }
}

/// The descriptions of every property named `key` inside a property named
/// `parent`, anywhere in the schema.
fn descriptions(schema: &Value, parent: &str, key: &str, inside: bool, out: &mut Vec<String>) {
    match schema {
        Value::Object(m) => {
            for (k, v) in m {
                if k == "properties" {
                    if let Value::Object(props) = v {
                        for (name, p) in props {
                            if inside && name == key {
                                out.push(p.get("description").and_then(Value::as_str).unwrap_or_default().to_string());
                            }
                            descriptions(p, parent, key, name == parent, out);
                        }
                    }
                } else {
                    descriptions(v, parent, key, inside, out);
                }
            }
        }
        Value::Array(a) => a.iter().for_each(|v| descriptions(v, parent, key, inside, out)),
        _ => {}
    }
}

#[test]
fn defaults_agree_in_code_schema_and_docs() {
    // The LOESS degree default was once 2 in the docs and the schema and 1 in
    // the code: each default is now defined once (spec::defaults) and both
    // texts are held to it.
    let schema: Value = serde_json::from_str(&schema_text()).unwrap();
    let doc = std::fs::read_to_string(root().join("docs/spec.md")).unwrap();
    let stat_docs = &doc[doc.find("### `stat`").expect("a stat section")..];
    let stat_docs = &stat_docs[..stat_docs[4..].find("\n### ").map_or(stat_docs.len(), |i| i + 4)];
    for (parent, key, word) in strata::spec::defaults::documented() {
        let mut found = Vec::new();
        descriptions(&schema, parent, key, false, &mut found);
        assert!(!found.is_empty(), "no `{parent}.{key}` in the schema");
        let says = |text: &str| text.contains(&format!("default {word}")) || text.contains(&format!("default `{word}`"));
        assert!(found.iter().any(|d| says(d)), "the schema's `{parent}.{key}` does not say `default {word}`: {found:?}");
        // In the docs: just after the key's first mention following its
        // parent's in the stat section.
        let from = stat_docs.find(&format!("`{parent}`")).unwrap_or_else(|| panic!("docs/spec.md's stat section does not mention `{parent}`"));
        let at = from + stat_docs[from..].find(&format!("`{key}`")).unwrap_or_else(|| panic!("docs/spec.md does not mention `{key}` after `{parent}`"));
        let near: String = stat_docs[at..].split_whitespace().collect::<Vec<_>>().join(" ").chars().take(90).collect();
        assert!(says(&near), "docs/spec.md does not say `default {word}` for `{key}`: {near:?}");
    }
}

#[test]
fn every_word_is_documented() {
    use strata::spec::shape::*;
    let doc = std::fs::read_to_string(root().join("docs/spec.md")).unwrap();
    let lists: &[(&str, &[&str])] = &[
        ("draw", GEOMETRIES),
        ("as/types", COLUMN_TYPES),
        ("format", DATA_FORMATS),
        ("stat", STAT_WORDS),
        ("summary", SUMMARIES),
        ("interval", INTERVALS),
        ("fit", FITS),
        ("rule", BIN_RULES),
        ("unit", BIN_UNITS),
        ("window summary", WINDOW_SUMMARIES),
        ("locale", LOCALES),
        ("bandwidth", BANDWIDTHS),
        ("align", WINDOW_ALIGN),
        ("arrange", ARRANGES),
        ("kind", SCALE_KINDS),
        ("axis/legend", PLACEMENTS),
        ("coords", COORD_WORDS),
        ("independent", INDEPENDENT),
        ("theme", THEME_WORDS),
        ("data_table", DATA_TABLE),
        ("style.shape", POINT_SHAPES),
        ("quiet", LINT_CODES),
    ];
    for (key, words) in lists {
        for w in *words {
            assert!(doc.contains(&format!("`{w}`")) || doc.contains(&format!("\"{w}\"")), "docs/spec.md does not mention the {key} word `{w}`");
        }
    }
}

// ---------------------------------------------------------------- mutations

/// SplitMix64 (Steele, Lea, Flood 2014): a small seeded generator.
struct Rng(u64);
impl Rng {
    fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9e3779b97f4a7c15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58476d1ce4e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d049bb133111eb);
        z ^ (z >> 31)
    }
    fn below(&mut self, n: usize) -> usize {
        (self.next() % n as u64) as usize
    }
}

const KEYS: &[&str] = &[
    "title", "layers", "draw", "x", "y", "color", "stat", "bin", "rule", "summary", "fit", "band", "window", "size", "kind", "domain", "zero", "coords",
    "angle", "inner", "theme", "text", "muted", "quiet", "style", "opacity", "dash", "data", "rows", "types", "titel", "colour",
];

fn random_value(r: &mut Rng, depth: usize) -> Value {
    let words: Vec<&str> = [GEOMETRIES, SCALE_KINDS, STAT_WORDS, SUMMARIES, LINT_CODES].concat();
    match r.below(if depth > 2 { 6 } else { 8 }) {
        0 => Value::Null,
        1 => json!(r.below(2) == 0),
        2 => json!(r.below(5) as i64 - 1),
        // Never x.0: JSON Schema counts 3.0 as an integer, the engine (serde) does not.
        3 => json!(r.below(9) as f64 / 4.0 + 0.125),
        4 => json!(words[r.below(words.len())]),
        5 => json!(["#000", "#ffffff", "a", "polar", "fd", "x", ""][r.below(7)]),
        6 => Value::Array((0..r.below(3)).map(|_| random_value(r, depth + 1)).collect()),
        _ => {
            let mut m = serde_json::Map::new();
            for _ in 0..r.below(3) {
                m.insert(KEYS[r.below(KEYS.len())].to_string(), random_value(r, depth + 1));
            }
            Value::Object(m)
        }
    }
}

/// Change one random place in `v`.
fn mutate(v: &mut Value, r: &mut Rng, depth: usize) {
    let descend = r.below(3) != 0 && depth < 6;
    match v {
        Value::Object(m) if !m.is_empty() && descend => {
            let k = m.keys().nth(r.below(m.len())).unwrap().clone();
            mutate(m.get_mut(&k).unwrap(), r, depth + 1);
        }
        Value::Array(a) if !a.is_empty() && descend => {
            let i = r.below(a.len());
            mutate(&mut a[i], r, depth + 1);
        }
        Value::Object(m) if r.below(2) == 0 => match r.below(3) {
            0 if !m.is_empty() => {
                let k = m.keys().nth(r.below(m.len())).unwrap().clone();
                m.shift_remove(&k);
            }
            1 if !m.is_empty() => {
                let k = m.keys().nth(r.below(m.len())).unwrap().clone();
                let val = m.shift_remove(&k).unwrap();
                m.insert(KEYS[r.below(KEYS.len())].to_string(), val);
            }
            _ => {
                m.insert(KEYS[r.below(KEYS.len())].to_string(), random_value(r, depth));
            }
        },
        _ => *v = random_value(r, depth),
    }
}

#[test]
fn shape_check_agrees_with_general_validator_on_mutations() {
    let v = validator();
    let shape = spec_shape();
    let seeds: Vec<Value> = repository_specs().iter().map(|(_, t)| serde_json::from_str(t).unwrap()).collect();
    let mut r = Rng(0x5eed_0001);
    let (mut accepted, mut rejected) = (0, 0);
    for n in 0..6000 {
        let mut s = seeds[n % seeds.len()].clone();
        for _ in 0..1 + r.below(3) {
            mutate(&mut s, &mut r, 0);
        }
        let mut errs = Vec::new();
        if s.is_object() {
            check(&s, &shape, "", &mut errs);
        }
        let empty_layers = s.get("layers").and_then(Value::as_array).is_some_and(|a| a.is_empty());
        let ours = s.is_object() && errs.is_empty() && !empty_layers;
        let theirs = v.is_valid(&s);
        assert_eq!(ours, theirs, "disagree on {s}\nengine: {errs:?}");
        if ours {
            accepted += 1;
            // What the shape check accepts, serde reads (only expression syntax, and the
            // bounds of `guard.rs`, which the schema does not express, may still fail).
            if let Err(e) = spec_from_value(&s) {
                let bound = |c: &str| matches!(c, "expr.invalid" | "spec.bad_color" | "spec.too_large" | "spec.bad_pattern") || c.starts_with("budget.");
                assert!(e.0.iter().all(|d| bound(&d.code)), "shape ok but serde failed on {s}: {e}");
            }
        } else {
            rejected += 1;
        }
    }
    // Both outcomes are well represented, so the agreement means something.
    assert!(accepted > 250 && rejected > 1000, "accepted {accepted}, rejected {rejected}");
}
