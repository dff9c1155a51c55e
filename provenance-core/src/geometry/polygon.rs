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

    /// True when `p` lies inside by [`Polygon::contains`], or within `tolerance` percentage
    /// points of the boundary (closed toward the outside).
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::Polygon;
    /// let whole = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
    /// // The apex is on the boundary: the half-open rule leaves it out, `covers` takes it.
    /// assert!(!whole.contains([100.0, 0.0, 0.0]));
    /// assert!(whole.covers([100.0, 0.0, 0.0], 1e-9));
    /// ```
    pub fn covers(&self, p: [f64; 3], tolerance: f64) -> bool {
        self.contains(p) || self.boundary_distance(p) <= tolerance
    }

    /// The edges, each as (index, start vertex, end vertex) in percent; edge `i` runs from
    /// vertex `i` to vertex `i + 1` (the last closes the ring).
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::Polygon;
    /// let t = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
    /// let last = t.edges().last().unwrap();
    /// assert_eq!(last, (2, [0.0, 0.0, 100.0], [100.0, 0.0, 0.0]));
    /// ```
    pub fn edges(&self) -> impl Iterator<Item = (usize, [f64; 3], [f64; 3])> + '_ {
        let n = self.vertices.len();
        (0..n).map(move |i| (i, self.vertices[i], self.vertices[(i + 1) % n]))
    }

    /// The area centroid, in percent; the vertex mean when the area is zero.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::Polygon;
    /// let t = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
    /// let c = t.centroid();
    /// assert!(c.iter().all(|v| (v - 100.0 / 3.0).abs() < 1e-9));
    /// ```
    pub fn centroid(&self) -> [f64; 3] {
        let n = self.plane.len();
        let area = self.signed_area();
        if n == 0 {
            return [f64::NAN; 3];
        }
        if area.abs() < 1e-12 {
            let k = n as f64;
            let mut m = [0.0; 3];
            for v in &self.vertices {
                for (mi, vi) in m.iter_mut().zip(v) {
                    *mi += vi / k;
                }
            }
            return m;
        }
        let (mut cx, mut cy) = (0.0, 0.0);
        for i in 0..n {
            let (a, b) = (self.plane[i], self.plane[(i + 1) % n]);
            let w = a.x * b.y - b.x * a.y;
            cx += (a.x + b.x) * w;
            cy += (a.y + b.y) * w;
        }
        Cartesian {
            x: cx / (6.0 * area),
            y: cy / (6.0 * area),
        }
        .to_parts()
    }

    /// Shortest distance from `p` (percent) to the edges of the polygon that do not lie along
    /// a side of the triangle, in percentage points; `None` when every edge lies along a side
    /// (the polygon is the whole triangle).
    ///
    /// This is the distance to the nearest boundary beyond which another field (or unassigned
    /// ground) lies: no composition lies beyond a side of the triangle.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::Polygon;
    /// // Q ≥ 50 (QFL): the only inner edge is the line Q = 50.
    /// let top = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0]]);
    /// // At Q = 60 the line Q = 50 is 10 · √3/2 away; the Q-F side is nearer but does not count.
    /// let d = top.interior_boundary_distance([60.0, 39.0, 1.0]).unwrap();
    /// assert!((d - 10.0 * 0.866_025_403_784_438_6).abs() < 1e-9);
    /// ```
    pub fn interior_boundary_distance(&self, p: [f64; 3]) -> Option<f64> {
        let q = Cartesian::from_parts(p);
        let n = self.plane.len();
        (0..n)
            .filter(|&i| !on_triangle_side(self.vertices[i], self.vertices[(i + 1) % n]))
            .map(|i| segment_distance(q, self.plane[i], self.plane[(i + 1) % n]))
            .reduce(f64::min)
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

/// Parts within this of 0 count as 0 when deciding whether an edge lies along a side of the
/// triangle (numerical tolerance, our choice).
pub const SIDE_TOLERANCE: f64 = 1e-9;

/// True when both endpoints have the same part equal to 0: the edge lies along a side.
///
/// # Example
/// ```
/// use provenance_core::geometry::polygon::on_triangle_side;
/// assert!(on_triangle_side([100.0, 0.0, 0.0], [60.0, 40.0, 0.0]));
/// assert!(!on_triangle_side([100.0, 0.0, 0.0], [0.0, 50.0, 50.0]));
/// ```
pub fn on_triangle_side(u: [f64; 3], v: [f64; 3]) -> bool {
    (0..3).any(|k| u[k].abs() <= SIDE_TOLERANCE && v[k].abs() <= SIDE_TOLERANCE)
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

#[cfg(test)]
mod tests {
    use super::*;

    const H: f64 = 0.866_025_403_784_438_6; // √3/2

    fn whole() -> Polygon {
        Polygon::new(vec![
            [100.0, 0.0, 0.0],
            [0.0, 100.0, 0.0],
            [0.0, 0.0, 100.0],
        ])
    }

    #[test]
    fn distance_to_the_sides_is_the_smallest_part_times_the_height_factor() {
        // In the triangle of side 100 the distance to the side where pole k is absent is
        // part k · √3/2 (hand geometry).
        let d = whole().boundary_distance([50.0, 30.0, 20.0]);
        assert!((d - 20.0 * H).abs() < 1e-12, "{d}");
        assert_eq!(whole().interior_boundary_distance([50.0, 30.0, 20.0]), None);
    }

    #[test]
    fn distance_beyond_a_segment_end_is_to_the_end() {
        // The segment from Q 50, F 50 to Q 50, L 50 (the line Q = 50) seen from the F apex:
        // the perpendicular foot lies outside the segment, so the distance is to its end at
        // Q 50, F 50, i.e. 50 points up the Q-F side.
        let top = Polygon::new(vec![
            [100.0, 0.0, 0.0],
            [50.0, 50.0, 0.0],
            [50.0, 0.0, 50.0],
        ]);
        let d = top.interior_boundary_distance([0.0, 100.0, 0.0]).unwrap();
        assert!((d - 50.0).abs() < 1e-9, "{d}");
    }

    #[test]
    fn a_point_on_a_shared_edge_belongs_to_exactly_one_side() {
        // Q ≥ 50 and Q < 50 share the line Q = 50; points on it go to one field only.
        let top = Polygon::new(vec![
            [100.0, 0.0, 0.0],
            [50.0, 50.0, 0.0],
            [50.0, 0.0, 50.0],
        ]);
        let low = Polygon::new(vec![
            [50.0, 50.0, 0.0],
            [0.0, 100.0, 0.0],
            [0.0, 0.0, 100.0],
            [50.0, 0.0, 50.0],
        ]);
        for l in [1.0, 10.0, 25.0, 49.0] {
            let p = [50.0, 50.0 - l, l];
            assert_eq!(top.contains(p) as u8 + low.contains(p) as u8, 1, "{p:?}");
        }
        // Half-open upward: the line of constant Q belongs to the polygon above it.
        assert!(top.contains([50.0, 25.0, 25.0]) && !low.contains([50.0, 25.0, 25.0]));
    }

    #[test]
    fn area_and_centroid_of_a_corner_triangle_by_hand() {
        // F ≥ 60: a triangle of side 40, area 0.16 of 4330.127, centroid at the vertex mean.
        let f = Polygon::new(vec![
            [0.0, 100.0, 0.0],
            [0.0, 60.0, 40.0],
            [40.0, 60.0, 0.0],
        ]);
        assert!((f.area() - 0.16 * 2500.0 * 3f64.sqrt()).abs() < 1e-9);
        let c = f.centroid();
        for (x, y) in c.iter().zip([40.0 / 3.0, 220.0 / 3.0, 40.0 / 3.0]) {
            assert!((x - y).abs() < 1e-9, "{c:?}");
        }
    }
}
