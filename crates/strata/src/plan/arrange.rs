//! Position adjustments: where marks that share an x go.

use super::{LayerData, Values};
use crate::spec::{Arrange, Geometry, Layer};

pub fn apply(layer: &Layer, mut data: LayerData) -> LayerData {
    let extent = matches!(layer.draw, Geometry::Bar | Geometry::Area);
    if !extent {
        return data;
    }
    let Some(Values::Num(ys)) = data.get("y").cloned() else { return data };
    let mut base = vec![Some(0.0); data.len];
    let mut top = ys.clone();
    if layer.arrange == Arrange::Stack || layer.arrange == Arrange::Proportion {
        // Positives stack up from zero, negatives down, each x on its own.
        let xs = data.get("x").cloned();
        let mut up: Vec<(Option<String>, f64)> = Vec::new();
        let mut down: Vec<(Option<String>, f64)> = Vec::new();
        for i in 0..data.len {
            let Some(y) = ys[i] else { continue };
            let key = xs.as_ref().and_then(|x| x.key(i));
            let acc = if y >= 0.0 { &mut up } else { &mut down };
            let slot = match acc.iter().position(|(k, _)| *k == key) {
                Some(p) => p,
                None => {
                    acc.push((key, 0.0));
                    acc.len() - 1
                }
            };
            base[i] = Some(acc[slot].1);
            acc[slot].1 += y;
            top[i] = Some(acc[slot].1);
        }
        if layer.arrange == Arrange::Proportion {
            for i in 0..data.len {
                let key = xs.as_ref().and_then(|x| x.key(i));
                let total: f64 = up.iter().chain(&down).filter(|(k, _)| *k == key).map(|(_, s)| s.abs()).sum();
                if total > 0.0 {
                    base[i] = base[i].map(|b| b / total);
                    top[i] = top[i].map(|t| t / total);
                }
            }
        }
    }
    data.channels.insert("y", Values::Num(top));
    data.channels.insert("y_base", Values::Num(base));
    data
}
