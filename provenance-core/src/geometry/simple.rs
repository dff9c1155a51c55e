//! Is a polygon simple? Its edges meet only at shared vertices of consecutive edges.
//!
//! The test runs in the (c, a) coordinates of the percentages, an affine image of the
//! equilateral diagram: affine maps keep crossings, touchings and collinearity, and the
//! percentages are used as written, without the rounding of √3.

use super::polygon::Polygon;
use std::fmt;

/// Cross products (in percent²) at or below this count as zero: collinear (numerical
/// tolerance, our choice; about 10⁴ times the rounding error of percentages near 100).
pub const COLLINEAR_TOLERANCE: f64 = 1e-8;

/// Why a polygon is not simple. Vertex and edge numbers are 1-based, as a person counts
/// them in the file; edge k runs from vertex k to vertex k + 1, and the last edge closes the
/// ring.
///
/// # Example
/// ```
/// use provenance_core::geometry::{Defect, Polygon};
/// // A bow tie: edges 1 and 3 cross.
/// let p = Polygon::new(vec![[0.0, 50.0, 50.0], [50.0, 50.0, 0.0], [50.0, 0.0, 50.0], [0.0, 100.0, 0.0]]);
/// assert!(matches!(p.check_simple(), Err(Defect::Crossing { first_edge: 1, second_edge: 3, .. })));
/// ```
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum Defect {
    /// Fewer than three vertices.
    TooFewVertices {
        /// How many there are.
        count: usize,
    },
    /// Two vertices coincide.
    RepeatedVertex {
        /// The earlier vertex.
        first: usize,
        /// The later vertex, equal to the first.
        second: usize,
    },
    /// Two consecutive edges run back over each other.
    DoublesBack {
        /// The vertex where the boundary turns back.
        vertex: usize,
    },
    /// Two edges that are not consecutive cross or touch.
    Crossing {
        /// The lower-numbered edge.
        first_edge: usize,
        /// The higher-numbered edge.
        second_edge: usize,
        /// A point they share, in percent.
        at: [f64; 3],
    },
    /// All vertices lie on one line.
    ZeroArea,
}

impl fmt::Display for Defect {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Defect::TooFewVertices { count } => write!(f, "it has {count} vertices"),
            Defect::RepeatedVertex { first, second } => {
                write!(f, "vertex {second} repeats vertex {first}")
            }
            Defect::DoublesBack { vertex } => {
                write!(f, "the boundary turns back on itself at vertex {vertex}")
            }
            Defect::Crossing {
                first_edge,
                second_edge,
                at,
            } => write!(
                f,
                "edge {first_edge} and edge {second_edge} meet at [{:.3}, {:.3}, {:.3}]",
                at[0], at[1], at[2]
            ),
            Defect::ZeroArea => write!(f, "its vertices lie on one line"),
        }
    }
}

type P = (f64, f64);

fn ca(v: [f64; 3]) -> P {
    (v[2], v[0])
}

fn cross(o: P, a: P, b: P) -> f64 {
    (a.0 - o.0) * (b.1 - o.1) - (a.1 - o.1) * (b.0 - o.0)
}

fn sign(x: f64) -> i8 {
    if x > COLLINEAR_TOLERANCE {
        1
    } else if x < -COLLINEAR_TOLERANCE {
        -1
    } else {
        0
    }
}

/// `p` lies within the bounding box of segment `a`–`b` (for a point already collinear).
fn within(a: P, b: P, p: P) -> bool {
    let e = 1e-12;
    p.0 >= a.0.min(b.0) - e
        && p.0 <= a.0.max(b.0) + e
        && p.1 >= a.1.min(b.1) - e
        && p.1 <= a.1.max(b.1) + e
}

/// A point shared by closed segments `p1`–`p2` and `p3`–`p4`, if any.
fn meet(p1: P, p2: P, p3: P, p4: P) -> Option<P> {
    let d1 = sign(cross(p3, p4, p1));
    let d2 = sign(cross(p3, p4, p2));
    let d3 = sign(cross(p1, p2, p3));
    let d4 = sign(cross(p1, p2, p4));
    if d1 * d2 < 0 && d3 * d4 < 0 {
        let t = cross(p3, p4, p1) / (cross(p3, p4, p1) - cross(p3, p4, p2));
        return Some((p1.0 + t * (p2.0 - p1.0), p1.1 + t * (p2.1 - p1.1)));
    }
    [
        (d1, p3, p4, p1),
        (d2, p3, p4, p2),
        (d3, p1, p2, p3),
        (d4, p1, p2, p4),
    ]
    .into_iter()
    .find(|(d, a, b, p)| *d == 0 && within(*a, *b, *p))
    .map(|(_, _, _, p)| p)
}

fn parts((c, a): P) -> [f64; 3] {
    [a, 100.0 - a - c, c]
}

impl Polygon {
    /// `Ok` when the polygon is simple: at least three distinct vertices, not all on a line,
    /// and edges that meet only where consecutive edges share a vertex. Consecutive collinear
    /// edges running on in the same direction are allowed (a vertex in the middle of a
    /// straight side, as where a neighbouring field's corner touches it).
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::{Defect, Polygon};
    /// let ok = Polygon::new(vec![[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [50.0, 25.0, 25.0], [50.0, 0.0, 50.0]]);
    /// assert_eq!(ok.check_simple(), Ok(()));
    /// let two = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0]]);
    /// assert_eq!(two.check_simple(), Err(Defect::TooFewVertices { count: 2 }));
    /// ```
    pub fn check_simple(&self) -> Result<(), Defect> {
        let v: Vec<P> = self.vertices().iter().map(|p| ca(*p)).collect();
        let n = v.len();
        if n < 3 {
            return Err(Defect::TooFewVertices { count: n });
        }
        for i in 0..n {
            for j in i + 1..n {
                if (v[i].0 - v[j].0).abs() <= 1e-9 && (v[i].1 - v[j].1).abs() <= 1e-9 {
                    return Err(Defect::RepeatedVertex {
                        first: i + 1,
                        second: j + 1,
                    });
                }
            }
        }
        for i in 0..n {
            let (prev, here, next) = (v[(i + n - 1) % n], v[i], v[(i + 1) % n]);
            let dot = (here.0 - prev.0) * (next.0 - here.0) + (here.1 - prev.1) * (next.1 - here.1);
            if sign(cross(prev, here, next)) == 0 && dot < 0.0 {
                return Err(Defect::DoublesBack { vertex: i + 1 });
            }
        }
        for i in 0..n {
            for j in i + 2..n {
                if i == 0 && j == n - 1 {
                    continue; // consecutive through the closing vertex
                }
                if let Some(at) = meet(v[i], v[(i + 1) % n], v[j], v[(j + 1) % n]) {
                    return Err(Defect::Crossing {
                        first_edge: i + 1,
                        second_edge: j + 1,
                        at: parts(at),
                    });
                }
            }
        }
        if (0..n).all(|i| sign(cross(v[0], v[1], v[i])) == 0) {
            return Err(Defect::ZeroArea);
        }
        Ok(())
    }

    /// True when [`Polygon::check_simple`] finds no defect.
    ///
    /// # Example
    /// ```
    /// use provenance_core::geometry::Polygon;
    /// let t = Polygon::new(vec![[100.0, 0.0, 0.0], [0.0, 100.0, 0.0], [0.0, 0.0, 100.0]]);
    /// assert!(t.is_simple());
    /// ```
    pub fn is_simple(&self) -> bool {
        self.check_simple().is_ok()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn poly(v: &[[f64; 3]]) -> Polygon {
        Polygon::new(v.to_vec())
    }

    #[test]
    fn repeated_vertex_is_named() {
        let p = poly(&[
            [100.0, 0.0, 0.0],
            [50.0, 50.0, 0.0],
            [50.0, 0.0, 50.0],
            [50.0, 50.0, 0.0],
        ]);
        assert_eq!(
            p.check_simple(),
            Err(Defect::RepeatedVertex {
                first: 2,
                second: 4
            })
        );
    }

    #[test]
    fn spike_doubling_back_is_refused() {
        // Q apex, then down the Q-F side to F 50, back up to F 20, then across.
        let p = poly(&[
            [100.0, 0.0, 0.0],
            [50.0, 50.0, 0.0],
            [80.0, 20.0, 0.0],
            [50.0, 0.0, 50.0],
        ]);
        assert_eq!(p.check_simple(), Err(Defect::DoublesBack { vertex: 2 }));
    }

    #[test]
    fn vertex_touching_a_far_edge_is_refused() {
        // Vertex 4 lies on edge 1 (the Q-F side at L = 0): the boundary pinches.
        let p = poly(&[
            [100.0, 0.0, 0.0],
            [0.0, 100.0, 0.0],
            [20.0, 40.0, 40.0],
            [50.0, 50.0, 0.0],
            [40.0, 0.0, 60.0],
        ]);
        match p.check_simple() {
            Err(Defect::Crossing {
                first_edge: 1, at, ..
            }) => {
                assert!((at[0] - 50.0).abs() < 1e-9 && at[2].abs() < 1e-9, "{at:?}");
            }
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn collinear_points_have_zero_area() {
        let p = poly(&[[100.0, 0.0, 0.0], [50.0, 50.0, 0.0], [0.0, 100.0, 0.0]]);
        // Three points on the Q-F side: vertex 3 doubles back toward vertex 1 first.
        assert!(p.check_simple().is_err());
    }

    #[test]
    fn crossing_point_is_hand_computed() {
        // Bow tie on the square c ∈ [0, 50], a ∈ [0, 50]: diagonals cross at (25, 25),
        // i.e. Q 25, F 50, L 25.
        let p = poly(&[
            [0.0, 100.0, 0.0],
            [50.0, 0.0, 50.0],
            [50.0, 50.0, 0.0],
            [0.0, 50.0, 50.0],
        ]);
        match p.check_simple() {
            Err(Defect::Crossing {
                first_edge: 1,
                second_edge: 3,
                at,
            }) => {
                for (x, y) in at.iter().zip([25.0, 50.0, 25.0]) {
                    assert!((x - y).abs() < 1e-9, "{at:?}");
                }
            }
            other => panic!("{other:?}"),
        }
    }
}
