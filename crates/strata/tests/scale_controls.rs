//! Issue 12, builds: `unpivot`, chosen colours (`scales.color.values`),
//! and category axis control (`order`, `top`, `unit`). Invented data.

use serde_json::Value;
use strata::scene::SceneOptions;
use strata::{render, RenderOptions};

fn draw(spec: &str) -> strata::Rendered {
    render(spec, None, &RenderOptions { scene: SceneOptions { width: 640.0 } }).unwrap_or_else(|e| panic!("{e}"))
}

fn refuse(spec: &str) -> Vec<(String, String, String)> {
    let Err(e) = render(spec, None, &RenderOptions { scene: SceneOptions { width: 640.0 } }) else { panic!("drawn, not refused") };
    e.0.iter().map(|d| (d.code.clone(), d.at.path.clone(), d.hint.clone().unwrap_or_default())).collect()
}

fn marks(r: &strata::Rendered) -> Vec<Value> {
    let s = serde_json::to_value(&r.scene).unwrap();
    fn walk(n: &Value, out: &mut Vec<Value>) {
        if n["type"] == "group" {
            n["children"].as_array().unwrap().iter().for_each(|c| walk(c, out));
        } else if n.get("datum").is_some() {
            out.push(n.clone());
        }
    }
    let mut out = Vec::new();
    s["children"].as_array().unwrap().iter().for_each(|c| walk(c, &mut out));
    out
}

fn texts(r: &strata::Rendered, class: &str) -> Vec<String> {
    r.svg
        .split("<text class=\"")
        .skip(1)
        .filter(|t| t.starts_with(&format!("{class}\"")))
        .map(|t| t.split('>').nth(1).unwrap().split('<').next().unwrap().to_string())
        .collect()
}

const WIDE: &str = r#""data": { "rows": [
    {"station": "North pier", "mar": 30, "jan": 10, "feb": 20},
    {"station": "Lighthouse", "mar": 35, "jan": 15, "feb": null} ] }"#;

#[test]
fn unpivot_turns_wide_columns_into_rows_in_listed_order() {
    let r = draw(&format!(
        r#"{{ {WIDE}, "unpivot": {{ "columns": ["jan", "feb", "mar"], "into": ["month", "rain"] }},
            "layers": [ {{ "draw": "line", "x": "month", "y": "rain", "color": "station" }} ] }}"#
    ));
    // The months keep the listed order on the axis (not the file's mar, jan, feb).
    let ticks = texts(&r, "strata-tick");
    let months: Vec<&String> = ticks.iter().filter(|t| ["jan", "feb", "mar"].contains(&t.as_str())).collect();
    assert_eq!(months, ["jan", "feb", "mar"]);
    assert!(r.table.contains("<th scope=\"col\">month</th>") && r.table.contains("<th scope=\"col\">rain</th>"), "{}", r.table);
    assert!(r.table.contains("(6 rows)"), "{}", r.table);
}

#[test]
fn unpivot_mistakes_point_at_the_spec() {
    let e = refuse(&format!(
        r#"{{ {WIDE}, "unpivot": {{ "columns": ["jan", "fbe"], "into": ["month", "rain"] }}, "layers": [ {{ "draw": "point", "x": "month", "y": "rain" }} ] }}"#
    ));
    assert_eq!((e[0].0.as_str(), e[0].1.as_str()), ("spec.unknown_column", "unpivot.columns[1]"), "{e:?}");
    assert!(e[0].2.contains("did you mean `feb`?"), "{e:?}");
    let e = refuse(&format!(
        r#"{{ {WIDE}, "unpivot": {{ "columns": ["jan"], "into": ["station", "rain"] }}, "layers": [ {{ "draw": "point", "x": "station", "y": "rain" }} ] }}"#
    ));
    assert_eq!((e[0].0.as_str(), e[0].1.as_str()), ("spec.unpivot_into", "unpivot.into[0]"), "{e:?}");
    // The shape check: `into` is two names.
    let e = strata::parse_spec(r#"{ "unpivot": { "columns": ["a"], "into": ["k"] }, "layers": [ { "draw": "point" } ] }"#).unwrap_err();
    assert_eq!(e.0[0].at.path, "unpivot.into", "{e:?}");
}

const GATES: &str = r#""data": { "rows": [
    {"month": "Jan", "gate": "Lane gate", "visitors": 120}, {"month": "Jan", "gate": "River gate", "visitors": 90}, {"month": "Jan", "gate": "Mill gate", "visitors": 60},
    {"month": "Feb", "gate": "Lane gate", "visitors": 150}, {"month": "Feb", "gate": "River gate", "visitors": 80}, {"month": "Feb", "gate": "Mill gate", "visitors": 70} ] }"#;

#[test]
fn chosen_colours_with_other_for_the_rest() {
    let r = draw(&format!(
        r##"{{ {GATES}, "layers": [ {{ "draw": "line", "x": "month", "y": "visitors", "color": "gate" }} ],
            "scales": {{ "color": {{ "values": {{ "Lane gate": "#c2410c", "other": "#9aa3ad" }} }} }} }}"##
    ));
    let lines = marks(&r);
    let stroke = |gate: &str| lines.iter().find(|m| m["datum"]["color"] == gate).unwrap()["stroke"].as_str().unwrap().to_string();
    assert_eq!(stroke("Lane gate"), "#c2410c");
    assert_eq!(stroke("River gate"), "#9aa3ad");
    assert_eq!(stroke("Mill gate"), "#9aa3ad");
    // The legend names the chosen category and gathers the rest as "Other".
    let legend = texts(&r, "strata-legend-label");
    assert_eq!(legend, ["Lane gate", "Other"], "{}", r.svg);
    assert!(r.warnings.is_empty(), "{:?}", r.warnings);
}

#[test]
fn chosen_colours_are_checked() {
    // A category that is not there: a warning with a did-you-mean.
    let r = draw(&format!(
        r##"{{ {GATES}, "layers": [ {{ "draw": "line", "x": "month", "y": "visitors", "color": "gate" }} ],
            "scales": {{ "color": {{ "values": {{ "Lane gat": "#c2410c" }} }} }} }}"##
    ));
    let w: Vec<_> = r.warnings.iter().filter(|w| w.code == "spec.unknown_category").collect();
    assert_eq!(w.len(), 1, "{:?}", r.warnings);
    assert_eq!(w[0].at.path, "scales.color.values.\"Lane gat\"");
    assert!(w[0].hint.as_deref().unwrap().contains("did you mean `Lane gate`?"));
    // Not a colour: refused where it is written.
    let e = strata::parse_spec(&format!(
        r#"{{ {GATES}, "layers": [ {{ "draw": "line", "x": "month", "y": "visitors", "color": "gate" }} ],
            "scales": {{ "color": {{ "values": {{ "Lane gate": "orangeish" }} }} }} }}"#
    ))
    .unwrap_err();
    assert_eq!((e.0[0].code.as_str(), e.0[0].at.path.as_str()), ("spec.bad_color", "scales.color.values.\"Lane gate\""), "{e:?}");
}

const SHOPS: &str = r#""data": { "rows": [
    {"shop": "Bakery", "sales": 40}, {"shop": "Chemist", "sales": 90}, {"shop": "Grocer", "sales": 65},
    {"shop": "Florist", "sales": 10}, {"shop": "Cobbler", "sales": 15} ] }"#;

fn bar_names(r: &strata::Rendered, key: &str) -> Vec<String> {
    let mut bars: Vec<(f64, String)> = marks(r).iter().map(|m| (m["y"].as_f64().unwrap(), m["datum"][key].as_str().unwrap().to_string())).collect();
    bars.sort_by(|a, b| a.0.total_cmp(&b.0));
    bars.into_iter().map(|b| b.1).collect()
}

#[test]
fn order_sorts_categories_by_the_value_drawn() {
    // Horizontal bars, largest on top.
    let r = draw(&format!(r#"{{ {SHOPS}, "layers": [ {{ "draw": "bar", "x": "sales", "y": "shop" }} ], "scales": {{ "y": {{ "order": "descending" }} }} }}"#));
    assert_eq!(bar_names(&r, "y"), ["Chemist", "Grocer", "Bakery", "Cobbler", "Florist"]);
    // Vertical bars, smallest first (left to right).
    let r = draw(&format!(r#"{{ {SHOPS}, "layers": [ {{ "draw": "bar", "x": "shop", "y": "sales" }} ], "scales": {{ "x": {{ "order": "ascending" }} }} }}"#));
    let mut bars: Vec<(f64, String)> = marks(&r).iter().map(|m| (m["x"].as_f64().unwrap(), m["datum"]["x"].as_str().unwrap().to_string())).collect();
    bars.sort_by(|a, b| a.0.total_cmp(&b.0));
    assert_eq!(bars.iter().map(|b| b.1.as_str()).collect::<Vec<_>>(), ["Florist", "Cobbler", "Bakery", "Grocer", "Chemist"]);
}

#[test]
fn top_keeps_the_largest_and_gathers_the_rest() {
    let r = draw(&format!(
        r#"{{ {SHOPS}, "layers": [ {{ "draw": "bar", "x": "sales", "y": "shop" }} ], "scales": {{ "y": {{ "top": 2, "order": "descending" }} }} }}"#
    ));
    assert_eq!(bar_names(&r, "y"), ["Chemist", "Grocer", "Other"]);
    // Other adds up what it gathered: 40 + 10 + 15.
    let other = marks(&r).into_iter().find(|m| m["datum"]["y"] == "Other").unwrap();
    assert_eq!(other["datum"]["x"].as_f64(), Some(65.0));
}

#[test]
fn unit_is_written_once_with_the_value_axis_title() {
    let r = draw(&format!(r#"{{ {SHOPS}, "layers": [ {{ "draw": "bar", "x": "shop", "y": "sales" }} ], "scales": {{ "y": {{ "unit": "£ thousand" }} }} }}"#));
    let titles = texts(&r, "strata-axis-title");
    assert!(titles.contains(&"sales (£ thousand)".to_string()), "{titles:?}");
    let r = draw(&format!(
        r#"{{ {SHOPS}, "layers": [ {{ "draw": "bar", "x": "shop", "y": "sales" }} ], "scales": {{ "y": {{ "title": "", "unit": "£ thousand" }} }} }}"#
    ));
    assert!(texts(&r, "strata-axis-title").contains(&"£ thousand".to_string()));
}

#[test]
fn ticks_may_be_the_values_themselves() {
    // Numbers: exactly the chosen values inside the domain, whatever the room.
    let rows: Vec<String> = (0..=10).map(|i| format!(r#"{{"t": {}, "v": {}}}"#, i * 10, i * 3)).collect();
    let spec = |ticks: &str| {
        format!(
            r#"{{ "data": {{ "rows": [{}] }}, "layers": [ {{ "draw": "line", "x": "t", "y": "v" }} ], "scales": {{ "x": {{ "ticks": {ticks} }} }} }}"#,
            rows.join(",")
        )
    };
    let r = draw(&spec("[0, 25, 50, 100, 400]"));
    let ticks = texts(&r, "strata-tick");
    // The horizontal axis is written first: its labels, then the vertical axis's (0, 5, 10, ...).
    assert_eq!(ticks[..5], ["0", "25", "50", "100", "0"], "{ticks:?}");
    // A count still works as before.
    assert!(render(&spec("4"), None, &RenderOptions::default()).is_ok());
    // Categories: only the named ones are labelled.
    let r = draw(&format!(
        r#"{{ {SHOPS}, "layers": [ {{ "draw": "bar", "x": "shop", "y": "sales" }} ], "scales": {{ "x": {{ "ticks": ["Bakery", "Grocer"] }} }} }}"#
    ));
    let ticks = texts(&r, "strata-tick");
    assert!(ticks.contains(&"Bakery".to_string()) && ticks.contains(&"Grocer".to_string()) && !ticks.contains(&"Chemist".to_string()), "{ticks:?}");
    // Dates on a time axis, labelled by the unit they fall on.
    let days: Vec<String> = (1..=12).map(|m| format!(r#"{{"d": "2024-{m:02}-15", "v": {m}}}"#)).collect();
    let r = draw(&format!(
        r#"{{ "data": {{ "rows": [{}], "types": {{"d": "date"}} }}, "layers": [ {{ "draw": "line", "x": "d", "y": "v" }} ], "scales": {{ "x": {{ "ticks": ["2024-04-01", "2024-10-01"] }} }} }}"#,
        days.join(",")
    ));
    let ticks = texts(&r, "strata-tick");
    assert!(ticks.contains(&"Apr 2024".to_string()) && ticks.contains(&"Oct".to_string()), "{ticks:?}");
    // Not a number on a number axis: refused at the item.
    let e = refuse(&spec(r#"[0, "lots"]"#));
    assert_eq!((e[0].0.as_str(), e[0].1.as_str()), ("spec.bad_ticks", "scales.x.ticks[1]"), "{e:?}");
}
