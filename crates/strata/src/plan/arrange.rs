//! Position adjustments: where marks that share an x go.
//!
//! - `stack`: bars and areas sharing an x (and panel) pile up; positive
//!   values stack upward from zero and negative values downward from zero,
//!   each on their own.
//! - `proportion`: a stack scaled so each x's absolute values sum to 1.
//! - `beside`: marks sharing an x sit side by side within the band; the
//!   scene divides the band among the colour categories.
//! - `jitter`: points move by a seeded pseudo-random amount (SplitMix64,
//!   seed fixed per layer), so every render is identical: up to 40 % of the
//!   data's resolution (smallest gap between distinct values) for numbers,
//!   or up to 30 % of a band either way (`x_offset`) for categories.

use super::{LayerData, Nums, Values};
use crate::channel::Channel;
use crate::spec::{Arrange, Geometry, Layer};
use crate::stat::rng::SplitMix64;

/// Seed of the jitter generator; the layer index is mixed in.
const JITTER_SEED: u64 = 0x5354_5241_5441_0001;

/// The data's resolution along x for bars on a continuous x without an
/// `x_end`: the smallest gap between distinct x values. A bar is that wide
/// times its share (`style.share`), so neighbours never overlap.
pub fn bar_step(geometry: Geometry, data: &LayerData) -> Option<f64> {
    if !matches!(geometry, Geometry::Bar | Geometry::Cell) || data.get(Channel::XEnd).is_some() {
        return None;
    }
    step_along(data, Channel::X)
}

/// Cells on a continuous y (years down the side of a heat map): the
/// smallest gap between distinct y values, which sets their height as
/// [`bar_step`] sets their width.
pub fn cell_y_step(geometry: Geometry, data: &LayerData) -> Option<f64> {
    if geometry != Geometry::Cell || data.get(Channel::YEnd).is_some() {
        return None;
    }
    step_along(data, Channel::Y)
}

/// The data's resolution along a continuous channel; `None` for text.
fn step_along(data: &LayerData, ch: Channel) -> Option<f64> {
    match data.get(ch)? {
        Values::Num(v) | Values::Time(v) => Some(resolution(v)),
        Values::Text(_) => None,
    }
}

pub fn apply(index: usize, layer: &Layer, geometry: Geometry, mut data: LayerData) -> LayerData {
    if layer.arrange == Arrange::Jitter {
        jitter(index, &mut data);
    }
    let stacked = matches!(layer.arrange, Arrange::Stack | Arrange::Proportion);
    // Labels follow a stack too (each at its own segment), so that their
    // positions, and the scale trained on them, match the stacked bars.
    let extent = matches!(geometry, Geometry::Bar | Geometry::Area) || (geometry == Geometry::Label && stacked);
    if !extent || data.get(Channel::YBase).is_some() {
        return data;
    }
    let Some(Values::Num(ys)) = data.get(Channel::Y).cloned() else { return data };
    if geometry == Geometry::Label && data.get(Channel::Text).is_none() {
        // A stacked label still reads its own value, not the running total.
        data.channels.insert(Channel::Text, Values::Num(ys.clone()));
    }
    let mut base = vec![Some(0.0); data.len];
    if layer.arrange == Arrange::Stack || layer.arrange == Arrange::Proportion {
        // Each stack (rows sharing x and panel) by its key, found by hash so
        // that many stacks stay linear: running totals upward and downward.
        // (Keys found by the engine's one hash index, and a slot of its
        // own for rows without a key.)
        let (mut slot_of, mut keys, mut key_slot) = (crate::index::Places::new(), Vec::new(), Vec::new());
        let mut keyless: Option<usize> = None;
        let mut slots: Vec<usize> = Vec::with_capacity(data.len);
        let mut n = 0;
        for i in 0..data.len {
            let slot = match stack_key(&data, i) {
                Some(k) => {
                    let j = slot_of.push(&mut keys, &k);
                    if j == key_slot.len() {
                        key_slot.push(n);
                    }
                    key_slot[j]
                }
                None => *keyless.get_or_insert(n),
            };
            n = n.max(slot + 1);
            slots.push(slot);
        }
        let mut up = vec![0.0f64; n];
        let mut down = vec![0.0f64; n];
        let mut top: Vec<Option<f64>> = vec![None; data.len];
        for i in 0..data.len {
            let Some(y) = ys.get(i) else { continue };
            let acc = if y >= 0.0 { &mut up[slots[i]] } else { &mut down[slots[i]] };
            base[i] = Some(*acc);
            *acc += y;
            top[i] = Some(*acc);
        }
        // `y` keeps each row's own value (what the data table, tooltips and
        // labels report); `y_top` is where its extent ends; `total` is its
        // stack's sum.
        let mut own: Vec<Option<f64>> = Vec::with_capacity(ys.len());
        for i in 0..ys.len() {
            own.push(ys.get(i));
        }
        let mut total: Vec<Option<f64>> = Vec::with_capacity(data.len);
        for i in 0..data.len {
            total.push(ys.get(i).map(|_| up[slots[i]] + down[slots[i]]));
        }
        if layer.arrange == Arrange::Proportion {
            for i in 0..data.len {
                let whole = up[slots[i]].abs() + down[slots[i]].abs();
                if whole > 0.0 {
                    base[i] = base[i].map(|b| b / whole);
                    top[i] = top[i].map(|t| t / whole);
                    own[i] = own[i].map(|v| v / whole);
                }
            }
            data.channels.insert(Channel::Y, Values::Num(own.into()));
        }
        data.channels.insert(Channel::YTop, Values::Num(top.into()));
        data.channels.insert(Channel::Total, Values::Num(total.into()));
    }
    data.channels.insert(Channel::YBase, Values::Num(base.into()));
    data
}

/// Marks stack when they share x and panel (or grid cell).
fn stack_key(data: &LayerData, i: usize) -> Option<String> {
    let x = data.get(Channel::X).and_then(|x| x.key(i));
    let mut key: Option<String> = None;
    for c in Channel::PANEL {
        if let Some(v) = data.get(c) {
            let k = key.get_or_insert_with(|| x.clone().unwrap_or_default());
            k.push('\u{1f}');
            k.push_str(&v.key(i).unwrap_or_default());
        }
    }
    key.or(x)
}

/// Smallest gap between distinct finite values (1 when there is none).
pub(super) fn resolution(v: &Nums) -> f64 {
    let mut s: Vec<f64> = v.present().collect();
    crate::sort::f64s(&mut s);
    s.dedup();
    let r = s.windows(2).map(|w| w[1] - w[0]).filter(|d| *d > 0.0).fold(f64::INFINITY, f64::min);
    if r.is_finite() {
        r
    } else {
        1.0
    }
}

fn jitter(index: usize, data: &mut LayerData) {
    let mut rng = SplitMix64::new(JITTER_SEED ^ (index as u64).wrapping_mul(0x9E37_79B9_7F4A_7C15));
    let n = data.len;
    // Draw x then y for each row, so either column's jitter never depends on the other being present.
    let mut draws: Vec<[f64; 2]> = Vec::with_capacity(n);
    for _ in 0..n {
        let dx = rng.next_f64() * 2.0 - 1.0;
        draws.push([dx, rng.next_f64() * 2.0 - 1.0]);
    }
    match data.get(Channel::X).cloned() {
        Some(Values::Text(_)) => {
            let mut off = Vec::with_capacity(n);
            for d in &draws {
                off.push(0.3 * d[0]);
            }
            data.channels.insert(Channel::XOffset, Values::Num(off.into()));
        }
        Some(Values::Num(v)) => {
            data.channels.insert(Channel::X, Values::Num(moved(&v, &draws, 0)));
        }
        Some(Values::Time(v)) => {
            data.channels.insert(Channel::X, Values::Time(moved(&v, &draws, 0)));
        }
        None => {}
    }
    if let Some(Values::Num(v)) = data.get(Channel::Y).cloned() {
        data.channels.insert(Channel::Y, Values::Num(moved(&v, &draws, 1)));
    }
}

/// Jittered values: each present value moved by its row's draw `d[k]`
/// times 0.4 of the data's resolution; a missing one stays missing (NaN).
fn moved(v: &Nums, draws: &[[f64; 2]], k: usize) -> Nums {
    let r = 0.4 * resolution(v);
    let mut out = Vec::with_capacity(v.len());
    for (&x, d) in v.raw().iter().zip(draws) {
        out.push(if x.is_finite() { x + r * d[k] } else { f64::NAN });
    }
    out.into()
}
