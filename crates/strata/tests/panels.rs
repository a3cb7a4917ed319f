//! Panel grids (`panels.rows` / `panels.cols`) and independent panel scales
//! (`panels.independent`), checked on the scene: where each panel goes, what
//! names it, which axes it draws, what its statistics count, and the
//! domain of its scales. The expected numbers are worked out by hand from
//! the small tables written here.

use strata::scene::{Node, Scene};
use strata::{render, DataBytes, RenderOptions};

fn scene(spec: &str, csv: &[u8]) -> strata::Rendered {
    render(spec, Some(DataBytes { bytes: csv, name: "d.csv" }), &RenderOptions::default()).unwrap_or_else(|e| panic!("{e}"))
}

/// A panel as drawn: its group's label, its frame (from the grid lines),
/// its strip texts (words, angle, x, y), its axis sides, its marks.
#[derive(Debug)]
struct Facet<'a> {
    label: String,
    frame: (f64, f64, f64, f64), // left, top, right, bottom
    strips: Vec<(String, f64, f64, f64)>,
    /// Axis sides drawn (`strata-axis-left`, ...), each with its tick labels.
    axes: Vec<(String, Vec<String>)>,
    node: &'a Node,
}

fn facets(s: &Scene) -> Vec<Facet<'_>> {
    s.children
        .iter()
        .filter_map(|n| match n {
            Node::Group { class, label, children, .. } if class == "strata-facet" => {
                let (mut l, mut t, mut r, mut b) = (f64::MAX, f64::MAX, f64::MIN, f64::MIN);
                let mut strips = Vec::new();
                let mut axes = Vec::new();
                for c in children {
                    match c {
                        Node::Text { text, angle, x, y, class, .. } if class == "strata-panel-title" => strips.push((text.clone(), *angle, *x, *y)),
                        Node::Group { class, children, .. } if class == "strata-grid" => {
                            for g in children {
                                if let Node::Line { x1, y1, x2, y2, .. } = g {
                                    l = l.min(x1.min(*x2));
                                    r = r.max(x1.max(*x2));
                                    t = t.min(y1.min(*y2));
                                    b = b.max(y1.max(*y2));
                                }
                            }
                        }
                        Node::Group { class, children, .. } if class.starts_with("strata-axis ") => {
                            let ticks = children
                                .iter()
                                .filter_map(|k| match k {
                                    Node::Text { text, class, .. } if class == "strata-tick" => Some(text.clone()),
                                    _ => None,
                                })
                                .collect();
                            axes.push((class.trim_start_matches("strata-axis ").to_string(), ticks));
                        }
                        _ => {}
                    }
                }
                Some(Facet { label: label.clone().unwrap_or_default(), frame: (l, t, r, b), strips, axes, node: n })
            }
            _ => None,
        })
        .collect()
}

impl Facet<'_> {
    fn has(&self, side: &str) -> bool {
        self.axes.iter().any(|(a, _)| a == side)
    }
    /// Tick labels on one side, as numbers.
    fn ticks(&self, side: &str) -> Vec<f64> {
        self.axes.iter().filter(|(a, _)| a == side).flat_map(|(_, t)| t.iter().filter_map(|t| t.replace(',', "").parse().ok())).collect()
    }
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() < 1e-6
}

/// Points of a facet: (cx, cy, datum).
fn points<'a>(f: &Facet<'a>) -> Vec<(f64, f64, &'a strata::scene::Datum)> {
    f.node
        .marks()
        .into_iter()
        .filter_map(|m| match m {
            Node::Circle { cx, cy, datum: Some(d), .. } => Some((*cx, *cy, d)),
            _ => None,
        })
        .collect()
}

// Two rows (`side`) by three columns (`zone`); the combination
// (south, east) has no rows, so its panel is empty.
const GRID_CSV: &[u8] = b"side,zone,a,b\n\
north,west,1,10\nnorth,west,2,20\nnorth,mid,3,30\nnorth,east,4,40\n\
south,west,5,50\nsouth,mid,6,60\nsouth,mid,7,70\n";

#[test]
fn rows_by_cols_grid_places_and_names_every_panel() {
    let spec = r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"panels":{"rows":"side","cols":"zone"},"size":{"width":720,"height":480}}"#;
    let r = scene(spec, GRID_CSV);
    let f = facets(&r.scene);
    // 2 x 3 panels, row by row, each named by its row and column values.
    let labels: Vec<&str> = f.iter().map(|f| f.label.as_str()).collect();
    assert_eq!(
        labels,
        vec![
            "panel side: north, zone: west",
            "panel side: north, zone: mid",
            "panel side: north, zone: east",
            "panel side: south, zone: west",
            "panel side: south, zone: mid",
            "panel side: south, zone: east",
        ]
    );
    let at = |row: usize, col: usize| &f[row * 3 + col];
    // Columns line up and run left to right, rows line up and run top to
    // bottom; every frame has the same size.
    for row in 0..2 {
        for col in 0..3 {
            let p = at(row, col).frame;
            assert!(close(p.0, at(0, col).frame.0) && close(p.2, at(0, col).frame.2), "column {col} not aligned: {f:#?}");
            assert!(close(p.1, at(row, 0).frame.1) && close(p.3, at(row, 0).frame.3), "row {row} not aligned");
            assert!(close(p.2 - p.0, at(0, 0).frame.2 - at(0, 0).frame.0) && close(p.3 - p.1, at(0, 0).frame.3 - at(0, 0).frame.1));
            if col > 0 {
                assert!(p.0 > at(row, col - 1).frame.2, "column {col} should be right of column {}", col - 1);
            }
            if row > 0 {
                assert!(p.1 > at(row - 1, col).frame.3);
            }
        }
    }
    // No turned text: column values read across above the top row, row
    // values across at the left of each row (left of the axis labels).
    assert!(f.iter().all(|p| p.strips.iter().all(|s| s.1 == 0.0)), "{f:?}");
    let cols = ["west", "mid", "east"];
    let rows = ["north", "south"];
    for col in 0..3 {
        let s = &at(0, col).strips;
        let heads: Vec<_> = s.iter().filter(|s| cols.contains(&s.0.as_str())).collect();
        assert_eq!(heads.len(), 1, "{s:?}");
        assert_eq!(heads[0].0, cols[col]);
        assert!(heads[0].3 < at(0, col).frame.1, "the column name is above the panel");
        assert!(close(heads[0].2, at(0, col).frame.0), "the column name starts over its column");
        assert!(at(1, col).strips.iter().all(|s| !cols.contains(&s.0.as_str())), "no column name in the second row");
    }
    for row in 0..2 {
        let side: Vec<_> = at(row, 0).strips.iter().filter(|s| rows.contains(&s.0.as_str())).collect();
        assert_eq!(side.len(), 1, "{:?}", at(row, 0).strips);
        assert_eq!(side[0].0, rows[row]);
        // Its right end clears the widest tick label (12 px, right-aligned 6 px left of the frame).
        let labels: Vec<&String> = at(row, 0).axes.iter().filter(|(a, _)| a == "strata-axis-left").flat_map(|(_, t)| t.iter()).collect();
        assert!(!labels.is_empty());
        let widest = labels.iter().map(|l| strata::text::width(l, 12.0, false)).fold(0.0, f64::max);
        let name_end = side[0].2 + strata::text::width(&side[0].0, 12.0, true);
        assert!(name_end <= at(row, 0).frame.0 - 6.0 - widest, "the row name ({name_end}) is left of its row's axis labels");
        assert!(side[0].3 > at(row, 0).frame.1 && side[0].3 < at(row, 0).frame.3, "the row name is beside its row");
        assert!(at(row, 1).strips.iter().chain(&at(row, 2).strips).all(|s| !rows.contains(&s.0.as_str())));
    }
    // Shared axes: x under the bottom row only, y left of the left column only.
    for (i, p) in f.iter().enumerate() {
        let (row, col) = (i / 3, i % 3);
        assert_eq!(p.has("strata-axis-bottom"), row == 1, "{}: {:?}", p.label, p.axes);
        assert_eq!(p.has("strata-axis-left"), col == 0, "{}: {:?}", p.label, p.axes);
    }
    // Each point is drawn inside its own panel, and says which cell it is in.
    let mut seen = 0;
    for p in &f {
        for (cx, cy, d) in points(p) {
            seen += 1;
            let (l, t, r, b) = p.frame;
            assert!(cx >= l - 1e-6 && cx <= r + 1e-6 && cy >= t - 1e-6 && cy <= b + 1e-6, "{}: point {cx},{cy} outside {:?}", p.label, p.frame);
            let want = format!("panel side: {}, zone: {}", d["panel_row"].as_str().unwrap(), d["panel_col"].as_str().unwrap());
            assert_eq!(p.label, want);
        }
    }
    assert_eq!(seen, 7);
    // The combination with no rows is still a panel, empty, in its place.
    let empty = at(1, 2);
    assert_eq!(points(empty).len(), 0);
    assert!(empty.frame.2 > empty.frame.0 && empty.frame.3 > empty.frame.1, "the empty panel has a frame: {:?}", empty.frame);
    // One title per axis for the whole grid.
    let titles: Vec<&str> = r
        .scene
        .children
        .iter()
        .filter_map(|n| match n {
            Node::Group { class, children, .. } if class == "strata-axis-titles" => Some(children),
            _ => None,
        })
        .flatten()
        .filter_map(|n| match n {
            Node::Text { text, .. } => Some(text.as_str()),
            _ => None,
        })
        .collect();
    assert_eq!(titles, vec!["a", "b"]);
    assert!(r.warnings.is_empty(), "{:?}", r.warnings);
}

#[test]
fn rows_alone_or_cols_alone_make_one_column_or_one_row() {
    let rows = scene(r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"panels":{"rows":"side"}}"#, GRID_CSV);
    let f = facets(&rows.scene);
    assert_eq!(f.len(), 2);
    assert!(close(f[0].frame.0, f[1].frame.0) && f[1].frame.1 > f[0].frame.3);
    assert_eq!(f[0].label, "panel side: north");
    // Only the bottom panel has the x axis; both have the y axis.
    assert_eq!(f.iter().map(|p| p.has("strata-axis-bottom")).collect::<Vec<_>>(), vec![false, true]);
    assert!(f.iter().all(|p| p.has("strata-axis-left")));

    let cols = scene(r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"panels":{"cols":"zone"}}"#, GRID_CSV);
    let f = facets(&cols.scene);
    assert_eq!(f.len(), 3);
    assert!(close(f[0].frame.1, f[2].frame.1) && f[1].frame.0 > f[0].frame.2 && f[2].frame.0 > f[1].frame.2);
    assert_eq!(f.iter().map(|p| p.has("strata-axis-left")).collect::<Vec<_>>(), vec![true, false, false]);
    assert!(f.iter().all(|p| p.has("strata-axis-bottom")));
    assert!(f.iter().all(|p| p.strips.iter().all(|s| s.1 == 0.0)), "no row strips without rows");
}

#[test]
fn statistics_count_and_stack_within_each_cell() {
    // Counted by hand from GRID_CSV: north/west 2, north/mid 1, north/east 1,
    // south/west 1, south/mid 2, south/east none.
    let spec = r#"{"layers":[{"draw":"bar","x":"side","stat":"count"}],"panels":{"rows":"side","cols":"zone"}}"#;
    let r = scene(spec, GRID_CSV);
    let f = facets(&r.scene);
    let counts: Vec<Vec<f64>> = f
        .iter()
        .map(|p| {
            p.node
                .marks()
                .into_iter()
                .filter_map(|m| match m {
                    Node::Rect { datum: Some(d), .. } => d["y"].as_f64(),
                    _ => None,
                })
                .collect()
        })
        .collect();
    assert_eq!(counts, vec![vec![2.0], vec![1.0], vec![1.0], vec![1.0], vec![2.0], vec![]]);

    // Stacked bars start from zero in every cell: the stack never carries
    // over from one cell to the next.
    let csv = b"side,zone,k,part,v\nn,w,x,p,1\nn,w,x,q,2\nn,e,x,p,4\nn,e,x,q,8\n";
    let spec = r#"{"layers":[{"draw":"bar","x":"k","y":"v","color":"part","arrange":"stack"}],"panels":{"rows":"side","cols":"zone"}}"#;
    let r = scene(spec, csv);
    let f = facets(&r.scene);
    let tops: Vec<Vec<(f64, f64)>> = f
        .iter()
        .map(|p| {
            p.node
                .marks()
                .into_iter()
                .filter_map(|m| match m {
                    Node::Rect { datum: Some(d), .. } => Some((d["y"].as_f64()?, d["total"].as_f64()?)),
                    _ => None,
                })
                .collect()
        })
        .collect();
    // Each segment reports its own value and its stack's total. West: 1 and 2
    // of 3; east: 4 and 8 of 12 (not of 15, which a carried-over stack would give).
    assert_eq!(tops, vec![vec![(1.0, 3.0), (2.0, 3.0)], vec![(4.0, 12.0), (8.0, 12.0)]]);
}

/// Pixels per data unit along y in each panel, from the first two points.
fn y_per_unit(f: &[Facet]) -> Vec<f64> {
    f.iter()
        .map(|p| {
            let pts = points(p);
            let (a, b) = (pts[0], pts[1]);
            (a.1 - b.1).abs() / (a.2["y"].as_f64().unwrap() - b.2["y"].as_f64().unwrap()).abs()
        })
        .collect()
}

// One panel of small numbers, one of large ones.
const INDEPENDENT_CSV: &[u8] = b"g,h,x,y\nsmall,one,1,2\nsmall,one,2,4\nsmall,one,3,9\nlarge,one,10,200\nlarge,one,20,500\nlarge,one,30,900\n";

#[test]
fn independent_y_fits_each_panel_shared_y_does_not() {
    let shared = scene(r#"{"layers":[{"draw":"point","x":"x","y":"y"}],"panels":{"cols":"g"}}"#, INDEPENDENT_CSV);
    let independent = scene(r#"{"layers":[{"draw":"point","x":"x","y":"y"}],"panels":{"cols":"g","independent":"y"}}"#, INDEPENDENT_CSV);
    let (fs, ff) = (facets(&shared.scene), facets(&independent.scene));
    assert_eq!((fs.len(), ff.len()), (2, 2));
    // Shared: one y scale, so a unit of y is as tall in both panels.
    let s = y_per_unit(&fs);
    assert!((s[0] - s[1]).abs() < 1e-6, "{s:?}");
    // Free: each panel's y domain is its own; the small numbers get far
    // more room per unit than on the shared scale.
    let v = y_per_unit(&ff);
    assert!(v[0] > 10.0 * v[1], "{v:?}");
    assert!(v[0] > 10.0 * s[0], "{v:?} vs {s:?}");
    // Each independent panel draws its own y axis with its own ticks; the shared
    // grid draws one y axis, on the left panel.
    assert!(ff.iter().all(|p| p.has("strata-axis-left")));
    assert_eq!(fs.iter().map(|p| p.has("strata-axis-left")).collect::<Vec<_>>(), vec![true, false]);
    let top_tick = |p: &Facet| p.ticks("strata-axis-left").into_iter().fold(f64::MIN, f64::max);
    assert!(top_tick(&ff[0]) <= 10.0 && top_tick(&ff[1]) >= 900.0, "{:?} {:?}", ff[0].axes, ff[1].axes);
    // x stays shared: a unit of x is as wide in both panels.
    let x_per_unit = |p: &Facet| {
        let pts = points(p);
        (pts[1].0 - pts[0].0) / (pts[1].2["x"].as_f64().unwrap() - pts[0].2["x"].as_f64().unwrap())
    };
    assert!((x_per_unit(&ff[0]) - x_per_unit(&ff[1])).abs() < 1e-6);
}

#[test]
fn independent_x_draws_an_x_axis_in_every_panel() {
    let spec = r#"{"layers":[{"draw":"point","x":"x","y":"y"}],"panels":{"rows":"g","independent":"x"}}"#;
    let r = scene(spec, INDEPENDENT_CSV);
    let f = facets(&r.scene);
    assert!(f.iter().all(|p| p.has("strata-axis-bottom")), "{f:#?}");
    // The first row's x ticks stop near 3, the second's reach 30.
    let xs: Vec<f64> = f.iter().map(|p| p.ticks("strata-axis-bottom").into_iter().fold(f64::MIN, f64::max)).collect();
    assert!(xs.contains(&30.0) && xs.iter().any(|x| *x <= 5.0), "{xs:?}");
}

#[test]
fn independent_y_with_by_fits_each_wrapped_panel() {
    let shared = facets(&scene(r#"{"layers":[{"draw":"point","x":"x","y":"y"}],"panels":{"by":"g"}}"#, INDEPENDENT_CSV).scene).len();
    assert_eq!(shared, 2);
    let r = scene(r#"{"layers":[{"draw":"point","x":"x","y":"y"}],"panels":{"by":"g","independent":"both"}}"#, INDEPENDENT_CSV);
    let v = y_per_unit(&facets(&r.scene));
    assert!(v[0] > 10.0 * v[1], "{v:?}");
    assert!(r.warnings.is_empty(), "{:?}", r.warnings);
}

#[test]
fn an_empty_panel_keeps_the_shared_scale_when_independent() {
    // The (south, east) cell is empty: with independent y it has no rows to fit,
    // so its y axis shows the domain every panel shares (as the shared
    // grid's left panels do), while a panel with rows shows its own.
    let independent = r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"panels":{"rows":"side","cols":"zone","independent":"y"}}"#;
    let shared = r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"panels":{"rows":"side","cols":"zone"}}"#;
    let (rf, rs) = (scene(independent, GRID_CSV), scene(shared, GRID_CSV));
    let (f, s) = (facets(&rf.scene), facets(&rs.scene));
    let shared_ticks = s[3].ticks("strata-axis-left");
    assert!(shared_ticks.len() >= 2 && shared_ticks.iter().any(|t| *t >= 70.0), "{shared_ticks:?}");
    assert_eq!(f[5].ticks("strata-axis-left"), shared_ticks);
    // north/mid holds one value (30): its own axis is about 30, not 10..70.
    let own = f[1].ticks("strata-axis-left");
    assert!(own.iter().all(|t| *t > 20.0 && *t < 40.0), "{own:?}");
}

#[test]
fn panel_mistakes_are_located() {
    let two = render(
        r#"{"layers":[{"draw":"point","x":"a","y":"b"}],"panels":{"by":"side","rows":"zone"}}"#,
        Some(DataBytes { bytes: GRID_CSV, name: "d.csv" }),
        &RenderOptions::default(),
    )
    .unwrap_err();
    assert_eq!(two.0.iter().map(|d| (d.code.as_str(), d.at.path.as_str())).collect::<Vec<_>>(), vec![("spec.panels_two_layouts", "panels")]);
    // A column that is not there: said once, at its key, even with two layers.
    let gone = render(
        r#"{"layers":[{"draw":"point","x":"a","y":"b"},{"draw":"line","x":"a","y":"b"}],"panels":{"rows":"side","cols":"zones"}}"#,
        Some(DataBytes { bytes: GRID_CSV, name: "d.csv" }),
        &RenderOptions::default(),
    )
    .unwrap_err();
    assert_eq!(gone.0.iter().map(|d| d.at.path.as_str()).collect::<Vec<_>>(), vec!["panels.cols"]);
    assert!(gone.0[0].hint.as_deref().unwrap_or("").contains("did you mean `zone`"), "{:?}", gone.0[0].hint);
}

#[test]
fn too_many_panels_is_an_error_at_the_key() {
    // 21 x 20 = 420 cells, more than the limit of 400; 20 x 20 is fine.
    let mut csv = String::from("r,c,v\n");
    for i in 0..21 {
        for j in 0..20 {
            csv.push_str(&format!("r{i},c{j},{}\n", i + j));
        }
    }
    let spec = r#"{"layers":[{"draw":"point","x":"v","y":"v"}],"panels":{"rows":"r","cols":"c"},"size":{"width":2000,"height":2000}}"#;
    let e = render(spec, Some(DataBytes { bytes: csv.as_bytes(), name: "d.csv" }), &RenderOptions::default()).unwrap_err();
    assert_eq!((e.0[0].code.as_str(), e.0[0].at.path.as_str()), ("plan.too_many_panels", "panels"));
    let fewer = format!("{}\n", csv.lines().filter(|l| !l.starts_with("r20,")).collect::<Vec<_>>().join("\n"));
    let r = scene(spec, fewer.as_bytes());
    assert_eq!(facets(&r.scene).len(), 400);
    let e = render(
        r#"{"layers":[{"draw":"point","x":"v","y":"v"}],"panels":{"by":"v"}}"#,
        Some(DataBytes { bytes: csv.as_bytes(), name: "d.csv" }),
        &RenderOptions::default(),
    );
    assert!(e.is_ok(), "41 values of v are few enough");
}

/// Wrapped panels (`by`) with shared scales: axes along the grid's edges
/// only, one title per axis, a strip over each panel. Three panels in two
/// columns leave the second column's lowest panel in the first row, so
/// that panel carries the column's x axis.
#[test]
fn wrapped_panels_draw_shared_axes_on_the_edges() {
    let csv = b"k,x,y\nA,1,1\nA,2,4\nB,1,2\nB,3,3\nC,2,5\nC,3,1\n";
    let spec = r#"{"layers":[{"draw":"point","x":"x","y":"y"}],"panels":{"by":"k","columns":2}}"#;
    let r = scene(spec, csv);
    let f = facets(&r.scene);
    assert_eq!(f.iter().map(|f| f.label.as_str()).collect::<Vec<_>>(), ["panel A", "panel B", "panel C"]);
    // A (row 0, col 0): left axis only; B (row 0, col 1): bottom axis only;
    // C (row 1, col 0): both.
    assert_eq!((f[0].has("strata-axis-left"), f[0].has("strata-axis-bottom")), (true, false));
    assert_eq!((f[1].has("strata-axis-left"), f[1].has("strata-axis-bottom")), (false, true));
    assert_eq!((f[2].has("strata-axis-left"), f[2].has("strata-axis-bottom")), (true, true));
    // The columns line up and the rows too; each strip sits over its own panel.
    assert!(close(f[0].frame.0, f[2].frame.0) && close(f[0].frame.1, f[1].frame.1));
    for p in &f {
        assert_eq!(p.strips.len(), 1);
        let (words, _, x, y) = &p.strips[0];
        assert_eq!(format!("panel {words}"), p.label);
        assert!(close(*x, p.frame.0) && *y < p.frame.1, "{words} strip at {x},{y}, frame {:?}", p.frame);
    }
    // One title per axis for the whole grid.
    let titles = r.svg.matches("class=\"strata-axis-title\"").count();
    assert_eq!(titles, 2, "{}", r.svg);
}
