//! A GeoJSON (RFC 7946) reader: every geometry type, with errors located by
//! feature index and JSON path.
//!
//! Accepted at the top: a `FeatureCollection`, one `Feature`, a bare
//! geometry, or a list of features (the spec's inline `shapes.features`).
//! Positions are `[longitude, latitude, (altitude)]` in degrees; longitude
//! may be any finite number (it is wrapped), latitude must lie within ±90.
//! Either ring winding is accepted: RFC 7946 asks for counter-clockwise
//! outer rings, older files write the opposite, and the map draws the
//! smaller side of each ring either way (see `clip`). `bbox`, `id` and
//! foreign members are ignored.

use crate::data::json::kind;
use crate::error::Diagnostic;
use serde_json::{Map, Value};

/// A position: longitude and latitude in degrees.
pub type Pos = (f64, f64);
/// A closed ring (first position equals the last).
pub type Ring = Vec<Pos>;

/// Most vertices one shapes source may hold (like the data caps).
pub const MAX_VERTICES: usize = 2_000_000;
/// Most features one shapes source may hold.
pub const MAX_FEATURES: usize = 100_000;
/// Errors reported before the reader stops listing them.
const MAX_ERRORS: usize = 20;

#[derive(Debug, Clone, PartialEq)]
pub enum Geometry {
    Point(Pos),
    MultiPoint(Vec<Pos>),
    LineString(Vec<Pos>),
    MultiLineString(Vec<Vec<Pos>>),
    /// Outer ring first, then holes.
    Polygon(Vec<Ring>),
    MultiPolygon(Vec<Vec<Ring>>),
    Collection(Vec<Geometry>),
}

impl Geometry {
    /// Every position, for bounds and counts.
    pub fn for_each_pos(&self, f: &mut impl FnMut(Pos)) {
        match self {
            Geometry::Point(p) => f(*p),
            Geometry::MultiPoint(v) | Geometry::LineString(v) => v.iter().for_each(|p| f(*p)),
            Geometry::MultiLineString(v) | Geometry::Polygon(v) => v.iter().flatten().for_each(|p| f(*p)),
            Geometry::MultiPolygon(v) => v.iter().flatten().flatten().for_each(|p| f(*p)),
            Geometry::Collection(v) => v.iter().for_each(|g| g.for_each_pos(f)),
        }
    }
}

#[derive(Debug, Clone, PartialEq)]
pub struct Feature {
    /// Place in the source (0-based).
    pub index: usize,
    /// The `key` property as text (numbers written without a trailing `.0`).
    pub key: Option<String>,
    pub properties: Map<String, Value>,
    /// `None` for a feature whose geometry is `null`.
    pub geometry: Option<Geometry>,
}

struct Reader {
    errors: Vec<Diagnostic>,
    vertices: usize,
}

impl Reader {
    fn err(&mut self, code: &str, path: &str, msg: impl Into<String>) {
        if self.errors.len() < MAX_ERRORS {
            self.errors.push(Diagnostic::error(code, msg).at_path(path));
        }
    }

    fn pos(&mut self, v: &Value, path: &str) -> Option<Pos> {
        let Some(a) = v.as_array() else {
            self.err("shapes.nesting", path, "expected a position: an array [longitude, latitude]");
            return None;
        };
        if a.len() < 2 {
            self.err("shapes.nesting", path, format!("a position needs at least 2 numbers, found {}", a.len()));
            return None;
        }
        let mut xy = [0.0; 2];
        for (i, slot) in xy.iter_mut().enumerate() {
            match a[i].as_f64() {
                Some(n) if n.is_finite() => *slot = n,
                _ => {
                    let what = if a[i].is_array() { "an array (wrong nesting?)".to_string() } else { crate::json::to_string(&a[i]) };
                    let code = if a[i].is_array() { "shapes.nesting" } else { "shapes.coordinate" };
                    self.err(code, &format!("{path}[{i}]"), format!("a coordinate must be a finite number, found {what}"));
                    return None;
                }
            }
        }
        if xy[1].abs() > 90.0 {
            self.err(
                "shapes.latitude",
                &format!("{path}[1]"),
                format!("latitude {} is beyond ±90 (positions are [longitude, latitude])", crate::format::float::Plain(xy[1])),
            );
            return None;
        }
        self.vertices += 1;
        Some((xy[0], xy[1]))
    }

    fn list<'a>(&mut self, v: &'a Value, path: &str, what: &str) -> Option<&'a Vec<Value>> {
        match v.as_array() {
            Some(a) => Some(a),
            None => {
                self.err("shapes.nesting", path, format!("expected an array of {what}, found {}", kind(v)));
                None
            }
        }
    }

    fn positions(&mut self, v: &Value, path: &str) -> Option<Vec<Pos>> {
        let a = self.list(v, path, "positions")?;
        let mut out = Vec::with_capacity(a.len());
        let mut ok = true;
        for (i, p) in a.iter().enumerate() {
            match self.pos(p, &format!("{path}[{i}]")) {
                Some(p) => out.push(p),
                None => {
                    // One error a list: a wrong nesting would repeat for every item.
                    ok = false;
                    break;
                }
            }
        }
        ok.then_some(out)
    }

    fn line(&mut self, v: &Value, path: &str) -> Option<Vec<Pos>> {
        let pts = self.positions(v, path)?;
        if pts.len() < 2 {
            self.err("shapes.line", path, format!("a line needs at least 2 positions, found {}", pts.len()));
            return None;
        }
        Some(pts)
    }

    fn polygon(&mut self, v: &Value, path: &str) -> Option<Vec<Ring>> {
        let a = self.list(v, path, "rings")?;
        let mut out = Vec::with_capacity(a.len());
        let mut ok = true;
        for (i, r) in a.iter().enumerate() {
            let rp = format!("{path}[{i}]");
            let Some(ring) = self.positions(r, &rp) else {
                ok = false;
                break;
            };
            if ring.len() < 4 {
                self.err("shapes.ring", &rp, format!("a ring needs at least 4 positions (the last repeats the first), found {}", ring.len()));
                ok = false;
            } else if ring.first() != ring.last() {
                let (f, l) = (ring[0], ring[ring.len() - 1]);
                self.err(
                    "shapes.ring_open",
                    &rp,
                    format!(
                        "the ring is not closed: it starts at [{}, {}] and ends at [{}, {}]",
                        crate::format::float::Plain(f.0),
                        crate::format::float::Plain(f.1),
                        crate::format::float::Plain(l.0),
                        crate::format::float::Plain(l.1)
                    ),
                );
                ok = false;
            } else {
                out.push(ring);
            }
        }
        ok.then_some(out)
    }

    fn geometry(&mut self, v: &Value, path: &str) -> Option<Geometry> {
        let Some(o) = v.as_object() else {
            self.err("shapes.geometry", path, format!("expected a geometry object, found {}", kind(v)));
            return None;
        };
        let ty = o.get("type").and_then(Value::as_str).unwrap_or("");
        if ty == "GeometryCollection" {
            let gp = format!("{path}.geometries");
            let a = self.list(o.get("geometries").unwrap_or(&Value::Null), &gp, "geometries")?;
            let mut out = Vec::with_capacity(a.len());
            for (i, g) in a.iter().enumerate() {
                out.push(self.geometry(g, &format!("{gp}[{i}]"))?);
            }
            return Some(Geometry::Collection(out));
        }
        let cp = format!("{path}.coordinates");
        let c = o.get("coordinates").unwrap_or(&Value::Null);
        match ty {
            "Point" => self.pos(c, &cp).map(Geometry::Point),
            "MultiPoint" => self.positions(c, &cp).map(Geometry::MultiPoint),
            "LineString" => self.line(c, &cp).map(Geometry::LineString),
            "MultiLineString" => {
                let a = self.list(c, &cp, "lines")?;
                let lines: Vec<_> = a.iter().enumerate().map(|(i, l)| self.line(l, &format!("{cp}[{i}]"))).collect();
                lines.into_iter().collect::<Option<Vec<_>>>().map(Geometry::MultiLineString)
            }
            "Polygon" => self.polygon(c, &cp).map(Geometry::Polygon),
            "MultiPolygon" => {
                let a = self.list(c, &cp, "polygons")?;
                let polys: Vec<_> = a.iter().enumerate().map(|(i, p)| self.polygon(p, &format!("{cp}[{i}]"))).collect();
                polys.into_iter().collect::<Option<Vec<_>>>().map(Geometry::MultiPolygon)
            }
            _ => {
                let found = o.get("type").map(crate::json::to_string).unwrap_or_else(|| "no type".into());
                let mut d = Diagnostic::error("shapes.geometry", format!("unknown geometry type {found}")).at_path(format!("{path}.type"));
                d = d.with_hint("one of Point, MultiPoint, LineString, MultiLineString, Polygon, MultiPolygon, GeometryCollection");
                if self.errors.len() < MAX_ERRORS {
                    self.errors.push(d);
                }
                None
            }
        }
    }

    fn feature(&mut self, v: &Value, index: usize, path: &str, key: Option<&str>) -> Option<Feature> {
        let Some(o) = v.as_object() else {
            self.err("shapes.feature", path, format!("feature {index}: expected a Feature object, found {}", kind(v)));
            return None;
        };
        if o.get("type").and_then(Value::as_str) != Some("Feature") {
            self.err("shapes.feature", &format!("{path}.type"), format!("feature {index}: \"type\" must be \"Feature\""));
            return None;
        }
        let properties = match o.get("properties") {
            Some(Value::Object(m)) => m.clone(),
            _ => Map::new(),
        };
        let key = key.and_then(|k| properties.get(k)).and_then(key_text);
        let before = self.errors.len();
        let geometry = match o.get("geometry") {
            None | Some(Value::Null) => None,
            Some(g) => Some(self.geometry(g, &format!("{path}.geometry"))?),
        };
        if self.errors.len() > before {
            return None;
        }
        Some(Feature { index, key, properties, geometry })
    }
}

/// The text of a key property: strings as they are, integers without `.0`.
pub fn key_text(v: &Value) -> Option<String> {
    match v {
        Value::String(s) => Some(s.clone()),
        Value::Number(n) => Some(match (n.as_i64(), n.as_f64()) {
            (Some(i), _) => i.to_string(),
            (None, Some(f)) if f.fract() == 0.0 && f.abs() < 1e15 => format!("{}", f as i64),
            _ => crate::json::to_string(v),
        }),
        Value::Bool(b) => Some(b.to_string()),
        _ => None,
    }
}

/// Read GeoJSON bytes; `path` names the source in messages (`shapes`).
pub fn read_bytes(bytes: &[u8], key: Option<&str>, path: &str) -> Result<Vec<Feature>, Vec<Diagnostic>> {
    let v: Value = crate::json::from_slice(bytes).map_err(|e| {
        vec![Diagnostic::error("shapes.json", format!("the shapes are not valid JSON: {e}")).at_path(path).at_data(e.line() as u64, Some(e.column() as u64))]
    })?;
    read(&v, key, path)
}

/// Read a parsed GeoJSON value. Errors are listed together (up to 20), each at
/// its JSON path under `path`, e.g. `shapes.features[3].geometry.coordinates[0]`.
pub fn read(v: &Value, key: Option<&str>, path: &str) -> Result<Vec<Feature>, Vec<Diagnostic>> {
    let mut r = Reader { errors: Vec::new(), vertices: 0 };
    let mut out = Vec::new();
    let items: Vec<(&Value, String)> = match v {
        Value::Array(a) => a.iter().enumerate().map(|(i, f)| (f, format!("{path}[{i}]"))).collect(),
        Value::Object(o) => match o.get("type").and_then(Value::as_str) {
            Some("FeatureCollection") => match o.get("features") {
                Some(Value::Array(a)) => a.iter().enumerate().map(|(i, f)| (f, format!("{path}.features[{i}]"))).collect(),
                _ => {
                    return Err(vec![Diagnostic::error("shapes.nesting", "a FeatureCollection needs a \"features\" array").at_path(format!("{path}.features"))])
                }
            },
            Some("Feature") => vec![(v, path.to_string())],
            _ => {
                let g = r.geometry(v, path);
                return match g {
                    Some(g) if r.errors.is_empty() => Ok(vec![Feature { index: 0, key: None, properties: Map::new(), geometry: Some(g) }]),
                    _ => Err(r.errors),
                };
            }
        },
        other => return Err(vec![Diagnostic::error("shapes.nesting", format!("expected GeoJSON (a FeatureCollection), found {}", kind(other))).at_path(path)]),
    };
    if items.len() > MAX_FEATURES {
        return Err(vec![Diagnostic::error("shapes.too_big", format!("{} features; at most {MAX_FEATURES} are drawn", items.len())).at_path(path)]);
    }
    for (i, (f, p)) in items.into_iter().enumerate() {
        if let Some(f) = r.feature(f, i, &p, key) {
            out.push(f);
        }
        if r.vertices > MAX_VERTICES {
            return Err(vec![Diagnostic::error("shapes.too_big", format!("more than {MAX_VERTICES} positions")).at_path(p)]);
        }
    }
    if r.errors.is_empty() {
        Ok(out)
    } else {
        Err(r.errors)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use serde_json::json;

    fn fc(geoms: Vec<Value>) -> Value {
        let feats: Vec<Value> = geoms.into_iter().enumerate().map(|(i, g)| json!({"type": "Feature", "properties": {"code": i}, "geometry": g})).collect();
        json!({"type": "FeatureCollection", "features": feats})
    }

    // Every geometry type of RFC 7946, section 3.1, with the examples'
    // shapes from its appendix A.
    #[test]
    fn reads_every_geometry_type() {
        let v = fc(vec![
            json!({"type": "Point", "coordinates": [100.0, 0.0]}),
            json!({"type": "LineString", "coordinates": [[100.0, 0.0], [101.0, 1.0]]}),
            json!({"type": "Polygon", "coordinates": [[[100.0, 0.0], [101.0, 0.0], [101.0, 1.0], [100.0, 1.0], [100.0, 0.0]],
                [[100.8, 0.8], [100.8, 0.2], [100.2, 0.2], [100.2, 0.8], [100.8, 0.8]]]}),
            json!({"type": "MultiPoint", "coordinates": [[100.0, 0.0], [101.0, 1.0]]}),
            json!({"type": "MultiLineString", "coordinates": [[[100.0, 0.0], [101.0, 1.0]], [[102.0, 2.0], [103.0, 3.0]]]}),
            json!({"type": "MultiPolygon", "coordinates": [[[[102.0, 2.0], [103.0, 2.0], [103.0, 3.0], [102.0, 3.0], [102.0, 2.0]]]]}),
            json!({"type": "GeometryCollection", "geometries": [{"type": "Point", "coordinates": [100.0, 0.0]},
                {"type": "LineString", "coordinates": [[101.0, 0.0], [102.0, 1.0]]}]}),
            Value::Null,
        ]);
        let f = read(&v, Some("code"), "shapes").unwrap();
        assert_eq!(f.len(), 8);
        assert_eq!(f[2].key.as_deref(), Some("2"));
        assert!(matches!(&f[2].geometry, Some(Geometry::Polygon(r)) if r.len() == 2));
        assert!(matches!(&f[6].geometry, Some(Geometry::Collection(g)) if g.len() == 2));
        assert!(f[7].geometry.is_none());
    }

    #[test]
    fn errors_name_the_feature_and_path() {
        let v = fc(vec![
            json!({"type": "Polygon", "coordinates": [[[0, 0], [1, 0], [1, 1], [0, 1]]]}),
            json!({"type": "Point", "coordinates": [10, 95]}),
            json!({"type": "LineString", "coordinates": [[0, 0], [1, "a"]]}),
            json!({"type": "Polygon", "coordinates": [[0, 0], [1, 0], [1, 1], [0, 0]]}),
            json!({"type": "Blob", "coordinates": []}),
        ]);
        let e = read(&v, None, "shapes").unwrap_err();
        let got: Vec<(&str, &str)> = e.iter().map(|d| (d.code.as_str(), d.at.path.as_str())).collect();
        assert_eq!(
            got,
            vec![
                ("shapes.ring_open", "shapes.features[0].geometry.coordinates[0]"),
                ("shapes.latitude", "shapes.features[1].geometry.coordinates[1]"),
                ("shapes.coordinate", "shapes.features[2].geometry.coordinates[1][1]"),
                ("shapes.nesting", "shapes.features[3].geometry.coordinates[0][0]"),
                ("shapes.geometry", "shapes.features[4].geometry.type"),
            ]
        );
        let short = fc(vec![json!({"type": "Polygon", "coordinates": [[[0, 0], [1, 0], [0, 0]]]})]);
        let e = read(&short, None, "shapes").unwrap_err();
        assert_eq!(e[0].code, "shapes.ring");
    }

    #[test]
    fn non_finite_and_bad_json_are_errors() {
        let e = read_bytes(b"{\"type\": \"Point\", \"coordinates\": [1e999, 0]}", None, "shapes");
        assert!(e.is_err());
        let e = read_bytes(b"{\"type\": ", None, "shapes").unwrap_err();
        assert_eq!(e[0].code, "shapes.json");
    }
}
