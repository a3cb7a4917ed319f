//! The checked spec value to the typed [`Spec`], by hand: each type says
//! how it reads from a JSON value, each struct with one line per key. (A
//! serde derive did this before; its generated code was about a fifth of the
//! page's engine.)
//!
//! The shape check (`shape.rs`) has already reported every problem with
//! its path, so a value that reaches here reads; tests/spec_schema.rs holds
//! that on thousands of mutations. The errors below are a last guard and
//! become `spec.invalid`.
//!
//! Adding a spec word: the field in the struct (mod.rs), its line in the
//! struct's `Read` impl below, and its shape in shape.rs (which also writes
//! the JSON Schema). DEVELOPERS.md says more.

use super::*;
use serde_json::{Map, Value};

/// A type read from the spec's JSON value.
pub(crate) trait Read: Sized {
    fn read(v: &Value) -> Result<Self, String>;
    /// The value when the key is left out; `None`: the key is required.
    fn absent() -> Option<Self> {
        None
    }
    /// A stand-in after an error, so that an object's fields read one after
    /// another without an early return each (which made the reader large);
    /// the error is kept and the object's read fails at [`Obj::end`].
    fn fallback() -> Self;
}

/// `fallback()` as the type's default.
macro_rules! fallback_default {
    () => {
        fn fallback() -> Self {
            Self::default()
        }
    };
}

/// The keys of one JSON object, read one by one; [`Obj::end`] refuses keys
/// that no line read.
pub(crate) struct Obj<'a> {
    map: &'a Map<String, Value>,
    read: std::cell::RefCell<Vec<&'a str>>,
    error: std::cell::RefCell<Option<String>>,
}

impl<'a> Obj<'a> {
    pub fn new(v: &'a Value, what: &str) -> Result<Obj<'a>, String> {
        let map = v.as_object().ok_or_else(|| format!("invalid type: {}, expected {what}", kind(v)))?;
        Ok(Obj { map, read: Default::default(), error: Default::default() })
    }

    fn value(&self, key: &str) -> Option<&'a Value> {
        let (k, v) = self.map.get_key_value(key)?;
        self.read.borrow_mut().push(k);
        Some(v)
    }

    /// Keep the first error (one function for every type: it is large).
    #[cold]
    #[inline(never)]
    fn note(&self, key: &str, e: String) {
        self.error.borrow_mut().get_or_insert_with(|| format!("{key}: {e}"));
    }

    /// The value read, or the type's stand-in after noting the error (one
    /// error path a type, so each `get` instance stays small).
    fn fail<T: Read>(&self, key: &str, r: Result<T, String>) -> T {
        match r {
            Ok(t) => t,
            Err(e) => {
                self.note(key, e);
                T::fallback()
            }
        }
    }

    /// A key whose type says what its absence means (`Option`, `Vec`, maps:
    /// empty); any other type is required.
    #[inline(never)]
    pub fn get<T: Read>(&self, key: &str) -> T {
        let r = match self.value(key) {
            Some(v) => T::read(v),
            None => T::absent().ok_or_else(missing),
        };
        self.fail(key, r)
    }

    /// A key whose absence means the type's default.
    #[inline(never)]
    pub fn or_default<T: Read + Default>(&self, key: &str) -> T {
        self.or(key, T::default())
    }

    /// A key whose absence means `default`.
    #[inline(never)]
    pub fn or<T: Read>(&self, key: &str, default: T) -> T {
        match self.value(key) {
            Some(v) => self.fail(key, T::read(v)),
            None => default,
        }
    }

    /// A word key as its index in `words`, in one function for every word
    /// enum (a `get` of each would be one function a type). `need`: 0 an
    /// `Option` (absent or null: `None`), 1 a key with a default (absent:
    /// `None`), 2 a required key. `None` also after an error, which is kept.
    #[inline(never)]
    fn word_at(&self, key: &str, words: &[&str], need: u8) -> Option<usize> {
        let Some(v) = self.value(key) else {
            if need == 2 {
                self.note(key, missing());
            }
            return None;
        };
        if need == 0 && v.is_null() {
            return None;
        }
        match word_index(v, words) {
            Ok(i) => Some(i),
            Err(e) => {
                self.note(key, e);
                None
            }
        }
    }

    /// An optional word key: `Option<T>`.
    #[inline(always)]
    pub fn word<T: Word>(&self, key: &str) -> Option<T> {
        self.word_at(key, T::WORDS, 0).map(|i| T::ALL[i].1)
    }

    /// A word key whose absence means `default`.
    #[inline(always)]
    pub fn word_or<T: Word>(&self, key: &str, default: T) -> T {
        self.word_at(key, T::WORDS, 1).map_or(default, |i| T::ALL[i].1)
    }

    /// A required word key.
    #[inline(always)]
    pub fn word_req<T: Word>(&self, key: &str) -> T {
        self.word_at(key, T::WORDS, 2).map_or(T::ALL[0].1, |i| T::ALL[i].1)
    }

    /// The value read, when every key read and every key of the object was
    /// read.
    pub fn end<T>(self, out: T) -> Result<T, String> {
        if let Some(e) = self.error.into_inner() {
            return Err(e);
        }
        let read = self.read.borrow();
        match self.map.keys().find(|k| !read.contains(&k.as_str())) {
            None => Ok(out),
            Some(k) => Err(format!("unknown field `{k}`")),
        }
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
    fallback_default!();
}

impl Read for f64 {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_f64().ok_or_else(|| wrong(v, "f64"))
    }
    fallback_default!();
}

impl Read for u64 {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_u64().ok_or_else(|| wrong(v, "u64"))
    }
    fallback_default!();
}

impl Read for u32 {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_u64().and_then(|n| u32::try_from(n).ok()).ok_or_else(|| wrong(v, "u32"))
    }
    fallback_default!();
}

impl Read for bool {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_bool().ok_or_else(|| wrong(v, "a boolean"))
    }
    fallback_default!();
}

impl Read for Value {
    fn read(v: &Value) -> Result<Self, String> {
        Ok(v.clone())
    }
    fallback_default!();
}

impl Read for Map<String, Value> {
    fn read(v: &Value) -> Result<Self, String> {
        v.as_object().cloned().ok_or_else(|| wrong(v, "a map"))
    }
    fallback_default!();
}

impl Read for [f64; 2] {
    fn read(v: &Value) -> Result<Self, String> {
        match v.as_array().map(Vec::as_slice) {
            Some([a, b]) => Ok([f64::read(a)?, f64::read(b)?]),
            _ => Err(wrong(v, "an array of length 2")),
        }
    }
    fallback_default!();
}

impl<T: Read> Read for Option<T> {
    #[inline]
    fn read(v: &Value) -> Result<Self, String> {
        if v.is_null() {
            return Ok(None);
        }
        T::read(v).map(Some)
    }
    fn absent() -> Option<Self> {
        Some(None)
    }
    fallback_default!();
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
    fn absent() -> Option<Self> {
        Some(Vec::new())
    }
    fallback_default!();
}

#[inline(never)]
fn at_index(i: usize, e: &str) -> String {
    format!("[{i}]: {e}")
}

#[inline(never)]
fn at_key(k: &str, e: &str) -> String {
    format!("{k}: {e}")
}

/// A map key: a column name, or a channel (the keys of `scales`).
pub(crate) trait ReadKey: Sized + std::hash::Hash + Eq {
    fn read_key(k: &str) -> Result<Self, String>;
}

impl ReadKey for String {
    fn read_key(k: &str) -> Result<Self, String> {
        Ok(k.to_string())
    }
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
    fn absent() -> Option<Self> {
        Some(IndexMap::new())
    }
    fn fallback() -> Self {
        IndexMap::new()
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
    fn fallback() -> Self {
        DataRef::Url(String::new())
    }
}

impl Read for Mapping {
    fn read(v: &Value) -> Result<Self, String> {
        if let Value::String(s) = v {
            return Ok(Mapping { column: s.clone(), as_type: None });
        }
        let o = Obj::new(v, "a column name or an object such as {\"column\": \"c\", \"as\": \"date\"}")?;
        let m = Mapping { column: o.get("column"), as_type: o.word("as") };
        o.end(m)
    }
    fn fallback() -> Self {
        Mapping { column: String::new(), as_type: None }
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
    fallback_default!();
}

impl Read for Coords {
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
    fallback_default!();
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
    fallback_default!();
}

impl Read for Robust {
    fn read(v: &Value) -> Result<Self, String> {
        match v {
            Value::Bool(b) => Ok(Robust::Flag(*b)),
            _ => u64::read(v).map(Robust::Iterations),
        }
    }
    fn fallback() -> Self {
        Robust::Flag(false)
    }
}

impl Read for Bandwidth {
    fn read(v: &Value) -> Result<Self, String> {
        match v {
            Value::String(_) => word(v).map(Bandwidth::Rule),
            _ => f64::read(v).map(Bandwidth::Width),
        }
    }
    fn fallback() -> Self {
        Bandwidth::Width(0.0)
    }
}

impl Read for Breaks {
    fn read(v: &Value) -> Result<Self, String> {
        match v {
            Value::String(_) => word(v).map(Breaks::Method),
            _ => Vec::read(v).map(Breaks::List),
        }
    }
    fn fallback() -> Self {
        Breaks::List(Vec::new())
    }
}

impl Read for Ticks {
    fn read(v: &Value) -> Result<Self, String> {
        match v {
            Value::Array(_) => Vec::read(v).map(Ticks::Values),
            _ => u32::read(v).map(Ticks::Count),
        }
    }
    fn fallback() -> Self {
        Ticks::Count(0)
    }
}

// ---------------------------------------------------------------- objects: one line per key

impl Read for Unpivot {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct Unpivot")?;
        let u = Unpivot { columns: o.get("columns"), into: o.get("into") };
        o.end(u)
    }
    fallback_default!();
}

impl Read for Spec {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "a spec object")?;
        let s = Spec {
            schema: o.get("$schema"),
            title: o.get("title"),
            subtitle: o.get("subtitle"),
            source: o.get("source"),
            description: o.get("description"),
            data: o.get("data"),
            shapes: o.get("shapes"),
            derive: o.get("derive"),
            where_: o.get("where"),
            layers: o.get("layers"),
            scales: o.get("scales"),
            coords: o.or_default("coords"),
            panels: o.get("panels"),
            notes: o.get("notes"),
            size: o.or_default("size"),
            theme: o.or_default("theme"),
            quiet: o.get("quiet"),
            locale: o.word("locale"),
            data_table: o.word_or("data_table", DataTable::default()),
            unpivot: o.get("unpivot"),
        };
        o.end(s)
    }
    fallback_default!();
}

impl Read for DataObject {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "a data URL string or an object with `url`, `format`, `types`, `sha256` or `rows`")?;
        let d = DataObject {
            url: o.get("url"),
            format: o.word("format"),
            types: o.get("types"),
            sha256: o.get("sha256"),
            rows: o.get("rows"),
            delimiter: o.get("delimiter"),
            decimal_comma: o.or_default("decimal_comma"),
            missing: o.get("missing"),
        };
        o.end(d)
    }
    fallback_default!();
}

impl Read for Shapes {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct Shapes")?;
        let s = Shapes { url: o.get("url"), features: o.get("features"), key: o.get("key"), sha256: o.get("sha256") };
        o.end(s)
    }
    fallback_default!();
}

impl Read for Layer {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct Layer")?;
        let l = Self::fields(&o);
        o.end(l)
    }
    fn fallback() -> Self {
        // (Never a field itself: layers come in a list.) The reads of an empty
        // object stand in; their error is dropped with it.
        let empty = Map::new();
        Self::fields(&Obj { map: &empty, read: Default::default(), error: Default::default() })
    }
}

impl Layer {
    fn fields(o: &Obj) -> Layer {
        Layer {
            draw: o.word_req("draw"),
            x: o.get("x"),
            y: o.get("y"),
            x_end: o.get("x_end"),
            y_end: o.get("y_end"),
            color: o.get("color"),
            size: o.get("size"),
            shape: o.get("shape"),
            opacity: o.get("opacity"),
            text: o.get("text"),
            group: o.get("group"),
            key: o.get("key"),
            tooltip: o.get("tooltip"),
            style: o.or_default("style"),
            stat: o.or_default("stat"),
            arrange: o.word_or("arrange", Arrange::default()),
            label_ends: o.or_default("label_ends"),
        }
    }
}

impl Read for Style {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct Style")?;
        let s = Style {
            color: o.get("color"),
            opacity: o.get("opacity"),
            width: o.get("width"),
            radius: o.get("radius"),
            dash: o.get("dash"),
            share: o.get("share"),
            shape: o.word("shape"),
            font_size: o.get("font_size"),
            every_point: o.get("every_point"),
        };
        o.end(s)
    }
    fallback_default!();
}

impl Read for StatObject {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "`none`, `count`, `box`, or an object with one of `bin`, `summary`, `fit`, `density`, `window`")?;
        let s = StatObject {
            bin: o.get("bin"),
            summary: o.word("summary"),
            interval: o.word("interval"),
            fit: o.word("fit"),
            band: o.get("band"),
            density: o.get("density"),
            window: o.get("window"),
            p: o.get("p"),
            span: o.get("span"),
            degree: o.get("degree"),
            robust: o.get("robust"),
        };
        o.end(s)
    }
    fallback_default!();
}

impl Read for DensitySpec {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct DensitySpec")?;
        let d = DensitySpec { bandwidth: o.get("bandwidth"), grid: o.get("grid") };
        o.end(d)
    }
    fallback_default!();
}

impl Read for WindowSpec {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct WindowSpec")?;
        let w = WindowSpec { summary: o.word("summary"), rows: o.get("rows"), align: o.word("align") };
        o.end(w)
    }
    fallback_default!();
}

impl Read for BinSpec {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct BinSpec")?;
        let b = BinSpec {
            rule: o.word("rule"),
            width: o.get("width"),
            count: o.get("count"),
            boundary: o.get("boundary"),
            unit: o.word("unit"),
            density: o.get("density"),
        };
        o.end(b)
    }
    fallback_default!();
}

impl Read for ScaleSpec {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct ScaleSpec")?;
        let s = ScaleSpec {
            kind: o.word("kind"),
            domain: o.get("domain"),
            zero: o.get("zero"),
            nice: o.get("nice"),
            reverse: o.or_default("reverse"),
            title: o.get("title"),
            format: o.get("format"),
            ticks: o.get("ticks"),
            palette: o.get("palette"),
            axis: o.word("axis"),
            legend: o.word("legend"),
            hide: o.or_default("hide"),
            base: o.get("base"),
            breaks: o.get("breaks"),
            count: o.get("count"),
            middle: o.get("middle"),
            values: o.get("values"),
            order: o.word("order"),
            top: o.get("top"),
            unit: o.get("unit"),
        };
        o.end(s)
    }
    fallback_default!();
}

impl Read for MapCoords {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct MapCoords")?;
        let m = MapCoords {
            kind: o.word_req("kind"),
            projection: o.word_or("projection", default_projection()),
            center: o.get("center"),
            rotate: o.or_default("rotate"),
            parallels: o.get("parallels"),
            fit: o.word_or("fit", default_fit()),
            graticule: o.or("graticule", default_graticule()),
            outline: o.or("outline", default_true()),
        };
        o.end(m)
    }
    fallback_default!();
}

impl Read for Polar {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct Polar")?;
        let p = Polar { kind: o.word_req("kind"), angle: o.word_or("angle", default_angle()), start: o.or_default("start"), inner: o.or_default("inner") };
        o.end(p)
    }
    fn fallback() -> Self {
        Polar { kind: PolarKind::Polar, angle: default_angle(), start: 0.0, inner: 0.0 }
    }
}

impl Read for Panels {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct Panels")?;
        let p = Panels { by: o.get("by"), columns: o.get("columns"), rows: o.get("rows"), cols: o.get("cols"), independent: o.word("independent") };
        o.end(p)
    }
    fallback_default!();
}

impl Read for Note {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct Note")?;
        let n = Note { x: o.get("x"), y: o.get("y"), x_end: o.get("x_end"), y_end: o.get("y_end"), text: o.get("text"), pointer: o.or_default("pointer") };
        o.end(n)
    }
    fallback_default!();
}

impl Read for Size {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "struct Size")?;
        let s = Size { width: o.get("width"), height: o.get("height"), aspect: o.get("aspect") };
        o.end(s)
    }
    fallback_default!();
}

impl Read for ThemeOverrides {
    fn read(v: &Value) -> Result<Self, String> {
        let o = Obj::new(v, "`light`, `dark`, `auto`, or an object of overrides")?;
        let t = ThemeOverrides {
            base: o.word("base"),
            background: o.get("background"),
            text: o.get("text"),
            muted: o.get("muted"),
            grid: o.get("grid"),
            axis: o.get("axis"),
            mark: o.get("mark"),
            font_size: o.get("font_size"),
        };
        o.end(t)
    }
    fallback_default!();
}

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
        assert_eq!(Style::read(&json!({"colour": "red"})).unwrap_err(), "unknown field `colour`");
        assert!(Layer::read(&json!({"draw": "pie"})).unwrap_err().starts_with("draw: unknown variant `pie`, expected one of `point`"));
        // Defaults other than the type's own.
        let m = MapCoords::read(&json!({"kind": "map"})).unwrap();
        assert_eq!((m.projection, m.fit, m.outline), (ProjectionWord::EqualEarth, MapFit::Shapes, true));
    }
}
