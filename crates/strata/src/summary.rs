//! The automatic text alternative: what is plotted against what, with ranges.

use crate::plan::{Plan, Values};
use crate::spec::Spec;

pub fn describe(spec: &Spec, plan: &Plan) -> String {
    let s = &plan.scales;
    let mut parts = Vec::new();
    let kinds: Vec<&str> = plan.layers.iter().map(|l| l.geometry.word()).collect();
    parts.push(format!(
        "{} chart{}",
        kinds.join(" and "),
        if s.x_title.is_empty() || s.y_title.is_empty() { String::new() } else { format!(" of {} against {}", s.y_title, s.x_title) }
    ));
    for l in &plan.layers {
        if let Some(Values::Num(ys)) = l.data.get("y") {
            let mut best: Option<(f64, usize)> = None;
            let mut worst: Option<(f64, usize)> = None;
            for (i, y) in ys.iter().enumerate() {
                if let Some(y) = y {
                    if best.is_none_or(|b| *y > b.0) {
                        best = Some((*y, i));
                    }
                    if worst.is_none_or(|w| *y < w.0) {
                        worst = Some((*y, i));
                    }
                }
            }
            if let (Some((hi, ih)), Some((lo, il))) = (best, worst) {
                let at = |i: usize| l.data.get("x").map(|x| format!(" at {}", json_text(&x.json(i)))).unwrap_or_default();
                parts.push(format!(
                    "{} ranges from {}{} to {}{}",
                    l.data.names.get("y").cloned().unwrap_or_else(|| "y".into()),
                    crate::format::value_label(lo),
                    at(il),
                    crate::format::value_label(hi),
                    at(ih)
                ));
            }
        }
    }
    if let Some(t) = &spec.subtitle {
        parts.push(t.clone());
    }
    let mut out = parts.join(". ");
    out.push('.');
    let mut c = out.chars();
    match c.next() {
        Some(f) => f.to_uppercase().collect::<String>() + c.as_str(),
        None => out,
    }
}

fn json_text(v: &serde_json::Value) -> String {
    match v {
        serde_json::Value::String(s) => s.clone(),
        serde_json::Value::Number(n) => n.as_f64().map(crate::format::value_label).unwrap_or_default(),
        other => other.to_string(),
    }
}
