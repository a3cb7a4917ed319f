//! Notes keep their text off the data (issue 12, item 10): a note's text
//! moves off lines, bars and points, and `pointer: true` draws a leader
//! line from the moved text to its point. Invented data written here.

use strata::scene::{Anchor, Node, Scene, Seg};
use strata::text;
use strata::{render, RenderOptions};

type Box4 = (f64, f64, f64, f64);

fn walk<'a>(n: &'a Node, f: &mut dyn FnMut(&'a Node, bool), in_notes: bool) {
    f(n, in_notes);
    if let Node::Group { children, class, .. } = n {
        let inside = in_notes || class == "strata-notes";
        children.iter().for_each(|c| walk(c, f, inside));
    }
}

/// Note texts (text, glyph box), leader lines, and the data's segments and boxes.
struct Drawn {
    notes: Vec<(String, Box4)>,
    leaders: Vec<(f64, f64, f64, f64)>,
    segs: Vec<((f64, f64), (f64, f64))>,
    boxes: Vec<Box4>,
}

fn drawn(s: &Scene) -> Drawn {
    let mut d = Drawn { notes: vec![], leaders: vec![], segs: vec![], boxes: vec![] };
    for c in &s.children {
        walk(
            c,
            &mut |n, in_notes| match n {
                Node::Text { x, y, text: t, size, anchor, class, .. } if class == "strata-note" => {
                    let w = text::width(t, *size, false);
                    let left = match anchor {
                        Anchor::Start => *x,
                        Anchor::Middle => x - w / 2.0,
                        Anchor::End => x - w,
                    };
                    d.notes.push((t.clone(), (left, y - size * text::CAP, left + w, y + size * 0.2)));
                }
                Node::Line { x1, y1, x2, y2, .. } if in_notes => d.leaders.push((*x1, *y1, *x2, *y2)),
                Node::Path { d: segs, datum: Some(_), .. } if !in_notes => {
                    let pts: Vec<(f64, f64)> = segs
                        .iter()
                        .filter_map(|s| match *s {
                            Seg::Move(x, y) | Seg::Line(x, y) => Some((x, y)),
                            _ => None,
                        })
                        .collect();
                    d.segs.extend(pts.windows(2).map(|w| (w[0], w[1])));
                }
                Node::Rect { x, y, width, height, datum: Some(_), .. } => d.boxes.push((*x, *y, x + width, y + height)),
                _ => {}
            },
            false,
        );
    }
    d
}

fn seg_hits(p: (f64, f64), q: (f64, f64), b: Box4) -> bool {
    (0..=400).any(|k| {
        let t = k as f64 / 400.0;
        let (x, y) = (p.0 + (q.0 - p.0) * t, p.1 + (q.1 - p.1) * t);
        x > b.0 && x < b.2 && y > b.1 && y < b.3
    })
}

fn overlap(a: Box4, b: Box4) -> bool {
    a.0 < b.2 && b.0 < a.2 && a.1 < b.3 && b.1 < a.3
}

const RISING: &str = r#"{ "data": { "rows": [ {"d": 1, "v": 10}, {"d": 2, "v": 20}, {"d": 3, "v": 30}, {"d": 4, "v": 40}, {"d": 5, "v": 50} ] },
    "layers": [ { "draw": "line", "x": "d", "y": "v" } ],
    "notes": [ { "x": 2, "y": 20, "text": "Gauge moved uphill" POINTER } ] }"#;

#[test]
fn a_note_moves_off_the_line() {
    // Beside and above its point, the text would lie across the rising line.
    let r = render(&RISING.replace("POINTER", ""), None, &RenderOptions::default()).unwrap();
    let d = drawn(&r.scene);
    assert_eq!(d.notes.len(), 1);
    assert_eq!(d.segs.len(), 4);
    for (p, q) in &d.segs {
        assert!(!seg_hits(*p, *q, d.notes[0].1), "{:?} covers the line {p:?}-{q:?}", d.notes[0]);
    }
    // Without `pointer`, no leader line.
    assert!(d.leaders.is_empty(), "{:?}", d.leaders);
}

#[test]
fn a_pointer_leads_from_the_moved_text_to_its_point() {
    let r = render(&RISING.replace("POINTER", r#", "pointer": true"#), None, &RenderOptions::default()).unwrap();
    let d = drawn(&r.scene);
    assert_eq!(d.leaders.len(), 1, "one leader line");
    let (x1, y1, x2, y2) = d.leaders[0];
    // The point: the dot the note draws at (2, 20), the second vertex of the line.
    let p = d.segs[1].0;
    let near = |x: f64, y: f64, b: Box4| x >= b.0 - 3.0 && x <= b.2 + 3.0 && y >= b.1 - 3.0 && y <= b.3 + 3.0;
    let to_point = ((x1 - p.0).hypot(y1 - p.1)).min((x2 - p.0).hypot(y2 - p.1));
    assert!(to_point < 6.0, "leader {:?} does not reach {p:?}", d.leaders[0]);
    assert!(near(x1, y1, d.notes[0].1) || near(x2, y2, d.notes[0].1), "leader {:?} does not reach the text {:?}", d.leaders[0], d.notes[0]);
}

#[test]
fn a_reference_line_label_moves_off_the_bars() {
    // The line's text goes at its right end, where the tallest bar stands.
    let spec = r#"{ "data": { "rows": [ {"k": "A", "v": 10}, {"k": "B", "v": 30}, {"k": "C", "v": 45} ] },
        "layers": [ { "draw": "bar", "x": "k", "y": "v" } ],
        "notes": [ { "y": 20, "text": "Target" } ] }"#;
    let r = render(spec, None, &RenderOptions::default()).unwrap();
    let d = drawn(&r.scene);
    assert_eq!(d.notes.len(), 1);
    for b in &d.boxes {
        assert!(!overlap(d.notes[0].1, *b), "{:?} covers a bar {b:?}", d.notes[0]);
    }
}
