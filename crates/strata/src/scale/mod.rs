//! Scales: map data values to the unit interval [0, 1] (position) or to
//! colours, and choose ticks.
//!
//! Used by the plan stage (training) and the scene stage (mapping).

pub mod ticks;

use crate::format;
use crate::plan::Values;

/// A trained position scale.
#[derive(Debug, Clone, PartialEq)]
pub enum PositionScale {
    /// Numbers (or times in ms) mapped linearly from `lo..hi`.
    Linear { lo: f64, hi: f64, time: bool },
    /// Discrete values, each a band of equal width.
    Category { values: Vec<String>, padding: f64 },
}

/// One tick: where it goes (unit position) and its label.
#[derive(Debug, Clone, PartialEq)]
pub struct Tick {
    pub unit: f64,
    pub value: f64,
    pub label: String,
}

impl PositionScale {
    /// Unit position of a number (continuous scales).
    pub fn unit_num(&self, v: f64) -> Option<f64> {
        match self {
            PositionScale::Linear { lo, hi, .. } => {
                if hi == lo {
                    Some(0.5)
                } else {
                    Some((v - lo) / (hi - lo))
                }
            }
            PositionScale::Category { .. } => None,
        }
    }

    /// Unit position of the centre of a category's band.
    pub fn unit_cat(&self, v: &str) -> Option<f64> {
        match self {
            PositionScale::Category { values, .. } => {
                let i = values.iter().position(|c| c == v)?;
                Some((i as f64 + 0.5) / values.len() as f64)
            }
            PositionScale::Linear { .. } => None,
        }
    }

    /// Unit position of row `i` of a column.
    pub fn unit(&self, values: &Values, i: usize) -> Option<f64> {
        match values {
            Values::Num(v) | Values::Time(v) => v[i].and_then(|x| self.unit_num(x)),
            Values::Text(v) => v[i].as_deref().and_then(|s| self.unit_cat(s)),
        }
    }

    /// Width of one band as a fraction of the axis (0 for continuous).
    pub fn band(&self) -> f64 {
        match self {
            PositionScale::Category { values, .. } => 1.0 / values.len().max(1) as f64,
            PositionScale::Linear { .. } => 0.0,
        }
    }

    pub fn is_discrete(&self) -> bool {
        matches!(self, PositionScale::Category { .. })
    }

    /// Ticks with labels; `wanted` is the rough count the layout can fit.
    pub fn ticks(&self, wanted: usize, pattern: Option<&str>) -> Vec<Tick> {
        match self {
            PositionScale::Linear { lo, hi, time } => {
                let step_ticks = ticks::nice_ticks(*lo, *hi, wanted);
                let step = if step_ticks.len() > 1 { step_ticks[1] - step_ticks[0] } else { 1.0 };
                step_ticks
                    .into_iter()
                    .filter(|t| *t >= lo - 1e-9 * (hi - lo).abs() && *t <= hi + 1e-9 * (hi - lo).abs())
                    .map(|t| Tick {
                        unit: self.unit_num(t).unwrap_or(0.0),
                        value: t,
                        label: if *time { format::date_label(t) } else { format::number_label(t, step, pattern) },
                    })
                    .collect()
            }
            PositionScale::Category { values, .. } => values
                .iter()
                .enumerate()
                .map(|(i, v)| Tick { unit: (i as f64 + 0.5) / values.len() as f64, value: i as f64, label: v.clone() })
                .collect(),
        }
    }
}
