//! Which specs need the page's full engine.
//!
//! The page loads a light core engine, built without the `full` feature
//! (crates/strata/Cargo.toml): no maps, no `derive`/`where` expressions, no
//! `unpivot`, no fitted or smoothed statistics (`fit`, `density`, `window`,
//! `interval`, box plots), no polar coordinates, no `steps` colour scale,
//! no small multiples (`panels`). A spec that asks for one of those takes
//! the full engine instead. [`needs_full`] says so in every build; the core
//! refuses such a spec with `spec.needs_full_engine` at the path that
//! [`needs_full_value`] returns from the checked JSON value, after the
//! shape check (so a mistake anywhere is still reported, located, by both
//! engines) and before reading it, so the readers of those parts are not
//! in the core (spec/read.rs: the lines under `feature = "full"`);
//! `<strata-chart>` guesses the same from the spec's text
//! with a short word list (`FULL_WORDS` in www/src/strata-chart.js; the test
//! `full_engine_words` in tests/full_engine.rs holds the two together) and
//! falls back to the full engine on that error.

use super::{Coords, Geometry, ScaleKind, Spec, Stat};
use serde_json::Value;

/// The first part of `spec` that only the full engine draws: its JSON path
/// and the word that asks for it; `None` for a spec the core draws.
pub fn needs_full(spec: &Spec) -> Option<(String, &'static str)> {
    let at = |path: &str, word| Some((path.to_string(), word));
    if spec.shapes.is_some() {
        return at("shapes", "shapes");
    }
    match spec.coords {
        Coords::Map(_) => return at("coords", "map"),
        Coords::Polar(_) => return at("coords", "polar"),
        Coords::Cartesian => {}
    }
    if let Some(i) = spec.layers.iter().position(|l| l.draw == Geometry::Region) {
        return layer_at(i, "", "draw", "region");
    }
    if !spec.derive.is_empty() {
        return at("derive", "derive");
    }
    if spec.where_.is_some() {
        return at("where", "where");
    }
    if spec.unpivot.is_some() {
        return at("unpivot", "unpivot");
    }
    if spec.panels.is_some() {
        return at("panels", "panels");
    }
    if spec.scales.get(&crate::channel::Channel::Color).is_some_and(|c| c.kind == Some(ScaleKind::Steps)) {
        return at("scales.color.kind", "steps");
    }
    for (i, l) in spec.layers.iter().enumerate() {
        if l.draw == Geometry::Box {
            return layer_at(i, "", "draw", "box");
        }
        match &l.stat {
            Stat::Box => return layer_at(i, "", "stat", "box"),
            Stat::Object(o) => {
                let word = if o.fit.is_some() {
                    "fit"
                } else if o.density.is_some() {
                    "density"
                } else if o.window.is_some() {
                    "window"
                } else if o.interval.is_some() {
                    "interval"
                } else {
                    continue;
                };
                return layer_at(i, "stat.", word, word);
            }
            _ => {}
        }
    }
    None
}

/// [`needs_full`] on the checked JSON value, before it is read: the same
/// path and word for every spec the shape check accepts (tests/full_engine.rs
/// holds the two together). The core engine refuses with it, so it never
/// reads the parts only the full engine draws and leaves their readers out.
pub fn needs_full_value(v: &Value) -> Option<(String, &'static str)> {
    // The shape check accepts no null: a key that is there is set.
    let has = |key: &str| v.get(key).is_some();
    let at = |path: &str, word| Some((path.to_string(), word));
    let layers = v.get("layers").and_then(Value::as_array).map_or(&[][..], Vec::as_slice);
    if has("shapes") {
        return at("shapes", "shapes");
    }
    match v.get("coords") {
        Some(Value::String(w)) if w == "polar" => return at("coords", "polar"),
        Some(Value::String(w)) if w == "map" => return at("coords", "map"),
        Some(c @ Value::Object(_)) => return at("coords", if c.get("kind").and_then(Value::as_str) == Some("map") { "map" } else { "polar" }),
        _ => {}
    }
    let draw = |l: &Value, w: &str| l.get("draw").and_then(Value::as_str) == Some(w);
    if let Some(i) = layers.iter().position(|l| draw(l, "region")) {
        return layer_at(i, "", "draw", "region");
    }
    if v.get("derive").and_then(Value::as_object).is_some_and(|d| !d.is_empty()) {
        return at("derive", "derive");
    }
    for key in ["where", "unpivot", "panels"] {
        if has(key) {
            return Some((key.to_string(), key));
        }
    }
    if v.get("scales").and_then(|s| s.get("color")).and_then(|c| c.get("kind")).and_then(Value::as_str) == Some("steps") {
        return at("scales.color.kind", "steps");
    }
    for (i, l) in layers.iter().enumerate() {
        if draw(l, "box") {
            return layer_at(i, "", "draw", "box");
        }
        match l.get("stat") {
            Some(Value::String(w)) if w == "box" => return layer_at(i, "", "stat", "box"),
            Some(o @ Value::Object(_)) => {
                if let Some(word) = ["fit", "density", "window", "interval"].into_iter().find(|w| o.get(*w).is_some()) {
                    return layer_at(i, "stat.", word, word);
                }
            }
            _ => {}
        }
    }
    None
}

/// The answer for a part of layer `i`: `layers[i].{prefix}{key}` and the word.
#[inline(never)]
fn layer_at(i: usize, prefix: &str, key: &str, word: &'static str) -> Option<(String, &'static str)> {
    Some((format!("layers[{i}].{prefix}{key}"), word))
}
