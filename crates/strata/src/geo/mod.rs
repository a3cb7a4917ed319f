//! Geography: a shared library (like `stat/`) for maps. It names no stage.
//!
//! - [`geojson`]: an RFC 7946 reader with errors located by feature index and JSON path;
//! - [`sphere`]: great-circle densification, rotations, spherical areas;
//! - [`project`]: the projections on the unit sphere;
//! - [`clip`]: seam cutting opposite the centre meridian, pole closure, horizon clipping;
//! - [`fit`]: a projection fitted to a pixel box, outlines in pixels;
//! - [`simplify`]: Visvalingam-Whyatt at the output's pixel scale;
//! - `classify`: class breaks for colour in steps (Fisher-Jenks, quantile, equal;
//!   the full engine's, feature `steps`).

#[cfg(feature = "steps")]
pub mod classify;
pub mod clip;
pub mod fit;
pub mod geojson;
pub mod project;
pub mod simplify;
pub mod sphere;

pub use project::{Projection, View};
pub use sphere::Rotation;
