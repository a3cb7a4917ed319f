//! Statistics and position adjustments through the whole pipeline: spec and
//! data in, plan and scene out.

use crate::channel::Channel;
use crate::scene::Node;
use crate::{render, DataBytes, RenderOptions};
use serde_json::Value;

const FAITHFUL: &[u8] = include_bytes!("../../../../tests/reference/fixtures/stats/old_faithful.csv");

fn run(spec: &str, csv: &[u8]) -> crate::Rendered {
    render(spec, Some(DataBytes { bytes: csv, name: "data.csv" }), &RenderOptions::default()).unwrap_or_else(|e| panic!("{e:?}"))
}

fn marks_of(r: &crate::Rendered) -> Vec<&Node> {
    r.scene.marks()
}

fn datum(n: &Node) -> &crate::scene::Datum {
    match n {
        Node::Rect { datum: Some(d), .. } | Node::Circle { datum: Some(d), .. } | Node::Path { datum: Some(d), .. } => d,
        _ => panic!("no datum"),
    }
}

fn f(v: &Value) -> f64 {
    v.as_f64().unwrap()
}

fn fixture_case(rule: &str) -> (Vec<f64>, Vec<f64>) {
    let fx: Value = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/stats/bins.json")).unwrap();
    let case = fx["cases"].as_array().unwrap().iter().find(|c| c["set"] == "old_faithful_eruptions" && c["rule"] == rule).unwrap().clone();
    let g = |k: &str| case[k].as_array().unwrap().iter().map(f).collect();
    (g("edges"), g("counts"))
}

#[test]
fn old_faithful_histogram_lists_edges_and_counts() {
    // Old Faithful eruption durations binned by Freedman-Diaconis; edges and
    // counts from numpy.histogram_bin_edges / numpy.histogram (numpy 2.4.6).
    let r = run(r#"{"layers":[{"draw":"bar","x":"eruptions","stat":{"bin":{"rule":"fd"}}}]}"#, FAITHFUL);
    let (edges, counts) = fixture_case("fd");
    let m = marks_of(&r);
    assert_eq!(m.len(), counts.len());
    let mut total = 0.0;
    for (k, node) in m.iter().enumerate() {
        let d = datum(node);
        assert!((f(&d["x"]) - edges[k]).abs() < 1e-12, "bin {k} start");
        assert!((f(&d["x_end"]) - edges[k + 1]).abs() < 1e-12, "bin {k} end");
        assert_eq!(f(&d["count"]), counts[k], "bin {k} count");
        assert_eq!(f(&d["y"]), counts[k]);
        total += f(&d["count"]);
        assert!(matches!(node, Node::Rect { .. }));
    }
    assert_eq!(total, 272.0);
}

#[test]
fn histogram_density_integrates_to_one() {
    let r = run(r#"{"layers":[{"draw":"bar","x":"eruptions","stat":{"bin":{"count":12,"density":true}}}]}"#, FAITHFUL);
    // numpy.histogram(x, bins=12, density=True) (numpy 2.4.6).
    let (_, dens) = fixture_case("density:12");
    let mut area = 0.0;
    for (k, node) in marks_of(&r).iter().enumerate() {
        let d = datum(node);
        assert!((f(&d["y"]) - dens[k]).abs() < 1e-12);
        area += f(&d["y"]) * (f(&d["x_end"]) - f(&d["x"]));
    }
    assert!((area - 1.0).abs() < 1e-12);
}

#[test]
fn density_area_matches_exact_kde_and_integrates_to_one() {
    let spec = r#"{"layers":[{"draw":"area","x":"eruptions","stat":{"density":{"bandwidth":"silverman","grid":200}}}]}"#;
    let r = run(spec, FAITHFUL);
    let m = marks_of(&r);
    assert_eq!(m.len(), 1);
    let table =
        crate::data::read(FAITHFUL, &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), types: Default::default(), ..Default::default() })
            .unwrap();
    let spec = crate::parse_spec(spec).unwrap();
    let plan = crate::plan::build(&spec, &table).unwrap();
    let d = &plan.layers[0].data;
    let xs: Vec<f64> = (0..d.len).map(|i| d.get(Channel::X).unwrap().num(i).unwrap()).collect();
    let ys: Vec<f64> = (0..d.len).map(|i| d.get(Channel::Y).unwrap().num(i).unwrap()).collect();
    let (e, _) = faithful_columns();
    let h = crate::stat::density::bandwidth(&e, crate::stat::density::Bandwidth::Silverman).unwrap();
    let exact = crate::stat::density::kde_exact(&e, h, &xs);
    for (a, b) in ys.iter().zip(&exact) {
        assert!((a - b).abs() < 1e-12);
    }
    // Trapezoid rule over min - 3h .. max + 3h: the density integrates to
    // 1 less the normal tails beyond 3 bandwidths (at most 2.7e-3).
    let area: f64 = xs.windows(2).zip(ys.windows(2)).map(|(x, y)| (x[1] - x[0]) * (y[0] + y[1]) / 2.0).sum();
    assert!(area > 0.997 && area <= 1.0001, "{area}");
}

fn faithful_columns() -> (Vec<f64>, Vec<f64>) {
    let text = std::str::from_utf8(FAITHFUL).unwrap();
    text.lines()
        .skip(1)
        .map(|l| {
            let mut it = l.split(',');
            (it.next().unwrap().parse::<f64>().unwrap(), it.next().unwrap().parse::<f64>().unwrap())
        })
        .unzip()
}

#[test]
fn summary_interval_on_a_range_layer_groups_by_x_and_color() {
    let csv = b"g,c,v\na,p,1\na,p,2\na,p,4\na,q,10\na,q,12\nb,p,3\nb,p,5\nb,p,7\nb,p,9\n";
    let r = run(r#"{"layers":[{"draw":"range","x":"g","y":"v","color":"c","stat":{"summary":"mean","interval":"ci95"}}]}"#, csv);
    let m = marks_of(&r);
    assert_eq!(m.len(), 3);
    let d = datum(m[0]);
    assert_eq!(d["x"], "a");
    assert_eq!(d["color"], "p");
    let (lo, hi) = crate::stat::summary::t_interval(&[1.0, 2.0, 4.0], 0.95).unwrap();
    assert!((f(&d["y"]) - lo).abs() < 1e-12 && (f(&d["y_end"]) - hi).abs() < 1e-12);
    assert!((f(&d["estimate"]) - 7.0 / 3.0).abs() < 1e-12);
    // mean 7/3, sd 1.5275, t(0.975, 2) = 4.302653 (scipy.stats.t.ppf, scipy 1.17.1): half-width 3.7946.
    assert!((hi - lo - 2.0 * 3.794_6).abs() < 2e-3, "{}", hi - lo);
    let d = datum(m[2]);
    assert_eq!(d["x"], "b");
    assert!((f(&d["estimate"]) - 6.0).abs() < 1e-12);
}

#[test]
fn point_summary_with_interval_draws_error_bars() {
    let csv = b"g,v\na,1\na,2\na,4\nb,3\nb,5\n";
    let r = run(r#"{"layers":[{"draw":"point","x":"g","y":"v","stat":{"summary":"median","interval":"min_max"}}]}"#, csv);
    let m = marks_of(&r);
    assert_eq!(m.len(), 2);
    let d = datum(m[0]);
    assert_eq!((f(&d["y"]), f(&d["y_low"]), f(&d["y_high"])), (2.0, 1.0, 4.0));
    assert!(r.svg.matches("<path").count() >= 2, "error bars drawn");
}

#[test]
fn quantile_summary_takes_p() {
    let csv = b"g,v\na,1\na,2\na,3\na,4\na,5\n";
    let r = run(r#"{"layers":[{"draw":"bar","x":"g","y":"v","stat":{"summary":"quantile","p":0.9}}]}"#, csv);
    // numpy.quantile([1,2,3,4,5], 0.9) = 4.6 (linear, type 7).
    assert!((f(&datum(marks_of(&r)[0])["y"]) - 4.6).abs() < 1e-12);
}

#[test]
fn stack_puts_negatives_below_zero_on_their_own() {
    let csv = b"x,s,v\na,s1,3\na,s2,-2\na,s3,4\na,s4,-1\nb,s1,1\nb,s2,1\n";
    let spec = crate::parse_spec(r#"{"layers":[{"draw":"bar","x":"x","y":"v","color":"s","arrange":"stack"}]}"#).unwrap();
    let table =
        crate::data::read(csv, &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), types: Default::default(), ..Default::default() })
            .unwrap();
    let plan = crate::plan::build(&spec, &table).unwrap();
    let d = &plan.layers[0].data;
    let col = |c: Channel| (0..d.len).map(|i| d.get(c).unwrap().num(i).unwrap()).collect::<Vec<_>>();
    assert_eq!(col(Channel::YBase), vec![0.0, 0.0, 3.0, -2.0, 0.0, 1.0]);
    // Tops are running totals; y keeps each row's own value, total the stack's sum (3 - 2 + 4 - 1 = 4).
    assert_eq!(col(Channel::YTop), vec![3.0, -2.0, 7.0, -3.0, 1.0, 2.0]);
    assert_eq!(col(Channel::Y), vec![3.0, -2.0, 4.0, -1.0, 1.0, 1.0]);
    assert_eq!(col(Channel::Total), vec![4.0, 4.0, 4.0, 4.0, 2.0, 2.0]);

    let spec = crate::parse_spec(r#"{"layers":[{"draw":"bar","x":"x","y":"v","color":"s","arrange":"proportion"}]}"#).unwrap();
    let plan = crate::plan::build(&spec, &table).unwrap();
    let d = &plan.layers[0].data;
    let col = |c: Channel| (0..d.len).map(|i| d.get(c).unwrap().num(i).unwrap()).collect::<Vec<_>>();
    // x = a: |3| + |-2| + |4| + |-1| = 10.
    assert_eq!(col(Channel::YTop), vec![0.3, -0.2, 0.7, -0.3, 0.5, 1.0]);
    assert_eq!(col(Channel::Y), vec![0.3, -0.2, 0.4, -0.1, 0.5, 0.5]);
}

#[test]
fn beside_splits_the_band_among_colours() {
    let csv = b"x,s,v\na,p,3\na,q,2\nb,p,1\nb,q,4\n";
    let r = run(r#"{"layers":[{"draw":"bar","x":"x","y":"v","color":"s","arrange":"beside"}]}"#, csv);
    let rects: Vec<(f64, f64)> = marks_of(&r)
        .iter()
        .map(|n| match n {
            Node::Rect { x, width, .. } => (*x, *width),
            _ => panic!(),
        })
        .collect();
    assert!((rects[0].1 - rects[1].1).abs() < 1e-9);
    assert!((rects[0].0 + rects[0].1 - rects[1].0).abs() < 1e-9, "p then q, touching");
}

#[test]
fn jitter_is_identical_every_run_and_bounded() {
    let csv = b"g,v\na,1\na,1\na,1\nb,2\nb,2\nb,3\n";
    let spec = r#"{"layers":[{"draw":"point","x":"g","y":"v","arrange":"jitter"}]}"#;
    let a = run(spec, csv);
    let b = run(spec, csv);
    assert_eq!(a.svg, b.svg);
    let xs: Vec<f64> = marks_of(&a)
        .iter()
        .map(|n| match n {
            Node::Circle { cx, .. } => *cx,
            _ => panic!(),
        })
        .collect();
    assert!(xs[0] != xs[1] && xs[1] != xs[2], "points moved apart");
    // Jitter in y is at most 40 % of the resolution (1).
    let spec_p = crate::parse_spec(spec).unwrap();
    let table =
        crate::data::read(csv, &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), types: Default::default(), ..Default::default() })
            .unwrap();
    let plan = crate::plan::build(&spec_p, &table).unwrap();
    let d = &plan.layers[0].data;
    let orig = [1.0, 1.0, 1.0, 2.0, 2.0, 3.0];
    for i in 0..d.len {
        let y = d.get(Channel::Y).unwrap().num(i).unwrap();
        assert!((y - orig[i]).abs() <= 0.4);
        assert!(d.get(Channel::XOffset).unwrap().num(i).unwrap().abs() <= 0.3);
    }
}

#[test]
fn box_plot_has_quartiles_whiskers_and_outliers() {
    let mut csv = String::from("g,v\n");
    for v in [1, 2, 3, 4, 5, 6, 7, 8, 9, 30] {
        csv.push_str(&format!("a,{v}\n"));
    }
    for v in [5, 5, 6, 7] {
        csv.push_str(&format!("b,{v}\n"));
    }
    let r = run(r#"{"layers":[{"draw":"box","x":"g","y":"v","stat":"box"}]}"#, csv.as_bytes());
    let m = marks_of(&r);
    // a: box + one outlier (30); b: box.
    assert_eq!(m.len(), 3);
    let d = datum(m[0]);
    // numpy.quantile([1..9, 30], [.25, .5, .75]) = 3.25, 5.5, 7.75 (type 7); fences -3.5 .. 14.5.
    assert_eq!((f(&d["q1"]), f(&d["median"]), f(&d["q3"])), (3.25, 5.5, 7.75));
    assert_eq!((f(&d["y"]), f(&d["y_end"])), (1.0, 9.0));
    let o = datum(m[1]);
    assert_eq!(o["part"], "outlier");
    assert_eq!(f(&o["y"]), 30.0);
}

#[test]
fn dates_bin_by_calendar_month() {
    let csv = b"day\n2024-01-03\n2024-01-31\n2024-02-01\n2024-02-29\n2024-03-15\n2024-03-31\n2024-03-31\n";
    let r = run(r#"{"layers":[{"draw":"bar","x":"day","stat":{"bin":{"unit":"month"}}}]}"#, csv);
    let got: Vec<(String, String, f64)> = marks_of(&r)
        .iter()
        .map(|n| {
            let d = datum(n);
            (d["x"].as_str().unwrap().to_string(), d["x_end"].as_str().unwrap().to_string(), f(&d["count"]))
        })
        .collect();
    assert_eq!(got.len(), 3);
    assert!(got[0].0.starts_with("2024-01-01") && got[0].1.starts_with("2024-02-01"), "{got:?}");
    assert_eq!(got.iter().map(|g| g.2).collect::<Vec<_>>(), vec![2.0, 2.0, 3.0]);
}

#[test]
fn linear_fit_draws_band_under_line_on_anscombe_set_one() {
    // Anscombe (1973), set 1: fitted line y = 3.00 + 0.500 x.
    let xs = [10.0, 8.0, 13.0, 9.0, 11.0, 14.0, 6.0, 4.0, 12.0, 7.0, 5.0];
    let ys = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];
    let mut csv = String::from("x,y\n");
    for (a, b) in xs.iter().zip(ys) {
        csv.push_str(&format!("{a},{b}\n"));
    }
    let spec = r#"{"layers":[{"draw":"point","x":"x","y":"y"},{"draw":"line","x":"x","y":"y","stat":{"fit":"linear"}}]}"#;
    let r = run(spec, csv.as_bytes());
    let paths: Vec<&Node> = marks_of(&r).into_iter().filter(|n| matches!(n, Node::Path { .. })).collect();
    assert_eq!(paths.len(), 2, "band then line");
    assert!(matches!(paths[0], Node::Path { paint, .. } if paint.fill.as_deref() != Some("none")));
    let table = crate::data::read(
        csv.as_bytes(),
        &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), types: Default::default(), ..Default::default() },
    )
    .unwrap();
    let plan = crate::plan::build(&crate::parse_spec(spec).unwrap(), &table).unwrap();
    let d = &plan.layers[1].data;
    for i in 0..d.len {
        let x = d.get(Channel::X).unwrap().num(i).unwrap();
        let y = d.get(Channel::Y).unwrap().num(i).unwrap();
        assert!((y - (3.0 + 0.5 * x)).abs() < 0.01);
        assert!(d.get(Channel::YLow).unwrap().num(i).unwrap() < y && d.get(Channel::YHigh).unwrap().num(i).unwrap() > y);
    }
}

#[test]
fn loess_options_reach_the_fit() {
    let mut csv = String::from("x,y\n");
    for i in 0..60 {
        let x = i as f64 * 0.1;
        csv.push_str(&format!("{x},{}\n", x * x));
    }
    let spec = r#"{"layers":[{"draw":"line","x":"x","y":"y","stat":{"fit":"loess","span":0.3,"degree":2,"robust":true}}]}"#;
    let table = crate::data::read(
        csv.as_bytes(),
        &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), types: Default::default(), ..Default::default() },
    )
    .unwrap();
    let plan = crate::plan::build(&crate::parse_spec(spec).unwrap(), &table).unwrap();
    let d = &plan.layers[0].data;
    // Local quadratics reproduce a parabola (Cleveland & Devlin 1988).
    for i in 0..d.len {
        let x = d.get(Channel::X).unwrap().num(i).unwrap();
        assert!((d.get(Channel::Y).unwrap().num(i).unwrap() - x * x).abs() < 1e-8);
    }
    // Out-of-range options are caught by the spec's shape check, at their path.
    let bad = crate::parse_spec(r#"{"layers":[{"draw":"line","x":"x","y":"y","stat":{"fit":"loess","degree":3}}]}"#).unwrap_err();
    assert_eq!(bad.0[0].at.path, "layers[0].stat.degree");
}

#[test]
fn rolling_window_per_group_in_x_order() {
    let csv = b"t,g,v\n3,a,30\n1,a,10\n2,a,20\n1,b,1\n2,b,3\n";
    let spec = r#"{"layers":[{"draw":"line","x":"t","y":"v","color":"g","stat":{"window":{"rows":2,"align":"trailing"}}}]}"#;
    let table =
        crate::data::read(csv, &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), types: Default::default(), ..Default::default() })
            .unwrap();
    let plan = crate::plan::build(&crate::parse_spec(spec).unwrap(), &table).unwrap();
    let d = &plan.layers[0].data;
    let y: Vec<f64> = (0..d.len).map(|i| d.get(Channel::Y).unwrap().num(i).unwrap()).collect();
    assert_eq!(y, vec![10.0, 15.0, 25.0, 1.0, 2.0]);
    let spec = r#"{"layers":[{"draw":"line","x":"t","y":"v","color":"g","stat":{"window":{"summary":"running_total"}}}]}"#;
    let plan = crate::plan::build(&crate::parse_spec(spec).unwrap(), &table).unwrap();
    let d = &plan.layers[0].data;
    let y: Vec<f64> = (0..d.len).map(|i| d.get(Channel::Y).unwrap().num(i).unwrap()).collect();
    assert_eq!(y, vec![10.0, 30.0, 60.0, 1.0, 4.0]);
}

#[test]
fn histograms_by_colour_share_edges_and_stack() {
    let mut csv = String::from("v,g\n");
    for i in 0..40 {
        csv.push_str(&format!("{},{}\n", i % 10, if i % 3 == 0 { "p" } else { "q" }));
    }
    let r = run(r#"{"layers":[{"draw":"bar","x":"v","color":"g","arrange":"stack","stat":{"bin":{"width":2,"boundary":0}}}]}"#, csv.as_bytes());
    let m = marks_of(&r);
    assert_eq!(m.len(), 10, "5 bins x 2 colours");
    let total: f64 = m.iter().map(|n| f(&datum(n)["count"])).sum();
    assert_eq!(total, 40.0);
    assert_eq!(datum(m[0])["x"], datum(m[5])["x"]);
}

#[test]
fn long_line_is_reduced_by_m4() {
    let n = 200_000;
    let mut csv = String::with_capacity(n * 16);
    csv.push_str("t,v\n");
    for i in 0..n {
        let v = crate::math::sin(i as f64 * 0.001) + if i == 123_457 { 5.0 } else { 0.0 };
        csv.push_str(&format!("{i},{v}\n"));
    }
    let r = run(r#"{"size":{"width":640},"layers":[{"draw":"line","x":"t","y":"v"}]}"#, csv.as_bytes());
    let m = marks_of(&r);
    let d = datum(m[0]);
    assert_eq!(f(&d["points"]), n as f64);
    let drawn = f(&d["drawn_points"]);
    assert!(drawn <= 4.0 * 640.0 && drawn > 640.0, "{drawn}");
    // The single spike survives: the smallest pixel y stands far above the next.
    let Node::Path { d: path, .. } = m[0] else { panic!() };
    let mut ys: Vec<f64> = path
        .iter()
        .filter_map(|s| match *s {
            crate::scene::Seg::Move(_, y) | crate::scene::Seg::Line(_, y) => Some(y),
            _ => None,
        })
        .collect();
    ys.sort_by(f64::total_cmp);
    assert!(ys[1] - ys[0] > 30.0, "spike at {} next {}", ys[0], ys[1]);
    assert!(r.svg.len() < 60_000, "{}", r.svg.len());
}

#[test]
fn crowded_scatter_becomes_tiles_with_a_warning() {
    let n = 60_000;
    let mut csv = String::from("x,y\n");
    for i in 0..n {
        let t = i as f64;
        csv.push_str(&format!("{},{}\n", crate::math::sin(t * 0.37) * 10.0, crate::math::cos(t * 0.11) * 5.0));
    }
    let r = run(r#"{"layers":[{"draw":"point","x":"x","y":"y"}]}"#, csv.as_bytes());
    assert!(r.warnings.iter().any(|w| w.code == "stat.scatter_binned"));
    let m = marks_of(&r);
    assert!(m.iter().all(|n| matches!(n, Node::Rect { .. })));
    let total: f64 = m.iter().map(|n| f(&datum(n)["count"])).sum();
    assert_eq!(total, n as f64);
    assert!(r.svg.contains("Tiles shaded by number of points"), "a note explains the shading");
    // Forbidden: every point is drawn.
    let r = run(r#"{"layers":[{"draw":"point","x":"x","y":"y","style":{"every_point":true}}]}"#, csv.as_bytes());
    assert_eq!(r.scene.marks().len(), n);
    assert!(r.warnings.is_empty());
}

#[test]
fn too_many_marks_is_an_error_that_suggests_a_statistic() {
    let n = 210_000;
    let mut csv = String::from("x,y\n");
    for i in 0..n {
        csv.push_str(&format!("{i},{}\n", i % 7));
    }
    let e = render(
        r#"{"layers":[{"draw":"point","x":"x","y":"y","style":{"every_point":true}}]}"#,
        Some(DataBytes { bytes: csv.as_bytes(), name: "d.csv" }),
        &RenderOptions::default(),
    )
    .unwrap_err();
    assert_eq!(e.0[0].code, "plan.too_many_marks");
    assert!(e.0[0].hint.as_deref().unwrap().contains("bin"));
}

#[test]
fn unknown_options_name_their_path() {
    let csv = b"x,y\n1,2\n2,3\n";
    let e = render(
        r#"{"layers":[{"draw":"bar","x":"x","stat":{"bin":{"rule":"fancy"}}}]}"#,
        Some(DataBytes { bytes: csv, name: "d.csv" }),
        &RenderOptions::default(),
    )
    .unwrap_err();
    assert_eq!(e.0[0].at.path, "layers[0].stat.bin.rule");
    assert!(format!("{} {}", e.0[0].message, e.0[0].hint.as_deref().unwrap_or("")).contains("sturges"));
    let e = render(
        r#"{"layers":[{"draw":"point","x":"x","y":"y","stat":{"summary":"mean","interval":"ci"}}]}"#,
        Some(DataBytes { bytes: csv, name: "d.csv" }),
        &RenderOptions::default(),
    )
    .unwrap_err();
    assert_eq!(e.0[0].at.path, "layers[0].stat.interval");
}

#[test]
fn geometries_draw() {
    let csv = b"x,y,y2,c,t\n1,2,4,p,one\n2,3,5,p,two\n3,1,6,q,three\n";
    for (geom, extra) in [
        ("band", r#","y_end":"y2""#),
        ("segment", r#","y_end":"y2""#),
        ("range", r#","y_end":"y2""#),
        ("area", ""),
        ("step", ""),
        ("label", r#","text":"t""#),
        ("cell", ""),
    ] {
        let spec = format!(r#"{{"layers":[{{"draw":"{geom}","x":"x","y":"y"{extra}}}]}}"#);
        let r = run(&spec, csv);
        if geom == "label" {
            assert!(r.svg.contains(">three<"), "{geom}");
        } else {
            assert!(!r.scene.marks().is_empty(), "{geom}");
        }
    }
}

#[test]
fn m4_streaming_and_sorting_paths_agree() {
    // The same series given in x order (one streaming pass) and in reverse
    // (collected, sorted, then reduced) draws the same path.
    let n = 20_000;
    let rows: Vec<String> = (0..n).map(|i| format!("{i},{}\n", crate::math::sin(i as f64 * 0.013) * (1.0 + (i % 17) as f64))).collect();
    let fwd = format!("t,v\n{}", rows.concat());
    let rev = format!("t,v\n{}", rows.iter().rev().cloned().collect::<String>());
    let spec = r#"{"size":{"width":500},"layers":[{"draw":"line","x":"t","y":"v"}]}"#;
    let (a, b) = (run(spec, fwd.as_bytes()), run(spec, rev.as_bytes()));
    let path = |r: &crate::Rendered| match r.scene.marks()[0] {
        Node::Path { d, .. } => d.clone(),
        _ => panic!(),
    };
    assert_eq!(path(&a), path(&b));
    assert!(f(&datum(a.scene.marks()[0])["drawn_points"]) < 4.0 * 500.0);
}

#[test]
fn wilson_interval_on_true_false_outcomes() {
    // 37 successes in 120: statsmodels proportion_confint(37, 120, method="wilson")
    // (statsmodels 0.15.0, summaries.json).
    let fx: Value = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/stats/summaries.json")).unwrap();
    let want = fx["wilson"].as_array().unwrap().iter().find(|c| c["k"] == 37).unwrap()["level95"].clone();
    let mut csv = String::from("arm,ok\n");
    for i in 0..120 {
        csv.push_str(&format!("a,{}\n", if i < 37 { "true" } else { "false" }));
    }
    let r = run(r#"{"layers":[{"draw":"range","x":"arm","y":"ok","stat":{"summary":"mean","interval":"wilson"}}]}"#, csv.as_bytes());
    let d = datum(marks_of(&r)[0]);
    assert!((f(&d["y"]) - f(&want[0])).abs() < 1e-12);
    assert!((f(&d["y_end"]) - f(&want[1])).abs() < 1e-12);
    assert!((f(&d["estimate"]) - 37.0 / 120.0).abs() < 1e-12);
}

#[test]
fn dates_without_a_unit_take_the_nearest_calendar_unit() {
    // Two years of daily dates: Sturges' width is 729 days / (log2 730 + 1)
    // = 69.4 days (Sturges 1926), nearer a quarter (91.3 days) than a month
    // (30.4 days) on a log scale.
    let mut csv = String::from("day\n");
    let start = crate::calendar::days_from_civil(2022, 1, 1);
    for d in 0..730 {
        let (y, m, dd) = crate::calendar::civil_from_days(start + d);
        csv.push_str(&format!("{y:04}-{m:02}-{dd:02}\n"));
    }
    let r = run(r#"{"layers":[{"draw":"bar","x":"day","stat":{"bin":{}}}]}"#, csv.as_bytes());
    let m = marks_of(&r);
    // ln(69.4/30.4) = 0.83 > ln(91.3/69.4) = 0.27: quarters, 8 of them.
    assert_eq!(m.len(), 8);
    assert!(datum(m[1])["x"].as_str().unwrap().starts_with("2022-04-01"));
    let total: f64 = m.iter().map(|n| f(&datum(n)["count"])).sum();
    assert_eq!(total, 730.0);
}

#[test]
fn statistics_group_by_panel_and_colour() {
    use crate::plan::{LayerData, Values};
    // A layer as the panel stage hands it over: x, a colour and a panel key.
    let xs = [1.0, 2.0, 2.5, 3.0, 1.0, 1.5, 3.0, 3.0];
    let colour = ["p", "p", "q", "q", "p", "p", "p", "q"];
    let panel = ["left", "left", "left", "left", "right", "right", "right", "right"];
    let mut data = LayerData { len: xs.len(), ..Default::default() };
    data.channels.insert(Channel::X, Values::Num(xs.iter().map(|x| Some(*x)).collect()));
    data.channels.insert(Channel::Color, Values::Text(colour.iter().map(|s| Some(s.to_string())).collect()));
    data.channels.insert(Channel::Panel, Values::Text(panel.iter().map(|s| Some(s.to_string())).collect()));
    let layer: crate::spec::Layer = crate::spec::from_json(r#"{"draw":"bar","x":"x","color":"c","stat":{"bin":{"count":2}}}"#).unwrap();
    let out = super::apply(0, &layer, data.clone(), None).unwrap().data;
    // Four groups (left/p, left/q, right/p, right/q) x two shared bins [1, 2), [2, 3].
    assert_eq!(out.len, 8);
    let counts: Vec<f64> = (0..out.len).map(|i| out.get(Channel::Count).unwrap().num(i).unwrap()).collect();
    assert_eq!(counts, vec![1.0, 1.0, 0.0, 2.0, 2.0, 1.0, 0.0, 1.0]);
    assert_eq!(out.get(Channel::Panel).unwrap().key(2).as_deref(), Some("left"));
    assert_eq!(out.get(Channel::Color).unwrap().key(2).as_deref(), Some("q"));
    // Counts split the same way, and also by x.
    let layer: crate::spec::Layer = crate::spec::from_json(r#"{"draw":"bar","x":"x","color":"c","stat":"count"}"#).unwrap();
    let out = super::apply(0, &layer, data, None).unwrap().data;
    let n: f64 = (0..out.len).map(|i| out.get(Channel::Y).unwrap().num(i).unwrap()).sum();
    assert_eq!(n, 8.0);
    // right/p/x=3 and right/q/x=3 are separate rows.
    assert_eq!(out.len, 8);
}

#[test]
fn statistics_draw_in_every_coordinate_system() {
    let stats = [
        r#"{"draw":"bar","x":"eruptions","stat":{"bin":{"rule":"scott"}}}"#,
        r#"{"draw":"area","x":"eruptions","stat":{"density":{}}}"#,
        r#"{"draw":"line","x":"eruptions","y":"waiting","stat":{"fit":"linear"}}"#,
        r#"{"draw":"band","x":"eruptions","y":"waiting","stat":{"fit":"linear","band":0.9}}"#,
        r#"{"draw":"line","x":"eruptions","y":"waiting","stat":{"fit":"loess","robust":2}}"#,
        r#"{"draw":"box","x":{"column":"waiting","as":"text"},"y":"eruptions","stat":"box"}"#,
        r#"{"draw":"line","x":"eruptions","y":"waiting","stat":{"window":{"rows":9}}}"#,
        r#"{"draw":"point","x":"eruptions","y":"waiting","arrange":"jitter"}"#,
    ];
    for coords in [r#""cartesian""#, r#"{"kind":"polar"}"#] {
        for s in stats {
            let spec = format!(r#"{{"coords":{coords},"layers":[{s}]}}"#);
            let r = run(&spec, FAITHFUL);
            assert!(!r.scene.marks().is_empty(), "{coords} {s}");
            assert!(!r.svg.contains("NaN"), "{coords} {s}");
        }
    }
}

#[test]
fn y_scale_covers_interval_ends() {
    // Error bars must stay inside the axis: the y scale is trained on the
    // interval's ends, not only on the summary.
    let csv = b"g,v\na,1\na,9\na,2\nb,4\nb,5\nb,15\n";
    let spec = r#"{"layers":[{"draw":"point","x":"g","y":"v","stat":{"summary":"mean","interval":"ci95"}}]}"#;
    let table = crate::data::read(csv, &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), ..Default::default() }).unwrap();
    let plan = crate::plan::build(&crate::parse_spec(spec).unwrap(), &table).unwrap();
    let d = &plan.layers[0].data;
    let high = (0..d.len).filter_map(|i| d.get(Channel::YHigh).unwrap().num(i)).fold(f64::MIN, f64::max);
    let low = (0..d.len).filter_map(|i| d.get(Channel::YLow).unwrap().num(i)).fold(f64::MAX, f64::min);
    let s = &plan.scales.y;
    let (u_hi, u_lo) = (s.unit_num(high).unwrap(), s.unit_num(low).unwrap());
    assert!(u_hi <= 1.0 + 1e-12 && u_lo >= -1e-12, "interval {low}..{high} maps to {u_lo}..{u_hi}");
}

#[test]
fn too_many_bins_is_refused_where_asked_not_truncated() {
    // A tiny width over a huge range, and a huge count: each a located error
    // before anything is allocated (truncating would drop data silently).
    let csv = b"x\n-1e12\n0\n5\n";
    let data = Some(DataBytes { bytes: csv, name: "d.csv" });
    let e = render(r#"{"layers":[{"draw":"area","x":"x","stat":{"bin":{"width":0.5}},"arrange":"stack"}]}"#, data, &RenderOptions::default()).unwrap_err();
    assert_eq!((e.0[0].code.as_str(), e.0[0].at.path.as_str()), ("stat.too_many_bins", "layers[0].stat.bin.width"));
    let e = render(r#"{"layers":[{"draw":"bar","x":"x","stat":{"bin":{"count":4000000000}}}]}"#, data, &RenderOptions::default()).unwrap_err();
    assert_eq!((e.0[0].code.as_str(), e.0[0].at.path.as_str()), ("stat.too_many_bins", "layers[0].stat.bin.count"));
    // Within the limit every value is counted: 11 bins of 1e11 from -1e12
    // hold all three rows.
    let r = render(r#"{"layers":[{"draw":"bar","x":"x","stat":{"bin":{"width":1e11,"boundary":0}}}]}"#, data, &RenderOptions::default()).unwrap();
    let total: f64 = r
        .scene
        .marks()
        .iter()
        .filter_map(|m| match m {
            Node::Rect { datum: Some(d), .. } => d.get("count").and_then(Value::as_f64),
            _ => None,
        })
        .sum();
    assert_eq!(total, 3.0);
}

#[test]
fn loess_band_is_drawn_and_matches_netlib() {
    // Issue 12 item 7: `"band": 0.95` on a LOESS fit was ignored. The chart's
    // band equals netlib loess's (scikit-misc 0.5.3, family gaussian, surface
    // direct, statistics exact; tests/reference/gen/loess_band_fixtures.py),
    // at the chart's own grid of 80 points from min x to max x.
    let fx: Value = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/stats/loess_band.json")).unwrap();
    let case = &fx["cases"][0];
    let xs: Vec<f64> = case["x"].as_array().unwrap().iter().map(f).collect();
    let ys: Vec<f64> = case["y"].as_array().unwrap().iter().map(f).collect();
    let mut csv = String::from("x,y\n");
    for (a, b) in xs.iter().zip(&ys) {
        csv.push_str(&format!("{a},{b}\n"));
    }
    let spec = r#"{"layers":[{"draw":"point","x":"x","y":"y"},{"draw":"line","x":"x","y":"y","stat":{"fit":"loess","span":0.75,"band":0.95}}]}"#;
    let r = run(spec, csv.as_bytes());
    let paths: Vec<&Node> = marks_of(&r).into_iter().filter(|n| matches!(n, Node::Path { .. })).collect();
    assert_eq!(paths.len(), 2, "band then line");
    assert!(matches!(paths[0], Node::Path { paint, .. } if paint.fill.as_deref() != Some("none")));
    let table = crate::data::read(
        csv.as_bytes(),
        &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), types: Default::default(), ..Default::default() },
    )
    .unwrap();
    let plan = crate::plan::build(&crate::parse_spec(spec).unwrap(), &table).unwrap();
    let d = &plan.layers[1].data;
    assert_eq!(d.len, 80);
    // The fixture's grid is 25 points over the same range: compare where
    // the grids meet (both start at min x and end at max x).
    let want_lo = case["bands"][0]["lower"].as_array().unwrap();
    let want_hi = case["bands"][0]["upper"].as_array().unwrap();
    for (i, j) in [(0, 0), (79, 24)] {
        let lo = d.get(Channel::YLow).unwrap().num(i).unwrap();
        let hi = d.get(Channel::YHigh).unwrap().num(i).unwrap();
        assert!((lo - f(&want_lo[j])).abs() < 1e-6, "lower at {i}: {lo} vs {}", want_lo[j]);
        assert!((hi - f(&want_hi[j])).abs() < 1e-6, "upper at {i}: {hi} vs {}", want_hi[j]);
    }
    // `"band": 0` asks for no band.
    let none = crate::plan::build(&crate::parse_spec(&spec.replace("0.95", "0")).unwrap(), &table).unwrap();
    assert!(none.layers[1].data.get(Channel::YLow).is_none());
}

fn plan_of(spec: &str, csv: &str) -> crate::plan::Plan {
    let table = crate::data::read(
        csv.as_bytes(),
        &crate::data::ReadOptions { format: Some(crate::spec::DataFormat::Csv), types: Default::default(), ..Default::default() },
    )
    .unwrap();
    crate::plan::build(&crate::parse_spec(spec).unwrap(), &table).unwrap_or_else(|e| panic!("{e:?}"))
}

fn close_rel(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * b.abs().max(1e-12)
}

#[test]
fn density_over_a_count_histogram_is_scaled_to_its_counts() {
    // Issue 12 item 11: a density over a count histogram drew flat along
    // the axis. It is now density x n x bin width, the expected count per
    // bin; checked against scipy.stats.gaussian_kde (Scott's bandwidth)
    // times n x width (tests/reference/gen/density_counts_fixtures.py).
    let fx: Value = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/stats/density_counts.json")).unwrap();
    let width = f(&fx["width"]);
    assert_eq!(width, 2.0);
    let single = &fx["single"];
    let mut csv = String::from("v\n");
    for v in single["values"].as_array().unwrap() {
        csv.push_str(&format!("{}\n", f(v)));
    }
    for (hist, dens) in [(0, 1), (1, 0)] {
        // The histogram may come before or after the density.
        let layers = [r#"{"draw":"bar","x":"v","stat":{"bin":{"width":2,"boundary":0}}}"#, r#"{"draw":"line","x":"v","stat":{"density":{}}}"#];
        let spec = format!(r#"{{"layers":[{},{}]}}"#, layers[hist], layers[dens]);
        let plan = plan_of(&spec, &csv);
        let d = &plan.layers[dens].data;
        let (grid, want) = (single["grid"].as_array().unwrap(), single["counts"].as_array().unwrap());
        assert_eq!(d.len, grid.len());
        for i in 0..d.len {
            assert!(close_rel(d.get(Channel::X).unwrap().num(i).unwrap(), f(&grid[i]), 1e-9), "x[{i}]");
            let y = d.get(Channel::Y).unwrap().num(i).unwrap();
            assert!(close_rel(y, f(&want[i]), 1e-9), "y[{i}]: {y} vs {}", want[i]);
        }
        assert!(plan.warnings.iter().all(|w| w.code != "stat.density_on_counts"));
    }
    // Groups by colour: each group's density times its own n.
    let grouped = &fx["grouped"];
    let mut csv = String::from("v,phase\n");
    for (k, vs) in grouped["groups"].as_object().unwrap() {
        for v in vs.as_array().unwrap() {
            csv.push_str(&format!("{},{k}\n", f(v)));
        }
    }
    let spec = r#"{"layers":[{"draw":"bar","x":"v","color":"phase","stat":{"bin":{"width":2,"boundary":0}}},{"draw":"line","x":"v","color":"phase","stat":{"density":{}}}]}"#;
    let plan = plan_of(spec, &csv);
    let d = &plan.layers[1].data;
    let grid = grouped["grid"].as_array().unwrap();
    for i in 0..d.len {
        let k = d.get(Channel::Color).unwrap().key(i).unwrap();
        let want = &grouped["counts"][k.as_str()][i % grid.len()];
        assert!(close_rel(d.get(Channel::X).unwrap().num(i).unwrap(), f(&grid[i % grid.len()]), 1e-9));
        assert!(close_rel(d.get(Channel::Y).unwrap().num(i).unwrap(), f(want), 1e-9), "{k} y[{i}]");
    }
    // A density histogram (`"density": true`) shares the density's axis:
    // nothing is scaled.
    let spec = r#"{"layers":[{"draw":"bar","x":"v","stat":{"bin":{"width":2,"density":true}}},{"draw":"line","x":"v","stat":{"density":{}}}]}"#;
    let plan = plan_of(spec, "v\n1\n2\n2\n3\n5\n");
    let ys: Vec<f64> = (0..plan.layers[1].data.len).map(|i| plan.layers[1].data.get(Channel::Y).unwrap().num(i).unwrap()).collect();
    assert!(ys.iter().cloned().fold(0.0, f64::max) < 1.0);
}

#[test]
fn density_over_uneven_or_weighted_bins_warns_instead() {
    // Bins by calendar month differ in width, and a weighted histogram sums
    // y rather than counting: no single factor puts a density on that axis,
    // so the chart warns and suggests a density histogram.
    let spec = r#"{"layers":[{"draw":"bar","x":"v","y":"w","stat":{"bin":{"width":2}}},{"draw":"line","x":"v","stat":{"density":{}}}]}"#;
    let plan = plan_of(spec, "v,w\n1,3\n2,1\n2,2\n3,4\n5,1\n");
    let w = plan.warnings.iter().find(|w| w.code == "stat.density_on_counts").expect("a warning");
    assert_eq!(w.at.path, "layers[1].stat.density");
    assert!(w.hint.as_deref().unwrap_or("").contains("\"density\": true"));
}
