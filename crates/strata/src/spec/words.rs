//! Keys that take either a single word or an object (`"x": "month"` or
//! `"x": { "column": "month" }`). Each is deserialised by one visitor so
//! that errors inside the object keep their path.

use super::*;
use serde::de::{self, MapAccess, Visitor};
use serde::Deserializer;
use std::fmt;
use std::marker::PhantomData;

/// A type whose spec value may be a bare word instead of an object.
pub trait FromWord: Sized {
    /// What the error message calls the accepted forms.
    const EXPECTED: &'static str;
    fn from_word(word: &str) -> Result<Self, String>;
    fn from_object<'de, A: MapAccess<'de>>(map: A) -> Result<Self, A::Error>;
}

struct WordOrObject<T>(PhantomData<T>);

impl<'de, T: FromWord> Visitor<'de> for WordOrObject<T> {
    type Value = T;
    fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
        f.write_str(T::EXPECTED)
    }
    fn visit_str<E: de::Error>(self, v: &str) -> Result<T, E> {
        T::from_word(v).map_err(E::custom)
    }
    fn visit_map<A: MapAccess<'de>>(self, map: A) -> Result<T, A::Error> {
        T::from_object(map)
    }
}

macro_rules! word_or_object {
    ($t:ty) => {
        impl<'de> Deserialize<'de> for $t {
            fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
                d.deserialize_any(WordOrObject::<$t>(PhantomData))
            }
        }
    };
}

/// `a`, `b`, `c`: words as messages list them.
fn quoted(words: &[&str]) -> String {
    words.iter().map(|w| format!("`{w}`")).collect::<Vec<_>>().join(", ")
}

fn object<'de, A: MapAccess<'de>, T: Deserialize<'de>>(map: A) -> Result<T, A::Error> {
    T::deserialize(de::value::MapAccessDeserializer::new(map))
}

impl FromWord for DataRef {
    const EXPECTED: &'static str = "a data URL string or an object with `url`, `format`, `types`, `sha256` or `rows`";
    fn from_word(word: &str) -> Result<Self, String> {
        Ok(DataRef::Url(word.to_string()))
    }
    fn from_object<'de, A: MapAccess<'de>>(map: A) -> Result<Self, A::Error> {
        object(map).map(DataRef::Object)
    }
}
word_or_object!(DataRef);

impl FromWord for Mapping {
    const EXPECTED: &'static str = "a column name or an object such as {\"column\": \"c\", \"as\": \"date\"}";
    fn from_word(word: &str) -> Result<Self, String> {
        Ok(Mapping { column: word.to_string(), as_type: None })
    }
    fn from_object<'de, A: MapAccess<'de>>(map: A) -> Result<Self, A::Error> {
        #[derive(Deserialize)]
        #[serde(deny_unknown_fields)]
        struct Raw {
            column: String,
            #[serde(default, rename = "as")]
            as_type: Option<ColumnType>,
        }
        let r: Raw = object(map)?;
        Ok(Mapping { column: r.column, as_type: r.as_type })
    }
}
word_or_object!(Mapping);

impl FromWord for Stat {
    const EXPECTED: &'static str = "`none`, `count`, `box`, or an object with one of `bin`, `summary`, `fit`, `density`, `window`";
    fn from_word(word: &str) -> Result<Self, String> {
        match StatWord::from_word(word) {
            Some(StatWord::None) => Ok(Stat::None),
            Some(StatWord::Count) => Ok(Stat::Count),
            Some(StatWord::Box) => Ok(Stat::Box),
            None => Err(format!(
                "unknown variant `{word}`, expected one of {} (other statistics take an object such as {{\"bin\": {{}}}})",
                quoted(StatWord::WORDS)
            )),
        }
    }
    fn from_object<'de, A: MapAccess<'de>>(map: A) -> Result<Self, A::Error> {
        let o: StatObject = object(map)?;
        let n = [o.bin.is_some(), o.summary.is_some(), o.fit.is_some(), o.density.is_some(), o.window.is_some()].iter().filter(|b| **b).count();
        if n != 1 {
            return Err(de::Error::custom("a statistic object needs exactly one of `bin`, `summary`, `fit`, `density`, `window`"));
        }
        Ok(Stat::Object(o))
    }
}
word_or_object!(Stat);

impl FromWord for Coords {
    const EXPECTED: &'static str = "`cartesian`, `map`, or an object {\"kind\": \"polar\", ...} or {\"kind\": \"map\", ...}";
    fn from_word(word: &str) -> Result<Self, String> {
        match CoordWord::from_word(word) {
            Some(CoordWord::Cartesian) => Ok(Coords::Cartesian),
            Some(CoordWord::Polar) => Ok(Coords::Polar(Polar { kind: PolarKind::Polar, angle: AngleChannel::X, start: 0.0, inner: 0.0 })),
            Some(CoordWord::Map) => Ok(Coords::Map(MapCoords::default())),
            None => Err(format!("unknown variant `{word}`, expected one of {}", quoted(CoordWord::WORDS))),
        }
    }
    fn from_object<'de, A: MapAccess<'de>>(map: A) -> Result<Self, A::Error> {
        let o: serde_json::Map<String, serde_json::Value> = object(map)?;
        let v = serde_json::Value::Object(o);
        if v.get("kind").and_then(serde_json::Value::as_str) == Some("map") {
            serde_json::from_value(v).map(Coords::Map).map_err(de::Error::custom)
        } else {
            serde_json::from_value(v).map(Coords::Polar).map_err(de::Error::custom)
        }
    }
}
word_or_object!(Coords);

impl FromWord for Theme {
    const EXPECTED: &'static str = "`light`, `dark`, `auto`, or an object of overrides";
    fn from_word(word: &str) -> Result<Self, String> {
        match ThemeWord::from_word(word) {
            Some(ThemeWord::Auto) => Ok(Theme::Auto),
            Some(ThemeWord::Light) => Ok(Theme::Light),
            Some(ThemeWord::Dark) => Ok(Theme::Dark),
            None => Err(format!("unknown variant `{word}`, expected one of {}", quoted(ThemeWord::WORDS))),
        }
    }
    fn from_object<'de, A: MapAccess<'de>>(map: A) -> Result<Self, A::Error> {
        object(map).map(Theme::Custom)
    }
}
word_or_object!(Theme);
