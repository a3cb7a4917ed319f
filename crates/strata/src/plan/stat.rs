//! Apply a layer's statistic: rows in, rows out.

use super::{LayerData, Values};
use crate::error::{Diagnostic, Errors};
use crate::spec::{Layer, Stat};
use indexmap::IndexMap;

/// The discrete channels a statistic groups by, in this order.
const GROUP_CHANNELS: [&str; 3] = ["x", "color", "group"];

pub fn apply(index: usize, layer: &Layer, data: LayerData) -> Result<LayerData, Errors> {
    match &layer.stat {
        Stat::Identity => Ok(data),
        Stat::Count => Ok(aggregate(data, "count", |ys| Some(ys.len() as f64), true)),
        Stat::Object(o) if o.summary.is_some() => {
            let name = o.summary.as_deref().unwrap_or("");
            let f: fn(&[f64]) -> Option<f64> = match name {
                "mean" => crate::stat::mean,
                "sum" => |ys| Some(ys.iter().sum()),
                "count" => |ys| Some(ys.len() as f64),
                "min" => |ys| ys.iter().copied().reduce(f64::min),
                "max" => |ys| ys.iter().copied().reduce(f64::max),
                _ => {
                    return Err(Diagnostic::error("spec.unknown_summary", format!("unknown summary `{name}`"))
                        .at_path(format!("layers[{index}].stat.summary"))
                        .with_hint("use one of mean, sum, count, min, max")
                        .into())
                }
            };
            if data.get("y").is_none() {
                return Err(Diagnostic::error("spec.missing_channel", format!("a `{name}` summary needs a `y` channel to summarise"))
                    .at_path(format!("layers[{index}].y"))
                    .into());
            }
            Ok(aggregate(data, name, f, false))
        }
        _ => Err(Diagnostic::error("spec.unsupported", "this statistic is not supported by this build yet")
            .at_path(format!("layers[{index}].stat"))
            .into()),
    }
}

/// Group rows by the discrete channels and reduce `y` in each group.
/// With `count_only`, rows need no `y`.
fn aggregate(data: LayerData, label: &str, f: impl Fn(&[f64]) -> Option<f64>, count_only: bool) -> LayerData {
    let keys: Vec<&str> = GROUP_CHANNELS.iter().copied().filter(|c| data.channels.contains_key(c)).collect();
    let mut groups: IndexMap<Vec<Option<String>>, (usize, Vec<f64>)> = IndexMap::new();
    let y = data.get("y");
    for i in 0..data.len {
        let key: Vec<Option<String>> = keys.iter().map(|k| data.channels[*k].key(i)).collect();
        if key.first().is_some_and(|k| k.is_none()) {
            continue; // rows with a missing x are not counted
        }
        let e = groups.entry(key).or_insert((i, Vec::new()));
        if count_only {
            e.1.push(1.0);
        } else if let Some(v) = y.and_then(|y| y.num(i)) {
            e.1.push(v);
        }
    }
    let firsts: Vec<usize> = groups.values().map(|(i, _)| *i).collect();
    let mut out = LayerData { len: firsts.len(), ..Default::default() };
    for k in &keys {
        out.channels.insert(k, data.channels[*k].take(&firsts));
        out.names.insert(k, data.names[*k].clone());
    }
    let ys: Vec<Option<f64>> = groups.values().map(|(_, ys)| f(ys)).collect();
    out.channels.insert("y", Values::Num(ys));
    let yname = match data.names.get("y") {
        Some(n) if !count_only => format!("{label} of {n}"),
        _ => label.to_string(),
    };
    out.names.insert("y", yname);
    out
}
