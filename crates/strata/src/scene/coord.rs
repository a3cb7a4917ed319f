//! Coordinate systems: unit positions (0..1 along each scale) to pixels.

use super::{polyline, Seg};
use crate::math;
use crate::plan::{AngleChannel, Coords};

/// The panel's pixel rectangle.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Frame {
    pub left: f64,
    pub top: f64,
    pub width: f64,
    pub height: f64,
}

impl Frame {
    pub fn right(&self) -> f64 {
        self.left + self.width
    }
    pub fn bottom(&self) -> f64 {
        self.top + self.height
    }
}

#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Coord {
    Cartesian(Frame),
    /// The x scale runs down the vertical axis, the y scale across.
    Transposed(Frame),
    Polar {
        frame: Frame,
        angle_is_x: bool,
        start: f64,
        inner: f64,
    },
}

/// A shape in pixels for an extent between two unit corners.
pub enum Area {
    Rect { x: f64, y: f64, width: f64, height: f64 },
    Path(Vec<Seg>),
}

impl Coord {
    pub fn new(c: &Coords, transposed: bool, frame: Frame) -> Coord {
        match c {
            Coords::Cartesian if transposed => Coord::Transposed(frame),
            // A map draws in `scene::map`; marks there never ask this.
            Coords::Cartesian | Coords::Map(_) => Coord::Cartesian(frame),
            Coords::Polar(p) => Coord::Polar { frame, angle_is_x: p.angle == AngleChannel::X, start: p.start, inner: p.inner.clamp(0.0, 0.95) },
        }
    }

    pub fn is_polar(&self) -> bool {
        matches!(self, Coord::Polar { .. })
    }

    pub fn frame(&self) -> Frame {
        match self {
            Coord::Cartesian(f) | Coord::Transposed(f) => *f,
            Coord::Polar { frame, .. } => *frame,
        }
    }

    /// Pixel position of unit coordinates (ux along x's scale, uy along y's).
    pub fn point(&self, ux: f64, uy: f64) -> (f64, f64) {
        match *self {
            Coord::Cartesian(f) => (f.left + ux * f.width, f.bottom() - uy * f.height),
            Coord::Transposed(f) => (f.left + uy * f.width, f.top + ux * f.height),
            Coord::Polar { frame, angle_is_x, start, inner } => {
                let (a, r) = if angle_is_x { (ux, uy) } else { (uy, ux) };
                let (cx, cy, radius) = polar_centre(frame);
                let rr = radius * (inner + (1.0 - inner) * r);
                let theta = (start / 360.0 + a) * std::f64::consts::TAU;
                (cx + rr * math::sin(theta), cy - rr * math::cos(theta))
            }
        }
    }

    /// The area between unit corners (x0..x1, y0..y1).
    pub fn area(&self, x0: f64, x1: f64, y0: f64, y1: f64) -> Area {
        match self {
            Coord::Cartesian(_) | Coord::Transposed(_) => {
                let (ax, ay) = self.point(x0, y0);
                let (bx, by) = self.point(x1, y1);
                Area::Rect { x: ax.min(bx), y: ay.min(by), width: (ax - bx).abs(), height: (ay - by).abs() }
            }
            Coord::Polar { .. } => {
                // Trace the outline with enough steps that arcs look round.
                let steps = 24;
                let mut pts = Vec::with_capacity(2 * steps + 2);
                for k in 0..=steps {
                    let t = k as f64 / steps as f64;
                    pts.push(self.point(x0 + (x1 - x0) * t, y1));
                }
                for k in (0..=steps).rev() {
                    let t = k as f64 / steps as f64;
                    pts.push(self.point(x0 + (x1 - x0) * t, y0));
                }
                Area::Path(polyline(&pts, true))
            }
        }
    }

    /// Pixel points for a polyline through unit points; in polar
    /// coordinates each segment is subdivided so it follows the circle.
    pub fn line(&self, units: &[(f64, f64)]) -> Vec<(f64, f64)> {
        match self {
            Coord::Polar { .. } => {
                let mut out = Vec::new();
                for (i, w) in units.windows(2).enumerate() {
                    let steps = 8;
                    for k in 0..steps {
                        if i > 0 && k == 0 {
                            continue;
                        }
                        let t = k as f64 / steps as f64;
                        out.push(self.point(w[0].0 + (w[1].0 - w[0].0) * t, w[0].1 + (w[1].1 - w[0].1) * t));
                    }
                }
                if let Some(last) = units.last() {
                    out.push(self.point(last.0, last.1));
                }
                out
            }
            _ => units.iter().map(|(x, y)| self.point(*x, *y)).collect(),
        }
    }
}

pub fn polar_centre(f: Frame) -> (f64, f64, f64) {
    (f.left + f.width / 2.0, f.top + f.height / 2.0, f.width.min(f.height) / 2.0)
}
