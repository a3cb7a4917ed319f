//! The map coordinate system resolved: the projection with its centre and
//! parallels, and each `region` layer's rows matched to the shapes.

use super::PlannedLayer;
use crate::channel::Channel;
use crate::error::{Diagnostic, Errors};
use crate::geo::geojson::Feature;
use crate::geo::{Projection, Rotation, View};
use crate::spec::{closest, Geometry, MapCoords, MapFit, ProjectionWord, Spec};

const D: f64 = std::f64::consts::PI / 180.0;

/// What the scene needs to draw a map.
#[derive(Debug, Clone)]
pub struct MapPlan {
    /// The projection after the sphere's turn (`rotate`).
    pub view: View,
    /// Fit the rows drawn (points) rather than the shapes.
    pub fit_data: bool,
    pub graticule: Option<f64>,
    pub outline: bool,
    pub features: std::sync::Arc<Vec<Feature>>,
    /// For each planned layer (by position in `Plan.layers`) that draws
    /// regions: the row of each feature, `None` for a shape with no row; a
    /// layer without `key` (a base map) has no entry.
    pub rows: Vec<Option<Vec<Option<usize>>>>,
}

/// The map's coordinate options: the spec's `coords` when it is a map, or
/// the defaults when a `region` layer asks for a map without saying.
pub fn coords(spec: &Spec) -> Option<MapCoords> {
    match &spec.coords {
        crate::spec::Coords::Map(m) => Some(m.clone()),
        _ if spec.layers.iter().any(|l| l.draw == Geometry::Region) => Some(MapCoords::default()),
        _ => None,
    }
}

/// Longitude and latitude bounds of the shapes (degrees) on the turned sphere.
fn bounds(features: &[Feature], rot: Rotation) -> Option<(f64, f64, f64, f64)> {
    let mut b = (f64::INFINITY, f64::INFINITY, f64::NEG_INFINITY, f64::NEG_INFINITY);
    for f in features {
        if let Some(g) = &f.geometry {
            g.for_each_pos(&mut |(x, y)| {
                let (x, y) = if rot.is_none() {
                    (x, y)
                } else {
                    let (l, p) = rot.apply(x * D, y * D);
                    (l / D, p / D)
                };
                b = (b.0.min(x), b.1.min(y), b.2.max(x), b.3.max(y))
            });
        }
    }
    (b.0 <= b.2).then_some(b)
}

fn projection(m: &MapCoords, features: &[Feature], rot: Rotation) -> Projection {
    let b = bounds(features, rot);
    // Default centre: the middle of the shapes when they span less than half
    // the world's longitudes, else 0°, 0°; with a turn, the turn says what
    // is in the middle (0°, 0° of the turned sphere).
    let (clon, clat) = match (m.center, b) {
        (Some(c), _) => (c[0], c[1]),
        _ if !m.rotate.is_null() => (0.0, 0.0),
        (None, Some(b)) if b.2 - b.0 < 180.0 => ((b.0 + b.2) / 2.0, (b.1 + b.3) / 2.0),
        _ => (0.0, 0.0),
    };
    // Default parallels: one sixth in from each end of the shapes' latitudes.
    let (p1, p2) = match (m.parallels, b) {
        (Some(p), _) => (p[0], p[1]),
        (None, Some(b)) if b.3 - b.1 > 1e-6 => (b.1 + (b.3 - b.1) / 6.0, b.3 - (b.3 - b.1) / 6.0),
        _ => (clat - 10.0, clat + 10.0),
    };
    let (lon0, lat0, lat1, lat2) = (clon * D, clat * D, p1 * D, p2 * D);
    match m.projection {
        ProjectionWord::EqualEarth => Projection::EqualEarth { lon0 },
        ProjectionWord::Mercator => Projection::Mercator { lon0 },
        ProjectionWord::Equirectangular => Projection::Equirectangular { lon0 },
        ProjectionWord::Albers => Projection::Albers { lon0, lat0, lat1, lat2 },
        ProjectionWord::LambertConformal => Projection::LambertConformal { lon0, lat0, lat1, lat2 },
        ProjectionWord::LambertEqualArea => Projection::LambertEqualArea { lon0, lat0 },
        ProjectionWord::Orthographic => Projection::Orthographic { lon0, lat0 },
        ProjectionWord::TransverseMercator => Projection::TransverseMercator { lon0, lat0 },
    }
}

impl MapPlan {
    /// The same map for a panel's rows: each region layer's rows matched
    /// to the shapes again (a panel keeps only its own rows).
    pub fn for_layers(&self, layers: &[PlannedLayer]) -> MapPlan {
        let by_key = KeyIndex::of(&self.features);
        let rows = layers
            .iter()
            .map(|l| {
                let keys = l.data.get(Channel::Key).filter(|_| l.geometry == Geometry::Region)?;
                let mut of_feature = vec![None; self.features.len()];
                for i in 0..l.data.len {
                    if let Some(fi) = keys.key(i).as_deref().and_then(|k| by_key.get(&self.features, k)) {
                        of_feature[fi].get_or_insert(i);
                    }
                }
                Some(of_feature)
            })
            .collect();
        MapPlan { rows, ..self.clone() }
    }
}

/// Each key's first feature, found by the engine's one hash index.
struct KeyIndex(crate::index::Index);

impl KeyIndex {
    fn hash(h: crate::index::Hasher, k: &str) -> u64 {
        h.bytes(k.as_bytes()).finish()
    }
    fn of(features: &[Feature]) -> KeyIndex {
        let key = |j: u32| features[j as usize].key.as_deref();
        let mut ix = crate::index::Index::with_capacity(features.len());
        for (fi, f) in features.iter().enumerate() {
            if let Some(k) = f.key.as_deref() {
                let _ = ix.find_or_insert(&|h| Self::hash(h, k), &|j| key(j) == Some(k), fi as u32, &|j, h| Self::hash(h, key(j).unwrap_or_default()));
            }
        }
        KeyIndex(ix)
    }
    fn get(&self, features: &[Feature], k: &str) -> Option<usize> {
        self.0.find(Self::hash(self.0.hasher(), k), &|j| features[j as usize].key.as_deref() == Some(k)).map(|j| j as usize)
    }
}

/// Resolve the map. `features` are the shapes read by the caller.
pub fn resolve(spec: &Spec, m: &MapCoords, features: Option<Vec<Feature>>, layers: &[PlannedLayer], warnings: &mut Vec<Diagnostic>) -> Result<MapPlan, Errors> {
    let Some(turn) = m.rotation() else {
        return Err(Diagnostic::error("map.rotate", "`rotate` takes a number or a list of one to three numbers (degrees)")
            .at_path("coords.rotate")
            .with_hint("for example [-30, -40]: the sphere turned so 30°E 40°N is in the middle")
            .into());
    };
    let rotation = Rotation::from_degrees(turn);
    let needs_shapes = layers.iter().any(|l| l.geometry == Geometry::Region);
    let features = match features {
        Some(f) => f,
        None if needs_shapes => {
            let i = layers.iter().find(|l| l.geometry == Geometry::Region).map(|l| l.index).unwrap_or(0);
            return Err(Diagnostic::error("map.no_shapes", "a `region` layer draws the shapes, but the chart has none")
                .at_path(format!("layers[{i}].draw"))
                .with_hint("give `shapes` with a `url` or inline `features`")
                .into());
        }
        None => Vec::new(),
    };
    let mut rows = Vec::with_capacity(layers.len());
    for l in layers {
        if !matches!(l.geometry, Geometry::Region | Geometry::Point | Geometry::Line | Geometry::Step | Geometry::Label) {
            warnings.push(
                Diagnostic::warning("map.geometry", format!("`{}` layers are not drawn on a map", l.geometry.word()))
                    .at_path(format!("layers[{}].draw", l.index))
                    .with_hint("on a map, draw `region`, `point`, `line` or `label`"),
            );
        }
        if l.geometry != Geometry::Region {
            rows.push(None);
            continue;
        }
        let Some(keys) = l.data.get(Channel::Key) else {
            rows.push(None);
            continue;
        };
        let by_key = KeyIndex::of(&features);
        let mut of_feature = vec![None; features.len()];
        let mut unmatched: Vec<String> = Vec::new();
        let mut n_unmatched = 0usize;
        for i in 0..l.data.len {
            let Some(k) = keys.key(i) else { continue };
            match by_key.get(&features, &k) {
                Some(fi) => {
                    if of_feature[fi].is_none() {
                        of_feature[fi] = Some(i);
                    }
                }
                None => {
                    n_unmatched += 1;
                    if unmatched.len() < 5 && !unmatched.contains(&k) {
                        unmatched.push(k);
                    }
                }
            }
        }
        if n_unmatched > 0 {
            // Every key (a repeated one changes no suggestion).
            let mut names: Vec<&str> = features.iter().filter_map(|f| f.key.as_deref()).collect();
            crate::sort::by(&mut names, |a, b| a.cmp(b));
            let listed: Vec<String> = unmatched
                .iter()
                .map(|k| match closest(k, names.iter().copied()) {
                    Some(c) => format!("\"{k}\" (did you mean \"{c}\"?)"),
                    None => format!("\"{k}\""),
                })
                .collect();
            let key_name = spec.shapes.as_ref().and_then(|s| s.key.clone()).unwrap_or_else(|| "key".into());
            warnings.push(
                Diagnostic::warning("map.unmatched", format!("{n_unmatched} row(s) match no shape by `{key_name}`: {}", crate::join(&listed, ", ")))
                    .at_path(format!("layers[{}].key", l.index)),
            );
        }
        rows.push(Some(of_feature));
    }
    Ok(MapPlan {
        view: View { projection: projection(m, &features, rotation), rotation },
        fit_data: m.fit == MapFit::Data,
        graticule: m.graticule_step().filter(|s| *s >= 1.0 && *s <= 90.0),
        outline: m.outline,
        features: std::sync::Arc::new(features),
        rows,
    })
}
