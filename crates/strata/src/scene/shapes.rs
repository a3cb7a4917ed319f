//! Point shapes as path outlines, each with the area of a circle of the
//! same radius.

use super::{polyline, Seg};
use crate::math;
use crate::scale::{MarkShape, SHAPES};

/// The outline of shape `i` (of [`SHAPES`]) centred at (cx, cy) with the area of a
/// circle of radius `r`, so no shape looks bigger than another (common practice).
pub fn shape_path(i: usize, cx: f64, cy: f64, r: f64) -> Vec<Seg> {
    let area = std::f64::consts::PI * r * r;
    let pts: Vec<(f64, f64)> = match SHAPES[i % SHAPES.len()] {
        MarkShape::Circle => {
            // Two half circles.
            let arc = |x| Seg::Arc { rx: r, ry: r, large: true, sweep: true, x, y: cy };
            return vec![Seg::Move(cx - r, cy), arc(cx + r), arc(cx - r), Seg::Close];
        }
        MarkShape::Square => {
            let h = area.sqrt() / 2.0;
            vec![(-h, -h), (h, -h), (h, h), (-h, h)]
        }
        MarkShape::Triangle => {
            // Equilateral: area = sqrt(3)/4 s^2.
            let s = (4.0 * area / 3f64.sqrt()).sqrt();
            let h = s * 3f64.sqrt() / 2.0;
            vec![(0.0, -2.0 * h / 3.0), (s / 2.0, h / 3.0), (-s / 2.0, h / 3.0)]
        }
        MarkShape::Diamond => {
            let h = (area / 2.0).sqrt();
            vec![(0.0, -h), (h, 0.0), (0.0, h), (-h, 0.0)]
        }
        MarkShape::Plus | MarkShape::Cross => {
            // A plus of arm width w and span 3w has area 5 w^2.
            let w = (area / 5.0).sqrt();
            let (a, b) = (w / 2.0, 1.5 * w);
            let p = vec![(-a, -b), (a, -b), (a, -a), (b, -a), (b, a), (a, a), (a, b), (-a, b), (-a, a), (-b, a), (-b, -a), (-a, -a)];
            if SHAPES[i % SHAPES.len()] == MarkShape::Cross {
                let c = std::f64::consts::FRAC_1_SQRT_2;
                let mut p = p;
                for q in &mut p {
                    let (x, y) = *q;
                    *q = (c * (x - y), c * (x + y));
                }
                p
            } else {
                p
            }
        }
        MarkShape::Star => {
            // Five points; ten triangles of sides s and 0.4 s at 36
            // degrees have area 10 x 0.5 x 0.4 s^2 sin 36.
            let sin36 = math::sin_cos_deg(36.0).0;
            let s = (area / (2.0 * sin36)).sqrt();
            let mut p = Vec::new();
            for k in 0..10 {
                let (sin, cos) = math::sin_cos_deg(36.0 * k as f64 - 90.0);
                let rr = if k % 2 == 0 { s } else { s * 0.4 };
                p.push((rr * cos, rr * sin));
            }
            p
        }
    };
    let mut at: Vec<(f64, f64)> = Vec::with_capacity(pts.len());
    for (x, y) in pts {
        at.push((cx + x, cy + y));
    }
    polyline(&at, true)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn shapes_have_equal_area() {
        // Shoelace area of each polygon equals pi r^2 (circle excluded).
        for (i, shape) in SHAPES.iter().enumerate().skip(1) {
            let pts: Vec<(f64, f64)> = shape_path(i, 0.0, 0.0, 10.0)
                .into_iter()
                .filter_map(|s| match s {
                    Seg::Move(x, y) | Seg::Line(x, y) => Some((x, y)),
                    _ => None,
                })
                .collect();
            let mut area = 0.0;
            for k in 0..pts.len() {
                let (a, b) = (pts[k], pts[(k + 1) % pts.len()]);
                area += a.0 * b.1 - b.0 * a.1;
            }
            let area = area.abs() / 2.0;
            let want = std::f64::consts::PI * 100.0;
            assert!((area - want).abs() / want < 0.02, "{} {area}", shape.name());
        }
    }
}
