//! Polygons in the ternary plane.

use super::ternary::Cartesian;
use crate::composition::Composition3;

/// A simple polygon whose vertices are given in percent of the three poles.
///
/// # Example
/// ```
/// use provenance_core::geometry::Polygon;
/// // The lower half of the triangle below 50% of the A pole (a trapezoid).
/// let p = Polygon::new(vec![[0.0, 100.0, 0.0], [0.0, 0.0, 100.0], [50.0, 0.0, 50.0], [50.0, 50.0, 0.0]]);
/// assert!(p.contains([10.0, 45.0, 45.0]));
/// assert!(!p.contains([60.0, 20.0, 20.0]));
/// // 3/4 of the whole triangle's area, 100²·√3/4.
/// assert!((p.area() - 0.75 * 4330.127_018_922_193).abs() < 1e-6);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Polygon {
    vertices: Vec<[f64; 3]>,
    plane: Vec<Cartesian>,
}

/// Coordinates used for exact-as-possible containment: (c, a) in percent, an affine image of
/// the triangle, free of the rounding of √3.
fn ca(p: [f64; 3]) -> (f64, f64) {
    (p[2], p[0])
}

impl Polygon {
    /// A polygon from vertices in percent (not checked; see the field-set checks).
    pub fn new(vertices: Vec<[f64; 3]>) -> Polygon {
        let plane = vertices.iter().map(|v| Cartesian::from_parts(*v)).collect();
        Polygon { vertices, plane }
    }

    /// Vertices in percent, in order.
    pub fn vertices(&self) -> &[[f64; 3]] {
        &self.vertices
    }

    /// Vertices in the Cartesian plane.
    pub fn plane(&self) -> &[Cartesian] {
        &self.plane
    }

    /// Area in the plane of the triangle of side 100 (shoelace formula), always ≥ 0.
    pub fn area(&self) -> f64 {
        self.signed_area().abs()
    }

    /// Signed area: positive when vertices run counter-clockwise in the plane.
    pub fn signed_area(&self) -> f64 {
        let n = self.plane.len();
        (0..n)
            .map(|i| {
                let (a, b) = (self.plane[i], self.plane[(i + 1) % n]);
                a.x * b.y - b.x * a.y
            })
            .sum::<f64>()
            / 2.0
    }

    /// True when the point `[a, b, c]` (percent) lies inside.
    ///
    /// Boundary rule: the crossing-number test with a ray toward +c, counting an edge when
    /// its endpoints lie on opposite sides of the point's `a` level with the lower endpoint
    /// included and the upper excluded, and the crossing when it lies strictly beyond the point.
    /// Each edge is evaluated from its endpoints in one canonical order, so two polygons that
    /// share an edge (with identical vertex values) compute the same crossing: a point on a
    /// shared edge belongs to exactly one of them.
    pub fn contains(&self, p: [f64; 3]) -> bool {
        let (px, py) = ca(p);
        let n = self.vertices.len();
        let mut inside = false;
        for i in 0..n {
            let (mut u, mut v) = (ca(self.vertices[i]), ca(self.vertices[(i + 1) % n]));
            if (u.1, u.0) > (v.1, v.0) {
                std::mem::swap(&mut u, &mut v);
            }
            // Half-open in a: u.1 <= py < v.1.
            if u.1 <= py && py < v.1 {
                let x = u.0 + (py - u.1) * (v.0 - u.0) / (v.1 - u.1);
                if px < x {
                    inside = !inside;
                }
            }
        }
        inside
    }

    /// True when a composition lies inside (see [`Polygon::contains`]).
    pub fn contains_composition(&self, c: &Composition3) -> bool {
        self.contains(c.parts())
    }

    /// Shortest distance from `p` (percent) to the polygon's boundary, in percentage points of
    /// the equilateral diagram.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::Polygon;
    /// let whole = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
    /// // The centroid is 100/(2√3) from every side.
    /// let d = whole.boundary_distance([100.0 / 3.0; 3]);
    /// assert!((d - 100.0 / (2.0 * 3f64.sqrt())).abs() < 1e-9);
    /// ```
    pub fn boundary_distance(&self, p: [f64; 3]) -> f64 {
        let q = Cartesian::from_parts(p);
        let n = self.plane.len();
        (0..n)
            .map(|i| segment_distance(q, self.plane[i], self.plane[(i + 1) % n]))
            .fold(f64::INFINITY, f64::min)
    }
}

/// Distance from point `p` to the segment `a`–`b`.
pub(crate) fn segment_distance(p: Cartesian, a: Cartesian, b: Cartesian) -> f64 {
    let (dx, dy) = (b.x - a.x, b.y - a.y);
    let len2 = dx * dx + dy * dy;
    let t = if len2 > 0.0 {
        (((p.x - a.x) * dx + (p.y - a.y) * dy) / len2).clamp(0.0, 1.0)
    } else {
        0.0
    };
    let c = Cartesian {
        x: a.x + t * dx,
        y: a.y + t * dy,
    };
    p.distance(&c)
}
