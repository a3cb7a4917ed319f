//! The checked spec value to the typed [`Spec`], by hand: each type says
//! how it reads from a JSON value, each struct with one line per key in a
//! table that one walker ([`fields`]) reads (code per struct was most of
//! this reader). (A
//! serde derive did this before; its generated code was about a fifth of the
//! page's engine.)
//!
//! The shape check (`shape.rs`) has already reported every problem with
//! its path, so a value that reaches here reads; tests/spec_schema.rs holds
//! that on thousands of mutations. The errors below are a last guard and
//! become `spec.invalid`.
//!
//! Adding a spec word: the field in the struct (mod.rs), its line in the
//! struct's `object!` table below, and its shape in shape.rs (which also writes
//! the JSON Schema). DEVELOPERS.md says more.

use super::*;
use serde_json::{Map, Value};

/// A type read from the spec's JSON value.
pub(crate) trait Read: Sized {
    fn read(v: &Value) -> Result<Self, String>;
}

/// A struct field that a key reads into: the walker of [`fields`] holds
/// one `&mut dyn Slot` per key, so no code is generated per struct for
/// finding keys, keeping errors or refusing unknown keys.
pub(crate) trait Slot {
    fn put(&mut self, v: &Value) -> Result<(), String>;
    /// A word field's words, and whether it is an `Option` (null: `None`):
    /// the walker finds the word, so each word enum's code is only
    /// [`Slot::set_word`].
    fn words(&self) -> Option<(&'static [&'static str], bool)> {
        None
    }
    fn set_word(&mut self, _i: usize) {}
}

impl<T: Read> Slot for T {
    #[inline(never)]
    fn put(&mut self, v: &Value) -> Result<(), String> {
        *self = T::read(v)?;
        Ok(())
    }
}

/// A word key's field: `Option<T>` (absent or null: `None`) or `T`.
pub(crate) struct WordOpt<'a, T>(&'a mut Option<T>);
pub(crate) struct WordOne<'a, T>(&'a mut T);

impl<T: Word> Slot for WordOpt<'_, T> {
    fn put(&mut self, _: &Value) -> Result<(), String> {
        Ok(())
    }
    fn words(&self) -> Option<(&'static [&'static str], bool)> {
        Some((T::WORDS, true))
    }
    fn set_word(&mut self, i: usize) {
        *self.0 = T::ALL.get(i).map(|w| w.1);
    }
}

impl<T: Word> Slot for WordOne<'_, T> {
    fn put(&mut self, _: &Value) -> Result<(), String> {
        Ok(())
    }
    fn words(&self) -> Option<(&'static [&'static str], bool)> {
        Some((T::WORDS, false))
    }
    fn set_word(&mut self, i: usize) {
        if let Some(w) = T::ALL.get(i) {
            *self.0 = w.1;
        }
    }
}

/// Read the object `v` into a struct whose fields start at the values their
/// keys' absence means: `keys[i]` reads into `slots[i]`. `required`: a bit
/// per key that must be there. As before this was a table (one line per
/// key, in order), the first error in `keys`' order is kept, with its key;
/// keys that no slot takes are refused after that.
#[inline(never)]
pub(crate) fn fields(v: &Value, what: &str, keys: &[&str], required: u32, slots: &mut [&mut dyn Slot]) -> Result<(), String> {
    let map = v.as_object().ok_or_else(|| wrong(v, what))?;
    let mut seen = 0u32;
    let mut first: Option<(usize, String)> = None;
    let mut unknown: Option<&str> = None;
    for (k, x) in map {
        let Some(i) = keys.iter().position(|w| *w == k) else {
            unknown.get_or_insert(k);
            continue;
        };
        seen |= 1 << i;
        let slot = &mut slots[i];
        let read = match slot.words() {
            None => slot.put(x),
            Some((_, true)) if x.is_null() => Ok(()),
            Some((words, _)) => word_index(x, words).map(|w| slot.set_word(w)),
        };
        if let Err(e) = read {
            if first.as_ref().is_none_or(|(j, _)| i < *j) {
                first = Some((i, e));
            }
        }
    }
    let missing_key = (0..keys.len()).find(|i| required & !seen & (1 << i) != 0);
    if let Some(i) = missing_key {
        if first.as_ref().is_none_or(|(j, _)| i < *j) {
            first = Some((i, missing()));
        }
    }
    if let Some((i, e)) = first {
        return Err(at_key(keys[i], &e));
    }
    match unknown {
        None => Ok(()),
        Some(k) => Err(format!("unknown field `{k}`")),
    }
}

#[cold]
#[inline(never)]
fn missing() -> String {
    "missing field".to_string()
}

fn kind(v: &Value) -> &'static str {
    match v {
        Value::Null => "null",
        Value::Bool(_) => "boolean",
        Value::Number(_) => "number",
        Value::String(_) => "string",
        Value::Array(_) => "sequence",
        Value::Object(_) => "map",
    }
}

fn wrong(v: &Value, expected: &str) -> String {
    format!("invalid type: {}, expected {expected}", kind(v))
}

impl Read for String {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_str().map(str::to_string).ok_or_else(|| wrong(v, "a string"))
    }
}

impl Read for f64 {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_f64().ok_or_else(|| wrong(v, "f64"))
    }
}

impl Read for u64 {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_u64().ok_or_else(|| wrong(v, "u64"))
    }
}

impl Read for u32 {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_u64().and_then(|n| u32::try_from(n).ok()).ok_or_else(|| wrong(v, "u32"))
    }
}

impl Read for bool {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_bool().ok_or_else(|| wrong(v, "a boolean"))
    }
}

impl Read for Value {
    fn read(v: &Value) -> Result<Self, String> {
        Ok(v.clone())
    }
}

impl Read for Map<String, Value> {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_object().cloned().ok_or_else(|| wrong(v, "a map"))
    }
}

impl Read for [f64; 2] {
    fn read(v: &Value) -> Result<Self, String> {
        match v.as_array().map(Vec::as_slice) {
            Some([a, b]) => Ok([f64::read(a)?, f64::read(b)?]),
            _ => Err(wrong(v, "an array of length 2")),
        }
    }
}

impl<T: Read> Read for Option<T> {
    #[inline]
    fn read(v: &Value) -> Result<Self, String> {
        if v.is_null() {
            return Ok(None);
        }
        T::read(v).map(Some)
    }
}

impl<T: Read> Read for Vec<T> {
    fn read(v: &Value) -> Result<Self, String> {
        let a = v.as_array().ok_or_else(|| wrong(v, "a sequence"))?;
        // A plain loop: a `collect` into `Result` is a few generic
        // functions per element type.
        let mut out = Vec::with_capacity(a.len());
        for (i, x) in a.iter().enumerate() {
            match T::read(x) {
                Ok(t) => out.push(t),
                Err(e) => return Err(at_index(i, &e)),
            }
        }
        Ok(out)
    }
}

#[inline(never)]
fn at_index(i: usize, e: &str) -> String {
    format!("[{i}]: {e}")
}

#[inline(never)]
fn at_key(k: &str, e: &str) -> String {
    format!("{k}: {e}")
}

/// A map key: a channel (the keys of `scales`; other maps are [`Pairs`]).
pub(crate) trait ReadKey: Sized + std::hash::Hash + Eq {
    fn read_key(k: &str) -> Result<Self, String>;
}

impl ReadKey for Channel {
    fn read_key(k: &str) -> Result<Self, String> {
        Channel::from_name(k).ok_or_else(|| format!("unknown channel `{k}`"))
    }
}

impl<K: ReadKey, T: Read> Read for IndexMap<K, T> {
    fn read(v: &Value) -> Result<Self, String> {
        let o = v.as_object().ok_or_else(|| wrong(v, "a map"))?;
        let mut out = IndexMap::with_capacity(o.len());
        for (k, x) in o {
            let key = K::read_key(k)?;
            match T::read(x) {
                Ok(t) => {
                    out.insert(key, t);
                }
                Err(e) => return Err(at_key(k, &e)),
            }
        }
        Ok(out)
    }
}

impl<T: Read> Read for Pairs<T> {
    fn read(v: &Value) -> Result<Self, String> {
        let o = v.as_object().ok_or_else(|| wrong(v, "a map"))?;
        let mut out = Vec::with_capacity(o.len());
        for (k, x) in o {
            match T::read(x) {
                Ok(t) => out.push((k.clone(), t)),
                Err(e) => return Err(at_key(k, &e)),
            }
        }
        Ok(Pairs(out))
    }
}

/// A word enum of `words!`: its words and values, in the spec's order.
pub(crate) trait Word: Copy + 'static {
    const ALL: &'static [(&'static str, Self)];
    const WORDS: &'static [&'static str];
}

/// A spec word of the `words!` enums.
pub(crate) fn word<T: Word>(v: &Value) -> Result<T, String> {
    word_index(v, T::WORDS).map(|i| T::ALL[i].1)
}

/// The index of the word `v` among `words` (one function for every word list).
#[inline(never)]
fn word_index(v: &Value, words: &[&str]) -> Result<usize, String> {
    let w = v.as_str().ok_or_else(|| wrong(v, "a word"))?;
    if let Some(i) = words.iter().position(|x| *x == w) {
        return Ok(i);
    }
    let mut e = format!("unknown variant `{w}`, expected one of ");
    for (i, x) in words.iter().enumerate() {
        if i > 0 {
            e.push_str(", ");
        }
        e.push('`');
        e.push_str(x);
        e.push('`');
    }
    Err(e)
}

// ---------------------------------------------------------------- keys that take a word or an object

impl Read for DataRef {
    fn read(v: &Value) -> Result<Self, String> {
        match v {
            Value::String(s) => Ok(DataRef::Url(s.clone())),
            _ => DataObject::read(v).map(DataRef::Object),
        }
    }
}

impl Read for Mapping {
    fn read(v: &Value) -> Result<Self, String> {
        if let Value::String(s) = v {
            return Ok(Mapping { column: s.clone(), as_type: None });
        }
        let mut m = Mapping { column: String::new(), as_type: None };
        let what = "a column name or an object such as {\"column\": \"c\", \"as\": \"date\"}";
        fields(v, what, &["column", "as"], 1, &mut [&mut m.column, &mut WordOpt(&mut m.as_type)])?;
        Ok(m)
    }
}

impl Read for Stat {
    fn read(v: &Value) -> Result<Self, String> {
        if v.is_string() {
            return Ok(match word::<StatWord>(v)? {
                StatWord::None => Stat::None,
                StatWord::Count => Stat::Count,
                StatWord::Box => Stat::Box,
            });
        }
        let o = StatObject::read(v)?;
        let n = [o.bin.is_some(), o.summary.is_some(), o.fit.is_some(), o.density.is_some(), o.window.is_some()].iter().filter(|b| **b).count();
        if n != 1 {
            return Err("a statistic object needs exactly one of `bin`, `summary`, `fit`, `density`, `window`".into());
        }
        Ok(Stat::Object(o))
    }
}

impl Read for Coords {
    #[cfg(feature = "full")]
    fn read(v: &Value) -> Result<Self, String> {
        if v.is_string() {
            return Ok(match word::<CoordWord>(v)? {
                CoordWord::Cartesian => Coords::Cartesian,
                CoordWord::Polar => Coords::Polar(Polar { kind: PolarKind::Polar, angle: AngleChannel::X, start: 0.0, inner: 0.0 }),
                CoordWord::Map => Coords::Map(MapCoords::default()),
            });
        }
        if v.get("kind").and_then(Value::as_str) == Some("map") {
            MapCoords::read(v).map(Coords::Map)
        } else {
            Polar::read(v).map(Coords::Polar)
        }
    }

    /// The core engine refused polar and map coordinates before reading.
    #[cfg(not(feature = "full"))]
    fn read(v: &Value) -> Result<Self, String> {
        match word::<CoordWord>(v)? {
            CoordWord::Cartesian => Ok(Coords::Cartesian),
            _ => Err("the core engine leaves out polar and map coordinates".into()),
        }
    }
}

impl Read for Theme {
    fn read(v: &Value) -> Result<Self, String> {
        if v.is_string() {
            return Ok(match word::<ThemeWord>(v)? {
                ThemeWord::Auto => Theme::Auto,
                ThemeWord::Light => Theme::Light,
                ThemeWord::Dark => Theme::Dark,
            });
        }
        ThemeOverrides::read(v).map(Theme::Custom)
    }
}

impl Read for Robust {
    fn read(v: &Value) -> Result<Self, String> {
        match v {
            Value::Bool(b) => Ok(Robust::Flag(*b)),
            _ => u64::read(v).map(Robust::Iterations),
        }
    }
}

#[cfg(feature = "full")]
impl Read for Bandwidth {
    fn read(v: &Value) -> Result<Self, String> {
        match v {
            Value::String(_) => word(v).map(Bandwidth::Rule),
            _ => f64::read(v).map(Bandwidth::Width),
        }
    }
}

impl Read for Breaks {
    fn read(v: &Value) -> Result<Self, String> {
        match v {
            Value::String(_) => word(v).map(Breaks::Method),
            _ => Vec::read(v).map(Breaks::List),
        }
    }
}

impl Read for Ticks {
    fn read(v: &Value) -> Result<Self, String> {
        match v {
            Value::Array(_) => Vec::read(v).map(Ticks::Values),
            _ => u32::read(v).map(Ticks::Count),
        }
    }
}

// ---------------------------------------------------------------- objects: one line per key

/// A struct read by [`fields`]: its value when every key is absent, which
/// keys are required (a bit each), then one line per key, in the order its
/// errors are kept: `"key": field` for a field that reads itself,
/// `"key" ? field` for an optional word, `"key" = field` for a word. A
/// line under `#[cfg(feature = "full")]` is a key the core engine refuses
/// before reading (`needs_full_value`), so its reader is not in the core.
macro_rules! object {
    ($ty:ident, $what:expr, $start:expr, $required:expr, { $($(#[$m:meta])* $key:literal $how:tt $field:ident),+ $(,)? }) => {
        impl Read for $ty {
            fn read(v: &Value) -> Result<Self, String> {
                let mut s: $ty = $start;
                fields(v, $what, &[$($(#[$m])* $key),+], $required, &mut [$($(#[$m])* slot!($how s.$field)),+])?;
                Ok(s)
            }
        }
    };
}

macro_rules! slot {
    (: $e:expr) => {
        &mut $e as &mut dyn Slot
    };
    (? $e:expr) => {
        &mut WordOpt(&mut $e) as &mut dyn Slot
    };
    (= $e:expr) => {
        &mut WordOne(&mut $e) as &mut dyn Slot
    };
}

#[cfg(feature = "full")]
object!(Unpivot, "struct Unpivot", Unpivot::default(), 0, { "columns": columns, "into": into });

object!(Spec, "a spec object", Spec::default(), 0, {
    "$schema": schema,
    "title": title,
    "subtitle": subtitle,
    "source": source,
    "description": description,
    "data": data,
    #[cfg(feature = "full")]
    "shapes": shapes,
    #[cfg(feature = "full")]
    "derive": derive,
    #[cfg(feature = "full")]
    "where": where_,
    "layers": layers,
    "scales": scales,
    "coords": coords,
    #[cfg(feature = "full")]
    "panels": panels,
    "notes": notes,
    "size": size,
    "theme": theme,
    "quiet": quiet,
    "locale" ? locale,
    "data_table" = data_table,
    #[cfg(feature = "full")]
    "unpivot": unpivot,
});

object!(DataObject, "a data URL string or an object with `url`, `format`, `types`, `sha256` or `rows`", DataObject::default(), 0, {
    "url": url,
    "format" ? format,
    "types": types,
    "sha256": sha256,
    "rows": rows,
    "delimiter": delimiter,
    "decimal_comma": decimal_comma,
    "missing": missing,
});

#[cfg(feature = "full")]
object!(Shapes, "struct Shapes", Shapes::default(), 0, { "url": url, "features": features, "key": key, "sha256": sha256 });

/// A layer with every key absent (`draw`, required, stands in as the first word).
fn blank_layer() -> Layer {
    Layer {
        draw: Geometry::ALL[0].1,
        x: None,
        y: None,
        x_end: None,
        y_end: None,
        color: None,
        size: None,
        shape: None,
        opacity: None,
        text: None,
        group: None,
        key: None,
        tooltip: Vec::new(),
        style: Style::default(),
        stat: Stat::default(),
        arrange: Arrange::default(),
        label_ends: false,
    }
}

object!(Layer, "struct Layer", blank_layer(), 1, {
    "draw" = draw,
    "x": x,
    "y": y,
    "x_end": x_end,
    "y_end": y_end,
    "color": color,
    "size": size,
    "shape": shape,
    "opacity": opacity,
    "text": text,
    "group": group,
    "key": key,
    "tooltip": tooltip,
    "style": style,
    "stat": stat,
    "arrange" = arrange,
    "label_ends": label_ends,
});

object!(Style, "struct Style", Style::default(), 0, {
    "color": color,
    "opacity": opacity,
    "width": width,
    "radius": radius,
    "dash": dash,
    "share": share,
    "shape" ? shape,
    "font_size": font_size,
    "every_point": every_point,
});

object!(StatObject, "`none`, `count`, `box`, or an object with one of `bin`, `summary`, `fit`, `density`, `window`", StatObject::default(), 0, {
    "bin": bin,
    "summary" ? summary,
    #[cfg(feature = "full")]
    "interval" ? interval,
    #[cfg(feature = "full")]
    "fit" ? fit,
    "band": band,
    #[cfg(feature = "full")]
    "density": density,
    #[cfg(feature = "full")]
    "window": window,
    "p": p,
    "span": span,
    "degree": degree,
    "robust": robust,
});

#[cfg(feature = "full")]
object!(DensitySpec, "struct DensitySpec", DensitySpec::default(), 0, { "bandwidth": bandwidth, "grid": grid });

#[cfg(feature = "full")]
object!(WindowSpec, "struct WindowSpec", WindowSpec::default(), 0, { "summary" ? summary, "rows": rows, "align" ? align });

object!(BinSpec, "struct BinSpec", BinSpec::default(), 0, {
    "rule" ? rule,
    "width": width,
    "count": count,
    "boundary": boundary,
    "unit" ? unit,
    "density": density,
});

object!(ScaleSpec, "struct ScaleSpec", ScaleSpec::default(), 0, {
    "kind" ? kind,
    "domain": domain,
    "zero": zero,
    "nice": nice,
    "reverse": reverse,
    "title": title,
    "format": format,
    "ticks": ticks,
    "palette": palette,
    "axis" ? axis,
    "legend" ? legend,
    "hide": hide,
    "base": base,
    "breaks": breaks,
    "count": count,
    "middle": middle,
    "values": values,
    "order" ? order,
    "top": top,
    "unit": unit,
});

#[cfg(feature = "full")]
// `MapCoords::default()` holds the defaults of `projection`, `fit`,
// `graticule` and `outline`; `kind` (required) has one word.
object!(MapCoords, "struct MapCoords", MapCoords::default(), 1, {
    "kind" = kind,
    "projection" = projection,
    "center": center,
    "rotate": rotate,
    "parallels": parallels,
    "fit" = fit,
    "graticule": graticule,
    "outline": outline,
});

#[cfg(feature = "full")]
object!(Polar, "struct Polar", Polar { kind: PolarKind::Polar, angle: default_angle(), start: 0.0, inner: 0.0 }, 1, {
    "kind" = kind,
    "angle" = angle,
    "start": start,
    "inner": inner,
});

#[cfg(feature = "full")]
object!(Panels, "struct Panels", Panels::default(), 0, {
    "by": by,
    "columns": columns,
    "rows": rows,
    "cols": cols,
    "independent" ? independent,
});

object!(Note, "struct Note", Note::default(), 0, {
    "x": x,
    "y": y,
    "x_end": x_end,
    "y_end": y_end,
    "text": text,
    "pointer": pointer,
});

object!(Size, "struct Size", Size::default(), 0, { "width": width, "height": height, "aspect": aspect });

object!(ThemeOverrides, "`light`, `dark`, `auto`, or an object of overrides", ThemeOverrides::default(), 0, {
    "base" ? base,
    "background": background,
    "text": text,
    "muted": muted,
    "grid": grid,
    "axis": axis,
    "mark": mark,
    "font_size": font_size,
});

#[cfg(test)]
mod tests {
    use super::*;
    use serde_json::json;

    #[test]
    fn reads_keys_and_refuses_what_the_shape_check_would() {
        let l = Layer::read(&json!({"draw": "bar", "x": "a", "y": {"column": "b", "as": "date"}, "style": {"opacity": 0.5}})).unwrap();
        assert_eq!((l.draw, l.x.unwrap().column.as_str(), l.y.unwrap().as_type), (Geometry::Bar, "a", Some(ColumnType::Date)));
        assert_eq!((l.style.opacity, l.arrange, l.tooltip.len()), (Some(0.5), Arrange::None, 0));
        // The first error is kept, with its key; later keys still read.
        assert_eq!(
            Layer::read(&json!({"draw": "bar", "x": 3, "y": true})).unwrap_err(),
            "x: invalid type: number, expected a column name or an object such as {\"column\": \"c\", \"as\": \"date\"}"
        );
        assert_eq!(Layer::read(&json!({"x": "a"})).unwrap_err(), "draw: missing field");
        // The first error in the table's key order, whatever the object's
        // order; a missing key counts at its place; unknown keys after all.
        assert_eq!(Layer::read(&json!({"zz": 1, "y": true, "x": 3, "draw": "bar"})).unwrap_err().split(':').next(), Some("x"));
        assert_eq!(Layer::read(&json!({"y": true, "x": 3})).unwrap_err(), "draw: missing field");
        assert_eq!(Layer::read(&json!({"draw": "bar", "zz": 1, "yy": 2})).unwrap_err(), "unknown field `zz`");
        assert_eq!(Note::read(&json!([1])).unwrap_err(), "invalid type: sequence, expected struct Note");
        assert_eq!(Style::read(&json!({"colour": "red"})).unwrap_err(), "unknown field `colour`");
        assert!(Layer::read(&json!({"draw": "pie"})).unwrap_err().starts_with("draw: unknown variant `pie`, expected one of `point`"));
        // Keyed values keep the object's order; a bad value names its key.
        let p = Pairs::<ColumnType>::read(&json!({"b": "date", "a": "number"})).unwrap();
        assert_eq!(p.keys().map(String::as_str).collect::<Vec<_>>(), ["b", "a"]);
        assert_eq!((p.get("a"), p.get("c"), p.len()), (Some(&ColumnType::Number), None, 2));
        assert_eq!(Pairs::<String>::read(&json!({"k": 1})).unwrap_err(), "k: invalid type: number, expected a string");
        let mut q: Pairs<u32> = [("x".to_string(), 1), ("y".to_string(), 2), ("x".to_string(), 3)].into_iter().collect();
        assert_eq!(q.iter().map(|(k, v)| (k.as_str(), *v)).collect::<Vec<_>>(), [("x", 3), ("y", 2)]);
        assert_eq!((q.shift_remove("x"), q.shift_remove("x"), q.len()), (Some(3), None, 1));
        // Defaults other than the type's own.
        #[cfg(feature = "full")]
        {
            let m = MapCoords::read(&json!({"kind": "map"})).unwrap();
            assert_eq!((m.projection, m.fit, m.outline), (ProjectionWord::EqualEarth, MapFit::Shapes, true));
        }
    }
}
