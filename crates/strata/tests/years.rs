//! Whole-number years read as years (`1960`, never `1,960`) on the axes, in
//! the automatic description and in the data table, as calendars and
//! newspapers write them (Unicode LDML's `y` field is never grouped, TR35
//! Part 4 "Date Field Symbol Table"); a number that is not a year keeps its
//! grouping.

use strata::{render, RenderOptions};

fn draw(spec: &str) -> strata::Rendered {
    render(spec, None, &RenderOptions::default()).unwrap()
}

fn spec(name: &str, other: &str) -> String {
    format!(
        r#"{{ "data": {{ "rows": [ {{"{name}": 1960, "{other}": 1500}}, {{"{name}": 1990, "{other}": 2500}}, {{"{name}": 2020, "{other}": 4000}} ] }},
           "layers": [ {{ "draw": "line", "x": "{name}", "y": "{other}" }} ] }}"#
    )
}

#[test]
fn years_are_not_grouped() {
    for name in ["year", "Yr", "birth_year", "DECADE"] {
        let r = draw(&spec(name, "visitors"));
        for text in [&r.svg, &r.table] {
            assert!(!text.contains("1,960") && !text.contains("2,020"), "{name}: grouped year in\n{text}");
            assert!(text.contains(">1960<") || text.contains(">2020<"), "{name}: no year label in\n{text}");
        }
        let desc = r.svg.split("<desc").nth(1).unwrap();
        assert!(desc.contains("1960 to 2020"), "{name}: {desc}");
        // The values beside the years are not years: they keep their separator.
        assert!(desc.contains("1,500") && r.table.contains("2,500"), "{name}: {desc}");
    }
}

#[test]
fn only_year_names_and_year_values_count() {
    // Named like a year but not whole 4-digit numbers, or 4-digit whole numbers under another name.
    let r = draw(&spec("population", "yearly"));
    assert!(r.table.contains("1,960") && r.table.contains("2,500"), "{}", r.table);
    let r = draw(r#"{ "data": { "rows": [ {"year": 1960.5, "v": 1}, {"year": 2020, "v": 2} ] }, "layers": [ { "draw": "point", "x": "year", "y": "v" } ] }"#);
    assert!(r.table.contains("1,960.5"), "{}", r.table);
}

#[test]
fn a_format_the_spec_sets_still_wins() {
    let r = draw(
        r##"{ "data": { "rows": [ {"year": 1960, "v": 1}, {"year": 2020, "v": 2} ] }, "layers": [ { "draw": "point", "x": "year", "y": "v" } ],
                     "scales": { "x": { "format": "#,##0" } } }"##,
    );
    assert!(r.svg.contains(">2,000<"), "{}", r.svg);
}

/// `{"column": "year", "as": "date"}` is not ignored: whole years become
/// 1 January of the year on a time axis; other numbers are a located error.
#[test]
fn years_as_dates() {
    let r = draw(
        r#"{ "data": { "rows": [ {"year": 1960, "v": 1}, {"year": 2020, "v": 2} ] }, "layers": [ { "draw": "line", "x": {"column": "year", "as": "date"}, "y": "v" } ] }"#,
    );
    assert!(r.svg.contains(">1960<") && !r.svg.contains("1,960"), "{}", r.svg);
    assert!(r.table.contains("1960-01-01"), "{}", r.table);
    let spec = r#"{ "data": { "rows": [ {"year": 1960.5, "v": 1}, {"year": 2020, "v": 2} ] }, "layers": [ { "draw": "line", "x": {"column": "year", "as": "date"}, "y": "v" } ] }"#;
    let Err(e) = render(spec, None, &RenderOptions::default()) else { panic!("a number that is not a year cannot be a date") };
    let text = format!("{e:?}");
    assert!(text.contains("spec.not_a_date") && text.contains("layers[0].x.as"), "{text}");
}
