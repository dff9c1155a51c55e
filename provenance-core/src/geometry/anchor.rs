//! Label anchors: the point of a polygon farthest from its boundary.
//!
//! Our own branch-and-bound search for the pole of inaccessibility: cover the polygon's
//! bounding box with square cells; a cell whose centre lies at signed distance d from the
//! boundary (positive inside) can hold no point farther than d + half its diagonal. Cells
//! are split, most promising first, until none can beat the best centre found by more than
//! the precision. The area centroid seeds the search.

use super::ternary::Cartesian;
use super::Polygon;
use std::cmp::Ordering;
use std::collections::BinaryHeap;

/// Precision of the search, percentage points (our choice: far finer than a label needs).
pub const ANCHOR_PRECISION: f64 = 0.01;

/// Cap on the cells examined, to bound the work on pathological input (our choice).
const MAX_CELLS: usize = 200_000;

/// Where to put a polygon's label.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// let whole = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
/// let a = whole.label_anchor();
/// // The incentre of the equilateral triangle, 100/(2√3) from every side.
/// assert!(a.parts.iter().all(|p| (p - 100.0 / 3.0).abs() < 0.05));
/// assert!((a.clearance - 28.867_513).abs() < 0.01);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Anchor {
    /// The anchor, in percent of the three poles.
    pub parts: [f64; 3],
    /// Its distance to the nearest edge, percentage points (0 for a degenerate polygon).
    pub clearance: f64,
}

#[derive(Clone, Copy)]
struct Cell {
    x: f64,
    y: f64,
    half: f64,
    d: f64,
    max: f64,
}

impl Cell {
    fn new(poly: &Polygon, x: f64, y: f64, half: f64) -> Cell {
        let d = signed_distance(poly, Cartesian { x, y });
        Cell {
            x,
            y,
            half,
            d,
            max: d + half * std::f64::consts::SQRT_2,
        }
    }
}

impl PartialEq for Cell {
    fn eq(&self, o: &Self) -> bool {
        self.max.total_cmp(&o.max) == Ordering::Equal
    }
}
impl Eq for Cell {}
impl PartialOrd for Cell {
    fn partial_cmp(&self, o: &Self) -> Option<Ordering> {
        Some(self.cmp(o))
    }
}
impl Ord for Cell {
    fn cmp(&self, o: &Self) -> Ordering {
        self.max.total_cmp(&o.max)
    }
}

fn signed_distance(poly: &Polygon, p: Cartesian) -> f64 {
    let parts = p.to_parts();
    let d = poly.boundary_distance(parts);
    if poly.contains(parts) {
        d
    } else {
        -d
    }
}

impl Polygon {
    /// The label anchor: the point inside farthest from every edge (pole of inaccessibility),
    /// found to within [`ANCHOR_PRECISION`].
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::Polygon;
    /// // The band Q ≤ 50: a trapezoid of height 50·√3/2, so the widest circle has radius
    /// // half of that, 21.65 (its centre can slide sideways).
    /// let low = Polygon::new(vec![[0.0, 100.0, 0.0], [0.0, 0.0, 100.0], [50.0, 0.0, 50.0], [50.0, 50.0, 0.0]]);
    /// let a = low.label_anchor();
    /// assert!((a.clearance - 21.650_635).abs() < 0.011);
    /// assert!((a.parts[0] - 25.0).abs() < 0.1);
    /// ```
    pub fn label_anchor(&self) -> Anchor {
        let pts = self.plane();
        if pts.is_empty() {
            return Anchor {
                parts: [f64::NAN; 3],
                clearance: 0.0,
            };
        }
        let (mut x0, mut y0, mut x1, mut y1) = (
            f64::INFINITY,
            f64::INFINITY,
            f64::NEG_INFINITY,
            f64::NEG_INFINITY,
        );
        for p in pts {
            x0 = x0.min(p.x);
            y0 = y0.min(p.y);
            x1 = x1.max(p.x);
            y1 = y1.max(p.y);
        }
        // Square cells as wide as the shorter side of the box, but no more than 64 across the
        // longer one, so that a thin sliver does not start with millions of cells.
        let size = (x1 - x0).min(y1 - y0).max((x1 - x0).max(y1 - y0) / 64.0);
        let first = Anchor {
            parts: self.vertices()[0],
            clearance: 0.0,
        };
        if size.is_nan() || size <= 0.0 || !size.is_finite() {
            return first;
        }
        let half = size / 2.0;
        let mut heap = BinaryHeap::new();
        let mut x = x0;
        while x < x1 {
            let mut y = y0;
            while y < y1 {
                heap.push(Cell::new(self, x + half, y + half, half));
                y += size;
            }
            x += size;
        }
        let c = Cartesian::from_parts(self.centroid());
        let mut best = Cell::new(self, c.x, c.y, 0.0);
        let mut seen = heap.len();
        while let Some(cell) = heap.pop() {
            if cell.d > best.d {
                best = cell;
            }
            if cell.max - best.d <= ANCHOR_PRECISION || seen >= MAX_CELLS {
                continue;
            }
            let h = cell.half / 2.0;
            for (dx, dy) in [(-h, -h), (h, -h), (-h, h), (h, h)] {
                heap.push(Cell::new(self, cell.x + dx, cell.y + dy, h));
            }
            seen += 4;
        }
        if best.d <= 0.0 {
            return first;
        }
        Anchor {
            parts: Cartesian {
                x: best.x,
                y: best.y,
            }
            .to_parts(),
            clearance: best.d,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_thin_sliver_gets_an_anchor_inside_it_quickly() {
        // A band 0.001 points of Q wide across the whole triangle: 100 long, 0.00087 high.
        let p = Polygon::new(vec![
            [50.0, 50.0, 0.0],
            [50.0, 0.0, 50.0],
            [50.001, 0.0, 49.999],
            [50.001, 49.999, 0.0],
        ]);
        let a = p.label_anchor();
        assert!(p.contains(a.parts), "{a:?}");
        assert!(a.clearance > 0.0 && a.clearance <= 0.001 * 0.866_025_403_784_438_6 / 2.0 + 1e-12);
    }

    #[test]
    fn a_degenerate_polygon_falls_back_to_its_first_vertex() {
        let line = Polygon::new(vec![
            [100.0, 0.0, 0.0],
            [50.0, 50.0, 0.0],
            [0.0, 100.0, 0.0],
        ]);
        let a = line.label_anchor();
        assert_eq!((a.parts, a.clearance), ([100.0, 0.0, 0.0], 0.0));
    }
}
