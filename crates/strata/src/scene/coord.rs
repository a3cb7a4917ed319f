//! Coordinate systems: unit positions (0..1 along each scale) to pixels.

use super::Seg;
use crate::math;
use crate::plan::Coords;

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
    /// The full engine's (feature `polar`); the core refuses polar specs.
    #[cfg(feature = "polar")]
    Polar {
        frame: Frame,
        angle_is_x: bool,
        start: f64,
        inner: f64,
    },
}

/// A shape in pixels for an extent between two unit corners.
pub enum Area {
    Rect {
        x: f64,
        y: f64,
        width: f64,
        height: f64,
    },
    #[cfg_attr(not(feature = "polar"), allow(dead_code))]
    Path(Vec<Seg>),
}

impl Coord {
    pub fn new(c: &Coords, transposed: bool, frame: Frame) -> Coord {
        match c {
            Coords::Cartesian if transposed => Coord::Transposed(frame),
            // A map draws in `scene::map`; marks there never ask this.
            Coords::Cartesian | Coords::Map(_) => Coord::Cartesian(frame),
            // Refused earlier (spec::needs_full): never drawn by the core.
            #[cfg(not(feature = "polar"))]
            Coords::Polar(_) => Coord::Cartesian(frame),
            #[cfg(feature = "polar")]
            Coords::Polar(p) => Coord::Polar { frame, angle_is_x: p.angle == crate::plan::AngleChannel::X, start: p.start, inner: p.inner.clamp(0.0, 0.95) },
        }
    }

    pub fn is_polar(&self) -> bool {
        #[cfg(feature = "polar")]
        return matches!(self, Coord::Polar { .. });
        #[cfg(not(feature = "polar"))]
        false
    }

    pub fn frame(&self) -> Frame {
        match self {
            Coord::Cartesian(f) | Coord::Transposed(f) => *f,
            #[cfg(feature = "polar")]
            Coord::Polar { frame, .. } => *frame,
        }
    }

    /// Pixel position of unit coordinates (ux along x's scale, uy along y's).
    #[inline(never)]
    pub fn point(&self, ux: f64, uy: f64) -> (f64, f64) {
        match *self {
            Coord::Cartesian(f) => (f.left + ux * f.width, f.bottom() - uy * f.height),
            Coord::Transposed(f) => (f.left + uy * f.width, f.top + ux * f.height),
            #[cfg(feature = "polar")]
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
            #[cfg(feature = "polar")]
            Coord::Polar { frame, angle_is_x, start, inner } => {
                let (a0, a1, r0, r1) = if *angle_is_x { (x0, x1, y0, y1) } else { (y0, y1, x0, x1) };
                let (_, _, radius) = polar_centre(*frame);
                let px = |r: f64| radius * (inner + (1.0 - inner) * r.clamp(0.0, 1.0));
                Area::Path(sector(polar_centre(*frame), *start, a0.min(a1), a0.max(a1), px(r0.min(r1)), px(r0.max(r1))))
            }
        }
    }

    /// Pixel points for a polyline through unit points; in polar
    /// coordinates each segment is subdivided so it follows the circle.
    pub fn line(&self, units: &[(f64, f64)]) -> Vec<(f64, f64)> {
        match self {
            #[cfg(feature = "polar")]
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

/// Radii below this many pixels are drawn as the centre point.
const POINT_RADIUS: f64 = 0.25;

/// The point at `turn` (fraction of a full turn, clockwise from the top,
/// after `start` degrees) and pixel radius `r` around centre (cx, cy).
fn on_circle(cx: f64, cy: f64, start: f64, turn: f64, r: f64) -> (f64, f64) {
    let theta = (start / 360.0 + turn) * std::f64::consts::TAU;
    (cx + r * math::sin(theta), cy - r * math::cos(theta))
}

/// Arc segments along the circle of pixel radius `r` from turn `a0` to
/// `a1` (a0 < a1, clockwise on screen: SVG's sweep flag 1; reversed when
/// `back`), starting where the path already is. A whole turn is two half
/// turns, as one SVG arc cannot end where it starts.
fn arc_to(out: &mut Vec<Seg>, (cx, cy): (f64, f64), start: f64, a0: f64, a1: f64, r: f64, back: bool) {
    let span = (a1 - a0).min(1.0);
    let pieces = if span > 0.5 + 1e-9 { 2 } else { 1 };
    for k in 1..=pieces {
        let f = k as f64 / pieces as f64;
        let turn = if back { a1 - span * f } else { a0 + span * f };
        let (x, y) = on_circle(cx, cy, start, turn, r);
        out.push(Seg::Arc { rx: r, ry: r, large: false, sweep: !back, x, y });
    }
}

/// An annular sector in pixels: turns a0..a1 (a0 <= a1) between pixel radii
/// r0 <= r1, outlined with SVG arcs; a wedge from the centre when r0 is
/// (nearly) zero, a whole ring or disc when it spans a full turn.
#[cfg(feature = "polar")]
pub fn sector(centre: (f64, f64, f64), start: f64, a0: f64, a1: f64, r0: f64, r1: f64) -> Vec<Seg> {
    let (cx, cy, _) = centre;
    let c = (cx, cy);
    let full = a1 - a0 >= 1.0 - 1e-9;
    let a1 = if full { a0 + 1.0 } else { a1 };
    let mut d = Vec::with_capacity(8);
    let (x, y) = on_circle(cx, cy, start, a0, r1);
    d.push(Seg::Move(x, y));
    if r1 > POINT_RADIUS {
        arc_to(&mut d, c, start, a0, a1, r1, false);
    }
    if full {
        d.push(Seg::Close);
        if r0 > POINT_RADIUS {
            // The hole: its own closed outline, wound the other way, so the
            // non-zero fill rule leaves it empty.
            let (x, y) = on_circle(cx, cy, start, a1, r0);
            d.push(Seg::Move(x, y));
            arc_to(&mut d, c, start, a0, a1, r0, true);
            d.push(Seg::Close);
        }
        return d;
    }
    if r0 > POINT_RADIUS {
        let (x, y) = on_circle(cx, cy, start, a1, r0);
        d.push(Seg::Line(x, y));
        arc_to(&mut d, c, start, a0, a1, r0, true);
    } else {
        d.push(Seg::Line(cx, cy));
    }
    d.push(Seg::Close);
    d
}

/// A whole circle of pixel radius `r` as two arcs; `None` below a quarter
/// pixel (a ring of zero radius draws nothing).
pub fn circle(centre: (f64, f64, f64), start: f64, r: f64) -> Option<Vec<Seg>> {
    if r <= POINT_RADIUS {
        return None;
    }
    let (cx, cy, _) = centre;
    let (x, y) = on_circle(cx, cy, start, 0.0, r);
    let mut d = vec![Seg::Move(x, y)];
    arc_to(&mut d, (cx, cy), start, 0.0, 1.0, r, false);
    d.push(Seg::Close);
    Some(d)
}

pub fn polar_centre(f: Frame) -> (f64, f64, f64) {
    (f.left + f.width / 2.0, f.top + f.height / 2.0, f.width.min(f.height) / 2.0)
}
