//! Expression tests: SQL three-valued logic truth tables and semantics.

use super::*;
use crate::data::from_rows;
use indexmap::IndexMap;
use serde_json::json;

fn table(rows: serde_json::Value) -> Table {
    let rows: Vec<serde_json::Map<String, serde_json::Value>> = rows.as_array().unwrap().iter().map(|r| r.as_object().unwrap().clone()).collect();
    from_rows(&rows, &Default::default()).unwrap()
}

/// A table from CSV text (integers stay Int64 there; JSON numbers are Float64).
fn csv(text: &str) -> Table {
    crate::data::read(text.as_bytes(), &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), ..Default::default() }).unwrap()
}

/// Every pair of truth values (TRUE, FALSE, UNKNOWN as NULL) in columns p, q.
fn truth_pairs() -> Table {
    let v = [json!(true), json!(false), json!(null)];
    let mut rows = vec![];
    for p in &v {
        for q in &v {
            rows.push(json!({"p": p, "q": q, "anchor": true}));
        }
    }
    table(json!(rows))
}

fn bools(t: &Table, e: &str) -> Vec<Option<bool>> {
    let a = evaluate(t, e).unwrap_or_else(|err| panic!("{}", err.render(e)));
    let Column::Bool(v) = a else { panic!("{a:?}") };
    v
}

fn text0(c: Column) -> String {
    let Column::Text(v) = c else { panic!("{c:?}") };
    v.get(0).unwrap().to_string()
}

const T: Option<bool> = Some(true);
const F: Option<bool> = Some(false);
const U: Option<bool> = None;

// Truth tables for AND, OR, NOT and IS, ISO/IEC 9075-2 (SQL/Foundation),
// subclause 6.39 <boolean value expression>, Tables "Truth table for the AND
// boolean operator", "... OR ...", "... IS ..." (from memory of the standard;
// rows ordered p, q over TRUE, FALSE, UNKNOWN).
#[test]
fn and_truth_table_iso_9075() {
    let t = truth_pairs();
    assert_eq!(bools(&t, "p AND q"), vec![T, F, U, F, F, F, U, F, U]);
}

#[test]
fn or_truth_table_iso_9075() {
    let t = truth_pairs();
    assert_eq!(bools(&t, "p OR q"), vec![T, T, T, T, F, U, T, U, U]);
}

#[test]
fn not_truth_table_iso_9075() {
    let t = truth_pairs();
    assert_eq!(bools(&t, "NOT p"), vec![F, F, F, T, T, T, U, U, U]);
}

#[test]
fn is_null_and_comparisons_with_unknown() {
    let t = truth_pairs();
    // IS NULL is never UNKNOWN.
    assert_eq!(bools(&t, "p IS NULL"), vec![F, F, F, F, F, F, T, T, T]);
    assert_eq!(bools(&t, "p IS NOT NULL"), vec![T, T, T, T, T, T, F, F, F]);
    // A comparison with NULL is UNKNOWN (ISO/IEC 9075-2, 8.2 <comparison predicate>).
    assert_eq!(bools(&t, "p = q"), vec![T, F, U, F, T, U, U, U, U]);
    assert_eq!(bools(&t, "NULL = NULL"), vec![U; 9]);
}

#[test]
fn in_and_between_with_nulls() {
    // 8.4 <in predicate>: x IN (a, b) = x = a OR x = b; 8.3 <between predicate>.
    let t = csv("x,k\n1,a\n2,b\n,c\n");
    assert_eq!(bools(&t, "x IN (1, 3)"), vec![T, F, U]);
    assert_eq!(bools(&t, "x IN (1, NULL)"), vec![T, U, U]);
    assert_eq!(bools(&t, "x NOT IN (1, NULL)"), vec![F, U, U]);
    assert_eq!(bools(&t, "x BETWEEN 1 AND 1.5"), vec![T, F, U]);
    assert_eq!(bools(&t, "x NOT BETWEEN 1 AND NULL"), vec![U, U, U]);
    assert_eq!(bools(&t, "x NOT BETWEEN 3 AND NULL"), vec![T, T, U]);
}

#[test]
fn where_keeps_only_true_rows() {
    let t = truth_pairs();
    let out = apply(t, &Default::default(), Some("p OR q")).unwrap();
    // TRUE rows of the OR table: 5 of 9.
    assert_eq!(out.num_rows(), 5);
}

#[test]
fn derive_chains_and_replaces() {
    let t = csv("a,b\n7,2.0\n-7,0.0\n,4.5\n");
    let mut d = IndexMap::new();
    d.insert("half".to_string(), "a / 2".to_string());
    d.insert("ratio".to_string(), "a / b".to_string());
    d.insert("twice".to_string(), "half * 2".to_string());
    d.insert("b".to_string(), "b + 1".to_string());
    let out = apply(t, &d.into_iter().collect(), None).unwrap();
    let ints = |n: &str| match out.by_name(n) {
        Some(Column::Int(v)) => v.iter().collect::<Vec<_>>(),
        c => panic!("{c:?}"),
    };
    let nums = |n: &str| match out.by_name(n) {
        Some(Column::Float(v)) => v.iter().collect::<Vec<_>>(),
        c => panic!("{c:?}"),
    };
    // Integer division truncates toward zero (as SQLite and ISO's exact numerics).
    assert_eq!(ints("half"), vec![Some(3), Some(-3), None]);
    assert_eq!(nums("ratio"), vec![Some(3.5), None, None]);
    assert_eq!(ints("twice"), vec![Some(6), Some(-6), None]);
    assert_eq!(nums("b"), vec![Some(3.0), Some(1.0), Some(5.5)]);
    assert_eq!(out.column_names(), vec!["a", "b", "half", "ratio", "twice"]);
}

#[test]
fn errors_name_the_spec_path_and_character() {
    let t = table(json!([{"rain_mm": 1.0, "station": "x"}]));
    let mut d = IndexMap::new();
    d.insert("rain_cm".to_string(), "rainmm / 10".to_string());
    d.insert("later".to_string(), "rain_cm * 2".to_string());
    d.insert("bad".to_string(), "1 +".to_string());
    let e = apply(t, &d.into_iter().collect(), Some("station > 3")).unwrap_err();
    // Syntax errors come first (parsed up front), then evaluation errors in order;
    // `later` uses the failed `rain_cm` and reports nothing more.
    let paths: Vec<&str> = e.0.iter().map(|d| d.at.path.as_str()).collect();
    assert_eq!(paths, vec!["derive.bad", "derive.rain_cm", "where"]);
    let m = &e.0[1];
    assert!(m.message.contains("no column `rainmm`") && m.message.contains("character 1"), "{}", m.message);
    assert!(m.message.contains("\n    rainmm / 10\n    ^^^^^^"), "{}", m.message);
    assert!(m.hint.as_ref().unwrap().contains("did you mean rain_mm"), "{:?}", m.hint);
    assert!(e.0[2].message.contains("compares text with an integer"), "{}", e.0[2].message);
}

#[test]
fn type_errors_say_expected_and_found() {
    let t = csv("s,x\na,1\n");
    let e = evaluate(&t, "s + 1").unwrap_err();
    assert_eq!(e.message, "`+` needs numbers on both sides, but this is text");
    assert_eq!(e.span, Span { start: 0, end: 1 });
    let e = evaluate(&t, "sqrt(s)").unwrap_err();
    assert!(e.message.contains("sqrt() needs a number"));
    let e = evaluate(&t, "sqrtt(x)").unwrap_err();
    assert!(e.hint.unwrap().contains("did you mean sqrt()"));
    let e = evaluate(&t, "CASE WHEN x > 0 THEN 'a' ELSE 1 END").unwrap_err();
    assert!(e.message.contains("ELSE branch gives an integer"), "{}", e.message);
    assert!(evaluate(&t, "-9223372036854775807 - x").is_ok());
    let e = evaluate(&t, "abs(-9223372036854775807 - x)").unwrap_err();
    assert!(e.message.contains("too large") && e.message.contains("data row 1"), "{}", e.message);
    let e = evaluate(&t, "9223372036854775807 + x").unwrap_err();
    assert_eq!(e.span, Span { start: 0, end: 23 });
}

#[test]
fn functions_and_dates() {
    let t = table(json!([{"d": "2024-02-29", "ts": "2024-02-29T23:59:59Z", "s": "Ärger"}]));
    let ints = |e: &str| match evaluate(&t, e).unwrap() {
        Column::Int(v) => v.values[0],
        c => panic!("{c:?}"),
    };
    assert_eq!(ints("year(d)"), 2024);
    assert_eq!(ints("month(ts)"), 2);
    assert_eq!(ints("day(ts)"), 29);
    // Unicode default case conversion (The Unicode Standard, 3.13): Ä <-> ä.
    assert_eq!(text0(evaluate(&t, "lower(s)").unwrap()), "ärger");
    assert_eq!(text0(evaluate(&t, "upper(s)").unwrap()), "ÄRGER");
    assert_eq!(ints("length(s)"), 5);
    assert_eq!(bools(&t, "d < '2024-03-01' AND ts > DATE '2024-02-29'"), vec![T]);
    let f = |e: &str| match evaluate(&t, e).unwrap() {
        Column::Float(v) => v.get(0),
        c => panic!("{c:?}"),
    };
    assert_eq!(f("log(1000)"), Some(3.0));
    assert_eq!(f("log(2, 8)"), Some(3.0));
    assert_eq!(f("ln(0)"), None);
    assert_eq!(f("sqrt(-1)"), None);
    assert_eq!(f("exp(1000)"), None);
    assert_eq!(f("round(2.675, 2)"), Some(2.68));
    assert_eq!(f("round(-2.5)"), Some(-3.0));
    assert_eq!(f("coalesce(NULL, 2, 3.5)"), Some(2.0));
}
