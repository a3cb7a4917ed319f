//! Scales: map data values to the unit interval [0, 1] (position), to
//! colours, sizes and shapes, and choose ticks and their labels.
//!
//! Used by the plan stage (training, `plan/scales.rs`) and the scene stage
//! (mapping and guides).

pub mod ticks;

use crate::format::{self, Locale};
use crate::math;
use ticks::TimeUnit;

/// The most ticks any scale generates, however many the spec asks for.
pub const MAX_TICKS: usize = 200;

/// The bases a log scale accepts: below 1.01 the powers of the base crowd
/// into hundreds of thousands per decade; above a million one power spans
/// six decades and an axis shows a single tick.
pub const MIN_LOG_BASE: f64 = 1.01;
pub const MAX_LOG_BASE: f64 = 1e6;

/// Whether `base` is a log base Strata accepts.
pub fn log_base_ok(base: f64) -> bool {
    (MIN_LOG_BASE..=MAX_LOG_BASE).contains(&base)
}

/// How a continuous scale bends the data before mapping it linearly.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Transform {
    Linear,
    /// Logarithm in `base`; values <= 0 have no position.
    Log {
        base: f64,
    },
    /// Square root of the magnitude, keeping the sign.
    Sqrt,
    /// sign(x) log(1 + |x| / c): linear near zero, logarithmic far out
    /// (Webber, "A bi-symmetric log transformation for wide-range data",
    /// Meas. Sci. Technol. 24, 2013).
    Symlog {
        constant: f64,
    },
}

impl Transform {
    pub fn apply(&self, x: f64) -> Option<f64> {
        match *self {
            Transform::Linear => Some(x),
            Transform::Log { base } => (x > 0.0).then(|| math::ln(x) / math::ln(base)),
            Transform::Sqrt => Some(x.signum() * x.abs().sqrt()),
            Transform::Symlog { constant } => Some(x.signum() * math::ln(1.0 + x.abs() / constant)),
        }
    }
    pub fn invert(&self, t: f64) -> f64 {
        match *self {
            Transform::Linear => t,
            Transform::Log { base } => math::pow(base, t),
            Transform::Sqrt => t.signum() * t * t,
            Transform::Symlog { constant } => t.signum() * (math::exp(t.abs()) - 1.0) * constant,
        }
    }
    pub fn word(&self) -> &'static str {
        match self {
            Transform::Linear => "linear",
            Transform::Log { .. } => "log",
            Transform::Sqrt => "sqrt",
            Transform::Symlog { .. } => "symlog",
        }
    }
}

/// A trained position scale.
#[derive(Debug, Clone, PartialEq)]
pub enum PositionScale {
    /// Numbers (or times in ms when `time`) from `lo` to `hi` (`lo > hi`
    /// when reversed), bent by `transform`; `step` is the tick step fixed
    /// by [`PositionScale::nice`], so the axis labels the domain's ends.
    /// `marks`: tick values chosen in the spec (`ticks: [...]`), shown as they are.
    Continuous { lo: f64, hi: f64, transform: Transform, time: bool, step: Option<f64>, marks: Option<Marks> },
    /// Discrete values, each a band of equal width; `padding` is the share
    /// of a band left empty around a bar (bands) — points sit at band centres.
    /// `index` finds a value's band by hash (made by [`PositionScale::category`]),
    /// so placing n rows on k categories is O(n), not O(n k).
    /// `marks`: the categories the spec asks to label (`ticks: [...]`); the others keep their band, unlabelled.
    Category { values: Vec<String>, padding: f64, index: crate::index::Places, marks: Option<std::sync::Arc<[String]>> },
}

/// Tick values chosen in the spec, in data units (ms for time).
pub type Marks = std::sync::Arc<[f64]>;

/// One tick: where it goes (unit position) and its label.
#[derive(Debug, Clone, PartialEq)]
pub struct Tick {
    pub unit: f64,
    pub value: f64,
    pub label: String,
}

/// What the layout asks of a scale's ticks.
#[derive(Debug, Clone, Copy)]
pub struct TickOptions<'a> {
    /// Rough count that fits.
    pub wanted: usize,
    /// The spec's LDML pattern, if any.
    pub pattern: Option<&'a str>,
    pub locale: &'a Locale,
    /// Shorter labels: compact numbers, shorter dates, truncated categories.
    pub short: bool,
}

impl PositionScale {
    pub fn linear(lo: f64, hi: f64) -> Self {
        PositionScale::Continuous { lo, hi, transform: Transform::Linear, time: false, step: None, marks: None }
    }

    /// Unit position of a number (continuous scales).
    pub fn unit_num(&self, v: f64) -> Option<f64> {
        match self {
            PositionScale::Continuous { lo, hi, transform, .. } => {
                let (a, b, x) = (transform.apply(*lo)?, transform.apply(*hi)?, transform.apply(v)?);
                if a == b {
                    Some(0.5)
                } else {
                    Some((x - a) / (b - a))
                }
            }
            PositionScale::Category { .. } => None,
        }
    }

    /// A category scale over `values` (the first of any repeated value counts).
    pub fn category(values: Vec<String>, padding: f64) -> PositionScale {
        let index = crate::index::Places::of(&values);
        PositionScale::Category { values, padding, index, marks: None }
    }

    /// The scale with tick values chosen in the spec: numbers (ms for time)
    /// on a continuous scale, category names on a category scale.
    pub fn with_marks(mut self, numbers: Vec<f64>, names: Vec<String>) -> PositionScale {
        match &mut self {
            PositionScale::Continuous { marks, .. } => *marks = Some(numbers.into()),
            PositionScale::Category { marks, .. } => *marks = Some(names.into()),
        }
        self
    }

    /// Unit position of the centre of a category's band.
    pub fn unit_cat(&self, v: &str) -> Option<f64> {
        match self {
            PositionScale::Category { values, index, .. } => {
                let i = index.get(values, v)?;
                Some((i as f64 + 0.5) / values.len() as f64)
            }
            PositionScale::Continuous { .. } => None,
        }
    }

    /// Width of one band as a fraction of the axis (0 for continuous).
    pub fn band(&self) -> f64 {
        match self {
            PositionScale::Category { values, .. } => 1.0 / values.len().max(1) as f64,
            PositionScale::Continuous { .. } => 0.0,
        }
    }

    pub fn is_discrete(&self) -> bool {
        matches!(self, PositionScale::Category { .. })
    }

    pub fn is_time(&self) -> bool {
        matches!(self, PositionScale::Continuous { time: true, .. })
    }

    /// The domain in data units, low end first as given.
    pub fn domain(&self) -> Option<(f64, f64)> {
        match self {
            PositionScale::Continuous { lo, hi, .. } => Some((*lo, *hi)),
            PositionScale::Category { .. } => None,
        }
    }

    /// The domain widened to the ends of the labelling the axis will show
    /// with about `wanted` ticks: the Talbot-Lin-Hanrahan labelling that
    /// covers the data, for linear, sqrt and symlog scales; powers of the base for log scales;
    /// calendar boundaries for time. Reversed domains stay reversed.
    pub fn nice(&self, wanted: usize) -> PositionScale {
        let wanted = wanted.min(MAX_TICKS);
        let PositionScale::Continuous { lo, hi, transform, time, marks, .. } = self else { return self.clone() };
        let rev = lo > hi;
        let (a, b) = if rev { (*hi, *lo) } else { (*lo, *hi) };
        if !(b > a) {
            return self.clone();
        }
        let mut fixed = None;
        let (na, nb) = if *time {
            ticks::time_nice(a, b, wanted)
        } else {
            match transform {
                Transform::Log { base } => {
                    if a <= 0.0 {
                        return self.clone();
                    }
                    let lb = math::ln(*base);
                    (math::pow(*base, (math::ln(a) / lb + 1e-9).floor()), math::pow(*base, (math::ln(b) / lb - 1e-9).ceil()))
                }
                _ => {
                    // The best labelling that covers the data ("loose"); its
                    // ends become the domain and its step the axis's step.
                    let t = ticks::extended_axis(a, b, wanted, true);
                    if t.len() < 2 {
                        return self.clone();
                    }
                    fixed = Some(t[1] - t[0]);
                    (t[0], t[t.len() - 1])
                }
            }
        };
        let (lo, hi) = if rev { (nb, na) } else { (na, nb) };
        PositionScale::Continuous { lo, hi, transform: *transform, time: *time, step: fixed, marks: marks.clone() }
    }

    /// Ticks with English labels; `wanted` is the rough count the layout can fit.
    pub fn ticks(&self, wanted: usize, pattern: Option<&str>) -> Vec<Tick> {
        self.ticks_with(&TickOptions { wanted, pattern, locale: format::english(), short: false })
    }

    /// Tick values (no labels) and the step they were chosen with; never
    /// more than [`MAX_TICKS`] (every k-th when a method gives more).
    fn tick_values(&self, wanted: usize) -> (Vec<f64>, TickStep) {
        let (t, step) = self.tick_values_unbounded(wanted.min(MAX_TICKS));
        if t.len() <= MAX_TICKS {
            return (t, step);
        }
        let k = t.len().div_ceil(MAX_TICKS);
        (ticks::every_kth(t, k), TickStep::Varied)
    }

    fn tick_values_unbounded(&self, wanted: usize) -> (Vec<f64>, TickStep) {
        let PositionScale::Continuous { lo, hi, transform, time, step: fixed, marks } = self else { return (vec![], TickStep::None) };
        let (a, b) = if lo <= hi { (*lo, *hi) } else { (*hi, *lo) };
        if let Some(m) = marks {
            // Chosen ticks: those inside the domain, whatever the room (`wanted` is not asked).
            let tol = 1e-9 * (b - a).abs();
            let mut t = ticks::kept(m.to_vec(), &|v| v.is_finite() && v >= a - tol && v <= b + tol);
            crate::sort::f64s(&mut t);
            t.dedup();
            if *time {
                return (t, TickStep::Chosen);
            }
            let even = t.len() > 1 && t.windows(2).all(|w| ((w[1] - w[0]) - (t[1] - t[0])).abs() <= 1e-9 * (t[1] - t[0]).abs());
            let step = if even { TickStep::Even(t[1] - t[0]) } else { TickStep::Varied };
            return (t, step);
        }
        if *time {
            let (t, unit, n) = ticks::time_ticks(a, b, wanted);
            return (t, TickStep::Time(unit, n));
        }
        let inside = |v: f64| v >= a - 1e-9 * (b - a).abs() && v <= b + 1e-9 * (b - a).abs();
        match transform {
            Transform::Log { base } => (ticks::log_ticks(a, b, *base, wanted), TickStep::Varied),
            Transform::Symlog { constant } if b - a > 0.0 => {
                let span = transform.apply(b).unwrap_or(0.0) - transform.apply(a).unwrap_or(0.0);
                if span < 3.0 {
                    let t = ticks::kept(ticks::extended_axis(a, b, wanted, false), &inside);
                    let step = if t.len() > 1 { t[1] - t[0] } else { 1.0 };
                    return (t, TickStep::Even(step));
                }
                // Zero and signed powers of ten beyond the linear zone.
                let mut t = Vec::new();
                for e in -15..=15 {
                    let p = math::powi(10.0, e);
                    if p < *constant {
                        continue;
                    }
                    for v in [-p, p] {
                        if inside(v) {
                            t.push(v);
                        }
                    }
                }
                if inside(0.0) {
                    t.push(0.0);
                }
                crate::sort::f64s(&mut t);
                let k = t.len().div_ceil(wanted.max(2)).max(1);
                (ticks::every_kth(t, k), TickStep::Varied)
            }
            _ => {
                if let Some(s) = fixed.filter(|s| *s > 0.0) {
                    // The step nice() widened the domain with: its multiples,
                    // every k-th of them when fewer are wanted.
                    let n = ((b - a) / s).round() as usize;
                    let mut k = 1;
                    while (n / k) + 1 > wanted.max(2) + wanted.max(2) / 2 {
                        k += 1;
                    }
                    // A domain across zero labels zero: `z` is zero's index among the multiples.
                    let zf = -a / s;
                    let z = (a < 0.0 && b > 0.0 && (zf - zf.round()).abs() < 1e-9).then(|| zf.round() as usize);
                    // Prefer a k that keeps both ends labelled, and zero.
                    if k > 1 {
                        let zero_ok = |d: usize| z.is_none_or(|z| z.is_multiple_of(d));
                        if let Some(d) = (k..=n.min(3 * k))
                            .find(|d| n.is_multiple_of(*d) && zero_ok(*d))
                            .or_else(|| (k..=n.min(3 * k)).find(|d| n.is_multiple_of(*d) && z.is_none()))
                        {
                            k = d;
                        }
                    }
                    let start = z.map_or(0, |z| z % k);
                    let mut t = Vec::new();
                    for i in (start..=n).step_by(k) {
                        t.push(ticks::clean(a + i as f64 * s, s));
                    }
                    return (t, TickStep::Even(s * k as f64));
                }
                let t = ticks::kept(ticks::extended_axis(a, b, wanted, false), &inside);
                let step = if t.len() > 1 { t[1] - t[0] } else { (b - a).abs().max(1.0) };
                (t, TickStep::Even(step))
            }
        }
    }

    /// Ticks with labels in a locale.
    pub fn ticks_with(&self, o: &TickOptions) -> Vec<Tick> {
        match self {
            PositionScale::Continuous { time, .. } => {
                let (vals, step) = self.tick_values(o.wanted);
                let labels = if *time {
                    let pattern = match (o.pattern, step) {
                        (Some(p), _) => p.to_string(),
                        (None, TickStep::Time(u, _)) => default_time_pattern(u, &vals, o.locale, o.short),
                        (None, TickStep::Chosen) => default_time_pattern(chosen_unit(&vals), &vals, o.locale, o.short),
                        _ => "yyyy-MM-dd".to_string(),
                    };
                    let mut labels = labels_of(&vals, &|v| format::date(v, &pattern, o.locale));
                    // Month ticks: the first label and each January also name the year.
                    if o.pattern.is_none() && pattern == "MMM" {
                        for (k, (l, v)) in labels.iter_mut().zip(&vals).enumerate() {
                            if k == 0 || format::civil(*v).month == 1 {
                                *l = format::date(*v, "MMM yyyy", o.locale);
                            }
                        }
                    }
                    labels
                } else {
                    number_labels(&vals, step, o)
                };
                let mut out = Vec::with_capacity(vals.len());
                for (v, label) in vals.iter().zip(labels) {
                    out.push(Tick { unit: self.unit_num(*v).unwrap_or(0.0), value: *v, label });
                }
                out
            }
            PositionScale::Category { values, marks, .. } => {
                let mut out = Vec::new();
                for (i, v) in values.iter().enumerate() {
                    if marks.as_ref().is_none_or(|m| m.contains(v)) {
                        out.push(Tick {
                            unit: (i as f64 + 0.5) / values.len() as f64,
                            value: i as f64,
                            label: if o.short { shorten(v, 10) } else { v.clone() },
                        });
                    }
                }
                out
            }
        }
    }
}

#[derive(Debug, Clone, Copy, PartialEq)]
enum TickStep {
    None,
    Even(f64),
    Varied,
    Time(TimeUnit, i64),
    /// Dates chosen in the spec.
    Chosen,
}

/// The calendar unit chosen dates fall on: years when each is 1 January,
/// months when each is the 1st, else days (for the default label pattern).
fn chosen_unit(vals: &[f64]) -> TimeUnit {
    let (mut years, mut months, mut days) = (true, true, true);
    for v in vals {
        let c = format::civil(*v);
        let midnight = c.hour == 0 && c.minute == 0;
        days &= midnight;
        months &= midnight && c.day == 1;
        years &= midnight && c.day == 1 && c.month == 1;
    }
    if years {
        TimeUnit::Year
    } else if months {
        TimeUnit::Month
    } else if days {
        TimeUnit::Day
    } else {
        TimeUnit::Minute
    }
}

fn number_labels(vals: &[f64], step: TickStep, o: &TickOptions) -> Vec<String> {
    if let Some(p) = o.pattern {
        return labels_of(vals, &|v| format::number(v, p, o.locale));
    }
    let biggest = vals.iter().fold(0.0f64, |m, v| m.max(v.abs()));
    if o.short || biggest >= 1e6 {
        // Compact forms with the fewest decimals that keep labels apart.
        for fd in 0..=3 {
            let l = labels_of(vals, &|v| format::compact(v, fd, o.locale));
            let distinct = l.windows(2).all(|w| w[0] != w[1]);
            if distinct {
                return l;
            }
        }
    }
    let pattern = match step {
        TickStep::Even(s) => {
            // As many decimals as the step needs, and more if a labelling is
            // offset from it (2.5, 7.5, 12.5 are 5 apart: without this they
            // printed "2", "8", "12", found in a user trial).
            let d = max_decimals(vals).max(format::step_decimals(s));
            format::default_pattern(math::powi(10.0, -(d as i32)))
        }
        _ => {
            // Uneven steps (log, symlog): each label as many decimals as it needs.
            let d = max_decimals(vals);
            format::default_pattern(math::powi(10.0, -(d as i32)))
        }
    };
    labels_of(vals, &|v| format::number(v, &pattern, o.locale))
}

/// One label per value (one function for every labelling).
fn labels_of(vals: &[f64], label: &dyn Fn(f64) -> String) -> Vec<String> {
    let mut out = Vec::with_capacity(vals.len());
    for v in vals {
        out.push(label(*v));
    }
    out
}

/// The most decimals a value of `vals` needs (0 for none).
fn max_decimals(vals: &[f64]) -> usize {
    let mut d = 0;
    for v in vals {
        d = d.max(format::step_decimals(v.abs()));
    }
    d
}

/// Default date pattern for ticks of a calendar unit.
fn default_time_pattern(unit: TimeUnit, vals: &[f64], loc: &Locale, short: bool) -> String {
    let ends = vals.first().zip(vals.last()).map(|(a, b)| (format::civil(*a), format::civil(*b)));
    let many_years = ends.is_some_and(|(a, b)| a.year != b.year);
    let many_days = ends.is_some_and(|(a, b)| (a.year, a.month, a.day) != (b.year, b.month, b.day));
    match unit {
        TimeUnit::Year => {
            if short {
                "yy".into()
            } else {
                "yyyy".into()
            }
        }
        TimeUnit::Month => match (many_years, short) {
            (true, true) => "MM/yy".into(),
            _ => "MMM".into(),
        },
        TimeUnit::Week | TimeUnit::Day => loc.day_month.to_string(),
        TimeUnit::Hour | TimeUnit::Minute => {
            if many_days && !short {
                format!("{} HH:mm", loc.day_month)
            } else {
                "HH:mm".into()
            }
        }
        TimeUnit::Second => "HH:mm:ss".into(),
    }
}

/// Cut text to `max` characters with an ellipsis.
pub fn shorten(s: &str, max: usize) -> String {
    if s.chars().count() <= max {
        return s.to_string();
    }
    let end = s.char_indices().nth(max.saturating_sub(1)).map_or(s.len(), |(i, _)| i);
    let mut out = s[..end].trim_end().to_string();
    out.push('\u{2026}');
    out
}

// ---------------------------------------------------------------- size and shape

/// Size scale: values to circle radii so that *area* is proportional to the
/// value's distance from the domain's low end (zero by default), the usual
/// rule for proportional symbols (common practice).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SizeScale {
    pub lo: f64,
    pub hi: f64,
    pub max_radius: f64,
}

impl SizeScale {
    pub fn radius(&self, v: f64) -> Option<f64> {
        if !v.is_finite() {
            return None;
        }
        let t = if self.hi > self.lo { ((v - self.lo) / (self.hi - self.lo)).clamp(0.0, 1.0) } else { 1.0 };
        Some(self.max_radius * t.sqrt())
    }
    /// Values for a size legend: up to three nice values above the low end,
    /// spread from small to the largest.
    pub fn legend_values(&self) -> Vec<f64> {
        let t = ticks::extended(self.lo, self.hi, 5, false);
        let v = ticks::kept(t, &|x| x > self.lo && x <= self.hi * (1.0 + 1e-9));
        if v.len() <= 3 {
            return v;
        }
        let n = v.len();
        vec![v[0], v[(n - 1) / 2], v[n - 1]]
    }
}

/// A shape of the shape channel.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum MarkShape {
    Circle,
    Square,
    Triangle,
    Diamond,
    Plus,
    Cross,
    Star,
}

impl MarkShape {
    pub fn name(self) -> &'static str {
        match self {
            MarkShape::Circle => "circle",
            MarkShape::Square => "square",
            MarkShape::Triangle => "triangle",
            MarkShape::Diamond => "diamond",
            MarkShape::Plus => "plus",
            MarkShape::Cross => "cross",
            MarkShape::Star => "star",
        }
    }
}

/// The shapes of the shape channel, in the order categories take them.
pub const SHAPES: [MarkShape; 7] =
    [MarkShape::Circle, MarkShape::Square, MarkShape::Triangle, MarkShape::Diamond, MarkShape::Plus, MarkShape::Cross, MarkShape::Star];

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn transforms_invert() {
        for t in [Transform::Linear, Transform::Log { base: 2.0 }, Transform::Sqrt, Transform::Symlog { constant: 1.0 }] {
            for x in [0.5, 3.0, 1000.0] {
                let y = t.apply(x).unwrap();
                assert!((t.invert(y) - x).abs() < 1e-9 * x.max(1.0), "{t:?} {x}");
            }
        }
        assert_eq!(Transform::Log { base: 10.0 }.apply(0.0), None);
        // Symlog is odd and linear near zero: d/dx at 0 is 1/c.
        let s = Transform::Symlog { constant: 1.0 };
        assert_eq!(s.apply(-5.0), s.apply(5.0).map(|v| -v));
        assert!((s.apply(1e-6).unwrap() - 1e-6).abs() < 1e-11);
    }

    /// Every default number label reads back as its tick's value: the label
    /// never rounds a tick to a different number (common practice: a tick
    /// label names the position it marks).
    #[test]
    fn number_labels_read_back_as_their_values() {
        let mut checked = 0;
        for (lo, hi) in [(3.2, 12.4), (0.13, 0.87), (-7.3, 41.9), (1.05, 1.95), (12.0, 97.0), (2.2, 2.9), (-0.04, 0.031), (1500.0, 9250.0)] {
            let s = PositionScale::linear(lo, hi);
            for wanted in 2..=9 {
                for t in s.ticks(wanted, None) {
                    let back: f64 = t.label.replace(',', "").replace('\u{2212}', "-").parse().unwrap();
                    assert!((back - t.value).abs() <= 1e-9 * t.value.abs().max(1.0), "{lo}..{hi} wanted {wanted}: {} labelled {}", t.value, t.label);
                    checked += 1;
                }
            }
        }
        assert!(checked > 100);
    }

    #[test]
    fn log_scale_positions() {
        let s = PositionScale::Continuous { lo: 1.0, hi: 1000.0, transform: Transform::Log { base: 10.0 }, time: false, step: None, marks: None };
        assert!((s.unit_num(10.0).unwrap() - 1.0 / 3.0).abs() < 1e-12);
        assert!((s.unit_num(100.0).unwrap() - 2.0 / 3.0).abs() < 1e-12);
        assert_eq!(s.unit_num(-1.0), None);
        let labels: Vec<String> = s.ticks(6, None).into_iter().map(|t| t.label).collect();
        assert_eq!(labels, ["1", "10", "100", "1,000"]);
    }

    #[test]
    fn nice_reaches_the_next_tick() {
        // Data 0..622 with about 4 ticks: the best covering labelling is
        // 0, 250, 500, 750; the domain becomes 0..750 and the axis keeps that
        // step, so its top tick is the domain's end.
        let s = PositionScale::linear(0.0, 622.0).nice(4);
        assert_eq!(s.domain(), Some((0.0, 750.0)), "{s:?}");
        let t = s.ticks(4, None);
        assert_eq!(t.iter().map(|t| t.value).collect::<Vec<_>>(), [0.0, 250.0, 500.0, 750.0]);
        let s = PositionScale::linear(0.0, 622.0).nice(6);
        assert_eq!(s.domain(), Some((0.0, 700.0)));
        assert_eq!(s.ticks(6, None).last().map(|t| t.value), Some(700.0));
        // Reversed stays reversed; log goes to powers.
        assert_eq!(PositionScale::linear(97.0, 3.0).nice(5).domain(), Some((100.0, 0.0)));
        let l = PositionScale::Continuous { lo: 3.0, hi: 420.0, transform: Transform::Log { base: 10.0 }, time: false, step: None, marks: None }.nice(5);
        assert_eq!(l.domain(), Some((1.0, 1000.0)));
    }

    #[test]
    fn symlog_ticks_are_signed_powers() {
        let s = PositionScale::Continuous { lo: -1000.0, hi: 1000.0, transform: Transform::Symlog { constant: 1.0 }, time: false, step: None, marks: None };
        let v: Vec<f64> = s.ticks(9, None).into_iter().map(|t| t.value).collect();
        assert_eq!(v, [-1000.0, -100.0, -10.0, -1.0, 0.0, 1.0, 10.0, 100.0, 1000.0]);
        // Symmetric about zero, zero in the middle.
        assert_eq!(s.unit_num(0.0), Some(0.5));
        assert!((s.unit_num(10.0).unwrap() + s.unit_num(-10.0).unwrap() - 1.0).abs() < 1e-12);
    }

    #[test]
    fn reversed_and_sqrt() {
        let r = PositionScale::linear(10.0, 0.0);
        assert_eq!(r.unit_num(10.0), Some(0.0));
        assert_eq!(r.unit_num(2.5), Some(0.75));
        let s = PositionScale::Continuous { lo: 0.0, hi: 100.0, transform: Transform::Sqrt, time: false, step: None, marks: None };
        assert_eq!(s.unit_num(25.0), Some(0.5));
    }

    #[test]
    fn labels_in_locales_and_short() {
        let s = PositionScale::linear(0.0, 2_500_000.0);
        let de = format::locale("de");
        let t = s.ticks_with(&TickOptions { wanted: 6, pattern: None, locale: de, short: false });
        // Large values go compact; CLDR de short form is "0 Mio." (no-break space).
        assert!(t.iter().any(|t| t.label == "1\u{a0}Mio."), "{t:?}");
        let s = PositionScale::linear(0.0, 1.0);
        let t = s.ticks_with(&TickOptions { wanted: 6, pattern: None, locale: format::locale("fr"), short: false });
        assert_eq!(t.iter().map(|t| t.label.as_str()).collect::<Vec<_>>(), ["0,0", "0,2", "0,4", "0,6", "0,8", "1,0"]);
        let t = s.ticks_with(&TickOptions { wanted: 6, pattern: Some("0%"), locale: format::english(), short: false });
        assert_eq!(t[1].label, "20%");
    }

    #[test]
    fn time_labels_by_unit() {
        let day = |y, m, d| crate::calendar::days_from_civil(y, m, d) as f64 * 86_400_000.0;
        let s = PositionScale::Continuous { lo: day(2024, 1, 1), hi: day(2024, 12, 31), transform: Transform::Linear, time: true, step: None, marks: None };
        let t = s.ticks_with(&TickOptions { wanted: 6, pattern: None, locale: format::locale("de"), short: false });
        assert_eq!(t[0].label, "Jan. 2024");
        assert_eq!(t[1].label, "Apr.");
        let s = PositionScale::Continuous { lo: day(1990, 1, 1), hi: day(2020, 1, 1), transform: Transform::Linear, time: true, step: None, marks: None };
        let t = s.ticks(4, None);
        assert_eq!(t.iter().map(|t| t.label.as_str()).collect::<Vec<_>>(), ["1990", "2000", "2010", "2020"]);
        let t = s.ticks(6, None);
        assert_eq!(t[1].label, "1995");
    }

    #[test]
    fn size_is_area() {
        let s = SizeScale { lo: 0.0, hi: 100.0, max_radius: 10.0 };
        let a = |v: f64| s.radius(v).unwrap().powi(2);
        // Twice the value, twice the area.
        assert!((a(50.0) * 2.0 - a(100.0)).abs() < 1e-9);
        assert_eq!(s.legend_values(), vec![25.0, 50.0, 100.0]);
        let s = SizeScale { lo: 0.0, hi: 99.2, max_radius: 10.0 };
        assert_eq!(s.legend_values(), vec![25.0, 50.0, 75.0]);
    }

    #[test]
    fn log_bases_and_tick_counts_are_bounded() {
        // Issue 16: a base of 1e6 ran 97 s, 1e10 asked for 80 GB, 1e50 panicked.
        for (base, ok) in [(1e50, false), (1e10, false), (f64::INFINITY, false), (0.5, false), (1.001, false), (1e6, true), (2.0, true), (1.5, true)] {
            let spec = format!(
                r#"{{"data":{{"rows":[{{"a":1,"b":3}},{{"a":1e30,"b":5}}]}},"scales":{{"x":{{"kind":"log","base":{base}}}}},"layers":[{{"draw":"point","x":"a","y":"b"}}]}}"#,
                base = if base.is_finite() { format!("{base:e}") } else { "1e999".into() }
            );
            let r = crate::render(&spec, None, &Default::default());
            match r {
                Ok(_) => assert!(ok, "{base} accepted"),
                Err(e) => {
                    assert!(!ok, "{base}: {e}");
                    assert!(e.0.iter().any(|d| d.code == "spec.bad_base" && d.at.path == "scales.x.base") || base.is_infinite(), "{base}: {e:?}");
                }
            }
        }
        // Ticks of a million-base log scale over 1e-300..1e300: a few, at once.
        let t = ticks::log_ticks(1e-300, 1e300, 1e6, 5);
        assert!(!t.is_empty() && t.len() <= 10, "{}", t.len());
        // However many ticks a spec wants, a scale gives at most MAX_TICKS.
        for transform in [Transform::Linear, Transform::Log { base: 1.01 }, Transform::Sqrt, Transform::Symlog { constant: 1.0 }] {
            let s = PositionScale::Continuous { lo: 1e-3, hi: 1e12, transform, time: false, step: None, marks: None };
            let n = s.nice(u32::MAX as usize).ticks(u32::MAX as usize, None).len();
            assert!(n <= MAX_TICKS, "{transform:?}: {n}");
        }
        let s = PositionScale::Continuous { lo: 0.0, hi: 3e12, transform: Transform::Linear, time: true, step: None, marks: None };
        assert!(s.ticks(u32::MAX as usize, None).len() <= MAX_TICKS);
    }
}
