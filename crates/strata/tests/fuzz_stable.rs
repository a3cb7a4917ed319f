//! A stable-toolchain stand-in for the libFuzzer targets in fuzz/: seeded
//! random inputs for spec JSON and for expressions, asserting no panic and
//! the basic contracts (an evaluated column has one value per row; an
//! error points inside the text). STRATA_FUZZ_CASES scales the run
//! (default 3000 a target, a few seconds in a debug build).

use serde_json::Value;

/// SplitMix64 (Steele, Lea, Flood 2014).
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
    fn pick<'a>(&mut self, xs: &[&'a str]) -> &'a str {
        xs[self.below(xs.len())]
    }
}

fn cases() -> usize {
    std::env::var("STRATA_FUZZ_CASES").ok().and_then(|v| v.parse().ok()).unwrap_or(3000)
}

const TABLE: &str = "i,x,s,b,d,t\n1,1.5,a,true,2024-01-31,2024-01-31T10:00:00Z\n-7,,It's,false,,2000-02-29T00:00:00Z\n,0.0,,,1969-12-31,\n9223372036854775807,-2.5e10,Ünï,true,2024-02-29,2024-02-29T23:59:59Z\n";

const TOKENS: &[&str] = &[
    "i",
    "x",
    "s",
    "b",
    "d",
    "t",
    "\"i\"",
    "\"s\"",
    "nope",
    "1",
    "0",
    "-1",
    "2.5",
    "1e308",
    "9223372036854775807",
    "'a'",
    "''",
    "'It''s'",
    "TRUE",
    "FALSE",
    "NULL",
    "DATE '2024-02-29'",
    "TIMESTAMP '2024-01-01 00:00:00'",
    "+",
    "-",
    "*",
    "/",
    "||",
    "=",
    "<>",
    "<",
    "<=",
    ">",
    ">=",
    "AND",
    "OR",
    "NOT",
    "IN",
    "BETWEEN",
    "IS",
    "CASE",
    "WHEN",
    "THEN",
    "ELSE",
    "END",
    "(",
    ")",
    ",",
    "log(",
    "ln(",
    "exp(",
    "sqrt(",
    "abs(",
    "round(",
    "floor(",
    "ceil(",
    "lower(",
    "upper(",
    "length(",
    "year(",
    "month(",
    "day(",
    "coalesce(",
    "'",
    "\"",
    "%",
    "é",
    "\n",
];

/// A well-formed random expression (so that evaluation, not only parsing, is exercised).
fn grammar(r: &mut Rng, depth: usize) -> String {
    if depth > 4 {
        return r.pick(&["i", "x", "s", "b", "d", "t", "1", "2.5", "'a'", "NULL", "TRUE"]).to_string();
    }
    let a = grammar(r, depth + 1);
    let b = grammar(r, depth + 1);
    match r.below(12) {
        0 => format!("{a} {} {b}", r.pick(&["+", "-", "*", "/", "||"])),
        1 => format!("{a} {} {b}", r.pick(&["=", "<>", "<", "<=", ">", ">="])),
        2 => format!("{a} {} {b}", r.pick(&["AND", "OR"])),
        3 => format!("NOT {a}"),
        4 => format!("{a} IS {}NULL", r.pick(&["", "NOT "])),
        5 => format!("{a} {}IN ({b}, {})", r.pick(&["", "NOT "]), grammar(r, depth + 1)),
        6 => format!("{a} BETWEEN {b} AND {}", grammar(r, depth + 1)),
        7 => format!("CASE WHEN {a} THEN {b} ELSE {} END", grammar(r, depth + 1)),
        8 => format!("{}({a})", r.pick(&["log", "ln", "exp", "sqrt", "abs", "round", "floor", "ceil", "lower", "upper", "length", "year", "month", "day"])),
        9 => format!("coalesce({a}, {b})"),
        10 => format!("-({a})"),
        _ => format!("({a})"),
    }
}

/// A well-typed random expression of kind 'n' (number), 'b' (boolean) or 't' (text).
fn typed(r: &mut Rng, kind: char, depth: usize) -> String {
    let leaf = depth > 4 || r.below(4) == 0;
    match kind {
        'n' if leaf => r.pick(&["i", "x", "1", "-3", "2.5", "0", "NULL", "9223372036854775807", "year(d)", "month(t)", "length(s)"]).to_string(),
        'n' => match r.below(6) {
            0 => format!("{} {} {}", typed(r, 'n', depth + 1), r.pick(&["+", "-", "*", "/"]), typed(r, 'n', depth + 1)),
            1 => format!("{}({})", r.pick(&["log", "ln", "exp", "sqrt", "abs", "round", "floor", "ceil"]), typed(r, 'n', depth + 1)),
            2 => format!("CASE WHEN {} THEN {} ELSE {} END", typed(r, 'b', depth + 1), typed(r, 'n', depth + 1), typed(r, 'n', depth + 1)),
            3 => format!("coalesce({}, {})", typed(r, 'n', depth + 1), typed(r, 'n', depth + 1)),
            4 => format!("round({}, {})", typed(r, 'n', depth + 1), r.pick(&["0", "2", "-1", "40", "i"])),
            _ => format!("-({})", typed(r, 'n', depth + 1)),
        },
        'b' if leaf => r.pick(&["b", "TRUE", "FALSE", "NULL", "d < '2020-01-01'", "t >= DATE '2024-01-31'"]).to_string(),
        'b' => match r.below(7) {
            0 => format!("{} {} {}", typed(r, 'n', depth + 1), r.pick(&["=", "<>", "<", "<=", ">", ">="]), typed(r, 'n', depth + 1)),
            1 => format!("{} {} {}", typed(r, 'b', depth + 1), r.pick(&["AND", "OR"]), typed(r, 'b', depth + 1)),
            2 => format!("NOT {}", typed(r, 'b', depth + 1)),
            3 => format!("{} IN ({}, {})", typed(r, 'n', depth + 1), typed(r, 'n', depth + 1), typed(r, 'n', depth + 1)),
            4 => format!("{} NOT BETWEEN {} AND {}", typed(r, 't', depth + 1), typed(r, 't', depth + 1), typed(r, 't', depth + 1)),
            5 => {
                let k = ['n', 't', 'b'][r.below(3)];
                format!("{} IS NOT NULL", typed(r, k, depth + 1))
            }
            _ => format!("{} = {}", typed(r, 't', depth + 1), typed(r, 't', depth + 1)),
        },
        _ if leaf => r.pick(&["s", "'a'", "''", "NULL", "'Ünï'"]).to_string(),
        _ => match r.below(4) {
            0 => format!("{} || {}", typed(r, 't', depth + 1), typed(r, 't', depth + 1)),
            1 => format!("{}({})", r.pick(&["lower", "upper"]), typed(r, 't', depth + 1)),
            2 => format!("CASE {} WHEN {} THEN {} END", typed(r, 'n', depth + 1), typed(r, 'n', depth + 1), typed(r, 't', depth + 1)),
            _ => format!("coalesce({}, {})", typed(r, 't', depth + 1), typed(r, 't', depth + 1)),
        },
    }
}

#[test]
fn expressions_never_panic() {
    let table = strata::data::read(TABLE.as_bytes(), &Default::default()).unwrap();
    let mut r = Rng(0xe7_9e55);
    let (mut ok, mut err) = (0, 0);
    for n in 0..cases() {
        let text = match n % 4 {
            3 => {
                let k = ['n', 'b', 't'][r.below(3)];
                typed(&mut r, k, 0)
            }
            0 => (0..1 + r.below(12)).map(|_| r.pick(TOKENS)).collect::<Vec<_>>().join(if r.below(2) == 0 { " " } else { "" }),
            1 => grammar(&mut r, 0),
            _ => {
                // A grammatical expression with a few characters changed.
                let mut c: Vec<char> = grammar(&mut r, 1).chars().collect();
                for _ in 0..1 + r.below(3) {
                    let i = r.below(c.len() + 1);
                    let ch = ['(', ')', '\'', '"', ' ', '-', 'x', 'N', '9', ','][r.below(10)];
                    if i < c.len() && r.below(2) == 0 {
                        c[i] = ch;
                    } else {
                        c.insert(i.min(c.len()), ch);
                    }
                }
                c.into_iter().collect()
            }
        };
        match strata::expr::evaluate(&table, &text) {
            Ok(col) => {
                assert_eq!(col.len(), table.num_rows(), "{text}");
                ok += 1;
            }
            Err(e) => {
                assert!(e.span.start <= text.chars().count(), "{text}: span {:?}", e.span);
                assert!(e.render(&text).contains('^'));
                err += 1;
            }
        }
    }
    assert!(ok > cases() / 8 && err > cases() / 8, "ok {ok}, err {err}");
}

#[test]
fn specs_never_panic() {
    let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../..");
    let mut seeds: Vec<String> = std::fs::read_dir(root.join("examples"))
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "json"))
        .map(|p| std::fs::read_to_string(p).unwrap())
        .collect();
    seeds.sort();
    seeds.push(r##"{"data":{"rows":[{"a":1,"b":"x"},{"a":null,"b":"y"}]},"derive":{"c":"a * 2"},"where":"b <> 'y'","layers":[{"draw":"bar","x":"b","y":"c"}],"theme":{"text":"#777"}}"##.into());
    let pieces =
        ["{", "}", "[", "]", ",", ":", "\"", "null", "true", "1e999", "-0", "\"layers\"", "\"draw\"", "\"where\"", "\"derive\"", "\"rows\"", "\\u0000", "é"];
    let mut r = Rng(0x5bec_f022);
    let mut parsed = 0;
    for n in 0..cases() {
        let seed = &seeds[n % seeds.len()];
        let mut text: Vec<char> = seed.chars().collect();
        for _ in 0..1 + r.below(4) {
            let i = r.below(text.len() + 1);
            match r.below(3) {
                0 if i < text.len() => {
                    text.remove(i);
                }
                1 => {
                    let p: Vec<char> = r.pick(&pieces).chars().collect();
                    text.splice(i..i, p);
                }
                _ => text.truncate(i.max(1)),
            }
        }
        let text: String = text.into_iter().collect();
        if let Ok(spec) = strata::parse_spec(&text) {
            parsed += 1;
            let _ = strata::lint::check(&spec, None);
            if let Some(rows) = spec.data.as_ref().and_then(|d| d.object().rows) {
                if let Ok(table) = strata::data::from_rows(&rows, &Default::default()) {
                    let _ = strata::expr::apply(table, &spec.derive, spec.where_.as_deref());
                }
            }
        } else if let Err(e) = serde_json::from_str::<Value>(&text) {
            // Invalid JSON: the engine must say so with a position.
            let msg = strata::parse_spec(&text).unwrap_err().0[0].message.clone();
            assert!(msg.contains("line"), "{e}: {msg}");
        }
    }
    assert!(parsed > 0);
}

/// Random but well-formed specs over small awkward tables (nulls, one row,
/// ties, negatives, dates, huge and tiny numbers), through the whole
/// pipeline: the render either succeeds with well-formed output or fails
/// with located errors; it never panics (a panic would take the page's
/// engine down with it).
#[test]
fn rendering_never_panics() {
    let mut r = Rng(0x0dd_ba11);
    let geometries = ["point", "line", "step", "area", "bar", "band", "segment", "label", "cell", "box", "range"];
    let stats = [
        "\"none\"",
        "\"count\"",
        "\"box\"",
        "{\"bin\":{\"rule\":\"fd\"}}",
        "{\"bin\":{\"width\":0.5}}",
        "{\"bin\":{\"rule\":\"doane\",\"density\":true}}",
        "{\"summary\":\"mean\",\"interval\":\"ci95\"}",
        "{\"summary\":\"quantile\",\"p\":0.9}",
        "{\"summary\":\"mean\",\"interval\":\"wilson\"}",
        "{\"fit\":\"linear\",\"band\":0.95}",
        "{\"fit\":\"loess\",\"span\":0.3,\"robust\":true}",
        "{\"density\":{\"bandwidth\":\"silverman\"}}",
        "{\"window\":{\"rows\":3,\"summary\":\"sum\",\"align\":\"trailing\"}}",
        "{\"window\":{\"rows\":2,\"summary\":\"running_total\"}}",
    ];
    let arranges = ["none", "stack", "beside", "proportion", "jitter"];
    let coords = [
        "\"cartesian\"",
        "{\"kind\":\"polar\",\"angle\":\"x\",\"inner\":0.3}",
        "{\"kind\":\"polar\",\"angle\":\"y\",\"start\":90}",
        "\"map\"",
        "{\"kind\":\"map\",\"projection\":\"orthographic\",\"graticule\":30,\"fit\":\"data\"}",
        "{\"kind\":\"map\",\"projection\":\"albers\",\"rotate\":30,\"center\":[170,-40]}",
    ];
    let panels = [
        "",
        ",\"panels\":{\"by\":\"g\",\"columns\":2}",
        ",\"panels\":{\"rows\":\"g\",\"cols\":\"h\"}",
        ",\"panels\":{\"cols\":\"g\",\"independent\":\"both\"}",
        ",\"panels\":{\"by\":\"h\",\"independent\":\"y\"}",
    ];
    let notes = [
        "",
        ",\"notes\":[{\"y\":1,\"text\":\"one\"},{\"x\":0,\"x_end\":2,\"text\":\"span\"}]",
        ",\"notes\":[{\"x\":\"a\",\"y\":2,\"text\":\"p\"},{\"y\":0,\"y_end\":1}]",
    ];
    let scales = [
        "",
        ",\"scales\":{\"y\":{\"kind\":\"log\"}}",
        ",\"scales\":{\"x\":{\"kind\":\"category\"},\"y\":{\"zero\":true,\"format\":\"#,##0.0\"}}",
        ",\"scales\":{\"y\":{\"kind\":\"symlog\",\"axis\":\"right\"},\"color\":{\"legend\":\"left\"}}",
        ",\"scales\":{\"x\":{\"domain\":[5,1]}}",
        ",\"scales\":{\"color\":{\"kind\":\"steps\",\"breaks\":\"natural\",\"count\":4}}",
        ",\"scales\":{\"color\":{\"kind\":\"steps\",\"breaks\":[0,1]}}",
    ];
    let xs = ["n", "m", "g", "d", "e"];
    let ys = ["n", "m", "v", "e"];
    let extra = [
        "",
        ",\"color\":\"g\"",
        ",\"color\":\"v\"",
        ",\"group\":\"h\",\"tip\":[\"g\",\"d\"]",
        ",\"size\":\"m\",\"shape\":\"h\"",
        ",\"y_end\":\"m\",\"x_end\":\"n\"",
        ",\"text\":\"g\"",
    ];
    let themes = ["", ",\"theme\":{\"font_size\":20,\"base\":\"dark\"}", ",\"data_table\":\"open\",\"locale\":\"de\""];
    // Rows: n number (with a null), m number, v 0/1, g and h text, d date, e empty.
    let row = |r: &mut Rng, i: usize| {
        let n = match r.below(6) {
            0 => "null".to_string(),
            1 => "-1e12".into(),
            2 => "0".into(),
            _ => format!("{}", (i % 5) as f64 * 1.5 - 2.0),
        };
        let m = match r.below(5) {
            0 => "1e-300".into(),
            1 => "3".into(),
            _ => format!("{}", r.below(100)),
        };
        let d = match r.below(4) {
            0 => "null".into(),
            _ => format!("\"2024-0{}-1{}\"", 1 + r.below(9), r.below(9)),
        };
        format!(r#"{{"n":{n},"m":{m},"v":{},"g":"{}","h":"{}","d":{d},"e":null}}"#, r.below(2), ["a", "b", "c"][r.below(3)], ["p", "q"][r.below(2)])
    };
    let (mut ok, mut err) = (0, 0);
    for _ in 0..cases() / 3 {
        let rows: Vec<String> = (0..[0, 1, 2, 5, 40][r.below(5)]).map(|i| row(&mut r, i)).collect();
        let layers: Vec<String> = (0..1 + r.below(2))
            .map(|_| {
                format!(
                    r#"{{"draw":"{}","x":"{}","y":"{}","stat":{},"arrange":"{}"{}}}"#,
                    r.pick(&geometries),
                    r.pick(&xs),
                    r.pick(&ys),
                    r.pick(&stats),
                    r.pick(&arranges),
                    r.pick(&extra)
                )
            })
            .collect();
        let spec = format!(
            r#"{{"title":"T","data":{{"rows":[{}]}},"layers":[{}],"coords":{}{}{}{}{},"size":{{"width":{}}}}}"#,
            rows.join(","),
            layers.join(","),
            r.pick(&coords),
            r.pick(&panels),
            r.pick(&notes),
            r.pick(&scales),
            r.pick(&themes),
            [120, 330, 640][r.below(3)]
        );
        match strata::render(&spec, None, &strata::RenderOptions::default()) {
            Ok(out) => {
                ok += 1;
                assert!(out.svg.starts_with("<svg") && out.svg.trim_end().ends_with("</svg>"), "{spec}");
                assert!(!out.svg.contains("NaN") && !out.svg.contains("inf"), "non-finite number in the SVG of {spec}");
                let bad = out.scene.non_finite();
                assert!(bad.is_empty(), "non-finite geometry at {bad:?} in the scene of {spec}");
            }
            Err(e) => {
                err += 1;
                assert!(!e.0.is_empty(), "{spec}");
            }
        }
    }
    assert!(ok > 0 && err > 0, "ok {ok}, err {err}");
}

/// Whole specs with expressions (issue 16): random `derive` and `where`
/// over the awkward table, well-typed, grammatical, mutated, and operator
/// chains of random length on both sides of the depth bound, drawn by a
/// layer that uses the derived columns; through the whole pipeline. A render
/// either draws well-formed SVG or fails with located errors.
#[test]
fn whole_specs_with_expressions_never_panic() {
    let mut r = Rng(0x5ec_0e55);
    let (mut drew, mut refused) = (0, 0);
    for n in 0..cases() / 3 {
        let mut derive = serde_json::Map::new();
        for k in 0..1 + r.below(3) {
            let text = match r.below(5) {
                0 => {
                    let kind = ['n', 'b', 't'][r.below(3)];
                    typed(&mut r, kind, 0)
                }
                1 => grammar(&mut r, 1),
                2 => {
                    // A flat chain: 1 to 400 operators (the bound is 128 levels).
                    let op = r.pick(&["+", "-", "*", "/", "||", "AND", "OR", "=", "<"]);
                    let len = 1 + r.below(400);
                    let leaf = r.pick(&["i", "x", "s", "b", "1", "'a'", "c0"]);
                    vec![leaf; len + 1].join(&format!(" {op} "))
                }
                3 => format!("{}{}{}", "(".repeat(r.below(80)), typed(&mut r, 'n', 2), ")".repeat(r.below(80))),
                _ => (0..1 + r.below(12)).map(|_| r.pick(TOKENS)).collect::<Vec<_>>().join(" "),
            };
            derive.insert(format!("c{k}"), Value::String(text));
        }
        let where_ = match r.below(3) {
            0 => Some(typed(&mut r, 'b', 1)),
            1 => Some(format!("i IS NULL{}", " OR x > 0".repeat(r.below(200)))),
            _ => None,
        };
        let y = r.pick(&["c0", "x", "i"]);
        let layer = match r.below(4) {
            0 => serde_json::json!({"draw": "point", "x": "i", "y": y, "color": "c0"}),
            1 => serde_json::json!({"draw": "bar", "x": "c0", "y": "x"}),
            2 => serde_json::json!({"draw": "line", "x": "d", "y": y, "tooltip": ["c0", "s"]}),
            _ => serde_json::json!({"draw": "label", "x": "i", "y": "x", "text": "c0"}),
        };
        let mut spec = serde_json::json!({"derive": derive, "layers": [layer]});
        if let Some(w) = where_ {
            spec["where"] = Value::String(w);
        }
        if r.below(4) == 0 {
            let base = [2.0, 1e6, 1e50, 0.5, 1.01][r.below(5)];
            spec["scales"] = serde_json::json!({"x": {"kind": "log", "base": base}});
        }
        let text = spec.to_string();
        match strata::render(&text, Some(strata::DataBytes { bytes: TABLE.as_bytes(), name: "t.csv" }), &Default::default()) {
            Ok(out) => {
                assert!(out.svg.starts_with("<svg"), "case {n}: {text}");
                assert!(!out.svg.chars().any(|c| (c as u32) < 0x20 && !matches!(c, '\t' | '\n' | '\r')), "case {n}");
                drew += 1;
            }
            Err(e) => {
                for d in &e.0 {
                    assert!(!d.at.path.is_empty() || d.at.line.is_some(), "case {n}: unlocated {d}: {text}");
                    assert!(d.to_string().len() < 10_000, "case {n}: a long message");
                }
                refused += 1;
            }
        }
    }
    assert!(drew > 0 && refused > 0, "drew {drew}, refused {refused}");
}
