//! The automatic text alternative (the SVG's `<desc>`): what is plotted
//! against what, the ranges, the extremes and, for a continuous x, the trend.
//! Written by the plan (into `Plan.chart.description` when the spec gives
//! none), from the plan's own facts.

use super::{ColorScale, Plan, Values};
use crate::channel::Channel;
use crate::format::{self, Locale};

/// A number as the description writes it: years (see [`super::is_year_column`]) without grouping.
fn num_text(x: f64, year: bool, loc: &Locale) -> String {
    if year {
        format::number(x, super::YEAR_PATTERN, loc)
    } else {
        format::value_label_in(x, loc)
    }
}

fn value_text(v: &Values, i: usize, year: bool, loc: &Locale) -> String {
    match v {
        Values::Num(x) => x.get(i).map(|x| num_text(x, year, loc)).unwrap_or_default(),
        Values::Time(x) => x.get(i).map(|ms| format::date(ms, "yyyy-MM-dd", loc)).unwrap_or_default(),
        Values::Text(x) => x[i].clone().unwrap_or_default(),
    }
}

/// Least-squares slope of y on x.
fn slope(pts: &[(f64, f64)]) -> Option<f64> {
    let n = pts.len() as f64;
    if pts.len() < 3 {
        return None;
    }
    // Plain loops (sums from -0.0, as `Iterator::sum` of f64 starts).
    let (mut sx, mut sy) = (-0.0f64, -0.0f64);
    for p in pts {
        sx += p.0;
        sy += p.1;
    }
    let (mx, my) = (sx / n, sy / n);
    let (mut sxx, mut sxy) = (-0.0f64, -0.0f64);
    for p in pts {
        sxx += (p.0 - mx) * (p.0 - mx);
        sxy += (p.0 - mx) * (p.1 - my);
    }
    (sxx > 0.0).then(|| sxy / sxx)
}

/// The trend in words: the fitted line's change across the x range,
/// against the spread of y (more than a fifth of it counts, common practice).
/// Rows read for the trend word of a layer (see [`describe`]).
const TREND_SAMPLE: usize = 100_000;

pub fn trend_word(pts: &[(f64, f64)]) -> Option<&'static str> {
    let b = slope(pts)?;
    let (mut xlo, mut xhi, mut ylo, mut yhi) = (f64::INFINITY, f64::NEG_INFINITY, f64::INFINITY, f64::NEG_INFINITY);
    for p in pts {
        (xlo, xhi, ylo, yhi) = (xlo.min(p.0), xhi.max(p.0), ylo.min(p.1), yhi.max(p.1));
    }
    if yhi <= ylo {
        return Some("stays level");
    }
    let change = b * (xhi - xlo) / (yhi - ylo);
    Some(if change > 0.2 {
        "rises"
    } else if change < -0.2 {
        "falls"
    } else {
        "shows no clear trend"
    })
}

/// One pass over a layer's y (and numeric x): the lowest and highest y with
/// the first row of each, and the x span of rows whose y is present.
struct Extremes {
    lo: f64,
    lo_row: usize,
    hi: f64,
    hi_row: usize,
    x_span: (f64, f64),
}

fn extremes(ys: &[f64], xs: Option<&[f64]>) -> Option<Extremes> {
    let mut e = Extremes { lo: f64::INFINITY, lo_row: usize::MAX, hi: f64::NEG_INFINITY, hi_row: usize::MAX, x_span: (f64::INFINITY, f64::NEG_INFINITY) };
    let mut seen = |i: usize, y: f64| {
        // Missing values are NaN or infinite; plain comparisons keep this
        // loop free of the NaN rules of f64::min.
        if !y.is_finite() {
            return false;
        }
        if y > e.hi || e.hi_row == usize::MAX {
            (e.hi, e.hi_row) = (y, i);
        }
        if y < e.lo || e.lo_row == usize::MAX {
            (e.lo, e.lo_row) = (y, i);
        }
        true
    };
    let mut span = (f64::INFINITY, f64::NEG_INFINITY);
    match xs {
        Some(xs) => {
            for (i, (&y, &x)) in ys.iter().zip(xs).enumerate() {
                if seen(i, y) && x.is_finite() {
                    if x < span.0 {
                        span.0 = x;
                    }
                    if x > span.1 {
                        span.1 = x;
                    }
                }
            }
        }
        None => {
            for (i, &y) in ys.iter().enumerate() {
                seen(i, y);
            }
        }
    }
    e.x_span = span;
    (e.hi_row != usize::MAX).then_some(e)
}

pub fn describe(plan: &Plan) -> String {
    let s = &plan.scales;
    let loc = s.locale;
    let mut parts = Vec::new();
    let mut kinds: Vec<&str> = Vec::with_capacity(plan.layers.len());
    for l in &plan.layers {
        kinds.push(l.geometry.word());
    }
    kinds.dedup();
    let mut head = format!("{} chart", crate::join(&kinds, " and "));
    if !s.x_title.is_empty() && !s.y_title.is_empty() {
        head.push_str(&format!(" of {} against {}", s.y_title, s.x_title));
    }
    if let Some(ColorScale::Categories(c)) = &s.color {
        let names: &[String] = &c[..c.len().min(6)];
        let more = if c.len() > 6 { format!(" and {} more", c.len() - 6) } else { String::new() };
        let by = if s.color_title.is_empty() { String::new() } else { format!(" by {}", s.color_title) };
        head.push_str(&format!(", in {} groups{by} ({}{more})", c.len(), crate::join(names, ", ")));
    }
    parts.push(head);
    for l in &plan.layers {
        let (Some(Values::Num(ys)), xv) = (l.data.get(Channel::Y), l.data.get(Channel::X)) else { continue };
        let xs = match xv {
            Some(Values::Num(x) | Values::Time(x)) => Some(x.raw()),
            _ => None,
        };
        let Some(e) = extremes(ys.raw(), xs) else { continue };
        let (lo, il, hi, ih) = (e.lo, e.lo_row, e.hi, e.hi_row);
        let x_year = xv.is_some_and(|x| l.data.names.get(&Channel::X).is_some_and(|n| super::is_year_column(n, x)));
        let y_year = l.data.get(Channel::Y).is_some_and(|y| l.data.names.get(&Channel::Y).is_some_and(|n| super::is_year_column(n, y)));
        let at = |i: usize| xv.map(|x| format!(" at {}", value_text(x, i, x_year, loc))).unwrap_or_default();
        let name = l.data.names.get(&Channel::Y).cloned().unwrap_or_else(|| "y".into());
        parts.push(format!("{name} ranges from {}{} to {}{}", num_text(lo, y_year, loc), at(il), num_text(hi, y_year, loc), at(ih)));
        if let Some(x @ (Values::Num(_) | Values::Time(_))) = xv {
            // The trend word is a coarse reading of the least-squares slope:
            // past 100,000 rows an evenly spaced, deterministic sample of
            // rows gives the same word without copying millions of points.
            let stride = l.data.len.div_ceil(TREND_SAMPLE).max(1);
            let mut pts: Vec<(f64, f64)> = Vec::with_capacity(l.data.len / stride + 1);
            for i in (0..l.data.len).step_by(stride) {
                if let (Some(a), Some(b)) = (x.num(i), ys.get(i)) {
                    pts.push((a, b));
                }
            }
            if let Some(w) = trend_word(&pts) {
                // The span is read from every row, not from the sample.
                let (first, last) = e.x_span;
                let span = match x {
                    Values::Time(_) => format!("{} to {}", format::date(first, "yyyy-MM-dd", loc), format::date(last, "yyyy-MM-dd", loc)),
                    _ => format!("{} to {}", num_text(first, x_year, loc), num_text(last, x_year, loc)),
                };
                let xname = l.data.names.get(&Channel::X).cloned().unwrap_or_else(|| "x".into());
                parts.push(format!("Over {xname} from {span} it {w}"));
            }
        }
    }
    if let Some(t) = &plan.chart.subtitle {
        parts.push(t.clone());
    }
    // Layers over the same columns (a line and its labels) would repeat
    // the same sentences: each is said once.
    let mut said = Vec::with_capacity(parts.len());
    for p in parts {
        if !said.contains(&p) {
            said.push(p);
        }
    }
    let mut out = crate::join(&said, ". ");
    out.push('.');
    crate::text::case::capitalise_first(&out)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn trends() {
        let up: Vec<(f64, f64)> = (0..10).map(|i| (i as f64, 2.0 * i as f64 + if i % 2 == 0 { 1.0 } else { -1.0 })).collect();
        assert_eq!(trend_word(&up), Some("rises"));
        let down: Vec<(f64, f64)> = up.iter().map(|p| (p.0, -p.1)).collect();
        assert_eq!(trend_word(&down), Some("falls"));
        // A symmetric hump has no linear trend.
        let hump: Vec<(f64, f64)> = (0..11).map(|i| (i as f64, -((i as f64 - 5.0).powi(2)))).collect();
        assert_eq!(trend_word(&hump), Some("shows no clear trend"));
        assert_eq!(trend_word(&up[..2]), None);
    }
}
