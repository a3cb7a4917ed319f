//! Train scales over every layer: domains, kinds and titles.

use super::{PlannedLayer, Values};
use crate::error::{Diagnostic, Errors};
use crate::scale::{ticks, PositionScale};
use crate::spec::{ScaleKind, ScaleSpec, Spec};

#[derive(Debug, Clone, PartialEq)]
pub enum ColorScale {
    /// Each category gets a palette colour, in order of first appearance.
    Categories(Vec<String>),
    /// Numbers between lo and hi on a ramp.
    Ramp { lo: f64, hi: f64 },
}

#[derive(Debug, Clone)]
pub struct Scales {
    pub x: PositionScale,
    pub y: PositionScale,
    pub x_title: String,
    pub y_title: String,
    pub x_spec: ScaleSpec,
    pub y_spec: ScaleSpec,
    pub color: Option<ColorScale>,
    pub color_title: String,
}

pub fn train(spec: &Spec, layers: &[PlannedLayer]) -> Result<Scales, Errors> {
    let x_spec = spec.scales.get("x").cloned().unwrap_or_default();
    let y_spec = spec.scales.get("y").cloned().unwrap_or_default();
    let x = train_position(&["x", "x_end"], "x", &x_spec, layers)?;
    let y = train_position(&["y", "y_end", "y_base"], "y", &y_spec, layers)?;
    let title = |ch: &str, s: &ScaleSpec| {
        s.title.clone().unwrap_or_else(|| layers.iter().find_map(|l| l.data.names.get(ch).cloned()).unwrap_or_default())
    };
    let mut cats: Vec<String> = Vec::new();
    let (mut lo, mut hi, mut numeric) = (f64::INFINITY, f64::NEG_INFINITY, false);
    for l in layers {
        match l.data.get("color") {
            Some(Values::Text(v)) => {
                for s in v.iter().flatten() {
                    if !cats.contains(s) {
                        cats.push(s.clone());
                    }
                }
            }
            Some(Values::Num(v)) | Some(Values::Time(v)) => {
                numeric = true;
                for x in v.iter().flatten() {
                    lo = lo.min(*x);
                    hi = hi.max(*x);
                }
            }
            None => {}
        }
    }
    let color = if !cats.is_empty() {
        Some(ColorScale::Categories(cats))
    } else if numeric {
        Some(ColorScale::Ramp { lo, hi })
    } else {
        None
    };
    let color_spec = spec.scales.get("color").cloned().unwrap_or_default();
    Ok(Scales {
        x_title: title("x", &x_spec),
        y_title: title("y", &y_spec),
        color_title: title("color", &color_spec),
        x,
        y,
        x_spec,
        y_spec,
        color,
    })
}

fn train_position(channels: &[&str], axis: &str, s: &ScaleSpec, layers: &[PlannedLayer]) -> Result<PositionScale, Errors> {
    let mut cats: Vec<String> = Vec::new();
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    let (mut any_num, mut any_text, mut time) = (false, false, false);
    let mut extent = false;
    for l in layers {
        for ch in channels {
            match l.data.get(ch) {
                Some(Values::Text(v)) => {
                    any_text = true;
                    for s in v.iter().flatten() {
                        if !cats.contains(s) {
                            cats.push(s.clone());
                        }
                    }
                }
                Some(vals @ (Values::Num(_) | Values::Time(_))) => {
                    any_num = true;
                    time |= matches!(vals, Values::Time(_));
                    if *ch == "y_base" {
                        extent = true;
                    }
                    if let Values::Num(v) | Values::Time(v) = vals {
                        for x in v.iter().flatten() {
                            lo = lo.min(*x);
                            hi = hi.max(*x);
                        }
                    }
                }
                None => {}
            }
        }
    }
    let want_category = s.kind == Some(ScaleKind::Category) || (s.kind.is_none() && any_text);
    if want_category {
        if let Some(dom) = &s.domain {
            cats = dom.iter().map(|v| v.as_str().map(str::to_string).unwrap_or_else(|| v.to_string())).collect();
        }
        return Ok(PositionScale::Category { values: cats, padding: 0.1 });
    }
    if any_text && any_num {
        return Err(Diagnostic::error("spec.mixed_axis", format!("the {axis} axis mixes text and numbers across layers"))
            .at_path(format!("scales.{axis}"))
            .into());
    }
    if let Some(dom) = &s.domain {
        let nums: Vec<f64> = dom.iter().filter_map(|v| v.as_f64()).collect();
        if nums.len() != 2 {
            return Err(Diagnostic::error("spec.bad_domain", "a continuous domain needs two numbers, such as [0, 100]")
                .at_path(format!("scales.{axis}.domain"))
                .into());
        }
        return Ok(PositionScale::Linear { lo: nums[0], hi: nums[1], time });
    }
    if !lo.is_finite() {
        lo = 0.0;
        hi = 1.0;
    }
    if s.zero.unwrap_or(extent) {
        lo = lo.min(0.0);
        hi = hi.max(0.0);
    }
    if s.nice.unwrap_or(!time) && hi > lo {
        let t = ticks::nice_ticks(lo, hi, s.ticks.unwrap_or(6) as usize);
        if let (Some(a), Some(b)) = (t.first(), t.last()) {
            lo = *a;
            hi = *b;
        }
    }
    if s.reverse {
        std::mem::swap(&mut lo, &mut hi);
    }
    Ok(PositionScale::Linear { lo, hi, time })
}
