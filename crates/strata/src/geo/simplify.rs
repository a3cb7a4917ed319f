//! Visvalingam-Whyatt line simplification (Visvalingam and Whyatt, 1993,
//! *The Cartographic Journal* 30(1)): repeatedly drop the point whose
//! triangle with its neighbours has the smallest area, while that area is
//! below a threshold. At the output's pixel scale a threshold of a fraction of
//! a square pixel moves no kept edge by a visible amount, so neighbouring
//! shapes simplified alone still meet without gaps at 1x.

use std::cmp::Ordering;
use std::collections::BinaryHeap;

/// Default threshold in square pixels.
pub const PIXEL_AREA: f64 = 0.25;

#[derive(PartialEq)]
struct Item {
    area: f64,
    i: usize,
    stamp: u32,
}
impl Eq for Item {}
impl PartialOrd for Item {
    fn partial_cmp(&self, o: &Self) -> Option<Ordering> {
        Some(self.cmp(o))
    }
}
impl Ord for Item {
    fn cmp(&self, o: &Self) -> Ordering {
        // Smallest area first, then the lowest index: a min-heap, deterministic.
        o.area.total_cmp(&self.area).then(o.i.cmp(&self.i))
    }
}

fn tri(a: (f64, f64), b: (f64, f64), c: (f64, f64)) -> f64 {
    ((b.0 - a.0) * (c.1 - a.1) - (c.0 - a.0) * (b.1 - a.1)).abs() / 2.0
}

/// Simplify an open path (ends kept) or a closed ring (`closed`: the last
/// point repeats the first; at least 4 points are kept), dropping points
/// whose effective area is below `min_area`.
pub fn simplify(pts: &[(f64, f64)], min_area: f64, closed: bool) -> Vec<(f64, f64)> {
    let n = pts.len();
    let keep_min = if closed { 4 } else { 2 };
    if n <= keep_min {
        return pts.to_vec();
    }
    // For a ring, work on the open list without the repeat; the first point stays.
    let m = if closed { n - 1 } else { n };
    let mut prev: Vec<usize> = (0..m).map(|i| if i == 0 { m - 1 } else { i - 1 }).collect();
    let mut next: Vec<usize> = (0..m).map(|i| if i + 1 == m { 0 } else { i + 1 }).collect();
    let mut stamp = vec![0u32; m];
    let mut alive = vec![true; m];
    let mut heap = BinaryHeap::new();
    let fixed = |i: usize| i == 0 || (!closed && i == m - 1);
    for i in 0..m {
        if !fixed(i) {
            heap.push(Item { area: tri(pts[prev[i]], pts[i], pts[next[i]]), i, stamp: 0 });
        }
    }
    let mut left = m;
    let mut floor = 0.0f64;
    while let Some(Item { area, i, stamp: s }) = heap.pop() {
        if !alive[i] || s != stamp[i] {
            continue;
        }
        // Effective area never falls below that of a point already dropped.
        let eff = area.max(floor);
        if eff >= min_area || left + usize::from(closed) <= keep_min {
            break;
        }
        floor = eff;
        alive[i] = false;
        left -= 1;
        let (p, q) = (prev[i], next[i]);
        next[p] = q;
        prev[q] = p;
        for j in [p, q] {
            if !fixed(j) {
                stamp[j] += 1;
                heap.push(Item { area: tri(pts[prev[j]], pts[j], pts[next[j]]), i: j, stamp: stamp[j] });
            }
        }
    }
    let mut out: Vec<(f64, f64)> = (0..m).filter(|&i| alive[i]).map(|i| pts[i]).collect();
    if closed {
        out.push(pts[0]);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    // Visvalingam and Whyatt (1993): points on a straight line have zero
    // effective area and go first; the corners of a square stay.
    #[test]
    fn collinear_points_go_corners_stay() {
        let mut sq = Vec::new();
        for i in 0..10 {
            sq.push((i as f64, 0.0));
        }
        for i in 0..10 {
            sq.push((10.0, i as f64));
        }
        for i in 0..10 {
            sq.push((10.0 - i as f64, 10.0));
        }
        for i in 0..10 {
            sq.push((0.0, 10.0 - i as f64));
        }
        sq.push((0.0, 0.0));
        let s = simplify(&sq, 0.25, true);
        assert_eq!(s, vec![(0.0, 0.0), (10.0, 0.0), (10.0, 10.0), (0.0, 10.0), (0.0, 0.0)]);
    }

    #[test]
    fn kept_points_stay_within_the_threshold() {
        // A wiggly line: every dropped point lies close to the simplified path.
        let pts: Vec<(f64, f64)> = (0..400).map(|i| (i as f64 * 0.5, libm::sin(i as f64 * 0.05) * 20.0 + ((i * 7919) % 13) as f64 * 0.01)).collect();
        let s = simplify(&pts, 0.25, false);
        assert!(s.len() < pts.len() / 2, "{} of {}", s.len(), pts.len());
        assert_eq!(s[0], pts[0]);
        assert_eq!(*s.last().unwrap(), *pts.last().unwrap());
        for p in &pts {
            let d = s
                .windows(2)
                .map(|w| {
                    let (a, b) = (w[0], w[1]);
                    let (dx, dy) = (b.0 - a.0, b.1 - a.1);
                    let t = (((p.0 - a.0) * dx + (p.1 - a.1) * dy) / (dx * dx + dy * dy)).clamp(0.0, 1.0);
                    (p.0 - a.0 - t * dx).hypot(p.1 - a.1 - t * dy)
                })
                .fold(f64::INFINITY, f64::min);
            assert!(d < 0.5, "a dropped point is {d} px off");
        }
    }
}
